package main

import (
	"math"
	"slices"
	"strings"
	"testing"
)

func TestParseList(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		in   string
		want []float64
	}{
		{"5", []float64{5}},
		{"-40:30:10", []float64{-40, -30, -20, -10, 0, 10, 20, 30}},
		{"0:1:0.1", []float64{0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1}},
		{"0:1:0.3", []float64{0, 0.3, 0.6, 0.9}},
		{"10:0:5", []float64{10, 5, 0}},
		{"1, 2,3:5:1 ,1e2", []float64{1, 2, 3, 4, 5, 100}},
		{"7:7:1", []float64{7}},
	} {
		got, err := parseList(c.in)
		if err != nil || !slices.Equal(got, c.want) {
			t.Errorf("parseList(%q) = %v, %v; want %v", c.in, got, err, c.want)
		}
	}
	for _, in := range []string{"", "a", "1,,2", "1:2", "1:2:3:4", "1:2:0", "1:2:-1", "inf", "1:nan:1", "0:2e6:1", "1e999"} {
		if got, err := parseList(in); err == nil {
			t.Errorf("parseList(%q) = %v, want an error", in, got)
		}
	}
}

func TestFormatValue(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		x      float64
		digits int
		want   string
	}{
		{34.85142, 6, "34.8514"},
		{200, 6, "200.000"},
		{1, 6, "1.00000"},
		{9.9999996, 6, "10.0000"},
		{0.00485458, 6, "0.00485458"},
		{-0.0731181, 6, "-0.0731181"},
		{3485142.3, 6, "3.48514e+06"},
		{348514.2, 6, "348514"},
		{6.11e-6, 3, "6.11e-06"},
		{0, 6, "0.00000"},
		{math.Inf(1), 6, "inf"},
		{math.Inf(-1), 6, "-inf"},
		{math.NaN(), 6, ""},
	} {
		if got := formatValue(c.x, c.digits); got != c.want {
			t.Errorf("formatValue(%v, %d) = %q, want %q", c.x, c.digits, got, c.want)
		}
	}
	for _, c := range []struct {
		si   float64
		u    unit
		want string
	}{
		{-40 + 273.15, uK, "233.15"},
		{273.16, uC, "0.01"},
		{uC.toSI(-56.558), uC, "-56.558"},
		{uBar.toSI(1.01325), uPa, "101325"},
		{101325, uBar, "1.01325"},
		{101325, ukPa, "101.325"},
		{273.15, uC, "0"},
		{12.5e6, uMPa, "12.5"},
	} {
		if got := formatConverted(c.si, c.u); got != c.want {
			t.Errorf("formatConverted(%v, %s) = %q, want %q", c.si, c.u.name, got, c.want)
		}
	}
}

func TestParsePrinted(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		s           string
		value, unit float64
		exact       bool
	}{
		{"0.992418352e-1", 0.0992418352, 1e-10, false},
		{"-0.364366650", -0.36436665, 1e-9, false},
		{"0.150151914e4", 1501.51914, 1e-5, false},
		{"300", 300, 1, false},
		{"1.5E+03", 1500, 100, false},
		{"0", 0, 1, true},
		{"0.00", 0, 0.01, false},
		{"0e0", 0, 1, false},
		{"inf", math.Inf(1), 0, false},
	} {
		p, err := parsePrinted(c.s)
		if err != nil || p.value != c.value || math.Abs(p.unit-c.unit) > 1e-12*c.unit || p.exact != c.exact {
			t.Errorf("parsePrinted(%q) = %v, %v, %v, %v; want %v, %v, %v", c.s, p.value, p.unit, p.exact, err, c.value, c.unit, c.exact)
		}
	}
	// A printed 0 is exact, except in C; 0.00 is not.
	for _, c := range []struct {
		col  column
		ref  string
		got  float64 // SI
		pass bool
	}{
		{column{qQ, phaseNone, uNone}, "0", 0, true},
		{column{qQ, phaseNone, uNone}, "0", 1e-17, false},
		{column{qQ, phaseNone, uNone}, "0.00", 0.004, true},
		{column{qT, phaseNone, uC}, "0", 273.15 + 0.4, true},
		{column{qT, phaseNone, uC}, "0", 273.15 + 1.2, false},
	} {
		p, _ := parsePrinted(c.ref)
		if d := compare(c.col, p, c.got, checkLimits); d.pass != c.pass {
			t.Errorf("%s %s against %v: pass %v, want %v", c.col.name(), c.ref, c.got, d.pass, c.pass)
		}
	}
	for _, s := range []string{"", "x", "1e", "--1"} {
		if _, err := parsePrinted(s); err == nil {
			t.Errorf("parsePrinted(%q): no error", s)
		}
	}
}

