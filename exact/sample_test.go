package exact

import (
	"errors"
	"math"
	"math/big"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact/internal/bigairy"
)

// waveDiff returns max |a(x) − b(x)| and max |a(x)| over n + 1 points
// evenly spaced on [lo, hi].
func waveDiff(a, b tiltwell.Wavefunction, lo, hi float64, n int) (diff, size float64) {
	for i := 0; i <= n; i++ {
		x := lo + (hi-lo)*float64(i)/float64(n)
		u, v := a.At(x), b.At(x)
		diff = max(diff, math.Abs(u-v))
		size = max(size, math.Abs(u))
	}
	return diff, size
}

// TestBuildWaveInfinite: the wavefunction BuildWave builds from a level
// is the one Wavefunction returns, to rounding (common practice, no
// source: the same function of the same level). Measured worst
// difference 7.7e-15 of max|φ| (f = 20, n = 7); the bound is 3e-14.
func TestBuildWaveInfinite(t *testing.T) {
	t.Parallel()
	var w tiltwell.Wavefunction
	for _, f := range append([]float64{0, 1e-25, -0.3, -7, -1e4, 2e4, -1e5}, fields...) {
		lv, err := Solver{}.Levels(nil, f, 60)
		if err != nil {
			t.Fatal(err)
		}
		for _, l := range lv {
			if l.N > 12 && l.N%7 != 0 {
				continue
			}
			ref, err := Solver{}.Wavefunction(f, l.N)
			if err != nil {
				t.Fatal(err)
			}
			if w, err = (Solver{}).BuildWave(w, f, l); err != nil {
				t.Fatalf("f=%g n=%d: %v", f, l.N, err)
			}
			if d, m := waveDiff(ref, w, -0.002, 1.002, 1004); d > 3e-14*m {
				t.Errorf("f=%g n=%d: BuildWave differs from Wavefunction by %.3g (max |φ| %.3g)", f, l.N, d, m)
			}
			for _, x := range []float64{math.NaN(), -1e-300, 1 + 1e-16, math.Inf(1)} {
				if v := w.At(x); v != 0 {
					t.Errorf("f=%g n=%d: φ(%v) = %v, want 0", f, l.N, x, v)
				}
			}
		}
	}
}

// TestBuildWaveStack: for a Stack, the wavefunction BuildWave builds from
// a level (η_r, carried to the real level η₀ by Newton steps) is the one
// Wavefunction returns, and so is its support. Measured worst difference
// 1.2e-13 of max|φ| (the double well at f = −8, Γ = 1e-4, where the
// energies differ within the level's Err), supports within 1.3e-9 (the
// tolerance of the support's root finding); the bounds are 1e-12 and
// 1e-8.
func TestBuildWaveStack(t *testing.T) {
	t.Parallel()
	var w tiltwell.Wavefunction
	for name, st := range testStacks(t) {
		s := Solver{Stack: st}
		for _, f := range []float64{0, 1e-6, 0.01, 0.5, 2, -1, 3, 6, -8} {
			ls, err := s.Levels(nil, f, 5)
			if err != nil && !errors.Is(err, tiltwell.ErrLevel) {
				t.Fatal(err)
			}
			for _, l := range ls {
				ref, err := s.Wavefunction(f, l.N)
				if err != nil {
					t.Fatal(err)
				}
				if w, err = s.BuildWave(w, f, l); err != nil {
					t.Fatalf("%s f=%g n=%d: %v", name, f, l.N, err)
				}
				lo, hi := tiltwell.Support(ref)
				lo2, hi2 := tiltwell.Support(w)
				if math.Abs(lo-lo2) > 1e-8*(1+math.Abs(lo)) || math.Abs(hi-hi2) > 1e-8*(1+math.Abs(hi)) {
					t.Errorf("%s f=%g n=%d: support [%.15g, %.15g], Wavefunction's [%.15g, %.15g]", name, f, l.N, lo2, hi2, lo, hi)
				}
				if d, m := waveDiff(ref, w, lo-0.5, hi+0.5, 1000); d > 1e-12*m {
					t.Errorf("%s f=%g n=%d (Γ = %.2g): BuildWave differs from Wavefunction by %.3g (max |φ| %.3g)", name, f, l.N, l.Gamma, d, m)
				}
				if v := w.At(math.NaN()); v != 0 {
					t.Errorf("%s f=%g n=%d: φ(NaN) = %v", name, f, l.N, v)
				}
			}
		}
	}
}

