package exact

import "math"

// Airy functions in the classically forbidden part of a layer, written in
// the physical variables of the layer so that nothing overflows however
// weak the field or high the barrier.
//
// In a layer with mass ratio μ and band edge v at field f > 0 the local
// deficit q(ξ) = v + f(ξ − ½) − η (in E₁) gives the Airy argument
// z = c q with c = s/f, s = (π² μ f)^(1/3), and, for z ≥ posStart,
//
//	ζ = (2/3) z^(3/2) = (2/3) π √μ q^(3/2) / f,   κ = s √z = π √(μ q),
//
// so that the asymptotic forms DLMF 9.7.5–9.7.8 read, with t = 1/ζ,
//
//	(s/μ) Ai′/Ai = −(κ/μ) R(−t),   (s/μ) Bi′/Bi = (κ/μ) R(t),
//	ln Bi = ζ − ¼ ln z − ½ ln π + ℓ(t),   ln Ai = −ζ − ¼ ln z − ln(2√π) + ℓ(−t),
//
// where R = V/U and ℓ = ln U are power series in t derived from the series
// U(t) = Σ u_k t^k and V(t) = Σ v_k t^k of DLMF 9.7.2 (R = 1 − t/6 + …).
// At f → 0 these are the exponentials e^(±κξ) of the zero-field layer.

// Coefficients of R(t) = V(t)/U(t) and ℓ(t) = ln U(t) (ℓ₀ = 0).
var ratioR, logU = ratioCoefficients()

func ratioCoefficients() (r, l [nPos]float64) {
	// R = V/U: r_k = v_k − Σ_(j=1..k) u_j r_(k−j).
	for k := range nPos {
		s := posV[k]
		for j := 1; j <= k; j++ {
			s -= posU[j] * r[k-j]
		}
		r[k] = s
	}
	// ℓ = ln U: ℓ′ = U′/U gives k ℓ_k = k u_k − Σ_(j=1..k−1) j ℓ_j u_(k−j).
	for k := 1; k < nPos; k++ {
		s := float64(k) * posU[k]
		for j := 1; j < k; j++ {
			s -= float64(j) * l[j] * posU[k-j]
		}
		l[k] = s / float64(k)
	}
	return r, l
}

// seriesEval returns Σ_(k≥0) c_k (σt)^k and its derivative with respect to
// t, for σ = ±1.
func seriesEval(c *[nPos]float64, t, sigma float64) (val, der float64) {
	x := sigma * t
	for k := nPos - 1; k >= 1; k-- {
		der = der*x + float64(k)*c[k]
		val = val*x + c[k]
	}
	return val*x + c[0], der * sigma
}

// dual is a value and its derivative with respect to the level η.
type dual struct{ v, d float64 }

// fpoint holds the Airy data of one point of a layer where z ≥ 0.
type fpoint struct {
	asym bool    // z ≥ posStart: series in t; else node table
	q    float64 // deficit v + f(ξ − ½) − η ≥ 0
	kap  float64 // π √(μ q) (asym)
	t    float64 // 1/ζ (asym; 0 once ζ overflows)
	// z, its ζ, and the scaled functions e^ζ Ai, e^ζ Ai′, e^(−ζ) Bi,
	// e^(−ζ) Bi′ (table range only).
	z, zeta, ai, aip, bi, bip float64
	// ld and lg are the physical log-derivatives w/u = (s/μ)y′/y of Ai and
	// Bi, with their η-derivatives.
	ld, lg dual
}

// layerScale holds s = (π² μ f)^(1/3) and c = s/f of a layer at f > 0.
type layerScale struct{ mu, f, s, c float64 }

func newLayerScale(mu, f float64) layerScale {
	return scaleFrom(mu, f, math.Cbrt(math.Pi*math.Pi*mu), math.Cbrt(f))
}

// scaleFrom is newLayerScale from a = (π²μ)^(1/3) and cf = f^(1/3), so
// that the layers of a stack share their cube roots.
func scaleFrom(mu, f, a, cf float64) layerScale {
	return layerScale{mu: mu, f: f, s: a * cf, c: a / (cf * cf)}
}

// forbOne is forb for a boundary condition that needs only one of the
// two log-derivatives: Bi's (and, in the table range, the scaled functions
// the modulus needs) if bi, else Ai's.
func (ls *layerScale) forbOne(q float64, bi bool) fpoint {
	p := fpoint{q: q}
	z := ls.c * q
	if z < posStart {
		return ls.forb(q)
	}
	p.asym = true
	sq := math.Sqrt(q)
	rm := math.Sqrt(ls.mu)
	p.kap = math.Pi * rm * sq
	p.t = 1.5 * ls.f / (math.Pi * rm * sq) / q
	sigma := -1.0
	if bi {
		sigma = 1
	}
	r, _ := seriesEval(&ratioR, p.t, sigma)
	d := 1.5 * math.Pi / (rm * sq) * tailSeries(p.t, sigma) * (r + 1)
	km := p.kap / ls.mu
	if bi {
		p.lg = dual{km * r, d}
	} else {
		p.ld = dual{-km * r, d}
	}
	return p
}

