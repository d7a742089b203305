package transport

import (
	"errors"
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
)

func lookup(t testing.TB, name string) *fluid.Fluid {
	t.Helper()
	f, err := fluid.Lookup(name)
	if err != nil {
		t.Fatal(err)
	}
	return f
}

// checkRow is one published check value: at (T, rho), the value want in
// the table's unit, to be matched within tol (±1 in its last printed
// digit).
type checkRow struct {
	T, rho, want, tol float64
}

// checkTable compares fn(f, T, rho)·scale with each row; unit names the
// table's unit for messages.
func checkTable(t *testing.T, what string, f *fluid.Fluid, fn func(*fluid.Fluid, float64, float64) (float64, error),
	scale float64, unit string, rows []checkRow) {
	t.Helper()
	for _, c := range rows {
		got, err := fn(f, c.T, c.rho)
		if err != nil {
			t.Errorf("%s(%s, %g K, %g kg/m3): %v", what, f.Name(), c.T, c.rho, err)
			continue
		}
		if math.Abs(got*scale-c.want) > c.tol {
			t.Errorf("%s(%s, %g K, %g kg/m3) = %.10g %s, want %.10g within %g", what, f.Name(), c.T, c.rho,
				got*scale, unit, c.want, c.tol)
		}
	}
}

// TestWaterViscosityTable checks μ̄0·μ̄1 of IAPWS R12-08 (μ̄2 = 1) against
// the release's check table for Eq. (10), in µPa·s, as transcribed in
// shared/reference/water-transport-iapws.md.
func TestWaterViscosityTable(t *testing.T) {
	t.Parallel()
	for _, c := range []checkRow{
		// IAPWS R12-08, check table for μ̄2 = 1 (reference file).
		{298.15, 998, 889.735100, 1e-6},
		{298.15, 1200, 1437.649467, 1e-6},
		{373.15, 1000, 307.883622, 1e-6},
		{433.15, 1, 14.538324, 1e-6},
		{433.15, 1000, 217.685358, 1e-6},
		{873.15, 1, 32.619287, 1e-6},
		{873.15, 100, 35.802262, 1e-6},
		{873.15, 600, 77.430195, 1e-6},
		{1173.15, 1, 44.217245, 1e-6},
		{1173.15, 100, 47.640433, 1e-6},
		{1173.15, 400, 64.154608, 1e-6},
	} {
		tb, rb := c.T/waterTc, c.rho/waterRhoc
		got := waterMu0(tb) * waterMu1(tb, rb)
		if math.Abs(got-c.want) > c.tol {
			t.Errorf("mu0*mu1(%g K, %g kg/m3) = %.9f uPa s, want %.6f", c.T, c.rho, got, c.want)
		}
	}
}

// TestWaterViscosityCritical checks the full R12-08 viscosity, critical
// enhancement μ̄2 included, through Viscosity (and so with IAPWS-95 for
// ζ), against the release's check table at 647.35 K.
func TestWaterViscosityCritical(t *testing.T) {
	t.Parallel()
	checkTable(t, "Viscosity", lookup(t, "water"), Viscosity, 1e6, "uPa s", []checkRow{
		// IAPWS R12-08 Table 4, T = 647.35 K, µPa·s (recalled from memory).
		{647.35, 122, 25.520677, 1e-6},
		{647.35, 222, 31.337589, 1e-6},
		{647.35, 272, 36.228143, 1e-6},
		{647.35, 322, 42.961579, 1e-6},
		{647.35, 372, 45.688204, 1e-6},
		{647.35, 422, 49.436256, 1e-6},
	})
}

// TestWaterMu2Branches checks, without any remembered value, that the two
// branches of R12-08's Y(ξ) (the series for small ξ, Eq. 15, and the
// closed form, Eq. 16) meet at the switch ξ = 0.3817016416 nm, and that
// μ̄2 grows with ξ.
func TestWaterMu2Branches(t *testing.T) {
	t.Parallel()
	const xs = 0.3817016416e-9
	lo, hi := waterMu2(xs), waterMu2(math.Nextafter(xs, 1))
	// The release chose the switch where the two agree to double
	// precision in μ̄2 − 1 ≈ 1e-6; 1e-12 relative in μ̄2 is a tight bound.
	if math.Abs(hi-lo) > 1e-12 {
		t.Errorf("mu2 jumps at the branch switch: %.17g -> %.17g", lo, hi)
	}
	prev := 1.0
	for xi := 0.01e-9; xi < 50e-9; xi *= 1.1 {
		m := waterMu2(xi)
		if !(m > prev) {
			t.Fatalf("mu2(%g m) = %.17g, not above mu2 at the smaller xi, %.17g", xi, m, prev)
		}
		prev = m
	}
}

