package wkb_test

import (
	"fmt"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/wkb"
)

// BenchmarkLevels times Levels for the connection rule, the plain rule and
// the exact reference in one run, so their ratios can be read off directly.
// ns/level is the time per call divided by k.
func BenchmarkLevels(b *testing.B) {
	methods := []struct {
		name string
		s    tiltwell.Solver
	}{
		{"wkb", wkb.Solver{}},
		{"wkb-plain", wkb.Solver{Plain: true}},
		{"exact", exact.Solver{}},
	}
	for _, m := range methods {
		for _, k := range []int{1, 5, 50} {
			for _, f := range []float64{0.1, 3, 10, 100, 1e4} {
				b.Run(fmt.Sprintf("method=%s/k=%d/f=%g", m.name, k, f), func(b *testing.B) {
					dst := make([]tiltwell.Level, 0, k)
					b.ReportAllocs()
					var err error
					for b.Loop() {
						if dst, err = m.s.Levels(dst, f, k); err != nil {
							b.Fatal(err)
						}
					}
					b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*k), "ns/level")
				})
			}
		}
	}
}

// BenchmarkWavefunction times construction (normalisation included) and one
// evaluation of the uniform wavefunction.
func BenchmarkWavefunction(b *testing.B) {
	for _, n := range []int{1, 10} {
		for _, f := range []float64{3, 100} {
			b.Run(fmt.Sprintf("op=new/n=%d/f=%g", n, f), func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					if _, err := (wkb.Solver{}).Wavefunction(f, n); err != nil {
						b.Fatal(err)
					}
				}
			})
			w, err := wkb.Solver{}.Wavefunction(f, n)
			if err != nil {
				b.Fatal(err)
			}
			b.Run(fmt.Sprintf("op=at/n=%d/f=%g", n, f), func(b *testing.B) {
				b.ReportAllocs()
				xi := 0.0
				for b.Loop() {
					_ = w.At(xi)
					xi += 0.01
					if xi > 1 {
						xi = 0
					}
				}
			})
		}
	}
}
