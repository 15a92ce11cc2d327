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
	down   downhill // f > 0: the downhill barrier's data
	up     uphill   // f > 0: the uphill barrier's
}

// edgesAt returns the barrier terms at energy eta, which must lie below
// the ceiling. At f = 0 each barrier holds e^(−κ|ξ − ξ_I|),
// κ = π√(μ(v − η)): σ = κ/(μπ²), σ′ = −1/(2κ), σ″ = −π²μ/(4κ³), and its
// weight is 1/(2κ) per φ(ξ_I)². At f > 0 they are the Airy terms of
// downhillAt and uphillAt.
func (p fparams) edgesAt(eta float64) edges {
	var e edges
	if p.f == 0 {
		e.L = expSide(p.vL, p.mL, eta)
		e.R = expSide(p.vR, p.mR, eta)
		return e
	}
	e.down = downhillAt(math.Max(0, (p.vL-p.f/2)-eta), p.mL, p.f)
	e.up = uphillAt(math.Max(0, (p.vR+p.f/2)-eta), p.mR, p.f)
	e.L, e.R = e.down.side, e.up.side
	e.eps, e.lnEps1 = e.down.eps, e.down.lnEps1
	return e
}

// expSide is the boundary term of a barrier v, μ at zero field.
func expSide(v, mu, eta float64) side {
	kp := math.Pi * math.Sqrt(mu*(v-eta))
	return side{sig: kp / (mu * math.Pi * math.Pi), d1: -1 / (2 * kp), d2: -math.Pi * math.Pi * mu / (4 * kp * kp * kp), norm: 1 / (2 * kp)}
}

// tval is T(η) with one pole deflated: A = T − w_j w_jᵀ/(θ_j − η) for
// the pole j nearest η, with the first two derivatives of A, so that
//
//	det T = det A + c/(θ_j − η),   c = w₀²a₁₁ + w₁²a₀₀ − 2w₀w₁a₀₁,
//
// (the pole's residue w_jw_jᵀ has rank one) and
//
//	g(η) = (θ_j − η) det T = (θ_j − η) det A + c
//
// is smooth at θ_j: near a pole, where the entries of T are huge and
// det T cancels, g keeps its accuracy.
type tval struct {
	eta              float64
	a00, a01, a11    float64
	d00, d01, d11    float64
	dd00, dd01, dd11 float64
	j                int     // the deflated pole
	th, w0, w1       float64 // θ_j, w_0j, w_1j
	below            int     // #{θ_i < η, i ≠ j}
}

// tAt evaluates T at eta with the barrier terms e, deflating the pole
// nearest eta.
func (sp *fspace) tAt(eta float64, e edges) tval {
	dim := sp.p.dim()
	t := tval{eta: eta}
	for i := 1; i < dim; i++ {
		if math.Abs(sp.vals[i]-eta) < math.Abs(sp.vals[t.j]-eta) {
			t.j = i
		}
	}
	t.th, t.w0, t.w1 = sp.vals[t.j], sp.w0[t.j], sp.w1[t.j]
	pl, pl1, pl2 := e.L.recip()
	pr, pr1, pr2 := e.R.recip()
	t.a00, t.d00, t.dd00 = pl, pl1, pl2
	t.a11, t.d11, t.dd11 = pr, pr1, pr2
	for i := range dim {
		if i == t.j {
			continue
		}
		th := sp.vals[i]
		if th < eta {
			t.below++
		}
		r := 1 / (th - eta)
		a, b := sp.w0[i]*r, sp.w1[i]*r
		t.a00 += sp.w0[i] * a
		t.a01 += sp.w0[i] * b
		t.a11 += sp.w1[i] * b
		t.d00 += a * a
		t.d01 += a * b
		t.d11 += b * b
		t.dd00 += 2 * a * a * r
		t.dd01 += 2 * a * b * r
		t.dd11 += 2 * b * b * r
	}
	return t
}

