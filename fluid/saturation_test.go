package fluid

import (
	"encoding/csv"
	"errors"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/diff/fd"
)

// allFluids returns every fluid of the registry.
func allFluids(t testing.TB) []*Fluid {
	t.Helper()
	var fs []*Fluid
	for _, n := range Names() {
		f, err := Lookup(n)
		if err != nil {
			t.Fatal(err)
		}
		fs = append(fs, f)
	}
	return fs
}

// readCSV reads a testdata table with '#' comments and a header row.
func readCSV(t *testing.T, name string) (header []string, rows [][]string) {
	t.Helper()
	fh, err := os.Open("../testdata/" + name)
	if err != nil {
		t.Fatal(err)
	}
	defer fh.Close()
	r := csv.NewReader(fh)
	r.Comment = '#'
	recs, err := r.ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	return recs[0], recs[1:]
}

// printedUnit returns one unit in the last printed digit of s, e.g.
// 1e-12 for "0.698451167e-3".
func printedUnit(t *testing.T, s string) float64 {
	t.Helper()
	m, e := strings.ToLower(s), 0
	if i := strings.IndexByte(m, 'e'); i >= 0 {
		var err error
		if e, err = strconv.Atoi(m[i+1:]); err != nil {
			t.Fatal(err)
		}
		m = m[:i]
	}
	dec := 0
	if i := strings.IndexByte(m, '.'); i >= 0 {
		dec = len(m) - i - 1
	}
	return math.Pow(10, float64(e-dec))
}

// TestSaturationIAPWS95Table8 checks the saturation solver against
// IAPWS R6-95(2018) Table 8 to every printed digit (±1 in the last).
func TestSaturationIAPWS95Table8(t *testing.T) {
	f, err := Lookup("water")
	if err != nil {
		t.Fatal(err)
	}
	header, rows := readCSV(t, "iapws95-table8-saturation.csv")
	// Printed units → SI.
	scale := map[string]float64{"T": 1, "p": 1e6, "rho_liq": 1, "rho_vap": 1,
		"h_liq": 1e3, "h_vap": 1e3, "s_liq": 1e3, "s_vap": 1e3}
	for _, row := range rows {
		T, _ := strconv.ParseFloat(row[0], 64)
		s, err := f.SaturationAtT(T)
		if err != nil {
			t.Fatalf("T = %v: %v", T, err)
		}
		got := map[string]float64{"T": T, "p": s.P, "rho_liq": s.Liquid.Rho, "rho_vap": s.Vapor.Rho,
			"h_liq": s.Liquid.H, "h_vap": s.Vapor.H, "s_liq": s.Liquid.S, "s_vap": s.Vapor.S}
		for i, col := range header[:len(header)-1] {
			want, err := strconv.ParseFloat(row[i], 64)
			if err != nil {
				t.Fatal(err)
			}
			unit := printedUnit(t, row[i])
			g := got[col] / scale[col]
			if math.Abs(g-want) > unit*(1+1e-9) {
				t.Errorf("T = %v K, %s = %.12g, want %s (±%g; %s)", T, col, g, row[i], unit, row[len(row)-1])
			}
		}
		// The same state from the pressure side.
		sp, err := f.SaturationAtP(s.P)
		if err != nil {
			t.Fatalf("p = %v: %v", s.P, err)
		}
		if math.Abs(sp.T-T) > 1e-9*T {
			t.Errorf("SaturationAtP(%v).T = %.15g, want %v", s.P, sp.T, T)
		}
	}
}

// scatter returns the rounding floor of the pressure (Pa) and of g/(RT)
// of f at (T, ρ): the largest deviation from the tangent over the 16
// nearest floating-point-scale neighbours ρ(1 + kε), plus the change
// across one unit in the last place of ρ (the best any density can do).
// It is the noise floor of the equation itself, against which residuals
// are judged.
func scatter(f *Fluid, T, rho float64) (dp, dg float64) {
	const eps = 2.220446049250313e-16
	p0 := f.props(T, rho)
	rt := f.r * T
	for k := -8; k <= 8; k++ {
		r := rho * (1 + float64(k)*eps)
		p := f.props(T, r)
		lin := p0.DpDrho * (r - rho)
		dp = math.Max(dp, math.Abs(p.P-p0.P-lin))
		dg = math.Max(dg, math.Abs(p.G-p0.G-lin/rho)/rt)
	}
	ulp := math.Abs(p0.DpDrho) * eps * rho
	return dp + ulp, dg + ulp/(rho*rt)
}

