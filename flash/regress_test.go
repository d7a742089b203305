package flash

import (
	"errors"
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

// TestPDWarmStartNearCritical: the sweep's warm-started inverse flashes
// (inputs and guesses are its states) found PD failing next to the
// critical point of R-134a where the cold flash succeeds: at the critical
// point itself from a guess at it, and for a liquid 37 mK below Tc, just
// denser than the saturated liquid, from a saturated liquid 0.34 K colder
// (that guess lies inside the dome on the state's isochore). A warm start
// must give the cold flash's state.
func TestPDWarmStartNearCritical(t *testing.T) {
	t.Parallel()
	f := mustFluid(t, "R134a")
	crit, err := DT(f, 511.94511327430297, 374.21196658494847)
	if err != nil {
		t.Fatal(err)
	}
	sat, err := TQ(f, 373.83775461836353, 0)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		p, rho float64
		guess  *State
	}{
		{4.0592763737311135e+06, 511.94511327430297, &crit},
		{4.0561451963235177e+06, 548.1240283425557, &sat},
	} {
		cold, err := PD(f, c.p, c.rho)
		if err != nil {
			t.Fatal(err)
		}
		warm, err := PDWith(f, c.p, c.rho, Options{Guess: c.guess})
		if err != nil {
			t.Errorf("p = %v, rho = %v from a guess at %v K: %v", c.p, c.rho, c.guess.T, err)
			continue
		}
		if warm.Phase != cold.Phase || math.Abs(warm.T-cold.T) > 1e-9*cold.T {
			t.Errorf("p = %v, rho = %v: warm %v at %v K, cold %v at %v K", c.p, c.rho, warm.Phase, warm.T, cold.Phase, cold.T)
		}
	}
}

