// Package coulomb holds the special functions of the variational exciton in
// a quantum well: the in-plane average of the Coulomb potential over an
// exponential trial density, and the exponential integral E₁.
//
// With lengths in units of λ/2, the trial density of the relative
// electron–hole motion exp(−2√(ρ² + β²u²)/λ) at a separation u along the
// growth axis, averaged against the Coulomb potential 1/√(ρ² + u²) over the
// plane, gives
//
//	∫ d²ρ exp(−2√(ρ² + β²u²)/λ) / √(ρ² + u²) = πλ K(2|u|/λ, β),
//
// and [Kernel] returns K. The package is internal: it is a building block of
// the root package's exciton binding energy.
package coulomb

import (
	"math"
	"sync"

	"gonum.org/v1/gonum/integrate/quad"
	"gonum.org/v1/gonum/mat"
)

// EulerGamma is the Euler–Mascheroni constant γ (DLMF 5.2.3; 40 digits in
// DLMF 5.2(ii), from memory).
const EulerGamma = 0.57721566490153286060651209008240243104215933593992

// Kernel returns the in-plane Coulomb kernel
//
//	K(B, β) = ∫_{βB}^∞ t e^(−t) / √(t² + (1 − β²) B²) dt
//	        = ∫₀^∞ ρ e^(−√(ρ² + β²B²)) / √(ρ² + B²) dρ
//
// for B ≥ 0 and 0 ≤ β ≤ 1 (the second form is the definition, with ρ in
// units of λ/2; s = √(ρ² + β²B²) turns it into the first). K(0, β) = 1,
// K(B, 1) = e^(−B), and K(B, 0) = B[(π/2)(H₁(B) − Y₁(B)) − 1], with H₁ the
// Struve function (by differentiating DLMF 11.5.2 with ν = 0 in its
// argument, with DLMF 11.4.27 for H₀′ and 10.6.3 for Y₀′). For large B,
// K ~ 1/B at β = 0 and K ~ β e^(−βB) at β > 0; near B = 0,
// K = 1 − B + O(B² ln B) whatever β.
//
// It returns NaN for B < 0, β outside [0, 1] or NaN arguments; callers pass
// validated values.
//
// Method: for B < 1, K = e^(−A) − ∫_A^∞ e^(−t)(1 − R(t)) dt with A = βB,
// R(t) = t/√(t² + c²), c² = (1 − β²)B²; the part over [A, T] (T = 1 for
// B < ½, 2 above) is the series of e^(−t) against the moments of 1 − R,
// which obey an exact recurrence, and the part over [T, ∞) is the binomial
// series of 1 − R in c²/t² < ¼ against the generalized exponential
// integrals E_2k(T) (DLMF 8.19.1).
// For B ≥ 1 the singularities of R at t = ±ic lie at least B from the
// interval of integration, and a fixed composite Gauss rule (Legendre
// panels on [A, A + 8], Laguerre beyond) converges. The tests hold both against the Struve closed form at β = 0,
// e^(−B) at β = 1, and an independent quadrature of the second form: the
// relative error is below 3e-15 (1 + βB), the last factor being the
// conditioning of e^(−βB) itself (TestKernelReference).
func Kernel(b, beta float64) float64 {
	if !(b >= 0) || !(beta >= 0 && beta <= 1) || math.IsInf(b, 0) {
		return math.NaN()
	}
	if b == 0 {
		return 1
	}
	if b < 1 {
		return kernelSeries(b, beta)
	}
	return kernelQuad(b, beta)
}

// The series of kernelSeries split the integral at t = T: T = 1 for
// B < ½ and T = 2 for ½ ≤ B < 1, so that c/T < ½ and the binomial series
// converges at least as ¼^k. Their lengths: T^n/n! < 1e-19 by n = maxExp,
// and ¼^k E_2k(T)/k < 1e-17 by k = maxBinom.
const (
	maxExp   = 27
	maxBinom = 26
	// seriesTol stops both series once a term falls below it; K is of
	// order one where the series are used (K > e^(−1)).
	seriesTol = 1e-18
)

