//go:build !amd64

package table

// vector is false where there is no vector kernel.
const vector = false

func evalVec(wx, wy *[4]float64, d0, d1 *float64, e0, e1 *float32, out *[maxProps]float64) {
	panic("table: no vector kernel")
}
