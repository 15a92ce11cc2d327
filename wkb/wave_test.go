package wkb_test

import (
	"fmt"
	"math"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/wkb"
	"gonum.org/v1/gonum/integrate/quad"
)

// quadPoints is the size of the single Gauss–Legendre rule the tests
// integrate with on [0, 1]: a different rule and partition from the
// package's own composite 16-point panels.
const quadPoints = 3000

func integrate(g func(float64) float64) float64 {
	return quad.Fixed(g, 0, 1, quadPoints, quad.Legendre{}, 0)
}

var waveCases = []struct {
	f float64
	n int
}{
	{1e-8, 1}, {1e-8, 12}, {0.5, 1}, {0.5, 30}, {2.25, 1}, {1.93, 1}, {9, 2}, {10, 7},
	{300, 1}, {300, 30}, {1e4, 1}, {1e4, 30}, {wkb.MaxField, 3},
}

// Normalisation, checked by quadrature; walls; sign convention φ′(0) > 0;
// n − 1 nodes; overlap with the exact wavefunction. The overlap defect
// 1 − ⟨φ|φ_exact⟩ is second order in the wavefunction's error, so the
// connection rule (levels good to 1e-3 of a level spacing or better) is
// held to 1e-6 and the plain rule to 5e-3 (observed: 5e-8 and 9e-4).
func TestWavefunction(t *testing.T) {
	t.Parallel()
	for _, r := range rules {
		overlapTol := 1e-6
		if r.s.Plain {
			overlapTol = 5e-3
		}
		for _, c := range waveCases {
			t.Run(fmt.Sprintf("%s/f=%g/n=%d", r.name, c.f, c.n), func(t *testing.T) {
				t.Parallel()
				w, err := r.s.Wavefunction(c.f, c.n)
				if err != nil {
					t.Fatal(err)
				}
				if norm := integrate(func(x float64) float64 { v := w.At(x); return v * v }); math.Abs(norm-1) > 1e-12 {
					t.Errorf("∫φ² = %.15g", norm)
				}
				for _, x := range []float64{0, 1} {
					if v := w.At(x); math.Abs(v) > 1e-12 {
						t.Errorf("φ(%g) = %g at a wall", x, v)
					}
				}
				for _, x := range []float64{-0.1, 1.1, math.NaN(), math.Inf(1)} {
					if v := w.At(x); v != 0 {
						t.Errorf("φ(%g) = %g outside the well", x, v)
					}
				}
				if v := w.At(1e-9); !(v > 0) {
					t.Errorf("φ(1e-9) = %g: want φ′(0) > 0", v)
				}
				nodes, prev := 0, w.At(1e-9)
				for i := 1; i < 20000; i++ {
					v := w.At(float64(i) / 20000)
					if v*prev < 0 {
						nodes++
					}
					if v != 0 {
						prev = v
					}
				}
				if nodes != c.n-1 {
					t.Errorf("%d nodes, want %d", nodes, c.n-1)
				}
				ex, err := exact.Solver{}.Wavefunction(c.f, c.n)
				if err != nil {
					t.Fatal(err)
				}
				if ov := integrate(func(x float64) float64 { return w.At(x) * ex.At(x) }); !(1-ov < overlapTol) {
					t.Errorf("⟨φ|φ_exact⟩ = %.12g, want within %g of 1", ov, overlapTol)
				}
			})
		}
	}
}

// f = 0: the closed form √2 sin(nπξ) (the flat well; common practice, no
// source).
func TestWavefunctionZeroField(t *testing.T) {
	t.Parallel()
	for _, n := range []int{1, 4, 100} {
		w, err := wkb.Solver{}.Wavefunction(0, n)
		if err != nil {
			t.Fatal(err)
		}
		for x := 0.0; x <= 1; x += 0.0137 {
			if got, want := w.At(x), math.Sqrt2*math.Sin(float64(n)*math.Pi*x); got != want {
				t.Errorf("n=%d: φ(%g) = %g, want %g", n, x, got, want)
			}
		}
	}
}

