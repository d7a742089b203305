package transport

import (
	"slices"
	"testing"
	"time"

	"github.com/tripoint-thermo/tripoint/fluid"
)

var sink float64

// benchStates are one state per region for each fluid: compressed
// liquid, vapour, supercritical and next to the critical point, where the
// enhancements matter most.
var benchStates = []struct {
	fluid, region string
	T, rho        float64
}{
	{"water", "liquid", 300, 998},
	{"water", "vapour", 500, 5},
	{"water", "supercritical", 800, 200},
	{"water", "near-critical", 647.35, 322},
	{"CO2", "liquid", 250, 1058},
	{"CO2", "vapour", 280, 60},
	{"CO2", "supercritical", 350, 300},
	{"CO2", "near-critical", 310, 400},
}

// BenchmarkTransport times each coefficient beside one fluid.Props
// evaluation at the same state, measured in the same run; the metric
// Props/op is the ratio of the two (the goal is at most 3).
func BenchmarkTransport(b *testing.B) {
	for _, s := range benchStates {
		f, err := fluid.Lookup(s.fluid)
		if err != nil {
			b.Fatal(err)
		}
		T, rho := s.T, s.rho
		var propsNs float64 // ns per Props call, set by the first sub-benchmark
		for _, c := range []struct {
			name string
			fn   func() (float64, error)
		}{
			{"Props", func() (float64, error) { p, err := f.Props(T, rho); return p.Cp, err }},
			{"Viscosity", func() (float64, error) { return Viscosity(f, T, rho) }},
			{"Conductivity", func() (float64, error) { return Conductivity(f, T, rho) }},
			{"At", func() (float64, error) { c, err := At(f, T, rho); return c.Conductivity, err }},
		} {
			if _, err := c.fn(); err != nil {
				continue // the fluid has no such correlation
			}
			b.Run(s.fluid+"/"+s.region+"/"+c.name, func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					v, _ := c.fn()
					sink += v
				}
				ns := float64(b.Elapsed().Nanoseconds()) / float64(b.N)
				if c.name == "Props" {
					propsNs = ns
				}
				b.ReportMetric(ns/propsNs, "Props/op")
			})
		}
	}
}

func BenchmarkSurfaceTension(b *testing.B) {
	f, _ := fluid.Lookup("water")
	b.ReportAllocs()
	for b.Loop() {
		s, _ := SurfaceTension(f, 350)
		sink += s
	}
}

// BenchmarkRatio measures the cost of each coefficient in Props
// evaluations at the same state by interleaved trials (Props, then the
// coefficient, 31 times, 200 calls each), which cancels the drift of a
// loaded machine, and reports the median ratio as Props/op; ns/op is that
// of the whole measurement and means nothing.
func BenchmarkRatio(b *testing.B) {
	for _, s := range benchStates {
		f, err := fluid.Lookup(s.fluid)
		if err != nil {
			b.Fatal(err)
		}
		T, rho := s.T, s.rho
		props := func() { p, _ := f.Props(T, rho); sink += p.Cp }
		for _, c := range []struct {
			name string
			fn   func() (float64, error)
		}{
			{"Viscosity", func() (float64, error) { return Viscosity(f, T, rho) }},
			{"Conductivity", func() (float64, error) { return Conductivity(f, T, rho) }},
			{"At", func() (float64, error) { c, err := At(f, T, rho); return c.Conductivity, err }},
		} {
			if _, err := c.fn(); err != nil {
				continue
			}
			b.Run(s.fluid+"/"+s.region+"/"+c.name, func(b *testing.B) {
				var med float64
				for b.Loop() {
					med = medianRatio(props, func() { v, _ := c.fn(); sink += v })
				}
				b.ReportMetric(med, "Props/op")
			})
		}
	}
}

func medianRatio(ref, fn func()) float64 {
	const trials, calls = 31, 200
	var r [trials]float64
	for k := range r {
		t0 := time.Now()
		for range calls {
			ref()
		}
		t1 := time.Now()
		for range calls {
			fn()
		}
		r[k] = float64(time.Since(t1)) / float64(t1.Sub(t0))
	}
	slices.Sort(r[:])
	return r[trials/2]
}
