package exact

import (
	"fmt"
	"math"

	"github.com/tiltwell/tiltwell"
)

const (
	// MaxField is the largest |f| the solver accepts. Beyond it the
	// triangular-well limit of DLMF 9.9.6 is accurate to far below float64
	// resolution for the low levels, and the high levels would need Airy
	// arguments beyond the tested range.
	MaxField = 1e5
	// MaxLevels is the largest number of levels (and highest level number)
	// the solver accepts.
	MaxLevels = 1000
)

// tinyField is the field below which the second-order series
// η = n² + C_n f² is exact in float64: the next term is O(f⁴) < 1e-80.
const tinyField = 1e-20

const eps = 0x1p-52 // float64 machine epsilon, 2.22e-16

// Solver is the exact reference: for the zero Stack, the tilted well with
// infinitely high walls, solved from the Airy quantisation condition to
// full float64 accuracy; for a finite Stack, the BenDaniel–Duke model of
// its layers (see "Layered wells" below). The zero value is ready to use,
// and one value may be used from many goroutines at once.
//
// # Infinite walls
//
// The n-th level at reduced field f > 0 solves, with α = (π² f)^(1/3) and
// the wall arguments z₀ = −α(η/f + ½), z₁ = −α(η/f − ½),
//
//	Θ(z₀) − Θ(z₁) = nπ,
//
// where Θ(z) = atan2(Ai(z), Bi(z)) is the continuous Airy phase (DLMF
// 9.8.4). The wavefunction Ai(z)Bi(z₁) − Bi(z)Ai(z₁) = M(z)M(z₁)
// sin(Θ(z) − Θ(z₁)) vanishes at z₁ by construction and at z₀ exactly when
// the phase difference is a multiple of π; its n − 1 interior nodes fix the
// multiple. Θ is monotone (Θ′ = −1/(πM²), DLMF 9.8.14), so each level is
// one monotone equation with no missed or doubled roots. It is solved by
// safeguarded Newton steps inside the rigorous bracket
//
//	max(n² − f/2, −f/2 + |a_n| (f/π)^(2/3), η_(n−1)) < η_n ≤ n² + f/2
//
// (min–max with |f(ξ − ½)| ≤ f/2, and domain monotonicity against the
// half-line triangular well whose levels are −f/2 + |a_n|(f/π)^(2/3), a_n the
// zeros of Ai). When both walls are deep in the oscillatory region
// (z₁ ≤ −13, weak field or high level) the phase difference is formed from
// the modulus–phase expansion DLMF 9.8.22 without cancellation:
//
//	Θ(−x₀) − Θ(−x₁) = (2/3)(x₀^(3/2) − x₁^(3/2)) + …,
//	x₀^(3/2) − x₁^(3/2) = α (x₀ + √(x₀x₁) + x₁)/(√x₀ + √x₁),   x₀ − x₁ = α,
//
// which keeps full relative accuracy down to f = 1e-20; below that the
// series n² + C_n f² is exact in float64. The wall arguments (from one exact
// product cη and a double-double α), the node phases and that leading
// difference are carried in double-double, so a level near the middle of a
// strongly tilted well (|η| ≪ f/2) keeps its relative accuracy too.
//
// Err is an estimate of the rounding error of the computed level, a few
// units in the last place of max(1, |η|, f/2). Against an independent 256-bit
// reference (f = 1e-8…1e4, n ≤ 50, and spot checks to n = 200,
// |f| = 1e5) the worst error is 2.2e-16·max(1, |η|), Err never undershoots
// it and is at most about 90 times it.
//
// # Layered wells
//
// For a finite Stack the methods solve, with the stack's band edge v(ξ)
// and mass ratio μ(ξ),
//
//	H = −(1/π²) d/dξ (1/μ) d/dξ + v(ξ) + f (ξ − ½),
//
// φ and w = φ′/μ continuous at every interface (D. J. BenDaniel and C. B.
// Duke, Phys. Rev. 152, 683 (1966)). A negative field is the mirrored
// stack at |f| ([tiltwell.Stack.Fold]), so the downhill side is on the
// left. The real solution decaying from the left (e^(κξ) at f = 0; at f > 0
// the one whose log-derivative at the first interface is the real part
// M′/M of the outgoing wave Ai − iBi ∝ M e^(iθ), M the Airy modulus) and
// the one decaying to the right (e^(−κξ), Ai) are carried through the
// inner layers to an interface, each with its η-derivative:
//
//   - at f = 0 by the exact cos or cosh transfer across each layer, across
//     a barrier in two-mode form (the amplitude of the mode that grows on
//     the way is formed once, so that the result has the direction of a
//     solution: this keeps nearly degenerate double-well pairs to
//     rounding);
//   - at f > 0 across a classically allowed stretch spanning a unit of the
//     Airy argument z or more by the amplitude–phase form φ = ρ M(z) sin ω,
//     ω advancing by Θ(z_a) − Θ(z_b) (phases in double-double, DLMF
//     9.8.3–9.8.4, 9.8.22); across a forbidden stretch where ζ =
//     (2/3)z^(3/2) grows by 20 or more by the growing solution alone (from
//     the log-derivatives and growth of Ai and Bi, DLMF 9.7.5–9.7.8, in
//     the layer's physical variables so that nothing overflows at any
//     field); elsewhere by Taylor steps of at most 1.25 local wavelengths,
//     whose coefficients follow from the equation itself.
//
// Where they meet, the difference of their Prüfer angles, their zeros
// counted,
//
//	D(η) = ϑ_L − ϑ_R,   D(η_n) = (n − 1)π,
//
// is continuous and increasing (dϑ/dη ∝ ∫φ² dξ), so level n is its n-th
// crossing, none missed or doubled. It is found by safeguarded Newton
// steps (in θ, η = lo + (hi − lo) sin²θ, which tames the square roots at
// both ends) inside a bracket from the lowest band edge to the Dirichlet
// bounds v_j + n²/(μ_j w_j²) (raised by the field) of the inner layers
// (min–max), starting from the zero-field phase condition k + δ_L + δ_R =
// nπ of the reference well and its sides plus the Stark shift of the
// infinite well of the equivalent width. In a stack of more than three
// layers with thick inner barriers the equation is matched where the
// level's wavefunction is largest (where dD/dη is smallest), where both
// solutions arrive growing.
//
// At f ≠ 0 the levels are quasi-bound, η = η_r − iΓ/2. The outgoing
// boundary condition adds −iP to the real one, P = (s/μ)/(πM²) at the
// first interface (θ′ = −1/(πM²), DLMF 9.8.14), so the complex level
// equation is F_r(η) − iP G(η) = 0 with F_r and G Wronskians of real
// solutions. Around the real root η₀, with g = PG/F_r′,
//
//	Γ = −2g,   η_r = η₀ + g² (F_r″/(2F_r′) − (PG)′/(PG)),
//
// to relative order (gχ)² in Γ and g³χ² in η_r, χ the relative rate of
// change of the equation with η; ln Γ is formed as a sum of logarithms so
// that Γ is accurate down to 1e-300. Where gχ > 1e-5 (broad resonances)
// the level is refined by Newton's method on the complex equation, the
// solutions carried by complex Taylor steps and the Airy log-derivatives
// at complex z taken from their series about the real axis or from DLMF
// 9.7.5–9.7.8.
//
// Level n is confined when: η_r + Err lies below the band edges of both
// outer layers at their interfaces (at f = 0 the barrier heights, below
// which it is a true bound state); and, at f ≠ 0, Γ is below the local
// level spacing π/(dD/dη) and below the distance η_r − η_r(n−1) to the
// level below. The first level that is not confined ends the list:
// Levels returns the confined ones with a [*tiltwell.ConfinedError] saying
// how many there are.
//
// Err estimates the rounding of the level equation (a few ε per step and
// per angle) divided by its slope, plus, at f ≠ 0, the neglected order of
// the narrow-resonance expansion or the last complex Newton step. GammaErr
// estimates the rounding of ln Γ, the level's own error carried through
// d ln Γ/dη, and the neglected order. A Γ below 1e-300 is reported as
// Gamma = 0 with GammaErr = 1e-300, an upper bound on Γ.
//
// Measured accuracy: against the independent 256-bit reference table
// testdata/stack256.txt (math/big Taylor shooting, exact/internal/bigstack)
// on the 1021 of its 1178 levels that this criterion confines (20 stacks:
// symmetric wells v = 2…300, μ = 1…2; asymmetric, double and stepped
// wells; f from −10 to 10; up to 10 levels; Γ from 1e-300 to 0.3), the
// worst η_r error is 5.7e-14 (5.7e-16·max(1, |η_r|), at v = 300, f = 2,
// n = 10) and the worst relative Γ error 1.2e-10 (Γ = 3.3e-7); Err and
// GammaErr never fall below the true errors (no true error reaches 1e-12,
// where the rules measure pessimism). The reference's own criterion stops
// a little lower at the downhill interface (Airy argument 1 there rather
// than 0) and, beyond a low uphill barrier, also counts the states the
// field holds far outside the well, which join the continuum as f → 0 and
// are not confined here. The textbook even/odd conditions at f = 0 (50
// wells, v = 0.3…1e5, μ = 0.5…3): worst error 5.9e-16·max(1, η). A
// brute-force Runge–Kutta shooting at f > 0 agrees to 1e-15 in η_r (1e-11
// for broad levels) and 1e-7 relative in Γ, its own limits.
//
// Speed (BenchmarkStackLevels, minima of ten runs' CPU time on the
// shared build machine; medians 2–5% higher): the lowest three levels of
// a finite well with their widths in 1.5 µs at f = 0, 3.8 µs at f = 1 and
// 4.8–4.9 µs at f = 2–3 (narrow, Γ ≤ 2e-7; two or three evaluations of
// the level equation per level, the one at the confinement ceiling only
// when the iteration needs the bracket: the start, the zero-field level
// plus the Stark shift of an infinite well of equivalent width, is off by
// 1e-3 to 5e-2 there), 14–20 µs where the third is broad (Γ =
// 0.014–0.13, complex Newton); the same well clad in thin layers (five
// layers) takes 1.6 times as long at f = 0 and 1.7 times at f = 1–3; a
// plain finite-difference solve of the three levels to 1e-6 takes 13 ms
// on a quiet machine (21–36 ms on a loaded one), 2600 times or more the
// exact solve. Levels allocates nothing once dst has room.
//
// # Wavefunctions of solved levels
//
// [Solver.Wavefunction] solves its level again. [Solver.BuildWave] and
// [Solver.SampleWave] ([tiltwell.WaveBuilder], [tiltwell.WaveSampler])
// build the wavefunction from a level Levels returned, with one
// evaluation of the level equation at its energy (two for a resonance
// whose real level η₀ differs from η_r by more than Err), into reused
// storage and without allocating. With 100 samples (BenchmarkBuildWave,
// BenchmarkStackBuildWave against BenchmarkWavefunction,
// BenchmarkStackWavefunction; CPU time as above): the benchmark well's
// second level at f = 2 in 6.0 µs against 18 µs for Wavefunction (35 µs
// before the two shared the construction), at f = 0, where a level costs
// little, about the same (3–5 µs); infinite walls at f = 100 (samples in
// the node table, 20 ns each) in 2.3 µs against 7.1 µs, at f = 1 (both
// walls in the modulus–phase range, 60 ns a sample) in 6.4 µs against
// 13 µs.
type Solver struct {
	// Stack is the layer structure; the zero Stack is the well with
	// infinitely high walls.
	Stack tiltwell.Stack
}

