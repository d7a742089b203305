// Package table answers the PH, PT and DU flashes of a fluid from spline
// tables built once from its equation of state, in the spirit of the IAPWS
// Guideline on the Spline-Based Table Look-up Method (SBTL): without an
// iteration of the equation and without an evaluation of it, every field
// of the returned flash.State comes from the tables.
package table
