package exact

import (
	"fmt"
	"math"
	"math/cmplx"

	"github.com/tiltwell/tiltwell"
)

// Broad resonances: the complex level equation solved by Newton's method
// in the complex η plane. The left solution is the outgoing wave Ai − iBi
// of the downhill outer layer, the right one the decaying Ai of the
// uphill layer; both are carried through the inner layers by Taylor
// steps with the complex deficit q = v + f(ξ − ½) − η, and the level is a
// zero of their Wronskian at the matching interface. The Airy
// log-derivatives at a complex argument z = x + iy come from the series
// about the real point x (DLMF 9.2.1 fixes every coefficient from the
// values at x), or, for |z| ≥ posStart, from the expansions DLMF
// 9.7.5–9.7.8, which hold for complex z in the sectors used here.

// maxBroadSteps bounds the Taylor steps of one complex evaluation.
const maxBroadSteps = 20000

// cdual is a complex value and its η-derivative.
type cdual struct{ v, d complex128 }

type cstate struct {
	u, w  cdual
	lg    float64
	steps int
}

func (st *cstate) renorm() {
	m := max(cmplx.Abs(st.u.v), cmplx.Abs(st.w.v))
	if (m > 0x1p-400 && m < 0x1p400) || m == 0 || math.IsInf(m, 0) || math.IsNaN(m) {
		return
	}
	_, e := math.Frexp(m)
	f1, f2 := scaleSteps(e)
	for _, f := range [2]float64{f1, f2} {
		if f == 1 {
			continue
		}
		sc := complex(f, 0)
		st.u.v *= sc
		st.u.d *= sc
		st.w.v *= sc
		st.w.d *= sc
	}
	st.lg += float64(e) * math.Ln2
}

func cabs1(z complex128) float64 { return math.Abs(real(z)) + math.Abs(imag(z)) }

// ctaylorStep is [taylorStep] with a complex λ.
func ctaylorStep(st *cstate, h, mu float64, lam complex128, beta, lamd float64) {
	A, B, Ad := lam*complex(h*h, 0), complex(beta*h*h*h, 0), complex(lamd*h*h, 0)
	hm := complex(mu*h, 0)
	e0, e1 := st.u.v, hm*st.w.v
	d0, d1 := st.u.d, hm*st.w.d
	U, W := e0+e1, e1
	Ud, Wd := d0+d1, d1
	size := cabs1(e0) + cabs1(e1)
	sized := cabs1(d0) + cabs1(d1)
	var em1, dm1 complex128
	ek, ek1, dk, dk1 := e0, e1, d0, d1
	for k := 0; k+2 < maxTaylor; k++ {
		inv := complex(1/float64((k+2)*(k+1)), 0)
		e2 := (A*ek + B*em1) * inv
		d2 := (A*dk + Ad*ek + B*dm1) * inv
		kk := complex(float64(k+2), 0)
		U += e2
		W += kk * e2
		Ud += d2
		Wd += kk * d2
		if k >= 2 && cabs1(e2)+cabs1(ek1) <= 0x1p-60*size && cabs1(d2)+cabs1(dk1) <= 0x1p-60*(sized+size*cabs1(Ad)) {
			break
		}
		em1, dm1 = ek, dk
		ek, dk = ek1, dk1
		ek1, dk1 = e2, d2
	}
	st.u = cdual{U, Ud}
	st.w = cdual{W / hm, Wd / hm}
	st.steps++
	st.renorm()
}

// ccross carries a complex state across inner layer j at complex η.
func (c *calc) ccross(st *cstate, j, dir int, eta complex128) bool {
	lo, hi, v, mu := c.layer(j)
	f := c.f
	x0, x1 := lo, hi
	if dir < 0 {
		x0, x1 = hi, lo
	}
	L := x1 - x0
	p2 := math.Pi * math.Pi
	q0 := complex(v+f*(x0-0.5), 0) - eta
	q1 := complex(v+f*(x1-0.5), 0) - eta
	lmax := p2 * mu * max(cmplx.Abs(q0), cmplx.Abs(q1))
	scale := max(math.Sqrt(lmax), math.Cbrt(p2*mu*f))
	n := math.Ceil(math.Abs(L) * scale / stepTheta)
	if !(n <= maxBroadSteps) || st.steps+int(n) > maxBroadSteps {
		return false
	}
	ni := max(int(n), 1)
	h := L / float64(ni)
	beta := p2 * mu * f
	for i := range ni {
		x := x0 + float64(i)*h
		hh := h
		if i == ni-1 {
			hh = x1 - x
		}
		q := complex(math.FMA(f, x-0.5, v), 0) - eta
		ctaylorStep(st, hh, mu, complex(p2*mu, 0)*q, beta, -p2*mu)
	}
	return true
}

