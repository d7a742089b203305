package fluid_test

import (
	"fmt"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// Carbon dioxide in the gas cooler of our own transcritical heat pump,
// at 40 °C and a density that puts it at 100 bar: dense and supercritical.
// Enthalpy is on the equation's own reference (ideal gas at 298.15 K,
// 101.325 kPa).
func ExampleLookup_carbonDioxide() {
	f, err := fluid.Lookup("R744")
	if err != nil {
		fmt.Println(err)
		return
	}
	c := f.Critical()
	fmt.Printf("%s: Tc = %.4f K, pc = %.5f MPa, rhoc = %.1f kg/m3\n", f.Name(), c.T, c.P/1e6, c.Rho)
	p, err := f.Props(313.15, 628.61)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("p = %.2f MPa, h = %.2f kJ/kg, cp = %.3f kJ/(kg K), w = %.1f m/s\n",
		p.P/1e6, p.H/1e3, p.Cp/1e3, p.W)
	// Output:
	// CO2: Tc = 304.1282 K, pc = 7.37730 MPa, rhoc = 467.6 kg/m3
	// p = 10.00 MPa, h = -193.74 kJ/kg, cp = 5.658 kJ/(kg K), w = 269.9 m/s
}
