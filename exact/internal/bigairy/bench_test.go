package bigairy

import (
	"fmt"
	"math/big"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
)

// BenchmarkLevels times one Level call at DefaultPrec (200 bits); the exact
// line is the float64 solver's lowest n levels at the same field, for scale.
func BenchmarkLevels(b *testing.B) {
	for _, f := range []float64{1e-8, 1, 100, 1e4} {
		for _, n := range []int{1, 50} {
			b.Run(fmt.Sprintf("method=bigairy/f=%g/n=%d", f, n), func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					if _, err := Level(f, n, 0); err != nil {
						b.Fatal(err)
					}
				}
			})
			b.Run(fmt.Sprintf("method=exact/f=%g/k=%d", f, n), func(b *testing.B) {
				b.ReportAllocs()
				dst := make([]tiltwell.Level, 0, n)
				var err error
				for b.Loop() {
					if dst, err = (exact.Solver{}).Levels(dst, f, n); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}

// BenchmarkAiry times the Maclaurin series at 256 bits.
func BenchmarkAiry(b *testing.B) {
	for _, z := range []float64{-200, -13, 1, 20, 200} {
		b.Run(fmt.Sprintf("z=%g", z), func(b *testing.B) {
			b.ReportAllocs()
			x := big.NewFloat(z)
			for b.Loop() {
				Airy(x, 256)
			}
		})
	}
}
