//go:build tripoint_evalcount

package evalcount

import "sync/atomic"

// Enabled reports whether this build counts evaluations.
const Enabled = true

// all counts every evaluation, iso the isotherm ones; they exist only in
// builds with the tripoint_evalcount tag, which tests and benchmarks use.
var all, iso atomic.Uint64

// Add counts one full evaluation.
func Add() { all.Add(1) }

// AddIsotherm counts one isotherm evaluation.
func AddIsotherm() {
	all.Add(1)
	iso.Add(1)
}

// Load returns the number of evaluations, full and isotherm, counted so
// far.
func Load() uint64 { return all.Load() }

// LoadIsotherm returns the number of isotherm evaluations counted so far.
func LoadIsotherm() uint64 { return iso.Load() }
