package elem

import "math"

// Constants of the cube root's argument reduction
//
//	x = 2^(3q+j) · m,  m in [1, 2),  j in {0, 1, 2},  m·invc = 1 + r,
//	∛x = 2^q · ∛(2^j/invc) · ∛(1 + r),
//
// where invc is the reciprocal of the centre of one of N = 64 intervals
// of m (tabulated with ∛(2^j/invc) for each j) and |r| ≤ 2^-7.
const (
	cbrtBits = 6
	cbrtN    = 1 << cbrtBits
	// cbrtBias is 3·342, added to x's unbiased exponent e to make it
	// positive (e ≥ −1022) before the division by 3: e + 1026 =
	// biased exponent + 3.
	cbrtBias = 342
)

// Cbrt returns the cube root of x.
//
// Method: x = 2^(3q+j)·m with m in [1, 2), split into 64 intervals by the
// top bits of its mantissa; with invc the tabulated double nearest the
// reciprocal of the interval's centre, r = m·invc − 1 (one rounding, by a
// fused multiply-add), |r| ≤ 2^-7, and ∛x = 2^q·∛(2^j/invc)·∛(1+r).
// ∛(2^j/invc) is tabulated as two doubles hi + lo, ∛(1+r) − 1 is the
// Taylor polynomial of degree 7, whose truncation error is below 2^-61,
// and the result is hi + (hi·(∛(1+r) − 1) + lo), scaled by 2^q exactly.
// No division: several times faster than math.Cbrt, whose Newton steps
// divide.
//
// Accuracy: about 0.51 ulp; within 1 ulp of math.Cbrt.
//
// Special cases are those of math.Cbrt, which computes them (with every
// zero, subnormal, infinite or NaN argument):
//
//	Cbrt(±0) = ±0
//	Cbrt(±Inf) = ±Inf
//	Cbrt(NaN) = NaN
func Cbrt(x float64) float64 {
	ix := math.Float64bits(x)
	sign := ix & (1 << 63)
	ix &^= 1 << 63
	if ix-logMinNorm >= logInf-logMinNorm {
		return math.Cbrt(x)
	}
	// e + 1026 = 3(q + 342) + j, in [4, 2049].
	ep := uint(ix>>52) + 3
	qp := ep / 3
	j := ep - 3*qp
	i := (ix >> (52 - cbrtBits)) & (cbrtN - 1)
	m := math.Float64frombits(ix&(1<<52-1) | 0x3ff<<52)
	e := &cbrtTable[j*cbrtN+uint(i)]
	r := math.FMA(m, e.invc, -1)
	r2 := r * r
	r4 := r2 * r2
	s := r * ((1.0/3 - r*(1.0/9)) + r2*(5.0/81-r*(10.0/243)) +
		r4*((22.0/729-r*(154.0/6561))+r2*(374.0/19683)))
	v := e.hi + math.FMA(e.hi, s, e.lo)
	// 2^q with q in [−341, 341]: a normal double, so the product is
	// exact.
	return v * math.Float64frombits(sign|uint64(qp-cbrtBias+1023)<<52)
}
