// Package perturb is Rayleigh–Schrödinger perturbation theory in the field
// for the tilted infinite well and the tilted finite well: the cheapest
// method, first or second order in f, for any level, with an error
// estimate from the series itself. The sections up to "Finite wells"
// describe infinite walls (the zero [tiltwell.Stack]); that section
// describes a single finite well.
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
// # Finite wells
//
// With [Solver].Stack a single finite well ([tiltwell.FiniteWell],
// [tiltwell.AsymmetricWell]: barriers v_L, v_R in E₁ with mass ratios μ_L,
// μ_R) the unperturbed Hamiltonian is
//
//	H₀ = −(1/π²) d/dξ (1/μ) d/dξ + v(ξ),
//
// φ and (1/μ)φ′ continuous at ξ = 0 and 1 (D. J. BenDaniel and C. B. Duke,
// Phys. Rev. 152, 683 (1966)), and V = ξ − ½ acts on the whole line. Its
// levels are the exact roots η₀ = k²/π² of the phase condition
// k + atan(μ_L k/κ_L) + atan(μ_R k/κ_R) = nπ, κ_j = π√(μ_j(v_j − η₀)),
// with the states A e^(κ_L ξ), B sin(kξ + δ_L), C e^(−κ_R(ξ − 1))
// (internal/squarewell). Every level the well binds at f = 0 is available,
// up to [MaxLevels].
//
// First order. E₁ = ⟨φ₀|ξ − ½|φ₀⟩ over the whole line is, region by
// region,
//
//	E₁ = C²(1 + κ_R)/(4κ_R²) − A²(1 + κ_L)/(4κ_L²)
//	     − (B²/2) [(ξ − ½) sin(2kξ + 2δ_L)/(2k) + cos(2kξ + 2δ_L)/(4k²)]₀¹,
//
// zero for a symmetric well by parity (the solver then sets every odd
// order to zero exactly).
//
// Second order, by the method of A. Dalgarno and J. T. Lewis, Proc. R.
// Soc. A 233, 70 (1955): instead of a sum over states, solve for the
// first-order state φ₁ = F φ₀ with
//
//	(H₀ − η₀) F φ₀ = −(V − E₁) φ₀,   E₂ = ⟨φ₀|(V − E₁) F|φ₀⟩.
//
// In each layer μ is constant and the left side is
// −(1/π²)(1/μ)(F″φ₀ + 2F′φ₀′), so [(1/μ)F′φ₀²]′ = π²(V − E₁)φ₀², and the
// continuity of φ₁ and (1/μ)φ₁′ makes (1/μ)F′φ₀² continuous too. Hence
//
//	(1/μ) F′ φ₀² = π² S(ξ),   S(ξ) = ∫₋∞^ξ (V − E₁) φ₀² dξ′,
//
// S vanishes at both ends because E₁ = ⟨V⟩, and integrating E₂ by parts,
//
//	E₂ = −π² ∫ μ S²/φ₀² dξ,
//
// negative for the ground level: it red-shifts. This quadrature form has
// poles at the nodes of excited states, so the solver uses φ₁ itself,
// which is closed form layer by layer. With ψ₀ = sin θ in the well
// (θ = ku + θ₀, u = ξ − ½, θ₀ = k/2 + δ_L), a = sin δ_L and
// c = sin(k + δ_L) its values at the interfaces, x = ξ in the left
// barrier and y = ξ − 1 in the right one, the equation
// (H₀ − η₀)ψ₁ = −(V − E₁)ψ₀ has the solution
//
//	ψ₁ = [−π²u²/(4k) + π²E₁u/(2k) + α] cos θ + [π²u/(4k²) + β] sin θ    (well)
//	ψ₁ = (a_L x²/2 + b_L x) e^(κ_L x),
//	     a_L = π²μ_L a/(2κ_L),  b_L = −(π²μ_L a (½ + E₁) + a_L)/(2κ_L)   (ξ < 0)
//	ψ₁ = (a_R y²/2 + b_R y + γ) e^(−κ_R y),
//	     a_R = −π²μ_R c/(2κ_R),  b_R = (a_R − π²μ_R c (½ − E₁))/(2κ_R)  (ξ > 1)
//
// (only the decaying exponentials are allowed): α and β match ψ₁ and
// (1/μ)ψ₁′ at ξ = 0, γ matches ψ₁ at ξ = 1, and (1/μ)ψ₁′ then matches at
// ξ = 1 by itself (the solvability condition, which is E₁ = ⟨V⟩; its
// residual is tested). A multiple of ψ₀ is removed to make ⟨ψ₀|ψ₁⟩ = 0,
// and E₂ = ⟨ψ₀|V − E₁|ψ₁⟩/N₀ with N₀ = ⟨ψ₀|ψ₀⟩, all integrals closed forms
// (polynomial times exponential in the barriers, polynomial times
// trigonometric in the well). The tests check E₂ against the quadrature
// form above, against finite differences of an eigen-solve in a box, and,
// as v → ∞, against C_n of infinite walls (the difference shrinking like
// 1/√v). The finite well's quadratic Stark shift is several times larger
// than the infinite well's, the more so the shallower the well (G.
// Bastard, E. E. Mendez, L. L. Chang and L. Esaki, Phys. Rev. B 28, 3241
// (1983), from memory): with the barrier mass ratio μ = 1.37, E₂/C₁ is
// 1.5 for v = 50, 3.65 for the GaAs-like demo electron (v = 4.3, invented
// demo data) and 6.6 for v = 2.
//
// Higher orders. The same construction solves every order of the
// recursion of the section "Error estimates and the validity limit",
// (H₀ − η₀)ψ_j = −Vψ_(j−1) + Σ_(i≤j) E_i ψ_(j−i), E_j = ⟨ψ₀|V|ψ_(j−1)⟩/N₀:
// ψ_j is a polynomial of degree ≤ 2j times cos θ and sin θ in the well
// and times the decaying exponential in each barrier, so the series
// η_n(f) = η₀ + E₁f + … + E₁₀f¹⁰ is computed once per level with nothing
// truncated. The tests check E₃ = ⟨ψ₁|V − E₁|ψ₁⟩/N₀ and every order to
// 10 against Wigner's 2n+1 rule, and the sum of the series against the
// box eigen-solve to 2e-13. Each E_j carries a rounding allowance δE_j,
// 4ε times ∫|ψ₀ V ψ_(j−1)| over N₀, which matters only for the top orders
// of levels above about n = 50.
//
// # Estimates and range on finite wells
//
// The energies are η₀ + E₁f (Order 1) and η₀ + E₁f + E₂f² (Order 2), and
//
//	Err = |Σ_(P<j≤10) E_j f^j| + max_j (|E_j| + δE_j) f^j + Σ_j δE_j f^j + 8ε Σ|terms| + 1.5 Γ_q,
//
// the known neglected orders, the larger of the last two orders that
// symmetry does not remove as the allowance for those beyond 10, rounding,
// and a multiple of the quasiclassical escape width Γ_q for the shift of
// the level that no order of the series sees (the exact solver's levels
// were found up to 0.93 Γ_q beyond the rest of the estimate). Perturbation
// theory cannot see the escape width: Gamma is 0 and GammaErr = 2Γ_q, with,
// for the downhill barrier (the left one for f > 0) of height
// w = v_L − f/2 − η above the level at the interface,
//
//	Γ_q = (2/π²) (A² κ₀/μ_L) exp(−(4π√μ_L/(3f)) w^(3/2)),   κ₀ = π√(μ_L w),
//
// A the interface amplitude of the normalized state to fourth order (from
// ψ₀ … ψ₄ and their overlaps) and η the best energy of the series (summed
// to order 10 where its last terms are below its third- and fourth-order
// ones; beyond the level's validity limit, η₀). It is the outgoing flux (1/μ_L) Im(φ*φ′) in units of E₁ when the
// decaying tail A e^(κ₀ξ) is carried through the triangular barrier by
// WKB and connected at the turning point ξ = −w/f to the outgoing wave,
// whose modulus equals that of the tail's growing component there
// (DLMF 9.7.7, 9.7.9, 9.7.11: Bi(z) ~ e^ζ/(√π z^(1/4)) and
// |Ai(−z) − i Bi(−z)| ~ 1/(√π z^(1/4)); L. D. Landau and E. M. Lifshitz,
// Quantum Mechanics, §50, for the quasiclassical escape rate, from
// memory). Held against the exact solver's widths on the grid below it is
// within 0.957 to 1.14 of them.
//
// The validity limit ([Solver.Limit]) of a finite-well level is the first
// field at which
//
//   - the allowance for the orders beyond 10 reaches 5% of the first
//     neglected terms |E_(P+1)|f^(P+1) + |E_(P+2)|f^(P+2);
//   - those terms reach 10% of the distance from η₀ to the nearest other
//     bound level or to the lower barrier top;
//   - Γ_q reaches 1% of that distance, or the level reaches the top of the
//     downhill barrier at the interface;
//   - the neglected terms cancel (|Σ| < ¼ Σ|terms|) while the allowance for
//     what the series does not know is more than 0.1% of them: the error
//     passes through zero there over too wide a range of fields for an
//     estimate to follow it.
//
// It is about 2.6 and 1.3 for the first two levels of the GaAs-like demo
// well at Order 2, 4.9 for the ground level of v = 50 (6.4 with infinite
// walls), and tiny for a level near the barrier top (0.005 for the third
// level of the demo well, whose η₀ = 4.25 is 0.05 below the top): the
// series of such a level converges only at very weak fields. Beyond the
// limit the levels are still returned with a [*tiltwell.RangeError]. A
// level above the downhill barrier at the interface (by the best energy of
// the series, or by η₀ beyond the level's limit) is not confined: Levels
// returns the levels below it with a [*tiltwell.ConfinedError], as it does
// for levels the well does not bind at f = 0. The dipole has a limit of
// its own (the Order-2 limit, lowered where the neglected terms of dη/df
// cancel).
//
// Held against the exact finite-barrier solver (TestFiniteAgainstExact with
// -random-wells 400 -field-steps 40) on 427 wells (v_L, v_R from 2 to 50
// E₁, mass ratios 1 to 2, symmetric and asymmetric), every level it
// confines, both orders and the fields ±min(10, Limit)·i/40: no energy
// estimate fell below the true error on 229,600 points, and the worst was
// 3.3 times it; GammaErr never fell below Γ on 114,800 points and was at
// most 2.3 times it; the dipole estimate fell below the true error on 12
// of 112,203 points (0.01%, by less than 0.01% of itself, near the barrier
// top at weak field) and was at most 6.1 times it. The ordinary test run
// uses 47 of these wells.
//
// The series of a stack's levels are computed on its first use, level by
// level as they are asked for, and kept for the 16 stacks most recently
// added (a cache shared by all Solvers, safe for concurrent use). In one
// benchmark run (BenchmarkLevelsFinite, on a loaded two-core machine) a
// cached level cost 0.12 to 0.25 µs, 20 to 50 times less than the exact
// solver's 3.3 to 8.7 µs; a level of a stack not seen before cost 70 to
// 130 µs, 10 to 30 times more: perturbation theory pays on a finite well
// from a few dozen calls per stack.
//
// References:
//   - J. J. Sakurai and J. Napolitano, Modern Quantum Mechanics, 2nd ed.
//     (Addison-Wesley, 2011), §5.1 (Rayleigh–Schrödinger series; from
//     memory).
//   - NIST Digital Library of Mathematical Functions, https://dlmf.nist.gov,
//     25.6.1 (ζ(2), ζ(4)).
//   - D. J. Griffiths, Introduction to Quantum Mechanics, 2nd ed. (Pearson,
//     2005), §8.3 (WKB with two hard walls; from memory), used in the tests.
//   - D. J. BenDaniel and C. B. Duke, Phys. Rev. 152, 683 (1966)
//     (matching at interfaces with a mass step).
//   - A. Dalgarno and J. T. Lewis, Proc. R. Soc. A 233, 70 (1955) (second
//     order without a sum over states).
//   - J. O. Hirschfelder, W. Byers Brown and S. T. Epstein, Adv. Quantum
//     Chem. 1, 255 (1964) (Wigner's 2n+1 rule; from memory), used in the
//     tests.
//   - G. Bastard, E. E. Mendez, L. L. Chang and L. Esaki, Phys. Rev. B 28,
//     3241 (1983) (the larger Stark shift of finite wells; from memory).
//   - L. D. Landau and E. M. Lifshitz, Quantum Mechanics (Non-relativistic
//     Theory), 3rd ed. (Pergamon, 1977), §50 (quasiclassical escape rate;
//     from memory).
//   - NIST Digital Library of Mathematical Functions, 9.7.7, 9.7.9, 9.7.11
//     (Airy asymptotics for the connection at the turning point).
package perturb
