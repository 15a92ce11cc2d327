package perturb

import (
	"fmt"
	"math"

	"github.com/tiltwell/tiltwell"
)

const (
	// MaxLevels is the largest number of levels (and highest level number)
	// the solver accepts, the same as the exact reference's.
	MaxLevels = 1000
	// MaxField is the largest |f| for which the solver answers at all.
	// Between a level's validity limit ([Solver.Limit]) and MaxField it
	// still answers, with an error wrapping [tiltwell.ErrOutOfRange]; beyond
	// MaxField it refuses.
	MaxField = 1e5
)

const eps = 0x1p-52 // float64 machine epsilon, 2.22e-16

// Solver is Rayleigh–Schrödinger perturbation theory in the field, of first
// or second order, for any level up to [MaxLevels]. The zero value is ready
// to use (second order). A Solver holds configuration only; one value may
// be used from many goroutines at once. The coefficient tables it reads are
// built once, on first use, and never modified.
//
// The energies are, in reduced units (η in E₁, f in F₀),
//
//	Order 1:  η_n = n²
//	Order 2:  η_n = n² + C_n f²,   C_n = (n²π² − 15)/(48 n⁴ π²),
//
// the first-order shift f⟨n|ξ − ½|n⟩ being zero (see the package
// documentation). Each [tiltwell.Level] carries an error estimate
// ([tiltwell.Estimate]) from the same series, not from any exact solver: with
// c_j the coefficients of η_n(f) = n² + Σ c_j f^j, computed once per level
// to order J = 10 by the Rayleigh–Schrödinger recursion solved in closed form,
//
//	Err = |Σ_(2P<j≤J) c_j f^j| + max(|c_8| f⁸, |c_10| f¹⁰) + ε|η|   (P = Order),
//
// the neglected orders that are known, the size of the last of them as the
// allowance for the orders beyond J, and ε = 2⁻⁵² for rounding (omitted at
// f = 0, where the result is exact). Inside the validity limit ([Solver.Limit])
// the first term is dominated by the first neglected order, c₂f² for
// Order 1 and c₄f⁴ for Order 2.
//
// Special cases are:
//
//	f = 0: η_n = n², Err = 0 (exact)
//	f < 0: the same levels as at −f (mirror symmetry, [tiltwell.Fold])
//	|f| beyond the limit of any of the requested levels: the levels, and an
//	  error wrapping [tiltwell.ErrOutOfRange] (a [*tiltwell.RangeError]
//	  whose Limit is the smallest limit among them)
//	|f| > MaxField: no levels, an error wrapping [tiltwell.ErrOutOfRange]
//
// On a finite well (Stack with three layers) the energies are
//
//	Order 1:  η_n = η₀ + E₁ f
//	Order 2:  η_n = η₀ + E₁ f + E₂ f²,
//
// η₀ the exact zero-field level, E₁ = ⟨φ₀|ξ − ½|φ₀⟩ (zero for a symmetric
// well) and E₂ from the first-order state of Dalgarno and Lewis, in closed
// form layer by layer; Err is built from the series to order 10 as above,
// plus an allowance for the escape that no order sees. Gamma is 0 and
// GammaErr the quasiclassical escape width, doubled (see the package
// documentation, sections "Finite wells" and "Estimates and range on
// finite wells"). Levels the well does not bind at f = 0, or that lie above
// the downhill barrier at the interface, are not confined: Levels returns
// those below them with a [*tiltwell.ConfinedError]. Special cases are:
//
//	f = 0: η_n = η₀, Err a few ulps of η₀, Gamma = GammaErr = 0
//	f < 0: the levels of the mirrored stack at −f ([tiltwell.Stack.Fold])
//
// The series of a stack's levels are computed on first use and kept, for
// the 16 stacks most recently used, in a cache shared by all Solvers
// (safe for concurrent use).
type Solver struct {
	// Order is the order of perturbation theory, 1 or 2. If Order is 0 it
	// is defaulted to 2. Other values make every method return an error
	// wrapping [tiltwell.ErrUnits].
	Order int
	// Stack is the layer structure. The zero value is the well with
	// infinitely high walls, described above. A single finite well (three
	// layers, from [tiltwell.FiniteWell] or [tiltwell.AsymmetricWell]) is
	// solved as described in the package documentation, section "Finite
	// wells"; other stacks make every method return an error wrapping
	// [errors.ErrUnsupported].
	Stack tiltwell.Stack
}

var _ tiltwell.WaveSolver = Solver{}

// order returns the effective order, or an error.
func (s Solver) order() (int, error) {
	switch s.Order {
	case 0:
		return 2, nil
	case 1, 2:
		return s.Order, nil
	}
	return 0, fmt.Errorf("perturb: Order %d not supported, want 0 (default 2), 1 or 2: %w", s.Order, tiltwell.ErrUnits)
}

