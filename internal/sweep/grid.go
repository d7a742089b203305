package main

import (
	"math"
	"slices"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/sublimation"
)

// kind is the forward flash of a case.
type kind uint8

const (
	kPT kind = iota
	kDT
	kTQ
	kPQ
	kPH
	kDU
)

var kindNames = [...]string{"PT", "DT", "TQ", "PQ", "PH", "DU"}

func (k kind) String() string { return kindNames[k] }

// region groups the cases of one part of the state space.
type region uint8

const (
	rFluid region = iota
	rSupercritical
	rCritical
	rSaturation
	rTriple
	rMetastable
	rSolid
	rLimits
	nRegions
)

var regionNames = [nRegions]string{"fluid", "supercritical", "critical", "saturation", "triple",
	"metastable", "solid", "limits"}

// regionWeights share the requested number of states among the regions.
var regionWeights = [nRegions]float64{0.34, 0.06, 0.06, 0.12, 0.06, 0.12, 0.16, 0.08}

// tcase is one forward flash: kind(a, b) with options, and for the
// cases built from a known mixture the fractions it must have.
type tcase struct {
	region region
	kind   kind
	a, b   float64
	phase  flash.Phase // Options.Phase
	meta   bool        // Options.AllowMetastable
	// For PH and DU cases built from a known mixture: the solid and
	// vapour fractions it must come back with (want >= 0), else -1.
	wantSolid, wantVapor float64
	// cc: check the Clausius–Clapeyron equation on the curve through
	// the state (one case per point of a curve).
	cc bool
}

func (c *tcase) options() flash.Options {
	return flash.Options{Phase: c.phase, AllowMetastable: c.meta}
}

// setup is what the grids and the judges need to know of a fluid.
type setup struct {
	f        *fluid.Fluid
	sol      sublimation.Solid
	hasSolid bool
	lim      fluid.Limits
	crit     fluid.Point
	tp       fluid.TriplePoint
	R        float64
	// Solid models only: the sublimation pressure at the vapour floor
	// (Pa), the model's limits, and its triple point.
	subPFloor float64
	solLim    sublimation.Limits
	three     sublimation.ThreePhase
	meltPMax  float64 // the highest pressure of the model's melting curve, Pa
	meltTEnd  float64 // the melting temperature there, K
	pSatTt    float64 // the equation's vapour pressure at the triple-point temperature, Pa
}

func newSetup(f *fluid.Fluid) (*setup, error) {
	s := &setup{f: f, lim: f.Limits(), crit: f.Critical(), tp: f.Triple(), R: f.GasConstant()}
	sat, err := f.SaturationAtT(s.tp.T)
	if err != nil {
		return nil, err
	}
	s.pSatTt = sat.P
	sol, err := sublimation.For(f)
	if err != nil {
		return s, nil // no solid model
	}
	s.sol, s.hasSolid, s.solLim = sol, true, sol.Limits()
	c, err := sol.SublimationPressure(s.lim.TFloor)
	if err != nil {
		return nil, err
	}
	s.subPFloor = c.P
	if s.three, err = sol.Triple(); err != nil {
		return nil, err
	}
	curve, err := sol.MeltingCurve(2)
	if err != nil {
		return nil, err
	}
	s.meltPMax, s.meltTEnd = curve[1].P, curve[1].T
	return s, nil
}

// logspace returns n points from lo to hi, evenly spaced in log.
func logspace(lo, hi float64, n int) []float64 {
	if n < 2 {
		return []float64{lo}
	}
	out := make([]float64, n)
	for i := range out {
		out[i] = lo * math.Pow(hi/lo, float64(i)/float64(n-1))
	}
	out[n-1] = hi
	return out
}

// linspace returns n points from lo to hi, evenly spaced.
func linspace(lo, hi float64, n int) []float64 {
	if n < 2 {
		return []float64{lo}
	}
	out := make([]float64, n)
	for i := range out {
		out[i] = lo + (hi-lo)*float64(i)/float64(n-1)
	}
	out[n-1] = hi
	return out
}

// offsets returns x·(1 + e) for e = 0 and ±10^k, k from kLo to kHi.
func offsets(x float64, kLo, kHi int) []float64 { return offsetsBy(x, kLo, kHi, 1) }

