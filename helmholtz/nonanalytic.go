package helmholtz

import (
	"math"

	"github.com/tripoint-thermo/tripoint/internal/elem"
)

// naTerm is one nonanalytic term, with the constants its derivatives
// need and what its evaluation shares with the term before it: the new…
// flags say which shared values it computes afresh (all of them for the
// first term).
type naTerm struct {
	NonAnalytic
	ib, ta             float64 // 1/β, 2a
	ita                int     // 2a when an integer up to 64, else −1
	aib, aib1, aib2    float64 // A/β, A/β(1/β−1), A/β(1/β−1)(1/β−2)
	bta, bta1, bta2    float64 // 2aB, 2aB(2a−1), 2aB(2a−1)(2a−2)
	bb1, bb12          float64 // b(b−1), b(b−1)(b−2)
	c2, c4, c8, d2, d4 float64 // 2C, 4C², 8C³, 2D, 4D²
	// newBeta: β differs from the previous term's (|δ−1|^(1/β));
	// newA: a differs (|δ−1|^(2a)); newShape: β, a, A or B differ (θ, Δ,
	// ln Δ); newPsi: C or D differ (ψ).
	newBeta, newA, newShape, newPsi bool
}

func compileNonAnalytic(t []NonAnalytic) []naTerm {
	var out []naTerm
	for i, q := range t {
		ib, ta, b := 1/q.Beta, 2*q.SmallA, q.SmallB
		n := naTerm{NonAnalytic: q, ib: ib, ta: ta, ita: -1,
			aib: q.A * ib, aib1: q.A * ib * (ib - 1), aib2: q.A * ib * (ib - 1) * (ib - 2),
			bta: q.B * ta, bta1: q.B * ta * (ta - 1), bta2: q.B * ta * (ta - 1) * (ta - 2),
			bb1: b * (b - 1), bb12: b * (b - 1) * (b - 2),
			c2: 2 * q.C, c4: 4 * q.C * q.C, c8: 8 * q.C * q.C * q.C, d2: 2 * q.D, d4: 4 * q.D * q.D,
			newBeta: true, newA: true, newShape: true, newPsi: true}
		if ta == math.Trunc(ta) && ta <= 64 {
			n.ita = int(ta)
		}
		if i > 0 {
			p := t[i-1]
			n.newBeta = q.Beta != p.Beta
			n.newA = q.SmallA != p.SmallA
			n.newShape = n.newBeta || n.newA || q.A != p.A || q.B != p.B
			n.newPsi = q.C != p.C || q.D != p.D
		}
		out = append(out, n)
	}
	return out
}

// naPowers holds |x|^(1/β − k) and |x|^(2a − k), k = 0..3, x = δ − 1:
// zero at x = 0, since 1/β > 3 and 2a > 3.
type naPowers struct{ p0, p1, p2, p3, s0, s1, s2, s3 float64 }

// update recomputes the powers that term q does not share with the term
// before it; iax = 1/|x|.
func (w *naPowers) update(q *naTerm, ax, iax float64) {
	if ax == 0 {
		return
	}
	if q.newBeta {
		w.p0 = powBeta(ax, q.ib)
		w.p1 = w.p0 * iax
		w.p2 = w.p1 * iax
		w.p3 = w.p2 * iax
	}
	if q.newA {
		if q.ita >= 0 {
			w.s0 = ipow(ax, q.ita)
		} else {
			w.s0 = math.Pow(ax, q.ta)
		}
		w.s1 = w.s0 * iax
		w.s2 = w.s1 * iax
		w.s3 = w.s2 * iax
	}
}

// naShape is the distance function Δ of one shape and its x-derivatives
// (x = δ − 1), with θ, ln Δ and 1/Δ.
type naShape struct {
	th, thx, thxx        float64
	dl, dlx, dlxx, dlxxx float64
	lnDl, idl            float64
}

// set computes Δ = θ² + B|x|^(2a), θ = −y + A|x|^(1/β) (y = τ − 1) and
// their x-derivatives (the third when third is set) for term q; sx is
// the sign of x.
func (s *naShape) set(q *naTerm, w *naPowers, y, sx float64, third bool) {
	s.th = -y + q.A*w.p0
	s.thx = q.aib * w.p1 * sx
	s.thxx = q.aib1 * w.p2
	s.dl = s.th*s.th + q.B*w.s0
	s.dlx = 2*s.th*s.thx + q.bta*w.s1*sx
	s.dlxx = 2*(s.thx*s.thx+s.th*s.thxx) + q.bta1*w.s2
	if third {
		s.dlxxx = 6*s.thx*s.thxx + 2*s.th*q.aib2*w.p3*sx + q.bta2*w.s3*sx
	}
	s.lnDl, s.idl = 0, 0
	if s.dl > 0 {
		s.lnDl = elem.Log(s.dl)
		s.idl = 1 / s.dl
	}
}

// naF is f = Δ^b of one term and its derivatives.
type naF struct {
	f, fx, fxx float64
	r1, rxx    float64 // Δ_x/Δ, Δ_xx/Δ
}

