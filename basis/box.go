package basis

import (
	"math"
)

// The basis of a finite stack: the eigenstates of the untilted stack in a
// box [a, b] that holds every inner layer and part of each outer layer,
//
//	H₀ = −(1/π²) d/dξ (1/μ(ξ)) d/dξ + v(ξ),   φ(a) = φ(b) = 0,
//
// with φ and (1/μ)φ′ continuous at every interface (BenDaniel–Duke). In
// each layer of constant v and μ the solutions of H₀φ = Eφ are
// φ″ = qφ, q = π²μ(v − E): cosines and sines where E > v, hyperbolic
// functions where E < v. A state is carried across a layer of width h by
// the transfer
//
//	φ(h) = C φ(0) + μ S w(0),   w(h) = (qS/μ) φ(0) + C w(0),   w = φ′/μ,
//
// C = cos kh, S = sin(kh)/k (E > v, k = √−q) or C = cosh κh,
// S = sinh(κh)/κ (E < v, κ = √q), and the level E_m is the m-th root of
// the Prüfer angle at b, which is continuous and increasing in E (the
// Sturm oscillation theorem: the m-th state has m − 1 zeros in (a, b);
// E. A. Coddington and N. Levinson, Theory of Ordinary Differential
// Equations (McGraw-Hill, 1955), ch. 8, from memory). The states satisfy
// the interface conditions exactly, so the tilt's matrix in this basis
// converges as fast as in the sine basis of infinite walls; a sine basis
// on the box would converge only as 1/N with a mass step, whose kink in
// φ makes the sine coefficients fall as m⁻² (common practice, no source).

// seg is one layer of the box: band edge v (E₁) and mass ratio mu on
// [lo, lo + w].
type seg struct {
	lo, w, v, mu float64
}

// transfer returns C(h), S(h) and q·S(h) for φ″ = qφ across width h. Where
// the growth t = √q·h exceeds 1 the three are scaled by e^(−t), returned
// as sc = t (sc = 0 otherwise), so that thick barriers do not overflow.
func transfer(q, h float64) (c, s, qs, sc float64) {
	switch {
	case q > 0:
		r := math.Sqrt(q)
		t := r * h
		if t > 1 {
			e := math.Exp(-2 * t)
			return (1 + e) / 2, (1 - e) / (2 * r), r * (1 - e) / 2, t
		}
		if t < 1e-8 { // sinh(t)/t = 1 + t²/6 + …
			return math.Cosh(t), h, q * h, 0
		}
		sh := math.Sinh(t)
		return math.Cosh(t), sh / r, r * sh, 0
	case q < 0:
		k := math.Sqrt(-q)
		t := k * h
		sn, cs := math.Sincos(t)
		if t < 1e-8 {
			return cs, h, q * h, 0
		}
		return cs, sn / k, -k * sn, 0
	}
	return 1, h, 0, 0
}

// shot is a solution of H₀φ = Eφ carried from one end of the box: φ = u
// and w = φ′/μ, both scaled by e^lg, and n, the zeros of φ passed (left
// shots only).
type shot struct {
	u, w, lg float64
	n        int
}

// renorm rescales the state by a power of two when it grows large or
// small; only the direction matters, lg keeps the scale.
func (st *shot) renorm() {
	m := max(math.Abs(st.u), math.Abs(st.w))
	if m > 0x1p-400 && m < 0x1p400 || m == 0 || math.IsInf(m, 0) || math.IsNaN(m) {
		return
	}
	_, e := math.Frexp(m)
	sc := math.Ldexp(1, -e)
	st.u *= sc
	st.w *= sc
	st.lg += float64(e) * math.Ln2
}

// right carries st across s from its left edge to its right edge at energy
// e, counting the zeros of φ in (lo, lo + w].
func (st *shot) right(s *seg, e float64) {
	q := math.Pi * math.Pi * s.mu * (s.v - e)
	c, sh, qs, sc := transfer(q, s.w)
	u := c*st.u + s.mu*sh*st.w
	w := qs/s.mu*st.u + c*st.w
	n := 0
	if q < 0 {
		// φ = A sin(kx + δ): zeros where kx + δ is a multiple of π.
		k := math.Sqrt(-q)
		d := math.Atan2(st.u*k, s.mu*st.w)
		end := (k*s.w + d) / math.Pi
		n = int(math.Floor(end) - math.Floor(d/math.Pi))
		// Where the end is within rounding of a zero, let the sign of the
		// computed φ decide whether the zero has been passed, so that the
		// count and the state agree.
		if st.u != 0 {
			crossed := u == 0 || (u > 0) != (st.u > 0)
			if crossed != (n&1 == 1) {
				if end-math.Floor(end) < 0.5 {
					n--
				} else {
					n++
				}
			}
		} else if u == 0 && n == 0 {
			n = 1
		}
	} else if st.u != 0 && (u == 0 || (u > 0) != (st.u > 0)) {
		n = 1 // at most one zero where φ is not oscillatory
	}
	st.u, st.w, st.lg, st.n = u, w, st.lg+sc, st.n+max(n, 0)
	st.renorm()
}

