//go:build tripoint_evalcount

package flash

import (
	"testing"

	"github.com/tripoint-thermo/tripoint/internal/evalcount"
)

// TestPHSolidVaporEvals checks the speed goal of issue 5 in evaluations
// of the fluid equation, which only a build with -tags
// tripoint_evalcount counts: PH into the solid–vapour region costs at
// most 12 evaluations per call, cold, for CO2 and water, over the grid of
// the solid–vapour benchmark.
func TestPHSolidVaporEvals(t *testing.T) {
	for _, f := range solidFluids(t) {
		worst, total := uint64(0), uint64(0)
		sts := solidVaporStates(t, f)
		for _, st := range sts {
			n0 := evalcount.Load()
			got, err := PH(f, st.P, st.H)
			n := evalcount.Load() - n0
			if err != nil || got.Phase != SolidVapor {
				t.Errorf("%s PH(%v, %v): %v %v", f.Name(), st.P, st.H, got.Phase, err)
			}
			worst, total = max(worst, n), total+n
		}
		if worst > 12 {
			t.Errorf("%s: PH into the solid-vapour region costs up to %d evaluations, want at most 12", f.Name(), worst)
		}
		t.Logf("%s: PH solid-vapour: %.1f evaluations per call on average, %d at most", f.Name(),
			float64(total)/float64(len(sts)), worst)
	}
}
