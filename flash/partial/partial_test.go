package partial

import (
	"errors"
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
	"gonum.org/v1/gonum/diff/fd"
)

// central4 is the fourth-order central difference of the first
// derivative, (f(x−2h) − 8f(x−h) + 8f(x+h) − f(x+2h))/(12h) (a standard
// stencil: common practice).
var central4 = fd.Formula{
	Stencil:    []fd.Point{{Loc: -2, Coeff: 1.0 / 12}, {Loc: -1, Coeff: -8.0 / 12}, {Loc: 1, Coeff: 8.0 / 12}, {Loc: 2, Coeff: -1.0 / 12}},
	Derivative: 1,
	Step:       1e-4,
}

// fdStep is the step of the differences relative to the natural size of
// the varied quantity (scale). With the fourth-order stencil the
// truncation error is about fdStep⁴ relative, and the flashes' rounding
// (about 1e-12 of their inputs' size) contributes about 1e-12/fdStep.
const fdStep = 1e-5

// fdTol is the bound on the relative difference between the analytic
// derivatives and the differences of the flashes (issue 11: ~1e-6).
const fdTol = 1e-6

// TestAgainstFlashes checks every (∂a/∂b)_c for which a flash with
// inputs (b, c) exists against centred differences of that flash: for
// each test state of every fluid in every region (states), each flash,
// each of its two inputs varied with the other held, and each of the
// nine quantities a.
func TestAgainstFlashes(t *testing.T) {
	t.Parallel()
	for _, name := range fluid.Names() {
		f := mustFluid(t, name)
		t.Run(name, func(t *testing.T) {
			t.Parallel()
			byPhase := map[flash.Phase]*fdStats{}
			byFlash := 0
			for _, ts := range states(t, f) {
				if ts.byFlash {
					byFlash++
				}
				st := byPhase[ts.st.Phase]
				if st == nil {
					st = &fdStats{}
					byPhase[ts.st.Phase] = st
				}
				j, err := At(f, ts.st)
				if err != nil {
					t.Fatalf("%s: %v", ts.name, err)
				}
				for _, in := range ts.flashes {
					for dir := 0; dir < 2; dir++ {
						b, c := in.b, in.c
						if dir == 1 {
							b, c = c, b
						}
						checkFlash(t, f, &ts, &j, in, b, c, st)
					}
				}
			}
			if _, ok := solidCases[name]; ok {
				t.Logf("%s: %d solid-region states of the flashes checked, besides those built from the solid models", name, byFlash)
				if byFlash == 0 {
					t.Errorf("%s: the flashes return no solid-region state", name)
				}
			}
			for ph := flash.Liquid; ph <= flash.Triple; ph++ {
				if st := byPhase[ph]; st != nil {
					t.Logf("%s %v: %d derivatives: worst relative difference %.2g where the differences resolve 1e-6 (%d), %.2g where they resolve 1e-8 (%d); %d vanish or are resolved only to their rounding",
						name, ph, st.n, st.worst, st.n-st.nLoose-st.nZero, st.worstResolved, st.nResolved, st.nLoose+st.nZero)
				}
			}
		})
	}
}

