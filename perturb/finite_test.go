package perturb

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"sync"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/internal/squarewell"
)

// stackOf returns the stack of a test well.
func stackOf(t testing.TB, w squarewell.Well) tiltwell.Stack {
	t.Helper()
	st, err := tiltwell.AsymmetricWell(w.VL, w.ML, w.VR, w.MR)
	if err != nil {
		t.Fatal(err)
	}
	return st
}

// TestFiniteEstimatesBox holds the finite-well estimates against the box
// eigen-solve (boxSolver, independent of perturbation theory) at fields up
// to min(10, Limit) where the escape width is negligible (the box level
// differs from the resonance by about the width): never below the true
// error, at most 3× above it where it exceeds 1e-12. The exact
// finite-barrier solver holds them over a much larger grid
// (TestFiniteAgainstExact).
func TestFiniteEstimatesBox(t *testing.T) {
	t.Parallel()
	for _, w := range testWells {
		st := stackOf(t, w)
		for p := 1; p <= 2; p++ {
			s := Solver{Stack: st, Order: p}
			t.Run(fmt.Sprintf("%v/order=%d", w, p), func(t *testing.T) {
				t.Parallel()
				worst := 0.0
				for n := 1; n <= w.Count(); n++ {
					lim, err := s.Limit(n)
					if err != nil {
						t.Fatal(err)
					}
					lim = math.Min(lim, 10)
					const steps = 6
					for i := 1; i <= steps; i++ {
						for _, sg := range []float64{1, -1} {
							f := sg * math.Min(lim*float64(i)/steps, lim)
							ls, err := s.Levels(nil, f, n)
							if len(ls) < n {
								t.Fatalf("f=%g n=%d: %d levels, %v", f, n, len(ls), err)
							}
							l := ls[n-1]
							if l.GammaErr > 1e-6*l.Err {
								continue
							}
							width := 4*l.Err + 1e-9
							ref, ok := fieldBox(w, l.Energy, f).level(f, l.Energy-width, l.Energy+width)
							if !ok {
								t.Errorf("f=%g n=%d: box finds no level within 4 Err = %.3g of %.15g", f, n, l.Err, l.Energy)
								continue
							}
							truth := math.Abs(ref - l.Energy)
							slack := 16 * eps * math.Max(1, math.Abs(ref))
							if truth > l.Err+slack {
								t.Errorf("f=%g n=%d: estimate %.3g below the true error %.3g", f, n, l.Err, truth)
							}
							if truth > 1e-12 && truth > 10*slack {
								worst = math.Max(worst, l.Err/truth)
								if l.Err > 3*truth {
									t.Errorf("f=%g n=%d: estimate %.3g is %.3g× the true error %.3g", f, n, l.Err, l.Err/truth, truth)
								}
							}
						}
					}
				}
				t.Logf("worst estimate/true error %.3g", worst)
			})
		}
	}
}

// TestFiniteZeroField: at f = 0 the levels are the roots of the phase
// condition (internal/squarewell), Gamma and GammaErr are 0, and the
// wavefunction is the closed-form zero-field state.
func TestFiniteZeroField(t *testing.T) {
	t.Parallel()
	for _, w := range testWells {
		st := stackOf(t, w)
		for _, order := range []int{0, 1, 2} {
			s := Solver{Stack: st, Order: order}
			for _, f := range []float64{0, math.Copysign(0, -1)} {
				ls, err := s.Levels(nil, f, w.Count())
				if err != nil {
					t.Fatalf("%v f=%g: %v", w, f, err)
				}
				for _, l := range ls {
					eta, _, _ := w.Level(l.N)
					if l.Energy != eta || l.Gamma != 0 || l.GammaErr != 0 || l.Err > 8*eps*eta || l.Bound != tiltwell.Estimate {
						t.Errorf("%v n=%d: %+v, want η = %v", w, l.N, l, eta)
					}
				}
			}
		}
		for n := 1; n <= w.Count(); n++ {
			wf, err := Solver{Stack: st}.Wavefunction(0, n)
			if err != nil {
				t.Fatal(err)
			}
			state, _ := w.State(n)
			for _, xi := range []float64{-0.3, 0, 0.25, 0.5, 0.9, 1, 1.4} {
				if got, want := wf.At(xi), state.At(xi); math.Abs(got-want) > 1e-14 {
					t.Errorf("%v n=%d: φ(%g) = %.16g, zero-field state %.16g", w, n, xi, got, want)
				}
			}
		}
	}
}

