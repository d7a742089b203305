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
