package exact

import (
	"fmt"
	"math"
	"math/big"
	"testing"

	"github.com/tiltwell/tiltwell/exact/internal/bigairy"
)

// relErr returns |got − want| / scale.
func relErr(got, want, scale float64) float64 { return math.Abs(got-want) / scale }

// TestAiryPublished checks the Airy functions against the closed forms at
// z = 0 and independent high-precision values elsewhere.
func TestAiryPublished(t *testing.T) {
	t.Parallel()
	// DLMF 9.2.3–9.2.6 (closed forms in Γ(1/3), Γ(2/3)) at z = 0, and
	// 20-digit values at z = ±1, ±5, all computed independently at high
	// precision (mpmath), not a published table.
	cases := []struct {
		z                  float64
		ai, aip, bi, bip   float64
		tol                float64 // relative to max(|Ai|, |Bi|) resp. max(|Ai′|, |Bi′|)
		tolAiRel, tolBiRel float64 // relative to the value itself
	}{
		{0, 0.35502805388781723926, -0.25881940379280679841, 0.61492662744600073515, 0.44828835735382635791, 4e-16, 4e-16, 4e-16},
		{-5, 0.35076100902411432, 0.32719281855444314, -0.13836913490160058, 0.77841177300189925, 4e-16, 1e-15, 1e-15},
		{-1, 0.53556088329235212, -0.010160567116645209, 0.10399738949694461, 0.59237562642279235, 4e-16, 1e-15, 1e-15},
		{1, 0.13529241631288142, -0.15914744129679321, 1.2074235949528713, 0.93243593339277563, 4e-16, 1e-15, 1e-15},
		// At z = 5 Ai is 6e6 times smaller than Bi; it must still be
		// accurate relative to itself.
		{5, 1.0834442813607442e-4, -2.4741389086846248e-4, 657.79204417117118, 1435.8190802179825, 4e-16, 1e-15, 1e-15},
	}
	for _, c := range cases {
		t.Run(fmt.Sprintf("z=%g", c.z), func(t *testing.T) {
			ai, aip, bi, bip := Airy(c.z)
			s := max(math.Abs(c.ai), math.Abs(c.bi))
			sp := max(math.Abs(c.aip), math.Abs(c.bip))
			for _, r := range []struct {
				name      string
				got, want float64
				scale     float64
				tol       float64
			}{
				{"Ai", ai, c.ai, s, c.tol},
				{"Ai′", aip, c.aip, sp, c.tol},
				{"Bi", bi, c.bi, s, c.tol},
				{"Bi′", bip, c.bip, sp, c.tol},
				{"Ai/self", ai, c.ai, math.Abs(c.ai), c.tolAiRel},
				{"Bi/self", bi, c.bi, math.Abs(c.bi), c.tolBiRel},
			} {
				if e := relErr(r.got, r.want, r.scale); e > r.tol {
					t.Errorf("%s(%g) = %.17g, want %.17g (rel err %.2g > %.2g)", r.name, c.z, r.got, r.want, e, r.tol)
				}
			}
		})
	}
}