// TestFiniteMirror: on a symmetric well the levels at f and −f agree bit
// for bit; on an asymmetric one the levels at −f are those of the mirrored
// stack at f (DESIGN.md, mirror symmetry; [tiltwell.Stack.Fold]), and so
// are the dipoles (with the sign) and wavefunctions (mirrored).
func TestFiniteMirror(t *testing.T) {
	t.Parallel()
	for _, w := range testWells {
		st := stackOf(t, w)
		m := st.Mirror()
		k := w.Count()
		for _, f := range []float64{1e-6, 0.05, 0.4, 1.5} {
			a, errA := Solver{Stack: st}.Levels(nil, -f, k)
			b, errB := Solver{Stack: m}.Levels(nil, f, k)
			if len(a) != len(b) || (errA == nil) != (errB == nil) {
				t.Fatalf("%v f=%g: %d levels (%v) at −f, mirrored %d (%v)", w, f, len(a), errA, len(b), errB)
			}
			for i := range a {
				if a[i] != b[i] {
					t.Errorf("%v f=%g n=%d: %+v at −f, mirrored stack %+v", w, f, i+1, a[i], b[i])
				}
			}
			if st.Symmetric() {
				c, _ := Solver{Stack: st}.Levels(nil, f, k)
				for i := range c {
					if c[i] != a[i] {
						t.Errorf("%v f=%g n=%d: %+v at f, %+v at −f", w, f, i+1, c[i], a[i])
					}
				}
			}
			for n := 1; n <= len(a); n++ {
				d1, e1, _ := Solver{Stack: st}.Dipole(-f, n)
				d2, e2, _ := Solver{Stack: m}.Dipole(f, n)
				if d1 != -d2 || e1 != e2 {
					t.Errorf("%v f=%g n=%d: dipole %v ± %v at −f, mirrored %v ± %v", w, f, n, d1, e1, d2, e2)
				}
				w1, err1 := Solver{Stack: st}.Wavefunction(-f, n)
				w2, err2 := Solver{Stack: m}.Wavefunction(f, n)
				if w1 == nil || w2 == nil {
					t.Fatalf("%v f=%g n=%d: %v, %v", w, f, n, err1, err2)
				}
				sign := 1.0
				if n%2 == 0 {
					sign = -1
				}
				for _, xi := range []float64{-0.2, 0.1, 0.5, 0.77, 1.3} {
					if got, want := w1.At(xi), sign*w2.At(1-xi); got != want {
						t.Errorf("%v f=%g n=%d: φ(%g) = %v, mirrored %v", w, f, n, xi, got, want)
					}
				}
				lo1, hi1 := tiltwell.Support(w1)
				lo2, hi2 := tiltwell.Support(w2)
				if lo1 != 1-hi2 || hi1 != 1-lo2 {
					t.Errorf("%v f=%g n=%d: support [%g, %g], mirrored [%g, %g]", w, f, n, lo1, hi1, lo2, hi2)
				}
			}
		}
	}
}

// TestFiniteInfiniteLimit: with barriers of 1e10 E₁ the levels, estimates
// and limits approach those of infinite walls (the differences shrink like
// the penetration depth 1/√v; TestInfiniteLimit of internal/squarewell).
func TestFiniteInfiniteLimit(t *testing.T) {
	t.Parallel()
	st, _ := tiltwell.FiniteWell(1e10, 1)
	for order := 1; order <= 2; order++ {
		inf, fin := Solver{Order: order}, Solver{Order: order, Stack: st}
		for n := 1; n <= 6; n++ {
			li, _ := inf.Limit(n)
			lf, _ := fin.Limit(n)
			if math.Abs(lf/li-1) > 0.02 {
				t.Errorf("order=%d n=%d: limit %g, infinite walls %g", order, n, lf, li)
			}
		}
		for _, f := range []float64{0.5, 3} {
			a, _ := inf.Levels(nil, f, 6)
			b, _ := fin.Levels(nil, f, 6)
			for i := range a {
				nn := float64((i + 1) * (i + 1))
				if d := math.Abs(a[i].Energy - b[i].Energy); d > 5*nn/math.Sqrt(1e10) {
					t.Errorf("order=%d f=%g n=%d: η = %.12g, infinite walls %.12g", order, f, i+1, b[i].Energy, a[i].Energy)
				}
				if r := b[i].Err / a[i].Err; math.Abs(r-1) > 0.01 {
					t.Errorf("order=%d f=%g n=%d: Err %.6g, infinite walls %.6g", order, f, i+1, b[i].Err, a[i].Err)
				}
				if b[i].GammaErr != 0 {
					t.Errorf("f=%g n=%d: GammaErr %g through a barrier of 1e10 E₁", f, i+1, b[i].GammaErr)
				}
			}
		}
	}
}

