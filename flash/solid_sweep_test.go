package flash

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// TestSolidSweep runs every flash on pseudo-random states of the solid
// regions of water and CO2 — solids by PT over the model's temperatures
// and pressures up to its limit, solid–vapour and solid–liquid mixtures
// at random points of the curves and fractions, liquid water above the
// melting curves of the high-pressure ices — and checks the backward
// residuals and phases (roundTrip), as the direct solves place these
// states by the curve nodes and must agree with them everywhere.
func TestSolidSweep(t *testing.T) {
	t.Parallel()
	n := 400
	if testing.Short() {
		n = 60
	}
	for _, f := range solidFluids(t) {
		r := rand.New(rand.NewPCG(7, 3))
		s := mustSolid(t, f)
		var k call
		if err := k.init(f, "test", fluid.Input{}, fluid.Input{}, nil, 0); err != nil {
			t.Fatal(err)
		}
		nodes := k.sol.n
		Tlo := f.Limits().TFloor
		if f.Name() == "water" {
			Tlo = 120
		}
		count := map[Phase]int{}
		for i := 0; i < n; i++ {
			var st State
			var err error
			switch r.IntN(4) {
			case 0:
				Thi := nodes.tt // ice Ih melts below 273.16 K
				if nodes.meltRising {
					Thi = nodes.meltEndT() // dry ice up to its melting at 800 MPa
				}
				T := Tlo + r.Float64()*(Thi-Tlo)
				p := math.Exp(math.Log(nodes.subPMin()) + r.Float64()*(math.Log(nodes.solidPMax())-math.Log(nodes.subPMin())))
				st, err = PT(f, p, T)
			case 1:
				c, e := s.SublimationPressure(nodes.subTMin() + r.Float64()*(nodes.tt-nodes.subTMin()))
				if e != nil {
					t.Fatal(e)
				}
				st, err = k.coexistState(&c, true, r.Float64()), nil
			case 2:
				c, e := s.MeltingTemperature(nodes.pt + r.Float64()*(nodes.solidPMax()-nodes.pt))
				if e != nil {
					t.Fatal(e)
				}
				st, err = k.coexistState(&c, false, r.Float64()), nil
			default:
				if f.Name() != "water" {
					continue
				}
				// Liquid water above 208.566 MPa, above the curves of the
				// high-pressure ices.
				p := math.Exp(math.Log(209e6) + r.Float64()*(math.Log(5e9)-math.Log(209e6)))
				Tm, _, _ := k.highIceT(p)
				st, err = PT(f, p, Tm+0.1+r.Float64()*100)
			}
			if err != nil {
				continue
			}
			count[st.Phase]++
			roundTrip(t, f, fmt.Sprintf("sweep %v", st.Phase), &st, Options{}, nil)
		}
		t.Logf("%s: %v", f.Name(), count)
	}
}
