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
	// Energy is the reduced energy η = E/E₁; for a quasi-bound level, the
	// real part η_r of its complex energy η_r − iΓ/2.
	Energy float64
	// Err is the method's own estimate of |Energy − η_true|, in units of
	// E₁. It is never negative or NaN.
	Err float64
	// Bound says whether Err is a proven bound or an estimate.
	Bound Bound
	// Gamma is the escape width Γ ≥ 0 in units of E₁: a carrier in the
	// level tunnels out of the well at the rate Γ E₁/ħ (escape time
	// ħ/(Γ E₁), see [Well.EscapeTime]). It is 0 for a true bound state
	// (infinite walls, or a finite well at zero field), and 0 from a
	// method that cannot see escape, which then puts its estimate of the
	// missing Γ in GammaErr.
	Gamma float64
	// GammaErr is the method's estimate of |Gamma − Γ_true| in units of
	// E₁, never negative or NaN. It is always an estimate, never a proven
	// bound, whatever Bound says of Err.
	GammaErr float64
}

// Solver computes the confined levels of a well in reduced units (see the
// package documentation): the [Stack] the solver was configured with,
// which for the zero Stack is the well with infinitely high walls.
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
	// ([ErrOutOfRange]). On error the returned slice has length 0, with
	// two exceptions: a method that documents that it still answers
	// outside its range of validity returns its levels with an error
	// wrapping [ErrOutOfRange]; and when the well confines fewer than k
	// levels, Levels returns the confined ones with a [*ConfinedError]
	// (wrapping [ErrLevel]).
	//
	// Levels must not return NaN or infinite energies, widths or error
	// estimates. For a mirror-symmetric well ([Stack.Symmetric], always
	// true of infinite walls) it must give the same energies for f and −f
	// (see [Fold]).
	Levels(dst []Level, f float64, k int) ([]Level, error)
}

// Wavefunction is a normalized real eigenfunction φ(ξ) of the well.
//
// For infinite walls φ vanishes outside [0, 1], ∫₀¹ φ² dξ = 1, and the sign
// convention is φ′(0) > 0. In a finite [Stack] φ reaches into the barriers:
// a bound state is normalized over the whole line, and a quasi-bound level
// (Γ > 0) is the real solution at its energy η_r normalized over the
// interval its [Spread.Support] gives, bounded on the downhill side by the
// outer classical turning point, which tends to the bound state as Γ → 0; its sign makes φ positive at the first interface
// (the left edge of the inner layers), the limit of φ′(0) > 0 as the
// barriers grow. Such a wavefunction implements [Spread], which gives the
// interval to integrate over.
type Wavefunction interface {
	// At returns φ(ξ). It returns 0 for NaN ξ and, for infinite walls,
	// for ξ outside [0, 1].
	At(xi float64) float64
}

// Spread is implemented by a [Wavefunction] that reaches beyond the
// reference well [0, 1].
type Spread interface {
	Wavefunction
	// Support returns the interval [lo, hi] over which φ is normalized:
	// for a bound state, an interval outside which ∫φ² dξ is below 1e-16
	// of the whole; for a quasi-bound level, the same, except that on the
	// downhill side the interval ends no further out than the outer
	// classical turning point, beyond which the real solution describes
	// the escaping wave rather than the level. Integrals of φ, such as
	// overlaps, need look no further.
	Support() (lo, hi float64)
}

// Support returns the interval over which w is normalized: w.Support() if
// w implements [Spread], and [0, 1] otherwise (infinite walls).
func Support(w Wavefunction) (lo, hi float64) {
	if s, ok := w.(Spread); ok {
		return s.Support()
	}
	return 0, 1
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
// In a finite [Stack], w must be the level of s.Mirror() (see
// [Stack.Fold]); the sign is right when the level's n − 1 nodes lie
// between the outer interfaces, as they do for every level this module
// confines. If w implements [Spread], so does the result, with the
// mirrored interval. The mirror of a nil w is zero everywhere.
func Mirror(w Wavefunction, n int) Wavefunction {
	s := 1.0
	if n%2 == 0 {
		s = -1
	}
	if sp, ok := w.(Spread); ok {
		return mirroredSpread{mirrored{w: w, sign: s, spread: true}, sp}
	}
	return mirrored{w: w, sign: s}
}

type mirrored struct {
	w      Wavefunction
	sign   float64
	spread bool // w implements Spread: no clipping to [0, 1]
}

// At returns sign·w(1 − ξ): 0 for NaN ξ, and, for infinite walls (w not a
// [Spread]), 0 outside [0, 1], where 1 − ξ would round onto a wall
// (ξ = −1e-300 gives 1 − ξ = 1).
func (m mirrored) At(xi float64) float64 {
	if m.w == nil || math.IsNaN(xi) || (!m.spread && !(xi >= 0 && xi <= 1)) {
		return 0
	}
	return m.sign * m.w.At(1-xi)
}

type mirroredSpread struct {
	mirrored
	sp Spread
}

func (m mirroredSpread) Support() (lo, hi float64) {
	lo, hi = m.sp.Support()
	return 1 - hi, 1 - lo
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
