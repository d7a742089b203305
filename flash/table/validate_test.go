package table

import (
	"fmt"
	"math"
	"sort"
	"strings"
	"testing"

	"github.com/tripoint-thermo/tripoint/flash"
)

// figures are the deviations of the tables from the equation in one
// region: the largest relative deviation of each property, over the
// points the tables answered.
type figures struct {
	n, left, phase, eqOff   int
	T, rho, h, s, cp, cv, w float64
	worst                   string
	worstDev                float64
}

// TestValidation compares every flash of the tables with the equation of
// state on a validation grid of random states (never nodes) in every
// region of every fluid, and asserts:
//
//   - T, ρ, h and s deviate by at most 1e-6 (relative; h against
//     max(|h|, R·Tc), s against max(|s|, R)) in the single-phase regions
//     and the two-phase region, outside the critical neighbourhood;
//   - the phase is the equation's, except within 1e-7 of a phase boundary;
//   - the tables answer every point outside the critical neighbourhood
//     (and, for DU, the isochores of water that cross the dome twice).
//
// The reference is the equation's state the inputs come from (flash.PT,
// flash.PQ); where the equation's own flash at those inputs returns
// another state, the count is printed as eqOff (see the report). The
// figures, with cp, cv and w, print with -v. -short uses a smaller grid.
func TestValidation(t *testing.T) {
	t.Parallel()
	n, m := 6000, 1500
	if testing.Short() {
		n, m = 600, 150
	}
	for _, name := range fluidNames {
		t.Run(name, func(t *testing.T) {
			t.Parallel()
			tb := tableOf(t, name)
			pts := validationGrid(t, tb, n, m)
			f := tb.Fluid()
			R, Tc := f.GasConstant(), f.Critical().T
			res := map[string]*figures{}
			for _, fl := range flashNames {
				for _, vp := range pts {
					ref := &vp.ref
					a, b, ok := inputs(fl, ref)
					if !ok {
						continue
					}
					key := fl + " " + vp.region
					fg := res[key]
					if fg == nil {
						fg = &figures{}
						res[key] = fg
					}
					var st flash.State
					if !fromTables(tb, fl, a, b, &st) {
						fg.left++
						if !inNeighbourhood(tb, fl, ref) {
							t.Errorf("%s %s(%v, %v): not answered by the tables outside the critical neighbourhood (T = %v K, p = %v Pa)",
								name, fl, a, b, ref.T, ref.P)
						}
						continue
					}
					fg.n++
					if eq, err := equationFlash(f, fl, a, b); err != nil || math.Abs(eq.T-ref.T) > 1e-8*ref.T {
						fg.eqOff++
					}
					if st.Phase != ref.Phase {
						fg.phase++
						if !nearBoundary(tb, ref) {
							t.Errorf("%s %s(%v, %v): phase %v, the equation's %v", name, fl, a, b, st.Phase, ref.Phase)
						}
					}
					dev := [...]float64{
						math.Abs(st.T-ref.T) / ref.T,
						math.Abs(st.Rho-ref.Rho) / ref.Rho,
						math.Abs(st.H-ref.H) / max(math.Abs(ref.H), R*Tc),
						math.Abs(st.S-ref.S) / max(math.Abs(ref.S), R),
					}
					fg.T, fg.rho, fg.h, fg.s = max(fg.T, dev[0]), max(fg.rho, dev[1]), max(fg.h, dev[2]), max(fg.s, dev[3])
					if d := max(dev[0], dev[1], dev[2], dev[3]); d > fg.worstDev {
						fg.worstDev = d
						fg.worst = fmt.Sprintf("%s(%.9g, %.9g)", fl, a, b)
					}
					if d := max(dev[0], dev[1], dev[2], dev[3]); d > 1e-6 {
						t.Errorf("%s %s(%v, %v), %s: deviation %.2e (T %.2e, rho %.2e, h %.2e, s %.2e)",
							name, fl, a, b, vp.region, d, dev[0], dev[1], dev[2], dev[3])
					}
					if !math.IsInf(ref.Cp, 1) {
						fg.cp = max(fg.cp, math.Abs(st.Cp-ref.Cp)/ref.Cp)
					}
					fg.cv = max(fg.cv, math.Abs(st.Cv-ref.Cv)/ref.Cv)
					fg.w = max(fg.w, math.Abs(st.W-ref.W)/ref.W)
				}
			}
			var keys []string
			for k := range res {
				keys = append(keys, k)
			}
			sort.Strings(keys)
			var b strings.Builder
			fmt.Fprintf(&b, "%s: %d bytes; largest relative deviations from the equation\n", name, tb.Bytes())
			fmt.Fprintf(&b, "  %-17s %5s %5s %8s %8s %8s %8s %8s %8s %8s %5s  %s\n",
				"flash region", "n", "left", "T", "rho", "h", "s", "cp", "cv", "w", "eqOff", "worst T, rho, h, s at")
			for _, k := range keys {
				fg := res[k]
				fmt.Fprintf(&b, "  %-17s %5d %5d %8.1e %8.1e %8.1e %8.1e %8.1e %8.1e %8.1e %5d  %s\n",
					k, fg.n, fg.left, fg.T, fg.rho, fg.h, fg.s, fg.cp, fg.cv, fg.w, fg.eqOff, fg.worst)
			}
			t.Log("\n" + b.String())
		})
	}
}
