package variational

import "math"

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
