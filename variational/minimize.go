package variational

import "math"

// objective is a function of the tilt β to be minimized.
type objective interface {
	value(beta float64) float64
}

// golden is the golden-section ratio (3 − √5)/2.
const golden = 0.3819660112501051

// bracketMin looks for a bracket a < b < c with F(b) ≤ F(a), F(b) ≤ F(c)
// starting from the guess x0 with initial step h > 0, expanding by the
// golden ratio downhill, and never leaving [lo, hi]. It returns the bracket
// and F at its points. If the minimum lies at a limit, b is that limit and
// the bracket is degenerate on that side.
func bracketMin(obj objective, x0, h, lo, hi float64) (a, b, c, fa, fb, fc float64) {
	x0 = math.Min(math.Max(x0, lo), hi)
	b, fb = x0, obj.value(x0)
	a = math.Max(x0-h, lo)
	c = math.Min(x0+h, hi)
	fa, fc = obj.value(a), obj.value(c)
	if a == b {
		fa = fb
	}
	if c == b {
		fc = fb
	}
	const grow = 1.618033988749895
	for range 200 {
		switch {
		case fb <= fa && fb <= fc:
			return
		case fa < fc: // downhill to the left
			if a == lo {
				return lo, lo, b, fa, fa, fb
			}
			na := math.Max(a-grow*(b-a), lo)
			c, fc = b, fb
			b, fb = a, fa
			a, fa = na, obj.value(na)
		default: // downhill to the right
			if c == hi {
				return b, hi, hi, fb, fc, fc
			}
			nc := math.Min(c+grow*(c-b), hi)
			a, fa = b, fb
			b, fb = c, fc
			c, fc = nc, obj.value(nc)
		}
	}
	return
}

// brent minimizes obj on the bracket a ≤ b ≤ c (F(b) no larger than the
// ends) by Brent's method: parabolic interpolation through the three best
// points, falling back to golden-section steps when the parabola is not
// trusted (R. P. Brent, Algorithms for Minimization without Derivatives,
// Prentice-Hall, 1973, ch. 5). It stops when the bracket is shorter than
// 2·(rtol·|x| + atol), or when the three best values found differ by at
// most ftol (the parabola through them can then gain no more than about
// ftol), and returns the best point and value.
func brent(obj objective, a, b, c, fb, rtol, atol, ftol float64, maxIter int) (x, fx float64) {
	lo, hi := a, c
	x, fx = b, fb
	w, fw := x, fx // second best
	v, fv := x, fx // previous w
	var step, prev float64
	for range maxIter {
		mid := (lo + hi) / 2
		tol := rtol*math.Abs(x) + atol
		if math.Abs(x-mid) <= 2*tol-(hi-lo)/2 {
			return
		}
		if v != w && w != x && v != x && fw-fx <= ftol && fv-fx <= ftol {
			return
		}
		useGolden := true
		if math.Abs(prev) > tol {
			// Parabola through (v, fv), (w, fw), (x, fx).
			r := (x - w) * (fx - fv)
			q := (x - v) * (fx - fw)
			p := (x-v)*q - (x-w)*r
			q = 2 * (q - r)
			if q > 0 {
				p = -p
			}
			q = math.Abs(q)
			if math.Abs(p) < math.Abs(q*prev/2) && p > q*(lo-x) && p < q*(hi-x) {
				prev = step
				step = p / q
				u := x + step
				if u-lo < 2*tol || hi-u < 2*tol {
					step = math.Copysign(tol, mid-x)
				}
				useGolden = false
			}
		}
		if useGolden {
			if x >= mid {
				prev = lo - x
			} else {
				prev = hi - x
			}
			step = golden * prev
		}
		u := x + step
		if math.Abs(step) < tol {
			u = x + math.Copysign(tol, step)
		}
		fu := obj.value(u)
		if fu <= fx {
			if u >= x {
				lo = x
			} else {
				hi = x
			}
			v, fv = w, fw
			w, fw = x, fx
			x, fx = u, fu
			continue
		}
		if u < x {
			lo = u
		} else {
			hi = u
		}
		if fu <= fw || w == x {
			v, fv = w, fw
			w, fw = u, fu
		} else if fu <= fv || v == x || v == w {
			v, fv = u, fu
		}
	}
	return
}
