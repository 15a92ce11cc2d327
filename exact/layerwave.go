package exact

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/integrate/quad"

	"github.com/tiltwell/tiltwell"
)

// StackWave is the normalized wavefunction of one level of a layered well,
// returned by [Solver.Wavefunction] when the Solver has a Stack. It
// implements [tiltwell.Spread]. It is immutable and safe for concurrent
// use.
//
// A bound level (f = 0) is normalized over the whole line. A quasi-bound
// level (f ≠ 0) is the real solution of the level equation whose outgoing
// boundary condition is replaced by its real part: in the downhill outer
// layer φ follows the modulus M(z) of the outgoing wave (as a bound state
// follows its decaying exponential), and φ is normalized between the
// downhill classical turning point and +∞ (the tail beyond it holds the
// escaping flux, not the level). Its energy is η₀, the real level, which
// differs from the reported η_r by the second-order shift (below 1e-13
// for Γ < 1e-7). φ is positive at the first interface (the left edge of
// the inner layers).
type StackWave struct {
	c      calc
	eta    float64
	pieces []wavePiece // sorted by position, contiguous
	x1, xn float64     // the outer interfaces
	v0, vn float64     // the outer layers' band edges
	// Outer layers: φ at the interfaces, and (f = 0) the decay constants
	// or (f > 0) the Airy data there.
	phi1, phin  float64
	k0, kn      float64
	ls0, lsn    layerScale
	p1, pn      fpoint
	lnM1        float64 // ln M(z_I) at the first interface (f > 0)
	left, right tailEnd // the outer layers' Airy data at the interfaces (f > 0)
	lo, hi      float64 // support
	n           int
	turningLeft float64
}

// tailEnd is what the value of an outer layer's Airy solution needs at
// the layer's interface (f > 0): the deficit q, √q and the argument z
// there, and M² (the downhill layer) or Ai (the uphill one) at z when z
// is in the node table's range, or else ℓ(t) (downhill) or ℓ(−t) (uphill),
// the logarithm of the asymptotic series (see airyq.go).
type tailEnd struct {
	q, sq, z float64
	table    bool
	val      float64 // M²(z) or Ai(z), table range
	l        float64 // ℓ(±t), asymptotic range
}

// newTailEnd returns the tail data of the outer layer with scale ls where
// its deficit at the interface is q ≥ 0: of the modulus M (left) or of Ai.
func newTailEnd(ls *layerScale, q float64, left bool) tailEnd {
	e := tailEnd{q: q, sq: math.Sqrt(q), z: ls.c * q}
	if e.z < posStart {
		e.table = true
		if left {
			e.val = tableM2(e.z)
		} else {
			s, d := node(e.z)
			e.val = horner(&s.ai, d)
		}
		return e
	}
	sigma := -1.0
	if left {
		sigma = 1
	}
	e.l, _ = seriesEval(&logU, ls.tOf(q, e.sq), sigma)
	return e
}

// tOf returns t = 1/ζ = 3f/(2π√μ q^(3/2)) at the deficit q with √q = sq,
// formed so that it underflows to 0 rather than overflowing.
func (ls *layerScale) tOf(q, sq float64) float64 {
	return 1.5 * ls.f / (math.Pi * math.Sqrt(ls.mu) * sq) / q
}

// tableM2 returns M²(z) for z in the node table's range.
func tableM2(z float64) float64 {
	s, cs, ds := tableCD(dd{z, 0})
	return (cs*cs + ds*ds) / s.m2
}

// wavePiece is a stretch of an inner layer on which φ is carried from a
// known state at x, in the same direction as the solution was built.
type wavePiece struct {
	a, b float64 // the stretch, a < b
	x    float64 // where the state is known (a or b)
	u, w float64 // state at x (scaled by e^lg)
	lg   float64 // log of the factor that turns u into φ
	eLg  float64 // e^lg
	seg  segInfo
}

// waveRecorder collects the pieces while a solution is carried.
type waveRecorder struct{ pieces []wavePiece }

func (r *waveRecorder) point(xi float64, st rstate, seg segInfo) {
	a, b := min(xi, seg.to), max(xi, seg.to)
	r.pieces = append(r.pieces, wavePiece{a: a, b: b, x: xi, u: st.u.v, w: st.w.v, lg: st.lg, seg: seg})
}

