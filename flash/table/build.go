package table

import (
	"errors"
	"math"
	"runtime"
	"slices"
	"sync"

	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/sublimation"
)

// This file builds the tables: the slabs in ln p (PH, PT) and ln ρ (DU),
// their boundary curves, and the patches between them, node by node
// from the equation of state, in parallel.

// resolution sets the grids: the steps in ln p and ln ρ of the slabs'
// axes, the nodes in η of the patches, the nodes of the saturation
// curves.
type resolution struct {
	dx0  float64 // the initial step of the slabs' grids in x
	nSat int     // the initial nodes of the saturation curves
}

var defaultResolution = resolution{dx0: 0.25, nSat: 33}

// builder carries what the build needs.
type builder struct {
	f        *fluid.Fluid
	sol      sublimation.Solid
	hasSolid bool
	crit     fluid.Point
	t        *Table
	res      resolution

	mu   sync.Mutex
	jobs []func() error
}

func errBuild(why string) error { return errors.New(why) }

// fail wraps an error of the build.
func (b *builder) fail(what string, err error) error {
	why := what
	if err != nil {
		why += ": " + err.Error()
	}
	return fluid.NewError("table.New", fluid.ErrNoConvergence, why,
		fluid.Input{Name: "fluid", Value: 0, Unit: b.f.Name()})
}

func lnP(x float64) float64  { return ln(x) }
func expP(x float64) float64 { return math.Exp(x) }
func nan() float64           { return math.NaN() }
func inf() float64           { return math.Inf(1) }
func sqrt(x float64) float64 { return math.Sqrt(x) }

// New builds the tables of f, with its reference state, over the range r
// (zero fields: the fluid's defaults, see Range). It evaluates the
// equation of state at every node (about two evaluations a node, marching
// along each grid line from a boundary), on all processors: 0.2–0.4 s and
// 9–17 MB for the default range of each fluid on a 2-core machine.
//
// Special cases are:
//
//	f nil, a field of r NaN, ±Inf or negative, PMin ≥ PMax or TMin ≥ TMax:
//	  error wrapping fluid.ErrInvalidInput
//	r not enclosing the critical neighbourhood (PMin < 0.9·pc, PMax >
//	  1.1·pc, TMax > 1.05·Tc, TMin below the saturation temperature at
//	  0.9·pc), TMin below the fluid's lowest fluid state (the triple point
//	  without a solid model, the vapour floor with one), TMax or PMax
//	  beyond the equation's accepted range: fluid.ErrOutOfRange
//	a node the equation's solvers cannot reach: fluid.ErrNoConvergence
func New(f *fluid.Fluid, r Range) (*Table, error) {
	return newWith(f, r, defaultResolution)
}

func newWith(f *fluid.Fluid, r Range, res resolution) (*Table, error) {
	if f == nil {
		return nil, fluid.NewError("table.New", fluid.ErrInvalidInput, "nil fluid")
	}
	b := &builder{f: f, crit: f.Critical(), res: res}
	t := &Table{f: f, lim: f.Limits(), crit: b.crit, rgas: f.GasConstant()}
	b.t = t
	if sol, err := sublimation.For(f); err == nil {
		b.sol, b.hasSolid, t.solid = sol, true, true
	}
	if err := b.resolve(r); err != nil {
		return nil, err
	}
	defs := b.pDefs()
	b.pSlabs(defs)
	if err := b.dSlabs(defs); err != nil {
		return nil, err
	}
	b.add(func() error { return b.buildSat(b.res.nSat) })
	if err := b.run(); err != nil {
		return nil, err
	}
	for _, ts := range []*tables{&t.ph, &t.pt, &t.du} {
		ts.join()
		t.bytes += ts.size()
	}
	var sv satVals
	t.sat.at(t.sat.x.x[0], &sv)
	vl, vv := 1/sv[sRhoL], math.Exp(-sv[sLnRhoV])
	t.triple = [4]float64{vl, vv, sv[sHL] - t.ptr*vl, sv[sHV] - t.ptr*vv}
	t.bytes += t.sat.size()
	return t, nil
}

