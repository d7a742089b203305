package flash

import (
	"errors"
	"math"
	"strconv"

	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/internal/elem"
)

// call carries what every flash needs: the fluid, the operation and its
// inputs (for errors), the options and the solid phase. decided is set
// once the solid paths have placed the state on the fluid's side of the
// solid curves: the fluid paths then do not place it again, and keep to
// temperatures at or above fixedTlo (if positive) at their pressure.
type call struct {
	f        *fluid.Fluid
	op       string
	in       [2]fluid.Input
	opt      Options
	sol      solidSide
	decided  bool
	fixedTlo float64
	// at, if at[0] > 0, is the (T, ρ) from which the next isobarSingle
	// starts Newton's method, instead of its start state extrapolated.
	at [2]float64
}

// init sets up k for a flash; it validates what every flash shares:
// a fluid, finite inputs, those in the bit mask positive (1: a, 2: b)
// positive, and the options.
func (k *call) init(f *fluid.Fluid, op string, a, b fluid.Input, opt *Options, positive int) error {
	*k = call{}
	k.f, k.op, k.in[0], k.in[1] = f, op, a, b
	if opt != nil {
		k.opt = *opt
	}
	if f == nil {
		return k.fail(fluid.ErrInvalidInput, "nil fluid")
	}
	if !isFinite(a.Value) || !isFinite(b.Value) {
		return k.fail(fluid.ErrInvalidInput, "inputs must be finite")
	}
	for i := range 2 {
		if positive&(1<<i) != 0 && !(k.in[i].Value > 0) {
			return k.fail(fluid.ErrInvalidInput, k.in[i].Name+" must be positive")
		}
	}
	if !(k.opt.Phase >= Unknown && k.opt.Phase <= Triple) {
		return k.fail(fluid.ErrInvalidInput, "Options.Phase must be one of the phases Unknown (0) to Triple (8)")
	}
	k.sol.init(f)
	return nil
}

// done finishes an exported flash: the internal signal errSolid never
// leaves the package.
func (k *call) done(st State, err error) (State, error) {
	if err == errSolid {
		return State{}, k.fail(fluid.ErrNoConvergence, "the solid-region iteration did not converge")
	}
	return st, err
}

// doneTo is done for a flash whose state is st: it returns the error
// done returns, and leaves st zero where that is not nil.
func (k *call) doneTo(st *State, err error) error {
	if err == nil {
		return nil
	}
	*st = State{}
	if err == errSolid {
		return k.fail(fluid.ErrNoConvergence, "the solid-region iteration did not converge")
	}
	return err
}

func (k *call) fail(sentinel error, why string) error {
	return fluid.NewError(k.op, sentinel, why, k.in[0], k.in[1])
}

// rewrap returns err (from package fluid) as an error of this flash,
// keeping its sentinel and explanation.
func (k *call) rewrap(err error) error {
	var fe *fluid.Error
	if errors.As(err, &fe) {
		return k.fail(fe.Err, fe.Range)
	}
	return k.fail(fluid.ErrNoConvergence, err.Error())
}

func (k *call) quality(q float64) error {
	if !(q >= 0 && q <= 1) {
		return k.fail(fluid.ErrInvalidInput, "q must lie in 0 <= q <= 1")
	}
	return nil
}

// guessRho returns the density of the warm-start phase on root, or 0: a
// single fluid phase carried to (T, p) by its own derivatives, the
// phase of a mixture as it is.
func (k *call) guessRho(root fluid.Root, T, p float64) float64 {
	g := k.opt.Guess
	if g == nil || g.N < 1 {
		return 0
	}
	if k.fluidGuess() && (root == fluid.RootStable || (root == fluid.RootLiquid) == (g.Rho > k.f.Critical().Rho)) {
		// A single phase, carried to (T, p) by its own derivatives
		// (guessProps): ρ + (Δp − (∂p/∂T)_ρ ΔT)/(∂p/∂ρ)_T.
		var pr fluid.Props
		if guessProps(g, &pr) {
			if rho := g.Rho + (p-g.P-pr.DpDT*(T-g.T))/pr.DpDrho; rho > 0.9*g.Rho && rho < 1.1*g.Rho {
				return rho
			}
		}
	}
	for i := 0; i < g.N && i < 3; i++ {
		ph := g.Phases[i].Phase
		if ph == Solid {
			continue
		}
		if root == fluid.RootStable || ph == Supercritical ||
			(root == fluid.RootLiquid && ph == Liquid) || (root == fluid.RootVapor && ph == Vapor) {
			return g.Phases[i].Rho
		}
	}
	return 0
}

// guessSat returns the warm-start saturation state (T, ρ′, ρ″), if the
// guess has one.
func (k *call) guessSat() (T, rl, rv float64, ok bool) {
	g := k.opt.Guess
	if g == nil || g.N != 2 || g.Phase != TwoPhase {
		return 0, 0, 0, false
	}
	return g.T, g.Phases[0].Rho, g.Phases[1].Rho, true
}

// rootFor maps a requested phase to a density root.
func rootFor(ph Phase) fluid.Root {
	switch ph {
	case Liquid:
		return fluid.RootLiquid
	case Vapor:
		return fluid.RootVapor
	}
	return fluid.RootStable
}

// fluidGuess reports whether the warm start is a single-phase fluid state.
func (k *call) fluidGuess() bool {
	g := k.opt.Guess
	return g != nil && g.N == 1 && g.Phases[0].Phase != Solid && g.Phase != Solid
}

// satisfies reports whether state phase got meets the request want.
func satisfies(want, got Phase) bool {
	switch want {
	case Unknown:
		return true
	case Liquid, Vapor:
		return got == want || got == Supercritical
	}
	return got == want
}

// notWanted is the error for a state whose stable phase is not the
// requested one.
func (k *call) notWanted(got Phase) error {
	why := "the stable state is " + got.String() + ", not the requested " + k.opt.Phase.String()
	if k.opt.Phase == Liquid || k.opt.Phase == Vapor {
		why += " (set AllowMetastable for a metastable state)"
	}
	return k.fail(fluid.ErrOutOfRange, why)
}

