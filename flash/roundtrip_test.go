package flash

import (
	"fmt"
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
)

func fluids(t testing.TB) []*fluid.Fluid {
	t.Helper()
	var fs []*fluid.Fluid
	for _, n := range fluid.Names() {
		f, err := fluid.Lookup(n)
		if err != nil {
			t.Fatal(err)
		}
		fs = append(fs, f)
	}
	return fs
}

// maxRho returns the largest phase density of st (for the pressure floor).
func maxRho(st *State) float64 {
	r := st.Rho
	for i := 0; i < st.N; i++ {
		r = max(r, st.Phases[i].Rho)
	}
	return r
}

// backward returns the backward residual of quantity name of st against
// the input want, and the floor DESIGN.md allows for it:
// |Δp| ≤ 1e-10·p + 1e-12·ρRT, |Δh|, |Δu| ≤ 1e-10·max(|h|, R·Tc),
// |Δs| ≤ 1e-10·max(|s|, R), |Δρ| ≤ 1e-10·ρ; T and q exact to 1e-12.
func backward(f *fluid.Fluid, st *State, name string, want float64) (got, floor float64) {
	R := f.GasConstant()
	Tc := f.Critical().T
	switch name {
	case "p":
		return st.P, 1e-10*want + 1e-12*maxRho(st)*R*st.T
	case "T":
		return st.T, 1e-12 * want
	case "q":
		return st.Quality, 1e-12
	case "rho":
		return st.Rho, 1e-10 * want
	case "h":
		return st.H, 1e-10 * max(math.Abs(want), R*Tc)
	case "u":
		return st.U, 1e-10 * max(math.Abs(want), R*Tc)
	case "s":
		return st.S, 1e-10 * max(math.Abs(want), R)
	}
	panic("unknown quantity " + name)
}

// checkInputs asserts that st, the result of flash fc, reproduces its
// inputs a and b within their backward-residual floors, and returns the
// residuals in units of the floors.
func checkInputs(t *testing.T, f *fluid.Fluid, what string, st *State, fc flashCase, a, b float64) (ra, rb float64) {
	t.Helper()
	var r [2]float64
	for i, c := range [2]struct {
		name string
		want float64
	}{{fc.a, a}, {fc.b, b}} {
		g, floor := backward(f, st, c.name, c.want)
		r[i] = math.Abs(g-c.want) / floor
		if math.Abs(g-c.want) > floor {
			t.Errorf("%s %s: %s = %.17g, off by %.3g (floor %.3g); T = %v, phase %v",
				f.Name(), what, c.name, g, g-c.want, floor, st.T, st.Phase)
		}
	}
	return r[0], r[1]
}

// checkState asserts the invariants every returned state must satisfy:
// finite values, the documented infinities only, phase fractions that add
// up, a known phase.
func checkState(t *testing.T, f *fluid.Fluid, what string, st *State) bool {
	t.Helper()
	ok := true
	for _, v := range []float64{st.T, st.P, st.Rho, st.H, st.S, st.U, st.Quality, st.Solid} {
		if !isFinite(v) {
			ok = false
		}
	}
	for _, v := range []float64{st.Cp, st.Cv, st.W} {
		if math.IsNaN(v) || math.IsInf(v, -1) {
			ok = false
		}
	}
	mixture := st.Phase == TwoPhase || st.Phase == SolidVapor || st.Phase == SolidLiquid || st.Phase == Triple
	if math.IsInf(st.Cp, 1) && !mixture && st.Flags&AtCritical == 0 {
		ok = false
	}
	if math.IsInf(st.Cv, 1) && st.Phase != Triple && st.Flags&AtCritical == 0 {
		ok = false
	}
	if st.N < 1 || st.N > 3 || st.Phase <= Unknown || st.Phase > Triple || st.T <= 0 || st.P <= 0 || st.Rho <= 0 {
		ok = false
	}
	sum := 0.0
	for i := 0; i < st.N && i < 3; i++ {
		sum += st.Phases[i].Fraction
	}
	if math.Abs(sum-1) > 1e-12 {
		ok = false
	}
	// Quality and Solid against the phase fractions (DESIGN.md).
	var xs, xv float64
	for i := 0; i < st.N && i < 3; i++ {
		switch st.Phases[i].Phase {
		case Solid:
			xs += st.Phases[i].Fraction
		case Vapor:
			xv += st.Phases[i].Fraction
		}
	}
	if st.Phase == Vapor {
		xv = 1 // a supercritical-temperature vapour lists itself as Vapor too
	}
	if math.Abs(st.Solid-xs) > 1e-12 || math.Abs(st.Quality-xv) > 1e-12 {
		ok = false
	}
	switch st.Phase {
	case Vapor:
		ok = ok && st.Quality == 1 && st.Solid == 0
	case Liquid, Supercritical:
		ok = ok && st.Quality == 0 && st.Solid == 0
	case Solid:
		ok = ok && st.Quality == 0 && st.Solid == 1 && st.N == 1 && !math.IsInf(st.Cp, 0) && st.W > 0
	case TwoPhase:
		ok = ok && st.Quality > 0 && st.Quality < 1 && st.N == 2 && math.IsInf(st.Cp, 1) && st.Solid == 0
	case SolidVapor:
		ok = ok && st.Quality > 0 && st.Quality < 1 && st.N == 2 && math.IsInf(st.Cp, 1) &&
			st.Phases[0].Phase == Solid && st.Phases[1].Phase == Vapor && !math.IsInf(st.Cv, 0) && st.W > 0
	case SolidLiquid:
		ok = ok && st.Quality == 0 && st.Solid > 0 && st.Solid < 1 && st.N == 2 && math.IsInf(st.Cp, 1) &&
			st.Phases[0].Phase == Solid && st.Phases[1].Phase != Vapor && !math.IsInf(st.Cv, 0) && st.W > 0
	case Triple:
		ok = ok && st.N == 3 && st.Phases[0].Phase == Solid && st.Phases[1].Phase == Liquid &&
			st.Phases[2].Phase == Vapor && math.IsInf(st.Cp, 1) && math.IsInf(st.Cv, 1) && st.W == 0 &&
			st.Solid > 0 && st.Quality > 0 && st.Solid+st.Quality < 1
	}
	if !ok {
		t.Errorf("%s %s: invalid state %+v", f.Name(), what, *st)
	}
	return ok
}

