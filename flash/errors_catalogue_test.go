package flash

import (
	"fmt"
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/internal/errcheck"
)

// catFlash is one flash for the error catalogue: its operation, the
// names and units of its inputs, which of them must be positive, and a
// valid pair of inputs (water, liquid at 1 MPa and 300 K, or on the
// saturation curve for TQ and PQ).
type catFlash struct {
	op       string
	a, b     fluid.Input // names, units and valid values
	positive [2]bool
	fn       func(f *fluid.Fluid, a, b float64, opt Options) (State, error)
}

func catalogueFlashes(t *testing.T, f *fluid.Fluid) []catFlash {
	t.Helper()
	st, err := PT(f, 1e6, 300)
	if err != nil {
		t.Fatal(err)
	}
	in := errcheck.In
	p, T, h, s := in("p", st.P, "Pa"), in("T", st.T, "K"), in("h", st.H, "J/kg"), in("s", st.S, "J/(kg K)")
	rho, u, q := in("rho", st.Rho, "kg/m3"), in("u", st.U, "J/kg"), in("q", 0.5, "")
	return []catFlash{
		{"PT", p, T, [2]bool{true, true}, PTWith},
		{"PH", p, h, [2]bool{true, false}, PHWith},
		{"PS", p, s, [2]bool{true, false}, PSWith},
		{"PQ", p, q, [2]bool{true, false}, PQWith},
		{"TQ", T, q, [2]bool{true, false}, TQWith},
		{"DU", rho, u, [2]bool{true, false}, DUWith},
		{"HS", h, s, [2]bool{false, false}, HSWith},
		{"DT", rho, T, [2]bool{true, true}, DTWith},
		{"TS", T, s, [2]bool{true, false}, TSWith},
		{"PD", p, rho, [2]bool{true, true}, PDWith},
	}
}

