package helmholtz

import (
	"errors"
	"fmt"
	"math"
	"sort"
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

// Limits of the tables a Residual evaluates by multiplication.
const (
	maxDeltaPow = 23 // largest δ exponent d or c
	maxExpC     = 8  // c of exp(−δ^c) is at most maxExpC−1
)

// polyGroup is the set of Power (c = 0) or Exponential terms that share
// c, and so the factor exp(−δ^c).
type polyGroup struct {
	c      int
	lo, hi int // terms[lo:hi]
}

// polyTerm is one Power or Exponential term with the constants its
// derivative sums need.
type polyTerm struct {
	n          float64
	fd, d2, d3 float64 // d, d², d³
	t, tt1, td float64 // t, t(t−1), t·d
	d, k       int32   // δ exponent; index of τ^t among the distinct exponents
}

// Residual is a compiled residual Helmholtz energy αʳ(δ, τ). It is
// immutable and safe for concurrent use. The zero value is αʳ ≡ 0.
//
// Evaluation groups the polynomial and exponential terms by (d, c), so
// that each exp(−δ^c) is computed once; takes integer powers by
// multiplication and the non-integer powers of τ from square roots of τ
// where the exponents share a power-of-two denominator; and shares the
// distance function Δ and its logarithm between nonanalytic terms of the
// same shape.
type Residual struct {
	groups []polyGroup
	terms  []polyTerm
	tp     tauPowers
	maxD   int
	gauss  []Gaussian
	gix    []int // index of τ^t of each Gaussian term among the distinct exponents
	na     []NonAnalytic
	na2a   []int // 2a of each nonanalytic term when an integer, else −1
}

// NewResidual compiles the terms t. It returns an error if a term has an
// exponent outside the ranges stated on the term types or a non-finite
// parameter.
func NewResidual(t ResidualTerms) (*Residual, error) {
	type raw struct {
		n, t float64
		d, c int
	}
	var all []raw
	for _, p := range t.Power {
		all = append(all, raw{p.N, p.T, p.D, 0})
	}
	for _, e := range t.Exponential {
		if e.C < 1 {
			return nil, fmt.Errorf("helmholtz: exponential term with c=%d < 1", e.C)
		}
		all = append(all, raw{e.N, e.T, e.D, e.C})
	}
	r := &Residual{}
	var exps []float64
	for _, p := range all {
		if !finite(p.n, p.t) || p.d < 1 || p.d > maxDeltaPow || p.c < 0 || p.c >= maxExpC {
			return nil, fmt.Errorf("helmholtz: term n=%g d=%d t=%g c=%d out of range", p.n, p.d, p.t, p.c)
		}
		r.maxD = max(r.maxD, p.d, p.c)
		exps = append(exps, p.t)
	}
	for _, g := range t.Gaussian {
		if !finite(g.N, g.T, g.Alpha, g.Beta, g.Gamma, g.Epsilon) || g.D < 1 || g.D > maxDeltaPow {
			return nil, fmt.Errorf("helmholtz: Gaussian term %+v out of range", g)
		}
		r.maxD = max(r.maxD, g.D)
		exps = append(exps, g.T)
	}
	for _, q := range t.NonAnalytic {
		if !finite(q.N, q.SmallA, q.SmallB, q.A, q.B, q.C, q.D, q.Beta) ||
			q.SmallA <= 1.5 || q.Beta <= 0 || 1/q.Beta <= 3 || q.SmallB <= 0.5 || q.SmallB >= 1 {
			return nil, fmt.Errorf("helmholtz: nonanalytic term %+v out of range", q)
		}
	}
	tp, idx, ok := newTauPowers(exps)
	if !ok {
		return nil, errors.New("helmholtz: too many distinct temperature exponents")
	}
	r.tp = tp
	// Group polynomial terms by c, keeping the published order within a
	// group.
	order := make([]int, len(all))
	for i := range order {
		order[i] = i
	}
	sort.SliceStable(order, func(a, b int) bool {
		pa, pb := all[order[a]], all[order[b]]
		return pa.c < pb.c
	})
	for _, i := range order {
		p := all[i]
		if n := len(r.groups); n == 0 || r.groups[n-1].c != p.c {
			r.groups = append(r.groups, polyGroup{c: p.c, lo: len(r.terms), hi: len(r.terms)})
		}
		fd := float64(p.d)
		r.terms = append(r.terms, polyTerm{n: p.n, fd: fd, d2: fd * fd, d3: fd * fd * fd,
			t: p.t, tt1: p.t * (p.t - 1), td: p.t * fd, d: int32(p.d), k: int32(idx[i])})
		r.groups[len(r.groups)-1].hi++
	}
	r.gauss = append(r.gauss, t.Gaussian...)
	r.gix = idx[len(all):]
	r.na = append(r.na, t.NonAnalytic...)
	for _, q := range r.na {
		ta := 2 * q.SmallA
		if ta == math.Trunc(ta) && ta <= 64 {
			r.na2a = append(r.na2a, int(ta))
		} else {
			r.na2a = append(r.na2a, -1)
		}
	}
	return r, nil
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
// Special cases are:
//
//	At δ = τ = 1 exactly, with nonanalytic terms, TT = ±Inf (the sign of
//	the dominant term, the one with the smallest b) and every nonanalytic
//	contribution to the other derivatives is its limit, 0.
//
// The result for δ ≤ 0 or τ ≤ 0 is unspecified (NaN or ±Inf).
func (r *Residual) Eval(delta, tau float64) Derivs {
	var dpow [maxDeltaPow + 1]float64
	var tv [maxTauDst]float64
	dpow[0] = 1
	for k := 1; k <= r.maxD; k++ {
		dpow[k] = dpow[k-1] * delta
	}
	r.tp.fill(&tv, tau)

	// Scaled sums: a, δα_δ, δ²α_δδ, δ³α_δδδ, τα_τ, τ²α_ττ, δτα_δτ.
	//
	// A term v = n δ^d τ^t exp(−δ^c) has, with e = c δ^c and y = d − e,
	//	δ v_δ/v = y,  δ² v_δδ/v = y(y−1) − ce,
	//	δ³ v_δδδ/v = y(y−1)(y−2) − 3ce(y−1) − c²e,
	// so a group of one c needs only the sums of v d^k (k = 0..3), v t,
	// v t(t−1) and v t d, from which Σ v y^k follow exactly.
	var a, d1, d2, d3, t1, t2, dt float64
	for gi := range r.groups {
		g := &r.groups[gi]
		var s0, s1, s2, s3, r1, r2, q float64
		for i := g.lo; i < g.hi; i++ {
			p := &r.terms[i]
			v := p.n * tv[p.k] * dpow[p.d]
			s0 += v
			s1 += v * p.fd
			s2 += v * p.d2
			s3 += v * p.d3
			r1 += v * p.t
			r2 += v * p.tt1
			q += v * p.td
		}
		if g.c > 0 {
			u := dpow[g.c]
			ex := math.Exp(-u)
			s0, s1, s2, s3 = s0*ex, s1*ex, s2*ex, s3*ex
			r1, r2, q = r1*ex, r2*ex, q*ex
			fc := float64(g.c)
			e := fc * u
			m1 := s1 - e*s0
			m2 := s2 - 2*e*s1 + e*e*s0
			m3 := s3 - 3*e*s2 + 3*e*e*s1 - e*e*e*s0
			a += s0
			d1 += m1
			d2 += m2 - m1 - fc*e*s0
			d3 += m3 - 3*m2 + 2*m1 - 3*fc*e*(m1-s0) - fc*fc*e*s0
			t1 += r1
			t2 += r2
			dt += q - e*r1
		} else {
			a += s0
			d1 += s1
			d2 += s2 - s1
			d3 += s3 - 3*s2 + 2*s1
			t1 += r1
			t2 += r2
			dt += q
		}
	}
	for i := range r.gauss {
		g := &r.gauss[i]
		dd := delta - g.Epsilon
		tt := tau - g.Gamma
		v := g.N * dpow[g.D] * tv[r.gix[i]] * math.Exp(-g.Alpha*dd*dd-g.Beta*tt*tt)
		fd := float64(g.D)
		// δ f'/f, δ²f''/f, δ³f'''/f for f = δ^d exp(−α(δ−ε)²); likewise in τ.
		ad2 := 2 * g.Alpha * delta * delta
		q1 := fd - 2*g.Alpha*delta*dd
		q2 := q1*q1 - fd - ad2
		q3 := q1*q1*q1 - 3*q1*(fd+ad2) + 2*fd
		k1 := g.T - 2*g.Beta*tau*tt
		k2 := k1*k1 - g.T - 2*g.Beta*tau*tau
		a += v
		d1 += v * q1
		d2 += v * q2
		d3 += v * q3
		t1 += v * k1
		t2 += v * k2
		dt += v * q1 * k1
	}
	id, it := 1/delta, 1/tau
	out := Derivs{
		A:   a,
		D:   d1 * id,
		DD:  d2 * id * id,
		DDD: d3 * id * id * id,
		T:   t1 * it,
		TT:  t2 * it * it,
		DT:  dt * id * it,
	}
	if len(r.na) > 0 {
		out = out.Add(r.evalNonAnalytic(delta, tau))
	}
	return out
}

// evalNonAnalytic returns the sum of the nonanalytic terms and their plain
// derivatives. It is valid at δ = 0 too, where it gives the limits.
//
// Consecutive terms of the same shape (β, a, A, B) share θ, Δ and ln Δ,
// and those with the same (C, D) share ψ, so a family of terms costs one
// power and one logarithm plus one exponential per term.
func (r *Residual) evalNonAnalytic(delta, tau float64) Derivs {
	var out Derivs
	x := delta - 1
	ax := math.Abs(x)
	sx := 1.0
	if x < 0 {
		sx = -1
	}
	y := tau - 1
	singular := false
	minB, nMinB := math.Inf(1), 0.0

	// Shape values, reused while the shape repeats.
	var prev *NonAnalytic
	var dl, dlx, dlxx, dlxxx, dlt, dlxt, lnDl float64
	var psi, psix, psixx, psixxx, psit, psitt, psixt float64
	for i := range r.na {
		q := &r.na[i]
		if prev == nil || q.Beta != prev.Beta || q.SmallA != prev.SmallA || q.A != prev.A || q.B != prev.B {
			ib := 1 / q.Beta
			// |x|^(1/β − k) and |x|^(2a − k), k = 0..3; zero at x = 0
			// since 1/β > 3 and 2a > 3.
			var p0, p1, p2, p3, s0, s1, s2, s3 float64
			if ax > 0 {
				p0 = powBeta(ax, ib)
				p1 = p0 / ax
				p2 = p1 / ax
				p3 = p2 / ax
				if n := r.na2a[i]; n >= 0 {
					s0 = ipow(ax, n)
				} else {
					s0 = math.Pow(ax, 2*q.SmallA)
				}
				s1 = s0 / ax
				s2 = s1 / ax
				s3 = s2 / ax
			}
			th := -y + q.A*p0
			thx := q.A * ib * p1 * sx
			thxx := q.A * ib * (ib - 1) * p2
			thxxx := q.A * ib * (ib - 1) * (ib - 2) * p3 * sx
			ta := 2 * q.SmallA
			dl = th*th + q.B*s0
			dlx = 2*th*thx + q.B*ta*s1*sx
			dlxx = 2*thx*thx + 2*th*thxx + q.B*ta*(ta-1)*s2
			dlxxx = 6*thx*thxx + 2*th*thxxx + q.B*ta*(ta-1)*(ta-2)*s3*sx
			dlt = -2 * th
			dlxt = -2 * thx
			if dl > 0 {
				lnDl = math.Log(dl)
			}
		}
		if prev == nil || q.C != prev.C || q.D != prev.D {
			psi = math.Exp(-q.C*x*x - q.D*y*y)
			psix = -2 * q.C * x * psi
			psixx = (4*q.C*q.C*x*x - 2*q.C) * psi
			psixxx = (12*q.C*q.C*x - 8*q.C*q.C*q.C*x*x*x) * psi
			psit = -2 * q.D * y * psi
			psitt = (4*q.D*q.D*y*y - 2*q.D) * psi
			psixt = 4 * q.C * q.D * x * y * psi
		}
		prev = q

		b := q.SmallB
		var f, fx, fxx, fxxx, ft, ftt, fxt float64
		if dl > 0 {
			f = math.Exp(b * lnDl)
			r1 := dlx / dl
			rt := dlt / dl
			rxx := dlxx / dl
			fx = f * b * r1
			fxx = f * (b*(b-1)*r1*r1 + b*rxx)
			fxxx = f * (b*(b-1)*(b-2)*r1*r1*r1 + 3*b*(b-1)*r1*rxx + b*dlxxx/dl)
			ft = f * b * rt
			ftt = f * (b*(b-1)*rt*rt + 2*b/dl)
			fxt = f * (b*(b-1)*r1*rt + b*dlxt/dl)
		} else {
			// Δ = 0 only at δ = τ = 1: every derivative of Δ^b but the
			// second τ-derivative tends to 0 there, and that one to +Inf.
			singular = true
			if b < minB {
				minB, nMinB = b, q.N
			} else if b == minB {
				nMinB += q.N
			}
		}

		g := delta * psi
		gx := psi + delta*psix
		gxx := 2*psix + delta*psixx
		gxxx := 3*psixx + delta*psixxx
		gt := delta * psit
		gtt := delta * psitt
		gxt := psit + delta*psixt

		n := q.N
		out.A += n * f * g
		out.D += n * (fx*g + f*gx)
		out.DD += n * (fxx*g + 2*fx*gx + f*gxx)
		out.DDD += n * (fxxx*g + 3*fxx*gx + 3*fx*gxx + f*gxxx)
		out.T += n * (ft*g + f*gt)
		out.TT += n * (ftt*g + 2*ft*gt + f*gtt)
		out.DT += n * (fxt*g + fx*gt + ft*gx + f*gxt)
	}
	if singular {
		out.TT = math.Copysign(math.Inf(1), nMinB)
	}
	return out
}

// powBeta returns x^e for x > 0, with e = 1/β; the published equations
// have β = 0.3, e = 10/3, where x³·∛x is exact to rounding and several
// times faster than math.Pow.
func powBeta(x, e float64) float64 {
	if e == 10.0/3 {
		return x * x * x * math.Cbrt(x)
	}
	return math.Pow(x, e)
}

// ipow returns x^n for n ≥ 0 by repeated squaring.
func ipow(x float64, n int) float64 {
	p := 1.0
	for n > 0 {
		if n&1 != 0 {
			p *= x
		}
		x *= x
		n >>= 1
	}
	return p
}

// DeltaLimits returns the limits of ∂αʳ/∂δ and ∂²αʳ/∂δ² as δ → 0 at τ.
// Divided by ρc and ρc², they are the second and third virial
// coefficients.
func (r *Residual) DeltaLimits(tau float64) (d, dd float64) {
	for _, g := range r.groups {
		for _, p := range r.terms[g.lo:g.hi] {
			v := p.n * math.Pow(tau, p.t)
			// δ^d exp(−δ^c) = δ^d − δ^(d+c) + …
			if p.d == 1 {
				d += v
			}
			if p.d == 2 {
				dd += 2 * v
			}
			if g.c > 0 && int(p.d)+g.c == 2 {
				dd -= 2 * v
			}
		}
	}
	for i := range r.gauss {
		g := &r.gauss[i]
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
		e := r.evalNonAnalytic(0, tau)
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
