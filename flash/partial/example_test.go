package partial_test

import (
	"errors"
	"fmt"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/flash/partial"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// The scenarios below are our own; the figures are what the library
// computes, rounded for display.

func co2() *fluid.Fluid {
	f, err := fluid.Lookup("CO2")
	if err != nil {
		panic(err)
	}
	return f
}

// The receiver of our own CO2 heat pump holds liquid and vapour at 3 MPa.
// A simulator integrating its mass and energy balances in (p, h) needs
// how the mixture's density responds to each: finite here, although the
// mixture's cp is infinite.
func ExampleDerivative() {
	f := co2()
	st, err := flash.PH(f, 3e6, -150e3)
	if err != nil {
		fmt.Println(err)
		return
	}
	drdh, err1 := partial.Derivative(f, st, partial.Rho, partial.H, partial.P)
	drdp, err2 := partial.Derivative(f, st, partial.Rho, partial.P, partial.H)
	if err := errors.Join(err1, err2); err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%v, quality %.4f\n", st.Phase, st.Quality)
	fmt.Printf("(drho/dh)_p = %.6g kg^2/(m3 J), (drho/dp)_h = %.6g s^2/m2\n", drdh, drdp)
	// Output:
	// TwoPhase, quality 0.6888
	// (drho/dh)_p = -0.00059312 kg^2/(m3 J), (drho/dp)_h = 4.50373e-05 s^2/m2
}

// The gas cooler of the same heat pump at 10 MPa, 320 K: build the
// Jacobian once and take every derivative the solver needs from it.
func ExampleAt() {
	f := co2()
	st, err := flash.PT(f, 10e6, 320)
	if err != nil {
		fmt.Println(err)
		return
	}
	j, err := partial.At(f, st)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, d := range [][3]partial.Quantity{
		{partial.Rho, partial.P, partial.H}, {partial.Rho, partial.H, partial.P},
		{partial.T, partial.P, partial.H}, {partial.H, partial.T, partial.P},
	} {
		x, err := j.Derivative(d[0], d[1], d[2])
		if err != nil {
			fmt.Println(err)
			return
		}
		fmt.Printf("(d%v/d%v)_%v = %.6g\n", d[0], d[1], d[2], x)
	}
	// Output:
	// (drho/dp)_h = 2.81017e-05
	// (drho/dh)_p = -0.00326293
	// (dT/dp)_h = 4.9031e-06
	// (dh/dT)_p = 7617.5
}

// A derivative that does not exist in the state is an error, never a
// silent infinity: the cp of a two-phase mixture.
func ExampleJacobian_Derivative_undefined() {
	f := co2()
	st, _ := flash.TQ(f, 260, 0.5)
	_, err := partial.Derivative(f, st, partial.H, partial.T, partial.P)
	fmt.Println(errors.Is(err, fluid.ErrUndefined))
	// Output:
	// true
}

// Dry ice subliming at 1 atm in our own storage bin: the slope of the
// sublimation curve and how the vapour's density and the solid's enthalpy
// follow it.
func ExampleSlopesAtP() {
	f := co2()
	s, err := partial.SlopesAtP(f, partial.Sublimation, 101325)
	if err != nil {
		fmt.Println(err)
		return
	}
	drho, err1 := s.Derivative(1, partial.Rho, partial.T)
	dh, err2 := s.Derivative(0, partial.H, partial.T)
	dT, err3 := s.Derivative(0, partial.T, partial.P)
	if err := errors.Join(err1, err2, err3); err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%v between %v and %v at %.3f K\n", s.Curve, s.Phases[0], s.Phases[1], s.T)
	fmt.Printf("dp/dT = %.1f Pa/K, dT/dp = %.4g K/Pa\n", s.DpDT, dT)
	fmt.Printf("vapour d(rho)/dT = %.5f kg/(m3 K), solid dh/dT = %.1f J/(kg K)\n", drho, dh)
	// Output:
	// Sublimation between Solid and Vapor at 194.684 K
	// dp/dT = 8304.4 Pa/K, dT/dp = 0.0001204 K/Pa
	// vapour d(rho)/dT = 0.22024 kg/(m3 K), solid dh/dT = 1248.8 J/(kg K)
}
