package variational_test

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"sync"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/variational"
)

func mustWell(t testing.TB, vl, ml, vr, mr float64) tiltwell.Stack {
	t.Helper()
	st, err := tiltwell.AsymmetricWell(vl, ml, vr, mr)
	if err != nil {
		t.Fatal(err)
	}
	return st
}

// TestFiniteBadInput checks the errors on finite stacks: unsupported
// families and stacks wrap errors.ErrUnsupported and name the stack; bad
// fields, level counts, fields beyond FiniteMaxField and bad Extra wrap
// the root sentinels; nothing panics and no level comes back.
func TestFiniteBadInput(t *testing.T) {
	t.Parallel()
	well := mustWell(t, 5, 1.37, 5, 1.37)
	five, err := tiltwell.NewStack([]tiltwell.Layer{{Edge: 10, Mass: 1}, {Width: 0.2, Edge: 3, Mass: 1}, {Width: 1, Mass: 1}, {Width: 0.2, Edge: 3, Mass: 1}, {Edge: 10, Mass: 1}}, 2)
	if err != nil {
		t.Fatal(err)
	}
	low := mustWell(t, -1, 1, 5, 1)
	for _, c := range []struct {
		name string
		s    variational.Solver
		f    float64
		k    int
		want error
	}{
		{"sine on a finite well", variational.Solver{Family: variational.Sine, Stack: well}, 1, 1, errors.ErrUnsupported},
		{"five layers", variational.Solver{Stack: five}, 1, 1, errors.ErrUnsupported},
		{"barrier below the well", variational.Solver{Stack: low}, 1, 1, errors.ErrUnsupported},
		{"NaN field", variational.Solver{Stack: well}, math.NaN(), 1, tiltwell.ErrField},
		{"infinite field", variational.Solver{Stack: well}, math.Inf(-1), 1, tiltwell.ErrField},
		{"no level", variational.Solver{Stack: well}, 1, 0, tiltwell.ErrLevel},
		{"too many levels", variational.Solver{Stack: well}, 1, variational.MaxLevels + 1, tiltwell.ErrLevel},
		{"tilt excited", variational.Solver{Family: variational.Tilt, Stack: well}, 1, 2, tiltwell.ErrLevel},
		{"field beyond the limit", variational.Solver{Stack: well}, -1.5 * variational.FiniteMaxField, 1, tiltwell.ErrOutOfRange},
		{"bad Extra", variational.Solver{Stack: well, Extra: -1}, 1, 1, tiltwell.ErrUnits},
	} {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			ls, err := c.s.Levels(nil, c.f, c.k)
			if !errors.Is(err, c.want) || len(ls) != 0 {
				t.Errorf("Levels: %d levels, error %v, want %v", len(ls), err, c.want)
			}
			if errors.Is(c.want, errors.ErrUnsupported) && !strings.Contains(err.Error(), c.s.Stack.String()) {
				t.Errorf("error %q does not name the stack %v", err, c.s.Stack)
			}
			br, err := c.s.Brackets(nil, c.f, c.k, nil)
			if !errors.Is(err, c.want) || len(br) != 0 {
				t.Errorf("Brackets: %d, error %v, want %v", len(br), err, c.want)
			}
			if w, err := c.s.Wavefunction(c.f, c.k); !errors.Is(err, c.want) || w != nil {
				t.Errorf("Wavefunction: %v, error %v, want %v", w, err, c.want)
			}
		})
	}
}

