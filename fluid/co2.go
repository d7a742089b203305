package fluid

import (
	"math"

	"github.com/tripoint-thermo/tripoint/helmholtz"
)

// Carbon dioxide (CO2, R744): the Span–Wagner equation of state.
//
// Source: R. Span and W. Wagner, "A New Equation of State for Carbon
// Dioxide Covering the Fluid Region from the Triple-Point Temperature to
// 1100 K at Pressures up to 800 MPa", J. Phys. Chem. Ref. Data 25, 1509
// (1996), Tables 27 and 28 (coefficients) and Section 3 (auxiliary
// equations); transcribed in shared/reference/co2-span-wagner-1996.md.
// The equation is complete: the ideal-gas part with its five
// Planck–Einstein terms and all 42 residual terms (7 power, 27
// exponential, 5 Gaussian and 3 nonanalytic critical-region terms).
//
// Constants, as the paper uses them: Tc = 304.1282 K, ρc = 467.6 kg/m³,
// pc = 7.3773 MPa (the equation gives 7.37730 MPa at (Tc, ρc)),
// R = 188.9241 J/(kg·K) (Rm = 8.31451 J/(mol·K), M = 44.0098 g/mol),
// published triple point 216.592 K, 0.51795 MPa.
//
// Range: published, from the triple-point temperature 216.592 K (above the
// triple-point pressure the lower bound is the melting curve, which package
// fluid does not judge) to 1100 K at pressures up to 800 MPa. Accepted with
// the Extrapolated flag:
//
//   - down to 150 K, for the vapour on the low-pressure side of the
//     sublimation curve. At 150 K dry ice sublimes at about 0.84 kPa, where
//     the residual part changes the vapour's density by less than 0.1 %
//     (|Z − 1| < 1e-3, tested), so the extrapolated equation there is
//     essentially its ideal-gas part, which rests on spectroscopic data
//     valid far below. The floor covers dry-ice handling at and below
//     atmospheric pressure (194.7 K) and vacuum freeze-out with margin;
//     colder vapour is a fraction of a kilopascal and of no use to the
//     equipment this library serves. Liquid below 216.592 K is metastable
//     and not flagged separately: Props does not judge the phase.
//   - up to 2000 K and 10 GPa, our own choice of a region where the
//     equation's extrapolation is physically reasonable (the paper reports
//     reasonable extrapolation behaviour beyond its range, from memory;
//     the figures are ours, not the paper's). Above about 2000 K carbon
//     dioxide begins to dissociate (common practice, no source).
//
// Reference state (the paper's, built into the ideal-gas constants a°1 and
// a°2): h = 0 and s = 0 for the ideal gas at 298.15 K and 101.325 kPa.
//
// Triple point (Triple): T = 216.592 K with P = 0.5179644576 MPa, the
// equation's own saturation pressure there (published: 0.51795 MPa), and
// the equation's saturated densities ρ′ = 1178.462640 kg/m³ and
// ρ″ = 13.76088497 kg/m³, from SaturationAtT(216.592) to the digits
// stored; they agree with the independent evaluation quoted in
// shared/reference/co2-span-wagner-1996.md (0.517964 MPa, 1178.463 and
// 13.7609 kg/m³), and tests prove both. The solid model of package
// sublimation is built to meet the fluid there. RhoSolid = 1552.82 kg/m³
// is the density of that dry-ice model at the triple point (proven by its
// tests); the paper's melting-curve slope alone would imply about
// 1535 kg/m³ (shared/reference/co2-solid-consistency.md), and measured dry
// ice is about 1560 kg/m³ near 195 K (from memory).
//
// Auxiliary equations (Span–Wagner Section 3): vapour pressure and
// saturated liquid and vapour densities for 216.592 K ≤ T ≤ Tc, for initial
// guesses (the saturation curve itself comes from the equation of state);
// melting pressure for 216.592 K ≤ T ≤ 327.73 K, the temperature at which
// it reaches 800 MPa, the equation of state's pressure limit (our bound;
// the paper's own statement of the data range is not recalled reliably);
// sublimation pressure for 150 K ≤ T ≤ 216.592 K, down to the vapour floor
// above (it gives 101.325 kPa at 194.6855 K).
func newCO2() *Fluid {
	const (
		tc   = 304.1282
		rhoc = 467.6
		pc   = 7.3773e6
		tt   = 216.592
		ptt  = 0.51795e6 // published triple-point pressure, the auxiliary equations' pt
	)
	f := &Fluid{
		name:      "CO2",
		aliases:   []string{"R744", "carbon dioxide"},
		eos:       "Span-Wagner (J. Phys. Chem. Ref. Data 25, 1509 (1996))",
		molarMass: 44.0098e-3,
		r:         188.9241,
		tc:        tc,
		rhoc:      rhoc,
		limits: Limits{
			TMin: tt, TMax: 1100, PMax: 800e6,
			TFloor: 150, TCeil: 2000, PCeil: 10e9, RhoCeil: co2RhoCeil,
		},
		triple: TriplePoint{T: tt, P: 0.5179644576e6,
			RhoSolid: 1552.82, RhoLiquid: 1178.462640, RhoVapor: 13.76088497},
		ideal: helmholtz.MustNewIdeal(helmholtz.IdealTerms{
			A1: 8.37304456, A2: -3.70454304, LogTau: 2.5,
			PlanckEinstein: []helmholtz.PlanckEinstein{
				{N: 1.99427042, Theta: 3.15163},
				{N: 0.62105248, Theta: 6.1119},
				{N: 0.41195293, Theta: 6.77708},
				{N: 1.04028922, Theta: 11.32384},
				{N: 0.08327678, Theta: 27.08792},
			},
		}),
		resid: helmholtz.MustNewResidual(co2Residual).MustWithKernel(co2Kernel),
	}
	f.aux = auxiliary{
		psat: func(T float64) float64 {
			th := 1 - T/tc
			return pc * math.Exp(tc/T*powSum(
				[]float64{-7.0602087, 1.9391218, -1.6463597, -3.2995634},
				[]float64{1, 1.5, 2, 4}, th))
		},
		rhoLiq: func(T float64) float64 {
			th := 1 - T/tc
			return rhoc * math.Exp(powSum(
				[]float64{1.9245108, -0.62385555, -0.32731127, 0.39245142},
				[]float64{0.34, 1.0 / 2, 10.0 / 6, 11.0 / 6}, th))
		},
		rhoVap: func(T float64) float64 {
			th := 1 - T/tc
			return rhoc * math.Exp(powSum(
				[]float64{-1.7074879, -0.82274670, -4.6008549, -10.111178, -29.742252},
				[]float64{0.340, 1.0 / 2, 1, 7.0 / 3, 14.0 / 3}, th))
		},
		pmelt: func(T float64) float64 {
			x := T/tt - 1
			return ptt * (1 + 1955.5390*x + 2055.4593*x*x)
		},
		meltRange: [2]float64{tt, co2MeltTMax},
		psub: func(T float64) float64 {
			x := 1 - T/tt
			return ptt * math.Exp(tt/T*(-14.740846*x+2.4327015*math.Pow(x, 1.9)-5.3061778*math.Pow(x, 2.9)))
		},
		subRange: [2]float64{150, tt},
	}
	f.crit = Point{T: tc, Rho: rhoc, P: f.props(tc, rhoc).P}
	return f
}

