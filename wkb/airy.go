package wkb

import (
	"math"
	"sync"
)

// This file holds a minimal real Airy evaluation: the modulus M and phase θ
// of DLMF §9.8 (Ai = M sin θ, Bi = M cos θ, θ continuous with θ(0) = π/6),
// and Ai, Bi scaled by e^(∓ζ) for large positive x. It serves the connection
// phase at the near wall and the uniform wavefunction; it is not a general
// Airy library.
//
// On [airyLo, airyHi] the functions come from a table built once: Ai, Ai′,
// Bi, Bi′ at nodes airyStep apart, by Taylor steps of w″ = x w (DLMF 9.2.1)
// from the initial values DLMF 9.2.3–9.2.6 (Ai and Bi towards −∞, Bi towards
// +∞) and, for Ai on x > 0, backwards from airyHi where DLMF 9.7.5 and 9.7.6
// are accurate: each function is stepped in a direction in which it does not
// decay, so rounding does not grow relative to it. At each node the table
// then holds the Taylor coefficients of M² = Ai² + Bi² (the Cauchy product
// of those of Ai and Bi) and of θ, from θ′ = −1/(π M²) (DLMF 9.8.14), so an
// evaluation is two short Horner sums. M² and θ are smooth (M² has no real
// zeros; its complex zeros, those of Ai(z e^(±2πi/3)), are at least 2 from
// the real axis), so airyOrder terms reach rounding for |t| ≤ airyStep/2.
// Outside the table the asymptotic expansions DLMF 9.7.5–9.7.11 are used.

const (
	airyLo   = -16.0 // ζ = 42.7: the phase series reaches ~1e-17 (smallest term ~ e^(−2ζ))
	airyHi   = 12.0  // ζ = 27.7: Ai/Bi < 1e-23, and DLMF 9.7.5–9.7.6 reach ~1e-24
	airyStep = 0.125
	airyN    = int((airyHi-airyLo)/airyStep) + 1
	// airyOrder is the number of Taylor coefficients kept per node. The
	// series of M² converges like (|t|/2)^k on x < 0 and like
	// (2√x |t|)^k/k! where M² ≈ Bi² grows (x ≤ 12): 1e-16 at |t| = 1/16.
	airyOrder = 14
	// airyTerms is the number of coefficients u_k kept (DLMF 9.7.2).
	airyTerms = 40
)

// airyNode holds Ai, Ai′, Bi, Bi′ and the continuous phase θ at x, and the
// Taylor coefficients of M² and θ about x.
type airyNode struct {
	x, ai, aip, bi, bip, theta float64
	m2c, thc                   [airyOrder]float64
}

// airyCoef holds u_k and v_k of DLMF 9.7.2:
//
//	u_k = (2k+1)(2k+3)···(6k−1) / (216^k k!),  v_k = −(6k+1)/(6k−1) u_k.
type airyCoef struct {
	u, v [airyTerms]float64
}

var airyCoefs = sync.OnceValue(func() *airyCoef {
	c := new(airyCoef)
	c.u[0], c.v[0] = 1, 1
	for k := 1; k < airyTerms; k++ {
		fk := float64(k)
		// u_k/u_(k−1) = (6k−5)(6k−3)(6k−1) / ((2k−1) 216 k)
		c.u[k] = c.u[k-1] * (6*fk - 5) * (6*fk - 3) * (6*fk - 1) / ((2*fk - 1) * 216 * fk)
		c.v[k] = -(6*fk + 1) / (6*fk - 1) * c.u[k]
	}
	return c
})

// airyTable is built once and must not be modified.
var airyTable = sync.OnceValue(buildAiryTable)