// offsetsBy is offsets with every step-th exponent.
func offsetsBy(x float64, kLo, kHi, step int) []float64 {
	out := []float64{x}
	for k := kLo; k <= kHi; k += step {
		e := math.Pow(10, float64(k))
		out = append(out, x*(1+e), x*(1-e))
	}
	slices.Sort(out)
	return out
}

// side returns n points of d ∈ ±[lo, hi] (log-spaced on each side) and 0.
func side(lo, hi float64, n int) []float64 {
	out := []float64{0}
	for _, d := range logspace(lo, hi, max(n/2, 1)) {
		out = append(out, d, -d)
	}
	slices.Sort(out)
	return out
}

// qualities returns n vapour fractions in [0, 1], denser at both ends.
func qualities(n int) []float64 {
	out := []float64{0, 1, 0.5}
	for _, e := range logspace(1e-9, 0.4, max((n-3)/2, 1)) {
		out = append(out, e, 1-e)
	}
	slices.Sort(out)
	return slices.Compact(out)
}

// sq returns the side of a square grid of about n points.
func sq(n float64) int { return max(int(math.Sqrt(n)), 2) }

// cases returns the forward cases of every selected region, about n in
// all.
func (s *setup) cases(n float64, want [nRegions]bool) []tcase {
	var out []tcase
	grids := [nRegions]func([]tcase, float64) []tcase{
		rFluid: s.fluidGrid, rSupercritical: s.supercriticalGrid, rCritical: s.criticalGrid,
		rSaturation: s.saturationGrid, rTriple: s.tripleGrid, rMetastable: s.metastableGrid,
		rSolid: s.solidGrid, rLimits: s.limitsGrid,
	}
	for r := range nRegions {
		if want[r] {
			out = grids[r](out, n*regionWeights[r])
		}
	}
	return out
}

// fluidGrid: PT over the whole accepted rectangle, log-spaced in T and p,
// from 1 Pa to PCeil.
func (s *setup) fluidGrid(out []tcase, m float64) []tcase {
	k := sq(m)
	Tlo := s.lim.TFloor
	if s.hasSolid {
		Tlo = min(Tlo, 0.5*s.tp.T) // into the solid below the vapour floor
	}
	for _, T := range logspace(Tlo, s.lim.TCeil, k) {
		for _, p := range logspace(1, s.lim.PCeil, k) {
			out = append(out, tcase{region: rFluid, kind: kPT, a: p, b: T})
		}
	}
	return out
}

// supercriticalGrid: PT for Tc < T ≤ 3 Tc and pc < p ≤ 30 pc.
func (s *setup) supercriticalGrid(out []tcase, m float64) []tcase {
	k := sq(m)
	c := s.crit
	for _, T := range logspace(c.T*(1+1e-9), min(3*c.T, s.lim.TCeil), k) {
		for _, p := range logspace(c.P*(1+1e-9), min(30*c.P, s.lim.PCeil), k) {
			out = append(out, tcase{region: rSupercritical, kind: kPT, a: p, b: T})
		}
	}
	return out
}

// criticalGrid: DT at T = Tc + d for |d| from 1e-7 K to 1 K (and 0) and
// ρ = ρc(1 + e) for |e| from 1e-7 to 0.5 (and 0); PT at the same T
// around pc; TQ and PQ are in the saturation grid.
func (s *setup) criticalGrid(out []tcase, m float64) []tcase {
	k := sq(m * 0.8)
	c := s.crit
	for _, d := range side(1e-7, 1, k) {
		for _, e := range side(1e-7, 0.5, k) {
			out = append(out, tcase{region: rCritical, kind: kDT, a: c.Rho * (1 + e), b: c.T + d})
		}
	}
	k = sq(m * 0.2)
	for _, d := range side(1e-7, 1, k) {
		for _, e := range side(1e-9, 0.1, k) {
			out = append(out, tcase{region: rCritical, kind: kPT, a: c.P * (1 + e), b: c.T + d})
		}
	}
	return out
}

