package flash

import (
	"math"

	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/internal/elem"
)

// This file places fluid states against the vapour–liquid saturation
// curve by the fluid's cached curve (fluid.SaturationEstimateAtT and its
// forms at p and ρ): a state whose inputs lie outside the cached curve's
// error bounds is placed without solving the equation's saturation, and
// the equation's saturation is started from the cached one. Results come
// from the equation; the cache only places states and starts solvers.

// cachePlace is where the cached curve puts a fluid state.
type cachePlace int8

const (
	cacheUndecided cachePlace = iota // within the bounds, or outside the curve's range
	cacheLiquid                      // a stable liquid
	cacheVapor                       // a stable vapour
	cacheInside                      // between the saturated phases: a liquid–vapour mixture
)

// placeTRho places (T, ρ) by the cached curve at T: a stable liquid above
// ρ′, a stable vapour below ρ″, a mixture between them.
func placeTRho(e *fluid.SatEstimate, rho float64) cachePlace {
	switch {
	case rho > e.Liquid.Rho+e.Err.Liquid.Rho:
		return cacheLiquid
	case rho < e.Vapor.Rho-e.Err.Vapor.Rho:
		return cacheVapor
	case rho > e.Vapor.Rho+e.Err.Vapor.Rho && rho < e.Liquid.Rho-e.Err.Liquid.Rho:
		return cacheInside
	}
	return cacheUndecided
}

// satValues returns the values of the saturated liquid and vapour that
// quantity X (h, s, u or ρ) is.
func satValues(X quantity) (liquid, vapour fluid.SatValue) {
	switch X {
	case qH:
		return fluid.SatLiquidH, fluid.SatVaporH
	case qS:
		return fluid.SatLiquidS, fluid.SatVaporS
	case qU:
		return fluid.SatLiquidU, fluid.SatVaporU
	}
	return fluid.SatLiquidRho, fluid.SatVaporRho
}

// placeX places X = x (h, s or u) at the point sp of the cached curve (at
// given p or T) against the saturated phases, X rising from the liquid to
// the vapour.
func placeX(sp *fluid.SatPoint, X quantity, x float64) cachePlace {
	vl, vv := satValues(X)
	xl, el := sp.Value(vl)
	xv, ev := sp.Value(vv)
	switch {
	case x > xv+ev:
		return cacheVapor
	case x < xl-el:
		return cacheLiquid
	case x > xl+el && x < xv-ev:
		return cacheInside
	}
	return cacheUndecided
}

// stableByCache reports whether the single-phase fluid state pr is the
// stable phase at its (T, p) by the cached curve; decided is false where
// the curve cannot tell (T outside its range, p within its bound).
func (k *call) stableByCache(pr *fluid.Props) (stable, decided bool) {
	c := k.f.Critical()
	if pr.T >= c.T {
		return true, true
	}
	ps, errP, ok := k.f.VaporPressureEstimate(pr.T)
	if !ok {
		return false, false
	}
	return placeP(pr.P, ps, errP, pr.Rho > c.Rho)
}

// placeP places a single-phase fluid state of pressure p, liquid
// (ρ > ρc) or not, against the vapour pressure ps ± bound at its
// temperature: stable is whether it is the stable phase there (the
// liquid above ps, the vapour below), decided whether p lies outside the
// bound.
func placeP(p, ps, bound float64, liquid bool) (stable, decided bool) {
	switch {
	case p > ps+bound:
		return liquid, true
	case p < ps-bound:
		return !liquid, true
	}
	return false, false
}

// vaporPressure is the cached vapour pressure at a temperature T, for
// placing the states of a warm start near T against it: p and the bound
// of its error in Pa, its slope dp/dT along the curve in Pa/K.
type vaporPressure struct {
	T, p, err, slope float64
	ok               bool
}

// at sets vp to the cached vapour pressure of f at T and reports whether
// the curve has one there.
func (vp *vaporPressure) at(f *fluid.Fluid, T float64) bool {
	vp.T = T
	vp.p, vp.err, vp.slope, vp.ok = f.VaporPressureSlopeEstimate(T)
	return vp.ok
}

