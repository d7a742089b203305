package main

import (
	"errors"
	"flag"
	"io"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/tripoint-thermo/tripoint/examples/internal/kit"
)

// TestRender draws the charts of every kind of fluid into a temporary
// folder and checks the files: valid PNG of the page size at 150 dpi,
// well-formed SVG of the page size in points, a sensible file size, and
// the labels each chart must carry.
func TestRender(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		fluid  string
		args   []string
		want   []string // texts in every SVG
		absent []string
	}{
		{"CO2", nil, []string{"triple line", "solid + vapour", "solid + liquid", "dry ice", "critical point", "liquid + vapour", "supercritical"}, nil},
		{"water", []string{"-units", "si", "-charts", "ph"}, []string{"triple line", "solid + vapour", "ice Ih", "pressure p [MPa]"}, nil},
		{"R134a", []string{"-ref", "IIR", "-pmax-bar", "60", "-tmin-C", "-60"}, []string{"critical point", "reference state: IIR"}, []string{"triple line", "solid + vapour"}},
	} {
		if testing.Short() && tc.fluid != "CO2" {
			continue // the race run in CI: the fluid with a solid model only
		}
		t.Run(tc.fluid, func(t *testing.T) {
			t.Parallel()
			dir := t.TempDir()
			var out, errs strings.Builder
			args := append([]string{"-fluid", tc.fluid, "-out", dir, "-points", "40", "-width-cm", "20", "-height-cm", "15"}, tc.args...)
			if err := run(args, &out, &errs); err != nil {
				t.Fatalf("%v\n%s", err, errs.String())
			}
			files := strings.Fields(out.String())
			kinds := 2
			if strings.Contains(strings.Join(tc.args, " "), "-charts ph") {
				kinds = 1
			}
			if len(files) != 2*kinds {
				t.Fatalf("files written: %q", files)
			}
			if !strings.Contains(errs.String(), "isochores") || !strings.Contains(errs.String(), "done in") {
				t.Errorf("no progress line: %q", errs.String())
			}
			for _, name := range files {
				fi, err := os.Stat(name)
				if err != nil {
					t.Fatal(err)
				}
				if fi.Size() < 20e3 || fi.Size() > 5e6 {
					t.Errorf("%s: %d bytes", name, fi.Size())
				}
				switch filepath.Ext(name) {
				case ".png":
					w, h, err := kit.CheckPNG(name)
					if err != nil || math.Abs(float64(w)-20/2.54*150) > 2 || math.Abs(float64(h)-15/2.54*150) > 2 {
						t.Errorf("%s: %d x %d px, %v", name, w, h, err)
					}
				case ".svg":
					w, h, texts, err := kit.CheckSVG(name)
					if err != nil || math.Abs(w-20/2.54*72) > 1 || math.Abs(h-15/2.54*72) > 1 {
						t.Errorf("%s: %g x %g pt, %v", name, w, h, err)
					}
					for _, s := range tc.want {
						if !strings.Contains(texts, s) {
							t.Errorf("%s lacks the text %q", name, s)
						}
					}
					for _, s := range tc.absent {
						if strings.Contains(texts, s) {
							t.Errorf("%s has the text %q", name, s)
						}
					}
				default:
					t.Errorf("unexpected file %s", name)
				}
			}
		})
	}
}

func TestBadFlags(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		args []string
		want string
	}{
		{[]string{"-fluid", "nitrogen"}, "nitrogen"},
		{[]string{"-ref", "NBP"}, "-ref"}, // CO2 has no liquid at 101.325 kPa
		{[]string{"-ref", "other"}, "-ref"},
		{[]string{"-charts", "ph,hs"}, "-charts"},
		{[]string{"-units", "imperial"}, "-units"},
		{[]string{"-pmax-bar", "1e6"}, "-pmax-bar"},
		{[]string{"-pmin-bar", "100", "-pmax-bar", "50"}, "-pmin-bar"},
		{[]string{"-tmin-C", "-300"}, "-tmin-C"},
		{[]string{"-tmax-K", "5000"}, "-tmax-C"},
		{[]string{"-tmax-C", "x"}, "-tmax-C"},
		{[]string{"-points", "3"}, "-points"},
		{[]string{"-width-cm", "1"}, "-width-cm"},
	} {
		var errs strings.Builder
		err := run(tc.args, io.Discard, &errs)
		if err == nil || errors.Is(err, flag.ErrHelp) {
			t.Errorf("%v: error %v", tc.args, err)
			continue
		}
		if !strings.Contains(errs.String()+err.Error(), tc.want) {
			t.Errorf("%v: message %q does not name %q", tc.args, errs.String(), tc.want)
		}
	}
	var errs strings.Builder
	if err := run([]string{"-h"}, io.Discard, &errs); !errors.Is(err, flag.ErrHelp) {
		t.Errorf("-h: %v", err)
	}
	for _, w := range []string{"-fluid", "-pmax-bar", "-pmax-MPa", "-tmin-C", "-tmin-K", "solid"} {
		if !strings.Contains(errs.String(), w) {
			t.Errorf("-h lacks %q", w)
		}
	}
}
