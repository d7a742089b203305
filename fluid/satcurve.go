package fluid

import (
	"errors"
	"math"
	"sync"

	"github.com/tripoint-thermo/tripoint/internal/elem"
)

// This file holds a cached representation of a fluid's own vapour–liquid
// saturation curve, for placing states against it and for starting the
// equation's saturation and single-phase solvers. It never gives a
// result: every result of tripoint comes from the equation of state.

// satCurveHolder builds a fluid's cached saturation curve once, on first
// use. Lookup creates one per fluid; copies made by WithReference share
// it (the cache is stored without reference-state offsets, which the
// accessors add). It is never copied by value.
type satCurveHolder struct {
	once  sync.Once
	curve *satCurve // nil where the build failed
}

// satCurve is the saturation curve of an equation of state between its
// triple point and Tc − critBand (Tc = Critical().T), as piecewise-cubic
// Hermite interpolants of
//
//	ln p, ln ρ′, ln ρ″, h′, h″, s′, s″, u′, u″
//
// with their exact slopes along the curve at the nodes (Clausius–Clapeyron
// for p; see satSlopes for the phases). In each interval every quantity
// is cubic in the one of three coordinates — T, y = 1/T (in which ln p is
// nearly linear) or x = ln θ, θ = 1 − T/Tc (in which the power laws
// θ^β of the densities and energies near the critical point are nearly
// linear) — that follows it best there, and its error is bounded: both
// are measured against the equation's own saturation between the nodes
// when the curve is built (see satCurveSafety). Each interpolant is
// stored as the coefficients of its cubic in the position s ∈ [0, 1]
// within the interval in its coordinate (satPoly), which the estimates
// evaluate as the build measured them. Values are in the equation's
// default reference state. The curve is immutable once built.
type satCurve struct {
	nodes []satNode
	ivs   []satInterval // ivs[i] is the interval nodes[i]..nodes[i+1]
	lnp   []float64     // ln p of the nodes, ascending (for the search in p)
	ts    []float64     // T of the nodes, ascending
	tIdx  nodeIndex     // of ts
	pIdx  nodeIndex     // of lnp
	tc    float64       // Critical().T
	// segs[q] splits the intervals into runs along which quantity q
	// rises or falls with T (node values and slopes) and single
	// intervals between them (satSegment), for the search of a value.
	segs [nSatQ][]satSegment
}

// satSegment is the intervals a ≤ i < b of a cached curve: a run along
// which a quantity rises (m = +1) or falls (m = −1) with T, node values
// and slopes, or (m = 0) a single interval where it does neither.
type satSegment struct {
	a, b int
	m    int8
}

// Indices of the interpolated quantities.
const (
	sqLnP = iota // ln p
	sqLnRhoL
	sqLnRhoV
	sqHL
	sqHV
	sqSL
	sqSV
	sqUL
	sqUV
	nSatQ
)

// The coordinates of the interpolants.
const (
	coordT = iota // T
	coordY        // 1/T
	coordX        // ln(1 − T/Tc)
	nCoord
)

// satNode is one node of the curve: T, the interpolated quantities v and
// their derivatives d with T along the curve, and the saturated phases'
// properties that start solvers (SatStart: interpolated linearly, without
// bounds).
type satNode struct {
	T     float64
	u     [nCoord]float64 // T in each coordinate
	tu    [nCoord]float64 // dT/du in each coordinate
	v, d  [nSatQ]float64
	start [2]SatStart // liquid, vapour
}

// satInterval is what the curve knows of one interval: the coordinate of
// each interpolant, its cubic there and the bound of its error, in the
// quantity's own units (ln p and ln ρ: relative, stored as e^err − 1).
type satInterval struct {
	coord   [nSatQ]uint8
	poly    [nSatQ]satPoly
	err     [nSatQ]float64
	h, hinv [nCoord]float64 // the width in each coordinate and its inverse
}

// satPoly is a cubic in the position s ∈ [0, 1] within an interval in
// one coordinate: c[0] + s(c[1] + s(c[2] + s·c[3])).
type satPoly [4]float64