// forb returns the Airy data at the point of the layer where the deficit is
// q ≥ 0.
func (ls *layerScale) forb(q float64) fpoint {
	p := fpoint{q: q}
	z := ls.c * q
	if !(z < posStart) {
		p.asym = true
		sq := math.Sqrt(q)
		p.kap = math.Pi * math.Sqrt(ls.mu) * sq
		// t = 3f/(2π√μ q^(3/2)), formed so that it underflows to 0
		// rather than overflowing.
		p.t = 1.5 * ls.f / (math.Pi * math.Sqrt(ls.mu) * sq) / q
		rg, _ := seriesEval(&ratioR, p.t, 1)
		rd, _ := seriesEval(&ratioR, p.t, -1)
		km := p.kap / ls.mu
		p.lg.v = km * rg
		p.ld.v = -km * rd
		// d/dη (s/μ)L = −(π² q/f)(1 − R²) with (π² q/f) t = 3π/(2√(μq)):
		// no division by f, and 1 − R² = −(R − 1)(R + 1) without
		// cancellation.
		pre := 1.5 * math.Pi / (math.Sqrt(ls.mu) * sq)
		gm1 := tailSeries(p.t, 1)
		dm1 := tailSeries(p.t, -1)
		p.lg.d = pre * gm1 * (rg + 1)
		p.ld.d = pre * dm1 * (rd + 1)
		return p
	}
	p.z = z
	p.zeta = (2.0 / 3) * z * math.Sqrt(z)
	p.ai, p.aip, p.bi, p.bip = AiryScaled(z)
	Ld, Lg := p.aip/p.ai, p.bip/p.bi
	sm := ls.s / ls.mu
	scm := sm * ls.c
	p.ld = dual{sm * Ld, -scm * (z - Ld*Ld)}
	p.lg = dual{sm * Lg, -scm * (z - Lg*Lg)}
	return p
}

// tailSeries returns (R(σt) − 1)/t = Σ_(k≥1) r_k σ^k t^(k−1).
func tailSeries(t, sigma float64) float64 {
	x := sigma * t
	s := 0.0
	for k := nPos - 1; k >= 1; k-- {
		s = s*x + ratioR[k]
	}
	return s * sigma
}

// lnBi returns ln Bi(z) − ζ at a forbidden point (the part of ln Bi left
// when the large exponent is taken out), and lnAi returns ln Ai(z) + ζ.
// In the asymptotic range ln z is formed as ln c + ln q.
func (ls *layerScale) lnBiRest(p *fpoint) float64 {
	if p.asym {
		l, _ := seriesEval(&logU, p.t, 1)
		return -0.25*(math.Log(ls.c)+math.Log(p.q)) - 0.5*math.Log(math.Pi) + l
	}
	return math.Log(p.bi)
}

func (ls *layerScale) lnAiRest(p *fpoint) float64 {
	if p.asym {
		l, _ := seriesEval(&logU, p.t, -1)
		return -0.25*(math.Log(ls.c)+math.Log(p.q)) - math.Log(2*math.Sqrt(math.Pi)) + l
	}
	return math.Log(p.ai)
}

// zetaOf returns ζ at a forbidden point: (2/3) π √μ q^(3/2)/f, which may be
// +Inf for an enormous deficit at a tiny field.
func (ls *layerScale) zetaOf(p *fpoint) float64 {
	if p.asym {
		return (2.0 / 3) * math.Pi * math.Sqrt(ls.mu) * p.q * math.Sqrt(p.q) / ls.f
	}
	return p.zeta
}

