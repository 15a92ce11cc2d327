package exact

import (
	"errors"
	"math"
	"math/cmplx"
	"testing"

	"github.com/tiltwell/tiltwell"
	"gonum.org/v1/gonum/integrate/quad"
)

// mustWell returns the finite well of barrier v and barrier mass ratio mu.
func mustWell(t testing.TB, v, mu float64) tiltwell.Stack {
	t.Helper()
	s, err := tiltwell.FiniteWell(v, mu)
	if err != nil {
		t.Fatal(err)
	}
	return s
}

func mustStack(t testing.TB, layers []tiltwell.Layer, ref int) tiltwell.Stack {
	t.Helper()
	s, err := tiltwell.NewStack(layers, ref)
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// roots returns the roots of g on (lo, hi), found by scanning n cells for
// sign changes and bisecting each to the last bit.
func roots(g func(float64) float64, lo, hi float64, n int) []float64 {
	var out []float64
	a, ga := lo, g(lo)
	for i := 1; i <= n; i++ {
		b := lo + (hi-lo)*float64(i)/float64(n)
		gb := g(b)
		if ga == 0 {
			out = append(out, a)
		} else if (ga < 0) != (gb < 0) && gb != 0 {
			x0, x1, g0 := a, b, ga
			for range 200 {
				m := x0 + (x1-x0)/2
				if m == x0 || m == x1 {
					break
				}
				if gm := g(m); (gm < 0) == (g0 < 0) {
					x0, g0 = m, gm
				} else {
					x1 = m
				}
			}
			out = append(out, x0+(x1-x0)/2)
		}
		a, ga = b, gb
	}
	return out
}

// textbookLevels returns the bound levels of the symmetric finite well
// from the textbook even and odd conditions, with the BenDaniel–Duke mass
// ratio μ of the barrier (G. Bastard, Wave Mechanics Applied to
// Semiconductor Heterostructures (1988), ch. III; from memory):
//
//	even: k tan(k/2) = κ/μ,   odd: −k cot(k/2) = κ/μ,
//
// k = π√η, κ = π√(μ(v − η)), written without poles as k sin(k/2) −
// (κ/μ)cos(k/2) = 0 and k cos(k/2) + (κ/μ) sin(k/2) = 0.
func textbookLevels(v, mu float64) []float64 {
	kap := func(eta float64) float64 { return math.Pi * math.Sqrt(mu*(v-eta)) }
	even := func(eta float64) float64 {
		k := math.Pi * math.Sqrt(eta)
		return k*math.Sin(k/2) - kap(eta)/mu*math.Cos(k/2)
	}
	odd := func(eta float64) float64 {
		k := math.Pi * math.Sqrt(eta)
		return k*math.Cos(k/2) + kap(eta)/mu*math.Sin(k/2)
	}
	n := 4000 + int(40*math.Sqrt(v))
	// The odd condition vanishes trivially at k = 0: start above it.
	all := append(roots(even, 1e-12, v, n), roots(odd, 1e-12, v, n)...)
	sortFloats(all)
	return all
}

func sortFloats(x []float64) {
	for i := 1; i < len(x); i++ {
		for j := i; j > 0 && x[j] < x[j-1]; j-- {
			x[j], x[j-1] = x[j-1], x[j]
		}
	}
}

// TestStackTextbookFiniteWell checks the zero-field levels of symmetric
// finite wells against the textbook even and odd conditions solved here
// by bisection, and the number of bound levels against their count.
func TestStackTextbookFiniteWell(t *testing.T) {
	t.Parallel()
	for _, c := range []struct{ v, mu float64 }{
		{4.3, 1.37}, {1, 1}, {0.3, 2}, {30, 0.5}, {100, 1}, {2000, 3},
	} {
		want := textbookLevels(c.v, c.mu)
		st := mustWell(t, c.v, c.mu)
		got, err := Solver{Stack: st}.Levels(nil, 0, len(want)+1)
		if n, ok := tiltwell.Confined(err); !ok || n != len(want) {
			t.Errorf("v=%g μ=%g: Levels(k=%d) error %v, want a ConfinedError with %d confined", c.v, c.mu, len(want)+1, err, len(want))
		}
		if len(got) != len(want) {
			t.Fatalf("v=%g μ=%g: %d levels, want %d", c.v, c.mu, len(got), len(want))
		}
		for i, w := range want {
			g := got[i]
			d := math.Abs(g.Energy - w)
			tol := 4 * eps * max(1, w)
			if d > g.Err+tol || d > 1e-13*max(1, w) {
				t.Errorf("v=%g μ=%g n=%d: η = %.17g, textbook %.17g (diff %.2g, Err %.2g)", c.v, c.mu, i+1, g.Energy, w, d, g.Err)
			}
			if g.Gamma != 0 || g.GammaErr != 0 {
				t.Errorf("v=%g μ=%g n=%d: Γ = %g ± %g at f = 0, want 0 ± 0", c.v, c.mu, i+1, g.Gamma, g.GammaErr)
			}
		}
	}
}

// doubleWell returns the stack of two wells of width 1 (the left one the
// reference) separated by a barrier of width b, all barriers of height v
// and mass ratio mu.
func doubleWell(t testing.TB, v, mu, b float64) tiltwell.Stack {
	return mustStack(t, []tiltwell.Layer{
		{Edge: v, Mass: mu}, {Width: 1, Mass: 1}, {Width: b, Edge: v, Mass: mu}, {Width: 1, Mass: 1}, {Edge: v, Mass: mu},
	}, 1)
}

// doubleWellPair returns the even and odd ground levels of the symmetric
// double well from the matching conditions written out by hand
// (textbook, from memory): in the middle barrier φ = cosh κx (even) or
// sinh κx (odd), in the well φ = A cos k(x − b/2) + B sin k(x − b/2) with
// A = cosh(κb/2), B = κ sinh(κb/2)/(μk) (even; odd swaps cosh and sinh),
// and the decaying exponential outside:
//
//	k(−A sin k + B cos k) + (κ/μ)(A cos k + B sin k) = 0.
func doubleWellPair(v, mu, b float64) (even, odd float64) {
	g := func(eta float64, isOdd bool) float64 {
		k := math.Pi * math.Sqrt(eta)
		kap := math.Pi * math.Sqrt(mu*(v-eta))
		t := math.Tanh(kap * b / 2)
		A, B := 1.0, kap*t/(mu*k)
		if isOdd {
			A, B = t, kap/(mu*k)
		}
		s, c := math.Sincos(k)
		return k*(-A*s+B*c) + kap/mu*(A*c+B*s)
	}
	e := roots(func(x float64) float64 { return g(x, false) }, 1e-9, v, 20000)
	o := roots(func(x float64) float64 { return g(x, true) }, 1e-9, v, 20000)
	return e[0], o[0]
}

// TestStackDoubleWellSplitting checks the two lowest levels of symmetric
// double wells at f = 0, and their splitting, against the closed-form even
// and odd conditions.
func TestStackDoubleWellSplitting(t *testing.T) {
	t.Parallel()
	for _, c := range []struct{ v, mu, b float64 }{
		{10, 1, 0.3}, {10, 1, 1}, {4.3, 1.37, 0.2}, {50, 0.7, 0.5}, {20, 1, 2.5},
	} {
		e, o := doubleWellPair(c.v, c.mu, c.b)
		got, err := Solver{Stack: doubleWell(t, c.v, c.mu, c.b)}.Levels(nil, 0, 2)
		if err != nil {
			t.Fatal(err)
		}
		for i, w := range []float64{e, o} {
			d := math.Abs(got[i].Energy - w)
			if d > got[i].Err+4*eps*max(1, w) || d > 1e-13*max(1, w) {
				t.Errorf("v=%g μ=%g b=%g n=%d: η = %.17g, closed form %.17g (diff %.2g, Err %.2g)", c.v, c.mu, c.b, i+1, got[i].Energy, w, d, got[i].Err)
			}
		}
		split, want := got[1].Energy-got[0].Energy, o-e
		if d := math.Abs(split - want); d > got[0].Err+got[1].Err+8*eps*max(1, e) {
			t.Errorf("v=%g μ=%g b=%g: splitting %.6g, closed form %.6g", c.v, c.mu, c.b, split, want)
		}
	}
}

// TestStackOrientation checks the numbers the team computed with mpmath
// for a 10 nm GaAs-like electron well (v = 4.3, μ = 1.37; a check of the
// project's own, not a publication): η₁ = 0.53932 at f = 0, η₁(1) =
// 0.50017 with Γ₁ ≈ 6.9e-14, η₁(2) = 0.38689 with Γ₁ ≈ 2.8e-6.
func TestStackOrientation(t *testing.T) {
	t.Parallel()
	s := Solver{Stack: mustWell(t, 4.3, 1.37)}
	for _, c := range []struct{ f, eta, gamma float64 }{
		{0, 0.53932, 0}, {1, 0.50017, 6.9e-14}, {2, 0.38689, 2.8e-6},
	} {
		l, err := s.Level(c.f, 1)
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(l.Energy-c.eta) > 0.5e-5 {
			t.Errorf("f=%g: η₁ = %.8f, want %.5f", c.f, l.Energy, c.eta)
		}
		if c.gamma == 0 && l.Gamma != 0 || c.gamma != 0 && math.Abs(l.Gamma/c.gamma-1) > 0.05/2.8 {
			t.Errorf("f=%g: Γ₁ = %.4g, want ≈ %.2g", c.f, l.Gamma, c.gamma)
		}
	}
}

// TestStackMirror checks η(f; v_L, v_R) = η(−f; v_R, v_L) and the same
// for Γ, for asymmetric wells and a stepped well (the operator with f → −f
// and ξ → 1 − ξ is the mirrored stack's; common practice, no source).
func TestStackMirror(t *testing.T) {
	t.Parallel()
	stacks := []tiltwell.Stack{}
	for _, w := range [][4]float64{{4.3, 1.37, 8, 0.9}, {30, 1, 6, 2}} {
		s, err := tiltwell.AsymmetricWell(w[0], w[1], w[2], w[3])
		if err != nil {
			t.Fatal(err)
		}
		stacks = append(stacks, s)
	}
	stacks = append(stacks, mustStack(t, []tiltwell.Layer{{Edge: 12, Mass: 1.2}, {Width: 0.4, Edge: 2, Mass: 1.1}, {Width: 1, Mass: 1}, {Edge: 9, Mass: 1.3}}, 2))
	for _, st := range stacks {
		a, b := Solver{Stack: st}, Solver{Stack: st.Mirror()}
		for _, f := range []float64{0.3, 1, 2.5} {
			la, ea := a.Levels(nil, f, 3)
			lb, eb := b.Levels(nil, -f, 3)
			if len(la) != len(lb) || (ea == nil) != (eb == nil) {
				t.Fatalf("%v f=%g: %d levels (%v) against %d mirrored (%v)", st, f, len(la), ea, len(lb), eb)
			}
			// The two see the interfaces rounded differently (1 − ξ):
			// equal within the error estimates.
			for i := range la {
				p, q := la[i], lb[i]
				if math.Abs(p.Energy-q.Energy) > p.Err+q.Err || math.Abs(p.Gamma-q.Gamma) > p.GammaErr+q.GammaErr {
					t.Errorf("%v f=%g n=%d: %+v, mirrored %+v", st, f, i+1, p, q)
				}
			}
		}
	}
}

// TestStackBadInput checks the errors for bad arguments.
func TestStackBadInput(t *testing.T) {
	t.Parallel()
	s := Solver{Stack: mustWell(t, 4.3, 1.37)}
	for _, c := range []struct {
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
		{2 * MaxField, 1, tiltwell.ErrOutOfRange},
		{0, 5, tiltwell.ErrLevel},
		{50, 1, tiltwell.ErrLevel},
	} {
		ls, err := s.Levels(nil, c.f, c.k)
		if !errors.Is(err, c.want) {
			t.Errorf("Levels(f=%g, k=%d): error %v, want %v", c.f, c.k, err, c.want)
		}
		if c.want != tiltwell.ErrLevel || c.k < 1 || c.k > MaxLevels {
			if len(ls) != 0 {
				t.Errorf("Levels(f=%g, k=%d) returned %d levels with its error", c.f, c.k, len(ls))
			}
		}
		if _, err := s.Level(c.f, c.k); !errors.Is(err, c.want) {
			t.Errorf("Level(f=%g, n=%d): error %v, want %v", c.f, c.k, err, c.want)
		}
		if _, err := s.Wavefunction(c.f, c.k); !errors.Is(err, c.want) {
			t.Errorf("Wavefunction(f=%g, n=%d): error %v, want %v", c.f, c.k, err, c.want)
		}
		if _, err := s.Dipole(c.f, c.k); !errors.Is(err, c.want) {
			t.Errorf("Dipole(f=%g, n=%d): error %v, want %v", c.f, c.k, err, c.want)
		}
	}
	// More levels than bound: the bound ones and how many exist.
	ls, err := s.Levels(nil, 0, 5)
	var ce *tiltwell.ConfinedError
	if !errors.As(err, &ce) || ce.Confined != 3 || len(ls) != 3 || ce.Asked != 5 {
		t.Errorf("Levels(f=0, k=5) = %d levels, %v; want 3 and a ConfinedError saying 3", len(ls), err)
	}
	if _, err := s.Level(0, 4); !errors.As(err, &ce) || ce.Confined != 3 {
		t.Errorf("Level(0, 4): %v, want a ConfinedError saying 3", err)
	}

}

// TestStackInfiniteLimit checks that as the barriers grow the levels
// approach the infinite-wall solver's at the rate the penetration depth
// sets: at f = 0, n² − η_n ≈ 4n²/(π√v) for μ = 1 (each phase shift is
// atan(k/κ) ≈ k/κ with κ = π√v; common practice, no source), so
// √v (η_∞ − η) tends to a constant; and that v = 1e300 neither overflows
// nor loses the levels.
func TestStackInfiniteLimit(t *testing.T) {
	t.Parallel()
	for _, f := range []float64{0, 1, 10} {
		inf, err := Solver{}.Levels(nil, f, 3)
		if err != nil {
			t.Fatal(err)
		}
		var prev [3]float64
		for e := 2; e <= 12; e += 2 {
			v := math.Pow(10, float64(e))
			ls, err := Solver{Stack: mustWell(t, v, 1)}.Levels(nil, f, 3)
			if err != nil {
				t.Fatalf("v=%g f=%g: %v", v, f, err)
			}
			for i, l := range ls {
				n := float64(i + 1)
				r := math.Sqrt(v) * (inf[i].Energy - l.Energy)
				if f == 0 {
					// 4n²/π (1 + O(1/√v)).
					if want := 4 * n * n / math.Pi; math.Abs(r/want-1) > 4/math.Sqrt(v)+1e-5 {
						t.Errorf("v=%g n=%d: √v(n² − η) = %.10g, want %.10g", v, i+1, r, want)
					}
				}
				if e > 2 {
					// The scaled difference settles: successive values
					// agree to O(1/√v).
					if math.Abs(r-prev[i]) > 20*math.Abs(r)/math.Sqrt(v)*10+1e-4*math.Abs(r) {
						t.Errorf("v=%g f=%g n=%d: √v(η_∞ − η) = %.10g, at v/100 %.10g", v, f, i+1, r, prev[i])
					}
				}
				prev[i] = r
			}
		}
		// v = 1e300: the infinite well to rounding.
		ls, err := Solver{Stack: mustWell(t, 1e300, 1)}.Levels(nil, f, 3)
		if err != nil {
			t.Fatalf("v=1e300 f=%g: %v", f, err)
		}
		for i, l := range ls {
			if d := math.Abs(l.Energy - inf[i].Energy); d > 1e-14*max(1, math.Abs(inf[i].Energy)) || math.IsNaN(l.Err) || l.Err > 1e-13 {
				t.Errorf("v=1e300 f=%g n=%d: η = %.17g ± %.2g, infinite walls %.17g", f, i+1, l.Energy, l.Err, inf[i].Energy)
			}
			if l.Gamma != 0 || l.GammaErr > gammaFloor {
				t.Errorf("v=1e300 f=%g n=%d: Γ = %g ± %g, want 0 (≤ 1e-300)", f, i+1, l.Gamma, l.GammaErr)
			}
		}
	}
}

// integrateSplit integrates g over [lo, hi] by 10-point Gauss–Legendre on
// pieces of length at most h, split at the stack's interfaces (where φ′
// jumps with the mass ratio).
func integrateSplit(g func(float64) float64, lo, hi, h float64, st tiltwell.Stack) float64 {
	cuts := []float64{lo}
	for _, x := range st.Interfaces(nil) {
		if x > lo && x < hi {
			cuts = append(cuts, x)
		}
	}
	cuts = append(cuts, hi)
	s := 0.0
	for i := 0; i+1 < len(cuts); i++ {
		a, b := cuts[i], cuts[i+1]
		n := int(math.Ceil((b - a) / h))
		for j := range n {
			x0 := a + (b-a)*float64(j)/float64(n)
			x1 := a + (b-a)*float64(j+1)/float64(n)
			s += quad.Fixed(g, x0, x1, 10, quad.Legendre{}, 0)
		}
	}
	return s
}

// testStacks is a small zoo of stacks for the identity checks: a GaAs-like
// finite well, an asymmetric well with different masses, a stepped well,
// and an asymmetric double well (all invented for the tests).
func testStacks(t testing.TB) map[string]tiltwell.Stack {
	asym, err := tiltwell.AsymmetricWell(6, 0.8, 12, 1.5)
	if err != nil {
		t.Fatal(err)
	}
	return map[string]tiltwell.Stack{
		"gaas":    mustWell(t, 4.3, 1.37),
		"asym":    asym,
		"stepped": mustStack(t, []tiltwell.Layer{{Edge: 12, Mass: 1.2}, {Width: 0.4, Edge: 2, Mass: 1.1}, {Width: 1, Mass: 1}, {Edge: 9, Mass: 1.3}}, 2),
		"double":  mustStack(t, []tiltwell.Layer{{Edge: 10, Mass: 1}, {Width: 1, Mass: 1}, {Width: 0.3, Edge: 10, Mass: 1.2}, {Width: 0.8, Edge: -0.5, Mass: 0.9}, {Edge: 10, Mass: 1}}, 1),
	}
}

// TestStackWavefunctions checks that the wavefunctions are normalized over
// their support, positive at the first interface, have n − 1 zeros
// between the outer interfaces, and (bound states) are orthogonal.
func TestStackWavefunctions(t *testing.T) {
	t.Parallel()
	for name, st := range testStacks(t) {
		s := Solver{Stack: st}
		ifs := st.Interfaces(nil)
		for _, f := range []float64{0, 0.5, 2, -1} {
			ls, err := s.Levels(nil, f, 3)
			if err != nil && !errors.Is(err, tiltwell.ErrLevel) {
				t.Fatalf("%s f=%g: %v", name, f, err)
			}
			var waves []tiltwell.Wavefunction
			for _, l := range ls {
				w, err := s.Wavefunction(f, l.N)
				if err != nil {
					t.Fatalf("%s f=%g n=%d: %v", name, f, l.N, err)
				}
				waves = append(waves, w)
				lo, hi := tiltwell.Support(w)
				norm := integrateSplit(func(x float64) float64 { v := w.At(x); return v * v }, lo, hi, 0.02, st)
				if math.Abs(norm-1) > 1e-10+l.Gamma {
					t.Errorf("%s f=%g n=%d: ∫φ² over [%.3g, %.3g] = %.15g", name, f, l.N, lo, hi, norm)
				}
				if x1 := ifs[0]; !(w.At(x1) > 0) {
					t.Errorf("%s f=%g n=%d: φ(%g) = %g, want > 0", name, f, l.N, x1, w.At(x1))
				}
				zeros, prev := 0, w.At(ifs[0])
				x0, x1 := ifs[0], ifs[len(ifs)-1]
				for i := 1; i <= 4000; i++ {
					v := w.At(x0 + (x1-x0)*float64(i)/4000)
					if v*prev < 0 {
						zeros++
					}
					if v != 0 {
						prev = v
					}
				}
				if zeros != l.N-1 {
					t.Errorf("%s f=%g n=%d: %d zeros between the outer interfaces, want %d", name, f, l.N, zeros, l.N-1)
				}
			}
			if f != 0 {
				continue
			}
			for i := range waves {
				for j := i + 1; j < len(waves); j++ {
					lo, hi := tiltwell.Support(waves[i])
					lo2, hi2 := tiltwell.Support(waves[j])
					lo, hi = min(lo, lo2), max(hi, hi2)
					o := integrateSplit(func(x float64) float64 { return waves[i].At(x) * waves[j].At(x) }, lo, hi, 0.02, st)
					if math.Abs(o) > 1e-10 {
						t.Errorf("%s: ∫φ%dφ%d = %.3g, want 0", name, i+1, j+1, o)
					}
				}
			}
		}
	}
}

// TestStackHellmannFeynman checks Dipole = ⟨ξ − ½⟩ against the slope
// dη/df by central differences (Hellmann–Feynman), for bound levels and
// for narrow quasi-bound ones (Γ < 1e-10, where the two agree to far
// below the difference's own error), and ⟨ξ − ½⟩ against the quadrature
// of (ξ − ½)φ².
func TestStackHellmannFeynman(t *testing.T) {
	t.Parallel()
	const h = 1e-4
	for name, st := range testStacks(t) {
		s := Solver{Stack: st}
		for _, f := range []float64{0, 0.3, 1, -0.7} {
			ls, _ := s.Levels(nil, f, 3)
			for _, l := range ls {
				if l.Gamma > 1e-10 {
					continue
				}
				d, err := s.Dipole(f, l.N)
				if err != nil {
					t.Fatal(err)
				}
				lm, e1 := s.Level(f-h, l.N)
				lp, e2 := s.Level(f+h, l.N)
				if e1 != nil || e2 != nil {
					t.Fatal(e1, e2)
				}
				fd := (lp.Energy - lm.Energy) / (2 * h)
				// O(h²) truncation and rounding ~1e-15/h.
				if math.Abs(fd-d) > 2e-8+1e-6*math.Abs(d) {
					t.Errorf("%s f=%g n=%d: Dipole %.12g, dη/df by differences %.12g", name, f, l.N, d, fd)
				}
				w, _ := s.Wavefunction(f, l.N)
				lo, hi := tiltwell.Support(w)
				q := integrateSplit(func(x float64) float64 { v := w.At(x); return (x - 0.5) * v * v }, lo, hi, 0.02, st)
				if math.Abs(q-d) > 1e-11*(1+math.Abs(d)) {
					t.Errorf("%s f=%g n=%d: Dipole %.15g, quadrature %.15g", name, f, l.N, d, q)
				}
			}
		}
	}
}

// TestStackWeakField checks that the field-on levels join the zero-field
// ones smoothly: for a symmetric well (η(f) − η(0))/f² settles to the
// polarisability, for an asymmetric one (η(f) − η(0))/f to the zero-field
// dipole (first-order perturbation theory, common practice), and at
// f ≤ 1e-9 the levels equal the zero-field ones within the estimates.
func TestStackWeakField(t *testing.T) {
	t.Parallel()
	for name, st := range testStacks(t) {
		s := Solver{Stack: st}
		l0, err := s.Levels(nil, 0, 2)
		if err != nil {
			t.Fatal(err)
		}
		for n := 1; n <= 2; n++ {
			d0, err := s.Dipole(0, n)
			if err != nil {
				t.Fatal(err)
			}
			e0 := l0[n-1].Energy
			// c₂ from a moderate field, then the weak-field ratios.
			l3, _ := s.Level(1e-3, n)
			lm3, _ := s.Level(-1e-3, n)
			c2 := (l3.Energy + lm3.Energy - 2*e0) / (2e-6)
			// The third-order term of (η(f) − η(−f))/2f, measured at
			// f = 1e-3 and scaled by f².
			c3 := math.Abs((l3.Energy-lm3.Energy)/2e-3-d0) / 1e-6
			for _, f := range []float64{1e-4, 1e-5, 1e-6} {
				lp, _ := s.Level(f, n)
				lm, _ := s.Level(-f, n)
				lin := (lp.Energy - lm.Energy) / (2 * f)
				quadr := (lp.Energy + lm.Energy - 2*e0) / (2 * f * f)
				if math.Abs(lin-d0) > 1e-13/f+2*c3*f*f+1e-12 {
					t.Errorf("%s n=%d f=%g: (η(f) − η(−f))/2f = %.12g, zero-field dipole %.12g", name, n, f, lin, d0)
				}
				if math.Abs(quadr-c2) > 1e-13/(f*f)+1e-3*math.Abs(c2) {
					t.Errorf("%s n=%d f=%g: (η(f) + η(−f) − 2η(0))/2f² = %.8g, at f = 1e-3 %.8g", name, n, f, quadr, c2)
				}
			}
			for _, f := range []float64{1e-9, 1e-15, 1e-30, 1e-300} {
				l, err := s.Level(f, n)
				if err != nil {
					t.Fatalf("%s n=%d f=%g: %v", name, n, f, err)
				}
				want := e0 + d0*f + c2*f*f
				if math.Abs(l.Energy-want) > l.Err+l0[n-1].Err {
					t.Errorf("%s n=%d f=%g: η = %.17g, zero-field series %.17g (Err %.2g)", name, n, f, l.Energy, want, l.Err)
				}
				if l.Gamma != 0 || l.GammaErr != gammaFloor {
					t.Errorf("%s n=%d f=%g: Γ = %g ± %g, want 0 ± 1e-300", name, n, f, l.Gamma, l.GammaErr)
				}
			}
		}
	}
}

// TestStackNarrowAgainstComplex checks the perturbative Γ and second-order
// shift of η_r (narrow resonances) against Newton's method on the complex
// level equation at the same points: the two are independent formulations
// of one equation and must agree within their two error estimates.
func TestStackNarrowAgainstComplex(t *testing.T) {
	t.Parallel()
	for name, st := range testStacks(t) {
		for _, f := range []float64{0.7, 1, 1.5, 2, 2.5, -1.2} {
			a := newCalc(st, f)
			b := newCalc(st, f)
			b.forceBroad = true
			floor := math.Inf(-1)
			for n := 1; n <= 3; n++ {
				la, why, err := a.solveStackLevel(n, floor, math.NaN())
				if err != nil || why != "" {
					break
				}
				floor = la.real.eta
				if la.lv.Gamma < 1e-15 {
					continue // below the complex path's resolution
				}
				lb, why, err := b.solveStackLevel(n, math.Inf(-1), math.NaN())
				if err != nil || why != "" {
					t.Errorf("%s f=%g n=%d: complex path: %q %v", name, f, n, why, err)
					continue
				}
				p, q := la.lv, lb.lv
				if math.Abs(p.Energy-q.Energy) > p.Err+q.Err {
					t.Errorf("%s f=%g n=%d: η_r %.17g ± %.2g, complex %.17g ± %.2g", name, f, n, p.Energy, p.Err, q.Energy, q.Err)
				}
				if math.Abs(p.Gamma-q.Gamma) > p.GammaErr+q.GammaErr {
					t.Errorf("%s f=%g n=%d: Γ %.15g ± %.2g, complex %.15g ± %.2g", name, f, n, p.Gamma, p.GammaErr, q.Gamma, q.GammaErr)
				}
			}
		}
	}
}

// shootResonance finds the complex level of the finite well (barriers v,
// mass ratio mu) at field f > 0 near start by brute force, independently
// of the Airy functions and of the solver's steps: the ODE
// φ′ = μw, w′ = π²(V − η)φ is integrated by classical fourth-order
// Runge–Kutta (complex η, about h per step, steps landing on the
// interfaces) inwards from both ends to the centre of the well, where the
// two solutions' Wronskian must vanish. On the right it starts deep in the
// uphill barrier with the decaying wave; on the left, at xo past the
// downhill turning point, with the outgoing WKB wave to second order
// (for K² = π²μ(η − V) linear in ξ, textbook WKB: φ′/φ = −iK − K′/(2K) −
// i 5K′²/(8K³), a wave running to −ξ with the time factor e^(−iηt)).
// The complex secant method solves the mismatch.
func shootResonance(v, mu, f float64, start complex128, xo, xr, h float64) complex128 {
	// Each stretch is marched with its own layer's coefficients, so that no
	// step sees the other side of an interface.
	pot := func(x float64, well bool) (float64, float64) {
		if well {
			return f * (x - 0.5), 1
		}
		return v + f*(x-0.5), mu
	}
	type stretch struct {
		to   float64
		well bool
	}
	march := func(eta complex128, x float64, u, w complex128, stops []stretch) (complex128, complex128) {
		for _, st := range stops {
			deriv := func(x float64, u, w complex128) (complex128, complex128) {
				V, m := pot(x, st.well)
				return complex(m, 0) * w, complex(math.Pi*math.Pi, 0) * (complex(V, 0) - eta) * u
			}
			x0 := x
			n := int(math.Ceil(math.Abs(st.to-x0) / h))
			hh := (st.to - x0) / float64(n)
			for i := range n {
				x := x0 + float64(i)*hh
				k1u, k1w := deriv(x, u, w)
				k2u, k2w := deriv(x+hh/2, u+k1u*complex(hh/2, 0), w+k1w*complex(hh/2, 0))
				k3u, k3w := deriv(x+hh/2, u+k2u*complex(hh/2, 0), w+k2w*complex(hh/2, 0))
				k4u, k4w := deriv(x+hh, u+k3u*complex(hh, 0), w+k3w*complex(hh, 0))
				u += complex(hh/6, 0) * (k1u + 2*k2u + 2*k3u + k4u)
				w += complex(hh/6, 0) * (k1w + 2*k2w + 2*k3w + k4w)
			}
			x = st.to
			if r := cmplx.Abs(u) + cmplx.Abs(w); r > 1e100 {
				u, w = u/complex(r, 0), w/complex(r, 0)
			}
		}
		return u, w
	}
	mismatch := func(eta complex128) complex128 {
		V, m := pot(xr, false)
		k := cmplx.Sqrt(complex(math.Pi*math.Pi*m, 0) * (complex(V, 0) - eta))
		ur, wr := march(eta, xr, 1, -k/complex(m, 0), []stretch{{1, false}, {0.5, true}})
		V, m = pot(xo, false)
		K := cmplx.Sqrt(complex(math.Pi*math.Pi*m, 0) * (eta - complex(V, 0)))
		Kp := complex(-math.Pi*math.Pi*m*f/2, 0) / K
		ul, wl := march(eta, xo, 1, (-1i*K-Kp/(2*K)-1i*5*Kp*Kp/(8*K*K*K))/complex(m, 0), []stretch{{0, false}, {0.5, true}})
		return ul*wr - wl*ur
	}
	a, b := start, start+complex(1e-7, -1e-7*math.Abs(imag(start))-1e-12)
	fa, fb := mismatch(a), mismatch(b)
	for range 60 {
		c := b - fb*(b-a)/(fb-fa)
		a, fa = b, fb
		b, fb = c, mismatch(c)
		if cmplx.Abs(b-a) < 1e-15 {
			break
		}
	}
	return b
}

// TestStackBruteForce checks η_r and Γ of a finite well against
// shootResonance at a few fields, to the brute force's own accuracy (its
// step error and that of the WKB conditions at its ends: it moves by
// about 1e-11 in η and 1e-7 relative in Γ when its steps are halved or its
// far end is moved).
func TestStackBruteForce(t *testing.T) {
	t.Parallel()
	const v, mu = 4.3, 1.37
	s := Solver{Stack: mustWell(t, v, mu)}
	for _, c := range []struct {
		f float64
		n int
	}{{1.5, 1}, {2, 1}, {3, 1}, {1, 2}, {2, 2}, {4, 1}} {
		l, err := s.Level(c.f, c.n)
		if err != nil {
			t.Fatal(err)
		}
		// The downhill turning point is at ½ − (v − η)/f; go 30 local
		// units of Airy argument beyond it.
		s0 := math.Cbrt(math.Pi * math.Pi * mu * c.f)
		xo := 0.5 - (v-l.Energy)/c.f - 45/s0
		xr := 1 + 12/math.Sqrt(mu*(v+c.f/2-l.Energy))
		eta := shootResonance(v, mu, c.f, complex(l.Energy*(1+1e-7), -l.Gamma/2*(1+1e-3)), xo, xr, 2e-4)
		if d := math.Abs(real(eta) - l.Energy); d > 1e-10 {
			t.Errorf("f=%g n=%d: η_r = %.12g, brute force %.12g", c.f, c.n, l.Energy, real(eta))
		}
		if g := -2 * imag(eta); math.Abs(g/l.Gamma-1) > 1e-6 {
			t.Errorf("f=%g n=%d: Γ = %.10g, brute force %.10g", c.f, c.n, l.Gamma, g)
		}
	}
}

// TestStackGamow checks Γ in the deep-tunnelling limit against the
// quasiclassical escape rate, the barrier's transmission over the
// classical period (L. D. Landau and E. M. Lifshitz, Quantum Mechanics,
// §50; from memory):
//
//	Γ_qc = D/T,   D = 4kκ/(k² + κ²) e^(−2S),   S = ∫κ dξ = (2/3)π q^(3/2)/f,
//	T = ∫ π/√(η − V) dξ over the allowed part of the well,
//
// (μ = 1; in reduced units the speed is 2√(η − V)/π, and 4kκ/(k² + κ²) is
// the transmission factor of the abrupt wall, with k and κ = π√q on either
// side of it and q = v − f/2 − η the barrier's height above the level
// there). Its own accuracy is O(1/S) (the quasiclassical connection at the
// outer turning point) and O(1/κ); Γ is checked over 46 to 690 in 2S,
// Γ from about 1e-20 to 1e-298, and below the 1e-300 floor.
func TestStackGamow(t *testing.T) {
	t.Parallel()
	const v = 1e4
	s := Solver{Stack: mustWell(t, v, 1)}
	for _, n := range []int{1, 3} {
		for _, decades := range []float64{20, 40, 90, 185, 285, 315, 330} {
			// f such that 2S is about decades·ln 10 at η ≈ 0.
			f := 2.0 / 3 * math.Pi * math.Pow(v, 1.5) / (decades * math.Ln10 / 2)
			l, err := s.Level(f, n)
			if err != nil {
				t.Fatal(err)
			}
			eta := l.Energy
			xt := math.Min(1, 0.5+eta/f)
			T := 2 * math.Pi / f * (math.Sqrt(eta+f/2) - math.Sqrt(math.Max(eta-f*(xt-0.5), 0)))
			k := math.Pi * math.Sqrt(eta+f/2)
			q := v - f/2 - eta
			kap := math.Pi * math.Sqrt(q)
			S := 2.0 / 3 * math.Pi * q * math.Sqrt(q) / f
			// Γ/Γ_qc in logarithms, since Γ_qc itself may underflow.
			lnQC := math.Log(4*k*kap/(k*k+kap*kap)/T) - 2*S
			if lnQC < math.Log(gammaFloor)-1 {
				// Below the floor: reported as 0 with the floor as an
				// upper bound.
				if l.Gamma != 0 || l.GammaErr != gammaFloor {
					t.Errorf("n=%d f=%.5g: Γ_qc = e^%.1f, got Γ = %g ± %g, want 0 ± 1e-300", n, f, lnQC, l.Gamma, l.GammaErr)
				}
				continue
			}
			r := math.Exp(math.Log(l.Gamma) - lnQC)
			if math.Abs(r-1) > 0.2/S+1e-3 {
				t.Errorf("n=%d f=%.5g (2S = %.0f): Γ = %.6g, quasiclassical ratio %.6f", n, f, 2*S, l.Gamma, r)
			}
		}
	}
}

// fuzzStack builds a stack from fuzz bytes: 3 to 7 layers with widths,
// band edges and masses spread over many decades, and the reference well
// among the inner layers.
func fuzzStack(data []byte) (tiltwell.Stack, error) {
	next := func() float64 {
		if len(data) == 0 {
			return 0.5
		}
		b := data[0]
		data = data[1:]
		return float64(b) / 255
	}
	n := 3 + int(next()*4.99)
	ref := 1 + int(next()*float64(n-2)*0.999)
	layers := make([]tiltwell.Layer, n)
	for i := range layers {
		if i == ref {
			layers[i] = tiltwell.Layer{Width: 1, Mass: 1}
			continue
		}
		// Edges from −1e3 to 1e6 (mostly positive), masses 0.01 to 100,
		// widths 0.01 to 10.
		e := math.Pow(10, -1+7*next())
		if next() < 0.25 {
			e = -e / 1e3
		}
		l := tiltwell.Layer{Edge: e, Mass: math.Pow(10, -2+4*next())}
		if i > 0 && i < n-1 {
			l.Width = math.Pow(10, -2+3*next())
		}
		layers[i] = l
	}
	return tiltwell.NewStack(layers, ref)
}

// FuzzStackLevels checks, for random stacks, fields and level counts,
// that Levels never panics, returns no NaN or infinite numbers, gives
// ordered levels with Γ ≥ 0, and errors that wrap the root sentinels.
func FuzzStackLevels(f *testing.F) {
	f.Add([]byte{0, 128, 200, 90, 40, 200, 90, 40}, 1.0, 3)
	f.Add([]byte{255, 50, 180, 10, 128, 30, 70, 240, 0, 0, 90, 200, 35}, -2.5, 5)
	f.Add([]byte{100, 0, 255, 255, 255, 0}, 0.0, 2)
	f.Add([]byte{10, 10, 10}, 1e-12, 1)
	f.Fuzz(func(t *testing.T, data []byte, field float64, k int) {
		st, err := fuzzStack(data)
		if err != nil {
			return
		}
		if k < -1 || k > 8 {
			k = k%8 + 1
		}
		if math.Abs(field) > 2e3 && !math.IsInf(field, 0) {
			field = math.Mod(field, 2e3)
		}
		ls, err := Solver{Stack: st}.Levels(nil, field, k)
		if err != nil {
			known := false
			for _, e := range []error{tiltwell.ErrField, tiltwell.ErrLevel, tiltwell.ErrOutOfRange, tiltwell.ErrNoConvergence} {
				known = known || errors.Is(err, e)
			}
			if !known {
				t.Fatalf("%v f=%g k=%d: error %v wraps no sentinel", st, field, k, err)
			}
		}
		prev := math.Inf(-1)
		for i, l := range ls {
			bad := func(x float64) bool { return math.IsNaN(x) || math.IsInf(x, 0) }
			if l.N != i+1 || bad(l.Energy) || bad(l.Err) || bad(l.Gamma) || bad(l.GammaErr) || l.Err < 0 || l.Gamma < 0 || l.GammaErr < 0 {
				t.Fatalf("%v f=%g: level %d = %+v", st, field, i+1, l)
			}
			if l.Energy < prev-l.Err {
				t.Fatalf("%v f=%g: level %d at %.17g below level %d at %.17g", st, field, i+1, l.Energy, i, prev)
			}
			prev = l.Energy
			// Every level Levels returns builds its wavefunction, with a
			// finite support and finite values.
			w, err := Solver{Stack: st}.BuildWave(nil, field, l)
			if err != nil {
				t.Fatalf("%v f=%g: level %d: BuildWave: %v", st, field, l.N, err)
			}
			lo, hi := tiltwell.Support(w)
			if !(lo < hi) || bad(lo) || bad(hi) {
				t.Fatalf("%v f=%g: level %d: support [%v, %v]", st, field, l.N, lo, hi)
			}
			for _, x := range append([]float64{lo, hi, (lo + hi) / 2, lo - 1, hi + 1}, st.Interfaces(nil)...) {
				if v := w.At(x); bad(v) {
					t.Fatalf("%v f=%g: level %d: φ(%g) = %v", st, field, l.N, x, v)
				}
			}
		}
	})
}

// TestStackAllocs checks that Levels does not allocate in steady state,
// for narrow and broad resonances, a bound well and a five-layer stack.
func TestStackAllocs(t *testing.T) {
	if underRace {
		t.Skip("sync.Pool drops items under -race")
	}
	well := mustWell(t, 4.3, 1.37)
	clad := mustStack(t, []tiltwell.Layer{{Edge: 4.3, Mass: 1.37}, {Width: 0.1, Edge: 9, Mass: 1.5}, {Width: 1, Mass: 1}, {Width: 0.1, Edge: 9, Mass: 1.5}, {Edge: 4.3, Mass: 1.37}}, 2)
	for _, c := range []struct {
		st tiltwell.Stack
		f  float64
		k  int
	}{{well, 0, 3}, {well, 1, 2}, {well, 3, 2}, {well, -2, 2}, {clad, 1, 2}, {clad, 0, 2}} {
		dst := make([]tiltwell.Level, 0, c.k)
		s := Solver{Stack: c.st}
		var err error
		if dst, err = s.Levels(dst, c.f, c.k); err != nil {
			t.Fatal(err)
		}
		if a := testing.AllocsPerRun(20, func() { dst, _ = s.Levels(dst, c.f, c.k) }); a != 0 {
			t.Errorf("%v f=%g k=%d: %v allocations per call", c.st, c.f, c.k, a)
		}
	}
}

// TestStackTransfersAgree checks the Airy amplitude–phase transfer across
// allowed stretches against Taylor steps alone, two formulations of the
// same carry, from weak to very strong fields: the levels and widths must
// agree within their error estimates.
func TestStackTransfersAgree(t *testing.T) {
	t.Parallel()
	for _, c := range []struct{ v, mu, f float64 }{{4.3, 1.37, 1}, {50, 1, 20}, {300, 2, 100}, {1e4, 1, 1000}, {1e6, 1, 1e5}, {12, 1.37, 1e-7}} {
		st := mustWell(t, c.v, c.mu)
		a, b := newCalc(st, c.f), newCalc(st, c.f)
		b.taylorOnly = true
		ia, ib := newLevelIter(), newLevelIter()
		for n := 1; n <= 4; n++ {
			la, wa, ea := a.next(&ia)
			lb, wb, eb := b.next(&ib)
			if ea != nil || eb != nil || wa != wb {
				t.Fatalf("v=%g f=%g n=%d: %q %v, Taylor %q %v", c.v, c.f, n, wa, ea, wb, eb)
			}
			if wa != "" {
				break
			}
			p, q := la.lv, lb.lv
			if math.Abs(p.Energy-q.Energy) > p.Err+q.Err || math.Abs(p.Gamma-q.Gamma) > p.GammaErr+q.GammaErr {
				t.Errorf("v=%g f=%g n=%d: %+v, with Taylor steps only %+v", c.v, c.f, n, p, q)
			}
		}
	}
}

// TestStackCeilingUnchecked starts levels whose bracket reaches the
// confinement ceiling (Dirichlet bound not below it) from poor hints at
// both ends of the bracket, so that the iteration needs the bracket and
// evaluates the level equation at the ceiling only then: the level and
// the confinement verdict must be those of the default start.
func TestStackCeilingUnchecked(t *testing.T) {
	t.Parallel()
	checked := 0
	for name, st := range testStacks(t) {
		for _, f := range []float64{0.5, 2, 3, 6, 8, -4} {
			c := newCalc(st, f)
			floor := math.Inf(-1)
			for n := 1; n <= 4; n++ {
				ref, why, err := c.solveStackLevel(n, floor, math.NaN())
				if err != nil {
					t.Fatalf("%s f=%g n=%d: %v", name, f, n, err)
				}
				vmin, ec, ub := c.bounds(n)
				lo := max(vmin, floor)
				if ub >= ec && ec > lo {
					checked++
					w := ec - lo
					for _, hint := range []float64{lo + 1e-6*w, ec - 1e-9*w} {
						got, gwhy, err := c.solveStackLevel(n, floor, hint)
						if err != nil {
							t.Errorf("%s f=%g n=%d hint %g: %v", name, f, n, hint, err)
							continue
						}
						if (gwhy == "") != (why == "") {
							t.Errorf("%s f=%g n=%d hint %g: confinement %q, default start %q", name, f, n, hint, gwhy, why)
							continue
						}
						if why == "" && math.Abs(got.lv.Energy-ref.lv.Energy) > got.lv.Err+ref.lv.Err {
							t.Errorf("%s f=%g n=%d hint %g: η_r %.17g ± %.2g, default start %.17g ± %.2g", name, f, n, hint, got.lv.Energy, got.lv.Err, ref.lv.Energy, ref.lv.Err)
						}
					}
				}
				if why != "" {
					break
				}
				floor = ref.real.eta
			}
		}
	}
	if checked == 0 {
		t.Fatal("no level had its bracket up to the ceiling")
	}
}
