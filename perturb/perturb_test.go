package perturb_test

import (
	"errors"
	"fmt"
	"math"
	"sync"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/exact/exacttest"
	"github.com/tiltwell/tiltwell/perturb"
	"gonum.org/v1/gonum/integrate/quad"
)

// refUlps is the allowance, in units of ε|η|, for the rounding of the
// exact reference on top of the Err it reports (its Err is "a few units in
// the last place"). It keeps the reference's own error out of the true
// error of perturbation theory; a looser reference would need a larger
// value here.
const refUlps = 4

// dipoleRefRel is the relative accuracy granted to exact.Dipole. Its doc
// says about 1e-13; against the 10th-order series at fields where the
// series is converged to far below that, it is off by up to 7.6e-11 (n = 1,
// f ≈ 0.07) and 1.4e-11 (n = 2, f ≈ 0.5), and the energies by up to 20 ulp.
// Tighten this when the reference's dipole improves.
const dipoleRefRel = 1e-10

// maxRatio is the most pessimistic the estimates may be where the true error
// is above 1e-14. The tiltwell rules ask for 10; the estimates achieve 1.10
// for energies and 1.43 for dipoles (measured worst on the grids below,
// near the validity limit), and the tests hold them to this.
const maxRatio = 1.5

// trueFloor is the true error above which pessimism is measured (the
// tiltwell rules: "where the true error is above 1e-14").
const trueFloor = 1e-14

// gridSteps is the number of fields from 0 to each level's validity limit.
const gridSteps = 200

// TestLevelsAgainstExact holds the error estimates against the exact Airy
// reference over fields 0 … Limit(n) for n = 1 … 12 at both orders: never
// below the true error, at most maxRatio above it where it is > 1e-14.
func TestLevelsAgainstExact(t *testing.T) {
	t.Parallel()
	var ex exact.Solver
	for order := 1; order <= 2; order++ {
		s := perturb.Solver{Order: order}
		t.Run(fmt.Sprintf("order=%d", order), func(t *testing.T) {
			t.Parallel()
			worst := 0.0
			points := 0
			dst := make([]tiltwell.Level, 0, 12)
			for n := 1; n <= 12; n++ {
				lim, err := s.Limit(n)
				if err != nil {
					t.Fatal(err)
				}
				for i := 0; i <= gridSteps; i++ {
					f := math.Min(lim*float64(i)/gridSteps, lim)
					ref, err := ex.Level(f, n)
					if err != nil {
						t.Fatal(err)
					}
					ls, err := s.Levels(dst, f, n)
					if err != nil && !errors.Is(err, tiltwell.ErrOutOfRange) {
						t.Fatalf("f=%g/n=%d: %v", f, n, err)
					}
					lv := ls[n-1]
					points++
					truth := math.Abs(lv.Energy - ref.Energy)
					slack := ref.Err + refUlps*0x1p-52*math.Abs(ref.Energy)
					if truth > lv.Err+slack {
						t.Errorf("f=%g/n=%d: estimate %.3g below the true error %.3g", f, n, lv.Err, truth)
					}
					if truth > trueFloor && truth > 10*slack {
						r := lv.Err / truth
						worst = math.Max(worst, r)
						if r > maxRatio {
							t.Errorf("f=%g/n=%d: estimate %.3g is %.3g× the true error %.3g", f, n, lv.Err, r, truth)
						}
					}
				}
			}
			t.Logf("%d points, worst estimate/true error %.4f", points, worst)
		})
	}
}