// hermitePoly returns the cubic Hermite interpolant of the values v0 at
// s = 0 and v1 at s = 1 with the slopes m0 and m1 in s there.
func hermitePoly(v0, m0, v1, m1 float64) satPoly {
	return satPoly{v0, m0, 3*(v1-v0) - 2*m0 - m1, 2*(v0-v1) + m0 + m1}
}

// at returns the cubic at s.
func (p *satPoly) at(s float64) float64 { return p[0] + s*(p[1]+s*(p[2]+s*p[3])) }

// ds returns the derivative of the cubic with s at s.
func (p *satPoly) ds(s float64) float64 { return p[1] + s*(2*p[2]+s*3*p[3]) }

// polyOf returns the cubic of quantity q in coordinate k over interval i
// of c.
func (c *satCurve) polyOf(i, q, k int) satPoly {
	a, b := &c.nodes[i], &c.nodes[i+1]
	h := c.ivs[i].h[k]
	// Slopes in u are the slopes in T times dT/du.
	return hermitePoly(a.v[q], a.d[q]*a.tu[k]*h, b.v[q], b.d[q]*b.tu[k]*h)
}

// Build parameters of the curve.
const (
	// The nodes are evenly spaced in θ = 1 − T/Tc far from the critical
	// point, at most satCurveDTheta apart, and geometric toward it, at
	// most satCurveRatio·θ apart (satCurveRatioNear·θ for θ below
	// satCurveThetaNear, where the cubics in ln θ follow the power laws
	// closely). The spacing puts the curve within about 1e-12 of the
	// equation's saturation in T, ρ′ and ρ″ away from the critical
	// point (1e-9 at six times the spacing), so that a saturation at p
	// started from it takes its one Newton step by the start's own
	// derivatives (satLinearStep): one evaluation of each phase. About
	// 900–1200 nodes, built in 6–12 ms on first use.
	satCurveDTheta    = 0.001
	satCurveRatio     = 0.0067
	satCurveRatioNear = 0.1
	satCurveThetaNear = 0.001
	// satCurveSafety multiplies the largest error measured in an interval
	// (at its quarter, half and three-quarter points, where the error of
	// a cubic Hermite interpolant, ∝ s²(1−s)², is largest) into its
	// bound; satCurveFloor adds the rounding of the equation's own
	// saturation (relative to ln p and ln ρ, and to max(|x|, R·Tc) and
	// max(|s|, R) for the energies and entropies).
	satCurveSafety = 4
	satCurveFloor  = 1e-11
	// satCurveThetaScatter is the θ below which measureInterval measures
	// the scatter of the equation's own saturation.
	satCurveThetaScatter = 0.01
)

// satCurve returns the cached curve of f, building it on first use; nil
// where f has none (a fluid not made by the registry) or the build
// failed.
func (f *Fluid) satCurve() *satCurve {
	h := f.satHolder
	if h == nil {
		return nil
	}
	h.once.Do(func() {
		c, err := f.buildSatCurve()
		if err == nil {
			h.curve = c
		}
	})
	return h.curve
}

// errSatCurve reports a failed build of the cached curve.
var errSatCurve = errors.New("fluid: the cached saturation curve could not be built")

// satCurveTemps returns the node temperatures of f's curve, from the
// triple point to Tc − critBand.
func (f *Fluid) satCurveTemps() []float64 {
	Tc := f.crit.T
	tEnd := Tc - critBand
	ts := []float64{f.triple.T}
	for th := 1 - f.triple.T/Tc; ; {
		r := satCurveRatio
		if th < satCurveThetaNear {
			r = satCurveRatioNear
		}
		th -= min(satCurveDTheta, r*th)
		T := Tc * (1 - th)
		if T >= tEnd || Tc-T < 1.5*critBand {
			break
		}
		ts = append(ts, T)
	}
	return append(ts, tEnd)
}