// recip[k] = 1/k, for the recurrences; recip[0] is unused.
var recip = func() [maxExp + 1]float64 {
	var r [maxExp + 1]float64
	for k := 1; k <= maxExp; k++ {
		r[k] = 1 / float64(k)
	}
	return r
}()

// expSeries[n] = (−1)^n / n!, the Taylor coefficients of e^(−t).
var expSeries = func() [maxExp]float64 {
	var s [maxExp]float64
	s[0] = 1
	for n := 1; n < maxExp; n++ {
		s[n] = -s[n-1] / float64(n)
	}
	return s
}()

// binomTail returns d_k = a_k T^(1−2k) E_2k(T), k = 1..maxBinom, for the
// split point T, where 1 − (1 + x)^(−1/2) = Σ a_k x^k with
// a_k = (−1)^(k+1) (2k − 1)!!/(2k)!!, and E_n(x) = ∫₁^∞ e^(−xt) t^(−n) dt, so
// that ∫_T^∞ e^(−t) t^(−2k) dt = T^(1−2k) E_2k(T).
func binomTail(t float64) [maxBinom]float64 {
	// E_n(T) by the forward recurrence E_(n+1)(x) = (e^(−x) − x E_n(x))/n
	// (DLMF 8.19.12), which for x ≤ 2 amplifies an error at most twofold.
	var en [2*maxBinom + 1]float64
	en[1] = E1(t)
	for n := 1; n < 2*maxBinom; n++ {
		en[n+1] = (math.Exp(-t) - t*en[n]) / float64(n)
	}
	var d [maxBinom]float64
	a, p := 0.5, 1/t // a_k and T^(1−2k) at k = 1
	for k := 1; k <= maxBinom; k++ {
		if k > 1 {
			a *= -float64(2*k-1) / float64(2*k)
			p /= t * t
		}
		d[k-1] = a * p * en[2*k]
	}
	return d
}

var (
	binomTail1 = sync.OnceValue(func() [maxBinom]float64 { return binomTail(1) })
	binomTail2 = sync.OnceValue(func() [maxBinom]float64 { return binomTail(2) })
)

// kernelSeries evaluates K for 0 < B < 1.
func kernelSeries(b, beta float64) float64 {
	t := 1.0
	d := binomTail1()
	if b >= 0.5 {
		t = 2
		d = binomTail2()
	}
	a := beta * b
	c2 := (1 - beta) * (1 + beta) * b * b // c² without cancellation near β = 1
	sq := math.Sqrt(t*t + c2)
	// Moments μ_n = ∫_A^T t^n (1 − R(t)) dt. With J_m = ∫_A^T t^m/√(t² + c²),
	//
	//	m J_m + (m − 1) c² J_(m−2) = T^(m−1) √(T² + c²) − A^(m−1) B
	//
	// (differentiate t^(m−1) √(t² + c²)), which gives without cancellation
	//
	//	(n + 1) μ_n = A^n (B − A) − T^n c²/(T + √(T² + c²)) + n c² J_(n−1).
	//
	// The recurrence for J multiplies errors by (m − 1)c²/m < ¼.
	dc := c2 / (t + sq)
	bma := b * (1 - beta)
	sum := bma - dc                     // n = 0
	jm2 := math.Log((t + sq) / (a + b)) // J_(n−2), here J_0
	jm1 := sq - b                       // J_(n−1), here J_1
	// n = 1 uses J_0.
	an, tn := a, t // A^n, T^n
	sum -= (an*bma - tn*dc + c2*jm2) * 0.5
	amb, tsq := b, sq // A^(m−1) B and T^(m−1) √(T² + c²) for m = 1
	for n := 2; n < maxExp; n++ {
		an *= a
		tn *= t
		term := expSeries[n] * (an*bma - tn*dc + float64(n)*c2*jm1) * recip[n+1]
		sum += term
		if math.Abs(term) < seriesTol {
			break
		}
		// J_n from J_(n−2) = jm2 for the next step.
		amb *= a
		tsq *= t
		jn := (tsq - amb - float64(n-1)*c2*jm2) * recip[n]
		jm2, jm1 = jm1, jn
	}
	// Tail over [T, ∞): Σ d_k c^(2k), in increasing powers until the terms
	// fall below seriesTol (they decrease at least as ¼^k).
	tail := 0.0
	pk := c2
	for k := range maxBinom {
		term := d[k] * pk
		tail += term
		if math.Abs(term) < seriesTol {
			break
		}
		pk *= c2
	}
	return math.Exp(-a) - sum - tail
}

