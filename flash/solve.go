package flash

import (
	"errors"
	"math"

	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/internal/elem"
)

// quantity names a state function that a flash takes as input.
type quantity int8

const (
	qT quantity = iota
	qP
	qRho
	qH
	qS
	qU
)

// of returns the quantity at pr.
func (q quantity) of(pr *fluid.Props) float64 {
	switch q {
	case qT:
		return pr.T
	case qP:
		return pr.P
	case qRho:
		return pr.Rho
	case qH:
		return pr.H
	case qS:
		return pr.S
	}
	return pr.U
}

// partials returns ∂q/∂T at constant ρ and ∂q/∂ρ at constant T, from
//
//	(∂h/∂T)_ρ = cv + (∂p/∂T)_ρ/ρ,  (∂h/∂ρ)_T = ((∂p/∂ρ)_T − T(∂p/∂T)_ρ/ρ)/ρ,
//	(∂s/∂T)_ρ = cv/T,             (∂s/∂ρ)_T = −(∂p/∂T)_ρ/ρ²,
//	(∂u/∂T)_ρ = cv,               (∂u/∂ρ)_T = (p − T(∂p/∂T)_ρ)/ρ².
//
// One reciprocal of ρ serves both partials (a division fewer on the
// Newton iterations' dependent path).
func (q quantity) partials(pr *fluid.Props) (dT, dRho float64) {
	ir := 1 / pr.Rho
	switch q {
	case qT:
		return 1, 0
	case qP:
		return pr.DpDT, pr.DpDrho
	case qRho:
		return 0, 1
	case qH:
		b := pr.DpDT * ir
		return pr.Cv + b, (pr.DpDrho - pr.T*b) * ir
	case qS:
		return pr.Cv / pr.T, -pr.DpDT * ir * ir
	}
	return pr.Cv, (pr.P - pr.T*pr.DpDT) * ir * ir
}

// tol returns the convergence tolerance of q at the target value v and
// the state pr: 1/100 of the backward-residual floors of DESIGN.md
// (|Δp| ≤ 1e-10·p + 1e-12·ρRT, |Δh|, |Δu| ≤ 1e-10·max(|h|, R·Tc),
// |Δs| ≤ 1e-10·max(|s|, R), |Δρ| ≤ 1e-10·ρ), except for the pressure of
// a dense liquid, which double precision resolves only to about
// 3e-13·ρRT: there half the floor.
func (q quantity) tol(f *fluid.Fluid, pr *fluid.Props, v float64) float64 {
	R := f.GasConstant()
	switch q {
	case qT, qRho:
		return 1e-12 * math.Abs(v)
	case qP:
		return 1e-12*math.Abs(v) + 5e-13*pr.Rho*R*pr.T
	case qH, qU:
		Tc, _ := f.Reducing()
		return 1e-12 * max(math.Abs(v), R*Tc)
	}
	return 1e-12 * max(math.Abs(v), R)
}

// floor returns the backward-residual floor of DESIGN.md for q.
func (q quantity) floor(f *fluid.Fluid, pr *fluid.Props, v float64) float64 {
	if q == qP {
		return 1e-10*math.Abs(v) + 1e-12*pr.Rho*f.GasConstant()*pr.T
	}
	return 100 * q.tol(f, pr, v)
}

// linearFinishStep is the largest relative Newton step that linearFinish
// takes without evaluating the equation again: the terms of second
// order it leaves out are below 1e-22 of the state, and the properties
// it keeps (cp, cv, w, κT, β, μJT and the derivatives of p) change by
// about 1e-11 of themselves, far below their accuracy.
const linearFinishStep = 1e-11

