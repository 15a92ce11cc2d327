package exact_test

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/exact/exacttest"
	"gonum.org/v1/gonum/mat"
)

// sineBasis is an independent test solver: Rayleigh–Ritz in the first size
// zero-field states √2 sin(mπξ), with the matrix elements
//
//	⟨m|H|n⟩ = n² δ_mn + f ⟨m|ξ − ½|n⟩,
//	⟨m|ξ − ½|n⟩ = −8mn / (π² (m² − n²)²) for m + n odd, 0 otherwise
//
// (the dipole matrix element of the infinite well in units of L, the
// integral ∫₀¹ 2 sin(mπξ) sin(nπξ)(ξ − ½) dξ in closed form: common
// practice, no source). With size 40 and |f| ≤ 10 the three lowest levels
// are good to below its claimed 1e-8 (at f = 10 the ground level of size
// 40 is 6.6e-11 above the exact one, computed independently at high
// precision (mpmath)).
type sineBasis struct {
	size  int
	claim float64
	// Deliberate faults, for the tests of Check itself.
	flipWave  bool    // wrong sign convention
	scaleWave float64 // not normalized if ≠ 0 and ≠ 1
	leakWave  bool    // nonzero outside [0, 1]
}

func (s sineBasis) eig(f float64, vectors bool) ([]float64, *mat.Dense) {
	h := mat.NewSymDense(s.size, nil)
	for m := 1; m <= s.size; m++ {
		h.SetSym(m-1, m-1, float64(m*m))
		for n := m + 1; n <= s.size; n += 2 {
			d := float64(m*m - n*n)
			h.SetSym(m-1, n-1, -8*f*float64(m*n)/(math.Pi*math.Pi*d*d))
		}
	}
	var es mat.EigenSym
	if !es.Factorize(h, vectors) {
		panic("sineBasis: eigendecomposition failed")
	}
	if !vectors {
		return es.Values(nil), nil
	}
	var v mat.Dense
	es.VectorsTo(&v)
	return es.Values(nil), &v
}

func (s sineBasis) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	dst = dst[:0]
	if err := tiltwell.CheckArgs("sinebasis", f, k, s.size, 0); err != nil {
		return dst, err
	}
	af, _ := tiltwell.Fold(f)
	vals, _ := s.eig(af, false)
	for n := 1; n <= k; n++ {
		dst = append(dst, tiltwell.Level{N: n, Energy: vals[n-1], Err: s.claim})
	}
	return dst, nil
}

func (s sineBasis) Wavefunction(f float64, n int) (tiltwell.Wavefunction, error) {
	if err := tiltwell.CheckArgs("sinebasis", f, n, s.size, 0); err != nil {
		return nil, err
	}
	af, mirrored := tiltwell.Fold(f)
	_, v := s.eig(af, true)
	c := make([]float64, s.size)
	slope := 0.0 // φ′(0) ∝ Σ c_m m
	for m := range c {
		c[m] = v.At(m, n-1)
		slope += c[m] * float64(m+1)
	}
	scale := 1.0
	if slope < 0 {
		scale = -1
	}
	if s.flipWave {
		scale = -scale
	}
	if s.scaleWave != 0 {
		scale *= s.scaleWave
	}
	var w tiltwell.Wavefunction = tiltwell.WaveFunc(func(xi float64) float64 {
		r := 0.0
		for m, cm := range c {
			r += cm * math.Sin(float64(m+1)*math.Pi*xi)
		}
		return scale * math.Sqrt2 * r
	})
	if mirrored {
		w = tiltwell.Mirror(w, n)
	}
	if s.leakWave {
		inner := w
		w = leaky{inner}
	}
	return w, nil
}

type leaky struct{ w tiltwell.Wavefunction }

func (l leaky) At(xi float64) float64 {
	if xi > 1 {
		return 1e-3
	}
	return l.w.At(xi)
}

// offset is the exact solver shifted by d, claiming claim (or the exact
// solver's own estimate if claim is 0) with the given bound kind.
type offset struct {
	d, claim float64
	bound    tiltwell.Bound
}

func (o offset) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	dst, err := exact.Solver{}.Levels(dst, f, k)
	for i := range dst {
		dst[i].Energy += o.d
		if o.claim != 0 {
			dst[i].Err = o.claim
		}
		dst[i].Bound = o.bound
	}
	return dst, err
}

