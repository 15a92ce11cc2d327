package wkb_test

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"sort"
	"strings"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/wkb"
)

// finiteCase is a single finite well: left and right barrier heights (E₁)
// and mass ratios.
type finiteCase struct{ vL, mL, vR, mR float64 }

func (c finiteCase) stack(t testing.TB) tiltwell.Stack {
	t.Helper()
	st, err := tiltwell.AsymmetricWell(c.vL, c.mL, c.vR, c.mR)
	if err != nil {
		t.Fatal(err)
	}
	return st
}

// ref returns the reference well for field f (folded to f ≥ 0).
func (c finiteCase) ref(f float64) refWell {
	if f < 0 {
		return refWell{c.vR, c.mR, c.vL, c.mL, -f}
	}
	return refWell{c.vL, c.mL, c.vR, c.mR, f}
}

// finiteCases returns the grid of wells: symmetric ones with barriers
// from 2 to 50 E₁ and mass ratios 1 to 2, and seeded random asymmetric
// ones in the same ranges.
func finiteCases() []finiteCase {
	var cs []finiteCase
	for _, v := range []float64{2, 3, 4.3, 7, 10, 20, 35, 50} {
		for _, m := range []float64{1, 1.37, 2} {
			cs = append(cs, finiteCase{v, m, v, m})
		}
	}
	rng := rand.New(rand.NewPCG(12, 3))
	for range 40 {
		v := func() float64 { return 2 * math.Pow(25, rng.Float64()) }
		m := func() float64 { return 1 + rng.Float64() }
		cs = append(cs, finiteCase{v(), m(), v(), m()})
	}
	return cs
}

// finiteFields are the fields of the grid, both signs.
var finiteFields = []float64{0.01, 0.03, 0.1, 0.2, 0.3, 0.5, 0.7, 1, 1.5, 2, 3, 4, 5, 7, 10, -0.1, -1, -3, -10}

// finiteResult is one level held against the reference.
type finiteResult struct {
	c           finiteCase
	f           float64
	lv          tiltwell.Level
	eta, gamma  float64 // reference
	zetaL       float64 // the under-barrier action, from the level
	dEta, dGam  float64 // true errors
	okRef       bool
	refusedNext string
}

// runFiniteGrid solves every well of the grid at every field with s's
// rule and the reference.
func runFiniteGrid(t *testing.T, plain bool) []finiteResult {
	t.Helper()
	var out []finiteResult
	refusals := map[string]int{}
	defer func() { t.Logf("first unconfined levels: %v", refusals) }()
	for _, c := range finiteCases() {
		st := c.stack(t)
		s := wkb.Solver{Stack: st, Plain: plain}
		for _, f := range finiteFields {
			ls, err := s.Levels(nil, f, 100)
			var ce *tiltwell.ConfinedError
			if err != nil && !errors.As(err, &ce) {
				t.Fatalf("%+v f=%g: %v", c, f, err)
			}
			if ce != nil {
				why := ce.Why
				if i := strings.Index(why, ": "); i >= 0 {
					why = why[i+2:]
				}
				if i := strings.Index(why, "("); i >= 0 {
					why = why[:i]
				}
				refusals[why]++
			}
			w := c.ref(f)
			for _, l := range ls {
				er, g, ok := w.refLevel(complex(l.Energy, -l.Gamma/2))
				ul := w.vL - l.Energy - w.f/2
				r := finiteResult{c: c, f: f, lv: l, eta: er, gamma: g, okRef: ok,
					zetaL: 2 * math.Pi * math.Sqrt(w.mL) / (3 * w.f) * ul * math.Sqrt(max(ul, 0)),
					dEta:  math.Abs(l.Energy - er), dGam: math.Abs(l.Gamma - g)}
				out = append(out, r)
			}
		}
	}
	return out
}

