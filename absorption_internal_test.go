package tiltwell

import (
	"fmt"
	"math"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"

	"github.com/tiltwell/tiltwell/internal/faddeeva"
)

// continuumByQuadrature integrates the broadened continuum of unit step
//
//	C(u) = ∫₀^∞ V(u − ε; σ, γ) S(ε; r) dε
//
// by composite 20-point Gauss–Legendre panels up to ε = max(u, 0) + 64w
// (w = max(σ, γ)), each panel a tenth of the distance to the peak of V at
// ε = u (at least w/10) and, with the Sommerfeld factor, a fifth of the
// distance to ε = 0 (at least r/40); and the tail beyond by y = D/s² with
// 40 nodes in s on the exact Voigt profile. It shares nothing with
// addContinuum but the Voigt profile and S.
func continuumByQuadrature(u, sigma, gamma, r float64) float64 {
	w := max(sigma, gamma)
	top := max(u, 0) + 64*w
	x := make([]float64, 20)
	wt := make([]float64, 20)
	f := func(e float64) float64 { return faddeeva.Voigt(u-e, sigma, gamma) * sommerfeld(e, r) }
	sum := 0.0
	for lo := 0.0; lo < top; {
		step := max(w/10, 0.1*math.Abs(lo-u))
		if lo < u && lo+step > u {
			step = max(u-lo, w/10)
		}
		if r > 0 {
			step = min(step, max(r/40, 0.2*lo))
		}
		hi := min(lo+step, top)
		quad.Legendre{}.FixedLocations(x, wt, lo, hi)
		for i := range x {
			sum += wt[i] * f(x[i])
		}
		lo = hi
	}
	if gamma > 0 {
		d := top - u
		xs := make([]float64, 40)
		ws := make([]float64, 40)
		quad.Legendre{}.FixedLocations(xs, ws, 0, 1)
		for i, s := range xs {
			y := d / (s * s)
			sum += ws[i] * faddeeva.Voigt(y, sigma, gamma) * sommerfeld(u+y, r) * 2 * d / (s * s * s)
		}
	}
	return sum
}

// TestContinuumAgainstQuadrature holds the lattice continuum to the
// quadrature of its defining integral over edge offsets from far below
// to far above the edge, for Gaussian, Lorentzian and mixed broadening,
// with and without the Sommerfeld factor; the error is measured in units
// of the step height (C → 1 far above the edge without Sommerfeld).
func TestContinuumAgainstQuadrature(t *testing.T) {
	t.Parallel()
	var worst float64
	for _, c := range []struct{ sigma, gamma, r float64 }{
		{1.7, 0, 0},
		{1.7, 0, 2},
		{1.7, 2, 0},
		{1.7, 2, 2},
		{0.5, 5, 1.5},
		{3, 0.01, 2.5},
		{0.2, 0, 1},
	} {
		var u []float64
		for x := -150.0; x <= 150; x += 0.37 {
			u = append(u, x)
		}
		got := make([]float64, len(u))
		if err := addContinuum(got, u, 1, c.sigma, c.gamma, c.r); err != nil {
			t.Fatal(err)
		}
		var e float64
		at := 0.0
		for i := 0; i < len(u); i++ {
			// Every fifth point within 12 meV of the edge, every
			// 29th elsewhere.
			if i%29 != 0 && (math.Abs(u[i]) > 12 || i%5 != 0) {
				continue
			}
			want := continuumByQuadrature(u[i], c.sigma, c.gamma, c.r)
			if d := math.Abs(got[i] - want); d > e {
				e, at = d, u[i]
			}
		}
		t.Logf("σ = %g, γ = %g, R = %g meV: worst error %.2g of the step at u = %g meV", c.sigma, c.gamma, c.r, e, at)
		worst = max(worst, e)
	}
	if worst > 1e-6 {
		t.Errorf("worst error %.2g of the step height, want ≤ 1e-6", worst)
	}
}

func BenchmarkContinuum(b *testing.B) {
	u := make([]float64, 500)
	for i := range u {
		u[i] = -100 + 240*float64(i)/499
	}
	out := make([]float64, len(u))
	for _, c := range []struct{ sigma, gamma, r float64 }{{1.7, 2, 2}, {1.7, 0, 0}} {
		b.Run(fmt.Sprintf("sigma=%g/gamma=%g/R=%g", c.sigma, c.gamma, c.r), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if err := addContinuum(out, u, 1, c.sigma, c.gamma, c.r); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