// wrongLevel is the exact solver with a relative error rel on level n at
// fields |f| > above (so symmetric in f), still claiming the exact
// solver's own estimate (a few ulps): a gross undershoot at a few points
// of a grid, which no allowance may forgive.
type wrongLevel struct {
	n          int
	rel, above float64
}

func (w wrongLevel) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	dst, err := exact.Solver{}.Levels(dst, f, k)
	if err != nil {
		return dst, err
	}
	if math.Abs(f) > w.above && k >= w.n {
		dst[w.n-1].Energy *= 1 + w.rel
	}
	return dst, nil
}

// linspace returns n fields evenly spaced over [a, b].
func linspace(a, b float64, n int) []float64 {
	fs := make([]float64, n)
	for i := range fs {
		fs[i] = a + (b-a)*float64(i)/float64(n-1)
	}
	return fs
}

var smallGrid = exact.Grid{Fields: []float64{0, 1e-8, 1, 10, -3}, Levels: 3}

// TestCheckCatchesOffset: a solver wrong by 1e-6 that claims full
// accuracy fails; one that is right passes.
func TestCheckCatchesOffset(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name   string
		s      tiltwell.Solver
		grid   exact.Grid
		wantOK bool
		reason string
	}{
		{"exact", exact.Solver{}, smallGrid, true, "the reference against itself"},
		{"sinebasis", sineBasis{size: 40, claim: 1e-8}, smallGrid, true, "an independent method, right within its claim"},
		{"offset=1e-6/claim=exact", offset{d: 1e-6}, smallGrid, false, "wrong by 1e-6, claims a few ulp"},
		{"offset=1e-6/claim=2e-6", offset{d: 1e-6, claim: 2e-6}, smallGrid, true, "wrong by 1e-6 and says so"},
		{"offset=1e-6/claim=2e-6/tol=1e-7", offset{d: 1e-6, claim: 2e-6}, exact.Grid{Fields: smallGrid.Fields, Levels: 3, Tol: 1e-7}, false, "honest, but beyond the tolerance"},
		{"offset=1e-6/claim=2e-6/tol=1e-5", offset{d: 1e-6, claim: 2e-6}, exact.Grid{Fields: smallGrid.Fields, Levels: 3, Tol: 1e-5}, true, "honest and within the tolerance"},
		{"offset=1e-6/claim=1e-4/ratio=10", offset{d: 1e-6, claim: 1e-4}, exact.Grid{Fields: smallGrid.Fields, Levels: 3, MaxRatio: 10}, false, "covers, but 100× pessimistic"},
		{"offset=1e-6/claim=1e-4/ratio=200", offset{d: 1e-6, claim: 1e-4}, exact.Grid{Fields: smallGrid.Fields, Levels: 3, MaxRatio: 200}, true, "100× pessimistic is within 200×"},
		{"offset=1e-6/rigorous", offset{d: 1e-6, claim: 0.9e-6, bound: tiltwell.Rigorous}, smallGrid, false, "a rigorous bound that misses"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			t.Parallel()
			r, err := exact.Check(tc.s, tc.grid)
			if err != nil {
				t.Fatal(err)
			}
			if r.OK() != tc.wantOK {
				t.Errorf("%s: OK() = %v, want %v. Report:\n%s", tc.reason, r.OK(), tc.wantOK, r)
			}
			if r.Points != 15 || r.Fields != 5 {
				t.Errorf("compared %d levels at %d fields, want 15 at 5", r.Points, r.Fields)
			}
		})
	}
}

