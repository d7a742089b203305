package helmholtz

import "math"

// tauPowers evaluates the τ^t of a set of exponents with as few
// transcendental calls as the set allows. An exponent t = m + j/q, with m
// an integer in [minM, maxM] and q the common power-of-two denominator of
// all exponents (at most maxRootQ), is T[m]·R[j], where T holds integer
// powers of τ by multiplication and R the powers of τ^(1/q), which take
// log2(q) square roots. Other exponents fall back to exp(t ln τ).
type tauPowers struct {
	q, levels  int // denominator and log2 of it
	minM, maxM int
	generic    []float64
}

const (
	maxRootQ = 16
	minTauM  = -8
	maxTauM  = 71
)

// tauIndex locates one exponent: generic ≥ 0 is an index into generic,
// else τ^t = T[m]·R[j].
type tauIndex struct {
	m, j    int
	generic int
}

// newTauPowers chooses the denominator for exps and returns the index of
// each.
func newTauPowers(exps []float64) (tauPowers, []tauIndex) {
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
	tp.minM, tp.maxM = 0, 0
	idx := make([]tauIndex, len(exps))
	for i, t := range exps {
		if !fits(t, tp.q) {
			k := -1
			for g, e := range tp.generic {
				if e == t {
					k = g
				}
			}
			if k < 0 {
				tp.generic = append(tp.generic, t)
				k = len(tp.generic) - 1
			}
			idx[i] = tauIndex{generic: k}
			continue
		}
		m := int(math.Floor(t))
		j := int(math.Round((t - float64(m)) * float64(tp.q)))
		idx[i] = tauIndex{m: m, j: j, generic: -1}
		tp.minM = min(tp.minM, m)
		tp.maxM = max(tp.maxM, m)
	}
	return tp, idx
}

// tauTable holds the evaluated powers for one τ.
type tauTable struct {
	t [maxTauM - minTauM + 1]float64 // τ^m at index m − minTauM
	r [maxRootQ]float64              // τ^(j/q)
	g [maxNonInt]float64             // generic exponents
}

// fill evaluates the table at tau.
func (tp *tauPowers) fill(tb *tauTable, tau float64) {
	const z = -minTauM
	tb.t[z] = 1
	for m := 1; m <= tp.maxM; m++ {
		tb.t[z+m] = tb.t[z+m-1] * tau
	}
	if tp.minM < 0 {
		inv := 1 / tau
		for m := -1; m >= tp.minM; m-- {
			tb.t[z+m] = tb.t[z+m+1] * inv
		}
	}
	if tp.q > 1 {
		root := tau
		for range tp.levels {
			root = math.Sqrt(root)
		}
		tb.r[0] = 1
		for j := 1; j < tp.q; j++ {
			tb.r[j] = tb.r[j-1] * root
		}
	} else {
		tb.r[0] = 1
	}
	if len(tp.generic) > 0 {
		lt := math.Log(tau)
		for i, e := range tp.generic {
			tb.g[i] = math.Exp(e * lt)
		}
	}
}

// pow returns τ^t for the exponent at ix.
func (tb *tauTable) pow(ix tauIndex) float64 {
	if ix.generic >= 0 {
		return tb.g[ix.generic]
	}
	return tb.t[ix.m-minTauM] * tb.r[ix.j]
}
