package wkb

import (
	"fmt"
	"math"

	"github.com/tiltwell/tiltwell"
)

// MaxField is the largest |f| that Levels and Wavefunction accept. The
// formulas hold at any field; the limit is the range over which the error
// estimates are tested against the exact reference.
const MaxField = 1e5

// MaxLevels is the largest level count k (and level number n) accepted.
// Wavefunction costs O(n) for its normalisation.
const MaxLevels = 10000

// Solver computes the levels of the tilted well by WKB quantisation with the
// action integral in closed form. The zero value is ready to use and selects
// the connection rule; Solver{Plain: true} selects the textbook rule. A
// Solver holds configuration only and is safe for concurrent use.
//
// With e = η + f/2 (the kinetic energy at the low wall ξ = 0), the local
// wavenumber is k(ξ) = π √(e − f ξ) and the classical turning point is
// ξ_t = e/f. The plain rule is
//
//	∫₀¹ k dξ = nπ          if η ≥ f/2 (two hard walls),
//	∫₀^ξ_t k dξ = (n − ¼)π  if η < f/2 (a hard wall and a turning point),
//
// (D. J. Griffiths, Introduction to Quantum Mechanics, 2nd ed., §8.3,
// Eqs. 8.16 and 8.47, from memory), in closed form
//
//	(2/(3f)) [(η + f/2)^(3/2) − (η − f/2)^(3/2)] = n,
//	η = −f/2 + [(3f/2)(n − ¼)]^(2/3).
//
// At low field the plain two-wall rule gives η_n ≈ n² + f²/(48n²): it
// shifts the ground level up, while the true level moves down (by
// 0.0108 f²). Its Err, about 0.032 f² at n = 1, is larger than the shift
// it predicts, so the estimate shows that the sign is not resolved.
//
// The connection rule (the default) is
//
//	S(η) + π/4 − u₁/ζ₀ − χ(x₁) = nπ,
//
// where S is ∫ k dξ over the allowed part of the well, ζ₀ = (2π/(3f)) e^(3/2)
// is the action from the low wall to the turning point, u₁ = 5/72, and χ is
// the connection phase at the high wall as a function of its Airy
// coordinate x₁ = (f − e)/(f/π)^(2/3) (the wall's distance past the turning
// point in Airy lengths (π² f)^(−1/3)); see the package documentation.
//
// With a Stack holding a single finite well the rules carry the step
// phases of the abrupt interfaces and the levels carry the quasiclassical
// escape width Γ through the downhill barrier; see the package
// documentation, "Finite barriers". A level that is not confined by the
// method's criterion (above a barrier at its interface, within 0.6 ħ of
// under-barrier action of the downhill barrier's top, or too broad for
// the first-order width) ends the list with a [*tiltwell.ConfinedError].
//
// Special cases are:
//
//	Levels(dst, 0, k) = n² for n = 1..k, with Err = 0 (both rules are exact
//	    for a flat well)
//	Levels(dst, −f, k) = Levels(dst, f, k)
//	Levels(dst, f, k) for |f| < 1e-150 is treated as f = 0 (the shift is
//	    below 1e-300)
//	with a finite well, Levels(dst, 0, k) = the square well's bound levels
//	    (internal/squarewell), with Γ = 0, and a ConfinedError past them;
//	    Levels(dst, −f, k) = the levels of the mirrored stack at f
type Solver struct {
	// Plain selects the textbook rule, with its jump at η = f/2 and its
	// wrong-signed ground-level shift at low field. Its Err is the size of
	// the connection correction (the distance to the connection rule's
	// level) plus the connection rule's own Err.
	Plain bool
	// Stack is the layer structure. The zero Stack is the well with
	// infinitely high walls; a single finite well (three layers, see
	// [tiltwell.FiniteWell] and [tiltwell.AsymmetricWell]) is solved by
	// the finite-well rules (see the package documentation). Other
	// stacks give an error wrapping [errors.ErrUnsupported].
	Stack tiltwell.Stack
}

var _ tiltwell.WaveSolver = Solver{}

// u1 is u₁ of DLMF 9.7.2, the first coefficient of the phase-integral series
// (the second-order WKB correction): θ(x) = π/4 + ζ − u₁/ζ + c₃/ζ³ − …
const u1 = 5.0 / 72

// c3 is the next coefficient of that series, the ζ^(−3) term of DLMF 9.8.22
// written in ζ = (2/3)|x|^(3/2): (1105/6144) (2/3)⁴ = u₃ + u₁³/3 − u₁u₂.
const c3 = 1105.0 / 6144 * 16 / 81

