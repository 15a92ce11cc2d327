// Package faddeeva computes the Faddeeva function
//
//	w(z) = e^(−z²) erfc(−iz)
//
// (DLMF 7.2.3) in the upper half-plane by J. A. C. Weideman's rational
// expansion, and from it the Voigt profile, the convolution of a Gaussian
// and a Lorentzian line shape. The package is internal: it is a building
// block of the root package's absorption spectra.
//
// References:
//   - J. A. C. Weideman, "Computation of the complex error function",
//     SIAM J. Numer. Anal. 31, 1497 (1994), doi:10.1137/0731077.
//   - DLMF: NIST Digital Library of Mathematical Functions, ch. 7,
//     https://dlmf.nist.gov/7.
package faddeeva

import (
	"math"
	"math/cmplx"
	"sync"
)

// terms is the number N of terms of Weideman's expansion. With N = 40 the
// tests measure a relative error of w of at most 9.1e-16 on the upper
// half-plane grid of TestWAgainstSeries (N = 32 gives 3e-13, N = 36
// 7e-15).
const terms = 40

// rsqrtPi is 1/√π.
const rsqrtPi = 0.56418958354775628694807945156077258584405062932900

// coefficients holds Weideman's scale L and coefficients a_1 … a_N, built
// once on first use and read-only after.
var coefficients = sync.OnceValue(func() *expansion {
	// Weideman (1994), §3: with t = L tan(θ/2), the function
	// (L² + t²) e^(−t²) of θ is smooth and 2π-periodic (it vanishes at
	// θ = ±π); its Fourier cosine coefficients a_n, by the trapezoidal rule
	// on 4N points, give
	//
	//	w(z) ≈ 2 Σ_{n=1}^{N} a_n Z^(n−1)/(L − iz)² + 1/(√π (L − iz)),
	//	Z = (L + iz)/(L − iz),
	//
	// for Im z ≥ 0, where |Z| ≤ 1. L = √(N/√2) is the paper's choice.
	const n = terms
	l := math.Sqrt(n / math.Sqrt2)
	const m = 2 * n
	var a [terms]float64
	for k := -m + 1; k <= m-1; k++ {
		th := float64(k) * math.Pi / m
		t := l * math.Tan(th/2)
		f := math.Exp(-t*t) * (l*l + t*t)
		for j := range a {
			a[j] += f * math.Cos(float64(j+1)*th)
		}
	}
	for j := range a {
		a[j] /= 2 * m
	}
	return &expansion{l, a}
})

// expansion is Weideman's scale L and coefficients a_1 … a_N.
type expansion struct {
	l float64
	a [terms]float64
}

// farField is |z| beyond which W uses the asymptotic series
// w(z) ≈ (i/(√π z)) (1 + 1/(2z²) + 3/(4z⁴)) (DLMF 7.12.1 with
// w(z) = erfc(−iz) e^(−z²)), whose first omitted term is 15/(8z⁶) ≈ 2e-36
// relative there, and which keeps (L − iz)² from overflowing.
const farField = 1e6

// W returns the Faddeeva function w(z) = e^(−z²) erfc(−iz) for Im z ≥ 0.
// For Im z < 0 it returns 2e^(−z²) − w(−z) (DLMF 7.4.3), which overflows
// to an infinity where e^(−z²) does. A NaN in z gives NaN.
//
// Special cases are:
//
//	w(0) = 1
//	w(x) = e^(−x²) + (2i/√π) F(x) for real x, F Dawson's integral (DLMF 7.5.1)
//	w(iy) = e^(y²) erfc(y) for real y
func W(z complex128) complex128 {
	if imag(z) < 0 {
		return 2*cmplx.Exp(-z*z) - W(-z)
	}
	if x, y := real(z), imag(z); x*x+y*y > farField*farField {
		r := 1 / z
		r2 := r * r
		return complex(0, rsqrtPi) * r * (1 + r2*(0.5+0.75*r2))
	}
	e := coefficients()
	x, y := real(z), imag(z)
	// 1/(L − iz) = 1/(L + y − ix), and Z = (L + iz)/(L − iz) =
	// (L − y + ix)/(L + y − ix), in real arithmetic (no complex
	// division).
	dr, di := e.l+y, -x
	n := 1 / (dr*dr + di*di)
	ir, ii := dr*n, -di*n // 1/(L − iz)
	nr, ni := e.l-y, x
	zr, zi := nr*ir-ni*ii, nr*ii+ni*ir
	// Horner's rule for Σ a_n Z^(n−1).
	pr, pi := e.a[terms-1], 0.0
	for j := terms - 2; j >= 0; j-- {
		pr, pi = pr*zr-pi*zi+e.a[j], pr*zi+pi*zr
	}
	// 2p/(L − iz)² + 1/(√π (L − iz))
	sr, si := ir*ir-ii*ii, 2*ir*ii
	return complex(2*(pr*sr-pi*si)+rsqrtPi*ir, 2*(pr*si+pi*sr)+rsqrtPi*ii)
}