// TestSampleWave: SampleWave gives the values of BuildWave's
// wavefunction, bit for bit, in dst's storage.
func TestSampleWave(t *testing.T) {
	t.Parallel()
	xi := []float64{-3, -0.7, -1e-300, 0, 1e-9, 0.13, 0.5, 0.77, 1, 1.2, 2.5, math.NaN()}
	for _, s := range []Solver{{}, {Stack: benchWell}, {Stack: benchClad}} {
		for _, f := range []float64{0, 0.4, -3, 40} {
			ls, err := s.Levels(nil, f, 3)
			if err != nil && !errors.Is(err, tiltwell.ErrLevel) {
				t.Fatal(err)
			}
			for _, l := range ls {
				w, err := s.BuildWave(nil, f, l)
				if err != nil {
					t.Fatal(err)
				}
				dst := make([]float64, 3, len(xi))
				got, err := s.SampleWave(dst, f, l, xi)
				if err != nil {
					t.Fatal(err)
				}
				if &got[0] != &dst[:1][0] || len(got) != len(xi) {
					t.Fatalf("SampleWave did not append to dst[:0]")
				}
				for i, x := range xi {
					if want := w.At(x); math.Float64bits(got[i]) != math.Float64bits(want) {
						t.Errorf("%v f=%g n=%d ξ=%g: SampleWave %v, BuildWave %v", s.Stack, f, l.N, x, got[i], want)
					}
				}
			}
		}
	}
}

// TestBuildWaveErrors: a level that is not a level of the solver at f, or
// bad arguments, give errors wrapping the root sentinels; a reuse of the
// other kind, or a nil one, is no problem.
func TestBuildWaveErrors(t *testing.T) {
	t.Parallel()
	inf, stk := Solver{}, Solver{Stack: benchWell}
	li, err := inf.Levels(nil, 2, 3)
	if err != nil {
		t.Fatal(err)
	}
	ls, err := stk.Levels(nil, 2, 3)
	if err != nil {
		t.Fatal(err)
	}
	with := func(l tiltwell.Level, n int, e float64) tiltwell.Level { l.N, l.Energy = n, e; return l }
	for _, c := range []struct {
		name string
		s    Solver
		f    float64
		l    tiltwell.Level
		want error
	}{
		{"infinite NaN field", inf, math.NaN(), li[0], tiltwell.ErrField},
		{"infinite field beyond range", inf, 2e5, li[0], tiltwell.ErrOutOfRange},
		{"infinite level 0", inf, 2, with(li[0], 0, li[0].Energy), tiltwell.ErrLevel},
		{"infinite level beyond MaxLevels", inf, 2, with(li[0], MaxLevels+1, li[0].Energy), tiltwell.ErrLevel},
		{"infinite NaN energy", inf, 2, with(li[0], 1, math.NaN()), tiltwell.ErrLevel},
		{"infinite wrong level", inf, 2, with(li[0], 2, li[0].Energy), tiltwell.ErrLevel},
		{"infinite wrong level at zero field", inf, 0, with(li[0], 2, 1), tiltwell.ErrLevel},
		{"infinite other field", inf, 40, li[1], tiltwell.ErrLevel},
		{"stack other field", stk, 1, ls[1], tiltwell.ErrLevel},
		{"stack NaN field", stk, math.NaN(), ls[0], tiltwell.ErrField},
		{"stack infinite energy", stk, 2, with(ls[0], 1, math.Inf(1)), tiltwell.ErrLevel},
		{"stack wrong level", stk, 2, with(ls[1], 3, ls[1].Energy), tiltwell.ErrLevel},
		{"stack above the barrier", stk, 2, with(ls[0], 1, 30), tiltwell.ErrLevel},
		{"stack level beyond MaxLevels", stk, 2, with(ls[0], MaxLevels+1, 1), tiltwell.ErrLevel},
	} {
		w, err := c.s.BuildWave(nil, c.f, c.l)
		if !errors.Is(err, c.want) || w != nil {
			t.Errorf("%s: BuildWave = %v, %v; want nil and an error wrapping %v", c.name, w, err, c.want)
		}
		if v, err := c.s.SampleWave(nil, c.f, c.l, []float64{0.5}); !errors.Is(err, c.want) || len(v) != 0 {
			t.Errorf("%s: SampleWave = %v, %v; want no values and an error wrapping %v", c.name, v, err, c.want)
		}
	}
	// An energy off by more than its Err, and a level whose Err covers
	// the difference, which Newton steps bring to the level.
	if _, err := inf.BuildWave(nil, 2, with(li[0], 1, li[0].Energy+1e-6)); !errors.Is(err, tiltwell.ErrLevel) {
		t.Errorf("η + 1e-6: error %v, want one wrapping ErrLevel", err)
	}
	near := li[0]
	near.Energy, near.Err = near.Energy+1e-6, 1e-6
	w, err := inf.BuildWave(nil, 2, near)
	if err != nil {
		t.Fatal(err)
	}
	ref, _ := inf.Wavefunction(2, 1)
	if d, m := waveDiff(ref, w, 0, 1, 200); d > 1e-12*m { // steps stop below 1e-12
		t.Errorf("from η + 1e-6 with Err 1e-6: differs by %.3g", d)
	}
	// Reuse of the other kind, and typed nils.
	for _, reuse := range []tiltwell.Wavefunction{nil, (*sampledWave)(nil), (*sampledStackWave)(nil), ref} {
		if _, err := inf.BuildWave(reuse, 2, li[0]); err != nil {
			t.Errorf("reuse %T: %v", reuse, err)
		}
		if _, err := stk.BuildWave(reuse, 2, ls[0]); err != nil {
			t.Errorf("reuse %T: %v", reuse, err)
		}
	}
}

