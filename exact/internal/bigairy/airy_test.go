package bigairy

import (
	"fmt"
	"math"
	"math/big"
	"testing"
)

// DLMF 9.2.3–9.2.6; 20-digit values computed independently at high
// precision (mpmath).
func TestInitial(t *testing.T) {
	t.Parallel()
	ai0, aip0, bi0, bip0 := Initial(128)
	for _, c := range []struct {
		name string
		got  *big.Float
		want string
	}{
		{"Ai(0)", ai0, "0.35502805388781723926"},
		{"Ai'(0)", aip0, "-0.25881940379280679841"},
		{"Bi(0)", bi0, "0.61492662744600073515"},
		{"Bi'(0)", bip0, "0.44828835735382635791"},
	} {
		if e := relErr(c.got, parse(t, c.want, 128), 0); e > 2e-20 {
			t.Errorf("%s = %s, want %s (rel %g)", c.name, c.got.Text('g', 22), c.want, e)
		}
	}
}

// 17-digit values computed independently at high precision (mpmath), and
// DLMF 9.2.3–9.2.6 at z = 0.
func TestAiryValues(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		z    float64
		want [4]string
	}{
		{-5, [4]string{"0.35076100902411432", "0.32719281855444314", "-0.13836913490160058", "0.77841177300189925"}},
		{-1, [4]string{"0.53556088329235212", "-0.010160567116645209", "0.10399738949694461", "0.59237562642279235"}},
		{0, [4]string{"0.35502805388781723926", "-0.25881940379280679841", "0.61492662744600073515", "0.44828835735382635791"}},
		{1, [4]string{"0.13529241631288142", "-0.15914744129679321", "1.2074235949528713", "0.93243593339277563"}},
		{5, [4]string{"1.0834442813607442e-4", "-2.4741389086846248e-4", "657.79204417117118", "1435.8190802179825"}},
	} {
		t.Run(fmt.Sprintf("z=%g", c.z), func(t *testing.T) {
			t.Parallel()
			ai, aip, bi, bip := Airy(newf(64).SetFloat64(c.z), 128)
			for i, got := range []*big.Float{ai, aip, bi, bip} {
				// 17 significant digits given: half a unit in the 17th digit.
				if e := relErr(got, parse(t, c.want[i], 128), 0); e > 1e-16 {
					t.Errorf("%s(%g) = %s, want %s (rel %g)", [4]string{"Ai", "Ai'", "Bi", "Bi'"}[i], c.z, got.Text('g', 20), c.want[i], e)
				}
			}
		})
	}
}

// The Wronskian W{Ai, Bi} = Ai Bi′ − Ai′ Bi = 1/π (DLMF 9.2.7) over the
// whole range |z| ≤ 200; at large positive z it mixes e^(−ζ) and e^(ζ)
// values, so it checks the relative accuracy of Ai and Ai′ there.
func TestWronskian(t *testing.T) {
	t.Parallel()
	const prec = 200
	for _, zf := range []float64{-200, -123.4, -50, -13, -2.338, -0.5, 0, 1e-9, 0.7, 3, 13, 50, 99.9, 200} {
		t.Run(fmt.Sprintf("z=%g", zf), func(t *testing.T) {
			t.Parallel()
			ai, aip, bi, bip := Airy(newf(64).SetFloat64(zf), prec)
			w := newf(prec+32).Mul(ai, bip)
			w.Sub(w, newf(prec+32).Mul(aip, bi))
			w.Mul(w, Pi(prec+32))
			if e := relErr(w, fint(1, prec), 0); e > 64*ulps(prec) {
				t.Errorf("π W − 1 = %g", e)
			}
		})
	}
}

// Raising the precision must not change the result beyond the stated
// accuracy: relative for z ≥ 0, relative to the modulus M (or N for the
// derivatives, DLMF 9.8.3–9.8.4) for z < 0. A truncated series or too few
// guard bits shows up here.
func TestAiryPrecision(t *testing.T) {
	t.Parallel()
	const lo, hi = 128, 320
	for _, zf := range []float64{-200, -77.7, -20, -3.25, 0.125, 4, 20, 77.7, 200} {
		t.Run(fmt.Sprintf("z=%g", zf), func(t *testing.T) {
			t.Parallel()
			z := newf(64).SetFloat64(zf)
			a, ap, b, bp := Airy(z, lo)
			A, AP, B, BP := Airy(z, hi)
			m := hypot(A, B)
			n := hypot(AP, BP)
			tol := 16 * ulps(lo)
			for i, c := range []struct{ got, want, scale *big.Float }{{a, A, m}, {ap, AP, n}, {b, B, m}, {bp, BP, n}} {
				scale := newf(hi).Abs(c.want)
				if zf < 0 {
					scale = c.scale
				}
				d := newf(hi).Sub(c.got, c.want)
				d.Quo(d.Abs(d), scale)
				if e, _ := d.Float64(); e > tol {
					t.Errorf("%s: %d vs %d bits differ by %g (scaled)", [4]string{"Ai", "Ai'", "Bi", "Bi'"}[i], lo, hi, e)
				}
			}
		})
	}
}