// place places the single-phase fluid state pr (below pc) against the
// vapour pressure at its own temperature, carried from vp's T to pr.T
// along the slope, as stableByCache does at pr.T itself, and reports
// whether that decides (|dT| ≤ 1e-3·T and p outside the bound). ps(T)
// lies within vp.err + |dT·slope|·(1 + |dT·slope|/p) of p + dT·slope:
// ps″ lies between 0 and slope²/ps where ln ps is concave in T with
// |d²ln ps/dT²| below (d ln ps/dT)² (the Clausius–Clapeyron form
// ln ps ≈ A − B/T with B > 2T, common to every fluid's vapour pressure;
// no source), which the second term covers twice over for |dT·slope| ≤ ps.
func (vp *vaporPressure) place(pr *fluid.Props, c fluid.Point) (stable, decided bool) {
	if !vp.ok || pr.T >= c.T {
		return false, false
	}
	dT := pr.T - vp.T
	lin := math.Abs(dT * vp.slope)
	if !(math.Abs(dT) <= 1e-3*vp.T && lin <= vp.p) {
		return false, false
	}
	return placeP(pr.P, vp.p+dT*vp.slope, vp.err+lin*(1+lin/vp.p), pr.Rho > c.Rho)
}

// satFromCacheT sets dst to the equation's saturation at T started from
// the cached curve (SatPoint.Solve), in place; ok is false where the
// curve has no estimate at T (dst is then untouched).
func (k *call) satFromCacheT(T float64, dst *fluid.Saturation) (ok bool, err error) {
	var sp fluid.SatPoint
	if !sp.LocateT(k.f, T) {
		return false, nil
	}
	return true, sp.Solve(dst)
}

// satFromCacheP is satFromCacheT at pressure p.
func (k *call) satFromCacheP(p float64, dst *fluid.Saturation) (ok bool, err error) {
	var sp fluid.SatPoint
	if !sp.LocateP(k.f, p) {
		return false, nil
	}
	return true, sp.Solve(dst)
}

// taitRho returns the density of a liquid of density rho and (∂p/∂ρ)_T
// dpdrho compressed by dp in Pa, in the Tait form of fluid.Density's
// liquid steps: ρ(1 + K′dp/K)^(1/K′) with the bulk modulus K =
// ρ(∂p/∂ρ)_T and K′ = dK/dp = 7, typical of liquids (common practice, no
// source); rho where that is not defined.
func taitRho(rho, dpdrho, dp float64) float64 {
	const kp = 7.0
	if base := 1 + kp*dp/(rho*dpdrho); base > 0 && isFinite(base) {
		return rho * elem.Exp(elem.Log(base)/kp)
	}
	return rho
}

// densityOn solves p(T, ρ) = p for ρ on the stable branch that the cached
// curve at T (the point sp, vapour pressure ps) chose (liquid true:
// ρ > ρ′; else ρ < ρ″), by fluid.PropsTPOnBranch, which judges the
// stable phase no more, started from the saturated phase carried to p:
// the liquid by taitRho, the vapour by the second-virial form
// Z = 1 + (Z″ − 1)p/p_sat through the saturated vapour's compression
// factor Z″; a positive guess (a warm start) within the bounds of the
// saturated density replaces the start.
func (k *call) densityOn(T, p float64, sp *fluid.SatPoint, ps float64, liquid bool, guess float64) (fluid.Props, bool) {
	f := k.f
	lim := f.Limits()
	var rho0, lo, hi float64
	root := fluid.RootVapor
	if liquid {
		root = fluid.RootLiquid
		rl, el := sp.Value(fluid.SatLiquidRho)
		lo = max(rl-2*el, f.Critical().Rho)
		hi = lim.RhoCeil
		rho0 = taitRho(rl, sp.Start(true).DpDrho, p-ps)
	} else {
		rv, ev := sp.Value(fluid.SatVaporRho)
		lo = 1e-12 * rv * p / ps
		hi = min(rv+2*ev, f.Critical().Rho)
		zv := ps / (rv * f.GasConstant() * T)
		z := 1 + (zv-1)*p/ps
		rho0 = p / (f.GasConstant() * T * z)
		if !(z > 0) {
			rho0 = rv * p / ps
		}
	}
	if guess > lo && guess < hi {
		rho0 = guess
	}
	rho0 = min(max(rho0, lo), hi)
	pr, err := f.PropsTPOnBranch(T, p, root, rho0)
	return pr, err == nil && pr.Rho >= lo && pr.Rho <= hi
}

