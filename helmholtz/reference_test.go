package helmholtz_test

import (
	"testing"

	"github.com/tripoint-thermo/tripoint/helmholtz"
	"github.com/tripoint-thermo/tripoint/internal/termwise"
)

// refTol bounds the deviation of the fast evaluation from the term-by-term
// one, relative to the magnitude of the terms weighted by their condition
// (internal/termwise): 8 ulp (2.2e-16 each). Each evaluation rounds every
// product of a term's contribution to an ulp or two of its weighted
// magnitude (powers by multiplication chains and roots against math.Pow,
// exponentials by two kernels within 0.51 and 1 ulp, the falling-factorial
// sums of the δ-derivatives without cancellation), so that the two differ
// by a few ulp; 8 leaves room for the sums. The largest deviations found
// are below 3 ulp.
const refTol = 8 * 0x1p-52

// refFloor is an absolute floor for results near the subnormal range,
// where products lose their relative precision: below 1e-300 a term is
// zero for every purpose of the equation.
const refFloor = 1e-300

// families are the test terms of helmholtz_test.go, with coefficients of
// our own (any values prove the evaluation), each family alone and all of
// them together.
var refFamilies = map[string]helmholtz.ResidualTerms{
	"power": {Power: []helmholtz.Power{
		{N: 0.7, D: 1, T: -0.5}, {N: -1.3, D: 2, T: 0.875}, {N: 0.4, D: 4, T: 1}, {N: 0.02, D: 3, T: 7},
		{N: 0.3, D: 5, T: 0.1}, // a t that is no multiple of 1/16: exp(t ln τ)
	}},
	"exponential": {Exponential: []helmholtz.Exponential{
		{N: 0.6, D: 1, T: 1.5, C: 1}, {N: -0.3, D: 4, T: 3, C: 2}, {N: 0.05, D: 7, T: 12.25, C: 3}, {N: -0.01, D: 3, T: 22, C: 6},
		{N: 0.2, D: 4, T: 3, C: 2}, {N: -0.1, D: 1, T: 1.5, C: 1},
	}},
	"gaussian": {Gaussian: []helmholtz.Gaussian{
		{N: -30, D: 3, T: 0, Alpha: 20, Beta: 150, Gamma: 1.21, Epsilon: 1},
		{N: 29, D: 3, T: 1, Alpha: 20, Beta: 150, Gamma: 1.21, Epsilon: 1},
		{N: 20, D: 2, T: 1, Alpha: 25, Beta: 325, Gamma: 1.16, Epsilon: 1},
		{N: 4, D: 1, T: 3.5, Alpha: 15, Beta: 275, Gamma: 1.25, Epsilon: 0.9},
	}},
	"nonanalytic": {NonAnalytic: []helmholtz.NonAnalytic{
		{N: -0.15, SmallA: 3.5, SmallB: 0.85, A: 0.32, B: 0.2, C: 28, D: 700, Beta: 0.3},
		{N: 0.32, SmallA: 3.5, SmallB: 0.95, A: 0.32, B: 0.2, C: 32, D: 800, Beta: 0.3},
		{N: 0.055, SmallA: 3.0, SmallB: 0.875, A: 0.7, B: 1.0, C: 12.5, D: 275, Beta: 0.3},
		{N: 0.04, SmallA: 3.25, SmallB: 0.9, A: 0.5, B: 0.5, C: 20, D: 300, Beta: 0.28},
	}},
}

// TestResidualReference proves Eval, EvalSecond and Isotherm against the
// term-by-term evaluation of internal/termwise over a dense (δ, τ) grid,
// the nonanalytic neighbourhood of δ = τ = 1 included.
func TestResidualReference(t *testing.T) {
	t.Parallel()
	all := helmholtz.ResidualTerms{}
	for _, f := range refFamilies {
		all.Power = append(all.Power, f.Power...)
		all.Exponential = append(all.Exponential, f.Exponential...)
		all.Gaussian = append(all.Gaussian, f.Gaussian...)
		all.NonAnalytic = append(all.NonAnalytic, f.NonAnalytic...)
	}
	n := 60
	if testing.Short() {
		n = 20
	}
	pts := termwise.Grid(1e-3, 4, n, 0.3, 3, n, true)
	cases := map[string]helmholtz.ResidualTerms{"all": all}
	for k, v := range refFamilies {
		cases[k] = v
	}
	for name, terms := range cases {
		r := helmholtz.MustNewResidual(terms)
		termwise.CheckResidual(t, name, terms, r, pts, refTol, refFloor)
	}
}

// TestIdealReference proves Ideal.Eval against the term-by-term
// evaluation.
func TestIdealReference(t *testing.T) {
	t.Parallel()
	terms := helmholtz.IdealTerms{
		A1: -8.3, A2: 6.7, LogTau: 3.0,
		Power:          []helmholtz.IdealPower{{N: 0.5, T: -0.5}, {N: -0.2, T: 1.75}, {N: 0.1, T: -0.75}, {N: 0.05, T: 0.3}},
		PlanckEinstein: []helmholtz.PlanckEinstein{{N: 0.97, Theta: 3.5}, {N: 0.012, Theta: 1.3}, {N: 0.25, Theta: 27.5}},
	}
	id := helmholtz.MustNewIdeal(terms)
	termwise.CheckIdeal(t, "ideal", terms, id, termwise.Grid(1e-6, 10, 40, 0.1, 4, 80, false), refTol)
}

// TestWithKernel: a kernel is used only with the terms it was generated
// from (the fingerprint), and then EvalSecond is the kernel.
func TestWithKernel(t *testing.T) {
	t.Parallel()
	r := helmholtz.MustNewResidual(refFamilies["power"])
	other := helmholtz.MustNewResidual(refFamilies["exponential"])
	marker, dmarker := helmholtz.Derivs{A: 42}, helmholtz.DeltaDerivs{A: 43}
	k := helmholtz.Kernel{Fingerprint: other.KernelFingerprint(),
		Second: func(delta, tau float64) helmholtz.Derivs { return marker },
		Delta:  func(delta, tau float64) helmholtz.DeltaDerivs { return dmarker }}
	if _, err := r.WithKernel(k); err == nil {
		t.Error("WithKernel accepted a kernel of other terms")
	}
	k.Fingerprint = r.KernelFingerprint()
	rk, err := r.WithKernel(k)
	if err != nil {
		t.Fatal(err)
	}
	if got := rk.EvalSecond(0.5, 1.2); got != marker {
		t.Errorf("EvalSecond with a kernel = %+v, want the kernel's %+v", got, marker)
	}
	if it := rk.Isotherm(1.2); it.Eval(0.5) != dmarker {
		t.Errorf("Isotherm.Eval with a kernel = %+v, want the kernel's %+v", it.Eval(0.5), dmarker)
	}
	if got, want := rk.Eval(0.5, 1.2), r.Eval(0.5, 1.2); got != want {
		t.Errorf("Eval with a kernel = %+v, want the tables' %+v", got, want)
	}
	if r.EvalSecond(0.5, 1.2) == marker {
		t.Error("WithKernel changed the Residual it was called on")
	}
}
