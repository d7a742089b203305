// Package errcheck checks tripoint's errors against the contract of the
// design ("Errors and bad input"), for the error-catalogue tests of every
// package: an error is a *fluid.Error whose Op names the function, that
// wraps the right sentinel, whose message names every input with its
// value and unit and states the valid range or why no state exists, in
// printable ASCII; and no call panics.
package errcheck

import (
	"errors"
	"fmt"
	"math"
	"regexp"
	"strings"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// opPrefix matches the start of a message of an operation of tripoint
// with its inputs, e.g. "fluid.Props: T = ": twice in one message, an
// inner error's inputs are repeated.
var opPrefix = regexp.MustCompile(`\b(fluid|flash|sublimation|partial|transport)\.[A-Za-z.]+: [A-Za-z]+ = `)

// Case is one bad call.
type Case struct {
	Name   string        // what the case is, for the test's report
	Op     string        // the operation the error must name, e.g. "flash.PT"
	Want   error         // the sentinel it must wrap
	Inputs []fluid.Input // the inputs the error must carry (name, value, unit)
	// Mention, if not empty, must appear in the message (an input that
	// is not a number, such as a fluid name).
	Mention string
	Call    func() error
}

// In is shorthand for a fluid.Input.
func In(name string, v float64, unit string) fluid.Input {
	return fluid.Input{Name: name, Value: v, Unit: unit}
}

// Check runs c and returns what is wrong with its error ("" when nothing
// is).
func Check(c Case) (fault string) {
	var err error
	func() {
		defer func() {
			if r := recover(); r != nil {
				fault = fmt.Sprintf("panic: %v", r)
			}
		}()
		err = c.Call()
	}()
	if fault != "" {
		return fault
	}
	if err == nil {
		return "no error"
	}
	msg := err.Error()
	var fe *fluid.Error
	if !errors.As(err, &fe) {
		return fmt.Sprintf("error %q is a %T, not a *fluid.Error", msg, err)
	}
	var faults []string
	if fe.Op != c.Op {
		faults = append(faults, fmt.Sprintf("Op %q, want %q", fe.Op, c.Op))
	}
	if !errors.Is(err, c.Want) {
		faults = append(faults, fmt.Sprintf("does not wrap %q", c.Want))
	}
	for _, in := range c.Inputs {
		if !carries(fe.Inputs, in) {
			faults = append(faults, fmt.Sprintf("does not carry the input %s = %v %s (carries %v)", in.Name, in.Value, in.Unit, fe.Inputs))
		}
		if !strings.Contains(msg, in.Name+" = ") {
			faults = append(faults, "the message does not name "+in.Name)
		}
	}
	if len(fe.Inputs) > len(c.Inputs) && len(c.Inputs) > 0 {
		faults = append(faults, fmt.Sprintf("carries inputs the call did not take: %v", fe.Inputs))
	}
	if c.Mention != "" && !strings.Contains(msg, c.Mention) {
		faults = append(faults, fmt.Sprintf("the message does not mention %q", c.Mention))
	}
	if strings.TrimSpace(fe.Range) == "" {
		faults = append(faults, "no valid range or reason (Range is empty)")
	}
	if errors.Is(err, fluid.ErrOutOfRange) && !strings.ContainsAny(fe.Range, "0123456789") &&
		!strings.Contains(fe.Range, "requested") {
		// A range names its bounds; a requested phase that is not the
		// stable one names the stable one instead.
		faults = append(faults, "an out-of-range error whose range names no bound")
	}
	if len(opPrefix.FindAllString(msg, -1)) > 1 {
		faults = append(faults, "a message inside another (the inner error's inputs repeated)")
	}
	for i := 0; i < len(msg); i++ {
		if msg[i] < 0x20 || msg[i] >= 0x7f {
			faults = append(faults, "not printable ASCII")
			break
		}
	}
	if len(faults) == 0 {
		return ""
	}
	return strings.Join(faults, "; ") + "\n\tmessage: " + msg
}

// carries reports whether ins holds in: the same name and unit and the
// same value (NaN matching NaN).
func carries(ins []fluid.Input, in fluid.Input) bool {
	for _, x := range ins {
		if x.Name == in.Name && x.Unit == in.Unit &&
			(x.Value == in.Value || math.IsNaN(x.Value) && math.IsNaN(in.Value)) {
			return true
		}
	}
	return false
}

// Known is a fault that a catalogue knows of and has reported: a case
// whose name contains Case may fail with a fault containing Fault.
type Known struct {
	Case, Fault string
	Why         string // the cause, and whom it was reported to
}

// Run checks every case; a fault is an error of the test unless it is
// listed in known. Listed faults that did not occur are logged, so that
// the list can shrink as they are fixed.
func Run(t testing.TB, cs []Case, known []Known) {
	t.Helper()
	seen := make([]bool, len(known))
	for _, c := range cs {
		fault := Check(c)
		if fault == "" {
			continue
		}
		listed := false
		for i, k := range known {
			if strings.Contains(c.Name, k.Case) && strings.Contains(fault, k.Fault) {
				seen[i], listed = true, true
			}
		}
		if !listed {
			t.Errorf("%s: %s", c.Name, fault)
		}
	}
	for i, k := range known {
		if !seen[i] {
			t.Logf("known fault %q (%s) did not occur: remove it from the list", k.Case, k.Why)
		}
	}
}
