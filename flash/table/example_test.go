package table_test

import (
	"fmt"
	"log"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/flash/table"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// The suction and discharge of a CO2 compressor of our own, from the
// tables and from the equation.
func Example() {
	co2, err := fluid.Lookup("CO2")
	if err != nil {
		log.Fatal(err)
	}
	t, err := table.New(co2, table.Range{}) // the default range
	if err != nil {
		log.Fatal(err)
	}
	suction, _ := t.PT(3e6, 270)              // 30 bar, 270 K: vapour
	discharge, _ := t.PH(9e6, suction.H+60e3) // 90 bar, 60 kJ/kg of work
	eq, _ := flash.PH(co2, 9e6, suction.H+60e3)
	fmt.Printf("suction %v, %.2f kg/m3, h = %.3f kJ/kg\n", suction.Phase, suction.Rho, suction.H/1e3)
	fmt.Printf("discharge %v at %.3f K (the equation: %.3f K)\n", discharge.Phase, discharge.T, eq.T)
	fmt.Println("from the tables:", t.CoversPT(3e6, 270), t.CoversPH(9e6, suction.H+60e3))
	// Output:
	// suction Vapor, 79.81 kg/m3, h = -69.327 kJ/kg
	// discharge Supercritical at 363.146 K (the equation: 363.146 K)
	// from the tables: true true
}

// A closed vessel of our own: 20 kg of CO2 in 50 L, its internal energy
// falling as it is cooled; DU from the tables, into the two-phase region.
func ExampleTable_DU() {
	co2, _ := fluid.Lookup("CO2")
	t, err := table.New(co2, table.Range{PMax: 20e6, TMax: 500})
	if err != nil {
		log.Fatal(err)
	}
	rho := 20 / 0.050
	for _, u := range []float64{-150e3, -230e3, -300e3} {
		st, _ := t.DU(rho, u)
		fmt.Printf("u = %4.0f kJ/kg: %-13v %.2f K, %.3f MPa, quality %.3f\n", u/1e3, st.Phase, st.T, st.P/1e6, st.Quality)
	}
	// Output:
	// u = -150 kJ/kg: Supercritical 325.38 K, 10.449 MPa, quality 0.000
	// u = -230 kJ/kg: TwoPhase      289.46 K, 5.249 MPa, quality 0.269
	// u = -300 kJ/kg: TwoPhase      265.89 K, 2.861 MPa, quality 0.124
}

// Where the tables leave a state to the equation: the critical
// neighbourhood.
func ExampleTable_CriticalNeighbourhood() {
	water, _ := fluid.Lookup("water")
	t, err := table.New(water, table.Range{PMax: 30e6, TMax: 900})
	if err != nil {
		log.Fatal(err)
	}
	p1, p2, t1, t2, _, _ := t.CriticalNeighbourhood()
	fmt.Printf("PH and PT: %.2f to %.2f MPa, %.1f to %.1f K\n", p1/1e6, p2/1e6, t1, t2)
	fmt.Println(t.CoversPT(22e6, 650), t.CoversPT(22e6, 700))
	// Output:
	// PH and PT: 19.86 to 24.27 MPa, 638.3 to 679.5 K
	// false true
}