// satGrid returns temperatures from Tt to Tc − critBand, denser near Tc.
func satGrid(f *Fluid, n int) []float64 {
	var ts []float64
	lo, hi := f.triple.T, f.crit.T-critBand
	for i := 0; i <= n; i++ {
		// Uniform in (Tc − T)^(1/4): fine steps close to Tc.
		u := float64(i) / float64(n)
		a, b := math.Pow(f.crit.T-lo, 0.25), math.Pow(f.crit.T-hi, 0.25)
		x := a + (b-a)*u
		ts = append(ts, math.Min(math.Max(f.crit.T-x*x*x*x, lo), hi))
	}
	return ts
}

// checkEquilibrium asserts that s satisfies the phase-equilibrium
// conditions to the rounding scatter of the equation (times 8) and within
// the floors of DESIGN.md.
func checkEquilibrium(t *testing.T, f *Fluid, s *Saturation, what string) {
	t.Helper()
	T := s.T
	rt := f.r * T
	spl, sgl := scatter(f, T, s.Liquid.Rho)
	spv, sgv := scatter(f, T, s.Vapor.Rho)
	dp := math.Abs(s.Liquid.P - s.Vapor.P)
	dg := math.Abs(s.Liquid.G-s.Vapor.G) / rt
	boundP := 8*(spl+spv) + 1e-14*s.P
	boundG := 8*(sgl+sgv) + 1e-14
	if dp > boundP || dp > 1e-10*s.P+1e-12*s.Liquid.Rho*rt {
		t.Errorf("%s %s T = %.12g: |p' - p''| = %.3g Pa, rounding bound %.3g", f.name, what, T, dp, boundP)
	}
	if dg > boundG {
		t.Errorf("%s %s T = %.12g: |g' - g''|/RT = %.3g, rounding bound %.3g", f.name, what, T, dg, boundG)
	}
	if math.Abs(s.Vapor.P-s.P) > 1e-10*s.P {
		t.Errorf("%s %s T = %.12g: P = %v but the vapour's pressure is %v", f.name, what, T, s.P, s.Vapor.P)
	}
	if !(s.Vapor.Rho < f.crit.Rho && f.crit.Rho < s.Liquid.Rho) || s.Flags&Saturated == 0 ||
		s.Liquid.Flags&Saturated == 0 || s.Vapor.Flags&Saturated == 0 {
		t.Errorf("%s %s T = %.12g: rho' = %v, rho'' = %v, flags %v", f.name, what, T, s.Liquid.Rho, s.Vapor.Rho, s.Flags)
	}
}

// TestSaturationResiduals checks equal pressure and Gibbs energy at
// rounding level from the triple point to Tc − 1 mK for every fluid, and
// that SaturationAtP inverts SaturationAtT.
func TestSaturationResiduals(t *testing.T) {
	t.Parallel()
	for _, f := range allFluids(t) {
		for _, T := range satGrid(f, 120) {
			s, err := f.SaturationAtT(T)
			if err != nil {
				t.Errorf("%s SaturationAtT(%v): %v", f.name, T, err)
				continue
			}
			checkEquilibrium(t, f, &s, "SaturationAtT")
			sp, err := f.SaturationAtP(s.P)
			if err != nil {
				t.Errorf("%s SaturationAtP(%v): %v", f.name, s.P, err)
				continue
			}
			checkEquilibrium(t, f, &sp, "SaturationAtP")
			if math.Abs(sp.T-T) > 1e-9*T {
				t.Errorf("%s SaturationAtP(%v).T = %.15g, want %v", f.name, s.P, sp.T, T)
			}
		}
	}
}