// cseries returns Σ c_k (σt)^k for complex t.
func cseries(c *[nPos]float64, t complex128, sigma float64) complex128 {
	x := t * complex(sigma, 0)
	var v complex128
	for k := nPos - 1; k >= 0; k-- {
		v = v*x + complex(c[k], 0)
	}
	return v
}

// clogDeriv returns the physical log-derivative (s/μ)y′/y, with its
// η-derivative, at the point of a layer where the (complex) deficit is q,
// of y = Ai (out false) or the outgoing wave y = Ai − iBi (out true).
// It reports false where neither method is accurate (Re z < 0 for Ai, or
// an imaginary part too large for the series about the real axis).
func (ls *layerScale) clogDeriv(q complex128, out bool) (cdual, bool) {
	z := complex(ls.c, 0) * q
	sm := complex(ls.s/ls.mu, 0)
	if (cmplx.Abs(z) >= posStart && math.Abs(imag(z)) <= real(z)) || math.IsInf(real(z), 1) {
		sq := cmplx.Sqrt(q)
		rmu := math.Sqrt(ls.mu)
		kap := complex(math.Pi*rmu, 0) * sq
		t := complex(1.5*ls.f/(math.Pi*rmu), 0) / (sq * q)
		pre := complex(1.5*math.Pi/rmu, 0) / sq
		rd := cseries(&ratioR, t, -1)
		km := kap / complex(ls.mu, 0)
		if !out {
			tail := (rd - 1) / t
			if t == 0 {
				tail = complex(-ratioR[1], 0)
			}
			return cdual{-km * rd, pre * tail * (rd + 1)}, true
		}
		rg := cseries(&ratioR, t, 1)
		tail := (rg - 1) / t
		if t == 0 {
			tail = complex(ratioR[1], 0)
		}
		// Bi + iAi ∝ Ai − iBi differs from Bi by (Ai/Bi)-terms below
		// e^(−2ζ) < 1e-50 here.
		return cdual{km * rg, pre * tail * (rg + 1)}, true
	}
	x, y := real(z), imag(z)
	if out {
		if x < -negStart {
			return cdual{}, false
		}
	} else if x < 0 {
		return cdual{}, false
	}
	ai, aip, bi, bip := AiryScaled(x)
	var y0, y1 complex128
	if out {
		// e^(−ζ)(Ai − iBi) in the scaled functions (ζ = 0 for x ≤ 0).
		e := 1.0
		if x > 0 {
			e = math.Exp(-(4.0 / 3) * x * math.Sqrt(x))
		}
		y0 = complex(ai*e, -bi)
		y1 = complex(aip*e, -bip)
	} else {
		y0, y1 = complex(ai, 0), complex(aip, 0)
	}
	// Normalized Taylor coefficients ĉ_k about x (ĉ₀ = 1, ĉ₁ = y′/y,
	// (k+2)(k+1)ĉ_(k+2) = x ĉ_k + ĉ_(k−1)), summed at δ = iy: y(z)/y(x)
	// and y′(z)/y(x).
	c1 := y1 / y0
	dl := complex(0, y)
	xc := complex(x, 0)
	val, der := 1+c1*dl, c1
	absSum := 1 + cabs1(c1*dl)
	var cm1 complex128
	ck, ck1 := complex(1, 0), c1
	pw := dl // δ^(k+1)
	for k := 0; ; k++ {
		if k == 150 {
			return cdual{}, false
		}
		ck2 := (xc*ck + cm1) / complex(float64((k+2)*(k+1)), 0)
		pw2 := pw * dl
		tv := ck2 * pw2
		td := complex(float64(k+2), 0) * ck2 * pw
		val += tv
		der += td
		absSum += cabs1(tv)
		if k > 2 && cabs1(tv) <= 1e-19*cabs1(val) && cabs1(td) <= 1e-19*cabs1(der) {
			break
		}
		cm1, ck, ck1 = ck, ck1, ck2
		pw = pw2
	}
	if absSum > 1e4*cabs1(val) {
		return cdual{}, false
	}
	L := der / val
	return cdual{sm * L, -sm * complex(ls.c, 0) * (z - L*L)}, true
}

