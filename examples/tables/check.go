package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"slices"
	"strings"
)

// errBeyond reports a deviation run with values beyond its limits or
// rows that could not be evaluated (exit status 1).
var errBeyond = errors.New("deviations beyond the limits")

// shippedRun is a deviation run against a published check table in
// testdata/: the file, the fluid whose equation the table checks, and
// what the table holds.
type shippedRun struct {
	file, fluid, what string
}

// shipped lists the runs of the check command. Every CSV file of
// testdata/ is either here or in notStates; a file in neither makes the
// check fail, so that no table is left unchecked by oversight.
var shipped = []shippedRun{
	{"iapws95-table7.csv", "water", "IAPWS R6-95(2018) Table 7: p, cv, w, s at 11 single-phase (T, rho)"},
	{"iapws95-table8-saturation.csv", "water", "IAPWS R6-95(2018) Table 8: saturation at 275, 450 and 625 K"},
}

// notStates are the CSV files of testdata/ that hold no properties of
// states, with the reason and where they are checked instead.
var notStates = map[string]string{
	"iapws95-table6.csv": "the reduced Helmholtz energy and its derivatives at one state; checked by fluid/water_test.go",
}

// checkLimits are those of the published tables: ±1 in the last printed
// digit, which is rounding.
var checkLimits = limits{digits: 1}

func cmdCheck(args []string, stdout, stderr io.Writer) error {
	var list []string
	for _, r := range shipped {
		list = append(list, "  "+r.file+" ("+r.fluid+"): "+r.what)
	}
	cmd := newCommand("check", `Usage: tables check [flags]

Runs the deviation report against every published check table in the
testdata directory and asserts the publications' own rule: each value
within ±1 in its last printed digit. The runs:

`+strings.Join(list, "\n")+`

A CSV file of the directory that is neither a run nor known to hold no
states is an error. Exit status 1 if any value is beyond the limit, any
row fails or any file is unknown.

Example (from the repository root):
  tables check
`)
	fs := cmd.fs
	dir := fs.String("dir", "testdata", "directory of the check tables (the repository's testdata/)")
	format := fs.String("format", "md", "output format: md or csv")
	worst := fs.Int("worst", 3, "list the N worst values of each table")
	quiet := fs.Bool("quiet", false, "no progress line on stderr")
	if err := cmd.parse(args, stdout); err != nil {
		return err
	}
	if err := cmd.noArgs(); err != nil {
		return err
	}
	f, err := parseFormat(*format)
	if err != nil {
		return usageError{err}
	}
	if *worst < 0 {
		return usagef("-worst %d: want 0 or more", *worst)
	}
	rps, unknown, err := runShipped(*dir, progressOut(*quiet, stderr))
	if err != nil {
		return err
	}
	if err := writeReports(stdout, rps, f, *worst); err != nil {
		return err
	}
	n, beyond, failed := 0, 0, 0
	for _, rp := range rps {
		n += rp.all.n
		beyond += rp.all.beyond
		failed += len(rp.failed)
	}
	if f == formatMD {
		fmt.Fprintf(stdout, "\nChecked %d tables, %d values: %d beyond ±1 in the last printed digit, %d rows not evaluated.\n",
			len(rps), n, beyond, failed)
	}
	if len(unknown) > 0 {
		return fmt.Errorf("%s: %s: not in the list of runs (examples/tables/check.go): add a run or a reason it holds no states",
			*dir, strings.Join(unknown, ", "))
	}
	if beyond > 0 || failed > 0 {
		return fmt.Errorf("%w: %d values beyond ±1 in the last printed digit, %d rows not evaluated", errBeyond, beyond, failed)
	}
	return nil
}

