package transport

import "math"

// Water: IAPWS R12-08 (viscosity), IAPWS R15-11 (thermal conductivity) and
// IAPWS R1-76(2014) (surface tension), with IAPWS-95 (package fluid) for
// the thermodynamic properties they need.

const (
	waterTc   = 647.096   // K
	waterRhoc = 322.0     // kg/m³
	waterPc   = 22.064e6  // Pa
	waterR    = 461.51805 // J/(kg·K), R15-11's specific gas constant
)

// waterCrit: the critical-enhancement constants common to R12-08 and
// R15-11 (recalled from memory of IAPWS R12-08 Table 3 and R15-11 Table 6):
// ξ0 = 0.13 nm, Γ0 = 0.06, ν = 0.630, γ = 1.239, T̄_R = 1.5.
var waterCrit = critParams{
	pc: waterPc, rhoc: waterRhoc,
	tRef:      1.5 * waterTc,
	xi0:       0.13e-9,
	gamma0:    0.06,
	nuOverGam: 0.630 / 1.239,
}

// waterModel: the water correlations.
var waterModel = model{
	fluid: "water",
	viscName: "IAPWS R12-08 (IAPWS Formulation 2008 for the Viscosity of Ordinary Water Substance), " +
		"critical enhancement included; T <= 1173.15 K for p <= 300 MPa, 873.15 K to 350 MPa, " +
		"433.15 K to 500 MPa, 373.15 K to 1000 MPa",
	condName: "IAPWS R15-11 (IAPWS Formulation 2011 for the Thermal Conductivity of Ordinary Water Substance), " +
		"critical enhancement included; T <= 1173.15 K for p <= 100 MPa, 874 K to 250 MPa, " +
		"573 K to 687 MPa, 403 K to 785 MPa, 348 K to 1000 MPa",
	sigmaDoc: "IAPWS R1-76(2014) (Revised Release on Surface Tension of Ordinary Water Substance); " +
		"248.15 K <= T <= 647.096 K",
	// IAPWS R12-08, range of validity (recalled from memory of the
	// release's section 2.2): from the melting or sublimation curve up to
	// 1173.15 K for p ≤ 300 MPa, 873.15 K for p ≤ 350 MPa, 433.15 K for
	// p ≤ 500 MPa and 373.15 K for p ≤ 1000 MPa.
	visc: &validity{name: "IAPWS R12-08", bands: []band{
		{300e6, 0, 1173.15}, {350e6, 0, 873.15}, {500e6, 0, 433.15}, {1000e6, 0, 373.15},
	}},
	// IAPWS R15-11, range of validity (recalled from memory of the
	// release's section 3.3): up to 1173.15 K for p ≤ 100 MPa, 874 K for
	// p ≤ 250 MPa, 573 K for p ≤ 687 MPa, 403 K for p ≤ 785 MPa and 348 K
	// for p ≤ 1000 MPa.
	cond: &validity{name: "IAPWS R15-11", bands: []band{
		{100e6, 0, 1173.15}, {250e6, 0, 874}, {687e6, 0, 573}, {785e6, 0, 403}, {1000e6, 0, 348},
	}},
	crit:      &waterCrit,
	coeffs:    waterCoeffs,
	sigma:     waterSigma,
	sigmaName: "IAPWS R1-76(2014)",
	// The release: from the triple point to the critical point; it states
	// that the equation also gives accurate values extrapolated into the
	// supercooled liquid down to −25 °C (recalled from memory), which is
	// accepted.
	sigmaLo: 248.15, sigmaHi: waterTc,
}

// waterCoeffs evaluates R12-08 and R15-11 at s.
func waterCoeffs(s state, w which) Coefficients {
	tb, rb := s.T/waterTc, s.rho/waterRhoc
	mu := waterMu0(tb) * waterMu1(tb, rb) * waterMu2(s.xi) // µPa·s
	c := Coefficients{Viscosity: mu * 1e-6}
	if w&wantConductivity == 0 {
		return c
	}
	lam := waterLambda0(tb) * waterLambda1(tb, rb) // mW/(m·K)
	if s.xi > 0 {
		// R15-11 Eq. (18): λ̄2 = Λ ρ̄ c̄p T̄ Z(y) / μ̄, y = q̄_D ξ.
		const (
			bigLambda = 177.8514
			qD        = 1 / 0.40e-9 // 1/m
		)
		z := crossover(qD*s.xi, s.cv/s.cp, rb)
		lam += bigLambda * rb * (s.cp / waterR) * tb * z / mu
	}
	c.Conductivity = lam * 1e-3
	return c
}

// waterMu0 is R12-08 Eq. (11), the dilute-gas viscosity in µPa·s.
func waterMu0(tb float64) float64 {
	const h0, h1, h2, h3 = 1.67752, 2.20462, 0.6366564, -0.241605
	u := 1 / tb
	return 100 * math.Sqrt(tb) / (h0 + u*(h1+u*(h2+u*h3)))
}

