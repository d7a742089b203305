package fluid

import (
	"math"

	"github.com/tripoint-thermo/tripoint/helmholtz"
)

// R-134a (1,1,1,2-tetrafluoroethane, HFC-134a): the Tillner-Roth–Baehr
// equation of state.
//
// Source: R. Tillner-Roth and H. D. Baehr, An International Standard
// Formulation for the Thermodynamic Properties of 1,1,1,2-Tetrafluoroethane
// (HFC-134a) for Temperatures from 170 K to 455 K and Pressures up to
// 70 MPa, J. Phys. Chem. Ref. Data 23, 657 (1994). No checked transcription
// of this publication is at hand: the coefficients are recalled from memory
// and proven by the checks in r134a_test.go that do not depend on memory
// (the IIR reference state that the ideal-gas constants build in, the
// auxiliary equations against the equation's own saturation) and by
// recalled table values.
//
// Constants: reducing temperature Tr = 374.18 K and density
// ρr = 508 kg/m³ (4.97883 mol/dm³), which define τ = Tr/T and δ = ρ/ρr
// (Reducing), M = 102.032 g/mol, molar gas constant 8.314471 J/(mol·K),
// so R = 81.48886 J/(kg·K). The publication's critical pressure,
// 4.05629 MPa, is the end point of its vapour-pressure equation at Tr;
// the equation of state was not constrained to the reducing point (as
// recalled; its own critical point below bears it out) and gives
// p(Tr, ρr) = 4.05662 MPa there, inside its own two-phase region
// ((∂p/∂ρ)_T = −1.6e-4·RT: Props returns its values with ErrUnstable).
//
// Critical point: Critical() is the equation's own, where
// (∂p/∂ρ)_T = (∂²p/∂ρ²)_T = 0, solved once at construction
// (criticalOfEquation): Tc = 374.211967 K, ρc = 511.9451 kg/m³,
// pc = 4.059276 MPa with the coefficients as recalled. Widely quoted
// critical constants of R-134a (374.21 K, 4.0593 MPa, 511.9 kg/m³;
// common practice, no source here) agree, which is evidence that the
// coefficients were recalled right. Everything that means the critical
// point uses it: the saturation curve runs past Tr up to Tc (between
// 374.18 K and 374.212 K the fluid is still two-phase below its vapour
// pressure), Supercritical means T > Tc and p > pc, and Props flags
// exactly (Tc, ρc) AtCritical. The equation has no nonanalytic terms:
// cv and w are finite everywhere, at the critical point too
// (1241.99 J/(kg·K) and 89.877 m/s), while there (∂p/∂ρ)_T = 0 makes
// cp, κT and the expansivity +Inf.
//
// Range (the publication's): 169.85 K (the triple point) to 455 K, at
// pressures up to 70 MPa. Props accepts exactly this range; no
// extrapolation is offered.
//
// Triple point: 169.85 K and 389.6 Pa, the publication's values; there is
// no solid model for R-134a, so RhoSolid is 0 and its solid region is
// undefined. The fluid densities are the equation's own saturated liquid
// and vapour at 169.85 K (where its vapour pressure is 389.564 Pa).
//
// Reference state (the publication's, built into its ideal-gas constants
// a1 and a2): the IIR state, h = 200 kJ/kg and s = 1 kJ/(kg·K) for the
// saturated liquid at 273.15 K. The ideal-gas part carries it without any
// offset.
//
// Auxiliary equations (the publication's, recalled): vapour pressure
//
//	ln(ps/pc) = (Tc/T)(−7.686556θ + 2.311791θ^1.5 − 2.039554θ² − 3.583758θ⁴),
//
// θ = 1 − T/Tc with the publication's Tc = 374.18 K (= Tr) and
// pc = 4.05629 MPa; saturated liquid density
//
//	ρ'/(kg/m³) = 518.20 + 884.13θ^(1/3) + 485.84θ^(2/3) + 193.29θ^(10/3);
//
// saturated vapour density
//
//	ln(ρ''/(516.86 kg/m³)) = −2.837294θ^(1/3) − 7.875988θ^(2/3) + 4.478586θ^(1/2)
//	                         − 14.140125θ^(9/4) − 52.361297θ^(11/2).
//
// The vapour-density equation is the least certain recollection. They
// approximate the equation's own saturation, for starting values of the
// solvers: seen deviations are, for the vapour pressure, 1.7 % at the
// triple point, 3e-3 at 200 K and within 1.7e-4 from 240 K to 374.18 K;
// for the liquid density within 5e-4 up to 373 K and 4e-3 at 374 K; for
// the vapour density 4.3 % at the triple point, 4e-3 at 200 K and within
// 1.1e-2 above (TestR134aAuxiliary asserts the bounds their use needs).
// They end at the publication's Tc = 374.18 K and pc (AuxVaporPressure
// and the other Aux functions accept T up to 374.18 K), where the
// equation's phases are still 68 kg/m³ apart; within about 0.01 K of it
// the auxiliary densities, which meet near 517 kg/m³, depart by several
// per cent from the equation's. As starting values the solvers use them
// as published up to 0.37 K below the equation's Tc and carry them on
// from there to its critical point (seedT, TestR134aSeeds).
func newR134a() *Fluid {
	const (
		tc   = 374.18
		rhoc = 508.0
		pc   = 4.05629e6 // the vapour-pressure equation's end point
		mm   = 102.032e-3
		rm   = 8.314471
	)
	f := &Fluid{
		name:      "R134a",
		aliases:   []string{"HFC-134a", "tetrafluoroethane", "1,1,1,2-tetrafluoroethane"},
		eos:       "Tillner-Roth and Baehr (J. Phys. Chem. Ref. Data 23, 657 (1994))",
		molarMass: mm,
		r:         rm / mm,
		tc:        tc,
		rhoc:      rhoc,
		limits: Limits{
			TMin: 169.85, TMax: 455, PMax: 70e6,
			TFloor: 169.85, TCeil: 455, PCeil: 70e6,
			// Above the densest state in range (liquid at 169.85 K and
			// 70 MPa, about 1650 kg/m³); the pressure ceiling bounds the
			// accepted states.
			RhoCeil: 1800,
		},
		triple: TriplePoint{T: 169.85, P: 389.6,
			RhoLiquid: 1591.107453, RhoVapor: 0.02817228815},
		ideal: helmholtz.MustNewIdeal(helmholtz.IdealTerms{
			A1: -1.019535, A2: 9.047135, LogTau: -1.629789,
			Power: []helmholtz.IdealPower{
				{N: -9.723916, T: -0.5},
				{N: -3.927170, T: -0.75},
			},
		}),
		resid: helmholtz.MustNewResidual(r134aResidual).MustWithKernel(r134aKernel),
	}
	f.aux = auxiliary{
		psat: func(T float64) float64 {
			th := 1 - T/tc
			th2 := th * th
			return pc * math.Exp(tc/T*(-7.686556*th+2.311791*th*math.Sqrt(th)-2.039554*th2-3.583758*th2*th2))
		},
		rhoLiq: func(T float64) float64 {
			th := 1 - T/tc
			c := math.Cbrt(th)
			return 518.20 + 884.13*c + 485.84*c*c + 193.29*th*th*th*c
		},
		rhoVap: func(T float64) float64 {
			th := 1 - T/tc
			c := math.Cbrt(th)
			return 516.86 * math.Exp(-2.837294*c-7.875988*c*c+4.478586*math.Sqrt(th)-
				14.140125*math.Pow(th, 9.0/4)-52.361297*math.Pow(th, 11.0/2))
		},
	}
	f.aux.tc, f.aux.pc = tc, pc
	c, ok := f.criticalOfEquation()
	if !ok {
		panic("fluid: the critical point of the R-134a equation did not converge")
	}
	f.crit = c
	return f
}

