package flash

import (
	"errors"
	"math"

	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/sublimation"
)

// HS by direct solves. A two-phase mixture at temperature T has
// h − T s = g(T), the Gibbs energy of its coexisting phases, whatever its
// fractions: so (h, s) lies on the straight tie line of slope T between
// the phases in the (s, h) plane. At the nodes of a coexistence curve
// (satnodes.go, region.go) the function
//
//	φ(T) = g(T) + T s − h
//
// is known without an evaluation; at fixed s it rises along each curve
// (the mixture of entropy s gains dh = v dp), so a sign change of φ
// between neighbouring nodes where s lies between the phases' entropies
// brackets the mixture's temperature. There the mixture is solved
// directly: liquid–vapour by Newton's method in (T, ln ρ′, ln ρ″) on
// equal pressure, equal Gibbs energy and φ = 0 (hsSat), solid–fluid in
// (T, ln ρ) on equal Gibbs energy and φ = 0 (hsCoexist). A single phase
// is solved by Newton's method on (h, s): the solid in (T, p) on its
// Gibbs function (no evaluation of the fluid equation), the fluid in
// (T, ln ρ) from the nearest of a set of anchor states (hsAnchors). Every
// result is checked against the curves before it is returned; where the
// direct solve cannot place or solve a state, HS falls back on the search
// along the isentrope (hsSearch).

// Outcomes of placing (h, s) against a family of tie lines.
const (
	tieNone  = iota // no tie line of the family passes near (h, s)
	tieRoot         // the tie lines at nodes j−1 and j bracket (h, s)
	tieBelow        // below the family's first tie line (for liquid–vapour: the triple line)
)

// tiePlace is the outcome of placing (h, s) against the tie lines of a
// two-phase family: the bracketing nodes j−1 and j, the temperature T at
// the root of φ by linear interpolation between them, and the fraction x
// of the second phase (vapour; for a solid–fluid curve the fluid) of the
// mixture with entropy s there, by interpolation too.
type tiePlace struct {
	kind   int8
	j      int
	t      float64 // position of the root between nodes j−1 and j, 0..1
	T, x   float64
	Ta, Tb float64 // the bracket of the root, if not the nodes' temperatures
	near   bool    // next to the liquid line, too near to tell by the nodes
}

// lerp returns a + t(b − a).
func lerp(a, b, t float64) float64 { return a + t*(b-a) }

// placeLV places (hd, sd), in the fluid's default reference state,
// against the liquid–vapour tie lines of the saturation nodes. φ rises
// with T where s′(T) ≤ sd (and a little beyond), so the root is searched
// among the nodes up to the first whose s′ exceeds sd.
func placeLV(n *satNodes, hd, sd float64) tiePlace {
	if sd < n.liq[0].S {
		return tiePlace{kind: tieNone}
	}
	phi := func(i int) float64 { return n.g[i] + n.T[i]*sd - hd }
	if p0 := phi(0); p0 > 0 {
		if sd > n.vap[0].S {
			// Right of the vapour at the triple point: no tie line.
			return tiePlace{kind: tieNone}
		}
		return tiePlace{kind: tieBelow}
	}
	// il: the last node with s′ ≤ sd.
	lo, hi := 0, n.last()
	if n.liq[hi].S <= sd {
		lo = hi
	}
	for hi-lo > 1 {
		m := (lo + hi) / 2
		if n.liq[m].S <= sd {
			lo = m
		} else {
			hi = m
		}
	}
	il := lo
	top := il
	switch {
	case il == n.last():
		if phi(il) < 0 {
			return tiePlace{kind: tieNone} // above the dome
		}
	case phi(il) < 0 && il+1 < n.placeTop:
		// Between node il and the saturated liquid of entropy sd (at
		// T_l, before node il+1) φ still rises; beyond T_l it need not,
		// so the liquid line decides: φ(T_l) = h′(T_l) − hd, with h′
		// from the cached curve (liquidAtS); within the bound of its
		// error (the error of T_l included) and the floor of h the
		// equation decides.
		Tl, hl, errH := n.liquidAtS(il, sd)
		phiL := hl - hd
		if phiL < -(errH + 1e-10*(math.Abs(hl)+n.liq[il].P/(n.liq[il].Rho*n.liq[il].Z))) {
			return tiePlace{kind: tieNone, j: il, T: Tl, x: -1} // above the liquid line
		}
		// Below it (or too near to tell): the mixture's T lies between
		// T[il] and T_l.
		t := 1.0
		if phiL > 0 {
			t = phi(il) / (phi(il) - phiL)
		}
		T := lerp(n.T[il], Tl, t)
		tt := (T - n.T[il]) / (n.T[il+1] - n.T[il])
		return tiePlace{kind: tieRoot, j: il + 1, t: tt, T: T, x: 0, Ta: n.T[il], Tb: Tl, near: phiL <= 0}
	case phi(il) < 0:
		top = il + 1 // next to the critical point: the mixture solve decides
		if phi(top) < 0 {
			return tiePlace{kind: tieNone}
		}
	}
	// The first node with φ ≥ 0 in (0, top]: φ rises on [0, il]. With
	// φ(0) = 0 exactly ((h, s) on the tie line of the first node, the
	// triple point's, and s at its liquid's) the interval is the first.
	a, b := 0, max(top, 1)
	for b-a > 1 {
		m := (a + b) / 2
		if phi(m) < 0 {
			a = m
		} else {
			b = m
		}
	}
	fa, fb := phi(a), phi(b)
	t := 0.0
	if fa != fb {
		t = fa / (fa - fb)
	}
	sl := lerp(n.liq[a].S, n.liq[b].S, t)
	sv := lerp(n.vap[a].S, n.vap[b].S, t)
	x := 0.5
	if sv > sl {
		x = (sd - sl) / (sv - sl)
	}
	return tiePlace{kind: tieRoot, j: b, t: t, T: lerp(n.T[a], n.T[b], t), x: x}
}

