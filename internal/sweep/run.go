package main

import (
	"errors"
	"fmt"
	"math"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// failKind is the kind of a failure.
type failKind uint8

const (
	fRefused     failKind = iota // a state that exists was refused
	fAccepted                    // a state was returned where none may be
	fPhase                       // a wrong phase, or a flag the contract asks for missing
	fInvalid                     // NaN, an infinity outside the contract, fractions that do not add up
	fPanic                       // a panic (recovered)
	fResidual                    // a round trip beyond its bound
	fError                       // an error that is not a *fluid.Error with a sentinel and an ASCII message
	fConsistency                 // a consistency check beyond its bound
	nFail
)

var failNames = [nFail]string{"refused", "accepted", "phase", "invalid", "panic", "residual", "error", "consistency"}

// failure is one failure, with a reproducer: its kind, the region of its
// case, the forward flash and the flash that failed (the forward one, or
// an inverse), and the report.
type failure struct {
	kind             failKind
	region           region
	forward, failing string
	text             string
}

// worst is the largest value of a measure and where it was seen.
type worst struct {
	v     float64
	where string
	n     int // how many values were measured
}

func (w *worst) add(v float64, where func() string) {
	w.n++
	if v > w.v || math.IsNaN(v) && !math.IsNaN(w.v) {
		w.v, w.where = v, where()
	}
}

func (w *worst) merge(o *worst) {
	w.n += o.n
	if o.v > w.v || math.IsNaN(o.v) && !math.IsNaN(w.v) {
		w.v, w.where = o.v, o.where
	}
}

// consistency measures, with their bounds.
type measure uint8

const (
	cMaxwell   measure = iota // (∂s/∂ρ)_T = −(∂p/∂T)_ρ/ρ², by differences of s
	cEnergy                   // (∂u/∂ρ)_T = (p − T(∂p/∂T)_ρ)/ρ², by differences of u
	cCv                       // cv = (∂u/∂T)_ρ, by differences of u
	cDpDrho                   // (∂p/∂ρ)_T, by differences of p
	cCpCv                     // cp − cv = T v β²/κ_T
	cSolidMaxw                // solid: (∂s/∂p)_T = −(∂v/∂T)_p, by differences of s
	cSolidCp                  // solid: cp = T(∂s/∂T)_p, by differences of s
	cGibbs                    // |Δg|/(RT) between coexisting phases
	cPressure                 // |Δp| between a phase and the state, in units of the bound
	cClapeyron                // dp/dT of a curve by differences against (Δs)/(Δv)
	cQuality                  // |Δq| and |Δ solid| of an inverse flash of a mixture
	nMeasures
)

var measureNames = [nMeasures]string{
	"Maxwell (ds/drho)_T = -(dp/dT)_rho/rho^2   [rel, differences]",
	"energy (du/drho)_T = (p - T(dp/dT)_rho)/rho^2 [rel, differences]",
	"cv = (du/dT)_rho                            [rel, differences]",
	"(dp/drho)_T                                 [rel to RT, differences]",
	"cp - cv = T v beta^2/kappa_T                [rel to cp]",
	"solid Maxwell (ds/dp)_T = -(dv/dT)_p        [rel, differences]",
	"solid cp = T (ds/dT)_p                      [rel, differences]",
	"Gibbs equality |g_i - g_j|/(RT)",
	"pressure equality |p_i - p| / bound",
	"Clausius-Clapeyron dp/dT                    [rel, differences]",
	"quality and solid fraction of inverse flashes [abs]",
}

// measureBounds: a value beyond is a failure. The difference checks are
// fourth-order differences with steps of 1e-3 of the variable and half
// that, Richardson-extrapolated (deriv): truncation and rounding stay well
// below 1e-6 away from the critical point, next to the spinodals too
// (within 1e-3 of it in reduced (δ, τ) they are not made); the
// identity cp − cv is algebra in double precision (1e-12); Gibbs
// equality: the saturation solver claims 1e-12 (its last millikelvin
// below Tc included) and the solid curves a few 1e-12, so 1e-11; pressure
// equality is held to DESIGN.md's backward-residual bound; the quality of
// an inverse two-phase flash, well conditioned more than 1 K below Tc, to
// 1e-7.
var measureBounds = [nMeasures]float64{1e-6, 1e-6, 1e-6, 1e-6, 1e-12, 1e-6, 1e-6, 1e-11, 1, 1e-6, 1e-7}

// result accumulates what one chunk of cases (or a whole sweep) found.
type result struct {
	cases     int
	states    [nRegions]int          // forward states returned
	refusedOK [nRegions]int          // refusals the judge allowed or asked for
	byPhase   [nRegions][9]int       // forward states by phase
	flashes   int                    // flash calls
	fails     [nFail]int             // failures by kind
	first     [nFail][]failure       // the first failures of each kind
	resid     [16][nQuantities]worst // by flash (index in inverses) and input
	cons      [nMeasures]worst       // consistency
	skipped   int                    // difference checks left out near the critical point or at a range edge
	errSeen   map[string]int         // sentinel of refusals, by flash
	maxFirst  int                    // how many failures of each kind to keep
	// prev is the previous forward state of the chunk, the warm start
	// of the inverse flashes of the next (see inverses), with the
	// reproducer of its flash.
	prev struct {
		st    flash.State
		repro string
		ok    bool
	}
	fluidName string // for reproducers
	// at is where the checks are: the case's region, its forward flash
	// and the flash being judged (for failure records).
	at struct {
		region           region
		forward, failing string
	}
}

func newResult(fluidName string, maxFirst int) *result {
	return &result{maxFirst: maxFirst, fluidName: fluidName, errSeen: map[string]int{}}
}

func (r *result) fail(k failKind, format string, args ...any) {
	r.fails[k]++
	if len(r.first[k]) < r.maxFirst {
		r.first[k] = append(r.first[k], failure{k, r.at.region, r.at.forward, r.at.failing, fmt.Sprintf(format, args...)})
	}
}

// merge adds o to r; merged in case order, the result does not depend on
// the order in which the chunks were computed.
func (r *result) merge(o *result) {
	r.cases += o.cases
	for i := range r.states {
		r.states[i] += o.states[i]
		r.refusedOK[i] += o.refusedOK[i]
		for j := range r.byPhase[i] {
			r.byPhase[i][j] += o.byPhase[i][j]
		}
	}
	r.flashes += o.flashes
	r.skipped += o.skipped
	for k := range r.fails {
		r.fails[k] += o.fails[k]
		for _, f := range o.first[k] {
			if len(r.first[k]) < r.maxFirst {
				r.first[k] = append(r.first[k], f)
			}
		}
	}
	for i := range r.resid {
		for j := range r.resid[i] {
			r.resid[i][j].merge(&o.resid[i][j])
		}
	}
	for i := range r.cons {
		r.cons[i].merge(&o.cons[i])
	}
	for k, v := range o.errSeen {
		r.errSeen[k] += v
	}
}

// sentinelName names the sentinel err wraps.
func sentinelName(err error) string {
	for _, s := range []error{fluid.ErrInvalidInput, fluid.ErrOutOfRange, fluid.ErrNoConvergence,
		fluid.ErrUnstable, fluid.ErrUndefined} {
		if errors.Is(err, s) {
			return s.Error()
		}
	}
	return "no sentinel"
}

// runCase runs the forward flash of c and everything that follows from it.
func (s *setup) runCase(c *tcase, r *result) {
	r.cases++
	fw := forward[c.kind]
	r.at.region, r.at.forward, r.at.failing = c.region, fw.name, fw.name
	opt := c.options()
	st, err, pan := call(fw.fn, s.f, c.a, c.b, opt)
	r.flashes++
	rep := func() string { return repro(fw.name, c.a, c.b, opt) }
	if pan != nil {
		r.fail(fPanic, "%s %s: %s: panic: %v", s.f.Name(), regionNames[c.region], rep(), pan)
		return
	}
	v := s.judge(c)
	if err != nil {
		if why := errorFault(err, "flash."+fw.name); why != "" {
			r.fail(fError, "%s %s: %s: error %q: %s", s.f.Name(), regionNames[c.region], rep(), err, why)
		}
		bad := errors.Is(err, fluid.ErrNoConvergence) || v.must == mustState
		if bad {
			r.fail(fRefused, "%s %s: %s: %v (a state exists: want %v)", s.f.Name(), regionNames[c.region], rep(), err, v.want)
			return
		}
		r.refusedOK[c.region]++
		r.errSeen[fw.name+": "+sentinelName(err)]++
		return
	}
	if v.must == mustRefuse {
		r.fail(fAccepted, "%s %s: %s returned %s; no state may be returned there", s.f.Name(), regionNames[c.region], rep(), brief(&st))
		return
	}
	r.states[c.region]++
	if why := s.invalid(&st); why != "" {
		r.fail(fInvalid, "%s %s: %s: %s: %s", s.f.Name(), regionNames[c.region], rep(), why, brief(&st))
		return
	}
	r.byPhase[c.region][st.Phase]++
	if !v.want.has(st.Phase) {
		r.fail(fPhase, "%s %s: %s: phase %v, want %v: %s", s.f.Name(), regionNames[c.region], rep(), st.Phase, v.want, brief(&st))
	}
	if v.meta && st.Flags&fluid.Metastable == 0 {
		r.fail(fPhase, "%s %s: %s: a metastable state not flagged Metastable: %s", s.f.Name(), regionNames[c.region], rep(), brief(&st))
	}
	s.checkKnown(c, &st, r, rep)
	// The forward inputs, by the backward-residual bounds.
	fi := s.flashIndex(fw.name)
	for _, q := range [2]struct {
		q quantity
		v float64
	}{{fw.a, c.a}, {fw.b, c.b}} {
		if q.q == qQ && st.Phase != flash.TwoPhase && st.Phase != flash.SolidVapor {
			continue // q = 0 or 1, or the critical point
		}
		s.residual(r, fi, &st, q.q, q.v, rep)
	}
	s.consistency(c, &st, r, rep)
	s.inverses(c, &st, r)
	r.prev.st, r.prev.repro, r.prev.ok = st, rep(), true
}

// checkKnown checks a state built from a known mixture (the fractions of
// a three-phase DU, the solid fraction of a solid–liquid PH) and the
// contract of saturated states from TQ and PQ.
func (s *setup) checkKnown(c *tcase, st *flash.State, r *result, rep func() string) {
	if c.kind == kTQ || c.kind == kPQ {
		if (c.b == 0 || c.b == 1) && st.Flags&fluid.AtCritical == 0 {
			if st.Flags&fluid.Saturated == 0 || st.N != 1 || math.IsInf(st.Cp, 0) {
				r.fail(fPhase, "%s %s: %s: q = %v must give a saturated single phase with finite cp: %s",
					s.f.Name(), regionNames[c.region], rep(), c.b, brief(st))
			}
		}
		return
	}
	if c.wantSolid < 0 || (c.kind != kPH && c.kind != kDU) {
		return
	}
	d := max(math.Abs(st.Solid-c.wantSolid), math.Abs(st.Quality-c.wantVapor))
	r.cons[cQuality].add(d, rep)
	if d > 1e-8 {
		r.fail(fPhase, "%s %s: %s: solid %.17g, vapour %.17g; the mixture was built with %.17g, %.17g",
			s.f.Name(), regionNames[c.region], rep(), st.Solid, st.Quality, c.wantSolid, c.wantVapor)
	}
}

func (s *setup) flashIndex(name string) int {
	for i := range inverses {
		if inverses[i].name == name {
			return i
		}
	}
	return 0
}

// residual checks one input of a flash against its bound.
func (s *setup) residual(r *result, fi int, st *flash.State, q quantity, want float64, rep func() string) {
	got := valueOf(st, q)
	b := s.bound(st, q, want)
	ratio := math.Abs(got-want) / b
	r.resid[fi][q].add(ratio, rep)
	if !(ratio <= 1) {
		r.fail(fResidual, "%s: %s: %s = %.17g, off by %.3g (bound %.3g): %s", s.f.Name(), rep(),
			quantityNames[q], got, got-want, b, brief(st))
	}
}

// inverses runs every flash that applies to the values of st and judges
// each by the backward residuals and the phase: cold, and warm-started
// (Options.Guess) from the state itself (a simulator's step that changed
// nothing) and from the previous case's forward state (a neighbour on
// the grid, or, where the grid turns, a state far off: a warm start may
// cost more, never mislead).
func (s *setup) inverses(c *tcase, st *flash.State, r *result) {
	mixture := st.Phase == flash.TwoPhase || st.Phase == flash.SolidVapor || st.Phase == flash.SolidLiquid || st.Phase == flash.Triple
	sat := st.Flags&fluid.Saturated != 0
	guesses := [3]struct {
		g    *flash.State
		from string // the reproducer of the guess
	}{{nil, ""}, {st, repro(forward[c.kind].name, c.a, c.b, c.options())}, {&r.prev.st, r.prev.repro}}
	for i := range inverses {
		inv := &inverses[i]
		if inv.name == forward[c.kind].name {
			continue
		}
		switch inv.name {
		case "PT":
			if mixture {
				continue // (p, T) cannot fix a mixture
			}
		case "TQ", "PQ":
			// q fixes the state of a liquid–vapour or solid–vapour mixture,
			// and of a saturated phase from TQ or PQ.
			if !(st.Phase == flash.TwoPhase || st.Phase == flash.SolidVapor ||
				sat && (c.kind == kTQ || c.kind == kPQ) && (st.Quality == 0 || st.Quality == 1)) {
				continue
			}
		}
		if c.meta && !inv.meta {
			continue
		}
		for gi, g := range guesses {
			if gi == 2 && !r.prev.ok {
				continue
			}
			opt := c.options()
			opt.Guess = g.g
			s.inverse(c, st, r, i, opt, g.from, mixture)
		}
	}
}

// inverse runs inverse flash i from the values of st with the options
// opt (guess: the reproducer of opt.Guess, if set) and judges it.
func (s *setup) inverse(c *tcase, st *flash.State, r *result, i int, opt flash.Options, guess string, mixture bool) {
	inv := &inverses[i]
	a, b := valueOf(st, inv.a), valueOf(st, inv.b)
	r.at.failing = inv.name
	got, err, pan := call(inv.fn, s.f, a, b, opt)
	r.flashes++
	rep := func() string {
		w := ""
		if opt.Guess != nil {
			w = " with Guess the state of " + guess
		}
		return repro(inv.name, a, b, opt) + w + " from " + repro(forward[c.kind].name, c.a, c.b, c.options())
	}
	if pan != nil {
		r.fail(fPanic, "%s %s: %s: panic: %v", s.f.Name(), regionNames[c.region], rep(), pan)
		return
	}
	if err != nil {
		if why := errorFault(err, "flash."+inv.name); why != "" {
			r.fail(fError, "%s: %s: error %q: %s", s.f.Name(), rep(), err, why)
		}
		r.fail(fRefused, "%s %s: %s: %v (the state %s)", s.f.Name(), regionNames[c.region], rep(), err, brief(st))
		return
	}
	if why := s.invalid(&got); why != "" {
		r.fail(fInvalid, "%s %s: %s: %s: %s", s.f.Name(), regionNames[c.region], rep(), why, brief(&got))
		return
	}
	s.residual(r, i, &got, inv.a, a, rep)
	if inv.b != qQ || got.Phase == flash.TwoPhase || got.Phase == flash.SolidVapor {
		s.residual(r, i, &got, inv.b, b, rep)
	}
	free := (st.Flags|got.Flags)&(fluid.Indeterminate|fluid.AtCritical) != 0 ||
		(inv.name == "TS" || inv.name == "PD") && s.nonUnique(st) ||
		got.Phase != st.Phase && s.samePlace(st, &got, inv.name)
	if got.Phase != st.Phase && !free {
		r.fail(fPhase, "%s %s: %s: phase %v, the state is %v: got %s, the state %s", s.f.Name(), regionNames[c.region],
			rep(), got.Phase, st.Phase, brief(&got), brief(st))
		return
	}
	if mixture && got.Phase == st.Phase && !free && inv.qualityFixed && s.crit.T-st.T > 1 {
		d := max(math.Abs(got.Quality-st.Quality), math.Abs(got.Solid-st.Solid))
		r.cons[cQuality].add(d, rep)
		if d > measureBounds[cQuality] {
			r.fail(fConsistency, "%s %s: %s: quality %.17g solid %.17g, the state %.17g %.17g", s.f.Name(),
				regionNames[c.region], rep(), got.Quality, got.Solid, st.Quality, st.Solid)
		}
	}
}

// boundaryFraction is the largest fraction of a phase that a state on a
// coexistence curve may carry, or lack, and still be taken as the same
// state as one without it: a saturated liquid and a mixture with a
// vapour fraction of 1e-15 are the same point of the curve, to rounding.
const boundaryFraction = 1e-8

// samePlace reports whether an inverse flash that returned got, of
// another phase than the forward state st, returned the same state in
// substance:
//
//   - both are fluid states within 1e-9·Tc of Tc;
//   - both are fluid states above the triple point, and got's phase is
//     right for its own (T, ρ) (judgeDT): the inputs were reproduced
//     within their bounds, so got answers the inverse problem; next to
//     the critical point, and at T = Tc where Liquid and Supercritical
//     are labels of one state, this is the rule;
//   - got is a single solid, stable at its own (T, p) (judgePT), and not
//     from PT: the inputs were reproduced within their bounds, and a
//     solid, nearly incompressible, fixes p only loosely by h and s (at
//     fixed s, Δh = v·Δp: ice at 200 K reproduces h and s to the floors
//     over 0.2 % in p, so a solid–vapour mixture with 1e-7 of vapour and
//     a solid a few µK warmer at a slightly higher p both answer HS);
//   - st lies on a coexistence curve (a saturated phase, or a mixture
//     with a phase of fraction below boundaryFraction) and got is the
//     same point of the curve with or without the vanishing phase; PT
//     of a saturated phase may return the other phase of the curve;
//   - from HS, st is a saturated single phase and got a mixture on a
//     coexistence curve that holds st's phase: along the curve
//     dh = T ds + v dp, for a mixture too, so that moving the point of
//     the curve and the fraction of the other phase together changes h
//     and s alike but for v dp, small for a condensed phase with little
//     of the other; (h, s) fixes such a state only loosely (the
//     Jacobian of (h, s) in (T, q) is of the order of v dp/dT), and a
//     warm-started HS that reproduces both within their bounds may end
//     on either side (seen: saturated ice, and ice with 3e-7 of vapour
//     0.5 mK colder).
func (s *setup) samePlace(st, got *flash.State, inv string) bool {
	pt := inv == "PT"
	isFluid := func(p flash.Phase) bool { return fluidPhases.has(p) && p != flash.Unknown }
	tc := s.crit.T
	if isFluid(st.Phase) && isFluid(got.Phase) && math.Abs(st.T-tc) <= 1e-9*tc && math.Abs(got.T-tc) <= 1e-9*tc {
		// Within 0.3 µK of Tc the saturated densities are the model's
		// of fluid.SaturationAtT and the phase labels of states a few
		// ulps apart in T differ: one state.
		return true
	}
	if isFluid(st.Phase) && isFluid(got.Phase) && got.T >= s.tp.T*(1+1e-9) {
		v := s.judgeDT(got.Rho, got.T, &tcase{kind: kDT})
		if v.must == mustState && v.want.has(got.Phase) {
			return true
		}
	}
	if !pt && got.Phase == flash.Solid && got.N == 1 {
		v := s.judgePT(got.P, got.T, &tcase{kind: kPT})
		if v.must == mustState && v.want.has(flash.Solid) && !v.want.has(flash.Liquid) && !v.want.has(flash.Vapor) {
			return true
		}
	}
	if pt && st.Flags&fluid.Saturated != 0 && got.Flags&fluid.Saturated != 0 {
		return true
	}
	if inv == "HS" && st.N == 1 && st.Flags&fluid.Saturated != 0 && got.N == 2 &&
		got.Flags&fluid.Saturated != 0 && coexists(st, got) {
		return true
	}
	return coexists(st, got) && coexists(got, st)
}

// coexists reports whether every phase of a with a fraction above
// boundaryFraction is a phase of b.
func coexists(a, b *flash.State) bool {
	for i := 0; i < a.N; i++ {
		if a.Phases[i].Fraction <= boundaryFraction {
			continue
		}
		found := false
		for j := 0; j < b.N; j++ {
			found = found || b.Phases[j].Phase == a.Phases[i].Phase
		}
		if !found {
			return false
		}
	}
	return true
}
