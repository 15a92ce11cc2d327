package bigstack

import (
	"math"
	"math/big"
	"testing"

	"github.com/tiltwell/tiltwell/exact/internal/bigairy"
)

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
		return f64(d)
	}
	return f64(d.Quo(d, s))
}

// crelErr returns |got − want| / max(|want|, floor) for complex values.
func crelErr(got, want *cf, floor float64) float64 {
	p := max(got.prec(), want.prec()) + 64
	d := newc(p).sub(got, want)
	n := d.abs2(p)
	n.Sqrt(n)
	s := want.abs2(p)
	s.Sqrt(s)
	if fl := newf(p).SetFloat64(floor); s.Cmp(fl) < 0 {
		s = fl
	}
	return f64(n.Quo(n, s))
}

// sinCos returns sin x and cos x at prec bits for |x| up to a few hundred:
// Taylor series at x/2^10, then ten doublings sin 2a = 2 sin a cos a,
// cos 2a = 1 − 2 sin² a (textbook identities). Test use only.
func sinCos(x *big.Float, prec uint) (s, c *big.Float) {
	const halvings = 10
	wp := prec + 64 + uint(math.Log2(math.Abs(f64(x))+2))
	y := newf(wp).SetMantExp(x, -halvings)
	y2 := newf(wp).Mul(y, y)
	s, c = newf(wp).Set(y), fint(1, wp)
	ts, tc := newf(wp).Set(y), fint(1, wp)
	for k := int64(1); ; k++ {
		ts.Mul(ts, y2)
		ts.Quo(ts, fint((2*k)*(2*k+1), wp))
		ts.Neg(ts)
		tc.Mul(tc, y2)
		tc.Quo(tc, fint((2*k-1)*(2*k), wp))
		tc.Neg(tc)
		s.Add(s, ts)
		c.Add(c, tc)
		if bitsOf(ts) < -int(wp)-8 && bitsOf(tc) < -int(wp)-8 {
			break
		}
	}
	t := newf(wp)
	for i := 0; i < halvings; i++ {
		t.Mul(s, s)
		s.Mul(s, c)
		s.SetMantExp(s, 1)
		c.SetMantExp(t, 1)
		c.Sub(fint(1, wp), c)
	}
	return s.SetPrec(prec), c.SetPrec(prec)
}

// tanhBig returns tanh x = (1 − e^(−2x))/(1 + e^(−2x)) for x ≥ 0.
func tanhBig(x *big.Float, prec uint) *big.Float {
	wp := prec + 32
	e := newf(wp).SetMantExp(x, 1)
	e = bigairy.Exp(e.Neg(e), wp)
	n := newf(wp).Sub(fint(1, wp), e)
	return n.Quo(n, newf(wp).Add(fint(1, wp), e)).SetPrec(prec)
}

// bisect returns the root of g in (a, b), where g(a) and g(b) have
// opposite signs, to about 2^-prec relative (plain bisection: slow and
// sure, independent of the package's root finding).
func bisect(g func(*big.Float) int, a, b *big.Float, prec uint) *big.Float {
	wp := prec + 16
	a, b = newf(wp).Set(a), newf(wp).Set(b)
	sa := g(a)
	for i := 0; i < int(prec)+64; i++ {
		m := newf(wp).Add(a, b)
		m.SetMantExp(m, -1)
		if sm := g(m); sm == sa {
			a = m
		} else if sm == 0 {
			return m
		} else {
			b = m
		}
	}
	m := newf(wp).Add(a, b)
	return m.SetMantExp(m, -1)
}

// sample returns cases, or under the race detector (about ten times
// slower on big arithmetic) every third case, first included, so the
// package's tests stay within seconds there too. Nothing is skipped in a
// normal run.
func sample[T any](cases []T) []T {
	if !raceEnabled {
		return cases
	}
	var out []T
	for i := 0; i < len(cases); i += 3 {
		out = append(out, cases[i])
	}
	return out
}