// TestAiryZerosTable checks a_k and Ai′(a_k) against DLMF Table 9.9.1
// (https://dlmf.nist.gov/9.9#T1) and A&S Table 10.13, p. 478, here with
// 16–17 digits computed independently at high precision (mpmath).
func TestAiryZerosTable(t *testing.T) {
	t.Parallel()
	table := []struct {
		k       int
		a, aip  float64
		ap, aap float64 // a′_k and Ai(a′_k)
	}{
		{1, -2.338107410459767, 0.7012108227206914, -1.0187929716474711, 0.5356566560156999},
		{2, -4.0879494441309706, -0.803111369654864, -3.2481975821798365, -0.419015478032564},
		{3, -5.5205598280955511, 0.8652040258941519, -4.8200992111787356, 0.3804064686281533},
		{4, -6.786708090071759, -0.9108507370496018, -6.1633073556394865, -0.3579079437122922},
		{5, -7.9441335871208531, 0.9473357094415678, -7.3721772550477702, 0.3423012444116238},
		{6, -9.0226508533409804, -0.9779228085694986, -8.4884867340197221, -0.3304762291479669},
		{7, -10.040174341558086, 1.004370122660312, -9.5354490524335475, 0.3210222881947164},
		{8, -11.008524303733263, -1.027738688820786, -10.527660396957407, -0.3131853909786818},
		{9, -11.936015563236263, 1.04872064858819, -11.475056633480245, 0.3065172938827772},
		{10, -12.828776752865757, -1.067793859157428, -12.384788371845747, -0.3007308293226446},
	}
	for _, c := range table {
		a, err := AiZero(c.k)
		if err != nil {
			t.Fatal(err)
		}
		if e := relErr(a, c.a, math.Abs(c.a)); e > 3e-16 {
			t.Errorf("a_%d = %.17g, want %.17g (rel err %.2g)", c.k, a, c.a, e)
		}
		// Ai(a_k) vanishes up to the rounding of the phase, about
		// ε θ M with θ = kπ.
		m, _ := ModulusPhase(c.a)
		tol0 := 4 * eps * float64(c.k) * math.Pi * m
		ai, aip, _, _ := Airy(c.a)
		if math.Abs(ai) > tol0 {
			t.Errorf("Ai(a_%d) = %g, want 0", c.k, ai)
		}
		if e := relErr(aip, c.aip, math.Abs(c.aip)); e > 1e-15 {
			t.Errorf("Ai′(a_%d) = %.17g, want %.17g (rel err %.2g)", c.k, aip, c.aip, e)
		}
		// At a′_k, Ai′ vanishes and Ai has the tabulated value.
		ai, aip, _, _ = Airy(c.ap)
		if math.Abs(aip) > tol0/m*max(1, math.Abs(c.ap)) {
			t.Errorf("Ai′(a′_%d) = %g, want 0", c.k, aip)
		}
		if e := relErr(ai, c.aap, math.Abs(c.aap)); e > 1e-15 {
			t.Errorf("Ai(a′_%d) = %.17g, want %.17g (rel err %.2g)", c.k, ai, c.aap, e)
		}
	}
}

// TestAiryZerosAsymptotic checks high zeros against DLMF 9.9.6 with
// T(t) ~ t^(2/3)(1 + (5/48)t^−2 − (5/36)t^−4 + (77125/82944)t^−6 − …)
// (DLMF 9.9.18; the t^−6 coefficient from memory). The first omitted term
// is O(t^−8), below 1e-16 relative for k ≥ 100.
func TestAiryZerosAsymptotic(t *testing.T) {
	t.Parallel()
	for _, k := range []int{100, 200, 500, 1000, 1001, 5000, 1000000} {
		a, err := AiZero(k)
		if err != nil {
			t.Fatal(err)
		}
		tt := 3 * math.Pi * (4*float64(k) - 1) / 8
		it2 := 1 / (tt * tt)
		want := -math.Pow(tt, 2.0/3) * (1 + it2*(5.0/48+it2*(-5.0/36+it2*77125.0/82944)))
		// The phase at a_k is ~kπ, so the zero's own rounding is about
		// kπ ε / Θ′; allow that.
		th, p := phase(a)
		tol := 4e-16 + 2*eps*th/(p*math.Abs(a))
		if e := relErr(a, want, math.Abs(want)); e > tol {
			t.Errorf("a_%d = %.17g, DLMF 9.9.6 gives %.17g (rel err %.2g > %.2g)", k, a, want, e, tol)
		}
	}
	if _, err := AiZero(0); err == nil {
		t.Error("AiZero(0): no error")
	}
}

