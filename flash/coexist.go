package flash

import (
	"math"

	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/sublimation"
)

// This file solves solid–fluid mixtures directly from the curve nodes
// (region.go): HS (hs.go) and DU place their inputs against the nodes'
// mixtures and solve the equilibrium with the mixture's condition in one
// Newton iteration, instead of solving the curve at each step of an
// outer iteration.

// mixCond is the second condition of a solid–fluid mixture solve: the
// mixture's h and s (HS: h − T s = g_f), or its specific volume and
// internal energy (DU: u_s + x (u_f − u_s) = u with
// x = (v − v_s)/(v_f − v_s)).
type mixCond struct {
	du   bool
	a, b float64 // h and s, or v and u
}

// residual returns the condition's residual in units of RT and its
// derivatives in T (at fixed ρ) and ln ρ of the fluid, with the solid at
// the fluid's pressure, from the fluid's properties fp and the solid's
// Gibbs derivatives g at (T, p_f):
//
//	HS: F = (h − T s − g_f)/RT,  ∂g_f/∂T = −s_f + (∂p/∂T)_ρ/ρ,
//	    ∂g_f/∂ln ρ = (∂p/∂ρ)_T;
//	DU: F = (u_mix − u)/RT, u_mix = (1 − x) u_s + x u_f,
//	    du_mix = (1 − x) du_s + x du_f + (u_f − u_s) dx,
//	    dx = −((1 − x) dv_s + x dv_f)/(v_f − v_s),
//
// with the solid's du_s = (cp − p v α) dT − (T v α + p ∂v/∂p) dp and
// dv_s = v α dT + ∂v/∂p dp (from g), dp = (∂p/∂T)_ρ dT + ρ (∂p/∂ρ)_T d ln ρ,
// and the fluid's du_f = cv dT + (p − T (∂p/∂T)_ρ)/ρ d ln ρ,
// dv_f = −v_f d ln ρ.
func (m *mixCond) residual(fp *fluid.Props, g *sublimation.Gibbs, rt float64) (F, dT, dy float64) {
	T, rho := fp.T, fp.Rho
	if !m.du {
		h, s := m.a, m.b
		return (h - T*s - fp.G) / rt, (-s + fp.S - fp.DpDT/rho) / rt, -fp.DpDrho / rt
	}
	v, u := m.a, m.b
	p := fp.P
	vs, us := g.GP, g.G-T*g.GT-p*g.GP
	vf, uf := 1/rho, fp.U
	x := (v - vs) / (vf - vs)
	um := us + x*(uf-us)
	dpT, dpy := fp.DpDT, rho*fp.DpDrho
	usT, usP := -T*g.GTT-p*g.GTP, -T*g.GTP-p*g.GPP
	vsT, vsP := g.GTP, g.GPP
	dus := [2]float64{usT + usP*dpT, usP * dpy}
	dvs := [2]float64{vsT + vsP*dpT, vsP * dpy}
	duf := [2]float64{fp.Cv, (p - T*fp.DpDT) / rho}
	dvf := [2]float64{0, -vf}
	var d [2]float64
	for i := range d {
		dx := -((1-x)*dvs[i] + x*dvf[i]) / (vf - vs)
		d[i] = ((1-x)*dus[i] + x*duf[i] + (uf-us)*dx) / rt
	}
	return (um - u) / rt, d[0], d[1]
}

// tol returns the tolerance of the condition in J/kg: 1/100 of the
// backward-residual floor of h or u.
func (m *mixCond) tol(f *fluid.Fluid) float64 {
	if m.du {
		return qU.tol(f, nil, m.b)
	}
	return qH.tol(f, nil, m.a)
}

// coexistSolve solves the equilibrium of the solid and the fluid with the
// mixture condition m: Newton's method in (T, ln ρ) of the fluid, with
// the solid at the fluid's pressure, on
//
//	F1 = (g_f(T, ρ) − g_s(T, p_f(T, ρ)))/(RT),  F2 = m's residual,
//
// with ∂g_f/∂T = −s_f + (∂p/∂T)_ρ/ρ, ∂g_f/∂ln ρ = (∂p/∂ρ)_T and
// ∂g_s = v_s dp. It converges to 1e-13 in F1 (the curves of package
// sublimation are solved to a few 1e-12) and 1/100 of the floor of h or
// u. The mixture's T lies between the nodes' Ta and Tb: an iterate that
// leaves that interval by its width, or 16 iterations, end the attempt;
// a solution beyond the triple point (the curves' common end) is none.
func (k *call) coexistSolve(m mixCond, T, rho float64, vapour bool, Ta, Tb float64) (sublimation.Coexistence, bool) {
	f := k.f
	sol := k.sol.s
	R := f.GasConstant()
	tol := m.tol(f)
	slim := sol.Limits()
	maxStep := 1.0
	if !vapour {
		maxStep = 0.05
	}
	y := math.Log(rho)
	var pT, py float64
	good := false
	var fp fluid.Props
	w := watch{best: math.Inf(1)}
	lastStep := math.Inf(1)
	converged := false
	lo, hi := min(Ta, Tb), max(Ta, Tb)
	wide := hi - lo
	for it := 0; it < 16; it++ {
		if T < lo-wide || T > hi+wide {
			return sublimation.Coexistence{}, false
		}
		var ok bool
		fp, ok = propsIter(f, T, math.Exp(y))
		if ok && (fp.P <= 0 || T < max(slim.TFloor, 1) || T > slim.TCeil) {
			ok = false
		}
		if !ok {
			if !good {
				return sublimation.Coexistence{}, false
			}
			T, y = 0.5*(T+pT), 0.5*(y+py)
			continue
		}
		rt := R * T
		g := sol.Derivs(T, fp.P)
		F1 := (fp.G - g.G) / rt
		F2, b1, b2 := m.residual(&fp, &g, rt)
		res := max(math.Abs(F1)/1e-13, math.Abs(F2)*rt/tol)
		if w.check(res, lastStep) {
			if !(math.Abs(F1) <= 1e-12 && math.Abs(F2)*rt <= 100*tol) {
				return sublimation.Coexistence{}, false
			}
			converged = true
			break
		}
		dT, dy, ok := solve2((-fp.S+fp.DpDT/fp.Rho-g.GT-g.GP*fp.DpDT)/rt, fp.DpDrho*(1-fp.Rho*g.GP)/rt,
			b1, b2, -F1, -F2)
		if !ok {
			return sublimation.Coexistence{}, false
		}
		sc := 1.0
		if x := math.Abs(dT); x > 0.05*T {
			sc = 0.05 * T / x
		}
		if x := math.Abs(dy); x > maxStep {
			sc = min(sc, maxStep/x)
		}
		pT, py, good = T, y, true
		lastStep = sc * max(math.Abs(dT)/T, math.Abs(dy))
		T, y = T+sc*dT, y+sc*dy
	}
	if !converged {
		return sublimation.Coexistence{}, false
	}
	if vapour && T > k.sol.tt*(1+tripleTolT) || !vapour && k.belowTripleP(fp.P) {
		// Beyond the triple point, where the curve ends: the equations
		// have a solution there (the curves extrapolate smoothly), but
		// it is no state.
		return sublimation.Coexistence{}, false
	}
	sp, err := sol.Props(T, fp.P)
	if err != nil {
		return sublimation.Coexistence{}, false
	}
	sp.Flags |= Saturated
	fp.Flags |= Saturated
	return sublimation.Coexistence{T: T, P: fp.P, Solid: sp, Fluid: fp}, true
}

