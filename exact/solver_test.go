package exact

import (
	"errors"
	"fmt"
	"math"
	"sync"
	"testing"

	"github.com/tiltwell/tiltwell"
	"gonum.org/v1/gonum/integrate/quad"
)

// TestLevelsPublished checks levels against 15-digit values computed
// independently at high precision (mpmath) from the Airy determinant
// Ai(x₋)Bi(x₊) − Ai(x₊)Bi(x₋) = 0, an independent formulation (not a
// published table).
func TestLevelsPublished(t *testing.T) {
	t.Parallel()
	table := []struct {
		f float64
		e [3]float64
	}{
		{1, [3]float64{0.989191714351091, 4.0032088300244, 9.00192325107681}},
		{5, [3]float64{0.741219278430113, 4.06922048935081, 9.04766385801899}},
		{10, [3]float64{0.0660262957550905, 4.18187000563762, 9.18467880199912}},
		{20, [3]float64{-1.9685399313543, 4.07925089520686, 9.62528390552019}},
		{50, [3]float64{-10.2062634323475, 0.865458071834238, 9.93927499167423}},
		{100, [3]float64{-26.5164070902714, -8.94126155816345, 5.44766594418562}},
	}
	for _, c := range table {
		got, err := Solver{}.Levels(nil, c.f, 3)
		if err != nil {
			t.Fatal(err)
		}
		for i, want := range c.e {
			// 15 significant digits are given: half a unit in the 15th,
			// plus a few ulps of our own.
			tol := 0.5e-14*math.Pow(10, math.Floor(math.Log10(math.Abs(want)))) + 4*eps*math.Abs(want)
			if d := math.Abs(got[i].Energy - want); d > tol {
				t.Errorf("f=%g n=%d: η = %.17g, want %.15g (diff %.2g > %.2g)", c.f, i+1, got[i].Energy, want, d, tol)
			}
		}
	}
}

// TestSecondOrderLimit checks (η_n(f) − n²)/f² → C_n = (n²π² − 15)/(48n⁴π²)
// (the second-order perturbation sum in closed form: common practice, no
// source; it matches the sum over states to 40 digits, computed
// independently at high precision (mpmath)) at f = 1e-3,
// where the f⁴ term is O(1e-6) relative to C_n.
func TestSecondOrderLimit(t *testing.T) {
	t.Parallel()
	table := []float64{-0.0108295365548972, 0.00322940396531892, 0.00192391518656505, 0.00117840024783243, 0.000782672741512164}
	const f = 1e-3
	lv, err := Solver{}.Levels(nil, f, len(table))
	if err != nil {
		t.Fatal(err)
	}
	for i, want := range table {
		n := i + 1
		if e := relErr(secondOrder(n), want, math.Abs(want)); e > 1e-14 {
			t.Errorf("C_%d closed form = %.17g, table %.15g", n, secondOrder(n), want)
		}
		got := (lv[i].Energy - float64(n*n)) / (f * f)
		if e := relErr(got, want, math.Abs(want)); e > 2e-5 {
			t.Errorf("n=%d: (η − n²)/f² = %.10g, want C_n = %.10g (rel %.2g)", n, got, want, e)
		}
	}
}

// TestTriangularLimit checks η_n → −f/2 + |a_n|(f/π)^(2/3) at strong field
// (L. D. Landau and E. M. Lifshitz, Quantum Mechanics, §24, from memory;
// O. Vallée and M. Soares, Airy Functions and Applications to Physics,
// Imperial College Press 2004, ch. 8; the deviations 1.8e-4 at f = 20,
// 5.1e-8 at f = 50, 2.1e-12 at f = 100 were computed independently at high
// precision (mpmath)).
func TestTriangularLimit(t *testing.T) {
	t.Parallel()
	for _, c := range []struct{ f, dev, tol float64 }{
		{20, 1.8e-4, 0.05e-4},
		{50, 5.1e-8, 0.05e-8},
		{100, 2.1e-12, 0.1e-12},
	} {
		l, err := Solver{}.Level(c.f, 1)
		if err != nil {
			t.Fatal(err)
		}
		a1, _ := AiZero(1)
		tri := -c.f/2 - a1*math.Pow(c.f/math.Pi, 2.0/3)
		if d := l.Energy - tri; math.Abs(d-c.dev) > c.tol {
			t.Errorf("f=%g: η₁ − triangular = %.3g, want %.2g", c.f, d, c.dev)
		}
	}
	// At f = 1e4 the far wall is exponentially far: the levels are the
	// triangular ones to rounding, for every n whose turning point is
	// well inside (z₁ = α + a_n > 8).
	const f = 1e4
	lv, err := Solver{}.Levels(nil, f, 10)
	if err != nil {
		t.Fatal(err)
	}
	for _, l := range lv {
		a, _ := AiZero(l.N)
		tri := -f/2 - a*math.Pow(f/math.Pi, 2.0/3)
		if math.Abs(l.Energy-tri) > 1e-14*math.Abs(tri) {
			t.Errorf("f=1e4 n=%d: η = %.17g, triangular %.17g", l.N, l.Energy, tri)
		}
	}
}

