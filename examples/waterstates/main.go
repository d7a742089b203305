// Command waterstates prints the state of water at a few points of a
// small steam plant of our own: feed water, boiler water and steam, the
// superheater outlet, the condenser inlet, and a supercritical test loop.
//
// Each point is given by its temperature and density, and the program
// prints what the IAPWS-95 equation of state gives there: pressure,
// enthalpy, entropy, isobaric heat capacity and speed of sound. The plant
// and its numbers are a demonstration, not a design.
//
// Usage:
//
//	go run ./examples/waterstates
package main

import (
	"fmt"
	"io"
	"os"
	"text/tabwriter"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// point is a point of the demonstration plant: its temperature in °C and
// its density in kg/m³.
type point struct {
	name string
	tC   float64
	rho  float64
}

// plant lists the points, in the order the water passes them.
var plant = []point{
	{"feed water, pump outlet", 40, 994.0},
	{"boiler water", 250, 800.0},
	{"boiler steam", 250, 19.0},
	{"superheater outlet", 540, 35.0},
	{"condenser inlet", 45, 0.06},
	{"supercritical test loop", 600, 100.0},
}

const kelvin = 273.15 // 0 °C in K

func main() {
	if err := run(os.Stdout); err != nil {
		fmt.Fprintln(os.Stderr, "waterstates:", err)
		os.Exit(1)
	}
}

// run prints the table of states to w.
func run(w io.Writer) error {
	water, err := fluid.Lookup("water")
	if err != nil {
		return err
	}
	fmt.Fprintf(w, "Water at the points of our demonstration steam plant; %s\n\n", water.EquationOfState())
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', tabwriter.AlignRight)
	fmt.Fprintln(tw, "point\tT [C]\trho [kg/m3]\tp [bar]\th [kJ/kg]\ts [kJ/(kg K)]\tcp [kJ/(kg K)]\tw [m/s]\t")
	for _, pt := range plant {
		p, err := water.Props(pt.tC+kelvin, pt.rho)
		if err != nil {
			return fmt.Errorf("%s: %w", pt.name, err)
		}
		fmt.Fprintf(tw, "%s\t%.2f\t%.4g\t%.5g\t%.2f\t%.4f\t%.4f\t%.1f\t\n",
			pt.name, pt.tC, pt.rho, p.P/1e5, p.H/1e3, p.S/1e3, p.Cp/1e3, p.W)
	}
	if err := tw.Flush(); err != nil {
		return err
	}
	fmt.Fprintln(w, "\nReference state: u = 0, s = 0 for the saturated liquid at the triple point (IAPWS-95).")
	return nil
}
