package fluid

import (
	"math"
	"strconv"

	"github.com/tripoint-thermo/tripoint/helmholtz"
	"github.com/tripoint-thermo/tripoint/internal/evalcount"
)

// Props are the properties of a fluid at one (T, ρ), from its equation of
// state. Units are SI: K, Pa, kg/m³, J/kg, J/(kg·K), m/s.
type Props struct {
	T   float64 // temperature, K
	Rho float64 // density, kg/m³
	P   float64 // pressure, Pa

	U float64 // specific internal energy, J/kg
	H float64 // specific enthalpy, J/kg
	S float64 // specific entropy, J/(kg·K)
	G float64 // specific Gibbs energy h − Ts, J/kg
	F float64 // specific Helmholtz energy u − Ts, J/kg

	Cv float64 // isochoric heat capacity, J/(kg·K)
	Cp float64 // isobaric heat capacity, J/(kg·K)
	W  float64 // speed of sound, m/s

	Z            float64 // compression factor p/(ρRT)
	JouleThomson float64 // Joule–Thomson coefficient (∂T/∂p)_h, K/Pa
	KappaT       float64 // isothermal compressibility (1/ρ)(∂ρ/∂p)_T, 1/Pa
	Expansivity  float64 // volume expansivity −(1/ρ)(∂ρ/∂T)_p, 1/K
	DpDrho       float64 // (∂p/∂ρ)_T, Pa·m³/kg
	DpDT         float64 // (∂p/∂T)_ρ, Pa/K

	Flags Flags // Extrapolated, AtCritical
}

// Props returns the properties of f at temperature T in K and density rho
// in kg/m³, from its equation of state:
//
//	p = ρRT(1 + δαʳ_δ)
//	u = RT τ(α°_τ + αʳ_τ),  h = u + p/ρ,  s = R(τ(α°_τ + αʳ_τ) − α° − αʳ)
//	cv = −R τ²(α°_ττ + αʳ_ττ)
//	cp = cv + T (∂p/∂T)²_ρ / (ρ² (∂p/∂ρ)_T),  w² = (∂p/∂ρ)_T cp/cv
//
// plus the reference-state offsets of f. Props judges only whether (T, ρ)
// lies in the equation's range (see Limits), not which phase is stable
// there: a metastable state is returned as it is.
//
// Special cases are:
//
//	T or rho NaN, ±Inf or ≤ 0: error wrapping ErrInvalidInput
//	T outside TFloor..TCeil, rho > RhoCeil or p > PCeil: ErrOutOfRange
//	p ≤ 0 (deep inside the two-phase region): the values, with an error
//	  wrapping ErrOutOfRange
//	(∂p/∂ρ)_T ≤ 0 (inside a spinodal), or cv ≤ 0 (where an equation is
//	  extrapolated far beyond its range): the values, with an error
//	  wrapping ErrUnstable
//	exactly the critical point (T, rho) = Critical(): flag AtCritical,
//	  DpDrho = 0, Cp = KappaT = Expansivity = +Inf; with nonanalytic
//	  terms Cv = +Inf and W = 0, without them Cv and W finite (their
//	  limits there)
//
// Props allocates nothing unless it returns an error.
func (f *Fluid) Props(T, rho float64) (p Props, err error) {
	err = f.PropsInto(&p, T, rho)
	return p, err
}

// PropsInto is Props with the result written into dst, in place, and
// the same error (dst is the zero Props where Props returns it). A caller
// that evaluates again and again (an iteration) spares the copies of a
// returned Props, which cost about a tenth of a cheap equation's
// evaluation.
func (f *Fluid) PropsInto(dst *Props, T, rho float64) error {
	*dst = Props{}
	if err := f.checkTRho("fluid.Props", T, rho); err != nil {
		return err
	}
	f.setProps(dst, T, rho)
	return f.checkProps("fluid.Props", dst)
}

// checkTRho validates (T, ρ) against f's accepted region.
func (f *Fluid) checkTRho(op string, T, rho float64) error {
	if !finite(T) || T <= 0 || !finite(rho) || rho <= 0 {
		return NewError(op, ErrInvalidInput, "T and rho must be finite and positive",
			Input{"T", T, "K"}, Input{"rho", rho, "kg/m3"})
	}
	l := &f.limits
	if T < l.TFloor || T > l.TCeil {
		return NewError(op, ErrOutOfRange, f.tRangeText(),
			Input{"T", T, "K"}, Input{"rho", rho, "kg/m3"})
	}
	if rho > l.RhoCeil {
		return NewError(op, ErrOutOfRange, "rho must not exceed "+fmtG(l.RhoCeil)+" kg/m3 for "+f.name,
			Input{"T", T, "K"}, Input{"rho", rho, "kg/m3"})
	}
	return nil
}

// tRangeText describes the accepted temperatures of f.
func (f *Fluid) tRangeText() string {
	return rangeText("T", f.limits.TFloor, f.limits.TCeil, "K") + " for " + f.name
}

// checkProps applies the pressure ceiling, the finiteness check and the
// stability check to computed properties.
func (f *Fluid) checkProps(op string, p *Props) error {
	in := func() []Input { return []Input{{"T", p.T, "K"}, {"rho", p.Rho, "kg/m3"}} }
	if !finite(p.P) || !finite(p.H) || !finite(p.S) || p.P > f.limits.PCeil {
		return &Error{Op: op, Inputs: in(), Err: ErrOutOfRange,
			Range: "p = " + fmtG(p.P) + " Pa exceeds the accepted " + fmtG(f.limits.PCeil) + " Pa for " + f.name}
	}
	if p.Flags&AtCritical != 0 {
		return nil
	}
	if p.DpDrho <= 0 {
		return &Error{Op: op, Inputs: in(), Err: ErrUnstable,
			Range: "(dp/drho)_T = " + fmtG(p.DpDrho) + " <= 0: inside the spinodal"}
	}
	if p.P <= 0 {
		return &Error{Op: op, Inputs: in(), Err: ErrOutOfRange,
			Range: "p = " + fmtG(p.P) + " Pa <= 0: no single-phase state of " + f.name + " at positive pressure"}
	}
	if p.Cv <= 0 {
		return &Error{Op: op, Inputs: in(), Err: ErrUnstable,
			Range: "cv = " + fmtG(p.Cv) + " J/(kg K) <= 0: thermally unstable (the equation extrapolated far beyond its range)"}
	}
	return nil
}