// TestContract runs the shared conformance harness over fields inside the
// limit of every level asked for (up to ± the smallest limit of levels
// 1 … k at each order: the harness asks for levels 1 … k at every field,
// and beyond a level's limit Levels answers with ErrOutOfRange), with the
// rules' 10× pessimism bound (exact.Grid.MaxRatio): 101 fields for the
// lowest 12 levels and 9 for the lowest 100. The harness counts the
// reference's rounding as true error, which at f = 1e-8 makes the rounding
// term ε|η| look 1.6× pessimistic. TestLevelsAgainstExact holds each
// level's estimates to maxRatio up to its own limit.
func TestContract(t *testing.T) {
	t.Parallel()
	for order := 1; order <= 2; order++ {
		s := perturb.Solver{Order: order}
		for _, c := range []struct{ k, steps int }{{12, 50}, {100, 4}} {
			lim := math.Inf(1)
			for n := 1; n <= c.k; n++ {
				l, _ := s.Limit(n)
				lim = math.Min(lim, l)
			}
			var fields []float64
			for i := -c.steps; i <= c.steps; i++ {
				f := lim * float64(i) / float64(c.steps)
				fields = append(fields, math.Max(-lim, math.Min(lim, f)))
			}
			fields = append(fields, 1e-8, -1e-300, math.Nextafter(lim, 0))
			t.Run(fmt.Sprintf("order=%d/k=%d", order, c.k), func(t *testing.T) {
				t.Parallel()
				r := exacttest.TestSolver(t, s, exact.Grid{Fields: fields, Levels: c.k, MaxRatio: 10})
				if r != nil {
					t.Logf("%d fields in ±%.4g: worst ratio %.4g at f=%g/n=%d; undershoots %d; worst |∫ψ²−1| %.2g; smallest overlap %.6f",
						len(fields), lim, r.Ratio.Value, r.Ratio.F, r.Ratio.N, r.Undershoots, r.Waves.Norm.Value, r.Waves.Overlap.Value)
				}
			})
		}
	}
}

// TestDipoleAgainstExact holds the dipole 2C_n f and its estimate against
// exact.Dipole over 0 … Limit(n) (Order 2) for n = 1 … 12.
func TestDipoleAgainstExact(t *testing.T) {
	t.Parallel()
	var ex exact.Solver
	s := perturb.Solver{}
	worst := 0.0
	for n := 1; n <= 12; n++ {
		lim, _ := s.Limit(n)
		for i := 0; i <= gridSteps; i++ {
			f := math.Min(lim*float64(i)/gridSteps, lim)
			want, err := ex.Dipole(f, n)
			if err != nil {
				t.Fatal(err)
			}
			d, derr, err := s.Dipole(f, n)
			if err != nil {
				t.Fatalf("f=%g/n=%d: %v", f, n, err)
			}
			slack := dipoleRefRel * math.Abs(want)
			truth := math.Abs(d - want)
			if truth > derr+slack {
				t.Errorf("f=%g/n=%d: dipole %.6g, exact %.6g: estimate %.3g below the true error %.3g", f, n, d, want, derr, truth)
			}
			if truth > trueFloor && truth > 10*slack {
				r := derr / truth
				worst = math.Max(worst, r)
				if r > maxRatio {
					t.Errorf("f=%g/n=%d: dipole estimate %.3g is %.3g× the true error %.3g", f, n, derr, r, truth)
				}
			}
		}
	}
	t.Logf("worst estimate/true error %.4f", worst)
}

// TestHellmannFeynman checks that the dipole is dη/df of the second-order
// energy (Hellmann–Feynman; common practice, no source), by a
// central difference, exact for a quadratic up to rounding.
func TestHellmannFeynman(t *testing.T) {
	t.Parallel()
	s := perturb.Solver{}
	for _, n := range []int{1, 2, 5, 12} {
		for _, f := range []float64{0.5, 2, 5} {
			const h = 1e-3
			lp, _ := s.Levels(nil, f+h, n)
			lm, _ := s.Levels(nil, f-h, n)
			fd := (lp[n-1].Energy - lm[n-1].Energy) / (2 * h)
			d, _, _ := s.Dipole(f, n)
			if math.Abs(fd-d) > 1e-9 {
				t.Errorf("f=%g/n=%d: dη/df = %.12g, dipole %.12g", f, n, fd, d)
			}
		}
	}
}

