package fluid

import (
	"math"

	"github.com/tripoint-thermo/tripoint/internal/elem"
)

// This file holds the estimates read from a fluid's cached saturation
// curve (satcurve.go): single values at a located point (SatPoint), whole
// saturation states (SatEstimate), and the points where a saturated
// value is given. They place states and start solvers; every result of
// tripoint comes from the equation of state.

// SatPoint is a point of a fluid's saturation curve located on its cached
// representation (Fluid.SaturationPointAtT, SaturationPointAtP,
// SaturationPointsWhere), from which single estimated values, their
// slopes along the curve and the bounds of their errors are read for a
// few multiplications each (a density for one exponential more);
// Estimate fills the whole SatEstimate. Values are in SI units with the
// fluid's reference state. A SatPoint is a plain value: its methods do
// not change the curve, which is immutable and shared, but they do cache
// in the SatPoint the coordinates they compute, so that one SatPoint is
// not for concurrent use (copies are). The zero SatPoint is no point:
// its methods return zeros.
type SatPoint struct {
	f    *Fluid
	c    *satCurve
	loc  satLoc
	tErr float64 // the bound of the error of T (0 at given T), once by is 0
	by   int8    // 1 + the interpolant sp was located by, until tErr is set
	p    float64 // the given pressure (SaturationPointAtP), else 0
}

// SaturationPointAtT locates temperature T in K on the cached curve of f
// (see SaturationEstimateAtT); ok is false where SaturationEstimateAtT's
// is. The call allocates nothing; SatPoint.LocateT does the same in
// place.
func (f *Fluid) SaturationPointAtT(T float64) (sp SatPoint, ok bool) {
	ok = sp.LocateT(f, T)
	return sp, ok
}

// LocateT sets sp to the point of f's cached curve at temperature T in K,
// in place, as SaturationPointAtT returns it, and reports whether there
// is one (where not, sp is the zero SatPoint). A hot path that locates
// points often spares itself the copy of the returned SatPoint, which
// costs about as much as locating it.
func (sp *SatPoint) LocateT(f *Fluid, T float64) bool {
	*sp = SatPoint{}
	c := f.satCurve()
	if c == nil {
		return false
	}
	i := c.intervalT(T)
	if i < 0 {
		return false
	}
	sp.f, sp.c, sp.loc.i, sp.loc.T = f, c, i, T
	return true
}

// SaturationPointAtP locates pressure p in Pa on the cached curve of f
// (see SaturationEstimateAtP): its temperature is estimated, with the
// bound of its error (Temperature), and every value's bound includes
// that error's effect. ok is false where SaturationEstimateAtP's is.
// SatPoint.LocateP does the same in place.
func (f *Fluid) SaturationPointAtP(p float64) (sp SatPoint, ok bool) {
	ok = sp.LocateP(f, p)
	return sp, ok
}

// LocateP sets sp to the point of f's cached curve at pressure p in Pa,
// in place, as SaturationPointAtP returns it, and reports whether there
// is one (where not, sp is the zero SatPoint); see LocateT.
func (sp *SatPoint) LocateP(f *Fluid, p float64) bool {
	*sp = SatPoint{}
	c := f.satCurve()
	if c == nil || !(p > 0) {
		return false
	}
	lp := elem.Log(p)
	i := c.intervalP(lp)
	if i < 0 {
		return false
	}
	f.setPointWhere(sp, c, i, sqLnP, lp, 0, 1)
	sp.p = p
	return true
}

// pointWhere returns the point of interval i where quantity q (without
// reference offsets) equals target, between the positions lo and hi in
// its coordinate (see locateWhere), with the error of its T from the
// error of q and q's slope.
func (f *Fluid) pointWhere(c *satCurve, i, q int, target, lo, hi float64) SatPoint {
	var sp SatPoint
	f.setPointWhere(&sp, c, i, q, target, lo, hi)
	return sp
}

