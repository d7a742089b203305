package fluid_test

import (
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/internal/errcheck"
)

// badNumbers are the inputs no function takes: NaN, ±Inf, and (where a
// positive number is wanted) zero and a negative number.
var badNumbers = []float64{math.NaN(), math.Inf(1), math.Inf(-1), 0, -1}

// TestErrorCatalogue walks a catalogue of bad inputs through every
// exported function of package fluid that takes inputs and checks each
// error against the design's contract (errcheck.Check): a *fluid.Error
// naming the function, wrapping the right sentinel, naming every input
// with its value and unit, stating the valid range or the reason, in
// ASCII, without a panic.
func TestErrorCatalogue(t *testing.T) {
	t.Parallel()
	var cs []errcheck.Case
	in := errcheck.In
	for _, name := range fluid.Names() {
		f, err := fluid.Lookup(name)
		if err != nil {
			t.Fatal(err)
		}
		l, c, tp := f.Limits(), f.Critical(), f.Triple()
		T0, rho0, p0 := 0.5*(c.T+l.TCeil), c.Rho, c.P // a valid supercritical point
		// (T, rho): Props; (T): Virial.
		props := func(T, rho float64, want error) {
			cs = append(cs, errcheck.Case{Name: name + " Props", Op: "fluid.Props", Want: want,
				Inputs: []fluid.Input{in("T", T, "K"), in("rho", rho, "kg/m3")},
				Call:   func() error { _, err := f.Props(T, rho); return err }})
		}
		for _, x := range badNumbers {
			props(x, rho0, fluid.ErrInvalidInput)
			props(T0, x, fluid.ErrInvalidInput)
			cs = append(cs, errcheck.Case{Name: name + " Virial", Op: "fluid.Virial", Want: fluid.ErrInvalidInput,
				Inputs: []fluid.Input{in("T", x, "K")},
				Call:   func() error { _, _, err := f.Virial(x); return err }})
		}
		props(l.TFloor*(1-1e-9), rho0, fluid.ErrOutOfRange)
		props(l.TCeil*(1+1e-9), rho0, fluid.ErrOutOfRange)
		props(T0, l.RhoCeil*(1+1e-9), fluid.ErrOutOfRange)
		for _, T := range []float64{l.TFloor * (1 - 1e-9), l.TCeil * (1 + 1e-9)} {
			cs = append(cs, errcheck.Case{Name: name + " Virial", Op: "fluid.Virial", Want: fluid.ErrOutOfRange,
				Inputs: []fluid.Input{in("T", T, "K")},
				Call:   func() error { _, _, err := f.Virial(T); return err }})
		}
		// Just inside the vapour spinodal at 0.9 Tc: the first density
		// above the saturated vapour's with (dp/drho)_T <= 0 (the
		// equation's p swings to large negative values deeper inside).
		sat, err := f.SaturationAtT(0.9 * c.T)
		if err != nil {
			t.Fatal(err)
		}
		n := len(cs)
		for k := 1; k < 100 && len(cs) == n; k++ {
			rho := sat.Vapor.Rho + (c.Rho-sat.Vapor.Rho)*float64(k)/100
			if pr, _ := f.Props(0.9*c.T, rho); pr.DpDrho <= 0 && pr.P > 0 {
				props(0.9*c.T, rho, fluid.ErrUnstable)
			}
		}
		// A stretched liquid, at p <= 0 before its spinodal: the
		// saturated liquid 1 K above the triple point, expanded in steps
		// of 1e-4 of its density.
		satL, err := f.SaturationAtT(tp.T + 1)
		if err != nil {
			t.Fatal(err)
		}
		for k := 1; k < 1000 && len(cs) == n+1; k++ {
			rho := satL.Liquid.Rho * (1 - 1e-4*float64(k))
			if pr, _ := f.Props(tp.T+1, rho); pr.P <= 0 && pr.DpDrho > 0 {
				props(tp.T+1, rho, fluid.ErrOutOfRange)
			}
		}
		if len(cs) != n+2 {
			t.Errorf("%s: no unstable or no stretched-liquid state found", name)
		}

		// (T, p): Density, PropsTP, StableRoot.
		tp3 := func(op string, T, p float64, root fluid.Root, want error) {
			ins := []fluid.Input{in("T", T, "K"), in("p", p, "Pa")}
			var call func() error
			switch op {
			case "fluid.Density":
				call = func() error { _, err := f.Density(T, p, root); return err }
			case "fluid.PropsTP":
				call = func() error { _, err := f.PropsTP(T, p, root, math.NaN()); return err }
			default:
				call = func() error { _, _, err := f.StableRoot(T, p); return err }
			}
			if root < fluid.RootStable || root > fluid.RootVapor {
				ins = append(ins, in("root", float64(root), ""))
			}
			cs = append(cs, errcheck.Case{Name: name + " " + op, Op: op, Want: want, Inputs: ins, Call: call})
		}
		for _, op := range []string{"fluid.Density", "fluid.PropsTP", "fluid.StableRoot"} {
			for _, x := range badNumbers {
				tp3(op, x, p0, fluid.RootStable, fluid.ErrInvalidInput)
				tp3(op, T0, x, fluid.RootStable, fluid.ErrInvalidInput)
			}
			tp3(op, l.TFloor*(1-1e-9), p0, fluid.RootStable, fluid.ErrOutOfRange)
			tp3(op, l.TCeil*(1+1e-9), p0, fluid.RootStable, fluid.ErrOutOfRange)
			tp3(op, T0, l.PCeil*(1+1e-9), fluid.RootStable, fluid.ErrOutOfRange)
			if op != "fluid.StableRoot" {
				tp3(op, T0, p0, fluid.Root(3), fluid.ErrInvalidInput)
				tp3(op, T0, p0, fluid.Root(-1), fluid.ErrInvalidInput)
				// A vapour root above the vapour spinodal: ten times
				// the vapour pressure a third of the way from the
				// triple point to the critical point.
				Ts := tp.T + (c.T-tp.T)/3
				sat, err := f.SaturationAtT(Ts)
				if err != nil {
					t.Fatal(err)
				}
				tp3(op, Ts, 10*sat.P, fluid.RootVapor, fluid.ErrUnstable)
			}
		}

		// Saturation.
		satT := func(op string, T float64, want error) {
			call := func() error { _, err := f.SaturationAtT(T); return err }
			if op == "fluid.SaturationAtTFrom" {
				call = func() error { _, err := f.SaturationAtTFrom(T, math.NaN(), -1); return err }
				op = "fluid.SaturationAtT" // a warm start that is not usable is SaturationAtT
			}
			cs = append(cs, errcheck.Case{Name: name + " " + op, Op: op, Want: want,
				Inputs: []fluid.Input{in("T", T, "K")}, Call: call})
		}
		satP := func(op string, p float64, want error) {
			call := func() error { _, err := f.SaturationAtP(p); return err }
			if op == "fluid.SaturationAtPFrom" {
				call = func() error { _, err := f.SaturationAtPFrom(p, 0.9*c.T, 2*c.Rho, 0.1*c.Rho); return err }
				op = "fluid.SaturationAtP"
			}
			cs = append(cs, errcheck.Case{Name: name + " " + op, Op: op, Want: want,
				Inputs: []fluid.Input{in("p", p, "Pa")}, Call: call})
		}
		for _, op := range []string{"fluid.SaturationAtT", "fluid.SaturationAtTFrom"} {
			for _, x := range badNumbers {
				satT(op, x, fluid.ErrInvalidInput)
			}
			satT(op, c.T*(1+1e-12), fluid.ErrOutOfRange)
			satT(op, tp.T*(1-1e-9), fluid.ErrOutOfRange)
		}
		for _, op := range []string{"fluid.SaturationAtP", "fluid.SaturationAtPFrom"} {
			for _, x := range badNumbers {
				satP(op, x, fluid.ErrInvalidInput)
			}
			satP(op, c.P*(1+1e-12), fluid.ErrOutOfRange)
			satP(op, 0.5*tp.P, fluid.ErrOutOfRange)
		}

		// The auxiliary equations.
		aux := []struct {
			op     string
			fn     func(float64) (float64, error)
			lo, hi float64 // the range, or 0, 0 where the fluid has none
		}{
			{"fluid.AuxVaporPressure", f.AuxVaporPressure, l.TMin, c.T},
			{"fluid.AuxLiquidDensity", f.AuxLiquidDensity, l.TMin, c.T},
			{"fluid.AuxVaporDensity", f.AuxVaporDensity, l.TMin, c.T},
		}
		lo, hi := f.AuxMeltingRange()
		aux = append(aux, struct {
			op     string
			fn     func(float64) (float64, error)
			lo, hi float64
		}{"fluid.AuxMeltingPressure", f.AuxMeltingPressure, lo, hi})
		lo, hi = f.AuxSublimationRange()
		aux = append(aux, struct {
			op     string
			fn     func(float64) (float64, error)
			lo, hi float64
		}{"fluid.AuxSublimationPressure", f.AuxSublimationPressure, lo, hi})
		for _, a := range aux {
			add := func(T float64, want error) {
				cs = append(cs, errcheck.Case{Name: name + " " + a.op, Op: a.op, Want: want,
					Inputs: []fluid.Input{in("T", T, "K")}, Call: func() error { _, err := a.fn(T); return err }})
			}
			if a.hi == 0 {
				add(300, fluid.ErrUndefined)
				continue
			}
			for _, x := range badNumbers {
				add(x, fluid.ErrInvalidInput)
			}
			add(a.lo*(1-1e-9), fluid.ErrOutOfRange)
			add(a.hi*(1+1e-6), fluid.ErrOutOfRange)
		}
		for _, x := range append(badNumbers, 0.5*tp.P, 1.01*c.P) {
			want := fluid.ErrInvalidInput
			if x > 0 && x-x == 0 {
				want = fluid.ErrOutOfRange
			}
			cs = append(cs, errcheck.Case{Name: name + " AuxSaturationTemperature", Op: "fluid.AuxSaturationTemperature",
				Want: want, Inputs: []fluid.Input{in("p", x, "Pa")},
				Call: func() error { _, err := f.AuxSaturationTemperature(x); return err }})
		}

		// Reference states.
		for _, r := range []fluid.RefState{-1, 4, 99} {
			cs = append(cs, errcheck.Case{Name: name + " WithReference", Op: "fluid.WithReference",
				Want: fluid.ErrInvalidInput, Inputs: []fluid.Input{in("ref", float64(r), "")},
				Call: func() error { _, err := f.WithReference(r); return err }})
		}
	}
	// Reference states that do not exist (DESIGN.md: CO2 has no liquid
	// at 101.325 kPa; water's IIR and ASHRAE states lie below its triple
	// point).
	for _, u := range []struct {
		fluid string
		ref   fluid.RefState
	}{{"CO2", fluid.RefNBP}, {"water", fluid.RefIIR}, {"water", fluid.RefASHRAE}} {
		f, _ := fluid.Lookup(u.fluid)
		cs = append(cs, errcheck.Case{Name: u.fluid + " WithReference " + u.ref.String(), Op: "fluid.WithReference",
			Want: fluid.ErrUndefined, Inputs: []fluid.Input{in("ref", float64(u.ref), "")},
			Call: func() error { _, err := f.WithReference(u.ref); return err }})
	}
	// Unknown names.
	for _, n := range []string{"", "no-such-fluid", "CO3", "w\xe4ter", "R134a\x00"} {
		cs = append(cs, errcheck.Case{Name: "Lookup " + n, Op: "fluid.Lookup", Want: fluid.ErrUndefined,
			Mention: "known: ", Call: func() error { _, err := fluid.Lookup(n); return err }})
	}
	for _, c := range cs {
		if fault := errcheck.Check(c); fault != "" {
			t.Errorf("%s: %s", c.Name, fault)
		}
	}
	if len(cs) < 300 {
		t.Errorf("only %d cases", len(cs))
	}
}
