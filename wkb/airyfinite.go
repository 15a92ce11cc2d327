package wkb

import "math"

// This file adds to the Airy evaluation of airy.go what finite barriers
// need: the log-derivative of the modulus, M′/M, with 1/(πM²) = −θ′, for
// the (Ai, Bi) pair at any real x, and Ai′/Ai on x ≥ 0. At the uphill
// interface they are used to all digits; the downhill interface uses the
// truncated phase-integral series of finite.go instead.

// airyPQRS returns P, Q of DLMF 9.7.9 and R, S of DLMF 9.7.10 for ζ > 0:
//
//	R = Σ (−1)^k v_(2k) ζ^(−2k),  S = Σ (−1)^k v_(2k+1) ζ^(−2k−1),
//
// with Ai′(−t) = t^(1/4)(R sin ω − S cos ω)/√π and
// Bi′(−t) = t^(1/4)(R cos ω + S sin ω)/√π, ω = ζ − π/4. Then
// Ai Ai′ + Bi Bi′ = (QR − PS)/π and PR + QS = 1 (the Wronskian, DLMF
// 9.2.7), so at x = −t
//
//	M² = (P² + Q²)/(π√t),  M′/M = √t (QR − PS)/(P² + Q²),
//	θ′ = −1/(πM²) = −√t/(P² + Q²).
func airyPQRS(z float64) (p, q, r, s float64) {
	c := airyCoefs()
	w := 1 / z
	w2 := -w * w
	p, q, r, s = 1, c.u[1]*w, 1, c.v[1]*w
	tp, tq := 1.0, w
	prev := math.Inf(1)
	for k := 1; 2*k+1 < airyTerms; k++ {
		tp *= w2
		tq *= w2
		a, b := c.u[2*k]*tp, c.u[2*k+1]*tq
		ra, sb := c.v[2*k]*tp, c.v[2*k+1]*tq
		m := math.Abs(a) + math.Abs(b) + math.Abs(ra) + math.Abs(sb)
		if m >= prev {
			break
		}
		p += a
		q += b
		r += ra
		s += sb
		if m < 1e-18 {
			break
		}
		prev = m
	}
	return p, q, r, s
}

// airyTabD returns θ(x), M²(x) and dM²/dx for x in [airyLo, airyHi] from
// the node table.
func airyTabD(x float64) (theta, m2, dm2 float64) {
	tab := airyTable()
	i := int((x-airyLo)*(1/airyStep) + 0.5)
	nd := &tab[max(0, min(airyN-1, i))]
	t := x - nd.x
	theta, m2 = nd.thc[airyOrder-1], nd.m2c[airyOrder-1]
	dm2 = float64(airyOrder-1) * nd.m2c[airyOrder-1]
	for k := airyOrder - 2; k >= 0; k-- {
		theta = theta*t + nd.thc[k]
		m2 = m2*t + nd.m2c[k]
		if k >= 1 {
			dm2 = dm2*t + float64(k)*nd.m2c[k]
		}
	}
	return theta, m2, dm2
}

// airyModLog returns y = 1/(πM²) = −θ′ and l = M′/M for the pair (Ai, Bi)
// at any real x (DLMF 9.8.3, 9.8.14): from the table on [airyLo, airyHi],
// from [airyPQRS] below it, and from DLMF 9.7.7–9.7.8 above it, where
// M ≈ Bi up to a relative e^(−4ζ)/4 < 1e-48. There y = e^(−2ζ)/(π(Bi
// e^(−ζ))²) underflows to 0 past ζ ≈ 370, far below any phase that
// matters.
func airyModLog(x float64) (y, l float64) {
	switch {
	case x < airyLo:
		t := -x
		st := math.Sqrt(t)
		p, q, r, s := airyPQRS(2.0 / 3 * t * st)
		pq := p*p + q*q
		return st / pq, st * (q*r - p*s) / pq
	case x <= airyHi:
		_, m2, dm2 := airyTabD(x)
		return 1 / (math.Pi * m2), dm2 / (2 * m2)
	}
	c := airyCoefs()
	sx := math.Sqrt(x)
	z := 2.0 / 3 * x * sx
	su, sv := asymSum(&c.u, 1/z), asymSum(&c.v, 1/z)
	// Bi e^(−ζ) = U₊/(√π x^(1/4)), Bi′/Bi = √x V₊/U₊ (DLMF 9.7.7, 9.7.8).
	bs2 := su * su / (math.Pi * sx)
	return math.Exp(-2*z) / (math.Pi * bs2), sx * sv / su
}