// finish checks a single-phase fluid result against the solid (unless the
// solid side is decided) and builds the state. A state where a solid is
// the stable phase gives errSolid (the flash then takes its solid path),
// or, where a metastable fluid was asked for, the state flagged
// Metastable; exactly on a solid–fluid curve it is flagged Indeterminate
// and Saturated.
func (k *call) finishTo(pr *fluid.Props, st *State) error {
	if lim := k.f.Limits(); pr.P > lim.PCeil*(1+1e-9) {
		return k.fail(fluid.ErrOutOfRange, "p = "+fmtG(pr.P)+" Pa exceeds the accepted "+
			fmtG(lim.PCeil)+" Pa of "+k.f.Name())
	} else if !(pr.P > 0) {
		return k.fail(fluid.ErrOutOfRange, "the equation gives p = "+fmtG(pr.P)+
			" Pa there: no fluid state")
	}
	fl, err := k.highIce(pr)
	if err != nil {
		return err
	}
	if !k.decided {
		v, why := k.versus(pr)
		switch {
		case v == vOnCurve:
			fl = Indeterminate | Saturated
		case (v == vSolid || v == vBeyond) && k.metaFluid():
			fl = Metastable
		case v == vSolid:
			return k.solidError(why)
		case v == vBeyond:
			// The fluid's pressure at a solid's density or entropy says
			// nothing: the solid paths decide.
			return errSolid
		}
	} else if k.fixedTlo > 0 && pr.T < k.fixedTlo*(1-1e-11) && !k.metaFluid() {
		return errSolid
	}
	setSingle(st, pr, fluidPhase(k.f, pr.T, pr.P, pr.Rho))
	st.Flags |= fl
	if c := k.f.Limits().PCeil; st.P > c && st.P <= c*(1+1e-12) {
		st.P = c // the ceiling itself, to rounding
	}
	return nil
}

// finish is finishTo, returning the state.
func (k *call) finish(pr *fluid.Props) (State, error) {
	var st State
	err := k.finishTo(pr, &st)
	return st, err
}

// stable reports whether a single-phase result pr on its branch is the
// stable fluid phase at its (T, p), with the Indeterminate flag of a
// state exactly on the vapour-pressure curve.
func (k *call) stable(pr *fluid.Props) (bool, Flags) {
	if st, ok := k.stableByCache(pr); ok {
		return st, 0
	}
	root, fl, err := k.f.StableRoot(pr.T, pr.P)
	if err != nil || root == fluid.RootStable || fl&Indeterminate != 0 {
		// (On the vapour-pressure curve to rounding either phase is.)
		return err == nil, fl
	}
	c := k.f.Critical()
	return (root == fluid.RootLiquid) == (pr.Rho > c.Rho), fl
}

// stableAtRho is stable for a state found at a given or solved density
// (DT, DU, TS, PD): below Tc, p(ρ) of a multiparameter equation can rise
// in places inside the saturation dome, so a root there is checked
// against the root of its branch at its (T, p) where neither the cached
// saturation curve (outside its bounds) nor the auxiliary saturated
// densities settle it.
func (k *call) stableAtRho(pr *fluid.Props) (bool, Flags) {
	if e, ok := k.f.SaturationEstimateAtT(pr.T); ok {
		switch placeTRho(&e, pr.Rho) {
		case cacheLiquid, cacheVapor:
			return true, 0
		case cacheInside:
			return false, 0
		}
	}
	ok, fl := k.stable(pr)
	c := k.f.Critical()
	if !ok || pr.T >= c.T {
		return ok, fl
	}
	liquid := pr.Rho > c.Rho
	root := fluid.RootVapor
	if liquid {
		root = fluid.RootLiquid
		if rl, err := k.f.AuxLiquidDensity(pr.T); err == nil && pr.Rho > 1.05*rl {
			return true, fl
		}
	} else if rv, err := k.f.AuxVaporDensity(pr.T); err == nil && pr.Rho < 0.95*rv {
		return true, fl
	}
	b, err := k.f.PropsTP(pr.T, pr.P, root, 0)
	return err == nil && math.Abs(b.Rho-pr.Rho) <= 1e-8*pr.Rho, fl
}

// ---------------------------------------------------------------------
// PT, TQ, PQ

// PT returns the state of f at pressure p in Pa and temperature T in K.
//
// Below Tc the stable fluid phase is the liquid above the equation's own
// vapour pressure and the vapour below it; exactly on the vapour-pressure
// curve (to rounding) the inputs do not fix the state, and PT returns the
// saturated liquid flagged Indeterminate and Saturated. For water and CO2
// the solid is the stable phase where its Gibbs energy is below the
// fluid's: above the sublimation curve below the triple point, beyond the
// melting curve above it (for water: below it, at T < 273.16 K); there PT
// returns Phase Solid. Exactly on a sublimation or melting curve (within
// 1e-11·RT in Gibbs energy) it returns the fluid phase flagged
// Indeterminate and Saturated; at the triple point the saturated liquid.
// The vapour below the triple point and the liquid of water above the
// ice Ih melting curve are flagged Extrapolated where beyond the
// equation's published range.
//
// Special cases are:
//
//	p or T NaN, ±Inf or ≤ 0: ErrInvalidInput
//	water above 208.566 MPa beyond the melting curves of ices III, V,
//	  VI and VII: ErrOutOfRange naming the ice (liquid with
//	  Options{Phase: Liquid, AllowMetastable: true}, flagged Metastable)
//	CO2 solid above 800 MPa (the dry-ice model's limit): ErrOutOfRange
//	water below 200 K at a pressure below the sublimation pressure at
//	  200 K (solid and vapour cannot be told apart): ErrOutOfRange
//	below the triple-point temperature of a fluid without a solid model
//	  (R-134a): ErrUndefined
//	outside the equation's accepted range: ErrOutOfRange
func PT(f *fluid.Fluid, p, T float64) (State, error) { return PTWith(f, p, T, Options{}) }

// PTWith is PT with options: a warm start from opt.Guess, and with
// opt.Phase Liquid or Vapor the root of that phase, metastable up to its
// spinodal if opt.AllowMetastable (else an error where it is not the
// stable one; metastable also against the solid: supercooled water,
// supersaturated CO2 vapour). opt.Phase Solid asks for a solid state. A
// mixture (TwoPhase, SolidVapor, SolidLiquid, Triple) cannot be
// requested: ErrInvalidInput.
func PTWith(f *fluid.Fluid, p, T float64, opt Options) (st State, err error) {
	st, err = ptWith(f, p, T, opt)
	keepInputP(f, p, &st, err)
	return
}

// keepInputP gives a single-phase fluid state st of a flash at pressure
// p (err nil) that pressure itself: its P, from the equation at the
// solved density, differs from p by rounding (within the
// backward-residual floor: in a dense liquid up to about 1e-13·ρRT, 4e-8
// of p for water at its triple point), and a state that keeps its input
// exactly can be fed to the next flash without landing on the other side
// of a phase boundary that rounding put it on.
func keepInputP(f *fluid.Fluid, p float64, st *State, err error) {
	if err == nil && st.N == 1 && (st.Phase == Liquid || st.Phase == Vapor || st.Phase == Supercritical) &&
		math.Abs(st.P-p) <= 1e-10*p+1e-12*st.Rho*f.GasConstant()*st.T {
		st.P = p
	}
}

