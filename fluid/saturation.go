package fluid

import (
	"math"

	"github.com/tripoint-thermo/tripoint/helmholtz"
)

// Saturation is a point of the vapour–liquid coexistence curve of a fluid's
// equation of state: temperature T in K, pressure P in Pa, and the
// properties of the saturated liquid (T, ρ′) and vapour (T, ρ″). Liquid
// and Vapor carry the Saturated flag; Flags is Saturated, with AtCritical
// at the critical point itself and Extrapolated where the phases are.
type Saturation struct {
	T, P          float64
	Liquid, Vapor Props
	Flags         Flags
}

// satPair is a solution of the phase-equilibrium conditions in reduced
// variables, with αʳ and its δ-derivatives of both phases (what the
// conditions need) and, once full is set, all their derivatives.
type satPair struct {
	tau, dl, dv float64
	il, iv      helmholtz.DeltaDerivs
	rl, rv      helmholtz.Derivs // where full
	full        bool
	strict      bool // Newton's method met its residual bounds (not only the rounding floor)
}

// pi returns the reduced pressure p/(ρc R T) of the vapour side.
func (s *satPair) pi() float64 { return s.dv * (1 + s.dv*s.iv.D) }

// complete evaluates all the derivatives of both phases of s, unless they
// are there: one full evaluation each.
func (f *Fluid) complete(s *satPair) {
	if !s.full {
		s.rl, s.rv, s.full = f.residual(s.dl, s.tau), f.residual(s.dv, s.tau), true
	}
}

// Tolerances of the saturation Newton iterations. An iterate is converged
// when the residuals of the reduced conditions are at the rounding level
// of the equation: |ΔP| ≤ satTolP and |ΔG| ≤ satTolG. The rounding of a
// reduced pressure P = δ(1 + δαʳ_δ) grows with δ and with τ: in a cold
// liquid 1 + δαʳ_δ is a small difference of terms of order 10² (IAPWS-95
// liquid at 273.16 K, τ = 2.37, scatters by 1e-12 in P and 3e-13 in G
// between neighbouring floating-point densities; near the critical point
// by 1e-15). The bounds model that as 1e-14·τ⁴. Near the critical point
// the densities are uncertain even at these residuals (the Jacobian is
// nearly singular). See newtonWatch for iterations that stall.

// newtonWatch watches the residual of a Newton iteration, scaled so that
// 1 is the convergence bound, and its relative Newton steps. check
// reports conv when the iteration is to stop: converged (res ≤ 1/16; or
// res ≤ 1 on two successive iterates, the caller keeping the better one;
// or res ≤ 1/2 where the iterate's own Newton step is at rounding level,
// below satStepRound, after a step below satStepQuad: quadratic
// convergence has then taken the iteration to where a further iterate
// differs from this one only by rounding), or stalled (three iterations
// without halving the best residual: rounding noise drives the steps),
// in which case ok says whether the residual is within 5 times the
// bound, the rounding floor of the equation.
//
// The bound of the step-size rule is half the convergence bound: the
// model of the rounding in satTolP lies up to 2.3 times above the
// scatter of the equation's pressure that TestSaturationResiduals allows
// (8 times the scatter between neighbouring floating-point densities;
// R-134a near 350 K). With the full bound the iteration stopped outside
// that test's bound at 3 of 2892 saturation states (241 temperatures
// from the triple point to Tc − 1 mK per fluid, at T and at p, from
// the auxiliary equations and from the cached curve); with half of it
// at none but the one state where the rule of two iterates alone does
// too (IAPWS-95 at p, from the auxiliary equations). Near the bound,
// the rule of two iterates keeps the better one.
type newtonWatch struct {
	best     float64
	n        int
	near     bool    // the previous iterate met the bound
	prevStep float64 // the previous iterate's relative Newton step
}

// newNewtonWatch returns a newtonWatch for a new iteration.
func newNewtonWatch() newtonWatch {
	return newtonWatch{best: math.Inf(1), prevStep: math.Inf(1)}
}

// Step sizes of newtonWatch and of the full last iterations. A relative
// Newton step below satStepRound is at the rounding level of the
// saturation conditions (the converged iterates' steps are 1e-16 to
// 2e-14: IAPWS-95 in the cold liquid, where p(δ) is steepest, the
// largest); one below satStepQuad is in the quadratic regime, and one
// below satStepFull takes the iteration within rounding of the root (the
// next step is about the square of this one: the saturation solvers
// evaluate that iterate fully, as the result needs).
const (
	satStepRound = 1e-13
	satStepQuad  = 1e-6
	satStepFull  = 1e-7
)

func (w *newtonWatch) check(res, step float64) (conv, ok bool) {
	quad := step <= satStepRound && w.prevStep <= satStepQuad
	w.prevStep = step
	if res <= 1.0/16 || res <= 1 && w.near || res <= 0.5 && quad {
		return true, true
	}
	w.near = res <= 1
	if res < 0.5*w.best {
		w.best, w.n = res, 0
		return false, false
	}
	w.n++
	if w.n >= 3 {
		return true, res <= 5
	}
	return false, false
}

// satTolP and satTolG are the tolerances at reduced pressure P, density δ
// and inverse reduced temperature τ.
func satTolP(P, delta, tau float64) float64 {
	t2 := tau * tau
	return 1e-14 * (delta*t2*t2 + math.Abs(P))
}

func satTolG(tau float64) float64 {
	t2 := tau * tau
	return 1e-14 * t2 * t2
}

