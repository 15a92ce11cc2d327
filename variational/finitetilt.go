package variational

import (
	"math"

	"github.com/tiltwell/tiltwell/internal/squarewell"
)

// The one-parameter tilt of the finite-well ground state,
//
//	ψ_β(ξ) = φ₁(ξ) e^(−β(ξ−½)),
//
// φ₁ the zero-field ground state (internal/squarewell): A e^(κ_L ξ) in the
// left barrier, B sin(kξ + δ) in the well, C e^(−κ_R(ξ−1)) in the right
// one. This is the trial function of G. Bastard, E. E. Mendez, L. L.
// Chang and L. Esaki, Phys. Rev. B 28, 3241 (1983), who introduced it for
// finite wells. It stays normalizable for −κ_R < β < κ_L. Its energy is
// a closed form per region, derived here: with x = ξ − ½ and every
// integral scaled by e^(−|β|) (which cancels in the ratio and keeps the
// terms finite),
//
//	left,  a = κ_L − β:  N = A²e^β/(2a),   ∫xψ² = −A²e^β (1/(4a²) + 1/(4a)),
//	                     ∫ψ′²/(μ_L π²) = a² N/(μ_L π²);
//	right, b = κ_R + β:  N = C²e^(−β)/(2b), ∫xψ² = C²e^(−β)(1/(4b²) + 1/(4b)),
//	                     ∫ψ′²/(μ_R π²) = b² N/(μ_R π²);
//	well, u = kx + θ, θ = k/2 + δ:
//	     N = B²(I₀ − Re J₀)/2,  ∫xψ² = B²(I₁ − Re J₁)/2,
//	     ∫ψ′²/π² = (B²/π²)[(k² + β²)I₀/2 + (k² − β²)Re J₀/2 − kβ Im J₀],
//
// with I_m = ∫_{−½}^{½} x^m e^(−2βx) dx and J_m = e^(2iθ) ∫_{−½}^{½} x^m e^(zx) dx,
// z = −2β + 2ik: J₀ = e^(2iθ) 2 sinh(z/2)/z, J₁ = e^(2iθ)[cosh(z/2)/z −
// 2 sinh(z/2)/z²]. Then
//
//	E(β) = [Σ ∫ψ′²/(μπ²) + v_L N_L + v_R N_R + f Σ ∫xψ²] / Σ N.
//
// At β = 0 it is the zero-field level exactly. At f > 0 the problem has
// no bound state (the potential falls without limit to the left), and as
// β → κ_L the function spreads into the downhill barrier and E(β) → −∞:
// the one-parameter energy is a stationary value, a local minimum near
// the resonance, and not a bound.
type ftilt struct {
	st   squarewell.State
	w    squarewell.Well
	f    float64
	bmin float64 // −κ_R
	bmax float64 // κ_L
}

func newFtilt(w squarewell.Well, st squarewell.State, f float64) ftilt {
	// The right amplitude C = B sin(k + δ_L) loses its relative accuracy
	// when the barrier is tall (k + δ_L = π − δ_R with δ_R tiny); at the
	// root it is B sin δ_R, which keeps it.
	st.C = st.B * math.Sin(math.Atan2(w.MR*st.K, st.KR))
	return ftilt{st: st, w: w, f: f, bmin: max(-st.KR, -maxTilt), bmax: min(st.KL, maxTilt)}
}