// r134aResidual: the 21 residual terms of Tillner-Roth and Baehr (1994),
// recalled from memory,
//
//	αʳ = Σ(1..8) n δ^d τ^t + Σ(9..21) n δ^d τ^t exp(−δ^l),
//
// l = 1 for terms 9–11, 2 for 12–17, 3 for 18–20 and 4 for 21.
var r134aResidual = helmholtz.ResidualTerms{
	Power: []helmholtz.Power{
		{N: 0.5586817e-1, D: 2, T: -0.5},
		{N: 0.4982230, D: 1, T: 0},
		{N: 0.2458698e-1, D: 3, T: 0},
		{N: 0.8570145e-3, D: 6, T: 0},
		{N: 0.4788584e-3, D: 6, T: 1.5},
		{N: -0.1800808e1, D: 1, T: 1.5},
		{N: 0.2671641, D: 1, T: 2},
		{N: -0.4781652e-1, D: 2, T: 2},
	},
	Exponential: []helmholtz.Exponential{
		{N: 0.1423987e-1, D: 5, T: 1, C: 1},
		{N: 0.3324062, D: 2, T: 3, C: 1},
		{N: -0.7485907e-2, D: 2, T: 5, C: 1},
		{N: 0.1017263e-3, D: 4, T: 1, C: 2},
		{N: -0.5184567, D: 1, T: 5, C: 2},
		{N: -0.8692288e-1, D: 4, T: 5, C: 2},
		{N: 0.2057144, D: 1, T: 6, C: 2},
		{N: -0.5000457e-2, D: 2, T: 10, C: 2},
		{N: 0.4603262e-3, D: 4, T: 10, C: 2},
		{N: -0.3497836e-2, D: 1, T: 10, C: 3},
		{N: 0.6995038e-2, D: 5, T: 18, C: 3},
		{N: -0.1452184e-1, D: 3, T: 22, C: 3},
		{N: -0.1285458e-3, D: 10, T: 50, C: 4},
	},
}
