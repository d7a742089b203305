package main

import (
	"fmt"
	"strings"
)

// quantity is a property a table can hold.
type quantity int

const (
	qT   quantity = iota // temperature
	qP                   // pressure
	qRho                 // density
	qV                   // specific volume
	qH                   // specific enthalpy
	qS                   // specific entropy
	qU                   // specific internal energy
	qG                   // specific Gibbs energy h − Ts
	qCv                  // isochoric heat capacity
	qCp                  // isobaric heat capacity
	qW                   // speed of sound
	qQ                   // vapour mass fraction (quality)
	qDh                  // enthalpy of vaporisation h″ − h′
	nQuantities
)

// unit is a unit of a quantity: value in SI = value·scale + offset.
type unit struct {
	name  string // in column names and flags, e.g. "kJ_kgK", "bar"
	text  string // ASCII, e.g. "kJ/(kg K)"
	md    string // for Markdown, e.g. "kJ/(kg·K)"
	scale float64
	off   float64
}

// toSI converts x to SI, rounded to 14 significant digits where the
// conversion does arithmetic: 0.01 °C is 273.16 K, the triple point of
// water, not 273.15999999999997 K below it.
func (u unit) toSI(x float64) float64 {
	if u.scale == 1 && u.off == 0 {
		return x
	}
	return round14(x*u.scale + u.off)
}

func (u unit) fromSI(x float64) float64 { return (x - u.off) / u.scale }

// quantityInfo describes a quantity: its column name, its symbol for
// Markdown, what it is, and its units. units[0] is the SI unit.
type quantityInfo struct {
	name  string // column name, e.g. "rho"
	md    string // Markdown symbol, e.g. "ρ"
	what  string
	units []unit
	pub   string // unit of a column without a unit suffix (see defaultUnitsText)
	eng   string // unit in engineering units
}

var (
	uK      = unit{"K", "K", "K", 1, 0}
	uC      = unit{"C", "C", "°C", 1, 273.15}
	uPa     = unit{"Pa", "Pa", "Pa", 1, 0}
	ukPa    = unit{"kPa", "kPa", "kPa", 1e3, 0}
	uMPa    = unit{"MPa", "MPa", "MPa", 1e6, 0}
	uBar    = unit{"bar", "bar", "bar", 1e5, 0}
	uKgM3   = unit{"kg_m3", "kg/m3", "kg/m³", 1, 0}
	uM3Kg   = unit{"m3_kg", "m3/kg", "m³/kg", 1, 0}
	uDm3Kg  = unit{"dm3_kg", "dm3/kg", "dm³/kg", 1e-3, 0}
	uJKg    = unit{"J_kg", "J/kg", "J/kg", 1, 0}
	ukJKg   = unit{"kJ_kg", "kJ/kg", "kJ/kg", 1e3, 0}
	uJKgK   = unit{"J_kgK", "J/(kg K)", "J/(kg·K)", 1, 0}
	ukJKgK  = unit{"kJ_kgK", "kJ/(kg K)", "kJ/(kg·K)", 1e3, 0}
	uMS     = unit{"m_s", "m/s", "m/s", 1, 0}
	uNone   = unit{"", "", "", 1, 0}
	energy  = []unit{uJKg, ukJKg}
	entropy = []unit{uJKgK, ukJKgK}
)

// quantities is indexed by quantity.
var quantities = [nQuantities]quantityInfo{
	qT:   {"T", "T", "temperature", []unit{uK, uC}, "K", "C"},
	qP:   {"p", "p", "pressure", []unit{uPa, ukPa, uMPa, uBar}, "MPa", "bar"},
	qRho: {"rho", "ρ", "density", []unit{uKgM3}, "kg_m3", "kg_m3"},
	qV:   {"v", "v", "specific volume", []unit{uM3Kg, uDm3Kg}, "m3_kg", "m3_kg"},
	qH:   {"h", "h", "specific enthalpy", energy, "kJ_kg", "kJ_kg"},
	qS:   {"s", "s", "specific entropy", entropy, "kJ_kgK", "kJ_kgK"},
	qU:   {"u", "u", "specific internal energy", energy, "kJ_kg", "kJ_kg"},
	qG:   {"g", "g", "specific Gibbs energy h - Ts", energy, "kJ_kg", "kJ_kg"},
	qCv:  {"cv", "cv", "isochoric heat capacity", entropy, "kJ_kgK", "kJ_kgK"},
	qCp:  {"cp", "cp", "isobaric heat capacity", entropy, "kJ_kgK", "kJ_kgK"},
	qW:   {"w", "w", "speed of sound", []unit{uMS}, "m_s", "m_s"},
	qQ:   {"q", "q", "vapour mass fraction (quality)", []unit{uNone}, "", ""},
	qDh:  {"dh", "Δh", "enthalpy of vaporisation h_vap - h_liq", energy, "kJ_kg", "kJ_kg"},
}

