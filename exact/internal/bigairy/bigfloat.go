package bigairy

import (
	"math"
	"math/big"
	"sync"
)

// guard is the number of extra bits every elementary function carries
// internally before rounding its result to the requested precision.
const guard = 32

func newf(prec uint) *big.Float { return new(big.Float).SetPrec(prec) }

// fint returns the integer n as a big.Float of precision prec.
func fint(n int64, prec uint) *big.Float { return newf(prec).SetInt64(n) }

// round returns a copy of x rounded to nearest-even at precision prec.
func round(x *big.Float, prec uint) *big.Float { return newf(prec).Set(x) }

// bitsOf returns e with |x| < 2^e (the binary exponent of x); 0 for x = 0.
func bitsOf(x *big.Float) int {
	if x.Sign() == 0 {
		return math.MinInt32
	}
	return x.MantExp(nil)
}

// constCache keeps the most precise value computed so far of a constant and
// hands out correctly rounded copies at lower precisions. Recomputing at a
// higher precision replaces the stored value.
type constCache struct {
	mu   sync.Mutex
	prec uint
	val  []*big.Float
	f    func(prec uint) []*big.Float
}

func (c *constCache) get(prec uint) []*big.Float {
	c.mu.Lock()
	defer c.mu.Unlock()
	if c.val == nil || c.prec < prec+guard {
		p := prec + guard
		if p < 2*c.prec {
			p = 2 * c.prec // grow geometrically so repeated small increases stay cheap
		}
		c.val = c.f(p)
		c.prec = p
	}
	out := make([]*big.Float, len(c.val))
	for i, v := range c.val {
		out[i] = round(v, prec)
	}
	return out
}

var piCache = &constCache{f: func(prec uint) []*big.Float { return []*big.Float{machinPi(prec)} }}

// Pi returns π rounded to prec bits. It is computed, not typed in, by
// Machin's formula
//
//	π/4 = 4 arctan(1/5) − arctan(1/239)
//
// with the Gregory series for each arctangent, and cached.
//
// References:
//   - J. M. Borwein and P. B. Borwein, Pi and the AGM (Wiley, 1987), §11.3
//     (Machin-type formulas).
func Pi(prec uint) *big.Float { return piCache.get(prec)[0] }

func machinPi(prec uint) *big.Float {
	wp := prec + guard
	a := atanInv(5, wp)
	a.Mul(a, fint(16, wp))
	b := atanInv(239, wp)
	b.Mul(b, fint(4, wp))
	return a.Sub(a, b).SetPrec(prec)
}

// atanInv returns arctan(1/n) = Σ (−1)^k / ((2k+1) n^(2k+1)) at precision
// prec (absolute error below 2^-prec for n ≥ 2).
func atanInv(n int64, prec uint) *big.Float {
	wp := prec + guard
	p := newf(wp).Quo(fint(1, wp), fint(n, wp)) // 1/n^(2k+1)
	sum := newf(wp).Set(p)
	n2 := fint(n*n, wp)
	t := newf(wp)
	for k := int64(1); ; k++ {
		p.Quo(p, n2)
		if bitsOf(p) < -int(wp) {
			break
		}
		t.Quo(p, fint(2*k+1, wp))
		if k%2 == 1 {
			sum.Sub(sum, t)
		} else {
			sum.Add(sum, t)
		}
	}
	return sum
}

// Sqrt returns √x rounded to prec bits, for x ≥ 0 (it returns 0 for x < 0
// rather than panicking; callers only pass non-negative values).
func Sqrt(x *big.Float, prec uint) *big.Float {
	if x.Sign() <= 0 {
		return newf(prec)
	}
	return newf(prec).Sqrt(x)
}

// Cbrt returns the real cube root x^(1/3) rounded to prec bits, by Newton's
// iteration y ← y − (y³ − x)/(3y²) from a float64 start.
func Cbrt(x *big.Float, prec uint) *big.Float {
	if x.Sign() == 0 {
		return newf(prec)
	}
	wp := prec + guard
	ax := newf(wp).Abs(x)
	// ax = m·2^e with m in [0.5, 1); write e = 3q + r, 0 ≤ r < 3.
	m := newf(wp)
	e := ax.MantExp(m)
	q := e / 3
	r := e - 3*q
	if r < 0 {
		r += 3
		q--
	}
	mf, _ := m.Float64()
	y := newf(wp).SetFloat64(math.Cbrt(math.Ldexp(mf, r)))
	y.SetMantExp(y, q)
	t := newf(wp)
	three := fint(3, wp)
	for i := 0; i < 64; i++ {
		// t = (y³ − ax)/(3y²)
		t.Mul(y, y)
		d := newf(wp).Mul(t, three)
		t.Mul(t, y)
		t.Sub(t, ax)
		t.Quo(t, d)
		y.Sub(y, t)
		if t.Sign() == 0 || bitsOf(t) < bitsOf(y)-int(wp)+2 {
			break
		}
	}
	if x.Sign() < 0 {
		y.Neg(y)
	}
	return y.SetPrec(prec)
}

