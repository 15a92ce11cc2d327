package bigairy

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"strings"
	"sync"
	"testing"

	"github.com/tiltwell/tiltwell"
)

// halfUnit returns half a unit in the last printed digit of the decimal s,
// the accuracy a correctly rounded printed value promises.
func halfUnit(s string) float64 {
	s = strings.TrimPrefix(s, "-")
	mant, exp := s, 0
	if i := strings.IndexAny(s, "eE"); i >= 0 {
		mant = s[:i]
		fmt.Sscan(s[i+1:], &exp)
	}
	frac := 0
	if i := strings.IndexByte(mant, '.'); i >= 0 {
		frac = len(mant) - i - 1
	}
	return 0.5 * math.Pow(10, float64(exp-frac))
}

// levelTol is the agreement promised by Level at prec bits: a few units of
// 2^-prec relative to max(1, |η|).
func levelTol(prec uint) float64 { return 8 * ulps(int(prec)) }

// Exact levels from the Airy determinant, computed independently at high
// precision (mpmath), 14–15 significant digits (not a published table).
func TestLevelTable(t *testing.T) {
	t.Parallel()
	table := []struct {
		f   float64
		eta [3]string
	}{
		{1, [3]string{"0.989191714351091", "4.0032088300244", "9.00192325107681"}},
		{5, [3]string{"0.741219278430113", "4.06922048935081", "9.04766385801899"}},
		{10, [3]string{"0.0660262957550905", "4.18187000563762", "9.18467880199912"}},
		{20, [3]string{"-1.9685399313543", "4.07925089520686", "9.62528390552019"}},
		{50, [3]string{"-10.2062634323475", "0.865458071834238", "9.93927499167423"}},
		{100, [3]string{"-26.5164070902714", "-8.94126155816345", "5.44766594418562"}},
	}
	for _, row := range table {
		for i, ws := range row.eta {
			n := i + 1
			t.Run(fmt.Sprintf("f=%g/n=%d", row.f, n), func(t *testing.T) {
				t.Parallel()
				got, err := Level(row.f, n, 0)
				if err != nil {
					t.Fatal(err)
				}
				want := parse(t, ws, 128)
				d := newf(128).Sub(got, want)
				if e, _ := d.Abs(d).Float64(); e > halfUnit(ws) {
					t.Errorf("η = %s, table %s, |Δ| = %g > %g", got.Text('g', 20), ws, e, halfUnit(ws))
				}
				// The sine-basis Ritz values of §3 lie above e_1 at f = 10 (HUM).
				if row.f == 10 && n == 1 {
					ritz := parse(t, "0.0660262958215814", 128) // N = 40
					if got.Cmp(ritz) >= 0 {
						t.Errorf("η_1 = %s not below the N = 40 Ritz value", got.Text('g', 20))
					}
				}
			})
		}
	}
}

// The Airy determinant and shooting in ξ are independent routes; where both
// apply they must agree to the working precision.
func TestLevelAiryVsShoot(t *testing.T) {
	t.Parallel()
	const prec = 128
	for _, c := range []struct {
		f float64
		n int
	}{
		{0.01, 1}, {0.3, 2}, {3, 1}, {3, 4}, {30, 5},
		{300, 12}, {3000, 20}, {1e4, 50}, {-7, 3},
	} {
		t.Run(fmt.Sprintf("f=%g/n=%d", c.f, c.n), func(t *testing.T) {
			t.Parallel()
			a, err := LevelAiry(c.f, c.n, prec)
			if err != nil {
				t.Fatal(err)
			}
			s, err := LevelShoot(c.f, c.n, prec)
			if err != nil {
				t.Fatal(err)
			}
			if e := relErr(a, s, 1); e > levelTol(prec) {
				t.Errorf("Airy %s, shooting %s: rel %g", a.Text('g', 40), s.Text('g', 40), e)
			}
		})
	}
}

// More bits must not move the result beyond the stated accuracy, at the
// corners of the required range (f in [1e-8, 1e4], n ≤ 50).
func TestLevelPrecision(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		f float64
		n int
	}{{1e-8, 1}, {1e-8, 50}, {1, 50}, {1e4, 1}, {1e4, 50}, {0.002, 7}} {
		t.Run(fmt.Sprintf("f=%g/n=%d", c.f, c.n), func(t *testing.T) {
			t.Parallel()
			lo, err := Level(c.f, c.n, 128)
			if err != nil {
				t.Fatal(err)
			}
			hi, err := Level(c.f, c.n, 192)
			if err != nil {
				t.Fatal(err)
			}
			if e := relErr(lo, hi, 1); e > levelTol(128) {
				t.Errorf("128 bits %s, 192 bits %s: rel %g", lo.Text('g', 45), hi.Text('g', 45), e)
			}
		})
	}
}

