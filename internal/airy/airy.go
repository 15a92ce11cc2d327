// Package airy evaluates the Airy functions Ai and Bi and their
// derivatives for a real argument z ≥ [MinZ], in scaled form so that no
// value overflows or underflows however large z is:
//
//	Ai(z) = ai·e^(−ζ),  Ai′(z) = aip·e^(−ζ),
//	Bi(z) = bi·e^(+ζ),  Bi′(z) = bip·e^(+ζ),   ζ = (2/3) z^(3/2) (z > 0),
//
// and ζ = 0 for z ≤ 0. It serves the methods that continue a solution
// through a semi-infinite layer under a field, where the solutions are
// Ai and Bi of a scaled coordinate (DLMF 9.2.1).
//
// Three regions, each to a few units in the last place (tested against
// the independent evaluation DLMF 9.2.10 with gonum's complex Ai, the
// Wronskian and DLMF's values at 0):
//
//   - MinZ ≤ z ≤ 1: the Maclaurin series DLMF 9.4.1–9.4.4 (Ai = c₁f − c₂g,
//     Bi = √3(c₁f + c₂g), c₁ = Ai(0), c₂ = −Ai′(0), DLMF 9.2.3–9.2.4);
//   - 1 < z < 9: Bi and Bi′ by the same series, whose terms are all
//     positive there, so nothing cancels; Ai and Ai′, where the series
//     would cancel, by a Taylor step of Ai″ = zAi (DLMF 9.2.1) from a
//     table at spacing 1/8, built once by the same steps taken downwards
//     from z = 9 (Ai grows that way, so the integration is stable);
//   - z ≥ 9 (ζ ≥ 18): the asymptotic expansions DLMF 9.7.5–9.7.8, summed
//     to their smallest term, which is below e^(−2ζ) ≤ 3e-16 relative.
package airy

import (
	"math"
	"math/cmplx"
	"sync"

	"gonum.org/v1/gonum/mathext"
)

// MinZ is the smallest argument Scaled accepts. Ai has no zero in
// [MinZ, ∞) (its first is a₁ = −2.3381…, DLMF Table 9.9.1); Bi has one,
// b₁ = [BiZero1].
const MinZ = -2

// BiZero1 is b₁, the first (largest) zero of Bi (DLMF Table 9.9.2).
const BiZero1 = -1.17371322270912792

const (
	seriesMax = 1.0 // Ai by the Maclaurin series up to here
	asymMin   = 9.0 // asymptotic expansions from here (ζ = 18)
)

// c1 = Ai(0) = 1/(3^(2/3) Γ(2/3)) and c2 = −Ai′(0) = 1/(3^(1/3) Γ(1/3))
// (DLMF 9.2.3, 9.2.4).
var (
	c1 = 1 / (math.Cbrt(9) * math.Gamma(2.0/3))
	c2 = 1 / (math.Cbrt(3) * math.Gamma(1.0/3))
)

// Scaled returns Ai, Ai′, Bi and Bi′ at z scaled as the package
// documentation says, and the exponent ζ. For z < MinZ or NaN z it
// returns NaNs; callers keep z in range.
func Scaled(z float64) (ai, aip, bi, bip, zeta float64) {
	switch {
	case !(z >= MinZ):
		n := math.NaN()
		return n, n, n, n, n
	case z >= asymMin:
		return asymptotic(z)
	}
	f, fp, g, gp := maclaurin(z)
	bi = math.Sqrt(3) * (c1*f + c2*g)
	bip = math.Sqrt(3) * (c1*fp + c2*gp)
	if z <= seriesMax {
		ai = c1*f - c2*g
		aip = c1*fp - c2*gp
	} else {
		ai, aip = aiTable(z)
	}
	if z > 0 {
		zeta = 2.0 / 3 * z * math.Sqrt(z)
		e := math.Exp(zeta)
		ai, aip = ai*e, aip*e
		bi, bip = bi/e, bip/e
	}
	return ai, aip, bi, bip, zeta
}

// tableStep is the spacing of the Ai table on [seriesMax, asymMin].
const tableStep = 0.125

