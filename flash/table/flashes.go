package table

import (
	"math"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// find returns the band of v that holds y at the cell i of its slab's
// axis (basis w), and the boundary values below and above y: k = −1
// below the first curve, k = len(v.bands) above the last.
func (v *view) find(i int, w *[4]float64, y float64) (k int, lo, hi float64) {
	if len(v.b) == 0 {
		return len(v.bands), 0, 0
	}
	lo = v.b[0].at(i, w)
	if !(y >= lo) {
		return -1, lo, lo
	}
	for k = range v.bands {
		hi = v.b[k+1].at(i, w)
		if y <= hi {
			return k, lo, hi
		}
		lo = hi
	}
	return len(v.bands), lo, hi
}

// eta returns the position of y between lo and hi (0 where they meet).
func eta(y, lo, hi float64) float64 {
	if d := hi - lo; d > 0 {
		return (y - lo) / d
	}
	return 0
}

// patchOf returns the patch of band k of v, nil if it is not one.
func (v *view) patchOf(k int) *patch {
	if k < 0 || k >= len(v.bands) {
		return nil
	}
	return v.bands[k].patch
}

// tabulatedP reports whether the tables of PH and PT hold pressure p: in
// the range, and not on the triple line of a fluid with a solid model
// (within 1e-9), where the equation's flash returns its documented
// choices.
func (t *Table) tabulatedP(p float64) bool {
	return p >= t.r.PMin && p <= t.r.PMax && !(t.solid && math.Abs(p-t.ptr) <= 1e-9*t.ptr)
}

// PH returns the state of the table's fluid at pressure p in Pa and
// specific enthalpy h in J/kg, as flash.PH does.
//
// Inside the range (see Range) and outside the critical neighbourhood
// (see CriticalNeighbourhood) every field comes from the tables: in a
// single phase from the bicubic patch of its region, in the two-phase
// region from the saturation curves at p (the phases' properties, the
// quality from h, the mixture's cv and speed of sound as the equation's
// flash defines them). T, ρ and s are within 1e-6 of flash.PH's (see the
// package documentation for the figures). CoversPH tells whether the
// tables answer.
//
// Special cases are (flash.PH's state or error, exactly):
//
//	p outside PMin..PMax, or NaN or ±Inf: flash.PH
//	the critical neighbourhood: flash.PH
//	p within 1e-9 of the triple-point pressure (a fluid with a solid
//	  model), where the equation returns its documented choices: flash.PH
//	h below the lowest fluid state at p (a solid, or below TMin) or above
//	  TMax, or NaN or ±Inf: flash.PH
func (t *Table) PH(p, h float64) (st flash.State, err error) {
	if t.fromPH(p, h, &st) {
		return st, nil
	}
	return flash.PH(t.f, p, h)
}

// CoversPH reports whether PH(p, h) is answered from the tables.
func (t *Table) CoversPH(p, h float64) bool {
	var st flash.State
	return t.fromPH(p, h, &st)
}

// fromPH is PH from the tables; false where they do not answer.
func (t *Table) fromPH(p, h float64, st *flash.State) bool {
	if !t.tabulatedP(p) {
		return false
	}
	x := ln(p)
	s, i, tx, w := t.ph.locate(x)
	wx := basis(tx, w)
	k, lo, hi := s.v.find(i, &wx, h)
	if pa := s.v.patchOf(k); pa != nil {
		var o [maxProps]float64
		pa.eval(i, &wx, eta(h, lo, hi), &o)
		rho := o[1]
		if pa.rhoPerA {
			rho *= p
		}
		t.single(st, o[0], p, rho, h, o[2], h-p/rho, o[3], o[4], o[5])
		return true
	}
	if k < 0 || k >= len(s.v.bands) || s.v.bands[k].kind != bandTwoPhase {
		return false
	}
	var v satVals
	t.sat.at(x, &v)
	hl, hv := v[sHL], v[sHV]
	q := (h - hl) / (hv - hl)
	*st = t.mixture(&v, p, min(max(q, 0), 1))
	return true
}

// PT returns the state of the table's fluid at pressure p in Pa and
// temperature T in K, as flash.PT does, from the tables where CoversPT
// (inside the range, outside the critical neighbourhood; see PH), else
// from flash.PT. The tables place the state against the saturation
// temperature at p; a state within the tables' accuracy of it (about
// 1e-9 K) may come out on the other side than flash.PT places it.
//
// Special cases are those of PH, with T for h: outside TMin (or the
// solid curves) to TMax, flash.PT.
func (t *Table) PT(p, T float64) (st flash.State, err error) {
	if t.fromPT(p, T, &st) {
		return st, nil
	}
	return flash.PT(t.f, p, T)
}

// CoversPT reports whether PT(p, T) is answered from the tables.
func (t *Table) CoversPT(p, T float64) bool {
	var st flash.State
	return t.fromPT(p, T, &st)
}

func (t *Table) fromPT(p, T float64, st *flash.State) bool {
	if !t.tabulatedP(p) {
		return false
	}
	s, i, tx, w := t.pt.locate(ln(p))
	wx := basis(tx, w)
	k, lo, hi := s.v.find(i, &wx, T)
	pa := s.v.patchOf(k)
	if pa == nil {
		return false
	}
	var o [maxProps]float64
	pa.eval(i, &wx, eta(T, lo, hi), &o)
	rho := o[1]
	if pa.rhoPerA {
		rho *= p
	}
	h := o[0]
	t.single(st, T, p, rho, h, o[2], h-p/rho, o[3], o[4], o[5])
	return true
}

// single fills st, a zero State, with a single-phase fluid state, its
// phase named as the equation's flash names it (Supercritical above Tc
// and pc; at or below Tc the liquid above pc or denser than ρc; else
// vapour). It sets the fields one by one: a composite literal would build
// the whole State and copy it.
func (t *Table) single(st *flash.State, T, p, rho, h, s, u, cp, cv, w float64) {
	c := &t.crit
	ph := flash.Vapor
	switch {
	case T > c.T && p > c.P:
		ph = flash.Supercritical
	case T > c.T:
	case p > c.P || rho > c.Rho:
		ph = flash.Liquid
	}
	st.T, st.P, st.Rho, st.H, st.S, st.U, st.Cp, st.Cv, st.W = T, p, rho, h, s, u, cp, cv, w
	st.Phase, st.N, st.Flags = ph, 1, t.extrapolated(T, p)
	if ph == flash.Vapor {
		st.Quality = 1
	}
	f := &st.Phases[0]
	f.Phase, f.Fraction, f.Rho, f.H, f.S, f.U, f.Cp, f.Cv, f.W = ph, 1, rho, h, s, u, cp, cv, w
}

// extrapolated returns the Extrapolated flag of a fluid state at (T, p)
// outside the equation's published range, as fluid.Props sets it.
func (t *Table) extrapolated(T, p float64) fluid.Flags {
	if T < t.lim.TMin || T > t.lim.TMax || p > t.lim.PMax {
		return fluid.Extrapolated
	}
	return 0
}

// DU returns the state of the table's fluid at density rho in kg/m³ and
// specific internal energy u in J/kg, as flash.DU does: from the tables
// where CoversDU, else from flash.DU. In a single phase the state comes
// from the patch of its region (h = u + p/ρ); below the saturated phases
// of its isochore, from the saturation curves, by Newton's method in
// ln p for the mixture of overall density ρ and internal energy u on the
// splines alone.
//
// Special cases are (flash.DU's state or error, exactly):
//
//	rho outside the densities of the range, or NaN, ±Inf or ≤ 0: flash.DU
//	the critical neighbourhood: flash.DU
//	the isochores that cross the saturation dome twice (DoubleCrossing): flash.DU
//	u below the lowest fluid state of the isochore (a solid, or a mixture
//	  below the triple point) or above TMax and PMax, or NaN or ±Inf: flash.DU
//
// Where flash.DU returns a state that is not an equilibrium state (near
// the critical point, at the time of writing, it did for a few inputs: a
// single phase inside the saturation dome, or a mixture whose phases are
// not saturated at its temperature), the tables return the equilibrium
// state; FuzzTables and TestValidation tell such inputs apart.
func (t *Table) DU(rho, u float64) (st flash.State, err error) {
	if t.fromDU(rho, u, &st) {
		return st, nil
	}
	return flash.DU(t.f, rho, u)
}

// CoversDU reports whether DU(rho, u) is answered from the tables.
func (t *Table) CoversDU(rho, u float64) bool {
	var st flash.State
	return t.fromDU(rho, u, &st)
}

func (t *Table) fromDU(rho, u float64, st *flash.State) bool {
	if !(rho >= t.du.lo && rho <= t.du.hi) {
		return false
	}
	s, i, tx, w := t.du.locate(ln(rho))
	wx := basis(tx, w)
	k, lo, hi := s.v.find(i, &wx, u)
	if pa := s.v.patchOf(k); pa != nil {
		var o [maxProps]float64
		pa.eval(i, &wx, eta(u, lo, hi), &o)
		pr := o[1]
		t.single(st, o[0], rho*pr, rho, u+pr, o[2], u, o[3], o[4], o[5])
		return true
	}
	if k >= 0 || s.v.below != bandTwoPhase {
		return false
	}
	// The upper end of the mixtures along the isochore: where it leaves
	// the dome, or p1 (the critical band).
	xs := t.sat.x.x[len(t.sat.x.x)-1]
	if len(s.v.lnPSat) > 0 {
		xs = s.v.lnPSat.at(i, &wx)
	}
	return t.duTwoPhase(rho, u, xs, lo-u, st)
}

// duTwoPhase solves the liquid–vapour mixture of overall density rho and
// internal energy u on the saturation curves: in x = ln p,
//
//	F(x) = u′ + q (u″ − u′) − u = 0,  q = (1/ρ − v′)/(v″ − v′),
//
// which rises with x along the isochore while it is two-phase, between
// the triple point and xs, where the isochore leaves the dome (or p1),
// and F(xs) = fs ≥ 0 is known. A mixture below the triple point's (solid
// in it) is not answered.
//
// Newton's method from the secant of the bracket's ends, bisection where
// a step would leave the bracket (or q leaves [0, 1]); once a step is below
// 1e-8 of x, one more leaves an error of the order of its square.
func (t *Table) duTwoPhase(rho, u, xs, fs float64, st *flash.State) bool {
	s := &t.sat
	v := 1 / rho
	tr := &t.triple
	a, b := s.x.x[0], min(xs, s.x.x[len(s.x.x)-1])
	fa := tr[2] + (tr[3]-tr[2])*(v-tr[0])/(tr[1]-tr[0]) - u
	if !(fa <= 0 && fs >= 0) {
		return false
	}
	x := a
	if fs > fa {
		x = a + (b-a)*(-fa)/(fs-fa)
	}
	for it := 0; it < 100; it++ {
		fx, dx, ok := t.duResidual(x, v, u)
		if !ok || fx > 0 {
			b = x
		} else {
			a = x
		}
		next := x - fx/dx
		if !ok || !(next > a && next < b) {
			next = 0.5 * (a + b)
		}
		step := math.Abs(next - x)
		x = next
		if step <= 1e-8*math.Abs(x) && ok || b-a <= 1e-14*math.Abs(x) {
			if step > 1e-15*math.Abs(x) && ok {
				if fx, dx, ok := t.duResidual(x, v, u); ok {
					x -= fx / dx
				}
			}
			break
		}
	}
	var sv satVals
	s.at(x, &sv)
	p := math.Exp(x)
	vl, vv := 1/sv[sRhoL], math.Exp(-sv[sLnRhoV])
	q := (v - vl) / (vv - vl)
	*st = t.mixture(&sv, p, min(max(q, 0), 1))
	return true
}

// duResidual returns F(x) of duTwoPhase and dF/dx, from the splines of
// ρ′, ln ρ″, h′ and h″ and their slopes, and whether 0 ≤ q ≤ 1.
func (t *Table) duResidual(x, v, u float64) (F, dF float64, ok bool) {
	s := &t.sat
	i, tx, w := s.x.cell(x)
	b := basis(tx, w)
	d := dbasis(tx, w)
	p := math.Exp(x)
	rl, rlx := s.c[sRhoL].at(i, &b), s.c[sRhoL].at(i, &d)
	lv, lvx := s.c[sLnRhoV].at(i, &b), s.c[sLnRhoV].at(i, &d)
	hl, hlx := s.c[sHL].at(i, &b), s.c[sHL].at(i, &d)
	hv, hvx := s.c[sHV].at(i, &b), s.c[sHV].at(i, &d)
	vl, vv := 1/rl, math.Exp(-lv)
	vlx, vvx := -rlx*vl*vl, -lvx*vv
	// u = h − p v, du/dx = dh/dx − p v − p dv/dx.
	ul, uv := hl-p*vl, hv-p*vv
	ulx, uvx := hlx-p*vl-p*vlx, hvx-p*vv-p*vvx
	dv := vv - vl
	q := (v - vl) / dv
	qx := (-vlx*dv - (v-vl)*(vvx-vlx)) / (dv * dv)
	return ul + q*(uv-ul) - u, ulx + qx*(uv-ul) + q*(uvx-ulx), q >= 0 && q <= 1
}
