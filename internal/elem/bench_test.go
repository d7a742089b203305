package elem

import (
	"math"
	"testing"
)

var sink float64

// The kernels and the math functions they replace, on arguments of the
// equations' range, 50 calls per op as BenchmarkExp50 in package fluid.
func BenchmarkExp(b *testing.B) {
	for _, c := range []struct {
		name string
		f    func(float64) float64
	}{{"elem", Exp}, {"math", math.Exp}} {
		b.Run(c.name, func(b *testing.B) {
			x := -0.5
			for b.Loop() {
				s := 0.0
				for i := range 50 {
					s += c.f(x - 0.01*float64(i))
				}
				sink = s
				x = -0.5 - 1e-9*s
			}
		})
	}
}

func BenchmarkLog(b *testing.B) {
	for _, c := range []struct {
		name string
		f    func(float64) float64
	}{{"elem", Log}, {"math", math.Log}} {
		b.Run(c.name, func(b *testing.B) {
			x := 0.5
			for b.Loop() {
				s := 0.0
				for i := range 50 {
					s += c.f(x + 0.03*float64(i))
				}
				sink = s
				x = 0.5 + 1e-9*s
			}
		})
	}
}