// waveBuf is the storage a StackWave is built in: the wave and the
// recorders of the two carries, reused from one build to the next.
type waveBuf struct {
	sw          StackWave
	left, right waveRecorder
}

// maxWaveSteps is the most Newton steps buildWave takes from the energy
// it is given to the root of the real level equation.
const maxWaveSteps = 8

// buildWave fills b.sw with the wavefunction of level n of the stack at
// the root η₀ of its real level equation nearest eta, matched at
// interface m with the Prüfer scale S. It carries the two solutions to
// the interface, recording every step, and takes Newton steps on the
// level equation there until a step is below tol or the rounding floor;
// the wave is built from the last carry, at its η. An eta whose level
// equation is off by more than π/4 (a quarter of the way to the next
// level), or further than maxShift from the η₀ the steps reach, is not
// level n: an error wrapping ErrLevel.
func (c *calc) buildWave(b *waveBuf, n int, eta float64, m int, S, tol, maxShift float64) error {
	target := float64(n-1) * math.Pi
	start := eta
	var r evalResult
	for it := 0; ; it++ {
		L, R := c.recordCarry(b, eta, m)
		r = c.match(L, R, S)
		if math.IsInf(r.errD, 1) {
			return &farError{fmt.Errorf("exact: level %d at f = %g: the stack's layers hold more than %d Taylor steps at this field: %w", n, c.f, maxSteps, tiltwell.ErrOutOfRange)}
		}
		g := r.D - target
		if it == 0 && !(math.Abs(g) <= math.Pi/4) {
			return &farError{fmt.Errorf("exact: η = %v is not level %d at f = %g (its level equation is off by %.3gπ): %w", eta, n, c.f, g/math.Pi, tiltwell.ErrLevel)}
		}
		if !(r.Dp > 0) || math.IsInf(r.Dp, 0) {
			return &farError{fmt.Errorf("exact: level %d at f = %g: the level equation has slope %v at η = %v: %w", n, c.f, r.Dp, eta, tiltwell.ErrNoConvergence)}
		}
		step := g / r.Dp
		if math.Abs(g) <= r.errD || math.Abs(step) <= max(tol, 2*r.errD/r.Dp+4*eps*max(1, math.Abs(eta))) {
			break
		}
		if it == maxWaveSteps || !(math.Abs(eta-step-start) <= maxShift) {
			return &farError{fmt.Errorf("exact: level %d at f = %g: the wavefunction's energy did not settle within %.3g of η = %v: %w", n, c.f, maxShift, start, tiltwell.ErrNoConvergence)}
		}
		eta -= step
	}
	if !(math.Abs(eta-start) <= maxShift) {
		return &farError{fmt.Errorf("exact: η = %v is not level %d at f = %g, whose real level is %v: %w", start, n, c.f, eta, tiltwell.ErrLevel)}
	}
	c.finishWave(b, n, eta, S, &r)
	return nil
}

// farError is buildWave's report that the energy it was given is not
// within a few Newton steps of the real level: too far for its level
// equation (a broad resonance whose η_r lies a good part of the level
// spacing from η₀), or not level n at all.
type farError struct{ err error }

func (e *farError) Error() string { return e.err.Error() }
func (e *farError) Unwrap() error { return e.err }

// recordCarry carries the left solution to interface m and the right one
// back to it at η, recording every step in b's recorders.
func (c *calc) recordCarry(b *waveBuf, eta float64, m int) (L, R rstate) {
	b.left.pieces = b.left.pieces[:0]
	b.right.pieces = b.right.pieces[:0]
	lam, _, _ := c.leftBC(eta)
	L = rstate{u: dual{1, 0}, w: lam}
	for j := 1; j < m; j++ {
		c.cross(&L, j, 1, eta, &b.left)
	}
	R = rstate{u: dual{1, 0}, w: c.rightBC(eta)}
	for j := c.n - 2; j >= m; j-- {
		c.cross(&R, j, -1, eta, &b.right)
	}
	return L, R
}

// airyK0 is M′(0)² + 1/(π²M(0)²), with M the Airy modulus: with ζ-scaled
// units it is the turning point's share of ∫M² dz (see finishWave).
var airyK0 = func() float64 {
	ai, aip, bi, bip := Airy(0)
	m02 := ai*ai + bi*bi
	mp0 := (ai*aip + bi*bip) / math.Sqrt(m02)
	return mp0*mp0 + 1/(math.Pi*math.Pi*m02)
}()

