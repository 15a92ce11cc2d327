package bigstack

import (
	"math"
	"math/big"
)

// maxStepRate bounds √|Q|·h over one Taylor step of the shooter: the
// solution turns by at most this angle, well below π, so φ has at most one
// zero per step (zeros of a solution of φ″ = Qφ are at least π/√max(−Q)
// apart, Sturm comparison) and a sign change between step points counts it.
const maxStepRate = 2.5

// maxSteps bounds the Taylor steps of one evaluation; beyond it the layer
// structure is out of range (a barrier so thick or tall, or a field so
// small above an uphill edge, that the reference would be too slow).
const maxSteps = 200000

// state is the solution carried across the layers: φ, p = φ′/μ (continuous
// at every interface by the BenDaniel–Duke conditions) and their
// derivatives with respect to η.
type state struct{ phi, p, dphi, dp *cf }

func newState(prec uint) *state {
	return &state{phi: newc(prec), p: newc(prec), dphi: newc(prec), dp: newc(prec)}
}

func (s *state) copyState(prec uint) *state {
	return &state{phi: newc(prec).set(s.phi), p: newc(prec).set(s.p), dphi: newc(prec).set(s.dphi), dp: newc(prec).set(s.dp)}
}

// shooter integrates φ″ = Q(ξ) φ with Q(ξ) = π² μ (v + f (ξ − ½) − η)
// in one layer by Taylor series in ξ, together with ψ = ∂φ/∂η, which obeys
// ψ″ = Q ψ − π² μ φ. With the scaled coefficients C_k = c_k h^k of φ about
// a step point x_j and E_k of ψ,
//
//	(k+2)(k+1) C_{k+2} = Q(x_j) h² C_k + π² μ f h³ C_{k−1}
//	(k+2)(k+1) E_{k+2} = Q(x_j) h² E_k + π² μ f h³ E_{k−1} − π² μ h² C_k
//
// (the equation with Q linear in ξ, expanded term by term), and
// φ(x_j + h) = Σ C_k, h φ′(x_j + h) = Σ k C_k, likewise for ψ. The sums are
// cut once three successive terms are 2^-(wp+8) below the largest one. In
// real mode (real η) the imaginary parts are skipped.
type shooter struct {
	wp      uint
	cplx    bool
	cs, es  []*cf
	inv, kf []*big.Float
	t       *big.Float
	steps   int
}

func newShooter(wp uint, cplx bool) *shooter {
	return &shooter{wp: wp, cplx: cplx, t: newf(wp)}
}

func (s *shooter) grow(n int) {
	for len(s.cs) < n {
		k := len(s.cs)
		s.cs = append(s.cs, newc(s.wp))
		s.es = append(s.es, newc(s.wp))
		s.kf = append(s.kf, fint(int64(k), s.wp))
		s.inv = append(s.inv, newf(s.wp).Quo(fint(1, s.wp), fint(int64((k+2)*(k+1)), s.wp)))
	}
}

// addMul sets dst = dst + a·b (real parts, or complex if s.cplx).
func (s *shooter) addMul(dst, a, b *cf) {
	t := s.t
	dst.re.Add(&dst.re, t.Mul(&a.re, &b.re))
	if !s.cplx {
		return
	}
	dst.re.Sub(&dst.re, t.Mul(&a.im, &b.im))
	dst.im.Add(&dst.im, t.Mul(&a.re, &b.im))
	dst.im.Add(&dst.im, t.Mul(&a.im, &b.re))
}

// addMulR sets dst = dst + a·r for real r.
func (s *shooter) addMulR(dst, a *cf, r *big.Float) {
	t := s.t
	dst.re.Add(&dst.re, t.Mul(&a.re, r))
	if s.cplx {
		dst.im.Add(&dst.im, t.Mul(&a.im, r))
	}
}

func (s *shooter) add(dst, a *cf) {
	dst.re.Add(&dst.re, &a.re)
	if s.cplx {
		dst.im.Add(&dst.im, &a.im)
	}
}

func (s *shooter) scaleR(dst *cf, r *big.Float) {
	dst.re.Mul(&dst.re, r)
	if s.cplx {
		dst.im.Mul(&dst.im, r)
	}
}

func (s *shooter) mag(c *cf) int {
	if s.cplx {
		return c.mag()
	}
	return bitsOf(&c.re)
}