// SaturationAtT returns the vapour–liquid saturation of f at temperature T
// in K, from the triple point to the critical point (Tc, pc, ρc) =
// Critical(), the equation's own (for R-134a above its reducing
// temperature).
//
// It solves the phase-equilibrium conditions of the equation of state,
//
//	p(T, ρ′) = p(T, ρ″),   g(T, ρ′) = g(T, ρ″),
//
// by Newton's method in the reduced densities (δ′, δ″) with the analytic
// Jacobian, every evaluation on the isotherm T (helmholtz.Isotherm),
// started from the auxiliary saturated-density equations; the phases'
// properties come from one full evaluation each. If
// Newton's method fails, it falls back on a bracketed
// Newton iteration in p on g′(p) − g″(p) = 0, whose derivative is
// 1/ρ′ − 1/ρ″, with both densities from Density, and polishes the result
// with the first method.
//
// Accuracy: down to Tc − 1 mK the residuals |Δp| and |Δg|/(RT) are at
// the rounding level of the equation itself (in a cold liquid its
// pressure scatters by about 1e-13·ρ′RT between neighbouring
// floating-point densities; elsewhere |Δp|/p and |Δg|/(RT) are about
// 1e-14). Between Tc − 1 mK and Tc the two densities close as
// (Tc − T)^β, the Jacobian becomes singular and the Gibbs-energy
// difference that tells the phases apart sinks below rounding: there
// Newton's method is started from a model of the curve anchored at the
// equation's own solutions at Tc − 1 mK, 0.1 mK, 10 µK and 1 µK (where
// they converge) and at the critical point (see nearCrit), and the
// model's values are returned where Newton's method cannot resolve the
// densities: wherever its result strays from the model, and everywhere
// below the last anchor at which it converges (1 µK below Tc for
// Span–Wagner and Tillner-Roth–Baehr, 10 µK for IAPWS-95), where its
// results would scatter from one temperature to the next by more than
// the properties change (ρ′ by 3e-5 relative between temperatures 0.2 nK
// apart), so that p, ρ′ and ρ″ are smooth functions of T there. In that
// band P is the model's pressure, rising to pc; p, ρ′
// and −ρ″ rise monotonically toward the critical point; ρ″ < ρc < ρ′;
// the residuals |Δp|/p, |Δg|/(RT) and the difference between P and the
// vapour's own pressure stay within 1e-12; P never exceeds pc; and the
// curve meets the critical point without a jump (TestSaturationNearCritical).
// The equation itself fixes the densities there only loosely: at
// Tc − 10 µK, IAPWS-95 states whose ρ′ differ by 3e-5 relative satisfy
// the conditions equally well.
//
// Special cases are:
//
//	T NaN, ±Inf or ≤ 0: ErrInvalidInput
//	T > Tc: ErrOutOfRange (no saturation above the critical temperature)
//	T < Tt, the triple-point temperature: ErrOutOfRange (no vapour–liquid
//	  saturation below the triple point: the liquid freezes)
//	T = Tc: the critical point, ρ′ = ρ″ = ρc, P = pc, flags
//	  Saturated|AtCritical; both phases are Props(Tc, ρc), the critical
//	  state (Cp = +Inf; Cv = +Inf and W = 0 with nonanalytic terms,
//	  finite Cv and W without them)
//
// SaturationAtT allocates nothing unless it returns an error.
func (f *Fluid) SaturationAtT(T float64) (Saturation, error) {
	const op = "fluid.SaturationAtT"
	in := Input{"T", T, "K"}
	if !finite(T) || T <= 0 {
		return Saturation{}, NewError(op, ErrInvalidInput, "T must be finite and positive", in)
	}
	if T > f.crit.T {
		return Saturation{}, NewError(op, ErrOutOfRange,
			"no vapour-liquid saturation above the critical temperature; "+f.satRange(), in)
	}
	if T < f.triple.T {
		return Saturation{}, NewError(op, ErrOutOfRange,
			"no vapour-liquid saturation below the triple point, where the liquid freezes; "+f.satRange(), in)
	}
	if T == f.crit.T {
		return f.criticalSaturation(), nil
	}
	s, ok := f.satT(f.tc/T, true)
	if !ok {
		return Saturation{}, NewError(op, ErrNoConvergence, "the saturation iteration did not converge", in)
	}
	sat := f.saturation(&s, T, 0)
	// Within a few ulps of Tc the vapour's pressure may round above pc.
	sat.P = min(sat.P, f.crit.P)
	return sat, nil
}

// SaturationAtP returns the vapour–liquid saturation of f at pressure p in
// Pa, from the triple-point pressure to the critical pressure.
//
// It solves p(T, ρ′) = p, p(T, ρ″) = p and g(T, ρ′) = g(T, ρ″) by Newton's
// method in (δ′, δ″, τ) with the analytic Jacobian, started from the
// auxiliary equations (the vapour-pressure equation inverted for T). If
// that fails it falls back on a bracketed Newton iteration in T on
// SaturationAtT, with the slope of the vapour-pressure curve from the
// Clausius–Clapeyron equation. The accuracy is that of SaturationAtT; P
// is the given p.
//
// Special cases are:
//
//	p NaN, ±Inf or ≤ 0: ErrInvalidInput
//	p > pc = Critical().P: ErrOutOfRange
//	p below the equation's vapour pressure at the triple-point
//	  temperature (which is Triple().P where the triple point is the
//	  equation's own): ErrOutOfRange (no vapour–liquid saturation below
//	  the triple point)
//	p = pc: the critical point, as SaturationAtT(Tc)
//
// SaturationAtP allocates nothing unless it returns an error.
func (f *Fluid) SaturationAtP(p float64) (Saturation, error) {
	const op = "fluid.SaturationAtP"
	in := Input{"p", p, "Pa"}
	if !finite(p) || p <= 0 {
		return Saturation{}, NewError(op, ErrInvalidInput, "p must be finite and positive", in)
	}
	if p > f.crit.P {
		return Saturation{}, NewError(op, ErrOutOfRange,
			"no vapour-liquid saturation above the critical pressure; "+f.satRangeP(), in)
	}
	belowTriple := func() error {
		return NewError(op, ErrOutOfRange,
			"no vapour-liquid saturation below the triple-point pressure, where vapour meets the solid; "+f.satRangeP(), in)
	}
	if p < 0.9*f.triple.P {
		return Saturation{}, belowTriple()
	}
	if p == f.crit.P {
		return f.criticalSaturation(), nil
	}
	s, ok := f.satP(p)
	if !ok {
		return Saturation{}, NewError(op, ErrNoConvergence, "the saturation iteration did not converge", in)
	}
	T := f.tc / s.tau
	if T < f.triple.T*(1-1e-12) {
		return Saturation{}, belowTriple()
	}
	return f.saturation(&s, T, p), nil
}

