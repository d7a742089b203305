package helmholtz

// Derivs holds a reduced Helmholtz energy α(δ, τ) and its partial
// derivatives at one (δ, τ). All are dimensionless.
type Derivs struct {
	A   float64 // α
	D   float64 // ∂α/∂δ
	T   float64 // ∂α/∂τ
	DD  float64 // ∂²α/∂δ²
	DT  float64 // ∂²α/∂δ∂τ
	TT  float64 // ∂²α/∂τ²
	DDD float64 // ∂³α/∂δ³
}

// Add returns the term-by-term sum of d and e.
func (d Derivs) Add(e Derivs) Derivs {
	return Derivs{
		A: d.A + e.A, D: d.D + e.D, T: d.T + e.T,
		DD: d.DD + e.DD, DT: d.DT + e.DT, TT: d.TT + e.TT, DDD: d.DDD + e.DDD,
	}
}

// Delta returns the part of d that a DeltaDerivs holds: α, ∂α/∂δ and
// ∂²α/∂δ².
func (d Derivs) Delta() DeltaDerivs { return DeltaDerivs{A: d.A, D: d.D, DD: d.DD} }
