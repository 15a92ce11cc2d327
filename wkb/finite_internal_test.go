package wkb

import (
	"fmt"
	"math"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"gonum.org/v1/gonum/integrate/quad"
)

// The blended truncation of the barrier's series (barrierOrder) against the
// Airy modulus to all digits. B = M′/M and U₊ (M² = e^(2ζ) U₊²/(π√z))
// depend on ζ alone, so this one-variable measurement is what the
// estimate rests on: for ζ from minBarrierAction to 40, the estimate
// (twice the next three terms, each counted at most as large as the one
// before) is never below the true error and at most 6.5× above it
// (measured; held to 10×).
func TestBarrierSeries(t *testing.T) {
	t.Parallel()
	var worst, worstU float64
	for zeta := minBarrierAction; zeta < 40; zeta *= 1.01 {
		z := math.Cbrt(1.5 * zeta * 1.5 * zeta)
		_, bex := airyModLog(z)
		var lnM float64
		if z <= airyHi {
			_, m2 := airyTab(z)
			lnM = 0.5 * math.Log(m2)
		} else {
			_, b, zz := airyScaledPos(z)
			lnM = math.Log(b) + zz
		}
		// U₊ = √(π√z) M e^(−ζ).
		lnU := 0.5*math.Log(math.Pi*math.Sqrt(z)) + lnM - zeta
		k, sig, _ := barrierOrder(zeta)
		b := 1 / zeta
		val := func(k int) (r, u float64) {
			u, v, _, _ := barrierSeries(b, k)
			return v / u, u
		}
		r0, u0 := val(k)
		r1, u1 := val(k + 1)
		r, u := (1-sig)*r0+sig*r1, (1-sig)*u0+sig*u1
		errB := r*math.Sqrt(z)/bex - 1
		errU := math.Log(u) - lnU
		eb := finiteSafety * barrierSeriesErr(zeta, 1, 0)
		eu := finiteSafety * barrierSeriesErr(zeta, 0, 1)
		if math.Abs(errB) > eb || math.Abs(errU) > eu {
			t.Errorf("ζ=%.4g: B error %.3g (estimate %.3g), ln U₊ error %.3g (estimate %.3g)", zeta, errB, eb, errU, eu)
		}
		if math.Abs(errB) > 1e-14 && math.Abs(errU) > 1e-14 {
			qb, qu := eb/math.Abs(errB), eu/math.Abs(errU)
			worst, worstU = max(worst, qb), max(worstU, qu)
			if qb > 10 || qu > 10 {
				t.Errorf("ζ=%.4g: estimates %.3g× (B) and %.3g× (U₊) the errors %.3g, %.3g", zeta, qb, qu, errB, errU)
			}
		}
	}
	t.Logf("worst pessimism: %.3g× (B), %.3g× (U₊)", worst, worstU)
}

// The e-derivatives of the level function and of ln G (used by Newton's
// method, the period T = 2 dF/dη and the second-order shift) match
// central differences.
func TestFiniteDerivatives(t *testing.T) {
	t.Parallel()
	for _, c := range []struct{ vL, mL, vR, mR, f, e float64 }{
		{10, 1, 10, 1, 0.5, 3},
		{4.3, 1.37, 5, 1.2, 2, 3.5},   // ζ_L ≈ 0.9: the blend near K = 0..1
		{10, 1.37, 10, 1.37, 10, 4},   // turning point inside the well
		{10, 1.37, 10, 1.37, 10, 9.4}, // near the barrier top
		{50, 2, 50, 2, 5, 45},
		{300, 1, 20, 1.5, 1e-3, 17}, // weak field: Airy arguments past the table
	} {
		t.Run(fmt.Sprintf("%v", c), func(t *testing.T) {
			t.Parallel()
			st, err := tiltwell.AsymmetricWell(c.vL, c.mL, c.vR, c.mR)
			if err != nil {
				t.Fatal(err)
			}
			w := newWell(st, c.f)
			h := 1e-6 * c.e
			p, pa, pb := w.eval(c.e), w.eval(c.e-h), w.eval(c.e+h)
			fd := (pb.psi - pa.psi) / (2 * h)
			fdG := (w.lnG(&pb.dh, pb.zl, pb.zetaL) - w.lnG(&pa.dh, pa.zl, pa.zetaL)) / (2 * h)
			if math.Abs(p.dpsi-fd) > 1e-7*math.Abs(fd) {
				t.Errorf("dψ/de = %.12g, central difference %.12g", p.dpsi, fd)
			}
			if math.Abs(p.dh.dlnG-fdG) > 1e-6*math.Abs(fdG)+1e-9 {
				t.Errorf("d ln G/de = %.10g, central difference %.10g", p.dh.dlnG, fdG)
			}
		})
	}
}

