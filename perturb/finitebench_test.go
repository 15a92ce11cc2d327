package perturb_test

import (
	"fmt"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/perturb"
)

// BenchmarkLevelsFinite times Levels on finite wells (the demo GaAs-like
// electron well, invented demo data, and a deep asymmetric well).
func BenchmarkLevelsFinite(b *testing.B) {
	demo, _ := tiltwell.FiniteWell(4.3, 1.37)
	deep, _ := tiltwell.AsymmetricWell(50, 1, 30, 2)
	for _, c := range []struct {
		name string
		st   tiltwell.Stack
		k    int
		f    float64
	}{{"demo", demo, 2, 1}, {"deep", deep, 5, 1}, {"deep", deep, 5, -3}} {
		s := perturb.Solver{Stack: c.st}
		b.Run(fmt.Sprintf("stack=%s/k=%d/f=%g", c.name, c.k, c.f), func(b *testing.B) {
			b.ReportAllocs()
			dst := make([]tiltwell.Level, 0, c.k)
			dst, _ = s.Levels(dst, c.f, c.k)
			for b.Loop() {
				dst, _ = s.Levels(dst, c.f, c.k)
			}
			levelsSink = dst
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*c.k), "ns/level")
		})
	}
}
