package bigstack

import (
	"errors"
	"fmt"
	"math"
	"math/big"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact/internal/bigairy"
)

// Layer is one layer of a stack, in the reduced units of the reference
// well (the layer of Width 1, Edge 0, Mass 1 that spans ξ ∈ [0, 1]).
type Layer struct {
	// Width is the thickness in units of the reference width; 0 for the
	// first and last layers, which are semi-infinite.
	Width float64
	// Edge is the band edge v in units of E₁.
	Edge float64
	// Mass is the mass ratio μ to the reference well's effective mass.
	Mass float64
}

// Limits on the arguments of [Level] and [Count].
const (
	// DefaultPrec is the precision in bits used when 0 is asked for.
	DefaultPrec = 256
	// MaxPrec is the largest precision accepted.
	MaxPrec = 1 << 14
	// MaxField is the largest |f| accepted, in F₀.
	MaxField = 1e4
	// MaxLevel is the largest level number accepted.
	MaxLevel = 1000
	// MaxLayers is the largest number of layers accepted.
	MaxLayers = 1000
)

var errSteps = fmt.Errorf("bigstack: more than %d Taylor steps in one evaluation: %w", maxSteps, tiltwell.ErrOutOfRange)

// problem is a validated stack at a field f ≥ 0 (folded: a negative field
// has been turned into the mirrored stack at |f|).
type problem struct {
	layers []Layer
	ref    int
	f      float64
	// cache of per-precision numbers
	cache map[uint]*consts
}

type consts struct {
	pi, pi2 *big.Float
	pos     []*big.Float // left edge of layer i (nil for i = 0)
	lc      []*layerConsts
	omega   *cf // e^(2πi/3)
}

// checkArgs validates a stack, field, level and precision as [Level]
// documents.
func checkArgs(layers []Layer, ref int, f float64, n int, prec uint) error {
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return fmt.Errorf("bigstack: field %v: %w", f, tiltwell.ErrField)
	}
	if math.Abs(f) > MaxField {
		return fmt.Errorf("bigstack: field %g beyond ±%g: %w", f, MaxField, tiltwell.ErrOutOfRange)
	}
	if n < 1 || n > MaxLevel {
		return fmt.Errorf("bigstack: level %d outside 1..%d: %w", n, MaxLevel, tiltwell.ErrLevel)
	}
	if prec > MaxPrec {
		return fmt.Errorf("bigstack: precision %d bits beyond %d: %w", prec, MaxPrec, tiltwell.ErrOutOfRange)
	}
	return checkLayers(layers, ref)
}

func checkLayers(layers []Layer, ref int) error {
	L := len(layers)
	if L < 3 || L > MaxLayers {
		return fmt.Errorf("bigstack: %d layers, need 3 to %d: %w", L, MaxLayers, tiltwell.ErrUnits)
	}
	if ref < 1 || ref > L-2 {
		return fmt.Errorf("bigstack: reference index %d is not an inner layer (1..%d): %w", ref, L-2, tiltwell.ErrUnits)
	}
	if layers[ref] != (Layer{Width: 1, Mass: 1}) {
		return fmt.Errorf("bigstack: reference layer %d is %+v, not {Width: 1, Edge: 0, Mass: 1}: %w", ref, layers[ref], tiltwell.ErrUnits)
	}
	for i, l := range layers {
		outer := i == 0 || i == L-1
		switch {
		case outer && l.Width != 0:
			return fmt.Errorf("bigstack: layer %d: width %v of a semi-infinite outer layer must be 0: %w", i, l.Width, tiltwell.ErrUnits)
		case !outer && !(l.Width > 0 && l.Width <= 1e4):
			return fmt.Errorf("bigstack: layer %d: width %v outside (0, 1e4]: %w", i, l.Width, tiltwell.ErrUnits)
		case !(math.Abs(l.Edge) <= 1e300):
			return fmt.Errorf("bigstack: layer %d: edge %v not finite or beyond 1e300: %w", i, l.Edge, tiltwell.ErrUnits)
		case !(l.Mass >= 1e-6 && l.Mass <= 1e6):
			return fmt.Errorf("bigstack: layer %d: mass %v outside [1e-6, 1e6]: %w", i, l.Mass, tiltwell.ErrUnits)
		}
	}
	return nil
}