// finishWave completes b.sw from the carries recorded at η, whose level
// equation at the matching interface is r: it scales the right solution
// to the left one, normalizes, and fills in the outer layers.
func (c *calc) finishWave(b *waveBuf, n int, eta, S float64, r *evalResult) {
	sw := &b.sw
	pieces := sw.pieces[:0]
	*sw = StackWave{c: *c, eta: eta, n: n}
	L, R := &r.L, &r.R
	// The right solution in units of the left one: u_R e^lgR = k u_L e^lgL
	// at the matching point, from the larger component.
	var ratio float64
	if math.Abs(S*L.u.v) >= math.Abs(L.w.v) {
		ratio = R.u.v / L.u.v
	} else {
		ratio = R.w.v / L.w.v
	}
	lnk := math.Log(math.Abs(ratio)) + R.lg - L.lg
	sgn := 1.0
	if ratio < 0 {
		sgn = -1
	}
	// The norm in units of the left solution (φ = 1 at interface 1), from
	// the Prüfer identity D′ = S π² N/(S²φ² + w²) at the matching point.
	U, W := S*L.u.v, L.w.v
	sc := max(math.Abs(U), math.Abs(W))
	lnN := math.Log(r.Dp*((U/sc)*(U/sc)+(W/sc)*(W/sc))/(S*math.Pi*math.Pi)) + 2*math.Log(sc) + 2*L.lg
	_, x1, v0, mu0 := c.layer(0)
	xn, _, vn, mun := c.layer(c.n - 1)
	sw.x1, sw.xn, sw.v0, sw.vn = x1, xn, v0, vn
	if c.f > 0 {
		// Between the turning point and interface 1, φ² ∝ M² holds
		// ∫₀^(z_I) M² dz = [zM² − M′² − 1/(π²M²)] over s, while the
		// Prüfer norm counted (MM″ − M′²)(z_I)/s = (zM² − M′² +
		// 1/(π²M²))(z_I)/s: the difference is (M′(0)² + 1/(π²M(0)²)
		// − 2/(π²M(z_I)²))/s in units of φ(ξ₁)²/M(z_I)².
		sw.ls0 = c.scale(0)
		q1 := max(v0+c.f*(x1-0.5)-eta, 0)
		sw.p1 = sw.ls0.forb(q1)
		sw.lnM1 = sw.ls0.lnM(&sw.p1)
		k0 := airyK0 - 2/(math.Pi*math.Pi)*math.Exp(-2*sw.lnM1)
		corr := k0 * math.Exp(-2*sw.lnM1) / sw.ls0.s
		lnN += math.Log1p(corr * math.Exp(-lnN))
		sw.turningLeft = 0.5 - (v0-eta)/c.f
		sw.lsn = c.scale(c.n - 1)
		qn := max(vn+c.f*(xn-0.5)-eta, 0)
		sw.pn = sw.lsn.forb(qn)
		sw.left = newTailEnd(&sw.ls0, q1, true)
		sw.right = newTailEnd(&sw.lsn, qn, false)
	} else {
		sw.k0 = math.Pi * math.Sqrt(mu0*(v0-eta))
		sw.kn = math.Pi * math.Sqrt(mun*(vn-eta))
	}
	half := 0.5 * lnN
	// The left pieces run rightward from interface 1 and the right ones
	// leftward from the last interface, so the left ones in order and the
	// right ones reversed are sorted by position.
	for _, p := range b.left.pieces {
		p.lg -= half
		p.eLg = math.Exp(p.lg)
		pieces = append(pieces, p)
	}
	for i := len(b.right.pieces) - 1; i >= 0; i-- {
		p := b.right.pieces[i]
		p.lg -= half + lnk
		p.eLg = math.Exp(p.lg)
		p.u *= sgn
		p.w *= sgn
		pieces = append(pieces, p)
	}
	sw.pieces = pieces
	sw.phi1 = math.Exp(-half)
	// φ at the last interface, from the right solution there (its start).
	sw.phin = sgn * math.Exp(-half-lnk)
	sw.lo, sw.hi = sw.support()
}