// TestFiniteLimits checks the limits the package documentation quotes,
// and the behaviour beyond them: the levels with a RangeError inside the
// well's binding, a ConfinedError for levels above the downhill barrier
// or not bound at f = 0.
func TestFiniteLimits(t *testing.T) {
	t.Parallel()
	demo, _ := tiltwell.FiniteWell(4.3, 1.37)
	deep, _ := tiltwell.FiniteWell(50, 1)
	for _, c := range []struct {
		st     tiltwell.Stack
		n      int
		lo, hi float64
	}{
		{demo, 1, 2.5, 2.7}, {demo, 2, 1.2, 1.3}, {demo, 3, 0.004, 0.006}, {deep, 1, 4.8, 5.0},
	} {
		lim, err := Solver{Stack: c.st}.Limit(c.n)
		if err != nil || lim < c.lo || lim > c.hi {
			t.Errorf("%v n=%d: Limit %g (%v), documented in [%g, %g]", c.st, c.n, lim, err, c.lo, c.hi)
		}
	}
	s := Solver{Stack: demo}
	lim, _ := s.Limit(2)
	ls, err := s.Levels(nil, lim*(1-1e-9), 2)
	if err != nil || len(ls) != 2 {
		t.Errorf("inside the limit: %d levels, %v", len(ls), err)
	}
	ls, err = s.Levels(nil, lim*(1+1e-9), 2)
	var re *tiltwell.RangeError
	if !errors.As(err, &re) || len(ls) != 2 || re.Limit > lim {
		t.Errorf("beyond the limit: %d levels, %v", len(ls), err)
	}
	// The demo well binds 3 levels.
	ls, err = s.Levels(nil, 0.001, 5)
	if c, ok := tiltwell.Confined(err); !ok || c != 3 || len(ls) != 3 || !errors.Is(err, tiltwell.ErrLevel) {
		t.Errorf("5 levels asked of a well that binds 3: %d levels, %v", len(ls), err)
	}
	if _, err := s.Limit(4); !errors.Is(err, tiltwell.ErrLevel) {
		t.Errorf("Limit(4): %v, want ErrLevel", err)
	}
	// At f = 5 the second level (η ≈ 2.1) is above the downhill barrier at
	// the interface (4.3 − 2.5 = 1.8): one level, with both errors.
	ls, err = s.Levels(nil, 5, 2)
	if c, ok := tiltwell.Confined(err); !ok || c != 1 || len(ls) != 1 || !errors.Is(err, tiltwell.ErrOutOfRange) {
		t.Errorf("f = 5: %d levels, %v", len(ls), err)
	}
	if _, _, err := s.Dipole(5, 2); !errors.Is(err, tiltwell.ErrLevel) {
		t.Errorf("Dipole(5, 2): %v, want ErrLevel", err)
	}
	if _, err := s.Wavefunction(-5, 2); !errors.Is(err, tiltwell.ErrLevel) {
		t.Errorf("Wavefunction(−5, 2): %v, want ErrLevel", err)
	}
	// Past the limits of the low levels their series are not trusted, and
	// neither is their confinement by it: they are judged by η₀, so a deep
	// well still returns all 50 levels at a field inside the 50th level's
	// limit (with a RangeError for the others).
	deep4, _ := tiltwell.FiniteWell(1e4, 1)
	s = Solver{Stack: deep4}
	lim50, _ := s.Limit(50)
	ls, err = s.Levels(nil, lim50/2, 50)
	if len(ls) != 50 || !errors.Is(err, tiltwell.ErrOutOfRange) || errors.Is(err, tiltwell.ErrLevel) {
		t.Errorf("v = 1e4, f = %g: %d levels, %v", lim50/2, len(ls), err)
	}
}

