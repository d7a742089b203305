package main

import (
	"fmt"
	"image/color"
	"math"

	"github.com/tripoint-thermo/tripoint/examples/internal/kit"
	"github.com/tripoint-thermo/tripoint/flash"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
)

// drawCycles draws each cycle on its own log p–h panel, side by side,
// and writes base.png and base.svg.
func drawCycles(base string, u kit.Units, cycles []Cycle, prog *kit.Progress) ([]string, error) {
	var row []*plot.Plot
	colours := []color.Color{kit.CycleA, kit.CycleB}
	for i, cy := range cycles {
		prog.Step("drawing", i+1, len(cycles))
		p, err := cyclePlot(cy, u, colours[i%len(colours)])
		if err != nil {
			return nil, err
		}
		row = append(row, p)
	}
	w := vg.Length(14*len(row)) * vg.Centimeter
	return kit.Save(base, w, 13*vg.Centimeter, row)
}

// cyclePlot draws one cycle over the dome and isotherms of its fluid.
func cyclePlot(cy Cycle, u kit.Units, col color.Color) (*plot.Plot, error) {
	f := cy.Fluid
	lim := f.Limits()
	b := kit.Bounds{
		TMin: math.Max(f.Triple().T, cy.In.TEvap-30),
		TMax: math.Min(lim.TMax, cy.P2.T+30),
		PMin: math.Max(f.Triple().P, cy.PLow/3),
		PMax: math.Min(lim.PMax, cy.PHigh*2),
	}
	ch, err := kit.NewChart(f, b)
	if err != nil {
		return nil, err
	}
	ax := kit.PHAxes(u)
	kind := "subcritical"
	if cy.Transcritical {
		kind = "transcritical"
	}
	p := kit.NewPlot(fmt.Sprintf("%s, %s: COP %.2f", f.Name(), kind, cy.COP), ax.XLabel, ax.YLabel)
	kit.AddGrid(p)
	// isotherms every 10 or 20 K, labelled at the bottom
	step := kit.NiceStep(u.T(b.TMax)-u.T(b.TMin), 8)
	var labs []kit.Label
	pLab := b.PMin * math.Pow(b.PMax/b.PMin, 0.04)
	for _, tv := range kit.Steps(u.T(b.TMin), u.T(b.TMax), step) {
		cv := ch.Isotherm(u.TK(tv), 120)
		kit.AddCurve(p, ax, cv, kit.Line(kit.IsothermC, 0.6, 4, 2))
		for _, s := range cv.Segs {
			for _, q := range s {
				if q.P >= pLab && q.Rho < f.Critical().Rho {
					labs = append(labs, kit.Label{X: ax.X(q), Y: ax.Y(q), Text: fmt.Sprintf("%g %s", tv, u.TUnit), Color: kit.IsothermC, Size: 7, Rotation: math.Pi / 2, Align: -1})
					goto next
				}
			}
		}
	next:
	}
	kit.AddLabels(p, labs...)
	liq, vap := ch.Dome(120)
	kit.AddCurve(p, ax, liq, kit.Line(kit.DomeInk, 1.6))
	kit.AddCurve(p, ax, vap, kit.Line(kit.DomeInk, 1.6))
	if cp, err := ch.Critical(); err == nil && cp.P < b.PMax {
		kit.AddPath(p, ax, []kit.Pt{cp}, kit.Line(kit.DomeInk, 1), 2.5)
	}

	// the cycle: 1→2 compression (drawn straight), 2→3 along the high-side
	// isobar, 3→4 isenthalpic expansion, 4→1 evaporation
	pt := func(s flash.State) kit.Pt { return kit.Pt{T: s.T, P: s.P, H: s.H, S: s.S, Rho: s.Rho} }
	path := []kit.Pt{pt(cy.P1), pt(cy.P2), pt(cy.P3), pt(cy.P4), pt(cy.P1)}
	kit.AddPath(p, ax, path, kit.Line(col, 2.2), 3.2)
	kit.AddPath(p, ax, []kit.Pt{pt(cy.P1), pt(cy.P2s)}, kit.Line(col, 0.8, 2, 2), 0)
	labs = nil
	for i, s := range []flash.State{cy.P1, cy.P2, cy.P3, cy.P4} {
		align, dy := -1, 1.0
		if i == 2 || i == 3 {
			align = 1
		}
		if i == 0 || i == 3 {
			dy = 0.93
		} else {
			dy = 1.07
		}
		q := pt(s)
		q.P *= dy
		labs = append(labs, kit.Label{X: ax.X(q), Y: ax.Y(q), Text: fmt.Sprintf(" %d ", i+1), Color: col, Size: 10, Bold: true, Align: align})
	}
	kit.AddLabels(p, labs...)
	p.X.Tick.Marker = kit.LinearTicks(8)
	kit.LogPressure(p, u.P(b.PMin), u.P(b.PMax))
	return p, nil
}
