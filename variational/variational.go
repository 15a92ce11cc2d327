package variational

import (
	"fmt"
	"github.com/tiltwell/tiltwell/internal/floor"
	"math"
	"strconv"

	"github.com/tiltwell/tiltwell"
)

// Family selects a trial-function family.
//
// Programs should not rely on the underlying numeric value of a Family
// being constant.
type Family int

const (
	// Poly is the Rayleigh–Ritz space
	//
	//	span{ξ(1 − ξ) (2ξ − 1)^j e^(−β(ξ − ½)), j = 0..d−1}
	//
	// with β optimized for each level and d = min(2n + Extra, 40) for
	// level n. It is this package's own design (no published source):
	// polynomials converge geometrically to the analytic eigenfunctions,
	// where sines converge only algebraically, and the envelope localizes
	// the space at the low wall in a strong field. It is the default and
	// the most accurate family at every field.
	Poly Family = iota
	// Sine is the Rayleigh–Ritz space of the tilted ground state and its
	// sine harmonics,
	//
	//	span{sin(kπξ) e^(−β(ξ − ½)), k = 1..d},
	//
	// with β optimized for each level and d as for Poly. For d = 1 it is
	// the Tilt family. Its accuracy is limited by the algebraic
	// convergence of sine series.
	Sine
	// Tilt is the one-parameter exponential tilt of the ground state,
	//
	//	φ_β(ξ) ∝ sin(πξ) e^(−β(ξ − ½)),
	//
	// of Bastard, Mendez, Chang and Esaki (Phys. Rev. B 28, 3241 (1983)),
	// with ⟨H⟩ and ⟨H²⟩ in closed form. It gives the ground level only.
	// Its lower bound comes from a Poly space of 8 to 32 functions at the
	// same tilt (see the package documentation), which makes a call about
	// 2.6× as long as the closed form alone (38 µs against 15 µs at
	// f = 10, BenchmarkLevels).
	Tilt
)

// String returns "poly", "sine" or "tilt".
func (fam Family) String() string {
	switch fam {
	case Poly:
		return "poly"
	case Sine:
		return "sine"
	case Tilt:
		return "tilt"
	}
	return "Family(" + strconv.Itoa(int(fam)) + ")"
}

// MaxLevels is the number of levels the Poly and Sine families give.
const MaxLevels = 12

// MaxField is the largest |f| the Poly and Tilt families accept.
const MaxField = 1e4

// FiniteMaxField is the largest |f| the Poly and Tilt families accept on a
// finite Stack: beyond it the levels of the 40-function well space are not
// yet converged for the upper levels, and the convergence estimate was
// seen to fall short (at f = 1e4).
const FiniteMaxField = 1e3

// SineMaxField is the largest |f| the Sine family accepts: beyond it its
// tilt search runs to the largest tilt the quadrature rules resolve, and
// its brackets are wider than 1e-3 anyway.
const SineMaxField = 1e3

// defaultExtra is the default of Solver.Extra.
const defaultExtra = 16

// MaxExtra is the largest Solver.Extra accepted: the Ritz dimension is
// capped at 40 functions, which any Extra ≥ 38 already reaches.
const MaxExtra = maxRitzDim

// Solver computes variational brackets [lower, upper] on the levels of the
// tilted well: the upper bound is a Rayleigh–Ritz value (Hylleraas–Undheim–
// MacDonald), the lower bound Temple's, and the reported Energy is the upper
// bound with Err the width of the bracket, so that
//
//	Energy − Err ≤ η_n ≤ Energy.
//
// On a finite well (Stack a three-layer stack) the zero-field levels are
// bracketed the same way, proven, by Kato's inclusion; under a field the
// Poly family reports the real variational level and the Tilt family the
// one-parameter stationary value, each with an estimated Err that includes
// the escape shift, Gamma = 0 and the escape width it leaves out in
// GammaErr (see the package documentation, "Finite wells"). Other stacks,
// and the Sine family on a finite well, give an error wrapping
// [errors.ErrUnsupported].
//
// The zero value uses the Poly family with its default size. A Solver holds
// configuration only and is safe for concurrent use.
type Solver struct {
	// Family is the trial-function family; the zero value is Poly.
	Family Family
	// Extra sets the Ritz dimension of the Poly and Sine families: level
	// n uses min(2n + Extra, 40) functions. If Extra is 0 it is defaulted
	// to 16; it must lie in 0..MaxExtra (other values give an error
	// wrapping [tiltwell.ErrUnits]). Tilt ignores it. On a finite Stack
	// (at f ≠ 0) the Poly space of a call for k levels has
	// min(2k + Extra − 2, 40) well functions beyond the two interface
	// functions (see the package documentation).
	Extra int
	// Stack is the layer structure; the zero value is the well between
	// infinitely high walls. The Poly and Tilt families also solve a
	// single finite well (a three-layer stack with both barriers above
	// the well, see the package documentation); other stacks, and the
	// Sine family on any finite stack, give an error wrapping
	// [errors.ErrUnsupported].
	Stack tiltwell.Stack
}