// TestClausiusClapeyron checks dp/dT along the computed curve, by central
// differences, against (h” − h')/(T (1/ρ” − 1/ρ')).
func TestClausiusClapeyron(t *testing.T) {
	t.Parallel()
	for _, f := range allFluids(t) {
		for _, T := range satGrid(f, 30) {
			h := math.Min(0.01, (f.crit.T-T)/100)
			if T-h < f.triple.T {
				continue
			}
			dpdT := fd.Derivative(func(T float64) float64 {
				s, err := f.SaturationAtT(T)
				if err != nil {
					t.Fatal(err)
				}
				return s.P
			}, T, &fd.Settings{Formula: fd.Central, Step: h})
			s, _ := f.SaturationAtT(T)
			cc := (s.Vapor.H - s.Liquid.H) / (T * (1/s.Vapor.Rho - 1/s.Liquid.Rho))
			if math.Abs(dpdT-cc) > 1e-6*cc {
				t.Errorf("%s T = %v: dp/dT = %.10g by differences, %.10g by Clausius-Clapeyron", f.name, T, dpdT, cc)
			}
		}
	}
}

// TestSaturationNearCritical documents the behaviour between Tc − 1 mK
// and Tc, with (Tc, pc, ρc) = Critical(): residuals of the equilibrium
// conditions within 1e-12 (|Δp|/p, |Δg|/RT, and P against the vapour's
// pressure), ρ” < ρc < ρ', p rising and the densities closing
// monotonically toward the critical point, continuity at Tc − 1 mK, no
// jump at Tc (the last floating-point temperature below it is within
// rounding of the critical point: the densities within 1e-5·ρc, p
// within 1e-14·pc), and exactly the critical point at Tc, where cp is
// infinite and, without nonanalytic terms, cv and w are finite and the
// limits of the saturated phases' values.
func TestSaturationNearCritical(t *testing.T) {
	t.Parallel()
	for _, f := range allFluids(t) {
		var prev Saturation
		first := true
		for k := 0.0; k <= 9; k += 0.25 {
			T := f.crit.T - critBand*math.Pow(10, -k)
			s, err := f.SaturationAtT(T)
			if err != nil {
				t.Errorf("%s SaturationAtT(Tc - %g): %v", f.name, f.crit.T-T, err)
				continue
			}
			rt := f.r * T
			if d := math.Abs(s.Liquid.P-s.Vapor.P) / s.P; d > 1e-12 {
				t.Errorf("%s Tc - %g K: |dp|/p = %.3g", f.name, f.crit.T-T, d)
			}
			if d := math.Abs(s.Liquid.G-s.Vapor.G) / rt; d > 1e-12 {
				t.Errorf("%s Tc - %g K: |dg|/RT = %.3g", f.name, f.crit.T-T, d)
			}
			if d := math.Abs(s.Vapor.P-s.P) / s.P; d > 1e-12 {
				t.Errorf("%s Tc - %g K: P = %v, vapour pressure %v", f.name, f.crit.T-T, s.P, s.Vapor.P)
			}
			if !(s.Vapor.Rho < f.crit.Rho && f.crit.Rho < s.Liquid.Rho && s.P <= f.crit.P) {
				t.Errorf("%s Tc - %g K: rho'' = %v, rho' = %v, p = %v", f.name, f.crit.T-T, s.Vapor.Rho, s.Liquid.Rho, s.P)
			}
			// Monotone, to within the scatter of densities the equation
			// cannot tell apart (1e-9) and the rounding of p (1e-14: within
			// 1e-12 K of Tc, p changes by less than that).
			if !first && !(s.P > prev.P*(1-1e-14) && s.Liquid.Rho < prev.Liquid.Rho*(1+1e-9) && s.Vapor.Rho > prev.Vapor.Rho*(1-1e-9)) {
				t.Errorf("%s Tc - %g K: not monotone: p %v -> %v, rho' %v -> %v, rho'' %v -> %v", f.name, f.crit.T-T,
					prev.P, s.P, prev.Liquid.Rho, s.Liquid.Rho, prev.Vapor.Rho, s.Vapor.Rho)
			}
			sp, err := f.SaturationAtP(s.P)
			if err != nil {
				t.Errorf("%s SaturationAtP(%v): %v", f.name, s.P, err)
			} else if math.Abs(sp.T-T) > 1e-9*T {
				t.Errorf("%s SaturationAtP(%v).T = %.15g, want %.15g", f.name, s.P, sp.T, T)
			}
			prev, first = s, false
		}
		// Continuity across Tc − 1 mK, where the model takes over.
		T1 := f.crit.T - critBand
		a, _ := f.SaturationAtT(math.Nextafter(T1, 0))
		b, _ := f.SaturationAtT(math.Nextafter(T1, 1000))
		if math.Abs(a.Liquid.Rho-b.Liquid.Rho) > 1e-6*b.Liquid.Rho || math.Abs(a.Vapor.Rho-b.Vapor.Rho) > 1e-6*b.Vapor.Rho {
			t.Errorf("%s: jump at Tc - 1 mK: rho' %v | %v, rho'' %v | %v", f.name, a.Liquid.Rho, b.Liquid.Rho, a.Vapor.Rho, b.Vapor.Rho)
		}
		// The last floating-point temperature below Tc still gives two
		// phases, at the critical point to within rounding (no jump: the
		// bounds allow the densities to close as (Tc − T)^β with β ≥ 0.3
		// from 1 % of ρc at Tc − 1 mK), and its pressure gives it back.
		Tm := math.Nextafter(f.crit.T, 0)
		s, err := f.SaturationAtT(Tm)
		if err != nil || !(s.Vapor.Rho < f.crit.Rho && f.crit.Rho < s.Liquid.Rho) ||
			math.Abs(s.Liquid.Rho-f.crit.Rho) > 1e-5*f.crit.Rho || math.Abs(s.Vapor.Rho-f.crit.Rho) > 1e-5*f.crit.Rho ||
			s.P > f.crit.P || f.crit.P-s.P > 1e-14*f.crit.P {
			t.Errorf("%s SaturationAtT(Tc-): %+v, %v; Critical() %+v", f.name, s, err, f.crit)
		}
		if sp, err := f.SaturationAtP(s.P); err != nil || math.Abs(sp.T-Tm) > 1e-12*Tm {
			t.Errorf("%s SaturationAtP(%v) = T %v, %v; want %v", f.name, s.P, sp.T, err, Tm)
		}
		// At Tc: the critical point itself.
		for _, c := range []func() (Saturation, error){
			func() (Saturation, error) { return f.SaturationAtT(f.crit.T) },
			func() (Saturation, error) { return f.SaturationAtP(f.crit.P) },
		} {
			s, err := c()
			if err != nil {
				t.Fatal(err)
			}
			if s.T != f.crit.T || s.P != f.crit.P || s.Liquid.Rho != f.crit.Rho || s.Vapor.Rho != f.crit.Rho ||
				s.Flags&(Saturated|AtCritical) != Saturated|AtCritical {
				t.Errorf("%s at the critical point: %+v", f.name, s)
			}
			if !math.IsInf(s.Liquid.Cp, 1) || s.Liquid.DpDrho != 0 || s.Liquid.Flags&AtCritical == 0 || s.Vapor != s.Liquid {
				t.Errorf("%s at the critical point: %+v", f.name, s)
			}
			if f.HasNonAnalytic() && (!math.IsInf(s.Liquid.Cv, 1) || s.Liquid.W != 0) {
				t.Errorf("%s at the critical point: cv = %v, w = %v", f.name, s.Liquid.Cv, s.Liquid.W)
			}
			if !f.HasNonAnalytic() {
				// Finite, and the limits of the saturated phases': cv and
				// w of an analytic equation are continuous in (T, ρ), so
				// at Tc − 1e-9 K (ρ′ and ρ″ within 2e-5·ρc) they agree to
				// 1e-5.
				b, err := f.SaturationAtT(f.crit.T - 1e-9)
				if err != nil {
					t.Fatal(err)
				}
				for _, ph := range []Props{b.Liquid, b.Vapor} {
					if !(s.Liquid.Cv > 0) || math.IsInf(s.Liquid.Cv, 0) || !(s.Liquid.W > 0) || math.IsInf(s.Liquid.W, 0) ||
						math.Abs(ph.Cv-s.Liquid.Cv) > 1e-5*s.Liquid.Cv || math.Abs(ph.W-s.Liquid.W) > 1e-5*s.Liquid.W {
						t.Errorf("%s at the critical point: cv = %v, w = %v; at Tc - 1e-9 K: %v, %v",
							f.name, s.Liquid.Cv, s.Liquid.W, ph.Cv, ph.W)
					}
				}
			}
		}
	}
}

