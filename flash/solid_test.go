package flash

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/sublimation"
	"gonum.org/v1/gonum/diff/fd"
)

// The tests of the solid regions. The boundaries they check against are
// the solid models' own Gibbs-equality curves (package sublimation, whose
// tests prove them against IAPWS R10-06, R14-08 and the Span–Wagner
// equations); here the flashes must agree with those curves, reproduce
// their inputs, keep the coexisting phases in equilibrium and follow the
// paths of the scenarios.

// solidFluids are the fluids with a solid model.
func solidFluids(t testing.TB) []*fluid.Fluid {
	return []*fluid.Fluid{mustFluid(t, "CO2"), mustFluid(t, "water")}
}

func mustSolid(t testing.TB, f *fluid.Fluid) sublimation.Solid {
	t.Helper()
	s, err := sublimation.For(f)
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// gibbsSpread returns the largest difference of the specific Gibbs
// energies g = h − Ts of the phases of st, in units of RT.
func gibbsSpread(f *fluid.Fluid, st *State) float64 {
	lo, hi := math.Inf(1), math.Inf(-1)
	for i := 0; i < st.N; i++ {
		g := st.Phases[i].H - st.T*st.Phases[i].S
		lo, hi = min(lo, g), max(hi, g)
	}
	return (hi - lo) / (f.GasConstant() * st.T)
}

// TestSolidRegions places states on both sides of the models' own
// sublimation and melting curves: PT is fluid on the fluid side, solid on
// the other, and on the curve the fluid flagged Indeterminate|Saturated;
// TQ and PQ on the sublimation curve give the saturated solid (q = 0),
// the saturated vapour (q = 1) and solid–vapour mixtures with exactly the
// requested quality.
func TestSolidRegions(t *testing.T) {
	t.Parallel()
	for _, f := range solidFluids(t) {
		s := mustSolid(t, f)
		tp, err := s.Triple()
		if err != nil {
			t.Fatal(err)
		}
		lim := f.Limits()
		for i := 0; i <= 8; i++ {
			T := lim.TFloor + (tp.T-lim.TFloor)*float64(i)/8
			if i == 8 {
				T = tp.T * (1 - 1e-9)
			}
			c, err := s.SublimationPressure(T)
			if err != nil {
				t.Fatal(err)
			}
			if st, err := PT(f, c.P*(1-1e-6), T); err != nil || st.Phase != Vapor || st.Flags&Indeterminate != 0 {
				t.Errorf("%s PT(psub(1-1e-6), %v): %v %v %v", f.Name(), T, st.Phase, st.Flags, err)
			}
			if st, err := PT(f, c.P*(1+1e-6), T); err != nil || st.Phase != Solid || st.Solid != 1 || st.Quality != 0 {
				t.Errorf("%s PT(psub(1+1e-6), %v): %v %v", f.Name(), T, st.Phase, err)
			}
			if st, err := PT(f, c.P, T); err != nil || st.Phase != Vapor || st.Flags&(Indeterminate|Saturated) != Indeterminate|Saturated {
				t.Errorf("%s PT(psub, %v) on the curve: %v %v %v", f.Name(), T, st.Phase, st.Flags, err)
			}
			for _, q := range []float64{0, 1e-6, 0.3, 0.999, 1} {
				st, err := TQ(f, T, q)
				if err != nil {
					t.Errorf("%s TQ(%v, %v): %v", f.Name(), T, q, err)
					continue
				}
				checkState(t, f, "TQ", &st)
				want := SolidVapor
				switch q {
				case 0:
					want = Solid
				case 1:
					want = Vapor
				}
				if st.Phase != want || st.T != T || math.Abs(st.P-c.P) > 1e-12*c.P || st.Flags&Saturated == 0 ||
					st.Quality != q {
					t.Errorf("%s TQ(%v, %v): %v T %v p %v (curve %v) q %v %v", f.Name(), T, q, st.Phase, st.T, st.P, c.P, st.Quality, st.Flags)
				}
				if (q == 0 || q == 1) && (st.N != 1 || math.IsInf(st.Cp, 0) || !(st.W > 0)) {
					t.Errorf("%s TQ(%v, %v): a saturated single phase with finite cp and w, got %+v", f.Name(), T, q, st)
				}
				pq, err := PQ(f, c.P, q)
				if err != nil || pq.Phase != want || math.Abs(pq.T-T) > 1e-9*T || pq.Quality != q {
					t.Errorf("%s PQ(%v, %v): %v T %v (want %v) q %v %v", f.Name(), c.P, q, pq.Phase, pq.T, T, pq.Quality, err)
				}
			}
		}
		// The melting curve: CO2's rises with T (solid above it),
		// water's falls (ice below it).
		mc, err := s.MeltingCurve(9)
		if err != nil {
			t.Fatal(err)
		}
		for _, c := range mc[1 : len(mc)-1] {
			solidP, fluidP := c.P*(1+1e-6), c.P*(1-1e-6)
			if f.Name() == "water" {
				solidP, fluidP = fluidP, solidP
			}
			if st, err := PT(f, fluidP, c.T); err != nil || st.Phase == Solid || st.Phase == Vapor {
				t.Errorf("%s PT(%v, %v) beside the melting curve: %v %v", f.Name(), fluidP, c.T, st.Phase, err)
			}
			if st, err := PT(f, solidP, c.T); err != nil || st.Phase != Solid {
				t.Errorf("%s PT(%v, %v) in the solid: %v %v", f.Name(), solidP, c.T, st.Phase, err)
			}
			if st, err := PT(f, c.P, c.T); err != nil || st.Phase == Solid || st.Flags&Indeterminate == 0 {
				t.Errorf("%s PT(%v, %v) on the melting curve: %v %v %v", f.Name(), c.P, c.T, st.Phase, st.Flags, err)
			}
		}
	}
}

// TestSolidErrors checks the errors of the solid regions: R-134a has no
// solid model (ErrUndefined); ice Ih ends at 208.566 MPa (IAPWS R14-08,
// the ice Ih–ice III–liquid triple point) and the error names the other
// ices; dry ice ends at 800 MPa (the model's limit); below the vapour
// floor a state can be placed only where it is solid.
func TestSolidErrors(t *testing.T) {
	t.Parallel()
	r := mustFluid(t, "R134a")
	w := mustFluid(t, "water")
	co2 := mustFluid(t, "CO2")
	tt := r.Triple().T
	for _, c := range []struct {
		name string
		fn   func() (State, error)
		want error
		text string
	}{
		{"R134a PT below Tt", func() (State, error) { return PT(r, 1e5, tt-5) }, fluid.ErrUndefined, "no solid model"},
		{"R134a TQ below Tt", func() (State, error) { return TQ(r, tt-5, 0.5) }, fluid.ErrUndefined, "no solid model"},
		{"R134a PQ below pt", func() (State, error) { return PQ(r, 0.5*r.Triple().P, 0.5) }, fluid.ErrUndefined, "no solid model"},
		{"R134a PH below the liquid", func() (State, error) { return PH(r, 1e6, -1e7) }, fluid.ErrUndefined, "no solid model"},
		{"water PT other ices", func() (State, error) { return PT(w, 220e6, 250) }, fluid.ErrOutOfRange, "ice III"},
		{"water PH other ices", func() (State, error) { return PH(w, 250e6, -4e5) }, fluid.ErrOutOfRange, "ice III"},
		{"water PT below the floor", func() (State, error) { return PT(w, 0.01, 150) }, fluid.ErrOutOfRange, "vapour floor"},
		{"CO2 PT above 800 MPa", func() (State, error) { return PT(co2, 900e6, 300) }, fluid.ErrOutOfRange, "800 MPa"},
		{"CO2 PH above 800 MPa", func() (State, error) { return PH(co2, 900e6, -5e5) }, fluid.ErrOutOfRange, "800 MPa"},
		{"CO2 DU below the floor", func() (State, error) { return DU(co2, 500, -9e5) }, fluid.ErrOutOfRange, ""},
		{"PT Solid requested in the vapour", func() (State, error) { return PTWith(co2, 1e4, 250, Options{Phase: Solid}) }, fluid.ErrOutOfRange, "Solid"},
		{"PT mixture requested", func() (State, error) { return PTWith(co2, 1e4, 250, Options{Phase: SolidVapor}) }, fluid.ErrInvalidInput, ""},
		{"PH Triple requested", func() (State, error) { return PHWith(co2, 1e5, -3e5, Options{Phase: Triple}) }, fluid.ErrOutOfRange, "SolidVapor"},
	} {
		st, err := c.fn()
		var fe *fluid.Error
		if !errors.Is(err, c.want) || !errors.As(err, &fe) || !strings.Contains(err.Error(), c.text) {
			t.Errorf("%s: %v, want %v containing %q", c.name, err, c.want, c.text)
		}
		if st != (State{}) {
			t.Errorf("%s: a state with the error", c.name)
		}
	}
}

// TestThrottleCO2 is the scenario of issue 5, our own: compressed liquid
// CO2 at 15 °C and 7.0 MPa, throttled (isenthalpic) to 101.325 kPa, ends
// at the sublimation temperature with about 33 % dry ice by mass: "from
// the published equations with a consistent enthalpy of sublimation
// (derived; common practice, no source, says roughly a third)" (issue 5).
// The test bounds it to ±1 percentage point.
func TestThrottleCO2(t *testing.T) {
	f := mustFluid(t, "CO2")
	in, err := PT(f, 7.0e6, 288.15)
	if err != nil || in.Phase != Liquid {
		t.Fatalf("feed: %v %v", in.Phase, err)
	}
	out, err := PH(f, 101325, in.H)
	if err != nil {
		t.Fatal(err)
	}
	c, err := mustSolid(t, f).SublimationTemperature(101325)
	if err != nil {
		t.Fatal(err)
	}
	if out.Phase != SolidVapor || math.Abs(out.T-c.T) > 1e-9*c.T || math.Abs(out.P-101325) > 1e-6 {
		t.Errorf("throttled: %v at %v K, %v Pa; want SolidVapor at %v K", out.Phase, out.T, out.P, c.T)
	}
	if math.Abs(out.Solid-0.33) > 0.01 || math.Abs(out.Solid+out.Quality-1) > 1e-12 {
		t.Errorf("dry ice fraction %.4f, want 0.33 +- 0.01 (vapour %.4f)", out.Solid, out.Quality)
	}
	t.Logf("dry ice %.4f by mass at %.3f K", out.Solid, out.T)
}

// TestFrostWater checks ice–vapour states of water below its triple-point
// pressure (611.65 Pa): frost on a cold coil and freeze-drying.
func TestFrostWater(t *testing.T) {
	f := mustFluid(t, "water")
	// Ice sublimes at 8.947 Pa at 230 K (IAPWS R14-08(2011) check value,
	// quoted in issue 5; ±1 in its last printed digit).
	st, err := TQ(f, 230, 0.5)
	if err != nil || st.Phase != SolidVapor || math.Abs(st.P-8.947) > 0.001 {
		t.Errorf("TQ(230 K, 0.5): %v %v Pa %v", st.Phase, st.P, err)
	}
	// Ice–vapour at pressures below the triple point against the R14-08
	// sublimation equation (fluid.AuxSublimationPressure), within 1e-4
	// (the agreement package sublimation proves).
	for _, p := range []float64{0.2, 1, 10, 100, 300, 600} {
		st, err := PQ(f, p, 0.4)
		if err != nil || st.Phase != SolidVapor {
			t.Errorf("PQ(%v Pa, 0.4): %v %v", p, st.Phase, err)
			continue
		}
		pr, err := f.AuxSublimationPressure(st.T)
		if err != nil || math.Abs(pr/p-1) > 1e-4 {
			t.Errorf("PQ(%v Pa): T = %v K, where R14-08 gives %v Pa", p, st.T, pr)
		}
	}
	// Frost on a coil of our own: vapour at 300 Pa and 280 K cooled at
	// constant pressure. It frosts at the sublimation temperature, and
	// once the heat of sublimation is removed it is ice.
	v, err := PT(f, 300, 280)
	if err != nil || v.Phase != Vapor {
		t.Fatalf("humid vapour: %v %v", v.Phase, err)
	}
	sat, err := PQ(f, 300, 1)
	if err != nil {
		t.Fatal(err)
	}
	ice, err := PQ(f, 300, 0)
	if err != nil || ice.Phase != Solid {
		t.Fatal(ice.Phase, err)
	}
	var phases []Phase
	for i := 0; i <= 40; i++ {
		h := v.H - float64(i)*(v.H-ice.H+40e3)/40
		st, err := PH(f, 300, h)
		if err != nil {
			t.Fatalf("PH(300 Pa, %v): %v", h, err)
		}
		checkState(t, f, "frost", &st)
		if len(phases) == 0 || phases[len(phases)-1] != st.Phase {
			phases = append(phases, st.Phase)
		}
		if st.Phase == SolidVapor {
			want := (sat.H - h) / (sat.H - ice.H)
			if math.Abs(st.T-sat.T) > 1e-9*sat.T || math.Abs(st.Solid-want) > 1e-9 {
				t.Errorf("frost at %v J/kg: T %v, ice fraction %v, want %v", h, st.T, st.Solid, want)
			}
		}
	}
	if fmt.Sprint(phases) != fmt.Sprint([]Phase{Vapor, SolidVapor, Solid}) {
		t.Errorf("frost path: %v", phases)
	}
	// Freeze-drying of our own: ice held at 250 K sublimes into a
	// vacuum below its sublimation pressure (76 Pa there): PT is vapour
	// at 10 Pa, ice at 100 Pa.
	if st, err := PT(f, 10, 250); err != nil || st.Phase != Vapor {
		t.Errorf("PT(10 Pa, 250 K): %v %v", st.Phase, err)
	}
	if st, err := PT(f, 100, 250); err != nil || st.Phase != Solid || math.Abs(st.Rho-920) > 5 {
		// Ice Ih near 250 K: about 920 kg/m3 (IAPWS R10-06 gives
		// 916.7 kg/m3 at the triple point, denser when colder).
		t.Errorf("PT(100 Pa, 250 K): %v %v kg/m3 %v", st.Phase, st.Rho, err)
	}
}

// TestVesselThroughTriple follows a fixed-volume vessel of our own,
// cooled from a liquid–vapour state through the triple point by DU
// (fixed ρ, falling u): it must pass through Triple states, with T and p
// fixed at the triple point while the solid grows and the liquid
// shrinks, and continue as solid–vapour. For CO2 and water.
func TestVesselThroughTriple(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		name     string
		rho, Ths float64 // kg/m3; the start temperature, K
	}{{"CO2", 500, 240}, {"water", 50, 290}} {
		f := mustFluid(t, c.name)
		tp, err := mustSolid(t, f).Triple()
		if err != nil {
			t.Fatal(err)
		}
		start, err := DT(f, c.rho, c.Ths)
		if err != nil || start.Phase != TwoPhase {
			t.Fatalf("%s start: %v %v", c.name, start.Phase, err)
		}
		// The three-phase u range on this isochore, to place the steps.
		lo, hi, ok := tripleURange(&tp, 1/c.rho)
		if !ok {
			t.Fatalf("%s: the isochore misses the triple point", c.name)
		}
		const n = 200
		du := (start.U - lo) / (0.8 * n) // to a quarter of the way again below the triple point
		var phases []Phase
		prev := start
		nTriple := 0
		for i := 1; i <= n; i++ {
			u := start.U - float64(i)*du
			st, err := DU(f, c.rho, u)
			if err != nil {
				t.Fatalf("%s DU(%v, %v): %v", c.name, c.rho, u, err)
			}
			what := fmt.Sprintf("%s DU(%v, %v)", c.name, c.rho, u)
			checkState(t, f, what, &st)
			for _, q := range []struct {
				name string
				v    float64
			}{{"rho", c.rho}, {"u", u}} {
				if g, floor := backward(f, &st, q.name, q.v); math.Abs(g-q.v) > floor {
					t.Errorf("%s: %s = %v off by %v (floor %v)", what, q.name, g, g-q.v, floor)
				}
			}
			if st.N > 1 {
				if d := gibbsSpread(f, &st); d > gibbsTol {
					t.Errorf("%s: phases' Gibbs energies differ by %v RT", what, d)
				}
			}
			if len(phases) == 0 || phases[len(phases)-1] != st.Phase {
				phases = append(phases, st.Phase)
			}
			switch st.Phase {
			case Triple:
				nTriple++
				if st.T != tp.T || st.P != tp.P || st.Flags&Indeterminate != 0 {
					t.Errorf("%s: triple state at %v K, %v Pa (want %v, %v), flags %v", what, st.T, st.P, tp.T, tp.P, st.Flags)
				}
				if prev.Phase == Triple && !(st.Solid > prev.Solid && st.Phases[1].Fraction < prev.Phases[1].Fraction) {
					t.Errorf("%s: solid %v after %v, liquid %v after %v", what, st.Solid, prev.Solid,
						st.Phases[1].Fraction, prev.Phases[1].Fraction)
				}
			case TwoPhase:
				if st.T < tp.T || st.T > prev.T {
					t.Errorf("%s: liquid-vapour at %v K after %v K", what, st.T, prev.T)
				}
			case SolidVapor:
				if st.T > tp.T || (prev.Phase == SolidVapor && st.T >= prev.T) {
					t.Errorf("%s: solid-vapour at %v K after %v K", what, st.T, prev.T)
				}
			}
			prev = st
		}
		want := []Phase{TwoPhase, Triple, SolidVapor}
		if fmt.Sprint(phases) != fmt.Sprint(want) || nTriple < 10 {
			t.Errorf("%s path: %v with %d triple states, want %v", c.name, phases, nTriple, want)
		}
		// The ends of the triple segment join the neighbouring states.
		top, err1 := DU(f, c.rho, hi)
		bot, err2 := DU(f, c.rho, lo)
		above, err3 := DU(f, c.rho, hi+1)
		below, err4 := DU(f, c.rho, lo-1)
		if err := errors.Join(err1, err2, err3, err4); err != nil {
			t.Fatal(err)
		}
		if top.Solid > 1e-9 || bot.Phases[1].Phase == Liquid && bot.Phases[1].Fraction > 1e-9 ||
			math.Abs(above.T-tp.T) > 1e-3 || math.Abs(below.T-tp.T) > 1e-3 ||
			math.Abs(above.Quality-top.Quality) > 1e-4 || math.Abs(below.Solid-bot.Solid) > 1e-4 {
			t.Errorf("%s segment ends: top %v %v, bottom %v %v; above %v K q %v, below %v K solid %v",
				c.name, top.Phase, top.Solid, bot.Phase, bot.Solid, above.T, above.Quality, below.T, below.Solid)
		}
	}
}

