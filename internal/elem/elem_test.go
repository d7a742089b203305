package elem

import (
	"math"
	"math/big"
	"math/rand/v2"
	"testing"
)

// ulpDist returns the distance between a and b in units in the last
// place: the number of doubles between them, counting one end; 0 for two
// NaNs or two equal values (±0 are equal); +Inf for NaN against a number
// or values of opposite signs apart from zeros.
func ulpDist(a, b float64) float64 {
	switch {
	case math.IsNaN(a) && math.IsNaN(b), a == b:
		return 0
	case math.IsNaN(a) || math.IsNaN(b):
		return math.Inf(1)
	case math.Signbit(a) != math.Signbit(b) && a != 0 && b != 0:
		return math.Inf(1)
	}
	ia, ib := math.Float64bits(math.Abs(a)), math.Float64bits(math.Abs(b))
	if ia > ib {
		return float64(ia - ib)
	}
	return float64(ib - ia)
}

// alike reports whether a and b are the same value: NaN alike NaN, and the
// signs of zeros must agree.
func alike(a, b float64) bool {
	switch {
	case math.IsNaN(a) && math.IsNaN(b):
		return true
	case a == b:
		return math.Signbit(a) == math.Signbit(b)
	}
	return false
}

var (
	specialExpIn = []float64{
		math.Inf(1), math.Inf(-1), math.NaN(), 0, math.Copysign(0, -1),
		5e-324, -5e-324, 1e-300, -1e-300, 0x1p-54, -0x1p-54,
		708, -708, 708.0000000000001, -708.0000000000001,
		709.782712893384, 709.7827128933841, 710, 1000, math.MaxFloat64,
		-708.3964185322641, -708.4, -720, -744.44007192138, -745.1332191019411,
		-745.1332191019412, -746, -1000, -math.MaxFloat64,
	}
	specialLogIn = []float64{
		math.Inf(1), math.Inf(-1), math.NaN(), 0, math.Copysign(0, -1),
		-1, -5e-324, 5e-324, 1e-310, 2.2250738585072014e-308, math.MaxFloat64,
		1, math.Nextafter(1, 2), math.Nextafter(1, 0), 2, 0.5, math.E,
		1 - 1.0/256, 1 + 1.0/128, 0.6875, 1.375, math.Nextafter(1.375, 0),
	}
	specialCbrtIn = []float64{
		math.Inf(1), math.Inf(-1), math.NaN(), 0, math.Copysign(0, -1),
		5e-324, -5e-324, 1e-310, 2.2250738585072014e-308, -2.2250738585072014e-308,
		math.MaxFloat64, -math.MaxFloat64, 1, -1, 8, -8, 27, 0.125, 2, 4, 1e-300, 1e300,
		math.Nextafter(2, 0), math.Nextafter(1, 2), 1 + 1.0/128, 1 + 1.0/64, 1 + 3.0/128,
	}
	specialLog1pIn = []float64{
		math.Inf(1), math.Inf(-1), math.NaN(), 0, math.Copysign(0, -1), -1, -2,
		5e-324, -5e-324, 1e-310, 1e-20, -1e-20, 1.0 / 128, -1.0 / 128,
		math.Nextafter(1.0/128, 1), math.Nextafter(-1.0/128, -1), 0.5, -0.5, 1e300,
	}
)

// TestExpSpecial: every special value and every edge of the fast path
// against math.Exp. Below expMax both are evaluated; beyond it Exp is
// math.Exp, so the results must be alike.
func TestExpSpecial(t *testing.T) {
	t.Parallel()
	for _, x := range specialExpIn {
		got, want := Exp(x), math.Exp(x)
		if math.Abs(x) > expMax || math.IsNaN(x) {
			if !alike(got, want) {
				t.Errorf("Exp(%v) = %v, math.Exp %v", x, got, want)
			}
			continue
		}
		if d := ulpDist(got, want); d > 1 {
			t.Errorf("Exp(%v) = %v, math.Exp %v: %v ulp apart", x, got, want, d)
		}
	}
}

// TestCbrtSpecial: the special values of math.Cbrt, the powers of two
// and cubes, the edges of the table intervals and the normal range.
// Outside the normal range Cbrt is math.Cbrt, so the results must be
// alike; cubes of small integers and powers of eight are exact.
func TestCbrtSpecial(t *testing.T) {
	t.Parallel()
	for _, x := range specialCbrtIn {
		got, want := Cbrt(x), math.Cbrt(x)
		if !(math.Abs(x) >= 2.2250738585072014e-308) || math.IsInf(x, 0) {
			if !alike(got, want) {
				t.Errorf("Cbrt(%v) = %v, math.Cbrt %v", x, got, want)
			}
			continue
		}
		if d := ulpDist(got, want); d > 1 {
			t.Errorf("Cbrt(%v) = %v, math.Cbrt %v: %v ulp apart", x, got, want, d)
		}
	}
	for _, c := range []struct{ x, want float64 }{{1, 1}, {8, 2}, {27, 3}, {-64, -4}, {0.125, 0.5}, {0x1p-999, 0x1p-333}, {0x1p1023, 0x1p341}} {
		if got := Cbrt(c.x); got != c.want {
			t.Errorf("Cbrt(%v) = %v, want %v exactly", c.x, got, c.want)
		}
	}
}

