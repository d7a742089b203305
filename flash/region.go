package flash

import (
	"errors"
	"math"
	"sort"
	"sync"

	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/sublimation"
)

// This file places states against the solid phases. The boundaries are
// the solid models' own Gibbs-equality curves (package sublimation), never
// the published auxiliary sublimation and melting equations, so that a
// state is never solid by one function and fluid by another (DESIGN.md,
// "Phase boundaries"). Each curve is monotone, so a table of its points,
// computed once per model, bounds it between neighbouring points: a state
// far from a curve is placed without solving for the curve, and a state
// between the bounds is placed by the Gibbs energies of its phases or by
// the curve itself.

// Tolerances of the triple line and the coexistence curves.
const (
	// tripleTolT and tripleTolP are the relative distances from the
	// triple-point temperature and pressure within which an input lies
	// on the triple line: the precision to which the fluid's stored
	// triple-point constants give the models' own triple point (about
	// 4e-14 in T and 7e-11 in p).
	tripleTolT = 1e-12
	tripleTolP = 1e-10
	// gibbsTol is the Gibbs-energy difference, in units of RT, within
	// which a fluid state lies on a solid–fluid coexistence curve: ten
	// times the residual to which package sublimation solves its curves
	// (at most about 1e-12·RT).
	gibbsTol = 1e-11
	// nodeSlack widens the bounds between curve nodes for the rounding
	// of the curve solutions.
	nodeSlack = 1e-9
	// nNodes is the number of points per curve in a node table.
	nNodes = 129
)

// curveNodes are points of a solid model's sublimation and melting curves,
// computed once per model: the models' triple point, the sublimation curve
// at evenly spaced temperatures from the fluid's vapour floor to the
// triple point, and the melting curve at evenly spaced pressures from the
// triple point to its end (208.566 MPa for ice Ih, 800 MPa for dry ice).
// Between neighbouring points the curves are bounded by the points, since
// each is monotone (Clausius–Clapeyron with nonzero Δh and Δv).
type curveNodes struct {
	tt, pt       float64   // the models' triple point, K and Pa
	subT, subP   []float64 // ascending
	meltT, meltP []float64 // meltP ascending from pt; meltT rising (CO2) or falling (water)
	meltRising   bool
	err          error
}

// subTMin and subPMin are the low end of the sublimation curve: the
// fluid's vapour floor and the sublimation pressure there.
func (n *curveNodes) subTMin() float64 { return n.subT[0] }
func (n *curveNodes) subPMin() float64 { return n.subP[0] }

// solidPMax is the highest pressure of a solid state of the model: the
// end of its melting curve. meltEndT is the melting temperature there.
func (n *curveNodes) solidPMax() float64 { return n.meltP[len(n.meltP)-1] }
func (n *curveNodes) meltEndT() float64  { return n.meltT[len(n.meltT)-1] }

// The node tables, one immutable table per solid model, built on first use.
var (
	co2Nodes   = sync.OnceValue(func() *curveNodes { return buildNodes("CO2") })
	waterNodes = sync.OnceValue(func() *curveNodes { return buildNodes("water") })
)

func nodesFor(f *fluid.Fluid) *curveNodes {
	switch f.Name() {
	case "CO2":
		return co2Nodes()
	case "water":
		return waterNodes()
	}
	return nil
}

func buildNodes(name string) *curveNodes {
	n := &curveNodes{}
	f, err := fluid.Lookup(name)
	if err != nil {
		n.err = err
		return n
	}
	s, err := sublimation.For(f)
	if err != nil {
		n.err = err
		return n
	}
	tp, err := s.Triple()
	if err != nil {
		n.err = err
		return n
	}
	n.tt, n.pt = tp.T, tp.P
	sub, err := s.SublimationCurve(nNodes)
	if err != nil {
		n.err = err
		return n
	}
	melt, err := s.MeltingCurve(nNodes)
	if err != nil {
		n.err = err
		return n
	}
	for _, c := range sub {
		n.subT = append(n.subT, c.T)
		n.subP = append(n.subP, c.P)
	}
	for _, c := range melt {
		n.meltT = append(n.meltT, c.T)
		n.meltP = append(n.meltP, c.P)
	}
	n.meltRising = n.meltT[len(n.meltT)-1] > n.meltT[0]
	for i := 1; i < len(n.subT); i++ {
		if !(n.subP[i] > n.subP[i-1] && n.subT[i] > n.subT[i-1]) {
			n.err = errors.New("sublimation curve not monotone")
		}
	}
	for i := 1; i < len(n.meltT); i++ {
		if !(n.meltP[i] > n.meltP[i-1]) || (n.meltT[i] > n.meltT[i-1]) != n.meltRising {
			n.err = errors.New("melting curve not monotone")
		}
	}
	return n
}

// bracket returns i with xs[i] ≤ x ≤ xs[i+1] for ascending xs, x within
// [xs[0], xs[len-1]].
func bracketIndex(xs []float64, x float64) int {
	i := sort.SearchFloat64s(xs, x) - 1
	return min(max(i, 0), len(xs)-2)
}