// checkFlash differentiates flash in with respect to b at constant c
// and compares every (∂a/∂b)_c, adding the differences to stats.
//
// The rounding: a flash returns a state whose inputs b and c differ from
// the requested ones by its backward residuals δb, δc (DESIGN.md bounds
// them by about 1e-10 relative; they are measured here at each point of
// the stencil), which move a by (∂a/∂b)_c δb + (∂a/∂c)_b δc; and a
// itself is rounded: T and ρ (the equation's arguments) to 1e-16 of
// their size s_a, the quantities the equation computes to about
// 1e-13 s_a (measured: between neighbouring floating-point densities of
// liquid water at 20 MPa, 300 K, u scatters by 3e-9 J/kg, 3e-14 of u, and
// h by 7e-9 J/kg). Summed over the stencil with its weights wᵢ and
// divided by the step h:
//
//	noise = Σ |wᵢ| (|(∂a/∂b)_c| |δbᵢ| + |(∂a/∂c)_b| |δcᵢ| + ε_a s_a) / h.
//
// The check is |difference − analytic| ≤ fdTol |analytic| + 2 noise.
func checkFlash(t *testing.T, f *fluid.Fluid, ts *testState, j *Jacobian, in inverse, b, c Quantity, stats *fdStats) {
	t.Helper()
	vc := value(&ts.st, c)
	memo := map[float64]flash.State{}
	at := func(x float64) flash.State {
		if st, ok := memo[x]; ok {
			return st
		}
		var st flash.State
		var err error
		if b == in.b {
			st, err = in.fn(x, vc)
		} else {
			st, err = in.fn(vc, x)
		}
		if err != nil {
			t.Fatalf("%s %s: flash (%v, %v) at %v = %v, %v = %v: %v", f.Name(), ts.name, in.b, in.c, b, x, c, vc, err)
		}
		if st.Phase != ts.st.Phase {
			t.Fatalf("%s %s: flash (%v, %v) at %v = %v left the region: %v", f.Name(), ts.name, in.b, in.c, b, x, st.Phase)
		}
		memo[x] = st
		return st
	}
	x0 := value(&ts.st, b)
	h := fdStep * scale(f, &ts.st, b)
	for _, a := range quantities {
		num := fd.Derivative(func(x float64) float64 {
			st := at(x)
			return value(&st, a)
		}, x0, &fd.Settings{Formula: central4, Step: h})
		an, err := j.Derivative(a, b, c)
		if err != nil {
			t.Errorf("%s %s: %s: %v", f.Name(), ts.name, name(a, b, c), err)
			continue
		}
		dc, err := j.Derivative(a, c, b)
		if err != nil {
			dc = 0
		}
		ea := 1e-13
		if a == T || a == Rho || a == V {
			ea = 1e-16
		}
		sa := scale(f, &ts.st, a)
		noise := 0.0
		for _, pt := range central4.Stencil {
			x := x0 + h*pt.Loc
			st := at(x)
			db, dcv := math.Abs(value(&st, b)-x), math.Abs(value(&st, c)-vc)
			noise += math.Abs(pt.Coeff) * (math.Abs(an)*db + math.Abs(dc)*dcv + ea*sa) / h
		}
		diff := math.Abs(num - an)
		if diff > fdTol*math.Abs(an)+2*noise {
			t.Errorf("%s %s: %s = %.12g, by differences of flash (%v, %v) %.12g (relative %.2g, rounding %.2g)",
				f.Name(), ts.name, name(a, b, c), an, in.b, in.c, num, diff/math.Abs(an), noise/math.Abs(an))
		}
		stats.add(diff, noise, an)
	}
}

// fdStats summarise the differences of TestAgainstFlashes.
type fdStats struct {
	n, nResolved, nLoose, nZero int
	worst, worstResolved        float64
}

func (s *fdStats) add(diff, noise, an float64) {
	s.n++
	if an == 0 {
		s.nZero++
		return
	}
	rel, allow := diff/math.Abs(an), 2*noise/math.Abs(an)
	switch {
	case allow > fdTol:
		s.nLoose++ // resolved only to the rounding of the differences
		return
	case allow < 1e-8:
		s.nResolved++
		s.worstResolved = max(s.worstResolved, rel)
	}
	s.worst = max(s.worst, rel)
}

// TestUndefined checks the derivatives that do not exist as finite
// numbers: NaN with an error wrapping fluid.ErrUndefined.
func TestUndefined(t *testing.T) {
	t.Parallel()
	for _, name := range fluid.Names() {
		f := mustFluid(t, name)
		for _, ts := range states(t, f) {
			j, err := At(f, ts.st)
			if err != nil {
				t.Fatal(err)
			}
			check := func(a, b, c Quantity) {
				d, err := j.Derivative(a, b, c)
				if !errors.Is(err, fluid.ErrUndefined) || !math.IsNaN(d) {
					t.Errorf("%s %s: %s = %v, %v; want NaN, ErrUndefined", name, ts.name, nameOf(a, b, c), d, err)
				}
			}
			for _, a := range quantities {
				for _, b := range quantities {
					check(a, b, b) // b does not vary at constant b
				}
				check(a, Rho, V)
				check(a, V, Rho)
			}
			switch ts.st.N {
			case 2: // T, p and g depend on one another
				for _, a := range quantities {
					for _, b := range []Quantity{T, P, G} {
						for _, c := range []Quantity{T, P, G} {
							check(a, b, c)
						}
					}
				}
			case 3: // T, p, g do not vary at all
				for _, a := range quantities {
					for _, b := range []Quantity{T, P, G} {
						for _, c := range quantities {
							check(a, b, c)
							check(a, c, b)
						}
					}
				}
			}
		}
	}
}

func nameOf(a, b, c Quantity) string { return name(a, b, c) }