// saturationGrid: TQ from the triple point to the critical point, dense
// in the last kelvin (down to 1 µK below Tc) and at the triple point;
// PQ likewise in p.
func (s *setup) saturationGrid(out []tcase, m float64) []tcase {
	nq := 24
	nT := max(int(m/2/float64(nq)), 4)
	c, tp := s.crit, s.tp
	Ts := linspace(tp.T, c.T, nT/2)
	for _, d := range logspace(1e-6, c.T-tp.T, nT/2) {
		Ts = append(Ts, c.T-d)
	}
	Ts = append(Ts, c.T)
	slices.Sort(Ts)
	for _, T := range slices.Compact(Ts) {
		for _, q := range qualities(nq) {
			out = append(out, tcase{region: rSaturation, kind: kTQ, a: T, b: q, cc: q == 0})
		}
	}
	ps := logspace(tp.P, c.P, nT/2)
	for _, d := range logspace(1e-9, 1-tp.P/c.P, nT/2) {
		ps = append(ps, c.P*(1-d))
	}
	ps = append(ps, c.P)
	slices.Sort(ps)
	for _, p := range slices.Compact(ps) {
		for _, q := range qualities(nq) {
			out = append(out, tcase{region: rSaturation, kind: kPQ, a: p, b: q})
		}
	}
	return out
}

// tripleGrid: PT at T = Tt(1 + e1), p = pt(1 + e2) for |e| from 1e-13 to
// 1e-2; TQ and PQ across the triple line; DU of three-phase mixtures over
// a grid of fractions; PH on the triple line and beside it.
func (s *setup) tripleGrid(out []tcase, m float64) []tcase {
	tp := s.tp
	k := sq(m * 0.35)
	es := side(1e-13, 1e-2, k)
	for _, e1 := range es {
		for _, e2 := range es {
			out = append(out, tcase{region: rTriple, kind: kPT, a: tp.P * (1 + e2), b: tp.T * (1 + e1)})
		}
	}
	kq := sq(m * 0.15)
	for _, e := range side(1e-13, 1e-2, kq) {
		for _, q := range qualities(kq) {
			out = append(out, tcase{region: rTriple, kind: kTQ, a: tp.T * (1 + e), b: q})
			out = append(out, tcase{region: rTriple, kind: kPQ, a: tp.P * (1 + e), b: q})
		}
	}
	if !s.hasSolid {
		return out
	}
	// Three-phase mixtures by DU, and by PH on the triple line.
	t3 := &s.three
	kd := sq(m * 0.3)
	xs := linspace(0, 1, kd)
	for _, a := range xs {
		for _, b := range xs {
			xS, xV := a*(1-b), b // fill the triangle
			xL := 1 - xS - xV
			if xS <= 0 || xV <= 0 || xL <= 1e-12 {
				continue
			}
			v := xS/t3.Solid.Rho + xL/t3.Liquid.Rho + xV/t3.Vapor.Rho
			u := xS*t3.Solid.U + xL*t3.Liquid.U + xV*t3.Vapor.U
			out = append(out, tcase{region: rTriple, kind: kDU, a: 1 / v, b: u, wantSolid: xS, wantVapor: xV})
		}
	}
	kh := max(int(m*0.05), 4)
	hlo, hhi := t3.Solid.H-0.1*(t3.Vapor.H-t3.Solid.H), t3.Vapor.H+0.1*(t3.Vapor.H-t3.Solid.H)
	for _, h := range linspace(hlo, hhi, kh) {
		for _, p := range []float64{t3.P, t3.P * (1 + 1e-11), t3.P * (1 - 1e-11), t3.P * (1 + 1e-9), t3.P * (1 - 1e-9)} {
			out = append(out, tcase{region: rTriple, kind: kPH, a: p, b: h, wantSolid: -1, wantVapor: -1})
		}
	}
	return out
}

