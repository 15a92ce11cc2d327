package variational_test

import (
	"fmt"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/variational"
)

// BenchmarkLevels times the ground level and the lowest five levels for
// each family at a moderate field, beside the exact reference in the same
// run; for Poly (and exact) also all twelve levels, and a strong field,
// where the lower bounds of the upper levels need the larger verification
// space.
func BenchmarkLevels(b *testing.B) {
	for _, tc := range []struct {
		name string
		s    tiltwell.Solver
		ks   []int
		fs   []float64
	}{
		{"method=variational/family=poly", variational.Solver{}, []int{1, 5, 12}, []float64{10, 500}},
		{"method=variational/family=sine", variational.Solver{Family: variational.Sine}, []int{1, 5}, []float64{10}},
		{"method=variational/family=tilt", variational.Solver{Family: variational.Tilt}, []int{1}, []float64{10}},
		{"method=exact", exact.Solver{}, []int{1, 5, 12}, []float64{10, 500}},
	} {
		for _, f := range tc.fs {
			for _, k := range tc.ks {
				b.Run(fmt.Sprintf("%s/k=%d/f=%g", tc.name, k, f), func(b *testing.B) {
					b.ReportAllocs()
					dst := make([]tiltwell.Level, 0, k)
					for b.Loop() {
						var err error
						if dst, err = tc.s.Levels(dst, f, k); err != nil {
							b.Fatal(err)
						}
					}
				})
			}
		}
	}
}

// BenchmarkSweep compares a warm-started sweep of nearby fields with
// independent calls.
func BenchmarkSweep(b *testing.B) {
	fs := make([]float64, 10)
	for i := range fs {
		fs[i] = 50 + float64(i)
	}
	s := variational.Solver{}
	b.Run("warm=true/k=5", func(b *testing.B) {
		b.ReportAllocs()
		dst := make([]variational.Bracket, 0, 5*len(fs))
		for b.Loop() {
			dst, _ = s.Sweep(dst, fs, 5)
		}
	})
	b.Run("warm=false/k=5", func(b *testing.B) {
		b.ReportAllocs()
		dst := make([]variational.Bracket, 0, 5)
		for b.Loop() {
			for _, f := range fs {
				dst, _ = s.Brackets(dst, f, 5, nil)
			}
		}
	})
}
