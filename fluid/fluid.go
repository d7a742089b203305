package fluid

import (
	"math"

	"github.com/tripoint-thermo/tripoint/helmholtz"
)

// Point is a state point of a fluid: temperature T in K, pressure P in Pa
// and density Rho in kg/m³.
type Point struct {
	T, P, Rho float64
}

// TriplePoint is the solid–liquid–vapour triple point where this library's
// own phase models meet: temperature T in K, pressure P in Pa, and the
// densities of the three coexisting phases in kg/m³. RhoSolid is 0 for a
// fluid without a solid model.
type TriplePoint struct {
	T, P                          float64
	RhoSolid, RhoLiquid, RhoVapor float64
}

// Limits describe where an equation of state is used.
//
// The published range is TMin ≤ T ≤ TMax, p ≤ PMax (for water and carbon
// dioxide the lower bound in T is the melting or sublimation curve, which
// package fluid does not judge). Props accepts TFloor ≤ T ≤ TCeil and
// ρ ≤ RhoCeil, p ≤ PCeil, and flags states outside the published range
// Extrapolated.
type Limits struct {
	TMin, TMax, PMax float64 // published range: K, K, Pa
	TFloor, TCeil    float64 // accepted temperatures, K
	PCeil, RhoCeil   float64 // accepted pressure, Pa, and density, kg/m³
}

// Fluid is a pure fluid: its equation of state, constants, auxiliary
// equations and reference state. A *Fluid is immutable and safe for
// concurrent use; obtain one from Lookup.
type Fluid struct {
	name      string
	aliases   []string
	eos       string // name of the equation of state and its reference
	molarMass float64
	r         float64 // specific gas constant, J/(kg·K)
	tc, rhoc  float64
	crit      Point
	triple    TriplePoint
	limits    Limits
	ideal     *helmholtz.Ideal
	resid     *helmholtz.Residual
	aux       auxiliary

	ref        RefState
	hOff, sOff float64 // added to h (and u, g) and s by the reference state
}

// auxiliary holds a fluid's published auxiliary equations, in SI units.
// A nil function means the fluid has none.
type auxiliary struct {
	psat, rhoLiq, rhoVap func(T float64) float64 // valid TMin..Tc
	pmelt, psub          func(T float64) float64
	meltRange, subRange  [2]float64 // T ranges of pmelt and psub
}

// Name returns the canonical name of f, e.g. "CO2".
func (f *Fluid) Name() string { return f.name }

// Aliases returns the other names Lookup accepts for f.
func (f *Fluid) Aliases() []string { return append([]string(nil), f.aliases...) }

// EquationOfState names the equation of state of f and its publication.
func (f *Fluid) EquationOfState() string { return f.eos }

// MolarMass returns the molar mass of f in kg/mol.
func (f *Fluid) MolarMass() float64 { return f.molarMass }

// GasConstant returns the specific gas constant R/M of f's equation of
// state in J/(kg·K).
func (f *Fluid) GasConstant() float64 { return f.r }

// Critical returns the equation's own critical point: its reducing
// temperature and density, and the pressure the equation gives there.
func (f *Fluid) Critical() Point { return f.crit }

// Triple returns the triple point (see TriplePoint and the fluid's doc).
func (f *Fluid) Triple() TriplePoint { return f.triple }

// Limits returns the range of f's equation of state.
func (f *Fluid) Limits() Limits { return f.limits }

// Reference returns the reference state of f's enthalpy and entropy.
func (f *Fluid) Reference() RefState { return f.ref }

// ReferenceOffsets returns the constants Δh in J/kg and Δs in J/(kg·K)
// that f's reference state adds to the equation's own enthalpy (and
// internal, Gibbs and Helmholtz energies) and entropy. They are zero for
// RefDefault; solid models add the same offsets.
func (f *Fluid) ReferenceOffsets() (dh, ds float64) { return f.hOff, f.sOff }