// SaturationAtTFrom is SaturationAtT started from the saturated densities
// rhoL and rhoV in kg/m³ of a nearby saturation state (a warm start);
// where they are not usable (not finite, not on either side of ρc) it is
// SaturationAtT.
func (f *Fluid) SaturationAtTFrom(T, rhoL, rhoV float64) (Saturation, error) {
	var s Saturation
	err := f.setSaturationAtTFrom(&s, T, rhoL, rhoV)
	return s, err
}

// SaturationAtPFrom is SaturationAtP started from the temperature T in K
// and the saturated densities rhoL and rhoV in kg/m³ of a nearby
// saturation state (a warm start); where they are not usable it is
// SaturationAtP. From a start within about 1e-11 of the saturation (the
// cached curve's, SaturationPointAtP), away from the critical point, its
// Newton step is taken by the start's own derivatives (satLinearStep):
// the phases' p, h, s, u and g are then the equation's to rounding, their
// cv, cp and w within about 1e-11, at one evaluation of each phase.
func (f *Fluid) SaturationAtPFrom(p, T, rhoL, rhoV float64) (Saturation, error) {
	var s Saturation
	err := f.setSaturationAtPFrom(&s, p, T, rhoL, rhoV)
	return s, err
}

// setSaturationAtPFrom sets dst to SaturationAtPFrom(p, T, rhoL, rhoV)
// in place and returns its error (dst is then the zero Saturation).
func (f *Fluid) setSaturationAtPFrom(dst *Saturation, p, T, rhoL, rhoV float64) (err error) {
	if f.warmUsable(T, rhoL, rhoV) && p >= f.triple.P && p < f.crit.P {
		var s satPair
		if f.satNewtonP(&s, p, f.tc/T, rhoL/f.rhoc, rhoV/f.rhoc) && s.strict {
			if Ts := f.tc / s.tau; Ts >= f.triple.T && Ts < f.crit.T-critBand {
				f.setSaturation(dst, &s, Ts, p)
				return nil
			}
		}
	}
	*dst, err = f.SaturationAtP(p)
	return err
}

// setSaturationAtTFrom is setSaturationAtPFrom for SaturationAtTFrom.
func (f *Fluid) setSaturationAtTFrom(dst *Saturation, T, rhoL, rhoV float64) (err error) {
	if f.warmUsable(T, rhoL, rhoV) {
		if s, ok := f.satNewtonT(f.tc/T, rhoL/f.rhoc, rhoV/f.rhoc, true); ok && s.strict {
			f.setSaturation(dst, &s, T, 0)
			return nil
		}
	}
	*dst, err = f.SaturationAtT(T)
	return err
}

// warmUsable reports whether a warm start lies where Newton's method
// applies: Tt ≤ T < Tc − critBand, ρ″ < ρc < ρ′ (Tc and ρc of
// Critical()).
func (f *Fluid) warmUsable(T, rhoL, rhoV float64) bool {
	c := &f.crit
	return T >= f.triple.T && T < c.T-critBand && rhoL > c.Rho && rhoL < f.limits.RhoCeil &&
		rhoV > 0 && rhoV < c.Rho
}

// AuxSaturationTemperature returns the saturation temperature in K at
// pressure p in Pa from f's auxiliary vapour-pressure equation, inverted
// by the secant method in 1/T on ln p: an estimate for starting values
// and phase checks, as accurate as that equation. Where the published
// equation ends below the equation of state's critical point (R-134a), it
// is the equation as the solvers use it, carried on to Critical() within
// 0.37 K of Tc (see AuxVaporPressure), so that every p up to
// Critical().P has an estimate. It returns an error
// wrapping ErrUndefined for a fluid without one, ErrInvalidInput for a
// p that is not finite and positive, and ErrOutOfRange outside
// Triple().P ≤ p ≤ Critical().P.
func (f *Fluid) AuxSaturationTemperature(p float64) (float64, error) {
	const op = "fluid.AuxSaturationTemperature"
	in := Input{"p", p, "Pa"}
	switch {
	case f.aux.psat == nil:
		return 0, NewError(op, ErrUndefined, "no auxiliary vapour-pressure equation for "+f.name, in)
	case !finite(p) || p <= 0:
		return 0, NewError(op, ErrInvalidInput, "p must be finite and positive", in)
	case p < f.triple.P || p > f.crit.P:
		return 0, NewError(op, ErrOutOfRange, "valid range "+fmtG(f.triple.P)+" <= p <= "+fmtG(f.crit.P)+" Pa", in)
	}
	return f.auxTsat(p), nil
}

func (f *Fluid) satRange() string {
	return "valid range " + fmtG(f.triple.T) + " <= T <= " + fmtG(f.crit.T) + " K for " + f.name
}

func (f *Fluid) satRangeP() string {
	return "valid range from the vapour pressure at the triple-point temperature " + fmtG(f.triple.T) +
		" K (about " + fmtG(f.triple.P) + " Pa) to " + fmtG(f.crit.P) + " Pa for " + f.name
}