// TestVentThroughTriple vents a CO2 vessel of our own: the gas leaving
// expands what remains reversibly and adiabatically, du = −p dv per unit
// mass, integrated here in ρ by the trapezoidal rule with DU at each
// step. The contents fall through the triple point, where T and p stay
// fixed while ρ falls, and continue as solid–vapour; their entropy stays
// constant to the integration error (bounded from the step size).
func TestVentThroughTriple(t *testing.T) {
	f := mustFluid(t, "CO2")
	tp, err := mustSolid(t, f).Triple()
	if err != nil {
		t.Fatal(err)
	}
	st, err := TQ(f, 250, 0.05)
	if err != nil {
		t.Fatal(err)
	}
	s0 := st.S
	rho, u := st.Rho, st.U
	var phases []Phase
	const steps = 400
	r1 := rho / 40 // the end density
	k := math.Pow(r1/rho, 1.0/steps)
	for i := 0; i < steps; i++ {
		rn := rho * k
		// du = p dρ/ρ²: a predictor step, then the trapezoid.
		dv := 1/rn - 1/rho
		up := u - st.P*dv
		pr, err := DU(f, rn, up)
		if err != nil {
			t.Fatalf("DU(%v, %v): %v", rn, up, err)
		}
		un := u - 0.5*(st.P+pr.P)*dv
		next, err := DU(f, rn, un)
		if err != nil {
			t.Fatalf("DU(%v, %v): %v", rn, un, err)
		}
		if len(phases) == 0 || phases[len(phases)-1] != next.Phase {
			phases = append(phases, next.Phase)
		}
		if next.Phase == Triple && (next.T != tp.T || next.P != tp.P) {
			t.Errorf("triple state at %v K, %v Pa", next.T, next.P)
		}
		st, rho, u = next, rn, un
	}
	if fmt.Sprint(phases) != fmt.Sprint([]Phase{TwoPhase, Triple, SolidVapor}) {
		t.Errorf("vent path: %v", phases)
	}
	// The trapezoidal rule's error over the path: of the order of the
	// square of the step in ln ρ times the curvature; a bound of 1e-3 R
	// holds with a wide margin at 400 steps (10 % steps give about 30
	// times more).
	if d := math.Abs(st.S - s0); d > 1e-3*f.GasConstant() {
		t.Errorf("entropy changed by %v J/(kg K) over the vent", d)
	}
	t.Logf("vented to %v K, solid %.3f, Δs = %.2g J/(kg K)", st.T, st.Solid, st.S-s0)
}

