package airy

import (
	"math"
	"math/cmplx"
	"testing"

	"gonum.org/v1/gonum/mathext"
)

// unscaled returns Ai, Ai′, Bi, Bi′ at z from Scaled (finite only for
// moderate z).
func unscaled(z float64) (ai, aip, bi, bip float64) {
	a, ap, b, bp, zeta := Scaled(z)
	e := math.Exp(zeta)
	return a / e, ap / e, b * e, bp * e
}

// TestAtZero checks Ai(0), Ai′(0), Bi(0), Bi′(0) against DLMF 9.2.3–9.2.6
// (Ai(0) = 0.35502 80538 87817, Ai′(0) = −0.25881 94037 92807,
// Bi(0) = 0.61492 66274 46001, Bi′(0) = 0.44828 83573 53826).
func TestAtZero(t *testing.T) {
	t.Parallel()
	ai, aip, bi, bip := unscaled(0)
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"Ai(0)", ai, 0.355028053887817},
		{"Ai'(0)", aip, -0.258819403792807},
		{"Bi(0)", bi, 0.614926627446001},
		{"Bi'(0)", bip, 0.448288357353826},
	} {
		if math.Abs(c.got-c.want) > 2e-15 {
			t.Errorf("%s = %.17g, want %.15g (DLMF 9.2.3-9.2.6)", c.name, c.got, c.want)
		}
	}
}

// mpmathTable holds z and the scaled Ai, Ai′, Bi, Bi′ (see the package
// documentation) computed with mpmath 1.3.0 (airyai, airybi) at 40
// digits, rounded to 17.
var mpmathTable = [][5]float64{
	{-1, 0.53556088329235212, -0.010160567116645209, 0.10399738949694461, 0.59237562642279235},
	{-0.5, 0.47572809161053959, -0.20408167033954739, 0.38035265975105385, 0.50593371362384717},
	{0.25, 0.31646728105604801, -0.27070661812043258, 0.6704795186449266, 0.43229316697727719},
	{1, 0.26351364474914007, -0.30997688896051485, 0.61991194357267849, 0.47872857060498474},
	{1.5, 0.24418489767140843, -0.331419979686364, 0.55209437228578414, 0.55423075639180504},
	{2.5, 0.21932220512871206, -0.36610893847516222, 0.46475048019609252, 0.67553844416449942},
	{4, 0.19709480264306651, -0.40568791157876305, 0.40480946788929807, 0.78177393062724383},
	{7, 0.17249220797740279, -0.46233906019668562, 0.34890049029582113, 0.91018349894869167},
	{8.999, 0.16226125135525815, -0.49116545778675461, 0.32704066624467719, 0.97175885379814628},
	{9, 0.16225684290423315, -0.49117868277244365, 0.32703135827743028, 0.97178677692419013},
	{12, 0.15119256068463708, -0.52685050091245182, 0.30390541388073291, 1.0463290385080119},
	{25, 0.12605216203160696, -0.63151510344184798, 0.2525248792945538, 1.2600863670598752},
	{100, 0.089196920936330413, -0.89219206250403149, 0.17843101117083542, 1.7838637549628087},
	{1e4, 0.028209476238902757, -2.8209483291267409, 0.056418964231755171, 5.6418950127005298},
}

// TestTable holds Scaled to the mpmath table: every value within 1e-14
// relative (Ai′(−1) = −0.0102 relative to 0.1, near its zero).
func TestTable(t *testing.T) {
	t.Parallel()
	for _, row := range mpmathTable {
		ai, aip, bi, bip, _ := Scaled(row[0])
		for i, got := range []float64{ai, aip, bi, bip} {
			want := row[i+1]
			if r := math.Abs(got-want) / math.Max(math.Abs(want), 0.1); r > 1e-14 {
				t.Errorf("z = %g, function %d: got %.17g, want %.17g (rel %.2g)", row[0], i, got, want, r)
			}
		}
	}
}

// TestIndependent holds Scaled to an independent evaluation: Ai and Ai′
// from gonum's complex Airy function (Amos' algorithm) and Bi from
// DLMF 9.2.10, Bi(z) = e^(πi/6) Ai(z e^(2πi/3)) + e^(−πi/6) Ai(z e^(−2πi/3)),
// and its derivative, Bi′(z) = e^(5πi/6) Ai′(z e^(2πi/3)) + c.c. (from
// differentiating 9.2.10), on −2 ≤ z ≤ 30, relative to the scale
// each function or 0.05. Amos' algorithm is the less accurate side here
// (up to 9e-14 near z = 9, where Scaled agrees with mpmath to 1e-15).
func TestIndependent(t *testing.T) {
	t.Parallel()
	w := cmplx.Exp(complex(0, 2*math.Pi/3))
	e6 := cmplx.Exp(complex(0, math.Pi/6))
	e56 := cmplx.Exp(complex(0, 5*math.Pi/6))
	worst := 0.0
	for z := -2.0; z <= 30; z += 0.0625 {
		ai, aip, bi, bip, zeta := Scaled(z)
		zc := complex(z, 0)
		wantAi := real(mathext.AiryAi(zc)) * math.Exp(zeta)
		wantAip := real(mathext.AiryAiDeriv(zc)) * math.Exp(zeta)
		wantBi := 2 * real(e6*mathext.AiryAi(zc*w)) * math.Exp(-zeta)
		wantBip := 2 * real(e56*mathext.AiryAiDeriv(zc*w)) * math.Exp(-zeta)
		for _, c := range []struct {
			name      string
			got, want float64
		}{
			{"Ai", ai, wantAi}, {"Ai'", aip, wantAip}, {"Bi", bi, wantBi}, {"Bi'", bip, wantBip},
		} {
			// Ai′ crosses zero near z = −1.02: relative to 0.05 there.
			scale := math.Max(math.Abs(c.want), 0.05)
			rel := math.Abs(c.got-c.want) / scale
			worst = math.Max(worst, rel)
			if rel > 2e-13 {
				t.Errorf("%s(%g): got %.17g, want %.17g (rel %.2g)", c.name, z, c.got, c.want, rel)
			}
		}
	}
	t.Logf("worst relative difference from the complex-Ai evaluation: %.2g", worst)
}

