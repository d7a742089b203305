package table

// This file holds the interpolation: cubic Hermite polynomials in one
// and two coordinates on nonuniform grids located in O(1), with node
// data laid out so that one set of basis weights serves every property
// of a call.

// grid is a set of n ≥ 2 nodes of a coordinate, ascending, with an index
// of buckets of equal width that finds the cell of a point without a
// search: each bucket names the cell its lower end lies in, and a bucket
// is no wider than the narrowest cell, so the cell of a point is that
// one or the next.
type grid struct {
	x     []float64
	cells []gcell // n − 1 cells, and one past the last (its lo the last node)
	idx   []int32
	x0    float64 // x[0]
	scale float64 // buckets per unit of the coordinate
	last  int     // the last cell, n − 2
}

// gcell is a cell of a grid: its lower node, width and inverse width, in
// one place for the lookup.
type gcell struct{ lo, w, inv float64 }

// maxBuckets bounds the index of a grid; beyond it a lookup may step
// over a few cells.
const maxBuckets = 1 << 14

func newGrid(x []float64) grid {
	n := len(x)
	g := grid{x: x, cells: make([]gcell, n), x0: x[0], last: n - 2}
	minw := x[n-1] - x[0]
	for i := 0; i+1 < n; i++ {
		w := x[i+1] - x[i]
		g.cells[i] = gcell{lo: x[i], w: w, inv: 1 / w}
		minw = min(minw, w)
	}
	g.cells[n-1] = gcell{lo: x[n-1]}
	nb := min(int((x[n-1]-x[0])/minw)+1, maxBuckets)
	g.scale = float64(nb) / (x[n-1] - x[0])
	g.idx = make([]int32, nb)
	i := 0
	for b := range g.idx {
		u := x[0] + float64(b)/g.scale
		for i < n-2 && u >= x[i+1] {
			i++
		}
		g.idx[b] = int32(i)
	}
	return g
}

// cell returns the cell i (0 ≤ i ≤ n−2) of u, the position t of u in it
// and its width. u outside the grid gives the first or last cell, t
// outside [0, 1].
func (g *grid) cell(u float64) (i int, t, w float64) {
	f := (u - g.x0) * g.scale
	b := 0
	if f > 0 {
		b = min(int(f), len(g.idx)-1)
	}
	i = int(g.idx[b])
	for i < g.last && u >= g.cells[i+1].lo {
		i++
	}
	c := &g.cells[i]
	return i, (u - c.lo) * c.inv, c.w
}

// size returns the bytes of g.
func (g *grid) size() int { return 8*len(g.x) + 24*len(g.cells) + 4*len(g.idx) }

// basis returns the cubic Hermite basis at t in a cell of width w, in
// the order of the node data: value and derivative at the cell's first
// node, then at its second:
//
//	h00 = 1 − t²(3 − 2t),  w·h10 = w·t(1 − t)²,  h01 = t²(3 − 2t),  w·h11 = w·t²(t − 1).
func basis(t, w float64) [4]float64 {
	t2 := t * t
	h01 := t2 * (3 - 2*t)
	return [4]float64{1 - h01, w * t * (1 - t) * (1 - t), h01, w * t2 * (t - 1)}
}

// dbasis returns the derivatives in the coordinate of basis.
func dbasis(t, w float64) [4]float64 {
	a := 6 * t * (1 - t) / w
	return [4]float64{-a, (1 - t) * (1 - 3*t), a, t * (3*t - 2)}
}

// curve is a function of a grid's coordinate as a cubic Hermite spline:
// node i holds the value c[2i] and the derivative c[2i+1].
type curve []float64

// at returns the curve in cell i with the basis w of the position in it.
func (c curve) at(i int, w *[4]float64) float64 {
	k := 2 * i
	d := c[k : k+4 : k+4]
	return w[0]*d[0] + w[1]*d[1] + w[2]*d[2] + w[3]*d[3]
}

// maxProps is the number of properties a patch holds: the first nExact
// with the equation's derivatives, stored in float64, the rest (cp, cv,
// w) in float32, whose 24-bit significands are far below the accuracy
// of their interpolation (their derivatives come from splines).
const (
	maxProps = 6
	nExact   = 3
	stride   = nExact * 4
	stride32 = (maxProps - nExact) * 4
)

