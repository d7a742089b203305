package fluid

import (
	"math"
	"testing"
)

var (
	sinkProps Props
	sinkFloat float64
)

// benchStates are water states in each region (states of IAPWS R6-95(2018)
// Table 7 and the critical point itself).
var benchStates = []struct {
	name   string
	T, rho float64
}{
	{"liquid/300K", 300, 996.556},
	{"vapour/500K", 500, 4.532},
	{"dense/500K", 500, 1084.564},
	{"nearcritical/647K", 647, 358},
	{"supercritical/900K", 900, 52.615},
	{"critical", 647.096, 322},
}

// BenchmarkProps is one full Props call: every property at one (T, ρ).
func BenchmarkProps(b *testing.B) {
	f := water(b)
	for _, s := range benchStates {
		b.Run(s.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				p, err := f.Props(s.T, s.rho)
				if err != nil {
					b.Fatal(err)
				}
				sinkProps = p
			}
		})
	}
}

// BenchmarkExp50 is 50 calls of math.Exp, the yardstick for
// BenchmarkProps: IAPWS-95 needs about that many transcendental functions
// (exponentials, powers and logarithms) per evaluation.
func BenchmarkExp50(b *testing.B) {
	b.ReportAllocs()
	x := -0.5
	for b.Loop() {
		s := 0.0
		for i := range 50 {
			s += math.Exp(x - 0.01*float64(i))
		}
		sinkFloat = s
		x = -0.5 - 1e-9*s // a dependence the compiler cannot hoist
	}
}
