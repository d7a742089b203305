package helmholtz

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"sort"

	"github.com/tripoint-thermo/tripoint/internal/elem"
)

// Power is the residual term n δ^d τ^t.
type Power struct {
	N float64 // coefficient n
	D int     // density exponent d ≥ 1
	T float64 // temperature exponent t
}

// Exponential is the residual term n δ^d τ^t exp(−δ^c).
type Exponential struct {
	N float64 // coefficient n
	D int     // density exponent d ≥ 1
	T float64 // temperature exponent t
	C int     // exponent c ≥ 1 inside exp(−δ^c)
}

// Gaussian is the bell-shaped residual term
//
//	n δ^d τ^t exp(−α(δ−ε)² − β(τ−γ)²).
type Gaussian struct {
	N       float64 // coefficient n
	D       int     // density exponent d ≥ 1
	T       float64 // temperature exponent t
	Alpha   float64 // α
	Beta    float64 // β
	Gamma   float64 // γ
	Epsilon float64 // ε
}

// NonAnalytic is the critical-region term of IAPWS-95 and Span–Wagner,
//
//	n Δ^b δ ψ,
//	Δ = θ² + B[(δ−1)²]^a,
//	θ = (1−τ) + A[(δ−1)²]^(1/(2β)),
//	ψ = exp(−C(δ−1)² − D(τ−1)²).
//
// The fields keep the publications' letters; the two lower-case exponents a
// and b are SmallA and SmallB. The third δ-derivative stays finite at δ = 1
// only for 2a > 3 and 1/β > 3, which NewResidual checks.
type NonAnalytic struct {
	N      float64 // coefficient n
	SmallA float64 // a: exponent of (δ−1)² in Δ
	SmallB float64 // b: exponent of Δ, 0.5 < b < 1
	A      float64 // A
	B      float64 // B
	C      float64 // C
	D      float64 // D
	Beta   float64 // β
}

// ResidualTerms lists the terms of a residual Helmholtz energy αʳ(δ, τ).
type ResidualTerms struct {
	Power       []Power
	Exponential []Exponential
	Gaussian    []Gaussian
	NonAnalytic []NonAnalytic
}

// Limits of the structures a Residual evaluates with.
const (
	maxDeltaPow = 23 // largest δ exponent d or c
	maxExpC     = 8  // c of exp(−δ^c) is at most maxExpC−1
	// maxDGroups bounds the groups of polynomial and exponential terms of
	// one (d, c), maxGauss the Gaussian and maxNonAnalytic the
	// nonanalytic terms: an Isotherm holds their τ-dependent factors in
	// arrays of these sizes.
	maxDGroups     = 64
	maxGauss       = 16
	maxNonAnalytic = 8
)

// cGroup is the set of terms of one c, which share the factor exp(−δ^c)
// (none for c = 0, the Power terms).
type cGroup struct {
	c        int
	fc       float64
	k        uint8 // slot of δ^c
	lo, hi   int32 // dgroups[lo:hi]
	flo, fhi int32 // full[flo:fhi]
}

// fullTerm is one Power or Exponential term with the constants its
// derivative sums need.
type fullTerm struct {
	n          float64
	fd, w2, w3 float64 // d, d(d−1), d(d−1)(d−2)
	t, tt1, td float64 // t, t(t−1), t·d
	kt, kd     uint8   // slots of τ^t and δ^d
}

// dGroup is the set of terms of one (d, c), which share δ^d exp(−δ^c):
// their sum is Σ n τ^t times that factor.
type dGroup struct {
	fd, w2 float64 // d, d(d−1)
	k      uint8   // slot of δ^d
}

// polyTerm is the τ-dependent part n τ^t of one Power or Exponential
// term, for an Isotherm.
type polyTerm struct {
	n float64
	k uint8 // slot of τ^t
	g uint8 // index of its (d, c) group
}

// gaussTerm is one Gaussian term with its slots and sharing.
type gaussTerm struct {
	Gaussian
	fd     float64
	kd, kt uint8 // slots of δ^d and τ^t
	// same: α, ε, β, γ are those of the previous term, whose exponential
	// it shares; sameDelta: α and ε are (on an isotherm the δ factor is
	// shared).
	same, sameDelta bool
}

