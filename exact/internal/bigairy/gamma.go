package bigairy

import (
	"math/big"
)

// GammaThird returns Γ(1/3) and Γ(2/3) rounded to prec bits.
//
// Γ(1/3) comes from the complete elliptic integral at the third singular
// value, evaluated by the arithmetic–geometric mean:
//
//	K(k) = π / (2 AGM(1, √(1 − k²))),   k = sin(π/12)
//	Γ(1/3) = 2^(7/9) 3^(−1/12) π^(1/3) K(sin(π/12))^(1/3)
//
// and Γ(2/3) from the reflection formula Γ(1/3)Γ(2/3) = π/sin(π/3) = 2π/√3.
// The tests check both against the independent Stirling route
// [GammaStirling].
//
// References:
//   - DLMF 19.8.5 (K by the AGM), 5.5.3 (reflection).
//   - J. M. Borwein and I. J. Zucker, "Fast evaluation of the gamma function
//     for small rational fractions using complete elliptic integrals of the
//     first kind", IMA J. Numer. Anal. 12, 519 (1992) (the Γ(1/3) identity).
func GammaThird(prec uint) (g13, g23 *big.Float) {
	v := gammaCache.get(prec)
	return v[0], v[1]
}

var gammaCache = &constCache{f: func(prec uint) []*big.Float {
	a, b := gammaThirdAGM(prec)
	return []*big.Float{a, b}
}}

func gammaThirdAGM(prec uint) (g13, g23 *big.Float) {
	wp := prec + guard
	pi := Pi(wp)
	s6 := Sqrt(fint(6, wp), wp)
	s2 := Sqrt(fint(2, wp), wp)
	// k' = cos(π/12) = (√6 + √2)/4
	kp := newf(wp).Add(s6, s2)
	kp.SetMantExp(kp, -2)
	a := fint(1, wp)
	b := kp
	t := newf(wp)
	for i := 0; i < 200; i++ {
		t.Add(a, b)
		t.SetMantExp(t, -1)
		b = Sqrt(newf(wp).Mul(a, b), wp)
		a.Set(t)
		d := newf(wp).Sub(a, b)
		if d.Sign() == 0 || bitsOf(d) < -int(wp)+2 {
			break
		}
	}
	// K = π/(2a)
	k := newf(wp).Quo(pi, a)
	k.SetMantExp(k, -1)
	// Γ(1/3)³ = 2^(7/3) 3^(−1/4) π K
	g3 := newf(wp).Mul(pi, k)
	g3.Mul(g3, Cbrt(fint(128, wp), wp))                    // 2^(7/3)
	g3.Quo(g3, Sqrt(Sqrt(fint(3, wp), wp), wp))            // 3^(1/4)
	g13 = Cbrt(g3, wp)                                     // Γ(1/3)
	g23 = newf(wp).Quo(newf(wp).Mul(fint(2, wp), pi), g13) // 2π/Γ(1/3)
	g23.Quo(g23, Sqrt(fint(3, wp), wp))                    // /√3
	return g13.SetPrec(prec), g23.SetPrec(prec)
}

// Bernoulli returns the Bernoulli numbers B_0, …, B_n as exact rationals
// (B_1 = −1/2 convention), by the recurrence Σ_{j=0}^{m} C(m+1, j) B_j = 0.
//
// References:
//   - DLMF 24.5.3.
func Bernoulli(n int) []*big.Rat {
	b := make([]*big.Rat, n+1)
	b[0] = big.NewRat(1, 1)
	binom := new(big.Int)
	t := new(big.Rat)
	for m := 1; m <= n; m++ {
		s := new(big.Rat)
		for j := 0; j < m; j++ {
			if j > 1 && j%2 == 1 {
				continue // odd Bernoulli numbers beyond B_1 vanish
			}
			binom.Binomial(int64(m+1), int64(j))
			t.SetInt(binom)
			t.Mul(t, b[j])
			s.Add(s, t)
		}
		s.Quo(s, new(big.Rat).SetInt64(int64(m+1)))
		b[m] = s.Neg(s)
	}
	return b
}

// GammaStirling returns Γ(x) for x > 0 rounded to prec bits, by Stirling's
// series for ln Γ at the shifted argument x + N followed by the downward
// recurrence Γ(x) = Γ(x + N) / (x(x+1)⋯(x+N−1)):
//
//	ln Γ(w) = (w − ½) ln w − w + ½ ln(2π) + Σ_{k=1}^{m} B_{2k} / (2k(2k−1) w^(2k−1)) + R_m
//
// with N and m chosen so the first omitted term, which bounds R_m for real
// w > 0, is below 2^-(prec+guard). It is slow (exact Bernoulli numbers) and
// serves as an independent check of [GammaThird].
//
// References:
//   - DLMF 5.11.1 (the series), 5.11(ii) (the bound on R_m for real w), 5.5.1.
func GammaStirling(x *big.Float, prec uint) *big.Float {
	wp := prec + guard + 16
	// Terms behave like 2(2k)!/((2π w)^(2k) 2k(2k−1)) · w; with w ≥ prec/2 and
	// m = prec/4 the first omitted term is far below 2^-wp (see the tests).
	n := int64(prec/2) + 10
	m := int(prec/4) + 10
	bern := Bernoulli(2*m + 2)
	w := newf(wp).Add(x, fint(n, wp))
	lw := Log(w, wp)
	pi := Pi(wp)
	twoPi := newf(wp).Mul(pi, fint(2, wp))
	half := newf(wp).SetFloat64(0.5)
	s := newf(wp).Sub(w, half)
	s.Mul(s, lw)
	s.Sub(s, w)
	l2p := Log(twoPi, wp)
	l2p.Mul(l2p, half)
	s.Add(s, l2p)
	w2 := newf(wp).Mul(w, w)
	wpow := newf(wp).Set(w) // w^(2k−1)
	t := newf(wp)
	for k := 1; k <= m; k++ {
		if k > 1 {
			wpow.Mul(wpow, w2)
		}
		t.SetRat(bern[2*k])
		t.Quo(t, fint(int64(2*k*(2*k-1)), wp))
		t.Quo(t, wpow)
		s.Add(s, t)
		if bitsOf(t) < -int(wp)-8 {
			break
		}
	}
	g := Exp(s, wp)
	p := newf(wp).Set(x)
	den := fint(1, wp)
	for i := int64(0); i < n; i++ {
		p.Add(round(x, wp), fint(i, wp))
		den.Mul(den, p)
	}
	return g.Quo(g, den).SetPrec(prec)
}