// placeCurve places (hd, sd) against the tie lines of a solid–fluid curve
// given by its nodes cs (ascending in pressure). At fixed sd, φ rises
// along the curve where the mixture of entropy sd exists, s_s ≤ sd ≤ s_f
// (the valid nodes), so a sign change of φ between valid nodes brackets
// the mixture. Where the valid nodes begin or end between two nodes, sd
// crosses the line of one phase there (the mixture's fraction reaches 0
// or 1), and beyond it φ need not rise: there the phase's line decides,
// φ = h_phase − hd where its entropy is sd, by linear interpolation; to
// within 1 % of the enthalpy step between the nodes (far more than the
// interpolation's error) the mixture solve decides.
func placeCurve(cs []sublimation.Coexistence, hd, sd float64) tiePlace {
	prev, prevValid := 0.0, false
	for i := range cs {
		c := &cs[i]
		phi := c.Fluid.G + c.T*sd - hd
		valid := c.Solid.S <= sd && sd <= c.Fluid.S
		if i == 0 {
			prev, prevValid = phi, valid
			continue
		}
		a := &cs[i-1]
		if i == len(cs)-1 && phi < 0 && phi > -1e-10*(math.Abs(hd)+math.Abs(c.Fluid.G)) {
			// On the last node's tie line, to the floor of h (the curve's
			// end is reproduced only to about 1e-11 K between solves).
			phi = 0
		}
		if valid != prevValid {
			// sd crosses the solid's line or the fluid's between a and c.
			sa, sb, ha, hb, x := a.Solid.S, c.Solid.S, a.Solid.H, c.Solid.H, 0.0
			if (a.Solid.S <= sd) == (c.Solid.S <= sd) {
				sa, sb, ha, hb, x = a.Fluid.S, c.Fluid.S, a.Fluid.H, c.Fluid.H, 1
			}
			tb := (sd - sa) / (sb - sa)
			phiB := lerp(ha, hb, tb) - hd
			margin := 0.01 * math.Abs(hb-ha)
			// Valid on the side of a (the mixture's φ rises from prev to
			// phiB) or on the side of c (from phiB to phi).
			lo, hi, t0, t1 := prev, phiB, 0.0, tb
			if valid {
				lo, hi, t0, t1 = phiB, phi, tb, 1
			}
			if lo < margin && hi > -margin {
				t := t0
				if lo < 0 && hi > 0 {
					t = t0 + (t1-t0)*lo/(lo-hi)
				} else if lo >= 0 {
					t = t0
				} else {
					t = t1
				}
				return tiePlace{kind: tieRoot, j: i, t: t, T: lerp(a.T, c.T, t), x: x,
					Ta: lerp(a.T, c.T, t0), Tb: lerp(a.T, c.T, t1)}
			}
		} else if prev < 0 && phi >= 0 && valid {
			t := prev / (prev - phi)
			ss := lerp(a.Solid.S, c.Solid.S, t)
			sf := lerp(a.Fluid.S, c.Fluid.S, t)
			return tiePlace{kind: tieRoot, j: i, t: t, T: lerp(a.T, c.T, t), x: (sd - ss) / (sf - ss)}
		}
		prev, prevValid = phi, valid
	}
	return tiePlace{kind: tieNone}
}

// hsDirect is HS by the direct solves above. done is false where it
// cannot place or solve the state (HS then searches along the
// isentrope); beyond reports a solid state found outside the models.
func (k *call) hsDirect(h, s float64) (st State, err error, done bool, beyond error) {
	f := k.f
	sn := satNodesFor(f)
	if sn == nil {
		return State{}, nil, false, nil
	}
	dh, ds := f.ReferenceOffsets()
	hd, sd := h-dh, s-ds
	c := f.Critical()

	// Liquid–vapour.
	side := anySide
	var anchor *fluid.Props
	var satAnchor fluid.Props
	lv := placeLV(sn, hd, sd)
	// A single fluid phase from a warm start where there is one, carried
	// to (h, s) by its own derivatives (predict2), before the placements
	// below solve any saturation: (h, s) fixes at most one stable single
	// phase (h rises with p at constant s), and hsFluidCheck checks it
	// against the other fluid phase and the solid. Next to the critical
	// point (from the node placeTop, about 0.995 Tc, to 1.001 Tc), where
	// the mixture and the single phase differ by rounding, the
	// placements decide first, as for a cold start, and the warm state
	// is checked after them.
	var warm fluid.Props
	haveWarm := false
	if g := k.opt.Guess; k.fluidGuess() && g.T > 0 && g.Rho > 0 {
		T0, rho0 := predict2(g, qH, h, qS, s)
		sdg := liquidSide
		if g.Rho < c.Rho {
			sdg = vaporSide
		}
		if g.T >= c.T || g.P >= c.P {
			sdg = anySide
		}
		// A start carried beyond the vapour pressure (a step into the
		// dome) goes to the placements at once.
		across := false
		if ps, errP, okp := sn.vapourPressure(T0); okp && sdg != anySide && T0 < c.T {
			p0 := predictP(g, T0, rho0)
			across = sdg == liquidSide && p0 < ps-errP || sdg == vaporSide && p0 > ps+errP
		}
		if !across {
			warm, haveWarm = hsNewton(f, h, s, T0, rho0, sdg, nil)
		}
		if haveWarm && (warm.T < sn.T[sn.placeTop] || warm.T > 1.001*c.T) {
			if st, err, done := k.hsFluidCheck(sn, &warm); done {
				return st, err, true, nil
			}
			haveWarm = false
		}
	}
	// Next to the critical point (the last node) the saturated entropies
	// are not linear between the nodes: there the mixture is solved
	// whatever the interpolated x says.
	if lv.near {
		// Too near the liquid line to tell by the nodes: the liquid
		// first, which is the state where it is stable (lvStable).
		if st, err, done := k.hsFluid(sn, h, s, hd, sd, &sn.liq[lv.j-1], nil, liquidSide); done {
			return st, err, true, nil
		}
	}
	if lv.kind == tieRoot && (lv.x > -0.05 && lv.x < 1.05 || lv.j == sn.last()) {
		sat, ok := k.hsSat(sn, h, s, &lv)
		switch {
		case ok:
			q := (s - sat.Liquid.S) / (sat.Vapor.S - sat.Liquid.S)
			if q >= 0 && q <= 1 {
				st, err := k.finishSat(&sat, q)
				return st, err, true, nil
			}
			// Beside the dome: the saturated phase on that side starts
			// the single-phase iteration.
			satAnchor, side = sat.Liquid, liquidSide
			if q > 1 {
				satAnchor, side = sat.Vapor, vaporSide
			}
			anchor = &satAnchor
		case lv.Tb > 0:
			// Next to the liquid line, no mixture found: the liquid
			// (lvStable checks it).
			anchor, side = &sn.liq[lv.j-1], liquidSide
		}
	} else if lv.kind == tieRoot {
		// Clearly beside the dome: the saturated phase on that side at
		// the nearer node starts the single-phase iteration.
		i := lv.j - 1
		if lv.t > 0.5 {
			i = lv.j
		}
		anchor, side = &sn.liq[i], liquidSide
		if lv.x > 1 {
			anchor, side = &sn.vap[i], vaporSide
		}
	} else if lv.x < 0 {
		// Above the liquid line: the liquid (or a dense fluid above Tc).
		side = liquidSide
	}

	// The solid (no evaluation of the fluid equation), then solid–vapour
	// and solid–liquid.
	if k.sol.ok {
		n := k.sol.n
		if sd <= n.solidSMax {
			st, err, ok, bey := k.hsSolid(h, s, hd, sd)
			if ok {
				return st, err, true, nil
			}
			beyond = bey
		}
		if lv.kind == tieBelow || lv.kind == tieNone {
			if tp := placeCurve(n.sub, hd, sd); tp.kind == tieRoot {
				if st, err, done := k.hsMixture(n.sub, true, h, s, &tp); done {
					return st, err, true, nil
				}
			}
		}
		if lv.kind != tieBelow && sd <= n.meltSMax && sd >= n.meltSMin {
			if tp := placeCurve(n.melt, hd, sd); tp.kind == tieRoot {
				if st, err, done := k.hsMixture(n.melt, false, h, s, &tp); done {
					return st, err, true, nil
				}
			}
		}
	}

	if haveWarm {
		if st, err, done := k.hsFluidCheck(sn, &warm); done {
			return st, err, true, beyond
		}
	}
	var second *fluid.Props
	if anchor == nil {
		pick := side
		if pick == anySide && sd < sn.liq[sn.last()].S {
			// Left of the critical point's entropy above the dome: a
			// liquid, or a dense fluid above Tc.
			pick = liquidSide
		}
		var near *fluid.Props
		if lv.kind == tieNone && lv.x < 0 {
			near = &sn.liq[lv.j] // the saturated liquid just below
		}
		anchor, second = sn.anchorFor(hd, sd, pick, c, near)
		if anchor == nil {
			return State{}, nil, false, beyond
		}
	}
	st, err, done = k.hsFluid(sn, h, s, hd, sd, anchor, second, side)
	if !done && err != nil && beyond == nil {
		beyond = err
	}
	return st, err, done, beyond
}