var _ tiltwell.WaveSolver = Solver{}

// secondOrder returns C_n = (n²π² − 15)/(48 n⁴ π²), the second-order Stark
// coefficient of the infinite well in reduced units (check by the sum over
// states with ⟨m|ξ|n⟩ = −8mn/(π²(m² − n²)²)).
func secondOrder(n int) float64 {
	nn := float64(n) * float64(n)
	return (nn*math.Pi*math.Pi - 15) / (48 * nn * nn * math.Pi * math.Pi)
}

// state is a solved level: everything the wavefunction and dipole need.
type state struct {
	wallScale
	eta        float64
	n          int
	x0, x1     float64 // −z₀, −z₁; x₀ = x₁ + α
	p0, p1     float64 // 1/(π M²) at z₀ and z₁
	asym       bool    // both walls in the modulus–phase range
	gp         float64 // ∂G/∂η at the last evaluation
	err        float64
	iterations int
	// When both walls were in the node table at the last evaluation:
	// the node nearest z₁ and the phase series c(z₁), d(z₁) about it
	// (nil otherwise). The wavefunction's sampler takes Θ(z₁) from them.
	node1  *nodeSeries
	c1, d1 float64
}

// wallScale holds the per-field constants of the level equation: α =
// (π² f)^(1/3) in double-double, its float64 value and c = α/f, so that the
// wall arguments x₀ = −z₀ = cη + α/2 and x₁ = −z₁ = cη − α/2 are formed in
// double-double from one exact product cη.
type wallScale struct {
	f, alpha, c float64
	ad          dd
}