// linearFinish takes the last Newton step (dT, dρ) from pr by the
// state's own derivatives, where the step is within linearFinishStep of
// T and ρ and pr is not near the critical point (cp < 50 cv, where the
// kept properties vary slowly): T, ρ, p, u, h, s, g, f and Z move to
// first order,
//
//	dp = (∂p/∂T)_ρ dT + (∂p/∂ρ)_T dρ,  du = cv dT + (p − T(∂p/∂T)_ρ)/ρ² dρ,
//	ds = cv/T dT − (∂p/∂T)_ρ/ρ² dρ,    dh = du + dp/ρ − p dρ/ρ²,
//	dg = dp/ρ − s dT,                   df = p dρ/ρ² − s dT,
//
// and the rest stay. The state then answers the iteration's targets to
// rounding and differs from the equation at its (T, ρ) by the second-
// order terms left out — less than the rounding of an evaluation — which
// spares the evaluation a converging Newton's method would take only to
// confirm a step of 1e-13 (a liquid's pressure needs it: its stiffness
// turns the last ulps of ρ into the floor of p). It reports whether it
// took the step.
// lim is f's Limits.
func linearFinish(f *fluid.Fluid, lim *fluid.Limits, pr *fluid.Props, dT, dRho float64) bool {
	T, rho := pr.T, pr.Rho
	if !(math.Abs(dT) <= linearFinishStep*T && math.Abs(dRho) <= linearFinishStep*rho) || !(pr.Cp < 50*pr.Cv) {
		return false
	}
	if T+dT < lim.TFloor || T+dT > lim.TCeil || rho+dRho > lim.RhoCeil {
		return false
	}
	dp := pr.DpDT*dT + pr.DpDrho*dRho
	du := pr.Cv*dT + (pr.P-T*pr.DpDT)/(rho*rho)*dRho
	ds := pr.Cv/T*dT - pr.DpDT/(rho*rho)*dRho
	dh := du + dp/rho - pr.P/(rho*rho)*dRho
	pr.G += dp/rho - pr.S*dT
	pr.F += pr.P/(rho*rho)*dRho - pr.S*dT
	pr.T, pr.Rho, pr.P = T+dT, rho+dRho, pr.P+dp
	pr.U, pr.H, pr.S = pr.U+du, pr.H+dh, pr.S+ds
	pr.Z = pr.P / (pr.Rho * f.GasConstant() * pr.T)
	return true
}

// props evaluates f at (T, ρ) for an iteration; ok is false where there
// is no usable state (outside the accepted T and ρ, or mechanically
// unstable). A pressure above the accepted ceiling is usable on the way
// (Props returns its values with the error); results are checked by
// finish.
func props(f *fluid.Fluid, T, rho float64) (pr fluid.Props, ok bool) {
	ok = propsInto(f, &pr, T, rho)
	return pr, ok
}

// propsInto is props writing into pr, in place.
func propsInto(f *fluid.Fluid, pr *fluid.Props, T, rho float64) bool {
	err := f.PropsInto(pr, T, rho)
	if err != nil && !(errors.Is(err, fluid.ErrOutOfRange) && pr.P > f.Limits().PCeil) {
		return false
	}
	return finiteProps(pr)
}

func finiteProps(pr *fluid.Props) bool {
	return isFinite(pr.P) && isFinite(pr.H) && isFinite(pr.S) && isFinite(pr.U) && pr.DpDrho > 0
}

func isFinite(x float64) bool { return x-x == 0 }

// expm1 returns e^x − 1 for the steps of the iterations: by its Taylor
// series to x³ where |x| < 1e-5 (a relative error below 1e-20), else as
// e^x − 1 with the table-driven exponential (an absolute error of about
// 1e-16: a relative error of the step below 1e-11, which only the steps
// far from convergence take).
func expm1(x float64) float64 {
	if math.Abs(x) < 1e-5 {
		return x * (1 + x*(0.5+x/6))
	}
	return elem.Exp(x) - 1
}

// lnRatio returns ln(a/b) for positive a and b, ib = 1/b: by the series
// of ln(1 + x), x = (a − b)/b, to x⁴ where |x| < 1e-4 (a relative error
// below 1e-16: a residual of an iteration near its end, without a
// logarithm or a division), else by the table-driven logarithm.
func lnRatio(a, b, ib float64) float64 {
	x := (a - b) * ib
	if math.Abs(x) < 1e-4 {
		return x * (1 - x*(0.5-x*(1.0/3-0.25*x)))
	}
	return elem.Log(a * ib)
}

// watch tracks the scaled residual of an iteration (1 = converged); see
// check.
type watch struct {
	best float64
	n    int
}

// check reports whether to stop: converged (res ≤ 1) or stalled at the
// rounding floor (three iterations without halving the best residual,
// with the last relative step, step, below 1e-9).
func (w *watch) check(res, step float64) (stop bool) {
	if res <= 1 {
		return true
	}
	if res < 0.5*w.best {
		w.best, w.n = res, 0
		return false
	}
	if step > 1e-9 {
		w.n = 0
		return false
	}
	w.n++
	return w.n >= 3
}

// branch is where a newton2 iteration may go: T in [tlo, thi] and, below
// Tc, the side sd of the critical density.
type branch struct {
	c        fluid.Point
	sd       side
	tlo, thi float64
	// logStep: Newton's method in (ln T, ln ρ) on ln p (a = p), nearly
	// linear for gases (p = ρRTZ), from starts far off.
	logStep bool
	// lnRhoStep: Newton's method in (T, ln ρ) on ln p (a = p), for a
	// vapour from a near start (a warm start): ln p is nearly linear in
	// ln ρ and h in T there, and the last step comes out about five
	// times shorter than in (T, ρ) or in (ln T, ln ρ) (measured on the
	// warm-start grids of the benchmarks), which often spares the
	// evaluation that would only confirm it (see linearFinish).
	lnRhoStep bool
}