// criticalSaturation returns the critical point as a saturation state:
// both phases are the critical state Props(Critical().T, Critical().Rho),
// flagged AtCritical.
func (f *Fluid) criticalSaturation() Saturation {
	c := f.props(f.crit.T, f.crit.Rho)
	c.Flags |= Saturated
	return Saturation{T: f.crit.T, P: f.crit.P, Liquid: c, Vapor: c,
		Flags: Saturated | AtCritical | c.Flags&Extrapolated}
}

// critReduced returns the critical point in the equation's reduced
// variables, δc = ρc/ρr and τc = Tr/Tc (both 1 for an equation
// constrained to its reducing point Tr, ρr).
func (f *Fluid) critReduced() (dc, tauc float64) {
	return f.crit.Rho / f.rhoc, f.tc / f.crit.T
}

// seedT returns the temperature at which the auxiliary saturation
// equations are evaluated for a starting value at T, and the factor on
// their pressure. Where they end at the equation's own critical point
// (water, CO2) that is T itself and 1. Where they end below it (R-134a:
// the publication's 374.18 K and 4.05629 MPa, the equation's 374.212 K
// and 4.05928 MPa) they are used as published up to θ = 1 − T/Tc =
// seedBlend (Tc = Critical().T; 0.37 K below Tc for R-134a) and carried
// on from there to the equation's critical point: T is shifted down by
// (Tc − Tc,aux)·s and the pressure scaled by 1 + (pc/pc,aux − 1)·s, with
// s = 1 − θ/seedBlend rising linearly to 1 at Tc, so that they reach
// (Tc, pc) continuously (TestR134aSeeds).
func (f *Fluid) seedT(T float64) (Ta, pScale float64) {
	if f.aux.tc <= 0 {
		return T, 1
	}
	s := 1 - (1-T/f.crit.T)/seedBlend
	if s <= 0 {
		return T, 1
	}
	s = min(s, 1)
	return min(T-(f.crit.T-f.aux.tc)*s, f.aux.tc), 1 + (f.crit.P/f.aux.pc-1)*s
}

// seedBlend is the θ = 1 − T/Tc below which seedT carries auxiliary
// equations on to the equation's critical point.
const seedBlend = 1e-3

// seedPsat returns the auxiliary vapour pressure at T in Pa as a
// starting value (see seedT), for Tt ≤ T ≤ Critical().T; 0 for a fluid
// without one.
func (f *Fluid) seedPsat(T float64) float64 {
	if f.aux.psat == nil {
		return 0
	}
	Ta, k := f.seedT(T)
	return k * f.aux.psat(Ta)
}

// saturation builds the exported result; p > 0 overrides the pressure.
func (f *Fluid) saturation(s *satPair, T, p float64) Saturation {
	var sat Saturation
	f.setSaturation(&sat, s, T, p)
	return sat
}

// setSaturation sets dst to saturation(s, T, p) in place (the hot path
// of the warm and cached starts: no copies of the two phases).
func (f *Fluid) setSaturation(dst *Saturation, s *satPair, T, p float64) {
	f.complete(s)
	*dst = Saturation{}
	l, v := &dst.Liquid, &dst.Vapor
	f.setPropsPairFromResidual(l, v, T, s.dl*f.rhoc, s.dv*f.rhoc, &s.rl, &s.rv)
	l.Flags |= Saturated
	v.Flags |= Saturated
	if p <= 0 {
		p = v.P
	}
	dst.T, dst.P = T, p
	dst.Flags = Saturated | (l.Flags|v.Flags)&Extrapolated
}

// auxDensities returns starting reduced densities at τ from the auxiliary
// equations (see seedT), clamped to δ″ < δc < δ′.
func (f *Fluid) auxDensities(tau float64) (dl, dv float64) {
	T := f.tc / tau
	dc, _ := f.critReduced()
	if f.aux.rhoLiq != nil && f.aux.rhoVap != nil {
		Ta, _ := f.seedT(T)
		dl, dv = f.aux.rhoLiq(Ta)/f.rhoc, f.aux.rhoVap(Ta)/f.rhoc
	} else {
		// No auxiliary equations: a rough corresponding-states start.
		th := math.Max(1-T/f.crit.T, 0)
		dl, dv = dc*(1+2*math.Cbrt(th)), dc*math.Exp(-8*math.Cbrt(th))
	}
	if !(dl > dc) || !finite(dl) {
		dl = dc * (1 + 1e-3)
	}
	if !(dv < dc) || !(dv > 0) {
		dv = dc * (1 - 1e-3)
	}
	return dl, dv
}

// satT solves the saturation at τ > 1; with full, the result's phases
// are evaluated fully (see satNewtonT).
func (f *Fluid) satT(tau float64, full bool) (satPair, bool) {
	if T := f.tc / tau; f.crit.T-T < critBand {
		return f.nearCritT(T)
	}
	return f.satTSolve(tau, full)
}

// satTSolve solves the saturation at τ by Newton's method with the
// pressure iteration as fallback.
func (f *Fluid) satTSolve(tau float64, full bool) (satPair, bool) {
	dl, dv := f.auxDensities(tau)
	if s, ok := f.satNewtonT(tau, dl, dv, full); ok {
		return s, true
	}
	return f.satByPressure(tau, full)
}

