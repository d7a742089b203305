package flash

import (
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/internal/evalcount"
)

// Benchmarks of the flashes in the solid regions, over grids of states of
// each region (the loop cycles through them), with allocations, the time
// per call in units of a Props evaluation measured in the same run
// ("Props/op", from the first sub-benchmark of each fluid) and, built with
// -tags tripoint_evalcount, evaluations of the fluid equation per call:
//
//	go test -run XXX -bench SolidRegions -benchmem ./flash
//	go test -tags tripoint_evalcount -run XXX -bench SolidRegions ./flash
//
// The goal of issue 5: PH into the solid–vapour region within 12 Props
// evaluations per call (TestPHSolidVaporEvals checks the count).

// solidBenchRegions are grids of states in each solid region.
var solidBenchRegions = []struct {
	name   string
	states func(t testing.TB, f *fluid.Fluid) []State
}{
	{"solidVapour", func(t testing.TB, f *fluid.Fluid) []State { return solidVaporStates(t, f) }},
	{"solid", func(t testing.TB, f *fluid.Fluid) []State { return onlyPhase(solidRegionStates(t, f), Solid) }},
	{"solidLiquid", func(t testing.TB, f *fluid.Fluid) []State { return onlyPhase(solidRegionStates(t, f), SolidLiquid) }},
	{"triple", func(t testing.TB, f *fluid.Fluid) []State { return onlyPhase(solidRegionStates(t, f), Triple) }},
}

// solidVaporStates are solid–vapour states of f at pressures from a
// five-hundredth of the triple-point pressure to just below it, a quarter,
// half and three quarters vapour by mass.
func solidVaporStates(t testing.TB, f *fluid.Fluid) []State {
	pt := f.Triple().P
	var sts []State
	for _, x := range []float64{2e-3, 1e-2, 0.1, 0.3, 0.9} {
		for _, q := range []float64{0.25, 0.5, 0.75} {
			st, err := PQ(f, x*pt, q)
			if err != nil {
				t.Fatal(err)
			}
			sts = append(sts, st)
		}
	}
	return sts
}

func onlyPhase(sts []State, ph Phase) []State {
	var out []State
	for _, st := range sts {
		if st.Phase == ph {
			out = append(out, st)
		}
	}
	return out
}

// solidBenchFlashes are the flashes benchmarked in the solid regions, with
// their inputs from a state.
var solidBenchFlashes = []struct {
	name string
	fn   func(f *fluid.Fluid, a, b float64, opt Options) (State, error)
	in   func(st *State) (a, b float64)
}{
	{"PH", PHWith, func(s *State) (float64, float64) { return s.P, s.H }},
	{"PS", PSWith, func(s *State) (float64, float64) { return s.P, s.S }},
	{"PT", PTWith, func(s *State) (float64, float64) { return s.P, s.T }},
	{"TQ", TQWith, func(s *State) (float64, float64) { return s.T, s.Quality }},
	{"PQ", PQWith, func(s *State) (float64, float64) { return s.P, s.Quality }},
	{"DU", DUWith, func(s *State) (float64, float64) { return s.Rho, s.U }},
	{"DT", DTWith, func(s *State) (float64, float64) { return s.Rho, s.T }},
	{"HS", HSWith, func(s *State) (float64, float64) { return s.H, s.S }},
	{"TS", TSWith, func(s *State) (float64, float64) { return s.T, s.S }},
	{"PD", PDWith, func(s *State) (float64, float64) { return s.P, s.Rho }},
}

// solidBenchApplies reports whether a flash fixes states of the region:
// PT does not fix a mixture, TQ and PQ only the solid–vapour ones.
func solidBenchApplies(fl, region string) bool {
	switch fl {
	case "PT":
		return region == "solid"
	case "TQ", "PQ":
		return region == "solidVapour"
	}
	return true
}

func BenchmarkSolidRegions(b *testing.B) {
	for _, f := range solidFluids(b) {
		// The unit: Props at the fluid phases of the solid–vapour grid.
		sv := solidVaporStates(b, f)
		var propsNs float64
		b.Run(f.Name()+"/Props", func(b *testing.B) {
			b.ReportAllocs()
			n0 := evalcount.Load()
			for i := 0; i < b.N; i++ {
				s := &sv[i%len(sv)]
				p, _ := f.Props(s.T, s.Phases[1].Rho)
				benchSink += p.H
			}
			reportEvals(b, n0)
			propsNs = float64(b.Elapsed().Nanoseconds()) / float64(b.N)
		})
		for _, rg := range solidBenchRegions {
			sts := rg.states(b, f)
			for _, fl := range solidBenchFlashes {
				if !solidBenchApplies(fl.name, rg.name) || len(sts) == 0 {
					continue
				}
				b.Run(f.Name()+"/"+fl.name+"/"+rg.name, func(b *testing.B) {
					b.ReportAllocs()
					a, c := fl.in(&sts[0])
					fl.fn(f, a, c, Options{}) // the node tables, built once, outside the timing
					b.ResetTimer()
					n0 := evalcount.Load()
					for i := 0; i < b.N; i++ {
						s := &sts[i%len(sts)]
						a, c := fl.in(s)
						st, _ := fl.fn(f, a, c, Options{})
						benchSink += st.T
					}
					reportEvals(b, n0)
					if propsNs > 0 {
						b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/propsNs, "Props/op")
					}
				})
			}
		}
	}
}
