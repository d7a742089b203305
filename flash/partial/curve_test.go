package partial

import (
	"errors"
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/sublimation"
	"gonum.org/v1/gonum/diff/fd"
)

// curvePoint is a point of a coexistence curve: the two phases as
// flash.PhaseState-like values and the curve's T and p.
type curvePoint struct {
	T, P float64
	ph   [2]flash.State // each phase as a single-phase state (for value)
}

func pointOf(T, p float64, a, b phaseValues) curvePoint {
	return curvePoint{T: T, P: p, ph: [2]flash.State{a.state(T, p), b.state(T, p)}}
}

type phaseValues struct{ rho, h, s, u float64 }

func (v phaseValues) state(T, p float64) flash.State {
	return flash.State{T: T, P: p, Rho: v.rho, H: v.h, S: v.s, U: v.u}
}

func fluidValues(pr *fluid.Props) phaseValues       { return phaseValues{pr.Rho, pr.H, pr.S, pr.U} }
func solidValues(sp *sublimation.Props) phaseValues { return phaseValues{sp.Rho, sp.H, sp.S, sp.U} }

// solveCurve solves curve c of f at T (atP false) or p (atP true) with
// the curve solvers of packages fluid and sublimation.
func solveCurve(f *fluid.Fluid, c Curve, x float64, atP bool) (curvePoint, error) {
	if c == Saturation {
		s, err := saturation(f, x, atP)
		return pointOf(s.T, s.P, fluidValues(&s.Liquid), fluidValues(&s.Vapor)), err
	}
	co, err := solidCurve(f, c, x, atP)
	return pointOf(co.T, co.P, solidValues(&co.Solid), fluidValues(&co.Fluid)), err
}

// curveCases are points of each curve of each fluid, in T and in p, away
// from the curves' ends (our own choice).
var curveCases = map[string][]struct {
	c      Curve
	Ts, ps []float64
}{
	"water": {
		{Saturation, []float64{300, 450, 600}, []float64{1e4, 1e6, 1e7}},
		{Sublimation, []float64{210, 250, 270}, []float64{1, 100, 500}},
		{Melting, []float64{255, 265, 272}, []float64{10e6, 100e6, 200e6}},
	},
	"CO2": {
		{Saturation, []float64{220, 260, 300}, []float64{1e6, 4e6, 7e6}},
		{Sublimation, []float64{160, 190, 210}, []float64{1e3, 1e5, 4e5}},
		{Melting, []float64{220, 260, 320}, []float64{10e6, 200e6, 700e6}},
	},
	"R134a": {
		{Saturation, []float64{200, 300, 370}, []float64{1e4, 1e6, 3.5e6}},
	},
}

// TestSlopesAgainstCurves checks the slopes along every curve of every
// fluid against centred differences of the curve solvers (in T with
// SlopesAtT, in p with SlopesAtP), for every quantity of each phase, to
// fdTol; and the Clausius–Clapeyron equation dp/dT = (h₂ − h₁)/(T(v₂ −
// v₁)) from the phases' own enthalpies and volumes (Clapeyron 1834,
// Clausius 1850; any textbook) to idTol.
func TestSlopesAgainstCurves(t *testing.T) {
	t.Parallel()
	for _, name := range fluid.Names() {
		f := mustFluid(t, name)
		cases, ok := curveCases[name]
		if !ok {
			t.Fatalf("no curve points for %s", name)
		}
		worst := 0.0
		for _, cc := range cases {
			for k, xs := range [][]float64{cc.Ts, cc.ps} {
				atP := k == 1
				for _, x := range xs {
					var sl Slopes
					var err error
					if atP {
						sl, err = SlopesAtP(f, cc.c, x)
					} else {
						sl, err = SlopesAtT(f, cc.c, x)
					}
					if err != nil {
						t.Fatalf("%s %v at %v: %v", name, cc.c, x, err)
					}
					pt0, err := solveCurve(f, cc.c, x, atP)
					if err != nil {
						t.Fatal(err)
					}
					// Clausius–Clapeyron.
					a, b := &pt0.ph[0], &pt0.ph[1]
					cl := (b.H - a.H) / (pt0.T * (1/b.Rho - 1/a.Rho))
					if math.Abs(cl-sl.DpDT) > idTol*math.Abs(cl) {
						t.Errorf("%s %v at %v: dp/dT = %v, Clausius-Clapeyron with h and v %v", name, cc.c, x, sl.DpDT, cl)
					}
					// Differences of the solver.
					wrt := T
					if atP {
						wrt = P
					}
					w := checkCurve(t, f, cc.c, x, atP, &sl, wrt)
					worst = max(worst, w)
				}
			}
		}
		t.Logf("%s: worst relative difference of the slopes %.2g", name, worst)
	}
}