// parts returns the norm Σ N and the numerator of E(β), both scaled by
// e^(−|β|).
func (t ftilt) parts(beta float64) (norm, num float64) {
	st, w, f := t.st, t.w, t.f
	ab := math.Abs(beta)
	pp := math.Pi * math.Pi
	// Left barrier.
	a := st.KL - beta
	al := st.A * st.A * math.Exp(beta-ab)
	nl := al / (2 * a)
	xl := -al * (1/(4*a*a) + 1/(4*a))
	tl := a * a * nl / (w.ML * pp)
	// Right barrier.
	b := st.KR + beta
	cr := st.C * st.C * math.Exp(-beta-ab)
	nr := cr / (2 * b)
	xr := cr * (1/(4*b*b) + 1/(4*b))
	tr := b * b * nr / (w.MR * pp)
	// Well.
	i0, i1 := tiltI(beta)
	j0, j1 := tiltJ(beta, st.K, st.K/2+st.DL)
	b2 := st.B * st.B
	k := st.K
	nw := b2 * (i0 - real(j0)) / 2
	xw := b2 * (i1 - real(j1)) / 2
	tw := b2 / pp * ((k*k+beta*beta)*i0/2 + (k*k-beta*beta)*real(j0)/2 - k*beta*imag(j0))
	norm = nl + nw + nr
	num = tl + tw + tr + w.VL*nl + w.VR*nr + f*(xl+xw+xr)
	return norm, num
}

// energy returns E(β); +Inf outside (−κ_R, κ_L) ∩ (−maxTilt, maxTilt).
func (t ftilt) energy(beta float64) float64 {
	if !(beta > t.bmin && beta < t.bmax) {
		return math.Inf(1)
	}
	n, e := t.parts(beta)
	return e / n
}

// value implements objective.
func (t *ftilt) value(beta float64) float64 { return t.energy(beta) }

// tiltI returns e^(−|β|) ∫_{−½}^{½} e^(−2βx) dx = e^(−|β|) sinh β/β and
// e^(−|β|) ∫ x e^(−2βx) dx = −e^(−|β|)(β cosh β − sinh β)/(2β²), from
// their series for |β| < 1.
func tiltI(beta float64) (i0, i1 float64) {
	ab := math.Abs(beta)
	if ab < 1 {
		e := math.Exp(-ab)
		b2 := beta * beta
		sh, term := 1.0, 1.0
		for m := 1; m <= 14; m++ {
			term *= b2 / float64(2*m*(2*m+1))
			sh += term
		}
		i0 = sh * e
		if beta != 0 {
			i1 = -bcoshMinusSinh(beta) / (2 * b2) * e
		}
		return i0, i1
	}
	e2 := math.Exp(-2 * ab)
	ch := (1 + e2) / 2                  // cosh β e^(−|β|)
	sh := math.Copysign((1-e2)/2, beta) // sinh β e^(−|β|)
	return sh / beta, -(beta*ch - sh) / (2 * beta * beta)
}

// tiltJ returns e^(−|β|) J₀ and e^(−|β|) J₁ (see ftilt).
func tiltJ(beta, k, theta float64) (j0, j1 complex128) {
	e2 := math.Exp(-2 * math.Abs(beta))
	ch := (1 + e2) / 2
	sh := math.Copysign((1-e2)/2, beta)
	sk, ck := math.Sincos(k)
	// sinh(z/2) = sinh(−β + ik), cosh(z/2) = cosh(−β + ik), scaled.
	shz := complex(-sh*ck, ch*sk)
	chz := complex(ch*ck, -sh*sk)
	z := complex(-2*beta, 2*k)
	s2, c2 := math.Sincos(2 * theta)
	ph := complex(c2, s2)
	j0 = ph * 2 * shz / z
	j1 = ph * (chz/z - 2*shz/(z*z))
	return j0, j1
}

// optimum minimizes E(β) from β = 0 and reports the tilt and energy, and
// false if the search slid into the downhill barrier (no stationary value
// below κ_L).
func (t *ftilt) optimum(guess float64) (beta, e float64, ok bool) {
	lo := t.bmin + 1e-6*(t.bmax-t.bmin)
	hi := t.bmax - 1e-6*(t.bmax-t.bmin)
	guess = math.Max(lo, math.Min(hi, guess))
	h := 0.02 * (t.bmax - t.bmin)
	a, b, c, _, fb, _ := bracketMin(t, guess, h, lo, hi)
	if b >= hi {
		return b, fb, false
	}
	beta, e = brent(t, a, b, c, fb, tiltRTol, tiltATol, 0, 200)
	return beta, e, !(beta >= hi-2*h*1e-3)
}
