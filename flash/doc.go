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
// and w).
//
// For water (ice Ih) and carbon dioxide (dry ice) the flashes reach the
// solid regions of package sublimation: Solid, SolidVapor (on the
// sublimation curve, below the triple-point pressure), SolidLiquid (on
// the melting curve; for CO2 also solid with the dense fluid above Tc) and
// Triple (the three phases at the triple point). Every state is placed by
// the solid models' own Gibbs-equality curves, never by the published
// auxiliary sublimation and melting equations, so that a state is never
// solid by one function and fluid by another: a table of points of each
// curve, computed once per model, bounds the curve between its points (it
// is monotone), and between the bounds the Gibbs energies of fluid and
// solid at (T, p), or the curve itself, decide. Below the triple point the
// fluid is the vapour below the sublimation curve and, for water, the
// liquid above the melting curve of ice Ih, flagged Extrapolated where
// beyond the equation's published range.
//
// # Mixtures
//
// A liquid–vapour state carries its quality (vapour mass fraction), the
// mixture's density, enthalpy, entropy and internal energy, Cp = +Inf,
// the full properties of both phases, and two derivatives of the
// equilibrium mixture computed analytically from the coexisting phases
// along the Clausius–Clapeyron slope dp/dT = (s″ − s′)/(v″ − v′):
//
//   - Cv, the heat capacity at fixed overall volume, with the quality
//     changing as the phases' densities move along the saturation curve;
//   - W, the homogeneous-equilibrium speed of sound √((∂p/∂ρ)_s): both
//     phases moving together in mechanical, thermal and phase equilibrium,
//     the sound speed that limits choked two-phase flow in that model.
//
// Solid–vapour and solid–liquid states are built the same way from the
// solid and the fluid on the sublimation or melting curve, the solid's
// changes along the curve following from its Gibbs derivatives (v, α,
// κ_T, cp at (T, p)): so they too have Cp = +Inf, a finite Cv and the
// homogeneous-equilibrium W. Quality is the vapour mass fraction (0 for
// SolidLiquid), Solid the solid mass fraction. A Triple state, where
// three phases coexist at one T and p, has Cp = Cv = +Inf and W = 0
// (DESIGN.md); Phases lists solid, liquid and vapour. A solid's W is its
// bulk sound speed √((∂p/∂ρ)_s). The formulas are given at the unexported
// functions mixDerivs, fluidAlong and solidAlong; tests check them against
// differences of the flashes themselves.
//
// # Inputs that do not fix the state
//
// PT exactly on the vapour-pressure curve (to rounding) returns the
// saturated liquid, flagged Indeterminate and Saturated; on a sublimation
// or melting curve (the fluid's and the solid's Gibbs energies within
// 1e-11·RT, a few times the accuracy of the curves) the fluid phase, flagged
// likewise; at the triple point the saturated liquid.
//
// On the triple line — p within 1e-10 of the triple-point pressure (the
// precision of the fluid's stored constants) or T within 1e-12 of its
// temperature — PH, PS, PQ, TQ, HS, DT, TS and PD do not fix the phase
// fractions of a three-phase mixture: every such mixture has
// h − Tt·s = g_t, so not even (h, s) fixes it. They return the mixture of
// least solid, flagged Indeterminate: the liquid–vapour mixture where the
// input lies among the liquid–vapour mixtures at the triple point (TQ and
// PQ always: q is the vapour fraction); below them in h or s (PH, PS, HS,
// TS) the solid–vapour mixture; below them in specific volume (DT, PD;
// dry ice is denser than its liquid) the solid–liquid mixture. DU fixes
// the three fractions (sublimation.ThreePhase.FractionsRhoU) and returns
// Triple states, not flagged: a closed vessel cooled or vented through
// the triple point stays at its T and p while its solid grows and its
// liquid shrinks, then continues as solid–vapour.
//
// Where s is not monotone along an isotherm or p along an isochore
// (liquid water below its density maximum near 4 °C) TS and PD have more
// than one solution and return the one of lowest pressure. Ice is lighter
// than liquid water and melts to higher entropy: for water below its
// triple point (T, s) and (p, ρ) can have a solid, a mixture and a fluid
// solution; TS returns the one of lowest pressure, PD the fluid state
// where there is one. DU is unique: u rises with T along every isochore,
// also one that crosses the saturation dome twice (water's liquid near
// 4 °C) or the triple point.
//
// # Metastable states
//
// With Options{Phase: Liquid, AllowMetastable: true} (or Vapor) PT, PH,
// PS, DT and DU return a single-phase state of that phase where the stable
// state is another, up to the spinodal, flagged Metastable: the
// superheated liquid of flashing flow and relief-valve sizing, the
// subcooled vapour of rapid expansions, and, against the solid, supercooled
// liquid water below 0 °C and CO2 vapour supersaturated against dry ice.
// Beyond the spinodal the error wraps fluid.ErrUnstable. Options.Phase may
// also request Solid, SolidVapor, SolidLiquid or Triple: the state must
// then be of that phase (no metastable solid is returned).
//
// # Solid regions and their limits
//
// Ice Ih ends at 208.566 MPa, the ice Ih–ice III–liquid triple point
// (IAPWS R14-08). Above it liquid water is bounded by the melting curves
// of ices III, V, VI and VII (IAPWS R14-08, Eqs. 2–5; see
// sublimation.Solid.HighIceMeltingTemperature), published equations used
// as the boundary of the model: no Gibbs-energy model of those ices
// exists here. Liquid above the curves is returned (for example at
// 300 MPa and 256 K, or 1 GPa and 310 K); a state beyond them — and a
// state with ice Ih above 208.566 MPa — is an error wrapping
// fluid.ErrOutOfRange that names the ice whose melting curve bounds the
// liquid at that pressure and says it is outside the model, in every
// flash. With Options{Phase: Liquid, AllowMetastable: true} PT, PH, PS,
// DU, DT, HS and TS return the liquid beyond the curves flagged
// Metastable, as for supercooled water below ice Ih's melting curve. The
// ice VII curve ends at 715 K and 20.6 GPa: above 715 K no ice bounds the
// liquid in the model and it is accepted as far as IAPWS-95's accepted
// range goes (100 GPa); below 715 K above 20.6 GPa it is an error naming
// ice VII. Where the curves meet the model's own ice Ih melting curve, at
// 208.566 MPa, the two boundaries differ by a few millikelvin (the model's
// curve ends within 0.01 K of the published 251.165 K). Dry ice ends at
// 800 MPa (the dry-ice model, the
// Span–Wagner equation and its melting equation): states with solid above
// it are an error; the fluid above 800 MPa is returned only above the
// model's melting temperature at 800 MPa (327.7 K), flagged Extrapolated,
// as the melting curve beyond is not known. Ice Ih is modelled down to
// 0 K (from 1 K here), below the vapour floor of 200 K: there a state is
// placed only where it is solid beyond doubt, at pressures above the
// sublimation pressure at the floor. A fluid without a solid model
// (R-134a) has its solid region — below its triple-point temperature — as
// an error wrapping fluid.ErrUndefined.
//
// # Accuracy and cost
//
// A returned state reproduces its inputs to |Δp| ≤ 1e-10·p + 1e-12·ρRT,
// |Δh|, |Δu| ≤ 1e-10·max(|h|, R·Tc), |Δs| ≤ 1e-10·max(|s|, R),
// |Δρ| ≤ 1e-10·ρ, and T and q exactly; the saturation it uses satisfies
// equal pressure and Gibbs energy at the rounding level of the equation
// (see fluid.SaturationAtT, also for the last millikelvin below Tc), the
// sublimation and melting curves equal Gibbs energy within a few
// 1e-12·RT (package sublimation). In the solid regions the node tables
// of the curves place a state, and it is solved directly (a solid by
// Newton's method on its Gibbs function, without evaluating the fluid
// equation; a mixture in one Newton iteration with the curve, warm-started
// from the nodes): every flash there costs 0 to 5 evaluations of the
// fluid equation (TestSolidRegionEvals; PD of water more, as it looks for
// a fluid state first). HS solves directly everywhere, placed by tables
// of the saturation and solid curves built once per fluid, at medians of
// 3 to 8 evaluations in every region (TestHSEvals). The
// flashes use Newton's method with analytic Jacobians from starting
// values out of the fluid's cached saturation curve and the auxiliary
// equations, with bracketing fallbacks that always terminate, and a warm
// start from Options.Guess; the common paths allocate nothing. A Newton
// step below 1e-11 of T and ρ, away from the critical point, is taken by
// the state's own derivatives (to first order in p, u, h, s, g and f;
// cp, cv, w and the other derivatives as evaluated, which that step
// moves by about 1e-11 of themselves) instead of by one more evaluation
// that would only confirm it; a saturation at p likewise (see
// fluid.SaturationAtPFrom). Single-phase PH and PS take 2 to 4
// evaluations, two-phase ones 2, warm-started ones 2.
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
