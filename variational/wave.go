package variational

import (
	"fmt"
	"math"

	"github.com/tiltwell/tiltwell"
)

// Wavefunction implements [tiltwell.WaveSolver]: it returns the normalized
// Ritz function of level n at field f, the trial function whose bracket
// [Solver.Levels] reports (the same tilt search, so the same optimum). It
// is normalized to 1 up to the quadrature error of its bracket (below
// 1e-14) and carries the sign convention φ′(0) > 0. The returned value is
// safe for concurrent use; each call to At costs O(d²) for a space of
// dimension d.
//
// At strong fields the tail of a level, where the exact wavefunction is
// exponentially small (below about 1e-8 of its peak), is dominated by the
// truncation of the expansion: there the computed φ can change sign
// spuriously, so node counts and the sign of φ′ at a wall the level does
// not reach are not meaningful. The sign convention φ′(0) > 0 is applied at
// f ≥ 0, where the level lives near ξ = 0, and carried to f < 0 by mirror
// symmetry.
//
// On a finite well the wavefunction reaches into the barriers and
// implements [tiltwell.Spread], positive at ξ = 0 (the first interface):
// at zero field the closed-form bound state of internal/squarewell,
// normalized over the line; under a field the Poly family's Ritz function
// continued by the barriers' solutions (the modulus of the outgoing wave
// downhill, Ai uphill), normalized between the downhill turning point and
// +∞ as the exact solver's (within 1e-11 of it for narrow levels,
// TestFiniteWavefunctionAgainstExact), and the Tilt family's normalized
// one-parameter function.
//
// Special cases are:
//
//	f < 0: the mirror image of the level at |f|, see [tiltwell.Mirror]
func (s Solver) Wavefunction(f float64, n int) (tiltwell.Wavefunction, error) {
	if err := s.check(f, n); err != nil {
		return nil, err
	}
	if !s.Stack.Infinite() {
		return s.finiteWavefunction(f, n)
	}
	af, neg := tiltwell.Fold(f)
	var w tiltwell.Wavefunction
	if s.Family == Tilt {
		sp := spacePool.Get().(*space)
		beta := sp.tiltOptimum(af, tiltGuess(af))
		spacePool.Put(sp)
		ss, _, _, _, _, _ := tiltMoments(beta)
		// ∫ sin²(πξ) e^(−2β(ξ−½)) dξ = cosh β · ss.
		norm := math.Sqrt(math.Cosh(beta) * ss)
		w = tiltwell.WaveFunc(func(xi float64) float64 {
			return math.Sin(math.Pi*xi) * math.Exp(-beta*(xi-0.5)) / norm
		})
	} else {
		sp := spacePool.Get().(*space)
		defer spacePool.Put(sp)
		sh := polyShape
		if s.Family == Sine {
			sh = sineShape
		}
		guess := ritzGuess(sh, af)
		var beta float64
		for m := 1; m <= n; m++ {
			beta, _ = sp.searchTilt(sh, s.dim(m), m, af, guess, false)
			guess = beta
		}
		dim := s.dim(n)
		sp.build(rules()[pickRule(dim, beta)], sh, dim, beta, af, true)
		if !sp.solve(true) {
			return nil, fmt.Errorf("variational: level %d at f = %g: trial space not positive definite: %w", n, f, tiltwell.ErrNoConvergence)
		}
		rw := &ritzWave{sh: sh, dim: dim, beta: beta, rec: make([]float64, dim*dim), x: make([]float64, dim)}
		copy(rw.rec, sp.rec[:dim*dim])
		for a := range dim {
			rw.x[a] = sp.vecs[a*dim+n-1]
		}
		if rw.eval(0, true) < 0 {
			for a := range rw.x {
				rw.x[a] = -rw.x[a]
			}
		}
		w = rw
	}
	if neg {
		w = tiltwell.Mirror(w, n)
	}
	return w, nil
}

// ritzWave is a Ritz function Σ_a x_a q_a, with q_a regenerated at any
// point by the recurrence that built them.
type ritzWave struct {
	sh   shape
	dim  int
	beta float64
	rec  []float64
	x    []float64
}

// At returns φ(ξ), 0 outside [0, 1].
func (w *ritzWave) At(xi float64) float64 {
	if !(xi >= 0 && xi <= 1) {
		return 0
	}
	return w.eval(xi, false)
}

// eval returns φ(ξ), or φ′(0) if deriv0 (ξ is then ignored): every q_a
// vanishes at 0, so q_a′(0) obeys the same recurrence started from the
// starting function's derivative.
func (w *ritzWave) eval(xi float64, deriv0 bool) float64 {
	xr := 0.0
	if w.beta < 0 {
		xr = 1
	}
	var start, m float64
	if deriv0 {
		xi = 0
	}
	switch w.sh {
	case sineShape:
		sn, cs := math.Sincos(math.Pi * xi)
		start, m = sn, cs
		if deriv0 {
			start = math.Pi
		}
	default:
		start, m = xi*(1-xi), 2*xi-1
		if deriv0 {
			start = 1
		}
	}
	var q [maxDim]float64
	dim := w.dim
	q[0] = math.Exp(-w.beta*(xi-xr)) * start / w.rec[0]
	phi := w.x[0] * q[0]
	for j := 1; j < dim; j++ {
		u := m * q[j-1]
		for i := range j {
			u -= w.rec[j*dim+i] * q[i]
		}
		q[j] = u / w.rec[j*dim+j]
		phi += w.x[j] * q[j]
	}
	return phi
}