// TestFiniteConfined checks that levels the well does not confine come
// back as a *tiltwell.ConfinedError with the confined levels: at zero
// field beyond the bound count of the phase condition, at a field where
// the upper levels are above the downhill barrier (the exact solver
// agrees on both), and for a level too broad for the real variational
// problem (v = 2 at f = 5: Γ = 0.93, which the exact solver still
// confines); the wavefunction of an unconfined level is an error
// wrapping ErrLevel.
func TestFiniteConfined(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		v, f float64
		want int
		why  string
	}{{5, 0, 3, "binds 3 levels at zero field"}, {5, 1, 2, "above the barrier"}, {5, -1, 2, "above the barrier"}, {5, 10, 1, "above the barrier"}, {2, 5, 0, "too broad"}} {
		st := mustWell(t, c.v, 1, c.v, 1)
		s := variational.Solver{Stack: st}
		ls, err := s.Levels(nil, c.f, 5)
		n, ok := tiltwell.Confined(err)
		if !ok || n != c.want || len(ls) != c.want || !errors.Is(err, tiltwell.ErrLevel) || !strings.Contains(err.Error(), c.why) {
			t.Errorf("f=%g: %d levels, error %v; want %d confined (%s)", c.f, len(ls), err, c.want, c.why)
		}
		ref, _ := exact.Solver{Stack: st}.Levels(nil, c.f, 5)
		if c.why != "too broad" && len(ref) != c.want {
			t.Errorf("f=%g: exact confines %d, the test expects %d", c.f, len(ref), c.want)
		}
		br, err := s.Brackets(nil, c.f, 5, nil)
		if n, ok := tiltwell.Confined(err); !ok || n != c.want || len(br) != c.want {
			t.Errorf("f=%g: Brackets %d, error %v", c.f, len(br), err)
		}
		if _, err := s.Wavefunction(c.f, c.want+1); !errors.Is(err, tiltwell.ErrLevel) {
			t.Errorf("f=%g: wavefunction of level %d: %v", c.f, c.want+1, err)
		}
	}
	s := variational.Solver{Stack: mustWell(t, 5, 1, 5, 1)}
	if _, err := s.Sweep(nil, []float64{0.5, 1, 2}, 3); !errors.Is(err, tiltwell.ErrLevel) {
		t.Errorf("Sweep through unconfined levels: %v", err)
	}
}

// TestFiniteMirror checks the mirror symmetry through Stack.Fold: the
// levels of a well at −f are, to the bit, those of the mirrored well at
// f, so a symmetric well gives the same levels at ±f; and the
// wavefunction at −f is the mirror image of the mirrored well's,
// φ(ξ; −f) = (−1)^(n+1) φ_mirror(1 − ξ; f), with the support mirrored.
func TestFiniteMirror(t *testing.T) {
	t.Parallel()
	for _, st := range []tiltwell.Stack{mustWell(t, 12, 1.37, 12, 1.37), mustWell(t, 8, 1.2, 20, 1.8)} {
		for _, fam := range []variational.Family{variational.Poly, variational.Tilt} {
			k := 3
			if fam == variational.Tilt {
				k = 1
			}
			for _, f := range []float64{0.3, 2.5} {
				a, err := variational.Solver{Family: fam, Stack: st}.Levels(nil, -f, k)
				if err != nil {
					t.Fatal(err)
				}
				b, err := variational.Solver{Family: fam, Stack: st.Mirror()}.Levels(nil, f, k)
				if err != nil {
					t.Fatal(err)
				}
				for i := range a {
					if a[i] != b[i] {
						t.Errorf("%v %v f=%g: %+v at −f, %+v mirrored", st, fam, f, a[i], b[i])
					}
				}
				for n := 1; n <= k; n++ {
					wm, err := variational.Solver{Family: fam, Stack: st}.Wavefunction(-f, n)
					if err != nil {
						t.Fatal(err)
					}
					wp, err := variational.Solver{Family: fam, Stack: st.Mirror()}.Wavefunction(f, n)
					if err != nil {
						t.Fatal(err)
					}
					sg := 1.0
					if n%2 == 0 {
						sg = -1
					}
					for _, x := range []float64{-0.4, 0, 0.3, 0.5, 0.9, 1.2} {
						if a, b := wm.At(x), sg*wp.At(1-x); a != b {
							t.Errorf("%v %v f=%g n=%d: φ(%g) = %g, mirror %g", st, fam, f, n, x, a, b)
						}
					}
					lo, hi := tiltwell.Support(wm)
					mlo, mhi := tiltwell.Support(wp)
					if lo != 1-mhi || hi != 1-mlo {
						t.Errorf("%v %v f=%g n=%d: support [%g, %g], mirror [%g, %g]", st, fam, f, n, lo, hi, mlo, mhi)
					}
				}
			}
		}
	}
}

