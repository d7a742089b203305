package partial

import (
	"errors"
	"math"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/sublimation"
)

// Jacobian holds the differentials of every quantity at one state, in two
// variables that are independent there. Obtain one from At (the zero
// value is not usable); it is a plain value, safe for concurrent use, and
// Derivative on it allocates nothing unless it returns an error.
type Jacobian struct {
	phase      flash.Phase
	t, p, v, s float64 // the state's T, p, v and s (s with the fluid's reference offsets)
	// dT, dp, dv and ds are the differentials of T, p, v and s; every
	// other row follows from them by the fundamental relations (rowOf).
	dT, dp, dv, ds row
	// crit: exactly the critical point of an equation with nonanalytic
	// terms, where ds carries the infinite cv/T in its k part.
	crit bool
}

// row is the differential dq = x dX + y dY of a quantity in the two
// variables (X, Y) of a Jacobian. At exactly the critical point cv is
// infinite: there dq = (x + k·K) dX + y dY with K = cv/T → ∞, and only
// the X-component carries K (X = T, Y = v).
type row struct{ x, y, k float64 }

// lin returns a·r + b·s.
func lin(a float64, r row, b float64, s row) row {
	return row{a*r.x + b*s.x, a*r.y + b*s.y, a*r.k + b*s.k}
}

// det returns the determinant r.x s.y − r.y s.x as d0 + d1·K.
func det(r, s row) (d0, d1 float64) {
	return r.x*s.y - r.y*s.x, r.k*s.y - r.y*s.k
}

// roundedZero returns 0 where d, the determinant r.x s.y − r.y s.x, lies
// within the rounding error of its two products (each factor rounded
// once from rows that share their differences), else d. Such a
// determinant is of rows that are proportional but for that rounding:
// at a triple point, where dT = dp = 0, dh = T ds and df = −p dv, h does
// not vary at constant s nor f at constant v, whatever the rounding
// makes of T ds.x ds.y − T ds.y ds.x.
func roundedZero(d float64, r, s row) float64 {
	const u = 0x1p-53 // unit roundoff
	if math.Abs(d) <= 4*u*(math.Abs(r.x*s.y)+math.Abs(r.y*s.x)) {
		return 0
	}
	return d
}

// At returns the Jacobian of state st of fluid f: the differentials of T,
// p, ρ, v, u, h, s, g and f in two variables that are independent at st,
// from which Derivative forms any (∂a/∂b)_c. st is a state returned by a
// flash of f (or built to the same contract).
//
// By phase:
//
//   - Liquid, Vapor, Supercritical: from the equation of state at
//     (st.T, st.Rho) (one fluid.Fluid.Props evaluation), in (T, v):
//     dp = (∂p/∂T)_v dT + (∂p/∂v)_T dv, ds = (cv/T) dT + (∂p/∂T)_v dv.
//   - Solid: from the solid's Gibbs energy at (st.T, st.P) (one
//     sublimation.Solid.Derivs evaluation), in (T, p):
//     dv = g_Tp dT + g_pp dp, ds = −g_TT dT − g_Tp dp.
//   - TwoPhase, SolidVapor, SolidLiquid: two phases in equilibrium, in
//     (T, v) of the mixture: p follows the coexistence curve,
//     dp = γ dT with γ = (s₂ − s₁)/(v₂ − v₁) from the phases' own entropies
//     and volumes (Clausius–Clapeyron), and ds = (cv/T) dT + γ dv with the
//     mixture's equilibrium cv that the state carries (State.Cv; where it
//     is not finite and positive it is computed from the phases, as
//     SlopesOf does). No equation is evaluated.
//   - Triple: in two phase fractions; T and p are fixed, dv and ds are
//     the lever rules of the three phases' volumes and entropies.
//
// The other differentials follow from the fundamental relations, which
// hold in every region:
//
//	du = T ds − p dv,  dh = T ds + v dp,  dg = −s dT + v dp,
//	df = −s dT − p dv,  dρ = −ρ² dv.
//
// A saturated single-phase state (Flags Saturated, e.g. TQ with q = 0)
// gets the derivatives of that phase alone, on its side of the curve. A
// TwoPhase state exactly at the critical point (flag AtCritical) is the
// critical state, a single phase. Where an equation's critical point lies
// a little inside its own spinodal (Tillner-Roth–Baehr R-134a:
// (∂p/∂ρ)_T = −4.7 Pa·m³/kg at its reducing point), the derivatives of
// the critical state are those the equation gives there, finite.
//
// Special cases are:
//
//	f nil, st.Phase not one of Liquid … Triple, st.N not that of its
//	  phase, a T, p, ρ or s of st (or of its phases) not finite or not
//	  positive where it must be: error wrapping fluid.ErrInvalidInput
//	Solid regions of a fluid without a solid model: fluid.ErrUndefined
//	the errors of fluid.Fluid.Props and sublimation.Solid.Props
//	  (a state outside the models' ranges: ErrOutOfRange; inside a
//	  spinodal: ErrUnstable)
//
// At allocates nothing unless it returns an error.
func At(f *fluid.Fluid, st flash.State) (Jacobian, error) { return at("partial.At", f, &st) }