// taylorStep advances the solution (w, w′) of w″ = x w from x0 by t, summing
// the Taylor series Σ c_k t^k with c_k = (x0 c_(k−2) + c_(k−3)) / (k(k−1)).
// It is used only to build the table, so it simply takes 60 terms
// (|x0 t²|, |t³| ≤ 1 there, so the terms fall faster than 1/k!).
func taylorStep(x0, w, wp, t float64) (float64, float64) {
	c0, c1, c2 := w, wp, x0*w/2
	s := c0 + t*(c1+t*c2)
	sp := c1 + 2*c2*t
	tk := t * t // t^(k−1) for k = 3 below
	for k := 3; k < 60; k++ {
		fk := float64(k)
		ck := (x0*c1 + c0) / (fk * (fk - 1))
		s += ck * tk * t
		sp += fk * ck * tk
		c0, c1, c2 = c1, c2, ck
		tk *= t
	}
	return s, sp
}

func buildAiryTable() *[airyN]airyNode {
	tab := new([airyN]airyNode)
	g13, g23 := math.Gamma(1.0/3), math.Gamma(2.0/3)
	// DLMF 9.2.3–9.2.6.
	ai0 := 1 / (math.Pow(3, 2.0/3) * g23)
	aip0 := -1 / (math.Pow(3, 1.0/3) * g13)
	bi0 := 1 / (math.Pow(3, 1.0/6) * g23)
	bip0 := math.Pow(3, 1.0/6) / g13
	i0 := int(-airyLo / airyStep) // index of x = 0
	for i := range tab {
		tab[i].x = airyLo + float64(i)*airyStep
	}
	tab[i0].ai, tab[i0].aip, tab[i0].bi, tab[i0].bip = ai0, aip0, bi0, bip0
	// Towards −∞ both functions oscillate: step Ai and Bi from 0.
	for i := i0 - 1; i >= 0; i-- {
		p := &tab[i+1]
		tab[i].ai, tab[i].aip = taylorStep(p.x, p.ai, p.aip, -airyStep)
		tab[i].bi, tab[i].bip = taylorStep(p.x, p.bi, p.bip, -airyStep)
	}
	// Towards +∞ Bi grows: step it from 0.
	for i := i0 + 1; i < airyN; i++ {
		p := &tab[i-1]
		tab[i].bi, tab[i].bip = taylorStep(p.x, p.bi, p.bip, airyStep)
	}
	// Ai decays towards +∞: start from DLMF 9.7.5–9.7.6 at airyHi and step
	// backwards, the direction in which it grows.
	last := &tab[airyN-1]
	as, aps := airyAiScaledPos(airyHi)
	e := math.Exp(-2.0 / 3 * airyHi * math.Sqrt(airyHi))
	last.ai, last.aip = as*e, aps*e
	for i := airyN - 2; i > i0; i-- {
		p := &tab[i+1]
		tab[i].ai, tab[i].aip = taylorStep(p.x, p.ai, p.aip, -airyStep)
	}
	// Phase: θ = atan2(Ai, Bi) on the continuous branch (DLMF 9.8.4), with
	// θ(0) = π/6 and θ increasing towards −∞.
	for i := i0; i < airyN; i++ {
		tab[i].theta = math.Atan2(tab[i].ai, tab[i].bi)
	}
	for i := i0 - 1; i >= 0; i-- {
		base := math.Atan2(tab[i].ai, tab[i].bi)
		p := &tab[i+1]
		// The step in θ is below 1 rad (|θ′| = 1/(πM²) ≤ 1.1 √|x|).
		pred := p.theta + math.Atan2(tab[i].ai*p.bi-tab[i].bi*p.ai, tab[i].bi*p.bi+tab[i].ai*p.ai)
		tab[i].theta = base + 2*math.Pi*math.Round((pred-base)/(2*math.Pi))
	}
	for i := range tab {
		tab[i].expand()
	}
	return tab
}

