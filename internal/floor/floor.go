// Package floor gives rigorous lower bounds on the levels of the tilted
// infinite well, for the methods that certify brackets (basis, variational)
// and need a bound on the next level without solving for it.
//
// In reduced units, H = −(1/π²) d²/dξ² + f (ξ − ½) on [0, 1] with Dirichlet
// walls. Two comparisons bound η_n from below:
//
//	η_n ≥ n² − |f|/2                    (f(ξ − ½) ≥ −|f|/2; min–max)
//	η_n ≥ −|f|/2 + |a_n| (|f|/π)^(2/3)  (the half-line triangular well)
//
// The second holds because extending the domain to the half-line with the
// same potential lowers every Dirichlet level (min–max on H¹₀(0, 1) ⊂
// H¹₀(0, ∞)), and the half-line levels are −|f|/2 + |a_n|(|f|/π)^(2/3), a_n
// the zeros of Ai (L. D. Landau and E. M. Lifshitz, Quantum Mechanics, §24,
// from memory).
//
// The package is internal: the bounds are a building block, and the exact
// solver's own levels are the reference users should call.
package floor

import "math"

const eps = 0x1p-52

// aiZeros holds |a_k|, k = 1..10, the magnitudes of the zeros of Ai, from
// DLMF Table 9.9.1 (https://dlmf.nist.gov/9.9#T1), to 16–17 digits.
var aiZeros = [...]float64{
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

// AiZero returns |a_k|, the magnitude of the k-th zero of Ai, for k ≥ 1:
// the table for k ≤ 10, and beyond it the asymptotic expansion
//
//	a_k = −T(3π(4k − 1)/8),
//	T(t) ~ t^(2/3) (1 + 5/48 t⁻² − 5/36 t⁻⁴ + 77125/82944 t⁻⁶
//	        − 108056875/6967296 t⁻⁸ + 162375596875/334430208 t⁻¹⁰)
//
// (DLMF 9.9.6 and 9.9.18; the t⁻⁶..t⁻¹⁰ coefficients from memory, checked in
// the tests against the table and against exact.AiZero). For k ≥ 11,
// t > 50 and the first omitted term is below 1e-16 relative; the float64
// evaluation adds a few ulps (below 1.5e-15 relative, tested). AiZero(k)
// for k < 1 returns NaN; callers pass level numbers, which are ≥ 1.
func AiZero(k int) float64 {
	if k < 1 {
		return math.NaN()
	}
	if k <= len(aiZeros) {
		return aiZeros[k-1]
	}
	t := 3 * math.Pi * (4*float64(k) - 1) / 8
	u := 1 / (t * t)
	s := 1 + u*(5.0/48+u*(-5.0/36+u*(77125.0/82944+u*(-108056875.0/6967296+u*(162375596875.0/334430208)))))
	return math.Pow(t, 2.0/3) * s
}

// Level returns a rigorous lower bound on η_n at reduced field f (either
// sign): the larger of the two bounds in the package documentation, lowered
// by 16ε(n² + |tri| + |f|) so that the rounding of the float64 evaluation,
// including the few ulps of [AiZero], cannot lift it above the true bound.
func Level(f float64, n int) float64 {
	af := math.Abs(f)
	nn := float64(n) * float64(n)
	lo := nn - af/2
	tri := 0.0
	if af > 0 {
		tri = -af/2 + AiZero(n)*math.Cbrt(af*af/(math.Pi*math.Pi))
		lo = max(lo, tri)
	}
	return lo - 16*eps*(nn+math.Abs(tri)+af)
}
