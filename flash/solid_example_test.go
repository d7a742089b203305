package flash_test

import (
	"fmt"

	"github.com/tripoint-thermo/tripoint/flash"
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

// Liquid CO2 from a storage tank of our own at 15 °C and 70 bar,
// throttled to atmospheric pressure: the enthalpy is kept, and the jet
// ends as dry-ice snow in its vapour at the sublimation temperature.
// Caution: CO2 is an asphyxiant, dry ice causes cold burns, and the snow
// can block vent lines; follow local codes and licensed practice.
func ExamplePH_dryIce() {
	f := co2()
	feed, _ := flash.PT(f, 70e5, 288.15)
	out, err := flash.PH(f, 101325, feed.H)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("feed: %v, h = %.2f kJ/kg\n", feed.Phase, feed.H/1e3)
	fmt.Printf("at 1 atm: %v at %.2f K (%.2f °C)\n", out.Phase, out.T, out.T-273.15)
	fmt.Printf("dry ice %.1f %% by mass, %.1f kg/m3; vapour %.3f kg/m3\n",
		100*out.Solid, out.Phases[0].Rho, out.Phases[1].Rho)
	// Output:
	// feed: Liquid, h = -272.02 kJ/kg
	// at 1 atm: SolidVapor at 194.68 K (-78.47 °C)
	// dry ice 32.8 % by mass, 1572.7 kg/m3; vapour 2.815 kg/m3
}

// A closed CO2 vessel of our own (500 kg/m3) cooled through the triple
// point: the temperature and pressure stay at the triple point while the
// liquid freezes, then the contents continue as dry ice and vapour.
func ExampleDU_triplePoint() {
	f := co2()
	start, _ := flash.DT(f, 500, 230)
	for _, du := range []float64{0, 40e3, 120e3, 200e3, 240e3} {
		st, err := flash.DU(f, 500, start.U-du)
		if err != nil {
			fmt.Println(err)
			return
		}
		liquid := 0.0
		for _, ph := range st.Phases[:st.N] {
			if ph.Phase == flash.Liquid {
				liquid = ph.Fraction
			}
		}
		fmt.Printf("%-10v T = %.3f K, p = %7.2f kPa, solid %.3f, liquid %.3f, vapour %.4f\n",
			st.Phase, st.T, st.P/1e3, st.Solid, liquid, st.Quality)
	}
	// Output:
	// TwoPhase   T = 230.000 K, p =  892.91 kPa, solid 0.000, liquid 0.974, vapour 0.0265
	// Triple     T = 216.592 K, p =  517.96 kPa, solid 0.055, liquid 0.929, vapour 0.0162
	// Triple     T = 216.592 K, p =  517.96 kPa, solid 0.451, liquid 0.531, vapour 0.0173
	// Triple     T = 216.592 K, p =  517.96 kPa, solid 0.847, liquid 0.134, vapour 0.0184
	// SolidVapor T = 209.332 K, p =  311.31 kPa, solid 0.989, liquid 0.000, vapour 0.0113
}

// Frost on a cold coil of our own: water vapour at 300 Pa (below its
// triple-point pressure) condenses straight to ice.
func ExamplePQ_frost() {
	w, _ := fluid.Lookup("water")
	st, err := flash.PQ(w, 300, 0.5)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%v at %.2f K: ice %.0f kg/m3, vapour %.5f kg/m3, heat of sublimation %.1f kJ/kg\n",
		st.Phase, st.T, st.Phases[0].Rho, st.Phases[1].Rho, (st.Phases[1].H-st.Phases[0].H)/1e3)
	// Output:
	// SolidVapor at 264.78 K: ice 918 kg/m3, vapour 0.00246 kg/m3, heat of sublimation 2836.3 kJ/kg
}

// Water in a high-pressure cell of our own at 1 GPa: liquid at 310 K;
// at 290 K ice VI is stable, which is outside the model (it has ice Ih
// only), and PT says so; the metastable liquid is there on request.
// Caution: high-pressure equipment needs design to local codes and
// licensed practice.
func ExamplePT_highPressureIce() {
	water, _ := fluid.Lookup("water")
	st, _ := flash.PT(water, 1e9, 310)
	fmt.Printf("310 K: %v, %.1f kg/m3\n", st.Phase, st.Rho)
	if _, err := flash.PT(water, 1e9, 290); err != nil {
		fmt.Println("290 K:", err)
	}
	meta, _ := flash.PTWith(water, 1e9, 290, flash.Options{Phase: flash.Liquid, AllowMetastable: true})
	fmt.Printf("290 K on request: %v, metastable %v\n", meta.Phase, meta.Flags&flash.Metastable != 0)
	// Output:
	// 310 K: Liquid, 1232.4 kg/m3
	// 290 K: flash.PT: p = 1000000000 Pa, T = 290 K: out of range (outside the models of water: at 1e+09 Pa liquid water freezes to ice VI below 300.243 K (its melting curve, IAPWS R14-08); ice VI and the other ices that are stable beyond it are outside the model, which has ice Ih only, up to 208.566 MPa)
	// 290 K on request: Liquid, metastable true
}