// satNewtonT is Newton's method in (δ′, δ″) on the reduced conditions
//
//	P(δ′) − P(δ″) = 0,  G(δ′) − G(δ″) = 0,
//
// P = δ(1 + δαʳ_δ) = p/(ρc R T), G = ln δ + αʳ + δαʳ_δ (g/(RT) less its
// τ-only part). With P_δ = 1 + 2δαʳ_δ + δ²αʳ_δδ, G_δ = P_δ/δ, so the
// Jacobian is [[P′_δ, −P″_δ], [P′_δ/δ′, −P″_δ/δ″]]. Every evaluation is
// on the isotherm τ, but that with full set, once a Newton step below
// satStepFull shows the next iterate to be within rounding of the root,
// the iterates from there on are evaluated fully (αʳ and all its
// derivatives, as the result's properties need: s.full), so that the
// converged phases cost no evaluation beyond the iteration's.
func (f *Fluid) satNewtonT(tau, dl, dv float64, full bool) (satPair, bool) {
	var s satPair
	s.tau = tau
	dc, _ := f.critReduced()
	w := newNewtonWatch()
	bestRes := math.Inf(1)
	var iso isotherm
	iso.set(f, tau)
	fullNow := false
	var fl, fv helmholtz.Derivs
	for it := 0; it < 40; it++ {
		var rl, rv helmholtz.DeltaDerivs
		if fullNow {
			fl, fv = f.residual(dl, tau), f.residual(dv, tau)
			rl, rv = fl.Delta(), fv.Delta()
		} else {
			rl, rv = iso.eval(dl), iso.eval(dv)
		}
		Pl, Pv := dl*(1+dl*rl.D), dv*(1+dv*rv.D)
		dPl := 1 + 2*dl*rl.D + dl*dl*rl.DD
		dPv := 1 + 2*dv*rv.D + dv*dv*rv.DD
		F1 := Pl - Pv
		F2 := gibbsReduced(dl, &rl) - gibbsReduced(dv, &rv)
		det := dPl * dPv * (1/dl - 1/dv)
		a := (F1*dPv/dv - F2*dPv) / det
		b := (F1*dPl/dl - F2*dPl) / det
		if !finite(a) || !finite(b) {
			return s, false
		}
		res := max(math.Abs(F1)/satTolP(Pv, dl, tau), math.Abs(F2)/satTolG(tau))
		good := dPl > 0 && dPv > 0 && dl > dc && dv < dc
		step := max(math.Abs(a)/dl, math.Abs(b)/dv)
		conv, ok := w.check(res, step)
		if good && res < bestRes {
			bestRes = res
			s.dl, s.dv, s.il, s.iv, s.strict = dl, dv, rl, rv, res <= 1
			s.rl, s.rv, s.full = fl, fv, fullNow
		}
		if conv {
			return s, ok && bestRes <= 5
		}
		fullNow = fullNow || full && step <= satStepFull
		// Keep δ″ < δc < δ′ (the trivial solution δ′ = δ″ lies between).
		dl = stepAbove(dl, a, dc)
		dv = stepBelow(dv, b, dc)
	}
	return s, false
}

// stepAbove returns x + dx, or halfway to the bound lo if that would not
// stay above it.
func stepAbove(x, dx, lo float64) float64 {
	if x+dx > lo {
		return x + dx
	}
	return 0.5 * (x + lo)
}

// stepBelow returns x + dx, or halfway to the bound hi (or to 0) if that
// would not stay within (0, hi).
func stepBelow(x, dx, hi float64) float64 {
	switch y := x + dx; {
	case y >= hi:
		return 0.5 * (x + hi)
	case y <= 0:
		return 0.5 * x
	default:
		return y
	}
}

// satByPressure solves the saturation at τ by a bracketed Newton iteration
// in the reduced pressure π on D(π) = G(δ′(π)) − G(δ″(π)) = 0, where
// dD/dπ = 1/δ′ − 1/δ″ < 0; a π at which a root does not exist (beyond a
// spinodal) bounds the bracket. The result is polished by satNewtonT
// (with full, see there).
func (f *Fluid) satByPressure(tau float64, full bool) (satPair, bool) {
	var s satPair
	T := f.tc / tau
	dc, _ := f.critReduced()
	pi := f.seedPsat(T) / (f.rhoc * f.r * T)
	lo, hi := 0.0, math.Inf(1)
	if !(pi > 0) || !finite(pi) {
		pi = f.crit.P / (f.rhoc * f.r * T) * 0.5
	}
	var gl, gv float64 // density guesses
	var iso isotherm
	iso.set(f, tau)
	for it := 0; it < 100; it++ {
		if !(pi > lo && pi < hi) {
			switch {
			case math.IsInf(hi, 1):
				pi = 2 * lo
			case lo == 0:
				pi = hi / 2
			default:
				pi = 0.5 * (lo + hi)
			}
		}
		dv, rv, stv := f.solveDelta(&iso, pi, branchVapor, gv, nil)
		if stv != rootFound {
			hi = pi
			pi = math.NaN()
			continue
		}
		dl, rl, stl := f.solveDelta(&iso, pi, branchLiquid, gl, nil)
		if stl != rootFound {
			lo = pi
			pi = math.NaN()
			continue
		}
		gl, gv = dl, dv
		D := gibbsReduced(dl, &rl) - gibbsReduced(dv, &rv)
		if D > 0 {
			lo = pi
		} else {
			hi = pi
		}
		step := -D / (1/dl - 1/dv)
		if math.Abs(D) <= satTolG(tau) || math.Abs(step) <= 1e-15*pi || hi-lo <= 1e-15*hi {
			if p, ok := f.satNewtonT(tau, dl, dv, full); ok {
				return p, true
			}
			s.tau, s.dl, s.dv, s.il, s.iv = tau, dl, dv, rl, rv
			return s, dl > dc && dv < dc && math.Abs(D) <= 5*satTolG(tau)
		}
		pi += step
	}
	return s, false
}

