package exact

import (
	"errors"
	"math"
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
