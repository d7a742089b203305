package fluid

import (
	"math"
	"sync"

	"github.com/tripoint-thermo/tripoint/internal/elem"
)

// This file holds a table of a fluid's own states above its critical
// temperature, for starting solvers there: above Tc a fluid is as dense
// as a liquid at high pressure and as rare as a gas at low, and the ideal
// gas, the density solver's start elsewhere, lies far from the dense
// states (Z = 0.45 at 1.1 Tc and 3 pc). It never gives a result: every
// state comes from the equation, solved from the table's start.

// denseTableHolder builds a fluid's table once, on first use. Lookup
// creates one per fluid; copies made by WithReference share it (densities
// do not depend on the reference state).
type denseTableHolder struct {
	once  sync.Once
	table *denseTable // nil where the build failed
}

// denseTable holds ln δ (δ = ρ/ρr), h and s (in the equation's default
// reference state) of the equation's own states at the nodes of a grid
// in u = ln(T/Tc − 1) and v = ln(p/pc), evenly spaced, from
// Tc·(1 + denseTableTMin) to TCeil and from denseTablePMin·pc to PCeil
// (Tc and pc of Critical()); NaN where the equation has no state in
// range. Between the nodes they are interpolated bilinearly in (u, v):
// starts, within a few per cent of the state away from the critical
// point (TestDenseTableStart, TestEstimateAboveTc).
type denseTable struct {
	tc, pc   float64
	u0, uInv float64 // first node and inverse spacing in u
	v0, vInv float64 // in v
	nu, nv   int
	lnDelta  []float64 // ln δ at node (i, j): [i*nv+j]
	h, s     []float64 // h and s there, J/kg and J/(kg·K)
}

// Build parameters of the table: the temperatures start at
// Tc·(1 + denseTableTMin) and the pressures at denseTablePMin·pc (below
// it the ideal gas starts the solver well enough), with nodes at most
// denseTableDU and denseTableDV apart in u and v.
const (
	denseTableTMin = 1e-3
	denseTablePMin = 0.1
	denseTableDU   = 0.2
	denseTableDV   = 0.2
)

// denseTable returns the table of f, building it on first use; nil where
// f has none (a fluid not made by the registry) or the build failed.
func (f *Fluid) denseTable() *denseTable {
	h := f.denseHolder
	if h == nil {
		return nil
	}
	h.once.Do(func() { h.table = f.buildDenseTable() })
	return h.table
}

// buildDenseTable solves the equation's density at the table's nodes,
// each isobar of an isotherm started from the node below it, in f's
// default reference state.
func (f *Fluid) buildDenseTable() *denseTable {
	g := *f
	g.hOff, g.sOff = 0, 0
	f = &g
	c := &f.crit
	l := &f.limits
	if !(l.TCeil > c.T*(1+denseTableTMin)) || !(l.PCeil > denseTablePMin*c.P) {
		return nil
	}
	d := &denseTable{tc: c.T, pc: c.P}
	d.u0 = math.Log(denseTableTMin)
	uEnd := math.Log(l.TCeil/c.T - 1)
	d.nu = int(math.Ceil((uEnd-d.u0)/denseTableDU)) + 1
	d.uInv = float64(d.nu-1) / (uEnd - d.u0)
	d.v0 = math.Log(denseTablePMin)
	vEnd := math.Log(l.PCeil / c.P)
	d.nv = int(math.Ceil((vEnd-d.v0)/denseTableDV)) + 1
	d.vInv = float64(d.nv-1) / (vEnd - d.v0)
	d.lnDelta = make([]float64, d.nu*d.nv)
	d.h, d.s = make([]float64, d.nu*d.nv), make([]float64, d.nu*d.nv)
	var it isotherm
	for i := 0; i < d.nu; i++ {
		T := c.T * (1 + math.Exp(d.u0+float64(i)/d.uInv))
		T = min(T, l.TCeil)
		tau := f.tc / T
		it.set(f, tau)
		gd := 0.0
		for j := 0; j < d.nv; j++ {
			p := c.P * math.Exp(d.v0+float64(j)/d.vInv)
			p = min(p, l.PCeil)
			pi := p / (f.rhoc * f.r * T)
			x, _, st := f.solveDelta(&it, pi, branchSingle, gd, nil)
			k := i*d.nv + j
			d.lnDelta[k], d.h[k], d.s[k] = math.NaN(), math.NaN(), math.NaN()
			if st == rootFound {
				pr := f.props(T, x*f.rhoc)
				d.lnDelta[k], d.h[k], d.s[k] = math.Log(x), pr.H, pr.S
				gd = x
			}
		}
	}
	return d
}