// TestModulusPhase checks M and θ (DLMF 9.8.3, 9.8.4) against 18-digit
// values computed independently at high precision (mpmath), and
// θ(a_k) = kπ (DLMF 9.9.1).
func TestModulusPhase(t *testing.T) {
	t.Parallel()
	for _, c := range []struct{ x, m, theta float64 }{
		{0, 0.710056107775634479, 0.523598775598298873},
		{-1, 0.545564768597701525, 1.37899921506759781},
		{-5, 0.377066708879254078, 8.22972265088822221},
		{-10, 0.317242419073487239, 21.8639589573365545},
	} {
		m, th := ModulusPhase(c.x)
		if e := relErr(m, c.m, c.m); e > 4e-16 {
			t.Errorf("M(%g) = %.17g, want %.17g (rel err %.2g)", c.x, m, c.m, e)
		}
		if e := relErr(th, c.theta, c.theta); e > 4e-16 {
			t.Errorf("θ(%g) = %.17g, want %.17g (rel err %.2g)", c.x, th, c.theta, e)
		}
	}
	for _, k := range []int{1, 2, 5, 10, 50, 200} {
		a, _ := AiZero(k)
		_, th := ModulusPhase(a)
		if e := relErr(th, float64(k)*math.Pi, float64(k)*math.Pi); e > 4e-16 {
			t.Errorf("θ(a_%d)/π = %.17g, want %d", k, th/math.Pi, k)
		}
	}
}

// TestWronskian checks Ai Bi′ − Ai′ Bi = 1/π (DLMF 9.2.7) across all three
// ranges of the evaluation, relative to the size of the products.
func TestWronskian(t *testing.T) {
	t.Parallel()
	for z := -60.0; z <= 60; z += 0.0625 {
		ai, aip, bi, bip := AiryScaled(z)
		w := ai*bip - aip*bi
		scale := math.Abs(ai*bip) + math.Abs(aip*bi)
		if e := math.Abs(w - 1/math.Pi); e > 8e-16*scale*(1+math.Pow(math.Abs(min(z, 0)), 1.5)/8) {
			t.Errorf("W(%g) − 1/π = %.3g (products %.3g)", z, e, scale)
		}
	}
}

// TestAiryRangeSeams checks that the three evaluation ranges agree where
// they meet (z = −13 and z = 20): an internal consistency check, the
// published values being tested above. The tolerance is the conditioning
// of the functions themselves: a relative rounding ε in z moves Ai and Bi
// by about ε|z|^(3/2) relative (through the phase (2/3)|z|^(3/2) on the
// left, through e^(±ζ) on the right).
func TestAiryRangeSeams(t *testing.T) {
	t.Parallel()
	for _, z := range []float64{-negStart, posStart} {
		lo, hi := math.Nextafter(z, math.Inf(-1)), math.Nextafter(z, math.Inf(1))
		cond := 4 * eps * (1 + math.Pow(math.Abs(z), 1.5))
		a1, ap1, b1, bp1 := Airy(lo)
		a2, ap2, b2, bp2 := Airy(hi)
		sa, sap := max(math.Abs(a1), math.Abs(b1)), max(math.Abs(ap1), math.Abs(bp1))
		if z > 0 {
			// Ai ≪ Bi here: Ai must be accurate relative to itself.
			sa, sap = math.Abs(a1), math.Abs(ap1)
		}
		for _, r := range []struct {
			name        string
			x, y, scale float64
		}{
			{"Ai", a1, a2, sa}, {"Ai′", ap1, ap2, sap},
			{"Bi", b1, b2, max(math.Abs(a1), math.Abs(b1))}, {"Bi′", bp1, bp2, max(math.Abs(ap1), math.Abs(bp1))},
		} {
			if math.Abs(r.x-r.y) > cond*r.scale {
				t.Errorf("seam at %g: %s %.17g vs %.17g (tol %.2g)", z, r.name, r.x, r.y, cond*r.scale)
			}
		}
		m1, t1 := ModulusPhase(lo)
		m2, t2 := ModulusPhase(hi)
		if math.Abs(m1-m2) > cond*m1 || math.Abs(t1-t2) > cond*max(1, t1) {
			t.Errorf("seam at %g: M %.17g vs %.17g, θ %.17g vs %.17g", z, m1, m2, t1, t2)
		}
	}
}