// newProblem folds a negative field: the levels of a stack at −f are those
// of its mirror image ξ → 1 − ξ (layers reversed) at f.
func newProblem(layers []Layer, ref int, f float64) *problem {
	ls := append([]Layer(nil), layers...)
	if f < 0 || (f == 0 && math.Signbit(f)) {
		ls, ref = mirror(layers, ref)
		f = -f
	}
	return &problem{layers: ls, ref: ref, f: f, cache: map[uint]*consts{}}
}

// mirror returns layers in reverse order and the mirrored reference index.
func mirror(layers []Layer, ref int) ([]Layer, int) {
	m := make([]Layer, len(layers))
	for i, l := range layers {
		m[len(layers)-1-i] = l
	}
	return m, len(layers) - 1 - ref
}

func (pb *problem) consts(wp uint) *consts {
	if c, ok := pb.cache[wp]; ok {
		return c
	}
	L := len(pb.layers)
	c := &consts{pi: bigairy.Pi(wp), pos: make([]*big.Float, L), lc: make([]*layerConsts, L)}
	c.pi2 = newf(wp).Mul(c.pi, c.pi)
	c.omega = omega3(wp)
	// Interfaces from the reference well outwards: its edges are exactly 0
	// and 1; the sums of float64 widths are exact at this precision for
	// widths within a few hundred binary orders of each other.
	c.pos[pb.ref], c.pos[pb.ref+1] = newf(wp), fint(1, wp)
	for i := pb.ref - 1; i >= 1; i-- {
		c.pos[i] = newf(wp).Sub(c.pos[i+1], ffloat(pb.layers[i].Width, wp))
	}
	for i := pb.ref + 2; i < L; i++ {
		c.pos[i] = newf(wp).Add(c.pos[i-1], ffloat(pb.layers[i-1].Width, wp))
	}
	for i, l := range pb.layers {
		lc := &layerConsts{v: ffloat(l.Edge, wp), mu: ffloat(l.Mass, wp)}
		lc.pi2mu = newf(wp).Mul(c.pi2, lc.mu)
		if pb.f > 0 {
			lc.s = bigairy.Cbrt(newf(wp).Mul(lc.pi2mu, ffloat(pb.f, wp)), wp)
		}
		c.lc[i] = lc
	}
	pb.cache[wp] = c
	return c
}

// matchMode selects the condition in the first (downhill) layer.
type matchMode int

const (
	// modeBound: real η; for f = 0 the decaying exponential, for f > 0 the
	// solution Bi that decays into the downhill barrier (the real problem
	// whose roots are the quasi-bound levels up to O(Γ)).
	modeBound matchMode = iota
	// modeOutgoing: complex η; the outgoing wave Ai − i Bi.
	modeOutgoing
)

// match is the result of one evaluation of the matching function.
type match struct {
	d, dd *cf // D = p − Lφ at ξ₀ and dD/dη
	zeros int // sign changes of φ on (ξ₀, ∞) (modeBound only)
	// at ξ₀, the first interface:
	phi, p *cf
	l      *cf // L, the log-derivative (p/φ) of the downhill solution
	z0     *cf // Airy argument of the downhill layer at ξ₀ (f > 0)
	// f > 0, modeBound: Bi(z₀)² from the series (biSq), or the asymptotic
	// form Bi² = e^(2ζ) su²/(π √z₀).
	biSq, su, zeta *big.Float
	beta, zmb2     *big.Float // β = Bi′/Bi and z₀ − β² at z₀
	at             []*state   // state at each interface (record only)
	zR             *cf        // Airy argument of the uphill layer at its interface
}