// g returns g(η) = (θ_j − η) det T and its first two derivatives.
func (t tval) g() (g, g1, g2 float64) {
	dA := t.a00*t.a11 - t.a01*t.a01
	dA1 := t.d00*t.a11 + t.a00*t.d11 - 2*t.a01*t.d01
	dA2 := t.dd00*t.a11 + 2*t.d00*t.d11 + t.a00*t.dd11 - 2*t.d01*t.d01 - 2*t.a01*t.dd01
	w00, w11, w01 := t.w0*t.w0, t.w1*t.w1, t.w0*t.w1
	c := w00*t.a11 + w11*t.a00 - 2*w01*t.a01
	c1 := w00*t.d11 + w11*t.d00 - 2*w01*t.d01
	c2 := w00*t.dd11 + w11*t.dd00 - 2*w01*t.dd01
	h := t.th - t.eta
	return h*dA + c, -dA + h*dA1 + c1, -2*dA1 + h*dA2 + c2
}

// count returns N(η), the number of levels of the space below η: by the
// Haynsworth inertia additivity N = #{θ_i < η} + #pos(T) − 2. Near the
// deflated pole, where one eigenvalue of T ≈ |w_j|²/(θ_j − η) dominates
// and the other ≈ g/|w_j|², the two pole terms cancel and
// N = #{θ_i < η, i ≠ j} − 1 + [g > 0], which holds on both sides of θ_j.
func (t tval) count() int {
	g, _, _ := t.g()
	h := t.th - t.eta
	ww := t.w0*t.w0 + t.w1*t.w1
	norm := math.Abs(t.a00) + math.Abs(t.a11) + 2*math.Abs(t.a01)
	if ww > 1e8*norm*math.Abs(h) {
		n := t.below - 1
		if g > 0 {
			n++
		}
		return n
	}
	// det T = g/h; T's trace.
	d := g / h
	tr := t.a00 + t.a11 + ww/h
	pos := 0
	switch {
	case d > 0 && tr > 0:
		pos = 2
	case d < 0:
		pos = 1
	case d == 0 && tr > 0:
		pos = 1
	}
	below := t.below
	if t.th < t.eta {
		below++
	}
	return below + pos - 2
}

// flevel is one level of a finite-well space.
type flevel struct {
	eta   float64
	ok    bool    // false: no level below the ceiling
	psi0  float64 // ψ(0) and ψ(1) of the normalized level
	psi1  float64
	x     [maxFiniteDim]float64 // the normalized level in the Ritz basis: ψ = Σ_i x_i ψ_i
	nIn   float64               // ∫₀¹ ψ² of the normalized level
	gamma float64               // first-order escape width
	shift float64               // second-order shift η_r − η₀ of the complex level
	e     edges
}

