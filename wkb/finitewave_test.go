package wkb_test

import (
	"errors"
	"fmt"
	"math"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/wkb"
	"gonum.org/v1/gonum/integrate/quad"
)

// integrateOn returns ∫_a^b g by composite 20-point Gauss–Legendre on
// panels of width at most h.
func integrateOn(g func(float64) float64, a, b, h float64) float64 {
	if !(b > a) {
		return 0
	}
	n := int(math.Ceil((b - a) / h))
	s := 0.0
	for i := range n {
		lo := a + (b-a)*float64(i)/float64(n)
		hi := a + (b-a)*float64(i+1)/float64(n)
		s += quad.Fixed(g, lo, hi, 20, quad.Legendre{}, 0)
	}
	return s
}

// finiteWaveCases are wells, fields and levels for the wavefunction tests.
var finiteWaveCases = []struct {
	c finiteCase
	f float64
	n int
}{
	{finiteCase{10, 1, 10, 1}, 0.5, 1},
	{finiteCase{10, 1, 10, 1}, 0.5, 3},
	{finiteCase{4.3, 1.37, 4.3, 1.37}, 1, 1},
	{finiteCase{4.3, 1.37, 4.3, 1.37}, 1, 2},
	{finiteCase{50, 2, 50, 2}, 5, 1},
	{finiteCase{50, 2, 50, 2}, 5, 6},
	{finiteCase{20, 1, 5, 1.5}, 3, 2},
	{finiteCase{20, 1, 5, 1.5}, -3, 2},
	{finiteCase{200, 1.2, 300, 1.5}, 100, 1}, // turning point inside the well
	{finiteCase{200, 1.2, 300, 1.5}, 100, 4},
	{finiteCase{2, 1, 2, 1}, 0.3, 1},
	{finiteCase{10, 1, 10, 1}, 1e-9, 2},
}

// The wavefunction over the whole line: normalized over its support,
// positive at the first interface, n − 1 nodes, continuous, and with
// (1/μ)φ′ continuous at the uphill interface, where the well's solution
// meets the barrier's to all digits (BenDaniel–Duke); at the downhill one
// the mismatch of (1/μ)φ′ is of the order of the level's error.
func TestFiniteWavefunction(t *testing.T) {
	t.Parallel()
	for _, tc := range finiteWaveCases {
		t.Run(fmt.Sprintf("%v/f=%g/n=%d", tc.c, tc.f, tc.n), func(t *testing.T) {
			t.Parallel()
			s := wkb.Solver{Stack: tc.c.stack(t)}
			w, err := s.Wavefunction(tc.f, tc.n)
			if err != nil {
				t.Fatal(err)
			}
			lo, hi := tiltwell.Support(w)
			if !(lo < 0 && hi >= 1) {
				t.Fatalf("support [%g, %g] does not hold the well", lo, hi)
			}
			g := func(x float64) float64 { v := w.At(x); return v * v }
			norm := integrateOn(g, lo, 0, 0.01) + integrateOn(g, 0, 1, 0.01) + integrateOn(g, 1, hi, 0.01)
			if math.Abs(norm-1) > 1e-9 {
				t.Errorf("∫φ² over [%g, %g] = %.12g, want 1", lo, hi, norm)
			}
			if v := w.At(0); !(v > 0) {
				t.Errorf("φ(0) = %g, want > 0", v)
			}
			nodes := 0
			prev := w.At(lo)
			for i := 1; i <= 4000; i++ {
				v := w.At(lo + (hi-lo)*float64(i)/4000)
				if v*prev < 0 {
					nodes++
				}
				if v != 0 {
					prev = v
				}
			}
			if nodes != tc.n-1 {
				t.Errorf("%d nodes, want %d", nodes, tc.n-1)
			}
			ws, _, mirrored := tc.c.stack(t).Fold(tc.f)
			l, r := ws.Outer()
			// One-sided second-order derivatives on each side of the
			// interfaces, in the folded frame (a mirrored wavefunction is
			// ±φ(1 − ξ)).
			at := func(u float64) float64 {
				if mirrored {
					return w.At(1 - u)
				}
				return w.At(u)
			}
			for _, x := range []float64{0, 1} {
				const h = 1e-6
				muOut, out := l.Mass, -1.0
				if x == 1 {
					muOut, out = r.Mass, 1
				}
				v0 := at(x)
				if d := math.Abs(at(x+out*1e-12) - v0); d > 1e-9*math.Abs(v0)+1e-12 {
					t.Errorf("ξ=%g: φ jumps by %.3g", x, d)
				}
				dOut := (3*v0 - 4*at(x+out*h) + at(x+out*2*h)) / (2 * h) * (-out) / muOut
				dIn := -(3*v0 - 4*at(x-out*h) + at(x-out*2*h)) / (2 * h) * (-out)
				if x == 1 && math.Abs(dOut-dIn) > 1e-6*(math.Abs(dIn)+10*math.Abs(v0)) {
					t.Errorf("ξ=1: (1/μ)φ′ = %.9g outside, %.9g inside", dOut, dIn)
				}
				t.Logf("ξ=%g: φ = %.6g, (1/μ)φ′ %.9g outside, %.9g inside", x, v0, dOut, dIn)
			}
		})
	}
}

// At f = 0 the wavefunction is the square well's bound state, and for
// f < 0 the mirror image of the folded one (DESIGN.md: φ_n(ξ; −f) =
// ±φ_n(1 − ξ; f) with the mirrored stack).
func TestFiniteWavefunctionZeroFieldAndMirror(t *testing.T) {
	t.Parallel()
	c := finiteCase{7, 1.37, 12, 1.1}
	s := wkb.Solver{Stack: c.stack(t)}
	w0, err := s.Wavefunction(0, 2)
	if err != nil {
		t.Fatal(err)
	}
	wt, err := s.Wavefunction(1e-7, 2)
	if err != nil {
		t.Fatal(err)
	}
	for _, x := range []float64{-0.3, -0.05, 0, 0.2, 0.5, 0.9, 1, 1.1, 1.4} {
		if d := math.Abs(w0.At(x) - wt.At(x)); d > 1e-5 {
			t.Errorf("ξ=%g: φ = %.9g at f = 0, %.9g at f = 1e-7", x, w0.At(x), wt.At(x))
		}
	}
	m := wkb.Solver{Stack: c.stack(t).Mirror()}
	for _, n := range []int{1, 2} {
		a, err := s.Wavefunction(2, n)
		if err != nil {
			t.Fatal(err)
		}
		b, err := m.Wavefunction(-2, n)
		if err != nil {
			t.Fatal(err)
		}
		sign := 1.0
		if n%2 == 0 {
			sign = -1
		}
		for _, x := range []float64{-0.1, 0, 0.3, 0.7, 1, 1.05} {
			if d := math.Abs(a.At(x) - sign*b.At(1-x)); d > 1e-12 {
				t.Errorf("n=%d ξ=%g: φ = %.12g, mirrored %.12g", n, x, a.At(x), sign*b.At(1-x))
			}
		}
	}
	// Beyond the confined levels: the same ConfinedError as Levels.
	_, err = s.Wavefunction(2, 50)
	if n, ok := tiltwell.Confined(err); !ok || !errors.Is(err, tiltwell.ErrLevel) {
		t.Errorf("Wavefunction beyond the confined levels: %v (confined %d)", err, n)
	}
}
