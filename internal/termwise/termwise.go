// Package termwise evaluates a reduced Helmholtz energy term by term with
// the plain formulas of its publications and math.Pow, math.Exp and
// math.Log: no shared powers, no grouping, no kernels of tripoint's own.
// It is the reference against which tests prove package helmholtz's fast
// evaluation; it is slow and meant for tests only.
//
// Each result comes with the magnitudes of what was summed: for every
// derivative, the sum over the terms of the absolute values of the
// products that make up the term's contribution, each weighted by the
// term's condition 1 + Σ|a| over the arguments a of its exponentials and
// the logarithms behind its powers (a rounding of relative size ε in an
// argument a changes e^a by the factor 1 + aε, and x^t = e^(t ln x)).
// Differences between two evaluations that round each term differently
// are bounded relative to these magnitudes, not to the results, which
// cancellation can make arbitrarily small.
//
// The formulas of the power, exponential and Gaussian terms are the
// Leibniz rule on δ^d·exp(…) and τ^t·exp(…); those of the nonanalytic
// terms are IAPWS R6-95(2018), Table 5, for the first and second
// derivatives and the Leibniz rule for the third δ-derivative.
package termwise

import (
	"math"

	"github.com/tripoint-thermo/tripoint/helmholtz"
)

// acc accumulates a derivative and the magnitude of its pieces, weighted
// by *cond.
type acc struct {
	v, m float64
	cond *float64
}

func (a *acc) add(pieces ...float64) {
	for _, p := range pieces {
		a.v += p
		a.m += math.Abs(p) * *a.cond
	}
}

// sums holds the seven accumulated derivatives and the condition of the
// term being added.
type sums struct {
	a, d, dd, ddd, t, tt, dt acc
	cond                     float64
}

func newSums() *sums {
	s := &sums{cond: 1}
	for _, a := range []*acc{&s.a, &s.d, &s.dd, &s.ddd, &s.t, &s.tt, &s.dt} {
		a.cond = &s.cond
	}
	return s
}

// logMag is |e ln x|, the size of the argument behind x^e.
func logMag(x, e float64) float64 { return math.Abs(e * math.Log(x)) }

func (s *sums) derivs() (v, m helmholtz.Derivs) {
	v = helmholtz.Derivs{A: s.a.v, D: s.d.v, DD: s.dd.v, DDD: s.ddd.v, T: s.t.v, TT: s.tt.v, DT: s.dt.v}
	m = helmholtz.Derivs{A: s.a.m, D: s.d.m, DD: s.dd.m, DDD: s.ddd.m, T: s.t.m, TT: s.tt.m, DT: s.dt.m}
	return v, m
}

// powDerivs returns x^e and its first three derivatives in x.
func powDerivs(x, e float64) [4]float64 {
	return [4]float64{
		math.Pow(x, e),
		e * math.Pow(x, e-1),
		e * (e - 1) * math.Pow(x, e-2),
		e * (e - 1) * (e - 2) * math.Pow(x, e-3),
	}
}

// leibniz returns the pieces of the k-th derivative of p·q from the
// derivatives of p and q (k ≤ 3).
func leibniz(p, q [4]float64, k int) []float64 {
	switch k {
	case 0:
		return []float64{p[0] * q[0]}
	case 1:
		return []float64{p[1] * q[0], p[0] * q[1]}
	case 2:
		return []float64{p[2] * q[0], 2 * p[1] * q[1], p[0] * q[2]}
	}
	return []float64{p[3] * q[0], 3 * p[2] * q[1], 3 * p[1] * q[2], p[0] * q[3]}
}

// scale multiplies pieces by c.
func scale(c float64, pieces []float64) []float64 {
	out := make([]float64, len(pieces))
	for i, p := range pieces {
		out[i] = c * p
	}
	return out
}