// TestErrorCatalogue walks a catalogue of bad inputs through every flash
// and its ...With options and checks each error against the design's
// contract (errcheck.Check): NaN, ±Inf, zero and negative inputs, q
// outside [0, 1], inputs beyond the accepted range on each side, TQ above
// Tc and PQ above pc, below the vapour floor, beyond the solid models, the
// solid region of a fluid without a solid model, a nil fluid, and
// Options.Phase outside the phases.
func TestErrorCatalogue(t *testing.T) {
	t.Parallel()
	water, co2, r134a := lookup(t, "water"), lookup(t, "CO2"), lookup(t, "R134a")
	var cs []errcheck.Case
	add := func(fl *fluid.Fluid, c catFlash, a, b float64, opt Options, want error, name string) {
		ai, bi := c.a, c.b
		ai.Value, bi.Value = a, b
		fname := "nil"
		if fl != nil {
			fname = fl.Name()
		}
		cs = append(cs, errcheck.Case{Name: fname + " " + c.op + " " + name, Op: "flash." + c.op, Want: want,
			Inputs: []fluid.Input{ai, bi},
			Call:   func() error { _, err := c.fn(fl, a, b, opt); return err }})
	}
	for _, c := range catalogueFlashes(t, water) {
		a, b := c.a.Value, c.b.Value
		for _, x := range []float64{math.NaN(), math.Inf(1), math.Inf(-1)} {
			add(water, c, x, b, Options{}, fluid.ErrInvalidInput, "a not finite")
			add(water, c, a, x, Options{}, fluid.ErrInvalidInput, "b not finite")
		}
		for _, x := range []float64{0, -1} {
			if c.positive[0] {
				add(water, c, x, b, Options{}, fluid.ErrInvalidInput, "a not positive")
			}
			if c.positive[1] {
				add(water, c, a, x, Options{}, fluid.ErrInvalidInput, "b not positive")
			}
		}
		add(nil, c, a, b, Options{}, fluid.ErrInvalidInput, "nil fluid")
		for _, ph := range []Phase{-1, Triple + 1, 1000} {
			add(water, c, a, b, Options{Phase: ph}, fluid.ErrInvalidInput, "bad Options.Phase")
		}
	}
	byOp := func(fl *fluid.Fluid, op string) catFlash {
		for _, c := range catalogueFlashes(t, fl) {
			if c.op == op {
				return c
			}
		}
		t.Fatalf("no flash %s", op)
		return catFlash{}
	}
	none := Options{}
	for _, fl := range []*fluid.Fluid{water, co2, r134a} {
		l, c := fl.Limits(), fl.Critical()
		// Beyond the accepted range on each side.
		add(fl, byOp(fl, "PT"), 1e5, l.TCeil*(1+1e-9), none, fluid.ErrOutOfRange, "T above TCeil")
		add(fl, byOp(fl, "PT"), l.PCeil*(1+1e-9), 0.5*(c.T+l.TCeil), none, fluid.ErrOutOfRange, "p above PCeil")
		add(fl, byOp(fl, "DT"), 1, l.TCeil*(1+1e-9), none, fluid.ErrOutOfRange, "T above TCeil")
		add(fl, byOp(fl, "DT"), l.RhoCeil*(1+1e-9), 0.5*(c.T+l.TCeil), none, fluid.ErrOutOfRange, "rho above RhoCeil")
		add(fl, byOp(fl, "DU"), l.RhoCeil*(1+1e-9), 0, none, fluid.ErrOutOfRange, "rho above RhoCeil")
		add(fl, byOp(fl, "PD"), 1e5, l.RhoCeil*(1+1e-9), none, fluid.ErrOutOfRange, "rho above RhoCeil")
		add(fl, byOp(fl, "PD"), l.PCeil*(1+1e-9), c.Rho, none, fluid.ErrOutOfRange, "p above PCeil")
		add(fl, byOp(fl, "TS"), l.TCeil*(1+1e-9), 0, none, fluid.ErrOutOfRange, "T above TCeil")
		add(fl, byOp(fl, "PH"), l.PCeil*(1+1e-9), 0, none, fluid.ErrOutOfRange, "p above PCeil")
		add(fl, byOp(fl, "PS"), l.PCeil*(1+1e-9), 0, none, fluid.ErrOutOfRange, "p above PCeil")
		add(fl, byOp(fl, "PH"), 1e5, 1e12, none, fluid.ErrOutOfRange, "h far above the range")
		add(fl, byOp(fl, "PS"), 1e5, 1e9, none, fluid.ErrOutOfRange, "s far above the range")
		add(fl, byOp(fl, "HS"), 1e12, 0, none, fluid.ErrOutOfRange, "h far above the range")
		add(fl, byOp(fl, "DU"), 1, 1e12, none, fluid.ErrOutOfRange, "u far above the range")
		// q outside [0, 1]; TQ above Tc; PQ above pc.
		for _, q := range []float64{-1e-12, 1 + 1e-12, -5, 2} {
			add(fl, byOp(fl, "TQ"), 0.9*c.T, q, none, fluid.ErrInvalidInput, "q outside [0, 1]")
			add(fl, byOp(fl, "PQ"), 0.5*c.P, q, none, fluid.ErrInvalidInput, "q outside [0, 1]")
		}
		add(fl, byOp(fl, "TQ"), c.T*(1+1e-12), 0.5, none, fluid.ErrOutOfRange, "T above Tc")
		add(fl, byOp(fl, "TQ"), 2*c.T, 0, none, fluid.ErrOutOfRange, "T above Tc")
		add(fl, byOp(fl, "PQ"), c.P*(1+1e-12), 0.5, none, fluid.ErrOutOfRange, "p above pc")
		add(fl, byOp(fl, "PQ"), 10*c.P, 1, none, fluid.ErrOutOfRange, "p above pc")
		// Requests that cannot be met: a mixture by PT; the liquid in
		// the vapour region without AllowMetastable.
		for _, ph := range []Phase{TwoPhase, SolidVapor, SolidLiquid, Triple} {
			add(fl, byOp(fl, "PT"), 1e5, 0.9*c.T, Options{Phase: ph}, fluid.ErrInvalidInput, "PT of a mixture")
		}
		add(fl, byOp(fl, "PT"), 1e3, 0.9*c.T, Options{Phase: Liquid}, fluid.ErrOutOfRange, "liquid requested in the vapour")
	}
	// Below the vapour floor (TQ and PQ below it; the floors are 200 K
	// for water and 150 K for CO2, TQ's doc).
	add(water, byOp(water, "TQ"), 199, 0.5, none, fluid.ErrOutOfRange, "below the vapour floor")
	add(co2, byOp(co2, "TQ"), 149, 1, none, fluid.ErrOutOfRange, "below the vapour floor")
	add(water, byOp(water, "PQ"), 0.01, 0.5, none, fluid.ErrOutOfRange, "below the vapour floor")
	add(co2, byOp(co2, "PQ"), 10, 0.5, none, fluid.ErrOutOfRange, "below the vapour floor")
	// Beyond the solid models (DESIGN.md: ice Ih ends at 208.566 MPa, dry
	// ice at 800 MPa); the liquid above 208.566 MPa ends at the melting
	// curves of ices III, V, VI and VII (IAPWS R14-08: ice III melts at
	// 253.3 K at 250 MPa, ice V at 260 K near 403 MPa, ice VI at 300 K near
	// 996 MPa).
	add(water, byOp(water, "PT"), 250e6, 250, none, fluid.ErrOutOfRange, "beyond ice Ih, in ice III")
	add(water, byOp(water, "PT"), 450e6, 260, none, fluid.ErrOutOfRange, "liquid beyond ice V")
	add(water, byOp(water, "PT"), 1e9, 300, none, fluid.ErrOutOfRange, "liquid beyond ice VI")
	add(co2, byOp(co2, "PT"), 900e6, 200, none, fluid.ErrOutOfRange, "beyond dry ice")
	add(co2, byOp(co2, "PH"), 900e6, -800e3, none, fluid.ErrOutOfRange, "beyond dry ice")
	// The solid region of a fluid without a solid model (R-134a).
	tp := r134a.Triple()
	add(r134a, byOp(r134a, "TQ"), tp.T-10, 0.5, none, fluid.ErrUndefined, "R-134a below its triple point")
	add(r134a, byOp(r134a, "PQ"), tp.P/2, 0.5, none, fluid.ErrUndefined, "R-134a below its triple point")
	satT, err := r134a.SaturationAtT(tp.T)
	if err != nil {
		t.Fatal(err)
	}
	add(r134a, byOp(r134a, "PH"), 1e6, satT.Liquid.H-50e3, none, fluid.ErrUndefined, "R-134a solid region")
	add(r134a, byOp(r134a, "PS"), 1e6, satT.Liquid.S-300, none, fluid.ErrUndefined, "R-134a solid region")

	errcheck.Run(t, cs, knownFaults)
	if len(cs) < 200 {
		t.Errorf("only %d cases", len(cs))
	}
}

