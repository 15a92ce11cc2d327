package exact

import (
	"math"

	"github.com/tiltwell/tiltwell"
)

// Propagation of a real solution through the inner layers of a stack.
//
// In layer j (band edge v, mass ratio μ) the BenDaniel–Duke equation is,
// with w = φ′/μ (continuous at interfaces, as φ is) and the deficit
// q(ξ) = v + f(ξ − ½) − η,
//
//	φ′ = μ w,   w′ = π² q φ,   so   φ″ = λ(ξ) φ,  λ = π² μ q.
//
// A state is (φ, w) at one point, each with its derivative with respect to
// η (a [dual]), scaled by e^lg so that growth through thick barriers
// neither overflows nor underflows, and the number of zeros of φ passed so
// far. Four kinds of step carry it across a layer:
//
//   - f = 0: the exact transfer matrix of cosh/sinh (v > η) or cos/sin
//     (v < η), written with sinh(x)/x so that it is smooth through v = η;
//     across a barrier with κw > 1 in two-mode form (twoModeLayer).
//   - f > 0 across an allowed stretch spanning a unit of z or more: the
//     Airy amplitude–phase transfer (milne.go).
//   - f > 0 elsewhere, where the forbidden part is thin (ζ grows by less
//     than 20 across it), and in every stretch while a wavefunction is
//     recorded: the Taylor series of φ about the start of each step,
//     whose coefficients obey (k+2)(k+1) c_(k+2) = λ c_k + π²μf c_(k−1)
//     (DLMF 9.2.1 in these variables); steps are short enough
//     (|h|·max(√|λ|, (π²μf)^(1/3)) ≤ stepTheta) that a step holds at most
//     one zero of φ and the series needs about 20 terms (across a stretch
//     forbidden throughout, while levels are solved, |h|·√|λ| may reach
//     2·stepTheta, about 30 terms). At f → 0 this is the zero-field
//     transfer.
//   - f > 0 across a thick forbidden part (ζ grows by 20 or more): the
//     growing Airy solution alone (the decaying one is below e^(−40) of
//     it at the far end), from the log-derivatives of Ai and Bi at both
//     ends and the growth ln(Bi_b/Bi_a) (see airyq.go).
//
// Zeros are counted by the sign of φ at the ends of each step (a step,
// a forbidden part and a zero-field layer with kw < π hold at most one), or
// from the exact phase (kw, or Δ of the Airy transfer) across a longer
// allowed stretch.

// stepTheta bounds |h|·scale of one Taylor step.
const stepTheta = 1.25

// thickZeta is the growth of ζ across a forbidden part beyond which only
// the growing solution is carried.
const thickZeta = 20.0

// maxTaylor is the most terms of one Taylor step.
const maxTaylor = 40

// maxSteps is the most Taylor steps one evaluation of the level equation
// may take (a few milliseconds); a stack and field that would need more
// (phases of 1e5 radians across the layers) are beyond the solver's
// range.
const maxSteps = 50000

type rstate struct {
	u, w  dual
	lg    float64
	nodes int
	// steps counts Taylor steps and layer transfers, for the rounding
	// estimate; over is set when a layer would have needed more than
	// maxSteps.
	steps int
	over  bool
}

// crossed reports whether φ passes through a zero going from a value
// `from` to a value `to`: a zero strictly after the start, the end
// included.
func crossed(from, to float64) bool {
	return (from > 0 && to <= 0) || (from < 0 && to >= 0)
}

// renorm rescales the state by a power of two when it grows large or
// small.
func (st *rstate) renorm() {
	m := max(math.Abs(st.u.v), math.Abs(st.w.v))
	if m > 0x1p-400 && m < 0x1p400 {
		return
	}
	if m == 0 || math.IsInf(m, 0) || math.IsNaN(m) {
		return
	}
	_, e := math.Frexp(m)
	sc, sc2 := scaleSteps(e)
	st.u.v *= sc
	st.u.d *= sc
	st.w.v *= sc
	st.w.d *= sc
	if sc2 != 1 {
		st.u.v *= sc2
		st.u.d *= sc2
		st.w.v *= sc2
		st.w.d *= sc2
	}
	st.lg += float64(e) * math.Ln2
}