// buildSatCurve solves the equation's saturation at the nodes and between
// them, in f's default reference state.
func (f *Fluid) buildSatCurve() (*satCurve, error) {
	g := *f
	g.hOff, g.sOff = 0, 0
	g.satHolder = nil
	if !(g.triple.T < g.crit.T-critBand) {
		return nil, errSatCurve
	}
	ts := g.satCurveTemps()
	c := &satCurve{nodes: make([]satNode, len(ts)), ivs: make([]satInterval, len(ts)-1),
		lnp: make([]float64, len(ts)), ts: ts, tc: g.crit.T}
	var prev satNode
	for i, T := range ts {
		var s Saturation
		var err error
		if i == 0 {
			s, err = g.SaturationAtT(T)
		} else {
			// From the last node, carried along the curve by its slopes.
			dT := T - prev.T
			s, err = g.SaturationAtTFrom(T, math.Exp(prev.v[sqLnRhoL]+prev.d[sqLnRhoL]*dT),
				math.Exp(prev.v[sqLnRhoV]+prev.d[sqLnRhoV]*dT))
		}
		if err != nil {
			return nil, err
		}
		c.nodes[i] = g.satNodeOf(&s)
		c.lnp[i] = c.nodes[i].v[sqLnP]
		prev = c.nodes[i]
	}
	for i := 1; i < len(ts); i++ {
		if !(c.lnp[i] > c.lnp[i-1]) {
			return nil, errSatCurve
		}
	}
	for q := range nSatQ {
		c.segs[q] = segments(c.nodes, q)
	}
	c.tIdx, c.pIdx = newNodeIndex(c.ts), newNodeIndex(c.lnp)
	// The coordinate and the error of each interpolant in each interval,
	// measured between the nodes.
	for i := range c.ivs {
		for k := range nCoord {
			c.ivs[i].h[k] = c.nodes[i+1].u[k] - c.nodes[i].u[k]
			c.ivs[i].hinv[k] = 1 / c.ivs[i].h[k]
		}
	}
	for i := range c.ivs {
		if err := g.measureInterval(c, i); err != nil {
			return nil, err
		}
	}
	return c, nil
}

// measureInterval sets the coordinate of each interpolant in interval i
// of c and the bound of its error: the largest difference, in the best
// coordinate, from the equation's saturation at the interval's quarter,
// half and three-quarter points, times satCurveSafety, plus the rounding
// floor. Within satCurveThetaScatter of the critical point the
// equation fixes its saturation only to a scatter that grows toward Tc
// (Newton's method stops at the rounding level of residuals whose
// Jacobian is nearly singular there): each point is solved from two
// starts, and their difference is added to the error.
func (f *Fluid) measureInterval(c *satCurve, i int) error {
	a, b := &c.nodes[i], &c.nodes[i+1]
	var polys [nCoord][nSatQ]satPoly
	for k := range nCoord {
		for q := range nSatQ {
			polys[k][q] = c.polyOf(i, q, k)
		}
	}
	var errs [nCoord][nSatQ]float64
	var spread [nSatQ]float64
	for _, fr := range [...]float64{0.25, 0.5, 0.75} {
		T := a.T + fr*(b.T-a.T)
		var l satLoc
		c.locateCoords(&l, i, T, allCoords)
		sT := l.s[coordT]
		rl, rv := math.Exp(polys[coordT][sqLnRhoL].at(sT)), math.Exp(polys[coordT][sqLnRhoV].at(sT))
		s, err := f.SaturationAtTFrom(T, rl, rv)
		if err != nil {
			return err
		}
		e := f.satValues(&s)
		if 1-T/c.tc < satCurveThetaScatter {
			// From the nearer node's densities.
			n := a
			if fr > 0.5 {
				n = b
			}
			s2, err := f.SaturationAtTFrom(T, math.Exp(n.v[sqLnRhoL]), math.Exp(n.v[sqLnRhoV]))
			if err != nil {
				return err
			}
			e2 := f.satValues(&s2)
			for q := range nSatQ {
				spread[q] = max(spread[q], math.Abs(e2[q]-e[q]))
			}
		}
		for k := range nCoord {
			for q := range nSatQ {
				errs[k][q] = max(errs[k][q], math.Abs(polys[k][q].at(l.s[k])-e[q]))
			}
		}
	}
	iv := &c.ivs[i]
	for q := range nSatQ {
		k := 0
		for kk := 1; kk < nCoord; kk++ {
			if errs[kk][q] < errs[k][q] {
				k = kk
			}
		}
		iv.coord[q] = uint8(k)
		iv.poly[q] = polys[k][q]
		iv.err[q] = satCurveSafety*(errs[k][q]+spread[q]) + f.satFloor(q, a, b)
		if q == sqLnP || q == sqLnRhoL || q == sqLnRhoV {
			iv.err[q] = math.Expm1(iv.err[q])
		}
	}
	return nil
}

