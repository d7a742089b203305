// Command vent empties a closed vessel of carbon dioxide through an
// orifice to the atmosphere and follows its contents down to the triple
// point and into the solid–vapour region, where dry ice forms in the
// vessel and in the jet.
//
// The contents evolve at fixed volume: each evaluation is a DU flash at
// the current mass and internal energy; the vessel is adiabatic or
// exchanges heat with the ambient through a wall heat-transfer
// coefficient. The outflow is the homogeneous-equilibrium isentropic
// nozzle with choking: the critical mass flux is the maximum of
// ρ·√(2(h0 − h)) along the isentrope from the drawn phase (PS flashes,
// into the solid–vapour region where the isentrope goes there). The jet
// after its expansion to ambient pressure is a PH flash at the stagnation
// enthalpy; its solid fraction is the dry ice (snow) it carries. The
// outflow is drawn from the top (vapour) or through a dip tube (liquid).
//
// The integration is an embedded Runge–Kutta pair (Bogacki–Shampine
// 3(2)) with adaptive steps; every change of the contents' phase — into
// the triple point, out of it into solid–vapour, the dip tube running
// dry — is located by bisection of the step, so the time at the triple
// point (T and p constant while the liquid freezes) is resolved exactly.
// The table is interpolated between the steps to even times.
//
// Assumptions: the contents are one equilibrium mixture (no
// stratification, no superheated liquid); the wall's own heat capacity
// is left out (with -htc-Wm2K the wall is at the ambient temperature);
// the homogeneous-equilibrium nozzle underestimates the flow of liquid
// through short orifices, where the liquid has no time to flash. After a
// dip tube first runs dry it draws vapour; dry ice settles and stays.
//
// The default scenario is our own: a 50 L cylinder holding 20 kg of CO2
// at 20 °C, opened to the atmosphere through a 3 mm orifice. Enthalpy
// and energy are on the IIR reference state.
//
// Usage:
//
//	go run ./examples/vent
//	go run ./examples/vent -draw liquid -orifice-mm 2 -htc-Wm2K 8
//	go run ./examples/vent -h
package main

