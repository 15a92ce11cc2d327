package variational_test

import (
	"fmt"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/variational"
)

// benchDeep is a deeper finite well (barriers 20 E₁, mass ratio 1.37, also
// invented), which confines five levels at f ≤ 3.
var benchDeep = func() tiltwell.Stack {
	s, err := tiltwell.FiniteWell(20, 1.37)
	if err != nil {
		panic(err)
	}
	return s
}()

// BenchmarkLevelsFinite times the levels of finite wells for each family
// beside the exact reference in the same run.
func BenchmarkLevelsFinite(b *testing.B) {
	for _, tc := range []struct {
		name string
		s    tiltwell.Solver
		ks   []int
	}{
		{"method=variational/family=poly", variational.Solver{Stack: benchDeep}, []int{1, 3, 5}},
		{"method=variational/family=tilt", variational.Solver{Family: variational.Tilt, Stack: benchDeep}, []int{1}},
		{"method=exact", exact.Solver{Stack: benchDeep}, []int{1, 3, 5}},
	} {
		for _, f := range []float64{0, 1, 3} {
			for _, k := range tc.ks {
				b.Run(fmt.Sprintf("%s/stack=finite/k=%d/f=%g", tc.name, k, f), func(b *testing.B) {
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