// TestHSWarmStartNearCritical: HS warm-started from a single phase within
// microkelvins of CO2's critical point, at (h, s) of a mixture there
// (q 0.99), gave a vapour whose h and s match the mixture's to rounding
// when the warm start was tried before the placements by the nodes (the
// sweep's warm inverses found it): next to the critical point the
// placements decide first.
func TestHSWarmStartNearCritical(t *testing.T) {
	t.Parallel()
	f := mustFluid(t, "CO2")
	g, err := DT(f, 464.80750756296044, 304.12818814028986)
	if err != nil {
		t.Fatal(err)
	}
	h, s := -173958.36441557808, -1303.4862165770776
	cold, err := HS(f, h, s)
	if err != nil {
		t.Fatal(err)
	}
	warm, err := HSWith(f, h, s, Options{Guess: &g})
	if err != nil || warm.Phase != cold.Phase || math.Abs(warm.T-cold.T) > 1e-9*cold.T {
		t.Errorf("warm %v at %v K (%v), cold %v at %v K", warm.Phase, warm.T, err, cold.Phase, cold.T)
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

// TestPTBesideTheSublimationCurve: just below the triple point, between
// the node bounds of the sublimation curve, the vapour root is
// metastable against the supercooled liquid, and PT refused with "the
// stable state is Liquid, not the requested Unknown" (found by the
// reliability sweep; the failure report, item D). Below the triple point
// the liquid lies above the solid in Gibbs energy: the solid is stable,
// and so by the model's own Gibbs energies.
func TestPTBesideTheSublimationCurve(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		fluid string
		p, T  float64
	}{
		{"CO2", 517653.9460654438, 216.46215650725492},
		{"CO2", 517964.4412205257, 216.59199315075958},
		{"water", 605.53822329, 272.9962448821829},
	} {
		f := mustFluid(t, c.fluid)
		st, err := PT(f, c.p, c.T)
		if err != nil || st.Phase != Solid {
			t.Errorf("%s PT(%v, %v) = %v, %v; want Solid", c.fluid, c.p, c.T, st.Phase, err)
			continue
		}
		s := mustSolid(t, f)
		sp, err := s.Props(c.T, c.p)
		if err != nil {
			t.Fatal(err)
		}
		for _, root := range []fluid.Root{fluid.RootLiquid, fluid.RootVapor} {
			if pr, err := f.PropsTP(c.T, c.p, root, 0); err == nil && pr.G < sp.G {
				t.Errorf("%s PT(%v, %v): the fluid root %v has the lower Gibbs energy", c.fluid, c.p, c.T, root)
			}
		}
	}
}

// TestOnTheTripleLineFromBelow: a temperature 1e-13 below Tt lies on the
// triple line (within the precision of the stored constant), where TS
// refused the vapour because the fluid path asked for the saturation
// below Tt (found by the reliability sweep from PT(512784.813024,
// 216.59199999997836); the failure report, item C).
func TestOnTheTripleLineFromBelow(t *testing.T) {
	t.Parallel()
	f := mustFluid(t, "CO2")
	const T = 216.59199999997836
	for _, p := range []float64{512784.81302400003, 517653.9460654438} {
		v, err := PT(f, p, T)
		if err != nil || v.Phase != Vapor {
			t.Fatalf("PT(%v, %v) = %v, %v", p, T, v.Phase, err)
		}
		st, err := TS(f, T, v.S)
		if err != nil {
			t.Errorf("TS(%v, %v): %v", T, v.S, err)
			continue
		}
		if st.Phase != Vapor || math.Abs(st.P-p) > 1e-10*p+1e-12*st.Rho*f.GasConstant()*T {
			t.Errorf("TS(%v, %v) = %v at %v Pa, want the vapour at %v Pa", T, v.S, st.Phase, st.P, p)
		}
	}
}

// TestR134aTripleBand: R-134a has no solid model; its liquid–vapour
// states end at its equation's own vapour pressure at Tt, 389.5638 Pa,
// below the published 389.6 Pa that Triple().P keeps. PH and PS between
// them, and PQ at the equation's pressure (to its precision, which the
// saturated liquid's own pressure sets at about 6e-10 relative), refused
// the states as solid (the failure report, item D; the sweep).
func TestR134aTripleBand(t *testing.T) {
	t.Parallel()
	f := mustFluid(t, "R134a")
	if tp := f.Triple(); tp.P != 389.6 {
		t.Errorf("Triple().P = %v, want the published 389.6 Pa (Tillner-Roth and Baehr 1994, from memory)", tp.P)
	}
	sat, err := f.SaturationAtT(f.Triple().T)
	if err != nil {
		t.Fatal(err)
	}
	liq, err := TQ(f, f.Triple().T, 0)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		name string
		st   func() (State, error)
		want Phase
	}{
		{"PH in the band", func() (State, error) { return PH(f, 389.5999999449016, 71454.99398560649) }, Liquid},
		{"PS in the band", func() (State, error) { return PS(f, 389.5999999449016, liq.S) }, Liquid},
		{"PQ at the equation's pressure", func() (State, error) { return PQ(f, sat.P, 0) }, Liquid},
		{"PH of TQ(Tt, 0)", func() (State, error) { return PH(f, liq.P, liq.H) }, Liquid},
		{"PQ of TQ(Tt, 0)", func() (State, error) { return PQ(f, liq.P, 0) }, Liquid},
	} {
		st, err := c.st()
		if err != nil || st.Phase != c.want {
			t.Errorf("%s: %v, %v; want %v", c.name, st.Phase, err, c.want)
		}
	}
	// The report's PQ(389.5637885098052, 0) was at the saturated liquid's
	// own pressure at Tt, which TQ then returned: 2.4e-10 below the
	// equation's vapour pressure there, further than the precision of the
	// triple line (1e-10), it lies in the solid region.
	for _, p := range []float64{389.5637885098052, sat.P * (1 - 1e-8)} {
		if _, err := PQ(f, p, 0); !errors.Is(err, fluid.ErrUndefined) {
			t.Errorf("PQ(%v, 0) below the triple line: %v, want ErrUndefined", p, err)
		}
	}
}

// TestInputPressureKept: a flash at given pressure (PT, PH, PS) returns
// that pressure as P, and TQ and PQ the saturation pressure for a
// saturated phase as for a mixture. The equation's own p at the solved
// density of a dense liquid scatters by about 1e-13·ρRT (4e-8 of p for
// water at its triple point), and states that carried it were placed on
// the other side of the triple line by the next flash (the sweep: PH of
// PT(611.654771283905, 273.1600000000273) gave ice and vapour).
func TestInputPressureKept(t *testing.T) {
	t.Parallel()
	w := mustFluid(t, "water")
	for _, c := range [][2]float64{{611.654771283905, 273.1600000004557}, {1e5, 300}, {3e7, 280}} {
		st, err := PT(w, c[0], c[1])
		if err != nil {
			t.Fatal(err)
		}
		if st.P != c[0] {
			t.Errorf("PT(%v, %v).P = %v", c[0], c[1], st.P)
		}
		for _, fl := range []struct {
			name string
			fn   func() (State, error)
		}{{"PH", func() (State, error) { return PH(w, st.P, st.H) }}, {"PS", func() (State, error) { return PS(w, st.P, st.S) }}} {
			got, err := fl.fn()
			if err != nil || got.Phase != st.Phase || got.P != st.P {
				t.Errorf("%s of PT(%v, %v) = %v at %v Pa, %v; want %v at %v Pa", fl.name, c[0], c[1], got.Phase, got.P, err, st.Phase, st.P)
			}
		}
	}
	for _, T := range []float64{273.1600000043293, 300, 600} {
		l, err1 := TQ(w, T, 0)
		v, err2 := TQ(w, T, 1)
		m, err3 := TQ(w, T, 0.5)
		if err1 != nil || err2 != nil || err3 != nil {
			t.Fatal(err1, err2, err3)
		}
		if l.P != m.P || v.P != m.P {
			t.Errorf("TQ(%v, 0, 0.5, 1).P = %v, %v, %v", T, l.P, m.P, v.P)
		}
		if q, err := PQ(w, l.P, 0); err != nil || q.Phase != Liquid {
			t.Errorf("PQ of TQ(%v, 0): %v, %v", T, q.Phase, err)
		}
	}
}

