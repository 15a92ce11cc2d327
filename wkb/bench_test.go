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

// BenchmarkFiniteLevels times Levels on a finite well, the invented
// GaAs/Al₀.₃Ga₀.₇As-like electron well of issue 12 (v = 4.3, μ = 1.37, two
// levels confined up to f ≈ 1) and a deep well (v = 50, μ = 1.37), for
// both rules and the exact reference in one run. ns/level is the time per
// call divided by k.
func BenchmarkFiniteLevels(b *testing.B) {
	for _, w := range []struct {
		name string
		v    float64
		ks   []int
	}{{"demo", 4.3, []int{1, 2}}, {"deep", 50, []int{1, 3, 6}}} {
		st, err := tiltwell.FiniteWell(w.v, 1.37)
		if err != nil {
			b.Fatal(err)
		}
		methods := []struct {
			name string
			s    tiltwell.Solver
		}{
			{"wkb", wkb.Solver{Stack: st}},
			{"wkb-plain", wkb.Solver{Stack: st, Plain: true}},
			{"exact", exact.Solver{Stack: st}},
		}
		for _, m := range methods {
			for _, k := range w.ks {
				for _, f := range []float64{0, 0.1, 1, 3} {
					if _, err := m.s.Levels(nil, f, k); err != nil {
						continue // fewer than k confined
					}
					b.Run(fmt.Sprintf("stack=%s/method=%s/k=%d/f=%g", w.name, m.name, k, f), func(b *testing.B) {
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
