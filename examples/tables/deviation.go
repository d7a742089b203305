package main

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"sort"
	"strconv"
	"strings"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// printed is a reference value as its table prints it: the value and one
// unit in its last printed digit. A zero printed as a bare integer ("0")
// is exact: a quantity that vanishes identically must come out exactly
// zero (except in °C, where 0 is a temperature like any other).
type printed struct {
	text  string
	value float64
	unit  float64
	exact bool
}

// parsePrinted reads a number such as "0.992418352e-1", "-40" or
// "1.5E+03" with the size of one unit in its last printed digit: 1e-10,
// 1 and 100 for those three. ±Inf has no unit.
func parsePrinted(s string) (printed, error) {
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		return printed{}, fmt.Errorf("%q is not a number", s)
	}
	p := printed{text: s, value: v}
	if math.IsInf(v, 0) || math.IsNaN(v) {
		return p, nil
	}
	mant, exp := strings.ToLower(s), 0
	if i := strings.IndexByte(mant, 'e'); i >= 0 {
		if exp, err = strconv.Atoi(mant[i+1:]); err != nil {
			return printed{}, fmt.Errorf("%q: bad exponent", s)
		}
		mant = mant[:i]
	}
	decimals := 0
	if i := strings.IndexByte(mant, '.'); i >= 0 {
		decimals = len(mant) - i - 1
	}
	p.unit = math.Pow(10, float64(exp-decimals))
	p.exact = v == 0 && !strings.ContainsAny(s, ".eE")
	return p, nil
}

// checkFile is a file of reference values in the check-table layout (see
// the package documentation).
type checkFile struct {
	path     string
	props    []propCol // the property columns, in file order
	fluidCol int       // index of the fluid column, or -1
	phaseCol int       // index of the phase column, or -1
	srcCol   int
	sat      bool // a saturation table: props[0] (T or p) fixes the state
	kind     evalKind
	rows     []checkRow
}

type propCol struct {
	column
	idx  int    // index in the CSV record
	head string // as written in the header
}

type checkRow struct {
	line   int
	cells  []string
	ref    []printed // parallel to checkFile.props
	has    []bool    // the cell holds a value
	source string
}

// evalKind is how a row's inputs fix its state.
type evalKind int

const (
	kindSatT evalKind = iota
	kindSatP
	kindTRho
	kindPT
	kindPH
	kindPS
	kindTQ
	kindPQ
	kindRhoU
	kindHS
	kindTS
	kindPRho
)

// flashFunc is a flash with options, its inputs in the order of its pair.
type flashFunc func(f *fluid.Fluid, a, b float64, opt flash.Options) (flash.State, error)

// pairs are the input pairs of single-phase rows (v counts as rho) and
// the flashes that compute them; T+rho is Props itself (flash nil). meta
// marks the flashes that return metastable states on request (see the
// flash package), to which the phase column passes its request.
var pairs = []struct {
	a, b  quantity
	kind  evalKind
	text  string
	flash flashFunc
	meta  bool
}{
	{qT, qRho, kindTRho, "the equation of state at (T, rho), as the publications' check tables evaluate it", nil, false},
	{qP, qT, kindPT, "flash.PT", flash.PTWith, true},
	{qP, qH, kindPH, "flash.PH", flash.PHWith, true},
	{qP, qS, kindPS, "flash.PS", flash.PSWith, true},
	{qT, qQ, kindTQ, "flash.TQ", flash.TQWith, false},
	{qP, qQ, kindPQ, "flash.PQ", flash.PQWith, false},
	{qRho, qU, kindRhoU, "flash.DU", flash.DUWith, true},
	{qH, qS, kindHS, "flash.HS", flash.HSWith, false},
	{qT, qS, kindTS, "flash.TS", flash.TSWith, false},
	{qP, qRho, kindPRho, "flash.PD", flash.PDWith, false},
}

