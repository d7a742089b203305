package transport

import "math"

// Pieces of the critical enhancement shared by the correlations: the
// mode-coupling theory of Olchowy and Sengers in the simplified form that
// IAPWS R12-08 and R15-11 and the reference correlations of other fluids
// use.
//
//	Δχ̄ = ρ̄ [ζ(T, ρ) − ζ(T_R, ρ) T_R/T],   ζ = (∂ρ̄/∂p̄)_T = (pc/ρc) (∂ρ/∂p)_T
//	ξ  = ξ0 (Δχ̄/Γ0)^(ν/γ)                  (ξ = 0 where Δχ̄ ≤ 0)
//
// with ρ̄ = ρ/ρc and the reference temperature T_R far above Tc, where the
// fluctuations the enhancement describes have died out.

// critParams are the constants of one fluid's critical enhancement.
type critParams struct {
	pc, rhoc  float64 // reducing pressure (Pa) and density (kg/m³) of ζ
	tRef      float64 // reference temperature T_R, K
	xi0       float64 // amplitude ξ0, m
	gamma0    float64 // amplitude Γ0 of the susceptibility
	nuOverGam float64 // ν/γ, critical exponents
}

// corrLength returns the correlation length ξ in m from the density
// (kg/m³), the temperature T (K) and (∂p/∂ρ)_T at T and at the reference
// temperature (Pa·m³/kg). It returns 0 where Δχ̄ ≤ 0 and +Inf where
// (∂p/∂ρ)_T = 0 at T (the critical point itself).
func (c *critParams) corrLength(rho, T, dpdrho, dpdrhoRef float64) float64 {
	rhoBar := rho / c.rhoc
	s := c.pc / c.rhoc
	dchi := rhoBar * s * (1/dpdrho - c.tRef/T/dpdrhoRef)
	if !(dchi > 0) {
		return 0
	}
	return c.xi0 * math.Pow(dchi/c.gamma0, c.nuOverGam)
}

// crossover returns the function
//
//	Z(y) = 2/(π y) {[(1 − κ⁻¹) arctan y + κ⁻¹ y] − [1 − exp(−1/(y⁻¹ + y²/(3ρ̄²)))]}
//
// of the simplified mode-coupling theory (IAPWS R15-11 Eq. 19; it equals
// (Ω − Ω0)/y in the notation of Olchowy and Sengers), with y = q_D ξ,
// κ⁻¹ = cv/cp and ρ̄ = ρ/ρc. Z = 0 for y < 1.2e-7, where the two brackets
// cancel to rounding (IAPWS R15-11).
func crossover(y, cvOverCp, rhoBar float64) float64 {
	if !(y >= 1.2e-7) {
		return 0
	}
	a := (1-cvOverCp)*math.Atan(y) + cvOverCp*y
	b := -math.Expm1(-1 / (1/y + y*y/(3*rhoBar*rhoBar)))
	return 2 / (math.Pi * y) * (a - b)
}
