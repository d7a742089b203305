package transport

import (
	"errors"
	"math"
	"strings"
	"testing"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

func TestErrors(t *testing.T) {
	t.Parallel()
	w := lookup(t, "water")
	c := lookup(t, "CO2")
	nan, inf := math.NaN(), math.Inf(1)
	for _, tc := range []struct {
		name    string
		f       *fluid.Fluid
		T, rho  float64
		want    error
		mention string // a piece of the message
	}{
		{"nil fluid", nil, 300, 1, fluid.ErrUndefined, "nil fluid"},
		{"NaN T", w, nan, 1, fluid.ErrInvalidInput, "T = NaN"},
		{"Inf rho", w, 300, inf, fluid.ErrInvalidInput, "rho = +Inf"},
		{"negative rho", w, 300, -1, fluid.ErrInvalidInput, "rho = -1"},
		{"zero T", w, 0, 1, fluid.ErrInvalidInput, "T = 0"},
		{"water too hot", w, 1200, 1, fluid.ErrOutOfRange, "1173.15"},
		{"water 338 MPa", w, 900, 700, fluid.ErrOutOfRange, "p = 3.38131e+08"},
		{"water above 1000 MPa", w, 300, 1300, fluid.ErrOutOfRange, "up to p = 1e+09 Pa"},
		{"water below the EoS floor", w, 150, 1, fluid.ErrOutOfRange, "200 <= T <= 5000 K"},
		{"water negative p", w, 241, 2994, fluid.ErrOutOfRange, "Pa <= 0"},
		{"water dilute limit too cold", w, 100, 0, fluid.ErrOutOfRange, "200 <= T"},
		{"water unstable", w, 600, 300, fluid.ErrUnstable, "spinodal"},
		{"water at the critical point", w, waterTc, waterRhoc, fluid.ErrUndefined, "critical point"},
		{"CO2 below the triple point", c, 200, 1, fluid.ErrOutOfRange, "216.592"},
		{"CO2 above 200 MPa", c, 300, 1400, fluid.ErrOutOfRange, "2e+08"},
	} {
		for _, fn := range []struct {
			op string
			f  func(*fluid.Fluid, float64, float64) (float64, error)
		}{
			{"transport.Conductivity", Conductivity},
			{"transport.At", func(f *fluid.Fluid, T, rho float64) (float64, error) {
				c, err := At(f, T, rho)
				return c.Viscosity, err
			}},
		} {
			v, err := fn.f(tc.f, tc.T, tc.rho)
			if fn.op == "transport.At" && tc.f == c {
				// CO2 has no viscosity: At is undefined before any range check.
				if !errors.Is(err, fluid.ErrUndefined) {
					t.Errorf("%s: At(CO2) err = %v, want ErrUndefined", tc.name, err)
				}
				continue
			}
			if !errors.Is(err, tc.want) {
				t.Errorf("%s: %s err = %v, want %v", tc.name, fn.op, err, tc.want)
				continue
			}
			var fe *fluid.Error
			if !errors.As(err, &fe) || fe.Op != fn.op {
				t.Errorf("%s: err %v is not a *fluid.Error of %s", tc.name, err, fn.op)
			}
			if msg := err.Error(); !strings.Contains(msg, tc.mention) || !isASCII(msg) {
				t.Errorf("%s: message %q does not say %q in ASCII", tc.name, msg, tc.mention)
			}
			if v != 0 {
				t.Errorf("%s: value %g returned with an error", tc.name, v)
			}
		}
	}
	if _, err := SurfaceTension(nil, 300); !errors.Is(err, fluid.ErrUndefined) {
		t.Errorf("SurfaceTension(nil): %v", err)
	}
	if _, err := SurfaceTension(w, nan); !errors.Is(err, fluid.ErrInvalidInput) {
		t.Errorf("SurfaceTension(NaN): %v", err)
	}
}

func isASCII(s string) bool {
	for i := 0; i < len(s); i++ {
		if s[i] >= 0x80 {
			return false
		}
	}
	return true
}

// TestRangeEdges: the published bounds themselves are inside.
func TestRangeEdges(t *testing.T) {
	t.Parallel()
	w := lookup(t, "water")
	if _, err := At(w, 1173.15, 1); err != nil {
		t.Errorf("At(water, 1173.15 K, 1 kg/m3): %v", err)
	}
	c := lookup(t, "CO2")
	for _, T := range []float64{216.592, 1100} {
		if _, err := Conductivity(c, T, 1); err != nil {
			t.Errorf("Conductivity(CO2, %g K, 1 kg/m3): %v", T, err)
		}
	}
	if _, err := Conductivity(c, 1100.0001, 1); !errors.Is(err, fluid.ErrOutOfRange) {
		t.Errorf("Conductivity(CO2, 1100.0001 K): %v", err)
	}
}

// TestNearCritical: values next to the critical point are finite and
// positive, and grow towards it along the critical isochore.
func TestNearCritical(t *testing.T) {
	t.Parallel()
	for _, name := range []string{"water", "CO2"} {
		f := lookup(t, name)
		cr := f.Critical()
		prev := 0.0
		for _, dT := range []float64{1, 0.1, 0.01, 1e-3, 1e-4} {
			l, err := Conductivity(f, cr.T+dT, cr.Rho)
			if err != nil || !(l > prev) || math.IsInf(l, 0) {
				t.Errorf("%s: Conductivity(Tc+%g K, rhoc) = %g, %v (previous %g)", name, dT, l, err, prev)
			}
			prev = l
		}
	}
}

func TestAllocs(t *testing.T) {
	w := lookup(t, "water")
	c := lookup(t, "CO2")
	st, err := flash.TQ(w, 373.15, 0.3)
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name string
		fn   func()
	}{
		{"Of", func() { Of(w, st) }},
		{"Viscosity", func() { Viscosity(w, 647.35, 322) }},
		{"Conductivity", func() { Conductivity(w, 647.35, 322) }},
		{"At", func() { At(w, 300, 998) }},
		{"CO2 Conductivity", func() { Conductivity(c, 310, 400) }},
		{"SurfaceTension", func() { SurfaceTension(w, 300) }},
	} {
		if n := testing.AllocsPerRun(100, tc.fn); n != 0 {
			t.Errorf("%s: %g allocs per call, want 0", tc.name, n)
		}
	}
}