func TestZeroField(t *testing.T) {
	t.Parallel()
	// f = 0: η_n = n², φ_n = √2 sin(nπξ) (the flat well; common practice,
	// no source), exactly.
	for _, f := range []float64{0, math.Copysign(0, -1)} {
		for order := 0; order <= 2; order++ {
			s := perturb.Solver{Order: order}
			ls, err := s.Levels(nil, f, perturb.MaxLevels)
			if err != nil {
				t.Fatal(err)
			}
			for _, lv := range ls {
				if lv.Energy != float64(lv.N*lv.N) || lv.Err != 0 {
					t.Fatalf("order=%d/f=%g/n=%d: η = %v ± %v, want %d ± 0", order, f, lv.N, lv.Energy, lv.Err, lv.N*lv.N)
				}
			}
			for _, n := range []int{1, 2, 7, 1000} {
				d, derr, err := s.Dipole(f, n)
				if err != nil || d != 0 || derr != 0 {
					t.Errorf("order=%d/n=%d: dipole %v ± %v, %v; want 0 ± 0", order, n, d, derr, err)
				}
				w, err := s.Wavefunction(f, n)
				if err != nil {
					t.Fatal(err)
				}
				for _, xi := range []float64{0.1, 0.37, 0.5, 0.9} {
					if got, want := w.At(xi), math.Sqrt2*math.Sin(float64(n)*math.Pi*xi); got != want {
						t.Errorf("n=%d: φ(%g) = %v, want %v", n, xi, got, want)
					}
				}
			}
		}
	}
}

// TestMirror checks η_n(−f) = η_n(f) bit for bit, the dipole odd in f and
// φ_n(ξ; −f) = (−1)^(n+1) φ_n(1 − ξ; f) (mirror symmetry; common practice,
// no source).
func TestMirror(t *testing.T) {
	t.Parallel()
	for order := 1; order <= 2; order++ {
		s := perturb.Solver{Order: order}
		for _, f := range []float64{1e-8, 0.7, 3, 20, 500} {
			t.Run(fmt.Sprintf("order=%d/f=%g", order, f), func(t *testing.T) {
				p, errP := s.Levels(nil, f, 20)
				m, errM := s.Levels(nil, -f, 20)
				if (errP == nil) != (errM == nil) {
					t.Fatalf("errors differ: %v, %v", errP, errM)
				}
				for i := range p {
					if p[i] != m[i] {
						t.Errorf("n=%d: %+v at f, %+v at −f", i+1, p[i], m[i])
					}
				}
				for _, n := range []int{1, 2, 3, 12} {
					dp, ep, _ := s.Dipole(f, n)
					dm, em, _ := s.Dipole(-f, n)
					if dm != -dp || em != ep {
						t.Errorf("n=%d: dipole %v ± %v at f, %v ± %v at −f", n, dp, ep, dm, em)
					}
					wp, _ := s.Wavefunction(f, n)
					wm, _ := s.Wavefunction(-f, n)
					sign := 1.0
					if n%2 == 0 {
						sign = -1
					}
					for _, xi := range []float64{0, 0.1, 0.33, 0.5, 0.8, 1} {
						if got, want := wm.At(xi), sign*wp.At(1-xi); got != want {
							t.Errorf("n=%d: φ(%g; −f) = %v, want %v", n, xi, got, want)
						}
					}
				}
			})
		}
	}
}

// integrate returns ∫₀¹ g dξ by 400-point Gauss–Legendre quadrature (exact
// for polynomials of degree 799; the integrands here are smooth with at
// most a few dozen oscillations).
func integrate(g func(float64) float64) float64 {
	return quad.Fixed(g, 0, 1, 400, quad.Legendre{}, 0)
}

func TestWavefunction(t *testing.T) {
	t.Parallel()
	s := perturb.Solver{}
	for _, n := range []int{1, 2, 3, 8, 12, 40} {
		for _, f := range []float64{0.3, 2, 6} {
			t.Run(fmt.Sprintf("f=%g/n=%d", f, n), func(t *testing.T) {
				t.Parallel()
				w, err := s.Wavefunction(f, n)
				if err != nil {
					t.Fatal(err)
				}
				// Normalized: ∫ψ² = 1.
				if norm := integrate(func(x float64) float64 { v := w.At(x); return v * v }); math.Abs(norm-1) > 1e-13 {
					t.Errorf("∫ψ² = %.16f", norm)
				}
				// Sign convention φ′(0) > 0, and ψ(0) = ψ(1) = 0.
				if w.At(1e-9) <= 0 {
					t.Errorf("ψ(1e-9) = %g, want > 0", w.At(1e-9))
				}
				if w.At(0) != 0 || math.Abs(w.At(1)) > 1e-13 {
					t.Errorf("ψ(0) = %g, ψ(1) = %g, want 0", w.At(0), w.At(1))
				}
				// ⟨ψ|ξ − ½|ψ⟩ = 2C_n f/(1 + f² s_n): the first-order
				// dipole, up to the normalization and O(f³).
				d, derr, _ := s.Dipole(f, n)
				got := integrate(func(x float64) float64 { v := w.At(x); return (x - 0.5) * v * v })
				if math.Abs(got-d) > derr+math.Abs(d)*(1-1/(1+f*f*normSqTest(n))) {
					t.Errorf("⟨ξ − ½⟩ = %.12g, first-order dipole %.12g ± %.3g", got, d, derr)
				}
			})
		}
	}
}