// TestLog1pSpecial: the special values of math.Log1p and the edges of the
// fast path. Outside it Log1p is math.Log1p, so the results must be alike.
func TestLog1pSpecial(t *testing.T) {
	t.Parallel()
	for _, x := range specialLog1pIn {
		got, want := Log1p(x), math.Log1p(x)
		if !(math.Abs(x) <= log1pSmall) {
			if !alike(got, want) {
				t.Errorf("Log1p(%v) = %v, math.Log1p %v", x, got, want)
			}
			continue
		}
		if d := ulpDist(got, want); d > 1 || (x == 0 && !alike(got, x)) {
			t.Errorf("Log1p(%v) = %v, math.Log1p %v: %v ulp apart", x, got, want, d)
		}
	}
}

// TestLogSpecial: the special values of math.Log and the edges of the
// table intervals.
func TestLogSpecial(t *testing.T) {
	t.Parallel()
	for _, x := range specialLogIn {
		got, want := Log(x), math.Log(x)
		if !(x >= 2.2250738585072014e-308) || math.IsInf(x, 1) {
			if !alike(got, want) {
				t.Errorf("Log(%v) = %v, math.Log %v", x, got, want)
			}
			continue
		}
		if d := ulpDist(got, want); d > 1 {
			t.Errorf("Log(%v) = %v, math.Log %v: %v ulp apart", x, got, want, d)
		}
	}
	if got := Log(1); !alike(got, 0) {
		t.Errorf("Log(1) = %v, want +0", got)
	}
}

// sweep compares f with ref on n arguments from gen. A distance of more
// than 1 ulp is accepted only where the exact value (exact, from
// math/big) shows that ref itself errs by more than 1 ulp and f is within
// maxKernelUlp of it: math.Exp on amd64 (an assembly kernel) errs by up
// to about 1.65 ulp. sweep returns the largest distance with its argument,
// the number of such arguments, and the number of arguments that fail.
func sweep(n int, gen func(*rand.Rand) float64, f, ref func(float64) float64, exact func(float64) *big.Float) (worst, at float64, refWrong, bad int) {
	rng := rand.New(rand.NewPCG(8, 1))
	for range n {
		x := gen(rng)
		got, want := f(x), ref(x)
		d := ulpDist(got, want)
		if d > worst || math.IsNaN(d) {
			worst, at = d, x
		}
		if d <= 1 {
			continue
		}
		if d <= 2 && !math.IsInf(want, 0) && want != 0 {
			e := exact(x)
			if math.Abs(ulpErr(got, e)) <= maxKernelUlp && math.Abs(ulpErr(want, e)) > 1 {
				refWrong++
				continue
			}
		}
		bad++
	}
	return worst, at, refWrong, bad
}

// points returns the number of arguments per sweep: millions, fewer
// under -short.
func points() int {
	if testing.Short() {
		return 1 << 19
	}
	return 1 << 22
}

// TestExpAgainstMath: Exp within 1 ulp of math.Exp on millions of
// arguments over its whole domain: uniform over the range where the
// results are finite and nonzero and beyond it, uniform over the range the
// equations of state use (exp(−δ^c) and the Planck–Einstein and Gaussian
// terms: about −1e6 to 1), log-uniform small magnitudes, and random bit
// patterns (every binade, the special values). The exception: about one
// argument in 80 000 where math.Exp (the amd64 assembly kernel) errs by
// more than 1 ulp and Exp, within 0.51 ulp of the exact value, lies 2 ulp
// from it (see sweep).
func TestExpAgainstMath(t *testing.T) {
	t.Parallel()
	gens := map[string]func(*rand.Rand) float64{
		"uniform[-750,750]": func(r *rand.Rand) float64 { return 1500*r.Float64() - 750 },
		"uniform[-40,2]":    func(r *rand.Rand) float64 { return 42*r.Float64() - 40 },
		"tiny":              func(r *rand.Rand) float64 { return math.Copysign(math.Exp2(-60*r.Float64()), r.Float64()-0.5) },
		"bits":              func(r *rand.Rand) float64 { return math.Float64frombits(r.Uint64()) },
		"bits|x|<1024": func(r *rand.Rand) float64 {
			return math.Float64frombits(r.Uint64() & (1<<63 | 0x408fffffffffffff))
		},
	}
	for name, gen := range gens {
		worst, at, refWrong, bad := sweep(points(), gen, Exp, math.Exp, bigExp)
		if bad > 0 {
			t.Errorf("%s: %d arguments more than 1 ulp from math.Exp; worst %v ulp at x = %v", name, bad, worst, at)
		}
		t.Logf("%s: at most %v ulp from math.Exp (x = %v); %d of %d arguments 2 ulp apart where math.Exp errs by more than 1 ulp",
			name, worst, at, refWrong, points())
	}
}