// TestCriticalPoint checks the derivatives at exactly the critical point
// (TQ at Tc, flag AtCritical): with nonanalytic terms (water, CO2) the
// infinite ones are undefined and the finite ones are their limits; the
// equation without them (R-134a) stays finite.
func TestCriticalPoint(t *testing.T) {
	t.Parallel()
	for _, name := range fluid.Names() {
		f := mustFluid(t, name)
		c := f.Critical()
		for _, q := range []float64{0, 0.5} {
			st, err := flash.TQ(f, c.T, q)
			if err != nil {
				t.Fatal(err)
			}
			pr, err := f.Props(c.T, c.Rho)
			if err != nil && f.HasNonAnalytic() {
				t.Fatal(err) // R-134a: ErrUnstable, see At
			}
			j, err := At(f, st)
			if err != nil {
				t.Fatal(err)
			}
			// Finite everywhere: (∂p/∂T)_ρ and (∂s/∂ρ)_T (Maxwell) from
			// the equation's own (∂p/∂T)_ρ at the critical point.
			for _, k := range []struct {
				a, b, c Quantity
				want    float64
			}{
				{P, T, Rho, pr.DpDT},
				{S, Rho, T, -pr.DpDT / (c.Rho * c.Rho)},
				{U, Rho, T, (c.P - c.T*pr.DpDT) / (c.Rho * c.Rho)},
			} {
				d, err := j.Derivative(k.a, k.b, k.c)
				if err != nil || math.Abs(d-k.want) > 1e-12*math.Abs(k.want) {
					t.Errorf("%s critical q = %v: %s = %v, %v; want %v", name, q, nameOf(k.a, k.b, k.c), d, err, k.want)
				}
			}
			if !f.HasNonAnalytic() {
				// Tillner-Roth–Baehr, without nonanalytic terms: at its own
				// critical point (∂p/∂ρ)_T = 0, so cp is infinite (NaN with
				// ErrUndefined, as every infinite derivative) while cv is
				// finite, the equation's own.
				if d, err := j.Derivative(H, T, P); !errors.Is(err, fluid.ErrUndefined) || !math.IsNaN(d) || !math.IsInf(pr.Cp, 1) {
					t.Errorf("%s critical: cp = %v, %v; the equation's %v", name, d, err, pr.Cp)
				}
				if d, err := j.Derivative(U, T, Rho); err != nil || !finite(pr.Cv) || math.Abs(d-pr.Cv) > 1e-12*pr.Cv {
					t.Errorf("%s critical: cv = %v, %v; the equation's %v", name, d, err, pr.Cv)
				}
				continue
			}
			// The limits with cv → ∞ and (∂p/∂ρ)_T = 0 (definitions):
			// (∂p/∂ρ)_T = 0, w² = (∂p/∂ρ)_s = 0, (∂T/∂s)_p = T/cp = 0,
			// (∂u/∂h)_ρ = cv/(cv + v(∂p/∂T)_v) = 1,
			// (∂ρ/∂h)_p = −ρ² (∂v/∂T)_p/cp = −ρ²/(T (∂p/∂T)_ρ).
			for _, k := range []struct {
				a, b, c Quantity
				want    float64
			}{
				{P, Rho, T, 0}, {P, Rho, S, 0}, {T, S, P, 0}, {U, H, Rho, 1},
				{Rho, H, P, -c.Rho * c.Rho / (c.T * pr.DpDT)},
			} {
				d, err := j.Derivative(k.a, k.b, k.c)
				if err != nil || math.Abs(d-k.want) > 1e-12*math.Abs(k.want) {
					t.Errorf("%s critical q = %v: %s = %v, %v; want %v", name, q, nameOf(k.a, k.b, k.c), d, err, k.want)
				}
			}
			for _, k := range [][3]Quantity{{H, T, P}, {U, T, Rho}, {Rho, P, T}, {S, T, P}, {Rho, T, P}} {
				if d, err := j.Derivative(k[0], k[1], k[2]); !errors.Is(err, fluid.ErrUndefined) || !math.IsNaN(d) {
					t.Errorf("%s critical q = %v: %s = %v, %v; want undefined", name, q, nameOf(k[0], k[1], k[2]), d, err)
				}
			}
		}
	}
}

// TestTwoPhaseCv checks that the mixture's cv that At takes from the
// state (computed by package flash) equals the one computed from the
// phases along the curve (SlopesOf), and that At's fallback, used where
// a state carries no cv, gives the same derivatives.
func TestTwoPhaseCv(t *testing.T) {
	t.Parallel()
	for _, name := range fluid.Names() {
		f := mustFluid(t, name)
		for _, ts := range mixtures(t, f) {
			st := ts.st
			sl, err := SlopesOf(f, st)
			if err != nil {
				t.Fatal(err)
			}
			if cv := sl.mixtureCv(st.Phases[0].Fraction, st.Phases[1].Fraction); math.Abs(cv-st.Cv) > 1e-10*st.Cv {
				t.Errorf("%s %s: cv of the state %v, from the slopes %v", name, ts.name, st.Cv, cv)
			}
			j1, err1 := At(f, st)
			st.Cv = 0
			j2, err2 := At(f, st)
			if err1 != nil || err2 != nil {
				t.Fatal(err1, err2)
			}
			for _, a := range quantities {
				d1, _ := j1.Derivative(a, T, Rho)
				d2, _ := j2.Derivative(a, T, Rho)
				if math.Abs(d1-d2) > 1e-10*math.Abs(d1) {
					t.Errorf("%s %s: %s = %v, with the fallback cv %v", name, ts.name, nameOf(a, T, Rho), d1, d2)
				}
			}
		}
	}
}