// scaleSteps returns two factors whose product is 2^−e: 2^−e and 1 while
// 2^−e is a float64, and two halves for a subnormal size (e < −1022,
// where 2^−e overflows: a solution that has decayed across a thick
// barrier to the subnormal range became ±Inf, and its wavefunction NaN).
func scaleSteps(e int) (sc, sc2 float64) {
	if e >= -1022 {
		return math.Ldexp(1, -e), 1
	}
	return math.Ldexp(1, -e/2), math.Ldexp(1, -e+e/2)
}

// recorder receives the state at every step point while a wavefunction
// is being built; nil while levels are being solved.
type recorder interface {
	point(xi float64, st rstate, seg segInfo)
}

// segInfo describes the stretch of layer that begins at a recorded
// point.
type segInfo struct {
	kind   segKind
	layer  int
	mu, v  float64
	to     float64 // the other end of the step or part
	ls     layerScale
	a, b   fpoint // thick part: ends (a left, b right)
	la, lb float64
}

type segKind int

const (
	segTaylor segKind = iota
	segZero           // zero-field layer transfer
	segThick          // thick forbidden part (Airy)
)

// taylorStep advances st over h in a region where φ″ = λ(ξ)φ with
// λ = lam + beta (ξ − start); lamd = ∂lam/∂η.
func taylorStep(st *rstate, h, mu, lam, beta, lamd float64) {
	A, B, Ad := lam*h*h, beta*h*h*h, lamd*h*h
	// e_k = c_k h^k and its η-derivative d_k.
	e0, e1 := st.u.v, mu*st.w.v*h
	d0, d1 := st.u.d, mu*st.w.d*h
	U, W := e0+e1, e1
	Ud, Wd := d0+d1, d1
	tol := 0x1p-60 * (math.Abs(e0) + math.Abs(e1))
	told := 0x1p-60 * (math.Abs(d0) + math.Abs(d1) + (math.Abs(e0)+math.Abs(e1))*math.Abs(Ad))
	var em1, dm1 float64 // e_(k−1), d_(k−1)
	ek, ek1, dk, dk1 := e0, e1, d0, d1
	for k := 0; k+2 < maxTaylor; k++ {
		inv := taylorInv[k]
		e2 := (A*ek + B*em1) * inv
		d2 := (A*dk + Ad*ek + B*dm1) * inv
		kk := taylorK[k]
		U += e2
		W += kk * e2
		Ud += d2
		Wd += kk * d2
		// Two small terms in a row (the three-term recurrence can
		// make one small by accident); checked every other term.
		if k&1 == 1 && math.Abs(e2)+math.Abs(ek1) <= tol && math.Abs(d2)+math.Abs(dk1) <= told {
			break
		}
		em1, dm1 = ek, dk
		ek, dk = ek1, dk1
		ek1, dk1 = e2, d2
	}
	from := st.u.v
	st.u = dual{U, Ud}
	st.w = dual{W / (mu * h), Wd / (mu * h)}
	if crossed(from, U) {
		st.nodes++
	}
	st.steps++
	st.renorm()
}

// taylorInv[k] = 1/((k+2)(k+1)) and taylorK[k] = k+2.
var taylorInv, taylorK = func() (inv, kk [maxTaylor]float64) {
	for k := range inv {
		inv[k] = 1 / float64((k+2)*(k+1))
		kk[k] = float64(k + 2)
	}
	return inv, kk
}()

