package main

import (
	"fmt"
	"math"

	"github.com/tripoint-thermo/tripoint/examples/internal/kit"
	"github.com/tripoint-thermo/tripoint/flash"
	"gonum.org/v1/plot"
)

// Line styles of the line families.
var (
	isothermStyle  = kit.Line(kit.IsothermC, 0.8)
	isentropeStyle = kit.Line(kit.IsentropeC, 0.7, 5, 2)
	qualityStyle   = kit.Line(kit.QualityC, 0.6, 3, 2)
	isochoreStyle  = kit.Line(kit.IsochoreC, 0.6, 1, 1.5)
	domeStyle      = kit.Line(kit.DomeInk, 1.8)
	boundaryStyle  = kit.Line(kit.TripleC, 0.9)
	tripleStyle    = kit.Line(kit.TripleC, 2.2)
)

// common draws what both charts share below the other lines: the solid
// regions and the quality lines. It returns the dome, drawn last by
// finishing.
func common(p *plot.Plot, ch *kit.Chart, ax kit.Axes, c config, prog *kit.Progress, qualityAt float64) (liq, vap kit.Curve) {
	n := c.dense
	if ch.HasSolid() {
		prog.Step("solid regions", 1, 2)
		kit.AddRegion(p, ax, ch.SolidVapour(n), kit.SolidVapC, boundaryStyle)
		prog.Step("solid regions", 2, 2)
		kit.AddRegion(p, ax, ch.SolidLiquid(n), kit.SolidLiqC, boundaryStyle)
	}
	prog.Step("saturation dome", 1, 1)
	liq, vap = ch.Dome(n)
	qs := []float64{0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9}
	var labs []kit.Label
	for i, q := range qs {
		prog.Step("quality lines", i+1, len(qs))
		cv := ch.Quality(q, n/2)
		kit.AddCurve(p, ax, cv, qualityStyle)
		// label where the line crosses the temperature qualityAt
		if pt, ok := firstWhere(cv, func(x kit.Pt) bool { return x.T >= qualityAt }); ok {
			labs = append(labs, kit.Label{X: ax.X(pt), Y: ax.Y(pt), Text: fmt.Sprintf("x=%.1f", q), Color: kit.QualityC, Size: 7, Rotation: math.Pi / 2})
		}
	}
	kit.AddLabels(p, labs...)
	return liq, vap
}

// densities returns the isochores of a chart: 1, 2 and 5 times the powers
// of ten between the lightest vapour and the densest liquid of the chart,
// or only the powers of ten where that spans more than three decades.
func densities(c config, liq kit.Curve) []float64 {
	rhoMax := 0.0
	for _, s := range liq.Segs {
		for _, pt := range s {
			rhoMax = math.Max(rhoMax, pt.Rho)
		}
	}
	b := c.bounds
	rhoMin := 2 * b.PMin / (c.fluid.GasConstant() * b.TMax)
	rhos := kit.Series125(rhoMin, rhoMax)
	if rhoMax/rhoMin > 1e3 {
		var dec []float64
		for _, r := range rhos {
			if m := r / math.Pow(10, math.Floor(math.Log10(r)+1e-9)); math.Abs(m-1) < 1e-9 {
				dec = append(dec, r)
			}
		}
		rhos = dec
	}
	return rhos
}

// isochores draws the isochores, labelled where they reach the temperature
// labelAt (or at their hot end).
func isochores(p *plot.Plot, ch *kit.Chart, ax kit.Axes, c config, prog *kit.Progress, liq kit.Curve, labelAt float64) {
	rhos := densities(c, liq)
	var labs []kit.Label
	for i, rho := range rhos {
		prog.Step("isochores", i+1, len(rhos))
		at := labelAt
		if i%2 == 1 {
			at = labelAt - 0.06*(c.bounds.TMax-c.bounds.TMin)
		}
		cv := ch.Isochore(rho, c.dense)
		kit.AddCurve(p, ax, cv, isochoreStyle)
		if len(cv.Segs) == 0 {
			continue
		}
		last := cv.Segs[len(cv.Segs)-1]
		pt := last[len(last)-1]
		if q, ok := firstWhere(cv, func(x kit.Pt) bool { return x.T >= at }); ok {
			pt = q
		}
		labs = append(labs, kit.Label{X: ax.X(pt), Y: ax.Y(pt), Text: fmtNum(rho, 3) + " kg/m³", Color: kit.IsochoreC, Size: 6.5, Align: -1})
	}
	kit.AddLabels(p, labs...)
}