// normSqTest is Σ_(m≠n) a_m², a_m = ⟨m|ξ|n⟩/(n² − m²), summed to m = 4000
// (the dropped tail is below 1e-20): the norm² of the first-order
// correction from the sum over states.
func normSqTest(n int) float64 {
	s := 0.0
	for m := 4000; m >= 1; m-- {
		a := firstOrderCoef(m, n)
		s += a * a
	}
	return s
}

// firstOrderCoef returns a_m = ⟨m|ξ|n⟩/(n² − m²) (0 for m = n); the matrix
// element ⟨m|ξ|n⟩ = −8mn/(π²(m² − n²)²) for m + n odd is derived by
// integration by parts (common practice, no source).
func firstOrderCoef(m, n int) float64 {
	if (m+n)%2 == 0 {
		return 0
	}
	d := float64(m-n) * float64(m+n)
	x := -8 * float64(m) * float64(n) / (math.Pi * math.Pi * d * d)
	return x / float64(n*n-m*m)
}

// TestWavefunctionSumOverStates checks the closed-form first-order
// wavefunction against the textbook sum over states,
// (φ_n + f Σ_(m≤M) a_m φ_m)/√(1 + f² Σ a_m²). The terms dropped beyond M
// are bounded by √2 f Σ_(m>M) |a_m| ≤ √2 f (8n/π²)(64/27)/(4M⁴) for
// M ≥ 2n (m² − n² ≥ 3m²/4, Σ_(m>M) m⁻⁵ < 1/(4M⁴)), plus the normalization.
func TestWavefunctionSumOverStates(t *testing.T) {
	t.Parallel()
	s := perturb.Solver{}
	const M = 2000
	for _, n := range []int{1, 2, 5, 12} {
		ns := normSqTest(n)
		for _, f := range []float64{0.5, 4} {
			w, _ := s.Wavefunction(f, n)
			nm := 1 / math.Sqrt(1+f*f*ns)
			bound := math.Sqrt2*f*(8*float64(n)/(math.Pi*math.Pi))*(64.0/27)/(4*math.Pow(M, 4)) + 1e-13
			for _, xi := range []float64{0.05, 0.21, 0.5, 0.77, 0.96} {
				sum := 0.0
				for m := M; m >= 1; m-- {
					sum += firstOrderCoef(m, n) * math.Sin(float64(m)*math.Pi*xi)
				}
				want := math.Sqrt2 * nm * (math.Sin(float64(n)*math.Pi*xi) + f*sum)
				if got := w.At(xi); math.Abs(got-want) > bound {
					t.Errorf("f=%g/n=%d: ψ(%g) = %.15g, sum over states %.15g (bound %.2g)", f, n, xi, got, want, bound)
				}
			}
		}
	}
}

// TestWavefunctionOrder checks that the first-order wavefunction is O(f²)
// from the exact one in norm: halving f divides the distance by about 4
// (common practice, no source).
func TestWavefunctionOrder(t *testing.T) {
	t.Parallel()
	var ex exact.Solver
	s := perturb.Solver{}
	dist := func(f float64, n int) float64 {
		w, _ := s.Wavefunction(f, n)
		we, err := ex.Wavefunction(f, n)
		if err != nil {
			t.Fatal(err)
		}
		return math.Sqrt(integrate(func(x float64) float64 { d := w.At(x) - we.At(x); return d * d }))
	}
	for _, n := range []int{1, 2, 3, 7} {
		for _, f := range []float64{0.4, 1.6} {
			d1, d2 := dist(f, n), dist(f/2, n)
			if r := d1 / d2; r < 3.5 || r > 4.5 {
				t.Errorf("f=%g/n=%d: ‖ψ − ψ_exact‖ = %.3g at f, %.3g at f/2: ratio %.3f, want ≈ 4", f, n, d1, d2, r)
			}
		}
	}
}

