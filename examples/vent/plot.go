package main

import (
	"fmt"
	"math"

	"github.com/tripoint-thermo/tripoint/examples/internal/kit"
	"github.com/tripoint-thermo/tripoint/flash"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// series is one line of a time plot.
type series struct {
	name string
	y    func(r Row) float64 // NaN: no point
	ls   draw.LineStyle
}

// Size of each panel of the page, and the margins around its data area
// (axes, labels, title), used to place the keys.
const (
	panelW, panelH = 13 * vg.Centimeter, 9.5 * vg.Centimeter
	marginW        = 2.2 * vg.Centimeter
	marginH        = 2.4 * vg.Centimeter
)

// drawVent draws pressure, temperature, mass and the dry-ice fractions
// against time on a 2×2 page and writes base.png and base.svg.
func drawVent(base string, u kit.Units, res *Result) ([]string, error) {
	rows, err := res.Dense(400)
	if err != nil {
		return nil, err
	}
	tEnd := rows[len(rows)-1].P.Time
	tScale, tUnit := 1.0, "s"
	if tEnd > 1800 {
		tScale, tUnit = 60, "min"
	}
	tt := res.V.F.Triple()
	vesselC, jetC := kit.CycleB, kit.CycleA
	flowing := func(r Row, v float64) float64 {
		if r.P.MDot == 0 {
			return math.NaN()
		}
		return v
	}
	pp := timePlot("Vessel pressure (log scale)", "pressure p ["+u.PUnit+"]", res, rows, tScale, tUnit,
		[]series{{"vessel", func(r Row) float64 { return u.P(r.P.St.P) }, kit.Line(vesselC, 1.8)},
			{"orifice throat (choked)", func(r Row) float64 {
				if !r.P.Flow.Choked {
					return math.NaN()
				}
				return u.P(r.P.Flow.PThroat)
			}, kit.Line(kit.IsentropeC, 1.2, 4, 2)}},
		[]refLine{{u.P(tt.P), "triple point"}, {u.P(res.V.PAmb), "ambient"}}, true)
	tp := timePlot("Temperature", "temperature T ["+u.TUnit+"]", res, rows, tScale, tUnit,
		[]series{{"vessel contents", func(r Row) float64 { return u.T(r.P.St.T) }, kit.Line(vesselC, 1.8)},
			{"jet at ambient pressure", func(r Row) float64 { return flowing(r, u.T(r.Jet.T)) }, kit.Line(jetC, 1.2, 4, 2)}},
		[]refLine{{u.T(tt.T), "triple point"}}, false)
	mp := timePlot("Mass in the vessel", "mass [kg]", res, rows, tScale, tUnit,
		[]series{{"total", func(r Row) float64 { return r.P.M }, kit.Line(vesselC, 1.8)},
			{"liquid", func(r Row) float64 { return r.P.M * phaseFraction(r.P.St, flash.Liquid) }, kit.Line(kit.IsochoreC, 1.4)},
			{"dry ice", func(r Row) float64 { return r.P.M * r.P.St.Solid }, kit.Line(kit.TripleC, 1.4)}},
		nil, false)
	dp := timePlot("Dry-ice (solid) mass fraction", "solid mass fraction", res, rows, tScale, tUnit,
		[]series{{"vessel contents", func(r Row) float64 { return r.P.St.Solid }, kit.Line(vesselC, 1.8)},
			{"jet at ambient pressure", func(r Row) float64 { return flowing(r, r.Jet.Solid) }, kit.Line(jetC, 1.4, 4, 2)}},
		nil, false)
	return kit.Save(base, 2*panelW, 2*panelH, []*plot.Plot{pp, tp}, []*plot.Plot{mp, dp})
}

// phaseFraction returns the mass fraction of the phase ph in st.
func phaseFraction(st flash.State, ph flash.Phase) float64 {
	for _, p := range st.Phases[:st.N] {
		if p.Phase == ph {
			return p.Fraction
		}
	}
	return 0
}

// refLine is a labelled horizontal reference line.
type refLine struct {
	y    float64
	text string
}

// timePlot draws the series against time, shades the time spent at the
// triple point, draws the reference lines and puts the key in a corner
// free of lines.
func timePlot(title, yLabel string, res *Result, rows []Row, tScale float64, tUnit string, ss []series, refs []refLine, logY bool) *plot.Plot {
	p := kit.NewPlot(title, "time ["+tUnit+"]", yLabel)
	kit.AddGrid(p)
	lo, hi := math.Inf(1), math.Inf(-1)
	var key kit.Key
	var lines []plot.Plotter
	var all plotter.XYs
	for _, s := range ss {
		var xy plotter.XYs
		flush := func() {
			if len(xy) > 1 {
				if l, err := plotter.NewLine(xy); err == nil {
					l.LineStyle = s.ls
					lines = append(lines, l)
				}
			}
			xy = nil
		}
		for _, r := range rows {
			y := s.y(r)
			if math.IsNaN(y) || math.IsInf(y, 0) {
				flush()
				continue
			}
			lo, hi = math.Min(lo, y), math.Max(hi, y)
			xy = append(xy, plotter.XY{X: r.P.Time / tScale, Y: y})
		}
		all = append(all, xy...)
		flush()
		key.Entries = append(key.Entries, kit.KeyEntry{Text: s.name, Line: s.ls})
	}
	for _, r := range refs {
		lo, hi = math.Min(lo, r.y), math.Max(hi, r.y)
	}
	if !(hi > lo) {
		lo, hi = lo-0.5, lo+0.5
	}
	tEnd := rows[len(rows)-1].P.Time / tScale
	if res.TripleStart >= 0 {
		key.Entries = append(key.Entries, kit.KeyEntry{Text: "at the triple point", Fill: kit.SolidLiqC})
	}
	if logY {
		// Place the key in decades: the corners are judged on the log scale.
		lo, hi = math.Log10(lo), math.Log10(hi)
		for i := range all {
			all[i].Y = math.Log10(all[i].Y)
		}
	}
	pad := 0.05 * (hi - lo)
	lo, hi = lo-pad, hi+pad
	hi = placeKey(&key, all, tEnd, lo, hi)
	if logY {
		lo, hi = math.Pow(10, lo), math.Pow(10, hi)
	}
	if res.TripleStart >= 0 {
		a, b := res.TripleStart/tScale, res.TripleEnd/tScale
		if poly, err := plotter.NewPolygon(plotter.XYs{{X: a, Y: lo}, {X: b, Y: lo}, {X: b, Y: hi}, {X: a, Y: hi}}); err == nil {
			poly.Color = kit.SolidLiqC
			poly.LineStyle.Width = 0
			p.Add(poly)
		}
	}
	var labs []kit.Label
	for i, r := range refs {
		l, err := plotter.NewLine(plotter.XYs{{X: 0, Y: r.y}, {X: tEnd, Y: r.y}})
		if err != nil {
			continue
		}
		l.LineStyle = kit.Line(kit.TripleC, 0.7, 2, 2)
		p.Add(l)
		// Above the line, or below it for the lower of two close lines
		// (in the plot's own scale).
		sc := func(y float64) float64 { return y }
		inv := sc
		if logY {
			sc, inv = math.Log10, func(y float64) float64 { return math.Pow(10, y) }
		}
		span := sc(hi) - sc(lo)
		dy := 0.035 * span
		for k, o := range refs {
			if k != i && o.y > r.y && sc(o.y)-sc(r.y) < 0.08*span {
				dy = -dy
			}
		}
		// At the right end or the left, whichever keeps farther from
		// the lines (the label spans about a fifth of the width).
		ly := sc(r.y) + dy
		clear := func(x0, x1 float64) float64 {
			d := math.Inf(1)
			for _, q := range all {
				if q.X >= x0 && q.X <= x1 {
					d = math.Min(d, math.Abs(q.Y-ly))
				}
			}
			return d
		}
		lab := kit.Label{X: tEnd * 0.99, Y: inv(ly), Text: fmt.Sprintf("%s %.4g", r.text, r.y), Color: kit.TripleC, Size: 7, Align: 1}
		if clear(0, 0.2*tEnd) > clear(0.8*tEnd, tEnd) {
			lab.X, lab.Align = tEnd*0.01, -1
		}
		labs = append(labs, lab)
	}
	p.Add(lines...)
	kit.AddLabels(p, labs...)
	p.Add(key)
	p.X.Min, p.X.Max = 0, tEnd
	p.Y.Min, p.Y.Max = lo, hi
	p.X.Tick.Marker = kit.LinearTicks(6)
	p.Y.Tick.Marker = kit.LinearTicks(6)
	if logY {
		kit.LogPressure(p, lo, hi)
	}
	return p
}

// placeKey puts the key in the first corner of the data area (top right,
// top left, bottom right, bottom left) that no point of xy falls in, and
// returns the top of the y range: raised to make room above the lines
// when every corner is taken.
func placeKey(key *kit.Key, xy plotter.XYs, xMax, lo, hi float64) float64 {
	w, h := key.Size()
	fw := float64((w + vg.Points(12)) / (panelW - marginW)) // fractions of the data area
	fh := float64((h + vg.Points(12)) / (panelH - marginH))
	free := func(left, bottom bool) bool {
		x0, x1 := xMax*(1-fw), xMax
		if left {
			x0, x1 = 0, xMax*fw
		}
		y0, y1 := hi-(hi-lo)*fh, hi
		if bottom {
			y0, y1 = lo, lo+(hi-lo)*fh
		}
		for _, q := range xy {
			if q.X >= x0 && q.X <= x1 && q.Y >= y0 && q.Y <= y1 {
				return false
			}
		}
		return true
	}
	for _, c := range [][2]bool{{false, false}, {true, false}, {false, true}, {true, true}} {
		if free(c[0], c[1]) {
			key.Left, key.Bottom = c[0], c[1]
			return hi
		}
	}
	key.Left, key.Bottom = false, false
	return lo + (hi-lo)/(1-fh)
}