// errSafety multiplies the first omitted term of the phase series in the
// connection rule's Err. The remainder of the series was observed to be
// smaller than, and of the sign of, that term (ratio 0.73 for the ground
// level at strong field, where the far wall is nearest the turning point,
// tending to 1 elsewhere); the factor keeps the estimate above the true
// error after it is turned into an energy.
const errSafety = 2

// tinyField is the |f| below which the levels are n² to all digits.
const tinyField = 1e-150

const eps = 0x1p-52

// Levels appends the lowest k levels at reduced field f to dst[:0] and
// returns the result, N = 1..k in increasing order of energy, with Bound
// [tiltwell.Estimate]. If dst is nil, a new slice is allocated and returned;
// if dst has capacity for k levels, Levels does not allocate.
//
// Errors wrap [tiltwell.ErrField] for NaN or infinite f, [tiltwell.ErrLevel]
// for k < 1 or k > [MaxLevels], and [tiltwell.ErrOutOfRange] for
// |f| > [MaxField]; the returned slice is then empty.
func (s Solver) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	dst = dst[:0]
	if err := tiltwell.CheckArgs("wkb", f, k, MaxLevels, MaxField); err != nil {
		return dst, err
	}
	if !s.Stack.Infinite() {
		if err := checkStack(s.Stack); err != nil {
			return dst, err
		}
		return s.finiteLevels(dst, f, k)
	}
	af, _ := tiltwell.Fold(f)
	ea := airyEnergy(af)
	for n := 1; n <= k; n++ {
		lv, err := s.level(af, ea, n)
		if err != nil {
			return dst[:0], err
		}
		dst = append(dst, lv)
	}
	return dst, nil
}

// airyEnergy returns (f/π)^(2/3), the Airy energy unit: the energy change
// across one Airy length (π² f)^(−1/3).
func airyEnergy(f float64) float64 { return math.Cbrt(f / math.Pi * f / math.Pi) }

// level returns level n at field f ≥ 0; ea = airyEnergy(f).
func (s Solver) level(f, ea float64, n int) (tiltwell.Level, error) {
	if f < tinyField {
		fn := float64(n)
		return tiltwell.Level{N: n, Energy: fn * fn, Bound: tiltwell.Estimate}, nil
	}
	ei, dpsi, err := connectE(f, ea, n)
	if err != nil {
		return tiltwell.Level{}, err
	}
	ei, elo, polished := polish(f, ea, n, ei, dpsi, false)
	eta := shift(ei, elo, f)
	e := connectErr(f, ea, n, ei, dpsi, polished)
	if s.Plain {
		ep := plainE(f, n)
		var plo float64
		ep, plo, _ = polish(f, ea, n, ep, 0, true)
		eta = shift(ep, plo, f)
		d, dlo := twoSum(ep, -ei)
		e += math.Abs(d + (dlo + plo - elo))
	}
	return tiltwell.Level{N: n, Energy: eta, Err: e, Bound: tiltwell.Estimate}, nil
}

// shift returns η = (e + elo) − f/2 with one rounding.
func shift(e, elo, f float64) float64 {
	s, t := twoSum(e, -f/2)
	return s + (t + elo)
}

// polish refines a converged root e of the quantisation rule, for two
// walls (e > f), by one Newton step whose residual n − ψ(e) is formed
// with the action in double-double (actionDD): ψ in float64 carries about
// 3ε·n of rounding, which moves e by 6ε·n² (up to 7 units in the last
// place of η, measured), while the refined e + elo is good to about half
// a unit. dpsi is dψ/de at e (recomputed if 0); plain selects the plain
// rule ψ = S/π. It returns e unchanged, elo = 0 and false for one wall.
func polish(f, ea float64, n int, e, dpsi float64, plain bool) (float64, float64, bool) {
	if !(e > f) {
		return e, 0, false
	}
	hi, lo := actionDD(f, e)
	if plain {
		_, dpsi = action(f, e)
	} else {
		// The connection terms, small against σ: 0.25 − (u₁/ζ₀ + χ)/π.
		r := math.Sqrt(e)
		s0 := 2.0 / 3 * e * r / f
		chi, _ := airyChi((f - e) / ea)
		small := 0.25 - (u1/(math.Pi*s0)+chi)/math.Pi
		var t float64
		hi, t = twoSum(hi, small)
		lo += t
		if dpsi == 0 {
			_, dpsi = connect(f, 1/f, 1/ea, e)
		}
	}
	res := (float64(n) - hi) - lo // n − ψ, exact to first order
	d := res / dpsi
	s, t := twoSum(e, d)
	return s, t, true
}

