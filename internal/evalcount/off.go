//go:build !tripoint_evalcount

// Package evalcount counts evaluations of the residual Helmholtz energy,
// for tripoint's benchmarks and tests only.
//
// In an ordinary build Add is an empty function the compiler removes and
// Load returns 0, so production code pays nothing. Built with
//
//	go test -tags tripoint_evalcount
//
// Add increments one process-wide atomic counter, which benchmarks read
// before and after a loop to report evaluations per call.
package evalcount

// Enabled reports whether this build counts evaluations.
const Enabled = false

// Add counts one evaluation (nothing in this build).
func Add() {}

// Load returns the number of evaluations counted so far (0 in this build).
func Load() uint64 { return 0 }