// TestZeroField checks η_n = n² and φ_n = √2 sin(nπξ) at f = 0, and the
// limit f → 0 (common practice, no source: the free particle in a box).
func TestZeroField(t *testing.T) {
	t.Parallel()
	for _, f := range []float64{0, math.Copysign(0, -1), 1e-300, 1e-25} {
		lv, err := Solver{}.Levels(nil, f, MaxLevels)
		if err != nil {
			t.Fatal(err)
		}
		for _, l := range lv {
			if want := float64(l.N * l.N); l.Energy != want {
				t.Errorf("f=%g n=%d: η = %.17g, want %g", f, l.N, l.Energy, want)
			}
			if f == 0 && l.Err != 0 {
				t.Errorf("f=0 n=%d: Err = %g, want 0", l.N, l.Err)
			}
		}
	}
	for _, f := range []float64{0, 1e-25, 1e-8} {
		for _, n := range []int{1, 2, 5, 40} {
			w, err := Solver{}.Wavefunction(f, n)
			if err != nil {
				t.Fatal(err)
			}
			for xi := 0.0; xi <= 1; xi += 1.0 / 64 {
				want := math.Sqrt2 * math.Sin(float64(n)*math.Pi*xi)
				// At f = 1e-8 the first-order change is below 0.1 f (the m = 2 term of
				// the first-order sum, f⟨2|ξ|1⟩/(1 − 4) ≈ 0.06 f, dominates).
				if d := math.Abs(w.At(xi) - want); d > 1e-13+0.2*f {
					t.Errorf("f=%g n=%d ξ=%g: φ = %.17g, √2 sin(nπξ) = %.17g", f, n, xi, w.At(xi), want)
				}
			}
		}
	}
}

// TestLevelsTinyField checks that weak fields keep full relative accuracy:
// η_n = n² + C_n f² + O(f⁴), and at f = 1e-8 the f⁴ term is far below
// rounding, so the second-order value is the exact answer
// (C_n as in TestSecondOrderLimit).
func TestLevelsTinyField(t *testing.T) {
	t.Parallel()
	for _, f := range []float64{1e-8, 1e-6, 1e-5} {
		lv, err := Solver{}.Levels(nil, f, 50)
		if err != nil {
			t.Fatal(err)
		}
		for _, l := range lv {
			nn := float64(l.N * l.N)
			want := nn + secondOrder(l.N)*f*f
			// O(f⁴) term: |C4| < 0.01 for n = 1 and falls with n.
			tol := 3*eps*nn + 0.01*f*f*f*f
			if d := math.Abs(l.Energy - want); d > tol {
				t.Errorf("f=%g n=%d: η = %.17g, n² + C_n f² = %.17g (diff %.2g > %.2g)", f, l.N, l.Energy, want, d, tol)
			}
			if l.Err < math.Abs(l.Energy-want)-0.01*f*f*f*f {
				t.Errorf("f=%g n=%d: Err %.2g below the difference %.2g", f, l.N, l.Err, math.Abs(l.Energy-want))
			}
		}
	}
}

// TestMirrorSymmetry checks η_n(−f) = η_n(f) and
// φ_n(ξ; −f) = (−1)^(n+1) φ_n(1 − ξ; f) (common practice, no source: the
// reflection ξ → 1 − ξ maps the Hamiltonian at f to the one at −f).
func TestMirrorSymmetry(t *testing.T) {
	t.Parallel()
	for _, f := range []float64{1e-8, 0.3, 7, 150, 5000} {
		p, err := Solver{}.Levels(nil, f, 12)
		if err != nil {
			t.Fatal(err)
		}
		m, err := Solver{}.Levels(nil, -f, 12)
		if err != nil {
			t.Fatal(err)
		}
		for i := range p {
			if p[i] != m[i] {
				t.Errorf("f=±%g n=%d: %+v vs %+v", f, i+1, p[i], m[i])
			}
		}
		for _, n := range []int{1, 2, 3, 12} {
			wp, _ := Solver{}.Wavefunction(f, n)
			wm, _ := Solver{}.Wavefunction(-f, n)
			s := 1.0
			if n%2 == 0 {
				s = -1
			}
			for xi := 0.0; xi <= 1; xi += 1.0 / 32 {
				if a, b := wm.At(xi), s*wp.At(1-xi); math.Abs(a-b) > 1e-14 {
					t.Errorf("f=%g n=%d ξ=%g: φ(−f) = %.17g, mirrored φ(f) = %.17g", f, n, xi, a, b)
				}
			}
			d1, _ := Solver{}.Dipole(f, n)
			d2, _ := Solver{}.Dipole(-f, n)
			if d1 != -d2 {
				t.Errorf("f=%g n=%d: dipole %g at +f, %g at −f", f, n, d1, d2)
			}
		}
	}
}

