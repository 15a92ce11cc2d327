package exact

import (
	"math"
	"math/big"
	"sync"
)

// Asymptotic expansions of the Airy functions away from the node table.
//
// For z = −x ≤ −negStart the modulus and phase of DLMF §9.8 are used:
//
//	M²(−x) ~ (1/(π√x)) Σ m_k x^(−3k),                 DLMF 9.8.20
//	θ(−x)  ~ π/4 + (2/3) x^(3/2) Σ t_k x^(−3k),        DLMF 9.8.22
//
// with m₀ = t₀ = 1. The coefficients are generated here from the
// differential equation w‴ + 4x w′ + 2w = 0 that w(x) = M²(−x) satisfies
// (the product of two solutions of y″ = zy obeys w‴ − 4zw′ − 2w = 0,
// DLMF 9.11.1 with z = −x): substituting the series gives
//
//	m_k = p(p − 1)(p − 2) m_(k−1) / (12k),  p = 5/2 − 3k,
//
// so m₁ = −5/32, m₂ = 10395/18432, matching DLMF 9.8.20. The phase follows
// from M² θ′ = −1/π (DLMF 9.8.14): dθ/dx = √x / S(x^(−3)) with
// S(y) = Σ m_k y^k; writing 1/S = Σ r_k y^k and integrating term by term,
// t_k = r_k/(1 − 2k), so t₁ = −5/32 and t₂ = 1105/6144 as in DLMF 9.8.22.
//
// For z ≥ posStart the exponential forms DLMF 9.7.5–9.7.8 are used, with
// ζ = (2/3) z^(3/2) (DLMF 9.7.1):
//
//	Ai(z)  ~ e^(−ζ) / (2√π z^(1/4)) Σ (−1)^k u_k ζ^(−k)
//	Ai′(z) ~ −z^(1/4) e^(−ζ) / (2√π) Σ (−1)^k v_k ζ^(−k)
//	Bi(z)  ~ e^(ζ) / (√π z^(1/4)) Σ u_k ζ^(−k)
//	Bi′(z) ~ z^(1/4) e^(ζ) / √π Σ v_k ζ^(−k)
//
// with u_k = (2k+1)(2k+3)⋯(6k−1)/(216^k k!) (DLMF 9.7.2) and
// v_k = −(6k+1)/(6k−1) u_k.
//
// The series are asymptotic, not convergent; the number of terms is chosen so
// that the first omitted term is below 1e-18 relative at the start of each
// range (checked in TestAsymptoticTruncation).

const (
	// negStart is where the node table ends and the modulus–phase series
	// takes over: z ≤ −negStart.
	negStart = 13.0
	// posStart is where the node table ends on the right: z ≥ posStart.
	posStart = 20.0
	// nNeg terms of the modulus–phase series at x ≥ 13: the 13th term is
	// |m₁₃| 13^(−39) ≈ 1e-19.
	nNeg = 13
	// nPos terms of the exponential series at ζ ≥ (2/3)·20^(3/2) ≈ 59.6.
	nPos = 13
)

// negSeries holds m_k, r_k (the reciprocal series 1/S) and t_k.
var negM, negR, negT = negCoefficients()

var posU, posV = posCoefficients()

func negCoefficients() (m, r, t [nNeg]float64) {
	m[0] = 1
	for k := 1; k < nNeg; k++ {
		p := 2.5 - 3*float64(k)
		m[k] = p * (p - 1) * (p - 2) * m[k-1] / (12 * float64(k))
	}
	// r = 1/S by the usual recurrence r₀ = 1, r_k = −Σ_{j=1..k} m_j r_(k−j).
	r[0] = 1
	for k := 1; k < nNeg; k++ {
		s := 0.0
		for j := 1; j <= k; j++ {
			s -= m[j] * r[k-j]
		}
		r[k] = s
	}
	for k := range t {
		t[k] = r[k] / (1 - 2*float64(k))
	}
	return m, r, t
}

func posCoefficients() (u, v [nPos]float64) {
	u[0], v[0] = 1, 1
	for k := 1; k < nPos; k++ {
		fk := float64(k)
		u[k] = u[k-1] * (6*fk - 5) * (6*fk - 3) * (6*fk - 1) / ((2*fk - 1) * 216 * fk)
		v[k] = -(6*fk + 1) / (6*fk - 1) * u[k]
	}
	return u, v
}