// taylorPart carries st from x0 to x1 (either direction) through part of a
// layer with edge v and mass mu at field f > 0, in Taylor steps; s is the
// layer's Airy scale (π²μf)^(1/3) (layerScale.s).
func taylorPart(st *rstate, x0, x1, v, mu, f, eta, s float64, rec recorder, seg segInfo) {
	L := x1 - x0
	if L == 0 {
		return
	}
	p2 := math.Pi * math.Pi
	q0 := v + f*(x0-0.5) - eta
	q1 := v + f*(x1-0.5) - eta
	lmax := p2 * mu * max(math.Abs(q0), math.Abs(q1))
	kscale := math.Sqrt(lmax)
	if rec == nil && q0 >= 0 && q1 >= 0 {
		// Forbidden throughout (q is linear): φ has at most one zero
		// there whatever the step, and the terms of a step twice as
		// long (about 30) fall like those of cosh, so that the step
		// loses to cancellation what the two short ones would
		// together. A recorded wavefunction keeps the short pieces
		// its samples and norm integrals are made for.
		kscale /= 2
	}
	scale := max(kscale, s)
	nf := math.Ceil(math.Abs(L) * scale / stepTheta)
	if !(nf <= maxSteps) || st.steps+int(nf) > maxSteps || st.over {
		st.over = true
		return
	}
	n := max(int(nf), 1)
	h := L / float64(n)
	beta := p2 * mu * f
	for i := range n {
		x := x0 + float64(i)*h
		if rec != nil {
			seg.kind, seg.to = segTaylor, x+h
			if i == n-1 {
				seg.to = x1
			}
			rec.point(x, *st, seg)
		}
		hh := h
		if i == n-1 {
			hh = x1 - x // land exactly on x1
		}
		q := math.FMA(f, x-0.5, v-eta)
		taylorStep(st, hh, mu, p2*mu*q, beta, -p2*mu)
	}
}

// allowedPart carries st across an allowed stretch at f > 0: by the Airy
// transfer (milnePart) when the stretch spans at least one unit of z and
// no wavefunction is being recorded, by Taylor steps otherwise.
func allowedPart(st *rstate, x0, x1, v, mu, f, eta float64, rec recorder, seg segInfo, ls layerScale, taylorOnly bool) {
	if rec == nil && !taylorOnly && ls.s*math.Abs(x1-x0) >= 1 && ls.c*(eta-v-f*(min(x0, x1)-0.5)) < 1e8 {
		milnePart(st, x0, x1, v, mu, f, eta, &ls)
		return
	}
	taylorPart(st, x0, x1, v, mu, f, eta, ls.s, rec, seg)
}

// zeroFieldLayer carries st across a whole layer of width w (w < 0 for
// the leftward direction) at f = 0.
func zeroFieldLayer(st *rstate, w, v, mu, eta float64) {
	lam := math.Pi * math.Pi * mu * (v - eta)
	lamd := -math.Pi * math.Pi * mu
	aw := math.Abs(w)
	// C = cosh(√λ|w|), S = sinh(√λ|w|)/√λ (cos and sin(√−λ|w|)/√−λ for
	// λ < 0); the leftward transfer, the inverse, has −S.
	var C, S, Cl, Sl float64
	x := lam * aw * aw
	switch {
	case math.Abs(x) < 1:
		// Series in x = λw²: C = Σ x^k/(2k)!, S = w Σ x^k/(2k+1)!,
		// dC/dλ = wS/2, dS/dλ = w³ Σ x^k (k+1)/(2k+3)!.
		var c, s float64
		for k := 16; k >= 0; k-- {
			c = 1 + c*x/float64((2*k+1)*(2*k+2))
			s = 1 + s*x/float64((2*k+2)*(2*k+3))
		}
		C, S = c, aw*s
		Cl, Sl = aw*S/2, aw*aw*aw*sdSeries(x)
	case lam > 0 && math.Sqrt(lam)*aw > 1:
		twoModeLayer(st, w, lam, mu)
		return
	case lam > 0:
		k := math.Sqrt(lam)
		kw := k * aw
		C = math.Cosh(kw)
		S = math.Sinh(kw) / k
		Cl = aw * S / 2
		Sl = (aw*C - S) / (2 * lam)
	default:
		k := math.Sqrt(-lam)
		sn, cs := math.Sincos(k * aw)
		C, S = cs, sn/k
		Cl = aw * S / 2
		Sl = (aw*C - S) / (2 * lam)
	}
	if w < 0 {
		S, Sl = -S, -Sl
	}
	// T = [[C, μS], [λS/μ, C]].
	t11, t12, t21 := C, mu*S, lam*S/mu
	t11d, t12d, t21d := Cl*lamd, mu*Sl*lamd, (lamd*S+lam*Sl*lamd)/mu
	u, wv := st.u, st.w
	from := u.v
	nu := dual{t11*u.v + t12*wv.v, t11d*u.v + t12d*wv.v + t11*u.d + t12*wv.d}
	nw := dual{t21*u.v + t11*wv.v, t21d*u.v + t11d*wv.v + t21*u.d + t11*wv.d}
	st.u, st.w = nu, nw
	st.steps++
	if lam < 0 && math.Sqrt(-lam)*aw >= math.Pi {
		// Count from the phase: the Prüfer angle atan2((k/μ)φ, w)
		// advances by exactly kw.
		k := math.Sqrt(-lam)
		a0 := lineAngle(k/mu*u.v, wv.v)
		a1 := lineAngle(k/mu*nu.v, nw.v)
		if w < 0 {
			a0, a1 = a1, a0
		}
		if ph := k * aw; ph < 1e15 {
			st.nodes += int(math.Round((ph + a0 - a1) / math.Pi))
		} else {
			// Beyond any level this solver reaches: count nothing
			// rather than an overflowed integer.
			st.nodes += 318309886183791 // 1e15/π
		}
	} else if crossed(from, nu.v) {
		st.nodes++
	}
	st.renorm()
}