// TestTriplePointSaturation checks the stored triple-point pressure and
// fluid densities against the equation's own saturation at Triple().T
// (DESIGN.md: they are the equation's values) to the digits stored,
// for fluids with a solid model.
func TestTriplePointSaturation(t *testing.T) {
	for _, f := range allFluids(t) {
		tp := f.Triple()
		if tp.RhoSolid == 0 {
			continue
		}
		s, err := f.SaturationAtT(tp.T)
		if err != nil {
			t.Fatalf("%s: %v", f.name, err)
		}
		for _, c := range []struct {
			name      string
			got, want float64
		}{{"P", s.P, tp.P}, {"RhoLiquid", s.Liquid.Rho, tp.RhoLiquid}, {"RhoVapor", s.Vapor.Rho, tp.RhoVapor}} {
			// ±1 in the last digit written in the fluid's data.
			if u := printedUnit(t, strconv.FormatFloat(c.want, 'e', -1, 64)); math.Abs(c.got-c.want) > u {
				t.Errorf("%s triple point %s = %v, the saturation gives %.10g", f.name, c.name, c.want, c.got)
			}
		}
	}
}

// TestSaturationErrors checks the typed errors of bad and out-of-range
// inputs.
func TestSaturationErrors(t *testing.T) {
	for _, f := range allFluids(t) {
		nan, inf := math.NaN(), math.Inf(1)
		for _, c := range []struct {
			x    float64
			atT  bool
			want error
		}{
			{nan, true, ErrInvalidInput}, {inf, true, ErrInvalidInput}, {-inf, true, ErrInvalidInput},
			{0, true, ErrInvalidInput}, {-1, true, ErrInvalidInput},
			{f.crit.T + 1e-9, true, ErrOutOfRange}, {1e4, true, ErrOutOfRange},
			{math.Nextafter(f.triple.T, 0), true, ErrOutOfRange}, {0.999 * f.triple.T, true, ErrOutOfRange},
			{nan, false, ErrInvalidInput}, {inf, false, ErrInvalidInput}, {0, false, ErrInvalidInput},
			{-5, false, ErrInvalidInput}, {math.Nextafter(f.crit.P, inf), false, ErrOutOfRange},
			{1e12, false, ErrOutOfRange}, {f.triple.P * 0.999, false, ErrOutOfRange},
			{1e-3, false, ErrOutOfRange},
		} {
			var err error
			if c.atT {
				_, err = f.SaturationAtT(c.x)
			} else {
				_, err = f.SaturationAtP(c.x)
			}
			var e *Error
			if !errors.Is(err, c.want) || !errors.As(err, &e) {
				t.Errorf("%s (atT %v) x = %v: err = %v, want %v", f.name, c.atT, c.x, err, c.want)
				continue
			}
			if !isASCII(err.Error()) {
				t.Errorf("non-ASCII message %q", err.Error())
			}
		}
		_, err := f.SaturationAtT(math.Nextafter(f.triple.T, 0))
		if !strings.Contains(err.Error(), "triple point") {
			t.Errorf("below the triple point: %v", err)
		}
	}
}

