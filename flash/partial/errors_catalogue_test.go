package partial_test

import (
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/flash/partial"
	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/internal/errcheck"
)

// TestErrorCatalogue walks a catalogue of bad inputs through the exported
// functions of package partial (At, Derivative, Jacobian.Derivative,
// SlopesAtT, SlopesAtP, SlopesOf, Slopes.Derivative) and checks each
// error against the design's contract (errcheck.Check).
func TestErrorCatalogue(t *testing.T) {
	t.Parallel()
	in := errcheck.In
	water, err := fluid.Lookup("water")
	if err != nil {
		t.Fatal(err)
	}
	r134a, err := fluid.Lookup("R134a")
	if err != nil {
		t.Fatal(err)
	}
	liquid, err := flash.PT(water, 1e6, 300)
	if err != nil {
		t.Fatal(err)
	}
	ice, err := flash.PT(water, 1e5, 250)
	if err != nil {
		t.Fatal(err)
	}
	stIn := func(st flash.State) []fluid.Input {
		return []fluid.Input{in("T", st.T, "K"), in("p", st.P, "Pa"), in("rho", st.Rho, "kg/m3")}
	}
	nan := math.NaN()
	malformed := []flash.State{
		{},
		{T: nan, P: 1e5, Rho: 1000, Phase: flash.Liquid, N: 1, Phases: [3]flash.PhaseState{{Phase: flash.Liquid, Fraction: 1, Rho: 1000}}},
		{T: 300, P: 1e5, Rho: -1, Phase: flash.Liquid, N: 1, Phases: [3]flash.PhaseState{{Phase: flash.Liquid, Fraction: 1, Rho: -1}}},
		{T: 300, P: 1e5, Rho: 1000, Phase: flash.Liquid, N: 2},
		{T: 300, P: 1e5, Rho: 1000, Phase: 42, N: 1},
	}
	var cs []errcheck.Case
	for _, st := range malformed {
		cs = append(cs, errcheck.Case{Name: "At malformed", Op: "partial.At", Want: fluid.ErrInvalidInput,
			Inputs: stIn(st), Call: func() error { _, err := partial.At(water, st); return err }})
		cs = append(cs, errcheck.Case{Name: "Derivative malformed", Op: "partial.Derivative", Want: fluid.ErrInvalidInput,
			Inputs: stIn(st), Call: func() error { _, err := partial.Derivative(water, st, partial.H, partial.T, partial.P); return err }})
	}
	cs = append(cs, errcheck.Case{Name: "At nil", Op: "partial.At", Want: fluid.ErrInvalidInput,
		Inputs: stIn(liquid), Call: func() error { _, err := partial.At(nil, liquid); return err }})
	cs = append(cs, errcheck.Case{Name: "At ice of R134a", Op: "partial.At", Want: fluid.ErrUndefined,
		Inputs: stIn(ice), Call: func() error { _, err := partial.At(r134a, ice); return err }})
	j, err := partial.At(water, liquid)
	if err != nil {
		t.Fatal(err)
	}
	var zero partial.Jacobian
	for _, q := range [][3]partial.Quantity{{0, partial.T, partial.P}, {partial.H, 10, partial.P}, {partial.H, partial.T, -1}} {
		cs = append(cs, errcheck.Case{Name: "Jacobian.Derivative bad quantity", Op: "partial.Jacobian.Derivative",
			Want: fluid.ErrInvalidInput, Inputs: []fluid.Input{in("T", liquid.T, "K"), in("p", liquid.P, "Pa")},
			Call: func() error { _, err := j.Derivative(q[0], q[1], q[2]); return err }})
	}
	cs = append(cs, errcheck.Case{Name: "zero Jacobian", Op: "partial.Jacobian.Derivative", Want: fluid.ErrInvalidInput,
		Call: func() error { _, err := zero.Derivative(partial.H, partial.T, partial.P); return err }})
	// Curves.
	c := water.Critical()
	slopes := []struct {
		name, unit string
		fn         func(*fluid.Fluid, partial.Curve, float64) (partial.Slopes, error)
		op         string
	}{
		{"T", "K", partial.SlopesAtT, "partial.SlopesAtT"},
		{"p", "Pa", partial.SlopesAtP, "partial.SlopesAtP"},
	}
	for _, sl := range slopes {
		add := func(f *fluid.Fluid, cv partial.Curve, x float64, want error) {
			cs = append(cs, errcheck.Case{Name: sl.op + " " + cv.String(), Op: sl.op, Want: want,
				Inputs: []fluid.Input{in(sl.name, x, sl.unit)},
				Call:   func() error { _, err := sl.fn(f, cv, x); return err }})
		}
		good := 0.8 * c.T
		above := 1.01 * c.T
		if sl.name == "p" {
			good, above = 0.5*c.P, 1.01*c.P
		}
		add(nil, partial.Saturation, good, fluid.ErrInvalidInput)
		for _, cv := range []partial.Curve{0, 4, -1} {
			add(water, cv, good, fluid.ErrInvalidInput)
		}
		for _, x := range []float64{nan, math.Inf(1), 0, -1} {
			for _, cv := range []partial.Curve{partial.Saturation, partial.Sublimation, partial.Melting} {
				add(water, cv, x, fluid.ErrInvalidInput)
			}
		}
		add(water, partial.Saturation, above, fluid.ErrOutOfRange)
		add(r134a, partial.Sublimation, good, fluid.ErrUndefined)
		add(r134a, partial.Melting, good, fluid.ErrUndefined)
	}
	cs = append(cs, errcheck.Case{Name: "SlopesOf a liquid", Op: "partial.SlopesOf", Want: fluid.ErrInvalidInput,
		Inputs: stIn(liquid), Call: func() error { _, err := partial.SlopesOf(water, liquid); return err }})
	cs = append(cs, errcheck.Case{Name: "SlopesOf nil fluid", Op: "partial.SlopesOf", Want: fluid.ErrInvalidInput,
		Inputs: stIn(liquid), Call: func() error { _, err := partial.SlopesOf(nil, liquid); return err }})
	s, err := partial.SlopesAtT(water, partial.Saturation, 400)
	if err != nil {
		t.Fatal(err)
	}
	var zs partial.Slopes
	for _, a := range []struct {
		i    int
		a, b partial.Quantity
	}{{2, partial.H, partial.T}, {-1, partial.H, partial.T}, {0, 0, partial.T}, {1, partial.H, 99}} {
		cs = append(cs, errcheck.Case{Name: "Slopes.Derivative", Op: "partial.Slopes.Derivative", Want: fluid.ErrInvalidInput,
			Inputs: []fluid.Input{in("T", s.T, "K"), in("p", s.P, "Pa")},
			Call:   func() error { _, err := s.Derivative(a.i, a.a, a.b); return err }})
	}
	cs = append(cs, errcheck.Case{Name: "zero Slopes", Op: "partial.Slopes.Derivative", Want: fluid.ErrInvalidInput,
		Call: func() error { _, err := zs.Derivative(0, partial.H, partial.T); return err }})
	errcheck.Run(t, cs, nil)
}
