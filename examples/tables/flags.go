package main

import (
	"flag"
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// maxRows bounds the length of a list flag and of a table.
const maxRows = 1000000

// listText is the syntax of list flags, for messages.
const listText = "comma-separated values or FROM:TO:STEP ranges (TO included when a step lands on it), e.g. -40:30:10 or 0,4,20"

// listHelp explains LIST in help texts.
const listHelp = `A LIST is comma-separated values or FROM:TO:STEP ranges, STEP > 0, from
FROM towards TO and including TO when a step lands on it: -40:30:10, or
0,4,20, or 1:10:1,20,50. The unit is in the flag's name.
`

// listFlag is a flag.Value holding a list of numbers (see parseList).
type listFlag struct {
	text string
	vals []float64
	set  bool
}

func (l *listFlag) String() string { return l.text }

func (l *listFlag) Set(s string) error {
	v, err := parseList(s)
	if err != nil {
		return err
	}
	l.text, l.vals, l.set = s, v, true
	return nil
}

// parseList reads comma-separated items, each a number or a range
// FROM:TO:STEP with STEP > 0, running from FROM towards TO (up or down) in
// steps of STEP and including TO when a step lands on it (to 1e-9 of a
// step). Values of a range are rounded to 14 significant digits, so that
// 0:1:0.1 gives 0.3 rather than 0.30000000000000004.
func parseList(s string) ([]float64, error) {
	var out []float64
	if strings.TrimSpace(s) == "" {
		return nil, fmt.Errorf("empty list; want %s", listText)
	}
	for item := range strings.SplitSeq(s, ",") {
		item = strings.TrimSpace(item)
		parts := strings.Split(item, ":")
		switch len(parts) {
		case 1:
			v, err := parseNumber(item)
			if err != nil {
				return nil, err
			}
			out = append(out, v)
		case 3:
			var r [3]float64
			for i, p := range parts {
				v, err := parseNumber(strings.TrimSpace(p))
				if err != nil {
					return nil, fmt.Errorf("range %q: %v", item, err)
				}
				r[i] = v
			}
			from, to, step := r[0], r[1], r[2]
			if step <= 0 {
				return nil, fmt.Errorf("range %q: STEP must be positive (the range runs from FROM towards TO)", item)
			}
			n := math.Floor(math.Abs(to-from)/step + 1e-9)
			if n+1 > float64(maxRows-len(out)) {
				return nil, fmt.Errorf("range %q: %.0f values, more than the limit of %d", item, n+1, maxRows)
			}
			dir := 1.0
			if to < from {
				dir = -1
			}
			for i := 0.0; i <= n; i++ {
				out = append(out, round14(from+dir*i*step))
			}
		default:
			return nil, fmt.Errorf("%q: want a number or FROM:TO:STEP", item)
		}
		if len(out) > maxRows {
			return nil, fmt.Errorf("more than the limit of %d values", maxRows)
		}
	}
	return out, nil
}

// parseNumber reads a finite decimal number.
func parseNumber(s string) (float64, error) {
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		return 0, fmt.Errorf("%q is not a number", s)
	}
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("%q: want a finite number", s)
	}
	return v, nil
}

// fmtMsg prints a computed value in a message, to 10 digits.
func fmtMsg(x float64) string { return strconv.FormatFloat(x, 'g', 10, 64) }

func round14(x float64) float64 {
	y, _ := strconv.ParseFloat(strconv.FormatFloat(x, 'g', 14, 64), 64)
	return y
}

// family is a set of list flags, one per unit of a quantity, such as
// -t-K and -t-C for temperatures: the unit is explicit in the flag's
// name, and at most one of them may be given.
type family struct {
	q     quantity
	what  string // "temperatures"
	flags []*unitList
}

type unitList struct {
	listFlag
	name string // flag name, e.g. "t-C"
	u    unit
}

// newFamily defines the flags prefix-UNIT for every unit of q on fs.
func newFamily(fs *flag.FlagSet, q quantity, prefix, what, usage string) *family {
	fam := &family{q: q, what: what}
	for _, u := range q.info().units {
		l := &unitList{name: prefix + "-" + u.name, u: u}
		fs.Var(l, l.name, usage+" in "+u.text+", a `LIST`")
		fam.flags = append(fam.flags, l)
	}
	return fam
}

// names lists the flags of the family, e.g. "-t-K or -t-C".
func (fam *family) names() string {
	var s []string
	for _, l := range fam.flags {
		s = append(s, "-"+l.name)
	}
	return strings.Join(s, " or ")
}

// given is the flag of the family that was set, in SI values: the values,
// their unit and the flag's name.
type given struct {
	si   []float64
	text []string // the values as given, for messages
	u    unit
	flag string
}