// TestFiniteAgainstReference holds the connection rule on finite wells to
// the shooting reference over the grid: energy and Γ estimates below the
// true error on at most 1% of the levels, and the pessimism measured
// where the true error is above 1e-12.
func TestFiniteAgainstReference(t *testing.T) {
	t.Parallel()
	res := runFiniteGrid(t, false)
	var under, underG, pess, pessG, measured, measuredG int
	var worst, worstG, worstRel float64
	var measuredRel, pessRel int
	var ratios []float64
	for _, r := range res {
		if !r.okRef {
			t.Errorf("%+v f=%g n=%d: reference did not settle", r.c, r.f, r.lv.N)
			continue
		}
		tolE := 1e-13 * max(1, math.Abs(r.eta))
		if r.dEta > r.lv.Err+tolE {
			under++
			t.Logf("undershoot: %+v f=%g n=%d ζ_L=%.3g: η=%.12g ref %.12g err %.3g est %.3g", r.c, r.f, r.lv.N, r.zetaL, r.lv.Energy, r.eta, r.dEta, r.lv.Err)
		}
		if r.dEta > 1e-12 {
			measured++
			q := r.lv.Err / r.dEta
			ratios = append(ratios, q)
			worst = max(worst, q)
			if q > 10 {
				pess++
				t.Logf("pessimistic: %+v f=%g n=%d ζ_L=%.3g: err %.3g est %.3g (%.3g×)", r.c, r.f, r.lv.N, r.zetaL, r.dEta, r.lv.Err, q)
			}
		}
		tolG := 1e-9*r.gamma + 1e-300
		if r.dGam > r.lv.GammaErr+tolG {
			underG++
			t.Logf("Γ undershoot: %+v f=%g n=%d ζ_L=%.3g: Γ=%.6g ref %.6g rel err %.3g est %.3g", r.c, r.f, r.lv.N, r.zetaL, r.lv.Gamma, r.gamma, r.dGam/r.gamma, r.lv.GammaErr/r.gamma)
		}
		// Pessimism of Γ: the rule's absolute threshold (an error above
		// 1e-12), and for information the relative one (above 1e-9 of
		// Γ, away from the underflow floor).
		if r.dGam > 1e-12 {
			measuredG++
			q := r.lv.GammaErr / r.dGam
			worstG = max(worstG, q)
			if q > 10 {
				pessG++
				t.Logf("Γ pessimistic: %+v f=%g n=%d ζ_L=%.3g: err %.3g est %.3g (%.3g×)", r.c, r.f, r.lv.N, r.zetaL, r.dGam, r.lv.GammaErr, q)
			}
		}
		if r.dGam > 1e-9*r.gamma && r.gamma > 1e-290 && r.lv.Gamma > 0 {
			measuredRel++
			q := r.lv.GammaErr / r.dGam
			worstRel = max(worstRel, q)
			if q > 10 {
				pessRel++
				t.Logf("Γ rel pessimistic: %+v f=%g n=%d ζ_L=%.3g: rel err %.3g est %.3g (%.3g×)", r.c, r.f, r.lv.N, r.zetaL, r.dGam/r.gamma, r.lv.GammaErr/r.gamma, q)
			}
		}
	}
	sort.Float64s(ratios)
	med := 0.0
	if len(ratios) > 0 {
		med = ratios[len(ratios)/2]
	}
	t.Logf("%d levels: η undershoots %d, %d beyond 10× of %d measured (worst %.3g×, median %.3g×); Γ undershoots %d, %d beyond 10× of %d with error > 1e-12 (worst %.3g×), %d beyond 10× of %d with relative error > 1e-9 (worst %.3g×)",
		len(res), under, pess, measured, worst, med, underG, pessG, measuredG, worstG, pessRel, measuredRel, worstRel)
	if under > len(res)/100 || underG > len(res)/100 {
		t.Errorf("undershoots: η %d, Γ %d of %d levels (allowed %d)", under, underG, len(res), len(res)/100)
	}
	fmt.Print()
}
