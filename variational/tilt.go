package variational

import "math"

// The one-parameter tilt family φ_β(ξ) = sin(πξ) e^(−β(ξ−½)) (G. Bastard,
// E. E. Mendez, L. L. Chang, L. Esaki, "Variational calculations on a
// quantum well in an electric field", Phys. Rev. B 28, 3241 (1983), with
// k = π/L for infinite barriers). Every expectation value is in closed
// form. With x = ξ − ½ the weight is e^(−2βx); all integrals below are
// divided by cosh β, which cancels in every ratio and keeps them finite for
// large |β|.

// tiltEnergy returns the Rayleigh quotient of φ_β,
//
//	E(β) = 1 + β²/π² − (f/2) [coth β − 1/β − 2β/(β² + π²)]
//
// (derived here from the trial function of Bastard et al.; checked by
// quadrature in the tests). Near β = 0, coth β − 1/β is
// computed from a series that does not cancel.
func tiltEnergy(beta, f float64) float64 {
	b2 := beta * beta
	return 1 + b2/(math.Pi*math.Pi) - f/2*(cothMinusInv(beta)-2*beta/(b2+math.Pi*math.Pi))
}

// cothMinusInv returns coth β − 1/β = (β cosh β − sinh β)/(β sinh β),
// with the numerator from its series where it would cancel.
func cothMinusInv(beta float64) float64 {
	if beta == 0 {
		return 0
	}
	if math.Abs(beta) < 1 {
		return bcoshMinusSinh(beta) / (beta * math.Sinh(beta))
	}
	return 1/math.Tanh(beta) - 1/beta
}

// bcoshMinusSinh returns β cosh β − sinh β = Σ_{m≥1} 2m β^(2m+1)/(2m+1)!
// for |β| < 1 (the series is entire; 14 terms reach 1e-30 there).
func bcoshMinusSinh(beta float64) float64 {
	b2 := beta * beta
	term := beta // β^(2m+1)/(2m+1)! at m = 0
	s := 0.0
	for m := 1; m <= 14; m++ {
		term *= b2 / float64(2*m*(2*m+1))
		s += float64(2*m) * term
	}
	return s
}

// tiltMoments returns the integrals over ξ ∈ [0, 1] of e^(−2βx)/cosh β
// times s², c², x s², x² s², s c and x s c, with s = sin πξ, c = cos πξ,
// x = ξ − ½. With s² = (1 + cos 2πx)/2, c² = (1 − cos 2πx)/2 and
// s c = −½ sin 2πx they follow from
//
//	M_n = ∫_{−½}^{½} xⁿ e^(−2βx) dx,   J_n = ∫_{−½}^{½} xⁿ e^(zx) dx,  z = −2β + 2πi,
//
// J_n = dⁿ/dzⁿ [2 sinh(z/2)/z] with sinh(z/2) = sinh β, cosh(z/2) = −cosh β:
//
//	J₀ = 2 sinh β/z,  J₁ = −cosh β/z − 2 sinh β/z²,
//	J₂ = sinh β/(2z) + 2 cosh β/z² + 4 sinh β/z³,
//
// and M_n the same with z = −2β (series near β = 0; derived here, checked
// by quadrature in the tests).
func tiltMoments(beta float64) (ss, cc, xss, xxss, sc, xsc float64) {
	t := math.Tanh(beta)
	var m0, m1, m2 float64
	if math.Abs(beta) < 1 {
		// sinh β/β, β cosh β − sinh β and (β²+2) sinh β − 2β cosh β by
		// their series, divided by cosh β.
		b2 := beta * beta
		ch := math.Cosh(beta)
		sh, nm, pm := 1.0, 0.0, 0.0
		term := 1.0 // β^(2m)/(2m+1)!
		for m := 1; m <= 14; m++ {
			term *= b2 / float64(2*m*(2*m+1))
			sh += term
			nm += float64(2*m) * term         // /β³ scale: N/β³ = Σ 2m β^(2m−2)/(2m+1)!
			pm += float64(2*m*(2*m-1)) * term // P/β³ likewise
		}
		m0 = sh / ch
		// N(β)/β² = β·Σ 2m β^(2m−2)/(2m+1)! ; nm holds Σ 2m β^(2m)/(2m+1)!.
		if beta != 0 {
			m1 = -0.5 * nm / (beta * ch)
		}
		m2 = 0.25 * pm / (b2 * ch)
		if beta == 0 {
			m2 = 1.0 / 12
		}
	} else {
		m0 = t / beta
		m1 = -0.5 * (1 - t/beta) / beta
		m2 = 0.25 * ((beta*beta+2)*t - 2*beta) / (beta * beta * beta)
	}
	z := complex(-2*beta, 2*math.Pi)
	ct := complex(t, 0)
	j0 := 2 * ct / z
	j1 := -1/z - 2*ct/(z*z)
	j2 := ct/(2*z) + 2/(z*z) + 4*ct/(z*z*z)
	ss = (m0 + real(j0)) / 2
	cc = (m0 - real(j0)) / 2
	xss = (m1 + real(j1)) / 2
	xxss = (m2 + real(j2)) / 2
	sc = -imag(j0) / 2
	xsc = -imag(j1) / 2
	return
}

// tiltVariance returns the Rayleigh quotient and the variance
// ⟨H²⟩ − ⟨H⟩² of φ_β in closed form. With A = 1 − β²/π², B = 2β/π,
//
//	Hφ_β = e^(−βx) [A s + B c + f x s],
//	⟨H⟩ = A + (B ⟨sc⟩ + f ⟨xs²⟩)/⟨s²⟩,
//	σ² = ‖(H − ⟨H⟩)φ_β‖²/‖φ_β‖²
//	   = [a² ⟨s²⟩ + B² ⟨c²⟩ + f² ⟨x²s²⟩ + 2aB ⟨sc⟩ + 2af ⟨xs²⟩ + 2Bf ⟨xsc⟩]/⟨s²⟩,
//
// a = A − ⟨H⟩, ⟨·⟩ the weighted integrals of tiltMoments. Written about the
// mean, every term is small when φ_β is close to an eigenfunction, so the
// variance does not cancel against ⟨H⟩².
func tiltVariance(beta, f float64) (e, s2 float64) {
	ss, cc, xss, xxss, sc, xsc := tiltMoments(beta)
	A := 1 - beta*beta/(math.Pi*math.Pi)
	B := 2 * beta / math.Pi
	e = tiltEnergy(beta, f)
	a := A - e
	num := a*a*ss + B*B*cc + f*f*xxss + 2*a*B*sc + 2*a*f*xss + 2*B*f*xsc
	return e, math.Max(num/ss, 0)
}

// tiltSearch is the objective of the tilt family: E(β) in closed form.
type tiltSearch struct{ f float64 }

func (o *tiltSearch) value(beta float64) float64 { return tiltEnergy(beta, o.f) }

// tiltGuess is a starting tilt for the ground level: 0.3225 f, the
// weak-field optimum (from dE/dβ = 0 with coth β − 1/β ≈ β/3:
// β ≈ (π²/12 − ½) f), capped by 1.7 f^(1/3), the strong-field trend of the
// optimum β* measured at f = 5..50.
func tiltGuess(f float64) float64 {
	return math.Min((math.Pi*math.Pi/12-0.5)*f, 1.7*math.Cbrt(f))
}
