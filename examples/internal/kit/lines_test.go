package kit

import (
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/sublimation"
)

func co2Chart(t *testing.T) (*Chart, sublimation.Solid) {
	t.Helper()
	f, err := fluid.Lookup("CO2")
	if err != nil {
		t.Fatal(err)
	}
	s, err := sublimation.For(f)
	if err != nil {
		t.Fatal(err)
	}
	c, err := NewChart(f, DefaultBounds(f))
	if err != nil {
		t.Fatal(err)
	}
	return c, s
}

// The solid regions are the solid model's own curves: every vertex of the
// solid–vapour region lies on sublimation's Gibbs-equality curve, and the
// triple line is the model's three-phase point.
func TestSolidRegionsFromModel(t *testing.T) {
	t.Parallel()
	c, s := co2Chart(t)
	r := c.SolidVapour(30)
	if len(r) != 60 {
		t.Fatalf("solid-vapour region has %d vertices, want 60", len(r))
	}
	for i, p := range r {
		x, err := s.SublimationPressure(p.T)
		if err != nil {
			t.Fatal(err)
		}
		want := x.Solid.H
		if i >= 30 {
			want = x.Fluid.H
		}
		if math.Abs(p.P-x.P) > 1e-9*x.P || math.Abs(p.H-want) > 1e-6 {
			t.Errorf("vertex %d at %.3f K: p %.9g h %.9g, model %.9g %.9g", i, p.T, p.P, p.H, x.P, want)
		}
	}
	sl := c.SolidLiquid(20)
	if len(sl) < 4 {
		t.Fatalf("solid-liquid region has %d vertices", len(sl))
	}
	for _, p := range sl[:len(sl)/2] {
		x, err := s.MeltingTemperature(p.P)
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(p.T-x.T) > 1e-9*x.T || math.Abs(p.H-x.Solid.H) > 1e-6 {
			t.Errorf("melting vertex at %.6g Pa: T %.9g h %.9g, model %.9g %.9g", p.P, p.T, p.H, x.T, x.Solid.H)
		}
	}
	tp, err := s.Triple()
	if err != nil {
		t.Fatal(err)
	}
	sol, liq, vap := c.Triple()
	if sol.H != tp.Solid.H || liq.H != tp.Liquid.H || vap.H != tp.Vapor.H {
		t.Errorf("triple line %v %v %v is not the model's %v", sol, liq, vap, tp)
	}
}

// No fluid point of a chart line lies where the solid model is stable,
// and every isentrope point has the isentrope's entropy (in the
// solid–vapour mixtures too).
func TestLinesRespectSolidModel(t *testing.T) {
	t.Parallel()
	c, s := co2Chart(t)
	tt := c.triple.T
	for _, T := range []float64{160, 190, 210, 216, 230, 280, 320} {
		cv := c.Isotherm(T, 60)
		if len(cv.Segs) == 0 {
			t.Fatalf("isotherm %g K: no points", T)
		}
		for _, seg := range cv.Segs {
			for _, p := range seg {
				if math.Abs(p.T-T) > 1e-9*T {
					t.Errorf("isotherm %g K has a point at %g K", T, p.T)
				}
				solid := p.Rho > 1400 // dry ice is denser than the fluid near these states
				switch {
				case T < tt && !solid:
					x, _ := s.SublimationPressure(T)
					if p.P > x.P*(1+1e-9) {
						t.Errorf("isotherm %g K: fluid at %g Pa above the model's sublimation pressure %g Pa", T, p.P, x.P)
					}
				case T > tt && !solid:
					if x, err := s.MeltingPressure(T); err == nil && p.P > x.P*(1+1e-9) {
						t.Errorf("isotherm %g K: fluid at %g Pa above the model's melting pressure %g Pa", T, p.P, x.P)
					}
				}
			}
		}
	}
	for _, sv := range []float64{-2000, -1500, -1000, -500} {
		cv := c.Isentrope(sv, 60)
		n := 0
		for _, seg := range cv.Segs {
			for _, p := range seg {
				n++
				if math.Abs(p.S-sv) > 1e-7*math.Max(1, math.Abs(sv)) {
					t.Errorf("isentrope %g: point with s = %.12g", sv, p.S)
				}
			}
		}
		if n < 20 {
			t.Errorf("isentrope %g: %d points", sv, n)
		}
	}
}

func TestChartWithoutSolid(t *testing.T) {
	t.Parallel()
	f, err := fluid.Lookup("R134a")
	if err != nil {
		t.Fatal(err)
	}
	c, err := NewChart(f, DefaultBounds(f))
	if err != nil {
		t.Fatal(err)
	}
	if c.HasSolid() || c.SolidVapour(10) != nil || c.SolidLiquid(10) != nil {
		t.Error("R134a chart has solid regions")
	}
	liq, vap := c.Dome(40)
	if len(liq.Segs) != 1 || len(liq.Segs[0]) < 30 || len(vap.Segs[0]) < 30 {
		t.Errorf("dome: %d, %d points", len(liq.Segs[0]), len(vap.Segs[0]))
	}
	if _, err := NewChart(f, Bounds{TMin: 300, TMax: 200, PMin: 1, PMax: 2}); err == nil {
		t.Error("inverted bounds: no error")
	}
	if _, err := NewChart(nil, DefaultBounds(f)); err == nil {
		t.Error("nil fluid: no error")
	}
}