// TestWaterConductivityTable checks λ̄0·λ̄1 of IAPWS R15-11 (λ̄2 = 0) in
// mW/(m·K).
func TestWaterConductivityTable(t *testing.T) {
	t.Parallel()
	f := lookup(t, "water")
	for _, c := range []checkRow{
		// IAPWS R15-11 Table 4, λ̄2 = 0 (recalled from memory).
		{298.15, 0, 18.4341883, 1e-7},
		{298.15, 998, 607.712868, 1e-6},
		{298.15, 1200, 799.038144, 1e-6},
		{873.15, 0, 79.1034659, 1e-7},
	} {
		tb, rb := c.T/waterTc, c.rho/waterRhoc
		got := waterLambda0(tb) * waterLambda1(tb, rb)
		if math.Abs(got-c.want) > c.tol {
			t.Errorf("lambda0*lambda1(%g K, %g kg/m3) = %.10f mW/(m K), want %.9g", c.T, c.rho, got, c.want)
		}
		if c.rho == 0 { // the zero-density limit through the API
			l, err := Conductivity(f, c.T, 0)
			if err != nil || math.Abs(l*1e3-c.want) > c.tol {
				t.Errorf("Conductivity(water, %g K, 0) = %.10f mW/(m K), %v; want %.9g", c.T, l*1e3, err, c.want)
			}
		}
	}
}

// TestWaterConductivityCritical checks the full R15-11 conductivity,
// critical enhancement λ̄2 included (with IAPWS-95 for cp, cv and ζ and
// R12-08 with μ̄2 for μ̄), through Conductivity and At.
func TestWaterConductivityCritical(t *testing.T) {
	t.Parallel()
	f := lookup(t, "water")
	rows := []checkRow{
		// IAPWS R15-11 Table 5, T = 647.35 K, mW/(m·K) (recalled from memory).
		{647.35, 1, 51.9298924, 1e-7},
		{647.35, 122, 130.922885, 1e-6},
		{647.35, 222, 367.787459, 1e-6},
		{647.35, 272, 757.959776, 1e-6},
		{647.35, 322, 1443.75556, 1e-5},
		{647.35, 372, 650.319402, 1e-6},
		{647.35, 422, 448.883487, 1e-6},
		{647.35, 750, 600.961346, 1e-6},
	}
	checkTable(t, "Conductivity", f, Conductivity, 1e3, "mW/(m K)", rows)
	for _, c := range rows {
		both, err := At(f, c.T, c.rho)
		eta, _ := Viscosity(f, c.T, c.rho)
		lam, _ := Conductivity(f, c.T, c.rho)
		if err != nil || both.Conductivity != lam || both.Viscosity != eta {
			t.Errorf("At(water, %g K, %g kg/m3) = %+v, %v; want {%g %g}", c.T, c.rho, both, err, eta, lam)
		}
	}
}

// TestWaterCommonPractice: loose checks of common practice, no source.
func TestWaterCommonPractice(t *testing.T) {
	t.Parallel()
	f := lookup(t, "water")
	// Liquid water at 20 °C and about 0.1 MPa, ρ ≈ 998.2 kg/m³ (common
	// practice, no source): η ≈ 1.0 mPa·s, λ ≈ 0.6 W/(m·K).
	c, err := At(f, 293.15, 998.2)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(c.Viscosity-1.0e-3) > 0.03e-3 {
		t.Errorf("eta(20 C liquid) = %g Pa s, want about 1.0e-3", c.Viscosity)
	}
	if math.Abs(c.Conductivity-0.6) > 0.02 {
		t.Errorf("lambda(20 C liquid) = %g W/(m K), want about 0.6", c.Conductivity)
	}
	// Far from the critical point the enhancements are negligible
	// (R12-08 and R15-11 say so for industrial use): below 1e-6 relative.
	tb, rb := 293.15/waterTc, 998.2/waterRhoc
	if r := c.Viscosity*1e6/(waterMu0(tb)*waterMu1(tb, rb)) - 1; math.Abs(r) > 1e-6 {
		t.Errorf("mu2 - 1 = %g in the liquid at 20 C", r)
	}
	if r := c.Conductivity*1e3/(waterLambda0(tb)*waterLambda1(tb, rb)) - 1; math.Abs(r) > 1e-6 {
		t.Errorf("lambda2/lambda = %g in the liquid at 20 C", r)
	}
}

func TestWaterSurfaceTension(t *testing.T) {
	t.Parallel()
	f := lookup(t, "water")
	for _, c := range []struct {
		T, want, tol float64 // K, mN/m
		src          string
	}{
		{293.15, 72.74, 0.01, "shared/reference/water-transport-iapws.md (R1-76)"},
		{273.16, 75.65, 0.01, "IAPWS R1-76(2014) table, 0.01 C (recalled from memory)"},
		{298.15, 71.97, 0.01, "IAPWS R1-76(2014) table, 25 C (recalled from memory)"},
		{373.15, 58.91, 0.01, "IAPWS R1-76(2014) table, 100 C (recalled from memory)"},
		{waterTc, 0, 0, "vanishes at the critical point (common practice, no source)"},
	} {
		got, err := SurfaceTension(f, c.T)
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(got*1e3-c.want) > c.tol {
			t.Errorf("SurfaceTension(water, %g K) = %.5f mN/m, want %g (%s)", c.T, got*1e3, c.want, c.src)
		}
	}
	// Common practice, no source: about 72.7 mN/m near 20 °C.
	if s, _ := SurfaceTension(f, 293.15); math.Abs(s-72.7e-3) > 0.3e-3 {
		t.Errorf("sigma(20 C) = %g N/m, want about 72.7e-3", s)
	}
	for _, T := range []float64{248.14, waterTc + 1e-9} {
		if _, err := SurfaceTension(f, T); !errors.Is(err, fluid.ErrOutOfRange) {
			t.Errorf("SurfaceTension(water, %g K): err = %v, want ErrOutOfRange", T, err)
		}
	}
}
