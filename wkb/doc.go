// Package wkb computes the levels of the tilted infinite well by WKB
// (phase-integral) quantisation, with the action integral in closed form,
// each level with an error estimate drawn from the method itself.
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
package wkb
