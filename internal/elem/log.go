package elem

import "math"

// Constants of the logarithm's argument reduction
//
//	x = 2^k · z,  z in [0.6875, 1.375),  z·(1/c) = 1 + r,
//	log(x) = k·ln2 + log(c) + log1p(r),
//
// where c is the centre of one of N = 128 intervals of z (its reciprocal
// and logarithm tabulated) and |r| ≤ 2^-7.
const (
	logBits = 7
	logN    = 1 << logBits
	// logOff is the bit pattern of 0.6875: x's bits less logOff give k
	// in the exponent field and the interval in the top mantissa bits.
	logOff = 0x3fe6000000000000
	// The positive normal doubles are bits in [logMinNorm, logInf).
	logMinNorm = 0x0010000000000000
	logInf     = 0x7ff0000000000000
)

// Log returns the natural logarithm of x.
//
// Method: x = 2^k·z with z in [0.6875, 1.375), split into 128 intervals
// by the top bits of its mantissa; c is the centre of z's interval (c = 1
// for the two intervals around 1, so that log x near 1 keeps its relative
// accuracy), and r = z·(1/c) − 1, |r| ≤ 2^-7, with the tabulated double
// 1/c and log c = −log(1/c) of that very double. The product z·(1/c) is
// split exactly into two doubles with a fused multiply-add, so that r is
// held in double-double precision, as are k·ln2 + log c (ln 2 and log c
// tabulated as two parts) and their sum with r; log1p(r) − r is the
// Taylor polynomial of degree 8, whose truncation error relative to the
// result is below 2^-59.
//
// Accuracy: about 0.51 ulp; within 1 ulp of math.Log.
//
// Special cases are those of math.Log, which computes them (with every
// zero, negative, subnormal, infinite or NaN argument):
//
//	Log(+Inf) = +Inf
//	Log(0) = -Inf
//	Log(x < 0) = NaN
//	Log(NaN) = NaN
func Log(x float64) float64 {
	ix := math.Float64bits(x)
	if ix-logMinNorm >= logInf-logMinNorm {
		return math.Log(x)
	}
	tmp := ix - logOff
	i := (tmp >> (52 - logBits)) & (logN - 1)
	k := float64(int64(tmp) >> 52)
	z := math.Float64frombits(ix - tmp&(0xfff<<52))
	e := &logTable[i]
	// r = z·(1/c) − 1 = rh + pl + (rounding error of r), each step
	// exact: pl by the fused multiply-add, p − 1 by Sterbenz's lemma
	// (q = z·(1/c) rounded is within 2^-7 of 1).
	q := z * e.invc
	pl := math.FMA(z, e.invc, -q)
	rh := q - 1
	r := rh + pl
	// k·ln2 + log c + r: the product k·ln2Hi is exact (ln2Hi has
	// trailing zeros), and every sum keeps its rounding error (Fast2Sum:
	// each first addend is zero or at least as large in magnitude as the
	// second; |log c| > |r| wherever c ≠ 1).
	el := rh - r + pl
	t := k * logLn2Hi
	w := t + e.logcHi
	ew := t - w + e.logcHi
	hi := w + r
	lo := w - hi + r + (ew + el) + (k*logLn2Lo + e.logcLo)
	return hi + (lo + log1pTail(r))
}

// log1pTail returns log1p(r) − r for |r| ≤ 2^-7: its Taylor polynomial of
// degree 8, whose truncation error relative to log1p(r) is below 2^-59.
func log1pTail(r float64) float64 {
	r2 := r * r
	r4 := r2 * r2
	return r2 * ((-1.0/2 + r*(1.0/3)) + r2*(-1.0/4+r*(1.0/5)) +
		r4*((-1.0/6+r*(1.0/7))+r2*(-1.0/8)))
}

// log1pSmall bounds the arguments of Log1p's fast path.
const log1pSmall = 0x1p-7

// Log1p returns ln(1 + x), accurate also where x is near zero.
//
// Method: for |x| ≤ 2^-7, x + (log1p(x) − x) with the Taylor polynomial
// of Log's last step (log1pTail); elsewhere math.Log1p. The fast path
// serves the Planck–Einstein terms ln(1 − e^(−θτ)) of the ideal-gas
// parts, whose e^(−θτ) is below 2^-7 wherever θτ > 4.86.
//
// Accuracy: about 0.51 ulp on the fast path (the polynomial's error is
// below 2^-8 of the result's ulp); math.Log1p's elsewhere.
//
// Special cases are those of math.Log1p, which computes them:
//
//	Log1p(±0) = ±0
//	Log1p(-1) = -Inf
//	Log1p(+Inf) = +Inf
//	Log1p(x < -1) = NaN
//	Log1p(NaN) = NaN
func Log1p(x float64) float64 {
	if !(math.Abs(x) <= log1pSmall) { // also NaN
		return math.Log1p(x)
	}
	return Log1pSmall(x)
}

// Log1pSmall is Log1p's fast path, for the callers that have checked
// |x| ≤ 2^-7 (it is inlined where Log1p is not); beyond that bound its
// result is not ln(1 + x).
func Log1pSmall(x float64) float64 { return x + log1pTail(x) }
