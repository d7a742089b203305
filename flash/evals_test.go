//go:build tripoint_evalcount

package flash

import (
	"slices"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/internal/evalcount"
)

// evalsOf returns the median and the largest number of full-evaluation
// equivalents (fullEquivalents) per call of flash fl over the states sts
// (as the benchmarks call it, see cases), after one call at each to build
// the one-time caches.
func evalsOf(f *fluid.Fluid, fl benchFlash, sts []State) (med, worst float64) {
	cs := cases(fl, sts)
	for _, c := range cs {
		fl.fn(f, c.a, c.b, c.opt)
	}
	var ns []float64
	for _, c := range cs {
		n0, i0 := evalcount.Load(), evalcount.LoadIsotherm()
		fl.fn(f, c.a, c.b, c.opt)
		ns = append(ns, fullEquivalents(n0, i0))
	}
	if len(ns) == 0 {
		return 0, 0
	}
	slices.Sort(ns)
	return ns[len(ns)/2], ns[len(ns)-1]
}

// regionByName returns the benchmark region of that name.
func regionByName(name string) benchRegion {
	for _, rg := range benchRegions {
		if rg.name == name {
			return rg
		}
	}
	panic("no benchmark region " + name)
}

// TestFlashEvals checks the speed goals of issue 4 in evaluations of the
// fluid equation (only a build with -tags tripoint_evalcount counts
// them), as medians over the benchmark grids (BenchmarkFlash) of every
// fluid, in full-evaluation equivalents (fullEquivalents: an isotherm
// evaluation counts as isoWeight of a full one): PT at most 4 in every
// region; single-phase PH and PS at most 6; two-phase PH and PS, TQ and
// PQ at most 6 (one saturation from the cached curve's start);
// warm-started PH at most 2 (in one phase: at the start carried to the
// inputs, and where the Newton step is taken to first order; in two:
// one of each saturated phase), next to saturation too (a start carried
// across the vapour-pressure curve goes to the saturation at once); DU
// of a mixture at most 20 in every case, and warm-started from a mixture
// half that (issue 4: a warm start costs about half a cold one); and near saturation (within 0.5 % of the vapour pressure)
// no dearer than the dearer of the liquid and the vapour away from it.
func TestFlashEvals(t *testing.T) {
	flashes := map[string]benchFlash{}
	for _, fl := range benchFlashes {
		flashes[fl.name] = fl
	}
	type goal struct {
		flash, region string
		median, worst float64 // 0: not checked
	}
	goals := []goal{
		{"PT", "liquid", 4, 0}, {"PT", "vapour", 4, 0}, {"PT", "nearSaturation", 4, 0},
		{"PT", "supercritical", 4, 0},
		{"PH", "liquid", 6, 0}, {"PH", "vapour", 6, 0}, {"PH", "supercritical", 6, 0},
		{"PS", "liquid", 6, 0}, {"PS", "vapour", 6, 0}, {"PS", "supercritical", 6, 0},
		{"PH", "twoPhase", 6, 0}, {"PS", "twoPhase", 6, 0},
		{"TQ", "twoPhase", 6, 0}, {"PQ", "twoPhase", 6, 0},
		{"PHwarm", "liquid", 2, 0}, {"PHwarm", "vapour", 2, 0}, {"PHwarm", "supercritical", 2, 0},
		{"PHwarm", "nearSaturation", 2, 0}, {"PHwarm", "twoPhase", 2, 0},
		{"DU", "twoPhase", 20, 20}, {"DUwarm", "twoPhase", 10, 10},
	}
	for _, f := range fluids(t) {
		med := map[[2]string]float64{}
		for _, rg := range benchRegions {
			sts := rg.states(f)
			for _, fl := range benchFlashes {
				if applies(fl.name, rg.name) {
					m, _ := evalsOf(f, fl, sts)
					med[[2]string{fl.name, rg.name}] = m
				}
			}
		}
		for _, g := range goals {
			rg := regionByName(g.region)
			m, w := evalsOf(f, flashes[g.flash], rg.states(f))
			if g.median > 0 && m > g.median {
				t.Errorf("%s %s %s: median %g full-evaluation equivalents, goal %g", f.Name(), g.flash, g.region, m, g.median)
			}
			if g.worst > 0 && w > g.worst {
				t.Errorf("%s %s %s: up to %g full-evaluation equivalents, goal %g", f.Name(), g.flash, g.region, w, g.worst)
			}
		}
		for _, rg := range []string{"liquid", "vapour", "supercritical"} {
			// A single-phase warm start away from saturation is no dearer
			// than a cold one (next to it, where a step may cross the
			// curve, it is not checked; in the dome the cold path places
			// the state on the cached curve, which costs time but no
			// evaluation, and ends with one or two saturations, against
			// the warm path's two: the warm one is the faster in time,
			// 0.56-0.78 of the cold one on the benchmark grids).
			if w, c := med[[2]string{"DUwarm", rg}], med[[2]string{"DU", rg}]; w > c {
				t.Errorf("%s DU %s: median %g full-evaluation equivalents warm-started, %g cold", f.Name(), rg, w, c)
			}
		}
		for _, fl := range []string{"PT", "PH", "PS", "DU", "DT", "PD"} {
			near := med[[2]string{fl, "nearSaturation"}]
			away := max(med[[2]string{fl, "liquid"}], med[[2]string{fl, "vapour"}])
			if near > away {
				t.Errorf("%s %s: median %g full-evaluation equivalents near saturation, %g away from it", f.Name(), fl, near, away)
			}
		}
	}
}

// TestCeilingEvals holds the cost of PH and PS next to the accepted
// temperatures' ceiling (TestTemperatureCeiling's cases) to 12
// evaluations of the equation per call cold and 4 warm-started, beyond
// the ceiling as inside it.
func TestCeilingEvals(t *testing.T) {
	ceilingCases(t, func(f *fluid.Fluid, name string, p float64, st *State, x float64, opt Options, rel float64) {
		fn := PHWith
		if name == "s" {
			fn = PSWith
		}
		n0 := evalcount.Load()
		fn(f, p, x, opt)
		goal := uint64(12)
		if opt.Guess != nil {
			goal = 4
		}
		if n := evalcount.Load() - n0; n > goal {
			t.Errorf("%s P%s at p = %v, %s offset %g from TCeil (warm %v): %d evaluations, goal %d",
				f.Name(), name, p, name, rel, opt.Guess != nil, n, goal)
		}
	})
}
