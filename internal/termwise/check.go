package termwise

import (
	"fmt"
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/helmholtz"
)

// Point is a (δ, τ).
type Point struct{ Delta, Tau float64 }

// Grid returns the points of a dense grid: n δ log-spaced over
// [dlo, dhi] and m τ evenly spaced over [tlo, thi], with, where near is
// set, the nonanalytic neighbourhood of δ = τ = 1: δ and τ at 1 ± 10^-k
// (k = 1..8) against each other and against the grid, τ = 1 exactly
// against every δ ≠ 1, and δ = 1 exactly against every τ ≠ 1.
func Grid(dlo, dhi float64, n int, tlo, thi float64, m int, near bool) []Point {
	var ds, ts []float64
	for i := range n {
		ds = append(ds, dlo*math.Pow(dhi/dlo, float64(i)/float64(n-1)))
	}
	for j := range m {
		ts = append(ts, tlo+(thi-tlo)*float64(j)/float64(m-1))
	}
	var pts []Point
	for _, d := range ds {
		for _, t := range ts {
			pts = append(pts, Point{d, t})
		}
	}
	if near {
		var ones []float64
		for k := 1; k <= 8; k++ {
			h := math.Pow(10, -float64(k))
			ones = append(ones, 1-h, 1+h)
		}
		for _, a := range ones {
			for _, b := range ones {
				pts = append(pts, Point{a, b})
			}
			for _, t := range ts {
				pts = append(pts, Point{a, t})
			}
			for _, d := range ds {
				pts = append(pts, Point{d, a})
			}
			pts = append(pts, Point{a, 1}, Point{1, a})
		}
	}
	return pts
}

// CheckResidual compares r, compiled from terms, with the term-by-term
// evaluation at every point: Eval and EvalSecond (with DDD zero) in every
// derivative and an Isotherm in αʳ and its δ-derivatives (and the
// Isotherm with Eval), each within tol of the
// magnitude of the terms (Residual's) plus tiny, an absolute floor for
// derivatives whose terms all vanish. It returns the largest deviation
// found, in units of the magnitude.
func CheckResidual(tb testing.TB, name string, terms helmholtz.ResidualTerms, r *helmholtz.Residual,
	pts []Point, tol, tiny float64) (worst float64) {
	tb.Helper()
	fails := 0
	var worstAt string
	report := func(what string, p Point, got, want, mag float64) {
		dev := math.Abs(got - want)
		if mag*tol > tiny && dev/mag > worst {
			worst = dev / mag
			worstAt = fmt.Sprintf("%s at δ=%v τ=%v", what, p.Delta, p.Tau)
		}
		if !(dev <= tol*mag+tiny) {
			fails++
			if fails <= 10 {
				tb.Errorf("%s at δ=%v τ=%v: %s = %.17g, term by term %.17g (magnitude %.3g; deviation %.3g of it)",
					name, p.Delta, p.Tau, what, got, want, mag, dev/mag)
			}
		}
	}
	for _, p := range pts {
		want, mag := Residual(terms, p.Delta, p.Tau)
		got := r.Eval(p.Delta, p.Tau)
		for _, c := range []struct {
			what           string
			got, want, mag float64
		}{
			{"A", got.A, want.A, mag.A}, {"D", got.D, want.D, mag.D}, {"DD", got.DD, want.DD, mag.DD},
			{"DDD", got.DDD, want.DDD, mag.DDD}, {"T", got.T, want.T, mag.T}, {"TT", got.TT, want.TT, mag.TT},
			{"DT", got.DT, want.DT, mag.DT},
		} {
			report(c.what, p, c.got, c.want, c.mag)
		}
		sec := r.EvalSecond(p.Delta, p.Tau)
		for _, c := range []struct {
			what           string
			got, want, mag float64
		}{
			{"EvalSecond A", sec.A, want.A, mag.A}, {"EvalSecond D", sec.D, want.D, mag.D},
			{"EvalSecond DD", sec.DD, want.DD, mag.DD}, {"EvalSecond T", sec.T, want.T, mag.T},
			{"EvalSecond TT", sec.TT, want.TT, mag.TT}, {"EvalSecond DT", sec.DT, want.DT, mag.DT},
		} {
			report(c.what, p, c.got, c.want, c.mag)
		}
		if sec.DDD != 0 {
			fails++
			tb.Errorf("%s at δ=%v τ=%v: EvalSecond DDD = %v, want 0", name, p.Delta, p.Tau, sec.DDD)
		}
		it := r.Isotherm(p.Tau)
		iso := it.Eval(p.Delta)
		report("isotherm A", p, iso.A, want.A, mag.A)
		report("isotherm D", p, iso.D, want.D, mag.D)
		report("isotherm DD", p, iso.DD, want.DD, mag.DD)
		report("isotherm A against Eval", p, iso.A, got.A, mag.A)
		report("isotherm D against Eval", p, iso.D, got.D, mag.D)
		report("isotherm DD against Eval", p, iso.DD, got.DD, mag.DD)
	}
	if fails > 10 {
		tb.Errorf("%s: %d deviations in all", name, fails)
	}
	tb.Logf("%s: largest deviation %.3g of the terms' magnitude (%s) over %d points", name, worst, worstAt, len(pts))
	return worst
}

// CheckIdeal compares id, compiled from terms, with the term-by-term
// evaluation at every point, each derivative within tol of the magnitude
// of its terms. It returns the largest deviation found, in units of the
// magnitude.
func CheckIdeal(tb testing.TB, name string, terms helmholtz.IdealTerms, id *helmholtz.Ideal, pts []Point, tol float64) (worst float64) {
	tb.Helper()
	fails := 0
	for _, p := range pts {
		want, mag := Ideal(terms, p.Delta, p.Tau)
		got := id.Eval(p.Delta, p.Tau)
		for _, c := range []struct {
			what           string
			got, want, mag float64
		}{
			{"A", got.A, want.A, mag.A}, {"D", got.D, want.D, mag.D}, {"DD", got.DD, want.DD, mag.DD},
			{"DDD", got.DDD, want.DDD, mag.DDD}, {"T", got.T, want.T, mag.T}, {"TT", got.TT, want.TT, mag.TT},
			{"DT", got.DT, want.DT, mag.DT},
		} {
			dev := math.Abs(c.got - c.want)
			if c.mag > 0 {
				worst = max(worst, dev/c.mag)
			}
			if !(dev <= tol*c.mag) {
				fails++
				if fails <= 10 {
					tb.Errorf("%s at δ=%v τ=%v: %s = %.17g, term by term %.17g (magnitude %.3g)",
						name, p.Delta, p.Tau, c.what, c.got, c.want, c.mag)
				}
			}
		}
	}
	return worst
}
