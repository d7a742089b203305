package flash

import (
	"flag"
	"fmt"
	"math"
	"slices"
	"testing"
	"time"

	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/internal/evalcount"
)

// Benchmarks per flash and region, over a grid of states of each region
// (the loop cycles through them), with allocations and, built with
// -tags tripoint_evalcount, residual-equation evaluations per call:
//
//	go test -run XXX -bench . -benchmem ./flash
//	go test -tags tripoint_evalcount -run XXX -bench . ./flash
//
// Props is the unit the goals are stated in. For medians and the
// worst state per region, in ratios to Props measured in the same run:
//
//	go test -run TestSpeedReport ./flash -args -flash.report
//
// and warm-started calls against cold ones (TestWarmReport):
//
//	go test -run TestWarmReport ./flash -args -flash.warmreport

var report = flag.Bool("flash.report", false, "print the per-region speed report (TestSpeedReport)")

// region names a part of the state space and gives a grid of states in it.
type benchRegion struct {
	name   string
	states func(f *fluid.Fluid) []State
}

// linspace returns n points from a to b.
func linspace(a, b float64, n int) []float64 {
	xs := make([]float64, n)
	for i := range xs {
		xs[i] = a + (b-a)*float64(i)/float64(n-1)
	}
	return xs
}

// satP returns the vapour pressure at T (for placing the grids).
func satPressure(f *fluid.Fluid, T float64) float64 {
	s, err := f.SaturationAtT(T)
	if err != nil {
		panic(err)
	}
	return s.P
}

func gridPT(f *fluid.Fluid, ts []float64, p func(T float64) []float64) []State {
	var sts []State
	for _, T := range ts {
		for _, pp := range p(T) {
			if st, err := PT(f, pp, T); err == nil {
				sts = append(sts, st)
			}
		}
	}
	return sts
}

var benchRegions = []benchRegion{
	{"liquid", func(f *fluid.Fluid) []State {
		tp, c := f.Triple(), f.Critical()
		return gridPT(f, linspace(tp.T+0.1*(c.T-tp.T), 0.85*c.T, 5), func(T float64) []float64 {
			ps := satPressure(f, T)
			return []float64{2 * ps, max(10*ps, 0.5*c.P), max(50*ps, 2*c.P)}
		})
	}},
	{"vapour", func(f *fluid.Fluid) []State {
		tp, c := f.Triple(), f.Critical()
		hi := min(1.5*c.T, f.Limits().TMax-warmMargin) // within the published range (R-134a: 455 K)
		return gridPT(f, linspace(tp.T+0.2*(c.T-tp.T), hi, 5), func(T float64) []float64 {
			ps := c.P
			if T < c.T {
				ps = satPressure(f, T)
			}
			return []float64{0.5 * ps, 0.1 * ps, 0.01 * ps}
		})
	}},
	{"supercritical", func(f *fluid.Fluid) []State {
		c := f.Critical()
		hi := min(2*c.T, f.Limits().TMax-warmMargin) // within the published range
		return gridPT(f, linspace(1.1*c.T, hi, 5), func(T float64) []float64 {
			return []float64{1.5 * c.P, 3 * c.P, 6 * c.P}
		})
	}},
	{"nearSaturation", func(f *fluid.Fluid) []State {
		tp, c := f.Triple(), f.Critical()
		return gridPT(f, linspace(tp.T+0.1*(c.T-tp.T), 0.95*c.T, 5), func(T float64) []float64 {
			ps := satPressure(f, T)
			return []float64{0.995 * ps, 1.005 * ps}
		})
	}},
	{"twoPhase", func(f *fluid.Fluid) []State {
		tp, c := f.Triple(), f.Critical()
		var sts []State
		for _, T := range linspace(tp.T+0.05*(c.T-tp.T), 0.95*c.T, 5) {
			for _, q := range []float64{0.2, 0.5, 0.8} {
				if st, err := TQ(f, T, q); err == nil {
					sts = append(sts, st)
				}
			}
		}
		return sts
	}},
}

// warmMargin (K) keeps the grids' top below the equation's upper
// temperature limit by more than a warm-started case's step (0.5 kJ/kg
// at cp above 0.5 kJ/(kg K)), so that no case times an out-of-range
// error (TestBenchCasesSucceed).
const warmMargin = 2

// benchFlash is a flash under benchmark: its inputs from a state, and
// whether it is warm-started from a neighbour.
type benchFlash struct {
	name string
	fn   func(f *fluid.Fluid, a, b float64, opt Options) (State, error)
	in   func(st *State) (a, b float64)
	warm bool
}

