package sublimation_test

import (
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/internal/errcheck"
	"github.com/tripoint-thermo/tripoint/sublimation"
)

// TestErrorCatalogue walks a catalogue of bad inputs through the exported
// functions of package sublimation (For, Solid.Props, the four curve
// functions, the curves for charts, the three-phase fractions) and checks
// each error against the design's contract (errcheck.Check).
func TestErrorCatalogue(t *testing.T) {
	t.Parallel()
	in := errcheck.In
	bad := []float64{math.NaN(), math.Inf(1), math.Inf(-1), 0, -1}
	var cs []errcheck.Case
	cs = append(cs, errcheck.Case{Name: "For nil", Op: "sublimation.For", Want: fluid.ErrInvalidInput,
		Call: func() error { _, err := sublimation.For(nil); return err }})
	r134a, err := fluid.Lookup("R134a")
	if err != nil {
		t.Fatal(err)
	}
	cs = append(cs, errcheck.Case{Name: "For R134a", Op: "sublimation.For", Want: fluid.ErrUndefined,
		Mention: "R134a", Call: func() error { _, err := sublimation.For(r134a); return err }})
	for _, name := range []string{"water", "CO2"} {
		f, err := fluid.Lookup(name)
		if err != nil {
			t.Fatal(err)
		}
		s, err := sublimation.For(f)
		if err != nil {
			t.Fatal(err)
		}
		l := s.Limits()
		tp, err := s.Triple()
		if err != nil {
			t.Fatal(err)
		}
		T0, p0 := tp.T-10, 1e6 // a solid state
		props := func(T, p float64, want error) {
			cs = append(cs, errcheck.Case{Name: name + " Props", Op: "sublimation.Solid.Props", Want: want,
				Inputs: []fluid.Input{in("T", T, "K"), in("p", p, "Pa")},
				Call:   func() error { _, err := s.Props(T, p); return err }})
		}
		for _, x := range bad {
			props(x, p0, fluid.ErrInvalidInput)
			props(T0, x, fluid.ErrInvalidInput)
		}
		if l.TFloor > 0 {
			props(l.TFloor*(1-1e-9), p0, fluid.ErrOutOfRange)
		}
		props(l.TCeil*(1+1e-9), p0, fluid.ErrOutOfRange)
		props(T0, l.PCeil*(1+1e-9), fluid.ErrOutOfRange)

		curves := []struct {
			op     string
			name   string
			unit   string
			fn     func(float64) (sublimation.Coexistence, error)
			lo, hi float64 // beyond the curve on each side
		}{
			{"SublimationPressure", "T", "K", s.SublimationPressure, f.Limits().TFloor * (1 - 1e-6), tp.T * (1 + 1e-6)},
			{"SublimationTemperature", "p", "Pa", s.SublimationTemperature, 1e-6, tp.P * (1 + 1e-6)},
			{"MeltingPressure", "T", "K", s.MeltingPressure, 0, 0},
			{"MeltingTemperature", "p", "Pa", s.MeltingTemperature, tp.P * (1 - 1e-6), l.PCeil * 1.01},
		}
		// The melting curve rises in T for dry ice and falls for ice Ih
		// (to 251.165 K at 208.566 MPa, IAPWS R14-08).
		if name == "water" {
			curves[2].lo, curves[2].hi = 251, tp.T*(1+1e-6)
		} else {
			curves[2].lo, curves[2].hi = tp.T*(1-1e-6), l.TCeil
		}
		for _, c := range curves {
			add := func(x float64, want error) {
				cs = append(cs, errcheck.Case{Name: name + " " + c.op, Op: "sublimation.Solid." + c.op, Want: want,
					Inputs: []fluid.Input{in(c.name, x, c.unit)},
					Call:   func() error { _, err := c.fn(x); return err }})
			}
			for _, x := range bad {
				add(x, fluid.ErrInvalidInput)
			}
			add(c.lo, fluid.ErrOutOfRange)
			add(c.hi, fluid.ErrOutOfRange)
		}
		for _, n := range []int{-1, 0, 1, 100001} {
			cs = append(cs, errcheck.Case{Name: name + " SublimationCurve", Op: "sublimation.Solid.SublimationCurve",
				Want: fluid.ErrInvalidInput, Inputs: []fluid.Input{in("n", float64(n), "")},
				Call: func() error { _, err := s.SublimationCurve(n); return err }})
			cs = append(cs, errcheck.Case{Name: name + " MeltingCurve", Op: "sublimation.Solid.MeltingCurve",
				Want: fluid.ErrInvalidInput, Inputs: []fluid.Input{in("n", float64(n), "")},
				Call: func() error { _, err := s.MeltingCurve(n); return err }})
		}
		// Three-phase fractions: bad numbers, and states that are not
		// three-phase mixtures (the vapour alone, denser than the solid).
		rhoMix := 1 / (0.2/tp.Solid.Rho + 0.5/tp.Liquid.Rho + 0.3/tp.Vapor.Rho)
		uMix := 0.2*tp.Solid.U + 0.5*tp.Liquid.U + 0.3*tp.Vapor.U
		fr := []struct {
			op, name, unit string
			fn             func(rho, x float64) (float64, float64, float64, error)
		}{
			{"FractionsRhoU", "u", "J/kg", tp.FractionsRhoU},
			{"FractionsRhoH", "h", "J/kg", tp.FractionsRhoH},
			{"FractionsRhoS", "s", "J/(kg K)", tp.FractionsRhoS},
		}
		for _, c := range fr {
			add := func(rho, x float64, want error) {
				cs = append(cs, errcheck.Case{Name: name + " " + c.op, Op: "sublimation.ThreePhase." + c.op, Want: want,
					Inputs: []fluid.Input{in("rho", rho, "kg/m3"), in(c.name, x, c.unit)},
					Call:   func() error { _, _, _, err := c.fn(rho, x); return err }})
			}
			for _, x := range bad {
				add(x, uMix, fluid.ErrInvalidInput)
				if x-x != 0 {
					add(rhoMix, x, fluid.ErrInvalidInput)
				}
			}
			add(2*tp.Solid.Rho, uMix, fluid.ErrOutOfRange)
			add(0.5*tp.Vapor.Rho, uMix, fluid.ErrOutOfRange)
		}
	}
	errcheck.Run(t, cs, nil)
	if len(cs) < 100 {
		t.Errorf("only %d cases", len(cs))
	}
}