// TestPHAtTheCeiling: at exactly the accepted 10 GPa of CO2 the density
// search of PH refused every temperature (fluid.PropsTP found p a
// rounding above the ceiling), and PH did not converge (the sweep).
func TestPHAtTheCeiling(t *testing.T) {
	t.Parallel()
	f := mustFluid(t, "CO2")
	const p, h = 1e10, 7.177358088180827e+06
	st, err := PH(f, p, h)
	if err != nil {
		t.Fatal(err)
	}
	if st.P != p || math.Abs(st.H-h) > 1e-10*math.Abs(h) {
		t.Errorf("PH(%v, %v) = p %v, h %v", p, h, st.P, st.H)
	}
}

// TestDUMetastable: DU with a metastable phase requested refused states
// that DT returns with the same request (the failure report, item A2,
// and the sweep): a start from far off stepped over the narrow band of
// the isochore between its crossing with the saturated phase and the
// spinodal, and supercooled water's isochore, whose pressure falls below
// zero as T rises below the density maximum, has its usable states in
// pieces. Each must come back at the temperature of its DT.
func TestDUMetastable(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		fluid  string
		rho, T float64
		phase  Phase
	}{
		{"CO2", 523.7224927396456, 304.0282, Liquid},
		{"CO2", 433.5617406094637, 304.0282, Vapor},
		{"water", 355.0426862248298, 646.996, Liquid},
	} {
		f := mustFluid(t, c.fluid)
		opt := Options{Phase: c.phase, AllowMetastable: true}
		dt, err := DTWith(f, c.rho, c.T, opt)
		if err != nil {
			t.Fatal(err)
		}
		st, err := DUWith(f, c.rho, dt.U, opt)
		if err != nil {
			t.Errorf("%s DU(%v, %v): %v", c.fluid, c.rho, dt.U, err)
			continue
		}
		if st.Phase != c.phase || st.Flags&Metastable == 0 || math.Abs(st.T-c.T) > 1e-9*c.T {
			t.Errorf("%s DU(%v, %v) = %v at %v K, flags %v; want metastable %v at %v K", c.fluid, c.rho, dt.U,
				st.Phase, st.T, st.Flags, c.phase, c.T)
		}
	}
	// Supercooled water at 234.4 K and 618 Pa (the sweep).
	w := mustFluid(t, "water")
	opt := Options{Phase: Liquid, AllowMetastable: true}
	pt, err := PTWith(w, 617.77131871, 234.42823529411766, opt)
	if err != nil {
		t.Fatal(err)
	}
	st, err := DUWith(w, pt.Rho, pt.U, opt)
	if err != nil || st.Flags&Metastable == 0 || math.Abs(st.T-pt.T) > 1e-9*pt.T {
		t.Errorf("DU of supercooled water: %v at %v K, flags %v, %v", st.Phase, st.T, st.Flags, err)
	}
}