var benchFlashes = []benchFlash{
	{"PT", PTWith, func(s *State) (float64, float64) { return s.P, s.T }, false},
	{"PH", PHWith, func(s *State) (float64, float64) { return s.P, s.H }, false},
	{"PHwarm", PHWith, func(s *State) (float64, float64) { return s.P, s.H }, true},
	{"PS", PSWith, func(s *State) (float64, float64) { return s.P, s.S }, false},
	{"TQ", TQWith, func(s *State) (float64, float64) { return s.T, s.Quality }, false},
	{"PQ", PQWith, func(s *State) (float64, float64) { return s.P, s.Quality }, false},
	{"DU", DUWith, func(s *State) (float64, float64) { return s.Rho, s.U }, false},
	{"DUwarm", DUWith, func(s *State) (float64, float64) { return s.Rho, s.U }, true},
	{"HS", HSWith, func(s *State) (float64, float64) { return s.H, s.S }, false},
	{"DT", DTWith, func(s *State) (float64, float64) { return s.Rho, s.T }, false},
	{"TS", TSWith, func(s *State) (float64, float64) { return s.T, s.S }, false},
	{"PD", PDWith, func(s *State) (float64, float64) { return s.P, s.Rho }, false},
}

// applies reports whether the flash is meaningful in the region (PT in
// a two-phase region is not; TQ and PQ are two-phase only).
func applies(fl, region string) bool {
	switch fl {
	case "PT":
		return region != "twoPhase"
	case "TQ", "PQ":
		return region == "twoPhase"
	}
	return true
}

// benchCase is one call: inputs and options.
type benchCase struct {
	a, b float64
	opt  Options
}

// cases turns a region's states into calls of fl. A warm start is from
// the state itself with the inputs moved a little (a simulator's step:
// 0.1 % in p or ρ, 0.5 kJ/kg in h or u).
func cases(fl benchFlash, sts []State) []benchCase {
	var cs []benchCase
	for i := range sts {
		a, b := fl.in(&sts[i])
		c := benchCase{a: a, b: b}
		if fl.warm {
			g := sts[i]
			c.a, c.b = a*1.001, b+500
			c.opt.Guess = &g
		}
		cs = append(cs, c)
	}
	return cs
}

// isoWeight is what an isotherm evaluation of the equation
// (evalcount.AddIsotherm: αʳ and two δ-derivatives on a prepared
// isotherm, the density and saturation solvers' iterations) counts for
// against a full one (evalcount.Add: every derivative Props needs). In
// instructions (callgrind, this branch, one liquid state each) an
// isotherm evaluation costs 0.31 (R-134a: 603 against 1959 of a Props
// call), 0.39 (water: 1713 against 4450) and 0.42 (CO2: 2019 against
// 4832) of a Props call; it counts as the upper bound rounded up, 1/2.
const isoWeight = 0.5

// fullEquivalents returns the evaluations counted since (n0, i0) =
// (evalcount.Load, evalcount.LoadIsotherm) as full evaluations plus
// isoWeight times the isotherm ones.
func fullEquivalents(n0, i0 uint64) float64 {
	iso := evalcount.LoadIsotherm() - i0
	return float64(evalcount.Load()-n0-iso) + isoWeight*float64(iso)
}

var benchSink float64

func BenchmarkProps(b *testing.B) {
	for _, f := range fluids(b) {
		sts := benchRegions[0].states(f)
		b.Run(f.Name(), func(b *testing.B) {
			b.ReportAllocs()
			n0 := evalcount.Load()
			for i := 0; i < b.N; i++ {
				s := &sts[i%len(sts)]
				p, _ := f.Props(s.T, s.Rho)
				benchSink += p.H
			}
			reportEvals(b, n0)
		})
	}
}

func reportEvals(b *testing.B, n0 uint64) {
	if evalcount.Enabled {
		b.ReportMetric(float64(evalcount.Load()-n0)/float64(b.N), "evals/op")
	}
}

func BenchmarkFlash(b *testing.B) {
	for _, f := range fluids(b) {
		for _, rg := range benchRegions {
			sts := rg.states(f)
			for _, fl := range benchFlashes {
				if !applies(fl.name, rg.name) {
					continue
				}
				cs := cases(fl, sts)
				b.Run(f.Name()+"/"+fl.name+"/"+rg.name, func(b *testing.B) {
					b.ReportAllocs()
					n0 := evalcount.Load()
					for i := 0; i < b.N; i++ {
						c := &cs[i%len(cs)]
						st, _ := fl.fn(f, c.a, c.b, c.opt)
						benchSink += st.T
					}
					reportEvals(b, n0)
				})
			}
		}
	}
}

// warmStep returns the inputs of flash fl at state g moved by a
// simulator's step: 0.1 % in the first; in the second 0.1 % (ρ, T), 1e-3
// (a quality) or 0.1 % of max(|x|, 1000) (h, s, u).
func warmStep(fl benchFlash, g *State) (a, b float64) {
	a, b = fl.in(g)
	switch fl.name {
	case "TQ", "PQ":
		b += 1e-3
	case "DT", "PD":
		b *= 1.001
	default:
		b += 1e-3 * math.Max(math.Abs(b), 1000)
	}
	return a * 1.001, b
}

var warmReport = flag.Bool("flash.warmreport", false, "print the warm-start report (TestWarmReport)")