// TestBuildWaveAllocs: building into a reused wavefunction, and sampling
// into a dst with room, allocate nothing.
func TestBuildWaveAllocs(t *testing.T) {
	if underRace || testing.CoverMode() != "" {
		t.Skip("allocation counts differ under -race and -cover (sync.Pool drops items under -race)")
	}
	xi := make([]float64, 64)
	for i := range xi {
		xi[i] = -1 + 3*float64(i)/63
	}
	dst := make([]float64, 0, len(xi))
	for _, s := range []Solver{{}, {Stack: benchWell}, {Stack: benchClad}} {
		for _, f := range []float64{0, 2, -3} {
			ls, err := s.Levels(nil, f, 2)
			if err != nil {
				t.Fatal(err)
			}
			w, err := s.BuildWave(nil, f, ls[1])
			if err != nil {
				t.Fatal(err)
			}
			if a := testing.AllocsPerRun(50, func() { w, _ = s.BuildWave(w, f, ls[1]) }); a != 0 {
				t.Errorf("%v f=%g: BuildWave with reuse: %v allocations", s.Stack, f, a)
			}
			if a := testing.AllocsPerRun(50, func() { dst, _ = s.SampleWave(dst, f, ls[1], xi) }); a != 0 {
				t.Errorf("%v f=%g: SampleWave: %v allocations", s.Stack, f, a)
			}
		}
	}
}

// TestStackTails holds the outer layers of a quasi-bound wavefunction to
// an independent evaluation of the Airy functions at 200 bits (Maclaurin
// series, exact/internal/bigairy): φ(ξ)/φ₁ = M(z)/M(z_I) on the downhill
// side (M the Airy modulus, DLMF 9.8.3) and φ(ξ)/φ_n = Ai(z)/Ai(z_n) on
// the uphill one, with z = c(v + f(ξ − ½) − η) formed as the solver forms
// it. The points reach both the node table's range and the asymptotic
// one. The bound 2e-13 allows for the rounding of z (ε|z| moves ln Ai by
// ε|z|^(3/2)).
func TestStackTails(t *testing.T) {
	t.Parallel()
	const prec = 200
	airy := func(z float64) (ai, m float64) {
		a, _, b, _ := bigairy.Airy(big.NewFloat(z), prec)
		af, _ := a.Float64()
		bf, _ := b.Float64()
		return af, math.Hypot(af, bf)
	}
	checked := [2]int{}
	for _, f := range []float64{0.5, 3} {
		s := Solver{Stack: benchWell}
		lv, err := s.Levels(nil, f, 1)
		if err != nil {
			t.Fatal(err)
		}
		w, err := s.Wavefunction(f, 1)
		if err != nil {
			t.Fatal(err)
		}
		sw := w.(*StackWave)
		// Downhill, between the turning point and interface 1.
		_, mI := airy(sw.ls0.c * (sw.v0 + f*(sw.x1-0.5) - sw.eta))
		for i := 1; i <= 8; i++ {
			x := sw.x1 - (sw.x1-sw.turningLeft)*float64(i)/9
			z := sw.ls0.c * (sw.v0 + f*(x-0.5) - sw.eta)
			_, m := airy(z)
			if got, want := w.At(x)/sw.phi1, m/mI; math.Abs(got-want) > 2e-13*want {
				t.Errorf("f=%g ξ=%g (z=%.4g): φ/φ₁ = %.16g, M(z)/M(z_I) = %.16g", f, x, z, got, want)
			}
			checked[0]++
		}
		// Uphill, beyond the last interface.
		zn := sw.lsn.c * (sw.vn + f*(sw.xn-0.5) - sw.eta)
		ain, _ := airy(zn)
		for i := 1; i <= 8; i++ {
			x := sw.xn + 0.15*float64(i)
			z := sw.lsn.c * (sw.vn + f*(x-0.5) - sw.eta)
			ai, _ := airy(z)
			if got, want := w.At(x)/sw.phin, ai/ain; math.Abs(got-want) > 2e-13*want {
				t.Errorf("f=%g ξ=%g (z=%.4g): φ/φ_n = %.16g, Ai(z)/Ai(z_n) = %.16g", f, x, z, got, want)
			}
			checked[1]++
		}
		_ = lv
	}
	if checked != [2]int{16, 16} {
		t.Errorf("checked %v points", checked)
	}
}

