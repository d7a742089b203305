package fluid_test

import (
	"errors"
	"fmt"

	"github.com/tripoint-thermo/tripoint/fluid"
)

func ExampleLookup() {
	f, err := fluid.Lookup("H2O") // case-insensitive; "water" and "R718" too
	if err != nil {
		fmt.Println(err)
		return
	}
	c := f.Critical()
	fmt.Println(f.Name(), "-", f.EquationOfState())
	fmt.Printf("M = %.6f g/mol\n", f.MolarMass()*1e3)
	fmt.Printf("critical point: %.3f K, %.3f MPa, %.0f kg/m3\n", c.T, c.P/1e6, c.Rho)

	_, err = fluid.Lookup("unobtainium")
	fmt.Println(errors.Is(err, fluid.ErrUndefined))
	// Output:
	// water - IAPWS-95 (IAPWS R6-95(2018))
	// M = 18.015268 g/mol
	// critical point: 647.096 K, 22.064 MPa, 322 kg/m3
	// true
}

func ExampleFluid_Props() {
	water, err := fluid.Lookup("water")
	if err != nil {
		fmt.Println(err)
		return
	}
	// Compressed liquid at 500 K and 838.025 kg/m3, a state of IAPWS
	// R6-95(2018) Table 7: the output is that table's values, rounded.
	// Inputs and results are in SI units; p.H, p.U, p.Cp, p.G and more
	// are there too.
	p, err := water.Props(500, 838.025)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("p  = %.6f MPa\n", p.P/1e6)
	fmt.Printf("s  = %.5f kJ/(kg K)\n", p.S/1e3)
	fmt.Printf("cv = %.5f kJ/(kg K)\n", p.Cv/1e3)
	fmt.Printf("w  = %.3f m/s\n", p.W)

	// Bad input is an error naming the input, its value and the range.
	_, err = water.Props(150, 1000)
	fmt.Println(err)
	// Output:
	// p  = 10.000386 MPa
	// s  = 2.56691 kJ/(kg K)
	// cv = 3.22106 kJ/(kg K)
	// w  = 1271.284 m/s
	// fluid.Props: T = 150 K, rho = 1000 kg/m3: out of range (valid range 200 <= T <= 5000 K for water)
}
