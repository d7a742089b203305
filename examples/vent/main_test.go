package main

import (
	"errors"
	"io"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/tripoint-thermo/tripoint/examples/internal/kit"
	"github.com/tripoint-thermo/tripoint/examples/internal/kittest"
	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

func co2(t testing.TB) *fluid.Fluid {
	t.Helper()
	f, err := fluid.Lookup("CO2")
	if err != nil {
		t.Fatal(err)
	}
	if f, err = f.WithReference(fluid.RefIIR); err != nil {
		t.Fatal(err)
	}
	return f
}

// scenario is the default vessel of the program (our own): 50 L, 3 mm
// orifice, Cd 0.8, to 1.01325 bar.
func scenario(t testing.TB, d Draw) *Vessel {
	return &Vessel{F: co2(t), Volume: 0.05, Orifice: 3e-3, Cd: 0.8, PAmb: 101325, TAmb: 293.15, Wall: cylinderWall(0.05, 4), Draw: d}
}

func vent(t *testing.T, v *Vessel, m0, T0, rtol float64) *Result {
	t.Helper()
	r, err := v.Integrate(m0, T0, Settings{TEnd: 7200, PEnd: v.PAmb + 1e3, RTol: rtol})
	if err != nil {
		t.Fatal(err)
	}
	res, err := Summarise(v, r)
	if err != nil {
		t.Fatal(err)
	}
	return res
}

// The mass and energy balances of the integration close: the change of
// the vessel's mass and internal energy (m·u of the final DU flash)
// equals the time integral of the outflow, ∫ṁ dt, and of the enthalpy
// outflow less the heat in, ∫(ṁ h0 − Q) dt. The flows are evaluated
// afresh at each step's state (a new DU flash, drawn phase and nozzle),
// not taken from the integrator, and integrated by Simpson's rule
// between the phase changes. The bound is the per-step tolerance times
// the number of steps (the local errors add up at most so).
func TestBalances(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name string
		draw Draw
		htc  float64
		rtol float64
	}{
		{"vapour, adiabatic", DrawVapour, 0, 1e-6},
		{"liquid, wall heat", DrawLiquid, 10, 1e-5},
	} {
		t.Run(tc.name, func(t *testing.T) {
			t.Parallel()
			v := scenario(t, tc.draw)
			v.HTC = tc.htc
			rtol := tc.rtol
			res := vent(t, v, 20, 293.15, rtol)
			pts := res.Run.Points
			e := newEval(v)
			fresh := make([]Point, len(pts))
			for i, p := range pts {
				e.dry = p.Dry
				q, err := e.at(p.Time, p.M, p.U)
				if err != nil {
					t.Fatal(err)
				}
				fresh[i] = q
				if p.Event != "" {
					fresh[i].Event = p.Event
				}
			}
			first, last := pts[0], pts[len(pts)-1]
			mOut := Integral(fresh, func(i int) float64 { return fresh[i].MDot })
			eOut := Integral(fresh, func(i int) float64 { return fresh[i].MDot*fresh[i].In.H - fresh[i].Q })
			dm := first.M - last.M
			dU := first.M*first.St.U - last.M*last.St.U
			bound := rtol * float64(len(pts))
			if d := math.Abs(dm - mOut); d > bound*first.M {
				t.Errorf("mass: vented %.9g kg, integral of the outflow %.9g kg (diff %.3g > %.3g)", dm, mOut, d, bound*first.M)
			}
			scale := Integral(fresh, func(i int) float64 { return math.Abs(fresh[i].MDot * fresh[i].In.H) })
			if d := math.Abs(dU - eOut); d > bound*scale {
				t.Errorf("energy: contents changed by %.9g J, enthalpy outflow less heat in %.9g J (diff %.3g > %.3g)", dU, eOut, d, bound*scale)
			}
			if dm < 0.5*first.M {
				t.Errorf("only %.3g kg of %.3g vented", dm, first.M)
			}
			// The contents reproduce the integrated state.
			if math.Abs(last.St.Rho-last.M/v.Volume) > 1e-10*last.St.Rho || math.Abs(last.St.U-last.U/last.M) > 1e-9*math.Abs(last.U/last.M)+1e-3 {
				t.Errorf("final contents (%.12g kg/m3, %.12g J/kg) against m/V = %.12g, U/m = %.12g", last.St.Rho, last.St.U, last.M/v.Volume, last.U/last.M)
			}
		})
	}
}