// Residual returns αʳ and its derivatives at (δ, τ) and their magnitudes.
// δ = 1 exactly is excluded where the terms are nonanalytic (their plain
// formulas divide by δ − 1 there).
func Residual(t helmholtz.ResidualTerms, delta, tau float64) (v, mag helmholtz.Derivs) {
	s := newSums()
	poly := func(n float64, d int, tt float64, c int) {
		s.cond = 1 + logMag(delta, float64(d)) + logMag(tau, tt)
		if c > 0 {
			s.cond += math.Pow(delta, float64(c)) + logMag(delta, float64(c))
		}
		p := powDerivs(delta, float64(d))
		// E = exp(−u), u = δ^c: E' = −u'E, E'' = (u'² − u'')E,
		// E''' = (−u'³ + 3u'u'' − u''')E.
		e := [4]float64{1, 0, 0, 0}
		if c > 0 {
			u := powDerivs(delta, float64(c))
			ex := math.Exp(-u[0])
			e = [4]float64{ex, -u[1] * ex, (u[1]*u[1] - u[2]) * ex,
				(-u[1]*u[1]*u[1] + 3*u[1]*u[2] - u[3]) * ex}
		}
		q := powDerivs(tau, tt)
		nq := n * q[0]
		s.a.add(scale(nq, leibniz(p, e, 0))...)
		s.d.add(scale(nq, leibniz(p, e, 1))...)
		s.dd.add(scale(nq, leibniz(p, e, 2))...)
		s.ddd.add(scale(nq, leibniz(p, e, 3))...)
		s.t.add(scale(n*q[1], leibniz(p, e, 0))...)
		s.tt.add(scale(n*q[2], leibniz(p, e, 0))...)
		s.dt.add(scale(n*q[1], leibniz(p, e, 1))...)
	}
	for _, p := range t.Power {
		poly(p.N, p.D, p.T, 0)
	}
	for _, p := range t.Exponential {
		poly(p.N, p.D, p.T, p.C)
	}
	for _, g := range t.Gaussian {
		p := powDerivs(delta, float64(g.D))
		x := delta - g.Epsilon
		s.cond = 1 + logMag(delta, float64(g.D)) + logMag(tau, g.T) +
			g.Alpha*x*x + g.Beta*(tau-g.Gamma)*(tau-g.Gamma)
		ex := math.Exp(-g.Alpha * x * x)
		a := g.Alpha
		e := [4]float64{ex, -2 * a * x * ex, (4*a*a*x*x - 2*a) * ex, (-8*a*a*a*x*x*x + 12*a*a*x) * ex}
		pt := powDerivs(tau, g.T)
		y := tau - g.Gamma
		ey := math.Exp(-g.Beta * y * y)
		b := g.Beta
		et := [4]float64{ey, -2 * b * y * ey, (4*b*b*y*y - 2*b) * ey}
		q := [4]float64{pt[0] * et[0], pt[1]*et[0] + pt[0]*et[1], pt[2]*et[0] + 2*pt[1]*et[1] + pt[0]*et[2]}
		s.a.add(scale(g.N*q[0], leibniz(p, e, 0))...)
		s.d.add(scale(g.N*q[0], leibniz(p, e, 1))...)
		s.dd.add(scale(g.N*q[0], leibniz(p, e, 2))...)
		s.ddd.add(scale(g.N*q[0], leibniz(p, e, 3))...)
		s.t.add(scale(g.N*q[1], leibniz(p, e, 0))...)
		s.tt.add(scale(g.N*q[2], leibniz(p, e, 0))...)
		s.dt.add(scale(g.N*q[1], leibniz(p, e, 1))...)
	}
	for _, q := range t.NonAnalytic {
		nonAnalytic(s, q, delta, tau)
	}
	return s.derivs()
}

