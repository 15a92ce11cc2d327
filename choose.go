package tiltwell

import (
	"fmt"
	"math"
	"reflect"
	"time"
)

// Candidate is a named [Solver] offered to [Choose].
type Candidate struct {
	// Name identifies the candidate in the report, such as "wkb".
	Name string
	// Solver is the method. It must not be nil.
	Solver Solver
}

// Trial is what [Choose] found out about one candidate.
type Trial struct {
	// Name is the candidate's name.
	Name string
	// Worst is the level with the largest error estimate, max(Err,
	// GammaErr), over all the fields and levels asked for, and F the
	// reduced field where it was found. If the candidate returned an
	// error, Worst is the zero Level.
	Worst Level
	F     float64
	// Met reports whether every level's Err and GammaErr were at most the
	// tolerance and the candidate returned no error.
	Met bool
	// Err is the first error the candidate returned (in field order), or
	// an error describing a broken [Solver] contract (too few levels, a NaN
	// or negative Err); nil if there was none.
	Err error
	// Stats is the measured cost. It depends on the machine and the load
	// on it; tests should ignore it.
	Stats Stats
}

// Stats is the cost of a candidate measured by [Choose] on this machine.
type Stats struct {
	// PerLevel is the wall-clock time per level: the time of the fastest
	// of repeated passes of Levels calls over all the fields (after an
	// untimed first pass), divided by the number of levels in a pass. It
	// is 0 if the candidate returned an error.
	PerLevel time.Duration
	// Calls is the number of Levels calls that were timed, over all
	// passes.
	Calls int
}

// Choice is the result of [Choose].
type Choice struct {
	// Name and Solver are the chosen candidate; Solver is nil if no
	// candidate met the tolerance.
	Name   string
	Solver Solver
	// WaveSolver is Solver as a [WaveSolver] when it is one (every method
	// of this module is), ready for [Pair.Sweep]; nil otherwise.
	WaveSolver WaveSolver
	// Trials has one entry per candidate, in the order given.
	Trials []Trial
}

// MaxLevelRequest is the largest number of levels [Choose] accepts, and
// the highest level number a [Transition] may name in [Pair.Sweep]. It
// bounds the memory a request can ask for before any solver sees it; the
// methods of this module support at most 1000 levels (the exact
// package's MaxLevels).
const MaxLevelRequest = 10000

// Timing. After one untimed pass over the fields, which collects the
// error estimates and pays one-time costs (tables built on first use, cold
// caches), Choose times one pass, then repeats batches of passes, each
// batch long enough (minBatch) for the timer's resolution not to matter,
// up to timedBatches batches or until timeBudget has been spent timing.
// The fastest pass counts: other work on the machine only ever adds time,
// so the minimum is the least disturbed measurement.
const (
	minBatch     = 10 * time.Microsecond
	timedBatches = 5
	timeBudget   = 2 * time.Millisecond
)

// Choose returns the cheapest candidate whose own error estimates meet the
// tolerance: a candidate meets tol if, at every reduced field in fields,
// Levels(dst, f, k) returns no error and every one of the k levels has
// Err ≤ tol and GammaErr ≤ tol (tol is absolute, in units of E₁: the
// escape width Γ is the imaginary part of the level, and a method that
// cannot see escape declares the width it misses in GammaErr). The cost is the measured
// time per level on this machine (see [Stats]); of two equally cheap
// candidates the earlier one wins.
//
// For a physical well w (see [Well]), a tolerance of 0.1 meV is
// w.FromMilliEV(0.1), and a field F in V/m is w.Reduced(F):
//
//	ch, err := tiltwell.Choose(cands, w.FromMilliEV(0.1), fields, 3)
//
// The chosen solver is ch.Solver, and ch.WaveSolver for [Pair.Sweep].
//
// Choose judges candidates by their own estimates, the [Level.Err] they
// report; it has no reference to compare with. To test that a method's
// estimates are honest, use the exact package's Check.
//
// Choose calls the candidates one after another, never concurrently, so
// that the timings are not disturbed. Every candidate makes one untimed
// pass over the fields first, so a table a method builds on first use is
// never counted as its cost. Beyond that pass, timing a candidate costs
// about 60 µs when a pass over the fields is fast (five batches of 10 µs
// and one pass), and one to six more passes, within 2 ms, when it is
// slow: one call with second-order perturbation theory, WKB and the exact
// solver on 5 fields and 3 levels takes 0.2–0.4 ms (BenchmarkChoose), the
// time of about a thousand exact level solves. To choose over a field
// range rather than a list, sample it, for instance with gonum's
// floats.Span, and include both ends.
//
// Choose returns an error, and no choice, for an empty candidate list
// or a nil Solver, including a nil pointer or func in the interface
// (wrapping [ErrNoSolver]), for tol that is not a positive finite number
// ([ErrUnits]), for an empty field list or a NaN or infinite field
// ([ErrField]), and for k < 1 or k > [MaxLevelRequest] ([ErrLevel]). If
// no candidate meets the tolerance, Choose returns the Choice with every
// Trial filled in, Name "" and Solver nil, and an error wrapping
// [ErrNoneMeets]. An error from a candidate is recorded in its Trial, not
// returned; so is a candidate that breaks the [Solver] contract (too few
// levels, or a NaN, infinite or negative value in a Level: [ErrLevel] or
// [ErrNoConvergence]) or panics ([ErrPanic]).
func Choose(candidates []Candidate, tol float64, fields []float64, k int) (Choice, error) {
	if len(candidates) == 0 {
		return Choice{}, fmt.Errorf("tiltwell: choose: %w", ErrNoSolver)
	}
	for i, c := range candidates {
		if c.Solver == nil {
			return Choice{}, fmt.Errorf("tiltwell: choose: candidate %d (%q) has a nil Solver: %w", i, c.Name, ErrNoSolver)
		}
		if isNil(c.Solver) {
			return Choice{}, fmt.Errorf("tiltwell: choose: candidate %d (%q) has a nil %T as its Solver: %w", i, c.Name, c.Solver, ErrNoSolver)
		}
	}
	if !(tol > 0) || math.IsInf(tol, 0) {
		return Choice{}, fmt.Errorf("tiltwell: choose: tolerance %v is not a positive finite number: %w", tol, ErrUnits)
	}
	if len(fields) == 0 {
		return Choice{}, fmt.Errorf("tiltwell: choose: no fields given: %w", ErrField)
	}
	for _, f := range fields {
		if math.IsNaN(f) || math.IsInf(f, 0) {
			return Choice{}, fmt.Errorf("tiltwell: choose: f = %v: %w", f, ErrField)
		}
	}
	if k < 1 || k > MaxLevelRequest {
		return Choice{}, fmt.Errorf("tiltwell: choose: %d levels requested, want 1 to %d: %w", k, MaxLevelRequest, ErrLevel)
	}

	ch := Choice{Trials: make([]Trial, len(candidates))}
	dst := make([]Level, 0, k)
	best := -1
	for i, c := range candidates {
		tr := try(c, tol, fields, k, dst)
		ch.Trials[i] = tr
		if tr.Met && (best < 0 || tr.Stats.PerLevel < ch.Trials[best].Stats.PerLevel) {
			best = i
		}
	}
	if best < 0 {
		return ch, fmt.Errorf("tiltwell: choose: tolerance %g over %d fields and %d levels: %w", tol, len(fields), k, ErrNoneMeets)
	}
	ch.Name = candidates[best].Name
	ch.Solver = candidates[best].Solver
	ch.WaveSolver, _ = ch.Solver.(WaveSolver)
	return ch, nil
}

