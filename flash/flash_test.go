package flash

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"sync"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
	"gonum.org/v1/gonum/diff/fd"
)

func mustFluid(t testing.TB, name string) *fluid.Fluid {
	t.Helper()
	f, err := fluid.Lookup(name)
	if err != nil {
		t.Fatal(err)
	}
	return f
}

// TestTwoPhaseDerivatives checks the analytic two-phase cv and
// homogeneous-equilibrium speed of sound against central differences of
// the flashes themselves: cv = (∂u/∂T)_ρ by DT along the isochore, and
// w² = (∂p/∂ρ)_s by PS along the isentrope.
func TestTwoPhaseDerivatives(t *testing.T) {
	t.Parallel()
	for _, f := range fluids(t) {
		tp, c := f.Triple(), f.Critical()
		for _, x := range []float64{0.1, 0.5, 0.9} {
			T := tp.T + (c.T-tp.T)*x
			for _, q := range []float64{0.05, 0.5, 0.95} {
				st, err := TQ(f, T, q)
				if err != nil {
					t.Fatal(err)
				}
				cv := fd.Derivative(func(T float64) float64 {
					s, err := DT(f, st.Rho, T)
					if err != nil {
						t.Fatal(err)
					}
					return s.U
				}, T, &fd.Settings{Formula: fd.Central, Step: 1e-2})
				if math.Abs(cv-st.Cv) > 1e-5*st.Cv {
					t.Errorf("%s T = %v, q = %v: cv = %v, by differences %v", f.Name(), T, q, st.Cv, cv)
				}
				dpdrho := 1 / fd.Derivative(func(p float64) float64 {
					s, err := PS(f, p, st.S)
					if err != nil {
						t.Fatal(err)
					}
					return s.Rho
				}, st.P, &fd.Settings{Formula: fd.Central, Step: 1e-5 * st.P})
				if w := math.Sqrt(dpdrho); math.Abs(w-st.W) > 1e-5*st.W {
					t.Errorf("%s T = %v, q = %v: w = %v, by differences %v", f.Name(), T, q, st.W, w)
				}
			}
		}
	}
}

// TestDUDoubleCrossing follows an isochore of liquid water between its
// saturated density at the triple point (999.793 kg/m3) and the maximum
// of the saturated density near 4 °C: it enters the dome and leaves it
// again. DU must return each state of the isochore, single-phase and
// two-phase alike.
func TestDUDoubleCrossing(t *testing.T) {
	f := mustFluid(t, "water")
	const rho = 999.9 // kg/m3, between ρ′(273.16 K) and max ρ′ (common knowledge: ~999.97 near 277 K)
	var phases []Phase
	for T := 273.2; T < 285; T += 0.25 {
		st, err := DT(f, rho, T)
		if err != nil {
			t.Fatalf("DT(%v, %v): %v", rho, T, err)
		}
		if len(phases) == 0 || phases[len(phases)-1] != st.Phase {
			phases = append(phases, st.Phase)
		}
		got, err := DU(f, rho, st.U)
		if err != nil {
			t.Errorf("DU(%v, %v) [T = %v, %v]: %v", rho, st.U, T, st.Phase, err)
			continue
		}
		if math.Abs(got.T-T) > 1e-7 || got.Phase != st.Phase {
			t.Errorf("DU(%v, %v): T = %v %v, want %v %v", rho, st.U, got.T, got.Phase, T, st.Phase)
		}
	}
	want := []Phase{Liquid, TwoPhase, Liquid}
	if len(phases) != len(want) || phases[0] != want[0] || phases[1] != want[1] || phases[2] != want[2] {
		t.Errorf("phases along the isochore: %v, want %v", phases, want)
	}
}