// Small field: η_n = n² + C_n f² + O(f⁴), C_n = (n²π² − 15)/(48 n⁴ π²)
// (the second-order perturbation sum in closed form: common practice, no
// source; C_n to 15 digits for n ≤ 5 computed independently at high
// precision (mpmath)). At f = 1e-8 the O(f⁴) remainder is 1e-16 relative
// to C_n f².
func TestLevelSmallField(t *testing.T) {
	t.Parallel()
	table := map[int]string{
		1: "-0.0108295365548972", 2: "0.00322940396531892", 3: "0.00192391518656505",
		4: "0.00117840024783243", 5: "0.000782672741512164",
	}
	const prec = 200
	for _, f := range []float64{1e-8, 1e-3} {
		for _, n := range []int{1, 2, 3, 4, 5, 20, 50} {
			t.Run(fmt.Sprintf("f=%g/n=%d", f, n), func(t *testing.T) {
				t.Parallel()
				eta, err := Level(f, n, prec)
				if err != nil {
					t.Fatal(err)
				}
				ff := newf(prec).SetFloat64(f)
				got := newf(prec).Sub(eta, fint(int64(n*n), prec))
				got.Quo(got, ff)
				got.Quo(got, ff)
				pi2 := newf(prec).Mul(Pi(prec), Pi(prec))
				cn := newf(prec).Mul(pi2, fint(int64(n*n), prec))
				cn.Sub(cn, fint(15, prec))
				cn.Quo(cn, newf(prec).Mul(pi2, fint(int64(48*n*n*n*n), prec)))
				// O(f²) relative remainder: 1e-16 at f = 1e-8 and, seen at
				// f = 0.01 as 7e-7 (mpmath), 1e-8 at f = 1e-3; allowed 10×.
				tol := 10 * f * f * 70
				if e := relErr(got, cn, 0); e > tol {
					t.Errorf("(η − n²)/f² = %s, C_n = %s, rel %g > %g", got.Text('g', 20), cn.Text('g', 20), e, tol)
				}
				if ws, ok := table[n]; ok {
					if e := relErr(cn, parse(t, ws, prec), 0); e > 1e-14 {
						t.Errorf("closed-form C_%d = %s, table %s", n, cn.Text('g', 20), ws)
					}
				}
			})
		}
	}
}

// Strong field: η_n → −f/2 + |a_n| (f/π)^(2/3) (L. D. Landau and
// E. M. Lifshitz, Quantum Mechanics, §24, from memory); the
// correction is of order e^(−(4/3) z₁^(3/2)), z₁ ≈ (π² f)^(1/3), about 1e-169
// at f = 1e4, so there the limit holds to every bit. At f = 20, 50, 100, 200
// the differences are those computed independently at high precision
// (mpmath), to 2 digits.
func TestLevelTriangular(t *testing.T) {
	t.Parallel()
	const prec = 160
	zeros := map[int]string{1: "-2.338107410459767", 2: "-4.0879494441309706", 3: "-5.5205598280955511"}
	tri := func(f float64, n int) *big.Float {
		a := airyZero(parse(t, zeros[n], prec+32), prec+32)
		ff := newf(prec + 32).SetFloat64(f)
		s := newf(prec+32).Quo(ff, Pi(prec+32))
		s = Cbrt(newf(prec+32).Mul(s, s), prec+32)
		s.Mul(s, a)
		s.Neg(s)
		return s.Sub(s, newf(prec+32).SetMantExp(ff, -1))
	}
	for n := 1; n <= 3; n++ {
		t.Run(fmt.Sprintf("f=1e4/n=%d", n), func(t *testing.T) {
			t.Parallel()
			eta, err := Level(1e4, n, prec)
			if err != nil {
				t.Fatal(err)
			}
			if e := relErr(eta, tri(1e4, n), 1); e > levelTol(prec) {
				t.Errorf("η = %s, triangular %s, rel %g", eta.Text('g', 40), tri(1e4, n).Text('g', 40), e)
			}
		})
	}
	for _, c := range []struct {
		f    float64
		diff float64
	}{{20, 1.8e-4}, {50, 5.1e-8}, {100, 2.1e-12}, {200, 7e-19}} {
		t.Run(fmt.Sprintf("f=%g/n=1", c.f), func(t *testing.T) {
			t.Parallel()
			eta, err := Level(c.f, 1, prec)
			if err != nil {
				t.Fatal(err)
			}
			d, _ := newf(prec).Sub(eta, tri(c.f, 1)).Float64()
			if math.Abs(math.Abs(d)-c.diff) > 0.05*c.diff {
				t.Errorf("η − triangular = %g, independent value %g", d, c.diff)
			}
		})
	}
}