// setPointWhere sets sp, a zero SatPoint, to pointWhere(c, i, q, target,
// lo, hi) in place (the hot path of SaturationPointAtP: no copies of the
// point).
func (f *Fluid) setPointWhere(sp *SatPoint, c *satCurve, i, q int, target, lo, hi float64) {
	sp.f, sp.c, sp.by = f, c, int8(q+1)
	c.locateWhere(&sp.loc, i, q, target, lo, hi)
}

// errT returns the bound of the error of sp's T: the bound of the
// interpolant it was located by over that interpolant's slope (0 at
// given T). It is computed when first asked for, not when the point is
// located: the solvers started from a point need its T alone.
func (sp *SatPoint) errT() float64 {
	if sp.by > 0 {
		q := int(sp.by - 1)
		sp.tErr, sp.by = sp.c.ivs[sp.loc.i].err[q]/math.Abs(sp.c.slope(&sp.loc, q)), 0
	}
	return sp.tErr
}

// Temperature returns the temperature of sp in K and the bound of its
// error (0 for a point at given T).
func (sp *SatPoint) Temperature() (T, errT float64) { return sp.loc.T, sp.errT() }

// Pressure returns the vapour pressure at sp in Pa, the bound of its
// error in Pa (0 at given p) and its slope dp/dT along the curve in Pa/K.
func (sp *SatPoint) Pressure() (p, errP, dpdT float64) {
	if sp.c == nil {
		return 0, 0, 0
	}
	lp := sp.c.value(&sp.loc, sqLnP)
	slope := sp.c.slope(&sp.loc, sqLnP)
	if sp.p > 0 {
		return sp.p, 0, slope * sp.p
	}
	p = elem.Exp(lp)
	return p, p * sp.c.ivs[sp.loc.i].err[sqLnP], slope * p
}

// Value returns the estimated value v of a saturated phase at sp (SI
// units, the fluid's reference state) and the bound of its error.
func (sp *SatPoint) Value(v SatValue) (x, errX float64) {
	if sp.c == nil || v < 0 || int(v) >= len(satQ) {
		return 0, 0
	}
	q := satQ[v].q
	x = sp.c.value(&sp.loc, q)
	errX = sp.c.ivs[sp.loc.i].err[q]
	scale := 1.0 // d(value)/d(interpolant)
	switch {
	case satQ[v].log:
		x = elem.Exp(x)
		errX *= x
		scale = x
	case q == sqSL || q == sqSV:
		x += sp.f.sOff
	default:
		x += sp.f.hOff
	}
	if eT := sp.errT(); eT > 0 {
		errX += math.Abs(sp.c.slope(&sp.loc, q)*scale) * eT
	}
	return x, errX
}

// Slope returns the derivative with temperature along the curve of the
// saturated value v at sp: kg/(m³·K), J/(kg·K) or J/(kg·K²).
func (sp *SatPoint) Slope(v SatValue) float64 {
	if sp.c == nil || v < 0 || int(v) >= len(satQ) {
		return 0
	}
	q := satQ[v].q
	d := sp.c.slope(&sp.loc, q)
	if satQ[v].log {
		d *= elem.Exp(sp.c.value(&sp.loc, q))
	}
	return d
}

// SatStart holds properties of a saturated phase that the cached curve
// interpolates linearly between its nodes, without a bound: for starting
// values only. Units are those of Props.
type SatStart struct {
	Cv, Cp, W, KappaT, Expansivity, DpDrho, DpDT float64
}

// Start returns the properties of the saturated liquid (liquid true) or
// vapour at sp that the curve holds for starting values (SatStart), for
// a few multiplications; Liquid and Vapor give them with the rest of the
// phase.
func (sp *SatPoint) Start(liquid bool) SatStart {
	c, l := sp.c, &sp.loc
	if c == nil {
		return SatStart{}
	}
	ph := 1
	if liquid {
		ph = 0
	}
	if l.have&(1<<coordT) == 0 {
		c.locateCoords(l, l.i, l.T, 1<<coordT)
	}
	w := l.s[coordT]
	a, b := &c.nodes[l.i].start[ph], &c.nodes[l.i+1].start[ph]
	return SatStart{Cv: lerp(a.Cv, b.Cv, w), Cp: lerp(a.Cp, b.Cp, w), W: lerp(a.W, b.W, w),
		KappaT: lerp(a.KappaT, b.KappaT, w), Expansivity: lerp(a.Expansivity, b.Expansivity, w),
		DpDrho: lerp(a.DpDrho, b.DpDrho, w), DpDT: lerp(a.DpDT, b.DpDT, w)}
}

