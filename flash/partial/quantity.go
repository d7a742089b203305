package partial

import "strconv"

// Quantity identifies a state function of a pure substance. The values
// are stable (the C ABI passes them as integer codes); 0 is no quantity.
type Quantity int32

const (
	T   Quantity = 1 // temperature, K
	P   Quantity = 2 // pressure, Pa
	Rho Quantity = 3 // density, kg/m³
	V   Quantity = 4 // specific volume 1/ρ, m³/kg
	U   Quantity = 5 // specific internal energy, J/kg
	H   Quantity = 6 // specific enthalpy u + pv, J/kg
	S   Quantity = 7 // specific entropy, J/(kg·K)
	G   Quantity = 8 // specific Gibbs energy h − Ts, J/kg
	F   Quantity = 9 // specific Helmholtz energy u − Ts, J/kg
)

var quantityNames = [...]string{"", "T", "p", "rho", "v", "u", "h", "s", "g", "f"}

var quantityUnits = [...]string{"", "K", "Pa", "kg/m3", "m3/kg", "J/kg", "J/kg", "J/(kg K)", "J/kg", "J/kg"}

// Valid reports whether q is one of the quantities T … F.
func (q Quantity) Valid() bool { return q >= T && q <= F }

// String returns the usual symbol of q in ASCII ("T", "p", "rho", "v",
// "u", "h", "s", "g", "f"), or "Quantity(n)" for an invalid q.
func (q Quantity) String() string {
	if q.Valid() {
		return quantityNames[q]
	}
	return "Quantity(" + strconv.Itoa(int(q)) + ")"
}

// Unit returns the SI unit of q in ASCII, e.g. "J/(kg K)"; "" for an
// invalid q.
func (q Quantity) Unit() string {
	if q.Valid() {
		return quantityUnits[q]
	}
	return ""
}

// name returns "(da/db)_c".
func name(a, b, c Quantity) string {
	return "(d" + a.String() + "/d" + b.String() + ")_" + c.String()
}
