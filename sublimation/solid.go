package sublimation

import (
	"math"
	"strconv"
	"sync"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// Gibbs holds a specific Gibbs energy g(T, p) in J/kg and its partial
// derivatives: GT in J/(kg·K), GP in m³/kg, GTT in J/(kg·K²), GTP in
// m³/(kg·K), GPP in m³/(kg·Pa).
type Gibbs struct {
	G, GT, GP, GTT, GTP, GPP float64
}

type gibbsDerivs = Gibbs

// model is a Gibbs-energy function of one solid phase, in the reference
// state of its fluid's published equation of state.
type model interface {
	gibbs(T, p float64) gibbsDerivs
}

// Limits describe where a solid model is used. The published (or
// data-supported) range is TMin ≤ T ≤ TMax, p ≤ PMax; Props accepts
// TFloor ≤ T ≤ TCeil, 0 < p ≤ PCeil, and flags states outside the published
// range Extrapolated. Temperatures in K, pressures in Pa.
type Limits struct {
	TMin, TMax, PMax     float64
	TFloor, TCeil, PCeil float64
}

// solidData describes one solid model: its name, its Gibbs function and
// its range.
type solidData struct {
	name   string // e.g. "ice Ih"
	m      model
	limits Limits
	// beyond explains why pressures above PCeil are refused.
	beyond string
	// curveTMin is the lowest temperature of the sublimation curve: the
	// fluid's vapour floor.
	curveTMin float64
	// meltPMax and meltTEnd are the end of the melting curve the model
	// supports: its upper pressure in Pa and the temperature there in K
	// (the published one; the model's own is computed).
	meltPMax, meltTEnd float64
	// meltBeyond explains why the melting curve stops at meltPMax.
	meltBeyond string
	// high are the melting curves of the other solid phases that bound
	// the liquid beyond meltPMax (water's high-pressure ices), in order
	// of temperature; nil where there are none.
	high []highIce

	endsOnce sync.Once // builds ends, an immutable cache
	ends     *curveEnds
}

// Solid is the solid phase of a fluid: a Gibbs-energy model g(T, p) with
// the fluid's reference-state offsets, and the fluid it coexists with. It
// is a small value, cheap to copy, immutable and safe for concurrent use;
// obtain one from For. The zero Solid is not a model: its methods that
// return an error return one wrapping fluid.ErrInvalidInput ("zero Solid;
// obtain one from sublimation.For"), Name returns "", Limits and
// HighIceRange zeros, and Derivs NaN; none panics.
type Solid struct {
	f      *fluid.Fluid
	d      *solidData
	dh, ds float64 // reference-state offsets of f
}

// For returns the solid model of f: IAPWS-06 ice Ih for water, the dry-ice
// model of this package for carbon dioxide. The reference-state offsets of
// f (fluid.Fluid.ReferenceOffsets) apply to the solid as to the fluid.
//
// Special cases are:
//
//	f nil: error wrapping fluid.ErrInvalidInput
//	a fluid without a solid model (R-134a): error wrapping fluid.ErrUndefined
func For(f *fluid.Fluid) (Solid, error) {
	if f == nil {
		return Solid{}, fluid.NewError("sublimation.For", fluid.ErrInvalidInput, "nil fluid")
	}
	var d *solidData
	switch f.Name() {
	case "water":
		d = iceData
	case "CO2":
		d = dryIceData
	}
	if d == nil {
		return Solid{}, fluid.NewError("sublimation.For", fluid.ErrUndefined,
			"no solid model for "+f.Name()+"; solid models exist for water (ice Ih) and CO2 (dry ice)")
	}
	dh, ds := f.ReferenceOffsets()
	return Solid{f: f, d: d, dh: dh, ds: ds}, nil
}

// Name names the solid phase, e.g. "ice Ih" or "dry ice"; "" for the
// zero Solid.
func (s Solid) Name() string {
	if s.d == nil {
		return ""
	}
	return s.d.name
}

// Fluid returns the fluid whose solid phase s is (nil for the zero Solid).
func (s Solid) Fluid() *fluid.Fluid { return s.f }

// Limits returns the range of the solid model (zero for the zero Solid).
func (s Solid) Limits() Limits {
	if s.d == nil {
		return Limits{}
	}
	return s.d.limits
}

// zero returns the error of operation op for the zero Solid (not
// obtained from For), wrapping fluid.ErrInvalidInput. Every method that
// returns an error starts with a test of s.d, so that a zero Solid never
// panics (and the test allocates nothing).
func (s Solid) zero(op string, in ...fluid.Input) error {
	return fluid.NewError(op, fluid.ErrInvalidInput, "zero Solid; obtain one from sublimation.For", in...)
}

// Props are the properties of a solid phase at one (T, p), in SI units.
type Props struct {
	T   float64 // temperature, K
	P   float64 // pressure, Pa
	Rho float64 // density, kg/m³

	U float64 // specific internal energy, J/kg
	H float64 // specific enthalpy, J/kg
	S float64 // specific entropy, J/(kg·K)
	G float64 // specific Gibbs energy, J/kg
	F float64 // specific Helmholtz energy, J/kg

	Cp float64 // isobaric heat capacity, J/(kg·K)
	Cv float64 // isochoric heat capacity, J/(kg·K)
	W  float64 // bulk (thermodynamic) sound speed √(∂p/∂ρ)_s, m/s

	KappaT      float64 // isothermal compressibility (1/ρ)(∂ρ/∂p)_T, 1/Pa
	KappaS      float64 // isentropic compressibility (1/ρ)(∂ρ/∂p)_s, 1/Pa
	Expansivity float64 // volume expansivity (1/v)(∂v/∂T)_p, 1/K

	Flags fluid.Flags // Extrapolated outside the model's published range
}

// Derivs returns g(T, p) and its derivatives, with the reference-state
// offsets of s's fluid (G gains Δh − TΔs, GT gains −Δs), without range
// checks. It is for tripoint's solvers, which build Jacobians from it.
// For the zero Solid every derivative is NaN.
func (s Solid) Derivs(T, p float64) Gibbs {
	if s.d == nil {
		nan := math.NaN()
		return Gibbs{nan, nan, nan, nan, nan, nan}
	}
	g := s.d.m.gibbs(T, p)
	g.G += s.dh - T*s.ds
	g.GT -= s.ds
	return g
}

// Props returns the properties of the solid at temperature T in K and
// pressure p in Pa, from its Gibbs energy:
//
//	v = 1/ρ = g_p,  s = −g_T,  h = g − T g_T,  u = h − p g_p,  f = g − p g_p
//	cp = −T g_TT,  α = g_Tp/g_p,  κ_T = −g_pp/g_p,
//	κ_s = κ_T − T v α²/cp,  cv = cp κ_s/κ_T,  w = 1/√(ρ κ_s)
//
// plus the reference-state offsets of its fluid. Props judges only whether
// (T, p) lies in the model's range, not whether the solid is the stable
// phase there.
//
// Special cases are:
//
//	T or p NaN, ±Inf or ≤ 0: error wrapping fluid.ErrInvalidInput
//	T outside TFloor..TCeil or p > PCeil: error wrapping fluid.ErrOutOfRange
//	  (for ice Ih it names the other ices that exist beyond)
//
// Props allocates nothing unless it returns an error.
func (s Solid) Props(T, p float64) (Props, error) {
	if s.d == nil {
		return Props{}, s.zero("sublimation.Solid.Props", fluid.Input{Name: "T", Value: T, Unit: "K"},
			fluid.Input{Name: "p", Value: p, Unit: "Pa"})
	}
	if err := s.check("sublimation.Solid.Props", T, p); err != nil {
		return Props{}, err
	}
	return s.props(T, p), nil
}

// check validates (T, p) against the accepted region.
func (s Solid) check(op string, T, p float64) error {
	if !finite(T) || T <= 0 || !finite(p) || p <= 0 {
		return fluid.NewError(op, fluid.ErrInvalidInput, "T and p must be finite and positive",
			fluid.Input{Name: "T", Value: T, Unit: "K"}, fluid.Input{Name: "p", Value: p, Unit: "Pa"})
	}
	l := &s.d.limits
	if T < l.TFloor || T > l.TCeil {
		return fluid.NewError(op, fluid.ErrOutOfRange,
			"valid range "+fmtG(l.TFloor)+" <= T <= "+fmtG(l.TCeil)+" K for "+s.d.name,
			fluid.Input{Name: "T", Value: T, Unit: "K"}, fluid.Input{Name: "p", Value: p, Unit: "Pa"})
	}
	if p > l.PCeil*(1+1e-12) { // to rounding: a curve solved at the limit
		return fluid.NewError(op, fluid.ErrOutOfRange,
			"p must not exceed "+fmtG(l.PCeil)+" Pa for "+s.d.name+": "+s.d.beyond,
			fluid.Input{Name: "T", Value: T, Unit: "K"}, fluid.Input{Name: "p", Value: p, Unit: "Pa"})
	}
	return nil
}

// props evaluates the model without checks.
func (s Solid) props(T, p float64) Props {
	g := s.Derivs(T, p)
	return fromGibbs(T, p, &g, &s.d.limits)
}

// fromGibbs turns Gibbs derivatives into properties.
func fromGibbs(T, p float64, g *Gibbs, l *Limits) Props {
	v := g.GP
	pr := Props{T: T, P: p, Rho: 1 / v, G: g.G, S: -g.GT}
	pr.H = g.G - T*g.GT
	pr.U = pr.H - p*v
	pr.F = g.G - p*v
	pr.Cp = -T * g.GTT
	pr.Expansivity = g.GTP / v
	pr.KappaT = -g.GPP / v
	// κ_s = κ_T − T v α²/cp = (g_Tp² − g_TT g_pp)/(g_p g_TT)
	pr.KappaS = (g.GTP*g.GTP - g.GTT*g.GPP) / (v * g.GTT)
	pr.Cv = pr.Cp * pr.KappaS / pr.KappaT
	pr.W = math.Sqrt(v / pr.KappaS)
	if T < l.TMin || T > l.TMax || p > l.PMax {
		pr.Flags |= fluid.Extrapolated
	}
	return pr
}

func finite(x float64) bool { return x-x == 0 }

func fmtG(x float64) string { return strconv.FormatFloat(x, 'g', -1, 64) }
