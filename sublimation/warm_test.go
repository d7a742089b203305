package sublimation

import (
	"math"
	"testing"
)

// TestCurvesWarm: the curves started from a nearby point of the curve
// (the ...From functions) agree with the cold starts to the solvers'
// tolerance, and a start that is not finite and positive is a cold one.
func TestCurvesWarm(t *testing.T) {
	t.Parallel()
	for _, name := range solids {
		s := mustSolid(t, name)
		sub, err := s.SublimationCurve(9)
		if err != nil {
			t.Fatal(err)
		}
		melt, err := s.MeltingCurve(9)
		if err != nil {
			t.Fatal(err)
		}
		same := func(what string, a, b Coexistence, err error) {
			t.Helper()
			if err != nil || math.Abs(a.T-b.T) > 1e-10*b.T || math.Abs(a.P-b.P) > 1e-9*b.P ||
				math.Abs(a.Fluid.Rho-b.Fluid.Rho) > 1e-9*b.Fluid.Rho {
				t.Errorf("%s %s: warm %v K %v Pa, cold %v K %v Pa (%v)", name, what, a.T, a.P, b.T, b.P, err)
			}
		}
		for i := 1; i < len(sub); i++ {
			c, w := sub[i], sub[i-1]
			a, err := s.SublimationPressureFrom(c.T, w.Fluid.Rho)
			same("SublimationPressureFrom", a, c, err)
			a, err = s.SublimationTemperatureFrom(c.P, w.T, w.Fluid.Rho)
			same("SublimationTemperatureFrom", a, c, err)
			a, err = s.SublimationPressureFrom(c.T, math.NaN())
			same("SublimationPressureFrom(NaN)", a, c, err)
		}
		for i := 1; i < len(melt); i++ {
			c, w := melt[i], melt[i-1]
			a, err := s.MeltingPressureFrom(c.T, w.Fluid.Rho)
			same("MeltingPressureFrom", a, c, err)
			a, err = s.MeltingTemperatureFrom(c.P, w.T, w.Fluid.Rho)
			same("MeltingTemperatureFrom", a, c, err)
			a, err = s.MeltingTemperatureFrom(c.P, -1, math.Inf(1))
			same("MeltingTemperatureFrom(-1, +Inf)", a, c, err)
		}
	}
}
