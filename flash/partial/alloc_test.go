package partial

import (
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// TestAllocs checks that the hot paths allocate nothing: At, Derivative,
// Jacobian.Derivative in every region, SlopesOf, SlopesAtT, SlopesAtP and
// Slopes.Derivative on every curve.
func TestAllocs(t *testing.T) {
	for _, name := range fluid.Names() {
		f := mustFluid(t, name)
		for _, ts := range states(t, f) {
			st := ts.st
			qa, qb, qc := benchQuantities(st.Phase)
			j, err := At(f, st)
			if err != nil {
				t.Fatal(err)
			}
			if _, err := j.Derivative(qa, qb, qc); err != nil {
				t.Fatal(err)
			}
			fns := map[string]func(){
				"At":                  func() { j, _ = At(f, st) },
				"Derivative":          func() { sink, _ = Derivative(f, st, qa, qb, qc) },
				"Jacobian.Derivative": func() { sink, _ = j.Derivative(qa, qb, qc) },
			}
			if st.N == 2 {
				fns["SlopesOf"] = func() {
					s, _ := SlopesOf(f, st)
					sink, _ = s.Derivative(1, Rho, T)
				}
			}
			for what, fn := range fns {
				if n := testing.AllocsPerRun(20, fn); n != 0 {
					t.Errorf("%s %s: %s allocates %v times", name, ts.name, what, n)
				}
			}
		}
		for _, cc := range curveCases[name] {
			c, temp, pres := cc.c, cc.Ts[1], cc.ps[1]
			for what, fn := range map[string]func(){
				"SlopesAtT": func() { s, _ := SlopesAtT(f, c, temp); sink, _ = s.Derivative(0, H, T) },
				"SlopesAtP": func() { s, _ := SlopesAtP(f, c, pres); sink, _ = s.Derivative(1, Rho, P) },
			} {
				if n := testing.AllocsPerRun(10, fn); n != 0 {
					t.Errorf("%s %v: %s allocates %v times", name, c, what, n)
				}
			}
		}
	}
}
