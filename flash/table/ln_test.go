package table

import (
	"math"
	"math/rand/v2"
	"testing"
)

// TestLn checks ln against math.Log over the pressures and densities the
// tables take (1e-3 to 1e12) and at the edges of its intervals: within 2
// units in the last place and 3e-16 (near x = 1, where ln x is small).
func TestLn(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(1, 1))
	check := func(x float64) {
		w := math.Log(x)
		if d := math.Abs(ln(x) - w); d > 3e-16+2*(math.Nextafter(math.Abs(w), 100)-math.Abs(w)) {
			t.Fatalf("ln(%v) = %v, math.Log %v", x, ln(x), math.Log(x))
		}
	}
	for i := 0; i < 200000; i++ {
		check(math.Exp(-7 + 35*rng.Float64()))
	}
	for j := 0; j <= 256; j++ {
		m := 1 + float64(j)/256
		for _, x := range []float64{m, math.Nextafter(m, 0), math.Nextafter(m, 3)} {
			check(x * 1024)
		}
	}
}
