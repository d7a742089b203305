package table

import "math"

// ln returns the natural logarithm of x, a positive normal float64, as
// the coordinate of the tables in ln p and ln ρ: from the exponent of x,
// a table of 256 logarithms over the leading bits of its significand and
// a polynomial of the rest, without the division of math.Log (the first
// step of every flash waits for it). Accuracy: within 2 units in the last place of
// ln x and 3e-16 (tested against math.Log), smooth within each of the
// table's intervals; the tables are built and read with the same
// function, so that a node lies exactly at its coordinate. Not for zero,
// negative, subnormal or non-finite x (the flashes check their range
// first).
//
// Method: x = 2^e·m with 1 ≤ m < 2, m = c_j·(1 + r) with c_j the middle
// of the j-th of 256 equal intervals of [1, 2) and |r| < 1/512, so
//
//	ln x = e·ln 2 + ln c_j + ln(1 + r),  ln(1 + r) = r − r²/2 + r³/3 − r⁴/4 + r⁵/5 + O(r⁶/6 < 1e-17).
func ln(x float64) float64 {
	b := math.Float64bits(x)
	e := float64(int(b>>52&0x7ff) - 1023)
	t := &lnTable[b>>44&0xff]
	m := math.Float64frombits(b&(1<<52-1) | 1023<<52)
	r := m*t[1] - 1
	r2 := r * r
	q := r - r2*(0.5-r*(1.0/3-r*(0.25-r*0.2)))
	return e*ln2Hi + (t[0] + (q + e*ln2Lo))
}

// ln 2 in two parts, the first with trailing zero bits so that e·ln2Hi is
// exact for every exponent e.
const (
	ln2Hi = 6.93147180369123816490e-01 // 0x3fe62e42fee00000
	ln2Lo = 1.90821492927058770002e-10 // 0x3dea39ef35793c76
)

// lnTable holds ln c_j and 1/c_j, c_j = 1 + (j + ½)/256; computed once at
// initialisation and read only after.
var lnTable = func() (t [256][2]float64) {
	for j := range t {
		c := 1 + (float64(j)+0.5)/256
		t[j] = [2]float64{math.Log(c), 1 / c}
	}
	return t
}()