// size returns the bytes of the grid, curves and patches of s.
func (s *slab) size() int {
	n := s.x.size()
	for _, c := range s.v.b {
		n += 8 * len(c)
	}
	for _, bd := range s.v.bands {
		if bd.patch != nil {
			n += 8*len(bd.patch.data) + 4*len(bd.patch.data32) + bd.patch.eta.size()
		}
	}
	return n
}

// add queues a job of the build.
func (b *builder) add(job func() error) {
	b.mu.Lock()
	b.jobs = append(b.jobs, job)
	b.mu.Unlock()
}

// run runs the queued jobs on all processors; the first error wins.
func (b *builder) run() error {
	jobs := b.jobs
	b.jobs = nil
	ch := make(chan func() error)
	var wg sync.WaitGroup
	var mu sync.Mutex
	var first error
	for w := 0; w < runtime.GOMAXPROCS(0); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for job := range ch {
				if err := job(); err != nil {
					mu.Lock()
					if first == nil {
						first = err
					}
					mu.Unlock()
				}
			}
		}()
	}
	for _, j := range jobs {
		ch <- j
	}
	close(ch)
	wg.Wait()
	return first
}

// resolve fills in and checks the range, the triple point and the
// critical neighbourhood.
func (b *builder) resolve(r Range) error {
	f, t := b.f, b.t
	in := []fluid.Input{{Name: "PMin", Value: r.PMin, Unit: "Pa"}, {Name: "PMax", Value: r.PMax, Unit: "Pa"},
		{Name: "TMin", Value: r.TMin, Unit: "K"}, {Name: "TMax", Value: r.TMax, Unit: "K"}}
	bad := func(sentinel error, why string) error {
		return fluid.NewError("table.New", sentinel, why, in...)
	}
	for _, x := range []float64{r.PMin, r.PMax, r.TMin, r.TMax} {
		if !finite(x) || x < 0 {
			return bad(fluid.ErrInvalidInput, "the range must be finite and not negative")
		}
	}
	t.tt = f.Triple().T
	st, err := f.SaturationAtT(t.tt)
	if err != nil {
		return b.fail("saturation at the triple point", err)
	}
	t.ptr = st.P
	d := defaults(f)
	if d.PMin == 0 {
		d.PMin = t.ptr
	}
	if r.PMin == 0 {
		r.PMin = d.PMin
	}
	if r.PMax == 0 {
		r.PMax = d.PMax
	}
	if r.TMin == 0 {
		r.TMin = d.TMin
	}
	if r.TMax == 0 {
		r.TMax = d.TMax
	}
	t.r = r
	// The equation's solvers cannot reach the accepted ceilings exactly.
	r.PMax = min(r.PMax, t.lim.PCeil*(1-1e-9))
	t.r = r
	if r.PMin >= r.PMax || r.TMin >= r.TMax {
		return bad(fluid.ErrInvalidInput, "PMin must be below PMax and TMin below TMax")
	}
	lim := t.lim
	c := b.crit
	sat1, err := f.SaturationAtP(critP1 * c.P)
	if err != nil {
		return b.fail("saturation at 0.9 pc", err)
	}
	t.nb = neighbourhood{p1: critP1 * c.P, p2: critP2 * c.P, t1: sat1.T, t2: critT2 * c.T,
		rho1: sat1.Vapor.Rho, rho2: sat1.Liquid.Rho}
	floor := t.tt
	if b.hasSolid {
		floor = lim.TFloor
	}
	switch {
	case r.TMax > lim.TCeil || r.PMax > lim.PCeil:
		return bad(fluid.ErrOutOfRange, "beyond the accepted range of "+f.Name()+": T <= "+
			fmtG(lim.TCeil)+" K, p <= "+fmtG(lim.PCeil)+" Pa")
	case r.TMin < floor:
		return bad(fluid.ErrOutOfRange, "TMin below the lowest fluid temperature of "+f.Name()+", "+fmtG(floor)+" K")
	case !(r.PMin < t.nb.p1 && r.PMax > t.nb.p2 && r.TMax > t.nb.t2 && r.TMin < t.nb.t1):
		return bad(fluid.ErrOutOfRange, "the range must enclose the critical neighbourhood: PMin < "+
			fmtG(t.nb.p1)+" Pa, PMax > "+fmtG(t.nb.p2)+" Pa, TMin < "+fmtG(t.nb.t1)+" K, TMax > "+
			fmtG(t.nb.t2)+" K")
	case r.PMin < t.ptr && b.hasSolid:
		// The vapour below the triple point must reach TMin or the
		// sublimation curve.
		if _, err := b.sol.SublimationTemperature(r.PMin); err != nil && r.TMin < t.tt {
			return bad(fluid.ErrOutOfRange, "PMin below the sublimation curve's range: "+err.Error())
		}
	}
	return nil
}

