package flash

import (
	"math"
	"sort"

	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/sublimation"
)

// This file builds the states of the solid regions and solves for single
// solid phases; solidpaths.go places each flash's inputs in them.

// solidPhaseState returns the PhaseState of the solid sp with mass
// fraction x.
func solidPhaseState(sp *sublimation.Props, x float64) PhaseState {
	return PhaseState{Phase: Solid, Fraction: x, Rho: sp.Rho, H: sp.H, S: sp.S, U: sp.U,
		Cp: sp.Cp, Cv: sp.Cv, W: sp.W}
}

// solidState returns the single-phase solid state sp: Quality 0, Solid 1,
// W the bulk sound speed √(∂p/∂ρ)_s.
func solidState(sp *sublimation.Props) State {
	st := State{T: sp.T, P: sp.P, Rho: sp.Rho, H: sp.H, S: sp.S, U: sp.U,
		Cp: sp.Cp, Cv: sp.Cv, W: sp.W, Phase: Solid, Solid: 1, N: 1,
		Flags: sp.Flags & (Extrapolated | Saturated)}
	st.Phases[0] = solidPhaseState(sp, 1)
	return st
}

// along is the change of a coexisting phase along its coexistence curve,
// per kelvin, where dp/dT = γ: dv/dT in m³/(kg·K), du/dT in J/(kg·K) and
// ds/dT in J/(kg·K²).
type along struct{ v, u, s float64 }

// fluidAlong returns the change of the fluid phase pr along a curve of
// slope γ, from its (T, ρ) derivatives:
//
//	dρ/dT = (γ − (∂p/∂T)_ρ)/(∂p/∂ρ)_T,
//	du/dT = cv + (p − T(∂p/∂T)_ρ)/ρ² · dρ/dT,
//	ds/dT = cv/T − (∂p/∂T)_ρ/ρ² · dρ/dT.
func fluidAlong(pr *fluid.Props, gamma float64) along {
	T := pr.T
	drho := (gamma - pr.DpDT) / pr.DpDrho
	r2 := pr.Rho * pr.Rho
	return along{v: -drho / r2, u: pr.Cv + (pr.P-T*pr.DpDT)/r2*drho, s: pr.Cv/T - pr.DpDT/r2*drho}
}

// solidAlong returns the change of the solid sp along a curve of slope γ,
// from its (T, p) derivatives (α the expansivity, κ_T the isothermal
// compressibility):
//
//	dv/dT = v(α − κ_T γ),
//	du/dT = cp − p v α + (p v κ_T − T v α) γ,
//	ds/dT = cp/T − v α γ.
func solidAlong(sp *sublimation.Props, gamma float64) along {
	v, a, kt := 1/sp.Rho, sp.Expansivity, sp.KappaT
	return along{
		v: v * (a - kt*gamma),
		u: sp.Cp - sp.P*v*a + (sp.P*v*kt-sp.T*v*a)*gamma,
		s: sp.Cp/sp.T - v*a*gamma,
	}
}

// mixDerivs returns the isochoric heat capacity cv and the
// homogeneous-equilibrium speed of sound w of a mixture of two
// coexisting phases a and b with mass fraction x of b, overall specific
// volume vm, along a coexistence curve of slope γ = dp/dT = (sb − sa)/(vb − va)
// (Clausius–Clapeyron). At fixed v the fraction moves as
// dx/dT = −(dva + x d(vb−va))/(vb − va), so that
//
//	cv = dua/dT + x d(ub−ua)/dT + (ub − ua) dx/dT,
//
// and at fixed s, with dx/dT = −(dsa + x d(sb−sa))/(sb − sa),
//
//	w² = (∂p/∂ρ)_s = −v² γ / (dv/dT)_s,
//	(dv/dT)_s = dva/dT + x d(vb−va)/dT + (vb − va) dx/dT.
//
// w is 0 where w² would not be positive and finite.
func mixDerivs(vm, gamma, va, vb, ua, ub, sa, sb float64, da, db along, x float64) (cv, w float64) {
	dqv := -(da.v + x*(db.v-da.v)) / (vb - va)
	cv = da.u + x*(db.u-da.u) + (ub-ua)*dqv
	dqs := -(da.s + x*(db.s-da.s)) / (sb - sa)
	dvdT := da.v + x*(db.v-da.v) + (vb-va)*dqs
	if w2 := -vm * vm * gamma / dvdT; w2 > 0 && isFinite(w2) {
		w = math.Sqrt(w2)
	}
	return cv, w
}