// left carries st across s from its right edge to its left edge.
func (st *shot) left(s *seg, e float64) {
	q := math.Pi * math.Pi * s.mu * (s.v - e)
	c, sh, qs, sc := transfer(q, s.w)
	u := c*st.u - s.mu*sh*st.w
	w := -qs/s.mu*st.u + c*st.w
	st.u, st.w, st.lg = u, w, st.lg+sc
	st.renorm()
}

// boundary conditions at the box ends.
const (
	dirichlet = iota // φ = 0
	neumann          // φ′ = 0
)

// start returns the state at an end of the box for the condition bc.
func start(bc int) shot {
	if bc == neumann {
		return shot{u: 1}
	}
	return shot{w: 1}
}

// angle returns the Prüfer angle of the left shot at b: π·(zeros passed)
// plus the angle of (u, σw) in [0, π), continuous and increasing in E.
func angle(st shot, sigma float64) float64 {
	a := math.Atan2(st.u, sigma*st.w)
	if a < 0 {
		a += math.Pi
	}
	if a >= math.Pi {
		a -= math.Pi
	}
	return float64(st.n)*math.Pi + a
}

// boxAngle returns the Prüfer angle at b of the solution started at a with
// the condition bc, at energy e.
func boxAngle(segs []seg, bc int, e, sigma float64) float64 {
	st := start(bc)
	for i := range segs {
		st.right(&segs[i], e)
	}
	return angle(st, sigma)
}

// boxLevels fills e[m] with the box levels E_1..E_M (M = len(e)) of the
// condition bc at both ends: the roots of angle(E) = mπ (Dirichlet) or
// (m − ½)π (Neumann), each bracketed between the level below and a step
// up grown until the angle passes the target, then solved by the
// Illinois variant of regula falsi to a relative 4u. It returns false if
// a root could not be bracketed (a broken invariant).
func boxLevels(segs []seg, bc int, e []float64) bool {
	vmin, vmax, mumin := math.Inf(1), math.Inf(-1), math.Inf(1)
	width := 0.0
	for _, s := range segs {
		vmin, vmax, mumin = min(vmin, s.v), max(vmax, s.v), min(mumin, s.mu)
		width += s.w
	}
	last := segs[len(segs)-1]
	// σ turns w into the units of φ at b; any positive value gives a
	// valid Prüfer angle.
	sigma := last.mu / math.Max(1, math.Pi*math.Sqrt(last.mu*math.Max(math.Abs(vmax-vmin), 1)))
	off := 0.0
	if bc == neumann {
		off = 0.5
	}
	lo := vmin - 1e-12*math.Max(1, math.Abs(vmin))
	for m := range e {
		target := (float64(m+1) - off) * math.Pi
		// The m-th level is at most v_max + m²/(μ_min W²) (min–max against
		// the box with the largest band edge and the smallest mass).
		ub := vmax + float64((m+1)*(m+1))/(mumin*width*width)
		ub += 1e-12 * math.Max(1, math.Abs(ub))
		step := 1.0 / (mumin * width * width)
		if m >= 2 {
			step = math.Max(step, 1.5*(e[m-1]-e[m-2]))
		} else if m == 1 {
			step = math.Max(step, 1.5*(e[0]-vmin))
		}
		hi := math.Min(lo+step, ub)
		fhi := boxAngle(segs, bc, hi, sigma) - target
		for fhi < 0 && hi < ub {
			hi = math.Min(hi+2*(hi-lo), ub)
			fhi = boxAngle(segs, bc, hi, sigma) - target
		}
		if fhi < 0 {
			return false
		}
		flo := boxAngle(segs, bc, lo, sigma) - target
		if flo > 0 {
			return false
		}
		e[m] = illinois(segs, bc, sigma, target, lo, hi, flo, fhi)
		lo = e[m]
	}
	return true
}