// isochoreCached is DU (X = u) placed along the isochore ρ by the cached
// curve. Along an isochore u rises with T, in one phase and across the
// dome alike. Above the u of the isochore at Tc the state is a single
// phase above Tc. Below it, the temperatures at which the isochore
// crosses the saturated phase of its side (fluid.SaturationEstimatesAtRho:
// one, or for water's liquid near its density maximum two) cut
// [Tt, Tc] into segments alternately inside the dome and outside it, and
// the saturated u at each crossing places u in one segment: outside, a
// single phase by Newton's method in T along the isochore, started from
// the saturated phase at the crossing below it with its cv; inside, a
// mixture, solved on the cached curve and polished by Newton's method in
// T over the equation's saturation (each started from the cached curve),
// with the mixture's cv. ok is false where the curve does not decide (u
// within the bounds of a crossing's, the isochore inside the dome up to
// within a millikelvin of Tc, or a solver failure): the caller's general
// path then runs.
func (k *call) isochoreCached(rho, u float64) (st State, err error, ok bool) {
	f := k.f
	c := f.Critical()
	lim := f.Limits()
	pc, okc := props(f, c.T, rho)
	if !okc {
		return st, nil, false
	}
	if u >= pc.U {
		// Above Tc.
		T0 := 1.01 * c.T
		if pc.Cv > 0 && isFinite(pc.Cv) {
			T0 = min(c.T+(u-pc.U)/pc.Cv, lim.TCeil)
		}
		if g := k.opt.Guess; g != nil && g.T > c.T && g.T < lim.TCeil {
			T0 = min(max(predictT(g, rho, qU, u), c.T), lim.TCeil)
		}
		pr, ok := newton1(f, qU, u, T0, rho, true, c.T, lim.TCeil)
		if !ok {
			return st, nil, false
		}
		st, err = k.finish(&pr)
		st, err = k.wanted(st, err)
		return st, err, true
	}
	// Below Tc: the segments of the isochore.
	et, okt := f.SaturationEstimateAtT(k.sol.tt)
	if !okt {
		return st, nil, false
	}
	in0 := placeTRho(&et, rho)
	if in0 == cacheUndecided {
		return st, nil, false
	}
	liquid := rho > c.Rho
	var buf [4]fluid.SatEstimate
	xs := f.SaturationEstimatesAtRho(rho, buf[:0])
	// Boundary j (1..m) is the crossing xs[j−1]; segment j lies between
	// boundaries j and j+1, boundary 0 being Tt and m+1 Tc.
	m := len(xs)
	j := m // the segment holding u: the top one unless a crossing is above u
	for i := range xs {
		ub, eb := xs[i].Vapor.U, xs[i].Err.Vapor.U
		if liquid {
			ub, eb = xs[i].Liquid.U, xs[i].Err.Liquid.U
		}
		if math.Abs(u-ub) <= eb {
			return st, nil, false
		}
		if u < ub {
			j = i
			break
		}
	}
	inside := (in0 == cacheInside) != (j%2 == 1)
	lo, hi := k.sol.tt, c.T
	if j > 0 {
		lo = xs[j-1].T - xs[j-1].Err.T
	}
	if j < m {
		hi = xs[j].T + xs[j].Err.T
	}
	if !inside {
		// A single phase, from the crossing below (or the one above).
		T0 := 0.5 * (lo + hi)
		var from *fluid.SatEstimate
		switch {
		case j > 0:
			from = &xs[j-1]
		case j < m:
			from = &xs[j]
		}
		if from != nil {
			sp := &from.Vapor
			if liquid {
				sp = &from.Liquid
			}
			if sp.Cv > 0 {
				T0 = from.T + (u-sp.U)/sp.Cv
			}
		}
		if g := k.opt.Guess; g != nil && g.T > lo && g.T < hi {
			T0 = predictT(g, rho, qU, u)
		}
		T0 = min(max(T0, lo), hi)
		pr, ok := newton1(f, qU, u, T0, rho, true, max(lo, lim.TFloor), hi)
		if !ok || pr.T < k.sol.tt {
			return st, nil, false
		}
		st, err = k.finish(&pr)
		st, err = k.wanted(st, err)
		return st, err, true
	}
	return k.mixtureOnIsochore(rho, u, lo, hi)
}