// twoModeLayer carries st across a zero-field barrier layer with κ|w| > 1
// (w < 0 for the leftward direction) in the form φ = G e^(κd) + Q e^(−κd),
// d the distance travelled: the amplitude G of the mode that grows along
// the way is formed once, so that the direction of the result is that of
// a solution (the matrix form would round φ and w separately, and a
// state entering nearly in the decaying mode would leave in a direction
// wrong by ε over the size of G).
func twoModeLayer(st *rstate, w, lam, mu float64) {
	k := math.Sqrt(lam)
	aw := math.Abs(w)
	kd := -math.Pi * math.Pi * mu / (2 * k) // dκ/dη
	sg := 1.0
	if w < 0 {
		sg = -1
	}
	// In the direction of travel, w' = σw with σ = ±1; the growing mode has
	// w'/φ = κ/μ.
	r := mu / k
	rd := -mu * kd / (k * k)
	u, wv := st.u, dual{sg * st.w.v, sg * st.w.d}
	G := dual{(u.v + r*wv.v) / 2, (u.d + r*wv.d + rd*wv.v) / 2}
	Q := dual{(u.v - r*wv.v) / 2, (u.d - r*wv.d - rd*wv.v) / 2}
	kw := k * aw
	e2 := math.Exp(-2 * kw)
	kwd := kd * aw
	e2d := -2 * kwd * e2
	km := k / mu
	kmd := kd / mu
	// Scaled by e^(−κ|w|): φ = G + Q e2, σw = (κ/μ)(G − Q e2); the
	// derivative of the scale factor, κ′|w|, is folded into the
	// derivatives.
	nu := dual{G.v + Q.v*e2, G.d + Q.d*e2 + Q.v*e2d}
	dm := dual{G.v - Q.v*e2, G.d - Q.d*e2 - Q.v*e2d}
	nw := dual{km * dm.v, kmd*dm.v + km*dm.d}
	nu.d += kwd * nu.v
	nw.d += kwd * nw.v
	from := st.u.v
	st.u = nu
	st.w = dual{sg * nw.v, sg * nw.d}
	st.lg += clampLg(kw)
	st.steps++
	if crossed(from, nu.v) {
		st.nodes++
	}
	st.renorm()
}

// sdSeries returns (dS/dλ)/w³ = Σ_(k≥0) x^k (k+1)/(2k+3)! for x = λw², the
// derivative of S = w Σ x^k/(2k+1)! with respect to λ.
func sdSeries(x float64) float64 {
	s := 0.0
	for k := 16; k >= 0; k-- {
		// term_k = (k+1)/(2k+3)!; term_(k+1)/term_k = (k+2)/((k+1)(2k+4)(2k+5)).
		s = 1 + s*x*float64(k+2)/(float64(k+1)*float64((2*k+4)*(2*k+5)))
	}
	return s / 6
}

