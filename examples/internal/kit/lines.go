package kit

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/sublimation"
)

// Pt is a state on a chart line, in SI units: K, Pa, J/kg, J/(kg·K),
// kg/m³.
type Pt struct{ T, P, H, S, Rho float64 }

func fromProps(p fluid.Props) Pt       { return Pt{p.T, p.P, p.H, p.S, p.Rho} }
func fromSolid(p sublimation.Props) Pt { return Pt{p.T, p.P, p.H, p.S, p.Rho} }
func fromState(s flash.State) Pt       { return Pt{s.T, s.P, s.H, s.S, s.Rho} }

// mix is the state of mass fraction x of b and 1 − x of a, at a's T and p.
func mix(a, b Pt, x float64) Pt {
	return Pt{a.T, a.P, a.H + x*(b.H-a.H), a.S + x*(b.S-a.S), 1 / ((1-x)/a.Rho + x/b.Rho)}
}

// Curve is one line of a chart: its points in order, broken into
// segments where a state could not be computed.
type Curve struct {
	Value float64 // the constant of the line, SI (for quality lines, q)
	Segs  [][]Pt
}

// Bounds are the ranges a chart covers, in K and Pa.
type Bounds struct{ TMin, TMax, PMin, PMax float64 }

// Chart computes the lines of the property charts of one fluid. For a
// fluid with a solid model it places the solid regions by that model's
// own Gibbs-equality curves (package sublimation), never by the
// published auxiliary curves, so that no chart line is fluid where the
// solid model is stable; the solid's h and s come from its Props.
type Chart struct {
	F        *fluid.Fluid
	B        Bounds
	solid    sublimation.Solid
	hasSolid bool
	triple   sublimation.ThreePhase // valid if hasSolid
	tt, pt   float64                // triple point, K and Pa
	tc, pc   float64
	meltPMax float64 // end of the melting curve, Pa (0: none)
	subTMin  float64 // lowest sublimation temperature, K
}

// DefaultBounds returns the ranges of a chart of f: from the lowest
// temperature of its models (the vapour floor of the solid's sublimation
// curve, or the triple point) to 1.6 Tc (within the equation's range),
// and from half the lowest coexistence pressure to 10 pc.
func DefaultBounds(f *fluid.Fluid) Bounds {
	tc, pc := f.Critical().T, f.Critical().P
	tp := f.Triple()
	b := Bounds{TMin: tp.T, TMax: math.Min(1.6*tc, f.Limits().TMax), PMin: 0.5 * tp.P, PMax: math.Min(10*pc, f.Limits().PMax)}
	if s, err := sublimation.For(f); err == nil {
		if c, err := s.SublimationCurve(2); err == nil {
			b.TMin, b.PMin = c[0].T, 0.5*c[0].P
		}
	}
	return b
}

// NewChart returns the chart of f over b.
func NewChart(f *fluid.Fluid, b Bounds) (*Chart, error) {
	if f == nil {
		return nil, errors.New("no fluid")
	}
	for _, v := range []float64{b.TMin, b.TMax, b.PMin, b.PMax} {
		if !(v > 0) || math.IsInf(v, 0) {
			return nil, fmt.Errorf("chart bounds must be finite and positive: %+v", b)
		}
	}
	if b.TMax <= b.TMin || b.PMax <= b.PMin {
		return nil, fmt.Errorf("chart bounds: need TMin < TMax and PMin < PMax: %+v", b)
	}
	c := &Chart{F: f, B: b, tc: f.Critical().T, pc: f.Critical().P, tt: f.Triple().T, pt: f.Triple().P}
	if s, err := sublimation.For(f); err == nil {
		tp, err := s.Triple()
		if err != nil {
			return nil, err
		}
		c.solid, c.hasSolid, c.triple = s, true, tp
		c.tt, c.pt = tp.T, tp.P
		sc, err := s.SublimationCurve(2)
		if err != nil {
			return nil, err
		}
		c.subTMin = sc[0].T
		mc, err := s.MeltingCurve(2)
		if err != nil {
			return nil, err
		}
		c.meltPMax = mc[1].P
	} else if !errors.Is(err, fluid.ErrUndefined) {
		return nil, err
	}
	return c, nil
}

// HasSolid reports whether the fluid has a solid model.
func (c *Chart) HasSolid() bool { return c.hasSolid }