// expand fills the Taylor coefficients of M² and θ about the node.
func (nd *airyNode) expand() {
	var a, b, q [airyOrder]float64
	a[0], a[1], a[2] = nd.ai, nd.aip, nd.x*nd.ai/2
	b[0], b[1], b[2] = nd.bi, nd.bip, nd.x*nd.bi/2
	for k := 3; k < airyOrder; k++ {
		fk := float64(k)
		a[k] = (nd.x*a[k-2] + a[k-3]) / (fk * (fk - 1))
		b[k] = (nd.x*b[k-2] + b[k-3]) / (fk * (fk - 1))
	}
	for k := range airyOrder {
		s := 0.0
		for i := 0; i <= k; i++ {
			s += a[i]*a[k-i] + b[i]*b[k-i]
		}
		nd.m2c[k] = s
	}
	// q = 1/M² as a series; θ_k = −q_(k−1)/(π k).
	q[0] = 1 / nd.m2c[0]
	for k := 1; k < airyOrder; k++ {
		s := 0.0
		for i := 1; i <= k; i++ {
			s += nd.m2c[i] * q[k-i]
		}
		q[k] = -s * q[0]
	}
	nd.thc[0] = nd.theta
	for k := 1; k < airyOrder; k++ {
		nd.thc[k] = -q[k-1] / (math.Pi * float64(k))
	}
}

// airyAiScaledPos returns Ai(x) e^ζ and Ai′(x) e^ζ, ζ = (2/3) x^(3/2), for
// large positive x (DLMF 9.7.5, 9.7.6):
//
//	Ai(x)  ~ e^(−ζ) / (2√π x^(1/4)) Σ (−1)^k u_k ζ^(−k)
//	Ai′(x) ~ −x^(1/4) e^(−ζ) / (2√π) Σ (−1)^k v_k ζ^(−k)
func airyAiScaledPos(x float64) (ai, aip float64) {
	c := airyCoefs()
	z := 2.0 / 3 * x * math.Sqrt(x)
	su, sv := asymSum(&c.u, -1/z), asymSum(&c.v, -1/z)
	q := math.Sqrt(math.Sqrt(x))
	return su / (2 * math.SqrtPi * q), -q * sv / (2 * math.SqrtPi)
}

// airyScaledPos returns Ai(x) e^ζ and Bi(x) e^(−ζ) for x ≥ airyHi
// (DLMF 9.7.5, 9.7.7), and ζ.
func airyScaledPos(x float64) (ai, bi, z float64) {
	c := airyCoefs()
	z = 2.0 / 3 * x * math.Sqrt(x)
	q := math.SqrtPi * math.Sqrt(math.Sqrt(x))
	return asymSum(&c.u, -1/z) / (2 * q), asymSum(&c.u, 1/z) / q, z
}

// asymSum sums Σ a_k r^k of an asymptotic series, stopping at the first term
// below 1e-18 of the sum or at the smallest term.
func asymSum(a *[airyTerms]float64, r float64) float64 {
	s, p := a[0], 1.0
	prev := math.Inf(1)
	for k := 1; k < airyTerms; k++ {
		p *= r
		t := a[k] * p
		at := math.Abs(t)
		if at >= prev {
			break
		}
		s += t
		if at < 1e-18*math.Abs(s) {
			break
		}
		prev = at
	}
	return s
}

// airyPQ returns P and Q of DLMF 9.7.9 for ζ > 0:
//
//	P = Σ (−1)^k u_(2k) ζ^(−2k),  Q = Σ (−1)^k u_(2k+1) ζ^(−2k−1),
//
// with Ai(−z) = (P cos(ζ−π/4) + Q sin(ζ−π/4))/(√π z^(1/4)) and
// Bi(−z) = (−P sin(ζ−π/4) + Q cos(ζ−π/4))/(√π z^(1/4)).
func airyPQ(z float64) (p, q float64) {
	c := airyCoefs()
	r := 1 / z
	r2 := -r * r
	p, q = 1, c.u[1]*r
	tp, tq := 1.0, r
	prev := math.Inf(1)
	for k := 1; 2*k+1 < airyTerms; k++ {
		tp *= r2
		tq *= r2
		a, b := c.u[2*k]*tp, c.u[2*k+1]*tq
		m := math.Abs(a) + math.Abs(b)
		if m >= prev {
			break
		}
		p += a
		q += b
		if m < 1e-18 {
			break
		}
		prev = m
	}
	return p, q
}

