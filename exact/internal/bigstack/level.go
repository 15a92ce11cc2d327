package bigstack

import (
	"fmt"
	"math"
	"math/big"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact/internal/bigairy"
)

// Route says how a [Resonance]'s width was obtained.
type Route int

const (
	// RouteBound: f = 0, a true bound state (Γ = 0).
	RouteBound Route = iota
	// RouteNewton: complex Newton on the outgoing-wave condition at a
	// precision that resolves Γ.
	RouteNewton
	// RouteNarrow: the first-order width of a narrow resonance,
	// Γ = 2A/B′ (see [Level]), and η_r the real root: both differ from
	// the complex root by terms of order Γ² (measured: at most 12Γ²
	// relative, TestNarrowAgainstNewton), far below 2^-prec where used.
	RouteNarrow
)

func (r Route) String() string {
	switch r {
	case RouteBound:
		return "bound"
	case RouteNewton:
		return "newton"
	case RouteNarrow:
		return "narrow"
	}
	return fmt.Sprintf("Route(%d)", int(r))
}

// Resonance is one quasi-bound level η = η_r − iΓ/2 in units of E₁.
type Resonance struct {
	// N is the level number (1 = lowest η_r).
	N int
	// Eta is η_r.
	Eta *big.Float
	// Gamma is the escape width Γ ≥ 0: 0 for a bound state (f = 0), and
	// also 0 when Γ is below big.Float's range (about 10^-6.4e8); then
	// Log10Gamma still holds it.
	Gamma *big.Float
	// Log10Gamma is log₁₀ Γ; nil for a bound state.
	Log10Gamma *big.Float
	// Route is how Γ was obtained.
	Route Route
}

// newtonFloor is the smallest log₁₀(Γ/max(1,|η|)) for which [Level] runs
// the complex Newton stage; below it the narrow formula, whose relative
// error is about Γ, is exact to far beyond the requested precision.
const newtonFloor = -310

// lowPrec is the precision of the bracketing evaluations.
const lowPrec = 96

// Level returns level n (the n-th lowest by η_r) of
//
//	H = −(1/π²) d/dξ (1/μ(ξ)) d/dξ + v(ξ) + f (ξ − ½)
//
// for the stack layers (left to right along +ξ, layers[ref] the reference
// well on [0, 1]) at the reduced field f, in units of E₁ and F₀, with η_r
// and Γ correct to about prec bits (0 means [DefaultPrec]) relative to
// max(1, |η_r|) and to Γ.
//
// Formulation (independent of package exact). In each layer the equation
// φ″ = π² μ_j (v_j + f(ξ − ½) − η) φ is integrated by Taylor series in ξ,
// with ∂φ/∂η alongside; φ and p = φ′/μ are continuous at the interfaces
// (BenDaniel–Duke). The uphill (last) layer holds the decaying Ai(z),
// z = s_j(ξ − ½ + (v_j − η)/f), s_j = (π² μ_j f)^(1/3) (at f = 0 the
// decaying exponential); the solution is carried leftwards to the first
// interface ξ₀ and matched there, D(η) = p − L(η) φ = 0, against the
// log-derivative L of the downhill (first) layer's solution:
//
//  1. Real stage: L from Bi(z) (which decays into the downhill barrier;
//     at f = 0 the exponential, and its roots are the bound states). The
//     number of its roots below η is the number of zeros of φ on (ξ₀, ∞)
//     plus one if (−1)^zeros · D(η) > 0 (a Sturm count), which brackets
//     the n-th root η_B; Newton with bisection polishes it. The search is
//     limited to η below the ceiling where the downhill Airy argument at ξ₀
//     is z₀ = 1 (at f = 0: below both outer band edges); fewer than n roots
//     below it gives a [*tiltwell.ConfinedError].
//  2. Narrow width: with W = Ai − iBi (outgoing, time factor e^(−iEt/ħ))
//     the condition p W − (s/μ) W′ φ = A − iB has B(η_B) = 0, and by the
//     Wronskian Ai Bi′ − Ai′ Bi = 1/π (DLMF 9.2.7) A(η_B) = (s/μ) φ/(π Bi)
//     without cancellation, so one complex Newton step gives
//     Γ = 2A/B′ = 2 (s/μ) φ / (π Bi(z₀)² dD/dη), relative error O(Γ).
//  3. Complex stage, where Γ ≥ 10^-310·max(1,|η|): Newton on
//     D(η) = p − (s/μ)(W′/W) φ in complex arithmetic from η_B − iΓ/2, at
//     prec + log₂(max(1,|η|)/Γ) + 64 bits, with W′/W = e^(2πi/3) Ai′(w)/Ai(w),
//     w = z₀ e^(2πi/3) (DLMF 9.2.11), Ai of complex argument by its
//     Maclaurin series with guard bits for the cancellation.
//
// The Airy functions come from their Maclaurin series (DLMF 9.4.1, with
// (|ζ| + Re ζ)/ln 2 guard bits) or, where |z| is large enough for the
// requested precision, the asymptotic expansions DLMF 9.7.5–9.7.8.
//
// Special cases are:
//
//	f = 0:  a bound state, Gamma 0, Route RouteBound
//	f < 0:  the level of the mirrored stack (layers reversed) at −f
//
// Errors wrap the root sentinels: [tiltwell.ErrField] for a NaN or
// infinite f, [tiltwell.ErrOutOfRange] for |f| > [MaxField], prec >
// [MaxPrec] or a stack that needs more than 200000 Taylor steps,
// [tiltwell.ErrUnits] for bad layers, [tiltwell.ErrLevel] for n outside
// 1..[MaxLevel] or (as a [*tiltwell.ConfinedError]) a level above the
// ceiling, [tiltwell.ErrNoConvergence] if a root search fails.
func Level(layers []Layer, ref int, f float64, n int, prec uint) (*Resonance, error) {
	return level(layers, ref, f, n, prec, routeAuto)
}

