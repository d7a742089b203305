package fluid

import (
	"slices"
	"strings"
	"sync"
)

// constructors of every fluid in the registry.
var constructors = []func() *Fluid{newWater, newCO2, newR134a}

// registry is built once, on first use, and never changed after.
var registry = sync.OnceValues(func() (map[string]*Fluid, []string) {
	m := map[string]*Fluid{}
	var names []string
	for _, c := range constructors {
		f := c()
		f.satHolder = &satCurveHolder{}
		f.denseHolder = &denseTableHolder{}
		names = append(names, f.name)
		for _, n := range append([]string{f.name}, f.aliases...) {
			m[normalize(n)] = f
		}
	}
	slices.Sort(names)
	return m, names
})

// normalize folds case and drops spaces, hyphens and underscores, so that
// "R-134a", "r134a" and "R 134a" name one fluid.
func normalize(s string) string {
	return strings.Map(func(r rune) rune {
		switch r {
		case ' ', '-', '_', '\t':
			return -1
		}
		return r
	}, strings.ToLower(strings.TrimSpace(s)))
}

// Lookup returns the fluid of the given name or alias, matched without
// regard to case, spaces, hyphens or underscores. The error wraps
// ErrUndefined and lists the known fluids.
func Lookup(name string) (*Fluid, error) {
	m, names := registry()
	if f, ok := m[normalize(name)]; ok {
		return f, nil
	}
	return nil, &Error{Op: "fluid.Lookup", Err: ErrUndefined,
		Range: "unknown fluid " + quoteASCII(name) + "; known: " + strings.Join(names, ", ")}
}

// Names returns the canonical names of all fluids, sorted.
func Names() []string {
	_, names := registry()
	return slices.Clone(names)
}

// quoteASCII quotes s with non-ASCII bytes escaped, so that messages stay
// ASCII.
func quoteASCII(s string) string {
	var b strings.Builder
	b.WriteByte('"')
	for i := 0; i < len(s); i++ {
		c := s[i]
		if c >= 0x20 && c < 0x7f && c != '"' && c != '\\' {
			b.WriteByte(c)
		} else {
			const hex = "0123456789abcdef"
			b.WriteString(`\x`)
			b.WriteByte(hex[c>>4])
			b.WriteByte(hex[c&15])
		}
	}
	b.WriteByte('"')
	return b.String()
}
