package main

import (
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"unicode/utf8"
)

// formatValue prints x with the given number of significant digits, in
// positional notation where that shows exactly those digits (trailing
// zeros included, since they are significant) and in exponent notation
// otherwise (|x| ≥ 10^digits or |x| < 1e-5). NaN, the mark of a value
// that does not exist, prints as an empty cell; ±Inf as inf and -inf.
func formatValue(x float64, digits int) string {
	switch {
	case math.IsNaN(x):
		return ""
	case math.IsInf(x, 1):
		return "inf"
	case math.IsInf(x, -1):
		return "-inf"
	}
	e := strconv.FormatFloat(x, 'e', digits-1, 64)
	exp, _ := strconv.Atoi(e[strings.IndexByte(e, 'e')+1:])
	if x != 0 && (exp >= digits || exp < -5) {
		return e
	}
	return strconv.FormatFloat(x, 'f', digits-1-exp, 64)
}

// inputText prints the i-th given value in the unit u: as given if u is
// the unit it was given in, else converted and rounded to 1e-11 of its
// SI value, which drops the binary noise of the conversion (0.01 °C is
// 273.16 K, not 273.16000000000003 K) and keeps every digit a person
// gives.
func inputText(g given, i int, u unit) string {
	if g.u == u {
		return g.text[i]
	}
	return formatConverted(g.si[i], u)
}

func formatConverted(si float64, u unit) string {
	v := u.fromSI(si)
	step := 1e-11 * math.Abs(si) / u.scale
	d := max(0, int(math.Ceil(-math.Log10(step))))
	s := strconv.FormatFloat(v, 'f', d, 64)
	if strings.ContainsRune(s, '.') {
		s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
	}
	if s == "-0" {
		s = "0"
	}
	return s
}

// table is a printed table: a title and notes, columns and rows in
// sections (one per isobar, say), and a source for CSV.
type table struct {
	title    string
	notes    []string  // lines under the title
	cols     []string  // CSV names
	labels   []string  // Markdown headings
	text     []bool    // text (left-aligned) columns; the others are numbers
	sections []section // rows
	source   string    // the source column of CSV output; "" for none
	noteCol  int       // index of the note column, or -1
	legend   []string  // lines after the table (Markdown only)
}

type section struct {
	heading string // Markdown heading and CSV comment; may be empty
	rows    [][]string
}

// write prints t to w as Markdown or as CSV in the check-table layout.
func (t *table) write(w io.Writer, f outFormat) error {
	if f == formatCSV {
		return t.writeCSV(w)
	}
	return t.writeMD(w)
}

func (t *table) writeCSV(w io.Writer) error {
	for _, line := range append([]string{t.title}, t.notes...) {
		if _, err := fmt.Fprintf(w, "# %s\n", line); err != nil {
			return err
		}
	}
	cw := csv.NewWriter(w)
	head := t.cols
	if t.source != "" {
		head = append(append([]string(nil), head...), "source")
	}
	if err := cw.Write(head); err != nil {
		return err
	}
	for _, sec := range t.sections {
		if sec.heading != "" {
			cw.Flush()
			if _, err := fmt.Fprintf(w, "# %s\n", sec.heading); err != nil {
				return err
			}
		}
		for _, r := range sec.rows {
			if t.source != "" {
				r = append(append([]string(nil), r...), t.source)
			}
			if err := cw.Write(r); err != nil {
				return err
			}
		}
	}
	cw.Flush()
	return cw.Error()
}

// writeMD prints t as Markdown tables, padded so that they read as plain
// text too. Notes longer than a few words become numbered footnotes; a
// note column that is empty throughout is left out.
func (t *table) writeMD(w io.Writer) error {
	var b strings.Builder
	if t.title != "" {
		b.WriteString(t.title + "\n")
	}
	for _, n := range t.notes {
		b.WriteString(n + "  \n")
	}
	keep := make([]bool, len(t.cols))
	for j := range keep {
		keep[j] = j != t.noteCol
	}
	var foot []string
	footNo := map[string]int{}
	secs := make([]section, len(t.sections))
	for i, sec := range t.sections {
		secs[i] = section{heading: sec.heading}
		for _, r := range sec.rows {
			r = append([]string(nil), r...)
			if t.noteCol >= 0 && r[t.noteCol] != "" {
				keep[t.noteCol] = true
				if n := r[t.noteCol]; utf8.RuneCountInString(n) > 30 {
					k, ok := footNo[n]
					if !ok {
						foot = append(foot, n)
						k = len(foot)
						footNo[n] = k
					}
					r[t.noteCol] = "[" + strconv.Itoa(k) + "]"
				}
			}
			secs[i].rows = append(secs[i].rows, r)
		}
	}
	var idx []int
	for j, k := range keep {
		if k {
			idx = append(idx, j)
		}
	}
	for _, sec := range secs {
		b.WriteString("\n")
		if sec.heading != "" {
			b.WriteString("**" + sec.heading + "**\n\n")
		}
		width := make([]int, len(t.cols))
		for _, j := range idx {
			width[j] = max(3, utf8.RuneCountInString(t.labels[j]))
			for _, r := range sec.rows {
				width[j] = max(width[j], utf8.RuneCountInString(mdEscape(r[j])))
			}
		}
		line := func(cell func(j int) string) {
			b.WriteString("|")
			for _, j := range idx {
				c := cell(j)
				pad := strings.Repeat(" ", width[j]-utf8.RuneCountInString(c))
				if t.text[j] {
					b.WriteString(" " + c + pad + " |")
				} else {
					b.WriteString(" " + pad + c + " |")
				}
			}
			b.WriteString("\n")
		}
		line(func(j int) string { return t.labels[j] })
		line(func(j int) string {
			if t.text[j] {
				return ":" + strings.Repeat("-", width[j]-1)
			}
			return strings.Repeat("-", width[j]-1) + ":"
		})
		for _, r := range sec.rows {
			line(func(j int) string { return mdEscape(r[j]) })
		}
	}
	if len(t.legend) > 0 || len(foot) > 0 {
		b.WriteString("\n")
	}
	for _, l := range t.legend {
		b.WriteString(l + "  \n")
	}
	for i, n := range foot {
		fmt.Fprintf(&b, "[%d] %s  \n", i+1, mdEscape(n))
	}
	_, err := io.WriteString(w, b.String())
	return err
}

func mdEscape(s string) string { return strings.ReplaceAll(s, "|", `\|`) }