type routeChoice int

const (
	routeAuto routeChoice = iota
	routeNarrowOnly
	routeNewtonOnly
)

func level(layers []Layer, ref int, f float64, n int, prec uint, choice routeChoice) (*Resonance, error) {
	if err := checkArgs(layers, ref, f, n, prec); err != nil {
		return nil, err
	}
	if prec == 0 {
		prec = DefaultPrec
	}
	pb := newProblem(layers, ref, f)
	etaB, m, err := pb.boundLevel(n, prec, f)
	if err != nil {
		return nil, err
	}
	res := &Resonance{N: n, Eta: etaB.SetPrec(prec), Gamma: newf(prec), Route: RouteBound}
	if pb.f == 0 {
		return res, nil
	}
	gamma, lg, err := pb.narrowGamma(m, prec)
	if err != nil {
		return nil, err
	}
	res.Gamma, res.Log10Gamma, res.Route = gamma, lg, RouteNarrow
	scale := math.Max(1, math.Abs(f64(etaB)))
	doNewton := choice == routeNewtonOnly || (choice == routeAuto && f64(lg)-math.Log10(scale) >= newtonFloor)
	if !doNewton {
		return res, nil
	}
	eta, err := pb.newton(n, etaB, gamma, prec)
	if err != nil {
		return nil, err
	}
	res.Eta = newf(prec).Set(&eta.re)
	g := newf(prec).Neg(&eta.im)
	g.SetMantExp(g, 1)
	res.Gamma = g
	res.Log10Gamma = log10(g, prec)
	res.Route = RouteNewton
	return res, nil
}

// Count returns the number of levels of the stack at field f that
// [Level] can find: the roots of its real stage below the ceiling (at
// f = 0 the bound states below both outer band edges; at f > 0 the levels
// below the downhill band edge at the first interface less f/s₀, where the
// downhill Airy argument is 1). Errors are as for [Level].
func Count(layers []Layer, ref int, f float64) (int, error) {
	if err := checkArgs(layers, ref, f, 1, 0); err != nil {
		return 0, err
	}
	pb := newProblem(layers, ref, f)
	lo, hi := pb.bounds()
	if hi <= lo {
		return 0, nil
	}
	c, _, err := pb.count(ffloat(hi, lowPrec), lowPrec)
	return c, err
}

