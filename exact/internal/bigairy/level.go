package bigairy

import (
	"fmt"
	"math"
	"math/big"

	"github.com/tiltwell/tiltwell"
)

// DefaultPrec is the precision in bits that [Level], [LevelAiry] and
// [LevelShoot] use when asked for 0 bits: about 60 decimal digits, far
// beyond float64 and still fast. The functions add their own guard bits on
// top of the requested precision.
const DefaultPrec = 200

// MaxField is the largest |f| that [Level] and [LevelShoot] accept.
const MaxField = 1e5

// MaxLevel is the largest level number n that [Level] and [LevelShoot]
// accept. The cost grows like n (more shooting steps), not the accuracy.
const MaxLevel = 1000

// MaxAiryArg is the largest |z| [LevelAiry] lets its Maclaurin series reach
// over the search interval; beyond it [LevelAiry] returns an error wrapping
// [tiltwell.ErrOutOfRange].
const MaxAiryArg = 200

// airyPreferred is the largest |z| over the search interval for which
// [Level] uses the Airy determinant; above it shooting is cheaper.
const airyPreferred = 110

// Level returns the n-th eigenvalue η (in units of E₁) of
//
//	H = −(1/π²) d²/dξ² + f (ξ − ½),  φ(0) = φ(1) = 0,  ξ ∈ [0, 1]
//
// at the reduced field f (in units of F₀), rounded to prec bits (0 means
// [DefaultPrec]) with an error of a few units of 2^-prec · max(1, |η|).
//
// Where the Airy arguments over the search interval stay below 110 in
// magnitude (roughly f ≥ n³/370, so f ≥ 0.003 for n = 1) it uses
// [LevelAiry], the root of the Airy determinant; elsewhere, in particular at
// small f where the arguments are of size π^(2/3) n² f^(−2/3), it uses
// [LevelShoot], shooting with Taylor series in ξ. The tests hold the two
// against each other where both apply.
//
// Special cases are:
//
//	f = 0:  η = n² exactly
//	f < 0:  Level(−f, n, prec), by mirror symmetry ξ → 1 − ξ
//
// Errors wrap the root sentinels: [tiltwell.ErrField] for NaN or ±Inf f,
// [tiltwell.ErrLevel] for n < 1 or n > [MaxLevel], [tiltwell.ErrOutOfRange]
// for |f| > [MaxField], [tiltwell.ErrNoConvergence] if the root search fails
// (not seen in the tests).
func Level(f float64, n int, prec uint) (*big.Float, error) {
	af, prec, zero, err := levelArgs(f, n, prec)
	if zero != nil || err != nil {
		return zero, err
	}
	if airyReach(af, n) <= airyPreferred {
		return levelAiry(af, n, prec)
	}
	return levelShoot(af, n, prec)
}

// levelArgs checks the arguments shared by [Level], [LevelAiry] and
// [LevelShoot] and applies the common special cases: it returns |f|, the
// precision (DefaultPrec for 0), and the answer n² itself at f = 0.
func levelArgs(f float64, n int, prec uint) (af float64, p uint, zero *big.Float, err error) {
	if err := tiltwell.CheckArgs("bigairy", f, n, MaxLevel, MaxField); err != nil {
		return 0, 0, nil, err
	}
	if prec == 0 {
		prec = DefaultPrec
	}
	af, _ = tiltwell.Fold(f)
	if af == 0 {
		return 0, prec, fint(int64(n)*int64(n), prec), nil
	}
	return af, prec, nil, nil
}

// airyReach returns the largest |z₀|, |z₁| over the search interval
// [n² − f/2, n² + f/2] of [LevelAiry]: α (n²/f + 1), α = (π² f)^(1/3).
func airyReach(f float64, n int) float64 {
	alpha := math.Cbrt(math.Pi * math.Pi * f)
	nn := float64(n) * float64(n)
	return alpha * (nn/f + 1)
}

