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