// bounds returns float64 bounds lo < every level and hi, the ceiling of
// the search (see [Level]); hi ≤ lo means nothing is confined.
func (pb *problem) bounds() (lo, hi float64) {
	c := pb.consts(lowPrec)
	L := len(pb.layers)
	lo = math.Inf(1)
	for i := 1; i < L; i++ {
		lo = math.Min(lo, pb.layers[i].Edge+pb.f*(f64(c.pos[i])-0.5))
	}
	lo -= 1 + 1e-9*math.Abs(lo)
	v0 := pb.layers[0].Edge
	if pb.f == 0 {
		return lo, math.Min(v0, pb.layers[L-1].Edge)
	}
	s0 := math.Cbrt(math.Pi * math.Pi * pb.layers[0].Mass * pb.f)
	return lo, v0 + pb.f*(f64(c.pos[1])-0.5) - pb.f/s0
}

// count returns the number of roots of the real stage below η (see
// [Level]) and the evaluation at η.
func (pb *problem) count(eta *big.Float, p uint) (int, *match, error) {
	m, err := pb.evaluate(creal(eta, p), p, modeBound, false)
	if err != nil {
		return 0, nil, err
	}
	c := m.zeros
	s := m.d.re.Sign()
	if c%2 == 1 {
		s = -s
	}
	if s > 0 {
		c++
	}
	return c, m, nil
}

// boundLevel returns the n-th root η_B of the real stage to prec bits and
// the evaluation there at the working precision.
func (pb *problem) boundLevel(n int, prec uint, f float64) (*big.Float, *match, error) {
	lo, hi := pb.bounds()
	wp := prec + guard
	confined := func(k int) error {
		return &tiltwell.ConfinedError{Method: "bigstack", F: f, Asked: n, Confined: k,
			Why: fmt.Sprintf("ceiling η = %.6g (downhill Airy argument 1 at the first interface, or the lower outer edge at f = 0)", hi)}
	}
	if !(hi > lo) {
		return nil, nil, confined(0)
	}
	a, b := ffloat(lo, wp), ffloat(hi, wp)
	ca, _, err := pb.count(a, lowPrec)
	if err != nil {
		return nil, nil, err
	}
	if ca != 0 {
		return nil, nil, fmt.Errorf("bigstack: %d roots below the lower bound %g: %w", ca, lo, tiltwell.ErrNoConvergence)
	}
	// Upper bracket: lo + 2^j/4 for j = 0, 1, …, capped at the ceiling,
	// the first with at least n roots below. Low levels never pay for an
	// evaluation near a distant ceiling, which can be costly (a tall
	// barrier's ceiling, a long uphill oscillatory region at small f).
	cb := -1
	for j := 0; cb < 0; j++ {
		t := newf(wp).SetMantExp(fint(1, wp), j-2)
		t.Add(t, a)
		last := t.Cmp(b) >= 0 || j > 2100
		if last {
			t.Set(b)
		}
		c, _, err := pb.count(t, lowPrec)
		if err != nil {
			return nil, nil, err
		}
		switch {
		case c >= n:
			b, cb = t, c
		case last:
			return nil, nil, confined(c)
		default:
			a, ca = t, c
		}
	}
	// Bisect on the count until (a, b] holds exactly root n.
	for i := 0; ca != n-1 || cb != n; i++ {
		if i == 400 {
			return nil, nil, fmt.Errorf("bigstack: cannot isolate level %d: %w", n, tiltwell.ErrNoConvergence)
		}
		mid := newf(wp).Add(a, b)
		mid.SetMantExp(mid, -1)
		c, _, err := pb.count(mid, lowPrec)
		if err != nil {
			return nil, nil, err
		}
		if c >= n {
			b, cb = mid, c
		} else {
			a, ca = mid, c
		}
	}
	ma, err := pb.evaluate(creal(a, lowPrec), lowPrec, modeBound, false)
	if err != nil {
		return nil, nil, err
	}
	loSign := ma.d.re.Sign()
	// Newton with bisection fallback; D is continuous on (a, b) and changes
	// sign only at root n. The precision doubles as the iterate converges.
	p := uint(lowPrec)
	x := newf(wp).Add(a, b)
	x.SetMantExp(x, -1)
	step := newf(wp)
	for i := 0; i < 500; i++ {
		m, err := pb.evaluate(creal(x, p), p, modeBound, false)
		if err != nil {
			return nil, nil, err
		}
		g, dg := &m.d.re, &m.dd.re
		if g.Sign() == 0 {
			if p == wp {
				return x, m, nil
			}
			p = wp
			continue
		}
		ok := dg.Sign() != 0
		if ok {
			step.Quo(g, dg)
		}
		// The sign of D is trusted to shrink the bracket only while the
		// Newton step is well above the rounding noise at precision p.
		if !ok || relStep(x, step) < int(p)-24 {
			if g.Sign() == loSign {
				a.Set(x)
			} else {
				b.Set(x)
			}
		}
		next := newf(wp)
		if ok {
			next.Sub(x, step)
			ok = next.Cmp(a) > 0 && next.Cmp(b) < 0
		}
		if !ok {
			next.Add(a, b)
			next.SetMantExp(next, -1)
			step.Sub(x, next)
		}
		x = next
		rel := relStep(x, step)
		switch {
		case p < wp && rel > int(p)-24:
			p = min(2*p, wp)
		case p == wp && rel > int(prec)+8:
			// Newton converges quadratically: x carries about 2·rel bits.
			m, err := pb.evaluate(creal(x, wp), wp, modeBound, true)
			if err != nil {
				return nil, nil, err
			}
			return x, m, nil
		}
	}
	return nil, nil, fmt.Errorf("bigstack: Newton iteration for level %d did not converge: %w", n, tiltwell.ErrNoConvergence)
}