// TestMetastable checks metastable states on request, and the errors
// without AllowMetastable and beyond the spinodal.
func TestMetastable(t *testing.T) {
	f := mustFluid(t, "water")
	sat, err := f.SaturationAtP(1e5)
	if err != nil {
		t.Fatal(err)
	}
	meta := Options{Phase: Liquid, AllowMetastable: true}
	// Superheated liquid: a little above the saturated liquid's enthalpy.
	h := sat.Liquid.H + 20e3
	st, err := PHWith(f, 1e5, h, meta)
	if err != nil || st.Phase != Liquid || st.Flags&Metastable == 0 || st.T <= sat.T || math.Abs(st.H-h) > 1e-6 {
		t.Errorf("metastable PH: %+v, %v", st, err)
	}
	if _, err := PHWith(f, 1e5, h, Options{Phase: Liquid}); !errors.Is(err, fluid.ErrOutOfRange) {
		t.Errorf("PH requesting liquid in the dome without AllowMetastable: %v", err)
	}
	if st, err := PH(f, 1e5, h); err != nil || st.Phase != TwoPhase {
		t.Errorf("stable PH: %v %v", st.Phase, err)
	}
	// Superheated liquid by PT, and subcooled vapour.
	st, err = PTWith(f, 1e5, sat.T+10, meta)
	if err != nil || st.Flags&Metastable == 0 || st.Rho < 900 {
		t.Errorf("metastable PT liquid: %+v, %v", st, err)
	}
	st, err = PTWith(f, 1e5, sat.T-5, Options{Phase: Vapor, AllowMetastable: true})
	if err != nil || st.Flags&Metastable == 0 || st.Rho > 1 {
		t.Errorf("metastable PT vapour: %+v, %v", st, err)
	}
	if _, err := PTWith(f, 1e5, sat.T-5, Options{Phase: Vapor}); !errors.Is(err, fluid.ErrOutOfRange) {
		t.Errorf("PT requesting vapour below Tsat: %v", err)
	}
	// Beyond the vapour spinodal.
	if _, err := PTWith(f, 1e7, 400, Options{Phase: Vapor, AllowMetastable: true}); !errors.Is(err, fluid.ErrUnstable) {
		t.Errorf("PT vapour beyond the spinodal: %v", err)
	}
	// DT inside the dome, on the liquid side, at a positive pressure.
	s5, _ := f.SaturationAtT(sat.T + 5)
	rho := s5.Liquid.Rho - 0.02
	st, err = DTWith(f, rho, sat.T+5, meta)
	if err != nil || st.Flags&Metastable == 0 || st.Phase != Liquid || st.P >= s5.P {
		t.Errorf("metastable DT: %+v, %v", st, err)
	}
	if st, err := DT(f, rho, sat.T+5); err != nil || st.Phase != TwoPhase {
		t.Errorf("stable DT: %v %v", st.Phase, err)
	}
}

