package sublimation

import (
	"errors"
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
	"gonum.org/v1/gonum/diff/fd"
)

var solids = []string{"water", "CO2"}

// grid returns temperatures and pressures spanning the accepted range of s.
func grid(s Solid) (Ts, ps []float64) {
	l := s.Limits()
	lo := math.Max(l.TFloor, 1)
	for i := 0; i <= 40; i++ {
		Ts = append(Ts, lo+(l.TCeil-lo)*float64(i)/40)
	}
	for e := 0.0; e <= 1; e += 1.0 / 40 {
		ps = append(ps, math.Pow(l.PCeil, e)) // 1 Pa .. PCeil
	}
	return Ts, ps
}

// TestDerivativesFD checks every analytic derivative of both Gibbs models
// against central finite differences of the next lower one (gonum fd).
func TestDerivativesFD(t *testing.T) {
	t.Parallel()
	for _, name := range solids {
		s := mustSolid(t, name)
		Ts, ps := grid(s)
		for _, T := range Ts[1 : len(Ts)-1] {
			for _, p := range ps[1 : len(ps)-1] {
				g := s.Derivs(T, p)
				hT, hp := 1e-3*T, 1e-4*p+100 // the absolute part keeps roundoff small at low p
				dT := func(f func(T float64) float64) float64 {
					return fd.Derivative(f, T, &fd.Settings{Formula: fd.Central, Step: hT})
				}
				dp := func(f func(p float64) float64) float64 {
					return fd.Derivative(f, p, &fd.Settings{Formula: fd.Central, Step: hp})
				}
				at := func(T, p float64) Gibbs { return s.Derivs(T, p) }
				for _, c := range []struct {
					name     string
					got, num float64
					scale    float64
				}{
					{"GT", g.GT, dT(func(x float64) float64 { return at(x, p).G }), math.Abs(g.G)/T + math.Abs(g.GT)},
					{"GP", g.GP, dp(func(x float64) float64 { return at(T, x).G }), math.Abs(g.GP)},
					{"GTT", g.GTT, dT(func(x float64) float64 { return at(x, p).GT }), math.Abs(g.GTT)},
					{"GTP", g.GTP, dT(func(x float64) float64 { return at(x, p).GP }), math.Abs(g.GTP) + 1e-6*math.Abs(g.GP)/T},
					{"GTP'", g.GTP, dp(func(x float64) float64 { return at(T, x).GT }), math.Abs(g.GTP) + 1e-6*math.Abs(g.GP)/T},
					{"GPP", g.GPP, dp(func(x float64) float64 { return at(T, x).GP }), math.Abs(g.GPP) + 1e-9*math.Abs(g.GP)/p},
				} {
					if math.Abs(c.got-c.num) > 1e-5*c.scale {
						t.Errorf("%s (%g K, %g Pa): %s = %.10g, finite difference %.10g", name, T, p, c.name, c.got, c.num)
					}
				}
			}
		}
	}
}

// TestPropsGrid: no NaN, cp, cv, κ_T, κ_s, w positive and finite over
// the accepted range of each solid, and the identities between them.
func TestPropsGrid(t *testing.T) {
	t.Parallel()
	for _, name := range solids {
		s := mustSolid(t, name)
		Ts, ps := grid(s)
		for _, T := range Ts {
			for _, p := range ps {
				pr, err := s.Props(T, p)
				if err != nil {
					t.Fatalf("%s %g K %g Pa: %v", name, T, p, err)
				}
				vals := []float64{pr.Rho, pr.U, pr.H, pr.S, pr.G, pr.F, pr.Cp, pr.Cv, pr.W, pr.KappaT, pr.KappaS, pr.Expansivity}
				for _, v := range vals {
					if !finite(v) {
						t.Fatalf("%s %g K %g Pa: non-finite %+v", name, T, p, pr)
					}
				}
				if pr.Cp <= 0 || pr.Cv <= 0 || pr.KappaT <= 0 || pr.KappaS <= 0 || pr.W <= 0 || pr.Rho <= 0 || pr.Cv > pr.Cp*(1+1e-12) {
					t.Errorf("%s %g K %g Pa: not stable: %+v", name, T, p, pr)
				}
				// cp − cv = T α²/(ρ κ_T)
				if d := pr.Cp - pr.Cv - T*pr.Expansivity*pr.Expansivity/(pr.Rho*pr.KappaT); math.Abs(d) > 1e-9*pr.Cp {
					t.Errorf("%s %g K %g Pa: cp - cv identity off by %g", name, T, p, d)
				}
			}
		}
	}
}

