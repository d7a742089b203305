// Command chart draws the pressure–enthalpy (log p–h) and temperature–
// entropy (T–s) charts of any fluid of tripoint, as PNG and SVG.
//
// Each chart shows the saturation dome with the critical point, lines of
// constant quality, and isochores; the p–h chart adds isotherms and
// isentropes, the T–s chart isobars and isenthalps. For a fluid with a
// solid model (CO2: dry ice; water: ice Ih) it also shows the solid, the
// solid–vapour and solid–liquid regions and the triple line, labelled:
// where a throttled or expanded stream of CO2 turns to dry ice. Those
// regions come from the solid model's own Gibbs-equality curves (package
// sublimation) and the solid's own enthalpy and entropy, on the fluid's
// reference state; the fluid lines are cut where that model says the
// solid is stable.
//
// Usage:
//
//	go run ./examples/chart -fluid CO2 -out /tmp
//	go run ./examples/chart -fluid R134a -ref IIR -units eng -pmax-bar 60
//	go run ./examples/chart -h
package main

import (
	"fmt"
	"io"
	"math"
	"path/filepath"
	"strconv"
	"strings"

	"github.com/tripoint-thermo/tripoint/examples/internal/kit"
	"github.com/tripoint-thermo/tripoint/fluid"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
)

const synopsis = `chart draws the log p-h and T-s charts of a fluid as PNG and SVG files:
saturation dome, isotherms or isobars, isentropes or isenthalps, quality
lines and isochores, and for CO2 and water the solid regions (solid-vapour,
solid-liquid) and the triple line from the solid model.

The ranges default to the fluid's: from the solid's lowest temperature (or
the triple point) to 1.6 Tc, and from half the lowest coexistence pressure
to 10 pc, within the range of the equation of state.

Usage: chart [flags]`

func main() { kit.Main("chart", run) }

// config is the parsed command line.
type config struct {
	fluid  *fluid.Fluid
	units  kit.Units
	bounds kit.Bounds
	charts []string
	out    string
	prefix string
	width  vg.Length
	height vg.Length
	dense  int // points per line
}