func kindText(k evalKind) string {
	switch k {
	case kindSatT:
		return "the vapour-liquid saturation at T (fluid.SaturationAtT)"
	case kindSatP:
		return "the vapour-liquid saturation at p (fluid.SaturationAtP)"
	}
	for _, p := range pairs {
		if p.kind == k {
			return p.text
		}
	}
	return "?"
}

func pairList() string {
	var s []string
	for _, p := range pairs {
		s = append(s, p.a.info().name+"+"+p.b.info().name)
	}
	return strings.Join(s, ", ")
}

// readCheckFile reads reference values in the check-table layout from r;
// path names the file in messages.
func readCheckFile(r io.Reader, path string) (*checkFile, error) {
	cr := csv.NewReader(r)
	cr.Comment = '#'
	cr.TrimLeadingSpace = true
	head, err := cr.Read()
	if err == io.EOF {
		return nil, fmt.Errorf("%s: no header line", path)
	}
	if err != nil {
		return nil, fmt.Errorf("%s: %v", path, err)
	}
	cf := &checkFile{path: path, fluidCol: -1, phaseCol: -1, srcCol: len(head) - 1}
	if strings.TrimSpace(head[len(head)-1]) != "source" {
		return nil, fmt.Errorf("%s: the last column is %q; the layout wants a source column last", path, head[len(head)-1])
	}
	seen := map[[2]int]string{}
	for i, h := range head[:len(head)-1] {
		h = strings.TrimSpace(h)
		switch h {
		case "source":
			return nil, fmt.Errorf("%s: source must be the last column only", path)
		case "fluid":
			cf.fluidCol = i
			continue
		case "phase":
			cf.phaseCol = i
			continue
		case "note":
			continue
		}
		c, err := parseColumn(h)
		if err != nil {
			return nil, fmt.Errorf("%s: %v", path, err)
		}
		key := [2]int{int(c.q), int(c.phase)}
		if prev, ok := seen[key]; ok {
			return nil, fmt.Errorf("%s: columns %q and %q hold the same property", path, prev, h)
		}
		seen[key] = h
		cf.props = append(cf.props, propCol{column: c, idx: i, head: h})
		if c.phase != phaseNone {
			cf.sat = true
		}
	}
	if err := cf.classify(); err != nil {
		return nil, fmt.Errorf("%s: %v", path, err)
	}
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, fmt.Errorf("%s: %v", path, err)
		}
		line, _ := cr.FieldPos(0)
		row, err := cf.parseRow(rec, line)
		if err != nil {
			return nil, fmt.Errorf("%s:%d: %v", path, line, err)
		}
		cf.rows = append(cf.rows, row)
	}
	if len(cf.rows) == 0 {
		return nil, fmt.Errorf("%s: no rows", path)
	}
	return cf, nil
}

// classify finds how the rows fix their states.
func (cf *checkFile) classify() error {
	need := 2
	if cf.sat {
		need = 1
	}
	if len(cf.props) <= need {
		return fmt.Errorf("%d property columns: the layout wants the %d that fix the state and at least one to compare", len(cf.props), need)
	}
	for _, c := range cf.props {
		switch {
		case cf.sat && c.phase == phaseNone && c.q != qT && c.q != qP && c.q != qDh:
			return fmt.Errorf("column %q: in a saturation table (one with _liq or _vap columns) only T, p and dh stand without a phase", c.head)
		case cf.sat && c.q == qQ:
			return fmt.Errorf("column %q: a saturation table has no quality column", c.head)
		case c.phase != phaseNone && c.q == qDh:
			return fmt.Errorf("column %q: dh belongs to neither phase", c.head)
		case !cf.sat && c.q == qDh:
			return fmt.Errorf("column %q: dh exists only in saturation tables (with _liq and _vap columns)", c.head)
		}
	}
	if cf.sat {
		switch c := cf.props[0]; {
		case c.q == qT && c.phase == phaseNone:
			cf.kind = kindSatT
		case c.q == qP && c.phase == phaseNone:
			cf.kind = kindSatP
		default:
			return fmt.Errorf("column %q: the first property column of a saturation table is the T or p that fixes the state", c.head)
		}
		return nil
	}
	a, b := inputQ(cf.props[0].q), inputQ(cf.props[1].q)
	for _, p := range pairs {
		if a == p.a && b == p.b || a == p.b && b == p.a {
			cf.kind = p.kind
			return nil
		}
	}
	return fmt.Errorf("columns %q and %q: the first two property columns fix the state and must be one of the pairs %s (v counts as rho)",
		cf.props[0].head, cf.props[1].head, pairList())
}