// hsFluid solves the single fluid phase with h and s from the anchor
// state (in the default reference state; hd and sd are the inputs there),
// or from second where its start is nearer (by its residuals), and checks
// it: against the solid by finish, against the other fluid phase below
// Tc by the saturation pressure at its T.
func (k *call) hsFluid(sn *satNodes, h, s, hd, sd float64, anchor, second *fluid.Props, sd2 side) (State, error, bool) {
	f := k.f
	lim := f.Limits()
	T0, rho0 := extrapolateHS(anchor, hd, sd, lim.TFloor, lim.TCeil)
	var first *fluid.Props
	var a, b fluid.Props
	if second != nil {
		// The start nearer in h and s; its evaluation is the first of
		// the iteration's.
		T1, rho1 := extrapolateHS(second, hd, sd, lim.TFloor, lim.TCeil)
		var oka, okb bool
		a, oka = props(f, T0, rho0)
		b, okb = props(f, T1, rho1)
		R := f.GasConstant()
		da := max(math.Abs(a.H-h)/(R*a.T), math.Abs(a.S-s)/R)
		db := max(math.Abs(b.H-h)/(R*b.T), math.Abs(b.S-s)/R)
		switch {
		case okb && (!oka || db < da):
			first = &b
		case oka:
			first = &a
		}
	}
	pr, ok := hsNewton(f, h, s, T0, rho0, sd2, first)
	if !ok {
		return State{}, nil, false
	}
	return k.hsFluidCheck(sn, &pr)
}

// hsFluidCheck checks and builds the single-phase fluid state pr of HS:
// done is false where it is not the stable state (or that is not known).
func (k *call) hsFluidCheck(sn *satNodes, pr *fluid.Props) (State, error, bool) {
	if stable, known := k.lvStable(sn, pr); !known || !stable {
		return State{}, nil, false
	}
	st, err := k.finish(pr)
	if err == errSolid {
		return State{}, nil, false
	}
	if errors.Is(err, fluid.ErrOutOfRange) {
		// Outside the models (water colder than the melting curve of a
		// high-pressure ice): (h, s) may have another state, in them,
		// which the search finds; the error stands if it does not.
		return State{}, err, false
	}
	if err != nil {
		return State{}, err, true
	}
	st, err = k.wanted(st, nil)
	return st, err, true
}

// lvStable reports whether the single-phase fluid state pr is stable
// against the other fluid phase: below Tc and above the triple-point
// temperature the liquid branch (ρ > ρc) must lie at or above the vapour
// pressure at its T, the vapour branch at or below it. The vapour
// pressure of the cached curve (satNodes.vapourPressure) decides where p
// differs from it by more than the bound of its error; closer, and next
// to the critical point, the saturation at T. known is false where that
// fails.
func (k *call) lvStable(sn *satNodes, pr *fluid.Props) (stable, known bool) {
	c := k.f.Critical()
	if pr.T >= c.T || pr.T < sn.T[0] {
		return true, true
	}
	liquid := pr.Rho > c.Rho
	if ps, errP, ok := sn.vapourPressure(pr.T); ok {
		switch {
		case pr.P > ps+errP:
			return liquid, true
		case pr.P < ps-errP:
			return !liquid, true
		}
	}
	i := sn.bracketT(pr.T)
	t := (pr.T - sn.T[i]) / (sn.T[i+1] - sn.T[i])
	sat, err := k.f.SaturationAtTFrom(pr.T, lerp(sn.liq[i].Rho, sn.liq[i+1].Rho, t), lerp(sn.vap[i].Rho, sn.vap[i+1].Rho, t))
	if err != nil {
		return false, false
	}
	tol := 1e-10*sat.P + 1e-12*pr.Rho*k.f.GasConstant()*pr.T
	if liquid {
		return pr.P >= sat.P-tol, true
	}
	return pr.P <= sat.P+tol, true
}

