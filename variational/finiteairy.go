package variational

import "math"

// The barriers of a finite well at f > 0 enter the trial space through
// the logarithmic derivatives of their exact solutions at the interfaces.
// In a barrier of height v and mass ratio μ the potential is
// v + f(ξ − ½), and with s = (π²μf)^(1/3) the solutions are the Airy
// functions of z = s·(v + f(ξ − ½) − η)/f (DLMF 9.2.1), which at the
// interface is z₀ = sV₀/f, V₀ = v ∓ f/2 − η the barrier's height above the
// level there. Writing κ₀ = π√(μV₀) for the local decay constant,
//
//	s√z₀ = κ₀,   ζ₀ = (2/3)z₀^(3/2) = 2κ₀³/(3π²μf),
//
// so every quantity below is formed from κ₀ and t = 1/ζ₀ = 3π²μf/(2κ₀³)
// once ζ₀ is large, and nothing overflows however small f is.
//
// Uphill (ξ > 1) the solution decays as Ai(z). Downhill (ξ < 0) the
// outgoing wave is Ai(z) − iBi(z) (DLMF 9.2.11 and 9.7.9–9.7.11: a wave
// travelling to ξ → −∞, time factor e^(−iEt/ħ)), with logarithmic
// derivative
//
//	s (Ai′ − iBi′)/(Ai − iBi) = s [M′/M − i/(πM²)],   M² = Ai² + Bi²
//
// (the imaginary part by the Wronskian W{Ai, Bi} = 1/π, DLMF 9.2.7; M is
// the modulus of DLMF 9.8.3). The level problem takes its real part, the
// logarithmic derivative of M, as the exact solver does for its real
// level; the imaginary part is the escape, which the real problem leaves
// out and the second-order shift and Γ₁ restore (finitelevel.go).

// Ai(0), −Ai′(0), Bi(0), Bi′(0) (DLMF 9.2.3–9.2.5; values to 20 digits
// from DLMF §9.2(ii), from memory, checked in the tests against the
// Wronskian and against the asymptotic expansions).
const (
	ai0  = 0.35502805388781723926
	aip0 = 0.25881940379280679840 // −Ai′(0)
	bi0  = 0.61492662744600073515
	bip0 = 0.44828835735382635791
)

// Switches between the Maclaurin series (and, for Ai, Steed's continued
// fraction) and the asymptotic expansions, as limits on t = 1/ζ: the
// expansions of Bi, whose terms are all positive, are good to about
// e^(−2ζ) relative, below 1e-18 for ζ > 21 (z > 10); those of Ai
// alternate and are used from ζ > 30 (z > 12.6), where they are good to
// 1e-18 with a dozen terms.
const (
	biAsymptotic = 1.0 / 21
	aiAsymptotic = 1.0 / 30
)

// maclaurin returns f, f′, g, g′ of DLMF 9.4.1–9.4.2,
//
//	f = Σ 3^k (1/3)_k z^(3k)/(3k)!,  g = Σ 3^k (2/3)_k z^(3k+1)/(3k+1)!,
//
// so that Ai = Ai(0) f + Ai′(0) g and Bi = Bi(0) f + Bi′(0) g (DLMF 9.4.1,
// 9.4.2). For z ≥ 0 every term is positive.
func maclaurin(z float64) (f, fp, g, gp float64) {
	z3 := z * z * z
	tf, tg := 1.0, z // the current terms of f and g
	f, g = 1, z
	fp, gp = 0, 1
	// The derivative of the term c z^(3k) is 3k c z^(3k−1): the term of f
	// times 3k/z, formed from the previous term as tf·z²/(3k−1) so that
	// z = 0 needs no special case; likewise g's (3k+1)c z^(3k).
	z2 := z * z
	for k := 1; k < 300; k++ {
		kk := float64(3 * k)
		pf, pg := tf, tg
		tf *= z3 / ((kk - 1) * kk)
		tg *= z3 / (kk * (kk + 1))
		fp += pf * z2 / (kk - 1)
		gp += pg * z2 / kk
		f += tf
		g += tg
		if math.Abs(tf) <= 1e-18*math.Abs(f) && math.Abs(tg) <= 1e-18*math.Abs(g) && math.Abs(pf*z2) <= 1e-18*math.Abs(fp)*(kk-1) {
			break
		}
	}
	return f, fp, g, gp
}

// airySmall holds Ai and Bi with their derivatives at one z in
// [0, 12.6], scaled by e^(±ζ) so that Bi does not overflow.
type airySmall struct {
	z, zeta float64
	ai, aip float64 // e^ζ Ai, e^ζ Ai′
	bi, bip float64 // e^(−ζ) Bi, e^(−ζ) Bi′
}