// TestStackTailWeakField: at f = 1e-6 the Airy arguments of the downhill
// tail are near 10⁵ and its exponent ζ near 10⁷; formed without
// cancellation, ln φ is smooth there: its second differences over steps
// of 0.0175 stay below 1e-9 (measured 1.3e-10; forming ζ(z) − ζ(z_I)
// directly left jumps of 6e-8).
func TestStackTailWeakField(t *testing.T) {
	t.Parallel()
	s := Solver{Stack: benchWell}
	w, err := s.Wavefunction(1e-6, 1)
	if err != nil {
		t.Fatal(err)
	}
	lo, _ := tiltwell.Support(w)
	var l []float64
	for x := lo; x < 0; x += 0.0175 {
		l = append(l, math.Log(w.At(x)))
	}
	for i := 1; i+1 < len(l); i++ {
		if d2 := l[i+1] - 2*l[i] + l[i-1]; math.Abs(d2) > 1e-9 {
			t.Errorf("ξ = %.4f: second difference of ln φ %.3g", lo+0.0175*float64(i), d2)
		}
	}
}

// TestDownhillEnd: the downhill end of a quasi-bound level's support is
// where w(ξ) = (ξ − ξ_t) φ(ξ)² falls to 1e-17 (ξ_t the turning point): w
// is at most that at the end, and a millionth of the tail further in it
// is above, unless the end is the turning point or the interface itself.
func TestDownhillEnd(t *testing.T) {
	t.Parallel()
	const tiny = 1e-17
	n := 0
	for name, st := range testStacks(t) {
		s := Solver{Stack: st}
		for _, f := range []float64{1e-3, 0.5, 2, 3, 6} {
			ls, _ := s.Levels(nil, f, 4)
			for _, l := range ls {
				w, err := s.Wavefunction(f, l.N)
				if err != nil {
					t.Fatal(err)
				}
				sw := w.(*StackWave)
				xt, x1 := sw.turningLeft, sw.x1
				wt := func(x float64) float64 { v := sw.At(x); return (x - xt) * v * v }
				lo := sw.lo
				if lo < xt || lo > x1 {
					t.Errorf("%s f=%g n=%d: end %g outside [ξ_t, ξ₁] = [%g, %g]", name, f, l.N, lo, xt, x1)
					continue
				}
				if v := wt(lo); v > tiny*(1+1e-9) {
					t.Errorf("%s f=%g n=%d: w(%g) = %.3g > %g", name, f, l.N, lo, v, tiny)
				}
				if lo > xt && lo < x1 {
					if v := wt(lo + 1e-6*(x1-xt)); !(v > tiny) {
						t.Errorf("%s f=%g n=%d: w(%g + 1e-6 of the tail) = %.3g, not above %g: the end is loose", name, f, l.N, lo, v, tiny)
					}
					n++
				}
			}
		}
	}
	if n < 20 {
		t.Errorf("only %d ends strictly inside their tails", n)
	}
	// At weak fields the turning point is up to 1e301 away: the end
	// stays a few tens of decay lengths from the interface (ln w, formed
	// from logarithms, at most ln 1e-17 there), where an 80-step
	// bisection over [ξ_t, ξ₁] left it near −9e284 at f ≤ 1e-30.
	for _, st := range []tiltwell.Stack{benchWell, benchClad} {
		s := Solver{Stack: st}
		for _, f := range []float64{1e-300, 1e-100, 1e-30, 1e-12} {
			for k := 1; k <= 2; k++ {
				w, err := s.Wavefunction(f, k)
				if err != nil {
					t.Fatal(err)
				}
				sw := w.(*StackWave)
				lo := sw.lo
				lr, _ := sw.leftLog(lo)
				lnw := math.Log(lo-sw.turningLeft) + 2*(math.Log(sw.phi1)+lr)
				if !(lo >= sw.x1-40 && lo < sw.x1) || lnw > math.Log(tiny)+1e-9 {
					t.Errorf("%v f=%g n=%d: end %g (interface %g), ln w = %.6g", st, f, k, lo, sw.x1, lnw)
				}
			}
		}
	}
}