// TestAirySpecialCases checks the documented special cases.
func TestAirySpecialCases(t *testing.T) {
	t.Parallel()
	ai, aip, bi, bip := Airy(math.Inf(1))
	if ai != 0 || aip != 0 || !math.IsInf(bi, 1) || !math.IsInf(bip, 1) {
		t.Errorf("Airy(+Inf) = %v %v %v %v", ai, aip, bi, bip)
	}
	ai, _, bi, _ = Airy(math.Inf(-1))
	if ai != 0 || bi != 0 {
		t.Errorf("Airy(−Inf) = %v, %v", ai, bi)
	}
	ai, _, _, _ = Airy(math.NaN())
	if !math.IsNaN(ai) {
		t.Errorf("Airy(NaN) = %v", ai)
	}
	// At z = 105, ζ = 717 > log(MaxFloat64): Bi overflows while Ai is a
	// subnormal but positive number.
	ai, aip, bi, bip = Airy(105)
	if !(ai > 0) || !(aip < 0) || !math.IsInf(bi, 1) || !math.IsInf(bip, 1) {
		t.Errorf("Airy(105) = %v %v %v %v", ai, aip, bi, bip)
	}
	m, th := ModulusPhase(math.Inf(-1))
	if m != 0 || !math.IsInf(th, 1) {
		t.Errorf("ModulusPhase(−Inf) = %v, %v", m, th)
	}
	m, th = ModulusPhase(math.Inf(1))
	if !math.IsInf(m, 1) || th != 0 {
		t.Errorf("ModulusPhase(+Inf) = %v, %v", m, th)
	}
	ai, aip, bi, bip = AiryScaled(math.Inf(1))
	if ai != 0 || !math.IsInf(aip, -1) || bi != 0 || !math.IsInf(bip, 1) {
		t.Errorf("AiryScaled(+Inf) = %v %v %v %v", ai, aip, bi, bip)
	}
}

// TestAsymptoticCoefficients checks the generated series coefficients
// against the values printed in DLMF 9.8.20 and 9.8.22 and the u_k of
// DLMF 9.7.2.
func TestAsymptoticCoefficients(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		// DLMF 9.8.20: M² ~ (1/(π√−x))(1 + (5/32)x^−3 + (1155/2048)x^−6 …)
		// with x < 0; here in powers of |x|^−3 the signs alternate.
		{"m1", negM[1], -5.0 / 32},
		{"m2", negM[2], 1155.0 / 2048},
		// DLMF 9.8.22: θ ~ π/4 + (2/3)(−x)^(3/2)(1 + (5/32)x^−3 +
		// (1105/6144)x^−6 + (82825/65536)x^−9 + …).
		{"t1", negT[1], -5.0 / 32},
		{"t2", negT[2], 1105.0 / 6144},
		{"t3", negT[3], -82825.0 / 65536},
		// DLMF 9.7.2: u₁ = 5/72, u₂ = 385/10368.
		{"u1", posU[1], 5.0 / 72},
		{"u2", posU[2], 385.0 / 10368},
		{"v1", posV[1], -7.0 / 72},
	} {
		if e := relErr(c.got, c.want, math.Abs(c.want)); e > 1e-15 {
			t.Errorf("%s = %.17g, want %.17g", c.name, c.got, c.want)
		}
	}
}

// TestAsymptoticTruncation checks that the first omitted term of each
// asymptotic series is below 1e-17 relative where the series takes over.
func TestAsymptoticTruncation(t *testing.T) {
	t.Parallel()
	// The next modulus coefficient by the same recurrence.
	k := nNeg
	p := 2.5 - 3*float64(k)
	next := p * (p - 1) * (p - 2) * negM[k-1] / (12 * float64(k))
	if v := math.Abs(next) * math.Pow(negStart, -3*float64(k)); v > 1e-17 {
		t.Errorf("modulus series: first omitted term %.2g at x = %g", v, negStart)
	}
	fk := float64(nPos)
	u := posU[nPos-1] * (6*fk - 5) * (6*fk - 3) * (6*fk - 1) / ((2*fk - 1) * 216 * fk)
	zeta := (2.0 / 3) * math.Pow(posStart, 1.5)
	if v := u * math.Pow(zeta, -fk); v > 1e-17 {
		t.Errorf("exponential series: first omitted term %.2g at z = %g", v, posStart)
	}
}

