package kit

import (
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Axes maps a state to the coordinates of a chart.
type Axes struct {
	X, Y           func(Pt) float64
	XLabel, YLabel string
	LogY           bool
}

// PHAxes are the axes of a pressure–enthalpy chart (log p over h).
func PHAxes(u Units) Axes {
	return Axes{
		X:      func(p Pt) float64 { return u.H(p.H) },
		Y:      func(p Pt) float64 { return u.P(p.P) },
		XLabel: "specific enthalpy h [" + u.HUnit + "]",
		YLabel: "pressure p [" + u.PUnit + "]",
		LogY:   true,
	}
}

// TSAxes are the axes of a temperature–entropy chart.
func TSAxes(u Units) Axes {
	return Axes{
		X:      func(p Pt) float64 { return u.S(p.S) },
		Y:      func(p Pt) float64 { return u.T(p.T) },
		XLabel: "specific entropy s [" + u.SUnit + "]",
		YLabel: "temperature T [" + u.TUnit + "]",
	}
}

// XY returns the chart coordinates of pts.
func (a Axes) XY(pts []Pt) plotter.XYs {
	xy := make(plotter.XYs, 0, len(pts))
	for _, p := range pts {
		x, y := a.X(p), a.Y(p)
		if math.IsNaN(x) || math.IsNaN(y) || math.IsInf(x, 0) || math.IsInf(y, 0) || (a.LogY && y <= 0) {
			continue
		}
		xy = append(xy, plotter.XY{X: x, Y: y})
	}
	return xy
}

// AddCurve draws each segment of c on p.
func AddCurve(p *plot.Plot, a Axes, c Curve, ls draw.LineStyle) {
	for _, s := range c.Segs {
		xy := a.XY(s)
		if len(xy) < 2 {
			continue
		}
		l, err := plotter.NewLine(xy)
		if err != nil {
			continue
		}
		l.LineStyle = ls
		p.Add(l)
	}
}

// AddPath draws the polyline through pts on p, with a marker at each
// point if r > 0 (radius in points).
func AddPath(p *plot.Plot, a Axes, pts []Pt, ls draw.LineStyle, r float64) {
	AddCurve(p, a, Curve{Segs: [][]Pt{pts}}, ls)
	if r <= 0 {
		return
	}
	s, err := plotter.NewScatter(a.XY(pts))
	if err != nil {
		return
	}
	s.GlyphStyle = draw.GlyphStyle{Color: ls.Color, Radius: vg.Points(r), Shape: draw.CircleGlyph{}}
	p.Add(s)
}

// AddRegion fills the region r on p with fill and outlines it with edge
// (no outline if edge.Width is 0).
func AddRegion(p *plot.Plot, a Axes, r Region, fill color.Color, edge draw.LineStyle) {
	xy := a.XY(r)
	if len(xy) < 3 {
		return
	}
	poly, err := plotter.NewPolygon(xy)
	if err != nil {
		return
	}
	poly.Color = fill
	poly.LineStyle = edge
	p.Add(poly)
}

// Label is a text on a chart at (X, Y) in chart coordinates.
type Label struct {
	X, Y     float64
	Text     string
	Color    color.Color
	Size     float64 // points
	Rotation float64 // radians
	Bold     bool
	// Align: −1 left, 0 centre, 1 right of (X, Y) horizontally; the text
	// is centred vertically.
	Align int
}

// AddLabels draws the labels on p.
func AddLabels(p *plot.Plot, ls ...Label) {
	if len(ls) == 0 {
		return
	}
	xys := make(plotter.XYs, len(ls))
	txt := make([]string, len(ls))
	for i, l := range ls {
		xys[i] = plotter.XY{X: l.X, Y: l.Y}
		txt[i] = l.Text
	}
	lab, err := plotter.NewLabels(plotter.XYLabels{XYs: xys, Labels: txt})
	if err != nil {
		return
	}
	for i, l := range ls {
		f := Sans
		if l.Bold {
			f = SansBold
		}
		size := l.Size
		if size == 0 {
			size = 8
		}
		xa := text.XCenter
		switch l.Align {
		case -1:
			xa = text.XLeft
		case 1:
			xa = text.XRight
		}
		lab.TextStyle[i] = text.Style{Color: l.Color, Font: font.From(f, vg.Points(size)), Rotation: l.Rotation,
			XAlign: xa, YAlign: text.YCenter, Handler: plot.DefaultTextHandler}
	}
	p.Add(lab)
}

// AddGrid draws a light grid on p.
func AddGrid(p *plot.Plot) {
	g := plotter.NewGrid()
	g.Vertical = Line(GridInk, 0.5)
	g.Horizontal = Line(GridInk, 0.5)
	p.Add(g)
}

// NiceStep returns a step of 1, 2, 2.5 or 5 times a power of ten that
// divides span into about n intervals.
func NiceStep(span float64, n int) float64 {
	if !(span > 0) || n < 1 {
		return 1
	}
	raw := span / float64(n)
	d := math.Pow(10, math.Floor(math.Log10(raw)))
	for _, m := range []float64{1, 2, 2.5, 5, 10} {
		if m*d >= raw {
			return m * d
		}
	}
	return 10 * d
}

// Steps returns the multiples of step in lo..hi.
func Steps(lo, hi, step float64) []float64 {
	var v []float64
	for k := math.Ceil(lo/step - 1e-9); k*step <= hi*(1+1e-12)+1e-12; k++ {
		v = append(v, k*step)
	}
	return v
}

// Series125 returns the values 1, 2 and 5 times the powers of ten in
// lo..hi.
func Series125(lo, hi float64) []float64 {
	var v []float64
	if !(lo > 0) || !(hi > lo) {
		return nil
	}
	for d := math.Floor(math.Log10(lo)); d <= math.Ceil(math.Log10(hi)); d++ {
		for _, m := range []float64{1, 2, 5} {
			x := m * math.Pow(10, d)
			if x >= lo && x <= hi {
				v = append(v, x)
			}
		}
	}
	return v
}
