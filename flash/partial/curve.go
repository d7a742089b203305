package partial

import (
	"math"
	"strconv"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/sublimation"
)

// Curve identifies a two-phase coexistence curve. The values are stable
// (the C ABI passes them as integer codes); 0 is no curve.
type Curve int32

const (
	Saturation  Curve = 1 // liquid–vapour, from the triple point to the critical point
	Sublimation Curve = 2 // solid–vapour, below the triple point
	Melting     Curve = 3 // solid–liquid (or solid–dense fluid above Tc), above the triple point
)

var curveNames = [...]string{"", "Saturation", "Sublimation", "Melting"}

// String returns the name of c, e.g. "Melting".
func (c Curve) String() string {
	if c >= Saturation && c <= Melting {
		return curveNames[c]
	}
	return "Curve(" + strconv.Itoa(int(c)) + ")"
}

// Slopes are the derivatives along a coexistence curve at one of its
// points: the curve's slope DpDT and, for each of its two phases, how the
// phase's properties change as the point moves along the curve. Obtain
// them from SlopesAtT, SlopesAtP or SlopesOf (the zero value is not
// usable) and read them with Derivative. A Slopes is a plain value, safe
// for concurrent use.
type Slopes struct {
	Curve Curve
	T, P  float64 // the point of the curve: K, Pa
	// DpDT is the slope dp/dT of the curve in Pa/K, from the
	// Clausius–Clapeyron equation (s₂ − s₁)/(v₂ − v₁) with the phases'
	// own entropies and volumes.
	DpDT float64
	// Phases are the two coexisting phases, in the order solid, liquid,
	// vapour (as State.Phases); the fluid on the melting curve above the
	// critical temperature is Supercritical.
	Phases [2]flash.Phase

	ph [2]along
}

// along is one phase on the curve: its v and s, and dv/dT and ds/dT along
// the curve.
type along struct{ v, s, dv, ds float64 }

// SlopesAtT returns the slopes of curve c of fluid f at temperature temp
// in K. It solves the curve at temp (fluid.Fluid.SaturationAtT,
// sublimation.Solid.SublimationPressure or MeltingPressure) and takes the
// slopes from the two phases found there (see Slopes.Derivative).
//
// Special cases are:
//
//	f nil or c not a Curve: error wrapping fluid.ErrInvalidInput
//	Sublimation or Melting for a fluid without a solid model:
//	  fluid.ErrUndefined
//	the errors of the curve's solver (temp outside the curve:
//	  fluid.ErrOutOfRange)
//	the critical point (Saturation at T = Tc): DpDT is (∂p/∂T)_ρ there,
//	  the limit of the curve's slope; the phases' own derivatives are
//	  infinite there (Derivative reports them as undefined)
func SlopesAtT(f *fluid.Fluid, c Curve, temp float64) (Slopes, error) {
	return slopesAt("partial.SlopesAtT", f, c, temp, false)
}

// SlopesAtP returns the slopes of curve c of fluid f at pressure pres in
// Pa, as SlopesAtT; it solves the curve with fluid.Fluid.SaturationAtP,
// sublimation.Solid.SublimationTemperature or MeltingTemperature.
func SlopesAtP(f *fluid.Fluid, c Curve, pres float64) (Slopes, error) {
	return slopesAt("partial.SlopesAtP", f, c, pres, true)
}

func slopesAt(op string, f *fluid.Fluid, c Curve, x float64, atP bool) (Slopes, error) {
	in := fluid.Input{Name: "T", Value: x, Unit: "K"}
	if atP {
		in = fluid.Input{Name: "p", Value: x, Unit: "Pa"}
	}
	if f == nil {
		return Slopes{}, fluid.NewError(op, fluid.ErrInvalidInput, "nil fluid", in)
	}
	if c == Saturation {
		s, err := saturation(f, x, atP)
		if err != nil {
			return Slopes{}, rewrapIn(op, in, err)
		}
		l, v := fluidPhase(&s.Liquid), fluidPhase(&s.Vapor)
		return newSlopes(c, s.T, s.P, flash.Liquid, flash.Vapor, l, v), nil
	}
	if c != Sublimation && c != Melting {
		return Slopes{}, fluid.NewError(op, fluid.ErrInvalidInput,
			"the curve must be Saturation, Sublimation or Melting (codes 1 to 3)", in)
	}
	co, err := solidCurve(f, c, x, atP)
	if err != nil {
		return Slopes{}, rewrapIn(op, in, err)
	}
	second := flash.Vapor
	if c == Melting {
		second = meltPhase(f, co.T, co.P)
	}
	return newSlopes(c, co.T, co.P, flash.Solid, second, solidPhase(&co.Solid), fluidPhase(&co.Fluid)), nil
}

// saturation solves the vapour–liquid saturation of f at temperature x
// (atP false) or pressure x (atP true).
func saturation(f *fluid.Fluid, x float64, atP bool) (fluid.Saturation, error) {
	if atP {
		return f.SaturationAtP(x)
	}
	return f.SaturationAtT(x)
}

