package fluid

import (
	"errors"
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/internal/evalcount"
)

// TestDensityRoundTrip computes p at a grid of (T, ρ) states across every
// region of every fluid up to the published pressure limit (vapour,
// liquid, supercritical, metastable states between saturation and
// spinodal) and solves back for ρ on the same
// branch. It judges the result by its backward residual (DESIGN.md):
// |p(T, ρ) − p| ≤ 1e-10·p + 1e-12·ρRT, and checks the branch, the stable
// choice against the equation's saturation and the Metastable flag.
func TestDensityRoundTrip(t *testing.T) {
	t.Parallel()
	for _, f := range allFluids(t) {
		l := f.limits
		n := 0
		for i := 0; i <= 40; i++ {
			T := l.TFloor * math.Pow(math.Min(l.TMax, 4*f.tc)/l.TFloor, float64(i)/40)
			for j := 0; j <= 60; j++ {
				rho := 1e-6 * f.rhoc * math.Pow(0.95*l.RhoCeil/(1e-6*f.rhoc), float64(j)/60)
				pr, err := f.Props(T, rho)
				if err != nil || pr.P <= 0 || pr.P > l.PMax {
					// Unstable, or beyond the accepted range, or beyond the
					// published pressure range, where p(ρ) of IAPWS-95 at
					// low T rises, falls and rises again (no single liquid
					// branch).
					continue
				}
				n++
				root := RootVapor
				if rho > f.rhoc {
					root = RootLiquid
				}
				got, err := f.PropsTP(T, pr.P, root, 0)
				if err != nil {
					t.Errorf("%s PropsTP(%v, %v, %v) [rho = %v]: %v", f.name, T, pr.P, root, rho, err)
					continue
				}
				checkBackward(t, f, T, pr.P, &got)
				if T < f.tc && (got.Rho > f.rhoc) != (root == RootLiquid) {
					t.Errorf("%s T = %v, p = %v: root %v gave rho = %v (from %v)", f.name, T, pr.P, root, got.Rho, rho)
				}
				// The stable root and the Metastable flag against the
				// saturation curve.
				if T >= f.triple.T && T < f.tc-critBand {
					s, err := f.SaturationAtT(T)
					if err != nil {
						t.Fatal(err)
					}
					liquidStable := pr.P > s.P
					meta := got.Flags&Metastable != 0
					if meta != (liquidStable != (root == RootLiquid)) {
						t.Errorf("%s T = %v, p = %v (psat %v), root %v: flags %v", f.name, T, pr.P, s.P, root, got.Flags)
					}
					st, err := f.PropsTP(T, pr.P, RootStable, 0)
					if err != nil {
						t.Errorf("%s stable at T = %v, p = %v: %v", f.name, T, pr.P, err)
						continue
					}
					if (st.Rho > f.rhoc) != liquidStable || st.Flags&Metastable != 0 {
						t.Errorf("%s stable at T = %v, p = %v (psat %v): rho = %v", f.name, T, pr.P, s.P, st.Rho)
					}
				}
			}
		}
		if n < 500 {
			t.Errorf("%s: only %d states tested", f.name, n)
		}
	}
}

func checkBackward(t *testing.T, f *Fluid, T, p float64, got *Props) {
	t.Helper()
	if d := math.Abs(got.P - p); d > 1e-10*p+1e-12*got.Rho*f.r*T {
		t.Errorf("%s T = %v, p = %v: rho = %v reproduces p = %v", f.name, T, p, got.Rho, got.P)
	}
}

// TestDensityStableNearSaturation checks RootStable on both sides of the
// vapour pressure, within the auxiliary equation's band where the
// equation's own saturation decides.
func TestDensityStableNearSaturation(t *testing.T) {
	for _, f := range allFluids(t) {
		for _, T := range satGrid(f, 20) {
			s, err := f.SaturationAtT(T)
			if err != nil {
				t.Fatal(err)
			}
			for _, rel := range []float64{-1e-3, -1e-6, -1e-10, 1e-10, 1e-6, 1e-3} {
				p := s.P * (1 + rel)
				rho, err := f.Density(T, p, RootStable)
				if err != nil {
					t.Errorf("%s T = %v, p = psat(1%+g): %v", f.name, T, rel, err)
					continue
				}
				if (rho > f.rhoc) != (rel > 0) {
					t.Errorf("%s T = %v, p = psat(1%+g): rho = %v", f.name, T, rel, rho)
				}
			}
		}
	}
}