// SolidName names the solid phase ("dry ice", "ice Ih"); "" without one.
func (c *Chart) SolidName() string {
	if !c.hasSolid {
		return ""
	}
	return c.solid.Name()
}

// Triple returns the triple point's solid, liquid and vapour states
// (solid zero without a solid model).
func (c *Chart) Triple() (solid, liquid, vapour Pt) {
	if c.hasSolid {
		return fromSolid(c.triple.Solid), fromProps(c.triple.Liquid), fromProps(c.triple.Vapor)
	}
	tp := c.F.Triple()
	if s, err := c.F.SaturationAtT(tp.T); err == nil {
		return Pt{}, fromProps(s.Liquid), fromProps(s.Vapor)
	}
	return Pt{}, Pt{}, Pt{}
}

// Critical returns the critical point of the equation (its reducing
// temperature and density). An equation not constrained exactly there
// (R-134a's gives (∂p/∂ρ)_T slightly below zero at its Tc and ρc) returns
// its values with fluid.ErrUnstable; they are used as they are, since the
// point is only marked.
func (c *Chart) Critical() (Pt, error) {
	cp := c.F.Critical()
	p, err := c.F.Props(cp.T, cp.Rho)
	if errors.Is(err, fluid.ErrUnstable) {
		err = nil
	}
	return fromProps(p), err
}

// LogSpace returns n values from lo to hi evenly spaced in ln.
func LogSpace(lo, hi float64, n int) []float64 {
	v := make([]float64, n)
	for i := range v {
		v[i] = lo * math.Pow(hi/lo, float64(i)/float64(n-1))
	}
	v[n-1] = hi
	return v
}

// LinSpace returns n values from lo to hi evenly spaced.
func LinSpace(lo, hi float64, n int) []float64 {
	v := make([]float64, n)
	for i := range v {
		v[i] = lo + (hi-lo)*float64(i)/float64(n-1)
	}
	v[n-1] = hi
	return v
}

// towardCritical returns n temperatures from t0 to Tc, crowded toward Tc
// where the dome closes.
func (c *Chart) towardCritical(t0 float64, n int) []float64 {
	v := make([]float64, n)
	for i := range v {
		u := 1 - float64(i)/float64(n-1)
		v[i] = c.tc - (c.tc-t0)*u*u
	}
	v[0] = t0
	return v
}

// Dome returns the saturated liquid and vapour lines from the triple
// point to the critical point, n points each.
func (c *Chart) Dome(n int) (liquid, vapour Curve) {
	var l, v []Pt
	for _, T := range c.towardCritical(math.Max(c.tt, c.B.TMin), n) {
		s, err := c.F.SaturationAtT(T)
		if err != nil {
			continue
		}
		l = append(l, fromProps(s.Liquid))
		v = append(v, fromProps(s.Vapor))
	}
	return Curve{Value: 0, Segs: [][]Pt{l}}, Curve{Value: 1, Segs: [][]Pt{v}}
}

// Quality returns the line of vapour mass fraction q in the liquid–vapour
// dome, n points from the triple point to the critical point.
func (c *Chart) Quality(q float64, n int) Curve {
	var pts []Pt
	for _, T := range c.towardCritical(math.Max(c.tt, c.B.TMin), n) {
		st, err := flash.TQ(c.F, T, q)
		if err != nil {
			continue
		}
		pts = append(pts, fromState(st))
	}
	return Curve{Value: q, Segs: [][]Pt{pts}}
}

// boundary is a phase boundary crossed by a line at fixed T (in p) or at
// fixed p (in T): the coexisting phases, lo on the side of the lower
// swept value (the less dense phase at fixed T, the one of lower entropy
// at fixed p).
type boundary struct {
	at     float64 // the swept value at the boundary
	lo, hi Pt
	loSol  bool // lo is the solid
	hiSol  bool
}

