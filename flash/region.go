package flash

import (
	"errors"
	"math"
	"sort"
	"strconv"
	"sync"
	"sync/atomic"

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
	// which a fluid state lies on a solid–fluid coexistence curve: a few
	// times the residual to which package sublimation solves its curves
	// (up to about 4e-12·RT, TestSolidGibbsEquality).
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
	tt, pt       float64                   // the models' triple point, K and Pa
	tp           sublimation.ThreePhase    // in the fluid's default reference state
	uIdeal       float64                   // u of the ideal gas at tt (ρ → 0), default reference, J/kg
	subT, subP   []float64                 // ascending
	meltT, meltP []float64                 // meltP ascending from pt; meltT rising (CO2) or falling (water)
	sub, melt    []sublimation.Coexistence // the curves at those points, default reference
	meltRising   bool
	// solidSMax is the largest entropy of the solid on its curves, and
	// meltSMin, meltSMax the range of the entropies of both phases on the
	// melting curve (HS: a solid state, or a solid–liquid mixture, has
	// its entropy within them), default reference state.
	solidSMax, meltSMin, meltSMax float64
	// solidRhoMin is the smallest density of the solid on its curves,
	// less 1e-3: no solid state of the model is less dense (the solid
	// expands with T and contracts with p, and its curves bound it).
	solidRhoMin float64
	// highPLo and highPHi are the pressure range of the melting curves
	// of water's high-pressure ices (sublimation.Solid.HighIceRange),
	// highTHi the temperature at their upper end; zero for dry ice.
	highPLo, highPHi, highTHi float64
	err                       error
}

// subTMin and subPMin are the low end of the sublimation curve: the
// fluid's vapour floor and the sublimation pressure there.
func (n *curveNodes) subTMin() float64 { return n.subT[0] }
func (n *curveNodes) subPMin() float64 { return n.subP[0] }

// belowSubPMin reports whether p lies below the sublimation pressure at the
// vapour floor by more than its precision, 1e-10 relative (the curve's
// pressure there, solved on different paths, differs by rounding).
func (n *curveNodes) belowSubPMin(p float64) bool { return p < n.subP[0]*(1-1e-10) }

// solidPMax is the highest pressure of a solid state of the model: the
// end of its melting curve. meltEndT is the melting temperature there.
func (n *curveNodes) solidPMax() float64 { return n.meltP[len(n.meltP)-1] }
func (n *curveNodes) meltEndT() float64  { return n.meltT[len(n.meltT)-1] }

// The node tables, one immutable table per solid model, built on first use.
var (
	co2Nodes   = sync.OnceValue(func() *curveNodes { return buildNodes("CO2") })
	waterNodes = sync.OnceValue(func() *curveNodes { return buildNodes("water") })
)

// lvTriplePressure holds, for each registered fluid without a solid
// model, its equation's own vapour pressure at the triple-point
// temperature, in Pa, computed once.
var lvTriplePressure = sync.OnceValue(func() map[string]float64 {
	m := map[string]float64{}
	for _, name := range fluid.Names() {
		f, err := fluid.Lookup(name)
		if err != nil || f.Triple().RhoSolid > 0 {
			continue
		}
		if s, err := f.SaturationAtT(f.Triple().T); err == nil {
			m[name] = s.P
		}
	}
	return m
})

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
	n.err = n.build(name)
	return n
}

func (n *curveNodes) build(name string) error {
	f, err := fluid.Lookup(name)
	if err != nil {
		return err
	}
	s, err := sublimation.For(f)
	if err != nil {
		return err
	}
	if n.tp, err = s.Triple(); err != nil {
		return err
	}
	n.tt, n.pt = n.tp.T, n.tp.P
	ig, err := f.Props(n.tt, 1e-9*n.tp.Vapor.Rho)
	if err != nil {
		return err
	}
	n.uIdeal = ig.U
	sub, err := s.SublimationCurve(nNodes)
	if err != nil {
		return err
	}
	melt, err := s.MeltingCurve(nNodes)
	if err != nil {
		return err
	}
	n.sub, n.melt = sub, melt
	n.solidSMax, n.meltSMin, n.meltSMax = math.Inf(-1), math.Inf(1), math.Inf(-1)
	n.solidRhoMin = math.Inf(1)
	for _, cs := range [2][]sublimation.Coexistence{sub, melt} {
		for _, c := range cs {
			n.solidSMax = max(n.solidSMax, c.Solid.S)
			n.solidRhoMin = min(n.solidRhoMin, c.Solid.Rho)
		}
	}
	n.solidRhoMin *= 1 - 1e-3
	for _, c := range melt {
		n.meltSMin = min(n.meltSMin, c.Solid.S, c.Fluid.S)
		n.meltSMax = max(n.meltSMax, c.Solid.S, c.Fluid.S)
	}
	// Between the nodes the curves may bulge past them a little.
	sl := 1e-3 * (n.meltSMax - n.meltSMin)
	n.solidSMax += sl
	n.meltSMin -= sl
	n.meltSMax += sl
	for _, c := range sub {
		n.subT = append(n.subT, c.T)
		n.subP = append(n.subP, c.P)
	}
	for _, c := range melt {
		n.meltT = append(n.meltT, c.T)
		n.meltP = append(n.meltP, c.P)
	}
	n.meltRising = n.meltT[len(n.meltT)-1] > n.meltT[0]
	_, n.highTHi, n.highPLo, n.highPHi = s.HighIceRange()
	for i := 1; i < len(n.subT); i++ {
		if !(n.subP[i] > n.subP[i-1] && n.subT[i] > n.subT[i-1]) {
			return errors.New("flash: sublimation curve of " + name + " not monotone")
		}
	}
	for i := 1; i < len(n.meltT); i++ {
		if !(n.meltP[i] > n.meltP[i-1]) || (n.meltT[i] > n.meltT[i-1]) != n.meltRising {
			return errors.New("flash: melting curve of " + name + " not monotone")
		}
	}
	return nil
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
	i := n.meltIndexT(T)
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
	ptLine float64 // the centre of the triple line in p (pt, or the models' own)
}