// TestDensityMetastable checks metastable roots up to the spinodal and
// the error beyond it.
func TestDensityMetastable(t *testing.T) {
	f, _ := Lookup("water")
	s, _ := f.SaturationAtT(400)
	for _, c := range []struct {
		T, p float64
		root Root
		want error
	}{
		{400, 0.9 * s.P, RootLiquid, nil},                   // superheated liquid
		{400, 1.1 * s.P, RootVapor, nil},                    // subcooled vapour
		{400, 20 * s.P, RootVapor, ErrUnstable},             // beyond the vapour spinodal
		{f.tc - 1, 0.5 * f.crit.P, RootLiquid, ErrUnstable}, // below the liquid spinodal
	} {
		pr, err := f.PropsTP(c.T, c.p, c.root, 0)
		if !errors.Is(err, c.want) {
			t.Errorf("T = %v, p = %v, %v: err = %v, want %v", c.T, c.p, c.root, err, c.want)
			continue
		}
		if err == nil {
			if pr.Flags&Metastable == 0 || pr.DpDrho <= 0 {
				t.Errorf("T = %v, p = %v, %v: %+v", c.T, c.p, c.root, pr)
			}
			checkBackward(t, f, c.T, c.p, &pr)
		}
	}
}

// TestPropsTPOnBranch checks PropsTPOnBranch against PropsTP: on the
// stable root the same state (the same iteration: bit for bit), on the
// metastable root the same state without the Metastable flag, beyond the
// spinodal the same error, and with RootStable PropsTP itself; and that
// PropsTP's properties are those of Props at its density, bit for bit
// (the root's full evaluation is at the δ Props takes).
func TestPropsTPOnBranch(t *testing.T) {
	t.Parallel()
	for _, f := range allFluids(t) {
		for _, T := range satGrid(f, 12) {
			s, err := f.SaturationAtT(T)
			if err != nil {
				t.Fatal(err)
			}
			for _, c := range []struct {
				p    float64
				root Root
			}{{3 * s.P, RootLiquid}, {0.3 * s.P, RootVapor}, {0.97 * s.P, RootLiquid}, {1.03 * s.P, RootVapor},
				{1.001 * s.P, RootStable}, {0.999 * s.P, RootStable}} {
				want, errW := f.PropsTP(T, c.p, c.root, 0)
				got, errG := f.PropsTPOnBranch(T, c.p, c.root, 0)
				if (errW == nil) != (errG == nil) || errW != nil && !errors.Is(errG, errorSentinel(errW)) {
					t.Errorf("%s T = %v, p = %v, %v: errors %v and %v", f.name, T, c.p, c.root, errW, errG)
					continue
				}
				if errW != nil {
					continue
				}
				if c.root != RootStable {
					want.Flags &^= Metastable
				}
				if got != want {
					t.Errorf("%s T = %v, p = %v, %v: %+v, PropsTP %+v", f.name, T, c.p, c.root, got, want)
				}
				pr, err := f.Props(T, want.Rho)
				pr.Flags |= want.Flags & (Metastable | Indeterminate)
				if err != nil || pr != want {
					t.Errorf("%s T = %v, p = %v, %v: PropsTP %+v, Props at its density %+v (%v)", f.name, T, c.p, c.root, want, pr, err)
				}
			}
		}
	}
}

// errorSentinel returns the sentinel an error of package fluid wraps.
func errorSentinel(err error) error {
	var e *Error
	if errors.As(err, &e) {
		return e.Err
	}
	return err
}

