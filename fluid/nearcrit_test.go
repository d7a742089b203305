package fluid

import "testing"

// TestSaturationSmoothNearCritical: half a microkelvin below Tc, below the
// last temperature at which Newton's method resolves the saturated
// densities, SaturationAtT follows its model, so that p rises and ρ′
// falls and ρ″ rises from one temperature to the next even 0.2 nK apart
// (where Newton's solutions scatter by 3e-5 relative in density, far
// more than the 1e-7 the densities change).
func TestSaturationSmoothNearCritical(t *testing.T) {
	t.Parallel()
	for _, f := range allFluids(t) {
		var prev Saturation
		for k := range 200 {
			T := f.crit.T - 0.5e-6 + float64(k)*0.2e-9
			s, err := f.SaturationAtT(T)
			if err != nil {
				t.Fatalf("%s SaturationAtT(%v): %v", f.name, T, err)
			}
			if k > 0 && !(s.P >= prev.P && s.Liquid.Rho < prev.Liquid.Rho && s.Vapor.Rho > prev.Vapor.Rho) {
				t.Errorf("%s Tc - %.4g K: p %v -> %v, rho' %v -> %v, rho'' %v -> %v", f.name, f.crit.T-T,
					prev.P, s.P, prev.Liquid.Rho, s.Liquid.Rho, prev.Vapor.Rho, s.Vapor.Rho)
			}
			prev = s
		}
	}
}