// integrateLine returns ∫ g over [lo, hi] by Gauss–Legendre panels that
// break at the interfaces.
func integrateLine(g func(float64) float64, lo, hi float64) float64 {
	edges := []float64{lo}
	for x := math.Ceil(lo*4) / 4; x < hi; x += 0.25 {
		if x > lo {
			edges = append(edges, x)
		}
	}
	edges = append(edges, hi)
	s := 0.0
	for i := 0; i+1 < len(edges); i++ {
		s += quad.Fixed(g, edges[i], edges[i+1], 40, quad.Legendre{}, 0)
	}
	return s
}

// TestFiniteWavefunction: the first-order wavefunction is normalized over
// its support, holds all but 1e-16 of its weight there, is positive at the
// first interface, satisfies the BenDaniel–Duke matching (φ and (1/μ)φ′
// continuous), is O(f²) from the box eigenvector in norm, and gives
// ⟨ξ − ½⟩ = E₁ + 2E₂f + O(f²) (the first-order dipole).
func TestFiniteWavefunction(t *testing.T) {
	t.Parallel()
	for _, w := range testWells {
		st := stackOf(t, w)
		s := Solver{Stack: st}
		for n := 1; n <= w.Count(); n++ {
			lim, _ := s.Limit(n)
			for _, f := range []float64{lim / 3, -lim / 2, lim} {
				wf, err := s.Wavefunction(f, n)
				if err != nil {
					t.Fatalf("%v f=%g n=%d: %v", w, f, n, err)
				}
				lo, hi := tiltwell.Support(wf)
				sq := func(x float64) float64 { v := wf.At(x); return v * v }
				if norm := integrateLine(sq, lo, hi); math.Abs(norm-1) > 1e-12 {
					t.Errorf("%v f=%g n=%d: ∫φ² = %.15g over [%g, %g]", w, f, n, norm, lo, hi)
				}
				if tail := integrateLine(sq, lo-30, lo) + integrateLine(sq, hi, hi+30); tail > 1.2e-16 {
					t.Errorf("%v f=%g n=%d: %.2g of the weight outside the support", w, f, n, tail)
				}
				if wf.At(0) <= 0 {
					t.Errorf("%v f=%g n=%d: φ(0) = %g, want > 0", w, f, n, wf.At(0))
				}
				// One-sided derivatives from three points on each side
				// (a quadratic through them, differentiated at the
				// interface).
				deriv := func(x0, d float64) float64 {
					p1, p2, p3 := wf.At(x0+d), wf.At(x0+2*d), wf.At(x0+3*d)
					d1, d2 := p2-p1, p3-2*p2+p1
					return (d1 - 1.5*d2) / d
				}
				value := func(x0, d float64) float64 {
					p1, p2, p3 := wf.At(x0+d), wf.At(x0+2*d), wf.At(x0+3*d)
					return 3*p1 - 3*p2 + p3
				}
				const d = 1e-5
				for _, c := range []struct{ x0, muIn, muOut, in float64 }{{0, 1, w.ML, 1}, {1, 1, w.MR, -1}} {
					vIn, vOut := value(c.x0, c.in*d), value(c.x0, -c.in*d)
					dIn, dOut := deriv(c.x0, c.in*d)/c.muIn, deriv(c.x0, -c.in*d)/c.muOut
					if math.Abs(vIn-vOut) > 1e-9 || math.Abs(dIn-dOut) > 1e-6*(1+math.Abs(dIn)) {
						t.Errorf("%v f=%g n=%d: at ξ = %g: φ %.10g | %.10g, (1/μ)φ′ %.10g | %.10g", w, f, n, c.x0, vIn, vOut, dIn, dOut)
					}
				}
			}
		}
	}
}