// TestFiniteWeakFieldLimit checks continuity at f → 0: the levels at
// f = 1e-9 (estimates, from the field's Airy terms) agree with the
// rigorous zero-field brackets within their errors plus the Stark shift,
// which is second order (the first order, f⟨ξ − ½⟩, vanishes in a
// symmetric well; below 1e-16 here).
func TestFiniteWeakFieldLimit(t *testing.T) {
	t.Parallel()
	for _, st := range []tiltwell.Stack{mustWell(t, 4.3, 1.37, 4.3, 1.37), mustWell(t, 50, 2, 50, 2), mustWell(t, 1e6, 1, 1e6, 1)} {
		z, err := variational.Solver{Stack: st}.Levels(nil, 0, 3)
		if err != nil {
			t.Fatal(err)
		}
		w, err := variational.Solver{Stack: st}.Levels(nil, 1e-9, 3)
		if err != nil {
			t.Fatal(err)
		}
		for i := range z {
			if z[i].Bound != tiltwell.Rigorous || w[i].Bound != tiltwell.Estimate {
				t.Errorf("%v n=%d: bounds %v at f = 0 and %v at f = 1e-9", st, i+1, z[i].Bound, w[i].Bound)
			}
			if d := math.Abs(z[i].Energy - w[i].Energy); d > z[i].Err+w[i].Err+1e-16 {
				t.Errorf("%v n=%d: %.17g at f = 0, %.17g at f = 1e-9", st, i+1, z[i].Energy, w[i].Energy)
			}
		}
	}
}

// TestFiniteExtremes runs wells at the edges of what a Stack allows and
// fields from the smallest subnormal to the limit: every answer is
// finite with a nonnegative error, or an error wrapping a root sentinel
// (or ErrUnsupported); Γ estimates span hundreds of decades without
// overflow.
func TestFiniteExtremes(t *testing.T) {
	t.Parallel()
	for _, c := range [][4]float64{{1e-6, 1, 1e-6, 1}, {1e300, 1, 1e300, 1}, {5, 1e-6, 5, 1e-6}, {5, 1e6, 5, 1e6}, {1e4, 1, 3, 1}, {3, 2, 1e5, 1e-3}, {2, 1, 2, 1}} {
		st := mustWell(t, c[0], c[1], c[2], c[3])
		for _, f := range []float64{0, 5e-324, 1e-300, 1e-8, 0.7, 30, -variational.FiniteMaxField} {
			for _, fam := range []variational.Family{variational.Poly, variational.Tilt} {
				s := variational.Solver{Family: fam, Stack: st}
				k := 4
				if fam == variational.Tilt {
					k = 1
				}
				ls, err := s.Levels(nil, f, k)
				if err != nil {
					if _, ok := tiltwell.Confined(err); !ok {
						t.Errorf("%v f=%g %v: %v", c, f, fam, err)
					}
				}
				for _, l := range ls {
					for _, x := range []float64{l.Energy, l.Err, l.GammaErr} {
						if math.IsNaN(x) || math.IsInf(x, 0) || l.Err < 0 || l.GammaErr < 0 {
							t.Errorf("%v f=%g %v: level %+v", c, f, fam, l)
						}
					}
				}
				if len(ls) > 0 {
					w, err := s.Wavefunction(f, 1)
					if err != nil {
						t.Errorf("%v f=%g %v: wavefunction: %v", c, f, fam, err)
						continue
					}
					lo, hi := tiltwell.Support(w)
					for _, x := range []float64{lo, 0, 0.5, 1, hi, math.Inf(1), math.NaN()} {
						if v := w.At(x); math.IsNaN(v) || math.IsInf(v, 0) {
							t.Errorf("%v f=%g %v: φ(%g) = %v", c, f, fam, x, v)
						}
					}
				}
			}
		}
	}
}