// satP solves the saturation at pressure p, pt ≤ p < pc.
func (f *Fluid) satP(p float64) (satPair, bool) {
	near := p > 0.99*f.crit.P
	if near && f.aux.psat != nil {
		near = p > f.seedPsat(f.crit.T-3*critBand)
	}
	if near {
		if s, in, ok := f.nearCritP(p); in || !ok {
			return s, ok
		}
	}
	T := f.auxTsat(p)
	tau := f.tc / T
	dl, dv := f.auxDensities(tau)
	var s satPair
	if f.satNewtonP(&s, p, tau, dl, dv) {
		return s, true
	}
	return f.satPByT(p, T)
}

// auxTsat inverts the auxiliary vapour-pressure equation for T by the
// secant method in 1/T on ln p, started from the line through the triple
// and critical points; without an auxiliary equation it returns that
// line's estimate.
func (f *Fluid) auxTsat(p float64) float64 {
	tt, tc := 0.99*f.triple.T, f.crit.T
	lp := math.Log(p)
	x0, y0 := 1/tc, math.Log(f.crit.P)
	slope := (math.Log(f.triple.P) - y0) / (1/tt - x0)
	x := x0 + (lp-y0)/slope
	if f.aux.psat == nil {
		return clampT(1/x, tt, tc)
	}
	for it := 0; it < 8; it++ {
		T := clampT(1/x, tt, tc)
		x = 1 / T
		y := math.Log(f.seedPsat(T))
		if !finite(y) {
			break
		}
		if math.Abs(y-lp) < 1e-7 { // a start only: Newton's method refines it
			return T
		}
		if x != x0 {
			slope = (y - y0) / (x - x0)
		}
		x0, y0 = x, y
		x += (lp - y) / slope
	}
	return clampT(1/x, tt, tc)
}

// clampT keeps a temperature estimate inside [lo, hi·(1 − 1e-7)].
func clampT(T, lo, hi float64) float64 {
	if !(T >= lo) {
		return lo
	}
	if T > hi*(1-1e-7) {
		return hi * (1 - 1e-7)
	}
	return T
}

// satNewtonP is Newton's method in (δ′, δ″, τ) on
//
//	E1 = P(δ′, τ)/(τ πc) − 1,  E2 = P(δ″, τ)/(τ πc) − 1,  E3 = G(δ′) − G(δ″),
//
// where p = ρc R Tc P/τ and πc = p/(ρc R Tc); ∂P/∂τ = δ²αʳ_δτ and
// ∂G/∂τ = αʳ_τ + δαʳ_δτ. The Jacobian has zeros at (1,2) and (2,1), so
// the step follows in closed form from the Schur complement in τ.
func (f *Fluid) satNewtonP(s *satPair, p, tau, dl, dv float64) bool {
	*s = satPair{}
	pc := p / (f.rhoc * f.r * f.tc)
	ipc := 1 / pc
	dc, tauc := f.critReduced()
	w := newNewtonWatch()
	bestRes := math.Inf(1)
	for it := 0; it < 40; it++ {
		rl := f.residual(dl, tau)
		rv := f.residual(dv, tau)
		// (Reciprocals, computed side by side, stand for the divisions
		// of the step, which would otherwise follow one another.)
		itau, idl, idv := 1/tau, 1/dl, 1/dv
		Pl, Pv := dl*(1+dl*rl.D), dv*(1+dv*rv.D)
		dPl := 1 + 2*dl*rl.D + dl*dl*rl.DD
		dPv := 1 + 2*dv*rv.D + dv*dv*rv.DD
		k := itau * ipc // 1/(τ πc)
		E1 := Pl*k - 1
		E2 := Pv*k - 1
		il, iv := rl.Delta(), rv.Delta()
		E3 := gibbsReduced(dl, &il) - gibbsReduced(dv, &iv)
		a11, a13 := dPl*k, (dl*dl*rl.DT-Pl*itau)*k
		a22, a23 := dPv*k, (dv*dv*rv.DT-Pv*itau)*k
		ia11, ia22 := 1/a11, 1/a22
		a31, a32 := dPl*idl, -dPv*idv
		a33 := (rl.T + dl*rl.DT) - (rv.T + dv*rv.DT)
		schur := a33 - a31*a13*ia11 - a32*a23*ia22
		dt := (-E3 + a31*E1*ia11 + a32*E2*ia22) / schur
		ddl := (-E1 - a13*dt) * ia11
		ddv := (-E2 - a23*dt) * ia22
		if !finite(dt) || !finite(ddl) || !finite(ddv) {
			return false
		}
		// Residuals of the pressures in units of the reduced pressure
		// P, as in satNewtonT.
		res := max(math.Abs(E1*tau*pc)/satTolP(Pv, dl, tau), math.Abs(E2*tau*pc)/satTolP(Pv, dv, tau),
			math.Abs(E3)/satTolG(tau))
		good := dPl > 0 && dPv > 0 && dl > dc && dv < dc && tau > tauc
		step := max(math.Abs(ddl)*idl, math.Abs(ddv)*idv, math.Abs(dt)*itau)
		if good && res <= satLinearRes && min(dPl, dPv) >= satLinearDP && step <= satLinearStep {
			// The last step, by the iterate's own derivatives.
			s.tau, s.dl, s.dv = tau+dt, dl+ddl, dv+ddv
			linearResidual(&s.rl, &rl, ddl, dt)
			linearResidual(&s.rv, &rv, ddv, dt)
			s.il, s.iv = s.rl.Delta(), s.rv.Delta()
			s.full, s.strict = true, true
			return true
		}
		conv, ok := w.check(res, step)
		if good && res < bestRes {
			bestRes = res
			s.tau, s.dl, s.dv, s.rl, s.rv, s.strict = tau, dl, dv, rl, rv, res <= 1
			s.il, s.iv, s.full = il, iv, true
		}
		if conv {
			return ok && bestRes <= 5
		}
		dl = stepAbove(dl, ddl, dc)
		dv = stepBelow(dv, ddv, dc)
		tau = stepAbove(tau, dt, tauc)
	}
	return false
}

