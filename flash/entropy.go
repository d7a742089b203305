package flash

import (
	"math"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// ---------------------------------------------------------------------
// TS, HS

// TS returns the state of f at temperature T in K and specific entropy s
// in J/(kg·K). Below Tc the saturated entropies at T place s: between
// them the liquid–vapour mixture, outside them the single phase, by
// Newton's method in ln ρ along the isotherm. Below the triple-point
// temperature the fluid is the vapour below the sublimation curve and
// (water) the liquid above the melting curve. Where s is not monotone
// along the isotherm (liquid water below its density maximum, where s
// rises with pressure) the state is not unique: TS returns the one of
// lowest pressure (a saturated mixture where there is one).
//
// Special cases are:
//
//	T NaN, ±Inf or ≤ 0, s NaN or ±Inf: ErrInvalidInput
//	s below the fluid states of the isotherm: the solid region
//	  (ErrOutOfRange; ErrUndefined without solid data)
//	outside the equation's accepted range: ErrOutOfRange
func TS(f *fluid.Fluid, T, s float64) (State, error) { return TSWith(f, T, s, Options{}) }

// TSWith is TS with options: a warm start and a requested phase.
func TSWith(f *fluid.Fluid, T, s float64, opt Options) (State, error) {
	var k call
	if err := k.init(f, "flash.TS", fluid.Input{Name: "T", Value: T, Unit: "K"},
		fluid.Input{Name: "s", Value: s, Unit: "J/(kg K)"}, &opt, 1); err != nil {
		return State{}, err
	}
	c := f.Critical()
	lim := f.Limits()
	lo, hi := 1e-12*c.Rho, lim.RhoCeil
	rho0 := c.Rho
	if g := k.opt.Guess; g != nil && g.N == 1 && g.Rho > 0 {
		rho0 = g.Rho
	}
	switch {
	case T < k.c.tt*(1-1e-12):
		if !k.c.hasSub {
			return State{}, k.c.solidError(k.op, "below the triple point", k.in[0], k.in[1])
		}
		if T < k.c.subLo {
			return State{}, k.c.regionError(k.op, regionBeyond, "below the range of the sublimation curve", k.in[0], k.in[1])
		}
		pv, err := f.PropsTP(T, k.c.psub(T), fluid.RootVapor, 0)
		if err != nil {
			return State{}, k.rewrap(err)
		}
		if s < pv.S {
			// The liquid above an anomalous melting curve (water), up to
			// the curve's end.
			if k.c.hasMelt && k.c.anomalous && T >= k.c.meltLo {
				pm, err1 := f.PropsTP(T, k.c.pmelt(T), fluid.RootLiquid, 0)
				pe, err2 := f.PropsTP(T, k.c.pMeltEnd, fluid.RootLiquid, 0)
				if err1 == nil && err2 == nil {
					pr, ok := solve1(f, qS, s, T, pm.Rho, false, pm.Rho, pe.Rho)
					if ok {
						return k.wanted(k.finish(&pr))
					}
				}
			}
			return State{}, k.c.solidError(k.op, "below the entropy of the vapour on the sublimation curve", k.in[0], k.in[1])
		}
		hi, rho0 = pv.Rho, min(rho0, pv.Rho)
	case T < c.T:
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
	pr, ok := solve1(f, qS, s, T, min(max(rho0, lo), hi), false, lo, hi)
	if !ok {
		return State{}, k.fail(fluid.ErrNoConvergence, "the iteration along the isotherm did not converge")
	}
	return k.wanted(k.finish(&pr))
}

// HS returns the state of f at specific enthalpy h in J/kg and specific
// entropy s in J/(kg·K): the end state of an isentropic compression or
// expansion of known work, or of a nozzle.
//
// Along an isentrope dh = dp/ρ, so h(p) rises with p: HS solves
// h(PS(p, s)) = h by Newton's method in ln p with slope p/ρ, bracketed,
// each PS warm-started from the last. On the triple line every
// three-phase mixture has h − Tt·s = g_t, so (h, s) does not fix it:
// the state without solid is returned, flagged Indeterminate.
//
// Special cases are:
//
//	h or s NaN or ±Inf: ErrInvalidInput
//	no fluid state with these h and s: ErrOutOfRange
func HS(f *fluid.Fluid, h, s float64) (State, error) { return HSWith(f, h, s, Options{}) }

// HSWith is HS with options, passed to each PS: a warm start, a
// requested phase, metastable states.
func HSWith(f *fluid.Fluid, h, s float64, opt Options) (State, error) {
	var k call
	if err := k.init(f, "flash.HS", fluid.Input{Name: "h", Value: h, Unit: "J/kg"},
		fluid.Input{Name: "s", Value: s, Unit: "J/(kg K)"}, &opt, 0); err != nil {
		return State{}, err
	}
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
		return State{}, k.fail(fluid.ErrOutOfRange, "no fluid state with these h and s")
	}
	tolH := qH.tol(f, nil, h)
	for it := 0; it < 100; it++ {
		r := last.H - h
		if math.Abs(r) <= 10*tolH {
			st := last
			if st.Phase == TwoPhase && st.T == k.c.tt {
				st.Flags |= Indeterminate
			}
			return st, nil
		}
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
		moved := false
		for try := 0; try < 60 && !moved; try++ {
			if phi-plo < 1e-15 || math.Abs(ln-lp) < 1e-16 {
				break
			}
			g := last
			inner.Guess = &g
			st, err := PSWith(f, math.Exp(ln), s, inner)
			if err == nil {
				last, lp, moved = st, ln, true
				break
			}
			// No fluid state there: bound the bracket and step back.
			if ln > lp {
				phi = ln
			} else {
				plo = ln
			}
			ln = 0.5 * (ln + lp)
		}
		if !moved {
			break
		}
	}
	if have && math.Abs(last.H-h) <= qH.floor(f, nil, h) {
		return last, nil
	}
	return State{}, k.fail(fluid.ErrNoConvergence, "the iteration along the isentrope did not converge")
}