// TestErrors checks the typed errors of bad inputs for every flash.
func TestErrors(t *testing.T) {
	f := mustFluid(t, "water")
	nan, inf := math.NaN(), math.Inf(1)
	c := f.Critical()
	type call func() (State, error)
	for _, e := range []struct {
		name string
		fn   call
		want error
	}{
		{"PT NaN", func() (State, error) { return PT(f, nan, 300) }, fluid.ErrInvalidInput},
		{"PT Inf", func() (State, error) { return PT(f, 1e5, inf) }, fluid.ErrInvalidInput},
		{"PT p<=0", func() (State, error) { return PT(f, 0, 300) }, fluid.ErrInvalidInput},
		{"PT T<0", func() (State, error) { return PT(f, 1e5, -3) }, fluid.ErrInvalidInput},
		{"PT two-phase request", func() (State, error) { return PTWith(f, 1e5, 300, Options{Phase: TwoPhase}) }, fluid.ErrInvalidInput},
		{"PT bad phase", func() (State, error) { return PTWith(f, 1e5, 300, Options{Phase: 42}) }, fluid.ErrInvalidInput},
		{"PT T>ceiling", func() (State, error) { return PT(f, 1e5, 1e5) }, fluid.ErrOutOfRange},
		{"PT p>ceiling", func() (State, error) { return PT(f, 1e15, 400) }, fluid.ErrOutOfRange},
		{"PT nil fluid", func() (State, error) { return PT(nil, 1e5, 300) }, fluid.ErrInvalidInput},
		{"TQ q>1", func() (State, error) { return TQ(f, 300, 1.5) }, fluid.ErrInvalidInput},
		{"TQ q<0", func() (State, error) { return TQ(f, 300, -0.1) }, fluid.ErrInvalidInput},
		{"TQ q NaN", func() (State, error) { return TQ(f, 300, nan) }, fluid.ErrInvalidInput},
		{"TQ above Tc", func() (State, error) { return TQ(f, c.T+1, 0.5) }, fluid.ErrOutOfRange},
		{"PQ above pc", func() (State, error) { return PQ(f, c.P*1.01, 0.5) }, fluid.ErrOutOfRange},
		{"PQ p<=0", func() (State, error) { return PQ(f, -1, 0.5) }, fluid.ErrInvalidInput},
		{"PH NaN h", func() (State, error) { return PH(f, 1e5, nan) }, fluid.ErrInvalidInput},
		{"PH Inf h", func() (State, error) { return PH(f, 1e5, -inf) }, fluid.ErrInvalidInput},
		{"PH h too high", func() (State, error) { return PH(f, 1e5, 1e9) }, fluid.ErrOutOfRange},
		{"PS NaN s", func() (State, error) { return PS(f, 1e5, nan) }, fluid.ErrInvalidInput},
		{"DU rho<=0", func() (State, error) { return DU(f, 0, 1e5) }, fluid.ErrInvalidInput},
		{"DU rho>ceiling", func() (State, error) { return DU(f, 1e6, 1e5) }, fluid.ErrOutOfRange},
		{"DT NaN", func() (State, error) { return DT(f, nan, 300) }, fluid.ErrInvalidInput},
		{"HS Inf", func() (State, error) { return HS(f, inf, 1e3) }, fluid.ErrInvalidInput},
		{"TS T<=0", func() (State, error) { return TS(f, 0, 1e3) }, fluid.ErrInvalidInput},
		{"PD NaN", func() (State, error) { return PD(f, 1e5, nan) }, fluid.ErrInvalidInput},
	} {
		st, err := e.fn()
		var fe *fluid.Error
		if !errors.Is(err, e.want) || !errors.As(err, &fe) {
			t.Errorf("%s: err = %v, want %v", e.name, err, e.want)
			continue
		}
		if st != (State{}) {
			t.Errorf("%s: a state with the error: %+v", e.name, st)
		}
		msg := err.Error()
		for i := 0; i < len(msg); i++ {
			if msg[i] >= 0x80 {
				t.Errorf("%s: non-ASCII message %q", e.name, msg)
				break
			}
		}
	}
}

// TestCriticalPoint checks TQ and PQ at exactly the critical point.
func TestCriticalPoint(t *testing.T) {
	for _, f := range fluids(t) {
		c := f.Critical()
		for _, st := range func() []State {
			a, err1 := TQ(f, c.T, 0.5)
			b, err2 := PQ(f, c.P, 0.5)
			if err1 != nil || err2 != nil {
				t.Fatal(err1, err2)
			}
			return []State{a, b}
		}() {
			if st.Flags&AtCritical == 0 || st.T != c.T || st.P != c.P || st.Rho != c.Rho {
				t.Errorf("%s at the critical point: %+v", f.Name(), st)
			}
			if f.HasNonAnalytic() && (!math.IsInf(st.Cv, 1) || st.W != 0) {
				t.Errorf("%s at the critical point: cv = %v, w = %v", f.Name(), st.Cv, st.W)
			}
		}
	}
}