// checkCurve compares the slopes of both phases with respect to wrt (T
// or P) against the fourth-order centred difference of the solver, with
// the rounding of the solvers (about 1e-12 of each quantity's natural
// size, 1e-10 for the melting curve, whose solver stops at Newton steps
// of 1e-12 in ln ρ of a stiff liquid) as a floor; it returns the worst
// relative difference.
func checkCurve(t *testing.T, f *fluid.Fluid, c Curve, x0 float64, atP bool, sl *Slopes, wrt Quantity) float64 {
	t.Helper()
	memo := map[float64]curvePoint{}
	at := func(x float64) curvePoint {
		if p, ok := memo[x]; ok {
			return p
		}
		p, err := solveCurve(f, c, x, atP)
		if err != nil {
			t.Fatalf("%s %v at %v: %v", f.Name(), c, x, err)
		}
		memo[x] = p
		return p
	}
	h := fdStep * 10 * x0
	eps := 1e-12
	if c == Melting {
		eps = 1e-10
	}
	worst := 0.0
	for i := 0; i < 2; i++ {
		base := at(x0).ph[i]
		for _, a := range quantities {
			num := fd.Derivative(func(x float64) float64 {
				p := at(x)
				return value(&p.ph[i], a)
			}, x0, &fd.Settings{Formula: central4, Step: h})
			an, err := sl.Derivative(i, a, wrt)
			if err != nil {
				t.Errorf("%s %v at %v: phase %d d%v/d%v: %v", f.Name(), c, x0, i, a, wrt, err)
				continue
			}
			floor := 3 * eps * scale(f, &base, a) / h
			d := math.Abs(num - an)
			if d > fdTol*math.Abs(an)+floor {
				t.Errorf("%s %v at %v: phase %d d%v/d%v = %.12g, by differences %.12g", f.Name(), c, x0, i, a, wrt, an, num)
			}
			if an != 0 && floor < 1e-2*fdTol*math.Abs(an) {
				worst = max(worst, d/math.Abs(an))
			}
		}
	}
	return worst
}

// TestSlopesConsistency checks, at the two-phase test states of every
// region, that SlopesOf (from the state's phases) equals SlopesAtT (from
// the curve solved at the state's T), and that each phase's slope equals
// the single-phase derivatives of that phase along the curve,
// da/dT = (∂a/∂T)_p + (∂a/∂p)_T dp/dT (chain rule), with the phase's own
// Jacobian (At of the phase alone): two independent formulas.
func TestSlopesConsistency(t *testing.T) {
	t.Parallel()
	for _, name := range fluid.Names() {
		f := mustFluid(t, name)
		for _, ts := range mixtures(t, f) {
			st := ts.st
			s1, err := SlopesOf(f, st)
			if err != nil {
				t.Fatal(err)
			}
			s2, err := SlopesAtT(f, s1.Curve, st.T)
			if err != nil {
				t.Fatal(err)
			}
			if s1.Phases != s2.Phases || s1.T != s2.T {
				t.Errorf("%s %s: SlopesOf %v %v, SlopesAtT %v %v", name, ts.name, s1.Phases, s1.T, s2.Phases, s2.T)
			}
			for i := 0; i < 2; i++ {
				ph := phaseAlone(&st, i)
				j, err := At(f, ph)
				if err != nil {
					t.Fatalf("%s %s phase %d: %v", name, ts.name, i, err)
				}
				for _, a := range quantities {
					d1, err1 := s1.Derivative(i, a, T)
					d2, err2 := s2.Derivative(i, a, T)
					dT, err3 := j.Derivative(a, T, P)
					dp, err4 := j.Derivative(a, P, T)
					if err1 != nil || err2 != nil || err3 != nil || err4 != nil {
						t.Fatal(err1, err2, err3, err4)
					}
					chain := dT + dp*s1.DpDT
					// The curve solvers agree with the flashes' states to
					// their residuals (1e-12 in the phases' densities).
					if !near(d1, d2) && math.Abs(d1-d2) > 1e-7*max(math.Abs(dT), math.Abs(dp*s1.DpDT)) {
						t.Errorf("%s %s phase %d: d%v/dT = %v by SlopesOf, %v by SlopesAtT", name, ts.name, i, a, d1, d2)
					}
					if !near(d1, chain, dT, dp*s1.DpDT) {
						t.Errorf("%s %s phase %d: d%v/dT = %v, by the chain rule %v", name, ts.name, i, a, d1, chain)
					}
				}
			}
		}
	}
}

