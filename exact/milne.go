package exact

import "math"

// The transfer across a classically allowed stretch of a layer at f > 0
// (z ≤ 0 throughout) in the amplitude–phase (Milne) form of the Airy
// solutions. Any real solution is φ = ρ M(z) sin ω(z) with ω = ω_a +
// Θ(z_a) − Θ(z), M the Airy modulus and Θ the continuous phase (DLMF
// 9.8.3–9.8.4, Θ′ = −1/(πM²), DLMF 9.8.14). With the local scale
// ĸ = (s/μ)/(πM²) and the modulus' log-derivative Λ = (s/μ)M′/M (both in
// the physical variables φ, w = φ′/μ),
//
//	tan ω = ĸφ/(w − Λφ),
//
// so that, with Δ = Θ(z_a) − Θ(z_b), r = M(z_b)/M(z_a) and
//
//	P = ĸ_a φ cos Δ + (w − Λ_a φ) sin Δ,   Q = (w − Λ_a φ) cos Δ − ĸ_a φ sin Δ,
//
// the state at the far end is φ_b = r P/ĸ_a, w_b = Λ_b φ_b + Q/r. At f = 0
// this is the rotation of the zero-field layer (r = 1, Λ = 0, ĸ = k/μ,
// Δ = kw). The phases are formed in double-double from the node table or
// the modulus–phase expansion (phaseDD), so that Δ keeps its accuracy
// however large Θ is; the stretch is taken this way when it spans at least
// one unit of z (shorter ones are Taylor steps, where the derivative
// c(p_a − p_b) of Δ would cancel).

// milneEnd is the Airy modulus and phase data at one end of a stretch.
type milneEnd struct {
	theta dd      // Θ(z)
	m2    float64 // M²
	mp    float64 // M′/M (d/dz)
	kz    float64 // z + 1/(π²M⁴) = M″/M, formed without cancellation
}

// milneAt returns the data at z ≤ 0 (z = zd.hi + zd.lo).
func milneAt(zd dd) milneEnd {
	z := zd.hi
	if z <= -negStart {
		x := ddNeg(zd)
		sx := ddSqrt(x)
		w, tc, _ := negModPhase(x.hi)
		lead := ddMul(ddMul(x, sx), ddTwo3)
		th := ddAdd(ddAdd(ddPi4, lead), dd{tc, 0})
		// M² = w/(π√x); d ln M/dz = −d ln M/dx = 1/(4x) − w′/(2w).
		dw := negDW(x.hi) / x.hi
		// z + 1/(π²M⁴) = −x + x/w² = −x(w − 1)(w + 1)/w², with w − 1
		// summed directly.
		wm1 := negPoly(&negM, 1/(x.hi*x.hi*x.hi))
		return milneEnd{theta: th, m2: w / (math.Pi * sx.hi), mp: 0.25/x.hi - dw/(2*w), kz: -x.hi * wm1 * (w + 1) / (w * w)}
	}
	s, cs, ds, cp, dp := tableCDD(zd)
	q := cs*cs + ds*ds
	// c² + d² = M_j² M², cc′ + dd′ = M_j² M M′.
	m2 := q / s.m2
	return milneEnd{
		theta: ddAdd(dd{s.theta, s.thetaLo}, dd{math.Atan2(cs, ds), 0}),
		m2:    m2,
		mp:    (cs*cp + ds*dp) / q,
		kz:    z + 1/(math.Pi*math.Pi*m2*m2),
	}
}

// milnePart carries st from x0 to x1 (either direction) across a stretch
// of a layer (edge v, mass mu) where the deficit q = v + f(ξ − ½) − η is
// nowhere positive, at f > 0.
func milnePart(st *rstate, x0, x1, v, mu, f, eta float64, ls *layerScale) {
	// z = c q in double-double from the exact product f(x − ½).
	zAt := func(x float64) dd {
		p, e := twoProd(f, x-0.5)
		s1, e1 := twoSum(v, -eta)
		qd := ddAdd(dd{p, e}, dd{s1, e1})
		return ddMulF(qd, ls.c)
	}
	a := milneAt(zAt(x0))
	b := milneAt(zAt(x1))
	sm := ls.s / mu
	c := ls.c
	// Δ = Θ(z_a) − Θ(z_b) and its η-derivative c(p_a − p_b), p = 1/(πM²).
	delta := ddAdd(a.theta, ddNeg(b.theta)).hi
	pa, pb := 1/(math.Pi*a.m2), 1/(math.Pi*b.m2)
	deltad := c * (pa - pb)
	// ĸ = (s/μ)p: dĸ/dη = 2cĸ M′/M. Λ = (s/μ)M′/M: dΛ/dη =
	// −c(s/μ)(1/(π²M⁴) + z − (M′/M)²). r = M_b/M_a: dr/dη = −c r (M′_b/M_b −
	// M′_a/M_a).
	ka := dual{sm * pa, 2 * c * sm * pa * a.mp}
	la := dual{sm * a.mp, -c * sm * (a.kz - a.mp*a.mp)}
	lb := dual{sm * b.mp, -c * sm * (b.kz - b.mp*b.mp)}
	r := math.Sqrt(b.m2 / a.m2)
	rd := -c * r * (b.mp - a.mp)
	u, w := st.u, st.w
	// y = w − Λ_a φ and x = ĸ_a φ.
	y := dual{w.v - la.v*u.v, w.d - la.d*u.v - la.v*u.d}
	x := dual{ka.v * u.v, ka.d*u.v + ka.v*u.d}
	sn, cs := math.Sincos(delta)
	P := dual{x.v*cs + y.v*sn, x.d*cs + y.d*sn + (-x.v*sn+y.v*cs)*deltad}
	Q := dual{y.v*cs - x.v*sn, y.d*cs - x.d*sn + (-y.v*sn-x.v*cs)*deltad}
	// φ_b = r P/ĸ_a, w_b = Λ_b φ_b + Q/r.
	rk := r / ka.v
	rkd := rd/ka.v - r*ka.d/(ka.v*ka.v)
	ub := dual{rk * P.v, rkd*P.v + rk*P.d}
	wb := dual{lb.v*ub.v + Q.v/r, lb.d*ub.v + lb.v*ub.d + Q.d/r - Q.v*rd/(r*r)}
	from := u.v
	st.u, st.w = ub, wb
	st.steps++
	if ad := math.Abs(delta); ad >= math.Pi {
		// Count from the phase: the angle of (w − Λφ, ĸφ) advances by
		// exactly Δ.
		kb := sm * pb
		a0 := lineAngle(x.v, y.v)
		a1 := lineAngle(kb*ub.v, wb.v-lb.v*ub.v)
		if delta < 0 {
			a0, a1 = a1, a0
		}
		st.nodes += int(math.Round((ad + a0 - a1) / math.Pi))
	} else if crossed(from, ub.v) {
		st.nodes++
	}
	st.renorm()
}