// TestWarmStart checks that warm-started flashes return the cold result
// from nearby guesses, single-phase and two-phase.
func TestWarmStart(t *testing.T) {
	for _, f := range fluids(t) {
		c := f.Critical()
		for _, start := range []struct{ p, T float64 }{{0.5 * c.P, 0.9 * c.T}, {0.1 * c.P, 1.2 * c.T}, {2 * c.P, 1.1 * c.T}} {
			prev, err := PT(f, start.p, start.T)
			if err != nil {
				t.Fatal(err)
			}
			for _, dh := range []float64{-2e3, 500, 5e3} {
				cold, err1 := PH(f, prev.P*1.01, prev.H+dh)
				warm, err2 := PHWith(f, prev.P*1.01, prev.H+dh, Options{Guess: &prev})
				if err1 != nil || err2 != nil || math.Abs(cold.T-warm.T) > 1e-8*cold.T || cold.Phase != warm.Phase {
					t.Errorf("%s PH warm %v %v vs cold %v %v (%v, %v)", f.Name(), warm.T, warm.Phase, cold.T, cold.Phase, err2, err1)
				}
			}
		}
		prev, err := TQ(f, 0.8*c.T, 0.4)
		if err != nil {
			t.Fatal(err)
		}
		cold, err1 := PH(f, prev.P*1.001, prev.H+1e3)
		warm, err2 := PHWith(f, prev.P*1.001, prev.H+1e3, Options{Guess: &prev})
		if err1 != nil || err2 != nil || math.Abs(cold.T-warm.T) > 1e-9*cold.T || math.Abs(cold.Quality-warm.Quality) > 1e-9 {
			t.Errorf("%s two-phase PH warm %+v vs cold %+v (%v, %v)", f.Name(), warm, cold, err2, err1)
		}
		if w, err := TQWith(f, 0.81*c.T, 0.4, Options{Guess: &prev}); err != nil || w.Phase != TwoPhase {
			t.Errorf("%s TQ warm: %v", f.Name(), err)
		}
	}
}

// TestWarmStartAcrossSaturation holds warm starts from a single phase
// next to the vapour-pressure curve to the cold flash where the step
// crosses the curve (a liquid heated into the dome, a vapour cooled into
// it, either stepped through it to the other phase) and where it stays on
// its side (a vapour near its vapour pressure, solved in (T, ln ρ)): the
// same phase, T within 1e-9, quality within 1e-9.
func TestWarmStartAcrossSaturation(t *testing.T) {
	for _, f := range fluids(t) {
		tp, c := f.Triple(), f.Critical()
		for _, T := range []float64{tp.T + 0.2*(c.T-tp.T), tp.T + 0.6*(c.T-tp.T), 0.97 * c.T} {
			s, err := f.SaturationAtT(T)
			if err != nil {
				t.Fatal(err)
			}
			hfg := s.Vapor.H - s.Liquid.H
			for _, g := range []struct {
				p  float64
				dh []float64 // steps in units of the enthalpy of vaporization
			}{
				{1.003 * s.P, []float64{0.01, 0.5, 1.2}},    // liquid
				{0.997 * s.P, []float64{-0.01, -0.5, 0.01}}, // vapour
			} {
				prev, err := PT(f, g.p, T)
				if err != nil {
					t.Fatal(err)
				}
				for _, d := range g.dh {
					p, h := g.p*1.0005, prev.H+d*hfg
					cold, err1 := PH(f, p, h)
					warm, err2 := PHWith(f, p, h, Options{Guess: &prev})
					if err1 != nil || err2 != nil || cold.Phase != warm.Phase ||
						math.Abs(cold.T-warm.T) > 1e-9*cold.T || math.Abs(cold.Quality-warm.Quality) > 1e-9 {
						t.Errorf("%s PH(%v, %v) from %v at %v K: warm %v %v q %v, cold %v %v q %v (%v, %v)",
							f.Name(), p, h, prev.Phase, T, warm.Phase, warm.T, warm.Quality,
							cold.Phase, cold.T, cold.Quality, err2, err1)
					}
				}
			}
		}
	}
}