// relStep returns r with |step| ≈ 2^-r · max(1, |x|).
func relStep(x, step *big.Float) int {
	if step.Sign() == 0 {
		return math.MaxInt32
	}
	return max(bitsOf(x), 1) - bitsOf(step)
}

// narrowGamma returns Γ = 2 (s₀/μ₀) φ₀ / (π Bi(z₀)² dD/dη) at the real
// root (see [Level], step 2) and log₁₀ Γ. With the asymptotic form
// Bi² = e^(2ζ) S_u²/(π√z₀) it is formed as
// ln Γ = ln(2 (s₀/μ₀) φ₀ √z₀ / (S_u² dD/dη)) − 2ζ, so no e^ζ is formed.
func (pb *problem) narrowGamma(m *match, prec uint) (gamma, lg *big.Float, err error) {
	wp := prec + guard
	c := pb.consts(wp)
	lc0 := c.lc[0]
	// φ₀ = p₀/L at the root: p is computed to full relative precision,
	// while φ₀ may be tiny (a tall barrier) and then only accurate
	// relative to the solution's size.
	phi0 := newf(wp).Quo(&m.p.re, &m.l.re)
	num := newf(wp).Quo(lc0.s, lc0.mu)
	num.Mul(num, phi0)
	num.SetMantExp(num, 1)
	num.Quo(num, &m.dd.re)
	var ln *big.Float
	if m.biSq != nil {
		num.Quo(num, c.pi)
		num.Quo(num, m.biSq)
		if num.Sign() <= 0 {
			return nil, nil, fmt.Errorf("bigstack: narrow width %s not positive: %w", num.Text('g', 6), tiltwell.ErrNoConvergence)
		}
		return num.SetPrec(prec), log10(num, prec), nil
	}
	num.Mul(num, newf(wp).Sqrt(&m.z0.re))
	num.Quo(num, m.su)
	num.Quo(num, m.su)
	if num.Sign() <= 0 {
		return nil, nil, fmt.Errorf("bigstack: narrow width factor %s not positive: %w", num.Text('g', 6), tiltwell.ErrNoConvergence)
	}
	// The exponent 2ζ can be huge: carry enough bits for its integer part.
	ep := wp + uint(max(bitsOf(m.zeta), 0)) + 8
	ln = bigairy.Log(num, ep)
	twoZeta := newf(ep).SetMantExp(m.zeta, 1)
	ln.Sub(ln, twoZeta)
	lg = newf(ep).Quo(ln, bigairy.Log(fint(10, ep), ep))
	gamma = newf(prec)
	// big.Float's binary exponent is an int32: e^ln is representable for
	// ln above about −1.48e9.
	if f64(ln) > -1.4e9 {
		gamma = bigairy.Exp(ln, prec)
	}
	return gamma, lg.SetPrec(prec + uint(max(bitsOf(lg), 0))), nil
}

