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
	if k.sol.ok && !k.metaFluid() && (k.onTripleT(T) || k.belowTripleT(T)) {
		return k.done(k.tsSolid(T, s))
	}
	st, err := k.ts(T, s, 0, 0)
	if err == errSolid && !k.decided {
		return k.done(k.tsSolid(T, s))
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
	}
	switch {
	case k.belowTripleT(T):
		if !k.decided {
			return State{}, k.solidError("below the triple point")
		}
	case T < c.T:
		sat, err := k.satT(T)
		if err != nil {
			return State{}, err
		}
		switch {
		case s < sat.Liquid.S:
			if !k.decided && k.tsNeedsSolid(T, s) {
				return State{}, errSolid
			}
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
	default:
		if !k.decided && k.tsNeedsSolid(T, s) {
			return State{}, errSolid
		}
	}
	if rhoLo > 0 {
		lo = max(lo, rhoLo)
	}
	if rhoHi > 0 {
		hi = min(hi, rhoHi)
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
	if k.hsTriple(h, s) {
		// On the triple line: PS at the triple-point pressure returns
		// its documented choice, flagged Indeterminate.
		st, err := PSWith(f, k.sol.tp.P, s, k.opt)
		if err == nil && math.Abs(st.H-h) <= qH.floor(f, nil, h) {
			return st, nil
		}
	}
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
		return State{}, k.fail(fluid.ErrOutOfRange, "no state with these h and s")
	}
	tolH := qH.tol(f, nil, h)
	for it := 0; it < 100; it++ {
		r := last.H - h
		if math.Abs(r) <= 10*tolH {
			st := last
			if k.sol.ok && st.N > 1 && k.onTripleP(st.P) {
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
			if try == 0 {
				// The isentrope may cross a band without a modelled
				// state (water above 208.566 MPa below 273.16 K, where
				// other ices exist): look beyond it before stepping back.
				d := ln - lp
				for j := 0; j < 8 && !moved; j++ {
					d *= 2
					lf := lp + d
					if !(lf > plo && lf < phi) {
						lf = plo + 0.999*(phi-plo)
						if d < 0 {
							lf = plo + 0.001*(phi-plo)
						}
					}
					if st, err := PSWith(f, math.Exp(lf), s, inner); err == nil {
						last, lp, moved = st, lf, true
					}
				}
				if moved {
					break
				}
			}
			// No state there: bound the bracket and step back.
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