// extrapolateHS returns a start (T, ρ) for h and s (default reference)
// from the anchor state a by one linear step in (T, ln ρ), bounded, and
// shortened as a whole where it would leave the accepted temperatures
// tlo..thi (a start at the limit with the density of the longer step
// lies far from the state: R-134a at its ceiling of 455 K and 24 MPa).
func extrapolateHS(a *fluid.Props, hd, sd, tlo, thi float64) (T, rho float64) {
	dT, dy, ok := stepHS(a, hd-a.H, sd-a.S)
	if !ok {
		return a.T, a.Rho
	}
	dT = max(min(dT, 0.5*a.T), -0.3*a.T)
	dy = max(min(dy, 3), -3)
	if T := a.T + dT; (T > thi || T < tlo) && a.T >= tlo && a.T <= thi {
		sc := (thi - a.T) / dT
		if T < tlo {
			sc = (tlo - a.T) / dT
		}
		dT, dy = sc*dT, sc*dy
	}
	return a.T + dT, a.Rho * math.Exp(dy)
}

// stepHS solves the linearised (dh, ds) = J (dT, d ln ρ) at the state a:
//
//	(∂h/∂T)_ρ = cv + (∂p/∂T)_ρ/ρ,  (∂h/∂ln ρ)_T = (∂p/∂ρ)_T − T(∂p/∂T)_ρ/ρ,
//	(∂s/∂T)_ρ = cv/T,              (∂s/∂ln ρ)_T = −(∂p/∂T)_ρ/ρ.
func stepHS(a *fluid.Props, dh, ds float64) (dT, dy float64, ok bool) {
	return solve2(a.Cv+a.DpDT/a.Rho, a.DpDrho-a.T*a.DpDT/a.Rho, a.Cv/a.T, -a.DpDT/a.Rho, dh, ds)
}

// solve2 solves [[a11, a12], [a21, a22]] x = (b1, b2) by Cramer's rule;
// ok is false where the solution is not finite.
func solve2(a11, a12, a21, a22, b1, b2 float64) (x1, x2 float64, ok bool) {
	det := a11*a22 - a12*a21
	x1 = (b1*a22 - a12*b2) / det
	x2 = (a11*b2 - a21*b1) / det
	return x1, x2, isFinite(x1) && isFinite(x2)
}

// hsNewton solves h(T, ρ) = h, s(T, ρ) = s by Newton's method in
// (T, ln ρ) with the analytic Jacobian of stepHS, from (T, ρ), with steps
// limited to a quarter of T and a factor e in ρ, halved back toward the
// last usable state where they leave the accepted region, meet an
// unstable state or (below Tc) cross to the other side of ρc than the
// branch sd. It converges to 1/100 of the backward-residual floors, or
// to the floors where rounding stalls it. first, if not nil, is the
// state already evaluated at the start. A start outside the accepted
// temperatures or above the accepted density is moved to their limit; an
// iteration held at an end of the accepted temperatures and sent beyond
// it by more than 1e-6·T three times in a row stops (the solution lies
// beyond, as in newton2).
func hsNewton(f *fluid.Fluid, h, s, T, rho float64, sd side, first *fluid.Props) (fluid.Props, bool) {
	lim := f.Limits()
	br := onBranch(f, sd, lim.TFloor, lim.TCeil)
	tolH, tolS := qH.tol(f, nil, h), qS.tol(f, nil, s)
	// A start extrapolated beyond the accepted range (a state at the
	// temperature ceiling) starts at its edge, as the iterates do.
	T, rho = min(max(T, lim.TFloor), lim.TCeil), min(rho, lim.RhoCeil)
	var prev fluid.Props
	havePrev := false
	w := watch{best: math.Inf(1)}
	backs, pinned := 0, 0
	lastStep := math.Inf(1)
	for it := 0; it < 60; it++ {
		var pr fluid.Props
		var ok bool
		if it == 0 && first != nil {
			pr, ok, T, rho = *first, true, first.T, first.Rho
		} else {
			pr, ok = props(f, T, rho)
		}
		if !ok || !br.keep(&pr) {
			if !havePrev || backs > 30 {
				return pr, false
			}
			backs++
			T, rho = 0.5*(T+prev.T), math.Sqrt(rho*prev.Rho)
			continue
		}
		rh, rs := pr.H-h, pr.S-s
		if w.check(max(math.Abs(rh)/tolH, math.Abs(rs)/tolS), lastStep) {
			return pr, math.Abs(rh) <= 100*tolH && math.Abs(rs) <= 100*tolS
		}
		dT, dy, ok := stepHS(&pr, -rh, -rs)
		if !ok {
			return pr, false
		}
		sc := 1.0
		if a := math.Abs(dT); a > 0.25*T {
			sc = 0.25 * T / a
		}
		if a := math.Abs(dy); a > 1 {
			sc = min(sc, 1/a)
		}
		if T == lim.TCeil && dT > 1e-6*T || T == lim.TFloor && dT < -1e-6*T {
			if pinned++; pinned >= 3 {
				return pr, false
			}
		} else {
			pinned = 0
		}
		prev, havePrev = pr, true
		lastStep = sc * max(math.Abs(dT)/T, math.Abs(dy))
		T = min(max(T+sc*dT, lim.TFloor), lim.TCeil)
		rho = min(rho*math.Exp(sc*dy), lim.RhoCeil)
	}
	return prev, false
}