// TestSolidGibbsEquality checks the equilibrium of every coexisting-phase
// state of the solid regions returned by the flashes: equal Gibbs energy
// of the phases (|Δg| ≤ gibbsTol·RT, ten times the accuracy of the
// curves), and each phase the model's own at the state's T and p.
func TestSolidGibbsEquality(t *testing.T) {
	t.Parallel()
	for _, f := range solidFluids(t) {
		s := mustSolid(t, f)
		var states []State
		lim := f.Limits()
		tp, _ := s.Triple()
		for i := 0; i <= 10; i++ {
			T := lim.TFloor + (tp.T-lim.TFloor)*float64(i)/10
			if st, err := TQ(f, T, 0.4); err == nil {
				states = append(states, st)
			}
		}
		for _, c := range func() []sublimation.Coexistence { m, _ := s.MeltingCurve(12); return m }()[1:] {
			h := 0.5 * (c.Solid.H + c.Fluid.H)
			if st, err := PH(f, c.P, h); err == nil {
				states = append(states, st)
			}
		}
		for _, x := range []float64{0.2, 0.5, 0.8} {
			rho := 1 / (x/tp.Liquid.Rho + (1-x)/tp.Vapor.Rho)
			lo, hi, _ := tripleURange(&tp, 1/rho)
			if st, err := DU(f, rho, lo+x*(hi-lo)); err == nil {
				states = append(states, st)
			}
		}
		if len(states) < 20 {
			t.Fatalf("%s: %d states", f.Name(), len(states))
		}
		for _, st := range states {
			if st.N < 2 {
				t.Errorf("%s: %v is not a mixture", f.Name(), st.Phase)
				continue
			}
			if d := gibbsSpread(f, &st); d > gibbsTol {
				t.Errorf("%s %v at %v K: Gibbs energies differ by %v RT", f.Name(), st.Phase, st.T, d)
			}
			for i := 0; i < st.N; i++ {
				ph := st.Phases[i]
				var rho float64
				if ph.Phase == Solid {
					sp, err := s.Props(st.T, st.P)
					if err != nil {
						t.Fatal(err)
					}
					rho = sp.Rho
				} else {
					pr, err := f.Props(st.T, ph.Rho)
					if err != nil {
						t.Fatal(err)
					}
					if math.Abs(pr.P-st.P) > 1e-9*st.P+1e-12*ph.Rho*f.GasConstant()*st.T {
						t.Errorf("%s %v: the %v phase has p = %v, the state %v", f.Name(), st.Phase, ph.Phase, pr.P, st.P)
					}
					rho = ph.Rho
				}
				if math.Abs(rho-ph.Rho) > 1e-12*rho {
					t.Errorf("%s %v: %v phase density %v, model %v", f.Name(), st.Phase, ph.Phase, ph.Rho, rho)
				}
			}
		}
	}
}

