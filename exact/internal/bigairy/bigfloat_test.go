package bigairy

import (
	"math/big"
	"testing"
)

// parse returns the decimal s as a big.Float of precision prec.
func parse(t *testing.T, s string, prec uint) *big.Float {
	t.Helper()
	x, _, err := big.ParseFloat(s, 10, prec, big.ToNearestEven)
	if err != nil {
		t.Fatalf("parse %q: %v", s, err)
	}
	return x
}

// relErr returns |got − want| / max(|want|, floor) as a float64.
func relErr(got, want *big.Float, floor float64) float64 {
	p := max(got.Prec(), want.Prec()) + 64
	d := newf(p).Sub(got, want)
	d.Abs(d)
	s := newf(p).Abs(want)
	if fl := newf(p).SetFloat64(floor); s.Cmp(fl) < 0 {
		s = fl
	}
	if s.Sign() == 0 {
		r, _ := d.Float64()
		return r
	}
	r, _ := d.Quo(d, s).Float64()
	return r
}

// ulps returns 2^-bits as a float64.
func ulps(bits int) float64 { r, _ := newf(64).SetMantExp(fint(1, 64), -bits).Float64(); return r }

func TestPi(t *testing.T) {
	t.Parallel()
	// π to 50 digits: from memory (a fact of the trade), checked here only
	// to the digits written.
	const pi50 = "3.14159265358979323846264338327950288419716939937510"
	if e := relErr(Pi(200), parse(t, pi50, 200), 0); e > 1e-50 {
		t.Errorf("Pi(200) differs from 50 known digits by %g", e)
	}
	// Independent: 4 arctan(1) by argument halving and the Gregory series
	// does not use Pi (no reduction for |x| ≤ 1). Checked at 1000 bits.
	for _, prec := range []uint{53, 200, 1000} {
		a := Atan(fint(1, prec), prec+16)
		a.SetMantExp(a, 2)
		if e := relErr(Pi(prec), a, 0); e > 4*ulps(int(prec)) {
			t.Errorf("prec=%d: Pi vs 4 arctan 1: rel %g", prec, e)
		}
	}
}

func TestElementary(t *testing.T) {
	t.Parallel()
	const prec = 300
	tol := 8 * ulps(prec)
	// ln 2 = 2 artanh(1/3) = 2 Σ 1/((2k+1) 3^(2k+1)) (DLMF 4.6.1 at x = 2;
	// summed here independently of Log).
	ln2 := newf(prec + 32)
	p := newf(prec+32).Quo(fint(1, prec+32), fint(3, prec+32))
	for k := int64(0); bitsOf(p) > -prec-40; k++ {
		ln2.Add(ln2, newf(prec+32).Quo(p, fint(2*k+1, prec+32)))
		p.Quo(p, fint(9, prec+32))
	}
	ln2.SetMantExp(ln2, 1)
	if e := relErr(Log(fint(2, prec), prec), ln2, 0); e > tol {
		t.Errorf("Log(2): rel %g", e)
	}
	// e to 40 digits: from memory (a fact of the trade).
	if e := relErr(Exp(fint(1, prec), prec), parse(t, "2.7182818284590452353602874713526624977572", prec), 0); e > 1e-40 {
		t.Errorf("Exp(1): rel %g", e)
	}
	// Round trips and identities over a range of magnitudes.
	for _, xs := range []string{"1e-30", "0.001", "0.5", "1", "1.5", "7", "123.456", "3771", "-3771", "-0.25", "1e40"} {
		x := parse(t, xs, prec)
		t.Run("x="+xs, func(t *testing.T) {
			t.Parallel()
			c := Cbrt(x, prec)
			c3 := newf(prec+8).Mul(c, c)
			c3.Mul(c3, c)
			if e := relErr(c3, x, 0); e > tol {
				t.Errorf("Cbrt³: rel %g", e)
			}
			if x.Sign() > 0 {
				if e := relErr(Exp(Log(x, prec+16), prec), x, 0); e > tol {
					t.Errorf("Exp(Log x): rel %g", e)
				}
			}
			if xf, _ := x.Float64(); xf > -5000 && xf < 5000 {
				// Log(Exp x) = x, absolute error relative to max(1, |x|).
				if e := relErr(Log(Exp(x, prec+32), prec), x, 1); e > tol {
					t.Errorf("Log(Exp x): rel %g", e)
				}
			}
			// arctan x + arctan(1/x) = π/2 for x > 0 (DLMF 4.24.15): one side
			// is reduced, the other is not.
			if x.Sign() > 0 {
				s := Atan(x, prec)
				s.Add(s, Atan(newf(prec).Quo(fint(1, prec), x), prec))
				h := Pi(prec)
				h.SetMantExp(h, -1)
				if e := relErr(s, h, 0); e > tol {
					t.Errorf("arctan x + arctan 1/x − π/2: rel %g", e)
				}
			}
		})
	}
	// arctan(1/√3) = π/6 (DLMF 4.14 special values, common practice).
	s3 := Sqrt(fint(3, prec+16), prec+16)
	a := Atan(newf(prec+16).Quo(fint(1, prec+16), s3), prec)
	want := newf(prec).Quo(Pi(prec), fint(6, prec))
	if e := relErr(a, want, 0); e > tol {
		t.Errorf("arctan(1/√3): rel %g", e)
	}
	// Atan2 quadrants: (y, x) = (1, −1) → 3π/4, (−1, −1) → −3π/4, (−1, 0) → −π/2.
	for _, c := range []struct {
		y, x int64
		num  int64 // want = num·π/4
	}{{1, -1, 3}, {-1, -1, -3}, {-1, 0, -2}, {0, -1, 4}, {1, 1, 1}} {
		got := Atan2(fint(c.y, prec), fint(c.x, prec), prec)
		want := newf(prec).Mul(Pi(prec), fint(c.num, prec))
		want.SetMantExp(want, -2)
		if e := relErr(got, want, 0); e > tol {
			t.Errorf("Atan2(%d, %d): rel %g", c.y, c.x, e)
		}
	}
}