// inputQ maps specific volume to density: both fix a state alike.
func inputQ(q quantity) quantity {
	if q == qV {
		return qRho
	}
	return q
}

// nInputs is the number of property columns that fix a row's state.
func (cf *checkFile) nInputs() int {
	if cf.sat {
		return 1
	}
	return 2
}

func (cf *checkFile) parseRow(rec []string, line int) (checkRow, error) {
	row := checkRow{line: line, cells: rec, ref: make([]printed, len(cf.props)), has: make([]bool, len(cf.props))}
	for i := range rec {
		rec[i] = strings.TrimSpace(rec[i])
	}
	row.source = rec[cf.srcCol]
	if row.source == "" {
		return row, errors.New("no source: every row names its source (document and table)")
	}
	if cf.fluidCol >= 0 && rec[cf.fluidCol] == "" {
		return row, errors.New("empty fluid cell")
	}
	if cf.phaseCol >= 0 {
		if _, err := phaseRequest(rec[cf.phaseCol]); err != nil {
			return row, err
		}
	}
	for j, c := range cf.props {
		cell := rec[c.idx]
		if cell == "" {
			if j < cf.nInputs() {
				return row, fmt.Errorf("column %s: the input is missing", c.head)
			}
			continue
		}
		p, err := parsePrinted(cell)
		if err != nil {
			return row, fmt.Errorf("column %s: %v", c.head, err)
		}
		if j < cf.nInputs() && (math.IsInf(p.value, 0) || math.IsNaN(p.value)) {
			return row, fmt.Errorf("column %s: the input %s is not finite", c.head, cell)
		}
		row.ref[j], row.has[j] = p, true
	}
	return row, nil
}

// state describes the inputs of a row, e.g. "T = 500 K, rho = 838.025 kg/m3".
func (cf *checkFile) state(r *checkRow) string {
	var s []string
	for j := range cf.nInputs() {
		c := cf.props[j]
		s = append(s, c.q.info().name+" = "+r.ref[j].text+unitSuffix(c.u))
	}
	return strings.Join(s, ", ")
}

func unitSuffix(u unit) string {
	if u.text == "" {
		return ""
	}
	return " " + u.text
}

// phaseRequest reads a cell of the phase column: Liquid or Vapor (also
// vapour, in any case) request that phase of a flash; the other names of
// flash phases, and an empty cell, request none.
func phaseRequest(cell string) (flash.Phase, error) {
	switch strings.ToLower(cell) {
	case "liquid":
		return flash.Liquid, nil
	case "vapor", "vapour":
		return flash.Vapor, nil
	case "":
		return flash.Unknown, nil
	}
	for p := flash.Unknown; p <= flash.Triple; p++ {
		if strings.EqualFold(cell, p.String()) {
			return flash.Unknown, nil
		}
	}
	return 0, fmt.Errorf("phase %q: want Liquid, Vapor, another flash phase name or nothing", cell)
}

