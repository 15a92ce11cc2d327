package wkb

import (
	"fmt"
	"math"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/internal/squarewell"
)

// finiteWavefunction is [Solver.Wavefunction] for a single finite well.
func (s Solver) finiteWavefunction(f float64, n int) (tiltwell.Wavefunction, error) {
	st, af, mirrored := s.Stack.Fold(f)
	var w tiltwell.Wavefunction
	if af < tinyField {
		sw, err := squarewell.FromStack(st)
		if err != nil {
			return nil, &tiltwell.ConfinedError{Method: "wkb", F: f, Asked: n, Confined: 0, Why: "a barrier is not above the well, so nothing is bound at zero field"}
		}
		state, err := sw.State(n)
		if err != nil {
			c := sw.Count()
			return nil, &tiltwell.ConfinedError{Method: "wkb", F: f, Asked: n, Confined: c, Why: fmt.Sprintf("level %d: above the lower barrier at zero field", c+1)}
		}
		w = state
	} else {
		wl := newWell(st, af)
		_, p, err := wl.scanLevels(nil, f, n, false)
		if err != nil {
			return nil, err
		}
		e := p.e
		if s.Plain {
			e, _ = wl.plainE(n, p.e)
		}
		w = newFiniteWave(wl, e, n)
	}
	if mirrored {
		return tiltwell.Mirror(w, n), nil
	}
	return w, nil
}

// finiteWave is the wavefunction of a level of a single finite well at
// f > 0 (folded), at the connection rule's real level e = η + f/2:
//
//	ξ < 0:      φ(0) M_b(z)/M_b(z_L),         z = z_L + s_L ξ
//	0 ≤ ξ ≤ 1:  A M(x) sin(θ(x) − θ(x₁) + g_R),  x = (fξ − e)/ε_A
//	ξ > 1:      φ(1) Ai(z)/Ai(z_R),            z = z_R + s_R (ξ − 1)
//
// with s_b = (π² μ_b f)^(1/3). In the well it is the uniform (Langer)
// solution, which for the linear potential is the Airy-function solution,
// with the phase g_R that matches the decaying Ai of the uphill barrier
// (BenDaniel–Duke, to all digits). In the downhill barrier it follows the
// modulus M_b of the outgoing wave Bi + i Ai, whose log-derivative the
// level matched (the growing exponential (1/√κ) e^(∫κ) away from the
// turning point, finite at it); past the turning point ξ_t = −(v_L − e)/f
// M_b is the amplitude of the escaping wave. φ is normalized over
// [ξ_t, ∞), with the barrier tails in closed form (∫M² dz =
// z M² − M′² − 1/(π²M²) from M″ = zM + 1/(π²M³), and ∫Ai² dz =
// z Ai² − Ai′², DLMF 9.11.15 with 9.2.1; from memory) and the well by
// composite Gauss–Legendre quadrature as for hard walls.
type finiteWave struct {
	w      well
	n      int
	e      float64
	x0, x1 float64
	sw     float64 // (π² f)^(1/3) = dx/dξ
	// The uphill end: θ(x₁) and the step phase g_R, or, for x₁ past
	// airyHi, the scaled Ai, Bi at x₁ and g̃ = g_R e^(2ζ₁).
	th1, beta1, gR float64
	scaled         bool
	a1, b1, z1, gt float64
	amp            float64 // A
	phi0, phi1     float64 // φ(0), φ(1)
	zL, sL, lnMzL  float64
	zR, sR, lnAizR float64
	lo, hi         float64 // support
}

func newFiniteWave(w well, e float64, n int) *finiteWave {
	fw := &finiteWave{w: w, n: n, e: e}
	f := w.f
	fw.sw = f * w.invEa
	fw.x0, fw.x1 = -e*w.invEa, (f-e)*w.invEa
	x1 := fw.x1
	_, _, y1, l1, _ := airyWall(x1)
	fw.zR = min(max(w.cR*(w.vR-e+f)*w.invEa, 0), maxAiryArg)
	lam, dlam := airyAiLog(fw.zR)
	X1 := l1 - w.qR*lam
	switch {
	case x1 < airyLo:
		fw.beta1, _, _ = airyNeg(x1)
		fw.gR = math.Atan2(y1, X1)
	case x1 <= airyHi:
		fw.th1, _ = airyTheta(x1)
		fw.gR = math.Atan2(y1, X1)
	default:
		fw.scaled = true
		fw.a1, fw.b1, fw.z1 = airyScaledPos(x1)
		// y₁ e^(2ζ₁) = 1/(π (Bi e^(−ζ₁))²); the angle is tiny.
		fw.gt = 1 / (math.Pi * fw.b1 * fw.b1 * X1)
	}
	fw.zL = min(w.cL*(w.vL-e)*w.invEa, maxAiryArg)
	fw.sL = w.cL * fw.sw
	fw.sR = w.cR * fw.sw
	fw.lnMzL = airyLnM(fw.zL)
	fw.lnAizR = airyLnAi(fw.zR)
	r0, r1 := fw.raw(0), fw.raw(1)
	// Norm in units of A².
	nl := r0 * r0 / fw.sL * tailM(fw.zL)
	// ∫_z^∞ Ai² = Ai′² − z Ai² (DLMF 9.11.15 with 9.2.1; from memory):
	// in units of Ai(z_R)², λ² − z_R = −dλ/dz.
	nr := r1 * r1 / fw.sR * (-dlam)
	norm := fw.wellNormSq() + nl + nr
	fw.amp = 1 / math.Sqrt(norm)
	if r0 < 0 {
		fw.amp = -fw.amp
	}
	fw.phi0, fw.phi1 = fw.amp*r0, fw.amp*r1
	fw.lo = -fw.leftDepth()
	fw.hi = 1 + fw.tailLength()
	return fw
}

