package flash

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/sublimation"
)

// The tests of HS's direct solves (hs.go) beyond the round trips of
// roundtrip_test.go and solid_test.go, which run HS on every state of
// their grids.

// TestHSRegressions keeps inputs HS once failed on. CO2 with dry ice and
// the dense fluid above Tc (310 K, solid 40 % by mass; the state of
// flash/partial's "dry ice-dense fluid" case, inputs from its session's
// note): the search along the isentrope did not converge.
func TestHSRegressions(t *testing.T) {
	t.Parallel()
	co2 := mustFluid(t, "CO2")
	const h, s = -28968.922394690828, -2457.5654950240687
	st, err := HS(co2, h, s)
	if err != nil {
		t.Fatal(err)
	}
	checkState(t, co2, "HS", &st)
	if st.Phase != SolidLiquid || math.Abs(st.T-310) > 1e-3 || math.Abs(st.Solid-0.4) > 1e-4 {
		t.Errorf("HS(%v, %v): %v at %v K, solid %v; want SolidLiquid near 310 K, solid 0.4", h, s, st.Phase, st.T, st.Solid)
	}
	for _, q := range []struct {
		name string
		v    float64
	}{{"h", h}, {"s", s}} {
		if g, floor := backward(co2, &st, q.name, q.v); math.Abs(g-q.v) > floor {
			t.Errorf("HS: %s = %v, off by %v (floor %v)", q.name, g, g-q.v, floor)
		}
	}
	if d := gibbsSpread(co2, &st); d > gibbsTol {
		t.Errorf("HS: the phases' Gibbs energies differ by %v RT", d)
	}
	m, err := mustSolid(t, co2).MeltingPressure(st.T)
	if err != nil || math.Abs(m.P/st.P-1) > 1e-9 {
		t.Errorf("HS: %v Pa at %v K, the melting curve there %v Pa (%v)", st.P, st.T, m.P, err)
	}
}

// TestHSAtTemperatureCeiling keeps a state at the end of the accepted
// temperatures: R-134a at T = TCeil = 455 K and 24.36 MPa (the
// supercritical benchmark grid's hottest, densest state, 6 pc). The
// start extrapolated from the nearest anchor lay beyond 455 K; HS then
// left its direct solve and searched along the isentrope (1393
// evaluations of the equation).
func TestHSAtTemperatureCeiling(t *testing.T) {
	t.Parallel()
	f := mustFluid(t, "R134a")
	lim := f.Limits()
	st, err := PT(f, 6*f.Critical().P, lim.TCeil)
	if err != nil {
		t.Fatal(err)
	}
	hsCheck(t, f, "at TCeil", &st, false)
	if got, err := HS(f, st.H, st.S); err == nil && math.Abs(got.T-lim.TCeil) > 1e-9*lim.TCeil {
		t.Errorf("HS at TCeil: T = %v K, want %v K", got.T, lim.TCeil)
	}
}

// hsCheck runs HS on the h and s of st and checks that it reproduces them
// to the backward-residual floors, and that the phase is st's (or, with
// any set, any state that reproduces the inputs).
func hsCheck(t *testing.T, f *fluid.Fluid, what string, st *State, any bool) {
	t.Helper()
	got, err := HS(f, st.H, st.S)
	if err != nil {
		t.Errorf("%s %s: HS: %v", f.Name(), what, err)
		return
	}
	if !checkState(t, f, what, &got) {
		return
	}
	for _, q := range []struct {
		name string
		v    float64
	}{{"h", st.H}, {"s", st.S}} {
		if g, floor := backward(f, &got, q.name, q.v); math.Abs(g-q.v) > floor {
			t.Errorf("%s %s: HS gives %s off by %.3g (floor %.3g), %v at %v K", f.Name(), what, q.name, g-q.v, floor, got.Phase, got.T)
		}
	}
	if !any && got.Phase != st.Phase && (st.Flags|got.Flags)&(Indeterminate|AtCritical) == 0 {
		t.Errorf("%s %s: HS gives %v at %v K (q %v, solid %v), want %v at %v K", f.Name(), what, got.Phase, got.T,
			got.Quality, got.Solid, st.Phase, st.T)
	}
}