// TestDUWarmStart checks DU warm-started from a mixture (isochoreWarm)
// and from single phases (predictT) against the cold flash: a
// simulator's steps in ρ and u that stay in the dome, leave it or enter
// it, on both sides of the critical density, next to the triple point
// and the critical point; the same phase, T within 1e-9 and quality
// within 1e-9.
func TestDUWarmStart(t *testing.T) {
	for _, f := range fluids(t) {
		tp, c := f.Triple(), f.Critical()
		for _, T := range []float64{tp.T + 0.02*(c.T-tp.T), tp.T + 0.5*(c.T-tp.T), 0.995 * c.T} {
			for _, q := range []float64{0, 0.02, 0.5, 0.98, 1} {
				prev, err := TQ(f, T, q)
				if err != nil {
					t.Fatal(err)
				}
				s := prev
				if q == 0 || q == 1 {
					// The saturated phase just outside the dome.
					if s, err = DT(f, prev.Rho*(1+0.002*(0.5-q)), T*1.001); err != nil {
						t.Fatal(err)
					}
				}
				for _, d := range [][2]float64{{1.001, 500}, {0.999, -500}, {1.05, 5e3}, {0.95, -5e3}, {1, 3e4}, {1, -3e4}} {
					rho, u := s.Rho*d[0], s.U+d[1]
					cold, err1 := DU(f, rho, u)
					warm, err2 := DUWith(f, rho, u, Options{Guess: &s})
					if (err1 == nil) != (err2 == nil) || err1 == nil && (cold.Phase != warm.Phase ||
						math.Abs(cold.T-warm.T) > 1e-9*cold.T || math.Abs(cold.Quality-warm.Quality) > 1e-9) {
						t.Errorf("%s DU(%v, %v) from %v at %v K q %v: warm %v %v q %v, cold %v %v q %v (%v, %v)",
							f.Name(), rho, u, s.Phase, s.T, q, warm.Phase, warm.T, warm.Quality,
							cold.Phase, cold.T, cold.Quality, err2, err1)
					}
				}
			}
		}
	}
}

// TestWarmStartsAgree checks every flash warm-started from each state of
// the benchmark grids, its inputs moved by a simulator's step (0.1 % in
// the first, 0.1 % of the second's scale, 1e-3 in a quality), against
// the same flash cold: the same phase, T, ρ and quality within 1e-9.
func TestWarmStartsAgree(t *testing.T) {
	for _, f := range fluids(t) {
		for _, fl := range benchFlashes {
			if fl.warm {
				continue
			}
			for _, rg := range benchRegions {
				if !applies(fl.name, rg.name) {
					continue
				}
				sts := rg.states(f)
				for i := range sts {
					g := sts[i]
					a, b := warmStep(fl, &g)
					cold, err1 := fl.fn(f, a, b, Options{})
					warm, err2 := fl.fn(f, a, b, Options{Guess: &g})
					if (err1 == nil) != (err2 == nil) || err1 == nil && (cold.Phase != warm.Phase ||
						math.Abs(cold.T-warm.T) > 1e-9*cold.T || math.Abs(cold.Rho-warm.Rho) > 1e-9*cold.Rho ||
						math.Abs(cold.Quality-warm.Quality) > 1e-9) {
						t.Errorf("%s %s(%v, %v) from %v at %v K: warm %v %v K %v kg/m3 q %v, cold %v %v K %v kg/m3 q %v (%v, %v)",
							f.Name(), fl.name, a, b, g.Phase, g.T, warm.Phase, warm.T, warm.Rho, warm.Quality,
							cold.Phase, cold.T, cold.Rho, cold.Quality, err2, err1)
					}
				}
			}
		}
	}
}