// log10 returns log₁₀ x for x > 0.
func log10(x *big.Float, prec uint) *big.Float {
	wp := prec + guard + 32
	l := bigairy.Log(x, wp)
	l.Quo(l, bigairy.Log(fint(10, wp), wp))
	return l.SetPrec(prec + 32)
}

// newton polishes the complex root from η_B − iΓ/2 (see [Level], step 3).
func (pb *problem) newton(n int, etaB, gammaN *big.Float, prec uint) (*cf, error) {
	scale := math.Max(1, math.Abs(f64(etaB)))
	// log₂(scale/Γ) from the binary exponents (Γ may be far below float64).
	extra := max(0, bitsOf(ffloat(scale, 64))-bitsOf(gammaN)+1)
	if gammaN.Sign() == 0 {
		return nil, fmt.Errorf("bigstack: width below big.Float's range: %w", tiltwell.ErrOutOfRange)
	}
	// The evaluation loses about 40 bits to the matching's conditioning
	// (measured: the Newton steps stall 34 bits below the working
	// precision), hence 2·guard.
	wp := prec + 2*guard + uint(extra)
	if wp > MaxPrec {
		return nil, fmt.Errorf("bigstack: complex Newton would need %d bits (Γ ≈ 2^-%d): %w", wp, extra, tiltwell.ErrOutOfRange)
	}
	eta := newc(wp)
	eta.re.Set(etaB)
	eta.im.SetMantExp(gammaN, -1)
	eta.im.Neg(&eta.im)
	step := newc(wp)
	prevMag := math.MaxInt32
	for i := 0; i < 80; i++ {
		m, err := pb.evaluate(eta, wp, modeOutgoing, false)
		if err != nil {
			return nil, err
		}
		if m.dd.mag() == math.MinInt32 {
			return nil, fmt.Errorf("bigstack: zero derivative in complex Newton: %w", tiltwell.ErrNoConvergence)
		}
		step.quo(m.d, m.dd)
		eta.sub(eta, step)
		// Converged when the step is 2^-(prec+8) below both Γ/2 and
		// max(1, |η_r|); Newton then has doubled those bits.
		tol := min(bitsOf(&eta.im), max(bitsOf(&eta.re), 1)) - int(prec) - 8
		sm := step.mag()
		if sm < tol {
			if eta.im.Sign() >= 0 {
				return nil, fmt.Errorf("bigstack: complex root with Im η ≥ 0: %w", tiltwell.ErrNoConvergence)
			}
			// The root must still be level n: its real part lies between
			// the real-stage roots n−1 and n+1.
			if c, _, err := pb.count(newf(lowPrec+guard).Set(&eta.re), lowPrec+guard); err == nil && (c < n-1 || c > n) {
				return nil, fmt.Errorf("bigstack: complex Newton for level %d ended at Re η with %d real roots below: %w", n, c, tiltwell.ErrNoConvergence)
			}
			return eta, nil
		}
		if sm > prevMag-4 && sm < bitsOf(&eta.im)-32 {
			// The steps stopped shrinking: they are rounding noise of the
			// evaluation, which loses bits where the matching function is
			// ill-conditioned. Raise the precision by the deficit.
			if wp > 2*MaxPrec {
				return nil, fmt.Errorf("bigstack: complex Newton for level %d stalls at 2^%d: %w", n, sm, tiltwell.ErrNoConvergence)
			}
			wp += uint(sm-tol) + 32
			e := newc(wp).set(eta)
			eta, step = e, newc(wp)
			prevMag = math.MaxInt32
			continue
		}
		prevMag = sm
	}
	return nil, fmt.Errorf("bigstack: complex Newton for level %d did not converge: %w", n, tiltwell.ErrNoConvergence)
}