// mixtureOnIsochore solves DU for a liquid–vapour mixture of density rho
// and internal energy u with T in [lo, hi] (below Tc): first on the
// cached curve, then by Newton's method in T over the equation's
// saturation with the mixture's cv, bracketed. ok is false where the
// cached curve ends below the solution (within a millikelvin of Tc) or
// an iteration fails.
func (k *call) mixtureOnIsochore(rho, u, lo, hi float64) (st State, err error, ok bool) {
	f := k.f
	// On the cached curve: u of the mixture and its slope along the
	// isochore, from the saturated phases and their slopes.
	mix := func(T float64) (r, d float64, ok bool) {
		e, ok := f.SaturationEstimateAtT(T)
		if !ok {
			return 0, 0, false
		}
		l, v := &e.Liquid, &e.Vapor
		vl, vv := 1/l.Rho, 1/v.Rho
		q := (1/rho - vl) / (vv - vl)
		dvl, dvv := -e.Slope.Liquid.Rho*vl*vl, -e.Slope.Vapor.Rho*vv*vv
		dq := -(dvl + q*(dvv-dvl)) / (vv - vl)
		r = l.U + q*(v.U-l.U) - u
		d = e.Slope.Liquid.U + q*(e.Slope.Vapor.U-e.Slope.Liquid.U) + (v.U-l.U)*dq
		return r, d, true
	}
	tLo, tHi := f.SaturationEstimateRange()
	a, b := max(lo, tLo), min(hi, tHi)
	if rb, _, okb := mix(b); !okb || rb < 0 {
		// Above the end of the cached curve: the general path.
		return st, nil, false
	}
	T := 0.5 * (a + b)
	for it := 0; it < 100; it++ {
		r, d, ok := mix(T)
		if !ok {
			return st, nil, false
		}
		if r > 0 {
			b = T
		} else {
			a = T
		}
		Tn := T - r/d
		if !(Tn > a && Tn < b) {
			Tn = 0.5 * (a + b)
		}
		// The cached curve is good to about 1e-8: a start needs no more.
		if math.Abs(Tn-T) <= 1e-10*T || b-a <= 1e-10*b {
			T = Tn
			break
		}
		T = Tn
	}
	// Polished on the equation's saturation.
	return k.polishMixture(rho, u, T, lo, hi, 30)
}

// polishMixture solves DU for a liquid–vapour mixture of density rho and
// internal energy u by Newton's method in T over the equation's
// saturation (started from the cached curve at each T), with the
// mixture's cv as the slope of its u along the isochore, from T within
// the bracket [lo, hi], bisecting where a step leaves the bracket or
// does not halve the residual, in at most maxIt saturations. ok is false
// where an iterate's saturation fails or does not hold rho between its
// phases' densities, or the iteration does not converge: the caller's
// general path decides.
func (k *call) polishMixture(rho, u, T, lo, hi float64, maxIt int) (st State, err error, ok bool) {
	f := k.f
	prevR := math.Inf(1)
	for it := 0; it < maxIt; it++ {
		var s fluid.Saturation
		okc, err := k.satFromCacheT(T, &s)
		if !okc || err != nil {
			return st, nil, false
		}
		q, in := qualityOf(rho, &s)
		if !in {
			return st, nil, false
		}
		m := twoPhase(f, &s, q)
		r := m.U - u
		if math.Abs(r) <= qU.tol(f, &s.Liquid, u) {
			st, err = k.finishSat(&s, q)
			return st, err, true
		}
		if r > 0 {
			hi = T
		} else {
			lo = T
		}
		if hi-lo <= 1e-14*hi {
			if math.Abs(r) <= qU.floor(f, &s.Liquid, u) {
				st, err = k.finishSat(&s, q)
				return st, err, true
			}
			return st, nil, false
		}
		Tn := T - r/m.Cv
		if !(Tn > lo && Tn < hi) || math.Abs(r) > 0.5*prevR {
			Tn = 0.5 * (lo + hi)
		}
		prevR = math.Abs(r)
		T = Tn
	}
	return st, nil, false
}