// boundariesAtT returns the phase boundaries along the isotherm T,
// ordered by pressure.
func (c *Chart) boundariesAtT(T float64) []boundary {
	var b []boundary
	add := func(p float64, a Pt, aSolid bool, d Pt, dSolid bool) {
		if a.Rho > d.Rho { // lo is the less dense phase
			a, d, aSolid, dSolid = d, a, dSolid, aSolid
		}
		b = append(b, boundary{p, a, d, aSolid, dSolid})
	}
	if T >= c.tt && T < c.tc {
		if s, err := c.F.SaturationAtT(T); err == nil {
			add(s.P, fromProps(s.Vapor), false, fromProps(s.Liquid), false)
		}
	}
	if c.hasSolid {
		if T <= c.tt {
			if x, err := c.solid.SublimationPressure(T); err == nil {
				add(x.P, fromProps(x.Fluid), false, fromSolid(x.Solid), true)
			}
		}
		if x, err := c.solid.MeltingPressure(T); err == nil {
			add(x.P, fromProps(x.Fluid), false, fromSolid(x.Solid), true)
		}
	}
	sort.Slice(b, func(i, j int) bool { return b[i].at < b[j].at })
	return b
}

// boundariesAtP returns the phase boundaries along the isobar p, ordered
// by temperature.
func (c *Chart) boundariesAtP(p float64) []boundary {
	var b []boundary
	add := func(T float64, a Pt, aSolid bool, d Pt, dSolid bool) {
		if a.S > d.S { // lo is the phase of lower entropy
			a, d, aSolid, dSolid = d, a, dSolid, aSolid
		}
		b = append(b, boundary{T, a, d, aSolid, dSolid})
	}
	if p >= c.pt && p < c.pc {
		if s, err := c.F.SaturationAtP(p); err == nil {
			add(s.T, fromProps(s.Liquid), false, fromProps(s.Vapor), false)
		}
	}
	if c.hasSolid {
		if p <= c.pt {
			if x, err := c.solid.SublimationTemperature(p); err == nil {
				add(x.T, fromSolid(x.Solid), true, fromProps(x.Fluid), false)
			}
		} else if x, err := c.solid.MeltingTemperature(p); err == nil {
			add(x.T, fromSolid(x.Solid), true, fromProps(x.Fluid), false)
		}
	}
	sort.Slice(b, func(i, j int) bool { return b[i].at < b[j].at })
	return b
}

// sweep builds a line along grid (pressures at fixed T, or temperatures
// at fixed p), crossing the boundaries with their coexisting states; at
// evaluates a single-phase state at a grid value, solid or fluid.
func sweep(grid []float64, bs []boundary, at func(x float64, solid bool) (Pt, error)) [][]Pt {
	var segs [][]Pt
	var cur []Pt
	flush := func() {
		if len(cur) > 1 {
			segs = append(segs, cur)
		}
		cur = nil
	}
	k := 0 // next boundary
	for _, x := range grid {
		for k < len(bs) && bs[k].at <= x {
			if bs[k].at >= grid[0] {
				cur = append(cur, bs[k].lo, bs[k].hi)
			}
			k++
		}
		// the phase of this interval: the high side of the last boundary
		// crossed, or the low side of the next one
		var solid bool
		switch {
		case k > 0:
			solid = bs[k-1].hiSol
		case len(bs) > 0:
			solid = bs[0].loSol
		}
		if k < len(bs) && math.Abs(bs[k].at-x) <= 1e-9*x || k > 0 && math.Abs(bs[k-1].at-x) <= 1e-9*x {
			continue // on the boundary itself: its states are there
		}
		p, err := at(x, solid)
		if err != nil {
			flush()
			continue
		}
		cur = append(cur, p)
	}
	flush()
	return segs
}

// Isotherm returns the isotherm T over the chart's pressures (n points
// and the phase boundaries it crosses).
func (c *Chart) Isotherm(T float64, n int) Curve {
	segs := sweep(LogSpace(c.B.PMin, c.B.PMax, n), c.boundariesAtT(T), func(p float64, solid bool) (Pt, error) {
		if solid {
			s, err := c.solid.Props(T, p)
			return fromSolid(s), err
		}
		st, err := flash.PT(c.F, p, T)
		return fromState(st), err
	})
	return Curve{Value: T, Segs: segs}
}

// Isobar returns the isobar p over the chart's temperatures.
func (c *Chart) Isobar(p float64, n int) Curve {
	segs := sweep(LinSpace(c.B.TMin, c.B.TMax, n), c.boundariesAtP(p), func(T float64, solid bool) (Pt, error) {
		if solid {
			s, err := c.solid.Props(T, p)
			return fromSolid(s), err
		}
		st, err := flash.PT(c.F, p, T)
		return fromState(st), err
	})
	return Curve{Value: p, Segs: segs}
}

