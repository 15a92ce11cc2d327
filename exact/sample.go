package exact

import (
	"errors"
	"fmt"
	"math"
	"sync"

	"github.com/tiltwell/tiltwell"
)

var (
	_ tiltwell.WaveSampler = Solver{}
	_ tiltwell.WaveBuilder = Solver{}
)

// BuildWave returns the wavefunction of level l at reduced field f, where
// l is a level that [Solver.Levels] returned for the same f, built from l
// without solving the level again (see [tiltwell.WaveBuilder]). Its values
// are those of [Solver.Wavefunction] to rounding; for a finite Stack it
// implements [tiltwell.Spread]. If reuse is a wavefunction that BuildWave
// returned before (of any Solver), the result is built in its storage and
// BuildWave does not allocate.
//
// The level's energy is the start of Newton steps on the level equation,
// stopped as soon as a step is below the level's Err (or the rounding
// floor): one evaluation for a level from Levels, two for a resonance
// whose second-order shift η_r − η₀ exceeds Err (the wavefunction of a
// quasi-bound level is built at the real level η₀, see [StackWave]). The
// cost is given at [Solver] ("Wavefunctions of solved levels").
//
// Errors: those of [Solver.Levels] for f and l.N; an energy that is not
// finite, whose level equation is more than a quarter of the way to the
// next level (a level other than l.N, or no level), or that the steps
// move by more than 16 Err (infinite walls) or Γ + 16 Err (a Stack: η_r
// lies within 0.3 Γ of η₀ on the test stacks), or (Stack) at or above the
// confinement ceiling wraps [tiltwell.ErrLevel].
func (s Solver) BuildWave(reuse tiltwell.Wavefunction, f float64, l tiltwell.Level) (tiltwell.Wavefunction, error) {
	if s.Stack.Infinite() {
		w, ok := reuse.(*sampledWave)
		if !ok || w == nil {
			w = new(sampledWave)
		}
		if err := w.build(f, l); err != nil {
			return nil, err
		}
		return w, nil
	}
	w, ok := reuse.(*sampledStackWave)
	if !ok || w == nil {
		w = new(sampledStackWave)
	}
	if err := s.buildStack(w, f, l); err != nil {
		return nil, err
	}
	return w, nil
}

// SampleWave appends φ(ξ) of level l at reduced field f for each ξ in xi
// to dst[:0] and returns the result (see [tiltwell.WaveSampler]), from l
// as [Solver.BuildWave] builds it. If dst has capacity for len(xi)
// values, SampleWave does not allocate (for a Stack, in steady state: the
// wavefunction's storage comes from a pool). Errors as for BuildWave.
func (s Solver) SampleWave(dst []float64, f float64, l tiltwell.Level, xi []float64) ([]float64, error) {
	dst = dst[:0]
	if s.Stack.Infinite() {
		var w sampledWave
		if err := w.build(f, l); err != nil {
			return dst, err
		}
		for _, x := range xi {
			dst = append(dst, w.At(x))
		}
		return dst, nil
	}
	w := stackWavePool.Get().(*sampledStackWave)
	defer stackWavePool.Put(w)
	if err := s.buildStack(w, f, l); err != nil {
		return dst, err
	}
	for _, x := range xi {
		dst = append(dst, w.At(x))
	}
	return dst, nil
}

var stackWavePool = sync.Pool{New: func() any { return new(sampledStackWave) }}

// sampledWave is the wavefunction BuildWave returns for infinite walls:
// the [Wave] at |f|, mirrored for f < 0 as [tiltwell.Mirror] does, with
// what its values need at the right wall z₁ computed once.
type sampledWave struct {
	w      Wave
	mirror bool
	sign   float64
	// Table range: cos Θ(z₁) and sin Θ(z₁).
	c1, s1 float64
	// Modulus–phase range: √x₁ and the phase correction at x₁ = −z₁.
	sx1, tc1 float64
	// Exponential range: the scaled Ai and Bi at z₁ and ζ₁.
	a1, b1, zeta1 float64
	// table: every point of the well is in the node table's range.
	table bool
}