// init sets b to the solid side of f, from solidSides where f has been
// seen before.
func (b *solidSide) init(f *fluid.Fluid) {
	if c := solidSides.Load(); c != nil {
		for i := range c.n {
			if c.f[i] == f {
				*b = c.s[i]
				return
			}
		}
	}
	b.build(f)
	solidSides.add(f, b)
}

// solidSideCache holds the solid sides of the last fluids seen (a flash
// would otherwise look up its fluid's models by name on every call): up
// to len(f), replaced whole on every addition (copy on write), so that a
// lookup is a scan of a few pointers without a lock.
type solidSideCache struct {
	n int
	f [8]*fluid.Fluid
	s [8]solidSide
}

// solidSideStore publishes the current solidSideCache.
type solidSideStore struct {
	atomic.Pointer[solidSideCache]
	mu sync.Mutex
}

var solidSides solidSideStore

// add records b as the solid side of f; where the cache is full the
// oldest entry gives way.
func (st *solidSideStore) add(f *fluid.Fluid, b *solidSide) {
	st.mu.Lock()
	defer st.mu.Unlock()
	var c solidSideCache
	if old := st.Load(); old != nil {
		c = *old
	}
	if c.n == len(c.f) {
		copy(c.f[:], c.f[1:])
		copy(c.s[:], c.s[1:])
		c.n--
	}
	c.f[c.n], c.s[c.n] = f, *b
	c.n++
	st.Store(&c)
}

