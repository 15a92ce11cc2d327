package wkb_test

import (
	"testing"

	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/exact/exacttest"
	"github.com/tiltwell/tiltwell/wkb"
)

// TestFiniteCheck holds the connection rule on finite wells to the exact
// finite-barrier reference with exact.Check (the Solver and WaveSolver
// contract, energies and escape widths by its undershoot rules, and the
// project's pessimism limit of 10× where the true error is above 1e-12),
// at fields where the rule reports every level asked for: the GaAs-like
// demo well (barrier 4.62 E₁, mass ratio 1.372, the electron of
// tiltwell.DemoGaAsWell), a deep asymmetric well, and a tall one at
// strong fields with eight levels, the top one at f = −150 broad (its
// width 23% off the exact one, within its estimate).
func TestFiniteCheck(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		c      finiteCase
		fields []float64
		k      int
	}{
		{finiteCase{4.62, 1.372, 4.62, 1.372}, []float64{0, 0.05, 0.2, -0.2, 0.5, -0.8, 1, 1.5}, 2},
		{finiteCase{50, 2, 20, 1}, []float64{0, 0.3, -0.3, 1, -1, 3, -3, 7, -10}, 3},
		{finiteCase{300, 1.3, 150, 1.8}, []float64{0, 5, -5, 30, -30, 100, -100, 150, -150}, 8},
	} {
		st := tc.c.stack(t)
		rep := exacttest.TestSolver(t, wkb.Solver{Stack: st}, exact.Grid{Stack: st, Fields: tc.fields, Levels: tc.k, MaxRatio: 10})
		if rep == nil {
			continue
		}
		g := rep.Gamma
		t.Logf("%v: %d levels, worst |η − η_exact| %.3g (f=%g n=%d); Γ: worst relative error %.3g (f=%g n=%d), %d undershoots, pessimism up to %.3g×",
			st, rep.Points, rep.Abs.Value, rep.Abs.F, rep.Abs.N, g.Rel.Value, g.Rel.F, g.Rel.N, g.Undershoots, g.Ratio.Value)
	}
}
