package wkb

import (
	"math"
	"sync"

	"github.com/tiltwell/tiltwell"
	"gonum.org/v1/gonum/integrate/quad"
)

// Wavefunction returns the normalized wavefunction of level n at reduced
// field f, at the energy of the rule the Solver selects. With a finite
// well it covers the whole line and implements [tiltwell.Spread] (see the
// package documentation, "Finite barriers"); for infinite walls it is the
// uniform
// (Langer) form of the level, which for the linear potential of the well is
// built from the Airy modulus M and phase θ (DLMF §9.8):
//
//	φ(ξ) = C M(x) sin(c [θ(x₀) − θ(x)]),   c = nπ / (θ(x₀) − θ(x₁)),
//
// with x = (f ξ − e)/(f/π)^(2/3) the Airy coordinate of ξ (x₀, x₁ those of
// the walls). Away from the turning point M ∝ k^(−1/2) and
// θ(x₀) − θ(x) = ∫₀^ξ k dξ′ + O(1/ζ) (DLMF 9.8.20, 9.8.22): this is the WKB
// form sin(∫₀^ξ k)/√k started at the low wall. Near the turning point it is
// the Airy-function solution, and past it the decaying one. The factor c
// spreads the phase mismatch of the approximate level over the well, so that
// φ vanishes at both walls and has n − 1 nodes; c = 1 exactly at a true
// level, and c − 1 is of the order of the level's error (so a wavefunction
// at a plain-rule level is correspondingly rougher). Past the turning point
// the form is evaluated as M sin(c[θ(x) − θ(x₁)]), which does not lose the
// exponentially small tail to cancellation.
//
// C > 0 normalizes ∫₀¹ φ² dξ = 1. It is computed once, by composite 16-point
// Gauss–Legendre quadrature with panels no wider than one radian of phase or
// one Airy length (π² f)^(−1/3), over [0, 1] cut 15 Airy lengths past the
// turning point (φ² is below 1e-30 of its peak there); its error is below
// 1e-13. Construction costs O(n) evaluations, each At one Airy evaluation.
//
// Errors follow the rules of [Solver.Levels], with k replaced by n.
//
// Special cases are:
//
//	Wavefunction(0, n) = √2 sin(nπξ)
//	Wavefunction(−f, n) = (−1)^(n+1) φ_n(1 − ξ; f), by [tiltwell.Mirror]
func (s Solver) Wavefunction(f float64, n int) (tiltwell.Wavefunction, error) {
	if err := tiltwell.CheckArgs("wkb", f, n, MaxLevels, MaxField); err != nil {
		return nil, err
	}
	if !s.Stack.Infinite() {
		if err := checkStack(s.Stack); err != nil {
			return nil, err
		}
		return s.finiteWavefunction(f, n)
	}
	af, mirrored := tiltwell.Fold(f)
	if af < tinyField {
		fn := float64(n)
		return tiltwell.WaveFunc(func(xi float64) float64 {
			return math.Sqrt2 * math.Sin(fn*math.Pi*xi)
		}), nil
	}
	var e float64
	if s.Plain {
		e = plainE(af, n)
	} else {
		var err error
		if e, _, err = connectE(af, airyEnergy(af), n); err != nil {
			return nil, err
		}
	}
	w := newWave(af, e, n)
	if mirrored {
		return tiltwell.Mirror(w, n), nil
	}
	return w, nil
}

// wave is the uniform wavefunction at field f > 0 and e = η + f/2.
type wave struct {
	n        int
	f, e, ea float64
	x0, x1   float64
	// θ(x₀) as π/4 + ζ₀ − β₀ (x₀ < airyLo) or from the table; θ(x₁)
	// likewise, or as Ai/Bi from the scaled pair (a1, b1, z1) past airyHi.
	th0, beta0 float64
	th1, beta1 float64
	a1, b1, z1 float64
	total      float64 // θ(x₀) − θ(x₁)
	c          float64 // nπ / total
	sign       float64 // (−1)^(n+1)
	norm       float64 // C
}