func ptWith(f *fluid.Fluid, p, T float64, opt Options) (st State, err error) {
	var k call
	if err := k.init(f, "flash.PT", fluid.Input{Name: "p", Value: p, Unit: "Pa"},
		fluid.Input{Name: "T", Value: T, Unit: "K"}, &opt, 3); err != nil {
		return State{}, err
	}
	switch k.opt.Phase {
	case TwoPhase, SolidVapor, SolidLiquid, Triple:
		return State{}, k.fail(fluid.ErrInvalidInput, "(p, T) cannot fix a mixture of phases")
	}
	meta := k.metaFluid()
	if k.sol.ok && k.onTripleT(T) && k.onTripleP(p) && k.opt.Phase != Solid && !meta {
		// The triple point: the saturated liquid (without solid), as on
		// the vapour-pressure curve.
		tpv, _ := k.triple()
		tp := &tpv
		st := single(&tp.Liquid, Liquid)
		st.P = tp.P // the triple point's, not the liquid's own (see twoPhase)
		st.Flags |= Indeterminate | Saturated
		return k.wanted(st, nil)
	}
	root := rootFor(k.opt.Phase)
	pl, hint, why := k.placePT(T, p)
	if root == fluid.RootStable {
		// Below the triple point the solid curves decide the fluid phase.
		root = hint
	}
	if pl == placeBeyond || pl == placeSolid && !meta {
		return k.done(k.ptSolid(p, T, pl, why, nil))
	}
	if pl == placeFluid && root == fluid.RootStable && p <= f.Limits().PCeil {
		// Below Tc the cached curve places (T, p) on a branch where p
		// lies outside its bound of the vapour pressure.
		if sp, ok := f.SaturationPointAtT(T); ok {
			if ps, errP, _ := sp.Pressure(); math.Abs(p-ps) > errP {
				// (At the pressure ceiling a root whose pressure rounds
				// above it is left to fluid.PropsTP, which says so.)
				pr, ok := k.densityOn(T, p, &sp, ps, p > ps, k.guessRho(root, T, p))
				if ok && pr.P <= f.Limits().PCeil {
					setSingle(&st, &pr, fluidPhase(f, T, p, pr.Rho))
					err = k.wantedTo(&st)
					return
				}
			}
		}
	}
	pr, perr := f.PropsTP(T, p, root, k.guessRho(root, T, p))
	if perr != nil {
		if pl == placeNear && !meta {
			// No fluid root beside the curve: the solid.
			return k.done(k.ptSolid(p, T, pl, why, nil))
		}
		return State{}, k.rewrap(perr)
	}
	if pr.Flags&Metastable != 0 && !k.opt.AllowMetastable {
		if pl == placeNear && !meta && k.opt.Phase != Vapor && k.opt.Phase != Liquid {
			// Beside the sublimation curve the vapour root is metastable
			// against the liquid: below the triple point the liquid lies
			// above the solid in Gibbs energy, so the solid is stable.
			return k.done(k.ptSolid(p, T, pl, why, nil))
		}
		ph := Liquid
		if pr.Rho > f.Critical().Rho {
			ph = Vapor
		}
		return State{}, k.notWanted(ph)
	}
	if pl == placeNear && !meta {
		return k.done(k.ptSolid(p, T, pl, why, &pr))
	}
	setSingle(&st, &pr, fluidPhase(f, T, p, pr.Rho))
	if meta && (pl == placeSolid || pl == placeNear && k.byGibbs(&pr) == vSolid) {
		st.Flags |= Metastable // against the solid
	}
	if st.Flags&Indeterminate != 0 {
		st.Flags |= Saturated // on a coexistence curve
	}
	err = k.wantedTo(&st)
	return
}

// TQ returns the saturation state of f at temperature T in K and vapour
// mass fraction q, from the vapour floor through the triple point to the
// critical point. q = 0 and q = 1 return the saturated liquid and vapour
// as single-phase states (Phase Liquid or Vapor, flag Saturated);
// 0 < q < 1 a two-phase state (see State). Below the triple-point
// temperature TQ returns states on the sublimation curve: q = 0 the
// saturated solid (Phase Solid), q = 1 the saturated vapour, between them
// SolidVapor with Quality q and Solid 1 − q (flag Saturated). On the
// triple line the solid fraction is not fixed and TQ returns the state
// without solid, flagged Indeterminate (for q < 1). At Tc the critical
// point itself.
//
// Special cases are:
//
//	T NaN, ±Inf or ≤ 0, q NaN or outside [0, 1]: ErrInvalidInput
//	T > Tc: ErrOutOfRange
//	T below the vapour floor (150 K for CO2, 200 K for water):
//	  ErrOutOfRange
//	T below the triple point of a fluid without a solid model (R-134a):
//	  ErrUndefined
func TQ(f *fluid.Fluid, T, q float64) (State, error) { return TQWith(f, T, q, Options{}) }

// TQWith is TQ with a warm start from opt.Guess (a two-phase state).
func TQWith(f *fluid.Fluid, T, q float64, opt Options) (st State, err error) {
	var k call
	if err := k.init(f, "flash.TQ", fluid.Input{Name: "T", Value: T, Unit: "K"},
		fluid.Input{Name: "q", Value: q}, &opt, 1); err != nil {
		return State{}, err
	}
	if err := k.quality(q); err != nil {
		return State{}, err
	}
	if k.sol.ok && k.belowTripleT(T) {
		return k.done(k.sublimationSat(T, 0, q))
	}
	if k.sol.ok && k.onTripleT(T) {
		return k.tripleSat(q)
	}
	if k.belowTripleT(T) {
		return State{}, k.solidError("below the triple point")
	}
	s, err := k.satT(T)
	if err != nil {
		return State{}, err
	}
	if err = k.finishSatTo(&s, q, &st); err != nil {
		return State{}, err
	}
	return
}

// PQ returns the saturation state of f at pressure p in Pa and vapour
// mass fraction q, as TQ: below the triple-point pressure on the
// sublimation curve (q = 0 the saturated solid, q = 1 the saturated
// vapour, SolidVapor between), from it to the critical pressure on the
// vapour-pressure curve.
//
// Special cases are:
//
//	p NaN, ±Inf or ≤ 0, q NaN or outside [0, 1]: ErrInvalidInput
//	p > pc: ErrOutOfRange
//	p below the sublimation pressure at the vapour floor: ErrOutOfRange
//	p below the triple point of a fluid without a solid model (R-134a):
//	  ErrUndefined
func PQ(f *fluid.Fluid, p, q float64) (State, error) { return PQWith(f, p, q, Options{}) }

