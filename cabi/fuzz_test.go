package main

import (
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// FuzzC calls the C entry points with arbitrary fluids, reference states,
// input pairs, inputs and property codes. Property: nothing panics (no
// TP_INTERNAL), every message is ASCII, a successful flash is finite and
// reproduces its inputs, and tp_prop agrees with tp_flash.
func FuzzC(f *testing.F) {
	seeds := []struct {
		fl, ref, pair, prop uint8
		a, b                float64
	}{
		{0, 0, 1, 4, 1e5, 300}, {1, 0, 2, 1, 3e6, -150e3}, {2, 0, 5, 3, 273.15, 0.5},
		{1, 1, 6, 4, 600, -250e3}, {2, 3, 1, 9, 101325, 350}, {0, 2, 4, 10, 2e6, 0.2},
		{1, 0, 1, 4, math.NaN(), 300}, {0, 0, 9, 4, 1e5, 300}, {0, 0, 1, 99, 1e5, 300},
		{1, 0, 7, 1, -300e3, -1500}, {2, 0, 8, 2, 10, 300},
	}
	for _, s := range seeds {
		f.Add(s.fl, s.ref, s.pair, s.prop, s.a, s.b)
	}
	names := append(fluid.Names(), "no-such-fluid")
	f.Fuzz(func(t *testing.T, fl, ref, pair, prop uint8, a, b float64) {
		name := names[int(fl)%len(names)]
		r := callC(name, int32(ref%5), int32(pair%10), a, b, int32(prop%16))
		if r.status == statusInternal || r.propStatus == statusInternal {
			t.Fatalf("%s ref %d pair %d (%g, %g): internal error: %s", name, ref%5, pair%10, a, b, r.msg)
		}
		for i := 0; i < len(r.msg); i++ {
			if r.msg[i] >= 0x7f || r.msg[i] < 0x20 {
				t.Fatalf("non-ASCII message %q", r.msg)
			}
		}
		if r.handle <= 0 || r.status != statusOK {
			return
		}
		st := r.st
		for _, v := range []float64{st.T, st.P, st.Rho, st.H, st.S, st.U, st.Quality, st.Solid} {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				t.Fatalf("%s pair %d (%g, %g): non-finite state %+v", name, pair%10, a, b, st)
			}
		}
		// The backward residuals of DESIGN.md.
		fd, _ := fluid.Lookup(name)
		R, Tc := fd.GasConstant(), fd.Critical().T
		dp := func(p float64) bool { return math.Abs(st.P-p) <= 1e-10*p+1e-12*st.Rho*R*st.T }
		de := func(got, want float64) bool { return math.Abs(got-want) <= 1e-10*math.Max(math.Abs(want), R*Tc) }
		ds := func(s float64) bool { return math.Abs(st.S-s) <= 1e-10*math.Max(math.Abs(s), R) }
		dr := func(rho float64) bool { return math.Abs(st.Rho-rho) <= 1e-10*rho }
		dT := func(T float64) bool { return math.Abs(st.T-T) <= 1e-12*T }
		dq := func(q float64) bool { return math.Abs(st.Quality-q) <= 1e-12 }
		var ok bool
		switch int32(pair % 10) {
		case pairPT:
			ok = dp(a) && dT(b)
		case pairPH:
			ok = dp(a) && de(st.H, b)
		case pairPS:
			ok = dp(a) && ds(b)
		case pairPQ:
			ok = dp(a) && (dq(b) || st.Phase >= 5) // below pt, q is the vapour fraction of solid–vapour
		case pairTQ:
			ok = dT(a) && (dq(b) || st.Phase >= 5)
		case pairDU:
			ok = dr(a) && de(st.U, b)
		case pairHS:
			ok = de(st.H, a) && ds(b)
		case pairDT:
			ok = dr(a) && dT(b)
		}
		if !ok {
			t.Fatalf("%s pair %d: inputs (%.17g, %.17g) not reproduced by %+v", name, pair%10, a, b, st)
		}
		if r.propStatus == statusOK && math.IsNaN(r.prop) {
			t.Fatalf("tp_prop returned NaN with status OK")
		}
	})
}
