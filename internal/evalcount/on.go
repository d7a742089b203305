//go:build tripoint_evalcount

package evalcount

import "sync/atomic"

// Enabled reports whether this build counts evaluations.
const Enabled = true

// n is the counter; it exists only in builds with the tripoint_evalcount
// tag, which tests and benchmarks use.
var n atomic.Uint64

// Add counts one evaluation.
func Add() { n.Add(1) }

// Load returns the number of evaluations counted so far.
func Load() uint64 { return n.Load() }
