package fluid

import (
	"math"

	"github.com/tripoint-thermo/tripoint/helmholtz"
)

// Water (H2O, R718): the IAPWS-95 formulation.
//
// Source: IAPWS R6-95(2018), Revised Release on the IAPWS Formulation 1995
// for the Thermodynamic Properties of Ordinary Water Substance for General
// and Scientific Use, Tables 1 and 2 (coefficients transcribed in
// shared/reference/water-iapws95.md). Constants: Tc = 647.096 K,
// ρc = 322 kg/m³, R = 461.51805 J/(kg·K), M = 18.015268 g/mol; the equation
// gives p(Tc, ρc) = 22.064 MPa to the release's digits.
//
// Range: published, from the melting-pressure curve to 1273 K at pressures
// up to 1000 MPa (the lowest melting temperature in that range is
// 251.165 K); accepted with the Extrapolated flag from 200 K (vapour below
// the triple point, down to where ice sublimes at 0.16 Pa) to 5000 K and up
// to 100 GPa, where the release reports reasonable extrapolation.
//
// Reference state (the release's): u = 0 and s = 0 for the saturated
// liquid at the triple point, 273.16 K.
//
// Auxiliary equations: the IAPWS Supplementary Release on Saturation
// Properties of Ordinary Water Substance (Wagner & Pruß 1993), for initial
// guesses; the saturation curve itself comes from the equation of state.
func newWater() *Fluid {
	const (
		tc   = 647.096
		rhoc = 322.0
		pc   = 22.064e6
	)
	f := &Fluid{
		name:      "water",
		aliases:   []string{"H2O", "R718"},
		eos:       "IAPWS-95 (IAPWS R6-95(2018))",
		molarMass: 18.015268e-3,
		r:         461.51805,
		tc:        tc,
		rhoc:      rhoc,
		limits: Limits{
			TMin: 251.165, TMax: 1273, PMax: 1e9,
			TFloor: 200, TCeil: 5000, PCeil: 100e9, RhoCeil: 3000,
		},
		// Until the solid model fixes it (see package sublimation), the
		// triple point of IAPWS-95 with IAPWS-06 ice Ih: 611.654771 Pa
		// (DESIGN.md; the published value is 611.657 Pa). Densities: the
		// saturated phases of IAPWS-95 at 273.16 K (liquid 999.793 kg/m³,
		// vapour 0.00485458 kg/m³, from memory of IAPWS R6-95 Table 13,
		// proven against the saturation solver in its tests) and ice Ih at
		// (273.16 K, 611.657 Pa), 916.709492 kg/m³ (IAPWS R10-06 Table 6).
		triple: TriplePoint{T: 273.16, P: 611.654771,
			RhoSolid: 916.709492, RhoLiquid: 999.793, RhoVapor: 0.00485458},
		ideal: helmholtz.MustNewIdeal(helmholtz.IdealTerms{
			A1: -8.3204464837497, A2: 6.6832105275932, LogTau: 3.00632,
			PlanckEinstein: []helmholtz.PlanckEinstein{
				{N: 0.012436, Theta: 1.28728967},
				{N: 0.97315, Theta: 3.53734222},
				{N: 1.2795, Theta: 7.74073708},
				{N: 0.96956, Theta: 9.24437796},
				{N: 0.24873, Theta: 27.5075105},
			},
		}),
		resid: helmholtz.MustNewResidual(waterResidual).MustWithKernel(waterKernel),
	}
	f.aux = auxiliary{
		psat: func(T float64) float64 {
			th := 1 - T/tc
			s := -7.85951783*th + 1.84408259*math.Pow(th, 1.5) - 11.7866497*th*th*th +
				22.6807411*math.Pow(th, 3.5) - 15.9618719*th*th*th*th + 1.80122502*math.Pow(th, 7.5)
			return pc * math.Exp(tc/T*s)
		},
		rhoLiq: func(T float64) float64 {
			th := 1 - T/tc
			return rhoc * (1 + powSum(
				[]float64{1.99274064, 1.09965342, -0.510839303, -1.75493479, -45.5170352, -6.74694450e5},
				[]float64{1.0 / 3, 2.0 / 3, 5.0 / 3, 16.0 / 3, 43.0 / 3, 110.0 / 3}, th))
		},
		rhoVap: func(T float64) float64 {
			th := 1 - T/tc
			return rhoc * math.Exp(powSum(
				[]float64{-2.03150240, -2.68302940, -5.38626492, -17.2991605, -44.7586581, -63.9201063},
				[]float64{2.0 / 6, 4.0 / 6, 8.0 / 6, 18.0 / 6, 37.0 / 6, 71.0 / 6}, th))
		},
		// IAPWS R14-08(2011): melting of ice Ih (251.165–273.16 K) and
		// sublimation (50–273.16 K), θ = T/Tt, pt = 611.657 Pa.
		pmelt: func(T float64) float64 {
			th := T / 273.16
			return 611.657 * (1 + 0.119539337e7*(1-math.Pow(th, 3)) +
				0.808183159e5*(1-math.Pow(th, 25.75)) + 0.333826860e4*(1-math.Pow(th, 103.75)))
		},
		meltRange: [2]float64{251.165, 273.16},
		psub: func(T float64) float64 {
			th := T / 273.16
			return 611.657 * math.Exp((-0.212144006e2*math.Pow(th, 0.333333333e-2)+
				0.273203819e2*math.Pow(th, 0.120666667e1)-0.610598130e1*math.Pow(th, 0.170333333e1))/th)
		},
		subRange: [2]float64{50, 273.16},
	}
	f.crit = Point{T: tc, Rho: rhoc, P: f.props(tc, rhoc).P}
	return f
}

