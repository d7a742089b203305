package fluid

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// refExists says for which fluids each reference state exists: CO2 has no
// liquid at 101.325 kPa (its triple point is at 0.518 MPa); water's IIR and
// ASHRAE states lie below its triple point, 273.16 K (DESIGN.md). Other
// fluids are judged from their triple and critical points.
var refExists = map[string]map[RefState]bool{
	"CO2":   {RefIIR: true, RefASHRAE: true, RefNBP: false},
	"water": {RefIIR: false, RefASHRAE: false, RefNBP: true},
}

func refExpected(f *Fluid, r RefState) bool {
	if m, ok := refExists[f.Name()]; ok {
		return m[r]
	}
	d, _ := r.definition()
	tp, c := f.Triple(), f.Critical()
	if d.T > 0 {
		return d.T >= tp.T && d.T <= c.T
	}
	return d.P >= tp.P && d.P <= c.P
}

// TestWithReference: each reference state reproduces its defining values
// (h and s of the saturated liquid at its temperature or pressure) to
// 1e-9 relative (of R·Tc and R where the value is 0), through the
// equation's own saturation solved on the new fluid.
func TestWithReference(t *testing.T) {
	t.Parallel()
	for _, f := range allFluids(t) {
		for _, r := range []RefState{RefIIR, RefASHRAE, RefNBP} {
			g, err := f.WithReference(r)
			if !refExpected(f, r) {
				var e *Error
				if !errors.Is(err, ErrUndefined) || !errors.As(err, &e) || g != nil {
					t.Errorf("%s %v: %v, %v; want ErrUndefined", f.Name(), r, g, err)
				} else if msg := err.Error(); !isASCII(msg) || !strings.Contains(msg, "does not exist") {
					t.Errorf("%s %v: message %q", f.Name(), r, msg)
				}
				continue
			}
			if err != nil {
				t.Errorf("%s %v: %v", f.Name(), r, err)
				continue
			}
			if g.Reference() != r || g == f || g.Name() != f.Name() {
				t.Errorf("%s %v: Reference() = %v, name %q", f.Name(), r, g.Reference(), g.Name())
			}
			d, _ := r.definition()
			var s Saturation
			if d.T > 0 {
				s, err = g.SaturationAtT(d.T)
			} else {
				s, err = g.SaturationAtP(d.P)
			}
			if err != nil {
				t.Fatal(err)
			}
			R, tc := f.GasConstant(), f.Critical().T
			if math.Abs(s.Liquid.H-d.H) > 1e-9*math.Max(math.Abs(d.H), R*tc) ||
				math.Abs(s.Liquid.S-d.S) > 1e-9*math.Max(math.Abs(d.S), R) {
				t.Errorf("%s %v: saturated liquid h = %.15g J/kg, s = %.15g J/(kg K); want %v, %v",
					f.Name(), r, s.Liquid.H, s.Liquid.S, d.H, d.S)
			}
			// Chained: re-referencing a re-referenced fluid gives the same.
			for _, r2 := range []RefState{RefDefault, RefIIR, RefASHRAE, RefNBP} {
				a, errA := f.WithReference(r2)
				b, errB := g.WithReference(r2)
				if (errA == nil) != (errB == nil) {
					t.Errorf("%s %v then %v: %v vs %v", f.Name(), r, r2, errA, errB)
					continue
				}
				if errA == nil {
					ah, as := a.ReferenceOffsets()
					bh, bs := b.ReferenceOffsets()
					if ah != bh || as != bs || a.Reference() != b.Reference() {
						t.Errorf("%s %v then %v: offsets %v %v, directly %v %v", f.Name(), r, r2, bh, bs, ah, as)
					}
				}
			}
		}
	}
}

// TestWithReferenceOffsets: the offsets reach every energy Props returns
// (u and h by Δh, s by Δs, g and the Helmholtz energy by Δh − TΔs) and
// nothing else, and the re-referenced fluid stays thermodynamically
// consistent.
func TestWithReferenceOffsets(t *testing.T) {
	t.Parallel()
	f := mustCO2(t)
	g, err := f.WithReference(RefIIR)
	if err != nil {
		t.Fatal(err)
	}
	dh, ds := g.ReferenceOffsets()
	if dh == 0 || ds == 0 {
		t.Fatalf("IIR offsets for CO2: %v, %v", dh, ds)
	}
	for _, st := range co2States {
		T, rho := st[0], st[1]
		a, errA := f.Props(T, rho)
		b, errB := g.Props(T, rho)
		if errA != nil || errB != nil {
			t.Fatal(errA, errB)
		}
		tol := 1e-12 * (math.Abs(dh) + math.Abs(a.H) + T*(math.Abs(ds)+math.Abs(a.S)))
		for _, c := range []struct {
			what      string
			got, want float64
		}{
			{"u", b.U, a.U + dh}, {"h", b.H, a.H + dh}, {"s", b.S, a.S + ds},
			{"g", b.G, a.G + dh - T*ds}, {"f", b.F, a.F + dh - T*ds},
		} {
			if math.Abs(c.got-c.want) > tol {
				t.Errorf("T %v rho %v: %s = %.15g, want %.15g", T, rho, c.what, c.got, c.want)
			}
		}
		a.U, a.H, a.S, a.G, a.F = b.U, b.H, b.S, b.G, b.F
		if a != b {
			t.Errorf("T %v rho %v: the reference state changed more than the energies:\n%+v\n%+v", T, rho, a, b)
		}
		checkConsistency(t, g, T, rho)
	}
}

// TestWithReferenceDefault: RefDefault gives back the published equation's
// own reference state, from any reference state; Lookup's fluids never
// change.
func TestWithReferenceDefault(t *testing.T) {
	t.Parallel()
	for _, f := range allFluids(t) {
		before, err := f.Props(f.Critical().T*1.2, f.Critical().Rho*0.5)
		if err != nil {
			t.Fatal(err)
		}
		for _, r := range []RefState{RefIIR, RefASHRAE, RefNBP} {
			g, err := f.WithReference(r)
			if err != nil {
				continue
			}
			d, err := g.WithReference(RefDefault)
			if err != nil {
				t.Fatal(err)
			}
			dh, ds := d.ReferenceOffsets()
			p, _ := d.Props(f.Critical().T*1.2, f.Critical().Rho*0.5)
			if d.Reference() != RefDefault || dh != 0 || ds != 0 || p != before {
				t.Errorf("%s %v -> default: ref %v offsets %v %v, props %+v, want %+v", f.Name(), r, d.Reference(), dh, ds, p, before)
			}
		}
		// Immutability: the registry's fluid is unchanged.
		l, _ := Lookup(f.Name())
		after, _ := l.Props(f.Critical().T*1.2, f.Critical().Rho*0.5)
		dh, ds := l.ReferenceOffsets()
		if l != f || l.Reference() != RefDefault || dh != 0 || ds != 0 || after != before {
			t.Errorf("%s: Lookup's fluid changed: ref %v offsets %v %v", f.Name(), l.Reference(), dh, ds)
		}
	}
}

func TestWithReferenceInvalid(t *testing.T) {
	t.Parallel()
	f := mustCO2(t)
	for _, r := range []RefState{-1, 4, 99} {
		g, err := f.WithReference(r)
		var e *Error
		if g != nil || !errors.Is(err, ErrInvalidInput) || !errors.As(err, &e) {
			t.Errorf("WithReference(%v) = %v, %v; want ErrInvalidInput", r, g, err)
		}
	}
}