// negPoly evaluates Σ_{k≥1} c_k y^k for y = x^(−3), by Horner's rule.
func negPoly(c *[nNeg]float64, y float64) float64 {
	s := 0.0
	for k := nNeg - 1; k >= 1; k-- {
		s = (s + c[k]) * y
	}
	return s
}

// negModPhase returns, for z = −x with x ≥ negStart,
//
//	w  = π M²(z) √x            (→ 1 as x → ∞)
//	θc = θ(z) − π/4 − (2/3) x^(3/2) = (2/3) x^(3/2) Σ_{k≥1} t_k x^(−3k)
//	rr = Σ_{k≥1} r_k x^(−3k)   (so 1/(π M²) = √x (1 + rr))
//
// The split keeps the huge leading phase out of the correction, so that
// phase differences can be formed without cancellation.
func negModPhase(x float64) (w, θc, rr float64) {
	y := 1 / (x * x * x)
	w = 1 + negPoly(&negM, y)
	if t := negPoly(&negT, y); t != 0 {
		// t = 0 once x³ overflows (x > 5.6e102); skipping the product then
		// keeps θc = 0 instead of ∞·0 when x^(3/2) overflows too.
		θc = (2.0 / 3) * x * math.Sqrt(x) * t
	}
	rr = negPoly(&negR, y)
	return w, θc, rr
}

// negPhaseCorr returns θc and rr of [negModPhase] without the modulus.
func negPhaseCorr(x float64) (θc, rr float64) {
	y := 1 / (x * x * x)
	// Both series in one loop so the Horner chains interleave.
	var st, sr float64
	for k := nNeg - 1; k >= 1; k-- {
		st = (st + negT[k]) * y
		sr = (sr + negR[k]) * y
	}
	if st == 0 {
		// x³ overflowed (x > 5.6e102): θc is 0, not ∞·0 once x^(3/2)
		// overflows too.
		return 0, sr
	}
	return (2.0 / 3) * x * math.Sqrt(x) * st, sr
}

// negDW returns d(π M² √x)/dx · x for the modulus series, used for M′.
func negDW(x float64) float64 {
	y := 1 / (x * x * x)
	s := 0.0
	for k := nNeg - 1; k >= 1; k-- {
		s = (s + -3*float64(k)*negM[k]) * y
	}
	return s
}

// posScaled returns, for z ≥ posStart, the scaled functions
//
//	e^ζ Ai(z), e^ζ Ai′(z), e^(−ζ) Bi(z), e^(−ζ) Bi′(z)
//
// and ζ = (2/3) z^(3/2).
func posScaled(z float64) (ai, aip, bi, bip, zeta float64) {
	sq := math.Sqrt(z)
	zeta = (2.0 / 3) * z * sq
	q := math.Sqrt(sq) // z^(1/4)
	iz := 1 / zeta
	var su, sua, sv, sva float64 // Σ u ζ^-k, Σ (−1)^k u ζ^-k, same for v
	for k := nPos - 1; k >= 0; k-- {
		su = su*iz + posU[k]
		sv = sv*iz + posV[k]
		sg := 1.0
		if k%2 == 1 {
			sg = -1
		}
		sua = sua*iz + sg*posU[k]
		sva = sva*iz + sg*posV[k]
	}
	const rsqpi = 0.56418958354775628694807945156077 // 1/√π
	ai = rsqpi / (2 * q) * sua
	aip = -q * rsqpi / 2 * sva
	bi = rsqpi / q * su
	bip = q * rsqpi * sv
	return ai, aip, bi, bip, zeta
}

// negSinCos returns sin θ(−x) and cos θ(−x) for x ≥ negStart, given θc
// of [negModPhase], where
//
//	θ(−x) = π/4 + (2/3) x^(3/2) + θc          (DLMF 9.8.22)
//
// with the large part P = (2/3) x^(3/2) reduced modulo 2π before it is
// rounded, so that the result is good to a few ulps however large P is (a
// float64 P has an absolute error of ε·P, which at x = 1e11 is already
// beyond π). For x ≤ 2³² P < 2⁴⁸ is formed and reduced in double-double
// (an absolute error below 2⁻⁵⁵); beyond, in math/big arithmetic with 80
// bits more than P has before its point (P reaches 2¹⁵³⁶ at the largest
// float64 x, far beyond float64 itself, but the reduced phase is always in
// [0, 2π)). θc, below 3e-3, is added in float64.
func negSinCos(x, tc float64) (sin, cos float64) {
	var r dd // P mod 2π, in [−π, 2π)
	if x <= negDDMax {
		sx := ddSqrt(dd{x, 0})
		p := ddMul(ddMulF(sx, x), ddTwo3)
		k := math.Round(p.hi / (2 * math.Pi))
		// P − k·2π with 2π in three parts, each product exact (k < 2⁴⁶).
		h1, e1 := twoProd(k, twoPi[0])
		h2, e2 := twoProd(k, twoPi[1])
		r = ddAdd(p, dd{-h1, -e1})
		r = ddAdd(r, dd{-h2, -e2})
		r = ddAdd(r, dd{-k * twoPi[2], 0})
	} else {
		r = bigReduce(x)
	}
	r = ddAdd(ddAdd(r, ddPi4), dd{tc, 0})
	// sin(h + l) = sin h + l cos h to within l²: |l| ≤ ulp(h)/2.
	sh, ch := math.Sincos(r.hi)
	return sh + r.lo*ch, ch - r.lo*sh
}

