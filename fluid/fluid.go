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

	// satHolder holds the cached saturation curve (satcurve.go), built on
	// first use; shared by the copies WithReference makes, nil for a
	// fluid not made by the registry.
	satHolder *satCurveHolder
	// denseHolder holds the table of densities above Tc that starts the
	// density solver there (densetable.go), as satHolder.
	denseHolder *denseTableHolder
}

// auxiliary holds a fluid's published auxiliary equations, in SI units.
// A nil function means the fluid has none.
type auxiliary struct {
	psat, rhoLiq, rhoVap func(T float64) float64 // valid TMin..tc
	// tc and pc are the critical temperature (K) and pressure (Pa) at
	// which psat, rhoLiq and rhoVap end, where these are not the
	// equation's own critical point (zero: they end there).
	tc, pc              float64
	pmelt, psub         func(T float64) float64
	meltRange, subRange [2]float64 // T ranges of pmelt and psub
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

// Critical returns the critical point of f's equation of state: the
// state where (∂p/∂ρ)_T = (∂²p/∂ρ²)_T = 0 and its vapour–liquid
// coexistence curve ends. For an equation constrained to its reducing
// point (IAPWS-95, Span–Wagner) it is the reducing temperature and
// density, with the pressure the equation gives there; for one that was
// not (Tillner-Roth–Baehr) it is solved from the equation (see the
// fluid's doc), and differs from the reducing point (see Reducing).
// Everything in tripoint that speaks of the critical point means this
// one: the end of the saturation curve, the Supercritical phase (T > Tc
// and p > pc) and the AtCritical flag.
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

// auxTc returns the temperature in K at which f's auxiliary saturation
// equations end: their publication's critical temperature, which is
// Critical().T except for R-134a (374.18 K, the reducing temperature).
func (f *Fluid) auxTc() float64 {
	if f.aux.tc > 0 {
		return f.aux.tc
	}
	return f.crit.T
}

// AuxVaporPressure returns the vapour pressure in Pa from f's published
// auxiliary equation, an approximation of the equation of state's own
// saturation for initial guesses and checks. It returns an error outside
// TMin ≤ T ≤ Tc, where Tc is the temperature at which the published
// equation ends: Critical().T, except for R-134a, whose auxiliary
// equations end at the publication's Tc = 374.18 K, below its equation's
// own critical temperature (as starting values the solvers carry them
// on to it within 0.37 K of it).
func (f *Fluid) AuxVaporPressure(T float64) (float64, error) {
	return f.auxEval("fluid.AuxVaporPressure", f.aux.psat, T, f.limits.TMin, f.auxTc())
}

// AuxLiquidDensity returns the saturated-liquid density in kg/m³ from f's
// published auxiliary equation, for TMin ≤ T ≤ Tc (Tc as for
// AuxVaporPressure).
func (f *Fluid) AuxLiquidDensity(T float64) (float64, error) {
	return f.auxEval("fluid.AuxLiquidDensity", f.aux.rhoLiq, T, f.limits.TMin, f.auxTc())
}

// AuxVaporDensity returns the saturated-vapour density in kg/m³ from f's
// published auxiliary equation, for TMin ≤ T ≤ Tc (Tc as for
// AuxVaporPressure).
func (f *Fluid) AuxVaporDensity(T float64) (float64, error) {
	return f.auxEval("fluid.AuxVaporDensity", f.aux.rhoVap, T, f.limits.TMin, f.auxTc())
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

// criticalOfEquation solves for the critical point of f's equation of
// state, for an equation that was not constrained to its reducing point:
// where, in reduced variables,
//
//	y   = 1 + 2δαʳ_δ + δ²αʳ_δδ       = (∂p/∂ρ)_T/(RT)   = 0,
//	y_δ = 2αʳ_δ + 4δαʳ_δδ + δ²αʳ_δδδ = (ρc/RT)(∂²p/∂ρ²)_T = 0.
//
// Newton's method in (δ, τ), started at the reducing point. The residuals
// y and y_δ are analytic (helmholtz.Derivs up to αʳ_δδδ), and so is
// ∂y/∂δ = y_δ; the other Jacobian entries, which would need fourth
// derivatives, are central differences of the analytic y and y_δ (step
// 1e-5): they steer the iteration only, while the point it stops at is
// fixed by the analytic residuals. The Jacobian is regular there
// (∂y/∂δ = 0, but ∂y/∂τ and ∂y_δ/∂δ are not). The iteration stops when
// both steps are below 1e-14 and keeps the iterate of smallest residual;
// it fails (ok false) unless |y| and |y_δ| are then within 1e-12. The
// equation must not have nonanalytic terms (their derivatives diverge at
// δ = τ = 1).
func (f *Fluid) criticalOfEquation() (c Point, ok bool) {
	yy := func(d, tau float64) (y, yd float64) {
		r := f.resid.Eval(d, tau)
		y = 1 + 2*d*r.D + d*d*r.DD
		yd = 2*r.D + 4*d*r.DD + d*d*r.DDD
		return y, yd
	}
	const h = 1e-5
	d, tau := 1.0, 1.0
	bd, bt, best := d, tau, math.Inf(1)
	for it := 0; it < 50; it++ {
		y, yd := yy(d, tau)
		if !finite(y) || !finite(yd) {
			break
		}
		if res := math.Abs(y) + math.Abs(yd); res < best {
			bd, bt, best = d, tau, res
		}
		_, ydp := yy(d+h, tau)
		_, ydm := yy(d-h, tau)
		yp, ydtp := yy(d, tau+h)
		ym, ydtm := yy(d, tau-h)
		a, b := yd, (yp-ym)/(2*h)                  // ∂y/∂δ, ∂y/∂τ
		c, e := (ydp-ydm)/(2*h), (ydtp-ydtm)/(2*h) // ∂y_δ/∂δ, ∂y_δ/∂τ
		det := a*e - b*c
		dd := (y*e - b*yd) / det
		dt := (a*yd - c*y) / det
		if !finite(dd) || !finite(dt) {
			break
		}
		d, tau = d-dd, tau-dt
		if math.Abs(dd) <= 1e-14 && math.Abs(dt) <= 1e-14 {
			if y, yd := yy(d, tau); math.Abs(y)+math.Abs(yd) < best {
				bd, bt, best = d, tau, math.Abs(y)+math.Abs(yd)
			}
			break
		}
	}
	if !(best <= 1e-12) || f.resid.HasNonAnalytic() {
		return Point{}, false
	}
	T, rho := f.tc/bt, bd*f.rhoc
	return Point{T: T, Rho: rho, P: f.props(T, rho).P}, true
}

// setCriticalProps gives the properties at exactly the critical point
// (T, ρ) = Critical(), flagged AtCritical, from tt = τ²(α°_ττ + αʳ_ττ)
// and x = 1 + δαʳ_δ − δταʳ_δτ = (∂p/∂T)_ρ/(ρR) there. There
// (∂p/∂ρ)_T = 0, so that cp, κT and the expansivity are infinite and the
// Joule–Thomson coefficient is its limit 1/(∂p/∂T)_ρ. With nonanalytic
// terms cv is infinite too and w zero; without them (Tillner-Roth–Baehr)
// cv = −Rτ²α_ττ and w = √(T/cv)·(∂p/∂T)_ρ/ρ (the limit of
// w² = (∂p/∂ρ)_T cp/cv as (∂p/∂ρ)_T → 0) are finite.
func (f *Fluid) setCriticalProps(p *Props, tt, x float64) {
	inf := math.Inf(1)
	p.Flags |= AtCritical
	p.DpDrho = 0
	p.Cp, p.KappaT, p.Expansivity = inf, inf, inf
	p.JouleThomson = 1 / p.DpDT
	if f.resid.HasNonAnalytic() {
		p.Cv, p.W = inf, 0
		return
	}
	p.Cv = -f.r * tt
	p.W = math.Sqrt(math.Max(-f.r*p.T*x*x/tt, 0))
}
