package fluid

import (
	"testing"

	"github.com/tripoint-thermo/tripoint/helmholtz"
	"github.com/tripoint-thermo/tripoint/internal/termwise"
)

// evalTol bounds the deviation of helmholtz's fast evaluation of the
// published equations from the term-by-term one of internal/termwise,
// relative to the magnitude of the terms weighted by their condition: 8
// ulp, for the reasons given at refTol in helmholtz/reference_test.go.
const evalTol = 8 * 0x1p-52

// evalFloor is an absolute floor for results near the subnormal range.
const evalFloor = 1e-300

// TestEvaluationReference proves the evaluation of every fluid's equation
// (Residual.Eval and EvalSecond, the Isotherm of the density and
// saturation solvers, Ideal.Eval) against a plain term-by-term evaluation
// with math.Pow and math.Exp over a dense (δ, τ) grid of its whole
// accepted region (δ from 1e-6 to RhoCeil/ρc, T from TFloor to TCeil),
// the nonanalytic neighbourhood of δ = τ = 1 included.
func TestEvaluationReference(t *testing.T) {
	t.Parallel()
	terms := map[string]helmholtz.ResidualTerms{"CO2": co2Residual, "water": waterResidual, "R134a": r134aResidual}
	n := 80
	if testing.Short() {
		n = 25
	}
	for _, f := range allFluids(t) {
		l := f.Limits()
		pts := termwise.Grid(1e-6, l.RhoCeil/f.rhoc, n, f.tc/l.TCeil, f.tc/l.TFloor, n, true)
		rt, ok := terms[f.name]
		if !ok {
			t.Fatalf("no terms for %s", f.name)
		}
		termwise.CheckResidual(t, f.name, rt, f.resid, pts, evalTol, evalFloor)
		termwise.CheckIdeal(t, f.name+" ideal", f.ideal.Terms(), f.ideal, pts, evalTol)
	}
}
