package bigstack

import (
	"fmt"
	"testing"
)

// BenchmarkLevel times one level of a finite well on each route.
func BenchmarkLevel(b *testing.B) {
	w := single(4.3, 1.37, 4.3, 1.37)
	for _, c := range []struct {
		f    float64
		prec uint
	}{{0, 256}, {1e-3, 256}, {1, 256}, {0.1, 256}} {
		b.Run(fmt.Sprintf("f=%g/prec=%d", c.f, c.prec), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := Level(w, 1, c.f, 1, c.prec); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
