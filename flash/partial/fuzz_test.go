package partial

import (
	"testing"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// FuzzDerivative feeds malformed and odd states and codes to Derivative:
// it must not panic, and a nil error must come with a finite value.
func FuzzDerivative(f *testing.F) {
	f.Add(uint8(0), int32(1), 1, 300.0, 1e5, 996.0, 390.0, 4000.0, 0.5, 996.0, 0.02, 390.0, 8000.0, int32(3), int32(6), int32(2))
	f.Add(uint8(1), int32(4), 2, 250.0, 1.8e6, 30.0, -800.0, 1500.0, 0.5, 1100.0, 45.0, -1000.0, -200.0, int32(6), int32(1), int32(2))
	f.Add(uint8(1), int32(5), 1, 200.0, 1e7, 1600.0, -1500.0, 1000.0, 0.0, 1600.0, 0.0, 0.0, 0.0, int32(7), int32(2), int32(1))
	f.Add(uint8(0), int32(8), 3, 273.16, 611.65, 1.0, 0.0, 1e300, 0.3, 917.0, 999.8, -1200.0, 0.0, int32(5), int32(4), int32(7))
	f.Add(uint8(2), int32(4), 2, 374.18, 4.0e6, 508.0, 1500.0, 0.0, 0.5, 508.0, 508.0, 1500.0, 1500.0, int32(2), int32(3), int32(1))
	names := fluid.Names()
	f.Fuzz(func(t *testing.T, fi uint8, ph int32, n int, T, p, rho, s, cv, x, r1, r2, s1, s2 float64, a, b, c int32) {
		fl, err := fluid.Lookup(names[int(fi)%len(names)])
		if err != nil {
			t.Fatal(err)
		}
		st := flash.State{T: T, P: p, Rho: rho, S: s, Cv: cv, Phase: flash.Phase(ph), N: n}
		st.Phases[0] = flash.PhaseState{Phase: flash.Solid, Fraction: 1 - x, Rho: r1, S: s1}
		st.Phases[1] = flash.PhaseState{Phase: flash.Vapor, Fraction: x, Rho: r2, S: s2}
		st.Phases[2] = flash.PhaseState{Phase: flash.Vapor, Fraction: x, Rho: r2 / 2, S: s2 * 2}
		d, err := Derivative(fl, st, Quantity(a), Quantity(b), Quantity(c))
		if err == nil && !finite(d) {
			t.Fatalf("Derivative = %v with a nil error", d)
		}
		if sl, err := SlopesOf(fl, st); err == nil {
			if d, err := sl.Derivative(int(a)%3, Quantity(b), Quantity(c)); err == nil && !finite(d) {
				t.Fatalf("Slopes.Derivative = %v with a nil error", d)
			}
		}
		if sl, err := SlopesAtT(fl, Curve(ph%4), T); err == nil {
			if d, err := sl.Derivative(n%2, Quantity(a), Quantity(b)); err == nil && !finite(d) {
				t.Fatalf("Slopes.Derivative = %v with a nil error", d)
			}
		}
	})
}