// segments splits the intervals between the nodes ns into the runs
// along which quantity q rises or falls with T (each node's slope of one
// sign and each value beyond the one before) and the single intervals
// between them.
func segments(ns []satNode, q int) []satSegment {
	sign := func(i int) int8 {
		switch d := ns[i].d[q]; {
		case d > 0:
			return 1
		case d < 0:
			return -1
		}
		return 0
	}
	// along reports whether interval i rises (m = 1) or falls (m = −1)
	// with its nodes.
	along := func(i int, m int8) bool {
		return m != 0 && sign(i) == m && sign(i+1) == m && float64(m)*(ns[i+1].v[q]-ns[i].v[q]) > 0
	}
	var segs []satSegment
	for i := 0; i < len(ns)-1; {
		m := sign(i)
		if !along(i, m) {
			segs = append(segs, satSegment{a: i, b: i + 1})
			i++
			continue
		}
		j := i + 1
		for j < len(ns)-1 && along(j, m) {
			j++
		}
		segs = append(segs, satSegment{a: i, b: j, m: m})
		i = j
	}
	return segs
}

// satFloor is the rounding floor of quantity q over an interval.
func (f *Fluid) satFloor(q int, a, b *satNode) float64 {
	switch q {
	case sqLnP, sqLnRhoL, sqLnRhoV:
		return satCurveFloor
	case sqSL, sqSV:
		return satCurveFloor * max(math.Abs(a.v[q]), math.Abs(b.v[q]), f.r)
	}
	return satCurveFloor * max(math.Abs(a.v[q]), math.Abs(b.v[q]), f.r*f.crit.T)
}

// satValues returns the interpolated quantities of the saturation s.
func (f *Fluid) satValues(s *Saturation) [nSatQ]float64 {
	l, v := &s.Liquid, &s.Vapor
	return [nSatQ]float64{elem.Log(s.P), elem.Log(l.Rho), elem.Log(v.Rho),
		l.H, v.H, l.S, v.S, l.U, v.U}
}

// satNodeOf builds a node from the equation's saturation s.
func (f *Fluid) satNodeOf(s *Saturation) satNode {
	n := satNode{T: s.T, v: f.satValues(s)}
	for k := range nCoord {
		var du float64
		n.u[k], du = coordOf(k, s.T, f.crit.T)
		n.tu[k] = 1 / du
	}
	l, v := &s.Liquid, &s.Vapor
	gamma := (v.S - l.S) / (1/v.Rho - 1/l.Rho) // dp/dT, Clausius–Clapeyron
	n.d[sqLnP] = gamma / s.P
	for i, pr := range [2]*Props{l, v} {
		drho, dh, ds, du := satSlopes(pr, gamma)
		n.d[sqLnRhoL+i] = drho / pr.Rho
		n.d[sqHL+i] = dh
		n.d[sqSL+i] = ds
		n.d[sqUL+i] = du
		n.start[i] = SatStart{Cv: pr.Cv, Cp: pr.Cp, W: pr.W, KappaT: pr.KappaT,
			Expansivity: pr.Expansivity, DpDrho: pr.DpDrho, DpDT: pr.DpDT}
	}
	return n
}

// satSlopes returns the derivatives with temperature of a saturated
// phase pr along the coexistence curve of slope γ = dp/dT, from its
// (T, ρ) derivatives:
//
//	dρ/dT = (γ − (∂p/∂T)_ρ)/(∂p/∂ρ)_T,
//	du/dT = cv + (p − T(∂p/∂T)_ρ)/ρ² · dρ/dT,
//	ds/dT = cv/T − (∂p/∂T)_ρ/ρ² · dρ/dT,
//	dh/dT = du/dT + γ/ρ − p/ρ² · dρ/dT.
func satSlopes(pr *Props, gamma float64) (drho, dh, ds, du float64) {
	T, r2 := pr.T, pr.Rho*pr.Rho
	drho = (gamma - pr.DpDT) / pr.DpDrho
	du = pr.Cv + (pr.P-T*pr.DpDT)/r2*drho
	ds = pr.Cv/T - pr.DpDT/r2*drho
	dh = du + gamma/pr.Rho - pr.P/r2*drho
	return drho, dh, ds, du
}

