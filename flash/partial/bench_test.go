package partial

import (
	"math"
	"testing"
	"time"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/internal/evalcount"
)

var sink float64

// benchStates are one state of each region of fluid name (the states
// of states(), first of each phase).
func benchStates(b *testing.B, name string) (*fluid.Fluid, []testState) {
	f := mustFluid(b, name)
	seen := map[flash.Phase]bool{}
	var out []testState
	for _, ts := range states(b, f) {
		if !seen[ts.st.Phase] {
			seen[ts.st.Phase] = true
			out = append(out, ts)
		}
	}
	return f, out
}

// benchQuantities is the derivative the benchmarks take: (∂ρ/∂h)_p, of
// the energy balance of a simulator, and at the triple point (where p
// does not vary) (∂ρ/∂u)_s.
func benchQuantities(ph flash.Phase) (a, b, c Quantity) {
	if ph == flash.Triple {
		return Rho, U, S
	}
	return Rho, H, P
}

// BenchmarkDerivative is one derivative from a state, At included, in
// each region of CO2; with -tags tripoint_evalcount it reports the
// residual-Helmholtz evaluations per call.
func BenchmarkDerivative(b *testing.B) {
	f, sts := benchStates(b, "CO2")
	for _, ts := range sts {
		b.Run(ts.st.Phase.String(), func(b *testing.B) {
			st := ts.st
			qa, qb, qc := benchQuantities(st.Phase)
			if _, err := Derivative(f, st, qa, qb, qc); err != nil {
				b.Fatal(err)
			}
			b.ReportAllocs()
			e0 := evalcount.Load()
			for b.Loop() {
				d, _ := Derivative(f, st, qa, qb, qc)
				sink += d
			}
			if evalcount.Enabled {
				b.ReportMetric(float64(evalcount.Load()-e0)/float64(b.N), "evals/op")
			}
		})
	}
}

// BenchmarkJacobianDerivative is one derivative from a Jacobian built
// beforehand: the algebra alone.
func BenchmarkJacobianDerivative(b *testing.B) {
	f, sts := benchStates(b, "CO2")
	j, err := At(f, sts[0].st)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		d, _ := j.Derivative(Rho, H, P)
		sink += d
	}
}

// BenchmarkSlopes is SlopesOf at a two-phase state and one slope.
func BenchmarkSlopes(b *testing.B) {
	f, sts := benchStates(b, "CO2")
	for _, ts := range sts {
		if ts.st.N != 2 {
			continue
		}
		b.Run(ts.st.Phase.String(), func(b *testing.B) {
			st := ts.st
			b.ReportAllocs()
			for b.Loop() {
				s, _ := SlopesOf(f, st)
				d, _ := s.Derivative(1, Rho, P)
				sink += d
			}
		})
	}
}

// BenchmarkCost measures, in one run, the cost of a derivative against
// the cost the issue allows (issue 11, "Speed"): one fluid.Fluid.Props
// evaluation at a single-phase fluid state, one saturation-derivative
// evaluation (SlopesOf) at a two-phase state, one solid Props at a solid
// state. It reports ns per derivative and the ratio (the goal: ≤ 1),
// each the best of 15 batches, taken in turn so that both see the same
// load.
func BenchmarkCost(b *testing.B) {
	for _, name := range []string{"CO2", "water"} {
		b.Run(name, func(b *testing.B) { benchCost(b, name) })
	}
}

func benchCost(b *testing.B, name string) {
	f, sts := benchStates(b, name)
	for _, ts := range sts {
		st := ts.st
		var ref func()
		refName := ""
		switch st.N {
		case 1:
			if st.Phase == flash.Solid {
				sol := mustSolid(b, f)
				ref, refName = func() { p, _ := sol.Props(st.T, st.P); sink += p.Cp }, "solid-Props"
			} else {
				ref, refName = func() { p, _ := f.Props(st.T, st.Rho); sink += p.Cp }, "Props"
			}
		case 2:
			ref, refName = func() { s, _ := SlopesOf(f, st); sink += s.DpDT }, "SlopesOf"
		default:
			continue // no evaluation at the triple point
		}
		b.Run(st.Phase.String(), func(b *testing.B) {
			const n = 2000
			batch := func(fn func()) float64 {
				t0 := time.Now()
				for i := 0; i < n; i++ {
					fn()
				}
				return float64(time.Since(t0).Nanoseconds()) / n
			}
			der := func() { d, _ := Derivative(f, st, Rho, H, P); sink += d }
			refNs, derNs := math.Inf(1), math.Inf(1)
			for r := 0; r < 15; r++ {
				refNs, derNs = min(refNs, batch(ref)), min(derNs, batch(der))
			}
			for b.Loop() {
				der()
			}
			b.ReportMetric(derNs, "derivative-ns")
			b.ReportMetric(refNs, refName+"-ns")
			b.ReportMetric(derNs/refNs, "ratio")
		})
	}
}
