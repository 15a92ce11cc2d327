package tiltwell_test

import (
	"errors"
	"fmt"
	"math"
	"testing"
	"time"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/perturb"
	"github.com/tiltwell/tiltwell/wkb"
)

// flatSolver is a cheap test solver: η_n = n² at every field (the f = 0
// levels, see the package documentation) with a fixed claimed error, and
// an optional field limit.
type flatSolver struct {
	err      float64
	maxField float64
}

func (s flatSolver) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	dst = dst[:0]
	if err := tiltwell.CheckArgs("flat", f, k, 0, s.maxField); err != nil {
		return dst, err
	}
	for n := 1; n <= k; n++ {
		dst = append(dst, tiltwell.Level{N: n, Energy: float64(n * n), Err: s.err})
	}
	return dst, nil
}

// slowSolver is flatSolver that spins for delay on every call, standing in
// for an accurate but expensive method.
type slowSolver struct {
	flatSolver
	delay time.Duration
}

func (s slowSolver) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	for t0 := time.Now(); time.Since(t0) < s.delay; {
	}
	return s.flatSolver.Levels(dst, f, k)
}

// growingSolver claims an error that grows with |f| and n, so that the
// worst level is known: |f| n × 1e-6.
type growingSolver struct{}

func (growingSolver) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	dst = dst[:0]
	if err := tiltwell.CheckArgs("growing", f, k, 0, 0); err != nil {
		return dst, err
	}
	for n := 1; n <= k; n++ {
		dst = append(dst, tiltwell.Level{N: n, Energy: float64(n * n), Err: math.Abs(f) * float64(n) * 1e-6})
	}
	return dst, nil
}

// brokenSolver breaks the contract: a NaN error estimate.
type brokenSolver struct{}

func (brokenSolver) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	dst = dst[:0]
	for n := 1; n <= k; n++ {
		dst = append(dst, tiltwell.Level{N: n, Energy: float64(n * n), Err: math.NaN()})
	}
	return dst, nil
}

// shortSolver breaks the contract: it returns one level fewer than asked.
type shortSolver struct{}

func (shortSolver) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	dst = dst[:0]
	for n := 1; n < k; n++ {
		dst = append(dst, tiltwell.Level{N: n, Energy: float64(n * n)})
	}
	return dst, nil
}

var (
	cheap  = tiltwell.Candidate{Name: "cheap", Solver: flatSolver{err: 1e-3}}
	costly = tiltwell.Candidate{Name: "costly", Solver: slowSolver{flatSolver{err: 1e-12}, 20 * time.Microsecond}}
)

func TestChoosePicks(t *testing.T) {
	t.Parallel()
	fields := []float64{-10, 0, 1, 10, 100}
	for _, tc := range []struct {
		name  string
		cands []tiltwell.Candidate
		tol   float64
		want  string
		met   []bool
	}{
		// The cheap method is good enough: it must win on cost.
		{"tol=1e-2/cheap-first", []tiltwell.Candidate{cheap, costly}, 1e-2, "cheap", []bool{true, true}},
		{"tol=1e-2/costly-first", []tiltwell.Candidate{costly, cheap}, 1e-2, "cheap", []bool{true, true}},
		// The tolerance is exactly the cheap method's claim: Err ≤ tol meets.
		{"tol=1e-3", []tiltwell.Candidate{costly, cheap}, 1e-3, "cheap", []bool{true, true}},
		// Only the accurate one is good enough.
		{"tol=1e-6", []tiltwell.Candidate{cheap, costly}, 1e-6, "costly", []bool{false, true}},
		// A cheap method that stops at |f| = 10 cannot cover the range.
		{"tol=1e-2/limited", []tiltwell.Candidate{{Name: "limited", Solver: flatSolver{err: 1e-3, maxField: 10}}, costly}, 1e-2, "costly", []bool{false, true}},
		// A candidate that breaks the contract is never chosen.
		{"tol=1e-2/nan", []tiltwell.Candidate{{Name: "nan", Solver: brokenSolver{}}, costly}, 1e-2, "costly", []bool{false, true}},
		{"tol=1e-2/short", []tiltwell.Candidate{{Name: "short", Solver: shortSolver{}}, costly}, 1e-2, "costly", []bool{false, true}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			t.Parallel()
			ch, err := tiltwell.Choose(tc.cands, tc.tol, fields, 3)
			if err != nil {
				t.Fatalf("Choose: %v", err)
			}
			if ch.Name != tc.want {
				t.Errorf("chose %q, want %q; trials %+v", ch.Name, tc.want, ch.Trials)
			}
			if ch.Solver == nil {
				t.Errorf("chose %q with a nil Solver", ch.Name)
			}
			if len(ch.Trials) != len(tc.cands) {
				t.Fatalf("%d trials for %d candidates", len(ch.Trials), len(tc.cands))
			}
			for i, tr := range ch.Trials {
				if tr.Name != tc.cands[i].Name {
					t.Errorf("trial %d is %q, want %q (input order)", i, tr.Name, tc.cands[i].Name)
				}
				if tr.Met != tc.met[i] {
					t.Errorf("%s: Met = %v, want %v", tr.Name, tr.Met, tc.met[i])
				}
				if tr.Err == nil && (tr.Stats.PerLevel <= 0 || tr.Stats.Calls < len(fields)) {
					t.Errorf("%s: stats %+v, want a positive time over at least one pass", tr.Name, tr.Stats)
				}
			}
		})
	}
}

