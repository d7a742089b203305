package fluid

import "testing"

// co2BenchSink keeps benchmark results alive.
var co2BenchSink Props

// BenchmarkPropsCO2 times one Props evaluation of carbon dioxide per region,
// beside water's in the same regions, so that one run compares them.
func BenchmarkPropsCO2(b *testing.B) {
	regions := []struct {
		fluid  string
		region string
		T, rho float64
	}{
		{"CO2", "vapour", 250, 20},
		{"CO2", "liquid", 250, 1050},
		{"CO2", "supercritical", 350, 300},
		{"CO2", "near-critical", 304.2, 500},
		{"CO2", "dilute-below-triple", 180, 0.1},
		{"water", "vapour", 400, 1},
		{"water", "liquid", 300, 996.6},
		{"water", "supercritical", 900, 241},
		{"water", "near-critical", 647.2, 330},
	}
	for _, r := range regions {
		f, err := Lookup(r.fluid)
		if err != nil {
			b.Fatal(err)
		}
		b.Run(r.fluid+"/"+r.region, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				co2BenchSink, err = f.Props(r.T, r.rho)
			}
			if err != nil {
				b.Fatal(err)
			}
		})
	}
}
