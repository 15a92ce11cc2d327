package exact

import "math"

// The node table airyNodes (airytable.go, written by internal/cmd/airygen
// from 256-bit values) gives Ai, Ai′, Bi, Bi′ and the continuous phase Θ at
// z_j = airyZMin + j·airyStep. Between nodes the functions are summed from
// their Taylor series about the nearest node, |δ| ≤ airyStep/2. Because Ai
// and Bi solve y″ = zy, the Taylor coefficients c_k of any solution about z_j
// obey (DLMF 9.2.1)
//
//	(k+2)(k+1) c_(k+2) = z_j c_k + c_(k−1),
//
// so each node needs only its four values. The phase is taken from two
// particular solutions, the rotations of (Bi, Ai) by the node's own vector:
//
//	c(z) = Bi_j Ai(z) − Ai_j Bi(z)    c(z_j) = 0,    c′(z_j) = −1/π
//	d(z) = Bi_j Bi(z) + Ai_j Ai(z)    d(z_j) = M_j², d′(z_j) = Bi_j Bi′_j + Ai_j Ai′_j
//
// using the Wronskian W{Ai, Bi} = 1/π (DLMF 9.2.7). Then
//
//	Θ(z) = Θ_j + atan2(c(z), d(z)),   M²(z) = (c² + d²)/M_j²,
//
// with no cancellation: the angle is small and both series start at their
// leading term exactly.

// nTaylor terms of each Taylor series. At the table's ends |z| ≤ 20 and
// |δ| ≤ 1/8, the k-th coefficient is below (√20/8)^k/k! relative, and
// 0.56^18/18! ≈ 2e-21.
const nTaylor = 18

type nodeSeries struct {
	nt           int // terms of c and d needed at |δ| ≤ airyStep/2
	z, theta, m2 float64
	thetaLo      float64          // Θ_j − theta, to 106 bits in all
	c, d         [nTaylor]float64 // phase series (see above)
	ai, bi       [nTaylor]float64 // Taylor series of Ai and Bi
}

var series = buildSeries()

func taylor(z, y0, y1 float64) (c [nTaylor]float64) {
	c[0], c[1] = y0, y1
	prev := 0.0 // c_(k−1)
	for k := 0; k+2 < nTaylor; k++ {
		c[k+2] = (z*c[k] + prev) / float64((k+2)*(k+1))
		prev = c[k]
	}
	return c
}

func buildSeries() []nodeSeries {
	s := make([]nodeSeries, len(airyNodes))
	for j, nd := range airyNodes {
		m2 := nd.ai*nd.ai + nd.bi*nd.bi
		s[j] = nodeSeries{
			z: nd.z, theta: nd.theta, thetaLo: airyThetaLo[j], m2: m2,
			c:  taylor(nd.z, 0, -1/math.Pi),
			d:  taylor(nd.z, m2, nd.bi*nd.bip+nd.ai*nd.aip),
			ai: taylor(nd.z, nd.ai, nd.aip),
			bi: taylor(nd.z, nd.bi, nd.bip),
		}
		s[j].nt = termsNeeded(&s[j])
	}
	return s
}

// termsNeeded returns how many terms of the phase series c, d keep the
// omitted terms below 2^−60 of the series' size (|c| ≈ |δ|/π, |d| ≈ M_j²)
// at |δ| = airyStep/2; past the first few the coefficients fall
// factorially, so the first omitted terms dominate the tail. A test checks
// the truncated sums against the full ones over each node's interval.
func termsNeeded(s *nodeSeries) int {
	h := airyStep / 2
	small := func(k int) bool {
		hk := math.Pow(h, float64(k))
		return math.Abs(s.c[k])*hk <= 0x1p-60*h/math.Pi && math.Abs(s.d[k])*hk <= 0x1p-60*s.m2
	}
	// Two omitted terms in a row must be small: the three-term recurrence
	// can make a single coefficient small by accident.
	for n := 2; n+1 < nTaylor; n++ {
		if small(n) && small(n+1) {
			return n
		}
	}
	return nTaylor
}

// node returns the table node nearest to z, which must lie in
// (−negStart, posStart), and the offset δ = z − z_j.
func node(z float64) (*nodeSeries, float64) {
	j := int(math.Round((z - airyZMin) / airyStep))
	j = min(max(j, 0), len(series)-1)
	s := &series[j]
	return s, z - s.z
}