// actionDD returns σ = S(e)/π for two walls, e > f > 0, as a double-double
// hi + lo, by the difference form (2/3)(e + √(e(e−f)) + (e − f))/(√e + √(e−f))
// with every step error-free or in double-double: its relative error is a
// few u², u = 2⁻⁵³ (T. J. Dekker, Numer. Math. 18, 224 (1971), for the
// double-double operations).
func actionDD(f, e float64) (hi, lo float64) {
	ah, al := twoSum(e, -f) // e − f
	rh, rl := sqrtDD(e, 0)
	bh, bl := sqrtDD(ah, al)
	// num = e + r·b + (e − f)
	ph, pl := twoProd(rh, bh)
	pl += rh*bl + rl*bh
	nh, nl := twoSum(e, ph)
	nl += pl
	nh, t := twoSum(nh, ah)
	nl += t + al
	// den = r + b
	dh, dl := twoSum(rh, bh)
	dl += rl + bl
	qh, ql := divDD(nh, nl, dh, dl)
	// × 2/3: 2q exactly, then ÷ 3.
	return divDD(2*qh, 2*ql, 3, 0)
}

// twoSum returns s = fl(a + b) and t with s + t = a + b exactly (Knuth;
// N. J. Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed.,
// §4.3).
func twoSum(a, b float64) (s, t float64) {
	s = a + b
	bb := s - a
	return s, (a - (s - bb)) + (b - bb)
}

// twoProd returns p = fl(a·b) and e with p + e = a·b exactly (barring
// underflow), by a fused multiply–add.
func twoProd(a, b float64) (p, e float64) {
	p = a * b
	return p, math.FMA(a, b, -p)
}

// sqrtDD returns √(xh + xl) as a double-double for xh > 0: the float64
// root and one Newton correction from the exact residual xh − r².
func sqrtDD(xh, xl float64) (hi, lo float64) {
	hi = math.Sqrt(xh)
	return hi, (math.FMA(-hi, hi, xh) + xl) / (2 * hi)
}

// divDD returns (ah + al)/(bh + bl) as a double-double, with one
// correction step of the long division (the residual formed with twoProd).
func divDD(ah, al, bh, bl float64) (hi, lo float64) {
	hi = ah / bh
	p, pe := twoProd(hi, bh)
	r := ((ah - p) - pe + al) - hi*bl
	return hi, r / bh
}

// action returns σ = S(e)/π, with S = ∫ k dξ over the allowed part of the
// well, and dσ/de, for f > 0, e > 0:
//
//	e ≤ f:  S = (2π/(3f)) e^(3/2)
//	e > f:  S = (2π/(3f)) [e^(3/2) − (e − f)^(3/2)]
//	          = (2π/3) (e + √(e(e−f)) + (e − f)) / (√e + √(e−f))
//
// The second line is the difference form, which does not cancel at small f.
// Phases are carried in units of π so that the quantum number n is exact.
func action(f, e float64) (s, ds float64) {
	r := math.Sqrt(e)
	if e <= f {
		return 2 * e * r / (3 * f), r / f
	}
	b := math.Sqrt(e - f)
	return 2 * (e + r*b + (e - f)) / (3 * (r + b)), 1 / (r + b)
}

// plainE returns e = η + f/2 of the plain rule, f > 0. The two-wall rule is
// used when it has a root with η ≥ f/2, which is when n ≥ (2/3)√f.
func plainE(f float64, n int) float64 {
	fn := float64(n)
	if 4*f > 9*fn*fn {
		// One wall: (2π/(3f)) e^(3/2) = (n − ¼)π.
		return math.Cbrt(1.5 * f * (fn - 0.25) * 1.5 * f * (fn - 0.25))
	}
	// Two walls: S is increasing and concave on e ≥ f, so Newton's steps
	// land at or below the root after the first, then climb to it.
	e := max(fn*fn+f/2+f*f/(48*fn*fn), f)
	for range 100 {
		s, ds := action(f, e)
		next := max(e+(fn-s)/ds, f)
		// σ carries rounding of about ε σ; a step below what that moves e
		// by is noise.
		if math.Abs(next-e) <= 2*eps*next+2*eps*(fn+1)/ds {
			return next
		}
		e = next
	}
	return e
}