var (
	_ tiltwell.WaveSolver = Solver{}
	_ tiltwell.Solver     = (*Solver)(nil)
)

// Bracket is a certified (or, where Bound says so, estimated) enclosure of
// one level, in units of E₁.
type Bracket struct {
	// N is the level number, 1 for the ground level.
	N int
	// Lower and Upper enclose the level: Lower ≤ η_N ≤ Upper. For
	// infinite walls, and at zero field, Upper is a Rayleigh–Ritz value
	// (or Kato's upper end) and is always a proven upper bound (up to
	// floating-point rounding); Lower is proven when Bound is
	// [tiltwell.Rigorous]. On a finite well at f ≠ 0 both are estimates
	// (see the package documentation).
	Lower, Upper float64
	// Energy is the reported level, in [Lower, Upper]: Upper for
	// infinite walls and at zero field; on a finite well at f ≠ 0 the
	// family's own stationary value (the fixed point of the Poly space,
	// or the one-parameter tilt's energy).
	Energy float64
	// Bound is Rigorous when Lower is Temple's bound with a proven α (or
	// the floor max(n² − |f|/2, −|f|/2 + |a_n|(|f|/π)^(2/3))) and Estimate
	// when Temple's condition holds only with an estimated α, or Lower is
	// Weinstein's E − σ (see the package documentation). On a finite well
	// it is Rigorous at zero field (Kato's inclusion) and Estimate under a
	// field, where the level is a resonance.
	Bound tiltwell.Bound
	// Tilt is the optimal β of the trial space for this level, with the
	// sign of the field (β(−f) = −β(f)). Pass the Brackets of a nearby
	// field to [Solver.Brackets] to start the searches from these values.
	Tilt float64
	// GammaErr is the estimate of the escape width Γ (in E₁) that the
	// real variational problem leaves out: 0 for infinite walls and at
	// zero field, and on a finite well at f ≠ 0 the first-order width of
	// the level's own trial function with a margin (see the package
	// documentation).
	GammaErr float64
}

// Level returns the bracket as a [tiltwell.Level]: Energy,
// Err = max(Upper − Energy, Energy − Lower) (Upper − Lower when Energy is
// Upper), Gamma = 0 and GammaErr.
func (b Bracket) Level() tiltwell.Level {
	return tiltwell.Level{N: b.N, Energy: b.Energy, Err: max(b.Upper-b.Energy, b.Energy-b.Lower), Bound: b.Bound, GammaErr: b.GammaErr}
}

// Contains reports whether Lower ≤ eta ≤ Upper.
func (b Bracket) Contains(eta float64) bool { return b.Lower <= eta && eta <= b.Upper }

// maxLevels returns the number of levels the family gives.
func (s Solver) maxLevels() int {
	if s.Family == Tilt {
		return 1
	}
	return MaxLevels
}

func (s Solver) check(f float64, k int) error {
	switch s.Family {
	case Poly, Sine, Tilt:
	default:
		return fmt.Errorf("variational: unknown family %v: %w", s.Family, tiltwell.ErrUnits)
	}
	if s.Extra < 0 || s.Extra > MaxExtra {
		return fmt.Errorf("variational: Extra = %d outside 0..%d: %w", s.Extra, MaxExtra, tiltwell.ErrUnits)
	}
	maxField := MaxField
	if s.Family == Sine {
		maxField = SineMaxField
	}
	if !s.Stack.Infinite() {
		maxField = FiniteMaxField
	}
	if err := s.checkStack(); err != nil {
		return err
	}
	return tiltwell.CheckArgs("variational", f, k, s.maxLevels(), maxField)
}

