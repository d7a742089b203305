package flash

import (
	"errors"
	"math"
	"sync"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// satNodes are points of a fluid's vapour–liquid saturation curve, in the
// fluid's default reference state: the nodes of the fluid's cached curve
// (fluid.SaturationEstimateNodes: the equation's own saturation there, to
// rounding), from the triple point to Tc − 1 mK, and the critical point
// itself. They place a state against the saturation curve without
// solving for it (HS: the tie lines h − T s = g(T) at the nodes; TS) and
// give starting values near it; between the nodes the saturated values
// and the bounds of their errors come from the cached curve (liquidLine,
// entropies, liquidAtS, vapourPressure: fluid.SatPoint).
//
// Along the curve T, p and s′ rise (checked when the table is built); s″
// falls for water and CO2 but not everywhere for every fluid, so no code
// relies on the order of s″.
type satNodes struct {
	f        *fluid.Fluid // the fluid in its default reference state
	T        []float64
	liq, vap []fluid.Props
	g        []float64 // h′ − T s′, J/kg
	// dsl is ds′/dT along the curve at each node but the last (the
	// critical point, where it diverges).
	dsl []float64
	// placeTop is the first node above 0.995 Tc: below it the saturated
	// liquid's line places (h, s) next to it (placeLV, tsByNodes);
	// nearer the critical point the mixture solve decides.
	placeTop int
	// anchors are single-phase states that start the single-phase
	// iteration of HS (anchorFor): saturated states away from the
	// critical point, the fluid on the solid curves, and a grid of
	// states above Tc and in the compressed liquid.
	anchors []fluid.Props
	err     error
}

// satTables holds the node table of every fluid of the registry, each
// built on first use.
var satTables = sync.OnceValue(func() map[string]*lazySat {
	m := map[string]*lazySat{}
	for _, n := range fluid.Names() {
		m[n] = &lazySat{name: n}
	}
	return m
})

type lazySat struct {
	name string
	once sync.Once
	n    *satNodes
}

// satNodesFor returns the saturation node table of f, or nil where it
// cannot be built.
func satNodesFor(f *fluid.Fluid) *satNodes {
	l := satTables()[f.Name()]
	if l == nil {
		return nil
	}
	l.once.Do(func() { l.n = buildSatNodes(l.name) })
	if l.n.err != nil {
		return nil
	}
	return l.n
}

func buildSatNodes(name string) *satNodes {
	n := &satNodes{}
	n.err = n.build(name)
	return n
}

func (n *satNodes) build(name string) error {
	f, err := fluid.Lookup(name)
	if err != nil {
		return err
	}
	n.f = f
	c := f.Critical()
	ts := f.SaturationEstimateNodes(nil)
	if len(ts) < 2 {
		return errors.New("flash: no cached saturation curve of " + name)
	}
	for _, T := range ts {
		sp, ok := f.SaturationPointAtT(T)
		if !ok {
			return errors.New("flash: no saturation at a node of the cached curve of " + name)
		}
		l, v := sp.Liquid(), sp.Vapor()
		n.T = append(n.T, T)
		n.liq = append(n.liq, l)
		n.vap = append(n.vap, v)
		n.g = append(n.g, l.H-T*l.S)
		n.dsl = append(n.dsl, sp.Slope(fluid.SatLiquidS))
	}
	s, err := f.SaturationAtT(c.T)
	if err != nil {
		return err
	}
	n.T = append(n.T, c.T)
	n.liq = append(n.liq, s.Liquid)
	n.vap = append(n.vap, s.Vapor)
	n.g = append(n.g, s.Liquid.H-c.T*s.Liquid.S)
	for i := 1; i < len(n.T); i++ {
		if !(n.liq[i].S > n.liq[i-1].S && n.T[i] > n.T[i-1]) {
			return errors.New("flash: saturation nodes of " + name + " not monotone")
		}
	}
	for n.placeTop = 0; n.placeTop < n.last() && n.T[n.placeTop] <= 0.995*c.T; n.placeTop++ {
	}
	n.buildAnchors(f)
	return nil
}

// liquidLine returns the entropy and enthalpy of the saturated liquid at
// T, Tt ≤ T ≤ Tc − 1 mK, from the cached curve, and the bound of the
// enthalpy's error (TestSatCurveBounds).
func (n *satNodes) liquidLine(T float64) (s, h, errH float64) {
	sp, _ := n.f.SaturationPointAtT(T)
	s, _ = sp.Value(fluid.SatLiquidS)
	h, errH = sp.Value(fluid.SatLiquidH)
	return s, h, errH
}

// entropies returns the entropies of the saturated liquid and vapour at
// T from the cached curve and the larger bound of their errors; ok is
// false outside Tt ≤ T ≤ Tc − 1 mK.
func (n *satNodes) entropies(T float64) (sl, sv, errS float64, ok bool) {
	sp, ok := n.f.SaturationPointAtT(T)
	if !ok {
		return 0, 0, 0, false
	}
	sl, el := sp.Value(fluid.SatLiquidS)
	sv, ev := sp.Value(fluid.SatVaporS)
	return sl, sv, max(el, ev), true
}

// liquidAtS returns the temperature in [T[i], T[i+1]] (i+1 < last) at
// which the saturated liquid has entropy s, s′(T[i]) ≤ s ≤ s′(T[i+1]) (s′
// rises along the curve), by the cached curve, and the enthalpy of the
// saturated liquid there with the bound of its error, that of the
// temperature included.
func (n *satNodes) liquidAtS(i int, s float64) (T, h, errH float64) {
	var buf [2]fluid.SatPoint
	if xs := n.f.SaturationPointsWhere(fluid.SatLiquidS, s, buf[:0]); len(xs) > 0 {
		T, _ = xs[0].Temperature()
		h, errH = xs[0].Value(fluid.SatLiquidH)
	} else {
		// At an end of the curve, to rounding: the node's.
		T = n.T[i]
		if s >= n.liq[i+1].S {
			T = n.T[i+1]
		}
		_, h, errH = n.liquidLine(T)
	}
	return min(max(T, n.T[i]), n.T[i+1]), h, errH
}

// anchorStride is the step in the saturation nodes between anchors:
// the cached curve holds a node every 0.001 in 1 − T/Tc away from the
// critical point, and anchorFor, which tries every anchor, needs no more
// than one every 0.05 or so.
const anchorStride = 48

// buildAnchors collects the anchor states of f: saturation nodes below
// 0.97 Tc about 0.05 apart in 1 − T/Tc (anchorStride; both phases;
// nearer the critical point their derivatives mislead), every sixteenth point of the solid model's
// curves (the fluid phase), and states on a grid above Tc (1.05 to 4.5 Tc,
// 0.02 to 3 ρc) and of the compressed fluid (0.1 to 100 times the
// published pressure limit, up to the accepted one), where the equation
// accepts them.
func (n *satNodes) buildAnchors(f *fluid.Fluid) {
	c := f.Critical()
	lim := f.Limits()
	add := func(pr fluid.Props, err error) {
		if err == nil && finiteProps(&pr) && pr.Cv > 0 {
			n.anchors = append(n.anchors, pr)
		}
	}
	for i := 0; i < len(n.T); i += anchorStride {
		if n.T[i] <= 0.97*c.T {
			n.anchors = append(n.anchors, n.liq[i], n.vap[i])
		}
	}
	if cn := nodesFor(f); cn != nil && cn.err == nil {
		for i := 0; i < len(cn.sub); i += 16 {
			n.anchors = append(n.anchors, cn.sub[i].Fluid)
		}
		for i := 0; i < len(cn.melt); i += 16 {
			n.anchors = append(n.anchors, cn.melt[i].Fluid)
		}
	}
	for _, x := range []float64{1.05, 1.2, 1.5, 2, 3, 4.5} {
		T := x * c.T
		if T > lim.TCeil {
			break
		}
		for _, d := range []float64{0.02, 0.1, 0.3, 0.6, 1, 1.5, 2, 2.5, 3} {
			pr, err := f.Props(T, d*c.Rho)
			if err == nil && pr.P <= lim.PMax {
				add(pr, nil)
			}
		}
	}
	tt := n.T[0]
	for _, T := range []float64{tt, tt + 0.4*(0.9*c.T-tt), tt + 0.8*(0.9*c.T-tt), 1.5 * c.T, 3 * c.T} {
		for _, x := range []float64{0.1, 0.3, 1, 3, 10, 30, 100} {
			if p := x * lim.PMax; p <= lim.PCeil && T <= lim.TCeil {
				add(f.PropsTP(T, p, fluid.RootStable, 0))
			}
		}
	}
}

// anchorFor returns the anchor states nearest to (hd, sd) in the default
// reference state by the size of the linear step from them in (T, ln ρ)
// (stepHS): on the side sd2 of ρc the nearest, or for anySide the
// nearest of the rarefied (ρ < ρc) and of the dense anchors, as the step
// size compares gases and liquids badly (a gas's h and s are nearly
// linear in T and ln ρ over long steps, a liquid's are not); nil if none.
// extra, if not nil, is a further candidate.
func (n *satNodes) anchorFor(hd, sd float64, sd2 side, c fluid.Point, extra *fluid.Props) (best, second *fluid.Props) {
	costs := [2]float64{math.Inf(1), math.Inf(1)}
	var picks [2]*fluid.Props
	for i := -1; i < len(n.anchors); i++ {
		a := extra
		if i >= 0 {
			a = &n.anchors[i]
		} else if a == nil {
			continue
		}
		dense := a.Rho >= c.Rho
		if sd2 == liquidSide && !dense || sd2 == vaporSide && dense {
			continue
		}
		dT, dy, ok := stepHS(a, hd-a.H, sd-a.S)
		if !ok {
			continue
		}
		j := 0
		if dense {
			j = 1
		}
		if cost := max(math.Abs(dT)/a.T, 0.5*math.Abs(dy)); cost < costs[j] {
			picks[j], costs[j] = a, cost
		}
	}
	if picks[0] == nil {
		return picks[1], nil
	}
	return picks[0], picks[1]
}

// last returns the index of the last node (the critical point).
func (n *satNodes) last() int { return len(n.T) - 1 }

// bracketT returns i with T[i] ≤ T ≤ T[i+1], for T within the table.
func (n *satNodes) bracketT(T float64) int { return bracketIndex(n.T, T) }

// vapourPressure returns the vapour pressure at T and the bound of its
// error from the cached curve; ok is false outside Tt ≤ T ≤ Tc − 1 mK.
func (n *satNodes) vapourPressure(T float64) (p, errP float64, ok bool) {
	return n.f.VaporPressureEstimate(T)
}
