package sublimation

import "math/cmplx"

// Ice Ih: the IAPWS-06 Gibbs function.
//
// Source: IAPWS R10-06(2009), Revised Release on the Equation of State 2006
// for H2O Ice Ih, Table 2 (coefficients, transcribed in
// shared/reference/ice-ih-iapws06.md), with s0 in the form consistent with
// the IAPWS-95 reference state (u = 0, s = 0 for the saturated liquid at
// the triple point), so that ice and IAPWS-95 water share one reference.
//
//	g(T, p) = g0(p) − s0·Tt·τ + Tt Re Σ(k=1,2) rk [(tk − τ) ln(tk − τ)
//	          + (tk + τ) ln(tk + τ) − 2 tk ln tk − τ²/tk]
//	g0(p) = Σ(k=0..4) g0k (π − π0)^k,  r2(p) = Σ(k=0..2) r2k (π − π0)^k,
//	τ = T/Tt, π = p/pt, π0 = p0/pt,
//
// with complex tk, rk and the principal branch of the logarithm. Range
// (R10-06): 0 < T ≤ 273.16 K, 0 < p ≤ 210 MPa, within the stability
// region of ice Ih.
const (
	iceTt  = 273.16   // K
	icePt  = 611.657  // Pa
	iceP0  = 101325.0 // Pa
	icePi0 = iceP0 / icePt
)

// iceIh is the IAPWS-06 model. Its zero value is not used; see iceModel.
type iceIh struct {
	g0     [5]float64 // J/kg
	s0     float64    // J/(kg·K)
	t1, r1 complex128 // r1 in J/(kg·K)
	t2     complex128
	r2     [3]complex128 // J/(kg·K)
}

var iceModel = &iceIh{
	g0: [5]float64{
		-632020.233335886,
		0.655022213658955,
		-0.0000000189369929326131,
		3.39746123271053e-15,
		-5.56464869058991e-22,
	},
	s0: -3327.33756492168,
	t1: complex(0.0368017112855051, 0.0510878114959572),
	r1: complex(44.7050716285388, 65.6876847463481),
	t2: complex(0.337315741065416, 0.335449415919309),
	r2: [3]complex128{
		complex(-72.597457432922, -78.100842711287),
		complex(-0.0000557107698030123, 0.0000464578634580806),
		complex(0.0000000000234801409215913, -0.0000000000285651142904972),
	},
}

// gibbs evaluates g and its first and second derivatives in T and p.
func (m *iceIh) gibbs(T, p float64) gibbsDerivs {
	tau := T / iceTt
	x := p/icePt - icePi0 // π − π0
	g0 := m.g0
	// g0(p) and its p-derivatives (d/dp = (1/pt) d/dπ).
	G0 := g0[0] + x*(g0[1]+x*(g0[2]+x*(g0[3]+x*g0[4])))
	G0p := (g0[1] + x*(2*g0[2]+x*(3*g0[3]+x*4*g0[4]))) / icePt
	G0pp := (2*g0[2] + x*(6*g0[3]+x*12*g0[4])) / (icePt * icePt)
	r2 := m.r2[0] + complex(x, 0)*(m.r2[1]+complex(x, 0)*m.r2[2])
	r2p := (m.r2[1] + complex(2*x, 0)*m.r2[2]) / complex(icePt, 0)
	r2pp := 2 * m.r2[2] / complex(icePt*icePt, 0)

	ct := complex(tau, 0)
	// Per term k: the bracket B, its τ-derivative B1 and second B2.
	b := func(t complex128) (B, B1, B2 complex128) {
		lm, lp := cmplx.Log(t-ct), cmplx.Log(t+ct)
		B = (t-ct)*lm + (t+ct)*lp - 2*t*cmplx.Log(t) - ct*ct/t
		B1 = -lm + lp - 2*ct/t
		B2 = 1/(t-ct) + 1/(t+ct) - 2/t
		return
	}
	B1a, B1b, B1c := b(m.t1)
	B2a, B2b, B2c := b(m.t2)
	return gibbsDerivs{
		G:   G0 - m.s0*T + iceTt*real(m.r1*B1a+r2*B2a),
		GT:  -m.s0 + real(m.r1*B1b+r2*B2b),
		GP:  G0p + iceTt*real(r2p*B2a),
		GTT: real(m.r1*B1c+r2*B2c) / iceTt,
		GTP: real(r2p * B2b),
		GPP: G0pp + iceTt*real(r2pp*B2a),
	}
}

// iceData is ice Ih with its range.
//
// Range: R10-06 states 0 < T ≤ 273.16 K and 0 < p ≤ 210 MPa within the
// stability region of ice Ih; Props accepts (flagged Extrapolated) up to
// 300 K for metastable superheated ice and solver iterates. Beyond
// 208.566 MPa (the ice Ih–ice III–liquid triple point at 251.165 K,
// IAPWS R14-08) other ices are stable: the melting curve stops there, and
// Props refuses pressures above the release's 210 MPa.
var iceData = &solidData{
	name: "ice Ih",
	m:    iceModel,
	limits: Limits{
		TMin: 0, TMax: iceTt, PMax: 210e6,
		TFloor: 0, TCeil: 300, PCeil: 210e6,
	},
	beyond:    "ice Ih is not stable there; ice II, ice III, ice V, ice VI and other ices exist beyond and are outside the model (IAPWS R10-06 covers ice Ih only)",
	curveTMin: 200, // fluid water's vapour floor, Limits().TFloor
	meltPMax:  208.566e6,
	meltTEnd:  251.165,
	meltBeyond: "the ice Ih melting curve ends at the ice Ih-ice III-liquid triple point, 251.165 K and 208.566 MPa (IAPWS R14-08); " +
		"beyond it liquid water coexists with ice III, ice V, ice VI and ice VII, which are outside the model",
	high: waterHighIces,
}
