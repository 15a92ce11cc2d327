// Package tiltwell computes the confined levels of a quantum well under a
// uniform electric field (the quantum-confined Stark effect), by several
// methods behind one interface: the idealised well with infinitely high
// walls, and finite barriers and layered wells described by a [Stack].
//
// The root package holds the shared vocabulary: reduced units and the
// physical scale ([Well]), the layers of a well ([Stack]: band edges and
// masses, BenDaniel–Duke interfaces), the [Level] result with its escape
// width Γ, the [Solver] and [WaveSolver]
// interfaces, the [Bound] kind of an error estimate, the sentinel errors
// every method wraps, and helpers shared by all methods (argument checks,
// mirror symmetry for negative fields). On top of it sit [Choose], which
// picks the cheapest of several candidate solvers whose own error estimates
// meet a tolerance, and [Pair], which turns an electron and a hole in one
// well into transition red shifts and overlaps over a field sweep. The
// methods live in their own packages (exact, perturb, variational, wkb,
// basis); this package imports none of them, so a caller passes the
// candidates in, as users of hash.Hash pass a crc32 or an fnv.
//
// # Reduced units
//
// A particle of effective mass m* in a well of width L, with a field F along
// +z, feels the potential e F (z − L/2) inside the well (zero at the centre).
// With ξ = z/L, the energy unit E₁ = ħ²π²/(2 m* L²) (the zero-field ground
// level) and the field unit F₀ = E₁/(e L), the reduced energy η = E/E₁ and
// reduced field f = F/F₀ obey
//
//	H = −(1/π²) d²/dξ² + f (ξ − ½),   φ(0) = φ(1) = 0.
//
// At f = 0 the levels are η_n = n² with φ_n(ξ) = √2 sin(nπξ). The spectrum
// is even in f; wavefunctions mirror, φ_n(ξ; −f) = ±φ_n(1 − ξ; f), with the
// sign fixed by the convention φ_n′(0) > 0.
//
// # Finite barriers
//
// A [Stack] adds layers around the reference well, each with its band edge
// v (in E₁) and mass ratio μ, so that
//
//	H = −(1/π²) d/dξ (1/μ(ξ)) d/dξ + v(ξ) + f (ξ − ½).
//
// The field acts in every layer and the potential is still zero at the
// centre of the reference well. At f = 0 the levels below both outer band
// edges are bound; under a field a carrier tunnels out through the downhill
// barrier and each level becomes quasi-bound, with complex energy
// η_r − iΓ/2: [Level.Energy] is η_r and [Level.Gamma] the escape width Γ.
// Negative fields mirror the stack ([Stack.Fold]).
package tiltwell