// lnM returns ln M(z) at a forbidden point.
func (ls *layerScale) lnM(p *fpoint) float64 {
	z := ls.zetaOf(p)
	if p.asym {
		return z + ls.lnBiRest(p)
	}
	r := p.ai / p.bi * math.Exp(-2*p.zeta)
	return z + math.Log(p.bi) + 0.5*math.Log1p(r*r)
}

// At returns φ(ξ), 0 for NaN.
func (sw *StackWave) At(xi float64) float64 {
	switch {
	case math.IsNaN(xi):
		return 0
	case xi < sw.x1:
		return sw.leftTail(xi)
	case xi > sw.xn:
		return sw.rightTail(xi)
	}
	// The first piece that ends at or beyond ξ.
	ps := sw.pieces
	i, j := 0, len(ps)
	for i < j {
		h := int(uint(i+j) >> 1)
		if ps[h].b < xi {
			i = h + 1
		} else {
			j = h
		}
	}
	if i == len(ps) {
		i = len(ps) - 1
	}
	return sw.pieceAt(&ps[i], xi)
}

func (sw *StackWave) pieceAt(p *wavePiece, xi float64) float64 {
	h := xi - p.x
	c := &sw.c
	seg := &p.seg
	switch seg.kind {
	case segTaylor:
		q := math.FMA(c.f, p.x-0.5, seg.v-sw.eta)
		u := taylorValue(p.u, p.w, h, seg.mu, math.Pi*math.Pi*seg.mu*q, math.Pi*math.Pi*seg.mu*c.f)
		return u * p.eLg
	case segZero:
		u, lg := zeroValue(p.u, p.w, h, seg.v, seg.mu, sw.eta)
		if lg == 0 {
			return u * p.eLg
		}
		return u * math.Exp(p.lg+lg)
	}
	// Thick forbidden part: φ = A d + B g from the state at x, with d =
	// Ai, g = Bi normalized at x.
	ls := &seg.ls
	var px *fpoint
	if p.x == seg.la {
		px = &seg.a
	} else {
		px = &seg.b
	}
	pt := ls.forb(max(seg.v+c.f*(xi-0.5)-sw.eta, 0))
	den := px.lg.v - px.ld.v
	A := (p.u*px.lg.v - p.w) / den
	B := (p.w - p.u*px.ld.v) / den
	var lnd, lng float64
	if xi >= p.x {
		gBi, gAi := ls.growth(px, &pt, xi-p.x)
		lnd, lng = -gAi.v, gBi.v
	} else {
		gBi, gAi := ls.growth(&pt, px, p.x-xi)
		lnd, lng = gAi.v, -gBi.v
	}
	return A*math.Exp(p.lg+lnd) + B*math.Exp(p.lg+lng)
}

// leftTail returns φ in the downhill outer layer: at f > 0,
// φ₁ M(z)/M(z_I), the modulus taken from the node table (M² from the
// phase series, no exponential), the modulus–phase expansion, or the
// asymptotic forms (see lnMRatio).
func (sw *StackWave) leftTail(xi float64) float64 {
	c := &sw.c
	if c.f == 0 {
		return sw.phi1 * math.Exp(sw.k0*(xi-sw.x1))
	}
	q := sw.v0 + c.f*(xi-0.5) - sw.eta
	z := sw.ls0.c * q
	var m2 float64
	switch {
	case z < posStart && z > -negStart:
		m2 = tableM2(z)
	case z <= -negStart:
		if z < -1e200 {
			return 0
		}
		x := -z
		w, _, _ := negModPhase(x)
		m2 = w / (math.Pi * math.Sqrt(x))
	default:
		// z ≥ posStart, and so is z_I > z.
		lr, _ := sw.ls0.lnMRatio(&sw.left, q, xi-sw.x1)
		return sw.phi1 * math.Exp(lr)
	}
	if sw.left.table {
		return sw.phi1 * math.Sqrt(m2/sw.left.val)
	}
	return sw.phi1 * math.Exp(0.5*math.Log(m2)-sw.lnM1)
}