// Residual is a compiled residual Helmholtz energy αʳ(δ, τ). It is
// immutable and safe for concurrent use. The zero value is αʳ ≡ 0.
//
// Evaluation groups the polynomial and exponential terms by c (and, on an
// Isotherm, by d), so that each exp(−δ^c) is computed once; takes the
// powers of δ and τ by
// multiplication from short chains (the non-integer powers of τ from
// square roots of τ, where the exponents share a power-of-two
// denominator); shares the exponential of consecutive Gaussian terms with
// the same parameters; and shares |δ−1|^(1/β), the distance function Δ and
// its logarithm between nonanalytic terms of the same shape. The
// exponentials and logarithms are those of internal/elem. With a Kernel
// (WithKernel), EvalSecond is the kernel.
type Residual struct {
	cgroups  []cGroup
	full     []fullTerm // by c, for Eval
	dgroups  []dGroup   // by c and d, for Isotherm
	terms    []polyTerm
	tp, dp   powPlan // powers of τ and of δ of the power and exponential terms
	gtp, gdp powPlan // powers of τ and of δ of the Gaussian terms
	gauss    []gaussTerm
	na       []naTerm
	kernel   Kernel // zero: the tables
	// terms as given, for DeltaLimits and the kernel's fingerprint.
	src ResidualTerms
}

// NewResidual compiles the terms t. It returns an error if a term has an
// exponent outside the ranges stated on the term types or a non-finite
// parameter, or if there are more terms than an Isotherm holds (64 groups
// of one (d, c), 16 Gaussian and 8 nonanalytic terms).
func NewResidual(t ResidualTerms) (*Residual, error) {
	all, err := rawTerms(t)
	if err != nil {
		return nil, err
	}
	texps, dexps := polyExponents(all)
	for _, p := range all {
		if !finite(p.n, p.t) || p.d < 1 || p.d > maxDeltaPow || p.c < 0 || p.c >= maxExpC {
			return nil, fmt.Errorf("helmholtz: term n=%g d=%d t=%g c=%d out of range", p.n, p.d, p.t, p.c)
		}
	}
	var gtexps, gdexps []float64
	for _, g := range t.Gaussian {
		if !finite(g.N, g.T, g.Alpha, g.Beta, g.Gamma, g.Epsilon) || g.D < 1 || g.D > maxDeltaPow {
			return nil, fmt.Errorf("helmholtz: Gaussian term %+v out of range", g)
		}
		gtexps = append(gtexps, g.T)
		gdexps = append(gdexps, float64(g.D))
	}
	for _, q := range t.NonAnalytic {
		if !finite(q.N, q.SmallA, q.SmallB, q.A, q.B, q.C, q.D, q.Beta) ||
			q.SmallA <= 1.5 || q.Beta <= 0 || 1/q.Beta <= 3 || q.SmallB <= 0.5 || q.SmallB >= 1 {
			return nil, fmt.Errorf("helmholtz: nonanalytic term %+v out of range", q)
		}
	}
	if len(t.Gaussian) > maxGauss || len(t.NonAnalytic) > maxNonAnalytic {
		return nil, fmt.Errorf("helmholtz: %d Gaussian and %d nonanalytic terms, at most %d and %d",
			len(t.Gaussian), len(t.NonAnalytic), maxGauss, maxNonAnalytic)
	}
	r := &Residual{}
	var tslot, dslot, gtslot, gdslot []int
	var ok1, ok2, ok3, ok4 bool
	r.tp, tslot, ok1 = newPowPlan(texps, 0)
	r.dp, dslot, ok2 = newPowPlan(dexps, r.tp.next)
	r.gtp, gtslot, ok3 = newPowPlan(gtexps, r.dp.next)
	r.gdp, gdslot, ok4 = newPowPlan(gdexps, r.gtp.next)
	if !ok1 || !ok2 || !ok3 || !ok4 {
		return nil, errors.New("helmholtz: too many distinct powers of tau or delta")
	}
	for _, i := range termOrder(all) {
		p := all[i]
		if n := len(r.cgroups); n == 0 || r.cgroups[n-1].c != p.c {
			nd := int32(len(r.dgroups))
			nf := int32(len(r.full))
			r.cgroups = append(r.cgroups, cGroup{c: p.c, fc: float64(p.c), k: uint8(dslot[2*i+1]),
				lo: nd, hi: nd, flo: nf, fhi: nf})
		}
		cg := &r.cgroups[len(r.cgroups)-1]
		fd := float64(p.d)
		r.full = append(r.full, fullTerm{n: p.n, fd: fd, w2: fd * (fd - 1), w3: fd * (fd - 1) * (fd - 2),
			t: p.t, tt1: p.t * (p.t - 1), td: p.t * fd, kt: uint8(tslot[i]), kd: uint8(dslot[2*i])})
		cg.fhi++
		if cg.hi == cg.lo || r.dgroups[cg.hi-1].fd != fd {
			r.dgroups = append(r.dgroups, dGroup{fd: fd, w2: fd * (fd - 1), k: uint8(dslot[2*i])})
			cg.hi++
		}
		r.terms = append(r.terms, polyTerm{n: p.n, k: uint8(tslot[i]), g: uint8(len(r.dgroups) - 1)})
	}
	if len(r.dgroups) > maxDGroups {
		return nil, fmt.Errorf("helmholtz: %d groups of terms of one (d, c), at most %d", len(r.dgroups), maxDGroups)
	}
	for i, g := range t.Gaussian {
		gt := gaussTerm{Gaussian: g, fd: float64(g.D), kd: uint8(gdslot[i]), kt: uint8(gtslot[i])}
		if i > 0 {
			p := t.Gaussian[i-1]
			gt.sameDelta = g.Alpha == p.Alpha && g.Epsilon == p.Epsilon
			gt.same = gt.sameDelta && g.Beta == p.Beta && g.Gamma == p.Gamma
		}
		r.gauss = append(r.gauss, gt)
	}
	r.na = compileNonAnalytic(t.NonAnalytic)
	r.src = ResidualTerms{
		Power:       slices.Clone(t.Power),
		Exponential: slices.Clone(t.Exponential),
		Gaussian:    slices.Clone(t.Gaussian),
		NonAnalytic: slices.Clone(t.NonAnalytic),
	}
	return r, nil
}