// TestHSNearBoundaries runs HS next to every boundary its placement
// decides by the node tables: the saturated liquid and vapour lines
// (mixtures of quality 1e-9 to 1e-3 from either end, single phases at
// the vapour pressure times 1 ± 1e-9 to 1e-3), the sublimation and
// melting curves likewise, and the critical neighbourhood (1 mK to 1 K
// below Tc). Every result must reproduce h and s. The phase must be the
// state's, except where another state reproduces them as well: a liquid
// within 1e-6 of the vapour pressure, whose h and s are within the floors
// of the saturated liquid's; a mixture with 1e-9 of vapour, whose h and s
// a liquid reproduces whose pressure is within the rounding of a cold
// liquid's (1e-12·ρRT, a floor of DESIGN.md) of the vapour pressure; and
// states within 0.02 K of Tc.
func TestHSNearBoundaries(t *testing.T) {
	t.Parallel()
	for _, f := range fluids(t) {
		tt, c := f.Triple().T, f.Critical()
		n := 24
		if testing.Short() {
			n = 8
		}
		var ts []float64
		for i := 0; i <= n; i++ {
			ts = append(ts, tt+(c.T-tt)*float64(i)/float64(n)*0.995)
		}
		ts = append(ts, c.T-1, c.T-0.1, c.T-0.01, c.T-1e-3)
		for _, T := range ts {
			for _, q := range []float64{1e-9, 1e-6, 1e-3, 0.5, 1 - 1e-3, 1 - 1e-6, 1 - 1e-9} {
				st, err := TQ(f, T, q)
				if err != nil {
					t.Fatal(err)
				}
				if T == tt {
					continue // on the triple line: Indeterminate
				}
				hsCheck(t, f, fmt.Sprintf("TQ(%v, %v)", T, q), &st, c.T-T < 0.02 || q == 1e-9)
			}
			sat, err := f.SaturationAtT(T)
			if err != nil {
				t.Fatal(err)
			}
			for _, x := range []float64{1e-9, 1e-6, 1e-3} {
				for _, p := range []float64{sat.P * (1 + x), sat.P * (1 - x)} {
					st, err := PT(f, p, T)
					if err != nil {
						continue // below the triple point: the solid
					}
					hsCheck(t, f, fmt.Sprintf("PT(%v, %v)", p, T), &st, x < 1e-5 || c.T-T < 0.02)
				}
			}
		}
	}
	for _, f := range solidFluids(t) {
		s := mustSolid(t, f)
		var k call
		if err := k.init(f, "test", fluid.Input{}, fluid.Input{}, nil, 0); err != nil {
			t.Fatal(err)
		}
		sub, err := s.SublimationCurve(12)
		if err != nil {
			t.Fatal(err)
		}
		melt, err := s.MeltingCurve(12)
		if err != nil {
			t.Fatal(err)
		}
		for i, cs := range [][]sublimation.Coexistence{sub, melt} {
			for _, c := range cs[1:] {
				for _, x := range []float64{1e-9, 1e-6, 1e-3, 0.5, 1 - 1e-3, 1 - 1e-6} {
					st := k.coexistState(&c, i == 0, x)
					hsCheck(t, f, fmt.Sprintf("curve %d at %v K, fluid %v", i, c.T, x), &st, false)
				}
				for _, d := range []float64{1e-3, 1e-2} {
					for _, p := range []float64{c.P * (1 + d), c.P * (1 - d)} {
						st, err := PT(f, p, c.T)
						if err != nil {
							continue // beyond the models
						}
						hsCheck(t, f, fmt.Sprintf("PT(%v, %v) by curve %d", p, c.T, i), &st, false)
					}
				}
			}
		}
	}
}