// horner sums Σ c_k δ^k.
func horner(c *[nTaylor]float64, d float64) float64 {
	s := c[nTaylor-1]
	for k := nTaylor - 2; k >= 0; k-- {
		s = s*d + c[k]
	}
	return s
}

// hornerD sums Σ k c_k δ^(k−1), the derivative of the series.
func hornerD(c *[nTaylor]float64, d float64) float64 {
	s := float64(nTaylor-1) * c[nTaylor-1]
	for k := nTaylor - 2; k >= 1; k-- {
		s = s*d + float64(k)*c[k]
	}
	return s
}

// tablePhase returns Θ(z) and M²(z) for z in the table's range.
func tablePhase(z float64) (theta, m2 float64) {
	s, d := node(z)
	// Both series together, so the two Horner chains interleave.
	cs, ds := s.c[nTaylor-1], s.d[nTaylor-1]
	for k := nTaylor - 2; k >= 0; k-- {
		cs = cs*d + s.c[k]
		ds = ds*d + s.d[k]
	}
	return s.theta + math.Atan2(cs, ds), (cs*cs + ds*ds) / s.m2
}

// phaseDD returns the continuous phase Θ(z) in double-double and
// p(z) = 1/(π M²(z)) for z = zd.hi + zd.lo, like [phase] but without the
// rounding of the large part of Θ: in the table range Θ_j is stored to 106
// bits and only the small angle atan2(c, d) is rounded; in the modulus–phase
// range π/4 + (2/3)x^(3/2) is formed in double-double.
func phaseDD(zd dd) (theta dd, p float64) {
	z := zd.hi
	switch {
	case z <= -negStart:
		x := ddNeg(zd)
		sx := ddSqrt(x)
		tc, rr := negPhaseCorr(x.hi)
		lead := ddMul(ddMul(x, sx), ddTwo3)
		return ddAdd(ddAdd(ddPi4, lead), dd{tc, 0}), sx.hi * (1 + rr)
	case z >= posStart:
		th, p := phase(z)
		return dd{th, 0}, p
	}
	s, cs, ds := tableCD(zd)
	return ddAdd(dd{s.theta, s.thetaLo}, dd{math.Atan2(cs, ds), 0}), s.m2 / (math.Pi * (cs*cs + ds*ds))
}

// inTable reports whether z is in the node table's range.
func inTable(z float64) bool { return z > -negStart && z < posStart }

// tableCD returns the node nearest to z = zd.hi + zd.lo (in the table's
// range) and the phase series c(z), d(z) about it.
func tableCD(zd dd) (s *nodeSeries, cs, ds float64) {
	z := zd.hi
	j := int(math.Round((z - airyZMin) / airyStep))
	j = min(max(j, 0), len(series)-1)
	s = &series[j]
	d := (z - s.z) + zd.lo // z − z_j is exact: |z − z_j| ≤ 1/8
	nt := s.nt
	cs, ds = s.c[nt-1], s.d[nt-1]
	for k := nt - 2; k >= 0; k-- {
		cs = cs*d + s.c[k]
		ds = ds*d + s.d[k]
	}
	return s, cs, ds
}

// tableCDD is tableCD with the derivatives c′(z), d′(z) of the phase
// series, summed in the same Horner pass.
func tableCDD(zd dd) (s *nodeSeries, cs, ds, cp, dp float64) {
	z := zd.hi
	j := int(math.Round((z - airyZMin) / airyStep))
	j = min(max(j, 0), len(series)-1)
	s = &series[j]
	d := (z - s.z) + zd.lo
	nt := s.nt
	cs, ds = s.c[nt-1], s.d[nt-1]
	for k := nt - 2; k >= 0; k-- {
		cp = cp*d + cs
		dp = dp*d + ds
		cs = cs*d + s.c[k]
		ds = ds*d + s.d[k]
	}
	return s, cs, ds, cp, dp
}