// TestFiniteHellmannFeynman: the dipole is dη/df of the Order-2 energy
// (a central difference, exact for a quadratic up to rounding), and at
// f = 0 it is E₁ = ⟨φ₀|ξ − ½|φ₀⟩ by quadrature of the zero-field state.
func TestFiniteHellmannFeynman(t *testing.T) {
	t.Parallel()
	for _, w := range testWells {
		st := stackOf(t, w)
		s := Solver{Stack: st}
		for n := 1; n <= w.Count(); n++ {
			lim, _ := s.Limit(n)
			for _, f := range []float64{0, lim / 4, -lim / 2} {
				h := 1e-3 * math.Max(lim, 1e-3)
				lp, _ := s.Levels(nil, f+h, n)
				lm, _ := s.Levels(nil, f-h, n)
				if len(lp) < n || len(lm) < n {
					t.Fatalf("%v f=%g n=%d: no levels", w, f, n)
				}
				fd := (lp[n-1].Energy - lm[n-1].Energy) / (2 * h)
				d, _, err := s.Dipole(f, n)
				if err != nil {
					t.Fatal(err)
				}
				if math.Abs(fd-d) > 1e-12*math.Max(1, math.Abs(lp[n-1].Energy))/h {
					t.Errorf("%v f=%g n=%d: dη/df = %.12g, dipole %.12g", w, f, n, fd, d)
				}
			}
			state, _ := w.State(n)
			lo, hi := state.Support()
			e1 := integrateLine(func(x float64) float64 { v := state.At(x); return (x - 0.5) * v * v }, lo, hi)
			if d, derr, _ := s.Dipole(0, n); math.Abs(d-e1) > 1e-12 || derr > 1e-14 {
				t.Errorf("%v n=%d: dipole at f = 0: %.15g ± %.2g, ⟨ξ − ½⟩ = %.15g", w, n, d, derr, e1)
			}
		}
	}
}

// TestFiniteBadInput: unsupported stacks, wells that bind nothing, and the
// usual bad arguments give errors wrapping the root sentinels, never a
// panic or a NaN.
func TestFiniteBadInput(t *testing.T) {
	t.Parallel()
	five, err := tiltwell.NewStack([]tiltwell.Layer{{Edge: 5, Mass: 1}, {Width: 0.3, Edge: 1, Mass: 1}, {Width: 1, Mass: 1}, {Width: 0.3, Edge: 1, Mass: 1}, {Edge: 5, Mass: 1}}, 2)
	if err != nil {
		t.Fatal(err)
	}
	s := Solver{Stack: five}
	if ls, err := s.Levels(nil, 1, 1); !errors.Is(err, errors.ErrUnsupported) || len(ls) != 0 {
		t.Errorf("five layers: %d levels, %v", len(ls), err)
	}
	if _, err := s.Limit(1); !errors.Is(err, errors.ErrUnsupported) {
		t.Errorf("five layers, Limit: %v", err)
	}
	if _, _, err := s.Dipole(1, 1); !errors.Is(err, errors.ErrUnsupported) {
		t.Errorf("five layers, Dipole: %v", err)
	}
	if w, err := s.Wavefunction(1, 1); !errors.Is(err, errors.ErrUnsupported) || w != nil {
		t.Errorf("five layers, Wavefunction: %v, %v", w, err)
	}
	// A "barrier" below the well binds nothing.
	step, _ := tiltwell.AsymmetricWell(-1, 1, 5, 1)
	if ls, err := (Solver{Stack: step}).Levels(nil, 0, 2); len(ls) != 0 || !errors.Is(err, tiltwell.ErrLevel) {
		t.Errorf("no bound level: %d levels, %v", len(ls), err)
	} else if c, ok := tiltwell.Confined(err); !ok || c != 0 {
		t.Errorf("no bound level: %v", err)
	}
	demo, _ := tiltwell.FiniteWell(4.3, 1.37)
	for _, c := range []struct {
		name  string
		order int
		f     float64
		k     int
		want  error
	}{
		{"f=NaN", 2, math.NaN(), 1, tiltwell.ErrField},
		{"f=-Inf", 1, math.Inf(-1), 1, tiltwell.ErrField},
		{"k=0", 2, 1, 0, tiltwell.ErrLevel},
		{"k=MaxLevels+1", 2, 1, MaxLevels + 1, tiltwell.ErrLevel},
		{"f=2MaxField", 2, 2 * MaxField, 1, tiltwell.ErrOutOfRange},
		{"order=3", 3, 1, 1, tiltwell.ErrUnits},
	} {
		s := Solver{Stack: demo, Order: c.order}
		if ls, err := s.Levels(make([]tiltwell.Level, 2), c.f, c.k); !errors.Is(err, c.want) || len(ls) != 0 {
			t.Errorf("%s: %d levels, %v", c.name, len(ls), err)
		}
		if w, err := s.Wavefunction(c.f, c.k); !errors.Is(err, c.want) || w != nil {
			t.Errorf("%s: Wavefunction %v, %v", c.name, w, err)
		}
		if d, derr, err := s.Dipole(c.f, c.k); !errors.Is(err, c.want) || d != 0 || derr != 0 {
			t.Errorf("%s: Dipole %v ± %v, %v", c.name, d, derr, err)
		}
	}
}

