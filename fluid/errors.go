package fluid

import (
	"errors"
	"strconv"
	"strings"
)

// Sentinel errors shared by every tripoint package. Errors returned by
// tripoint functions are *Error values that wrap one of these; test for them
// with errors.Is.
var (
	// ErrInvalidInput: an input is NaN, ±Inf, not positive where it must
	// be, or outside its mathematical domain (a quality outside [0, 1]).
	ErrInvalidInput = errors.New("invalid input")
	// ErrOutOfRange: the inputs are valid numbers but lie outside the
	// region the models cover.
	ErrOutOfRange = errors.New("out of range")
	// ErrNoConvergence: an iterative solver failed to converge.
	ErrNoConvergence = errors.New("no convergence")
	// ErrUnstable: the state is mechanically unstable, (∂p/∂ρ)_T ≤ 0.
	ErrUnstable = errors.New("mechanically unstable")
	// ErrUndefined: the quantity or reference state does not exist for
	// that fluid or region.
	ErrUndefined = errors.New("undefined")
)

// Input is one named input of an operation, with its SI unit.
type Input struct {
	Name  string  // e.g. "T"
	Value float64 // in SI units
	Unit  string  // e.g. "K"
}

// Error is the error type of every tripoint operation. Its message names
// the operation, the inputs with their values, what went wrong and, where
// one applies, the valid range, in ASCII.
type Error struct {
	Op     string  // the operation, e.g. "fluid.Props" or "flash.PH"
	Inputs []Input // the inputs of the call
	Err    error   // a sentinel above, possibly wrapped
	Range  string  // the valid range or a further explanation; may be empty
}

// Error implements the error interface.
func (e *Error) Error() string {
	var b strings.Builder
	b.WriteString(e.Op)
	for i, in := range e.Inputs {
		if i == 0 {
			b.WriteString(": ")
		} else {
			b.WriteString(", ")
		}
		b.WriteString(in.Name)
		b.WriteString(" = ")
		b.WriteString(strconv.FormatFloat(in.Value, 'g', 10, 64))
		if in.Unit != "" {
			b.WriteByte(' ')
			b.WriteString(in.Unit)
		}
	}
	b.WriteString(": ")
	if e.Err != nil {
		b.WriteString(e.Err.Error())
	} else {
		b.WriteString("error")
	}
	if e.Range != "" {
		b.WriteString(" (")
		b.WriteString(e.Range)
		b.WriteByte(')')
	}
	return b.String()
}

// Unwrap returns the underlying error, so that errors.Is matches the
// sentinels.
func (e *Error) Unwrap() error { return e.Err }

// NewError returns an *Error for operation op with the given cause, range
// text and inputs. It is for tripoint's own packages and for callers that
// build on them.
func NewError(op string, err error, rng string, inputs ...Input) *Error {
	return &Error{Op: op, Inputs: inputs, Err: err, Range: rng}
}

// finite reports whether x is neither NaN nor ±Inf.
func finite(x float64) bool { return x-x == 0 }
