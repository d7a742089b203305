package fluid

import (
	"math"

	"github.com/tripoint-thermo/tripoint/helmholtz"
	"github.com/tripoint-thermo/tripoint/internal/elem"
	"github.com/tripoint-thermo/tripoint/internal/evalcount"
)

// Root selects which density root of p(T, ρ) = p is wanted. The values are
// stable (the C ABI exposes them).
type Root int32

const (
	// RootStable is the stable fluid phase at (T, p). Below the critical
	// temperature it is the liquid above the equation's own vapour
	// pressure and the vapour below it (at exactly the vapour pressure,
	// the liquid).
	RootStable Root = 0
	// RootLiquid is the liquid-like root, the densest rising branch of
	// p(ρ), metastable below the vapour pressure down to the liquid
	// spinodal.
	RootLiquid Root = 1
	// RootVapor is the vapour-like root, the rising branch of p(ρ) from
	// ρ = 0, metastable above the vapour pressure up to the vapour
	// spinodal.
	RootVapor Root = 2
)

// String returns "stable", "liquid" or "vapor".
func (r Root) String() string {
	switch r {
	case RootStable:
		return "stable"
	case RootLiquid:
		return "liquid"
	case RootVapor:
		return "vapor"
	}
	return "Root(" + fmtG(float64(r)) + ")"
}

// aux pressure band: outside psat_aux·(1 ± auxBand) the stable phase is
// decided from the auxiliary vapour-pressure equation alone; inside it,
// from the equation's own saturation. TestAuxVaporPressureBand proves for
// every fluid that the auxiliary equation lies within 2/5 of this band
// (some published auxiliary equations are good to only 2 % near the
// triple point).
const auxBand = 0.05

// rhoStepTol is the relative Newton step in ρ below which a root is taken
// as converged: the residual of p is then at the level of its rounding.
const rhoStepTol = 1e-14

// spinodalTol is the relative difference from a spinodal pressure below
// which a target pressure is the spinodal's to rounding (the scatter of
// p = ρRT(1 + δαʳ_δ) next to a spinodal: a few 1e-15 in the log of the
// density solver near CO2's critical point).
const spinodalTol = 1e-14

// residual evaluates αʳ and its derivatives but the third δ-derivative,
// which only Derivs and the critical point of an equation need. Every
// solver of package fluid evaluates the equation through it, props or an
// isotherm, so that the test-only evaluation counter sees each call.
func (f *Fluid) residual(delta, tau float64) helmholtz.Derivs {
	evalcount.Add()
	return f.resid.EvalSecond(delta, tau)
}

// isotherm is αʳ of a fluid on one isotherm, for the solvers that
// evaluate it again and again at one temperature: p, (∂p/∂ρ)_T and the
// Gibbs energy at any density for a fraction of a full evaluation.
type isotherm struct {
	helmholtz.Isotherm
}

// set makes it f's isotherm at τ.
func (it *isotherm) set(f *Fluid, tau float64) { it.Set(f.resid, tau) }

// eval returns αʳ, ∂αʳ/∂δ and ∂²αʳ/∂δ² at δ, counted as an isotherm
// evaluation.
func (it *isotherm) eval(delta float64) helmholtz.DeltaDerivs {
	evalcount.AddIsotherm()
	return it.Isotherm.Eval(delta)
}

