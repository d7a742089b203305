package fluid

import (
	"errors"
	"math"
	"slices"
	"testing"

	"github.com/tripoint-thermo/tripoint/helmholtz"
	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/floats/scalar"
)

// The R-134a coefficients are recalled from memory (see r134a.go). The
// checks that decide whether they were recalled right are those that do
// not depend on memory: the IIR reference state built into the ideal-gas
// constants and the auxiliary equations against the equation's own
// saturation (r134a_sat_test.go). The rest are consistency checks, values
// recalled from memory (marked so) and facts of common practice (marked
// so).

func r134a(t testing.TB) *Fluid {
	t.Helper()
	f, err := Lookup("R134a")
	if err != nil {
		t.Fatal(err)
	}
	return f
}

func TestR134aLookup(t *testing.T) {
	t.Parallel()
	f := r134a(t)
	for _, name := range []string{"R134a", "r134a", "R-134a", "r 134a", "HFC-134a", "hfc134a",
		"tetrafluoroethane", "Tetrafluoroethane", "1,1,1,2-Tetrafluoroethane"} {
		g, err := Lookup(name)
		if err != nil || g != f {
			t.Errorf("Lookup(%q) = %p, %v; want the R134a fluid %p", name, g, err, f)
		}
	}
	if !slices.Contains(Names(), "R134a") {
		t.Errorf("Names() = %v, want R134a among them", Names())
	}
	if f.Name() != "R134a" || f.HasNonAnalytic() || f.Reference() != RefDefault {
		t.Errorf("name %q, nonanalytic %v, reference %v", f.Name(), f.HasNonAnalytic(), f.Reference())
	}
	if dh, ds := f.ReferenceOffsets(); dh != 0 || ds != 0 {
		t.Errorf("reference offsets %g, %g; the IIR state is built into the equation", dh, ds)
	}
	// Constants of Tillner-Roth and Baehr (1994), recalled from memory:
	// M = 102.032 g/mol, molar gas constant 8.314471 J/(mol K),
	// Tc = 374.18 K, ρc = 508 kg/m³, triple point 169.85 K, 389.6 Pa,
	// range 169.85-455 K up to 70 MPa.
	tc, rhoc := f.Reducing()
	tp := f.Triple()
	l := f.Limits()
	for _, c := range []struct {
		what      string
		got, want float64
	}{
		{"M", f.MolarMass(), 0.102032},
		{"R", f.GasConstant(), 8.314471 / 0.102032},
		{"Tc", tc, 374.18},
		{"rhoc", rhoc, 508},
		{"Tt", tp.T, 169.85},
		{"pt", tp.P, 389.6},
		{"RhoSolid", tp.RhoSolid, 0},
		{"TMin", l.TMin, 169.85},
		{"TMax", l.TMax, 455},
		{"PMax", l.PMax, 70e6},
	} {
		if !scalar.EqualWithinAbsOrRel(c.got, c.want, 0, 1e-15) {
			t.Errorf("%s = %.17g, want %.17g", c.what, c.got, c.want)
		}
	}
	if p, err := f.Props(f.Critical().T, f.Critical().Rho); p.P != f.Critical().P {
		t.Errorf("Critical().P = %.17g, Props there gives %.17g (%v)", f.Critical().P, p.P, err)
	}
	for _, fn := range []func(float64) (float64, error){f.AuxMeltingPressure, f.AuxSublimationPressure} {
		if _, err := fn(170); !errors.Is(err, ErrUndefined) {
			t.Errorf("R-134a has no solid model: got %v, want ErrUndefined", err)
		}
	}
}

// r134aY returns y = (∂p/∂ρ)_T/(RT) = 1 + 2δαʳ_δ + δ²αʳ_δδ and
// y_δ = ∂y/∂δ = (ρc/RT)(∂²p/∂ρ²)_T of the residual part res at (δ, τ),
// and the sums of the magnitudes of their terms, one per residual term
// (the 1 of the ideal gas included in y's).
func r134aY(res helmholtz.ResidualTerms, delta, tau float64) (y, yd, my, myd float64) {
	y, my = 1, 1
	add := func(t helmholtz.ResidualTerms) {
		r := helmholtz.MustNewResidual(t).Eval(delta, tau)
		a, b := 2*delta*r.D+delta*delta*r.DD, 2*r.D+4*delta*r.DD+delta*delta*r.DDD
		y, yd = y+a, yd+b
		my, myd = my+math.Abs(2*delta*r.D)+math.Abs(delta*delta*r.DD),
			myd+math.Abs(2*r.D)+math.Abs(4*delta*r.DD)+math.Abs(delta*delta*r.DDD)
	}
	for _, t := range res.Power {
		add(helmholtz.ResidualTerms{Power: []helmholtz.Power{t}})
	}
	for _, t := range res.Exponential {
		add(helmholtz.ResidualTerms{Exponential: []helmholtz.Exponential{t}})
	}
	return y, yd, my, myd
}

