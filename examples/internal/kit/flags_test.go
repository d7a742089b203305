package kit

import (
	"errors"
	"flag"
	"io"
	"math"
	"strings"
	"testing"
)

func TestFlagsUnits(t *testing.T) {
	t.Parallel()
	// Conversions are exact definitions: 0 °C = 273.15 K, 1 bar = 1e5 Pa,
	// 1 MPa = 1e6 Pa (SI brochure; common practice).
	for _, tc := range []struct {
		args  []string
		wantT float64 // K
		wantP float64 // Pa
		wantH float64 // J/kg
	}{
		{nil, 265.15, 0, 2e5},
		{[]string{"-t-C", "35"}, 308.15, 0, 2e5},
		{[]string{"-t-K", "300", "-p-bar", "90"}, 300, 9e6, 2e5},
		{[]string{"-p-MPa", "9.5", "-h-kJkg", "-12.5"}, 265.15, 9.5e6, -12.5e3},
		{[]string{"-p-Pa", "101325", "-h-Jkg", "7"}, 265.15, 101325, 7},
	} {
		fs := NewFlags("x", "test", io.Discard)
		T := fs.Temperature("t", "a temperature", -8)
		p := fs.Pressure("p", "a pressure", 0).Optional()
		h := fs.Enthalpy("h", "an enthalpy", 200)
		if err := fs.Parse(tc.args); err != nil {
			t.Fatalf("%v: %v", tc.args, err)
		}
		for _, c := range []struct{ got, want float64 }{{T.Value(), tc.wantT}, {p.Value(), tc.wantP}, {h.Value(), tc.wantH}} {
			if math.Abs(c.got-c.want) > 1e-9*math.Max(1, math.Abs(c.want)) {
				t.Errorf("%v: got %v, want %v", tc.args, c.got, c.want)
			}
		}
		if p.IsSet() != (tc.wantP != 0) {
			t.Errorf("%v: IsSet = %v", tc.args, p.IsSet())
		}
	}
}

func TestFlagsMoreUnits(t *testing.T) {
	t.Parallel()
	// Conversions are exact definitions: 1 L = 1e-3 m³, 1 mm = 1e-3 m,
	// 1 min = 60 s, 1 h = 3600 s (SI brochure; common practice).
	for _, tc := range []struct {
		args                []string
		wantV, wantD, wantT float64 // m³, m, s
	}{
		{nil, 0.05, 0.003, 600},
		{[]string{"-v-m3", "0.2", "-d-m", "0.01", "-t-min", "2"}, 0.2, 0.01, 120},
		{[]string{"-v-L", "12.5", "-d-mm", "6", "-t-h", "1.5"}, 0.0125, 0.006, 5400},
	} {
		fs := NewFlags("x", "test", io.Discard)
		v := fs.Volume("v", "a volume", 50)
		d := fs.Length("d", "a diameter", 3)
		tm := fs.Duration("t", "a time", 600)
		m := fs.Mass("m", "a mass", 20)
		a := fs.Area("a", "an area", 0).Optional()
		k := fs.HeatTransferCoefficient("k", "a coefficient", 10)
		if err := fs.Parse(tc.args); err != nil {
			t.Fatalf("%v: %v", tc.args, err)
		}
		for _, c := range []struct{ got, want float64 }{{v.Value(), tc.wantV}, {d.Value(), tc.wantD}, {tm.Value(), tc.wantT}, {m.Value(), 20}, {a.Value(), 0}, {k.Value(), 10}} {
			if math.Abs(c.got-c.want) > 1e-12*math.Max(1, math.Abs(c.want)) {
				t.Errorf("%v: got %v, want %v", tc.args, c.got, c.want)
			}
		}
	}
}

func TestFlagsErrors(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		args []string
		want string // in the message
	}{
		{[]string{"-t-C", "abc"}, "-t-C"},
		{[]string{"-t-C", "NaN"}, "not a finite number"},
		{[]string{"-t-C", "Inf"}, "not a finite number"},
		{[]string{"-t-C", "5", "-t-K", "280"}, "already given"},
		{[]string{"-t-C", "200"}, "outside"},
		{[]string{"-dt-K", "-1"}, "-dt-K"},
		{[]string{"stray"}, "unexpected argument"},
		{[]string{"-nosuch", "1"}, "nosuch"},
	} {
		var out strings.Builder
		fs := NewFlags("x", "test", &out)
		fs.Temperature("t", "a temperature", -8).Within(200, 400)
		fs.TemperatureDifference("dt", "a difference", 5).Within(0, 50)
		err := fs.Parse(tc.args)
		if err == nil {
			t.Errorf("%v: no error", tc.args)
			continue
		}
		if msg := err.Error() + out.String(); !strings.Contains(msg, tc.want) {
			t.Errorf("%v: error %q (output %q) does not mention %q", tc.args, err, out.String(), tc.want)
		}
	}
	var out strings.Builder
	fs := NewFlags("x", "synopsis line", &out)
	fs.Temperature("t", "a temperature", -8)
	if err := fs.Parse([]string{"-h"}); !errors.Is(err, flag.ErrHelp) {
		t.Errorf("-h: %v, want flag.ErrHelp", err)
	}
	for _, w := range []string{"synopsis line", "-t-C", "-t-K", "°C"} {
		if !strings.Contains(out.String(), w) {
			t.Errorf("-h output lacks %q:\n%s", w, out.String())
		}
	}
	// An optional quantity shows no default.
	out.Reset()
	fs = NewFlags("x", "synopsis line", &out)
	fs.Pressure("p", "an optional pressure", 0).Optional()
	if err := fs.Parse([]string{"-h"}); !errors.Is(err, flag.ErrHelp) {
		t.Errorf("-h: %v, want flag.ErrHelp", err)
	}
	if strings.Contains(out.String(), "default") {
		t.Errorf("-h shows a default of an optional quantity:\n%s", out.String())
	}
}

func TestNiceSteps(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		span float64
		n    int
		want float64
	}{{336, 20, 20}, {835, 20, 50}, {1, 10, 0.1}, {23, 10, 2.5}} {
		if got := NiceStep(tc.span, tc.n); math.Abs(got-tc.want) > 1e-12*tc.want {
			t.Errorf("NiceStep(%v, %d) = %v, want %v", tc.span, tc.n, got, tc.want)
		}
	}
	if got := Series125(0.3, 60); len(got) != 7 || got[0] != 0.5 || got[6] != 50 {
		t.Errorf("Series125(0.3, 60) = %v", got)
	}
}