// Density returns the density in kg/m³ of f at temperature T in K and
// pressure p in Pa, on the requested root.
//
// It solves p(T, ρ) = p by Newton's method with the analytic (∂p/∂ρ)_T (in
// ln ρ on the vapour and supercritical branches, in ρ on the liquid one),
// started from the auxiliary saturated-liquid equation, the ideal gas or
// rhoGuess, and kept inside a bracket on the requested branch that shrinks
// by bisection whenever a Newton step leaves it, so that it always
// terminates. The root is converged when the Newton step is below 1e-14·ρ.
// Every evaluation is on the isotherm T (helmholtz.Isotherm: αʳ and its
// first two δ-derivatives, about 0.7 of a full evaluation of αʳ).
//
// For T ≥ Tc, p(ρ) rises monotonically and all three roots are the same.
// For T < Tc the liquid root is sought on ρ > ρc and the vapour root on
// ρ < ρc. RootStable takes the vapour below the equation's own vapour
// pressure and the liquid above it: away from it the auxiliary
// vapour-pressure equation decides, within 5 % of it the equation's own
// saturation (SaturationAtT), and below the triple-point temperature (no
// saturation is defined there) the root of lower Gibbs energy.
//
// Special cases are:
//
//	T or p NaN, ±Inf or ≤ 0, or root not a Root: ErrInvalidInput
//	T outside TFloor..TCeil or p > PCeil (see Limits): ErrOutOfRange
//	a liquid root that would be denser than RhoCeil: ErrOutOfRange
//	no root before the spinodal on the requested branch (a liquid below
//	  its spinodal pressure, a vapour above its): ErrUnstable
//
// Density allocates nothing unless it returns an error.
func (f *Fluid) Density(T, p float64, root Root) (float64, error) {
	rho, _, err := f.densityTP("fluid.Density", T, p, root, 0, false, nil)
	return rho, err
}

// PropsTP returns the properties of f at temperature T in K and pressure
// p in Pa on the requested root (see Density), starting Newton's method
// from rhoGuess in kg/m³ when it is positive (a warm start from a nearby
// state; 0 means none). A state on a root that is not the stable phase at
// (T, p) carries the Metastable flag; at exactly the vapour pressure (to
// rounding) RootStable takes the liquid and flags it Indeterminate. The
// properties come from one full evaluation at the density found, as
// Props(T, ρ) would give them. Special cases are those of Density and
// Props.
func (f *Fluid) PropsTP(T, p float64, root Root, rhoGuess float64) (Props, error) {
	return f.propsTP("fluid.PropsTP", T, p, root, rhoGuess, true)
}

// propsTP is PropsTP (wantMeta: flag a root that is not the stable
// phase Metastable) and PropsTPOnBranch, for the operation op.
func (f *Fluid) propsTP(op string, T, p float64, root Root, rhoGuess float64, wantMeta bool) (Props, error) {
	var fr fullRoot
	rho, fl, err := f.densityTP(op, T, p, root, rhoGuess, wantMeta, &fr)
	if err != nil {
		return Props{}, err
	}
	var pr Props
	if fr.ok {
		// The root's last Newton iteration, evaluated fully.
		pr = f.propsFromResidual(T, fr.rho, &fr.r)
	} else {
		pr = f.props(T, rho)
	}
	pr.Flags |= fl
	if c := f.limits.PCeil; pr.P > c && pr.P-p <= 1e-10*p+1e-12*pr.Rho*f.r*T {
		// p within the ceiling, reproduced at the root to rounding (the
		// backward-residual floor of DESIGN.md), which lands above it.
		chk := pr
		chk.P = c
		return pr, f.checkProps(op, &chk)
	}
	return pr, f.checkProps(op, &pr)
}

// PropsTPOnBranch is PropsTP on the liquid (root RootLiquid) or the
// vapour (RootVapor) root, for a caller that has placed (T, p) against
// the vapour pressure itself (package flash, by the cached saturation
// curve): it does not judge which phase is stable there, so that it
// solves no saturation and flags no state Metastable, and it costs the
// root's Newton iterations alone (the last a full evaluation, see
// PropsTP). With RootStable it is PropsTP. Special cases are those of
// Density and Props.
func (f *Fluid) PropsTPOnBranch(T, p float64, root Root, rhoGuess float64) (Props, error) {
	return f.propsTP("fluid.PropsTPOnBranch", T, p, root, rhoGuess, root == RootStable)
}

// fullRoot receives the full evaluation of a root that solveDelta was
// asked for: αʳ and all the derivatives Props needs at δ = rho/ρr, so
// that Props at the root, (T, rho), follows without another evaluation.
type fullRoot struct {
	rho float64 // the root, kg/m³
	r   helmholtz.Derivs
	ok  bool // set where the root was found and evaluated
}