// level solves for level n above lo (the level below, or −∞), below the
// ceiling. It returns ok false if the space has no n-th level there.
//
// For every η the update σ_L e₀e₀ᵀ + σ_R e₁e₁ᵀ is positive of rank two,
// so the n-th eigenvalue λ_n(η) of the updated pencil lies in
// [θ_n, θ_{n+2}] (interlacing; θ_{n+2} = +∞ beyond the space), and so
// does the fixed point: N(θ_n⁻) ≤ n − 1 and N(θ_{n+2}⁺) ≥ n.
func (sp *fspace) level(n int, lo float64) flevel {
	p := sp.p
	dim := p.dim()
	hi := p.ceiling()
	hi -= 8 * eps * (math.Abs(hi) + p.f + 1)
	if n > dim {
		return flevel{}
	}
	a := math.Max(lo, sp.vals[n-1])
	b := hi
	nb := -1
	if n+1 < dim && sp.vals[n+1] < hi {
		b, nb = sp.vals[n+1], n
	}
	if !(a < b) {
		return flevel{}
	}
	if nb < 0 {
		nb = sp.tAt(b, p.edgesAt(b)).count()
		if nb < n {
			return flevel{}
		}
	}
	// Bisect on N until the closed [a, b] holds at most one pole θ_j and
	// N(a) = n−1, N(b) = n: with that pole deflated (or, if there is
	// none, the nearest), g is continuous on [a, b] and changes sign once.
	na := n - 1 // a is the level below, or θ_n, below which level n does not lie
	ref := -1
	for range 300 {
		poles, last := 0, -1
		for j := range dim {
			if th := sp.vals[j]; th >= a && th <= b {
				poles++
				last = j
			}
		}
		if poles <= 1 && na == n-1 && nb == n {
			ref = last
			break
		}
		m := a + (b-a)/2
		if m <= a || m >= b {
			ref = last
			break
		}
		nm := sp.tAt(m, p.edgesAt(m)).count()
		if nm >= n {
			b, nb = m, nm
		} else {
			a, na = m, nm
		}
	}
	// Newton on g, safeguarded by the bracket. The sign of g at the ends
	// is not safe (an end may be the level below, a root of g itself), so
	// the side of the root is taken from the count at the first point, and
	// from the sign of g relative to it afterwards (g changes sign once in
	// [a, b]). The iteration stops when the step reaches rounding: below
	// 4ε(|η| + 1), or below 64ε(|η| + 1) and no longer halving.
	t := a + (b-a)/2
	if ref < 0 {
		ref = sp.tAt(t, p.edgesAt(t)).j
	}
	e := p.edgesAt(t)
	aboveSign := sp.tAt(t, e).count() >= n
	g0, _, _ := sp.tAtPole(t, e, ref).g()
	if !aboveSign {
		g0 = -g0
	}
	// g0 now has the sign g takes above the root.
	prevStep := math.Inf(1)
	for range 100 {
		g, g1, _ := sp.tAtPole(t, p.edgesAt(t), ref).g()
		step := math.Abs(g / g1)
		tol := eps * (math.Abs(t) + 1)
		if step <= 4*tol || (step <= 64*tol && step > prevStep/2) {
			if next := t - g/g1; next >= a && next <= b {
				t = next
			}
			break
		}
		prevStep = step
		if (g > 0) == (g0 > 0) {
			b = t
		} else {
			a = t
		}
		next := t - g/g1
		if !(next > a && next < b) {
			next = a + (b-a)/2
		}
		t = next
		if b-a <= 2*tol {
			break
		}
	}
	return sp.finish(t, ref)
}

// tAtPole is tAt with pole j deflated.
func (sp *fspace) tAtPole(eta float64, e edges, j int) tval {
	t := sp.tAt(eta, e)
	if t.j == j {
		return t
	}
	// Move the nearest pole back into A and deflate j instead.
	dim := sp.p.dim()
	_ = dim
	add := func(i int, sign float64) {
		r := 1 / (sp.vals[i] - eta)
		a, b := sp.w0[i]*r, sp.w1[i]*r
		t.a00 += sign * sp.w0[i] * a
		t.a01 += sign * sp.w0[i] * b
		t.a11 += sign * sp.w1[i] * b
		t.d00 += sign * a * a
		t.d01 += sign * a * b
		t.d11 += sign * b * b
		t.dd00 += sign * 2 * a * a * r
		t.dd01 += sign * 2 * a * b * r
		t.dd11 += sign * 2 * b * b * r
		if sp.vals[i] < eta {
			if sign > 0 {
				t.below++
			} else {
				t.below--
			}
		}
	}
	add(t.j, 1)
	add(j, -1)
	t.j = j
	t.th, t.w0, t.w1 = sp.vals[j], sp.w0[j], sp.w1[j]
	return t
}