// LevelAiry is [Level] by the Airy determinant only:
//
//	D(η) = Ai(z₀) Bi(z₁) − Ai(z₁) Bi(z₀) = 0,
//	z₀ = −α(η/f + ½),  z₁ = −α(η/f − ½),  α = (π² f)^(1/3)
//
// (φ(ξ) = Bi(z₀)Ai(z) − Ai(z₀)Bi(z) with z = α(ξ − ½) − αη/f vanishes at
// ξ = 0 by construction and at ξ = 1 when D = 0). The root is bracketed by
// the number of levels below η,
//
//	N(η) = ⌊(Θ(z₀) − Θ(z₁))/π⌋
//
// with Θ the continuous Airy phase ([Phase]), starting from the min–max
// bounds n² − f/2 ≤ η_n ≤ n² + f/2, so no root is missed or doubled; inside
// the bracket it takes Newton steps on D with the analytic derivative,
// falling back to bisection. Airy values come from the Maclaurin series
// ([Airy]), so it returns an error wrapping [tiltwell.ErrOutOfRange] when
// α(n²/|f| + 1) exceeds [MaxAiryArg], which excludes small fields (for
// n = 1, |f| below about 2e-3) and high levels at moderate fields.
//
// Special cases are as for [Level].
func LevelAiry(f float64, n int, prec uint) (*big.Float, error) {
	af, prec, zero, err := levelArgs(f, n, prec)
	if zero != nil || err != nil {
		return zero, err
	}
	if r := airyReach(af, n); r > MaxAiryArg {
		return nil, fmt.Errorf("bigairy: Airy arguments up to %.4g at f = %g, n = %d, beyond %d: %w", r, f, n, MaxAiryArg, tiltwell.ErrOutOfRange)
	}
	return levelAiry(af, n, prec)
}

// LevelShoot is [Level] by shooting in ξ only: φ″ = Q(ξ) φ with
// Q(ξ) = π²(f(ξ − ½) − η), φ(0) = 0, φ′(0) = 1, is integrated to ξ = 1 by
// Taylor series (the coefficients follow from the three-term recurrence
// (k+2)(k+1) c_{k+2} = Q(x₀) c_k + π² f c_{k−1}) on 2^m equal steps with
// √max|Q| · h ≤ 2.5, together with ∂φ/∂η for Newton steps on φ(1; η).
// The number of levels below η is the number of zeros of φ in (0, 1)
// (Sturm oscillation theorem), counted as ⌊ϑ(1)/π⌋ with the Prüfer angle
// ϑ = atan2(φ, φ′/s), s = √max(1, max|Q|), which moves by at most 2.5 < π per
// step and so is unwrapped without ambiguity. The bracket starts from the
// min–max bounds n² − f/2 ≤ η_n ≤ n² + f/2.
//
// It works for every f with |f| ≤ [MaxField], including tiny f, where the
// Airy arguments are huge but the equation in ξ is benign. The cost grows
// like √(n² + |f|) steps.
//
// Special cases are as for [Level].
func LevelShoot(f float64, n int, prec uint) (*big.Float, error) {
	af, prec, zero, err := levelArgs(f, n, prec)
	if zero != nil || err != nil {
		return zero, err
	}
	return levelShoot(af, n, prec)
}

// evalFunc evaluates, at η and working precision wp, the number of levels
// strictly below η and a function g with a simple root at every level,
// with its derivative dg/dη.
type evalFunc func(eta *big.Float, wp uint) (count int, g, dg *big.Float)