// coexistState returns the mixture of the solid and the fluid of the
// coexistence c with fluid mass fraction xf: SolidVapor on the
// sublimation curve (vapour true), SolidLiquid on the melting curve.
// xf ≤ 0 and xf ≥ 1 give the saturated solid and fluid as single-phase
// states, flagged Saturated. The mixture has Cp = +Inf and the Cv and W
// of mixDerivs; Quality is the vapour mass fraction xf (SolidVapor) or 0
// (SolidLiquid), Solid is 1 − xf.
func (k *call) coexistState(c *sublimation.Coexistence, vapour bool, xf float64) State {
	sp, fp := &c.Solid, &c.Fluid
	fph := Vapor
	if !vapour {
		fph = fluidPhase(k.f, c.T, c.P, fp.Rho)
		if fph == Vapor {
			fph = Liquid // the dense fluid of a melting curve
		}
	}
	if xf <= 0 {
		st := solidState(sp)
		st.Flags |= Saturated
		return st
	}
	if xf >= 1 {
		st := single(fp, fph)
		st.P = c.P // the curve's (see twoPhase)
		st.Flags |= Saturated
		return st
	}
	ph := SolidLiquid
	if vapour {
		ph = SolidVapor
	}
	xs := 1 - xf
	st := State{T: c.T, P: c.P, Phase: ph, Solid: xs, N: 2,
		Flags: Saturated | (sp.Flags|fp.Flags)&Extrapolated}
	if vapour {
		st.Quality = xf
	}
	vs, vf := 1/sp.Rho, 1/fp.Rho
	st.Rho = 1 / (vs + xf*(vf-vs))
	st.H = sp.H + xf*(fp.H-sp.H)
	st.S = sp.S + xf*(fp.S-sp.S)
	st.U = sp.U + xf*(fp.U-sp.U)
	st.Cp = math.Inf(1)
	st.Phases[0] = solidPhaseState(sp, xs)
	st.Phases[1] = phaseState(fp, fph, xf)
	gamma := (fp.S - sp.S) / (vf - vs)
	st.Cv, st.W = mixDerivs(1/st.Rho, gamma, vs, vf, sp.U, fp.U, sp.S, fp.S,
		solidAlong(sp, gamma), fluidAlong(fp, gamma), xf)
	return st
}

// tripleState returns the three-phase state of tp with mass fractions xs,
// xl and xv (summing to 1): Cp = Cv = +Inf and W = 0 (DESIGN.md), Quality
// xv, Solid xs. A zero fraction gives the two-phase state of the other
// two phases at the triple point.
func (k *call) tripleState(tp *sublimation.ThreePhase, xs, xl, xv float64) State {
	switch {
	case xs <= 0:
		s := tripleSaturation(tp)
		return twoPhase(k.f, &s, xv)
	case xl <= 0:
		c := sublimation.Coexistence{T: tp.T, P: tp.P, Solid: tp.Solid, Fluid: tp.Vapor}
		return k.coexistState(&c, true, xv)
	case xv <= 0:
		c := sublimation.Coexistence{T: tp.T, P: tp.P, Solid: tp.Solid, Fluid: tp.Liquid}
		return k.coexistState(&c, false, xl)
	}
	sp, l, v := &tp.Solid, &tp.Liquid, &tp.Vapor
	st := State{T: tp.T, P: tp.P, Phase: Triple, Quality: xv, Solid: xs, N: 3,
		Flags: Saturated | (sp.Flags|l.Flags|v.Flags)&Extrapolated}
	st.Rho = 1 / (xs/sp.Rho + xl/l.Rho + xv/v.Rho)
	st.H = xs*sp.H + xl*l.H + xv*v.H
	st.S = xs*sp.S + xl*l.S + xv*v.S
	st.U = xs*sp.U + xl*l.U + xv*v.U
	st.Cp, st.Cv, st.W = math.Inf(1), math.Inf(1), 0
	st.Phases[0] = solidPhaseState(sp, xs)
	st.Phases[1] = phaseState(l, Liquid, xl)
	st.Phases[2] = phaseState(v, Vapor, xv)
	return st
}