// isochoreWarm is DU (X = u) from a two-phase warm start, without the
// segments of the isochore that the cold path places first
// (isochoreCached): one Newton step from the guess's own saturated
// phases, whose mixture at the overall density rho gives u at the
// guess's temperature, with the guess's cv as the slope (a simulator's
// step changes the quality, on which cv depends, only a little); then
// polishMixture. Every iterate is a mixture holding rho between its
// phases' densities, and the mixture's u rises with T along the isochore
// (cv > 0), so a converged state is the one equilibrium state at
// (rho, u); where an iterate leaves the dome or the iteration is slow to
// settle, ok is false and the cold path decides.
func (k *call) isochoreWarm(rho, u float64) (st State, err error, ok bool) {
	gT, _, _, okg := k.guessSat()
	if !okg {
		return st, nil, false
	}
	lo, hi := k.f.SaturationEstimateRange()
	lo = max(lo, k.sol.tt)
	if !(gT > lo && gT < hi) {
		return st, nil, false
	}
	g := k.opt.Guess
	l, v := &g.Phases[0], &g.Phases[1]
	vl, vv := 1/l.Rho, 1/v.Rho
	T := gT
	if q := (1/rho - vl) / (vv - vl); q > 0 && q < 1 && g.Cv > 0 && isFinite(g.Cv) {
		if Tn := gT - (l.U+q*(v.U-l.U)-u)/g.Cv; Tn > lo && Tn < hi && math.Abs(Tn-gT) <= 0.05*gT {
			T = Tn
		}
	}
	return k.polishMixture(rho, u, T, lo, hi, 6)
}

// liquidStart estimates the compressed liquid at pressure p with X = x
// (h or s) from the cached curve, as a start for Newton's method: the
// saturated liquid at the T where
//
//	g(T) = X′(T) + (∂X/∂p)_T (p − p_sat(T)) − x = 0,
//	(∂h/∂p)_T = (1 − Tβ′)/ρ′,  (∂s/∂p)_T = −β′/ρ′
//
// (β′ the saturated liquid's expansivity: a liquid's X departs from the
// saturated liquid's at its temperature nearly linearly in p), by
// Newton's method on the curve from T0, or where T0 is outside the curve
// from the T at which X′ = x, with the density carried to p by taitRho.
// Near Tc, where β′ diverges, the correction misleads: steps are limited
// to a tenth of T, and a search that does not settle in a few steps
// keeps its best point. ok is false where x lies above the liquid at the
// end of the curve (Tc − 1 mK). Each step reads single values of the
// curve (fluid.SatPoint).
func (k *call) liquidStart(p float64, X quantity, x, T0 float64) (start fluid.Props, ok bool) {
	f := k.f
	lo, hi := f.SaturationEstimateRange()
	vl := fluid.SatLiquidH
	if X == qS {
		vl = fluid.SatLiquidS
	}
	T := T0
	if !(T >= lo && T <= hi) {
		var buf [2]fluid.SatPoint
		if xs := f.SaturationPointsWhere(vl, x, buf[:0]); len(xs) > 0 {
			T, _ = xs[0].Temperature()
		} else if sp, ok := f.SaturationPointAtT(lo); ok {
			if xl, _ := sp.Value(vl); x >= xl {
				return start, false
			}
			// Below the liquid at the triple point.
			T = lo
		} else {
			return start, false
		}
	}
	// Newton's method on the curve, to 1e-3 in T: a start needs no more
	// (Newton's method in (T, ρ) takes it on from the estimate's X).
	var best fluid.SatPoint
	var bestX, bestPs float64
	bestR := math.Inf(1)
	for it := 0; it < 4; it++ {
		sp, ok := f.SaturationPointAtT(T)
		if !ok {
			return start, false
		}
		xl, _ := sp.Value(vl)
		dxl := sp.Slope(vl)
		rl, _ := sp.Value(fluid.SatLiquidRho)
		beta := sp.Start(true).Expansivity
		ps, _, dps := sp.Pressure()
		dxdp := (1 - T*beta) / rl
		if X == qS {
			dxdp = -beta / rl
		}
		xt := xl + dxdp*(p-ps)
		if r := math.Abs(xt - x); r < bestR {
			best, bestX, bestPs, bestR = sp, xt, ps, r
		}
		dT := (x - xt) / (dxl - dxdp*dps)
		if !isFinite(dT) || math.Abs(dT) <= 1e-3*T {
			break
		}
		dT = max(min(dT, 0.1*T), -0.1*T)
		T = min(max(T+dT, lo), hi)
	}
	if !(bestR < math.Inf(1)) {
		return start, false
	}
	start = best.Liquid()
	start.Rho = taitRho(start.Rho, start.DpDrho, p-bestPs)
	start.P = p
	// Its X by the same estimate, from which Newton's method in (T, ρ)
	// goes on.
	if X == qS {
		start.S = bestX
	} else {
		start.H = bestX
	}
	return start, true
}