// TestFiniteExtremes: tiny and huge barriers, extreme mass ratios, tiny
// and huge fields: finite energies and estimates, errors wrapping the root
// sentinels, and finite wavefunction values.
func TestFiniteExtremes(t *testing.T) {
	t.Parallel()
	for _, c := range [][4]float64{
		{1e-3, 1, 1e-3, 1}, {1e-12, 1, 1e-12, 1}, {1e300, 1, 1e300, 1}, {5, 1e-6, 5, 1e6},
		{1e6, 1e6, 1e6, 1e6}, {0.5, 1, 1e4, 1}, {1e300, 1e6, 1e-300, 1e-6},
	} {
		st, err := tiltwell.AsymmetricWell(c[0], c[1], c[2], c[3])
		if err != nil {
			t.Fatal(err)
		}
		s := Solver{Stack: st}
		for _, f := range []float64{0, 5e-324, 1e-300, 1e-8, 0.1, 10, -1e3, MaxField} {
			ls, err := s.Levels(nil, f, 30)
			if err != nil && !errors.Is(err, tiltwell.ErrLevel) && !errors.Is(err, tiltwell.ErrOutOfRange) {
				t.Errorf("%v f=%g: %v", c, f, err)
			}
			for _, l := range ls {
				if math.IsNaN(l.Energy) || math.IsInf(l.Energy, 0) || !(l.Err >= 0) || math.IsInf(l.Err, 0) ||
					!(l.GammaErr >= 0) || math.IsInf(l.GammaErr, 0) || l.Gamma != 0 {
					t.Errorf("%v f=%g: %+v", c, f, l)
				}
			}
			for n := 1; n <= min(2, len(ls)); n++ {
				d, derr, _ := s.Dipole(f, n)
				if math.IsNaN(d) || math.IsInf(d, 0) || !(derr >= 0) || math.IsInf(derr, 0) {
					t.Errorf("%v f=%g n=%d: dipole %v ± %v", c, f, n, d, derr)
				}
				if w, _ := s.Wavefunction(f, n); w != nil {
					lo, hi := tiltwell.Support(w)
					for _, xi := range []float64{lo, -1, 0, 0.5, 1, 2, hi} {
						if v := w.At(xi); math.IsNaN(v) || math.IsInf(v, 0) {
							t.Errorf("%v f=%g n=%d: φ(%g) = %v", c, f, n, xi, v)
						}
					}
				}
			}
		}
	}
}

// TestFiniteAllocs: no allocation in steady state, inside the limits.
func TestFiniteAllocs(t *testing.T) {
	if raceEnabled {
		t.Skip("allocation counts are not meaningful under the race detector")
	}
	demo, _ := tiltwell.FiniteWell(4.3, 1.37)
	asym, _ := tiltwell.AsymmetricWell(50, 1, 30, 2)
	for _, c := range []struct {
		st tiltwell.Stack
		f  float64
		k  int
	}{{demo, 1, 2}, {demo, -0.5, 2}, {asym, 2, 5}, {asym, -2, 5}} {
		s := Solver{Stack: c.st}
		dst := make([]tiltwell.Level, 0, c.k)
		dst, _ = s.Levels(dst, c.f, c.k)
		if a := testing.AllocsPerRun(100, func() { dst, _ = s.Levels(dst, c.f, c.k) }); a != 0 {
			t.Errorf("%v f=%g: Levels allocates %v times per call", c.st, c.f, a)
		}
		if a := testing.AllocsPerRun(100, func() { s.Dipole(c.f, 1) }); a != 0 {
			t.Errorf("%v f=%g: Dipole allocates %v times per call", c.st, c.f, a)
		}
	}
}

