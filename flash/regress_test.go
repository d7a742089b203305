package flash

import (
	"math"
	"testing"
)

// TestDUWarmStartNeverHurts: a guess from a distant state once made DU
// fail where the cold flash succeeds (CO2 two-phase at 298 K from a
// supercritical guess; inputs found by the vent example). A warm start
// must give the cold flash's state.
func TestDUWarmStartNeverHurts(t *testing.T) {
	t.Parallel()
	f := mustFluid(t, "CO2")
	g, err := DT(f, 632.5282450825886, 301.57046037278974)
	if err != nil {
		t.Fatal(err)
	}
	const rho, u = 537.5192932, -224145.93792426802
	cold, err := DU(f, rho, u)
	if err != nil {
		t.Fatal(err)
	}
	warm, err := DUWith(f, rho, u, Options{Guess: &g})
	if err != nil {
		t.Fatalf("warm-started DU: %v", err)
	}
	if warm.Phase != cold.Phase || math.Abs(warm.T-cold.T) > 1e-9*cold.T {
		t.Errorf("warm %v at %v K, cold %v at %v K", warm.Phase, warm.T, cold.Phase, cold.T)
	}
}

// TestDUNearCritical: 1 µK below Tc on a near-critical isochore of CO2
// (inputs found by the vent example at 23.4 kg in 50 L and 31 °C), where
// the equation fixes the saturated densities only loosely, DU returns the
// two-phase state instead of failing, reproducing u within the scatter of
// the near-critical saturation (1e-9·R·Tc) and ρ exactly.
func TestDUNearCritical(t *testing.T) {
	t.Parallel()
	f := mustFluid(t, "CO2")
	const rho, u = 467.72037743417383, -190335.84478071507
	st, err := DU(f, rho, u)
	if err != nil {
		t.Fatal(err)
	}
	c := f.Critical()
	if st.Phase != TwoPhase || !(c.T-st.T < 1e-3) {
		t.Errorf("%v at %v K", st.Phase, st.T)
	}
	if d := math.Abs(st.U - u); d > 1e-9*f.GasConstant()*c.T {
		t.Errorf("|du| = %g J/kg", d)
	}
	if math.Abs(st.Rho-rho) > 1e-10*rho {
		t.Errorf("rho = %v", st.Rho)
	}
}