// knownFaults are the shortfalls of the flashes' errors that the
// catalogue found and that are still open (a fault listed here may
// occur; any other fails the test): none. The last ones (PD, TS, HS and
// DU reporting no convergence for inputs beyond the accepted range, HS
// naming no bound) were fixed in the reliability round.
var knownFaults []errcheck.Known

// TestBadGuess checks that a malformed warm start (Options.Guess) does
// no harm (Options: "A Guess from another region is harmless"): every
// flash returns, with it, a state of the phase it returns without one,
// reproducing its inputs within the backward-residual bounds of
// DESIGN.md, or the same error.
func TestBadGuess(t *testing.T) {
	t.Parallel()
	nan := math.NaN()
	bad := []State{
		{},
		{N: -1},
		{N: 7, Phase: 99},
		{T: nan, P: nan, Rho: nan, H: nan, S: nan, U: nan, N: 1, Phase: Liquid,
			Phases: [3]PhaseState{{Phase: Liquid, Fraction: 1, Rho: nan}}},
		{T: -5, P: -1, Rho: -3, N: 2, Phase: TwoPhase,
			Phases: [3]PhaseState{{Phase: Liquid, Rho: -1}, {Phase: Vapor, Rho: 1e300}}},
		{T: 1e300, P: 1e300, Rho: 1e-300, N: 3, Phase: Triple,
			Phases: [3]PhaseState{{Phase: Solid, Rho: math.Inf(1)}, {Phase: 42}, {Phase: Vapor}}},
	}
	for _, name := range []string{"water", "CO2", "R134a"} {
		f := lookup(t, name)
		for _, c := range catalogueFlashes(t, f) {
			a, b := c.a.Value, c.b.Value
			cold, coldErr := c.fn(f, a, b, Options{})
			for i := range bad {
				got, err := c.fn(f, a, b, Options{Guess: &bad[i]})
				what := fmt.Sprintf("%s %s(%.17g, %.17g) with guess %d", name, c.op, a, b, i)
				if (err == nil) != (coldErr == nil) {
					t.Errorf("%s: %v; without it: %v", what, err, coldErr)
					continue
				}
				if err != nil {
					continue
				}
				if got.Phase != cold.Phase {
					t.Errorf("%s: phase %v, without it %v", what, got.Phase, cold.Phase)
				}
				for _, in := range []fluid.Input{c.a, c.b} {
					if g, floor := backward(f, &got, in.Name, in.Value); math.Abs(g-in.Value) > floor {
						t.Errorf("%s: %s = %.17g, off by %.3g (floor %.3g)", what, in.Name, g, g-in.Value, floor)
					}
				}
			}
		}
	}
}

func lookup(t *testing.T, name string) *fluid.Fluid {
	t.Helper()
	f, err := fluid.Lookup(name)
	if err != nil {
		t.Fatal(err)
	}
	return f
}
