// Package helmholtz evaluates the reduced Helmholtz energy of modern
// multiparameter equations of state and its analytic partial derivatives.
//
// An equation of state in this form gives the Helmholtz energy a(T, ρ) of a
// pure fluid as
//
//	a(T, ρ) / (R T) = α(δ, τ) = α°(δ, τ) + αʳ(δ, τ),   δ = ρ/ρc,  τ = Tc/T,
//
// where α° is the ideal-gas part and αʳ the residual part. Every
// thermodynamic property follows from α and its derivatives; package fluid
// turns them into properties. This package knows nothing of fluids, units or
// reference states: it evaluates sums of the term families used by IAPWS-95
// (water), Span–Wagner (carbon dioxide), Tillner-Roth–Baehr (R-134a) and
// similar equations.
//
// Residual term families (Residual):
//
//	Power        n δ^d τ^t
//	Exponential  n δ^d τ^t exp(−δ^c)
//	Gaussian     n δ^d τ^t exp(−α(δ−ε)² − β(τ−γ)²)
//	NonAnalytic  n Δ^b δ ψ,  Δ = θ² + B[(δ−1)²]^a,
//	             θ = (1−τ) + A[(δ−1)²]^(1/(2β)),
//	             ψ = exp(−C(δ−1)² − D(τ−1)²)
//
// Ideal-gas term families (Ideal):
//
//	ln δ + a1 + a2 τ + a3 ln τ + Σ n τ^t + Σ n ln(1 − exp(−θ τ))
//
// One call returns α and its first and second derivatives in δ and τ (mixed
// included) and the third δ-derivative, which a solver for the critical
// point needs (Residual.Eval); Residual.EvalSecond leaves the third out,
// for the properties at (T, ρ). An Isotherm holds the τ-dependent part of
// αʳ at one τ, so that solvers working at one temperature evaluate αʳ and
// its first two δ-derivatives for the δ-dependent part only. Evaluation
// allocates nothing, and compiled Residual and Ideal values are immutable
// and safe for concurrent use.
//
// Speed: the terms are grouped by their exponential exp(−δ^c), the powers
// of δ and τ come from short chains of multiplications (the non-integer
// powers of τ from square roots), Gaussian and nonanalytic terms share
// what they have in common, and the exponentials and logarithms are the
// table-driven kernels of internal/elem. For a fixed set of terms,
// WriteKernel generates EvalSecond as Go source with every coefficient a
// constant and every loop unrolled (a Kernel), which a Residual uses once
// attached with WithKernel: package fluid does so for its equations.
// Accuracy: within 8 ulp of a plain term-by-term evaluation, relative to
// the magnitude of the terms weighted by their condition
// (TestResidualReference; internal/termwise).
//
// References:
//
//	IAPWS R6-95(2018), Revised Release on the IAPWS Formulation 1995 for the
//	  Thermodynamic Properties of Ordinary Water Substance, Tables 4 and 5.
//	R. Span and W. Wagner, J. Phys. Chem. Ref. Data 25, 1509 (1996).
package helmholtz
