package table

import (
	"math"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// The saturation curve from the triple point to the lower end of the
// critical neighbourhood, as cubic Hermite splines in ln p.
const (
	sT      = iota // T, K
	sRhoL          // ρ′
	sLnRhoV        // ln ρ″
	sHL            // h′
	sHV            // h″
	sSL            // s′
	sSV            // s″
	sCpL           // cp′
	sCpV           // cp″
	sCvL           // cv′
	sCvV           // cv″
	sWL            // w′
	sWV            // w″
	sCvA           // the mixture's cv at q → 0, of the line cv(q)
	sCvB           // the mixture's cv at q → 1
	sKA            // the mixture's (v/w)² at q → 0, of the line (v/w)²(q)
	sKB            // the mixture's (v/w)² at q → 1
	nSat
)

// satCurves is the saturation curve on its grid in ln p.
//
// A mixture's cv and (v/w)² are linear in its quality q at a given
// pressure: along the saturation curve of slope γ, with the phases'
// changes along it (see flash's State doc),
//
//	cv = du′/dT + q d(u″ − u′)/dT − (u″ − u′)(dv′/dT + q d(v″ − v′)/dT)/(v″ − v′),
//	(v/w)² = −(dv/dT)_s/γ,  (dv/dT)_s = dv′/dT + q d(v″ − v′)/dT − (v″ − v′)(ds′/dT + q d(s″ − s′)/dT)/(s″ − s′),
//
// so two mixtures of the equation's flash at each node (q = 1/4 and
// 3/4) fix both lines, and the tables give the flash's own mixture
// properties at every q.
type satCurves struct {
	x grid
	c [nSat]curve
}

// satVals are the saturation curves at one pressure.
type satVals [nSat]float64

// at evaluates every curve at x.
func (s *satCurves) at(x float64, v *satVals) {
	i, t, w := s.x.cell(x)
	b := basis(t, w)
	for k := range v {
		v[k] = s.c[k].at(i, &b)
	}
}

// size returns the bytes of s.
func (s *satCurves) size() int {
	n := s.x.size()
	for _, c := range s.c {
		n += 8 * len(c)
	}
	return n
}

// satNode is a node of the saturation curves: the values, the exact
// slopes in x = ln p (NaN where the equation gives none), the tolerances
// of the refinement, and what warm-starts the next node.
type satNode struct {
	v, d, tol [nSat]float64
	bl        bpoint
	mix       flash.State
}

// satNodeAt computes the node at p, warm-started from near.
func (b *builder) satNodeAt(p float64, near *satNode) (satNode, error) {
	var n satNode
	var prev *bpoint
	var opt flash.Options
	if near != nil {
		prev, opt.Guess = &near.bl, &near.mix
	}
	bl, err := b.atP(bcurve{kind: cSatLiquid}, p, prev)
	if err != nil {
		return n, b.fail("saturation at p = "+fmtG(p)+" Pa", err)
	}
	bv, err := b.atP(bcurve{kind: cSatVapor}, p, &bl)
	if err != nil {
		return n, b.fail("saturation at p = "+fmtG(p)+" Pa", err)
	}
	var mix [2]flash.State
	for m, q := range [2]float64{0.25, 0.75} {
		mix[m], err = flash.PQWith(b.f, p, q, opt)
		if err != nil {
			return n, b.fail("mixture at p = "+fmtG(p)+" Pa", err)
		}
	}
	n.bl, n.mix = bl, mix[0]
	l, v := &bl.pr, &bv.pr
	R := b.f.GasConstant()
	eScale := R * b.crit.T
	set := func(k int, val, d, scale float64) { n.v[k], n.d[k], n.tol[k] = val, d, tolCurve*scale }
	set(sT, l.T, bl.dT*p, l.T)
	set(sRhoL, l.Rho, p*along(l, vRho, bl.dT, 1), l.Rho)
	set(sLnRhoV, math.Log(v.Rho), p*along(v, vRho, bv.dT, 1)/v.Rho, 1)
	set(sHL, l.H, p*along(l, vH, bl.dT, 1), max(math.Abs(l.H), eScale))
	set(sHV, v.H, p*along(v, vH, bv.dT, 1), max(math.Abs(v.H), eScale))
	set(sSL, l.S, p*along(l, vS, bl.dT, 1), max(math.Abs(l.S), R))
	set(sSV, v.S, p*along(v, vS, bv.dT, 1), max(math.Abs(v.S), R))
	nan := math.NaN()
	set(sCpL, l.Cp, nan, 0)
	set(sCpV, v.Cp, nan, 0)
	set(sCvL, l.Cv, nan, 0)
	set(sCvV, v.Cv, nan, 0)
	set(sWL, l.W, nan, 0)
	set(sWV, v.W, nan, 0)
	// The lines through q = 1/4 and 3/4, at q = 0 and 1.
	k1 := sq(1/mix[0].Rho) / sq(mix[0].W)
	k2 := sq(1/mix[1].Rho) / sq(mix[1].W)
	set(sCvA, 1.5*mix[0].Cv-0.5*mix[1].Cv, nan, 0)
	set(sCvB, 1.5*mix[1].Cv-0.5*mix[0].Cv, nan, 0)
	set(sKA, 1.5*k1-0.5*k2, nan, 0)
	set(sKB, 1.5*k2-0.5*k1, nan, 0)
	return n, nil
}

// buildSat builds the saturation curves from the triple point to p1,
// refined as the slabs are (see sbuild) to tolCurve.
func (b *builder) buildSat(n0 int) error {
	x0, x1 := ln(b.t.ptr), ln(b.t.nb.p1)
	xs := make([]float64, n0)
	for i := range xs {
		xs[i] = x0 + (x1-x0)*float64(i)/float64(n0-1)
	}
	xs[n0-1] = x1
	pOf := func(i int, x float64) float64 {
		switch x {
		case x0:
			return b.t.ptr
		case x1:
			return b.t.nb.p1
		}
		return math.Exp(x)
	}
	nodes := make([]satNode, n0)
	for i, x := range xs {
		var near *satNode
		if i > 0 {
			near = &nodes[i-1]
		}
		var err error
		if nodes[i], err = b.satNodeAt(pOf(i, x), near); err != nil {
			return err
		}
	}
	for round := 0; round < 40; round++ {
		n := len(xs)
		bad := make([]float64, n-1)
		f, df, tol := make([]float64, n), make([]float64, n), make([]float64, n)
		for k := 0; k < nSat; k++ {
			if !finite(nodes[0].d[k]) {
				continue
			}
			for i := range nodes {
				f[i], df[i], tol[i] = nodes[i].v[k], nodes[i].d[k], nodes[i].tol[k]
			}
			estimate(xs, f, df, tol, bad)
		}
		keepWide(xs, bad, minDx)
		if !refineAny(bad) {
			break
		}
		nx := split(xs, bad)
		nn := make([]satNode, len(nx))
		o := 0
		for i, x := range nx {
			if o < len(xs) && xs[o] == x {
				nn[i] = nodes[o]
				o++
				continue
			}
			var err error
			if nn[i], err = b.satNodeAt(pOf(i, x), &nn[i-1]); err != nil {
				return err
			}
		}
		xs, nodes = nx, nn
	}
	s := &b.t.sat
	s.x = newGrid(xs)
	n := len(xs)
	vals, ders := make([]float64, n), make([]float64, n)
	for k := range s.c {
		for i := range nodes {
			vals[i], ders[i] = nodes[i].v[k], nodes[i].d[k]
		}
		if !finite(ders[0]) {
			slopes(xs, vals, ders)
		}
		c := make(curve, 2*n)
		for i := range n {
			c[2*i], c[2*i+1] = vals[i], ders[i]
		}
		s.c[k] = c
	}
	return nil
}

// mixture returns the liquid–vapour state of the saturation values v at
// pressure p and quality q, 0 ≤ q ≤ 1: as the equation's flash builds it
// (q = 0 and 1 the saturated phases as single-phase states, flagged
// Saturated).
func (t *Table) mixture(v *satVals, p, q float64) flash.State {
	rl, rv := v[sRhoL], expP(v[sLnRhoV])
	hl, hv := v[sHL], v[sHV]
	ul, uv := hl-p/rl, hv-p/rv
	l := flash.PhaseState{Phase: flash.Liquid, Fraction: 1 - q, Rho: rl, H: hl, S: v[sSL], U: ul,
		Cp: v[sCpL], Cv: v[sCvL], W: v[sWL]}
	g := flash.PhaseState{Phase: flash.Vapor, Fraction: q, Rho: rv, H: hv, S: v[sSV], U: uv,
		Cp: v[sCpV], Cv: v[sCvV], W: v[sWV]}
	T := v[sT]
	fl := t.extrapolated(T, p)
	if q <= 0 || q >= 1 {
		ph := l
		if q >= 1 {
			ph = g
		}
		ph.Fraction = 1
		st := flash.State{T: T, P: p, Rho: ph.Rho, H: ph.H, S: ph.S, U: ph.U, Cp: ph.Cp, Cv: ph.Cv,
			W: ph.W, Phase: ph.Phase, N: 1, Flags: fl | fluid.Saturated}
		if q >= 1 {
			st.Quality = 1
		}
		st.Phases[0] = ph
		return st
	}
	vl, vv := 1/rl, 1/rv
	vm := vl + q*(vv-vl)
	st := flash.State{T: T, P: p, Rho: 1 / vm, H: hl + q*(hv-hl), S: l.S + q*(g.S-l.S),
		U: ul + q*(uv-ul), Cp: inf(), Phase: flash.TwoPhase, Quality: q, N: 2,
		Flags: fl | fluid.Saturated}
	st.Cv = v[sCvA] + q*(v[sCvB]-v[sCvA])
	if k := v[sKA] + q*(v[sKB]-v[sKA]); k > 0 {
		st.W = vm / sqrt(k)
	}
	st.Phases[0] = l
	st.Phases[1] = g
	return st
}

func sq(x float64) float64 { return x * x }
