package fluid

import (
	"errors"
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/helmholtz"
)

func water(t testing.TB) *Fluid {
	t.Helper()
	f, err := Lookup("water")
	if err != nil {
		t.Fatal(err)
	}
	return f
}

// TestWaterTable6 reproduces IAPWS R6-95(2018) Table 6 (testdata).
func TestWaterTable6(t *testing.T) {
	t.Parallel()
	f := water(t)
	ideal, resid := f.Derivs(500, 838.025) // the state of Table 6
	parts := map[string]helmholtz.Derivs{"ideal": ideal, "residual": resid}
	seen := map[string]bool{}
	for _, row := range readCheckTable(t, "iapws95-table6.csv") {
		d, ok := parts[row.cells["part"]]
		if !ok {
			t.Fatalf("%s: unknown part %q", row.pos, row.cells["part"])
		}
		// The release's names: φ, φ_δ, φ_δδ, φ_τ, φ_ττ, φ_δτ.
		got, ok := map[string]float64{
			"phi": d.A, "phi_d": d.D, "phi_dd": d.DD,
			"phi_t": d.T, "phi_tt": d.TT, "phi_dt": d.DT,
		}[row.cells["derivative"]]
		if !ok {
			t.Fatalf("%s: unknown derivative %q", row.pos, row.cells["derivative"])
		}
		seen[row.cells["part"]+" "+row.cells["derivative"]] = true
		checkPrinted(t, row, "value", got)
	}
	if len(seen) != 12 {
		t.Errorf("Table 6 has %d distinct values, want 12", len(seen))
	}
}

// TestWaterTable7 reproduces IAPWS R6-95(2018) Table 7 (testdata): p, cv,
// w and s at all eleven states.
func TestWaterTable7(t *testing.T) {
	t.Parallel()
	f := water(t)
	rows := readCheckTable(t, "iapws95-table7.csv")
	if len(rows) != 11 {
		t.Fatalf("Table 7 has %d rows, want 11", len(rows))
	}
	for _, row := range rows {
		T, rho := row.float(t, "T_K"), row.float(t, "rho_kg_m3")
		p, err := f.Props(T, rho)
		if err != nil {
			t.Errorf("%s: %v", row.pos, err)
			continue
		}
		checkPrinted(t, row, "p_MPa", p.P/1e6)
		checkPrinted(t, row, "cv_kJ_kgK", p.Cv/1e3)
		checkPrinted(t, row, "w_m_s", p.W)
		checkPrinted(t, row, "s_kJ_kgK", p.S/1e3)
		if p.Flags != 0 {
			t.Errorf("%s: flags %v, want none (inside the published range)", row.pos, p.Flags)
		}
	}
}

// TestWaterCriticalPoint checks the equation at its own critical point
// without memory of any check table: the release's critical parameters are
// Tc = 647.096 K, ρc = 322 kg/m³ and pc = 22.064 MPa (IAPWS R6-95(2018)),
// and the equation was constrained to them with (∂p/∂ρ)_T = 0 and
// (∂²p/∂ρ²)_T = 0 there (from memory of Wagner and Pruß, J. Phys. Chem.
// Ref. Data 31, 387 (2002)). A wrong coefficient of a term that matters at
// δ = τ = 1 shows here at the size of that term.
func TestWaterCriticalPoint(t *testing.T) {
	t.Parallel()
	f := water(t)
	c := f.Critical()
	if c.T != 647.096 || c.Rho != 322 {
		t.Errorf("Critical() = %+v, want T = 647.096 K, Rho = 322 kg/m3", c)
	}
	// pc printed as 22.064 MPa: ±1 in the last digit.
	if math.Abs(c.P-22.064e6) > 1e3 {
		t.Errorf("p(Tc, rhoc) = %.6g Pa, want 22.064 MPa", c.P)
	}
	// The nonanalytic terms add nothing to αʳ_δ, αʳ_δδ, αʳ_δδδ at δ = τ = 1
	// (their limits are 0), so these are the analytic parts.
	_, r := f.Derivs(c.T, c.Rho)
	dp := 1 + 2*r.D + r.DD        // (∂p/∂ρ)_T / (RT)
	d2p := 2*r.D + 4*r.DD + r.DDD // ρc (∂²p/∂ρ²)_T / (RT)
	if math.Abs(dp) > 1e-6 || math.Abs(d2p) > 1e-4 {
		t.Errorf("at (Tc, rhoc): (dp/drho)/RT = %g, rhoc (d2p/drho2)/RT = %g; want about 0", dp, d2p)
	}
}