// rawTerm is a power (c = 0) or exponential term.
type rawTerm struct {
	n, t float64
	d, c int
}

// rawTerms returns the power and exponential terms of t in the order
// given.
func rawTerms(t ResidualTerms) ([]rawTerm, error) {
	var all []rawTerm
	for _, p := range t.Power {
		all = append(all, rawTerm{p.N, p.T, p.D, 0})
	}
	for _, e := range t.Exponential {
		if e.C < 1 {
			return nil, fmt.Errorf("helmholtz: exponential term with c=%d < 1", e.C)
		}
		all = append(all, rawTerm{e.N, e.T, e.D, e.C})
	}
	return all, nil
}

// polyExponents returns the exponents of τ of the terms, and of δ: d and
// c of each term in turn.
func polyExponents(all []rawTerm) (texps, dexps []float64) {
	for _, p := range all {
		texps = append(texps, p.t)
		dexps = append(dexps, float64(p.d), float64(p.c))
	}
	return texps, dexps
}

// termOrder returns the indices of the terms grouped by c, then by d,
// keeping the published order within a group.
func termOrder(all []rawTerm) []int {
	order := make([]int, len(all))
	for i := range order {
		order[i] = i
	}
	sort.SliceStable(order, func(a, b int) bool {
		pa, pb := all[order[a]], all[order[b]]
		return pa.c < pb.c || pa.c == pb.c && pa.d < pb.d
	})
	return order
}

// MustNewResidual is like NewResidual but panics on error. It is meant for
// package-level tables of published coefficients, which tests prove.
func MustNewResidual(t ResidualTerms) *Residual {
	r, err := NewResidual(t)
	if err != nil {
		panic(err)
	}
	return r
}

// HasNonAnalytic reports whether r has nonanalytic critical-region terms,
// which make ∂²αʳ/∂τ² infinite at δ = τ = 1.
func (r *Residual) HasNonAnalytic() bool { return len(r.na) > 0 }

// Eval returns αʳ and its derivatives at (δ, τ), for δ > 0 and τ > 0.
//
// Accuracy: within 8 ulp of a plain term-by-term evaluation with
// math.Pow and math.Exp, relative to the magnitude of the terms weighted
// by their condition (TestResidualReference).
//
// Special cases are:
//
//	At δ = τ = 1 exactly, with nonanalytic terms, TT = ±Inf (the sign of
//	the dominant term, the one with the smallest b) and every nonanalytic
//	contribution to the other derivatives is its limit, 0.
//
// The result for δ ≤ 0 or τ ≤ 0 is unspecified (NaN or ±Inf).
func (r *Residual) Eval(delta, tau float64) Derivs { return r.eval(delta, tau, true) }

// EvalSecond is Eval without the third δ-derivative (DDD is zero), which
// the properties at (T, ρ) do not need; with a kernel (WithKernel) it is
// the kernel. Its accuracy is Eval's.
func (r *Residual) EvalSecond(delta, tau float64) Derivs {
	if r.kernel.Second != nil {
		return r.kernel.Second(delta, tau)
	}
	return r.eval(delta, tau, false)
}