// TestLogAgainstMath: Log within 1 ulp of math.Log on millions of
// arguments over its whole domain: random bit patterns of positive and
// negative doubles (every binade, subnormals, the special values), the
// range of the equations' arguments (reduced densities and temperatures,
// the Planck–Einstein factors, the distance function Δ: about 1e-30 to
// 1e4), and arguments within 1e-6 and 1e-2 of 1.
func TestLogAgainstMath(t *testing.T) {
	t.Parallel()
	gens := map[string]func(*rand.Rand) float64{
		"bits":       func(r *rand.Rand) float64 { return math.Float64frombits(r.Uint64()) },
		"bits>0":     func(r *rand.Rand) float64 { return math.Float64frombits(r.Uint64() >> 1) },
		"1e-30..1e4": func(r *rand.Rand) float64 { return math.Pow(10, 34*r.Float64()-30) },
		"[0.5,2]":    func(r *rand.Rand) float64 { return 0.5 + 1.5*r.Float64() },
		"1±1e-2":     func(r *rand.Rand) float64 { return 1 + 2e-2*(r.Float64()-0.5) },
		"1±1e-6":     func(r *rand.Rand) float64 { return 1 + 2e-6*(r.Float64()-0.5) },
	}
	againstMath(t, "math.Log", gens, Log, math.Log, func(x float64) *big.Float { return bigLog(newBig(x)) })
}

// TestCbrtAgainstMath: Cbrt within 1 ulp of math.Cbrt on millions of
// arguments over its whole domain: random bit patterns (every binade,
// subnormals, both signs, the special values), the range of the
// nonanalytic terms' |δ − 1| (about 1e-12 to 10) and [1, 8), every
// interval of the table with every exponent residue.
func TestCbrtAgainstMath(t *testing.T) {
	t.Parallel()
	gens := map[string]func(*rand.Rand) float64{
		"bits":        func(r *rand.Rand) float64 { return math.Float64frombits(r.Uint64()) },
		"1e-12..10":   func(r *rand.Rand) float64 { return math.Pow(10, 13*r.Float64()-12) },
		"[1,8)":       func(r *rand.Rand) float64 { return 1 + 7*r.Float64() },
		"-1e-3..-1e3": func(r *rand.Rand) float64 { return -math.Pow(10, 6*r.Float64()-3) },
	}
	againstMath(t, "math.Cbrt", gens, Cbrt, math.Cbrt, func(x float64) *big.Float {
		v := bigCbrt(newBig(math.Abs(x)))
		if x < 0 {
			v.Neg(v)
		}
		return v
	})
}

// TestLog1pAgainstMath: Log1p within 1 ulp of math.Log1p on its fast
// path, |x| ≤ 2^-7 (uniform and log-uniform magnitudes of both signs),
// and alike it beyond.
func TestLog1pAgainstMath(t *testing.T) {
	t.Parallel()
	gens := map[string]func(*rand.Rand) float64{
		"uniform":     func(r *rand.Rand) float64 { return log1pSmall * (2*r.Float64() - 1) },
		"log-uniform": func(r *rand.Rand) float64 { return math.Copysign(math.Exp2(-7-60*r.Float64()), r.Float64()-0.5) },
		"bits":        func(r *rand.Rand) float64 { return math.Float64frombits(r.Uint64()) },
	}
	againstMath(t, "math.Log1p", gens, Log1p, math.Log1p, bigLog1p)
}

// againstMath fails where f lies more than 1 ulp from ref (the math
// package's function, named refName) at any of points() arguments from
// each of gens — also where exact shows ref itself to err, which sweep
// would otherwise excuse — and logs the worst case.
func againstMath(t *testing.T, refName string, gens map[string]func(*rand.Rand) float64,
	f, ref func(float64) float64, exact func(float64) *big.Float) {
	t.Helper()
	for name, gen := range gens {
		worst, at, refWrong, bad := sweep(points(), gen, f, ref, exact)
		if bad > 0 || refWrong > 0 {
			t.Errorf("%s: %d arguments more than 1 ulp from %s; worst %v ulp at x = %v", name, bad+refWrong, refName, worst, at)
		}
		t.Logf("%s: at most %v ulp from %s (x = %v)", name, worst, refName, at)
	}
}