// Every level at a field lies inside the min–max bounds n² ± f/2 and the
// levels strictly increase: no root missed or found twice. At f = 1000 the
// levels below n ≈ 21 are triangular-well levels (η < f/2) and those above
// are two-wall levels, so the run crosses the change of regime.
func TestLevelOrder(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		f      float64
		n0, n1 int
	}{{1e-8, 47, 50}, {1000, 1, 30}} {
		f := c.f
		t.Run(fmt.Sprintf("f=%g", f), func(t *testing.T) {
			t.Parallel()
			var prev *big.Float
			crossed := false
			for n := c.n0; n <= c.n1; n++ {
				eta, err := Level(f, n, 64)
				if err != nil {
					t.Fatalf("n=%d: %v", n, err)
				}
				e, _ := eta.Float64()
				nn := float64(n * n)
				if e < nn-f/2 || e > nn+f/2 {
					t.Errorf("n=%d: η = %v outside [%v, %v]", n, e, nn-f/2, nn+f/2)
				}
				if prev != nil && eta.Cmp(prev) <= 0 {
					t.Errorf("n=%d: η = %v not above η_%d = %v", n, e, n-1, prev)
				}
				if e > f/2 && n > 1 {
					crossed = true
				}
				prev = eta
			}
			if f == 1000 && !crossed {
				t.Error("no two-wall level reached")
			}
		})
	}
}

func TestLevelSpecial(t *testing.T) {
	t.Parallel()
	// f = 0: η = n² exactly (the zero-field infinite well: common
	// practice, no source).
	for _, fn := range []func(float64, int, uint) (*big.Float, error){Level, LevelAiry, LevelShoot} {
		for _, n := range []int{1, 7, 1000} {
			got, err := fn(0, n, 0)
			if err != nil {
				t.Fatal(err)
			}
			if got.Cmp(fint(int64(n*n), 64)) != 0 || got.Prec() != DefaultPrec {
				t.Errorf("f=0/n=%d: %s at %d bits", n, got.Text('g', 20), got.Prec())
			}
		}
	}
	// Mirror symmetry η_n(−f) = η_n(f) (common practice, no source).
	for _, f := range []float64{1e-8, 2.5, 1e4} {
		a, err1 := Level(f, 2, 96)
		b, err2 := Level(-f, 2, 96)
		if err1 != nil || err2 != nil || a.Cmp(b) != 0 {
			t.Errorf("f=±%g: %v %v, %v %v", f, a, err1, b, err2)
		}
	}
}

func TestLevelErrors(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		f    float64
		n    int
		want error
	}{
		{math.NaN(), 1, tiltwell.ErrField},
		{math.Inf(1), 1, tiltwell.ErrField},
		{math.Inf(-1), 1, tiltwell.ErrField},
		{1, 0, tiltwell.ErrLevel},
		{1, -3, tiltwell.ErrLevel},
		{1, MaxLevel + 1, tiltwell.ErrLevel},
		{2 * MaxField, 1, tiltwell.ErrOutOfRange},
		{-2 * MaxField, 1, tiltwell.ErrOutOfRange},
	} {
		for name, fn := range map[string]func(float64, int, uint) (*big.Float, error){"Level": Level, "LevelAiry": LevelAiry, "LevelShoot": LevelShoot} {
			got, err := fn(c.f, c.n, 64)
			if !errors.Is(err, c.want) || got != nil {
				t.Errorf("%s(%v, %d) = %v, %v; want error wrapping %v", name, c.f, c.n, got, err, c.want)
			}
		}
	}
	// The Maclaurin series cannot reach small fields.
	if _, err := LevelAiry(1e-6, 1, 64); !errors.Is(err, tiltwell.ErrOutOfRange) {
		t.Errorf("LevelAiry(1e-6, 1): %v", err)
	}
}

// The caches behind Pi, GammaThird and Initial are shared; concurrent use at
// different precisions must be race-free and give the same results.
func TestConcurrent(t *testing.T) {
	t.Parallel()
	want, err := Level(5, 2, 100)
	if err != nil {
		t.Fatal(err)
	}
	var wg sync.WaitGroup
	for i := range 4 {
		wg.Go(func() {
			Pi(uint(100 + 50*i))
			Initial(uint(120 + 40*i))
			got, err := Level(5, 2, 100)
			if err != nil || got.Cmp(want) != 0 {
				t.Errorf("goroutine %d: %v %v, want %v", i, got, err, want)
			}
		})
	}
	wg.Wait()
}

// FuzzLevel: no panic, a finite value or an error wrapping a root sentinel.
func FuzzLevel(f *testing.F) {
	for _, s := range []struct {
		f float64
		n int
	}{{0, 1}, {1e-8, 3}, {-2.5, 2}, {1e4, 50}, {math.NaN(), 1}, {1, 0}, {1e6, 1}} {
		f.Add(s.f, s.n)
	}
	f.Fuzz(func(t *testing.T, fv float64, n int) {
		if n > 60 && n <= MaxLevel && !math.IsNaN(fv) && !math.IsInf(fv, 0) && math.Abs(fv) <= MaxField {
			t.Skip("valid but slow: high levels are covered by TestLevelOrder")
		}
		got, err := Level(fv, n, 64)
		if err != nil {
			if !errors.Is(err, tiltwell.ErrField) && !errors.Is(err, tiltwell.ErrLevel) &&
				!errors.Is(err, tiltwell.ErrOutOfRange) && !errors.Is(err, tiltwell.ErrNoConvergence) {
				t.Fatalf("Level(%v, %d): unwrapped error %v", fv, n, err)
			}
			return
		}
		if got.IsInf() {
			t.Fatalf("Level(%v, %d) = %v", fv, n, got)
		}
	})
}