// subPBounds bounds the sublimation pressure at T, subT[0] ≤ T ≤ tt.
func (n *curveNodes) subPBounds(T float64) (lo, hi float64) {
	i := bracketIndex(n.subT, T)
	return n.subP[i] * (1 - nodeSlack), n.subP[i+1] * (1 + nodeSlack)
}

// subTBounds bounds the sublimation temperature at p, subP[0] ≤ p ≤ pt.
func (n *curveNodes) subTBounds(p float64) (lo, hi float64) {
	i := bracketIndex(n.subP, p)
	return n.subT[i] * (1 - nodeSlack), n.subT[i+1] * (1 + nodeSlack)
}

// meltPBounds bounds the melting pressure at T within the curve's range.
func (n *curveNodes) meltPBounds(T float64) (lo, hi float64) {
	var i int
	if n.meltRising {
		i = bracketIndex(n.meltT, T)
	} else {
		// Descending temperatures: search the reversed order.
		j := sort.Search(len(n.meltT), func(j int) bool { return n.meltT[j] < T })
		i = min(max(j-1, 0), len(n.meltT)-2)
	}
	return n.meltP[i] * (1 - nodeSlack), n.meltP[i+1] * (1 + nodeSlack)
}

// meltTBounds bounds the melting temperature at p, pt ≤ p ≤ solidPMax.
func (n *curveNodes) meltTBounds(p float64) (lo, hi float64) {
	i := bracketIndex(n.meltP, p)
	a, b := n.meltT[i], n.meltT[i+1]
	if a > b {
		a, b = b, a
	}
	return a * (1 - nodeSlack), b * (1 + nodeSlack)
}

// solidSide is what a flash knows of its fluid's solid phase.
type solidSide struct {
	ok     bool // the fluid has a solid model (and its node table)
	s      sublimation.Solid
	n      *curveNodes
	tt, pt float64 // the fluid's stored triple point (every fluid)
	tp     sublimation.ThreePhase
	haveTP bool
}

func (b *solidSide) init(f *fluid.Fluid) {
	t := f.Triple()
	b.tt, b.pt = t.T, t.P
	if t.RhoSolid <= 0 {
		return // no solid model: sublimation.For would only say so
	}
	n := nodesFor(f)
	if n == nil || n.err != nil {
		return
	}
	s, err := sublimation.For(f)
	if err != nil {
		return
	}
	b.ok, b.s, b.n = true, s, n
}

// anomalous reports whether the melting temperature falls with pressure
// (ice Ih).
func (b *solidSide) anomalous() bool { return b.ok && !b.n.meltRising }

// onTripleT and onTripleP report whether T or p lies on the triple line;
// belowTripleT and belowTripleP whether it lies below it.
func (k *call) onTripleT(T float64) bool    { return math.Abs(T-k.sol.tt) <= tripleTolT*k.sol.tt }
func (k *call) onTripleP(p float64) bool    { return math.Abs(p-k.sol.pt) <= tripleTolP*k.sol.pt }
func (k *call) belowTripleT(T float64) bool { return T < k.sol.tt*(1-tripleTolT) }
func (k *call) belowTripleP(p float64) bool { return p < k.sol.pt*(1-tripleTolP) }

// verdict is the outcome of placing a fluid state against the solid.
type verdict int8

const (
	vFluid   verdict = iota // the fluid state is stable against the solid
	vOnCurve                // on a solid–fluid coexistence curve, within gibbsTol
	vSolid                  // a state with solid is stable: the solid paths decide
	vBeyond                 // outside the solid model's range (an error)
)

// versus places the single-phase fluid state pr against the solid, by
// the node bounds and, between them, the Gibbs energies of fluid and
// solid at its (T, p): along an isotherm g_fluid − g_solid rises with p
// (its derivative is v_fluid − v_solid, of the sign of the side), so the
// fluid is stable where its Gibbs energy is the lower one. Stability
// against the other fluid phase is judged elsewhere.
func (k *call) versus(pr *fluid.Props) (verdict, string) {
	b := &k.sol
	T, p := pr.T, pr.P
	if !b.ok {
		if k.belowTripleT(T) {
			return vSolid, "below the triple-point temperature"
		}
		return vFluid, ""
	}
	n := b.n
	if !k.belowTripleT(T) {
		if !n.meltRising || p <= n.pt*(1+tripleTolP) || T > n.meltEndT() {
			// No ice Ih above Tt; no dry ice below pt or above the
			// end of its melting curve (beyond 800 MPa the melting
			// curve is not known: see doc.go).
			return vFluid, ""
		}
		if p > n.solidPMax() {
			return vBeyond, beyondCO2
		}
		lo, hi := n.meltPBounds(T)
		switch {
		case p < lo:
			return vFluid, ""
		case p > hi:
			return vSolid, ""
		}
		return k.byGibbs(pr), ""
	}
	if pr.Rho < k.f.Critical().Rho {
		// The vapour.
		lo, hi := n.subPBounds(T)
		switch {
		case p < lo:
			return vFluid, ""
		case p > hi:
			return vSolid, ""
		}
		return k.byGibbs(pr), ""
	}
	// The liquid below the triple-point temperature: ice Ih above its
	// melting curve only.
	if !n.meltRising && p > n.solidPMax() {
		return vBeyond, beyondIce
	}
	if n.meltRising || T < n.meltEndT() {
		return vSolid, ""
	}
	lo, hi := n.meltPBounds(T)
	switch {
	case p > hi:
		return vFluid, ""
	case p < lo:
		return vSolid, ""
	}
	return k.byGibbs(pr), ""
}

