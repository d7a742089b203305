package fluid

import (
	"errors"
	"math"
	"testing"
)

// checkContract asserts what DESIGN.md promises of every result: with a nil
// error no field is NaN and the only infinities are those of the critical
// point; an error is a *Error wrapping a sentinel, with an ASCII message.
func checkContract(t *testing.T, p Props, err error) {
	t.Helper()
	if err != nil {
		var e *Error
		if !errors.As(err, &e) {
			t.Fatalf("error %T %v, want *fluid.Error", err, err)
		}
		if !isASCII(err.Error()) {
			t.Fatalf("error %q is not ASCII", err)
		}
		for _, s := range []error{ErrInvalidInput, ErrOutOfRange, ErrUnstable} {
			if errors.Is(err, s) {
				return
			}
		}
		t.Fatalf("error %v wraps no expected sentinel", err)
	}
	for name, v := range floatFields(p) {
		if math.IsNaN(v) {
			t.Fatalf("(%v K, %v kg/m3): %s is NaN", p.T, p.Rho, name)
		}
		if math.IsInf(v, 0) {
			switch {
			case p.Flags&AtCritical != 0 && math.IsInf(v, 1) &&
				(name == "Cv" || name == "Cp" || name == "KappaT" || name == "Expansivity"):
			default:
				t.Fatalf("(%v K, %v kg/m3): %s = %v", p.T, p.Rho, name, v)
			}
		}
	}
}

func FuzzProps(f *testing.F) {
	w := water(f)
	for _, s := range [][2]float64{
		{300, 996.556}, {647.096, 322}, {200, 1e-8}, {5000, 3000}, {500, 100},
		{math.NaN(), 1}, {300, math.Inf(1)}, {0, 0}, {-1, -1}, {1e308, 1e-308},
	} {
		f.Add(s[0], s[1])
	}
	f.Fuzz(func(t *testing.T, T, rho float64) {
		p, err := w.Props(T, rho)
		checkContract(t, p, err)
		B, C, err := w.Virial(T)
		if err == nil && (math.IsNaN(B) || math.IsInf(B, 0) || math.IsNaN(C) || math.IsInf(C, 0)) {
			t.Fatalf("Virial(%v) = %v, %v", T, B, C)
		}
	})
}

func FuzzLookup(f *testing.F) {
	for _, s := range []string{"water", "H2O", " r-718 ", "", "\xff\xfe", "w\u00e4sser"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, name string) {
		fl, err := Lookup(name)
		if err != nil {
			if fl != nil || !errors.Is(err, ErrUndefined) || !isASCII(err.Error()) {
				t.Fatalf("Lookup(%q) = %v, %v", name, fl, err)
			}
			return
		}
		if fl == nil || normalize(fl.Name()) == "" {
			t.Fatalf("Lookup(%q) = %v", name, fl)
		}
	})
}
