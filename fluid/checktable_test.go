package fluid

import (
	"encoding/csv"
	"io"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// checkRow is one row of a published check table in ../testdata: its
// cells by column name, and where it stands in the file.
type checkRow struct {
	cells map[string]string
	pos   string // file:line
}

// readCheckTable reads ../testdata/name (see testdata/README.md). Every
// row must name its source.
func readCheckTable(t *testing.T, name string) []checkRow {
	t.Helper()
	path := filepath.Join("..", "testdata", name)
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	r := csv.NewReader(strings.NewReader(string(b)))
	r.Comment = '#'
	head, err := r.Read()
	if err != nil {
		t.Fatalf("%s: header: %v", path, err)
	}
	if head[len(head)-1] != "source" {
		t.Fatalf("%s: last column is %q, want source", path, head[len(head)-1])
	}
	var rows []checkRow
	for {
		rec, err := r.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("%s: %v", path, err)
		}
		line, _ := r.FieldPos(0)
		row := checkRow{cells: map[string]string{}, pos: path + ":" + strconv.Itoa(line)}
		for j, c := range rec {
			row.cells[head[j]] = strings.TrimSpace(c)
		}
		if row.cells["source"] == "" {
			t.Fatalf("%s: no source", row.pos)
		}
		rows = append(rows, row)
	}
	if len(rows) == 0 {
		t.Fatalf("%s: no rows", path)
	}
	return rows
}

// float returns the cell col of row as a number.
func (row checkRow) float(t *testing.T, col string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(row.cells[col], 64)
	if err != nil {
		t.Fatalf("%s: column %s: %v", row.pos, col, err)
	}
	return v
}

// printed is a value as a publication prints it, with the size of one
// unit in its last printed digit.
type printed struct {
	text  string
	value float64
	unit  float64 // one unit in the last printed digit; 0 for a printed 0
}

// parsePrinted reads a number such as "0.992418352e-1" or "-0.364366650".
func parsePrinted(s string) (printed, error) {
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		return printed{}, err
	}
	p := printed{text: s, value: v}
	if v == 0 {
		return p, nil
	}
	mant, exp := strings.ToLower(s), 0
	if i := strings.IndexByte(mant, 'e'); i >= 0 {
		if exp, err = strconv.Atoi(mant[i+1:]); err != nil {
			return printed{}, err
		}
		mant = mant[:i]
	}
	decimals := 0
	if i := strings.IndexByte(mant, '.'); i >= 0 {
		decimals = len(mant) - i - 1
	}
	p.unit = math.Pow(10, float64(exp-decimals))
	return p, nil
}

// matches reports whether got rounds to the printed value: |got − value|
// within one unit in the last printed digit, plus the few ulps of
// representing the decimal numbers in binary. A printed 0 must be exactly 0.
func (p printed) matches(got float64) bool {
	if p.unit == 0 {
		return got == 0
	}
	return math.Abs(got-p.value) <= p.unit+8*0x1p-52*math.Abs(p.value)
}

// checkPrinted compares got, in the units of the table, with the cell col
// of row.
func checkPrinted(t *testing.T, row checkRow, col string, got float64) {
	t.Helper()
	p, err := parsePrinted(row.cells[col])
	if err != nil {
		t.Fatalf("%s: column %s: %v", row.pos, col, err)
	}
	if !p.matches(got) {
		t.Errorf("%s: %s = %.12g, want %s ±%g (%s)", row.pos, col, got, p.text, p.unit, row.cells["source"])
	}
}

func TestParsePrinted(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		s          string
		value, ulp float64
	}{
		{"0.992418352e-1", 0.0992418352, 1e-10},
		{"-0.364366650", -0.36436665, 1e-9},
		{"0.150151914e4", 1501.51914, 1e-5},
		{"0.999938125", 0.999938125, 1e-9},
		{"12.5", 12.5, 0.1},
		{"0", 0, 0},
	} {
		p, err := parsePrinted(c.s)
		if err != nil {
			t.Fatal(err)
		}
		if p.value != c.value || math.Abs(p.unit-c.ulp) > 1e-12*c.ulp {
			t.Errorf("parsePrinted(%q) = %v, %v; want %v, %v", c.s, p.value, p.unit, c.value, c.ulp)
		}
	}
	p, _ := parsePrinted("0.150151914e4")
	for _, c := range []struct {
		got  float64
		want bool
	}{
		{1501.51914, true}, {1501.51915, true}, {1501.51913, true},
		{1501.519151, false}, {1501.519129, false},
	} {
		if p.matches(c.got) != c.want {
			t.Errorf("%s matches %v = %v, want %v", p.text, c.got, !c.want, c.want)
		}
	}
	if _, err := parsePrinted("x"); err == nil {
		t.Error("parsePrinted(x): no error")
	}
}
