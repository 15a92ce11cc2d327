package variational

import "math"

// airyZeros holds |a_k|, k = 1..10, the magnitudes of the zeros of Ai, from
// DLMF Table 9.9.1 (https://dlmf.nist.gov/9.9#T1), to 16 digits.
var airyZeros = [...]float64{
	2.338107410459767,
	4.0879494441309706,
	5.5205598280955511,
	6.786708090071759,
	7.9441335871208531,
	9.0226508533409804,
	10.040174341558086,
	11.008524303733263,
	11.936015563236263,
	12.828776752865757,
}

// airyZero returns |a_k|, the magnitude of the k-th zero of Ai (k ≥ 1):
// the table above for k ≤ 10, and beyond it the asymptotic expansion
//
//	a_k = −T(3π(4k − 1)/8),
//	T(t) ~ t^(2/3) (1 + 5/48 t⁻² − 5/36 t⁻⁴ + 77125/82944 t⁻⁶
//	        − 108056875/6967296 t⁻⁸ + 162375596875/334430208 t⁻¹⁰),
//
// (DLMF 9.9.6 and 9.9.18; the t⁻⁶..t⁻¹⁰ coefficients from memory, checked
// in the tests against the table at k = 6..10, where the truncation error
// is already below 1e-13 relative). For k ≥ 11, t > 50 and the first
// omitted term is below 1e-16 relative.
func airyZero(k int) float64 {
	if k <= len(airyZeros) {
		return airyZeros[k-1]
	}
	return airyZeroAsymptotic(k)
}

func airyZeroAsymptotic(k int) float64 {
	t := 3 * math.Pi * (4*float64(k) - 1) / 8
	u := 1 / (t * t)
	s := 1 + u*(5.0/48+u*(-5.0/36+u*(77125.0/82944+u*(-108056875.0/6967296+u*(162375596875.0/334430208)))))
	return math.Pow(t, 2.0/3) * s
}

// levelFloor returns a rigorous lower bound on η_n at reduced field f ≥ 0:
// the larger of
//
//	n² − f/2                       (f(ξ − ½) ≥ −f/2, min–max),
//	−f/2 + |a_n| (f/π)^(2/3)       (the triangular well on the half-line:
//	                                extending the domain to [0, ∞) with the
//	                                same potential lowers every Dirichlet
//	                                level, min–max on H¹₀(0,1) ⊂ H¹₀(0,∞)),
//
// shaded down by a few units in the last place so that rounding cannot lift
// it above the true floor.
func levelFloor(n int, f float64) float64 {
	nn := float64(n)
	lo := nn*nn - f/2
	if f > 0 {
		tri := -f/2 + airyZero(n)*math.Pow(f/math.Pi, 2.0/3)
		lo = math.Max(lo, tri)
	}
	return lo - 8*eps*(math.Abs(lo)+f)
}

const eps = 0x1p-52

// templeLower returns Temple's lower bound E − σ²/(α − E) on the level
// whose trial function has Rayleigh quotient E ∈ [eLo, eHi] and variance at
// most s2, given α ≤ the next level above it, and whether its condition
// eHi < α holds (G. Temple, Proc. R. Soc. Lond. A 119, 276 (1928); see
// the package documentation for the form used for excited levels).
func templeLower(eLo, eHi, s2, alpha float64) (float64, bool) {
	if !(eHi < alpha) {
		return math.Inf(-1), false
	}
	return eLo - s2/(alpha-eHi), true
}

// gaussBound returns a bound on the error of the N-point Gauss–Legendre
// rule on [0, 1] for an integrand analytic in the image of the Bernstein
// ellipse E_ρ (foci ±1 in t = 2ξ − 1, semi-axis sum ρ) and bounded by M
// there:
//
//	|I − I_N| ≤ ½ · (64/15) M ρ^(−2(N−1)) / (ρ² − 1)
//
// (L. N. Trefethen, "Is Gauss quadrature better than Clenshaw–Curtis?",
// SIAM Rev. 50, 67 (2008), Theorem 4.5, from memory; stated there for the
// (n+1)-point rule with exponent 2n, used here with n = N − 1, and the
// factor ½ maps [−1, 1] to [0, 1]).
func gaussBound(m, rho float64, npts int) float64 {
	if !(m >= 0) {
		return math.Inf(1)
	}
	// In logarithms: M may be huge and ρ^(−2(N−1)) tiny.
	return math.Exp(math.Log(32.0/15*m) - 2*float64(npts-1)*math.Log(rho) - math.Log(rho*rho-1))
}

// ellipseRhos are the ellipse parameters tried when bounding quadrature
// errors; each bound is valid for any of them, and the smallest is used.
var ellipseRhos = [...]float64{1.25, 1.5, 2, 3, 4, 6, 8, 12, 16, 24, 32}

// funcBounds sets b0, b1, b2 to bounds of |q|, |q′|, |q″| on the image of
// E_ρ for each basis function q of the space (full mode), from its
// expansion coefficients.
func (sp *space) funcBounds(rho float64, b0, b1, b2 []float64) {
	a := (rho + 1/rho) / 2 // semi-axes of E_ρ in t
	b := (rho - 1/rho) / 2
	ab := math.Abs(sp.beta)
	emax := math.Exp(ab * (a - 1) / 2) // |e^(−β(z−ξr))| on the ellipse
	for j := range sp.dim {
		c := sp.coef[j*ncoef : (j+1)*ncoef]
		var g0, g1, g2 float64
		if sp.shape == sineShape {
			for k := 1; k < ncoef; k++ {
				if c[k] == 0 {
					continue
				}
				kp := float64(k) * math.Pi
				ch := math.Abs(c[k]) * math.Cosh(kp*b/2) // |sin|, |cos| ≤ cosh(Im)
				g0 += ch
				g1 += kp * ch
				g2 += kp * kp * ch
			}
		} else {
			// g = (1 − t²)/4 · Σ c_k t^k = Σ g_k t^k, g_k = (c_k − c_{k−2})/4;
			// d/dξ = 2 d/dt, |t| ≤ a.
			ak := 1.0 // a^k
			for k := 0; k < ncoef+2; k, ak = k+1, ak*a {
				gk := 0.0
				if k < ncoef {
					gk += c[k]
				}
				if k >= 2 {
					gk -= c[k-2]
				}
				gk = math.Abs(gk) / 4
				if gk == 0 {
					continue
				}
				fk := float64(k)
				g0 += gk * ak
				g1 += gk * 2 * fk * ak / a
				g2 += gk * 4 * fk * (fk - 1) * ak / (a * a)
			}
		}
		b0[j] = emax * g0
		b1[j] = emax * (g1 + ab*g0)
		b2[j] = emax * (g2 + 2*ab*g1 + ab*ab*g0)
	}
}