// try runs one candidate over the fields: one pass to collect its error
// estimates, then the timed passes (see minBatch).
func try(c Candidate, tol float64, fields []float64, k int, dst []Level) (tr Trial) {
	// A candidate that panics is recorded as failed, like one that
	// returns an error.
	defer func() {
		if r := recover(); r != nil {
			tr = Trial{Name: c.Name, Err: fmt.Errorf("tiltwell: choose: candidate %q panicked: %v: %w", c.Name, r, ErrPanic)}
		}
	}()
	tr = Trial{Name: c.Name, Met: true}
	worst := -1.0
	for _, f := range fields {
		var err error
		dst, err = c.Solver.Levels(dst, f, k)
		if err == nil {
			err = checkLevels(dst, k)
		}
		if err != nil {
			return Trial{Name: c.Name, Err: fmt.Errorf("tiltwell: choose: candidate %q at f = %g: %w", c.Name, f, err)}
		}
		for _, l := range dst {
			if e := max(l.Err, l.GammaErr); e > worst {
				worst = e
				tr.Worst = l
				tr.F = f
			}
			if !(l.Err <= tol && l.GammaErr <= tol) {
				tr.Met = false
			}
		}
	}

	pass := func(reps int) time.Duration {
		t0 := time.Now()
		for range reps {
			for _, f := range fields {
				dst, _ = c.Solver.Levels(dst, f, k)
			}
		}
		return time.Since(t0)
	}
	fastest := pass(1)
	spent, calls := fastest, len(fields)
	reps := 1
	if fastest < minBatch {
		reps = int(minBatch/max(fastest, time.Nanosecond)) + 1
	}
	for range timedBatches {
		if spent >= timeBudget {
			break
		}
		d := pass(reps)
		spent += d
		calls += reps * len(fields)
		fastest = min(fastest, d/time.Duration(reps))
	}
	tr.Stats = Stats{PerLevel: fastest / time.Duration(len(fields)*k), Calls: calls}
	return tr
}

// isNil reports whether v, a non-nil interface value, holds a nil pointer
// or func, on which calling a method panics.
func isNil(v any) bool {
	switch rv := reflect.ValueOf(v); rv.Kind() {
	case reflect.Pointer, reflect.Func:
		return rv.IsNil()
	}
	return false
}

// checkLevels reports a Levels result that breaks the Solver contract in a
// way that would make its numbers meaningless: a wrong count or
// numbering, or a value that is NaN, infinite or (for the error
// estimates and the width) negative.
func checkLevels(ls []Level, k int) error {
	if len(ls) != k {
		return fmt.Errorf("returned %d levels, want %d: %w", len(ls), k, ErrLevel)
	}
	for i, l := range ls {
		if l.N != i+1 {
			return fmt.Errorf("level %d has N = %d: %w", i+1, l.N, ErrLevel)
		}
		if math.IsNaN(l.Energy) || math.IsInf(l.Energy, 0) {
			return fmt.Errorf("level %d: energy %v is not a finite number: %w", l.N, l.Energy, ErrNoConvergence)
		}
		for _, v := range []struct {
			name string
			x    float64
		}{{"error estimate", l.Err}, {"escape width", l.Gamma}, {"escape width estimate", l.GammaErr}} {
			if !(v.x >= 0) || math.IsInf(v.x, 1) {
				return fmt.Errorf("level %d: %s %v is not a finite non-negative number: %w", l.N, v.name, v.x, ErrNoConvergence)
			}
		}
	}
	return nil
}
