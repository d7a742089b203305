package elem

import "math"

// Constants of the exponential's argument reduction
//
//	x = k·ln2/N + r,  |r| ≤ ln2/(2N),  N = 128,
//	exp(x) = 2^(k/N) · exp(r).
const (
	expBits = 7
	expN    = 1 << expBits
	// expInvLn2N is N/ln 2 rounded.
	expInvLn2N = expN / math.Ln2
	// expShift is 1.5·2^52: z + expShift rounds z to an integer held in
	// the low bits of the sum.
	expShift = 0x1.8p52
	// expMax bounds the arguments of the fast path: exp(±708) is a normal
	// number, well inside the double range.
	expMax = 708
)

// Exp returns e**x.
//
// Method: with k the integer nearest x·N/ln 2 (N = 128) and
// r = x − k·ln2/N, exp(x) = 2^(k/N)·exp(r). 2^(j/N), j = k mod N, comes
// from a table as a double H_j and its relative tail, 2^(floor(k/N)) is
// added to the exponent, and exp(r) − 1 is the Taylor polynomial of
// degree 5, whose truncation error is below r⁶/720 < 6e-19 for
// |r| ≤ ln2/256. ln2/N is split in two parts, the first with trailing zero
// bits, so that r is exact to within about 2^-70 (ln2/N's first part with 36
// significant bits, |k| < 2^17).
//
// Accuracy: about 0.51 ulp; within 1 ulp of math.Exp except where
// math.Exp errs by more than 1 ulp (see the package doc).
//
// Special cases are those of math.Exp, which computes them:
//
//	Exp(+Inf) = +Inf
//	Exp(NaN) = NaN
//	Exp(x) = 0 for x < −745.13..., subnormal down there from −708.39...
//	Exp(x) = +Inf for x > 709.78...
func Exp(x float64) float64 {
	if !(x <= expMax && x >= -expMax) { // also NaN
		if x < -750 {
			return 0 // far below the subnormal range (math.Exp alike)
		}
		return math.Exp(x)
	}
	z := expInvLn2N * x
	kd := z + expShift
	ki := math.Float64bits(kd)
	kd -= expShift
	r := x - kd*expLn2HiN - kd*expLn2LoN
	j := ki & (expN - 1)
	// ki<<45 puts k mod N into the mantissa bits the table entry has had
	// subtracted, and floor(k/N) into the exponent field.
	sbits := expTable[j].bits + ki<<(52-expBits)
	tail := expTable[j].tail
	r2 := r * r
	tmp := tail + r + r2*(0.5+r*(1.0/6)) + r2*r2*(1.0/24+r*(1.0/120))
	scale := math.Float64frombits(sbits)
	return scale + scale*tmp
}
