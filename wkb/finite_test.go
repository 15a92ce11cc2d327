package wkb_test

import (
	"errors"
	"flag"
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
// symmetric and asymmetric, |f| ≤ 10): energy and Γ estimates below the
// true error on at most 1% of the levels, and no more than 10×
// pessimistic where the true error is above 1e-12 (issue 12's rule),
// beyond the exact solver's own error.
func TestFiniteAgainstExact(t *testing.T) {
	t.Parallel()
	g := runFiniteGrid(t, false)
	st := finiteStats(t, g.res)
	t.Logf("exact confines %d levels; the rule reports %d (%.1f%%), refuses %v, reports %d beyond exact's", g.exact, len(g.res), 100*float64(len(g.res))/float64(g.exact), g.refusals, g.extraWKB)
	if st.under > len(g.res)/100 || st.underG > len(g.res)/100 {
		t.Errorf("undershoots: η %d, Γ %d of %d levels (allowed %d)", st.under, st.underG, len(g.res), len(g.res)/100)
	}
	if st.pess > len(g.res)/200 || st.pessG > 0 {
		t.Errorf("beyond 10× pessimistic: η %d, Γ %d of %d levels", st.pess, st.pessG, len(g.res))
	}
	if g.extraWKB > 0 {
		t.Errorf("%d levels reported that exact does not confine", g.extraWKB)
	}
}

type gridStats struct {
	under, underG, pess, pessG, measured, measuredG int
	worst, worstG, median                           float64
}

// finiteStats counts undershoots and pessimism, logging each.
func finiteStats(t *testing.T, res []finiteResult) gridStats {
	var st gridStats
	var ratios []float64
	for _, r := range res {
		// The exact level's own error counts on its side.
		if r.dEta > r.lv.Err+r.ex.Err {
			st.under++
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
		// exact's narrow widths were measured to differ from the
		// independent flux formula of reference_test.go by up to 4e-9
		// of Γ on the grid of issue 12 (and by 1.5e-7 at |f| ≈ 100),
		// beyond their GammaErr, while this package's width agrees with
		// the flux to 1e-12: that much is allowed for, and beyond it a
		// narrow level (ζ_L > 12, where the flux formula holds to
		// e^(−2ζ_L)) is held to the flux instead.
		if r.dGam > r.lv.GammaErr+r.ex.GammaErr+1e-8*r.ex.Gamma && r.zetaL > 12 {
			fl := r.c.ref(r.f).fluxGamma(r.ex.Energy)
			if d := math.Abs(r.lv.Gamma - fl); d <= r.lv.GammaErr+1e-12*fl {
				t.Logf("Γ: %+v f=%g n=%d: exact %.12g, flux %.12g, this package %.12g ± %.2g", r.c, r.f, r.lv.N, r.ex.Gamma, fl, r.lv.Gamma, r.lv.GammaErr)
				r.dGam = d
			}
		}
		if r.dGam > r.lv.GammaErr+r.ex.GammaErr+1e-8*r.ex.Gamma {
			st.underG++
			t.Logf("Γ undershoot: %+v f=%g n=%d ζ_L=%.3g: Γ=%.6g exact %.6g rel err %.3g est %.3g", r.c, r.f, r.lv.N, r.zetaL, r.lv.Gamma, r.ex.Gamma, r.dGam/r.ex.Gamma, r.lv.GammaErr/r.ex.Gamma)
		}
		if r.dGam > 1e-12 {
			st.measuredG++
			q := r.lv.GammaErr / r.dGam
			st.worstG = max(st.worstG, q)
			if q > 10 {
				st.pessG++
				t.Logf("Γ pessimistic: %+v f=%g n=%d ζ_L=%.3g: err %.3g est %.3g (%.3g×)", r.c, r.f, r.lv.N, r.zetaL, r.dGam, r.lv.GammaErr, q)
			}
		}
	}
	sort.Float64s(ratios)
	if len(ratios) > 0 {
		st.median = ratios[len(ratios)/2]
	}
	t.Logf("%d levels: η undershoots %d, %d beyond 10× of %d with error > 1e-12 (worst %.3g×, median %.3g×); Γ undershoots %d, %d beyond 10× of %d with error > 1e-12 (worst %.3g×)",
		len(res), st.under, st.pess, st.measured, st.worst, st.median, st.underG, st.pessG, st.measuredG, st.worstG)
	return st
}

// randomWells is the number of seeded random finite wells of
// TestFiniteRandomWells (0 in an ordinary run).
var randomWells = flag.Int("finite-wells", 0, "number of random finite wells TestFiniteRandomWells holds against the exact solver")

// TestFiniteRandomWells holds the connection rule to exact.Solver on
// seeded random wells (-finite-wells N): barriers 2 to 50 E₁ (a third of
// them symmetric), mass ratios 1 to 2, six random fields each with
// 0.01 ≤ |f| ≤ 10; and as many more with barriers to 2000 E₁ and
// |f| ≤ 300. The same rules as the fixed grid.
func TestFiniteRandomWells(t *testing.T) {
	if *randomWells == 0 {
		t.Skip("run with -finite-wells N")
	}
	for _, big := range []bool{false, true} {
		rng := rand.New(rand.NewPCG(99, 7))
		var res []finiteResult
		nex := 0
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
			}
		}
		t.Logf("barriers to %g E₁: exact confines %d levels, the rule reports %d", map[bool]float64{false: 50, true: 2000}[big], nex, len(res))
		st := finiteStats(t, res)
		if st.under > len(res)/100 || st.underG > len(res)/100 {
			t.Errorf("undershoots: η %d, Γ %d of %d levels", st.under, st.underG, len(res))
		}
	}
}

// The shooting reference of reference_test.go, which shares no code with
// package exact, confirms exact.Solver on a sample of the grid: η to
// 1e-12 and Γ to the shooting's resolution (1e-5 of Γ).
func TestReferenceAgreesWithExact(t *testing.T) {
	t.Parallel()
	cs := finiteCases()
	checked := 0
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
				er, g, ok := w.refLevel(complex(l.Energy, -l.Gamma/2))
				if !ok {
					t.Errorf("%+v f=%g n=%d: shooting did not settle", c, f, l.N)
					continue
				}
				checked++
				if d := math.Abs(er - l.Energy); d > 1e-12*max(1, math.Abs(er)) {
					t.Errorf("%+v f=%g n=%d: η shooting %.15g, exact %.15g", c, f, l.N, er, l.Energy)
				}
				if d := math.Abs(g - l.Gamma); d > 1e-5*l.Gamma+1e-300 {
					t.Errorf("%+v f=%g n=%d: Γ shooting %.10g, exact %.10g", c, f, l.N, g, l.Gamma)
				}
			}
		}
	}
	t.Logf("%d levels checked", checked)
}

// The plain rule on the same grid: its Err is its distance from the
// connection rule plus that rule's estimate, so it must cover its error
// just as well.
func TestFinitePlainAgainstExact(t *testing.T) {
	t.Parallel()
	g := runFiniteGrid(t, true)
	st := finiteStats(t, g.res)
	if st.under > len(g.res)/100 || st.underG > len(g.res)/100 {
		t.Errorf("undershoots: η %d, Γ %d of %d levels (allowed %d)", st.under, st.underG, len(g.res), len(g.res)/100)
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
