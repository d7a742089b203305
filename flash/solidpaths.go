package flash

import (
	"math"

	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/sublimation"
)

// This file places each flash's inputs in the solid regions, by the solid
// model's own curves: solid, solid–vapour, solid–liquid and the triple
// point. The fluid paths (flash.go, volume.go, entropy.go) send their
// inputs here where the state has, or may have, solid; where the curves
// then show a fluid state, the fluid path is run again with its bounds
// fixed by the curves ("decided").

// metaFluid reports whether the options ask for a metastable fluid phase.
func (k *call) metaFluid() bool {
	return k.opt.AllowMetastable && (k.opt.Phase == Liquid || k.opt.Phase == Vapor)
}

// solidOf returns quantity q of the solid sp.
func solidOf(q quantity, sp *sublimation.Props) float64 {
	switch q {
	case qT:
		return sp.T
	case qP:
		return sp.P
	case qRho:
		return sp.Rho
	case qH:
		return sp.H
	case qS:
		return sp.S
	}
	return sp.U
}

// decide marks the solid side of the call as decided: the fluid paths
// then no longer place their results against the solid, and at a given
// pressure keep to temperatures at or above Tlo (0: no bound).
func (k *call) decide(Tlo float64) {
	k.decided, k.fixedTlo = true, Tlo
}

// wantedState checks a state against the requested phase.
func (k *call) wantedState(st State) (State, error) {
	if !satisfies(k.opt.Phase, st.Phase) {
		return State{}, k.notWanted(st.Phase)
	}
	return st, nil
}

// ---------------------------------------------------------------------
// PT

// placement is where PT's (T, p) lies, by the node bounds.
type placement int8

const (
	placeFluid  placement = iota // a fluid state, on the root given
	placeSolid                   // solid
	placeNear                    // between the bounds of a curve: by the Gibbs energies
	placeBeyond                  // outside the models
)

// placePT places (T, p) for PT: the phase, and for a fluid or a state
// near a curve the fluid root to compare.
func (k *call) placePT(T, p float64) (placement, fluid.Root, string) {
	b := &k.sol
	if !b.ok {
		if k.belowTripleT(T) {
			return placeSolid, 0, ""
		}
		return placeFluid, fluid.RootStable, ""
	}
	n := b.n
	if Tm, _, ok := k.highIceT(p); ok {
		// Water above the end of ice Ih's melting curve: the liquid
		// above the melting curves of the high-pressure ices; beyond
		// them ices outside the model (ptSolid says so, or with a
		// metastable liquid requested PT returns it, flagged).
		if T >= Tm*(1-1e-12) {
			return placeFluid, fluid.RootStable, ""
		}
		return placeSolid, 0, ""
	}
	if !k.belowTripleT(T) {
		if !n.meltRising || p <= n.pt*(1+tripleTolP) || T > n.meltEndT() {
			return placeFluid, fluid.RootStable, ""
		}
		if p > n.solidPMax() {
			return placeBeyond, 0, beyondCO2
		}
		lo, hi := n.meltPBounds(T)
		switch {
		case p < lo:
			return placeFluid, fluid.RootStable, ""
		case p > hi:
			return placeSolid, 0, ""
		}
		return placeNear, fluid.RootStable, ""
	}
	if T < n.subTMin() {
		// Below the vapour floor only a solid can be told: where p is
		// above the sublimation pressure at the floor, which is above
		// the sublimation pressure at T.
		switch {
		case n.belowSubPMin(p):
			return placeBeyond, 0, belowFloor
		case p > n.solidPMax():
			return placeBeyond, 0, k.beyondWhy(p)
		}
		return placeSolid, 0, ""
	}
	lo, hi := n.subPBounds(T)
	switch {
	case p < lo:
		return placeFluid, fluid.RootVapor, ""
	case p <= hi:
		return placeNear, fluid.RootVapor, ""
	case p > n.solidPMax():
		return placeBeyond, 0, k.beyondWhy(p)
	case n.meltRising || T < n.meltEndT():
		return placeSolid, 0, ""
	}
	// Ice Ih below its melting curve, the liquid above it.
	mlo, mhi := n.meltPBounds(T)
	switch {
	case p > mhi:
		return placeFluid, fluid.RootLiquid, ""
	case p >= mlo:
		return placeNear, fluid.RootLiquid, ""
	}
	return placeSolid, 0, ""
}

// beyondWhy explains a state at pressure p above the solid model's
// pressure limit: for water the ice whose melting curve bounds the
// liquid there (highIceWhy).
func (k *call) beyondWhy(p float64) string {
	if k.sol.anomalous() {
		if _, _, ok := k.highIceT(p); ok {
			return k.highIceWhy(p)
		}
		return beyondIce
	}
	return beyondCO2
}

