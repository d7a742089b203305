package helmholtz

import (
	"math"
	"slices"

	"github.com/tripoint-thermo/tripoint/internal/elem"
)

// powPlan computes the powers x^t of one base x > 0 for a fixed set of
// exponents with as few operations, and as short chains of dependent
// ones, as it can find. With q the smallest power-of-two denominator (at
// most maxRootQ) of the exponents, every exponent t = e/q, e an integer,
// is reached by multiplication from the seeds
//
//	1, x, x^(1/2), x^(1/4), …, x^(1/q)   (square roots)   and 1/x,
//
// each new power the product of two already computed, the pair chosen to
// keep the chain of dependent multiplications short (a sum e = a + b of
// two available exponents of least depth, else a binary split of e).
// Exponents that are not multiples of 1/maxRootQ, or far outside
// [minPowE, maxPowE], fall back to exp(t ln x) with one logarithm shared.
//
// The plan writes slot values into a *[maxSlots]float64, from slot base
// on (so that the plans of τ and δ share one array); slotOf gives each
// requested exponent's slot.
type powPlan struct {
	q, levels  int // denominator and log2 of it
	inv        bool
	base, next int // slots [base, next) are the plan's
	ops        []powOp
	generic    []genericPow
}

// powOp is one multiplication v[dst] = v[a]·v[b].
type powOp struct{ dst, a, b uint8 }

// genericPow is one power by exp(t ln x).
type genericPow struct {
	slot uint8
	t    float64
}

const (
	maxRootQ = 16
	minPowE  = -8
	maxPowE  = 80
	// maxSlots bounds the slots of the plans of one evaluation (requested
	// powers and intermediate products); slot indices are masked with
	// maxSlots−1, so that the evaluation needs no bounds checks.
	maxSlots = 64
	// Seed slots, after base: 1, x, 1/x, then x^(1/2), x^(1/4), … from
	// slotRoot on.
	slotOne  = 0
	slotX    = 1
	slotInv  = 2
	slotRoot = 3
)

// newPowPlan returns a plan for the exponents exps with its slots from
// base on, and the slot of each exponent; ok is false when the plan would
// need slots beyond maxSlots.
func newPowPlan(exps []float64, base int) (p powPlan, slotOf []int, ok bool) {
	fits := func(t float64, q int) bool {
		x := t * float64(q)
		return x == math.Trunc(x) && t >= minPowE && t <= maxPowE
	}
	p.q = 1
	for q := 1; q <= maxRootQ; q *= 2 {
		if !slices.ContainsFunc(exps, func(t float64) bool { return fits(t, maxRootQ) && !fits(t, q) }) {
			p.q = q
			break
		}
	}
	for l := p.q; l > 1; l /= 2 {
		p.levels++
	}
	p.base = base
	b := planBuilder{p: &p, slot: map[int]int{}, depth: map[int]int{}}
	b.seed(0, base+slotOne)
	b.seed(p.q, base+slotX)
	for i := 1; i <= p.levels; i++ {
		b.seed(p.q>>i, base+slotRoot+i-1)
	}
	b.next = base + slotRoot + p.levels
	// Exponents in units of 1/q, smallest magnitudes first so that the
	// larger ones can be sums of them.
	var units []int
	for _, t := range exps {
		if fits(t, p.q) {
			units = append(units, int(math.Round(t*float64(p.q))))
		}
	}
	slices.SortFunc(units, func(a, c int) int { return max(a, -a) - max(c, -c) })
	for _, e := range units {
		b.ensure(e)
	}
	slotOf = make([]int, len(exps))
	gen := map[float64]int{}
	for i, t := range exps {
		if fits(t, p.q) {
			slotOf[i] = b.slot[int(math.Round(t*float64(p.q)))]
			continue
		}
		s, seen := gen[t]
		if !seen {
			s = b.alloc()
			gen[t] = s
			p.generic = append(p.generic, genericPow{slot: uint8(s), t: t})
		}
		slotOf[i] = s
	}
	p.next = b.next
	return p, slotOf, b.next <= maxSlots
}

// planBuilder grows a powPlan: slot and depth of every exponent (in units
// of 1/q) available so far.
type planBuilder struct {
	p           *powPlan
	slot, depth map[int]int
	next        int
}

func (b *planBuilder) seed(e, s int) { b.slot[e], b.depth[e] = s, 0 }

func (b *planBuilder) alloc() int {
	s := b.next
	b.next++
	return s
}

// ensure makes x^(e/q) available and returns its slot.
func (b *planBuilder) ensure(e int) int {
	if s, ok := b.slot[e]; ok {
		return s
	}
	q := b.p.q
	// The pair of available exponents of least depth.
	best, bestDepth := 0, math.MaxInt
	keys := make([]int, 0, len(b.slot))
	for a := range b.slot {
		keys = append(keys, a)
	}
	slices.Sort(keys)
	for _, a := range keys {
		if a == 0 {
			continue
		}
		if _, ok := b.slot[e-a]; ok && e-a != 0 {
			if d := max(b.depth[a], b.depth[e-a]) + 1; d < bestDepth {
				best, bestDepth = a, d
			}
		}
	}
	var a, c int
	switch {
	case bestDepth < math.MaxInt:
		a, c = best, e-best
	case e < 0:
		// 1/x times x^((e+q)/q).
		if !b.p.inv {
			b.p.inv = true
			b.seed(-q, b.p.base+slotInv)
		}
		a, c = -q, e+q
	case e >= 2*q && e%q != 0:
		// Integer part times fractional part.
		a, c = e-e%q, e%q
	default:
		// Binary split: the largest power of two (in units of 1/q, or
		// of q for multiples of q) below e, and the rest.
		h := 1
		for h*2 < e {
			h *= 2
		}
		a, c = h, e-h
	}
	sa, sc := b.ensure(a), b.ensure(c)
	s := b.alloc()
	b.slot[e], b.depth[e] = s, max(b.depth[a], b.depth[c])+1
	b.p.ops = append(b.p.ops, powOp{dst: uint8(s), a: uint8(sa), b: uint8(sc)})
	return s
}

// eval fills the slots of p for base x > 0.
func (p *powPlan) eval(v *[maxSlots]float64, x float64) {
	b := p.base
	v[(b+slotOne)&(maxSlots-1)] = 1
	v[(b+slotX)&(maxSlots-1)] = x
	if p.inv {
		v[(b+slotInv)&(maxSlots-1)] = 1 / x
	}
	r := x
	for i := range p.levels {
		r = math.Sqrt(r)
		v[(b+slotRoot+i)&(maxSlots-1)] = r
	}
	for _, o := range p.ops {
		v[o.dst&(maxSlots-1)] = v[o.a&(maxSlots-1)] * v[o.b&(maxSlots-1)]
	}
	if len(p.generic) > 0 {
		lx := elem.Log(x)
		for _, g := range p.generic {
			v[g.slot&(maxSlots-1)] = elem.Exp(g.t * lx)
		}
	}
}