// tripleSaturation is the liquid–vapour saturation of the triple point.
func tripleSaturation(tp *sublimation.ThreePhase) fluid.Saturation {
	return fluid.Saturation{T: tp.T, P: tp.P, Liquid: tp.Liquid, Vapor: tp.Vapor,
		Flags: Saturated | (tp.Liquid.Flags|tp.Vapor.Flags)&Extrapolated}
}

// refDH is the enthalpy offset of the call's fluid's reference state.
func (k *call) refDH() float64 {
	dh, _ := k.f.ReferenceOffsets()
	return dh
}

// triple returns the triple point where the models meet, from the node
// table with the reference-state offsets of the call's fluid.
func (k *call) triple() (sublimation.ThreePhase, error) {
	tp := k.sol.n.tp
	if dh, ds := k.f.ReferenceOffsets(); dh != 0 || ds != 0 {
		g := dh - tp.T*ds
		for _, p := range [2]*fluid.Props{&tp.Liquid, &tp.Vapor} {
			p.U, p.H, p.S, p.G, p.F = p.U+dh, p.H+dh, p.S+ds, p.G+g, p.F+g
		}
		sp := &tp.Solid
		sp.U, sp.H, sp.S, sp.G, sp.F = sp.U+dh, sp.H+dh, sp.S+ds, sp.G+g, sp.F+g
	}
	return tp, nil
}

// The curves at T or p, as errors of this flash, started from the node
// tables (the fluid's density interpolated between the neighbouring
// nodes, in ln ρ; the temperature linearly in 1/T against ln p, as the
// Clausius–Clapeyron equation nearly makes it).

func (k *call) subAtT(T float64) (sublimation.Coexistence, error) {
	n := k.sol.n
	rho := 0.0
	if T >= n.subT[0] && T <= n.subT[len(n.subT)-1] {
		i := bracketIndex(n.subT, T)
		rho = nodeRho(n.sub, i, (T-n.subT[i])/(n.subT[i+1]-n.subT[i]))
	}
	c, err := k.sol.s.SublimationPressureFrom(T, rho)
	if err != nil {
		return c, k.rewrap(err)
	}
	return c, nil
}

func (k *call) subAtP(p float64) (sublimation.Coexistence, error) {
	n := k.sol.n
	p = min(p, n.pt)
	T, rho := n.curveStart(n.sub, n.subP, p)
	c, err := k.sol.s.SublimationTemperatureFrom(p, T, rho)
	if err != nil {
		return c, k.rewrap(err)
	}
	return c, nil
}

func (k *call) meltAtT(T float64) (sublimation.Coexistence, error) {
	n := k.sol.n
	rho := 0.0
	if lo, hi := min(n.meltT[0], n.meltEndT()), max(n.meltT[0], n.meltEndT()); T >= lo && T <= hi {
		i := n.meltIndexT(T)
		rho = nodeRho(n.melt, i, (T-n.meltT[i])/(n.meltT[i+1]-n.meltT[i]))
	}
	c, err := k.sol.s.MeltingPressureFrom(T, rho)
	if err != nil {
		return c, k.rewrap(err)
	}
	return c, nil
}