// StableRoot returns the root of the stable fluid phase of f at
// temperature T in K and pressure p in Pa, as RootStable decides it:
// RootLiquid or RootVapor below Tc (at exactly the vapour pressure,
// RootLiquid with Indeterminate set in flags), RootStable at and above
// Tc, where the fluid has one phase. Away from the vapour pressure it
// costs no evaluation of the equation; within 5 % of it, one saturation
// (SaturationAtT); below the triple-point temperature, the two roots.
// It does not judge solid phases. Errors are those of Density.
func (f *Fluid) StableRoot(T, p float64) (root Root, flags Flags, err error) {
	const op = "fluid.StableRoot"
	if err := f.checkTP(op, T, p); err != nil {
		return 0, 0, err
	}
	if T >= f.crit.T {
		return RootStable, 0, nil
	}
	if b, ok := f.auxSide(T, p); ok {
		return rootOf(b), 0, nil
	}
	tau := f.tc / T
	pi := p / (f.rhoc * f.r * T)
	if T >= f.triple.T {
		if s, ok := f.satT(tau, false); ok {
			ps := s.pi()
			if onVapourCurve(pi, ps, tau) {
				return RootLiquid, Indeterminate, nil
			}
			if pi > ps {
				return RootLiquid, 0, nil
			}
			return RootVapor, 0, nil
		}
	}
	var it isotherm
	it.set(f, tau)
	d, r, st := f.solveDelta(&it, pi, branchVapor, 0, nil)
	if st != rootFound {
		return RootLiquid, 0, nil
	}
	return rootOf(f.stableBranch(&it, T, pi, branchVapor, d, &r)), 0, nil
}

// onVapourCurve reports whether the reduced pressure pi lies on the
// vapour-pressure curve at ps to rounding: within the precision to which
// the saturation fixes ps, satTolG(τ)·ps (equal Gibbs energies to
// satTolG in units of RT put p on the curve to that fraction, since
// d(g′ − g″) = (v′ − v″) dp and p v″ ≈ RT), so that a vapour pressure
// computed on one path (the cached curve, a warm start) is on the curve
// for every other.
func onVapourCurve(pi, ps, tau float64) bool {
	return math.Abs(pi-ps) <= satTolG(tau)*ps
}

func rootOf(b branch) Root {
	if b == branchLiquid {
		return RootLiquid
	}
	return RootVapor
}

// propsFromResidual builds Props at (T, ρ) from residual derivatives
// already evaluated there.
func (f *Fluid) propsFromResidual(T, rho float64, r *helmholtz.Derivs) Props {
	delta, tau := rho/f.rhoc, f.tc/T
	i := f.ideal.Eval(delta, tau)
	return f.fromDerivs(T, rho, delta, tau, &i, r)
}

// setPropsPairFromResidual sets p1 and p2, zero Props, to
// propsFromResidual at two densities and one temperature (the phases of a
// saturation), with the ideal-gas part's τ-dependence evaluated once.
func (f *Fluid) setPropsPairFromResidual(p1, p2 *Props, T, rho1, rho2 float64, r1, r2 *helmholtz.Derivs) {
	d1, d2, tau := rho1/f.rhoc, rho2/f.rhoc, f.tc/T
	i1, i2 := f.ideal.EvalPair(d1, d2, tau)
	f.setFromDerivs(p1, T, rho1, d1, tau, &i1, r1)
	f.setFromDerivs(p2, T, rho2, d2, tau, &i2, r2)
}

// checkTP validates (T, p) against f's accepted region.
func (f *Fluid) checkTP(op string, T, p float64) error {
	if !finite(T) || T <= 0 || !finite(p) || p <= 0 {
		return NewError(op, ErrInvalidInput, "T and p must be finite and positive",
			Input{"T", T, "K"}, Input{"p", p, "Pa"})
	}
	l := &f.limits
	if T < l.TFloor || T > l.TCeil {
		return NewError(op, ErrOutOfRange, rangeText("T", l.TFloor, l.TCeil, "K")+" for "+f.name,
			Input{"T", T, "K"}, Input{"p", p, "Pa"})
	}
	if p > l.PCeil {
		return NewError(op, ErrOutOfRange, "p must not exceed "+fmtG(l.PCeil)+" Pa for "+f.name,
			Input{"T", T, "K"}, Input{"p", p, "Pa"})
	}
	return nil
}