// TestAuxVaporPressureBand proves the premise of RootStable's shortcut:
// the auxiliary vapour-pressure equation of every fluid lies within 2/5
// of auxBand of the equation's own vapour pressure, where it is defined
// (up to its own Tc: for R-134a 374.18 K, below Critical().T; above it
// the shortcut does not decide, its NaN failing both comparisons).
func TestAuxVaporPressureBand(t *testing.T) {
	for _, f := range allFluids(t) {
		if f.aux.psat == nil {
			continue
		}
		for _, T := range satGrid(f, 60) {
			if T > f.auxTc() {
				if _, ok := f.auxSide(T, f.crit.P); ok {
					t.Errorf("%s T = %v: auxSide decides above the auxiliary equation's Tc", f.name, T)
				}
				continue
			}
			s, err := f.SaturationAtT(T)
			if err != nil {
				t.Fatal(err)
			}
			if d := math.Abs(f.aux.psat(T)/s.P - 1); !(d <= 0.4*auxBand) {
				t.Errorf("%s T = %v: auxiliary vapour pressure off by %.3g", f.name, T, d)
			}
		}
	}
}

func TestSaturationAllocs(t *testing.T) {
	f, _ := Lookup("water")
	for name, fn := range map[string]func(){
		"AtT":         func() { f.SaturationAtT(400) },
		"AtP":         func() { f.SaturationAtP(1e5) },
		"NearCritAtT": func() { f.SaturationAtT(f.crit.T - 1e-5) },
		"NearCritAtP": func() { f.SaturationAtP(f.crit.P - 1) },
	} {
		if a := testing.AllocsPerRun(20, fn); a != 0 {
			t.Errorf("%s: %v allocs", name, a)
		}
	}
}