// phases returns the sequence of distinct phases of the contents.
func phases(pts []Point) []flash.Phase {
	var seq []flash.Phase
	for _, p := range pts {
		if len(seq) == 0 || seq[len(seq)-1] != p.St.Phase {
			seq = append(seq, p.St.Phase)
		}
	}
	return seq
}

// The default vessel (vapour drawn, adiabatic) passes through the triple
// point — temperature and pressure constant at the models' triple point
// while the liquid freezes and vapour leaves — and continues as solid
// and vapour, colder, down to the end pressure. The phase changes are
// located to within a microsecond.
func TestTriplePassage(t *testing.T) {
	t.Parallel()
	v := scenario(t, DrawVapour)
	res := vent(t, v, 20, 293.15, 1e-6)
	pts := res.Run.Points
	want := []flash.Phase{flash.TwoPhase, flash.Triple, flash.SolidVapor}
	if got := phases(pts); len(got) != len(want) || got[0] != want[0] || got[1] != want[1] || got[2] != want[2] {
		t.Fatalf("phases %v, want %v", got, want)
	}
	tp := v.F.Triple()
	var nTriple int
	prevSolid, prevLiquid := -1.0, 2.0
	for i, p := range pts {
		switch p.St.Phase {
		case flash.Triple:
			nTriple++
			if math.Abs(p.St.T-tp.T) > 1e-9*tp.T || math.Abs(p.St.P-tp.P) > 1e-9*tp.P {
				t.Errorf("t = %.6g s: triple state at %.12g K, %.12g Pa, want %.12g K, %.12g Pa", p.Time, p.St.T, p.St.P, tp.T, tp.P)
			}
			liq := phaseFraction(p.St, flash.Liquid)
			if p.St.Solid < prevSolid || liq > prevLiquid {
				t.Errorf("t = %.6g s: solid fraction %.6g (before %.6g), liquid %.6g (before %.6g): the liquid must freeze", p.Time, p.St.Solid, prevSolid, liq, prevLiquid)
			}
			prevSolid, prevLiquid = p.St.Solid, liq
		case flash.SolidVapor:
			if p.St.T >= tp.T || p.St.P >= tp.P {
				t.Errorf("t = %.6g s: solid-vapour state at %.6g K, %.6g Pa, not below the triple point", p.Time, p.St.T, p.St.P)
			}
			if q := pts[i-1]; q.St.Phase == flash.SolidVapor && (p.St.T > q.St.T+1e-9 || p.St.Solid < q.St.Solid-1e-9) {
				t.Errorf("t = %.6g s: solid-vapour warming (%.9g -> %.9g K) or losing solid (%.9g -> %.9g) in an adiabatic vent", p.Time, q.St.T, p.St.T, q.St.Solid, p.St.Solid)
			}
		}
		if p.Event != "" && p.Event != "end pressure" {
			if q := pts[i-1]; q.St.Phase == p.St.Phase || p.Time-q.Time > 1e-6 {
				t.Errorf("event %q at %.9g s: the point before is %v at %.9g s", p.Event, p.Time, q.St.Phase, q.Time)
			}
		}
	}
	if nTriple < 3 || !(res.TripleEnd > res.TripleStart) {
		t.Errorf("%d points at the triple point, from %.6g s to %.6g s", nTriple, res.TripleStart, res.TripleEnd)
	}
	if s := pts[len(pts)-1].St.Solid; !(s > 0.5) {
		t.Errorf("final solid fraction %.4g: the frozen liquid should remain as dry ice", s)
	}
}