// hsSat solves the liquid–vapour mixture with h and s near the
// placement lv: Newton's method in (T, ln ρ′, ln ρ″) on
//
//	F1 = (p′ − p″)/(ρr R T),  F2 = (g′ − g″)/(RT),  F3 = (h − T s − g′)/(RT)
//
// (ρr the reducing density), started from the nodes; where it fails
// (near the critical point, where the Jacobian becomes singular) a
// bracketed iteration in T over saturation states (hsSatBracket). The
// result need not have s between the saturated entropies: then the
// state is single-phase beside the dome.
func (k *call) hsSat(n *satNodes, h, s float64, lv *tiePlace) (fluid.Saturation, bool) {
	f := k.f
	a, b := lv.j-1, lv.j
	if b < n.last() && !lv.near {
		T := lv.T
		rl := lerp(n.liq[a].Rho, n.liq[b].Rho, lv.t)
		rv := math.Exp(lerp(math.Log(n.vap[a].Rho), math.Log(n.vap[b].Rho), lv.t))
		if gT, grl, grv, ok := k.guessSat(); ok && gT > n.T[a] && gT < n.T[b] {
			T, rl, rv = gT, grl, grv // a warm start in the same interval
		}
		if sat, ok := hsSatNewton(f, h, s, T, rl, rv, n.T[a], n.T[b]); ok {
			return sat, true
		}
	}
	return k.hsSatBracket(n, h, s, lv)
}

// hsSatNewton is the Newton iteration of hsSat (lvMixNewton with the
// condition h − T s = g′).
func hsSatNewton(f *fluid.Fluid, h, s, T, rl, rv, Ta, Tb float64) (fluid.Saturation, bool) {
	return lvMixNewton(f, mixCond{a: h, b: s}, T, rl, rv, Ta, Tb)
}

// lvResidual returns the condition's residual for a liquid–vapour
// mixture of the saturated phases l and v at their T, in units of RT, and
// its derivatives in T (at fixed densities), ln ρ′ and ln ρ″:
//
//	HS: F = (h − T s − g′)/RT,  ∂g′/∂T = −s′ + (∂p/∂T)_ρ′/ρ′,
//	    ∂g′/∂ln ρ′ = (∂p/∂ρ)_T′;
//	DU: F = (u_mix − u)/RT, u_mix = u′ + x (u″ − u′),
//	    x = (v − v′)/(v″ − v′), ∂x/∂ln ρ′ = (1 − x) v′/(v″ − v′),
//	    ∂x/∂ln ρ″ = x v″/(v″ − v′), ∂u/∂T = cv,
//	    ∂u/∂ln ρ = (p − T(∂p/∂T)_ρ)/ρ.
func (m *mixCond) lvResidual(l, v *fluid.Props, rt float64) (F, dT, dl, dv float64) {
	T := l.T
	if !m.du {
		h, s := m.a, m.b
		return (h - T*s - l.G) / rt, (-s + l.S - l.DpDT/l.Rho) / rt, -l.DpDrho / rt, 0
	}
	vm, u := m.a, m.b
	vl, vv := 1/l.Rho, 1/v.Rho
	x := (vm - vl) / (vv - vl)
	du := v.U - l.U
	F = (l.U + x*du - u) / rt
	dT = ((1-x)*l.Cv + x*v.Cv) / rt
	dl = ((1-x)*(l.P-T*l.DpDT)/l.Rho + du*(1-x)*vl/(vv-vl)) / rt
	dv = (x*(v.P-T*v.DpDT)/v.Rho + du*x*vv/(vv-vl)) / rt
	return F, dT, dl, dv
}

