package table

import (
	"errors"
	"math"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// This file builds one slab: its nodes in x, its boundary curves and the
// patches between them. Both grids are refined where the interpolation
// error, estimated from the node data, is above the tolerance: the cubic
// of a cell, extrapolated to the next node on either side, misses that
// node's value by about f⁗ times a known power of the spacings, and the
// same fourth derivative gives the error at the cell's middle,
//
//	e_mid ≈ miss · (w/2)⁴ / ((u_k − u_i)² (u_k − u_{i+1})²)
//
// for a cell [u_i, u_{i+1}] of width w and a neighbouring node u_k. Cells
// above the tolerance are halved, the new nodes solved, until none is.
// Every state solved becomes a node: no evaluation is spent on checks.

// Tolerances of the refinement: the estimated error at the middle of a
// cell, in each direction, relative to the scale of each property
// (T, ρ or 1 for ln ρ, max(|s|, R), max(|h|, R·Tc)); and of the boundary
// curves, which place η.
const (
	tolPatch = 3e-7
	tolCurve = 1e-9
)

// Limits of the refinement: the narrowest cells and the initial grids.
const (
	minDx   = 1e-7
	minDeta = 1.0 / (1 << 13)
	nEta0   = 17
)

// pbuild is a patch under construction.
type pbuild struct {
	spec   colSpec
	lo, hi int       // its boundary curves in the slab
	eta    []float64 // its nodes in η
	st     [][]fluid.Props
	nd     [][]nodeDat
	out    *patch // the patch of the table, filled by assemble
}

// nodeDat holds, for each property of a node, its value, its exact
// derivatives in x and η (where the equation gives them) and the
// tolerance of the refinement.
type nodeDat [maxProps][4]float64

// sbuild is a slab under construction: x = ln a from xa to xb (a from aa
// to ab), boundary curves in the variable v.
type sbuild struct {
	b       *builder
	a, v    variable
	aa, ab  float64
	dx0     float64 // the initial step in x
	curves  []bcurve
	start   []bpoint // DU: where each curve's search at a density starts
	xs      []float64
	pts     [][]bpoint // [curve][node]
	patches []*pbuild
}

// point returns the point of curve k at x, warm-started from near.
func (s *sbuild) point(k int, x float64, near *bpoint) (bpoint, error) {
	av := math.Exp(x)
	switch x {
	case s.xs[0]:
		av = s.aa
	case s.xs[len(s.xs)-1]:
		av = s.ab
	}
	if s.a == vP {
		return s.b.atP(s.curves[k], av, near)
	}
	if near == nil {
		near = &s.start[k]
	}
	return s.b.atRho(s.curves[k], av, near)
}

// build refines and fills the slab.
func (s *sbuild) build() error {
	xa, xb := ln(s.aa), ln(s.ab)
	n := nodes(xb-xa, s.dx0)
	s.xs = make([]float64, n)
	for i := range s.xs {
		s.xs[i] = xa + (xb-xa)*float64(i)/float64(n-1)
	}
	s.xs[n-1] = xb
	s.pts = make([][]bpoint, len(s.curves))
	for k := range s.curves {
		s.pts[k] = make([]bpoint, n)
		for i := range s.xs {
			var near *bpoint
			if i > 0 {
				near = &s.pts[k][i-1]
			}
			bp, err := s.point(k, s.xs[i], near)
			if err != nil {
				return s.b.fail("boundary at "+s.a.name()+" = "+fmtG(math.Exp(s.xs[i])), err)
			}
			s.pts[k][i] = bp
		}
	}
	for _, pb := range s.patches {
		pb.eta = make([]float64, nEta0)
		for j := range pb.eta {
			pb.eta[j] = float64(j) / float64(nEta0-1)
		}
		pb.st = make([][]fluid.Props, n)
		pb.nd = make([][]nodeDat, n)
		for i := range s.xs {
			if err := s.column(pb, i, nil, nil); err != nil {
				return err
			}
		}
	}
	for round := 0; round < 40; round++ {
		xbad := s.xIndicator()
		more := refineAny(xbad)
		ebad := make([][]float64, len(s.patches))
		for k, pb := range s.patches {
			ebad[k] = s.etaIndicator(pb)
			more = more || refineAny(ebad[k])
		}
		if !more {
			break
		}
		if err := s.refine(xbad, ebad); err != nil {
			return err
		}
	}
	s.assemble()
	return nil
}

// column solves the states of column i of pb: all of them (old nil), or
// those at the η nodes not in the old column (old and oldEta its states
// and nodes).
func (s *sbuild) column(pb *pbuild, i int, old []fluid.Props, oldEta []float64) error {
	lo, hi := &s.pts[pb.lo][i], &s.pts[pb.hi][i]
	av := value(&lo.pr, s.a)
	blo, bhi := value(&lo.pr, s.v), value(&hi.pr, s.v)
	ny := len(pb.eta)
	st := make([]fluid.Props, ny)
	nd := make([]nodeDat, ny)
	o := 0
	for j, e := range pb.eta {
		switch {
		case o < len(oldEta) && oldEta[o] == e:
			st[j] = old[o]
			o++
		case j == 0:
			st[j] = lo.pr
		case j == ny-1:
			st[j] = hi.pr
		default:
			var g2 *fluid.Props
			if j >= 2 {
				g2 = &st[j-2]
			}
			pr, err := s.b.solve(s.a, s.v, av, blo+e*(bhi-blo), &st[j-1], g2)
			if err != nil {
				return s.b.fail("node at "+s.a.name()+" = "+fmtG(av)+", "+s.v.name()+" = "+
					fmtG(blo+e*(bhi-blo)), err)
			}
			st[j] = pr
		}
		nd[j] = s.datum(pb, lo, hi, e, &st[j])
	}
	pb.st[i], pb.nd[i] = st, nd
	return nil
}

// datum returns the node data of the state pr at η between the boundary
// points lo and hi:
//
//	(∂z/∂x)_η = a (∂z/∂a)_b + (∂z/∂b)_a (lo′ + η(hi′ − lo′)),
//	(∂z/∂η)_x = (∂z/∂b)_a (hi − lo),
//
// transformed as the property is stored.
func (s *sbuild) datum(pb *pbuild, lo, hi *bpoint, e float64, pr *fluid.Props) nodeDat {
	var d nodeDat
	av := value(&lo.pr, s.a)
	blo, dlo := bslope(lo, s.a, s.v)
	bhi, dhi := bslope(hi, s.a, s.v)
	bx, by := dlo+e*(dhi-dlo), bhi-blo
	R := s.b.f.GasConstant()
	eScale := max(math.Abs(pr.H), R*s.b.crit.T)
	for k, pp := range pb.spec.props {
		if !pp.exact() {
			switch pp.tr {
			case pCp:
				d[k][0] = pr.Cp
			case pCv:
				d[k][0] = pr.Cv
			default:
				d[k][0] = pr.W
			}
			continue
		}
		z := value(pr, pp.z)
		za, zb := inAB(pr, pp.z, s.a, s.v)
		zx, zy := av*za+zb*bx, zb*by
		scale := math.Abs(z)
		switch pp.z {
		case vS:
			scale = max(scale, R)
		case vH, vU:
			scale = eScale
		}
		switch pp.tr {
		case pPerA:
			// z/a with x = ln a: (z/a)_x = z_x/a − z/a, (z/a)_η = z_η/a.
			z, zx, zy, scale = z/av, zx/av-z/av, zy/av, math.Abs(z/av)
		case pPerRho:
			ra, rb := inAB(pr, vRho, s.a, s.v)
			rx, ry := av*ra+rb*bx, rb*by
			r := pr.Rho
			z, zx, zy, scale = z/r, (zx-z/r*rx)/r, (zy-z/r*ry)/r, eScale
		}
		d[k] = [4]float64{z, zx, zy, tolPatch * scale}
	}
	return d
}

// estimate raises ratio[i] to the estimated error at the middle of cell
// i of the line (u, f, df) over its tolerance tol (the smaller of its two
// nodes'). A line of one cell has no estimate: its ratio is +Inf.
func estimate(u, f, df, tol, ratio []float64) {
	n := len(u)
	if n == 2 {
		ratio[0] = math.Inf(1)
		return
	}
	for i := 0; i+1 < n; i++ {
		w := u[i+1] - u[i]
		e := 0.0
		for _, k := range [2]int{i - 1, i + 2} {
			if k < 0 || k >= n {
				continue
			}
			b := basis((u[k]-u[i])/w, w)
			miss := math.Abs(b[0]*f[i] + b[1]*df[i] + b[2]*f[i+1] + b[3]*df[i+1] - f[k])
			a, c := u[k]-u[i], u[k]-u[i+1]
			h2 := w * w / 4
			e = max(e, miss*h2*h2/(a*a*c*c))
		}
		r := e / min(tol[i], tol[i+1])
		if !finite(r) {
			r = math.Inf(1)
		}
		ratio[i] = max(ratio[i], r)
	}
}

// xIndicator returns the ratios of the estimated errors to their
// tolerances of the cells in x: the greatest over the boundary curves
// and the rows of the patches.
func (s *sbuild) xIndicator() []float64 {
	n := len(s.xs)
	bad := make([]float64, n-1)
	f, df, tol := make([]float64, n), make([]float64, n), make([]float64, n)
	R := s.b.f.GasConstant()
	for k := range s.curves {
		for i := range s.xs {
			f[i], df[i] = bslope(&s.pts[k][i], s.a, s.v)
			sc := math.Abs(f[i])
			if s.v != vT {
				sc = max(sc, R*s.b.crit.T)
			}
			tol[i] = tolCurve * sc
		}
		estimate(s.xs, f, df, tol, bad)
	}
	for _, pb := range s.patches {
		s.lineRatios(pb, true, bad)
	}
	keepWide(s.xs, bad, minDx)
	return bad
}

// etaIndicator returns the ratios of the cells in η of pb.
func (s *sbuild) etaIndicator(pb *pbuild) []float64 {
	bad := make([]float64, len(pb.eta)-1)
	s.lineRatios(pb, false, bad)
	keepWide(pb.eta, bad, minDeta)
	return bad
}

// lineRatios raises ratio by the lines of every exact property of pb
// along x (alongX) or along η, one line at every node of the other grid.
func (s *sbuild) lineRatios(pb *pbuild, alongX bool, ratio []float64) {
	u, other, m := pb.eta, len(s.xs), 2
	if alongX {
		u, other, m = s.xs, len(pb.eta), 1
	}
	n := len(u)
	f, df, tol := make([]float64, n), make([]float64, n), make([]float64, n)
	for o := 0; o < other; o++ {
		for k, pp := range pb.spec.props {
			if !pp.exact() {
				continue
			}
			for j := range n {
				var d *[4]float64
				if alongX {
					d = &pb.nd[j][o][k]
				} else {
					d = &pb.nd[o][j][k]
				}
				f[j], df[j], tol[j] = d[0], d[m], d[3]
			}
			estimate(u, f, df, tol, ratio)
		}
	}
}

// keepWide clears the ratios of the cells of u narrower than twice w:
// they are not split further.
func keepWide(u, ratio []float64, w float64) {
	for i := range ratio {
		if u[i+1]-u[i] < 2*w {
			ratio[i] = 0
		}
	}
}

// split returns the nodes u with every cell whose ratio exceeds 1 cut
// into m equal cells, m = ⌈ratio^¼⌉ (the error of a cubic falls as the
// fourth power of the width), at least 2 and at most 6.
func split(u []float64, ratio []float64) []float64 {
	out := make([]float64, 0, len(u)+len(ratio))
	for i := range u {
		out = append(out, u[i])
		if i < len(ratio) && ratio[i] > 1 {
			m := min(max(int(math.Ceil(math.Pow(ratio[i], 0.25))), 2), 6)
			for k := 1; k < m; k++ {
				out = append(out, u[i]+(u[i+1]-u[i])*float64(k)/float64(m))
			}
		}
	}
	return out
}

// refineAny reports whether any ratio exceeds 1.
func refineAny(ratio []float64) bool {
	for _, r := range ratio {
		if r > 1 {
			return true
		}
	}
	return false
}

// refine inserts the new nodes and solves their states.
func (s *sbuild) refine(xbad []float64, ebad [][]float64) error {
	oldX := s.xs
	s.xs = split(oldX, xbad)
	// The boundary points and the columns at the new nodes in x.
	pts := make([][]bpoint, len(s.curves))
	for k := range pts {
		pts[k] = make([]bpoint, len(s.xs))
	}
	type moved struct {
		st [][]fluid.Props
		nd [][]nodeDat
	}
	olds := make([]moved, len(s.patches))
	for k, pb := range s.patches {
		olds[k] = moved{pb.st, pb.nd}
		pb.st = make([][]fluid.Props, len(s.xs))
		pb.nd = make([][]nodeDat, len(s.xs))
	}
	o := 0
	for i, x := range s.xs {
		isOld := o < len(oldX) && oldX[o] == x
		for k := range s.curves {
			if isOld {
				pts[k][i] = s.pts[k][o]
				continue
			}
			bp, err := s.point(k, x, &pts[k][i-1])
			if err != nil {
				return s.b.fail("boundary at "+s.a.name()+" = "+fmtG(math.Exp(x)), err)
			}
			pts[k][i] = bp
		}
		if isOld {
			for k, pb := range s.patches {
				pb.st[i], pb.nd[i] = olds[k].st[o], olds[k].nd[o]
			}
			o++
		}
	}
	s.pts = pts
	for k, pb := range s.patches {
		oldEta := pb.eta
		pb.eta = split(oldEta, ebad[k])
		for i := range s.xs {
			if pb.st[i] == nil {
				if err := s.column(pb, i, nil, nil); err != nil {
					return err
				}
			} else if len(pb.eta) != len(oldEta) {
				if err := s.column(pb, i, pb.st[i], oldEta); err != nil {
					return err
				}
			}
		}
	}
	return nil
}

// assemble fills the table's patches of the slab: the node data, the
// slopes of cp, cv and w and every cross derivative from cubic splines
// along the grid lines.
func (s *sbuild) assemble() {
	nx := len(s.xs)
	for _, pb := range s.patches {
		ny := len(pb.eta)
		// All in float64 first: [node][prop][f, fx, fy, fxy].
		all := make([]float64, nx*ny*maxProps*4)
		at := func(i, j, k, m int) *float64 { return &all[((i*ny+j)*maxProps+k)*4+m] }
		for i := range nx {
			for j := range ny {
				for k := range maxProps {
					d := &pb.nd[i][j][k]
					*at(i, j, k, 0), *at(i, j, k, 1), *at(i, j, k, 2) = d[0], d[1], d[2]
				}
			}
		}
		line := make([]float64, max(nx, ny))
		out := make([]float64, max(nx, ny))
		alongX := func(k, m, j, set int) {
			for i := range nx {
				line[i] = *at(i, j, k, m)
			}
			slopes(s.xs, line[:nx], out[:nx])
			for i := range nx {
				*at(i, j, k, set) = out[i]
			}
		}
		alongY := func(k, m, i, set int, mean bool) {
			for j := range ny {
				line[j] = *at(i, j, k, m)
			}
			slopes(pb.eta, line[:ny], out[:ny])
			for j := range ny {
				if mean {
					*at(i, j, k, set) = 0.5 * (*at(i, j, k, set) + out[j])
				} else {
					*at(i, j, k, set) = out[j]
				}
			}
		}
		for k, pp := range pb.spec.props {
			if !pp.exact() {
				for j := range ny {
					alongX(k, 0, j, 1)
				}
				for i := range nx {
					alongY(k, 0, i, 2, false)
				}
			}
			for j := range ny {
				alongX(k, 2, j, 3)
			}
			for i := range nx {
				alongY(k, 1, i, 3, true)
			}
		}
		p := pb.out
		p.eta = newGrid(pb.eta)
		p.ny = ny
		p.data = make([]float64, nx*ny*stride)
		p.data32 = make([]float32, nx*ny*stride32)
		for n := range nx * ny {
			copy(p.data[n*stride:(n+1)*stride], all[n*maxProps*4:])
			for m := range stride32 {
				p.data32[n*stride32+m] = float32(all[n*maxProps*4+stride+m])
			}
		}
		pb.st, pb.nd = nil, nil
	}
}

// curveOf returns boundary curve k of the slab as a curve of x.
func (s *sbuild) curveOf(k int) curve {
	c := make(curve, 2*len(s.xs))
	for i := range s.xs {
		c[2*i], c[2*i+1] = bslope(&s.pts[k][i], s.a, s.v)
	}
	return c
}

func (z variable) name() string {
	return [...]string{"T", "rho", "p", "h", "u", "s"}[z]
}

// solve returns the fluid state where a = av and b = bv, by Newton's
// method in (T, ρ) with the analytic Jacobian, from the nearby state g
// (the previous node of the grid line) and, where not nil, the one before
// it, g2: the first step from g is corrected to second order by the
// change of (∂T/∂b)_a and (∂ρ/∂b)_a from g2 to g, so that one or two
// evaluations of the equation usually suffice. Converged when a step is
// below 1e-13 of T and ρ, or, once a step is below 1e-7 of them, after
// that step (Newton's method leaves an error of the order of its square).
func (b *builder) solve(a, bv variable, av, bval float64, g, g2 *fluid.Props) (fluid.Props, error) {
	// step returns the Newton step at pr to (av, bval), and (∂T/∂b)_a,
	// (∂ρ/∂b)_a there.
	step := func(pr *fluid.Props) (dT, dR, sT, sR float64) {
		ra := av - value(pr, a)
		rb := bval - value(pr, bv)
		aT, aR := tr(pr, a)
		bT, bR := tr(pr, bv)
		d := aT*bR - aR*bT
		sT, sR = -aR/d, aT/d
		return (ra*bR - aR*rb) / d, (aT*rb - ra*bT) / d, sT, sR
	}
	cur := *g
	T, rho := cur.T, cur.Rho
	dT, dR, sT, sR := step(&cur)
	if g2 != nil {
		if db := value(g, bv) - value(g2, bv); db != 0 {
			_, _, sT2, sR2 := step(g2)
			h := bval - value(g, bv)
			dT += 0.5 * (sT - sT2) / db * h * h
			dR += 0.5 * (sR - sR2) / db * h * h
		}
	}
	last := false
	for it := 0; it < 60; it++ {
		if it > 0 {
			dT, dR, _, _ = step(&cur)
		}
		if math.Abs(dT) <= 1e-13*T && math.Abs(dR) <= 1e-13*rho {
			return cur, nil
		}
		last = it > 0 && math.Abs(dT) <= 1e-7*T && math.Abs(dR) <= 1e-7*rho
		for h := 0; ; h++ {
			dT = math.Max(math.Min(dT, 0.25*T), -0.25*T)
			dR = math.Max(math.Min(dR, 0.5*rho), -0.5*rho)
			pr, err := b.f.Props(T+dT, rho+dR)
			if err == nil || errors.Is(err, fluid.ErrOutOfRange) && finite(pr.P) && pr.DpDrho > 0 {
				cur = pr
				T, rho = T+dT, rho+dR
				break
			}
			if h == 30 {
				return cur, err
			}
			dT, dR = dT/2, dR/2
			last = false
		}
		if last {
			return cur, nil
		}
	}
	return cur, errBuild("Newton's method did not converge")
}

// transform is how a property is stored.
type transform int8

const (
	pIdent  transform = iota // z
	pPerA                    // z/a, a the variable of x = ln a
	pPerRho                  // z/ρ
	pCp                      // cp (no exact derivatives: spline slopes)
	pCv                      // cv (likewise)
	pW                       // w (likewise)
)

// prop is a stored property: a state variable and its transform.
type prop struct {
	z  variable
	tr transform
}

var (
	cpProp = prop{tr: pCp}
	cvProp = prop{tr: pCv}
	wProp  = prop{tr: pW}
)

// exact reports whether the equation gives the derivatives of p.
func (p prop) exact() bool { return p.tr < pCp }

// colSpec says what a patch interpolates: the variables a (x = ln a) and
// b (the η direction) and the stored properties.
type colSpec struct {
	a, b  variable
	props [maxProps]prop
}