// asymptoticDerivatives is |z| beyond which [Derivatives] sums the
// asymptotic series: there its terms fall below 1e-16 of the first within
// 20 terms, while the recurrence would lose a factor of about |z|² per
// order to cancellation.
const asymptoticDerivatives = 8

// Derivatives returns w(z) and its first five derivatives w⁽ⁿ⁾, n = 1…5,
// for Im z ≥ 0. Within |z| < 8 they follow from the differential equation
// w′ = −2z w + 2i/√π (DLMF 7.10.2, from memory) and its derivatives
// w⁽ⁿ⁺¹⁾ = −2n w⁽ⁿ⁻¹⁾ − 2z w⁽ⁿ⁾; beyond, from the asymptotic series of w
// (see [W]) differentiated term by term,
//
//	w⁽ⁿ⁾(z) ~ (i/√π) Σ_k c_k (−1)ⁿ (2k + 1)(2k + 2)⋯(2k + n) z^(−2k−1−n),
//	c_k = (2k − 1)!!/2^k,
//
// summed until the terms fall below 1e-17 of the first. d[0] is W(z).
func Derivatives(z complex128) (d [6]complex128) {
	d[0] = W(z)
	if x, y := real(z), imag(z); x*x+y*y < asymptoticDerivatives*asymptoticDerivatives {
		d[1] = -2*z*d[0] + complex(0, 2*rsqrtPi)
		for n := 1; n < 5; n++ {
			d[n+1] = -2*complex(float64(n), 0)*d[n-1] - 2*z*d[n]
		}
		return d
	}
	r := 1 / z
	r2 := r * r
	for n := 1; n < len(d); n++ {
		// Term k: c_k (2k+1)_n r^(2k+1+n), with (a)_n the rising
		// factorial.
		rn := r
		for range n {
			rn *= r
		}
		sum := complex(0, 0)
		c := 1.0
		for k := 0; k < 40; k++ {
			rise := 1.0
			for j := range n {
				rise *= float64(2*k + 1 + j)
			}
			term := complex(c*rise, 0) * rn
			sum += term
			if cmplx.Abs(term) < 1e-17*cmplx.Abs(sum) {
				break
			}
			c *= float64(2*k+1) / 2
			rn *= r2
		}
		if n%2 == 1 {
			sum = -sum
		}
		d[n] = complex(0, rsqrtPi) * sum
	}
	return d
}

// sqrt2Pi is √(2π).
const sqrt2Pi = 2.50662827463100050241576528481104525300698674060994

// Voigt returns the normalized Voigt profile at x,
//
//	V(x; σ, γ) = ∫ G(t; σ) L(x − t; γ) dt = Re w(z)/(σ √(2π)),   z = (x + iγ)/(σ√2),
//
// the convolution of the Gaussian G(t; σ) = e^(−t²/2σ²)/(σ√(2π)) of
// standard deviation σ > 0 and the Lorentzian L(x; γ) = γ/(π(x² + γ²)) of
// half width at half maximum γ ≥ 0 (B. H. Armstrong, J. Quant. Spectrosc.
// Radiat. Transfer 7, 61 (1967), from memory; the identity follows from
// the integral representation DLMF 7.7.2 of w). Its integral over x is 1.
// It does not check its arguments: σ ≤ 0, γ < 0 or a NaN give a
// meaningless result.
//
// Special cases are:
//
//	γ = 0:   V = G(x; σ)
//	σ → 0:  V → L(x; γ)
func Voigt(x, sigma, gamma float64) float64 {
	s := sigma * math.Sqrt2
	return real(W(complex(x/s, gamma/s))) * (1 / (sigma * sqrt2Pi))
}

// VoigtDerivatives returns V(x; σ, γ) (see [Voigt]) and its first, third
// and fifth derivatives with respect to x.
func VoigtDerivatives(x, sigma, gamma float64) (v, d1, d3, d5 float64) {
	s := sigma * math.Sqrt2
	d := Derivatives(complex(x/s, gamma/s))
	c := 1 / (sigma * sqrt2Pi)
	r := 1 / s
	return real(d[0]) * c, real(d[1]) * c * r, real(d[3]) * c * r * r * r, real(d[5]) * c * r * r * r * r * r
}
