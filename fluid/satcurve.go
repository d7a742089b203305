package fluid

import (
	"errors"
	"math"
	"sort"
	"sync"
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
// when the curve is built (see satCurveSafety). Values are in the
// equation's default reference state. The curve is immutable once built.
type satCurve struct {
	nodes []satNode
	ivs   []satInterval // ivs[i] is the interval nodes[i]..nodes[i+1]
	lnp   []float64     // ln p of the nodes, ascending (for the search in p)
	ts    []float64     // T of the nodes, ascending
	tc    float64       // Critical().T
	// mono[q] is +1 or −1 where quantity q rises or falls with T along
	// the whole curve (node values and slopes), else 0.
	mono [nSatQ]int8
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
// properties that start solvers (interpolated linearly, without bounds).
type satNode struct {
	T     float64
	u     [nCoord]float64 // T in each coordinate
	tu    [nCoord]float64 // dT/du in each coordinate
	v, d  [nSatQ]float64
	start [2]satStart // liquid, vapour
}

// satStart holds properties of a saturated phase that the estimates
// interpolate linearly between nodes, for starting values only.
type satStart struct {
	Cv, Cp, W, KappaT, Expansivity, DpDrho, DpDT float64
}

// satInterval is what the curve knows of one interval: the coordinate of
// each interpolant and the bound of its error, in the quantity's own
// units (ln p and ln ρ: relative, stored as e^err − 1).
type satInterval struct {
	coord   [nSatQ]uint8
	uses    uint8 // bit k set: some quantity is cubic in coordinate k
	err     [nSatQ]float64
	h, hinv [nCoord]float64 // the width in each coordinate and its inverse
}

// Build parameters of the curve.
const (
	// The nodes are evenly spaced in θ = 1 − T/Tc far from the critical
	// point, at most satCurveDTheta apart, and geometric toward it, at
	// most satCurveRatio·θ apart (satCurveRatioNear·θ for θ below
	// satCurveThetaNear, where the cubics in ln θ follow the power laws
	// closely).
	satCurveDTheta    = 0.006
	satCurveRatio     = 0.04
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
		c.mono[q] = monotone(c.nodes, q)
	}
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
	var errs [nCoord][nSatQ]float64
	var spread [nSatQ]float64
	for _, fr := range [...]float64{0.25, 0.5, 0.75} {
		T := a.T + fr*(b.T-a.T)
		var bs satBasis
		c.basis(i, T, coordT, &bs)
		rl, rv := math.Exp(bs.value(a, b, sqLnRhoL)), math.Exp(bs.value(a, b, sqLnRhoV))
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
			c.basis(i, T, k, &bs)
			for q := range nSatQ {
				errs[k][q] = max(errs[k][q], math.Abs(bs.value(a, b, q)-e[q]))
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
		iv.uses |= 1 << k
		iv.err[q] = satCurveSafety*(errs[k][q]+spread[q]) + f.satFloor(q, a, b)
		if q == sqLnP || q == sqLnRhoL || q == sqLnRhoV {
			iv.err[q] = math.Expm1(iv.err[q])
		}
	}
	return nil
}

// monotone returns +1 or −1 where the values and slopes of quantity q at
// the nodes all rise or all fall, else 0.
func monotone(ns []satNode, q int) int8 {
	up, down := true, true
	for i := range ns {
		up = up && ns[i].d[q] > 0 && (i == 0 || ns[i].v[q] > ns[i-1].v[q])
		down = down && ns[i].d[q] < 0 && (i == 0 || ns[i].v[q] < ns[i-1].v[q])
	}
	switch {
	case up:
		return 1
	case down:
		return -1
	}
	return 0
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
	return [nSatQ]float64{math.Log(s.P), math.Log(l.Rho), math.Log(v.Rho),
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
		n.start[i] = satStart{Cv: pr.Cv, Cp: pr.Cp, W: pr.W, KappaT: pr.KappaT,
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

// satBasis is the cubic Hermite basis of an interval at one point in one
// coordinate u: the weights of the end values (h00, h01) and of the end
// slopes with T (h10, h11: the slopes in u times the interval's width in
// u, by du/dT at each end), and their derivatives with T (g…).
type satBasis struct {
	h00, h10, h01, h11 float64
	g00, g10, g01, g11 float64
}

// coordOf returns coordinate k at T and du/dT there (Tc = Critical().T).
func coordOf(k int, T, Tc float64) (u, dudT float64) {
	switch k {
	case coordY:
		return 1 / T, -1 / (T * T)
	case coordX:
		return math.Log(1 - T/Tc), -1 / (Tc - T)
	}
	return T, 1
}

// basis sets bs to the basis of interval i at T in coordinate k.
func (c *satCurve) basis(i int, T float64, k int, bs *satBasis) {
	u, ku := coordOf(k, T, c.tc)
	c.basisAt(i, k, u, ku, bs)
}

// basisAt sets bs to the basis of interval i in coordinate k at u, where
// du/dT = ku.
func (c *satCurve) basisAt(i, k int, u, ku float64, bs *satBasis) {
	a, b := &c.nodes[i], &c.nodes[i+1]
	iv := &c.ivs[i]
	h, hinv := iv.h[k], iv.hinv[k]
	s := (u - a.u[k]) * hinv
	s2 := s * s
	s3 := s2 * s
	// Slopes in u are the slopes in T times dT/du.
	bs.h00, bs.h10 = 2*s3-3*s2+1, (s3-2*s2+s)*h*a.tu[k]
	bs.h01, bs.h11 = -2*s3+3*s2, (s3-s2)*h*b.tu[k]
	bs.g00, bs.g10 = (6*s2-6*s)*hinv*ku, (3*s2-4*s+1)*ku*a.tu[k]
	bs.g01, bs.g11 = (6*s-6*s2)*hinv*ku, (3*s2-2*s)*ku*b.tu[k]
}

// value returns the interpolant of quantity q between nodes a and b.
func (bs *satBasis) value(a, b *satNode, q int) float64 {
	return bs.h00*a.v[q] + bs.h10*a.d[q] + bs.h01*b.v[q] + bs.h11*b.d[q]
}

// slope returns the derivative with T of the interpolant of quantity q.
func (bs *satBasis) slope(a, b *satNode, q int) float64 {
	return bs.g00*a.v[q] + bs.g10*a.d[q] + bs.g01*b.v[q] + bs.g11*b.d[q]
}

// interp evaluates the interpolants of interval i at T into v and their
// derivatives with T into dv.
func (c *satCurve) interp(i int, T float64, v, dv *[nSatQ]float64) {
	a, b := &c.nodes[i], &c.nodes[i+1]
	iv := &c.ivs[i]
	var bs [nCoord]satBasis
	for k := range nCoord {
		if iv.uses&(1<<k) != 0 {
			c.basis(i, T, k, &bs[k])
		}
	}
	for q := range nSatQ {
		h := &bs[iv.coord[q]]
		v[q] = h.h00*a.v[q] + h.h10*a.d[q] + h.h01*b.v[q] + h.h11*b.d[q]
		dv[q] = h.g00*a.v[q] + h.g10*a.d[q] + h.g01*b.v[q] + h.g11*b.d[q]
	}
}

// intervalT returns the interval holding T, or −1 outside the curve.
func (c *satCurve) intervalT(T float64) int {
	n := len(c.ts)
	if !(T >= c.ts[0] && T <= c.ts[n-1]) {
		return -1
	}
	return min(max(sort.SearchFloat64s(c.ts, T)-1, 0), n-2)
}

// intervalP returns the interval holding ln p, or −1 outside the curve.
func (c *satCurve) intervalP(lp float64) int {
	n := len(c.lnp)
	if !(lp >= c.lnp[0] && lp <= c.lnp[n-1]) {
		return -1
	}
	return min(max(sort.SearchFloat64s(c.lnp, lp)-1, 0), n-2)
}

// SatEstimate is a point of a fluid's saturation curve estimated from a
// cached representation of the equation's own curve (see
// Fluid.SaturationEstimateAtT), with bounds of its error. It is for
// placing states against the curve and for starting solvers; results
// come from the equation (SaturationAtT, SaturationAtP and their warm
// forms).
//
// Liquid and Vapor hold the estimated saturated phases in SI units with
// the fluid's reference state, flagged Saturated: T, P, Rho, H, S, U, G
// and F within the bounds of Err; Cv, Cp, W, KappaT, Expansivity,
// DpDrho, DpDT, Z and JouleThomson interpolated linearly between nodes of
// the curve, without a bound (starting values only).
type SatEstimate struct {
	T, P          float64
	Liquid, Vapor Props
	// Slope holds the derivatives along the curve with temperature:
	// dp/dT in Pa/K, and for each phase dρ/dT, dh/dT, ds/dT and du/dT.
	Slope SatSlope
	// Err bounds |estimate − equation's saturation| of each value.
	Err SatError
}

// SatSlope holds derivatives along the saturation curve with temperature:
// P in Pa/K, and the phases' in kg/(m³·K), J/(kg·K), J/(kg·K²), J/(kg·K).
type SatSlope struct {
	P             float64
	Liquid, Vapor PhaseValues
}

// SatError bounds the error of a SatEstimate: T in K (0 for an estimate
// at given T), P in Pa (0 for one at given p), and each phase's Rho in
// kg/m³, H and U in J/kg, S in J/(kg·K).
type SatError struct {
	T, P          float64
	Liquid, Vapor PhaseValues
}

// PhaseValues are density, enthalpy, entropy and internal energy of a
// phase, or their errors or derivatives (see where used for units).
type PhaseValues struct {
	Rho, H, S, U float64
}

// SaturationEstimateAtT returns the estimated saturation of f at
// temperature T in K from the cached curve, with bounds of its error
// (measured against the equation when the curve was built; see
// SatEstimate). ok is false outside Triple().T ≤ T ≤ Critical().T −
// 1 mK, where the curve ends (within a millikelvin of the critical point
// only the equation's own saturation places states, see SaturationAtT),
// and for a fluid without a cached curve. The curve is built on the first
// call for a fluid, in a few milliseconds, and shared by every copy of
// the fluid (WithReference); the call allocates nothing after that.
func (f *Fluid) SaturationEstimateAtT(T float64) (e SatEstimate, ok bool) {
	c := f.satCurve()
	if c == nil {
		return e, false
	}
	i := c.intervalT(T)
	if i < 0 {
		return e, false
	}
	f.satEstimate(c, i, T, &e)
	return e, true
}

// SaturationEstimateRange returns the temperatures in K between which
// SaturationEstimateAtT has estimates: the triple point and
// Critical().T − 1 mK; zero for a fluid without a cached curve.
func (f *Fluid) SaturationEstimateRange() (lo, hi float64) {
	c := f.satCurve()
	if c == nil {
		return 0, 0
	}
	return c.ts[0], c.ts[len(c.ts)-1]
}

// VaporPressureEstimate returns the vapour pressure of f at temperature
// T in K and the bound of its error, both in Pa, from the cached curve:
// the P and Err.P of SaturationEstimateAtT at a fraction of its cost,
// for placing states. ok is false where SaturationEstimateAtT's is.
func (f *Fluid) VaporPressureEstimate(T float64) (p, errP float64, ok bool) {
	c := f.satCurve()
	if c == nil {
		return 0, 0, false
	}
	i := c.intervalT(T)
	if i < 0 {
		return 0, 0, false
	}
	var bs satBasis
	c.basis(i, T, int(c.ivs[i].coord[sqLnP]), &bs)
	p = math.Exp(bs.value(&c.nodes[i], &c.nodes[i+1], sqLnP))
	return p, p * c.ivs[i].err[sqLnP], true
}

// SaturationEstimateAtP returns the estimated saturation of f at pressure
// p in Pa, as SaturationEstimateAtT: ok is false outside the pressures of
// its temperature range. Err.T bounds the error of the estimated T, and
// the phases' errors include its effect.
func (f *Fluid) SaturationEstimateAtP(p float64) (e SatEstimate, ok bool) {
	c := f.satCurve()
	if c == nil || !(p > 0) {
		return e, false
	}
	lp := math.Log(p)
	i := c.intervalP(lp)
	if i < 0 {
		return e, false
	}
	a, b := &c.nodes[i], &c.nodes[i+1]
	T := c.rootIn(i, sqLnP, lp, a.T, b.T)
	f.satEstimate(c, i, T, &e)
	e.P = p
	e.Liquid.P, e.Vapor.P = p, p
	// The error of T from that of ln p, by the slope d ln p/dT.
	e.Err.P = 0
	e.addErrT(c.ivs[i].err[sqLnP] / (e.Slope.P / p))
	return e, true
}

// SatValue selects a value of a saturated phase, for
// SaturationEstimatesWhere.
type SatValue int8

// The values of the saturated liquid and vapour: density, enthalpy,
// entropy and internal energy.
const (
	SatLiquidRho SatValue = iota
	SatVaporRho
	SatLiquidH
	SatVaporH
	SatLiquidS
	SatVaporS
	SatLiquidU
	SatVaporU
)

// satQ maps a SatValue to its interpolant and whether it is a logarithm.
var satQ = [...]struct {
	q   int
	log bool
}{{sqLnRhoL, true}, {sqLnRhoV, true}, {sqHL, false}, {sqHV, false},
	{sqSL, false}, {sqSV, false}, {sqUL, false}, {sqUV, false}}

// SaturationEstimatesWhere appends to dst the estimated saturation states
// of f at which value v of a saturated phase equals x (SI units, in f's
// reference state), in ascending temperature, within the range of
// SaturationEstimateAtT, and returns the extended slice. Each is as
// SaturationEstimateAtP: Err.T bounds the error of its temperature (large
// where v hardly changes with T), and the phases' errors include its
// effect. Values that rise or fall monotonically along the curve (ρ′, ρ″,
// h′, s′, u′, s″) have at most one such state; the density of liquid
// water (a maximum near 277 K) and h″ and u″ (a maximum well below Tc)
// can have two. With dst of enough capacity the call allocates nothing.
func (f *Fluid) SaturationEstimatesWhere(v SatValue, x float64, dst []SatEstimate) []SatEstimate {
	c := f.satCurve()
	if c == nil || v < 0 || int(v) >= len(satQ) || !finite(x) {
		return dst
	}
	q := satQ[v].q
	target := x
	switch {
	case satQ[v].log:
		if !(x > 0) {
			return dst
		}
		target = math.Log(x)
	case q == sqSL || q == sqSV:
		target -= f.sOff
	default:
		target -= f.hOff
	}
	add := func(i int, T float64) {
		var e SatEstimate
		f.satEstimate(c, i, T, &e)
		var bs satBasis
		c.basis(i, T, int(c.ivs[i].coord[q]), &bs)
		slope := bs.slope(&c.nodes[i], &c.nodes[i+1], q)
		e.addErrT(c.ivs[i].err[q] / math.Abs(slope))
		dst = append(dst, e)
	}
	lo, hi := 0, len(c.ivs)
	if m := float64(c.mono[q]); m != 0 {
		// One crossing at most: the interval by bisection of the nodes.
		n := len(c.nodes)
		if (c.nodes[0].v[q]-target)*m > 0 || (c.nodes[n-1].v[q]-target)*m < 0 {
			return dst
		}
		a, b := 0, n-1
		for b-a > 1 {
			mid := (a + b) / 2
			if (c.nodes[mid].v[q]-target)*m > 0 {
				b = mid
			} else {
				a = mid
			}
		}
		lo, hi = a, a+1
	}
	for i := lo; i < hi; i++ {
		a, b := &c.nodes[i], &c.nodes[i+1]
		fa, fb := a.v[q]-target, b.v[q]-target
		switch {
		case fa == 0:
			add(i, a.T)
		case fb == 0 && i == len(c.ivs)-1:
			add(i, b.T)
		case fb == 0:
			// At the next interval's first node.
		case (fa < 0) != (fb < 0):
			add(i, c.rootIn(i, q, target, a.T, b.T))
		case (a.d[q] < 0) != (b.d[q] < 0):
			// An extremum inside: two roots where it lies beyond x.
			Tm := c.extremumIn(i, q)
			var bs satBasis
			c.basis(i, Tm, int(c.ivs[i].coord[q]), &bs)
			if fm := bs.value(a, b, q) - target; fm != 0 && (fm < 0) != (fa < 0) {
				add(i, c.rootIn(i, q, target, a.T, Tm))
				add(i, c.rootIn(i, q, target, Tm, b.T))
			}
		}
	}
	return dst
}

// SaturationEstimatesAtRho is SaturationEstimatesWhere for the density
// rho in kg/m³ of the saturated liquid (rho > Critical().Rho) or vapour
// (rho < Critical().Rho): the crossings of the isochore with the
// saturated phase of its side, at most two (water's liquid near its
// density maximum), else one or none.
func (f *Fluid) SaturationEstimatesAtRho(rho float64, dst []SatEstimate) []SatEstimate {
	if rho > f.crit.Rho {
		return f.SaturationEstimatesWhere(SatLiquidRho, rho, dst)
	}
	return f.SaturationEstimatesWhere(SatVaporRho, rho, dst)
}

// addErrT adds an error dT in K of the estimate's temperature to its
// bounds: the phases' errors grow by their slopes along the curve times
// dT.
func (e *SatEstimate) addErrT(dT float64) {
	e.Err.T += dT
	for k, ph := range [2]*PhaseValues{&e.Err.Liquid, &e.Err.Vapor} {
		sl := &e.Slope.Liquid
		if k == 1 {
			sl = &e.Slope.Vapor
		}
		ph.Rho += math.Abs(sl.Rho) * dT
		ph.H += math.Abs(sl.H) * dT
		ph.S += math.Abs(sl.S) * dT
		ph.U += math.Abs(sl.U) * dT
	}
}

// rootIn returns the T in [lo, hi], within interval i, at which the
// interpolant of q equals target, where it changes sign between lo and
// hi: Newton's method kept inside the shrinking bracket by bisection.
func (c *satCurve) rootIn(i, q int, target, lo, hi float64) float64 {
	a, b := &c.nodes[i], &c.nodes[i+1]
	k := int(c.ivs[i].coord[q])
	var bs satBasis
	c.basis(i, lo, k, &bs)
	flo := bs.value(a, b, q)
	up := flo < target // rising from lo to hi
	c.basis(i, hi, k, &bs)
	// From the chord (in 1/T for ln p, nearly linear there).
	w := (target - flo) / (bs.value(a, b, q) - flo)
	T := lo + w*(hi-lo)
	if q == sqLnP {
		T = 1 / (1/lo + w*(1/hi-1/lo))
	}
	if !(T > lo && T < hi) {
		T = 0.5 * (lo + hi)
	}
	for it := 0; it < 100 && hi-lo > 1e-15*hi; it++ {
		c.basis(i, T, k, &bs)
		r := bs.value(a, b, q) - target
		if r == 0 {
			return T
		}
		if (r < 0) == up {
			lo = T
		} else {
			hi = T
		}
		Tn := T - r/bs.slope(a, b, q)
		if !(Tn > lo && Tn < hi) {
			Tn = 0.5 * (lo + hi)
		}
		if math.Abs(Tn-T) <= 1e-15*T {
			return Tn
		}
		T = Tn
	}
	return T
}

// extremumIn returns the T in interval i at which the slope of the
// interpolant of q, of opposite signs at the nodes, vanishes (bisection).
func (c *satCurve) extremumIn(i, q int) float64 {
	a, b := &c.nodes[i], &c.nodes[i+1]
	k := int(c.ivs[i].coord[q])
	lo, hi := a.T, b.T
	var bs satBasis
	for it := 0; it < 60 && hi-lo > 1e-14*hi; it++ {
		m := 0.5 * (lo + hi)
		c.basis(i, m, k, &bs)
		if (bs.slope(a, b, q) < 0) == (a.d[q] < 0) {
			lo = m
		} else {
			hi = m
		}
	}
	return 0.5 * (lo + hi)
}

// satEstimate fills e at T in interval i, with f's reference offsets.
func (f *Fluid) satEstimate(c *satCurve, i int, T float64, e *SatEstimate) {
	var v, dv [nSatQ]float64
	c.interp(i, T, &v, &dv)
	a, b := &c.nodes[i], &c.nodes[i+1]
	w := (T - a.T) * c.ivs[i].hinv[coordT]
	bd := &c.ivs[i].err
	p := math.Exp(v[sqLnP])
	e.T, e.P = T, p
	e.Slope.P = dv[sqLnP] * p
	e.Err = SatError{P: p * bd[sqLnP]}
	for ph := 0; ph < 2; ph++ {
		pr := &e.Liquid
		sl, er := &e.Slope.Liquid, &e.Err.Liquid
		if ph == 1 {
			pr, sl, er = &e.Vapor, &e.Slope.Vapor, &e.Err.Vapor
		}
		rho := math.Exp(v[sqLnRhoL+ph])
		sa, sb := &a.start[ph], &b.start[ph]
		*pr = Props{T: T, Rho: rho, P: p,
			U: v[sqUL+ph] + f.hOff, H: v[sqHL+ph] + f.hOff, S: v[sqSL+ph] + f.sOff,
			Cv: lerp(sa.Cv, sb.Cv, w), Cp: lerp(sa.Cp, sb.Cp, w), W: lerp(sa.W, sb.W, w),
			KappaT: lerp(sa.KappaT, sb.KappaT, w), Expansivity: lerp(sa.Expansivity, sb.Expansivity, w),
			DpDrho: lerp(sa.DpDrho, sb.DpDrho, w), DpDT: lerp(sa.DpDT, sb.DpDT, w),
			Flags: Saturated}
		pr.G = pr.H - T*pr.S
		pr.F = pr.U - T*pr.S
		pr.Z = p / (rho * f.r * T)
		pr.JouleThomson = (T*pr.Expansivity - 1) / (rho * pr.Cp)
		*sl = PhaseValues{Rho: dv[sqLnRhoL+ph] * rho, H: dv[sqHL+ph], S: dv[sqSL+ph], U: dv[sqUL+ph]}
		*er = PhaseValues{Rho: rho * bd[sqLnRhoL+ph], H: bd[sqHL+ph],
			S: bd[sqSL+ph], U: bd[sqUL+ph]}
	}
}

// lerp returns a + w(b − a).
func lerp(a, b, w float64) float64 { return a + w*(b-a) }