// With liquid in the vessel (compressed liquid, or liquid drawn through
// a dip tube) the jet expanded to ambient pressure is part dry ice and
// part vapour: its solid fraction lies in (0, 1), and a colder liquid
// gives more (its enthalpy is lower).
func TestJetDryIce(t *testing.T) {
	t.Parallel()
	f := co2(t)
	noz := Nozzle{F: f, PBack: 101325}
	prev := 0.0
	for _, T := range []float64{293.15, 273.15, 253.15, 233.15} {
		// Compressed liquid: 2 % denser than the saturated liquid.
		sat, err := flash.TQ(f, T, 0)
		if err != nil {
			t.Fatal(err)
		}
		st, err := flash.DT(f, 1.02*sat.Rho, T)
		if err != nil {
			t.Fatal(err)
		}
		if st.Phase != flash.Liquid {
			t.Fatalf("%.2f K, %.1f kg/m3: %v, want liquid", T, st.Rho, st.Phase)
		}
		in, err := drawn(st, DrawVapour)
		if err != nil {
			t.Fatal(err)
		}
		jet, err := noz.Jet(in)
		if err != nil {
			t.Fatal(err)
		}
		if jet.Phase != flash.SolidVapor || !(jet.Solid > 0 && jet.Solid < 1) {
			t.Errorf("liquid at %.2f K, %.4g MPa: jet %v with solid fraction %.4g, want solid and vapour", T, st.P/1e6, jet.Phase, jet.Solid)
		}
		if jet.Solid <= prev {
			t.Errorf("liquid at %.2f K: jet solid fraction %.4g not above %.4g of the warmer liquid", T, jet.Solid, prev)
		}
		prev = jet.Solid
	}
	// The vent with a dip tube: the jet carries dry ice while liquid is drawn.
	v := scenario(t, DrawLiquid)
	res := vent(t, v, 20, 293.15, 1e-5)
	n := 0
	for i, p := range res.Run.Points {
		if p.In.Phase != flash.Liquid || p.MDot == 0 {
			continue
		}
		n++
		if s := res.Jets[i].Solid; !(s > 0 && s < 1) {
			t.Errorf("t = %.6g s, liquid drawn: jet solid fraction %.4g", p.Time, s)
		}
	}
	if n < 3 {
		t.Errorf("liquid drawn at %d points only", n)
	}
	if !(res.JetSolidMass > 0 && res.JetSolidMass < res.MassOut) {
		t.Errorf("dry ice carried out %.4g kg of %.4g kg vented", res.JetSolidMass, res.MassOut)
	}
}

// idealChokedFlux is the choked mass flux of a perfect gas (constant γ)
// from stagnation p0, ρ0: G* = √(γ p0 ρ0) (2/(γ+1))^((γ+1)/(2(γ−1)))
// (the isentropic nozzle relations of gas dynamics; common practice).
func idealChokedFlux(p0, rho0, gamma float64) float64 {
	return math.Sqrt(gamma*p0*rho0) * math.Pow(2/(gamma+1), (gamma+1)/(2*(gamma-1)))
}

// The choked mass flux in the ideal-gas limit: CO2 vapour at 0.5 bar and
// 400 K (compressibility factor within 1e-3 of 1) against the
// perfect-gas formula with γ = cp/cv of the stagnation state. Along the
// expansion to the throat (about 350 K) CO2's γ rises by about 0.015,
// which moves G* by about 0.3 %; the bound is 0.5 %. The critical
// pressure ratio (2/(γ+1))^(γ/(γ−1)) likewise, within 1 %.
func TestChokedIdealGas(t *testing.T) {
	t.Parallel()
	f := co2(t)
	st, err := flash.PT(f, 0.5e5, 400)
	if err != nil {
		t.Fatal(err)
	}
	if z := st.P / (st.Rho * f.GasConstant() * st.T); math.Abs(z-1) > 1e-3 {
		t.Fatalf("Z = %.6g: not the ideal-gas limit", z)
	}
	noz := Nozzle{F: f, PBack: 0.05e5}
	fl, err := noz.Flux(Stagnation{P: st.P, H: st.H, S: st.S, Phase: st.Phase})
	if err != nil {
		t.Fatal(err)
	}
	gamma := st.Cp / st.Cv
	want := idealChokedFlux(st.P, st.Rho, gamma)
	if !fl.Choked || math.Abs(fl.G/want-1) > 5e-3 {
		t.Errorf("G* = %.6g kg/(m2 s) (choked %v), perfect gas %.6g (γ = %.5g): %.3g %%", fl.G, fl.Choked, want, gamma, 100*(fl.G/want-1))
	}
	t.Logf("G* = %.6g, perfect gas %.6g (%.3g %%), throat %.6g Pa", fl.G, want, 100*(fl.G/want-1), fl.PThroat)
	ratio := math.Pow(2/(gamma+1), gamma/(gamma-1))
	if r := fl.PThroat / st.P; math.Abs(r/ratio-1) > 1e-2 {
		t.Errorf("critical pressure ratio %.5g, perfect gas %.5g", r, ratio)
	}
}

