package transport

import "math"

// Carbon dioxide: the thermal conductivity of Huber et al. (2016) and the
// surface tension of Mulero et al. (2012), with Span–Wagner (package
// fluid) for the thermodynamic properties the conductivity needs.
//
// No viscosity correlation is offered: the one Huber et al. use in their
// critical enhancement, Laesecke & Muzny (2017), is evaluated here for
// that term only (co2Viscosity), because its own check table could not be
// reproduced from the values recalled for it (see co2_test.go).

// co2Crit: the critical enhancement of Huber et al. (2016), recalled from
// memory: ξ0 = 1.50e-10 m, Γ0 = 0.052, ν = 0.63, γ = 1.239,
// T_ref = 456.19 K, with the critical pressure and density of Span–Wagner.
var co2Crit = critParams{
	pc: 7.3773e6, rhoc: 467.6,
	tRef:      456.19,
	xi0:       1.50e-10,
	gamma0:    0.052,
	nuOverGam: 0.63 / 1.239,
}

var co2Model = model{
	fluid: "CO2",
	condName: "Huber, Sykioti, Assael and Perkins, J. Phys. Chem. Ref. Data 45, 013102 (2016), " +
		"critical enhancement included; 216.592 K <= T <= 1100 K, p <= 200 MPa",
	sigmaDoc: "Mulero, Cachadina and Parra, J. Phys. Chem. Ref. Data 41, 043105 (2012); " +
		"216.592 K <= T <= 304.13 K",
	// Huber et al. (2016): from the triple-point temperature to 1100 K at
	// pressures up to 200 MPa (recalled from memory of the paper's
	// abstract).
	cond:   &validity{name: "Huber et al. (2016)", bands: []band{{200e6, 216.592, 1100}}},
	crit:   &co2Crit,
	coeffs: co2Coeffs,
	// Mulero et al. (2012), σ = σ0 (1 − T/Tc)^n with Tc = 304.13 K; used
	// from the triple point.
	sigma:     func(T float64) float64 { return mulero(T, 304.13, 0.07863, 1.254) },
	sigmaName: "Mulero et al. (2012)",
	sigmaLo:   216.592, sigmaHi: 304.13,
}

// co2Coeffs evaluates the conductivity of Huber et al. (2016):
//
//	λ = λ0(T) + Δλr(T, ρ) + Δλc(T, ρ)
//	λ0 = √Tr / Σ L_k/Tr^k   (mW/(m·K)),  Tr = T/Tc
//	Δλr = Σ(i=1..6) (B1,i + B2,i Tr) ρr^i   (W/(m·K)),  ρr = ρ/ρc
//	Δλc = ρ cp R_D k_B T q_D Z(q_D ξ) / (6π η)
//
// with Tc = 304.1282 K, ρc = 467.6 kg/m³, R_D = 1.02,
// q_D⁻¹ = 4.0e-10 m and η from Laesecke & Muzny (2017). Coefficients
// recalled from memory of Huber et al. (2016), Tables 3, 4 and 5.
func co2Coeffs(s state, w which) Coefficients {
	const (
		tc, rhoc = 304.1282, 467.6
		rD       = 1.02
		qD       = 1 / 4.0e-10  // 1/m
		kB       = 1.380649e-23 // J/K, exact (SI 2019)
		l0, l1   = 1.51874307e-2, 2.80674040e-2
		l2, l3   = 2.28564190e-2, -7.41624210e-3
	)
	tr, rr := s.T/tc, s.rho/rhoc
	u := 1 / tr
	lam := math.Sqrt(tr) / (l0 + u*(l1+u*(l2+u*l3))) * 1e-3
	sum, x := 0.0, rr
	for i := range co2B1 {
		sum += (co2B1[i] + co2B2[i]*tr) * x
		x *= rr
	}
	lam += sum
	if s.xi > 0 {
		z := crossover(qD*s.xi, s.cv/s.cp, rr)
		lam += s.rho * s.cp * rD * kB * s.T * qD * z / (6 * math.Pi * co2Viscosity(s.T, s.rho))
	}
	return Coefficients{Conductivity: lam}
}