func (k *call) meltAtP(p float64) (sublimation.Coexistence, error) {
	n := k.sol.n
	p = max(p, n.pt)
	T, rho := n.curveStart(n.melt, n.meltP, p)
	c, err := k.sol.s.MeltingTemperatureFrom(p, T, rho)
	if err != nil {
		return c, k.rewrap(err)
	}
	k.polish(&c, p)
	return c, nil
}

// nodeRho interpolates the fluid's density of the curve nodes cs at the
// fraction t of the interval from node i, in ln ρ.
func nodeRho(cs []sublimation.Coexistence, i int, t float64) float64 {
	return math.Exp(lerp(math.Log(cs[i].Fluid.Rho), math.Log(cs[i+1].Fluid.Rho), t))
}

// curveStart interpolates the temperature and the fluid's density of the
// curve nodes cs at pressure p, ps their ascending pressures; zeros (a
// cold start) outside them.
func (n *curveNodes) curveStart(cs []sublimation.Coexistence, ps []float64, p float64) (T, rho float64) {
	if !(p >= ps[0] && p <= ps[len(ps)-1]) {
		return 0, 0
	}
	i := bracketIndex(ps, p)
	a, b := &cs[i], &cs[i+1]
	t := (math.Log(p) - math.Log(ps[i])) / (math.Log(ps[i+1]) - math.Log(ps[i]))
	return 1 / lerp(1/a.T, 1/b.T, t), nodeRho(cs, i, t)
}

// meltIndexT returns i with the melting temperature at T between nodes
// i and i+1 (meltT rising for CO2, falling for water).
func (n *curveNodes) meltIndexT(T float64) int {
	if n.meltRising {
		return bracketIndex(n.meltT, T)
	}
	j := sort.Search(len(n.meltT), func(j int) bool { return n.meltT[j] < T })
	return min(max(j-1, 0), len(n.meltT)-2)
}

// polish takes one more Newton step on the coexistence c at pressure p,
// in (T, ln ρ) on p_fluid = p and g_fluid = g_solid, where the fluid's
// pressure misses p by more than 1e-11·p: the curve solvers stop on the
// size of their steps, and a liquid's stiffness turns a step of 1e-12 in
// ln ρ into 1e-9 in p near the triple point of dry ice. A coexistence
// the solver placed at p itself (c.P == p: the fluid's own p lies within
// the rounding scatter of a dense liquid's p, which a step cannot
// reduce) is left as it is.
func (k *call) polish(c *sublimation.Coexistence, p float64) {
	fp := &c.Fluid
	if c.P == p || math.Abs(fp.P-p) <= 1e-11*p {
		return
	}
	T, rho := c.T, fp.Rho
	rt := k.f.GasConstant() * T
	g := k.sol.s.Derivs(T, p)
	F1, F2 := (fp.P-p)/p, (fp.G-g.G)/rt
	a11, a12 := fp.DpDT/p, rho*fp.DpDrho/p
	a21, a22 := (-fp.S+fp.DpDT/rho-g.GT)/rt, fp.DpDrho/rt
	det := a11*a22 - a12*a21
	dT, dy := -(F1*a22-a12*F2)/det, -(a11*F2-a21*F1)/det
	if !isFinite(dT) || !isFinite(dy) || math.Abs(dT) > 1e-6*T || math.Abs(dy) > 1e-6 {
		return
	}
	nf, err := k.f.Props(T+dT, rho*math.Exp(dy))
	if err != nil {
		return
	}
	ns, err := k.sol.s.Props(T+dT, nf.P)
	if err != nil {
		return
	}
	nf.Flags |= Saturated
	ns.Flags |= Saturated
	*c = sublimation.Coexistence{T: T + dT, P: nf.P, Solid: ns, Fluid: nf}
	if sublimation.AtPressure(&nf, p, k.f.GasConstant()) {
		c.P = p // as the curve solver takes it
	}
}

// solidFloorT is the lowest temperature of a solid state: the model's
// own floor (0 for ice Ih, where 1 K is taken).
func (k *call) solidFloorT() float64 { return max(k.sol.s.Limits().TFloor, 1) }