func (b *branch) keep(pr *fluid.Props) bool {
	if pr.T < b.tlo || pr.T > b.thi {
		return false
	}
	if b.sd == anySide || pr.T >= b.c.T {
		return true
	}
	return (pr.Rho > b.c.Rho) == (b.sd == liquidSide)
}

// newton2 solves a(T, ρ) = va, b(T, ρ) = vb by Newton's method in (T, ρ)
// with the analytic Jacobian, from (T, ρ), with steps limited to a
// quarter of T and half of ρ and halved back toward the last good point
// where they leave the accepted region, meet an unstable state or leave
// the branch br, and stopped where they keep pressing beyond the
// accepted temperatures (a start outside them, or above the accepted
// density, is moved to their limit). It returns the state and whether
// it converged (to 1/100 of the floors, or to the floors where rounding
// stalls the iteration).
//
// start, if not nil, is a valid state near (T, ρ) to fall back toward if
// (T, ρ) itself is not usable.
func newton2(f *fluid.Fluid, a quantity, va float64, b quantity, vb float64, T, rho float64,
	br branch, start *fluid.Props) (fluid.Props, bool) {
	lim := f.Limits()
	T, rho = min(max(T, lim.TFloor), lim.TCeil), min(rho, lim.RhoCeil)
	// The iterate and the last good one, swapped rather than copied.
	var buf [2]fluid.Props
	pr, prev := &buf[0], &buf[1]
	havePrev := false
	if start != nil {
		*prev, havePrev = *start, true
	}
	w := watch{best: math.Inf(1)}
	iva := 0.0 // 1/va, for lnRhoStep
	if br.lnRhoStep {
		iva = 1 / va
	}
	backs, pinned := 0, 0
	lastStep, prevDT, prevRb := math.Inf(1), 0.0, math.Inf(1)
	for it := 0; it < 60; it++ {
		ok := propsInto(f, pr, T, rho)
		if !ok || !br.keep(pr) {
			if !havePrev || backs > 40 {
				return *pr, false
			}
			backs++
			T, rho = 0.5*(T+prev.T), 0.5*(rho+prev.Rho)
			continue
		}
		ra, rb := a.of(pr)-va, b.of(pr)-vb
		ta, tb := a.tol(f, pr, va), b.tol(f, pr, vb)
		res := max(math.Abs(ra)/ta, math.Abs(rb)/tb)
		if w.check(res, lastStep) {
			return *pr, math.Abs(ra) <= a.floor(f, pr, va) && math.Abs(rb) <= b.floor(f, pr, vb)
		}
		a1, a2 := a.partials(pr)
		b1, b2 := b.partials(pr)
		onLnP := a == qP && pr.P > 0 && va > 0
		logged := br.logStep && onLnP
		lnRho := !logged && br.lnRhoStep && onLnP
		switch {
		case logged:
			// In ln T and ln ρ, on ln p: the linear step below then
			// gives d ln T and d ln ρ, turned back into dT and dρ.
			ra = elem.Log(pr.P / va)
			a1, a2 = a1*T/pr.P, a2*rho/pr.P
			b1, b2 = b1*T, b2*rho
		case lnRho:
			// In T and ln ρ, on ln p (its row multiplied by p, which
			// leaves the step as it is and spares the divisions).
			ra = pr.P * lnRatio(pr.P, va, iva)
			a2 *= rho
			b2 *= rho
		}
		det := a1*b2 - a2*b1
		dT := (-ra*b2 + rb*a2) / det
		dRho := (-rb*a1 + ra*b1) / det
		if !isFinite(dT) || !isFinite(dRho) {
			return *pr, false
		}
		switch {
		case logged:
			dT = T * expm1(max(min(dT, math.Ln2), -math.Ln2))
			dRho = rho * expm1(max(min(dRho, 2*math.Ln2), -2*math.Ln2))
		case lnRho:
			if d := dRho; math.Abs(d) < 1e-3 {
				// (e^d − 1 to d⁴: a relative error below 1e-14 of
				// a step that is not the last, 1e-20 of one that is.)
				dRho = rho * d * (1 + d*(0.5+d*(1.0/6+d/24)))
			} else {
				dRho = rho * expm1(max(min(d, 2*math.Ln2), -2*math.Ln2))
			}
		}
		if res <= 1e4 && linearFinish(f, &lim, pr, dT, dRho) {
			return *pr, true
		}
		s := 1.0
		if !logged {
			// (Bounded in the logarithms above where logged.)
			if math.Abs(dT) > 0.25*T {
				s = 0.25 * T / math.Abs(dT)
			}
			if dRho < -0.5*rho {
				s = min(s, 0.5*rho/-dRho)
			} else if dRho > rho {
				s = min(s, rho/dRho)
			}
		}
		// Held at an end of the accepted temperatures and sent beyond it
		// three times in a row by more than 1e-6·T or by a step that
		// does not shrink (a solution at the end itself draws the steps
		// to nothing, quadratically): the solution lies outside them.
		// Meanwhile a pressure (a = p) is solved for at that end, by
		// Newton's method in ρ alone, so that the state returned shows
		// where the isobar meets it.
		press := math.Abs(dT) > 1e-6*T || math.Abs(dT) >= 0.5*math.Abs(prevDT)
		prevDT = dT
		if T == lim.TCeil && dT > 0 && press || T == lim.TFloor && dT < 0 && press {
			// (While the residual in b falls by 30 % a step the
			// iteration still converges: toward a solution at the end
			// itself. Beyond the end it settles where p is solved.)
			if math.Abs(rb) >= 0.7*prevRb {
				pinned++
			}
			if pinned >= 3 {
				return *pr, false
			}
			if a == qP {
				dT, s = 0, 1
				dRho = max(min(-(pr.P-va)/pr.DpDrho, 0.5*rho), -0.5*rho)
			}
		} else {
			pinned = 0
		}
		pr, prev = prev, pr
		havePrev, prevRb = true, math.Abs(rb)
		lastStep = s * max(math.Abs(dT)/T, math.Abs(dRho)/rho)
		T = min(max(T+s*dT, lim.TFloor), lim.TCeil)
		rho = min(rho+s*dRho, lim.RhoCeil)
	}
	return *prev, false
}

