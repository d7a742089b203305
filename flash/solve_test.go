package flash

import (
	"math"
	"testing"
)

// TestLinearFinish holds the states whose last Newton step newton2 takes
// by their own derivatives (linearFinish) to the equation at their (T, ρ):
// p, h, s and u within the iterations' tolerance (1/100 of the backward-
// residual floors of DESIGN.md; for p 1e-12·p + 5e-13·ρRT) of a fresh
// evaluation, and the kept properties (cp, cv, w) within 1e-10 of it,
// for PH, PS and warm-started PH over the single-phase grids of every
// fluid (below the temperature ceiling, which the warm start's step
// would cross).
func TestLinearFinish(t *testing.T) {
	t.Parallel()
	for _, f := range fluids(t) {
		R := f.GasConstant()
		c := f.Critical()
		for _, rg := range benchRegions {
			if rg.name == "twoPhase" {
				continue
			}
			for _, g := range rg.states(f) {
				g := g
				if g.T > 0.99*f.Limits().TCeil {
					continue
				}
				for _, run := range []struct {
					name string
					fn   func() (State, error)
				}{
					{"PH", func() (State, error) { return PH(f, g.P, g.H) }},
					{"PS", func() (State, error) { return PS(f, g.P, g.S) }},
					{"PHwarm", func() (State, error) { return PHWith(f, g.P*1.001, g.H+500, Options{Guess: &g}) }},
				} {
					st, err := run.fn()
					if err != nil {
						t.Errorf("%s %s %s from (%v K, %v Pa): %v", f.Name(), rg.name, run.name, g.T, g.P, err)
						continue
					}
					if st.N != 1 {
						continue
					}
					pr, err := f.Props(st.T, st.Rho)
					if err != nil {
						t.Errorf("%s %s: Props(%v, %v): %v", f.Name(), run.name, st.T, st.Rho, err)
						continue
					}
					hs := max(math.Abs(pr.H), R*c.T)
					ss := max(math.Abs(pr.S), R)
					for _, d := range []struct {
						what      string
						got, want float64
						scale     float64
						tol       float64
					}{
						{"p", st.P, pr.P, pr.P + 0.5*pr.Rho*R*pr.T, 1e-12},
						{"h", st.H, pr.H, hs, 1e-12},
						{"s", st.S, pr.S, ss, 1e-12},
						{"u", st.U, pr.U, hs, 1e-12},
						{"cp", st.Cp, pr.Cp, pr.Cp, 1e-10},
						{"cv", st.Cv, pr.Cv, pr.Cv, 1e-10},
						{"w", st.W, pr.W, pr.W, 1e-10},
					} {
						if e := math.Abs(d.got-d.want) / d.scale; !(e <= d.tol) {
							t.Errorf("%s %s %s at (%v K, %v kg/m3): %s %v, the equation's %v (%.2g > %g)",
								f.Name(), rg.name, run.name, st.T, st.Rho, d.what, d.got, d.want, e, d.tol)
						}
					}
				}
			}
		}
	}
}