// TestSolidMixtureDerivatives checks the analytic cv and
// homogeneous-equilibrium speed of sound of solid–vapour and
// solid–liquid states against central differences of the flashes
// themselves: cv = (∂u/∂T)_ρ by DT along the isochore, w² = (∂p/∂ρ)_s by
// PS along the isentrope.
func TestSolidMixtureDerivatives(t *testing.T) {
	t.Parallel()
	for _, f := range solidFluids(t) {
		s := mustSolid(t, f)
		lim := f.Limits()
		tp, _ := s.Triple()
		var states []State
		for _, x := range []float64{0.3, 0.7, 0.95} {
			T := lim.TFloor + (tp.T-lim.TFloor)*x
			for _, q := range []float64{0.1, 0.6} {
				if st, err := TQ(f, T, q); err == nil {
					states = append(states, st)
				}
			}
		}
		m, _ := s.MeltingCurve(5)
		for _, c := range m[1:4] {
			for _, xs := range []float64{0.2, 0.7} {
				if st, err := PH(f, c.P, c.Fluid.H+xs*(c.Solid.H-c.Fluid.H)); err == nil {
					states = append(states, st)
				}
			}
		}
		for _, st := range states {
			if st.Phase != SolidVapor && st.Phase != SolidLiquid {
				t.Fatalf("%s: %v", f.Name(), st.Phase)
			}
			hT := 1e-4 * st.T
			cv := fd.Derivative(func(T float64) float64 {
				s, err := DT(f, st.Rho, T)
				if err != nil {
					t.Fatal(err)
				}
				return s.U
			}, st.T, &fd.Settings{Formula: fd.Central, Step: hT})
			if math.Abs(cv-st.Cv) > 1e-5*math.Abs(st.Cv) {
				t.Errorf("%s %v at %v K: cv = %v, by differences %v", f.Name(), st.Phase, st.T, st.Cv, cv)
			}
			dvdp := fd.Derivative(func(p float64) float64 {
				s, err := PS(f, p, st.S)
				if err != nil {
					t.Fatal(err)
				}
				return s.Rho
			}, st.P, &fd.Settings{Formula: fd.Central, Step: 1e-5 * st.P})
			if w := math.Sqrt(1 / dvdp); math.Abs(w-st.W) > 1e-5*st.W {
				t.Errorf("%s %v at %v K: w = %v, by differences %v", f.Name(), st.Phase, st.T, st.W, w)
			}
		}
	}
}

