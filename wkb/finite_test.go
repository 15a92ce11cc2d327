package wkb_test

import (
	"errors"
	"flag"
	"fmt"
	"math"
	"math/rand/v2"
	"sort"
	"strings"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/internal/squarewell"
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

// finiteResult is one level held against the exact solver.
type finiteResult struct {
	c          finiteCase
	f          float64
	lv, ex     tiltwell.Level
	zetaL      float64 // the under-barrier action, from the level
	dEta, dGam float64 // true errors
}

// finiteGrid holds a rule's levels on the grid against the exact solver,
// and counts the levels exact confines that the rule does not report, by
// the rule's reason.
type finiteGrid struct {
	res      []finiteResult
	exact    int
	refusals map[string]int
	extraWKB int // levels the rule reports beyond exact's
}

// runFiniteGrid solves every well of the grid at every field with the
// rule and with exact.Solver.
func runFiniteGrid(t *testing.T, plain bool) finiteGrid {
	t.Helper()
	g := finiteGrid{refusals: map[string]int{}}
	for _, c := range finiteCases() {
		st := c.stack(t)
		s := wkb.Solver{Stack: st, Plain: plain}
		for _, f := range finiteFields {
			ls, err := s.Levels(nil, f, 100)
			var ce *tiltwell.ConfinedError
			if err != nil && !errors.As(err, &ce) {
				t.Fatalf("%+v f=%g: %v", c, f, err)
			}
			ex, err := exact.Solver{Stack: st}.Levels(nil, f, 100)
			if err != nil && !errors.As(err, new(*tiltwell.ConfinedError)) {
				t.Fatalf("%+v f=%g: exact: %v", c, f, err)
			}
			g.exact += len(ex)
			if len(ls) < len(ex) && ce != nil {
				why := ce.Why
				if i := strings.Index(why, ": "); i >= 0 {
					why = why[i+2:]
				}
				if i := strings.Index(why, " ("); i >= 0 {
					why = why[:i]
				}
				g.refusals[why] += len(ex) - len(ls)
			}
			g.extraWKB += max(0, len(ls)-len(ex))
			w := c.ref(f)
			for i := range min(len(ls), len(ex)) {
				l := ls[i]
				ul := w.vL - l.Energy - w.f/2
				g.res = append(g.res, finiteResult{c: c, f: f, lv: l, ex: ex[i],
					zetaL: 2 * math.Pi * math.Sqrt(w.mL) / (3 * w.f) * ul * math.Sqrt(max(ul, 0)),
					dEta:  math.Abs(l.Energy - ex[i].Energy), dGam: math.Abs(l.Gamma - ex[i].Gamma)})
			}
		}
	}
	return g
}

// TestFiniteAgainstExact holds the connection rule on finite wells to
// exact.Solver over the grid (barriers 2 to 50 E₁, mass ratios 1 to 2,
// symmetric and asymmetric, |f| ≤ 10) by the rules of exact.Check, for
// energies and escape widths alike: an estimate below the true error (the
// exact level's own estimate added on its side) on at most 1% of the
// levels, never by more than exact.SmallExcess (3×) beyond the rounding
// floor, and no estimate more than 10× pessimistic where the true error
// is above 1e-12.
func TestFiniteAgainstExact(t *testing.T) {
	t.Parallel()
	g := runFiniteGrid(t, false)
	st := finiteStats(t, g.res)
	t.Logf("exact confines %d levels; the rule reports %d (%.1f%%), refuses %v, reports %d beyond exact's", g.exact, len(g.res), 100*float64(len(g.res))/float64(g.exact), g.refusals, g.extraWKB)
	st.check(t, len(g.res))
	if g.extraWKB > 0 {
		t.Errorf("%d levels reported that exact does not confine", g.extraWKB)
	}
}

type gridStats struct {
	under, underG, gross, grossG, pess, pessG, measured, measuredG int
	worst, worstG, median, medianG, worstRel                       float64
	closest, closestG                                              float64 // the largest true error over the covered error
	relLo, relHi                                                   float64 // GammaErr over the error where it is above 1e-11 of Γ
}

// check applies exact.Check's rules to the counts of n levels.
func (st gridStats) check(t *testing.T, n int) {
	t.Helper()
	if st.under > n/100 || st.underG > n/100 || st.gross > 0 || st.grossG > 0 {
		t.Errorf("undershoots: η %d (%d gross), Γ %d (%d gross) of %d levels (allowed %d, none gross)", st.under, st.gross, st.underG, st.grossG, n, n/100)
	}
	if st.pess > 0 || st.pessG > 0 {
		t.Errorf("beyond 10× pessimistic: η %d, Γ %d of %d levels", st.pess, st.pessG, n)
	}
}

// finiteStats counts undershoots and pessimism as exact.Check does,
// logging each.
func finiteStats(t *testing.T, res []finiteResult) gridStats {
	var st gridStats
	var ratios, ratiosG []float64
	for _, r := range res {
		// The exact level's own error counts on its side.
		if cover := r.lv.Err + r.ex.Err; cover > 0 {
			st.closest = max(st.closest, r.dEta/cover)
		}
		if cover := r.lv.GammaErr + r.ex.GammaErr; cover > 0 {
			st.closestG = max(st.closestG, r.dGam/cover)
		}
		if cover := r.lv.Err + r.ex.Err; r.dEta > cover {
			st.under++
			if r.dEta > exact.SmallExcess*cover && r.dEta > exact.RoundingULPs*0x1p-52*max(1, math.Abs(r.ex.Energy)) {
				st.gross++
			}
			t.Logf("undershoot: %+v f=%g n=%d ζ_L=%.3g: η=%.12g exact %.12g err %.3g est %.3g", r.c, r.f, r.lv.N, r.zetaL, r.lv.Energy, r.ex.Energy, r.dEta, r.lv.Err)
		}
		if r.dEta > 1e-12 {
			st.measured++
			q := r.lv.Err / r.dEta
			ratios = append(ratios, q)
			st.worst = max(st.worst, q)
			if q > 10 {
				st.pess++
				t.Logf("pessimistic: %+v f=%g n=%d ζ_L=%.3g: err %.3g est %.3g (%.3g×)", r.c, r.f, r.lv.N, r.zetaL, r.dEta, r.lv.Err, q)
			}
		}
		if cover := r.lv.GammaErr + r.ex.GammaErr; r.dGam > cover {
			st.underG++
			if r.dGam > exact.SmallExcess*cover && r.dGam > max(exact.RoundingULPs*0x1p-52*r.ex.Gamma, 1e-300) {
				st.grossG++
			}
			t.Logf("Γ undershoot: %+v f=%g n=%d ζ_L=%.3g: Γ=%.6g exact %.6g rel err %.3g est %.3g", r.c, r.f, r.lv.N, r.zetaL, r.lv.Gamma, r.ex.Gamma, r.dGam/r.ex.Gamma, r.lv.GammaErr/r.ex.Gamma)
		}
		if r.ex.Gamma > 0 {
			st.worstRel = max(st.worstRel, r.dGam/r.ex.Gamma)
			if r.dGam > 1e-11*r.ex.Gamma {
				q := r.lv.GammaErr / r.dGam
				if st.relHi == 0 {
					st.relLo = q
				}
				st.relLo, st.relHi = min(st.relLo, q), max(st.relHi, q)
			}
		}
		if r.dGam > 1e-12 {
			st.measuredG++
			q := r.lv.GammaErr / r.dGam
			ratiosG = append(ratiosG, q)
			st.worstG = max(st.worstG, q)
			if q > 10 {
				st.pessG++
				t.Logf("Γ pessimistic: %+v f=%g n=%d ζ_L=%.3g: err %.3g est %.3g (%.3g×)", r.c, r.f, r.lv.N, r.zetaL, r.dGam, r.lv.GammaErr, q)
			}
		}
	}
	st.median, st.medianG = median(ratios), median(ratiosG)
	t.Logf("%d levels: η undershoots %d (%d gross; the closest error %.3g of the estimates), %d beyond 10× of %d with error > 1e-12 (worst %.3g×, median %.3g×); Γ undershoots %d (%d gross; closest %.3g), %d beyond 10× of %d with error > 1e-12 (worst %.3g×, median %.3g×), worst relative error of Γ %.3g; where that is above 1e-11, GammaErr is %.3g× to %.3g× the error",
		len(res), st.under, st.gross, st.closest, st.pess, st.measured, st.worst, st.median, st.underG, st.grossG, st.closestG, st.pessG, st.measuredG, st.worstG, st.medianG, st.worstRel, st.relLo, st.relHi)
	return st
}

// median returns the median of xs (sorting them), 0 for none.
func median(xs []float64) float64 {
	if len(xs) == 0 {
		return 0
	}
	sort.Float64s(xs)
	return xs[len(xs)/2]
}

// randomWells is the number of seeded random finite wells of
// TestFiniteRandomWells (0 in an ordinary run).
var randomWells = flag.Int("finite-wells", 0, "number of random finite wells TestFiniteRandomWells holds against the exact solver")

// TestFiniteRandomWells holds the connection rule to exact.Solver on
// seeded random wells (-finite-wells N): barriers 2 to 50 E₁ (a third of
// them symmetric), mass ratios 1 to 2, six random fields each with
// 0.01 ≤ |f| ≤ 10; and as many more with barriers to 2000 E₁ and
// |f| ≤ 300. The same rules as the fixed grid. It also holds the flux
// formula of reference_test.go to exact's widths where ζ_L ≥ 5, logging
// its deviation by band of ζ_L and the size of the turning-point term it
// leaves out (see fluxGamma), and requiring 1e-10 of Γ for ζ_L ≥ 9.
func TestFiniteRandomWells(t *testing.T) {
	if *randomWells == 0 {
		t.Skip("run with -finite-wells N")
	}
	for _, big := range []bool{false, true} {
		rng := rand.New(rand.NewPCG(99, 7))
		var res []finiteResult
		nex := 0
		var fl fluxStats
		for range *randomWells {
			vmax, fmax := 50.0, 10.0
			if big {
				vmax, fmax = 2000, 300
			}
			v := func() float64 { return 2 * math.Pow(vmax/2, rng.Float64()) }
			m := func() float64 { return 1 + rng.Float64() }
			c := finiteCase{v(), m(), v(), m()}
			if rng.IntN(3) == 0 {
				c.vR, c.mR = c.vL, c.mL
			}
			st := c.stack(t)
			for range 6 {
				f := math.Copysign(fmax*math.Pow(10, -3*rng.Float64()), rng.Float64()-0.5)
				ls, err := wkb.Solver{Stack: st}.Levels(nil, f, 100)
				if err != nil && !errors.As(err, new(*tiltwell.ConfinedError)) {
					t.Fatalf("%+v f=%g: %v", c, f, err)
				}
				ex, err := exact.Solver{Stack: st}.Levels(nil, f, 100)
				if err != nil && !errors.As(err, new(*tiltwell.ConfinedError)) {
					t.Fatalf("%+v f=%g: exact: %v", c, f, err)
				}
				nex += len(ex)
				if len(ls) > len(ex) {
					t.Errorf("%+v f=%g: %d levels, exact confines %d", c, f, len(ls), len(ex))
				}
				w := c.ref(f)
				for i := range min(len(ls), len(ex)) {
					l := ls[i]
					ul := w.vL - l.Energy - w.f/2
					res = append(res, finiteResult{c: c, f: f, lv: l, ex: ex[i],
						zetaL: 2 * math.Pi * math.Sqrt(w.mL) / (3 * w.f) * ul * math.Sqrt(max(ul, 0)),
						dEta:  math.Abs(l.Energy - ex[i].Energy), dGam: math.Abs(l.Gamma - ex[i].Gamma)})
				}
				for _, e := range ex {
					fl.add(w, e)
				}
			}
		}
		t.Logf("barriers to %g E₁: exact confines %d levels, the rule reports %d", map[bool]float64{false: 50, true: 2000}[big], nex, len(res))
		finiteStats(t, res).check(t, len(res))
		fl.report(t)
	}
}

// fluxStats compares the flux formula (fluxGamma) with exact's widths by
// band of the under-barrier action ζ_L: from 5 to 7, from 7 to 9, above 9.
type fluxStats struct {
	n            [3]int
	dev, cut     [3]float64 // worst relative deviation from exact, worst cut
	devPerGamma  float64    // worst deviation over Γ² (below ζ_L = 9)
	cutLo, cutHi float64    // range of cut e^(2ζ_L)
	worstAt      string
}

func (s *fluxStats) add(w refWell, e tiltwell.Level) {
	u := w.vL - e.Energy - w.f/2
	zeta := 2 * math.Pi * math.Sqrt(w.mL) / (3 * w.f) * u * math.Sqrt(max(u, 0))
	if zeta < 5 || !(e.Gamma > 1e-290) {
		return
	}
	b := 2
	switch {
	case zeta < 7:
		b = 0
	case zeta < 9:
		b = 1
	}
	g, cut := w.fluxGamma(e.Energy)
	d := math.Abs(g-e.Gamma) / e.Gamma
	s.n[b]++
	if d > s.dev[b] {
		s.dev[b] = d
		if b == 2 {
			s.worstAt = fmt.Sprintf("%+v n=%d ζ_L=%.3g", w, e.N, zeta)
		}
	}
	s.cut[b] = max(s.cut[b], cut)
	if b < 2 {
		s.devPerGamma = max(s.devPerGamma, d/e.Gamma)
	}
	if c := cut * math.Exp(2*zeta); s.cutHi == 0 {
		s.cutLo, s.cutHi = c, c
	} else {
		s.cutLo, s.cutHi = min(s.cutLo, c), max(s.cutHi, c)
	}
}

func (s *fluxStats) report(t *testing.T) {
	t.Helper()
	t.Logf("flux formula against exact: ζ_L 5–7: %d levels, worst %.2g of Γ; 7–9: %d, %.2g; ≥ 9: %d, %.2g (%s); below 9 at most %.2g Γ of Γ. The turning-point cut it leaves out: up to %.2g, %.2g, %.2g of the norm in the three bands, %.2g to %.2g times e^(−2ζ_L)",
		s.n[0], s.dev[0], s.n[1], s.dev[1], s.n[2], s.dev[2], s.worstAt, s.devPerGamma, s.cut[0], s.cut[1], s.cut[2], s.cutLo, s.cutHi)
	if s.dev[2] > 1e-10 {
		t.Errorf("the flux formula is %.3g of Γ from exact's width at %s", s.dev[2], s.worstAt)
	}
}

// The shooting reference of reference_test.go, which shares no code with
// package exact, confirms exact.Solver on a sample of the grid: η to
// 1e-12, a width the shooting resolves to its resolution (1e-5 of Γ),
// and a narrow one (below 1e-9 of the level) by the flux formula to
// 1e-10 of Γ (measured: 7.5e-12 for ζ_L ≥ 9, see fluxGamma).
func TestReferenceAgreesWithExact(t *testing.T) {
	t.Parallel()
	cs := finiteCases()
	checked, narrow := 0, 0
	worstNarrow := 0.0
	for i, c := range cs {
		if i%7 != 0 {
			continue
		}
		st := c.stack(t)
		for _, f := range []float64{0.3, 3, -1} {
			ex, err := exact.Solver{Stack: st}.Levels(nil, f, 100)
			if err != nil && !errors.As(err, new(*tiltwell.ConfinedError)) {
				t.Fatal(err)
			}
			w := c.ref(f)
			for _, l := range ex {
				er, g, flux, ok := w.refLevel(complex(l.Energy, -l.Gamma/2))
				if !ok {
					t.Errorf("%+v f=%g n=%d: shooting did not settle", c, f, l.N)
					continue
				}
				checked++
				if d := math.Abs(er - l.Energy); d > 1e-12*max(1, math.Abs(er)) {
					t.Errorf("%+v f=%g n=%d: η shooting %.15g, exact %.15g", c, f, l.N, er, l.Energy)
				}
				tol := 1e-5
				if flux {
					narrow++
					tol = 1e-10
					if l.Gamma > 0 {
						worstNarrow = max(worstNarrow, math.Abs(g-l.Gamma)/l.Gamma)
					}
				}
				if d := math.Abs(g - l.Gamma); d > tol*l.Gamma+1e-300 {
					t.Errorf("%+v f=%g n=%d: Γ shooting %.10g (flux %v), exact %.10g", c, f, l.N, g, flux, l.Gamma)
				}
			}
		}
	}
	t.Logf("%d levels checked, %d narrow widths by the flux (worst %.2g of Γ)", checked, narrow, worstNarrow)
}

// The plain rule on the same grid: its Err is its distance from the
// connection rule plus that rule's estimate, so it must cover its error
// just as well.
func TestFinitePlainAgainstExact(t *testing.T) {
	t.Parallel()
	g := runFiniteGrid(t, true)
	st := finiteStats(t, g.res)
	if st.under > len(g.res)/100 || st.underG > len(g.res)/100 || st.gross > 0 || st.grossG > 0 {
		t.Errorf("undershoots: η %d (%d gross), Γ %d (%d gross) of %d levels (allowed %d, none gross)", st.under, st.gross, st.underG, st.grossG, len(g.res), len(g.res)/100)
	}
}

// At f = 0 both rules give the square well's levels, the roots of
// k + δ_L + δ_R = nπ with tan δ = μ_b k/κ (internal/squarewell, itself
// tested against the textbook even and odd conditions), with Γ = 0; at
// tiny fields the general path (Airy functions, the barrier's series)
// reaches them to the second-order Stark shift, O(f²).
func TestFiniteZeroField(t *testing.T) {
	t.Parallel()
	for _, c := range []finiteCase{{4.3, 1.37, 4.3, 1.37}, {10, 1, 20, 2}, {50, 2, 3, 1}, {1e4, 1.5, 1e4, 1.5}} {
		sq, err := squarewell.FromStack(c.stack(t))
		if err != nil {
			t.Fatal(err)
		}
		for _, plain := range []bool{false, true} {
			s := wkb.Solver{Stack: c.stack(t), Plain: plain}
			for _, f := range []float64{0, math.Copysign(0, -1), 1e-200, 1e-7, -1e-5} {
				k := min(sq.Count(), 30)
				ls, err := s.Levels(nil, f, k)
				if err != nil {
					t.Fatalf("%+v f=%g: %v", c, f, err)
				}
				for _, l := range ls {
					want, _, err := sq.Level(l.N)
					if err != nil {
						t.Fatal(err)
					}
					// The Stark shift is at most |f|/2 (|dη/df| =
					// |⟨ξ − ½⟩|, Hellmann–Feynman, with the state mostly
					// in the well).
					tol := 8*0x1p-52*want + math.Abs(f)/2
					if d := math.Abs(l.Energy - want); d > tol {
						t.Errorf("%+v plain=%v f=%g n=%d: η = %.17g ± %.2g, square well %.17g", c, plain, f, l.N, l.Energy, l.Err, want)
					}
					if f == 0 && (l.Gamma != 0 || l.GammaErr != 0) {
						t.Errorf("%+v f=0 n=%d: Γ = %g ± %g, want 0", c, l.N, l.Gamma, l.GammaErr)
					}
				}
			}
		}
	}
}

// Levels of a well at f and of its mirror image at −f agree exactly
// (Stack.Fold), and a symmetric well's are even in f.
func TestFiniteMirror(t *testing.T) {
	t.Parallel()
	c := finiteCase{12, 1.2, 7, 1.8}
	a, errA := wkb.Solver{Stack: c.stack(t)}.Levels(nil, 2.5, 10)
	b, errB := wkb.Solver{Stack: c.stack(t).Mirror()}.Levels(nil, -2.5, 10)
	if len(a) == 0 || len(a) != len(b) || (errA == nil) != (errB == nil) {
		t.Fatalf("%d levels (%v) and %d mirrored (%v)", len(a), errA, len(b), errB)
	}
	for i := range a {
		if a[i] != b[i] {
			t.Errorf("n=%d: %+v, mirrored %+v", i+1, a[i], b[i])
		}
	}
}

// Bad input and unsupported stacks: errors wrapping the root sentinels
// (errors.ErrUnsupported for more than one well), never a panic; levels
// beyond the confined ones: the confined ones with a ConfinedError.
func TestFiniteErrors(t *testing.T) {
	t.Parallel()
	five, err := tiltwell.NewStack([]tiltwell.Layer{{Edge: 5, Mass: 1}, {Width: 1, Mass: 1}, {Width: 0.3, Edge: 5, Mass: 1}, {Width: 1, Mass: 1}, {Edge: 5, Mass: 1}}, 1)
	if err != nil {
		t.Fatal(err)
	}
	for _, plain := range []bool{false, true} {
		s := wkb.Solver{Stack: five, Plain: plain}
		ls, err := s.Levels(nil, 1, 2)
		if !errors.Is(err, errors.ErrUnsupported) || len(ls) != 0 {
			t.Errorf("five layers: %d levels, %v; want ErrUnsupported", len(ls), err)
		}
		if w, err := s.Wavefunction(1, 1); !errors.Is(err, errors.ErrUnsupported) || w != nil {
			t.Errorf("five layers: wavefunction %v, %v; want ErrUnsupported", w, err)
		}
	}
	s := wkb.Solver{Stack: finiteCase{4.3, 1.37, 4.3, 1.37}.stack(t)}
	for _, tt := range []struct {
		f    float64
		k    int
		want error
	}{
		{math.NaN(), 1, tiltwell.ErrField},
		{math.Inf(-1), 1, tiltwell.ErrField},
		{1, 0, tiltwell.ErrLevel},
		{1, wkb.MaxLevels + 1, tiltwell.ErrLevel},
		{2 * wkb.MaxField, 1, tiltwell.ErrOutOfRange},
	} {
		if ls, err := s.Levels(nil, tt.f, tt.k); !errors.Is(err, tt.want) || len(ls) != 0 {
			t.Errorf("f=%g k=%d: %d levels, %v; want %v", tt.f, tt.k, len(ls), err, tt.want)
		}
	}
	for _, f := range []float64{0, 1, -3, 50} {
		ls, err := s.Levels(nil, f, 40)
		n, ok := tiltwell.Confined(err)
		if !ok || n != len(ls) || !errors.Is(err, tiltwell.ErrLevel) {
			t.Errorf("f=%g: %d levels with %v; want the confined ones with a ConfinedError", f, len(ls), err)
		}
		for _, l := range ls {
			if math.IsNaN(l.Energy+l.Err+l.Gamma+l.GammaErr) || l.Err < 0 || l.Gamma < 0 || l.GammaErr < 0 {
				t.Errorf("f=%g: bad level %+v", f, l)
			}
		}
	}
	// A barrier below the well binds nothing at zero field.
	low, err := tiltwell.AsymmetricWell(-1, 1, 5, 1)
	if err != nil {
		t.Fatal(err)
	}
	if ls, err := (wkb.Solver{Stack: low}).Levels(nil, 0, 1); len(ls) != 0 || !errors.Is(err, tiltwell.ErrLevel) {
		t.Errorf("barrier below the well: %d levels, %v", len(ls), err)
	}
}

// Levels on a finite well do not allocate when dst has capacity.
func TestFiniteAllocs(t *testing.T) {
	if raceEnabled {
		t.Skip("the race detector allocates")
	}
	for _, tc := range []struct {
		c finiteCase
		f float64
		k int
	}{{finiteCase{4.3, 1.37, 4.3, 1.37}, 1, 2}, {finiteCase{50, 2, 20, 1}, 3, 5}, {finiteCase{10, 1, 10, 1}, 0, 3}} {
		for _, plain := range []bool{false, true} {
			s := wkb.Solver{Stack: tc.c.stack(t), Plain: plain}
			dst := make([]tiltwell.Level, 0, tc.k)
			var err error
			a := testing.AllocsPerRun(20, func() { dst, err = s.Levels(dst, tc.f, tc.k) })
			if err != nil || a != 0 {
				t.Errorf("%+v f=%g plain=%v: %v allocations per call (err %v)", tc.c, tc.f, plain, a, err)
			}
		}
	}
}

// One Solver value on a finite well from many goroutines gives the serial
// results.
func TestFiniteConcurrent(t *testing.T) {
	t.Parallel()
	s := wkb.Solver{Stack: finiteCase{20, 1.3, 30, 1.6}.stack(t)}
	want, err := s.Levels(nil, 1.7, 5)
	if err != nil {
		t.Fatal(err)
	}
	done := make(chan []tiltwell.Level)
	for range 8 {
		go func() {
			got, _ := s.Levels(nil, 1.7, 5)
			done <- got
		}()
	}
	for range 8 {
		got := <-done
		for i := range want {
			if got[i] != want[i] {
				t.Errorf("n=%d: %+v concurrently, %+v serially", i+1, got[i], want[i])
			}
		}
	}
}

// The levels are continuous in the field, through the blends of the
// barrier's series, the turning point crossing the uphill interface and
// the second-order shift of broad levels: the largest step of η on a
// scan shrinks in proportion to the step of f (a jump would keep its
// size), and stays below the dipole bound |dη/df| = |⟨ξ − ½⟩| ≤ 2 on
// these wells (Hellmann–Feynman; the states reach less than 1.5 past
// either interface).
func TestFiniteContinuous(t *testing.T) {
	t.Parallel()
	for _, c := range []finiteCase{{10, 1.37, 10, 1.37}, {50, 1, 8, 2}} {
		s := wkb.Solver{Stack: c.stack(t)}
		for n := 1; n <= 3; n++ {
			largest := func(h float64) (float64, float64) {
				prev, w, at := math.NaN(), 0.0, 0.0
				for i := 0; ; i++ {
					f := 0.05 + float64(i)*h
					ls, err := s.Levels(nil, f, n)
					if err != nil || f > 10 {
						break
					}
					if d := math.Abs(ls[n-1].Energy - prev); d > w {
						w, at = d, f
					}
					prev = ls[n-1].Energy
				}
				return w, at
			}
			w1, at := largest(1e-2)
			w2, _ := largest(2.5e-3)
			if w1/w2 < 3 || w1 > 2*1e-2 {
				t.Errorf("%+v n=%d: largest steps of η %.3g and %.3g for steps of f 1e-2 and 2.5e-3 (near f = %.4g)", c, n, w1, w2, at)
			}
			t.Logf("%+v n=%d: largest steps of η %.3g, %.3g (ratio %.3g), near f = %.4g", c, n, w1, w2, w1/w2, at)
		}
	}
}

func FuzzFiniteLevels(f *testing.F) {
	for _, s := range []struct {
		vL, mL, vR, mR, f float64
		k                 int
	}{{4.3, 1.37, 4.3, 1.37, 1, 3}, {50, 2, 2, 1, -7, 5}, {2, 1, 2, 1, 0, 1}, {1e4, 1, 1e4, 1, 1e4, 10}, {-1, 1, 5, 1, 3, 2}, {10, 1e-6, 10, 1e6, 1e-9, 4}, {1e300, 1, 3, 1, 0.5, 2}} {
		f.Add(s.vL, s.mL, s.vR, s.mR, s.f, s.k, false)
		f.Add(s.vL, s.mL, s.vR, s.mR, s.f, s.k, true)
	}
	f.Fuzz(func(t *testing.T, vL, mL, vR, mR, fl float64, k int, plain bool) {
		st, err := tiltwell.AsymmetricWell(vL, mL, vR, mR)
		if err != nil {
			return
		}
		k %= 60
		s := wkb.Solver{Stack: st, Plain: plain}
		ls, err := s.Levels(nil, fl, k)
		if err != nil {
			if n, ok := tiltwell.Confined(err); ok {
				if n != len(ls) {
					t.Fatalf("ConfinedError says %d, %d levels returned", n, len(ls))
				}
			} else if len(ls) != 0 {
				t.Fatalf("levels returned with %v", err)
			}
			if !errors.Is(err, tiltwell.ErrField) && !errors.Is(err, tiltwell.ErrLevel) && !errors.Is(err, tiltwell.ErrOutOfRange) && !errors.Is(err, tiltwell.ErrNoConvergence) {
				t.Fatalf("error %v wraps no root sentinel", err)
			}
		}
		for i, l := range ls {
			if math.IsNaN(l.Energy) || math.IsInf(l.Energy, 0) || !(l.Err >= 0) || math.IsInf(l.Err, 0) || !(l.Gamma >= 0) || math.IsInf(l.Gamma, 0) || !(l.GammaErr >= 0) || math.IsInf(l.GammaErr, 0) || l.N != i+1 {
				t.Fatalf("bad level %+v", l)
			}
			if i > 0 && !(l.Energy > ls[i-1].Energy) {
				t.Fatalf("levels %d, %d out of order: %v, %v", i, i+1, ls[i-1].Energy, l.Energy)
			}
		}
		if len(ls) == 0 || len(ls) > 10 {
			return
		}
		w, err := s.Wavefunction(fl, len(ls))
		if err != nil {
			t.Fatalf("Wavefunction(%d) after Levels gave it: %v", len(ls), err)
		}
		lo, hi := tiltwell.Support(w)
		for _, x := range []float64{lo, lo / 2, 0, 0.5, 1, (1 + hi) / 2, hi} {
			if v := w.At(x); math.IsNaN(v) || math.IsInf(v, 0) {
				t.Fatalf("φ(%g) = %v", x, v)
			}
		}
	})
}
