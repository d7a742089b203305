package kit

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"os"
	"sort"
	"strconv"
	"strings"
)

// unit is a unit a quantity flag accepts: the suffix of the flag name,
// the unit as printed, and the conversion to SI.
type unit struct {
	suffix string
	symbol string
	toSI   func(float64) float64
	fromSI func(float64) float64
}

func scale(suffix, symbol string, f float64) unit {
	return unit{suffix, symbol, func(x float64) float64 { return x * f }, func(x float64) float64 { return x / f }}
}

var (
	unitC   = unit{"C", "°C", func(x float64) float64 { return x + ZeroCelsius }, func(x float64) float64 { return x - ZeroCelsius }}
	unitK   = scale("K", "K", 1)
	unitBar = scale("bar", "bar", 1e5)
	unitMPa = scale("MPa", "MPa", 1e6)
	unitPa  = scale("Pa", "Pa", 1)
	unitKJ  = scale("kJkg", "kJ/kg", 1e3)
	unitJ   = scale("Jkg", "J/kg", 1)

	unitL    = scale("L", "L", 1e-3)
	unitM3   = scale("m3", "m³", 1)
	unitKg   = scale("kg", "kg", 1)
	unitMm   = scale("mm", "mm", 1e-3)
	unitM    = scale("m", "m", 1)
	unitM2   = scale("m2", "m²", 1)
	unitS    = scale("s", "s", 1)
	unitMin  = scale("min", "min", 60)
	unitHour = scale("h", "h", 3600)
	unitHTC  = scale("Wm2K", "W/(m²·K)", 1)
)

// ZeroCelsius is 0 °C in K.
const ZeroCelsius = 273.15

// Quantity is a physical quantity set on the command line through one of
// several flags that differ only in their unit suffix: -tevap-C or
// -tevap-K, -pgc-bar, -pgc-MPa or -pgc-Pa. Its value is kept in SI units.
type Quantity struct {
	name   string
	what   string
	units  []unit
	si     float64 // value in SI units
	set    string  // the flag that set it, "" if none
	lo, hi float64 // accepted SI range, checked by Flags.Parse
	bounds bool
	opt    bool // no default value: -h shows none
	fs     *flag.FlagSet
}

// Optional marks the quantity as one without a default value: -h shows
// none, and the program decides by IsSet.
func (q *Quantity) Optional() *Quantity {
	q.opt = true
	for _, u := range q.units {
		if fl := q.fs.Lookup(q.name + "-" + u.suffix); fl != nil {
			fl.DefValue = ""
		}
	}
	return q
}

// Value returns the quantity in SI units.
func (q *Quantity) Value() float64 { return q.si }

// IsSet reports whether a flag set the quantity.
func (q *Quantity) IsSet() bool { return q.set != "" }

// Within makes Flags.Parse reject values outside lo..hi, in SI units.
func (q *Quantity) Within(lo, hi float64) *Quantity {
	q.lo, q.hi, q.bounds = lo, hi, true
	return q
}

// Format returns the quantity's SI value v in its first (primary) unit,
// e.g. "-8 °C".
func (q *Quantity) Format(v float64) string {
	u := q.units[0]
	return strconv.FormatFloat(u.fromSI(v), 'g', 6, 64) + " " + u.symbol
}

// flagValue is one unit-suffixed flag of a Quantity.
type flagValue struct {
	q *Quantity
	u unit
}

func (v *flagValue) String() string {
	if v == nil || v.q == nil || v.q.units[0].suffix != v.u.suffix {
		return ""
	}
	if v.q.set == "" && v.q.opt {
		return ""
	}
	return strconv.FormatFloat(v.u.fromSI(v.q.si), 'g', -1, 64)
}