// dim returns the Ritz dimension of level n ≤ MaxLevels; Extra has been
// checked to lie in 0..MaxExtra, so 2n + Extra cannot overflow.
func (s Solver) dim(n int) int {
	e := s.Extra
	if e == 0 {
		e = defaultExtra
	}
	return min(2*n+e, maxRitzDim)
}

// Levels implements [tiltwell.Solver]. Energy is the upper bound of each
// level's bracket and Err its width (see [Solver.Brackets]); on a finite
// well at f ≠ 0, Energy is the bracket's Energy and Err its larger
// distance to an end ([Bracket.Level]). When a finite well confines fewer
// than k levels, Levels returns the confined ones with a
// [*tiltwell.ConfinedError]. If dst has capacity for k levels, Levels does
// not allocate.
//
// Special cases are:
//
//	f = 0:  brackets about n² whose width is the rounding allowance,
//	        1e-14 to 1e-11 (Poly and Sine); Tilt is exact up to rounding
//	f < 0:  the same levels as for |f| (mirror symmetry)
func (s Solver) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	dst = dst[:0]
	if err := s.check(f, k); err != nil {
		return dst, err
	}
	if !s.Stack.Infinite() {
		fw := finitePool.Get().(*finiteWork)
		defer finitePool.Put(fw)
		br, err := s.finiteBrackets(fw, fw.brackets[:0], f, k, nil)
		if err != nil {
			if _, ok := tiltwell.Confined(err); !ok {
				return dst, err
			}
		}
		for _, b := range br {
			dst = append(dst, b.Level())
		}
		return dst, err
	}
	sp := spacePool.Get().(*space)
	defer spacePool.Put(sp)
	br, err := s.brackets(sp, sp.brackets[:0], f, k, nil)
	if err != nil {
		return dst, err
	}
	for _, b := range br {
		dst = append(dst, b.Level())
	}
	return dst, nil
}

// Brackets appends the brackets of the lowest k levels at reduced field f
// to dst[:0] and returns the result. If dst is nil, a new slice is
// allocated and returned; if it has capacity for k brackets, Brackets does
// not allocate. On a finite well that confines fewer than k levels it
// returns the confined ones with a [*tiltwell.ConfinedError]; there the
// Poly family does not search its tilt (warm is ignored) and the Tilt
// family starts its one-parameter search from warm[0].Tilt.
//
// If warm is not nil, warm[i].Tilt (for i < len(warm)) is the starting
// point of the tilt search for level i+1, as returned by a call at a nearby
// field; this is the warm start for a field sweep (see [Solver.Sweep]). The
// result does not depend on warm except through which local optimum of the
// tilt the searches find; every bracket is valid whatever the tilt. warm may
// be dst itself. A starting tilt beyond ±150 (the search range) starts the
// search at the nearer end; a NaN or infinite one is an error wrapping
// [tiltwell.ErrUnits].
//
// For level n the method minimizes the n-th Ritz value of the family's
// space over β (Brent's method, tilt converged to 1e-7 relative, the energy
// to ~1e-14), which bounds η_n from above by the Hylleraas–Undheim–
// MacDonald theorem, and takes the Ritz function φ_n with E = ⟨H⟩ and
// σ² = ⟨H²⟩ − E², both computed by Gauss–Legendre quadrature with a
// rigorous bound on the quadrature error (closed forms for Tilt). With α a
// proven lower bound on η_{n+1} (the best of the level floor, level n+1's
// own lower bound and Temple's bound from the next Ritz function), Temple's
// inequality gives
//
//	η_n ≥ E − σ²/(α − E)   when E < α
//
// (G. Temple, Proc. R. Soc. Lond. A 119, 276 (1928)); where this width is
// dominated by σ² (Poly's upper levels, Sine and Tilt everywhere), the
// lower bound comes instead from a Poly space at the same tilt. See the
// package documentation for the proof for excited levels and for the
// choice of α. When E ≥ α the lower bound is Temple's with an estimated α,
// or Weinstein's E − σ (D. H. Weinstein, Proc. Natl. Acad. Sci. USA 20,
// 529 (1934)), and is marked Estimate: it brackets some level, and the
// method cannot prove that it is η_n.
func (s Solver) Brackets(dst []Bracket, f float64, k int, warm []Bracket) ([]Bracket, error) {
	dst = dst[:0]
	if err := s.check(f, k); err != nil {
		return dst, err
	}
	for i := range min(len(warm), k) {
		if t := warm[i].Tilt; math.IsNaN(t) || math.IsInf(t, 0) {
			return dst, fmt.Errorf("variational: warm[%d].Tilt = %v is not a finite tilt: %w", i, t, tiltwell.ErrUnits)
		}
	}
	if !s.Stack.Infinite() {
		fw := finitePool.Get().(*finiteWork)
		defer finitePool.Put(fw)
		return s.finiteBrackets(fw, dst, f, k, warm)
	}
	sp := spacePool.Get().(*space)
	defer spacePool.Put(sp)
	return s.brackets(sp, dst, f, k, warm)
}