// Liquid and Vapor return the estimated saturated phases at sp as the
// Liquid and Vapor of its SatEstimate (without the bounds).
func (sp *SatPoint) Liquid() Props { return sp.phase(0) }
func (sp *SatPoint) Vapor() Props  { return sp.phase(1) }

// phase returns the estimated saturated phase ph (0 liquid, 1 vapour).
func (sp *SatPoint) phase(ph int) Props {
	if sp.c == nil {
		return Props{}
	}
	p, _, _ := sp.Pressure()
	sp.c.locateCoords(&sp.loc, sp.loc.i, sp.loc.T, allCoords&^sp.loc.have)
	var pr Props
	sp.fillPhase(ph, p, &pr)
	return pr
}

// fillPhase fills pr with the estimated saturated phase ph at pressure p;
// every coordinate of sp must be computed.
func (sp *SatPoint) fillPhase(ph int, p float64, pr *Props) {
	c, l, f := sp.c, &sp.loc, sp.f
	T := l.T
	a, b := &c.nodes[l.i], &c.nodes[l.i+1]
	w := l.s[coordT]
	sa, sb := &a.start[ph], &b.start[ph]
	rho := elem.Exp(c.valueAt(l, sqLnRhoL+ph))
	*pr = Props{T: T, Rho: rho, P: p,
		U: c.valueAt(l, sqUL+ph) + f.hOff, H: c.valueAt(l, sqHL+ph) + f.hOff, S: c.valueAt(l, sqSL+ph) + f.sOff,
		Cv: lerp(sa.Cv, sb.Cv, w), Cp: lerp(sa.Cp, sb.Cp, w), W: lerp(sa.W, sb.W, w),
		KappaT: lerp(sa.KappaT, sb.KappaT, w), Expansivity: lerp(sa.Expansivity, sb.Expansivity, w),
		DpDrho: lerp(sa.DpDrho, sb.DpDrho, w), DpDT: lerp(sa.DpDT, sb.DpDT, w),
		Flags: Saturated}
	pr.G = pr.H - T*pr.S
	pr.F = pr.U - T*pr.S
	pr.Z = p / (rho * f.r * T)
	pr.JouleThomson = (T*pr.Expansivity - 1) / (rho * pr.Cp)
}

// Solve sets dst to the equation's saturation at sp: at its pressure for
// a point located at a pressure (SaturationPointAtP, LocateP), else at
// its temperature, started from the point's temperature and saturated
// densities, as SaturationAtPFrom and SaturationAtTFrom are, with their
// results and errors (dst is the zero Saturation with an error). Away
// from the critical point that costs one evaluation of each phase (see
// SaturationAtPFrom). dst is filled in place: a hot path spares itself
// the copies of a returned Saturation. The zero SatPoint gives an error
// wrapping ErrInvalidInput.
func (sp *SatPoint) Solve(dst *Saturation) error {
	c, l, f := sp.c, &sp.loc, sp.f
	if c == nil {
		*dst = Saturation{}
		return NewError("fluid.SatPoint.Solve", ErrInvalidInput, "the zero SatPoint is no point of a curve")
	}
	rl, rv := elem.Exp(c.value(l, sqLnRhoL)), elem.Exp(c.value(l, sqLnRhoV))
	if sp.p > 0 {
		return f.setSaturationAtPFrom(dst, sp.p, l.T, rl, rv)
	}
	return f.setSaturationAtTFrom(dst, l.T, rl, rv)
}