// TestPDTripleWater: PD of water's saturated liquid at the triple point
// refused it ("no state of water with this pressure and density"; the
// failure report, item B, and the sweep), and a liquid at the triple-point
// pressure denser than that liquid — above Tt, below the density maximum
// (about 277 K) — was not found: the fluid path looked for it below the
// saturation temperature only. The first must come back as the saturated
// liquid at the triple point, the second as the liquid of lowest T with
// that density (IAPWS-95 at 611.654771 Pa: about 274.1 K), and a density
// above the liquid's maximum there has no state.
func TestPDTripleWater(t *testing.T) {
	t.Parallel()
	w := mustFluid(t, "water")
	tp := w.Triple()
	l, err := TQ(w, tp.T, 0) // the models' triple point (Triple() rounds its densities)
	if err != nil {
		t.Fatal(err)
	}
	for _, p := range []float64{611.6547710075598, 611.654771} {
		st, err := PD(w, p, l.Rho)
		if err != nil || st.Phase != Liquid || math.Abs(st.T-tp.T) > 1e-9*tp.T {
			t.Errorf("PD(%v, %v) = %v at %v K, %v; want the liquid at Tt", p, l.Rho, st.Phase, st.T, err)
		}
	}
	// The report's PD(611.654765100373, ...) was at the saturated
	// liquid's own pressure, which TQ then returned: 1e-8 below the
	// triple point, beyond its precision, where no state is that dense.
	if _, err := PD(w, 611.654765100373, l.Rho); !errors.Is(err, fluid.ErrOutOfRange) {
		t.Errorf("PD below the triple line: %v, want ErrOutOfRange", err)
	}
	st, err := PD(w, tp.P, 999.85)
	if err != nil || st.Phase != Liquid || !(st.T > tp.T && st.T < 277) {
		t.Errorf("PD(%v, 999.85) = %v at %v K, %v; want the liquid between Tt and 277 K", tp.P, st.Phase, st.T, err)
	} else if math.Abs(st.Rho-999.85) > 1e-10*999.85 || math.Abs(st.P-tp.P) > 1e-10*tp.P+1e-12*st.Rho*w.GasConstant()*st.T {
		t.Errorf("PD(%v, 999.85) = p %v, rho %v", tp.P, st.P, st.Rho)
	}
	if _, err := PD(w, tp.P, 1000.5); err == nil {
		t.Errorf("PD(%v, 1000.5): a state above the liquid's density maximum", tp.P)
	}
}

// TestPDNearCritical: next to the critical point the isotherms are nearly
// flat and the saturated densities fixed only loosely, and PD of a state
// just outside them looked for it below the saturation temperature only
// and did not converge (the failure report, item B; the sweep: DT at Tc,
// PQ of the saturated liquid within 0.1 µK of Tc).
func TestPDNearCritical(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		fluid  string
		p, rho float64
	}{
		{"CO2", 7.377300000000077e+06, 467.6012745828625},
		{"CO2", 7.377299982558742e+06, 467.9436635045589},
		{"R134a", 4.059276373731113e+06, 511.9452673454299},
		{"R134a", 4.059276364105091e+06, 512.0124593341232},
	} {
		f := mustFluid(t, c.fluid)
		st, err := PD(f, c.p, c.rho)
		if err != nil {
			t.Errorf("%s PD(%v, %v): %v", c.fluid, c.p, c.rho, err)
			continue
		}
		if !(math.Abs(st.T-f.Critical().T) < 5e-3) || math.Abs(st.Rho-c.rho) > 1e-10*c.rho ||
			math.Abs(st.P-c.p) > 1e-10*c.p+1e-12*c.rho*f.GasConstant()*st.T {
			t.Errorf("%s PD(%v, %v) = T %v, p %v, rho %v", c.fluid, c.p, c.rho, st.T, st.P, st.Rho)
		}
	}
}

// TestAtTheVapourFloor: CO2 at the sublimation pressure of its 150 K
// vapour floor, which the states there carry to rounding (843.607177066
// Pa, from the node table, the curve solver and the states built on it):
// PD of the saturated solid and of a solid–vapour mixture did not
// converge (the failure report, item B), and PQ a part in 1e9 below the
// floor returned the floor's state, 10 bounds off in p (item D); it is
// refused now, as below the floor.
func TestAtTheVapourFloor(t *testing.T) {
	t.Parallel()
	f := mustFluid(t, "CO2")
	const p = 843.6071770655553
	for _, rho := range []float64{1617.4954499340759, 0.05956349059202698, 0.029782293685102216} {
		st, err := PD(f, p, rho)
		if err != nil || st.T != 150 || math.Abs(st.Rho-rho) > 1e-10*rho {
			t.Errorf("PD(%v, %v) = %v at %v K, rho %v, %v", p, rho, st.Phase, st.T, st.Rho, err)
		}
	}
	if st, err := PQ(f, 843.6071762227535, 1); !errors.Is(err, fluid.ErrOutOfRange) {
		t.Errorf("PQ below the floor = %v at %v Pa, %v; want ErrOutOfRange", st.Phase, st.P, err)
	}
	for _, q := range []float64{0, 0.5, 1} {
		st, err := PQ(f, p, q)
		if err != nil || math.Abs(st.P-p) > 1e-10*p {
			t.Errorf("PQ(%v, %v) = p %v, %v", p, q, st.P, err)
		}
	}
}