// TestCheckGrossUndershoot: the 1% allowance forgives small excesses only.
// A solver wrong by 1e-6 relative on level 3 at |f| > 5 (2 of 505 levels
// on the grid, errors of 9e-6 claimed as 7e-15) must fail, and the report
// must name the field, level, true error and estimate of the worst one.
func TestCheckGrossUndershoot(t *testing.T) {
	t.Parallel()
	g := exact.Grid{Fields: linspace(0, 5.1, 101), Levels: 5}
	r, err := exact.Check(wrongLevel{n: 3, rel: 1e-6, above: 5}, g)
	if err != nil {
		t.Fatal(err)
	}
	if r.OK() {
		t.Fatalf("a solver off by 9e-6 claiming 7e-15 passed:\n%s", r)
	}
	t.Logf("the report:\n%s", r)
	if r.Undershoots != 2 || r.GrossUndershoots != 2 || r.RigorousUndershoots != 0 || r.Allowed != 5 {
		t.Errorf("undershoots %d (gross %d, rigorous %d, allowed %d), want 2 (2, 0, 5)",
			r.Undershoots, r.GrossUndershoots, r.RigorousUndershoots, r.Allowed)
	}
	w := r.WorstUndershoot
	e3, err := exact.Solver{}.Level(w.F, 3)
	if err != nil {
		t.Fatal(err)
	}
	if !(w.F > 5) || w.N != 3 || w.Want != e3.Energy || w.Err != e3.Err || !w.Gross() {
		t.Errorf("worst undershoot %+v, want a gross one at f > 5, n=3 (η = %v ± %v)", w, e3.Energy, e3.Err)
	}
	s := r.String()
	if n := strings.Count(s, fmt.Sprintf("f=%g n=3: gross undershoot", w.F)); n != 1 {
		t.Errorf("the worst undershoot is listed %d times, want once:\n%s", n, s)
	}
	for _, want := range []string{
		": FAIL\n",
		"2 gross, none allowed",
		fmt.Sprintf("worst: f=%g n=3: gross undershoot, true error %.3g, estimate %.3g", w.F, w.True(), w.Err),
		"true error 9.05e-06",
	} {
		if !strings.Contains(s, want) {
			t.Errorf("report lacks %q:\n%s", want, s)
		}
	}
	var rec recordTB
	exacttest.TestSolver(&rec, wrongLevel{n: 3, rel: 1e-6, above: 5}, g)
	if len(rec.errors) != 1 || !strings.Contains(rec.errors[0], "gross undershoot") {
		t.Errorf("TestSolver: errors %q, want one naming the gross undershoot", rec.errors)
	}
}

// edited is the exact solver with each level passed through edit.
type edited struct {
	edit func(f float64, l *tiltwell.Level)
}

func (e edited) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	dst, err := exact.Solver{}.Levels(dst, f, k)
	if err != nil {
		return dst, err
	}
	for i := range dst {
		e.edit(f, &dst[i])
	}
	return dst, nil
}

// ulps moves x by n units in the last place.
func ulps(x float64, n int) float64 {
	for range n {
		x = math.Nextafter(x, math.Inf(1))
	}
	return x
}

// TestCheckSmallUndershoot: what the 1% allowance forgives (excesses
// within 3× of the estimates, or within 4 ulps of max(1, |η|)) and what it
// does not, on the 505 levels of 101 fields in [0, 5.1] (5 allowed).
func TestCheckSmallUndershoot(t *testing.T) {
	t.Parallel()
	g := exact.Grid{Fields: linspace(0, 5.1, 101), Levels: 5}
	// excess gives level 1 at the two fields above 5 an error of x times
	// what the two estimates cover.
	excess := func(x float64) edited {
		return edited{func(f float64, l *tiltwell.Level) {
			if l.N == 1 && math.Abs(f) > 5 {
				l.Energy += x * 2 * l.Err // the reference's Err is the same
			}
		}}
	}
	// atZero gives the levels n ≤ k at f = 0, exact and claimed so (Err 0),
	// an error of u ulps.
	atZero := func(u, k int) edited {
		return edited{func(f float64, l *tiltwell.Level) {
			if f == 0 && l.N <= k {
				l.Energy, l.Err = ulps(l.Energy, u), 0
			}
		}}
	}
	for _, tc := range []struct {
		name   string
		s      tiltwell.Solver
		wantOK bool
		gross  int
		reason string
	}{
		{"excess=2.5", excess(2.5), true, 0, "2 undershoots by 2.5×: small, within the 5 allowed"},
		{"excess=4", excess(4), false, 2, "2 undershoots by 4×: gross"},
		{"ulps=4/k=5", atZero(4, 5), true, 0, "5 levels off by 4 ulps claiming 0: the rounding floor, 5 allowed"},
		{"ulps=1/k=5", atZero(1, 5), true, 0, "1 ulp"},
		{"ulps=40/k=1", atZero(40, 1), false, 1, "40 ulps of η₁ = 1 claimed as 0: gross"},
		{"rel=1e-6", wrongLevel{n: 3, rel: 1e-6, above: 5}, false, 2, "1e9× the estimates: gross"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			t.Parallel()
			r, err := exact.Check(tc.s, g)
			if err != nil {
				t.Fatal(err)
			}
			if r.OK() != tc.wantOK || r.GrossUndershoots != tc.gross || r.Undershoots == 0 {
				t.Errorf("%s: OK() = %v with %d gross undershoots, want %v with %d (and some undershoot):\n%s",
					tc.reason, r.OK(), r.GrossUndershoots, tc.wantOK, tc.gross, r)
			}
		})
	}
	// More small undershoots than the 1% allowance fail: 7 of 505.
	seven := edited{func(f float64, l *tiltwell.Level) {
		excess(2.5).edit(f, l)
		atZero(4, 5).edit(f, l)
	}}
	r, err := exact.Check(seven, g)
	if err != nil {
		t.Fatal(err)
	}
	if r.OK() || r.Undershoots != 7 || r.GrossUndershoots != 0 || r.Allowed != 5 || len(r.Violations) != 0 {
		t.Errorf("7 small undershoots of 505: OK %v, %d (gross %d, allowed %d), want a failure with 7 (0, 5):\n%s",
			r.OK(), r.Undershoots, r.GrossUndershoots, r.Allowed, r)
	}
}