// TestClausiusClapeyron: along every computed curve the slope of p(T),
// by central differences of the curve, equals Δs/Δv of the coexisting
// phases; and the phases have equal Gibbs energies.
func TestClausiusClapeyron(t *testing.T) {
	t.Parallel()
	for _, name := range solids {
		s := mustSolid(t, name)
		tp, err := s.Triple()
		if err != nil {
			t.Fatal(err)
		}
		check := func(kind string, c Coexistence, at func(T float64) (Coexistence, error), h float64) {
			rt := s.Fluid().GasConstant() * c.T
			if d := c.Fluid.G - c.Solid.G; math.Abs(d) > 1e-10*rt {
				t.Errorf("%s %s at %g K: g_fluid - g_solid = %g J/kg", name, kind, c.T, d)
			}
			if c.Fluid.Flags&fluid.Saturated == 0 || c.Solid.Flags&fluid.Saturated == 0 {
				t.Errorf("%s %s at %g K: Saturated flag missing", name, kind, c.T)
			}
			a, err1 := at(c.T - h)
			b, err2 := at(c.T + h)
			if err1 != nil || err2 != nil {
				return
			}
			slope := (b.P - a.P) / (2 * h)
			cc := (c.Fluid.S - c.Solid.S) / (1/c.Fluid.Rho - 1/c.Solid.Rho)
			if math.Abs(slope/cc-1) > 1e-6 {
				t.Errorf("%s %s at %g K: dp/dT = %.9g, Clausius-Clapeyron %.9g", name, kind, c.T, slope, cc)
			}
		}
		sub, err := s.SublimationCurve(30)
		if err != nil {
			t.Fatal(err)
		}
		for _, c := range sub {
			check("sublimation", c, s.SublimationPressure, 1e-3)
		}
		melt, err := s.MeltingCurve(30)
		if err != nil {
			t.Fatal(err)
		}
		for _, c := range melt {
			check("melting", c, s.MeltingPressure, 1e-4)
		}
		if sub[len(sub)-1].T != tp.T || melt[0].P != tp.P {
			// the curves start at the triple point
			if math.Abs(sub[len(sub)-1].P/tp.P-1) > 1e-9 || math.Abs(melt[0].T-tp.T) > 1e-9 {
				t.Errorf("%s: curves do not meet at the triple point: %g %g vs %g K %g Pa",
					name, sub[len(sub)-1].P, melt[0].T, tp.T, tp.P)
			}
		}
	}
}

// TestCurveInverses: the curves at T and at p are inverse functions.
func TestCurveInverses(t *testing.T) {
	t.Parallel()
	for _, name := range solids {
		s := mustSolid(t, name)
		sub, _ := s.SublimationCurve(15)
		for _, c := range sub {
			b, err := s.SublimationTemperature(c.P)
			if err != nil || math.Abs(b.T-c.T) > 1e-9*c.T {
				t.Errorf("%s: SublimationTemperature(%g) = %g K, want %g (%v)", name, c.P, b.T, c.T, err)
			}
		}
		melt, _ := s.MeltingCurve(15)
		for _, c := range melt {
			b, err := s.MeltingPressure(c.T)
			// the curve at p is solved to 1e-12 in T; on water's steep
			// curve that is worth |dp/dT|·1e-12·T in p.
			slope := (c.Fluid.S - c.Solid.S) / (1/c.Fluid.Rho - 1/c.Solid.Rho)
			if err != nil || math.Abs(b.P-c.P) > 1e-8*c.P+math.Abs(slope)*1e-11*c.T {
				t.Errorf("%s: MeltingPressure(%g) = %g Pa, want %g (%v)", name, c.T, b.P, c.P, err)
			}
		}
	}
}