// slab kinds in ln p.
type pKind int8

const (
	pBelow pKind = iota // below the triple-point pressure: vapour only
	pSub                // from the triple point to p1: liquid, two-phase, vapour
	pBand               // p1 to p2: the critical neighbourhood between t1 and t2
	pHigh               // above p2, split at the critical isochore
	pTop                // above where the critical isochore leaves the range
)

// pdef is a slab in ln p before it is built.
type pdef struct {
	pa, pb float64
	kind   pKind
	low    bcurve // the lower boundary: TMin or the solid's curve
}

// lowCurve returns the lower boundary of the fluid at pressures around
// p: the isotherm TMin or, where the solid model's curve lies above it,
// that curve (sublimation below the triple-point pressure, melting
// above).
func (b *builder) lowCurve(p float64, liquid bool) bcurve {
	iso := bcurve{kind: cIsotherm, c: b.t.r.TMin, liquid: liquid}
	if !b.hasSolid {
		return iso
	}
	var co sublimation.Coexistence
	var err error
	kind := cMelt
	if liquid {
		co, err = b.sol.MeltingTemperature(p)
	} else {
		co, err = b.sol.SublimationTemperature(p)
		kind = cSub
	}
	if err != nil || co.T <= b.t.r.TMin {
		return iso
	}
	return bcurve{kind: kind}
}

// pDefs returns the slabs in ln p: split at the triple point, p1 and p2,
// and where TMin meets a solid curve.
func (b *builder) pDefs() []pdef {
	t := b.t
	r := t.r
	br := []float64{r.PMin, r.PMax, t.nb.p1, t.nb.p2}
	// Where the critical isochore, which splits the slabs above p2,
	// reaches TMax.
	pIso := math.Inf(1)
	if pr, err := b.f.Props(r.TMax, b.crit.Rho); err == nil {
		pIso = pr.P
		br = append(br, pIso)
	}
	if t.ptr > r.PMin {
		br = append(br, t.ptr)
	}
	if b.hasSolid && math.Abs(r.TMin-t.tt) > 1e-9*t.tt {
		if co, err := b.sol.MeltingPressure(r.TMin); err == nil {
			br = append(br, co.P)
		}
		if co, err := b.sol.SublimationPressure(r.TMin); err == nil {
			br = append(br, co.P)
		}
	}
	slices.Sort(br)
	var pts []float64
	for _, p := range br {
		if p < r.PMin || p > r.PMax {
			continue
		}
		if n := len(pts); n > 0 && p <= pts[n-1]*(1+1e-9) {
			continue
		}
		pts = append(pts, p)
	}
	var defs []pdef
	for k := 0; k+1 < len(pts); k++ {
		pa, pb := pts[k], pts[k+1]
		pm := math.Sqrt(pa * pb)
		d := pdef{pa: pa, pb: pb}
		switch {
		case pm < t.ptr:
			d.kind = pBelow
		case pm < t.nb.p1:
			d.kind = pSub
		case pm < t.nb.p2:
			d.kind = pBand
		case pm < pIso:
			d.kind = pHigh
		default:
			d.kind = pTop
		}
		d.low = b.lowCurve(pm, d.kind != pBelow)
		defs = append(defs, d)
	}
	return defs
}