// TestCheckDiff: the diff lists the levels beyond the margin, and only
// those, each with both energies, in grid order.
func TestCheckDiff(t *testing.T) {
	t.Parallel()
	fields := linspace(0, 5.1, 101)
	r, err := exact.Check(wrongLevel{n: 3, rel: 1e-6, above: 5}, exact.Grid{Fields: fields, Levels: 5})
	if err != nil {
		t.Fatal(err)
	}
	var want strings.Builder
	for _, f := range fields[99:] {
		l, err := exact.Solver{}.Level(f, 3)
		if err != nil {
			t.Fatal(err)
		}
		fmt.Fprintf(&want, "-f=%v n=3: %v\n+f=%v n=3: %v\n", f, l.Energy, f, l.Energy*(1+1e-6))
	}
	if r.Diff != want.String() {
		t.Errorf("diff:\n%s\nwant:\n%s", r.Diff, want.String())
	}
	if m := r.Margin; !(m > 1e-14 && m < 1e-12) {
		t.Errorf("margin %g, want the largest estimates on the grid, ~1e-13", m)
	}
	// A long diff stops after 50 levels.
	r, err = exact.Check(offset{d: 1e-6}, exact.Grid{Fields: linspace(1, 2, 13), Levels: 5})
	if err != nil {
		t.Fatal(err)
	}
	if n := strings.Count(r.Diff, "\n"); n != 101 || !strings.HasSuffix(r.Diff, "… and 15 more levels beyond the margin\n") {
		t.Errorf("diff of 65 levels has %d lines, want 2×50 and one for the 15 more:\n%s", n, r.Diff)
	}
}

