package helmholtz

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/diff/fd"
	"gonum.org/v1/gonum/floats/scalar"
)

// Test terms: shapes of the published families with coefficients of our
// own (any values prove the derivatives).
var families = map[string]ResidualTerms{
	"power": {Power: []Power{
		{N: 0.7, D: 1, T: -0.5}, {N: -1.3, D: 2, T: 0.875}, {N: 0.4, D: 4, T: 1}, {N: 0.02, D: 3, T: 7},
	}},
	"exponential": {Exponential: []Exponential{
		{N: 0.6, D: 1, T: 1.5, C: 1}, {N: -0.3, D: 4, T: 3, C: 2}, {N: 0.05, D: 7, T: 12.25, C: 3}, {N: -0.01, D: 3, T: 22, C: 6},
	}},
	"gaussian": {Gaussian: []Gaussian{
		{N: -30, D: 3, T: 0, Alpha: 20, Beta: 150, Gamma: 1.21, Epsilon: 1},
		{N: 20, D: 2, T: 1, Alpha: 25, Beta: 325, Gamma: 1.16, Epsilon: 1},
		{N: 4, D: 1, T: 3.5, Alpha: 15, Beta: 275, Gamma: 1.25, Epsilon: 0.9},
	}},
	"nonanalytic": {NonAnalytic: []NonAnalytic{
		{N: -0.15, SmallA: 3.5, SmallB: 0.85, A: 0.32, B: 0.2, C: 28, D: 700, Beta: 0.3},
		{N: 0.32, SmallA: 3.5, SmallB: 0.95, A: 0.32, B: 0.2, C: 32, D: 800, Beta: 0.3},
		{N: 0.055, SmallA: 3.0, SmallB: 0.875, A: 0.7, B: 1.0, C: 12.5, D: 275, Beta: 0.3},
	}},
}

// central4 is the fourth-order central difference for a first derivative.
var central4 = fd.Formula{
	Stencil:    []fd.Point{{Loc: -2, Coeff: 1.0 / 12}, {Loc: -1, Coeff: -8.0 / 12}, {Loc: 1, Coeff: 8.0 / 12}, {Loc: 2, Coeff: -1.0 / 12}},
	Derivative: 1,
	Step:       1e-4,
}

type point struct{ delta, tau float64 }

func testPoints(nonanalytic bool) []point {
	rng := rand.New(rand.NewPCG(1, 2))
	var pts []point
	for range 40 {
		pts = append(pts, point{0.05 + 3*rng.Float64(), 0.4 + 2.5*rng.Float64()})
	}
	if nonanalytic {
		// Close to, but not at, the critical point, on both sides of it.
		for _, dd := range []float64{-0.2, -0.03, -2e-3, 2e-3, 0.03, 0.2} {
			for _, dt := range []float64{-0.05, -2e-3, 2e-3, 0.05} {
				pts = append(pts, point{1 + dd, 1 + dt})
			}
		}
		// On the critical isotherm θ varies on the scale A|δ−1|^(1/β),
		// which a difference in τ resolves only for |δ−1| ≳ 0.03.
		for _, dd := range []float64{-0.2, -0.03, 0.03, 0.2} {
			pts = append(pts, point{1 + dd, 1})
		}
	}
	return pts
}

// checkDerivs compares the analytic derivatives of eval with central
// differences of the next-lower ones.
func checkDerivs(t *testing.T, name string, eval func(d, t float64) Derivs, pts []point) {
	t.Helper()
	for _, p := range pts {
		got := eval(p.delta, p.tau)
		// Near δ = τ = 1 the nonanalytic terms vary on the scale of
		// |δ−1| in δ and of θ = (1−τ) + A|δ−1|^(1/β) in τ.
		x := math.Abs(p.delta - 1)
		hd := math.Min(1e-4, 1e-2*x)
		ht := math.Min(1e-4, 1e-3*(math.Abs(p.tau-1)+0.3*math.Pow(x, 1/0.3)))
		dDelta := func(f func(Derivs) float64) float64 {
			return fd.Derivative(func(x float64) float64 { return f(eval(x, p.tau)) }, p.delta,
				&fd.Settings{Formula: central4, Step: hd})
		}
		dTau := func(f func(Derivs) float64) float64 {
			return fd.Derivative(func(x float64) float64 { return f(eval(p.delta, x)) }, p.tau,
				&fd.Settings{Formula: central4, Step: ht})
		}
		cases := []struct {
			what      string
			analytic  float64
			numerical float64
		}{
			{"D", got.D, dDelta(func(d Derivs) float64 { return d.A })},
			{"DD", got.DD, dDelta(func(d Derivs) float64 { return d.D })},
			{"DDD", got.DDD, dDelta(func(d Derivs) float64 { return d.DD })},
			{"T", got.T, dTau(func(d Derivs) float64 { return d.A })},
			{"TT", got.TT, dTau(func(d Derivs) float64 { return d.T })},
			{"DT", got.DT, dTau(func(d Derivs) float64 { return d.D })},
			{"TD", got.DT, dDelta(func(d Derivs) float64 { return d.T })},
		}
		for _, c := range cases {
			scale := math.Abs(got.A) + math.Abs(got.D) + math.Abs(got.T) + math.Abs(c.analytic) + 1e-12
			if !scalar.EqualWithinAbsOrRel(c.analytic, c.numerical, 1e-6*scale, 1e-6) {
				t.Errorf("%s at δ=%g τ=%g: %s analytic %.12g, numerical %.12g", name, p.delta, p.tau, c.what, c.analytic, c.numerical)
			}
		}
	}
}