// lvMixNewton solves the liquid–vapour mixture with the condition m (h
// and s, or specific volume and u) by Newton's method in
// (T, ln ρ′, ln ρ″) on
//
//	F1 = (p′ − p″)/(ρr R T),  F2 = (g′ − g″)/(RT),  F3 = m's residual
//
// (ρr the reducing density), from (T, ρ′, ρ″). The tolerances are those
// of fluid.SaturationAtT for F1 and F2 (the rounding level of the
// equation: 1e-14(δ′τ⁴ + |P|) and 1e-14τ⁴ in reduced units) and 1/100 of
// the backward-residual floor of h or u for F3. Within a millikelvin of
// Tc, where the equation fixes the saturated densities only loosely
// (fluid.SaturationAtT: rounding leaves F1 and F2 above their
// tolerances in a band of densities), a point of that band is accepted
// once F3 meets its tolerance with F1 and F2 within 100 times theirs.
// The root lies between Ta and Tb: an iterate that leaves that interval
// by its width, or 16 iterations, end the attempt (where the inputs lie
// beside the dome there may be no root at all).
func lvMixNewton(f *fluid.Fluid, m mixCond, T, rl, rv, Ta, Tb float64) (fluid.Saturation, bool) {
	Tr, rhor := f.Reducing()
	R := f.GasConstant()
	c := f.Critical()
	tol3 := m.tol(f)
	yl, yv := math.Log(rl), math.Log(rv)
	var l, v fluid.Props
	good := false
	var pT, pyl, pyv float64 // the last good point
	w := watch{best: math.Inf(1)}
	lastStep := math.Inf(1)
	converged := false
	wide := Tb - Ta
	for it := 0; it < 16; it++ {
		if T < Ta-wide || T > Tb+wide {
			return fluid.Saturation{}, false
		}
		var okl, okv bool
		l, okl = propsIter(f, T, math.Exp(yl))
		v, okv = propsIter(f, T, math.Exp(yv))
		if !okl || !okv || !(l.Rho > c.Rho && v.Rho < c.Rho) || T >= c.T {
			if !good {
				return fluid.Saturation{}, false
			}
			T, yl, yv = 0.5*(T+pT), 0.5*(yl+pyl), 0.5*(yv+pyv)
			continue
		}
		rt := R * T
		tau := Tr / T
		t4 := tau * tau * tau * tau
		P := v.P / (rhor * rt)
		F1 := (l.P - v.P) / (rhor * rt)
		F2 := (l.G - v.G) / rt
		F3, a31, a32, a33 := m.lvResidual(&l, &v, rt)
		res12 := max(math.Abs(F1)/(1e-14*(l.Rho/rhor*t4+math.Abs(P))), math.Abs(F2)/(1e-14*t4))
		res := max(res12, math.Abs(F3)*rt/tol3)
		near := c.T-T < 1e-3
		if near && res12 <= 100 && math.Abs(F3)*rt <= tol3 {
			converged = true
			break
		}
		if w.check(res, lastStep) {
			if res > 5 && !(math.Abs(F3)*rt <= 100*tol3 && res <= 100) {
				return fluid.Saturation{}, false
			}
			converged = true
			break
		}
		// Rows: ∂/∂T at fixed ρ, ∂/∂ln ρ′, ∂/∂ln ρ″.
		a11, a12, a13 := (l.DpDT-v.DpDT)/(rhor*rt), l.Rho*l.DpDrho/(rhor*rt), -v.Rho*v.DpDrho/(rhor*rt)
		a21, a22, a23 := (-l.S+l.DpDT/l.Rho+v.S-v.DpDT/v.Rho)/rt, l.DpDrho/rt, -v.DpDrho/rt
		// Solve J d = −F by Cramer's rule.
		det := a11*(a22*a33-a23*a32) - a12*(a21*a33-a23*a31) + a13*(a21*a32-a22*a31)
		b1, b2, b3 := -F1, -F2, -F3
		if near && res12 <= 10 {
			// F1 and F2 at the equation's rounding noise: a step along
			// the coexistence curve for F3 alone, which does not chase
			// that noise.
			b1, b2 = 0, 0
		}
		dT := (b1*(a22*a33-a23*a32) - a12*(b2*a33-a23*b3) + a13*(b2*a32-a22*b3)) / det
		dl := (a11*(b2*a33-a23*b3) - b1*(a21*a33-a23*a31) + a13*(a21*b3-b2*a31)) / det
		dv := (a11*(a22*b3-b2*a32) - a12*(a21*b3-b2*a31) + b1*(a21*a32-a22*a31)) / det
		if !isFinite(dT) || !isFinite(dl) || !isFinite(dv) {
			return fluid.Saturation{}, false
		}
		sc := 1.0
		if x := math.Abs(dT); x > 0.05*T {
			sc = 0.05 * T / x
		}
		if x := math.Abs(dl); x > 0.1 {
			sc = min(sc, 0.1/x)
		}
		if x := math.Abs(dv); x > 1 {
			sc = min(sc, 1/x)
		}
		pT, pyl, pyv, good = T, yl, yv, true
		lastStep = sc * max(math.Abs(dT)/T, math.Abs(dl), math.Abs(dv))
		T, yl, yv = T+sc*dT, yl+sc*dl, yv+sc*dv
	}
	if !converged || !(l.Rho > v.Rho*(1+1e-6)) {
		return fluid.Saturation{}, false
	}
	l.Flags |= Saturated
	v.Flags |= Saturated
	return fluid.Saturation{T: T, P: v.P, Liquid: l, Vapor: v,
		Flags: Saturated | (l.Flags|v.Flags)&Extrapolated}, true
}

// propsIter is props for the iterates of a phase-equilibrium solve: a
// liquid state at negative pressure (a slightly too low density at low
// temperature, where p changes by the bulk modulus times Δρ/ρ) is usable
// there, as long as it is mechanically stable.
func propsIter(f *fluid.Fluid, T, rho float64) (fluid.Props, bool) {
	pr, err := f.Props(T, rho)
	if err != nil && !(isRangeErr(err) && pr.T == T && pr.P <= 0) {
		return pr, false
	}
	return pr, isFinite(pr.P) && isFinite(pr.H) && isFinite(pr.S) && pr.DpDrho > 0
}

// hsSatBracket solves φ(T) = g(T) + T s − h = 0 in the bracket of lv
// (the nodes j−1 and j, where φ(T_a) < 0 ≤ φ(T_b), or Ta and Tb, where
// the upper end is checked first) over saturation states at T, by
// Newton's method with dφ/dT = s − s′ + v′γ (γ the Clausius–Clapeyron
// slope), kept in the bracket by bisection, so that it always terminates.
func (k *call) hsSatBracket(n *satNodes, h, s float64, lv *tiePlace) (fluid.Saturation, bool) {
	f := k.f
	a, b := lv.j-1, lv.j
	lo, hi := n.T[a], n.T[b]
	rl, rv := 0.5*(n.liq[a].Rho+n.liq[b].Rho), math.Sqrt(n.vap[a].Rho*n.vap[b].Rho)
	T := 0.5 * (lo + hi)
	tolH := qH.tol(f, nil, h)
	var sat fluid.Saturation
	if lv.Tb > 0 {
		// Next to the liquid line: its end is where the saturated
		// liquid's entropy is s, by Newton's method with ds′/dT from the
		// nodes (s′ rises smoothly), from the interpolated one.
		lo, T = lv.Ta, lv.Tb
		ds := n.dsl[a]
		for it := 0; it < 8; it++ {
			var err error
			sat, err = f.SaturationAtTFrom(T, rl, rv)
			if err != nil {
				return sat, false
			}
			rl, rv = sat.Liquid.Rho, sat.Vapor.Rho
			r := sat.Liquid.S - s
			if math.Abs(r) <= qS.tol(f, nil, s) {
				break
			}
			T -= r / ds
		}
		hi = T
		if phi := sat.Liquid.H - T*sat.Liquid.S + T*s - h; phi < 0 {
			return sat, false // above the liquid line: no mixture
		}
	}
	ok := bracketRoot(lo, hi, T, tolH, true, func(T float64) (phi, slope float64, ok bool) {
		var err error
		if sat, err = f.SaturationAtTFrom(T, rl, rv); err != nil {
			return 0, 0, false
		}
		rl, rv = sat.Liquid.Rho, sat.Vapor.Rho
		vl, vv := 1/sat.Liquid.Rho, 1/sat.Vapor.Rho
		gamma := (sat.Vapor.S - sat.Liquid.S) / (vv - vl)
		return sat.Liquid.H - T*sat.Liquid.S + T*s - h, s - sat.Liquid.S + vl*gamma, true
	})
	// Within a millikelvin of Tc the equation fixes the saturation only
	// loosely (fluid.SaturationAtT): there the bracket's end is the state.
	return sat, ok || f.Critical().T-sat.T < 1e-3 && sat.T > 0
}