func newWave(f, e float64, n int) *wave {
	w := &wave{n: n, f: f, e: e, ea: math.Cbrt(f / math.Pi * f / math.Pi), sign: 1, norm: 1}
	if n%2 == 0 {
		w.sign = -1
	}
	w.x0, w.x1 = -e/w.ea, (f-e)/w.ea
	if w.x0 < airyLo {
		var z0 float64
		w.beta0, _, z0 = airyNeg(w.x0)
		w.th0 = math.Pi/4 + z0 - w.beta0
	} else {
		w.th0, _ = airyTheta(w.x0)
	}
	switch {
	case w.x1 < airyLo:
		w.beta1, _, _ = airyNeg(w.x1)
		s, _ := action(f, e)
		w.total = math.Pi*s - w.beta0 + w.beta1 // difference form: no cancellation at small f
	case w.x1 <= airyHi:
		w.th1, _ = airyTheta(w.x1)
		w.total = w.th0 - w.th1
	default:
		w.a1, w.b1, w.z1 = airyScaledPos(w.x1)
		w.th1 = w.a1 / w.b1 * math.Exp(-2*w.z1)
		w.total = w.th0 - w.th1
	}
	w.c = float64(n) * math.Pi / w.total
	w.norm = 1 / math.Sqrt(w.normSq())
	return w
}

// actionDiff returns (2π/(3f)) (a^(3/2) − b^(3/2)) for a ≥ b ≥ 0 with
// a − b = f d, in the form (2π/3) d (a + √(ab) + b)/(√a + √b).
func actionDiff(a, b, d float64) float64 {
	ra, rb := math.Sqrt(a), math.Sqrt(b)
	if ra+rb == 0 {
		return 0
	}
	return 2 * math.Pi / 3 * d * (a + ra*rb + b) / (ra + rb)
}

// At returns φ(ξ) for ξ in [0, 1] and 0 elsewhere.
func (w *wave) At(xi float64) float64 {
	if !(xi >= 0 && xi <= 1) {
		return 0
	}
	return w.norm * w.raw(xi)
}

// raw returns φ/C.
func (w *wave) raw(xi float64) float64 {
	b := w.e - w.f*xi // kinetic energy at ξ
	x := -b / w.ea
	var m, left, right float64
	switch {
	case x < airyLo:
		beta, m2, _ := airyNeg(x)
		m = math.Sqrt(m2)
		left = actionDiff(w.e, b, xi) - w.beta0 + beta
		if w.x1 < airyLo {
			right = actionDiff(b, w.e-w.f, 1-xi) - beta + w.beta1
		} else {
			right = w.total - left
		}
	case x <= airyHi:
		th, m2 := airyTheta(x)
		m = math.Sqrt(m2)
		left, right = w.th0-th, th-w.th1
	default:
		// Past the table both Ai/Bi < 1e-23, so sin(c R) = c R and
		// M R = Ai(x) − Bi(x) Ai(x₁)/Bi(x₁) (DLMF 9.7.5, 9.7.7).
		if x >= w.x1 {
			return 0 // the wall; the form below is zero there up to rounding
		}
		a, bs, z := airyScaledPos(x)
		return w.sign * w.c * math.Exp(-z) * (a - math.Exp(2*(z-w.z1))*bs*w.a1/w.b1)
	}
	if left <= right {
		return m * math.Sin(w.c*max(left, 0))
	}
	return w.sign * m * math.Sin(w.c*max(right, 0))
}

// legendre16 holds the 16-point Gauss–Legendre rule on [−1, 1]; it must not
// be modified.
var legendre16 = sync.OnceValue(func() *[2][16]float64 {
	r := new([2][16]float64)
	quad.Legendre{}.FixedLocations(r[0][:], r[1][:], -1, 1)
	return r
})

// normSq returns ∫₀¹ (φ/C)² dξ by composite Gauss–Legendre quadrature.
func (w *wave) normSq() float64 {
	ell := 1 / math.Cbrt(math.Pi*math.Pi*w.f) // Airy length in ξ
	return panelNormSq(w.raw, w.e, w.f, w.ea, ell)
}

// panelNormSq returns ∫₀^end raw(ξ)² dξ, end = min(1, (e + 15 ea)/f), by
// composite 16-point Gauss–Legendre quadrature on panels no wider than
// ell (an Airy length) or one radian of the phase √(e − fξ) π ξ: the
// norm of a wavefunction of energy e in the tilt fξ, cut 15 Airy lengths
// (ea in energy) past a turning point inside [0, 1].
func panelNormSq(raw func(float64) float64, e, f, ea, ell float64) float64 {
	gl := legendre16()
	end := min(1, (e+15*ea)/f)
	sum := 0.0
	for a := 0.0; a < end; {
		h := ell
		if k := math.Pi * math.Sqrt(math.Abs(e-f*a)); k*h > 1 {
			h = 1 / k
		}
		b := min(a+h, end)
		if end-b < 1e-3*h {
			b = end
		}
		mid, half := (a+b)/2, (b-a)/2
		p := 0.0
		for i, t := range gl[0] {
			v := raw(mid + half*t)
			p += gl[1][i] * v * v
		}
		sum += half * p
		a = b
	}
	return sum
}