// TestTripleLine checks the documented choices on the triple line, where
// PH, PS, PQ, TQ, HS and DT do not fix the fractions (flag
// Indeterminate): the state of least solid, liquid–vapour where the
// input lies among the liquid–vapour mixtures; below them solid–vapour
// (PH, PS, TS) or solid–liquid (DT, PD, for dry ice, denser than its
// liquid). DU fixes the fractions: not Indeterminate.
func TestTripleLine(t *testing.T) {
	t.Parallel()
	for _, f := range solidFluids(t) {
		tp, err := mustSolid(t, f).Triple()
		if err != nil {
			t.Fatal(err)
		}
		sol, liq, vap := tp.Solid, tp.Liquid, tp.Vapor
		for _, pp := range []float64{tp.P, f.Triple().P} { // the model's and the stored constant
			for _, c := range []struct {
				x    float64 // fraction of the way from the solid to the vapour
				want Phase
			}{{0.02, SolidVapor}, {0.2, SolidVapor}, {0.8, TwoPhase}, {0.99, TwoPhase}} {
				for _, X := range []string{"h", "s"} {
					xs, xl, xv := sol.H, liq.H, vap.H
					fn := PHWith
					if X == "s" {
						xs, xl, xv, fn = sol.S, liq.S, vap.S, PSWith
					}
					x := xs + c.x*(xv-xs)
					want := c.want
					if x >= xl {
						want = TwoPhase
					} else {
						want = SolidVapor
					}
					st, err := fn(f, pp, x, Options{})
					if err != nil || st.Phase != want || st.Flags&Indeterminate == 0 || st.T != tp.T {
						t.Errorf("%s P%s(%v, %v): %v %v at %v K, %v", f.Name(), strings.ToUpper(X), pp, x, st.Phase, st.Flags, st.T, err)
						continue
					}
					if g, floor := backward(f, &st, X, x); math.Abs(g-x) > floor {
						t.Errorf("%s P%s on the triple line: %s off by %v", f.Name(), strings.ToUpper(X), X, g-x)
					}
					// HS with the state's h and s: the same choice.
					hs, err := HS(f, st.H, st.S)
					if err != nil || hs.Phase != st.Phase || hs.Flags&Indeterminate == 0 || math.Abs(hs.Solid-st.Solid) > 1e-9 {
						t.Errorf("%s HS on the triple line: %v %v solid %v (want %v %v), %v", f.Name(), hs.Phase, hs.Flags, hs.Solid, st.Phase, st.Solid, err)
					}
				}
			}
			for _, q := range []float64{0, 0.5} {
				st, err := PQ(f, pp, q)
				if err != nil || st.Flags&Indeterminate == 0 || st.Solid != 0 || st.Quality != q {
					t.Errorf("%s PQ(%v, %v): %v %v %v", f.Name(), pp, q, st.Phase, st.Flags, err)
				}
			}
		}
		for _, T := range []float64{tp.T, f.Triple().T} {
			st, err := TQ(f, T, 0.5)
			if err != nil || st.Phase != TwoPhase || st.Flags&Indeterminate == 0 {
				t.Errorf("%s TQ(%v, 0.5): %v %v %v", f.Name(), T, st.Phase, st.Flags, err)
			}
			rho := 1 / (0.5/liq.Rho + 0.5/vap.Rho)
			st, err = DT(f, rho, T)
			if err != nil || st.Phase != TwoPhase || st.Flags&Indeterminate == 0 {
				t.Errorf("%s DT(%v, %v): %v %v %v", f.Name(), rho, T, st.Phase, st.Flags, err)
			}
			if sol.Rho > liq.Rho {
				rho := 0.5 * (sol.Rho + liq.Rho)
				for _, st := range func() []State {
					a, err1 := DT(f, rho, T)
					b, err2 := PD(f, tp.P, rho)
					if err1 != nil || err2 != nil {
						t.Fatal(err1, err2)
					}
					return []State{a, b}
				}() {
					if st.Phase != SolidLiquid || st.Flags&Indeterminate == 0 {
						t.Errorf("%s at the triple point with rho %v: %v %v", f.Name(), rho, st.Phase, st.Flags)
					}
				}
			}
		}
		// PT at the triple point itself: on a coexistence curve.
		if st, err := PT(f, tp.P, tp.T); err != nil || st.Flags&Indeterminate == 0 {
			t.Errorf("%s PT at the triple point: %v %v", f.Name(), st.Flags, err)
		}
		// DU fixes the three fractions.
		rho := 1 / (0.3/sol.Rho + 0.3/liq.Rho + 0.4/vap.Rho)
		u := 0.3*sol.U + 0.3*liq.U + 0.4*vap.U
		st, err := DU(f, rho, u)
		if err != nil || st.Phase != Triple || st.Flags&Indeterminate != 0 ||
			math.Abs(st.Solid-0.3) > 1e-9 || math.Abs(st.Quality-0.4) > 1e-9 {
			t.Errorf("%s DU in the triple point: %+v %v", f.Name(), st, err)
		}
	}
}

