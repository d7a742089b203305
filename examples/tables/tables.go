package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// values holds the quantities of one state in SI units, indexed by
// quantity; NaN marks a quantity the state does not have.
type values [nQuantities]float64

func undefinedValues() values {
	var v values
	for i := range v {
		v[i] = math.NaN()
	}
	return v
}

// propsValues are the values of the equation of state at (T, ρ).
func propsValues(p fluid.Props) values {
	v := undefinedValues()
	v[qT], v[qP], v[qRho], v[qV] = p.T, p.P, p.Rho, 1/p.Rho
	v[qH], v[qS], v[qU], v[qG] = p.H, p.S, p.U, p.G
	v[qCv], v[qCp], v[qW] = p.Cv, p.Cp, p.W
	return v
}

// stateValues are the values of a flash state.
func stateValues(st flash.State) values {
	v := undefinedValues()
	v[qT], v[qP], v[qRho], v[qV] = st.T, st.P, st.Rho, 1/st.Rho
	v[qH], v[qS], v[qU], v[qG] = st.H, st.S, st.U, st.H-st.T*st.S
	v[qCv], v[qCp], v[qW], v[qQ] = st.Cv, st.Cp, st.W, st.Quality
	return v
}

// satValues are the values of a column of a saturation table.
func satValue(s fluid.Saturation, c column) float64 {
	switch {
	case c.phase == phaseLiq:
		return propsValues(s.Liquid)[c.q]
	case c.phase == phaseVap:
		return propsValues(s.Vapor)[c.q]
	case c.q == qT:
		return s.T
	case c.q == qP:
		return s.P
	case c.q == qDh:
		return s.Vapor.H - s.Liquid.H
	}
	return math.NaN()
}

// flagNotes describes the flags of a state for the note column.
func flagNotes(fl fluid.Flags) string {
	var s []string
	for _, x := range []struct {
		f    fluid.Flags
		text string
	}{
		{fluid.Saturated, "saturated"},
		{fluid.Extrapolated, "extrapolated beyond the published range"},
		{fluid.Metastable, "metastable"},
		{fluid.AtCritical, "critical point"},
		{fluid.Indeterminate, "on a phase boundary: one of its phases"},
	} {
		if fl&x.f != 0 {
			s = append(s, x.text)
		}
	}
	return strings.Join(s, "; ")
}

// errorNote is the text of a failed row: the cause and the explanation of
// a *fluid.Error without its echo of the inputs (the row shows them).
func errorNote(err error) string {
	var fe *fluid.Error
	if errors.As(err, &fe) && fe.Err != nil {
		if fe.Range != "" {
			return fe.Err.Error() + ": " + fe.Range
		}
		return fe.Err.Error()
	}
	return err.Error()
}

// tableOpts are the resolved options of a table command.
type tableOpts struct {
	f      *fluid.Fluid
	us     unitSystem
	format outFormat
	props  []quantity
	digits int
}

func (o *options) resolve(allowed []quantity) (tableOpts, error) {
	var t tableOpts
	var err error
	if t.format, err = parseFormat(o.format); err != nil {
		return t, err
	}
	if t.us, err = parseUnitSystem(o.units); err != nil {
		return t, err
	}
	if t.props, err = parseProps(o.props, allowed); err != nil {
		return t, err
	}
	if o.digits < 3 || o.digits > 17 {
		return t, fmt.Errorf("-digits %d: want 3 to 17", o.digits)
	}
	t.digits = o.digits
	if t.f, err = lookupFluid(o.fluid, o.ref); err != nil {
		return t, err
	}
	return t, nil
}

// cell prints the SI value v of column c. An energy or entropy within
// 1e-12·R·Tc or 1e-12·R of zero prints as zero: that is the rounding of
// the reference-state offsets (h′ of the state that defines the
// reference comes out as 1e-11 J/kg, not 0), far below any printed digit.
func (t *tableOpts) cell(c column, v float64) string {
	crit, R := t.f.Critical(), t.f.GasConstant()
	switch c.q {
	case qH, qU, qG, qDh:
		if math.Abs(v) < 1e-12*R*crit.T {
			v = 0
		}
	case qS:
		if math.Abs(v) < 1e-12*R {
			v = 0
		}
	}
	return formatValue(c.u.fromSI(v), t.digits)
}