// TestHSSweep runs HS on pseudo-random states of every region of every
// fluid (PT over the accepted temperatures and pressures, the solid
// regions included, and TQ): each must be reproduced, in its phase.
func TestHSSweep(t *testing.T) {
	t.Parallel()
	n := 1500
	if testing.Short() {
		n = 300
	}
	for _, f := range fluids(t) {
		r := rand.New(rand.NewPCG(5, 11))
		lim := f.Limits()
		tt, tc := f.Triple().T, f.Critical().T
		Tlo := lim.TFloor
		if f.Name() == "water" {
			Tlo = 120 // ice below the vapour floor
		}
		count := map[Phase]int{}
		for i := 0; i < n; i++ {
			var st State
			var err error
			if r.IntN(4) == 0 {
				st, err = TQ(f, tt+r.Float64()*(tc-tt), r.Float64())
			} else {
				T := Tlo + r.Float64()*(min(lim.TMax, 3*tc)-Tlo)
				p := math.Exp(r.Float64() * math.Log(lim.PMax))
				st, err = PT(f, p, T)
			}
			if err != nil {
				continue
			}
			count[st.Phase]++
			hsCheck(t, f, fmt.Sprintf("%v at %v K, %v Pa", st.Phase, st.T, st.P), &st, false)
		}
		t.Logf("%s: %v", f.Name(), count)
	}
}

// TestHSAllocs: HS allocates nothing, in every region.
func TestHSAllocs(t *testing.T) {
	co2 := mustFluid(t, "CO2")
	w := mustFluid(t, "water")
	r := mustFluid(t, "R134a")
	for _, c := range []struct {
		name string
		f    *fluid.Fluid
		st   func() (State, error)
	}{
		{"liquid", w, func() (State, error) { return PT(w, 1e6, 350) }},
		{"vapour", w, func() (State, error) { return PT(w, 1e5, 500) }},
		{"supercritical", w, func() (State, error) { return PT(w, 30e6, 800) }},
		{"two-phase", w, func() (State, error) { return TQ(w, 400, 0.3) }},
		{"two-phase next to the critical point", w, func() (State, error) { return TQ(w, 647.09, 0.3) }},
		{"R-134a vapour", r, func() (State, error) { return PT(r, 1e5, 300) }},
		{"dry ice", co2, func() (State, error) { return PT(co2, 1e5, 190) }},
		{"dry ice and vapour", co2, func() (State, error) { return PQ(co2, 1e5, 0.4) }},
		{"dry ice and liquid", co2, func() (State, error) { return PH(co2, 100e6, -4.5e5) }},
		{"ice", w, func() (State, error) { return PT(w, 1e5, 260) }},
		{"vapour below the triple-point pressure", w, func() (State, error) { return PT(w, 100, 280) }},
		{"liquid water below 273.16 K", w, func() (State, error) { return PT(w, 150e6, 265) }},
	} {
		st, err := c.st()
		if err != nil {
			t.Fatal(c.name, err)
		}
		HS(c.f, st.H, st.S) // the node tables, built once
		if a := testing.AllocsPerRun(10, func() { HS(c.f, st.H, st.S) }); a != 0 {
			t.Errorf("HS %s (%v at %v K): %v allocs", c.name, st.Phase, st.T, a)
		}
	}
}

// TestHSReferenceState runs HS on states of fluids on another reference
// state (fluid.Fluid.WithReference): the node tables are in the default
// one, and the inputs are shifted into it for the placement only.
func TestHSReferenceState(t *testing.T) {
	t.Parallel()
	for _, name := range []string{"CO2", "R134a"} {
		g, err := mustFluid(t, name).WithReference(fluid.RefIIR)
		if err != nil {
			t.Fatal(err)
		}
		var sts []State
		for _, c := range [][2]float64{{1e5, 300}, {5e6, 250}, {30e6, 400}} {
			if st, err := PT(g, c[0], c[1]); err == nil {
				sts = append(sts, st)
			}
		}
		for _, q := range []float64{0.2, 0.9} {
			st, err := TQ(g, 0.5*(g.Triple().T+g.Critical().T), q)
			if err != nil {
				t.Fatal(err)
			}
			sts = append(sts, st)
		}
		if name == "CO2" {
			for _, c := range []func() (State, error){
				func() (State, error) { return PT(g, 1e5, 180) },
				func() (State, error) { return PQ(g, 1e5, 0.3) },
				func() (State, error) {
					m, err := mustSolid(t, g).MeltingTemperature(100e6)
					if err != nil {
						return State{}, err
					}
					return PH(g, 100e6, 0.5*(m.Solid.H+m.Fluid.H))
				},
			} {
				st, err := c()
				if err != nil {
					t.Fatal(err)
				}
				sts = append(sts, st)
			}
		}
		for i := range sts {
			hsCheck(t, g, fmt.Sprintf("%v on IIR", sts[i].Phase), &sts[i], false)
		}
	}
}
