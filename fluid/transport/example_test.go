package transport_test

import (
	"fmt"

	"github.com/tripoint-thermo/tripoint/flash"
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

// Boiling water at 100 °C: the coefficients of each coexisting phase of a
// flash state.
func ExampleOf() {
	water, _ := fluid.Lookup("water")
	st, err := flash.TQ(water, 373.15, 0.5)
	if err != nil {
		fmt.Println(err)
		return
	}
	r, err := transport.Of(water, st)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, ph := range r.Phases[:r.N] {
		fmt.Printf("%-6s rho %8.3f kg/m3  eta %7.2f uPa s  lambda %.4f W/(m K)\n",
			ph.Phase, ph.Rho, ph.Viscosity*1e6, ph.Conductivity)
	}
	// Output:
	// Liquid rho  958.349 kg/m3  eta  281.58 uPa s  lambda 0.6772 W/(m K)
	// Vapor  rho    0.598 kg/m3  eta   12.23 uPa s  lambda 0.0246 W/(m K)
}