// bracketRoot solves φ(T) = 0 in [lo, hi], where φ changes sign (rising:
// from negative at lo to positive at hi), by Newton's method from T with
// the slope eval returns, kept in the bracket by bisection, so that it
// always terminates: converged where |φ| ≤ tol, or where the bracket has
// shrunk to rounding with |φ| within 100 tol. eval leaves its state at
// the last T for the caller.
func bracketRoot(lo, hi, T, tol float64, rising bool, eval func(T float64) (phi, slope float64, ok bool)) bool {
	for it := 0; it < 100; it++ {
		phi, slope, ok := eval(T)
		if !ok {
			return false
		}
		if math.Abs(phi) <= tol {
			return true
		}
		if (phi > 0) == rising {
			hi = T
		} else {
			lo = T
		}
		if hi-lo <= 1e-14*hi {
			return math.Abs(phi) <= 100*tol
		}
		Tn := T - phi/slope
		if !(Tn > lo && Tn < hi) || !isFinite(Tn) {
			Tn = 0.5 * (lo + hi)
		}
		T = Tn
	}
	return false
}

// hsMixture solves the solid–fluid mixture with h and s placed at tp on
// the curve nodes cs (vapour: the sublimation curve; else the melting
// curve) and returns its state; done is false where the mixture is not
// found or (h, s) lies beside it.
func (k *call) hsMixture(cs []sublimation.Coexistence, vapour bool, h, s float64, tp *tiePlace) (State, error, bool) {
	a, b := &cs[tp.j-1], &cs[tp.j]
	rho := math.Exp(lerp(math.Log(a.Fluid.Rho), math.Log(b.Fluid.Rho), tp.t))
	c, ok := k.hsCoexist(h, s, tp.T, rho, vapour, a.T, b.T)
	if !ok {
		Ta, Tb := a.T, b.T
		if tp.Tb > 0 {
			Ta, Tb = tp.Ta, tp.Tb
		}
		if c, ok = k.hsCoexistBracket(h, s, Ta, Tb, rho, vapour); !ok {
			return State{}, nil, false
		}
	}
	x := (s - c.Solid.S) / (c.Fluid.S - c.Solid.S)
	if !(x >= 0 && x <= 1) {
		return State{}, nil, false
	}
	st, err := k.wantedState(k.coexistState(&c, vapour, x))
	return st, err, true
}

// hsCoexist solves the equilibrium of the solid and the fluid with the
// mixture condition h − T s = g (coexistSolve).
func (k *call) hsCoexist(h, s, T, rho float64, vapour bool, Ta, Tb float64) (sublimation.Coexistence, bool) {
	return k.coexistSolve(mixCond{a: h, b: s}, T, rho, vapour, Ta, Tb)
}

// hsCoexistBracket solves the solid–fluid mixture with h and s where
// hsCoexist does not: next to the solid's line, where the mixture has
// little fluid, φ(T) = g(T) + T s − h has the small slope
// dφ/dT = s − s_s + v_s γ (γ = dp/dT of the curve) and Newton's method
// from a start beyond φ's maximum runs away. Here φ is solved between Ta
// and Tb over the curve at T (sublimation.Solid.SublimationPressureFrom
// or MeltingPressureFrom, warm-started) by Newton's method kept in the
// bracket by bisection, so that it always terminates; ok is false where
// φ does not change sign between the ends.
func (k *call) hsCoexistBracket(h, s, Ta, Tb, rho float64, vapour bool) (sublimation.Coexistence, bool) {
	sol := k.sol.s
	curve := func(T float64) (sublimation.Coexistence, float64, bool) {
		var c sublimation.Coexistence
		var err error
		if vapour {
			c, err = sol.SublimationPressureFrom(T, rho)
		} else {
			c, err = sol.MeltingPressureFrom(T, rho)
		}
		if err != nil {
			return c, 0, false
		}
		rho = c.Fluid.Rho
		return c, c.Fluid.G + T*s - h, true
	}
	lo, hi := min(Ta, Tb), max(Ta, Tb)
	cl, fl, ok1 := curve(lo)
	ch, fh, ok2 := curve(hi)
	if !ok1 || !ok2 || fl*fh > 0 {
		return sublimation.Coexistence{}, false
	}
	tolH := qH.tol(k.f, nil, h)
	if math.Abs(fl) <= tolH {
		return cl, true
	}
	if math.Abs(fh) <= tolH {
		return ch, true
	}
	var c sublimation.Coexistence
	ok := bracketRoot(lo, hi, lo+(hi-lo)*fl/(fl-fh), tolH, fh > fl, func(T float64) (phi, slope float64, ok bool) {
		c, phi, ok = curve(T)
		if !ok {
			return 0, 0, false
		}
		vs, vf := 1/c.Solid.Rho, 1/c.Fluid.Rho
		gamma := (c.Fluid.S - c.Solid.S) / (vf - vs)
		return phi, s - c.Solid.S + vs*gamma, true
	})
	return c, ok
}

// hsSolid solves the single solid phase with h and s (hd, sd in the
// default reference state) by Newton's method in (T, p) on the solid's
// Gibbs function, from the nearest node of the solid's curves, and
// places the result by the curves (placePT). ok is false where the
// result is not a solid state of the model; beyond is the error for a
// solid state found outside the model's range.
func (k *call) hsSolid(h, s, hd, sd float64) (st State, err error, ok bool, beyond error) {
	n := k.sol.n
	var best *sublimation.Props
	bestD := math.Inf(1)
	for _, cs := range [2][]sublimation.Coexistence{n.sub, n.melt} {
		for i := range cs {
			sp := &cs[i].Solid
			if d := math.Abs(sp.S-sd) + math.Abs(sp.H-hd)/sp.T; d < bestD {
				best, bestD = sp, d
			}
		}
	}
	if best == nil {
		return State{}, nil, false, nil
	}
	// One linear step from the node: dh = cp dT + v(1 − Tα) dp,
	// ds = cp/T dT − vα dp.
	v, al := 1/best.Rho, best.Expansivity
	dT, dp, _ := solve2(best.Cp, v*(1-best.T*al), best.Cp/best.T, -v*al, hd-best.H, sd-best.S)
	sp, good := k.solidNewton(qH, h, qS, s, best.T+dT, best.P+dp)
	if !good {
		return State{}, nil, false, nil
	}
	ok, why := k.solidAt(&sp)
	switch {
	case ok:
		st, err := k.wantedState(solidState(&sp))
		return st, err, true, nil
	case why != "":
		return State{}, nil, false, k.beyondError(why)
	}
	return State{}, nil, false, nil
}

