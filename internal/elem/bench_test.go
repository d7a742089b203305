package elem

import (
	"math"
	"testing"
)

var sink float64

// benchKernels times f and ref on 50 arguments per op, x0 + step·i (as
// BenchmarkExp50 in package fluid).
func benchKernels(b *testing.B, f, ref func(float64) float64, x0, step float64) {
	for _, c := range []struct {
		name string
		f    func(float64) float64
	}{{"elem", f}, {"math", ref}} {
		b.Run(c.name, func(b *testing.B) {
			x := x0
			for b.Loop() {
				s := 0.0
				for i := range 50 {
					s += c.f(x + step*float64(i))
				}
				sink = s
				x = x0 + 1e-9*s // a dependence the compiler cannot hoist
			}
		})
	}
}

// BenchmarkExp and BenchmarkLog: the kernels against the math functions
// they replace, on arguments of the equations' range.
func BenchmarkExp(b *testing.B) { benchKernels(b, Exp, math.Exp, -0.5, -0.01) }
func BenchmarkLog(b *testing.B) { benchKernels(b, Log, math.Log, 0.5, 0.03) }

// BenchmarkCbrt and BenchmarkLog1p: on the range of the nonanalytic
// terms' |δ − 1| and of the Planck–Einstein terms' −e^(−θτ).
func BenchmarkCbrt(b *testing.B)  { benchKernels(b, Cbrt, math.Cbrt, 0.01, 0.02) }
func BenchmarkLog1p(b *testing.B) { benchKernels(b, Log1p, math.Log1p, -0.0078, 0.0001) }
