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

// checker compares evaluations with the term-by-term one and reports.
type checker struct {
	tb        testing.TB
	name      string
	tol, tiny float64
	fails     int
	worst     float64
	worstAt   string
}

// report checks one value against the term-by-term one.
func (c *checker) report(what string, p Point, got, want, mag float64) {
	dev := math.Abs(got - want)
	if mag*c.tol > c.tiny && dev/mag > c.worst {
		c.worst = dev / mag
		c.worstAt = fmt.Sprintf("%s at δ=%v τ=%v", what, p.Delta, p.Tau)
	}
	if !(dev <= c.tol*mag+c.tiny) {
		c.fails++
		if c.fails <= 10 {
			c.tb.Errorf("%s at δ=%v τ=%v: %s = %.17g, term by term %.17g (magnitude %.3g; deviation %.3g of it)",
				c.name, p.Delta, p.Tau, what, got, want, mag, dev/mag)
		}
	}
}

// derivs checks every field of got but DDD, and DDD where third is set
// (else it must be zero).
func (c *checker) derivs(prefix string, p Point, got, want, mag helmholtz.Derivs, third bool) {
	c.report(prefix+"A", p, got.A, want.A, mag.A)
	c.report(prefix+"D", p, got.D, want.D, mag.D)
	c.report(prefix+"DD", p, got.DD, want.DD, mag.DD)
	c.report(prefix+"T", p, got.T, want.T, mag.T)
	c.report(prefix+"TT", p, got.TT, want.TT, mag.TT)
	c.report(prefix+"DT", p, got.DT, want.DT, mag.DT)
	if third {
		c.report(prefix+"DDD", p, got.DDD, want.DDD, mag.DDD)
	} else if got.DDD != 0 {
		c.fails++
		c.tb.Errorf("%s at δ=%v τ=%v: %sDDD = %v, want 0", c.name, p.Delta, p.Tau, prefix, got.DDD)
	}
}

// done reports the totals and returns the largest deviation.
func (c *checker) done(n int) float64 {
	if c.fails > 10 {
		c.tb.Errorf("%s: %d deviations in all", c.name, c.fails)
	}
	c.tb.Logf("%s: largest deviation %.3g of the terms' magnitude (%s) over %d points", c.name, c.worst, c.worstAt, n)
	return c.worst
}

// CheckResidual compares r, compiled from terms, with the term-by-term
// evaluation at every point: Eval and EvalSecond (with DDD zero) in every
// derivative and an Isotherm in αʳ and its δ-derivatives (and the
// Isotherm with Eval), each within tol of the magnitude of the terms
// (Residual's) plus tiny, an absolute floor for derivatives whose terms
// all vanish. It returns the largest deviation found, in units of the
// magnitude.
func CheckResidual(tb testing.TB, name string, terms helmholtz.ResidualTerms, r *helmholtz.Residual,
	pts []Point, tol, tiny float64) (worst float64) {
	tb.Helper()
	c := checker{tb: tb, name: name, tol: tol, tiny: tiny}
	for _, p := range pts {
		want, mag := Residual(terms, p.Delta, p.Tau)
		got := r.Eval(p.Delta, p.Tau)
		c.derivs("", p, got, want, mag, true)
		c.derivs("EvalSecond ", p, r.EvalSecond(p.Delta, p.Tau), want, mag, false)
		it := r.Isotherm(p.Tau)
		iso := it.Eval(p.Delta)
		c.report("isotherm A", p, iso.A, want.A, mag.A)
		c.report("isotherm D", p, iso.D, want.D, mag.D)
		c.report("isotherm DD", p, iso.DD, want.DD, mag.DD)
		c.report("isotherm A against Eval", p, iso.A, got.A, mag.A)
		c.report("isotherm D against Eval", p, iso.D, got.D, mag.D)
		c.report("isotherm DD against Eval", p, iso.DD, got.DD, mag.DD)
	}
	return c.done(len(pts))
}

// CheckIdeal compares id, compiled from terms, with the term-by-term
// evaluation at every point, each derivative within tol of the magnitude
// of its terms. It returns the largest deviation found, in units of the
// magnitude.
func CheckIdeal(tb testing.TB, name string, terms helmholtz.IdealTerms, id *helmholtz.Ideal, pts []Point, tol float64) (worst float64) {
	tb.Helper()
	c := checker{tb: tb, name: name, tol: tol}
	for _, p := range pts {
		want, mag := Ideal(terms, p.Delta, p.Tau)
		c.derivs("", p, id.Eval(p.Delta, p.Tau), want, mag, true)
	}
	return c.done(len(pts))
}
