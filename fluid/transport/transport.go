package transport

import (
	"errors"
	"strconv"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// Coefficients are the transport coefficients of a fluid at one (T, ρ).
type Coefficients struct {
	Viscosity    float64 // dynamic viscosity η, Pa·s
	Conductivity float64 // thermal conductivity λ, W/(m·K)
}

// which selects the coefficients a call computes.
type which uint8

const (
	wantViscosity which = 1 << iota
	wantConductivity
)

// band is one pressure band of a correlation's published range: up to
// PMax (Pa) the correlation holds for TMin ≤ T ≤ TMax (K).
type band struct {
	pMax, tMin, tMax float64
}

// validity is the published range of one correlation.
type validity struct {
	name  string // the correlation, e.g. "IAPWS R12-08"
	bands []band // by increasing pMax
}

// check reports whether (T, p) lies in v and, if not, returns the text
// of the range that applies.
func (v *validity) check(T, p float64) (string, bool) {
	for i := range v.bands {
		b := &v.bands[i]
		if p <= b.pMax {
			if T >= b.tMin && T <= b.tMax {
				return "", true
			}
			return rangeText(v.name, T, p, b, i, v.bands), false
		}
	}
	last := v.bands[len(v.bands)-1]
	return v.name + " holds up to p = " + fmtG(last.pMax) + " Pa", false
}

func rangeText(name string, T, p float64, b *band, i int, bands []band) string {
	pLo := 0.0
	if i > 0 {
		pLo = bands[i-1].pMax
	}
	t := "T <= " + fmtG(b.tMax) + " K"
	if b.tMin > 0 {
		t = fmtG(b.tMin) + " <= " + t
	}
	return name + " holds " + t + " for " + fmtG(pLo) + " < p <= " + fmtG(b.pMax) +
		" Pa; here p = " + strconv.FormatFloat(p, 'g', 6, 64) + " Pa"
}

// state is what the correlations need at one (T, ρ): the equation of state
// and the correlation length of the critical enhancement.
type state struct {
	T, rho    float64 // K, kg/m³
	p         float64 // Pa
	cp, cv    float64 // J/(kg·K)
	dpdrho    float64 // (∂p/∂ρ)_T at T, Pa·m³/kg
	dpdrhoRef float64 // (∂p/∂ρ)_T at the reference temperature of the enhancement
	xi        float64 // correlation length, m (0 at zero density)
}

// model holds the correlations of one fluid. Its values are fixed at
// compile time and never changed.
type model struct {
	fluid string // canonical fluid name

	viscName, condName string    // the publications, for Correlations
	visc, cond         *validity // nil where the fluid has no such correlation
	crit               *critParams

	// coeffs computes the requested coefficients at s, whose fields are
	// filled and range-checked.
	coeffs func(s state, w which) Coefficients

	sigma            func(T float64) float64 // N/m; nil if none
	sigmaName        string                  // short name, for messages
	sigmaDoc         string                  // publication and range, for Correlations
	sigmaLo, sigmaHi float64                 // K
}

// modelFor returns the correlations of f, or nil.
func modelFor(f *fluid.Fluid) *model {
	if f == nil {
		return nil
	}
	switch f.Name() {
	case "water":
		return &waterModel
	case "CO2":
		return &co2Model
	case "R134a":
		return &r134aModel
	}
	return nil
}

// Sources names the correlations this package has for one fluid; an
// empty string where it has none.
type Sources struct {
	Viscosity, Conductivity, SurfaceTension string
}

// Correlations returns the correlations this package uses for f, each
// with its publication and range; empty strings for a fluid without them
// (and for a nil f).
func Correlations(f *fluid.Fluid) Sources {
	m := modelFor(f)
	if m == nil {
		return Sources{}
	}
	return Sources{Viscosity: m.viscName, Conductivity: m.condName, SurfaceTension: m.sigmaDoc}
}

// Viscosity returns the dynamic viscosity η of fluid f in Pa·s at
// temperature T in K and density rho in kg/m³, from the fluid's reference
// correlation (see Correlations). rho = 0 gives the dilute-gas limit.
//
// The correlation's published range is enforced in T and in the pressure
// its equation of state gives at (T, rho); the lower temperature bound
// there is the melting or sublimation curve, which this package does not
// judge (as package fluid does not): a state inside a solid region gets
// the fluid correlation's value. Accuracy is that of the correlation (its
// publication states it by region); the implementation reproduces the
// publication's check values to their printed digits (see the tests).
//
// Special cases are:
//
//	f without a viscosity correlation: error wrapping fluid.ErrUndefined
//	T or rho NaN or ±Inf, T ≤ 0 or rho < 0: fluid.ErrInvalidInput
//	(T, p) outside the correlation's range, or p ≤ 0: fluid.ErrOutOfRange
//	(T, rho) rejected by f.Props (outside the equation of state's region,
//	  mechanically unstable): that error, wrapped
//	exactly the critical point, where η diverges: fluid.ErrUndefined
//
// Viscosity allocates nothing unless it returns an error.
func Viscosity(f *fluid.Fluid, T, rho float64) (float64, error) {
	c, err := eval("transport.Viscosity", f, T, rho, wantViscosity)
	return c.Viscosity, err
}

// Conductivity returns the thermal conductivity λ of fluid f in W/(m·K)
// at temperature T in K and density rho in kg/m³, from the fluid's
// reference correlation (see Correlations), critical enhancement included.
// rho = 0 gives the dilute-gas limit. Ranges and special cases are those
// of Viscosity, for the conductivity correlation.
//
// Conductivity allocates nothing unless it returns an error.
func Conductivity(f *fluid.Fluid, T, rho float64) (float64, error) {
	c, err := eval("transport.Conductivity", f, T, rho, wantConductivity)
	return c.Conductivity, err
}

// At returns the viscosity and the thermal conductivity of fluid f at
// temperature T in K and density rho in kg/m³, sharing the equation-of-
// state evaluations the two need. Both coefficients must be defined and in
// range; the special cases are those of Viscosity and Conductivity.
//
// At allocates nothing unless it returns an error.
func At(f *fluid.Fluid, T, rho float64) (Coefficients, error) {
	return eval("transport.At", f, T, rho, wantViscosity|wantConductivity)
}

func inputs(T, rho float64) []fluid.Input {
	return []fluid.Input{{Name: "T", Value: T, Unit: "K"}, {Name: "rho", Value: rho, Unit: "kg/m3"}}
}

func eval(op string, f *fluid.Fluid, T, rho float64, w which) (Coefficients, error) {
	m := modelFor(f)
	if m == nil || (w&wantViscosity != 0 && m.visc == nil) || (w&wantConductivity != 0 && m.cond == nil) {
		return Coefficients{}, fluid.NewError(op, fluid.ErrUndefined, "no "+what(w)+" correlation for "+name(f), inputs(T, rho)...)
	}
	if !finite(T) || T <= 0 || !finite(rho) || rho < 0 {
		return Coefficients{}, fluid.NewError(op, fluid.ErrInvalidInput,
			"T must be finite and positive, rho finite and not negative", inputs(T, rho)...)
	}
	var s state
	if err := m.fill(op, f, &s, T, rho); err != nil {
		return Coefficients{}, err
	}
	if rho > 0 && !(s.p > 0) {
		// Stretched liquid, or the equation of state extrapolated past
		// sense: every correlation's range begins at p > 0.
		return Coefficients{}, fluid.NewError(op, fluid.ErrOutOfRange, "the correlations hold for p > 0; here p = "+
			strconv.FormatFloat(s.p, 'g', 6, 64)+" Pa", inputs(T, rho)...)
	}
	if w&wantViscosity != 0 {
		if msg, ok := m.visc.check(T, s.p); !ok {
			return Coefficients{}, fluid.NewError(op, fluid.ErrOutOfRange, msg, inputs(T, rho)...)
		}
	}
	if w&wantConductivity != 0 {
		if msg, ok := m.cond.check(T, s.p); !ok {
			return Coefficients{}, fluid.NewError(op, fluid.ErrOutOfRange, msg, inputs(T, rho)...)
		}
	}
	return m.coeffs(s, w), nil
}

// fill evaluates f's equation of state at (T, rho) and, where the model
// has a critical enhancement, at its reference temperature.
// Its errors are those of operation op.
func (m *model) fill(op string, f *fluid.Fluid, s *state, T, rho float64) error {
	s.T, s.rho = T, rho
	if rho == 0 {
		// The zero-density limit: no equation-of-state call to judge T,
		// so apply its accepted temperatures here.
		if l := f.Limits(); T < l.TFloor || T > l.TCeil {
			return fluid.NewError(op, fluid.ErrOutOfRange, "valid range "+fmtG(l.TFloor)+
				" <= T <= "+fmtG(l.TCeil)+" K for "+f.Name(), inputs(T, rho)...)
		}
		return nil
	}
	p, err := f.Props(T, rho)
	if err != nil {
		return rewrap(op, err, inputs(T, rho))
	}
	if p.Flags&fluid.AtCritical != 0 {
		return fluid.NewError(op, fluid.ErrUndefined,
			"viscosity and thermal conductivity diverge at the critical point", inputs(T, rho)...)
	}
	s.p, s.cp, s.cv, s.dpdrho = p.P, p.Cp, p.Cv, p.DpDrho
	if c := m.crit; c != nil {
		_, rhoc := f.Reducing()
		_, r := f.Derivs(c.tRef, rho)
		d := rho / rhoc
		s.dpdrhoRef = f.GasConstant() * c.tRef * (1 + 2*d*r.D + d*d*r.DD)
		s.xi = c.corrLength(rho, T, s.dpdrho, s.dpdrhoRef)
	}
	return nil
}

// SurfaceTension returns the vapour–liquid surface tension σ of fluid f in
// N/m at temperature T in K, from the fluid's correlation (see
// Correlations), which is zero at its critical temperature.
//
// Special cases are:
//
//	f without a surface-tension correlation: error wrapping fluid.ErrUndefined
//	T NaN or ±Inf, or T ≤ 0: fluid.ErrInvalidInput
//	T outside the correlation's range: fluid.ErrOutOfRange
//
// SurfaceTension allocates nothing unless it returns an error.
func SurfaceTension(f *fluid.Fluid, T float64) (float64, error) {
	const op = "transport.SurfaceTension"
	in := fluid.Input{Name: "T", Value: T, Unit: "K"}
	m := modelFor(f)
	if m == nil || m.sigma == nil {
		return 0, fluid.NewError(op, fluid.ErrUndefined, "no surface-tension correlation for "+name(f), in)
	}
	if !finite(T) || T <= 0 {
		return 0, fluid.NewError(op, fluid.ErrInvalidInput, "T must be finite and positive", in)
	}
	if T < m.sigmaLo || T > m.sigmaHi {
		return 0, fluid.NewError(op, fluid.ErrOutOfRange, m.sigmaName+" holds "+
			fmtG(m.sigmaLo)+" <= T <= "+fmtG(m.sigmaHi)+" K", in)
	}
	return m.sigma(T), nil
}

// rewrap returns err, an error of package fluid, as an error of op with
// the inputs of the call, keeping its sentinel and explanation (so that
// the message names the inputs once).
func rewrap(op string, err error, in []fluid.Input) error {
	var fe *fluid.Error
	if errors.As(err, &fe) {
		return fluid.NewError(op, fe.Err, fe.Range, in...)
	}
	return fluid.NewError(op, err, "", in...)
}

func what(w which) string {
	switch w {
	case wantViscosity:
		return "viscosity"
	case wantConductivity:
		return "thermal-conductivity"
	}
	return "viscosity or thermal-conductivity"
}

func name(f *fluid.Fluid) string {
	if f == nil {
		return "a nil fluid"
	}
	return f.Name()
}

func finite(x float64) bool { return x-x == 0 }

func fmtG(x float64) string { return strconv.FormatFloat(x, 'g', -1, 64) }