// runShipped runs the shipped deviation reports against the tables in
// dir and lists the CSV files of dir that are neither runs nor known to
// hold no states.
func runShipped(dir string, progOut io.Writer) (rps []*report, unknown []string, err error) {
	files, err := filepath.Glob(filepath.Join(dir, "*.csv"))
	if err != nil {
		return nil, nil, err
	}
	if len(files) == 0 {
		return nil, nil, fmt.Errorf("-dir %s: no CSV files (run from the repository root, or give -dir)", dir)
	}
	known := map[string]bool{}
	for _, r := range shipped {
		known[r.file] = true
	}
	for _, p := range files {
		b := filepath.Base(p)
		if _, ok := notStates[b]; !ok && !known[b] {
			unknown = append(unknown, b)
		}
	}
	slices.Sort(unknown)
	var cfs []*checkFile
	total := 0
	for _, r := range shipped {
		p := filepath.Join(dir, r.file)
		fh, err := os.Open(p)
		if err != nil {
			return nil, nil, err
		}
		cf, err := readCheckFile(fh, p)
		fh.Close()
		if err != nil {
			return nil, nil, err
		}
		cfs = append(cfs, cf)
		total += len(cf.rows)
	}
	prog := newProgress(progOut, "tables check", total, nil)
	for i, cf := range cfs {
		rp, err := deviations(cf, &fluidSource{def: shipped[i].fluid, ref: "default"}, checkLimits, prog)
		if err != nil {
			return nil, nil, err
		}
		rps = append(rps, rp)
	}
	prog.end()
	return rps, unknown, nil
}

func cmdDev(args []string, stdout, stderr io.Writer) error {
	cmd := newCommand("dev", `Usage: tables dev [flags] FILE...

Reads reference values in the check-table layout (see the package
documentation or testdata/README.md; "-" reads standard input), computes
every row with tripoint, and prints for each property the maximum and
mean relative deviation, the largest deviation in units of the last
printed digit, the number of values beyond the limits and the worst
state, then the worst values. Exit status 1 if any value is beyond the
limits or any row cannot be evaluated.

Example:
  tables dev -fluid water testdata/iapws95-table7.csv
`)
	fs := cmd.fs
	fl := fs.String("fluid", "", "fluid of rows without a fluid column (required then)")
	ref := fs.String("ref", "default", "reference state of the files' h, u, g and s: default (the published equation's), IIR, ASHRAE or NBP")
	format := fs.String("format", "md", "output format: md or csv")
	worst := fs.Int("worst", 5, "list the N worst values of each file")
	limDigits := fs.Float64("limit-digits", 1, "a value agrees within this many units of its last printed digit")
	limRel := fs.Float64("limit-rel", 0, "or within this relative deviation, if positive")
	quiet := fs.Bool("quiet", false, "no progress line on stderr")
	if err := cmd.parse(args, stdout); err != nil {
		return err
	}
	if fs.NArg() == 0 {
		return usagef("give one or more files of reference values (see -h)")
	}
	f, err := parseFormat(*format)
	if err != nil {
		return usageError{err}
	}
	if *worst < 0 {
		return usagef("-worst %d: want 0 or more", *worst)
	}
	if !(*limDigits >= 0) || !(*limRel >= 0) || *limDigits > 1e300 || *limRel > 1e300 {
		return usagef("-limit-digits %v, -limit-rel %v: want finite values of 0 or more", *limDigits, *limRel)
	}
	if _, err := parseRef(*ref); err != nil {
		return usageError{err}
	}
	var cfs []*checkFile
	total := 0
	for _, p := range fs.Args() {
		var cf *checkFile
		if p == "-" {
			cf, err = readCheckFile(os.Stdin, "stdin")
		} else {
			var fh *os.File
			if fh, err = os.Open(p); err != nil {
				return err
			}
			cf, err = readCheckFile(fh, p)
			fh.Close()
		}
		if err != nil {
			return err
		}
		cfs = append(cfs, cf)
		total += len(cf.rows)
	}
	fsrc := &fluidSource{def: *fl, ref: *ref}
	prog := newProgress(progressOut(*quiet, stderr), "tables dev", total, nil)
	var rps []*report
	for _, cf := range cfs {
		rp, err := deviations(cf, fsrc, limits{digits: *limDigits, rel: *limRel}, prog)
		if err != nil {
			return err
		}
		rps = append(rps, rp)
	}
	prog.end()
	if err := writeReports(stdout, rps, f, *worst); err != nil {
		return err
	}
	var bad []string
	for _, rp := range rps {
		if !rp.ok() {
			bad = append(bad, rp.cf.path+": "+rp.summary())
		}
	}
	if len(bad) > 0 {
		return fmt.Errorf("%w: %s", errBeyond, strings.Join(bad, "; "))
	}
	return nil
}