// TestErrors covers bad input and fluids without a solid model.
func TestErrors(t *testing.T) {
	t.Parallel()
	if _, err := For(nil); !errors.Is(err, fluid.ErrInvalidInput) {
		t.Errorf("For(nil): %v", err)
	}
	for _, n := range fluid.Names() {
		f, _ := fluid.Lookup(n)
		_, err := For(f)
		switch n {
		case "water", "CO2":
			if err != nil {
				t.Errorf("For(%s): %v", n, err)
			}
		default: // R-134a and any other fluid without a solid model
			if !errors.Is(err, fluid.ErrUndefined) {
				t.Errorf("For(%s): %v, want ErrUndefined", n, err)
			}
		}
	}
	nan, inf := math.NaN(), math.Inf(1)
	for _, name := range solids {
		s := mustSolid(t, name)
		for _, in := range [][2]float64{{nan, 1e5}, {200, nan}, {inf, 1e5}, {200, -inf}, {0, 1e5}, {200, 0}, {-5, 1e5}} {
			if _, err := s.Props(in[0], in[1]); !errors.Is(err, fluid.ErrInvalidInput) {
				t.Errorf("%s Props(%g, %g): %v", name, in[0], in[1], err)
			}
		}
		for _, x := range []float64{nan, inf, -inf, 0, -1} {
			for _, fn := range []func(float64) (Coexistence, error){s.SublimationPressure, s.SublimationTemperature, s.MeltingPressure, s.MeltingTemperature} {
				if _, err := fn(x); !errors.Is(err, fluid.ErrInvalidInput) {
					t.Errorf("%s curve(%g): %v", name, x, err)
				}
			}
		}
		for _, fn := range []func(float64) (Coexistence, error){s.SublimationPressure, s.MeltingPressure} {
			if _, err := fn(1000); !errors.Is(err, fluid.ErrOutOfRange) {
				t.Errorf("%s curve(1000 K): %v", name, err)
			}
		}
		if _, err := s.SublimationPressure(100); !errors.Is(err, fluid.ErrOutOfRange) {
			t.Errorf("%s sublimation below the vapour floor: %v", name, err)
		}
		if _, err := s.SublimationTemperature(1e9); !errors.Is(err, fluid.ErrOutOfRange) {
			t.Errorf("%s sublimation above the triple point: %v", name, err)
		}
		if _, err := s.SublimationCurve(1); !errors.Is(err, fluid.ErrInvalidInput) {
			t.Errorf("%s SublimationCurve(1): %v", name, err)
		}
		if _, err := s.MeltingCurve(-3); !errors.Is(err, fluid.ErrInvalidInput) {
			t.Errorf("%s MeltingCurve(-3): %v", name, err)
		}
	}
}

// TestReferenceOffsets: the offsets of a fluid's reference state shift
// the solid's h, u, s, g, f like the fluid's and nothing else.
func TestReferenceOffsets(t *testing.T) {
	t.Parallel()
	s := mustSolid(t, "CO2")
	o := s
	o.dh, o.ds = 1234.5, -6.75
	a, _ := s.Props(200, 1e5)
	b, _ := o.Props(200, 1e5)
	T := 200.0
	if b.H-a.H != 1234.5 || b.U-a.U != 1234.5 || math.Abs(b.S-a.S+6.75) > 1e-12 ||
		math.Abs(b.G-a.G-(1234.5+6.75*T)) > 1e-9 || b.Rho != a.Rho || b.Cp != a.Cp || b.W != a.W {
		t.Errorf("offsets: %+v vs %+v", a, b)
	}
}

// TestPropsAllocs: Props allocates nothing.
func TestPropsAllocs(t *testing.T) {
	for _, c := range []struct {
		name string
		p    float64 // a sublimation pressure
	}{{"water", 100}, {"CO2", 1e5}} {
		name := c.name
		s := mustSolid(t, name)
		if n := testing.AllocsPerRun(100, func() { sinkProps, _ = s.Props(200, 1e5) }); n != 0 {
			t.Errorf("%s Props: %g allocs", name, n)
		}
		if n := testing.AllocsPerRun(100, func() { sinkCoex, _ = s.SublimationTemperature(c.p) }); n != 0 {
			t.Errorf("%s SublimationTemperature: %g allocs", name, n)
		}
	}
}

var (
	sinkProps Props
	sinkCoex  Coexistence
)

func BenchmarkProps(b *testing.B) {
	for _, name := range solids {
		s := mustSolid(b, name)
		b.Run(name, func(b *testing.B) {
			b.ReportAllocs()
			for i := 0; i < b.N; i++ {
				sinkProps, _ = s.Props(200+float64(i&7), 1e5)
			}
		})
	}
}

func BenchmarkCurves(b *testing.B) {
	for _, c := range []struct {
		name string
		p, T float64 // a sublimation pressure and temperature
	}{{"water", 100, 230}, {"CO2", 101325, 190}} {
		s := mustSolid(b, c.name)
		b.Run(c.name+"/SublimationTemperature", func(b *testing.B) {
			b.ReportAllocs()
			for i := 0; i < b.N; i++ {
				sinkCoex, _ = s.SublimationTemperature(c.p)
			}
		})
		b.Run(c.name+"/MeltingTemperature", func(b *testing.B) {
			b.ReportAllocs()
			for i := 0; i < b.N; i++ {
				sinkCoex, _ = s.MeltingTemperature(100e6)
			}
		})
		b.Run(c.name+"/SublimationPressure", func(b *testing.B) {
			b.ReportAllocs()
			for i := 0; i < b.N; i++ {
				sinkCoex, _ = s.SublimationPressure(c.T)
			}
		})
	}
}