// densityTP solves for the density at (T, p) on root. It returns the
// density and flags: Indeterminate for RootStable at exactly the vapour
// pressure and, when wantMeta, Metastable for a root that is not the
// stable phase. Every evaluation is on the isotherm T, except that with
// fr not nil the root's last Newton iteration is a full evaluation,
// stored in fr (fr.ok false where the root came otherwise: below the
// triple point, where both roots are compared).
func (f *Fluid) densityTP(op string, T, p float64, root Root, guess float64, wantMeta bool, fr *fullRoot) (float64, Flags, error) {
	if err := f.checkTP(op, T, p); err != nil {
		return 0, 0, err
	}
	if root < RootStable || root > RootVapor {
		return 0, 0, NewError(op, ErrInvalidInput,
			"root must be RootStable (0), RootLiquid (1) or RootVapor (2)",
			Input{"T", T, "K"}, Input{"p", p, "Pa"}, Input{"root", float64(root), ""})
	}
	tau := f.tc / T
	pi := p / (f.rhoc * f.r * T)
	g := guess / f.rhoc
	if !finite(g) || g < 0 {
		g = 0
	}
	var it isotherm
	it.set(f, tau)
	if T >= f.crit.T {
		if g == 0 {
			if d := f.denseTable(); d != nil {
				g, _ = d.start(T, p)
			}
		}
		d, _, st := f.solveDelta(&it, pi, branchSingle, g, fr)
		return f.rootResult(op, T, p, d, st, branchSingle, 0)
	}
	switch root {
	case RootLiquid, RootVapor:
		b := branchLiquid
		if root == RootVapor {
			b = branchVapor
		}
		d, r, st := f.solveDelta(&it, pi, b, g, fr)
		var fl Flags
		if wantMeta && st == rootFound && f.stableBranch(&it, T, pi, b, d, &r) != b {
			fl = Metastable
		}
		return f.rootResult(op, T, p, d, st, b, fl)
	}
	// RootStable.
	if b, ok := f.auxSide(T, p); ok {
		d, _, st := f.solveDelta(&it, pi, b, g, fr)
		return f.rootResult(op, T, p, d, st, b, 0)
	}
	if T >= f.triple.T {
		if s, ok := f.satT(tau, false); ok {
			b := branchVapor
			ps := s.pi()
			if pi >= ps {
				b = branchLiquid
			}
			var fl Flags
			if onVapourCurve(pi, ps, tau) {
				// On the vapour-pressure curve to rounding: the inputs
				// do not fix the phase.
				fl = Indeterminate
			}
			d, _, st := f.solveDelta(&it, pi, b, g, fr)
			if st != rootFound && (fl != 0 || f.crit.T-T < critBand) {
				// Within a millikelvin of Tc the saturation pressure is
				// the near-critical model's (SaturationAtT), which may lie
				// a rounding beyond the spinodal of the branch it picks:
				// the other branch, as on the curve either phase is.
				o := branchLiquid
				if b == branchLiquid {
					o = branchVapor
				}
				if d2, _, st2 := f.solveDelta(&it, pi, o, 0, fr); st2 == rootFound {
					return f.rootResult(op, T, p, d2, st2, o, fl)
				}
			}
			return f.rootResult(op, T, p, d, st, b, fl)
		}
	}
	// Both roots, the lower Gibbs energy wins.
	dl, rl, stl := f.solveDelta(&it, pi, branchLiquid, 0, nil)
	dv, rv, stv := f.solveDelta(&it, pi, branchVapor, 0, nil)
	switch {
	case stl == rootFound && stv == rootFound:
		if gibbsReduced(dl, &rl) <= gibbsReduced(dv, &rv) {
			return f.rootResult(op, T, p, dl, stl, branchLiquid, 0)
		}
		return f.rootResult(op, T, p, dv, stv, branchVapor, 0)
	case stl == rootFound:
		return f.rootResult(op, T, p, dl, stl, branchLiquid, 0)
	case stv == rootFound:
		return f.rootResult(op, T, p, dv, stv, branchVapor, 0)
	}
	return f.rootResult(op, T, p, dl, stl, branchLiquid, 0)
}

// auxSide decides the stable branch at (T, p), T < Tc, from the auxiliary
// vapour pressure when p lies outside its uncertainty band. ok is false
// when it cannot decide.
func (f *Fluid) auxSide(T, p float64) (branch, bool) {
	if f.aux.psat == nil || T < f.triple.T {
		return 0, false
	}
	ps := f.aux.psat(T)
	switch {
	case p > ps*(1+auxBand):
		return branchLiquid, true
	case p < ps*(1-auxBand):
		return branchVapor, true
	}
	return 0, false
}