func (v *flagValue) Set(s string) error {
	x, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
	if err != nil {
		return errors.New("not a number")
	}
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return errors.New("not a finite number")
	}
	flagName := "-" + v.q.name + "-" + v.u.suffix
	if v.q.set != "" && v.q.set != flagName {
		return fmt.Errorf("%s was already given; set %s once, in one unit", v.q.set, v.q.what)
	}
	si := v.u.toSI(x)
	if math.IsInf(si, 0) {
		return errors.New("out of the range of numbers")
	}
	v.q.si = si
	v.q.set = flagName
	return nil
}

// Flags is a command line: a flag.FlagSet with quantity flags, a synopsis
// for -h, and checks of the values after parsing.
type Flags struct {
	fs         *flag.FlagSet
	synopsis   string
	quantities []*Quantity
	out        io.Writer
}

// NewFlags returns an empty command line for the program name, printing
// synopsis before the flags on -h and errors to out.
func NewFlags(name, synopsis string, out io.Writer) *Flags {
	f := &Flags{fs: flag.NewFlagSet(name, flag.ContinueOnError), synopsis: synopsis, out: out}
	f.fs.SetOutput(out)
	f.fs.Usage = f.usage
	return f
}

func (f *Flags) usage() {
	fmt.Fprintf(f.out, "%s\n\nFlags (a quantity may be given in any one of the units its flags name):\n", strings.TrimSpace(f.synopsis))
	f.fs.PrintDefaults()
}

func (f *Flags) quantity(name, what string, def float64, units ...unit) *Quantity {
	q := &Quantity{name: name, what: what, units: units, si: units[0].toSI(def), fs: f.fs}
	f.quantities = append(f.quantities, q)
	for i, u := range units {
		usage := what + " in " + u.symbol
		if i == 0 && len(units) > 1 {
			var alt []string
			for _, a := range units[1:] {
				alt = append(alt, "-"+name+"-"+a.suffix)
			}
			usage += " (or " + strings.Join(alt, ", ") + ")"
		} else if i > 0 {
			usage += " (as -" + name + "-" + units[0].suffix + ")"
		}
		f.fs.Var(&flagValue{q, u}, name+"-"+u.suffix, usage)
	}
	return q
}

// Temperature adds -name-C and -name-K, with default defC in °C.
func (f *Flags) Temperature(name, what string, defC float64) *Quantity {
	return f.quantity(name, what, defC, unitC, unitK)
}

// TemperatureDifference adds -name-K (a difference in K equals one in °C).
func (f *Flags) TemperatureDifference(name, what string, defK float64) *Quantity {
	return f.quantity(name, what, defK, unitK)
}

// Pressure adds -name-bar, -name-MPa and -name-Pa, with default defBar in
// bar (0: not set, for optional pressures).
func (f *Flags) Pressure(name, what string, defBar float64) *Quantity {
	return f.quantity(name, what, defBar, unitBar, unitMPa, unitPa)
}

// Enthalpy adds -name-kJkg and -name-Jkg, with default defKJ in kJ/kg.
func (f *Flags) Enthalpy(name, what string, defKJ float64) *Quantity {
	return f.quantity(name, what, defKJ, unitKJ, unitJ)
}

// Volume adds -name-L and -name-m3, with default defL in litres.
func (f *Flags) Volume(name, what string, defL float64) *Quantity {
	return f.quantity(name, what, defL, unitL, unitM3)
}

// Mass adds -name-kg, with default defKg in kg.
func (f *Flags) Mass(name, what string, defKg float64) *Quantity {
	return f.quantity(name, what, defKg, unitKg)
}

// Length adds -name-mm and -name-m, with default defMm in mm.
func (f *Flags) Length(name, what string, defMm float64) *Quantity {
	return f.quantity(name, what, defMm, unitMm, unitM)
}

// Area adds -name-m2, with default defM2 in m² (0: not set, for optional
// areas).
func (f *Flags) Area(name, what string, defM2 float64) *Quantity {
	return f.quantity(name, what, defM2, unitM2)
}