// TestMetastableSolidRegions checks fluid states metastable against the
// solid, on request: supercooled liquid water and CO2 vapour
// supersaturated against dry ice.
func TestMetastableSolidRegions(t *testing.T) {
	w := mustFluid(t, "water")
	co2 := mustFluid(t, "CO2")
	liq := Options{Phase: Liquid, AllowMetastable: true}
	vap := Options{Phase: Vapor, AllowMetastable: true}
	st, err := PTWith(w, 1e5, 263.15, liq)
	if err != nil || st.Phase != Liquid || st.Flags&Metastable == 0 || math.Abs(st.Rho-998.1) > 1 {
		// Supercooled water at -10 °C: about 998.1 kg/m3 (from memory).
		t.Errorf("supercooled water: %v %v %v kg/m3 %v", st.Phase, st.Flags, st.Rho, err)
	}
	if st, err := PT(w, 1e5, 263.15); err != nil || st.Phase != Solid {
		t.Errorf("water at -10 °C: %v %v", st.Phase, err)
	}
	sc, _ := PTWith(w, 1e5, 268.15, liq)
	ph, err := PHWith(w, 1e5, sc.H, liq)
	if err != nil || ph.Flags&Metastable == 0 || math.Abs(ph.T-268.15) > 1e-8 {
		t.Errorf("supercooled water by PH: %v %v %v", ph.T, ph.Flags, err)
	}
	st, err = PTWith(co2, 1e5, 190, vap)
	if err != nil || st.Phase != Vapor || st.Flags&Metastable == 0 {
		t.Errorf("supersaturated CO2 vapour: %v %v %v", st.Phase, st.Flags, err)
	}
	if st, err := PT(co2, 1e5, 190); err != nil || st.Phase != Solid {
		t.Errorf("CO2 at 1 bar, 190 K: %v %v", st.Phase, err)
	}
}