// ptSolid is PT where placePT found solid, a curve nearby, or a state
// outside the models. pr is the fluid state at (T, p) on root, where PT
// computed one (near a curve), else nil.
func (k *call) ptSolid(p, T float64, pl placement, why string, pr *fluid.Props) (State, error) {
	if !k.sol.ok {
		return State{}, k.solidError("below the triple-point temperature")
	}
	if pl == placeBeyond {
		return State{}, k.beyondError(why)
	}
	if pr != nil {
		switch k.byGibbs(pr) {
		case vFluid:
			return k.wanted(single(pr, fluidPhase(k.f, T, p, pr.Rho)), nil)
		case vOnCurve:
			// On a sublimation or melting curve: the inputs do not fix
			// the solid fraction; the fluid phase is returned.
			st := single(pr, fluidPhase(k.f, T, p, pr.Rho))
			st.Flags |= Indeterminate | Saturated
			return k.wanted(st, nil)
		}
	}
	sp, err := k.solidProps(T, p)
	if err != nil {
		return State{}, err
	}
	return k.wantedState(solidState(&sp))
}

// ---------------------------------------------------------------------
// TQ, PQ

// sublimationSat returns the state on the sublimation curve at T (p = 0)
// or at p (T = 0) with vapour mass fraction q: the saturated solid for
// q = 0, the saturated vapour for q = 1, SolidVapor between.
func (k *call) sublimationSat(T, p, q float64) (State, error) {
	if !k.sol.ok {
		return State{}, k.solidError("below the triple point")
	}
	var c sublimation.Coexistence
	var err error
	if p == 0 {
		c, err = k.subAtT(T)
	} else {
		c, err = k.subAtP(p)
	}
	if err != nil {
		return State{}, err
	}
	return k.wantedState(k.coexistState(&c, true, q))
}

// tripleSat is TQ and PQ on the triple line: the liquid–vapour state of
// quality q at the triple point, the one of least solid (none), flagged
// Indeterminate.
func (k *call) tripleSat(q float64) (State, error) {
	tpv, err := k.triple()
	tp := &tpv
	if err != nil {
		return State{}, err
	}
	s := tripleSaturation(tp)
	st := twoPhase(k.f, &s, q)
	st.Flags |= Indeterminate
	return k.wantedState(st)
}

// ---------------------------------------------------------------------
// PH, PS

// isobarSolid is PH (X = h) and PS (X = s) where the state may have solid:
// at pressures below the triple point against the sublimation curve, on
// the triple line against the triple point, above it against the melting
// curve. On the triple line, between the solid and the vapour, the inputs
// do not fix the fractions: the state of least solid is returned, flagged
// Indeterminate — liquid–vapour where x lies within the liquid–vapour
// mixtures, else solid–vapour.
func (k *call) isobarSolid(p float64, X quantity, x float64, st *State) error {
	if !k.sol.ok {
		return k.solidError("below the sublimation or melting temperature")
	}
	n := k.sol.n
	lim := k.f.Limits()
	meta := k.metaFluid()
	switch {
	case k.onTripleP(p):
		tpv, err := k.triple()
		tp := &tpv
		if err != nil {
			return err
		}
		xs, xl, xv := solidOf(X, &tp.Solid), X.of(&tp.Liquid), X.of(&tp.Vapor)
		switch {
		case meta && x < xl:
			start, sd := &tp.Liquid, liquidSide
			if k.opt.Phase == Vapor {
				start, sd = &tp.Vapor, vaporSide
			}
			return k.isobarSingle(p, X, x, start, sd, lim.TFloor, tp.T, true, st)
		case x < xs:
			return st.set(k.solidIsobar(tp.P, X, x, tp.T))
		case x > xv:
			k.decide(tp.T)
			return k.isobarSingle(p, X, x, &tp.Vapor, vaporSide, tp.T, lim.TCeil, false, st)
		case x >= xl:
			s := tripleSaturation(tp)
			ts := twoPhase(k.f, &s, (x-xl)/(xv-xl))
			ts.Flags |= Indeterminate
			return st.set(k.wantedState(ts))
		}
		c := sublimation.Coexistence{T: tp.T, P: tp.P, Solid: tp.Solid, Fluid: tp.Vapor}
		cs := k.coexistState(&c, true, (x-xs)/(xv-xs))
		cs.Flags |= Indeterminate
		return st.set(k.wantedState(cs))
	case p < n.pt:
		if n.belowSubPMin(p) {
			// The vapour down to the vapour floor; the solid is below it.
			k.decide(lim.TFloor)
			return k.isobaric(p, X, x, st)
		}
		if Thi, ok := k.clearlySolid(n.sub, n.subP, p, X, x, meta); ok {
			_, hi := n.subTBounds(p)
			return st.set(k.solidIsobar(p, X, x, min(Thi, hi)))
		}
		if Tlo, start, ok := k.clearlyVapour(p, X, x, meta); ok {
			k.decide(Tlo)
			return k.isobarSingle(p, X, x, &start, vaporSide, Tlo, lim.TCeil, false, st)
		}
		c, err := k.subAtP(p)
		if err != nil {
			return err
		}
		xs, xv := solidOf(X, &c.Solid), X.of(&c.Fluid)
		switch {
		case x > xv:
			k.decide(c.T)
			return k.isobarSingle(p, X, x, &c.Fluid, vaporSide, c.T, lim.TCeil, false, st)
		case meta && k.opt.Phase == Vapor:
			return k.isobarSingle(p, X, x, &c.Fluid, vaporSide, lim.TFloor, c.T, true, st)
		case x < xs:
			return st.set(k.solidIsobar(p, X, x, c.T))
		}
		return st.set(k.wantedState(k.coexistState(&c, true, (x-xs)/(xv-xs))))
	}
	if p > n.solidPMax() {
		// Above the end of the melting curve: the fluid above the
		// temperature where it ends (CO2) or above the melting curves
		// of the high-pressure ices (water); colder, solid phases
		// outside the models, or on request the metastable liquid.
		Tlo := k.freezeTHi(p)
		if meta && k.opt.Phase == Liquid {
			if pl, err := k.f.PropsTP(Tlo, p, fluid.RootLiquid, 0); err == nil {
				return k.isobarSingle(p, X, x, &pl, anySide, lim.TFloor, lim.TCeil, true, st)
			}
		}
		k.decide(Tlo)
		err := k.isobaric(p, X, x, st)
		if err == errSolid {
			return k.beyondError(k.beyondWhy(p))
		}
		return err
	}
	if Thi, ok := k.clearlySolid(n.melt, n.meltP, p, X, x, meta); ok {
		_, hi := n.meltTBounds(p)
		return st.set(k.solidIsobar(p, X, x, min(Thi, hi)))
	}
	m, err := k.meltAtP(p)
	if err != nil {
		return err
	}
	xs, xl := solidOf(X, &m.Solid), X.of(&m.Fluid)
	switch {
	case x > xl:
		k.decide(m.T)
		return k.isobaric(p, X, x, st)
	case meta && k.opt.Phase == Liquid:
		return k.isobarSingle(p, X, x, &m.Fluid, liquidSide, lim.TFloor, m.T, true, st)
	case x < xs:
		return st.set(k.solidIsobar(p, X, x, m.T))
	}
	return st.set(k.wantedState(k.coexistState(&m, false, (x-xs)/(xl-xs))))
}

