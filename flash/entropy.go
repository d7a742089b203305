package flash

import (
	"errors"
	"math"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// ---------------------------------------------------------------------
// TS, HS

// TS returns the state of f at temperature T in K and specific entropy s
// in J/(kg·K). Below Tc the saturated entropies at T place s: between
// them the liquid–vapour mixture, outside them the single phase, by
// Newton's method in ln ρ along the isotherm. For water and CO2 below the
// triple-point temperature the entropies of the vapour and the solid on
// the sublimation curve at T place s (solid–vapour between them, the
// solid at the pressure where its entropy is s below), and for ice Ih
// the liquid beyond its melting curve; above it (CO2) the liquid and the
// solid on the melting curve. Where s is not monotone along the isotherm
// (liquid water below its density maximum, where s rises with pressure;
// ice, which melts to higher entropy) the state is not unique: TS returns
// the one of lowest pressure (a saturated mixture where there is one). On
// the triple line the state of least solid, flagged Indeterminate.
//
// Special cases are:
//
//	T NaN, ±Inf or ≤ 0, s NaN or ±Inf: ErrInvalidInput
//	no state with these T and s: ErrOutOfRange
//	a state with solid beyond the solid model: ErrOutOfRange
//	below the triple-point temperature of a fluid without a solid model
//	  (R-134a): ErrUndefined
//	outside the equation's accepted range: ErrOutOfRange
func TS(f *fluid.Fluid, T, s float64) (State, error) { return TSWith(f, T, s, Options{}) }

// TSWith is TS with options: a warm start and a requested phase.
func TSWith(f *fluid.Fluid, T, s float64, opt Options) (State, error) {
	var k call
	if err := k.init(f, "flash.TS", fluid.Input{Name: "T", Value: T, Unit: "K"},
		fluid.Input{Name: "s", Value: s, Unit: "J/(kg K)"}, &opt, 1); err != nil {
		return State{}, err
	}
	if lim := f.Limits(); T > lim.TCeil {
		return State{}, k.fail(fluid.ErrOutOfRange, "T exceeds the accepted "+fmtG(lim.TCeil)+" K")
	}
	if k.sol.ok && !k.metaFluid() && (k.onTripleT(T) || k.belowTripleT(T) || k.belowMeltS(T, s)) {
		return k.done(k.tsSolid(T, s))
	}
	st, err := k.ts(T, s, 0, 0)
	if err == errSolid && !k.decided {
		return k.done(k.tsSolid(T, s))
	}
	if err != nil && k.mayMelt(T) && !errors.Is(err, fluid.ErrInvalidInput) {
		// No liquid with this entropy below the dense end of the
		// equation: dry ice or solid–liquid.
		if st2, err2 := k.tsSolid(T, s); err2 == nil {
			return st2, nil
		}
	}
	return k.done(st, err)
}

// ts is the fluid path of TS, with the density kept within rhoLo and
// rhoHi where they are positive (bounds set by the solid paths).
func (k *call) ts(T, s, rhoLo, rhoHi float64) (State, error) {
	f := k.f
	c := f.Critical()
	lim := f.Limits()
	lo, hi := 1e-12*c.Rho, lim.RhoCeil
	rho0 := c.Rho
	if k.fluidGuess() && k.opt.Guess.Rho > 0 {
		rho0 = k.opt.Guess.Rho
		if r := predictRho(k.opt.Guess, T, qS, s); r > 0 {
			rho0 = r
		}
	}
	switch {
	case k.belowTripleT(T):
		if !k.decided {
			return State{}, k.solidError("below the triple point")
		}
	case T < c.T:
		if st, err, done := k.tsByNodes(T, s, rhoLo, rhoHi); done {
			return st, err
		}
		sat, err := k.satT(T)
		if err != nil {
			return State{}, err
		}
		switch {
		case s < sat.Liquid.S:
			lo, rho0 = sat.Liquid.Rho, max(rho0, sat.Liquid.Rho*(1+1e-6))
		case s > sat.Vapor.S:
			hi, rho0 = sat.Vapor.Rho, min(rho0, sat.Vapor.Rho*(1-1e-6))
		default:
			q := (s - sat.Liquid.S) / (sat.Vapor.S - sat.Liquid.S)
			if sat.Vapor.S == sat.Liquid.S {
				q = 0.5
			}
			return k.finishSat(&sat, q)
		}
	}
	pr, ok := isotherm(f, T, s, rho0, lo, hi, rhoLo, rhoHi)
	if !ok {
		return State{}, k.fail(fluid.ErrNoConvergence, "the iteration along the isotherm did not converge")
	}
	return k.wanted(k.finish(&pr))
}

// isotherm solves s(T, ρ) = s along the isotherm T for ρ in [lo, hi],
// narrowed to [rhoLo, rhoHi] where those are positive, from rho0
// (solve1).
func isotherm(f *fluid.Fluid, T, s, rho0, lo, hi, rhoLo, rhoHi float64) (fluid.Props, bool) {
	if rhoLo > 0 {
		lo = max(lo, rhoLo)
	}
	if rhoHi > 0 {
		hi = min(hi, rhoHi)
	}
	return solve1(f, qS, s, T, min(max(rho0, lo), hi), false, lo, hi)
}

// tsByNodes is the fluid path of TS below Tc placed by the saturation
// nodes (satnodes.go) instead of the saturation at T: s beside the
// saturated entropies at T of the cached curve by more than the bound of
// their errors gives the single phase on that side, started next to
// the interpolated saturated density and checked against the vapour
// pressure at T (lvStable); between them the saturation at T, started
// from the interpolated densities, gives the mixture. done is false
// where the nodes do not decide (next to the saturated entropies, near
// the critical point, an iteration that fails): the caller's path then
// runs.
func (k *call) tsByNodes(T, s, rhoLo, rhoHi float64) (State, error, bool) {
	f := k.f
	n := satNodesFor(f)
	if n == nil || T < n.T[0] || k.guessIsSat() {
		return State{}, nil, false
	}
	i := n.bracketT(T)
	sl, sv, errS, ok := n.entropies(T)
	if i+1 >= n.placeTop || !ok {
		return State{}, nil, false
	}
	_, ds := f.ReferenceOffsets()
	sd := s - ds
	m := errS + 1e-10*max(math.Abs(sd), f.GasConstant())
	t := (T - n.T[i]) / (n.T[i+1] - n.T[i])
	rl := lerp(n.liq[i].Rho, n.liq[i+1].Rho, t)
	rv := nodeRhoV(n, i, t)
	lim := f.Limits()
	lo, hi, rho0 := 1e-12*f.Critical().Rho, lim.RhoCeil, 0.0
	switch {
	case sd < sl-m:
		lo, rho0 = rl*(1-1e-6), rl*(1+1e-6)
	case sd > sv+m:
		hi, rho0 = rv*(1+1e-6), rv*(1-1e-6)
	case sd > sl+m && sd < sv-m:
		sat, err := f.SaturationAtTFrom(T, rl, rv)
		if err != nil || !(s >= sat.Liquid.S && s <= sat.Vapor.S) {
			return State{}, nil, false
		}
		st, err := k.finishSat(&sat, (s-sat.Liquid.S)/(sat.Vapor.S-sat.Liquid.S))
		return st, err, true
	default:
		return State{}, nil, false
	}
	if k.fluidGuess() {
		// A single phase carried to (T, s) from the warm start, where
		// that lies on the side placed.
		if r := predictRho(k.opt.Guess, T, qS, s); r > lo && r < hi {
			rho0 = r
		}
	}
	pr, ok := isotherm(f, T, s, rho0, lo, hi, rhoLo, rhoHi)
	if !ok {
		return State{}, nil, false
	}
	if stable, known := k.lvStable(n, &pr); !known || !stable {
		return State{}, nil, false
	}
	st, err := k.wanted(k.finish(&pr))
	return st, err, true
}

// guessIsSat reports whether the warm start is a liquid–vapour state.
func (k *call) guessIsSat() bool {
	_, _, _, ok := k.guessSat()
	return ok
}

// nodeRhoV interpolates the saturated vapour's density of the nodes at
// the fraction t of the interval from node i, in ln ρ.
func nodeRhoV(n *satNodes, i int, t float64) float64 {
	return math.Exp(lerp(math.Log(n.vap[i].Rho), math.Log(n.vap[i+1].Rho), t))
}

// HS returns the state of f at specific enthalpy h in J/kg and specific
// entropy s in J/(kg·K): the end state of an isentropic compression or
// expansion of known work, or of a nozzle.
//
// Every two-phase mixture at temperature T has h − T s = g(T), the Gibbs
// energy of its phases, whatever its fractions: (h, s) lies on the tie
// line of slope T between them. Tables of the saturation, sublimation
// and melting curves, computed once per fluid, place (h, s) against these
// tie lines and against the lines of the saturated phases without an
// evaluation of the equation. A mixture is then solved directly — liquid
// and vapour by Newton's method in (T, ln ρ′, ln ρ″) on equal pressure,
// equal Gibbs energy and h − T s = g, a solid and its vapour or liquid in
// (T, ln ρ) on equal Gibbs energy and h − T s = g — and a single phase
// by Newton's method on (h, s) with the analytic Jacobian: the solid in
// (T, p) on its Gibbs function, the fluid in (T, ln ρ) from the nearest
// of a set of tabulated states. Each result is checked against the
// curves (a single fluid phase against the vapour pressure at its T and
// against the solid). Next to the critical point, and where the tables
// cannot tell, bracketed iterations over the curves decide, and where
// nothing else places the state a search along the isentrope (h rises
// with p at fixed s, dh = dp/ρ) with PS at each pressure; every path
// terminates. Typical costs: 3 to 6 evaluations of the fluid equation in
// one phase, 6 in the liquid–vapour region, 3 for a solid–fluid mixture,
// none for the solid (TestHSEvals).
//
// On the triple line every three-phase mixture has h − Tt·s = g_t, so
// (h, s) does not fix it: PS at the triple-point pressure gives the state
// of least solid, flagged Indeterminate (liquid–vapour, or solid–vapour
// below the liquid's s). Within the backward-residual floors of a
// saturated phase (a mixture with about 1e-9 of the other phase) HS may
// return that phase instead of the mixture: both reproduce h and s.
//
// Special cases are:
//
//	h or s NaN or ±Inf: ErrInvalidInput
//	h above the top of the isentrope s in the accepted region (its
//	  state at the pressure or temperature ceiling), or an isentrope
//	  with no state at any accepted pressure: ErrOutOfRange
//	no state found otherwise: ErrNoConvergence
//	water beyond the melting curves of ices III, V, VI and VII, or with
//	  ice Ih above 208.566 MPa: ErrOutOfRange naming the ice
func HS(f *fluid.Fluid, h, s float64) (State, error) { return HSWith(f, h, s, Options{}) }

// HSWith is HS with options: a warm start from opt.Guess (a single-phase
// fluid or liquid–vapour state), a requested phase, and metastable states
// (by the search along the isentrope, whose PS honours the request).
func HSWith(f *fluid.Fluid, h, s float64, opt Options) (State, error) {
	var k call
	if err := k.init(f, "flash.HS", fluid.Input{Name: "h", Value: h, Unit: "J/kg"},
		fluid.Input{Name: "s", Value: s, Unit: "J/(kg K)"}, &opt, 0); err != nil {
		return State{}, err
	}
	if k.hsTriple(h, s) {
		// On the triple line: PS at the triple-point pressure returns
		// its documented choice, flagged Indeterminate.
		st, err := PSWith(f, k.sol.n.tp.P, s, k.opt)
		if err == nil && math.Abs(st.H-h) <= qH.floor(f, nil, h) {
			return st, nil
		}
	}
	if k.metaFluid() {
		// A metastable phase on request: the search, whose PS honours it.
		return k.hsSearch(h, s)
	}
	st, err, done, beyond := k.hsDirect(h, s)
	if done {
		return st, err
	}
	st, err = k.hsSearch(h, s)
	if err != nil {
		if st2, err2, done := k.hsFromTop(h, s); done {
			return st2, err2
		}
	}
	if err != nil && beyond != nil {
		return State{}, beyond
	}
	return st, err
}

// hsFromTop is the last resort of HS, from the top of the isentrope s in
// the accepted region: h rises with p along it (dh = dp/ρ), and T with
// it, so its top is its state at the pressure ceiling, or at the
// temperature ceiling where that comes first. Where h lies above that
// top, an error wrapping fluid.ErrOutOfRange; else Newton's method on
// (h, s) from it, for a state in a band of the isentrope next to the
// ceiling that the search cannot reach across the pressures without a
// modelled state below it (water above 20 GPa, beyond the ice VII melting
// curve). done is false where neither applies.
func (k *call) hsFromTop(h, s float64) (State, error, bool) {
	f := k.f
	lim := f.Limits()
	top, err := PS(f, lim.PCeil, s)
	if err != nil {
		if top, err = TS(f, lim.TCeil, s); err != nil {
			return State{}, nil, false
		}
	}
	if h > top.H+qH.floor(f, nil, h) {
		return State{}, k.fail(fluid.ErrOutOfRange, "h above the top of the isentrope in the accepted region, h = "+
			fmtG(top.H)+" J/kg at p = "+fmtG(top.P)+" Pa and T = "+fmtG(top.T)+" K (p <= "+fmtG(lim.PCeil)+
			" Pa, T <= "+fmtG(lim.TCeil)+" K)"), true
	}
	if top.N != 1 || top.Phase == Solid {
		return State{}, nil, false
	}
	pr, ok := hsNewton(f, h, s, top.T, top.Rho, anySide, nil)
	if !ok {
		return State{}, nil, false
	}
	sn := satNodesFor(f)
	if sn == nil {
		return State{}, nil, false
	}
	st, err, done := k.hsFluidCheck(sn, &pr)
	return st, err, done && err == nil
}

// hsSearch is HS by a search along the isentrope, where the direct
// solves (hs.go) cannot place or solve the state: h(PS(p, s)) = h by
// Newton's method in ln p with slope p/ρ (dh = dp/ρ at fixed s),
// bracketed by states, each PS warm-started from the last; where the
// isentrope crosses a band without a modelled state a scan finds the
// states on either side. It always terminates (a budget of PS calls).
func (k *call) hsSearch(h, s float64) (State, error) {
	f := k.f
	c := f.Critical()
	lim := f.Limits()
	p0 := c.P
	if g := k.opt.Guess; g != nil && g.P > 0 {
		p0 = g.P
	}
	pmin := 1e-12 * c.P
	plo, phi := math.Log(pmin), math.Log(lim.PCeil)
	inner := k.opt
	var last State
	have := false
	lp := 0.0
	// A pressure where the isentrope has a fluid state, in half decades
	// out from p0 (near a melting curve the window can be narrow).
	for i := 0; i < 34; i++ {
		e := float64((i+1)/2) / 2
		if i%2 == 1 {
			e = -e
		}
		if e > 3.5 || e < -12 {
			continue
		}
		pp := min(max(p0*math.Pow(10, e), pmin), lim.PCeil)
		if st, err := PSWith(f, pp, s, inner); err == nil {
			last, have, lp = st, true, math.Log(pp)
			break
		}
	}
	if !have {
		return State{}, k.fail(fluid.ErrOutOfRange, "no state on this isentrope at any pressure up to the accepted "+
			fmtG(lim.PCeil)+" Pa within "+fmtG(lim.TFloor)+" <= T <= "+fmtG(lim.TCeil)+" K")
	}
	tolH := qH.tol(f, nil, h)
	// A budget of PS calls bounds the search where (h, s) has no state.
	budget := 80
	ps := func(ln float64, guess *State) (State, bool) {
		if budget <= 0 {
			return State{}, false
		}
		budget--
		inner.Guess = nil
		var g State
		if guess != nil {
			g = *guess
			inner.Guess = &g
		}
		st, err := PSWith(f, math.Exp(ln), s, inner)
		return st, err == nil
	}
	stalls, scanned := 0, false
	for it := 0; it < 100; it++ {
		r := last.H - h
		if math.Abs(r) <= 10*tolH {
			st := last
			if k.sol.ok && st.N > 1 && k.onTripleP(st.P) {
				st.Flags |= Indeterminate
			}
			return st, nil
		}
		// Only states bound the bracket: the isentrope can cross bands
		// without a modelled state (water above 208.566 MPa below
		// 273.16 K, where other ices exist).
		if r > 0 {
			phi = lp
		} else {
			plo = lp
		}
		step := -r * last.Rho / last.P // d ln p = dh ρ/p along the isentrope
		ln := lp + max(min(step, 3), -3)
		if !(ln > plo && ln < phi) {
			ln = 0.5 * (plo + phi)
		}
		st, ok := ps(ln, &last)
		for j := 0; !ok && j < 12 && budget > 0; j++ {
			// No state there: back toward the last one.
			ln = 0.5 * (ln + lp)
			if math.Abs(ln-lp) < 1e-15 {
				break
			}
			st, ok = ps(ln, &last)
		}
		if ok && math.Abs(ln-lp) > 1e-9 {
			stalls = 0
		} else {
			stalls++
		}
		if ok {
			last, lp = st, ln
		}
		if !ok || stalls >= 3 {
			// Stuck at the edge of such a band: scan the bracket for
			// the states on either side of the solution, once.
			if scanned || budget <= 0 {
				break
			}
			scanned = true
			a, b, ok := hsScan(ps, h, plo, phi)
			if !ok {
				break
			}
			last, lp, plo, phi, stalls = a.st, a.ln, a.ln, b.ln, 0
		}
	}
	if have && math.Abs(last.H-h) <= qH.floor(f, nil, h) {
		return last, nil
	}
	return State{}, k.fail(fluid.ErrNoConvergence, "the iteration along the isentrope did not converge")
}

// hsPoint is a state of an isentrope at ln p.
type hsPoint struct {
	st State
	ln float64
}

// hsScan scans ln p in (lo, hi) for the two neighbouring states of the
// isentrope whose enthalpies bracket h, with PS by ps (cold: a warm start
// from far along the isentrope misleads more than it helps).
func hsScan(ps func(float64, *State) (State, bool), h, lo, hi float64) (a, b hsPoint, ok bool) {
	const n = 32
	haveA := false
	for i := 1; i < n; i++ {
		ln := lo + (hi-lo)*float64(i)/n
		st, good := ps(ln, nil)
		if !good {
			continue
		}
		if st.H <= h {
			a, haveA = hsPoint{st, ln}, true
			continue
		}
		if haveA {
			return a, hsPoint{st, ln}, true
		}
		return a, b, false
	}
	return a, b, false
}