// waterResidual: IAPWS R6-95(2018) Table 2.
var waterResidual = helmholtz.ResidualTerms{
	Power: []helmholtz.Power{
		{N: 0.12533547935523e-1, D: 1, T: -0.5},
		{N: 0.78957634722828e1, D: 1, T: 0.875},
		{N: -0.87803203303561e1, D: 1, T: 1},
		{N: 0.31802509345418, D: 2, T: 0.5},
		{N: -0.26145533859358, D: 2, T: 0.75},
		{N: -0.78199751687981e-2, D: 3, T: 0.375},
		{N: 0.88089493102134e-2, D: 4, T: 1},
	},
	Exponential: []helmholtz.Exponential{
		{N: -0.66856572307965, D: 1, T: 4, C: 1},
		{N: 0.20433810950965, D: 1, T: 6, C: 1},
		{N: -0.66212605039687e-4, D: 1, T: 12, C: 1},
		{N: -0.19232721156002, D: 2, T: 1, C: 1},
		{N: -0.25709043003438, D: 2, T: 5, C: 1},
		{N: 0.16074868486251, D: 3, T: 4, C: 1},
		{N: -0.40092828925807e-1, D: 4, T: 2, C: 1},
		{N: 0.39343422603254e-6, D: 4, T: 13, C: 1},
		{N: -0.75941377088144e-5, D: 5, T: 9, C: 1},
		{N: 0.56250979351888e-3, D: 7, T: 3, C: 1},
		{N: -0.15608652257135e-4, D: 9, T: 4, C: 1},
		{N: 0.11537996422951e-8, D: 10, T: 11, C: 1},
		{N: 0.36582165144204e-6, D: 11, T: 4, C: 1},
		{N: -0.13251180074668e-11, D: 13, T: 13, C: 1},
		{N: -0.62639586912454e-9, D: 15, T: 1, C: 1},
		{N: -0.10793600908932, D: 1, T: 7, C: 2},
		{N: 0.17611491008752e-1, D: 2, T: 1, C: 2},
		{N: 0.22132295167546, D: 2, T: 9, C: 2},
		{N: -0.40247669763528, D: 2, T: 10, C: 2},
		{N: 0.58083399985759, D: 3, T: 10, C: 2},
		{N: 0.49969146990806e-2, D: 4, T: 3, C: 2},
		{N: -0.31358700712549e-1, D: 4, T: 7, C: 2},
		{N: -0.74315929710341, D: 4, T: 10, C: 2},
		{N: 0.47807329915480, D: 5, T: 10, C: 2},
		{N: 0.20527940895948e-1, D: 6, T: 6, C: 2},
		{N: -0.13636435110343, D: 6, T: 10, C: 2},
		{N: 0.14180634400617e-1, D: 7, T: 10, C: 2},
		{N: 0.83326504880713e-2, D: 9, T: 1, C: 2},
		{N: -0.29052336009585e-1, D: 9, T: 2, C: 2},
		{N: 0.38615085574206e-1, D: 9, T: 3, C: 2},
		{N: -0.20393486513704e-1, D: 9, T: 4, C: 2},
		{N: -0.16554050063734e-2, D: 9, T: 8, C: 2},
		{N: 0.19955571979541e-2, D: 10, T: 6, C: 2},
		{N: 0.15870308324157e-3, D: 10, T: 9, C: 2},
		{N: -0.16388568342530e-4, D: 12, T: 8, C: 2},
		{N: 0.43613615723811e-1, D: 3, T: 16, C: 3},
		{N: 0.34994005463765e-1, D: 4, T: 22, C: 3},
		{N: -0.76788197844621e-1, D: 4, T: 23, C: 3},
		{N: 0.22446277332006e-1, D: 5, T: 23, C: 3},
		{N: -0.62689710414685e-4, D: 14, T: 10, C: 4},
		{N: -0.55711118565645e-9, D: 3, T: 50, C: 6},
		{N: -0.19905718354408, D: 6, T: 44, C: 6},
		{N: 0.31777497330738, D: 6, T: 46, C: 6},
		{N: -0.11841182425981, D: 6, T: 50, C: 6},
	},
	Gaussian: []helmholtz.Gaussian{
		{N: -0.31306260323435e2, D: 3, T: 0, Alpha: 20, Beta: 150, Gamma: 1.21, Epsilon: 1},
		{N: 0.31546140237781e2, D: 3, T: 1, Alpha: 20, Beta: 150, Gamma: 1.21, Epsilon: 1},
		{N: -0.25213154341695e4, D: 3, T: 4, Alpha: 20, Beta: 250, Gamma: 1.25, Epsilon: 1},
	},
	NonAnalytic: []helmholtz.NonAnalytic{
		{N: -0.14874640856724, SmallA: 3.5, SmallB: 0.85, B: 0.2, C: 28, D: 700, A: 0.32, Beta: 0.3},
		{N: 0.31806110878444, SmallA: 3.5, SmallB: 0.95, B: 0.2, C: 32, D: 800, A: 0.32, Beta: 0.3},
	},
}
