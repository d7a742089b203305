package transport

import (
	"errors"
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// TestR134aSurfaceTension: Mulero et al. (2012) prints no table for
// computer verification; loose checks of common practice, no source:
// about 8.0 mN/m at 25 °C and 11.5 mN/m at 0 °C, zero at Tc.
func TestR134aSurfaceTension(t *testing.T) {
	t.Parallel()
	f := lookup(t, "R134a")
	for _, c := range []struct{ T, want, tol float64 }{
		{298.15, 8.0e-3, 0.3e-3},
		{273.15, 11.5e-3, 0.4e-3},
		{374.18, 0, 0},
	} {
		if s, err := SurfaceTension(f, c.T); err != nil || math.Abs(s-c.want) > c.tol {
			t.Errorf("SurfaceTension(R134a, %g K) = %g N/m, %v; want about %g", c.T, s, err, c.want)
		}
	}
	for _, T := range []float64{169.8, 374.19} {
		if _, err := SurfaceTension(f, T); !errors.Is(err, fluid.ErrOutOfRange) {
			t.Errorf("SurfaceTension(R134a, %g K): %v, want ErrOutOfRange", T, err)
		}
	}
	if _, err := At(f, 300, 1200); !errors.Is(err, fluid.ErrUndefined) {
		t.Errorf("At(R134a): %v, want ErrUndefined", err)
	}
	if c := Correlations(f); c.Viscosity != "" || c.Conductivity != "" || c.SurfaceTension == "" {
		t.Errorf("Correlations(R134a) = %+v", c)
	}
}
