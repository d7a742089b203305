package fluid

import (
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/diff/fd"
)

// central4 is the fourth-order central difference for a first derivative.
var central4 = fd.Formula{
	Stencil:    []fd.Point{{Loc: -2, Coeff: 1.0 / 12}, {Loc: -1, Coeff: -8.0 / 12}, {Loc: 1, Coeff: 8.0 / 12}, {Loc: 2, Coeff: -1.0 / 12}},
	Derivative: 1,
	Step:       1e-4,
}

// deriv returns dg/dx at x by central4 with a step relative to x.
func deriv(g func(float64) float64, x, rel float64) float64 {
	return fd.Derivative(g, x, &fd.Settings{Formula: central4, Step: rel * x})
}

// consistencyStates: a grid over the accepted region — compressed and
// supercooled liquid, vapour, supercritical fluid and the metastable and
// unstable states between the saturated densities — that keeps clear of
// the critical point, where the derivatives vary faster than a difference
// step can follow (TestWaterAtCritical covers it).
func consistencyStates(f *Fluid) [][2]float64 {
	tc, rhoc := f.Reducing()
	var s [][2]float64
	for _, T := range []float64{210, 260, 273.16, 300, 373.15, 450, 550, 620, 640, 660, 700, 900, 1273, 2000, 4000} {
		for _, rho := range []float64{1e-4, 0.05, 1, 10, 50, 150, 250, 322, 400, 500, 700, 900, 1000, 1100, 1250} {
			if math.Abs(T/tc-1) < 0.05 && math.Abs(rho/rhoc-1) < 0.3 {
				continue
			}
			s = append(s, [2]float64{T, rho})
		}
	}
	return s
}

// TestConsistency checks every property of Props against derivatives of
// the others by finite differences, with fourth-order central differences
// of step 1e-4 relative (truncation and rounding both near 1e-11 of the
// scale):
//
//	p = ρ² (∂f/∂ρ)_T, s = −(∂f/∂T)_ρ, cv = (∂u/∂T)_ρ = T (∂s/∂T)_ρ
//	(∂p/∂ρ)_T, (∂p/∂T)_ρ; Maxwell: (∂s/∂ρ)_T = −(∂p/∂T)_ρ/ρ²
//	cp = (∂h/∂T)_p = (∂h/∂T)_ρ − (∂h/∂ρ)_T (∂p/∂T)_ρ/(∂p/∂ρ)_T
//	cp − cv = T β²/(ρ κT), κT = 1/(ρ(∂p/∂ρ)_T), β = κT (∂p/∂T)_ρ
//	w² = (∂p/∂ρ)_s = (∂p/∂ρ)_T − (∂p/∂T)_ρ (∂s/∂ρ)_T/(∂s/∂T)_ρ
//	μJT = −(∂h/∂p)_T/cp = −(∂h/∂ρ)_T/((∂p/∂ρ)_T cp)
//	h = u + p/ρ, g = h − Ts, f = u − Ts, Z = p/(ρRT)
//
// A difference quotient of a wrong analytic expression would disagree at
// the size of the error; the tolerance is 1e-7 of each quantity's scale.
func TestConsistency(t *testing.T) {
	t.Parallel()
	f := water(t)
	R := f.GasConstant()
	const rel, tol = 1e-4, 1e-7
	n := 0
	for _, st := range consistencyStates(f) {
		T, rho := st[0], st[1]
		p, err := f.Props(T, rho)
		if err != nil && !errors.Is(err, ErrUnstable) {
			continue // above the pressure ceiling
		}
		// Inside the spinodal the equation reaches pressures above the
		// ceiling next to accepted states: skip the states whose
		// difference stencil leaves the accepted region.
		outside := false
		props := func(T, rho float64) Props {
			q, err := f.Props(T, rho)
			if err != nil && !errors.Is(err, ErrUnstable) {
				outside = true
			}
			return q
		}
		inT := func(get func(Props) float64) float64 {
			return deriv(func(x float64) float64 { return get(props(x, rho)) }, T, rel)
		}
		inRho := func(get func(Props) float64) float64 {
			return deriv(func(x float64) float64 { return get(props(T, x)) }, rho, rel)
		}
		fT, fR := inT(func(q Props) float64 { return q.F }), inRho(func(q Props) float64 { return q.F })
		pT, pR := inT(func(q Props) float64 { return q.P }), inRho(func(q Props) float64 { return q.P })
		sT, sR := inT(func(q Props) float64 { return q.S }), inRho(func(q Props) float64 { return q.S })
		uT := inT(func(q Props) float64 { return q.U })
		hT, hR := inT(func(q Props) float64 { return q.H }), inRho(func(q Props) float64 { return q.H })
		if outside {
			continue
		}
		n++

		rt := R * T
		kT := 1 / (rho * pR)
		beta := kT * pT
		cp := hT - hR*pT/pR
		for _, c := range []struct {
			name      string
			got, want float64
			scale     float64 // floor of the tolerance
		}{
			{"p = rho^2 (df/drho)_T", p.P, rho * rho * fR, rho * rt},
			{"s = -(df/dT)_rho", p.S, -fT, R},
			{"cv = (du/dT)_rho", p.Cv, uT, R},
			{"cv = T (ds/dT)_rho", p.Cv, T * sT, R},
			{"(dp/drho)_T", p.DpDrho, pR, rt},
			{"(dp/dT)_rho", p.DpDT, pT, rho * R},
			{"Maxwell (ds/drho)_T", sR, -p.DpDT / (rho * rho), R / rho},
			{"cp = (dh/dT)_p", p.Cp, cp, p.Cv},
			{"cp - cv = T beta^2/(rho kappaT)", p.Cp - p.Cv, T * beta * beta / (rho * kT), p.Cp},
			{"kappaT", p.KappaT * p.DpDrho * rho, kT * p.DpDrho * rho, 1},
			{"beta", p.Expansivity, beta, math.Abs(p.KappaT * rho * R)},
			// Props returns W = 0 where w² < 0: in unstable states, and in
			// extrapolated liquid below about 250 K, where the equation's
			// cv is negative.
			{"w^2 = (dp/drho)_s", p.W * p.W, math.Max(pR-pT*sR/sT, 0), rt},
			{"JouleThomson", p.JouleThomson, -hR / (pR * cp), 1 / (rho * p.Cp)},
			{"h = u + p/rho", p.H, p.U + p.P/rho, rt},
			{"g = h - Ts", p.G, p.H - T*p.S, rt},
			{"f = u - Ts", p.F, p.U - T*p.S, rt},
			{"Z = p/(rho R T)", p.Z, p.P / (rho * rt), 1},
		} {
			if d := math.Abs(c.got - c.want); d > tol*math.Max(math.Abs(c.want), c.scale) {
				t.Errorf("T = %v K, rho = %v kg/m3: %s: %.12g vs %.12g (rel %.2g)",
					T, rho, c.name, c.got, c.want, d/math.Max(math.Abs(c.want), c.scale))
			}
		}
	}
	t.Logf("%d states checked", n)
	if n < 150 {
		t.Errorf("only %d states checked", n)
	}
}