// eval computes the state of row r with fluid f and returns the value of
// every property column in SI units (NaN where the state has no such
// value) and the flags of the state.
func (cf *checkFile) eval(f *fluid.Fluid, r *checkRow) ([]float64, fluid.Flags, error) {
	in := func(j int) (quantity, float64) {
		c := cf.props[j]
		v := c.u.toSI(r.ref[j].value)
		if c.q == qV {
			return qRho, 1 / v
		}
		return c.q, v
	}
	out := make([]float64, len(cf.props))
	if cf.sat {
		_, x := in(0)
		var s fluid.Saturation
		var err error
		if cf.kind == kindSatT {
			s, err = f.SaturationAtT(x)
		} else {
			s, err = f.SaturationAtP(x)
		}
		if err != nil {
			return nil, 0, err
		}
		for j, c := range cf.props {
			out[j] = satValue(s, c.column)
		}
		return out, s.Flags, nil
	}
	qa, a := in(0)
	_, b := in(1)
	var v values
	var fl fluid.Flags
	for _, p := range pairs {
		if p.kind != cf.kind {
			continue
		}
		if p.a != qa {
			a, b = b, a // the order of the pair
		}
		if p.flash == nil {
			pr, err := f.Props(a, b)
			if err != nil {
				return nil, 0, err
			}
			v, fl = propsValues(pr), pr.Flags
			break
		}
		// A requested phase, metastable where need be.
		var opt flash.Options
		if cf.phaseCol >= 0 && p.meta {
			opt.Phase, _ = phaseRequest(r.cells[cf.phaseCol])
			opt.AllowMetastable = opt.Phase != flash.Unknown
		}
		st, err := p.flash(f, a, b, opt)
		if err != nil {
			return nil, 0, err
		}
		v, fl = stateValues(st), st.Flags
	}
	for j, c := range cf.props {
		out[j] = v[c.q]
	}
	return out, fl, nil
}

// limits decide whether a computed value agrees with its reference: within
// digits units of the reference's last printed digit (plus the few ulps of
// representing decimal numbers in binary), or, if rel > 0, within that
// relative deviation.
type limits struct {
	digits, rel float64
}

func (l limits) text() string {
	s := "within ±" + strconv.FormatFloat(l.digits, 'g', -1, 64) + " in the last printed digit"
	if l.rel > 0 {
		s += " or a relative deviation of " + strconv.FormatFloat(l.rel, 'g', -1, 64)
	}
	return s
}

// valueDev is one compared value.
type valueDev struct {
	row    *checkRow
	col    int // index into checkFile.props
	got    float64
	rel    float64 // (got − ref)/|ref| in SI units; NaN for a zero or infinite reference
	digits float64 // |got − ref| in units of the last printed digit, in the column's unit
	pass   bool
}

// compare compares the computed SI value got with the reference ref of
// column c.
func compare(c column, ref printed, got float64, lim limits) valueDev {
	d := valueDev{got: c.u.fromSI(got), rel: math.NaN()}
	diff := math.Abs(d.got - ref.value)
	switch {
	case math.IsNaN(got):
		d.digits = math.Inf(1)
		return d
	case math.IsInf(ref.value, 0) || ref.exact && c.u.off == 0:
		if d.got == ref.value {
			d.digits, d.pass = 0, true
		} else {
			d.digits = math.Inf(1)
		}
		return d
	}
	refSI := c.u.toSI(ref.value)
	if refSI != 0 {
		d.rel = (got - refSI) / math.Abs(refSI)
	}
	d.digits = diff / ref.unit
	d.pass = diff <= lim.digits*ref.unit+8*0x1p-52*math.Abs(ref.value) ||
		lim.rel > 0 && math.Abs(d.rel) <= lim.rel
	return d
}

// colStats are the deviations of one column.
type colStats struct {
	n, nRel, beyond int
	maxRel, sumRel  float64
	maxDigits       float64
	worst           int // index into report.devs, -1 if none
}

func (s *colStats) meanRel() float64 {
	if s.nRel == 0 {
		return math.NaN()
	}
	return s.sumRel / float64(s.nRel)
}

// rowFailure is a row whose state could not be computed.
type rowFailure struct {
	row *checkRow
	err error
}

// report is the deviation report of one file.
type report struct {
	cf      *checkFile
	fluids  []*fluid.Fluid // in order of first use
	lim     limits
	devs    []valueDev
	failed  []rowFailure
	flagged []rowFailure // rows computed as metastable or extrapolated states
	cols    []colStats   // parallel to cf.props
	all     colStats
	sources []string
}

