package wkb_test

import (
	"math"
	"math/cmplx"

	"github.com/tiltwell/tiltwell/exact"
)

// This file holds an independent reference for the single finite well
// under a field, used by the tests of the finite-well rules: the complex
// level η_r − iΓ/2 by shooting, integrating the Schrödinger equation
// φ″ = π² μ (v + f(ξ − ½) − η) φ itself (Taylor series in each layer, in
// complex arithmetic) from an outgoing wave far beyond the downhill barrier
// and from a decaying one deep in the uphill barrier, and matching the
// log-derivatives (1/μ) φ′/φ at the downhill interface by the secant
// method in the complex η plane. It shares no code with the package: only
// the outgoing wave's starting values use the asymptotic expansion of Ai
// (DLMF 9.7.5–9.7.6), in the sector where it holds, and a narrow width
// (too small for the shooting to resolve) comes from the flux through the
// barrier, Γ = 2 s_L φ(0)²/(π³ μ_L M²(z_L) N), with the real solution's
// norm N and the Airy modulus of package exact.

// refWell is a single finite well at f > 0, folded (the left barrier is
// the downhill one).
type refWell struct {
	vL, mL, vR, mR, f float64
}

// layer returns μ and the band edge v of the layer holding ξ (the right
// one at an interface).
func (w refWell) layer(xi float64) (mu, v float64) {
	switch {
	case xi < 0:
		return w.mL, w.vL
	case xi < 1:
		return 1, 0
	}
	return w.mR, w.vR
}

// cstate is (φ, (1/μ)φ′) with a real log-scale.
type cstate struct{ phi, psi complex128 }

// step carries the state from a to b (same layer) by Taylor series of
// φ″ = (A + β(ξ − a)) φ, A = π²μ(v + f(a − ½) − η), β = π²μ f, and adds
// ∫|φ|² over the step to *norm (for real η) if norm is not nil.
func (w refWell) step(st cstate, a, b float64, eta complex128, norm *float64) cstate {
	mu, v := w.layer(0.5 * (a + b))
	beta := math.Pi * math.Pi * mu * w.f
	for a != b {
		if cmplx.IsNaN(eta) || cmplx.IsNaN(st.phi) || math.IsNaN(a) {
			return cstate{phi: cmplx.NaN(), psi: cmplx.NaN()}
		}
		A := complex(math.Pi*math.Pi*mu, 0) * (complex(v+w.f*(a-0.5), 0) - eta)
		h := b - a
		lim := 0.4 / math.Sqrt(cmplx.Abs(A)+1e-300)
		lim = min(lim, 0.4/math.Cbrt(beta))
		if math.Abs(h) > lim {
			h = math.Copysign(lim, h)
		}
		var c [80]complex128
		c[0], c[1] = st.phi, complex(mu, 0)*st.psi
		phi, dphi := c[0]+c[1]*complex(h, 0), c[1]
		hk := complex(h, 0) // h^k for k = 1
		scale := cmplx.Abs(c[0]) + cmplx.Abs(c[1]*complex(h, 0))
		nk := 2
		for k := 2; k < len(c); k++ {
			var prev complex128
			if k >= 3 {
				prev = c[k-3]
			}
			c[k] = (A*c[k-2] + complex(beta, 0)*prev) / complex(float64(k*(k-1)), 0)
			dphi += complex(float64(k), 0) * c[k] * hk
			hk *= complex(h, 0)
			phi += c[k] * hk
			nk = k + 1
			if k > 6 && cmplx.Abs(c[k]*hk)+cmplx.Abs(c[k-1]*hk/complex(h, 0)) < 1e-19*scale {
				break
			}
		}
		if norm != nil {
			// ∫₀^h φ² dt for the real polynomial Σ c_k t^k (η real).
			s := 0.0
			for i := range nk {
				for j := range nk {
					p := i + j + 1
					s += real(c[i]) * real(c[j]) * math.Pow(math.Abs(h), float64(p)) / float64(p) * sign(h, p)
				}
			}
			*norm += math.Abs(s)
		}
		st = cstate{phi: phi, psi: dphi / complex(mu, 0)}
		a += h
		if math.Abs(b-a) < 1e-15*max(1, math.Abs(b)) {
			a = b
		}
		// Keep the numbers in range; the log-derivative is what counts.
		if m := cmplx.Abs(st.phi) + cmplx.Abs(st.psi); m > 1e100 || m < 1e-100 {
			st.phi /= complex(m, 0)
			st.psi /= complex(m, 0)
			if norm != nil {
				*norm /= m * m
			}
		}
	}
	return st
}

