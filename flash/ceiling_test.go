package flash

import (
	"errors"
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// ceilingCases are PH and PS at the accepted temperatures' ceiling of
// every fluid on isobars from 0.01 to 6 pc (the supercritical benchmark
// grid reaches R-134a's, 455 K): x the state's h or s at TCeil moved by
// rel (relative, at least 1e5 J/kg or 1e3 J/(kg K)), cold and warm-started
// from the state at TCeil.
func ceilingCases(t *testing.T, fn func(f *fluid.Fluid, name string, p float64, st *State, x float64, opt Options, rel float64)) {
	t.Helper()
	for _, f := range fluids(t) {
		lim, c := f.Limits(), f.Critical()
		for _, pr := range []float64{0.01, 0.5, 2, 6} {
			p := pr * c.P
			st, err := PT(f, p, lim.TCeil)
			if err != nil {
				t.Fatalf("%s PT(%v, %v): %v", f.Name(), p, lim.TCeil, err)
			}
			for _, rel := range []float64{1e-6, 0, -1e-9, -1e-6} {
				for _, opt := range []Options{{}, {Guess: &st}} {
					fn(f, "h", p, &st, st.H+rel*max(st.H, 1e5), opt, rel)
					fn(f, "s", p, &st, st.S+rel*max(st.S, 1e3), opt, rel)
				}
			}
		}
	}
}

// TestTemperatureCeiling checks PH and PS next to the accepted
// temperatures' ceiling: inside it (and exactly at it) the state, at
// TCeil or just below; beyond it an error wrapping ErrOutOfRange. Beyond
// it the iteration, held at the ceiling, once ran its 60 iterations and
// the fallbacks behind it (up to 198 evaluations of the equation, and
// errors built on the way: 257 allocations); TestCeilingEvals holds the
// cost down.
func TestTemperatureCeiling(t *testing.T) {
	t.Parallel()
	ceilingCases(t, func(f *fluid.Fluid, name string, p float64, st *State, x float64, opt Options, rel float64) {
		fn := PHWith
		if name == "s" {
			fn = PSWith
		}
		got, err := fn(f, p, x, opt)
		what := f.Name() + " P" + name
		switch {
		case rel > 0:
			var e *fluid.Error
			if !errors.Is(err, fluid.ErrOutOfRange) || !errors.As(err, &e) {
				t.Errorf("%s at p = %v, %s = %v beyond TCeil (warm %v): %v, %v K, want ErrOutOfRange", what, p, name, x, opt.Guess != nil, err, got.T)
			}
		case err != nil:
			t.Errorf("%s at p = %v, %s = %v (warm %v): %v", what, p, name, x, opt.Guess != nil, err)
		case got.T > f.Limits().TCeil || math.Abs(got.T-st.T) > 1e-4*st.T:
			t.Errorf("%s at p = %v, %s = %v (warm %v): T = %v, TCeil %v", what, p, name, x, opt.Guess != nil, got.T, f.Limits().TCeil)
		}
	})
}
