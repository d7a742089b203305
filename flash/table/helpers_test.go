package table

import (
	"math"
	"math/rand/v2"
	"sync"
	"testing"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// The tables of each fluid, built once per test binary.
var built sync.Map // name → *builtTable

type builtTable struct {
	once sync.Once
	t    *Table
	err  error
}

// tableOf returns the default tables of the named fluid.
func tableOf(tb testing.TB, name string) *Table {
	tb.Helper()
	v, _ := built.LoadOrStore(name, &builtTable{})
	b := v.(*builtTable)
	b.once.Do(func() {
		f, err := fluid.Lookup(name)
		if err != nil {
			b.err = err
			return
		}
		b.t, b.err = New(f, Range{})
	})
	if b.err != nil {
		tb.Fatal(b.err)
	}
	return b.t
}

var fluidNames = []string{"CO2", "water", "R134a"}

// vpoint is a point of the validation grid: an equilibrium state of the
// equation and its region.
type vpoint struct {
	region string
	ref    flash.State
}

// validationGrid returns n single-phase states at random (p, T) over the
// range of t (uniform in ln p and T, seeded: the same points every run,
// none of them a node but by a chance of nought) from flash.PT, and m
// liquid–vapour states at random (p, q) from the triple point to the
// critical pressure, from flash.PQ.
func validationGrid(tb testing.TB, t *Table, n, m int) []vpoint {
	tb.Helper()
	f := t.Fluid()
	r := t.Range()
	c := f.Critical()
	rng := rand.New(rand.NewPCG(8, 2))
	var pts []vpoint
	lp0, lp1 := math.Log(r.PMin), math.Log(r.PMax)
	for len(pts) < n {
		p := math.Exp(lp0 + rng.Float64()*(lp1-lp0))
		T := r.TMin + rng.Float64()*(r.TMax-r.TMin)
		st, err := flash.PT(f, p, T)
		if err != nil || st.Phase == flash.Solid {
			continue // the solid, and states the equation does not reach
		}
		pts = append(pts, vpoint{regionOf(st.Phase), st})
	}
	for k := 0; k < m; {
		p := math.Exp(math.Log(t.ptr) + rng.Float64()*(math.Log(c.P)-math.Log(t.ptr)))
		st, err := flash.PQ(f, p, rng.Float64())
		if err != nil {
			continue
		}
		pts = append(pts, vpoint{"two-phase", st})
		k++
	}
	return pts
}

func regionOf(ph flash.Phase) string {
	switch ph {
	case flash.Liquid:
		return "liquid"
	case flash.Vapor:
		return "vapour"
	case flash.Supercritical:
		return "supercritical"
	}
	return "two-phase"
}

// inputs returns the inputs of flash fl ("PH", "PT" or "DU") at st, and
// false where fl does not apply (PT of a mixture).
func inputs(fl string, st *flash.State) (a, b float64, ok bool) {
	switch fl {
	case "PH":
		return st.P, st.H, true
	case "PT":
		return st.P, st.T, st.Phase != flash.TwoPhase
	}
	return st.Rho, st.U, true
}

// fromTables runs flash fl of t on the tables alone.
func fromTables(t *Table, fl string, a, b float64, st *flash.State) bool {
	switch fl {
	case "PH":
		return t.fromPH(a, b, st)
	case "PT":
		return t.fromPT(a, b, st)
	}
	return t.fromDU(a, b, st)
}

// tableFlash and equationFlash run flash fl of t and of the equation.
func tableFlash(t *Table, fl string, a, b float64) (flash.State, error) {
	switch fl {
	case "PH":
		return t.PH(a, b)
	case "PT":
		return t.PT(a, b)
	}
	return t.DU(a, b)
}

func equationFlash(f *fluid.Fluid, fl string, a, b float64) (flash.State, error) {
	switch fl {
	case "PH":
		return flash.PH(f, a, b)
	case "PT":
		return flash.PT(f, a, b)
	}
	return flash.DU(f, a, b)
}

var flashNames = []string{"PH", "PT", "DU"}

// inNeighbourhood reports whether the equilibrium state st lies where
// flash fl is left to the equation: the critical neighbourhood (see
// Table.CriticalNeighbourhood), and for DU the isochores of water that
// cross the saturation dome twice.
func inNeighbourhood(t *Table, fl string, st *flash.State) bool {
	p1, p2, t1, t2, r1, r2 := t.CriticalNeighbourhood()
	if fl != "DU" {
		return st.P >= p1 && st.P <= p2 && st.T >= t1 && st.T <= t2
	}
	if st.Rho >= r1 && st.Rho <= r2 {
		if st.Phase == flash.TwoPhase {
			return st.T >= t1
		}
		return st.T <= t2
	}
	lo, hi := t.DoubleCrossing()
	return st.Rho >= lo && st.Rho <= hi
}

// nearBoundary reports whether st lies within a relative 1e-7 of a phase
// boundary (the critical temperature or pressure, the saturation curve),
// where the tables and the equation may place it on either side.
func nearBoundary(t *Table, st *flash.State) bool {
	c := t.crit
	if math.Abs(st.T/c.T-1) < 1e-7 || math.Abs(st.P/c.P-1) < 1e-7 {
		return true
	}
	if st.Phase == flash.TwoPhase {
		return st.Quality < 1e-7 || st.Quality > 1-1e-7
	}
	if st.T < c.T {
		if s, err := t.f.SaturationAtT(st.T); err == nil && math.Abs(st.P/s.P-1) < 1e-7 {
			return true
		}
	}
	return false
}
