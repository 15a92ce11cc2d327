package basis

import (
	"fmt"
	"math"
	"testing"
)

// The selected-vector path (Dsytrd, Dsterf, inverse iteration) agrees with
// Dsyev: the same eigenvalues and, up to sign, the same orthonormal
// eigenvectors.
func TestEigenSelected(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		N, kk int
		f     float64
	}{{24, 3, 0}, {24, 12, 10}, {40, 6, 1e-8}, {80, 30, 300}, {160, 9, 1000}, {200, 100, 1e5}, {129, 7, 50}} {
		t.Run(fmt.Sprintf("N=%d/kk=%d/f=%g", c.N, c.kk, c.f), func(t *testing.T) {
			N := c.N
			fill := func(w *work) {
				w.sizes(N, 2*N, c.kk)
				for i := range N {
					for j := i; j < N; j++ {
						w.a[i*N+j] = c.f * dipole(i+1, j+1)
					}
					w.a[i*N+i] += float64((i + 1) * (i + 1))
				}
			}
			var all, sel work
			fill(&all)
			fill(&sel)
			if !all.eigen(N) || !sel.eigenSelected(N, c.kk) {
				t.Fatal("no convergence")
			}
			for j := range N {
				if d := math.Abs(all.eig[j] - sel.eig[j]); d > 1e-13*max(1, math.Abs(all.eig[j]))*float64(N) {
					t.Errorf("eigenvalue %d: %.17g vs %.17g", j, all.eig[j], sel.eig[j])
				}
			}
			for j := range c.kk {
				dot := 0.0
				for i := range N {
					dot += all.a[i*N+j] * sel.a[i*N+j]
				}
				if math.Abs(math.Abs(dot)-1) > 1e-12 {
					t.Errorf("vector %d: |⟨Dsyev, selected⟩| = %.16g", j, math.Abs(dot))
				}
				for k := range j {
					o := 0.0
					for i := range N {
						o += sel.a[i*N+j] * sel.a[i*N+k]
					}
					if math.Abs(o) > 1e-13 {
						t.Errorf("vectors %d, %d: overlap %.3g", j, k, o)
					}
				}
			}
		})
	}
}