// isobarMelt sends PH (X = h) and PS (X = s) at a pressure of the
// melting curve to the solid paths where x lies below, or near, the
// liquid on the curve there, by the node tables (between neighbouring
// nodes the liquid's X is bounded by theirs, widened by one step for
// where it is not monotone along the curve): along the isobar X rises
// with T, so such a state has solid or is a liquid next to the curve,
// which isobarSolid places against the curve itself. done is false
// elsewhere: the fluid path then runs first.
func (k *call) isobarMelt(p float64, X quantity, x float64, st *State) (err error, done bool) {
	if !k.sol.ok || k.metaFluid() || k.decided {
		return nil, false
	}
	n := k.sol.n
	if !(p > n.pt*(1+tripleTolP) && p <= n.solidPMax()) {
		return nil, false
	}
	i := bracketIndex(n.meltP, p)
	a, b := X.of(&n.melt[i].Fluid), X.of(&n.melt[i+1].Fluid)
	dh, ds := k.f.ReferenceOffsets()
	off := dh
	if X == qS {
		off = ds
	}
	if x-off > max(a, b)+math.Abs(b-a)+1e-9*math.Abs(x) {
		return nil, false
	}
	return k.isobarSolid(p, X, x, st), true
}

// clearlySolid reports whether X = x at pressure p lies below the solid
// on a curve there by the node tables cs (pressures ps): below both
// neighbouring nodes' solid less one step (for where it is not monotone),
// so that the state is solid, colder than where the curve crosses the
// isobar (Thi: the larger of the nodes' temperatures), without solving
// for the curve. It is false with a metastable fluid requested.
func (k *call) clearlySolid(cs []sublimation.Coexistence, ps []float64, p float64, X quantity, x float64, meta bool) (Thi float64, ok bool) {
	if meta || !(p >= ps[0] && p <= ps[len(ps)-1]) {
		return 0, false
	}
	i := bracketIndex(ps, p)
	a, b := solidOf(X, &cs[i].Solid), solidOf(X, &cs[i+1].Solid)
	dh, ds := k.f.ReferenceOffsets()
	off := dh
	if X == qS {
		off = ds
	}
	if x-off < min(a, b)-math.Abs(b-a)-1e-9*math.Abs(x) {
		return max(cs[i].T, cs[i+1].T), true
	}
	return 0, false
}

// clearlyVapour reports whether X = x at pressure p, between the ends of
// the sublimation curve's node table, lies above the vapour on the curve
// there by the table: above both neighbouring nodes' vapour plus one step
// (for where it is not monotone), so that the state is a vapour hotter
// than where the curve crosses the isobar, without solving for the
// curve. Tlo is a lower bound of that crossing (the lower of the nodes'
// temperatures), and start the vapour at the nearer node carried to p as
// an ideal gas (ρ ∝ p, s less R ln p), in the call's reference state:
// a start for the single-phase iteration. It is false with a metastable
// fluid requested.
func (k *call) clearlyVapour(p float64, X quantity, x float64, meta bool) (Tlo float64, start fluid.Props, ok bool) {
	n := k.sol.n
	cs, ps := n.sub, n.subP
	if meta || !(p >= ps[0] && p <= ps[len(ps)-1]) || X != qH && X != qS {
		return 0, start, false
	}
	i := bracketIndex(ps, p)
	a, b := X.of(&cs[i].Fluid), X.of(&cs[i+1].Fluid)
	dh, ds := k.f.ReferenceOffsets()
	off := dh
	if X == qS {
		off = ds
	}
	if !(x-off > max(a, b)+math.Abs(b-a)+1e-9*math.Abs(x)) {
		return 0, start, false
	}
	j := i
	if p/ps[i] > ps[i+1]/p {
		j = i + 1
	}
	start = cs[j].Fluid
	r := p / start.P
	start.Rho *= r
	start.P = p
	start.S -= k.f.GasConstant() * math.Log(r)
	start.U, start.H, start.S = start.U+dh, start.H+dh, start.S+ds
	start.G, start.F = start.H-start.T*start.S, start.U-start.T*start.S
	return min(cs[i].T, cs[i+1].T) * (1 - nodeSlack), start, true
}

