package basis

import (
	"fmt"
	"math"

	"github.com/tiltwell/tiltwell"
)

const (
	// MaxSize is the largest basis size N a [Solver] accepts.
	MaxSize = 1024
	// AutoMaxSize is the largest N the automatic size choice (Size 0)
	// goes to. The full Dsyev decomposition costs about 9N³ flops,
	// measured at about 1.5 s at N = 512 on a 2-core machine; asking for
	// fewer than N/2 levels takes the faster path (see [Solver]).
	AutoMaxSize = 512
	// DefaultTol is the tolerance the automatic size choice aims at when
	// Tol is 0: every level's Err at most DefaultTol·max(1, |Energy|).
	DefaultTol = 1e-10
	// MaxPotential is the largest |V(ξ)| a Potential may return (in E₁),
	// far beyond any physical well, so that no square in the error bars
	// can overflow.
	MaxPotential = 1e12
	// MaxField is the largest |f| a Solver accepts, the range of the
	// exact reference it is tested against. Near it even N = AutoMaxSize
	// leaves errors of order 1e-8 in the ground level (the Err says so).
	MaxField = 1e5
)

// Solver is the Rayleigh–Ritz solution of the tilted well in the N lowest
// sine states χ_m = √2 sin(mπξ), or, with a finite Stack, in the N lowest
// states of the untilted stack in a box (see the package documentation,
// "Finite barriers"; the rest of this comment is about infinite walls).
// It implements [tiltwell.WaveSolver]. A
// Solver holds configuration only: one value may be used from many
// goroutines at once, and scratch space comes from a [sync.Pool], so calls
// do not allocate in steady state.
//
// The Ritz values θ_1 ≤ … ≤ θ_N are the eigenvalues of the N×N matrix
//
//	H_mn = m² δ_mn + f X_mn + V_mn,
//	X_mn = ⟨m|ξ − ½|n⟩ = −8mn/(π²(m² − n²)²)  (m + n odd; 0 otherwise),
//	V_mn = 2∫₀¹ V(ξ) sin(mπξ) sin(nπξ) dξ     (only with a Potential).
//
// The decomposition is LAPACK's Dsyev (gonum) for all N eigenvectors, or,
// when k + 1 ≤ N/2 (k levels asked for, one more for the gap), the
// Householder reduction
// (Dsytrd), all eigenvalues (Dsterf) and the k + 1 lowest eigenvectors by
// tridiagonal inverse iteration, a third to a sixth of the cost. Energy is
// the Rayleigh quotient of the computed Ritz vector, θ_k to rounding.
// For the lowest
// levels the error θ_k − η_k falls as N⁻⁷: the odd periodic extension of
// an eigenfunction has a jump in its fourth derivative, 2π²f φ′(0), so its
// sine coefficients fall as m⁻⁵ (a test measures the exponent; at f = 10
// the ground-level error is 1.0e-6, 7.9e-9, 6.6e-11 at N = 10, 20, 40).
//
// # Error bars without a potential (Rigorous)
//
// Each level is given as Energy = θ_k and a bracket [θ_k − Err, θ_k]
// containing the exact level η_k (reported as the symmetric Err of
// [tiltwell.Level]). It rests on three theorems, each applied with its
// hypotheses checked at run time:
//
//  1. Hylleraas–Undheim–MacDonald (min–max): η_k ≤ θ_k.
//
//  2. Kato–Temple (Temple 1928, Kato 1949; Parlett §10.5): for any trial
//     function u with Rayleigh quotient ρ and variance
//     σ² = ‖(H − ρ)u‖²/‖u‖², and any β ≤ η_(k+1) with β > ρ,
//
//     η_k ≥ ρ − σ²/(β − ρ).
//
//     (The largest level below β is at least this, and η_k is at least
//     the largest level below β, because β ≤ η_(k+1).)
//
//  3. Operator bounds for the next level β: H ≥ H₀ − |f|/2 gives
//     η_j ≥ j² − |f|/2, and Dirichlet domain monotonicity (the box [0, 1]
//     inside the half-line, where the levels of the linear potential are
//     those of the triangular well) gives η_j ≥ −|f|/2 + |a_j|(|f|/π)^(2/3),
//     a_j the zeros of Ai (DLMF 9.9.1; table and the asymptotic form DLMF
//     9.9.6/9.9.18 in this package). β is the larger of these and of the
//     bracket already proven for level k + 1 (levels are bracketed from the
//     top down).
//
// The trial function is u = ψ + δ, the Ritz vector ψ = Σ c_n χ_n plus one
// perturbative step outside the basis, δ = −Σ_(m>N) r_m/(m² − θ) χ_m, where
// r_m = f⟨m|ξ − ½|ψ⟩ is the residual outside the basis. Then
// (H − θ)u = ε + f(ξ − ½)δ, with ε the (rounding-level) residual inside the
// basis, and
//
//	ρ(u) = θ + [⟨ψ|H|ψ⟩ − θ‖ψ‖² − T₁ + f⟨δ|ξ − ½|δ⟩] / (‖ψ‖² + D),
//	T₁ = Σ_(m>N) r_m²/(m² − θ),   D = ‖δ‖² = Σ_(m>N) r_m²/(m² − θ)²,
//	σ² ≤ (‖ε‖ + |f|√D/2)² / ‖ψ‖²,
//
// using |ξ − ½| ≤ ½. The sums run explicitly over N < m ≤ 2N; beyond, the
// bound |r_m| ≤ (8|f|/π²) m Σ_n n|c_n| / (m² − N²)² (over n of the other
// parity) and Σ_(m>M) m⁻ᵖ ≤ M^(1−p)/(p − 1) bound the rest. T₁ is the
// second-order energy correction, so ρ(u) is far closer to η_k than θ_k
// is (its error is O(f²D)), and the lower end of the bracket is close to the
// exact level: Err exceeds the true error θ_k − η_k by little (the tests
// hold the ratio to at most 10 wherever the true error is above 1e-14).
// The plain Ritz vector (δ = 0, σ² ≤ ‖r‖² + …) and the bounds of item 3
// on η_k itself are tried too; the best proven lower bound is used. Near the top of the basis (θ ≥ (N+1)²) only the latter remain
// and the bracket can be wide, but it holds.
//
// Where the proven bracket is more than 1.5× wider than an estimated one,
// the estimate is returned instead and that level is marked
// [tiltwell.Estimate]. The estimate uses, where the proven β is too low for
// β > ρ, the Ritz-gap guess β = θ_k + (θ_(k+1) − θ_k)/2 (accepted only if
// σ ≤ (β − ρ)/8, where the bound hardly depends on β), and at most twice
// the second-order correction, θ_k − ρ(u). This happens for a few levels
// near the top of a small basis at strong fields (414 of the 4910 cells of
// the test grid f ≤ 1000, N ≤ 160, every level; none misses the exact
// value). On that grid, wherever the true error is above 1e-14, the worst
// Err/true-error ratio is 6.6, at the top level of the basis; below the top
// two levels it is under 3.5, and for the three lowest levels (N ≥ 8)
// 1.0–1.5. (With a slack of 3 instead of 1.5, proven brackets at the top of
// small bases reached 11.4× the true error, e.g. N = 20, n = 19,
// f = 231.) Beyond |f| = 1000 the estimate is offered only where
// the correction θ_k − ρ(u) is below 2% of the gap to the next Ritz value:
// at stronger fields the top of a small basis is far from converged and the
// plain estimate undershot the true error by up to 6× (649 of 17010 cells
// for f = 1e3…1e5, N = 10…320); with the test 8 of the 5830 cells of
// TestStrongFieldEstimates miss (0.14%), and the proven brackets used
// instead are honest but can be several hundred times wider than the true
// error there (the test logs the count).
//
// Fields below 1e-100 are treated as zero field (the tilt's matrix elements
// would underflow), with |f|/2 added to Err: by min–max
// |η_n(f) − η_n(0)| ≤ |f|/2, so the bracket stays rigorous.
//
// # Rounding
//
// The reported Energy is the Rayleigh quotient ρ(c) of the computed Ritz
// vector c, formed in double-double (error-free products and sums, T. J.
// Dekker, Numer. Math. 18, 224 (1971); the pattern of T. Ogita, S. M. Rump,
// S. Oishi, SIAM J. Sci. Comput. 26, 1955 (2005)), with the tilt's matrix
// elements as −f·(8/π²)·mn/(m² − n²)², the integer ratio and 8/π² in
// double-double too: the pair θ_dd = θ + t_l is ρ(c) to a proven
// (2(N+1)² + 8)u²·(2/3)|f| + O(Nu²|θ|), far below one unit in the last
// place, and θ is its rounding. Every width is then measured from θ_dd
// (rounding relative to the width, not to θ), and Err is the distance from
// θ to the far end of [θ_dd − width, θ_dd + up], where up (η_k above
// θ_dd: the non-orthogonality of c to the lower Ritz vectors, a residual
// squared over the gap) is of the same tiny size. So where the truncation
// error has vanished Err is |t_l|, at most half a unit in the last place
// of θ, plus the bounds of the rest: 4e-15 for the ground level at N = 160,
// f = 10 (true error 4.3e-15), 1e-26 at f = 0, where θ_k = k² exactly.
// Before, Err had a floor of 2γ_(2N+2)(Σn²c_n² + 2|f|/3) + 4u|θ|, the
// worst case of a float64 inner product, up to 641× the true error
// (N = 160, f = 1, n = 45) and 83× for the automatic size and k = 12 at
// f = 0.0017…0.002, n = 11; now at most 2.4× on 300 fields from 1e-4 to
// 1e3, where the true error is one unit in the last place, the exact
// reference's own rounding. The double-double rows cost time: solving
// all N levels takes about 1.35× as long (N = 20…80, f = 10), 5 of 40
// levels 1.1×. With a potential the rows are formed the same way, but the
// moments V_mn carry their own rounding and quadrature error, so the
// bound there is the float64 one, γ_(2N+2)·sup|V|. The other sums
// (residuals, out-of-basis tails) carry Higham's γ_n = nu/(1 − nu) bounds (N. J. Higham, Accuracy and Stability of
// Numerical Algorithms, 2nd ed., §3.1, §3.5) with |X| row sums at most
// 2/3; they enter the bracket squared or through the residual, where
// their size does not matter. The bracket is rigorous "up to
// floating-point rounding of the bound itself", as [tiltwell.Rigorous]
// says: the eigenvectors themselves need no accuracy, since every bound
// is a bound for whatever vector c the eigensolver returned.
//
// # With a potential (Estimate)
//
// V is added to the tilt and its matrix elements are computed as
// V_mn = C_|m−n| − C_(m+n), C_j = ∫₀¹ V(ξ) cos(jπξ) dξ, by Gauss–Legendre
// quadrature (gonum integrate/quad), on panels split at Breaks, with
// j_max·h + 32 nodes on a panel of width h, j_max = 3N the largest
// frequency needed. The q-point rule integrates e^ξ cos(jπξ) to rounding once
// q ≥ j + 20 for j up to 600 (measured; a test checks it), so for a V that
// is smooth on each panel the matrix elements are exact to rounding.
// Mirror symmetry does not hold with a potential: f < 0 is solved as it
// stands.
//
// What remains guaranteed: Energy is still an upper bound on the exact
// level of H₀ + f(ξ − ½) + V, up to the quadrature error of V_mn (HUM
// needs only the matrix of the operator in the basis). What is no longer
// proven, so Bound is [tiltwell.Estimate]: the residual tail beyond m = 2N
// now depends on V, which is only known at the nodes; it is estimated by
// assuming |r_m| falls at least as fast as 1/m (true for bounded V with
// jumps at the Breaks) from its size at m ≈ 2N; sup|V| and inf V in the
// bounds of items 2 and 3 are taken from the samples at the nodes; and
// quadrature error is not included, which is small only for V smooth
// between Breaks.
//
// Special cases are:
//
//	f = 0, no potential: θ_k = k² exactly and Err is the rounding bound
//	    (1e-26 to 1e-24 for N = 160)
//	f < 0, no potential: the levels of |f| (tiltwell.Fold); wavefunctions
//	    mirrored (tiltwell.Mirror)
//	f < 0 with a potential: solved directly, no mirror symmetry
//	k > N (Size > 0): an error wrapping tiltwell.ErrLevel
//	finite Stack: see the package documentation; Size must be 0 or at
//	    least 2; f < 0 is the mirrored stack (tiltwell.Stack.Fold), with
//	    the potential mirrored too
//	Size = 0: N starts at max(k + 8, 12 + ⌈12|f|^(3/7)⌉) and grows (by the
//	    factor the N⁻⁷ rate predicts, 1.25 to 2) until every
//	    Err ≤ Tol·max(1, |Energy|), at most AutoMaxSize; if even that misses
//	    the tolerance, its levels are returned with their honest, larger
//	    Err (Solve reports the N used)
type Solver struct {
	// Size is the basis size N, 1 ≤ N ≤ MaxSize. If Size is 0 it is chosen
	// automatically from Tol.
	Size int
	// Tol is the tolerance for the automatic size: N grows until the
	// levels all have Err ≤ Tol·max(1, |Energy|). If Tol is 0 it is
	// defaulted to DefaultTol. It has no effect when Size > 0. It must not
	// be negative, NaN or infinite.
	Tol float64
	// Potential, if not nil, is added to the tilt: V(ξ) in units of E₁ for
	// ξ in [0, 1] (with a finite Stack, between the outer interfaces; the
	// outer layers stay as the stack has them). It is called only at
	// quadrature nodes inside that interval,
	// possibly concurrently from several goroutines if the Solver is, and
	// must be a pure function returning finite values of magnitude at most
	// MaxPotential.
	Potential func(xi float64) float64
	// Breaks lists the points in (0, 1), in increasing order, where the
	// Potential jumps or has a kink; quadrature panels are split there so
	// the quadrature converges. It is used only with a Potential and must
	// not be modified during a call. With a finite Stack they must lie
	// between the outer interfaces.
	Breaks []float64
	// Stack is the layer structure. The zero value is the well with
	// infinitely high walls, solved as described above; a finite stack is
	// solved in a box of its untilted states (see the package
	// documentation, "Finite barriers").
	Stack tiltwell.Stack
	// Box, used only with a finite Stack, is how far in units of L the box
	// reaches beyond each outer interface into the outer layers. If Box is
	// 0 it is chosen for each field from the decay of the highest level
	// asked for (at most DefaultBox); on the downhill side under a field
	// the box never reaches past that level's classical turning point. It
	// must be finite, 0 ≤ Box ≤ MaxBox. A Box is used shortened by 4.0e-4
	// of itself, so that round depths beside round band edges do not make
	// the box's levels degenerate.
	Box float64
}