// lnMRatio returns ln(M(z)/M(z_I)) and its derivative with respect to ξ
// for two points of a layer in the asymptotic range, the interface (e)
// and the point with deficit q a distance d = ξ − ξ_I from it: ln M =
// ζ + ln Bi − ζ to within (Ai/Bi)² < e^(−4ζ) < 1e-100, with ζ − ζ_I formed
// without cancellation (as in [layerScale.growth]).
func (ls *layerScale) lnMRatio(e *tailEnd, q, d float64) (lr, dlr float64) {
	sq := math.Sqrt(q)
	rm := math.Pi * math.Sqrt(ls.mu)
	dz := (2.0 / 3) * rm * d * (q + sq*e.sq + e.q) / (sq + e.sq)
	t := ls.tOf(q, sq)
	l, _ := seriesEval(&logU, t, 1)
	// ln(q/q_I), not log1p(f d/q_I): the same q as z, so that the two
	// cannot disagree near the turning point at a tiny field.
	lr = dz - 0.25*math.Log(q/e.q) + (l - e.l)
	rg, _ := seriesEval(&ratioR, t, 1)
	// d ln Bi/dξ = s Bi′/Bi = κ R(t), κ = π√(μq).
	return lr, rm * sq * rg
}

// leftLog returns ln(φ(ξ)/φ₁) and its derivative in the downhill outer
// layer at f > 0, at a point between the turning point and interface 1
// (z ≥ 0).
func (sw *StackWave) leftLog(xi float64) (lr, dlr float64) {
	c := &sw.c
	q := max(sw.v0+c.f*(xi-0.5)-sw.eta, 0)
	z := sw.ls0.c * q
	if z >= posStart {
		return sw.ls0.lnMRatio(&sw.left, q, xi-sw.x1)
	}
	// M² = (c² + d²)/M_j² and M′/M = (cc′ + dd′)/(c² + d²) from the
	// phase series (see airy.go).
	s, cs, ds := tableCD(dd{z, 0})
	d := z - s.z
	var cp, dp float64
	for k := s.nt - 1; k >= 1; k-- {
		cp = cp*d + float64(k)*s.c[k]
		dp = dp*d + float64(k)*s.d[k]
	}
	q2 := cs*cs + ds*ds
	return 0.5*math.Log(q2/s.m2) - sw.lnM1, sw.ls0.s * (cs*cp + ds*dp) / q2
}

// rightTail returns φ in the uphill outer layer: at f > 0,
// φ_n Ai(z)/Ai(z_n), Ai from its Taylor series about the nearest node or
// from the asymptotic forms DLMF 9.7.5, with ζ − ζ_n formed without
// cancellation when both points are in their range.
func (sw *StackWave) rightTail(xi float64) float64 {
	c := &sw.c
	if c.f == 0 {
		return sw.phin * math.Exp(-sw.kn*(xi-sw.xn))
	}
	q := sw.vn + c.f*(xi-0.5) - sw.eta
	ls := &sw.lsn
	z := ls.c * q
	e := &sw.right
	if z < posStart {
		// So is z_n ≤ z.
		s, d := node(z)
		return sw.phin * horner(&s.ai, d) / e.val
	}
	sq := math.Sqrt(q)
	t := ls.tOf(q, sq)
	l, _ := seriesEval(&logU, t, -1)
	rm := math.Pi * math.Sqrt(ls.mu)
	if e.table {
		// ln Ai = −ζ − ¼ ln z − ln(2√π) + ℓ(−t) (DLMF 9.7.5).
		zeta := (2.0 / 3) * rm * q * sq / ls.f
		lnAi := -zeta - 0.25*math.Log(z) - math.Log(2*math.Sqrt(math.Pi)) + l
		return sw.phin * math.Exp(lnAi-math.Log(e.val))
	}
	d := xi - sw.xn
	dz := (2.0 / 3) * rm * d * (q + sq*e.sq + e.q) / (sq + e.sq)
	return sw.phin * math.Exp(-(dz + 0.25*math.Log(q/e.q) + (e.l - l)))
}

// Support returns the interval over which φ is normalized and outside
// which ∫φ² dξ is below 1e-16: for a quasi-bound level it starts no
// further left than the downhill turning point.
func (sw *StackWave) Support() (lo, hi float64) { return sw.lo, sw.hi }