// Huber et al. (2016), coefficients B1,i and B2,i of the residual
// conductivity, W/(m·K) (recalled from memory).
var (
	co2B1 = [6]float64{1.00128e-2, 5.60488e-2, -8.11620e-2, 6.24337e-2, -2.06336e-2, 2.53248e-3}
	co2B2 = [6]float64{4.30829e-3, -3.58563e-2, 6.71480e-2, -5.22855e-2, 1.74571e-2, -1.96414e-3}
)

// co2Viscosity is the viscosity of Laesecke & Muzny (2017) in Pa·s,
// recalled from memory, for the critical enhancement of the conductivity
// only:
//
//	η = η0(T) + η0(T) B*(T*) N_A σ³ ρ/M + η_tL [c1 Tr ρr³ + (ρr² + ρr^γ)/(Tr − c2)]
//	η0 = 1.0055 √T / [a0 + a1 T^(1/6) + a2 exp(a3 T^(1/3))
//	     + (a4 + a5 T^(1/3))/exp(T^(1/3)) + a6 √T]   (mPa·s)
//	B* = Σ(i=0..6) b_i T*^(−i/4) + b7 T*^(−2.5) + b8 T*^(−5.5),  T* = T/(ε/k)
//	η_tL = ρ_tL^(2/3) √(R T_t) / (M^(1/6) N_A^(1/3))
//
// with ε/k = 200.760 K, σ = 0.378421 nm, T_t = 216.592 K, Tr = T/T_t,
// ρ_tL = 1178.53 kg/m³, ρr = ρ/ρ_tL and M = 44.0098 g/mol.
func co2Viscosity(T, rho float64) float64 {
	const (
		nA    = 6.022140857e23 // 1/mol, CODATA 2014
		rGas  = 8.3144598      // J/(mol·K), CODATA 2014
		m     = 44.0098e-3     // kg/mol
		tt    = 216.592        // K
		rhoTL = 1178.53        // kg/m³
		sigma = 0.378421e-9    // m
		epsK  = 200.760        // K
		c1    = 0.360603235428487
		c2    = 0.121550806591497
		gam   = 8.06282737481277
	)
	t3 := math.Cbrt(T)
	sq := math.Sqrt(T)
	a := &co2A
	eta0 := 1.0055e-3 * sq / (a[0] + a[1]*math.Sqrt(t3) + a[2]*math.Exp(a[3]*t3) +
		(a[4]+a[5]*t3)*math.Exp(-t3) + a[6]*sq) // Pa·s
	// B*: powers of T*^(−1/4) by multiplication.
	q := math.Sqrt(math.Sqrt(epsK / T))
	b := &co2Bvir
	bs := b[6]
	for i := 5; i >= 0; i-- {
		bs = bs*q + b[i]
	}
	q2 := q * q
	q10 := q2 * q2 * q2 * q2 * q2
	q12 := q10 * q2
	bs += q10 * (b[7] + b[8]*q12)
	bEta := nA * sigma * sigma * sigma * bs // m³/mol
	etaTL := math.Pow(rhoTL, 2.0/3) * math.Sqrt(rGas*tt) / (math.Pow(m, 1.0/6) * math.Cbrt(nA))
	tr, rr := T/tt, rho/rhoTL
	rr2 := rr * rr
	etaR := etaTL * (c1*tr*rr2*rr + (rr2+math.Pow(rr, gam))/(tr-c2))
	return eta0*(1+bEta*rho/m) + etaR
}

// Laesecke & Muzny (2017): coefficients a_i of the dilute-gas viscosity
// and b_i of the second viscosity virial coefficient (recalled from
// memory).
var (
	co2A = [7]float64{1749.354893188350, -369.069300007128, 5423856.34887691,
		-2.21283852168356, -269503.247933569, 73145.021531826, 5.34368649509278}
	co2Bvir = [9]float64{-19.572881, 219.73999, -1015.3226, 2471.0125, -3375.1717,
		2491.6597, -787.26086, 14.085455, -0.34664158}
)

// mulero is the surface-tension form of Mulero, Cachadiña & Parra (2012),
// σ = σ0 (1 − T/Tc)^n in N/m, zero at and above Tc.
func mulero(T, tc, sigma0, n float64) float64 {
	tau := 1 - T/tc
	if tau <= 0 {
		return 0
	}
	return sigma0 * math.Pow(tau, n)
}
