package fluid

import (
	"strconv"
	"strings"
)

// Flags qualify a computed state. The same bits are used by fluid.Props and
// by the flash package's states; their values are stable (the C ABI
// exposes them).
type Flags uint32

const (
	Saturated     Flags = 1 << iota // on a coexistence curve
	Extrapolated                    // outside the equation's published range, inside its documented extension
	Metastable                      // a metastable state, returned on request
	AtCritical                      // exactly at the critical point: cp infinite; cv infinite and w zero where the equation has nonanalytic terms
	Indeterminate                   // the inputs do not fix the state; a documented choice was returned
)

var flagNames = [...]string{"Saturated", "Extrapolated", "Metastable", "AtCritical", "Indeterminate"}

// String returns the names of the set flags joined by "|", or "0".
func (f Flags) String() string {
	if f == 0 {
		return "0"
	}
	var parts []string
	for i, n := range flagNames {
		if f&(1<<i) != 0 {
			parts = append(parts, n)
		}
	}
	if rest := f &^ (1<<len(flagNames) - 1); rest != 0 {
		parts = append(parts, "0x"+strconv.FormatUint(uint64(rest), 16))
	}
	return strings.Join(parts, "|")
}