// aiNodes holds Ai and Ai′ at seriesMax + i·tableStep, i = 0..64.
var aiNodes = sync.OnceValue(func() (t [65][2]float64) {
	n := len(t) - 1
	a, ap, _, _, zeta := asymptotic(asymMin)
	e := math.Exp(-zeta)
	t[n] = [2]float64{a * e, ap * e}
	for i := n - 1; i >= 0; i-- {
		z0 := seriesMax + float64(i+1)*tableStep
		t[i][0], t[i][1] = taylor(z0, t[i+1][0], t[i+1][1], -tableStep)
	}
	return t
})

// aiTable returns Ai(z) and Ai′(z) for seriesMax < z < asymMin by one
// Taylor step from the nearest table node.
func aiTable(z float64) (ai, aip float64) {
	t := aiNodes()
	i := int(math.Round((z - seriesMax) / tableStep))
	i = min(max(i, 0), len(t)-1)
	z0 := seriesMax + float64(i)*tableStep
	return taylor(z0, t[i][0], t[i][1], z-z0)
}

// taylor carries a solution of y″ = zy from z0 (y, y′) to z0 + h by its
// Taylor series, (k+2)(k+1)c_(k+2) = z0 c_k + c_(k−1) (DLMF 9.2.1 about
// z0), summed until the terms fall below 1e-18 of the sum (|h| ≤ 1/8
// here: about 20 terms).
func taylor(z0, y, yp, h float64) (float64, float64) {
	cm, c0, c1 := 0.0, y, yp // c_(k−1), c_k, c_(k+1)
	hk := 1.0                // h^k
	sum, dsum := c0, 0.0
	for k := 0; k < 80; k++ {
		// Add c_(k+1) h^(k+1) and its derivative term.
		dsum += float64(k+1) * c1 * hk
		hk *= h
		sum += c1 * hk
		c2 := (z0*c0 + cm) / (float64(k+2) * float64(k+1))
		cm, c0, c1 = c0, c1, c2
		if k > 4 && math.Abs(c1*hk*h) <= 1e-18*math.Abs(sum) && math.Abs(c0*hk) <= 1e-18*math.Abs(sum)+1e-300 {
			break
		}
	}
	return sum, dsum
}

// maclaurin returns the series f(z), f′(z), g(z), g′(z) of DLMF 9.4.1–9.4.4:
//
//	f(z) = Σ 3^k (1/3)_k z^(3k)/(3k)!,  g(z) = Σ 3^k (2/3)_k z^(3k+1)/(3k+1)!.
//
// Successive terms of f are multiplied by z³/((3k−1)·3k) and those of g
// by z³/(3k·(3k+1)).
func maclaurin(z float64) (f, fp, g, gp float64) {
	z3 := z * z * z
	tf, tg := 1.0, z // the k-th terms of f and g
	f, g = tf, tg
	fp, gp = 0, 1
	for k := 1; k < 200; k++ {
		fk := float64(3 * k)
		tf *= z3 / ((fk - 1) * fk)
		tg *= z3 / (fk * (fk + 1))
		f += tf
		g += tg
		// d/dz of z^(3k)·c is 3k z^(3k−1)·c; of z^(3k+1)·c, (3k+1) z^(3k)·c.
		if z != 0 {
			fp += fk * tf / z
		}
		gp += (fk + 1) * tg / z
		if math.Abs(tf) <= 1e-18*math.Abs(f) && math.Abs(tg) <= 1e-18*math.Abs(g) {
			break
		}
	}
	if z == 0 {
		gp = 1
	}
	return f, fp, g, gp
}