// stableBranch returns the stable branch at (T, p) for T < Tc, given the
// root (d, r) already found on branch b of the isotherm it.
func (f *Fluid) stableBranch(it *isotherm, T, pi float64, b branch, d float64, r *helmholtz.DeltaDerivs) branch {
	if s, ok := f.auxSide(T, pi*f.rhoc*f.r*T); ok {
		return s
	}
	if T >= f.triple.T {
		if s, ok := f.satT(it.Tau(), false); ok {
			if pi >= s.pi() {
				return branchLiquid
			}
			return branchVapor
		}
	}
	other := branchLiquid
	if b == branchLiquid {
		other = branchVapor
	}
	d2, r2, st := f.solveDelta(it, pi, other, 0, nil)
	if st != rootFound {
		return b
	}
	g1, g2 := gibbsReduced(d, r), gibbsReduced(d2, &r2)
	if g2 < g1 || (g2 == g1 && other == branchLiquid) {
		return other
	}
	return b
}

// gibbsReduced returns g/(RT) less its τ-only ideal-gas part: ln δ + αʳ +
// δαʳ_δ. Differences of it between two densities at one temperature are
// differences of g/(RT).
func gibbsReduced(d float64, r *helmholtz.DeltaDerivs) float64 {
	return elem.Log(d) + r.A + d*r.D
}

// rootResult turns a solver status into the Density result.
func (f *Fluid) rootResult(op string, T, p, d float64, st rootStatus, b branch, fl Flags) (float64, Flags, error) {
	if st == rootFound {
		return d * f.rhoc, fl, nil
	}
	in := []Input{{"T", T, "K"}, {"p", p, "Pa"}}
	switch st {
	case rootAboveCeil:
		return 0, 0, &Error{Op: op, Inputs: in, Err: ErrOutOfRange,
			Range: "no liquid-like root: p exceeds the pressures of the liquid branch at this T up to the accepted " +
				fmtG(f.limits.RhoCeil) + " kg/m3 for " + f.name}
	case rootBeyondSpinodal:
		what := "no liquid-like root: p is below the liquid spinodal pressure at this T"
		if b == branchVapor {
			what = "no vapour-like root: p is above the vapour spinodal pressure at this T"
		}
		return 0, 0, &Error{Op: op, Inputs: in, Err: ErrUnstable, Range: what}
	}
	return 0, 0, &Error{Op: op, Inputs: in, Err: ErrNoConvergence,
		Range: "the density iteration did not converge"}
}

// branch of p(ρ) at fixed T on which a root is sought.
type branch int8

const (
	branchVapor  branch = iota // rising from ρ = 0 up to the vapour spinodal, ρ < ρc
	branchLiquid               // rising from the liquid spinodal on, ρ > ρc
	branchSingle               // T ≥ Tc: rising throughout
)

type rootStatus int8

const (
	rootFound rootStatus = iota
	rootBeyondSpinodal
	rootAboveCeil
	rootNoConvergence
)