// Mirror: φ_n(ξ; −f) = (−1)^(n+1) φ_n(1 − ξ; f) (mirror symmetry; common
// practice, no source; tiltwell.Fold).
func TestWavefunctionMirror(t *testing.T) {
	t.Parallel()
	for _, n := range []int{1, 2, 5} {
		a, err := wkb.Solver{}.Wavefunction(40, n)
		if err != nil {
			t.Fatal(err)
		}
		b, err := wkb.Solver{}.Wavefunction(-40, n)
		if err != nil {
			t.Fatal(err)
		}
		s := 1.0
		if n%2 == 0 {
			s = -1
		}
		for x := 0.0; x <= 1; x += 0.031 {
			if got, want := b.At(x), s*a.At(1-x); got != want {
				t.Errorf("n=%d: φ(%g; −f) = %g, want %g", n, x, got, want)
			}
		}
	}
}

// Away from the turning point the uniform form is the WKB form
// sin(∫₀^ξ k dξ′)/√k(ξ) (its modulus and phase reduce to the leading terms
// of DLMF 9.8.20 and 9.8.22; common practice, no source for the test
// itself): compared here after normalising each on [0, 1], where the
// corrections are of order 5/(72 ζ) with ζ the action to the turning point.
func TestWavefunctionWKBForm(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		f float64
		n int
	}{{0.5, 20}, {5, 40}} {
		t.Run(fmt.Sprintf("f=%g/n=%d", c.f, c.n), func(t *testing.T) {
			t.Parallel()
			w, err := wkb.Solver{}.Wavefunction(c.f, c.n)
			if err != nil {
				t.Fatal(err)
			}
			l := levelAt(t, wkb.Solver{}, c.f, c.n)
			e := l.Energy + c.f/2
			if e <= c.f {
				t.Fatal("the test wants two walls")
			}
			wkbForm := func(x float64) float64 {
				b := e - c.f*x
				s := 2 * math.Pi / (3 * c.f) * (e*math.Sqrt(e) - b*math.Sqrt(b))
				return math.Sin(s) / math.Sqrt(math.Pi*math.Sqrt(b))
			}
			norm := math.Sqrt(integrate(func(x float64) float64 { v := wkbForm(x); return v * v }))
			zeta := 2 * math.Pi / (3 * c.f) * (e - c.f) * math.Sqrt(e-c.f) // action from the high wall to the turning point
			tol := 5 / (72 * zeta) * 4
			for x := 0.05; x < 1; x += 0.05 {
				if d := math.Abs(w.At(x) - wkbForm(x)/norm); d > tol*math.Sqrt2 {
					t.Errorf("ξ=%.2f: uniform %.8g, WKB %.8g (diff %.2g, tol %.2g)", x, w.At(x), wkbForm(x)/norm, d, tol*math.Sqrt2)
				}
			}
		})
	}
}

// The package's own normalisation needs no help from the caller: the
// project harness reports the worst normalisation defect and overlap over
// a grid.
func TestWavefunctionCheck(t *testing.T) {
	t.Parallel()
	for _, r := range rules {
		t.Run(r.name, func(t *testing.T) {
			t.Parallel()
			rep, err := exact.Check(r.s, exact.Grid{Fields: []float64{-3, 0.2, 2.25, 40, 2000}, Levels: 12})
			if err != nil {
				t.Fatal(err)
			}
			if !rep.OK() || rep.Waves == nil {
				t.Fatalf("check failed: %v", rep.Violations)
			}
			t.Logf("worst |∫φ² − 1| = %.2g (f=%g n=%d), smallest overlap %.12g (f=%g n=%d)",
				rep.Waves.Norm.Value, rep.Waves.Norm.F, rep.Waves.Norm.N, rep.Waves.Overlap.Value, rep.Waves.Overlap.F, rep.Waves.Overlap.N)
			if rep.Waves.Norm.Value > 1e-10 {
				t.Errorf("normalisation defect %.3g", rep.Waves.Norm.Value)
			}
		})
	}
}

var _ tiltwell.WaveSolver = wkb.Solver{}
