// Package variational brackets the levels of the tilted infinite well
// (and, see "Finite wells" below, of a single finite well),
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
// # Finite wells
//
// With a [Solver.Stack] holding a single finite well (left barrier v_L,
// μ_L; the reference well; right barrier v_R, μ_R; both above the well)
// the Poly and Tilt families solve
//
//	H = −(1/π²) d/dξ (1/μ(ξ)) d/dξ + v(ξ) + f (ξ − ½)
//
// with φ and (1/μ)φ′ continuous at the interfaces (BenDaniel–Duke),
// after [tiltwell.Stack.Fold], so that f ≥ 0 and the left barrier is the
// downhill one. Other stacks, and the Sine family, are refused with an
// error wrapping errors.ErrUnsupported; |f| is limited to
// [FiniteMaxField].
//
// Zero field. The levels below both barriers are bound states, each
// bracketed, proven up to rounding, by Kato's inclusion around the
// closed-form state of internal/squarewell made to satisfy the matching
// conditions exactly (its right tail takes the decay that matches the
// well's slope), with the interval (α′, α) that holds the level alone
// taken from the phase condition k + δ_L(k) + δ_R(k) = nπ without
// solving it (the phases rise with k and lie in [0, π/2)). The brackets
// are a few ulps wide for ordinary wells and up to 7e-12 for barriers of
// 1e12 E₁ (the matched tail inherits the residual of the computed root);
// beyond about 1e30 E₁ no matched state can be formed in float64 and the
// bracket is an estimate (TestZeroFieldBracket). Levels beyond the well's
// bound count come back with a [*tiltwell.ConfinedError].
//
// Poly under a field (this package's own design). Only the well is
// expanded, in every polynomial of degree ≤ d + 1 times the envelope
// e^(−β(ξ−ξr)) (d bubbles ξ(1−ξ)(2ξ−1)^j e^(−βξ) and two interface
// functions; β the trend of the infinite-well optimum, not searched,
// d = min(2k + Extra − 2 + ⌈0.8 f^(1/3)⌉, 40), at least 12). Each barrier enters through
// the logarithmic derivative Λ(η) of its exact real solution at the
// interface (Ai uphill; downhill the modulus M of the outgoing wave
// Ai − iBi, whose logarithmic derivative is the real part of the outgoing
// one, DLMF 9.2.11 and 9.8.3), as the boundary term Λψ(interface)²/(μπ²)
// of the energy, which is what the barrier contributes for that solution.
// The level is the fixed point of the n-th Ritz value of this
// energy-dependent pencil, found through a 2×2 secular matrix (the update
// has rank two), a bisection on the inertia count (Haynsworth) that
// isolates it from the poles and Newton's method on the pole-deflated
// determinant. At f = 0 such a fixed point is a proven upper bound (the
// barrier terms fall as η rises; min–max), and at f > 0 it bounds the
// level η₀ of the real problem from above; the resonance η_r − iΓ/2 is
// not a bound state, so the level is reported as an Estimate with
//
//	Err ≈ convergence + rounding + |δ₂|(1 + x(1 + 3ε²)),
//
// the convergence from the nested spaces with 4 and 8 fewer bubbles (the
// tail of a geometric sequence), the rounding 80ε(1 + |η| + f/2), and δ₂
// the second-order shift of the level by the imaginary part of the
// outgoing boundary term (ε relative to the real part), η_r = η₀ + δ₂
// to second order, with its relative remainder bounded by
// x(1 + 3ε²), x = |δ₂|/(Γ₁/2), as measured on the test grid. A level is not
// confined when it lies above the ceiling min(v_L − f/2, v_R + f/2), when
// Γ₁ exceeds its distance to the level below, or when x(1 + 3ε²) > 0.5
// (too broad for the real variational problem: on the test grid the
// levels refused so had Γ from 0.013 up; the broadest answered, 1.2).
//
// Escape width. The real problem does not see escape: Gamma is 0, and
// GammaErr holds the first-order width Γ₁ = −2 Im δ₁ of the level's own
// trial function (the golden rule with the exact Airy flux through the
// downhill barrier), widened by the same remainder and 1e-6: Γ₁ is within
// 1e-10 of the exact Γ for narrow levels and within 3% at Γ = 0.5.
//
// Tilt under a field. The one-parameter function φ₁(ξ)e^(−β(ξ−½)) of
// Bastard, Mendez, Chang and Esaki, φ₁ the zero-field ground state, with
// its energy a closed form per region (exponentials in the barriers,
// exponentials times sines in the well; see ftilt in finitetilt.go). It
// stays normalizable for −κ_R < β < κ_L, and as β → κ_L it spreads into
// the downhill barrier and its energy falls without limit: the minimum
// over β is a local one, a stationary value for the resonance and not a
// bound, reported as an Estimate whose bracket reaches across the Poly
// space's estimate of the level (its Err is its distance from that
// estimate plus the estimate's own uncertainty). Where E(β) has no local
// minimum below κ_L the level is not confined for Tilt.
//
// Measured against the exact finite-barrier solver (TestFiniteAgainstExact
// with -finite-random=300: barriers 2 to 50 E₁, mass ratios 1 to 2,
// symmetric and asymmetric, |f| ≤ 10, every level the exact solver
// confines): Poly, 26 895 levels, no Err below the true error, Err/true
// error median 1.02 and worst 1.75 where the true error exceeds 1e-12;
// GammaErr/Γ worst 1.65; 500 of 27 395 exact levels (1.8%, all with
// Γ ≥ 0.013) not confined here. Tilt, 8 868 ground levels, none below,
// worst 1.24 (Γ: 1.11); 784 of 9 652 (8.1%, Γ ≥ 0.019) not confined. At strong fields
// (TestFiniteStrongField, barriers 300 to 2·10⁴ E₁, f up to 1000, twelve
// levels) none below and worst 3.2; near the rounding floor, about 1e-11
// at f = 1000, the ratio reached 9.2 on a wider grid. Cost
// (BenchmarkLevelsFinite, a 20 E₁ well, shared machine): 0.15 to 0.2 ms
// for one level at f = 1 or 3 and 0.3 to 0.5 ms for five (exact: 2 to
// 3 µs and 30 to 50 µs); at f = 0 about 1 to 4 µs, like exact. The Tilt
// family costs as much as Poly's ground level, which it needs for its
// error.
//
// References:
//   - G. Bastard, E. E. Mendez, L. L. Chang, L. Esaki, "Variational
//     calculations on a quantum well in an electric field", Phys. Rev. B
//     28, 3241 (1983).
//   - D. J. BenDaniel and C. B. Duke, Phys. Rev. 152, 683 (1966).
//   - G. H. Golub, "Some modified matrix eigenvalue problems", SIAM Rev.
//     15, 318 (1973) (secular equations of low-rank updates; from memory).
//   - E. V. Haynsworth, "Determination of the inertia of a partitioned
//     Hermitian matrix", Linear Algebra Appl. 1, 73 (1968) (from memory).
//   - I. J. Thompson and A. R. Barnett, J. Comput. Phys. 64, 490 (1986)
//     (Steed's continued fraction for K_ν; from memory).
//   - NIST DLMF, §9.2, §9.4, §9.6, §9.7, §9.8 (Airy functions).
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