// phase returns the continuous phase Θ(z) = atan2(Ai(z), Bi(z)), Θ(0) = π/6
// (DLMF 9.8.4, there written θ), and p(z) = 1/(π M²(z)) = −Θ′(z)
// (DLMF 9.8.14). For z ≥ posStart, Θ underflows to 0 once
// Ai/Bi < 1e-308, which is harmless: Θ is then far below the rounding of
// any phase difference it enters.
func phase(z float64) (theta, p float64) {
	switch {
	case z <= -negStart:
		x := -z
		sx := math.Sqrt(x)
		_, tc, rr := negModPhase(x)
		return math.Pi/4 + (2.0/3)*x*sx + tc, sx * (1 + rr)
	case z >= posStart:
		ai, _, bi, _, zeta := posScaled(z)
		e := math.Exp(-2 * zeta)
		r := ai / bi * e // Ai/Bi
		// M² = Bi²(1 + (Ai/Bi)²).
		return math.Atan(r), e / (math.Pi * bi * bi * (1 + r*r))
	}
	theta, m2 := tablePhase(z)
	return theta, 1 / (math.Pi * m2)
}

// Airy returns the Airy functions Ai(z), Ai′(z), Bi(z) and Bi′(z) of a real
// argument (DLMF §9.2).
//
// Accuracy (tested against 300-bit sums): for −13 < z < 20 the values come
// from Taylor series about table nodes computed at 256-bit precision and
// are accurate to a few units in the last place of max(|Ai|, |Bi|) (so Ai
// near one of its zeros has an absolute, not relative, error of that size).
// For z ≥ 20 the asymptotic expansions DLMF 9.7.5–9.7.8 with a
// double-double e^(±ζ) give each function to a few ulps of itself. For
// z ≤ −13 the modulus–phase forms DLMF 9.8.20, 9.8.22 are used, with the
// phase π/4 + (2/3)|z|^(3/2) reduced modulo 2π before it is rounded (in
// double-double up to |z| = 2³², in math/big arithmetic beyond): Ai and Bi
// are good to a few ulps of the modulus M(z) and Ai′, Bi′ of
// N(z) = √(Ai′² + Bi′²) (DLMF 9.8.3–9.8.4) for every finite z, within one
// ulp at z = −200 against 300-bit sums. A call costs about 5 µs for
// z < −2³² (the math/big reduction), tens of ns elsewhere.
//
// Special cases are:
//
//	Airy(+Inf) = 0, 0, +Inf, +Inf
//	Airy(−Inf) = 0, NaN, 0, NaN (Ai′ and Bi′ oscillate with growing
//	  amplitude |z|^(1/4)/√π and have no limit)
//	Airy(NaN)  = NaN, NaN, NaN, NaN
//	Bi′ and Bi overflow to +Inf once they exceed the largest float64,
//	  near z = 104.0 and 104.4 (use [AiryScaled] beyond), and Ai, Ai′
//	  underflow to 0 (−0 for Ai′) beyond z = 172
//	z ≤ −13, however large |z|: finite values, |Ai|, |Bi| ≤ M(z), as
//	  accurate as above
func Airy(z float64) (ai, aip, bi, bip float64) {
	switch {
	case math.IsNaN(z):
		n := math.NaN()
		return n, n, n, n
	case math.IsInf(z, 1):
		return 0, 0, math.Inf(1), math.Inf(1)
	case math.IsInf(z, -1):
		return 0, math.NaN(), 0, math.NaN()
	case z >= posStart:
		ai, aip, bi, bip, _ := posScaled(z)
		// e^(−ζ) applied as two halves, so that Ai underflows and Bi
		// overflows only when the values themselves do.
		g := expNegHalfZeta(z)
		return ai * g * g, aip * g * g, bi / g / g, bip / g / g
	case z <= -negStart:
		x := -z
		m, _, mp, tc := negMod(x)
		sin, cos := negSinCos(x, tc)
		// Ai = M sin θ, Bi = M cos θ (DLMF 9.8.1–9.8.2), θ′ = −1/(πM²).
		return m * sin, mp*sin - cos/(math.Pi*m), m * cos, mp*cos + sin/(math.Pi*m)
	}
	s, d := node(z)
	return horner(&s.ai, d), hornerD(&s.ai, d), horner(&s.bi, d), hornerD(&s.bi, d)
}

