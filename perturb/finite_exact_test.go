package perturb

import (
	"errors"
	"flag"
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/exact/exacttest"
)

// randomWells is the number of random wells in exactWells: 20 in the
// ordinary test run, more with -random-wells (the package documentation
// quotes a run with 400 and 40 fields on each side).
var randomWells = flag.Int("random-wells", 20, "number of random finite wells held against the exact solver")

// fieldSteps is the number of fields from 0 to min(10, Limit(n)) on each
// side.
var fieldSteps = flag.Int("field-steps", 12, "fields on each side per level in TestFiniteAgainstExact")

// exactWells is the grid of finite wells held against the exact solver:
// symmetric wells v = 2 … 50 E₁ with mass ratios 1, 1.37 and 2; a few
// asymmetric ones; and seeded random asymmetric wells with v_L, v_R
// log-uniform in [2, 50] and μ_L, μ_R uniform in [1, 2] (a third of them
// symmetric).
func exactWells() [][4]float64 {
	var out [][4]float64
	for _, v := range []float64{2, 3, 4.3, 6, 10, 20, 50} {
		for _, mu := range []float64{1, 1.37, 2} {
			out = append(out, [4]float64{v, mu, v, mu})
		}
	}
	out = append(out, [4]float64{10, 1, 30, 2}, [4]float64{5, 2, 20, 1}, [4]float64{3, 1.5, 3.5, 1},
		[4]float64{2, 1, 50, 2}, [4]float64{50, 2, 2, 1}, [4]float64{8, 1.2, 4, 1.8})
	rng := rand.New(rand.NewPCG(12, 6))
	for range *randomWells {
		vl, vr := 2*math.Pow(25, rng.Float64()), 2*math.Pow(25, rng.Float64())
		ml, mr := 1+rng.Float64(), 1+rng.Float64()
		if rng.IntN(3) == 0 {
			vr, mr = vl, ml
		}
		out = append(out, [4]float64{vl, ml, vr, mr})
	}
	return out
}

// dipoleRefRelStack is the relative accuracy granted to exact.Dipole on a
// finite well: measured against Richardson differences of its levels it
// is about 1.5e-9 at weak fields, where it integrates (ξ − ½)φ².
const dipoleRefRelStack = 2e-9

// TestFiniteAgainstExact holds the finite-well energies, escape-width
// estimates and dipoles against the exact finite-barrier solver over the
// wells of exactWells, both orders, every level the exact solver confines
// and the fields ±min(10, Limit(n))·i/12, i = 0 … 12: estimates below the
// true error on at most 1% of points (the tiltwell rules; measured: none
// for energies and widths), and never more than 10× above it where the
// true error exceeds 1e-12 (dipoles: 1e-9, the reference's own accuracy).
// exacttest.TestSolver takes no stack yet, so the contract checks of the
// harness run on infinite walls only (TestContract); the ones that matter
// for finite wells are in the tests of finite_test.go.
func TestFiniteAgainstExact(t *testing.T) {
	t.Parallel()
	type tally struct {
		points, under, pess int
		worst               float64
	}
	var en, gam, dip tally
	rlo, rhi := math.Inf(1), 0.0
	check := func(tl *tally, truth, est, slack, floor float64, what string, args ...any) {
		tl.points++
		if truth > est+slack {
			tl.under++
			if tl.under <= 5 {
				t.Logf("%s estimate %.3g below the true error %.3g at %v", what, est, truth, args)
			}
		}
		if truth > floor && truth > 10*slack {
			r := est / truth
			tl.worst = math.Max(tl.worst, r)
			if r > 10 {
				tl.pess++
				t.Errorf("%s estimate %.3g is %.3g× the true error %.3g at %v", what, est, r, truth, args)
			}
		}
	}
	for _, c := range exactWells() {
		st, err := tiltwell.AsymmetricWell(c[0], c[1], c[2], c[3])
		if err != nil {
			t.Fatal(err)
		}
		ex := exact.Solver{Stack: st}
		for p := 1; p <= 2; p++ {
			s := Solver{Stack: st, Order: p}
			side, _ := s.side(1)
			for n := 1; n <= side.count; n++ {
				lim, err := s.Limit(n)
				if err != nil {
					t.Fatal(err)
				}
				lim = math.Min(lim, 10)
				for i := 0; i <= *fieldSteps; i++ {
					for _, sg := range []float64{1, -1} {
						f := sg * math.Min(lim*float64(i)/float64(*fieldSteps), lim)
						ref, err := ex.Level(f, n)
						if errors.Is(err, tiltwell.ErrLevel) {
							continue // not confined by the exact solver's criterion
						} else if err != nil {
							t.Fatalf("exact %v f=%g n=%d: %v", c, f, n, err)
						}
						ls, err := s.Levels(nil, f, n)
						if len(ls) < n {
							t.Errorf("%v f=%g n=%d: %d levels, %v", c, f, n, len(ls), err)
							continue
						}
						l := ls[n-1]
						at := fmt.Sprintf("%v order=%d n=%d f=%.6g", c, p, n, f)
						check(&en, math.Abs(l.Energy-ref.Energy), l.Err, ref.Err, 1e-12, "energy", at)
						if p == 2 {
							check(&gam, ref.Gamma, l.GammaErr, ref.GammaErr, 1e-12, "width", at)
							if ref.Gamma > 1e-250 && l.GammaErr > 0 {
								r := l.GammaErr / gammaSafety / ref.Gamma
								rlo, rhi = math.Min(rlo, r), math.Max(rhi, r)
							}
							want, err := ex.Dipole(f, n)
							if err != nil {
								t.Fatalf("exact dipole %s: %v", at, err)
							}
							d, derr, err := s.Dipole(f, n)
							if err != nil && !errors.Is(err, tiltwell.ErrOutOfRange) {
								t.Fatalf("dipole %s: %v", at, err)
							}
							if err == nil {
								check(&dip, math.Abs(d-want), derr, dipoleRefRelStack*math.Abs(want)+1e-13, 1e-9, "dipole", at)
							}
						}
					}
				}
			}
		}
	}
	for _, c := range []struct {
		name string
		tl   tally
	}{{"energy", en}, {"width", gam}, {"dipole", dip}} {
		if c.tl.under > c.tl.points/100 {
			t.Errorf("%s: %d of %d estimates below the true error, more than 1%%", c.name, c.tl.under, c.tl.points)
		}
		t.Logf("%s: %d points, %d below the true error, %d more than 10× above, worst ratio %.3g", c.name, c.tl.points, c.tl.under, c.tl.pess, c.tl.worst)
	}
	t.Logf("quasiclassical width / exact width in [%.3g, %.3g]", rlo, rhi)
}

// TestFiniteCheck holds both orders on the GaAs-like demo well (barrier
// 4.62 E₁, mass ratio 1.372) to the exact finite-barrier reference with
// exact.Check and the project's pessimism limit, at fields inside both
// levels' validity limits (a cross-check inside the project).
func TestFiniteCheck(t *testing.T) {
	t.Parallel()
	st, err := tiltwell.FiniteWell(4.62, 1.372)
	if err != nil {
		t.Fatal(err)
	}
	for _, order := range []int{1, 2} {
		exacttest.TestSolver(t, Solver{Order: order, Stack: st},
			exact.Grid{Stack: st, Fields: []float64{0, 0.05, 0.2, -0.2, 0.5, -0.8, 1}, Levels: 2, MaxRatio: 10})
	}
}
