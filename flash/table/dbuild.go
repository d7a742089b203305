package table

import (
	"math"
	"slices"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// This file sets up the slabs of DU, in x = ln ρ: the region of (ρ, u)
// that the range of (p, T) covers, bounded below by the lowest states of
// each isochore — the isobar PMin, the lower boundary of the vapour below
// the triple point, the saturated vapour, the saturated liquid, the lower
// boundary of the liquid (TMin or the melting curve) — and above by the
// isotherm TMax and the isobar PMax. Two-phase states lie below the
// saturated phases; near the critical density, between the saturated
// densities at p1, the tables start at the isotherm t2 and the mixtures
// below p1 are two-phase, those between the equation's.

// dpiece is a piece of the lower or upper boundary of the DU region: a
// curve between two densities, the state where it starts, and what lies
// below it.
type dpiece struct {
	c          bcurve
	ra, rb     float64
	start      bpoint
	below      bandKind
	band, none bool // the critical band; a band of densities left to the equation
}

// dSlabs queues the slabs of DU.
func (b *builder) dSlabs(defs []pdef) error {
	t := b.t
	r := t.r
	f := b.f
	vapour := func(T, p float64) (bpoint, error) {
		root := fluid.RootVapor
		if T >= b.crit.T || p >= b.crit.P {
			root = fluid.RootStable
		}
		pr, err := f.PropsTP(T, p, root, 0)
		return bpoint{pr: pr, dT: 0, dp: 1}, err
	}
	var lower, upper []dpiece
	add := func(list *[]dpiece, c bcurve, a, z bpoint, below bandKind) {
		*list = append(*list, dpiece{c: c, ra: a.pr.Rho, rb: z.pr.Rho, start: a, below: below})
	}
	// The lowest state on the isobar PMin: the vapour's lower boundary
	// below the triple point, else the saturated vapour.
	var lowMin bpoint
	var err error
	if r.PMin < t.ptr {
		lowMin, err = b.atP(defs[0].low, r.PMin, nil)
	} else {
		lowMin, err = b.atP(bcurve{kind: cSatVapor}, r.PMin, nil)
	}
	if err != nil {
		return b.fail("lower boundary at PMin", err)
	}
	topMin, err := vapour(r.TMax, r.PMin)
	if err != nil {
		return b.fail("TMax at PMin", err)
	}
	topMin.dT, topMin.dp = 1, 0
	add(&lower, bcurve{kind: cIsobar, c: r.PMin}, topMin, lowMin, bandOut)
	for _, d := range defs {
		if d.kind != pBelow {
			continue
		}
		a, err1 := b.atP(d.low, d.pa, nil)
		z, err2 := b.atP(d.low, d.pb, &a)
		if err1 != nil || err2 != nil {
			return b.fail("lower boundary below the triple point", err1)
		}
		add(&lower, d.low, a, z, bandOut)
	}
	satAt := func(kind curveKind, p float64) (bpoint, error) { return b.atP(bcurve{kind: kind}, p, nil) }
	pLow := max(r.PMin, t.ptr)
	v0, err1 := satAt(cSatVapor, pLow)
	v1, err2 := satAt(cSatVapor, t.nb.p1)
	l1, err3 := satAt(cSatLiquid, t.nb.p1)
	l0, err4 := satAt(cSatLiquid, pLow)
	if err := errors4(err1, err2, err3, err4); err != nil {
		return b.fail("saturation", err)
	}
	add(&lower, bcurve{kind: cSatVapor}, v0, v1, bandTwoPhase)
	iso2 := bcurve{kind: cIsotherm, c: t.nb.t2}
	b2, err := b.atRho(iso2, v1.pr.Rho, &v1)
	if err != nil {
		return b.fail("t2 isotherm", err)
	}
	lower = append(lower, dpiece{c: iso2, ra: v1.pr.Rho, rb: l1.pr.Rho, start: b2, below: bandTwoPhase, band: true})
	// The saturated liquid from p1 down: its density rises to the triple
	// point, or (water) to a maximum above it, then falls. Isochores
	// between the triple point's and the maximum cross the dome twice:
	// they are left to the equation.
	rhoEnd := l0.pr.Rho
	rhoMax := b.liquidDensityMax(pLow, l0)
	add(&lower, bcurve{kind: cSatLiquid}, l1, l0, bandTwoPhase)
	lower[len(lower)-1].rb = rhoEnd
	if rhoMax > rhoEnd*(1+1e-12) {
		lower = append(lower, dpiece{ra: rhoEnd, rb: rhoMax, none: true})
		t.gap = [2]float64{rhoEnd, rhoMax}
	}
	first := true
	for _, d := range defs {
		if d.kind == pBelow {
			continue
		}
		a, err1 := b.atP(d.low, d.pa, nil)
		z, err2 := b.atP(d.low, d.pb, &a)
		if err1 != nil || err2 != nil {
			return b.fail("lower boundary of the liquid", err1)
		}
		if first && rhoMax > a.pr.Rho {
			if a, err = b.atRho(d.low, rhoMax, &a); err != nil {
				return b.fail("lower boundary of the liquid", err)
			}
		}
		first = false
		add(&lower, d.low, a, z, bandOut)
	}
	topMax, err := vapour(r.TMax, r.PMax)
	if err != nil {
		return b.fail("TMax at PMax", err)
	}
	add(&upper, bcurve{kind: cIsotherm, c: r.TMax}, topMin, topMax, bandOut)
	upper[0].start.dT, upper[0].start.dp = 0, 1
	topMax.dT, topMax.dp = 1, 0
	last := lower[len(lower)-1]
	add(&upper, bcurve{kind: cIsobar, c: r.PMax}, topMax, last.start, bandOut)
	upper[1].rb = last.rb
	// The slabs: between every end of a piece, and at ρc.
	br := []float64{b.crit.Rho}
	for _, ps := range [][]dpiece{lower, upper} {
		for _, p := range ps {
			br = append(br, p.ra, p.rb)
		}
	}
	slices.Sort(br)
	var ends []float64
	for _, x := range br {
		if n := len(ends); n == 0 || x > ends[n-1]*(1+1e-12) {
			ends = append(ends, x)
		}
	}
	pieceAt := func(ps []dpiece, rho float64) int {
		for k := range ps {
			if rho >= ps[k].ra && rho <= ps[k].rb {
				return k
			}
		}
		return -1
	}
	t.du.slabs = make([]slab, len(ends)-1)
	// Each piece's state at the start of each slab, marching up in ρ.
	at := func(ps []dpiece, k int, rho float64) (bpoint, error) {
		bp, err := b.atRho(ps[k].c, rho, &ps[k].start)
		if err == nil {
			ps[k].start = bp
		}
		return bp, err
	}
	for n := 0; n+1 < len(ends); n++ {
		ra, rb := ends[n], ends[n+1]
		rm := math.Sqrt(ra * rb)
		lo, hi := pieceAt(lower, rm), pieceAt(upper, rm)
		out := &t.du.slabs[n]
		if lo < 0 || hi < 0 || lower[lo].none {
			// Left to the equation: a grid without curves.
			out.x = newGrid([]float64{ln(ra), ln(rb)})
			continue
		}
		sl, err1 := at(lower, lo, ra)
		su, err2 := at(upper, hi, ra)
		if err := errors4(err1, err2); err != nil {
			return b.fail("boundary at rho = "+fmtG(ra)+" kg/m3", err)
		}
		pl, pu := lower[lo], upper[hi]
		s := &sbuild{b: b, a: vRho, v: vU, aa: ra, ab: rb, dx0: b.res.dx0,
			curves: []bcurve{pl.c, pu.c}, start: []bpoint{sl, su}}
		spec := colSpec{a: vRho, b: vU, props: [maxProps]prop{{vT, pIdent}, {vP, pPerRho}, {vS, pIdent}, cpProp, cvProp, wProp}}
		out.v.below = pl.below
		if pl.band {
			out.v.bands = []band{{kind: bandOut}, s.patch(0, 1, spec)}
		} else {
			out.v.bands = []band{s.patch(0, 1, spec)}
		}
		band := pl.band
		b.add(func() error {
			if err := s.build(); err != nil {
				return err
			}
			out.x = newGrid(s.xs)
			if band {
				out.v.b = append(out.v.b, b.mixCurve(s.xs))
			}
			out.v.b = append(out.v.b, s.curveOf(0), s.curveOf(1))
			if out.v.below == bandTwoPhase && !band {
				// ln p along the saturated phase: d ln p/dx = (dp/dx)/p.
				c := make(curve, 2*len(s.xs))
				for i := range s.xs {
					p, dp := bslope(&s.pts[0][i], vRho, vP)
					c[2*i], c[2*i+1] = ln(p), dp/p
				}
				out.v.lnPSat = c
			}
			return nil
		})
	}
	return nil
}

func errors4(errs ...error) error {
	for _, e := range errs {
		if e != nil {
			return e
		}
	}
	return nil
}

// mixCurve returns the internal energy of the liquid–vapour mixtures at
// p1 as a curve of x = ln ρ at the nodes xs:
//
//	u(ρ) = u′ + (u″ − u′)(1/ρ − v′)/(v″ − v′),  du/dx = −(u″ − u′)/(ρ (v″ − v′)).
func (b *builder) mixCurve(xs []float64) curve {
	s, err := b.f.SaturationAtP(b.t.nb.p1)
	c := make(curve, 2*len(xs))
	if err != nil {
		return c
	}
	vl, vv := 1/s.Liquid.Rho, 1/s.Vapor.Rho
	ul, uv := s.Liquid.U, s.Vapor.U
	for i, x := range xs {
		rho := math.Exp(x)
		c[2*i] = ul + (uv-ul)*(1/rho-vl)/(vv-vl)
		c[2*i+1] = -(uv - ul) / (rho * (vv - vl))
	}
	return c
}

// liquidDensityMax returns the greatest density of the saturated liquid
// between pLow (state l0) and a few kelvin above: l0's own where it
// falls with T from there, else (water) the maximum, by golden-section
// search in T.
func (b *builder) liquidDensityMax(pLow float64, l0 bpoint) float64 {
	rho := func(T float64) float64 {
		s, err := b.f.SaturationAtT(T)
		if err != nil {
			return 0
		}
		return s.Liquid.Rho
	}
	T0 := l0.pr.T
	if rho(T0+0.5) <= l0.pr.Rho {
		return l0.pr.Rho
	}
	a, c := T0, T0+40
	g := (math.Sqrt(5) - 1) / 2
	x1, x2 := c-g*(c-a), a+g*(c-a)
	f1, f2 := rho(x1), rho(x2)
	for c-a > 1e-7 {
		if f1 > f2 {
			c, x2, f2 = x2, x1, f1
			x1 = c - g*(c-a)
			f1 = rho(x1)
		} else {
			a, x1, f1 = x1, x2, f2
			x2 = a + g*(c-a)
			f2 = rho(x2)
		}
	}
	return max(f1, f2)
}