// airySmallAt sums the Maclaurin series at 0 ≤ z ≤ 12.6: Bi keeps full
// relative accuracy, Ai an absolute accuracy of about ε·Bi, which is all
// the combinations below need (Ai enters them only multiplied by Ai).
func airySmallAt(z float64) airySmall {
	a := airySmall{z: z, zeta: 2.0 / 3 * z * math.Sqrt(z)}
	f, fp, g, gp := maclaurin(z)
	e := math.Exp(-a.zeta)
	a.bi = (bi0*f + bip0*g) * e
	a.bip = (bi0*fp + bip0*gp) * e
	a.ai = (ai0*f - aip0*g) / e
	a.aip = (ai0*fp - aip0*gp) / e
	return a
}

// biSums returns the sums of the asymptotic expansions of Bi and Bi′
// (DLMF 9.7.7, 9.7.8) at t = 1/ζ,
//
//	U = Σ u_k t^k,  V = Σ v_k t^k,  D = (U − V)/t = Σ_{k≥1} (u_k − v_k) t^(k−1),
//
// with u_0 = v_0 = 1, u_k = (2k+1)(2k+3)…(6k−1)/(216^k k!) and
// v_k = −(6k+1)/(6k−1) u_k (DLMF 9.7.2), summed until the terms fall
// below 1e-18 or start to grow. D is formed termwise, without the
// cancellation of U − V.
func biSums(t float64) (u, v, d float64) {
	return airySums(t, 1)
}

// aiSums returns the same sums for Ai and Ai′ (DLMF 9.7.5, 9.7.6), whose
// terms alternate: U = Σ (−1)^k u_k t^k, V = Σ (−1)^k v_k t^k,
// D = (V − U)/t.
func aiSums(t float64) (u, v, d float64) {
	u, v, d = airySums(t, -1)
	return u, v, -d
}

func airySums(t, sign float64) (u, v, d float64) {
	u, v = 1, 1
	uk := 1.0 // u_k
	tk := 1.0 // (sign·t)^(k−1)
	prev := math.Inf(1)
	for k := 1; k < 60; k++ {
		// u_k/u_{k−1} = (6k−5)(6k−3)(6k−1)/((2k−1)·216·k).
		fk := float64(k)
		uk *= (6*fk - 5) * (6*fk - 3) * (6*fk - 1) / ((2*fk - 1) * 216 * fk)
		vk := -(6*fk + 1) / (6*fk - 1) * uk
		term := math.Abs(uk * tk * t)
		if term > prev {
			break
		}
		d += (uk - vk) * tk
		tk *= sign * t
		u += uk * tk
		v += vk * tk
		prev = term
		if term < 1e-18 {
			break
		}
	}
	return u, v, sign * d
}

// aiPos holds Ai and its logarithmic derivative at one z in [0, 12.6].
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

// aiAt evaluates Ai at 0 ≤ z ≤ 12.6. Up to aiMaclaurin it takes the
// Maclaurin series; beyond, the modified Bessel functions
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
		f, fp, g, gp := maclaurin(z)
		ai, aip := ai0*f-aip0*g, ai0*fp-aip0*gp
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

// barrierScale returns κ₀ = π√(μV₀), s = (π²μf)^(1/3) and t = 1/ζ₀ =
// 3π²μf/(2κ₀³) (+Inf at V₀ = 0) for a barrier of mass ratio μ whose
// potential lies V₀ ≥ 0 above the level at its interface.
func barrierScale(v0, mu, f float64) (kappa0, s, t float64) {
	pp := math.Pi * math.Pi
	kappa0 = math.Pi * math.Sqrt(mu*v0)
	s = math.Cbrt(pp * mu * f)
	t = 1.5 * pp * mu * f / (kappa0 * kappa0 * kappa0)
	return kappa0, s, t
}

// downhill is the downhill barrier's boundary term at one energy, with
// the escape data and what its wavefunction needs.
type downhill struct {
	side
	eps    float64 // u_i/u: the escape term relative to the real one (≤ 0)
	lnEps1 float64 // d ln(−ε)/dη (0 when ε = 0)
	kappa0 float64
	t      float64 // 1/ζ₀
	lnM0   float64 // ln M(z₀) − ζ₀
}