// maxKernelUlp bounds the error of the kernels against the exact value:
// half an ulp for the final rounding and a few hundredths for the rest
// (the analysis in their doc comments).
const maxKernelUlp = 0.53

// accuracy returns the largest error of f in ulp against the exact
// values, over n arguments from gen (fewer under -short), with its
// argument.
func accuracy(n int, seed uint64, gen func(i int, r *rand.Rand) float64, f func(float64) float64,
	exact func(float64) *big.Float) (worst, at float64) {
	if testing.Short() {
		n /= 10
	}
	rng := rand.New(rand.NewPCG(seed, seed+1))
	for i := range n {
		x := gen(i, rng)
		if e := math.Abs(ulpErr(f(x), exact(x))); e > worst {
			worst, at = e, x
		}
	}
	return worst, at
}

// TestKernelAccuracy: Exp against e^x, Log against ln x, Cbrt against ∛x
// and Log1p against ln(1 + x) from math/big, on samples of the fast
// paths' ranges (and near 1 for Log).
func TestKernelAccuracy(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		name  string
		seed  uint64
		gen   func(i int, r *rand.Rand) float64
		f     func(float64) float64
		exact func(float64) *big.Float
	}{
		{"Exp", 3, func(i int, r *rand.Rand) float64 {
			if i%2 == 0 {
				return 4*r.Float64() - 2
			}
			return 2*expMax*r.Float64() - expMax
		}, Exp, bigExp},
		{"Log", 5, func(i int, r *rand.Rand) float64 {
			switch i % 3 {
			case 1:
				return 0.5 + 1.5*r.Float64()
			case 2:
				return 1 + 0.02*(r.Float64()-0.5)
			}
			return math.Float64frombits(r.Uint64()>>2 + 0x2000000000000000)
		}, Log, func(x float64) *big.Float { return bigLog(newBig(x)) }},
		{"Cbrt", 7, func(i int, r *rand.Rand) float64 {
			if i%2 == 0 {
				return 1 + 7*r.Float64()
			}
			return math.Float64frombits(r.Uint64()>>2 + 0x2000000000000000)
		}, Cbrt, func(x float64) *big.Float { return bigCbrt(newBig(x)) }},
		{"Log1p", 9, func(i int, r *rand.Rand) float64 {
			if i%2 == 0 {
				return log1pSmall * (2*r.Float64() - 1)
			}
			return math.Copysign(math.Exp2(-7-50*r.Float64()), r.Float64()-0.5)
		}, Log1p, bigLog1p},
	} {
		worst, at := accuracy(20000, c.seed, c.gen, c.f, c.exact)
		if worst > maxKernelUlp {
			t.Errorf("%s: %v ulp from the exact value at x = %v, want at most %v", c.name, worst, at, maxKernelUlp)
		}
		t.Logf("%s: at most %.4f ulp from the exact value (x = %v)", c.name, worst, at)
	}
}

// FuzzKernels: for any argument, Exp, Log, Cbrt and Log1p are within 1
// ulp of math.Exp, math.Log, math.Cbrt and math.Log1p (alike for the special values; Exp 2 ulp from math.Exp only
// where it is within maxKernelUlp of the exact value), without panicking.
func FuzzKernels(f *testing.F) {
	for _, x := range specialExpIn {
		f.Add(x)
	}
	for _, x := range specialLogIn {
		f.Add(x)
	}
	for _, x := range specialCbrtIn {
		f.Add(x)
	}
	f.Fuzz(func(t *testing.T, x float64) {
		if d := ulpDist(Cbrt(x), math.Cbrt(x)); !(d <= 1) {
			t.Errorf("Cbrt(%v) = %v, math.Cbrt %v", x, Cbrt(x), math.Cbrt(x))
		}
		if d := ulpDist(Log1p(x), math.Log1p(x)); !(d <= 1) {
			t.Errorf("Log1p(%v) = %v, math.Log1p %v", x, Log1p(x), math.Log1p(x))
		}
		if d := ulpDist(Exp(x), math.Exp(x)); !(d <= 1) &&
			!(d <= 2 && math.Abs(ulpErr(Exp(x), bigExp(x))) <= maxKernelUlp) {
			t.Errorf("Exp(%v) = %v, math.Exp %v", x, Exp(x), math.Exp(x))
		}
		if d := ulpDist(Log(x), math.Log(x)); !(d <= 1) {
			t.Errorf("Log(%v) = %v, math.Log %v", x, Log(x), math.Log(x))
		}
	})
}