var _ tiltwell.WaveSolver = Solver{}

// Stats reports how a call of [Solver.Solve] was carried out.
type Stats struct {
	// Size is the basis size N of the returned levels.
	Size int
	// Tries is the number of diagonalisations done (more than 1 only with
	// the automatic size).
	Tries int
}

// tinyField is the |f| below which the tilt is dropped: its matrix elements
// and residuals would underflow into subnormals (and f² to 0, turning the
// bracket arithmetic into 0/0), while its effect on any level is at most
// |f|/2 < 5e-101, which is added to Err.
const tinyField = 1e-100

// negligible returns f, or 0 when |f| < tinyField.
func negligible(f float64) float64 {
	if math.Abs(f) < tinyField {
		return 0
	}
	return f
}

// Levels appends the lowest k levels at reduced field f to dst[:0] and
// returns the result; see [Solver] for the method, the error bars and the
// special cases. If dst is nil, a new slice is allocated and returned; if it
// has capacity for k levels, Levels does not allocate in steady state.
//
// With a finite Stack fewer than k levels may be confined: Levels then
// returns those with a [*tiltwell.ConfinedError].
//
// Errors wrap [tiltwell.ErrField] (NaN or infinite f), [tiltwell.ErrLevel]
// (k < 1, k > Size, or k > AutoMaxSize), [tiltwell.ErrOutOfRange]
// (|f| > MaxField), [tiltwell.ErrUnits] (a bad Size, Tol, Box, Breaks, or
// a Potential value that is not finite) and [tiltwell.ErrNoConvergence] (the
// eigensolver failed); the returned slice is then empty.
func (s Solver) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	dst, _, err := s.Solve(dst, f, k)
	return dst, err
}