// fields is the grid of reduced fields most tests run over.
var fields = []float64{1e-8, 1e-4, 0.01, 0.1, 0.5, 1, 2, 5, 10, 20, 35, 50, 100, 200, 500, 1000, 3000, 1e4, 3e4, 1e5}

// gaussLegendre integrates g over [0, 1] with n nodes split into panels.
func integrate01(g func(float64) float64, n int) float64 {
	return quad.Fixed(g, 0, 1, n, quad.Legendre{}, 0)
}

// TestWavefunctions checks normalisation, orthogonality, the node count
// n − 1, the sign convention φ′(0) > 0 and the walls, by quadrature
// (common practice, no source: properties of a Sturm–Liouville problem).
func TestWavefunctions(t *testing.T) {
	t.Parallel()
	levels := []int{1, 2, 3, 7, 20, 50}
	for _, f := range fields {
		t.Run(fmt.Sprintf("f=%g", f), func(t *testing.T) {
			t.Parallel()
			ws := make([]tiltwell.Wavefunction, len(levels))
			for i, n := range levels {
				w, err := Solver{}.Wavefunction(f, n)
				if err != nil {
					t.Fatal(err)
				}
				ws[i] = w
			}
			// Enough Gauss–Legendre nodes for 50 half-waves and the
			// narrow ground state at f = 1e5 (width ~ (π²f)^(−1/3)).
			const nq = 600
			for i := range ws {
				for j := i; j < len(ws); j++ {
					got := integrate01(func(x float64) float64 { return ws[i].At(x) * ws[j].At(x) }, nq)
					want := 0.0
					if i == j {
						want = 1
					}
					if math.Abs(got-want) > 1e-13 {
						t.Errorf("⟨%d|%d⟩ = %.17g, want %g", levels[i], levels[j], got, want)
					}
				}
				n := levels[i]
				nodes, prev := 0, ws[i].At(1e-9)
				if !(prev > 0) {
					t.Errorf("n=%d: φ(1e-9) = %g, want > 0 (φ′(0) > 0)", n, prev)
				}
				const ns = 20000
				for k := 1; k < ns; k++ {
					v := ws[i].At(float64(k) / ns)
					if v*prev < 0 {
						nodes++
					}
					if v != 0 {
						prev = v
					}
				}
				if nodes != n-1 {
					t.Errorf("n=%d: %d nodes, want %d", n, nodes, n-1)
				}
				if a, b := ws[i].At(0), ws[i].At(1); math.Abs(a) > 1e-12 || math.Abs(b) > 1e-12 {
					t.Errorf("n=%d: φ(0) = %g, φ(1) = %g, want 0", n, a, b)
				}
				if ws[i].At(-0.1) != 0 || ws[i].At(1.1) != 0 || ws[i].At(math.NaN()) != 0 {
					t.Errorf("n=%d: nonzero outside the well", n)
				}
			}
		})
	}
}

