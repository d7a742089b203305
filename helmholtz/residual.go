package helmholtz

import (
	"errors"
	"fmt"
	"math"
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

// Limits of the power tables a Residual evaluates by multiplication.
const (
	maxDeltaPow = 23 // largest δ exponent d or c
	maxTauPow   = 63 // largest integer τ exponent t
	maxNonInt   = 16 // largest number of distinct non-integer τ exponents
	maxExpC     = 8  // c of exp(−δ^c) is at most maxExpC−1
)

// polyTerm is a Power (c = 0) or Exponential term, compiled.
type polyTerm struct {
	n    float64
	t    float64
	d, c int
	// ti indexes the τ-power table: ti ≥ 0 is the integer power ti,
	// ti < 0 is the non-integer exponent nonInt[−ti−1].
	ti int
}

// Residual is a compiled residual Helmholtz energy αʳ(δ, τ). It is
// immutable and safe for concurrent use. The zero value is αʳ ≡ 0.
type Residual struct {
	poly   []polyTerm
	nonInt []float64 // distinct non-integer τ exponents
	maxT   int       // largest integer τ power in use
	maxD   int       // largest δ power in use
	gauss  []Gaussian
	na     []NonAnalytic
}

// NewResidual compiles the terms t. It returns an error if a term has an
// exponent outside the ranges stated on the term types or a non-finite
// parameter.
func NewResidual(t ResidualTerms) (*Residual, error) {
	r := &Residual{}
	add := func(n float64, d int, tt float64, c int) error {
		if !finite(n, tt) || d < 1 || d > maxDeltaPow || c < 0 || c >= maxExpC {
			return fmt.Errorf("helmholtz: term n=%g d=%d t=%g c=%d out of range", n, d, tt, c)
		}
		pt := polyTerm{n: n, t: tt, d: d, c: c}
		if tt == math.Trunc(tt) && tt >= 0 && tt <= maxTauPow {
			pt.ti = int(tt)
			r.maxT = max(r.maxT, pt.ti)
		} else {
			k := -1
			for i, e := range r.nonInt {
				if e == tt {
					k = i
				}
			}
			if k < 0 {
				if len(r.nonInt) == maxNonInt {
					return errors.New("helmholtz: too many distinct non-integer exponents")
				}
				r.nonInt = append(r.nonInt, tt)
				k = len(r.nonInt) - 1
			}
			pt.ti = -k - 1
		}
		r.maxD = max(r.maxD, d, c)
		r.poly = append(r.poly, pt)
		return nil
	}
	for _, p := range t.Power {
		if err := add(p.N, p.D, p.T, 0); err != nil {
			return nil, err
		}
	}
	for _, e := range t.Exponential {
		if e.C < 1 {
			return nil, fmt.Errorf("helmholtz: exponential term with c=%d < 1", e.C)
		}
		if err := add(e.N, e.D, e.T, e.C); err != nil {
			return nil, err
		}
	}
	for _, g := range t.Gaussian {
		if !finite(g.N, g.T, g.Alpha, g.Beta, g.Gamma, g.Epsilon) || g.D < 1 || g.D > maxDeltaPow {
			return nil, fmt.Errorf("helmholtz: Gaussian term %+v out of range", g)
		}
		r.maxD = max(r.maxD, g.D)
	}
	r.gauss = append(r.gauss, t.Gaussian...)
	for _, q := range t.NonAnalytic {
		if !finite(q.N, q.SmallA, q.SmallB, q.A, q.B, q.C, q.D, q.Beta) ||
			q.SmallA <= 1.5 || q.Beta <= 0 || 1/q.Beta <= 3 || q.SmallB <= 0.5 || q.SmallB >= 1 {
			return nil, fmt.Errorf("helmholtz: nonanalytic term %+v out of range", q)
		}
	}
	r.na = append(r.na, t.NonAnalytic...)
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
	var tpow [maxTauPow + 1]float64
	var tnon [maxNonInt]float64
	var expc [maxExpC]float64

	dpow[0] = 1
	for k := 1; k <= r.maxD; k++ {
		dpow[k] = dpow[k-1] * delta
	}
	tpow[0] = 1
	for k := 1; k <= r.maxT; k++ {
		tpow[k] = tpow[k-1] * tau
	}
	if len(r.nonInt) > 0 {
		lt := math.Log(tau)
		for i, e := range r.nonInt {
			tnon[i] = math.Exp(e * lt)
		}
	}
	expc[0] = 1
	for c := 1; c < maxExpC && c <= r.maxD; c++ {
		expc[c] = math.NaN() // filled on first use
	}

	// Scaled sums: a, δα_δ, δ²α_δδ, δ³α_δδδ, τα_τ, τ²α_ττ, δτα_δτ.
	var a, d1, d2, d3, t1, t2, dt float64
	for i := range r.poly {
		p := &r.poly[i]
		var tp float64
		if p.ti >= 0 {
			tp = tpow[p.ti]
		} else {
			tp = tnon[-p.ti-1]
		}
		v := p.n * dpow[p.d] * tp
		fd := float64(p.d)
		var p1, p2, p3 float64
		if p.c == 0 {
			p1, p2, p3 = fd, fd*fd, fd*fd*fd
		} else {
			e := expc[p.c]
			if e != e { // NaN: not yet computed
				e = math.Exp(-dpow[p.c])
				expc[p.c] = e
			}
			v *= e
			fc := float64(p.c)
			u := dpow[p.c]
			p1 = fd - fc*u
			p2 = p1*p1 - fc*fc*u
			p3 = p2*p1 - fc*fc*u*(fc+2*p1)
		}
		a += v
		d1 += v * p1
		d2 += v * (p2 - p1)
		d3 += v * (p3 - 3*p2 + 2*p1)
		t1 += v * p.t
		t2 += v * p.t * (p.t - 1)
		dt += v * p1 * p.t
	}
	for i := range r.gauss {
		g := &r.gauss[i]
		dd := delta - g.Epsilon
		tt := tau - g.Gamma
		v := g.N * dpow[g.D] * math.Pow(tau, g.T) * math.Exp(-g.Alpha*dd*dd-g.Beta*tt*tt)
		fd := float64(g.D)
		// δ f'/f, δ²f''/f, δ³f'''/f for f = δ^d exp(−α(δ−ε)²); likewise in τ.
		q1 := fd - 2*g.Alpha*delta*dd
		q2 := q1*q1 - fd - 2*g.Alpha*delta*delta
		q3 := q1*q1*q1 + 3*q1*(-fd-2*g.Alpha*delta*delta) + 2*fd
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
	for i := range r.na {
		q := &r.na[i]
		ib := 1 / q.Beta
		// |x|^(1/β − k) and |x|^(2a − k), k = 0..3; zero at x = 0 since
		// 1/β > 3 and 2a > 3.
		var p0, p1, p2, p3, s0, s1, s2, s3 float64
		if ax > 0 {
			p0 = math.Pow(ax, ib)
			p1 = p0 / ax
			p2 = p1 / ax
			p3 = p2 / ax
			s0 = math.Pow(ax, 2*q.SmallA)
			s1 = s0 / ax
			s2 = s1 / ax
			s3 = s2 / ax
		}
		th := -y + q.A*p0
		thx := q.A * ib * p1 * sx
		thxx := q.A * ib * (ib - 1) * p2
		thxxx := q.A * ib * (ib - 1) * (ib - 2) * p3 * sx
		ta := 2 * q.SmallA
		dl := th*th + q.B*s0
		dlx := 2*th*thx + q.B*ta*s1*sx
		dlxx := 2*thx*thx + 2*th*thxx + q.B*ta*(ta-1)*s2
		dlxxx := 6*thx*thxx + 2*th*thxxx + q.B*ta*(ta-1)*(ta-2)*s3*sx
		dlt := -2 * th
		dlxt := -2 * thx

		b := q.SmallB
		var f, fx, fxx, fxxx, ft, ftt, fxt float64
		if dl > 0 {
			f = math.Pow(dl, b)
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

		psi := math.Exp(-q.C*x*x - q.D*y*y)
		psix := -2 * q.C * x * psi
		psixx := (4*q.C*q.C*x*x - 2*q.C) * psi
		psixxx := (12*q.C*q.C*x - 8*q.C*q.C*q.C*x*x*x) * psi
		psit := -2 * q.D * y * psi
		psitt := (4*q.D*q.D*y*y - 2*q.D) * psi
		psixt := 4 * q.C * q.D * x * y * psi

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

// DeltaLimits returns the limits of ∂αʳ/∂δ and ∂²αʳ/∂δ² as δ → 0 at τ.
// Divided by ρc and ρc², they are the second and third virial
// coefficients.
func (r *Residual) DeltaLimits(tau float64) (d, dd float64) {
	for i := range r.poly {
		p := &r.poly[i]
		v := p.n * math.Pow(tau, p.t)
		// δ^d exp(−δ^c) = δ^d − δ^(d+c) + …
		if p.d == 1 {
			d += v
		}
		if p.d == 2 {
			dd += 2 * v
		}
		if p.c > 0 && p.d+p.c == 2 {
			dd -= 2 * v
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