// solidBoundaryAtP returns the solid's coexistence with the fluid at
// pressure p: sublimation below the triple point, melting above it.
func (c *Chart) solidBoundaryAtP(p float64) (sublimation.Coexistence, bool) {
	if !c.hasSolid {
		return sublimation.Coexistence{}, false
	}
	var x sublimation.Coexistence
	var err error
	if p <= c.pt {
		x, err = c.solid.SublimationTemperature(p)
	} else {
		x, err = c.solid.MeltingTemperature(p)
	}
	return x, err == nil
}

// atPOf returns the state at pressure p where the property get equals y,
// for get rising with T along the isobar (h, s): a solid–fluid mixture or
// the solid itself where y lies at or below the fluid on the solid's
// coexistence curve, else the fluid from flash.
func (c *Chart) atPOf(p, y float64, get func(Pt) float64, fl func(p, y float64) (flash.State, error), dydT func(sublimation.Props) float64) (Pt, error) {
	if x, ok := c.solidBoundaryAtP(p); ok {
		ys, yf := get(fromSolid(x.Solid)), get(fromProps(x.Fluid))
		if y <= yf {
			if y >= ys {
				return mix(fromSolid(x.Solid), fromProps(x.Fluid), (y-ys)/(yf-ys)), nil
			}
			return c.solidAtPOf(p, y, x.T, get, dydT)
		}
	}
	st, err := fl(p, y)
	if err != nil {
		return Pt{}, err
	}
	if st.Phase >= flash.Solid {
		return Pt{}, errors.New("solid")
	}
	return fromState(st), nil
}

// solidAtPOf solves get(solid(T, p)) = y for T below tHi by Newton's
// method with dy/dT from dydT, bracketed by bisection.
func (c *Chart) solidAtPOf(p, y, tHi float64, get func(Pt) float64, dydT func(sublimation.Props) float64) (Pt, error) {
	lo, hi := c.solid.Limits().TFloor, tHi
	sl, err := c.solid.Props(lo, p)
	if err != nil || get(fromSolid(sl)) > y {
		return Pt{}, errors.New("below the solid model's range")
	}
	T := hi
	for range 100 {
		s, err := c.solid.Props(T, p)
		if err != nil {
			return Pt{}, err
		}
		r := get(fromSolid(s)) - y
		if math.Abs(r) <= 1e-10*math.Max(1, math.Abs(y)) {
			return fromSolid(s), nil
		}
		if r > 0 {
			hi = T
		} else {
			lo = T
		}
		T -= r / dydT(s)
		if !(T > lo && T < hi) {
			T = 0.5 * (lo + hi)
		}
		if hi-lo < 1e-12*T {
			return fromSolid(s), nil
		}
	}
	return Pt{}, errors.New("no convergence")
}

// Isentrope returns the isentrope s over the chart's pressures: fluid
// states from flash.PS, and solid–fluid mixtures and solid states from the
// solid model where the entropy lies below the fluid's on its
// coexistence curve.
func (c *Chart) Isentrope(s float64, n int) Curve {
	return c.isobarsOf(s, n, func(p Pt) float64 { return p.S },
		func(p, s float64) (flash.State, error) { return flash.PS(c.F, p, s) },
		func(sp sublimation.Props) float64 { return sp.Cp / sp.T })
}

// Isenthalp returns the isenthalp h over the chart's pressures, as
// Isentrope.
func (c *Chart) Isenthalp(h float64, n int) Curve {
	return c.isobarsOf(h, n, func(p Pt) float64 { return p.H },
		func(p, h float64) (flash.State, error) { return flash.PH(c.F, p, h) },
		func(sp sublimation.Props) float64 { return sp.Cp })
}

// isobarsOf traces the line where the quantity get equals x over the
// chart's pressures: on each isobar the fluid state from solve (a PS or PH
// flash), else the solid state or solid–fluid mixture, whose x changes
// with T by dxdT; segments break where no state lies within the chart.
func (c *Chart) isobarsOf(x float64, n int, get func(Pt) float64,
	solve func(p, x float64) (flash.State, error), dxdT func(sublimation.Props) float64) Curve {
	var cur []Pt
	var segs [][]Pt
	for _, p := range LogSpace(c.B.PMin, c.B.PMax, n) {
		pt, err := c.atPOf(p, x, get, solve, dxdT)
		if err != nil || pt.T < c.B.TMin || pt.T > c.B.TMax {
			if len(cur) > 1 {
				segs = append(segs, cur)
			}
			cur = nil
			continue
		}
		cur = append(cur, pt)
	}
	if len(cur) > 1 {
		segs = append(segs, cur)
	}
	return Curve{Value: x, Segs: segs}
}

