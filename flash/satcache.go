package flash

import (
	"math"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// This file places fluid states against the vapour–liquid saturation
// curve by the fluid's cached curve (fluid.SaturationEstimateAtT and its
// forms at p and ρ): a state whose inputs lie outside the cached curve's
// error bounds is placed without solving the equation's saturation, and
// the equation's saturation is started from the cached one. Results come
// from the equation; the cache only places states and starts solvers.

// estErr returns the error bound of quantity X of the liquid (liquid
// true) or vapour of the estimate e.
func estErr(e *fluid.SatEstimate, X quantity, liquid bool) float64 {
	ph := &e.Err.Vapor
	if liquid {
		ph = &e.Err.Liquid
	}
	switch X {
	case qH:
		return ph.H
	case qS:
		return ph.S
	case qU:
		return ph.U
	case qRho:
		return ph.Rho
	case qT:
		return e.Err.T
	}
	return e.Err.P
}

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

// placeX places X = x at the saturation estimate e (at given p or T)
// against the saturated phases, X rising from the liquid to the vapour.
func placeX(e *fluid.SatEstimate, X quantity, x float64) cachePlace {
	xl, xv := X.of(&e.Liquid), X.of(&e.Vapor)
	el, ev := estErr(e, X, true), estErr(e, X, false)
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
	liquid := pr.Rho > c.Rho
	switch {
	case pr.P > ps+errP:
		return liquid, true
	case pr.P < ps-errP:
		return !liquid, true
	}
	return false, false
}

// satFromCacheT returns the equation's saturation at T started from the
// cached curve; ok is false where the curve has no estimate at T.
func (k *call) satFromCacheT(T float64) (fluid.Saturation, bool, error) {
	e, ok := k.f.SaturationEstimateAtT(T)
	if !ok {
		return fluid.Saturation{}, false, nil
	}
	s, err := k.f.SaturationAtTFrom(T, e.Liquid.Rho, e.Vapor.Rho)
	return s, true, err
}

// satFromCacheP is satFromCacheT at pressure p.
func (k *call) satFromCacheP(p float64) (fluid.Saturation, bool, error) {
	e, ok := k.f.SaturationEstimateAtP(p)
	if !ok {
		return fluid.Saturation{}, false, nil
	}
	s, err := k.f.SaturationAtPFrom(p, e.T, e.Liquid.Rho, e.Vapor.Rho)
	return s, true, err
}

// taitRho returns the density of the liquid l compressed by dp in Pa, in
// the Tait form of fluid.Density's liquid steps: ρ(1 + K′dp/K)^(1/K′)
// with the bulk modulus K = ρ(∂p/∂ρ)_T of l and K′ = dK/dp = 7, typical
// of liquids (common practice, no source); l's density where that is
// not defined.
func taitRho(l *fluid.Props, dp float64) float64 {
	const kp = 7.0
	if base := 1 + kp*dp/(l.Rho*l.DpDrho); base > 0 && isFinite(base) {
		return l.Rho * math.Pow(base, 1/kp)
	}
	return l.Rho
}

// densityOn solves p(T, ρ) = p for ρ on the stable branch that the cached
// curve e at T chose (liquid true: ρ > ρ′; else ρ < ρ″), started from the
// saturated phase carried to p: the liquid by taitRho, the vapour by the
// second-virial form Z = 1 + (Z″ − 1)p/p_sat through the saturated
// vapour's compression factor Z″; a positive guess (a warm start)
// replaces the start. Far from the vapour pressure fluid.PropsTP solves
// it; near it, where PropsTP would solve the saturation to choose the
// root, Newton's method in ln ρ kept in that bracket (newton1).
func (k *call) densityOn(T, p float64, e *fluid.SatEstimate, liquid bool, guess float64) (fluid.Props, bool) {
	f := k.f
	lim := f.Limits()
	var rho0, lo, hi float64
	if liquid {
		l := &e.Liquid
		lo = max(l.Rho-2*e.Err.Liquid.Rho, f.Critical().Rho)
		hi = lim.RhoCeil
		rho0 = taitRho(l, p-e.P)
	} else {
		v := &e.Vapor
		lo = 1e-12 * v.Rho * p / e.P
		hi = min(v.Rho+2*e.Err.Vapor.Rho, f.Critical().Rho)
		z := 1 + (v.Z-1)*p/e.P
		rho0 = p / (f.GasConstant() * T * z)
		if !(z > 0) {
			rho0 = v.Rho * p / e.P
		}
	}
	if guess > lo && guess < hi {
		rho0 = guess
	}
	rho0 = min(max(rho0, lo), hi)
	if math.Abs(p/e.P-1) > 0.1 {
		// Far from the vapour pressure fluid.PropsTP decides the root
		// from the auxiliary equation without a saturation solve (they
		// are good to 2 %), and its iteration evaluates only the residual
		// part of the equation: from the same start.
		if pr, err := f.PropsTP(T, p, fluid.RootStable, rho0); err == nil && (pr.Rho > e.Liquid.Rho) == liquid {
			return pr, true
		}
	}
	return newton1(f, qP, p, T, rho0, false, lo, hi)
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
			T0 = g.T
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
			T0 = g.T
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
	prevR := math.Inf(1)
	for it := 0; it < 30; it++ {
		s, okc, err := k.satFromCacheT(T)
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

// liquidStart estimates the compressed liquid at pressure p with X = x
// (h or s) from the cached curve, as a start for Newton's method: the
// saturated liquid at the T where
//
//	g(T) = X′(T) + (∂X/∂p)_T (p − p_sat(T)) − x = 0,
//	(∂h/∂p)_T = (1 − Tβ′)/ρ′,  (∂s/∂p)_T = −β′/ρ′
//
// (β′ the saturated liquid's expansivity: a liquid's X departs from the
// saturated liquid's at its temperature nearly linearly in p), by
// Newton's method on the curve from T0, or where T0 is 0 from the T at
// which X′ = x, with the density carried to p by taitRho. Near Tc, where β′ diverges, the correction misleads: steps
// are limited to a tenth of T, and a search that does not settle in a
// few steps keeps its start. ok is false where x lies above the liquid at
// the end of the curve (Tc − 1 mK).
func (k *call) liquidStart(p float64, X quantity, x, T0 float64) (start fluid.Props, ok bool) {
	f := k.f
	lo, hi := f.SaturationEstimateRange()
	T := T0
	if !(T >= lo && T <= hi) {
		v := fluid.SatLiquidH
		if X == qS {
			v = fluid.SatLiquidS
		}
		var buf [2]fluid.SatEstimate
		if xs := f.SaturationEstimatesWhere(v, x, buf[:0]); len(xs) > 0 {
			T = xs[0].T
		} else if el, ok := f.SaturationEstimateAtT(lo); ok && x < X.of(&el.Liquid) {
			// Below the liquid at the triple point.
			T = lo
		} else {
			return start, false
		}
	}
	// Newton's method on the curve, to 1e-3 in T: a start needs no more
	// (Newton's method in (T, ρ) takes it on from the estimate's X).
	var e, best fluid.SatEstimate
	var xt, bestX float64
	bestR := math.Inf(1)
	for it := 0; it < 4; it++ {
		if e, ok = f.SaturationEstimateAtT(T); !ok {
			return start, false
		}
		l := &e.Liquid
		xl, dxl, dxdp := l.H, e.Slope.Liquid.H, (1-T*l.Expansivity)/l.Rho
		if X == qS {
			xl, dxl, dxdp = l.S, e.Slope.Liquid.S, -l.Expansivity/l.Rho
		}
		xt = xl + dxdp*(p-e.P)
		if r := math.Abs(xt - x); r < bestR {
			best, bestX, bestR = e, xt, r
		}
		dT := (x - xt) / (dxl - dxdp*e.Slope.P)
		if !isFinite(dT) || math.Abs(dT) <= 1e-3*T {
			break
		}
		dT = max(min(dT, 0.1*T), -0.1*T)
		T = min(max(T+dT, lo), hi)
	}
	if !(bestR < math.Inf(1)) {
		return start, false
	}
	start = best.Liquid
	start.P = p
	start.Rho = taitRho(&best.Liquid, p-best.P)
	// Its X by the same estimate, from which Newton's method in (T, ρ)
	// goes on.
	if X == qS {
		start.S = bestX
	} else {
		start.H = bestX
	}
	return start, true
}
