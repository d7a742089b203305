package elem

import (
	"math"
	"math/big"
)

// Reference values in high precision (math/big), for the tables and the
// accuracy tests. prec bits are far more than a double needs.
const prec = 256

func newBig(x float64) *big.Float { return new(big.Float).SetPrec(prec).SetFloat64(x) }

// bigAtanhSeries returns 2·atanh(u) = 2(u + u³/3 + u⁵/5 + …) for |u| < 1/2.
func bigAtanhSeries(u *big.Float) *big.Float {
	u2 := new(big.Float).SetPrec(prec).Mul(u, u)
	term := new(big.Float).SetPrec(prec).Set(u)
	sum := new(big.Float).SetPrec(prec).Set(u)
	eps := new(big.Float).SetPrec(prec).SetMantExp(big.NewFloat(1), -prec-8)
	for n := int64(3); ; n += 2 {
		term.Mul(term, u2)
		q := new(big.Float).SetPrec(prec).Quo(term, new(big.Float).SetPrec(prec).SetInt64(n))
		sum.Add(sum, q)
		if new(big.Float).Abs(q).Cmp(eps) < 0 {
			break
		}
	}
	return sum.Mul(sum, big.NewFloat(2))
}

// bigLn2 is ln 2 = 2·atanh(1/3).
func bigLn2() *big.Float {
	third := new(big.Float).SetPrec(prec).Quo(newBig(1), newBig(3))
	return bigAtanhSeries(third)
}

// bigLog returns ln x for x > 0: x = m·2^e, m in [1/√2, √2),
// ln x = e·ln2 + 2·atanh((m−1)/(m+1)).
func bigLog(x *big.Float) *big.Float {
	m := new(big.Float).SetPrec(prec)
	e := x.MantExp(m) // m in [0.5, 1)
	if m.Cmp(big.NewFloat(math.Sqrt2/2)) < 0 {
		m.SetMantExp(m, 1)
		e--
	}
	num := new(big.Float).SetPrec(prec).Sub(m, newBig(1))
	den := new(big.Float).SetPrec(prec).Add(m, newBig(1))
	s := bigAtanhSeries(num.Quo(num, den))
	k := new(big.Float).SetPrec(prec).SetInt64(int64(e))
	return s.Add(s, k.Mul(k, bigLn2()))
}

// bigExp returns e^x: x = k·ln2 + r, |r| ≤ ln2/2, e^r by its Taylor series.
func bigExp(x float64) *big.Float {
	ln2 := bigLn2()
	k := math.Round(x / math.Ln2)
	r := newBig(x)
	r.Sub(r, new(big.Float).SetPrec(prec).Mul(newBig(k), ln2))
	sum := newBig(1)
	term := newBig(1)
	eps := new(big.Float).SetPrec(prec).SetMantExp(big.NewFloat(1), -prec-8)
	for n := int64(1); ; n++ {
		term.Mul(term, r)
		term.Quo(term, new(big.Float).SetPrec(prec).SetInt64(n))
		sum.Add(sum, term)
		if new(big.Float).Abs(term).Cmp(eps) < 0 {
			break
		}
	}
	return sum.SetMantExp(sum, int(k))
}

// bigExp2Frac returns 2^(j/n) for n a power of two: n-th root of 2^j by
// repeated square roots.
func bigExp2Frac(j, n int) *big.Float {
	v := new(big.Float).SetPrec(prec).SetMantExp(newBig(1), j)
	for ; n > 1; n /= 2 {
		v.Sqrt(v)
	}
	return v
}

// ulpErr returns (got − exact)/ulp(exact), ulp of the double nearest
// exact (for a normal result).
func ulpErr(got float64, exact *big.Float) float64 {
	ef, _ := exact.Float64()
	ulp := math.Nextafter(math.Abs(ef), math.Inf(1)) - math.Abs(ef)
	if ef != 0 {
		// The ulp below a power of two is half the one above.
		if m, _ := math.Frexp(math.Abs(ef)); m == 0.5 {
			d := new(big.Float).SetPrec(prec).Sub(newBig(math.Abs(ef)), new(big.Float).Abs(exact))
			if d.Sign() > 0 {
				ulp /= 2
			}
		}
	}
	d := new(big.Float).SetPrec(prec).Sub(newBig(got), exact)
	q, _ := d.Float64()
	return q / ulp
}

// bigCbrt returns the cube root of v > 0: Newton's iteration
// y ← y − (y³ − v)/(3y²) from math.Cbrt's double, each step doubling the
// correct bits (53 → 106 → 212 → 424 > prec).
func bigCbrt(v *big.Float) *big.Float {
	f, _ := v.Float64()
	y := newBig(math.Cbrt(f))
	for range 3 {
		y3 := new(big.Float).SetPrec(prec).Mul(y, y)
		d := new(big.Float).SetPrec(prec).Mul(y3, newBig(3))
		y3.Mul(y3, y)
		y3.Sub(y3, v)
		y.Sub(y, y3.Quo(y3, d))
	}
	return y
}

// bigLog1p returns ln(1 + x) for x > −1, 1 + x held exactly.
func bigLog1p(x float64) *big.Float {
	if !(x > -1) || math.IsInf(x, 1) {
		return newBig(math.Log1p(x))
	}
	v := new(big.Float).SetPrec(prec).Add(newBig(1), newBig(x))
	if x == 0 {
		return v.SetFloat64(0)
	}
	return bigLog(v)
}
