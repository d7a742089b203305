package sublimation

import (
	"math"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// The melting curves of water's high-pressure ices, the boundary of the
// water model above ice Ih.
//
// Source: IAPWS R14-08(2011), Revised Release on the Pressure along the
// Melting and Sublimation Curves of Ordinary Water Substance, Eqs. 2–5
// (coefficients and check values recalled from memory; the tests prove
// them against the release's check values and against the triple points
// where neighbouring curves meet). With π = p/p*, θ = T/T*:
//
//	ice III  T* = 251.165 K, p* = 208.566 MPa, π = 1 − 0.299948 (1 − θ^60),
//	         251.165 K ≤ T ≤ 256.164 K
//	ice V    T* = 256.164 K, p* = 350.100 MPa, π = 1 − 1.18721 (1 − θ^8),
//	         256.164 K ≤ T ≤ 273.31 K
//	ice VI   T* = 273.31 K,  p* = 632.400 MPa, π = 1 − 1.07476 (1 − θ^4.6),
//	         273.31 K ≤ T ≤ 355 K
//	ice VII  T* = 355 K,     p* = 2216.000 MPa,
//	         ln π = 1.73683 (1 − 1/θ) − 0.0544606 (1 − θ^5)
//	                + 0.806106e-7 (1 − θ^22),  355 K ≤ T ≤ 715 K
//
// Each curve starts at the triple point where it meets the previous one
// (ice Ih–III–liquid at 251.165 K and 208.566 MPa; III–V–liquid at
// 256.164 K, 350.100 MPa; V–VI–liquid at 273.31 K, 632.400 MPa; VI–VII–
// liquid at 355 K, 2216 MPa); together they form one curve of pressure
// rising with temperature, from 208.566 MPa at 251.165 K to 20.618 GPa at
// 715 K. These are published equations used as a boundary of the model:
// no Gibbs-energy model of ices III, V, VI or VII exists here, so the
// states beyond them (and their mixtures with the liquid) are outside the
// model. With six significant digits in their coefficients, neighbouring
// curves meet at their common triple points to about 1e-6 in pressure.

// highIce is the melting curve of one high-pressure ice.
type highIce struct {
	name         string
	tStar, pStar float64 // K, Pa
	tHi          float64 // upper end of the curve, K (the lower end is tStar)
	// lnPi returns ln π(θ) and its derivative in θ.
	lnPi func(th float64) (lnPi, dlnPi float64)
}

// simple returns ln π and its derivative for π = 1 − a(1 − θ^b).
func simple(a, b float64) func(th float64) (float64, float64) {
	return func(th float64) (float64, float64) {
		tb := math.Pow(th, b)
		pi := 1 - a*(1-tb)
		return math.Log(pi), a * b * tb / (th * pi)
	}
}

// waterHighIces are the curves of ices III, V, VI and VII in order of
// temperature (and pressure).
var waterHighIces = []highIce{
	{"ice III", 251.165, 208.566e6, 256.164, simple(0.299948, 60)},
	{"ice V", 256.164, 350.100e6, 273.31, simple(1.18721, 8)},
	{"ice VI", 273.31, 632.400e6, 355, simple(1.07476, 4.6)},
	{"ice VII", 355, 2216.000e6, 715, func(th float64) (float64, float64) {
		t2 := th * th
		t4 := t2 * t2
		t5 := t4 * th
		t22 := t5 * t5 * t5 * t5 * t2
		return 1.73683*(1-1/th) - 0.0544606*(1-t5) + 0.806106e-7*(1-t22),
			1.73683/t2 + 0.0544606*5*t4 - 0.806106e-7*22*t22/th
	}},
}

// highPressure returns the melting pressure of curve c at T within its
// range.
func (c *highIce) highPressure(T float64) float64 {
	l, _ := c.lnPi(T / c.tStar)
	return c.pStar * math.Exp(l)
}

// highTemperature returns the melting temperature of curve c at p within
// its range, by Newton's method on ln π(θ) (monotone), bracketed by the
// curve's ends.
func (c *highIce) highTemperature(p float64) float64 {
	target := math.Log(p / c.pStar)
	lo, hi := 1.0, c.tHi/c.tStar
	lhi, _ := c.lnPi(hi)
	th := 1 + (hi-1)*target/lhi // linear in the bracket
	for it := 0; it < 100; it++ {
		l, d := c.lnPi(th)
		r := l - target
		if r > 0 {
			hi = th
		} else {
			lo = th
		}
		next := th - r/d
		if !(next > lo && next < hi) {
			next = 0.5 * (lo + hi)
		}
		if math.Abs(next-th) <= 1e-15*th || hi-lo <= 1e-15*hi {
			th = next
			break
		}
		th = next
	}
	return th * c.tStar
}

// IceMelting is a point of the melting curve of one of water's
// high-pressure ices: temperature T in K, pressure P in Pa, and the ice
// that coexists with the liquid there ("ice III", "ice V", "ice VI" or
// "ice VII").
type IceMelting struct {
	T, P float64
	Ice  string
}

// HighIceRange returns the range of the melting curves of the
// high-pressure ices of s's fluid: from tLo = 251.165 K, pLo =
// 208.566 MPa (the ice Ih–ice III–liquid triple point, where the melting
// curve of ice Ih ends) to tHi = 715 K, pHi = 20.618 GPa (the end of the
// ice VII curve of IAPWS R14-08). It returns zeros for dry ice, whose
// model has no other solid phase in its range.
func (s Solid) HighIceRange() (tLo, tHi, pLo, pHi float64) {
	if s.d == nil {
		return 0, 0, 0, 0
	}
	c := s.d.high
	if len(c) == 0 {
		return 0, 0, 0, 0
	}
	last := &c[len(c)-1]
	return c[0].tStar, last.tHi, c[0].pStar, last.highPressure(last.tHi)
}

// HighIceMeltingPressure returns the melting curve of water's
// high-pressure ices at temperature T in K (IAPWS R14-08(2011), Eqs. 2–5;
// see HighIceRange): the pressure above which liquid water at T freezes,
// and the ice it freezes to. These curves are published equations used
// as the boundary of the model, not Gibbs-energy equalities: the ices
// themselves are not modelled. At a temperature where two curves meet
// (256.164, 273.31 and 355 K) the curve of the lower-pressure ice is
// used.
//
// Special cases are:
//
//	T NaN, ±Inf or ≤ 0: error wrapping fluid.ErrInvalidInput
//	T outside 251.165 K ≤ T ≤ 715 K: error wrapping fluid.ErrOutOfRange
//	dry ice (no high-pressure ices in the model): error wrapping
//	  fluid.ErrUndefined
//
// HighIceMeltingPressure allocates nothing unless it returns an error.
func (s Solid) HighIceMeltingPressure(T float64) (IceMelting, error) {
	const op = "sublimation.Solid.HighIceMeltingPressure"
	tLo, tHi, _, _ := s.HighIceRange()
	if err := s.highInput(op, fluid.Input{Name: "T", Value: T, Unit: "K"}, tLo, tHi); err != nil {
		return IceMelting{}, err
	}
	for i := range s.d.high {
		c := &s.d.high[i]
		if T <= c.tHi {
			return IceMelting{T: T, P: c.highPressure(T), Ice: c.name}, nil
		}
	}
	return IceMelting{}, s.highInput(op, fluid.Input{Name: "T", Value: T, Unit: "K"}, 0, 0)
}

// HighIceMeltingTemperature returns the melting curve of water's
// high-pressure ices at pressure p in Pa (see HighIceMeltingPressure):
// the temperature below which liquid water at p freezes, and the ice it
// freezes to. At a pressure where two curves meet the curve of the
// lower-pressure ice is used.
//
// Special cases are:
//
//	p NaN, ±Inf or ≤ 0: error wrapping fluid.ErrInvalidInput
//	p outside 208.566 MPa ≤ p ≤ 20.618 GPa (HighIceRange): error
//	  wrapping fluid.ErrOutOfRange
//	dry ice: error wrapping fluid.ErrUndefined
//
// HighIceMeltingTemperature allocates nothing unless it returns an error.
func (s Solid) HighIceMeltingTemperature(p float64) (IceMelting, error) {
	const op = "sublimation.Solid.HighIceMeltingTemperature"
	_, _, pLo, pHi := s.HighIceRange()
	if err := s.highInput(op, fluid.Input{Name: "p", Value: p, Unit: "Pa"}, pLo, pHi); err != nil {
		return IceMelting{}, err
	}
	for i := range s.d.high {
		c := &s.d.high[i]
		if i == len(s.d.high)-1 || p <= s.d.high[i+1].pStar {
			return IceMelting{T: c.highTemperature(p), P: p, Ice: c.name}, nil
		}
	}
	return IceMelting{}, s.highInput(op, fluid.Input{Name: "p", Value: p, Unit: "Pa"}, 0, 0)
}

// highInput checks the input of the high-pressure ice curves: finite
// and positive, a model with such ices, and within [lo, hi].
func (s Solid) highInput(op string, in fluid.Input, lo, hi float64) error {
	if s.d == nil {
		return s.zero(op, in)
	}
	if !finite(in.Value) || in.Value <= 0 {
		return fluid.NewError(op, fluid.ErrInvalidInput, in.Name+" must be finite and positive", in)
	}
	if len(s.d.high) == 0 {
		return fluid.NewError(op, fluid.ErrUndefined,
			"the "+s.d.name+" model has no high-pressure ices: it is the stable solid throughout its range", in)
	}
	if !(in.Value >= lo && in.Value <= hi) {
		return fluid.NewError(op, fluid.ErrOutOfRange, "valid range "+fmtG(lo)+" <= "+in.Name+" <= "+fmtG(hi)+
			" "+in.Unit+" (the melting curves of ice III, V, VI and VII, IAPWS R14-08)", in)
	}
	return nil
}