// Support returns the interval over which φ is normalized: from the
// downhill turning point (or, for a narrow level, from where the tail
// towards it holds less than 1e-17) to where the uphill tail holds less
// than 1e-17.
func (fw *finiteWave) Support() (lo, hi float64) { return fw.lo, fw.hi }

// At returns φ(ξ) (0 for NaN ξ).
func (fw *finiteWave) At(xi float64) float64 {
	switch {
	case math.IsNaN(xi):
		return 0
	case xi < 0:
		return fw.phi0 * math.Exp(lnMRatio(fw.zL, fw.sL*xi, fw.lnMzL))
	case xi > 1:
		if fw.phi1 == 0 {
			return 0
		}
		return fw.phi1 * math.Exp(lnAiRatio(fw.zR, fw.sR*(xi-1), fw.lnAizR))
	}
	return fw.amp * fw.raw(xi)
}

// raw returns φ/A in the well.
func (fw *finiteWave) raw(xi float64) float64 {
	w := &fw.w
	x := fw.x0 + fw.sw*xi
	if fw.scaled && x > airyHi {
		// M sin(θ − θ₁ + g_R) with all three tiny: Ai(x) − Bi(x)(Ai/Bi(x₁) − g_R)
		// (DLMF 9.7.5, 9.7.7), scaled by e^(∓ζ).
		a, b, z := airyScaledPos(x)
		return math.Exp(-z) * (a - b*(fw.a1/fw.b1-fw.gt)*math.Exp(2*(z-fw.z1)))
	}
	var m2, r float64
	switch {
	case x < airyLo:
		beta, mm, z := airyNeg(x)
		m2 = mm
		if fw.x1 < airyLo {
			// ∫_ξ^1 k dξ′ in the difference form (no cancellation at
			// small f), and the phase corrections β.
			r = actionDiff(fw.e-w.f*xi, fw.e-w.f, 1-xi) - beta + fw.beta1
		} else {
			r = math.Pi/4 + z - beta - fw.theta1()
		}
	default:
		th, mm := airyTheta(x)
		m2 = mm
		r = th - fw.theta1()
	}
	g := fw.gR
	if fw.scaled {
		g = fw.gt * math.Exp(-2*fw.z1)
	}
	return math.Sqrt(m2) * math.Sin(r+g)
}

// theta1 returns θ(x₁) for x₁ ≥ airyLo.
func (fw *finiteWave) theta1() float64 {
	if fw.scaled {
		return fw.a1 / fw.b1 * math.Exp(-2*fw.z1)
	}
	return fw.th1
}

// wellNormSq returns ∫₀¹ (φ/A)² dξ by composite Gauss–Legendre
// quadrature, with panels no wider than one radian of phase or one Airy
// length, cut 15 Airy lengths past a turning point inside the well.
func (fw *finiteWave) wellNormSq() float64 {
	return panelNormSq(fw.raw, fw.e, fw.w.f, fw.w.ea, 1/fw.sw)
}

// tailLength returns the depth into the uphill barrier beyond which its
// tail holds less than 1e-17, from ∫_z^∞ Ai² ≈ Ai(z)²/(2√z).
func (fw *finiteWave) tailLength() float64 {
	q := fw.phi1 * fw.phi1 / (2 * fw.sR * math.Sqrt(max(fw.zR, 0.1)))
	if !(q > 1e-17) {
		return 0
	}
	dz := 0.5 * math.Log(q/1e-17)
	if fw.zR > 1e6 {
		return dz / (math.Sqrt(fw.zR) * fw.sR)
	}
	z0 := 2.0 / 3 * fw.zR * math.Sqrt(fw.zR)
	z := math.Cbrt(1.5 * (z0 + dz) * 1.5 * (z0 + dz))
	return (z - fw.zR) / fw.sR
}

