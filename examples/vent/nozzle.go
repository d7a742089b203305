package main

import (
	"errors"
	"fmt"
	"math"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// Stagnation is the fluid entering the nozzle at rest: pressure P in Pa,
// specific enthalpy H in J/kg and entropy S in J/(kg·K), and the phase
// it is drawn from.
type Stagnation struct {
	P, H, S float64
	Phase   flash.Phase
}

// Flow is the homogeneous-equilibrium isentropic flow of a nozzle.
type Flow struct {
	G       float64     // mass flux at the throat, kg/(m²·s)
	Choked  bool        // the throat pressure lies above the back pressure
	PThroat float64     // throat pressure, Pa (the back pressure if not choked)
	Throat  flash.State // the state at the throat
	Evals   int         // PS flashes spent
}

// Velocity returns the throat velocity √(2(h0 − h)) in m/s.
func (fl Flow) Velocity(h0 float64) float64 {
	return math.Sqrt(2 * math.Max(0, h0-fl.Throat.H))
}

// Nozzle computes the homogeneous-equilibrium isentropic mass flux of a
// fluid from a stagnation state to a back pressure: the phases move
// together in mechanical, thermal and phase equilibrium, so that along
// the nozzle the fluid follows the isentrope s = s0 through every region
// it reaches (liquid, liquid–vapour, the triple line and solid–vapour),
// each state found by a PS flash. The mass flux at pressure p is
//
//	G(p) = ρ(p, s0) √(2 (h0 − h(p, s0))),
//
// and the flow chokes where G is largest: the throat pressure p* is the
// maximiser of G over [pb, p0], p* > pb for a choked flow (there the
// velocity equals the homogeneous-equilibrium sound speed), p* = pb
// otherwise.
type Nozzle struct {
	F     *fluid.Fluid
	PBack float64 // back pressure, Pa

	guess   flash.State // warm start of the PS flashes
	ratio   float64     // last throat pressure ratio p*/p0, 0 if none
	unchoke bool        // the last flow was not choked
}

// errNoFlow is returned for a stagnation pressure at or below the back
// pressure.
var errNoFlow = errors.New("stagnation pressure at or below the back pressure")

// lnpTol is the tolerance of the throat search in ln p: G is flat at its
// maximum, so its relative error is of order lnpTol², far below the
// integration tolerances.
const lnpTol = 1e-4

// Flux returns the flow from st0. A warm start from the previous call's
// throat makes the search cost a handful of PS flashes when the
// stagnation state changes little.
func (n *Nozzle) Flux(st0 Stagnation) (Flow, error) {
	if !(st0.P > n.PBack) {
		return Flow{PThroat: n.PBack}, errNoFlow
	}
	var fl Flow
	var ferr error
	g := func(lnp float64) float64 {
		if ferr != nil {
			return 0
		}
		p := math.Exp(lnp)
		fl.Evals++
		var opt flash.Options
		if n.guess.T > 0 {
			opt.Guess = &n.guess
		}
		st, err := flash.PSWith(n.F, p, st0.S, opt)
		if err != nil && opt.Guess != nil {
			st, err = flash.PS(n.F, p, st0.S) // a cold start, as in the vessel
		}
		if err != nil {
			ferr = fmt.Errorf("isentrope s = %.6g J/(kg K) from %.6g Pa at %.6g Pa: %w", st0.S, st0.P, p, err)
			return 0
		}
		n.guess = st
		return st.Rho * math.Sqrt(2*math.Max(0, st0.H-st.H))
	}
	lo, hi := math.Log(n.PBack), math.Log(st0.P)
	if n.ratio > 0 && n.unchoke && hi-lo > 4*lnpTol {
		// Still unchoked if G falls from the back pressure upward (G
		// is unimodal along the isentrope).
		gl := g(lo)
		st := n.guess
		if gl >= g(lo+2*lnpTol) && ferr == nil {
			n.guess = st
			return Flow{G: gl, PThroat: n.PBack, Throat: st, Evals: fl.Evals}, nil
		}
	}
	a, b := lo, hi
	bracketed := false
	if n.ratio > 0 {
		a, b, bracketed = bracketNear(g, lo, hi, math.Log(st0.P*n.ratio))
	}
	if ferr != nil {
		return Flow{}, ferr
	}
	if !bracketed {
		a, b = scan(g, lo, hi, 16)
	}
	if ferr != nil {
		return Flow{}, ferr
	}
	x := maximize(g, a, b, lnpTol)
	if ferr != nil {
		return Flow{}, ferr
	}
	// The PS state at the maximiser, and the boundary: an unchoked flow
	// has its maximum at the back pressure.
	gx := g(x)
	if x-lo < 2*lnpTol {
		if gl := g(lo); gl >= gx {
			x, gx = lo, gl
		} else {
			g(x)
		}
	}
	if ferr != nil {
		return Flow{}, ferr
	}
	fl.G = gx
	fl.PThroat = math.Exp(x)
	fl.Choked = x > lo
	if !fl.Choked {
		fl.PThroat = n.PBack
	}
	fl.Throat = n.guess
	n.ratio = fl.PThroat / st0.P
	n.unchoke = !fl.Choked
	return fl, nil
}

// bracketNear looks for a bracket [a, b] ⊂ [lo, hi] of the maximum of g
// around x0: g(a), g(b) ≤ g(m) for an m inside. It reports false if the
// maximum seems to lie at or beyond an end (then scan from scratch).
func bracketNear(g func(float64) float64, lo, hi, x0 float64) (a, b float64, ok bool) {
	const d = 0.02
	x0 = math.Min(math.Max(x0, lo+d), hi-d)
	if !(x0-d >= lo && x0+d <= hi) {
		return lo, hi, false
	}
	ga, gm, gb := g(x0-d), g(x0), g(x0+d)
	a, m, b := x0-d, x0, x0+d
	for k := 0; k < 8 && !(gm >= ga && gm >= gb); k++ {
		step := 1.6 * (b - a)
		if ga > gm { // move down
			b, gb = m, gm
			m, gm = a, ga
			a = math.Max(lo, m-step)
			if a == m {
				return lo, hi, false
			}
			ga = g(a)
		} else { // move up
			a, ga = m, gm
			m, gm = b, gb
			b = math.Min(hi, m+step)
			if b == m {
				return lo, hi, false
			}
			gb = g(b)
		}
	}
	return a, b, gm >= ga && gm >= gb
}

// scan evaluates g at n points evenly spaced in [lo, hi) and returns the
// interval around the largest value.
func scan(g func(float64) float64, lo, hi float64, n int) (a, b float64) {
	h := (hi - lo) / float64(n)
	best, gbest := 0, math.Inf(-1)
	for i := 0; i < n; i++ {
		if v := g(lo + float64(i)*h); v > gbest {
			best, gbest = i, v
		}
	}
	return lo + float64(max(best-1, 0))*h, lo + float64(best+1)*h
}

// maximize returns the maximiser of g on [a, b] to within tol by Brent's
// method (golden sections with parabolic steps), for a g that is
// unimodal on [a, b]; it converges to an end where g is monotone.
func maximize(g func(float64) float64, a, b, tol float64) float64 {
	const cgold = 0.3819660112501051
	x := a + cgold*(b-a)
	w, v := x, x
	fx := -g(x)
	fw, fv := fx, fx
	var d, e float64
	for it := 0; it < 100; it++ {
		m := 0.5 * (a + b)
		tol1 := tol/3 + 1e-12*math.Abs(x)
		tol2 := 2 * tol1
		if math.Abs(x-m) <= tol2-0.5*(b-a) {
			break
		}
		golden := true
		if math.Abs(e) > tol1 {
			r := (x - w) * (fx - fv)
			q := (x - v) * (fx - fw)
			p := (x-v)*q - (x-w)*r
			q = 2 * (q - r)
			if q > 0 {
				p = -p
			} else {
				q = -q
			}
			if math.Abs(p) < math.Abs(0.5*q*e) && p > q*(a-x) && p < q*(b-x) {
				e, d = d, p/q
				golden = false
				if u := x + d; u-a < tol2 || b-u < tol2 {
					d = math.Copysign(tol1, m-x)
				}
			}
		}
		if golden {
			if x < m {
				e = b - x
			} else {
				e = a - x
			}
			d = cgold * e
		}
		u := x + d
		if math.Abs(d) < tol1 {
			u = x + math.Copysign(tol1, d)
		}
		fu := -g(u)
		if fu <= fx {
			if u < x {
				b = x
			} else {
				a = x
			}
			v, fv, w, fw, x, fx = w, fw, x, fx, u, fu
		} else {
			if u < x {
				a = u
			} else {
				b = u
			}
			if fu <= fw || w == x {
				v, fv, w, fw = w, fw, u, fu
			} else if fu <= fv || v == x || v == w {
				v, fv = u, fu
			}
		}
	}
	return x
}

// Jet returns the state of the jet after its expansion to the back
// pressure, with the kinetic energy dissipated: a PH flash at the
// stagnation enthalpy. Its Solid field is the dry-ice (snow) fraction.
func (n *Nozzle) Jet(st0 Stagnation) (flash.State, error) {
	return flash.PH(n.F, n.PBack, st0.H)
}
