package flash

import (
	"math"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// This file classifies states against the solid regions. Until the solid
// models exist (package sublimation), the boundaries are the published
// sublimation and melting curves of each fluid (DESIGN.md).

// curves are a fluid's published solid-boundary curves.
type curves struct {
	f                  *fluid.Fluid
	tt, pt             float64
	hasSub, hasMelt    bool
	subLo, subHi       float64
	meltLo, meltHi     float64
	anomalous          bool    // the melting pressure falls with T (water: ice Ih)
	pMeltEnd           float64 // the melting curve's pressure at its far end from the triple point
	solidModelExpected bool    // the fluid has solid data (RhoSolid > 0)
}

func curvesOf(f *fluid.Fluid) curves {
	tp := f.Triple()
	c := curves{f: f, tt: tp.T, pt: tp.P, solidModelExpected: tp.RhoSolid > 0}
	c.subLo, c.subHi = f.AuxSublimationRange()
	c.meltLo, c.meltHi = f.AuxMeltingRange()
	c.hasSub, c.hasMelt = c.subHi > 0, c.meltHi > 0
	if c.hasMelt {
		// The end of the curve away from the triple point tells its
		// slope (it starts at about pt).
		if c.meltHi > c.tt {
			c.pMeltEnd, _ = f.AuxMeltingPressure(c.meltHi)
		} else {
			c.anomalous = true
			c.pMeltEnd, _ = f.AuxMeltingPressure(c.meltLo)
		}
	}
	return c
}

// psub and pmelt evaluate the curves, with T held inside their ranges
// (a temperature a rounding error outside is at the end).
func (c *curves) psub(T float64) float64 {
	p, _ := c.f.AuxSublimationPressure(min(max(T, c.subLo), c.subHi))
	return p
}

func (c *curves) pmelt(T float64) float64 {
	p, _ := c.f.AuxMeltingPressure(min(max(T, c.meltLo), c.meltHi))
	return p
}

// region is the outcome of a classification.
type region int8

const (
	regionFluid  region = iota
	regionSolid         // solid, or solid in equilibrium with a fluid
	regionBeyond        // outside every model (other ices, below the curves' range)
)

// classify places (T, p) against the solid curves. For a fluid state it
// reports whether it lies exactly on a solid boundary (onCurve).
func (c *curves) classify(T, p float64) (r region, onCurve bool, why string) {
	if T < c.tt && T < c.tt*(1-1e-12) { // within rounding of Tt: at Tt

		if !c.hasSub {
			return regionSolid, false, "below the triple-point temperature"
		}
		if T < c.subLo {
			return regionBeyond, false, "below the range of the sublimation curve"
		}
		ps := c.psub(T)
		if p <= ps {
			return regionFluid, p == ps, ""
		}
		if c.hasMelt && c.anomalous {
			if p > c.pMeltEnd {
				return regionBeyond, false, "above the end of the melting curve below the triple-point temperature, where other solid phases exist"
			}
			if T >= c.meltLo {
				pm := c.pmelt(T)
				if p >= pm {
					return regionFluid, p == pm, ""
				}
			}
		}
		return regionSolid, false, "above the sublimation pressure below the triple-point temperature"
	}
	if c.hasMelt && !c.anomalous && T <= c.meltHi {
		if pm := c.pmelt(T); p > pm {
			return regionSolid, false, "above the melting pressure"
		} else if p == pm {
			return regionFluid, true, ""
		}
	}
	return regionFluid, false, ""
}

// solidError is the error for a state in a solid region.
func (c *curves) solidError(op, why string, in ...fluid.Input) error {
	if !c.solidModelExpected {
		return fluid.NewError(op, fluid.ErrUndefined,
			"the state is solid ("+why+") and "+c.f.Name()+" has no solid model", in...)
	}
	return fluid.NewError(op, fluid.ErrOutOfRange,
		"the state is solid or solid-fluid ("+why+", by the published sublimation and melting curves of "+
			c.f.Name()+"); solid models are not yet available", in...)
}

// regionError turns a non-fluid classification into an error.
func (c *curves) regionError(op string, r region, why string, in ...fluid.Input) error {
	if r == regionBeyond {
		return fluid.NewError(op, fluid.ErrOutOfRange, "outside the models of "+c.f.Name()+": "+why, in...)
	}
	return c.solidError(op, why, in...)
}

// freezeT returns the lowest temperature at which the fluid exists at
// pressure p, by the solid curves: the sublimation temperature below the
// triple-point pressure, the melting temperature above it (for a melting
// curve rising with T), the triple-point temperature otherwise. floor is
// true where that is instead the lowest accepted temperature of the
// equation (the vapour at a pressure below the sublimation pressure
// there).
func (c *curves) freezeT(p float64) (T float64, floor bool) {
	lim := c.f.Limits()
	switch {
	case p < c.pt && c.hasSub:
		lo, hi := max(c.subLo, lim.TFloor), c.subHi
		if p < c.psub(lo) {
			return lo, true // the vapour exists down to the floor
		}
		return invertCurve(c.psub, p, lo, hi), false
	case p >= c.pt && c.hasMelt && !c.anomalous:
		if p > c.pMeltEnd {
			return c.meltHi, false
		}
		return invertCurve(c.pmelt, p, c.meltLo, c.meltHi), false
	case p >= c.pt && c.hasMelt && c.anomalous:
		if p > c.pMeltEnd {
			return c.tt, false
		}
		// The liquid exists below Tt down to the melting curve.
		return invertCurve(c.pmelt, p, c.meltLo, c.meltHi), false
	}
	return max(c.tt, lim.TFloor), c.tt <= lim.TFloor
}

// lowError is the error for a state below the lowest fluid temperature
// at p: the solid region, or below the equation's accepted range.
func (c *curves) lowError(op string, floor bool, in ...fluid.Input) error {
	if floor {
		lim := c.f.Limits()
		return fluid.NewError(op, fluid.ErrOutOfRange, "below the accepted temperature "+
			fmtG(lim.TFloor)+" K of "+c.f.Name(), in...)
	}
	return c.solidError(op, "below the sublimation or melting temperature", in...)
}

// invertCurve returns T in [lo, hi] with fn(T) = p for a monotone curve,
// by regula falsi on ln p.
func invertCurve(fn func(float64) float64, p, lo, hi float64) float64 {
	lp := math.Log(p)
	g := func(T float64) float64 { return math.Log(fn(T)) - lp }
	fa, fb := g(lo), g(hi)
	switch {
	case fa == 0:
		return lo
	case fb == 0:
		return hi
	case fa*fb > 0:
		if math.Abs(fa) < math.Abs(fb) {
			return lo
		}
		return hi
	}
	return illinois(g, lo, hi, fa, fb, 1e-13*hi)
}

// illinois returns a root of g in [a, b], where g(a) = fa and g(b) = fb
// have opposite signs, by the Illinois variant of regula falsi, to within
// tol in the argument.
func illinois(g func(float64) float64, a, b, fa, fb, tol float64) float64 {
	side := 0
	c := a
	for it := 0; it < 200; it++ {
		cn := (a*fb - b*fa) / (fb - fa)
		if !(cn >= min(a, b) && cn <= max(a, b)) {
			cn = 0.5 * (a + b)
		}
		if it > 0 && math.Abs(cn-c) <= tol {
			return cn
		}
		c = cn
		fc := g(c)
		if fc == 0 {
			return c
		}
		if fc*fb > 0 {
			b, fb = c, fc
			if side == -1 {
				fa *= 0.5
			}
			side = -1
		} else {
			a, fa = c, fc
			if side == 1 {
				fb *= 0.5
			}
			side = 1
		}
	}
	return c
}