func newScale(f float64) wallScale {
	if f == 0 {
		return wallScale{}
	}
	ad := ddCbrt(ddMulF(ddPi2, f))
	return wallScale{f: f, alpha: ad.hi, c: ad.hi / f, ad: ad}
}

// eval evaluates G(η) = Θ(z₀) − Θ(z₁) − nπ and fills st with the phase data
// at η. It returns G, ∂G/∂η and an estimate of the absolute rounding error
// of G.
func (st *state) eval(eta float64) (g, gp, gerr float64) {
	f, a := st.f, st.alpha
	p, e := twoProd(st.c, eta)
	ce := dd{p, e}
	half := dd{st.ad.hi / 2, st.ad.lo / 2}
	x0, x1 := ddAdd(ce, half), ddAdd(ce, ddNeg(half))
	st.x0, st.x1 = x0.hi, x1.hi
	np := ddMulF(ddPi, float64(st.n))
	if x1.hi >= negStart {
		// Both walls in the modulus–phase range: the leading phase
		// difference (2/3)(x₀^(3/2) − x₁^(3/2)) in the form
		// (2/3)α(x₀ + √(x₀x₁) + x₁)/(√x₀ + √x₁), which does not cancel
		// at weak field, in double-double.
		st.asym, st.node1 = true, nil
		s0, s1 := ddSqrt(x0), ddSqrt(x1)
		tc0, rr0 := negPhaseCorr(x0.hi)
		tc1, rr1 := negPhaseCorr(x1.hi)
		num := ddAdd(ddAdd(x0, x1), ddSqrt(ddMul(x0, x1)))
		lead := ddMul(ddDiv(ddMul(num, st.ad), ddAdd(s0, s1)), ddTwo3)
		g = ddAdd(ddAdd(lead, ddNeg(np)), dd{tc0 - tc1, 0}).hi
		st.p0, st.p1 = s0.hi*(1+rr0), s1.hi*(1+rr1)
		dp := a/(s0.hi+s1.hi) + (s0.hi*rr0 - s1.hi*rr1)
		gp = a / f * dp
		gerr = eps * (1 + 2*math.Abs(tc0) + 2*math.Abs(tc1) + 1e-3*np.hi)
		return g, gp, gerr
	}
	st.asym, st.node1 = false, nil
	z0, z1 := ddNeg(x0), ddNeg(x1)
	var p0, p1 float64
	if inTable(z0.hi) && inTable(z1.hi) {
		// Both walls in the node table: Θ₀ − Θ₁ = (Θ_j0 − Θ_j1) +
		// atan2(c₀,d₀) − atan2(c₁,d₁), and the two small angles (each
		// below 0.46) combine into one atan2 of the rotated vector.
		s0, c0, d0 := tableCD(z0)
		s1, c1, d1 := tableCD(z1)
		ang := math.Atan2(c0*d1-c1*d0, d0*d1+c0*c1)
		k := ddAdd(ddAdd(dd{s0.theta, s0.thetaLo}, dd{-s1.theta, -s1.thetaLo}), ddNeg(np))
		g = ddAdd(k, dd{ang, 0}).hi
		p0 = s0.m2 / (math.Pi * (c0*c0 + d0*d0))
		p1 = s1.m2 / (math.Pi * (c1*c1 + d1*d1))
		st.node1, st.c1, st.d1 = s1, c1, d1
	} else {
		th0, q0 := phaseDD(z0)
		th1, q1 := phaseDD(z1)
		g = ddAdd(ddAdd(th0, ddNeg(th1)), ddNeg(np)).hi
		p0, p1 = q0, q1
	}
	st.p0, st.p1 = p0, p1
	gp = a / f * (p0 - p1)
	// Each phase is Θ_j (106 bits) plus a rounded angle below 1/2, or a
	// double-double leading term plus a rounded correction.
	gerr = 4 * eps
	return g, gp, gerr
}

