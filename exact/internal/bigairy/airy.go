package bigairy

import (
	"math"
	"math/big"
)

// Initial returns Ai(0), Ai′(0), Bi(0) and Bi′(0) rounded to prec bits:
//
//	Ai(0)  = 1/(3^(2/3) Γ(2/3))      (DLMF 9.2.3)
//	Ai′(0) = −1/(3^(1/3) Γ(1/3))     (DLMF 9.2.4)
//	Bi(0)  = 1/(3^(1/6) Γ(2/3))      (DLMF 9.2.5)
//	Bi′(0) = 3^(1/6)/Γ(1/3)          (DLMF 9.2.6)
//
// with Γ(1/3), Γ(2/3) from [GammaThird].
func Initial(prec uint) (ai0, aip0, bi0, bip0 *big.Float) {
	v := initCache.get(prec)
	return v[0], v[1], v[2], v[3]
}

var initCache = &constCache{f: func(prec uint) []*big.Float {
	wp := prec + guard
	g13, g23 := GammaThird(wp)
	c3 := Cbrt(fint(3, wp), wp) // 3^(1/3)
	s6 := Sqrt(c3, wp)          // 3^(1/6)
	one := fint(1, wp)
	ai0 := newf(wp).Mul(c3, c3)
	ai0.Mul(ai0, g23)
	ai0.Quo(one, ai0)
	aip0 := newf(wp).Mul(c3, g13)
	aip0.Quo(one, aip0)
	aip0.Neg(aip0)
	bi0 := newf(wp).Mul(s6, g23)
	bi0.Quo(one, bi0)
	bip0 := newf(wp).Quo(s6, g13)
	return []*big.Float{ai0, aip0, bi0, bip0}
}}

// airyGuard returns the extra working bits the Maclaurin series needs at z:
// the terms grow to about e^ζ, ζ = (2/3)|z|^(3/2), for either sign of z, and
// for z > 0 the result Ai(z) is itself about e^(−ζ), so relative accuracy in
// Ai there costs 2ζ/ln 2 bits.
func airyGuard(zf float64) (bits uint, zetaPos float64) {
	az := math.Abs(zf)
	zeta := 2.0 / 3.0 * az * math.Sqrt(az)
	cancel := zeta
	if zf > 0 {
		cancel = 2 * zeta
		zetaPos = zeta
	}
	// + log2 of the number of terms and of |z|^(1/4) factors, with margin.
	return uint(cancel/math.Ln2) + 2*uint(math.Log2(az+2)) + guard + 16, zetaPos
}

// Airy returns Ai(z), Ai′(z), Bi(z) and Bi′(z) rounded to prec bits, by the
// Maclaurin series
//
//	Ai(z) = Ai(0) f(z) + Ai′(0) g(z),  Bi(z) = Bi(0) f(z) + Bi′(0) g(z)
//	f(z) = Σ_k z^(3k) / Π_{j=1}^{k} (3j−1)(3j)
//	g(z) = Σ_k z^(3k+1) / Π_{j=1}^{k} (3j)(3j+1)
//
// (DLMF 9.4.1–9.4.2 written as term recurrences; f and g solve w″ = zw with
// f(0) = g′(0) = 1, f′(0) = g(0) = 0), and the termwise derivatives. The
// working precision is raised by about ζ/ln 2 bits (z < 0) or 2ζ/ln 2 bits
// (z > 0), ζ = (2/3)|z|^(3/2), to cover the cancellation among terms of size
// up to e^ζ.
//
// Accuracy: for z ≥ 0 each result has relative error a few units of
// 2^-prec. For z < 0 the functions oscillate; Ai and Bi then have absolute
// error a few units of 2^-prec times the modulus M(z) = √(Ai² + Bi²)
// (DLMF 9.8.3), and Ai′, Bi′ likewise relative to N(z) = √(Ai′² + Bi′²), so
// digits are relative except close to a zero. The cost grows like |z|^3
// (|z|^(3/2) terms at |z|^(3/2) bits); |z| = 200 takes some tens of
// milliseconds. The argument z is not modified.
func Airy(z *big.Float, prec uint) (ai, aip, bi, bip *big.Float) {
	zf, _ := z.Float64()
	g, zetaPos := airyGuard(zf)
	wp := prec + g
	ai0, aip0, bi0, bip0 := Initial(wp)
	if z.Sign() == 0 {
		return ai0.SetPrec(prec), aip0.SetPrec(prec), bi0.SetPrec(prec), bip0.SetPrec(prec)
	}
	zz := round(z, wp)
	z3 := newf(wp).Mul(zz, zz)
	a := fint(1, wp)          // f terms
	b := newf(wp).Set(zz)     // g terms
	c := newf(wp).Mul(zz, zz) // f′ terms, starting at k = 1: z²/2
	c.SetMantExp(c, -1)
	d := fint(1, wp) // g′ terms
	z3.Mul(z3, zz)
	fs := newf(wp).Set(a)
	gs := newf(wp).Set(b)
	fps := newf(wp).Set(c)
	gps := newf(wp).Set(d)
	// Stop once every term is below 2^stop: far below the smallest result
	// (about e^(−ζ) for z > 0, |z|^(−1/4) for z < 0) at 2^-prec relative.
	stop := -int(prec) - 24 - 2*int(math.Log2(math.Abs(zf)+2)) - int(zetaPos/math.Ln2)
	den := newf(wp)
	az3 := math.Abs(zf * zf * zf)
	for k := int64(1); ; k++ {
		// a_k = a_{k−1} z³/((3k−1)3k); b_k = b_{k−1} z³/(3k(3k+1));
		// c_{k+1} = c_k z³/(3k(3k+2)); d_k = d_{k−1} z³/((3k−2)(3k)).
		a.Mul(a, z3)
		a.Quo(a, den.SetInt64((3*k-1)*(3*k)))
		b.Mul(b, z3)
		b.Quo(b, den.SetInt64((3*k)*(3*k+1)))
		c.Mul(c, z3)
		c.Quo(c, den.SetInt64((3*k)*(3*k+2)))
		d.Mul(d, z3)
		d.Quo(d, den.SetInt64((3*k-2)*(3*k)))
		fs.Add(fs, a)
		gs.Add(gs, b)
		fps.Add(fps, c)
		gps.Add(gps, d)
		if float64(9*k*k) > az3 && bitsOf(a) < stop && bitsOf(b) < stop && bitsOf(c) < stop && bitsOf(d) < stop {
			break
		}
	}
	lin := func(p, q *big.Float, u, v *big.Float) *big.Float {
		r := newf(wp).Mul(p, u)
		return r.Add(r, newf(wp).Mul(q, v)).SetPrec(prec)
	}
	ai = lin(ai0, aip0, fs, gs)
	aip = lin(ai0, aip0, fps, gps)
	bi = lin(bi0, bip0, fs, gs)
	bip = lin(bi0, bip0, fps, gps)
	return ai, aip, bi, bip
}