// TestWaterAtCritical checks the contract at exactly (Tc, ρc) and next to
// it (DESIGN.md): Cv = Cp = +Inf, W = 0 and AtCritical exactly there;
// finite values, without the flag, a hair away on each side in T and ρ.
func TestWaterAtCritical(t *testing.T) {
	t.Parallel()
	f := water(t)
	tc, rhoc := f.Reducing()
	p, err := f.Props(tc, rhoc)
	if err != nil {
		t.Fatal(err)
	}
	if !math.IsInf(p.Cv, 1) || !math.IsInf(p.Cp, 1) || p.W != 0 || p.Flags&AtCritical == 0 {
		t.Errorf("at (Tc, rhoc): Cv = %v, Cp = %v, W = %v, flags %v; want +Inf, +Inf, 0, AtCritical",
			p.Cv, p.Cp, p.W, p.Flags)
	}
	if !math.IsInf(p.KappaT, 1) || !math.IsInf(p.Expansivity, 1) || p.DpDrho != 0 {
		t.Errorf("at (Tc, rhoc): KappaT = %v, Expansivity = %v, DpDrho = %v; want +Inf, +Inf, 0",
			p.KappaT, p.Expansivity, p.DpDrho)
	}
	for name, v := range floatFields(p) {
		if math.IsNaN(v) {
			t.Errorf("at (Tc, rhoc): %s is NaN", name)
		}
	}
	// μJT → 1/(∂p/∂T)_ρ as cp, β → ∞.
	if math.Abs(p.JouleThomson*p.DpDT-1) > 1e-15 {
		t.Errorf("at (Tc, rhoc): JouleThomson = %v, want 1/DpDT = %v", p.JouleThomson, 1/p.DpDT)
	}

	type near struct {
		name   string
		T, rho float64
	}
	var pts []near
	for _, s := range []float64{-1, 1} {
		pts = append(pts,
			near{"T(1±1e-12)", tc * (1 + s*1e-12), rhoc},
			near{"rho(1±1e-12)", tc, rhoc * (1 + s*1e-12)},
			near{"T next float", math.Nextafter(tc, tc+s), rhoc},
			near{"rho next float", tc, math.Nextafter(rhoc, rhoc+s)},
			near{"both 1e-12", tc * (1 + s*1e-12), rhoc * (1 + s*1e-12)},
		)
	}
	at := p
	for _, q := range pts {
		p, err := f.Props(q.T, q.rho)
		if err != nil && !errors.Is(err, ErrUnstable) {
			t.Errorf("%s: %v", q.name, err)
			continue
		}
		// Below Tc on the critical isochore the state lies inside the
		// spinodal: its values come with ErrUnstable.
		if (err != nil) != (p.DpDrho <= 0) {
			t.Errorf("%s: DpDrho = %g with error %v", q.name, p.DpDrho, err)
		}
		if p.Flags&AtCritical != 0 {
			t.Errorf("%s: flagged AtCritical", q.name)
		}
		for name, v := range floatFields(p) {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				t.Errorf("%s (T = %.17g K, rho = %.17g kg/m3): %s = %v", q.name, q.T, q.rho, name, v)
			}
		}
		if err == nil && (p.Cv <= 0 || p.Cp < p.Cv || p.W <= 0) {
			t.Errorf("%s: Cv = %g, Cp = %g, W = %g; want 0 < Cv <= Cp, W > 0", q.name, p.Cv, p.Cp, p.W)
		}
		// Everything but the divergent quantities is continuous there.
		for _, v := range [][3]float64{{p.P, at.P, 1e-9}, {p.H, at.H, 1e-9}, {p.S, at.S, 1e-9}, {p.DpDT, at.DpDT, 1e-6}} {
			if math.Abs(v[0]-v[1]) > v[2]*math.Abs(v[1]) {
				t.Errorf("%s: %v jumps from %v at the critical point", q.name, v[0], v[1])
			}
		}
	}
}

// TestWaterReferenceState checks the release's reference state without
// fitted offsets: u = 0 and s = 0 for the saturated liquid at the triple
// point, 273.16 K (IAPWS R6-95(2018), which chose the constants n°1 and
// n°2 so), at the saturated-liquid density 999.793 kg/m³ (from
// memory of IAPWS R6-95 Table 13). The bound is what the six printed digits
// of that density allow: half a unit, 0.0005 kg/m³, times (∂u/∂ρ)_T and
// (∂s/∂ρ)_T, doubled.
func TestWaterReferenceState(t *testing.T) {
	t.Parallel()
	f := water(t)
	const T, rho, drho = 273.16, 999.793, 0.0005
	p, err := f.Props(T, rho)
	if err != nil {
		t.Fatal(err)
	}
	// (∂s/∂ρ)_T = −(∂p/∂T)_ρ/ρ²; (∂u/∂ρ)_T = (p − T(∂p/∂T)_ρ)/ρ².
	dsdrho := -p.DpDT / (rho * rho)
	dudrho := (p.P - T*p.DpDT) / (rho * rho)
	if tol := 2 * drho * math.Abs(dudrho); math.Abs(p.U) > tol {
		t.Errorf("u = %g J/kg, want 0 within %g", p.U, tol)
	}
	if tol := 2 * drho * math.Abs(dsdrho); math.Abs(p.S) > tol {
		t.Errorf("s = %g J/(kg K), want 0 within %g", p.S, tol)
	}
}
