package table

import (
	"math"
	"math/rand/v2"
	"testing"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

var sink float64

//go:noinline
func loopPH(tb *Table, pts [][4]float64, n int) {
	for i := 0; i < n; i++ {
		q := &pts[i&511]
		st, _ := tb.PH(q[0], q[2])
		sink += st.T
	}
}

//go:noinline
func loopPT(tb *Table, pts [][4]float64, n int) {
	for i := 0; i < n; i++ {
		q := &pts[i&511]
		st, _ := tb.PT(q[0], q[1])
		sink += st.T
	}
}

//go:noinline
func loopDU(tb *Table, pts [][4]float64, us []float64, n int) {
	for i := 0; i < n; i++ {
		q := &pts[i&511]
		st, _ := tb.DU(q[3], us[i&511])
		sink += st.T
	}
}

func BenchmarkQuick(b *testing.B) {
	f, _ := fluid.Lookup("CO2")
	tb, _ := New(f, Range{})
	rng := rand.New(rand.NewPCG(1, 2))
	var pts [][4]float64
	var us []float64
	for len(pts) < 512 {
		p := math.Exp(math.Log(1e3) + rng.Float64()*(math.Log(1e8)-math.Log(1e3)))
		T := 220 + rng.Float64()*800
		st, err := flash.PT(f, p, T)
		if err != nil || !tb.CoversPH(p, st.H) || !tb.CoversDU(st.Rho, st.U) || !tb.CoversPT(p, T) {
			continue
		}
		pts = append(pts, [4]float64{p, T, st.H, st.Rho})
		us = append(us, st.U)
	}
	b.Run("PH", func(b *testing.B) { loopPH(tb, pts, b.N) })
	b.Run("PT", func(b *testing.B) { loopPT(tb, pts, b.N) })
	b.Run("DU", func(b *testing.B) { loopDU(tb, pts, us, b.N) })
}

func BenchmarkQuickEq(b *testing.B) {
	f, _ := fluid.Lookup("CO2")
	tb, _ := New(f, Range{})
	rng := rand.New(rand.NewPCG(1, 2))
	var pts [][4]float64
	var us []float64
	for len(pts) < 512 {
		p := math.Exp(math.Log(1e3) + rng.Float64()*(math.Log(1e8)-math.Log(1e3)))
		T := 220 + rng.Float64()*800
		st, err := flash.PT(f, p, T)
		if err != nil || !tb.CoversPH(p, st.H) || !tb.CoversDU(st.Rho, st.U) || !tb.CoversPT(p, T) {
			continue
		}
		pts = append(pts, [4]float64{p, T, st.H, st.Rho})
		us = append(us, st.U)
	}
	b.Run("PH", func(b *testing.B) {
		for i := 0; i < b.N; i++ {
			q := &pts[i&511]
			st, _ := flash.PH(f, q[0], q[2])
			sink += st.T
		}
	})
	b.Run("PT", func(b *testing.B) {
		for i := 0; i < b.N; i++ {
			q := &pts[i&511]
			st, _ := flash.PT(f, q[0], q[1])
			sink += st.T
		}
	})
	b.Run("DU", func(b *testing.B) {
		for i := 0; i < b.N; i++ {
			q := &pts[i&511]
			st, _ := flash.DU(f, q[3], us[i&511])
			sink += st.T
		}
	})
}
