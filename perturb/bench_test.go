package perturb_test

import (
	"fmt"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/perturb"
)

var levelsSink []tiltwell.Level

// BenchmarkLevels times Levels for both orders and, in the same run, the
// exact reference, so that the ratios can be read off one report. The
// ns/level metric is ns/op divided by k.
func BenchmarkLevels(b *testing.B) {
	solvers := []struct {
		name string
		s    tiltwell.Solver
	}{
		{"perturb1", perturb.Solver{Order: 1}},
		{"perturb2", perturb.Solver{Order: 2}},
		{"exact", exact.Solver{}},
	}
	for _, c := range solvers {
		for _, k := range []int{1, 5, 12, 100} {
			for _, f := range []float64{1, 5} {
				b.Run(fmt.Sprintf("method=%s/k=%d/f=%g", c.name, k, f), func(b *testing.B) {
					b.ReportAllocs()
					dst := make([]tiltwell.Level, 0, k)
					dst, _ = c.s.Levels(dst, f, k) // build the tables outside the timing
					for b.Loop() {
						dst, _ = c.s.Levels(dst, f, k)
					}
					levelsSink = dst
					b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*k), "ns/level")
				})
			}
		}
	}
}

var floatSink float64

// BenchmarkDipole times one dipole beside exact.Dipole.
func BenchmarkDipole(b *testing.B) {
	b.Run("method=perturb/n=3/f=2", func(b *testing.B) {
		b.ReportAllocs()
		s := perturb.Solver{}
		for b.Loop() {
			d, _, _ := s.Dipole(2, 3)
			floatSink = d
		}
	})
	b.Run("method=exact/n=3/f=2", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			d, _ := exact.Solver{}.Dipole(2, 3)
			floatSink = d
		}
	})
}

var waveSink float64

// BenchmarkWavefunction times one evaluation of a first-order wavefunction.
func BenchmarkWavefunction(b *testing.B) {
	b.ReportAllocs()
	w, _ := perturb.Solver{}.Wavefunction(2, 3)
	xi := 0.0
	for b.Loop() {
		waveSink = w.At(xi)
		xi += 1e-3
		if xi > 1 {
			xi = 0
		}
	}
}

// BenchmarkLevelsFinite times Levels on finite wells beside the exact
// finite-barrier solver in the same run: the GaAs-like demo electron well
// (invented demo data) and a deep asymmetric well, at fields inside the
// levels' limits. "perturb2" is the steady state (the stack's series
// cached); "perturb2-cold" builds them anew on every call, as for a stack
// not seen before (each iteration uses a barrier 1e-12 higher).
func BenchmarkLevelsFinite(b *testing.B) {
	demo, _ := tiltwell.FiniteWell(4.3, 1.37)
	deep, _ := tiltwell.AsymmetricWell(50, 1, 30, 2)
	for _, c := range []struct {
		name string
		st   tiltwell.Stack
		k    int
		f    float64
	}{{"demo", demo, 2, 1}, {"deep", deep, 5, 1}, {"deep", deep, 5, -2}} {
		for _, m := range []string{"perturb2", "perturb2-cold", "exact"} {
			b.Run(fmt.Sprintf("method=%s/stack=%s/k=%d/f=%g", m, c.name, c.k, c.f), func(b *testing.B) {
				b.ReportAllocs()
				var s tiltwell.Solver = perturb.Solver{Stack: c.st}
				if m == "exact" {
					s = exact.Solver{Stack: c.st}
				}
				l0, _ := c.st.Layer(0)
				l2, _ := c.st.Layer(2)
				dst := make([]tiltwell.Level, 0, c.k)
				dst, _ = s.Levels(dst, c.f, c.k)
				i := 0
				for b.Loop() {
					if m == "perturb2-cold" {
						i++
						d := 1e-12 * float64(i)
						st, _ := tiltwell.AsymmetricWell(l0.Edge+d, l0.Mass, l2.Edge+d, l2.Mass)
						s = perturb.Solver{Stack: st}
					}
					dst, _ = s.Levels(dst, c.f, c.k)
				}
				levelsSink = dst
				b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*c.k), "ns/level")
			})
		}
	}
}