// Duration adds -name-s, -name-min and -name-h, with default defS in s.
func (f *Flags) Duration(name, what string, defS float64) *Quantity {
	return f.quantity(name, what, defS, unitS, unitMin, unitHour)
}

// HeatTransferCoefficient adds -name-Wm2K, with default def in W/(m²·K).
func (f *Flags) HeatTransferCoefficient(name, what string, def float64) *Quantity {
	return f.quantity(name, what, def, unitHTC)
}

// Float adds a dimensionless flag -name.
func (f *Flags) Float(name string, def float64, usage string) *float64 {
	return f.fs.Float64(name, def, usage)
}

// String adds a string flag -name.
func (f *Flags) String(name, def, usage string) *string { return f.fs.String(name, def, usage) }

// Int adds an integer flag -name.
func (f *Flags) Int(name string, def int, usage string) *int { return f.fs.Int(name, def, usage) }

// Bool adds a boolean flag -name.
func (f *Flags) Bool(name string, def bool, usage string) *bool { return f.fs.Bool(name, def, usage) }

// Parse parses args (without the program name). It returns flag.ErrHelp
// for -h, and an error naming the flag for a value that is not a finite
// number, lies outside its accepted range, or a quantity given twice; and
// for arguments that are not flags. Errors other than ErrHelp have been
// printed to the output with the usage.
func (f *Flags) Parse(args []string) error {
	if err := f.fs.Parse(args); err != nil {
		if errors.Is(err, flag.ErrHelp) {
			return err
		}
		return UsageError{err} // the flag package has printed it
	}
	if f.fs.NArg() > 0 {
		return f.fail(fmt.Errorf("unexpected argument %q (all inputs are flags; see -h)", f.fs.Arg(0)))
	}
	for _, q := range f.quantities {
		if !q.bounds {
			continue
		}
		if q.si < q.lo || q.si > q.hi {
			name := q.set
			if name == "" {
				name = "-" + q.name + "-" + q.units[0].suffix
			}
			return f.fail(fmt.Errorf("%s: %s = %s is outside %s .. %s", name, q.what, q.Format(q.si), q.Format(q.lo), q.Format(q.hi)))
		}
	}
	return nil
}

// Check returns an error naming a flag, printed with a hint at -h, for
// the programs' own checks after Parse.
func (f *Flags) Check(flagName, format string, args ...any) error {
	return f.fail(fmt.Errorf("-%s: %s", flagName, fmt.Sprintf(format, args...)))
}

func (f *Flags) fail(err error) error {
	fmt.Fprintf(f.out, "%s: %v\n(run with -h for the flags)\n", f.fs.Name(), err)
	return UsageError{err}
}

// Choice checks that value is one of the allowed words, returning an
// error for the flag name otherwise.
func (f *Flags) Choice(flagName, value string, allowed ...string) error {
	for _, a := range allowed {
		if value == a {
			return nil
		}
	}
	s := append([]string(nil), allowed...)
	sort.Strings(s)
	return f.Check(flagName, "%q is not one of %s", value, strings.Join(s, ", "))
}

// UsageError is a bad command line, already reported on the flag output
// with the flag it concerns (Parse, Check and Choice return it).
type UsageError struct{ error }

// Unwrap returns the underlying error.
func (e UsageError) Unwrap() error { return e.error }

// Main runs a command: run with the command-line arguments, standard
// output and standard error. It returns normally on success or -h, and
// otherwise exits with status 2, after printing the error prefixed with
// the command's name unless it is a UsageError (already reported).
func Main(name string, run func(args []string, stdout, stderr io.Writer) error) {
	err := run(os.Args[1:], os.Stdout, os.Stderr)
	if err == nil || errors.Is(err, flag.ErrHelp) {
		return
	}
	if !errors.As(err, new(UsageError)) {
		fmt.Fprintln(os.Stderr, name+":", err)
	}
	os.Exit(2)
}