// lineAngle returns the angle of the line through (x, y) = (w, Sφ) in
// [0, π], continued from the sign of y = Sφ: atan2(y, x) for y > 0 and
// atan2(y, x) + π for y < 0. An angle that rounds to π is left at π
// rather than folded to 0, so that the angle and the sign of φ (from which
// zeros are counted) never disagree.
func lineAngle(y, x float64) float64 {
	switch {
	case y > 0:
		return math.Atan2(y, x)
	case y < 0:
		return math.Atan2(y, x) + math.Pi
	}
	return 0
}

// thickRight carries st rightward from forbidden point a to b (a thick
// part), keeping the growing solution Bi.
func thickRight(st *rstate, a, b *fpoint, gBi dual) {
	den := a.lg.v - a.ld.v
	dend := a.lg.d - a.ld.d
	num := st.w.v - st.u.v*a.ld.v
	numd := st.w.d - st.u.d*a.ld.v - st.u.v*a.ld.d
	amp := num / den
	ampd := (numd*den - num*dend) / (den * den)
	from := st.u.v
	ud := ampd + amp*gBi.d
	st.u = dual{amp, ud}
	st.w = dual{b.lg.v * amp, b.lg.d*amp + b.lg.v*ud}
	st.lg += clampLg(gBi.v)
	if crossed(from, amp) {
		st.nodes++
	}
	st.steps++
	st.renorm()
}

// thickLeft carries st leftward from forbidden point b to a, keeping the
// solution Ai that grows to the left.
func thickLeft(st *rstate, a, b *fpoint, gAi dual) {
	den := b.ld.v - b.lg.v
	dend := b.ld.d - b.lg.d
	num := st.w.v - st.u.v*b.lg.v
	numd := st.w.d - st.u.d*b.lg.v - st.u.v*b.lg.d
	amp := num / den
	ampd := (numd*den - num*dend) / (den * den)
	from := st.u.v
	ud := ampd + amp*gAi.d
	st.u = dual{amp, ud}
	st.w = dual{a.ld.v * amp, a.ld.d*amp + a.ld.v*ud}
	st.lg += clampLg(gAi.v)
	if crossed(from, amp) {
		st.nodes++
	}
	st.steps++
	st.renorm()
}

// clampLg keeps a log-scale increment finite (an increment of 1e300 already
// means that whatever lies beyond is zero to any precision).
func clampLg(x float64) float64 { return min(x, 1e300) }

// calc is one stack at one folded field f ≥ 0: the layers and the level
// equation's pieces. It holds no memory of its own, so that solving
// levels does not allocate.
//
// A negative field is solved as |f| on the mirror image of the stack
// ([tiltwell.Stack.Fold]); calc reads the layers mirrored itself, so that
// no mirrored copy of the stack is made.
type calc struct {
	st     tiltwell.Stack
	n      int
	f      float64
	mirror bool
	// forceBroad makes every quasi-bound level take the complex path,
	// and taylorOnly every allowed stretch Taylor steps (tests compare
	// the formulations).
	forceBroad, taylorOnly bool
	// scales caches the layer scales of the first layers and of the last
	// one (scales[cachedScales]).
	scales [cachedScales + 1]layerScale
}

// cachedScales is how many layers' scales a calc keeps.
const cachedScales = 8

func newCalc(st tiltwell.Stack, f float64) calc {
	af, mir := tiltwell.Fold(f)
	c := calc{st: st, n: st.Len(), f: af, mirror: mir}
	if af > 0 {
		// One cube root of f, and one of π²μ per mass (the layers
		// repeat a few).
		cf := math.Cbrt(af)
		var roots [cachedScales]float64 // (π²μ)^(1/3) of the cached layers
		scaleOf := func(i int) layerScale {
			_, _, _, mu := c.layer(i)
			a := math.NaN()
			for j := range min(i, cachedScales) {
				if c.scales[j].mu == mu {
					a = roots[j]
					break
				}
			}
			if math.IsNaN(a) {
				a = math.Cbrt(math.Pi * math.Pi * mu)
			}
			if i < cachedScales {
				roots[i] = a
			}
			return scaleFrom(mu, af, a, cf)
		}
		for j := range min(c.n, cachedScales) {
			c.scales[j] = scaleOf(j)
		}
		c.scales[cachedScales] = scaleOf(c.n - 1)
	}
	return c
}