// duMixture is DU where (ρ, u) may be a mixture of the solid and the
// fluid of the curve nodes cs (vapour: the sublimation curve, else the
// melting curve). At fixed v the mixture's u rises with T (DU), so a sign
// change of u_mix − u between neighbouring nodes, one of them with v
// between the phases' volumes, brackets it (u_mix extended beyond them by
// the same formula, so that a mixture next to a phase line is bracketed
// too); coexistSolve then solves it from the nodes. done is false where
// no mixture is found (the other paths decide).
func (k *call) duMixture(cs []sublimation.Coexistence, vapour bool, rho, u float64) (State, bool) {
	dh, _ := k.f.ReferenceOffsets()
	v, ud := 1/rho, u-dh
	prev, prevValid := 0.0, false
	for i := range cs {
		c := &cs[i]
		vs, vf := 1/c.Solid.Rho, 1/c.Fluid.Rho
		x := (v - vs) / (vf - vs)
		r := c.Solid.U + x*(c.Fluid.U-c.Solid.U) - ud
		valid := x >= 0 && x <= 1
		if i > 0 && (valid || prevValid) && (r >= 0) != (prev >= 0) {
			a := &cs[i-1]
			t := prev / (prev - r)
			return k.duMixtureAt(v, u, lerp(a.T, c.T, t), nodeRho(cs, i-1, t), vapour, a.T, c.T)
		}
		prev, prevValid = r, valid
	}
	if n := len(cs); prevValid && math.Abs(prev) <= qU.floor(k.f, nil, u) {
		// At the end of the curve itself (ice Ih at 208.566 MPa, dry
		// ice at 800 MPa), where no node beyond brackets it: solved from
		// that node.
		a, c := &cs[n-2], &cs[n-1]
		return k.duMixtureAt(v, u, c.T, c.Fluid.Rho, vapour, a.T, c.T)
	}
	return State{}, false
}

// duMixtureAt solves the mixture of specific volume v and internal
// energy u from (T, ρ) between the nodes' Ta and Tb (coexistSolve) and
// builds its state; ok is false where it fails or v lies outside the
// phases' volumes.
func (k *call) duMixtureAt(v, u, T, rho float64, vapour bool, Ta, Tb float64) (State, bool) {
	m, ok := k.coexistSolve(mixCond{du: true, a: v, b: u}, T, rho, vapour, Ta, Tb)
	if !ok {
		return State{}, false
	}
	xf := (v - 1/m.Solid.Rho) / (1/m.Fluid.Rho - 1/m.Solid.Rho)
	if !(xf >= 0 && xf <= 1) {
		return State{}, false
	}
	return k.coexistState(&m, vapour, xf), true
}

// duSolidPhase is DU for a single solid phase: Newton's method in (T, p)
// on the solid's Gibbs function for v(T, p) = 1/ρ and u(T, p) = u
// (solidNewton; no evaluation of the fluid equation), from the solid
// node nearest in u and ρ; the result is placed by the curves (solidAt).
// ok is false where it is not a solid state of the model.
func (k *call) duSolidPhase(rho, u float64) (State, bool) {
	n := k.sol.n
	dh, _ := k.f.ReferenceOffsets()
	ud := u - dh
	var best *sublimation.Props
	bestD := math.Inf(1)
	for _, cs := range [2][]sublimation.Coexistence{n.sub, n.melt} {
		for i := range cs {
			sp := &cs[i].Solid
			if d := math.Abs(sp.U-ud)/(sp.Cp*sp.T) + math.Abs(sp.Rho/rho-1); d < bestD {
				best, bestD = sp, d
			}
		}
	}
	sp, ok := k.solidNewton(qRho, rho, qU, u, best.T, best.P)
	if !ok {
		return State{}, false
	}
	if ok, _ := k.solidAt(&sp); !ok {
		return State{}, false
	}
	return solidState(&sp), true
}