// solidIsobar returns the solid at pressure p with X = x, below the
// temperature Thi where it meets a fluid.
func (k *call) solidIsobar(p float64, X quantity, x, Thi float64) (State, error) {
	lo := k.solidFloorT()
	sp, ok := k.solidSolve(X, x, true, 0, p, lo, Thi)
	if !ok {
		g := k.sol.s.Derivs(lo, p)
		if v, _, _ := solidQ(X, &g, lo, p); x < v {
			return State{}, k.fail(fluid.ErrOutOfRange, "below the solid at the lowest temperature "+
				fmtG(lo)+" K of the "+k.sol.s.Name()+" model")
		}
		return State{}, k.fail(fluid.ErrNoConvergence, "the solid iteration did not converge")
	}
	return k.wantedState(solidState(&sp))
}

// ---------------------------------------------------------------------
// DT, DU

// tripleVolumes places the specific volume v at the triple point: within
// the three-phase volumes the fractions are not fixed, and the mixture of
// least solid is returned, flagged Indeterminate (liquid–vapour where v
// lies between the liquid and the vapour, else solid–liquid); ok is false
// outside them.
func (k *call) tripleVolumes(tp *sublimation.ThreePhase, v float64) (State, bool) {
	vs, vl, vv := 1/tp.Solid.Rho, 1/tp.Liquid.Rho, 1/tp.Vapor.Rho
	var st State
	switch {
	case v >= vl && v < vv && vs > vl:
		// (Water: the saturated liquid itself at v = v′.)
		fallthrough
	case v > vl && v < vv:
		s := tripleSaturation(tp)
		st = twoPhase(k.f, &s, (v-vl)/(vv-vl))
	case v > vs && v < vv && v <= vl:
		// Dry ice, denser than the liquid: solid and liquid.
		c := sublimation.Coexistence{T: tp.T, P: tp.P, Solid: tp.Solid, Fluid: tp.Liquid}
		st = k.coexistState(&c, false, (v-vs)/(vl-vs))
	default:
		return State{}, false
	}
	st.Flags |= Indeterminate
	return st, true
}

// dtSolid is DT where the state may have solid: on the triple line, below
// the triple point, or (CO2) dense enough to reach the melting curve.
func (k *call) dtSolid(rho, T float64) (State, error) {
	if !k.sol.ok {
		return State{}, k.solidError("below the triple point")
	}
	if k.onTripleT(T) {
		tpv, err := k.triple()
		tp := &tpv
		if err != nil {
			return State{}, err
		}
		if st, ok := k.tripleVolumes(tp, 1/rho); ok {
			return k.wantedState(st)
		}
		vs, vv := 1/tp.Solid.Rho, 1/tp.Vapor.Rho
		if v := 1 / rho; v < vs && k.sol.n.meltRising {
			return k.solidAtTRho(rho, tp.T, tp.P, k.sol.n.solidPMax())
		} else if v >= vv || !k.sol.n.meltRising {
			k.decide(0)
			return k.dtFluid(rho, T)
		}
		return k.solidAtTRho(rho, tp.T, tp.P, k.sol.n.solidPMax())
	}
	st, err := k.atTRho(rho, T, k.belowTripleT(T))
	if err != nil {
		return State{}, err
	}
	return k.wantedState(st)
}

// atTRho returns the equilibrium state at (T, ρ) off the triple line,
// with the curves on the side given: below the triple point (sublimation
// and, for ice Ih, melting) or above it (the melting of dry ice).
func (k *call) atTRho(rho, T float64, below bool) (State, error) {
	n := k.sol.n
	v := 1 / rho
	if below {
		if T < n.subTMin() {
			// Only the solid can be told below the vapour floor.
			return k.solidAtTRho(rho, T, n.subPMin(), n.solidPMax())
		}
		c, err := k.subAtT(min(T, n.tt))
		if err != nil {
			return State{}, err
		}
		vs, vv := 1/c.Solid.Rho, 1/c.Fluid.Rho
		switch {
		case v >= vv:
			k.decide(0)
			return k.dtFluid(rho, T)
		case v > vs:
			return k.coexistState(&c, true, (v-vs)/(vv-vs)), nil
		}
		if n.meltRising || T < n.meltEndT() {
			return k.solidAtTRho(rho, T, c.P, n.solidPMax())
		}
		m, err := k.meltAtT(T)
		if err != nil {
			return State{}, err
		}
		vsm, vlm := 1/m.Solid.Rho, 1/m.Fluid.Rho // ice is the lighter
		switch {
		case v >= vsm:
			return k.solidAtTRho(rho, T, c.P, m.P)
		case v > vlm:
			return k.coexistState(&m, false, (vsm-v)/(vsm-vlm)), nil
		}
		k.decide(0)
		return k.dtFluid(rho, T)
	}
	if !n.meltRising || T > n.meltEndT() {
		k.decide(0)
		return k.dtFluid(rho, T)
	}
	m, err := k.meltAtT(max(T, n.tt))
	if err != nil {
		return State{}, err
	}
	vsm, vlm := 1/m.Solid.Rho, 1/m.Fluid.Rho // dry ice is the denser
	switch {
	case v >= vlm:
		k.decide(0)
		return k.dtFluid(rho, T)
	case v > vsm:
		return k.coexistState(&m, false, (v-vsm)/(vlm-vsm)), nil
	}
	return k.solidAtTRho(rho, T, m.P, n.solidPMax())
}