// at is At for operation op.
func at(op string, f *fluid.Fluid, st *flash.State) (Jacobian, error) {
	if f == nil {
		return Jacobian{}, stateError(op, st, fluid.ErrInvalidInput, "nil fluid")
	}
	if why := checkState(st); why != "" {
		return Jacobian{}, stateError(op, st, fluid.ErrInvalidInput, why)
	}
	switch st.Phase {
	case flash.Liquid, flash.Vapor, flash.Supercritical:
		return fluidJacobian(op, f, st, st.Phase)
	case flash.Solid:
		return solidJacobian(op, f, st)
	case flash.Triple:
		return tripleJacobian(st), nil
	}
	// A two-phase mixture.
	ph := &st.Phases
	v1, v2 := 1/ph[0].Rho, 1/ph[1].Rho
	if st.Flags&fluid.AtCritical != 0 || v1 == v2 {
		// Both phases are the critical state.
		return fluidJacobian(op, f, st, st.Phase)
	}
	gamma := (ph[1].S - ph[0].S) / (v2 - v1)
	cv := st.Cv
	if !(cv > 0) || !finite(cv) {
		sl, err := slopesOf(op, f, st)
		if err != nil {
			return Jacobian{}, err
		}
		cv = sl.mixtureCv(ph[0].Fraction, ph[1].Fraction)
		if !(cv > 0) || !finite(cv) {
			return Jacobian{}, stateError(op, st, fluid.ErrUndefined, "no finite equilibrium cv of the mixture")
		}
	}
	j := Jacobian{phase: st.Phase, t: st.T, p: st.P, v: 1 / st.Rho, s: st.S}
	j.dT = row{x: 1}
	j.dv = row{y: 1}
	j.dp = row{x: gamma}
	j.ds = row{x: cv / st.T, y: gamma}
	return j, nil
}

// Derivative returns (∂a/∂b)_c of fluid f at state st: At followed by
// Jacobian.Derivative (see both).
func Derivative(f *fluid.Fluid, st flash.State, a, b, c Quantity) (float64, error) {
	j, err := at("partial.Derivative", f, &st)
	if err != nil {
		return math.NaN(), err
	}
	return j.Derivative(a, b, c)
}

// Phase returns the phase of the state j was built for.
func (j *Jacobian) Phase() flash.Phase { return j.phase }