// fluidSource resolves the fluid of each row.
type fluidSource struct {
	byName map[string]*fluid.Fluid
	def    string // -fluid, may be empty
	ref    string
}

func (fs *fluidSource) get(name string) (*fluid.Fluid, error) {
	fromFlag := name == ""
	if fromFlag {
		name = fs.def
	}
	if name == "" {
		return nil, usagef("no fluid: give -fluid or a fluid column")
	}
	if f, ok := fs.byName[name]; ok {
		return f, nil
	}
	f, err := lookupFluid(name, fs.ref)
	if err != nil {
		if fromFlag {
			return nil, usageError{err}
		}
		return nil, err
	}
	if fs.byName == nil {
		fs.byName = map[string]*fluid.Fluid{}
	}
	// One fluid for all its names (CO2, R744).
	if g, ok := fs.byName[f.Name()]; ok {
		f = g
	}
	fs.byName[name], fs.byName[f.Name()] = f, f
	return f, nil
}

// deviations evaluates every row of cf and compares it with its reference
// values.
func deviations(cf *checkFile, fsrc *fluidSource, lim limits, prog *progress) (*report, error) {
	rp := &report{cf: cf, lim: lim, cols: make([]colStats, len(cf.props))}
	seenSrc := map[string]bool{}
	seenFluid := map[*fluid.Fluid]bool{}
	for i := range cf.rows {
		r := &cf.rows[i]
		if !seenSrc[r.source] {
			seenSrc[r.source] = true
			rp.sources = append(rp.sources, r.source)
		}
		name := ""
		if cf.fluidCol >= 0 {
			name = r.cells[cf.fluidCol]
		}
		f, err := fsrc.get(name)
		if err != nil {
			if cf.fluidCol < 0 {
				return nil, err
			}
			return nil, fmt.Errorf("%s:%d: %v", cf.path, r.line, err)
		}
		if !seenFluid[f] {
			seenFluid[f] = true
			rp.fluids = append(rp.fluids, f)
		}
		got, fl, err := cf.eval(f, r)
		prog.step()
		if err != nil {
			rp.failed = append(rp.failed, rowFailure{r, err})
			continue
		}
		if fl&(fluid.Metastable|fluid.Extrapolated) != 0 {
			rp.flagged = append(rp.flagged, rowFailure{r, errors.New(flagNotes(fl & (fluid.Metastable | fluid.Extrapolated)))})
		}
		for j := cf.nInputs(); j < len(cf.props); j++ {
			if !r.has[j] {
				continue
			}
			d := compare(cf.props[j].column, r.ref[j], got[j], lim)
			d.row, d.col = r, j
			rp.devs = append(rp.devs, d)
		}
	}
	for j := range rp.cols {
		rp.cols[j].worst = -1
	}
	rp.all.worst = -1
	for k, d := range rp.devs {
		for _, s := range []*colStats{&rp.cols[d.col], &rp.all} {
			s.n++
			if !d.pass {
				s.beyond++
			}
			s.maxDigits = math.Max(s.maxDigits, d.digits)
			if !math.IsNaN(d.rel) {
				a := math.Abs(d.rel)
				s.nRel++
				s.sumRel += a
				if s.worst < 0 || a > s.maxRel || math.IsNaN(rp.devs[s.worst].rel) {
					s.maxRel, s.worst = a, k
				}
			} else if s.worst < 0 {
				s.worst = k
			}
		}
	}
	return rp, nil
}

// ok reports whether every value agreed and every row was evaluated.
func (rp *report) ok() bool { return rp.all.beyond == 0 && len(rp.failed) == 0 }

