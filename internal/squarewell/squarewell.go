// Package squarewell solves the finite square well at zero field in closed
// form: the bound levels and normalized wavefunctions of the reference well
// ξ ∈ [0, 1] between two semi-infinite barriers of heights v_L, v_R (in
// E₁) and mass ratios μ_L, μ_R, with BenDaniel–Duke matching (φ and
// (1/μ)φ′ continuous). Several methods start from these states (the
// perturbation series, trial functions, quantisation with phase shifts), so
// they live here once.
//
// In reduced units (H = −(1/π²) d/dξ (1/μ) d/dξ + v) a level η has the
// wave number k = π√η in the well and the decay constants
// κ_j = π√(μ_j (v_j − η)) in the barriers. With
//
//	φ = A e^(κ_L ξ)            ξ < 0
//	φ = B sin(kξ + δ_L)        0 ≤ ξ ≤ 1
//	φ = C e^(−κ_R (ξ − 1))     ξ > 1
//
// matching φ′/(μφ) at ξ = 0 gives tan δ_L = μ_L k/κ_L, and at ξ = 1 the same
// with δ_R, so level n solves the monotone phase condition
//
//	k + atan(μ_L k/κ_L) + atan(μ_R k/κ_R) = nπ,   0 < k < π√min(v_L, v_R).
//
// For the symmetric well it is equivalent to the textbook even and odd
// conditions k tan(k/2) = κ/μ and −k cot(k/2) = κ/μ (G. Bastard, Wave
// Mechanics Applied to Semiconductor Heterostructures (1988), ch. III, for
// the mass ratio; from memory). Each phase lies in [0, π/2), so level n has
// k in ((n − 1)π, nπ]: one root per bracket, none missed or doubled.
package squarewell

import (
	"errors"
	"fmt"
	"math"

	"github.com/tiltwell/tiltwell"
)

const eps = 0x1p-52

// Well is a finite square well at zero field: the reference well [0, 1]
// between a left barrier of height VL (E₁) and mass ratio ML and a right
// barrier VR, MR.
type Well struct {
	VL, ML, VR, MR float64
}

// ErrNotSquare reports a stack that is not a single finite well.
var ErrNotSquare = errors.New("squarewell: the stack is not a single finite well")

// FromStack returns the Well of a three-layer stack. It returns an error
// wrapping [ErrNotSquare] for infinite walls or more layers, and an error
// wrapping [tiltwell.ErrUnits] if a barrier is not above the well's band
// edge (such a stack binds nothing).
func FromStack(s tiltwell.Stack) (Well, error) {
	if s.Len() != 3 {
		return Well{}, fmt.Errorf("%w: %v", ErrNotSquare, s)
	}
	l, r := s.Outer()
	w := Well{VL: l.Edge, ML: l.Mass, VR: r.Edge, MR: r.Mass}
	if !(w.VL > 0 && w.VR > 0) {
		return Well{}, fmt.Errorf("squarewell: barriers %g and %g E₁ must both be above the well: %w", w.VL, w.VR, tiltwell.ErrUnits)
	}
	return w, nil
}

// top returns the lower barrier height, the energy below which levels are
// bound.
func (w Well) top() float64 { return min(w.VL, w.VR) }

// kappa returns π√(μ(v − η)) for η = k²/π², formed as
// √(μ (π√v − k)(π√v + k)) so that it keeps its relative accuracy as the
// level approaches the barrier top.
func kappa(v, mu, k float64) float64 {
	pv := math.Pi * math.Sqrt(v)
	return math.Sqrt(mu * (pv - k) * (pv + k))
}

// Phase returns the phase shifts δ_L = atan(μ_L k/κ_L) and
// δ_R = atan(μ_R k/κ_R) at wave number k (both in [0, π/2]) and
// their derivatives with respect to k.
func (w Well) Phase(k float64) (dl, dr, dlk, drk float64) {
	dl, dlk = phase(w.VL, w.ML, k)
	dr, drk = phase(w.VR, w.MR, k)
	return dl, dr, dlk, drk
}

// phase returns atan2(μk, κ) and its derivative
// μ(κ² + k²)/(κ(κ² + μ²k²)) with respect to k.
func phase(v, mu, k float64) (d, dk float64) {
	kp := kappa(v, mu, k)
	d = math.Atan2(mu*k, kp)
	if kp == 0 {
		return d, math.Inf(1)
	}
	// dκ/dk = −μk/κ.
	num := mu * (kp*kp + mu*k*k)
	den := kp * (kp*kp + mu*mu*k*k)
	return d, num / den
}