// At a choked throat inside one region the velocity equals the
// homogeneous-equilibrium sound speed: d(ρu)/dp = 0 along the isentrope
// with dh = dp/ρ is u² = (∂p/∂ρ)_s — a thermodynamic identity that checks
// the maximisation without any formula of its own. Cases: vapour, a
// two-phase throat from saturated liquid (the flashing flow of a dip
// tube) and from a wet vapour.
func TestChokedSoundSpeed(t *testing.T) {
	t.Parallel()
	f := co2(t)
	noz := Nozzle{F: f, PBack: 101325}
	for _, tc := range []struct {
		name  string
		st    func() (flash.State, error)
		phase flash.Phase
	}{
		{"vapour 20 bar 350 K", func() (flash.State, error) { return flash.PT(f, 20e5, 350) }, flash.Vapor},
		{"saturated liquid 250 K", func() (flash.State, error) { return flash.TQ(f, 250, 0) }, flash.TwoPhase},
		{"wet vapour 280 K, q = 0.9", func() (flash.State, error) { return flash.TQ(f, 280, 0.9) }, flash.TwoPhase},
	} {
		st, err := tc.st()
		if err != nil {
			t.Fatal(err)
		}
		noz.ratio = 0
		fl, err := noz.Flux(Stagnation{P: st.P, H: st.H, S: st.S, Phase: st.Phase})
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		if !fl.Choked || fl.Throat.Phase != tc.phase {
			t.Errorf("%s: choked %v, throat %v, want choked in %v", tc.name, fl.Choked, fl.Throat.Phase, tc.phase)
			continue
		}
		t.Logf("%s: throat %.6g Pa %v, G %.6g, u/w - 1 = %.3g, %d PS flashes", tc.name, fl.PThroat, fl.Throat.Phase, fl.G, fl.Velocity(st.H)/fl.Throat.W-1, fl.Evals)
		if u, w := fl.Velocity(st.H), fl.Throat.W; math.Abs(u/w-1) > 1e-3 {
			t.Errorf("%s: throat at %.6g Pa: velocity %.6g m/s, sound speed %.6g m/s", tc.name, fl.PThroat, u, w)
		}
		// The warm start gives the same throat.
		fl2, err := noz.Flux(Stagnation{P: st.P, H: st.H, S: st.S, Phase: st.Phase})
		if err != nil || math.Abs(fl2.G/fl.G-1) > 1e-8 || fl2.Evals >= fl.Evals {
			t.Errorf("%s: warm start G %.9g (%d PS flashes) against %.9g (%d), err %v", tc.name, fl2.G, fl2.Evals, fl.G, fl.Evals, err)
		}
	}
}

// Just above the back pressure the flow is not choked and tends to the
// incompressible orifice flux √(2ρ0Δp) (Bernoulli; common practice). To
// first order in ε = Δp/(κp), with κ = ρw²/p the isentropic exponent,
// the density at the outlet is ρ0(1 − ε) and h0 − h = Δp/ρ0·(1 + ε/2),
// so G = √(2ρ0Δp)·(1 − 3ε/4) (derived); for Δp/p = 1e-3 the remainder is
// of order ε², below 1e-5.
func TestUnchokedLimit(t *testing.T) {
	t.Parallel()
	f := co2(t)
	pb := 101325.0
	st, err := flash.PT(f, pb*1.001, 300)
	if err != nil {
		t.Fatal(err)
	}
	noz := Nozzle{F: f, PBack: pb}
	fl, err := noz.Flux(Stagnation{P: st.P, H: st.H, S: st.S})
	if err != nil {
		t.Fatal(err)
	}
	eps := (st.P - pb) / (st.Rho * st.W * st.W)
	want := math.Sqrt(2*st.Rho*(st.P-pb)) * (1 - 0.75*eps)
	if fl.Choked || fl.PThroat != pb || math.Abs(fl.G/want-1) > 1e-5 {
		t.Errorf("G = %.9g (choked %v at %.9g Pa), Bernoulli with the first compressibility correction %.9g", fl.G, fl.Choked, fl.PThroat, want)
	}
	if _, err := noz.Flux(Stagnation{P: pb, H: st.H, S: st.S}); !errors.Is(err, errNoFlow) {
		t.Errorf("no pressure difference: %v", err)
	}
}