// metastableGrid: along isotherms from the triple point to 0.1 K below
// Tc, DT with AllowMetastable at densities between each saturated phase
// and its spinodal (closing in on the spinodal to 1e-6 of the gap); and,
// for fluids with a solid, the fluid against the solid: supercooled
// liquid (PT, Liquid) and supersaturated vapour (PT, Vapor) below the
// triple point.
func (s *setup) metastableGrid(out []tcase, m float64) []tcase {
	c, tp := s.crit, s.tp
	nx := 20
	share := 1.0
	if s.hasSolid {
		share = 0.7
	}
	nT := max(int(m*share/float64(2*nx)), 4)
	// Up to 1e-6 of the gap from the spinodal, not on it: at the
	// spinodal itself (∂p/∂ρ)_T = 0, and the inverse flashes have a
	// double root there (flash: metastable states up to the spinodal,
	// which is refused with ErrUnstable).
	xs := linspace(0, 1, nx-4)[1 : nx-5]
	xs = append(xs, 1-1e-2, 1-1e-3, 1-1e-4, 1-1e-6, 1e-4)
	for _, T := range linspace(tp.T, c.T-0.1, nT) {
		sat, err := s.f.SaturationAtT(T)
		if err != nil {
			continue // reported by the saturation grid
		}
		for _, liquid := range []bool{true, false} {
			rs := sat.Vapor.Rho
			ph := flash.Vapor
			if liquid {
				rs, ph = sat.Liquid.Rho, flash.Liquid
			}
			sp, ok := s.spinodal(T, rs, liquid)
			if !ok {
				continue
			}
			for _, x := range xs {
				rho := rs + (sp-rs)*x
				out = append(out, tcase{region: rMetastable, kind: kDT, a: rho, b: T, phase: ph, meta: true})
			}
		}
	}
	if !s.hasSolid {
		return out
	}
	k := sq(m * (1 - share) / 2)
	// Supercooled liquid, from the vapour floor to the triple point, at
	// pressures from the triple point's to the solid model's limit.
	for _, T := range linspace(s.lim.TFloor, tp.T, k) {
		for _, p := range logspace(tp.P*1.01, s.solLim.PCeil, k) {
			out = append(out, tcase{region: rMetastable, kind: kPT, a: p, b: T, phase: flash.Liquid, meta: true})
		}
	}
	// Supersaturated vapour: up to 3 times the sublimation pressure.
	for _, T := range linspace(s.lim.TFloor, tp.T, k) {
		c, err := s.sol.SublimationPressure(T)
		if err != nil {
			continue
		}
		for _, r := range logspace(1+1e-6, 3, k) {
			out = append(out, tcase{region: rMetastable, kind: kPT, a: c.P * r, b: T, phase: flash.Vapor, meta: true})
		}
	}
	return out
}

// spinodal returns the density of the spinodal ((∂p/∂ρ)_T = 0) of the
// liquid (beyond ρc below rs) or the vapour (above rs, below ρc) at T,
// by bisection on the sign of (∂p/∂ρ)_T from fluid.Props.
func (s *setup) spinodal(T, rs float64, liquid bool) (float64, bool) {
	c := s.crit
	lo, hi := c.Rho, rs // liquid: stable at hi, unstable toward lo
	if !liquid {
		lo, hi = rs, c.Rho // vapour: stable at lo
	}
	stable := func(rho float64) bool {
		pr, _ := s.f.Props(T, rho) // the values come back with ErrUnstable too
		return pr.DpDrho > 0
	}
	if liquid && (stable(lo) || !stable(hi)) || !liquid && (!stable(lo) || stable(hi)) {
		return 0, false
	}
	for range 200 {
		mid := 0.5 * (lo + hi)
		if mid == lo || mid == hi {
			break
		}
		if stable(mid) == liquid {
			hi = mid
		} else {
			lo = mid
		}
	}
	if liquid {
		return hi, true // the stable side
	}
	return lo, true
}