// flashCase is one flash and the two quantities it takes.
type flashCase struct {
	name string
	a, b string
	fn   func(f *fluid.Fluid, a, b float64, opt Options) (State, error)
}

var flashCases = []flashCase{
	{"PH", "p", "h", PHWith}, {"PS", "p", "s", PSWith}, {"DU", "rho", "u", DUWith},
	{"HS", "h", "s", HSWith}, {"DT", "rho", "T", DTWith}, {"TS", "T", "s", TSWith},
	{"PD", "p", "rho", PDWith},
}

func quantityOf(st *State, name string) float64 {
	switch name {
	case "p":
		return st.P
	case "T":
		return st.T
	case "rho":
		return st.Rho
	case "h":
		return st.H
	case "s":
		return st.S
	case "u":
		return st.U
	case "q":
		return st.Quality
	}
	panic(name)
}

// roundTrip runs every flash on the quantities of st and checks the
// backward residuals, the phase, and (where well conditioned) T. If worst
// is not nil it keeps there the largest residual of each quantity in
// units of its floor.
func roundTrip(t *testing.T, f *fluid.Fluid, origin string, st *State, opt Options, worst map[string]float64) (n int) {
	t.Helper()
	for _, fc := range flashCases {
		a, b := quantityOf(st, fc.a), quantityOf(st, fc.b)
		got, err := fc.fn(f, a, b, opt)
		what := fmt.Sprintf("%s(%s = %.17g, %s = %.17g) from %s %v T = %.12g", fc.name, fc.a, a, fc.b, b, origin, st.Phase, st.T)
		if err != nil {
			t.Errorf("%s %s: %v", f.Name(), what, err)
			continue
		}
		n++
		if !checkState(t, f, what, &got) {
			continue
		}
		ra, rb := checkInputs(t, f, what, &got, fc, a, b)
		if worst != nil {
			worst[fc.a] = max(worst[fc.a], ra)
			worst[fc.b] = max(worst[fc.b], rb)
		}
		samePhase := got.Phase == st.Phase ||
			(st.Flags|got.Flags)&(Indeterminate|AtCritical) != 0 ||
			(fc.name == "TS" || fc.name == "PD") && nonUnique(f, st)
		if !samePhase {
			t.Errorf("%s %s: phase %v (T = %v, q = %v), want %v", f.Name(), what, got.Phase, got.T, got.Quality, st.Phase)
		}
		if st.Phase == TwoPhase && got.Phase == TwoPhase && fc.name != "PD" {
			// The quality of a mixture is well conditioned away from Tc.
			if f.Critical().T-st.T > 1 && math.Abs(got.Quality-st.Quality) > 1e-7 {
				t.Errorf("%s %s: q = %v, want %v", f.Name(), what, got.Quality, st.Quality)
			}
		}
	}
	return n
}

// nonUnique reports whether st is a liquid below its density maximum
// ((∂p/∂T)_ρ ≤ 0, in it or in its saturated liquid), where s along the
// isotherm and p along the isochore are not monotone and TS and PD do
// not fix the state (their documented choice is the lowest pressure),
// or a state of water at or below its triple point with ice or liquid:
// ice is lighter than the liquid and melts to lower entropy along an
// isotherm, so (p, ρ) and (T, s) can have a fluid, an ice and a mixed
// solution (PD returns the fluid where there is one, TS the state of
// lowest pressure).
func nonUnique(f *fluid.Fluid, st *State) bool {
	if f.Name() == "water" && st.Phase != Vapor && st.T <= f.Triple().T*(1+1e-12) {
		return true
	}
	if st.Phase != Liquid && st.Phase != TwoPhase {
		return false
	}
	pr, err := f.Props(st.T, st.Phases[0].Rho)
	if err == nil && pr.DpDT <= 0 {
		return true
	}
	s, err := f.SaturationAtT(st.T)
	return err == nil && s.Liquid.DpDT <= 0
}