func hypot(a, b *big.Float) *big.Float {
	p := max(a.Prec(), b.Prec())
	s := newf(p).Mul(a, a)
	s.Add(s, newf(p).Mul(b, b))
	return Sqrt(s, p)
}

// uCoef returns the u_k of DLMF 9.7.2, u_k = (2k+1)(2k+3)⋯(6k−1)/(216^k k!),
// and v_k = −(6k+1)/(6k−1) u_k of DLMF 9.7.3, as exact rationals.
func uCoef(k int) (u, v *big.Rat) {
	num := big.NewInt(1)
	for j := 2*k + 1; j <= 6*k-1; j += 2 {
		num.Mul(num, big.NewInt(int64(j)))
	}
	den := new(big.Int).Exp(big.NewInt(216), big.NewInt(int64(k)), nil)
	fact := new(big.Int).MulRange(1, int64(max(k, 1)))
	den.Mul(den, fact)
	u = new(big.Rat).SetFrac(num, den)
	v = new(big.Rat).Mul(u, big.NewRat(-int64(6*k+1), int64(6*k-1)))
	if k == 0 {
		v = big.NewRat(1, 1)
	}
	return u, v
}

// DLMF 9.7.5–9.7.8: the asymptotic expansions for large positive z, summed
// to K terms. DLMF 9.7(iv) bounds the remainder of the Ai and Ai′ series
// (alternating) by the first omitted term; for Bi and Bi′ we allow ten
// times it, which the terms, falling by a factor ζ/k, easily cover.
func TestAiryLargePositive(t *testing.T) {
	t.Parallel()
	const prec = 256
	const K = 30
	for _, zf := range []float64{50, 120, 200} {
		t.Run(fmt.Sprintf("z=%g", zf), func(t *testing.T) {
			t.Parallel()
			ai, aip, bi, bip := Airy(newf(64).SetFloat64(zf), prec)
			// The expansion is summed with 32 more bits: e^ζ amplifies the
			// rounding error of ζ ≈ 1886 by that much.
			const prec = prec + 32
			z := newf(prec).SetFloat64(zf)
			zeta := newf(prec).Mul(z, Sqrt(z, prec))
			zeta.Mul(zeta, fint(2, prec))
			zeta.Quo(zeta, fint(3, prec))
			z14 := Sqrt(Sqrt(z, prec), prec)
			sp := Sqrt(Pi(prec), prec)
			var su, sua, sv, sva *big.Float // Σ u ζ^-k, Σ (−1)^k u ζ^-k, same for v
			su, sua, sv, sva = newf(prec), newf(prec), newf(prec), newf(prec)
			zk := fint(1, prec)
			var omitted float64
			for k := 0; k <= K; k++ {
				u, v := uCoef(k)
				tu := newf(prec).SetRat(u)
				tu.Quo(tu, zk)
				tv := newf(prec).SetRat(v)
				tv.Quo(tv, zk)
				if k == K {
					a, _ := tu.Float64()
					b, _ := tv.Float64()
					omitted = math.Max(math.Abs(a), math.Abs(b))
					break
				}
				su.Add(su, tu)
				sv.Add(sv, tv)
				if k%2 == 1 {
					tu.Neg(tu)
					tv.Neg(tv)
				}
				sua.Add(sua, tu)
				sva.Add(sva, tv)
				zk.Mul(zk, zeta)
			}
			em := Exp(newf(prec).Neg(zeta), prec)
			ep := Exp(zeta, prec)
			wantAi := newf(prec).Mul(em, sua)
			wantAi.Quo(wantAi, newf(prec).Mul(fint(2, prec), newf(prec).Mul(sp, z14)))
			wantAip := newf(prec).Mul(em, sva)
			wantAip.Mul(wantAip, z14)
			wantAip.Quo(wantAip, newf(prec).Mul(fint(-2, prec), sp))
			wantBi := newf(prec).Mul(ep, su)
			wantBi.Quo(wantBi, newf(prec).Mul(sp, z14))
			wantBip := newf(prec).Mul(ep, sv)
			wantBip.Mul(wantBip, z14)
			wantBip.Quo(wantBip, sp)
			tol := 10*omitted + 16*ulps(prec-32)
			for i, c := range []struct{ got, want *big.Float }{{ai, wantAi}, {aip, wantAip}, {bi, wantBi}, {bip, wantBip}} {
				if e := relErr(c.got, c.want, 0); e > tol {
					t.Errorf("%s(%g): rel %g vs asymptotic, allowed %g", [4]string{"Ai", "Ai'", "Bi", "Bi'"}[i], zf, e, tol)
				}
			}
		})
	}
}

