// Command tables prints property tables of the fluids of tripoint and
// deviation reports of tripoint against tables of reference values.
//
// Usage:
//
//	go run ./examples/tables <command> [flags]
//
// The commands:
//
//	sat       saturation table by temperature or pressure
//	isobar    single-phase states along isobars
//	isotherm  single-phase states along isotherms
//	dev       deviation report against reference values in CSV files
//	check     deviation reports against the published check tables in testdata/
//
// "tables <command> -h" lists the flags of a command. Every flag that
// takes a temperature or pressure names its unit: -t-C, -t-K, -p-bar,
// -p-MPa, -p-kPa, -p-Pa. Lists of values are comma-separated numbers or
// ranges FROM:TO:STEP (TO included when a step lands on it), e.g.
// -t-C -40:30:10 or -p-bar 1,10,50. Tables print in engineering units
// (-units eng: °C, bar, kJ/kg, kJ/(kg K)) or SI units (-units si: K,
// Pa, J/kg, J/(kg K)), density in kg/m³ and sound speed in m/s in both,
// as Markdown (-format md) or as CSV (-format csv). Enthalpy, internal
// energy, Gibbs energy and entropy are on the reference state of the
// published equation of each fluid unless -ref chooses IIR, ASHRAE or
// NBP where the fluid has it (CO2 has no NBP state: it does not boil at
// 101.325 kPa; water's IIR and ASHRAE states lie below its triple point).
// Runs that last more than a second print a progress line to stderr
// (-quiet silences it).
//
// Examples:
//
//	go run ./examples/tables sat -fluid CO2 -t-C -50:30:10 -ref IIR
//	go run ./examples/tables isobar -fluid R134a -p-bar 2,10 -t-C -20:80:10
//	go run ./examples/tables isotherm -fluid water -t-C 300 -p-MPa 1:20:1 -units si -format csv
//	go run ./examples/tables check
//	go run ./examples/tables dev -fluid water testdata/iapws95-table7.csv
//
// # Tables
//
// A saturation table (sat) has a row per temperature or pressure from the
// triple point to the critical point, computed by fluid.SaturationAtT or
// fluid.SaturationAtP: the saturation pressure or temperature and the
// chosen properties (-props) of the saturated liquid (′) and vapour (″),
// and the enthalpy of vaporisation dh. An isobar or isotherm table has a
// row per state from flash.PT: its phase, the chosen properties and a
// note: the flags of the state (saturated, extrapolated beyond the
// published range) or why it has no values (a solid region, outside the
// equation's range). Where an isobar or isotherm crosses the
// vapour-pressure curve between two rows, the saturated liquid and vapour
// (flash.PQ or flash.TQ with q = 0 and 1) are added between them (-sat).
// Computed values print with -digits significant digits (default 6);
// the given temperatures and pressures print as given.
//
// The CSV output is in the check-table layout below, with a source column
// naming the equation it was computed from, so that the dev command
// reads it back (with the same -ref); the saturated rows of an isobar or
// isotherm print their computed temperature or pressure in full there,
// since it fixes their state, and their phase column says which phase.
//
// # The check-table layout
//
// Reference values are CSV files (RFC 4180, read by encoding/csv):
//
//   - Lines starting with # are comments: say there what the table is,
//     where it comes from and in what units it prints.
//   - The first other line is the header; its last column is source, and
//     every row names its source there: the document and its table, and
//     "recalled from memory" where a value was recalled rather than read.
//   - A property column is named quantity[_liq|_vap][_unit]: the quantity
//     T, p, rho, v, h, s, u, g, cv, cp, w, q (quality) or dh (enthalpy of
//     vaporisation), matched without regard to case; _liq or _vap for the
//     saturated liquid or vapour; and the unit, matched exactly: T_K, T_C;
//     p_Pa, p_kPa, p_MPa, p_bar; rho_kg_m3; v_m3_kg, v_dm3_kg; h (u, g,
//     dh) J_kg, kJ_kg; s (cv, cp) J_kgK, kJ_kgK; w_m_s. A column without a
//     unit is in the units of the published tables: T K, p MPa, rho kg/m3,
//     v m3/kg, h u g dh kJ/kg, s cv cp kJ/(kg K), w m/s.
//   - Other columns: fluid (the fluid of the row; else -fluid gives it);
//     phase, where Liquid or Vapor requests that phase of the flashes PT,
//     PH, PS and DU, metastable if need be (the report lists the rows that
//     came out metastable), and other flash phase names request nothing;
//     note.
//     None of them is compared.
//   - A table with any _liq or _vap column is a saturation table: its
//     first property column, T or p, fixes the state (the equation's own
//     saturation), and an unsuffixed p or T is the saturation pressure or
//     temperature. Otherwise the first two property columns fix the
//     state: T and rho (the equation of state at (T, ρ) itself, as the
//     publications' check tables evaluate it), or one of the flashes
//     p+T, p+h, p+s, T+q, p+q, rho+u, h+s, T+s, p+rho (v counts as rho).
//   - Values are written with the digits the table prints, in its
//     notation (0.992418352e-1): the digits written set the tolerance. A
//     bare 0 is exact (a quantity that vanishes identically must come out
//     exactly zero), except in °C. An empty cell is not compared.
//
// The published check tables in testdata/ are in this layout as they
// stand: iapws95-table7.csv names its units in its columns (T_K,
// rho_kg_m3, p_MPa, ...), and iapws95-table8-saturation.csv uses the
// default units of unsuffixed columns (T, p, rho_liq, ...).
//
// # Deviation reports
//
// The dev command computes every row of each file and compares each
// value with its reference: the relative deviation (computed −
// reference)/|reference| in SI units, and the deviation in units of the
// last printed digit of the reference (0.992418352e-1 has a last digit of
// 1e-10). A value agrees if it lies within -limit-digits units of its last
// digit (default 1: the rounding of the printed value) or, if -limit-rel
// is set, within that relative deviation. For each property the report
// gives the number of values, the maximum and mean relative deviation (of
// magnitudes), the largest deviation in last digits, the number beyond
// the limits and the worst state; then the -worst values overall, those
// beyond the limits first; then the rows that could not be evaluated. The
// exit status is 1 if any value is beyond the limits or any row fails,
// which is what a test harness checks.
//
// The check command runs the reports against the published check tables
// of testdata/ (IAPWS-95 Tables 7 and 8) with the publications' limit of
// ±1 in the last printed digit. Every CSV file there must be one of its
// runs or be listed as holding no states (Table 6 holds Helmholtz-energy
// derivatives), so that a new table is never left unchecked.
//
// Exit status: 0 success; 1 deviations beyond the limits, rows not
// evaluated or other failures; 2 bad flags or arguments.
package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
)