// findLevel returns the n-th root of the problem described by eval, to prec
// bits relative to max(1, |η|), starting from the bracket [lo, hi] with
// count(lo) ≤ n−1 and count(hi) ≥ n.
func findLevel(eval evalFunc, n int, lo, hi float64, prec uint) (*big.Float, error) {
	const lowPrec = 64 // enough to count and to reach float64 accuracy
	wp := prec + guard
	blo := newf(wp).SetFloat64(lo)
	bhi := newf(wp).SetFloat64(hi)
	// Make sure the bracket holds the n-th level: widen if a bound fails.
	for i := 0; ; i++ {
		c, _, _ := eval(blo, lowPrec)
		if c <= n-1 {
			break
		}
		if i == 60 {
			return nil, fmt.Errorf("bigairy: no lower bracket for level %d: %w", n, tiltwell.ErrNoConvergence)
		}
		w := newf(wp).Sub(bhi, blo)
		blo.Sub(blo, w)
	}
	for i := 0; ; i++ {
		c, _, _ := eval(bhi, lowPrec)
		if c >= n {
			break
		}
		if i == 60 {
			return nil, fmt.Errorf("bigairy: no upper bracket for level %d: %w", n, tiltwell.ErrNoConvergence)
		}
		w := newf(wp).Sub(bhi, blo)
		bhi.Add(bhi, w)
	}
	// Bisect on the count until exactly one level is inside.
	clo, glo, _ := eval(blo, lowPrec)
	chi, ghi, _ := eval(bhi, lowPrec)
	for i := 0; clo != n-1 || chi != n || glo.Sign()*ghi.Sign() >= 0; i++ {
		if i == 400 {
			return nil, fmt.Errorf("bigairy: cannot isolate level %d: %w", n, tiltwell.ErrNoConvergence)
		}
		mid := newf(wp).Add(blo, bhi)
		mid.SetMantExp(mid, -1)
		if c, g, _ := eval(mid, lowPrec); c >= n {
			bhi, chi, ghi = mid, c, g
		} else {
			blo, clo, glo = mid, c, g
		}
	}
	loSign := glo.Sign()
	// Newton with bisection fallback, raising the precision as the iterate
	// converges.
	p := uint(lowPrec)
	x := newf(wp).Add(blo, bhi)
	x.SetMantExp(x, -1)
	step := newf(wp)
	for i := 0; i < 400; i++ {
		_, g, dg := eval(x, p)
		if g.Sign() == 0 {
			if p == wp {
				return x.SetPrec(prec), nil
			}
			p = wp
			continue
		}
		// The sign of g at precision p can be trusted only while the Newton
		// step is well above the rounding noise of the evaluation, about
		// 2^-p relative; only then may it shrink the bracket.
		ok := dg.Sign() != 0
		if ok {
			step.Quo(g, dg)
		}
		if !ok || relStep(x, step) < int(p)-20 {
			if g.Sign() == loSign {
				blo.Set(x)
			} else {
				bhi.Set(x)
			}
		}
		next := newf(wp)
		if ok {
			next.Sub(x, step)
			ok = next.Cmp(blo) > 0 && next.Cmp(bhi) < 0
		}
		if !ok {
			next.Add(blo, bhi)
			next.SetMantExp(next, -1)
			step.Sub(x, next)
		}
		x = next
		rel := relStep(x, step)
		switch {
		case p < wp && rel > int(p)-16:
			p = min(2*p, wp) // this precision is exhausted: double it
		case p == wp && rel > int(prec)+8:
			// Newton converges quadratically: x now carries about 2·rel
			// bits. Every iterate stayed inside the bracket that isolates
			// level n, so this is that level's root.
			return x.SetPrec(prec), nil
		}
	}
	return nil, fmt.Errorf("bigairy: Newton iteration for level %d did not converge: %w", n, tiltwell.ErrNoConvergence)
}

// relStep returns r with |step| ≈ 2^-r · max(1, |x|).
func relStep(x, step *big.Float) int {
	if step.Sign() == 0 {
		return math.MaxInt32
	}
	scale := bitsOf(x)
	if scale < 1 {
		scale = 1
	}
	return scale - bitsOf(step)
}