// TestTaylorTruncation checks that the per-node term counts of the phase
// series lose nothing: over each node's interval the truncated sums agree
// with the full 18-term ones to 2^−56 of the series' size.
func TestTaylorTruncation(t *testing.T) {
	t.Parallel()
	for j := range series {
		s := &series[j]
		for i := -8; i <= 8; i++ {
			d := float64(i) / 8 * airyStep / 2
			var cf, df, ct, dt float64
			for k := nTaylor - 1; k >= 0; k-- {
				cf, df = cf*d+s.c[k], df*d+s.d[k]
			}
			for k := s.nt - 1; k >= 0; k-- {
				ct, dt = ct*d+s.c[k], dt*d+s.d[k]
			}
			if math.Abs(cf-ct) > 0x1p-56*airyStep/2/math.Pi || math.Abs(df-dt) > 0x1p-56*s.m2 {
				t.Errorf("node z=%g δ=%g: %d terms: c %g vs %g, d %g vs %g", s.z, d, s.nt, ct, cf, dt, df)
			}
		}
	}
}

// TestEstrin checks that Estrin's scheme, which the sampled wavefunctions
// use, sums the Taylor series of Ai and Bi as Horner's rule does, to
// rounding, over each node's interval.
func TestEstrin(t *testing.T) {
	t.Parallel()
	h := airyStep / 2
	for j := range series {
		s := &series[j]
		sa := math.Abs(s.ai[0]) + h*math.Abs(s.ai[1])
		sb := math.Abs(s.bi[0]) + h*math.Abs(s.bi[1])
		for i := -8; i <= 8; i++ {
			d := float64(i) / 8 * h
			a, b := estrin2(&s.ai, &s.bi, d)
			if da, db := math.Abs(a-horner(&s.ai, d)), math.Abs(b-horner(&s.bi, d)); da > 4*eps*sa || db > 4*eps*sb {
				t.Errorf("node z=%g δ=%g: Estrin − Horner: Ai %.3g, Bi %.3g", s.z, d, da, db)
			}
		}
	}
}

// TestAiryAgainstBig checks Ai, Ai′, Bi, Bi′ against the 300-bit Maclaurin
// sums of internal/bigairy across all three evaluation ranges, each relative
// to itself for z > 0 and relative to the modulus for z < 0, where the
// functions oscillate (M for Ai and Bi, N = √(Ai′² + Bi′²) for the
// derivatives, DLMF 9.8.3, 9.8.4). On the right the scale factor e^(±ζ) is
// formed from a double-double ζ, so even z = 100 (ζ = 667) stays within a
// few ulps; on the left the phase (2/3)|z|^(3/2) is reduced modulo 2π
// before it is rounded, so z = −200 (phase 1886) does too.
func TestAiryAgainstBig(t *testing.T) {
	t.Parallel()
	for _, z := range []float64{-200, -97.3, -40, -13.1, -12.9, -7.3, -0.4, 0.7, 6.1, 19.9, 20.3, 30, 60, 100, 103.31} {
		ai, aip, bi, bip := Airy(z)
		rai, raip, rbi, rbip := bigairy.Airy(big.NewFloat(z), 300)
		m, _ := ModulusPhase(z)
		want := func(w *big.Float) float64 { f, _ := w.Float64(); return f }
		n := math.Hypot(want(raip), want(rbip))
		for _, c := range []struct {
			name      string
			got, want float64
			scale     float64
		}{
			{"Ai", ai, want(rai), m},
			{"Bi", bi, want(rbi), m},
			{"Ai′", aip, want(raip), n},
			{"Bi′", bip, want(rbip), n},
		} {
			scale, tol := c.scale, 4*eps
			if z > 0 {
				scale, tol = math.Abs(c.want), 4*eps
			}
			if e := math.Abs(c.got-c.want) / scale; e > tol {
				t.Errorf("%s(%g) = %.17g, 300-bit %.17g (rel %.2g > %.2g)", c.name, z, c.got, c.want, e, tol)
			}
		}
	}
}