// Isochore returns the isochore ρ over the chart's temperatures: fluid
// states from flash.DT, and solid–fluid mixtures of that overall density
// on the solid's coexistence curves; it ends where the solid alone would
// be needed.
func (c *Chart) Isochore(rho float64, n int) Curve {
	var cur []Pt
	var segs [][]Pt
	end := func() {
		if len(cur) > 1 {
			segs = append(segs, cur)
		}
		cur = nil
	}
	for _, T := range LinSpace(c.B.TMin, c.B.TMax, n) {
		pt, err := c.isochoreAt(rho, T)
		if err != nil || pt.P < c.B.PMin || pt.P > c.B.PMax {
			end()
			continue
		}
		cur = append(cur, pt)
	}
	end()
	return Curve{Value: rho, Segs: segs}
}

func (c *Chart) isochoreAt(rho, T float64) (Pt, error) {
	for _, b := range c.boundariesAtT(T) {
		if !b.loSol && !b.hiSol {
			continue
		}
		if rho >= b.lo.Rho && rho <= b.hi.Rho {
			// volume fraction to mass fraction of hi: 1/ρ = (1−x)/ρlo + x/ρhi
			x := (1/rho - 1/b.lo.Rho) / (1/b.hi.Rho - 1/b.lo.Rho)
			return mix(b.lo, b.hi, x), nil
		}
	}
	st, err := flash.DT(c.F, rho, T)
	if err != nil {
		return Pt{}, err
	}
	if c.solidIsStable(T, st.P) {
		return Pt{}, errors.New("solid")
	}
	return fromState(st), nil
}

// solidIsStable reports whether the solid model is the stable phase at
// (T, p) by the model's own curves.
func (c *Chart) solidIsStable(T, p float64) bool {
	if !c.hasSolid {
		return false
	}
	bs := c.boundariesAtT(T)
	var solid bool
	k := sort.Search(len(bs), func(i int) bool { return bs[i].at > p })
	switch {
	case k > 0:
		solid = bs[k-1].hiSol
	case len(bs) > 0:
		solid = bs[0].loSol
	}
	return solid
}

// Region is a closed area of a chart: a polygon of states.
type Region []Pt

// SolidVapour returns the solid–vapour region: between the solid and the
// vapour on the model's sublimation curve, n points, from the chart's
// lowest temperature to the triple point. Nil without a solid model.
func (c *Chart) SolidVapour(n int) Region {
	if !c.hasSolid {
		return nil
	}
	cs, err := c.solid.SublimationCurve(n)
	if err != nil {
		return nil
	}
	var sol, vap []Pt
	for _, x := range cs {
		if x.T < c.B.TMin*(1-1e-12) {
			continue
		}
		sol = append(sol, fromSolid(x.Solid))
		vap = append(vap, fromProps(x.Fluid))
	}
	return closeRegion(sol, vap)
}

// SolidLiquid returns the solid–liquid region: between the solid and the
// liquid (dense fluid above Tc) on the model's melting curve, from the
// triple point to the chart's highest pressure or the curve's end, n
// points evenly spaced in ln p. Nil without a solid model.
func (c *Chart) SolidLiquid(n int) Region {
	if !c.hasSolid || c.B.PMax <= c.pt {
		return nil
	}
	top := math.Min(c.B.PMax, c.meltPMax)
	var sol, liq []Pt
	for _, p := range LogSpace(c.pt, top, n) {
		x, err := c.solid.MeltingTemperature(p)
		if err != nil || x.T > c.B.TMax || x.T < c.B.TMin {
			continue
		}
		sol = append(sol, fromSolid(x.Solid))
		liq = append(liq, fromProps(x.Fluid))
	}
	return closeRegion(sol, liq)
}

// MeltingEnd returns the end of the solid model's melting curve in Pa (0
// without a solid model).
func (c *Chart) MeltingEnd() float64 { return c.meltPMax }

func closeRegion(a, b []Pt) Region {
	if len(a) < 2 {
		return nil
	}
	r := append(Region(nil), a...)
	for i := len(b) - 1; i >= 0; i-- {
		r = append(r, b[i])
	}
	return r
}
