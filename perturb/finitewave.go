package perturb

import (
	"fmt"
	"math"

	"github.com/tiltwell/tiltwell"
)

// waveStack is Wavefunction for a finite stack: the normalized first-order
// wavefunction (φ₀ + f φ₁)/√(1 + f² ‖φ₁‖²) over the whole line.
func (s Solver) waveStack(f float64, n int) (tiltwell.Wavefunction, error) {
	lv, err := s.stackLevel(f, n)
	if err != nil {
		return nil, err
	}
	af, mir := tiltwell.Fold(f)
	if af > 0 {
		var pw [wellOrder + 1]float64
		wellPowers(&pw, af)
		if _, _, conf := lv.gamma(af, lv.judged(&pw, af, lv.lim(1)), math.NaN()); !conf {
			return nil, &tiltwell.ConfinedError{Method: "perturb", F: f, Asked: n, Confined: n - 1,
				Why: fmt.Sprintf("level %d is above the downhill barrier at the interface", n)}
		}
	}
	g := &lv.geom
	scale := 1 / math.Sqrt(g.n0*(1+af*af*lv.s11))
	w := &wellWave{
		k: g.k, th0: g.th0, kl: g.kl, kr: g.kr,
		l0: g.sl, r0: g.s1,
		f: af, scale: scale,
	}
	copy(w.l[:], lv.psi1.L)
	copy(w.p[:], lv.psi1.P)
	copy(w.q[:], lv.psi1.Q)
	copy(w.r[:], lv.psi1.R)
	w.lo, w.hi = w.support()
	var wf tiltwell.Wavefunction = w
	if mir {
		wf = tiltwell.Mirror(w, n)
	}
	if af > lv.lim(1) {
		return wf, &tiltwell.RangeError{Method: "perturb", F: f, Limit: lv.lim(1)}
	}
	return wf, nil
}

// wellWave is the first-order wavefunction of a finite-well level,
//
//	scale · (l₀ + f L₁(ξ)) e^(κ_L ξ)                          ξ < 0
//	scale · (sin θ + f (P₁(u) cos θ + Q₁(u) sin θ)),  u = ξ − ½, θ = ku + θ₀
//	scale · (r₀ + f R₁(ξ − 1)) e^(−κ_R (ξ − 1))               ξ > 1
//
// with the polynomials of ψ₁ (degree ≤ 2) and scale = 1/√(N₀(1 + f²‖φ₁‖²)).
type wellWave struct {
	k, th0, kl, kr float64
	l0, r0         float64
	l, p, q, r     [3]float64
	f, scale       float64
	lo, hi         float64
}

func eval3(c *[3]float64, x float64) float64 { return c[0] + x*(c[1]+x*c[2]) }

// At returns ψ(ξ), and 0 for NaN ξ.
func (w *wellWave) At(xi float64) float64 {
	switch {
	case math.IsNaN(xi):
		return 0
	case xi < 0:
		e := math.Exp(w.kl * xi)
		if e == 0 {
			return 0
		}
		return w.scale * (w.l0 + w.f*eval3(&w.l, xi)) * e
	case xi > 1:
		y := xi - 1
		e := math.Exp(-w.kr * y)
		if e == 0 {
			return 0
		}
		return w.scale * (w.r0 + w.f*eval3(&w.r, y)) * e
	}
	u := xi - 0.5
	s, c := math.Sincos(w.k*u + w.th0)
	return w.scale * (s + w.f*(eval3(&w.p, u)*c+eval3(&w.q, u)*s))
}

// Support returns the interval outside which ∫ψ² dξ is below 1e-16 (each
// tail below 5e-17).
func (w *wellWave) Support() (lo, hi float64) { return w.lo, w.hi }

// support finds, for each barrier, the distance d beyond which the tail
// of ψ² holds less than 5e-17, by bisection on the closed form
// ∫_d^∞ g(t) e^(−λt) dt = e^(−λd) Σ_m g^(m)(d)/λ^(m+1) of the squared
// polynomial g.
func (w *wellWave) support() (lo, hi float64) {
	tail := func(c0 float64, c *[3]float64, sign, kappa float64) float64 {
		// ψ at distance t into the barrier: scale·(c0 + f c(sign·t)) e^(−κt).
		a := poly{c0 + w.f*c[0], sign * w.f * c[1], w.f * c[2]}
		g := axpy(w.scale*w.scale, mul(a, a), nil)
		lam := 2 * kappa
		weight := func(d float64) float64 {
			s, t := 0.0, 1/lam
			for dd := g; len(dd) > 0; dd = dd.deriv() {
				s += dd.eval(d) * t
				t /= lam
			}
			return math.Exp(-lam*d) * s
		}
		const target = 5e-17
		if weight(0) <= target {
			return 0
		}
		a0, b0 := 0.0, 1/lam
		for weight(b0) > target && b0 < 1e300 {
			a0, b0 = b0, 2*b0
		}
		for range 200 {
			m := 0.5 * (a0 + b0)
			if m == a0 || m == b0 {
				break
			}
			if weight(m) > target {
				a0 = m
			} else {
				b0 = m
			}
		}
		return b0
	}
	return -tail(w.l0, &w.l, -1, w.kl), 1 + tail(w.r0, &w.r, 1, w.kr)
}
