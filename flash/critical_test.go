package flash

import (
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// TestCriticalState checks every flash that can be given exactly the
// critical point (Tc, pc, ρc) = Critical(): TQ(Tc, q) and PQ(pc, q) for
// q = 0, 1/2, 1, and DT(ρc, Tc). Each returns the critical state,
// flagged AtCritical, with the values of fluid.Props there: cp = +Inf;
// with nonanalytic terms cv = +Inf and w = 0, without them (R-134a)
// finite cv and w. TQ and PQ flag it Saturated and name it Liquid,
// TwoPhase or Vapor by q; DT names it Vapor (at Tc and pc the state is
// not above the vapour pressure, and not Supercritical, which needs
// T > Tc and p > pc).
func TestCriticalState(t *testing.T) {
	for _, f := range fluids(t) {
		c := f.Critical()
		pr, err := f.Props(c.T, c.Rho)
		if err != nil || pr.Flags&AtCritical == 0 {
			t.Fatalf("%s Props at Critical(): %+v, %v", f.Name(), pr, err)
		}
		type flash struct {
			name string
			st   State
			err  error
			ph   Phase
			sat  bool
		}
		var cases []flash
		for _, q := range []float64{0, 0.5, 1} {
			ph := TwoPhase
			switch q {
			case 0:
				ph = Liquid
			case 1:
				ph = Vapor
			}
			st, err := TQ(f, c.T, q)
			cases = append(cases, flash{"TQ", st, err, ph, true})
			st, err = PQ(f, c.P, q)
			cases = append(cases, flash{"PQ", st, err, ph, true})
		}
		st, err := DT(f, c.Rho, c.T)
		cases = append(cases, flash{"DT", st, err, Vapor, false})
		for _, k := range cases {
			st := k.st
			if k.err != nil {
				t.Errorf("%s %s at the critical point: %v", f.Name(), k.name, k.err)
				continue
			}
			want := AtCritical
			if k.sat {
				want |= Saturated
			}
			if st.Phase != k.ph || st.Flags != want || st.T != c.T || st.P != c.P || st.Rho != c.Rho ||
				st.H != pr.H || st.S != pr.S || st.U != pr.U || !math.IsInf(st.Cp, 1) {
				t.Errorf("%s %s at the critical point: %+v", f.Name(), k.name, st)
			}
			if st.Cv != pr.Cv || st.W != pr.W {
				t.Errorf("%s %s at the critical point: cv = %v, w = %v; Props %v, %v", f.Name(), k.name, st.Cv, st.W, pr.Cv, pr.W)
			}
			if f.HasNonAnalytic() != (math.IsInf(st.Cv, 1) && st.W == 0) {
				t.Errorf("%s %s at the critical point: cv = %v, w = %v", f.Name(), k.name, st.Cv, st.W)
			}
			if !f.HasNonAnalytic() && !(st.Cv > 0 && st.W > 0 && !math.IsInf(st.Cv, 0) && !math.IsInf(st.W, 0)) {
				t.Errorf("%s %s at the critical point: cv = %v, w = %v; want finite", f.Name(), k.name, st.Cv, st.W)
			}
		}
	}
}

// TestPhaseNearCritical checks the phase names against Critical() where
// R-134a's equation differs from its reducing point: between the
// reducing temperature 374.18 K and the equation's critical temperature
// the fluid is two-phase below pc (TQ works there), PT gives Liquid just
// above the equation's vapour pressure and Vapor just below it, on the
// stable root (denser than ρ′, lighter than ρ″), never Supercritical;
// Supercritical needs T > Tc and p > pc, and is given on either side of
// the critical point's floating-point neighbours.
func TestPhaseNearCritical(t *testing.T) {
	f, err := fluid.Lookup("R134a")
	if err != nil {
		t.Fatal(err)
	}
	tr, _ := f.Reducing()
	c := f.Critical()
	for _, T := range []float64{tr - 0.01, tr, tr + 0.01, tr + 0.02, tr + 0.03, c.T - 1e-4, c.T - 1e-7} {
		s, err := f.SaturationAtT(T)
		if err != nil {
			t.Fatal(err)
		}
		if st, err := TQ(f, T, 0.5); err != nil || st.Phase != TwoPhase {
			t.Errorf("TQ(%v, 0.5) = %v, %v", T, st.Phase, err)
		}
		for _, rel := range []float64{-1e-3, -1e-6, 1e-6, 1e-3} {
			p := s.P * (1 + rel)
			st, err := PT(f, p, T)
			if err != nil {
				t.Errorf("PT(%v, %v): %v", p, T, err)
				continue
			}
			if rel > 0 && (st.Phase != Liquid || !(st.Rho > s.Liquid.Rho)) ||
				rel < 0 && (st.Phase != Vapor || !(st.Rho < s.Vapor.Rho)) {
				t.Errorf("PT(psat(1%+g), %v): %v at rho = %v; saturated %v, %v", rel, T, st.Phase, st.Rho, s.Liquid.Rho, s.Vapor.Rho)
			}
		}
	}
	above, below := math.Nextafter(c.T, 1000), math.Nextafter(c.T, 0)
	pUp, pDown := math.Nextafter(c.P, math.Inf(1)), math.Nextafter(c.P, 0)
	for _, k := range []struct {
		p, T float64
		want Phase
	}{
		{pUp, above, Supercritical}, {1.01 * c.P, c.T + 0.01, Supercritical},
		{pDown, above, Vapor}, {0.99 * c.P, c.T + 0.01, Vapor},
		{pUp, c.T, Liquid}, {pUp, below, Liquid}, {1.01 * c.P, tr + 0.01, Liquid},
	} {
		st, err := PT(f, k.p, k.T)
		if err != nil || st.Phase != k.want {
			t.Errorf("PT(%.17g Pa, %.17g K) = %v, %v; want %v", k.p, k.T, st.Phase, err, k.want)
		}
	}
}