// PQWith is PQ with a warm start from opt.Guess (a two-phase state).
func PQWith(f *fluid.Fluid, p, q float64, opt Options) (st State, err error) {
	var k call
	if err := k.init(f, "flash.PQ", fluid.Input{Name: "p", Value: p, Unit: "Pa"},
		fluid.Input{Name: "q", Value: q}, &opt, 1); err != nil {
		return State{}, err
	}
	if err := k.quality(q); err != nil {
		return State{}, err
	}
	if k.sol.ok && k.belowTripleP(p) {
		return k.done(k.sublimationSat(0, p, q))
	}
	if k.sol.ok && k.onTripleP(p) {
		return k.tripleSat(q)
	}
	s, err := k.satP(p)
	if err != nil {
		if p < k.sol.pt && errors.Is(err, fluid.ErrOutOfRange) {
			return State{}, k.solidError("below the triple point")
		}
		return State{}, err
	}
	if err = k.finishSatTo(&s, q, &st); err != nil {
		return State{}, err
	}
	return
}

// satP returns the saturation at p, started from the cached curve, else
// from the guess.
func (k *call) satP(p float64) (fluid.Saturation, error) {
	var s fluid.Saturation
	ok, err := k.satFromCacheP(p, &s)
	if !ok {
		if gT, rl, rv, okg := k.guessSat(); okg {
			s, err = k.f.SaturationAtPFrom(p, gT, rl, rv)
		} else {
			s, err = k.f.SaturationAtP(p)
		}
	}
	if err != nil && k.onTripleP(p) {
		// On the triple line below the vapour pressure at Tt, to within
		// its precision: the saturation at Tt.
		return k.satT(k.sol.tt)
	}
	if err != nil {
		return s, k.rewrap(err)
	}
	return s, nil
}

// finishSat builds the state of saturation s at quality q, with the
// request checked and the triple point flagged.
func (k *call) finishSatTo(s *fluid.Saturation, q float64, st *State) error {
	setTwoPhase(k.f, s, q, st)
	if k.onTripleT(s.T) && q < 1 {
		// On the triple line: the state without solid.
		st.Flags |= Indeterminate
	}
	if !satisfies(k.opt.Phase, st.Phase) {
		return k.notWanted(st.Phase)
	}
	return nil
}

// finishSat is finishSatTo, returning the state.
func (k *call) finishSat(s *fluid.Saturation, q float64) (State, error) {
	var st State
	if err := k.finishSatTo(s, q, &st); err != nil {
		return State{}, err
	}
	return st, nil
}

// ---------------------------------------------------------------------
// PH, PS

// PH returns the state of f at pressure p in Pa and specific enthalpy h
// in J/kg: liquid, vapour, supercritical or two-phase; for water and CO2
// also solid, solid–vapour (below the triple-point pressure) and
// solid–liquid (above it).
//
// Below pc the fluid's cached saturation curve
// (fluid.SaturationEstimateAtP) places h against the saturated
// enthalpies; within its error bounds of the curve, and within a
// millikelvin of the critical point where it ends, the equation's own
// saturation (SaturationAtP) decides. Single-phase states come from
// Newton's method in (T, ρ) on p and h with the analytic Jacobian,
// started from the cached saturated phase (a liquid from the saturated
// liquid at its own temperature, carried to p), with a bracketed search
// along the isobar where it fails.
// Below the triple-point pressure h is placed against the solid and the
// vapour on the model's sublimation curve at p, above it against the
// solid and the liquid on its melting curve where h lies below the liquid
// there; a solid state comes from Newton's method in T on the solid's
// Gibbs function. On the triple line (p within 1e-10 of pt) the fractions
// are not fixed: the state of least solid is returned, flagged
// Indeterminate (liquid–vapour where h lies between the liquid and the
// vapour at the triple point, else solid–vapour).
//
// Special cases are:
//
//	p NaN, ±Inf or ≤ 0, h NaN or ±Inf: ErrInvalidInput
//	h below the solid at its lowest modelled temperature: ErrOutOfRange
//	a state with solid beyond the solid model (water above 208.566 MPa
//	  beyond the melting curves of ices III, V, VI and VII, naming the
//	  ice; CO2 above 800 MPa): ErrOutOfRange
//	h below the fluid at the triple point of a fluid without a solid
//	  model (R-134a): ErrUndefined
//	outside the equation's accepted range: ErrOutOfRange
func PH(f *fluid.Fluid, p, h float64) (State, error) { return PHWith(f, p, h, Options{}) }

// PHWith is PH with options (see Options): a warm start from opt.Guess,
// a requested phase, and metastable states up to the spinodal.
func PHWith(f *fluid.Fluid, p, h float64, opt Options) (st State, err error) {
	var k call
	if err := k.init(f, "flash.PH", fluid.Input{Name: "p", Value: p, Unit: "Pa"},
		fluid.Input{Name: "h", Value: h, Unit: "J/kg"}, &opt, 1); err != nil {
		return State{}, err
	}
	err = k.doneTo(&st, k.isobaricAll(p, qH, h, &st))
	keepInputP(f, p, &st, err)
	return
}

// PS returns the state of f at pressure p in Pa and specific entropy s
// in J/(kg·K), as PH does for enthalpy.
func PS(f *fluid.Fluid, p, s float64) (State, error) { return PSWith(f, p, s, Options{}) }

// PSWith is PS with options (see Options).
func PSWith(f *fluid.Fluid, p, s float64, opt Options) (st State, err error) {
	var k call
	if err := k.init(f, "flash.PS", fluid.Input{Name: "p", Value: p, Unit: "Pa"},
		fluid.Input{Name: "s", Value: s, Unit: "J/(kg K)"}, &opt, 1); err != nil {
		return State{}, err
	}
	err = k.doneTo(&st, k.isobaricAll(p, qS, s, &st))
	keepInputP(f, p, &st, err)
	return
}

// dXdT returns (∂X/∂T)_p at pr: cp for h, cp/T for s.
func dXdT(X quantity, pr *fluid.Props) float64 {
	if X == qS {
		return pr.Cp / pr.T
	}
	return pr.Cp
}

// side selects the branch a single-phase iteration keeps to.
type side int8

const (
	anySide    side = iota // above pc: one fluid phase
	liquidSide             // ρ > ρc below Tc
	vaporSide              // ρ < ρc below Tc
)

// onBranch returns the branch for newton2 that holds a single-phase
// iteration on its side below Tc (and below pc), and within [tlo, thi].
func onBranch(f *fluid.Fluid, sd side, tlo, thi float64) branch {
	return branch{c: f.Critical(), sd: sd, tlo: tlo, thi: thi}
}

func sideOf(liquid bool) side {
	if liquid {
		return liquidSide
	}
	return vaporSide
}

