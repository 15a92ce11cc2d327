package exact

import (
	"math"
	"sort"

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
	pieces []wavePiece
	x1, xn float64 // the outer interfaces
	// Outer layers: φ at the interfaces, and (f = 0) the decay constants
	// or (f > 0) the Airy data there.
	phi1, phin  float64
	k0, kn      float64
	ls0, lsn    layerScale
	p1, pn      fpoint
	lnM1        float64 // ln M(z_I) at the first interface (f > 0)
	lo, hi      float64 // support
	n           int
	turningLeft float64
}

// wavePiece is a stretch of an inner layer on which φ is carried from a
// known state at x, in the same direction as the solution was built.
type wavePiece struct {
	a, b float64 // the stretch, a < b
	x    float64 // where the state is known (a or b)
	u, w float64 // state at x (scaled by e^lg)
	lg   float64 // log of the factor that turns u into φ
	seg  segInfo
}

// waveRecorder collects the pieces while a solution is carried.
type waveRecorder struct{ pieces []wavePiece }

func (r *waveRecorder) point(xi float64, st rstate, seg segInfo) {
	a, b := min(xi, seg.to), max(xi, seg.to)
	r.pieces = append(r.pieces, wavePiece{a: a, b: b, x: xi, u: st.u.v, w: st.w.v, lg: st.lg, seg: seg})
}

// newStackWave builds the wavefunction of a solved level.
func (c *calc) newStackWave(sl *stackLevel) *StackWave {
	rl := &sl.real
	eta, m := rl.eta, rl.m
	if rl.evalEta != eta {
		// The norm needs the level equation at the level itself.
		rl.res = c.eval(eta, m, rl.S)
		rl.evalEta = eta
	}
	sw := &StackWave{c: *c, eta: eta, n: sl.lv.N}
	// Carry both solutions again, recording every step.
	var left, right waveRecorder
	lam, _, _ := c.leftBC(eta)
	L := rstate{u: dual{1, 0}, w: lam}
	for j := 1; j < m; j++ {
		c.cross(&L, j, 1, eta, &left)
	}
	R := rstate{u: dual{1, 0}, w: c.rightBC(eta)}
	for j := c.n - 2; j >= m; j-- {
		c.cross(&R, j, -1, eta, &right)
	}
	// The right solution in units of the left one: u_R e^lgR = k u_L e^lgL
	// at the matching point, from the larger component.
	S := rl.S
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
	lnN := math.Log(rl.res.Dp*((U/sc)*(U/sc)+(W/sc)*(W/sc))/(S*math.Pi*math.Pi)) + 2*math.Log(sc) + 2*L.lg
	_, x1, v0, mu0 := c.layer(0)
	xn, _, vn, mun := c.layer(c.n - 1)
	sw.x1, sw.xn = x1, xn
	if c.f > 0 {
		// Between the turning point and interface 1, φ² ∝ M² holds
		// ∫₀^(z_I) M² dz = [zM² − M′² − 1/(π²M²)] over s, while the
		// Prüfer norm counted (MM″ − M′²)(z_I)/s = (zM² − M′² +
		// 1/(π²M²))(z_I)/s: the difference is (M′(0)² + 1/(π²M(0)²)
		// − 2/(π²M(z_I)²))/s in units of φ(ξ₁)²/M(z_I)².
		sw.ls0 = newLayerScale(mu0, c.f)
		sw.p1 = sw.ls0.forb(max(v0+c.f*(x1-0.5)-eta, 0))
		sw.lnM1 = sw.ls0.lnM(&sw.p1)
		ai, aip, bi, bip := Airy(0)
		m02 := ai*ai + bi*bi
		mp0 := (ai*aip + bi*bip) / math.Sqrt(m02)
		k0 := mp0*mp0 + 1/(math.Pi*math.Pi*m02) - 2/(math.Pi*math.Pi)*math.Exp(-2*sw.lnM1)
		corr := k0 * math.Exp(-2*sw.lnM1) / sw.ls0.s
		lnN += math.Log1p(corr * math.Exp(-lnN))
		sw.turningLeft = 0.5 - (v0-eta)/c.f
		sw.lsn = newLayerScale(mun, c.f)
		sw.pn = sw.lsn.forb(max(vn+c.f*(xn-0.5)-eta, 0))
	} else {
		sw.k0 = math.Pi * math.Sqrt(mu0*(v0-eta))
		sw.kn = math.Pi * math.Sqrt(mun*(vn-eta))
	}
	half := 0.5 * lnN
	pieces := make([]wavePiece, 0, len(left.pieces)+len(right.pieces))
	for _, p := range left.pieces {
		p.lg -= half
		pieces = append(pieces, p)
	}
	for i := len(right.pieces) - 1; i >= 0; i-- {
		p := right.pieces[i]
		p.lg -= half + lnk
		p.u *= sgn
		p.w *= sgn
		pieces = append(pieces, p)
	}
	sort.SliceStable(pieces, func(i, j int) bool { return pieces[i].a < pieces[j].a })
	sw.pieces = pieces
	sw.phi1 = math.Exp(-half)
	// φ at the last interface, from the right solution there (its start).
	sw.phin = sgn * math.Exp(-half-lnk)
	sw.lo, sw.hi = sw.support()
	return sw
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
	i := sort.Search(len(sw.pieces), func(i int) bool { return sw.pieces[i].b >= xi })
	if i == len(sw.pieces) {
		i = len(sw.pieces) - 1
	}
	return sw.pieceAt(&sw.pieces[i], xi)
}