// solidGrid: PT below the triple point and up to the solid model's
// pressure limit; TQ and PQ on the sublimation curve; PH in solid–liquid
// mixtures on the melting curve.
func (s *setup) solidGrid(out []tcase, m float64) []tcase {
	if !s.hasSolid {
		// The solid region is an error (ErrUndefined): a few cases.
		tp := s.tp
		for _, T := range linspace(0.5*tp.T, tp.T*(1-1e-9), 10) {
			for _, p := range logspace(1, 1e7, 10) {
				out = append(out, tcase{region: rSolid, kind: kPT, a: p, b: T})
			}
			out = append(out, tcase{region: rSolid, kind: kTQ, a: T, b: 0.5})
		}
		return out
	}
	tp := s.tp
	k := sq(m * 0.4)
	Tlo := min(s.lim.TFloor, 0.5*tp.T)
	for _, T := range linspace(Tlo, tp.T, k) {
		for _, p := range logspace(s.subPFloor, s.solLim.PCeil, k) {
			out = append(out, tcase{region: rSolid, kind: kPT, a: p, b: T})
		}
	}
	kq := sq(m * 0.2)
	for _, T := range linspace(s.lim.TFloor, tp.T, kq) {
		for _, q := range qualities(kq) {
			out = append(out, tcase{region: rSolid, kind: kTQ, a: T, b: q, cc: q == 0})
		}
	}
	for _, p := range logspace(s.subPFloor, tp.P, kq) {
		for _, q := range qualities(kq) {
			out = append(out, tcase{region: rSolid, kind: kPQ, a: p, b: q})
		}
	}
	// Solid–liquid mixtures: solid fraction x at pressure p on the
	// melting curve, by PH.
	km := sq(m * 0.2)
	for _, p := range logspace(tp.P*1.001, s.meltPMax, km) {
		c, err := s.sol.MeltingTemperature(p)
		if err != nil {
			continue // reported by the curve checks
		}
		for i, x := range linspace(0, 1, km+2)[1 : km+1] {
			h := x*c.Solid.H + (1-x)*c.Fluid.H
			out = append(out, tcase{region: rSolid, kind: kPH, a: p, b: h, wantSolid: x, wantVapor: 0, cc: i == 0})
		}
	}
	return out
}

// limitsGrid: both sides of every edge: T at TFloor and TCeil, p at
// PCeil, ρ at RhoCeil, the vapour floor of TQ and PQ, the critical point
// of TQ and PQ, and the solid model's pressure limit.
func (s *setup) limitsGrid(out []tcase, m float64) []tcase {
	l, c := s.lim, s.crit
	k := max(int(m/12), 4)
	// Small sweeps (the tests) take every third exponent of the offsets
	// and fewer qualities; from m = 2000 on, all of them.
	step, nq := 1, 12
	if m < 2000 {
		step, nq = 3, 4
	}
	offsets := func(x float64, kLo, kHi int) []float64 { return offsetsBy(x, kLo, kHi, step) }
	Ts := logspace(l.TFloor, l.TCeil, k)
	ps := logspace(1, l.PCeil, k)
	for _, T := range append(offsets(l.TFloor, -12, -3), offsets(l.TCeil, -12, -3)...) {
		for _, p := range ps {
			out = append(out, tcase{region: rLimits, kind: kPT, a: p, b: T})
		}
	}
	for _, p := range offsets(l.PCeil, -12, -3) {
		for _, T := range Ts {
			out = append(out, tcase{region: rLimits, kind: kPT, a: p, b: T})
		}
	}
	for _, rho := range offsets(l.RhoCeil, -12, -3) {
		for _, T := range Ts {
			out = append(out, tcase{region: rLimits, kind: kDT, a: rho, b: T})
		}
	}
	Tfl := s.tp.T
	pfl := s.tp.P
	if s.hasSolid {
		Tfl, pfl = l.TFloor, s.subPFloor
	}
	for _, q := range qualities(nq) {
		for _, T := range append(offsets(Tfl, -12, -3), offsets(c.T, -15, -3)...) {
			out = append(out, tcase{region: rLimits, kind: kTQ, a: T, b: q})
		}
		for _, p := range append(offsets(pfl, -12, -3), offsets(c.P, -15, -3)...) {
			out = append(out, tcase{region: rLimits, kind: kPQ, a: p, b: q})
		}
	}
	if s.hasSolid {
		for _, p := range offsets(s.solLim.PCeil, -12, -3) {
			for _, T := range logspace(Tfl*0.5, 2*s.tp.T, k) {
				out = append(out, tcase{region: rLimits, kind: kPT, a: p, b: T})
			}
		}
		for _, p := range offsets(s.meltPMax, -12, -3) {
			for _, T := range logspace(Tfl*0.5, 2*s.tp.T, k) {
				out = append(out, tcase{region: rLimits, kind: kPT, a: p, b: T})
			}
		}
	}
	return out
}
