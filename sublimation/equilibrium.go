package sublimation

import (
	"math"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// Coexistence is a solid in equilibrium with one fluid phase: with the
// vapour on the sublimation curve, with the liquid (or the dense fluid
// above the critical temperature) on the melting curve. T is in K and P in
// Pa; Solid and Fluid are the two coexisting phases at (T, P), with equal
// Gibbs energies. Solid.Flags and Fluid.Flags carry Saturated.
type Coexistence struct {
	T, P  float64
	Solid Props
	Fluid fluid.Props
}

// ThreePhase is the triple point where the solid model and the fluid's
// equation of state meet: solid, liquid and vapour at one (T, P) with equal
// Gibbs energies and equal pressures. T is in K and P in Pa.
type ThreePhase struct {
	T, P          float64
	Solid         Props
	Liquid, Vapor fluid.Props
}

// Solver settings. Newton converges quadratically from the auxiliary-curve
// guesses; the limits only bound pathological inputs.
const (
	// edgeSlack widens the curve ranges by this relative amount, so that
	// the nominal triple point (273.16 K, 216.592 K) is accepted although
	// the models meet within ~1e-11 K of it.
	edgeSlack = 1e-9
	maxIter   = 60
	tolStep   = 1e-12 // on ln ρ and on T/T
)

// curveEnds are the model's own ends of its curves; they do not depend on
// the reference state, so one computation serves every Solid of a model.
type curveEnds struct {
	triple   [4]float64 // T, p, ρ_liquid, ρ_vapour
	subPMin  float64    // sublimation pressure at curveTMin, Pa
	meltTEnd float64    // melting temperature at meltPMax, K
	err      error
}

// ends returns the model's curve ends, computing them once.
func (s Solid) ends() *curveEnds {
	s.d.endsOnce.Do(func() {
		e := &curveEnds{}
		s.d.ends = e
		tp, err := s.solveTriple()
		if err != nil {
			e.err = err
			return
		}
		e.triple = tp
		c, err := s.sublimationAtT("sublimation.Solid.SublimationPressure", s.d.curveTMin, 0)
		if err != nil {
			e.err = err
			return
		}
		e.subPMin = c.P
		m, err := s.meltingAtP("sublimation.Solid.MeltingTemperature", s.d.meltPMax, 0, 0)
		if err != nil {
			e.err = err
			return
		}
		e.meltTEnd = m.T
	})
	return s.d.ends
}

// SublimationPressure returns the sublimation curve at temperature T in K:
// the pressure at which the solid and the vapour have equal Gibbs
// energies, with both phases. The curve runs from the fluid's vapour
// floor (Limits().TFloor of the fluid: 200 K for water, 150 K for CO2) to
// the triple point.
//
// Special cases are:
//
//	T NaN, ±Inf or ≤ 0: error wrapping fluid.ErrInvalidInput
//	T below the vapour floor or above the triple point: fluid.ErrOutOfRange
func (s Solid) SublimationPressure(T float64) (Coexistence, error) {
	return s.SublimationPressureFrom(T, 0)
}

// SublimationPressureFrom is SublimationPressure started from the vapour
// density rhoV in kg/m³ of a nearby point of the curve (a warm start; a
// value that is not finite and positive starts cold). The result does not
// depend on the start beyond the solver's tolerance.
func (s Solid) SublimationPressureFrom(T, rhoV float64) (Coexistence, error) {
	const op = "sublimation.Solid.SublimationPressure"
	in, e, err := s.curveInput(op, "T", T, "K")
	if err != nil {
		return Coexistence{}, err
	}
	if T < s.d.curveTMin || T > e.triple[0]*(1+edgeSlack) {
		return Coexistence{}, fluid.NewError(op, fluid.ErrOutOfRange,
			"valid range "+fmtG(s.d.curveTMin)+" <= T <= "+fmtG(e.triple[0])+" K (vapour floor to triple point) for "+s.d.name, in)
	}
	return s.sublimationAtT(op, T, warm(rhoV))
}

// warm returns x where it can start an iteration (finite and positive),
// else 0 (a cold start).
func warm(x float64) float64 {
	if finite(x) && x > 0 {
		return x
	}
	return 0
}

// SublimationTemperature returns the sublimation curve at pressure p in
// Pa: the temperature at which the solid and the vapour have equal Gibbs
// energies, with both phases. p runs from the sublimation pressure at the
// vapour floor to the triple-point pressure.
//
// Special cases are:
//
//	p NaN, ±Inf or ≤ 0: error wrapping fluid.ErrInvalidInput
//	p outside the curve's range: fluid.ErrOutOfRange
func (s Solid) SublimationTemperature(p float64) (Coexistence, error) {
	return s.SublimationTemperatureFrom(p, 0, 0)
}

// SublimationTemperatureFrom is SublimationTemperature started from the
// temperature T0 in K and vapour density rhoV in kg/m³ of a nearby point
// of the curve (a warm start; values that are not finite and positive
// start cold).
func (s Solid) SublimationTemperatureFrom(p, T0, rhoV float64) (Coexistence, error) {
	const op = "sublimation.Solid.SublimationTemperature"
	in, e, err := s.curveInput(op, "p", p, "Pa")
	if err != nil {
		return Coexistence{}, err
	}
	if p < e.subPMin*(1-edgeSlack) || p > e.triple[1]*(1+edgeSlack) {
		return Coexistence{}, fluid.NewError(op, fluid.ErrOutOfRange,
			"valid range "+fmtG(e.subPMin)+" <= p <= "+fmtG(e.triple[1])+" Pa (vapour floor "+
				fmtG(s.d.curveTMin)+" K to triple point) for "+s.d.name, in)
	}
	if warm(T0) == 0 {
		rhoV = 0
	}
	return s.sublimationAtP(op, p, warm(T0), warm(rhoV))
}

// MeltingPressure returns the melting curve at temperature T in K: the
// pressure above the triple point at which the solid and the liquid have
// equal Gibbs energies, with both phases. For ice Ih the curve runs from
// the triple point down to 251.165 K (208.566 MPa, where ice III appears);
// for dry ice from the triple point up to the model's pressure limit.
//
// Special cases are:
//
//	T NaN, ±Inf or ≤ 0: error wrapping fluid.ErrInvalidInput
//	T outside the curve's range: fluid.ErrOutOfRange (for water naming
//	  the other ices)
func (s Solid) MeltingPressure(T float64) (Coexistence, error) {
	return s.MeltingPressureFrom(T, 0)
}

// MeltingPressureFrom is MeltingPressure started from the liquid density
// rhoL in kg/m³ of a nearby point of the curve (a warm start; a value that
// is not finite and positive starts cold).
func (s Solid) MeltingPressureFrom(T, rhoL float64) (Coexistence, error) {
	const op = "sublimation.Solid.MeltingPressure"
	in, e, err := s.curveInput(op, "T", T, "K")
	if err != nil {
		return Coexistence{}, err
	}
	lo, hi := e.triple[0], e.meltTEnd
	if lo > hi {
		lo, hi = hi, lo
	}
	if T < lo*(1-edgeSlack) || T > hi*(1+edgeSlack) {
		return Coexistence{}, fluid.NewError(op, fluid.ErrOutOfRange,
			"valid range "+fmtG(lo)+" <= T <= "+fmtG(hi)+" K for the melting of "+s.d.name+"; "+s.d.meltBeyond, in)
	}
	return s.meltingAtT(op, T, warm(rhoL))
}

// MeltingTemperature returns the melting curve at pressure p in Pa, from
// the triple-point pressure to the end of the model's melting curve
// (208.566 MPa for ice Ih; the dry-ice model's pressure limit for CO2).
//
// Special cases are:
//
//	p NaN, ±Inf or ≤ 0: error wrapping fluid.ErrInvalidInput
//	p outside the curve's range: fluid.ErrOutOfRange (for water naming
//	  the other ices)
func (s Solid) MeltingTemperature(p float64) (Coexistence, error) {
	return s.MeltingTemperatureFrom(p, 0, 0)
}

// MeltingTemperatureFrom is MeltingTemperature started from the
// temperature T0 in K and liquid density rhoL in kg/m³ of a nearby point
// of the curve (a warm start; values that are not finite and positive
// start cold).
func (s Solid) MeltingTemperatureFrom(p, T0, rhoL float64) (Coexistence, error) {
	const op = "sublimation.Solid.MeltingTemperature"
	in, e, err := s.curveInput(op, "p", p, "Pa")
	if err != nil {
		return Coexistence{}, err
	}
	if p < e.triple[1]*(1-edgeSlack) || p > s.d.meltPMax*(1+1e-12) { // the end to rounding
		return Coexistence{}, fluid.NewError(op, fluid.ErrOutOfRange,
			"valid range "+fmtG(e.triple[1])+" <= p <= "+fmtG(s.d.meltPMax)+" Pa for the melting of "+s.d.name+"; "+s.d.meltBeyond, in)
	}
	if warm(T0) == 0 {
		rhoL = 0
	}
	return s.meltingAtP(op, p, warm(T0), warm(rhoL))
}

// curveInput is the common start of the curve functions: the input x
// named name (finite and positive, else ErrInvalidInput) and the curves'
// end points.
func (s Solid) curveInput(op, name string, x float64, unit string) (fluid.Input, *curveEnds, error) {
	in := fluid.Input{Name: name, Value: x, Unit: unit}
	if s.d == nil {
		return in, nil, s.zero(op, in)
	}
	if !finite(x) || x <= 0 {
		return in, nil, fluid.NewError(op, fluid.ErrInvalidInput, name+" must be finite and positive", in)
	}
	e := s.ends()
	if e.err != nil {
		return in, nil, e.err
	}
	return in, e, nil
}

// Triple returns the triple point where the solid model, the liquid and
// the vapour of the fluid's equation of state have one pressure and one
// Gibbs energy. It is computed once per model (it does not depend on the
// reference state) and agrees with the constants of fluid.Fluid.Triple.
func (s Solid) Triple() (ThreePhase, error) {
	if s.d == nil {
		return ThreePhase{}, s.zero("sublimation.Solid.Triple")
	}
	e := s.ends()
	if e.err != nil {
		return ThreePhase{}, e.err
	}
	T, p := e.triple[0], e.triple[1]
	liq, err := s.f.Props(T, e.triple[2])
	if err != nil {
		return ThreePhase{}, err
	}
	vap, err := s.f.Props(T, e.triple[3])
	if err != nil {
		return ThreePhase{}, err
	}
	sol := s.props(T, p)
	sol.Flags |= fluid.Saturated
	liq.Flags |= fluid.Saturated
	vap.Flags |= fluid.Saturated
	return ThreePhase{T: T, P: p, Solid: sol, Liquid: liq, Vapor: vap}, nil
}

// FractionsRhoU returns the mass fractions of solid, liquid and vapour of
// a three-phase mixture at the triple point with overall density rho in
// kg/m³ and specific internal energy u in J/kg: the solution of
//
//	xs + xl + xv = 1,  Σ xi/ρi = 1/ρ,  Σ xi ui = u.
//
// (ρ, u), (ρ, h) and (ρ, s) fix the fractions; (h, s) does not, since
// every three-phase mixture has h − Tt·s = g_t. The error wraps
// fluid.ErrOutOfRange when the state is not a three-phase mixture (a
// fraction outside [0, 1] by more than 1e-12) and fluid.ErrInvalidInput
// for non-finite or non-positive rho or non-finite u.
func (tp ThreePhase) FractionsRhoU(rho, u float64) (solid, liquid, vapor float64, err error) {
	return tp.fractions("sublimation.ThreePhase.FractionsRhoU", rho, u, "u", "J/kg",
		tp.Solid.U, tp.Liquid.U, tp.Vapor.U)
}

// FractionsRhoH is FractionsRhoU with the specific enthalpy h in J/kg.
func (tp ThreePhase) FractionsRhoH(rho, h float64) (solid, liquid, vapor float64, err error) {
	return tp.fractions("sublimation.ThreePhase.FractionsRhoH", rho, h, "h", "J/kg",
		tp.Solid.H, tp.Liquid.H, tp.Vapor.H)
}

// FractionsRhoS is FractionsRhoU with the specific entropy s in J/(kg·K).
func (tp ThreePhase) FractionsRhoS(rho, s float64) (solid, liquid, vapor float64, err error) {
	return tp.fractions("sublimation.ThreePhase.FractionsRhoS", rho, s, "s", "J/(kg K)",
		tp.Solid.S, tp.Liquid.S, tp.Vapor.S)
}

func (tp ThreePhase) fractions(op string, rho, e float64, name, unit string, es, el, ev float64) (xs, xl, xv float64, err error) {
	// The inputs for an error, built only there (allocation-free otherwise).
	in := func() []fluid.Input {
		return []fluid.Input{{Name: "rho", Value: rho, Unit: "kg/m3"}, {Name: name, Value: e, Unit: unit}}
	}
	if !finite(rho) || rho <= 0 || !finite(e) {
		return 0, 0, 0, fluid.NewError(op, fluid.ErrInvalidInput, "rho must be finite and positive, "+name+" finite", in()...)
	}
	vs, vl, vv := 1/tp.Solid.Rho, 1/tp.Liquid.Rho, 1/tp.Vapor.Rho
	// Eliminate xl = 1 − xs − xv:
	//	xs (vs − vl) + xv (vv − vl) = v − vl
	//	xs (es − el) + xv (ev − el) = e − el
	a, b, c := vs-vl, vv-vl, 1/rho-vl
	d, f, g := es-el, ev-el, e-el
	det := a*f - b*d
	if det == 0 {
		return 0, 0, 0, fluid.NewError(op, fluid.ErrUndefined, "degenerate triple point", in()...)
	}
	xs = (c*f - b*g) / det
	xv = (a*g - c*d) / det
	xl = 1 - xs - xv
	const tol = 1e-12
	if xs < -tol || xl < -tol || xv < -tol || xs > 1+tol || xl > 1+tol || xv > 1+tol {
		return xs, xl, xv, fluid.NewError(op, fluid.ErrOutOfRange,
			"not a three-phase mixture: fractions solid "+fmtG(xs)+", liquid "+fmtG(xl)+", vapour "+fmtG(xv), in()...)
	}
	clamp := func(x float64) float64 { return math.Min(math.Max(x, 0), 1) }
	return clamp(xs), clamp(xl), clamp(xv), nil
}

// SublimationCurve returns n ≥ 2 points of the sublimation curve, evenly
// spaced in temperature from the vapour floor to the triple point, for
// charts. The error wraps fluid.ErrInvalidInput for n < 2 or n > 100000.
func (s Solid) SublimationCurve(n int) ([]Coexistence, error) {
	const op = "sublimation.Solid.SublimationCurve"
	if s.d == nil {
		return nil, s.zero(op, fluid.Input{Name: "n", Value: float64(n)})
	}
	if n < 2 || n > maxCurve {
		return nil, fluid.NewError(op, fluid.ErrInvalidInput, "need 2 <= n <= 100000",
			fluid.Input{Name: "n", Value: float64(n)})
	}
	e := s.ends()
	if e.err != nil {
		return nil, e.err
	}
	lo, hi := s.d.curveTMin, e.triple[0]
	out := make([]Coexistence, n)
	rho := 0.0
	for i := range out {
		T := lo + (hi-lo)*float64(i)/float64(n-1)
		if i == n-1 {
			T = hi
		}
		c, err := s.sublimationAtT(op, T, rho)
		if err != nil {
			return nil, err
		}
		out[i], rho = c, c.Fluid.Rho // warm start
	}
	return out, nil
}

// MeltingCurve returns n ≥ 2 points of the melting curve, evenly spaced in
// pressure from the triple point to the end of the model's melting curve,
// for charts. The error wraps fluid.ErrInvalidInput for n < 2 or
// n > 100000.
func (s Solid) MeltingCurve(n int) ([]Coexistence, error) {
	const op = "sublimation.Solid.MeltingCurve"
	if s.d == nil {
		return nil, s.zero(op, fluid.Input{Name: "n", Value: float64(n)})
	}
	if n < 2 || n > maxCurve {
		return nil, fluid.NewError(op, fluid.ErrInvalidInput, "need 2 <= n <= 100000",
			fluid.Input{Name: "n", Value: float64(n)})
	}
	e := s.ends()
	if e.err != nil {
		return nil, e.err
	}
	lo, hi := e.triple[1], s.d.meltPMax
	out := make([]Coexistence, n)
	T, rho := 0.0, 0.0
	for i := range out {
		p := lo + (hi-lo)*float64(i)/float64(n-1)
		if i == n-1 {
			p = hi
		}
		c, err := s.meltingAtP(op, p, T, rho)
		if err != nil {
			return nil, err
		}
		out[i], T, rho = c, c.T, c.Fluid.Rho
	}
	return out, nil
}

const maxCurve = 100000

// sublimationAtT solves g_fluid(T, ρ) = g_solid(T, p_fluid(T, ρ)) for the
// vapour density ρ by Newton's method in ln ρ, from rho0 or, if rho0 is 0,
// from the ideal gas at the published sublimation pressure.
func (s Solid) sublimationAtT(op string, T, rho0 float64) (Coexistence, error) {
	if rho0 <= 0 {
		rho0 = s.guessSubP(T) / (s.f.GasConstant() * T)
	}
	return s.coexistAtT(op, T, rho0, 1)
}

// meltingAtT solves the same at T for the liquid density.
func (s Solid) meltingAtT(op string, T, rho0 float64) (Coexistence, error) {
	if rho0 <= 0 {
		rho0 = s.guessLiquidRho(T, s.guessMeltP(T))
	}
	return s.coexistAtT(op, T, rho0, 0.05)
}

// coexistAtT is Newton's method on F(y) = (g_f − g_s)/(RT), y = ln ρ, with
// dF/dy = (∂p/∂ρ)_T (1 − ρ v_s)/(RT) and steps bounded by maxStep. A step
// into a state the fluid equation refuses is halved.
func (s Solid) coexistAtT(op string, T, rho0, maxStep float64) (Coexistence, error) {
	rt := s.f.GasConstant() * T
	y := math.Log(rho0)
	var lastGood float64
	var step float64
	haveGood := false
	for it := 0; it < maxIter; it++ {
		rho := math.Exp(y)
		fp, err := s.f.Props(T, rho)
		if err != nil || fp.P <= 0 {
			if !haveGood {
				return Coexistence{}, s.noConv(op, err, fluid.Input{Name: "T", Value: T, Unit: "K"})
			}
			step /= 2
			y = lastGood + step
			continue
		}
		g := s.Derivs(T, fp.P)
		F := (fp.G - g.G) / rt
		dF := fp.DpDrho * (1 - rho*g.GP) / rt
		step = -F / dF
		if math.Abs(step) <= tolStep {
			return s.coexistence(T, fp), nil
		}
		if step > maxStep {
			step = maxStep
		} else if step < -maxStep {
			step = -maxStep
		}
		lastGood, haveGood = y, true
		y += step
	}
	return Coexistence{}, s.noConv(op, nil, fluid.Input{Name: "T", Value: T, Unit: "K"})
}

// sublimationAtP and meltingAtP solve the equilibrium at p for T and the
// fluid density by Newton's method in (T, ln ρ) on
//
//	F1 = (p_f(T, ρ) − p)/p,  F2 = (g_f(T, ρ) − g_s(T, p))/(RT),
//
// with the analytic Jacobian; T0 and rho0 are a warm start (0: from the
// published curves).
func (s Solid) sublimationAtP(op string, p, T0, rho0 float64) (Coexistence, error) {
	if T0 <= 0 {
		T0 = s.guessSubT(p)
	}
	if rho0 <= 0 {
		rho0 = p / (s.f.GasConstant() * T0)
	}
	return s.coexistAtP(op, p, T0, rho0, 1)
}

func (s Solid) meltingAtP(op string, p, T0, rho0 float64) (Coexistence, error) {
	if T0 <= 0 {
		T0 = s.guessMeltT(p)
	}
	if rho0 <= 0 {
		rho0 = s.guessLiquidRho(T0, p)
	}
	return s.coexistAtP(op, p, T0, rho0, 0.05)
}

func (s Solid) coexistAtP(op string, p, T0, rho0, maxStep float64) (Coexistence, error) {
	R := s.f.GasConstant()
	floor := s.f.Limits().TFloor
	T, y := math.Max(T0, floor), math.Log(rho0)
	var lastT, lastY, dT, dy float64
	haveGood := false
	in := fluid.Input{Name: "p", Value: p, Unit: "Pa"}
	for it := 0; it < maxIter; it++ {
		rho := math.Exp(y)
		fp, err := s.f.Props(T, rho)
		if err == nil && s.check(op, T, p) != nil {
			err = s.check(op, T, p)
		}
		if err != nil {
			if !haveGood {
				return Coexistence{}, s.noConv(op, err, in)
			}
			dT, dy = dT/2, dy/2
			T, y = lastT+dT, lastY+dy
			continue
		}
		rt := R * T
		g := s.Derivs(T, p)
		F1 := (fp.P - p) / p
		F2 := (fp.G - g.G) / rt
		a11 := fp.DpDT / p
		a12 := rho * fp.DpDrho / p
		a21 := (-fp.S + fp.DpDT/rho - g.GT) / rt
		a22 := fp.DpDrho / rt
		det := a11*a22 - a12*a21
		dT = -(F1*a22 - a12*F2) / det
		dy = -(a11*F2 - a21*F1) / det
		if !finite(dT) || !finite(dy) {
			return Coexistence{}, s.noConv(op, nil, in)
		}
		if math.Abs(dT) <= tolStep*T && math.Abs(dy) <= tolStep {
			c := s.coexistence(T, fp)
			if AtPressure(&fp, p, R) {
				c.P = p
			}
			return c, nil
		}
		if lim := 0.05 * T; math.Abs(dT) > lim {
			dy *= lim / math.Abs(dT)
			dT = math.Copysign(lim, dT)
		}
		if math.Abs(dy) > maxStep {
			dT *= maxStep / math.Abs(dy)
			dy = math.Copysign(maxStep, dy)
		}
		lastT, lastY, haveGood = T, y, true
		if T+dT < floor { // stay where the fluid equation is accepted
			if T == floor {
				// The root lies at the floor to within rounding, or
				// below it: settle it at the floor.
				// (To 1e-10 in p, the backward-residual bound of a
				// state on the curve: the curve's pressure at the floor
				// from different solves differs by rounding.)
				c, err := s.coexistAtT(op, floor, rho, maxStep)
				if err == nil && math.Abs(c.P/p-1) <= 1e-10 {
					return c, nil
				}
				return Coexistence{}, fluid.NewError(op, fluid.ErrOutOfRange,
					"the curve reaches this pressure below the fluid's floor "+fmtG(floor)+" K", in)
			}
			dy *= (floor - T) / dT
			dT = floor - T
		}
		T, y = T+dT, y+dy
	}
	return Coexistence{}, s.noConv(op, nil, in)
}

// AtPressure reports whether the fluid state fp of a coexistence with R
// its gas constant in J/(kg·K) lies at pressure p in Pa to the rounding
// of its own p: |p_fluid − p| ≤ 1e-12·(p + ρRT), since a dense liquid's
// p scatters by about 1e-13·ρRT (2e-8 of p for water at its triple
// point, where one ulp of ρ moves p by 4e-10 of it). The curves take such
// a state as at p itself (Coexistence.P = p).
func AtPressure(fp *fluid.Props, p, R float64) bool {
	return math.Abs(fp.P-p) <= 1e-12*(p+fp.Rho*R*fp.T)
}

// coexistence builds the result from the converged fluid state: the solid
// at the fluid's pressure.
func (s Solid) coexistence(T float64, fp fluid.Props) Coexistence {
	sp := s.props(T, fp.P)
	sp.Flags |= fluid.Saturated
	fp.Flags |= fluid.Saturated
	return Coexistence{T: T, P: fp.P, Solid: sp, Fluid: fp}
}

func (s Solid) noConv(op string, cause error, in fluid.Input) error {
	msg := "solid-fluid equilibrium of " + s.d.name + " did not converge"
	if cause != nil {
		msg += ": " + cause.Error()
	}
	return fluid.NewError(op, fluid.ErrNoConvergence, msg, in)
}

// solveTriple solves, by Newton's method in (T, ln ρ_l, ln ρ_v),
//
//	(p_l − p_v)/(ρ_l R T) = 0,  (g_l − g_v)/(RT) = 0,  (g_v − g_s(T, p_v))/(RT) = 0,
//
// from the fluid's stored triple-point constants.
func (s Solid) solveTriple() ([4]float64, error) {
	const op = "sublimation.Solid.Triple"
	t0 := s.f.Triple()
	R := s.f.GasConstant()
	T, yl, yv := t0.T, math.Log(t0.RhoLiquid), math.Log(t0.RhoVapor)
	in := fluid.Input{Name: "T", Value: t0.T, Unit: "K"}
	for it := 0; it < maxIter; it++ {
		rl, rv := math.Exp(yl), math.Exp(yv)
		l, err := s.f.Props(T, rl)
		if err != nil {
			return [4]float64{}, s.noConv(op, err, in)
		}
		v, err := s.f.Props(T, rv)
		if err != nil {
			return [4]float64{}, s.noConv(op, err, in)
		}
		rt := R * T
		g := s.Derivs(T, v.P)
		F := [3]float64{(l.P - v.P) / (rl * rt), (l.G - v.G) / rt, (v.G - g.G) / rt}
		J := [3][3]float64{
			{(l.DpDT - v.DpDT) / (rl * rt), l.DpDrho / rt, -rv * v.DpDrho / (rl * rt)},
			{(-l.S + l.DpDT/rl + v.S - v.DpDT/rv) / rt, l.DpDrho / rt, -v.DpDrho / rt},
			{(-v.S + v.DpDT/rv - g.GT - g.GP*v.DpDT) / rt, 0, v.DpDrho * (1 - rv*g.GP) / rt},
		}
		d, ok := solve3(J, F)
		if !ok {
			return [4]float64{}, s.noConv(op, nil, in)
		}
		if math.Abs(d[0]) <= tolStep*T && math.Abs(d[1]) <= tolStep && math.Abs(d[2]) <= tolStep {
			return [4]float64{T, v.P, rl, rv}, nil
		}
		T, yl, yv = T-d[0], yl-d[1], yv-d[2]
	}
	return [4]float64{}, s.noConv(op, nil, in)
}

// solve3 solves J d = F by Cramer's rule.
func solve3(J [3][3]float64, F [3]float64) ([3]float64, bool) {
	det := func(m [3][3]float64) float64 {
		return m[0][0]*(m[1][1]*m[2][2]-m[1][2]*m[2][1]) -
			m[0][1]*(m[1][0]*m[2][2]-m[1][2]*m[2][0]) +
			m[0][2]*(m[1][0]*m[2][1]-m[1][1]*m[2][0])
	}
	D := det(J)
	if D == 0 || !finite(D) {
		return [3]float64{}, false
	}
	var d [3]float64
	for c := 0; c < 3; c++ {
		m := J
		for r := 0; r < 3; r++ {
			m[r][c] = F[r]
		}
		d[c] = det(m) / D
	}
	return d, finite(d[0]) && finite(d[1]) && finite(d[2])
}

// Initial guesses from the published auxiliary curves, falling back on a
// Clausius–Clapeyron line through the stored triple point.

func (s Solid) guessSubP(T float64) float64 {
	if lo, hi := s.f.AuxSublimationRange(); T >= lo && T <= hi {
		if p, err := s.f.AuxSublimationPressure(T); err == nil {
			return p
		}
	}
	t := s.f.Triple()
	// ln p = ln pt − (Δh/R)(1/T − 1/Tt), with Δh/(R Tt) ≈ 25 for both
	// solids (22 for ice Ih, 24 for dry ice): good to a factor of a few.
	return t.P * math.Exp(-25*t.T*(1/T-1/t.T))
}

func (s Solid) guessSubT(p float64) float64 {
	t := s.f.Triple()
	T := 1 / (1/t.T - math.Log(p/t.P)/(25*t.T))
	// refine on the published curve by secant steps in (1/T, ln p),
	// within its range (outside it the calls would build errors).
	lo, hi := s.f.AuxSublimationRange()
	for i := 0; i < 8; i++ {
		T2 := T * 1.001
		if T2 > hi {
			T2 = T / 1.001
		}
		if T < lo || T > hi || T2 < lo {
			break
		}
		p1, err1 := s.f.AuxSublimationPressure(T)
		p2, err2 := s.f.AuxSublimationPressure(T2)
		if err1 != nil || err2 != nil {
			break
		}
		slope := (math.Log(p2) - math.Log(p1)) / (1/T2 - 1/T)
		x := 1/T + (math.Log(p)-math.Log(p1))/slope
		Tn := 1 / x
		if math.Abs(Tn-T) < 1e-9*T {
			return Tn
		}
		T = Tn
	}
	return T
}

func (s Solid) guessMeltP(T float64) float64 {
	// Within the published curve's range only: outside it the call
	// would build an error.
	if lo, hi := s.f.AuxMeltingRange(); T >= lo && T <= hi {
		if p, err := s.f.AuxMeltingPressure(T); err == nil {
			return p
		}
	}
	return s.f.Triple().P
}

func (s Solid) guessMeltT(p float64) float64 {
	lo, hi := s.f.AuxMeltingRange()
	if hi <= lo {
		return s.f.Triple().T
	}
	plo, err1 := s.f.AuxMeltingPressure(lo)
	phi, err2 := s.f.AuxMeltingPressure(hi)
	if err1 != nil || err2 != nil {
		return s.f.Triple().T
	}
	// The published melting pressure is monotone in T: bisect.
	rising := phi > plo
	for i := 0; i < 60; i++ {
		m := 0.5 * (lo + hi)
		pm, _ := s.f.AuxMeltingPressure(m)
		if (pm < p) == rising {
			lo = m
		} else {
			hi = m
		}
	}
	return 0.5 * (lo + hi)
}

// guessLiquidRho is the fluid's liquid root at (T, p) or, where there is
// none, the solid density at (T, p) scaled by the liquid/solid density
// ratio at the triple point.
func (s Solid) guessLiquidRho(T, p float64) float64 {
	if rho, err := s.f.Density(T, p, fluid.RootLiquid); err == nil {
		return rho
	}
	t := s.f.Triple()
	if s.check("", T, p) != nil {
		return t.RhoLiquid
	}
	rs := s.props(T, p).Rho
	ts := s.props(t.T, t.P).Rho
	return rs * t.RhoLiquid / ts
}
