// Package wkb computes the levels of the tilted well by WKB
// (phase-integral) quantisation, with the action integral in closed form,
// each level with an error estimate drawn from the method itself: between
// infinitely high walls, and in a single finite well, where a level also
// has the quasiclassical escape width through the downhill barrier (see
// "Finite barriers" below).
//
// Units are the reduced ones of package tiltwell: energy η in E₁, field f in
// F₀, position ξ in [0, 1], H = −(1/π²) d²/dξ² + f (ξ − ½). With
// e = η + f/2 the local wavenumber is k(ξ) = π √(e − f ξ); for f ≥ 0 the low
// wall is ξ = 0 and the classical turning point is ξ_t = e/f.
//
// # Two rules
//
// [Solver]{Plain: true} is the textbook rule: ∫k dξ = nπ between two hard
// walls when the level is above the potential everywhere in the well
// (η ≥ f/2), and ∫k dξ = (n − ¼)π between the low wall and the turning
// point otherwise. It is closed form and jumps where the turning point
// reaches the high wall (η = f/2). At low field it gives
//
//	η_n ≈ n² + f²/(48 n²),
//
// a blue shift for every level, while the true ground level shifts to the
// red, η₁ ≈ 1 − 0.01083 f² (the second-order coefficient
// (n²π² − 15)/(48 n⁴ π²), second-order perturbation theory). The plain rule is
// wrong by −5 f²/(16 π² n⁴) there, which is the next order of the WKB
// series, and its Err shows it: at n = 1 Err ≈ 0.032 f², more than the
// shift 0.021 f² it predicts, so it does not even claim the sign.
//
// [Solver]{} (the default) is a connection rule of this package's design. It
// starts from the exact quantisation of the linear potential,
// θ(x₀) − θ(x₁) = nπ, where θ is the Airy phase (Ai = M sin θ,
// Bi = M cos θ, DLMF 9.8.1–9.8.4) and x₀ = −e/ε_A, x₁ = (f − e)/ε_A are the
// walls' Airy coordinates, ε_A = (f/π)^(2/3) the energy across one Airy
// length ℓ = (π² f)^(−1/3). Writing θ(x) = ζ̄(x) + χ(x) with
// ζ̄ = (2/3)(−x)^(3/2) for x < 0 (the WKB phase from x to the turning point)
// and 0 for x ≥ 0, it becomes
//
//	S(η) + χ(x₀) − χ(x₁) = nπ,   S = ∫ k dξ over the allowed part.
//
// The connection phase χ is π/4 deep on the allowed side, π/6 when the
// turning point is on the wall (x = 0), and falls like ½ e^(−2ζ) once the
// turning point is inside the well: the plain rules are its two limits, and
// the jump between them is the replacement of χ by π/4 or 0. The rule keeps
// χ(x₁) at the high wall as the Airy-function solution near a linear
// turning point with a hard wall gives it (evaluated from the Airy
// functions, see below), a function of the wall's distance past the
// turning point in Airy lengths, so it is continuous across η = f/2. At
// the low wall, which is always at least |a₁| = 2.34 Airy lengths inside
// the allowed region, it uses the phase-integral series to its first
// correction, χ(x₀) ≈ π/4 − u₁/ζ₀ with u₁ = 5/72 (DLMF 9.7.2, 9.8.22; the
// second-order WKB term). So
//
//	S(η) + π/4 − 5/(72 ζ₀) − χ(x₁) = nπ,   ζ₀ = (2π/(3f)) e^(3/2).
//
// Labelled honestly: this is not textbook WKB. Because the potential is
// exactly linear, the Airy connection at the high wall is exact, and the
// rule's only approximation is the truncated phase series at the low wall.
// It reproduces the exact low-field coefficient (n²π² − 15)/(48 n⁴ π²) (the
// u₁ terms at the two walls give the −5/(16π²n⁴)), and in the strong-field
// limit η → −f/2 + |a_n| (f/π)^(2/3) it gives the zeros a_n of Ai through
// the t^(−2) term of DLMF 9.9.6. Using the Airy phase at the low wall as well
// would make it the exact solver of package exact.
//
// # Error estimates
//
// The connection rule's Err is the first omitted term of the low-wall
// series, c₃/ζ₀³ with c₃ = (1105/6144)(2/3)⁴ (DLMF 9.8.22), divided by
// dΦ/dη and doubled, plus rounding. The remainder of that series was
// observed to be smaller than this term and of its sign; the factor 2 keeps
// the estimate above the error after linearisation (worst case the ground
// level at strong field, 2.8× the true error). The plain rule's Err is the
// size of the connection correction, |η_plain − η_connection|, plus the
// connection rule's Err. Both are of kind [tiltwell.Estimate]; they are
// tested against the exact reference, never computed from it.
//
// Where the error is at the rounding floor (weak fields, where both walls
// bound the level), the float64 phase equation moves η by up to 7 units
// in the last place, more than an estimate within 10× of a one-unit error
// can cover: both rules therefore refine the two-wall root by one Newton
// step whose residual n − ψ is formed with the action in double-double
// (error-free products and sums, T. J. Dekker, Numer. Math. 18, 224
// (1971)), and η = e − f/2 is rounded once. The rounding part of Err is
// then half a unit of η plus the connection phase's own rounding over
// dψ/de. Against the exact reference on f = 1e-4…1e4 (and 3000 fields to
// 10³, levels to 1000) no estimate is more than 6.33× the true error
// wherever that is above 1e-14, and none undershoots; before, 12.8× at
// one unit in the last place (f = 0.16, n = 11) and a 2× undershoot at
// 7 units (f = 0.000566, n = 12).
//
// # Finite barriers
//
// [Solver]{Stack: s}, with s a single finite well ([tiltwell.FiniteWell],
// [tiltwell.AsymmetricWell]: the reference well between a left barrier
// v_L, μ_L and a right barrier v_R, μ_R), solves
//
//	H = −(1/π²) d/dξ (1/μ) d/dξ + v(ξ) + f (ξ − ½)
//
// with φ and (1/μ) dφ/dξ continuous at the interfaces (D. J. BenDaniel and
// C. B. Duke, Phys. Rev. 152, 683 (1966)). Other stacks give an error
// wrapping [errors.ErrUnsupported]. A negative field is folded with
// [tiltwell.Stack.Fold]; for f > 0 the left barrier is the downhill one,
// through which the carrier escapes. With e = η + f/2 the kinetic energy at
// the downhill interface ξ = 0,
//
//	k = π √e,  κ_L = π √(μ_L (v_L − e)),  ζ_L = (2π√μ_L/(3f)) (v_L − e)^(3/2) = ∫ κ dξ,
//
// ζ_L the under-barrier action (in units of ħ) from the interface to the
// barrier's outer turning point ξ_t = −(v_L − e)/f.
//
// Step phases. Where the carrier meets a barrier it is below, the well's
// local plane wave sin(kξ + δ) matched to the barrier's decaying
// exponential by BenDaniel–Duke gives k cot δ/μ_w = κ/μ_b, the phase shift
// of the abrupt step with its mass jump,
//
//	tan δ = μ_b k/(μ_w κ)   (μ_w = 1 in the reference well),
//
// so that Bohr–Sommerfeld quantisation reads S + δ_L + δ_R = nπ, S = ∫ k dξ
// over the allowed part of the well. An infinitely high barrier gives δ = 0
// (the hard wall). At f = 0 this is the square well's exact condition
// k + δ_L + δ_R = nπ: both rules return the roots of internal/squarewell
// there, with Γ = 0.
//
// [Solver]{Plain: true, Stack: s} is that textbook rule, with k and κ from
// the linear potential at each interface, π/4 in place of δ_R when the
// turning point is inside the well (e < f), and the quasiclassical width
//
//	Γ = P e^(−2ζ_L) / T,   P = 4 μ_L k κ_L/(κ_L² + μ_L² k²),   T = 2 dF/dη,
//
// the Gamow factor over the classical period (L. D. Landau and E. M.
// Lifshitz, Quantum Mechanics, §50, from memory, where the barrier is
// smooth on both sides and P = 1) with P the transmission of the abrupt
// step, from the matching above; T counts the time spent in the barriers.
// Its Err and GammaErr are its distance from the connection rule plus that
// rule's estimates.
//
// [Solver]{Stack: s} (the default) is the connection rule carried to the
// finite well. As for hard walls it keeps the Airy functions where a
// turning point may meet an interface: the well's solution is the uniform
// (Langer) form M(x) sin(θ(x) − α), which for the linear potential is the
// Airy solution, and the uphill barrier holds its decaying Ai, both to all
// digits, so the level is continuous where the turning point crosses the
// uphill interface (η = f/2). The downhill barrier's solution is replaced
// by its phase-integral series: the growing Bi(z) ~ e^ζ U₊/(√π z^(1/4)),
// whose log-derivative is B = √z V₊/U₊ with U₊ = Σ u_k ζ^(−k),
// V₊ = Σ v_k ζ^(−k) (DLMF 9.7.2, 9.7.7–9.7.8); K = 0 terms give κ and the
// step phase above, K = 1 the first-order WKB κ − κ′/(2κ). Matching
// (1/μ)φ′/φ with (1/μ_w)φ′/φ = s (l − y cot Θ), y = 1/(πM²) = −dθ/dx,
// l = M′/M, s = (π² f)^(1/3), q = μ_b^(−2/3), the level solves
//
//	S + χ(x₀) + d_L − χ(x₁) + g_R = nπ,
//	d_L = atan2(y(x₀), q_L B(z_L) − l(x₀)),   g_R = atan2(y(x₁), l(x₁) − q_R Ai′/Ai(z_R)),
//
// with the connection phases χ of the hard-wall rule and the Airy
// coordinates x₀, x₁ of the interfaces in the well and z_L, z_R in the
// barriers; for plane waves d_L and g_R are the step phases δ. The
// series keeps K = min(max(2(ζ_L − 0.7), 0), 8) terms, blended between
// whole numbers by 6t⁵ − 15t⁴ + 10t³ so that the levels have two
// continuous derivatives in f; after K terms the truncation error has one
// sign down to ζ_L ≈ 0.55K + 0.1, which this choice keeps.
//
// Escape. Downhill the outgoing wave Bi + i Ai has the log-derivative
// B + i θ_b′, θ_b′ = −1/(πM_b²) (the Wronskian W{Ai, Bi} = 1/π, DLMF
// 9.2.7). To first order the level function gains i G,
// G = q_L y/(π M_b² (x² + y²)) with x = q_L B − l, and the complex level
// η_r − iΓ/2 of F + iG = nπ is
//
//	Γ = 2G/F′,   η_r = η₀ + g² (F″/(2F′) − G′/G + (x/y) F′),   g = Γ/2,
//
// with M_b² = e^(2ζ_L) U₊²/(π √z_L) from the same series: at leading order
// this is the quasiclassical width of the plain rule, the Gamow factor
// e^(−2ζ_L) in closed form for the linear barrier times the step's P over
// the period. Γ is formed in logarithms, from 1e-300 to broad levels;
// below 1e-300 it is reported as Gamma = 0 with GammaErr = 1e-300.
//
// Where it fails. The quasiclassical picture needs a thick enough
// barrier: the series in 1/ζ_L fails as the level nears the barrier's top,
// and the first-order width as the resonance broadens. The literature
// finds refined quasiclassical widths agreeing with exact complex energies
// down to an action of about ħ/3 (from memory); this rule's estimates were
// measured to hold down to ζ_L = 0.6 (below 0.55 they undershoot), so a
// level with ζ_L < 0.6 (or above the downhill barrier at its interface,
// or above the uphill barrier at its interface, as in package exact), or
// one so broad that (Γ/2)χ > 0.3 (χ the rate at which ln Γ and F′ change
// with η), ends the list with a [*tiltwell.ConfinedError] naming the
// reason. On the grid below this refuses 211 of the 3587 levels exact
// confines (5.9%, the top level of a field or two).
//
// Error estimates. B and U₊ depend on ζ_L alone, so their truncation
// errors are one function of one variable: the estimate is twice the next
// three terms' changes (each counted at most as large as the one before,
// since past its smallest term the series grows while its error stays
// about that size), measured against the Airy modulus to be never below
// the error and at most 6.5× above it for ζ_L from 0.6 to 40
// (TestBarrierSeries). Err carries it into η through the sensitivity
// ∂d_L/∂B over dF/dη, with the next order of the second-order shift
// (4|η₂|gχ + g(gχ)²) and rounding; GammaErr carries it into ln G, with the
// error of η times d ln Γ/dη, the error of the period from the slope of the
// phase error, (gχ)² for the first-order width, and rounding. Against
// exact.Solver with a Stack on the grid of issue 12 (24 symmetric wells,
// v = 2…50, μ = 1, 1.37, 2, and 40 seeded random asymmetric ones in the
// same ranges, at 19 fields with |f| ≤ 10; TestFiniteAgainstExact): 3376
// levels, no energy or width estimate below the true error, and where the
// true error exceeds 1e-12 energy estimates at most 8.5× the error (median
// 2.0×) and width estimates at most 9.7×. On 400 random wells at 6 fields
// each (-finite-wells 400): 7426 levels with no undershoot (worst 9.7×,
// 9.7×), and 20787 levels with barriers to 2000 E₁ and |f| ≤ 300 with
// none either (worst 9.8× for energies, 11.4× for 2 of 1174 widths). The
// plain rule's estimates never undershoot on the grid but reach 36×
// (energies) and 56× (widths) where it lands near the truth by chance.
// In one run of BenchmarkFiniteLevels (on a shared, loaded machine, where
// the hard-wall rule took 0.4 µs a level) a level cost 0.4 µs at f = 0 and
// 1.1 to 3.2 µs under a field, against exact.Solver's 0.6 µs and 2.1 to
// 10 µs: up to 5 times faster on the shallow demo well (v = 4.3,
// μ = 1.37) and for several levels of a deep one (v = 50), about alike
// for a single level of the deep well at weak field. Levels does not
// allocate.
//
// Wavefunctions cover the whole line: the uniform Airy solution in the
// well, φ(0) M_b(z)/M_b(z_L) in the downhill barrier (the modulus of the
// outgoing wave, which the level matched; it is the growing exponential
// away from the turning point and finite at it), φ(1) Ai(z)/Ai(z_R) in the
// uphill one. They are normalized over [ξ_t, ∞) (the barrier tails in
// closed form), positive at the first interface, and implement
// [tiltwell.Spread].
//
// # Airy functions
//
// The package evaluates the Airy modulus and phase itself (it does not
// import package exact): a table of Taylor series of θ and M² on
// [−16, 12], built once from DLMF 9.2.3–9.2.6 by Taylor steps of
// w″ = x w, and the asymptotic expansions DLMF 9.7.5–9.7.11 beyond. It is
// accurate to about 5e-15 (tested against DLMF values).
//
// References:
//   - D. J. Griffiths, Introduction to Quantum Mechanics, 2nd ed. (Pearson,
//     2005), §8.3 (quantisation with hard walls and turning points; from
//     memory).
//   - NIST Digital Library of Mathematical Functions, https://dlmf.nist.gov,
//     §9.2, §9.7, §9.8 (Airy functions, asymptotic expansions, modulus and
//     phase), §9.9 (zeros).
//   - R. E. Langer, "On the connection formulas and the solutions of the
//     wave equation", Phys. Rev. 51, 669 (1937) (the uniform approximation;
//     from memory).
//   - D. J. BenDaniel and C. B. Duke, "Space-charge effects on electron
//     tunneling", Phys. Rev. 152, 683 (1966) (the matching at an interface
//     with a mass jump).
//   - L. D. Landau and E. M. Lifshitz, Quantum Mechanics (Non-relativistic
//     Theory), 3rd ed., §50 (the quasiclassical escape rate; from memory).
package wkb