// solidAtTRho returns the solid of density rho at T, its pressure between
// plo and phi.
func (k *call) solidAtTRho(rho, T, plo, phi float64) (State, error) {
	sp, ok := k.solidSolve(qRho, rho, false, T, 0, plo, phi)
	if !ok {
		g := k.sol.s.Derivs(T, phi)
		if rho*g.GP > 1 && phi >= k.sol.n.solidPMax() {
			return State{}, k.beyondError(k.beyondWhy(phi))
		}
		if T < k.sol.n.subTMin() {
			return State{}, k.beyondError(belowFloor)
		}
		return State{}, k.fail(fluid.ErrNoConvergence, "the solid iteration did not converge")
	}
	return solidState(&sp), nil
}

// tripleURange returns the range [lo, hi] of the internal energies of the
// three-phase mixtures of specific volume v at the triple point, where
// the isochore crosses the triangle of the three phases in the (v, u)
// plane; ok is false where it does not.
func tripleURange(tp *sublimation.ThreePhase, v float64) (lo, hi float64, ok bool) {
	vs := [3]float64{1 / tp.Solid.Rho, 1 / tp.Liquid.Rho, 1 / tp.Vapor.Rho}
	us := [3]float64{tp.Solid.U, tp.Liquid.U, tp.Vapor.U}
	lo, hi = math.Inf(1), math.Inf(-1)
	for i := 0; i < 3; i++ {
		j := (i + 1) % 3
		a, b := min(vs[i], vs[j]), max(vs[i], vs[j])
		if !(v >= a && v <= b) || a == b {
			continue
		}
		u := us[i] + (us[j]-us[i])*(v-vs[i])/(vs[j]-vs[i])
		lo, hi, ok = min(lo, u), max(hi, u), true
	}
	if ok && !(v > min(vs[0], vs[1], vs[2]) && v < max(vs[0], vs[1], vs[2])) {
		ok = false
	}
	return lo, hi, ok
}

// duSolid is DU where the state may have solid: the isochore's state at
// the triple-point temperature decides the side. Within the three-phase
// mixtures (ρ, u) fixes the fractions (sublimation.ThreePhase.FractionsRhoU):
// T and p stay at the triple point while they change.
func (k *call) duSolid(rho, u float64) (State, error) {
	if !k.sol.ok {
		return State{}, k.solidError("below the liquid-vapour states at the triple-point temperature")
	}
	tpv, err := k.triple()
	tp := &tpv
	if err != nil {
		return State{}, err
	}
	n := k.sol.n
	lim := k.f.Limits()
	lo, hi, three := tripleURange(tp, 1/rho)
	if !three {
		c := k.side()
		at, err := c.dtSolid(rho, tp.T)
		if err != nil {
			return State{}, err
		}
		lo, hi = at.U, at.U
	}
	tol := qU.tol(k.f, nil, u)
	switch {
	case three && u >= lo-tol && u <= hi+tol:
		xs, xl, xv, err := tp.FractionsRhoU(rho, min(max(u, lo), hi))
		if err != nil {
			return State{}, k.rewrap(err)
		}
		// A fraction at the rounding level of the sum is none: the state
		// lies on an edge of the three-phase triangle (a two-phase state
		// at the triple point).
		xs, xl, xv = dropRounding(xs), dropRounding(xl), dropRounding(xv)
		if sum := xs + xl + xv; sum > 0 {
			xs, xl, xv = xs/sum, xl/sum, xv/sum
		}
		return k.wantedState(k.tripleState(tp, xs, xl, xv))
	case u < lo:
		if st, err, done := k.duHighIce(tp, rho, u); done {
			return st, err
		}
		if st, ok := k.duDirect(rho, u, true); ok {
			return k.wantedState(st)
		}
		a := n.subTMin()
		if k.sol.anomalous() {
			// Ice is modelled below the vapour floor, and is told from
			// vapour there where its pressure is above the sublimation
			// pressure at the floor: the isochore from where it meets
			// that pressure.
			g := k.sol.s.Derivs(a, n.subPMin())
			if rho*g.GP > 1 {
				if sp, ok := k.solidSolve(qRho, rho, true, 0, n.subPMin(), k.solidFloorT(), a); ok {
					a = sp.T * (1 + 1e-9) // just above that pressure
				} else if g := k.sol.s.Derivs(k.solidFloorT(), n.subPMin()); rho*g.GP > 1 {
					a = k.solidFloorT() // above that pressure all the way down
				}
			}
		}
		if k.sol.anomalous() && a < n.meltEndT() {
			// Below the end of ice Ih's melting curve a dense isochore
			// can pass through the other ices: the solid–liquid part
			// above it first.
			c := k.side()
			if sm, err := c.atTRho(rho, n.meltEndT(), true); err == nil && sm.U <= u {
				a = n.meltEndT()
			}
		}
		return k.isochoreRoot(rho, u, a, tp.T, true)
	}
	// Above the triple point: the fluid, and for dense CO2 first the
	// melting curve.
	if n.meltRising && 1/rho < 1/tp.Liquid.Rho {
		if st, ok := k.duDirect(rho, u, false); ok {
			return k.wantedState(st)
		}
		top := n.meltEndT()
		c := k.side()
		st, err := c.atTRho(rho, top, false)
		if err == nil && st.U >= u {
			return k.isochoreRoot(rho, u, tp.T, top, false)
		}
		k.decide(0)
		pr, ok := newton1(k.f, qU, u, 1.05*top, rho, true, top, lim.TCeil)
		if !ok {
			return State{}, k.fail(fluid.ErrNoConvergence, "the single-phase iteration did not converge")
		}
		return k.wanted(k.finish(&pr))
	}
	k.decide(tp.T)
	return k.isochoric(rho, qU, u)
}

