package table

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"sync"
	"testing"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// TestAllocs checks that the flashes of the tables allocate nothing, in a
// single phase and in the two-phase region.
func TestAllocs(t *testing.T) {
	tb := tableOf(t, "CO2")
	mix, err := flash.PQ(tb.Fluid(), 3e6, 0.3)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		fl   string
		a, b float64
	}{
		{"PH", 3e6, -150e3}, {"PH", 3e6, mix.H}, {"PT", 10e6, 330}, {"DU", 50, 200e3}, {"DU", mix.Rho, mix.U},
	} {
		var st flash.State
		if !fromTables(tb, c.fl, c.a, c.b, &st) {
			t.Fatalf("%s(%v, %v) not from the tables", c.fl, c.a, c.b)
		}
		if n := testing.AllocsPerRun(100, func() { st, _ = tableFlash(tb, c.fl, c.a, c.b) }); n != 0 {
			t.Errorf("%s(%v, %v): %v allocations", c.fl, c.a, c.b, n)
		}
	}
}

// TestKernels checks the vector kernel of eval against the pure-Go one at
// random points of every patch of CO2's tables (where the processor has
// the vector instructions): the same sums, rounded differently.
func TestKernels(t *testing.T) {
	t.Parallel()
	if !vector {
		t.Skip("no vector kernel on this processor")
	}
	tb := tableOf(t, "CO2")
	rng := rand.New(rand.NewPCG(3, 4))
	for _, ts := range []*tables{&tb.ph, &tb.pt, &tb.du} {
		for _, s := range ts.slabs {
			for _, bd := range s.v.bands {
				p := bd.patch
				if p == nil {
					continue
				}
				for k := 0; k < 200; k++ {
					i := rng.IntN(len(s.x.x) - 1)
					tx, w := rng.Float64(), s.x.x[i+1]-s.x.x[i]
					wx := basis(tx, w)
					eta := rng.Float64()
					var v, g [maxProps]float64
					p.eval(i, &wx, eta, &v)
					p.evalGo(i, &wx, eta, &g)
					for m := range v {
						if math.Abs(v[m]-g[m]) > 1e-13*max(math.Abs(g[m]), 1) {
							t.Fatalf("property %d: vector %v, Go %v", m, v[m], g[m])
						}
					}
				}
			}
		}
	}
}

// TestNewErrors checks the errors of New: typed, wrapping the sentinel,
// naming the range, in ASCII.
func TestNewErrors(t *testing.T) {
	t.Parallel()
	co2, _ := fluid.Lookup("CO2")
	r134a, _ := fluid.Lookup("R134a")
	for _, c := range []struct {
		f    *fluid.Fluid
		r    Range
		want error
	}{
		{nil, Range{}, fluid.ErrInvalidInput},
		{co2, Range{PMin: math.NaN()}, fluid.ErrInvalidInput},
		{co2, Range{TMax: math.Inf(1)}, fluid.ErrInvalidInput},
		{co2, Range{PMin: -1}, fluid.ErrInvalidInput},
		{co2, Range{PMin: 2e6, PMax: 1e6}, fluid.ErrInvalidInput},
		{co2, Range{PMax: 5e6}, fluid.ErrOutOfRange},  // below the critical neighbourhood
		{co2, Range{TMax: 310}, fluid.ErrOutOfRange},  // likewise
		{co2, Range{TMax: 3000}, fluid.ErrOutOfRange}, // beyond the equation's accepted range
		{co2, Range{TMin: 100}, fluid.ErrOutOfRange},  // below the vapour floor
		{r134a, Range{TMin: 150}, fluid.ErrOutOfRange},
	} {
		tb, err := New(c.f, c.r)
		if tb != nil || !errors.Is(err, c.want) {
			t.Errorf("New(%v, %+v) = %v, %v; want an error wrapping %v", c.f, c.r, tb, err, c.want)
			continue
		}
		var fe *fluid.Error
		if !errors.As(err, &fe) || fe.Op != "table.New" {
			t.Errorf("New(%+v): %T %v is not a *fluid.Error of table.New", c.r, err, err)
		}
		for _, r := range err.Error() {
			if r > 126 {
				t.Errorf("New(%+v): message not ASCII: %q", c.r, err)
				break
			}
		}
	}
}

