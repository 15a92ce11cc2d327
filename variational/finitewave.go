package variational

import (
	"fmt"
	"math"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/internal/squarewell"
)

// finiteWavefunction returns the wavefunction of level n on a finite
// well; the arguments have been checked.
func (s Solver) finiteWavefunction(f float64, n int) (tiltwell.Wavefunction, error) {
	st, af, mirrored := s.Stack.Fold(f)
	w, err := squarewell.FromStack(st)
	if err != nil {
		return nil, fmt.Errorf("variational: %w", err)
	}
	var wf tiltwell.Wavefunction
	// The levels below n decide whether n is confined, as in Levels.
	fw := finitePool.Get().(*finiteWork)
	defer finitePool.Put(fw)
	if _, err := s.finiteBrackets(fw, fw.brackets[:0], f, n, nil); err != nil {
		return nil, err
	}
	switch {
	case af == 0:
		state, err := w.State(n)
		if err != nil {
			return nil, fmt.Errorf("variational: %w", err)
		}
		wf = state
	case s.Family == Tilt:
		state, err := w.State(1)
		if err != nil {
			return nil, fmt.Errorf("variational: %w", err)
		}
		t := newFtilt(w, state, af)
		beta, _, ok := t.optimum(0)
		if !ok {
			return nil, fmt.Errorf("variational: no stationary tilt at f = %g: %w", f, tiltwell.ErrLevel)
		}
		wf = newTiltWave(t, beta)
	default:
		// finiteBrackets built fw.large for k = n levels.
		sp := fw.large
		prev := math.Inf(-1)
		var lv flevel
		for m := 1; m <= n; m++ {
			lv = sp.level(m, prev)
			if !lv.ok {
				return nil, fmt.Errorf("variational: level %d at f = %g: %w", n, f, tiltwell.ErrLevel)
			}
			prev = lv.eta
		}
		wf = newFwave(sp, lv)
	}
	if mirrored {
		wf = tiltwell.Mirror(wf, n)
	}
	return wf, nil
}

// fwave is a level of the Poly space on a finite well at f > 0: the Ritz
// function in the well, regenerated at any ξ by the recurrence that built
// the basis, continued into the barriers by their solutions, φ ∝ M(z) on
// the downhill side (the modulus of the outgoing wave, whose logarithmic
// derivative the level problem uses) and φ ∝ Ai(z) on the uphill side. It
// is normalized between the downhill turning point and +∞, and is positive
// at ξ = 0.
type fwave struct {
	beta       float64
	pw, mL, mR int
	e0, e1, xr float64
	rec        []float64
	v          []float64 // coefficients of the basis
	psi0, psi1 float64
	f          float64
	vL, muL    float64 // downhill: height above the level at ξ = 0, mass
	vR, muR    float64 // uphill: likewise at ξ = 1
	xiT        float64 // the downhill turning point
	down       downhill
	up         uphill
	lo, hi     float64
}

func newFwave(sp *fspace, lv flevel) *fwave {
	p := sp.p
	dim := p.dim()
	w := &fwave{beta: p.beta, pw: p.pw, rec: make([]float64, p.pw*p.pw), v: make([]float64, dim), psi0: lv.psi0, psi1: lv.psi1}
	copy(w.rec, sp.rec[:p.pw*p.pw])
	w.mL, w.mR = 1, 1
	if p.beta > 1 {
		w.mR = min(p.pw+1, int(math.Ceil(p.beta)))
	} else if p.beta < -1 {
		w.mL = min(p.pw+1, int(math.Ceil(-p.beta)))
	}
	if p.beta < 0 {
		w.xr = 1
	}
	w.e0, w.e1 = math.Exp(-p.beta*(0-w.xr)), math.Exp(-p.beta*(1-w.xr))
	for j := range dim {
		for a := range dim {
			w.v[a] += lv.x[j] * sp.vecs[a*dim+j]
		}
	}
	w.f = p.f
	w.vL, w.muL = math.Max(0, (p.vL-p.f/2)-lv.eta), p.mL
	w.vR, w.muR = math.Max(0, (p.vR+p.f/2)-lv.eta), p.mR
	w.xiT = -w.vL / p.f
	w.down, w.up = lv.e.down, lv.e.up
	w.lo, w.hi = w.support()
	return w
}

// At returns φ(ξ); 0 for NaN and infinite ξ.
func (w *fwave) At(xi float64) float64 {
	switch {
	case math.IsNaN(xi) || math.IsInf(xi, 0):
		return 0
	case xi < 0:
		return w.psi0 * math.Exp(w.down.lnMRatio(w.vL, w.muL, w.f, -xi))
	case xi > 1:
		return w.psi1 * math.Exp(w.up.lnAiRatio(w.vR, w.muR, w.f, xi-1))
	}
	return w.well(xi)
}