func (t *tableOpts) header(title string) *table {
	return &table{
		title: title,
		notes: []string{
			"Equation of state: " + t.f.EquationOfState() + ".",
			"Reference state of h, u, g and s: " + refText(t.f) + ".",
		},
		source:  "computed by tripoint examples/tables from " + t.f.EquationOfState(),
		noteCol: -1,
	}
}

func (tb *table) addCol(c column, text bool) {
	tb.cols = append(tb.cols, c.name())
	tb.labels = append(tb.labels, c.label())
	tb.text = append(tb.text, text)
}

func (tb *table) addTextCol(name string) {
	tb.cols = append(tb.cols, name)
	tb.labels = append(tb.labels, name)
	tb.text = append(tb.text, true)
}

// usageError is an error in the flags or arguments (exit status 2).
type usageError struct{ err error }

func (e usageError) Error() string { return e.err.Error() }
func (e usageError) Unwrap() error { return e.err }

func usagef(format string, a ...any) error { return usageError{fmt.Errorf(format, a...)} }

// command is the flag set of a command and its help text.
type command struct {
	fs    *flag.FlagSet
	intro string // the help text before the list of flags
}

// newCommand returns a command whose flag set prints nothing itself:
// parse reports errors, and -h prints the help to stdout.
func newCommand(name, intro string) *command {
	fs := flag.NewFlagSet(name, flag.ContinueOnError)
	fs.SetOutput(io.Discard)
	fs.Usage = func() {}
	return &command{fs: fs, intro: intro}
}

// help prints the help text and the flags to w.
func (c *command) help(w io.Writer) {
	fmt.Fprint(w, c.intro)
	fmt.Fprintln(w, "\nFlags:")
	c.fs.SetOutput(w)
	c.fs.PrintDefaults()
	c.fs.SetOutput(io.Discard)
}

// parse parses args; -h prints the help to stdout and returns
// flag.ErrHelp; a bad flag or an argument where none belongs is a
// usageError.
func (c *command) parse(args []string, stdout io.Writer) error {
	if err := c.fs.Parse(args); err != nil {
		if errors.Is(err, flag.ErrHelp) {
			c.help(stdout)
			return err
		}
		return usageError{err}
	}
	return nil
}

// noArgs is an error if arguments follow the flags.
func (c *command) noArgs() error {
	if c.fs.NArg() > 0 {
		return usagef("unexpected argument %q (flags come first, each with its value; see -h)", c.fs.Arg(0))
	}
	return nil
}

var satProps = []quantity{qRho, qV, qH, qS, qU, qG, qCv, qCp, qW, qDh}

