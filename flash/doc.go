// Package flash finds the state of a pure fluid from any two of its
// properties: the flashes PT, PH, PS, PQ, TQ, DU, HS, DT, TS and PD, each
// with a ...With variant that takes Options.
//
//	f, _ := fluid.Lookup("water")
//	st, err := flash.PH(f, 1e5, 1.2e6) // p in Pa, h in J/kg
//	// st.Phase == flash.TwoPhase, st.T ≈ 372.76 K, st.Quality ≈ 0.35
//
// Every flash takes a *fluid.Fluid and returns a State: a plain value in
// SI units (K, Pa, kg/m³, J/kg, J/(kg·K), m/s) with the properties of the
// whole and of each coexisting phase (State.Phases[:State.N], in the
// order solid, liquid, vapour).
//
// # Phases
//
// Supercritical is T > Tc and p > pc. At or below Tc the fluid is Liquid
// above the equation's own vapour pressure and Vapor below it; above Tc at
// p ≤ pc it is Vapor. Between the saturated states it is TwoPhase. TQ and
// PQ with q = 0 or 1 return the saturated liquid or vapour as a
// single-phase state (Phase Liquid or Vapor, flag Saturated, finite cp
// and w). Below the triple point the fluid is the vapour below the
// published sublimation curve and, for water, the liquid above the
// melting curve of ice Ih; they are returned, flagged Extrapolated where
// they lie beyond the equation's published range.
//
// # Two-phase states
//
// A liquid–vapour state carries its quality (vapour mass fraction), the
// mixture's density, enthalpy, entropy and internal energy, Cp = +Inf,
// the full properties of both phases, and two derivatives of the
// equilibrium mixture computed analytically from the saturated phases
// along the Clausius–Clapeyron slope dp/dT = (s″ − s′)/(v″ − v′):
//
//   - Cv, the heat capacity at fixed overall volume, with the quality
//     changing as the phases' densities move along the saturation curve;
//   - W, the homogeneous-equilibrium speed of sound √((∂p/∂ρ)_s): both
//     phases moving together in mechanical, thermal and phase equilibrium,
//     the sound speed that limits choked two-phase flow in that model.
//
// The formulas are given at the unexported twoPhase function; tests check
// them against differences of the flashes themselves.
//
// # Inputs that do not fix the state
//
// PT exactly on the vapour-pressure curve (to rounding) returns the
// saturated liquid, flagged Indeterminate and Saturated; on a sublimation
// or melting curve, the fluid phase, flagged likewise. On the triple line
// (T = Tt) a mixture's solid fraction is not fixed by PH, PS, PQ, TQ, HS
// or DT: the state without solid is returned, flagged Indeterminate.
// Where s is not monotone along an isotherm or p along an isochore
// (liquid water below its density maximum near 4 °C) TS and PD have more
// than one solution and return the one of lowest pressure. DU is unique:
// u rises with T along every isochore, also one that crosses the
// saturation dome twice (water's liquid near 4 °C).
//
// # Metastable states
//
// With Options{Phase: Liquid, AllowMetastable: true} (or Vapor) PT, PH,
// PS, DT and DU return a single-phase state of that phase where the stable
// state is another, up to the spinodal, flagged Metastable: the
// superheated liquid of flashing flow and relief-valve sizing, the
// subcooled vapour of rapid expansions. Beyond the spinodal the error
// wraps fluid.ErrUnstable.
//
// # Solid regions
//
// Until the solid models exist (package sublimation), states are placed
// against the published sublimation and melting curves of each fluid
// (fluid.AuxSublimationPressure, fluid.AuxMeltingPressure). A state in a
// solid region is an error wrapping fluid.ErrOutOfRange that says so —
// never a liquid or vapour that does not exist; for a fluid without solid
// data (R-134a) the error wraps fluid.ErrUndefined. For water the only
// melting curve in the data is that of ice Ih: below the triple-point
// temperature and above its end (208.566 MPa) other ices exist and the
// error says so; the liquid above about 630 MPa near room temperature,
// where ices VI and VII exist, is not yet classified (their melting curves
// are not in the fluid data).
//
// # Accuracy and cost
//
// A returned state reproduces its inputs to |Δp| ≤ 1e-10·p + 1e-12·ρRT,
// |Δh|, |Δu| ≤ 1e-10·max(|h|, R·Tc), |Δs| ≤ 1e-10·max(|s|, R),
// |Δρ| ≤ 1e-10·ρ, and T and q exactly; the saturation it uses satisfies
// equal pressure and Gibbs energy at the rounding level of the equation
// (see fluid.SaturationAtT, also for the last millikelvin below Tc). The
// flashes use Newton's method with analytic Jacobians from starting
// values out of the auxiliary equations, with bracketing fallbacks that
// always terminate, and a warm start from Options.Guess; the common paths
// allocate nothing.
//
// # Errors
//
// No flash panics. Bad input (NaN, ±Inf, p ≤ 0, T ≤ 0, ρ ≤ 0, q outside
// [0, 1], a nil fluid) returns an error wrapping fluid.ErrInvalidInput;
// inputs outside the models, fluid.ErrOutOfRange; see each function.
// Errors are *fluid.Error values naming the flash, its inputs and the
// valid range.
//
// # Caution
//
// Results feed the design of pressure equipment, relief systems and
// refrigeration plants. Check them against published tables for your
// case, mind the cautions of high pressure, cold burns, asphyxiation by
// CO2 and dry-ice blockage of vent lines, and defer to local codes and
// licensed engineering practice.
package flash