// solidCurve solves the sublimation or melting curve c of f at
// temperature x (atP false) or pressure x (atP true).
func solidCurve(f *fluid.Fluid, c Curve, x float64, atP bool) (sublimation.Coexistence, error) {
	sol, err := sublimation.For(f)
	if err != nil {
		return sublimation.Coexistence{}, err
	}
	switch {
	case c == Sublimation && atP:
		return sol.SublimationTemperature(x)
	case c == Sublimation:
		return sol.SublimationPressure(x)
	case atP:
		return sol.MeltingTemperature(x)
	}
	return sol.MeltingPressure(x)
}

// SlopesOf returns the slopes of the coexistence curve on which the
// two-phase state st of fluid f lies (Phase TwoPhase, SolidVapor or
// SolidLiquid), from the phases of st: the equation of state at each
// fluid phase's (st.T, ρᵢ) and the solid's Gibbs energy at (st.T, st.P).
// This is the saturation-derivative evaluation: two evaluations, no curve
// to solve.
//
// Special cases are:
//
//	f nil, st not a two-phase state, or a malformed st: error wrapping
//	  fluid.ErrInvalidInput (a Triple state lies on three curves: use
//	  SlopesAtT at its temperature)
//	the errors of fluid.Fluid.Props and sublimation.Solid.Props
func SlopesOf(f *fluid.Fluid, st flash.State) (Slopes, error) {
	const op = "partial.SlopesOf"
	if f == nil {
		return Slopes{}, stateError(op, &st, fluid.ErrInvalidInput, "nil fluid")
	}
	if why := checkState(&st); why != "" {
		return Slopes{}, stateError(op, &st, fluid.ErrInvalidInput, why)
	}
	if st.N != 2 {
		return Slopes{}, stateError(op, &st, fluid.ErrInvalidInput,
			"not a two-phase state (TwoPhase, SolidVapor or SolidLiquid)")
	}
	return slopesOf(op, f, &st)
}

// slopesOf is SlopesOf for a checked two-phase st.
func slopesOf(op string, f *fluid.Fluid, st *flash.State) (Slopes, error) {
	var a [2]phaseData
	for i := 0; i < 2; i++ {
		ps := &st.Phases[i]
		if ps.Phase == flash.Solid {
			sol, err := sublimation.For(f)
			if err != nil {
				return Slopes{}, rewrap(op, st, err)
			}
			sp, err := sol.Props(st.T, st.P)
			if err != nil {
				return Slopes{}, rewrap(op, st, err)
			}
			a[i] = solidPhase(&sp)
			continue
		}
		pr, err := f.Props(st.T, ps.Rho)
		if err != nil {
			return Slopes{}, rewrap(op, st, err)
		}
		a[i] = fluidPhase(&pr)
	}
	c := Saturation
	switch st.Phase {
	case flash.SolidVapor:
		c = Sublimation
	case flash.SolidLiquid:
		c = Melting
	}
	return newSlopes(c, st.T, st.P, st.Phases[0].Phase, st.Phases[1].Phase, a[0], a[1]), nil
}

// phaseData is one phase at a point of a curve: v, s and its derivatives
// in (T, p) or (T, v). A fluid phase gives (∂p/∂T)_v, (∂p/∂ρ)_T and cv; a
// solid gives α, κ_T and cp.
type phaseData struct {
	solid         bool
	T, v, s       float64
	pT, pRho, cv  float64 // fluid
	alpha, kT, cp float64 // solid
}

func fluidPhase(pr *fluid.Props) phaseData {
	return phaseData{T: pr.T, v: 1 / pr.Rho, s: pr.S, pT: pr.DpDT, pRho: pr.DpDrho, cv: pr.Cv}
}

func solidPhase(sp *sublimation.Props) phaseData {
	return phaseData{solid: true, T: sp.T, v: 1 / sp.Rho, s: sp.S, alpha: sp.Expansivity, kT: sp.KappaT, cp: sp.Cp}
}

// slope returns dv/dT and ds/dT of phase d along a curve of slope gamma:
// for a fluid phase, with dρ/dT = (γ − (∂p/∂T)_ρ)/(∂p/∂ρ)_T,
//
//	dv/dT = −(1/ρ²) dρ/dT,  ds/dT = cv/T + (∂p/∂T)_ρ dv/dT;
//
// for a solid, with v = g_p,
//
//	dv/dT = g_Tp + g_pp γ = v(α − κ_T γ),  ds/dT = −g_TT − g_Tp γ = cp/T − αvγ.
func (d *phaseData) slope(gamma float64) (dv, ds float64) {
	if d.solid {
		return d.v * (d.alpha - d.kT*gamma), d.cp/d.T - d.alpha*d.v*gamma
	}
	drho := (gamma - d.pT) / d.pRho
	dv = -drho * d.v * d.v
	return dv, d.cv/d.T + d.pT*dv
}