// satLinearStep and satLinearRes bound the Newton step (relative, in δ′,
// δ″ and τ) and the residual (in units of the convergence bounds) of an
// iterate of satNewtonP from which the last step is taken by the
// iterate's own derivatives (linearResidual) instead of by evaluating
// the equation again: there the terms of second order left out are below
// 1e-22, the residuals of the result are at the rounding of the update,
// and the second derivatives kept (cv, cp, w of the phases) are off by
// about 1e-11 of themselves. A start from the cached curve (within
// about 1e-12 of the curve, see satCurveDTheta) ends there after one
// evaluation of each phase.
const (
	satLinearStep = 1e-11
	satLinearRes  = 1e6
	// satLinearDP bounds (∂P/∂δ)_τ of both phases (reduced) from below:
	// toward the critical point it vanishes, cp and w of the phases
	// grow with its inverse, and the second derivatives kept would move
	// them by more than 1e-10.
	satLinearDP = 0.1
)

// linearResidual sets dst to the derivatives r of αʳ at (δ, τ) carried
// to (δ + dd, τ + dt) to first order: αʳ, αʳ_δ and αʳ_τ move by their own
// derivatives; the second derivatives stay.
func linearResidual(dst, r *helmholtz.Derivs, dd, dt float64) {
	*dst = *r
	dst.A += r.D*dd + r.T*dt
	dst.D += r.DD*dd + r.DT*dt
	dst.T += r.DT*dd + r.TT*dt
}

// satPByT solves the saturation at p by a bracketed Newton iteration in T
// on psat(T) = p, with dpsat/dT = (s″ − s′)/(1/ρ″ − 1/ρ′) from the
// Clausius–Clapeyron equation.
func (f *Fluid) satPByT(p, T float64) (satPair, bool) {
	lo, hi := 0.99*f.triple.T, f.crit.T-critBand
	var s satPair
	for it := 0; it < 100; it++ {
		if !(T > lo && T < hi) {
			T = 0.5 * (lo + hi)
		}
		tau := f.tc / T
		var ok bool
		s, ok = f.satTSolve(tau, true)
		if !ok {
			return s, false
		}
		ps := s.pi() * f.rhoc * f.r * T
		if ps < p {
			lo = T
		} else {
			hi = T
		}
		step := (p - ps) / f.clapeyron(&s)
		if math.Abs(p-ps) <= 1e-14*p || hi-lo <= 1e-15*hi {
			return s, true
		}
		T += step
	}
	return s, false
}

// critBand is the interval below Tc = Critical().T, in K, in which the
// saturation is started from the near-critical model instead of the
// auxiliary equations, and where Newton's method cannot resolve the
// densities, taken from the model.
const critBand = 1e-3

// nearCrit is the saturation curve between T1 = Tc − critBand and the
// critical point (Tc, pc, ρc) = Critical(), in x = (Tc − T)/critBand:
//
//	p(T) = pc + A y + B y²,  y = T − Tc,
//	δ′, δ″ = m ± h,
//
// with A and B making p and its Clausius–Clapeyron slope continuous at
// T1 and p = pc at Tc, and m (the mean of δ′ and δ″) and h (half their
// difference) interpolated between anchors, the equation's own
// saturation solved at x = 1, 1e-1, 1e-2, 1e-3 as far down as Newton's
// method converges to its residual bounds (and finds the phases closer
// than at the anchor before): m linearly in x, ln h linearly
// in ln x (a local power law x^β); below the last anchor, h follows the
// last segment's exponent β (bounded to [0.3, 0.5]: about 0.34 for
// Span–Wagner CO2, 0.49 for IAPWS-95 and 0.50 for Tillner-Roth–Baehr
// just below 1 mK, tending to the classical 1/2 at Tc) and m tends
// linearly to δc = ρc/ρr.
type nearCrit struct {
	pc, A, B float64
	dc       float64    // δc
	n        int        // anchors in use
	x, m, h  [4]float64 // anchors
	s1       satPair    // the solution at T1
	p1       float64
}

// nearCritAnchors are the x of the anchors.
var nearCritAnchors = [4]float64{1, 1e-1, 1e-2, 1e-3}

// nearCritModel builds the near-critical model of f with the anchors
// needed down to x, 0 < x ≤ 1 (x ≤ 0: only the pressure model).
func (f *Fluid) nearCritModel(x float64) (nearCrit, bool) {
	var m nearCrit
	T1 := f.crit.T - critBand
	s1, ok := f.satTSolve(f.tc/T1, true)
	if !ok {
		return m, false
	}
	m.s1 = s1
	m.p1 = s1.pi() * f.rhoc * f.r * T1
	m.pc = f.crit.P
	m.dc, _ = f.critReduced()
	slope := f.clapeyron(&m.s1)
	y1 := -critBand
	m.B = (slope*y1 - (m.p1 - m.pc)) / (y1 * y1)
	m.A = slope - 2*m.B*y1
	if m.A+2*m.B*y1 <= 0 || m.A <= 0 {
		// Not monotone: the straight line through T1 and Tc.
		m.A, m.B = (m.pc-m.p1)/critBand, 0
	}
	m.x[0], m.m[0], m.h[0], m.n = 1, 0.5*(s1.dl+s1.dv), 0.5*(s1.dl-s1.dv), 1
	for k := 1; k < len(nearCritAnchors) && m.x[m.n-1] > x && x > 0; k++ {
		xa := nearCritAnchors[k]
		tau := f.tc / (f.crit.T - xa*critBand)
		dl, dv := m.densities(xa)
		s, ok := f.satNewtonT(tau, dl, dv, false)
		if !ok || !s.strict {
			// From the last anchor's densities.
			s, ok = f.satNewtonT(tau, m.m[m.n-1]+m.h[m.n-1], m.m[m.n-1]-m.h[m.n-1], false)
		}
		if !ok || !s.strict || !(s.dl-s.dv > 0) || !(s.dl-s.dv < 2*m.h[m.n-1]) {
			break
		}
		m.x[m.n], m.m[m.n], m.h[m.n] = xa, 0.5*(s.dl+s.dv), 0.5*(s.dl-s.dv)
		m.n++
	}
	return m, true
}