// worstK returns the indices of the k worst values: those beyond the
// limits first, then by relative deviation, then by deviation in printed
// digits.
func (rp *report) worstK(k int) []int {
	idx := make([]int, len(rp.devs))
	for i := range idx {
		idx[i] = i
	}
	key := func(d valueDev) float64 {
		switch {
		case !math.IsNaN(d.rel):
			return math.Abs(d.rel)
		case d.pass:
			return -1
		}
		return math.Inf(1)
	}
	sort.SliceStable(idx, func(a, b int) bool {
		da, db := rp.devs[idx[a]], rp.devs[idx[b]]
		if da.pass != db.pass {
			return !da.pass
		}
		if ka, kb := key(da), key(db); ka != kb {
			return ka > kb
		}
		return da.digits > db.digits
	})
	return idx[:min(k, len(idx))]
}

func fmtRel(x float64) string {
	if math.IsNaN(x) {
		return "-"
	}
	return strconv.FormatFloat(x, 'e', 1, 64)
}

func fmtDigits(x float64) string {
	if math.IsInf(x, 1) {
		return "inf"
	}
	return strconv.FormatFloat(x, 'f', 2, 64)
}

func fmtGot(x float64) string {
	if math.IsNaN(x) {
		return "(not computed)"
	}
	return strconv.FormatFloat(x, 'g', 12, 64)
}

func (rp *report) fluidText() string {
	var s []string
	for _, f := range rp.fluids {
		s = append(s, f.Name()+" ("+f.EquationOfState()+")")
	}
	return strings.Join(s, ", ")
}

func (rp *report) sourceText() string {
	const most = 4
	s := rp.sources
	if len(s) > most {
		return strings.Join(s[:most], "; ") + fmt.Sprintf("; and %d more", len(s)-most)
	}
	return strings.Join(s, "; ")
}

func (rp *report) summary() string {
	var b strings.Builder
	if rp.all.beyond == 0 {
		fmt.Fprintf(&b, "all %d values %s", rp.all.n, rp.lim.text())
	} else {
		fmt.Fprintf(&b, "%d of %d values beyond the limit (%s)", rp.all.beyond, rp.all.n, rp.lim.text())
	}
	if len(rp.failed) > 0 {
		fmt.Fprintf(&b, "; %d of %d rows not evaluated", len(rp.failed), len(rp.cf.rows))
	}
	return b.String()
}

// writeMD prints the report as Markdown: the per-property table, the
// worst states and the rows that could not be evaluated.
func (rp *report) writeMD(w io.Writer, worst int) error {
	cf := rp.cf
	var ref string
	if len(rp.fluids) > 0 {
		ref = refText(rp.fluids[0])
	}
	tb := &table{
		title: "Deviations from " + cf.path,
		notes: []string{
			"Fluid: " + rp.fluidText() + "; reference state of h and s: " + ref + ".",
			fmt.Sprintf("%d rows; states from %s.", len(cf.rows), kindText(cf.kind)),
			"Reference values: " + rp.sourceText() + ".",
			"Relative deviations (computed - reference)/|reference| in SI units, max and mean of their magnitudes; deviations in units of the last printed digit of each reference value.",
		},
		noteCol: -1,
	}
	for _, h := range []string{"property", "values", "max rel dev", "mean rel dev", "max dev [last digit]", "beyond limit", "worst state"} {
		tb.cols = append(tb.cols, h)
		tb.labels = append(tb.labels, h)
		tb.text = append(tb.text, h == "property" || h == "worst state")
	}
	var sec section
	add := func(name string, s *colStats) {
		ws := ""
		if s.worst >= 0 {
			d := rp.devs[s.worst]
			ws = fmt.Sprintf("line %d: %s", d.row.line, cf.state(d.row))
		}
		sec.rows = append(sec.rows, []string{name, strconv.Itoa(s.n), fmtRel(nanIfNone(s.maxRel, s.nRel)), fmtRel(s.meanRel()),
			fmtDigits(s.maxDigits), strconv.Itoa(s.beyond), ws})
	}
	for j := cf.nInputs(); j < len(cf.props); j++ {
		add(cf.props[j].text(), &rp.cols[j])
	}
	add("all", &rp.all)
	tb.sections = []section{sec}
	tables := []*table{tb}
	if k := rp.worstK(worst); len(k) > 0 {
		wt := &table{noteCol: -1}
		for _, h := range []string{"line", "state", "property", "reference", "computed", "rel dev", "dev [last digit]", "within limit"} {
			wt.cols = append(wt.cols, h)
			wt.labels = append(wt.labels, h)
			wt.text = append(wt.text, h == "state" || h == "property" || h == "within limit")
		}
		ws := section{heading: fmt.Sprintf("The %d worst values", len(k))}
		for _, i := range k {
			d := rp.devs[i]
			ok := "yes"
			if !d.pass {
				ok = "NO"
			}
			ws.rows = append(ws.rows, []string{strconv.Itoa(d.row.line), cf.state(d.row), cf.props[d.col].text(),
				d.row.ref[d.col].text, fmtGot(d.got), fmtRel(d.rel), fmtDigits(d.digits), ok})
		}
		wt.sections = []section{ws}
		tables = append(tables, wt)
	}
	last := tables[len(tables)-1]
	if len(rp.flagged) > 0 {
		last.legend = append(last.legend, "Rows computed as metastable states (at the request of the phase column) or beyond the published range:")
		for _, f := range rp.flagged {
			last.legend = append(last.legend, fmt.Sprintf("- line %d (%s): %v", f.row.line, cf.state(f.row), f.err))
		}
	}
	if len(rp.failed) > 0 {
		last.legend = append(last.legend, "Rows not evaluated:")
		for _, f := range rp.failed {
			last.legend = append(last.legend, fmt.Sprintf("- line %d (%s): %v", f.row.line, cf.state(f.row), f.err))
		}
	}
	last.legend = append(last.legend, "Result: "+rp.summary()+".")
	for _, t := range tables {
		if err := t.writeMD(w); err != nil {
			return err
		}
	}
	return nil
}