// Sweep appends the brackets of the lowest k levels at each field of fs to
// dst[:0], field after field (those of fs[i] at [i*k, (i+1)*k)), and
// returns the result. Each field's tilt searches start from the previous
// field's optimum with a small first step. The saving is modest: a cold
// search already takes only about seven Ritz evaluations, and the
// verification of each bracket, which is not shared between fields, costs
// as much again. If dst is nil, a new slice is allocated and returned. On
// a finite well, a field that confines fewer than k levels ends the sweep:
// Sweep returns the brackets so far, those of that field included, with
// its [*tiltwell.ConfinedError].
func (s Solver) Sweep(dst []Bracket, fs []float64, k int) ([]Bracket, error) {
	dst = dst[:0]
	for _, f := range fs {
		if err := s.check(f, k); err != nil {
			return dst, err
		}
	}
	if !s.Stack.Infinite() {
		fw := finitePool.Get().(*finiteWork)
		defer finitePool.Put(fw)
		var warm []Bracket
		for i, f := range fs {
			out, err := s.finiteBrackets(fw, dst[len(dst):], f, k, warm)
			dst = append(dst, out...)
			if err != nil {
				return dst, err
			}
			warm = dst[i*k : (i+1)*k]
		}
		return dst, nil
	}
	sp := spacePool.Get().(*space)
	defer spacePool.Put(sp)
	var warm []Bracket
	for i, f := range fs {
		out, err := s.brackets(sp, dst[len(dst):], f, k, warm)
		if err != nil {
			return dst, err
		}
		dst = append(dst, out...)
		warm = dst[i*k : (i+1)*k]
	}
	return dst, nil
}