// patch is one boundary-fitted sub-table: a grid over its slab's grid in
// x and its own grid in η from 0 to 1, where
//
//	b = lo(x) + η (hi(x) − lo(x))
//
// between two boundary curves of the slab, and maxProps properties per
// node as bicubic Hermite data. Node (i, j) holds, for each property k,
// the four numbers f, ∂f/∂x, ∂f/∂η and ∂²f/∂x∂η at
// data[((i·ny + j)·nExact + k)·4:] (the exact properties) or
// data32[((i·ny + j)·(maxProps − nExact) + k − nExact)·4:], so that the
// four corners of a cell are two runs of memory in each and the sixteen
// basis weights serve every property.
type patch struct {
	eta     grid
	ny      int
	data    []float64
	data32  []float32
	rhoPerA bool // the density is stored as ρ/a, a = p (else ρ)
}

// eval interpolates the patch in cell i of the slab's grid (x basis wx)
// at η, into out: by the vector kernel evalVec where the processor has
// it, else by evalGo. This is the hot path of every flash of the tables.
func (p *patch) eval(i int, wx *[4]float64, eta float64, out *[maxProps]float64) {
	if !vector {
		p.evalGo(i, wx, eta, out)
		return
	}
	j, t, h := p.eta.cell(eta)
	wy := basis(t, h)
	n := i*p.ny + j
	r0, r1 := n*stride, (n+p.ny)*stride
	q0, q1 := n*stride32, (n+p.ny)*stride32
	a := p.data[r0 : r0+2*stride : r0+2*stride]
	c := p.data[r1 : r1+2*stride : r1+2*stride]
	e := p.data32[q0 : q0+2*stride32 : q0+2*stride32]
	g := p.data32[q1 : q1+2*stride32 : q1+2*stride32]
	evalVec(wx, &wy, &a[0], &c[0], &e[0], &g[0], out)
}

// evalGo is eval in Go, written out in full, in two stages that keep the
// weights in registers: along η at the cell's two nodes in x, the values
// and their x-derivatives, then along x.
func (p *patch) evalGo(i int, wx *[4]float64, eta float64, out *[maxProps]float64) {
	j, t, h := p.eta.cell(eta)
	wy := basis(t, h)
	y0, y1, y2, y3 := wy[0], wy[1], wy[2], wy[3]
	x0, x1, x2, x3 := wx[0], wx[1], wx[2], wx[3]
	n := i*p.ny + j
	r0 := n * stride
	r1 := r0 + p.ny*stride
	a := p.data[r0 : r0+2*stride : r0+2*stride]
	c := p.data[r1 : r1+2*stride : r1+2*stride]
	for k := 0; k < nExact; k++ {
		o := 4 * k
		a0 := a[o : o+4 : o+4] // node (i, j): f, fx, fy, fxy
		b0 := a[o+stride : o+stride+4 : o+stride+4]
		c0 := c[o : o+4 : o+4]
		d0 := c[o+stride : o+stride+4 : o+stride+4]
		g0 := y0*a0[0] + y1*a0[2] + y2*b0[0] + y3*b0[2]
		gx0 := y0*a0[1] + y1*a0[3] + y2*b0[1] + y3*b0[3]
		g1 := y0*c0[0] + y1*c0[2] + y2*d0[0] + y3*d0[2]
		gx1 := y0*c0[1] + y1*c0[3] + y2*d0[1] + y3*d0[3]
		out[k] = x0*g0 + x1*gx0 + x2*g1 + x3*gx1
	}
	r0 = n * stride32
	r1 = r0 + p.ny*stride32
	e := p.data32[r0 : r0+2*stride32 : r0+2*stride32]
	g := p.data32[r1 : r1+2*stride32 : r1+2*stride32]
	for k := 0; k < maxProps-nExact; k++ {
		o := 4 * k
		a0 := e[o : o+4 : o+4]
		b0 := e[o+stride32 : o+stride32+4 : o+stride32+4]
		c0 := g[o : o+4 : o+4]
		d0 := g[o+stride32 : o+stride32+4 : o+stride32+4]
		g0 := y0*float64(a0[0]) + y1*float64(a0[2]) + y2*float64(b0[0]) + y3*float64(b0[2])
		gx0 := y0*float64(a0[1]) + y1*float64(a0[3]) + y2*float64(b0[1]) + y3*float64(b0[3])
		g1 := y0*float64(c0[0]) + y1*float64(c0[2]) + y2*float64(d0[0]) + y3*float64(d0[2])
		gx1 := y0*float64(c0[1]) + y1*float64(c0[3]) + y2*float64(d0[1]) + y3*float64(d0[3])
		out[nExact+k] = x0*g0 + x1*gx0 + x2*g1 + x3*gx1
	}
}