// solidProps returns the solid at (T, p) as a result of this flash.
func (k *call) solidProps(T, p float64) (sublimation.Props, error) {
	if p > k.sol.n.solidPMax()*(1+1e-12) {
		return sublimation.Props{}, k.beyondError(k.beyondWhy(p))
	}
	sp, err := k.sol.s.Props(T, p)
	if err != nil {
		return sp, k.rewrap(err)
	}
	return sp, nil
}

// solidQ returns quantity q of the solid from its Gibbs derivatives g at
// (T, p), with ∂q/∂T at fixed p and ∂q/∂p at fixed T (q one of h, s, u,
// ρ — for ρ the specific volume 1/ρ is returned, with its derivatives).
func solidQ(q quantity, g *sublimation.Gibbs, T, p float64) (v, dT, dp float64) {
	cp := -T * g.GTT
	switch q {
	case qH:
		return g.G - T*g.GT, cp, g.GP - T*g.GTP
	case qS:
		return -g.GT, cp / T, -g.GTP
	case qU:
		return g.G - T*g.GT - p*g.GP, cp - p*g.GTP, -T*g.GTP - p*g.GPP
	}
	return g.GP, g.GTP, g.GPP // volume
}

// solidTarget converts a target value of q to what solidQ returns: the
// specific volume for ρ.
func solidTarget(q quantity, x float64) float64 {
	if q == qRho {
		return 1 / x
	}
	return x
}

// solidSolve solves q(T, p) = x for a single solid phase with one of T
// (varyT) and p fixed at the other's value (T or p), in [lo, hi], by
// Newton's method with the analytic derivative, kept in the bracket by
// bisection (q monotone there). It returns the solid's properties.
func (k *call) solidSolve(q quantity, x float64, varyT bool, T, p, lo, hi float64) (sublimation.Props, bool) {
	s := k.sol.s
	xt := solidTarget(q, x)
	at := func(y float64) (r, d float64) {
		tt, pp := T, p
		if varyT {
			tt = y
		} else {
			pp = y
		}
		g := s.Derivs(tt, pp)
		v, dT, dp := solidQ(q, &g, tt, pp)
		if varyT {
			return v - xt, dT
		}
		return v - xt, dp
	}
	flo, _ := at(lo)
	fhi, _ := at(hi)
	if !isFinite(flo) || !isFinite(fhi) || flo*fhi > 0 {
		return sublimation.Props{}, false
	}
	tol := solidTol(k.f, q, xt)
	rising := fhi > flo
	y := 0.5 * (lo + hi)
	if flo == 0 {
		y = lo
	} else if fhi == 0 {
		y = hi
	} else {
		// Start by linear interpolation in the bracket.
		y = lo + (hi-lo)*flo/(flo-fhi)
	}
	a, b := lo, hi
	for it := 0; it < 200; it++ {
		r, d := at(y)
		if math.Abs(r) <= tol {
			break
		}
		if (r > 0) == rising {
			b = y
		} else {
			a = y
		}
		yn := y - r/d
		if !(yn > a && yn < b) || !isFinite(yn) {
			yn = 0.5 * (a + b)
		}
		if b-a <= 1e-15*max(math.Abs(b), 1e-300) {
			y = yn
			break
		}
		y = yn
	}
	tt, pp := T, p
	if varyT {
		tt = y
	} else {
		pp = y
	}
	sp, err := s.Props(tt, pp)
	if err != nil {
		return sp, false
	}
	if r, _ := at(y); math.Abs(r) > 100*tol {
		return sp, false
	}
	return sp, true
}

// solidTol is the convergence tolerance of solidSolve for the target xt
// (a specific volume for ρ): 1/100 of the backward-residual floors.
func solidTol(f *fluid.Fluid, q quantity, xt float64) float64 {
	if q == qRho {
		return 1e-12 * math.Abs(xt)
	}
	return q.tol(f, nil, xt)
}
