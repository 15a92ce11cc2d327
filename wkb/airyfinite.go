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

// airyAiLog returns Ai′(z)/Ai(z) for z ≥ 0, where Ai > 0: from the table,
// Ai′/Ai = M′/M + θ′ cot θ, on [0, airyHi], and from DLMF 9.7.5–9.7.6
// beyond. Its z-derivative is z − (Ai′/Ai)² (the Riccati form of
// Ai″ = z Ai).
func airyAiLog(z float64) float64 {
	if z <= airyHi {
		th, m2, dm2 := airyTabD(z)
		return (dm2/2 - 1/(math.Pi*math.Tan(th))) / m2
	}
	// −√z V₋/U₋ with U₋ = Σ (−1)^k u_k ζ^(−k), V₋ likewise (DLMF 9.7.5,
	// 9.7.6): ζ ≥ 27.7 here, so a dozen terms reach rounding.
	c := airyCoefs()
	s := math.Sqrt(z)
	r := -1.5 / (z * s)
	u, v, p := 1.0, 1.0, 1.0
	for k := 1; k < airyTerms; k++ {
		p *= r
		tu, tv := c.u[k]*p, c.v[k]*p
		u += tu
		v += tv
		if math.Abs(tu)+math.Abs(tv) < 1e-18 {
			break
		}
	}
	return -s * v / u
}

// airyWall returns, at any real x, the connection phase χ(x) = θ(x) − ζ̄(x)
// of [airyChi] and its derivative, with y = 1/(πM²) and l = M′/M of
// [airyModLog], from one evaluation.
func airyWall(x float64) (chi, dchi, y, l float64) {
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
		// |Q/P| ≈ u₁/ζ < 1.7e-3 for ζ ≥ 42.7: four terms of the
		// arctangent series reach 1e-26 (as in airyNeg).
		v := q / p
		v2 := v * v
		beta := v * (1 - v2*(1.0/3-v2*(1.0/5-v2/7)))
		return math.Pi/4 - beta, st * (pm*(p+1) + q*q) / pq, st / pq, st * (q*r - p*s) / pq
	case x <= airyHi:
		th, m2, dm2 := airyTabD(x)
		y = 1 / (math.Pi * m2)
		l = dm2 / (2 * m2)
		if x < 0 {
			s := math.Sqrt(-x)
			return th - 2.0/3*(-x)*s, s - y, y, l
		}
		return th, -y, y, l
	}
	chi, dchi = airyChi(x)
	y, l = airyModLog(x)
	return chi, dchi, y, l
}