// TestSecondOrderQuadrature recovers C_n = ⟨φ_n|ξ − ½|ψ₁⟩ from the
// wavefunction by quadrature, with ψ₁ = (ψ(f)·√(1 + f² s_n) − φ_n)/f: a
// third route to C_n (besides the sum over states and the closed form).
func TestSecondOrderQuadrature(t *testing.T) {
	t.Parallel()
	s := perturb.Solver{}
	// C_n for n = 1 … 5, computed independently at high precision (mpmath).
	want := []float64{-0.0108295365548972, 0.00322940396531892, 0.00192391518656505, 0.00117840024783243, 0.000782672741512164}
	const f = 1.0
	for i, c := range want {
		n := i + 1
		w, _ := s.Wavefunction(f, n)
		nm := math.Sqrt(1 + f*f*normSqTest(n))
		got := integrate(func(x float64) float64 {
			phi := math.Sqrt2 * math.Sin(float64(n)*math.Pi*x)
			psi1 := (w.At(x)*nm - phi) / f
			return phi * (x - 0.5) * psi1
		})
		if math.Abs(got-c) > 1e-13 {
			t.Errorf("n=%d: ⟨φ|ξ − ½|ψ₁⟩ = %.16g, the independent C_n is %.16g", n, got, c)
		}
	}
}

func TestLimit(t *testing.T) {
	t.Parallel()
	for order := 0; order <= 2; order++ {
		s := perturb.Solver{Order: order}
		for _, n := range []int{1, 2, 3, 12, 100, 1000} {
			lim, err := s.Limit(n)
			if err != nil || !(lim > 0) || math.IsInf(lim, 0) {
				t.Fatalf("order=%d/n=%d: Limit = %v, %v", order, n, lim, err)
			}
			// Just inside: no error; just outside: the levels and a
			// RangeError with this limit (n is the only level asked for
			// through Dipole).
			if lim > perturb.MaxField {
				continue
			}
			_, _, err = s.Dipole(lim*(1-1e-12), n)
			if order != 1 && err != nil {
				t.Errorf("order=%d/n=%d: Dipole inside the limit: %v", order, n, err)
			}
			ls, err := s.Levels(nil, lim*(1+1e-12), n)
			var re *tiltwell.RangeError
			if !errors.As(err, &re) || !errors.Is(err, tiltwell.ErrOutOfRange) || len(ls) != n {
				t.Errorf("order=%d/n=%d: beyond the limit: %d levels, %v", order, n, len(ls), err)
			} else if re.Limit > lim {
				t.Errorf("order=%d/n=%d: RangeError.Limit %g, above Limit(n) = %g", order, n, re.Limit, lim)
			}
		}
	}
	// Second-order limits of the first levels, as the documentation of
	// Limit states them (6.4, 6.4, 10.5, 282), so that the doc stays true.
	s := perturb.Solver{}
	for _, c := range []struct {
		n      int
		lo, hi float64
	}{{1, 5, 7}, {2, 5, 7}, {3, 9, 12}, {12, 250, 300}} {
		if lim, _ := s.Limit(c.n); lim < c.lo || lim > c.hi {
			t.Errorf("n=%d: Limit %g outside [%g, %g]", c.n, lim, c.lo, c.hi)
		}
	}
}

// TestOutsideLimit checks the documented behaviour beyond the validity
// limit: the levels still come back, finite, with a RangeError.
func TestOutsideLimit(t *testing.T) {
	t.Parallel()
	for order := 1; order <= 2; order++ {
		s := perturb.Solver{Order: order}
		for _, f := range []float64{50, -300, 1e4, perturb.MaxField} {
			ls, err := s.Levels(nil, f, 30)
			if !errors.Is(err, tiltwell.ErrOutOfRange) || len(ls) != 30 {
				t.Fatalf("order=%d/f=%g: %d levels, %v", order, f, len(ls), err)
			}
			for _, lv := range ls {
				if math.IsNaN(lv.Energy) || math.IsInf(lv.Energy, 0) || math.IsNaN(lv.Err) || math.IsInf(lv.Err, 0) || lv.Err < 0 {
					t.Errorf("order=%d/f=%g/n=%d: %+v", order, f, lv.N, lv)
				}
			}
		}
	}
}