// TestBadInput checks the errors of malformed inputs, and that no
// input panics.
func TestBadInput(t *testing.T) {
	t.Parallel()
	w := mustFluid(t, "water")
	r := mustFluid(t, "R134a")
	good, err := flash.PT(w, 1e5, 300)
	if err != nil {
		t.Fatal(err)
	}
	mod := func(fn func(*flash.State)) flash.State {
		st := good
		fn(&st)
		return st
	}
	nan := math.NaN()
	for _, c := range []struct {
		name string
		f    *fluid.Fluid
		st   flash.State
		want error
	}{
		{"nil fluid", nil, good, fluid.ErrInvalidInput},
		{"zero state", w, flash.State{}, fluid.ErrInvalidInput},
		{"bad phase", w, mod(func(s *flash.State) { s.Phase = 42 }), fluid.ErrInvalidInput},
		{"bad N", w, mod(func(s *flash.State) { s.N = 2 }), fluid.ErrInvalidInput},
		{"NaN T", w, mod(func(s *flash.State) { s.T = nan }), fluid.ErrInvalidInput},
		{"negative rho", w, mod(func(s *flash.State) { s.Rho = -1 }), fluid.ErrInvalidInput},
		{"infinite s", w, mod(func(s *flash.State) { s.S = math.Inf(1) }), fluid.ErrInvalidInput},
		{"out of range", w, mod(func(s *flash.State) { s.T = 1e5 }), fluid.ErrOutOfRange},
		{"two-phase without phases", w, mod(func(s *flash.State) { s.Phase, s.N = flash.TwoPhase, 2 }), fluid.ErrInvalidInput},
		{"solid of R-134a", r, mod(func(s *flash.State) { s.Phase = flash.Solid; s.T = 150 }), fluid.ErrUndefined},
		{"ice beyond ice Ih", w, mod(func(s *flash.State) { s.Phase, s.T, s.P = flash.Solid, 250, 1e9 }), fluid.ErrOutOfRange},
		{"ice too warm", w, mod(func(s *flash.State) { s.Phase, s.T = flash.Solid, 400 }), fluid.ErrOutOfRange},
	} {
		if _, err := At(c.f, c.st); !errors.Is(err, c.want) {
			t.Errorf("%s: At error %v, want %v", c.name, err, c.want)
		}
		if d, err := Derivative(c.f, c.st, H, T, P); !errors.Is(err, c.want) || !math.IsNaN(d) {
			t.Errorf("%s: Derivative = %v, %v; want NaN, %v", c.name, d, err, c.want)
		}
	}
	j, err := At(w, good)
	if err != nil {
		t.Fatal(err)
	}
	for _, q := range [][3]Quantity{{0, T, P}, {H, 10, P}, {H, T, -1}} {
		if d, err := j.Derivative(q[0], q[1], q[2]); !errors.Is(err, fluid.ErrInvalidInput) || !math.IsNaN(d) {
			t.Errorf("Derivative%v = %v, %v; want NaN, ErrInvalidInput", q, d, err)
		}
	}
	var zero Jacobian
	if d, err := zero.Derivative(H, T, P); !errors.Is(err, fluid.ErrInvalidInput) || !math.IsNaN(d) {
		t.Errorf("zero Jacobian: %v, %v", d, err)
	}
	var zs Slopes
	if d, err := zs.Derivative(0, H, T); !errors.Is(err, fluid.ErrInvalidInput) || !math.IsNaN(d) {
		t.Errorf("zero Slopes: %v, %v", d, err)
	}
	var fe *fluid.Error
	if _, err := j.Derivative(H, T, T); !errors.As(err, &fe) || fe.Op != "partial.Jacobian.Derivative" {
		t.Errorf("error %v is not a *fluid.Error of partial.Jacobian.Derivative", err)
	}
}

// TestQuantityNames checks the stable codes and names of the enums (the
// C ABI depends on them).
func TestQuantityNames(t *testing.T) {
	want := []string{"T", "p", "rho", "v", "u", "h", "s", "g", "f"}
	for i, q := range quantities {
		if int(q) != i+1 || q.String() != want[i] || q.Unit() == "" {
			t.Errorf("quantity %d: %d %q %q", i, q, q, q.Unit())
		}
	}
	if Quantity(0).Valid() || Quantity(10).Valid() || Quantity(10).String() != "Quantity(10)" || Quantity(0).Unit() != "" {
		t.Error("invalid quantities")
	}
	if Saturation != 1 || Sublimation != 2 || Melting != 3 || Melting.String() != "Melting" || Curve(7).String() != "Curve(7)" {
		t.Error("curve codes")
	}
}
