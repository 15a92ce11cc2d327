package coulomb

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"
)

// kernelByQuadrature integrates the defining form of K,
//
//	K(B, β) = ∫₀^∞ ρ e^(−√(ρ² + β²B²)) / √(ρ² + B²) dρ,
//
// after ρ = B sinh ψ (dρ/√(ρ² + B²) = dψ), which leaves the smooth
// integrand B sinh ψ exp(−B √(sinh²ψ + β²)), by composite 20-point
// Gauss–Legendre panels up to where the exponent exceeds its minimum by 60.
// It shares no step with Kernel.
func kernelByQuadrature(b, beta float64) float64 {
	// The exponent exceeds its minimum βB by 60 at sinh ψ = top.
	s := beta + 60/b
	top := math.Asinh(math.Sqrt(s*s - beta*beta))
	// Panels of width min(1/8, 2/B), graded geometrically towards ψ = 0
	// where sinh ψ ~ β would otherwise be unresolved.
	h := min(0.125, 2/b)
	x := make([]float64, 20)
	w := make([]float64, 20)
	sum := 0.0
	step := h
	if beta > 0 && beta < h {
		step = beta / 64
	}
	for lo := 0.0; lo < top; {
		hi := lo + step
		step = min(2*step, h)
		quad.Legendre{}.FixedLocations(x, w, lo, hi)
		lo = hi
		for i, p := range x {
			s := math.Sinh(p)
			sum += w[i] * b * s * math.Exp(-b*math.Sqrt(s*s+beta*beta))
		}
	}
	return sum
}

// struveH1 sums DLMF 11.2.1 for H₁(z), for the moderate z of the tests.
func struveH1(z float64) float64 {
	h := z / 2
	term := h * h / (math.Gamma(1.5) * math.Gamma(2.5))
	sum := term
	for k := 1; k < 80; k++ {
		kk := float64(k)
		term *= -h * h / ((kk + 0.5) * (kk + 1.5))
		sum += term
	}
	return sum
}

func TestKernelReference(t *testing.T) {
	t.Parallel()
	bs := []float64{1e-9, 1e-6, 1e-4, 1e-3, 0.01, 0.05, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.8, 0.9, 0.99999, 1, 1.00001, 1.5, 2, 3, 5, 8, 12, 20, 40, 80, 200}
	betas := []float64{0, 1e-6, 0.05, 0.2, 0.5, 0.7, 0.9, 0.99, 0.999999, 1}
	worst := 0.0
	for _, b := range bs {
		for _, beta := range betas {
			got := Kernel(b, beta)
			want := kernelByQuadrature(b, beta)
			if want < 1e-250 {
				continue
			}
			// e^(−βB) alone carries a relative error βB·ε from rounding
			// its argument, so the tolerance grows with βB.
			rel := math.Abs(got-want) / want / (1 + beta*b)
			worst = max(worst, rel)
			if rel > 3e-15 {
				t.Errorf("Kernel(%g, %g) = %.17g, quadrature %.17g, relative error %.2g", b, beta, got, want, rel)
			}
		}
	}
	t.Logf("worst relative error against quadrature, over 1 + βB: %.2g", worst)
}

// At β = 1 the trial density is isotropic and K(B, 1) = e^(−B) exactly
// (the integrand of the first form is e^(−t) on [B, ∞)).
func TestKernelIsotropic(t *testing.T) {
	t.Parallel()
	for _, b := range []float64{1e-8, 0.01, 0.3, 0.4999, 0.5, 0.7, 2, 10, 50} {
		got, want := Kernel(b, 1), math.Exp(-b)
		if math.Abs(got-want) > 1e-15*want {
			t.Errorf("Kernel(%g, 1) = %.17g, want e^(−B) = %.17g", b, got, want)
		}
	}
}

// At β = 0, K(B, 0) = B[(π/2)(H₁(B) − Y₁(B)) − 1] (DLMF 11.5.2 with ν = 0,
// differentiated in its argument with DLMF 11.4.27 and 10.6.3). H₁ from its
// power series DLMF 11.2.1 and Y₁ from the standard library; the series
// cancels as B grows (terms up to e^B/B), so the check stops at B = 5.
func TestKernelStruve(t *testing.T) {
	t.Parallel()
	for _, b := range []float64{1e-3, 0.01, 0.1, 0.3, 0.5, 0.99, 1, 2, 4, 5} {
		want := b * (math.Pi/2*(struveH1(b)-math.Y1(b)) - 1)
		got := Kernel(b, 0)
		if math.Abs(got-want) > 1e-13*want {
			t.Errorf("Kernel(%g, 0) = %.17g, Struve form %.17g", b, got, want)
		}
	}
}

// Small-B expansion K = 1 − B + O(B² ln B) (first form: e^(−A) ≈ 1 − A,
// and ∫(1 − R) over [A, ∞) is √(A² + c²) − A = B − A).
func TestKernelSmall(t *testing.T) {
	t.Parallel()
	for _, beta := range []float64{0, 0.3, 1} {
		b := 1e-7
		got := Kernel(b, beta)
		want := 1 - b
		if math.Abs(got-want) > 1e-12 {
			t.Errorf("Kernel(%g, %g) = %.17g, expansion %.17g", b, beta, got, want)
		}
	}
}