// growth returns ln(Bi(z_b)/Bi(z_a)) and ln(Ai(z_a)/Ai(z_b)) for two
// forbidden points a, b of one layer a length L apart (z_b > z_a), with
// their η-derivatives. When both points are in the asymptotic range the
// difference of the large exponents is formed without cancellation,
//
//	ζ_b − ζ_a = (2/3) π √μ L (q_a + √(q_a q_b) + q_b)/(√q_a + √q_b),
//
// which stays accurate at f → 0 (where it is κL).
func (ls *layerScale) growth(a, b *fpoint, L float64) (gBi, gAi dual) {
	if a.asym && b.asym {
		sa, sb := math.Sqrt(a.q), math.Sqrt(b.q)
		rm := math.Pi * math.Sqrt(ls.mu)
		dz := (2.0 / 3) * rm * L * (a.q + sa*sb + b.q) / (sa + sb)
		dzd := -rm * L / (sa + sb)
		fl := b.q - a.q // = f L
		lz := math.Log1p(fl / a.q)
		lzd := fl / (a.q * b.q)
		lpa, dpa := seriesEval(&logU, a.t, 1)
		lpb, dpb := seriesEval(&logU, b.t, 1)
		lma, dma := seriesEval(&logU, a.t, -1)
		lmb, dmb := seriesEval(&logU, b.t, -1)
		// dt/dη = 3t/(2q).
		ta, tb := 1.5*a.t/a.q, 1.5*b.t/b.q
		gBi = dual{dz - 0.25*lz + (lpb - lpa), dzd - 0.25*lzd + dpb*tb - dpa*ta}
		gAi = dual{dz + 0.25*lz + (lma - lmb), dzd + 0.25*lzd + dma*ta - dmb*tb}
		return gBi, gAi
	}
	za, zb := ls.zetaOf(a), ls.zetaOf(b)
	dz := zb - za
	ba, bb := ls.lnBiRest(a), ls.lnBiRest(b)
	aa, ab := ls.lnAiRest(a), ls.lnAiRest(b)
	// d ln y/dη = −c y′/y = −(μ/f) × (physical log-derivative).
	k := ls.mu / ls.f
	gBi = dual{dz + (bb - ba), -k * (b.lg.v - a.lg.v)}
	gAi = dual{dz + (aa - ab), k * (b.ld.v - a.ld.v)}
	return gBi, gAi
}

// modulusBC returns the physical log-derivative (s/μ) M′/M of the Airy
// modulus M = √(Ai² + Bi²) at a forbidden point, with its η-derivative, and
// the outgoing flux factor P = (s/μ)/(π M²) split as P = pre·e^(−2ζ)
// (the logarithm is left to the caller that needs it). M′/M is the real part and −P the imaginary part of
// the log-derivative of the outgoing wave Ai − iBi ∝ M e^(iθ) (DLMF 9.8.3,
// 9.8.14: θ′ = −1/(π M²)).
func (ls *layerScale) modulusBC(p *fpoint) (lam dual, pre, zeta float64) {
	zeta = ls.zetaOf(p)
	if p.asym {
		// M′/M = Bi′/Bi up to (Ai/Bi)² < e^(−4ζ) < 1e-100.
		u, _ := seriesEval(&posU, p.t, 1)
		// π M² ≈ π Bi² = e^(2ζ) U²/√z and (s/μ)√z = κ/μ.
		return p.lg, p.kap / ls.mu / (u * u), zeta
	}
	// r = Ai/Bi = (scaled ratio) e^(−2ζ).
	r := p.ai / p.bi * math.Exp(-2*p.zeta)
	r2 := r * r
	lv := (p.lg.v + r2*p.ld.v) / (1 + r2)
	L := lv * ls.mu / ls.s // M′/M in z units
	// M″/M = 1/(π² M⁴) + z (from (M²)″ = 2(Ai′² + Bi′²) + 2zM² and
	// Ai′² + Bi′² = M′² + 1/(π² M²)).
	m2 := p.bi * p.bi * (1 + r2) // e^(−2ζ) M²
	inv := math.Exp(-4*p.zeta) / (math.Pi * math.Pi * m2 * m2)
	lam = dual{lv, -(ls.s / ls.mu) * ls.c * (inv + p.z - L*L)}
	return lam, ls.s / (ls.mu * math.Pi * m2), zeta
}

// modulusTable is [layerScale.modulusBC] for 0 ≤ z < posStart, from the
// phase series of the node table (see airy.go): with c(z), d(z) the
// rotated solutions about the nearest node j, c² + d² = M_j² M² and
// cc′ + dd′ = M_j² M M′, so M′/M and M² need two Horner sums and no
// exponential. ζ is returned as 0 (pre is then P itself).
func (ls *layerScale) modulusTable(z float64) (lam dual, pre, zeta float64) {
	s, cs, ds, cp, dp := tableCDD(dd{z, 0})
	q := cs*cs + ds*ds
	m2 := q / s.m2
	mp := (cs*cp + ds*dp) / q
	sm := ls.s / ls.mu
	// d/dη (s/μ)M′/M = −(s/μ)c (M″/M − (M′/M)²), M″/M = 1/(π²M⁴) + z.
	lam = dual{sm * mp, -sm * ls.c * (1/(math.Pi*math.Pi*m2*m2) + z - mp*mp)}
	return lam, sm / (math.Pi * m2), 0
}

// aiTable returns the physical log-derivative (s/μ)Ai′/Ai and its
// η-derivative for 0 ≤ z < posStart, from the Taylor series of Ai about
// the nearest node.
func (ls *layerScale) aiTable(z float64) dual {
	s, d := node(z)
	L := hornerD(&s.ai, d) / horner(&s.ai, d)
	sm := ls.s / ls.mu
	return dual{sm * L, -sm * ls.c * (z - L*L)}
}