// solveDelta finds the reduced density δ on branch b of the isotherm it
// where the reduced pressure δ(1 + δαʳ_δ) equals pi = p/(ρc R T). g > 0
// is a starting value. It returns δ with αʳ and its δ-derivatives there.
//
// The bracket (lo, hi) always holds the root if it exists: for the vapour
// branch, lo has p below the target on the rising branch and hi either p
// above it or (∂p/∂ρ)_T ≤ 0 (beyond the spinodal); for the liquid branch
// the mirror image. Newton steps that leave the bracket are replaced by
// bisection, so every iteration shrinks it or converges.
//
// With fr not nil the root is also evaluated fully (fullRoot). Once a
// Newton step shows the next iterate to be within rounding of the root
// (fullNext), the iterates from there on are evaluated fully, so that
// the root usually costs no evaluation beyond the iteration's; where the
// iteration converges on an isotherm evaluation, the root is evaluated
// fully afterwards. A full iterate is at δ = ρ/ρr with ρ = δ·ρr, exactly
// the δ at which Props(T, ρ) evaluates.
func (f *Fluid) solveDelta(it *isotherm, pi float64, b branch, g float64, fr *fullRoot) (float64, helmholtz.DeltaDerivs, rootStatus) {
	tau := it.Tau()
	lo, hi := 0.0, f.limits.RhoCeil/f.rhoc
	var x float64
	switch b {
	case branchVapor:
		hi = f.crit.Rho / f.rhoc
		x = pi // ideal gas
	case branchLiquid:
		lo = f.crit.Rho / f.rhoc
		switch {
		case g > 0:
		case f.aux.rhoLiq != nil:
			// Below its range the auxiliary equation's extrapolation
			// can leave the liquid branch: start from its end.
			x = f.aux.rhoLiq(max(f.tc/tau, f.limits.TMin)) / f.rhoc
		default:
			x = f.triple.RhoLiquid / f.rhoc
		}
	default:
		x = pi
	}
	if g > 0 {
		x = g
	}
	// Status of the bracket ends: whether a stable point with p above
	// (vapour, single: hi) or below (liquid: lo) the target was seen.
	hiAbove, loBelow := false, false
	// The stable point of least |p − target| seen: where the target lies
	// within rounding of a spinodal pressure, p(ρ) is flat there to
	// below rounding and no stable point need show the other sign.
	bestX, bestRes := 0.0, math.Inf(1)
	// A stable liquid point seen: far from the critical point and below
	// the triple point p(ρ) of some equations falls again at densities
	// above the liquid branch, so an unstable point denser than it lies
	// above the branch, not below.
	anchor := math.Inf(1)
	var r helmholtz.DeltaDerivs
	full, prevStep := false, math.Inf(1)
	for n := 0; n < 300; n++ {
		if !(x > lo && x < hi) {
			x = bracketMid(lo, hi, b)
		}
		// A full iterate is at δ = ρ/ρr, ρ = δ·ρr; where no such δ lies
		// inside the bracket (it is a few ulps wide), on the isotherm at
		// δ itself.
		isFull := false
		if full {
			if xr := x * f.rhoc / f.rhoc; xr > lo && xr < hi {
				fr.rho = x * f.rhoc
				x, isFull = xr, true
				fr.r = f.residual(x, tau)
				r = fr.r.Delta()
			}
		}
		if !isFull {
			r = it.eval(x)
		}
		P := x * (1 + x*r.D)
		dP := 1 + 2*x*r.D + x*x*r.DD
		res := P - pi
		stable := dP > 0
		if stable && math.Abs(res) < bestRes {
			bestX, bestRes = x, math.Abs(res)
		}
		switch b {
		case branchVapor:
			if !stable || res > 0 {
				hi, hiAbove = x, stable
			} else {
				lo = x
			}
		case branchLiquid:
			switch {
			case !stable && x > anchor:
				hi = x
			case !stable || res < 0:
				lo, loBelow = x, stable
			default:
				hi, hiAbove = x, true
			}
			if stable {
				anchor = min(anchor, x)
			}
		default:
			if res < 0 {
				lo = x
			} else {
				hi, hiAbove = x, true
			}
		}
		if stable {
			step := -res / dP
			if math.Abs(step) <= rhoStepTol*x {
				if math.Abs(res) > 1e-6*math.Abs(pi)+1e-10*x {
					// A root that double precision cannot resolve: far
					// below Tc the nonanalytic terms of IAPWS-95 make
					// p(ρ) rise by 1e25 Pa per kg/m³ next to ρc, where p
					// jumps by orders of magnitude between neighbouring
					// densities. Not a state of the fluid.
					if b == branchVapor {
						return x, r, rootBeyondSpinodal
					}
					return x, r, rootNoConvergence
				}
				if math.Abs(res) > 1e-13*x {
					// A dense liquid's p scatters by about 1e-13·ρRT
					// between neighbouring densities: the last step, or
					// the next density toward it, where that is closer.
					xn := x + step
					if xn == x {
						xn = math.Nextafter(x, x+math.Copysign(1, step))
					}
					if rn := it.eval(xn); math.Abs(xn*(1+xn*rn.D)-pi) < math.Abs(res) {
						x, r, isFull = xn, rn, false
					}
				}
				if fr != nil {
					if !isFull {
						fr.rho = x * f.rhoc
						fr.r = f.residual(fr.rho/f.rhoc, tau)
					}
					fr.ok = true
				}
				return x, r, rootFound
			}
			rel := math.Abs(step) / x
			full = full || fr != nil && fullNext(rel, prevStep)
			prevStep = rel
			xn := x + step
			switch {
			case rel <= 1e-4:
				// Close to the root the forms below differ from the
				// Newton step by a few times its square, relative: the
				// Newton step, without their logarithm and exponential.
			case b != branchLiquid && P > 0 && pi > 0:
				// Newton in ln ρ on ln p: nearly linear for gases.
				xn = x * elem.Exp(-elem.Log(P/pi)*P/(x*dP))
			case b == branchLiquid:
				// A Tait-form step, ρ = ρ₀(1 + K′Δp/K)^(1/K′) with the
				// bulk modulus K = ρ(∂p/∂ρ)_T here and K′ = dK/dp = 7,
				// typical of liquids (common practice, no source): the
				// Newton step where Δp is small, and the stiffening of a
				// compressed liquid where it is not.
				const kp = 7.0
				if base := 1 + kp*(pi-P)/(x*dP); base > 0.25 {
					xn = x * elem.Exp(elem.Log(base)/kp)
				}
			}
			x = xn
		} else {
			x = math.NaN() // bisect
		}
		if hi-lo <= 4e-16*hi {
			break
		}
	}
	switch {
	case b == branchVapor && !hiAbove, b == branchLiquid && hiAbove && !loBelow:
		if hi-lo <= 4e-16*hi && bestRes <= spinodalTol*math.Abs(pi) {
			// The target is the spinodal pressure to rounding: the
			// stable point closest to it.
			x, r = bestX, it.eval(bestX)
			if fr != nil {
				fr.rho = x * f.rhoc
				fr.r = f.residual(fr.rho/f.rhoc, tau)
				fr.ok = true
				r = fr.r.Delta()
			}
			return x, r, rootFound
		}
		return x, r, rootBeyondSpinodal
	case b != branchVapor && !hiAbove:
		return x, r, rootAboveCeil
	}
	if hi-lo <= 4e-16*hi {
		// The bracket closed on the root at rounding level: the end
		// whose p is closer (a dense liquid's scatters by 1e-13·ρRT).
		x, r = hi, it.eval(hi)
		if lo > 0 {
			rl := it.eval(lo)
			if math.Abs(lo*(1+lo*rl.D)-pi) < math.Abs(hi*(1+hi*r.D)-pi) && 1+2*lo*rl.D+lo*lo*rl.DD > 0 {
				x, r = lo, rl
			}
		}
		if fr != nil {
			fr.rho = x * f.rhoc
			fr.r = f.residual(fr.rho/f.rhoc, tau)
			fr.ok = true
			r = fr.r.Delta()
		}
		return x, r, rootFound
	}
	return x, r, rootNoConvergence
}