// dropRounding returns 0 for a mass fraction below 1e-15, the rounding
// of fractions solved from sums of order 1 (a larger one matters: a
// vapour fraction of 1e-12 changes the density of liquid water at its
// triple point by 2e-7).
func dropRounding(x float64) float64 {
	if x < 1e-15 {
		return 0
	}
	return x
}

// duHighIce is DU below the triple point on a dense isochore of water
// that is above the end of ice Ih's melting curve (208.566 MPa) at the
// triple-point temperature: colder, it stays liquid until it meets the
// melting curve of ice Ih or of a high-pressure ice. Where the isochore's
// liquid with internal energy u lies above 208.566 MPa, that liquid is
// the state (u rises with T along the isochore), placed against the
// high-pressure ices by finish; otherwise done is false and the ice Ih
// paths decide.
func (k *call) duHighIce(tp *sublimation.ThreePhase, rho, u float64) (st State, err error, done bool) {
	n := k.sol.n
	if !k.sol.anomalous() || rho <= tp.Liquid.Rho {
		return State{}, nil, false
	}
	// (Above 208.566 MPa by more than rounding, as highIceT: at that
	// pressure itself ice Ih and its melting curve end, which the ice Ih
	// paths place.)
	pHi := n.highPLo * (1 + 1e-9)
	top, ok := props(k.f, tp.T, rho)
	if !ok || !(top.P > pHi) {
		return State{}, nil, false
	}
	pr, ok := newton1(k.f, qU, u, tp.T, rho, true, k.f.Limits().TFloor, tp.T)
	if !ok || !(pr.P > pHi) {
		return State{}, nil, false
	}
	k.decide(0)
	st, err = k.wanted(k.finish(&pr))
	return st, err, true
}

// duDirect is DU by the direct solves of coexist.go, before the iteration
// along the isochore: the solid (where ρ is dense enough for one), and
// the mixtures of the sublimation curve (below the triple point) and of
// the melting curve (CO2 above it, water below it). ok is false where
// none is found.
func (k *call) duDirect(rho, u float64, below bool) (State, bool) {
	n := k.sol.n
	if rho >= n.solidRhoMin {
		if st, ok := k.duSolidPhase(rho, u); ok {
			return st, true
		}
	}
	if below {
		if st, ok := k.duMixture(n.sub, true, rho, u); ok {
			return st, true
		}
	}
	if below == k.sol.anomalous() {
		if st, ok := k.duMixture(n.melt, false, rho, u); ok {
			return st, true
		}
	}
	return State{}, false
}

// side returns a copy of k for a side evaluation, which must not change
// k's decided state nor answer to its options.
func (k *call) side() call {
	c := *k
	c.opt = Options{}
	return c
}

