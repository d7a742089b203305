package flash

import (
	"math"
	"testing"
)

// TestSatNodes proves what HS's and TS's placement relies on. The nodes
// are the cached curve's estimates at its nodes, within their bounds of
// the equation's own saturation there (SaturationAtT; near Tc the
// equation fixes its saturation only to a scatter, which the bounds
// include), monotone in T and s′, and end at the critical point.
// Between them, at points of every interval, the cached curve's values
// the placement reads (the saturated liquid's h and s, the vapour's s,
// the vapour pressure) lie within their bounds of the equation's
// saturation there, and liquidAtS inverts s′ within 1e-9·T (its h within
// its bound).
func TestSatNodes(t *testing.T) {
	t.Parallel()
	for _, f := range fluids(t) {
		n := satNodesFor(f)
		if n == nil {
			t.Fatalf("%s: no saturation nodes", f.Name())
		}
		c := f.Critical()
		if n.T[n.last()] != c.T || n.placeTop < n.last()/2 || n.placeTop > n.last() {
			t.Fatalf("%s: last node %v K (Tc %v), placeTop %d of %d", f.Name(), n.T[n.last()], c.T, n.placeTop, n.last())
		}
		dh, ds := f.ReferenceOffsets()
		for i := 0; i < n.last(); i++ {
			T := n.T[i]
			s, err := f.SaturationAtT(T)
			if err != nil {
				t.Fatal(err)
			}
			e, _ := f.SaturationEstimateAtT(T)
			l, v := &n.liq[i], &n.vap[i]
			for _, q := range []struct {
				name            string
				node, eq, bound float64
			}{{"p", l.P, s.P, e.Err.P}, {"rho'", l.Rho, s.Liquid.Rho, e.Err.Liquid.Rho}, {"rho''", v.Rho, s.Vapor.Rho, e.Err.Vapor.Rho},
				{"h'", l.H + dh, s.Liquid.H, e.Err.Liquid.H}, {"h''", v.H + dh, s.Vapor.H, e.Err.Vapor.H},
				{"s'", l.S + ds, s.Liquid.S, e.Err.Liquid.S}, {"s''", v.S + ds, s.Vapor.S, e.Err.Vapor.S}} {
				if !(math.Abs(q.node-q.eq) <= q.bound) {
					t.Errorf("%s node %d at %v K: %s = %v, the equation's %v, bound %v", f.Name(), i, T, q.name, q.node, q.eq, q.bound)
				}
			}
			if i+1 == n.last() {
				continue
			}
			for _, x := range []float64{0.2, 0.5, 0.8} {
				T := n.T[i] + x*(n.T[i+1]-n.T[i])
				s, err := f.SaturationAtT(T)
				if err != nil {
					t.Fatal(err)
				}
				sl, hl, errH := n.liquidLine(T)
				ssl, ssv, errS, ok := n.entropies(T)
				ps, errP, okp := n.vapourPressure(T)
				if !ok || !okp || sl != ssl || math.Abs(hl+dh-s.Liquid.H) > errH ||
					math.Abs(sl+ds-s.Liquid.S) > errS || math.Abs(ssv+ds-s.Vapor.S) > errS || math.Abs(ps-s.P) > errP {
					t.Errorf("%s at %v K: h' %v +- %v, s' %v, s'' %v +- %v, p %v +- %v; the equation's %v, %v, %v, %v",
						f.Name(), T, hl+dh, errH, sl+ds, ssv+ds, errS, ps, errP, s.Liquid.H, s.Liquid.S, s.Vapor.S, s.P)
				}
				Tl, h2, errH2 := n.liquidAtS(i, sl)
				if math.Abs(Tl-T) > 1e-9*T || math.Abs(h2+dh-s.Liquid.H) > errH2 {
					t.Errorf("%s: liquidAtS(%v) = %v K, h' %v +- %v; want %v K, %v", f.Name(), sl, Tl, h2+dh, errH2, T, s.Liquid.H)
				}
			}
		}
	}
}