// levelAiry implements [LevelAiry] for f > 0.
func levelAiry(f float64, n int, prec uint) (*big.Float, error) {
	// Extra bits: z = −α(η ± f/2)/f may cancel by up to log2 of the reach.
	extra := uint(math.Log2(airyReach(f, n)+2)) + 8
	eval := func(eta *big.Float, wp uint) (int, *big.Float, *big.Float) {
		wp += extra
		ff := newf(wp).SetFloat64(f)
		pi := Pi(wp)
		alpha := newf(wp).Mul(pi, pi)
		alpha.Mul(alpha, ff)
		alpha = Cbrt(alpha, wp)
		hf := newf(wp).SetMantExp(ff, -1)
		// z₀ = −α(η + f/2)/f, z₁ = −α(η − f/2)/f
		z0 := newf(wp).Add(eta, hf)
		z0.Mul(z0, alpha)
		z0.Quo(z0, ff)
		z0.Neg(z0)
		z1 := newf(wp).Sub(eta, hf)
		z1.Mul(z1, alpha)
		z1.Quo(z1, ff)
		z1.Neg(z1)
		a0, ap0, b0, bp0 := Airy(z0, wp)
		a1, ap1, b1, bp1 := Airy(z1, wp)
		// D = Ai0 Bi1 − Ai1 Bi0;
		// dD/dη = −(α/f)[Ai0′ Bi1 + Ai0 Bi1′ − Ai1′ Bi0 − Ai1 Bi0′].
		mul := func(x, y *big.Float) *big.Float { return newf(wp).Mul(x, y) }
		d := mul(a0, b1)
		d.Sub(d, mul(a1, b0))
		dd := mul(ap0, b1)
		dd.Add(dd, mul(a0, bp1))
		dd.Sub(dd, mul(ap1, b0))
		dd.Sub(dd, mul(a1, bp0))
		dd.Mul(dd, alpha)
		dd.Quo(dd, ff)
		dd.Neg(dd)
		// N(η) = ⌊(Θ₀ − Θ₁)/π⌋; Θ₀ > Θ₁ since z₀ < z₁ and Θ decreases.
		th := phaseOf(z0, a0, b0, wp)
		th.Sub(th, phaseOf(z1, a1, b1, wp))
		th.Quo(th, pi)
		cnt := 0
		if th.Sign() > 0 {
			i, _ := th.Int64()
			cnt = int(i)
		}
		return cnt, d, dd
	}
	nn := float64(n) * float64(n)
	return findLevel(eval, n, nn-f/2, nn+f/2, prec)
}

// levelShoot implements [LevelShoot] for f > 0.
func levelShoot(f float64, n int, prec uint) (*big.Float, error) {
	nn := float64(n) * float64(n)
	lo, hi := nn-f/2, nn+f/2
	eval := func(eta *big.Float, wp uint) (int, *big.Float, *big.Float) {
		th, phi, psi := shoot(f, eta, wp)
		cnt := 0
		if th > 0 {
			cnt = int(math.Floor(th / math.Pi))
		}
		return cnt, phi, psi
	}
	return findLevel(eval, n, lo, hi, prec)
}