import (
	"fmt"
	"io"
	"math"
	"path/filepath"
	"strings"
	"text/tabwriter"

	"github.com/tripoint-thermo/tripoint/examples/internal/kit"
	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

const synopsis = `vent empties a closed CO2 vessel through an orifice to the atmosphere: the
contents at fixed volume (a DU flash each step; adiabatic or with wall heat
transfer), the outflow through a homogeneous-equilibrium isentropic nozzle with
choking, the jet expanded to ambient pressure. It follows the contents through
the triple point into the solid-vapour region, prints a time table with the dry
ice in the vessel and in the jet, and plots pressure, temperature, mass and
dry-ice fractions against time (PNG and SVG).

Default scenario (our own): a 50 L cylinder with 20 kg of CO2 at 20 C, opened
through a 3 mm orifice, vapour drawn from the top, adiabatic.

Usage: vent [flags]`

func main() { kit.Main("vent", run) }

// config is the parsed command line.
type config struct {
	v      Vessel
	m0, T0 float64
	set    Settings
	rows   int
	units  kit.Units
	out    string
	prefix string
	plot   bool
	quiet  bool
}

func parse(args []string, stderr io.Writer) (config, error) {
	fs := kit.NewFlags("vent", synopsis, stderr)
	vol := fs.Volume("volume", "internal volume of the vessel", 50).Within(1e-6, 1e3)
	fill := fs.Mass("fill", "mass of CO2 filled", 20).Within(1e-6, 1e6)
	t0 := fs.Temperature("t0", "starting temperature of the contents", 20).Within(217, 1100)
	dia := fs.Length("orifice", "orifice diameter", 3).Within(1e-5, 1)
	cd := fs.Float("cd", 0.8, "discharge coefficient of the orifice, 0 < cd <= 1")
	pamb := fs.Pressure("pamb", "ambient (back) pressure", 1.01325).Within(100, 2e6)
	tamb := fs.Temperature("tamb", "ambient temperature (wall heat transfer)", 20).Within(150, 500)
	htc := fs.HeatTransferCoefficient("htc", "wall heat-transfer coefficient (0: adiabatic)", 0).Within(0, 1e4)
	wall := fs.Area("wall", "inner wall area (default: a cylinder four diameters long of the volume)", 0).Optional()
	draw := fs.String("draw", "vapour", "what the orifice draws: vapour (from the top) or liquid (dip tube)")
	tend := fs.Duration("tend", "longest vent time simulated", 7200).Within(1e-3, 1e7)
	pend := fs.Pressure("pend", "vessel pressure at which the run ends (default: ambient + 0.01 bar)", 0).Optional()
	rtol := fs.Float("rtol", 1e-6, "relative tolerance of each integration step")
	rows := fs.Int("rows", 20, "about how many rows of the time table at even times (the events are added)")
	units := fs.String("units", "eng", "units of the output: eng (°C, bar, kJ/kg) or si (K, MPa, kJ/kg)")
	out := fs.String("out", ".", "directory for the plot files")
	prefix := fs.String("prefix", "vent", "file name prefix of the plots: PREFIX.png, PREFIX.svg")
	plotOn := fs.Bool("plot", true, "draw the plots")
	quiet := fs.Bool("quiet", false, "no progress line")
	if err := fs.Parse(args); err != nil {
		return config{}, err
	}
	c := config{out: *out, prefix: *prefix, plot: *plotOn, quiet: *quiet, rows: *rows, m0: fill.Value(), T0: t0.Value()}
	if !(*cd > 0 && *cd <= 1) {
		return c, fs.Check("cd", "%g: the discharge coefficient must be in (0, 1]", *cd)
	}
	if !(*rtol >= 1e-8 && *rtol <= 1e-2) {
		return c, fs.Check("rtol", "%g: the tolerance must be in 1e-8 .. 1e-2 (below 1e-8 the throat search of the nozzle is the limit)", *rtol)
	}
	if *rows < 1 || *rows > 10000 {
		return c, fs.Check("rows", "%d: must be in 1 .. 10000", *rows)
	}
	var d Draw
	switch *draw {
	case "vapour", "vapor":
		d = DrawVapour
	case "liquid":
		d = DrawLiquid
	default:
		return c, fs.Choice("draw", *draw, "vapour", "liquid")
	}
	var err error
	if c.units, err = kit.UnitsNamed(*units); err != nil {
		return c, fs.Check("units", "%v", err)
	}
	f, err := fluid.Lookup("CO2")
	if err == nil {
		f, err = f.WithReference(fluid.RefIIR)
	}
	if err != nil {
		return c, err
	}
	if rho := fill.Value() / vol.Value(); rho > 1100 {
		return c, fs.Check("fill-kg", "%g kg in %g L is %.0f kg/m3: above 1100 kg/m3 the vessel would be overfilled with liquid (a hydraulic hazard, and outside this model)",
			fill.Value(), vol.Value()*1e3, rho)
	}
	area := wall.Value()
	if !wall.IsSet() {
		area = cylinderWall(vol.Value(), 4)
	} else if !(area > 0) {
		return c, fs.Check("wall-m2", "%g: the wall area must be positive", area)
	}
	c.v = Vessel{F: f, Volume: vol.Value(), Orifice: dia.Value(), Cd: *cd, PAmb: pamb.Value(), TAmb: tamb.Value(),
		HTC: htc.Value(), Wall: area, Draw: d}
	pe := pamb.Value() + 1e3
	if pend.IsSet() {
		pe = pend.Value()
		if !(pe > pamb.Value()) {
			return c, fs.Check("pend-bar", "%s: the end pressure must be above the ambient pressure %s",
				pend.Format(pe), pamb.Format(pamb.Value()))
		}
	}
	c.set = Settings{TEnd: tend.Value(), PEnd: pe, RTol: *rtol}
	return c, nil
}

// cylinderWall returns the inner surface in m² of a closed cylinder of
// volume V in m³ whose length is ld diameters.
func cylinderWall(V, ld float64) float64 {
	D := math.Cbrt(4 * V / (math.Pi * ld))
	return math.Pi*D*D/2 + math.Pi*D*ld*D
}

// run parses the command line, vents the vessel, prints the table and
// draws the plots.
func run(args []string, stdout, stderr io.Writer) error {
	c, err := parse(args, stderr)
	if err != nil {
		return err
	}
	prog := kit.NewProgress(stderr, "vent", c.quiet)
	set := c.set
	set.OnStep = func(p Point) {
		prog.Step("venting [simulated s]", int(math.Round(p.Time)), int(math.Round(set.TEnd)))
	}
	r, err := c.v.Integrate(c.m0, c.T0, set)
	if err != nil {
		return err
	}
	res, err := Summarise(&c.v, r)
	if err != nil {
		return err
	}
	rows, err := res.Table(c.rows)
	if err != nil {
		return err
	}
	report(stdout, c, res, rows)
	if c.plot {
		prog.Step("drawing", 1, 1)
		files, err := drawVent(filepath.Join(c.out, c.prefix), c.units, res)
		if err != nil {
			return err
		}
		fmt.Fprintf(stdout, "\nPlots: %s\n", strings.Join(files, ", "))
	}
	cautions(stdout, c, res)
	prog.Done()
	return nil
}

// phaseName names the phase of the contents for the table.
func phaseName(p flash.Phase) string {
	switch p {
	case flash.TwoPhase:
		return "liquid+vapour"
	case flash.SolidVapor:
		return "solid+vapour"
	case flash.SolidLiquid:
		return "solid+liquid"
	case flash.Triple:
		return "triple"
	case flash.Vapor:
		return "vapour"
	}
	return strings.ToLower(p.String())
}

// report prints the scenario, the time table and the summary.
func report(w io.Writer, c config, res *Result, rows []Row) {
	u := c.units
	v := c.v
	p0 := res.Run.Points[0]
	fmt.Fprintf(w, "CO2 vent: %.4g L vessel, %.4g kg at %s (%.1f kg/m3), %.4g mm orifice, Cd %.3g, to %.5g %s\n",
		v.Volume*1e3, c.m0, u.FormatT(c.T0), c.m0/v.Volume, v.Orifice*1e3, v.Cd, u.P(v.PAmb), u.PUnit)
	wallText := "adiabatic"
	if v.HTC > 0 {
		wallText = fmt.Sprintf("wall %.3g W/(m2 K) over %.3g m2 to %s", v.HTC, v.Wall, u.FormatT(v.TAmb))
	}
	fmt.Fprintf(w, "Draw-off: %v; %s. Homogeneous-equilibrium isentropic nozzle; jet expanded to ambient at its stagnation enthalpy.\n", v.Draw, wallText)
	fmt.Fprintf(w, "Start: %.5g %s, %s, %s", u.P(p0.St.P), u.PUnit, u.FormatT(p0.St.T), phaseName(p0.St.Phase))
	if lf, ok := liquidVolumeFraction(p0.St); ok {
		fmt.Fprintf(w, ", liquid fills %.0f %% of the volume", 100*lf)
	}
	fmt.Fprintf(w, ".\n")
	if st := p0.St; st.Phase == flash.Liquid || st.Phase == flash.Supercritical && st.Rho > v.F.Critical().Rho {
		fmt.Fprintf(w, "Note: the vessel is full of liquid (no vapour space): its pressure rises steeply with temperature.\n")
	}
	fmt.Fprintln(w)
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', tabwriter.AlignRight)
	fmt.Fprintf(tw, "t [s]\tp [%s]\tT [%s]\tmass [kg]\tphase\tquality\tsolid\tflow [kg/s]\tchoked\tjet dry ice\tevent\t\n", u.PUnit, u.TUnit)
	for _, r := range rows {
		ch := "no"
		if r.P.Flow.Choked {
			ch = "yes"
		}
		fmt.Fprintf(tw, "%.1f\t%.4f\t%.2f\t%.3f\t%s\t%.4f\t%.4f\t%.5f\t%s\t%.4f\t%s\t\n",
			r.P.Time, u.P(r.P.St.P), u.T(r.P.St.T), r.P.M, phaseName(r.P.St.Phase), r.P.St.Quality, r.P.St.Solid,
			r.P.MDot, ch, r.Jet.Solid, r.P.Event)
	}
	tw.Flush()
	fmt.Fprintf(w, "(quality: vapour mass fraction; solid: dry-ice mass fraction of the contents; jet dry ice: solid mass fraction of the jet at ambient pressure)\n")

	last := res.Run.Points[len(res.Run.Points)-1]
	fmt.Fprintf(w, "\nEnd after %.1f s (%s): %.5g %s, %s, %s, %.3f kg left", last.Time, res.Run.Reason,
		u.P(last.St.P), u.PUnit, u.FormatT(last.St.T), phaseName(last.St.Phase), last.M)
	if last.St.Solid > 0 {
		fmt.Fprintf(w, ", of it %.3f kg dry ice", last.M*last.St.Solid)
	}
	fmt.Fprintln(w, ".")
	if res.TripleStart >= 0 {
		fmt.Fprintf(w, "Triple point (%s, %.5g %s) from %.1f s to %.1f s: the liquid froze while vapour left.\n",
			u.FormatT(v.F.Triple().T), u.P(v.F.Triple().P), u.PUnit, res.TripleStart, res.TripleEnd)
	}
	fmt.Fprintf(w, "Vented %.3f kg; peak flow %.4f kg/s; lowest temperature in the vessel %s; dry ice carried out in the jet %.3f kg.\n",
		c.m0-last.M, res.PeakFlow, u.FormatT(res.TMin), res.JetSolidMass)
	fmt.Fprintf(w, "Mass balance: vented %.6g kg against the integral of the flow %.6g kg; energy: change of contents %.6g kJ against the enthalpy outflow minus heat in %.6g kJ.\n",
		c.m0-last.M, res.MassOut, (p0.U-last.U)/1e3, (res.EnthalpyOut-res.HeatIn)/1e3)
	fmt.Fprintf(w, "(%d steps, %d rejected, %d evaluations, %d PS flashes in the nozzle)\n", len(res.Run.Points)-1, res.Run.Reject, res.Run.Evals, res.Run.PS)
}

// liquidVolumeFraction returns the fraction of the volume the liquid
// takes in a liquid–vapour state.
func liquidVolumeFraction(st flash.State) (float64, bool) {
	if st.Phase != flash.TwoPhase {
		return 0, false
	}
	for _, ph := range st.Phases[:st.N] {
		if ph.Phase == flash.Liquid {
			return ph.Fraction * st.Rho / ph.Rho, true
		}
	}
	return 0, false
}

// cautions prints the safety cautions of venting CO2.
func cautions(w io.Writer, c config, res *Result) {
	u := c.units
	fmt.Fprintf(w, `
Caution: a model for understanding and first estimates, not a design or a
relief-sizing method. The homogeneous-equilibrium nozzle assumes the phases
stay in equilibrium; real short orifices pass more liquid than it predicts.
- High pressure: the vessel starts at %.4g %s. Open, vent and handle pressure
  equipment only as its ratings and the applicable codes allow.
- Asphyxiation: up to %.1f kg of CO2 is released here. CO2 is heavier than air and
  collects in pits, cellars and enclosed or low spaces; vent outdoors or
  through a safe discharge line and monitor the atmosphere.
- Cold burns: the jet gets as cold as %s and can carry dry-ice snow; the
  vessel, the vent line and the dry ice left in the vessel get as cold. Wear eye, face
  and hand protection; never touch dry ice with bare skin.
- Dry-ice blockage: solid forms in the vessel, the orifice, vent lines and
  relief devices when the pressure falls below the triple point (%.4g %s);
  a blocked line can hold pressure behind a plug that breaks free later.
  A vessel at ambient pressure may still hold dry ice that re-pressurises
  it when closed and warmed.
Follow local codes and standards and licensed engineering practice.
`, u.P(res.Run.Points[0].St.P), u.PUnit, c.m0, u.FormatT(res.JetTMin), u.P(c.v.F.Triple().P), u.PUnit)
}