func TestGamma(t *testing.T) {
	t.Parallel()
	const prec = 200
	tol := 16 * ulps(prec)
	third := newf(prec+32).Quo(fint(1, prec+32), fint(3, prec+32))
	twoThirds := newf(prec+32).Quo(fint(2, prec+32), fint(3, prec+32))
	g13, g23 := GammaThird(prec)
	// Independent route: Stirling's series with exact Bernoulli numbers.
	if e := relErr(g13, GammaStirling(third, prec), 0); e > tol {
		t.Errorf("Γ(1/3): AGM vs Stirling rel %g", e)
	}
	if e := relErr(g23, GammaStirling(twoThirds, prec), 0); e > tol {
		t.Errorf("Γ(2/3): reflection vs Stirling rel %g", e)
	}
	// Γ(1/2) = √π (DLMF 5.4.6), Γ(5) = 24, Γ(1) = 1 (DLMF 5.4.1).
	half := newf(prec).SetFloat64(0.5)
	if e := relErr(GammaStirling(half, prec), Sqrt(Pi(prec+8), prec), 0); e > tol {
		t.Errorf("Γ(1/2): rel %g", e)
	}
	if e := relErr(GammaStirling(fint(5, prec), prec), fint(24, prec), 0); e > tol {
		t.Errorf("Γ(5): rel %g", e)
	}
	if e := relErr(GammaStirling(fint(1, prec), prec), fint(1, prec), 0); e > tol {
		t.Errorf("Γ(1): rel %g", e)
	}
	// Γ(1/3) = 2.6789385347077476337…: from memory; the Airy initial values
	// of DLMF 9.2.3–9.2.6 test it again in TestInitial.
	if e := relErr(g13, parse(t, "2.6789385347077476337", prec), 0); e > 1e-19 {
		t.Errorf("Γ(1/3) digits: rel %g", e)
	}
}

func TestBernoulli(t *testing.T) {
	t.Parallel()
	// DLMF Table 24.2.1: B_0 … B_12.
	want := []string{"1", "-1/2", "1/6", "0", "-1/30", "0", "1/42", "0", "-1/30", "0", "5/66", "0", "-691/2730"}
	got := Bernoulli(12)
	for i, w := range want {
		r, _ := new(big.Rat).SetString(w)
		if got[i].Cmp(r) != 0 {
			t.Errorf("B_%d = %v, want %v", i, got[i], w)
		}
	}
}

func TestCaches(t *testing.T) {
	t.Parallel()
	// A low-precision request after a high one is the correctly rounded
	// high value; a fresh computation at the low precision agrees.
	hi := Pi(2000)
	lo := Pi(100)
	if lo.Prec() != 100 || hi.Prec() != 2000 {
		t.Fatalf("precisions %d, %d", lo.Prec(), hi.Prec())
	}
	if r := round(hi, 100); r.Cmp(lo) != 0 {
		t.Errorf("Pi(100) = %s, rounded Pi(2000) = %s", lo.Text('g', 40), r.Text('g', 40))
	}
	if e := relErr(machinPi(100), lo, 0); e > 2*ulps(100) {
		t.Errorf("fresh Pi(100) vs cached: rel %g", e)
	}
	// Results are fresh values: changing one does not change the next.
	a := Pi(64)
	a.SetInt64(3)
	if b := Pi(64); b.Cmp(a) == 0 {
		t.Error("Pi result aliases the cache")
	}
}
