package tiltwell

import (
	"math"
	"strconv"
)

// Bound says what kind of promise a [Level]'s error estimate makes.
//
// Programs should not rely on the underlying numeric value of a Bound being
// constant.
type Bound int

const (
	// Estimate means Err is a measured or asymptotic estimate of the error:
	// the tests hold it against the exact reference (it must cover the true
	// error on at least 99% of a grid of fields and levels), but it is not
	// proven.
	Estimate Bound = iota
	// Rigorous means Err is a proven bound: the true level lies in
	// [Energy − Err, Energy + Err], up to floating-point rounding of the
	// bound itself.
	Rigorous
)

// String returns "estimate" or "rigorous".
func (b Bound) String() string {
	switch b {
	case Estimate:
		return "estimate"
	case Rigorous:
		return "rigorous"
	}
	return "Bound(" + strconv.Itoa(int(b)) + ")"
}

// Level is one confined level computed by a method.
type Level struct {
	// N is the level number, 1 for the ground level.
	N int
	// Energy is the reduced energy η = E/E₁.
	Energy float64
	// Err is the method's own estimate of |Energy − η_true|, in units of
	// E₁. It is never negative or NaN.
	Err float64
	// Bound says whether Err is a proven bound or an estimate.
	Bound Bound
}

// Solver computes the confined levels of the tilted infinite well in reduced
// units (see the package documentation).
//
// Implementations in this module are safe for concurrent use by multiple
// goroutines: a Solver value holds configuration only. Implementations must
// not modify their configuration during a call.
type Solver interface {
	// Levels appends the lowest k levels at reduced field f, in increasing
	// order of energy with N = 1..k, to dst[:0] and returns the result. If
	// dst is nil, a new slice is allocated and returned; if dst has
	// capacity for k levels, Levels must not allocate in steady state.
	//
	// Levels must return an error, never panic, for bad input: NaN or
	// infinite f (wrapping [ErrField]), k < 1 or more levels than the
	// method supports ([ErrLevel]), and |f| beyond the method's range
	// ([ErrOutOfRange]). On error the returned slice has length 0, unless
	// the method documents that it still answers outside its range of
	// validity (the error then wraps [ErrOutOfRange]).
	//
	// Levels must not return NaN energies or error estimates, and must
	// give the same energies for f and −f (mirror symmetry; see [Fold]).
	Levels(dst []Level, f float64, k int) ([]Level, error)
}

// Wavefunction is a normalized real eigenfunction φ(ξ) of the well,
// ∫₀¹ φ² dξ = 1, with the sign convention φ′(0) > 0.
type Wavefunction interface {
	// At returns φ(ξ). It returns 0 for ξ outside [0, 1] (the walls are
	// infinitely high) and for NaN ξ.
	At(xi float64) float64
}

// WaveSolver is a [Solver] that also returns wavefunctions.
type WaveSolver interface {
	Solver
	// Wavefunction returns the normalized wavefunction of level n (1 for
	// the ground level) at reduced field f. Errors follow the rules of
	// [Solver.Levels].
	Wavefunction(f float64, n int) (Wavefunction, error)
}

// Fold returns |f| and whether f was negative. A method computes at |f| and
// uses mirror symmetry for f < 0:
//
//	η_n(−f) = η_n(f),  φ_n(ξ; −f) = (−1)^(n+1) φ_n(1 − ξ; f)
//
// (the operator with f → −f and ξ → 1 − ξ is the same; the sign keeps
// φ_n′(0) > 0, since φ_n′(1) has the sign (−1)^n for a level with n − 1
// nodes). Fold(-0) reports false.
func Fold(f float64) (abs float64, mirrored bool) {
	if f < 0 {
		return -f, true
	}
	return math.Abs(f), false
}

// Mirror returns the wavefunction of level n at field −f given w, the
// wavefunction of level n at field f: ξ ↦ (−1)^(n+1) w(1 − ξ). See [Fold].
func Mirror(w Wavefunction, n int) Wavefunction {
	s := 1.0
	if n%2 == 0 {
		s = -1
	}
	return mirrored{w: w, sign: s}
}

type mirrored struct {
	w    Wavefunction
	sign float64
}

func (m mirrored) At(xi float64) float64 {
	if !(xi >= 0 && xi <= 1) {
		return 0
	}
	return m.sign * m.w.At(1-xi)
}

// WaveFunc adapts an ordinary function to the [Wavefunction] interface. The
// function is called only for ξ in [0, 1]; At returns 0 elsewhere.
type WaveFunc func(xi float64) float64

// At returns w(ξ) for ξ in [0, 1] and 0 otherwise.
func (w WaveFunc) At(xi float64) float64 {
	if !(xi >= 0 && xi <= 1) {
		return 0
	}
	return w(xi)
}
