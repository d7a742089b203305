package flash

import (
	"errors"
	"math"
	"sync"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// satNodes are points of a fluid's vapour–liquid saturation curve,
// computed once per fluid (the equation's own saturation,
// fluid.SaturationAtT) in the fluid's default reference state: the
// triple-point temperature, nSatNodes temperatures closing in on the
// critical point as (1 − i/n)², and the critical point itself. They place
// a state against the saturation curve without solving for it (HS: the
// tie lines h − T s = g(T) at the nodes; TS: the saturated entropies
// between neighbouring nodes) and give starting values near it.
//
// Along the curve T, p and s′ rise (checked when the table is built); s″
// falls for water and CO2 but not everywhere for every fluid, so no code
// relies on the order of s″.
type satNodes struct {
	T        []float64
	liq, vap []fluid.Props
	g        []float64 // h′ − T s′, J/kg
	// dsl and dhl are ds′/dT and dh′/dT along the curve at each node
	// but the last (the critical point, where they diverge), dsv ds″/dT.
	dsl, dhl, dsv []float64
	// hermiteTop is the first node above 0.995 Tc: below it liquidLine
	// interpolates the saturated liquid to 1e-7 of |h′| + RT, except in
	// the first intervals of water (4e-7); nearer the critical point the
	// slopes change too fast.
	hermiteTop int
	// hErr is, for each interval below hermiteTop, the error of
	// liquidLine's h′ at the interval's midpoint against the equation's
	// saturation there: the placement's margin next to the liquid line;
	// sErr the larger error of the interpolated s′ and s″ (TS).
	hErr, sErr []float64
	// anchors are single-phase states that start the single-phase
	// iteration of HS (anchorFor): saturated states away from the
	// critical point, the fluid on the solid curves, and a grid of
	// states above Tc and in the compressed liquid.
	anchors []fluid.Props
	err     error
}

// nSatNodes is the number of intervals of a saturation node table.
const nSatNodes = 128

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
	tt, c := f.Triple().T, f.Critical()
	var prev fluid.Saturation
	for i := 0; i <= nSatNodes; i++ {
		x := 1 - float64(i)/nSatNodes
		T := c.T - (c.T-tt)*x*x
		if i == 0 {
			T = tt
		}
		var s fluid.Saturation
		if i > 0 && i < nSatNodes {
			s, err = f.SaturationAtTFrom(T, prev.Liquid.Rho, prev.Vapor.Rho)
		} else {
			s, err = f.SaturationAtT(T)
		}
		if err != nil {
			return err
		}
		n.T = append(n.T, T)
		n.liq = append(n.liq, s.Liquid)
		n.vap = append(n.vap, s.Vapor)
		n.g = append(n.g, s.Liquid.H-T*s.Liquid.S)
		prev = s
	}
	for i := 1; i < len(n.T); i++ {
		if !(n.liq[i].S > n.liq[i-1].S && n.T[i] > n.T[i-1]) {
			return errors.New("flash: saturation nodes of " + name + " not monotone")
		}
	}
	for i := 0; i < n.last(); i++ {
		l := &n.liq[i]
		gamma := -n.lnPSlope(i) * l.P / (n.T[i] * n.T[i])
		a := fluidAlong(l, gamma)
		n.dsl = append(n.dsl, a.s)
		n.dhl = append(n.dhl, a.u+l.P*a.v+gamma/l.Rho)
		n.dsv = append(n.dsv, fluidAlong(&n.vap[i], gamma).s)
	}
	for n.hermiteTop = 0; n.hermiteTop < n.last() && n.T[n.hermiteTop] <= 0.995*c.T; n.hermiteTop++ {
	}
	for i := 0; i+1 < n.hermiteTop; i++ {
		T := 0.5 * (n.T[i] + n.T[i+1])
		s, err := f.SaturationAtTFrom(T, n.liq[i].Rho, n.vap[i].Rho)
		if err != nil {
			return err
		}
		sl, h := n.liquidLine(i, T)
		sv := n.vapourS(i, T)
		n.hErr = append(n.hErr, math.Abs(h-s.Liquid.H))
		n.sErr = append(n.sErr, max(math.Abs(sl-s.Liquid.S), math.Abs(sv-s.Vapor.S)))
	}
	n.buildAnchors(f)
	return nil
}

