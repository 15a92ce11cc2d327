// Package perturb is Rayleigh–Schrödinger perturbation theory in the field
// for the tilted infinite well: the cheapest method, first or second order
// in f, for any level, with an error estimate from the series itself.
//
// In reduced units (see package tiltwell) the Hamiltonian is H₀ + fV with
// H₀ = −(1/π²) d²/dξ², levels n² and states φ_n = √2 sin(nπξ), and
// V = ξ − ½. [Solver] implements [tiltwell.WaveSolver]:
//
//	perturb.Solver{Order: 1}   η_n = n²
//	perturb.Solver{Order: 2}   η_n = n² + C_n f²   (the zero value)
//
// with the normalized first-order wavefunction ([Solver.Wavefunction]) and
// the dipole to first order ([Solver.Dipole]).
//
// # First order
//
// The first-order shift f⟨n|ξ − ½|n⟩ is zero: φ_n² is symmetric about
// ξ = ½ and ξ − ½ is odd about it. So is every odd order, since η_n(f) is
// even in f (mirror symmetry). The first-order wavefunction has the closed
// form given at [Solver.Wavefunction], found by solving
// ψ₁″ + n²π² ψ₁ = π² (ξ − ½) φ_n with the resonant ansatz
// (a ξ² + b ξ) cos(nπξ) + c ξ sin(nπξ).
//
// # Second order
//
// With ⟨m|ξ|n⟩ = −8mn/(π²(m² − n²)²) for m + n odd and 0 for m + n even
// (m ≠ n),
//
//	C_n = Σ_(m≠n) |⟨m|ξ|n⟩|²/(n² − m²) = −(64 n²/π⁴) Σ_(m ≥ 1, m+n odd) m²/(m² − n²)⁵.
//
// The summand is even in m and vanishes at m = 0, so with p = m − n the sum
// is half the sum over all odd integers p of g(p) = (p + n)²/(p⁵ (p + 2n)⁵).
// Since g(−2n − p) = g(p), its partial fractions are
// Σ_j A_j [p^(−j) + (−1)^j (p + 2n)^(−j)], j = 1…5, with A_j the Taylor
// coefficients of (p + n)²(p + 2n)^(−5) at p = 0: A₄ = −1/(64n⁴) and
// A₂ = 5/(256n⁶). Over the odd integers, shifting by the even 2n changes
// nothing, the odd powers cancel, and Σ p⁻² = π²/4, Σ p⁻⁴ = π⁴/48 (from
// ζ(2) = π²/6, ζ(4) = π⁴/90, DLMF 25.6.1, and the factor 2(1 − 2^(−s)) for
// odd p of both signs). Hence
//
//	Σ m²/(m² − n²)⁵ = A₂ π²/4 + A₄ π⁴/48 = 5π²/(1024 n⁶) − π⁴/(3072 n⁴),
//	C_n = 1/(48 n²) − 5/(16 n⁴ π²) = (n²π² − 15)/(48 n⁴ π²).
//
// The ground level red-shifts (C₁ < 0), the others blue-shift, and
// C_n → 1/(48n²), the two-wall WKB result. The tests check C_n against
// published values, the direct sum for n = 1…20 and a fit of exact levels.
//
// # Error estimates and the validity limit
//
// The coefficients c₄, …, c₁₀ of η_n(f) = n² + C_n f² + c₄ f⁴ + … are
// computed once per level (on first use, 64 levels at a time) by the
// Rayleigh–Schrödinger recursion, solved in closed form: every order of the
// wavefunction is a polynomial times cos(nπξ) plus a polynomial times
// sin(nπξ), so no basis is truncated. The error estimate of an order-P
// energy is the sum of the known neglected orders plus an allowance for the
// rest (see [Solver]); it is held against the exact Airy reference over
// fields from 0 to the validity limit for levels 1…12, where it never
// undershoots the true error and overshoots it by at most 10% (energies)
// and 43% (dipoles).
//
// The validity limit ([Solver.Limit]) is where the series stops being
// trusted: the last computed orders grow past 5% of the first neglected
// one, or the first neglected order past 10% of the distance to the
// nearest other level. It grows like n² (about 6 for n = 1 and 2 at
// second order, 280 for n = 12; the radius of convergence, judged from the
// ratios of the coefficients, is about 10.5 for n = 1 and 2). Beyond it the solver still answers, with an error
// wrapping [tiltwell.ErrOutOfRange]; the estimate there is usually
// pessimistic, but not always (it was seen to undershoot at three times
// the first-order limit), and levels may come out of order in energy.
//
// References:
//   - J. J. Sakurai and J. Napolitano, Modern Quantum Mechanics, 2nd ed.
//     (Addison-Wesley, 2011), §5.1 (Rayleigh–Schrödinger series; from
//     memory).
//   - NIST Digital Library of Mathematical Functions, https://dlmf.nist.gov,
//     25.6.1 (ζ(2), ζ(4)).
//   - D. J. Griffiths, Introduction to Quantum Mechanics, 2nd ed. (Pearson,
//     2005), §8.3 (WKB with two hard walls; from memory), used in the tests.
package perturb
