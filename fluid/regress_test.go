package fluid

import (
	"errors"
	"math"
	"testing"
)

// TestPropsTPNoUnresolvableRoot: far below Tc the nonanalytic terms of
// IAPWS-95 make p(ρ) rise by about 1e25 Pa per kg/m³ next to ρc, so that
// p jumps by orders of magnitude between neighbouring floating-point
// densities. The vapour-branch search once closed on that jump and
// returned ρ = 322 kg/m³ with g = −2.9e23 J/kg as the vapour root, and as
// the stable root (the failure report of the reliability sweep, item E;
// water at 260.4 K and 34.7 MPa). There is no vapour root there: the
// stable root is the liquid (about 1016 kg/m³), and RootVapor is refused
// as beyond the vapour spinodal.
func TestPropsTPNoUnresolvableRoot(t *testing.T) {
	t.Parallel()
	f, err := Lookup("water")
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range [][2]float64{
		{260.40658793022465, 3.474405494398e+07},
		{270.1199531683596, 3.7959512945656404e+07}, // liquid above ice Ih's melting curve
	} {
		T, p := c[0], c[1]
		st, err := f.PropsTP(T, p, RootStable, 0)
		if err != nil || st.Rho < 1000 || st.Flags&Metastable != 0 {
			t.Errorf("PropsTP(%v, %v, RootStable) = rho %v, flags %v, %v; want the stable liquid", T, p, st.Rho, st.Flags, err)
		}
		if math.Abs(st.P-p) > 1e-10*p+1e-12*st.Rho*f.GasConstant()*T {
			t.Errorf("PropsTP(%v, %v): p = %v", T, p, st.P)
		}
		if v, err := f.PropsTP(T, p, RootVapor, 0); !errors.Is(err, ErrUnstable) {
			t.Errorf("PropsTP(%v, %v, RootVapor) = rho %v, %v; want ErrUnstable", T, p, v.Rho, err)
		}
	}
}

// TestPropsTPAtTheCeiling: at exactly the accepted pressure ceiling the
// root's p may round above it; PropsTP must accept the input it was
// given (R-134a at 70 MPa, the reproducer of the reliability round's
// brief; CO2 at 10 GPa and 2000 K, found by the sweep).
func TestPropsTPAtTheCeiling(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		fluid string
		T     float64
	}{{"R134a", 188.41370179413101}, {"CO2", 1999.999998}, {"water", 1273}} {
		f, err := Lookup(c.fluid)
		if err != nil {
			t.Fatal(err)
		}
		p := f.Limits().PCeil
		st, err := f.PropsTP(c.T, p, RootStable, 0)
		if err != nil {
			t.Errorf("%s PropsTP(%v, %v): %v", c.fluid, c.T, p, err)
			continue
		}
		if math.Abs(st.P-p) > 1e-10*p+1e-12*st.Rho*f.GasConstant()*c.T {
			t.Errorf("%s PropsTP(%v, %v): p = %v", c.fluid, c.T, p, st.P)
		}
	}
}

// TestPropsTPAtTheSpinodal: liquid CO2 0.1 K below Tc at a pressure
// within rounding of its liquid spinodal's (the state DT gives at
// 498.83136700035953 kg/m³, 1e-6 of the gap from the spinodal; the
// sweep). p(ρ) there is flat to below rounding over 3e-5 kg/m³, and no
// stable density shows a pressure below the target: the root is the
// stable density closest to it, not "below the spinodal".
func TestPropsTPAtTheSpinodal(t *testing.T) {
	t.Parallel()
	f, err := Lookup("CO2")
	if err != nil {
		t.Fatal(err)
	}
	const T, p = 304.02819999999997, 7.359810229726279e+06
	st, err := f.PropsTP(T, p, RootLiquid, 0)
	if err != nil || math.Abs(st.Rho-498.8313) > 1e-3 || !(st.DpDrho > 0) {
		t.Fatalf("PropsTP(%v, %v, RootLiquid) = rho %v, dp/drho %v, %v", T, p, st.Rho, st.DpDrho, err)
	}
	if math.Abs(st.P-p) > 1e-14*p {
		t.Errorf("PropsTP(%v, %v): p = %v", T, p, st.P)
	}
	// Beyond it by more than rounding: refused.
	if _, err := f.PropsTP(T, p*(1-1e-9), RootLiquid, 0); !errors.Is(err, ErrUnstable) {
		t.Errorf("PropsTP below the spinodal pressure: %v, want ErrUnstable", err)
	}
}
