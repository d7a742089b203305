package kit

import (
	"fmt"
	"math"
	"strconv"
)

// Units converts SI values for display: temperature, pressure, specific
// enthalpy and entropy. Density is always shown in kg/m³.
type Units struct {
	Name                   string // "eng" or "si"
	TUnit, PUnit           string
	HUnit, SUnit           string
	tOff, pScale           float64
	hScale, sScale, tScale float64
}

var (
	// Engineering units: °C, bar, kJ/kg, kJ/(kg·K).
	Engineering = Units{Name: "eng", TUnit: "°C", PUnit: "bar", HUnit: "kJ/kg", SUnit: "kJ/(kg·K)",
		tOff: ZeroCelsius, tScale: 1, pScale: 1e5, hScale: 1e3, sScale: 1e3}
	// SI units with prefixes that keep the numbers readable: K, MPa,
	// kJ/kg, kJ/(kg·K).
	SI = Units{Name: "si", TUnit: "K", PUnit: "MPa", HUnit: "kJ/kg", SUnit: "kJ/(kg·K)",
		tOff: 0, tScale: 1, pScale: 1e6, hScale: 1e3, sScale: 1e3}
)

// UnitsNamed returns Engineering for "eng" and SI for "si".
func UnitsNamed(name string) (Units, error) {
	switch name {
	case "eng":
		return Engineering, nil
	case "si":
		return SI, nil
	}
	return Units{}, fmt.Errorf("units %q: want eng (°C, bar, kJ/kg) or si (K, MPa, kJ/kg)", name)
}

// T converts a temperature in K.
func (u Units) T(K float64) float64 { return K - u.tOff }

// P converts a pressure in Pa.
func (u Units) P(Pa float64) float64 { return Pa / u.pScale }

// H converts a specific enthalpy in J/kg.
func (u Units) H(Jkg float64) float64 { return Jkg / u.hScale }

// S converts a specific entropy in J/(kg·K).
func (u Units) S(JkgK float64) float64 { return JkgK / u.sScale }

// FormatT formats a temperature in K with its unit and three decimals
// at most, e.g. "-56.558 °C".
func (u Units) FormatT(K float64) string {
	return strconv.FormatFloat(math.Round(u.T(K)*1000)/1000, 'f', -1, 64) + " " + u.TUnit
}

// TK converts a displayed temperature back to K.
func (u Units) TK(v float64) float64 { return v + u.tOff }

// PPa converts a displayed pressure back to Pa.
func (u Units) PPa(v float64) float64 { return v * u.pScale }