// isobaricAll is PH (X = h) and PS (X = s): below and on the triple line
// by the solid paths, above it the fluid first.
func (k *call) isobaricAll(p float64, X quantity, x float64, st *State) error {
	if k.sol.ok && (k.belowTripleP(p) || k.onTripleP(p)) {
		if k.fluidGuess() && k.belowTripleP(p) {
			// A vapour from a warm start, placed against the solid by
			// finish, before the sublimation curve is solved for.
			if done, err := k.isobaricWarm(p, X, x, st); done {
				return err
			}
		}
		return k.isobarSolid(p, X, x, st)
	}
	if err, done := k.isobarMelt(p, X, x, st); done {
		return err
	}
	err := k.isobaric(p, X, x, st)
	if err == errSolid && !k.decided {
		return k.isobarSolid(p, X, x, st)
	}
	return err
}

// isobaric is the fluid path of PH (X = h) and PS (X = s).
func (k *call) isobaric(p float64, X quantity, x float64, st *State) error {
	f := k.f
	if pc := f.Limits().PCeil; p > pc {
		return k.fail(fluid.ErrOutOfRange, "p exceeds the accepted "+fmtG(pc)+" Pa")
	}
	if done, err := k.isobaricWarm(p, X, x, st); done {
		return err
	}
	c, lim := f.Critical(), f.Limits()
	want := k.opt.Phase
	// The lowest fluid temperature at p, a bound from the solid model's
	// curve nodes (results are placed against the solid in finish).
	Tf, floor := k.freezeT(p)
	if k.belowTripleP(p) && k.metaFluid() && want == Liquid && !k.sol.ok {
		// A metastable liquid below the triple-point pressure (a fluid
		// without a solid model: above Tt, below the vapour pressure),
		// from the liquid at Tt stretched to p.
		if pl, err := f.PropsTP(k.sol.tt, p, fluid.RootLiquid, 0); err == nil {
			return k.isobarSingle(p, X, x, &pl, liquidSide, k.sol.tt, lim.TCeil, true, st)
		}
	}
	if p >= c.P || k.belowTripleP(p) {
		// One fluid phase along the isobar.
		sd := anySide
		root := fluid.RootStable
		T0 := c.T
		if k.belowTripleP(p) {
			root, T0, sd = fluid.RootVapor, Tf, vaporSide
		} else if ls, ok := k.liquidStart(p, X, x, 0); ok {
			// Above pc, liquid-like below Tc by the cached curve.
			return k.isobarSingle(p, X, x, &ls, anySide, Tf, lim.TCeil, false, st)
		} else if sp, ok := f.SaturationPointAtT(satEnd(f)); ok {
			// Above the liquid at the end of the cached curve: above Tc,
			// by Newton's method in (T, ρ) from the table of states
			// above Tc, or from the ideal gas at 1.5 Tc (the saturated
			// vapour there to fall back toward).
			v := sp.Vapor()
			T0 = min(1.5*c.T, 0.5*(c.T+lim.TCeil))
			k.at = [2]float64{T0, p / (f.GasConstant() * T0)}
			if Ta, ra, ok := estimateAboveTc(f, p, X, x); ok {
				k.at = [2]float64{Ta, ra}
			}
			return k.isobarSingle(p, X, x, &v, sd, Tf, lim.TCeil, false, st)
		} else if pcr, ok := props(f, c.T, c.Rho); ok || pcr.H != 0 {
			// Above pc: start from the liquid at the triple-point
			// temperature or a gas well above Tc, whichever side of the
			// critical point's X the input lies on (near Tc the cp of
			// the isobar misleads).
			T0 = min(1.5*c.T, 0.5*(c.T+lim.TCeil))
			if x < X.of(&pcr) {
				T0 = max(k.sol.tt, lim.TFloor)
			} else {
				// Gas-like: Newton's method in (T, ρ) from the ideal
				// gas at T0 (the critical state to fall back toward).
				k.at = [2]float64{T0, p / (f.GasConstant() * T0)}
				return k.isobarSingle(p, X, x, &pcr, sd, Tf, lim.TCeil, false, st)
			}
		}
		pr0, err := f.PropsTP(T0, p, root, 0)
		if err != nil && T0 != c.T {
			pr0, err = f.PropsTP(c.T, p, root, 0)
		}
		if err != nil {
			return k.rewrap(err)
		}
		if k.belowTripleP(p) && x < X.of(&pr0)-X.tol(f, &pr0, x) {
			return k.lowError(floor)
		}
		return k.isobarSingle(p, X, x, &pr0, sd, Tf, lim.TCeil, false, st)
	}
	// pt <= p < pc: place x against the saturated phases, by the cached
	// curve where x lies outside its bounds.
	var s fluid.Saturation
	var err error
	if sp := (fluid.SatPoint{}); sp.LocateP(f, p) {
		Ts, errT := sp.Temperature()
		if want != TwoPhase {
			switch placeX(&sp, X, x) {
			case cacheVapor:
				v := sp.Vapor()
				if Ta, ra, ok := estimateAboveTc(f, p, X, x); ok {
					// Above Tc: from the table of states there.
					k.at = [2]float64{Ta, ra}
				}
				return k.isobarSingle(p, X, x, &v, vaporSide, Ts-errT, lim.TCeil, false, st)
			case cacheLiquid:
				start := sp.Liquid()
				if X == qH || X == qS {
					if ls, ok := k.liquidStart(p, X, x, 0); ok {
						start = ls
					}
				}
				return k.isobarSingle(p, X, x, &start, liquidSide, Tf, Ts+errT, false, st)
			}
		}
		err = sp.Solve(&s)
	} else {
		// Within a millikelvin of the critical point, or between the
		// stored triple-point pressure and the equation's vapour
		// pressure at Tt: the equation's saturation.
		s, err = f.SaturationAtP(p)
	}
	if err != nil && k.onTripleP(p) {
		// On the triple line, below the vapour pressure at Tt to within
		// its precision (a fluid without a solid model): the saturation
		// at Tt.
		s, err = k.satT(k.sol.tt)
	}
	if err != nil {
		if errors.Is(err, fluid.ErrOutOfRange) && p < k.sol.pt*1.01 {
			// Between the stored triple-point pressure and the
			// equation's vapour pressure at Tt: vapour only.
			pr0, err := f.PropsTP(max(Tf, k.sol.tt), p, fluid.RootVapor, 0)
			if err != nil {
				return k.rewrap(err)
			}
			if x < X.of(&pr0) {
				return k.solidError("below the triple-point temperature")
			}
			return k.isobarSingle(p, X, x, &pr0, vaporSide, pr0.T, lim.TCeil, false, st)
		}
		return k.rewrap(err)
	}
	return k.isobaricSat(p, X, x, &s, st)
}

