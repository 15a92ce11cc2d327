// Package basis solves the tilted infinite well by Rayleigh–Ritz in the N
// lowest sine states of the untilted well,
//
//	χ_m(ξ) = √2 sin(mπξ),  m = 1..N,
//
// with every level carrying a bracket built from the residual of its Ritz
// pair against the full (infinite) operator.
//
// In this basis the tilted Hamiltonian has the analytic matrix elements
//
//	⟨m|H|n⟩ = m² δ_mn + f ⟨m|ξ − ½|n⟩,
//	⟨m|ξ − ½|n⟩ = −8mn / (π² (m² − n²)²)   for m + n odd, 0 otherwise,
//
// (the dipole matrix elements of the infinite well, from the integral of
// ξ sin(mπξ) sin(nπξ)). One symmetric eigen-decomposition (gonum's LAPACK)
// gives all N Ritz values at once; they are upper bounds on the
// exact levels (Hylleraas–Undheim–MacDonald) and decrease monotonically,
// interlacing, as N grows. The lowest levels converge as N⁻⁷ (see
// [Solver]).
//
// The error bars are certified: the part of each Ritz pair's residual that
// lies outside the basis has the closed form r_m = f ⟨m|ξ − ½|ψ⟩ (m > N),
// summed explicitly to m = 2N with a proven tail bound beyond; one
// perturbative correction step outside the basis gives a trial function
// whose residual is far smaller, and the Kato–Temple inequality turns it
// into a lower bound, with the gap measured to a proven lower bound on the
// next level. Levels without a user potential are marked
// [tiltwell.Rigorous].
//
// A user potential V(ξ) can be added to the tilt ([Solver.Potential]), with
// matrix elements by Gauss–Legendre quadrature. No exact reference exists
// then; the Ritz values remain upper bounds (up to quadrature error) and the
// error bars become [tiltwell.Estimate]s, as the [Solver] documentation
// explains.
//
// References:
//   - E. A. Hylleraas and B. Undheim, Z. Phys. 65, 759 (1930); J. K. L.
//     MacDonald, Phys. Rev. 43, 830 (1933): Ritz roots are upper bounds and
//     interlace as the basis grows.
//   - G. Temple, Proc. R. Soc. Lond. A 119, 276 (1928); T. Kato, J. Phys.
//     Soc. Japan 4, 334 (1949): lower bounds from the variance.
//   - B. N. Parlett, The Symmetric Eigenvalue Problem (SIAM, 1998), §10.5
//     (Kato–Temple) and §11.4 (Rayleigh–Ritz).
//   - N. J. Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed.
//     (SIAM, 2002), §3.1 and §3.5 (rounding of sums and inner products).
//   - NIST Digital Library of Mathematical Functions, §9.9 (zeros of Ai),
//     https://dlmf.nist.gov/9.9.
package basis