func main() {
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}

const usageText = `Usage: tables <command> [flags]

Property tables of the fluids of tripoint, and deviation reports against
tables of reference values.

Commands:
  sat       saturation table by temperature or pressure
  isobar    single-phase states along isobars
  isotherm  single-phase states along isotherms
  dev       deviation report against reference values in CSV files
  check     deviation reports against the published check tables in testdata/

Run "tables <command> -h" for the flags of a command.

Examples:
  tables sat -fluid CO2 -t-C -50:30:10 -ref IIR
  tables isobar -fluid R134a -p-bar 2,10 -t-C -20:80:10
  tables check
`

// run runs the command in args and returns the exit status.
func run(args []string, stdout, stderr io.Writer) int {
	if len(args) == 0 {
		fmt.Fprint(stderr, usageText)
		return 2
	}
	name, rest := args[0], args[1:]
	var err error
	switch name {
	case "sat":
		err = cmdSat(rest, stdout, stderr)
	case "isobar":
		err = cmdLine(true, rest, stdout, stderr)
	case "isotherm":
		err = cmdLine(false, rest, stdout, stderr)
	case "dev":
		err = cmdDev(rest, stdout, stderr)
	case "check":
		err = cmdCheck(rest, stdout, stderr)
	case "-h", "-help", "--help", "help":
		fmt.Fprint(stdout, usageText)
		return 0
	default:
		fmt.Fprintf(stderr, "tables: unknown command %q\n\n%s", name, usageText)
		return 2
	}
	var ue usageError
	switch {
	case err == nil, errors.Is(err, flag.ErrHelp):
		return 0
	case errors.As(err, &ue):
		fmt.Fprintf(stderr, "tables %s: %v\nRun \"tables %s -h\" for help.\n", name, err, name)
		return 2
	}
	fmt.Fprintf(stderr, "tables %s: %v\n", name, err)
	return 1
}