// ceval evaluates the complex level equation at η with matching interface
// m: the Wronskian F = φ_L w_R − w_L φ_R, its η-derivative, and the size
// of the terms it is formed from (for the rounding estimate).
func (c *calc) ceval(eta complex128, m int) (F, Fp complex128, size float64, steps int, ok bool) {
	_, x1, v0, mu0 := c.layer(0)
	ls0 := newLayerScale(mu0, c.f)
	lamL, ok := ls0.clogDeriv(complex(v0+c.f*(x1-0.5), 0)-eta, true)
	if !ok {
		return 0, 0, 0, 0, false
	}
	xn, _, vn, mun := c.layer(c.n - 1)
	lsn := newLayerScale(mun, c.f)
	lamR, ok := lsn.clogDeriv(complex(vn+c.f*(xn-0.5), 0)-eta, false)
	if !ok {
		return 0, 0, 0, 0, false
	}
	L := cstate{u: cdual{1, 0}, w: lamL}
	for j := 1; j < m; j++ {
		if !c.ccross(&L, j, 1, eta) {
			return 0, 0, 0, 0, false
		}
	}
	R := cstate{u: cdual{1, 0}, w: lamR}
	for j := c.n - 2; j >= m; j-- {
		if !c.ccross(&R, j, -1, eta) {
			return 0, 0, 0, 0, false
		}
	}
	F = L.u.v*R.w.v - L.w.v*R.u.v
	Fp = L.u.d*R.w.v + L.u.v*R.w.d - L.w.d*R.u.v - L.w.v*R.u.d
	size = cmplx.Abs(L.u.v*R.w.v) + cmplx.Abs(L.w.v*R.u.v)
	return F, Fp, size, L.steps + R.steps, true
}

// broad refines a level whose resonance is too broad for the perturbative
// Γ: Newton's method on the complex level equation from the perturbative
// estimate η₀ + g²(κ₂ − χ₁) + ig.
func (c *calc) broad(out *stackLevel, g, chi1, kappa2 float64) (notConfined, error) {
	rl := &out.real
	start := complex(rl.eta+g*g*(kappa2-chi1), g)
	eta := start
	m := rl.m
	var last float64
	conv := false
	var errEta float64
	for it := 0; it < 60; it++ {
		F, Fp, size, steps, ok := c.ceval(eta, m)
		if !ok {
			return "", fmt.Errorf("exact: level %d at f = %g: the broad resonance is outside the complex solver's reach: %w", out.lv.N, c.f, tiltwell.ErrNoConvergence)
		}
		d := F / Fp
		eta -= d
		ad := cmplx.Abs(d)
		errEta = 8 * eps * float64(4+steps) * size / cmplx.Abs(Fp)
		if ad <= errEta+2*eps*max(1, cmplx.Abs(eta)) || (it > 3 && ad >= last) {
			conv = ad <= 1e3*(errEta+2*eps*max(1, cmplx.Abs(eta)))
			last = ad
			break
		}
		last = ad
	}
	if !conv {
		return "", fmt.Errorf("exact: level %d at f = %g: complex Newton did not settle (last step %g): %w", out.lv.N, c.f, last, tiltwell.ErrNoConvergence)
	}
	if cmplx.Abs(eta-start) > 0.3*out.spacing || imag(eta) >= 0 {
		return "", fmt.Errorf("exact: level %d at f = %g: complex Newton left the resonance: %w", out.lv.N, c.f, tiltwell.ErrNoConvergence)
	}
	// The complex equation's rounding, the last step, and the real
	// equation's rounding estimate as a floor (the two are formed from
	// the same solutions).
	e := errEta + last + rl.err
	out.lv.Energy = real(eta)
	out.lv.Err = e
	out.lv.Gamma = -2 * imag(eta)
	out.lv.GammaErr = 2 * e
	return "", nil
}
