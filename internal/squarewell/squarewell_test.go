package squarewell

import (
	"errors"
	"math"
	"testing"

	"github.com/tiltwell/tiltwell"
	"gonum.org/v1/gonum/integrate/quad"
)

// TestTextbookConditions: for the symmetric well the levels satisfy the
// textbook even and odd conditions, k tan(k/2) = κ/μ (n odd) and
// −k cot(k/2) = κ/μ (n even), with k = π√η and κ = π√(μ(v − η))
// (G. Bastard, Wave Mechanics Applied to Semiconductor Heterostructures
// (1988), ch. III, for the mass ratio; from memory). The conditions are
// solved here independently by bisection.
func TestTextbookConditions(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct{ v, mu float64 }{{4.3, 1.37}, {2, 1}, {10, 2}, {50, 1}, {300, 1.37}, {1e4, 0.5}} {
		w := Well{VL: tc.v, ML: tc.mu, VR: tc.v, MR: tc.mu}
		n := w.Count()
		if n < 1 {
			t.Fatalf("v = %g: no bound level", tc.v)
		}
		for i := 1; i <= min(n, 20); i++ {
			got, _, err := w.Level(i)
			if err != nil {
				t.Fatal(err)
			}
			cond := func(eta float64) float64 {
				k := math.Pi * math.Sqrt(eta)
				kp := math.Pi * math.Sqrt(tc.mu*(tc.v-eta))
				if i%2 == 1 {
					return k*math.Sin(k/2)/math.Cos(k/2) - kp/tc.mu
				}
				return -k*math.Cos(k/2)/math.Sin(k/2) - kp/tc.mu
			}
			// The i-th level lies in k ∈ ((i−1)π, iπ), where the
			// condition runs from −∞ (or below zero) to +∞.
			lo := math.Pow(float64(i-1), 2) * (1 + 1e-15)
			hi := math.Min(float64(i*i)*(1-1e-15), tc.v)
			for range 200 {
				mid := 0.5 * (lo + hi)
				if cond(mid) > 0 {
					hi = mid
				} else {
					lo = mid
				}
			}
			want := 0.5 * (lo + hi)
			if d := math.Abs(got - want); d > 4e-15*math.Max(1, want) {
				t.Errorf("v = %g μ = %g n = %d: η = %.17g, textbook condition gives %.17g (diff %.1e)", tc.v, tc.mu, i, got, want, d)
			}
		}
	}
}

// TestDemoWell: the GaAs-like demo electron well (v = 4.3, μ = 1.37) has
// η₁ = 0.53932 at zero field (computed independently at high precision
// with mpmath) and binds three levels, the third just below the barrier
// top (k₃ ∈ (2π, π√4.3): the phase condition changes sign there).
func TestDemoWell(t *testing.T) {
	t.Parallel()
	w := Well{VL: 4.3, ML: 1.37, VR: 4.3, MR: 1.37}
	eta, _, err := w.Level(1)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(eta-0.53932) > 5e-6 {
		t.Errorf("η₁ = %.6f, want 0.53932", eta)
	}
	if c := w.Count(); c != 3 {
		t.Errorf("Count = %d, want 3", c)
	}
	if _, _, err := w.Level(4); !errors.Is(err, tiltwell.ErrLevel) {
		t.Errorf("level 4: %v, want ErrLevel", err)
	}
}

// TestCount: a level appears each time the well deepens past a threshold.
// For the symmetric well with μ = 1 the n-th level appears at
// v = (n − 1)² (the barrier top meets k = (n − 1)π; textbook, from memory).
func TestCount(t *testing.T) {
	t.Parallel()
	for n := 1; n <= 6; n++ {
		vc := float64((n - 1) * (n - 1))
		if n > 1 {
			below := Well{VL: vc * (1 - 1e-9), ML: 1, VR: vc * (1 - 1e-9), MR: 1}
			if c := below.Count(); c != n-1 {
				t.Errorf("v just below %g: %d levels, want %d", vc, c, n-1)
			}
		}
		above := Well{VL: vc*(1+1e-9) + 1e-12, ML: 1, VR: vc*(1+1e-9) + 1e-12, MR: 1}
		if c := above.Count(); c != n {
			t.Errorf("v just above %g: %d levels, want %d", vc, c, n)
		}
	}
}

