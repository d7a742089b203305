// Command sweep is tripoint's reliability sweep: it runs every flash over
// dense grids of states through every region of a fluid and reports what
// went wrong, how close the round trips come to the backward-residual
// bounds of the design, how consistent the returned states are, and how
// long it took.
//
//	go run ./internal/sweep -fluid CO2              # about 10^6 states
//	go run ./internal/sweep -fluid all -states 2e4  # a quick look at every fluid
//	go run ./internal/sweep -h                      # the flags
//
// # What it does
//
// Each fluid gets a deterministic list of forward cases, grouped in
// regions (see -regions): a PT grid over the whole accepted (T, p)
// rectangle; a supercritical grid; DT within 1 K (down to 1e-7 K) of the
// critical point; TQ and PQ along the saturation curve up to 1 µK from Tc;
// the neighbourhood of the triple point (PT, TQ, PQ, three-phase DU and PH
// on the triple line); metastable liquid and vapour between the saturated
// states and the spinodals (DT with AllowMetastable), and supercooled or
// supersaturated fluid against the solid (PT with AllowMetastable); the
// solid regions (PT in the solid, TQ and PQ on the sublimation curve, PH
// in solid-liquid mixtures); and the edges of every range (TFloor, TCeil,
// PCeil, RhoCeil, the vapour floors and the solid models' limits), on
// both sides.
//
// For each case the forward flash runs first. Whether it must succeed,
// may be refused, or must be refused, and which phase it must give, is
// judged independently of package flash: from the fluid equation at
// (T, p) or (T, ρ) (fluid.PropsTP, fluid.Props, fluid.SaturationAtT),
// from the solid model (sublimation.Solid.Props: the phase of lower
// Gibbs energy), and from the documented contract. A returned state is
// then checked for the invariants of the contract (finite fields, the
// listed infinities only, fractions that add up), its forward inputs are
// checked against the backward-residual bounds, and every inverse flash
// that applies — PH, PS, DU, HS, DT, TS, PD, and PT, TQ, PQ where they
// fix the state — is run from the state's own values and judged by the
// same bounds and by its phase: cold, and warm-started (Options.Guess)
// from the state itself and from the previous case's state (a neighbour
// on the grid, or a state far off where the grid turns), as simulators
// call them. The consistency checks follow: for each
// fluid phase, fourth-order differences of fluid.Props (with steps h and
// h/2, Richardson-extrapolated: next to a spinodal a fixed step is too
// coarse) against its analytic derivatives (the Maxwell relation (∂s/∂ρ)_T =
// −(∂p/∂T)_ρ/ρ², the energy equation (∂u/∂ρ)_T = (p − T(∂p/∂T)_ρ)/ρ²,
// cv = (∂u/∂T)_ρ, (∂p/∂ρ)_T) and the identity cp − cv = T v β²/κ_T; for
// each solid phase the Maxwell relation (∂s/∂p)_T = −(∂v/∂T)_p and
// cp = T(∂s/∂T)_p; for each equilibrium, equal Gibbs energies (scaled by
// RT) and equal pressures; and, for saturated liquids from TQ and points
// of the solid curves, the Clausius–Clapeyron equation against central
// differences of the curve's pressure.
//
// # Failures
//
// A failure is: a refused state that exists, a state returned where none
// may be, a wrong phase, NaN or an infinity outside the contract's list,
// a panic (recovered and reported), a round trip beyond its bound, an
// error that is not a *fluid.Error wrapping a sentinel with an ASCII
// message, or a consistency error beyond its bound. The sweep prints the
// count of each kind, the first failures of each with a Go reproducer,
// the worst residuals in units of their bounds, the worst consistency
// errors, the states per region and phase, and the time.
//
// The cases are split into chunks that goroutines take in turn; the
// results are merged in the order of the cases, so that the output does
// not depend on the scheduling (only the time does).
package main
