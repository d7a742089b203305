package sublimation

import "math"

// dryIce is the Gibbs-energy model of solid carbon dioxide of this package
// (derivation in doc.go):
//
//	g(T, p) = g0(T) + Φ(T, p)
//	g0(T)   = c0 + c1 T + R T Σ ni ln(1 − exp(−θi/T))
//	          − a1 R T²/(2 T0) − a2 R T³/(6 T0²)
//	Φ(T, p) = v0(T) K(T)/(n − 1) [(1 + n p/K(T))^((n−1)/n) − 1]
//	v0(T)   = v00 exp(α0 τ + α1 τ²/2),  K(T) = K0 exp(−β τ),  τ = T − T0,
//
// so that v = g_p = v0(T) (1 + n p/K(T))^(−1/n), a Murnaghan isotherm whose
// zero-pressure volume and bulk modulus depend smoothly on T, and the
// isobaric heat capacity at p → 0 is a sum of Einstein functions plus an
// anharmonic term a1 T/T0 + a2 (T/T0)².
type dryIce struct {
	r      float64 // specific gas constant of the fluid equation, J/(kg·K)
	t0     float64 // K
	c0, c1 float64 // J/kg, J/(kg·K)
	a1, a2 float64 // dimensionless
	modes  []einstein
	v00    float64 // m³/kg
	al0    float64 // 1/K
	al1    float64 // 1/K²
	k0     float64 // Pa
	beta   float64 // 1/K
	n      float64 // dimensionless, > 1
}

// einstein is a group of n oscillators of characteristic temperature
// theta in K.
type einstein struct{ n, theta float64 }

func (m *dryIce) gibbs(T, p float64) gibbsDerivs {
	R := m.r
	// g0(T) and its T-derivatives.
	G := m.c0 + m.c1*T
	GT := m.c1
	GTT := 0.0
	for _, e := range m.modes {
		x := e.theta / T
		em := math.Expm1(x)            // e^x − 1
		l := math.Log(-math.Expm1(-x)) // ln(1 − e^−x)
		G += e.n * R * T * l
		GT += e.n * R * (l - x/em)
		GTT -= e.n * R * x * x * (em + 1) / (em * em) / T
	}
	t := T / m.t0
	G -= R * m.t0 * (m.a1*t*t/2 + m.a2*t*t*t/6)
	GT -= R * (m.a1*t + m.a2*t*t/2)
	GTT -= R * (m.a1 + m.a2*t) / m.t0

	// Φ(T, p).
	tau := T - m.t0
	L := m.al0 + m.al1*tau // v0'/v0
	v0 := m.v00 * math.Exp(tau*(m.al0+m.al1*tau/2))
	K := m.k0 * math.Exp(-m.beta*tau)
	n := m.n
	mm := (n - 1) / n
	x := n * p / K
	lu := math.Log1p(x)        // ln u, u = 1 + n p/K
	um1 := math.Expm1(mm * lu) // u^m − 1
	um := um1 + 1              // u^m
	ui := math.Exp(-lu / n)    // u^(−1/n)
	u := 1 + x
	uT := x * m.beta           // ∂u/∂T
	uTT := x * m.beta * m.beta // ∂²u/∂T²
	A := v0 * K / (n - 1)
	d := L - m.beta // A'/A
	A1 := A * d
	A2 := A * (d*d + m.al1)
	G += A * um1
	GT += A1*um1 + A*mm*um/u*uT
	GTT += A2*um1 + 2*A1*mm*um/u*uT + A*mm*(mm-1)*um/(u*u)*uT*uT + A*mm*um/u*uTT
	return gibbsDerivs{
		G: G, GT: GT, GTT: GTT,
		GP:  v0 * ui,
		GTP: v0*L*ui - v0*ui/(n*u)*uT,
		GPP: -v0 * ui / (u * K),
	}
}

// dryIceModel holds the parameters of doc.go ("Dry ice"). The five
// intramolecular modes are the Planck–Einstein terms of the Span–Wagner
// ideal-gas part (θ = θ°i·Tc with θ°i of Span and Wagner 1996, Table 27,
// Tc = 304.1282 K); the lattice temperatures, the anharmonic terms, c1 and
// the volume parameters were fitted (doc.go), n and β were fixed; c0 was
// then set so that g equals the Span–Wagner saturated Gibbs energy at
// 216.592 K, 0.517964458 MPa (the fluid equation's own saturation).
var dryIceModel = &dryIce{
	r:  188.9241,
	t0: 216.592,
	c0: -831446.746464718,
	c1: 5214.466116539215,
	a1: 2.968612661528503,
	a2: -1.6378182349455643,
	modes: []einstein{
		{3, 105.73642862607916}, // translational lattice modes
		{2, 106.52026460024565}, // librational lattice modes
		{1.99427042, 3.15163 * 304.1282},
		{0.62105248, 6.1119 * 304.1282},
		{0.41195293, 6.77708 * 304.1282},
		{1.04028922, 11.32384 * 304.1282},
		{0.08327678, 27.08792 * 304.1282},
	},
	v00:  0.0006440429413767558,
	al0:  0.0005709171369443279,
	al1:  -1.2945916649249662e-06,
	k0:   6.147143741419223e+09,
	beta: 0.0027,
	n:    7.8,
}

// dryIceData is dry ice with its range (doc.go, "Range").
var dryIceData = &solidData{
	name: "dry ice",
	m:    dryIceModel,
	limits: Limits{
		TMin: 150, TMax: 327.73, PMax: 800e6,
		TFloor: 150, TCeil: 340, PCeil: 800e6,
	},
	beyond: "the dry-ice model rests on the Span-Wagner melting equation and equation of state, " +
		"which end at 800 MPa; no solid data support it beyond",
	curveTMin: 150, // fluid CO2's vapour floor, Limits().TFloor
	meltPMax:  800e6,
	meltTEnd:  327.73,
	meltBeyond: "the melting curve of the dry-ice model ends at 800 MPa, " +
		"the pressure limit of the Span-Wagner equation and its melting equation",
}