// newSlopes builds the slopes of curve c at (T, p) from its two phases.
func newSlopes(c Curve, T, p float64, ph1, ph2 flash.Phase, a, b phaseData) Slopes {
	s := Slopes{Curve: c, T: T, P: p, Phases: [2]flash.Phase{ph1, ph2}}
	s.ph[0] = along{v: a.v, s: a.s}
	s.ph[1] = along{v: b.v, s: b.s}
	if a.v == b.v {
		// The critical point: the phases are one; the slope is the
		// limit (∂p/∂T)_ρ, the phases' own slopes are infinite.
		s.DpDT = a.pT
		nan := math.NaN()
		s.ph[0].dv, s.ph[0].ds, s.ph[1].dv, s.ph[1].ds = nan, nan, nan, nan
		return s
	}
	s.DpDT = (b.s - a.s) / (b.v - a.v)
	s.ph[0].dv, s.ph[0].ds = a.slope(s.DpDT)
	s.ph[1].dv, s.ph[1].ds = b.slope(s.DpDT)
	return s
}

// Derivative returns da/db of phase i (0 or 1, as Phases) along the
// curve, in SI units: with b = T the derivative with respect to
// temperature, with b = P with respect to pressure (any other b of the
// phase serves too, e.g. dh″/ds″). Along the curve each quantity is a
// function of one variable, with
//
//	dp = γ dT,  dv, ds from the phase's own derivatives (see slope),
//	du = T ds − p dv,  dh = T ds + v dp,  dg = −s dT + v dp,
//	df = −s dT − p dv,  dρ = −ρ² dv,
//
// so that T, p and g are common to both phases and dp/dT = γ = DpDT.
//
// Special cases are:
//
//	i not 0 or 1, a or b not one of T … F, s the zero Slopes: NaN,
//	  error wrapping fluid.ErrInvalidInput
//	db = 0 along the curve, or a result that is not finite (the phases'
//	  derivatives at the critical point): NaN, error wrapping
//	  fluid.ErrUndefined
//
// Derivative allocates nothing unless it returns an error.
func (s *Slopes) Derivative(i int, a, b Quantity) (float64, error) {
	if s.Curve < Saturation || s.Curve > Melting {
		return math.NaN(), s.error(fluid.ErrInvalidInput, i, a, b, "the zero Slopes: obtain them from SlopesAtT, SlopesAtP or SlopesOf")
	}
	if i != 0 && i != 1 || !a.Valid() || !b.Valid() {
		return math.NaN(), s.error(fluid.ErrInvalidInput, i, a, b,
			"the phase index must be 0 or 1, the quantities among T, p, rho, v, u, h, s, g, f (codes 1 to 9)")
	}
	if a == b {
		return 1, nil
	}
	da, db := s.d(i, a), s.d(i, b)
	r := da / db
	if db == 0 || !finite(r) {
		return math.NaN(), s.error(fluid.ErrUndefined, i, a, b, "not finite on the curve here")
	}
	return r + 0, nil
}

// d returns dq/dT of phase i along the curve.
func (s *Slopes) d(i int, q Quantity) float64 {
	p := &s.ph[i]
	g := s.DpDT
	switch q {
	case T:
		return 1
	case P:
		return g
	case Rho:
		return -p.dv / (p.v * p.v)
	case V:
		return p.dv
	case U:
		return s.T*p.ds - s.P*p.dv
	case H:
		return s.T*p.ds + p.v*g
	case S:
		return p.ds
	case G:
		return -p.s + p.v*g
	}
	return -p.s - s.P*p.dv // F
}

// mixtureCv returns the isochoric heat capacity T(∂s/∂T)_v of a mixture
// of the two phases with mass fractions x1, x2 along the curve: at fixed
// v = x1 v1 + x2 v2, dx2/dT = −(x1 v1′ + x2 v2′)/(v2 − v1), and
//
//	cv = T (x1 s1′ + x2 s2′ + (s2 − s1) dx2/dT).
func (s *Slopes) mixtureCv(x1, x2 float64) float64 {
	a, b := &s.ph[0], &s.ph[1]
	dx := -(x1*a.dv + x2*b.dv) / (b.v - a.v)
	return s.T * (x1*a.ds + x2*b.ds + (b.s-a.s)*dx)
}

func (s *Slopes) error(sentinel error, i int, a, b Quantity, why string) error {
	return fluid.NewError("partial.Slopes.Derivative", sentinel,
		"d"+a.String()+"/d"+b.String()+" of phase "+strconv.Itoa(i)+" along the "+s.Curve.String()+" curve: "+why,
		fluid.Input{Name: "T", Value: s.T, Unit: "K"}, fluid.Input{Name: "p", Value: s.P, Unit: "Pa"})
}

// meltPhase names the fluid phase on the melting curve at (T, p).
func meltPhase(f *fluid.Fluid, T, p float64) flash.Phase {
	if c := f.Critical(); T > c.T && p > c.P {
		return flash.Supercritical
	}
	return flash.Liquid
}

// rewrapIn is rewrap for an operation with one input.
func rewrapIn(op string, in fluid.Input, err error) error {
	sentinel, why := cause(err)
	return fluid.NewError(op, sentinel, why, in)
}