// airyArg returns z = s (x − ½ + (v − η)/f) for layer lc at x.
func (pb *problem) airyArg(lc *layerConsts, x *big.Float, eta *cf, wp uint) *cf {
	z := newc(wp)
	ff := ffloat(pb.f, wp)
	z.re.Sub(lc.v, &eta.re)
	z.im.Neg(&eta.im)
	z.re.Quo(&z.re, ff)
	z.im.Quo(&z.im, ff)
	t := newf(wp).Sub(x, newf(wp).SetFloat64(0.5))
	z.re.Add(&z.re, t)
	return z.mulR(z, lc.s)
}

// aiState sets st to the decaying solution Ai(z) of layer lc, with
// φ = Ai(z), p = (s/μ) Ai′(z) and their η-derivatives (dz/dη = −s/f,
// Ai″ = z Ai), or the same up to a constant factor from the ratio
// ω = Ai′/Ai when |z| is large (then φ = 1, p = (s/μ) ω,
// dp = (s/μ)(−s/f)(z − ω²)).
func (pb *problem) aiState(lc *layerConsts, z *cf, wp uint, st *state) {
	sm := newf(wp).Quo(lc.s, lc.mu)             // s/μ
	dz := newf(wp).Quo(lc.s, ffloat(-pb.f, wp)) // dz/dη = −s/f
	if zc := z.float(); real(zc) > 0 && asymReach(cabs(zc), wp) {
		if w, zmw2, ok := aiRatioAsym(z, wp); ok {
			st.phi.set(creal(fint(1, wp), wp))
			st.p.mulR(w, sm)
			st.dphi.set(newc(wp))
			st.dp.mulR(zmw2, sm)
			st.dp.mulR(st.dp, dz)
			return
		}
	}
	ai, aip := aiSeries(z, wp)
	st.phi.set(ai)
	st.p.mulR(aip, sm)
	st.dphi.mulR(aip, dz)
	st.dp.mul(z, ai)
	st.dp.mulR(st.dp, sm)
	st.dp.mulR(st.dp, dz)
}

// expBC is the decaying exponential of an outer layer at f = 0 on the
// side sign (−1: φ ∝ e^(−κξ) on the right, +1: e^(κξ) on the left): it
// returns L = sign·κ/μ and dL/dη = −sign·π²/(2κ), κ = π√(μ(v − η)).
func expBC(lc *layerConsts, eta *cf, sign int, c *consts, wp uint) (l, dl *cf) {
	arg := newc(wp)
	arg.re.Sub(lc.v, &eta.re)
	arg.im.Neg(&eta.im)
	arg.mulR(arg, lc.mu)
	kappa := newc(wp).sqrt(arg)
	kappa.mulR(kappa, c.pi)
	l = newc(wp).mulR(kappa, newf(wp).Quo(fint(int64(sign), wp), lc.mu))
	dl = newc(wp)
	if kappa.mag() > math.MinInt32 {
		dl.quo(creal(newf(wp).Mul(c.pi2, ffloat(-0.5*float64(sign), wp)), wp), kappa)
	}
	return l, dl
}

func cabs(z complex128) float64 { return math.Hypot(real(z), imag(z)) }

