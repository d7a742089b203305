package partial

import (
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// idTol bounds the identities of the Bridgman table, relative to the
// largest term (issue 11: ~1e-10).
const idTol = 1e-10

// near reports whether x and y agree within idTol of the largest of
// the magnitudes in terms (and of x and y themselves).
func near(x, y float64, terms ...float64) bool {
	m := max(math.Abs(x), math.Abs(y))
	for _, t := range terms {
		m = max(m, math.Abs(t))
	}
	return math.Abs(x-y) <= idTol*m
}

// identityStates are the test states of every region, with the critical
// states (TQ at Tc) added.
func identityStates(t *testing.T, f *fluid.Fluid) []testState {
	out := states(t, f)
	c := f.Critical()
	for _, q := range []float64{0, 0.5} {
		st, err := flash.TQ(f, c.T, q)
		if err != nil {
			t.Fatal(err)
		}
		out = append(out, testState{name: "critical", st: st})
	}
	return out
}

// TestBridgmanIdentities checks, over all 9³ combinations at every test
// state, the identities every set of partial derivatives obeys
// (identities of calculus and of the fundamental relation):
//
//	reciprocity  (∂a/∂b)_c (∂b/∂a)_c = 1
//	cyclic rule  (∂a/∂b)_c (∂b/∂c)_a (∂c/∂a)_b = −1
//	chain rule   (∂a/∂b)_c = (∂a/∂d)_c (∂d/∂b)_c
//	density      (∂ρ/∂b)_c = −ρ² (∂v/∂b)_c
//
// wherever the derivatives involved are defined.
func TestBridgmanIdentities(t *testing.T) {
	t.Parallel()
	for _, name := range fluid.Names() {
		f := mustFluid(t, name)
		for _, ts := range identityStates(t, f) {
			j, err := At(f, ts.st)
			if err != nil {
				t.Fatalf("%s %s: %v", name, ts.name, err)
			}
			var d [10][10][10]float64
			var ok [10][10][10]bool
			for _, a := range quantities {
				for _, b := range quantities {
					for _, c := range quantities {
						v, err := j.Derivative(a, b, c)
						d[a][b][c], ok[a][b][c] = v, err == nil
						if err == nil && !finite(v) {
							t.Fatalf("%s %s: %s = %v with a nil error", name, ts.name, nameOf(a, b, c), v)
						}
					}
				}
			}
			rho := ts.st.Rho
			if ts.name == "critical" {
				rho = f.Critical().Rho
			}
			n := 0
			for _, a := range quantities {
				for _, b := range quantities {
					for _, c := range quantities {
						if !ok[a][b][c] {
							continue
						}
						x := d[a][b][c]
						if ok[b][a][c] && x != 0 {
							n++
							if y := d[b][a][c]; !near(x*y, 1) {
								t.Errorf("%s %s: reciprocity %s·%s = %v", name, ts.name, nameOf(a, b, c), nameOf(b, a, c), x*y)
							}
						}
						if a != b && b != c && a != c && ok[b][c][a] && ok[c][a][b] && x != 0 {
							n++
							if p := x * d[b][c][a] * d[c][a][b]; !near(p, -1) {
								t.Errorf("%s %s: cyclic rule %s %s %s = %v", name, ts.name, nameOf(a, b, c), nameOf(b, c, a), nameOf(c, a, b), p)
							}
						}
						for _, e := range quantities {
							if ok[a][e][c] && ok[e][b][c] {
								n++
								if y := d[a][e][c] * d[e][b][c]; !near(x, y) {
									t.Errorf("%s %s: chain rule %s = %v, %s %s = %v", name, ts.name, nameOf(a, b, c), x, nameOf(a, e, c), nameOf(e, b, c), y)
								}
							}
						}
						if a == V && ok[Rho][b][c] {
							n++
							if y := d[Rho][b][c]; !near(y, -rho*rho*x) {
								t.Errorf("%s %s: %s = %v, −ρ² %s = %v", name, ts.name, nameOf(Rho, b, c), y, nameOf(V, b, c), -rho*rho*x)
							}
						}
					}
				}
			}
			// At a triple point T, p and g are constant, dh = T ds and
			// df = −p dv: no derivative at constant T, p, g, or of h at
			// constant s (s at h, f at v, v or ρ at f), and 898
			// identities among those that exist.
			least := 1000
			if ts.st.Phase == flash.Triple {
				least = 898
			}
			if n < least {
				t.Errorf("%s %s: only %d identities checked", name, ts.name, n)
			}
		}
	}
}

// TestThermodynamicIdentities checks at every state the derivatives that
// the fundamental relation fixes (Callen, Thermodynamics, ch. 3 and 7;
// textbook identities):
//
//	(∂u/∂s)_v = T, (∂u/∂v)_s = −p, (∂h/∂s)_p = T, (∂h/∂p)_s = v,
//	(∂g/∂T)_p = −s, (∂g/∂p)_T = v, (∂f/∂T)_v = −s, (∂f/∂v)_T = −p,
//	the Maxwell relations (∂T/∂v)_s = −(∂p/∂s)_v, (∂T/∂p)_s = (∂v/∂s)_p,
//	(∂s/∂v)_T = (∂p/∂T)_v, (∂s/∂p)_T = −(∂v/∂T)_p,
//	(∂h/∂p)_T = v − T(∂v/∂T)_p,  (∂u/∂v)_T = T(∂p/∂T)_v − p,
//	cp/cv = κ_T/κ_s: (∂h/∂T)_p (∂ρ/∂p)_s = (∂u/∂T)_v (∂ρ/∂p)_T,
//
// wherever the derivatives exist; and against the values that the state
// and the equations carry, computed by other formulas in other packages
// (fluid.Props, sublimation.Props, flash's two-phase cv and
// homogeneous-equilibrium sound speed): cp = (∂h/∂T)_p, cv = (∂u/∂T)_ρ,
// w² = (∂p/∂ρ)_s, and for a fluid phase the Joule–Thomson coefficient
// (∂T/∂p)_h, κ_T = (∂ρ/∂p)_T/ρ, α = −(∂ρ/∂T)_p/ρ, (∂p/∂T)_ρ, (∂p/∂ρ)_T.
func TestThermodynamicIdentities(t *testing.T) {
	t.Parallel()
	for _, name := range fluid.Names() {
		f := mustFluid(t, name)
		for _, ts := range identityStates(t, f) {
			st := ts.st
			j, err := At(f, st)
			if err != nil {
				t.Fatal(err)
			}
			Tv, p, v, s := j.t, j.p, j.v, j.s
			der := func(a, b, c Quantity) (float64, bool) {
				x, err := j.Derivative(a, b, c)
				return x, err == nil
			}
			for _, k := range []struct {
				a, b, c Quantity
				want    float64
			}{
				{U, S, V, Tv}, {U, V, S, -p}, {H, S, P, Tv}, {H, P, S, v},
				{G, T, P, -s}, {G, P, T, v}, {F, T, V, -s}, {F, V, T, -p},
			} {
				if x, ok := der(k.a, k.b, k.c); ok && !near(x, k.want) {
					t.Errorf("%s %s: %s = %v, want %v", name, ts.name, nameOf(k.a, k.b, k.c), x, k.want)
				}
			}
			pairs := []struct {
				a1, b1, c1 Quantity
				sign       float64
				a2, b2, c2 Quantity
			}{
				{T, V, S, -1, P, S, V}, {T, P, S, 1, V, S, P}, {S, V, T, 1, P, T, V}, {S, P, T, -1, V, T, P},
			}
			for _, k := range pairs {
				x, ok1 := der(k.a1, k.b1, k.c1)
				y, ok2 := der(k.a2, k.b2, k.c2)
				if ok1 && ok2 && !near(x, k.sign*y) {
					t.Errorf("%s %s: Maxwell %s = %v, %s = %v", name, ts.name, nameOf(k.a1, k.b1, k.c1), x, nameOf(k.a2, k.b2, k.c2), y)
				}
			}
			if hp, ok1 := der(H, P, T); ok1 {
				if vT, ok2 := der(V, T, P); ok2 && !near(hp, v-Tv*vT, v, Tv*vT) {
					t.Errorf("%s %s: (dh/dp)_T = %v, v - T(dv/dT)_p = %v", name, ts.name, hp, v-Tv*vT)
				}
			}
			if uv, ok1 := der(U, V, T); ok1 {
				if pT, ok2 := der(P, T, V); ok2 && !near(uv, Tv*pT-p, Tv*pT, p) {
					t.Errorf("%s %s: (du/dv)_T = %v, T(dp/dT)_v - p = %v", name, ts.name, uv, Tv*pT-p)
				}
			}
			cp, okp := der(H, T, P)
			cv, okv := der(U, T, Rho)
			ks, oks := der(Rho, P, S)
			kt, okt := der(Rho, P, T)
			if okp && okv && oks && okt && !near(cp*ks, cv*kt) {
				t.Errorf("%s %s: cp (drho/dp)_s = %v, cv (drho/dp)_T = %v", name, ts.name, cp*ks, cv*kt)
			}
			// Against the state and the equations.
			if st.N == 1 && okp && !near(cp, st.Cp) {
				t.Errorf("%s %s: (dh/dT)_p = %v, state cp %v", name, ts.name, cp, st.Cp)
			}
			if st.N < 3 && finite(st.Cv) && (!okv || !near(cv, st.Cv)) {
				t.Errorf("%s %s: (du/dT)_rho = %v, state cv %v", name, ts.name, cv, st.Cv)
			}
			if w2, ok := der(P, Rho, S); ok && st.W > 0 && !near(w2, st.W*st.W, st.W*st.W) {
				t.Errorf("%s %s: (dp/drho)_s = %v, state w^2 %v", name, ts.name, w2, st.W*st.W)
			}
			if st.N != 1 || st.Phase == flash.Solid || st.Flags&flash.AtCritical != 0 {
				continue
			}
			pr, err := f.Props(st.T, st.Rho)
			if err != nil {
				t.Fatal(err)
			}
			for _, k := range []struct {
				what      string
				got, want float64
			}{
				{"(dT/dp)_h", must(der(T, P, H)), pr.JouleThomson},
				{"(drho/dp)_T / rho", must(der(Rho, P, T)) / pr.Rho, pr.KappaT},
				{"-(drho/dT)_p / rho", -must(der(Rho, T, P)) / pr.Rho, pr.Expansivity},
				{"(dp/dT)_rho", must(der(P, T, Rho)), pr.DpDT},
				{"(dp/drho)_T", must(der(P, Rho, T)), pr.DpDrho},
			} {
				// The Joule–Thomson coefficient is a difference of terms
				// of the size T α v/cp.
				if !near(k.got, k.want, st.T*pr.Expansivity/(pr.Rho*pr.Cp)) {
					t.Errorf("%s %s: %s = %v, fluid.Props %v", name, ts.name, k.what, k.got, k.want)
				}
			}
		}
	}
}

func must(x float64, ok bool) float64 {
	if !ok {
		return math.NaN()
	}
	return x
}
