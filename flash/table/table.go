package table

import (
	"math"
	"strconv"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// Range is the region of (p, T) a Table covers: PMin ≤ p ≤ PMax and
// TMin ≤ T ≤ TMax, and never beyond the fluid phases: the lower bound in
// T is the greater of TMin and the solid model's sublimation or melting
// curve at p (for a fluid without a solid model, TMin is at least its
// triple-point temperature). A zero field takes the fluid's default:
//
//	fluid   PMin               PMax     TMin                    TMax
//	CO2     1 kPa              100 MPa  150 K (the solid curves) 1100 K
//	water   611 Pa             100 MPa  273.16 K                1273 K
//	R134a   389.5638 Pa (its   70 MPa   169.85 K                455 K
//	        vapour pressure
//	        at 169.85 K)
//
// With the defaults CO2 is covered from its vapour at 1 kPa (where dry
// ice sublimes at 151.2 K) along the sublimation curve to the triple
// point and up the melting curve (236.1 K at 100 MPa); water from the
// triple-point temperature; R-134a from its triple point. The range must
// enclose the critical neighbourhood (see CriticalNeighbourhood): PMin
// below 0.9·pc, PMax above 1.1·pc, TMin below the saturation temperature
// at 0.9·pc, TMax above 1.05·Tc.
type Range struct {
	PMin, PMax float64 // Pa
	TMin, TMax float64 // K
}

// defaults returns the default range of f.
func defaults(f *fluid.Fluid) Range {
	lim := f.Limits()
	tp := f.Triple()
	switch f.Name() {
	case "CO2":
		return Range{PMin: 1e3, PMax: 100e6, TMin: lim.TFloor, TMax: 1100}
	case "water":
		return Range{PMin: 611, PMax: 100e6, TMin: tp.T, TMax: 1273}
	}
	// Any other fluid: from its triple point to the end of its equation's
	// published range, at most 100 MPa.
	return Range{PMin: 0, PMax: min(lim.PMax, 100e6), TMin: tp.T, TMax: lim.TMax}
}

// neighbourhood is the critical neighbourhood, where the tables do not
// answer: p1 ≤ p ≤ p2 and t1 ≤ T ≤ t2 for PH and PT; for DU the
// densities between the saturated vapour and liquid at p1 (rho1, rho2)
// below t2.
type neighbourhood struct {
	p1, p2, t1, t2 float64
	rho1, rho2     float64
}

// The critical neighbourhood relative to the critical point: from 0.9·pc
// (t1 is the saturation temperature there) to 1.1·pc, and to 1.05·Tc.
const (
	critP1 = 0.9
	critP2 = 1.1
	critT2 = 1.05
)

// Table answers the PH, PT and DU flashes of one fluid from spline tables
// over a Range: every field of the returned flash.State comes from the
// tables, without an evaluation of the equation of state, where the
// inputs lie in the range, outside the critical neighbourhood and off the
// triple line; elsewhere — also in the solid regions — the equation's
// flash answers (see PH). A *Table is immutable and safe for concurrent
// use; build one with New. See the package documentation for its layout,
// accuracy and cost.
type Table struct {
	f     *fluid.Fluid
	r     Range
	lim   fluid.Limits
	crit  fluid.Point
	nb    neighbourhood
	tt    float64 // triple-point temperature, K
	ptr   float64 // the equation's vapour pressure at tt, Pa
	rgas  float64 // specific gas constant
	solid bool    // the fluid has a solid model

	ph, pt, du tables     // the tables of each flash
	gap        [2]float64 // DU: the densities whose isochores cross the dome twice
	triple     [4]float64 // v′, v″, u′, u″ of the saturated phases at the triple point
	sat        satCurves
	bytes      int
}

// bandKind says what a band between two boundary curves holds.
type bandKind int8

const (
	bandOut      bandKind = iota // not in the tables: the equation answers
	bandPatch                    // a single-phase patch
	bandTwoPhase                 // liquid–vapour states from the saturation curves
)

// band is the part of a slab between two consecutive boundary curves.
type band struct {
	kind  bandKind
	patch *patch
}

// view is a slab as one flash sees it: its boundary curves in the
// flash's second input (h, T or u), ascending, the bands between them,
// and what lies below the first.
type view struct {
	b     []curve
	bands []band
	below bandKind
	// DU, below which lie mixtures: ln p along the first curve (the
	// saturated phase whose density is ρ), where the isochore leaves the
	// dome; empty where the first curve is the mixtures' at p1.
	lnPSat curve
}

// slab is a part of the tables between two values of x (ln p for PH
// and PT, ln ρ for DU): its grid in x and its view.
type slab struct {
	x     grid
	v     view
	first int // the index of its first node in its tables' grid
}

// tables are the slabs of one flash, ascending in x, and one grid of all
// their nodes (a slab's last node is the next one's first) that finds the
// slab and the cell of a point at once.
type tables struct {
	slabs    []slab
	x        grid
	cellSlab []uint8 // the slab of each cell of x
	lo, hi   float64 // the range of the flash's first input (p or ρ)
}

// join sets up the grid of ts from its slabs.
func (ts *tables) join() {
	var xs []float64
	for k := range ts.slabs {
		s := &ts.slabs[k]
		if k == 0 {
			xs = append(xs, s.x.x[0])
		}
		s.first = len(xs) - 1
		xs = append(xs, s.x.x[1:]...)
		for range s.x.x[1:] {
			ts.cellSlab = append(ts.cellSlab, uint8(k))
		}
	}
	ts.x = newGrid(xs)
	ts.lo, ts.hi = math.Exp(xs[0]), math.Exp(xs[len(xs)-1])
}

// locate returns the slab of x, the cell of x in it, the position in the
// cell and its width. x must lie in the grid.
func (ts *tables) locate(x float64) (s *slab, i int, t, w float64) {
	g, t, w := ts.x.cell(x)
	s = &ts.slabs[ts.cellSlab[g]]
	return s, g - s.first, t, w
}

// size returns the bytes of the tables.
func (ts *tables) size() int {
	n := ts.x.size() + len(ts.cellSlab)
	for i := range ts.slabs {
		n += ts.slabs[i].size()
	}
	return n
}

// Fluid returns the fluid of t.
func (t *Table) Fluid() *fluid.Fluid { return t.f }

// Range returns the range t covers, with the defaults filled in.
func (t *Table) Range() Range { return t.r }

// Bytes returns the memory the tables occupy, in bytes: the node data of
// every patch and curve (the Table's own fields, a few hundred bytes,
// aside).
func (t *Table) Bytes() int { return t.bytes }

// CriticalNeighbourhood returns the region where the tables leave the
// state to the equation's flash near the critical point: for PH and PT
// p1 ≤ p ≤ p2 and t1 ≤ T ≤ t2 (Pa, K: p1 = 0.9·pc, p2 = 1.1·pc, t1 the
// saturation temperature at p1, t2 = 1.05·Tc); for DU densities between
// rho1 and rho2 (kg/m³, the saturated vapour and liquid at p1) at
// temperatures below t2, but for the liquid–vapour mixtures below t1.
// Inside it the state is the equation's own.
func (t *Table) CriticalNeighbourhood() (p1, p2, t1, t2, rho1, rho2 float64) {
	n := &t.nb
	return n.p1, n.p2, n.t1, n.t2, n.rho1, n.rho2
}

// DoubleCrossing returns the densities, in kg/m³, whose isochores cross
// the saturation dome twice, which DU leaves to the equation: for water
// the liquid denser than at the triple point (999.79 kg/m³) up to the
// greatest density of its saturated liquid (999.97 kg/m³ near 277 K),
// whose isochores leave the dome above the triple point and enter it
// again near 4 °C. Zero for a fluid without them.
func (t *Table) DoubleCrossing() (lo, hi float64) { return t.gap[0], t.gap[1] }

func fmtG(x float64) string { return strconv.FormatFloat(x, 'g', 10, 64) }

var _ = math.Inf
