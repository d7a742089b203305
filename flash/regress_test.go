package flash

import (
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
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
// two-phase state instead of failing, reproducing u and ρ within the
// bounds of DESIGN.md (|Δu| ≤ 1e-10·max(|u|, R·Tc)).
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
	if d := math.Abs(st.U - u); d > 1e-10*max(math.Abs(u), f.GasConstant()*c.T) {
		t.Errorf("|du| = %g J/kg", d)
	}
	if math.Abs(st.Rho-rho) > 1e-10*rho {
		t.Errorf("rho = %v", st.Rho)
	}
}

// checkMixture asserts that the phases of a liquid–vapour state coexist:
// equal pressures within DESIGN.md's backward-residual bound of p and
// Gibbs energies within 1e-11·RT (the bound of the reliability sweep).
func checkMixture(t *testing.T, f *fluid.Fluid, st *State) {
	t.Helper()
	if st.Phase != TwoPhase {
		return
	}
	l, v := &st.Phases[0], &st.Phases[1]
	pl, err1 := f.Props(st.T, l.Rho)
	pv, err2 := f.Props(st.T, v.Rho)
	if err1 != nil || err2 != nil {
		t.Fatalf("phases: %v, %v", err1, err2)
	}
	RT := f.GasConstant() * st.T
	for _, p := range []fluid.Props{pl, pv} {
		if b := 1e-10*st.P + 1e-12*l.Rho*RT; math.Abs(p.P-st.P) > b {
			t.Errorf("a phase at p = %.17g, the state at %.17g", p.P, st.P)
		}
	}
	if d := math.Abs(pl.G-pv.G) / RT; d > 1e-11 {
		t.Errorf("|g' - g''|/RT = %.3g", d)
	}
}

// TestDUNearCriticalBound: within a millikelvin of Tc the mixture's u,
// computed from the saturation at each T, scatters between neighbouring
// temperatures by more than the backward-residual floor, so that DU
// either missed u by up to 400 bounds or did not converge. DU now solves
// the mixture within the band the equation leaves (Newton's method on the
// phases' equilibrium and u) and must reproduce ρ and u within the bounds
// of DESIGN.md, |Δu| ≤ 1e-10·max(|u|, R·Tc), |Δρ| ≤ 1e-10·ρ, with
// coexisting phases. Inputs found by the reliability sweep
// (internal/sweep) and its failure report.
func TestDUNearCriticalBound(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		fluid  string
		rho, u float64
	}{
		{"CO2", 464.74994607647, -189730.28805628474},   // u off by 4.3 bounds
		{"CO2", 467.9118113211362, -190374.90589903714}, // no convergence
		{"CO2", 471.2236184879813, -191044.4313927422},  // no convergence, q = 1e-9
		{"CO2", 466.8167325073696, -190151.84003884604}, // report A3: u off by 370 bounds
		{"CO2", 469.1729663113487, -190630.46163631295}, // report A3: no convergence
		{"water", 321.78331006898617, 2.0160485351857482e+06},
		{"water", 322.8825077598734, 2.014452204232689e+06},  // no convergence, q = 0
		{"water", 322.4324773216858, 2.0151055110903697e+06}, // report A3: off by 11 bounds
		{"R134a", 512.2896267875894, 381671.2102226779},
		{"R134a", 511.50464337896807, 381753.0092805155}, // no convergence
	} {
		f := mustFluid(t, c.fluid)
		st, err := DU(f, c.rho, c.u)
		if err != nil {
			t.Errorf("%s DU(%v, %v): %v", c.fluid, c.rho, c.u, err)
			continue
		}
		tc := f.Critical().T
		if b := 1e-10 * max(math.Abs(c.u), f.GasConstant()*tc); math.Abs(st.U-c.u) > b {
			t.Errorf("%s DU(%v, %v): u off by %.3g (bound %.3g)", c.fluid, c.rho, c.u, st.U-c.u, b)
		}
		if math.Abs(st.Rho-c.rho) > 1e-10*c.rho {
			t.Errorf("%s DU(%v, %v): rho = %.17g", c.fluid, c.rho, c.u, st.Rho)
		}
		if !(tc-st.T < 1e-3) {
			t.Errorf("%s DU(%v, %v): T = %v, Tc = %v", c.fluid, c.rho, c.u, st.T, tc)
		}
		checkMixture(t, f, &st)
	}
}

// TestHSOnTheTripleTieLine: (h, s) of R-134a's saturated liquid at its
// triple point lies exactly on the first tie line of the saturation
// nodes (φ = 0 at the first node), where HS indexed the node before the
// first and panicked (found by the reliability sweep from
// TQ(169.85000000269193, 0)). It must return that state.
func TestHSOnTheTripleTieLine(t *testing.T) {
	t.Parallel()
	f := mustFluid(t, "R134a")
	for _, hs := range [][2]float64{
		{71454.9939724412, 412.61701661926224},
		{71455.03123513573, 412.6172360051588},
	} {
		st, err := HS(f, hs[0], hs[1])
		if err != nil {
			t.Errorf("HS(%v, %v): %v", hs[0], hs[1], err)
			continue
		}
		if math.Abs(st.H-hs[0]) > 1e-10*max(math.Abs(hs[0]), f.GasConstant()*f.Critical().T) ||
			math.Abs(st.S-hs[1]) > 1e-10*max(math.Abs(hs[1]), f.GasConstant()) {
			t.Errorf("HS(%v, %v) = h %v, s %v", hs[0], hs[1], st.H, st.S)
		}
	}
}