// TestRobustness is a sweep of pseudo-random states from several
// goroutines. Valid states (made by DT from random (T, ρ) in the fluid
// region) must come back from a random other flash, reproducing its
// inputs; random inputs of every kind, valid or not, must give an error
// or a valid state, never a panic.
func TestRobustness(t *testing.T) {
	t.Parallel()
	n := 300
	if !testing.Short() {
		n = 2500
	}
	for _, f := range fluids(t) {
		var wg sync.WaitGroup
		for g := 0; g < 4; g++ {
			wg.Add(1)
			go func(seed uint64) {
				defer wg.Done()
				r := rand.New(rand.NewPCG(seed, 7))
				lim := f.Limits()
				c := f.Critical()
				for i := 0; i < n; i++ {
					T := lim.TFloor * math.Pow(math.Min(lim.TMax, 3*c.T)/lim.TFloor, r.Float64())
					rho := 1e-4 * c.Rho * math.Pow(3.2*c.Rho/(1e-4*c.Rho), r.Float64())
					st, err := DT(f, rho, T)
					if err != nil || st.P > lim.PMax {
						continue
					}
					fc := flashCases[r.IntN(len(flashCases))]
					a, b := quantityOf(&st, fc.a), quantityOf(&st, fc.b)
					got, err := fc.fn(f, a, b, Options{})
					what := fc.name + " from DT"
					if err != nil {
						if (fc.name == "TS" || fc.name == "PD") && nonUnique(f, &st) {
							continue
						}
						t.Errorf("%s %s(%.17g, %.17g) [T = %v, rho = %v, %v]: %v", f.Name(), fc.name, a, b, T, rho, st.Phase, err)
						continue
					}
					if !checkState(t, f, what, &got) {
						continue
					}
					checkInputs(t, f, fmt.Sprintf("%s(%.17g, %.17g)", fc.name, a, b), &got, fc, a, b)
					// Random inputs, mostly nonsense.
					x := randomInput(r)
					y := randomInput(r)
					fc = flashCases[r.IntN(len(flashCases))]
					if got, err := fc.fn(f, x, y, Options{}); err == nil {
						checkState(t, f, fc.name+" from random inputs", &got)
					}
				}
			}(uint64(g) + 1)
		}
		wg.Wait()
	}
}

func randomInput(r *rand.Rand) float64 {
	switch r.IntN(10) {
	case 0:
		return math.NaN()
	case 1:
		return math.Inf(1 - 2*r.IntN(2))
	case 2:
		return -r.Float64() * 1e6
	case 3:
		return 0
	}
	return math.Pow(10, -3+12*r.Float64())
}

func TestAllocs(t *testing.T) {
	f := mustFluid(t, "water")
	prev, _ := PT(f, 1e6, 450)
	two, _ := TQ(f, 400, 0.3)
	for name, fn := range map[string]func(){
		"PT liquid":    func() { PT(f, 1e6, 350) },
		"PT vapour":    func() { PT(f, 1e5, 500) },
		"PH liquid":    func() { PH(f, 1e6, 3e5) },
		"PH vapour":    func() { PH(f, 1e5, 3e6) },
		"PH two-phase": func() { PH(f, 1e5, 1e6) },
		"PH warm":      func() { PHWith(f, 1.01e6, prev.H+1e3, Options{Guess: &prev}) },
		"PS":           func() { PS(f, 1e6, 2000) },
		"TQ":           func() { TQ(f, 400, 0.5) },
		"TQ warm":      func() { TQWith(f, 401, 0.5, Options{Guess: &two}) },
		"PQ":           func() { PQ(f, 1e5, 0.5) },
		"DT":           func() { DT(f, 10, 400) },
		"DT two-phase": func() { DT(f, 10, 450) },
		"DU two-phase": func() { DU(f, two.Rho, two.U) },
		"DU liquid":    func() { DU(f, 990, 2e5) },
		"PT near sat":  func() { PT(f, 1.001*two.P, 400) },
		"PH p > pc":    func() { PH(f, 5e7, 5e5) },
		"PD":           func() { PD(f, 1e5, 990) },
		"PH T > Tc":    func() { PH(f, 5e7, 3e6) },
		"PS T > Tc":    func() { PS(f, 1e7, 6500) },
		"PH below pt":  func() { PH(f, 300, 2.8e6) },
		"PT T > Tc":    func() { PT(f, 5e7, 900) },
	} {
		if a := testing.AllocsPerRun(20, fn); a != 0 {
			t.Errorf("%s: %v allocs", name, a)
		}
	}
}
