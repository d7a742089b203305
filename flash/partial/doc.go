// Package partial provides exact partial derivatives of the state of a pure
// fluid, for simulators that integrate equipment in time or solve networks
// by Newton's method: any (∂a/∂b)_c with a, b and c among T, p, ρ, v, u,
// h, s, g and f, at a flash.State in every region — liquid, vapour,
// supercritical, liquid–vapour, solid, solid–vapour, solid–liquid and the
// triple point — and the derivatives along the saturation, sublimation
// and melting curves.
//
//	f, _ := fluid.Lookup("CO2")
//	st, _ := flash.PH(f, 3e6, -150e3) // liquid and vapour
//	// (∂ρ/∂h)_p of the mixture, in kg²/(m³·J):
//	drhodh, err := partial.Derivative(f, st, partial.Rho, partial.H, partial.P)
//
// Finite differences across a phase boundary give meaningless numbers;
// these are analytic: from the Helmholtz-energy derivatives of the
// equation of state in a single fluid phase, from the solid's Gibbs-energy
// derivatives in the solid, and from the coexistence curve (its
// Clausius–Clapeyron slope and the mixture's equilibrium cv) in a
// mixture of phases. Units are SI: K, Pa, kg/m³, m³/kg, J/kg, J/(kg·K).
//
// # Method
//
// At expresses the differentials of T, p, v and s at the state in two
// variables (X, Y) that are independent there ((T, v) in a fluid phase or
// a two-phase mixture, (T, p) in the solid, two phase fractions at the
// triple point); those of u, h, g, f and ρ follow from the fundamental
// relations du = T ds − p dv, dh = T ds + v dp, dg = −s dT + v dp,
// df = −s dT − p dv, dρ = −ρ² dv, which hold in every region. Then one
// formula, the ratio of Jacobian determinants (Bridgman's method),
//
//	(∂a/∂b)_c = ∂(a, c)/∂(b, c) = (a_X c_Y − a_Y c_X) / (b_X c_Y − b_Y c_X),
//
// serves all 9³ combinations. Derivatives along a coexistence curve
// (Slopes) come from the curve's slope γ = dp/dT = (s₂ − s₁)/(v₂ − v₁) and
// each phase's own derivatives: for a fluid phase
// dρ/dT = (γ − (∂p/∂T)_ρ)/(∂p/∂ρ)_T, for the solid dv/dT = g_Tp + g_pp γ.
//
// # Infinite and undefined derivatives
//
// A derivative that is not a finite number — b does not vary at constant c
// (T and p in a two-phase state, where cp is infinite; T, p or g at the
// triple point, where cv is infinite), or the infinite ones at exactly the
// critical point — is returned as NaN with an error wrapping
// fluid.ErrUndefined, never as ±Inf: its sign is not fixed by the state,
// and a simulator must not carry it on silently. (The State's own Cp and
// Cv fields follow the flash contract and are +Inf there.) At exactly the
// critical point of an equation with nonanalytic terms, derivatives with a
// finite limit are returned as that limit (see Jacobian.Derivative).
//
// # Cost
//
// Derivative at a single-phase fluid state costs one evaluation of the
// equation of state (fluid.Fluid.Props) and a few tens of floating-point
// operations; at a solid state one Gibbs-energy evaluation
// (sublimation.Solid.Derivs); at a two-phase or triple state no
// evaluation at all (the state carries the phases and the mixture's cv).
// SlopesOf costs one evaluation per phase, SlopesAtT and SlopesAtP the
// curve's solution besides. Build a Jacobian with At once and call its
// Derivative for each derivative needed at that state. Nothing allocates
// unless an error is returned.
//
// # C ABI
//
// Quantity and Curve are int32 enums with stable values, so that a C call
// with one state and three property codes maps onto Derivative directly,
// and one with a curve code, a temperature or pressure, a phase index and
// two property codes onto SlopesAtT or SlopesAtP and Slopes.Derivative.
//
// # Accuracy
//
// The results are those of the equations to rounding: the tests check
// them against centred finite differences of the flashes (and of the solid
// models) in every region of every fluid to 1e-6 relative, the identities
// of the Bridgman table (reciprocity, the cyclic rule, (∂h/∂p)_T =
// v − T(∂v/∂T)_p, the Maxwell relations) to 1e-10, and the curves'
// slopes against the Clausius–Clapeyron equation with the phases' own
// enthalpies and volumes.
package partial
