package table

import (
	"errors"
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// FuzzTables runs PH, PT and DU of the tables of every fluid on arbitrary
// inputs. Property: no panic; an error is a *fluid.Error wrapping one of
// the sentinels; a state is finite (but for the documented infinities);
// where the tables answer, the state agrees with the equation's flash to
// the tables' stated accuracy (1e-6 in T, ρ, h, s; the phase but within
// 1e-7 of a boundary); where they do not, it is the equation's own,
// exactly.
func FuzzTables(f *testing.F) {
	seeds := []struct {
		fl, kind uint8
		a, b     float64
	}{
		{0, 0, 3e6, -150e3}, {0, 1, 1e5, 300}, {0, 2, 600, -250e3}, {0, 1, 7.4e6, 305},
		{1, 0, 1e5, 1e6}, {1, 1, 30e6, 700}, {1, 2, 10, 2e6}, {1, 2, 999.9, 5e4},
		{2, 0, 1e6, 250e3}, {2, 1, 1e6, 300}, {2, 2, 1200, 250e3},
		{0, 0, math.NaN(), 0}, {1, 1, -1, 300}, {2, 2, math.Inf(1), 1}, {0, 1, 1e3, 100},
	}
	for _, s := range seeds {
		f.Add(s.fl, s.kind, s.a, s.b)
	}
	f.Fuzz(func(t *testing.T, fl, kind uint8, a, b float64) {
		name := fluidNames[int(fl)%len(fluidNames)]
		fn := flashNames[int(kind)%len(flashNames)]
		tb := tableOf(t, name)
		st, err := tableFlash(tb, fn, a, b)
		var got flash.State
		covered := fromTables(tb, fn, a, b, &got)
		eq, eqErr := equationFlash(tb.Fluid(), fn, a, b)
		if !covered {
			if (err == nil) != (eqErr == nil) || err != nil && err.Error() != eqErr.Error() || err == nil && st != eq {
				t.Fatalf("%s %s(%v, %v) left to the equation: %+v, %v; the equation's %+v, %v", name, fn, a, b, st, err, eq, eqErr)
			}
		}
		if err != nil {
			var fe *fluid.Error
			if !errors.As(err, &fe) || !isSentinel(err) {
				t.Fatalf("%s %s(%v, %v): error %v is not a *fluid.Error wrapping a sentinel", name, fn, a, b, err)
			}
			return
		}
		if !covered {
			return
		}
		if st != got {
			t.Fatalf("%s %s(%v, %v): %+v, from the tables %+v", name, fn, a, b, st, got)
		}
		for _, v := range []float64{st.T, st.P, st.Rho, st.H, st.S, st.U, st.Quality, st.Solid, st.Cv, st.W} {
			if !finite(v) {
				t.Fatalf("%s %s(%v, %v): a field not finite: %+v", name, fn, a, b, st)
			}
		}
		if !finite(st.Cp) && !(math.IsInf(st.Cp, 1) && st.Phase == flash.TwoPhase) {
			t.Fatalf("%s %s(%v, %v): cp %v", name, fn, a, b, st.Cp)
		}
		if eqErr != nil {
			t.Fatalf("%s %s(%v, %v): the tables answer %+v, the equation fails: %v", name, fn, a, b, st, eqErr)
		}
		if fn == "DU" && notEquilibrium(tb, &eq) {
			t.Logf("%s DU(%v, %v): the equation's flash returns %v at %v K, not an equilibrium state; the tables' %v at %v K",
				name, a, b, eq.Phase, eq.T, st.Phase, st.T)
			return
		}
		R, Tc := tb.Fluid().GasConstant(), tb.crit.T
		dev := max(math.Abs(st.T-eq.T)/eq.T, math.Abs(st.Rho-eq.Rho)/eq.Rho,
			math.Abs(st.H-eq.H)/max(math.Abs(eq.H), R*Tc), math.Abs(st.S-eq.S)/max(math.Abs(eq.S), R))
		if dev > 1e-6 || st.Phase != eq.Phase && !nearBoundary(tb, &eq) {
			t.Fatalf("%s %s(%v, %v): the tables' %+v, the equation's %+v (deviation %.2e)", name, fn, a, b, st, eq, dev)
		}
	})
}

func isSentinel(err error) bool {
	for _, s := range []error{fluid.ErrInvalidInput, fluid.ErrOutOfRange, fluid.ErrNoConvergence, fluid.ErrUnstable, fluid.ErrUndefined} {
		if errors.Is(err, s) {
			return true
		}
	}
	return false
}

// notEquilibrium reports whether st, a state from the equation's DU, is
// not the equilibrium state it should be: a single phase inside the
// saturation dome at its temperature (denser than the saturated vapour and
// lighter than the saturated liquid), or a liquid–vapour mixture whose
// phases are not the saturated phases at its temperature. These are
// defects of flash.DU near the critical point that the tables do not
// share (see the package documentation).
func notEquilibrium(t *Table, st *flash.State) bool {
	if st.T >= t.crit.T {
		return false
	}
	s, err := t.f.SaturationAtT(st.T)
	if err != nil {
		return false
	}
	switch st.Phase {
	case flash.Liquid, flash.Vapor:
		return st.Rho > s.Vapor.Rho*(1+1e-9) && st.Rho < s.Liquid.Rho*(1-1e-9)
	case flash.TwoPhase:
		return math.Abs(st.Phases[0].Rho/s.Liquid.Rho-1) > 1e-6 || math.Abs(st.Phases[1].Rho/s.Vapor.Rho-1) > 1e-6
	}
	return false
}
