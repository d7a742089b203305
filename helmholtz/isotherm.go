package helmholtz

import (
	"math"

	"github.com/tripoint-thermo/tripoint/internal/elem"
)

// DeltaDerivs holds αʳ and its first two δ-derivatives at one (δ, τ):
// what the pressure p = ρRT(1 + δαʳ_δ), its slope
// (∂p/∂ρ)_T = RT(1 + 2δαʳ_δ + δ²αʳ_δδ) and the Gibbs energy need.
type DeltaDerivs struct {
	A  float64 // αʳ
	D  float64 // ∂αʳ/∂δ
	DD float64 // ∂²αʳ/∂δ²
}

// Isotherm is a residual Helmholtz energy on one isotherm τ, for solvers
// that evaluate it again and again at one temperature (densities at
// (T, p), phase equilibria at T). At fixed τ every term
// n δ^d τ^t exp(−δ^c) is a constant times δ^d exp(−δ^c), so the terms of
// one (d, c) merge into one coefficient; the τ-factors of the Gaussian
// terms, exp(−β(τ−γ)²), and of the nonanalytic ones, exp(−D(τ−1)²), are
// constants too. Isotherm holds those constants; its Eval costs the
// δ-dependent part only: the exponentials exp(−δ^c), one per distinct
// (α, ε) of the Gaussian terms, and the nonanalytic terms' power,
// logarithm and exponentials.
//
// An Isotherm is a plain value (no allocation), valid as long as the
// Residual it came from; safe for concurrent use.
type Isotherm struct {
	r    *Residual
	tau  float64
	ta   [maxDGroups]float64     // Σ n τ^t of each (d, c) group
	gt   [maxGauss]float64       // n τ^t exp(−β(τ−γ)²) of each Gaussian term
	psiT [maxNonAnalytic]float64 // exp(−D(τ−1)²) of each nonanalytic term
}

// Isotherm returns r on the isotherm τ > 0.
func (r *Residual) Isotherm(tau float64) (it Isotherm) {
	it.Set(r, tau)
	return it
}

// Set makes it r on the isotherm τ > 0, in place (an Isotherm is large
// enough for the copy to count).
func (it *Isotherm) Set(r *Residual, tau float64) {
	it.r, it.tau = r, tau
	if r.kernel.Delta != nil {
		return // the kernel evaluates at (δ, τ)
	}
	var tv [maxSlots]float64
	r.tp.eval(&tv, tau)
	if len(r.gauss) > 0 {
		r.gtp.eval(&tv, tau)
	}
	// The terms come group by group: Σ n τ^t of each (d, c) group.
	clear(it.ta[:len(r.dgroups)])
	for i := range r.terms {
		p := &r.terms[i]
		it.ta[p.g&(maxDGroups-1)] += p.n * tv[p.k&(maxSlots-1)]
	}
	for i := range r.gauss {
		g := &r.gauss[i]
		tt := tau - g.Gamma
		it.gt[i&(maxGauss-1)] = g.N * tv[g.kt&(maxSlots-1)] * elem.Exp(-g.Beta*tt*tt)
	}
	y := tau - 1
	for i := range r.na {
		it.psiT[i&(maxNonAnalytic-1)] = elem.Exp(-r.na[i].D * y * y)
	}
}

// Tau returns the isotherm's τ.
func (it *Isotherm) Tau() float64 { return it.tau }

// Eval returns αʳ, ∂αʳ/∂δ and ∂²αʳ/∂δ² at (δ, τ) for δ > 0.
//
// Accuracy: Eval agrees with Residual.Eval to rounding (it merges the
// terms of one (d, c) first, and factors the exponentials of the Gaussian
// and nonanalytic terms into a δ and a τ part): both are within 8 ulp of a
// plain term-by-term evaluation, relative to the magnitude of the terms
// weighted by their condition (TestResidualReference).
//
// Special cases are those of Residual.Eval: at δ = τ = 1 exactly the
// nonanalytic contributions are their limits, 0.
func (it *Isotherm) Eval(delta float64) DeltaDerivs {
	r := it.r
	if r.kernel.Delta != nil {
		return r.kernel.Delta(delta, it.tau)
	}
	var dv [maxSlots]float64 // slots of δ only
	r.dp.eval(&dv, delta)
	if len(r.gauss) > 0 {
		r.gdp.eval(&dv, delta)
	}
	var a, d1, d2 float64
	for ci := range r.cgroups {
		cg := &r.cgroups[ci]
		s0, s1, s2 := isoSums(it.ta[cg.lo:cg.hi], r.dgroups[cg.lo:cg.hi], &dv)
		if cg.c == 0 {
			a += s0
			d1 += s1
			d2 += s2
			continue
		}
		u := dv[cg.k&(maxSlots-1)]
		ga, g1, g2 := expGroup(cg.fc, cg.fc*u, elem.Exp(-u), s0, s1, s2)
		a += ga
		d1 += g1
		d2 += g2
	}
	var ed float64
	for i := range r.gauss {
		g := &r.gauss[i]
		dd := delta - g.Epsilon
		if !g.sameDelta {
			ed = elem.Exp(-g.Alpha * dd * dd)
		}
		v := it.gt[i&(maxGauss-1)] * dv[g.kd&(maxSlots-1)] * ed
		q1, q2, _, _ := g.deltaFactors(delta, dd)
		a += v
		d1 += v * q1
		d2 += v * q2
	}
	id := 1 / delta
	out := DeltaDerivs{A: a, D: d1 * id, DD: d2 * id * id}
	if len(r.na) > 0 {
		na, nd, ndd := it.nonAnalytic(delta)
		out.A += na
		out.D += nd
		out.DD += ndd
	}
	return out
}

// isoSums returns the sums over the (d, c) groups gs with the
// coefficients ta = Σ n τ^t of v = ta δ^d, v d and v d(d−1), with the
// powers of δ from the slots dv. (A function of its own, so that its loop
// keeps the sums in registers.)
func isoSums(ta []float64, gs []dGroup, dv *[maxSlots]float64) (s0, s1, s2 float64) {
	gs = gs[:len(ta)]
	for i, a := range ta {
		g := &gs[i]
		u := a * dv[g.k&(maxSlots-1)]
		s0 += u
		s1 += u * g.fd
		s2 += u * g.w2
	}
	return s0, s1, s2
}

// nonAnalytic returns the nonanalytic terms and their first two
// δ-derivatives on the isotherm (see Residual.evalNonAnalytic).
func (it *Isotherm) nonAnalytic(delta float64) (a, d, dd float64) {
	x := delta - 1
	ax := math.Abs(x)
	sx := 1.0
	if x < 0 {
		sx = -1
	}
	y := it.tau - 1
	var w naPowers
	var sh naShape
	var e naF
	var psi float64
	for i := range it.r.na {
		q := &it.r.na[i]
		w.update(q, ax, 1/ax)
		if q.newShape {
			sh.set(q, &w, y, sx, false)
		}
		if q.newPsi {
			psi = elem.Exp(-q.C*x*x) * it.psiT[i&(maxNonAnalytic-1)]
		}
		e.set(q, &sh)
		ta, td, tdd, _, _ := naSum(q, delta, x, &e, psi)
		a += ta
		d += td
		dd += tdd
	}
	return a, d, dd
}