// Solve is [Solver.Levels] that also reports the basis size it used.
func (s Solver) Solve(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, Stats, error) {
	if !s.Stack.Infinite() {
		return s.solveStack(dst, f, k)
	}
	dst = dst[:0]
	if err := s.check(f, k); err != nil {
		return dst, Stats{}, err
	}
	w := getWork()
	defer putWork(w)
	fr := negligible(f)
	st, err := s.run(w, fr, k)
	if err != nil {
		return dst, st, err
	}
	for j := range k {
		// |η_n(f) − η_n(0)| ≤ |f|/2 by min–max (|f(ξ − ½)| ≤ |f|/2).
		e := w.err[j] + math.Abs(f-fr)/2
		dst = append(dst, tiltwell.Level{N: j + 1, Energy: w.theta[j], Err: e, Bound: w.bound[j]})
	}
	return dst, st, nil
}

// Wavefunction returns the normalized wavefunction of level n at reduced
// field f, Σ c_m √2 sin(mπξ) over the basis of [Solver.Levels] at the same
// f and k = n (the automatic size is chosen as Levels(f, n) would), with
// the sign φ′(0) = √2π Σ m c_m > 0. It is evaluated in O(N) operations per
// point with one sine and cosine call. Errors follow [Solver.Levels].
//
// At strong fields the tail of a level, where the exact wavefunction is
// exponentially small (below about 1e-8 of its peak), is dominated by the
// truncation of the expansion: there the computed φ can change sign
// spuriously, so node counts and the sign of φ′ at a wall the level does
// not reach are not meaningful. The sign convention φ′(0) > 0 is applied at
// f ≥ 0, where the level lives near ξ = 0, and carried to f < 0 by mirror
// symmetry.
//
// With a finite Stack the wavefunction is Σ c_m χ_m over the box states
// of the same solve as Levels(f, n), normalized over the box and zero
// outside it; it implements [tiltwell.Spread] with the box as its
// support, and is positive at the first interface. At f = 0 without a
// potential it is the Dirichlet box state itself.
//
// Special cases are:
//
//	f < 0, no potential: tiltwell.Mirror of the wavefunction at |f|
//	f < 0, finite Stack: tiltwell.Mirror of the wavefunction of the
//	    mirrored stack at |f|
func (s Solver) Wavefunction(f float64, n int) (tiltwell.Wavefunction, error) {
	if !s.Stack.Infinite() {
		return s.stackWavefunction(f, n)
	}
	if err := s.check(f, n); err != nil {
		return nil, err
	}
	mir := false
	if s.Potential == nil {
		_, mir = tiltwell.Fold(f)
	}
	w := getWork()
	defer putWork(w)
	st, err := s.run(w, negligible(f), n)
	if err != nil {
		return nil, err
	}
	N := st.Size
	c := make([]float64, N)
	slope, norm := 0.0, 0.0
	for i := range c {
		c[i] = w.a[i*N+n-1]
		slope += float64(i+1) * c[i]
		norm += c[i] * c[i]
	}
	scale := 1 / math.Sqrt(norm)
	if slope < 0 {
		scale = -scale
	}
	for i := range c {
		c[i] *= scale
	}
	var wf tiltwell.Wavefunction = wave{c: c}
	if mir {
		wf = tiltwell.Mirror(wf, n)
	}
	return wf, nil
}