// TestCustomRange builds tables over a range of our own (a CO2 plant's:
// 0.5 to 15 MPa, from the solid curves to 450 K) and checks that they
// answer inside it, to the stated accuracy, and leave the rest to the
// equation, exactly.
func TestCustomRange(t *testing.T) {
	t.Parallel()
	f, _ := fluid.Lookup("CO2")
	tb, err := New(f, Range{PMin: 0.5e6, PMax: 15e6, TMax: 450})
	if err != nil {
		t.Fatal(err)
	}
	if r := tb.Range(); r.PMin != 0.5e6 || r.PMax != 15e6 || r.TMax != 450 || r.TMin != f.Limits().TFloor {
		t.Errorf("range %+v", r)
	}
	for _, c := range []struct {
		p, T   float64
		inside bool
	}{
		{3e6, 300, true}, {12e6, 400, true}, {0.6e6, 240, true},
		{0.4e6, 300, false}, {16e6, 300, false}, {3e6, 460, false},
	} {
		ref, err := flash.PT(f, c.p, c.T)
		if err != nil {
			t.Fatal(err)
		}
		if got := tb.CoversPT(c.p, c.T); got != c.inside {
			t.Errorf("CoversPT(%v, %v) = %v", c.p, c.T, got)
		}
		st, err := tb.PT(c.p, c.T)
		if err != nil {
			t.Fatal(err)
		}
		if !c.inside && st != ref {
			t.Errorf("PT(%v, %v) = %+v outside the range, the equation's %+v", c.p, c.T, st, ref)
		}
		if math.Abs(st.Rho/ref.Rho-1) > 1e-6 || math.Abs(st.H-ref.H) > 1e-6*max(math.Abs(ref.H), f.GasConstant()*f.Critical().T) {
			t.Errorf("PT(%v, %v): rho %v, h %v; the equation's %v, %v", c.p, c.T, st.Rho, st.H, ref.Rho, ref.H)
		}
	}
}

// TestLeftToTheEquation checks the states the tables leave to the
// equation's flash: the solid regions, the critical neighbourhood, the
// triple line, bad inputs — the equation's result and error, exactly.
func TestLeftToTheEquation(t *testing.T) {
	t.Parallel()
	tb := tableOf(t, "CO2")
	f := tb.Fluid()
	c := f.Critical()
	for _, in := range []struct {
		fl   string
		a, b float64
	}{
		{"PH", 101325, -250e3},          // dry ice and vapour
		{"PT", 20e6, 220},               // dry ice
		{"PT", 1.01 * c.P, 1.001 * c.T}, // the critical neighbourhood
		{"DU", c.Rho, -200e3},           // likewise
		{"PH", tb.ptr, -200e3},          // the triple line
		{"PH", math.NaN(), 0}, {"PT", -1, 300}, {"DU", 0, 1}, {"PH", 1e12, 0},
	} {
		var st flash.State
		if fromTables(tb, in.fl, in.a, in.b, &st) {
			t.Errorf("%s(%v, %v) answered by the tables", in.fl, in.a, in.b)
		}
		got, err := tableFlash(tb, in.fl, in.a, in.b)
		want, werr := equationFlash(f, in.fl, in.a, in.b)
		if got != want || (err == nil) != (werr == nil) || err != nil && err.Error() != werr.Error() {
			t.Errorf("%s(%v, %v) = %+v, %v; the equation's %+v, %v", in.fl, in.a, in.b, got, err, want, werr)
		}
	}
}

