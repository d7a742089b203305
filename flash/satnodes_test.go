package flash

import (
	"math"
	"testing"
)

// TestSatNodesInterpolation proves the accuracy that HS's placement
// relies on, against the equation's own saturation at points between the
// nodes: the interpolated vapour pressure (lvStable decides by it beyond
// 1e-6 relative) within 1e-7; the interpolated saturated liquid's
// enthalpy below hermiteTop within 5e-7 of |h′| + RT, and within the
// per-interval error hErr the placement widens its margin by (ten times
// it) at the midpoints where hErr was measured, within twice hErr
// elsewhere in the interval.
func TestSatNodesInterpolation(t *testing.T) {
	t.Parallel()
	for _, f := range fluids(t) {
		n := satNodesFor(f)
		if n == nil {
			t.Fatalf("%s: no saturation nodes", f.Name())
		}
		if n.hermiteTop < n.last()/2 {
			t.Errorf("%s: hermiteTop %d of %d", f.Name(), n.hermiteTop, n.last())
		}
		worstP, worstH := 0.0, 0.0
		for i := 0; i+1 < n.last(); i++ {
			for _, x := range []float64{0.2, 0.5, 0.8} {
				T := n.T[i] + x*(n.T[i+1]-n.T[i])
				s, err := f.SaturationAtT(T)
				if err != nil {
					t.Fatal(err)
				}
				p, ok := n.vapourPressure(T)
				if !ok {
					t.Fatalf("%s: no vapour pressure at %v K", f.Name(), T)
				}
				worstP = max(worstP, math.Abs(p/s.P-1))
				if i+1 >= n.hermiteTop {
					continue
				}
				ls, lh := n.liquidLine(i, T)
				d := math.Abs(lh - s.Liquid.H)
				worstH = max(worstH, d/(math.Abs(s.Liquid.H)+f.GasConstant()*T))
				if d > 2*n.hErr[i]+1e-9*(math.Abs(s.Liquid.H)+f.GasConstant()*T) {
					t.Errorf("%s: h' at %v K off by %v, the interval's measured error %v", f.Name(), T, d, n.hErr[i])
				}
				if Tl := n.liquidT(i, ls); math.Abs(Tl-T) > 1e-9*T {
					t.Errorf("%s: liquidT(%v) = %v, want %v", f.Name(), ls, Tl, T)
				}
			}
		}
		if worstP > 1e-7 || worstH > 5e-7 {
			t.Errorf("%s: interpolation errors: p %v, h' %v", f.Name(), worstP, worstH)
		}
		t.Logf("%s: interpolation errors: vapour pressure %.2g, saturated liquid's h %.2g of |h|+RT", f.Name(), worstP, worstH)
	}
}