// scale returns the layer scale of layer j (f > 0).
func (c *calc) scale(j int) layerScale {
	switch {
	case j < cachedScales:
		return c.scales[j]
	case j == c.n-1:
		return c.scales[cachedScales]
	}
	_, _, _, mu := c.layer(j)
	return newLayerScale(mu, c.f)
}

// layer returns the span, band edge and mass ratio of layer j of the
// folded stack.
func (c *calc) layer(j int) (lo, hi, v, mu float64) {
	if c.mirror {
		jj := c.n - 1 - j
		l, _ := c.st.Layer(jj)
		a, b := c.st.Span(jj)
		return 1 - b, 1 - a, l.Edge, l.Mass
	}
	l, _ := c.st.Layer(j)
	lo, hi = c.st.Span(j)
	return lo, hi, l.Edge, l.Mass
}

// cross carries st across inner layer j, rightward (dir > 0) or leftward.
func (c *calc) cross(st *rstate, j, dir int, eta float64, rec recorder) {
	lo, hi, v, mu := c.layer(j)
	f := c.f
	x0, x1 := lo, hi
	if dir < 0 {
		x0, x1 = hi, lo
	}
	seg := segInfo{layer: j, mu: mu, v: v}
	if f == 0 {
		if rec != nil {
			seg.kind, seg.to = segZero, x1
			rec.point(x0, *st, seg)
		}
		zeroFieldLayer(st, x1-x0, v, mu, eta)
		return
	}
	// Deficits at the ends; q grows with ξ.
	qlo := v + f*(lo-0.5) - eta
	qhi := v + f*(hi-0.5) - eta
	if qhi <= 0 {
		// Allowed throughout.
		allowedPart(st, x0, x1, v, mu, f, eta, rec, seg, c.scale(j), c.taylorOnly)
		return
	}
	// The forbidden part [xt, hi] with xt the turning point (or lo).
	xt := lo
	if qlo < 0 {
		xt = min(max(lo-qlo/f, lo), hi)
		qlo = 0
	}
	ls := c.scale(j)
	// ζ grows across the forbidden part by about (2/3)π√μ L(q₀+√(q₀q₁)+q₁)/(√q₀+√q₁).
	L := hi - xt
	s0, s1 := math.Sqrt(qlo), math.Sqrt(qhi)
	dzeta := (2.0 / 3) * math.Pi * math.Sqrt(mu) * L * (qlo + s0*s1 + qhi) / (s0 + s1)
	if !(dzeta >= thickZeta) {
		if xt > lo {
			// An allowed stretch and a thin forbidden one.
			if dir > 0 {
				allowedPart(st, lo, xt, v, mu, f, eta, rec, seg, ls, c.taylorOnly)
				taylorPart(st, xt, hi, v, mu, f, eta, ls.s, rec, seg)
			} else {
				taylorPart(st, hi, xt, v, mu, f, eta, ls.s, rec, seg)
				allowedPart(st, xt, lo, v, mu, f, eta, rec, seg, ls, c.taylorOnly)
			}
			return
		}
		taylorPart(st, x0, x1, v, mu, f, eta, ls.s, rec, seg)
		return
	}
	a, b := ls.forb(qlo), ls.forb(qhi)
	gBi, gAi := ls.growth(&a, &b, L)
	seg.kind, seg.ls, seg.a, seg.b, seg.la, seg.lb = segThick, ls, a, b, xt, hi
	if dir > 0 {
		if xt > lo {
			allowedPart(st, lo, xt, v, mu, f, eta, rec, segInfo{layer: j, mu: mu, v: v}, ls, c.taylorOnly)
		}
		if rec != nil {
			seg.to = hi
			rec.point(xt, *st, seg)
		}
		thickRight(st, &a, &b, gBi)
		return
	}
	if rec != nil {
		seg.to = xt
		rec.point(hi, *st, seg)
	}
	thickLeft(st, &a, &b, gAi)
	if xt > lo {
		allowedPart(st, xt, lo, v, mu, f, eta, rec, segInfo{layer: j, mu: mu, v: v}, ls, c.taylorOnly)
	}
}