// byGibbs compares the Gibbs energies of the fluid state pr and the solid
// at its (T, p).
func (k *call) byGibbs(pr *fluid.Props) verdict {
	g := k.sol.s.Derivs(pr.T, pr.P)
	d := g.G - pr.G
	switch tol := gibbsTol * k.f.GasConstant() * pr.T; {
	case math.Abs(d) <= tol:
		return vOnCurve
	case d < 0:
		return vSolid
	}
	return vFluid
}

// Explanations of states outside the solid models.
const (
	beyondIce = "ice Ih is stable only up to 208.566 MPa (the ice Ih-ice III-liquid triple point, IAPWS R14-08); " +
		"above it ice II, ice III, ice V, ice VI and other ices exist, which are outside the model"
	beyondCO2 = "the state is solid above 800 MPa, the upper end of the dry-ice model " +
		"(and of the Span-Wagner equation and its melting equation)"
	belowFloor = "below the lowest temperature of the sublimation curve (the fluid's vapour floor), " +
		"where solid and vapour cannot be told apart"
)

// errSolid is returned inside package flash by the fluid paths when the
// state has solid, or may have: each flash then takes its solid path,
// which decides from the model's curves. It never leaves the package.
var errSolid = errors.New("flash: solid region")

// solidError is the error for a state in a solid region of a fluid
// without a solid model, and otherwise errSolid.
func (k *call) solidError(why string) error {
	if !k.sol.ok {
		if k.sol.tt > 0 && k.f.Triple().RhoSolid > 0 {
			return k.fail(fluid.ErrNoConvergence, "the solid model of "+k.f.Name()+" is not available")
		}
		return k.fail(fluid.ErrUndefined, "the state is solid ("+why+") and "+k.f.Name()+" has no solid model")
	}
	return errSolid
}

// beyondError is the error for a state outside the solid models.
func (k *call) beyondError(why string) error {
	return k.fail(fluid.ErrOutOfRange, "outside the models of "+k.f.Name()+": "+why)
}

// freezeT returns a lower bound of the lowest temperature at which the
// fluid is stable at pressure p: the sublimation temperature below the
// triple-point pressure, the melting temperature above it, by the node
// tables (the fluid paths then check their results with versus), or the
// fixed bound of a path whose solid side is already decided. floor is
// true where that is the lowest accepted temperature of the equation
// instead (the vapour below the sublimation pressure at the vapour floor).
func (k *call) freezeT(p float64) (T float64, floor bool) {
	lim := k.f.Limits()
	if k.fixedTlo > 0 {
		return k.fixedTlo, k.fixedTlo <= lim.TFloor
	}
	b := &k.sol
	if !b.ok {
		return max(b.tt, lim.TFloor), b.tt <= lim.TFloor
	}
	n := b.n
	switch {
	case p < n.pt:
		if p < n.subPMin() {
			return lim.TFloor, true
		}
		lo, _ := n.subTBounds(p)
		return max(lo, lim.TFloor), false
	case p > n.solidPMax():
		if n.meltRising {
			return n.meltEndT(), false
		}
		return b.tt, false
	}
	lo, _ := n.meltTBounds(p)
	return max(lo, lim.TFloor), false
}

// lowError is the error for a fluid state below the lowest fluid
// temperature at p: below the equation's accepted range, or the solid
// region.
func (k *call) lowError(floor bool) error {
	if floor {
		lim := k.f.Limits()
		return k.fail(fluid.ErrOutOfRange, "below the accepted temperature "+fmtG(lim.TFloor)+" K of "+k.f.Name())
	}
	return k.solidError("below the sublimation or melting temperature")
}

// illinois returns a root of g in [a, b], where g(a) = fa and g(b) = fb
// have opposite signs, by the Illinois variant of regula falsi, to within
// tol in the argument.
func illinois(g func(float64) float64, a, b, fa, fb, tol float64) float64 {
	side := 0
	c := a
	for it := 0; it < 200; it++ {
		cn := (a*fb - b*fa) / (fb - fa)
		if !(cn >= min(a, b) && cn <= max(a, b)) {
			cn = 0.5 * (a + b)
		}
		if it > 0 && math.Abs(cn-c) <= tol {
			return cn
		}
		c = cn
		fc := g(c)
		if fc == 0 {
			return c
		}
		if fc*fb > 0 {
			b, fb = c, fc
			if side == -1 {
				fa *= 0.5
			}
			side = -1
		} else {
			a, fa = c, fc
			if side == 1 {
				fb *= 0.5
			}
			side = 1
		}
	}
	return c
}
