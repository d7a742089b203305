package kit

import (
	"io"
	"math"
	"testing"
)

// FuzzFlags parses arbitrary values for a quantity flag: never a panic,
// and an accepted value is finite and inside its range.
func FuzzFlags(f *testing.F) {
	for _, s := range []string{"35", "-8", "1e308", "NaN", "-Inf", "0x1p4", " 3 ", "", "1e-400"} {
		f.Add("t-C", s)
		f.Add("p-bar", s)
	}
	f.Fuzz(func(t *testing.T, name, value string) {
		fs := NewFlags("x", "fuzz", io.Discard)
		T := fs.Temperature("t", "a temperature", -8).Within(1, 1e4)
		p := fs.Pressure("p", "a pressure", 0).Optional()
		if err := fs.Parse([]string{"-" + name, value}); err != nil {
			return
		}
		if v := T.Value(); math.IsNaN(v) || math.IsInf(v, 0) || v < 1 || v > 1e4 {
			t.Errorf("-%s %q: T = %v accepted", name, value, v)
		}
		if v := p.Value(); math.IsNaN(v) || math.IsInf(v, 0) {
			t.Errorf("-%s %q: p = %v accepted", name, value, v)
		}
	})
}
