// Package kit holds what tripoint's example programs share: command-line
// flags whose physical quantities carry their unit in the flag name
// (-tevap-C, -pgc-bar), a progress line for long runs, and the charts:
// their visual style, the lines of a fluid's property chart (saturation
// dome, isotherms, isobars, isentropes, isenthalps, quality lines,
// isochores, and the solid regions and triple line of a fluid with a
// solid model) and writing them as PNG and SVG.
//
// Everything is computed in SI units (K, Pa, J/kg, J/(kg·K), kg/m³); a
// Units value converts for display.
package kit