// The program runs from its command line: the table, the summary, the
// cautions, and the plots as PNG and SVG.
func TestRun(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	var out, errOut strings.Builder
	err := run([]string{"-orifice-mm", "4", "-rtol", "1e-4", "-out", dir, "-units", "si"}, &out, &errOut)
	if err != nil {
		t.Fatalf("%v\n%s", err, errOut.String())
	}
	s := out.String()
	for _, w := range []string{"t [s]", "p [MPa]", "T [K]", "triple", "solid+vapour", "TwoPhase -> Triple", "Triple -> SolidVapor",
		"jet dry ice", "Asphyxiation", "Cold burns", "Dry-ice blockage", "High pressure", "local codes", "licensed engineering practice"} {
		if !strings.Contains(s, w) {
			t.Errorf("output lacks %q", w)
		}
	}
	if !strings.Contains(errOut.String(), "vent: done") {
		t.Errorf("no progress line: %q", errOut.String())
	}
	png, svg := filepath.Join(dir, "vent.png"), filepath.Join(dir, "vent.svg")
	if w, h, err := kit.CheckPNG(png); err != nil || w < 1000 || h < 700 {
		t.Errorf("%s: %dx%d, %v", png, w, h, err)
	}
	_, _, texts, err := kit.CheckSVG(svg)
	if err != nil {
		t.Fatal(err)
	}
	for _, w := range []string{"Vessel pressure", "Temperature", "Mass in the vessel", "Dry-ice (solid) mass fraction", "at the triple point", "time [s]"} {
		if !strings.Contains(texts, w) {
			t.Errorf("%s lacks the text %q", svg, w)
		}
	}
	if fi, err := os.Stat(png); err != nil || fi.Size() < 20000 {
		t.Errorf("%s: %v", png, err)
	}
}

// Bad flags give errors naming the flag; -h prints the flags in their
// units.
func TestFlags(t *testing.T) {
	t.Parallel()
	kittest.CheckCommandLine(t, run, []kittest.BadFlag{
		{Args: []string{"-cd", "1.5"}, Want: "-cd"},
		{Args: []string{"-cd", "0"}, Want: "-cd"},
		{Args: []string{"-volume-L", "-3"}, Want: "-volume-L"},
		{Args: []string{"-volume-L", "50", "-volume-m3", "0.05"}, Want: "already given"},
		{Args: []string{"-fill-kg", "abc"}, Want: "-fill-kg"},
		{Args: []string{"-fill-kg", "80"}, Want: "overfilled"},
		{Args: []string{"-orifice-mm", "NaN"}, Want: "not a finite number"},
		{Args: []string{"-draw", "both"}, Want: "-draw"},
		{Args: []string{"-units", "imperial"}, Want: "-units"},
		{Args: []string{"-pend-bar", "0.5"}, Want: "-pend-bar"},
		{Args: []string{"-rtol", "0"}, Want: "-rtol"},
		{Args: []string{"-t0-C", "-80"}, Want: "-t0-C"},
		{Args: []string{"-wall-m2", "-1"}, Want: "-wall-m2"},
		{Args: []string{"extra"}, Want: "unexpected argument"},
	}, []string{"-volume-L", "-volume-m3", "-fill-kg", "-t0-C", "-t0-K", "-orifice-mm", "-cd", "-pamb-bar", "-htc-Wm2K", "-draw", "-tend-min", "Default scenario"})
}

// FuzzFlags: no command line makes the parsing of the flags panic.
func FuzzFlags(f *testing.F) {
	f.Add("-volume-L", "50", "-fill-kg", "20")
	f.Add("-orifice-mm", "1e-9", "-cd", "-1")
	f.Add("-t0-K", "1e308", "-draw", "liquid")
	f.Fuzz(func(t *testing.T, a, b, c, d string) {
		_, _ = parse([]string{a, b, c, d}, io.Discard)
	})
}

// FuzzNozzle: from any stagnation state flash.PT accepts, the nozzle
// returns a finite, non-negative mass flux with its throat between the
// back and stagnation pressures, or an error; and the jet a state or an
// error — never a panic.
func FuzzNozzle(f *testing.F) {
	f.Add(57e5, 293.15, 101325.0)
	f.Add(5.2e5, 217.0, 101325.0)
	f.Add(200e5, 250.0, 5e5)
	f.Add(1.2e5, 400.0, 1e5)
	fl := co2(f)
	f.Fuzz(func(t *testing.T, p0, T0, pb float64) {
		if !(pb >= 100 && pb <= 2e6) {
			return
		}
		st, err := flash.PT(fl, p0, T0)
		if err != nil || st.Phase == flash.Solid {
			return
		}
		noz := Nozzle{F: fl, PBack: pb}
		in := Stagnation{P: st.P, H: st.H, S: st.S, Phase: st.Phase}
		flow, err := noz.Flux(in)
		if err == nil {
			if !(flow.G >= 0) || math.IsInf(flow.G, 0) || flow.PThroat < pb || flow.PThroat > p0 {
				t.Errorf("PT(%g Pa, %g K) to %g Pa: G = %g, throat %g Pa", p0, T0, pb, flow.G, flow.PThroat)
			}
		}
		if jet, err := noz.Jet(in); err == nil && !(jet.Solid >= 0 && jet.Solid <= 1) {
			t.Errorf("PT(%g Pa, %g K): jet solid fraction %g", p0, T0, jet.Solid)
		}
	})
}
