package fluid_test

import (
	"fmt"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// Properties of R-134a vapour leaving the evaporator of our own small
// chiller, at 5 °C and 15 kg/m³ (superheated: the vapour pressure at 5 °C
// is about 3.5 bar).
func Example_r134a() {
	f, err := fluid.Lookup("R-134a")
	if err != nil {
		fmt.Println(err)
		return
	}
	tp := f.Triple()
	fmt.Printf("%s, M = %.6f kg/mol, triple point %.2f K and %.1f Pa\n", f.Name(), f.MolarMass(), tp.T, tp.P)
	p, err := f.Props(278.15, 15)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("p = %.1f kPa, h = %.2f kJ/kg, s = %.4f kJ/(kg K), w = %.1f m/s\n",
		p.P/1e3, p.H/1e3, p.S/1e3, p.W)
	// Output:
	// R134a, M = 0.102032 kg/mol, triple point 169.85 K and 389.6 Pa
	// p = 310.4 kPa, h = 402.59 kJ/kg, s = 1.7372 kJ/(kg K), w = 148.3 m/s
}
