package transport_test

import (
	"fmt"

	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/fluid/transport"
)

// Liquid water at 20 °C and about atmospheric pressure.
func ExampleAt() {
	water, _ := fluid.Lookup("water")
	c, err := transport.At(water, 293.15, 998.2)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("viscosity    %.4f mPa s\n", c.Viscosity*1e3)
	fmt.Printf("conductivity %.4f W/(m K)\n", c.Conductivity)
	// Output:
	// viscosity    1.0016 mPa s
	// conductivity 0.5980 W/(m K)
}

// Carbon dioxide next to its critical point, where the critical
// enhancement makes up nearly half of the conductivity.
func ExampleConductivity() {
	co2, _ := fluid.Lookup("CO2")
	l, err := transport.Conductivity(co2, 310, 400)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.2f mW/(m K)\n", l*1e3)
	_, err = transport.Conductivity(co2, 1200, 10)
	fmt.Println(err)
	// Output:
	// 73.04 mW/(m K)
	// transport.Conductivity: T = 1200 K, rho = 10 kg/m3: out of range (Huber et al. (2016) holds 216.592 <= T <= 1100 K for 0 < p <= 2e+08 Pa; here p = 2.27904e+06 Pa)
}

func ExampleSurfaceTension() {
	water, _ := fluid.Lookup("water")
	s, _ := transport.SurfaceTension(water, 373.15)
	fmt.Printf("%.2f mN/m\n", s*1e3)
	// Output:
	// 58.91 mN/m
}
