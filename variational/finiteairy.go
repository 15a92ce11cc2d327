package variational

import "math"

// The downhill barrier of a finite well at f > 0 enters the layered trial
// space through the logarithmic derivative of its exact solution: in the
// barrier ξ < 0 the potential is v_L + f(ξ − ½), and with
//
//	z = s(ξ − ξ_t),  s = (π² μ_L f)^(1/3),  ξ_t = −(v_L − f/2 − η)/f
//
// (ξ_t the classical turning point) the solutions are the Airy functions
// of z (DLMF 9.2.1). The outgoing one is Ai(z) − i Bi(z) (DLMF 9.2.11 and
// 9.7.9–9.7.11: a wave travelling to ξ → −∞); its logarithmic derivative
// at the interface z₀ = s(v_L − f/2 − η)/f > 0 is
//
//	s (Ai′ − iBi′)/(Ai − iBi) = s [(Ai′Ai + Bi′Bi) − i/π]/(Ai² + Bi²)
//
// (the imaginary part by the Wronskian W{Ai, Bi} = 1/π, DLMF 9.2.7). The
// real part is the logarithmic derivative of the real solution
// y = Ai(z)Ai(z₀) + Bi(z)Bi(z₀), which the level problem uses; the
// imaginary part is the escape, which the real problem leaves out.

// Ai(0), −Ai′(0), Bi(0), Bi′(0) (DLMF 9.2.3–9.2.5; values to 20 digits
// from DLMF §9.2(ii), from memory, checked in the tests against the
// Wronskian and against the asymptotic expansions).
const (
	ai0  = 0.35502805388781723926
	aip0 = 0.25881940379280679840 // −Ai′(0)
	bi0  = 0.61492662744600073515
	bip0 = 0.44828835735382635791
)

// airySwitch is the z above which the asymptotic expansions replace the
// Maclaurin series: there ζ = (2/3)z^(3/2) > 21, and the expansions of Bi
// (whose terms are all positive) are good to e^(−2ζ) < 1e-18 relative.
const airySwitch = 10

// airyPos holds Ai, Bi and their derivatives at one z ≥ 0, with Bi and
// Bi′ scaled by e^(−ζ) and Ai and Ai′ by e^(ζ) so that nothing overflows
// (DLMF 9.7.5 for ζ).
type airyPos struct {
	z, zeta      float64
	ai, aip      float64 // e^ζ Ai, e^ζ Ai′
	bi, bip      float64 // e^(−ζ) Bi, e^(−ζ) Bi′
	asymptotic   bool    // Ai, Ai′ are left out (they enter only at e^(−2ζ))
	uMinusV, uPV float64 // asymptotic sums U − V and U + V (DLMF 9.7.7–9.7.8)
}

// airyAt evaluates the Airy functions at z ≥ 0. Below airySwitch it sums
// the Maclaurin series Ai = a f − a′ g, Bi = b f + b′ g with
//
//	f = Σ 3^k (1/3)_k z^(3k)/(3k)!,  g = Σ 3^k (2/3)_k z^(3k+1)/(3k+1)!
//
// (DLMF 9.4.1, 9.4.2), whose terms are all positive for z ≥ 0: Bi keeps
// full relative accuracy, Ai its absolute accuracy ε·Bi, which is all the
// combinations below need (Ai enters them only multiplied by Ai). Above
// it, the asymptotic expansions (DLMF 9.7.7, 9.7.8)
//
//	Bi(z) ~ e^ζ/(√π z^(1/4)) Σ u_k ζ^(−k),  Bi′(z) ~ z^(1/4) e^ζ/√π Σ v_k ζ^(−k),
//
// u_k, v_k from DLMF 9.7.2, and Ai is left out.
func airyAt(z float64) airyPos {
	a := airyPos{z: z, zeta: 2.0 / 3 * z * math.Sqrt(z)}
	if z < airySwitch {
		z3 := z * z * z
		tf, tg := 1.0, z // current terms of f and g
		f, g := 1.0, z
		fp, gp := 0.0, 1.0 // f′ and g′
		for k := 1; k < 200; k++ {
			kk := float64(3 * k)
			tf *= z3 / ((kk - 1) * kk)
			tg *= z3 / (kk * (kk + 1))
			f += tf
			g += tg
			// d/dz z^(3k) = 3k z^(3k−1): the f term times 3k/z; g's
			// term times (3k+1)/z. Written from the previous term to
			// avoid dividing by z = 0.
			fp += tf * kk / z
			gp += tg * (kk + 1) / z
			if tf <= 1e-18*f && tg <= 1e-18*g {
				break
			}
		}
		if z == 0 {
			fp, gp = 0, 1
		}
		e := math.Exp(-a.zeta)
		a.bi = (bi0*f + bip0*g) * e
		a.bip = (bi0*fp + bip0*gp) * e
		a.ai = (ai0*f - aip0*g) / e
		a.aip = (ai0*fp - aip0*gp) / e
		return a
	}
	a.asymptotic = true
	u, v, umv, upv := asymptoticSums(a.zeta)
	r := 1 / math.Sqrt(math.Pi)
	q := math.Sqrt(math.Sqrt(z))
	a.bi = r / q * u
	a.bip = r * q * v
	a.uMinusV, a.uPV = umv, upv
	return a
}

