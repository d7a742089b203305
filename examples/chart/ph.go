package main

import (
	"math"

	"github.com/tripoint-thermo/tripoint/examples/internal/kit"
	"gonum.org/v1/plot"
)

// phChart draws the log p–h chart.
func phChart(ch *kit.Chart, c config, prog *kit.Progress) *plot.Plot {
	u, b := c.units, c.bounds
	ax := kit.PHAxes(u)
	p := kit.NewPlot(title("log p-h", c.fluid), ax.XLabel, ax.YLabel)
	kit.AddGrid(p)
	_, tl, tv := ch.Triple()
	liq, vap := common(p, ch, ax, c, prog, tl.T+0.12*(c.fluid.Critical().T-tl.T))

	// isotherms, labelled near the bottom of the chart
	tlo, thi := u.T(b.TMin), u.T(b.TMax)
	step := kit.NiceStep(thi-tlo, 20)
	temps := kit.Steps(tlo, thi, step)
	pLab := b.PMin * math.Pow(b.PMax/b.PMin, 0.035)
	var labs []kit.Label
	for i, tv := range temps {
		prog.Step("isotherms", i+1, len(temps))
		cv := ch.Isotherm(u.TK(tv), c.dense)
		kit.AddCurve(p, ax, cv, isothermStyle)
		if pt, ok := firstWhere(cv, func(q kit.Pt) bool { return q.P >= pLab }); ok {
			labs = append(labs, kit.Label{X: ax.X(pt), Y: ax.Y(pt), Text: fmtNum(tv, 4) + " " + u.TUnit, Color: kit.IsothermC, Size: 7, Rotation: math.Pi / 2, Align: -1})
		}
	}
	kit.AddLabels(p, labs...)

	// isentropes from the saturated liquid at the triple point to beyond
	// the saturated vapour there, labelled at their top
	sStep := kit.NiceStep(u.S(tv.S-tl.S), 10)
	ents := kit.Steps(u.S(tl.S), u.S(tv.S)+4*sStep, sStep)
	labs = nil
	for i, sv := range ents {
		prog.Step("isentropes", i+1, len(ents))
		cv := ch.Isentrope(sv*1e3, c.dense)
		kit.AddCurve(p, ax, cv, isentropeStyle)
		if len(cv.Segs) > 0 {
			last := cv.Segs[len(cv.Segs)-1]
			pt := last[len(last)-1]
			labs = append(labs, kit.Label{X: ax.X(pt), Y: ax.Y(pt), Text: "s=" + fmtNum(sv, 4), Color: kit.IsentropeC, Size: 6.5, Align: -1, Rotation: math.Pi / 4})
		}
	}
	kit.AddLabels(p, labs...)
	isochores(p, ch, ax, c, prog, liq, b.TMax)
	finishing(p, ch, ax, c, liq, vap, [2]string{"isotherm, " + u.TUnit, "isentrope, " + u.SUnit}, math.Pi/2)
	return p
}
