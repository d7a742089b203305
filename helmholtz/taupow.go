package helmholtz

import "math"

// tauPowers evaluates the τ^t of a set of exponents with as few
// transcendental calls as the set allows. An exponent t = m + j/q, with m
// an integer in [minTauM, maxTauM] and q the common power-of-two
// denominator of all exponents (at most maxRootQ), is τ^m·(τ^(1/q))^j: τ^m
// by multiplication from two short tables, τ^(1/q) from log2(q) square
// roots. Other exponents fall back to exp(t ln τ). Each distinct exponent
// is evaluated once per call.
type tauPowers struct {
	q, levels int // denominator and log2 of it
	maxM      int // largest m in use (≥ 0)
	minM      int // smallest m in use (≤ 0)
	dist      []tauExp
}

// tauExp is one distinct exponent: t = m + j/q, or generic.
type tauExp struct {
	t       float64
	m, j    int
	generic bool
}

const (
	maxRootQ  = 16
	minTauM   = -8
	maxTauM   = 79
	maxTauDst = 64 // largest number of distinct exponents
)

// newTauPowers chooses the denominator for exps and returns, for each,
// the index of its distinct exponent.
func newTauPowers(exps []float64) (tauPowers, []int, bool) {
	tp := tauPowers{q: 1}
	fits := func(t float64, q int) bool {
		x := t * float64(q)
		return x == math.Trunc(x) && math.Floor(t) >= minTauM && math.Floor(t) <= maxTauM
	}
	// The smallest power-of-two q that fits every representable exponent.
	for q := 1; q <= maxRootQ; q *= 2 {
		ok := true
		for _, t := range exps {
			if fits(t, maxRootQ) && !fits(t, q) {
				ok = false
				break
			}
		}
		if ok {
			tp.q = q
			break
		}
	}
	for l := tp.q; l > 1; l /= 2 {
		tp.levels++
	}
	idx := make([]int, len(exps))
	for i, t := range exps {
		k := -1
		for d, e := range tp.dist {
			if e.t == t {
				k = d
			}
		}
		if k < 0 {
			e := tauExp{t: t, generic: true}
			if fits(t, tp.q) {
				m := int(math.Floor(t))
				e = tauExp{t: t, m: m, j: int(math.Round((t - float64(m)) * float64(tp.q)))}
				tp.maxM = max(tp.maxM, m)
				tp.minM = min(tp.minM, m)
			}
			tp.dist = append(tp.dist, e)
			k = len(tp.dist) - 1
		}
		idx[i] = k
	}
	return tp, idx, len(tp.dist) <= maxTauDst
}

// fill sets val[k] = τ^t for every distinct exponent k.
func (tp *tauPowers) fill(val *[maxTauDst]float64, tau float64) {
	// base[i] holds τ^(i+minTauM) for the m in use, from a chain of
	// multiplications up and down from τ^0; r[j] = τ^(j/q).
	var base [maxTauM - minTauM + 1]float64
	var r [maxRootQ]float64
	const z = -minTauM
	base[z] = 1
	for m := 1; m <= tp.maxM; m++ {
		base[z+m] = base[z+m-1] * tau
	}
	if tp.minM < 0 {
		inv := 1 / tau
		for m := -1; m >= tp.minM; m-- {
			base[z+m] = base[z+m+1] * inv
		}
	}
	r[0] = 1
	if tp.q > 1 {
		root := tau
		for range tp.levels {
			root = math.Sqrt(root)
		}
		for j := 1; j < tp.q; j++ {
			r[j] = r[j-1] * root
		}
	}
	lt := 0.0
	haveLog := false
	for k := range tp.dist {
		e := &tp.dist[k]
		if e.generic {
			if !haveLog {
				lt, haveLog = math.Log(tau), true
			}
			val[k] = math.Exp(e.t * lt)
			continue
		}
		val[k] = base[z+e.m] * r[e.j]
	}
}