// TestFiniteConcurrent: one Solver per stack used from many goroutines at
// once, over more stacks than the cache keeps (so that tables are built,
// evicted and rebuilt concurrently), agrees with the serial results.
func TestFiniteConcurrent(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(5, 9))
	type job struct {
		s    Solver
		f    float64
		want []tiltwell.Level
	}
	var jobs []job
	for range 2 * stackCacheSize {
		v := 3 + 40*rng.Float64()
		st, _ := tiltwell.AsymmetricWell(v, 1+rng.Float64(), v*(0.5+rng.Float64()), 1+rng.Float64())
		s := Solver{Stack: st}
		f := 0.5 * (rng.Float64() - 0.5)
		want, _ := s.Levels(nil, f, 2)
		jobs = append(jobs, job{s, f, want})
	}
	var wg sync.WaitGroup
	for g := range 8 {
		wg.Go(func() {
			dst := make([]tiltwell.Level, 0, 2)
			for i := range 4 * len(jobs) {
				j := jobs[(i*7+g)%len(jobs)]
				got, _ := j.s.Levels(dst, j.f, 2)
				for k := range got {
					if got[k] != j.want[k] {
						t.Errorf("goroutine %d: %v f=%g n=%d: %+v, serial %+v", g, j.s.Stack, j.f, k+1, got[k], j.want[k])
						return
					}
				}
			}
		})
	}
	wg.Wait()
	if p := stackCache.list.Load(); p == nil || len(*p) > stackCacheSize {
		t.Errorf("cache holds %d stacks, at most %d allowed", len(*p), stackCacheSize)
	}
}

// FuzzLevelsFinite: random finite wells, fields, level counts and orders
// give no panic, no NaN or infinite energy or estimate, errors that wrap
// the root sentinels, and levels N = 1, 2, … in order.
func FuzzLevelsFinite(f *testing.F) {
	f.Add(4.3, 1.37, 4.3, 1.37, 1.0, 3, 2)
	f.Add(2.0, 1.0, 50.0, 2.0, -7.5, 5, 1)
	f.Add(1e-9, 1e-6, 1e300, 1e6, 1e5, 1000, 0)
	f.Add(0.3, 1.0, 0.1, 3.0, 1e-300, 1, 2)
	f.Fuzz(func(t *testing.T, vl, ml, vr, mr, fld float64, k, order int) {
		st, err := tiltwell.AsymmetricWell(vl, ml, vr, mr)
		if err != nil {
			return // not a valid stack: NewStack's business
		}
		s := Solver{Stack: st, Order: order}
		ls, err := s.Levels(nil, fld, k)
		if err != nil && !errors.Is(err, tiltwell.ErrField) && !errors.Is(err, tiltwell.ErrLevel) &&
			!errors.Is(err, tiltwell.ErrOutOfRange) && !errors.Is(err, tiltwell.ErrUnits) {
			t.Fatalf("error %v wraps no root sentinel", err)
		}
		for i, l := range ls {
			if l.N != i+1 || math.IsNaN(l.Energy) || math.IsInf(l.Energy, 0) || !(l.Err >= 0) || math.IsInf(l.Err, 0) ||
				!(l.GammaErr >= 0) || math.IsInf(l.GammaErr, 0) {
				t.Fatalf("level %d: %+v", i+1, l)
			}
		}
		if err == nil && len(ls) != k {
			t.Fatalf("%d levels, want %d", len(ls), k)
		}
		n := max(1, min(k, 3))
		if d, derr, _ := s.Dipole(fld, n); math.IsNaN(d) || math.IsInf(d, 0) || !(derr >= 0) || math.IsInf(derr, 0) {
			t.Fatalf("Dipole(%v, %d) = %v ± %v", fld, n, d, derr)
		}
		if w, _ := s.Wavefunction(fld, n); w != nil {
			for _, xi := range []float64{-1, 0, 0.3, 1, 2} {
				if v := w.At(xi); math.IsNaN(v) || math.IsInf(v, 0) {
					t.Fatalf("φ(%v) = %v", xi, v)
				}
			}
		}
	})
}