// FuzzProps: no panic, and with a nil error every field is finite.
func FuzzProps(f *testing.F) {
	f.Add(0, 200.0, 1e5)
	f.Add(1, 273.16, 611.657)
	f.Add(1, 300.0, 8e8)
	f.Fuzz(func(t *testing.T, which int, T, p float64) {
		s := mustSolid(t, solids[(which%2+2)%2])
		pr, err := s.Props(T, p)
		if err == nil {
			for _, v := range []float64{pr.Rho, pr.H, pr.S, pr.U, pr.G, pr.Cp, pr.Cv, pr.W, pr.KappaT, pr.KappaS} {
				if !finite(v) {
					t.Fatalf("(%g, %g): %+v", T, p, pr)
				}
			}
		}
		c, err := s.SublimationTemperature(p)
		if err == nil && (!finite(c.T) || !finite(c.Fluid.H) || !finite(c.Solid.H)) {
			t.Fatalf("sublimation at %g: %+v", p, c)
		}
		m, err := s.MeltingTemperature(p)
		if err == nil && (!finite(m.T) || !finite(m.Fluid.H) || !finite(m.Solid.H)) {
			t.Fatalf("melting at %g: %+v", p, m)
		}
	})
}

// TestTripleFractions: fractions chosen at the triple point come back
// from (ρ, u), (ρ, h) and (ρ, s); states outside the triangle are refused.
func TestTripleFractions(t *testing.T) {
	t.Parallel()
	for _, name := range solids {
		s := mustSolid(t, name)
		tp, err := s.Triple()
		if err != nil {
			t.Fatal(err)
		}
		for _, x := range [][3]float64{{0.2, 0.3, 0.5}, {1, 0, 0}, {0, 1, 0}, {0, 0, 1}, {0.6, 0, 0.4}, {0.01, 0.98, 0.01}} {
			v := x[0]/tp.Solid.Rho + x[1]/tp.Liquid.Rho + x[2]/tp.Vapor.Rho
			mix := func(a, b, c float64) float64 { return x[0]*a + x[1]*b + x[2]*c }
			for _, c := range []struct {
				name string
				fn   func(rho, e float64) (float64, float64, float64, error)
				e    float64
			}{
				{"u", tp.FractionsRhoU, mix(tp.Solid.U, tp.Liquid.U, tp.Vapor.U)},
				{"h", tp.FractionsRhoH, mix(tp.Solid.H, tp.Liquid.H, tp.Vapor.H)},
				{"s", tp.FractionsRhoS, mix(tp.Solid.S, tp.Liquid.S, tp.Vapor.S)},
			} {
				xs, xl, xv, err := c.fn(1/v, c.e)
				if err != nil || math.Abs(xs-x[0]) > 1e-9 || math.Abs(xl-x[1]) > 1e-9 || math.Abs(xv-x[2]) > 1e-9 {
					t.Errorf("%s (rho, %s) fractions %v: got %g %g %g, %v", name, c.name, x, xs, xl, xv, err)
				}
			}
		}
		if _, _, _, err := tp.FractionsRhoU(2*tp.Solid.Rho, tp.Solid.U); !errors.Is(err, fluid.ErrOutOfRange) {
			t.Errorf("%s: denser than the solid: %v", name, err)
		}
		if _, _, _, err := tp.FractionsRhoU(math.NaN(), 0); !errors.Is(err, fluid.ErrInvalidInput) {
			t.Errorf("%s: NaN: %v", name, err)
		}
	}
}

// TestWithReference: a fluid's reference state shifts the solid as it
// shifts the fluid, so the curves and the triple point do not move.
func TestWithReference(t *testing.T) {
	t.Parallel()
	f, _ := fluid.Lookup("CO2")
	g, err := f.WithReference(fluid.RefIIR)
	if err != nil {
		t.Fatal(err)
	}
	a, _ := For(f)
	b, err := For(g)
	if err != nil {
		t.Fatal(err)
	}
	dh, ds := g.ReferenceOffsets()
	if dh == 0 && ds == 0 {
		t.Fatal("IIR offsets are zero")
	}
	ca, err1 := a.SublimationTemperature(101325)
	cb, err2 := b.SublimationTemperature(101325)
	if err1 != nil || err2 != nil || math.Abs(ca.T-cb.T) > 1e-9 ||
		math.Abs(cb.Solid.H-ca.Solid.H-dh) > 1e-6 || math.Abs(cb.Fluid.H-ca.Fluid.H-dh) > 1e-6 ||
		math.Abs(cb.Solid.S-ca.Solid.S-ds) > 1e-9 {
		t.Errorf("reference offsets: %+v vs %+v (%v %v)", ca, cb, err1, err2)
	}
	ta, _ := a.Triple()
	tb, _ := b.Triple()
	if ta.T != tb.T || ta.P != tb.P || math.Abs(tb.Solid.H-ta.Solid.H-dh) > 1e-6 {
		t.Errorf("triple with reference: %+v vs %+v", ta, tb)
	}
}
