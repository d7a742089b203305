// Package sublimation provides the solid phases of tripoint's fluids —
// ice Ih for water and dry ice for carbon dioxide — as Gibbs-energy models
// g(T, p), and their equilibria with the fluid's equation of state: the
// sublimation curve (solid–vapour), the melting curve (solid–liquid, and
// solid–dense fluid above the critical temperature) and the triple point
// where the three phase models meet.
//
// Obtain the solid of a fluid with For; a fluid without a solid model
// (R-134a) gives an error wrapping fluid.ErrUndefined. Solid.Props returns
// the solid's properties at (T, p); Solid.Derivs the raw Gibbs derivatives
// for solvers. The curves are computed by Gibbs-energy equality with the
// fluid equation — never taken from the published auxiliary equations,
// which serve only as initial guesses and as checks — as functions of T
// (SublimationPressure, MeltingPressure) and of p (SublimationTemperature,
// MeltingTemperature), and as point sets for charts (SublimationCurve,
// MeltingCurve). Solid.Triple returns the three coexisting phases, and
// its FractionsRhoU, FractionsRhoH and FractionsRhoS the phase fractions of
// a three-phase mixture (not (h, s), which does not fix them). Every
// classifier of the project uses these curves, so
// that a state is never solid by one and fluid by another. The reference
// state of the fluid (fluid.Fluid.ReferenceOffsets) applies to the solid.
//
// Units are SI: K, Pa, kg/m³, J/kg, J/(kg·K), m/s.
//
// # Ice Ih
//
// IAPWS R10-06(2009), the Revised Release on the Equation of State 2006
// for H2O Ice Ih, with the constant s0 in the form consistent with
// IAPWS-95's reference state. It reproduces the release's check table
// (Table 6) to its printed digits. With IAPWS-95 liquid and vapour it
// gives the triple point 273.16 K, 611.654771 Pa (published 611.657 Pa:
// the releases were fitted separately). The sublimation curve runs from
// 200 K (fluid water's vapour floor) to the triple point and agrees with
// IAPWS R14-08(2011) within 1e-4 relative; the melting curve runs from the
// triple point to the ice Ih–ice III–liquid triple point, 208.566 MPa and
// 251.165 K: beyond it other ices are stable, which are outside the model,
// and an error says so.
//
// Above 208.566 MPa the liquid is bounded by the melting curves of ices
// III, V, VI and VII, given by the published equations of IAPWS R14-08
// (HighIceMeltingPressure, HighIceMeltingTemperature, HighIceRange) from
// 251.165 K to 715 K and 20.6 GPa. They serve as the boundary of the
// model, not as Gibbs-energy equalities: no model of those ices exists
// here.
//
// # Dry ice
//
// No published Gibbs-energy equation for solid CO2 whose check values we
// can reproduce is available to us, so dry ice is a model of our own: one
// smooth Gibbs function for the whole solid region, with no piecewise
// definition and no kink anywhere (in particular not at the triple point),
// built so that it is thermodynamically consistent by construction — every
// property is a derivative of g — and so that it meets the Span–Wagner
// fluid equation along the published sublimation and melting curves.
//
// Form (specific quantities; R = 188.9241 J/(kg·K), the Span–Wagner gas
// constant; T0 = 216.592 K; τ = T − T0):
//
//	g(T, p)  = g0(T) + Φ(T, p)
//	g0(T)    = c0 + c1 T + R T Σ ni ln(1 − exp(−θi/T))
//	           − a1 R T²/(2 T0) − a2 R T³/(6 T0²)
//	Φ(T, p)  = v0(T) K(T)/(n − 1) [(1 + n p/K(T))^((n−1)/n) − 1]
//	v0(T)    = v00 exp(α0 τ + α1 τ²/2),   K(T) = K0 exp(−β τ)
//
// g0 is the Gibbs energy on the isobar p = 0: its heat capacity
// cp0 = R Σ ni E(θi/T) + R (a1 T/T0 + a2 T²/T0²), with the Einstein
// function E(x) = x² eˣ/(eˣ − 1)², counts 3 translational and 2 librational
// lattice modes per molecule and the molecule's own vibrations, plus an
// anharmonic term. Φ = ∫0^p v dp makes the volume v = v0(T)(1 + n p/K)^(−1/n)
// a Murnaghan isotherm whose zero-pressure volume v0 and bulk modulus K
// vary smoothly with T; the expansivity then falls with pressure, as in
// real solids. All derivatives are analytic.
//
// Parameters and their sources:
//
//   - The intramolecular modes are the five Planck–Einstein terms of the
//     Span–Wagner ideal-gas part (ni = a°4..a°8, θi = θ°i·Tc: 958.5,
//     1858.8, 2061.1, 3443.9 and 8238.1 K; Span and Wagner 1996,
//     Table 27): the molecule vibrates in the crystal nearly as in the gas.
//   - n = 7.8, the pressure derivative of the bulk modulus of solid CO2
//     from room-temperature compression measurements (recalled from
//     memory, of the order 7–8; fixed). β = 2.7e-3 1/K, from the common
//     practice estimate that dlnK/dT ≈ −K'·α for molecular solids
//     (fixed; no source).
//   - Fitted, by weighted least squares, to: (i) Gibbs equality with the
//     Span–Wagner vapour along the Span–Wagner sublimation equation at
//     150–215 K every 2.5 K (residual Δg/(RT) ≈ Δln p, weight 1/1e-3);
//     (ii) Gibbs equality with the Span–Wagner liquid along the
//     Span–Wagner melting equation at 217–326 K every 3 K (residual the
//     melting-temperature error Δg/Δs, weight 1/0.05 K); (iii) dry-ice
//     density 1562 kg/m³ at 194.7 K, 101.325 kPa (weight 1/0.5 %; the
//     handbook value about 1.56 g/cm³, recalled from memory); (iv) cp of
//     54 J/(mol·K) at 190 K (weight 1/4 J/(mol·K); calorimetry of Giauque
//     and Egan 1937 gives roughly 50–58 near 190 K, recalled from
//     memory); (v) a prior K0 = 4 GPa ± 25 % (recalled from memory:
//     compression data of dry ice suggest a few GPa). The fitted values
//     are the lattice temperatures 105.74 and 106.52 K, a1 = 2.9686,
//     a2 = −1.6378, c1 = 5214.47 J/(kg·K), v00 = 6.44043e-4 m³/kg,
//     α0 = 5.7092e-4 1/K, α1 = −1.2946e-6 1/K², K0 = 6.147 GPa.
//   - c0 is then fixed so that the solid's Gibbs energy equals that of
//     the Span–Wagner saturated phases at 216.592 K, where the fluid
//     equation's own saturation pressure is 0.517964458 MPa (published
//     triple-point pressure 0.51795 MPa). That single condition puts the
//     three-phase point of the models at 216.592 K and 0.517964 MPa
//     exactly (to 1e-11 K): the fluid's two phases already have equal g
//     there, and the solid now joins them. The published sublimation and
//     melting equations are still met within the deviations below.
//
// What the model gives (tests bound each figure; the sources are those
// above): sublimation pressure within 0.15 % of the Span–Wagner equation
// over 150–216.592 K; melting temperature within 0.1 K of the Span–Wagner
// melting equation up to 800 MPa (within 0.15 % in pressure above 240 K;
// near the triple point the pressure difference is small in absolute terms
// but its relative value reaches 1.5 % at 217 K, 0.04 MPa in 2.4 MPa);
// normal sublimation temperature 194.684 K at 101.325 kPa (Span–Wagner
// auxiliary equation 194.6855 K, handbooks 194.69 K); enthalpy of
// sublimation 25.233 kJ/mol at 194.7 K against 25.23 kJ/mol from
// calorimetry (Giauque and Egan 1937, from memory); solid density
// 1572.7 kg/m³ at 194.7 K against about 1560 (from memory) and
// 1552.8 kg/m³ at the triple point; cp 54.8 J/(mol·K) at 194.7 K; bulk
// modulus 6.5 GPa and bulk sound speed 2.3 km/s at 194.7 K. cp, cv, the
// compressibilities and the sound speed are positive and finite over the
// whole accepted range.
//
// Range. The model rests on data from 150 K (the sublimation equation's
// lower end as used here, and the CO2 vapour floor) to the melting curve,
// and up to 800 MPa, the upper end of the Span–Wagner equation of state
// and of its melting equation: along the melting curve the Gibbs equality
// with the fluid fixes the solid's Gibbs energy up to there. Beyond
// 800 MPa no data enter the model and Props returns an error; low
// temperatures at high pressure (far from both curves) rest only on the
// form of Φ and are less certain. Solid CO2-I remains the stable solid up
// to several GPa, so no other solid phase bounds the range.
//
// References:
//
//	IAPWS R10-06(2009), Revised Release on the Equation of State 2006 for
//	  H2O Ice Ih.
//	IAPWS R14-08(2011), Revised Release on the Pressure along the Melting
//	  and Sublimation Curves of Ordinary Water Substance.
//	R. Span and W. Wagner, J. Phys. Chem. Ref. Data 25, 1509 (1996).
//	W. F. Giauque and C. J. Egan, J. Chem. Phys. 5, 45 (1937) (from memory).
package sublimation