// build sets b to the solid side of f from its models.
func (b *solidSide) build(f *fluid.Fluid) {
	*b = solidSide{}
	t := f.Triple()
	b.tt, b.pt = t.T, t.P
	b.ptLine = b.pt
	if t.RhoSolid <= 0 {
		// No solid model (sublimation.For would only say so): the
		// liquid–vapour states end where the equation's own vapour
		// pressure curve does, at Tt, whatever the published triple-point
		// pressure Triple().P (R-134a: 389.5638 Pa against 389.6 Pa).
		if p, ok := lvTriplePressure()[f.Name()]; ok {
			b.pt, b.ptLine = p, p
		}
		return
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
	// The triple line in p is centred on the models' own triple-point
	// pressure, which the states on it carry; the stored constant agrees
	// with it to within the line's tolerance (about 7e-11).
	b.ptLine = n.pt
}

// anomalous reports whether the melting temperature falls with pressure
// (ice Ih).
func (b *solidSide) anomalous() bool { return b.ok && !b.n.meltRising }

// onTripleT and onTripleP report whether T or p lies on the triple line;
// belowTripleT and belowTripleP whether it lies below it.
func (k *call) onTripleT(T float64) bool { return math.Abs(T-k.sol.tt) <= tripleTolT*k.sol.tt }
func (k *call) onTripleP(p float64) bool {
	return math.Abs(p-k.sol.ptLine) <= tripleTolP*k.sol.ptLine
}
func (k *call) belowTripleT(T float64) bool { return T < k.sol.tt*(1-tripleTolT) }
func (k *call) belowTripleP(p float64) bool { return p < k.sol.ptLine*(1-tripleTolP) }

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
		if p > n.solidPMax()*(1+1e-12) { // (its end, to rounding)
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
	// melting curve only; above the end of that curve finish places the
	// liquid against the high-pressure ices (highIce).
	if !n.meltRising && p > n.solidPMax() {
		return vFluid, ""
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

// highIceT returns, for water at a pressure p above the end of ice Ih's
// melting curve (208.566 MPa), the lowest temperature of liquid water at
// p: the melting temperature of ice III, V, VI or VII there (IAPWS R14-08,
// sublimation.Solid.HighIceMeltingTemperature), and the ice; above the
// end of ice VII's curve (20.6 GPa) 715 K, where that curve ends (above
// 715 K no ice bounds the liquid in the model: it is accepted as far as
// the equation's range goes). ok is false where p is not above the end
// of ice Ih's melting curve (by more than 1e-9, the rounding of states
// on that curve, which the ice Ih model places) or the fluid has no
// high-pressure ices.
func (k *call) highIceT(p float64) (T float64, ice string, ok bool) {
	b := &k.sol
	if !b.ok || b.n.highPLo == 0 || !(p > b.n.highPLo*(1+1e-9)) {
		return 0, "", false
	}
	n := b.n
	if p >= n.highPHi {
		return n.highTHi, "ice VII", true
	}
	m, err := b.s.HighIceMeltingTemperature(p)
	if err != nil {
		return n.highTHi, "ice VII", true
	}
	return m.T, m.Ice, true
}

// highIce places a single-phase fluid state of water above 208.566 MPa
// against the melting curves of the high-pressure ices (highIceT), which
// bound the model: a liquid colder than the curve is an error naming the
// ice, or with a metastable fluid requested the liquid flagged
// Metastable. No flash has another fluid solution there, as h, s, u and
// p rise monotonically along the paths that lead across these curves.
func (k *call) highIce(pr *fluid.Props) (Flags, error) {
	Tm, _, ok := k.highIceT(pr.P)
	if !ok || pr.T >= Tm*(1-1e-12) {
		return 0, nil
	}
	if k.metaFluid() {
		return Metastable, nil
	}
	return 0, k.beyondError(k.beyondWhy(pr.P))
}

// highIceWhy explains a state of water beyond the melting curves of the
// high-pressure ices at p.
func (k *call) highIceWhy(p float64) string {
	Tm, ice, _ := k.highIceT(p)
	if p >= k.sol.n.highPHi {
		return "above " + fmtG(k.sol.n.highPHi) + " Pa, the end of the melting curve of ice VII (IAPWS R14-08), " +
			"liquid water is accepted only above " + fmtG(k.sol.n.highTHi) + " K; colder, ice VII and other ices " +
			"are stable, which are outside the model"
	}
	return "at " + strconv.FormatFloat(p, 'g', 6, 64) + " Pa liquid water freezes to " + ice + " below " + strconv.FormatFloat(Tm, 'f', 3, 64) +
		" K (its melting curve, IAPWS R14-08); " + ice + " and the other ices that are stable beyond it are " +
		"outside the model, which has ice Ih only, up to 208.566 MPa"
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
		// Without a solid model, below the triple point is the solid
		// region (an error wrapping fluid.ErrUndefined).
		return max(b.tt, lim.TFloor), b.tt < lim.TFloor
	}
	n := b.n
	switch {
	case p < n.pt:
		if n.belowSubPMin(p) {
			return lim.TFloor, true
		}
		lo, _ := n.subTBounds(p)
		return max(lo, lim.TFloor), false
	case p > n.solidPMax():
		if n.meltRising {
			return n.meltEndT(), false
		}
		Tm, _, _ := k.highIceT(p)
		return Tm, false
	}
	lo, _ := n.meltTBounds(p)
	return max(lo, lim.TFloor), false
}

// belowFreezing reports whether X = x at pressure p lies below the liquid
// at an upper bound of its melting temperature there (by the node
// tables), so that the state has solid or is a liquid close above the
// melting curve, for the solid paths to decide. It is false where the
// fluid has no solid model or the solid side is decided.
func (k *call) belowFreezing(p float64, X quantity, x float64) bool {
	b := &k.sol
	if !b.ok || k.decided || p < b.n.pt {
		return false
	}
	pf, err := k.f.PropsTP(k.freezeTHi(p), p, fluid.RootLiquid, 0)
	return err == nil && x < X.of(&pf)
}

// freezeTHi returns an upper bound of the melting temperature at p ≥ pt
// by the node tables (above the end of the melting curve, where it ends
// or, for water, the triple point); 0 without a solid model.
func (k *call) freezeTHi(p float64) float64 {
	b := &k.sol
	if !b.ok {
		return 0
	}
	n := b.n
	switch {
	case p > n.solidPMax() && n.meltRising:
		return n.meltEndT()
	case p > n.solidPMax():
		Tm, _, _ := k.highIceT(p)
		return Tm
	case p < n.pt:
		return b.tt
	}
	_, Th := n.meltTBounds(p)
	return Th
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