// leftDepth returns how far the support reaches into the downhill
// barrier: to its turning point, or, for a narrow level, to where the tail
// beyond holds less than 1e-17, from ∫₀^z M² dz′ ≈ M(z)²/(2√z).
func (fw *finiteWave) leftDepth() float64 {
	q := fw.phi0 * fw.phi0 / (2 * fw.sL * math.Sqrt(max(fw.zL, 0.1)))
	return depth(fw.zL, fw.sL, 0.5*math.Log(max(q, 1e-300)/1e-17))
}

// depth returns the distance, in ξ, from z (the Airy coordinate at an
// interface, s its scale dz/dξ) to the point where ζ is less by dz, or
// to z = 0 if ζ(z) ≤ dz; dz ≤ 0 gives 0. For large z it uses
// ζ(z) − ζ(z − d) ≈ √z d, without cancellation.
func depth(z, s, dz float64) float64 {
	if !(dz > 0) {
		return 0
	}
	zeta := 2.0 / 3 * z * math.Sqrt(z)
	if zeta <= dz {
		return z / s
	}
	if z > 1e6 {
		return dz / (math.Sqrt(z) * s)
	}
	zc := zeta - dz
	return (z - math.Cbrt(1.5*zc*1.5*zc)) / s
}

// zetaDiff returns ζ(z + d) − ζ(z), ζ = (2/3) z^(3/2), for z, z + d ≥ 0,
// in a form that does not cancel when d is small next to z.
func zetaDiff(z, d float64) float64 {
	a := z + d
	ra, rz := math.Sqrt(a), math.Sqrt(z)
	if ra+rz == 0 {
		return 0
	}
	return 2.0 / 3 * d * (a + ra*rz + z) / (ra + rz)
}

// lnMRatio returns ln M(z + d) − ln M(z), given lnMz = ln M(z): past
// airyHi from the scaled Bi, with the exponents' difference from
// [zetaDiff].
func lnMRatio(z, d, lnMz float64) float64 {
	if z > airyHi && z+d > airyHi {
		_, b0, _ := airyScaledPos(z)
		_, b1, _ := airyScaledPos(z + d)
		return math.Log(b1/b0) + zetaDiff(z, d)
	}
	return airyLnM(z+d) - lnMz
}

// lnAiRatio returns ln Ai(z + d) − ln Ai(z) for z, z + d ≥ 0, given
// lnAiz = ln Ai(z), likewise.
func lnAiRatio(z, d, lnAiz float64) float64 {
	if z > airyHi && z+d > airyHi {
		a0, _, _ := airyScaledPos(z)
		a1, _, _ := airyScaledPos(z + d)
		return math.Log(a1/a0) - zetaDiff(z, d)
	}
	return airyLnAi(z+d) - lnAiz
}

// airyLnM returns ln M(x), M² = Ai² + Bi² (DLMF 9.8.3).
func airyLnM(x float64) float64 {
	switch {
	case x < airyLo:
		_, m2, _ := airyNeg(x)
		return 0.5 * math.Log(m2)
	case x <= airyHi:
		_, m2 := airyTab(x)
		return 0.5 * math.Log(m2)
	}
	// M = Bi (1 + Ai²/Bi²)^(1/2), Ai²/Bi² < 1e-47.
	_, b, z := airyScaledPos(x)
	return math.Log(b) + z
}

// airyLnAi returns ln Ai(z) for z ≥ 0.
func airyLnAi(z float64) float64 {
	if z <= airyHi {
		th, m2 := airyTab(z)
		return 0.5*math.Log(m2) + math.Log(math.Sin(th))
	}
	a, _, zz := airyScaledPos(z)
	return math.Log(a) - zz
}

// tailM returns ∫₀^z M² dz′/M(z)² for z ≥ 0: from the identity
// d/dz [z M² − M′² − 1/(π²M²)] = M² (M″ = z M + 1/(π²M³), DLMF 9.8.14
// with 9.2.1), z − l² − y² + (M(0)/M(z))² (l₀² + y₀²) with l = M′/M and
// y = 1/(πM²). For z past airyHi, z − l² is formed from the series,
// z (U − V)(U + V)/U² with l = √z V/U (DLMF 9.7.7–9.7.8), which does not
// cancel.
func tailM(z float64) float64 {
	y0, l0 := airyModLog(0)
	if z <= airyHi {
		y, l := airyModLog(z)
		_, m20 := airyTab(0)
		_, m2 := airyTab(z)
		return z - l*l - y*y + m20/m2*(l0*l0+y0*y0)
	}
	c := airyCoefs()
	s := math.Sqrt(z)
	zeta := 2.0 / 3 * z * s
	u, v := asymSum(&c.u, 1/zeta), asymSum(&c.v, 1/zeta)
	d := 0.0 // U − V = Σ (u_k − v_k) ζ^(−k), all terms positive
	p := 1.0
	for k := 1; k < airyTerms; k++ {
		p /= zeta
		t := (c.u[k] - c.v[k]) * p
		d += t
		if t < 1e-18*d {
			break
		}
	}
	return z * d * (u + v) / (u * u)
}