// TestCheckReport looks inside the report of the 1e-6 offset.
func TestCheckReport(t *testing.T) {
	t.Parallel()
	g := smallGrid
	g.Tol = 1e-7
	r, err := exact.Check(offset{d: 1e-6}, g)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(r.Abs.Value-1e-6) > 1e-12 {
		t.Errorf("worst absolute error %g, want 1e-6", r.Abs.Value)
	}
	// The relative error is largest where |η| is smallest: the ground
	// level at f = 10, η₁ = 0.0660262957550905 (computed independently at
	// high precision (mpmath); internal/bigairy gives 0.06602629575509051632
	// at 200 bits).
	if r.Rel.F != 10 || r.Rel.N != 1 || math.Abs(r.Rel.Value-1e-6/0.0660262957550905) > 1e-9 {
		t.Errorf("worst relative error %+v, want 1e-6/0.066 at f=10 n=1", r.Rel)
	}
	if r.Undershoots != 15 || len(r.Undershot) != 10 || r.Beyond != 15 {
		t.Errorf("undershoots %d (listed %d), beyond %d; want 15 (10), 15", r.Undershoots, len(r.Undershot), r.Beyond)
	}
	if len(r.Violations) != 0 {
		t.Errorf("violations for a contract-keeping solver: %q", r.Violations)
	}
	s := r.String()
	// The diff shows both energies as strconv formats a float64, the
	// shortest text that reads back the same.
	e1, err := exact.Solver{}.Level(10, 1)
	if err != nil {
		t.Fatal(err)
	}
	shifted := "+f=10 n=1: " + strconv.FormatFloat(e1.Energy+1e-6, 'g', -1, 64) + "\n"
	exact1 := "-f=10 n=1: " + strconv.FormatFloat(e1.Energy, 'g', -1, 64) + "\n"
	for _, want := range []string{"FAIL", "(-want +got)", exact1 + "    " + shifted, "undershot", "… and 5 more", "tolerance 1e-07: 15 levels beyond it"} {
		if !strings.Contains(s, want) {
			t.Errorf("report lacks %q:\n%s", want, s)
		}
	}
	// A passing solver has an empty diff.
	r, err = exact.Check(sineBasis{size: 40, claim: 1e-8}, smallGrid)
	if err != nil {
		t.Fatal(err)
	}
	if r.Diff != "" || !strings.Contains(r.String(), ": ok\n") {
		t.Errorf("passing solver has a diff or no ok:\n%s", r)
	}
	if r.Waves == nil || r.Waves.Norm.Value > 1e-12 || r.Waves.Overlap.Value < 1-1e-12 {
		t.Errorf("sine-basis wavefunctions: %+v, want normalized and overlapping exact to 1e-12", r.Waves)
	}
}

// faulty breaks one rule of the Solver contract at a time.
type faulty struct{ fault string }

func (s faulty) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	if s.fault != "no-checks" && s.fault != "panic" {
		if err := tiltwell.CheckArgs("faulty", f, k, 0, 0); err != nil {
			if s.fault == "error-with-levels" {
				return append(dst[:0], tiltwell.Level{N: 1}), err
			}
			return dst[:0], err
		}
	}
	if s.fault == "panic" && k < 1 {
		panic("k < 1")
	}
	if s.fault == "fresh-dst" {
		dst = nil
	}
	dst, err := exact.Solver{}.Levels(dst[:0], f, max(k, 1))
	if err != nil && s.fault != "no-checks" {
		return dst, err
	}
	switch s.fault {
	case "asymmetric":
		if f < 0 {
			dst[0].Energy += 1e-3
		}
	case "unsorted":
		dst[0], dst[1] = dst[1], dst[0]
		dst[0].N, dst[1].N = 1, 2
	case "short":
		dst = dst[:k-1]
	case "nan-err":
		dst[1].Err = math.NaN()
	case "negative-err":
		dst[1].Err = -1e-3
	case "bad-bound":
		dst[2].Bound = 7
	}
	return dst, nil
}

func TestCheckContract(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		fault string
		want  string // in a violation
	}{
		{"no-checks", "want one wrapping"},
		{"panic", "panic: k < 1"},
		{"error-with-levels", "1 levels with the error, want 0"},
		{"fresh-dst", "did not append to dst[:0]"},
		{"asymmetric", "at ±f differ"},
		{"unsorted", "below level"},
		{"short", "returned 2 levels, want 3"},
		{"nan-err", "error estimate NaN"},
		{"negative-err", "error estimate -0.001"},
		{"bad-bound", "unknown bound kind"},
	} {
		t.Run("fault="+tc.fault, func(t *testing.T) {
			t.Parallel()
			r, err := exact.Check(faulty{tc.fault}, smallGrid)
			if err != nil {
				t.Fatal(err)
			}
			if r.OK() {
				t.Errorf("a solver with fault %q passed:\n%s", tc.fault, r)
			}
			if !strings.Contains(strings.Join(r.Violations, "\n"), tc.want) {
				t.Errorf("no violation mentions %q:\n%s", tc.want, r)
			}
		})
	}
	// The harness itself: the unfaulted solver passes.
	if r, err := exact.Check(faulty{}, smallGrid); err != nil || !r.OK() {
		t.Errorf("unfaulted solver: %v\n%s", err, r)
	}
}