// Count returns the number of bound levels: the n with a root below the
// barrier top, i.e. nπ < k_top + δ(k_top) + π/2 with the other barrier's
// phase δ at the top of the lower one (a level exactly at the top is not
// bound).
func (w Well) Count() int {
	kt := math.Pi * math.Sqrt(w.top())
	dl, dr, _, _ := w.Phase(kt)
	g := (kt + dl + dr) / math.Pi
	n := int(math.Ceil(g)) - 1
	if g > 1e9 {
		// Barriers so high that the count is beyond any use; report a
		// bound large enough for every caller.
		return 1e9
	}
	return max(n, 0)
}

// Level returns the n-th bound level η_n (n = 1 for the ground level) and
// its wave number k = π√η. It returns an error wrapping [tiltwell.ErrLevel]
// if the well binds fewer than n levels.
func (w Well) Level(n int) (eta, k float64, err error) {
	if n < 1 {
		return 0, 0, fmt.Errorf("squarewell: level %d: %w", n, tiltwell.ErrLevel)
	}
	if c := w.Count(); n > c {
		return 0, 0, fmt.Errorf("squarewell: level %d: the well binds %d: %w", n, c, tiltwell.ErrLevel)
	}
	kt := math.Pi * math.Sqrt(w.top())
	lo, hi := float64(n-1)*math.Pi, min(float64(n)*math.Pi, kt)
	target := float64(n) * math.Pi
	g := func(k float64) (float64, float64) {
		dl, dr, dlk, drk := w.Phase(k)
		return k + dl + dr - target, 1 + dlk + drk
	}
	// Start from the infinite-well root scaled by the penetration: the
	// phases are nearly linear in k for deep wells.
	_, _, dlk0, drk0 := w.Phase(0.5 * (lo + hi))
	k = target / (1 + dlk0 + drk0)
	if !(k > lo && k < hi) {
		k = 0.5 * (lo + hi)
	}
	for range 200 {
		gv, gd := g(k)
		if gv > 0 {
			hi = k
		} else {
			lo = k
		}
		next := k - gv/gd
		if !(next > lo && next < hi) {
			next = 0.5 * (lo + hi)
		}
		if math.Abs(next-k) <= 2*eps*k || lo >= hi || next == lo || next == hi {
			k = next
			break
		}
		k = next
	}
	return k * k / (math.Pi * math.Pi), k, nil
}

// State is a bound state in closed form.
type State struct {
	// Eta is the level η, K the wave number π√η, KL and KR the decay
	// constants κ_L, κ_R in the barriers, DL the phase δ_L.
	Eta, K, KL, KR, DL float64
	// A, B, C are the amplitudes of the three pieces, normalized so that
	// ∫φ² dξ = 1 over the line, with φ(0) = A > 0.
	A, B, C float64
}

// State returns the normalized bound state of level n.
func (w Well) State(n int) (State, error) {
	eta, k, err := w.Level(n)
	if err != nil {
		return State{}, err
	}
	kl, kr := kappa(w.VL, w.ML, k), kappa(w.VR, w.MR, k)
	dl, _ := phase(w.VL, w.ML, k)
	// ∫₀¹ sin²(kξ + δ) dξ = ½ − (sin 2(k + δ) − sin 2δ)/(4k).
	in := 0.5 - (math.Sin(2*(k+dl))-math.Sin(2*dl))/(4*k)
	sl, sr := math.Sin(dl), math.Sin(k+dl)
	norm := in + sl*sl/(2*kl) + sr*sr/(2*kr)
	b := 1 / math.Sqrt(norm)
	return State{Eta: eta, K: k, KL: kl, KR: kr, DL: dl, A: b * sl, B: b, C: b * sr}, nil
}

// At returns φ(ξ).
func (s State) At(xi float64) float64 {
	switch {
	case math.IsNaN(xi):
		return 0
	case xi < 0:
		return s.A * math.Exp(s.KL*xi)
	case xi > 1:
		return s.C * math.Exp(-s.KR*(xi-1))
	}
	return s.B * math.Sin(s.K*xi+s.DL)
}

// Support returns the interval outside which ∫φ² dξ is below 1e-16: each
// tail holds A²e^(−2κd)/(2κ) beyond a distance d.
func (s State) Support() (lo, hi float64) {
	tail := func(a, kp float64) float64 {
		w := a * a / (2 * kp)
		if w <= 1e-17 {
			return 0
		}
		return math.Log(w/1e-17) / (2 * kp)
	}
	return -tail(s.A, s.KL), 1 + tail(s.C, s.KR)
}