// TestWarmReport prints, with -args -flash.warmreport, for every flash
// and region the median time of a call warm-started from each state of
// the grid with its inputs moved by warmStep, against the same call
// cold, and their ratio (each call the best of 5 rounds of 40). It is a
// measurement, not a check.
func TestWarmReport(t *testing.T) {
	if !*warmReport {
		t.Skip("run with -args -flash.warmreport")
	}
	timeOf := func(fn func()) float64 {
		best := math.Inf(1)
		for r := 0; r < 5; r++ {
			t0 := time.Now()
			for i := 0; i < 40; i++ {
				fn()
			}
			best = min(best, float64(time.Since(t0).Nanoseconds())/40)
		}
		return best
	}
	median := func(xs []float64) float64 {
		slices.Sort(xs)
		return xs[len(xs)/2]
	}
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
				var cold, warm []float64
				for i := range sts {
					g := sts[i]
					a, b := warmStep(fl, &g)
					if _, err := fl.fn(f, a, b, Options{}); err != nil {
						continue
					}
					cold = append(cold, timeOf(func() { fl.fn(f, a, b, Options{}) }))
					warm = append(warm, timeOf(func() { fl.fn(f, a, b, Options{Guess: &g}) }))
				}
				if len(cold) == 0 {
					continue
				}
				mc, mw := median(cold), median(warm)
				fmt.Printf("%-6s %-3s %-15s cold %6.0f ns, warm %6.0f ns = %.2f\n", f.Name(), fl.name, rg.name, mc, mw, mw/mc)
			}
		}
	}
}

// TestBenchCasesSucceed checks that every benchmarked call returns a
// state: a benchmark or speed report that timed an error path (a grid
// state at the edge of the range, or a warm step beyond it) would
// measure the wrong thing.
func TestBenchCasesSucceed(t *testing.T) {
	for _, f := range fluids(t) {
		for _, rg := range benchRegions {
			sts := rg.states(f)
			for _, fl := range benchFlashes {
				if !applies(fl.name, rg.name) {
					continue
				}
				for _, c := range cases(fl, sts) {
					if _, err := fl.fn(f, c.a, c.b, c.opt); err != nil {
						t.Errorf("%s %s %s: %v", f.Name(), fl.name, rg.name, err)
					}
				}
			}
		}
	}
}

// TestSpeedReport prints, with -args -flash.report, the median and the
// worst time per call of every flash in every region over its grid of
// states, in ns and in ratios to the median Props evaluation (over the
// liquid grid) measured next to it, just before and just after, the
// less disturbed of the two, with evaluations per call where the build
// counts them: the median and largest count of all evaluations, and the
// median of full-evaluation equivalents (fullEquivalents). Each state is
// called once before it is timed or counted, so that one-time caches
// (the cached saturation curve, the solid models' node tables) are not.
// It is a measurement, not a check (the goals are for benchmarks).
func TestSpeedReport(t *testing.T) {
	if !*report {
		t.Skip("run with -args -flash.report")
	}
	// The best of 5 rounds of 40 calls: the least disturbed by the rest
	// of the machine.
	timeOf := func(fn func()) float64 {
		best := math.Inf(1)
		for r := 0; r < 5; r++ {
			t0 := time.Now()
			for i := 0; i < 40; i++ {
				fn()
			}
			best = min(best, float64(time.Since(t0).Nanoseconds())/40)
		}
		return best
	}
	median := func(xs []float64) float64 {
		slices.Sort(xs)
		return xs[len(xs)/2]
	}
	for _, f := range fluids(t) {
		sts := benchRegions[0].states(f)
		propsUnit := func() float64 {
			var props []float64
			for i := range sts {
				s := &sts[i]
				props = append(props, timeOf(func() { f.Props(s.T, s.Rho) }))
			}
			return median(props)
		}
		fmt.Printf("%s: Props median %.0f ns\n", f.Name(), propsUnit())
		for _, rg := range benchRegions {
			sts := rg.states(f)
			for _, fl := range benchFlashes {
				if !applies(fl.name, rg.name) {
					continue
				}
				cs := cases(fl, sts)
				for _, c := range cs {
					fl.fn(f, c.a, c.b, c.opt)
				}
				unit := propsUnit()
				var ns, ev, eq []float64
				for _, c := range cs {
					n0, i0 := evalcount.Load(), evalcount.LoadIsotherm()
					fl.fn(f, c.a, c.b, c.opt)
					ev = append(ev, float64(evalcount.Load()-n0))
					eq = append(eq, fullEquivalents(n0, i0))
					ns = append(ns, timeOf(func() { fl.fn(f, c.a, c.b, c.opt) }))
				}
				unit = min(unit, propsUnit())
				med := median(ns)
				worst := ns[len(ns)-1]
				evs := ""
				if evalcount.Enabled {
					slices.Sort(ev)
					evs = fmt.Sprintf("  evals median %.0f max %.0f, full-equivalents median %.1f", ev[len(ev)/2], ev[len(ev)-1], median(eq))
				}
				fmt.Printf("  %-7s %-15s median %7.0f ns = %5.2f Props, worst %7.0f ns = %5.2f Props%s\n",
					fl.name, rg.name, med, med/unit, worst, worst/unit, evs)
			}
		}
	}
}