// coordOf returns coordinate k at T and du/dT there (Tc = Critical().T).
func coordOf(k int, T, Tc float64) (u, dudT float64) {
	switch k {
	case coordY:
		return 1 / T, -1 / (T * T)
	case coordX:
		return elem.Log(1 - T/Tc), -1 / (Tc - T)
	}
	return T, 1
}

// tOfCoord returns the T at which coordinate k is u (coordOf inverted).
func tOfCoord(k int, u, Tc float64) float64 {
	switch k {
	case coordY:
		return 1 / u
	case coordX:
		return Tc * -math.Expm1(u)
	}
	return u
}

// satLoc is a temperature T located in interval i of a curve, with its
// position s in the interval and ds/dT in each coordinate computed so
// far (bit k of have: coordinate k).
type satLoc struct {
	i    int
	T    float64
	have uint8
	s    [nCoord]float64
	dsdT [nCoord]float64
}

// locateCoords sets l to T in interval i, with the coordinates in the
// bit mask uses.
func (c *satCurve) locateCoords(l *satLoc, i int, T float64, uses uint8) {
	iv := &c.ivs[i]
	a := &c.nodes[i]
	l.i, l.T = i, T
	l.have |= uses
	if uses&(1<<coordT) != 0 {
		l.s[coordT], l.dsdT[coordT] = (T-a.u[coordT])*iv.hinv[coordT], iv.hinv[coordT]
	}
	if uses&(1<<coordY) != 0 {
		y := 1 / T
		l.s[coordY], l.dsdT[coordY] = (y-a.u[coordY])*iv.hinv[coordY], -y*y*iv.hinv[coordY]
	}
	if uses&(1<<coordX) != 0 {
		u, du := coordOf(coordX, T, c.tc)
		l.s[coordX], l.dsdT[coordX] = (u-a.u[coordX])*iv.hinv[coordX], du*iv.hinv[coordX]
	}
}

// allCoords is the bit mask of every coordinate.
const allCoords = 1<<nCoord - 1

// valueAt and slopeAt are value and slope at an l whose coordinates are
// all computed (locateCoords with allCoords).
func (c *satCurve) valueAt(l *satLoc, q int) float64 {
	iv := &c.ivs[l.i]
	return iv.poly[q].at(l.s[iv.coord[q]])
}

func (c *satCurve) slopeAt(l *satLoc, q int) float64 {
	iv := &c.ivs[l.i]
	k := iv.coord[q]
	return iv.poly[q].ds(l.s[k]) * l.dsdT[k]
}

// value returns the interpolant of quantity q at l.
func (c *satCurve) value(l *satLoc, q int) float64 {
	iv := &c.ivs[l.i]
	k := iv.coord[q]
	if l.have&(1<<k) == 0 {
		c.locateCoords(l, l.i, l.T, 1<<k)
	}
	return iv.poly[q].at(l.s[k])
}

// slope returns the derivative with T of the interpolant of quantity q
// at l.
func (c *satCurve) slope(l *satLoc, q int) float64 {
	iv := &c.ivs[l.i]
	k := iv.coord[q]
	if l.have&(1<<k) == 0 {
		c.locateCoords(l, l.i, l.T, 1<<k)
	}
	return iv.poly[q].ds(l.s[k]) * l.dsdT[k]
}

// intervalT returns the interval holding T, or −1 outside the curve.
func (c *satCurve) intervalT(T float64) int { return c.tIdx.interval(c.ts, T) }

// intervalP returns the interval holding ln p, or −1 outside the curve.
func (c *satCurve) intervalP(lp float64) int { return c.pIdx.interval(c.lnp, lp) }