func TestCheckWaveContract(t *testing.T) {
	t.Parallel()
	g := exact.Grid{Fields: []float64{0.5, -4}, Levels: 2}
	for _, tc := range []struct {
		name string
		s    sineBasis
		want string
	}{
		{"flipped", sineBasis{size: 60, claim: 1e-8, flipWave: true}, "sign convention"},
		{"scaled", sineBasis{size: 60, claim: 1e-8, scaleWave: 1.01}, "∫φ² = 1.0201"},
		{"leaky", sineBasis{size: 60, claim: 1e-8, leakWave: true}, "want 0 outside [0, 1]"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			t.Parallel()
			r, err := exact.Check(tc.s, g)
			if err != nil {
				t.Fatal(err)
			}
			if r.OK() || !strings.Contains(strings.Join(r.Violations, "\n"), tc.want) {
				t.Errorf("want a failure mentioning %q:\n%s", tc.want, r)
			}
		})
	}
}

func TestCheckBadInput(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name string
		s    tiltwell.Solver
		g    exact.Grid
		want error
	}{
		{"solver=nil", nil, smallGrid, tiltwell.ErrNoSolver},
		{"fields=none", exact.Solver{}, exact.Grid{Levels: 3}, tiltwell.ErrField},
		{"f=NaN", exact.Solver{}, exact.Grid{Fields: []float64{1, math.NaN()}, Levels: 3}, tiltwell.ErrField},
		{"f=-Inf", exact.Solver{}, exact.Grid{Fields: []float64{math.Inf(-1)}, Levels: 3}, tiltwell.ErrField},
		{"f=2e5", exact.Solver{}, exact.Grid{Fields: []float64{2e5}, Levels: 3}, tiltwell.ErrOutOfRange},
		{"k=0", exact.Solver{}, exact.Grid{Fields: []float64{1}}, tiltwell.ErrLevel},
		{"k=1001", exact.Solver{}, exact.Grid{Fields: []float64{1}, Levels: exact.MaxLevels + 1}, tiltwell.ErrLevel},
		{"tol=-1e-9", exact.Solver{}, exact.Grid{Fields: []float64{1}, Levels: 1, Tol: -1e-9}, tiltwell.ErrUnits},
		{"tol=NaN", exact.Solver{}, exact.Grid{Fields: []float64{1}, Levels: 1, Tol: math.NaN()}, tiltwell.ErrUnits},
		{"ratio=-10", exact.Solver{}, exact.Grid{Fields: []float64{1}, Levels: 1, MaxRatio: -10}, tiltwell.ErrUnits},
	} {
		t.Run(tc.name, func(t *testing.T) {
			t.Parallel()
			r, err := exact.Check(tc.s, tc.g)
			if !errors.Is(err, tc.want) || r != nil {
				t.Errorf("error %v, report %v; want an error wrapping %v and no report", err, r, tc.want)
			}
		})
	}
}

// recordTB is a testing.TB that records failures instead of failing.
type recordTB struct {
	testing.TB
	errors, fatals []string
}

func (r *recordTB) Helper() {}
func (r *recordTB) Errorf(format string, args ...any) {
	r.errors = append(r.errors, fmt.Sprintf(format, args...))
}
func (r *recordTB) Fatalf(format string, args ...any) {
	r.fatals = append(r.fatals, fmt.Sprintf(format, args...))
}

func TestTestSolver(t *testing.T) {
	t.Parallel()
	var pass recordTB
	if r := exacttest.TestSolver(&pass, sineBasis{size: 40, claim: 1e-8}, smallGrid); r == nil || len(pass.errors)+len(pass.fatals) != 0 {
		t.Errorf("right solver failed the test: %q %q", pass.errors, pass.fatals)
	}
	var fail recordTB
	exacttest.TestSolver(&fail, offset{d: 1e-6}, smallGrid)
	if len(fail.errors) != 1 || !strings.Contains(fail.errors[0], "exact.Check of exact_test.offset") || !strings.Contains(fail.errors[0], "(-want +got)") {
		t.Errorf("wrong solver: errors %q, want one carrying the report", fail.errors)
	}
	var bad recordTB
	if r := exacttest.TestSolver(&bad, offset{}, exact.Grid{}); r != nil || len(bad.fatals) != 1 {
		t.Errorf("empty grid: report %v, fatals %q; want nil and one fatal", r, bad.fatals)
	}
}