// start returns a starting reduced density δ for the equation's root at
// temperature T in K and pressure p in Pa, interpolated in the table;
// ok is false outside it or next to a node without a density.
func (d *denseTable) start(T, p float64) (delta float64, ok bool) {
	r := T/d.tc - 1
	if !(r >= denseTableTMin) || !(p >= denseTablePMin*d.pc) {
		return 0, false
	}
	su := (elem.Log(r) - d.u0) * d.uInv
	sv := (elem.Log(p/d.pc) - d.v0) * d.vInv
	if !(su <= float64(d.nu-1)) || !(sv <= float64(d.nv-1)) {
		return 0, false
	}
	i, j := min(int(su), d.nu-2), min(int(sv), d.nv-2)
	a, b := su-float64(i), sv-float64(j)
	k := i*d.nv + j
	z := d.lnDelta
	w := (1-a)*((1-b)*z[k]+b*z[k+1]) + a*((1-b)*z[k+d.nv]+b*z[k+d.nv+1])
	if !finite(w) {
		return 0, false
	}
	return elem.Exp(w), true
}

// startPX returns the temperature T in K and reduced density δ at which
// the quantity of the table q (d.h or d.s) equals x along the isobar p,
// interpolated: bilinearly, so that along an isobar q is piecewise
// linear in u between nodes, and rises with T (cp > 0), found by
// bisection of the nodes. ok is false outside the table or next to a
// node without a state.
func (d *denseTable) startPX(p, x float64, q []float64) (T, delta float64, ok bool) {
	if !(p >= denseTablePMin*d.pc) || !finite(x) {
		return 0, 0, false
	}
	sv := (elem.Log(p/d.pc) - d.v0) * d.vInv
	if !(sv <= float64(d.nv-1)) {
		return 0, 0, false
	}
	j := min(int(sv), d.nv-2)
	b := sv - float64(j)
	at := func(z []float64, i int) float64 {
		k := i*d.nv + j
		return (1-b)*z[k] + b*z[k+1]
	}
	lo, hi := 0, d.nu-1
	if !(at(q, lo) <= x && x <= at(q, hi)) {
		return 0, 0, false
	}
	for hi-lo > 1 {
		m := (lo + hi) / 2
		if at(q, m) <= x {
			lo = m
		} else {
			hi = m
		}
	}
	qa, qb := at(q, lo), at(q, hi)
	a := (x - qa) / (qb - qa)
	w := (1-a)*at(d.lnDelta, lo) + a*at(d.lnDelta, hi)
	if !(a >= 0 && a <= 1) || !finite(w) {
		return 0, 0, false
	}
	T = d.tc * (1 + elem.Exp(d.u0+(float64(lo)+a)/d.uInv))
	return T, elem.Exp(w), true
}

// EstimateAboveTcPH returns an estimate of the temperature T in K and the
// density rho in kg/m³ of f at pressure p in Pa and specific enthalpy h
// in J/kg above the critical temperature, from a table of the equation's
// own states built on first use (a few milliseconds, shared by the copies
// of f): a start for solvers, within a few per cent of the state away
// from the critical point. ok is false outside the table, Tc·(1 + 1e-3)
// ≤ T ≤ TCeil and 0.1·pc ≤ p ≤ PCeil (Tc and pc of Critical()), next to
// a node without a state (the densest corner), and for a fluid without
// the table (not made by the registry). The call allocates nothing after
// the build.
func (f *Fluid) EstimateAboveTcPH(p, h float64) (T, rho float64, ok bool) {
	return f.estimateAboveTc(p, h, false)
}

// EstimateAboveTcPS is EstimateAboveTcPH for the specific entropy s in
// J/(kg·K).
func (f *Fluid) EstimateAboveTcPS(p, s float64) (T, rho float64, ok bool) {
	return f.estimateAboveTc(p, s, true)
}

// estimateAboveTc is EstimateAboveTcPH (x = h) and, with entropy set,
// EstimateAboveTcPS (x = s).
func (f *Fluid) estimateAboveTc(p, x float64, entropy bool) (T, rho float64, ok bool) {
	d := f.denseTable()
	if d == nil {
		return 0, 0, false
	}
	q, off := d.h, f.hOff
	if entropy {
		q, off = d.s, f.sOff
	}
	T, delta, ok := d.startPX(p, x-off, q)
	return T, delta * f.rhoc, ok
}
