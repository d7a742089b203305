package table

import (
	"math"

	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/sublimation"
)

// This file computes the boundary curves of the tables: fluid states
// along curves of the (T, p) plane — isotherms, isobars, the
// saturation, sublimation and melting curves — at a given pressure (the
// slabs in ln p of PH and PT) or a given density (the slabs in ln ρ of
// DU), each with the direction of its curve.

// curveKind names a boundary curve of the (T, p) plane.
type curveKind int8

const (
	cIsotherm  curveKind = iota // T = const
	cIsobar                     // p = const (DU only)
	cSatLiquid                  // the saturated liquid
	cSatVapor                   // the saturated vapour
	cMelt                       // the liquid on the melting curve
	cSub                        // the vapour on the sublimation curve
	cIsochore                   // ρ = const (PH and PT above p2)
)

// bcurve is a boundary curve: its kind, the constant of an isotherm or
// isobar, and for an isotherm which fluid branch it is on.
type bcurve struct {
	kind   curveKind
	c      float64 // T of an isotherm (K), p of an isobar (Pa), ρ of an isochore (kg/m³)
	liquid bool    // an isotherm's liquid branch (below Tc)
}

// bpoint is a state on a boundary curve and the direction of the curve
// there: (dT, dp) per unit of its parameter.
type bpoint struct {
	pr     fluid.Props
	dT, dp float64
	rl, rv float64 // on the saturation curve: both densities (warm starts)
}

// root returns the density root of the branch at (T, p).
func (c bcurve) root(b *builder, T, p float64) fluid.Root {
	if T >= b.crit.T {
		return fluid.RootStable
	}
	if c.liquid {
		return fluid.RootLiquid
	}
	if p >= b.crit.P {
		return fluid.RootStable
	}
	return fluid.RootVapor
}

// atP returns the point of curve c at pressure p (not an isobar),
// warm-started from prev where it is not nil.
func (b *builder) atP(c bcurve, p float64, prev *bpoint) (bpoint, error) {
	switch c.kind {
	case cIsotherm:
		g := 0.0
		if prev != nil {
			g = prev.pr.Rho
		}
		pr, err := b.f.PropsTP(c.c, p, c.root(b, c.c, p), g)
		return bpoint{pr: pr, dT: 0, dp: 1}, err
	case cSatLiquid, cSatVapor:
		var s fluid.Saturation
		var err error
		if prev != nil {
			s, err = b.f.SaturationAtPFrom(p, prev.pr.T, prev.rl, prev.rv)
		} else {
			s, err = b.f.SaturationAtP(p)
		}
		if err != nil {
			return bpoint{}, err
		}
		g := clapeyron(s.Liquid.S, s.Vapor.S, s.Liquid.Rho, s.Vapor.Rho)
		pr := s.Liquid
		if c.kind == cSatVapor {
			pr = s.Vapor
		}
		return bpoint{pr: pr, dT: 1 / g, dp: 1, rl: s.Liquid.Rho, rv: s.Vapor.Rho}, nil
	case cIsochore:
		// p(T, ρ) = p by Newton's method in T, from near or Tc.
		T := b.crit.T
		if prev != nil {
			T = prev.pr.T
		}
		for it := 0; it < 60; it++ {
			pr, err := b.f.Props(T, c.c)
			if err != nil && pr.DpDT == 0 {
				return bpoint{}, err
			}
			dT := (p - pr.P) / pr.DpDT
			if math.Abs(dT) <= 1e-12*T {
				return bpoint{pr: pr, dT: 1 / pr.DpDT, dp: 1}, err
			}
			T = b.clampT(T + math.Max(math.Min(dT, 0.2*T), -0.2*T))
		}
		return bpoint{}, errBuild("no convergence on an isochore")
	case cMelt, cSub:
		var co sublimation.Coexistence
		var err error
		if c.kind == cMelt {
			co, err = b.sol.MeltingTemperature(p)
		} else {
			co, err = b.sol.SublimationTemperature(p)
		}
		if err != nil {
			return bpoint{}, err
		}
		g := clapeyron(co.Solid.S, co.Fluid.S, co.Solid.Rho, co.Fluid.Rho)
		return bpoint{pr: co.Fluid, dT: 1 / g, dp: 1}, nil
	}
	return bpoint{}, errBuild("atP: an isobar has no point at a given pressure")
}

// clapeyron returns the slope dp/dT of a coexistence curve from its two
// phases' entropies and densities: (s₂ − s₁)/(1/ρ₂ − 1/ρ₁).
func clapeyron(s1, s2, rho1, rho2 float64) float64 {
	return (s2 - s1) / (1/rho2 - 1/rho1)
}

// atRho returns the point of curve c where its fluid has density rho,
// warm-started from near, a point of the same curve near it.
func (b *builder) atRho(c bcurve, rho float64, near *bpoint) (bpoint, error) {
	switch c.kind {
	case cIsotherm:
		pr, err := b.f.Props(c.c, rho)
		return bpoint{pr: pr, dT: 0, dp: 1}, err
	case cIsobar:
		// p(T, ρ) = p along the isochore, by Newton's method in T.
		T := near.pr.T
		for it := 0; it < 60; it++ {
			pr, err := b.f.Props(T, rho)
			if err != nil && pr.DpDT == 0 {
				return bpoint{}, err
			}
			dT := (c.c - pr.P) / pr.DpDT
			dT = math.Max(math.Min(dT, 0.2*T), -0.2*T)
			if math.Abs(dT) <= 1e-12*T {
				return bpoint{pr: pr, dT: 1, dp: 0}, err
			}
			T = b.clampT(T + dT)
		}
		return bpoint{}, errBuild("no convergence on an isobar")
	}
	// A curve parametrised by p: ln ρ(p) = ln ρ by Newton's method in ln p,
	// with d ln ρ/d ln p from the curve's direction.
	lp := math.Log(near.pr.P)
	cur := *near
	for it := 0; it < 60; it++ {
		r := math.Log(cur.pr.Rho / rho)
		d := cur.pr.P / cur.pr.Rho * along(&cur.pr, vRho, cur.dT, cur.dp) / cur.dp
		step := -r / d
		if math.Abs(step) <= 1e-15 || math.Abs(r) <= 1e-14 {
			return cur, nil
		}
		step = math.Max(math.Min(step, 0.5), -0.5)
		// Backtrack where a step leaves the curve's range (its ends, the
		// triple and critical points, are in it).
		var next bpoint
		var err error
		for h := 0; h < 60; h++ {
			if next, err = b.atP(c, math.Exp(lp+step), &cur); err == nil {
				break
			}
			step /= 2
		}
		if err != nil {
			return bpoint{}, err
		}
		lp += step
		cur = next
	}
	return bpoint{}, errBuild("no convergence on a boundary curve at a given density")
}

// clampT keeps an iteration in T inside the equation's accepted range.
func (b *builder) clampT(T float64) float64 {
	l := b.t.lim
	return min(max(T, l.TFloor), l.TCeil)
}