// connect returns ψ = Φ/π, Φ(e) = S(e) + π/4 − u₁/ζ₀ − χ(x₁), and dψ/de,
// for f > 0, given invF = 1/f and invEa = 1/ea.
func connect(f, invF, invEa, e float64) (psi, dpsi float64) {
	r := math.Sqrt(e)
	s0 := 2.0 / 3 * e * r * invF // ζ₀/π, and σ when e ≤ f
	ds0 := r * invF
	s, ds := s0, ds0
	if e > f {
		b := math.Sqrt(e - f)
		inv := 1 / (r + b)
		s, ds = 2.0/3*(e+r*b+(e-f))*inv, inv
	}
	chi, dchi := airyChi((f - e) * invEa)
	// u₁/ζ₀ = u₁/(π s0); its derivative is u₁ ds0/(π s0²).
	q := u1 / (math.Pi * s0)
	return s + 0.25 - (q+chi)*(1/math.Pi), ds + (q*ds0/s0+dchi*invEa)*(1/math.Pi)
}

// connectE solves the connection rule for e = η + f/2 by Newton's method on
// the closed-form phase, kept inside a bracket (Φ increases with e, from −∞
// at e = 0), for f > 0 and ea = airyEnergy(f). It returns e and dψ/de there.
func connectE(f, ea float64, n int) (e, dpsi float64, err error) {
	fn := float64(n)
	// Start from the one-wall rule with the far-wall correction,
	// ζ₀ − u₁/ζ₀ = (n − ¼)π, if that puts the turning point inside the
	// well; else from the plain two-wall level less the u₁ terms of the
	// two walls, −5f²/(16π²n⁴), when the field is weak for the level.
	t := (fn - 0.25) * math.Pi
	z := (t + math.Sqrt(t*t+4*u1)) / 2
	e = math.Cbrt(1.5 * f * z / math.Pi * 1.5 * f * z / math.Pi)
	if e > f {
		e = plainE(f, n)
		if f < fn*fn {
			e -= 5 * f * f / (16 * math.Pi * math.Pi * fn * fn * fn * fn)
		}
	}
	lo, hi := 0.0, math.Inf(1)
	invF, invEa := 1/f, 1/ea
	for range 100 {
		psi, d := connect(f, invF, invEa, e)
		if psi < fn {
			lo = e
		} else {
			hi = e
		}
		step := (fn - psi) / d
		next := e + step
		// ψ carries rounding of a few ε (|ψ| + 1); a step below what that
		// moves e by is noise. By the quadratic convergence of Newton's
		// method a step δ leaves an error of about δ²/scale, scale the
		// energy over which Φ bends (e, or the Airy energy while the high
		// wall is within reach of the table); below ε e/4 it need not be
		// checked by another round.
		as := math.Abs(step)
		scale := e
		if f-e > airyLo*ea {
			scale = min(e, ea)
		}
		if as <= 2*eps*e+2*eps*(fn+1)/d || as*as <= eps/4*e*scale {
			return next, d, nil
		}
		if !(next > lo && next < hi) {
			if math.IsInf(hi, 1) {
				next = 2 * e
			} else {
				next = lo + (hi-lo)/2
			}
		}
		e = next
	}
	return 0, 0, fmt.Errorf("wkb: f = %g, n = %d: connection rule did not converge: %w", f, n, tiltwell.ErrNoConvergence)
}

// connectErr is the connection rule's error estimate for e at level n, with
// dpsi = dψ/de: the first omitted term of the far-wall phase series,
// c₃/ζ₀³, turned into an energy by dΦ/de, times errSafety, plus rounding.
// polished says e was refined by polish (two walls).
func connectErr(f, ea float64, n int, e, dpsi float64, polished bool) float64 {
	r := math.Sqrt(e)
	z0 := 2 * math.Pi / 3 * e * r / f
	trunc := errSafety * c3 / (z0 * z0 * z0)
	// Rounding: the connection phase is good to about ε (2 + ζ̄₁) in the
	// table, where it is θ − ζ̄₁ (tested against the asymptotic series at
	// the table's edge), and 2ε beyond; ψ ≈ n to about ε (n + 1) in
	// float64, or, after polish, to ε for the small connection terms and
	// a few u² n for the action; η rounds at ε|η|/2 after polish, and at
	// ε (|η| + e)/2 from e − f/2 without it.
	x1 := (f - e) / ea
	chiErr := 2 * eps
	if x1 >= airyLo && x1 <= airyHi {
		chiErr = eps * (2 + 2.0/3*max(-x1, 0)*math.Sqrt(max(-x1, 0)))
	}
	eta := e - f/2
	if polished {
		return ((trunc+chiErr)/math.Pi+eps*(1+eps*float64(n)))/dpsi + eps*math.Abs(eta)/2
	}
	return ((trunc+chiErr)/math.Pi+eps*(float64(n)+1))/dpsi + eps*(math.Abs(eta)+e)/2
}