// TestPTAt800MPa: the dry-ice model ends at 800 MPa, and its node table
// at the melting curve's pressure solved there, 1e-15 below: PT at
// exactly 800 MPa refused the metastable liquid as beyond the model (the
// failure report, item D). DESIGN.md rules out states above 800 MPa only.
func TestPTAt800MPa(t *testing.T) {
	t.Parallel()
	f := mustFluid(t, "CO2")
	st, err := PTWith(f, 8e8, 216.592, Options{Phase: Liquid, AllowMetastable: true})
	if err != nil || st.Phase != Liquid || st.Flags&Metastable == 0 {
		t.Errorf("PT(8e8, 216.592, metastable liquid) = %v, %v, %v", st.Phase, st.Flags, err)
	}
	st, err = PT(f, 8e8, 216.592)
	if err != nil || st.Phase != Solid {
		t.Errorf("PT(8e8, 216.592) = %v, %v; want dry ice", st.Phase, err)
	}
}

// TestPQOnTheTripleLine: TQ a part in 1e11 above Tt gives the vapour
// pressure 1.5e-10 above the models' triple-point pressure, within the
// triple line's tolerance of the stored constant but not of the models'
// own pressure, which PQ then returned 1.5 bounds off (the sweep). The
// line is centred on the models' pressure now.
func TestPQOnTheTripleLine(t *testing.T) {
	t.Parallel()
	f := mustFluid(t, "CO2")
	v, err := TQ(f, 216.59200000343276, 1)
	if err != nil {
		t.Fatal(err)
	}
	st, err := PQ(f, v.P, 1)
	if err != nil || math.Abs(st.P-v.P) > 1e-10*v.P+1e-12*st.Rho*f.GasConstant()*st.T {
		t.Errorf("PQ(%v, 1) = p %v, %v", v.P, st.P, err)
	}
}

// TestHSHighPressureWater: (h, s) of water at 50 to 100 GPa above 715 K
// (supercritical, above the end of ice VII's melting curve) has a second
// solution of the extrapolated equation in the ice VII region, which HS
// found first and reported as outside the models; and the isentrope
// crosses a wide band of pressures without a modelled state below it,
// which the search along it did not get across (the sweep; the failure
// report, item C: "HS refuses a state that exists"). Ice Ih at exactly
// 208.566 MPa, the end of its model, came back a rounding above it and
// was refused. Each must return its state.
func TestHSHighPressureWater(t *testing.T) {
	t.Parallel()
	w := mustFluid(t, "water")
	for _, c := range []struct {
		p, T float64
		want Phase
	}{
		{5.350508541873332e+10, 739.4687493128625, Supercritical},
		{7.314717042971188e+10, 773.0780055336547, Supercritical},
		{1e11, 739.4687493128625, Supercritical},
		{2.08566e+08, 141.52770107819362, Solid},
		{2.08566e+08, 246.07666463765335, Solid},
	} {
		pt, err := PT(w, c.p, c.T)
		if err != nil {
			t.Fatal(err)
		}
		st, err := HS(w, pt.H, pt.S)
		if err != nil || st.Phase != c.want {
			t.Errorf("HS of PT(%v, %v) = %v, %v; want %v", c.p, c.T, st.Phase, err, c.want)
			continue
		}
		if math.Abs(st.T-c.T) > 1e-9*c.T || math.Abs(st.P-c.p) > 1e-9*c.p {
			t.Errorf("HS of PT(%v, %v) = T %v, p %v", c.p, c.T, st.T, st.P)
		}
	}
}

