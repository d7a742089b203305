package flash

import (
	"math"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// phaseState returns the PhaseState of pr as phase ph with mass fraction x.
func phaseState(pr *fluid.Props, ph Phase, x float64) PhaseState {
	return PhaseState{Phase: ph, Fraction: x, Rho: pr.Rho, H: pr.H, S: pr.S, U: pr.U,
		Cp: pr.Cp, Cv: pr.Cv, W: pr.W}
}

// single returns the single-phase state of pr as phase ph.
func single(pr *fluid.Props, ph Phase) State {
	var st State
	setSingle(&st, pr, ph)
	return st
}

// set sets st to v and returns err, for a state and error returned
// together: return st.set(f()).
func (st *State) set(v State, err error) error {
	*st = v
	return err
}

// setSingle sets st to the single-phase state of pr as phase ph.
func setSingle(st *State, pr *fluid.Props, ph Phase) {
	// (Zeroed, then set field by field: a composite literal would be
	// built aside and copied, which costs as much again.)
	*st = State{}
	st.T, st.P, st.Rho, st.H, st.S, st.U = pr.T, pr.P, pr.Rho, pr.H, pr.S, pr.U
	st.Cp, st.Cv, st.W, st.Phase, st.N, st.Flags = pr.Cp, pr.Cv, pr.W, ph, 1, pr.Flags
	if ph == Vapor {
		st.Quality = 1
	}
	setPhase(&st.Phases[0], pr, ph, 1)
}

// setPhase sets ps to phaseState(pr, ph, x) in place.
func setPhase(ps *PhaseState, pr *fluid.Props, ph Phase, x float64) {
	ps.Phase, ps.Fraction, ps.Rho, ps.H, ps.S, ps.U = ph, x, pr.Rho, pr.H, pr.S, pr.U
	ps.Cp, ps.Cv, ps.W = pr.Cp, pr.Cv, pr.W
}

// fluidPhase names the phase of a single-phase fluid state (DESIGN.md):
// Supercritical above Tc and pc; at or below Tc the liquid-like branch
// (ρ > ρc) is Liquid; otherwise Vapor.
func fluidPhase(f *fluid.Fluid, T, p, rho float64) Phase {
	c := f.Critical()
	switch {
	case T > c.T && p > c.P:
		return Supercritical
	case T > c.T:
		return Vapor
	case p > c.P || rho > c.Rho:
		return Liquid
	}
	return Vapor
}

// twoPhase returns the liquid–vapour state of saturation s at vapour mass
// fraction q. q = 0 and q = 1 give the saturated liquid and vapour as
// single-phase states, flagged Saturated.
//
// The mixture's ρ, h, s and u follow from its phases (1/ρ = (1−q)/ρ′ +
// q/ρ″, h = (1−q)h′ + q h″, …) and Cp = +Inf. Cv and W are derivatives of
// the mixture along its equilibrium paths, computed analytically from the
// properties of the two phases along the Clausius–Clapeyron slope
// γ = dp_sat/dT = (s″ − s′)/(v″ − v′): see fluidAlong (each phase along
// the curve) and mixDerivs (cv at fixed v, w² = (∂p/∂ρ)_s).
//
// At the critical point itself (T = Tc) the state is the critical state,
// with cv = cp = +Inf and w = 0 where the equation has nonanalytic terms.
func twoPhase(f *fluid.Fluid, s *fluid.Saturation, q float64) State {
	var st State
	setTwoPhase(f, s, q, &st)
	return st
}

// setTwoPhase sets st to twoPhase(f, s, q).
func setTwoPhase(f *fluid.Fluid, s *fluid.Saturation, q float64, st *State) {
	l, v := &s.Liquid, &s.Vapor
	if q <= 0 || q >= 1 {
		// The saturated phase at the saturation pressure: a dense
		// liquid's own p at its density scatters by about 1e-13·ρ′RT
		// (4e-8·p for water at its triple point), the vapour's does not.
		if q <= 0 {
			setSingle(st, l, Liquid)
		} else {
			setSingle(st, v, Vapor)
		}
		st.P = s.P
		st.Flags |= Saturated | s.Flags&AtCritical
		return
	}
	*st = State{}
	st.T, st.P, st.Phase, st.Quality, st.N = s.T, s.P, TwoPhase, q, 2
	st.Flags = Saturated | s.Flags&(Extrapolated|AtCritical) | (l.Flags|v.Flags)&Extrapolated
	vl, vv := 1/l.Rho, 1/v.Rho
	st.Rho = 1 / (vl + q*(vv-vl))
	st.H = l.H + q*(v.H-l.H)
	st.S = l.S + q*(v.S-l.S)
	st.U = l.U + q*(v.U-l.U)
	st.Cp = math.Inf(1)
	setPhase(&st.Phases[0], l, Liquid, 1-q)
	setPhase(&st.Phases[1], v, Vapor, q)
	if s.Flags&AtCritical != 0 {
		st.Cv, st.W = l.Cv, l.W
		return
	}
	gamma := (v.S - l.S) / (vv - vl)
	st.Cv, st.W = mixDerivs(1/st.Rho, gamma, vl, vv, l.U, v.U, l.S, v.S,
		fluidAlong(l, gamma), fluidAlong(v, gamma), q)
}
