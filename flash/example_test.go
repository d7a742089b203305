package flash_test

import (
	"fmt"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// The scenarios below are our own; the figures are what the library
// computes, rounded for display.

func water() *fluid.Fluid {
	f, err := fluid.Lookup("water")
	if err != nil {
		panic(err)
	}
	return f
}

// Water at 1 bar and 25 °C.
func ExamplePT() {
	st, err := flash.PT(water(), 1e5, 298.15)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%v: rho = %.3f kg/m3, h = %.2f kJ/kg, cp = %.4f kJ/(kg K)\n", st.Phase, st.Rho, st.H/1e3, st.Cp/1e3)
	// Output:
	// Liquid: rho = 997.047 kg/m3, h = 104.92 kJ/kg, cp = 4.1813 kJ/(kg K)
}

// Saturated water at 10 bar throttled to 1 bar: the enthalpy is kept and
// part of the liquid flashes to steam.
func ExamplePH() {
	f := water()
	up, _ := flash.PQ(f, 10e5, 0)
	down, err := flash.PH(f, 1e5, up.H)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%v at %.2f K, quality %.4f, vapour density %.4f kg/m3\n",
		down.Phase, down.T, down.Quality, down.Phases[1].Rho)
	// Output:
	// TwoPhase at 372.76 K, quality 0.1528, vapour density 0.5903 kg/m3
}

// An ideal turbine stage of our own plant: steam at 40 bar and 400 °C
// expanded at constant entropy to 0.1 bar.
func ExamplePS() {
	f := water()
	in, _ := flash.PT(f, 40e5, 673.15)
	out, err := flash.PS(f, 0.1e5, in.S)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%v at %.2f K, quality %.4f, isentropic work %.1f kJ/kg\n", out.Phase, out.T, out.Quality, (in.H-out.H)/1e3)
	// Output:
	// TwoPhase at 318.96 K, quality 0.8163, isentropic work 1070.0 kJ/kg
}

// Boiling water at 100 °C, half vapour by mass: the mixture and each phase.
func ExampleTQ() {
	st, err := flash.TQ(water(), 373.15, 0.5)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("p = %.1f Pa, rho' = %.3f, rho'' = %.5f kg/m3\n", st.P, st.Phases[0].Rho, st.Phases[1].Rho)
	fmt.Printf("mixture: rho = %.4f kg/m3, cv = %.1f J/(kg K), equilibrium sound speed %.2f m/s\n", st.Rho, st.Cv, st.W)
	// Output:
	// p = 101418.0 Pa, rho' = 958.349, rho'' = 0.59817 kg/m3
	// mixture: rho = 1.1956 kg/m3, cv = 37551.0 J/(kg K), equilibrium sound speed 301.77 m/s
}

// The normal boiling point: saturated liquid at 101.325 kPa.
func ExamplePQ() {
	st, err := flash.PQ(water(), 101325, 0)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%v, %v: T = %.3f K\n", st.Phase, st.Flags, st.T)
	// Output:
	// Liquid, Saturated: T = 373.124 K
}

// Our own 1 m³ vessel holding 100 kg of water, heated until its specific
// internal energy is 1 MJ/kg: fixed volume and energy fix the state.
func ExampleDU() {
	st, err := flash.DU(water(), 100, 1e6)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%v at %.2f K and %.4f MPa, vapour mass fraction %.4f\n", st.Phase, st.T, st.P/1e6, st.Quality)
	// Output:
	// TwoPhase at 477.19 K and 1.6907 MPa, vapour mass fraction 0.0761
}

// The end state of the turbine stage above, found from its enthalpy and
// entropy alone.
func ExampleHS() {
	f := water()
	in, _ := flash.PT(f, 40e5, 673.15)
	out, _ := flash.PS(f, 0.1e5, in.S)
	st, err := flash.HS(f, out.H, out.S)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("p = %.1f Pa, T = %.2f K\n", st.P, st.T)
	// Output:
	// p = 10000.0 Pa, T = 318.96 K
}

// Water at 500 K filling a vessel at 500 kg/m³ boils in place: a mixture.
func ExampleDT() {
	st, err := flash.DT(water(), 500, 500)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%v, quality %.4f, p = %.4f MPa\n", st.Phase, st.Quality, st.P/1e6)
	// Output:
	// TwoPhase, quality 0.0107, p = 2.6392 MPa
}

// Superheated liquid for a flashing-flow calculation: the liquid at 1 bar
// with more enthalpy than the saturated liquid, metastable, on request.
func ExamplePHWith() {
	st, err := flash.PHWith(water(), 1e5, 450e3, flash.Options{Phase: flash.Liquid, AllowMetastable: true})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%v, %v, T = %.2f K\n", st.Phase, st.Flags, st.T)
	// Output:
	// Liquid, Metastable, T = 380.46 K
}

// A simulator stepping along a heated pipe passes each state as the
// guess for the next.
func ExamplePHWith_warmStart() {
	f := water()
	st, _ := flash.PT(f, 5e5, 300)
	for i := 0; i < 4; i++ {
		next, err := flash.PHWith(f, st.P-1e4, st.H+200e3, flash.Options{Guess: &st})
		if err != nil {
			fmt.Println(err)
			return
		}
		st = next
		fmt.Printf("%v %.2f K q = %.4f\n", st.Phase, st.T, st.Quality)
	}
	// Output:
	// Liquid 347.82 K q = 0.0000
	// Liquid 395.27 K q = 0.0000
	// TwoPhase 422.66 K q = 0.0392
	// TwoPhase 421.87 K q = 0.1352
}

// An isotherm and an isochore: TS and PD.
func ExampleTS() {
	f := water()
	st, _ := flash.TS(f, 400, 7000)
	pd, _ := flash.PD(f, st.P, st.Rho)
	fmt.Printf("TS: %v at %.1f Pa; PD: T = %.2f K\n", st.Phase, st.P, pd.T)
	// Output:
	// TS: TwoPhase at 245769.3 Pa; PD: T = 400.00 K
}