// asymptoticSums returns U = Σ u_k ζ^(−k), V = Σ v_k ζ^(−k), U − V and
// U + V, with u_0 = v_0 = 1 and
//
//	u_k = (2k+1)(2k+3)…(6k−1)/(216^k k!),  v_k = −(6k+1)/(6k−1) u_k
//
// (DLMF 9.7.2), summed until the terms fall below 1e-18 or start to grow.
func asymptoticSums(zeta float64) (u, v, umv, upv float64) {
	u, v, umv, upv = 1, 1, 0, 2
	uk := 1.0 // u_k
	t := 1.0  // ζ^(−k)
	prev := math.Inf(1)
	for k := 1; k < 60; k++ {
		// u_k/u_{k−1} = (6k−5)(6k−3)(6k−1)/((2k−1)·216·k).
		fk := float64(k)
		uk *= (6*fk - 5) * (6*fk - 3) * (6*fk - 1) / ((2*fk - 1) * 216 * fk)
		vk := -(6*fk + 1) / (6*fk - 1) * uk
		t /= zeta
		term := uk * t
		if term > prev {
			break
		}
		u += term
		v += vk * t
		umv += (uk - vk) * t
		upv += (uk + vk) * t
		prev = term
		if term < 1e-18 {
			break
		}
	}
	return u, v, umv, upv
}

// logDeriv returns Re of the outgoing logarithmic derivative divided by s,
// (Ai′Ai + Bi′Bi)/(Ai² + Bi²), at z₀: √z V/U in the asymptotic range.
func (a airyPos) logDeriv() float64 {
	if a.asymptotic {
		return math.Sqrt(a.z) * (a.uPV - a.uMinusV) / (a.uPV + a.uMinusV)
	}
	e4 := math.Exp(-4 * a.zeta)
	return (a.bip*a.bi + e4*a.aip*a.ai) / (a.bi*a.bi + e4*a.ai*a.ai)
}

// lnEscape returns ln(1/(π(Ai² + Bi²))) at z₀, minus the imaginary part
// of the outgoing logarithmic derivative over s, in logarithms since it
// falls like e^(−2ζ).
func (a airyPos) lnEscape() float64 {
	den := a.bi * a.bi
	if !a.asymptotic {
		den += math.Exp(-4*a.zeta) * a.ai * a.ai
	}
	return -math.Log(math.Pi*den) - 2*a.zeta
}

// mInv4 returns 1/(π²M⁴) at z₀, M² = Ai² + Bi² (0 in the asymptotic
// range, where it is below e^(−4ζ) < 1e-36 of u²).
func (a airyPos) mInv4() float64 {
	if a.asymptotic {
		return 0
	}
	e4 := math.Exp(-4 * a.zeta)
	q := a.bi*a.bi + e4*a.ai*a.ai // M² e^(−2ζ)
	return e4 / (math.Pi * math.Pi * q * q)
}

// dlog returns du/dz for u = M′/M, the real part of the outgoing
// logarithmic derivative: from M″ = zM + 1/(π²M³) (derived here from
// M² = Ai² + Bi², Airy's equation and W{Ai, Bi} = 1/π, DLMF 9.2.7),
//
//	u̇ = z − u² + 1/(π²M⁴),
//
// formed in the asymptotic range as z(U − V)(U + V)/U² without
// cancellation.
func (a airyPos) dlog() float64 {
	if a.asymptotic {
		u := (a.uPV + a.uMinusV) / 2
		return a.z * a.uMinusV * a.uPV / (u * u)
	}
	u := a.logDeriv()
	return a.z - u*u + a.mInv4()
}