// isobaricSat finishes PH/PS with the equation's saturation s at p.
func (k *call) isobaricSat(p float64, X quantity, x float64, s *fluid.Saturation, st *State) error {
	f := k.f
	want := k.opt.Phase
	xl, xv := X.of(&s.Liquid), X.of(&s.Vapor)
	if k.onTripleT(s.T) && x < xl && xl-x <= X.floor(f, &s.Liquid, x) {
		// The liquid at the triple point, to the floor of x: no colder
		// liquid to solve for (a fluid without a solid model).
		return k.finishSatTo(s, 0, st)
	}
	// (The limits and the freezing temperature are read only where a
	// single phase is solved for: a mixture, the warm path's most
	// common end here, needs neither.)
	switch {
	case x < xl:
		Tf, _ := k.freezeT(p)
		return k.isobarSingle(p, X, x, &s.Liquid, liquidSide, Tf, s.T, false, st)
	case x > xv:
		return k.isobarSingle(p, X, x, &s.Vapor, vaporSide, s.T, f.Limits().TCeil, false, st)
	}
	if (want == Liquid || want == Vapor) && k.opt.AllowMetastable {
		start := &s.Liquid
		if want == Vapor {
			start = &s.Vapor
		}
		Tf, _ := k.freezeT(p)
		return k.isobarSingle(p, X, x, start, sideOf(want == Liquid), Tf, f.Limits().TCeil, true, st)
	}
	q := (x - xl) / (xv - xl)
	switch {
	case xv == xl:
		q = 0.5
	case x-xl <= X.tol(f, &s.Liquid, x):
		// The saturated liquid to rounding (x from a saturation solved
		// from T, this one from p: their h or s differ in the last
		// digits).
		q = 0
	case xv-x <= X.tol(f, &s.Vapor, x):
		q = 1
	}
	return k.finishSatTo(s, q, st)
}

// isobaricWarm tries the warm start of PH/PS: done reports whether it
// decided the state (err nil) or found it beyond the accepted
// temperatures (err says so).
func (k *call) isobaricWarm(p float64, X quantity, x float64, st *State) (done bool, err error) {
	g := k.opt.Guess
	if g == nil || g.N < 1 || !(g.T > 0) || k.opt.AllowMetastable || k.decided {
		return false, nil
	}
	f := k.f
	if gT, rl, rv, ok := k.guessSat(); ok {
		return k.isobaricWarmSat(p, X, x, gT, rl, rv, st), nil
	}
	if !k.fluidGuess() {
		return false, nil
	}
	liquid := g.Rho > f.Critical().Rho
	sd := sideOf(liquid)
	if p >= f.Critical().P {
		sd = anySide
	}
	T0, rho0 := predict(g, p, X, x)
	var vp vaporPressure
	near := false // a vapour within 20 % of its vapour pressure
	if sd != anySide {
		if vp.at(f, T0) {
			if stable, decided := placeP(p, vp.p, vp.err, liquid); decided && !stable {
				// The guess's phase carried to (p, x) lies beyond the
				// vapour-pressure curve: the state is most likely a
				// mixture (or the other phase), placed against the
				// saturation at p at once, without first solving for a
				// metastable state.
				return k.isobaricWarmSat(p, X, x, 0, 0, 0, st), nil
			}
			near = !liquid && p > 0.8*vp.p
		}
	}
	var from fluid.Props
	from.T, from.Rho = g.T, g.Rho
	lim := f.Limits()
	br := onBranch(f, sd, lim.TFloor, lim.TCeil)
	// A vapour near its vapour pressure, where p(ρ) bends most, in
	// (T, ln ρ) (see lnRhoStep); farther off the plain step ends as soon
	// and costs less.
	br.lnRhoStep = near
	pr, ok := newton2(f, qP, p, X, x, T0, rho0, br, &from)
	if !ok {
		if k.aboveTCeil(&pr, p, X, x) {
			return true, k.rangeTError()
		}
		return false, nil
	}
	stable, decided := vp.place(&pr, f.Critical())
	if !decided {
		stable, _ = k.stable(&pr)
	}
	if !stable {
		return false, nil
	}
	if err := k.finishTo(&pr, st); err != nil || !satisfies(k.opt.Phase, st.Phase) {
		return false, nil
	}
	return true, nil
}

// isobaricWarmSat is the warm start of PH/PS through the equation's
// saturation at p (pt ≤ p < pc), started from the cached curve, or where
// it has none from the guess's saturated phases (T gT, densities rl and
// rv; gT = 0: none), and placed by isobaricSat. It reports whether that
// decided the state; where not, the cold path does.
func (k *call) isobaricWarmSat(p float64, X quantity, x, gT, rl, rv float64, st *State) bool {
	f := k.f
	if !(p < f.Critical().P && p >= k.sol.pt) {
		return false
	}
	var s fluid.Saturation
	ok, err := k.satFromCacheP(p, &s)
	if !ok {
		if !(gT > 0) {
			return false
		}
		s, err = f.SaturationAtPFrom(p, gT, rl, rv)
	}
	return err == nil && k.isobaricSat(p, X, x, &s, st) == nil
}

// guessProps sets pr to the single-phase guess g as the Props that the
// warm starts carry to the inputs by its own derivatives, which its
// state holds implicitly (common thermodynamic identities):
//
//	(∂p/∂ρ)_T = w² cv/cp,  (∂p/∂T)_ρ = ρ √((cp − cv)(∂p/∂ρ)_T/T)
//
// (the root taken positive: a liquid below its density maximum, where
// it is negative, is started less well), with T, ρ, p, h, s, u and cv
// (the other fields are left as they are); ok is false where g lacks
// what they need (a mixture: cp = +Inf).
func guessProps(g *State, pr *fluid.Props) (ok bool) {
	T, rho := g.T, g.Rho
	cp, cv, w := g.Cp, g.Cv, g.W
	if !(cp > cv && cv > 0 && w > 0 && isFinite(cp)) {
		return false
	}
	// (The reciprocals are independent of one another: no division
	// waits for another.)
	icp, iT := 1/cp, 1/T
	pr.T, pr.Rho, pr.P, pr.H, pr.S, pr.U, pr.Cv = T, rho, g.P, g.H, g.S, g.U, cv
	pr.DpDrho = w * w * cv * icp
	pr.DpDT = rho * math.Sqrt((cp-cv)*pr.DpDrho*iT)
	return true
}

// predict returns the start of a warm-started PH (X = h) or PS (X = s)
// at pressure p: the single-phase guess g carried to (p, x) by one
// Newton step from its own derivatives (guessProps). Where the step
// would move T by more than 5 % or ρ by more than 10 %, or the guess
// lacks what it needs, the guess itself.
func predict(g *State, p float64, X quantity, x float64) (T, rho float64) {
	return predict2(g, qP, p, X, x)
}

