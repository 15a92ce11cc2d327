package tiltwell

import (
	"fmt"
	"math"
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
	// Worst is the level with the largest error estimate Err over all the
	// fields and levels asked for, and F the reduced field where it was
	// found. If the candidate returned an error, Worst is the zero Level.
	Worst Level
	F     float64
	// Met reports whether every level's Err was at most the tolerance and
	// the candidate returned no error.
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
	// of repeated passes of Levels calls over all the fields, divided by
	// the number of levels in a pass. It is 0 if the candidate returned an
	// error.
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
	// Trials has one entry per candidate, in the order given.
	Trials []Trial
}

// timeBudget is how long Choose keeps repeating a candidate's Levels calls
// over the fields to time it: long enough that the timer resolution and a
// single cold call do not dominate, short enough that choosing among a
// handful of fast methods takes milliseconds.
const timeBudget = 2 * time.Millisecond

// slowPass is the duration of a first pass over the fields beyond which
// Choose times that pass alone instead of repeating the calls.
const slowPass = 50 * time.Millisecond

// Choose returns the cheapest candidate whose own error estimates meet the
// tolerance: a candidate meets tol if, at every reduced field in fields,
// Levels(dst, f, k) returns no error and every one of the k levels has
// Err ≤ tol (tol is absolute, in units of E₁). The cost is the measured
// time per level on this machine (see [Stats]); of two equally cheap
// candidates the earlier one wins.
//
// Choose judges candidates by their own estimates, the [Level.Err] they
// report; it has no reference to compare with. To test that a method's
// estimates are honest, use the exact package's Check.
//
// Choose calls the candidates one after another, never concurrently, so
// that the timings are not disturbed. To choose over a field range rather
// than a list, sample it, for instance with gonum's floats.Span, and
// include both ends.
//
// Choose returns an error, and no choice, for an empty candidate list
// or a nil Solver (wrapping [ErrNoSolver]), for tol that is not a
// positive finite number ([ErrUnits]), for an empty field list or a NaN or
// infinite field ([ErrField]), and for k < 1 ([ErrLevel]). If no candidate
// meets the tolerance, Choose returns the Choice with every Trial filled
// in, Name "" and Solver nil, and an error wrapping [ErrNoneMeets]. An
// error from a candidate is recorded in its Trial, not returned.
func Choose(candidates []Candidate, tol float64, fields []float64, k int) (Choice, error) {
	if len(candidates) == 0 {
		return Choice{}, fmt.Errorf("tiltwell: choose: %w", ErrNoSolver)
	}
	for i, c := range candidates {
		if c.Solver == nil {
			return Choice{}, fmt.Errorf("tiltwell: choose: candidate %d (%q) has a nil Solver: %w", i, c.Name, ErrNoSolver)
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
	if k < 1 {
		return Choice{}, fmt.Errorf("tiltwell: choose: %d levels requested, need at least 1: %w", k, ErrLevel)
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
	return ch, nil
}

// try runs one candidate over the fields: one pass to collect its error
// estimates, then timed passes until timeBudget has elapsed.
func try(c Candidate, tol float64, fields []float64, k int, dst []Level) (tr Trial) {
	// A candidate that panics (a bug in it, or a typed nil Solver) is
	// recorded as failed, like one that returns an error.
	defer func() {
		if r := recover(); r != nil {
			tr = Trial{Name: c.Name, Err: fmt.Errorf("tiltwell: choose: candidate %q panicked: %v: %w", c.Name, r, ErrNoSolver)}
		}
	}()
	tr = Trial{Name: c.Name, Met: true}
	worst := -1.0
	start := time.Now()
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
			if l.Err > worst {
				worst = l.Err
				tr.Worst = l
				tr.F = f
			}
			if !(l.Err <= tol) {
				tr.Met = false
			}
		}
	}
	// The first pass pays one-time costs (tables built on first use, cold
	// caches), so it is timed only when it was already slow enough for
	// them not to matter. Otherwise passes are repeated for timeBudget and
	// the fastest counts: other work on the machine only ever adds time,
	// so the minimum is the least disturbed measurement.
	fastest, calls := time.Since(start), len(fields)
	if fastest < slowPass {
		fastest, calls = time.Duration(math.MaxInt64), 0
		for spent := time.Duration(0); calls == 0 || spent < timeBudget; {
			t0 := time.Now()
			for _, f := range fields {
				dst, _ = c.Solver.Levels(dst, f, k)
			}
			d := time.Since(t0)
			spent += d
			fastest = min(fastest, d)
			calls += len(fields)
		}
	}
	tr.Stats = Stats{PerLevel: fastest / time.Duration(len(fields)*k), Calls: calls}
	return tr
}

// checkLevels reports a Levels result that breaks the Solver contract in a
// way that would make its estimates meaningless.
func checkLevels(ls []Level, k int) error {
	if len(ls) != k {
		return fmt.Errorf("returned %d levels, want %d: %w", len(ls), k, ErrLevel)
	}
	for i, l := range ls {
		if l.N != i+1 {
			return fmt.Errorf("level %d has N = %d: %w", i+1, l.N, ErrLevel)
		}
		if math.IsNaN(l.Energy) || math.IsNaN(l.Err) || l.Err < 0 {
			return fmt.Errorf("level %d: energy %v, error estimate %v: %w", l.N, l.Energy, l.Err, ErrNoConvergence)
		}
	}
	return nil
}
