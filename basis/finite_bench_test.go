package basis_test

import (
	"fmt"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/basis"
	"github.com/tiltwell/tiltwell/exact"
)

// BenchmarkFiniteLevels times the levels of finite wells beside the
// exact reference in the same run: the invented GaAs/Al₀.₃Ga₀.₇As-like
// electron well (v = 4.3, μ = 1.37) and a deep asymmetric well, at zero
// field (rigorous brackets from the box roots), a weak and a strong
// field; ns/level is reported for the comparison per level.
func BenchmarkFiniteLevels(b *testing.B) {
	gaas, err := tiltwell.FiniteWell(4.3, 1.37)
	if err != nil {
		b.Fatal(err)
	}
	deep, err := tiltwell.AsymmetricWell(20, 1, 40, 2)
	if err != nil {
		b.Fatal(err)
	}
	for _, c := range []struct {
		name  string
		stack tiltwell.Stack
		k     int
		f     float64
	}{
		{"gaas", gaas, 2, 0}, {"gaas", gaas, 2, 0.3}, {"gaas", gaas, 1, 2},
		{"deep", deep, 4, 0}, {"deep", deep, 4, 1}, {"deep", deep, 4, 5},
	} {
		for _, m := range []struct {
			name string
			s    tiltwell.Solver
		}{
			{"basis", basis.Solver{Stack: c.stack}},
			{"basis/N=40", basis.Solver{Stack: c.stack, Size: 40}},
			{"exact", exact.Solver{Stack: c.stack}},
		} {
			b.Run(fmt.Sprintf("method=%s/stack=%s/k=%d/f=%g", m.name, c.name, c.k, c.f), func(b *testing.B) {
				dst := make([]tiltwell.Level, 0, c.k)
				b.ReportAllocs()
				var err error
				for b.Loop() {
					dst, err = m.s.Levels(dst, c.f, c.k)
				}
				if err != nil {
					b.Fatal(err)
				}
				b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(c.k), "ns/level")
			})
		}
	}
}