// step advances (y, yp, u, up) = (φ, φ′, ψ, ψ′) by h, with qh2 = Q(x_j) h²,
// bh3 = π² μ f h³ and p2h2 = π² μ h².
func (s *shooter) step(y, yp, u, up, qh2 *cf, bh3, p2h2, h *big.Float) {
	s.steps++
	s.grow(3)
	s.cs[0].set(y)
	s.cs[1].set(yp)
	s.scaleR(s.cs[1], h)
	s.es[0].set(u)
	s.es[1].set(up)
	s.scaleR(s.es[1], h)
	maxC := max(s.mag(s.cs[0]), s.mag(s.cs[1]))
	maxE := max(s.mag(s.es[0]), s.mag(s.es[1]))
	negP2h2 := newf(s.wp).Neg(p2h2)
	lim := int(s.wp) + 8
	small := 0
	last := 1
	for k := 0; ; k++ {
		s.grow(k + 3)
		c, e := s.cs[k+2], s.es[k+2]
		c.re.SetInt64(0)
		c.im.SetInt64(0)
		e.re.SetInt64(0)
		e.im.SetInt64(0)
		s.addMul(c, qh2, s.cs[k])
		s.addMul(e, qh2, s.es[k])
		if k > 0 {
			s.addMulR(c, s.cs[k-1], bh3)
			s.addMulR(e, s.es[k-1], bh3)
		}
		s.addMulR(e, s.cs[k], negP2h2)
		s.scaleR(c, s.inv[k])
		s.scaleR(e, s.inv[k])
		mc, me := s.mag(c), s.mag(e)
		maxC, maxE = max(maxC, mc), max(maxE, me)
		last = k + 2
		if mc < maxC-lim && me < maxE-lim {
			small++
		} else {
			small = 0
		}
		if small >= 3 && k > 4 {
			break
		}
	}
	for _, v := range []*cf{y, yp, u, up} {
		v.re.SetInt64(0)
		v.im.SetInt64(0)
	}
	for k := last; k >= 0; k-- {
		s.add(y, s.cs[k])
		s.add(u, s.es[k])
		if k > 0 {
			s.addMulR(yp, s.cs[k], s.kf[k])
			s.addMulR(up, s.es[k], s.kf[k])
		}
	}
	inv := newf(s.wp).Quo(fint(1, s.wp), h)
	s.scaleR(yp, inv)
	s.scaleR(up, inv)
}

// layerConsts are the per-layer numbers of one evaluation.
type layerConsts struct {
	v, mu *big.Float // band edge and mass ratio
	pi2mu *big.Float // π² μ
	s     *big.Float // (π² μ f)^(1/3), f > 0
}

// segment integrates the state through layer i from xa leftwards to xb
// (xb < xa), entering and leaving with p = φ′/μ. It returns the number of
// sign changes of Re φ at the step points (xa excluded, xb included).
func (pb *problem) segment(sh *shooter, lc *layerConsts, xa, xb *big.Float, eta *cf, st *state, prevSign *int) (zeros int, err error) {
	wp := sh.wp
	// Number of steps: √max|Q| · |h| ≤ maxStepRate, |Q| largest at an end.
	width := f64(newf(64).Sub(xa, xb))
	er, ei := f64(&eta.re), f64(&eta.im)
	qmax := 0.0
	for _, x := range []*big.Float{xa, xb} {
		xf := f64(x)
		vr := f64(lc.v) + pb.f*(xf-0.5) - er
		qmax = math.Max(qmax, math.Hypot(vr, ei))
	}
	qmax *= math.Pi * math.Pi * f64(lc.mu)
	m := math.Ceil(width * math.Sqrt(qmax) / maxStepRate)
	if m < 1 {
		m = 1
	}
	if m > maxSteps || sh.steps+int(m) > maxSteps {
		return 0, errSteps
	}
	steps := int(m)
	h := newf(wp).Sub(xb, xa)
	h.Quo(h, fint(int64(steps), wp))
	h2 := newf(wp).Mul(h, h)
	bh3 := newf(wp).Mul(lc.pi2mu, ffloat(pb.f, wp))
	bh3.Mul(bh3, h2)
	bh3.Mul(bh3, h)
	p2h2 := newf(wp).Mul(lc.pi2mu, h2)
	// φ′ = μ p inside the layer.
	yp := newc(wp).mulR(st.p, lc.mu)
	up := newc(wp).mulR(st.dp, lc.mu)
	y, u := st.phi, st.dphi
	qh2 := newc(wp)
	half := newf(wp).SetFloat64(0.5)
	ff := ffloat(pb.f, wp)
	x := newf(wp)
	for j := 0; j < steps; j++ {
		// x_j = xa + j h; Q(x_j) h² = π² μ (v + f (x_j − ½) − η) h².
		x.Mul(h, fint(int64(j), wp))
		x.Add(x, xa)
		qh2.re.Sub(x, half)
		qh2.re.Mul(&qh2.re, ff)
		qh2.re.Add(&qh2.re, lc.v)
		qh2.re.Sub(&qh2.re, &eta.re)
		qh2.im.Neg(&eta.im)
		qh2.mulR(qh2, lc.pi2mu)
		qh2.mulR(qh2, h2)
		sh.step(y, yp, u, up, qh2, bh3, p2h2, h)
		if prevSign != nil {
			if sg := y.re.Sign(); sg != 0 {
				if *prevSign != 0 && sg != *prevSign {
					zeros++
				}
				*prevSign = sg
			}
		}
	}
	inv := newf(wp).Quo(fint(1, wp), lc.mu)
	st.p.mulR(yp, inv)
	st.dp.mulR(up, inv)
	return zeros, nil
}