// evaluate computes the matching function D(η) = p(ξ₀) − L(η) φ(ξ₀) of the
// solution that satisfies the uphill (right) condition, carried leftwards
// to the first interface ξ₀ = x₁, against the log-derivative L of the
// downhill condition chosen by mode, at working precision wp.
func (pb *problem) evaluate(eta *cf, wp uint, mode matchMode, record bool) (*match, error) {
	c := pb.consts(wp)
	L := len(pb.layers)
	R := L - 1
	cplx := mode == modeOutgoing || !eta.isReal()
	sh := newShooter(wp, cplx)
	st := newState(wp)
	m := &match{}
	if record {
		m.at = make([]*state, L)
	}
	lcR := c.lc[R]
	sign := 1
	zeros := 0
	var signp *int
	if !cplx {
		signp = &sign
	}
	if pb.f == 0 {
		l, dl := expBC(lcR, eta, -1, c, wp)
		st.phi.set(creal(fint(1, wp), wp))
		st.p.set(l)
		st.dp.set(dl)
	} else {
		z := pb.airyArg(lcR, c.pos[R], eta, wp)
		m.zR = z
		if z.re.Sign() >= 0 {
			pb.aiState(lcR, z, wp, st)
		} else {
			// Start at the real turning point x_t = ½ − (v − Re η)/f,
			// where Re z = 0 and the series is cheap, and integrate the
			// uphill layer down to its interface (Ai has no zeros at
			// Re z ≥ 0, so the zero count starts there).
			xt := newf(wp).Sub(lcR.v, &eta.re)
			xt.Quo(xt, ffloat(pb.f, wp))
			xt.Sub(newf(wp).SetFloat64(0.5), xt)
			zt := pb.airyArg(lcR, xt, eta, wp)
			pb.aiState(lcR, zt, wp, st)
			if st.phi.re.Sign() < 0 {
				return nil, errors.New("bigstack: internal: Ai(z_t) < 0")
			}
			zc, err := pb.segment(sh, lcR, xt, c.pos[R], eta, st, signp)
			if err != nil {
				return nil, err
			}
			zeros += zc
		}
	}
	if record {
		m.at[R] = st.copyState(wp)
	}
	for i := R - 1; i >= 1; i-- {
		zc, err := pb.segment(sh, c.lc[i], c.pos[i+1], c.pos[i], eta, st, signp)
		if err != nil {
			return nil, err
		}
		zeros += zc
		if record {
			m.at[i] = st.copyState(wp)
		}
	}
	m.zeros = zeros
	// Downhill condition at ξ₀.
	lc0 := c.lc[0]
	var l, dl *cf
	switch {
	case pb.f == 0:
		l, dl = expBC(lc0, eta, +1, c, wp)
	case mode == modeBound:
		z0 := pb.airyArg(lc0, c.pos[1], eta, wp)
		m.z0 = z0
		z := &z0.re
		var beta, zmb2 *big.Float
		if z.Sign() > 0 && asymReach(f64(z), wp) {
			b, d, su, zeta, ok := biAsym(z, wp)
			if ok {
				beta, zmb2, m.su, m.zeta = b, d, su, zeta
			}
		}
		if beta == nil {
			_, _, bi, bip := bigairy.Airy(z, wp+16)
			beta = newf(wp).Quo(bip, bi)
			zmb2 = newf(wp).Mul(beta, beta)
			zmb2.Sub(z, zmb2)
			m.biSq = newf(wp).Mul(bi, bi)
		}
		m.beta, m.zmb2 = beta, zmb2
		sm := newf(wp).Quo(lc0.s, lc0.mu)
		l = creal(newf(wp).Mul(beta, sm), wp)
		d := newf(wp).Mul(zmb2, sm)
		d.Mul(d, lc0.s)
		d.Quo(d, ffloat(-pb.f, wp))
		dl = creal(d, wp)
	default:
		// Ai(z) − i Bi(z) = 2 e^(−πi/3) Ai(z e^(2πi/3)) (DLMF 9.2.11), so
		// its log-derivative is ω = e^(2πi/3) Ai′(w)/Ai(w), w = z e^(2πi/3).
		z0 := pb.airyArg(lc0, c.pos[1], eta, wp)
		m.z0 = z0
		w := newc(wp).mul(z0, c.omega)
		ai, aip := aiSeries(w, wp+16)
		om := newc(wp).quo(aip, ai)
		om.mul(om, c.omega)
		sm := newf(wp).Quo(lc0.s, lc0.mu)
		l = newc(wp).mulR(om, sm)
		d := newc(wp).mul(om, om)
		d.sub(z0, d)
		d.mulR(d, sm)
		d.mulR(d, newf(wp).Quo(lc0.s, ffloat(-pb.f, wp)))
		dl = d
	}
	// D = p − L φ, dD = dp − L dφ − dL φ.
	m.l = l
	m.phi, m.p = st.phi, st.p
	m.d = newc(wp).mul(l, st.phi)
	m.d.sub(st.p, m.d)
	m.dd = newc(wp).mul(l, st.dphi)
	m.dd.sub(st.dp, m.dd)
	m.dd.sub(m.dd, newc(wp).mul(dl, st.phi))
	return m, nil
}