// TestR134aCriticalPoint checks, without memory, that Critical() is the
// critical point of the equation, and the equation at its reducing point.
func TestR134aCriticalPoint(t *testing.T) {
	t.Parallel()
	f := r134a(t)
	tc, rhoc := f.Reducing()
	c := f.Critical()
	delta, tau := c.Rho/rhoc, tc/c.T

	// (∂p/∂ρ)_T and (∂²p/∂ρ²)_T vanish to rounding at Critical(): y and
	// y_δ, summed term by term, are within 16 ulps of the sum of their
	// terms' magnitudes, plus what the rounding of Critical() itself to
	// float64 (half an ulp in T and ρ) can leave: |y_τ|·ulp(τ) for y
	// (y_δ = 0 there) and |∂y_δ/∂δ|·ulp(δ) + |∂y_δ/∂τ|·ulp(τ) for y_δ
	// (slopes by central differences of the same sums).
	const eps = 0x1p-52
	y, yd, my, myd := r134aY(r134aResidual, delta, tau)
	const h = 1e-6
	yOf := func(d, tt float64) float64 { y, _, _, _ := r134aY(r134aResidual, d, tt); return y }
	ydOf := func(d, tt float64) float64 { _, yd, _, _ := r134aY(r134aResidual, d, tt); return yd }
	yt := (yOf(delta, tau+h) - yOf(delta, tau-h)) / (2 * h)
	ydd := (ydOf(delta+h, tau) - ydOf(delta-h, tau)) / (2 * h)
	ydt := (ydOf(delta, tau+h) - ydOf(delta, tau-h)) / (2 * h)
	by := 16*eps*my + math.Abs(yt)*eps*tau
	byd := 16*eps*myd + math.Abs(ydd)*eps*delta + math.Abs(ydt)*eps*tau
	if math.Abs(y) > by || math.Abs(yd) > byd {
		t.Errorf("at Critical() = %+v: y = %.3g (rounding bound %.3g), y_delta = %.3g (bound %.3g)", c, y, by, yd, byd)
	}
	// And the state is the critical one, not another point of the
	// spinodal: y_δ = 0 at the minimum of y along the isotherm, and it
	// is a genuine critical point (y_τ < 0: cooling by 1e-6·Tc opens a
	// two-phase region, heating closes it) with ∂y_δ/∂δ > 0 (p(ρ) has an
	// inflection, not an extremum, of y there).
	if !(yt < 0) || !(ydd > 0) {
		t.Errorf("at Critical(): y_tau = %g, dy_delta/ddelta = %g; want < 0 and > 0", yt, ydd)
	}
	for _, dT := range []float64{-1e-6, 1e-6} {
		T := c.T * (1 + dT)
		minY := math.Inf(1)
		for k := -200; k <= 200; k++ {
			rho := c.Rho * (1 + 5e-5*float64(k))
			p := f.props(T, rho)
			minY = math.Min(minY, p.DpDrho/(f.r*T))
		}
		if (dT < 0) != (minY < 0) {
			t.Errorf("T = Tc(1%+g): min (dp/drho)_T/RT = %g near rhoc", dT, minY)
		}
	}
	// Props there: the critical state (see Props).
	p, err := f.Props(c.T, c.Rho)
	if err != nil || p.P != c.P || p.Flags != AtCritical || p.DpDrho != 0 || !math.IsInf(p.Cp, 1) ||
		!math.IsInf(p.KappaT, 1) || !math.IsInf(p.Expansivity, 1) {
		t.Errorf("Props(Critical()) = %+v, %v", p, err)
	}

	// Widely quoted critical constants of R-134a (common practice, no
	// source here): 374.21 K, 4.0593 MPa, 511.9 kg/m³, each ±1 in its
	// last digit. They are those of this equation, which is evidence that
	// its coefficients were recalled right.
	if math.Abs(c.T-374.21) > 0.01 || math.Abs(c.P-4.0593e6) > 100 || math.Abs(c.Rho-511.9) > 0.1 {
		t.Errorf("Critical() = %+v; quoted 374.21 K, 4.0593 MPa, 511.9 kg/m3", c)
	}

	// The reducing point lies inside the equation's two-phase region,
	// below its critical temperature: (∂p/∂ρ)_T < 0, so Props returns its
	// values with ErrUnstable, not flagged AtCritical; with no
	// nonanalytic terms cv, cp and w are finite there.
	pr, err := f.Props(tc, rhoc)
	if !(tc < c.T) || !errors.Is(err, ErrUnstable) || pr.DpDrho >= 0 || pr.Flags&AtCritical != 0 ||
		!(pr.Cv > 0) || math.IsInf(pr.Cv, 0) || !(pr.W > 0) || math.IsInf(pr.W, 0) ||
		math.IsNaN(pr.Cp) || math.IsInf(pr.Cp, 0) {
		t.Errorf("Props(Tc, rhoc) = %+v, %v: want finite values with ErrUnstable, (dp/drho)_T < 0", pr, err)
	}
	// The publication's critical pressure, 4.05629 MPa (recalled from
	// memory), is the end point of its vapour-pressure equation at the
	// reducing temperature; the equation of state was not constrained to
	// it, so p(Tc, ρc) matches it only as well as the equation fits the
	// critical region. The bound is of that kind: the rise of the
	// equation's own vapour pressure between the reducing and the
	// critical temperature.
	const pcPub = 4.05629e6
	sr, err := f.SaturationAtT(tc)
	if err != nil {
		t.Fatal(err)
	}
	if d := math.Abs(pr.P - pcPub); d > c.P-sr.P {
		t.Errorf("p(Tc, rhoc) = %.7g Pa, publication's pc %.7g Pa: off by %.3g Pa, more than %.3g Pa", pr.P, pcPub, d, c.P-sr.P)
	}
}

