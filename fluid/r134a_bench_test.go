package fluid

import "testing"

var r134aSink Props

// BenchmarkR134aProps times Props for R-134a in each region, cycling
// through a few states of that region.
func BenchmarkR134aProps(b *testing.B) {
	f, err := Lookup("R134a")
	if err != nil {
		b.Fatal(err)
	}
	regions := []struct {
		name   string
		states [][2]float64 // (T in K, ρ in kg/m³)
	}{
		{"liquid", [][2]float64{{180, 1570}, {250, 1372}, {300, 1201}, {340, 1021}}},
		{"vapour", [][2]float64{{200, 0.3}, {250, 5}, {300, 30}, {340, 100}}},
		{"supercritical", [][2]float64{{380, 600}, {400, 300}, {430, 1000}, {455, 100}}},
		{"critical", [][2]float64{{374.5, 508}, {374.3, 500}, {375, 520}, {376, 480}}},
		{"compressed", [][2]float64{{170, 1640}, {250, 1450}, {350, 1250}, {455, 1100}}},
	}
	for _, r := range regions {
		b.Run(r.name, func(b *testing.B) {
			for _, s := range r.states {
				if _, err := f.Props(s[0], s[1]); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportAllocs()
			i := 0
			for b.Loop() {
				s := r.states[i&3]
				r134aSink, _ = f.Props(s[0], s[1])
				i++
			}
		})
	}
}