// isochoreRoot solves u(T) = u along the isochore rho for T in [a, b] on
// the side given of the triple point, by Newton's method with the slope
// cv of each state (two-phase cv in a mixture), bracketed: u rises with T
// along every isochore.
func (k *call) isochoreRoot(rho, u, a, b float64, below bool) (State, error) {
	eval := func(T float64) (State, error) {
		c := k.side()
		return c.atTRho(rho, T, below)
	}
	tol := qU.tol(k.f, nil, u)
	sa, err := eval(a)
	if err != nil {
		return State{}, err
	}
	if math.Abs(sa.U-u) <= tol || sa.U > u && sa.U-u <= qU.floor(k.f, nil, u) {
		// (At the lowest temperature, u within its backward-residual
		// floor of the state there: that state, at the end of the models.)
		return k.wantedState(sa)
	}
	if sa.U > u {
		if below {
			return State{}, k.fail(fluid.ErrOutOfRange, "below the states of the isochore at the lowest temperature "+
				fmtG(a)+" K of the models")
		}
		return State{}, k.fail(fluid.ErrNoConvergence, "the iteration along the isochore did not converge")
	}
	// Where a dense isochore of water passes through the other ices the
	// states are outside the models: such a temperature bounds the
	// bracket from above, as the ices lie above the ice Ih it starts in.
	gaps := below && k.sol.anomalous()
	var gapErr error
	T := 0.5 * (a + b)
	sb, err := eval(b)
	switch {
	case err != nil && !gaps:
		return State{}, err
	case err != nil:
		gapErr, b = err, T
	default:
		fa, fb := sa.U-u, sb.U-u
		if math.Abs(fb) <= tol {
			return k.wantedState(sb)
		}
		T = a + (b-a)*(-fa)/(fb-fa)
	}
	if g := k.opt.Guess; g != nil && g.T > a && g.T < b {
		T = g.T
	}
	for it := 0; it < 200; it++ {
		st, err := eval(T)
		if err != nil {
			if !gaps {
				return State{}, err
			}
			gapErr, b = err, T
			T = 0.5 * (a + b)
			continue
		}
		r := st.U - u
		if math.Abs(r) <= tol {
			return k.wantedState(st)
		}
		if r > 0 {
			b = T
		} else {
			a = T
		}
		if b-a <= 1e-15*b {
			if math.Abs(r) <= qU.floor(k.f, nil, u) {
				return k.wantedState(st)
			}
			break
		}
		if gapErr != nil && r < 0 {
			// Below a gap the root may still lie above this state:
			// step by halves toward the gap.
			T = 0.5 * (T + b)
			continue
		}
		Tn := T - r/st.Cv
		if !(Tn > a && Tn < b) || !isFinite(Tn) {
			Tn = 0.5 * (a + b)
		}
		T = Tn
	}
	if gapErr != nil {
		return State{}, gapErr
	}
	return State{}, k.fail(fluid.ErrNoConvergence, "the iteration along the isochore did not converge")
}

// ---------------------------------------------------------------------
// PD

// belowMeltS reports whether (T, s) of CO2 at a temperature of its
// melting curve lies at or below the entropy of the liquid on the curve
// there, by the node tables (below both neighbouring nodes' liquid, less
// a step, for where it is not monotone), so that it has dry ice or is a
// liquid next to the curve: tsSolid places it against the curve itself.
func (k *call) belowMeltS(T, s float64) bool {
	n := k.sol.n
	if !k.mayMelt(T) {
		return false
	}
	i := n.meltIndexT(T)
	a, b := n.melt[i].Fluid.S, n.melt[i+1].Fluid.S
	_, ds := k.f.ReferenceOffsets()
	return s-ds <= max(a, b)+math.Abs(b-a)
}

// denseMelt reports whether (p, ρ) of CO2 at a pressure of its melting
// curve is at least as dense as the liquid on the curve there, by the
// node tables (the liquid's density rises along the curve), so that it
// has dry ice: the solid paths place it against the curve (pdSolid). It
// is false for water, whose ice is lighter than its liquid, and where
// the fluid has no solid model.
func (k *call) denseMelt(p, rho float64) bool {
	n := k.sol.n
	if !n.meltRising || !(p > n.pt*(1+tripleTolP) && p <= n.solidPMax()) {
		return false
	}
	i := bracketIndex(n.meltP, p)
	return rho >= n.melt[i].Fluid.Rho*(1-1e-9)
}

// pdSolid is PD where the state may have solid.
func (k *call) pdSolid(p, rho float64) (State, error) {
	if !k.sol.ok {
		return State{}, k.solidError("below the triple point")
	}
	n := k.sol.n
	lim := k.f.Limits()
	v := 1 / rho
	var c sublimation.Coexistence
	var err error
	vapour := false
	switch {
	case k.onTripleP(p):
		tpv, err := k.triple()
		tp := &tpv
		if err != nil {
			return State{}, err
		}
		if st, ok := k.tripleVolumes(tp, v); ok {
			return k.wantedState(st)
		}
		if k.sol.anomalous() && v < 1/tp.Liquid.Rho {
			// Water denser than its liquid at the triple point: the
			// liquid above Tt, below its density maximum.
			k.decide(tp.T)
			return k.pd(p, rho)
		}
		c = sublimation.Coexistence{T: tp.T, P: tp.P, Solid: tp.Solid, Fluid: tp.Vapor}
		vapour = true
	case p < n.pt:
		if n.belowSubPMin(p) {
			k.decide(lim.TFloor)
			return k.pd(p, rho)
		}
		if c, err = k.subAtP(p); err != nil {
			return State{}, err
		}
		vapour = true
	case p > n.solidPMax():
		k.decide(k.freezeTHi(p))
		st, err := k.pd(p, rho)
		if err != nil {
			return State{}, k.beyondError(k.beyondWhy(p))
		}
		return st, nil
	default:
		if c, err = k.meltAtP(p); err != nil {
			return State{}, err
		}
	}
	vs, vf := 1/c.Solid.Rho, 1/c.Fluid.Rho
	switch {
	case v > min(vs, vf) && v < max(vs, vf):
		return k.wantedState(k.coexistState(&c, vapour, (v-vs)/(vf-vs)))
	case (vf > vs) == (v >= vf):
		// On the fluid's side of the curve.
		k.decide(c.T)
		return k.pd(p, rho)
	}
	sp, ok := k.solidSolve(qRho, rho, true, 0, p, k.solidFloorT(), c.T)
	if !ok {
		return State{}, k.fail(fluid.ErrOutOfRange, "no state of "+k.f.Name()+" with this pressure and density")
	}
	return k.wantedState(solidState(&sp))
}