// asymptotic returns the scaled functions for z ≥ asymMin by DLMF
// 9.7.5–9.7.8,
//
//	Ai(z)  ~ e^(−ζ)/(2√π z^(1/4)) Σ (−1)^k u_k/ζ^k,
//	Ai′(z) ~ −z^(1/4) e^(−ζ)/(2√π) Σ (−1)^k v_k/ζ^k,
//	Bi(z)  ~ e^(ζ)/(√π z^(1/4)) Σ u_k/ζ^k,
//	Bi′(z) ~ z^(1/4) e^(ζ)/√π Σ v_k/ζ^k,
//
// with u_0 = v_0 = 1, u_k = u_(k−1)(6k−5)(6k−3)(6k−1)/((2k−1)·216k) and
// v_k = −u_k (6k+1)/(6k−1) (DLMF 9.7.2), summed until the terms stop
// decreasing or fall below 1e-17 (the omitted recessive term of Bi is
// e^(−2ζ) relative).
func asymptotic(z float64) (ai, aip, bi, bip, zeta float64) {
	sz := math.Sqrt(z)
	zeta = 2.0 / 3 * z * sz
	q := math.Sqrt(sz) // z^(1/4)
	var su, sua, sv, sva float64 = 1, 1, 1, 1
	u, p := 1.0, 1.0 // u_k and ζ^(−k)
	prev := math.Inf(1)
	for k := 1; k < 100; k++ {
		fk := float64(k)
		u *= (6*fk - 5) * (6*fk - 3) * (6*fk - 1) / ((2*fk - 1) * 216 * fk)
		p /= zeta
		v := -u * (6*fk + 1) / (6*fk - 1)
		t := u * p
		if t >= prev || t < 1e-17 {
			break
		}
		prev = t
		sgn := 1.0
		if k&1 == 1 {
			sgn = -1
		}
		su += t
		sua += sgn * t
		sv += v * p
		sva += sgn * v * p
	}
	sp := math.Sqrt(math.Pi)
	ai = sua / (2 * sp * q)
	aip = -q * sva / (2 * sp)
	bi = su / (sp * q)
	bip = q * sv / sp
	return ai, aip, bi, bip, zeta
}

// MaxComplex is the largest |z| for which Complex is meant: its
// Maclaurin sums lose about e^(2ζ) (ζ = (2/3)|z|^(3/2)) to cancellation,
// 1e-10 of Ai at |z| = 6.
const MaxComplex = 6

// Complex returns Ai, Ai′, Bi and Bi′ at a complex z with |z| ≤ MaxComplex
// by the Maclaurin series DLMF 9.4.1–9.4.4 (complex arithmetic, no
// allocation); beyond, by gonum's mathext.AiryAi and AiryAiDeriv (D. E.
// Amos, ACM TOMS 12, 265 (1986)) with Bi from DLMF 9.2.10,
// Bi(z) = e^(πi/6) Ai(zω) + e^(−πi/6) Ai(zω̄), ω = e^(2πi/3), and its
// derivative. The values are unscaled.
func Complex(z complex128) (ai, aip, bi, bip complex128) {
	if cmplx.Abs(z) <= MaxComplex {
		f, fp, g, gp := maclaurinC(z)
		k1, k2, r3 := complex(c1, 0), complex(c2, 0), complex(math.Sqrt(3), 0)
		return k1*f - k2*g, k1*fp - k2*gp, r3 * (k1*f + k2*g), r3 * (k1*fp + k2*gp)
	}
	w := complex(-0.5, math.Sqrt(3)/2)
	wc := complex(-0.5, -math.Sqrt(3)/2)
	e6 := complex(math.Sqrt(3)/2, 0.5)
	e6c := complex(math.Sqrt(3)/2, -0.5)
	e56 := complex(-math.Sqrt(3)/2, 0.5)
	e56c := complex(-math.Sqrt(3)/2, -0.5)
	ai, aip = mathext.AiryAi(z), mathext.AiryAiDeriv(z)
	bi = e6*mathext.AiryAi(z*w) + e6c*mathext.AiryAi(z*wc)
	bip = e56*mathext.AiryAiDeriv(z*w) + e56c*mathext.AiryAiDeriv(z*wc)
	return ai, aip, bi, bip
}

// maclaurinC is maclaurin in complex arithmetic.
func maclaurinC(z complex128) (f, fp, g, gp complex128) {
	z3 := z * z * z
	tf, tg := complex(1, 0), z
	f, g = tf, tg
	fp, gp = 0, 1
	for k := 1; k < 200; k++ {
		fk := float64(3 * k)
		tf *= z3 / complex((fk-1)*fk, 0)
		tg *= z3 / complex(fk*(fk+1), 0)
		f += tf
		g += tg
		if z != 0 {
			fp += complex(fk, 0) * tf / z
			gp += complex(fk+1, 0) * tg / z
		}
		if cmplx.Abs(tf) <= 1e-18*cmplx.Abs(f) && cmplx.Abs(tg) <= 1e-18*cmplx.Abs(g) {
			break
		}
	}
	return f, fp, g, gp
}