// Phase returns the continuous phase Θ(z) = atan2(Ai(z), Bi(z)) rounded to
// prec bits: the branch with Θ(0) = π/6 that is continuous in z, so that
//
//	Ai(z) = M(z) sin Θ(z),  Bi(z) = M(z) cos Θ(z)   (DLMF 9.8.1–9.8.2, 9.8.4)
//	dΘ/dz = −1/(π M²(z))                           (DLMF 9.8.14)
//
// Θ decreases, Θ(a_k) = kπ at the zeros a_k of Ai (DLMF 9.9.1), and Θ → 0+
// as z → +∞.
//
// Special cases are:
//
//	z ≥ 0: Θ(z) = arctan(Ai(z)/Bi(z)) ∈ (0, π/6]
//	z < 0: the branch of atan2 closest to π/4 + (2/3)(−z)^(3/2) (DLMF 9.8.22),
//	       which is always within 0.27 of Θ
//
// The accuracy is a few units of 2^-prec relative to Θ (and for z > 0
// relative to Θ itself, which is about e^(−2ζ)/2). The argument z is not
// modified.
func Phase(z *big.Float, prec uint) *big.Float {
	ai, _, bi, _ := Airy(z, prec+guard)
	return phaseOf(z, ai, bi, prec)
}

// phaseOf returns Θ from Ai and Bi at z, rounded to prec bits.
func phaseOf(z, ai, bi *big.Float, prec uint) *big.Float {
	zf, _ := z.Float64()
	wp := prec + guard
	if zf < 0 {
		wp += uint(math.Log2(2 + math.Abs(zf)*math.Sqrt(math.Abs(zf)))) // Θ ≈ ζ: keep digits relative
	}
	a := Atan2(ai, bi, wp)
	if zf >= 0 {
		return a.SetPrec(prec)
	}
	est := math.Pi/4 + 2.0/3.0*(-zf)*math.Sqrt(-zf)
	af, _ := a.Float64()
	k := math.Round((est - af) / (2 * math.Pi))
	if k != 0 {
		t := Pi(wp)
		t.Mul(t, newf(wp).SetFloat64(2*k))
		a.Add(a, t)
	}
	return a.SetPrec(prec)
}

// Nodes returns, for j = 0 … count−1, the row
//
//	{z, Ai(z), Ai′(z), Bi(z), Bi′(z), Θ(z)},  z = zmin + j·step
//
// with z computed in float64 as zmin + float64(j)*step and every value
// computed at 256 bits ([Airy], [Phase]) and rounded to the nearest float64.
// The generator of the exact package's Airy table and its test share it.
func Nodes(zmin, step float64, count int) [][6]float64 {
	return nodes(zmin, step, count, 256)
}

// nodes is [Nodes] at a chosen precision; the tests compare 256 bits against
// more to show the float64 roundings are correct.
func nodes(zmin, step float64, count int, prec uint) [][6]float64 {
	out := make([][6]float64, count)
	for j := range out {
		zf := zmin + float64(j)*step
		z := newf(prec).SetFloat64(zf)
		ai, aip, bi, bip := Airy(z, prec)
		th := phaseOf(z, ai, bi, prec)
		row := &out[j]
		row[0] = zf
		for i, v := range []*big.Float{ai, aip, bi, bip, th} {
			row[i+1], _ = v.Float64()
		}
	}
	return out
}