// TestAiryHugeArguments checks the documented behaviour where float64 runs
// out: Bi overflows only once its value does, and far left the phase
// overflows to +Inf while the modulus stays finite and Ai, Bi stay exact.
func TestAiryHugeArguments(t *testing.T) {
	t.Parallel()
	if _, _, bi, _ := Airy(103.31); math.IsInf(bi, 0) {
		t.Error("Bi(103.31) = +Inf; its value 1.87e303 is finite")
	}
	if _, _, bi, _ := Airy(104.5); !math.IsInf(bi, 1) {
		t.Errorf("Bi(104.5) = %g, want +Inf", bi)
	}
	m, th := ModulusPhase(-1e300)
	if !(m > 0) || !math.IsInf(th, 1) {
		t.Errorf("ModulusPhase(−1e300) = %g, %g; want M > 0, θ = +Inf", m, th)
	}
	// θ overflows exactly where (2/3)|z|^(3/2) passes MaxFloat64.
	zOver := -math.Pow(1.5, 2.0/3) * math.Pow(math.MaxFloat64, 2.0/3)
	for _, c := range []struct {
		z   float64
		inf bool
	}{{zOver * (1 - 1e-12), false}, {zOver * (1 + 1e-12), true}} {
		if _, th := ModulusPhase(c.z); math.IsInf(th, 1) != c.inf {
			t.Errorf("θ(%g) = %g, want +Inf: %v", c.z, th, c.inf)
		}
	}
	ai, aip, bi, bip := AiryScaled(math.Inf(-1))
	if ai != 0 || bi != 0 || !math.IsNaN(aip) || !math.IsNaN(bip) {
		t.Errorf("AiryScaled(−Inf) = %v %v %v %v", ai, aip, bi, bip)
	}
}

// TestAiryExtremes: no NaN from any finite argument, and the limits the
// documentation promises: Ai → 0, Bi → +∞ as z → +∞ (DLMF 9.7.5, 9.7.7),
// and |Ai|, |Bi| ≤ M = √(Ai² + Bi²) as z → −∞ (DLMF 9.8.1–9.8.3). Right of
// z = 104.7 Bi and M overflow, right of 172 Ai underflows to 0; the
// Wronskian Ai Bi′ − Ai′ Bi = 1/π (DLMF 9.2.7) holds on the left.
func TestAiryExtremes(t *testing.T) {
	t.Parallel()
	var zs []float64
	for e := -323; e <= 308; e++ {
		for _, m := range []float64{1, 3.3, 4.2} {
			z := m * math.Pow(10, float64(e))
			if !math.IsInf(z, 0) {
				zs = append(zs, z, -z)
			}
		}
	}
	zs = append(zs, math.MaxFloat64, -math.MaxFloat64, 5e-324, -5e-324, 0)
	for _, z := range zs {
		ai, aip, bi, bip := Airy(z)
		sai, saip, sbi, sbip := AiryScaled(z)
		m, th := ModulusPhase(z)
		for _, v := range []float64{ai, aip, bi, bip, sai, saip, sbi, sbip, m, th} {
			if math.IsNaN(v) {
				t.Fatalf("z=%g: Airy %v %v %v %v, AiryScaled %v %v %v %v, ModulusPhase %v %v",
					z, ai, aip, bi, bip, sai, saip, sbi, sbip, m, th)
			}
		}
		for _, v := range []float64{sai, saip, sbi, sbip} {
			if math.IsInf(v, 0) {
				t.Errorf("AiryScaled(%g) = %v %v %v %v: infinite", z, sai, saip, sbi, sbip)
			}
		}
		switch {
		case z > 172:
			if ai != 0 || aip != 0 || !math.IsInf(bi, 1) || !math.IsInf(bip, 1) || !math.IsInf(m, 1) || th != 0 {
				t.Errorf("z=%g: Airy %v %v %v %v, ModulusPhase %v %v; want 0, 0, +Inf, +Inf and +Inf, 0", z, ai, aip, bi, bip, m, th)
			}
		case z < -negStart:
			if !(m > 0) || math.IsInf(m, 0) || math.Abs(ai) > m*(1+4*eps) || math.Abs(bi) > m*(1+4*eps) ||
				math.Abs(math.Hypot(ai, bi)-m) > 4*eps*m {
				t.Errorf("z=%g: Ai %v, Bi %v, M %v: want |Ai|, |Bi| ≤ M = √(Ai² + Bi²)", z, ai, bi, m)
			}
			w := ai*bip - aip*bi
			if scale := math.Abs(ai*bip) + math.Abs(aip*bi); math.Abs(w-1/math.Pi) > 8*eps*scale {
				t.Errorf("z=%g: Wronskian %v, want 1/π", z, w)
			}
		}
	}
}

