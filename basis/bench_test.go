package basis_test

import (
	"fmt"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/basis"
	"github.com/tiltwell/tiltwell/exact"
)

// BenchmarkLevels times all N levels of an N-state basis at f = 10, and
// exact.Solver for the same k in the same run. ns/level is reported so the
// two can be compared per level.
func BenchmarkLevels(b *testing.B) {
	const f = 10
	for _, N := range []int{10, 20, 40, 80} {
		for _, c := range []struct {
			name string
			s    tiltwell.Solver
		}{
			{"basis", basis.Solver{Size: N}},
			{"exact", exact.Solver{}},
		} {
			b.Run(fmt.Sprintf("method=%s/N=%d/k=%d/f=%d", c.name, N, N, f), func(b *testing.B) {
				dst := make([]tiltwell.Level, 0, N)
				b.ReportAllocs()
				var err error
				for b.Loop() {
					dst, err = c.s.Levels(dst, f, N)
				}
				if err != nil {
					b.Fatal(err)
				}
				b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(N), "ns/level")
			})
		}
	}
}

// BenchmarkLowLevels times the common use: 5 levels from an N-state basis.
func BenchmarkLowLevels(b *testing.B) {
	const f, k = 10, 5
	for _, c := range []struct {
		name string
		s    tiltwell.Solver
	}{
		{"basis/N=20", basis.Solver{Size: 20}},
		{"basis/N=40", basis.Solver{Size: 40}},
		{"basis/auto", basis.Solver{}},
		{"basis/potential/N=40", basis.Solver{Size: 40, Potential: func(x float64) float64 { return x * x }}},
		{"exact", exact.Solver{}},
	} {
		b.Run(fmt.Sprintf("method=%s/k=%d/f=%d", c.name, k, f), func(b *testing.B) {
			dst := make([]tiltwell.Level, 0, k)
			b.ReportAllocs()
			var err error
			for b.Loop() {
				dst, err = c.s.Levels(dst, f, k)
			}
			if err != nil {
				b.Fatal(err)
			}
		})
	}
}