// ---------------------------------------------------------------------
// TS

// tsSolid is TS where the state may have solid. Where the solid's entropy
// and a mixture's overlap along the isotherm (ice below its melting curve)
// the state of lowest pressure is returned, as for liquid water.
func (k *call) tsSolid(T, s float64) (State, error) {
	if !k.sol.ok {
		return State{}, k.solidError("below the triple point")
	}
	n := k.sol.n
	if k.onTripleT(T) {
		tpv, err := k.triple()
		tp := &tpv
		if err != nil {
			return State{}, err
		}
		ss, sl, sv := tp.Solid.S, tp.Liquid.S, tp.Vapor.S
		var st State
		switch {
		case s > sv:
			k.decide(0)
			return k.ts(T, s, 0, tp.Vapor.Rho)
		case s >= sl:
			sat := tripleSaturation(tp)
			st = twoPhase(k.f, &sat, (s-sl)/(sv-sl))
		case s >= ss:
			c := sublimation.Coexistence{T: tp.T, P: tp.P, Solid: tp.Solid, Fluid: tp.Vapor}
			st = k.coexistState(&c, true, (s-ss)/(sv-ss))
		default:
			return k.solidIsotherm(T, s, tp.P, n.solidPMax())
		}
		st.Flags |= Indeterminate
		return k.wantedState(st)
	}
	var c sublimation.Coexistence
	var err error
	if k.belowTripleT(T) {
		if T < n.subTMin() {
			return k.solidIsotherm(T, s, n.subPMin(), n.solidPMax())
		}
		if c, err = k.subAtT(T); err != nil {
			return State{}, err
		}
		ss, sv := c.Solid.S, c.Fluid.S
		switch {
		case s > sv:
			k.decide(0)
			return k.ts(T, s, 0, c.Fluid.Rho)
		case s >= ss:
			return k.wantedState(k.coexistState(&c, true, (s-ss)/(sv-ss)))
		}
		if n.meltRising || T < n.meltEndT() {
			return k.solidIsotherm(T, s, c.P, n.solidPMax())
		}
		m, err := k.meltAtT(T)
		if err != nil {
			return State{}, err
		}
		if s >= m.Solid.S {
			return k.solidIsotherm(T, s, c.P, m.P)
		}
		// Below the ice on its melting curve: the liquid beyond it.
		k.decide(0)
		return k.ts(T, s, m.Fluid.Rho, 0)
	}
	// Above the triple point: dry ice on and beyond its melting curve.
	if c, err = k.meltAtT(T); err != nil {
		return State{}, err
	}
	ss, sl := c.Solid.S, c.Fluid.S
	switch {
	case s > sl:
		k.decide(0)
		return k.ts(T, s, 0, c.Fluid.Rho)
	case s >= ss:
		return k.wantedState(k.coexistState(&c, false, (s-ss)/(sl-ss)))
	}
	return k.solidIsotherm(T, s, c.P, n.solidPMax())
}

// solidIsotherm returns the solid at T with entropy s, its pressure
// between plo and phi.
func (k *call) solidIsotherm(T, s, plo, phi float64) (State, error) {
	sp, ok := k.solidSolve(qS, s, false, T, 0, plo, phi)
	if !ok {
		if g := k.sol.s.Derivs(T, phi); -g.GT > s {
			if phi >= k.sol.n.solidPMax() {
				return State{}, k.beyondError(k.beyondWhy(phi))
			}
		}
		return State{}, k.fail(fluid.ErrOutOfRange, "no state of "+k.f.Name()+" with this temperature and entropy")
	}
	return k.wantedState(solidState(&sp))
}

// mayMelt reports whether the isotherm T above the triple point crosses
// the melting curve of dry ice.
func (k *call) mayMelt(T float64) bool {
	n := k.sol.n
	return k.sol.ok && !k.decided && n.meltRising && !k.belowTripleT(T) && T <= n.meltEndT()
}

// ---------------------------------------------------------------------
// HS

// hsTriple reports whether (h, s) lies on the triple line, h = g_t + Tt·s
// within the residual floor of h with s between the solid's and the
// vapour's: every three-phase mixture does, and (h, s) does not fix its
// fractions.
func (k *call) hsTriple(h, s float64) bool {
	if !k.sol.ok {
		return false
	}
	tpv, err := k.triple()
	tp := &tpv
	if err != nil || s < tp.Solid.S || s > tp.Vapor.S {
		return false
	}
	return math.Abs(h-tp.Vapor.G-tp.T*s) <= qH.floor(k.f, nil, h)
}