// TestDUEdges: DU at the edges of the models' states. Solids at the
// sublimation pressure of the vapour floor (ice below 200 K, and the
// solid–vapour mixture of CO2 at 150 K) were refused as below the states
// of the isochore (the failure report, item A6): a solid's pressure at
// given (ρ, u) is fixed only to its backward-residual floor (ice at
// 0.16 Pa to about 1 Pa), and rounding put it below the floor's pressure;
// and the Newton iteration on (v, u) stalled where it pressed toward
// p ≤ 0. A mixture on an edge of the three-phase triangle (a liquid
// fraction of 1e-17) came back as Triple without liquid (item A4); now
// the two-phase state of the edge, or Triple with a liquid fraction. The
// ice–liquid mixture at the end of ice Ih's melting curve (208.566 MPa),
// which no node beyond brackets, was refused as beyond the model (the
// sweep, from PH at 208.566 MPa).
func TestDUEdges(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		fluid  string
		rho, u float64
		want   Phase
		triple bool // Triple with a liquid fraction may come back instead
	}{
		{"water", 931.4668024384079, -553005.1955311878, Solid, false},
		{"water", 926.459666086835, -472284.3576455384, Solid, false},
		{"water", 931.2250282401106, -548388.4446703828, Solid, false},
		{"CO2", 0.029782293685102216, -141435.2614772201, SolidVapor, false},
		{"CO2", 43.80600291703943, -471130.4747298289, SolidVapor, true},
		{"water", 41.65953252499539, -333143.65705882525, SolidVapor, true},
		{"water", 0.07740467563000071, -163598.32781547625, SolidVapor, true},
	} {
		f := mustFluid(t, c.fluid)
		st, err := DU(f, c.rho, c.u)
		if err != nil {
			t.Errorf("%s DU(%v, %v): %v", c.fluid, c.rho, c.u, err)
			continue
		}
		if c.triple && st.Phase == Triple {
			if xl := 1 - st.Solid - st.Quality; !(st.N == 3 && xl > 0 && st.Phases[1].Fraction > 0) {
				t.Errorf("%s DU(%v, %v) = Triple, solid %v, vapour %v", c.fluid, c.rho, c.u, st.Solid, st.Quality)
			}
		} else if st.Phase != c.want {
			t.Errorf("%s DU(%v, %v) = %v, want %v", c.fluid, c.rho, c.u, st.Phase, c.want)
		}
		if math.Abs(st.U-c.u) > 1e-10*max(math.Abs(c.u), f.GasConstant()*f.Critical().T) ||
			math.Abs(st.Rho-c.rho) > 1e-10*c.rho {
			t.Errorf("%s DU(%v, %v) = rho %v, u %v", c.fluid, c.rho, c.u, st.Rho, st.U)
		}
	}
	w := mustFluid(t, "water")
	for _, h := range []float64{100363.73920112042, 16742.707200833283} {
		ph, err := PH(w, 2.08566e+08, h)
		if err != nil || ph.Phase != SolidLiquid {
			t.Fatalf("PH(2.08566e8, %v) = %v, %v", h, ph.Phase, err)
		}
		st, err := DU(w, ph.Rho, ph.U)
		if err != nil || st.Phase != SolidLiquid || math.Abs(st.Solid-ph.Solid) > 1e-8 {
			t.Errorf("DU of PH(2.08566e8, %v) = %v, solid %v, %v; want SolidLiquid, solid %v", h, st.Phase, st.Solid, err, ph.Solid)
		}
	}
}

// TestMetastableNextToTheSpinodal: PS with a metastable phase requested
// refused states that DT and PT return with the same request (the
// sweep): supercooled water 50 K below its melting curve, where Newton's
// method from the melting curve's liquid steps past the spinodal, and
// R-134a vapour at 1e-6 of the gap from its spinodal, where s(T) at fixed
// p has an infinite slope and the state lies within a few ulps of T from
// the end of the vapour root; and metastable liquid CO2 at 800 MPa, the
// end of the dry-ice model, which finish sent to the solid paths. Each
// must come back, flagged Metastable.
func TestMetastableNextToTheSpinodal(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		fluid string
		dt    bool // the state from DT(a, b), else PT(a, b)
		a, b  float64
		phase Phase
	}{
		{"water", false, 9.927578298354734e+07, 217.21411764705883, Liquid},
		{"water", false, 247648.4027198921, 234.42823529411766, Liquid},
		{"R134a", true, 3.4698444524519387, 176.77413446050673, Vapor},
		{"CO2", false, 8e8, 216.592, Liquid},
		// R-134a liquid at 161.7 Pa, below its triple-point pressure (PH
		// and PS refused it as solid).
		{"R134a", true, 1493.127433266497, 206.33752992418945, Liquid},
		// R-134a vapour at its triple-point temperature, the floor of
		// its accepted temperatures, 65 times its vapour pressure and
		// 1e-6 of the gap from the spinodal: newton2 held at the floor
		// gave up while its residuals were still halving (the sweep).
		{"R134a", true, 2.259985983398478, 169.85, Vapor},
		{"R134a", true, 2.6030844195482206, 169.85, Vapor},
	} {
		f := mustFluid(t, c.fluid)
		opt := Options{Phase: c.phase, AllowMetastable: true}
		var st State
		var err error
		if c.dt {
			st, err = DTWith(f, c.a, c.b, opt)
		} else {
			st, err = PTWith(f, c.a, c.b, opt)
		}
		if err != nil {
			t.Fatal(err)
		}
		for _, fl := range []struct {
			name string
			x    float64
			fn   func(*fluid.Fluid, float64, float64, Options) (State, error)
		}{{"PS", st.S, PSWith}, {"PH", st.H, PHWith}} {
			got, err := fl.fn(f, st.P, fl.x, opt)
			if err != nil || got.Phase != c.phase || got.Flags&Metastable == 0 || math.Abs(got.T-st.T) > 1e-9*st.T {
				t.Errorf("%s %s of %v at %v K: %v at %v K, flags %v, %v", c.fluid, fl.name, c.phase, st.T,
					got.Phase, got.T, got.Flags, err)
			}
		}
	}
}