// support finds where the tails' weight falls below 1e-17 on each side.
func (sw *StackWave) support() (lo, hi float64) {
	const tiny = 1e-17
	// A tail that decays at least as fast as e^(−κd) beyond an
	// interface where φ = p holds at most p² e^(−2κd)/(2κ) beyond d.
	tail := func(p, k float64) float64 {
		w := p * p / (2 * k)
		if !(w > tiny) {
			return 0
		}
		return math.Log(w/tiny) / (2 * k)
	}
	c := &sw.c
	if c.f == 0 {
		return sw.x1 - tail(sw.phi1, sw.k0), sw.xn + tail(sw.phin, sw.kn)
	}
	// Uphill: the potential rises, so φ decays faster than with the
	// decay constant at the interface.
	hi = sw.xn + tail(sw.phin, math.Max(sw.pn.ld.v*-c.muAt(c.n-1), 1e-300))
	return sw.downhillEnd(tiny), hi
}

// downhillEnd returns the point ξ between the downhill turning point ξ_t
// and interface 1 where w(ξ) = (ξ − ξ_t) φ(ξ)² falls to tiny: φ² ∝ M²
// grows with ξ there, so w bounds ∫φ² from ξ_t to ξ, and beyond the point
// returned that weight is at most tiny. ln w increases with ξ; it is
// solved by Newton steps kept inside a bracket (bisection when a step
// leaves it), in u = ln(ξ − ξ_t) when the root lies in the half of
// [ξ_t, ξ₁] nearer the turning point (ln w = u + ln φ² has slope at least
// 1 there, and since φ grows the root lies between ln(tiny/φ₁²) and
// ln(tiny/φ(ξ_t)²)), and in the distance d = ξ₁ − ξ from the interface in
// the other half (at weak field the turning point is far away, and ξ_t +
// e^u would not resolve ξ). The point returned is within 1e-9 of the
// root's distance from the nearer end, on the side where w ≤ tiny; a root
// that close to ξ_t gives ξ_t itself.
func (sw *StackWave) downhillEnd(tiny float64) float64 {
	xt, x1 := sw.turningLeft, sw.x1
	span := x1 - xt
	if !(span > 0) {
		return x1
	}
	lnTiny := math.Log(tiny)
	lnP1 := 2 * math.Log(sw.phi1) // ln φ₁²
	// ln w − ln tiny at ξ = ξ₁ − d, with ξ − ξ_t = span − d, and its
	// derivative with respect to ξ.
	hx := func(d float64) (v, s float64) {
		lr, dlr := sw.leftLog(x1 - d)
		e := span - d
		return math.Log(e) + lnP1 + 2*lr - lnTiny, 1/e + 2*dlr
	}
	if v, _ := hx(0); !(v > 0) {
		return x1
	}
	if v, _ := hx(span / 2); !(v > 0) {
		// The root is in the half nearer the interface: Newton in d,
		// from the decay at the interface.
		a, b := 0.0, span/2 // w > tiny at a, ≤ tiny at b
		_, k := sw.leftLog(x1)
		d := (math.Log(span) + lnP1 - lnTiny) / (2 * k)
		for range 100 {
			if !(d > a && d < b) {
				// Bisection, in ln(1 + d) while the bracket spans
				// decades (a far turning point at a tiny field).
				d = a + (b-a)/2
				if b > 4*(a+1) {
					d = math.Sqrt((a+1)*(b+1)) - 1
				}
			}
			v, s := hx(d)
			if v > 0 {
				a = d
			} else {
				b = d
			}
			tol := 1e-9 * d
			if b-a <= tol {
				break
			}
			nd := d + v/s
			if v > 0 && math.Abs(nd-d) <= tol {
				// Newton has converged from inside: step just past the
				// root to close the bracket.
				nd += tol / 2
			}
			d = nd
		}
		// The float64 point no nearer the interface than the root.
		x := x1 - b
		for x1-x < b {
			x = math.Nextafter(x, math.Inf(-1))
		}
		return x
	}
	// The root is in the half nearer the turning point: Newton in u.
	h := func(u float64) (v, s float64) {
		d := math.Exp(u)
		lr, dlr := sw.leftLog(xt + d)
		return u + lnP1 + 2*lr - lnTiny, 1 + 2*dlr*d
	}
	lrt, _ := sw.leftLog(xt)
	a := lnTiny - lnP1                  // w ≤ tiny there: φ ≤ φ₁
	b := min(a-2*lrt, math.Log(span/2)) // w > tiny there
	tol := 1e-9 * span
	if math.Exp(b) <= tol {
		return xt
	}
	if !(a < b) {
		return xt
	}
	v, s := h(b)
	u := b - v/s
	for range 60 {
		if !(u > a && u < b) {
			u = a + (b-a)/2
		}
		v, s = h(u)
		if v > 0 {
			b = u
		} else {
			a = u
		}
		d := math.Exp(u)
		if math.Exp(b)-math.Exp(a) <= 1e-9*d || (b-a) <= 1e-9 {
			break
		}
		nu := u - v/s
		if v > 0 && math.Abs(nu-u) <= 1e-9 {
			// Newton has converged from above: step just past the root
			// to close the bracket.
			nu -= 0.5e-9
		}
		u = nu
	}
	// The float64 point no further from the turning point than e^a.
	x, e := xt+math.Exp(a), math.Exp(a)
	for x-xt > e && x > xt {
		x = math.Nextafter(x, math.Inf(-1))
	}
	return x
}

