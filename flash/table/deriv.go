package table

import (
	"github.com/tripoint-thermo/tripoint/fluid"
)

// This file holds what the build needs of derivatives: the partial
// derivatives of the state variables at a fluid state, in the variables
// of each table, and the spline slopes of the properties the equation
// gives no derivatives of (cp, cv, w).

// variable is a state variable of a fluid phase.
type variable int8

const (
	vT variable = iota
	vRho
	vP
	vH
	vU
	vS
)

// tr returns (∂z/∂T)_ρ and (∂z/∂ρ)_T at the fluid state pr, from
//
//	(∂h/∂T)_ρ = cv + (∂p/∂T)_ρ/ρ,  (∂h/∂ρ)_T = ((∂p/∂ρ)_T − T(∂p/∂T)_ρ/ρ)/ρ,
//	(∂u/∂T)_ρ = cv,               (∂u/∂ρ)_T = (p − T(∂p/∂T)_ρ)/ρ²,
//	(∂s/∂T)_ρ = cv/T,             (∂s/∂ρ)_T = −(∂p/∂T)_ρ/ρ².
//
// (Building on package partial instead would evaluate the equation a
// second time at every node; the build has a time budget.)
func tr(pr *fluid.Props, z variable) (dT, dRho float64) {
	r := pr.Rho
	switch z {
	case vT:
		return 1, 0
	case vRho:
		return 0, 1
	case vP:
		return pr.DpDT, pr.DpDrho
	case vH:
		return pr.Cv + pr.DpDT/r, (pr.DpDrho - pr.T*pr.DpDT/r) / r
	case vU:
		return pr.Cv, (pr.P - pr.T*pr.DpDT) / (r * r)
	}
	return pr.Cv / pr.T, -pr.DpDT / (r * r)
}

// value returns z at pr.
func value(pr *fluid.Props, z variable) float64 {
	switch z {
	case vT:
		return pr.T
	case vRho:
		return pr.Rho
	case vP:
		return pr.P
	case vH:
		return pr.H
	case vU:
		return pr.U
	}
	return pr.S
}

// inAB returns (∂z/∂a)_b and (∂z/∂b)_a at pr, by the Jacobian of (a, b)
// in (T, ρ).
func inAB(pr *fluid.Props, z, a, b variable) (za, zb float64) {
	aT, aR := tr(pr, a)
	bT, bR := tr(pr, b)
	zT, zR := tr(pr, z)
	d := aT*bR - aR*bT
	return (zT*bR - zR*bT) / d, (aT*zR - aR*zT) / d
}

// along returns dz/dt along a curve through pr whose direction in the
// (T, p) plane is (dT, dp) per unit t: with (∂z/∂T)_p = z_T − z_ρ p_T/p_ρ
// and (∂z/∂p)_T = z_ρ/p_ρ.
func along(pr *fluid.Props, z variable, dT, dp float64) float64 {
	zT, zR := tr(pr, z)
	return (zT-zR*pr.DpDT/pr.DpDrho)*dT + zR/pr.DpDrho*dp
}

// slopes sets out[i] to the derivative at node i of the cubic spline
// through (xs, ys): twice continuously differentiable, with the end
// slopes of the cubic through the first and the last four nodes (two
// nodes: the line; three: the parabola). It solves the tridiagonal system
// of the slopes directly (a general banded solver would factorise a
// dense matrix).
func slopes(xs, ys, out []float64) {
	n := len(xs)
	switch n {
	case 2:
		d := (ys[1] - ys[0]) / (xs[1] - xs[0])
		out[0], out[1] = d, d
		return
	case 3:
		for i := range 3 {
			out[i] = lagrangeSlope(xs, ys, i)
		}
		return
	}
	out[0] = lagrangeSlope(xs[:4], ys[:4], 0)
	out[n-1] = lagrangeSlope(xs[n-4:], ys[n-4:], 3)
	// h_i s_{i−1} + 2(h_{i−1} + h_i) s_i + h_{i−1} s_{i+1} = 3(h_i δ_{i−1} + h_{i−1} δ_i),
	// by the Thomas algorithm (the system is diagonally dominant).
	c := make([]float64, n)
	d := make([]float64, n)
	for i := 1; i < n-1; i++ {
		h0, h1 := xs[i]-xs[i-1], xs[i+1]-xs[i]
		d0, d1 := (ys[i]-ys[i-1])/h0, (ys[i+1]-ys[i])/h1
		a, bb, cc := h1, 2*(h0+h1), h0
		r := 3 * (h1*d0 + h0*d1)
		if i == 1 {
			r -= a * out[0]
			a = 0
		}
		if i == n-2 {
			r -= cc * out[n-1]
			cc = 0
		}
		m := bb - a*c[i-1]
		c[i] = cc / m
		d[i] = (r - a*d[i-1]) / m
	}
	for i := n - 2; i >= 1; i-- {
		out[i] = d[i] - c[i]*out[i+1]
	}
}

// lagrangeSlope returns the derivative at xs[k] of the polynomial
// through the points (xs, ys).
func lagrangeSlope(xs, ys []float64, k int) float64 {
	s := 0.0
	for j := range xs {
		if j == k {
			for m := range xs {
				if m != k {
					s += ys[k] / (xs[k] - xs[m])
				}
			}
			continue
		}
		num, den := 1.0, 1.0
		for m := range xs {
			if m != j && m != k {
				num *= xs[k] - xs[m]
			}
			if m != j {
				den *= xs[j] - xs[m]
			}
		}
		s += ys[j] * num / den
	}
	return s
}

// finite reports whether x is neither NaN nor ±Inf.
func finite(x float64) bool { return x-x == 0 }