func (q quantity) info() *quantityInfo { return &quantities[q] }

// unitNamed returns the unit of q called name.
func (q quantity) unitNamed(name string) (unit, bool) {
	for _, u := range q.info().units {
		if u.name == name {
			return u, true
		}
	}
	return unit{}, false
}

// unitNames lists the unit names of q for messages.
func (q quantity) unitNames() string {
	var s []string
	for _, u := range q.info().units {
		if u.name != "" {
			s = append(s, u.name)
		}
	}
	return strings.Join(s, ", ")
}

// quantityNamed returns the quantity whose column name is name, matched
// without regard to case.
func quantityNamed(name string) (quantity, bool) {
	for q := range nQuantities {
		if strings.EqualFold(quantities[q].name, name) {
			return q, true
		}
	}
	return 0, false
}

// quantityList lists the column names of all quantities, for messages.
func quantityList() string {
	var s []string
	for q := range nQuantities {
		s = append(s, quantities[q].name)
	}
	return strings.Join(s, ", ")
}

// unitSystem is a choice of units for a printed table.
type unitSystem int

const (
	unitsSI  unitSystem = iota // K, Pa, kg/m³, J/kg, J/(kg·K), m/s
	unitsEng                   // °C, bar, kg/m³, kJ/kg, kJ/(kg·K), m/s
)

func parseUnitSystem(s string) (unitSystem, error) {
	switch strings.ToLower(s) {
	case "si":
		return unitsSI, nil
	case "eng":
		return unitsEng, nil
	}
	return 0, fmt.Errorf("-units %q: want si (K, Pa, J/kg, J/(kg K)) or eng (C, bar, kJ/kg, kJ/(kg K))", s)
}

// unitOf returns the unit of q in the system.
func (us unitSystem) unitOf(q quantity) unit {
	if us == unitsSI {
		return q.info().units[0]
	}
	u, _ := q.unitNamed(q.info().eng)
	return u
}

// phaseTag marks a saturated phase in a column name.
type phaseTag int

const (
	phaseNone phaseTag = iota
	phaseLiq           // "_liq": the saturated liquid
	phaseVap           // "_vap": the saturated vapour
)

var phaseSuffix = [...]string{"", "liq", "vap"}

// column is a property column of the check-table layout: a quantity, the
// saturated phase it belongs to (if any) and its unit.
type column struct {
	q     quantity
	phase phaseTag
	u     unit
}

// name returns the column's name in the layout: quantity[_phase][_unit],
// e.g. "rho_liq_kg_m3", "T_C", "q".
func (c column) name() string {
	s := c.q.info().name
	if c.phase != phaseNone {
		s += "_" + phaseSuffix[c.phase]
	}
	if c.u.name != "" {
		s += "_" + c.u.name
	}
	return s
}

// label returns the column's heading for Markdown, e.g. "ρ′ [kg/m³]".
func (c column) label() string {
	return c.heading(c.q.info().md, [...]string{"", "′", "″"}[c.phase], c.u.md)
}

// text returns the column's name for plain-text messages, e.g.
// "rho_liq [kg/m3]".
func (c column) text() string {
	return c.heading(c.q.info().name, [...]string{"", "_liq", "_vap"}[c.phase], c.u.text)
}

func (c column) heading(sym, phase, unit string) string {
	if unit != "" {
		return sym + phase + " [" + unit + "]"
	}
	return sym + phase
}

// parseColumn reads a column name of the check-table layout:
//
//	quantity[_liq|_vap][_unit]
//
// The quantity is matched without regard to case, the unit exactly. A
// column without a unit is in the units of the published tables (see
// defaultUnitsText).
func parseColumn(name string) (column, error) {
	qname, rest, _ := strings.Cut(name, "_")
	q, ok := quantityNamed(qname)
	if !ok {
		return column{}, fmt.Errorf("column %q: unknown quantity %q (known: %s; other columns: fluid, phase, note, source)",
			name, qname, quantityList())
	}
	c := column{q: q}
	first, after, _ := strings.Cut(rest, "_")
	switch first {
	case "liq":
		c.phase, rest = phaseLiq, after
	case "vap":
		c.phase, rest = phaseVap, after
	}
	if rest == "" {
		c.u, _ = q.unitNamed(q.info().pub)
		return c, nil
	}
	u, ok := q.unitNamed(rest)
	if !ok {
		if q == qQ {
			return column{}, fmt.Errorf("column %q: the quality q takes no unit", name)
		}
		return column{}, fmt.Errorf("column %q: unknown unit %q of %s (known: %s)", name, rest, q.info().name, q.unitNames())
	}
	c.u = u
	return c, nil
}

// defaultUnitsText states the units of columns without a unit suffix.
const defaultUnitsText = "T K, p MPa, rho kg/m3, v m3/kg, h u g dh kJ/kg, s cv cp kJ/(kg K), w m/s"
