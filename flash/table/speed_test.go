package table

import (
	"flag"
	"fmt"
	"math"
	"slices"
	"testing"
	"time"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// Benchmarks: the tables against the equation's flashes, per fluid and
// flash, cycling over the same states of the validation grid:
//
//	go test ./flash/table -run '^$' -bench . -benchmem
//
// and the ratio of the medians per state, measured in one run:
//
//	go test ./flash/table -run TestSpeedReport -args -table.report

var report = flag.Bool("table.report", false, "print the speed report (TestSpeedReport)")

// benchStates returns the states of the validation grid for the speed
// measurements (fewer than the validation's).
func benchStates(tb testing.TB, t *Table) []vpoint {
	return validationGrid(tb, t, 400, 100)
}

var benchSink float64

func BenchmarkTable(b *testing.B) {
	benchFlashes(b, func(t *Table, fl string, a, b float64) { tableLoop(t, fl, a, b, 1) })
}

func BenchmarkEquation(b *testing.B) {
	benchFlashes(b, func(t *Table, fl string, a, b float64) { equationLoop(t.Fluid(), fl, a, b, 1) })
}

// benchFlashes runs call per fluid and flash, cycling over the states of
// the validation grid.
func benchFlashes(b *testing.B, call func(t *Table, fl string, a, b float64)) {
	for _, name := range fluidNames {
		t := tableOf(b, name)
		pts := benchStates(b, t)
		for _, fl := range flashNames {
			in := benchInputs(fl, pts)
			b.Run(name+"/"+fl, func(b *testing.B) {
				b.ReportAllocs()
				for i := 0; i < b.N; i++ {
					x := &in[i%len(in)]
					call(t, fl, x[0], x[1])
				}
			})
		}
	}
}

// TestSpeedReport prints, with -args -table.report, for every fluid and
// flash the median time per call of the tables and of the equation's
// flash over the states of the validation grid, and their ratio, measured
// in one run (each state: the best of 5 rounds of calls, the least
// disturbed by the rest of the machine; the calls are direct, in a loop).
// It is a measurement, not a check: timings on a shared machine do not
// make assertions.
func TestSpeedReport(t *testing.T) {
	if !*report {
		t.Skip("run with -args -table.report")
	}
	for _, name := range fluidNames {
		tb := tableOf(t, name)
		pts := benchStates(t, tb)
		for _, fl := range flashNames {
			var tab, eq []float64
			left := 0
			for _, x := range benchInputs(fl, pts) {
				var st flash.State
				if !fromTables(tb, fl, x[0], x[1], &st) {
					left++
				}
				tab = append(tab, timeCalls(200, func(n int) { tableLoop(tb, fl, x[0], x[1], n) }))
				eq = append(eq, timeCalls(4, func(n int) { equationLoop(tb.Fluid(), fl, x[0], x[1], n) }))
			}
			slices.Sort(tab)
			slices.Sort(eq)
			mt, me := tab[len(tab)/2], eq[len(eq)/2]
			fmt.Printf("%-6s %s: tables median %6.1f ns (worst %8.0f), equation median %8.0f ns: %5.1f times faster (%d of %d states left to the equation)\n",
				name, fl, mt, tab[len(tab)-1], me, me/mt, left, len(tab))
		}
	}
}

// timeCalls returns the time per call of loop(n), the best of 5 rounds.
func timeCalls(n int, loop func(n int)) float64 {
	best := math.Inf(1)
	for r := 0; r < 5; r++ {
		t0 := time.Now()
		loop(n)
		best = min(best, float64(time.Since(t0).Nanoseconds())/float64(n))
	}
	return best
}

// tableLoop and equationLoop call flash fl of the tables or the equation
// n times with the same inputs, directly.
func tableLoop(t *Table, fl string, a, b float64, n int) {
	switch fl {
	case "PH":
		for i := 0; i < n; i++ {
			st, _ := t.PH(a, b)
			benchSink += st.T
		}
	case "PT":
		for i := 0; i < n; i++ {
			st, _ := t.PT(a, b)
			benchSink += st.T
		}
	default:
		for i := 0; i < n; i++ {
			st, _ := t.DU(a, b)
			benchSink += st.T
		}
	}
}

func equationLoop(f *fluid.Fluid, fl string, a, b float64, n int) {
	switch fl {
	case "PH":
		for i := 0; i < n; i++ {
			st, _ := flash.PH(f, a, b)
			benchSink += st.T
		}
	case "PT":
		for i := 0; i < n; i++ {
			st, _ := flash.PT(f, a, b)
			benchSink += st.T
		}
	default:
		for i := 0; i < n; i++ {
			st, _ := flash.DU(f, a, b)
			benchSink += st.T
		}
	}
}

// BenchmarkBuild times New with the default range of each fluid (the
// goal: 1 s).
func BenchmarkBuild(b *testing.B) {
	for _, name := range fluidNames {
		f, _ := fluid.Lookup(name)
		b.Run(name, func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if _, err := New(f, Range{}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// benchInputs returns the inputs of flash fl at the states.
func benchInputs(fl string, pts []vpoint) [][2]float64 {
	var in [][2]float64
	for i := range pts {
		if a, b, ok := inputs(fl, &pts[i].ref); ok {
			in = append(in, [2]float64{a, b})
		}
	}
	return in
}