// cmdSat prints a saturation table by temperature or by pressure.
func cmdSat(args []string, stdout, stderr io.Writer) error {
	cmd := newCommand("sat", `Usage: tables sat [flags]

Prints the vapour-liquid saturation table of a fluid by temperature
(-t-C or -t-K) or by pressure (-p-bar, -p-MPa, -p-kPa or -p-Pa), from the
triple point to the critical point, with the properties of the saturated
liquid (') and vapour (") in each row.

Properties (-props):
`+propNames(satProps)+`

`+listHelp+`
Example:
  tables sat -fluid CO2 -t-C -50:30:10 -ref IIR
`)
	fs := cmd.fs
	var o options
	o.define(fs, "rho,h,dh,s")
	tf := newFamily(fs, qT, "t", "temperatures", "saturation temperatures")
	pf := newFamily(fs, qP, "p", "pressures", "saturation pressures")
	if err := cmd.parse(args, stdout); err != nil {
		return err
	}
	if err := cmd.noArgs(); err != nil {
		return err
	}
	tg, byT, err := tf.get()
	if err != nil {
		return usageError{err}
	}
	pg, byP, err := pf.get()
	if err != nil {
		return usageError{err}
	}
	if byT == byP {
		return usagef("give either the temperatures (%s) or the pressures (%s)", tf.names(), pf.names())
	}
	t, err := o.resolve(satProps)
	if err != nil {
		return usageError{err}
	}
	f, tp, cr := t.f, t.f.Triple(), t.f.Critical()
	in, out := qT, qP
	g, lo, hi := tg, tp.T, cr.T
	if byP {
		in, out = qP, qT
		g, lo, hi = pg, tp.P, cr.P
	}
	for i, x := range g.si {
		if x < lo || x > hi {
			return usagef("%s %s: outside the vapour-liquid saturation of %s, which runs from its triple point %s to its critical point %s %s",
				g.flag, g.text[i], f.Name(), fmtMsg(g.u.fromSI(lo)), fmtMsg(g.u.fromSI(hi)), g.u.text)
		}
	}
	by := map[bool]string{false: "temperature", true: "pressure"}[byP]
	tb := t.header("Saturation of " + f.Name() + " by " + by)
	inCol := column{q: in, u: t.us.unitOf(in)}
	tb.addCol(inCol, false)
	outCol := column{q: out, u: t.us.unitOf(out)}
	tb.addCol(outCol, false)
	var cols []column
	for _, q := range t.props {
		if q == qDh {
			cols = append(cols, column{q: q, u: t.us.unitOf(q)})
			continue
		}
		cols = append(cols, column{q: q, phase: phaseLiq, u: t.us.unitOf(q)}, column{q: q, phase: phaseVap, u: t.us.unitOf(q)})
	}
	for _, c := range cols {
		tb.addCol(c, false)
	}
	tb.noteCol = len(tb.cols)
	tb.addTextCol("note")
	tb.legend = []string{"′ saturated liquid, ″ saturated vapour."}

	prog := newProgress(progressOut(o.quiet, stderr), "tables sat", len(g.si), nil)
	var sec section
	for i, x := range g.si {
		var s fluid.Saturation
		var err error
		if byP {
			s, err = f.SaturationAtP(x)
		} else {
			s, err = f.SaturationAtT(x)
		}
		if err != nil {
			return fmt.Errorf("%s %s: %v", g.flag, g.text[i], err)
		}
		row := []string{inputText(g, i, inCol.u), t.cell(outCol, satValue(s, outCol))}
		for _, c := range cols {
			row = append(row, t.cell(c, satValue(s, c)))
		}
		note := ""
		if s.Flags&fluid.AtCritical != 0 {
			note = "critical point: cv and cp infinite, w zero"
		}
		row = append(row, note)
		sec.rows = append(sec.rows, row)
		prog.step()
	}
	prog.end()
	tb.sections = []section{sec}
	return tb.write(stdout, t.format)
}

// propNames lists quantities for help texts, one a line.
func propNames(qs []quantity) string {
	var s []string
	for _, q := range qs {
		s = append(s, fmt.Sprintf("  %-4s %s", q.info().name, q.info().what))
	}
	return strings.Join(s, "\n")
}

func progressOut(quiet bool, stderr io.Writer) io.Writer {
	if quiet {
		return nil
	}
	return stderr
}

var lineProps = []quantity{qRho, qV, qH, qS, qU, qG, qCv, qCp, qW, qQ}