// TestHellmannFeynman checks dη/df = ⟨ξ − ½⟩ (the Hellmann–Feynman
// theorem) three ways: Dipole against a central finite difference of η,
// and against the quadrature of (ξ − ½)φ².
func TestHellmannFeynman(t *testing.T) {
	t.Parallel()
	for _, f := range fields {
		for _, n := range []int{1, 2, 5, 30} {
			d, err := Solver{}.Dipole(f, n)
			if err != nil {
				t.Fatal(err)
			}
			w, _ := Solver{}.Wavefunction(f, n)
			q := integrate01(func(x float64) float64 { v := w.At(x); return (x - 0.5) * v * v }, 600)
			// Quadrature of an integrand of size ½ with cancellation.
			if math.Abs(q-d) > 2e-13 {
				t.Errorf("f=%g n=%d: Dipole %.17g, quadrature %.17g", f, n, d, q)
			}
			if f < 0.01 {
				continue // the difference quotient is all rounding
			}
			h := 1e-3 * f
			e := func(x float64) float64 { l, _ := Solver{}.Level(x, n); return l.Energy }
			// Fourth-order central difference; the h⁴ term is tiny,
			// the rounding term ~ ε|η|/h dominates.
			fd := (8*(e(f+h)-e(f-h)) - (e(f+2*h) - e(f-2*h))) / (12 * h)
			l, _ := Solver{}.Level(f, n)
			tol := 1e-9*math.Abs(d) + 20*eps*max(1, math.Abs(l.Energy))/h
			if f+2*h > MaxField {
				continue
			}
			if math.Abs(fd-d) > tol {
				t.Errorf("f=%g n=%d: Dipole %.15g, finite difference %.15g (tol %.2g)", f, n, d, fd, tol)
			}
		}
	}
}

// TestBadInput checks that bad arguments give errors wrapping the root
// sentinels and never panic or return NaN.
func TestBadInput(t *testing.T) {
	t.Parallel()
	cases := []struct {
		f    float64
		k    int
		want error
	}{
		{math.NaN(), 1, tiltwell.ErrField},
		{math.Inf(1), 1, tiltwell.ErrField},
		{math.Inf(-1), 1, tiltwell.ErrField},
		{1, 0, tiltwell.ErrLevel},
		{1, -3, tiltwell.ErrLevel},
		{1, MaxLevels + 1, tiltwell.ErrLevel},
		{MaxField * 1.0001, 1, tiltwell.ErrOutOfRange},
		{-2e5, 1, tiltwell.ErrOutOfRange},
	}
	for _, c := range cases {
		dst, err := Solver{}.Levels(make([]tiltwell.Level, 3), c.f, c.k)
		if !errors.Is(err, c.want) {
			t.Errorf("Levels(f=%g, k=%d): err = %v, want %v", c.f, c.k, err, c.want)
		}
		if len(dst) != 0 {
			t.Errorf("Levels(f=%g, k=%d): %d levels on error", c.f, c.k, len(dst))
		}
		if _, err := (Solver{}).Wavefunction(c.f, c.k); !errors.Is(err, c.want) {
			t.Errorf("Wavefunction(f=%g, n=%d): err = %v, want %v", c.f, c.k, err, c.want)
		}
		if _, err := (Solver{}).Dipole(c.f, c.k); !errors.Is(err, c.want) {
			t.Errorf("Dipole(f=%g, n=%d): err = %v, want %v", c.f, c.k, err, c.want)
		}
		if _, err := (Solver{}).Level(c.f, c.k); !errors.Is(err, c.want) {
			t.Errorf("Level(f=%g, n=%d): err = %v, want %v", c.f, c.k, err, c.want)
		}
	}
}

// TestHighLevels runs the largest supported k at several fields: the levels
// increase, have the rigorous bounds max(n² − |f|/2, triangular) < η_n ≤
// n² + |f|/2 (min–max and domain monotonicity), and carry finite estimates.
func TestHighLevels(t *testing.T) {
	t.Parallel()
	for _, f := range []float64{1e-3, 1, 100, 1e4, MaxField} {
		lv, err := Solver{}.Levels(nil, f, MaxLevels)
		if err != nil {
			t.Fatal(err)
		}
		for i, l := range lv {
			nn := float64(l.N * l.N)
			a, _ := AiZero(l.N)
			lo := max(nn-f/2, -f/2-a*math.Pow(f/math.Pi, 2.0/3))
			slack := 1e-14 * max(1, math.Abs(l.Energy))
			if !(l.Energy > lo-slack && l.Energy <= nn+f/2+slack) {
				t.Errorf("f=%g n=%d: η = %.17g outside (%.17g, %.17g]", f, l.N, l.Energy, lo, nn+f/2)
			}
			if i > 0 && !(l.Energy > lv[i-1].Energy) {
				t.Errorf("f=%g: η_%d = %.17g not above η_%d = %.17g", f, l.N, l.Energy, l.N-1, lv[i-1].Energy)
			}
			if !(l.Err >= 0) || math.IsInf(l.Err, 0) || l.Err > 1e-13*max(1, math.Abs(l.Energy)) {
				t.Errorf("f=%g n=%d: Err = %g", f, l.N, l.Err)
			}
		}
	}
}

