package table

import (
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
)

func BenchmarkBuild(b *testing.B) {
	for _, name := range fluidNames {
		f, _ := fluid.Lookup(name)
		b.Run(name, func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if _, err := New(f, Range{}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