func parse(args []string, stderr io.Writer) (config, error) {
	fs := kit.NewFlags("chart", synopsis, stderr)
	name := fs.String("fluid", "CO2", "fluid name or alias (one of "+strings.Join(fluid.Names(), ", ")+")")
	ref := fs.String("ref", "default", "enthalpy and entropy reference state: default (the equation's own), IIR, ASHRAE or NBP")
	units := fs.String("units", "eng", "units on the charts: eng (°C, bar, kJ/kg) or si (K, MPa, kJ/kg)")
	which := fs.String("charts", "ph,ts", "which charts, comma-separated: ph, ts")
	out := fs.String("out", ".", "directory for the files")
	prefix := fs.String("prefix", "", "file name prefix (default: the fluid's name); files are PREFIX-ph.png, PREFIX-ph.svg, ...")
	tmin := fs.Temperature("tmin", "lowest temperature of the charts", 0)
	tmax := fs.Temperature("tmax", "highest temperature of the charts", 0)
	pmin := fs.Pressure("pmin", "lowest pressure of the charts", 0)
	pmax := fs.Pressure("pmax", "highest pressure of the charts", 0)
	for _, q := range []*kit.Quantity{tmin, tmax, pmin, pmax} {
		q.Optional()
	}
	wcm := fs.Float("width-cm", 26, "page width of each chart in cm")
	hcm := fs.Float("height-cm", 19, "page height of each chart in cm")
	dense := fs.Int("points", 160, "points per line (more: smoother, slower)")
	if err := fs.Parse(args); err != nil {
		return config{}, err
	}
	c := config{out: *out, dense: *dense}
	f, err := fluid.Lookup(*name)
	if err != nil {
		return c, fs.Check("fluid", "%v", err)
	}
	var r fluid.RefState
	switch strings.ToUpper(*ref) {
	case "DEFAULT":
		r = fluid.RefDefault
	case "IIR":
		r = fluid.RefIIR
	case "ASHRAE":
		r = fluid.RefASHRAE
	case "NBP":
		r = fluid.RefNBP
	default:
		return c, fs.Check("ref", "%q is not one of default, IIR, ASHRAE, NBP", *ref)
	}
	if r != fluid.RefDefault {
		if f, err = f.WithReference(r); err != nil {
			return c, fs.Check("ref", "%v", err)
		}
	}
	c.fluid = f
	if c.units, err = kit.UnitsNamed(*units); err != nil {
		return c, fs.Check("units", "%v", err)
	}
	for _, w := range strings.Split(*which, ",") {
		w = strings.TrimSpace(w)
		if err := fs.Choice("charts", w, "ph", "ts"); err != nil {
			return c, err
		}
		c.charts = append(c.charts, w)
	}
	if !(*wcm >= 8 && *wcm <= 200) || !(*hcm >= 6 && *hcm <= 200) {
		return c, fs.Check("width-cm", "page %g cm x %g cm: want 8..200 cm wide and 6..200 cm high", *wcm, *hcm)
	}
	c.width, c.height = vg.Length(*wcm)*vg.Centimeter, vg.Length(*hcm)*vg.Centimeter
	if *dense < 20 || *dense > 5000 {
		return c, fs.Check("points", "%d: want 20..5000", *dense)
	}
	b := kit.DefaultBounds(f)
	lim := f.Limits()
	if tmin.IsSet() {
		b.TMin = tmin.Value()
	}
	if tmax.IsSet() {
		b.TMax = tmax.Value()
	}
	if pmin.IsSet() {
		b.PMin = pmin.Value()
	}
	if pmax.IsSet() {
		b.PMax = pmax.Value()
	}
	switch {
	case b.TMin <= 0 || b.TMin >= b.TMax:
		return c, fs.Check("tmin-C", "%s: want above 0 K and below the highest temperature %s", tmin.Format(b.TMin), tmin.Format(b.TMax))
	case b.TMax > lim.TCeil:
		return c, fs.Check("tmax-C", "%s: above the highest temperature of %s's equation, %s", tmax.Format(b.TMax), f.Name(), tmax.Format(lim.TCeil))
	case b.PMin <= 0 || b.PMin >= b.PMax:
		return c, fs.Check("pmin-bar", "%s: want above 0 and below the highest pressure %s", pmin.Format(b.PMin), pmin.Format(b.PMax))
	case b.PMax > lim.PCeil:
		return c, fs.Check("pmax-bar", "%s: above the highest pressure of %s's equation, %s", pmax.Format(b.PMax), f.Name(), pmax.Format(lim.PCeil))
	}
	c.bounds = b
	c.prefix = *prefix
	if c.prefix == "" {
		c.prefix = f.Name()
	}
	return c, nil
}

// run parses the command line, draws the charts and prints the files
// written to stdout; progress goes to stderr.
func run(args []string, stdout, stderr io.Writer) error {
	c, err := parse(args, stderr)
	if err != nil {
		return err
	}
	files, err := render(c, kit.NewProgress(stderr, "chart", false))
	for _, f := range files {
		fmt.Fprintln(stdout, f)
	}
	return err
}

// render computes and writes the charts of c, returning the files written.
func render(c config, prog *kit.Progress) ([]string, error) {
	ch, err := kit.NewChart(c.fluid, c.bounds)
	if err != nil {
		return nil, err
	}
	var files []string
	for _, which := range c.charts {
		var p *plot.Plot
		if which == "ph" {
			p = phChart(ch, c, prog)
		} else {
			p = tsChart(ch, c, prog)
		}
		fs, err := kit.Save(filepath.Join(c.out, c.prefix+"-"+which), c.width, c.height, []*plot.Plot{p})
		if err != nil {
			return files, err
		}
		files = append(files, fs...)
	}
	prog.Done()
	return files, nil
}

// title names the chart, its fluid, equation and reference state.
func title(kind string, f *fluid.Fluid) string {
	return fmt.Sprintf("%s chart of %s   (reference state: %s)", kind, f.Name(), refName(f.Reference()))
}

func refName(r fluid.RefState) string {
	if r == fluid.RefDefault {
		return "the equation's own"
	}
	return r.String()
}

// fmtNum formats v with at most prec significant digits, in plain
// decimal notation between 1e-4 and 1e6.
func fmtNum(v float64, prec int) string {
	a := math.Abs(v)
	if v == 0 || a < 1e-4 || a >= 1e6 {
		return strconv.FormatFloat(v, 'g', prec, 64)
	}
	r, _ := strconv.ParseFloat(strconv.FormatFloat(v, 'g', prec, 64), 64)
	return strconv.FormatFloat(r, 'f', -1, 64)
}

// finite reports whether every value is finite.
func finite(v ...float64) bool {
	for _, x := range v {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return false
		}
	}
	return true
}
