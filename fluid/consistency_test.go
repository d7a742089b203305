package fluid

import (
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

// checkConsistency compares the properties Props gives at (T, ρ) with
// fourth-order central differences of its own values, for any state,
// stable or not (the identities hold for every (T, ρ); the values are
// taken without Props's checks):
//
//	p = ρ² (∂f/∂ρ)_T, s = −(∂f/∂T)_ρ, cv = (∂u/∂T)_ρ = T (∂s/∂T)_ρ
//	(∂p/∂ρ)_T, (∂p/∂T)_ρ; Maxwell: (∂s/∂ρ)_T = −(∂p/∂T)_ρ/ρ²
//	(∂u/∂ρ)_T = (p − T(∂p/∂T)_ρ)/ρ²
//	cp = (∂h/∂T)_p = (∂h/∂T)_ρ − (∂h/∂ρ)_T (∂p/∂T)_ρ/(∂p/∂ρ)_T
//	cp − cv = T (∂p/∂T)²_ρ/(ρ² (∂p/∂ρ)_T), κT = 1/(ρ(∂p/∂ρ)_T), β = κT (∂p/∂T)_ρ
//	w² = (∂p/∂ρ)_s = (∂p/∂ρ)_T − (∂p/∂T)_ρ (∂s/∂ρ)_T/(∂s/∂T)_ρ
//	μJT = (∂T/∂p)_h
//	h = u + p/ρ, g = h − Ts, f = u − Ts, Z = p/(ρRT)
//
// The quantities that divide by (∂p/∂ρ)_T (cp, w², μJT, κT, β) are
// compared only where the state is mechanically and thermally stable and
// not within 1 % of a spinodal, where the quotient of differences is
// ill-conditioned. Steps are 1e-4 relative, smaller near the critical
// point, where the nonanalytic terms vary on the scales of
// θ = (1−τ) + A|δ−1|^(1/β) in τ and of max(|δ−1|, |τ−1|^β) in δ
// (A ≈ 0.7, β ≈ 0.3 for both water and CO2). A difference quotient of a
// wrong analytic expression would disagree at the size of the error; the
// tolerance is 1e-7 of each quantity's scale.
func checkConsistency(t *testing.T, f *Fluid, T, rho float64) {
	t.Helper()
	p := f.props(T, rho)
	x, y := math.Abs(rho/f.rhoc-1), math.Abs(f.tc/T-1)
	stepT := T * math.Min(1e-4, 1e-2*(y+0.7*math.Pow(x, 1/0.3)))
	stepR := rho * math.Min(1e-4, 1e-2*math.Max(x, math.Pow(y/0.7, 0.3)))
	dT := func(get func(Props) float64) float64 {
		return fd.Derivative(func(x float64) float64 { return get(f.props(x, rho)) }, T,
			&fd.Settings{Formula: central4, Step: stepT})
	}
	dR := func(get func(Props) float64) float64 {
		return fd.Derivative(func(x float64) float64 { return get(f.props(T, x)) }, rho,
			&fd.Settings{Formula: central4, Step: stepR})
	}
	P := func(q Props) float64 { return q.P }
	U := func(q Props) float64 { return q.U }
	H := func(q Props) float64 { return q.H }
	S := func(q Props) float64 { return q.S }
	F := func(q Props) float64 { return q.F }
	pT, pR := dT(P), dR(P)
	hT, hR := dT(H), dR(H)
	sT, sR := dT(S), dR(S)
	R := f.GasConstant()
	rt := R * T
	type check struct {
		what      string
		got, want float64
		scale     float64 // absolute floor of the comparison
	}
	cases := []check{
		{"(dp/drho)_T", p.DpDrho, pR, rt},
		{"(dp/dT)_rho", p.DpDT, pT, rho * R},
		{"cv = (du/dT)_rho", p.Cv, dT(U), R},
		{"cv = T (ds/dT)_rho", p.Cv, T * sT, R},
		{"Maxwell (ds/drho)_T", sR, -p.DpDT / (rho * rho), R / rho},
		{"p = rho^2 (df/drho)_T", p.P, rho * rho * dR(F), rho * rt},
		{"s = -(df/dT)_rho", p.S, -dT(F), R},
		{"(du/drho)_T", dR(U), (p.P - T*p.DpDT) / (rho * rho), rt / rho},
		{"h = u + p/rho", p.H, p.U + p.P/rho, rt},
		{"g = h - Ts", p.G, p.H - T*p.S, rt},
		{"f = u - Ts", p.F, p.U - T*p.S, rt},
		{"Z = p/(rho R T)", p.Z, p.P / (rho * rt), 1},
	}
	if p.DpDrho > 1e-2*rt && p.Cv > 0 {
		cases = append(cases,
			check{"cp = (dh/dT)_p", p.Cp, hT - hR*pT/pR, R},
			check{"w^2 = (dp/drho)_s", p.W * p.W, pR - pT*sR/sT, rt},
			check{"mu_JT = (dT/dp)_h", p.JouleThomson, hR / (hR*pT - hT*pR), 1 / (rho * R)},
			check{"cp - cv", p.Cp - p.Cv, T * pT * pT / (rho * rho * pR), R},
			check{"kappa_T", p.KappaT, 1 / (rho * pR), 1 / (rho * rt)},
			check{"expansivity", p.Expansivity, pT / (rho * pR), 1 / T},
		)
	}
	for _, c := range cases {
		if d := math.Abs(c.got - c.want); !(d <= 1e-7*math.Max(math.Abs(c.want), c.scale)) {
			t.Errorf("%s T = %v K, rho = %v kg/m3: %s: %.12g vs %.12g (rel %.2g)",
				f.Name(), T, rho, c.what, c.got, c.want, d/math.Max(math.Abs(c.want), c.scale))
		}
	}
}

// TestConsistency runs checkConsistency over a grid of states of every
// fluid: compressed and supercooled liquid, vapour, supercritical fluid,
// extrapolated states and the metastable and unstable states between the
// saturated densities.
func TestConsistency(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		name   string
		states func(*Fluid) [][2]float64
	}{
		{"water", consistencyStates},
		{"CO2", func(*Fluid) [][2]float64 { return co2States }},
		{"R134a", r134aGrid},
	} {
		f, err := Lookup(c.name)
		if err != nil {
			t.Fatal(err)
		}
		n := 0
		for _, s := range c.states(f) {
			// Keep the stencil inside the accepted pressures: deep inside
			// the two-phase region the equations reach ±1e20 Pa. On
			// δ = 1 exactly the |δ−1|^(1/β) of the nonanalytic terms makes
			// differences in ρ converge only like h^(4/3): left out
			// (TestWaterAtCritical and TestCO2AtCritical cover it).
			if math.Abs(f.props(s[0], s[1]).P) > f.limits.PCeil || s[1] == f.rhoc {
				continue
			}
			checkConsistency(t, f, s[0], s[1])
			n++
		}
		if n < 20 {
			t.Errorf("%s: only %d states checked", c.name, n)
		}
	}
}