func TestBadInput(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name  string
		order int
		f     float64
		k     int
		want  error
	}{
		{"f=NaN", 2, math.NaN(), 1, tiltwell.ErrField},
		{"f=+Inf", 2, math.Inf(1), 1, tiltwell.ErrField},
		{"f=-Inf", 1, math.Inf(-1), 1, tiltwell.ErrField},
		{"k=0", 2, 1, 0, tiltwell.ErrLevel},
		{"k=-3", 1, 1, -3, tiltwell.ErrLevel},
		{"k=MaxLevels+1", 2, 1, perturb.MaxLevels + 1, tiltwell.ErrLevel},
		{"f=2MaxField", 2, 2 * perturb.MaxField, 1, tiltwell.ErrOutOfRange},
		{"f=-1e300", 1, -1e300, 1, tiltwell.ErrOutOfRange},
		{"order=3", 3, 1, 1, tiltwell.ErrUnits},
		{"order=-1", -1, 1, 1, tiltwell.ErrUnits},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			s := perturb.Solver{Order: c.order}
			dst := make([]tiltwell.Level, 3)
			ls, err := s.Levels(dst, c.f, c.k)
			if !errors.Is(err, c.want) || len(ls) != 0 {
				t.Errorf("Levels: %d levels, error %v, want none and one wrapping %q", len(ls), err, c.want)
			}
			if w, err := s.Wavefunction(c.f, c.k); !errors.Is(err, c.want) || w != nil {
				t.Errorf("Wavefunction: %v, %v, want nil and %q", w, err, c.want)
			}
			if d, derr, err := s.Dipole(c.f, c.k); !errors.Is(err, c.want) || d != 0 || derr != 0 {
				t.Errorf("Dipole: %v ± %v, %v, want 0 and %q", d, derr, err, c.want)
			}
		})
	}
	if _, err := (perturb.Solver{}).Limit(0); !errors.Is(err, tiltwell.ErrLevel) {
		t.Errorf("Limit(0): %v", err)
	}
	w, _ := perturb.Solver{}.Wavefunction(1, 1)
	for _, xi := range []float64{-0.1, 1.1, math.NaN(), math.Inf(1)} {
		if v := w.At(xi); v != 0 {
			t.Errorf("At(%v) = %v, want 0", xi, v)
		}
	}
}

// TestTinyAndHighLevels covers the edges: tiny fields (no underflow trouble,
// the shift C_n f² kept), the highest level, and the estimate staying
// finite.
func TestTinyAndHighLevels(t *testing.T) {
	t.Parallel()
	s := perturb.Solver{}
	for _, f := range []float64{1e-8, 1e-100, 5e-324} {
		ls, err := s.Levels(nil, f, perturb.MaxLevels)
		if err != nil {
			t.Fatal(err)
		}
		for _, lv := range ls {
			nn := float64(lv.N * lv.N)
			if math.Abs(lv.Energy-nn) > 1e-17*nn+1e-16 || !(lv.Err >= 0) || lv.Err > 1e-12*nn {
				t.Fatalf("f=%g/n=%d: %+v", f, lv.N, lv)
			}
		}
	}
	// High level against exact, inside its limit.
	var ex exact.Solver
	for _, n := range []int{100, 500, 1000} {
		lim, _ := s.Limit(n)
		f := math.Min(lim, exact.MaxField) / 2
		ref, err := ex.Level(f, n)
		if err != nil {
			t.Fatal(err)
		}
		ls, err := s.Levels(nil, f, n)
		if err != nil && !errors.Is(err, tiltwell.ErrOutOfRange) {
			t.Fatal(err)
		}
		lv := ls[n-1]
		truth := math.Abs(lv.Energy - ref.Energy)
		if truth > lv.Err+ref.Err+refUlps*0x1p-52*ref.Energy {
			t.Errorf("f=%g/n=%d: estimate %.3g below the true error %.3g", f, n, lv.Err, truth)
		}
		t.Logf("f=%g/n=%d: true error %.3g, estimate %.3g", f, n, truth, lv.Err)
	}
}

