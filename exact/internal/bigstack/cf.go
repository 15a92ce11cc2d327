package bigstack

import (
	"math"
	"math/big"
)

// guard is the number of extra bits carried by intermediate results.
const guard = 32

func newf(prec uint) *big.Float { return new(big.Float).SetPrec(prec) }

// fint returns the integer n as a big.Float of precision prec.
func fint(n int64, prec uint) *big.Float { return newf(prec).SetInt64(n) }

// ffloat returns the float64 x exactly (prec ≥ 53) as a big.Float.
func ffloat(x float64, prec uint) *big.Float { return newf(prec).SetFloat64(x) }

// bitsOf returns e with |x| < 2^e; a very negative number for x = 0.
func bitsOf(x *big.Float) int {
	if x.Sign() == 0 {
		return math.MinInt32
	}
	return x.MantExp(nil)
}

// f64 returns x rounded to float64 (±Inf or 0 outside its range).
func f64(x *big.Float) float64 { v, _ := x.Float64(); return v }

// cf is a complex number re + i·im with big.Float parts. Like big.Float it
// is used through pointers only (a copied big.Float shares its mantissa).
// Results are rounded to the precision of the receiver.
type cf struct{ re, im big.Float }

// newc returns 0 + 0i at precision prec.
func newc(prec uint) *cf {
	c := new(cf)
	c.re.SetPrec(prec)
	c.im.SetPrec(prec)
	return c
}

// creal returns x + 0i at precision prec.
func creal(x *big.Float, prec uint) *cf {
	c := newc(prec)
	c.re.Set(x)
	return c
}

func (c *cf) prec() uint { return c.re.Prec() }

func (c *cf) set(a *cf) *cf {
	c.re.Set(&a.re)
	c.im.Set(&a.im)
	return c
}

func (c *cf) add(a, b *cf) *cf {
	c.re.Add(&a.re, &b.re)
	c.im.Add(&a.im, &b.im)
	return c
}

func (c *cf) sub(a, b *cf) *cf {
	c.re.Sub(&a.re, &b.re)
	c.im.Sub(&a.im, &b.im)
	return c
}

func (c *cf) neg(a *cf) *cf {
	c.re.Neg(&a.re)
	c.im.Neg(&a.im)
	return c
}

// mulR sets c = a·r for a real r.
func (c *cf) mulR(a *cf, r *big.Float) *cf {
	c.re.Mul(&a.re, r)
	c.im.Mul(&a.im, r)
	return c
}

// mul sets c = a·b; c may alias a or b.
func (c *cf) mul(a, b *cf) *cf {
	p := c.prec() + 8
	t1 := newf(p).Mul(&a.re, &b.re)
	t2 := newf(p).Mul(&a.im, &b.im)
	t3 := newf(p).Mul(&a.re, &b.im)
	t4 := newf(p).Mul(&a.im, &b.re)
	c.re.Sub(t1, t2)
	c.im.Add(t3, t4)
	return c
}

// quo sets c = a/b; c may alias a or b. b must not be 0.
func (c *cf) quo(a, b *cf) *cf {
	p := c.prec() + 8
	d := newf(p).Mul(&b.re, &b.re)
	d.Add(d, newf(p).Mul(&b.im, &b.im))
	t1 := newf(p).Mul(&a.re, &b.re)
	t1.Add(t1, newf(p).Mul(&a.im, &b.im))
	t2 := newf(p).Mul(&a.im, &b.re)
	t2.Sub(t2, newf(p).Mul(&a.re, &b.im))
	c.re.Quo(t1, d)
	c.im.Quo(t2, d)
	return c
}

// abs2 returns |a|² at precision prec.
func (c *cf) abs2(prec uint) *big.Float {
	d := newf(prec).Mul(&c.re, &c.re)
	return d.Add(d, newf(prec).Mul(&c.im, &c.im))
}

// sqrt sets c to the principal square root of a (Re √a ≥ 0, the branch
// cut on the negative real axis, where √(−x ± 0i) = ±i√x).
func (c *cf) sqrt(a *cf) *cf {
	p := c.prec() + 16
	if a.im.Sign() == 0 {
		r := newf(p).Abs(&a.re)
		r.Sqrt(orZero(r))
		if a.re.Sign() >= 0 {
			c.re.Set(r)
			c.im.SetInt64(0)
		} else {
			c.re.SetInt64(0)
			if a.im.Signbit() {
				r.Neg(r)
			}
			c.im.Set(r)
		}
		return c
	}
	m := a.abs2(p)
	m.Sqrt(m)
	// re = √((|a| + x)/2), im = sign(y) √((|a| − x)/2); take the larger
	// one directly and the other as y/(2·larger) to avoid cancellation.
	if a.re.Sign() >= 0 {
		r := newf(p).Add(m, &a.re)
		r.SetMantExp(r, -1)
		r.Sqrt(r)
		im := newf(p).Quo(&a.im, r)
		im.SetMantExp(im, -1)
		c.re.Set(r)
		c.im.Set(im)
		return c
	}
	r := newf(p).Sub(m, &a.re)
	r.SetMantExp(r, -1)
	r.Sqrt(r)
	if a.im.Sign() < 0 {
		r.Neg(r)
	}
	re := newf(p).Quo(&a.im, r)
	re.SetMantExp(re, -1)
	c.re.Set(re)
	c.im.Set(r)
	return c
}

func orZero(x *big.Float) *big.Float {
	if x.Sign() < 0 {
		return x.SetInt64(0)
	}
	return x
}

// mag returns log2 |c| roughly (max of the parts' binary exponents);
// math.MinInt32 for c = 0.
func (c *cf) mag() int { return max(bitsOf(&c.re), bitsOf(&c.im)) }

// float returns c as a complex128 (parts may overflow to ±Inf).
func (c *cf) float() complex128 { return complex(f64(&c.re), f64(&c.im)) }

// isReal reports whether the imaginary part is exactly zero.
func (c *cf) isReal() bool { return c.im.Sign() == 0 }