// brackets computes the brackets; the arguments have been checked.
func (s Solver) brackets(sp *space, dst []Bracket, f float64, k int, warm []Bracket) ([]Bracket, error) {
	af, neg := tiltwell.Fold(f)
	sign := 1.0
	if neg {
		sign = -1
	}
	dst = dst[:0]
	if s.Family == Tilt {
		guess := tiltGuess(af)
		if len(warm) > 0 {
			guess = sign * warm[0].Tilt
		}
		b := sp.tiltBracket(af, guess)
		b.Tilt *= sign
		return append(dst, b), nil
	}
	sh := polyShape
	if s.Family == Sine {
		sh = sineShape
	}
	// Upper bounds and Ritz data, level by level.
	var res [MaxLevels]ritzResult
	guess := 0.0
	for n := 1; n <= k; n++ {
		isWarm := n <= len(warm)
		switch {
		case isWarm:
			guess = sign * warm[n-1].Tilt
		case n == 1:
			guess = ritzGuess(sh, af)
		}
		dim := s.dim(n)
		beta, evals := sp.searchTilt(sh, dim, n, af, guess, isWarm)
		res[n-1] = sp.verify(sh, dim, n, af, beta)
		res[n-1].evals = evals
		if !res[n-1].ok {
			return dst, fmt.Errorf("variational: level %d at f = %g: trial space not positive definite at β = %g: %w",
				n, f, beta, tiltwell.ErrNoConvergence)
		}
		guess = beta
	}
	// Lower bounds, from the top. For level n, alphaRig is a proven lower
	// bound on η_{n+1}: the largest of the floor of level n+1, the proven
	// lower bound of level n+1 itself, and Temple's bound from the next
	// Ritz function of level n's own space (and of its verification
	// space), with alphaRig2 ≤ η_{n+2} (the floor of level k+2 above the
	// top). alphaEst is the best estimate of one: also the estimated lower
	// bound of level n+1 and the Weinstein interval of the next Ritz value
	// in level n's own space.
	for n := 1; n <= k; n++ {
		dst = append(dst, Bracket{})
	}
	alphaRig := floor.Level(af, k+1)  // proven: ≤ η_{n+1}
	alphaRig2 := floor.Level(af, k+2) // proven: ≤ η_{n+2}
	alphaEst := alphaRig
	for n := k; n >= 1; n-- {
		r := res[n-1]
		// The next Ritz function of level n's own space bounds η_{n+1}
		// by Temple's inequality too, with alphaRig2 ≤ η_{n+2}.
		if t, ok := templeLower(r.nextELo, r.nextEHi, r.nextS2, alphaRig2); ok {
			alphaRig = math.Max(alphaRig, math.Min(t, r.nextEHi))
		}
		alphaEst = math.Max(alphaEst, alphaRig)
		fl := floor.Level(af, n)
		b := Bracket{N: n, Upper: r.upper, Tilt: sign * r.beta}
		b.Lower, b.Bound = lowerBound(r.eLo, r.eHi, r.s2, fl, alphaRig, math.Max(alphaEst, r.nextLo))
		// Where Temple's term σ²/(α − E) dominates the width, or the
		// bound is only an estimate, the lower bound is taken instead
		// from Poly spaces at the same tilt (Poly: the maxDim-function
		// verification space; Sine: Poly's own dimension first, then
		// maxDim), whose Ritz functions have far smaller residuals (σ²
		// 1e-7 → 1e-11 at f = 500, n = 9). The upper bound, the reported
		// energy, stays that of the searched space.
		if r.eLo-b.Lower > r.upper-r.eLo || b.Bound != tiltwell.Rigorous {
			for _, d := range s.verifyDims(n) {
				r2 := sp.verify(polyShape, d, n, af, r.beta)
				if !r2.ok {
					continue
				}
				var lo float64
				lo, alphaRig = checkAgainst(&b, r2, fl, alphaRig, alphaRig2, math.Max(alphaEst, r.nextLo))
				// Enough: Temple's term no longer dominates, or the
				// bracket is within twice the distance from Upper down
				// to this space's Ritz value, a lower bound on the true
				// error (Sine, whose own error is far larger).
				if r2.eLo-lo <= r2.upper-r2.eLo || b.Upper-b.Lower <= 2*(b.Upper-r2.upper) {
					break
				}
			}
		}
		b.Energy = b.Upper
		dst[n-1] = b
		alphaRig2 = alphaRig
		alphaRig, alphaEst = fl, math.Max(fl, b.Lower)
		if b.Bound == tiltwell.Rigorous {
			alphaRig = math.Max(fl, b.Lower)
		}
	}
	return dst, nil
}

// verifyDims returns the dimensions of the Poly spaces that may verify a
// lower bound on level n: for Poly the maxDim-function verification space
// (if larger than the searched one), for Sine Poly's own dimension and
// then maxDim.
func (s Solver) verifyDims(n int) []int {
	d := s.dim(n)
	switch {
	case s.Family == Sine && d < maxDim:
		return []int{d, maxDim}
	case s.Family == Sine || d < maxDim:
		return []int{maxDim}
	}
	return nil
}