// r134aGrid returns (T, ρ) states across the published range: liquid,
// vapour, supercritical and near-critical, some of them metastable or
// unstable, with p ≤ 70 MPa.
func r134aGrid(f *Fluid) [][2]float64 {
	var g [][2]float64
	for _, T := range []float64{169.85, 180, 200, 230, 260, 273.15, 300, 330, 360, 370, 374, 374.18, 375, 380, 400, 430, 455} {
		for _, rho := range []float64{1e-6, 0.03, 1, 5, 20, 60, 150, 300, 450, 508, 560, 700, 900, 1100, 1300, 1450, 1550, 1600, 1650} {
			// Deep inside the two-phase dome the τ^50 term gives
			// pressures of ±1e20 Pa: states with |p| > 70 MPa are left out.
			if p := f.props(T, rho); math.Abs(p.P) <= f.limits.PCeil {
				g = append(g, [2]float64{T, rho})
			}
		}
	}
	return g
}

// TestR134aVirial checks B and C against the low-density behaviour of the
// compression factor, Z = 1 + Bρ + Cρ² + …
func TestR134aVirial(t *testing.T) {
	t.Parallel()
	f := r134a(t)
	for _, T := range []float64{170, 250, 300, 374.18, 455} {
		B, C, err := f.Virial(T)
		if err != nil {
			t.Fatal(err)
		}
		// Quadratic extrapolation of αʳ_δ/ρc and αʳ_δδ/ρc² from
		// ρ = h, 2h, 3h to ρ = 0; (Z − 1)/ρ = αʳ_δ/ρc.
		_, rhoc := f.Reducing()
		h := 1e-3
		ext := func(q func(r float64) float64) float64 { return 3*q(h) - 3*q(2*h) + q(3*h) }
		b0 := ext(func(rho float64) float64 { _, r := f.Derivs(T, rho); return r.D / rhoc })
		c0 := ext(func(rho float64) float64 { _, r := f.Derivs(T, rho); return r.DD / (rhoc * rhoc) })
		if !scalar.EqualWithinAbsOrRel(B, b0, 0, 1e-9) || !scalar.EqualWithinAbsOrRel(C, c0, 0, 1e-6) {
			t.Errorf("T=%g: B = %.12g, C = %.12g; extrapolated %.12g, %.12g", T, B, C, b0, c0)
		}
		// And the compression factor at low density, Z ≈ 1 + Bρ + Cρ².
		rho := 1e-3
		p, err := f.Props(T, rho)
		if err != nil || !scalar.EqualWithinAbsOrRel(p.Z, 1+B*rho+C*rho*rho, 1e-10, 0) {
			t.Errorf("T=%g: Z(%g) = %.15g, 1 + B rho + C rho^2 = %.15g (%v)", T, rho, p.Z, 1+B*rho+C*rho*rho, err)
		}
		if B >= 0 {
			t.Errorf("T=%g: B = %g m3/kg, want < 0 below the Boyle temperature", T, B)
		}
	}
}