// illinois returns the root of angle(E) − target in [lo, hi], where the
// function is flo ≤ 0 and fhi ≥ 0.
func illinois(segs []seg, bc int, sigma, target, lo, hi, flo, fhi float64) float64 {
	side := 0
	for range 200 {
		if flo == 0 {
			return lo
		}
		if fhi == 0 || hi-lo <= 4*unit*math.Max(math.Abs(lo), math.Abs(hi)) {
			return hi
		}
		x := hi - fhi*(hi-lo)/(fhi-flo)
		if !(x > lo && x < hi) {
			x = lo + (hi-lo)/2
		}
		fx := boxAngle(segs, bc, x, sigma) - target
		if fx < 0 {
			lo, flo = x, fx
			if side == -1 {
				fhi /= 2
			}
			side = -1
		} else {
			hi, fhi = x, fx
			if side == 1 {
				flo /= 2
			}
			side = 1
		}
	}
	return hi
}

// rep is the closed form of one box state on one layer, in the local
// coordinate x ∈ [0, h]:
//
//	oscillatory or thin:  φ = c1·C(x) + c2·S(x)  (C, S as in transfer)
//	thick barrier:        φ = c1·e^(−κx) + c2·e^(−κ(h−x))
//
// The second form, from the values at both edges, keeps full accuracy
// where cosh and sinh would cancel (a decaying tail).
type rep struct {
	q, k   float64 // q = π²μ(v − E) and √|q|
	c1, c2 float64
	thick  bool
}

// at returns φ at local coordinate x on a layer of width h.
func (r *rep) at(x, h float64) float64 {
	switch {
	case r.thick:
		return r.c1*math.Exp(-r.k*x) + r.c2*math.Exp(-r.k*(h-x))
	case r.q < 0:
		sn, cs := math.Sincos(r.k * x)
		if r.k*x < 1e-8 {
			return r.c1*cs + r.c2*x
		}
		return r.c1*cs + r.c2*sn/r.k
	case r.q > 0:
		t := r.k * x
		if t < 1e-8 {
			return r.c1*math.Cosh(t) + r.c2*x
		}
		return r.c1*math.Cosh(t) + r.c2*math.Sinh(t)/r.k
	}
	return r.c1 + r.c2*x
}

// boxState fills reps (one per layer) with the state of energy e, and ends
// with its values at the interfaces (len(segs) + 1, the box ends
// included), scaled so that the largest is of order 1. It shoots from
// both ends and joins the two shots at the interface where the state is
// largest, so that each shot is used only where it has been growing
// (stable). ls and rs are scratch of length len(segs) + 1.
func boxState(segs []seg, bc int, e float64, reps []rep, ends []float64, ls, rs []shot) {
	n := len(segs)
	ls[0] = start(bc)
	for i := range segs {
		ls[i+1] = ls[i]
		ls[i+1].right(&segs[i], e)
	}
	rs[n] = start(bc)
	for i := n - 1; i >= 0; i-- {
		rs[i] = rs[i+1]
		rs[i].left(&segs[i], e)
	}
	// σ converts w = φ′/μ to the units of φ.
	sigma := 0.0
	for _, s := range segs {
		sigma = math.Max(sigma, math.Pi*math.Sqrt(s.mu*math.Max(math.Abs(s.v-e), 1))/s.mu)
	}
	lnorm := func(st shot) float64 {
		return st.lg + math.Log(math.Abs(st.u)+math.Abs(st.w)/sigma)
	}
	best, join := math.Inf(-1), 0
	for i := 0; i <= n; i++ {
		if v := lnorm(ls[i]) + lnorm(rs[i]); v > best {
			best, join = v, i
		}
	}
	// Scale both shots to unit norm at the join; the right one is matched
	// to the left by least squares in the (u, w/σ) metric.
	jl := ls[join]
	nl := math.Abs(jl.u) + math.Abs(jl.w)/sigma
	lu, lw := jl.u/nl, jl.w/nl
	jr := rs[join]
	alpha := (lu*jr.u + lw*jr.w/(sigma*sigma)) / (jr.u*jr.u + jr.w*jr.w/(sigma*sigma))
	us := func(i int) (u, w float64) {
		if i <= join {
			f := math.Exp(ls[i].lg-jl.lg) / nl
			return ls[i].u * f, ls[i].w * f
		}
		f := alpha * math.Exp(rs[i].lg-jr.lg)
		return rs[i].u * f, rs[i].w * f
	}
	u0, w0 := us(0)
	ends[0] = u0
	for i := range segs {
		s := &segs[i]
		u1, w1 := us(i + 1)
		ends[i+1] = u1
		q := math.Pi * math.Pi * s.mu * (s.v - e)
		r := rep{q: q, k: math.Sqrt(math.Abs(q))}
		if t := r.k * s.w; q > 0 && t > 1 {
			x := math.Exp(-t)
			d := 1 - x*x
			r.thick = true
			r.c1 = (u0 - u1*x) / d
			r.c2 = (u1 - u0*x) / d
		} else {
			r.c1, r.c2 = u0, s.mu*w0
		}
		reps[i] = r
		u0, w0 = u1, w1
	}
}