// cmdLine prints single-phase tables along isobars (isobar true) or
// isotherms.
func cmdLine(isobar bool, args []string, stdout, stderr io.Writer) error {
	name := map[bool]string{true: "isobar", false: "isotherm"}[isobar]
	fixedWhat, stepWhat := "pressures of the isobars", "temperatures along each isobar"
	fixedOne, stepOne := "pressure", "temperature"
	ex := "tables isobar -fluid CO2 -p-bar 10,50,100 -t-C -50:150:10"
	if !isobar {
		fixedWhat, stepWhat = "temperatures of the isotherms", "pressures along each isotherm"
		fixedOne, stepOne = "temperature", "pressure"
		ex = "tables isotherm -fluid water -t-C 100,300 -p-bar 1:200:10"
	}
	cmd := newCommand(name, fmt.Sprintf(`Usage: tables %s [flags]

Prints the states of a fluid along %ss: one table for each %s, with
a row for each %s, from the flash at (p, T): phase, the properties
chosen with -props, and a note (saturated, extrapolated, or why a state
has no values, such as a solid region). Where a line crosses the
vapour-pressure curve the saturated liquid and vapour are added (-sat).

Properties (-props):
%s

%s
Example:
  %s
`, name, name, fixedOne, stepOne, propNames(lineProps), listHelp, ex))
	fs := cmd.fs
	var o options
	o.define(fs, "rho,h,s,cp,w")
	var tf, pf *family
	if isobar {
		pf = newFamily(fs, qP, "p", "pressures", fixedWhat)
		tf = newFamily(fs, qT, "t", "temperatures", stepWhat)
	} else {
		tf = newFamily(fs, qT, "t", "temperatures", fixedWhat)
		pf = newFamily(fs, qP, "p", "pressures", stepWhat)
	}
	sat := fs.Bool("sat", true, "add the saturated liquid and vapour where a line crosses the vapour-pressure curve")
	if err := cmd.parse(args, stdout); err != nil {
		return err
	}
	if err := cmd.noArgs(); err != nil {
		return err
	}
	tg, err := tf.need()
	if err != nil {
		return usageError{err}
	}
	pg, err := pf.need()
	if err != nil {
		return usageError{err}
	}
	t, err := o.resolve(lineProps)
	if err != nil {
		return usageError{err}
	}
	f := t.f
	fixed, step := pg, tg
	fixedQ, stepQ := qP, qT
	if !isobar {
		fixed, step = tg, pg
		fixedQ, stepQ = qT, qP
	}
	if n := len(fixed.si) * len(step.si); n > maxRows {
		return usagef("%d rows: more than the limit of %d", n, maxRows)
	}
	tb := t.header(strings.ToUpper(name[:1]) + name[1:] + "s of " + f.Name())
	stepCol := column{q: stepQ, u: t.us.unitOf(stepQ)}
	fixedCol := column{q: fixedQ, u: t.us.unitOf(fixedQ)}
	tb.addCol(stepCol, false)
	tb.addCol(fixedCol, false)
	tb.addTextCol("phase")
	var cols []column
	for _, q := range t.props {
		c := column{q: q, u: t.us.unitOf(q)}
		cols = append(cols, c)
		tb.addCol(c, false)
	}
	tb.noteCol = len(tb.cols)
	tb.addTextCol("note")

	prog := newProgress(progressOut(o.quiet, stderr), "tables "+name, len(fixed.si)*len(step.si), nil)
	for k, x := range fixed.si {
		sec := section{heading: fixedCol.q.info().name + " = " + inputText(fixed, k, fixedCol.u) + " " + fixedCol.u.text}
		// The saturation this line crosses, if any.
		var satAt float64
		var satErr error
		hasSat := false
		if *sat {
			if isobar && x < f.Critical().P && x >= f.Triple().P {
				var s fluid.Saturation
				s, satErr = f.SaturationAtP(x)
				satAt, hasSat = s.T, true
			} else if !isobar && x < f.Critical().T && x >= f.Triple().T {
				var s fluid.Saturation
				s, satErr = f.SaturationAtT(x)
				satAt, hasSat = s.P, true
			}
		}
		addRow := func(st flash.State, err error, stepVal string) {
			row := []string{stepVal, inputText(fixed, k, fixedCol.u)}
			if err != nil {
				row = append(row, "")
				for range cols {
					row = append(row, "")
				}
				row = append(row, errorNote(err))
			} else {
				v := stateValues(st)
				row = append(row, st.Phase.String())
				for _, c := range cols {
					row = append(row, t.cell(c, v[c.q]))
				}
				row = append(row, flagNotes(st.Flags))
			}
			sec.rows = append(sec.rows, row)
		}
		var prev *flash.State
		for i, y := range step.si {
			if hasSat && i > 0 && between(satAt, step.si[i-1], y) {
				if satErr != nil {
					return fmt.Errorf("%s %s: the saturation: %v", fixed.flag, fixed.text[k], satErr)
				}
				// First the phase of the side the line comes from: on an
				// isobar the liquid from below Tsat, on an isotherm the
				// liquid from above psat.
				first := 0.0
				if isobar == (step.si[i-1] > satAt) {
					first = 1
				}
				for _, q := range []float64{first, 1 - first} {
					var st flash.State
					if isobar {
						st, err = flash.PQ(f, x, q)
					} else {
						st, err = flash.TQ(f, x, q)
					}
					// CSV prints the saturation temperature or pressure of
					// these rows exactly: it fixes their state when read back.
					at := formatValue(stepCol.u.fromSI(satAt), t.digits)
					if t.format == formatCSV {
						at = strconv.FormatFloat(stepCol.u.fromSI(satAt), 'g', -1, 64)
					}
					addRow(st, err, at)
				}
			}
			var p, T float64 = x, y
			if !isobar {
				p, T = y, x
			}
			st, err := flash.PTWith(f, p, T, flash.Options{Guess: prev})
			if err == nil {
				prev = &st
			}
			addRow(st, err, inputText(step, i, stepCol.u))
			prog.step()
		}
		tb.sections = append(tb.sections, sec)
	}
	prog.end()
	return tb.write(stdout, t.format)
}

// between reports whether x lies strictly between a and b.
func between(x, a, b float64) bool {
	return a < x && x < b || b < x && x < a
}
