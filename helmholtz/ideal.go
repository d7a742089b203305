package helmholtz

import (
	"fmt"
	"math"

	"github.com/tripoint-thermo/tripoint/internal/elem"
)

// IdealPower is the ideal-gas term n τ^t.
type IdealPower struct {
	N float64 // coefficient n
	T float64 // exponent t ≠ 0
}

// PlanckEinstein is the ideal-gas term n ln(1 − exp(−θ τ)), from a
// vibrational mode of characteristic reduced temperature θ > 0.
type PlanckEinstein struct {
	N     float64 // coefficient n
	Theta float64 // θ
}

// IdealTerms lists the terms of an ideal-gas Helmholtz energy
//
//	α°(δ, τ) = ln δ + A1 + A2 τ + LogTau ln τ + Σ n τ^t + Σ n ln(1 − exp(−θ τ)).
type IdealTerms struct {
	A1, A2         float64 // constant and linear terms (they fix the reference state)
	LogTau         float64 // coefficient of ln τ
	Power          []IdealPower
	PlanckEinstein []PlanckEinstein
}

// Ideal is a compiled ideal-gas Helmholtz energy. It is immutable and safe
// for concurrent use.
//
// Evaluation takes the powers of τ by multiplication and square roots (as
// Residual does) and the exponentials and logarithms of the
// Planck–Einstein terms from internal/elem.
type Ideal struct {
	t     IdealTerms
	tp    powPlan
	pslot []uint8 // slot of τ^t of each power term
}

// NewIdeal compiles the terms t. It returns an error for a non-finite
// coefficient, t = 0 in a power term or θ ≤ 0.
func NewIdeal(t IdealTerms) (*Ideal, error) {
	if !finite(t.A1, t.A2, t.LogTau) {
		return nil, fmt.Errorf("helmholtz: ideal-gas constants %g %g %g not finite", t.A1, t.A2, t.LogTau)
	}
	for _, p := range t.Power {
		if !finite(p.N, p.T) || p.T == 0 {
			return nil, fmt.Errorf("helmholtz: ideal-gas power term %+v out of range", p)
		}
	}
	for _, p := range t.PlanckEinstein {
		if !finite(p.N, p.Theta) || p.Theta <= 0 {
			return nil, fmt.Errorf("helmholtz: Planck–Einstein term %+v out of range", p)
		}
	}
	c := t
	c.Power = append([]IdealPower(nil), t.Power...)
	c.PlanckEinstein = append([]PlanckEinstein(nil), t.PlanckEinstein...)
	id := &Ideal{t: c}
	var exps []float64
	for _, p := range t.Power {
		exps = append(exps, p.T)
	}
	tp, slots, ok := newPowPlan(exps, 0)
	if !ok {
		return nil, fmt.Errorf("helmholtz: too many distinct ideal-gas powers")
	}
	id.tp = tp
	for _, s := range slots {
		id.pslot = append(id.pslot, uint8(s))
	}
	return id, nil
}

// MustNewIdeal is like NewIdeal but panics on error, for package-level
// tables of published coefficients.
func MustNewIdeal(t IdealTerms) *Ideal {
	id, err := NewIdeal(t)
	if err != nil {
		panic(err)
	}
	return id
}

// Terms returns a copy of the terms id was compiled from.
func (id *Ideal) Terms() IdealTerms {
	c := id.t
	c.Power = append([]IdealPower(nil), id.t.Power...)
	c.PlanckEinstein = append([]PlanckEinstein(nil), id.t.PlanckEinstein...)
	return c
}

// Eval returns α° and its derivatives at (δ, τ), δ > 0, τ > 0. The mixed
// derivative is zero, and the δ-derivatives are those of ln δ.
func (id *Ideal) Eval(delta, tau float64) Derivs {
	a, t1, t2 := id.EvalTau(tau)
	return id.withTau(delta, tau, a, t1, t2)
}

// EvalPair returns α° and its derivatives at (δ1, τ) and (δ2, τ), as two
// calls of Eval would, with the τ-dependent part evaluated once (the two
// phases of a saturation share τ).
func (id *Ideal) EvalPair(delta1, delta2, tau float64) (d1, d2 Derivs) {
	a, t1, t2 := id.EvalTau(tau)
	return id.withTau(delta1, tau, a, t1, t2), id.withTau(delta2, tau, a, t1, t2)
}

// withTau completes α° at (δ, τ) from EvalTau's results.
func (id *Ideal) withTau(delta, tau, a, t1, t2 float64) Derivs {
	return Derivs{
		A:   elem.Log(delta) + id.t.A1 + id.t.A2*tau + a,
		D:   1 / delta,
		T:   id.t.A2 + t1,
		DD:  -1 / (delta * delta),
		TT:  t2,
		DDD: 2 / (delta * delta * delta),
	}
}

// EvalTau returns the τ-dependent part of α° without ln δ + A1 + A2 τ, and
// the first and second τ-derivatives of α° (the linear term included in the
// first).
func (id *Ideal) EvalTau(tau float64) (a, t1, t2 float64) {
	it := 1 / tau
	if id.t.LogTau != 0 {
		a = id.t.LogTau * elem.Log(tau)
		t1 = id.t.LogTau * it
		t2 = -id.t.LogTau * it * it
	}
	if len(id.t.Power) > 0 {
		var tv [maxSlots]float64
		id.tp.eval(&tv, tau)
		for i, p := range id.t.Power {
			v := p.N * tv[id.pslot[i]&(maxSlots-1)]
			a += v
			t1 += v * p.T * it
			t2 += v * p.T * (p.T - 1) * it * it
		}
	}
	for _, p := range id.t.PlanckEinstein {
		x := p.Theta * tau
		e := elem.Exp(-x)
		om := 1 - e // 1 − e^(−x), to rounding for x ≥ ln 2
		var lom float64
		switch {
		case x < math.Ln2:
			om = -math.Expm1(-x)
			lom = elem.Log(om)
		case e <= 0x1p-7:
			lom = elem.Log1pSmall(-e) // a polynomial, without Log's reduction
		default:
			lom = elem.Log(om)
		}
		a += p.N * lom
		iom := 1 / om
		r := e * iom
		nt := p.N * p.Theta
		t1 += nt * r
		t2 -= nt * p.Theta * r * iom
	}
	return a, t1, t2
}