// predict2 is predict for any two quantities: the guess g carried to
// A = a and X = x.
func predict2(g *State, A quantity, a float64, X quantity, x float64) (T, rho float64) {
	T, rho = g.T, g.Rho
	var pr fluid.Props
	if !guessProps(g, &pr) {
		return T, rho
	}
	a1, a2 := A.partials(&pr)
	b1, b2 := X.partials(&pr)
	ra, rb := A.of(&pr)-a, X.of(&pr)-x
	idet := 1 / (a1*b2 - a2*b1)
	dT := (-ra*b2 + rb*a2) * idet
	dRho := (-rb*a1 + ra*b1) * idet
	if !isFinite(dT) || !isFinite(dRho) || math.Abs(dT) > 0.05*T || math.Abs(dRho) > 0.1*rho {
		return T, rho
	}
	return T + dT, rho + dRho
}

// predictP returns the pressure of the guess g carried to (T, ρ) by its
// own derivatives (guessProps), to first order; NaN where the guess
// lacks what it needs.
func predictP(g *State, T, rho float64) float64 {
	var pr fluid.Props
	if !guessProps(g, &pr) {
		return math.NaN()
	}
	return g.P + pr.DpDT*(T-g.T) + pr.DpDrho*(rho-g.Rho)
}

// predictT returns the start in T of a warm-started flash along the
// isochore rho with X = x (DU: X = u): the guess g carried there by
// its own derivatives (guessProps), to first order in T and ρ; its T
// where the step would move T by more than 5 % or the guess lacks what
// it needs (a mixture: its T).
func predictT(g *State, rho float64, X quantity, x float64) float64 {
	var pr fluid.Props
	if !guessProps(g, &pr) {
		return g.T
	}
	dXdT, dXdRho := X.partials(&pr)
	dT := (x - X.of(&pr) - dXdRho*(rho-pr.Rho)) / dXdT
	if !isFinite(dT) || math.Abs(dT) > 0.05*g.T {
		return g.T
	}
	return g.T + dT
}

// predictRho returns the start in ρ of a warm-started flash along the
// isotherm T with X = x (TS: X = s): the guess g carried there by its
// own derivatives (guessProps), to first order in T and ρ; 0 where the
// step would move ρ by more than 10 % or the guess lacks what it needs.
func predictRho(g *State, T float64, X quantity, x float64) float64 {
	var pr fluid.Props
	if !guessProps(g, &pr) {
		return 0
	}
	dXdT, dXdRho := X.partials(&pr)
	dRho := (x - X.of(&pr) - dXdT*(T-pr.T)) / dXdRho
	if !isFinite(dRho) || math.Abs(dRho) > 0.1*g.Rho {
		return 0
	}
	return g.Rho + dRho
}

// isobarSingle solves a single-phase state at p with X = x on side sd,
// between tlo and thi, from the state start; meta allows a metastable
// result (flagged). It tries Newton's method in (T, ρ) from the start
// extrapolated with (∂X/∂T)_p (or from k.at, where the caller set it;
// in ln T and ln ρ on ln p for a vapour and from k.at), then from the
// far end of the bracket (near the critical point the start's cp
// misleads), then a bracketed search along the isobar, between the
// equation's own saturation temperature and the far end below pc.
func (k *call) isobarSingle(p float64, X quantity, x float64, start *fluid.Props, sd side, tlo, thi float64, meta bool, st *State) error {
	f := k.f
	c := f.Critical()
	lim := f.Limits()
	keepLo, keepHi := tlo*(1-1e-11), thi*(1+1e-11)
	if meta {
		keepLo, keepHi = lim.TFloor, lim.TCeil
	}
	at := k.at // a start given by the caller, for this call only
	k.at = [2]float64{}
	keep := onBranch(f, sd, keepLo, keepHi)
	keep.logStep = at[0] > 0 || sd == vaporSide
	mayFreeze := !meta && sd != vaporSide && k.sol.ok && !k.decided
	if d := dXdT(X, start); mayFreeze && d > 0 && start.T+(x-X.of(start))/d < k.freezeTHi(p) &&
		k.belowFreezing(p, X, x) {
		// By the start's slope the state lies near or below where the
		// liquid freezes, and it is below the liquid there: the solid
		// paths decide.
		return errSolid
	}
	T0, rho0 := extrapolate(X, x, start, sd, tlo, thi)
	if at[0] > 0 {
		T0, rho0 = at[0], at[1]
	}
	pr, ok := newton2(f, qP, p, X, x, T0, rho0, keep, start)
	if !ok && !meta && k.aboveTCeil(&pr, p, X, x) {
		return k.rangeTError()
	}
	if !ok && mayFreeze && k.belowFreezing(p, X, x) {
		// Below the liquid where it may freeze: the solid paths decide,
		// without the fallbacks' search along the isobar.
		return errSolid
	}
	if !ok && !meta {
		// From the far end of the bracket.
		root := fluid.RootVapor
		Ta := min(thi, 2*start.T)
		switch {
		case sd == anySide:
			root = fluid.RootStable
			Ta = max(tlo, k.sol.tt)
			if x > X.of(start) {
				Ta = min(thi, 2*start.T)
			}
		case sd == liquidSide:
			root, Ta = fluid.RootLiquid, max(tlo, k.sol.tt)
		}
		if pa, err := f.PropsTP(Ta, p, root, 0); err == nil {
			T0, rho0 := extrapolate(X, x, &pa, sd, tlo, thi)
			pr, ok = newton2(f, qP, p, X, x, T0, rho0, keep, &pa)
		}
		if !ok {
			if sd != anySide && p < c.P && p >= k.sol.pt {
				if s, err := f.SaturationAtP(p); err == nil {
					if sd == liquidSide {
						thi = s.T
					} else {
						tlo = s.T
					}
				}
			}
			if Tf, _ := k.freezeT(p); Tf > tlo {
				tlo = Tf
			}
			var below, above bool
			pr, ok, below, above = isobar(f, p, X, x, tlo, thi, root)
			switch {
			case above && sd == liquidSide && thi < c.T || below && sd == vaporSide:
				// The start misjudged the dome's edge.
				if s, err := f.SaturationAtP(p); err == nil {
					xl, xv := X.of(&s.Liquid), X.of(&s.Vapor)
					if x >= xl && x <= xv {
						q := (x - xl) / (xv - xl)
						return k.finishSatTo(&s, q, st)
					}
				}
				return k.fail(fluid.ErrNoConvergence, "the single-phase iteration did not converge")
			case below:
				_, floor := k.freezeT(p)
				return k.lowError(floor || tlo <= lim.TFloor && tlo < k.sol.tt)
			case below || above:
				return k.rangeTError()
			}
		}
	}
	if !ok && meta {
		// Deep in the metastable region (supercooled water tens of
		// kelvin below its melting curve) Newton's method from the
		// saturated or melting-curve state can step past the spinodal:
		// a bracketed search along the isobar on the requested root.
		pr, ok = isobarMeta(f, p, X, x, tlo, thi, rootFor(k.opt.Phase), keep)
	}
	if !ok {
		if meta {
			return k.fail(fluid.ErrUnstable, "no metastable "+k.opt.Phase.String()+" state with these inputs before the spinodal")
		}
		return k.fail(fluid.ErrNoConvergence, "the single-phase iteration did not converge")
	}
	Tf, floor := k.freezeT(p)
	if pr.T < Tf*(1-1e-11) && !meta {
		return k.lowError(floor)
	}
	if err := k.finishTo(&pr, st); err != nil {
		return err
	}
	if meta {
		if ok, _ := k.stable(&pr); !ok {
			st.Flags |= Metastable
		}
	}
	if !satisfies(k.opt.Phase, st.Phase) {
		return k.notWanted(st.Phase)
	}
	return nil
}