// build fills w with the wavefunction of level l at f.
func (w *sampledWave) build(f float64, l tiltwell.Level) error {
	if err := tiltwell.CheckArgs("exact", f, l.N, MaxLevels, MaxField); err != nil {
		return err
	}
	n, eta := l.N, l.Energy
	af, mir := tiltwell.Fold(f)
	*w = sampledWave{mirror: mir, sign: 1}
	if mir && n%2 == 0 {
		w.sign = -1
	}
	if math.IsNaN(eta) || math.IsInf(eta, 0) {
		return fmt.Errorf("exact: level %d at f = %g: energy %v: %w", n, f, eta, tiltwell.ErrLevel)
	}
	if af < tinyField {
		// η = n² to far below the spacing 2n ± 1.
		if nn := float64(n) * float64(n); !(math.Abs(eta-nn) <= (2*float64(n)-1)/4) {
			return fmt.Errorf("exact: η = %v is not level %d at f = %g (%g): %w", eta, n, f, nn, tiltwell.ErrLevel)
		}
		w.w = Wave{n: n, scale: 1, zero: true}
		return nil
	}
	st := state{wallScale: newScale(af), n: n}
	tol := min(l.Err, 1e-12*max(1, math.Abs(eta)))
	for it := 0; ; it++ {
		g, gp, gerr := st.eval(eta)
		if it == 0 && !(math.Abs(g) <= math.Pi/4) {
			return fmt.Errorf("exact: η = %v is not level %d at f = %g (its phase condition is off by %.3gπ): %w", eta, n, f, g/math.Pi, tiltwell.ErrLevel)
		}
		step := g / gp
		if math.Abs(g) <= gerr || math.Abs(step) <= max(tol, 2*gerr/gp+2*eps*math.Abs(eta)) {
			break
		}
		if it == 4 {
			return fmt.Errorf("exact: level %d at f = %g: the wavefunction's energy did not settle from η = %v: %w", n, f, l.Energy, tiltwell.ErrNoConvergence)
		}
		eta -= step
	}
	if math.Abs(eta-l.Energy) > 16*l.Err+4*eps*max(1, math.Abs(eta)) {
		return fmt.Errorf("exact: η = %v is not level %d at f = %g, which is %v: %w", l.Energy, n, f, eta, tiltwell.ErrLevel)
	}
	st.eta = eta
	// As Wave.fill, with Θ(z₁) only where a point may need it, and cos Θ₁,
	// sin Θ₁ = (Bi, Ai)/M at z₁.
	sign := 1.0
	if n%2 == 0 {
		sign = -1
	}
	w.w = Wave{n: n, scale: 1, st: st, norm: sign * math.Sqrt(st.alpha*math.Pi/pdiff(&st))}
	z1 := -st.x1
	switch {
	case st.asym:
		w.sx1 = math.Sqrt(st.x1)
		_, w.tc1, _ = negModPhase(st.x1)
		return nil
	case z1 >= posStart:
		w.a1, _, w.b1, _, w.zeta1 = posScaled(z1)
		r := w.a1 / w.b1 * math.Exp(-2*w.zeta1) // Ai/Bi at z₁
		w.w.scale = math.Sqrt(1 + r*r)
		w.c1, w.s1 = 1/w.w.scale, r/w.w.scale
	case st.node1 != nil:
		// From the phase series about the node j nearest z₁ (see
		// airy.go): c = M_j M sin(Θ − Θ_j), d = M_j M cos(Θ − Θ_j), so
		// (cos Θ₁, sin Θ₁) is (Bi_j d − Ai_j c, Bi_j c + Ai_j d)/(M_j² M).
		s, c, d := st.node1, st.c1, st.d1
		a, b := s.ai[0], s.bi[0]
		m := math.Sqrt(s.m2 * (c*c + d*d))
		w.c1, w.s1 = (b*d-a*c)/m, (b*c+a*d)/m
	default:
		s, d := node(z1)
		a, b := estrin2(&s.ai, &s.bi, d)
		m := math.Hypot(a, b)
		w.c1, w.s1 = b/m, a/m
	}
	if st.x0 >= negStart {
		w.w.th1, _ = phase(z1)
	}
	w.table = st.x0 < negStart && z1 < posStart
	return nil
}

