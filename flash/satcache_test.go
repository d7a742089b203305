package flash

import (
	"fmt"
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// bandCase is one flash call near the saturation curve, with the phase
// the equation's own saturation gives its inputs (Unknown: not asserted).
type bandCase struct {
	fc   flashCase
	a, b float64
	want Phase
}

// bandOffsets are relative offsets from saturated values: inside the
// cached curve's bounds (1e-12, 1e-9: there the equation's saturation
// decides) and outside them (1e-6).
var bandOffsets = []float64{-1e-6, -1e-9, -1e-12, 1e-12, 1e-9, 1e-6}

// bandTemperatures are saturation temperatures that put inputs on every
// kind of ground of the cached curve: the triple point, the body of the
// curve, the last interval below its end at Tc − 1 mK, and the last
// millikelvin below Tc, where it gives no estimates. For R-134a, whose
// stored triple-point pressure (the published 389.6 Pa) lies above its
// equation's vapour pressure at the triple-point temperature (389.56 Pa),
// the triple point is the saturation at the stored pressure.
func bandTemperatures(t *testing.T, f *fluid.Fluid) []float64 {
	tp, tc := f.Triple(), f.Critical().T
	tt := tp.T
	if s, err := f.SaturationAtT(tt); err != nil || s.P < tp.P*(1-1e-9) {
		s, err := f.SaturationAtP(tp.P)
		if err != nil {
			t.Fatal(err)
		}
		tt = s.T
	}
	return []float64{tt, tt + 1e-3, tt + 0.3*(tc-tt), tt + 0.7*(tc-tt), tc - 0.1,
		tc - 1.2e-3, tc - 5e-4, tc - 1e-4}
}

// bandCases returns the calls near the saturation s: PT a hair above and
// below the vapour pressure, PH and PS a hair either side of each
// saturated phase's h and s (offsets in units of the latent difference),
// DT and PD a hair either side of each saturated density, and DU at the
// states DT gives there.
func bandCases(t *testing.T, f *fluid.Fluid, s *fluid.Saturation, strict bool) []bandCase {
	t.Helper()
	fc := map[string]flashCase{}
	for _, c := range flashCases {
		fc[c.name] = c
	}
	ptCase := flashCase{"PT", "p", "T", PTWith}
	want := func(p Phase) Phase {
		if strict {
			return p
		}
		return Unknown
	}
	var cs []bandCase
	l, v := &s.Liquid, &s.Vapor
	for _, d := range bandOffsets {
		loud := math.Abs(d) >= 1e-9 // outside the equation's own scatter
		side := func(below, above Phase) Phase {
			if !loud {
				return Unknown
			}
			if d < 0 {
				return want(below)
			}
			return want(above)
		}
		cs = append(cs, bandCase{ptCase, s.P * (1 + d), s.T, side(Vapor, Liquid)})
		dh, ds := v.H-l.H, v.S-l.S
		cs = append(cs,
			bandCase{fc["PH"], s.P, l.H + d*dh, side(Liquid, TwoPhase)},
			bandCase{fc["PH"], s.P, v.H + d*dh, side(TwoPhase, Vapor)},
			bandCase{fc["PS"], s.P, l.S + d*ds, side(Liquid, TwoPhase)},
			bandCase{fc["PS"], s.P, v.S + d*ds, side(TwoPhase, Vapor)},
			bandCase{fc["DT"], l.Rho * (1 + d), s.T, side(TwoPhase, Liquid)},
			bandCase{fc["DT"], v.Rho * (1 + d), s.T, side(Vapor, TwoPhase)},
			bandCase{fc["PD"], s.P, l.Rho * (1 + d), side(TwoPhase, Liquid)},
			bandCase{fc["PD"], s.P, v.Rho * (1 + d), side(Vapor, TwoPhase)},
		)
		for _, rho := range []float64{l.Rho * (1 + d), v.Rho * (1 + d)} {
			// Along an isochore through a saturated state, T changes
			// with u so little near Tc that states either side of the
			// crossing agree to rounding: the phase only for 1e-6.
			if st, err := DT(f, rho, s.T); err == nil {
				ph := Unknown
				if math.Abs(d) >= 1e-6 {
					ph = want(st.Phase)
				}
				cs = append(cs, bandCase{fc["DU"], rho, st.U, ph})
			}
		}
	}
	return cs
}

// TestCacheBandRoundTrip puts the inputs of PT, PH, PS, DT, PD and DU a
// hair either side of the saturation curve, where the cached curve's
// bounds leave the decision to the equation's own saturation (offsets of
// 1e-12 and 1e-9) and just outside them (1e-6), at the triple point, over
// the body of the curve, in its last interval and within a millikelvin of
// Tc (down to Tc − 0.1 mK). Every call must succeed (PD of water's liquid
// below its density maximum may not, see PD), reproduce its inputs within the backward
// residual floors of DESIGN.md, and, where the offset exceeds the
// equation's own scatter (1e-9 and more, away from Tc), return the phase
// the equation's saturation gives: the stable root or phase on each side.
func TestCacheBandRoundTrip(t *testing.T) {
	t.Parallel()
	for _, f := range fluids(t) {
		tc := f.Critical().T
		n := 0
		ts := bandTemperatures(t, f)
		for _, T := range ts {
			s, err := f.SaturationAtT(T)
			if err != nil {
				t.Fatalf("%s SaturationAtT(%v): %v", f.Name(), T, err)
			}
			if tp := f.Triple(); T == ts[0] && s.P < tp.P {
				// R-134a's triple point is the saturation at its stored
				// pressure (bandTemperatures), and the vapour pressure at
				// its temperature may round below that pressure, where
				// the fluid has no liquid: the saturation at the stored
				// pressure itself.
				if s, err = f.SaturationAtP(tp.P); err != nil {
					t.Fatalf("%s SaturationAtP(%v): %v", f.Name(), tp.P, err)
				}
			}
			// Within 0.1 K of Tc (and at the triple point, where the
			// solid joins) the phases are left to the other tests.
			strict := tc-T >= 0.1 && T > ts[0]
			liquid := single(&s.Liquid, Liquid)
			for _, c := range bandCases(t, f, &s, strict) {
				if c.fc.name == "DU" && tc-T < 2e-4 {
					// In the last 0.2 mK DU reproduces u only to the
					// scatter of the equation's near-critical saturation
					// (TestDUNearCritical), for water up to 2e-9·R·Tc:
					// beyond the floors checked here.
					continue
				}
				what := fmt.Sprintf("%s(%s = %.17g, %s = %.17g) at T_sat = %v", c.fc.name, c.fc.a, c.a, c.fc.b, c.b, T)
				st, err := c.fc.fn(f, c.a, c.b, Options{})
				if err != nil {
					if c.fc.name == "PD" && nonUnique(f, &liquid) {
						// Water's liquid below its density maximum,
						// where PD does not fix the state.
						continue
					}
					t.Errorf("%s %s: %v", f.Name(), what, err)
					continue
				}
				n++
				if !checkState(t, f, what, &st) {
					continue
				}
				checkInputs(t, f, what, &st, c.fc, c.a, c.b)
				if c.want != Unknown && st.Phase != c.want {
					t.Errorf("%s %s: phase %v (T = %v, q = %v), want %v", f.Name(), what, st.Phase, st.T, st.Quality, c.want)
				}
			}
		}
		t.Logf("%s: %d calls near the saturation curve", f.Name(), n)
	}
}

// TestCachePTRoot checks that PT's root decided by the cached curve is
// the equation's own root on that branch (fluid.PropsTP), a hair outside
// the cached bounds and far from them, over the whole curve: the
// densities agree as far as the tolerance of the iterations on p fixes
// ρ (twice qP.tol over (∂p/∂ρ)_T: loose near Tc, where p hardly changes
// with ρ).
func TestCachePTRoot(t *testing.T) {
	t.Parallel()
	for _, f := range fluids(t) {
		lo, hi := f.SaturationEstimateRange()
		for i := 0; i <= 20; i++ {
			T := lo + (hi-lo)*float64(i)/20
			if i == 0 && f.Triple().RhoSolid > 0 {
				continue // above the vapour pressure at Tt: the solid
			}
			e, ok := f.SaturationEstimateAtT(T)
			if !ok {
				t.Fatalf("%s: no estimate at %v", f.Name(), T)
			}
			for _, k := range []float64{-0.5, -2e-3, -1.01 * e.Err.P / e.P, 1.01 * e.Err.P / e.P, 2e-3, 3} {
				p := e.P * (1 + k)
				st, err := PT(f, p, T)
				if err != nil {
					t.Errorf("%s PT(%v, %v): %v", f.Name(), p, T, err)
					continue
				}
				root := fluid.RootLiquid
				if k < 0 {
					root = fluid.RootVapor
				}
				want, err := f.PropsTP(T, p, root, 0)
				if err != nil || want.Flags&Metastable != 0 {
					t.Errorf("%s PT(%v, %v): the equation's root: %+v, %v", f.Name(), p, T, want, err)
					continue
				}
				// ρ as far as the tolerance of the iterations on p
				// fixes it (qP.tol, 1/100 of the floor of DESIGN.md;
				// near Tc p hardly changes with ρ).
				tol := 1e-14*want.Rho + 2*qP.tol(f, &want, p)/want.DpDrho
				if math.Abs(st.Rho-want.Rho) > tol {
					t.Errorf("%s PT(%v, %v): rho = %v, the equation's root %v", f.Name(), p, T, st.Rho, want.Rho)
				}
			}
		}
	}
}