// Large-B limits: K ~ 1/B at β = 0 (the plane average of 1/|u|) and
// K ~ β e^(−βB) for β > 0.
func TestKernelLarge(t *testing.T) {
	t.Parallel()
	b := 1e4
	if got := Kernel(b, 0); math.Abs(got*b-1) > 1e-7 {
		t.Errorf("B·K(%g, 0) = %.17g, want → 1", b, got*b)
	}
	b = 300
	if got, want := Kernel(b, 0.1), 0.1*math.Exp(-30); math.Abs(got/want-1) > 0.05 {
		t.Errorf("K(%g, 0.1) = %g, want ≈ β e^(−βB) = %g", b, got, want)
	}
}

func TestKernelBad(t *testing.T) {
	t.Parallel()
	for _, c := range [][2]float64{{-1, 0.5}, {math.NaN(), 0.5}, {1, math.NaN()}, {1, -0.1}, {1, 1.1}, {math.Inf(1), 0}} {
		if got := Kernel(c[0], c[1]); !math.IsNaN(got) {
			t.Errorf("Kernel(%g, %g) = %g, want NaN", c[0], c[1], got)
		}
	}
}

// Continuity across the switch at B = 1 on a random sample of β.
func TestKernelSwitch(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(1, 1))
	for range 50 {
		beta := rng.Float64()
		lo, hi := Kernel(math.Nextafter(1, 0), beta), Kernel(1, beta)
		if math.Abs(lo-hi) > 4e-16 {
			t.Errorf("β = %g: K jumps by %g at B = 1", beta, hi-lo)
		}
	}
}

// E₁ against tabulated values: E₁(0.5), E₁(1), E₁(2), E₁(10) agree with
// M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions,
// Table 5.1, to its 9–10 digits (from memory); all digits here come from an
// independent 30-digit evaluation outside the repository.
func TestE1(t *testing.T) {
	t.Parallel()
	for _, c := range []struct{ x, want float64 }{
		{1e-6, 13.2382958930624912436},
		{0.01, 4.03792957653811383179},
		{0.1, 1.82292395841939066608},
		{0.3, 0.90567665167584671243},
		{0.5, 0.559773594776160811747},
		{0.999, 0.219752182022944540813},
		{1, 0.219383934395520273677},
		{1.001, 0.219016422527468855681},
		{1.125, 0.178602727437028176614},
		{1.25, 0.146413372525910176693},
		{1.5, 0.100019582406632651902},
		{2, 0.0489005107080611195672},
		{2.6, 0.0218502218040821936106},
		{3, 0.0130483810941970374125},
		{4.37, 0.00242127994224161366346},
		{7, 0.000115481731610338216431},
		{7.99, 0.0000380873188307392646055},
		{8, 0.0000376656228439249017726},
		{8.001, 0.0000376237135937012921735},
		{10, 4.1569689296853242774e-6},
		{12, 4.75108182467249393259e-7},
		{20, 9.8355252906498816904e-11},
		{30, 3.02155201068881254482e-15},
		{60, 1.43586756568125678844e-28},
		{300, 1.71038427680451011572e-133},
	} {
		if got := E1(c.x); math.Abs(got-c.want) > 3e-15*c.want {
			t.Errorf("E1(%g) = %.17g, want %.17g (relative error %.2g)", c.x, got, c.want, math.Abs(got/c.want-1))
		}
	}
	if !math.IsNaN(E1(-1)) || !math.IsNaN(E1(math.NaN())) || !math.IsInf(E1(0), 1) || E1(math.Inf(1)) != 0 {
		t.Errorf("E1 special cases: %g %g %g %g", E1(-1), E1(math.NaN()), E1(0), E1(math.Inf(1)))
	}
}

func TestLaguerre(t *testing.T) {
	t.Parallel()
	// Exact for polynomials of degree ≤ 2n − 1: ∫₀^∞ e^(−x) x^k dx = k!.
	x, w := Laguerre(12)
	for k := 0; k < 24; k++ {
		sum := 0.0
		for i := range x {
			sum += w[i] * math.Pow(x[i], float64(k))
		}
		want := math.Gamma(float64(k + 1))
		if math.Abs(sum-want) > 1e-11*want {
			t.Errorf("Laguerre(12): ∫ e^(−x) x^%d = %g, want %g", k, sum, want)
		}
	}
	if x, w := Laguerre(0); x != nil || w != nil {
		t.Error("Laguerre(0) should return nil")
	}
}

func BenchmarkKernel(b *testing.B) {
	for _, c := range [][2]float64{{0.01, 0}, {0.3, 0.5}, {0.8, 0.5}, {1.5, 0.5}, {20, 0.9}} {
		b.Run(fmt.Sprintf("B=%g/beta=%g", c[0], c[1]), func(b *testing.B) {
			b.ReportAllocs()
			s := 0.0
			for b.Loop() {
				s += Kernel(c[0], c[1])
			}
			_ = s
		})
	}
	b.Run("E1", func(b *testing.B) {
		b.ReportAllocs()
		s := 0.0
		for b.Loop() {
			s += E1(0.7) + E1(3)
		}
		_ = s
	})
}