// TestConcurrent calls one Solver from many goroutines (run with -race).
func TestConcurrent(t *testing.T) {
	t.Parallel()
	var s tiltwell.WaveSolver = Solver{}
	want := make([][]tiltwell.Level, len(fields))
	for i, f := range fields {
		want[i], _ = s.Levels(nil, f, 8)
	}
	var wg sync.WaitGroup
	errs := make(chan string, 64)
	for g := range 16 {
		wg.Go(func() {
			dst := make([]tiltwell.Level, 0, 8)
			for r := range 20 {
				i := (g + r) % len(fields)
				var err error
				dst, err = s.Levels(dst, fields[i], 8)
				if err != nil {
					errs <- err.Error()
					return
				}
				for j := range dst {
					if dst[j] != want[i][j] {
						errs <- fmt.Sprintf("f=%g n=%d: %+v vs %+v", fields[i], j+1, dst[j], want[i][j])
						return
					}
				}
				w, _ := s.Wavefunction(fields[i], 1+r%4)
				_ = w.At(0.3)
			}
		})
	}
	wg.Wait()
	close(errs)
	for e := range errs {
		t.Error(e)
	}
}

// TestNoAllocs checks that Levels does not allocate when dst has capacity.
func TestNoAllocs(t *testing.T) {
	dst := make([]tiltwell.Level, 0, 10)
	for _, f := range []float64{0, 1e-8, 1, 30, 1e4} {
		a := testing.AllocsPerRun(100, func() {
			dst, _ = Solver{}.Levels(dst, f, 10)
		})
		if a != 0 {
			t.Errorf("f=%g: %v allocations per call", f, a)
		}
	}
}

// TestGaAsShift checks the ground-level shift of a 10 nm GaAs well
// (m* = 0.067, infinite barriers) in meV against exact Airy values
// computed independently at high precision (mpmath) with the CODATA 2018
// constants (E. Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021));
// E₁ = 56.1239048 meV.
func TestGaAsShift(t *testing.T) {
	t.Parallel()
	w, err := tiltwell.NewWell(10e-9, 0.067)
	if err != nil {
		t.Fatal(err)
	}
	if e := relErr(w.MilliEV(1), 56.1239048, 56.1239048); e > 1e-8 {
		t.Errorf("E₁ = %.9g meV, want 56.1239048", w.MilliEV(1))
	}
	for _, c := range []struct{ kv, shift float64 }{
		{10, -0.0192946}, {50, -0.481642}, {100, -1.91768}, {200, -7.53596},
	} {
		f := w.Reduced(tiltwell.KVPerCM(c.kv))
		l, err := Solver{}.Level(f, 1)
		if err != nil {
			t.Fatal(err)
		}
		got := w.MilliEV(l.Energy - 1)
		if e := relErr(got, c.shift, math.Abs(c.shift)); e > 5e-6 {
			t.Errorf("F = %g kV/cm: shift %.7g meV, want %.6g", c.kv, got, c.shift)
		}
	}
}

// FuzzLevels checks that no (f, k) panics, returns NaN, or returns an
// error that does not wrap a root sentinel.
func FuzzLevels(f *testing.F) {
	for _, s := range []struct {
		f float64
		k int
	}{{0, 1}, {1e-8, 3}, {10, 10}, {-50, 4}, {1e5, 2}, {math.NaN(), 1}, {1e6, 1}, {3, 0}, {5e-324, 2}, {99999.99, 200}} {
		f.Add(s.f, s.k)
	}
	f.Fuzz(func(t *testing.T, fld float64, k int) {
		if k > 2*MaxLevels {
			k = k%(2*MaxLevels) + 1
		}
		lv, err := Solver{}.Levels(nil, fld, k)
		if err != nil {
			if !errors.Is(err, tiltwell.ErrField) && !errors.Is(err, tiltwell.ErrLevel) && !errors.Is(err, tiltwell.ErrOutOfRange) {
				t.Fatalf("f=%g k=%d: unexpected error %v", fld, k, err)
			}
			return
		}
		for _, l := range lv {
			if math.IsNaN(l.Energy) || math.IsNaN(l.Err) || math.IsInf(l.Energy, 0) || l.Err < 0 {
				t.Fatalf("f=%g k=%d: bad level %+v", fld, k, l)
			}
		}
		w, err := Solver{}.Wavefunction(fld, len(lv))
		if err != nil {
			t.Fatalf("f=%g n=%d: wavefunction: %v", fld, len(lv), err)
		}
		for _, x := range []float64{0, 0.25, 0.5, 0.999} {
			if v := w.At(x); math.IsNaN(v) || math.IsInf(v, 0) {
				t.Fatalf("f=%g n=%d: φ(%g) = %v", fld, len(lv), x, v)
			}
		}
	})
}