// get returns the values of the one flag of the family that was set; ok
// is false if none was. Two flags set, or a value at or below zero in SI
// (absolute zero, zero pressure), is an error.
func (fam *family) get() (g given, ok bool, err error) {
	var set *unitList
	for _, l := range fam.flags {
		if !l.set {
			continue
		}
		if set != nil {
			return given{}, false, fmt.Errorf("-%s and -%s: give the %s once, in one unit", set.name, l.name, fam.what)
		}
		set = l
	}
	if set == nil {
		return given{}, false, nil
	}
	g = given{u: set.u, flag: "-" + set.name}
	for _, v := range set.vals {
		si := set.u.toSI(v)
		if si <= 0 {
			return given{}, false, fmt.Errorf("-%s %v: %s must be above zero (%s %s)", set.name, v, fam.q.info().what, fmtMsg(si), fam.q.info().units[0].text)
		}
		g.si = append(g.si, si)
		g.text = append(g.text, strconv.FormatFloat(v, 'g', -1, 64))
	}
	return g, true, nil
}

// need is get for a family that must be given.
func (fam *family) need() (given, error) {
	g, ok, err := fam.get()
	if err == nil && !ok {
		err = fmt.Errorf("give the %s with %s", fam.what, fam.names())
	}
	return g, err
}

// options are the flags every table command shares.
type options struct {
	fluid, ref, units, format, props string
	digits                           int
	quiet                            bool
}

func (o *options) define(fs *flag.FlagSet, props string) {
	fs.StringVar(&o.fluid, "fluid", "CO2", "fluid: "+strings.Join(fluid.Names(), ", ")+" (or an alias such as R744, H2O, R-134a)")
	fs.StringVar(&o.ref, "ref", "default", "reference state of h and s: default (the published equation's), IIR, ASHRAE or NBP")
	fs.StringVar(&o.units, "units", "eng", "units: si (K, Pa, J/kg, J/(kg K)) or eng (C, bar, kJ/kg, kJ/(kg K)); density kg/m3 and sound speed m/s in both")
	fs.StringVar(&o.format, "format", "md", "output format: md (Markdown) or csv (the check-table layout, readable by the dev command)")
	fs.StringVar(&o.props, "props", props, "properties to tabulate, comma-separated")
	fs.IntVar(&o.digits, "digits", 6, "significant digits of computed values (3 to 17)")
	fs.BoolVar(&o.quiet, "quiet", false, "no progress line on stderr")
}

// outFormat is the output format of tables and reports.
type outFormat int

const (
	formatMD outFormat = iota
	formatCSV
)

func parseFormat(s string) (outFormat, error) {
	switch strings.ToLower(s) {
	case "md", "markdown":
		return formatMD, nil
	case "csv":
		return formatCSV, nil
	}
	return 0, fmt.Errorf("-format %q: want md or csv", s)
}

// lookupFluid returns the named fluid on the reference state ref.
func lookupFluid(name, ref string) (*fluid.Fluid, error) {
	f, err := fluid.Lookup(name)
	if err != nil {
		return nil, fmt.Errorf("-fluid %q: %v", name, err)
	}
	r, err := parseRef(ref)
	if err != nil {
		return nil, err
	}
	g, err := f.WithReference(r)
	if err != nil {
		return nil, fmt.Errorf("-ref %s: %v", ref, err)
	}
	return g, nil
}

func parseRef(s string) (fluid.RefState, error) {
	for _, r := range []fluid.RefState{fluid.RefDefault, fluid.RefIIR, fluid.RefASHRAE, fluid.RefNBP} {
		if strings.EqualFold(s, r.String()) {
			return r, nil
		}
	}
	return 0, fmt.Errorf("-ref %q: want default, IIR, ASHRAE or NBP", s)
}

// refText describes the reference state of f.
func refText(f *fluid.Fluid) string {
	switch f.Reference() {
	case fluid.RefIIR:
		return "IIR (h = 200 kJ/kg, s = 1 kJ/(kg K) for the saturated liquid at 0 C)"
	case fluid.RefASHRAE:
		return "ASHRAE (h = 0, s = 0 for the saturated liquid at -40 C)"
	case fluid.RefNBP:
		return "NBP (h = 0, s = 0 for the saturated liquid at 101.325 kPa)"
	}
	return "that of the published equation"
}

// parseProps reads the -props list against the quantities allowed.
func parseProps(s string, allowed []quantity) ([]quantity, error) {
	var out []quantity
	var names []string
	for _, q := range allowed {
		names = append(names, q.info().name)
	}
	for item := range strings.SplitSeq(s, ",") {
		item = strings.TrimSpace(item)
		q, ok := quantityNamed(item)
		if ok && !slices.Contains(allowed, q) {
			ok = false
		}
		if !ok {
			return nil, fmt.Errorf("-props: %q is not a property of this table (want some of %s)", item, strings.Join(names, ", "))
		}
		if slices.Contains(out, q) {
			return nil, fmt.Errorf("-props: %q given twice", item)
		}
		out = append(out, q)
	}
	return out, nil
}
