package kit

import (
	"image/color"
	"math"
	"strconv"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// The palette of tripoint's charts: muted earth colours on a warm paper
// background, one hue per family of lines.
var (
	Paper      = color.RGBA{0xfb, 0xf8, 0xf1, 0xff} // background
	Ink        = color.RGBA{0x2b, 0x2b, 0x33, 0xff} // text, axes
	GridInk    = color.RGBA{0xe4, 0xdf, 0xd3, 0xff}
	DomeInk    = color.RGBA{0x1d, 0x35, 0x57, 0xff} // saturation dome, navy
	IsothermC  = color.RGBA{0xc0, 0x50, 0x2d, 0xff} // isotherms and isobars, brick
	IsentropeC = color.RGBA{0x2a, 0x7f, 0x73, 0xff} // isentropes and isenthalps, teal
	QualityC   = color.RGBA{0x7a, 0x6c, 0xa8, 0xff} // quality lines, heather
	IsochoreC  = color.RGBA{0x8a, 0x9a, 0x3c, 0xff} // isochores, olive
	SolidVapC  = color.RGBA{0xd6, 0xe8, 0xf5, 0xff} // solid + vapour region fill
	SolidLiqC  = color.RGBA{0xe9, 0xe1, 0xf2, 0xff} // solid + liquid region fill
	TripleC    = color.RGBA{0xa8, 0x1c, 0x5a, 0xff} // triple line, plum
	CycleA     = color.RGBA{0xd6, 0x28, 0x28, 0xff} // first cycle
	CycleB     = color.RGBA{0x1f, 0x6f, 0xb4, 0xff} // second cycle
)

// Sans is the typeface of the charts.
var Sans = font.Font{Typeface: "Liberation", Variant: "Sans"}

// SansBold is its bold face, for titles.
var SansBold = font.Font{Typeface: "Liberation", Variant: "Sans", Weight: 3} // x/image/font.WeightBold

// NewPlot returns an empty plot in tripoint's style.
func NewPlot(title, xLabel, yLabel string) *plot.Plot {
	p := plot.New()
	p.BackgroundColor = Paper
	p.Title.Text = title
	p.Title.TextStyle.Font = font.From(SansBold, 13)
	p.Title.TextStyle.Color = Ink
	p.Title.Padding = vg.Points(8)
	for _, ax := range []*plot.Axis{&p.X, &p.Y} {
		ax.Label.TextStyle.Font = font.From(Sans, 11)
		ax.Label.TextStyle.Color = Ink
		ax.Tick.Label.Font = font.From(Sans, 9)
		ax.Tick.Label.Color = Ink
		ax.LineStyle.Color = Ink
		ax.Tick.LineStyle.Color = Ink
		ax.Padding = 0
	}
	p.X.Label.Text = xLabel
	p.Y.Label.Text = yLabel
	p.Legend.TextStyle.Font = font.From(Sans, 9)
	p.Legend.TextStyle.Color = Ink
	return p
}

// Line returns a line style of width w points in colour c, dashed with
// the given dash and gap lengths in points (none: solid).
func Line(c color.Color, w float64, dashes ...float64) draw.LineStyle {
	ls := draw.LineStyle{Color: c, Width: vg.Points(w)}
	for _, d := range dashes {
		ls.Dashes = append(ls.Dashes, vg.Points(d))
	}
	return ls
}

// LogPressure sets the y axis of p to a logarithmic scale from lo to hi,
// with ticks at 1, 2 and 5 times the powers of ten.
func LogPressure(p *plot.Plot, lo, hi float64) {
	p.Y.Scale = plot.LogScale{}
	p.Y.Tick.Marker = plot.TickerFunc(logTicks)
	p.Y.Min, p.Y.Max = lo, hi
}

// logTicks labels 1, 2 and 5 times each power of ten and marks the other
// integers as minor ticks; over many decades only the powers of ten are
// labelled.
func logTicks(lo, hi float64) []plot.Tick {
	if !(lo > 0) || !(hi > lo) {
		return nil
	}
	var ticks []plot.Tick
	d0, d1 := int(math.Floor(math.Log10(lo))), int(math.Ceil(math.Log10(hi)))
	many := d1-d0 > 6
	for d := d0; d <= d1; d++ {
		base := math.Pow(10, float64(d))
		for m := 1; m <= 9; m++ {
			v := float64(m) * base
			if v < lo*(1-1e-9) || v > hi*(1+1e-9) {
				continue
			}
			label := ""
			if m == 1 || (!many && (m == 2 || m == 5)) {
				label = strconv.FormatFloat(v, 'g', -1, 64)
			}
			ticks = append(ticks, plot.Tick{Value: v, Label: label})
		}
	}
	return ticks
}

// LinearTicks returns a ticker with about n labelled ticks at multiples
// of 1, 2, 2.5 or 5 times a power of ten, and unlabelled minor ticks
// between them.
func LinearTicks(n int) plot.Ticker {
	return plot.TickerFunc(func(lo, hi float64) []plot.Tick {
		if !(hi > lo) {
			return nil
		}
		step := NiceStep(hi-lo, n)
		minor := step / 5
		if m := step / math.Pow(10, math.Floor(math.Log10(step))); m == 2.5 {
			minor = step / 5
		}
		var ticks []plot.Tick
		for _, v := range Steps(lo, hi, minor) {
			t := plot.Tick{Value: v}
			if k := v / step; math.Abs(k-math.Round(k)) < 1e-6 {
				if math.Abs(v) < 1e-9*step {
					v = 0
				}
				t.Label = strconv.FormatFloat(v, 'f', -1, 64)
			}
			ticks = append(ticks, t)
		}
		return ticks
	})
}

// KeyEntry is one entry of a Key: a line sample or a filled box, and
// its text.
type KeyEntry struct {
	Text string
	Line draw.LineStyle // drawn if Width > 0
	Fill color.Color    // a filled box, if not nil
}

// Key is a plotter that draws a key of the chart's lines in a corner of
// the data area (the top right one unless Left or Bottom is set), on a
// box of the paper colour.
type Key struct {
	Entries      []KeyEntry
	Left, Bottom bool // the corner: left instead of right, bottom instead of top
}

// Size returns the width and height of the key's box.
func (k Key) Size() (w, h vg.Length) {
	sty := text.Style{Font: font.From(Sans, 9), Handler: plot.DefaultTextHandler}
	pad, thumb, row := vg.Points(6), vg.Points(26), vg.Points(13)
	var tw vg.Length
	for _, e := range k.Entries {
		tw = max(tw, sty.Width(e.Text))
	}
	return pad + thumb + pad + tw + pad, pad + row*vg.Length(len(k.Entries)) + pad
}

// Plot implements plot.Plotter.
func (k Key) Plot(c draw.Canvas, _ *plot.Plot) {
	if len(k.Entries) == 0 {
		return
	}
	sty := text.Style{Color: Ink, Font: font.From(Sans, 9), XAlign: text.XLeft, YAlign: text.YCenter, Handler: plot.DefaultTextHandler}
	pad, thumb, row := vg.Points(6), vg.Points(26), vg.Points(13)
	bw, bh := k.Size()
	r := vg.Rectangle{Min: vg.Point{X: c.Max.X - pad - bw, Y: c.Max.Y - pad - bh}, Max: vg.Point{X: c.Max.X - pad, Y: c.Max.Y - pad}}
	if k.Left {
		r.Min.X, r.Max.X = c.Min.X+pad, c.Min.X+pad+bw
	}
	if k.Bottom {
		r.Min.Y, r.Max.Y = c.Min.Y+pad, c.Min.Y+pad+bh
	}
	c.SetColor(Paper)
	c.Fill(r.Path())
	c.SetLineStyle(Line(GridInk, 1))
	c.Stroke(r.Path())
	y := r.Max.Y - pad - row/2
	for _, e := range k.Entries {
		x0 := r.Min.X + pad
		if e.Fill != nil {
			b := vg.Rectangle{Min: vg.Point{X: x0, Y: y - row/3}, Max: vg.Point{X: x0 + thumb, Y: y + row/3}}
			c.SetColor(e.Fill)
			c.Fill(b.Path())
			if e.Line.Width > 0 {
				c.SetLineStyle(e.Line)
				c.Stroke(b.Path())
			}
		} else if e.Line.Width > 0 {
			c.StrokeLine2(e.Line, x0, y, x0+thumb, y)
		}
		c.FillText(sty, vg.Point{X: x0 + thumb + pad, Y: y}, e.Text)
		y -= row
	}
}