// airyAiLog returns λ = Ai′(z)/Ai(z) for z ≥ 0, where Ai > 0, and its
// derivative z − λ² (the Riccati form of Ai″ = z Ai): from the table,
// λ = M′/M + θ′ cot θ, on [0, airyHi], and from DLMF 9.7.5–9.7.6 beyond,
// λ = −√z V₋/U₋ with U₋ = Σ (−1)^k u_k ζ^(−k) and V₋ likewise, where
// z − λ² = z (U₋ − V₋)(U₋ + V₋)/U₋² does not cancel.
func airyAiLog(z float64) (lam, dlam float64) {
	if z <= airyHi {
		th, m2, dm2 := airyTabD(z)
		lam = (dm2/2 - 1/(math.Pi*math.Tan(th))) / m2
		return lam, z - lam*lam
	}
	// ζ ≥ 27.7 here, so a dozen terms reach rounding.
	c := airyCoefs()
	s := math.Sqrt(z)
	r := -1.5 / (z * s)
	u, v, d, p := 1.0, 1.0, 0.0, 1.0
	for k := 1; k < airyTerms; k++ {
		p *= r
		tu, tv := c.u[k]*p, c.v[k]*p
		u += tu
		v += tv
		d += tu - tv
		if math.Abs(tu)+math.Abs(tv) < 1e-18 {
			break
		}
	}
	return -s * v / u, z * d * (u + v) / (u * u)
}

// airyWall returns, at any real x, the connection phase χ(x) = θ(x) − ζ̄(x)
// of [airyChi] and its derivative, with y = 1/(πM²) and l = M′/M of
// [airyModLog] and dl = dl/dx = x + y² − l² (from M″ = xM + 1/(π²M³),
// DLMF 9.8.14 with 9.2.1), from one evaluation. dl is formed without the
// cancellation of its terms where x is large: far on the allowed side
// x + y² = t (1 − (P² + Q²)²)/(P² + Q²)² with t = −x, and on the
// forbidden side x − l² = x (U − V)(U + V)/U² with l = √x V/U (DLMF
// 9.7.7–9.7.8).
func airyWall(x float64) (chi, dchi, y, l, dl float64) {
	switch {
	case x < airyLo:
		t := -x
		st := math.Sqrt(t)
		z := 2.0 / 3 * t * st
		p, q, r, s := airyPQRS(z)
		pq := p*p + q*q
		// θ = π/4 + ζ − atan(Q/P) (DLMF 9.7.9, 9.8.4); dχ/dx =
		// θ′ + √t = √t (P² + Q² − 1)/(P² + Q²), with P² + Q² − 1 formed
		// from P − 1 so that it does not cancel.
		pm := p - 1
		pq1 := pm*(p+1) + q*q // P² + Q² − 1
		// |Q/P| ≈ u₁/ζ < 1.7e-3 for ζ ≥ 42.7: four terms of the
		// arctangent series reach 1e-26 (as in airyNeg).
		v := q / p
		v2 := v * v
		beta := v * (1 - v2*(1.0/3-v2*(1.0/5-v2/7)))
		y = st / pq
		l = st * (q*r - p*s) / pq
		return math.Pi/4 - beta, st * pq1 / pq, y, l, -t*pq1*(pq+1)/(pq*pq) - l*l
	case x <= airyHi:
		th, m2, dm2 := airyTabD(x)
		y = 1 / (math.Pi * m2)
		l = dm2 / (2 * m2)
		dl = x + y*y - l*l
		if x < 0 {
			s := math.Sqrt(-x)
			return th - 2.0/3*(-x)*s, s - y, y, l, dl
		}
		return th, -y, y, l, dl
	}
	chi, dchi = airyChi(x)
	y, l = airyModLog(x)
	c := airyCoefs()
	zeta := 2.0 / 3 * x * math.Sqrt(x)
	u, v := asymSum(&c.u, 1/zeta), asymSum(&c.v, 1/zeta)
	d, p := 0.0, 1.0 // U − V = Σ (u_k − v_k) ζ^(−k), all terms positive
	for k := 1; k < airyTerms; k++ {
		p /= zeta
		t := (c.u[k] - c.v[k]) * p
		d += t
		if t < 1e-18*d {
			break
		}
	}
	return chi, dchi, y, l, x*d*(u+v)/(u*u) + y*y
}