// solidRegionStates returns states of every solid region of f: solid by
// PT over a grid, solid–vapour by TQ, solid–liquid by PH on the melting
// curve and three-phase by DU.
func solidRegionStates(t testing.TB, f *fluid.Fluid) []State {
	s := mustSolid(t, f)
	tp, err := s.Triple()
	if err != nil {
		t.Fatal(err)
	}
	lim := f.Limits()
	var sts []State
	add := func(st State, err error) {
		if err == nil {
			sts = append(sts, st)
		}
	}
	Tlo := lim.TFloor
	if f.Name() == "water" {
		Tlo = 120 // ice below the vapour floor
	}
	for i := 0; i <= 6; i++ {
		T := Tlo + (tp.T-Tlo)*float64(i)/6.5
		for _, p := range []float64{0.5 * tp.P, 2 * tp.P, 1e6, 3e7, 1.5e8} {
			if st, err := PT(f, p, T); err == nil && st.Phase == Solid {
				sts = append(sts, st)
			}
		}
	}
	if f.Name() == "CO2" {
		for _, T := range []float64{220, 250, 300} {
			m, _ := s.MeltingPressure(T)
			for _, x := range []float64{1.01, 1.3} {
				if st, err := PT(f, m.P*x, T); err == nil && st.Phase == Solid {
					sts = append(sts, st)
				}
			}
		}
	}
	for i := 0; i <= 5; i++ {
		T := lim.TFloor + (tp.T-lim.TFloor)*float64(i)/5.5
		for _, q := range []float64{0.01, 0.5, 0.99} {
			add(TQ(f, T, q))
		}
	}
	m, _ := s.MeltingCurve(6)
	for _, c := range m[1 : len(m)-1] {
		for _, xs := range []float64{0.1, 0.5, 0.9} {
			add(PH(f, c.P, c.Fluid.H+xs*(c.Solid.H-c.Fluid.H)))
		}
	}
	for _, x := range []float64{0.1, 0.5} {
		rho := 1 / (x/tp.Liquid.Rho + (1-x)/tp.Vapor.Rho)
		lo, hi, _ := tripleURange(&tp, 1/rho)
		for _, y := range []float64{0.1, 0.5, 0.9} {
			add(DU(f, rho, lo+y*(hi-lo)))
		}
	}
	return sts
}