// Levels appends the lowest k levels at reduced field f to dst[:0] and
// returns the result; see [Solver] for the energies and error estimates. If
// dst is nil, a new slice is allocated and returned; if dst has capacity for
// k levels, Levels does not allocate (after the first call, which builds
// the coefficient tables). The cost is about 10–20 ns per level. On a
// finite well the first call for a stack builds its levels' series (about
// 70–130 µs per level) and later calls cost about 0.1–0.25 µs per level
// (see the package documentation).
//
// Errors wrap [tiltwell.ErrField] (f NaN or infinite), [tiltwell.ErrLevel]
// (k < 1 or k > MaxLevels), [tiltwell.ErrUnits] (bad Order; see [Solver])
// and [tiltwell.ErrOutOfRange]. For |f| beyond the validity limit of one of
// the levels but within MaxField the levels are still returned, in order of
// n (they may then be out of order in energy, and their estimates are not
// to be trusted), with a [*tiltwell.RangeError] whose Limit is the smallest
// limit among levels 1..k; on every other error the result has length 0.
func (s Solver) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	dst = dst[:0]
	p, err := s.order()
	if err != nil {
		return dst, err
	}
	if err := tiltwell.CheckArgs("perturb", f, k, MaxLevels, MaxField); err != nil {
		return dst, err
	}
	if !s.Stack.Infinite() {
		return s.levelsStack(dst, f, k, p)
	}
	af, _ := tiltwell.Fold(f)
	pw := powers(af)
	lim := math.Inf(1)
	for b := 0; b*blockSize < k; b++ {
		blk := blocks[b]()
		m := min(blockSize, k-b*blockSize)
		for j := range blk[:m] {
			e := &blk[j]
			lv := tiltwell.Level{N: b*blockSize + j + 1, Energy: e.nn, Bound: tiltwell.Estimate}
			if af > 0 {
				r := 0.0
				if p == 2 {
					lv.Energy += e.c[0] * pw[0]
					r = eps * abs(lv.Energy)
				}
				lv.Err = e.estimate(p, &pw) + r
			}
			if e.lim[p-1] < lim {
				lim = e.lim[p-1]
			}
			dst = append(dst, lv)
		}
	}
	if af > lim {
		return dst, &tiltwell.RangeError{Method: "perturb", F: f, Limit: lim}
	}
	return dst, nil
}

// Limit returns the validity limit of level n at the solver's order: the
// largest |f| at which its error estimate is trusted. It is where the last
// computed orders reach 5% of the first neglected one, or the first
// neglected order reaches 10% of the distance to the nearest other
// unperturbed level (3 for n = 1, 2n − 1 above), whichever comes first.
// On a finite well further criteria apply (the escape width, the top of
// the downhill barrier, cancelling neglected terms; see the package
// documentation), and the limit is the smaller of those for positive and
// negative fields; a level the well does not bind at f = 0 gives a
// [*tiltwell.ConfinedError]. Errors are otherwise as for [Solver.Levels],
// with n in place of k.
//
// For example the limits for n = 1, 2, 3 and 12 are about 5.3, 8.0, 16 and
// 127 at Order 1, and 6.4, 6.4, 10.5 and 282 at Order 2; they grow roughly
// like n² (Order 2: about 1.5 × 10⁴ at n = 100).
func (s Solver) Limit(n int) (float64, error) {
	p, err := s.order()
	if err != nil {
		return 0, err
	}
	if err := tiltwell.CheckArgs("perturb", 0, n, MaxLevels, 0); err != nil {
		return 0, err
	}
	if !s.Stack.Infinite() {
		return s.limitStack(n, p)
	}
	return entryOf(n).lim[p-1], nil
}

// Dipole returns the dipole moment d = ⟨ξ − ½⟩ of level n (a fraction of
// the well width) to first order in f, and an estimate derr of |d − d_true|:
//
//	d = 2 C_n f = dη_n/df (Hellmann–Feynman, from the second-order energy),
//
// which is also the expectation value in the normalized first-order
// wavefunction, 2C_n f/(1 + f² s_n), to first order. The result and its
// estimate do not depend on Order. The estimate is built from the series of
// dη_n/df as the energy's is (see [Solver]):
//
//	derr = |Σ_(4≤j≤J) j c_j f^(j−1)| + max(8|c_8| f⁷, 10|c_10| f⁹) + ε|d|.
//
// On a finite well d = E₁ + 2E₂f (the derivative of the Order-2 energy),
// and derr is built from the series to order 10 in the same way, plus
// Γ_q |dS/df| for the escape (S the exponent of Γ_q); its limit is that of
// Order 2, lowered where the neglected terms of dη/df cancel.
//
// Errors are as for [Solver.Levels] with n in place of k; the limit is that
// of Order 2 for level n, and beyond it d and derr are still returned with
// the error.
//
// Special cases are:
//
//	f = 0: d = 0, derr = 0 (exact); on a finite well d = E₁ (0 if symmetric)
//	f < 0: −Dipole(−f, n) (on a finite well, of the mirrored stack)
func (s Solver) Dipole(f float64, n int) (d, derr float64, err error) {
	if _, err := s.order(); err != nil {
		return 0, 0, err
	}
	if err := tiltwell.CheckArgs("perturb", f, n, MaxLevels, MaxField); err != nil {
		return 0, 0, err
	}
	if !s.Stack.Infinite() {
		return s.dipoleStack(f, n)
	}
	af, mir := tiltwell.Fold(f)
	e := entryOf(n)
	if af > 0 {
		d = 2 * e.c[0] * af
		derr = e.dipoleEstimate(af) + eps*math.Abs(d)
	}
	if mir {
		d = -d
	}
	if af > e.lim[1] {
		return d, derr, &tiltwell.RangeError{Method: "perturb", F: f, Limit: e.lim[1]}
	}
	return d, derr, nil
}