// Derivative returns the partial derivative (∂a/∂b)_c at the state of j,
// in the SI units of the quantities (e.g. (∂h/∂p)_T in m³/kg), from the
// Jacobian determinants (Bridgman's method):
//
//	(∂a/∂b)_c = (a_X c_Y − a_Y c_X) / (b_X c_Y − b_Y c_X),
//
// where q_X, q_Y are the components of dq in the variables (X, Y) of j.
// One formula serves every a, b, c and every region; ρ is reduced to v
// first ((∂a/∂ρ)_c = −v² (∂a/∂v)_c, (∂ρ/∂b)_c = −ρ² (∂v/∂b)_c), so that
// the dependence of ρ and v is exact.
//
// Where the derivative does not exist as a finite number, Derivative
// returns NaN and an error wrapping fluid.ErrUndefined, never ±Inf:
//
//   - b does not vary at constant c (the denominator vanishes): b = c, b
//     and c one of ρ and v, any two of T, p and g in a two-phase state
//     ((∂h/∂T)_p, the cp of a mixture, is infinite), any of T, p and g
//     in a triple-point state ((∂u/∂T)_v, its cv, is infinite);
//   - at exactly the critical point of an equation with nonanalytic terms
//     (flag AtCritical), where cv and (∂ρ/∂p)_T are infinite: a derivative
//     whose limit there is infinite ((∂h/∂T)_p, (∂ρ/∂p)_T, (∂u/∂T)_ρ).
//     Derivatives with a finite limit are returned as that limit, taken
//     with cv → ∞ and (∂p/∂ρ)_T = 0: (∂p/∂T)_ρ, (∂s/∂ρ)_T, (∂p/∂ρ)_T = 0,
//     (∂p/∂ρ)_s = w² = 0, (∂T/∂s)_p = T/cp = 0, (∂u/∂h)_ρ = 1.
//
// Special cases are:
//
//	a, b or c not one of T … F, or j the zero Jacobian: NaN, error
//	  wrapping fluid.ErrInvalidInput
//	a = b (b, c independent): 1;  a = c: 0
//
// Derivative allocates nothing unless it returns an error.
func (j *Jacobian) Derivative(a, b, c Quantity) (float64, error) {
	if !a.Valid() || !b.Valid() || !c.Valid() {
		return math.NaN(), j.error(fluid.ErrInvalidInput, a, b, c,
			"the quantities must be among T, p, rho, v, u, h, s, g, f (codes 1 to 9)")
	}
	if j.phase == flash.Unknown {
		return math.NaN(), j.error(fluid.ErrInvalidInput, a, b, c, "the zero Jacobian: obtain one from At")
	}
	a0, b0 := a, b
	scale := 1.0
	if a == Rho {
		a, scale = V, -1/(j.v*j.v)
	}
	if b == Rho {
		b, scale = V, scale*-(j.v*j.v)
	}
	if c == Rho {
		c = V
	}
	ra, rb, rc := j.rowOf(a), j.rowOf(b), j.rowOf(c)
	n0, n1 := det(ra, rc)
	d0, d1 := det(rb, rc)
	n0, d0 = roundedZero(n0, ra, rc), roundedZero(d0, rb, rc)
	var r float64
	switch {
	case d1 != 0: // only at the critical point: the leading order in K
		r = n1 / d1
	case n1 != 0 || d0 == 0:
		return math.NaN(), j.error(fluid.ErrUndefined, a0, b0, c, "it is infinite or does not exist "+
			j.where()+": "+b0.String()+" does not vary at constant "+c.String())
	default:
		r = n0 / d0
	}
	if a0 == b0 {
		return 1, nil
	}
	r *= scale
	if !finite(r) {
		return math.NaN(), j.error(fluid.ErrUndefined, a0, b0, c, "it is not finite "+j.where())
	}
	return r + 0, nil // no −0
}

// where names the state in messages.
func (j *Jacobian) where() string {
	if j.crit {
		return "at the critical point"
	}
	return "in a " + j.phase.String() + " state"
}

// rowOf returns the differential of q (not Rho) from dT, dp, dv and ds.
func (j *Jacobian) rowOf(q Quantity) row {
	switch q {
	case T:
		return j.dT
	case P:
		return j.dp
	case V:
		return j.dv
	case S:
		return j.ds
	case U:
		return lin(j.t, j.ds, -j.p, j.dv)
	case H:
		return lin(j.t, j.ds, j.v, j.dp)
	case G:
		return lin(-j.s, j.dT, j.v, j.dp)
	}
	return lin(-j.s, j.dT, -j.p, j.dv) // F
}

// error returns the error of Derivative for (∂a/∂b)_c.
func (j *Jacobian) error(sentinel error, a, b, c Quantity, why string) error {
	return fluid.NewError("partial.Jacobian.Derivative", sentinel, name(a, b, c)+": "+why,
		fluid.Input{Name: "T", Value: j.t, Unit: "K"}, fluid.Input{Name: "p", Value: j.p, Unit: "Pa"})
}

// fluidJacobian is the Jacobian of a single fluid phase at (st.T, st.Rho),
// in (T, v).
func fluidJacobian(op string, f *fluid.Fluid, st *flash.State, ph flash.Phase) (Jacobian, error) {
	pr, err := f.Props(st.T, st.Rho)
	if err != nil && !(errors.Is(err, fluid.ErrUnstable) && st.Flags&fluid.AtCritical != 0) {
		// (The critical state of an equation whose critical point lies
		// a little inside its own spinodal is taken as it is.)
		return Jacobian{}, rewrap(op, st, err)
	}
	// p is the state's own (a flash at given p keeps it: flash.PT), which
	// differs from the equation's at (T, ρ) by rounding only.
	j := Jacobian{phase: ph, t: pr.T, p: st.P, v: 1 / pr.Rho, s: pr.S}
	j.dT = row{x: 1}
	j.dv = row{y: 1}
	j.dp = row{x: pr.DpDT, y: -pr.Rho * pr.Rho * pr.DpDrho}
	if pr.Flags&fluid.AtCritical != 0 && math.IsInf(pr.Cv, 1) {
		// Nonanalytic terms: cv is infinite. (Without them, as for
		// R-134a, cv stays finite at the critical point and only
		// (∂p/∂ρ)_T vanishes.)
		j.ds = row{y: pr.DpDT, k: 1}
		j.crit = true
	} else {
		j.ds = row{x: pr.Cv / pr.T, y: pr.DpDT}
	}
	return j, nil
}