func TestParseColumn(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		in   string
		want column
	}{
		{"T_K", column{qT, phaseNone, uK}},
		{"t_C", column{qT, phaseNone, uC}},
		{"T", column{qT, phaseNone, uK}},
		{"p", column{qP, phaseNone, uMPa}},
		{"P_bar", column{qP, phaseNone, uBar}},
		{"rho_liq", column{qRho, phaseLiq, uKgM3}},
		{"rho_vap_kg_m3", column{qRho, phaseVap, uKgM3}},
		{"h_liq_J_kg", column{qH, phaseLiq, uJKg}},
		{"Cp_kJ_kgK", column{qCp, phaseNone, ukJKgK}},
		{"v_dm3_kg", column{qV, phaseNone, uDm3Kg}},
		{"q", column{qQ, phaseNone, uNone}},
		{"dh", column{qDh, phaseNone, ukJKg}},
	} {
		got, err := parseColumn(c.in)
		if err != nil || got != c.want {
			t.Errorf("parseColumn(%q) = %+v, %v; want %+v", c.in, got, err, c.want)
		}
		// The name a column prints parses back to the column.
		if back, err := parseColumn(got.name()); err != nil || back != got {
			t.Errorf("parseColumn(%q) = %+v, %v; want %+v", got.name(), back, err, got)
		}
	}
	for _, c := range []struct{ in, want string }{
		{"x", "unknown quantity"},
		{"T_F", `unknown unit "F" of T (known: K, C)`},
		{"p_mpa", "unknown unit"},
		{"q_1", "takes no unit"},
		{"rho_liq_g_cm3", "unknown unit"},
	} {
		if _, err := parseColumn(c.in); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("parseColumn(%q): %v, want %q", c.in, err, c.want)
		}
	}
}

// TestReadCheckFileErrors: files that break the layout are refused with
// the file, line and reason.
func TestReadCheckFileErrors(t *testing.T) {
	t.Parallel()
	for _, c := range []struct{ data, want string }{
		{"", "f: no header"},
		{"# only a comment\n", "no header"},
		{"T,p\n300,1\n", "wants a source column last"},
		{"T,source,p,source\n", "source must be the last column only"},
		{"T,p,h,source\n", "f: no rows"},
		{"T,p,h,source\n300,1,2,\n", "f:2: no source"},
		{"T,p,h,source\n300,x,2,a\n", `f:2: column p: "x" is not a number`},
		{"T,p,h,source\n,1,2,a\n", "f:2: column T: the input is missing"},
		{"T,p,h,source\ninf,1,2,a\n", "not finite"},
		{"T,p,h,source\n300,1,2\n", "wrong number of fields"},
		{"T,p,source\n300,1,a\n", "at least one to compare"},
		{"T,x,h,source\n", `unknown quantity "x"`},
		{"T_K,T_C,h,source\n", "hold the same property"},
		{"h,s,T,source\n", ""}, // h+s is a pair: no error
		{"T,h,s,source\n", "must be one of the pairs"},
		{"h_liq,T,p,source\n", "first property column of a saturation table"},
		{"T,h,rho_liq,source\n", "only T, p and dh stand without a phase"},
		{"T,q,rho_liq,source\n", "only T, p and dh"},
		{"T,dh_liq,rho_liq,source\n", "dh belongs to neither phase"},
		{"T,p,dh,source\n", "dh exists only in saturation tables"},
		{"fluid,T,p,h,source\n,300,1,2,a\n", "empty fluid cell"},
		{"T,p,phase,h,source\n300,1,solid-ish,2,a\n", `phase "solid-ish"`},
	} {
		_, err := readCheckFile(strings.NewReader(c.data), "f")
		switch {
		case c.want == "" && err != nil && !strings.Contains(err.Error(), "no rows"):
			t.Errorf("%q: %v", c.data, err)
		case c.want != "" && (err == nil || !strings.Contains(err.Error(), c.want)):
			t.Errorf("%q: error %v, want %q", c.data, err, c.want)
		}
	}
}

// FuzzParseList: no input panics, and what parses is finite and within
// the length limit.
func FuzzParseList(f *testing.F) {
	for _, s := range []string{"5", "-40:30:10", "0:1:0.1", "10:0:5", "1,2", "1e308:-1e308:1e300", ":", ",", "1:2:1e-300"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		v, err := parseList(s)
		if err != nil {
			return
		}
		if len(v) == 0 || len(v) > maxRows {
			t.Fatalf("%q: %d values", s, len(v))
		}
		for _, x := range v {
			if math.IsNaN(x) || math.IsInf(x, 0) {
				t.Fatalf("%q: value %v", s, x)
			}
		}
	})
}

// FuzzReadCheckFile: no file panics the reader or the evaluation of what
// it accepts.
func FuzzReadCheckFile(f *testing.F) {
	for _, s := range []string{
		"T_K,rho_kg_m3,p_MPa,source\n300,996.556,0.0992418352,a\n",
		"T,p,rho_liq,h_vap,dh,source\n275,0.000698451167,999.887406,2504.28995,2496.5,a\n",
		"p_bar,T_C,phase,h_kJ_kg,q,note,source\n1,20,Liquid,84,0,,a\n",
		"fluid,p,h,T,source\nCO2,5,300,280,a\nwater,0.1,2700,400,b\n",
		"rho,u,T,source\n100,300,250,a\n",
		"h,s,T,source\n2700,7,400,a\n",
	} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		cf, err := readCheckFile(strings.NewReader(s), "fuzz")
		if err != nil {
			return
		}
		if len(cf.rows) > 20 {
			return // keep each case fast
		}
		_, _ = deviations(cf, &fluidSource{def: "water", ref: "default"}, checkLimits, newProgress(nil, "", 0, nil))
	})
}