// nodes returns the number of nodes of an axis of the given width and
// step.
func nodes(width, step float64) int {
	return max(2, int(math.Ceil(width/step-1e-9))+1)
}

// pSlabs queues the slabs in ln p of PH (boundaries in h) and PT (in T).
func (b *builder) pSlabs(defs []pdef) {
	t := b.t
	t.ph.slabs = make([]slab, len(defs))
	t.pt.slabs = make([]slab, len(defs))
	for n, d := range defs {
		top := bcurve{kind: cIsotherm, c: t.r.TMax}
		var cs []bcurve
		switch d.kind {
		case pBelow, pTop:
			cs = []bcurve{d.low, top}
		case pHigh:
			// Split at the critical isochore, which runs close to the
			// line of the maxima of cp above the critical point.
			cs = []bcurve{d.low, {kind: cIsochore, c: t.crit.Rho}, top}
		case pSub:
			cs = []bcurve{d.low, {kind: cSatLiquid}, {kind: cSatVapor}, top}
		case pBand:
			cs = []bcurve{d.low, {kind: cIsotherm, c: t.nb.t1, liquid: true}, {kind: cIsotherm, c: t.nb.t2}, top}
		}
		for _, fl := range [2]struct {
			v     variable
			props [maxProps]prop
			out   *slab
		}{
			{vH, [maxProps]prop{{vT, pIdent}, {vRho, pIdent}, {vS, pIdent}, cpProp, cvProp, wProp}, &t.ph.slabs[n]},
			{vT, [maxProps]prop{{vH, pIdent}, {vRho, pIdent}, {vS, pIdent}, cpProp, cvProp, wProp}, &t.pt.slabs[n]},
		} {
			s := &sbuild{b: b, a: vP, v: fl.v, aa: d.pa, ab: d.pb, dx0: b.res.dx0, curves: cs}
			liq := colSpec{a: vP, b: fl.v, props: fl.props}
			vap := liq
			vap.props[1].tr = pPerA
			out := fl.out
			var show []int // the curves the view places the second input by
			switch {
			case d.kind == pBelow:
				out.v.bands = []band{s.patch(0, 1, vap)}
			case d.kind == pHigh:
				out.v.bands = []band{s.patch(0, 1, liq), s.patch(1, 2, liq)}
			case d.kind == pTop:
				out.v.bands = []band{s.patch(0, 1, liq)}
			case d.kind == pSub && fl.v == vH:
				out.v.bands = []band{s.patch(0, 1, liq), {kind: bandTwoPhase}, s.patch(2, 3, vap)}
			case d.kind == pSub:
				// In T the saturated phases share one boundary.
				out.v.bands = []band{s.patch(0, 1, liq), s.patch(2, 3, vap)}
				show = []int{0, 1, 3}
			case d.kind == pBand:
				out.v.bands = []band{s.patch(0, 1, liq), {kind: bandOut}, s.patch(2, 3, liq)}
			}
			b.add(func() error {
				if err := s.build(); err != nil {
					return err
				}
				out.x = newGrid(s.xs)
				if show == nil {
					for k := range s.curves {
						show = append(show, k)
					}
				}
				for _, k := range show {
					out.v.b = append(out.v.b, s.curveOf(k))
				}
				return nil
			})
		}
	}
}

// patch adds a patch between the curves lo and hi to s and returns its
// band.
func (s *sbuild) patch(lo, hi int, spec colSpec) band {
	p := &patch{rhoPerA: spec.props[1].tr == pPerA}
	s.patches = append(s.patches, &pbuild{spec: spec, lo: lo, hi: hi, out: p})
	return band{kind: bandPatch, patch: p}
}

// bslope returns z and dz/dx at a boundary point, x = ln a:
// dz/dx = a (dz/dt)/(da/dt) along the curve.
func bslope(bp *bpoint, a, z variable) (val, d float64) {
	pr := &bp.pr
	da := along(pr, a, bp.dT, bp.dp)
	dz := along(pr, z, bp.dT, bp.dp)
	return value(pr, z), value(pr, a) * dz / da
}