// Exp returns e^x rounded to prec bits (relative error a few units of
// 2^-prec), by the Taylor series at x/2^m followed by m squarings.
func Exp(x *big.Float, prec uint) *big.Float {
	if x.Sign() == 0 {
		return fint(1, prec)
	}
	e := bitsOf(x)
	k := int(math.Sqrt(float64(prec)))/2 + 4 // |r| < 2^-k after scaling
	m := e + k
	if m < 0 {
		m = 0
	}
	wp := prec + guard + uint(m)
	r := newf(wp).SetMantExp(x, -m)
	sum := fint(1, wp)
	term := fint(1, wp)
	for i := int64(1); ; i++ {
		term.Mul(term, r)
		term.Quo(term, fint(i, wp))
		if term.Sign() == 0 || bitsOf(term) < -int(wp)-1 {
			break
		}
		sum.Add(sum, term)
	}
	for i := 0; i < m; i++ {
		sum.Mul(sum, sum)
	}
	return sum.SetPrec(prec)
}

// Log returns the natural logarithm of x > 0 rounded to prec bits, by the
// cubically convergent iteration y ← y + 2(x − e^y)/(x + e^y) from a
// float64 start. It returns 0 for x ≤ 0 (callers only pass positive values).
func Log(x *big.Float, prec uint) *big.Float {
	if x.Sign() <= 0 {
		return newf(prec)
	}
	wp := prec + guard
	m := newf(wp)
	e := x.MantExp(m)
	mf, _ := m.Float64()
	y := newf(wp).SetFloat64(math.Log(mf) + float64(e)*math.Ln2)
	xx := round(x, wp)
	num, den := newf(wp), newf(wp)
	for i := 0; i < 64; i++ {
		ey := Exp(y, wp)
		num.Sub(xx, ey)
		den.Add(xx, ey)
		num.Quo(num, den)
		num.SetMantExp(num, 1)
		y.Add(y, num)
		scale := bitsOf(y)
		if scale < 0 {
			scale = 0 // absolute accuracy near y = 0 is enough: log is then ≈ x − 1
		}
		if num.Sign() == 0 || bitsOf(num) < scale-int(wp)+4 {
			break
		}
	}
	return y.SetPrec(prec)
}

// Atan returns arctan(x) in (−π/2, π/2) rounded to prec bits: reduction to
// |x| ≤ 1 by arctan(x) = π/2 − arctan(1/x), then repeated argument halving
// arctan(x) = 2 arctan(x/(1 + √(1 + x²))) and the Gregory series.
func Atan(x *big.Float, prec uint) *big.Float {
	if x.Sign() == 0 {
		return newf(prec)
	}
	wp := prec + guard + 16
	ax := newf(wp).Abs(x)
	one := fint(1, wp)
	invert := ax.Cmp(one) > 0
	if invert {
		ax.Quo(one, ax)
	}
	const halvings = 8
	t := newf(wp)
	for i := 0; i < halvings; i++ {
		t.Mul(ax, ax)
		t.Add(t, one)
		t.Sqrt(t)
		t.Add(t, one)
		ax.Quo(ax, t)
	}
	x2 := newf(wp).Mul(ax, ax)
	p := newf(wp).Set(ax)
	sum := newf(wp).Set(ax)
	for k := int64(1); ; k++ {
		p.Mul(p, x2)
		if p.Sign() == 0 || bitsOf(p) < bitsOf(sum)-int(wp)-1 {
			break
		}
		t.Quo(p, fint(2*k+1, wp))
		if k%2 == 1 {
			sum.Sub(sum, t)
		} else {
			sum.Add(sum, t)
		}
	}
	sum.SetMantExp(sum, halvings)
	if invert {
		h := Pi(wp)
		h.SetMantExp(h, -1)
		sum.Sub(h, sum)
	}
	if x.Sign() < 0 {
		sum.Neg(sum)
	}
	return sum.SetPrec(prec)
}

// Atan2 returns the angle of the point (x, y) in (−π, π], the big-float
// analogue of [math.Atan2] (y first). Atan2(0, 0) is 0.
func Atan2(y, x *big.Float, prec uint) *big.Float {
	wp := prec + guard
	switch {
	case x.Sign() == 0 && y.Sign() == 0:
		return newf(prec)
	case x.Sign() == 0:
		h := Pi(wp)
		h.SetMantExp(h, -1)
		if y.Sign() < 0 {
			h.Neg(h)
		}
		return h.SetPrec(prec)
	}
	q := newf(wp).Quo(y, x)
	a := Atan(q, wp)
	if x.Sign() < 0 {
		if y.Sign() >= 0 {
			a.Add(a, Pi(wp))
		} else {
			a.Sub(a, Pi(wp))
		}
	}
	return a.SetPrec(prec)
}
