package bigstack

import (
	"fmt"
	"math"
	"math/cmplx"
	"testing"

	"github.com/tiltwell/tiltwell/exact/internal/bigairy"
)

func cnum(z complex128, prec uint) *cf {
	c := newc(prec)
	c.re.SetFloat64(real(z))
	c.im.SetFloat64(imag(z))
	return c
}

// The complex series on the real axis against bigairy.Airy (the real
// Maclaurin series, itself held against DLMF values in its tests): the
// complex arithmetic must reproduce the real functions.
func TestAiSeriesReal(t *testing.T) {
	t.Parallel()
	const prec = 160
	for _, z := range []float64{-30, -5, -1, 0, 0.5, 5, 30} {
		ai, aip := aiSeries(cnum(complex(z, 0), prec), prec)
		wai, waip, _, _ := bigairy.Airy(ffloat(z, prec), prec)
		// Near zeros on the negative axis the accuracy is relative to the
		// modulus, about |z|^(−1/4).
		floor := 0.0
		if z < 0 {
			floor = 0.1 * math.Pow(-z, -0.25)
		}
		if e := crelErr(ai, creal(wai, prec), floor); e > 1e-45 {
			t.Errorf("Ai(%g): rel %g", z, e)
		}
		if e := crelErr(aip, creal(waip, prec), 10*floor); e > 1e-45 {
			t.Errorf("Ai′(%g): rel %g", z, e)
		}
		if ai.im.Sign() != 0 || aip.im.Sign() != 0 {
			t.Errorf("Ai(%g) not real", z)
		}
	}
}

// DLMF 9.2.11: Ai(z e^(∓2πi/3)) = ½ e^(∓πi/3) (Ai(z) ± i Bi(z)); with the
// lower sign, Ai(z) − i Bi(z) = 2 e^(−πi/3) Ai(z e^(2πi/3)), the outgoing
// wave the solver uses. Ai, Bi on the right from bigairy (real series),
// the left from the complex series at a rotated argument. Equation number
// from memory; the identity is what is checked.
func TestOutgoingConnection(t *testing.T) {
	t.Parallel()
	const prec = 160
	for _, z := range []float64{-7, -1, 0.3, 2, 9, 25} {
		w := newc(prec).mul(cnum(complex(z, 0), prec), omega3(prec))
		ai, _ := aiSeries(w, prec)
		rot := cnum(cmplx.Exp(complex(0, -math.Pi/3)), prec) // float64 phase: ≤ 1e-16
		got := newc(prec).mul(ai, rot)
		got.mulR(got, fint(2, prec))
		a, _, b, _ := bigairy.Airy(ffloat(z, prec), prec)
		want := newc(prec)
		want.re.Set(a)
		want.im.Neg(b)
		if e := crelErr(got, want, 0); e > 1e-15 {
			t.Errorf("z=%g: Ai − iBi vs 2e^(−πi/3)Ai(ze^(2πi/3)): rel %g", z, e)
		}
	}
}

// DLMF 9.2.12 (from memory): Ai(z) + e^(2πi/3) Ai(z e^(2πi/3)) +
// e^(−2πi/3) Ai(z e^(−2πi/3)) = 0 at complex z.
func TestAiryConnectionComplex(t *testing.T) {
	t.Parallel()
	const prec = 200
	om := omega3(prec)
	omc := newc(prec).set(om)
	omc.im.Neg(&omc.im)
	for _, z := range []complex128{3 + 4i, -2 + 0.5i, 10 - 1i, -12 - 3i, 0.1i} {
		zc := cnum(z, prec)
		a0, _ := aiSeries(zc, prec)
		a1, _ := aiSeries(newc(prec).mul(zc, om), prec)
		a2, _ := aiSeries(newc(prec).mul(zc, omc), prec)
		sum := newc(prec).mul(a1, om)
		sum.add(sum, newc(prec).mul(a2, omc))
		sum.add(sum, a0)
		// Relative to the largest of the three terms.
		scale := math.Max(cmplx.Abs(a0.float()), math.Max(cmplx.Abs(a1.float()), cmplx.Abs(a2.float())))
		if r := cmplx.Abs(sum.float()) / scale; r > 1e-55 {
			t.Errorf("z=%v: connection sum %g of scale %g", z, r, scale)
		}
	}
}

// Where both apply (|z| = 40, precision 128), the asymptotic ratio
// Ai′/Ai of DLMF 9.7.5–9.7.6 and its derivative z − ω² must agree with the
// Maclaurin series, at several phases up to the Stokes line 2π/3.
func TestAsymptoticOverlap(t *testing.T) {
	t.Parallel()
	const prec = 128
	for _, ph := range []float64{0, 0.3, -1, math.Pi / 3, 2, 2 * math.Pi / 3} {
		t.Run(fmt.Sprintf("ph=%g", ph), func(t *testing.T) {
			t.Parallel()
			z := cnum(cmplx.Rect(40, ph), prec)
			w, zmw2, ok := aiRatioAsym(z, prec)
			if !ok {
				t.Fatal("asymptotic series did not reach the precision")
			}
			ai, aip := aiSeries(z, prec+64)
			want := newc(prec+64).quo(aip, ai)
			if e := crelErr(w, want, 0); e > 1e-36 {
				t.Errorf("ω: rel %g", e)
			}
			wd := newc(prec+64).mul(want, want)
			wd.sub(z, wd)
			if e := crelErr(zmw2, wd, 0); e > 1e-30 {
				t.Errorf("z − ω²: rel %g", e)
			}
		})
	}
	// Too small an argument for the precision is refused, not wrong.
	if _, _, ok := aiRatioAsym(cnum(3, 200), 200); ok {
		t.Error("asymptotic series accepted |z| = 3 at 200 bits")
	}
}

// Bi by DLMF 9.7.7–9.7.8 against bigairy's series: β = Bi′/Bi, z − β²
// (free of cancellation) and Bi² = e^(2ζ) S_u²/(π√z).
func TestBiAsymptotic(t *testing.T) {
	t.Parallel()
	const prec = 128
	for _, z := range []float64{30, 60} {
		zb := ffloat(z, prec)
		beta, zmb2, su, zeta, ok := biAsym(zb, prec)
		if !ok {
			t.Fatalf("z=%g: not reached", z)
		}
		_, _, bi, bip := bigairy.Airy(zb, prec+64)
		want := newf(prec+64).Quo(bip, bi)
		if e := relErr(beta, want, 0); e > 1e-36 {
			t.Errorf("z=%g β: rel %g", z, e)
		}
		wd := newf(prec+64).Mul(want, want)
		wd.Sub(zb, wd)
		if e := relErr(zmb2, wd, 0); e > 1e-30 {
			t.Errorf("z=%g z − β²: rel %g", z, e)
		}
		// Bi² from the sums.
		wp := uint(prec + 64)
		b2 := bigairy.Exp(newf(wp).SetMantExp(zeta, 1), wp)
		b2.Mul(b2, newf(wp).Mul(su, su))
		b2.Quo(b2, bigairy.Pi(wp))
		b2.Quo(b2, newf(wp).Sqrt(zb))
		if e := relErr(b2, newf(wp).Mul(bi, bi), 0); e > 1e-36 {
			t.Errorf("z=%g Bi²: rel %g", z, e)
		}
	}
}