// gridTemperatures spans the fluid's range with extra points at the
// triple point and around the critical point.
func gridTemperatures(f *fluid.Fluid, n int) []float64 {
	lim := f.Limits()
	tp, c := f.Triple(), f.Critical()
	hi := math.Min(lim.TMax, 2.5*c.T)
	var ts []float64
	for i := 0; i <= n; i++ {
		ts = append(ts, lim.TFloor*math.Pow(hi/lim.TFloor, float64(i)/float64(n)))
	}
	ts = append(ts, tp.T, tp.T+0.01, tp.T+1)
	if tp.T-1 > lim.TFloor {
		ts = append(ts, tp.T-1)
	}
	for _, d := range []float64{-1, -0.1, -0.01, -1e-3, 1e-3, 0.01, 0.1, 1} {
		ts = append(ts, c.T+d)
	}
	return ts
}

func gridPressures(f *fluid.Fluid, n int) []float64 {
	lim := f.Limits()
	c := f.Critical()
	lo := 1.0
	var ps []float64
	for i := 0; i <= n; i++ {
		ps = append(ps, lo*math.Pow(lim.PMax/lo, float64(i)/float64(n)))
	}
	for _, d := range []float64{0.9, 0.99, 0.999, 1.001, 1.01, 1.1} {
		ps = append(ps, c.P*d)
	}
	ps = append(ps, f.Triple().P*1.5)
	return ps
}

// TestRoundTripPT builds states by PT over a grid of (T, p) that crosses
// every fluid region of every fluid (compressed and saturated liquid,
// vapour, supercritical, the critical neighbourhood, the triple point and
// the vapour and liquid below it) and checks that PH, PS, DU, HS, DT, TS
// and PD return the same state, judged by their backward residuals.
func TestRoundTripPT(t *testing.T) {
	t.Parallel()
	n := 14
	if !testing.Short() {
		n = 30
	}
	for _, f := range fluids(t) {
		worst := map[string]float64{}
		phases := map[Phase]int{}
		states, flashes := 0, 0
		for _, T := range gridTemperatures(f, n) {
			for _, p := range gridPressures(f, n) {
				st, err := PT(f, p, T)
				if err != nil {
					continue
				}
				states++
				phases[st.Phase]++
				checkState(t, f, "PT", &st)
				if g, floor := backward(f, &st, "p", p); math.Abs(g-p) > floor {
					t.Errorf("%s PT(%v, %v): p = %v", f.Name(), p, T, g)
				}
				flashes += roundTrip(t, f, "PT", &st, Options{}, worst)
			}
		}
		if states < n*n/3 {
			t.Errorf("%s: only %d PT states", f.Name(), states)
		}
		t.Logf("%s: %d PT states (%v), %d flashes; worst residual / floor: %v", f.Name(), states, phases, flashes, worst)
	}
}

// TestRoundTripTQ builds two-phase and saturated states by TQ from the
// triple point to the critical point and checks that the other flashes
// return the same T and quality.
func TestRoundTripTQ(t *testing.T) {
	t.Parallel()
	for _, f := range fluids(t) {
		tp, c := f.Triple(), f.Critical()
		var ts []float64
		for i := 0; i <= 12; i++ {
			ts = append(ts, tp.T+(c.T-tp.T)*float64(i)/12*0.999)
		}
		ts = append(ts, c.T-0.1, c.T-0.01)
		for _, T := range ts {
			for _, q := range []float64{0, 1e-6, 0.01, 0.3, 0.7, 0.99, 1} {
				st, err := TQ(f, T, q)
				if err != nil {
					t.Errorf("%s TQ(%v, %v): %v", f.Name(), T, q, err)
					continue
				}
				checkState(t, f, "TQ", &st)
				if q == 0 || q == 1 {
					if st.Flags&Saturated == 0 || math.IsInf(st.Cp, 0) || st.N != 1 {
						t.Errorf("%s TQ(%v, %v): %+v", f.Name(), T, q, st)
					}
					continue
				}
				if T == tp.T {
					continue // on the triple line: Indeterminate
				}
				roundTrip(t, f, "TQ", &st, Options{}, nil)
				sp, err := PQ(f, st.P, q)
				if err != nil || math.Abs(sp.T-T) > 1e-9*T || math.Abs(sp.Quality-q) > 1e-12 {
					t.Errorf("%s PQ(%v, %v) = T %v, q %v, %v", f.Name(), st.P, q, sp.T, sp.Quality, err)
				}
			}
		}
	}
}
