package fluid

import (
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/internal/evalcount"
)

// reportCounts reports the evaluations of the equation per call, all of
// them (evals/op) and those on an isotherm among them (iso/op), when the
// build counts them (go test -tags tripoint_evalcount -bench .).
func reportCounts(b *testing.B, n0, i0 uint64) {
	if evalcount.Enabled {
		b.ReportMetric(float64(evalcount.Load()-n0)/float64(b.N), "evals/op")
		b.ReportMetric(float64(evalcount.LoadIsotherm()-i0)/float64(b.N), "iso/op")
	}
}

// solverStates are (T in K, p in Pa) states of each fluid in each region,
// states of our own choosing: compressed liquid, vapour, supercritical,
// and liquid and vapour within 5 % of the vapour pressure (where the
// stable root needs the equation's own saturation).
var solverStates = map[string]map[string][][2]float64{
	"water": {
		"liquid":        {{300, 1e6}, {350, 5e6}, {400, 100e6}, {500, 10e6}},
		"vapour":        {{400, 1e5}, {500, 1e5}, {600, 1e6}, {700, 5e6}},
		"supercritical": {{700, 30e6}, {800, 50e6}, {1000, 100e6}, {660, 25e6}},
		"nearSat":       {{373.124, 101325}, {450, 0.96e6}, {500, 2.5e6}, {600, 12.6e6}},
	},
	"CO2": {
		"liquid":        {{220, 1e6}, {250, 5e6}, {280, 10e6}, {300, 20e6}},
		"vapour":        {{220, 0.3e6}, {250, 1e6}, {280, 3e6}, {300, 5e6}},
		"supercritical": {{310, 8e6}, {350, 10e6}, {400, 30e6}, {500, 5e6 + 3e6}},
		"nearSat":       {{230, 0.9e6}, {250, 1.75e6}, {270, 3.1e6}, {290, 5.1e6}},
	},
	"R134a": {
		"liquid":        {{200, 1e6}, {250, 2e6}, {300, 5e6}, {350, 10e6}},
		"vapour":        {{250, 0.05e6}, {300, 0.3e6}, {330, 0.8e6}, {360, 2e6}},
		"supercritical": {{380, 5e6}, {400, 10e6}, {450, 20e6}, {420, 4.5e6}},
		"nearSat":       {{250, 0.118e6}, {280, 0.36e6}, {320, 1.05e6}, {350, 2.5e6}},
	},
}

// BenchmarkSolvers times the solvers that work on one isotherm, for every
// fluid: Density and PropsTP (RootStable) per region, cycling through four
// states, and SaturationAtT and SaturationAtP over their whole range.
func BenchmarkSolvers(b *testing.B) {
	for _, name := range []string{"water", "CO2", "R134a"} {
		f, err := Lookup(name)
		if err != nil {
			b.Fatal(err)
		}
		for _, region := range []string{"liquid", "vapour", "supercritical", "nearSat"} {
			states := solverStates[name][region]
			for _, s := range states {
				if _, err := f.PropsTP(s[0], s[1], RootStable, 0); err != nil {
					b.Fatalf("%s %v: %v", name, s, err)
				}
			}
			b.Run(name+"/Density/"+region, func(b *testing.B) {
				b.ReportAllocs()
				n0, i0 := evalcount.Load(), evalcount.LoadIsotherm()
				for i := 0; i < b.N; i++ {
					s := states[i&3]
					rho, _ := f.Density(s[0], s[1], RootStable)
					fluidSink += rho
				}
				reportCounts(b, n0, i0)
			})
			b.Run(name+"/PropsTP/"+region, func(b *testing.B) {
				b.ReportAllocs()
				n0, i0 := evalcount.Load(), evalcount.LoadIsotherm()
				for i := 0; i < b.N; i++ {
					s := states[i&3]
					p, _ := f.PropsTP(s[0], s[1], RootStable, 0)
					fluidSink += p.H
				}
				reportCounts(b, n0, i0)
			})
		}
		tt, tc := f.Triple().T, f.Critical().T
		pt, pc := f.Triple().P, f.Critical().P
		b.Run(name+"/SaturationAtT", func(b *testing.B) {
			b.ReportAllocs()
			n0, i0 := evalcount.Load(), evalcount.LoadIsotherm()
			for i := 0; i < b.N; i++ {
				T := tt + (tc-0.01-tt)*float64(i&63)/63
				s, _ := f.SaturationAtT(T)
				fluidSink += s.P
			}
			reportCounts(b, n0, i0)
		})
		b.Run(name+"/SaturationAtP", func(b *testing.B) {
			b.ReportAllocs()
			n0, i0 := evalcount.Load(), evalcount.LoadIsotherm()
			for i := 0; i < b.N; i++ {
				p := pt * 1.01 * math.Pow(0.99*pc/(1.01*pt), float64(i&63)/63)
				s, _ := f.SaturationAtP(p)
				fluidSink += s.T
			}
			reportCounts(b, n0, i0)
		})
	}
}

// BenchmarkResidual times one evaluation of αʳ at a liquid state of each
// fluid: Eval (every derivative, the third δ-derivative included),
// EvalSecond (what Props needs), an Isotherm's Eval (αʳ, αʳ_δ, αʳ_δδ, what
// the density and saturation solvers need on one isotherm) and the
// Isotherm's construction.
func BenchmarkResidual(b *testing.B) {
	for _, c := range []struct {
		name   string
		T, rho float64
	}{{"water", 300, 996.6}, {"CO2", 250, 1050}, {"R134a", 250, 1372}} {
		f, err := Lookup(c.name)
		if err != nil {
			b.Fatal(err)
		}
		d, tau := c.rho/f.rhoc, f.tc/c.T
		b.Run(c.name+"/Eval", func(b *testing.B) {
			for b.Loop() {
				r := f.resid.Eval(d, tau)
				fluidSink += r.A
			}
		})
		b.Run(c.name+"/EvalSecond", func(b *testing.B) {
			for b.Loop() {
				r := f.resid.EvalSecond(d, tau)
				fluidSink += r.A
			}
		})
		it := f.resid.Isotherm(tau)
		b.Run(c.name+"/IsothermEval", func(b *testing.B) {
			for b.Loop() {
				r := it.Eval(d)
				fluidSink += r.A
			}
		})
		b.Run(c.name+"/Isotherm", func(b *testing.B) {
			for b.Loop() {
				it := f.resid.Isotherm(tau)
				fluidSink += it.Tau()
			}
		})
	}
}
