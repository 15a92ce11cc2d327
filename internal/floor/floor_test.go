package floor

import (
	"math"
	"testing"

	"github.com/tiltwell/tiltwell/exact"
)

// TestAiZero checks the table and the asymptotic zeros against the exact
// package's zeros (Newton on the 256-bit Airy phase table), and the
// asymptotic form against DLMF Table 9.9.1 at k = 6..10, where its
// truncation error is below 1e-12 relative and falls like k^(−14/3).
func TestAiZero(t *testing.T) {
	t.Parallel()
	for k := 1; k <= 1001; k++ {
		want, err := exact.AiZero(k)
		if err != nil {
			t.Fatal(err)
		}
		// A few ulps: the asymptotic form rounds t = 3π(4k − 1)/8 and a
		// power of it (exact.AiZero is correctly rounded, checked against
		// 200-bit Newton on the phase). Level's shading covers this.
		if got := AiZero(k); math.Abs(got+want) > 1.5e-15*got {
			t.Errorf("k=%d: |a_k| = %.17g, exact.AiZero %.17g", k, got, want)
		}
	}
	for k := 6; k <= 10; k++ {
		tt := 3 * math.Pi * (4*float64(k) - 1) / 8
		u := 1 / (tt * tt)
		asym := math.Pow(tt, 2.0/3) * (1 + u*(5.0/48+u*(-5.0/36+u*(77125.0/82944+u*(-108056875.0/6967296+u*(162375596875.0/334430208))))))
		tol := 1e-12 * math.Pow(6/float64(k), 14.0/3)
		if math.Abs(asym-aiZeros[k-1]) > tol*asym {
			t.Errorf("k=%d: asymptotic %.17g, DLMF table %.17g", k, asym, aiZeros[k-1])
		}
	}
	if !math.IsNaN(AiZero(0)) {
		t.Error("AiZero(0) is not NaN")
	}
}

// TestLevel checks that the bound is below every exact level over a wide
// grid of fields and levels (it is a theorem; this guards the code), and
// that it is sharp at the two limits it comes from: n² − |f|/2 is not the
// binding one at strong field, the triangular level is exact there.
func TestLevel(t *testing.T) {
	t.Parallel()
	for _, f := range []float64{0, 1e-8, 0.3, 1, 5, 10, 30, 100, 300, 1000, 1e4, 1e5, -50} {
		ex, err := exact.Solver{}.Levels(nil, f, 200)
		if err != nil {
			t.Fatal(err)
		}
		for _, l := range ex {
			if fl := Level(f, l.N); fl > l.Energy {
				t.Errorf("f=%g n=%d: floor %.17g above η = %.17g", f, l.N, fl, l.Energy)
			}
		}
	}
	// At f = 1e4 the ground level is the triangular one to rounding: the
	// bound is below it by its own rounding allowance only.
	l, _ := exact.Solver{}.Level(1e4, 1)
	if d := l.Energy - Level(1e4, 1); d < 0 || d > 32*eps*(1+math.Abs(l.Energy)+1e4) {
		t.Errorf("f=1e4: η₁ − floor = %.3g, want a few ulps", d)
	}
	// At f = 0 the bound is n² itself.
	if Level(0, 3) != 9-16*eps*9 {
		t.Errorf("Level(0, 3) = %.17g", Level(0, 3))
	}
}
