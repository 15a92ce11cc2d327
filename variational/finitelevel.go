package variational

import "math"

// side is one barrier's boundary term σ(η) and its first two
// η-derivatives, with the barrier's weight per ψ(interface)².
type side struct {
	sig, d1, d2 float64
	norm        float64
}

// recip returns P = 1/σ and its first two derivatives.
func (b side) recip() (p, p1, p2 float64) {
	p = 1 / b.sig
	p1 = -b.d1 * p * p
	p2 = -b.d2*p*p + 2*b.d1*b.d1*p*p*p
	return p, p1, p2
}

// edges holds both barriers' terms at one energy and, at f > 0, the
// escape term of the downhill one: the outgoing boundary condition
// replaces its u = M′/M by u + iu_i, u_i = −1/(πM²), which is ε = u_i/u
// relative, with lnEps1 = d ln(−ε)/dη.
type edges struct {
	L, R   side
	eps    float64
	lnEps1 float64
	left   airyPos // f > 0: the downhill barrier's Airy data at its interface
	right  aiPos   // f > 0: the uphill barrier's
}

// edgesAt returns the barrier terms at energy eta, which must lie below
// the ceiling.
//
// At f = 0 each barrier holds e^(−κ|ξ − ξ_I|), κ = π√(μ(v − η)):
// σ = κ/(μπ²), σ′ = −1/(2κ), σ″ = −π²μ/(4κ³), and its weight is 1/(2κ)
// per φ(ξ_I)².
//
// At f > 0, with s = (π²μf)^(1/3) and q = s/f = −dz/dη: downhill,
// σ_L = k u, u = M′/M at z₀ = s(v_L − f/2 − η)/f, k = s/(μ_L π²), so
// σ_L′ = −k q u̇ and σ_L″ = k q² ü with u̇ = z − u² + 1/(π²M⁴) and
// ü = 1 − 2u u̇ − 4u/(π²M⁴); uphill, σ_R = −k u_A, u_A = Ai′/Ai at
// z₀ = s(v_R + f/2 − η)/f, with du_A/dz = z − u_A² = −w and
// d²u_A/dz² = 1 + 2u_A w, so σ_R′ = −k q w and σ_R″ = −k q²(1 + 2u_A w).
// The escape ratio ε = u_i/u has d ln(−ε)/dη = 2qu + q u̇/u
// (d ln(Ai² + Bi²)/dz = 2u).
func (p fparams) edgesAt(eta float64) edges {
	var e edges
	if p.f == 0 {
		e.L = expSide(p.vL, p.mL, eta)
		e.R = expSide(p.vR, p.mR, eta)
		return e
	}
	pp := math.Pi * math.Pi
	// Downhill.
	s := math.Cbrt(pp * p.mL * p.f)
	q := s / p.f
	a := airyAt(math.Max(0, s*((p.vL-p.f/2)-eta)/p.f))
	u, ud, mi := a.logDeriv(), a.dlog(), a.mInv4()
	k := s / (p.mL * pp)
	e.L = side{sig: k * u, d1: -k * q * ud, d2: k * q * q * (1 - 2*u*ud - 4*u*mi), norm: a.normRatio() / s}
	e.eps = -math.Exp(a.lnEscape()) / u
	e.lnEps1 = 2*q*u + q*ud/u
	e.left = a
	// Uphill.
	s = math.Cbrt(pp * p.mR * p.f)
	q = s / p.f
	ar := aiAt(math.Max(0, s*((p.vR+p.f/2)-eta)/p.f))
	k = s / (p.mR * pp)
	e.R = side{sig: -k * ar.u, d1: -k * q * ar.w, d2: -k * q * q * (1 + 2*ar.u*ar.w), norm: ar.w / s}
	e.right = ar
	return e
}

// expSide is the boundary term of a barrier v, μ at zero field.
func expSide(v, mu, eta float64) side {
	kp := math.Pi * math.Sqrt(mu*(v-eta))
	return side{sig: kp / (mu * math.Pi * math.Pi), d1: -1 / (2 * kp), d2: -math.Pi * math.Pi * mu / (4 * kp * kp * kp), norm: 1 / (2 * kp)}
}

// tval is T(η) with its first two derivatives and the count of Ritz
// values θ_j below η.
type tval struct {
	t00, t01, t11    float64
	d00, d01, d11    float64
	dd00, dd01, dd11 float64
	below            int
}

// tAt evaluates T at eta with the barrier terms e.
func (sp *fspace) tAt(eta float64, e edges) tval {
	var t tval
	pl, pl1, pl2 := e.L.recip()
	pr, pr1, pr2 := e.R.recip()
	t.t00, t.d00, t.dd00 = pl, pl1, pl2
	t.t11, t.d11, t.dd11 = pr, pr1, pr2
	for j := range sp.p.dim() {
		th := sp.vals[j]
		if th < eta {
			t.below++
		}
		r := 1 / (th - eta)
		a, b := sp.w0[j]*r, sp.w1[j]*r
		t.t00 += sp.w0[j] * a
		t.t01 += sp.w0[j] * b
		t.t11 += sp.w1[j] * b
		t.d00 += a * a
		t.d01 += a * b
		t.d11 += b * b
		t.dd00 += 2 * a * a * r
		t.dd01 += 2 * a * b * r
		t.dd11 += 2 * b * b * r
	}
	return t
}