// solidAt reports whether the solid sp is a state of the model: placed
// solid by the node tables (placePT), or between their bounds by the
// Gibbs energies of the solid and the fluid (on a curve, within gibbsTol,
// it coexists with the fluid and counts as solid). why explains a (T, p)
// outside the models (above the solid's pressure limit, where placePT's
// Solid means other ices, or below the vapour floor). Below the vapour
// floor a solid whose pressure lies below the sublimation pressure at
// the floor by no more than the inputs fix it is moved up to that
// pressure first (atFloorP).
func (k *call) solidAt(sp *sublimation.Props) (ok bool, why string) {
	k.atFloorP(sp)
	T, p := sp.T, sp.P
	if p > k.sol.n.solidPMax()*(1+1e-12) {
		return false, k.beyondWhy(p)
	}
	pl, root, why := k.placePT(T, p)
	switch pl {
	case placeSolid:
		return true, ""
	case placeNear:
		pr, err := k.f.PropsTP(T, p, root, 0)
		return err != nil || k.byGibbs(&pr) != vFluid, ""
	case placeBeyond:
		return false, why
	}
	return false, ""
}

// atFloorP moves the solid sp onto the edge of the model's states where
// its pressure lies beyond that edge by no more than the inputs fix it:
// up to the sublimation pressure at the vapour floor (the lowest pressure
// at which a solid is told from vapour below the floor), and down to the
// model's pressure limit (the end of its melting curve). A solid's p at
// given (ρ, u) or (h, s) is fixed only to the backward-residual floors of
// DESIGN.md, 1e-10·ρ in ρ and 1e-10·max(|h|, R·Tc) in h — ice at 0.16 Pa
// only to about 1 Pa, since its volume changes by κ_T ≈ 1.2e-10 per Pa,
// and at 208.566 MPa to about 0.03 Pa. The moved state reproduces the
// inputs within those floors.
func (k *call) atFloorP(sp *sublimation.Props) {
	n := k.sol.n
	R := k.f.GasConstant()
	Tc, _ := k.f.Reducing()
	band := 1e-10*sp.P + 1e-12*sp.Rho*R*sp.T + 1e-10/sp.KappaT +
		1e-10*max(math.Abs(sp.H), R*Tc)*sp.Rho
	edge := 0.0
	switch pm, pM := n.subPMin(), n.solidPMax(); {
	case sp.T < n.subTMin() && sp.P < pm && pm-sp.P <= band:
		edge = pm
	case sp.P > pM && sp.P-pM <= band:
		edge = pM
	default:
		return
	}
	if q, err := k.sol.s.Props(sp.T, edge); err == nil {
		*sp = q
	}
}

// solidNewton solves the solid's quantities a and b (solidQ: h, s, u,
// or for ρ the specific volume) at the targets xa and xb by Newton's
// method in (T, p) from (T, p), with the analytic derivatives of its
// Gibbs function (no evaluation of the fluid equation): for h and s
//
//	∂h/∂T = −T g_TT,  ∂h/∂p = g_p − T g_Tp,  ∂s/∂T = −g_TT,  ∂s/∂p = −g_Tp,
//
// whose determinant g_TT g_p never vanishes (cp > 0, v > 0); for v and u
// ∂v/∂T = g_Tp, ∂v/∂p = g_pp, ∂u/∂T = −T g_TT − p g_Tp,
// ∂u/∂p = −T g_Tp − p g_pp. T is kept within the model's range and p
// positive, up to the model's limit; it converges to 1/100 of the
// backward-residual floors (solidTol), or to the floors where rounding
// stalls it.
func (k *call) solidNewton(a quantity, xa float64, b quantity, xb float64, T, p float64) (sublimation.Props, bool) {
	sol := k.sol.s
	lim := sol.Limits()
	tlo := k.solidFloorT()
	ta, tb := solidTarget(a, xa), solidTarget(b, xb)
	tolA, tolB := solidTol(k.f, a, ta), solidTol(k.f, b, tb)
	pmin := 1e-12 * k.sol.pt
	T = min(max(T, tlo), lim.TCeil)
	p = min(max(p, pmin), lim.PCeil)
	w := watch{best: math.Inf(1)}
	lastStep := math.Inf(1)
	for it := 0; it < 60; it++ {
		g := sol.Derivs(T, p)
		va, aT, ap := solidQ(a, &g, T, p)
		vb, bT, bp := solidQ(b, &g, T, p)
		ra, rb := va-ta, vb-tb
		if w.check(max(math.Abs(ra)/tolA, math.Abs(rb)/tolB), lastStep) {
			if math.Abs(ra) > 100*tolA || math.Abs(rb) > 100*tolB {
				return sublimation.Props{}, false
			}
			sp, err := sol.Props(T, p)
			return sp, err == nil
		}
		dT, dp, ok := solve2(aT, ap, bT, bp, -ra, -rb)
		if !ok {
			return sublimation.Props{}, false
		}
		sc := 1.0
		if x := math.Abs(dT); x > 0.25*T {
			sc = 0.25 * T / x
		}
		dT, dp = sc*dT, sc*dp
		if dp < 0 && -dp > 0.9*p {
			// At low pressure v and u hardly depend on p, and a step
			// toward p ≤ 0 is limited on its own (a scale on both would
			// stall T, which u fixes).
			dp = -0.9 * p
		}
		lastStep = max(math.Abs(dT)/T, math.Abs(dp)/max(p, 1))
		T = min(max(T+dT, tlo), lim.TCeil)
		p = min(max(p+dp, pmin), lim.PCeil)
	}
	return sublimation.Props{}, false
}
