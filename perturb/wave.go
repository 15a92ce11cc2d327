package perturb

import (
	"math"

	"github.com/tiltwell/tiltwell"
)

// Wavefunction returns the normalized first-order wavefunction of level n at
// reduced field f (the same for Order 1 and 2),
//
//	ψ_n = (φ_n + f ψ₁) / √(1 + f² s_n),   φ_n = √2 sin(nπξ),
//	ψ₁ = √2 [ (π/(4n)) ξ(1 − ξ) cos(nπξ) + ((ξ − ½)/(4n²)) sin(nπξ) ],
//	s_n = ‖ψ₁‖² = π²/(480 n²) + 1/(192 n⁴) − 7/(32 n⁶ π²).
//
// ψ₁ is the closed-form solution of (H₀ − n²) ψ₁ = −(ξ − ½) φ_n with
// ψ₁(0) = ψ₁(1) = 0 and ⟨φ_n|ψ₁⟩ = 0 (see the package documentation). It
// equals the sum over states Σ_(m≠n) ⟨m|ξ|n⟩/(n² − m²) φ_m, but nothing
// is truncated: the closed form is the whole sum. ψ_n differs from the true
// wavefunction by O(f²) in norm. The sign follows φ_n′(0) > 0:
// ψ_n′(0) = √2 (nπ + fπ/(8n))/√(1 + f² s_n).
//
// On a finite well the wavefunction is, in the same way,
// (φ₀ + f φ₁)/√(1 + f² ‖φ₁‖²) over the whole line, with φ₀ the zero-field
// state and φ₁ the Dalgarno–Lewis first-order state (closed form in each
// layer, see the package documentation); it implements [tiltwell.Spread],
// its Support holding all but 1e-16 of ∫ψ², and φ(0) > 0 at the first
// interface.
//
// Errors are as for [Solver.Levels] with n in place of k; the limit is that
// of Order 2 for level n, and beyond it the wavefunction is still returned
// with the error.
//
// Special cases are:
//
//	f = 0: √2 sin(nπξ) (exact); on a finite well the zero-field state
//	f < 0: [tiltwell.Mirror] of the wavefunction at −f (on a finite well, of
//	  the mirrored stack)
func (s Solver) Wavefunction(f float64, n int) (tiltwell.Wavefunction, error) {
	if _, err := s.order(); err != nil {
		return nil, err
	}
	if err := tiltwell.CheckArgs("perturb", f, n, MaxLevels, MaxField); err != nil {
		return nil, err
	}
	if !s.Stack.Infinite() {
		return s.waveStack(f, n)
	}
	af, mir := tiltwell.Fold(f)
	nf := float64(n)
	w := wave{
		k:  nf * math.Pi,
		a:  af * math.Pi / (4 * nf),
		b:  af / (4 * nf * nf),
		nm: math.Sqrt2 / math.Sqrt(1+af*af*normSq(n)),
	}
	var wf tiltwell.Wavefunction = w
	if mir {
		wf = tiltwell.Mirror(w, n)
	}
	if lim := entryOf(n).lim[1]; af > lim {
		return wf, &tiltwell.RangeError{Method: "perturb", F: f, Limit: lim}
	}
	return wf, nil
}

// normSq returns s_n = ‖ψ₁‖² (see [Solver.Wavefunction]).
func normSq(n int) float64 {
	nn := float64(n) * float64(n)
	return math.Pi*math.Pi/(480*nn) + 1/(192*nn*nn) - 7/(32*nn*nn*nn*math.Pi*math.Pi)
}

// wave is the first-order wavefunction
// nm·[sin(kξ) + a ξ(1 − ξ) cos(kξ) + b (ξ − ½) sin(kξ)].
type wave struct {
	k, a, b, nm float64
}

// At returns ψ(ξ), or 0 outside [0, 1] and for NaN ξ.
func (w wave) At(xi float64) float64 {
	if !(xi >= 0 && xi <= 1) {
		return 0
	}
	s, c := math.Sincos(w.k * xi)
	return w.nm * (s*(1+w.b*(xi-0.5)) + w.a*xi*(1-xi)*c)
}