func (c *calc) muAt(j int) float64 {
	_, _, _, mu := c.layer(j)
	return mu
}

// taylorValue carries (φ, w) over h with the series of [taylorStep] and
// returns φ.
func taylorValue(u, w, h, mu, lam, beta float64) float64 {
	A, B := lam*h*h, beta*h*h*h
	e0, e1 := u, mu*w*h
	U := e0 + e1
	size := math.Abs(e0) + math.Abs(e1)
	var em1 float64
	ek, ek1 := e0, e1
	tol := 0x1p-60 * size
	for k := 0; k+2 < maxTaylor; k++ {
		// The reciprocal table, not a division: the terms form a
		// dependent chain, and a division would set its pace.
		e2 := (A*ek + B*em1) * taylorInv[k]
		U += e2
		// Two small terms in a row, checked every other term (as in
		// taylorStep).
		if k&1 == 1 && math.Abs(e2)+math.Abs(ek1) <= tol {
			break
		}
		em1, ek, ek1 = ek, ek1, e2
	}
	return U
}

// zeroValue carries (φ, w) over h through a zero-field layer and returns
// φ as a value and a log scale.
func zeroValue(u, w, h, v, mu, eta float64) (float64, float64) {
	lam := math.Pi * math.Pi * mu * (v - eta)
	ah := math.Abs(h)
	var C, S, lg float64
	switch x := lam * ah * ah; {
	case math.Abs(x) < 1:
		var cc, ss float64
		for k := 16; k >= 0; k-- {
			cc = 1 + cc*x/float64((2*k+1)*(2*k+2))
			ss = 1 + ss*x/float64((2*k+2)*(2*k+3))
		}
		C, S = cc, ah*ss
	case lam > 0:
		// The two modes, as in twoModeLayer.
		k := math.Sqrt(lam)
		e2 := math.Exp(-2 * k * ah)
		sw := w
		if h < 0 {
			sw = -w
		}
		G, Q := (u+mu*sw/k)/2, (u-mu*sw/k)/2
		return G + Q*e2, k * ah
	default:
		k := math.Sqrt(-lam)
		sn, cs := math.Sincos(k * ah)
		C, S = cs, sn/k
	}
	if h < 0 {
		S = -S
	}
	return C*u + mu*S*w, lg
}

// stackWavefunction returns the [*StackWave] of level n at f, or for f < 0
// the mirror image ([tiltwell.Mirror]) of the level of the mirrored stack
// at |f|.
func (s Solver) stackWavefunction(f float64, n int) (tiltwell.Wavefunction, error) {
	sl, c, err := s.solveOneCalc(f, n)
	if err != nil {
		return nil, err
	}
	w, err := c.newStackWave(&sl)
	if err != nil {
		return nil, err
	}
	if f < 0 {
		return tiltwell.Mirror(w, n), nil
	}
	return w, nil
}

// newStackWave builds the wavefunction of a solved level, at its real
// level η₀ and its matching interface.
func (c *calc) newStackWave(sl *stackLevel) (*StackWave, error) {
	b := new(waveBuf)
	rl := &sl.real
	if err := c.buildWave(b, sl.lv.N, rl.eta, rl.m, rl.S, 0, math.Inf(1)); err != nil {
		return nil, err
	}
	return &b.sw, nil
}

