// Command cycle compares single-stage vapour-compression refrigeration
// cycles of CO2 (R744; transcritical, with a gas cooler) and R-134a
// (subcritical, with a condenser) at the same evaporating temperature,
// condenser or gas-cooler outlet temperature, suction superheat,
// subcooling and compressor isentropic efficiency.
//
// For a transcritical cycle it searches the high-side pressure that
// maximises the COP (or takes the one given with -pgc-bar). It prints the
// state points (T, p, h, s, quality), the pressure ratio, the COP beside
// its second-law bound, the volumetric cooling capacity and the discharge
// temperature, and draws both cycles on log p–h charts (PNG and SVG).
//
// The default scenario is a plant of our own: the medium-temperature
// display cases of a small supermarket, evaporating at −8 °C, with the
// gas cooler or condenser on the roof leaving at 35 °C on a summer day.
// Enthalpy and entropy are on the IIR reference state (h = 200 kJ/kg,
// s = 1 kJ/(kg·K) for the saturated liquid at 0 °C) for both fluids.
//
// Usage:
//
//	go run ./examples/cycle
//	go run ./examples/cycle -tevap-C -10 -tout-C 40 -eta 0.65 -out /tmp
//	go run ./examples/cycle -h
package main

import (
	"fmt"
	"io"
	"path/filepath"
	"strings"
	"text/tabwriter"

	"github.com/tripoint-thermo/tripoint/examples/internal/kit"
	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

const synopsis = `cycle compares vapour-compression refrigeration cycles of CO2 (transcritical,
gas cooler; the high-side pressure is searched for the best COP) and R-134a
(subcritical, condenser) at the same conditions, prints their state points
and performance, and draws them on log p-h charts (PNG and SVG).

Default scenario (our own): supermarket display cases evaporating at -8 C,
gas cooler or condenser outlet at 35 C on a summer day.

Usage: cycle [flags]`

func main() { kit.Main("cycle", run) }

// config is the parsed command line.
type config struct {
	in     Inputs
	fluids []*fluid.Fluid
	units  kit.Units
	out    string
	prefix string
	chart  bool
	quiet  bool
}

func parse(args []string, stderr io.Writer) (config, error) {
	fs := kit.NewFlags("cycle", synopsis, stderr)
	tevap := fs.Temperature("tevap", "evaporating temperature", -8).Within(150, 400)
	tout := fs.Temperature("tout", "condenser or gas-cooler outlet temperature", 35).Within(150, 500)
	sh := fs.TemperatureDifference("superheat", "suction superheat", 5).Within(0, 50)
	sc := fs.TemperatureDifference("subcool", "subcooling at the condenser outlet (subcritical cycles)", 3).Within(0, 50)
	eta := fs.Float("eta", 0.7, "compressor isentropic efficiency, 0 < eta <= 1")
	pgc := fs.Pressure("pgc", "fixed high-side (gas-cooler) pressure of the transcritical cycle, replacing the search,", 0).Optional()
	pmax := fs.Pressure("pmax", "highest high-side pressure of the search", 140).Within(1e5, 1e9)
	names := fs.String("fluids", "CO2,R134a", "the fluids to compare, comma-separated")
	units := fs.String("units", "eng", "units of the output: eng (°C, bar, kJ/kg) or si (K, MPa, kJ/kg)")
	out := fs.String("out", ".", "directory for the chart files")
	prefix := fs.String("prefix", "cycle", "file name prefix of the chart: PREFIX.png, PREFIX.svg")
	chart := fs.Bool("chart", true, "draw the cycles on log p-h charts")
	quiet := fs.Bool("quiet", false, "no progress line")
	if err := fs.Parse(args); err != nil {
		return config{}, err
	}
	c := config{out: *out, prefix: *prefix, chart: *chart, quiet: *quiet}
	if !(*eta > 0 && *eta <= 1) {
		return c, fs.Check("eta", "%g: the isentropic efficiency must be in (0, 1]", *eta)
	}
	if tout.Value() <= tevap.Value()+sh.Value() {
		return c, fs.Check("tout-C", "the outlet temperature %s must be above the suction temperature %s (evaporating temperature plus superheat)",
			tout.Format(tout.Value()), tevap.Format(tevap.Value()+sh.Value()))
	}
	if pgc.IsSet() && !(pgc.Value() > 0) {
		return c, fs.Check("pgc-bar", "%s: must be positive", pgc.Format(pgc.Value()))
	}
	var err error
	if c.units, err = kit.UnitsNamed(*units); err != nil {
		return c, fs.Check("units", "%v", err)
	}
	for _, n := range strings.Split(*names, ",") {
		f, err := fluid.Lookup(strings.TrimSpace(n))
		if err != nil {
			return c, fs.Check("fluids", "%v", err)
		}
		if f, err = f.WithReference(fluid.RefIIR); err != nil {
			return c, fs.Check("fluids", "%s: %v", n, err)
		}
		c.fluids = append(c.fluids, f)
	}
	c.in = Inputs{TEvap: tevap.Value(), TOut: tout.Value(), Superheat: sh.Value(), Subcool: sc.Value(), Eta: *eta, PMax: pmax.Value()}
	if pgc.IsSet() {
		c.in.PHigh = pgc.Value()
	}
	return c, nil
}

// run parses the command line, computes and prints the cycles, and
// draws them.
func run(args []string, stdout, stderr io.Writer) error {
	c, err := parse(args, stderr)
	if err != nil {
		return err
	}
	prog := kit.NewProgress(stderr, "cycle", c.quiet)
	var cycles []Cycle
	for _, f := range c.fluids {
		in := c.in
		if in.PHigh > 0 && !Transcritical(f, Inputs{TOut: in.TOut, Subcool: in.Subcool}) {
			in.PHigh = 0 // -pgc-bar applies to the transcritical cycles only
		}
		cy, err := Solve(f, in, prog)
		if err != nil {
			return err
		}
		cycles = append(cycles, cy)
	}
	report(stdout, c, cycles)
	if c.chart {
		files, err := drawCycles(filepath.Join(c.out, c.prefix), c.units, cycles, prog)
		if err != nil {
			return err
		}
		fmt.Fprintf(stdout, "\nCharts: %s\n", strings.Join(files, ", "))
	}
	prog.Done()
	return nil
}

// report prints the inputs, the state points and the performance of each
// cycle, and the cautions.
func report(w io.Writer, c config, cycles []Cycle) {
	u := c.units
	in := c.in
	fmt.Fprintf(w, "Vapour-compression cycles at evaporating %s, outlet %s, superheat %g K, subcooling %g K (subcritical), isentropic efficiency %g\n",
		u.FormatT(in.TEvap), u.FormatT(in.TOut), in.Superheat, in.Subcool, in.Eta)
	fmt.Fprintf(w, "Enthalpy and entropy on the IIR reference state (h = 200 kJ/kg, s = 1 kJ/(kg K), saturated liquid at 0 C).\n")
	for _, cy := range cycles {
		kind := "subcritical, condenser"
		if cy.Transcritical {
			kind = "transcritical, gas cooler"
			if cy.Scan != nil {
				kind += ", high-side pressure of best COP"
			}
		}
		fmt.Fprintf(w, "\n%s (%s)\n", cy.Fluid.Name(), kind)
		tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', tabwriter.AlignRight)
		// tabwriter counts bytes: ASCII unit names keep the columns aligned
		ascii := strings.NewReplacer("°", "", "·", " ")
		fmt.Fprintf(tw, "point\tT [%s]\tp [%s]\th [%s]\ts [%s]\tquality\t\n", ascii.Replace(u.TUnit), u.PUnit, u.HUnit, ascii.Replace(u.SUnit))
		for _, pt := range []struct {
			name string
			st   flash.State
		}{{"1 compressor suction", cy.P1}, {"2s isentropic discharge", cy.P2s}, {"2 compressor discharge", cy.P2}, {outletName(cy), cy.P3}, {"4 evaporator inlet", cy.P4}} {
			fmt.Fprintf(tw, "%s\t%.2f\t%.3f\t%.2f\t%.4f\t%s\t\n", pt.name, u.T(pt.st.T), u.P(pt.st.P), u.H(pt.st.H), u.S(pt.st.S), quality(pt.st))
		}
		tw.Flush()
		tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
		fmt.Fprintf(tw, "  high / low pressure\t%.3f / %.3f %s, ratio %.2f\n", u.P(cy.PHigh), u.P(cy.PLow), u.PUnit, cy.PressureRatio())
		fmt.Fprintf(tw, "  refrigerating effect\t%.2f %s\n", u.H(cy.QEvap), u.HUnit)
		fmt.Fprintf(tw, "  compressor work\t%.2f %s\n", u.H(cy.W), u.HUnit)
		fmt.Fprintf(tw, "  heat rejected\t%.2f %s\n", u.H(cy.QRej), u.HUnit)
		fmt.Fprintf(tw, "  COP\t%.3f  (second-law bound T1/(T3 - T1) = %.2f; %.0f %% of it)\n", cy.COP, cy.Carnot, 100*cy.COP/cy.Carnot)
		fmt.Fprintf(tw, "  volumetric cooling capacity\t%.0f kJ/m3 at suction\n", cy.VCC/1e3)
		fmt.Fprintf(tw, "  discharge temperature\t%s\n", u.FormatT(roundT(cy.P2.T)))
		fmt.Fprintf(tw, "  mass flow per kW of cooling\t%.2f g/s\n", 1e3/cy.QEvap*1e3)
		tw.Flush()
		if len(cy.Scan) > 0 {
			fmt.Fprintf(w, "  COP against high-side pressure:")
			step := max(1, len(cy.Scan)/8)
			for i := 0; i < len(cy.Scan); i += step {
				fmt.Fprintf(w, "  %.0f %s: %.2f", u.P(cy.Scan[i].P), u.PUnit, cy.Scan[i].COP)
			}
			fmt.Fprintln(w)
		}
	}
	if len(cycles) == 2 {
		a, b := cycles[0], cycles[1]
		fmt.Fprintf(w, "\n%s against %s: COP %.2f vs %.2f (%+.0f %%), volumetric capacity %.1f times, pressure ratio %.2f vs %.2f\n",
			a.Fluid.Name(), b.Fluid.Name(), a.COP, b.COP, 100*(a.COP/b.COP-1), a.VCC/b.VCC, a.PressureRatio(), b.PressureRatio())
	}
	fmt.Fprintf(w, "\nCaution: an ideal single-stage cycle (no pressure drops or heat losses) for comparison, not a design.\n"+
		"CO2 plants run at high pressures (the high side here up to %.0f bar, standstill pressures can exceed it):\n"+
		"rate and protect the equipment accordingly; released CO2 can asphyxiate in low or enclosed spaces and\n"+
		"causes cold burns. Follow the codes and standards that apply and licensed engineering practice.\n", u.P(maxHigh(cycles)))
}

func maxHigh(cs []Cycle) float64 {
	m := 0.0
	for _, c := range cs {
		m = max(m, c.PHigh)
	}
	return m
}

func roundT(T float64) float64 { return float64(int64(T*100+0.5)) / 100 }

func outletName(c Cycle) string {
	if c.Transcritical {
		return "3 gas-cooler outlet"
	}
	return "3 condenser outlet"
}

// quality describes the phase of a state: its vapour fraction in the
// two-phase region, else the phase.
func quality(s flash.State) string {
	switch s.Phase {
	case flash.TwoPhase:
		return fmt.Sprintf("%.4f", s.Quality)
	case flash.Vapor:
		if s.Flags&flash.Saturated != 0 {
			return "1 (saturated)"
		}
		return "vapour"
	case flash.Liquid:
		if s.Flags&flash.Saturated != 0 {
			return "0 (saturated)"
		}
		return "liquid"
	case flash.Supercritical:
		return "supercritical"
	}
	return s.Phase.String()
}