// normRatio returns ∫₀^z₀ M(z)² dz / M(z₀)², the weight of the downhill
// barrier between its turning point (z = 0) and the interface in units
// of φ(0)²/s, for φ ∝ M there. From ∫ M² dz = zM² − M′² − 1/(π²M²)
// (differentiate, using the modulus equation),
//
//	z₀ − u₀² − 1/(π²M₀⁴) + (M′(0)² + 1/(π²M(0)²))/M₀².
//
// In the asymptotic range the last two terms (below e^(−2ζ) < 1e-18 of
// the first) are dropped and z₀ − u₀² = z₀(U − V)(U + V)/U².
func (a airyPos) normRatio() float64 {
	if a.asymptotic {
		return a.dlog()
	}
	u := a.logDeriv()
	e2 := math.Exp(-2 * a.zeta)
	q := a.bi*a.bi + e2*e2*a.ai*a.ai // M₀² e^(−2ζ)
	m02 := ai0*ai0 + bi0*bi0
	mp0 := (-ai0*aip0 + bi0*bip0) / math.Sqrt(m02)
	return a.z - u*u - a.mInv4() + e2*(mp0*mp0+1/(math.Pi*math.Pi*m02))/q
}

// aiPos holds Ai and its logarithmic derivative at one z ≥ 0, for the
// uphill barrier, where the solution is the decaying Ai.
type aiPos struct {
	z, zeta float64
	u       float64 // Ai′/Ai (negative)
	w       float64 // u² − z = −d(Ai′/Ai)/dz > 0, formed without cancellation
	lnAi    float64 // ln Ai(z) + ζ
}

// aiMaclaurin is the largest z at which aiAt sums the Maclaurin series:
// there Bi/Ai < 27, so the series loses at most about 1.5 digits, and
// beyond it (ζ > 1.2) Steed's continued fraction converges without
// overflow.
const aiMaclaurin = 1.5

// aiAt evaluates Ai at z ≥ 0. Up to aiMaclaurin it takes the Maclaurin
// series of airyAt; beyond, the modified Bessel functions
//
//	Ai(z) = (1/π)√(z/3) K_{1/3}(ζ),  Ai′(z) = −(z/(π√3)) K_{2/3}(ζ)
//
// (DLMF 9.6.1), with K_{1/3}(ζ) and K_{2/3}(ζ)/K_{1/3}(ζ) from Steed's
// continued fraction CF2 for K_ν, K_{ν+1} at ν = −1/3 (I. J. Thompson
// and A. R. Barnett, J. Comput. Phys. 64, 490 (1986); in the form of W. H.
// Press et al., Numerical Recipes, 2nd ed., §6.7, from memory; checked in
// the tests against the series, the asymptotic expansion and the
// Wronskian), which gives
//
//	K_{2/3}/K_{1/3} = 1 + (1/6 − h)/ζ,   K_{1/3} = √(π/(2ζ)) e^(−ζ)/S,
//
// and so u = −√z (1 + r), u² − z = z r (2 + r), r = (1/6 − h)/ζ > 0.
func aiAt(z float64) aiPos {
	a := aiPos{z: z, zeta: 2.0 / 3 * z * math.Sqrt(z)}
	if z <= aiMaclaurin {
		m := airyAt(z)
		e := math.Exp(-a.zeta)
		ai, aip := m.ai*e, m.aip*e // Ai, Ai′ themselves (ζ ≤ 2/3)
		a.u = aip / ai
		a.w = a.u*a.u - z
		a.lnAi = math.Log(ai) + a.zeta
		return a
	}
	h, s := steedCF2(a.zeta, -1.0/3)
	r := (1.0/6 - h) / a.zeta
	a.u = -math.Sqrt(z) * (1 + r)
	a.w = z * r * (2 + r)
	// e^ζ Ai = (1/π)√(z/3) √(π/(2ζ)) / S.
	a.lnAi = math.Log(math.Sqrt(z/3) * math.Sqrt(math.Pi/(2*a.zeta)) / (math.Pi * s))
	return a
}

// steedCF2 returns h and S of Steed's algorithm for K_ν(x), |ν| ≤ 1/2:
// K_ν = √(π/(2x)) e^(−x)/S and K_{ν+1}/K_ν = (ν + x + ½ − h)/x.
func steedCF2(x, nu float64) (h, s float64) {
	b := 2 * (1 + x)
	d := 1 / b
	h = d
	delh := d
	q1, q2 := 0.0, 1.0
	a1 := 0.25 - nu*nu
	q, c := a1, a1
	a := -a1
	s = 1 + q*delh
	for i := 1; i < 10000; i++ {
		fi := float64(i)
		a -= 2 * fi
		c = -a * c / (fi + 1)
		qnew := (q1 - b*q2) / a
		q1, q2 = q2, qnew
		q += c * qnew
		b += 2
		d = 1 / (b + a*d)
		delh = (b*d - 1) * delh
		h += delh
		dels := q * delh
		s += dels
		if math.Abs(dels) < 1e-17*math.Abs(s) && math.Abs(delh) < 1e-17*math.Abs(h) {
			break
		}
	}
	return a1 * h, s
}