// airyNeg returns the phase correction β = atan(Q/P), with θ(x) = π/4 + ζ − β,
// and M² = (P² + Q²)/(π √(−x)), for x ≤ airyLo (DLMF 9.7.9, 9.8.3, 9.8.4);
// ζ = (2/3)(−x)^(3/2).
func airyNeg(x float64) (beta, m2, z float64) {
	s := math.Sqrt(-x)
	z = 2.0 / 3 * (-x) * s
	p, q := airyPQ(z)
	// |Q/P| ≈ u₁/ζ < 1.7e-3 for ζ ≥ 42.7: four terms of the arctangent
	// series reach 1e-26.
	y := q / p
	y2 := y * y
	return y * (1 - y2*(1.0/3-y2*(1.0/5-y2/7))), (p*p + q*q) / (math.Pi * s), z
}

// airyTab returns θ(x) and M²(x) for x in [airyLo, airyHi], by the Taylor
// series about the nearest table node.
func airyTab(x float64) (theta, m2 float64) {
	tab := airyTable()
	i := int((x-airyLo)*(1/airyStep) + 0.5) // x ≥ airyLo: truncation rounds
	nd := &tab[max(0, min(airyN-1, i))]
	t := x - nd.x
	theta, m2 = nd.thc[airyOrder-1], nd.m2c[airyOrder-1]
	for k := airyOrder - 2; k >= 0; k-- {
		theta = theta*t + nd.thc[k]
		m2 = m2*t + nd.m2c[k]
	}
	return theta, m2
}

// airyTheta returns θ(x) and M²(x) = Ai² + Bi² for x ≤ airyHi (DLMF 9.8.3,
// 9.8.4).
func airyTheta(x float64) (theta, m2 float64) {
	if x < airyLo {
		beta, m2, z := airyNeg(x)
		return math.Pi/4 + z - beta, m2
	}
	return airyTab(x)
}

// airyChi returns the connection phase χ(x) = θ(x) − ζ̄(x), where
// ζ̄ = (2/3)(−x)^(3/2) for x < 0 and 0 for x ≥ 0, and its derivative dχ/dx.
// χ is π/4 deep in the allowed side (x → −∞), π/6 at x = 0 and falls to 0
// like ½ e^(−2ζ) on the forbidden side. θ′ = −1/(πM²) (DLMF 9.8.14).
func airyChi(x float64) (chi, dchi float64) {
	switch {
	case x < airyLo:
		// dχ/dx = √(−x) β′(ζ), with β′ from β = u₁/ζ − c₃/ζ³ + O(ζ^(−5))
		// (DLMF 9.8.22): the difference √(−x) − 1/(πM²) would cancel.
		beta, _, z := airyNeg(x)
		r := 1 / (z * z)
		return math.Pi/4 - beta, -math.Sqrt(-x) * r * (u1 - 3*c3*r)
	case x <= airyHi:
		th, m2 := airyTab(x)
		d := -1 / (math.Pi * m2)
		if x < 0 {
			s := math.Sqrt(-x)
			return th - 2.0/3*(-x)*s, d + s
		}
		return th, d
	}
	// θ = atan(Ai/Bi) with Ai/Bi = ½ e^(−2ζ) (1 − 2u₁/ζ + O(ζ^(−2))) below
	// 1e-23 here (DLMF 9.7.5, 9.7.7), and dθ/dx = −1/(π Bi²) =
	// −√x e^(−2ζ) (1 − 2u₁/ζ + O(ζ^(−2))): far below any phase that matters.
	s := math.Sqrt(x)
	z := 2.0 / 3 * x * s
	r := math.Exp(-2*z) * (1 - 2*u1/z)
	return r / 2, -s * r
}