// Estimate fills e with the whole estimate at sp (see SatEstimate).
func (sp *SatPoint) Estimate(e *SatEstimate) {
	c, l := sp.c, &sp.loc
	if c == nil {
		*e = SatEstimate{}
		return
	}
	c.locateCoords(l, l.i, l.T, allCoords&^l.have)
	bd := &c.ivs[l.i].err
	var p, errP float64
	dpdT := c.slopeAt(l, sqLnP)
	if sp.p > 0 {
		p = sp.p
	} else {
		p = elem.Exp(c.valueAt(l, sqLnP))
		errP = p * bd[sqLnP]
	}
	e.T, e.P = l.T, p
	e.Slope.P = dpdT * p
	e.Err = SatError{P: errP}
	for ph := 0; ph < 2; ph++ {
		pr, sl, er := &e.Liquid, &e.Slope.Liquid, &e.Err.Liquid
		if ph == 1 {
			pr, sl, er = &e.Vapor, &e.Slope.Vapor, &e.Err.Vapor
		}
		sp.fillPhase(ph, p, pr)
		rho := pr.Rho
		*sl = PhaseValues{Rho: c.slopeAt(l, sqLnRhoL+ph) * rho, H: c.slopeAt(l, sqHL+ph),
			S: c.slopeAt(l, sqSL+ph), U: c.slopeAt(l, sqUL+ph)}
		*er = PhaseValues{Rho: rho * bd[sqLnRhoL+ph], H: bd[sqHL+ph],
			S: bd[sqSL+ph], U: bd[sqUL+ph]}
	}
	if eT := sp.errT(); eT > 0 {
		e.addErrT(eT)
	}
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
// SaturationPointAtT reads single values at a fraction of its cost.
func (f *Fluid) SaturationEstimateAtT(T float64) (e SatEstimate, ok bool) {
	sp, ok := f.SaturationPointAtT(T)
	if ok {
		sp.Estimate(&e)
	}
	return e, ok
}

// SaturationEstimateNodes appends to dst the temperatures in K of the
// nodes of f's cached saturation curve, ascending from the triple point to
// Critical().T − 1 mK, and returns the extended slice: there the
// estimates (SaturationPointAtT, SaturationEstimateAtT) are the
// equation's own saturation, solved when the curve was built, to
// rounding (the densities and the pressure through their logarithms), and
// the curve's pieces meet. It appends nothing for a fluid without a
// cached curve.
func (f *Fluid) SaturationEstimateNodes(dst []float64) []float64 {
	c := f.satCurve()
	if c == nil {
		return dst
	}
	return append(dst, c.ts...)
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
	p, errP, _, ok = f.VaporPressureSlopeEstimate(T)
	return p, errP, ok
}

// VaporPressureSlopeEstimate is VaporPressureEstimate with the slope
// dp/dT of the cached curve at T in Pa/K, for carrying the estimate to a
// nearby temperature: within 1e-9 of the equation's Clausius–Clapeyron
// slope up to 1 K below Tc, within 1e-7 from there to Tc − 2 mK
// (TestVaporPressureSlope).
func (f *Fluid) VaporPressureSlopeEstimate(T float64) (p, errP, dpdT float64, ok bool) {
	c := f.satCurve()
	if c == nil {
		return 0, 0, 0, false
	}
	i := c.intervalT(T)
	if i < 0 {
		return 0, 0, 0, false
	}
	l := c.locateT(i, T)
	p = elem.Exp(c.value(&l, sqLnP))
	return p, p * c.ivs[i].err[sqLnP], p * c.slope(&l, sqLnP), true
}

// SaturationEstimateAtP returns the estimated saturation of f at pressure
// p in Pa, as SaturationEstimateAtT: ok is false outside the pressures of
// its temperature range. Err.T bounds the error of the estimated T, and
// the phases' errors include its effect.
func (f *Fluid) SaturationEstimateAtP(p float64) (e SatEstimate, ok bool) {
	sp, ok := f.SaturationPointAtP(p)
	if ok {
		sp.Estimate(&e)
	}
	return e, ok
}

// SatValue selects a value of a saturated phase, for
// SaturationEstimatesWhere and SatPoint.
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

// SaturationPointsWhere appends to dst the points of the cached curve of
// f at which value v of a saturated phase equals x (SI units, in f's
// reference state), in ascending temperature, within the range of
// SaturationEstimateAtT, and returns the extended slice. Each is located
// as by SaturationPointAtP: the bound of the error of its temperature
// (large where v hardly changes with T) enters every value's bound.
// Values that rise or fall monotonically along the curve (ρ′, ρ″, h′,
// s′, u′, s″) have at most one such point; the density of liquid water
// (a maximum near 277 K) and h″ and u″ (a maximum well below Tc) can have
// two. With dst of enough capacity the call allocates nothing.
func (f *Fluid) SaturationPointsWhere(v SatValue, x float64, dst []SatPoint) []SatPoint {
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
		target = elem.Log(x)
	case q == sqSL || q == sqSV:
		target -= f.sOff
	default:
		target -= f.hOff
	}
	for _, sg := range c.segs[q] {
		i := sg.a
		if m := float64(sg.m); m != 0 {
			// One crossing at most: the interval by bisection of the
			// run's nodes.
			if (c.nodes[sg.a].v[q]-target)*m > 0 || (c.nodes[sg.b].v[q]-target)*m < 0 {
				continue
			}
			a, b := sg.a, sg.b
			for b-a > 1 {
				mid := (a + b) / 2
				if (c.nodes[mid].v[q]-target)*m > 0 {
					b = mid
				} else {
					a = mid
				}
			}
			i = a
		}
		dst = f.crossingsIn(c, i, q, target, dst)
	}
	return dst
}

