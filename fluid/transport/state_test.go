package transport

import (
	"errors"
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

func TestOf(t *testing.T) {
	t.Parallel()
	w := lookup(t, "water")
	// Two-phase water at 100 °C: one entry per coexisting phase, equal to
	// At at the phase's density.
	st, err := flash.TQ(w, 373.15, 0.3)
	if err != nil {
		t.Fatal(err)
	}
	r, err := Of(w, st)
	if err != nil {
		t.Fatal(err)
	}
	if r.N != 2 || r.Phases[0].Phase != flash.Liquid || r.Phases[1].Phase != flash.Vapor {
		t.Fatalf("Of(two-phase water) = %+v", r)
	}
	for i := range r.N {
		want, err := At(w, st.T, st.Phases[i].Rho)
		if err != nil || r.Phases[i].Coefficients != want || r.Phases[i].Fraction != st.Phases[i].Fraction {
			t.Errorf("phase %d: %+v, want %+v (%v)", i, r.Phases[i], want, err)
		}
	}
	// The liquid is the more viscous and the better conductor.
	if !(r.Phases[0].Viscosity > r.Phases[1].Viscosity && r.Phases[0].Conductivity > r.Phases[1].Conductivity) {
		t.Errorf("liquid %+v vs vapour %+v", r.Phases[0], r.Phases[1])
	}

	// Common practice, no source: saturated water at 100 °C, liquid
	// η ≈ 0.282 mPa·s and λ ≈ 0.68 W/(m·K), vapour η ≈ 12.3 µPa·s and
	// λ ≈ 0.025 W/(m·K).
	for _, c := range []struct{ got, want, tol float64 }{
		{r.Phases[0].Viscosity, 0.282e-3, 0.005e-3},
		{r.Phases[0].Conductivity, 0.68, 0.01},
		{r.Phases[1].Viscosity, 12.3e-6, 0.3e-6},
		{r.Phases[1].Conductivity, 0.025, 0.001},
	} {
		if math.Abs(c.got-c.want) > c.tol {
			t.Errorf("saturated water at 100 C: %g, want about %g", c.got, c.want)
		}
	}

	// A single phase.
	st, err = flash.PT(w, 1e5, 293.15)
	if err != nil {
		t.Fatal(err)
	}
	if r, err := Of(w, st); err != nil || r.N != 1 || r.Phases[0].Phase != flash.Liquid {
		t.Errorf("Of(liquid water) = %+v, %v", r, err)
	}

	// A solid state: an error.
	solid := flash.State{T: 250, P: 1e5, Phase: flash.Solid, N: 1}
	solid.Phases[0] = flash.PhaseState{Phase: flash.Solid, Fraction: 1, Rho: 920}
	if _, err := Of(w, solid); !errors.Is(err, fluid.ErrUndefined) {
		t.Errorf("Of(ice): %v, want ErrUndefined", err)
	}
	// Solid and vapour: only the vapour.
	sv := flash.State{T: 260, P: 150, Phase: flash.SolidVapor, N: 2}
	sv.Phases[0] = flash.PhaseState{Phase: flash.Solid, Fraction: 0.5, Rho: 920}
	sv.Phases[1] = flash.PhaseState{Phase: flash.Vapor, Fraction: 0.5, Rho: 150 / (461.51805 * 260)}
	if r, err := Of(w, sv); err != nil || r.N != 1 || r.Phases[0].Phase != flash.Vapor {
		t.Errorf("Of(ice + vapour) = %+v, %v", r, err)
	}
	// A malformed state.
	if _, err := Of(w, flash.State{T: 300}); !errors.Is(err, fluid.ErrInvalidInput) {
		t.Errorf("Of(zero State): %v, want ErrInvalidInput", err)
	}
	// CO2 has no viscosity correlation here.
	c := lookup(t, "CO2")
	st, err = flash.PT(c, 1e5, 300)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := Of(c, st); !errors.Is(err, fluid.ErrUndefined) {
		t.Errorf("Of(CO2): %v, want ErrUndefined", err)
	}
}

// FuzzOf: no state, however malformed, makes Of panic; with a nil error
// every returned phase is a fluid one with finite, positive coefficients.
func FuzzOf(f *testing.F) {
	w, _ := fluid.Lookup("water")
	f.Add(300.0, 998.0, 1, int32(1), int32(2))
	f.Add(373.15, 958.0, 2, int32(1), int32(2))
	f.Add(260.0, 920.0, 2, int32(5), int32(2))
	f.Add(300.0, 1.0, -1, int32(9), int32(0))
	f.Fuzz(func(t *testing.T, T, rho float64, n int, k0, k1 int32) {
		st := flash.State{T: T, N: n}
		st.Phases[0] = flash.PhaseState{Phase: flash.Phase(k0), Rho: rho}
		st.Phases[1] = flash.PhaseState{Phase: flash.Phase(k1), Rho: rho / 100}
		r, err := Of(w, st)
		if err != nil {
			return
		}
		for _, ph := range r.Phases[:r.N] {
			if ph.Phase == flash.Solid || !(ph.Viscosity > 0 && ph.Conductivity > 0) ||
				math.IsInf(ph.Viscosity, 0) || math.IsInf(ph.Conductivity, 0) {
				t.Errorf("Of(%+v) phase %+v", st, ph)
			}
		}
	})
}