// well evaluates the Ritz function in the well.
func (w *fwave) well(xi float64) float64 {
	env := math.Exp(-w.beta * (xi - w.xr))
	phi := w.v[0]*math.Pow(1-xi, float64(w.mL))*env/w.e0 + w.v[1]*math.Pow(xi, float64(w.mR))*env/w.e1
	if w.pw == 0 {
		return phi
	}
	var q [maxWellDim]float64
	m := 2*xi - 1
	q[0] = xi * (1 - xi) * env / w.rec[0]
	phi += w.v[2] * q[0]
	for j := 1; j < w.pw; j++ {
		u := m * q[j-1]
		for i := range j {
			u -= w.rec[j*w.pw+i] * q[i]
		}
		q[j] = u / w.rec[j*w.pw+j]
		phi += w.v[2+j] * q[j]
	}
	return phi
}

// Support implements [tiltwell.Spread]: the interval outside which ∫φ²
// is below 1e-16, starting no further left than the downhill turning
// point.
func (w *fwave) Support() (lo, hi float64) { return w.lo, w.hi }

func (w *fwave) support() (lo, hi float64) {
	const tiny = 1e-17
	hi = 1 + tailLength(w.psi1, w.up.decay, tiny)
	// Downhill: φ ∝ M rises from the turning point to the interface, so
	// ∫ from ξ_t to ξ is at most (ξ − ξ_t)φ(ξ)²; bisect for where that
	// is tiny. When the turning point is very far (the weakest fields,
	// where it may not even be finite), start instead where the tail is
	// already negligible: within 3V₀/(4f) of the interface the decay rate
	// is at least κ₀/2.
	a, b := w.xiT, 0.0
	if l := tailLength(w.psi0, w.down.kappa0/2, tiny); !(a > -1e6) && l < 0.75*w.vL/w.f {
		a = -2 * l
	}
	x0 := a
	g := func(x float64) float64 { v := w.At(x); return (x - x0) * v * v }
	if g(b) <= tiny {
		return b, hi
	}
	for range 80 {
		m := a + (b-a)/2
		if m == a || m == b {
			break
		}
		if g(m) > tiny {
			b = m
		} else {
			a = m
		}
	}
	return a, hi
}

// tailLength returns the distance beyond which a tail that starts at p
// and decays at least as fast as e^(−κd) holds less than tiny:
// p²e^(−2κd)/(2κ) ≤ tiny.
func tailLength(p, kappa, tiny float64) float64 {
	if !(kappa > 0) {
		return 0
	}
	wt := p * p / (2 * kappa)
	if !(wt > tiny) {
		return 0
	}
	return math.Log(wt/tiny) / (2 * kappa)
}

// modulusNeg returns M(−x) = √(Ai(−x)² + Bi(−x)²) for x > 0: from the
// Maclaurin series up to x = 8 (where the alternating terms cost about
// six digits), beyond from M²(−x) ~ (1/(π√x))(1 + 5/(32x³) + 1155/(2048x⁶))
// (DLMF 9.8.20, from memory). It serves the wavefunction beyond the
// downhill turning point, outside the interval it is normalized over.
func modulusNeg(x float64) float64 {
	if x > 8 {
		x3 := x * x * x
		return math.Sqrt((1 + 5/(32*x3) + 1155/(2048*x3*x3)) / (math.Pi * math.Sqrt(x)))
	}
	z := -x
	z3 := z * z * z
	tf, tg := 1.0, z
	f, g := 1.0, z
	for k := 1; k < 200; k++ {
		kk := float64(3 * k)
		tf *= z3 / ((kk - 1) * kk)
		tg *= z3 / (kk * (kk + 1))
		f += tf
		g += tg
		if math.Abs(tf) <= 1e-18 && math.Abs(tg) <= 1e-18 {
			break
		}
	}
	ai := ai0*f - aip0*g
	bi := bi0*f + bip0*g
	return math.Hypot(ai, bi)
}

// tiltWave is the normalized one-parameter tilt φ₁(ξ)e^(−β(ξ−½)).
type tiltWave struct {
	st     squarewell.State
	beta   float64
	scale  float64 // 1/√(∫ψ²)
	lo, hi float64
}

func newTiltWave(t ftilt, beta float64) *tiltWave {
	n, _ := t.parts(beta) // scaled by e^(−|β|)
	tw := &tiltWave{st: t.st, beta: beta, scale: 1 / math.Sqrt(n*math.Exp(math.Abs(beta)))}
	tw.lo = -tailLength(tw.At(0), t.st.KL-beta, 1e-17)
	tw.hi = 1 + tailLength(tw.At(1), t.st.KR+beta, 1e-17)
	return tw
}

// At returns ψ(ξ); 0 for NaN and infinite ξ. The exponents of each tail
// are combined before exponentiating, so that a decaying factor that
// underflows never meets a growing one that overflows.
func (w *tiltWave) At(xi float64) float64 {
	st := w.st
	switch {
	case math.IsNaN(xi) || math.IsInf(xi, 0):
		return 0
	case xi < 0:
		return st.A * math.Exp(st.KL*xi-w.beta*(xi-0.5)) * w.scale
	case xi > 1:
		return st.C * math.Exp(-st.KR*(xi-1)-w.beta*(xi-0.5)) * w.scale
	}
	return st.B * math.Sin(st.K*xi+st.DL) * math.Exp(-w.beta*(xi-0.5)) * w.scale
}

// Support implements [tiltwell.Spread].
func (w *tiltWave) Support() (lo, hi float64) { return w.lo, w.hi }