// finishing draws the dome over the other lines, the critical point, the
// triple line, the names of the regions, the legend, and widens the x
// axis by a strip on the right that holds the legend.
func finishing(p *plot.Plot, ch *kit.Chart, ax kit.Axes, c config, liq, vap kit.Curve, family [2]string, rotSL float64) {
	kit.AddCurve(p, ax, liq, domeStyle)
	kit.AddCurve(p, ax, vap, domeStyle)
	u, b := c.units, c.bounds
	f := c.fluid
	cp, cpErr := ch.Critical()
	if cpErr == nil {
		kit.AddPath(p, ax, []kit.Pt{cp}, kit.Line(kit.DomeInk, 1), 3)
		kit.AddLabels(p, kit.Label{X: ax.X(cp), Y: ax.Y(cp), Text: "   critical point", Color: kit.DomeInk, Size: 8, Align: -1, Bold: true})
	}
	s, l, v := ch.Triple()
	var labs []kit.Label
	name := func(pt kit.Pt, txt string, align int, rot float64) {
		labs = append(labs, kit.Label{X: ax.X(pt), Y: ax.Y(pt), Text: txt, Color: kit.Ink, Size: 10, Bold: true, Align: align, Rotation: rot})
	}
	tt, tc := l.T, f.Critical().T
	if sat, err := f.SaturationAtT(tt + 0.6*(tc-tt)); err == nil {
		name(kit.Pt{T: sat.T, P: sat.P, H: sat.Liquid.H, S: sat.Liquid.S}, "liquid   ", 1, 0)
	}
	if sat, err := f.SaturationAtT(tt + 0.3*(tc-tt)); err == nil {
		name(kit.Pt{T: sat.T, P: sat.P, H: sat.Vapor.H, S: sat.Vapor.S}, "   vapour", -1, 0)
	}
	if st, err := flash.TQ(f, tt+0.45*(tc-tt), 0.5); err == nil {
		name(kit.Pt{T: st.T, P: st.P * 1.08, H: st.H, S: st.S}, "liquid + vapour", 0, 0)
	}
	if ps := 2.5 * f.Critical().P; ps < b.PMax {
		if st, err := flash.PT(f, ps, tc+0.4*(b.TMax-tc)); err == nil {
			name(kit.Pt{T: st.T, P: st.P, H: st.H, S: st.S}, "supercritical", 0, 0)
		}
	}
	if ch.HasSolid() {
		kit.AddPath(p, ax, []kit.Pt{s, l, v}, tripleStyle, 2.5)
		txt := fmt.Sprintf("triple line  %s, %s %s", u.FormatT(s.T), fmtNum(u.P(s.P), 4), u.PUnit)
		// below the line, inside the solid–vapour region
		below := kit.Pt{T: s.T - 0.025*(b.TMax-b.TMin), P: s.P / math.Pow(b.PMax/b.PMin, 0.025), H: 0.5*(l.H+v.H) - 0.1*(v.H-l.H), S: 0.5*(l.S+v.S) - 0.1*(v.S-l.S)}
		labs = append(labs, kit.Label{X: ax.X(below), Y: ax.Y(below), Text: txt, Color: kit.TripleC, Size: 8.5, Bold: true})
		if pt, ok := regionCentre(ch.SolidVapour(c.dense), ax); ok {
			name(pt, "solid + vapour", 0, 0)
		}
		if pt, ok := regionCentre(ch.SolidLiquid(c.dense), ax); ok {
			name(pt, "solid + liquid", 0, rotSL)
		}
		name(s, ch.SolidName()+"   ", 1, 0)
	}
	kit.AddLabels(p, labs...)

	// legend in a strip to the right of the lines
	p.X.Tick.Marker = kit.LinearTicks(10)
	xmin, xmax := p.X.Min, p.X.Max
	p.X.Min, p.X.Max = xmin-0.05*(xmax-xmin), xmax+0.25*(xmax-xmin)
	key := kit.Key{Entries: []kit.KeyEntry{
		{Text: "saturation dome", Line: domeStyle},
		{Text: family[0], Line: isothermStyle},
		{Text: family[1], Line: isentropeStyle},
		{Text: "vapour fraction x", Line: qualityStyle},
		{Text: "isochore, kg/m³", Line: isochoreStyle},
	}}
	if ch.HasSolid() {
		key.Entries = append(key.Entries,
			kit.KeyEntry{Text: "triple line", Line: tripleStyle},
			kit.KeyEntry{Text: "solid + vapour", Fill: kit.SolidVapC, Line: boundaryStyle},
			kit.KeyEntry{Text: "solid + liquid", Fill: kit.SolidLiqC, Line: boundaryStyle})
	}
	p.Add(key)
	if ax.LogY {
		kit.LogPressure(p, u.P(b.PMin), u.P(b.PMax))
	} else {
		p.Y.Min, p.Y.Max = u.T(b.TMin), u.T(b.TMax)
		p.Y.Tick.Marker = kit.LinearTicks(10)
	}
}

// firstWhere returns the first point of c for which ok holds.
func firstWhere(c kit.Curve, ok func(kit.Pt) bool) (kit.Pt, bool) {
	for _, s := range c.Segs {
		for _, q := range s {
			if ok(q) {
				return q, true
			}
		}
	}
	return kit.Pt{}, false
}

// regionCentre returns the point of a region (solid branch, then fluid
// branch reversed) halfway across it at the middle of its height on the
// chart: the place for its name.
func regionCentre(r kit.Region, ax kit.Axes) (kit.Pt, bool) {
	n := len(r) / 2
	if n < 2 || len(r) != 2*n {
		return kit.Pt{}, false
	}
	y := func(p kit.Pt) float64 {
		if ax.LogY {
			return math.Log(ax.Y(p))
		}
		return ax.Y(p)
	}
	lo, hi := y(r[0]), y(r[n-1])
	mid := 0.5 * (lo + hi)
	k := 0
	for i := 0; i < n; i++ {
		if math.Abs(y(r[i])-mid) < math.Abs(y(r[k])-mid) {
			k = i
		}
	}
	a, b := r[k], r[2*n-1-k]
	return kit.Pt{T: a.T, P: a.P, H: 0.5 * (a.H + b.H), S: 0.5 * (a.S + b.S)}, true
}