// DLMF Table 9.9.1 (A&S Table 10.13, p. 478): zeros a_k of Ai and
// Ai′(a_k), here to 17 digits computed independently at high precision
// (mpmath).
// The zeros are refined here by Newton's method on the big-float Ai and
// compared with the table to its 17 digits; Θ(a_k) = kπ (DLMF 9.9.1).
func TestAiryZeros(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		k       int
		ak, aip string
	}{
		{1, "-2.338107410459767", "0.7012108227206914"},
		{2, "-4.0879494441309706", "-0.803111369654864"},
		{3, "-5.5205598280955511", "0.8652040258941519"},
		{4, "-6.786708090071759", "-0.9108507370496018"},
		{5, "-7.9441335871208531", "0.9473357094415678"},
		{6, "-9.0226508533409804", "-0.9779228085694986"},
		{7, "-10.040174341558086", "1.004370122660312"},
		{8, "-11.008524303733263", "-1.027738688820786"},
		{9, "-11.936015563236263", "1.04872064858819"},
		{10, "-12.828776752865757", "-1.067793859157428"},
	} {
		t.Run(fmt.Sprintf("k=%d", c.k), func(t *testing.T) {
			t.Parallel()
			const prec = 160
			z := airyZero(parse(t, c.ak, prec), prec)
			// The table digits: 16–17 significant figures.
			if e := relErr(z, parse(t, c.ak, prec), 0); e > 1e-16 {
				t.Errorf("a_%d = %s, table %s (rel %g)", c.k, z.Text('g', 20), c.ak, e)
			}
			_, aip, _, _ := Airy(z, prec)
			if e := relErr(aip, parse(t, c.aip, prec), 0); e > 1e-15 {
				t.Errorf("Ai'(a_%d) = %s, table %s (rel %g)", c.k, aip.Text('g', 20), c.aip, e)
			}
			th := Phase(z, prec)
			want := newf(prec).Mul(Pi(prec), fint(int64(c.k), prec))
			if e := relErr(th, want, 0); e > 1e-40 {
				t.Errorf("Θ(a_%d)/π − %d: rel %g", c.k, c.k, e)
			}
		})
	}
}

// airyZero refines a zero of Ai near z by Newton's method.
func airyZero(z *big.Float, prec uint) *big.Float {
	z = round(z, prec)
	for i := 0; i < 20; i++ {
		ai, aip, _, _ := Airy(z, prec)
		d := newf(prec).Quo(ai, aip)
		z.Sub(z, d)
		if d.Sign() == 0 || bitsOf(d) < bitsOf(z)-int(prec)+4 {
			break
		}
	}
	return z
}

// DLMF 9.8 modulus and phase (9.8.3, 9.8.4), 18-digit values computed
// independently at high precision (mpmath):
// M = √(Ai² + Bi²), θ = Θ on the continuous branch with Θ(0) = π/6.
func TestModulusPhase(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		x        float64
		m, theta string
	}{
		{0, "0.710056107775634479", "0.523598775598298873"},
		{-1, "0.545564768597701525", "1.37899921506759781"},
		{-5, "0.377066708879254078", "8.22972265088822221"},
		{-10, "0.317242419073487239", "21.8639589573365545"},
	} {
		t.Run(fmt.Sprintf("x=%g", c.x), func(t *testing.T) {
			t.Parallel()
			const prec = 128
			z := newf(64).SetFloat64(c.x)
			ai, _, bi, _ := Airy(z, prec)
			if e := relErr(hypot(ai, bi), parse(t, c.m, prec), 0); e > 1e-17 {
				t.Errorf("M(%g): rel %g", c.x, e)
			}
			if e := relErr(Phase(z, prec), parse(t, c.theta, prec), 0); e > 1e-17 {
				t.Errorf("θ(%g) = %s: rel %g", c.x, Phase(z, prec).Text('g', 20), e)
			}
		})
	}
}