func TestChooseTrialErrors(t *testing.T) {
	t.Parallel()
	cands := []tiltwell.Candidate{
		{Name: "limited", Solver: flatSolver{err: 1e-3, maxField: 10}},
		{Name: "nan", Solver: brokenSolver{}},
		{Name: "short", Solver: shortSolver{}},
	}
	ch, err := tiltwell.Choose(cands, 1, []float64{1, 50}, 2)
	if !errors.Is(err, tiltwell.ErrNoneMeets) {
		t.Fatalf("Choose: error %v, want one wrapping ErrNoneMeets", err)
	}
	if ch.Solver != nil || ch.Name != "" {
		t.Errorf("chose %q although nothing met the tolerance", ch.Name)
	}
	for i, want := range []error{tiltwell.ErrOutOfRange, tiltwell.ErrNoConvergence, tiltwell.ErrLevel} {
		tr := ch.Trials[i]
		if !errors.Is(tr.Err, want) {
			t.Errorf("%s: Err = %v, want one wrapping %v", tr.Name, tr.Err, want)
		}
		if tr.Met || tr.Stats != (tiltwell.Stats{}) {
			t.Errorf("%s: failed candidate has Met = %v, stats %+v", tr.Name, tr.Met, tr.Stats)
		}
	}
}

func TestChooseWorst(t *testing.T) {
	t.Parallel()
	// growingSolver claims |f| n 1e-6: the worst is at the largest |f|,
	// here the negative end, and the highest level.
	fields := []float64{-30, -1, 0, 2, 20}
	ch, err := tiltwell.Choose([]tiltwell.Candidate{{Name: "growing", Solver: growingSolver{}}}, 1e-3, fields, 4)
	if err != nil {
		t.Fatal(err)
	}
	tr := ch.Trials[0]
	if tr.F != -30 || tr.Worst.N != 4 || tr.Worst.Err != math.Abs(-30)*4*1e-6 {
		t.Errorf("worst at f = %v, level %+v; want f = -30, N = 4, Err = 1.2e-4", tr.F, tr.Worst)
	}
	// 1.2e-4 > 1e-4: the same candidate fails a tighter tolerance.
	if _, err := tiltwell.Choose([]tiltwell.Candidate{{Name: "growing", Solver: growingSolver{}}}, 1e-4, fields, 4); !errors.Is(err, tiltwell.ErrNoneMeets) {
		t.Errorf("tol = 1e-4: error %v, want ErrNoneMeets", err)
	}
}