// nodeIndex finds the interval of ascending nodes xs that holds x in a
// few steps: the range of the nodes is cut into 4 buckets per node, and
// idx[b] is the last node at or below the start of bucket b, so that x
// in bucket b lies in an interval from idx[b] to idx[b+1], found by
// bisection (one or two steps, but where the nodes crowd, next to the
// critical point).
type nodeIndex struct {
	x0, inv float64
	idx     []uint16
}

func newNodeIndex(xs []float64) nodeIndex {
	n := len(xs)
	nb := 4 * n
	ix := nodeIndex{x0: xs[0], inv: float64(nb) / (xs[n-1] - xs[0]), idx: make([]uint16, nb+2)}
	j := 0
	for b := range ix.idx {
		xb := ix.x0 + float64(b)/ix.inv
		for j+1 < n && xs[j+1] <= xb {
			j++
		}
		ix.idx[b] = uint16(j)
	}
	return ix
}

// interval returns i with xs[i] ≤ x ≤ xs[i+1], the interval starting at
// x where x is a node (the last interval at the last node), or −1 where x
// lies outside the nodes.
func (ix *nodeIndex) interval(xs []float64, x float64) int {
	n := len(xs)
	if !(x >= xs[0] && x <= xs[n-1]) {
		return -1
	}
	b := min(int((x-ix.x0)*ix.inv), len(ix.idx)-2)
	lo, hi := int(ix.idx[b]), int(ix.idx[b+1])
	if xs[lo] > x {
		lo = 0 // (the bucket's start rounded above x)
	}
	if hi < n-1 && xs[hi+1] <= x {
		hi = n - 1
	}
	// The last node at or below x, in [lo, hi].
	for lo < hi {
		m := (lo + hi + 1) / 2
		if xs[m] <= x {
			lo = m
		} else {
			hi = m - 1
		}
	}
	return min(lo, n-2)
}

// locateT returns T located in interval i (its coordinates are computed
// as values need them).
func (c *satCurve) locateT(i int, T float64) satLoc { return satLoc{i: i, T: T} }

// locateWhere sets l, a zero satLoc, to the point of interval i, between
// the positions lo and hi in the coordinate of quantity q, at which the
// interpolant of q equals target, where it changes sign between lo and
// hi: Newton's method on the cubic in s, kept inside the shrinking
// bracket by bisection. The point's position in that coordinate is the
// solution itself, so that q reads back as target to rounding.
func (c *satCurve) locateWhere(l *satLoc, i, q int, target, lo, hi float64) {
	iv := &c.ivs[i]
	k := int(iv.coord[q])
	p := &iv.poly[q]
	flo, fhi := p.at(lo)-target, p.at(hi)-target
	up := flo < 0 // rising from lo to hi
	// From the chord.
	s := lo + (hi-lo)*flo/(flo-fhi)
	if !(s > lo && s < hi) {
		s = 0.5 * (lo + hi)
	}
	for it := 0; it < 100 && hi-lo > 1e-16; it++ {
		r := p.at(s) - target
		if r == 0 {
			break
		}
		if (r < 0) == up {
			lo = s
		} else {
			hi = s
		}
		sn := s - r/p.ds(s)
		if !(sn > lo && sn < hi) {
			sn = 0.5 * (lo + hi)
		}
		if math.Abs(sn-s) <= 1e-16 {
			s = sn
			break
		}
		s = sn
	}
	a, b := &c.nodes[i], &c.nodes[i+1]
	u := a.u[k] + s*iv.h[k]
	T := min(max(tOfCoord(k, u, c.tc), a.T), b.T)
	c.locateCoords(l, i, T, 1<<k)
	l.s[k] = s
}

// extremumIn returns the position s in interval i, in the coordinate of
// quantity q, at which the slope of its interpolant, of opposite signs
// at the nodes, vanishes (bisection).
func (c *satCurve) extremumIn(i, q int) float64 {
	p := &c.ivs[i].poly[q]
	lo, hi := 0.0, 1.0
	neg0 := p.ds(0) < 0
	for it := 0; it < 60 && hi-lo > 1e-15; it++ {
		m := 0.5 * (lo + hi)
		if (p.ds(m) < 0) == neg0 {
			lo = m
		} else {
			hi = m
		}
	}
	return 0.5 * (lo + hi)
}
