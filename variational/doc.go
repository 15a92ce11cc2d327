// Package variational brackets the levels of the tilted infinite well,
//
//	H = −(1/π²) d²/dξ² + f (ξ − ½),   φ(0) = φ(1) = 0
//
// (reduced units: energy η in E₁, field f in F₀, ξ ∈ [0, 1]), between a
// Rayleigh–Ritz upper bound and a Temple lower bound, without calling an
// exact solver. [Solver.Levels] reports the upper bound as the energy and
// the width of the bracket as the error, so that Energy − Err ≤ η ≤ Energy;
// [Solver.Brackets] returns the brackets themselves.
//
// # Trial families
//
//   - [Poly] (the default, this package's own design): the Ritz space
//     span{ξ(1−ξ)(2ξ−1)^j e^(−β(ξ−½)), j < d}. Polynomials converge
//     geometrically to the analytic eigenfunctions and the envelope
//     localizes the space at the low wall in a strong field.
//   - [Sine]: the tilted ground state and its harmonics,
//     span{sin(kπξ) e^(−β(ξ−½)), k = 1..d}.
//   - [Tilt]: the one-parameter tilt φ_β ∝ sin(πξ) e^(−β(ξ−½)) of Bastard,
//     Mendez, Chang and Esaki, ground level only, every expectation value
//     in closed form.
//
// For level n the Ritz spaces have d = min(2n + Extra, 40) functions, and
// β is chosen for each level to minimize the n-th Ritz value (Brent's
// method).
//
// # Bounds
//
// Upper bound. By the Hylleraas–Undheim–MacDonald theorem (min–max), the
// n-th Ritz value of any trial space of dimension d ≥ n is at least η_n,
// whatever β; minimizing over β keeps the bound.
//
// Lower bound. Let φ be a normalized trial function in the domain of H with
// E = ⟨H⟩ and σ² = ⟨H²⟩ − E², and α ≤ η_{n+1} with E < α. Then
//
//	η_n ≥ E − σ²/(α − E)
//
// (Temple's inequality; G. Temple, Proc. R. Soc. Lond. A 119, 276 (1928)).
// Proof, for any n: put a = E − σ²/(α − E). Then ⟨(H − a)(H − α)⟩ =
// σ² − (E − a)(α − E) = 0, so Σ_i |c_i|²(η_i − a)(η_i − α) = 0 over the
// eigen-expansion of φ. If no eigenvalue lay in [a, α), every term would
// be ≥ 0 and vanish, putting all the weight on η_i = α, so E = α: a
// contradiction. Some η_j lies in [a, α); as α ≤ η_{n+1}, j ≤ n, and
// η_n ≥ η_j ≥ a. No upper bound on η_{n−1} is needed. (Kato's inclusion
// (T. Kato, J. Phys. Soc. Japan 4, 334 (1949)) adds the upper end
// E + σ²/(E − α′) for an interval (α′, α) holding exactly one eigenvalue;
// the Ritz value is already a better upper bound, so it is not used.)
//
// The package takes φ = the n-th Ritz function and α the largest of the
// proven lower bounds on η_{n+1} at hand: the floor
//
//	max((n+1)² − |f|/2, −|f|/2 + |a_{n+1}| (|f|/π)^(2/3))
//
// (f(ξ − ½) ≥ −|f|/2; and the Dirichlet levels on [0, 1] lie above those
// of the same potential on the half-line [0, ∞), the triangular well, by
// min–max, a_k the zeros of Ai, DLMF Table 9.9.1 and 9.9.6), the proven
// lower bound found for level n+1 itself (the levels are processed from
// the top), and Temple's bound on η_{n+1} from the (n+1)-th Ritz function
// of level n's own space, with the proven lower bound on η_{n+2} (for the
// top requested level, the floor of level n+2) as its α.
//
// Temple's width σ²/(α − E) exceeds the true error E − η_n by about the
// mean energy of the residual over the gap, and a polynomial space's
// residual sits in its highest degrees. Where that term dominates the
// bracket (Poly, upper levels at f ≳ 100), the lower bound is taken, at
// the same tilt, from a larger verification space of 48 functions, whose
// Ritz function has a far smaller residual (σ² 1.5e-7 at d = 34 against
// 6e-12 at d = 48 for f = 500, n = 9). The upper bound, the reported
// energy, stays that of the searched space; the verification space's
// bound replaces the first if it is proven and the first is not, or if it
// is of the same kind and higher.
//
// The Sine and Tilt families take their lower bounds the same way from
// Poly spaces at their own tilt (Sine: Poly's dimension for the level, then
// 48 functions; Tilt: 8, 16 or 32 functions, grown until the bracket is at
// most twice the distance from the Tilt energy down to that space's Ritz
// value, itself an upper bound on η₁). Their own residuals lie in high
// harmonics, so their own Temple bounds were 400 (Sine, up to 3e3) and
// up to 20 (Tilt, f ≈ 3) times their true errors; with the Poly bound the
// bracket is as wide as the family's own error plus Poly's, and the
// reported energy is still the family's own Ritz value.
//
// When E < α fails, which happens for high levels at fields where no
// proven bound is close (on the test grid: n ≥ 7 at 50 ≤ f ≤ 200, 33 of
// 528 brackets), the lower bound is Temple's with an estimated α (the
// lower end of level n+1's bracket, or the Weinstein interval
// θ_{n+1} − σ_{n+1} of the next Ritz value of the searched or the
// verification space, D. H. Weinstein, Proc. Natl. Acad. Sci. USA 20, 529
// (1934)), or failing that Weinstein's E − σ, and the bracket is marked
// [tiltwell.Estimate]: such a bound is true whenever the estimate of α is,
// which the method does not prove. Estimated levels are verified in the
// 48-function space too: without it their width was up to 163× the true
// error (f = 86.76, n = 11; Temple's term of the searched space with an
// estimated α). The level's own floor replaces any lower bound that falls
// below it, and is proven.
//
// # What is proven
//
// For Tilt, E and σ² are closed forms (see tiltEnergy and tiltVariance in
// tilt.go, checked against quadrature in the tests). For Poly and Sine the
// trial space is built numerically: a Krylov (Stieltjes) basis — the starting function
// times powers of cos πξ (Sine) or of 2ξ − 1 (Poly), times the envelope —
// orthonormalized by Gram–Schmidt in a Gauss–Legendre inner product, with
// H, the Gram matrix and the residual of the Ritz function integrated by
// the same rule. The plain tilted sine basis is not used for computing:
// at the tilts a strong field wants it is singular to working precision
// (eight functions at β ≈ 40 give a Gram matrix of condition 1e15, and
// Ritz values far below the true levels). Every Gauss–Legendre sum carries
// a rigorous bound on its error, from bounds on the integrand in a
// Bernstein ellipse (L. N. Trefethen, SIAM Rev. 50, 67 (2008), Thm 4.5),
// and the bounds enter the bracket (they are below 1e-40 in practice). The
// Rigorous kind means: proven up to floating-point rounding. Rounding is
// not bounded by proof; each side of a bracket carries an allowance
// c·d·ε·(|η| + |f|/2 + 1), c = 4 (Poly), 8 (Poly's verification space)
// or 16 (Sine), calibrated against the exact reference (the raw Ritz
// values fall at most 0.3, 2.3 and 2.2 units below it on the test grid).
//
// # Accuracy
//
// Measured against the exact reference on 44 fields from 0 to 10⁴ (Sine:
// 20 fields to 10³) and every level, each field solved cold as Levels does
// (TestBracketsDense): no bracket misses the exact level. Poly: 495 of 528
// brackets rigorous (94%), width/true error median 2.0 (the rounding
// allowance on both sides), 90th percentile 3.1, worst 5.9 (f = 100,
// n = 2), none above 10; its 33 estimates (n ≥ 7, 50 ≤ f ≤ 200) median
// 2.0, worst 4.4 (f = 91.2, n = 12). The top level of a call for k < 12
// levels does as well (worst 5.7 over 50 fields from 0.01 to 10⁴ and
// k = 1, 2, 3, 5, 8, 11). Sine: median 1.0, worst 3.8 (f = 0.1, n = 12).
// Tilt: worst 1.01. TestCheck holds every family to 10× with
// exact.Check. Typical Poly widths: 1e-13 at f ≤ 10, 1e-11 at f = 100,
// 2e-10 at 10³ for the lowest five levels.
//
// Special cases are:
//
//	f = 0:  brackets about n² whose width is the rounding allowance (the
//	        spaces contain the sines, exactly for Sine, to 1e-15 for Poly)
//	f < 0:  the brackets of |f| (mirror symmetry), tilts of opposite sign
//
// References:
//   - G. Bastard, E. E. Mendez, L. L. Chang, L. Esaki, "Variational
//     calculations on a quantum well in an electric field", Phys. Rev. B
//     28, 3241 (1983).
//   - E. A. Hylleraas and B. Undheim, Z. Phys. 65, 759 (1930);
//     J. K. L. MacDonald, Phys. Rev. 43, 830 (1933).
//   - G. Temple, Proc. R. Soc. Lond. A 119, 276 (1928).
//   - T. Kato, J. Phys. Soc. Japan 4, 334 (1949).
//   - D. H. Weinstein, Proc. Natl. Acad. Sci. USA 20, 529 (1934).
//   - R. P. Brent, Algorithms for Minimization without Derivatives
//     (Prentice-Hall, 1973), ch. 5.
//   - L. N. Trefethen, "Is Gauss quadrature better than Clenshaw–Curtis?",
//     SIAM Rev. 50, 67 (2008).
//   - NIST DLMF, §9.9 (zeros of Ai), https://dlmf.nist.gov/9.9.
package variational
