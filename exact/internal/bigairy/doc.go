// Package bigairy is an arbitrary-precision (math/big) reference for the
// Airy functions and the levels of the tilted infinite well. It is slow by
// design (milliseconds to seconds per value) and exists for two jobs: to
// generate the float64 Airy table of package exact, and to check the fast
// exact solver in its tests against values good to far more than float64.
//
// Everything is computed from scratch at the requested precision in bits:
// π by Machin's formula, e^x, ln x, arctan x, square and cube roots, Γ(1/3)
// and Γ(2/3) by the arithmetic–geometric mean (checked against Stirling's
// series with exact Bernoulli numbers), the Airy functions by their
// Maclaurin series with the working precision raised to cover cancellation,
// and the continuous Airy phase Θ(z) = atan2(Ai(z), Bi(z)) of DLMF §9.8.
//
// The levels of H = −(1/π²) d²/dξ² + f(ξ − ½) on [0, 1] with Dirichlet walls
// come by two independent routes: [LevelAiry] finds the root of the Airy
// determinant, bracketed by the phase count ⌊(Θ(z₀) − Θ(z₁))/π⌋, where the
// Airy arguments are moderate; [LevelShoot] integrates the equation in ξ by
// Taylor series and counts nodes with a Prüfer angle, which works at every
// field, including tiny f where the Airy arguments are of size 1e5 and
// more. [Level] picks the cheaper of the two. The tests hold them against
// each other to the working precision.
//
// Arguments are never modified; results are new values rounded to the
// requested precision. All functions are safe for concurrent use (the
// constants π, Γ(1/3) and the Airy initial values are cached behind a mutex).
package bigairy