// quadRule is the composite rule of kernelQuad: nodes x_j on [0, ∞) and
// weights that include e^(−x_j), so that ∫₀^∞ e^(−x) g(x) dx ≈ Σ w_j g(x_j).
type quadRule struct {
	x, w []float64
}

// Panels of kernelQuad: Gauss–Legendre on [0, 1], [1, 3], [3, 8] and
// Gauss–Laguerre on [8, ∞). The singularities of R(A + x) at
// x = −A ± ic are at distance B ≥ 1 from x = 0, the nearest point of the
// integration range; the panels grow with the distance from it.
var (
	legendrePanels = [...][2]float64{{0, 1}, {1, 3}, {3, 8}}
	legendreOrder  = 12
	laguerreStart  = 8.0
	laguerreOrder  = 24
)

var kernelRule = sync.OnceValue(func() quadRule {
	var r quadRule
	x := make([]float64, legendreOrder)
	w := make([]float64, legendreOrder)
	for _, p := range legendrePanels {
		quad.Legendre{}.FixedLocations(x, w, p[0], p[1])
		for i := range x {
			r.x = append(r.x, x[i])
			r.w = append(r.w, w[i]*math.Exp(-x[i]))
		}
	}
	lx, lw := Laguerre(laguerreOrder)
	for i := range lx {
		r.x = append(r.x, laguerreStart+lx[i])
		r.w = append(r.w, lw[i]*math.Exp(-laguerreStart))
	}
	return r
})

// kernelQuad evaluates K for B ≥ 1.
func kernelQuad(b, beta float64) float64 {
	a := beta * b
	b2 := b * b
	r := kernelRule()
	sum := 0.0
	for i, x := range r.x {
		// R(A + x) = (A + x)/√((A + x)² + c²), with (A + x)² + c² =
		// x(x + 2A) + B² free of cancellation.
		sum += r.w[i] * (a + x) / math.Sqrt(x*(x+2*a)+b2)
	}
	return math.Exp(-a) * sum
}

// Laguerre returns the nodes and weights of the n-point Gauss–Laguerre rule,
// ∫₀^∞ e^(−x) g(x) dx ≈ Σ w_i g(x_i), from the eigen-decomposition of the
// Jacobi matrix of the Laguerre polynomials (diagonal 2k + 1, off-diagonal
// k; G. H. Golub and J. H. Welsch, Math. Comp. 23, 221 (1969)). It returns
// nil slices for n < 1 or if the decomposition fails.
func Laguerre(n int) (x, w []float64) {
	if n < 1 {
		return nil, nil
	}
	j := mat.NewSymDense(n, nil)
	for k := range n {
		j.SetSym(k, k, float64(2*k+1))
		if k > 0 {
			j.SetSym(k-1, k, float64(k))
		}
	}
	var eig mat.EigenSym
	if !eig.Factorize(j, true) {
		return nil, nil
	}
	x = eig.Values(nil)
	var v mat.Dense
	eig.VectorsTo(&v)
	w = make([]float64, n)
	for i := range n {
		// μ₀ = ∫₀^∞ e^(−x) dx = 1.
		w[i] = v.At(0, i) * v.At(0, i)
	}
	return x, w
}