// satEnd returns the temperature at which the fluid's cached curve ends
// (Tc − 1 mK), or 0 without one.
func satEnd(f *fluid.Fluid) float64 {
	_, hi := f.SaturationEstimateRange()
	return hi
}

// estimateAboveTc returns the estimate of (T, ρ) at p with X = x (h or
// s) above Tc from the fluid's table (fluid.EstimateAboveTcPH, PS).
func estimateAboveTc(f *fluid.Fluid, p float64, X quantity, x float64) (T, rho float64, ok bool) {
	switch X {
	case qH:
		return f.EstimateAboveTcPH(p, x)
	case qS:
		return f.EstimateAboveTcPS(p, x)
	}
	return 0, 0, false
}

// aboveTCeil reports whether pr, where a Newton iteration on the isobar
// p stopped at the accepted temperatures' ceiling (newton2: held there
// and pressed beyond it, its pressure near p), shows X = x to lie beyond
// it: X(TCeil, p) < x, with X(TCeil, p) from pr by (∂X/∂p)_T, its
// correction counted twice against the margin. Above Tc, where the
// ceiling lies, an isobar has one fluid phase, along which X (h or s)
// rises with T.
func (k *call) aboveTCeil(pr *fluid.Props, p float64, X quantity, x float64) bool {
	lim := k.f.Limits()
	if pr.T != lim.TCeil || !(lim.TCeil > k.f.Critical().T) || !(math.Abs(pr.P-p) <= 1e-6*p) || !(pr.DpDrho > 0) {
		return false
	}
	_, dXdRho := X.partials(pr)
	return X.of(pr)+2*math.Abs(dXdRho/pr.DpDrho*(p-pr.P)) < x
}

// rangeTError is the error for a state beyond the accepted temperatures.
func (k *call) rangeTError() error {
	lim := k.f.Limits()
	return k.fail(fluid.ErrOutOfRange, "beyond the accepted temperature range "+
		fmtG(lim.TFloor)+" <= T <= "+fmtG(lim.TCeil)+" K")
}

// isobarMeta solves X(T, p) = x at fixed p on root (Liquid or Vapor,
// metastable allowed) for T in [lo, hi], where the root may end at a
// spinodal temperature inside the interval: the end of the root's
// temperatures is found by bisection from the usable end of the interval
// (to the last floating-point temperature), and Newton's method in
// (T, ρ) on the branch keep starts from the state there — next to a
// spinodal X(T) at fixed p has an infinite slope and a state may lie
// within a few ulps of T from its end, where (T, ρ) still resolves it —
// then isobar searches between it and the interval's usable end.
func isobarMeta(f *fluid.Fluid, p float64, X quantity, x, lo, hi float64, root fluid.Root, keep branch) (fluid.Props, bool) {
	usable := func(T float64) bool {
		_, err := f.PropsTP(T, p, root, 0)
		return err == nil
	}
	// lastUsable bisects between the usable good and the unusable bad to
	// the last floating-point temperature on good's side.
	lastUsable := func(good, bad float64) float64 {
		for i := 0; i < 80; i++ {
			m := 0.5 * (good + bad)
			if m == good || m == bad {
				break
			}
			if usable(m) {
				good = m
			} else {
				bad = m
			}
		}
		return good
	}
	edge := 0.0
	switch ua, ub := usable(lo), usable(hi); {
	case ua && ub:
	case ub:
		lo = lastUsable(hi, lo)
		edge = lo
	case ua:
		hi = lastUsable(lo, hi)
		edge = hi
	default:
		return fluid.Props{}, false
	}
	if edge > 0 {
		if pe, err := f.PropsTP(edge, p, root, 0); err == nil {
			if pr, ok := newton2(f, qP, p, X, x, pe.T, pe.Rho, keep, &pe); ok {
				return pr, true
			}
		}
	}
	pr, ok, _, _ := isobar(f, p, X, x, lo, hi, root)
	return pr, ok
}

// extrapolate returns a starting (T, ρ) for X = x at the pressure of the
// state start, by (∂X/∂T)_p and the expansivity (the ideal gas on the
// vapour side), T kept in [tlo, thi]: at most a quarter of T away, but
// for a gas (Z > 0.8 on the vapour side), which it takes up to twice T.
func extrapolate(X quantity, x float64, start *fluid.Props, sd side, tlo, thi float64) (T0, rho0 float64) {
	d := dXdT(X, start)
	T0 = start.T
	gas := sd == vaporSide && start.Z > 0.8
	switch {
	case gas && start.Cp > 0 && isFinite(start.Cp):
		// A gas, whose cp changes slowly along the isobar: h by cp, s by
		// cp in ln T, up to twice T.
		r := 1 + (x-X.of(start))/(start.Cp*start.T)
		if X == qS {
			r = elem.Exp(max(min((x-X.of(start))/start.Cp, math.Ln2), -math.Ln2))
		}
		T0 = min(max(start.T*max(min(r, 2), 0.75), tlo), thi)
	case d > 0 && isFinite(d):
		// At most a quarter of T away: cp and the expansivity of the
		// start (huge near the critical point) say little further out.
		dT := (x - X.of(start)) / d
		dT = max(min(dT, 0.25*start.T), -0.25*start.T)
		T0 = min(max(start.T+dT, tlo), thi)
	}
	e := max(min(-start.Expansivity*(T0-start.T), math.Ln2), -math.Ln2)
	rho0 = start.Rho * elem.Exp(e)
	if !isFinite(rho0) || rho0 <= 0 {
		rho0 = start.Rho
	}
	if sd == vaporSide && T0 > start.T {
		rho0 = start.Rho * start.T / T0
	}
	return T0, rho0
}

func fmtG(x float64) string { return strconv.FormatFloat(x, 'g', -1, 64) }
