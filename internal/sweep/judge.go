package main

import (
	"errors"
	"math"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// must says whether a forward flash has to succeed.
type must int8

const (
	mayRefuse  must = 0
	mustState  must = 1
	mustRefuse must = -1
)

// phaseSet is a set of phases, bit i for flash.Phase(i); 0 means any.
type phaseSet uint16

func phases(ps ...flash.Phase) phaseSet {
	var s phaseSet
	for _, p := range ps {
		s |= 1 << p
	}
	return s
}

func (s phaseSet) has(p flash.Phase) bool { return s == 0 || s&(1<<p) != 0 }

func (s phaseSet) String() string {
	if s == 0 {
		return "any"
	}
	out := ""
	for p := flash.Unknown; p <= flash.Triple; p++ {
		if s&(1<<p) != 0 {
			if out != "" {
				out += "|"
			}
			out += p.String()
		}
	}
	return out
}

var fluidPhases = phases(flash.Liquid, flash.Vapor, flash.Supercritical, flash.TwoPhase)

// verdict is what a forward flash must do, judged without package flash.
type verdict struct {
	must  must
	want  phaseSet // the phases it may return
	meta  bool     // the state must be flagged Metastable
	fluid bool     // a fluid state exists (for the reproducer's note)
}

// gibbsBand is the band in g/(RT) within which fluid and solid are taken
// as coexisting (either phase may be returned): well above the accuracy
// of the model's curves (a few 1e-12, package sublimation) and of the
// flash's own decision (1e-11, package flash).
const gibbsBand = 1e-9

// fluidPhaseOf classifies a fluid state by the contract (DESIGN.md):
// Supercritical above Tc and pc, below Tc Liquid on the liquid root and
// Vapor on the vapour root; at Tc the side of pc or ρc decides.
func (s *setup) fluidPhaseOf(T, p, rho float64) phaseSet {
	c := s.crit
	switch {
	case T > c.T && p > c.P:
		return phases(flash.Supercritical)
	case T > c.T:
		return phases(flash.Vapor)
	case T == c.T:
		return phases(flash.Liquid, flash.Vapor, flash.Supercritical)
	case rho > c.Rho:
		return phases(flash.Liquid)
	}
	return phases(flash.Vapor)
}

// rangeErr reports whether err says that the inputs lie outside the
// equation's accepted range (the input check of fluid, not a missing root).
func rangeErr(err error) bool {
	return errors.Is(err, fluid.ErrOutOfRange) || errors.Is(err, fluid.ErrInvalidInput)
}

// judgePT judges PT(p, T) with opt from the fluid equation (the stable
// root at (T, p), or the requested one) and the solid model (the phase
// of lower Gibbs energy at (T, p)).
func (s *setup) judgePT(p, T float64, c *tcase) verdict {
	root := fluid.RootStable
	switch c.phase {
	case flash.Liquid:
		root = fluid.RootLiquid
	case flash.Vapor:
		root = fluid.RootVapor
	}
	pr, ferr := s.f.PropsTP(T, p, root, 0)
	fluidOK := ferr == nil
	var fluidWant phaseSet
	if fluidOK {
		fluidWant = s.fluidPhaseOf(T, p, pr.Rho)
	}
	if c.meta {
		// A metastable fluid on request: it exists where its root does.
		if !fluidOK {
			return verdict{must: mayRefuse}
		}
		v := verdict{must: mustState, want: fluidWant, fluid: true}
		if s.hasSolid && p > s.meltPMax*(1-1e-9) && T < s.tp.T {
			// Beyond the solid model (ice Ih ends at 208.566 MPa): the
			// flashes do not place a supercooled liquid there (package
			// flash, "Solid regions and their limits").
			v.must = mayRefuse
		}
		v.meta = pr.Flags&fluid.Metastable != 0
		if s.hasSolid {
			if sp, err := s.sol.Props(T, p); err == nil && (sp.G-pr.G)/(s.R*T) < -gibbsBand {
				v.meta = true
			}
		}
		return v
	}
	if !s.hasSolid {
		if T < s.tp.T || !fluidOK {
			return verdict{must: mustRefuse}
		}
		return verdict{must: mustState, want: fluidWant, fluid: true}
	}
	if p > s.meltPMax*(1-1e-9) {
		// At and above the end of the model's melting curve (ice Ih:
		// 208.566 MPa, where ice III appears; dry ice: 800 MPa) the
		// flashes may refuse (package flash: "Solid regions and their
		// limits"); what they return must be the fluid or the solid.
		return verdict{must: mayRefuse, want: fluidWant | phases(flash.Solid)}
	}
	sp, serr := s.sol.Props(T, p)
	switch {
	case serr == nil && fluidOK:
		dg := (sp.G - pr.G) / (s.R * T)
		switch {
		case math.Abs(dg) <= gibbsBand:
			return verdict{must: mustState, want: fluidWant | phases(flash.Solid, flash.Liquid), fluid: true}
		case dg < 0:
			return verdict{must: mustState, want: phases(flash.Solid)}
		}
		return verdict{must: mustState, want: fluidWant, fluid: true}
	case serr == nil:
		// No fluid root in the equation's range: the solid, where the
		// fluid floor does not make it ambiguous (below the vapour floor
		// at pressures under the sublimation pressure there, the flash
		// cannot tell solid from vapour and refuses: DESIGN.md).
		if T < s.lim.TFloor && p < s.subPFloor {
			return verdict{must: mayRefuse, want: phases(flash.Solid)}
		}
		if !rangeErr(ferr) {
			return verdict{must: mayRefuse, want: phases(flash.Solid)}
		}
		return verdict{must: mustState, want: phases(flash.Solid)}
	case fluidOK:
		// Beyond the solid model (its pressure or temperature limit):
		// other solids may be stable there; the flash may refuse, and
		// what it returns must be the fluid.
		return verdict{must: mayRefuse, want: fluidWant, fluid: true}
	}
	return verdict{must: mustRefuse}
}

// satBand returns the relative band around the saturated density of the
// phase sp (at saturation pressure p) within which DT may return either
// side: 1e-9, or 1e-4 within 1 mK of Tc, where the equation fixes the
// saturated densities only to about 3e-5 (fluid.SaturationAtT) and the
// flashes' saturations from T and from p, and at temperatures 0.04 nK
// apart, differ by that much (CO2 at Tc − 1.4 µK: ρ′ 468.7191 from T,
// 468.7077 from p, 468.7251 at 3.5e-11 K above), so that a state 2e-5
// from ρ′ may be placed on either side; and at
// least the band in which the phase's own pressure stays within 1e-12·p
// of p, p/(ρ(∂p/∂ρ)_T)·1e-12, since the flashes place a state against the
// vapour pressure to 1e-14·p (fluid.StableRoot) and the saturation fixes
// that pressure to about the same: next to the critical point, where
// (∂p/∂ρ)_T vanishes, that band widens smoothly into the millikelvin's.
func (s *setup) satBand(T float64, sp *fluid.Props, p float64) float64 {
	b := 1e-9
	if s.crit.T-T < 1e-3 {
		b = 1e-4
	}
	if k := sp.Rho * sp.DpDrho; k > 0 {
		b = max(b, 1e-12*p/k)
	}
	return b
}

// judgeDT judges DT(ρ, T) of a fluid state from fluid.Props and the
// equation's own saturation. Below the triple point (where a solid may
// form) only success is judged.
func (s *setup) judgeDT(rho, T float64, c *tcase) verdict {
	pr, err := s.f.Props(T, rho)
	if c.meta {
		if err != nil {
			return verdict{must: mustRefuse} // beyond the spinodal, or p <= 0
		}
		return verdict{must: mustState, want: phases(c.phase), meta: true, fluid: true}
	}
	if err != nil && (T < s.lim.TFloor || T > s.lim.TCeil || rho > s.lim.RhoCeil) {
		return verdict{must: mustRefuse}
	}
	cr := s.crit
	if T >= cr.T {
		if err != nil && !errors.Is(err, fluid.ErrUnstable) {
			return verdict{must: mayRefuse}
		}
		return verdict{must: mustState, want: s.fluidPhaseOf(T, pr.P, rho), fluid: true}
	}
	if T < s.tp.T {
		return verdict{must: mayRefuse}
	}
	sat, serr := s.f.SaturationAtT(T)
	if serr != nil {
		return verdict{must: mayRefuse}
	}
	bl, bv := s.satBand(T, &sat.Liquid, sat.P), s.satBand(T, &sat.Vapor, sat.P)
	rl, rv := sat.Liquid.Rho, sat.Vapor.Rho
	// Every phase that a condition allows: the single phase of a side
	// beyond its band, the mixture between the bands, either within a
	// band (next to Tc the bands of both sides may meet).
	var want phaseSet
	if rho > rl*(1+bl) {
		want |= phases(flash.Liquid)
	}
	if rho < rv*(1-bv) {
		want |= phases(flash.Vapor)
	}
	if rho < rl*(1-bl) && rho > rv*(1+bv) {
		want |= phases(flash.TwoPhase)
	}
	if math.Abs(rho-rl) <= bl*rl {
		want |= phases(flash.Liquid, flash.TwoPhase)
	}
	if math.Abs(rho-rv) <= bv*rv {
		want |= phases(flash.Vapor, flash.TwoPhase)
	}
	if s.hasSolid && want.has(flash.Liquid) && rho > rl*(1+bl) {
		// A dense liquid may lie beyond the melting curve.
		want |= phases(flash.Solid, flash.SolidLiquid)
	}
	v := verdict{must: mustState, want: want, fluid: true}
	if err != nil && !errors.Is(err, fluid.ErrUnstable) && rho > rl {
		// A liquid isochore so dense that the equation gives p > PCeil.
		v.must = mayRefuse
	}
	if s.hasSolid && pr.P > s.meltPMax*(1-1e-9) && rho > rl {
		// Beyond the end of the solid model's melting curve (water above
		// 208.566 MPa, colder than the melting curves of the
		// high-pressure ices; dry ice above 800 MPa) the flashes may
		// refuse, as for PT (package flash: "Solid regions and their
		// limits"; DT's special cases).
		v.must = mayRefuse
	}
	return v
}

// tolT and tolP are the triple-line tolerances of package flash (its
// doc: T within 1e-12, p within 1e-10 of the triple point); within ten
// times them either side may be returned.
const (
	tolT = 1e-12
	tolP = 1e-10
)

// judgeSat judges TQ(x, q) (atP false) or PQ(x, q) from the contract:
// from the vapour floor (the triple point without a solid model) to the
// critical point; below the triple point the sublimation curve.
func (s *setup) judgeSat(x, q float64, atP bool) verdict {
	lo, hi, xt, tol := s.tp.T, s.crit.T, s.tp.T, tolT
	if atP {
		// The equation's own vapour pressure at the triple-point
		// temperature (Triple().P for a fluid whose triple point is the
		// models' own; for R-134a the published one differs).
		lo, hi, xt, tol = s.pSatTt, s.crit.P, s.pSatTt, tolP
	}
	if s.hasSolid {
		lo = s.lim.TFloor
		if atP {
			lo = s.subPFloor
		}
	}
	if !(q >= 0 && q <= 1) {
		return verdict{must: mustRefuse}
	}
	switch {
	case x < lo*(1-1e-9) || x > hi:
		return verdict{must: mustRefuse}
	case x < lo*(1+1e-9):
		return verdict{must: mayRefuse} // the floor, to its accuracy
	case x == hi:
		return verdict{must: mustState, want: fluidPhases} // AtCritical
	}
	// byQ: q = 0 is the condensed phase alone, q = 1 the vapour, else
	// the mixture.
	byQ := func(condensed, mixture flash.Phase) phaseSet {
		switch q {
		case 0:
			return phases(condensed)
		case 1:
			return phases(flash.Vapor)
		}
		return phases(mixture)
	}
	fluidSide := func() phaseSet { return byQ(flash.Liquid, flash.TwoPhase) }
	solidSide := func() phaseSet { return byQ(flash.Solid, flash.SolidVapor) }
	d := (x - xt) / xt
	switch {
	case d < -10*tol:
		if !s.hasSolid {
			return verdict{must: mustRefuse}
		}
		return verdict{must: mustState, want: solidSide()}
	case d <= -tol/10 && s.hasSolid:
		return verdict{must: mustState, want: solidSide() | fluidSide()}
	case d <= -tol/10:
		return verdict{must: mayRefuse, want: fluidSide()}
	}
	return verdict{must: mustState, want: fluidSide(), fluid: true}
}

// judge returns the verdict on case c.
func (s *setup) judge(c *tcase) verdict {
	switch c.kind {
	case kPT:
		return s.judgePT(c.a, c.b, c)
	case kDT:
		return s.judgeDT(c.a, c.b, c)
	case kTQ:
		return s.judgeSat(c.a, c.b, false)
	case kPQ:
		return s.judgeSat(c.a, c.b, true)
	case kPH:
		if c.wantSolid >= 0 {
			return verdict{must: mustState, want: phases(flash.SolidLiquid)}
		}
		return verdict{must: mustState}
	case kDU:
		return verdict{must: mustState, want: phases(flash.Triple)}
	}
	return verdict{must: mayRefuse}
}