// solve finds level n at field f > 0 with η > floor (the previous level, or
// −Inf).
func solve(f float64, n int, floor float64) (state, error) {
	return solveScaled(newScale(f), n, floor, math.NaN())
}

// solveScaled is solve with the field constants precomputed and an optional
// starting value hint (NaN for none).
func solveScaled(sc wallScale, n int, floor, hint float64) (state, error) {
	f, alpha := sc.f, sc.alpha
	st := state{wallScale: sc, n: n}
	nn := float64(n) * float64(n)
	hi := nn + f/2
	// The triangular-well level −f/2 + |a_n| (f/π)^(2/3), with
	// (f/π)^(2/3) = α²/π².
	tri := -f/2 - airyZero(n)*(alpha*alpha/(math.Pi*math.Pi))
	// The bounds are computed in float64; widen them by their rounding so
	// the bracket stays valid.
	margin := 8 * eps * (f + nn + math.Abs(tri))
	lo := max(nn-f/2, tri, floor) - margin
	hi += margin
	eta := guess(f, alpha, n, tri, hint, lo, hi)
	var prevEta, prevGp, step float64
	haveprev := false
	for it := 1; it <= 100; it++ {
		st.iterations = it
		g, gp, gerr := st.eval(eta)
		st.gp = gp
		if g > 0 {
			hi = eta
		} else {
			lo = eta
		}
		step = g / gp
		next := eta - step
		ulp := eps * math.Abs(eta)
		if math.Abs(g) <= gerr || math.Abs(step) <= 2*ulp {
			// At the rounding floor: one last Newton step is still a
			// refinement, never a worsening, of size at most gerr/gp;
			// keep it inside the bracket.
			if !(next >= lo && next <= hi) {
				next = eta
			}
			st.eta = next
			st.err = 2*gerr/gp + 2*ulp
			return st, nil
		}
		curv := 0.0
		if haveprev && eta != prevEta {
			curv = math.Abs((gp - prevGp) / (eta - prevEta) / (2 * gp))
		}
		prevEta, prevGp, haveprev = eta, gp, true
		if !(next > lo && next < hi) {
			mid := 0.5 * (lo + hi)
			if mid == lo || mid == hi {
				// The bracket is down to adjacent floats.
				st.eta = eta
				st.err = 2*gerr/gp + 2*ulp + (hi - lo)
				return st, nil
			}
			eta = mid
			continue
		}
		if curv > 0 && 8*curv*step*step <= gerr/gp+eps*math.Abs(next) {
			// Quadratic convergence: the error left after this step is
			// about curv·step² (curv = |G″/2G′| from the last two
			// derivatives), below the rounding floor even with a safety
			// factor of 8 on the curvature.
			st.eta = next
			st.err = 2*gerr/gp + 2*eps*math.Abs(next) + curv*step*step
			return st, nil
		}
		eta = next
	}
	return st, fmt.Errorf("exact: level %d at f = %g: %w", n, f, tiltwell.ErrNoConvergence)
}

