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
	y    func(i int) float64
	ls   draw.LineStyle
}

// drawVent draws pressure, temperature, mass and the dry-ice fractions
// against time on a 2×2 page and writes base.png and base.svg.
func drawVent(base string, u kit.Units, res *Result) ([]string, error) {
	pts := res.Run.Points
	tEnd := pts[len(pts)-1].Time
	tScale, tUnit := 1.0, "s"
	if tEnd > 1200 {
		tScale, tUnit = 60, "min"
	}
	tt := res.V.F.Triple()
	vesselC := kit.CycleB
	jetC := kit.CycleA
	pp := timePlot("Vessel pressure", "pressure p ["+u.PUnit+"]", res, tScale, tUnit,
		[]series{{"vessel", func(i int) float64 { return u.P(pts[i].St.P) }, kit.Line(vesselC, 1.8)},
			{"throat (choked flow)", func(i int) float64 {
				if !pts[i].Flow.Choked {
					return math.NaN()
				}
				return u.P(pts[i].Flow.PThroat)
			}, kit.Line(kit.IsentropeC, 1.2, 4, 2)}},
		[]refLine{{u.P(tt.P), "triple point"}, {u.P(res.V.PAmb), "ambient"}})
	tp := timePlot("Temperature", "temperature T ["+u.TUnit+"]", res, tScale, tUnit,
		[]series{{"vessel contents", func(i int) float64 { return u.T(pts[i].St.T) }, kit.Line(vesselC, 1.8)},
			{"jet at ambient pressure", func(i int) float64 {
				if pts[i].MDot == 0 {
					return math.NaN()
				}
				return u.T(res.Jets[i].T)
			}, kit.Line(jetC, 1.2, 4, 2)}},
		[]refLine{{u.T(tt.T), "triple point"}})
	mp := timePlot("Mass in the vessel", "mass [kg]", res, tScale, tUnit,
		[]series{{"total", func(i int) float64 { return pts[i].M }, kit.Line(vesselC, 1.8)},
			{"liquid", func(i int) float64 { return pts[i].M * liquidFraction(pts[i]) }, kit.Line(kit.IsochoreC, 1.4)},
			{"dry ice", func(i int) float64 { return pts[i].M * pts[i].St.Solid }, kit.Line(kit.TripleC, 1.4)}},
		nil)
	dp := timePlot("Dry-ice (solid) mass fraction", "solid mass fraction", res, tScale, tUnit,
		[]series{{"vessel contents", func(i int) float64 { return pts[i].St.Solid }, kit.Line(vesselC, 1.8)},
			{"jet at ambient pressure", func(i int) float64 {
				if pts[i].MDot == 0 {
					return math.NaN()
				}
				return res.Jets[i].Solid
			}, kit.Line(jetC, 1.4, 4, 2)}},
		nil)
	dp.Y.Min = 0
	dp.Y.Max = math.Max(dp.Y.Max, 0.1)
	return kit.Save(base, 26*vg.Centimeter, 19*vg.Centimeter, []*plot.Plot{pp, tp}, []*plot.Plot{mp, dp})
}

// liquidFraction returns the liquid mass fraction of the contents.
func liquidFraction(p Point) float64 {
	for _, ph := range p.St.Phases[:p.St.N] {
		if ph.Phase == flash.Liquid {
			return ph.Fraction
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
// triple point and draws the reference lines.
func timePlot(title, yLabel string, res *Result, tScale float64, tUnit string, ss []series, refs []refLine) *plot.Plot {
	pts := res.Run.Points
	p := kit.NewPlot(title, "time ["+tUnit+"]", yLabel)
	kit.AddGrid(p)
	lo, hi := math.Inf(1), math.Inf(-1)
	var key kit.Key
	var lines []plot.Plotter
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
		for i := range pts {
			y := s.y(i)
			if math.IsNaN(y) || math.IsInf(y, 0) {
				flush()
				continue
			}
			lo, hi = math.Min(lo, y), math.Max(hi, y)
			xy = append(xy, plotter.XY{X: pts[i].Time / tScale, Y: y})
		}
		flush()
		key.Entries = append(key.Entries, kit.KeyEntry{Text: s.name, Line: s.ls})
	}
	for _, r := range refs {
		lo, hi = math.Min(lo, r.y), math.Max(hi, r.y)
	}
	if !(hi > lo) {
		hi, lo = lo+1, lo-1
	}
	pad := 0.06 * (hi - lo)
	lo, hi = lo-pad, hi+pad*2.5 // room for the key
	tEnd := pts[len(pts)-1].Time / tScale
	if res.TripleStart >= 0 {
		a, b := res.TripleStart/tScale, res.TripleEnd/tScale
		if poly, err := plotter.NewPolygon(plotter.XYs{{X: a, Y: lo}, {X: b, Y: lo}, {X: b, Y: hi}, {X: a, Y: hi}}); err == nil {
			poly.Color = kit.SolidLiqC
			poly.LineStyle.Width = 0
			p.Add(poly)
		}
		key.Entries = append(key.Entries, kit.KeyEntry{Text: "at the triple point", Fill: kit.SolidLiqC})
	}
	var labs []kit.Label
	for _, r := range refs {
		l, err := plotter.NewLine(plotter.XYs{{X: 0, Y: r.y}, {X: tEnd, Y: r.y}})
		if err != nil {
			continue
		}
		l.LineStyle = kit.Line(kit.TripleC, 0.7, 2, 2)
		p.Add(l)
		labs = append(labs, kit.Label{X: tEnd * 0.99, Y: r.y + 0.03*(hi-lo), Text: fmt.Sprintf("%s %.4g", r.text, r.y), Color: kit.TripleC, Size: 7, Align: 1})
	}
	p.Add(lines...)
	kit.AddLabels(p, labs...)
	p.Add(key)
	p.X.Min, p.X.Max = 0, tEnd
	p.Y.Min, p.Y.Max = lo, hi
	p.X.Tick.Marker = kit.LinearTicks(6)
	p.Y.Tick.Marker = kit.LinearTicks(6)
	return p
}
