package exact

import (
	"fmt"
	"math"
	"testing"

	"github.com/tiltwell/tiltwell"
)

// The benchmark wells (invented for the benchmarks): a finite well with
// barriers 12 E₁ high and a barrier mass ratio 1.37, and the same well
// clad on both sides by thin (0.1 L) higher layers, five layers in all.
// At f ≤ 3 the lowest three levels are narrow (Γ ≤ 2e-7), at f = 6 and 8
// the third is broad (Γ = 0.014 and 0.13).
var (
	benchWell = func() tiltwell.Stack {
		s, err := tiltwell.FiniteWell(12, 1.37)
		if err != nil {
			panic(err)
		}
		return s
	}()
	benchClad = func() tiltwell.Stack {
		s, err := tiltwell.NewStack([]tiltwell.Layer{{Edge: 12, Mass: 1.37}, {Width: 0.1, Edge: 20, Mass: 1.5}, {Width: 1, Mass: 1}, {Width: 0.1, Edge: 20, Mass: 1.5}, {Edge: 12, Mass: 1.37}}, 2)
		if err != nil {
			panic(err)
		}
		return s
	}()
)

// BenchmarkStackLevels times the lowest three levels, with Γ, of the
// benchmark wells at one field, reusing dst.
func BenchmarkStackLevels(b *testing.B) {
	for _, c := range []struct {
		name string
		st   tiltwell.Stack
	}{{"well3", benchWell}, {"clad5", benchClad}} {
		for _, f := range []float64{0, 1, 2, 3, 6, 8} {
			b.Run(fmt.Sprintf("stack=%s/k=3/f=%g", c.name, f), func(b *testing.B) {
				s := Solver{Stack: c.st}
				dst := make([]tiltwell.Level, 0, 3)
				b.ReportAllocs()
				for b.Loop() {
					dst, _ = s.Levels(dst, f, 3)
				}
				levelSink = dst
			})
		}
	}
}

// BenchmarkStackWavefunction times building a level's wavefunction and
// evaluating it at 100 points.
func BenchmarkStackWavefunction(b *testing.B) {
	for _, f := range []float64{0, 2} {
		b.Run(fmt.Sprintf("stack=well3/f=%g/n=2", f), func(b *testing.B) {
			s := Solver{Stack: benchWell}
			b.ReportAllocs()
			for b.Loop() {
				w, _ := s.Wavefunction(f, 2)
				for i := range 100 {
					floatSink += w.At(-0.5 + 2*float64(i)/100)
				}
			}
		})
	}
}

// fdLevels returns the lowest k levels of the finite well (barriers v,
// barrier mass ratio mu) at field f by plain finite differences: the
// three-point BenDaniel–Duke Hamiltonian
//
//	−(1/π²h²)[(u_(i+1) − u_i)/μ_(i+½) − (u_i − u_(i−1))/μ_(i−½)] + V_i u_i
//
// on m points per unit length in the box [−a, 1 + a] with φ = 0 at its
// ends, the interfaces halfway between grid points (where μ_(i+½) is the
// mean of the two sides' masses, which keeps the scheme second order),
// and each eigenvalue found by bisection on Sturm counts of the symmetric
// tridiagonal matrix to 1e-9. At f > 0 the box turns each resonance into
// a bound level, which is within about Γ of η_r.
func fdLevels(dst []float64, v, mu, f, a float64, m, k int) []float64 {
	h := 1 / float64(m)
	n := int(math.Round((1 + 2*a) * float64(m)))
	c := 1 / (math.Pi * math.Pi * h * h)
	massAt := func(x float64) float64 {
		switch {
		case math.Abs(x) < h/4 || math.Abs(x-1) < h/4:
			return (1 + mu) / 2
		case x > 0 && x < 1:
			return 1
		}
		return mu
	}
	diag := make([]float64, n)
	off := make([]float64, n) // off[i] couples i and i+1
	for i := range n {
		x := -a + (float64(i)+0.5)*h
		vx := v
		if x > 0 && x < 1 {
			vx = 0
		}
		ml, mr := massAt(x-h/2), massAt(x+h/2)
		diag[i] = c*(1/ml+1/mr) + vx + f*(x-0.5)
		off[i] = -c / mr
	}
	// count returns the number of eigenvalues below λ (Sturm sequence).
	count := func(lam float64) int {
		neg := 0
		q := diag[0] - lam
		for i := 0; ; i++ {
			if q < 0 {
				neg++
			}
			if i+1 == n {
				return neg
			}
			if q == 0 {
				q = 1e-300
			}
			q = diag[i+1] - lam - off[i]*off[i]/q
		}
	}
	lo0, hi0 := -f/2-a*f, v+f*(1.5+a)
	dst = dst[:0]
	for j := range k {
		lo, hi := lo0, hi0
		for hi-lo > 1e-9*max(1, math.Abs(lo)) {
			md := lo + (hi-lo)/2
			if count(md) > j {
				hi = md
			} else {
				lo = md
			}
		}
		dst = append(dst, lo+(hi-lo)/2)
	}
	return dst
}

// BenchmarkStackFiniteDifference times fdLevels on the benchmark well
// with the grid that reaches 1e-6 on the lowest three levels (checked in
// TestFiniteDifferenceGrid), for the ratio to BenchmarkStackLevels.
func BenchmarkStackFiniteDifference(b *testing.B) {
	for _, f := range []float64{0, 1, 2, 3} {
		b.Run(fmt.Sprintf("stack=well3/k=3/f=%g", f), func(b *testing.B) {
			dst := make([]float64, 0, 3)
			b.ReportAllocs()
			for b.Loop() {
				dst = fdLevels(dst, 12, 1.37, f, fdBox, fdGrid, 3)
			}
			floatSink += dst[0]
		})
	}
}

// fdGrid points per unit length and a box fdBox wide on either side take
// the finite differences to within 1e-6 of the exact levels.
const (
	fdGrid = 6800
	fdBox  = 1.5
)

// TestFiniteDifferenceGrid checks that the benchmark's finite-difference
// solve reaches 1e-6, so that the timings compare like with like.
func TestFiniteDifferenceGrid(t *testing.T) {
	t.Parallel()
	s := Solver{Stack: benchWell}
	for _, f := range []float64{0, 1, 3} {
		ex, err := s.Levels(nil, f, 3)
		if err != nil {
			t.Fatal(err)
		}
		fd := fdLevels(nil, 12, 1.37, f, fdBox, fdGrid, 3)
		for i := range fd {
			if d := math.Abs(fd[i] - ex[i].Energy); d > 1e-6 || d < 1e-8 {
				t.Errorf("f=%g n=%d: finite differences %.10g, exact %.10g (diff %.2g, want between 1e-8 and 1e-6)", f, i+1, fd[i], ex[i].Energy, d)
			}
		}
	}
}

// BenchmarkStackBuildWave times building a level's wavefunction from the
// level (BuildWave, reusing the storage) and evaluating it at the 100
// points of BenchmarkStackWavefunction, for the ratio to it.
func BenchmarkStackBuildWave(b *testing.B) {
	for _, f := range []float64{0, 2} {
		b.Run(fmt.Sprintf("stack=well3/f=%g/n=2", f), func(b *testing.B) {
			s := Solver{Stack: benchWell}
			lv, err := s.Levels(nil, f, 2)
			if err != nil {
				b.Fatal(err)
			}
			var w tiltwell.Wavefunction
			b.ReportAllocs()
			for b.Loop() {
				w, _ = s.BuildWave(w, f, lv[1])
				for i := range 100 {
					floatSink += w.At(-0.5 + 2*float64(i)/100)
				}
			}
		})
	}
}