// TestWronskian checks Ai·Bi′ − Ai′·Bi = 1/π (DLMF 9.2.7), which the
// scaling leaves unchanged, for z up to 1e6.
func TestWronskian(t *testing.T) {
	t.Parallel()
	for _, z := range []float64{-1, -0.5, 0, 0.3, 1, 1.0001, 2, 5, 8.999, 9, 9.001, 12, 30, 100, 1e3, 1e6} {
		ai, aip, bi, bip, _ := Scaled(z)
		w := ai*bip - aip*bi
		if math.Abs(w*math.Pi-1) > 8e-15 {
			t.Errorf("z = %g: π·W{Ai, Bi} = %.17g, want 1 (DLMF 9.2.7)", z, w*math.Pi)
		}
	}
}

// TestContinuity checks that the regions join without a visible step: the
// relative jump across each switch point is a few ulps.
func TestContinuity(t *testing.T) {
	t.Parallel()
	for _, z0 := range []float64{seriesMax, asymMin} {
		a0, ap0, b0, bp0, _ := Scaled(math.Nextafter(z0, 0))
		a1, ap1, b1, bp1, _ := Scaled(z0)
		for i, p := range [][2]float64{{a0, a1}, {ap0, ap1}, {b0, b1}, {bp0, bp1}} {
			if r := math.Abs(p[0]-p[1]) / math.Abs(p[1]); r > 2e-14 {
				t.Errorf("switch at %g, function %d: relative jump %.2g", z0, i, r)
			}
		}
	}
}

// TestOutOfDomain checks the NaN answer below MinZ.
func TestOutOfDomain(t *testing.T) {
	if _, _, bi, _, _ := Scaled(BiZero1); math.Abs(bi) > 1e-16 {
		t.Errorf("Bi(b₁) = %g, want 0 (DLMF Table 9.9.2)", bi)
	}
	t.Parallel()
	for _, z := range []float64{math.NaN(), -2.5, math.Inf(-1)} {
		if ai, _, _, _, _ := Scaled(z); !math.IsNaN(ai) {
			t.Errorf("Scaled(%g) = %g, want NaN", z, ai)
		}
	}
}

// TestComplex checks Complex against Scaled on the real axis and the
// Wronskian Ai·Bi′ − Ai′·Bi = 1/π (DLMF 9.2.7) off it.
func TestComplex(t *testing.T) {
	t.Parallel()
	for _, x := range []float64{-2, -0.5, 0, 0.7, 3, 8} {
		ai, aip, bi, bip := Complex(complex(x, 0))
		a, ap, b, bp := unscaled(x)
		for i, p := range [][2]float64{{real(ai), a}, {real(aip), ap}, {real(bi), b}, {real(bip), bp}} {
			if math.Abs(p[0]-p[1]) > 1e-13*math.Max(math.Abs(p[1]), 0.1) {
				t.Errorf("Complex(%g) function %d = %.17g, Scaled gives %.17g", x, i, p[0], p[1])
			}
		}
	}
	// Off the axis: the Wronskian, to the cancellation the documentation
	// states (about u·e^(2ζ), ζ = (2/3)|z|^(3/2)), and gonum's Amos
	// evaluation of Ai, Ai′.
	for _, z := range []complex128{complex(1, 1), complex(-1.5, 0.3), complex(4, -0.5), complex(0.2, -2), complex(-5, 3), complex(5.9, 0.5), complex(7, -1)} {
		ai, aip, bi, bip := Complex(z)
		r := cmplx.Abs(z)
		tol := 1e-14 * math.Exp(4.0/3*r*math.Sqrt(r))
		if w := (ai*bip - aip*bi) * math.Pi; cmplx.Abs(w-1) > tol {
			t.Errorf("z = %v: π·W{Ai, Bi} = %v, want 1 (DLMF 9.2.7)", z, w)
		}
		ga, gap := mathext.AiryAi(z), mathext.AiryAiDeriv(z)
		if cmplx.Abs(ai-ga) > tol*cmplx.Abs(ga)+1e-14 || cmplx.Abs(aip-gap) > tol*cmplx.Abs(gap)+1e-14 {
			t.Errorf("z = %v: Ai %v Ai′ %v, Amos %v %v", z, ai, aip, ga, gap)
		}
	}
}