// wave is Σ c_m √2 sin(mπξ).
type wave struct{ c []float64 }

// At returns φ(ξ), 0 outside (0, 1) and exactly 0 on the walls, where
// every sin(mπξ) vanishes but its float64 value (sin(π) = 1.2e-16) would
// not. sin(mπξ) comes from rotating (cos πξ, sin πξ) m times, whose
// rounding grows only linearly in m.
func (w wave) At(xi float64) float64 {
	if !(xi > 0 && xi < 1) {
		return 0
	}
	s1, c1 := math.Sincos(math.Pi * xi)
	sm, cm := s1, c1
	sum := 0.0
	for _, c := range w.c {
		sum += c * sm
		sm, cm = sm*c1+cm*s1, cm*c1-sm*s1
	}
	return math.Sqrt2 * sum
}

// check validates the configuration and the arguments.
func (s Solver) check(f float64, k int) error {
	if s.Size < 0 || s.Size > MaxSize {
		return fmt.Errorf("basis: Size = %d outside 0..%d: %w", s.Size, MaxSize, tiltwell.ErrUnits)
	}
	if !(s.Tol >= 0) || math.IsInf(s.Tol, 0) {
		return fmt.Errorf("basis: Tol = %v is not a finite non-negative number: %w", s.Tol, tiltwell.ErrUnits)
	}
	if s.Size == 1 && !s.Stack.Infinite() {
		return fmt.Errorf("basis: Size = 1 with a finite Stack, which needs at least 2 states: %w", tiltwell.ErrUnits)
	}
	if !(s.Box >= 0 && s.Box <= MaxBox) {
		return fmt.Errorf("basis: Box = %v outside [0, %g]: %w", s.Box, float64(MaxBox), tiltwell.ErrUnits)
	}
	if s.Potential != nil {
		lo, hi := 0.0, 1.0
		if !s.Stack.Infinite() {
			lo, _ = s.Stack.Span(1)
			_, hi = s.Stack.Span(s.Stack.Len() - 2)
		}
		prev := lo
		for i, b := range s.Breaks {
			if !(b > prev && b < hi) {
				return fmt.Errorf("basis: Breaks[%d] = %v not increasing inside (%g, %g): %w", i, b, lo, hi, tiltwell.ErrUnits)
			}
			prev = b
		}
	}
	maxLevel := s.Size
	if maxLevel == 0 {
		maxLevel = AutoMaxSize
	}
	return tiltwell.CheckArgs("basis", f, k, maxLevel, MaxField)
}