// At returns φ(ξ), as [Wave.At] (and [tiltwell.Mirror] for f < 0) does.
// In the node table's range it forms M sin(Θ − Θ₁) as Ai cos Θ₁ −
// Bi sin Θ₁ (DLMF 9.8.1–9.8.2), from the Taylor series of Ai and Bi about
// the nearest node: no trigonometric function, equal to Wave.At to
// rounding. Elsewhere the arithmetic is Wave.At's.
func (w *sampledWave) At(xi float64) float64 {
	sign := 1.0
	if w.mirror {
		if !(xi >= 0 && xi <= 1) {
			return 0
		}
		xi, sign = 1-xi, w.sign
	}
	if !(w.table && xi > 0 && xi < 1) {
		return sign * w.at(xi)
	}
	// Every point of the well is in the node table's range: estrin2,
	// written out here (the call is a fifth of the cost).
	wv := &w.w
	z := -(wv.st.x1 + wv.st.alpha*(1-xi))
	s := &series[int((z-airyZMin)/airyStep+0.5)]
	d := z - s.z
	a, b := &s.ai, &s.bi
	d2 := d * d
	d4 := d2 * d2
	d8 := d4 * d4
	a0, b0 := a[0]+a[1]*d, b[0]+b[1]*d
	a1, b1 := a[2]+a[3]*d, b[2]+b[3]*d
	a2, b2 := a[4]+a[5]*d, b[4]+b[5]*d
	a3, b3 := a[6]+a[7]*d, b[6]+b[7]*d
	a4, b4 := a[8]+a[9]*d, b[8]+b[9]*d
	a5, b5 := a[10]+a[11]*d, b[10]+b[11]*d
	a6, b6 := a[12]+a[13]*d, b[12]+b[13]*d
	a7, b7 := a[14]+a[15]*d, b[14]+b[15]*d
	a0, b0 = a0+a1*d2, b0+b1*d2
	a2, b2 = a2+a3*d2, b2+b3*d2
	a4, b4 = a4+a5*d2, b4+b5*d2
	a6, b6 = a6+a7*d2, b6+b7*d2
	a0, b0 = a0+a2*d4, b0+b2*d4
	a4, b4 = a4+a6*d4, b4+b6*d4
	ai, bi := a0+a4*d8, b0+b4*d8
	return sign * (wv.norm * (ai*w.c1 - bi*w.s1))
}

func (w *sampledWave) at(xi float64) float64 {
	if !(xi > 0 && xi < 1) {
		return 0
	}
	wv := &w.w
	if wv.zero {
		return math.Sqrt2 * math.Sin(float64(wv.n)*math.Pi*xi)
	}
	st := &wv.st
	d := st.alpha * (1 - xi) // x − x₁ ≥ 0
	x := st.x1 + d
	if st.asym {
		sx := math.Sqrt(x)
		wx, tc, _ := negModPhase(x)
		dth := (2.0/3)*d*(x+sx*w.sx1+st.x1)/(sx+w.sx1) + (tc - w.tc1)
		m := math.Sqrt(wx / (math.Pi * sx))
		return wv.norm * m * math.Sin(dth)
	}
	z := -x
	switch {
	case z >= posStart:
		a, _, b, _, zeta := posScaled(z)
		v := math.Exp(-zeta)*a - math.Exp(zeta-2*w.zeta1)*b*w.a1/w.b1
		return wv.norm * v / wv.scale
	case z > -negStart:
		s, dz := node(z)
		ai, bi := estrin2(&s.ai, &s.bi, dz)
		return wv.norm * (ai*w.c1 - bi*w.s1)
	}
	th, m2 := phaseM2(z)
	return wv.norm * math.Sqrt(m2) * math.Sin(th-wv.th1)
}

// estrin2 sums the first 16 terms of the Taylor series Σ a_k δ^k and
// Σ b_k δ^k of Ai and Bi about a node by Estrin's scheme (pairs of terms
// combined with δ², δ⁴, δ⁸): four dependent steps instead of Horner's
// fifteen, the two series interleaved. At |δ| ≤ airyStep/2 the omitted
// terms are below 1e-17 of the functions (TestEstrin holds the sums to
// Horner's 18-term ones within 4 ulps of the series' size).
func estrin2(a, b *[nTaylor]float64, d float64) (sa, sb float64) {
	d2 := d * d
	d4 := d2 * d2
	d8 := d4 * d4
	a0, b0 := a[0]+a[1]*d, b[0]+b[1]*d
	a1, b1 := a[2]+a[3]*d, b[2]+b[3]*d
	a2, b2 := a[4]+a[5]*d, b[4]+b[5]*d
	a3, b3 := a[6]+a[7]*d, b[6]+b[7]*d
	a4, b4 := a[8]+a[9]*d, b[8]+b[9]*d
	a5, b5 := a[10]+a[11]*d, b[10]+b[11]*d
	a6, b6 := a[12]+a[13]*d, b[12]+b[13]*d
	a7, b7 := a[14]+a[15]*d, b[14]+b[15]*d
	a0, b0 = a0+a1*d2, b0+b1*d2
	a2, b2 = a2+a3*d2, b2+b3*d2
	a4, b4 = a4+a5*d2, b4+b5*d2
	a6, b6 = a6+a7*d2, b6+b7*d2
	a0, b0 = a0+a2*d4, b0+b2*d4
	a4, b4 = a4+a6*d4, b4+b6*d4
	return a0 + a4*d8, b0 + b4*d8
}