// TestDUSpuriousSaturation: DU's iteration through the dome started the
// saturation at 617 K from the triple point's densities, and Newton's
// method converged to a spurious solution (p 20 % low); DU returned a
// mixture at 624 K whose p belonged to 620 K for the saturated vapour at
// 617 K (the sweep, from TQ(617.0609799196787, 1)). It must return that
// vapour (or a mixture with a vanishing liquid fraction) at 617 K.
func TestDUSpuriousSaturation(t *testing.T) {
	t.Parallel()
	w := mustFluid(t, "water")
	for _, q := range []float64{1, 0.999999999} {
		tq, err := TQ(w, 617.0609799196787, q)
		if err != nil {
			t.Fatal(err)
		}
		st, err := DU(w, tq.Rho, tq.U)
		if err != nil || math.Abs(st.T-tq.T) > 1e-9*tq.T || math.Abs(st.P-tq.P) > 1e-9*tq.P || st.Quality < 1-1e-8 {
			t.Errorf("DU of TQ(617.06, %v) = %v at %v K, %v Pa, q %v, %v; want the vapour at %v K, %v Pa",
				q, st.Phase, st.T, st.P, st.Quality, err, tq.T, tq.P)
		}
	}
}

// TestNearCriticalSupercritical: PH and PS a few µK above Tc and a few Pa
// above pc, where cp is so large that the search along the isobar fixed
// T to its tolerance with h still beyond its floor, did not converge;
// PT of the saturated phases 3 nK below Tc took the liquid root, which
// the near-critical model's pressure puts a rounding beyond the liquid
// spinodal; PD of a mixture 1.4 µK below Tc with 0.5 % vapour (2e-5 in
// density from the saturated liquid, within the band in which the
// equation fixes it) returned the liquid; and HS of a liquid 1.5e-8 K
// above the triple point returned a solid–vapour mixture above it. (All
// found by the sweep at 2e5 states.)
func TestNearCriticalSupercritical(t *testing.T) {
	t.Parallel()
	f := mustFluid(t, "CO2")
	for _, c := range [][3]float64{
		{7.377303565428733e+06, -170407.48613436133, 0},
		{7.377444405908948e+06, -168738.40248735197, 0},
		{7.377300000000094e+06, -171514.78495678736, 0},
		{7.377300181636036e+06, -1293.6337379536153, 1},
	} {
		var st State
		var err error
		b := 1e-10 * max(math.Abs(c[1]), f.GasConstant()*f.Critical().T)
		if c[2] == 0 {
			st, err = PH(f, c[0], c[1])
			if err == nil && math.Abs(st.H-c[1]) > b {
				t.Errorf("PH(%v, %v): h = %v", c[0], c[1], st.H)
			}
		} else {
			st, err = PS(f, c[0], c[1])
			if err == nil && math.Abs(st.S-c[1]) > 1e-10*max(math.Abs(c[1]), f.GasConstant()) {
				t.Errorf("PS(%v, %v): s = %v", c[0], c[1], st.S)
			}
		}
		if err != nil {
			t.Errorf("PH/PS(%v, %v): %v", c[0], c[1], err)
		}
	}
	for _, q := range []float64{0, 1} {
		tq, err := TQ(f, 304.1281999969587, q)
		if err != nil {
			t.Fatal(err)
		}
		if st, err := PT(f, tq.P, tq.T); err != nil || st.Phase != Liquid && st.Phase != Vapor {
			t.Errorf("PT of TQ(304.1281999969587, %v) = %v, %v", q, st.Phase, err)
		}
	}
	tq, err := TQ(f, 304.1281985562843, 0.004903329792212769)
	if err != nil {
		t.Fatal(err)
	}
	st, err := PD(f, tq.P, tq.Rho)
	if err != nil || math.Abs(st.Rho-tq.Rho) > 1e-10*tq.Rho || math.Abs(st.T-tq.T) > 1e-9*tq.T {
		t.Errorf("PD of a mixture 1.4 µK below Tc = %v at %v K, rho %v, %v", st.Phase, st.T, st.Rho, err)
	}
	pt, err := PT(f, 517964.51339021366, 216.59200001494008)
	if err != nil {
		t.Fatal(err)
	}
	if st, err := HS(f, pt.H, pt.S); err != nil || st.Phase != Liquid {
		t.Errorf("HS of the liquid 1.5e-8 K above Tt = %v at %v K, %v", st.Phase, st.T, err)
	}
}

