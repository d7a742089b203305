package sublimation_test

import (
	"fmt"

	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/sublimation"
)

// Dry ice at atmospheric pressure: its sublimation temperature and the
// heat it takes to sublime.
func ExampleSolid_SublimationTemperature() {
	co2, _ := fluid.Lookup("CO2")
	dry, _ := sublimation.For(co2)
	c, err := dry.SublimationTemperature(101325)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("T = %.2f K, solid %.0f kg/m3, vapour %.2f kg/m3\n", c.T, c.Solid.Rho, c.Fluid.Rho)
	fmt.Printf("enthalpy of sublimation %.1f kJ/kg\n", (c.Fluid.H-c.Solid.H)/1e3)
	// Output:
	// T = 194.68 K, solid 1573 kg/m3, vapour 2.81 kg/m3
	// enthalpy of sublimation 573.4 kJ/kg
}

// The triple point of water where IAPWS-95 meets IAPWS-06 ice Ih.
func ExampleSolid_Triple() {
	water, _ := fluid.Lookup("water")
	ice, _ := sublimation.For(water)
	tp, _ := ice.Triple()
	fmt.Printf("%.2f K, %.6f Pa; ice %.3f, liquid %.3f kg/m3\n", tp.T, tp.P, tp.Solid.Rho, tp.Liquid.Rho)
	// Output:
	// 273.16 K, 611.654771 Pa; ice 916.709, liquid 999.793 kg/m3
}

// The solid of a fluid, and its melting under pressure.
func ExampleFor() {
	co2, _ := fluid.Lookup("CO2")
	dry, _ := sublimation.For(co2)
	fmt.Println(dry.Name())
	m, _ := dry.MeltingTemperature(100e6)
	fmt.Printf("dry ice melts at %.2f K under 100 MPa\n", m.T)
	// Output:
	// dry ice
	// dry ice melts at 236.08 K under 100 MPa
}

// Liquid water under high pressure freezes to ices other than ice Ih. The
// model has ice Ih only; the published melting curves of ices III, V, VI
// and VII bound its liquid above 208.566 MPa.
func ExampleSolid_HighIceMeltingTemperature() {
	water, _ := fluid.Lookup("water")
	ice, _ := sublimation.For(water)
	for _, p := range []float64{300e6, 500e6, 1e9, 5e9} {
		m, err := ice.HighIceMeltingTemperature(p)
		if err != nil {
			fmt.Println(err)
			return
		}
		fmt.Printf("%.0f MPa: liquid water freezes to %s below %.2f K\n", p/1e6, m.Ice, m.T)
	}
	// Output:
	// 300 MPa: liquid water freezes to ice III below 254.96 K
	// 500 MPa: liquid water freezes to ice V below 266.22 K
	// 1000 MPa: liquid water freezes to ice VI below 300.24 K
	// 5000 MPa: liquid water freezes to ice VII below 511.30 K
}