// sampledStackWave is the wavefunction BuildWave returns for a Stack: the
// [StackWave] of the folded stack, mirrored for f < 0 as
// [tiltwell.Mirror] does, in storage that BuildWave reuses.
type sampledStackWave struct {
	b      waveBuf
	mirror bool
	sign   float64
}

// At returns φ(ξ), 0 for NaN.
func (w *sampledStackWave) At(xi float64) float64 {
	if w.mirror {
		if math.IsNaN(xi) {
			return 0
		}
		return w.sign * w.b.sw.At(1-xi)
	}
	return w.b.sw.At(xi)
}

// Support returns the interval over which φ is normalized (see
// [StackWave.Support]).
func (w *sampledStackWave) Support() (lo, hi float64) {
	lo, hi = w.b.sw.Support()
	if w.mirror {
		return 1 - hi, 1 - lo
	}
	return lo, hi
}

// buildStack fills w with the wavefunction of level l of the stack at f,
// matched where the solver matches it.
func (s Solver) buildStack(w *sampledStackWave, f float64, l tiltwell.Level) error {
	if err := tiltwell.CheckArgs("exact", f, l.N, MaxLevels, MaxField); err != nil {
		return err
	}
	n, eta := l.N, l.Energy
	if math.IsNaN(eta) || math.IsInf(eta, 0) {
		return fmt.Errorf("exact: level %d at f = %g: energy %v: %w", n, f, eta, tiltwell.ErrLevel)
	}
	c := newCalc(s.Stack, f)
	if _, ec, _ := c.bounds(n); !(eta < ec) {
		return fmt.Errorf("exact: η = %v is not below the outer band edges (%v): level %d at f = %g is not confined: %w", eta, ec, n, f, tiltwell.ErrLevel)
	}
	w.mirror, w.sign = c.mirror, 1
	if c.mirror && n%2 == 0 {
		w.sign = -1
	}
	tol := min(l.Err, 1e-12*max(1, math.Abs(eta)))
	// η_r lies within Γ of the real level η₀ (its second-order shift
	// g²(κ₂ − χ₁), g = −Γ/2, was at most 0.29 Γ on the test stacks).
	maxShift := l.Gamma + 16*l.Err + 4*eps*max(1, math.Abs(eta))
	err := c.buildFrom(w, n, eta, tol, maxShift)
	if err == nil {
		return nil
	}
	var far *farError
	if !errors.As(err, &far) {
		return err
	}
	// Newton steps from η_r do not reach the real level (a broad
	// resonance, Γ a good part of the spacing), or l is not level n:
	// solve level n as Wavefunction does, and build at its real level if
	// its η_r is l's.
	sl, serr := c.nth(n, f)
	if serr != nil {
		return serr
	}
	if !(math.Abs(sl.lv.Energy-eta) <= 16*(l.Err+sl.lv.Err)+4*eps*max(1, math.Abs(eta))) {
		return fmt.Errorf("exact: η = %v is not level %d at f = %g, which is %v: %w", eta, n, f, sl.lv.Energy, tiltwell.ErrLevel)
	}
	return c.buildWave(&w.b, n, sl.real.eta, sl.real.m, sl.real.S, 0, math.Inf(1))
}

// buildFrom fills w with the wavefunction of level n from its η_r (eta),
// matched where the solver matches it.
func (c *calc) buildFrom(w *sampledStackWave, n int, eta, tol, maxShift float64) error {
	if !(c.n > 3 && c.n <= maxSelect) {
		m := c.matchPoint()
		return c.buildWave(&w.b, n, eta, m, c.scaleAt(m, eta), tol, maxShift)
	}
	// Match where the level lives, as solveReal does: at the flattest
	// interface among those whose level equation agrees with a root
	// within maxShift of η_r (see flattest). The Newton steps to η₀ are
	// taken there, and the wave is built where D is flattest at η₀.
	ae := allPool.Get().(*allEval)
	defer allPool.Put(ae)
	c.evalAll(ae, eta, eta)
	target := float64(n-1) * math.Pi
	_, m := c.flattest(ae, target, 2*maxShift+1e-6*max(1, math.Abs(eta)))
	if err := c.buildWave(&w.b, n, eta, m, ae.S[m], tol, maxShift); err != nil {
		return err
	}
	eta0 := w.b.sw.eta
	c.evalAll(ae, eta0, eta0)
	if _, mf := c.flattest(ae, target, 1e-6*max(1, math.Abs(eta0))); mf != m {
		return c.buildWave(&w.b, n, eta0, mf, ae.S[mf], tol, maxShift-math.Abs(eta0-eta))
	}
	return nil
}