func sign(h float64, p int) float64 {
	if h < 0 && p%2 == 1 {
		return -1
	}
	return 1
}

// airyAsym returns Ai(w) and Ai′(w) for complex w with |w| large and
// |arg w| ≤ 2π/3 (DLMF 9.7.5, 9.7.6), the common factor e^(−ξ) included.
func airyAsym(w complex128) (ai, aip complex128) {
	xi := 2.0 / 3 * w * cmplx.Sqrt(w)
	var su, sv complex128 = 1, 1
	uk := 1.0
	term := complex(1, 0)
	for k := 1; k < 30; k++ {
		fk := float64(k)
		uk *= (6*fk - 5) * (6*fk - 3) * (6*fk - 1) / ((2*fk - 1) * 216 * fk)
		vk := -(6*fk + 1) / (6*fk - 1) * uk
		term *= -1 / xi
		su += complex(uk, 0) * term
		sv += complex(vk, 0) * term
		if cmplx.Abs(term)*uk < 1e-18 {
			break
		}
	}
	e := cmplx.Exp(-xi)
	q := cmplx.Sqrt(cmplx.Sqrt(w))
	return e * su / (2 * complex(math.SqrtPi, 0) * q), -q * e * sv / (2 * complex(math.SqrtPi, 0))
}

// leftStart returns the outgoing wave Ai(z e^(2πi/3)) ∝ Ai(z) − i Bi(z)
// of the downhill layer, twelve Airy lengths beyond its turning point, and
// where it starts.
func (w refWell) leftStart(eta complex128) (cstate, float64) {
	sL := math.Cbrt(math.Pi * math.Pi * w.mL * w.f)
	xtp := 0.5 + (eta-complex(w.vL, 0))/complex(w.f, 0) // complex turning point
	x0 := math.Min(real(xtp), 0) - 12/sL
	t := complex(sL, 0) * (xtp - complex(x0, 0)) // z = −t
	rot := cmplx.Exp(complex(0, -math.Pi/3))
	ai, aip := airyAsym(t * rot)
	// dφ/dξ = Ai′(w) dw/dξ, w = t e^(−iπ/3), dt/dξ = −s_L.
	return cstate{phi: ai, psi: aip * rot * complex(-sL, 0) / complex(w.mL, 0)}, x0
}

// rightStart returns a decaying start deep in the uphill barrier: any
// start converges to the decaying solution as it is carried leftwards.
func (w refWell) rightStart(eta complex128) (cstate, float64) {
	kr := math.Pi * math.Sqrt(w.mR*math.Max(w.vR+w.f/2-real(eta), 1e-300))
	d := math.Min(30/kr, math.Cbrt(math.Pow(45/(math.Pi*math.Sqrt(w.mR*w.f)), 2)))
	x := 1 + d
	kap := complex(math.Pi, 0) * cmplx.Sqrt(complex(w.mR, 0)*(complex(w.vR+w.f*(x-0.5), 0)-eta))
	return cstate{phi: 1, psi: -kap / complex(w.mR, 0)}, x
}

// mismatch returns (1/μ)φ′/φ of the right solution minus that of the left
// one at ξ = 0.
func (w refWell) mismatch(eta complex128) complex128 {
	l, x0 := w.leftStart(eta)
	if d := w.thickStart(real(eta)); d > 0 {
		// A thick barrier: start inside it, 40 units of action from the
		// interface, with the solution that grows towards the well; the
		// other one dies out by e^(−80). The width is then too small for
		// the shooting to see, and fluxGamma supplies it.
		kap := complex(math.Pi, 0) * cmplx.Sqrt(complex(w.mL, 0)*(complex(w.vL+w.f*(-d-0.5), 0)-eta))
		l, x0 = cstate{phi: 1, psi: kap / complex(w.mL, 0)}, -d
	}
	l = w.step(l, x0, 0, eta, nil)
	r, x1 := w.rightStart(eta)
	r = w.step(r, x1, 1, eta, nil)
	r = w.step(r, 1, 0, eta, nil)
	return r.psi/r.phi - l.psi/l.phi
}

