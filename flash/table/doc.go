// Package table answers the PH, PT and DU flashes of a fluid from spline
// tables built once from its equation of state, in the spirit of the IAPWS
// Guideline on the Spline-Based Table Look-up Method (SBTL): every field of
// the returned flash.State — T, p, ρ, h, s, u, cp, cv, w, the phase, the
// quality and, in the two-phase region, both phases — comes from the
// tables, without an iteration or an evaluation of the equation.
//
//	co2, _ := fluid.Lookup("CO2")
//	t, err := table.New(co2, table.Range{}) // the default range; about 0.3 s, 17 MB
//	st, err := t.PH(3e6, -150e3)            // as flash.PH(co2, 3e6, -150e3), within 1e-6
//
// A Table is immutable once built and safe for concurrent use. The flash
// functions of package flash keep taking a *fluid.Fluid; a Table is the
// opt-in. Where the tables do not answer — outside the Range, in the
// critical neighbourhood, on the triple line, in the solid regions, for
// bad inputs — the equation's flash (flash.PH, flash.PT, flash.DU) answers,
// with its states and its errors; CoversPH, CoversPT and CoversDU tell which.
//
// # Ranges
//
// Range sets the pressures and temperatures covered; a zero field takes the
// fluid's default (see Range): CO2 from 1 kPa to 100 MPa, from its
// sublimation and melting curves (the dry-ice model's own) to 1100 K;
// water from 611 Pa to 100 MPa and from 273.16 K to 1273 K; R-134a from its
// triple point (169.85 K, 389.56 Pa, its equation's vapour pressure there)
// to 70 MPa and 455 K.
//
// # Layout
//
// The tables of PH and PT are slabs in x = ln p, those of DU slabs in
// x = ln ρ. Within a slab, boundary curves that never cross run along x:
// the lowest fluid state (the isotherm TMin, or the solid model's
// sublimation or melting curve where it lies above it), the saturated
// liquid and vapour, the isotherm TMax and, for DU, the isobars PMin and
// PMax; above 1.1·pc the critical isochore splits the fluid, because the
// maxima of cp run close to it there. Between two curves lo(x) and hi(x) a
// patch is a grid in x and in
//
//	η = (b − lo(x)) / (hi(x) − lo(x)),   b = h (PH), T (PT) or u (DU),
//
// so that every phase boundary is a grid line and no spline crosses one.
// Slabs end where a boundary curve has a kink (the triple point, 0.9·pc and
// 1.1·pc, where the critical isochore reaches TMax, where TMin meets a solid
// curve, and for DU where the boundaries change from one curve to the next).
//
// A patch holds per node T (PT: h), ρ (DU: p/ρ; in the vapour below pc, ρ/p)
// and s with their derivatives in x and η exactly from the equation (by the
// Jacobian of (T, ρ)), the cross derivative and the slopes of cp, cv and w
// from cubic splines along the grid lines; it interpolates them as bicubic
// Hermite polynomials. T, ρ and s are stored in float64, cp, cv and w in
// float32, whose 24-bit significands are well below the accuracy of their
// interpolation. Both grids of a patch are refined where the interpolation
// error, estimated from the node data themselves (the cubic of a cell
// extrapolated to the next node), exceeds 3e-7 of the property, so that
// nodes crowd where the fluid's properties bend (the saturated vapour near
// the critical point, the maxima of cp above it) and are sparse elsewhere.
// A cell is found without a search: by an index of buckets no wider than
// the narrowest cell.
//
// The saturation curve, from the triple point to 0.9·pc, is a set of cubic
// Hermite splines in ln p (T, ρ′, ln ρ″, h′, h″, s′, s″ with exact slopes;
// cp, cv and w of both phases) refined to 1e-9. Liquid–vapour states come
// from it: PH places h between h′ and h″ at p; DU solves the mixture of
// overall ρ and u by Newton's method in ln p on the splines alone, between
// the triple point and where the isochore leaves the dome. A mixture's cv
// and (v/w)² are linear in its quality at a given pressure (see the
// formulas at flash's State); two mixtures of the equation's own flash at
// each node fix both lines, so the tables give the equation's mixture cv
// and homogeneous-equilibrium speed of sound at every quality.
//
// # The critical neighbourhood
//
// Near the critical point the boundary-fitted coordinates degenerate (h′
// and h″ meet, cp diverges). The tables leave to the equation:
//
//   - PH and PT: 0.9·pc ≤ p ≤ 1.1·pc at temperatures from t1, the
//     saturation temperature at 0.9·pc (0.985–0.986 Tc), to 1.05·Tc. For
//     CO2 that is 6.64 to 8.12 MPa and 299.5 to 319.3 K; for water 19.86 to
//     24.27 MPa and 638.3 to 679.5 K; for R-134a 3.65 to 4.47 MPa and 369.0
//     to 392.9 K.
//   - DU: the densities between the saturated vapour and liquid at 0.9·pc
//     (CO2 261 to 688 kg/m³), at temperatures below 1.05·Tc, but for the
//     liquid–vapour mixtures below t1.
//
// CriticalNeighbourhood returns these bounds. Inside them the state is the
// equation's own: its deviation from the equation is zero. Around them the
// tables hold their accuracy (the validation grid reaches up to them).
//
// Water's saturated liquid is densest near 277 K (999.97 kg/m³), denser
// than at the triple point (999.79 kg/m³): the isochores between leave the
// saturation dome above the triple point and enter it again. DU leaves
// them to the equation (DoubleCrossing).
//
// # Accuracy
//
// Measured against the equation on a validation grid of random states
// never used as nodes (TestValidation: 6000 single-phase states uniform in
// ln p and T over the default range of each fluid and 1500 liquid–vapour
// states), the largest relative deviations of T, ρ, h and s (h against
// max(|h|, R·Tc), s against max(|s|, R)) are 4.5e-7 in every region of
// every fluid outside the critical neighbourhood; the test asserts 1e-6.
// Liquid–vapour states: T within 3e-10, ρ and h within 6e-8. cp, cv and w
// (interpolated without the equation's derivatives): cp within 2.2e-4 in
// PH and PT and within 3.2e-3 in DU (R-134a's compressed liquid; 3.3e-4
// for water, 1.8e-4 for CO2), cv within 8e-5, w within 2e-4; a mixture's
// cv within 4e-8 and w within 4e-5.
// The phase is the equation's except within the tables' accuracy of a
// phase boundary (the saturation curve, Tc, pc).
//
// # Cost
//
// New evaluates the equation at every node, about two evaluations a node
// (each node starts from its neighbour's state, corrected to second order),
// on all processors: on a 2-core machine 0.3 s for CO2, 0.4 s for water and
// 0.2 s for R-134a when it is otherwise idle, up to 0.9 s under load
// (BenchmarkBuild). The tables take 17.0 MB for CO2, 13.5 MB for water and
// 8.7 MB for R-134a (Bytes). A call costs about 90 ns; TestSpeedReport
// (with -table.report) prints the medians over the validation grid against
// the equation's flashes in the same run: PH 15–30 times faster, DU 21–37
// times, PT 7–12 times (the equation's PT solves for one density, 0.6–1.1
// µs, and the tables' call fills every field of the state; R-134a's
// equation is the cheapest and gives the lowest ratios). A liquid–vapour
// DU, which iterates on the splines, costs about 0.6 µs. None allocates. On amd64
// processors with AVX and FMA the bicubic sums of the six properties run
// as a vector kernel in assembly (evalVec), elsewhere in Go (evalGo).
//
// # Caution
//
// Results feed the design of pressure equipment and refrigeration plants.
// The tables reproduce the equation of state to the accuracy above, no
// better: check them against the equation (the Covers methods and
// CriticalNeighbourhood say where the equation answers), and defer to local
// codes and licensed engineering practice.
package table