// set computes f = Δ^b and its first two x-derivatives for term q; all
// zero where Δ = 0 (only at δ = τ = 1, where they tend to 0).
func (e *naF) set(q *naTerm, s *naShape) {
	if !(s.dl > 0) {
		*e = naF{}
		return
	}
	b := q.SmallB
	e.f = elem.Exp(b * s.lnDl)
	e.r1 = s.dlx * s.idl
	e.rxx = s.dlxx * s.idl
	e.fx = e.f * b * e.r1
	e.fxx = e.f * (q.bb1*e.r1*e.r1 + b*e.rxx)
}

// naSum returns n·f·g and its first two δ-derivatives for g = δψ, from ψ
// and its x-derivatives ψ_x = −2Cxψ, ψ_xx = (4C²x² − 2C)ψ.
func naSum(q *naTerm, delta, x float64, e *naF, psi float64) (a, d, dd, psix, psixx float64) {
	psix = -q.c2 * x * psi
	psixx = (q.c4*x*x - q.c2) * psi
	g := delta * psi
	gx := psi + delta*psix
	gxx := 2*psix + delta*psixx
	return q.N * e.f * g, q.N * (e.fx*g + e.f*gx), q.N * (e.fxx*g + 2*e.fx*gx + e.f*gxx), psix, psixx
}

// evalNonAnalytic returns the sum of the nonanalytic terms and their plain
// derivatives (DDD when third is set). It is valid at δ = 0 too, where it
// gives the limits.
//
// Terms share with the term before them what they have in common
// (compileNonAnalytic): |δ−1|^(1/β) for the same β, θ, Δ and ln Δ for the
// same shape (β, a, A, B), ψ for the same (C, D); so a family of terms
// costs one power and one logarithm plus one exponential per term.
func (r *Residual) evalNonAnalytic(delta, tau float64, third bool) Derivs {
	var out Derivs
	x := delta - 1
	ax := math.Abs(x)
	iax := 1 / ax
	sx := 1.0
	if x < 0 {
		sx = -1
	}
	y := tau - 1
	singular := false
	minB, nMinB := math.Inf(1), 0.0

	var w naPowers
	var sh naShape
	var e naF
	var psi, psit, psitt float64
	for i := range r.na {
		q := &r.na[i]
		w.update(q, ax, iax)
		if q.newShape {
			sh.set(q, &w, y, sx, third)
		}
		if q.newPsi {
			psi = elem.Exp(-q.C*x*x - q.D*y*y)
			psit = -q.d2 * y * psi
			psitt = (q.d4*y*y - q.d2) * psi
		}
		e.set(q, &sh)
		a, d, dd, psix, psixx := naSum(q, delta, x, &e, psi)
		out.A += a
		out.D += d
		out.DD += dd

		b := q.SmallB
		var ft, ftt, fxt float64
		if sh.dl > 0 {
			rt := -2 * sh.th * sh.idl // Δ_τ/Δ
			ft = e.f * b * rt
			ftt = e.f * (q.bb1*rt*rt + 2*b*sh.idl)
			fxt = e.f * (q.bb1*e.r1*rt - 2*b*sh.thx*sh.idl)
		} else {
			// Δ = 0 only at δ = τ = 1: every derivative of Δ^b but the
			// second τ-derivative tends to 0 there, and that one to +Inf.
			singular = true
			if b < minB {
				minB, nMinB = b, q.N
			} else if b == minB {
				nMinB += q.N
			}
		}
		g := delta * psi
		gx := psi + delta*psix
		gt := delta * psit
		gxt := psit - q.c2*x*gt // ψ_τ + δψ_xτ, ψ_xτ = −2Cx ψ_τ
		out.T += q.N * (ft*g + e.f*gt)
		out.TT += q.N * (ftt*g + 2*ft*gt + e.f*delta*psitt)
		out.DT += q.N * (fxt*g + e.fx*gt + ft*gx + e.f*gxt)
		if third && sh.dl > 0 {
			fxxx := e.f * (q.bb12*e.r1*e.r1*e.r1 + 3*q.bb1*e.r1*e.rxx + b*sh.dlxxx*sh.idl)
			psixxx := (3*q.c4*x - q.c8*x*x*x) * psi
			gxx := 2*psix + delta*psixx
			gxxx := 3*psixx + delta*psixxx
			out.DDD += q.N * (fxxx*g + 3*e.fxx*gx + 3*e.fx*gxx + e.f*gxxx)
		}
	}
	if singular {
		out.TT = math.Copysign(math.Inf(1), nMinB)
	}
	return out
}

// powBeta returns x^e for x > 0, with e = 1/β; the published equations
// have β = 0.3, e = 10/3, where x³·∛x is exact to rounding and several
// times faster than math.Pow (∛x from elem.Cbrt, which does not divide).
func powBeta(x, e float64) float64 {
	if e == 10.0/3 {
		return x * x * x * elem.Cbrt(x)
	}
	return math.Pow(x, e)
}

// ipow returns x^n for n ≥ 0 by repeated squaring.
func ipow(x float64, n int) float64 {
	p := 1.0
	for n > 0 {
		if n&1 != 0 {
			p *= x
		}
		x *= x
		n >>= 1
	}
	return p
}
