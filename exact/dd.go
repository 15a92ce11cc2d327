package exact

import "math"

// Double-double arithmetic: a value is hi + lo with |lo| ≤ ulp(hi)/2, about
// 106 bits. The level equation needs it in two places only: the wall
// arguments z₀, z₁ (whose rounding ε|z| would otherwise move a level by
// ε(|η| + f/2), far more than ε|η| when a level sits near the middle of a
// strongly tilted well) and the large phases Θ(z₀), Θ(z₁) ≈ nπ whose
// difference is nπ plus a small remainder.
//
// References:
//   - T. J. Dekker, "A floating-point technique for extending the available
//     precision", Numer. Math. 18, 224–242 (1971) (TwoSum, TwoProduct).
//   - D. E. Knuth, The Art of Computer Programming, vol. 2, §4.2.2
//     (the branch-free TwoSum).

type dd struct{ hi, lo float64 }

// twoSum returns s = fl(a + b) and the exact error e, a + b = s + e.
func twoSum(a, b float64) (s, e float64) {
	s = a + b
	bb := s - a
	e = (a - (s - bb)) + (b - bb)
	return s, e
}

// twoProd returns p = fl(a·b) and the exact error e, a·b = p + e (by FMA).
func twoProd(a, b float64) (p, e float64) {
	p = a * b
	return p, math.FMA(a, b, -p)
}

func ddAdd(x, y dd) dd {
	s, e := twoSum(x.hi, y.hi)
	e += x.lo + y.lo
	s, e = twoSum(s, e)
	return dd{s, e}
}

func ddNeg(x dd) dd { return dd{-x.hi, -x.lo} }

// ddMulF returns x·b.
func ddMulF(x dd, b float64) dd {
	p, e := twoProd(x.hi, b)
	e += x.lo * b
	p, e = twoSum(p, e)
	return dd{p, e}
}

// ddMul returns x·y.
func ddMul(x, y dd) dd {
	p, e := twoProd(x.hi, y.hi)
	e += x.hi*y.lo + x.lo*y.hi
	p, e = twoSum(p, e)
	return dd{p, e}
}

// ddSqrt returns √x for x > 0 (one Newton correction of the float root).
func ddSqrt(x dd) dd {
	s := math.Sqrt(x.hi)
	p, e := twoProd(s, s)
	r := ((x.hi - p) - e + x.lo) / (2 * s)
	h, l := twoSum(s, r)
	return dd{h, l}
}

// ddCbrt returns ∛x for x > 0 (one Newton correction of the float root).
func ddCbrt(x dd) dd {
	c := math.Cbrt(x.hi)
	c3 := ddMulF(ddMul(dd{c, 0}, dd{c, 0}), c)
	r := ((x.hi - c3.hi) - c3.lo + x.lo) / (3 * c * c)
	h, l := twoSum(c, r)
	return dd{h, l}
}

// Constants in double-double. π = πHi + πLo to 107 bits, the low part
// being the float64 nearest to π − fl(π) (checked in TestDoubleDouble
// against π from Machin's formula at 256 bits).
var (
	ddPi   = dd{math.Pi, 1.2246467991473532e-16}
	ddPi2  = ddMul(ddPi, ddPi)
	ddPi4  = dd{math.Pi / 4, 1.2246467991473532e-16 / 4}
	ddTwo3 = dd{2.0 / 3, 3.700743415417188e-17} // lo = 2/3 − fl(2/3)
)

// ddDiv returns x/y.
func ddDiv(x, y dd) dd {
	q1 := x.hi / y.hi
	r := ddAdd(x, ddNeg(ddMulF(y, q1)))
	q2 := r.hi / y.hi
	h, l := twoSum(q1, q2)
	return dd{h, l}
}