func (sw *StackWave) pieceAt(p *wavePiece, xi float64) float64 {
	h := xi - p.x
	c := &sw.c
	seg := &p.seg
	switch seg.kind {
	case segTaylor:
		q := math.FMA(c.f, p.x-0.5, seg.v-sw.eta)
		u := taylorValue(p.u, p.w, h, seg.mu, math.Pi*math.Pi*seg.mu*q, math.Pi*math.Pi*seg.mu*c.f)
		return u * math.Exp(p.lg)
	case segZero:
		u, lg := zeroValue(p.u, p.w, h, seg.v, seg.mu, sw.eta)
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

// leftTail returns φ in the downhill outer layer.
func (sw *StackWave) leftTail(xi float64) float64 {
	c := &sw.c
	if c.f == 0 {
		return sw.phi1 * math.Exp(sw.k0*(xi-sw.x1))
	}
	_, _, v0, _ := c.layer(0)
	q := v0 + c.f*(xi-0.5) - sw.eta
	var lnm float64
	if q >= 0 {
		p := sw.ls0.forb(q)
		lnm = sw.ls0.lnM(&p)
	} else {
		z := sw.ls0.c * q
		if z < -1e200 {
			return 0
		}
		m, _ := ModulusPhase(z)
		lnm = math.Log(m)
	}
	return sw.phi1 * math.Exp(lnm-sw.lnM1)
}

// rightTail returns φ in the uphill outer layer.
func (sw *StackWave) rightTail(xi float64) float64 {
	c := &sw.c
	if c.f == 0 {
		return sw.phin * math.Exp(-sw.kn*(xi-sw.xn))
	}
	_, _, vn, _ := c.layer(c.n - 1)
	p := sw.lsn.forb(vn + c.f*(xi-0.5) - sw.eta)
	_, gAi := sw.lsn.growth(&sw.pn, &p, xi-sw.xn)
	return sw.phin * math.Exp(-gAi.v)
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
	// Downhill: φ² ∝ M² with M increasing, so ∫ from the turning point to
	// ξ is at most (ξ − ξ_t) φ(ξ)²; bisect for where that is tiny.
	a, b := sw.turningLeft, sw.x1
	w := func(x float64) float64 { v := sw.leftTail(x); return (x - sw.turningLeft) * v * v }
	if w(b) <= tiny {
		return b, hi
	}
	for range 80 {
		md := a + (b-a)/2
		if md == a || md == b {
			break
		}
		if w(md) > tiny {
			b = md
		} else {
			a = md
		}
	}
	return a, hi
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
	for k := 0; k+2 < maxTaylor; k++ {
		e2 := (A*ek + B*em1) / float64((k+2)*(k+1))
		U += e2
		if k >= 2 && math.Abs(e2)+math.Abs(ek1) <= 0x1p-60*size {
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
	w := c.newStackWave(&sl)
	if f < 0 {
		return tiltwell.Mirror(w, n), nil
	}
	return w, nil
}

// stackDipole returns ⟨ξ − ½⟩ of level n at f by Gauss–Legendre
// quadrature of (ξ − ½)φ² over the support, piece by piece.
func (s Solver) stackDipole(f float64, n int) (float64, error) {
	sl, c, err := s.solveOneCalc(f, n)
	if err != nil {
		return 0, err
	}
	w := c.newStackWave(&sl)
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