// downhillAt returns the downhill barrier's term for a barrier of mass
// ratio mu whose potential lies v0 ≥ 0 above the level at the interface,
// at field f > 0. With u = M′/M at z₀, k = s/(μπ²) and q = −dz₀/dη = s/f,
//
//	σ = k u,  σ′ = −k q u̇,  σ″ = k q² ü,
//	u̇ = z − u² + 1/(π²M⁴),  ü = 1 − 2u u̇ − 4u/(π²M⁴)
//
// (from M″ = zM + 1/(π²M³), derived here from M² = Ai² + Bi², Airy's
// equation and the Wronskian), the barrier's weight between its turning
// point and the interface per φ(0)², from ∫M²dz = zM² − M′² − 1/(π²M²)
// (differentiate, using the same equation),
//
//	[z₀ − u² − 1/(π²M₀⁴) + (M′(0)² + 1/(π²M(0)²))/M₀²]/s,
//
// and ε = −1/(πM²u) with d ln(−ε)/dη = 2qu + q u̇/u (d ln M²/dz = 2u).
// Once ζ₀ > 21, where M = Bi to below e^(−2ζ₀) relative, the same terms
// come from the asymptotic sums at t = 1/ζ₀ with s√z₀ = κ₀:
//
//	σ = κ₀V/(μπ²U),  σ′ = −(3/(2κ₀)) D(U + V)/U²,  weight = −σ′,
//	ln(πM²) = 2/t + 2 ln U − ln(κ₀/s).
func downhillAt(v0, mu, f float64) downhill {
	kappa0, s, t := barrierScale(v0, mu, f)
	pp := math.Pi * math.Pi
	dh := downhill{kappa0: kappa0, t: t}
	if t < biAsymptotic {
		// Every product below is formed so that s cancels analytically:
		// s underflows for the smallest fields.
		U, V, D := biSums(t)
		dh.sig = kappa0 * V / (mu * pp * U)
		dh.d1 = -1.5 / kappa0 * D * (U + V) / (U * U)
		dh.norm = -dh.d1
		uud := 1.5 * V * D * (U + V) / (U * U * U) // u·u̇
		dh.d2 = (1 - 2*uud) / f
		lnS := (math.Log(pp*mu) + math.Log(f)) / 3
		lnEsc := -2/t + math.Log(kappa0) - lnS - 2*math.Log(U)
		// ε = u_i/u = −e^lnEsc/u with u = (κ₀/s)V/U.
		dh.eps = -math.Exp(lnEsc-math.Log(kappa0)+lnS) * U / V
		if dh.eps != 0 {
			// 2qu + q u̇/u with q = s/f.
			dh.lnEps1 = 2*kappa0*V/(f*U) + pp*mu*1.5*D*(U+V)/(kappa0*kappa0*U*V)
		}
		dh.lnM0 = math.Log(U) - 0.5*math.Log(math.Pi) - 0.5*(math.Log(kappa0)-lnS)
		return dh
	} else {
		z := s * v0 / f
		q := s / f
		a := airySmallAt(z)
		e2 := math.Exp(-2 * a.zeta)
		e4 := e2 * e2
		Q := a.bi*a.bi + e4*a.ai*a.ai // M² e^(−2ζ)
		u := (a.bip*a.bi + e4*a.aip*a.ai) / Q
		mi := e4 / (pp * Q * Q) // 1/(π²M⁴)
		ud := z - u*u + mi
		udd := 1 - 2*u*ud - 4*u*mi
		k := s / (mu * pp)
		dh.sig = k * u
		dh.d1 = -k * q * ud
		dh.d2 = k * q * q * udd
		m02 := ai0*ai0 + bi0*bi0
		mp0 := (-ai0*aip0 + bi0*bip0) / math.Sqrt(m02)
		dh.norm = (z - u*u - mi + e2*(mp0*mp0+1/(pp*m02))/Q) / s
		lnEsc := -math.Log(math.Pi*Q) - 2*a.zeta
		dh.lnM0 = 0.5 * math.Log(Q)
		dh.eps = -math.Exp(lnEsc) / u
		if dh.eps != 0 {
			dh.lnEps1 = 2*q*u + q*ud/u
		}
	}
	return dh
}