// nonAnalytic adds the term n Δ^b δ ψ of IAPWS R6-95(2018), Table 5.
func nonAnalytic(s *sums, q helmholtz.NonAnalytic, delta, tau float64) {
	n, a, b, A, B, C, D, beta := q.N, q.SmallA, q.SmallB, q.A, q.B, q.C, q.D, q.Beta
	x := delta - 1
	x2 := x * x
	theta := (1 - tau) + A*math.Pow(x2, 1/(2*beta))
	Delta := theta*theta + B*math.Pow(x2, a)
	psi := math.Exp(-C*x2 - D*(tau-1)*(tau-1))
	s.cond = 1 + C*x2 + D*(tau-1)*(tau-1) + b*math.Abs(math.Log(Delta))
	if x != 0 {
		s.cond += logMag(math.Abs(x), 1/beta) + logMag(math.Abs(x), 2*a)
	}
	// Δ and Δ^b.
	// ∂Δ/∂δ = (δ−1)·dDx; Table 5's (1/(δ−1))·∂Δ/∂δ is dDx, which stays
	// defined at δ = 1.
	dDx := A*theta*2/beta*math.Pow(x2, 1/(2*beta)-1) + 2*B*a*math.Pow(x2, a-1)
	dD := x * dDx
	// Table 5's ∂²Δ/∂δ² with its factor (δ−1)² taken into the powers,
	// so that it stays defined at δ = 1.
	ddD := dDx + 4*B*a*(a-1)*math.Pow(x2, a-1) +
		2*A*A/(beta*beta)*math.Pow(x2, 1/beta-1) +
		A*theta*4/beta*(1/(2*beta)-1)*math.Pow(x2, 1/(2*beta)-1)
	Db := math.Pow(Delta, b)
	dDb := b * math.Pow(Delta, b-1) * dD
	ddDb := b * (math.Pow(Delta, b-1)*ddD + (b-1)*math.Pow(Delta, b-2)*dD*dD)
	tDb := -2 * theta * b * math.Pow(Delta, b-1)
	ttDb := 2*b*math.Pow(Delta, b-1) + 4*theta*theta*b*(b-1)*math.Pow(Delta, b-2)
	dtDb := -A*b*2/beta*math.Pow(Delta, b-1)*x*math.Pow(x2, 1/(2*beta)-1) -
		2*theta*b*(b-1)*math.Pow(Delta, b-2)*dD
	// ψ.
	dpsi := -2 * C * x * psi
	ddpsi := (2*C*x2 - 1) * 2 * C * psi
	tpsi := -2 * D * (tau - 1) * psi
	ttpsi := (2*D*(tau-1)*(tau-1) - 1) * 2 * D * psi
	dtpsi := 4 * C * D * x * (tau - 1) * psi

	s.a.add(n * Db * delta * psi)
	s.d.add(n*Db*psi, n*Db*delta*dpsi, n*dDb*delta*psi)
	s.dd.add(n*Db*2*dpsi, n*Db*delta*ddpsi, 2*n*dDb*psi, 2*n*dDb*delta*dpsi, n*ddDb*delta*psi)
	s.t.add(n*delta*tDb*psi, n*delta*Db*tpsi)
	s.tt.add(n*delta*ttDb*psi, 2*n*delta*tDb*tpsi, n*delta*Db*ttpsi)
	s.dt.add(n*Db*tpsi, n*Db*delta*dtpsi, n*delta*dDb*tpsi, n*tDb*psi, n*tDb*delta*dpsi, n*dtDb*delta*psi)

	// Third δ-derivative: Leibniz on f = Δ^b and g = δψ, with Δ written
	// in |x|: θ = (1 − τ) + A|x|^(1/β), Δ = θ² + B|x|^(2a).
	ax, sx := math.Abs(x), math.Copysign(1, x)
	ib, ta := 1/beta, 2*a
	th := [4]float64{theta, A * ib * math.Pow(ax, ib-1) * sx, A * ib * (ib - 1) * math.Pow(ax, ib-2),
		A * ib * (ib - 1) * (ib - 2) * math.Pow(ax, ib-3) * sx}
	bx := [4]float64{B * math.Pow(ax, ta), B * ta * math.Pow(ax, ta-1) * sx, B * ta * (ta - 1) * math.Pow(ax, ta-2),
		B * ta * (ta - 1) * (ta - 2) * math.Pow(ax, ta-3) * sx}
	d1 := 2*th[0]*th[1] + bx[1]
	d2 := 2*th[1]*th[1] + 2*th[0]*th[2] + bx[2]
	d3 := 6*th[1]*th[2] + 2*th[0]*th[3] + bx[3]
	f3 := b * (math.Pow(Delta, b-1)*d3 + 3*(b-1)*math.Pow(Delta, b-2)*d1*d2 +
		(b-1)*(b-2)*math.Pow(Delta, b-3)*d1*d1*d1)
	dddpsi := (12*C*C*x - 8*C*C*C*x*x2) * psi
	g := [4]float64{delta * psi, psi + delta*dpsi, 2*dpsi + delta*ddpsi, 3*ddpsi + delta*dddpsi}
	f := [4]float64{Db, dDb, ddDb, f3}
	s.ddd.add(scale(n, leibniz(f, g, 3))...)
}

// Ideal returns α° and its derivatives at (δ, τ) and their magnitudes.
func Ideal(t helmholtz.IdealTerms, delta, tau float64) (v, mag helmholtz.Derivs) {
	s := newSums()
	s.a.add(math.Log(delta), t.A1, t.A2*tau, t.LogTau*math.Log(tau))
	s.d.add(1 / delta)
	s.dd.add(-1 / (delta * delta))
	s.ddd.add(2 / (delta * delta * delta))
	s.t.add(t.A2, t.LogTau/tau)
	s.tt.add(-t.LogTau / (tau * tau))
	for _, p := range t.Power {
		q := powDerivs(tau, p.T)
		s.cond = 1 + logMag(tau, p.T)
		s.a.add(p.N * q[0])
		s.t.add(p.N * q[1])
		s.tt.add(p.N * q[2])
	}
	for _, p := range t.PlanckEinstein {
		e := math.Exp(-p.Theta * tau)
		s.cond = 1 + p.Theta*tau
		s.a.add(p.N * math.Log(1-e))
		s.t.add(p.N * p.Theta * (1/(1-e) - 1))
		s.tt.add(-p.N * p.Theta * p.Theta * e / ((1 - e) * (1 - e)))
	}
	return s.derivs()
}