// crossingsIn appends to dst the points of interval i of the curve c
// where quantity q equals target: where the nodes' values straddle it,
// and two where an extremum inside lies beyond it. A crossing exactly at
// a node belongs to the interval that starts there (the last interval
// keeps its end).
func (f *Fluid) crossingsIn(c *satCurve, i, q int, target float64, dst []SatPoint) []SatPoint {
	a, b := &c.nodes[i], &c.nodes[i+1]
	fa, fb := a.v[q]-target, b.v[q]-target
	switch {
	case fa == 0:
		dst = append(dst, f.pointWhere(c, i, q, target, 0, 0))
	case fb == 0 && i == len(c.ivs)-1:
		dst = append(dst, f.pointWhere(c, i, q, target, 1, 1))
	case fb == 0:
		// At the next interval's first node.
	case (fa < 0) != (fb < 0):
		dst = append(dst, f.pointWhere(c, i, q, target, 0, 1))
	case (a.d[q] < 0) != (b.d[q] < 0):
		// An extremum inside: two roots where it lies beyond x.
		sm := c.extremumIn(i, q)
		if fm := c.ivs[i].poly[q].at(sm) - target; fm != 0 && (fm < 0) != (fa < 0) {
			dst = append(dst, f.pointWhere(c, i, q, target, 0, sm))
			dst = append(dst, f.pointWhere(c, i, q, target, sm, 1))
		}
	}
	return dst
}

// SaturationEstimatesWhere appends to dst the estimated saturation states
// of f at which value v of a saturated phase equals x, the estimates at
// the points of SaturationPointsWhere, and returns the extended slice.
// Each is as SaturationEstimateAtP: Err.T bounds the error of its
// temperature, and the phases' errors include its effect. With dst of
// enough capacity the call allocates nothing.
func (f *Fluid) SaturationEstimatesWhere(v SatValue, x float64, dst []SatEstimate) []SatEstimate {
	var buf [4]SatPoint
	for _, sp := range f.SaturationPointsWhere(v, x, buf[:0]) {
		var e SatEstimate
		sp.Estimate(&e)
		dst = append(dst, e)
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

// lerp returns a + w(b − a).
func lerp(a, b, w float64) float64 { return a + w*(b-a) }
