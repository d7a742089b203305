package flash

import (
	"errors"
	"math"
	"sync"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// The fuzz targets run every flash on arbitrary inputs, for every fluid
// (chosen by the third argument): no panic; either a typed error, or a
// valid state (finite, with the documented infinities only) that
// reproduces its inputs to the backward-residual floors of DESIGN.md.
// Seed corpora are in testdata/fuzz/<target>.

var fuzzFluids = sync.OnceValue(func() []*fluid.Fluid {
	var fs []*fluid.Fluid
	for _, n := range fluid.Names() {
		f, _ := fluid.Lookup(n)
		fs = append(fs, f)
	}
	return fs
})

// allCases are the flashes of flashCases plus those with a quality.
var allCases = append([]flashCase{
	{"PT", "p", "T", PTWith}, {"TQ", "T", "q", TQWith}, {"PQ", "p", "q", PQWith},
}, flashCases...)

func fuzzFlash(f *testing.F, name string) {
	var fc flashCase
	for _, c := range allCases {
		if c.name == name {
			fc = c
		}
	}
	f.Fuzz(func(t *testing.T, a, b float64, k uint8) {
		fs := fuzzFluids()
		fl := fs[int(k)%len(fs)]
		st, err := fc.fn(fl, a, b, Options{})
		if err != nil {
			var fe *fluid.Error
			if !errors.As(err, &fe) {
				t.Fatalf("%s(%v, %v): untyped error %v", name, a, b, err)
			}
			return
		}
		if !fuzzCheck(t, fl, fc, a, b, &st, "") {
			return
		}
		// Warm-started from the state itself and from the state at
		// inputs moved by 0.3 %: the same state, never an error.
		guesses := []State{st}
		if g, err := fc.fn(fl, a*1.003, b*0.997, Options{}); err == nil {
			guesses = append(guesses, g)
		}
		for i := range guesses {
			g := &guesses[i]
			warm, err := fc.fn(fl, a, b, Options{Guess: g})
			if err != nil {
				t.Errorf("%s %s(%.17g, %.17g) warm-started from %v at T = %.17g, rho = %.17g: %v (cold: %v)",
					fl.Name(), name, a, b, g.Phase, g.T, g.Rho, err, st.Phase)
				continue
			}
			fuzzCheck(t, fl, fc, a, b, &warm, " warm-started")
		}
	})
}

// fuzzCheck checks that st, from flash fc at inputs (a, b), is valid and
// reproduces its inputs to the floors, and reports whether it is valid.
func fuzzCheck(t *testing.T, fl *fluid.Fluid, fc flashCase, a, b float64, st *State, how string) bool {
	t.Helper()
	if !checkState(t, fl, fc.name, st) {
		return false
	}
	for _, q := range []struct {
		name string
		v    float64
	}{{fc.a, a}, {fc.b, b}} {
		got, floor := backward(fl, st, q.name, q.v)
		if q.name == "q" && (st.Phase == Liquid || st.Phase == Vapor) {
			continue // q = 0 or 1, a saturated single phase
		}
		if math.Abs(got-q.v) > floor {
			t.Errorf("%s %s(%.17g, %.17g)%s: %s = %.17g (floor %.3g), %v", fl.Name(), fc.name, a, b, how, q.name, got, floor, st.Phase)
		}
	}
	return true
}
func FuzzPT(f *testing.F) { fuzzFlash(f, "PT") }
func FuzzTQ(f *testing.F) { fuzzFlash(f, "TQ") }
func FuzzPQ(f *testing.F) { fuzzFlash(f, "PQ") }
func FuzzPH(f *testing.F) { fuzzFlash(f, "PH") }
func FuzzPS(f *testing.F) { fuzzFlash(f, "PS") }
func FuzzDU(f *testing.F) { fuzzFlash(f, "DU") }
func FuzzHS(f *testing.F) { fuzzFlash(f, "HS") }
func FuzzDT(f *testing.F) { fuzzFlash(f, "DT") }
func FuzzTS(f *testing.F) { fuzzFlash(f, "TS") }
func FuzzPD(f *testing.F) { fuzzFlash(f, "PD") }