// shoot integrates φ″ = Q φ, Q(ξ) = A + Bξ, A = −π²(η + f/2), B = π² f,
// from φ(0) = 0, φ′(0) = 1 to ξ = 1 together with ψ = ∂φ/∂η
// (ψ″ = Qψ − π²φ, ψ(0) = ψ′(0) = 0), and returns the unwrapped Prüfer
// angle ϑ(1), φ(1) and ψ(1).
func shoot(f float64, eta *big.Float, prec uint) (theta float64, phi, psi *big.Float) {
	wp := prec + guard
	ef, _ := eta.Float64()
	pi2f := math.Pi * math.Pi
	q0 := pi2f * (-ef - f/2)
	q1 := pi2f * (f/2 - ef)
	s := math.Sqrt(math.Max(1, math.Max(math.Abs(q0), math.Abs(q1))))
	m := 0
	for float64(int(1)<<m)*shootStep < s {
		m++
	}
	steps := 1 << m
	pi := Pi(wp)
	pi2 := newf(wp).Mul(pi, pi)
	ff := newf(wp).SetFloat64(f)
	hf := newf(wp).SetMantExp(ff, -1)
	a := newf(wp).Add(eta, hf)
	a.Mul(a, pi2)
	a.Neg(a)
	b := newf(wp).Mul(pi2, ff)
	h := newf(wp).SetMantExp(fint(1, wp), -m) // exact 2^-m
	h2 := newf(wp).Mul(h, h)
	bh3 := newf(wp).Mul(b, h2)
	bh3.Mul(bh3, h)               // B h³
	p2h2 := newf(wp).Mul(pi2, h2) // π² h²
	sb := newf(wp).SetFloat64(s)
	y := newf(wp)     // φ
	yp := fint(1, wp) // φ′
	u := newf(wp)     // ψ
	up := newf(wp)    // ψ′
	// Scratch reused across steps: coefficient arrays and 1/((k+2)(k+1)).
	var cs, es, inv, kf []big.Float
	grow := func(n int) {
		for len(cs) < n {
			k := len(cs)
			cs = append(cs, *newf(wp))
			es = append(es, *newf(wp))
			kf = append(kf, *fint(int64(k), wp))
			r := newf(wp).Quo(fint(1, wp), fint(int64((k+2)*(k+1)), wp))
			inv = append(inv, *r)
		}
	}
	grow(64)
	t1, t2, qh2, v := newf(wp), newf(wp), newf(wp), newf(wp)
	prev := 0.0 // angle of the previous node
	theta = 0
	for j := 0; j < steps; j++ {
		// Q(x_j) h², x_j = j h.
		qh2.SetInt64(int64(j))
		qh2.SetMantExp(qh2, -m)
		qh2.Mul(qh2, b)
		qh2.Add(qh2, a)
		qh2.Mul(qh2, h2)
		// Scaled coefficients C_k = c_k h^k: (k+2)(k+1) C_{k+2} = Qh² C_k + Bh³ C_{k−1},
		// and E_k for ψ with the extra source −π²h² C_k.
		cs[0].Set(y)
		cs[1].Mul(yp, h)
		es[0].Set(u)
		es[1].Mul(up, h)
		cscale := max(bitsOf(&cs[0]), bitsOf(&cs[1]))
		escale := max(bitsOf(&es[0]), bitsOf(&es[1]), cscale-8)
		last := 1
		for k := 0; ; k++ {
			grow(k + 3)
			c, e := &cs[k+2], &es[k+2]
			c.Mul(qh2, &cs[k])
			e.Mul(qh2, &es[k])
			if k > 0 {
				c.Add(c, t1.Mul(bh3, &cs[k-1]))
				e.Add(e, t1.Mul(bh3, &es[k-1]))
			}
			e.Sub(e, t1.Mul(p2h2, &cs[k]))
			c.Mul(c, &inv[k])
			e.Mul(e, &inv[k])
			last = k + 2
			if last > 8 && bitsOf(c) < cscale-int(wp)-4 && bitsOf(&cs[last-1]) < cscale-int(wp)-4 &&
				bitsOf(e) < escale-int(wp)-4 && bitsOf(&es[last-1]) < escale-int(wp)-4 {
				break
			}
		}
		// φ(x+h) = Σ C_k, h φ′(x+h) = Σ k C_k, likewise ψ.
		y.SetInt64(0)
		yp.SetInt64(0)
		u.SetInt64(0)
		up.SetInt64(0)
		for k := last; k >= 0; k-- {
			y.Add(y, &cs[k])
			u.Add(u, &es[k])
			if k > 0 {
				yp.Add(yp, t2.Mul(&cs[k], &kf[k]))
				up.Add(up, t2.Mul(&es[k], &kf[k]))
			}
		}
		yp.Quo(yp, h)
		up.Quo(up, h)
		// Prüfer angle of (φ, φ′/s), unwrapped: it moves by at most s·h ≤ shootStep < π.
		v.Quo(yp, sb)
		e := max(bitsOf(y), bitsOf(v))
		fy, _ := t1.SetMantExp(y, -e).Float64()
		fv, _ := t1.SetMantExp(v, -e).Float64()
		ang := math.Atan2(fy, fv)
		d := ang - prev
		d -= 2 * math.Pi * math.Round(d/(2*math.Pi))
		theta += d
		prev = ang
	}
	return theta, y, u
}

// shootStep bounds s·h, the largest move of the Prüfer angle in one step;
// it must stay below π for the unwrapping to be unambiguous.
const shootStep = 2.5