// TestAiryNegativePhase holds the phase reduction of negSinCos, in
// double-double up to x = 2³² and in math/big beyond, against the same
// reduction done here at 200 bits more with internal/bigairy's π: the
// sine and cosine of θ(−x) agree to 2 ulps, up to the largest float64.
func TestAiryNegativePhase(t *testing.T) {
	t.Parallel()
	for _, x := range []float64{13.0001, 40, 1000, 123456.7, 0x1p32 - 1, 0x1p32, 0x1p32 + 1, 1e10, 1e11, 1e20, 5.6e102, 1e103,
		1e205, 4.17e205, 4.2e205, 1e300, math.MaxFloat64} {
		prec := uint(max(0, 3*math.Ilogb(x)/2+2) + 200)
		nf := func() *big.Float { return new(big.Float).SetPrec(prec) }
		bx := nf().SetFloat64(x)
		p := nf().Sqrt(bx)
		p.Mul(p, bx)
		p.Mul(p, nf().SetInt64(2))
		p.Quo(p, nf().SetInt64(3))
		pi := bigairy.Pi(prec)
		tp := nf().Mul(pi, nf().SetInt64(2))
		q, _ := nf().Quo(p, tp).Int(nil)
		p.Sub(p, nf().Mul(nf().SetInt(q), tp))
		p.Add(p, nf().Quo(pi, nf().SetInt64(4)))
		tc, _ := negPhaseCorr(x)
		p.Add(p, nf().SetFloat64(tc))
		hi, _ := p.Float64()
		lo, _ := p.Sub(p, nf().SetFloat64(hi)).Float64()
		sh, ch := math.Sincos(hi)
		ws, wc := sh+lo*ch, ch-lo*sh
		gs, gc := negSinCos(x, tc)
		if math.Abs(gs-ws) > 2*eps || math.Abs(gc-wc) > 2*eps {
			t.Errorf("x=%g: sin, cos θ = %.17g, %.17g; want %.17g, %.17g", x, gs, gc, ws, wc)
		}
	}
}

// TestTwoPi checks the three-part 2π and the math/big 2π against π from
// Machin's formula in internal/bigairy.
func TestTwoPi(t *testing.T) {
	t.Parallel()
	want := new(big.Float).SetPrec(bigPiPrec+64).Mul(bigairy.Pi(bigPiPrec+64), big.NewFloat(2))
	sum := new(big.Float).SetPrec(300)
	for _, c := range twoPi {
		sum.Add(sum, big.NewFloat(c))
	}
	d, _ := sum.Sub(sum, want).Float64()
	if math.Abs(d) > 0x1p-155 {
		t.Errorf("twoPi parts miss 2π by %g", d)
	}
	got := bigTwoPi()
	if got.Prec() != bigPiPrec {
		t.Errorf("bigTwoPi has %d bits, want %d", got.Prec(), bigPiPrec)
	}
	diff := new(big.Float).SetPrec(bigPiPrec+64).Sub(got, want)
	if diff.Sign() != 0 && diff.MantExp(nil) > -bigPiPrec+3 {
		t.Errorf("bigTwoPi misses 2π by 2^%d", diff.MantExp(nil))
	}
}
