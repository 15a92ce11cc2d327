// Package basis solves the tilted well by Rayleigh–Ritz in the N lowest
// states of the untilted well: for infinite walls the sine states,
//
//	χ_m(ξ) = √2 sin(mπξ),  m = 1..N,
//
// with every level carrying a bracket built from the residual of its Ritz
// pair against the full (infinite) operator; for finite barriers and
// layered wells the states of the untilted stack in a box (see "Finite
// barriers" below).
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
// # Finite barriers
//
// With a finite [Solver.Stack] (a single finite well or any layered
// stack) the levels are resonances under a field and bound states at
// f = 0, and the method is Rayleigh–Ritz in a box [a, b] that holds every
// inner layer and part of each outer one, in the basis of the untilted
// stack's own box states,
//
//	−(1/π²) d/dξ (1/μ) dχ_m/dξ + v(ξ) χ_m = E_m χ_m,   χ_m(a) = χ_m(b) = 0,
//
// closed forms per layer (cosines and sines, or hyperbolic functions)
// with φ and (1/μ)φ′ continuous at every interface (BenDaniel–Duke), the
// levels E_m the roots of the Prüfer angle. In this basis the untilted
// part of the Hamiltonian, the BenDaniel–Duke kinetic term with the band
// edges, is diagonal; the tilt f(ξ − ½) and a Potential are integrated by
// Gauss–Legendre quadrature on each layer. (A plain sine basis on the
// box, with the kinetic matrix ∫(1/μ)φ_m′φ_n′ in closed form, converges
// only as 1/N where the mass steps: the kink of φ there makes its sine
// coefficients fall as m⁻². In the basis of box states the tilted level's
// error falls as N⁻⁵ or faster.)
//
// The box's walls are then removed to all orders: with G the 2×2 matrix
// of the box's Green's function at the outer interfaces and D the
// difference between the logarithmic derivatives of the wall's solution
// and of the one the outer layer keeps (Airy functions of the linear
// potential under a field, DLMF 9.2; exponentials at f = 0), the levels
// of the whole line solve det(I − G D/π²) = 0. Near a Ritz value θ this is
// η = θ − vᵀD̃(I − SD̃)⁻¹v (v the Ritz function at the interfaces, S the
// regular part of G), solved by Newton's method. On the downhill side the
// outer wave is outgoing, Ai − iBi; the width of a narrow level follows
// from the imaginary part of D to full relative precision (the flux
// form, down to 1e-300 and below), and a broad one (where (Γ/2)²∂ln Γ/∂η
// is not below rounding) from the complex root itself. See greens.go for
// the formulas.
//
// The box: beyond each outer interface, as deep as the level's decay
// exponent ∫κ dξ reaches 9 (κ = π√(μ(v(ξ) − η)) for the highest level
// asked for), at most DefaultBox; on the downhill side under a field, if
// the barrier ends first, the first zero of Bi beyond the classical
// turning point (where the real problem's solution vanishes, so that the
// top level's box state is its own); at f = 0 without a potential,
// exponent 19, at most 1000. [Solver.Box] sets the depth instead.
//
// The error estimate (all [tiltwell.Estimate]s, except at f = 0) adds:
// the Ritz truncation, ‖(1 − P)Wψ‖²/(E_(N+1) + min W − θ) (a bound on
// the second-order energy of the states beyond the basis, W the tilt and
// potential); the wall's error, from the part of G beyond the basis,
// which falls as N⁻³: measured from the change of η − θ and Γ since a
// smaller basis on the same box (0.7N, or the previous size of the
// automatic choice), over (N/N′)³ − 1, taken twice (the median ratio
// of the estimate to the true error is then 2.0 where that term
// dominates on the large grid below); for a narrow width, the orders its
// formula drops, (Γ/2)²χ and Γ's relative Γχ(ε + Γχ/2)/2 (χ = ∂ln Γ/∂η,
// ε = Ai/Bi at the interface), twice the Ritz function's error at the
// interface (from the residual, by |δ(ξ)|² ≤ 2‖δ‖‖δ′‖), and
// ∂Γ/∂η = χΓ times η's error; and the rounding of the sums and of the
// Newton iteration.
//
// At f = 0 without a potential the levels are the Dirichlet box's roots
// E_D, upper bounds (min–max: the box's functions are admissible for the
// line), and the Neumann box's roots E_N bound them from below (min–max
// again, decoupling the outer half-lines, whose spectra start at their
// band edges): [E_N, E_D] is a rigorous bracket, reported as
// [tiltwell.Rigorous] with Energy = E_D, Err = E_D − E_N + rounding
// (1e-16 to 1e-15, TestFiniteZeroField).
//
// A level is confined, as in the exact solver, if it lies below the lower
// outer band edge at its interface by more than its Err, and under a
// field if its width is below the distance to the next Ritz value and to
// the level below; levels beyond are not returned (a
// [*tiltwell.ConfinedError] with the confined ones).
//
// Measured against exact.Solver{Stack} (TestFiniteLargeGrid, run with
// -basis.largegrid: barrier heights 2 to 100 E₁, mass ratios 1 to 2,
// symmetric and asymmetric, fields 0 to 10 and −2, every level the exact
// solver confines, up to 12: 1121 levels, 706 with Γ > 0): the energy
// estimate is below the true error on 3 levels (0.27%, at most 3.1×
// below, a small basis, N = 48, where the wall's error has not yet
// settled to N⁻³) and never more than 10× above it where it exceeds
// 1e-12 (at most 9.4×); the width's estimate is below the true error on
// 4 (0.57%, at most 2.6×), more than 10× above on 1 (11.7×, where Γ's
// error changes sign between basis sizes). On the default grid of
// TestFiniteAgainstExact no estimate is more than 10× pessimistic (at
// most 6.2× for energies, 9.9× for widths). 15 levels the exact
// solver confines are not returned: very broad resonances (Γ from 0.09 to
// 1.6, where no Ritz value of the box stands for the level) and levels
// within about 1e-3 of the barrier top at weak fields. The automatic size
// reaches Tol for the Ritz truncation; for broad resonances the wall's
// error (N⁻³) is pursued only to N = 256 and reported as it is. exact.Check
// (exacttest.TestSolver) with MaxRatio 10 passes on the demo
// GaAs/AlGaAs-like well and a deep well to f = 10 (TestFiniteCheck).
//
// Cost (BenchmarkFiniteLevels, beside the exact solver in the same run on
// a loaded 2-core machine): at f = 0 about 50 times the exact solver's time
// per level, for narrow resonances 150 to 220 times, at strong fields
// with broad top levels 500 to 3000 times (0.2 to 60 ms per call): the
// method is a cross-check, not an inner loop. Levels does not allocate in
// steady state (TestFiniteAllocs).
//
// A Potential acts between the outer interfaces only (the outer layers
// stay pure, so that their closed forms hold), and is mirrored with the
// stack for f < 0.
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
//     https://dlmf.nist.gov/9.9; §9.2, §9.4, §9.7 (Airy functions).
//   - D. J. BenDaniel and C. B. Duke, Phys. Rev. 152, 683 (1966)
//     (interface conditions).
//   - G. Gamow, Z. Phys. 51, 204 (1928) (the flux form of the width).
//   - M. G. Krein's formula for the resolvent under a finite-rank change of
//     boundary conditions (from memory; derived in greens.go).
package basis