const (
	// co2MeltTMax is where the Span–Wagner melting equation reaches
	// 800 MPa: the root of 1 + a1 x + a2 x² = 800/0.51795, T = Tt(1 + x).
	co2MeltTMax = 327.6731
	// co2RhoCeil bounds the densities Props accepts for CO2 (kg/m³).
	co2RhoCeil = 2500
)

// co2Residual: Span–Wagner (1996) Table 28, terms 1–42.
var co2Residual = helmholtz.ResidualTerms{
	Power: []helmholtz.Power{
		{N: 0.38856823203161, D: 1, T: 0},
		{N: 2.9385475942740, D: 1, T: 0.75},
		{N: -5.5867188534934, D: 1, T: 1},
		{N: -0.76753199592477, D: 1, T: 2},
		{N: 0.31729005580416, D: 2, T: 0.75},
		{N: 0.54803315897767, D: 2, T: 2},
		{N: 0.12279411220335, D: 3, T: 0.75},
	},
	Exponential: []helmholtz.Exponential{
		{N: 2.1658961543220, D: 1, T: 1.5, C: 1},
		{N: 1.5841735109724, D: 2, T: 1.5, C: 1},
		{N: -0.23132705405503, D: 4, T: 2.5, C: 1},
		{N: 0.058116916431436, D: 5, T: 0, C: 1},
		{N: -0.55369137205382, D: 5, T: 1.5, C: 1},
		{N: 0.48946615909422, D: 5, T: 2, C: 1},
		{N: -0.024275739843501, D: 6, T: 0, C: 1},
		{N: 0.062494790501678, D: 6, T: 1, C: 1},
		{N: -0.12175860225246, D: 6, T: 2, C: 1},
		{N: -0.37055685270086, D: 1, T: 3, C: 2},
		{N: -0.016775879700426, D: 1, T: 6, C: 2},
		{N: -0.11960736637987, D: 4, T: 3, C: 2},
		{N: -0.045619362508778, D: 4, T: 6, C: 2},
		{N: 0.035612789270346, D: 4, T: 8, C: 2},
		{N: -0.0074427727132052, D: 7, T: 6, C: 2},
		{N: -0.0017395704902432, D: 8, T: 0, C: 2},
		{N: -0.021810121289527, D: 2, T: 7, C: 3},
		{N: 0.024332166559236, D: 3, T: 12, C: 3},
		{N: -0.037440133423463, D: 3, T: 16, C: 3},
		{N: 0.14338715756878, D: 5, T: 22, C: 4},
		{N: -0.13491969083286, D: 5, T: 24, C: 4},
		{N: -0.023151225053480, D: 6, T: 16, C: 4},
		{N: 0.012363125492901, D: 7, T: 24, C: 4},
		{N: 0.0021058321972940, D: 8, T: 8, C: 4},
		{N: -0.00033958519026368, D: 10, T: 2, C: 4},
		{N: 0.0055993651771592, D: 4, T: 28, C: 5},
		{N: -0.00030335118055646, D: 8, T: 14, C: 6},
	},
	Gaussian: []helmholtz.Gaussian{
		{N: -213.65488688320, D: 2, T: 1, Alpha: 25, Beta: 325, Gamma: 1.16, Epsilon: 1},
		{N: 26641.569149272, D: 2, T: 0, Alpha: 25, Beta: 300, Gamma: 1.19, Epsilon: 1},
		{N: -24027.212204557, D: 2, T: 1, Alpha: 25, Beta: 300, Gamma: 1.19, Epsilon: 1},
		{N: -283.41603423999, D: 3, T: 3, Alpha: 15, Beta: 275, Gamma: 1.25, Epsilon: 1},
		{N: 212.47284400179, D: 3, T: 3, Alpha: 20, Beta: 275, Gamma: 1.22, Epsilon: 1},
	},
	NonAnalytic: []helmholtz.NonAnalytic{
		{N: -0.66642276540751, SmallA: 3.5, SmallB: 0.875, Beta: 0.3, A: 0.7, B: 0.3, C: 10, D: 275},
		{N: 0.72608632349897, SmallA: 3.5, SmallB: 0.925, Beta: 0.3, A: 0.7, B: 0.3, C: 10, D: 275},
		{N: 0.055068668612842, SmallA: 3.0, SmallB: 0.875, Beta: 0.3, A: 0.7, B: 1.0, C: 12.5, D: 275},
	},
}