// Derivs returns the ideal-gas and residual parts of the reduced Helmholtz
// energy and their derivatives at (T, ρ), without range checks. It is for
// tripoint's solvers, which build Jacobians from them; the reference-state
// offsets are not included.
func (f *Fluid) Derivs(T, rho float64) (ideal, resid helmholtz.Derivs) {
	delta, tau := rho/f.rhoc, f.tc/T
	evalcount.Add()
	return f.ideal.Eval(delta, tau), f.resid.Eval(delta, tau)
}

// Reducing returns the reducing temperature Tc in K and density ρc in
// kg/m³ of f's equation: τ = Tc/T, δ = ρ/ρc.
func (f *Fluid) Reducing() (Tc, rhoc float64) { return f.tc, f.rhoc }

// props evaluates the equation without checks.
func (f *Fluid) props(T, rho float64) Props {
	var p Props
	f.setProps(&p, T, rho)
	return p
}

// setProps sets p, a zero Props, to props(T, rho) in place.
func (f *Fluid) setProps(p *Props, T, rho float64) {
	delta, tau := rho/f.rhoc, f.tc/T
	i := f.ideal.Eval(delta, tau)
	r := f.residual(delta, tau)
	f.setFromDerivs(p, T, rho, delta, tau, &i, &r)
}

// fromDerivs turns α derivatives into properties.
func (f *Fluid) fromDerivs(T, rho, delta, tau float64, i, r *helmholtz.Derivs) Props {
	var p Props
	f.setFromDerivs(&p, T, rho, delta, tau, i, r)
	return p
}

// setFromDerivs sets p, a zero Props, to fromDerivs(T, rho, delta, tau,
// i, r) in place.
func (f *Fluid) setFromDerivs(p *Props, T, rho, delta, tau float64, i, r *helmholtz.Derivs) {
	R := f.r
	rt := R * T
	dad := delta * r.D              // δαʳ_δ
	d2 := delta * delta * r.DD      // δ²αʳ_δδ
	dt := delta * tau * r.DT        // δταʳ_δτ
	tat := tau * (i.T + r.T)        // τα_τ
	tt := tau * tau * (i.TT + r.TT) // τ²α_ττ
	x := 1 + dad - dt               // (∂p/∂T)_ρ / (ρR)
	y := 1 + 2*dad + d2             // (∂p/∂ρ)_T / (RT)
	z := 1 + dad
	p.T, p.Rho = T, rho
	p.P = rho * rt * z
	p.U = rt*tat + f.hOff
	p.S = R*(tat-i.A-r.A) + f.sOff
	p.Z = z
	p.H = p.U + rt*z // p/ρ without a division
	p.G = p.H - T*p.S
	p.F = p.U - T*p.S
	p.DpDrho = rt * y
	p.DpDT = rho * R * x
	l := &f.limits
	if T < l.TMin || T > l.TMax || p.P > l.PMax {
		p.Flags |= Extrapolated
	}
	if T == f.crit.T && rho == f.crit.Rho {
		f.setCriticalProps(p, tt, x)
		return
	}
	p.Cv = -R * tt
	p.Cp = p.Cv + R*x*x/y
	w2 := rt * (y - x*x/tt)
	p.W = math.Sqrt(math.Max(w2, 0))
	p.KappaT = 1 / (rho * p.DpDrho)
	p.Expansivity = p.KappaT * p.DpDT
	// μ_JT = (T(∂v/∂T)_p − v)/cp = (Tβ − 1)/(ρ cp), in the form that
	// stays finite where (∂p/∂ρ)_T = 0 (y = 0, on a spinodal), tending
	// to 1/(∂p/∂T)_ρ there: Tβ = x/y and cp = (cv y + R x²)/y.
	p.JouleThomson = (x - y) / (rho * (p.Cv*y + R*x*x))
}

// Virial returns the second and third virial coefficients of f at T,
// B in m³/kg and C in m⁶/kg², from the limits of the residual part as
// ρ → 0: B = lim αʳ_δ/ρc, C = lim αʳ_δδ/ρc². In molar units multiply by the
// molar mass (B) and its square (C).
//
// Special cases are:
//
//	T NaN, ±Inf or ≤ 0: error wrapping ErrInvalidInput
//	T outside TFloor..TCeil (see Limits): ErrOutOfRange
func (f *Fluid) Virial(T float64) (B, C float64, err error) {
	// Validated on its own: the error must not name a density the caller
	// did not give.
	switch l := &f.limits; {
	case !finite(T) || T <= 0:
		return 0, 0, NewError("fluid.Virial", ErrInvalidInput, "T must be finite and positive", Input{"T", T, "K"})
	case T < l.TFloor || T > l.TCeil:
		return 0, 0, NewError("fluid.Virial", ErrOutOfRange, f.tRangeText(), Input{"T", T, "K"})
	}
	d, dd := f.resid.DeltaLimits(f.tc / T)
	return d / f.rhoc, dd / (f.rhoc * f.rhoc), nil
}

func fmtG(x float64) string { return strconv.FormatFloat(x, 'g', -1, 64) }