// negMod returns M(−x), θ(−x), dM/dz at z = −x and the phase correction
// θc of [negModPhase], for x ≥ negStart.
func negMod(x float64) (m, theta, mp, tc float64) {
	sx := math.Sqrt(x)
	w, tc, _ := negModPhase(x)
	// π M² √x = w  ⇒  M = √(w/(π√x)).
	m = math.Sqrt(w / (math.Pi * sx))
	theta = math.Pi/4 + (2.0/3)*x*sx + tc // +Inf once x^(3/2) overflows
	// dM/dx = M/2 · (w′/w − 1/(2x)); dM/dz = −dM/dx. negDW gives x·w′.
	mp = -m / (2 * x) * (negDW(x)/w - 0.5)
	return m, theta, mp, tc
}

// AiryScaled returns the Airy functions scaled so that they neither overflow
// nor underflow for large positive z:
//
//	e^ζ Ai(z), e^ζ Ai′(z), e^(−ζ) Bi(z), e^(−ζ) Bi′(z),   ζ = (2/3) z^(3/2)
//
// for z > 0 (DLMF 9.7.1), and the unscaled values for z ≤ 0. Accuracy as
// for [Airy]; ζ is formed in double-double so that its rounding does not
// enter the scale factor.
//
// Special cases are:
//
//	AiryScaled(+Inf) = 0, −Inf, 0, +Inf
//	AiryScaled(−Inf) = 0, NaN, 0, NaN (as [Airy])
//	AiryScaled(NaN)  = NaN, NaN, NaN, NaN
func AiryScaled(z float64) (ai, aip, bi, bip float64) {
	if math.IsInf(z, 1) {
		return 0, math.Inf(-1), 0, math.Inf(1)
	}
	if z >= posStart {
		ai, aip, bi, bip, _ = posScaled(z)
		return ai, aip, bi, bip
	}
	ai, aip, bi, bip = Airy(z)
	if z > 0 {
		g := expNegHalfZeta(z)
		e := 1 / (g * g) // e^ζ ≤ e^59.7, no overflow below posStart
		return ai * e, aip * e, bi / e, bip / e
	}
	return ai, aip, bi, bip
}

// expNegHalfZeta returns e^(−ζ/2) for ζ = (2/3) z^(3/2), z > 0, with ζ
// formed in double-double: e^(−ζ/2) = e^(−ζhi/2)(1 − ζlo/2), since the
// rounding of ζ alone would cost ε·ζ relative (1e-13 at z = 100). It is 0
// once e^(−ζ/2) underflows (ζ > 1500, z > 172), including where ζ itself
// overflows (z > 3.2e205) and its low part would be NaN.
func expNegHalfZeta(z float64) float64 {
	zeta := ddMul(ddMulF(ddSqrt(dd{z, 0}), z), ddTwo3)
	if !(zeta.hi < 1500) {
		return 0
	}
	return math.Exp(-zeta.hi/2) * (1 - zeta.lo/2)
}

// ModulusPhase returns the modulus M(z) = √(Ai² + Bi²) and the continuous
// phase θ(z) = atan2(Ai(z), Bi(z)) with θ(0) = π/6 (DLMF 9.8.3, 9.8.4 with
// the branch continued from z = 0; θ decreases, θ(a_k) = kπ at the zeros a_k
// of Ai, DLMF 9.9.1). M overflows to +Inf for z > 104; θ underflows to 0 for
// large positive z. Both are good to a few ulps of themselves.
//
// Special cases are:
//
//	ModulusPhase(+Inf) = +Inf, 0
//	ModulusPhase(−Inf) = 0, +Inf
//	ModulusPhase(NaN)  = NaN, NaN
//	z < −4.1739e205: θ = +Inf, its value (2/3)|z|^(3/2) being beyond the
//	  largest float64 (M stays finite; [Airy] stays exact there)
func ModulusPhase(z float64) (m, theta float64) {
	switch {
	case math.IsNaN(z):
		return z, z
	case math.IsInf(z, 1):
		return z, 0
	case math.IsInf(z, -1):
		return 0, math.Inf(1)
	case z <= -negStart:
		m, theta, _, _ = negMod(-z)
		return m, theta
	case z >= posStart:
		ai, _, bi, _, _ := posScaled(z)
		g := expNegHalfZeta(z)
		r := ai / bi * (g * g) * (g * g) // Ai/Bi = (scaled ratio) e^(−2ζ)
		return bi / g / g * math.Sqrt(1+r*r), math.Atan(r)
	}
	theta, m2 := tablePhase(z)
	return math.Sqrt(m2), theta
}
