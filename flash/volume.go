package flash

import (
	"errors"
	"math"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// ---------------------------------------------------------------------
// DT, DU, PD

// DT returns the state of f at density rho in kg/m³ and temperature T in
// K: the equation of state itself where (T, ρ) is a stable single phase,
// and the liquid–vapour mixture of that overall density where ρ lies
// between the saturated densities at T. For water and CO2, below the
// triple-point temperature ρ is placed against the vapour and the solid
// on the sublimation curve at T (solid–vapour between them, the solid at
// the pressure where its density is ρ beyond), and for ice Ih against the
// solid and the liquid on its melting curve; above it, dry ice denser
// than the liquid on its melting curve at T is solid–liquid or solid. On
// the triple line a mixture's fractions are not fixed: the state of
// least solid is returned, flagged Indeterminate (liquid–vapour, or for
// dry ice between the solid and the liquid densities solid–liquid).
//
// Special cases are:
//
//	rho or T NaN, ±Inf or ≤ 0: ErrInvalidInput
//	a state with solid beyond the solid model (water above 208.566 MPa
//	  beyond the melting curves of ices III, V, VI and VII, naming the
//	  ice; CO2 above 800 MPa): ErrOutOfRange
//	below the triple-point temperature of a fluid without a solid model
//	  (R-134a): ErrUndefined
//	outside the equation's accepted range: ErrOutOfRange
func DT(f *fluid.Fluid, rho, T float64) (State, error) { return DTWith(f, rho, T, Options{}) }

// DTWith is DT with options: a requested phase, and with
// opt.AllowMetastable the single-phase state at (T, ρ) inside the
// saturation dome, up to the spinodal, flagged Metastable.
func DTWith(f *fluid.Fluid, rho, T float64, opt Options) (State, error) {
	var k call
	if err := k.init(f, "flash.DT", fluid.Input{Name: "rho", Value: rho, Unit: "kg/m3"},
		fluid.Input{Name: "T", Value: T, Unit: "K"}, &opt, 3); err != nil {
		return State{}, err
	}
	if k.sol.ok && !k.metaFluid() && (k.onTripleT(T) || k.belowTripleT(T) && !k.clearVapour(rho, T)) {
		return k.done(k.dtSolid(rho, T))
	}
	// Above the triple point the fluid's state at (T, ρ) is placed
	// against the melting curve by finish: on the liquid branch p rises
	// with ρ, so a liquid below the melting pressure is less dense than
	// the liquid on the curve.
	st, err := k.dtFluid(rho, T)
	if err == errSolid && !k.decided {
		return k.done(k.dtSolid(rho, T))
	}
	return k.done(st, err)
}

// clearVapour reports whether (T, ρ) below the triple point is a vapour
// by the node bounds: ρ below p_sub/(RT) for a lower bound of the
// sublimation pressure p_sub at T, and so below the saturated vapour's
// density (its compression factor is below 1).
func (k *call) clearVapour(rho, T float64) bool {
	n := k.sol.n
	if T < n.subTMin() {
		return false
	}
	lo, _ := n.subPBounds(T)
	return rho < lo/(k.f.GasConstant()*T)
}

// clearVapourP reports whether (p, ρ) below the triple-point pressure is a
// vapour by the node bounds: ρ below p/(RT) for an upper bound T of the
// sublimation temperature at p, and so below the saturated vapour's
// density (its compression factor is below 1).
func (k *call) clearVapourP(p, rho float64) bool {
	n := k.sol.n
	if n.belowSubPMin(p) {
		return true
	}
	_, hi := n.subTBounds(p)
	return rho < p/(k.f.GasConstant()*hi)
}

// dtFluid is the fluid path of DT.
func (k *call) dtFluid(rho, T float64) (State, error) {
	f := k.f
	c := f.Critical()
	if T >= k.sol.tt && T < c.T && !k.opt.AllowMetastable {
		// Inside the dome by the cached curve (outside its bounds), or
		// where it ends, well inside by the auxiliary densities: a
		// mixture.
		inside := false
		if e, ok := f.SaturationEstimateAtT(T); ok {
			inside = placeTRho(&e, rho) == cacheInside
		} else {
			rl, err1 := f.AuxLiquidDensity(T)
			rv, err2 := f.AuxVaporDensity(T)
			inside = err1 == nil && err2 == nil && rho > 1.05*rv && rho < 0.95*rl
		}
		if inside {
			s, err := k.satT(T)
			if err != nil {
				return State{}, err
			}
			if q, in := qualityOf(rho, &s); in {
				return k.finishSat(&s, q)
			}
		}
	}
	pr, perr := f.Props(T, rho)
	ok := (perr == nil || isRangeErr(perr) && pr.P > f.Limits().PCeil) &&
		(finiteProps(&pr) || pr.Flags&AtCritical != 0) // the critical state: (dp/drho)_T = 0
	if T >= c.T || T < k.sol.tt {
		if !ok {
			if T < k.sol.tt && perr != nil && !isRangeErr(perr) && !k.decided {
				return State{}, k.solidError("between the vapour and the condensed phases below the triple point")
			}
			return State{}, k.rewrap(perr)
		}
		if T < k.sol.tt {
			// The vapour below the sublimation curve, the liquid above
			// the melting curve; and the branch must match.
			return k.belowTriple(&pr)
		}
		return k.wanted(k.finish(&pr))
	}
	if ok {
		if st, fl := k.stableAtRho(&pr); st {
			s, err := k.finish(&pr)
			s.Flags |= fl
			return k.wanted(s, err)
		}
		if want := k.opt.Phase; (want == Liquid || want == Vapor) && k.opt.AllowMetastable &&
			(want == Liquid) == (rho > c.Rho) {
			s, err := k.finish(&pr)
			s.Flags |= Metastable
			return s, err
		}
	}
	s, err := k.satT(T)
	if err != nil {
		return State{}, err
	}
	q, in := qualityOf(rho, &s)
	if !in {
		if ok {
			return k.wanted(k.finish(&pr))
		}
		return State{}, k.rewrap(perr)
	}
	return k.finishSat(&s, q)
}

// isRangeErr reports whether err is an accepted-range error of Props.
func isRangeErr(err error) bool {
	fe, ok := err.(*fluid.Error)
	return ok && fe.Err == fluid.ErrOutOfRange
}

// wantedTo checks the state st against the requested phase (st is set
// to zero where it does not meet it).
func (k *call) wantedTo(st *State) error {
	if !satisfies(k.opt.Phase, st.Phase) {
		err := k.notWanted(st.Phase)
		*st = State{}
		return err
	}
	return nil
}

// wanted is wantedTo for a state returned with err (passed on as they
// are where err is not nil).
func (k *call) wanted(st State, err error) (State, error) {
	if err != nil {
		return st, err
	}
	if !satisfies(k.opt.Phase, st.Phase) {
		return State{}, k.notWanted(st.Phase)
	}
	return st, nil
}

// qualityOf returns the vapour mass fraction of a mixture of overall
// density rho at saturation s, and whether rho lies between ρ″ and ρ′.
func qualityOf(rho float64, s *fluid.Saturation) (float64, bool) {
	rl, rv := s.Liquid.Rho, s.Vapor.Rho
	if !(rho < rl && rho > rv) {
		return 0, false
	}
	return (1/rho - 1/rl) / (1/rv - 1/rl), true
}

// satT returns the saturation at T, started from the cached curve, else
// from the guess. On the triple line below the stored triple-point
// temperature (within tripleTolT, the precision of that constant) it is
// the saturation at the triple point.
func (k *call) satT(T float64) (fluid.Saturation, error) {
	if T < k.sol.tt && k.onTripleT(T) {
		T = k.sol.tt
	}
	var s fluid.Saturation
	ok, err := k.satFromCacheT(T, &s)
	if !ok {
		if gT, rl, rv, okg := k.guessSat(); okg && math.Abs(gT-T) < 1e-2*T {
			s, err = k.f.SaturationAtTFrom(T, rl, rv)
		} else {
			s, err = k.f.SaturationAtT(T)
		}
	}
	if err != nil {
		return s, k.rewrap(err)
	}
	return s, nil
}

// DU returns the state of f at density rho in kg/m³ and specific
// internal energy u in J/kg: a closed vessel of fixed volume and mass
// after heat or work exchange, or during blowdown.
//
// Along an isochore u rises with T, in one phase and across the
// saturation dome alike, so DU solves u(T) = u along it: Newton's method
// in T with cv in a single phase, and in the dome with the mixture's cv
// (see State) over saturation states at each T, bracketed. Below Tc the
// fluid's cached saturation curve first places u along the isochore
// between its crossings with the saturated phases, and a mixture is
// solved on it and polished by the equation's saturation (two of them,
// typically). Isochores that cross the dome twice (water's liquid near
// 4 °C, whose saturated density has a maximum) are handled, since the
// function of T is the same. At the triple point u(T) rises at fixed T: where (ρ, u) lies among
// the three-phase mixtures DU returns Phase Triple with the fractions
// they fix (T and p those of the triple point), below them it follows the
// isochore through the solid–vapour, solid–liquid and solid states (with
// their mixture cv), and for dense CO2 above the triple point along the
// melting curve. A vessel cooled or vented through the triple point thus
// passes through Triple states and continues as solid–vapour.
//
// Within a millikelvin of Tc the equation fixes the saturated densities
// only to about 3e-5 relative (fluid.SaturationAtT), and the mixture's u
// computed from the saturation at each T scatters by more than the
// backward-residual floor between neighbouring temperatures: there the
// mixture is solved within that band (Newton's method on the phases'
// equilibrium and u together), so that ρ and u are still reproduced to
// the floors of DESIGN.md with the phases in equilibrium to 1e-12·RT; a
// state within the band of a saturated density may come back as that
// single phase instead of a mixture with a vanishing fraction.
//
// Special cases are:
//
//	rho NaN, ±Inf or ≤ 0, u NaN or ±Inf: ErrInvalidInput
//	u below the states of the isochore at the lowest modelled
//	  temperature: ErrOutOfRange
//	a state with solid beyond the solid model (water above 208.566 MPa
//	  beyond the melting curves of ices III, V, VI and VII, naming the
//	  ice; CO2 above 800 MPa): ErrOutOfRange
//	u below the fluid at the triple point of a fluid without a solid
//	  model (R-134a): ErrUndefined
//	outside the equation's accepted range: ErrOutOfRange
func DU(f *fluid.Fluid, rho, u float64) (State, error) { return DUWith(f, rho, u, Options{}) }

// DUWith is DU with options: a warm start from opt.Guess, a requested
// phase, metastable single-phase states with opt.AllowMetastable.
func DUWith(f *fluid.Fluid, rho, u float64, opt Options) (State, error) {
	st, err := duWith(f, rho, u, opt)
	if err != nil && opt.Guess != nil && errors.Is(err, fluid.ErrNoConvergence) {
		// A guess must never make a solvable case fail: start cold.
		opt.Guess = nil
		return duWith(f, rho, u, opt)
	}
	return st, err
}

func duWith(f *fluid.Fluid, rho, u float64, opt Options) (State, error) {
	var k call
	if err := k.init(f, "flash.DU", fluid.Input{Name: "rho", Value: rho, Unit: "kg/m3"},
		fluid.Input{Name: "u", Value: u, Unit: "J/kg"}, &opt, 1); err != nil {
		return State{}, err
	}
	if k.sol.ok && !k.metaFluid() && rho <= f.Limits().RhoCeil {
		tpv, _ := k.triple()
		tp := &tpv
		_, hi, three := tripleURange(tp, 1/rho)
		below := three && u <= hi+qU.tol(f, nil, u) // in or below the three-phase mixtures
		switch {
		case three:
		case rho < tp.Vapor.Rho && u < tp.Vapor.U:
			// A vapour isochore below the saturated vapour's u at the
			// triple point, and so below its own state there (u falls
			// with ρ along a vapour isotherm): it meets the sublimation
			// curve.
			below = true
		case rho < tp.Vapor.Rho && u < k.sol.n.uIdeal+k.refDH(),
			k.sol.anomalous() && rho > tp.Liquid.Rho:
			// Between the saturated and the ideal-gas u at the triple
			// point; or liquid water denser than at the triple point,
			// whose isochore meets the melting curve below it: placed by
			// its state at the triple-point temperature.
			if pr, err := f.Props(tp.T, rho); err == nil {
				below = u <= pr.U
			}
		}
		if below {
			return k.done(k.duSolid(rho, u))
		}
		if k.sol.n.meltRising && rho > tp.Liquid.Rho {
			// Dense CO2: dry ice or dry ice with liquid, by the nodes of
			// the melting curve, before the fluid path.
			if st, ok := k.duDirect(rho, u, false); ok {
				return k.wantedState(st)
			}
		}
		// Elsewhere the fluid path first: its states are placed against
		// the solid by finish (dense CO2 against the melting curve).
	}
	st, err := k.isochoric(rho, qU, u)
	if err == errSolid && !k.decided {
		return k.done(k.duSolid(rho, u))
	}
	return k.done(st, err)
}

// isochoric solves X(T, ρ) = x along the isochore ρ, X rising with T
// (u, or p outside water's density maximum).
func (k *call) isochoric(rho float64, X quantity, x float64) (State, error) {
	f := k.f
	c := f.Critical()
	lim := f.Limits()
	if rho > lim.RhoCeil {
		return State{}, k.fail(fluid.ErrOutOfRange, "rho exceeds the accepted "+fmtG(lim.RhoCeil)+" kg/m3")
	}
	want := k.opt.Phase
	meta := k.opt.AllowMetastable && (want == Liquid || want == Vapor)
	if !meta && !k.decided {
		if want == Unknown || want == TwoPhase {
			if st, err, ok := k.isochoreWarm(rho, x); ok {
				return st, err
			}
		}
		if st, err, ok := k.isochoreCached(rho, x); ok {
			return st, err
		}
	}
	T0 := 1.1 * c.T
	g := k.opt.Guess
	if g != nil && g.T > 0 {
		T0 = predictT(g, rho, X, x)
	}
	// A single phase first.
	pr, ok := newton1(f, X, x, T0, rho, true, lim.TFloor, lim.TCeil)
	if !ok && meta {
		// A metastable phase lies in a narrow band of the isochore below
		// its crossing with the saturated phase, between it and the
		// spinodal, which a start from far off steps over: from the
		// crossing, downward.
		var buf [4]fluid.SatEstimate
		for _, e := range f.SaturationEstimatesAtRho(rho, buf[:0]) {
			top := e.T + e.Err.T
			if pr, ok = newton1(f, X, x, top, rho, true, lim.TFloor, top); ok {
				break
			}
		}
		if !ok {
			// Where the isochore's usable states come in separate
			// pieces (supercooled water, whose liquid isochores reach
			// negative pressures as T rises below its density maximum):
			// a scan for the piece that holds x.
			pr, ok = isochoreScan(f, X, x, rho, lim.TFloor, c.T)
		}
	}
	if ok && want != TwoPhase && pr.T < k.sol.tt {
		// A fluid below the triple point, or a metastable vapour there
		// with the equilibrium state elsewhere on the isochore.
		if !k.decided {
			if st, err := k.belowTriple(&pr); err == nil {
				return st, nil
			}
		}
		ok = false
	}
	if ok && want != TwoPhase {
		if pr.T >= c.T {
			return k.wanted(k.finish(&pr))
		}
		if st, fl := k.stableAtRho(&pr); st {
			s, err := k.finish(&pr)
			s.Flags |= fl
			return k.wanted(s, err)
		}
		if meta && (want == Liquid) == (rho > c.Rho) {
			s, err := k.finish(&pr)
			s.Flags |= Metastable
			return s, err
		}
	}
	// Along the isochore through the dome: E(T) = X of the mixture at T
	// with the overall density rho, or of the single phase where rho lies
	// outside the saturated densities at T.
	var sat fluid.Saturation
	var sp fluid.Props
	inside := false
	var gT, gl, gv float64 // warm starts of the saturation
	if T, rl, rv, okg := k.guessSat(); okg {
		gT, gl, gv = T, rl, rv
		T0 = T
	} else if ok && pr.T > k.sol.tt && pr.T < c.T {
		T0 = pr.T
	} else {
		T0 = 0.5 * (k.sol.tt + c.T)
	}
	hiT := c.T
	if _, ok := props(f, c.T, rho); !ok {
		// No single phase at Tc on this isochore (an equation whose
		// own critical point lies above its reducing temperature): the
		// mixture just below.
		hiT = c.T * (1 - 1e-12)
	}
	var failed error
	eval := func(T float64) (r, d float64) {
		inside = false
		if T >= c.T && hiT == c.T {
			// Above the dome.
			pr, ok := props(f, T, rho)
			if !ok {
				failed = k.fail(fluid.ErrOutOfRange, "no fluid state on the isochore at the critical temperature")
				return 0, 1
			}
			sp = pr
			dT, _ := X.partials(&pr)
			return X.of(&pr) - x, dT
		}
		var s fluid.Saturation
		var err error
		if gl > 0 && math.Abs(T-gT) <= 1e-3*T {
			s, err = f.SaturationAtTFrom(T, gl, gv)
		} else {
			// A warm start from far along the curve can lead Newton's
			// method to a spurious solution (water from its triple
			// point's densities at 617 K: p 20 % low): the cached curve,
			// or a cold start.
			s, err = k.satT(T)
		}
		if err != nil {
			failed = err
			return 0, 1
		}
		gT, gl, gv = T, s.Liquid.Rho, s.Vapor.Rho
		sat = s
		q, in := qualityOf(rho, &s)
		inside = in
		if in {
			st := twoPhase(f, &s, q)
			v := st.U
			if X == qP {
				v = st.P
			}
			// dX/dT along the isochore: the mixture's cv for u; γ for p.
			d := st.Cv
			if X == qP {
				d = (s.Vapor.S - s.Liquid.S) / (1/s.Vapor.Rho - 1/s.Liquid.Rho)
			}
			return v - x, d
		}
		pr, err := f.Props(T, rho)
		if err != nil && !isFinite(pr.U) {
			failed = err
			return 0, 1
		}
		sp = pr
		dT, _ := X.partials(&pr)
		return X.of(&pr) - x, dT
	}
	lo, hi := k.sol.tt, hiT
	rlo, _ := eval(lo)
	if failed != nil {
		return State{}, k.rewrap(failed)
	}
	if rlo > 0 {
		// Below the triple line: a vapour below the sublimation curve,
		// or solid.
		if k.decided {
			return State{}, k.fail(fluid.ErrNoConvergence, "the iteration along the isochore did not converge")
		}
		return State{}, k.solidError("below the liquid-vapour states at the triple-point temperature")
	}
	rhi, _ := eval(hi)
	if failed != nil {
		return State{}, k.rewrap(failed)
	}
	if rhi < 0 {
		// Above Tc, where the single-phase attempt failed.
		pr, ok := newton1(f, X, x, 1.1*c.T, rho, true, c.T, lim.TCeil)
		if !ok {
			if top, okt := props(f, lim.TCeil, rho); okt && x > X.of(&top) {
				// X rises with T along the isochore: beyond its top.
				return State{}, k.fail(fluid.ErrOutOfRange, "u above the isochore's "+fmtG(top.U)+
					" J/kg at the accepted "+fmtG(lim.TCeil)+" K")
			}
			return State{}, k.fail(fluid.ErrNoConvergence, "the single-phase iteration did not converge")
		}
		return k.wanted(k.finish(&pr))
	}
	T := min(max(T0, lo), hi)
	converged := false
	prevR := math.Inf(1)
	for it := 0; it < 200; it++ {
		r, d := eval(T)
		if failed != nil {
			return State{}, k.rewrap(failed)
		}
		ref := &sat.Liquid
		if !inside {
			ref = &sp
		}
		if math.Abs(r) <= X.tol(f, ref, x) {
			converged = true
			break
		}
		if hi-lo <= 1e-14*hi {
			// T is fixed to rounding. Within a millikelvin of Tc the
			// equation fixes the saturated densities only loosely
			// (fluid.SaturationAtT), and the mixture's u jumps between
			// neighbouring temperatures by more than the floor: there
			// the state is solved within that band (nearCritDU).
			if math.Abs(r) <= X.floor(f, ref, x) {
				converged = true
			} else if c.T-T < 1e-3 {
				return k.nearCritDU(rho, x, T, &sat, inside)
			}
			break
		}
		if r > 0 {
			hi = T
		} else {
			lo = T
		}
		Tn := T - r/d
		// Bisect where Newton leaves the bracket or stalls (|r| not
		// halved: a slope far off the secant creeps along one end of
		// the bracket), so that the bracket always shrinks.
		if !(Tn > lo && Tn < hi) || math.Abs(r) > 0.5*prevR {
			Tn = 0.5 * (lo + hi)
		}
		prevR = math.Abs(r)
		T = Tn
	}
	if !converged {
		return State{}, k.fail(fluid.ErrNoConvergence, "the iteration along the isochore did not converge")
	}
	if inside {
		q, _ := qualityOf(rho, &sat)
		return k.finishSat(&sat, q)
	}
	if !finiteProps(&sp) {
		return State{}, k.fail(fluid.ErrNoConvergence, "the iteration along the isochore did not converge")
	}
	return k.wanted(k.finish(&sp))
}

// isochoreScan solves X(T, ρ) = x along the isochore rho for T in
// [lo, hi] where its usable single-phase states (mechanically stable, at
// positive pressure) come in pieces: a scan of 64 temperatures, each
// piece's ends between the scan's points found by bisection, for the
// piece whose X brackets x, then newton1 in it; where that finds none,
// scans of 512 and 4096 (supercooled water's usable pieces can be
// 4 K wide, and 0.4 K where its cv turns negative below 233 K). It
// is the last resort of a metastable request.
func isochoreScan(f *fluid.Fluid, X quantity, x, rho, lo, hi float64) (fluid.Props, bool) {
	usable := func(T float64) (float64, bool) {
		pr, ok := props(f, T, rho)
		if !ok || !(pr.P > 0) {
			return 0, false
		}
		return X.of(&pr) - x, true
	}
	// edge returns the end of the piece between a usable a and an
	// unusable b, and X − x there.
	edge := func(a, b float64) (float64, float64) {
		ra, _ := usable(a)
		for j := 0; j < 60 && math.Abs(b-a) > 1e-13*b; j++ {
			m := 0.5 * (a + b)
			if r, ok := usable(m); ok {
				a, ra = m, r
			} else {
				b = m
			}
		}
		return a, ra
	}
	solve := func(a, b float64) (fluid.Props, bool) {
		return newton1(f, X, x, 0.5*(a+b), rho, true, min(a, b), max(a, b))
	}
	for _, n := range [...]int{64, 512, 4096} {
		prevT, prevR, have := 0.0, 0.0, false
		for i := 0; i <= n; i++ {
			T := lo + (hi-lo)*float64(i)/float64(n)
			r, ok := usable(T)
			switch {
			case ok && have && (r >= 0) != (prevR >= 0):
				return solve(prevT, T)
			case ok && !have && i > 0:
				// A piece begins between the last point and T.
				if a, ra := edge(T, T-(hi-lo)/float64(n)); (ra >= 0) != (r >= 0) {
					return solve(a, T)
				}
			case !ok && have:
				// The piece ends between the last point and T.
				if b, rb := edge(prevT, T); (rb >= 0) != (prevR >= 0) {
					return solve(prevT, b)
				}
			}
			prevT, prevR, have = T, r, ok
		}
	}
	return fluid.Props{}, false
}

// nearCritDU finishes DU within a millikelvin of Tc, where the
// iteration along the isochore has fixed T to rounding without meeting
// u: there the equation fixes the saturated densities only to about
// 3e-5 relative (fluid.SaturationAtT), and the mixture's u, computed
// from the saturation at each T, scatters between neighbouring
// temperatures by more than the backward-residual floor. The state is
// solved within that band instead: the mixture of the saturated phases
// by Newton's method in (T, ln ρ′, ln ρ″) with u_mix = u (lvMixNewton),
// or the single phase at (T, ρ) with u(T) = u where ρ lies outside the
// saturated densities at T, or inside them by less than the band; the
// side of the saturation sat at T (inside) is tried first.
func (k *call) nearCritDU(rho, u, T float64, sat *fluid.Saturation, inside bool) (State, error) {
	f := k.f
	c := f.Critical()
	mixture := func() (State, bool) {
		if sat.T == 0 {
			return State{}, false
		}
		s, ok := lvMixNewton(f, mixCond{du: true, a: 1 / rho, b: u}, T, sat.Liquid.Rho, sat.Vapor.Rho, c.T-2e-3, c.T)
		if !ok {
			return State{}, false
		}
		q, in := qualityOf(rho, &s)
		if !in || math.Abs(twoPhase(f, &s, q).U-u) > qU.floor(f, nil, u) {
			return State{}, false
		}
		st, err := k.finishSat(&s, q)
		return st, err == nil
	}
	single := func() (State, bool) {
		pr, ok := newton1(f, qU, u, T, rho, true, T*(1-1e-6), min(T*(1+1e-6), c.T))
		if !ok || pr.T >= c.T {
			return State{}, false
		}
		if s, err := f.SaturationAtT(pr.T); err == nil {
			const band = 3e-5
			if rho < s.Liquid.Rho*(1-band) && rho > s.Vapor.Rho*(1+band) {
				return State{}, false // inside the dome beyond the band
			}
		}
		st, err := k.finish(&pr)
		if err != nil || !satisfies(k.opt.Phase, st.Phase) {
			return State{}, false
		}
		return st, true
	}
	first, second := single, mixture
	if inside {
		first, second = mixture, single
	}
	if st, ok := first(); ok {
		return st, nil
	}
	if st, ok := second(); ok {
		return st, nil
	}
	return State{}, k.fail(fluid.ErrNoConvergence, "the iteration along the isochore did not converge")
}

// belowTriple finishes a single-phase state below the triple-point
// temperature: fluid only where the solid curves say so (finish), and on
// the branch of its phase.
func (k *call) belowTriple(pr *fluid.Props) (State, error) {
	if !k.decided && pr.P > 0 {
		// On the branch of its phase, not a rising piece of p(ρ)
		// inside the equation's unstable region.
		c := k.f.Critical()
		root := fluid.RootVapor
		if pr.Rho > c.Rho {
			root = fluid.RootLiquid
		}
		if b, err := k.f.PropsTP(pr.T, pr.P, root, 0); err != nil || math.Abs(b.Rho-pr.Rho) > 1e-8*pr.Rho {
			return State{}, k.solidError("between the vapour and the condensed phases below the triple point")
		}
	}
	return k.wanted(k.finish(pr))
}

// PD returns the state of f at pressure p in Pa and density rho in kg/m³.
// Below pc, a density between the saturated densities at p gives the
// liquid–vapour mixture at the saturation temperature; otherwise the
// single phase, by Newton's method in T along the isochore. For water and
// CO2 below the triple-point pressure ρ is placed against the vapour and
// the solid on the sublimation curve at p, above it (CO2) against the
// liquid and the solid on the melting curve. Where p falls along the
// isochore (water's liquid below about 4 °C) the solution may not be
// unique: PD returns the one it reaches; for water above the triple-point
// pressure, whose ice is lighter than its liquid, (p, ρ) can also have an
// ice or ice–liquid solution, and PD returns the fluid state where there
// is one. On the triple line, within the three-phase densities, the state
// of least solid, flagged Indeterminate.
//
// Special cases are:
//
//	p or rho NaN, ±Inf or ≤ 0: ErrInvalidInput
//	no state with these p and ρ (denser than the solid at its lowest
//	  modelled temperature): ErrOutOfRange
//	a state with solid beyond the solid model: ErrOutOfRange
//	a state in the solid region of a fluid without a solid model
//	  (R-134a): ErrUndefined
//	outside the equation's accepted range: ErrOutOfRange
func PD(f *fluid.Fluid, p, rho float64) (State, error) { return PDWith(f, p, rho, Options{}) }

// PDWith is PD with options: a warm start and a requested phase.
func PDWith(f *fluid.Fluid, p, rho float64, opt Options) (State, error) {
	var k call
	if err := k.init(f, "flash.PD", fluid.Input{Name: "p", Value: p, Unit: "Pa"},
		fluid.Input{Name: "rho", Value: rho, Unit: "kg/m3"}, &opt, 3); err != nil {
		return State{}, err
	}
	if k.sol.ok && !k.metaFluid() && (k.onTripleP(p) || k.belowTripleP(p) && !k.clearVapourP(p, rho) || k.denseMelt(p, rho)) {
		return k.done(k.pdSolid(p, rho))
	}
	st, err := k.pd(p, rho)
	if err != nil && k.sol.ok && !k.decided && !errors.Is(err, fluid.ErrInvalidInput) {
		// No fluid state (ice is lighter than water: the fluid is tried
		// first, see PD).
		if st2, err2 := k.pdSolid(p, rho); err2 == nil || err == errSolid {
			return k.done(st2, err2)
		}
	}
	return k.done(st, err)
}

// pd is the fluid path of PD.
func (k *call) pd(p, rho float64) (State, error) {
	f := k.f
	c := f.Critical()
	lim := f.Limits()
	switch {
	case p > lim.PCeil:
		return State{}, k.fail(fluid.ErrOutOfRange, "p exceeds the accepted "+fmtG(lim.PCeil)+" Pa")
	case rho > lim.RhoCeil:
		return State{}, k.fail(fluid.ErrOutOfRange, "rho exceeds the accepted "+fmtG(lim.RhoCeil)+" kg/m3")
	}
	tlo, thi := lim.TFloor, lim.TCeil
	T0 := p / (rho * f.GasConstant())
	if p >= c.P {
		T0 = max(T0, c.T*1.01)
	}
	Tf, _ := k.freezeT(p)
	tlo = max(tlo, Tf*(1-1e-11))
	// The liquid-like side: T between the freezing temperature and the
	// saturation (or critical) temperature, started at the top: the
	// isochore meets the dome below the solution, not above it.
	e, cached := f.SaturationEstimateAtP(p)
	pl := cacheUndecided
	if cached && !k.onTripleP(p) {
		// (On the triple line the saturation at p decides: a saturated
		// liquid there has no colder liquid to solve for.)
		pl = placeTRho(&e, rho)
	}
	tsat := 0.0 // the saturation temperature, where ρ is denser than the saturated liquid
	switch {
	case pl == cacheLiquid:
		// Denser than the saturated liquid by the cached curve: below
		// its T, from it along the isobar by its expansivity.
		thi, T0 = e.T+e.Err.T, e.T
		tsat = e.T - e.Err.T
		if b := e.Liquid.Expansivity; b > 0 {
			T0 = e.T - math.Log(rho/e.Liquid.Rho)/b
		}
	case pl == cacheVapor:
		tlo = e.T - e.Err.T
		T0 = max(e.T, p/(rho*f.GasConstant()*e.Vapor.Z))
	case p < c.P && !k.belowTripleP(p):
		s, err := k.satP(p)
		if err == nil {
			if q, in := qualityOf(rho, &s); in {
				return k.finishSat(&s, q)
			}
			// A saturated phase's density to rounding (from a
			// saturation solved from T; this one is from p).
			if rl := s.Liquid.Rho; math.Abs(rho-rl) <= qRho.tol(f, nil, rl) {
				return k.finishSat(&s, 0)
			}
			if rv := s.Vapor.Rho; math.Abs(rho-rv) <= qRho.tol(f, nil, rv) {
				return k.finishSat(&s, 1)
			}
			if rho >= s.Liquid.Rho {
				thi, T0 = s.T, s.T*(1-1e-9)
				tsat = s.T
			} else {
				// The vapour, from the saturated vapour's Z.
				tlo = s.T
				T0 = max(s.T, p/(rho*f.GasConstant()*s.Vapor.Z))
			}
		}
	case p >= c.P && rho > c.Rho:
		if pc, err := f.PropsTP(c.T, p, fluid.RootStable, 0); err == nil && rho >= pc.Rho {
			thi, T0 = c.T, c.T
		}
	}
	var pr fluid.Props
	ok := false
	if g := k.opt.Guess; k.fluidGuess() && g.T > 0 {
		// From the warm start by Newton's method alone; where that fails
		// (a guess across the dome from the solution: next to the
		// critical point the isochore of a liquid just denser than the
		// saturated one runs inside the dome below it), from the cold
		// start.
		pr, ok = newton1(f, qP, p, min(max(g.T, tlo), thi), rho, true, tlo, thi)
	}
	if !ok {
		pr, ok = solve1(f, qP, p, min(max(T0, tlo), thi), rho, true, tlo, thi)
	}
	if !ok && tsat > 0 && k.sol.anomalous() {
		// Water denser than its saturated liquid at p near its density
		// maximum lies above the saturation temperature, not below: the
		// solution of lowest temperature there.
		pr, ok = solve1(f, qP, p, tsat, rho, true, tsat, min(1.1*tsat, c.T))
	}
	if !ok && p > c.P*(1-1e-3) && p <= c.P*(1+1e-3) {
		// Next to the critical point, where the equation fixes the
		// saturated densities only loosely (fluid.SaturationAtT) and its
		// isotherms are nearly flat, (p, ρ) just outside the saturated
		// densities may lie on either side of the saturation
		// temperature: the single phase within a few millikelvin of Tc.
		pr, ok = solve1(f, qP, p, c.T, rho, true, max(c.T-5e-3, tlo), min(c.T+5e-3, lim.TCeil))
	}
	if !ok {
		if k.sol.ok && !k.decided && Tf > lim.TFloor {
			// The solution may lie where the fluid freezes: the solid paths decide.
			return State{}, errSolid
		}
		return State{}, k.fail(fluid.ErrNoConvergence, "the iteration along the isochore did not converge")
	}
	if pr.T < k.sol.tt {
		return k.belowTriple(&pr)
	}
	return k.wanted(k.finish(&pr))
}