// guess returns a starting value for level n inside [lo, hi): the best of
// three models by a rough estimate of each one's error in η.
//
//   - The triangular level, exact when the far wall is far: the wall at
//     z₁ = α + a_n > 0 adds Θ(z₁) ≈ ½ exp(−(4/3) z₁^(3/2)) to the phase
//     (DLMF 9.7.5, 9.7.7), worth about Θ(z₁) f/(α √|a_n|) in η.
//   - Second-order perturbation theory n² + C_n f², whose next term is
//     about (C_n f²)²/(2n) (the f⁴ term over the level spacing).
//   - hint, the extrapolation from the levels below (NaN if none), trusted
//     to about 1e-4 of the spacing 2n.
func guess(f, alpha float64, n int, tri, hint, lo, hi float64) float64 {
	nn := float64(n) * float64(n)
	best, bestErr := 0.5*(lo+hi), math.Inf(1)
	if z1 := alpha + airyZero(n); z1 > 0 {
		e := 0.5 * math.Exp(-4.0/3*z1*math.Sqrt(z1)) * f / (alpha * math.Sqrt(-airyZero(n)))
		best, bestErr = tri, e
	}
	c := secondOrder(n) * f * f
	if e := c * c / (2 * float64(n)); e < bestErr {
		best, bestErr = nn+c, e
	}
	if hint > lo && hint < hi && 2e-4*float64(n) < bestErr {
		best = hint
	}
	if !(best >= lo && best < hi) {
		best = 0.5 * (lo + hi)
	}
	return best
}