// negDDMax is the largest x whose phase negSinCos reduces in
// double-double: (2/3) x^(3/2) < 2⁴⁸ there.
const negDDMax = 1 << 32

// twoPi is 2π in three float64 parts, twice the triple-double π
// 3.141592653589793 + 1.2246467991473532e-16 − 2.9947698097183397e-33
// (from memory; TestTwoPi checks it against Machin's formula at 256 bits).
var twoPi = [3]float64{2 * math.Pi, 2 * 1.2246467991473532e-16, 2 * -2.9947698097183397e-33}

// bigPiPrec is the precision of bigTwoPi: enough for the 1536 bits of
// (2/3) x^(3/2) before the point at x = MaxFloat64, plus bigGuard.
const (
	bigGuard  = 80
	bigPiPrec = 1536 + 2*bigGuard
)

// bigTwoPi is 2π to bigPiPrec bits, from Machin's formula
// π/4 = 4 arctan(1/5) − arctan(1/239) (any text on the computation of π,
// e.g. J. M. Borwein and P. B. Borwein, Pi and the AGM, Wiley 1987, §11.1;
// from memory). It must not be modified.
var bigTwoPi = sync.OnceValue(func() *big.Float {
	const wp = bigPiPrec + 32
	// arctan(1/n) = Σ (−1)^k / ((2k+1) n^(2k+1)).
	atanInv := func(n int64) *big.Float {
		sum := new(big.Float).SetPrec(wp)
		pow := new(big.Float).SetPrec(wp).Quo(big.NewFloat(1).SetPrec(wp), new(big.Float).SetInt64(n)) // 1/n^(2k+1)
		n2 := new(big.Float).SetPrec(wp).SetInt64(n * n)
		term := new(big.Float).SetPrec(wp)
		den := new(big.Float).SetPrec(wp)
		for k := int64(0); pow.MantExp(nil) > -wp-8; k++ {
			term.Quo(pow, den.SetInt64(2*k+1))
			if k%2 == 0 {
				sum.Add(sum, term)
			} else {
				sum.Sub(sum, term)
			}
			pow.Quo(pow, n2)
		}
		return sum
	}
	pi := new(big.Float).SetPrec(wp).Mul(big.NewFloat(16), atanInv(5))
	pi.Sub(pi, new(big.Float).SetPrec(wp).Mul(big.NewFloat(4), atanInv(239)))
	return pi.Mul(pi, big.NewFloat(2)).SetPrec(bigPiPrec)
})

// bigReduce returns (2/3) x^(3/2) mod 2π, in [0, 2π), as a double-double,
// for any finite x ≥ 0, computed with bigGuard bits more than the phase has
// before its point: an absolute error below 2⁻⁷⁶.
func bigReduce(x float64) dd {
	prec := uint(max(0, 3*math.Ilogb(x)/2+2) + bigGuard)
	nf := func() *big.Float { return new(big.Float).SetPrec(prec) }
	bx := nf().SetFloat64(x)
	p := nf().Sqrt(bx)
	p.Mul(p, bx)
	p.Mul(p, big.NewFloat(2))
	p.Quo(p, big.NewFloat(3))
	tp := nf().Set(bigTwoPi())
	q, _ := nf().Quo(p, tp).Int(nil) // ⌊P/2π⌋, P > 0
	p.Sub(p, nf().Mul(nf().SetInt(q), tp))
	hi, _ := p.Float64()
	lo, _ := p.Sub(p, nf().SetFloat64(hi)).Float64()
	return dd{hi, lo}
}
