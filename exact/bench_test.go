package exact

import (
	"fmt"
	"testing"

	"github.com/tiltwell/tiltwell"
)

var (
	levelSink []tiltwell.Level
	floatSink float64
)

// BenchmarkLevels times the lowest k levels at one field, reusing dst.
func BenchmarkLevels(b *testing.B) {
	for _, k := range []int{1, 10, 50} {
		for _, f := range []float64{1e-8, 0.1, 1, 10, 100, 1000, 1e4} {
			b.Run(fmt.Sprintf("k=%d/f=%g", k, f), func(b *testing.B) {
				dst := make([]tiltwell.Level, 0, k)
				b.ReportAllocs()
				for b.Loop() {
					dst, _ = Solver{}.Levels(dst, f, k)
				}
				levelSink = dst
			})
		}
	}
}

// BenchmarkPhase times one evaluation of the Airy phase in each range.
func BenchmarkPhase(b *testing.B) {
	for _, z := range []float64{-1e300, -1e10, -100, -5, 3, 30} {
		b.Run(fmt.Sprintf("z=%g", z), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				t, _ := phase(z)
				floatSink += t
			}
		})
	}
}

// BenchmarkAiry times Ai, Ai′, Bi, Bi′ together.
func BenchmarkAiry(b *testing.B) {
	for _, z := range []float64{-1e300, -1e10, -100, -5, 3, 30} {
		b.Run(fmt.Sprintf("z=%g", z), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				ai, _, _, _ := Airy(z)
				floatSink += ai
			}
		})
	}
}

// BenchmarkWavefunction times building a wavefunction and evaluating it at
// 100 points.
func BenchmarkWavefunction(b *testing.B) {
	for _, f := range []float64{1, 100} {
		b.Run(fmt.Sprintf("f=%g/n=3", f), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				w, _ := Solver{}.Wavefunction(f, 3)
				for i := range 100 {
					floatSink += w.At(float64(i) / 100)
				}
			}
		})
	}
}

// BenchmarkBuildWave times building a wavefunction from its level
// (BuildWave, reusing the storage) and evaluating it at the 100 points
// of BenchmarkWavefunction, for the ratio to it.
func BenchmarkBuildWave(b *testing.B) {
	for _, f := range []float64{1, 100} {
		b.Run(fmt.Sprintf("f=%g/n=3", f), func(b *testing.B) {
			lv, err := Solver{}.Levels(nil, f, 3)
			if err != nil {
				b.Fatal(err)
			}
			var w tiltwell.Wavefunction
			b.ReportAllocs()
			for b.Loop() {
				w, _ = Solver{}.BuildWave(w, f, lv[2])
				for i := range 100 {
					floatSink += w.At(float64(i) / 100)
				}
			}
		})
	}
}