// phaseAlone returns phase i of a two-phase state as a single-phase state.
func phaseAlone(st *flash.State, i int) flash.State {
	p := st.Phases[i]
	ph := p.Phase
	one := flash.State{T: st.T, P: st.P, Rho: p.Rho, H: p.H, S: p.S, U: p.U, Cp: p.Cp, Cv: p.Cv, W: p.W,
		Phase: ph, N: 1}
	one.Phases[0] = p
	one.Phases[0].Fraction = 1
	return one
}

// TestSlopesSpecial checks the critical point and the errors.
func TestSlopesSpecial(t *testing.T) {
	t.Parallel()
	for _, name := range fluid.Names() {
		f := mustFluid(t, name)
		c := f.Critical()
		s, err := SlopesAtT(f, Saturation, c.T)
		if err != nil {
			t.Fatal(err)
		}
		pr, _ := f.Props(c.T, c.Rho) // R-134a: ErrUnstable with the values
		if s.DpDT != pr.DpDT {
			t.Errorf("%s at Tc: dp/dT = %v, (dp/dT)_rho %v", name, s.DpDT, pr.DpDT)
		}
		if d, err := s.Derivative(1, T, P); err != nil || math.Abs(d*pr.DpDT-1) > 1e-15 {
			t.Errorf("%s at Tc: dT/dp = %v, %v", name, d, err)
		}
		for _, a := range []Quantity{Rho, V, H, S, U, F} {
			if d, err := s.Derivative(0, a, T); !errors.Is(err, fluid.ErrUndefined) || !math.IsNaN(d) {
				t.Errorf("%s at Tc: d%v'/dT = %v, %v; want undefined", name, a, d, err)
			}
		}
		if _, err := SlopesAtT(f, Saturation, c.T+1); !errors.Is(err, fluid.ErrOutOfRange) {
			t.Errorf("%s above Tc: %v", name, err)
		}
	}
	w := mustFluid(t, "water")
	r := mustFluid(t, "R134a")
	for _, k := range []struct {
		name string
		err  error
		want error
	}{
		{"nil fluid", second(SlopesAtT(nil, Saturation, 300)), fluid.ErrInvalidInput},
		{"no curve", second(SlopesAtT(w, 0, 300)), fluid.ErrInvalidInput},
		{"curve 4", second(SlopesAtP(w, 4, 1e5)), fluid.ErrInvalidInput},
		{"R-134a sublimation", second(SlopesAtT(r, Sublimation, 150)), fluid.ErrUndefined},
		{"R-134a melting", second(SlopesAtP(r, Melting, 1e6)), fluid.ErrUndefined},
		{"sublimation above Tt", second(SlopesAtT(w, Sublimation, 300)), fluid.ErrOutOfRange},
		{"melting NaN", second(SlopesAtP(w, Melting, math.NaN())), fluid.ErrInvalidInput},
		{"SlopesOf nil", second(SlopesOf(nil, flash.State{})), fluid.ErrInvalidInput},
		{"SlopesOf single phase", second(SlopesOf(w, mustState(flash.PT(w, 1e5, 300)))), fluid.ErrInvalidInput},
	} {
		if !errors.Is(k.err, k.want) {
			t.Errorf("%s: %v, want %v", k.name, k.err, k.want)
		}
	}
	s, err := SlopesAtT(w, Saturation, 400)
	if err != nil {
		t.Fatal(err)
	}
	for _, k := range []struct {
		i    int
		a, b Quantity
	}{{2, H, T}, {-1, H, T}, {0, 0, T}, {0, H, 12}} {
		if d, err := s.Derivative(k.i, k.a, k.b); !errors.Is(err, fluid.ErrInvalidInput) || !math.IsNaN(d) {
			t.Errorf("Derivative(%d, %v, %v) = %v, %v", k.i, k.a, k.b, d, err)
		}
	}
	if d, err := s.Derivative(0, P, P); d != 1 || err != nil {
		t.Errorf("dp/dp = %v, %v", d, err)
	}
}

func second[T any](_ T, err error) error { return err }

func mustState(st flash.State, err error) flash.State {
	if err != nil {
		panic(err)
	}
	return st
}