// TestR134aNoNaN evaluates Props over a dense (T, ρ) grid covering and
// surrounding the accepted region, the critical point included: a nil
// error means every field is finite, except at exactly Critical(), where
// cp, κT and the expansivity are +Inf (flag AtCritical); an error is a
// typed *Error wrapping a sentinel.
func TestR134aNoNaN(t *testing.T) {
	t.Parallel()
	f := r134a(t)
	temps := floats.Span(make([]float64, 121), 165, 460)
	c := f.Critical()
	temps = append(temps, 169.85, 374.18, 455, math.Nextafter(169.85, 0), math.Nextafter(455, 1000),
		c.T, math.Nextafter(c.T, 0), math.Nextafter(c.T, 1000))
	dens := floats.LogSpan(make([]float64, 161), 1e-10, 2000)
	dens = append(dens, 508, math.Nextafter(508, 0), math.Nextafter(508, 1000), 1800, math.Nextafter(1800, 1e4),
		c.Rho, math.Nextafter(c.Rho, 0), math.Nextafter(c.Rho, 1000))
	nOK := 0
	for _, T := range temps {
		for _, rho := range dens {
			p, err := f.Props(T, rho)
			fields := []float64{p.T, p.Rho, p.P, p.U, p.H, p.S, p.G, p.F, p.Cv, p.Cp, p.W,
				p.Z, p.JouleThomson, p.KappaT, p.Expansivity, p.DpDrho, p.DpDT}
			if err == nil && T == c.T && rho == c.Rho {
				nOK++
				if p.Flags != AtCritical || p.DpDrho != 0 || !math.IsInf(p.Cp, 1) || !math.IsInf(p.KappaT, 1) ||
					!math.IsInf(p.Expansivity, 1) || !(p.Cv > 0 && p.W > 0) {
					t.Errorf("Props at Critical() = %+v", p)
				}
				for i, v := range fields {
					if math.IsNaN(v) || math.IsInf(v, 0) && v != p.Cp && v != p.KappaT && v != p.Expansivity {
						t.Errorf("Props(%g, %g): field %d = %g", T, rho, i, v)
					}
				}
				continue
			}
			if err == nil {
				nOK++
				for i, v := range fields {
					if math.IsNaN(v) || math.IsInf(v, 0) {
						t.Errorf("Props(%g, %g): field %d = %g", T, rho, i, v)
					}
				}
				if !(p.Cv > 0 && p.Cp >= p.Cv && p.W > 0 && p.DpDrho > 0) {
					t.Errorf("Props(%g, %g) = %+v: want cp >= cv > 0, w > 0", T, rho, p)
				}
				if p.Flags != 0 {
					t.Errorf("Props(%g, %g): flags %v inside the published range", T, rho, p.Flags)
				}
				continue
			}
			var e *Error
			if !errors.As(err, &e) || !(errors.Is(err, ErrOutOfRange) || errors.Is(err, ErrUnstable)) {
				t.Errorf("Props(%g, %g): error %v of type %T", T, rho, err, err)
			}
			if errors.Is(err, ErrUnstable) {
				for i, v := range fields {
					if math.IsNaN(v) {
						t.Errorf("Props(%g, %g) unstable: field %d NaN", T, rho, i)
					}
				}
			}
			// Outside the accepted region: out of range. Props may also
			// report a state of p ≤ 0 (deep in the two-phase region) as
			// out of range.
			q := f.props(T, rho)
			out := T < 169.85 || T > 455 || rho > 1800 || q.P > 70e6
			if oor := errors.Is(err, ErrOutOfRange); out && !oor || !out && oor && q.P > 0 {
				t.Errorf("Props(%g, %g): %v; outside the accepted region: %v", T, rho, err, out)
			}
		}
	}
	if nOK < len(temps)*len(dens)/2 {
		t.Errorf("only %d of %d states accepted", nOK, len(temps)*len(dens))
	}
}

