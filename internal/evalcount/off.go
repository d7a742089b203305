//go:build !tripoint_evalcount

// Package evalcount counts evaluations of the residual Helmholtz energy,
// for tripoint's benchmarks and tests only.
//
// Two kinds are counted. A full evaluation (Add) gives αʳ and all its
// derivatives at one (δ, τ). An isotherm evaluation (AddIsotherm) gives
// αʳ and its first two δ-derivatives at one δ on an isotherm whose
// τ-dependent part was prepared once (helmholtz.Isotherm), as the density
// and saturation solvers use it; it costs about a third of a full one.
// Load counts both kinds, each as one evaluation of the equation;
// LoadIsotherm counts the isotherm evaluations among them, so that
// Load − LoadIsotherm are the full ones.
//
// In an ordinary build Add and AddIsotherm are empty functions the
// compiler removes and Load and LoadIsotherm return 0, so production code
// pays nothing. Built with
//
//	go test -tags tripoint_evalcount
//
// they increment process-wide atomic counters, which benchmarks read
// before and after a loop to report evaluations per call.
package evalcount

// Enabled reports whether this build counts evaluations.
const Enabled = false

// Add counts one full evaluation (nothing in this build).
func Add() {}

// AddIsotherm counts one isotherm evaluation (nothing in this build).
func AddIsotherm() {}

// Load returns the number of evaluations, full and isotherm, counted so
// far (0 in this build).
func Load() uint64 { return 0 }

// LoadIsotherm returns the number of isotherm evaluations counted so far
// (0 in this build).
func LoadIsotherm() uint64 { return 0 }