func TestChooseBadInput(t *testing.T) {
	t.Parallel()
	ok := []tiltwell.Candidate{cheap}
	fields := []float64{0, 1}
	for _, tc := range []struct {
		name   string
		cands  []tiltwell.Candidate
		tol    float64
		fields []float64
		k      int
		want   error
	}{
		{"candidates=none", nil, 1e-3, fields, 1, tiltwell.ErrNoSolver},
		{"candidates=empty", []tiltwell.Candidate{}, 1e-3, fields, 1, tiltwell.ErrNoSolver},
		{"candidates=nil-solver", []tiltwell.Candidate{cheap, {Name: "nil"}}, 1e-3, fields, 1, tiltwell.ErrNoSolver},
		{"tol=0", ok, 0, fields, 1, tiltwell.ErrUnits},
		{"tol=-1e-3", ok, -1e-3, fields, 1, tiltwell.ErrUnits},
		{"tol=NaN", ok, math.NaN(), fields, 1, tiltwell.ErrUnits},
		{"tol=+Inf", ok, math.Inf(1), fields, 1, tiltwell.ErrUnits},
		{"fields=none", ok, 1e-3, nil, 1, tiltwell.ErrField},
		{"f=NaN", ok, 1e-3, []float64{0, math.NaN()}, 1, tiltwell.ErrField},
		{"f=-Inf", ok, 1e-3, []float64{math.Inf(-1)}, 1, tiltwell.ErrField},
		{"k=0", ok, 1e-3, fields, 0, tiltwell.ErrLevel},
		{"k=-2", ok, 1e-3, fields, -2, tiltwell.ErrLevel},
	} {
		t.Run(tc.name, func(t *testing.T) {
			t.Parallel()
			ch, err := tiltwell.Choose(tc.cands, tc.tol, tc.fields, tc.k)
			if !errors.Is(err, tc.want) {
				t.Fatalf("error %v, want one wrapping %v", err, tc.want)
			}
			if ch.Solver != nil || ch.Trials != nil {
				t.Errorf("bad input still gave a choice: %+v", ch)
			}
		})
	}
}

// TestChooseDoesNotMutate checks that the caller's slices are left alone.
func TestChooseDoesNotMutate(t *testing.T) {
	t.Parallel()
	cands := []tiltwell.Candidate{costly, cheap}
	fields := []float64{3, -2, 0}
	if _, err := tiltwell.Choose(cands, 1e-2, fields, 2); err != nil {
		t.Fatal(err)
	}
	if cands[0].Name != "costly" || cands[1].Name != "cheap" {
		t.Errorf("candidates reordered: %v, %v", cands[0].Name, cands[1].Name)
	}
	if got := fmt.Sprint(fields); got != "[3 -2 0]" {
		t.Errorf("fields changed to %v", got)
	}
}

type panicky struct{}

func (panicky) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	panic("broken candidate")
}

type nilSolver struct{ x *int }

func (s *nilSolver) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	_ = *s.x
	return dst, nil
}

// TestChoosePanickingCandidate checks that a candidate that panics, or a
// typed nil Solver, is recorded as failed instead of crashing Choose.
func TestChoosePanickingCandidate(t *testing.T) {
	var typedNil *nilSolver
	good := tiltwell.Candidate{Name: "good", Solver: flatSolver{err: 1e-9}}
	ch, err := tiltwell.Choose([]tiltwell.Candidate{{Name: "panics", Solver: panicky{}}, {Name: "typed-nil", Solver: typedNil}, good}, 1e-6, []float64{1}, 2)
	if err != nil {
		t.Fatal(err)
	}
	if ch.Name != "good" {
		t.Errorf("chose %q", ch.Name)
	}
	for _, tr := range ch.Trials[:2] {
		if tr.Err == nil || tr.Met {
			t.Errorf("%s: trial %+v, want a recorded failure", tr.Name, tr)
		}
	}
}

// BenchmarkChoose times one Choose call among perturb2, wkb and exact over
// 5 fields in [0, 1] and 3 levels: at tol=1e-3 all three meet the
// tolerance and perturb2 wins; at tol=1e-8 only exact does. The ms per
// call is the cost stated in Choose's documentation.
func BenchmarkChoose(b *testing.B) {
	cands := []tiltwell.Candidate{
		{Name: "perturb2", Solver: perturb.Solver{Order: 2}},
		{Name: "wkb", Solver: wkb.Solver{}},
		{Name: "exact", Solver: exact.Solver{}},
	}
	fields := []float64{0, 0.25, 0.5, 0.75, 1}
	for _, tol := range []float64{1e-3, 1e-8} {
		b.Run(fmt.Sprintf("tol=%g/fields=5/k=3", tol), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := tiltwell.Choose(cands, tol, fields, 3); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