// dΘ/dz = −1/(π M²) (DLMF 9.8.14), by a central difference with step
// 2^-40 (error ~2^-80 relative): a wrong branch would be off by 2π/h.
// Θ decreases along a grid that crosses z = 0 and the table's range.
func TestPhaseDerivative(t *testing.T) {
	t.Parallel()
	const prec = 160
	h := newf(prec).SetMantExp(fint(1, prec), -40)
	var prev *big.Float
	for zf := -40.0; zf <= 20; zf += 2.5 {
		z := newf(prec).SetFloat64(zf)
		th := Phase(z, prec)
		if prev != nil && th.Cmp(prev) >= 0 {
			t.Errorf("Θ(%g) = %s does not decrease", zf, th.Text('g', 20))
		}
		prev = th
		if zf > 10 {
			continue // Θ ~ e^(−2ζ): the central difference needs more digits than it is worth
		}
		up := Phase(newf(prec).Add(z, h), prec)
		dn := Phase(newf(prec).Sub(z, h), prec)
		d := newf(prec).Sub(up, dn)
		d.SetMantExp(d, 39) // /(2h)
		ai, _, bi, _ := Airy(z, prec)
		m2 := newf(prec).Mul(ai, ai)
		m2.Add(m2, newf(prec).Mul(bi, bi))
		want := newf(prec).Mul(Pi(prec), m2)
		want.Quo(fint(-1, prec), want)
		if e := relErr(d, want, 0); e > 1e-20 {
			t.Errorf("z=%g: dΘ/dz rel err %g", zf, e)
		}
	}
}

// DLMF 9.8.22 with its first four terms, for x < 0:
// θ(x) ~ π/4 + (2/3)(−x)^(3/2)(1 + (5/32)x^−3 + (1105/6144)x^−6 + (82825/65536)x^−9).
// The omitted term is of order ζ|x|^−12: the error relative to θ ≈ ζ is
// allowed 30|x|^−12. (Measured: 21.8|x|^−12 at all three x, the constant
// being the next coefficient of the series, so the rate itself is checked.)
func TestPhaseAsymptotic(t *testing.T) {
	t.Parallel()
	const prec = 160
	for _, xf := range []float64{-20, -60, -200} {
		x := newf(prec).SetFloat64(xf)
		ax := newf(prec).Neg(x)
		zeta := newf(prec).Mul(ax, Sqrt(ax, prec))
		zeta.Mul(zeta, fint(2, prec))
		zeta.Quo(zeta, fint(3, prec))
		x3 := newf(prec).Mul(x, x)
		x3.Mul(x3, x)
		r := newf(prec).Quo(fint(1, prec), x3) // x^-3, negative
		s := fint(1, prec)
		p := newf(prec).Set(r)
		for _, c := range []*big.Rat{big.NewRat(5, 32), big.NewRat(1105, 6144), big.NewRat(82825, 65536)} {
			s.Add(s, newf(prec).Mul(newf(prec).SetRat(c), p))
			p.Mul(p, r)
		}
		want := newf(prec).Mul(zeta, s)
		q := Pi(prec)
		q.SetMantExp(q, -2)
		want.Add(want, q)
		got := Phase(x, prec)
		tol := 30 * math.Pow(-xf, -12)
		if e := relErr(got, want, 0); e > tol {
			t.Errorf("x=%g: θ = %s, asymptotic %s, rel %g > %g", xf, got.Text('g', 30), want.Text('g', 30), e, tol)
		}
	}
}

// The float64 table values are the correct roundings: a 256-bit and a
// 384-bit computation round to the same float64 at every node.
func TestNodesRounding(t *testing.T) {
	t.Parallel()
	const zmin, step, count = -13.0, 0.25, 133
	a := Nodes(zmin, step, count)
	b := nodes(zmin, step, count, 384)
	for j := range a {
		if a[j] != b[j] {
			t.Errorf("node %d: 256 bits %v, 384 bits %v", j, a[j], b[j])
		}
		if a[j][0] != zmin+float64(j)*step {
			t.Errorf("node %d: z = %v", j, a[j][0])
		}
	}
	// Spot values against those of TestAiryValues and TestModulusPhase
	// (float64, 1 ulp).
	for _, c := range []struct {
		j    int
		col  int
		want float64
	}{
		{52, 1, 0.35502805388781723926}, // Ai(0)
		{56, 3, 1.2074235949528713},     // Bi(1)
		{12, 5, 21.8639589573365545},    // θ(−10)
		{72, 2, -2.4741389086846248e-4}, // Ai′(5)
	} {
		if got := a[c.j][c.col]; math.Abs(got-c.want) > 2e-16*math.Abs(c.want) {
			t.Errorf("node %d col %d = %v, want %v", c.j, c.col, got, c.want)
		}
	}
}
