package main

import (
	"strings"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
	"github.com/tripoint-thermo/tripoint/sublimation"
)

// knownFailure is a group of failures the sweep found that is still
// open, with its cause; a failure that matches no group fails the test.
type knownFailure struct {
	fluid   string // "" for any
	kind    failKind
	failing string // the flash that failed ("consistency" for those checks)
	text    string // a part of the failure's text
	why     string
}

// known lists the open groups of failures: none. The 40 groups the
// sweep found before the reliability round (its failure report, and the
// groups found after that session's merges) were fixed in package flash,
// fluid and sublimation, each with a regression test
// (flash/regress_test.go, fluid/regress_test.go), or, where the sweep
// itself was wrong, in the sweep (see its judge: the metastable grid no
// longer puts states on the spinodal itself, DT near Tc and beyond the
// high-pressure ices is judged by the documented contract, and the
// consistency differences are extrapolated next to the spinodals).
var known []knownFailure

func (k *knownFailure) matches(fl string, f *failure) bool {
	return (k.fluid == "" || k.fluid == fl) && k.kind == f.kind && k.failing == f.failing &&
		strings.Contains(f.text, k.text)
}

// TestSweep runs the sweep over some 3000 cases per fluid (800 under
// -short) through every region and asserts what the
// command reports: no failure outside the known groups — no refused state
// that exists, no wrong phase, no NaN or infinity outside the contract,
// no panic, every round trip within the backward-residual bounds of
// DESIGN.md, every consistency check within its bound — and states in
// every region.
func TestSweep(t *testing.T) {
	t.Parallel()
	n := 1200.0
	if testing.Short() {
		n = 150 // about 800 cases: the edges, the triple point and the saturation grid have a least size
	}
	for _, name := range fluid.Names() {
		t.Run(name, func(t *testing.T) {
			t.Parallel()
			f, err := fluid.Lookup(name)
			if err != nil {
				t.Fatal(err)
			}
			cfg := &config{states: n, workers: 2, show: 1 << 30}
			for i := range cfg.regions {
				cfg.regions[i] = true
			}
			rep, err := sweep(f, cfg, nil)
			if err != nil {
				t.Fatal(err)
			}
			r := rep.res
			for k := range r.first {
				for i := range r.first[k] {
					fl := &r.first[k][i]
					listed := false
					for j := range known {
						if known[j].matches(name, fl) {
							listed = true
							break
						}
					}
					if !listed {
						t.Errorf("[%s] %s", failNames[fl.kind], fl.text)
					}
				}
			}
			_, serr := sublimation.For(f)
			noSolid := serr != nil
			for i := range nRegions {
				switch {
				case i == rSolid && noSolid:
					// Without a solid model the solid region is refused.
					if r.refusedOK[i] == 0 || r.states[i] != 0 {
						t.Errorf("the solid region of %s: %d states, %d refusals", name, r.states[i], r.refusedOK[i])
					}
				case r.states[i] == 0:
					t.Errorf("no state in region %s", regionNames[i])
				}
			}
			if r.cases < int(n) {
				t.Errorf("%d cases, want at least %d", r.cases, int(n))
			}
		})
	}
}

// TestSweepDeterministic checks that the result does not depend on the
// number of goroutines: the grid, not the scheduling, decides what is
// computed and reported.
func TestSweepDeterministic(t *testing.T) {
	t.Parallel()
	f, err := fluid.Lookup("CO2")
	if err != nil {
		t.Fatal(err)
	}
	var out [2]string
	for i, w := range []int{1, 3} {
		cfg := &config{states: 150, workers: w, show: 1 << 30}
		for j := range cfg.regions {
			cfg.regions[j] = true
		}
		rep, err := sweep(f, cfg, nil)
		if err != nil {
			t.Fatal(err)
		}
		rep.elapsed, rep.workers = 0, 0
		var b strings.Builder
		rep.print(&b, 1<<30)
		out[i] = b.String()
	}
	if out[0] != out[1] {
		t.Errorf("1 and 3 goroutines report differently:\n%s\n---\n%s", out[0], out[1])
	}
}

// TestFlags checks the command's flags: defaults, a fluid by alias, a
// region list, and the errors of bad values.
func TestFlags(t *testing.T) {
	t.Parallel()
	var sink strings.Builder
	cfg, err := parseFlags([]string{"-fluid", "carbon dioxide", "-states", "5e4", "-regions", "triple,solid", "-quiet"}, &sink)
	if err != nil {
		t.Fatal(err)
	}
	if len(cfg.fluids) != 1 || cfg.fluids[0] != "CO2" || cfg.states != 5e4 || cfg.progress ||
		!cfg.regions[rTriple] || !cfg.regions[rSolid] || cfg.regions[rFluid] {
		t.Errorf("parsed %+v", cfg)
	}
	for _, args := range [][]string{
		{"-fluid", "nitrogen"}, {"-states", "0"}, {"-states", "NaN"}, {"-workers", "0"},
		{"-regions", "nowhere"}, {"extra"},
	} {
		if _, err := parseFlags(args, &sink); err == nil {
			t.Errorf("%v: no error", args)
		}
	}
}