// eval sums the families of terms from the tables.
func (r *Residual) eval(delta, tau float64, third bool) Derivs {
	out := r.polyEval(delta, tau, third)
	if len(r.gauss) > 0 {
		out = out.Add(r.gaussEval(delta, tau, third))
	}
	if len(r.na) > 0 {
		out = out.Add(r.evalNonAnalytic(delta, tau, third))
	}
	return out
}

// polyEval returns the power and exponential terms and their derivatives
// (DDD when third is set).
//
// A term v = n δ^d τ^t exp(−δ^c) has, with e = c δ^c and y = d − e,
//
//	δ v_δ/v = y,  δ² v_δδ/v = y(y−1) − ce,
//	δ³ v_δδδ/v = y(y−1)(y−2) − 3ce(y−1) − c²e,
//
// which expand in powers of e with the falling factorials d, d(d−1) and
// d(d−1)(d−2) (expGroup and below): a group of one c needs only the sums
// of v times these, v t, v t(t−1) and v t d (polySums). The falling
// factorials vanish for the terms that do not contribute (d = 1 to the
// second, d ≤ 2 to the third derivative), so that at small δ the sums do
// not cancel.
func (r *Residual) polyEval(delta, tau float64, third bool) Derivs {
	// One array of slots holds the powers of τ and of δ.
	var pv [maxSlots]float64
	r.tp.eval(&pv, tau)
	r.dp.eval(&pv, delta)
	// Scaled sums: a, δα_δ, δ²α_δδ, δ³α_δδδ, τα_τ, τ²α_ττ, δτα_δτ.
	var a, d1, d2, d3, t1, t2, dt float64
	for ci := range r.cgroups {
		cg := &r.cgroups[ci]
		s0, s1, s2, s3, r1, r2, q := polySums(r.full[cg.flo:cg.fhi], &pv)
		if cg.c == 0 {
			a += s0
			d1 += s1
			d2 += s2
			d3 += s3
			t1 += r1
			t2 += r2
			dt += q
			continue
		}
		u := pv[cg.k&(maxSlots-1)]
		ex := elem.Exp(-u)
		e := cg.fc * u
		ga, g1, g2 := expGroup(cg.fc, e, ex, s0, s1, s2)
		a += ga
		d1 += g1
		d2 += g2
		if third {
			fc := cg.fc
			// Σ v (y(y−1)(y−2) − 3ce(y−1) − c²e), collected by sums so
			// that nothing cancels at small e.
			d3 += (s3 - 3*e*s2 + 3*e*((1-fc)+e)*s1 +
				e*(3*(fc-1)*e-(fc-1)*(fc-2)-e*e)*s0) * ex
		}
		r1, r2, q = r1*ex, r2*ex, q*ex
		t1 += r1
		t2 += r2
		dt += q - e*r1
	}
	if !third {
		d3 = 0
	}
	return scaled(delta, tau, a, d1, d2, d3, t1, t2, dt)
}

// scaled returns the derivatives from the scaled sums a, δα_δ, δ²α_δδ,
// δ³α_δδδ, τα_τ, τ²α_ττ and δτα_δτ.
func scaled(delta, tau, a, d1, d2, d3, t1, t2, dt float64) Derivs {
	id, it := 1/delta, 1/tau
	return Derivs{A: a, D: d1 * id, DD: d2 * id * id, DDD: d3 * id * id * id,
		T: t1 * it, TT: t2 * it * it, DT: dt * id * it}
}

// gaussEval returns the Gaussian terms and their derivatives (DDD when
// third is set).
func (r *Residual) gaussEval(delta, tau float64, third bool) Derivs {
	var pv [maxSlots]float64
	r.gtp.eval(&pv, tau)
	r.gdp.eval(&pv, delta)
	var a, d1, d2, d3, t1, t2, dt, eg float64
	for i := range r.gauss {
		g := &r.gauss[i]
		dd := delta - g.Epsilon
		tt := tau - g.Gamma
		if !g.same {
			eg = elem.Exp(-g.Alpha*dd*dd - g.Beta*tt*tt)
		}
		v := g.N * pv[g.kd&(maxSlots-1)] * pv[g.kt&(maxSlots-1)] * eg
		q1, q2, w, ad2 := g.deltaFactors(delta, dd)
		// τf_τ/f and τ²f_ττ/f for f = τ^t exp(−β(τ−γ)²), likewise.
		wt := -2 * g.Beta * tau * tt
		k1 := g.T + wt
		k2 := g.T*(g.T-1) + 2*g.T*wt + wt*wt - 2*g.Beta*tau*tau
		a += v
		d1 += v * q1
		d2 += v * q2
		if third {
			fd := g.fd
			d3 += v * (fd*(fd-1)*(fd-2) + 3*fd*(fd-1)*w + 3*fd*(w*w-ad2) + w*w*w - 3*ad2*w)
		}
		t1 += v * k1
		t2 += v * k2
		dt += v * q1 * k1
	}
	return scaled(delta, tau, a, d1, d2, d3, t1, t2, dt)
}