// newton1 solves q(T, ρ) = v in one unknown, T (varyT) or ρ, kept in the
// bracket [lo, hi] in which q is monotone, by Newton's method (in ln ρ for
// ρ, where gases make q nearly linear) with bisection where a step leaves
// the bracket.
func newton1(f *fluid.Fluid, q quantity, v, T, rho float64, varyT bool, lo, hi float64) (fluid.Props, bool) {
	// The iteration variable: T, or ln ρ.
	x, fwd := T, func(x float64) float64 { return x }
	if !varyT {
		lo, hi = math.Log(lo), math.Log(hi)
		x, fwd = math.Log(rho), math.Exp
	}
	if !(x >= lo && x <= hi) {
		x = 0.5 * (lo + hi)
	}
	lo0, hi0 := lo, hi
	w := watch{best: math.Inf(1)}
	var pr fluid.Props
	sign := 0.0 // the sign of dq/dx, learnt from the first good point
	good, haveGood := 0.0, false
	lastStep := math.Inf(1)
	for it := 0; it < 200; it++ {
		if varyT {
			T = x
		} else {
			rho = fwd(x)
		}
		var ok bool
		pr, ok = props(f, T, rho)
		if !ok {
			// No usable state here: bound the bracket on this side of
			// the last good point and step back halfway toward it.
			switch {
			case !haveGood && x-lo < hi-x:
				lo = x
			case !haveGood:
				hi = x
			case x > good:
				hi = x
			default:
				lo = x
			}
			if haveGood {
				x = 0.5 * (x + good)
			} else {
				x = 0.5 * (lo + hi)
			}
			if hi-lo <= 1e-15*math.Abs(hi) {
				return pr, false
			}
			continue
		}
		good, haveGood = x, true
		r := q.of(&pr) - v
		res := math.Abs(r) / q.tol(f, &pr, v)
		if w.check(res, lastStep) {
			return pr, math.Abs(r) <= q.floor(f, &pr, v)
		}
		dT, dRho := q.partials(&pr)
		d := dT
		if !varyT {
			d = dRho * rho
		}
		if sign == 0 && d != 0 {
			sign = math.Copysign(1, d)
		}
		if r*sign > 0 {
			hi = x
		} else {
			lo = x
		}
		xn := x - r/d
		switch {
		case !isFinite(xn):
			xn = 0.5 * (lo + hi)
		case xn <= lo && x != lo0 && lo == lo0:
			xn = lo0 // the root may lie at the end of the bracket
		case xn >= hi && x != hi0 && hi == hi0:
			xn = hi0
		case !(xn > lo && xn < hi):
			xn = 0.5 * (lo + hi)
		}
		lastStep = math.Abs(xn-x) / max(math.Abs(x), 1)
		x = xn
		if hi-lo <= 1e-15*math.Abs(hi) {
			return pr, math.Abs(r) <= q.floor(f, &pr, v)
		}
	}
	return pr, false
}