// TestFiniteBrackets checks what Brackets and Sweep return on a finite
// well: Lower ≤ Energy ≤ Upper, Level() giving Energy and
// max(Upper − Energy, Energy − Lower), Gamma 0 and GammaErr; a Sweep
// giving, field by field, the brackets of separate calls (the Poly space
// does not search its tilt, so warm starts change nothing; for Tilt they
// start the one-parameter search and land on the same optimum).
func TestFiniteBrackets(t *testing.T) {
	t.Parallel()
	st := mustWell(t, 20, 1.37, 20, 1.37)
	fs := []float64{0, 0.5, 1.5, -3}
	for _, fam := range []variational.Family{variational.Poly, variational.Tilt} {
		s := variational.Solver{Family: fam, Stack: st}
		k := 4
		if fam == variational.Tilt {
			k = 1
		}
		sw, err := s.Sweep(nil, fs, k)
		if err != nil {
			t.Fatal(err)
		}
		for i, f := range fs {
			br, err := s.Brackets(nil, f, k, nil)
			if err != nil {
				t.Fatal(err)
			}
			ls, err := s.Levels(nil, f, k)
			if err != nil {
				t.Fatal(err)
			}
			for j, b := range br {
				if !(b.Lower <= b.Energy && b.Energy <= b.Upper) {
					t.Errorf("%v f=%g: bracket %+v", fam, f, b)
				}
				want := tiltwell.Level{N: j + 1, Energy: b.Energy, Err: max(b.Upper-b.Energy, b.Energy-b.Lower), Bound: b.Bound, GammaErr: b.GammaErr}
				if b.Level() != want || ls[j] != want {
					t.Errorf("%v f=%g: Level() %+v, Levels %+v, want %+v", fam, f, b.Level(), ls[j], want)
				}
				got := sw[i*k+j]
				if math.Abs(got.Energy-b.Energy) > 1e-9*(1+math.Abs(b.Energy)) || got.Bound != b.Bound {
					t.Errorf("%v f=%g n=%d: sweep %+v, separate %+v", fam, f, j+1, got, b)
				}
			}
		}
	}
}

// TestFiniteConcurrent calls one Solver from many goroutines (run under
// -race in CI) and checks that every call gives the serial answer.
func TestFiniteConcurrent(t *testing.T) {
	t.Parallel()
	s := variational.Solver{Stack: mustWell(t, 12, 1.37, 12, 1.37)}
	fs := []float64{0, 0.7, -1.9, 3.1}
	want := make([][]tiltwell.Level, len(fs))
	for i, f := range fs {
		ls, err := s.Levels(nil, f, 3)
		if err != nil {
			t.Fatal(err)
		}
		want[i] = ls
	}
	var wg sync.WaitGroup
	errs := make(chan error, 16)
	for g := range 8 {
		wg.Go(func() {
			dst := make([]tiltwell.Level, 0, 3)
			for r := range 4 {
				i := (g + r) % len(fs)
				var err error
				if dst, err = s.Levels(dst, fs[i], 3); err != nil {
					errs <- err
					return
				}
				for j := range dst {
					if dst[j] != want[i][j] {
						errs <- fmt.Errorf("f=%g: %+v, serial %+v", fs[i], dst[j], want[i][j])
						return
					}
				}
			}
		})
	}
	wg.Wait()
	close(errs)
	for err := range errs {
		t.Error(err)
	}
}

// TestFiniteNarrowLevelsConfined checks that levels whose escape width is
// far below the smallest float64 are confined, not refused: the ratio of
// the second-order shift to Γ₁/2 is formed as 2|δ₂|/Γ₁, since Γ₁/2
// underflowed to 0 for a Γ₁ of 5e-324 and made it 0/0 (a random well of
// the exact grid, rounded: at f = 1.5 the exact solver confines seven
// levels, with Γ from below 1e-300 to 2e-7).
func TestFiniteNarrowLevelsConfined(t *testing.T) {
	t.Parallel()
	st := mustWell(t, 41.5, 1.866, 48.08, 1.682)
	for _, f := range []float64{1.5, -1.5, 0.3} {
		ref, err := exact.Solver{Stack: st}.Levels(nil, f, variational.MaxLevels)
		if _, ok := tiltwell.Confined(err); err != nil && !ok {
			t.Fatal(err)
		}
		got, err := variational.Solver{Stack: st}.Levels(nil, f, variational.MaxLevels)
		if len(got) < len(ref) {
			t.Errorf("f=%g: %d levels (%v), exact confines %d", f, len(got), err, len(ref))
		}
	}
}