// polySums returns the sums over the terms v = n δ^d τ^t of ts of v,
// v d, v d(d−1), v d(d−1)(d−2), v t, v t(t−1) and v t d, with the powers
// of τ and δ from the slots pv. (A function of its own, so that its loop
// keeps the seven sums in registers.)
func polySums(ts []fullTerm, pv *[maxSlots]float64) (s0, s1, s2, s3, r1, r2, q float64) {
	for i := range ts {
		p := &ts[i]
		v := p.n * pv[p.kt&(maxSlots-1)] * pv[p.kd&(maxSlots-1)]
		s0 += v
		s1 += v * p.fd
		s2 += v * p.w2
		s3 += v * p.w3
		r1 += v * p.t
		r2 += v * p.tt1
		q += v * p.td
	}
	return s0, s1, s2, s3, r1, r2, q
}

// deltaFactors returns δf'/f and δ²f”/f for f = δ^d exp(−α(δ−ε)²), with
// w = −2αδ(δ−ε) and 2αδ², from which δ³f”'/f follows; dd = δ − ε. In
// falling factorials of d and powers of w:
//
//	δf'/f = d + w,  δ²f''/f = d(d−1) + 2dw + w² − 2αδ²,
//	δ³f'''/f = d(d−1)(d−2) + 3d(d−1)w + 3d(w² − 2αδ²) + w³ − 6αδ²w.
func (g *gaussTerm) deltaFactors(delta, dd float64) (q1, q2, w, ad2 float64) {
	ad2 = 2 * g.Alpha * delta * delta
	w = -2 * g.Alpha * delta * dd
	fd := g.fd
	return fd + w, fd*(fd-1) + 2*fd*w + w*w - ad2, w, ad2
}

// expGroup returns the scaled sums a, δα_δ and δ²α_δδ of a group of
// terms with the factor ex = exp(−δ^c), e = c δ^c, from the plain sums
// s0 = Σ n δ^d τ^t, s1 = Σ … d, s2 = Σ … d(d−1):
//
//	Σ v y = s1 − e s0,  Σ v (y(y−1) − ce) = s2 − 2e s1 + e((1 − c) + e) s0,
//
// with 1 − c, an integer, added to e last, so that c = 1 does not round e
// away.
func expGroup(fc, e, ex, s0, s1, s2 float64) (a, d1, d2 float64) {
	return s0 * ex, (s1 - e*s0) * ex, (s2 - 2*e*s1 + e*((1-fc)+e)*s0) * ex
}

// DeltaLimits returns the limits of ∂αʳ/∂δ and ∂²αʳ/∂δ² as δ → 0 at τ.
// Divided by ρc and ρc², they are the second and third virial
// coefficients.
func (r *Residual) DeltaLimits(tau float64) (d, dd float64) {
	poly := func(n float64, dexp int, t float64, c int) {
		v := n * math.Pow(tau, t)
		// δ^d exp(−δ^c) = δ^d − δ^(d+c) + …
		if dexp == 1 {
			d += v
		}
		if dexp == 2 {
			dd += 2 * v
		}
		if c > 0 && dexp+c == 2 {
			dd -= 2 * v
		}
	}
	for _, p := range r.src.Power {
		poly(p.N, p.D, p.T, 0)
	}
	for _, p := range r.src.Exponential {
		poly(p.N, p.D, p.T, p.C)
	}
	for _, g := range r.src.Gaussian {
		tt := tau - g.Gamma
		// δ^d exp(−α(δ−ε)²) = e0 δ^d (1 + 2αε δ + …)
		v := g.N * math.Pow(tau, g.T) * math.Exp(-g.Alpha*g.Epsilon*g.Epsilon-g.Beta*tt*tt)
		if g.D == 1 {
			d += v
			dd += 2 * v * 2 * g.Alpha * g.Epsilon
		}
		if g.D == 2 {
			dd += 2 * v
		}
	}
	if len(r.na) > 0 {
		e := r.evalNonAnalytic(0, tau, false)
		d += e.D
		dd += e.DD
	}
	return d, dd
}

func finite(v ...float64) bool {
	for _, x := range v {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return false
		}
	}
	return true
}