// finish returns the level at its root eta (with pole j deflated): the
// null vector of T, the normalized Ritz function, the first-order escape
// width and the second-order shift.
//
// The outgoing boundary condition replaces the downhill u = M′/M by
// u + iu_i, so 1/σ_L by P_L/(1 + iε) = P_L(1 − iε − ε² + …), ε = u_i/u,
// and the complex level solves g(η) − (iε + ε²)Q(η) + … = 0 with
// Q = P_L·(θ_j − η)T₁₁. Expanding about the real root η₀ of g, derived
// here,
//
//	η = η₀ + i γ + γ² [g′/Q − (εQ)′/(εQ) + g″/(2g′)],   γ = εQ/g′ = −Γ₁/2,
//
// with (εQ)′/(εQ) = d ln(−ε)/dη + Q′/Q. The imaginary part is the
// first-order escape width Γ₁; the real part the shift η_r − η₀, which the
// tests hold against the exact resonance (its relative remainder is
// below x(1 + 3ε²), x = |shift|/(Γ₁/2), on the test grid).
func (sp *fspace) finish(eta float64, j int) flevel {
	dim := sp.p.dim()
	e := sp.p.edgesAt(eta)
	tv := sp.tAtPole(eta, e, j)
	lv := flevel{eta: eta, ok: true, e: e}
	// The null vector c of T, that is of hT = hA + w wᵀ (h = θ_j − η,
	// finite at the pole), orthogonal to its larger row.
	h := tv.th - eta
	m00 := h*tv.a00 + tv.w0*tv.w0
	m01 := h*tv.a01 + tv.w0*tv.w1
	m11 := h*tv.a11 + tv.w1*tv.w1
	var c0, c1 float64
	if math.Hypot(m00, m01) >= math.Hypot(m01, m11) {
		c0, c1 = m01, -m00
	} else {
		c0, c1 = m11, -m01
	}
	// ψ = Σ_i x_i ψ_i with x_i = −(w_0i c_0 + w_1i c_1)/(θ_i − η), and
	// (ψ(0), ψ(1)) = (c_0/σ_L, c_1/σ_R). For the deflated pole,
	// (hA + wwᵀ)c = 0 gives wᵀc/h = −wᵀAc/(wᵀw).
	nIn := 0.0
	for i := range dim {
		var xi float64
		if i == tv.j {
			ac0 := tv.a00*c0 + tv.a01*c1
			ac1 := tv.a01*c0 + tv.a11*c1
			xi = (tv.w0*ac0 + tv.w1*ac1) / (tv.w0*tv.w0 + tv.w1*tv.w1)
		} else {
			xi = -(sp.w0[i]*c0 + sp.w1[i]*c1) / (sp.vals[i] - eta)
		}
		lv.x[i] = xi
		nIn += xi * xi
	}
	y0, y1 := c0/e.L.sig, c1/e.R.sig
	tot := nIn + y0*y0*e.L.norm + y1*y1*e.R.norm
	sc := 1 / math.Sqrt(tot)
	if y0 < 0 {
		sc = -sc // φ > 0 at the first interface
	}
	for i := range dim {
		lv.x[i] *= sc
	}
	lv.psi0, lv.psi1 = y0*sc, y1*sc
	lv.nIn = nIn / tot
	if sp.p.f > 0 && e.eps != 0 {
		// The complex level solves g − (iε + ε²)Q = 0 with
		// Q = P_L·(θ_j − η)T₁₁ = P_L(h a₁₁ + w₁²) (see shift2).
		_, g1, g2 := tv.g()
		pl, pl1, _ := e.L.recip()
		r := h*tv.a11 + tv.w1*tv.w1
		q := pl * r
		q1 := pl1*r + pl*(-tv.a11+h*tv.d11)
		lv.gamma = -2 * e.eps * q / g1
		e2 := e.eps * e.eps
		lv.shift = e2 * (q/g1 - q*(e.lnEps1*q+q1)/(g1*g1) + q*q*g2/(2*g1*g1*g1))
	}
	return lv
}