// FuzzAt: no input panics; with a nil error the values are finite and
// positive.
func FuzzAt(f *testing.F) {
	w, _ := fluid.Lookup("water")
	c, _ := fluid.Lookup("CO2")
	f.Add(300.0, 998.0, false)
	f.Add(647.35, 322.0, false)
	f.Add(310.0, 400.0, true)
	f.Add(1e-300, 0.0, true)
	f.Fuzz(func(t *testing.T, T, rho float64, co2 bool) {
		fl := w
		if co2 {
			fl = c
		}
		if l, err := Conductivity(fl, T, rho); err == nil && !(l > 0 && !math.IsInf(l, 0)) {
			t.Errorf("Conductivity(%s, %g, %g) = %g", fl.Name(), T, rho, l)
		}
		if v, err := Viscosity(fl, T, rho); err == nil && !(v > 0 && !math.IsInf(v, 0)) {
			t.Errorf("Viscosity(%s, %g, %g) = %g", fl.Name(), T, rho, v)
		}
		if s, err := SurfaceTension(fl, T); err == nil && !(s >= 0 && !math.IsInf(s, 0)) {
			t.Errorf("SurfaceTension(%s, %g) = %g", fl.Name(), T, s)
		}
	})
}

// TestCrossoverSmall checks the crossover function against its own
// expansion for small y, Z = y/π + O(y²), which follows from the formula
// alone (no remembered value), and that it is zero below the cut 1.2e-7.
func TestCrossoverSmall(t *testing.T) {
	t.Parallel()
	for _, k := range []float64{0.1, 0.5, 0.9} {
		for _, y := range []float64{1e-6, 1e-5, 1e-4} {
			z := crossover(y, k, 1)
			if math.Abs(z/(y/math.Pi)-1) > 10*y {
				t.Errorf("Z(%g; cv/cp = %g) = %g, want %g + O(y^2)", y, k, z, y/math.Pi)
			}
		}
		if z := crossover(1e-8, k, 1); z != 0 {
			t.Errorf("Z(1e-8) = %g, want 0", z)
		}
	}
}

// TestConcurrent: the functions are safe for concurrent use and give the
// serial results.
func TestConcurrent(t *testing.T) {
	t.Parallel()
	w := lookup(t, "water")
	want, err := At(w, 647.35, 322)
	if err != nil {
		t.Fatal(err)
	}
	done := make(chan Coefficients)
	for range 8 {
		go func() {
			var c Coefficients
			for range 50 {
				c, _ = At(w, 647.35, 322)
			}
			done <- c
		}()
	}
	for range 8 {
		if c := <-done; c != want {
			t.Errorf("concurrent At = %+v, want %+v", c, want)
		}
	}
}
