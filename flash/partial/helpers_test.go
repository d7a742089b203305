package partial

import (
	"errors"
	"math"
	"slices"
	"testing"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/sublimation"
)

// This file builds the test states of every region and the inverse
// functions ("flashes") whose centred differences check the derivatives.
// The fluid regions use the flashes of package flash. The solid regions
// (Solid, SolidVapor, SolidLiquid, Triple) are checked twice: with states
// built here directly from package sublimation's models, whose flashes
// are Newton iterations on those models restricted to the region, and
// with the states and flashes of package flash.

var quantities = [...]Quantity{T, P, Rho, V, U, H, S, G, F}

func mustFluid(t testing.TB, name string) *fluid.Fluid {
	t.Helper()
	f, err := fluid.Lookup(name)
	if err != nil {
		t.Fatal(err)
	}
	return f
}

func mustSolid(t testing.TB, f *fluid.Fluid) sublimation.Solid {
	t.Helper()
	s, err := sublimation.For(f)
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// value returns quantity q of state st.
func value(st *flash.State, q Quantity) float64 {
	switch q {
	case T:
		return st.T
	case P:
		return st.P
	case Rho:
		return st.Rho
	case V:
		return 1 / st.Rho
	case U:
		return st.U
	case H:
		return st.H
	case S:
		return st.S
	case G:
		return st.H - st.T*st.S
	}
	return st.U - st.T*st.S
}

// scale returns the natural size of q at st, for steps and tolerances:
// the size to which double precision resolves it, relative to which the
// flashes' residuals are bounded (DESIGN.md). That is the value itself,
// but at least R·Tc for energies and R for entropy (their zero is set by
// the reference state), ρRT for the pressure of a dense phase, and the
// size of the terms h and Ts (u and Ts) of which g (f) is the difference.
func scale(f *fluid.Fluid, st *flash.State, q Quantity) float64 {
	R := f.GasConstant()
	Tc, _ := f.Reducing()
	x := math.Abs(value(st, q))
	ts := math.Abs(st.T * st.S)
	switch q {
	case P:
		return max(x, st.Rho*R*st.T)
	case U, H:
		return max(x, R*Tc)
	case G:
		return max(math.Abs(st.H), ts, R*Tc)
	case F:
		return max(math.Abs(st.U), ts, R*Tc)
	case S:
		return max(x, R)
	}
	return x
}

// solidState returns the solid state of f at (T, p) from its model.
func solidState(sol sublimation.Solid, T, p float64) (flash.State, error) {
	sp, err := sol.Props(T, p)
	if err != nil {
		return flash.State{}, err
	}
	st := flash.State{T: T, P: p, Rho: sp.Rho, H: sp.H, S: sp.S, U: sp.U, Cp: sp.Cp, Cv: sp.Cv, W: sp.W,
		Phase: flash.Solid, N: 1, Solid: 1}
	st.Phases[0] = solidPhaseState(&sp, 1)
	return st, nil
}

func solidPhaseState(sp *sublimation.Props, x float64) flash.PhaseState {
	return flash.PhaseState{Phase: flash.Solid, Fraction: x, Rho: sp.Rho, H: sp.H, S: sp.S, U: sp.U,
		Cp: sp.Cp, Cv: sp.Cv, W: sp.W}
}

func fluidPhaseState(pr *fluid.Props, ph flash.Phase, x float64) flash.PhaseState {
	return flash.PhaseState{Phase: ph, Fraction: x, Rho: pr.Rho, H: pr.H, S: pr.S, U: pr.U,
		Cp: pr.Cp, Cv: pr.Cv, W: pr.W}
}

// mixState returns the solid–fluid mixture of f on curve c (Sublimation
// or Melting) at temperature T with fluid mass fraction x, its cv from
// the phases along the curve (mixtureCv).
func mixState(f *fluid.Fluid, sol sublimation.Solid, c Curve, T, x float64) (flash.State, error) {
	var co sublimation.Coexistence
	var err error
	if c == Sublimation {
		co, err = sol.SublimationPressure(T)
	} else {
		co, err = sol.MeltingPressure(T)
	}
	if err != nil {
		return flash.State{}, err
	}
	ph, second := flash.SolidVapor, flash.Vapor
	if c == Melting {
		ph, second = flash.SolidLiquid, meltPhase(f, co.T, co.P)
	}
	s, l := &co.Solid, &co.Fluid
	v := (1-x)/s.Rho + x/l.Rho
	st := flash.State{T: co.T, P: co.P, Rho: 1 / v, H: (1-x)*s.H + x*l.H, S: (1-x)*s.S + x*l.S,
		U: (1-x)*s.U + x*l.U, Cp: math.Inf(1), Phase: ph, N: 2, Solid: 1 - x, Flags: flash.Saturated}
	if c == Sublimation {
		st.Quality = x
	}
	st.Phases[0] = solidPhaseState(s, 1-x)
	st.Phases[1] = fluidPhaseState(l, second, x)
	sl, err := SlopesOf(f, st)
	if err != nil {
		return flash.State{}, err
	}
	st.Cv = sl.mixtureCv(1-x, x)
	return st, nil
}

// tripleState returns the three-phase mixture of f at its triple point
// with solid, liquid and vapour mass fractions xs, xl, xv.
func tripleState(tp *sublimation.ThreePhase, xs, xl, xv float64) flash.State {
	s, l, g := &tp.Solid, &tp.Liquid, &tp.Vapor
	inf := math.Inf(1)
	st := flash.State{T: tp.T, P: tp.P, Rho: 1 / (xs/s.Rho + xl/l.Rho + xv/g.Rho),
		H: xs*s.H + xl*l.H + xv*g.H, S: xs*s.S + xl*l.S + xv*g.S, U: xs*s.U + xl*l.U + xv*g.U,
		Cp: inf, Cv: inf, Phase: flash.Triple, Quality: xv, Solid: xs, N: 3, Flags: flash.Saturated}
	st.Phases[0] = solidPhaseState(s, xs)
	st.Phases[1] = fluidPhaseState(l, flash.Liquid, xl)
	st.Phases[2] = fluidPhaseState(g, flash.Vapor, xv)
	return st
}

// inverse is a function that returns the state with quantities b and c
// at the given values: a flash.
type inverse struct {
	b, c Quantity
	fn   func(vb, vc float64) (flash.State, error)
}

// fluidFlashes are the flashes of package flash by their inputs; PT
// only where (p, T) fixes the state.
func fluidFlashes(f *fluid.Fluid, withPT bool) []inverse {
	in := []inverse{
		{P, H, func(p, h float64) (flash.State, error) { return flash.PH(f, p, h) }},
		{P, S, func(p, s float64) (flash.State, error) { return flash.PS(f, p, s) }},
		{Rho, U, func(rho, u float64) (flash.State, error) { return flash.DU(f, rho, u) }},
		{H, S, func(h, s float64) (flash.State, error) { return flash.HS(f, h, s) }},
		{Rho, T, func(rho, T float64) (flash.State, error) { return flash.DT(f, rho, T) }},
		{T, S, func(T, s float64) (flash.State, error) { return flash.TS(f, T, s) }},
		{P, Rho, func(p, rho float64) (flash.State, error) { return flash.PD(f, p, rho) }},
	}
	if withPT {
		in = append(in, inverse{P, T, func(p, T float64) (flash.State, error) { return flash.PT(f, p, T) }})
	}
	return in
}

// pairs are the input pairs of the flashes, for the model-built regions.
var pairs = [][2]Quantity{{P, T}, {P, H}, {P, S}, {Rho, U}, {H, S}, {Rho, T}, {T, S}, {P, Rho}}

// newtonFlashes are flashes by Newton's method in two parameters (u1, u2)
// of a family of states build(u1, u2), started from u0 (the
// parameters of the base state): for the solid, (T, p); for a solid–fluid
// mixture, (T, x). Pairs that do not fix a state of the family (T and p
// of a mixture) are left out by the caller.
func newtonFlashes(f *fluid.Fluid, build func(u1, u2 float64) (flash.State, error), u0 [2]float64,
	ps [][2]Quantity) []inverse {
	var in []inverse
	for _, pc := range ps {
		b, c := pc[0], pc[1]
		in = append(in, inverse{b, c, func(vb, vc float64) (flash.State, error) {
			return newton2(f, build, u0, b, vb, c, vc)
		}})
	}
	return in
}

// newton2 solves b(u) = vb, c(u) = vc for u by Newton's method with a
// forward-difference Jacobian; the converged state reproduces its inputs
// to rounding, whatever the accuracy of that Jacobian, or to the
// residual floors of DESIGN.md (1e-10 of the natural sizes) where the
// curve solvers of package sublimation scatter by more than rounding.
func newton2(f *fluid.Fluid, build func(u1, u2 float64) (flash.State, error), u [2]float64,
	b Quantity, vb float64, c Quantity, vc float64) (flash.State, error) {
	st, err := build(u[0], u[1])
	if err != nil {
		return st, err
	}
	sb, sc := scale(f, &st, b), scale(f, &st, c)
	res := func(st *flash.State) [2]float64 {
		return [2]float64{(value(st, b) - vb) / sb, (value(st, c) - vc) / sc}
	}
	best, bestRes := st, math.Inf(1)
	for it := 0; it < 30; it++ {
		r := res(&st)
		if m := max(math.Abs(r[0]), math.Abs(r[1])); m < bestRes {
			best, bestRes = st, m
		}
		if bestRes <= 1e-15 {
			return best, nil
		}
		var J [2][2]float64
		for k := 0; k < 2; k++ {
			du := u
			h := 1e-7 * math.Max(math.Abs(u[k]), 1e-3)
			du[k] += h
			s2, err := build(du[0], du[1])
			if err != nil {
				du[k] -= 2 * h
				h = -h
				if s2, err = build(du[0], du[1]); err != nil {
					return st, err
				}
			}
			r2 := res(&s2)
			J[0][k], J[1][k] = (r2[0]-r[0])/h, (r2[1]-r[1])/h
		}
		det := J[0][0]*J[1][1] - J[0][1]*J[1][0]
		d0 := -(r[0]*J[1][1] - J[0][1]*r[1]) / det
		d1 := -(J[0][0]*r[1] - r[0]*J[1][0]) / det
		u[0], u[1] = u[0]+d0, u[1]+d1
		if st, err = build(u[0], u[1]); err != nil {
			return st, err
		}
	}
	if bestRes <= 1e-10 {
		return best, nil
	}
	return best, errors.New("newton2 did not converge")
}

// testState is a state of one region with the flashes that check it.
// byFlash marks a solid-region state returned by a flash of package
// flash (once the flashes reach the solid regions; the model-built
// states are checked either way).
type testState struct {
	name    string
	st      flash.State
	flashes []inverse
	byFlash bool
}

// fluidCase names a fluid state by a flash.
type fluidCase struct {
	name string
	fn   func(f *fluid.Fluid) (flash.State, error)
	// omit are the flashes whose inputs do not fix this state: (T, s)
	// of liquid water below Tt, which the solid–vapour mixture at the
	// same T and s shares (TS returns the state of lowest pressure, the
	// mixture).
	omit [][2]Quantity
}

func pt(p, T float64) func(*fluid.Fluid) (flash.State, error) {
	return func(f *fluid.Fluid) (flash.State, error) { return flash.PT(f, p, T) }
}

func tq(T, q float64) func(*fluid.Fluid) (flash.State, error) {
	return func(f *fluid.Fluid) (flash.State, error) { return flash.TQ(f, T, q) }
}

// fluidCases are the fluid states of each fluid, away from phase
// boundaries (states of our own choosing).
var fluidCases = map[string][]fluidCase{
	"water": {
		{name: "liquid", fn: pt(20e6, 300)},
		{name: "compressed liquid", fn: pt(50e6, 500)},
		{name: "liquid below Tt", fn: pt(150e6, 265), omit: [][2]Quantity{{T, S}}},
		{name: "vapour", fn: pt(1e5, 500)},
		{name: "supercritical", fn: pt(30e6, 700)},
		{name: "near-critical", fn: pt(25e6, 660)},
		{name: "two-phase cold", fn: tq(300, 0.5)},
		{name: "two-phase", fn: tq(450, 0.2)},
		{name: "two-phase hot", fn: tq(620, 0.8)},
	},
	"CO2": {
		{name: "liquid", fn: pt(10e6, 250)},
		{name: "vapour", fn: pt(1e6, 300)},
		{name: "vapour below Tt", fn: pt(1e5, 200)},
		{name: "supercritical", fn: pt(20e6, 350)},
		{name: "near-critical", fn: pt(8e6, 310)},
		{name: "two-phase cold", fn: tq(220, 0.5)},
		{name: "two-phase", fn: tq(280, 0.3)},
		{name: "two-phase hot", fn: tq(300, 0.7)},
	},
	"R134a": {
		{name: "liquid", fn: pt(2e6, 280)},
		{name: "vapour", fn: pt(1e5, 300)},
		{name: "supercritical", fn: pt(5e6, 400)},
		{name: "two-phase cold", fn: tq(250, 0.5)},
		{name: "two-phase hot", fn: tq(350, 0.3)},
	},
}

// solidCases are the solid-region states of each fluid with a solid
// model: the solid at (T, p), solid–fluid mixtures at (curve, T, x), and
// the triple point.
type solidCase struct {
	name  string
	phase flash.Phase
	a, b  float64 // (T, p) of the solid; (T, x) of a mixture
	// omit are the flashes whose inputs do not fix the state among all
	// phases (the flashes choose another solution; the model-built
	// states, restricted to their region, are checked with them).
	omit [][2]Quantity
}

var solidCases = map[string][]solidCase{
	"water": {
		// (p, ρ) of ice is also that of hot liquid water (about 460 K).
		{"ice", flash.Solid, 260, 10e6, [][2]Quantity{{P, Rho}}},
		{"ice cold", flash.Solid, 220, 5e6, [][2]Quantity{{P, Rho}}},
		{"ice-vapour", flash.SolidVapor, 250, 0.5, nil},
		// (T, s) of ice and liquid is also that of ice and vapour, (p, ρ)
		// that of hot liquid water.
		{"ice-liquid", flash.SolidLiquid, 265, 0.4, [][2]Quantity{{T, S}, {P, Rho}}},
	},
	"CO2": {
		{"dry ice", flash.Solid, 200, 10e6, nil},
		{"dry ice compressed", flash.Solid, 280, 500e6, nil},
		{"dry ice-vapour", flash.SolidVapor, 190, 0.5, nil},
		{"dry ice-liquid", flash.SolidLiquid, 250, 0.4, nil},
		// Solid with the dense fluid above Tc (flash.HS once did not
		// converge here; flash.TestHSRegressions keeps the case).
		{"dry ice-dense fluid", flash.SolidLiquid, 310, 0.6, nil},
	},
}

// states returns the test states of f in every region it has.
func states(t testing.TB, f *fluid.Fluid) []testState {
	t.Helper()
	cases, ok := fluidCases[f.Name()]
	if !ok {
		t.Fatalf("no test states for %s", f.Name())
	}
	var out []testState
	for _, c := range cases {
		st, err := c.fn(f)
		if err != nil {
			t.Fatalf("%s %s: %v", f.Name(), c.name, err)
		}
		out = append(out, testState{name: c.name, st: st, flashes: without(fluidFlashes(f, st.N == 1), c.omit)})
	}
	sc, ok := solidCases[f.Name()]
	if !ok {
		return out
	}
	sol := mustSolid(t, f)
	for _, c := range sc {
		var build func(u1, u2 float64) (flash.State, error)
		ps := pairs
		switch c.phase {
		case flash.Solid:
			build = func(T, p float64) (flash.State, error) { return solidState(sol, T, p) }
		case flash.SolidVapor:
			build = func(T, x float64) (flash.State, error) { return mixState(f, sol, Sublimation, T, x) }
			ps = pairs[1:]
		default:
			build = func(T, x float64) (flash.State, error) { return mixState(f, sol, Melting, T, x) }
			ps = pairs[1:]
		}
		st, err := build(c.a, c.b)
		if err != nil {
			t.Fatalf("%s %s: %v", f.Name(), c.name, err)
		}
		out = append(out, testState{name: c.name, st: st, flashes: newtonFlashes(f, build, [2]float64{c.a, c.b}, ps)})
		var fs flash.State
		if c.phase == flash.Solid {
			fs, err = flash.PT(f, st.P, st.T)
		} else {
			fs, err = flash.DT(f, st.Rho, st.T)
		}
		if err == nil && fs.Phase == c.phase {
			out = append(out, testState{name: c.name + " by flash", st: fs,
				flashes: without(fluidFlashes(f, c.phase == flash.Solid), c.omit), byFlash: true})
		}
	}
	tp, err := sol.Triple()
	if err != nil {
		t.Fatal(err)
	}
	st := tripleState(&tp, 0.3, 0.3, 0.4)
	frac := func(fn func(rho, e float64) (float64, float64, float64, error)) func(rho, e float64) (flash.State, error) {
		return func(rho, e float64) (flash.State, error) {
			xs, xl, xv, err := fn(rho, e)
			return tripleState(&tp, xs, xl, xv), err
		}
	}
	out = append(out, testState{name: "triple", st: st, flashes: []inverse{
		{Rho, U, frac(tp.FractionsRhoU)}, {Rho, H, frac(tp.FractionsRhoH)}, {Rho, S, frac(tp.FractionsRhoS)},
	}})
	if fs, err := flash.DU(f, st.Rho, st.U); err == nil && fs.Phase == flash.Triple {
		// On the triple line only (ρ, u)-type inputs fix the state.
		out = append(out, testState{name: "triple by flash", st: fs, flashes: fluidFlashes(f, false)[2:3], byFlash: true})
	}
	return out
}

// without returns the flashes of in but those with the inputs of omit.
func without(in []inverse, omit [][2]Quantity) []inverse {
	var out []inverse
	for _, x := range in {
		if !slices.Contains(omit, [2]Quantity{x.b, x.c}) {
			out = append(out, x)
		}
	}
	return out
}

// mixtures returns the two-phase test states of f (TwoPhase, SolidVapor,
// SolidLiquid).
func mixtures(t testing.TB, f *fluid.Fluid) []testState {
	var out []testState
	for _, ts := range states(t, f) {
		if ts.st.N == 2 {
			out = append(out, ts)
		}
	}
	return out
}
