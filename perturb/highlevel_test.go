package perturb

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
)

// TestHighLevelEstimates checks the estimates of high levels (n up to 1000,
// where the top coefficients come from their large-n law) against the
// exact reference at seeded random fields inside each level's validity
// limit: no undershoot beyond the exact solver's own error and rounding,
// at most 3× pessimism where the true error is above 1e-9 relative, and at
// most 10× (the tiltwell rules) wherever it is above 1e-14 (a cross-check
// inside the project).
func TestHighLevelEstimates(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(3, 4))
	for _, p := range []int{1, 2} {
		worst, rule := 0.0, 0.0
		for range 1500 {
			n := 1 + rng.IntN(MaxLevels)
			lim, err := Solver{Order: p}.Limit(n)
			if err != nil {
				t.Fatal(err)
			}
			f := math.Min(lim, MaxField) * rng.Float64()
			// Levels below n may be past their own (smaller) limits: the
			// soft range error still returns every level.
			lv, err := Solver{Order: p}.Levels(nil, f, n)
			if len(lv) != n || (err != nil && !errors.Is(err, tiltwell.ErrOutOfRange)) {
				t.Fatalf("order %d n=%d f=%g: %d levels, %v", p, n, f, len(lv), err)
			}
			l, err := exact.Solver{}.Level(f, n)
			if err != nil {
				t.Fatal(err)
			}
			got := lv[n-1]
			d := math.Abs(got.Energy - l.Energy)
			if d > got.Err+l.Err+4*eps*math.Abs(l.Energy) {
				t.Errorf("order %d n=%d f=%g: error %.6g, estimate %.6g", p, n, f, d, got.Err)
			}
			if d > 1e-9*math.Abs(l.Energy) {
				worst = math.Max(worst, got.Err/d)
			}
			if d > 1e-14 {
				rule = math.Max(rule, got.Err/d)
				if got.Err > 10*d {
					t.Errorf("order %d n=%d f=%g: estimate %.3g is %.3g× the true error %.3g", p, n, f, got.Err, got.Err/d, d)
				}
			}
		}
		if worst > 3 {
			t.Errorf("order %d: estimate up to %.2f× the true error", p, worst)
		}
		t.Logf("order %d: worst Err/true %.2f (true error above 1e-9 relative), %.2f (above 1e-14)", p, worst, rule)
	}
}