// run diagonalises at the configured or automatic size, leaving levels
// 1..k (and the eigenvectors) in w.
func (s Solver) run(w *work, f float64, k int) (Stats, error) {
	af := f
	if s.Potential == nil {
		af, _ = tiltwell.Fold(f)
	}
	if s.Size > 0 {
		err := s.solveN(w, af, s.Size, k)
		return Stats{Size: s.Size, Tries: 1}, err
	}
	tol := s.Tol
	if tol == 0 {
		tol = DefaultTol
	}
	N := min(AutoMaxSize, max(k+8, 12+int(math.Ceil(12*math.Pow(math.Abs(af), 3.0/7)))))
	st := Stats{}
	for {
		st.Size, st.Tries = N, st.Tries+1
		if err := s.solveN(w, af, N, k); err != nil {
			return st, err
		}
		worst := 0.0
		for j := range k {
			worst = max(worst, w.err[j]/(tol*max(1, math.Abs(w.theta[j]))))
		}
		if worst <= 1 || N == AutoMaxSize {
			return st, nil
		}
		// The error falls as N⁻⁷ once the basis resolves the level; grow
		// by the factor that rate predicts, with a margin, 1.25 to 2.
		g := min(2, max(1.25, 1.1*math.Pow(worst, 1.0/7)))
		N = min(AutoMaxSize, int(math.Ceil(float64(N)*g)))
	}
}
