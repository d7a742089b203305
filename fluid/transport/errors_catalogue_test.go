package transport_test

import (
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/fluid/transport"
	"github.com/tripoint-thermo/tripoint/internal/errcheck"
)

// TestErrorCatalogue walks a catalogue of bad inputs through the exported
// functions of package transport (Viscosity, Conductivity, At,
// SurfaceTension, Of) and checks each error against the design's
// contract (errcheck.Check).
func TestErrorCatalogue(t *testing.T) {
	t.Parallel()
	in := errcheck.In
	var cs []errcheck.Case
	fns := []struct {
		op string
		fn func(*fluid.Fluid, float64, float64) error
	}{
		{"transport.Viscosity", func(f *fluid.Fluid, T, rho float64) error { _, err := transport.Viscosity(f, T, rho); return err }},
		{"transport.Conductivity", func(f *fluid.Fluid, T, rho float64) error { _, err := transport.Conductivity(f, T, rho); return err }},
		{"transport.At", func(f *fluid.Fluid, T, rho float64) error { _, err := transport.At(f, T, rho); return err }},
	}
	water, err := fluid.Lookup("water")
	if err != nil {
		t.Fatal(err)
	}
	for _, name := range fluid.Names() {
		f, err := fluid.Lookup(name)
		if err != nil {
			t.Fatal(err)
		}
		src := transport.Correlations(f)
		c, l := f.Critical(), f.Limits()
		for _, g := range fns {
			add := func(T, rho float64, want error, what string) {
				cs = append(cs, errcheck.Case{Name: name + " " + g.op + " " + what, Op: g.op, Want: want,
					Inputs: []fluid.Input{in("T", T, "K"), in("rho", rho, "kg/m3")},
					Call:   func() error { return g.fn(f, T, rho) }})
			}
			has := src.Viscosity != "" && src.Conductivity != "" ||
				g.op == "transport.Viscosity" && src.Viscosity != "" ||
				g.op == "transport.Conductivity" && src.Conductivity != ""
			if !has {
				add(300, 1, fluid.ErrUndefined, "no correlation")
				continue
			}
			for _, x := range []float64{math.NaN(), math.Inf(1), math.Inf(-1), 0, -1} {
				add(x, 1, fluid.ErrInvalidInput, "bad T")
			}
			for _, x := range []float64{math.NaN(), math.Inf(1), math.Inf(-1), -1} {
				add(c.T*1.5, x, fluid.ErrInvalidInput, "bad rho")
			}
			add(l.TCeil*2, 1, fluid.ErrOutOfRange, "T above the range")
			add(c.T*1.5, l.RhoCeil*(1+1e-9), fluid.ErrOutOfRange, "rho above RhoCeil")
			add(c.T, c.Rho, fluid.ErrUndefined, "at the critical point")
		}
		// Surface tension.
		addS := func(T float64, want error) {
			cs = append(cs, errcheck.Case{Name: name + " SurfaceTension", Op: "transport.SurfaceTension", Want: want,
				Inputs: []fluid.Input{in("T", T, "K")},
				Call:   func() error { _, err := transport.SurfaceTension(f, T); return err }})
		}
		if src.SurfaceTension == "" {
			addS(300, fluid.ErrUndefined)
			continue
		}
		for _, x := range []float64{math.NaN(), math.Inf(1), 0, -1} {
			addS(x, fluid.ErrInvalidInput)
		}
		addS(1.01*c.T, fluid.ErrOutOfRange)
		addS(0.5*f.Triple().T, fluid.ErrOutOfRange)
	}
	for _, g := range fns {
		cs = append(cs, errcheck.Case{Name: g.op + " nil fluid", Op: g.op, Want: fluid.ErrUndefined,
			Inputs: []fluid.Input{in("T", 300, "K"), in("rho", 1, "kg/m3")},
			Call:   func() error { return g.fn(nil, 300, 1) }})
	}
	// States: malformed, and solid.
	ice, err := flash.PT(water, 1e5, 250)
	if err != nil {
		t.Fatal(err)
	}
	for _, st := range []flash.State{{}, {T: 300, N: 5}, {T: 300, N: 1, Phases: [3]flash.PhaseState{{Phase: flash.TwoPhase, Rho: 1}}}} {
		cs = append(cs, errcheck.Case{Name: "Of malformed", Op: "transport.Of", Want: fluid.ErrInvalidInput,
			Inputs: []fluid.Input{in("T", st.T, "K")},
			Call:   func() error { _, err := transport.Of(water, st); return err }})
	}
	cs = append(cs, errcheck.Case{Name: "Of ice", Op: "transport.Of", Want: fluid.ErrUndefined,
		Inputs: []fluid.Input{in("T", ice.T, "K"), in("p", ice.P, "Pa")},
		Call:   func() error { _, err := transport.Of(water, ice); return err }})
	errcheck.Run(t, cs, nil)
	if len(cs) < 70 {
		t.Errorf("only %d cases", len(cs))
	}
}