// TestMetastableFar: supercooled water at 233.5 K whose isochore has
// usable states only in a 0.4 K piece (cv turns negative below it; DU
// missed it), and supercooled water at 237.2 K whose density root PT
// found 1.04 bounds off in p (the sweep at 2e5 states).
func TestMetastableFar(t *testing.T) {
	t.Parallel()
	o := Options{Phase: Liquid, AllowMetastable: true}
	w := mustFluid(t, "water")
	pt, err := PTWith(w, 401235.83877461235, 233.48000000000002, o)
	if err != nil {
		t.Fatal(err)
	}
	if st, err := DUWith(w, pt.Rho, pt.U, o); err != nil || math.Abs(st.T-pt.T) > 1e-9*pt.T {
		t.Errorf("DU of supercooled water at 233.48 K: %v at %v K, %v", st.Phase, st.T, err)
	}
	const p = 71347.78977709032
	st, err := PTWith(w, p, 237.20000000000002, o)
	if err != nil || st.P != p {
		t.Errorf("PT(%v, 237.2) = p %v, %v", p, st.P, err)
	}
	if pr, err := w.PropsTP(237.20000000000002, p, fluid.RootLiquid, 0); err != nil ||
		math.Abs(pr.P-p) > 1e-10*p+1e-12*pr.Rho*w.GasConstant()*pr.T {
		t.Errorf("PropsTP(237.2, %v) = p %v, %v", p, pr.P, err)
	}
}

// TestMergedEdges holds the states the merge of the speed and
// reliability branches broke (the sweep's short run): the saturated
// liquid of R-134a at its triple point from TQ, whose h and ρ a
// saturation solved from p reproduces only to rounding, must come back
// from PH and PD as the saturated liquid (PH gave a mixture with a
// quality of 4e-16, PD no convergence); the top of water's isentrope at
// its 5000 K ceiling is a state of HS (refused as above it under -race,
// where its h came out 3e-16 below the input's); and ice on its melting
// curve next to the triple point carries the input pressure, not its
// liquid's own p, which lies 5e-9 below it and below the triple line
// (PS then gave solid and vapour, PD no state), also where the curve
// solver's last step leaves the liquid's p 3e-7 off and a polishing step
// brings it to one ulp of ρ from p.
func TestMergedEdges(t *testing.T) {
	t.Parallel()
	r := mustFluid(t, "R134a")
	liq, err := TQ(r, r.Triple().T, 0)
	if err != nil {
		t.Fatal(err)
	}
	if st, err := PH(r, liq.P, liq.H); err != nil || st.Phase != Liquid {
		t.Errorf("R-134a PH of TQ(Tt, 0) = %v (q %v), %v; want Liquid", st.Phase, st.Quality, err)
	}
	if st, err := PD(r, liq.P, liq.Rho); err != nil || st.Phase != Liquid {
		t.Errorf("R-134a PD of TQ(Tt, 0) = %v, %v; want Liquid", st.Phase, err)
	}
	w := mustFluid(t, "water")
	top, err := PT(w, 1.4677992676220708e+09, 5000)
	if err != nil {
		t.Fatal(err)
	}
	if st, err := HS(w, top.H, top.S); err != nil || math.Abs(st.T-5000) > 1e-6 {
		t.Errorf("water HS at the top of its isentrope = %v K, %v", st.T, err)
	}
	const p = 611.6547716192147
	sl, err := PH(w, p, -259631.82559561165)
	if err != nil || sl.Phase != SolidLiquid || sl.P != p {
		t.Fatalf("water PH next to the triple point = %v at p %v, %v; want SolidLiquid at %v", sl.Phase, sl.P, err, p)
	}
	if st, err := PS(w, sl.P, sl.S); err != nil || st.Phase != SolidLiquid {
		t.Errorf("water PS of %v = %v, %v; want SolidLiquid", sl.Phase, st.Phase, err)
	}
	// Above the triple-point pressure a water ice–liquid mixture's (p, ρ)
	// is also a liquid–vapour mixture's, and PD returns the fluid state
	// (its documented choice).
	if st, err := PD(w, sl.P, sl.Rho); err != nil || st.Phase != TwoPhase || math.Abs(st.Rho/sl.Rho-1) > 1e-12 {
		t.Errorf("water PD of %v = %v (ρ %v), %v; want TwoPhase at ρ %v", sl.Phase, st.Phase, st.Rho, err, sl.Rho)
	}
}