// lnMRatio returns ln(M(z)/M(z₀)) at the distance x ≥ 0 into the downhill
// barrier (ξ = −x), for a barrier v0 above the level at the interface:
// ln M − ζ from the series or the expansion at each point, and
// ζ − ζ₀ = −(2x/3)(κ² + κκ₀ + κ₀²)/(κ + κ₀) = −(2x/3)(κ + κ₀²/(κ + κ₀))
// with κ = π√(μ(V₀ − fx)), which follows from ζ = 2κ³/(3π²μf) without
// cancellation (or overflow). Beyond the
// turning point it takes M from modulusNeg.
func (dh downhill) lnMRatio(v0, mu, f, x float64) float64 {
	vx := v0 - f*x
	if vx < 0 {
		_, s, _ := barrierScale(v0, mu, f)
		return math.Log(modulusNeg(-s*vx/f)) - dh.lnM0 - 1/dh.t
	}
	kappa, s, t := barrierScale(vx, mu, f)
	dz := -(2 * x / 3) * (kappa + dh.kappa0*dh.kappa0/(kappa+dh.kappa0))
	if t < biAsymptotic && dh.t < biAsymptotic {
		U, _, _ := biSums(t)
		U0, _, _ := biSums(dh.t)
		return math.Log(U/U0) - 0.5*math.Log(kappa/dh.kappa0) + dz
	}
	var lnM float64
	if t < biAsymptotic {
		U, _, _ := biSums(t)
		lnM = math.Log(U) - 0.5*math.Log(math.Pi) - 0.5*math.Log(kappa/s)
	} else {
		a := airySmallAt(s * vx / f)
		lnM = 0.5 * math.Log(a.bi*a.bi+math.Exp(-4*a.zeta)*a.ai*a.ai)
	}
	return lnM - dh.lnM0 + dz
}

// uphill is the uphill barrier's boundary term at one energy.
type uphill struct {
	side
	kappa0 float64
	t      float64
	decay  float64 // −s Ai′/Ai at z₀: the decay rate at the interface
	lnA0   float64 // ln Ai(z₀) + ζ₀
}

// uphillAt returns the uphill barrier's term for a barrier of mass ratio
// mu whose potential lies v0 ≥ 0 above the level at the interface, at
// field f > 0: with u = Ai′/Ai at z₀, k = s/(μπ²), q = s/f and
// w = u² − z = −du/dz,
//
//	σ = −k u,  σ′ = −k q w,  σ″ = −k q²(1 + 2uw),  weight = w/s
//
// (∫_z₀^∞ Ai² dz = Ai′(z₀)² − z₀Ai(z₀)², DLMF 9.11.15 for any solution of
// Airy's equation; from memory), and from ζ₀ > 30 the asymptotic sums at
// t = 1/ζ₀: σ = κ₀V/(μπ²U), weight = −σ′ = (3/(2κ₀))D(U + V)/U².
func uphillAt(v0, mu, f float64) uphill {
	kappa0, s, t := barrierScale(v0, mu, f)
	pp := math.Pi * math.Pi
	uh := uphill{kappa0: kappa0, t: t}
	if t < aiAsymptotic {
		U, V, D := aiSums(t)
		uh.sig = kappa0 * V / (mu * pp * U)
		uh.norm = 1.5 / kappa0 * D * (U + V) / (U * U)
		uh.d1 = -uh.norm
		uw := -1.5 * V * D * (U + V) / (U * U * U) // u·w, s cancelling
		uh.d2 = -(1 + 2*uw) / f
		uh.decay = kappa0 * V / U
		lnS := (math.Log(pp*mu) + math.Log(f)) / 3
		uh.lnA0 = -math.Log(2*math.Sqrt(math.Pi)) - 0.5*(math.Log(kappa0)-lnS) + math.Log(U)
		return uh
	}
	a := aiAt(s * v0 / f)
	k, q := s/(mu*pp), s/f
	uh.sig = -k * a.u
	uh.d1 = -k * q * a.w
	uh.d2 = -k * q * q * (1 + 2*a.u*a.w)
	uh.norm = a.w / s
	uh.decay = -s * a.u
	uh.lnA0 = a.lnAi
	return uh
}

// lnAiRatio returns ln(Ai(z)/Ai(z₀)) at the distance x ≥ 0 into the uphill
// barrier, for a barrier v0 above the level at the interface, with
// ζ − ζ₀ = (2x/3)(κ + κ₀²/(κ + κ₀)), κ = π√(μ(V₀ + fx)).
func (uh uphill) lnAiRatio(v0, mu, f, x float64) float64 {
	vx := v0 + f*x
	kappa, s, t := barrierScale(vx, mu, f)
	dz := (2 * x / 3) * (kappa + uh.kappa0*uh.kappa0/(kappa+uh.kappa0))
	if t < aiAsymptotic && uh.t < aiAsymptotic {
		U, _, _ := aiSums(t)
		U0, _, _ := aiSums(uh.t)
		return math.Log(U/U0) - 0.5*math.Log(kappa/uh.kappa0) - dz
	}
	var lnA float64
	if t < aiAsymptotic {
		U, _, _ := aiSums(t)
		lnA = -math.Log(2*math.Sqrt(math.Pi)) - 0.5*math.Log(kappa/s) + math.Log(U)
	} else {
		lnA = aiAt(s * vx / f).lnAi
	}
	return lnA - uh.lnA0 - dz
}