// E1 returns the exponential integral E₁(x) = ∫₁^∞ e^(−xt)/t dt for x > 0
// (DLMF 6.2.1 with 6.2.2), +Inf at x = 0, and NaN for x < 0 or NaN.
//
// For x ≤ 1 it sums E₁(x) = −γ − ln x − Σ_(n≥1) (−x)^n/(n n!) (DLMF 6.6.2)
// to n = 20; for 1 < x ≤ 8 it uses Taylor series about the centres of a
// table of step ¼, whose coefficients follow from E₁′(x) = −e^(−x)/x
// (DLMF 6.2.1) with no cancellation; beyond, it evaluates the continued
// fraction
//
//	E₁(x) = e^(−x) / (x + 1 − 1²/(x + 3 − 2²/(x + 5 − …)))
//
// (the even contraction of DLMF 6.9.1) from depth 30 down. The table's
// centre values come from the same fraction taken 600 deep. The relative
// error is below 3e-15 on the tested points (TestE1).
func E1(x float64) float64 {
	switch {
	case !(x >= 0):
		return math.NaN()
	case x == 0:
		return math.Inf(1)
	case math.IsInf(x, 1):
		return 0
	case x <= 1:
		// Horner in x of Σ a_n x^n, a_n = (−1)^(n+1)/(n n!).
		s := 0.0
		for n := e1SeriesLen; n >= 1; n-- {
			s = s*x + e1Series[n]
		}
		return -EulerGamma - math.Log(x) + s*x
	case x <= e1TableEnd:
		t := e1Table()
		k := min(int((x-1)/e1Step), len(t)-1)
		d := x - (1 + (float64(k)+0.5)*e1Step)
		c := &t[k]
		s := 0.0
		for j := e1TaylorLen; j >= 0; j-- {
			s = s*d + c[j]
		}
		return s
	}
	return e1Fraction(x, 30)
}

// e1Fraction evaluates the continued fraction of E₁(x) backwards from the
// given depth.
func e1Fraction(x float64, depth int) float64 {
	t := 0.0
	for k := depth; k >= 1; k-- {
		t = float64(k*k) / (x + float64(2*k+1) - t)
	}
	return math.Exp(-x) / (x + 1 - t)
}

const (
	e1SeriesLen = 20 // 1/(20·20!) < 3e-20
	e1Step      = 0.25
	e1TableEnd  = 8.0
	// e1TaylorLen is the order of the Taylor series: with |d| ≤ 1/8 and
	// the singularity of E₁ at 0 at least 9/8 away, terms fall by 1/9.
	e1TaylorLen = 17
)

// e1Series[n] = (−1)^(n+1)/(n n!), n ≥ 1.
var e1Series = func() [e1SeriesLen + 1]float64 {
	var a [e1SeriesLen + 1]float64
	f := 1.0
	for n := 1; n <= e1SeriesLen; n++ {
		f *= float64(n)
		a[n] = 1 / (float64(n) * f)
		if n%2 == 0 {
			a[n] = -a[n]
		}
	}
	return a
}()

// e1Table holds, for each centre x₀ = 1 + (k + ½)/4 of (1, 8], the Taylor
// coefficients of E₁ at x₀: c₀ = E₁(x₀) and c_j = −g_(j−1)/j, where
// g(x₀ + d) = e^(−x₀−d)/(x₀ + d) = Σ g_i d^i has
// g_i = (e^(−x₀)/x₀)(−1)^i Σ_(m=0..i) x₀^(m−i)/m!, a sum of positive terms.
var e1Table = sync.OnceValue(func() [][e1TaylorLen + 1]float64 {
	n := int((e1TableEnd - 1) / e1Step)
	t := make([][e1TaylorLen + 1]float64, n)
	for k := range t {
		x0 := 1 + (float64(k)+0.5)*e1Step
		t[k][0] = e1Fraction(x0, 600)
		pre := math.Exp(-x0) / x0
		for j := 1; j <= e1TaylorLen; j++ {
			i := j - 1
			sum, term := 0.0, 1.0 // term = x₀^(m−i)/m!, from m = 0
			for m := 0; m <= i; m++ {
				if m == 0 {
					term = math.Pow(x0, float64(-i))
				} else {
					term *= x0 / float64(m)
				}
				sum += term
			}
			g := pre * sum
			if i%2 == 1 {
				g = -g
			}
			t[k][j] = -g / float64(j)
		}
	}
	return t
})