func nanIfNone(x float64, n int) float64 {
	if n == 0 {
		return math.NaN()
	}
	return x
}

// reportCSVHeader is the header of CSV reports: one row per compared
// property of each file, and a row "all" per file.
var reportCSVHeader = []string{"file", "fluid", "property", "unit", "values", "max_abs_rel_dev", "mean_abs_rel_dev",
	"max_dev_last_digits", "beyond_limit", "rows_not_evaluated", "worst_line", "worst_state"}

// csvRows returns the report's rows for a CSV report.
func (rp *report) csvRows() [][]string {
	cf := rp.cf
	var names []string
	for _, f := range rp.fluids {
		names = append(names, f.Name())
	}
	var out [][]string
	add := func(prop, unit string, s *colStats, failed string) {
		wl, ws := "", ""
		if s.worst >= 0 {
			d := rp.devs[s.worst]
			wl, ws = strconv.Itoa(d.row.line), cf.state(d.row)
		}
		out = append(out, []string{cf.path, strings.Join(names, " "), prop, unit, strconv.Itoa(s.n),
			fmtRel(nanIfNone(s.maxRel, s.nRel)), fmtRel(s.meanRel()), fmtDigits(s.maxDigits), strconv.Itoa(s.beyond), failed, wl, ws})
	}
	for j := cf.nInputs(); j < len(cf.props); j++ {
		c := cf.props[j]
		name := c.q.info().name
		if c.phase != phaseNone {
			name += "_" + phaseSuffix[c.phase]
		}
		add(name, c.u.text, &rp.cols[j], "")
	}
	add("all", "", &rp.all, strconv.Itoa(len(rp.failed)))
	return out
}

func writeReports(w io.Writer, rps []*report, f outFormat, worst int) error {
	if f == formatCSV {
		cw := csv.NewWriter(w)
		cw.Write(reportCSVHeader)
		for _, rp := range rps {
			for _, r := range rp.csvRows() {
				cw.Write(r)
			}
		}
		cw.Flush()
		return cw.Error()
	}
	for i, rp := range rps {
		if i > 0 {
			if _, err := io.WriteString(w, "\n"); err != nil {
				return err
			}
		}
		if err := rp.writeMD(w, worst); err != nil {
			return err
		}
	}
	return nil
}