// Levels appends the lowest k levels at reduced field f to dst[:0] and
// returns the result (see [tiltwell.Solver]). If dst has capacity for k
// levels, Levels does not allocate.
//
// Special cases (infinite walls) are:
//
//	f = 0:  η_n = n², Err = 0
//	|f| < 1e-20: η_n = n² + C_n f² (exact in float64)
//	f < 0:  the levels at |f| (mirror symmetry)
//
// For a finite Stack: f < 0 gives the levels of the mirrored stack at |f|;
// at f = 0, Gamma = GammaErr = 0. When the stack confines fewer than k
// levels, Levels returns the confined ones with a
// [*tiltwell.ConfinedError] (see "Layered wells" at [Solver]).
//
// Errors wrap [tiltwell.ErrField] for NaN or infinite f,
// [tiltwell.ErrLevel] for k < 1 or k > MaxLevels (or more levels than
// confined), [tiltwell.ErrOutOfRange] for |f| > MaxField or, for a Stack,
// layers that would need more than 50000 Taylor steps in one evaluation
// (phases of some 60000 radians across them), and
// [tiltwell.ErrNoConvergence] for a broad resonance the complex solver
// cannot settle.
func (s Solver) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	if !s.Stack.Infinite() {
		return s.stackLevels(dst, f, k)
	}
	dst = dst[:0]
	if err := tiltwell.CheckArgs("exact", f, k, MaxLevels, MaxField); err != nil {
		return dst, err
	}
	af, _ := tiltwell.Fold(f)
	sc := newScale(af)
	// Levels are smooth in n (n enters the quantisation condition as a
	// continuous parameter, with dη/dn = π/(∂G/∂η)), so from the third
	// level on the start is the cubic Hermite extrapolation from the two
	// levels below.
	var e1, d1, e2, d2 float64
	for n := 1; n <= k; n++ {
		hint := math.NaN()
		if n >= 3 {
			// Hermite cubic through (n−2, e2, d2), (n−1, e1, d1),
			// evaluated at n (one step beyond): p(2) for nodes at 0, 1.
			hint = 5*e2 - 4*e1 + 2*d2 + 4*d1
		}
		floor := math.Inf(-1)
		if n > 1 {
			floor = e1
		}
		lv, gp, err := level(sc, n, floor, hint)
		if err != nil {
			return dst[:0], err
		}
		e2, d2 = e1, d1
		e1, d1 = lv.Energy, math.Pi/gp
		dst = append(dst, lv)
	}
	return dst, nil
}

func level(sc wallScale, n int, floor, hint float64) (tiltwell.Level, float64, error) {
	af := sc.f
	nn := float64(n) * float64(n)
	if af < tinyField {
		e := nn + secondOrder(n)*af*af
		err := 0.0
		if af > 0 {
			err = eps * nn
		}
		return tiltwell.Level{N: n, Energy: e, Err: err, Bound: tiltwell.Estimate}, math.Pi / (2 * float64(n)), nil
	}
	st, err := solveScaled(sc, n, floor, hint)
	if err != nil {
		return tiltwell.Level{}, 0, err
	}
	return tiltwell.Level{N: n, Energy: st.eta, Err: st.err, Bound: tiltwell.Estimate}, st.gp, nil
}

// Level returns level n (1 for the ground level) at reduced field f. Errors
// as for [Solver.Levels], with n in place of k. For a finite Stack it
// solves levels 1..n as Levels does (the confinement test of level n
// needs level n − 1), and gives the same level to the bit.
func (s Solver) Level(f float64, n int) (tiltwell.Level, error) {
	if !s.Stack.Infinite() {
		return s.stackLevel(f, n)
	}
	if err := tiltwell.CheckArgs("exact", f, n, MaxLevels, MaxField); err != nil {
		return tiltwell.Level{}, err
	}
	af, _ := tiltwell.Fold(f)
	lv, _, err := level(newScale(af), n, math.Inf(-1), math.NaN())
	return lv, err
}