// TestRoundTripSolid runs every flash on the quantities of states in every
// solid region (solid, solid–vapour, solid–liquid, triple) and checks
// their backward residuals against DESIGN.md's floors, and the phase
// (where the inputs fix it). PT → h, s, ρ, u → PH, PS, DU, HS, DT, TS, PD.
func TestRoundTripSolid(t *testing.T) {
	t.Parallel()
	for _, f := range solidFluids(t) {
		sts := solidRegionStates(t, f)
		count := map[Phase]int{}
		for _, st := range sts {
			count[st.Phase]++
		}
		for _, ph := range []Phase{Solid, SolidVapor, SolidLiquid, Triple} {
			if count[ph] < 5 {
				t.Errorf("%s: only %d %v states", f.Name(), count[ph], ph)
			}
		}
		n := 0
		worst := map[string]float64{}
		for i := range sts {
			st := &sts[i]
			checkState(t, f, "origin", st)
			n += roundTrip(t, f, st.Phase.String(), st, Options{})
			for _, fc := range flashCases {
				a, b := quantityOf(st, fc.a), quantityOf(st, fc.b)
				got, err := fc.fn(f, a, b, Options{})
				if err != nil {
					continue
				}
				for _, c := range []struct {
					name string
					want float64
				}{{fc.a, a}, {fc.b, b}} {
					g, floor := backward(f, &got, c.name, c.want)
					worst[c.name] = max(worst[c.name], math.Abs(g-c.want)/floor)
				}
			}
		}
		t.Logf("%s: %d states (%v), %d flashes; worst residual / floor: %v", f.Name(), len(sts), count, n, worst)
	}
}

// TestSolidWarmStart checks that warm starts from solid-region states,
// and fluid flashes warm-started from them, return the cold results.
func TestSolidWarmStart(t *testing.T) {
	for _, f := range solidFluids(t) {
		for _, prev := range solidRegionStates(t, f) {
			for _, fc := range allCases {
				if fc.name == "TQ" || fc.name == "PQ" {
					continue
				}
				a, b := quantityOf(&prev, fc.a), quantityOf(&prev, fc.b)
				a2, b2 := a*(1+1e-4), b
				if fc.a == "T" || fc.a == "p" || fc.a == "rho" {
					b2 = b + 1e-4*math.Abs(b)
				}
				cold, err1 := fc.fn(f, a2, b2, Options{})
				warm, err2 := fc.fn(f, a2, b2, Options{Guess: &prev})
				if (err1 == nil) != (err2 == nil) {
					t.Errorf("%s %s warm %v, cold %v", f.Name(), fc.name, err2, err1)
					continue
				}
				if err1 != nil {
					continue
				}
				if cold.Phase != warm.Phase || math.Abs(cold.T-warm.T) > 1e-8*cold.T ||
					math.Abs(cold.Solid-warm.Solid) > 1e-8 {
					t.Errorf("%s %s(%v, %v) from %v: warm %v %v K solid %v, cold %v %v K solid %v", f.Name(), fc.name,
						a2, b2, prev.Phase, warm.Phase, warm.T, warm.Solid, cold.Phase, cold.T, cold.Solid)
				}
			}
		}
	}
}

func TestSolidAllocs(t *testing.T) {
	f := mustFluid(t, "CO2")
	w := mustFluid(t, "water")
	r := mustFluid(t, "R134a")
	liq, _ := PT(f, 7e6, 288.15)
	sv, _ := PQ(f, 1e5, 0.5)
	for name, fn := range map[string]func(){
		"PH solid-vapour":     func() { PH(f, 101325, liq.H) },
		"PH warm":             func() { PHWith(f, 1.01e5, liq.H, Options{Guess: &sv}) },
		"PH solid":            func() { PH(f, 1e5, -7e5) },
		"PH solid-liquid":     func() { PH(f, 3e6, -5e5) },
		"PT solid":            func() { PT(f, 1e5, 190) },
		"PT ice":              func() { PT(w, 1e5, 260) },
		"PT liquid CO2":       func() { PT(f, 1e7, 220) },
		"TQ solid-vapour":     func() { TQ(f, 200, 0.5) },
		"PQ ice-vapour":       func() { PQ(w, 100, 0.5) },
		"DT solid-vapour":     func() { DT(f, 100, 200) },
		"DU triple":           func() { DU(f, 500, -5e5) },
		"DU solid-vapour":     func() { DU(f, 500, -6.5e5) },
		"PS solid":            func() { PS(f, 1e5, -3000) },
		"TS solid-vapour":     func() { TS(f, 200, -2000) },
		"PD solid-vapour":     func() { PD(f, 1e5, 100) },
		"PH ice-vapour":       func() { PH(w, 300, 1e6) },
		"DT ice":              func() { DT(w, 919, 250) },
		"R134a PT (no solid)": func() { PT(r, 1e5, 300) },
	} {
		if a := testing.AllocsPerRun(10, fn); a != 0 {
			t.Errorf("%s: %v allocs", name, a)
		}
	}
}