// fullNext reports whether a Newton iteration whose relative step is
// step, after one of prev, will converge at its next iterate: the step
// of a root solver converging quadratically is about K·step² with K the
// ratio step/prev² of its last two. Below 1e-7 the next step is at the
// rounding level (rhoStepTol) for the K of the equations here (0.1 to
// 2); up to 1e-6 where the measured K says so. Over 4000 states of the
// three fluids (40 temperatures from the triple point to 2 Tc or TCeil,
// 40 pressures from 1e-3 to 10 pc) it took PropsTP's isotherm
// evaluations from 3.7–4.1 to 2.8–3.1 per call; 16 roots (0.4 %) needed
// more than one full evaluation.
func fullNext(step, prev float64) bool {
	if step <= 1e-7 {
		return true
	}
	return step <= 1e-6 && max(step/(prev*prev), 0.1)*step*step <= rhoStepTol
}

// bracketMid returns a point inside (lo, hi), geometric where the bracket
// spans orders of magnitude of a gas density.
func bracketMid(lo, hi float64, b branch) float64 {
	if b != branchLiquid && lo > 0 && hi > 4*lo {
		return math.Sqrt(lo * hi)
	}
	if lo == 0 && b != branchLiquid {
		return hi / 8
	}
	return 0.5 * (lo + hi)
}
