package table

import (
	"math"
	"testing"

	"github.com/tripoint-thermo/tripoint/flash"
)

func BenchmarkMicro(b *testing.B) {
	t := tableOf(b, "CO2")
	pts := benchStates(b, t)
	in := benchInputs("PT", pts)
	n := len(in)
	b.Run("log", func(b *testing.B) {
		for i := 0; i < b.N; i++ {
			benchSink += math.Log(in[i%n][0])
		}
	})
	b.Run("cell", func(b *testing.B) {
		for i := 0; i < b.N; i++ {
			x := math.Log(in[i%n][0])
			_, j, tx, w := t.pt.locate(x)
			benchSink += tx + w + float64(j)
		}
	})
	b.Run("find", func(b *testing.B) {
		for i := 0; i < b.N; i++ {
			x := math.Log(in[i%n][0])
			s, j, tx, w := t.pt.locate(x)
			wx := basis(tx, w)
			k, lo, hi := s.v.find(j, &wx, in[i%n][1])
			benchSink += lo + hi + float64(k)
		}
	})
	b.Run("fromPT", func(b *testing.B) {
		var st flash.State
		for i := 0; i < b.N; i++ {
			t.fromPT(in[i%n][0], in[i%n][1], &st)
			benchSink += st.T
		}
	})
	b.Run("PT", func(b *testing.B) {
		for i := 0; i < b.N; i++ {
			st, _ := t.PT(in[i%n][0], in[i%n][1])
			benchSink += st.T
		}
	})
	b.Run("PTsame", func(b *testing.B) {
		for i := 0; i < b.N; i++ {
			st, _ := t.PT(in[7][0], in[7][1])
			benchSink += st.T
		}
	})
}

func BenchmarkMicro2(b *testing.B) {
	t := tableOf(b, "CO2")
	pts := benchStates(b, t)
	in := benchInputs("PT", pts)
	p, T := in[7][0], in[7][1]
	b.Run("findSame", func(b *testing.B) {
		for i := 0; i < b.N; i++ {
			x := math.Log(p)
			s, j, tx, w := t.pt.locate(x)
			wx := basis(tx, w)
			k, lo, hi := s.v.find(j, &wx, T)
			benchSink += lo + hi + float64(k)
		}
	})
	b.Run("evalSame", func(b *testing.B) {
		x := math.Log(p)
		s, j, tx, w := t.pt.locate(x)
		wx := basis(tx, w)
		k, lo, hi := s.v.find(j, &wx, T)
		pa := s.v.bands[k].patch
		var o [maxProps]float64
		for i := 0; i < b.N; i++ {
			pa.eval(j, &wx, eta(T, lo, hi), &o)
			benchSink += o[0]
		}
	})
	b.Run("fromPTSame", func(b *testing.B) {
		var st flash.State
		for i := 0; i < b.N; i++ {
			t.fromPT(p, T, &st)
			benchSink += st.T
		}
	})
}