// stackDipole returns ⟨ξ − ½⟩ of level n at f by Gauss–Legendre
// quadrature of (ξ − ½)φ² over the support, piece by piece.
func (s Solver) stackDipole(f float64, n int) (float64, error) {
	sl, c, err := s.solveOneCalc(f, n)
	if err != nil {
		return 0, err
	}
	w, err := c.newStackWave(&sl)
	if err != nil {
		return 0, err
	}
	d := w.moment(func(x float64) float64 { return x - 0.5 })
	if f < 0 {
		d = -d
	}
	return d, nil
}

// moment returns ∫ g φ² over the support.
func (sw *StackWave) moment(g func(float64) float64) float64 {
	integrand := func(x float64) float64 { v := sw.At(x); return g(x) * v * v }
	gl := func(a, b float64) float64 {
		if !(b > a) {
			return 0
		}
		return quad.Fixed(integrand, a, b, 12, quad.Legendre{}, 0)
	}
	total := 0.0
	// Tails in pieces one decay length long (at most 60 of them).
	c := &sw.c
	kl, kr := sw.k0, sw.kn
	if c.f > 0 {
		kl = max(sw.p1.lg.v*sw.c.muAt(0), 1e-3)
		kr = max(-sw.pn.ld.v*sw.c.muAt(c.n-1), 1e-3)
	}
	total += gpieces(gl, sw.lo, sw.x1, 1/max(kl, 1e-3), false)
	total += gpieces(gl, sw.xn, sw.hi, 1/max(kr, 1e-3), true)
	for i := range sw.pieces {
		p := &sw.pieces[i]
		switch p.seg.kind {
		case segTaylor:
			total += gl(p.a, p.b)
		default:
			_, _, v, mu := c.layer(p.seg.layer)
			k := math.Pi * math.Sqrt(mu*max(math.Abs(v-sw.eta), math.Abs(v+c.f*(p.a-0.5)-sw.eta), math.Abs(v+c.f*(p.b-0.5)-sw.eta)))
			n := int(math.Ceil((p.b - p.a) * k / 1.5))
			if n <= 200 {
				total += gpieces(gl, p.a, p.b, (p.b-p.a)/float64(max(n, 1)), false)
			} else {
				// A long decaying stretch: only the end towards the
				// matching point matters.
				fromRight := p.x == p.a
				total += gpiecesEnd(gl, p.a, p.b, 1.5/k, fromRight)
			}
		}
	}
	return total
}

// gpieces integrates over [a, b] in pieces of length about h, at most 400
// of them, starting at the end where the integrand is large (a if fromB
// is false, else b... the pieces cover the interval either way).
func gpieces(gl func(a, b float64) float64, a, b, h float64, _ bool) float64 {
	if !(b > a) {
		return 0
	}
	n := int(math.Ceil((b - a) / h))
	n = min(max(n, 1), 400)
	s := 0.0
	for i := range n {
		x0 := a + (b-a)*float64(i)/float64(n)
		x1 := a + (b-a)*float64(i+1)/float64(n)
		s += gl(x0, x1)
	}
	return s
}

// gpiecesEnd integrates the 60 pieces of length h at one end of [a, b]:
// the right end if right, where a stretch decaying away from it holds all
// its weight.
func gpiecesEnd(gl func(a, b float64) float64, a, b, h float64, right bool) float64 {
	s := 0.0
	for i := range 60 {
		if right {
			x1 := b - float64(i)*h
			x0 := max(b-float64(i+1)*h, a)
			s += gl(x0, x1)
			if x0 == a {
				break
			}
		} else {
			x0 := a + float64(i)*h
			x1 := min(a+float64(i+1)*h, b)
			s += gl(x0, x1)
			if x1 == b {
				break
			}
		}
	}
	return s
}

// solveOneCalc solves level n alone and returns it with its calc.
func (s Solver) solveOneCalc(f float64, n int) (stackLevel, calc, error) {
	if err := tiltwell.CheckArgs("exact", f, n, MaxLevels, MaxField); err != nil {
		return stackLevel{}, calc{}, err
	}
	c := newCalc(s.Stack, f)
	sl, err := c.nth(n, f)
	return sl, c, err
}