func TestResidualDerivatives(t *testing.T) {
	t.Parallel()
	for name, terms := range families {
		r := MustNewResidual(terms)
		checkDerivs(t, name, r.Eval, testPoints(len(terms.NonAnalytic) > 0))
	}
}

func TestIdealDerivatives(t *testing.T) {
	t.Parallel()
	id := MustNewIdeal(IdealTerms{
		A1: -8.3, A2: 6.7, LogTau: 3.0,
		Power:          []IdealPower{{N: 0.5, T: -0.5}, {N: -0.2, T: 1.75}},
		PlanckEinstein: []PlanckEinstein{{N: 0.97, Theta: 3.5}, {N: 0.012, Theta: 1.3}, {N: 0.25, Theta: 27.5}},
	})
	checkDerivs(t, "ideal", id.Eval, testPoints(false))
	// EvalPair is two calls of Eval, bit for bit.
	for _, p := range testPoints(false) {
		d1, d2 := id.EvalPair(p.delta, 2.5*p.delta, p.tau)
		if d1 != id.Eval(p.delta, p.tau) || d2 != id.Eval(2.5*p.delta, p.tau) {
			t.Errorf("EvalPair(%v, %v, %v) = %+v, %+v; Eval gives %+v, %+v", p.delta, 2.5*p.delta, p.tau,
				d1, d2, id.Eval(p.delta, p.tau), id.Eval(2.5*p.delta, p.tau))
		}
	}
}

// TestCriticalPoint checks the nonanalytic terms at δ = τ = 1 exactly: an
// infinite TT of the dominant term's sign, every other value finite, and
// finite values 1e-12 away on every side.
func TestCriticalPoint(t *testing.T) {
	t.Parallel()
	r := MustNewResidual(families["nonanalytic"])
	d := r.Eval(1, 1)
	if !math.IsInf(d.TT, -1) { // the b = 0.85 term has n < 0
		t.Errorf("TT at the critical point = %g, want -Inf", d.TT)
	}
	for _, v := range []float64{d.A, d.D, d.DD, d.DDD, d.T, d.DT} {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			t.Errorf("non-finite derivative at the critical point: %+v", d)
		}
	}
	for _, p := range []point{{1 + 1e-12, 1}, {1 - 1e-12, 1}, {1, 1 + 1e-12}, {1, 1 - 1e-12}, {1 + 1e-12, 1 - 1e-12}} {
		e := r.Eval(p.delta, p.tau)
		for _, v := range []float64{e.A, e.D, e.DD, e.DDD, e.T, e.TT, e.DT} {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				t.Errorf("non-finite derivative at δ=%v τ=%v: %+v", p.delta, p.tau, e)
			}
		}
		if e.TT >= 0 {
			t.Errorf("TT at δ=%v τ=%v = %g, want large negative", p.delta, p.tau, e.TT)
		}
	}
}

// TestDeltaLimits compares the δ → 0 limits with evaluations at small δ.
func TestDeltaLimits(t *testing.T) {
	t.Parallel()
	all := ResidualTerms{}
	for _, f := range families {
		all.Power = append(all.Power, f.Power...)
		all.Exponential = append(all.Exponential, f.Exponential...)
		all.Gaussian = append(all.Gaussian, f.Gaussian...)
		all.NonAnalytic = append(all.NonAnalytic, f.NonAnalytic...)
	}
	r := MustNewResidual(all)
	for _, tau := range []float64{0.5, 0.9, 1, 1.3, 2.7} {
		d, dd := r.DeltaLimits(tau)
		// Quadratic extrapolation of α_δ(h) and α_δδ(h) to h = 0.
		h := 1e-5
		e1, e2, e3 := r.Eval(h, tau), r.Eval(2*h, tau), r.Eval(3*h, tau)
		d0 := 3*e1.D - 3*e2.D + e3.D
		dd0 := 3*e1.DD - 3*e2.DD + e3.DD
		if !scalar.EqualWithinAbsOrRel(d, d0, 1e-7, 1e-7) {
			t.Errorf("τ=%g: lim α_δ = %.12g, extrapolated %.12g", tau, d, d0)
		}
		if !scalar.EqualWithinAbsOrRel(dd, dd0, 1e-5, 1e-5) {
			t.Errorf("τ=%g: lim α_δδ = %.12g, extrapolated %.12g", tau, dd, dd0)
		}
	}
}

func TestNewResidualRejects(t *testing.T) {
	t.Parallel()
	bad := []ResidualTerms{
		{Power: []Power{{N: math.NaN(), D: 1, T: 1}}},
		{Power: []Power{{N: 1, D: 0, T: 1}}},
		{Exponential: []Exponential{{N: 1, D: 1, T: 1, C: 0}}},
		{Gaussian: []Gaussian{{N: 1, D: 0}}},
		{NonAnalytic: []NonAnalytic{{N: 1, SmallA: 3.5, SmallB: 0.85, Beta: 0.4}}},
	}
	for i, b := range bad {
		if _, err := NewResidual(b); err == nil {
			t.Errorf("case %d: no error for %+v", i, b)
		}
	}
}