// checkAgainst replaces b's lower bound by the one the Ritz pair r2 (of a
// Poly space at the same tilt) gives, when that is proven and b's is not,
// or of the same kind and higher. alphaRig and alphaRig2 are proven lower
// bounds on the next two levels, alphaEst an estimated one on the next. It
// returns r2's lower bound and the proven bound on the next level, raised
// by Temple's bound from r2's next Ritz function.
func checkAgainst(b *Bracket, r2 ritzResult, fl, alphaRig, alphaRig2, alphaEst float64) (lo, alphaNext float64) {
	a2 := alphaRig
	if t, ok := templeLower(r2.nextELo, r2.nextEHi, r2.nextS2, alphaRig2); ok {
		a2 = math.Max(a2, math.Min(t, r2.nextEHi))
	}
	aEst := math.Max(math.Max(alphaEst, a2), r2.nextLo)
	lo, bd := lowerBound(r2.eLo, r2.eHi, r2.s2, fl, a2, aEst)
	if bd == tiltwell.Rigorous && b.Bound != tiltwell.Rigorous || bd == b.Bound && lo > b.Lower {
		b.Lower, b.Bound = math.Min(lo, b.Upper), bd
	}
	return lo, a2
}

// ritzGuess is the starting tilt of the ground-level search: the trend of
// the optimum in the tests' sweeps (Poly: about 0.3 f at weak and
// 4.6 f^(1/3) at strong field; Sine: the Tilt family's optimum).
func ritzGuess(sh shape, f float64) float64 {
	if sh == polyShape {
		return math.Min(0.3*f, 4.6*math.Cbrt(f))
	}
	return tiltGuess(f)
}

// tiltBracket minimizes the closed-form tilt energy and bounds the ground
// level.
func (sp *space) tiltBracket(f, guess float64) Bracket {
	beta := sp.tiltOptimum(f, guess)
	e, s2 := tiltVariance(beta, f)
	ro := roundoff(polyShape, e, f, 1)
	br := Bracket{N: 1, Upper: e + ro, Tilt: beta}
	alpha, fl := floor.Level(f, 2), floor.Level(f, 1)
	br.Lower, br.Bound = lowerBound(e-ro, e+ro, s2, fl, alpha, alpha)
	// Temple's width for the one-parameter function is up to 20× its
	// true error (f ≈ 3), and the floor up to 16× (f ≈ 4): its residual
	// lies in high states. A small Poly space at the same tilt bounds the
	// level far more closely; it is grown until the bracket is at most
	// twice the distance from the Tilt energy down to that space's Ritz
	// value (itself above η₁), which bounds the true error from below.
	for _, d := range [...]int{8, 16, 32} {
		r2 := sp.verify(polyShape, d, 1, f, beta)
		if !r2.ok {
			continue
		}
		checkAgainst(&br, r2, fl, alpha, floor.Level(f, 3), alpha)
		if br.Upper-br.Lower <= 2*(br.Upper-r2.upper) {
			break
		}
	}
	br.Energy = br.Upper
	return br
}

// tiltOptimum minimizes the closed-form tilt energy over β, starting
// from guess.
func (sp *space) tiltOptimum(f, guess float64) float64 {
	o := &sp.tilt
	o.f = f
	guess = math.Max(-maxTilt, math.Min(maxTilt, guess)) // a finite guess; warm ones are checked
	h := 0.25 + 0.2*math.Abs(guess)
	a, b, c, _, fb, _ := bracketMin(o, guess, h, -maxTilt, maxTilt)
	beta, _ := brent(o, a, b, c, fb, tiltRTol, tiltATol, 0, 200)
	return beta
}

// lowerBound chooses the lower bound of a level whose trial function has
// Rayleigh quotient in [eLo, eHi] and variance at most s2, given the level's
// floor, a proven lower bound alphaRig on the next level and an estimated
// one alphaEst ≥ alphaRig:
//   - Temple with alphaRig if its condition holds: Rigorous;
//   - otherwise Temple with alphaEst (Kato's form, with an estimated end of
//     the interval), or failing that Weinstein's eLo − σ: Estimate;
//   - the floor instead whenever it is higher, which is proven.
func lowerBound(eLo, eHi, s2, floor, alphaRig, alphaEst float64) (float64, tiltwell.Bound) {
	lo, bound := floor, tiltwell.Rigorous
	if t, ok := templeLower(eLo, eHi, s2, alphaRig); ok {
		lo = math.Max(lo, t)
	} else if t, ok := templeLower(eLo, eHi, s2, alphaEst); ok && t > floor {
		lo, bound = t, tiltwell.Estimate
	} else if w := eLo - math.Sqrt(s2); w > floor {
		lo, bound = w, tiltwell.Estimate
	}
	return math.Min(lo, eHi), bound
}