// waterH are the coefficients H_ij of R12-08 Eq. (12), Table 2
// (shared/reference/water-transport-iapws.md): row i is the power of
// (1/T̄ − 1), column j the power of (ρ̄ − 1).
var waterH = [][]float64{
	{5.20094e-1, 2.22531e-1, -2.81378e-1, 1.61913e-1, -3.25372e-2, 0, 0},
	{8.50895e-2, 9.99115e-1, -9.06851e-1, 2.57399e-1, 0, 0, 0},
	{-1.08374, 1.88797, -7.72479e-1, 0, 0, 0, 0},
	{-2.89555e-1, 1.26613, -4.89837e-1, 0, 6.98452e-2, 0, -4.35673e-3},
	{0, 0, -2.57040e-1, 0, 0, 8.72102e-3, 0},
	{0, 1.20573e-1, 0, 0, 0, 0, -5.93264e-4},
}

// waterMu1 is R12-08 Eq. (12), the residual factor of the viscosity.
func waterMu1(tb, rb float64) float64 {
	return math.Exp(rb * bivariate(waterH, 1/tb-1, rb-1))
}

// waterMu2 is the critical enhancement of R12-08, Eqs. (14) to (21), at
// correlation length xi (m); 1 for xi = 0.
func waterMu2(xi float64) float64 {
	if xi == 0 {
		return 1
	}
	// R12-08 Table 3 (recalled from memory): x_μ = 0.068,
	// q_C⁻¹ = 1.9 nm, q_D⁻¹ = 1.1 nm.
	const (
		xmu = 0.068
		qC  = 1 / 1.9e-9
		qD  = 1 / 1.1e-9
	)
	c, d := qC*xi, qD*xi
	var y float64
	if xi <= 0.3817016416e-9 {
		// Eq. (15): the series for small ξ.
		d2 := d * d
		y = 0.2 * c * d2 * d2 * d * (1 - c + c*c - 765.0/504*d2)
	} else {
		// Eqs. (16) to (20).
		psi := math.Acos(1 / math.Sqrt(1+d*d))
		w := math.Sqrt(math.Abs((c-1)/(c+1))) * math.Tan(psi/2)
		var l float64
		if c > 1 {
			l = math.Log((1 + w) / (1 - w))
		} else {
			l = 2 * math.Atan(math.Abs(w))
		}
		c2 := c * c
		y = math.Sin(3*psi)/12 - math.Sin(2*psi)/(4*c) +
			(1-1.25*c2)*math.Sin(psi)/c2 -
			((1-1.5*c2)*psi-math.Pow(math.Abs(c2-1), 1.5)*l)/(c2*c)
	}
	return math.Exp(xmu * y)
}

// waterLambda0 is R15-11 Eq. (16), the dilute-gas thermal conductivity in
// mW/(m·K). Coefficients L_k recalled from memory of R15-11 Table 1.
func waterLambda0(tb float64) float64 {
	const l0, l1, l2, l3, l4 = 2.443221e-3, 1.323095e-2, 6.770357e-3, -3.454586e-3, 4.096266e-4
	u := 1 / tb
	return math.Sqrt(tb) / (l0 + u*(l1+u*(l2+u*(l3+u*l4))))
}

// waterL are the coefficients L_ij of R15-11 Eq. (17) (recalled from
// memory of R15-11 Table 2): row i is the power of (1/T̄ − 1), column j
// the power of (ρ̄ − 1).
var waterL = [][]float64{
	{1.60397357, -0.646013523, 0.111443906, 0.102997357, -0.0504123634, 0.00609859258},
	{2.33771842, -2.78843778, 1.53616167, -0.463045512, 0.0832827019, -0.00719201245},
	{2.19650529, -4.54580785, 3.55777244, -1.40944978, 0.275418278, -0.0205938816},
	{-1.21051378, 1.60812989, -0.621178141, 0.0716373224, 0, 0},
	{-2.7203370, 4.57586331, -3.18369245, 1.1168348, -0.19268305, 0.012913842},
}

// waterLambda1 is R15-11 Eq. (17), the residual factor of the thermal
// conductivity.
func waterLambda1(tb, rb float64) float64 {
	return math.Exp(rb * bivariate(waterL, 1/tb-1, rb-1))
}

// bivariate returns Σ_i x^i Σ_j c[i][j] y^j by Horner's rule in both.
func bivariate(c [][]float64, x, y float64) float64 {
	sum := 0.0
	for i := len(c) - 1; i >= 0; i-- {
		inner := 0.0
		for j := len(c[i]) - 1; j >= 0; j-- {
			inner = inner*y + c[i][j]
		}
		sum = sum*x + inner
	}
	return sum
}

// waterSigma is IAPWS R1-76(2014): σ = B τ^μ (1 + b τ), τ = 1 − T/Tc, in
// N/m (shared/reference/water-transport-iapws.md).
func waterSigma(T float64) float64 {
	const bigB, b, mu = 235.8e-3, -0.625, 1.256
	tau := 1 - T/waterTc
	if tau <= 0 {
		return 0
	}
	return bigB * math.Pow(tau, mu) * (1 + b*tau)
}