// solidJacobian is the Jacobian of the solid at (st.T, st.P), in (T, p),
// from its Gibbs energy: v = g_p, s = −g_T, dv = g_Tp dT + g_pp dp,
// ds = −g_TT dT − g_Tp dp. Outside the model's range sublimation.Solid.Props
// gives the error.
func solidJacobian(op string, f *fluid.Fluid, st *flash.State) (Jacobian, error) {
	sol, err := sublimation.For(f)
	if err != nil {
		return Jacobian{}, rewrap(op, st, err)
	}
	if l := sol.Limits(); !(st.T >= l.TFloor && st.T <= l.TCeil && st.P <= l.PCeil) {
		if _, err := sol.Props(st.T, st.P); err != nil {
			return Jacobian{}, rewrap(op, st, err)
		}
	}
	g := sol.Derivs(st.T, st.P)
	j := Jacobian{phase: flash.Solid, t: st.T, p: st.P, v: g.GP, s: -g.GT}
	j.dT = row{x: 1}
	j.dp = row{y: 1}
	j.dv = row{x: g.GTP, y: g.GPP}
	j.ds = row{x: -g.GTT, y: -g.GTP}
	return j, nil
}

// tripleJacobian is the Jacobian of a three-phase mixture in the
// fractions (x₁, x₂) of its second and third phases (x₀ = 1 − x₁ − x₂).
func tripleJacobian(st *flash.State) Jacobian {
	ph := &st.Phases
	v0, v1, v2 := 1/ph[0].Rho, 1/ph[1].Rho, 1/ph[2].Rho
	j := Jacobian{phase: flash.Triple, t: st.T, p: st.P, v: 1 / st.Rho, s: st.S}
	j.dv = row{x: v1 - v0, y: v2 - v0}
	j.ds = row{x: ph[1].S - ph[0].S, y: ph[2].S - ph[0].S}
	return j
}

// nPhases is the number of coexisting phases of each phase value.
func nPhases(ph flash.Phase) int {
	switch ph {
	case flash.Liquid, flash.Vapor, flash.Supercritical, flash.Solid:
		return 1
	case flash.TwoPhase, flash.SolidVapor, flash.SolidLiquid:
		return 2
	case flash.Triple:
		return 3
	}
	return 0
}

// checkState returns why st is not a usable state, or "".
func checkState(st *flash.State) string {
	n := nPhases(st.Phase)
	switch {
	case n == 0:
		return "st.Phase must be one of Liquid, Vapor, Supercritical, TwoPhase, Solid, SolidVapor, SolidLiquid, Triple"
	case st.N != n:
		return "st.N does not match st.Phase"
	case !(st.T > 0) || !finite(st.T) || !(st.P > 0) || !finite(st.P) || !(st.Rho > 0) || !finite(st.Rho) || !finite(st.S):
		return "st.T, st.P and st.Rho must be finite and positive, st.S finite"
	}
	if n > 1 {
		for i := 0; i < n; i++ {
			if p := &st.Phases[i]; !(p.Rho > 0) || !finite(p.Rho) || !finite(p.S) {
				return "the density of each phase must be finite and positive, its entropy finite"
			}
		}
	}
	return ""
}

func stateError(op string, st *flash.State, sentinel error, why string) error {
	return fluid.NewError(op, sentinel, why, fluid.Input{Name: "T", Value: st.T, Unit: "K"},
		fluid.Input{Name: "p", Value: st.P, Unit: "Pa"}, fluid.Input{Name: "rho", Value: st.Rho, Unit: "kg/m3"})
}

// rewrap returns err, from another package, as an error of op at st,
// keeping its sentinel and explanation.
func rewrap(op string, st *flash.State, err error) error {
	sentinel, why := cause(err)
	return stateError(op, st, sentinel, why)
}

// cause returns the sentinel of err and an explanation naming the
// operation that failed.
func cause(err error) (sentinel error, why string) {
	var fe *fluid.Error
	if !errors.As(err, &fe) || fe.Err == nil {
		return fluid.ErrNoConvergence, err.Error()
	}
	why = fe.Op + ": " + fe.Err.Error()
	if fe.Range != "" {
		why += " (" + fe.Range + ")"
	}
	return fe.Err, why
}

func finite(x float64) bool { return x-x == 0 }
