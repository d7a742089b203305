package main

import (
	"math"

	"github.com/tripoint-thermo/tripoint/examples/internal/kit"
	"gonum.org/v1/plot"
)

// tsChart draws the T–s chart.
func tsChart(ch *kit.Chart, c config, prog *kit.Progress) *plot.Plot {
	u, b := c.units, c.bounds
	ax := kit.TSAxes(u)
	p := kit.NewPlot(title("T-s", c.fluid), ax.XLabel, ax.YLabel)
	kit.AddGrid(p)
	_, tl, tv := ch.Triple()
	liq, vap := common(p, ch, ax, c, prog, tl.T+0.12*(c.fluid.Critical().T-tl.T))

	// isobars at 1, 2, 5 times the powers of ten, labelled at their hot end
	var labs []kit.Label
	ps := kit.Series125(u.P(b.PMin), u.P(b.PMax))
	if b.PMax/b.PMin > 1e3 { // powers of ten only
		ps = kit.Series125(u.P(b.PMin), u.P(b.PMax))[:0]
		for _, v := range kit.Series125(u.P(b.PMin), u.P(b.PMax)) {
			if m := v / math.Pow(10, math.Floor(math.Log10(v)+1e-9)); math.Abs(m-1) < 1e-9 {
				ps = append(ps, v)
			}
		}
	}
	for i, pv := range ps {
		prog.Step("isobars", i+1, len(ps))
		cv := ch.Isobar(u.PPa(pv), c.dense)
		kit.AddCurve(p, ax, cv, isothermStyle)
		if len(cv.Segs) > 0 {
			last := cv.Segs[len(cv.Segs)-1]
			pt := last[len(last)-1]
			labs = append(labs, kit.Label{X: ax.X(pt), Y: ax.Y(pt), Text: fmtNum(pv, 4) + " " + u.PUnit, Color: kit.IsothermC, Size: 6.5, Align: 1, Rotation: math.Pi / 2})
		}
	}
	kit.AddLabels(p, labs...)

	// isenthalps from the saturated liquid at the triple point to beyond
	// the vapour's maximum enthalpy
	hStep := kit.NiceStep(u.H(tv.H-tl.H), 10)
	hs := kit.Steps(u.H(tl.H), u.H(tv.H)+3*hStep, hStep)
	labs = nil
	for i, hv := range hs {
		prog.Step("isenthalps", i+1, len(hs))
		cv := ch.Isenthalp(hv*1e3, c.dense)
		kit.AddCurve(p, ax, cv, isentropeStyle)
		if len(cv.Segs) > 0 {
			last := cv.Segs[len(cv.Segs)-1]
			pt := last[0]
			labs = append(labs, kit.Label{X: ax.X(pt), Y: ax.Y(pt), Text: "h=" + fmtNum(hv, 4), Color: kit.IsentropeC, Size: 6.5, Align: -1})
		}
	}
	kit.AddLabels(p, labs...)
	isochores(p, ch, ax, c, prog, liq, b.TMin+0.8*(b.TMax-b.TMin))
	finishing(p, ch, ax, c, liq, vap, [2]string{"isobar, " + u.PUnit, "isenthalp, " + u.HUnit}, 0)
	return p
}
