package fluid

// RefState selects the reference state of enthalpy and entropy. The
// values are stable (the C ABI exposes them).
type RefState int32

const (
	// RefDefault is the reference state of the fluid's published
	// equation of state (see each fluid's doc).
	RefDefault RefState = iota
	// RefIIR: h = 200 kJ/kg and s = 1 kJ/(kg·K) for the saturated liquid
	// at 0 °C.
	RefIIR
	// RefASHRAE: h = 0 and s = 0 for the saturated liquid at −40 °C.
	RefASHRAE
	// RefNBP: h = 0 and s = 0 for the saturated liquid at the normal
	// boiling point, 101.325 kPa.
	RefNBP
)

func (r RefState) String() string {
	switch r {
	case RefDefault:
		return "default"
	case RefIIR:
		return "IIR"
	case RefASHRAE:
		return "ASHRAE"
	case RefNBP:
		return "NBP"
	}
	return "RefState(" + fmtG(float64(r)) + ")"
}

// refDef is the definition of a reference state: the saturated liquid at
// temperature T (K) or, when T is 0, at pressure P (Pa) has enthalpy H
// (J/kg) and entropy S (J/(kg·K)).
type refDef struct {
	T, P, H, S float64
	what       string
}

// definition returns the defining state of r; ok is false for RefDefault
// and unknown values.
func (r RefState) definition() (d refDef, ok bool) {
	switch r {
	case RefIIR:
		return refDef{T: 273.15, H: 200e3, S: 1e3, what: "saturated liquid at 273.15 K"}, true
	case RefASHRAE:
		return refDef{T: 233.15, what: "saturated liquid at 233.15 K"}, true
	case RefNBP:
		return refDef{P: 101325, what: "saturated liquid at 101325 Pa"}, true
	}
	return refDef{}, false
}

// WithReference returns a new fluid equal to f but with enthalpy and
// entropy on the reference state r; f itself is not changed. The offsets
// are computed exactly from the equation's own saturation (SaturationAtT
// or SaturationAtP of the saturated liquid that defines r), so that the
// new fluid reproduces the defining values there to rounding:
//
//	RefIIR:     h = 200 kJ/kg, s = 1 kJ/(kg·K), saturated liquid at 273.15 K
//	RefASHRAE:  h = 0, s = 0, saturated liquid at 233.15 K (−40 °C)
//	RefNBP:     h = 0, s = 0, saturated liquid at 101.325 kPa
//	RefDefault: the published equation's own reference state (offsets 0)
//
// The offsets Δh and Δs are added to u and h, s, and Δh − TΔs to g and
// the Helmholtz energy, by Props and every property built on it; solid
// models add the same (ReferenceOffsets). Pressures, heat capacities and
// every other property are unchanged.
//
// Special cases are:
//
//	r not a RefState value: error wrapping ErrInvalidInput
//	the defining saturated liquid does not exist for f (its temperature
//	  lies below the triple point or above the critical temperature, or
//	  its pressure below the triple-point or above the critical pressure;
//	  e.g. RefNBP for CO2, RefIIR and RefASHRAE for water): ErrUndefined
//	the saturation solver fails: its error (ErrNoConvergence)
func (f *Fluid) WithReference(r RefState) (*Fluid, error) {
	const op = "fluid.WithReference"
	in := Input{Name: "ref", Value: float64(r)}
	g := *f
	g.ref, g.hOff, g.sOff = r, 0, 0
	if r == RefDefault {
		return &g, nil
	}
	d, ok := r.definition()
	if !ok {
		return nil, NewError(op, ErrInvalidInput, "unknown reference state "+r.String()+
			"; known: default, IIR, ASHRAE, NBP", in)
	}
	tp, c := f.triple, f.crit
	undefined := func(why string) error {
		return NewError(op, ErrUndefined, r.String()+" reference state ("+d.what+") does not exist for "+
			f.name+": "+why, in)
	}
	var sat Saturation
	var err error
	// g has zero offsets: its saturation is the equation's own.
	switch {
	case d.T > 0 && d.T < tp.T:
		return nil, undefined("below the triple-point temperature " + fmtG(tp.T) + " K")
	case d.T > c.T:
		return nil, undefined("above the critical temperature " + fmtG(c.T) + " K")
	case d.T > 0:
		sat, err = g.SaturationAtT(d.T)
	case d.P < tp.P:
		return nil, undefined("below the triple-point pressure " + fmtG(tp.P) + " Pa")
	case d.P > c.P:
		return nil, undefined("above the critical pressure " + fmtG(c.P) + " Pa")
	default:
		sat, err = g.SaturationAtP(d.P)
	}
	if err != nil {
		return nil, &Error{Op: op, Inputs: []Input{in}, Err: err,
			Range: "the saturation defining the " + r.String() + " reference state failed"}
	}
	g.hOff = d.H - sat.Liquid.H
	g.sOff = d.S - sat.Liquid.S
	return &g, nil
}
