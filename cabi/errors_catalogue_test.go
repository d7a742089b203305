package main

import (
	"math"
	"strings"
	"testing"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// TestCMessages walks a catalogue of bad calls through the C entry points
// (tp_fluid, tp_flash, tp_prop, by callC) and checks that each gives the
// status of the Go error (statusOf), the Go error's own message (ASCII,
// naming the inputs, their values and units, and the range; truncated to
// the 255 characters of tp_error.message), the same status from tp_prop,
// and for the errors of the C layer itself (unknown fluid, reference
// state, input pair, property code) a message that names the bad value
// and what is valid.
func TestCMessages(t *testing.T) {
	t.Parallel()
	nan, inf := math.NaN(), math.Inf(1)
	type call struct {
		fluid      string
		ref, pair  int32
		a, b       float64
		prop       int32
		status     int32
		msgHas     []string // the message must contain each
		compareGo  bool     // the message must be the Go error's
		propStatus int32
	}
	flashCalls := []call{
		{"water", 0, pairPT, nan, 300, propRho, statusInvalidInput, []string{"flash.PT", "p = NaN Pa", "T = 300 K"}, true, statusInvalidInput},
		{"water", 0, pairPT, 1e5, -inf, propRho, statusInvalidInput, []string{"T = -Inf K"}, true, statusInvalidInput},
		{"water", 0, pairPH, 0, 1e5, propT, statusInvalidInput, []string{"p = 0 Pa", "h = 100000 J/kg", "positive"}, true, statusInvalidInput},
		{"water", 0, pairPS, 1e5, inf, propT, statusInvalidInput, []string{"s = +Inf J/(kg K)"}, true, statusInvalidInput},
		{"water", 0, pairTQ, 300, 1.5, propP, statusInvalidInput, []string{"q = 1.5", "0 <= q <= 1"}, true, statusInvalidInput},
		{"water", 0, pairTQ, 700, 0.5, propP, statusOutOfRange, []string{"T = 700 K", "647.096"}, true, statusOutOfRange},
		{"CO2", 0, pairPQ, 8e6, 0.5, propT, statusOutOfRange, []string{"p = 8000000 Pa"}, true, statusOutOfRange},
		{"CO2", 0, pairPT, 900e6, 200, propRho, statusOutOfRange, []string{"800 MPa"}, true, statusOutOfRange},
		{"water", 0, pairPT, 250e6, 250, propRho, statusOutOfRange, []string{"ice III"}, true, statusOutOfRange},
		{"R134a", 0, pairTQ, 150, 0.5, propP, statusUndefined, []string{"T = 150 K"}, true, statusUndefined},
		{"water", 0, pairDU, -1, 1e5, propT, statusInvalidInput, []string{"rho = -1 kg/m3", "u = 100000 J/kg"}, true, statusInvalidInput},
		{"water", 0, pairDT, 1e6, 300, propP, statusOutOfRange, []string{"rho = 1000000 kg/m3", "3000 kg/m3"}, true, statusOutOfRange},
		{"water", 0, pairHS, nan, nan, propT, statusInvalidInput, []string{"h = NaN J/kg", "s = NaN J/(kg K)"}, true, statusInvalidInput},
		// The C layer's own errors.
		{"no-such-fluid", 0, pairPT, 1e5, 300, propRho, statusUndefined, []string{`"no-such-fluid"`, "known: CO2, R134a, water"}, false, statusUndefined},
		{"CO2", 3, pairPT, 1e5, 300, propRho, statusUndefined, []string{"NBP", "CO2"}, false, statusUndefined},
		{"water", 4, pairPT, 1e5, 300, propRho, statusInvalidInput, []string{"reference state", "0..3", "got 4"}, false, statusInvalidInput},
		{"water", 0, 0, 1e5, 300, propRho, statusInvalidInput, []string{"input pair", "got 0"}, false, statusInvalidInput},
		{"water", 0, 99, 1e5, 300, propRho, statusInvalidInput, []string{"input pair", "got 99"}, false, statusInvalidInput},
		{"water", 0, pairPT, 1e5, 300, 0, statusOK, nil, false, statusInvalidInput},
		{"water", 0, pairPT, 1e5, 300, 99, statusOK, nil, false, statusInvalidInput},
	}
	for _, c := range flashCalls {
		r := callC(c.fluid, c.ref, c.pair, c.a, c.b, c.prop)
		// r.status is tp_fluid's where it failed (no handle), else tp_flash's.
		if r.status != c.status {
			t.Errorf("%+v: status %d, want %d (%s)", c, r.status, c.status, r.msg)
			continue
		}
		for i := 0; i < len(r.msg); i++ {
			if r.msg[i] < 0x20 || r.msg[i] >= 0x7f {
				t.Errorf("%+v: message not printable ASCII: %q", c, r.msg)
				break
			}
		}
		for _, want := range c.msgHas {
			if !strings.Contains(r.msg, want) {
				t.Errorf("%+v: message %q does not contain %q", c, r.msg, want)
			}
		}
		if c.status != statusOK && r.msg == "" {
			t.Errorf("%+v: empty message", c)
		}
		if c.compareGo {
			f, err := fluid.Lookup(c.fluid)
			if err != nil {
				t.Fatal(err)
			}
			_, gerr := run(f, int32ToC(int(c.pair)), c.a, c.b, flash.Options{})
			if gerr == nil {
				t.Errorf("%+v: no Go error", c)
				continue
			}
			want := gerr.Error()
			if len(want) > 255 {
				want = want[:255]
			}
			if r.msg != want {
				t.Errorf("%+v: C message %q, Go %q", c, r.msg, want)
			}
		}
		if r.handle > 0 && r.propStatus != c.propStatus {
			t.Errorf("%+v: tp_prop status %d, want %d", c, r.propStatus, c.propStatus)
		}
	}
}