// isobar solves X(T, p) = x for T in [lo, hi] at fixed p on root, with
// the density from fluid.PropsTP at each T, by the Illinois variant of
// regula falsi: slower than newton2 but bracketed, for where it fails.
// below and above report x outside [X(lo), X(hi)] (X rises with T).
func isobar(f *fluid.Fluid, p float64, X quantity, x, lo, hi float64, root fluid.Root) (pr fluid.Props, ok, below, above bool) {
	rhoGuess := 0.0
	eval := func(T float64) (fluid.Props, bool) {
		pr, err := f.PropsTP(T, p, root, rhoGuess)
		if err != nil && !errors.Is(err, fluid.ErrUnstable) || !isFinite(pr.H) || pr.Rho == 0 {
			return pr, false
		}
		rhoGuess = pr.Rho
		return pr, true
	}
	pa, oka := eval(lo)
	pb, okb := eval(hi)
	if !oka || !okb {
		return pr, false, false, false
	}
	fa, fb := X.of(&pa)-x, X.of(&pb)-x
	if fa > 0 {
		return pa, false, true, false
	}
	if fb < 0 {
		return pb, false, false, true
	}
	var last fluid.Props
	good := true
	g := func(T float64) float64 {
		var ok bool
		last, ok = eval(T)
		if !ok {
			good = false
			return 0
		}
		return X.of(&last) - x
	}
	T := illinois(g, lo, hi, fa, fb, 1e-14*hi)
	if !good {
		return last, false, false, false
	}
	pr, okc := eval(T)
	if !okc {
		return pr, false, false, false
	}
	// Next to the critical point X(T) is so steep (cp grows without
	// bound) that the bracket's tolerance in T leaves X beyond its floor:
	// a few Newton steps with (∂X/∂T)_p, kept in the bracket.
	for i := 0; i < 4 && math.Abs(X.of(&pr)-x) > X.tol(f, &pr, x); i++ {
		d := dXdT(X, &pr)
		Tn := pr.T - (X.of(&pr)-x)/d
		if !(d > 0) || !(Tn >= lo && Tn <= hi) || Tn == pr.T {
			break
		}
		pn, okn := eval(Tn)
		if !okn || math.Abs(X.of(&pn)-x) >= math.Abs(X.of(&pr)-x) {
			break
		}
		pr = pn
	}
	return pr, math.Abs(X.of(&pr)-x) <= X.floor(f, &pr, x), false, false
}

// solve1 is newton1 with a fallback for where q is not monotone in the
// bracket (liquid water below its density maximum, where s rises with ρ
// along an isotherm and p falls with T along an isochore): a scan of the
// bracket (in ln ρ for ρ) for the first sign change from lo, refined by
// regula falsi. It returns the solution nearest lo.
func solve1(f *fluid.Fluid, q quantity, v, T, rho float64, varyT bool, lo, hi float64) (fluid.Props, bool) {
	if pr, ok := newton1(f, q, v, T, rho, varyT, lo, hi); ok {
		return pr, true
	}
	at := func(x float64) (fluid.Props, bool) {
		if varyT {
			return props(f, x, rho)
		}
		return props(f, T, math.Exp(x))
	}
	a, b := lo, hi
	if !varyT {
		a, b = math.Log(lo), math.Log(hi)
	}
	const n = 64
	var pr fluid.Props
	prevX, prevR, havePrev := 0.0, 0.0, false
	for i := 0; i <= n; i++ {
		x := a + (b-a)*float64(i)/n
		if i == 0 {
			x = a + (b-a)*1e-9
		}
		p, ok := at(x)
		if !ok {
			havePrev = false
			continue
		}
		r := q.of(&p) - v
		if havePrev && r*prevR <= 0 {
			good := true
			g := func(x float64) float64 {
				var ok bool
				pr, ok = at(x)
				if !ok {
					good = false
					return 0
				}
				return q.of(&pr) - v
			}
			xr := illinois(g, prevX, x, prevR, r, 1e-15*max(math.Abs(x), 1))
			pr, ok = at(xr)
			if good && ok && math.Abs(q.of(&pr)-v) <= q.floor(f, &pr, v) {
				return pr, true
			}
		}
		prevX, prevR, havePrev = x, r, true
	}
	return pr, false
}