// The Airy helpers of the finite-well rules against package exact's Airy
// functions (tested there against 300-bit sums): M′/M, 1/(πM²), Ai′/Ai,
// χ, ln M, ln Ai and the tail integrals, across the table and both
// asymptotic ranges.
func TestAiryFiniteHelpers(t *testing.T) {
	t.Parallel()
	for _, x := range []float64{-400, -40, -16.5, -15.9, -7.3, -2.33, -0.4, 0, 0.7, 3.1, 11.9, 12.1, 25, 80, 300} {
		ai, aip, bi, bip := exact.AiryScaled(x)
		// Scaled for x > 0: Ai e^ζ, Bi e^(−ζ); the ratios need e^(±2ζ).
		z := 0.0
		if x > 0 {
			z = 2.0 / 3 * x * math.Sqrt(x)
		}
		r := math.Exp(-2 * z) // Ai² relative to Bi², scaled
		m2 := bi*bi + ai*ai*r*r
		l := (bi*bip + ai*aip*r*r) / m2
		y := math.Exp(-2*z) / (math.Pi * m2)
		gy, gl := airyModLog(x)
		if d := math.Abs(gl - l); d > 1e-13*(math.Abs(l)+1) {
			t.Errorf("x=%g: M′/M = %.16g, exact %.16g", x, gl, l)
		}
		if d := math.Abs(gy - y); d > 1e-13*y {
			t.Errorf("x=%g: 1/(πM²) = %.16g, exact %.16g", x, gy, y)
		}
		_, _, wy, wl, wdl := airyWall(x)
		if wy != gy || wl != gl {
			t.Errorf("x=%g: airyWall and airyModLog differ", x)
		}
		// dl/dx = x + y² − l² against a central difference of l.
		h := 1e-3 * max(1, math.Abs(x))
		_, la := airyModLog(x - h)
		_, lb := airyModLog(x + h)
		if fd := (lb - la) / (2 * h); math.Abs(wdl-fd) > 1e-5*math.Abs(fd)+1e-12 {
			t.Errorf("x=%g: dl/dx = %.10g, central difference %.10g", x, wdl, fd)
		}
		if lm := airyLnM(x); math.Abs(lm-(0.5*math.Log(m2)+z)) > 1e-13*(1+z) {
			t.Errorf("x=%g: ln M = %.16g, exact %.16g", x, lm, 0.5*math.Log(m2)+z)
		}
		if x >= 0 {
			g, dg := airyAiLog(x)
			if math.Abs(g-aip/ai) > 1e-13*math.Abs(aip/ai) {
				t.Errorf("x=%g: Ai′/Ai = %.16g, exact %.16g", x, g, aip/ai)
			}
			if g := airyLnAi(x); math.Abs(g-(math.Log(ai)-z)) > 1e-13*(1+z) {
				t.Errorf("x=%g: ln Ai = %.16g, exact %.16g", x, g, math.Log(ai)-z)
			}
			// ∫_x^∞ Ai² = Ai′² − x Ai² and ∫₀^x M² = [x M² − M′² − 1/(π²M²)]₀^x,
			// by quadrature of exact's functions.
			wantAi := 0.0
			wantM := 0.0
			if x < 30 {
				wantAi = integrateRatio(func(s float64) float64 {
					a, _, _, _ := exact.Airy(s)
					return a * a
				}, x, x+30) / (ai * ai * r)
				if x <= 12 {
					wantM = integrateRatio(func(s float64) float64 {
						a, _, b, _ := exact.Airy(s)
						return a*a + b*b
					}, 0, x) / (m2 * math.Exp(2*z))
				}
			}
			if x < 30 {
				if g := -dg; math.Abs(g-wantAi) > 1e-10*wantAi {
					t.Errorf("x=%g: ∫Ai²/Ai² = %.14g, quadrature %.14g", x, g, wantAi)
				}
			}
			if x > 0 && x <= 12 {
				if g := tailM(x); math.Abs(g-wantM) > 1e-10*wantM {
					t.Errorf("x=%g: ∫M²/M² = %.14g, quadrature %.14g", x, g, wantM)
				}
			}
		}
	}
	// Past the table, the series forms of the tails against the direct
	// ones just inside it, continued: 1/(2√x) (1 + O(x^(−3/2))).
	for _, x := range []float64{12.5, 50, 1e4, 1e8} {
		_, dg := airyAiLog(x)
		g := -dg
		if d := math.Abs(g*2*math.Sqrt(x) - 1); d > 0.1/(x*math.Sqrt(x))*10 {
			t.Errorf("x=%g: ∫Ai²/Ai² · 2√x = %.14g", x, g*2*math.Sqrt(x))
		}
		if g := tailM(x); math.Abs(g*2*math.Sqrt(x)-1) > 1/(x*math.Sqrt(x)) {
			t.Errorf("x=%g: ∫M²/M² · 2√x = %.14g", x, g*2*math.Sqrt(x))
		}
	}
	// ζ(z + d) − ζ(z) without cancellation.
	for _, c := range [][2]float64{{1e7, 2e-9}, {3, 0.5}, {0, 2}, {100, -50}} {
		want := 2.0 / 3 * ((c[0]+c[1])*math.Sqrt(c[0]+c[1]) - c[0]*math.Sqrt(c[0]))
		if c[0] == 1e7 {
			want = math.Sqrt(c[0]) * c[1] // the derivative, to 1e-16
		}
		if g := zetaDiff(c[0], c[1]); math.Abs(g-want) > 1e-12*math.Abs(want) {
			t.Errorf("ζ(%g + %g) − ζ(%g) = %.16g, want %.16g", c[0], c[1], c[0], g, want)
		}
	}
}

// integrateRatio returns ∫_a^b g by composite 20-point Gauss–Legendre on
// panels of width 0.25.
func integrateRatio(g func(float64) float64, a, b float64) float64 {
	n := int(math.Ceil((b - a) / 0.25))
	s := 0.0
	for i := range n {
		lo := a + (b-a)*float64(i)/float64(n)
		hi := a + (b-a)*float64(i+1)/float64(n)
		s += quad.Fixed(g, lo, hi, 20, quad.Legendre{}, 0)
	}
	return s
}