// TestSaturationLinearFinish holds the saturation at p started from the
// cached curve, whose last Newton step is taken by the iterate's own
// derivatives (linearResidual), to the equation: both phases evaluated
// afresh at the result's (T, ρ′) and (T, ρ″) meet the equilibrium
// conditions at rounding level (checkEquilibrium), and the result's p,
// h, s, u and g agree with them to rounding, its cv, cp and w within
// 1e-10 (where the phases are not nearly critical), from the triple
// point to Tc − critBand for every fluid.
func TestSaturationLinearFinish(t *testing.T) {
	t.Parallel()
	for _, f := range allFluids(t) {
		rtc := f.r * f.crit.T
		for _, T := range satGrid(f, 120) {
			ref, err := f.SaturationAtT(T)
			if err != nil {
				t.Fatalf("%s SaturationAtT(%v): %v", f.name, T, err)
			}
			p := ref.P
			sp, ok := f.SaturationPointAtP(p)
			if !ok {
				continue
			}
			Ts, _ := sp.Temperature()
			rl, _ := sp.Value(SatLiquidRho)
			rv, _ := sp.Value(SatVaporRho)
			s, err := f.SaturationAtPFrom(p, Ts, rl, rv)
			if err != nil {
				t.Errorf("%s SaturationAtPFrom(%v): %v", f.name, p, err)
				continue
			}
			fresh := s
			fresh.Liquid, fresh.Vapor = f.props(s.T, s.Liquid.Rho), f.props(s.T, s.Vapor.Rho)
			fresh.Liquid.Flags |= Saturated
			fresh.Vapor.Flags |= Saturated
			checkEquilibrium(t, f, &fresh, "SaturationAtPFrom, evaluated afresh")
			for _, ph := range []struct {
				name      string
				got, want *Props
				scatterP  float64
			}{
				{"liquid", &s.Liquid, &fresh.Liquid, 0},
				{"vapour", &s.Vapor, &fresh.Vapor, 0},
			} {
				dpS, _ := scatter(f, s.T, ph.want.Rho)
				// Where (∂P/∂δ)_τ of a phase falls below satLinearDP the
				// last step is evaluated (and cp grows with its inverse,
				// so that the ulp of ρ by which ρ′ and ρ″ round moves it
				// by more than 1e-10): the heat capacities and w are
				// compared only away from there.
				soft := min(fresh.Liquid.DpDrho, fresh.Vapor.DpDrho)/(f.r*s.T) < satLinearDP
				for _, d := range []struct {
					what           string
					got, want, tol float64
				}{
					{"p", ph.got.P, ph.want.P, 16*dpS + 1e-14*p}, // two evaluations, each within 8 scatters (as checkEquilibrium)
					{"h", ph.got.H, ph.want.H, 1e-13 * max(math.Abs(ph.want.H), rtc)},
					{"s", ph.got.S, ph.want.S, 1e-13 * max(math.Abs(ph.want.S), f.r)},
					{"u", ph.got.U, ph.want.U, 1e-13 * max(math.Abs(ph.want.U), rtc)},
					{"g", ph.got.G, ph.want.G, 1e-13 * max(math.Abs(ph.want.G), rtc)},
					{"cv", ph.got.Cv, ph.want.Cv, 1e-10 * ph.want.Cv},
					{"cp", ph.got.Cp, ph.want.Cp, 1e-10 * ph.want.Cp},
					{"w", ph.got.W, ph.want.W, 1e-10 * ph.want.W},
				} {
					if soft && (d.what == "cv" || d.what == "cp" || d.what == "w") {
						continue
					}
					if !(math.Abs(d.got-d.want) <= d.tol) {
						t.Errorf("%s p = %v, %s: %s %v, evaluated afresh %v (|diff| %.3g > %.3g)",
							f.name, p, ph.name, d.what, d.got, d.want, math.Abs(d.got-d.want), d.tol)
					}
				}
			}
		}
	}
}
