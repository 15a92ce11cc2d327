package basis

import (
	"math"
	"math/big"
)

// Error-free transformations and a double-double accumulator, so that the
// Rayleigh quotient of a Ritz vector, the reported energy, is known to
// about half a unit in the last place with a proven bound on the rest,
// instead of the ~4N units a plain float64 inner product of N terms can
// lose (Higham's γ_(2N)).
//
// References:
//   - T. J. Dekker, "A floating-point technique for extending the available
//     precision", Numer. Math. 18, 224 (1971) (TwoSum, TwoProduct).
//   - T. Ogita, S. M. Rump, S. Oishi, "Accurate sum and dot product", SIAM
//     J. Sci. Comput. 26, 1955 (2005), doi:10.1137/030601818 (the
//     accumulation pattern of Dot2).
//   - N. J. Higham, Accuracy and Stability of Numerical Algorithms, 2nd
//     ed. (SIAM, 2002), §3.1 (γ_n), §4.3 (compensated summation).

// twoSum returns s = fl(a + b) and t with s + t = a + b exactly (Knuth's
// branch-free form; Higham §4.3), barring overflow.
func twoSum(a, b float64) (s, t float64) {
	s = a + b
	bb := s - a
	t = (a - (s - bb)) + (b - bb)
	return s, t
}

// twoProd returns p = fl(a·b) and e with p + e = a·b exactly, by a fused
// multiply–add, unless a·b underflows (then |e| is below 2⁻¹⁰⁷⁴ off).
func twoProd(a, b float64) (p, e float64) {
	p = a * b
	return p, math.FMA(a, b, -p)
}

// underflowSlack bounds what one product may lose to underflow in twoProd
// (its error term is then inexact by at most a subnormal unit).
const underflowSlack = 0x1p-1070

// dd accumulates Σ x_i y_i (and small extra terms) in double-double: the
// products exactly by twoProd, the running sum by twoSum, and all the
// low-order parts in a float64 sum lo. The only roundings are in lo, so
//
//	|hi + lo − Σ| ≤ γ_(2m+2) (m u S + X) + m·2⁻¹⁰⁷⁰,
//
// m the number of terms, S = Σ|x_i y_i| and X the sum of the magnitudes of
// the extra terms (each low-order part is at most u times a partial sum
// of magnitudes, u = 2⁻⁵³; Higham §3.1 for the float sum).
type dd struct {
	hi, lo float64
	abs    float64 // S
	extra  float64 // X
	m      int
}

// addProd adds x·y exactly (to the rounding of lo).
func (a *dd) addProd(x, y float64) {
	p, e := twoProd(x, y)
	s, t := twoSum(a.hi, p)
	a.hi = s
	a.lo += t + e
	a.abs += math.Abs(p)
	a.m++
}

// addSmall adds a term already known to be of the order of the rounding
// (its own error is the caller's to account for).
func (a *dd) addSmall(x float64) {
	a.lo += x
	a.extra += math.Abs(x)
	a.m++
}

// value returns the sum as a normalized pair (hi, lo) and a bound on its
// distance from the exact sum of the terms added.
func (a *dd) value() (hi, lo, errBound float64) {
	hi, lo = twoSum(a.hi, a.lo)
	m := float64(a.m)
	errBound = gamma(2*a.m+2)*(m*unit*a.abs+a.extra)*(1+4*unit) + m*underflowSlack
	return hi, lo, errBound
}

// ddDiv returns (th, tl) ≈ (qh + ql)/(ch + cl) with |th + tl − q/c| at
// most 32u²|q/c| (one correction step of the long division: the residual
// q − th·c is formed with twoProd, and Sterbenz's lemma makes qh − fl(th·ch)
// exact, so only terms of order u|q| are rounded, each by u), for c > 0
// and |cl| ≤ u·ch.
func ddDiv(qh, ql, ch, cl float64) (th, tl float64) {
	th = qh / ch
	p, pe := twoProd(th, ch)
	r := ((qh - p) - pe + ql) - th*cl
	return th, r / ch
}

// eightPiSq is 8/π² as a double-double, eightPiSqHi + eightPiSqLo, from
// the untyped constant math.Pi (63 digits) at 256 bits.
var eightPiSqHi, eightPiSqLo = func() (hi, lo float64) {
	const prec = 256
	pi, _, err := big.ParseFloat(piDigits, 10, prec, big.ToNearestEven)
	if err != nil {
		panic(err) // a broken invariant: the literal is a number
	}
	x := new(big.Float).SetPrec(prec).Mul(pi, pi)
	x.Quo(new(big.Float).SetPrec(prec).SetInt64(8), x)
	hi, _ = x.Float64()
	lo, _ = x.Sub(x, new(big.Float).SetPrec(prec).SetFloat64(hi)).Float64()
	return hi, lo
}()

// piDigits is math.Pi as the Go source writes it.
const piDigits = "3.14159265358979323846264338327950288419716939937510582097494459"

// ratio returns mn/(m² − n²)² as a double-double r + rl, |r + rl − mn/(m² − n²)²|
// ≤ u²·mn/(m² − n²)², for m ≠ n up to 2¹³ (every integer here is exact
// in float64, and the remainder of a correctly rounded quotient is
// exact, so one fused multiply–add gives it).
func ratio(m, n int) (r, rl float64) {
	d := m*m - n*n
	num, den := float64(m*n), float64(d)*float64(d)
	r = num / den
	return r, math.FMA(-r, den, num) / den
}