// TestZeroSolid: the zero Solid (not obtained from For) panicked with a
// nil pointer in every method (the failure report of the reliability
// sweep, item F). Each method that returns an error must return one
// wrapping fluid.ErrInvalidInput that says how to get a Solid, naming
// the operation and its input; the others must return their zero values
// (NaN for Derivs).
func TestZeroSolid(t *testing.T) {
	t.Parallel()
	var z sublimation.Solid
	in := errcheck.In
	var cs []errcheck.Case
	add := func(op string, inputs []fluid.Input, call func() error) {
		cs = append(cs, errcheck.Case{Name: "zero Solid " + op, Op: "sublimation.Solid." + op, Want: fluid.ErrInvalidInput,
			Mention: "sublimation.For", Inputs: inputs, Call: call})
	}
	Tp := []fluid.Input{in("T", 250, "K"), in("p", 1e5, "Pa")}
	add("Props", Tp, func() error { _, err := z.Props(250, 1e5); return err })
	add("SublimationPressure", []fluid.Input{in("T", 250, "K")}, func() error { _, err := z.SublimationPressure(250); return err })
	add("SublimationPressure", []fluid.Input{in("T", 250, "K")}, func() error { _, err := z.SublimationPressureFrom(250, 1); return err })
	add("SublimationTemperature", []fluid.Input{in("p", 100, "Pa")}, func() error { _, err := z.SublimationTemperature(100); return err })
	add("SublimationTemperature", []fluid.Input{in("p", 100, "Pa")}, func() error { _, err := z.SublimationTemperatureFrom(100, 250, 1); return err })
	add("MeltingPressure", []fluid.Input{in("T", 250, "K")}, func() error { _, err := z.MeltingPressure(250); return err })
	add("MeltingPressure", []fluid.Input{in("T", 250, "K")}, func() error { _, err := z.MeltingPressureFrom(250, 1000); return err })
	add("MeltingTemperature", []fluid.Input{in("p", 1e7, "Pa")}, func() error { _, err := z.MeltingTemperature(1e7); return err })
	add("MeltingTemperature", []fluid.Input{in("p", 1e7, "Pa")}, func() error { _, err := z.MeltingTemperatureFrom(1e7, 250, 1000); return err })
	add("Triple", nil, func() error { _, err := z.Triple(); return err })
	add("SublimationCurve", []fluid.Input{in("n", 10, "")}, func() error { _, err := z.SublimationCurve(10); return err })
	add("MeltingCurve", []fluid.Input{in("n", 10, "")}, func() error { _, err := z.MeltingCurve(10); return err })
	add("HighIceMeltingPressure", []fluid.Input{in("T", 300, "K")}, func() error { _, err := z.HighIceMeltingPressure(300); return err })
	add("HighIceMeltingTemperature", []fluid.Input{in("p", 1e9, "Pa")}, func() error { _, err := z.HighIceMeltingTemperature(1e9); return err })
	errcheck.Run(t, cs, nil)
	if z.Name() != "" || z.Fluid() != nil || z.Limits() != (sublimation.Limits{}) {
		t.Errorf("zero Solid: Name %q, Fluid %v, Limits %+v", z.Name(), z.Fluid(), z.Limits())
	}
	if a, b, c, d := z.HighIceRange(); a != 0 || b != 0 || c != 0 || d != 0 {
		t.Errorf("zero Solid: HighIceRange %v %v %v %v", a, b, c, d)
	}
	if g := z.Derivs(250, 1e5); !math.IsNaN(g.G) || !math.IsNaN(g.GPP) {
		t.Errorf("zero Solid: Derivs %+v", g)
	}
}
