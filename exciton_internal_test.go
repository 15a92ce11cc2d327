package tiltwell

import (
	"math"
	"testing"
)

// Gauss–Legendre rules integrate polynomials of degree 2n − 1 exactly:
// ∫₋₁¹ x^k dx = 2/(k + 1) for even k (textbook). This guards against bad
// tabulated rules such as gonum v0.17.0's 26-point one.
func TestGaussRule(t *testing.T) {
	t.Parallel()
	for n := 1; n <= 300; n++ {
		r := gaussRule(n)
		if len(r.x) < n {
			t.Fatalf("gaussRule(%d) has %d points", n, len(r.x))
		}
		for _, k := range []int{0, min(2, 2*n-2), 2*n - 2} {
			s := 0.0
			for i, x := range r.x {
				s += r.w[i] * math.Pow(x, float64(k))
			}
			if want := 2 / float64(k+1); math.Abs(s-want) > 1e-13 {
				t.Errorf("gaussRule(%d): ∫x^%d = %.16g, want %.16g", n, k, s, want)
			}
		}
	}
}

// Clenshaw–Curtis rules with n + 1 nodes integrate polynomials of degree
// n exactly (textbook), for odd and even n.
func TestCCRule(t *testing.T) {
	t.Parallel()
	for n := 1; n <= 70; n++ {
		x, w := ccRule(n)
		for k := 0; k <= n; k++ {
			s := 0.0
			for i := range x {
				s += w[i] * math.Pow(x[i], float64(k))
			}
			want := 0.0
			if k%2 == 0 {
				want = 2 / float64(k+1)
			}
			if math.Abs(s-want) > 1e-14 {
				t.Errorf("ccRule(%d): ∫x^%d = %.16g, want %.16g", n, k, s, want)
			}
		}
	}
}

// chebFit reproduces a smooth function and reports one it cannot resolve.
func TestChebFit(t *testing.T) {
	t.Parallel()
	p, ok := chebFit(math.Exp, -1, 2, 0, chebMax)
	if !ok || len(p.c) > 25 {
		t.Fatalf("exp: ok %v, degree %d", ok, len(p.c)-1)
	}
	for _, x := range []float64{-1, -0.3, 0.7, 1.9, 2} {
		if got := p.at(x); math.Abs(got-math.Exp(x)) > 1e-14*math.Exp(x) {
			t.Errorf("exp(%g): %.17g, want %.17g", x, got, math.Exp(x))
		}
	}
	if _, ok := chebFit(math.Abs, -1, 1.5, 0, chebMax); ok {
		t.Error("|x| across 0 should not converge")
	}
}

// brentMin finds the minimum of a parabola and of a function whose
// minimum is at an end.
func TestBrentMin(t *testing.T) {
	t.Parallel()
	x, f := brentMin(func(x float64) float64 { return (x-0.3)*(x-0.3) + 1 }, -2, 5, 1e-8)
	if math.Abs(x-0.3) > 1e-7 || math.Abs(f-1) > 1e-14 {
		t.Errorf("parabola: (%g, %g)", x, f)
	}
	x, _ = brentMin(func(x float64) float64 { return x }, 1, 2, 1e-8)
	if x-1 > 1e-7 {
		t.Errorf("x on [1, 2]: minimum at %g", x)
	}
}

// newton2 converges on a coupled quadratic, and on an even function of θ
// whose minimum lies at θ = π/2 (β = 1).
func TestNewton2(t *testing.T) {
	t.Parallel()
	f := func(s, th float64) float64 {
		a, b := s-0.2, th-0.9
		return a*a + 0.5*a*b + 2*b*b
	}
	s, th, _ := newton2(f, -1, 0.1, -3, 3)
	if math.Abs(s-0.2) > 1e-4 || math.Abs(th-0.9) > 1e-4 {
		t.Errorf("quadratic: (%g, %g), want (0.2, 0.9)", s, th)
	}
	g := func(s, th float64) float64 {
		c := math.Cos(th)
		return (s-1)*(s-1) - math.Sin(th)*math.Sin(th) + c*c*c*c
	}
	s, th, _ = newton2(g, 2, math.Pi/4, -3, 3)
	if math.Abs(s-1) > 1e-4 || math.Abs(math.Sin(th)*math.Sin(th)-1) > 1e-6 {
		t.Errorf("even in θ: (%g, %g), want (1, β = 1)", s, th)
	}
}