func TestR134aBadInput(t *testing.T) {
	t.Parallel()
	f := r134a(t)
	nan, inf := math.NaN(), math.Inf(1)
	for _, c := range []struct {
		T, rho float64
		want   error
	}{
		{nan, 1, ErrInvalidInput}, {300, nan, ErrInvalidInput}, {inf, 1, ErrInvalidInput},
		{300, inf, ErrInvalidInput}, {-inf, 1, ErrInvalidInput}, {0, 1, ErrInvalidInput},
		{-300, 1, ErrInvalidInput}, {300, 0, ErrInvalidInput}, {300, -1, ErrInvalidInput},
		{169.8, 1, ErrOutOfRange}, {455.1, 1, ErrOutOfRange}, {300, 1801, ErrOutOfRange},
		{170, 1700, ErrOutOfRange}, // about 430 MPa, above 70 MPa
	} {
		if _, err := f.Props(c.T, c.rho); !errors.Is(err, c.want) {
			t.Errorf("Props(%g, %g): %v, want %v", c.T, c.rho, err, c.want)
		}
	}
	for _, fn := range []func(float64) (float64, error){f.AuxVaporPressure, f.AuxLiquidDensity, f.AuxVaporDensity} {
		for _, T := range []float64{nan, -1, 0} {
			if _, err := fn(T); !errors.Is(err, ErrInvalidInput) {
				t.Errorf("aux(%g): %v, want ErrInvalidInput", T, err)
			}
		}
		for _, T := range []float64{169.8, 374.19, inf} {
			if _, err := fn(T); err == nil {
				t.Errorf("aux(%g): no error outside 169.85..374.18 K", T)
			}
		}
	}
	if _, _, err := f.Virial(nan); !errors.Is(err, ErrInvalidInput) {
		t.Errorf("Virial(NaN): %v", err)
	}
}

func TestR134aAllocs(t *testing.T) {
	f := r134a(t)
	var sink Props
	n := testing.AllocsPerRun(100, func() {
		sink, _ = f.Props(300, 1199.6664)
		sink, _ = f.Props(300, 34.19)
		sink, _ = f.Props(400, 300)
	})
	if n != 0 {
		t.Errorf("Props allocates %v times per run", n)
	}
	_ = sink
}

func FuzzR134aProps(f *testing.F) {
	fl, err := Lookup("R134a")
	if err != nil {
		f.Fatal(err)
	}
	for _, s := range [][2]float64{{300, 1200}, {300, 34}, {374.18, 508}, {169.85, 0.028}, {455, 1500}} {
		f.Add(s[0], s[1])
	}
	c := fl.Critical()
	f.Add(c.T, c.Rho)
	f.Fuzz(func(t *testing.T, T, rho float64) {
		p, err := fl.Props(T, rho)
		if err != nil {
			var e *Error
			if !errors.As(err, &e) {
				t.Fatalf("Props(%g, %g): untyped error %v", T, rho, err)
			}
			return
		}
		if p.Flags&AtCritical != 0 {
			// The critical state: cp, κT and the expansivity infinite.
			if T != c.T || rho != c.Rho || !math.IsInf(p.Cp, 1) || math.IsInf(p.Cv, 0) || math.IsInf(p.W, 0) {
				t.Fatalf("Props(%g, %g) = %+v", T, rho, p)
			}
			return
		}
		for _, v := range []float64{p.P, p.U, p.H, p.S, p.G, p.F, p.Cv, p.Cp, p.W, p.Z,
			p.JouleThomson, p.KappaT, p.Expansivity, p.DpDrho, p.DpDT} {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				t.Fatalf("Props(%g, %g) = %+v", T, rho, p)
			}
		}
	})
}