// thickStart returns the depth into the downhill barrier at which its
// action from the interface is 40, or 0 if the whole barrier holds less
// than 50.
func (w refWell) thickStart(eta float64) float64 {
	u := w.vL - eta - w.f/2
	if u <= 0 {
		return 0
	}
	c := math.Pi * math.Sqrt(w.mL)
	if 2*c/(3*w.f)*u*math.Sqrt(u) < 50 {
		return 0
	}
	// ∫₀^d κ = (2c/(3f)) (u^(3/2) − (u − f d)^(3/2)) = 40.
	r := u*math.Sqrt(u) - 40*3*w.f/(2*c)
	return (u - math.Cbrt(r*r)) / w.f
}

// refLevel returns the complex level near guess: η_r and Γ. ok is false
// if the secant iteration did not settle.
func (w refWell) refLevel(guess complex128) (etaR, gamma float64, ok bool) {
	e0, e1 := guess, guess+complex(1e-6*math.Max(1, cmplx.Abs(guess)), 0)
	d0, d1 := w.mismatch(e0), w.mismatch(e1)
	best, bestD := e1, cmplx.Abs(d1)
	for it := 0; it < 60; it++ {
		if d1 == 0 {
			ok = true
			break
		}
		if d1 == d0 || cmplx.IsNaN(d1) {
			break
		}
		e2 := e1 - d1*(e1-e0)/(d1-d0)
		e0, d0 = e1, d1
		e1 = e2
		d1 = w.mismatch(e1)
		if a := cmplx.Abs(d1); a < bestD {
			best, bestD = e1, a
		}
		// Down to rounding: the narrow width is the smallest part of η.
		step := cmplx.Abs(e1 - e0)
		ok = step < 1e-12*math.Max(1, cmplx.Abs(e1))
		if step < 1e-15*math.Max(1, cmplx.Abs(e1)) {
			break
		}
	}
	e1 = best
	etaR, gamma = real(e1), -2*imag(e1)
	if gamma < 1e-9*math.Max(1, math.Abs(etaR)) {
		gamma = w.fluxGamma(etaR)
	}
	return etaR, gamma, ok
}

// fluxGamma returns the width of a narrow resonance at η_r from the flux
// of the outgoing wave Bi + i Ai through the downhill layer:
// j = 2 s_L |φ(0)|²/(π³ μ_L M²(z_L)) (the Wronskian W{Ai, Bi} = 1/π,
// DLMF 9.2.7), over the norm N of the real solution (decaying into the
// uphill barrier, and ∝ Bi in the downhill one up to its turning point,
// ∫Bi² dz = z Bi² − Bi′², DLMF 9.11.16 for w = Bi, from memory).
func (w refWell) fluxGamma(eta float64) float64 {
	norm := 0.0
	r, x1 := w.rightStart(complex(eta, 0))
	r = w.step(r, x1, 1, complex(eta, 0), &norm)
	r = w.step(r, 1, 0, complex(eta, 0), &norm)
	phi0 := real(r.phi)
	sL := math.Cbrt(math.Pi * math.Pi * w.mL * w.f)
	zL := sL * (w.vL - eta - w.f/2) / w.f
	ai, _, bi, bip := exact.AiryScaled(zL)
	_, _, _, bip0 := exact.Airy(0)
	z := 2.0 / 3 * zL * math.Sqrt(zL)
	rb := bip / bi
	r0 := bip0 * math.Exp(-z) / bi
	tail := phi0 * phi0 * (zL - rb*rb + r0*r0) / sL
	norm += tail
	ra := ai * math.Exp(-2*z) / bi // Ai/Bi
	lnG := math.Log(2*sL*phi0*phi0/(math.Pow(math.Pi, 3)*w.mL*norm*bi*bi*(1+ra*ra))) - 2*z
	return math.Exp(lnG)
}