// det returns det T and its first two derivatives.
func (t tval) det() (d, d1, d2 float64) {
	d = t.t00*t.t11 - t.t01*t.t01
	d1 = t.d00*t.t11 + t.t00*t.d11 - 2*t.t01*t.d01
	d2 = t.dd00*t.t11 + 2*t.d00*t.d11 + t.t00*t.dd11 - 2*t.d01*t.d01 - 2*t.t01*t.dd01
	return d, d1, d2
}

// count returns N(η), the number of levels of the space below η.
func (t tval) count() int {
	d, _, _ := t.det()
	pos := 0
	switch tr := t.t00 + t.t11; {
	case d > 0 && tr > 0:
		pos = 2
	case d < 0:
		pos = 1
	case d == 0 && tr > 0:
		pos = 1
	}
	return t.below + pos - 2
}

// flevel is one level of a finite-well space.
type flevel struct {
	eta   float64
	ok    bool    // false: no level below the ceiling
	coef  float64 // the Ritz function is coef·Σ_j a_j x_j, a_j below
	psi0  float64 // ψ(0) and ψ(1) of the normalized level
	psi1  float64
	c0    float64 // the null vector of T
	c1    float64
	nIn   float64 // ∫₀¹ ψ² of the normalized level
	gamma float64 // first-order escape width
	shift float64 // second-order shift η_r − η₀ of the complex level
	e     edges
}

// level solves for level n above lo (the level below, or −∞), below the
// ceiling. It returns ok false if the space has no n-th level there.
func (sp *fspace) level(n int, lo float64) flevel {
	p := sp.p
	hi := p.ceiling()
	// Nothing lies below the bottom of the potential, −f/2.
	a := math.Max(lo, -p.f/2-1)
	b := hi - 8*eps*(math.Abs(hi)+p.f+1)
	if !(a < b) {
		return flevel{}
	}
	tb := sp.tAt(b, p.edgesAt(b))
	if tb.count() < n {
		return flevel{}
	}
	// Bisect on N until [a, b] holds no pole θ_j and N(a) = n−1,
	// N(b) = n: det T is then continuous there with one sign change.
	na, nb := -1, tb.count()
	for range 200 {
		poles := false
		for j := range p.dim() {
			if th := sp.vals[j]; th > a && th < b {
				poles = true
				break
			}
		}
		if !poles && na == n-1 && nb == n {
			break
		}
		m := a + (b-a)/2
		if m <= a || m >= b {
			break
		}
		nm := sp.tAt(m, p.edgesAt(m)).count()
		if nm >= n {
			b, nb = m, nm
		} else {
			a, na = m, nm
		}
	}
	// Newton on det T, safeguarded by the bracket.
	ea := p.edgesAt(a)
	da, _, _ := sp.tAt(a, ea).det()
	t := a + (b-a)/2
	for range 100 {
		e := p.edgesAt(t)
		d, d1, _ := sp.tAt(t, e).det()
		if (d > 0) == (da > 0) {
			a = t
		} else {
			b = t
		}
		next := t - d/d1
		if !(next > a && next < b) {
			next = a + (b-a)/2
		}
		done := math.Abs(next-t) <= 2*eps*(math.Abs(t)+1)
		t = next
		if done || b-a <= 2*eps*(math.Abs(t)+1) {
			break
		}
	}
	return sp.finish(t)
}

// finish returns the level at its root eta: the null vector of T, the
// normalization, the first-order escape width and the second-order
// shift.
func (sp *fspace) finish(eta float64) flevel {
	e := sp.p.edgesAt(eta)
	tv := sp.tAt(eta, e)
	lv := flevel{eta: eta, ok: true, e: e}
	// The null vector c of T, orthogonal to its larger row.
	if math.Hypot(tv.t00, tv.t01) >= math.Hypot(tv.t01, tv.t11) {
		lv.c0, lv.c1 = tv.t01, -tv.t00
	} else {
		lv.c0, lv.c1 = tv.t11, -tv.t01
	}
	// ψ = Σ_j a_j x_j with a_j = −(w_0j c_0 + w_1j c_1)/(θ_j − η), and
	// (ψ(0), ψ(1)) = (c_0/σ_L, c_1/σ_R).
	nIn := 0.0
	for j := range sp.p.dim() {
		aj := (sp.w0[j]*lv.c0 + sp.w1[j]*lv.c1) / (sp.vals[j] - eta)
		nIn += aj * aj
	}
	y0, y1 := lv.c0/e.L.sig, lv.c1/e.R.sig
	tot := nIn + y0*y0*e.L.norm + y1*y1*e.R.norm
	sc := 1 / math.Sqrt(tot)
	if y0 < 0 {
		sc = -sc // φ > 0 at the first interface
	}
	lv.coef = -sc
	lv.psi0, lv.psi1 = y0*sc, y1*sc
	lv.nIn = nIn / tot
	if sp.p.f > 0 && e.eps != 0 {
		_, d1, d2 := tv.det()
		pl, pl1, _ := e.L.recip()
		q := pl * tv.t11
		q1 := pl1*tv.t11 + pl*tv.d11
		lv.gamma = -2 * e.eps * q / d1
		e2 := e.eps * e.eps
		lv.shift = e2 * (q/d1 - q*(e.lnEps1*q+q1)/(d1*d1) + q*q*d2/(2*d1*d1*d1))
	}
	return lv
}