// HasNonAnalytic reports whether f's equation has nonanalytic
// critical-region terms, which make cv and cp infinite and w zero at
// exactly the critical point.
func (f *Fluid) HasNonAnalytic() bool { return f.resid.HasNonAnalytic() }

// auxIn reports whether the auxiliary saturation equations apply at T.
func (f *Fluid) auxIn(T float64) bool {
	return T >= f.limits.TMin && T <= f.tc
}

// AuxVaporPressure returns the vapour pressure in Pa from f's published
// auxiliary equation, an approximation of the equation of state's own
// saturation for initial guesses and checks. It returns an error outside
// TMin ≤ T ≤ Tc.
func (f *Fluid) AuxVaporPressure(T float64) (float64, error) {
	return f.auxEval("fluid.AuxVaporPressure", f.aux.psat, T, f.limits.TMin, f.tc)
}

// AuxLiquidDensity returns the saturated-liquid density in kg/m³ from f's
// published auxiliary equation, for TMin ≤ T ≤ Tc.
func (f *Fluid) AuxLiquidDensity(T float64) (float64, error) {
	return f.auxEval("fluid.AuxLiquidDensity", f.aux.rhoLiq, T, f.limits.TMin, f.tc)
}

// AuxVaporDensity returns the saturated-vapour density in kg/m³ from f's
// published auxiliary equation, for TMin ≤ T ≤ Tc.
func (f *Fluid) AuxVaporDensity(T float64) (float64, error) {
	return f.auxEval("fluid.AuxVaporDensity", f.aux.rhoVap, T, f.limits.TMin, f.tc)
}

// AuxMeltingPressure returns the melting pressure in Pa at T from f's
// published melting equation, within its stated temperature range. The
// error wraps ErrUndefined for a fluid without one.
func (f *Fluid) AuxMeltingPressure(T float64) (float64, error) {
	return f.auxEval("fluid.AuxMeltingPressure", f.aux.pmelt, T, f.aux.meltRange[0], f.aux.meltRange[1])
}

// AuxSublimationPressure returns the sublimation pressure in Pa at T from
// f's published sublimation equation, within its stated temperature range.
// The error wraps ErrUndefined for a fluid without one.
func (f *Fluid) AuxSublimationPressure(T float64) (float64, error) {
	return f.auxEval("fluid.AuxSublimationPressure", f.aux.psub, T, f.aux.subRange[0], f.aux.subRange[1])
}

// AuxMeltingRange and AuxSublimationRange return the temperature ranges
// (K) of the published melting and sublimation equations; zero when the
// fluid has none.
func (f *Fluid) AuxMeltingRange() (lo, hi float64)     { return f.aux.meltRange[0], f.aux.meltRange[1] }
func (f *Fluid) AuxSublimationRange() (lo, hi float64) { return f.aux.subRange[0], f.aux.subRange[1] }

func (f *Fluid) auxEval(op string, fn func(float64) float64, T, lo, hi float64) (float64, error) {
	in := Input{Name: "T", Value: T, Unit: "K"}
	if fn == nil {
		return 0, NewError(op, ErrUndefined, "no such equation for "+f.name, in)
	}
	if !finite(T) || T <= 0 {
		return 0, NewError(op, ErrInvalidInput, "T must be finite and positive", in)
	}
	if T < lo || T > hi {
		return 0, NewError(op, ErrOutOfRange, rangeText("T", lo, hi, "K"), in)
	}
	return fn(T), nil
}

func rangeText(name string, lo, hi float64, unit string) string {
	return "valid range " + fmtG(lo) + " <= " + name + " <= " + fmtG(hi) + " " + unit
}

// powSum returns Σ a[i] x^t[i].
func powSum(a, t []float64, x float64) float64 {
	s := 0.0
	for i := range a {
		s += a[i] * math.Pow(x, t[i])
	}
	return s
}