// densities returns the model's reduced densities at x.
func (m *nearCrit) densities(x float64) (dl, dv float64) {
	k := 0
	for k+1 < m.n && m.x[k+1] > x {
		k++
	}
	var mean, h float64
	if k+1 < m.n {
		// Between anchors k and k+1.
		u := (x - m.x[k+1]) / (m.x[k] - m.x[k+1])
		mean = m.m[k+1] + (m.m[k]-m.m[k+1])*u
		beta := math.Log(m.h[k]/m.h[k+1]) / math.Log(m.x[k]/m.x[k+1])
		h = m.h[k+1] * math.Pow(x/m.x[k+1], beta)
	} else {
		// Below the last anchor.
		beta := 0.5
		if m.n > 1 {
			beta = math.Log(m.h[m.n-2]/m.h[m.n-1]) / math.Log(m.x[m.n-2]/m.x[m.n-1])
			beta = min(max(beta, 0.3), 0.5)
		}
		xl := m.x[m.n-1]
		mean = m.dc + (m.m[m.n-1]-m.dc)*x/xl
		h = m.h[m.n-1] * math.Pow(x/xl, beta)
	}
	return mean + h, mean - h
}

// p returns the model's pressure at y = T − Tc.
func (m *nearCrit) p(y float64) float64 { return m.pc + (m.A+m.B*y)*y }

// y returns T − Tc where the model's pressure is p, p1 ≤ p ≤ pc.
func (m *nearCrit) y(p float64) float64 {
	d := p - m.pc
	disc := m.A*m.A + 4*m.B*d
	if disc < 0 {
		disc = 0
	}
	y := 2 * d / (m.A + math.Sqrt(disc))
	return math.Max(y, -critBand)
}

// nearCritT returns the saturation at T, Tc − critBand < T < Tc.
func (f *Fluid) nearCritT(T float64) (satPair, bool) {
	y := T - f.crit.T
	m, ok := f.nearCritModel(-y / critBand)
	if !ok {
		return satPair{}, false
	}
	return f.nearCritAt(&m, y, 0), true
}

// nearCritP returns the saturation at p if p lies at or above the model's
// pressure at Tc − critBand; in is false otherwise.
func (f *Fluid) nearCritP(p float64) (s satPair, in, ok bool) {
	m, ok := f.nearCritModel(0)
	if !ok {
		return s, false, false
	}
	if p < m.p1 {
		return s, false, true
	}
	y := m.y(p)
	if m, ok = f.nearCritModel(-y / critBand); !ok {
		return s, true, false
	}
	return f.nearCritAt(&m, y, p), true, true
}

// nearCritAt returns the saturation at y = T − Tc in [−critBand, 0):
// Newton's method (in the densities, or with p > 0 at that pressure in
// densities and τ) started from the model, where it converges to its
// residual bounds, or to the rounding floor without leaving the model's
// neighbourhood; the model otherwise.
func (f *Fluid) nearCritAt(m *nearCrit, y, p float64) satPair {
	x := -y / critBand
	if x >= 1 {
		return m.s1
	}
	T := f.crit.T + y
	tau := f.tc / T
	dl, dv := m.densities(x)
	h := 0.5 * (dl - dv)
	var s satPair
	var ok bool
	if x < m.x[m.n-1] {
		// Below the last anchor, where Newton's method no longer
		// converged: the model.
		return f.modelPair(tau, dl, dv)
	}
	if p > 0 {
		ok = f.satNewtonP(&s, p, tau, dl, dv)
	} else {
		s, ok = f.satNewtonT(tau, dl, dv, true)
	}
	// Close to Tc the equation cannot tell apart states within a band of
	// densities, and Newton's method, driven by rounding noise, may
	// wander in it even while its residuals meet their bounds: its
	// result stands only where it stays near the model (within 5 % of
	// h, and of 1e-2·critBand in T), and the model's own values,
	// monotone by construction and equal to rounding in the residuals
	// there, are returned otherwise.
	if ok && math.Abs(s.dl-dl) <= 0.05*h && math.Abs(s.dv-dv) <= 0.05*h &&
		math.Abs(s.tau-tau) <= 0.01*critBand*tau/T {
		return s
	}
	return f.modelPair(tau, dl, dv)
}

// modelPair returns the model's densities at τ as a satPair.
func (f *Fluid) modelPair(tau, dl, dv float64) satPair {
	s := satPair{tau: tau, dl: dl, dv: dv}
	f.complete(&s)
	s.il, s.iv = s.rl.Delta(), s.rv.Delta()
	return s
}

// clapeyron returns the slope dp/dT of the vapour-pressure curve at the
// solution s, in Pa/K, from the Clausius–Clapeyron equation
// dp/dT = (s″ − s′)/(1/ρ″ − 1/ρ′). s = R(τα_τ − α): the ideal-gas τ terms
// are equal in both phases and cancel, leaving ln δ. It completes s.
func (f *Fluid) clapeyron(s *satPair) float64 {
	f.complete(s)
	sl := s.tau*s.rl.T - s.rl.A - math.Log(s.dl)
	sv := s.tau*s.rv.T - s.rv.A - math.Log(s.dv)
	return f.r * (sv - sl) / (1/(s.dv*f.rhoc) - 1/(s.dl*f.rhoc))
}
