package main

import (
	"bytes"
	"math"
	"strconv"
	"strings"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// TestRun checks the printed table: one row per point, every number
// parses, each printed value is the equation's value in the printed unit
// to the printed digits, and each point is on the side of saturation its
// name claims.
func TestRun(t *testing.T) {
	var buf bytes.Buffer
	if err := run(&buf); err != nil {
		t.Fatal(err)
	}
	water, err := fluid.Lookup("water")
	if err != nil {
		t.Fatal(err)
	}
	rows := map[string][]float64{}
	for _, line := range strings.Split(buf.String(), "\n") {
		for _, pt := range plant {
			name, rest, ok := strings.Cut(strings.TrimSpace(line), "  ")
			if !ok || name != pt.name {
				continue
			}
			var vals []float64
			for _, s := range strings.Fields(rest) {
				v, err := strconv.ParseFloat(s, 64)
				if err != nil {
					t.Fatalf("row %q: %v", line, err)
				}
				vals = append(vals, v)
			}
			rows[pt.name] = vals
		}
	}
	if len(rows) != len(plant) {
		t.Fatalf("%d rows for %d points:\n%s", len(rows), len(plant), buf.String())
	}
	for _, pt := range plant {
		v := rows[pt.name]
		if len(v) != 7 {
			t.Errorf("%s: %d numbers, want 7", pt.name, len(v))
			continue
		}
		p, err := water.Props(pt.tC+kelvin, pt.rho)
		if err != nil {
			t.Fatal(err)
		}
		// Printed value, equation's value in that unit, half a unit of the
		// printed precision (%.5g for p, %.2f for h, %.4f for s and cp,
		// %.1f for w).
		for _, c := range []struct {
			name           string
			printed, value float64
			halfUnit       float64
		}{
			{"T", v[0], pt.tC, 0.005},
			{"p", v[2], p.P / 1e5, 0.5 * math.Pow(10, math.Floor(math.Log10(p.P/1e5))-4)},
			{"h", v[3], p.H / 1e3, 0.005},
			{"s", v[4], p.S / 1e3, 0.00005},
			{"cp", v[5], p.Cp / 1e3, 0.00005},
			{"w", v[6], p.W, 0.05},
		} {
			if math.Abs(c.printed-c.value) > c.halfUnit*(1+1e-9) {
				t.Errorf("%s: %s printed %v, equation gives %v", pt.name, c.name, c.printed, c.value)
			}
		}
		// Which side of saturation: the IAPWS auxiliary vapour pressure at
		// T. Liquid points lie above it, vapour points below it (or below
		// pc above Tc), and the supercritical loop is above Tc and pc
		// (the phase definitions of DESIGN.md).
		T := pt.tC + kelvin
		c := water.Critical()
		switch pt.name {
		case "feed water, pump outlet", "boiler water":
			if ps, err := water.AuxVaporPressure(T); err != nil || p.P <= ps {
				t.Errorf("%s: p = %g Pa, not above the vapour pressure %g Pa (%v)", pt.name, p.P, ps, err)
			}
		case "boiler steam", "superheater outlet", "condenser inlet":
			ps := c.P
			if T < c.T {
				if ps, err = water.AuxVaporPressure(T); err != nil {
					t.Fatal(err)
				}
			}
			if p.P >= ps {
				t.Errorf("%s: p = %g Pa, not below %g Pa", pt.name, p.P, ps)
			}
		case "supercritical test loop":
			if T <= c.T || p.P <= c.P {
				t.Errorf("%s: %g K, %g Pa is not supercritical", pt.name, T, p.P)
			}
		default:
			t.Errorf("%s: no check of its phase", pt.name)
		}
	}
	// Facts of common practice (no source): liquid water near 40 C has
	// cp close to 4.18 kJ/(kg K) and a speed of sound near 1530 m/s.
	if v := rows["feed water, pump outlet"]; math.Abs(v[5]-4.18) > 0.03 || math.Abs(v[6]-1530) > 20 {
		t.Errorf("feed water: cp = %v kJ/(kg K), w = %v m/s", v[5], v[6])
	}
}
