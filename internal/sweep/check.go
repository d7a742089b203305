package main

import (
	"errors"
	"fmt"
	"math"
	"strconv"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// flashFn is the signature every ...With flash shares.
type flashFn func(f *fluid.Fluid, a, b float64, opt flash.Options) (flash.State, error)

// inverse is a flash run from the values of a state.
type inverse struct {
	name string
	a, b quantity
	fn   flashFn
	// meta: the flash returns metastable states on request (flash doc).
	meta bool
	// qualityFixed: the inputs fix the quality of a mixture well (not
	// so HS, TS and PD: next to a saturated phase (h, s) fixes q only
	// in proportion to q, and s along an isotherm and p along an
	// isochore may not be monotone).
	qualityFixed bool
}

// quantity names a property of a state that a flash takes.
type quantity uint8

const (
	qP quantity = iota
	qT
	qRho
	qH
	qS
	qU
	qQ
	nQuantities
)

var quantityNames = [nQuantities]string{"p", "T", "rho", "h", "s", "u", "q"}

var inverses = []inverse{
	{"PT", qP, qT, flash.PTWith, true, true},
	{"PH", qP, qH, flash.PHWith, true, true},
	{"PS", qP, qS, flash.PSWith, true, true},
	{"DU", qRho, qU, flash.DUWith, true, true},
	{"HS", qH, qS, flash.HSWith, false, false},
	{"DT", qRho, qT, flash.DTWith, true, true},
	{"TS", qT, qS, flash.TSWith, false, false},
	{"PD", qP, qRho, flash.PDWith, false, false},
	{"TQ", qT, qQ, flash.TQWith, false, true},
	{"PQ", qP, qQ, flash.PQWith, false, true},
}

// forward maps a case kind onto its flash and input names.
var forward = [...]inverse{
	kPT: inverses[0], kDT: inverses[5], kTQ: inverses[8], kPQ: inverses[9],
	kPH: inverses[1], kDU: inverses[3],
}

func valueOf(st *flash.State, q quantity) float64 {
	switch q {
	case qP:
		return st.P
	case qT:
		return st.T
	case qRho:
		return st.Rho
	case qH:
		return st.H
	case qS:
		return st.S
	case qU:
		return st.U
	}
	return st.Quality
}

// bound returns the backward-residual bound of DESIGN.md for quantity q
// of state st against its input want: |Δp| ≤ 1e-10·p + 1e-12·ρRT (ρ the
// densest phase), |Δh|, |Δu| ≤ 1e-10·max(|h|, R·Tc), |Δs| ≤
// 1e-10·max(|s|, R), |Δρ| ≤ 1e-10·ρ; T and q are inputs that the flashes
// keep (package flash: "T and q exactly"), held to 1e-12.
func (s *setup) bound(st *flash.State, q quantity, want float64) float64 {
	switch q {
	case qP:
		rho := st.Rho
		for i := 0; i < st.N && i < len(st.Phases); i++ {
			rho = max(rho, st.Phases[i].Rho)
		}
		return 1e-10*want + 1e-12*rho*s.R*st.T
	case qT:
		return 1e-12 * want
	case qRho:
		return 1e-10 * want
	case qH, qU:
		return 1e-10 * max(math.Abs(want), s.R*s.crit.T)
	case qS:
		return 1e-10 * max(math.Abs(want), s.R)
	}
	return 1e-12
}

// call runs one flash with a panic guard.
func call(fn flashFn, f *fluid.Fluid, a, b float64, opt flash.Options) (st flash.State, err error, panicked any) {
	defer func() {
		if r := recover(); r != nil {
			panicked = r
		}
	}()
	st, err = fn(f, a, b, opt)
	return st, err, nil
}

// goFloat formats x as a Go float literal that reads back to the same
// bits.
func goFloat(x float64) string {
	switch {
	case math.IsNaN(x):
		return "math.NaN()"
	case math.IsInf(x, 1):
		return "math.Inf(1)"
	case math.IsInf(x, -1):
		return "math.Inf(-1)"
	}
	s := strconv.FormatFloat(x, 'g', -1, 64)
	for _, c := range s {
		if c == '.' || c == 'e' || c == 'n' || c == 'I' {
			return s
		}
	}
	return s + ".0"
}

// repro is a Go call that reproduces a flash.
func repro(name string, a, b float64, opt flash.Options) string {
	o := ""
	if opt.Phase != flash.Unknown || opt.AllowMetastable {
		o = fmt.Sprintf(", flash.Options{Phase: flash.%v, AllowMetastable: %v}", opt.Phase, opt.AllowMetastable)
	} else {
		o = ", flash.Options{}"
	}
	return fmt.Sprintf("flash.%sWith(f, %s, %s%s)", name, goFloat(a), goFloat(b), o)
}

// brief describes a state in one line.
func brief(st *flash.State) string {
	return fmt.Sprintf("%v T=%.17g p=%.17g rho=%.17g h=%.17g s=%.17g q=%.17g solid=%.17g flags=%v",
		st.Phase, st.T, st.P, st.Rho, st.H, st.S, st.Quality, st.Solid, st.Flags)
}

// errorFault returns what is wrong with an error of operation op (""
// when nothing is): it must be a *fluid.Error naming op, wrapping a
// sentinel, with an ASCII message.
func errorFault(err error, op string) string {
	var fe *fluid.Error
	if !errors.As(err, &fe) {
		return fmt.Sprintf("not a *fluid.Error: %T", err)
	}
	if fe.Op != op {
		return "Op " + strconv.Quote(fe.Op) + ", want " + strconv.Quote(op)
	}
	known := false
	for _, s := range []error{fluid.ErrInvalidInput, fluid.ErrOutOfRange, fluid.ErrNoConvergence,
		fluid.ErrUnstable, fluid.ErrUndefined} {
		known = known || errors.Is(err, s)
	}
	if !known {
		return "wraps no sentinel"
	}
	msg := err.Error()
	for i := 0; i < len(msg); i++ {
		if msg[i] < 0x20 || msg[i] >= 0x7f {
			return "non-ASCII message"
		}
	}
	return ""
}

// invalid returns what is wrong with a returned state ("" when nothing
// is): every field finite but for the contract's infinities (Cp of
// mixtures and at the critical point, Cv at the critical point with
// nonanalytic terms and of triple states), phase fractions that add up,
// Quality and Solid that agree with them, and the structure of each phase.
func (s *setup) invalid(st *flash.State) string {
	fin := func(x float64) bool { return x-x == 0 }
	for _, v := range [...]float64{st.T, st.P, st.Rho, st.H, st.S, st.U, st.Quality, st.Solid} {
		if !fin(v) {
			return "a non-finite T, p, rho, h, s, u, quality or solid"
		}
	}
	if st.T <= 0 || st.P <= 0 || st.Rho <= 0 {
		return "T, p or rho not positive"
	}
	if st.N < 1 || st.N > 3 || st.Phase <= flash.Unknown || st.Phase > flash.Triple {
		return "N or Phase out of range"
	}
	mixture := st.Phase == flash.TwoPhase || st.Phase == flash.SolidVapor || st.Phase == flash.SolidLiquid || st.Phase == flash.Triple
	crit := st.Flags&fluid.AtCritical != 0
	switch {
	case math.IsNaN(st.Cp) || math.IsNaN(st.Cv) || math.IsNaN(st.W):
		return "NaN in cp, cv or w"
	case math.IsInf(st.Cp, -1) || math.IsInf(st.Cv, -1) || math.IsInf(st.W, 0):
		return "an infinity in cp, cv or w outside the contract"
	case math.IsInf(st.Cp, 1) && !mixture && !crit:
		return "cp = +Inf in a single-phase state away from the critical point"
	case math.IsInf(st.Cv, 1) && st.Phase != flash.Triple && !(crit && s.f.HasNonAnalytic()):
		return "cv = +Inf outside a triple or critical state"
	case mixture && !math.IsInf(st.Cp, 1) && !crit:
		return "a mixture with finite cp"
	case st.Cv <= 0 || st.W < 0:
		return "cv <= 0 or w < 0"
	}
	sum, xs, xv := 0.0, 0.0, 0.0
	for i := 0; i < st.N; i++ {
		ph := &st.Phases[i]
		if !fin(ph.Fraction) || !fin(ph.Rho) || !fin(ph.H) || !fin(ph.S) || !fin(ph.U) || ph.Rho <= 0 ||
			math.IsNaN(ph.Cp) || math.IsNaN(ph.Cv) || math.IsNaN(ph.W) || math.IsInf(ph.W, 0) {
			return fmt.Sprintf("phase %d not finite", i)
		}
		if (math.IsInf(ph.Cp, 0) || math.IsInf(ph.Cv, 0)) && !crit {
			return fmt.Sprintf("phase %d with infinite cp or cv away from the critical point", i)
		}
		sum += ph.Fraction
		switch ph.Phase {
		case flash.Solid:
			xs += ph.Fraction
		case flash.Vapor:
			xv += ph.Fraction
		}
	}
	if st.Phase == flash.Vapor {
		xv = 1
	}
	if math.Abs(sum-1) > 1e-12 || math.Abs(st.Solid-xs) > 1e-12 || math.Abs(st.Quality-xv) > 1e-12 {
		return "fractions, Quality or Solid do not add up"
	}
	if why := s.wholeOfPhases(st); why != "" {
		return why
	}
	ok := true
	p := &st.Phases
	switch st.Phase {
	case flash.Vapor:
		ok = st.N == 1
	case flash.Liquid, flash.Supercritical:
		ok = st.N == 1 && st.Quality == 0
	case flash.Solid:
		ok = st.N == 1 && st.Solid == 1 && st.W > 0
	case flash.TwoPhase:
		ok = st.N == 2 && (st.Quality > 0 && st.Quality < 1 || crit) && st.Solid == 0
	case flash.SolidVapor:
		ok = st.N == 2 && st.Quality > 0 && st.Quality < 1 && p[0].Phase == flash.Solid && p[1].Phase == flash.Vapor &&
			!math.IsInf(st.Cv, 0) && st.W > 0
	case flash.SolidLiquid:
		ok = st.N == 2 && st.Quality == 0 && st.Solid > 0 && st.Solid < 1 && p[0].Phase == flash.Solid &&
			p[1].Phase != flash.Vapor && !math.IsInf(st.Cv, 0) && st.W > 0
	case flash.Triple:
		ok = st.N == 3 && p[0].Phase == flash.Solid && p[1].Phase == flash.Liquid && p[2].Phase == flash.Vapor &&
			math.IsInf(st.Cv, 1) && st.W == 0 && st.Solid > 0 && st.Quality > 0 && st.Solid+st.Quality < 1
	}
	if !ok {
		return "the phases do not match Phase " + st.Phase.String()
	}
	return ""
}

// wholeOfPhases checks that the state's ρ, h, s and u are those of its
// phases (flash.State: 1/ρ = Σ xᵢ/ρᵢ, h = Σ xᵢhᵢ, ...) to 1e-9 of their
// scales: a state that echoes its inputs but whose phases are another
// state fails here, although it reproduces the inputs.
func (s *setup) wholeOfPhases(st *flash.State) string {
	var v, h, en, u float64
	for i := 0; i < st.N; i++ {
		ph := &st.Phases[i]
		v += ph.Fraction / ph.Rho
		h += ph.Fraction * ph.H
		en += ph.Fraction * ph.S
		u += ph.Fraction * ph.U
	}
	e := s.R * s.crit.T
	switch {
	case math.Abs(1/st.Rho-v) > 1e-9*v:
		return fmt.Sprintf("rho = %.17g is not that of its phases (%.17g)", st.Rho, 1/v)
	case math.Abs(st.H-h) > 1e-9*max(math.Abs(h), e):
		return fmt.Sprintf("h = %.17g is not that of its phases (%.17g)", st.H, h)
	case math.Abs(st.S-en) > 1e-9*max(math.Abs(en), s.R):
		return fmt.Sprintf("s = %.17g is not that of its phases (%.17g)", st.S, en)
	case math.Abs(st.U-u) > 1e-9*max(math.Abs(u), e):
		return fmt.Sprintf("u = %.17g is not that of its phases (%.17g)", st.U, u)
	}
	return ""
}

// nonUnique reports whether TS and PD may return another of several
// solutions for st (package flash: where s along an isotherm or p along an
// isochore is not monotone they return the solution of lowest pressure,
// PD the fluid where there is one): a liquid (or its saturated liquid)
// with (∂p/∂T)_ρ ≤ 0, below its density maximum; or, for a solid lighter
// than its liquid (ice), a state at or below the triple-point temperature
// that is not vapour.
func (s *setup) nonUnique(st *flash.State) bool {
	if s.hasSolid && s.three.Solid.Rho < s.three.Liquid.Rho && st.Phase != flash.Vapor && st.T <= s.tp.T*(1+1e-12) {
		return true
	}
	if st.Phase != flash.Liquid && st.Phase != flash.TwoPhase && st.Phase != flash.SolidLiquid {
		return false
	}
	i := 0
	if st.Phase == flash.SolidLiquid {
		i = 1
	}
	if pr, err := s.f.Props(st.T, st.Phases[i].Rho); err == nil && pr.DpDT <= 0 {
		return true
	}
	sat, err := s.f.SaturationAtT(st.T)
	return err == nil && sat.Liquid.DpDT <= 0
}
