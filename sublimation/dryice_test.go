package sublimation

import (
	"math"
	"testing"
)

const mCO2 = 44.0098e-3 // kg/mol, Span–Wagner 1996

// TestDryIceTriple: the three phases meet where the Span–Wagner
// equation's own saturation is at 216.592 K, 0.517964 MPa (DESIGN.md;
// shared/reference/co2-span-wagner-1996.md), with three-phase Gibbs
// equality, and the stored fluid.Triple constants of CO2 agree at their
// printed digits.
func TestDryIceTriple(t *testing.T) {
	t.Parallel()
	s := mustSolid(t, "CO2")
	tp, err := s.Triple()
	if err != nil {
		t.Fatal(err)
	}
	checkTriple(t, s, tp, 216.592, 1e-9, 0.517964e6, 1)
	sat, err := s.Fluid().SaturationAtT(216.592)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(sat.P-tp.P) > 1e-9*tp.P {
		t.Errorf("triple pressure %.10g Pa, fluid saturation at 216.592 K %.10g Pa", tp.P, sat.P)
	}
	st := s.Fluid().Triple()
	for _, c := range []struct {
		name          string
		got, want, ul float64
	}{
		{"T", tp.T, st.T, 1e-9},
		{"P", tp.P, st.P, 1},
		{"RhoLiquid", tp.Liquid.Rho, st.RhoLiquid, 1e-3},
		{"RhoVapor", tp.Vapor.Rho, st.RhoVapor, 1e-4},
		{"RhoSolid", tp.Solid.Rho, st.RhoSolid, 0.01},
	} {
		if !digits(c.got, c.want, c.ul) {
			t.Errorf("CO2 fluid.Triple().%s = %.12g, models meet at %.12g", c.name, c.want, c.got)
		}
	}
}

// TestDryIceSublimationSW bounds the deviation of the Gibbs-equality
// sublimation curve from the Span–Wagner sublimation equation (1996,
// Section 3) over 150–216.592 K. The paper's stated uncertainty is not
// recalled; the bound 2e-3 is of the order of the scatter of the
// sublimation-pressure data it rests on (from memory).
func TestDryIceSublimationSW(t *testing.T) {
	t.Parallel()
	s := mustSolid(t, "CO2")
	worst := 0.0
	for T := 150.0; T <= 216.592; T += 0.5 {
		c, err := s.SublimationPressure(T)
		if err != nil {
			t.Fatal(err)
		}
		pa, _ := s.Fluid().AuxSublimationPressure(T)
		worst = math.Max(worst, math.Abs(c.P/pa-1))
	}
	if worst > 2e-3 {
		t.Errorf("worst |p/p_SW - 1| = %.3g > 2e-3", worst)
	}
	t.Logf("sublimation 150-216.592 K: worst |p/p_SW - 1| = %.2g", worst)
}

// TestDryIceMeltingSW bounds the deviation of the Gibbs-equality melting
// curve from the Span–Wagner melting equation up to 800 MPa: in melting
// temperature at the published pressure within 0.1 K (the scatter of
// melting-temperature data at high pressure is of this order, common
// practice, no source), and in pressure within 0.2 % above 240 K.
func TestDryIceMeltingSW(t *testing.T) {
	t.Parallel()
	s := mustSolid(t, "CO2")
	f := s.Fluid()
	worstT, worstP := 0.0, 0.0
	for T := 216.7; T <= 327.6; T += 0.5 {
		pa, err := f.AuxMeltingPressure(T)
		if err != nil {
			t.Fatal(err)
		}
		c, err := s.MeltingTemperature(pa)
		if err != nil {
			t.Fatal(err)
		}
		worstT = math.Max(worstT, math.Abs(c.T-T))
		if T >= 240 {
			m, err := s.MeltingPressure(T)
			if err != nil {
				t.Fatal(err)
			}
			worstP = math.Max(worstP, math.Abs(m.P/pa-1))
		}
	}
	if worstT > 0.1 || worstP > 2e-3 {
		t.Errorf("melting: worst |dT| = %.3g K (bound 0.1), worst |p/p_SW - 1| above 240 K = %.3g (bound 2e-3)", worstT, worstP)
	}
	t.Logf("melting: worst |dT| = %.2g K, worst |dp/p| (T >= 240 K) = %.2g", worstT, worstP)
	// Melting above the critical temperature (solid with dense fluid).
	c, err := s.MeltingPressure(310)
	if err != nil || c.Fluid.Rho < 1000 {
		t.Errorf("melting at 310 K > Tc: %+v, %v", c.Fluid, err)
	}
}

// TestDryIceMeasured checks the model against measured and handbook
// values (sources beside each).
func TestDryIceMeasured(t *testing.T) {
	t.Parallel()
	s := mustSolid(t, "CO2")
	// Normal sublimation temperature 194.69 K (−78.46 °C) at 101.325 kPa:
	// Span–Wagner sublimation equation 194.6855 K
	// (shared/reference/co2-solid-consistency.md), handbooks 194.69 K.
	c, err := s.SublimationTemperature(101325)
	if err != nil {
		t.Fatal(err)
	}
	tsub := c.T
	if math.Abs(c.T-194.69) > 0.01 {
		t.Errorf("normal sublimation temperature %.5g K, want 194.69 K ± 0.01", c.T)
	}
	// Enthalpy of sublimation 25.23 kJ/mol at 194.7 K (calorimetry,
	// Giauque and Egan 1937, from memory): within 1 %.
	c, err = s.SublimationPressure(194.7)
	if err != nil {
		t.Fatal(err)
	}
	dh := (c.Fluid.H - c.Solid.H) * mCO2
	if math.Abs(dh/25230-1) > 0.01 {
		t.Errorf("enthalpy of sublimation at 194.7 K %.5g J/mol, want 25230 within 1 %%", dh)
	}
	// Dry-ice density about 1.56 g/cm³ near 195 K (from memory): within 2 %.
	p, err := s.Props(195, 101325)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(p.Rho/1560-1) > 0.02 {
		t.Errorf("density at 195 K %.5g kg/m3, want 1560 within 2 %%", p.Rho)
	}
	// Solid heat capacity near 190 K roughly 50–58 J/(mol·K) (Giauque
	// and Egan 1937, from memory).
	p, _ = s.Props(190, 101325)
	if cp := p.Cp * mCO2; cp < 50 || cp > 58 {
		t.Errorf("cp at 190 K %.4g J/(mol K), want 50-58", cp)
	}
	// Enthalpy of fusion at the triple point 8.3–9.0 kJ/mol (literature,
	// from memory; co2-solid-consistency.md).
	tp, _ := s.Triple()
	if hf := (tp.Liquid.H - tp.Solid.H) * mCO2; hf < 8300 || hf > 9000 {
		t.Errorf("enthalpy of fusion %.5g J/mol, want 8300-9000", hf)
	}
	t.Logf("T_sub(1 atm) %.5f K, dh_sub(194.7 K) %.1f J/mol", tsub, dh)
}

// TestDryIceBeyond800MPa: the model's data end at 800 MPa.
func TestDryIceBeyond800MPa(t *testing.T) {
	t.Parallel()
	s := mustSolid(t, "CO2")
	if _, err := s.Props(250, 801e6); err == nil {
		t.Error("Props at 801 MPa: no error")
	}
	if _, err := s.MeltingTemperature(801e6); err == nil {
		t.Error("MeltingTemperature at 801 MPa: no error")
	}
	if _, err := s.Props(250, 800e6); err != nil {
		t.Error(err)
	}
}