// TestMixtures checks every field of liquid–vapour states from the tables
// against the equation's flash: quality, flags, cp, and each phase.
func TestMixtures(t *testing.T) {
	t.Parallel()
	for _, name := range fluidNames {
		tb := tableOf(t, name)
		f := tb.Fluid()
		rng := rand.New(rand.NewPCG(5, 6))
		for k := 0; k < 40; k++ {
			p1, _, _, _, _, _ := tb.CriticalNeighbourhood()
			p := math.Exp(math.Log(tb.ptr) + rng.Float64()*(math.Log(p1)-math.Log(tb.ptr)))
			ref, err := flash.PQ(f, p, rng.Float64())
			if err != nil {
				t.Fatal(err)
			}
			for _, fl := range []string{"PH", "DU"} {
				a, b, _ := inputs(fl, &ref)
				var st flash.State
				if !fromTables(tb, fl, a, b, &st) {
					t.Fatalf("%s %s(%v, %v): not from the tables", name, fl, a, b)
				}
				if st.Phase != flash.TwoPhase || st.N != 2 || st.Flags != ref.Flags || !math.IsInf(st.Cp, 1) ||
					math.Abs(st.Quality-ref.Quality) > 1e-6 {
					t.Errorf("%s %s(%v, %v): %+v, the equation's %+v", name, fl, a, b, st, ref)
				}
				for i := 0; i < 2; i++ {
					g, w := st.Phases[i], ref.Phases[i]
					if g.Phase != w.Phase || math.Abs(g.Fraction-w.Fraction) > 1e-6 || math.Abs(g.Rho/w.Rho-1) > 1e-6 ||
						math.Abs(g.H-w.H) > 1e-6*max(math.Abs(w.H), f.GasConstant()*tb.crit.T) ||
						math.Abs(g.Cp/w.Cp-1) > 1e-3 || math.Abs(g.W/w.W-1) > 1e-3 {
						t.Errorf("%s %s(%v, %v): phase %d %+v, the equation's %+v", name, fl, a, b, i, g, w)
					}
				}
				if math.Abs(st.Cv/ref.Cv-1) > 1e-6 || math.Abs(st.W/ref.W-1) > 1e-4 {
					t.Errorf("%s %s(%v, %v): cv %v, w %v; the equation's %v, %v", name, fl, a, b, st.Cv, st.W, ref.Cv, ref.W)
				}
			}
		}
	}
}

// TestConcurrent runs the flashes of one Table from many goroutines at
// once: the same states as one at a time.
func TestConcurrent(t *testing.T) {
	t.Parallel()
	tb := tableOf(t, "water")
	pts := validationGrid(t, tb, 60, 20)
	want := make([]flash.State, 0, 3*len(pts))
	for _, fl := range flashNames {
		for i := range pts {
			a, b, _ := inputs(fl, &pts[i].ref)
			st, _ := tableFlash(tb, fl, a, b)
			want = append(want, st)
		}
	}
	var wg sync.WaitGroup
	var mu sync.Mutex
	bad := 0
	for g := 0; g < 8; g++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			n := 0
			for _, fl := range flashNames {
				for i := range pts {
					a, b, _ := inputs(fl, &pts[i].ref)
					if st, _ := tableFlash(tb, fl, a, b); st != want[n] {
						mu.Lock()
						bad++
						mu.Unlock()
					}
					n++
				}
			}
		}()
	}
	wg.Wait()
	if bad > 0 {
		t.Errorf("%d states differ between goroutines", bad)
	}
}

// TestErrorsTyped checks that an error from the tables' flashes is the
// equation flash's: typed, naming the flash.
func TestErrorsTyped(t *testing.T) {
	t.Parallel()
	tb := tableOf(t, "R134a")
	_, err := tb.PT(1e5, 100) // below R-134a's triple point: no solid model
	if !errors.Is(err, fluid.ErrUndefined) || !strings.Contains(err.Error(), "flash.PT") {
		t.Errorf("PT below the triple point: %v", err)
	}
}