// TestInfiniteLimit: as the barriers grow, η_n → n² from below, the gap
// shrinking like 1/√v: η_n ≈ n² (1 − 4/(π√(μv))) for the symmetric well
// (first order in the penetration depth; from the phase condition with
// atan(x) ≈ x).
func TestInfiniteLimit(t *testing.T) {
	t.Parallel()
	for _, v := range []float64{1e4, 1e8, 1e12, 1e300} {
		w := Well{VL: v, ML: 1, VR: v, MR: 1}
		for n := 1; n <= 3; n++ {
			eta, _, err := w.Level(n)
			if err != nil {
				t.Fatal(err)
			}
			nn := float64(n * n)
			want := nn * (1 - 4/(math.Pi*math.Sqrt(v)))
			if d := math.Abs(eta - want); d > 20*nn/v+1e-15*nn || eta >= nn {
				t.Errorf("v = %g n = %d: η = %.17g, first order %.17g", v, n, eta, want)
			}
		}
	}
}

// TestStates: the closed-form states are normalized, orthogonal, satisfy
// the BenDaniel–Duke matching and the Schrödinger equation inside.
func TestStates(t *testing.T) {
	t.Parallel()
	w := Well{VL: 12, ML: 1.5, VR: 30, MR: 0.8}
	n := w.Count()
	if n < 3 {
		t.Fatalf("%d levels", n)
	}
	var ss []State
	for i := 1; i <= n; i++ {
		s, err := w.State(i)
		if err != nil {
			t.Fatal(err)
		}
		ss = append(ss, s)
		// φ′/μ continuous at ξ = 0 and 1.
		if l, r := s.KL*s.A/w.ML, s.B*s.K*math.Cos(s.DL); math.Abs(l-r) > 1e-12*math.Abs(r)+1e-14 {
			t.Errorf("n = %d: (1/μ)φ′ at 0: %g vs %g", i, l, r)
		}
		if l, r := s.B*s.K*math.Cos(s.K+s.DL), -s.KR*s.C/w.MR; math.Abs(l-r) > 1e-12*math.Abs(r)+1e-14 {
			t.Errorf("n = %d: (1/μ)φ′ at 1: %g vs %g", i, l, r)
		}
		if s.A <= 0 {
			t.Errorf("n = %d: φ(0) = %g, want > 0", i, s.A)
		}
	}
	integral := func(f func(float64) float64, lo, hi float64) float64 {
		return quad.Fixed(f, lo, 0, 200, nil, 0) + quad.Fixed(f, 0, 1, 200, nil, 0) + quad.Fixed(f, 1, hi, 200, nil, 0)
	}
	for i := range ss {
		lo, hi := ss[i].Support()
		for j := range ss {
			got := integral(func(x float64) float64 { return ss[i].At(x) * ss[j].At(x) }, lo-1, hi+1)
			want := 0.0
			if i == j {
				want = 1
			}
			if math.Abs(got-want) > 1e-12 {
				t.Errorf("⟨%d|%d⟩ = %.3g, want %g", i+1, j+1, got, want)
			}
		}
		// The support holds all but 1e-16 of the norm.
		sq := func(x float64) float64 { v := ss[i].At(x); return v * v }
		tail := quad.Fixed(sq, lo-200, lo, 400, nil, 0) + quad.Fixed(sq, hi, hi+200, 400, nil, 0)
		if tail > 2e-16 {
			t.Errorf("n = %d: %.2g of the norm outside the support [%g, %g]", i+1, tail, lo, hi)
		}
	}
}

func TestFromStack(t *testing.T) {
	t.Parallel()
	s, _ := tiltwell.AsymmetricWell(3, 1, 5, 2)
	w, err := FromStack(s)
	if err != nil || w != (Well{3, 1, 5, 2}) {
		t.Errorf("FromStack = %+v, %v", w, err)
	}
	if _, err := FromStack(tiltwell.Stack{}); !errors.Is(err, ErrNotSquare) {
		t.Errorf("infinite walls: %v", err)
	}
	neg, _ := tiltwell.FiniteWell(-1, 1)
	if _, err := FromStack(neg); !errors.Is(err, tiltwell.ErrUnits) {
		t.Errorf("negative barrier: %v", err)
	}
}