// hermite returns the cubic Hermite interpolant at t in [0, 1] of the
// values y0, y1 with slopes d0, d1 (per unit of the interval's length,
// already multiplied by it).
func hermite(t, y0, y1, d0, d1 float64) float64 {
	t2, t3 := t*t, t*t*t
	return (2*t3-3*t2+1)*y0 + (t3-2*t2+t)*d0 + (-2*t3+3*t2)*y1 + (t3-t2)*d1
}

// liquidLine returns the entropy and enthalpy of the saturated liquid at
// T in [T[i], T[i+1]], i+1 < last, by cubic Hermite interpolation with
// the slopes along the curve (good to about 1e-9 relative,
// TestSatNodesInterpolation).
func (n *satNodes) liquidLine(i int, T float64) (s, h float64) {
	dT := n.T[i+1] - n.T[i]
	t := (T - n.T[i]) / dT
	s = hermite(t, n.liq[i].S, n.liq[i+1].S, n.dsl[i]*dT, n.dsl[i+1]*dT)
	h = hermite(t, n.liq[i].H, n.liq[i+1].H, n.dhl[i]*dT, n.dhl[i+1]*dT)
	return s, h
}

// vapourS returns the entropy of the saturated vapour at T in [T[i],
// T[i+1]], i+1 < last, by cubic Hermite interpolation as liquidLine.
func (n *satNodes) vapourS(i int, T float64) float64 {
	dT := n.T[i+1] - n.T[i]
	return hermite((T-n.T[i])/dT, n.vap[i].S, n.vap[i+1].S, n.dsv[i]*dT, n.dsv[i+1]*dT)
}

// liquidT returns the temperature in [T[i], T[i+1]] (i+1 < last) at
// which the saturated liquid of liquidLine has entropy s, with
// s′(T[i]) ≤ s ≤ s′(T[i+1]): s′ rises along the curve.
func (n *satNodes) liquidT(i int, s float64) float64 {
	lo, hi := n.T[i], n.T[i+1]
	sl, sh := n.liq[i].S, n.liq[i+1].S
	T := lo + (hi-lo)*(s-sl)/(sh-sl)
	for it := 0; it < 60; it++ {
		v, _ := n.liquidLine(i, T)
		if v > s {
			hi = T
		} else {
			lo = T
		}
		if hi-lo <= 1e-13*hi {
			break
		}
		// The secant of the bracket's ends is good enough: s′ is
		// nearly linear in T over an interval.
		vl, _ := n.liquidLine(i, lo)
		vh, _ := n.liquidLine(i, hi)
		Tn := lo + (hi-lo)*(s-vl)/(vh-vl)
		if !(Tn > lo && Tn < hi) || !isFinite(Tn) {
			Tn = 0.5 * (lo + hi)
		}
		if math.Abs(Tn-T) <= 1e-13*T {
			return Tn
		}
		T = Tn
	}
	return T
}

// buildAnchors collects the anchor states of f: every eighth saturation
// node below 0.97 Tc (both phases; nearer the critical point their
// derivatives mislead), every sixteenth point of the solid model's
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
	for i := 0; i < len(n.T); i += 8 {
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

// vapourPressure returns the vapour pressure at T, Tt ≤ T < T of the last
// node but one, by cubic Hermite interpolation of ln p in 1/T between the
// neighbouring nodes with the Clausius–Clapeyron slopes
// dp/dT = (s″ − s′)/(v″ − v′) there: ln p is nearly linear in 1/T, and
// the interpolation is good to about 1e-8 relative
// (TestSatNodesInterpolation); ok is false next to the critical point.
func (n *satNodes) vapourPressure(T float64) (p float64, ok bool) {
	i := n.bracketT(T)
	if i+1 >= n.last() {
		return 0, false
	}
	x0, x1 := 1/n.T[i], 1/n.T[i+1]
	y0, y1 := math.Log(n.vap[i].P), math.Log(n.vap[i+1].P)
	d0, d1 := n.lnPSlope(i), n.lnPSlope(i+1)
	hx := x1 - x0
	t := (1/T - x0) / hx
	t2, t3 := t*t, t*t*t
	y := (2*t3-3*t2+1)*y0 + (t3-2*t2+t)*hx*d0 + (-2*t3+3*t2)*y1 + (t3-t2)*hx*d1
	return math.Exp(y), true
}

// lnPSlope returns d ln p/d(1/T) = −T² γ/p at node i.
func (n *satNodes) lnPSlope(i int) float64 {
	l, v := &n.liq[i], &n.vap[i]
	gamma := (v.S - l.S) / (1/v.Rho - 1/l.Rho)
	return -n.T[i] * n.T[i] * gamma / v.P
}
