package tiltwell

import (
	"errors"
	"fmt"
	"math"
)

// Sentinel errors. Every method package wraps one of these, so that
// errors.Is(err, tiltwell.ErrField) and the like work whichever method
// returned the error.
var (
	// ErrField reports a field that is NaN or infinite.
	ErrField = errors.New("tiltwell: field is not a finite number")
	// ErrLevel reports a level count or level number the method cannot
	// produce: k < 1, n < 1, or beyond the method's supported levels.
	ErrLevel = errors.New("tiltwell: level not available")
	// ErrOutOfRange reports a finite field outside the range where the
	// method is valid or supported.
	ErrOutOfRange = errors.New("tiltwell: field outside the method's range")
	// ErrNoConvergence reports an iteration that did not converge.
	ErrNoConvergence = errors.New("tiltwell: no convergence")
	// ErrUnits reports a physical parameter that is not usable: a width,
	// mass, tolerance or temperature that is not a finite positive number,
	// a well outside the plausible range [NewWell] accepts, a bad layer of
	// a [Stack] or [Structure], or a material composition outside its
	// range.
	ErrUnits = errors.New("tiltwell: invalid physical parameter")
	// ErrNoSolver reports a missing solver: an empty candidate list for
	// [Choose], or a nil [Solver] where one is needed.
	ErrNoSolver = errors.New("tiltwell: no solver given")
	// ErrNoneMeets reports that no candidate's own error estimates met the
	// tolerance; [Choose] still returns the report of every candidate.
	ErrNoneMeets = errors.New("tiltwell: no candidate meets the tolerance")
	// ErrPanic reports a panic in code the caller supplied (a solver, its
	// wavefunctions, or a potential it calls) that [Choose] or
	// [Pair.Sweep] recovered and turned into an error. Only panics on the
	// calling goroutines are recovered: a panic on a goroutine the
	// supplied code starts itself still ends the program.
	ErrPanic = errors.New("tiltwell: supplied code panicked")
)

// RangeError is returned for a finite field outside the range a method
// supports. It wraps [ErrOutOfRange].
type RangeError struct {
	// Method names the method, such as "perturb".
	Method string
	// F is the reduced field that was asked for.
	F float64
	// Limit is the largest |f| the method accepts.
	Limit float64
}

func (e *RangeError) Error() string {
	return fmt.Sprintf("%s: |f| = %g beyond the supported limit %g: %v", e.Method, math.Abs(e.F), e.Limit, ErrOutOfRange)
}

// Unwrap returns [ErrOutOfRange].
func (e *RangeError) Unwrap() error { return ErrOutOfRange }

// CheckArgs validates the arguments of [Solver.Levels] for a method named
// method that supports levels 1..maxLevel and fields |f| ≤ maxField. A
// maxLevel ≤ 0, or a maxField that is not a positive number (0, negative
// or NaN), means no limit. The returned error is prefixed
// with method and wraps [ErrField], [ErrLevel] or [ErrOutOfRange] (as a
// [*RangeError]); it is nil if the arguments are acceptable.
func CheckArgs(method string, f float64, k, maxLevel int, maxField float64) error {
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return fmt.Errorf("%s: f = %v: %w", method, f, ErrField)
	}
	if k < 1 {
		return fmt.Errorf("%s: %d levels requested, need at least 1: %w", method, k, ErrLevel)
	}
	if maxLevel > 0 && k > maxLevel {
		return fmt.Errorf("%s: %d levels requested, at most %d supported: %w", method, k, maxLevel, ErrLevel)
	}
	if maxField > 0 && math.Abs(f) > maxField {
		return &RangeError{Method: method, F: f, Limit: maxField}
	}
	return nil
}