func TestDensityErrors(t *testing.T) {
	for _, f := range allFluids(t) {
		nan, inf := math.NaN(), math.Inf(1)
		l := f.limits
		for _, c := range []struct {
			T, p float64
			root Root
			want error
		}{
			{nan, 1e5, 0, ErrInvalidInput}, {300, nan, 0, ErrInvalidInput},
			{inf, 1e5, 0, ErrInvalidInput}, {300, inf, 0, ErrInvalidInput},
			{-1, 1e5, 0, ErrInvalidInput}, {300, 0, 0, ErrInvalidInput}, {300, -1, 0, ErrInvalidInput},
			{300, 1e5, 3, ErrInvalidInput}, {300, 1e5, -1, ErrInvalidInput},
			{l.TFloor * 0.99, 1, 0, ErrOutOfRange}, {l.TCeil * 1.01, 1e5, 0, ErrOutOfRange},
			{400, l.PCeil * 1.01, 0, ErrOutOfRange},
		} {
			_, err := f.Density(c.T, c.p, c.root)
			var e *Error
			if !errors.Is(err, c.want) || !errors.As(err, &e) || !isASCII(err.Error()) {
				t.Errorf("%s Density(%v, %v, %v): err = %v, want %v", f.name, c.T, c.p, c.root, err, c.want)
			}
		}
	}
}

func TestDensityAllocs(t *testing.T) {
	f, _ := Lookup("water")
	s, _ := f.SaturationAtT(400)
	for name, fn := range map[string]func(){
		"liquid":        func() { f.Density(300, 1e5, RootStable) },
		"vapour":        func() { f.Density(500, 1e5, RootStable) },
		"supercritical": func() { f.Density(800, 50e6, RootStable) },
		"nearSat":       func() { f.Density(400, s.P*(1+1e-6), RootStable) },
		"metastable":    func() { f.PropsTP(400, s.P*0.9, RootLiquid, 0) },
		"onBranch":      func() { f.PropsTPOnBranch(400, s.P*0.9, RootLiquid, 0) },
		"aboveTc":       func() { f.EstimateAboveTcPH(3e7, 2e6) },
	} {
		if a := testing.AllocsPerRun(20, fn); a != 0 {
			t.Errorf("%s: %v allocs", name, a)
		}
	}
}

var fluidSink float64

// benchEvals reports equation evaluations per call when the build counts
// them (go test -tags tripoint_evalcount -bench .).
func benchEvals(b *testing.B, n0 uint64) {
	if evalcount.Enabled {
		b.ReportMetric(float64(evalcount.Load()-n0)/float64(b.N), "evals/op")
	}
}

// BenchmarkPropsEvals is Props with the evaluation count
// (go test -tags tripoint_evalcount), for comparison with the solvers.
func BenchmarkPropsEvals(b *testing.B) {
	f, _ := Lookup("water")
	b.ReportAllocs()
	n0 := evalcount.Load()
	for i := 0; i < b.N; i++ {
		p, _ := f.Props(300+float64(i&63), 990)
		fluidSink += p.H
	}
	benchEvals(b, n0)
}

func BenchmarkDensity(b *testing.B) {
	f, _ := Lookup("water")
	for _, c := range []struct {
		name string
		T, p float64
	}{
		{"liquid", 300, 1e6}, {"compressedLiquid", 400, 100e6}, {"vapour", 500, 1e5},
		{"supercritical", 800, 50e6}, {"nearSaturation", 373.124, 101325},
	} {
		b.Run(c.name, func(b *testing.B) {
			b.ReportAllocs()
			n0 := evalcount.Load()
			for i := 0; i < b.N; i++ {
				rho, _ := f.Density(c.T, c.p, RootStable)
				fluidSink += rho
			}
			benchEvals(b, n0)
		})
	}
}

func BenchmarkSaturation(b *testing.B) {
	f, _ := Lookup("water")
	b.Run("AtT", func(b *testing.B) {
		b.ReportAllocs()
		n0 := evalcount.Load()
		for i := 0; i < b.N; i++ {
			s, _ := f.SaturationAtT(300 + float64(i&255))
			fluidSink += s.P
		}
		benchEvals(b, n0)
	})
	b.Run("AtP", func(b *testing.B) {
		b.ReportAllocs()
		n0 := evalcount.Load()
		for i := 0; i < b.N; i++ {
			s, _ := f.SaturationAtP(1e4 * float64(1+i&255))
			fluidSink += s.T
		}
		benchEvals(b, n0)
	})
}