func TestAllocs(t *testing.T) {
	s := perturb.Solver{}
	dst := make([]tiltwell.Level, 0, 50)
	s.Levels(dst, 1, 50) // build the tables
	if a := testing.AllocsPerRun(100, func() { dst, _ = s.Levels(dst, 3.5, 50) }); a != 0 {
		t.Errorf("Levels allocates %v times per call", a)
	}
	if a := testing.AllocsPerRun(100, func() { s.Dipole(2, 7) }); a != 0 {
		t.Errorf("Dipole allocates %v times per call", a)
	}
	// Outside the limit the RangeError is the one allocation.
	if a := testing.AllocsPerRun(100, func() { dst, _ = s.Levels(dst, 100, 50) }); a > 1 {
		t.Errorf("Levels beyond the limit allocates %v times per call", a)
	}
}

// TestConcurrent uses one Solver from many goroutines, including the first
// use of a fresh table block (levels 900 …), for the race detector.
func TestConcurrent(t *testing.T) {
	t.Parallel()
	s := perturb.Solver{Order: 1}
	want, _ := s.Levels(nil, 2, perturb.MaxLevels)
	var wg sync.WaitGroup
	for g := range 8 {
		wg.Go(func() {
			dst := make([]tiltwell.Level, 0, perturb.MaxLevels)
			for range 20 {
				got, _ := s.Levels(dst, 2, perturb.MaxLevels-g)
				for i := range got {
					if got[i] != want[i] {
						t.Errorf("goroutine %d: level %d: %+v, want %+v", g, i+1, got[i], want[i])
						return
					}
				}
			}
		})
	}
	wg.Wait()
}

// FuzzLevels: no panic, no NaN or negative Err, errors wrap the root
// sentinels, and a successful call gives k levels N = 1 … k.
func FuzzLevels(f *testing.F) {
	f.Add(1.0, 3, 2)
	f.Add(-7.5, 12, 1)
	f.Add(0.0, 1, 0)
	f.Add(1e5, 1000, 2)
	f.Add(math.NaN(), 0, 5)
	f.Fuzz(func(t *testing.T, fld float64, k, order int) {
		s := perturb.Solver{Order: order}
		ls, err := s.Levels(nil, fld, k)
		if err != nil {
			if !errors.Is(err, tiltwell.ErrField) && !errors.Is(err, tiltwell.ErrLevel) &&
				!errors.Is(err, tiltwell.ErrOutOfRange) && !errors.Is(err, tiltwell.ErrUnits) {
				t.Fatalf("error %v wraps no root sentinel", err)
			}
			if !errors.Is(err, tiltwell.ErrOutOfRange) && len(ls) != 0 {
				t.Fatalf("%d levels with error %v", len(ls), err)
			}
		}
		for i, lv := range ls {
			if lv.N != i+1 || math.IsNaN(lv.Energy) || math.IsInf(lv.Energy, 0) || !(lv.Err >= 0) || math.IsInf(lv.Err, 0) {
				t.Fatalf("level %d: %+v", i+1, lv)
			}
		}
		if err == nil && len(ls) != k {
			t.Fatalf("%d levels, want %d", len(ls), k)
		}
		n := max(1, min(k, perturb.MaxLevels))
		if d, derr, err := s.Dipole(fld, n); math.IsNaN(d) || math.IsNaN(derr) || derr < 0 || (err != nil && d != 0 && !errors.Is(err, tiltwell.ErrOutOfRange)) {
			t.Fatalf("Dipole(%v, %d) = %v ± %v, %v", fld, n, d, derr, err)
		}
		w, werr := s.Wavefunction(fld, n)
		if werr == nil || errors.Is(werr, tiltwell.ErrOutOfRange) && math.Abs(fld) <= perturb.MaxField {
			if w == nil {
				t.Fatalf("Wavefunction(%v, %d): nil with %v", fld, n, werr)
			}
			for _, xi := range []float64{0, 0.3, 1} {
				if v := w.At(xi); math.IsNaN(v) || math.IsInf(v, 0) {
					t.Fatalf("ψ(%v) = %v", xi, v)
				}
			}
		}
	})
}
