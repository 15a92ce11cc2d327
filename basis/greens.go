package basis

import (
	"math"
	"math/cmplx"

	"github.com/tiltwell/tiltwell/internal/airy"
)

// The box's walls, removed to all orders through the box's Green's
// function.
//
// Let x₀ and x₁ be the outer interfaces and G the 2×2 matrix of the box's
// Green's function G(x_i, x_j; η) (Dirichlet walls at a < x₀ and b > x₁).
// A solution of the whole line is, inside [x₀, x₁], u = Σ_j G(·, x_j)α_j:
// it solves the equation there, and on each outer stretch of the box it
// is the solution that vanishes at the wall, whose logarithmic derivative
// (1/μ)u′/u at the interface is λ_i. The jump of G's flux,
// −(1/π²)[(1/μ)∂G] = 1, gives α_i = D_i u(x_i)/π², where D_i is the
// difference between λ_i and the log-derivative R_i of the solution the
// outer layer keeps (D₀ = λ₀ − R₀ on the left, D₁ = R₁ − λ₁ on the
// right). So the levels of the line solve det(I − G D̃) = 0,
// D̃ = diag(D₀, D₁)/π² (M. G. Krein's resolvent formula for a rank-two
// change of the boundary conditions; derived here, from memory of the
// form). Near a Ritz value θ of the box, G = vvᵀ/(θ − η) + S, with
// v_i = ψ(x_i) of the Ritz function and S regular, and the matrix
// determinant lemma turns the condition into
//
//	η = θ − vᵀ D̃ (I − S D̃)⁻¹ v,
//
// which has no cancellation however close η is to θ, and is solved by
// Newton's method from θ. G in the basis is yᵢᵀ(T − η)⁻¹y_j, with T the
// tridiagonal form of the Rayleigh–Ritz matrix, A = QTQᵀ, and y_i = Qᵀe_i,
// (e_i)_m = χ_m(x_i); the states beyond the basis, which carry G's kink,
// are added at zeroth order in the tilt in closed form: the untilted
// box's Green's function, −π²φ_a(x_<)φ_b(x_>)/(φ_a w_b − φ_b w_a) from
// the solutions φ_a, φ_b that vanish at the walls (w = φ′/μ), less its
// first N terms Σ χ_m(x_i)χ_m(x_j)/(E_m − η). What is left of G falls
// about as N⁻³; stackRun measures the error it leaves from a second basis
// size.
//
// The outer layers, in closed form (z = s(ξ − ξ_t), s = (π²μf)^(1/3),
// ξ_t the turning point; the Wronskian DLMF 9.2.7 removes every
// cancellation):
//
//   - f = 0, either side: D = (2κ/μ)/(e^(2κd) − 1), κ = π√(μ(v − η)), d
//     the wall's depth.
//   - f > 0, uphill (right): the layer keeps Ai, and
//     D₁ = (s/πμ) Ai(z_b) / (Ai(z₁)(Bi(z_b)Ai(z₁) − Ai(z_b)Bi(z₁))).
//   - f > 0, downhill (left): the level is a resonance whose outer wave is
//     Ai(z) − iBi(z) (outgoing for z → −∞), ∝ Bi + iAi. With R₀ that of
//     Bi alone (the real, bound-like problem),
//     D₀ = (s/πμ) Bi(z_a) / ((Ai(z_a)Bi(z₀) − Bi(z_a)Ai(z₀)) Bi(z₀)),
//     whose root is the real level η_p; with the outgoing wave,
//     D₀ = (s/πμ) (Bi(z_a) + iAi(z_a)) / ((Ai(z_a)Bi(z₀) − Bi(z_a)Ai(z₀)) (Bi(z₀) + iAi(z₀))),
//     whose root is the complex level η_r − iΓ/2 itself.
//
// The imaginary part of the outgoing D₀ is Q = s/(πμ Bi(z₀)²) to first
// order in Ai/Bi at x₀, so a narrow level has
//
//	Γ = −2 Im η = 2 (Q/π²) ((I − S D̃)⁻¹v)₀² / h′(η)
//
// at the real root (h(η) = η − θ + vᵀD̃(I − S D̃)⁻¹v, whose slope carries
// the η-dependence of S and D̃), with full relative precision however small Γ is (the
// flux form of the width: G. Gamow, Z. Phys. 51, 204 (1928)). Expanding the
// level equation in Ai/Bi about the real root gives
// η_r = η_p − χ(Γ/2)² − εΓ/2 + O(Γ²/gap) with χ = ∂ln Γ/∂η and ε = Ai/Bi at
// x₀; where those terms are not below rounding, the complex root is
// solved instead.

// greenAt2 returns the 2×2 G_ij(η) = y_iᵀ(T − η)⁻¹y_j for the symmetric
// tridiagonal T with diagonal d and off-diagonal e, by Gaussian
// elimination with partial pivoting in complex arithmetic (cw: scratch of
// length 6N, piv of length N).
func greenAt2(d, e, y0, y1 []float64, eta complex128, cw []complex128, piv []bool) (g00, g01, g11 complex128) {
	N := len(d)
	dl, dd, du, du2, x0, x1 := cw[:N], cw[N:2*N], cw[2*N:3*N], cw[3*N:4*N], cw[4*N:5*N], cw[5*N:6*N]
	for i := range N {
		dd[i] = complex(d[i], 0) - eta
		if i < N-1 {
			dl[i], du[i] = complex(e[i], 0), complex(e[i], 0)
		}
		du2[i] = 0
		piv[i] = false
		x0[i], x1[i] = complex(y0[i], 0), complex(y1[i], 0)
	}
	tiny := complex(unit*(1+cmplx.Abs(eta)), 0)
	for i := 0; i < N-1; i++ {
		if cabs1(dd[i]) >= cabs1(dl[i]) {
			if dd[i] == 0 {
				dd[i] = tiny
			}
			l := dl[i] / dd[i]
			dl[i] = l
			dd[i+1] -= l * du[i]
		} else {
			l := dd[i] / dl[i]
			dd[i] = dl[i]
			dl[i] = l
			t := du[i]
			du[i] = dd[i+1]
			dd[i+1] = t - l*dd[i+1]
			if i < N-2 {
				du2[i] = du[i+1]
				du[i+1] = -l * du[i+1]
			}
			piv[i] = true
		}
	}
	if dd[N-1] == 0 {
		dd[N-1] = tiny
	}
	for _, x := range [2][]complex128{x0, x1} {
		for i := 0; i < N-1; i++ {
			if piv[i] {
				x[i], x[i+1] = x[i+1], x[i]-dl[i]*x[i+1]
			} else {
				x[i+1] -= dl[i] * x[i]
			}
		}
		for i := N - 1; i >= 0; i-- {
			s := x[i]
			if i+1 < N {
				s -= du[i] * x[i+1]
			}
			if i+2 < N {
				s -= du2[i] * x[i+2]
			}
			x[i] = s / dd[i]
		}
	}
	for i := range N {
		g00 += complex(y0[i], 0) * x0[i]
		g01 += complex(y0[i], 0) * x1[i]
		g11 += complex(y1[i], 0) * x1[i]
	}
	return g00, g01, g11
}

// cabs1 is |Re z| + |Im z|, the pivoting measure.
func cabs1(z complex128) float64 { return math.Abs(real(z)) + math.Abs(imag(z)) }

// zshot carries a solution of the untilted equation at complex energy eta
// across segs, forwards (dir = +1) or backwards (dir = −1), from the state
// (u, w) scaled by e^lg; the state is renormalized at every layer.
func zshot(segs []seg, eta complex128, dir int, u, w complex128, lg float64) (complex128, complex128, float64) {
	n := len(segs)
	for i := range n {
		s := &segs[i]
		if dir < 0 {
			s = &segs[n-1-i]
		}
		q := complex(math.Pi*math.Pi*s.mu, 0) * (complex(s.v, 0) - eta)
		r := cmplx.Sqrt(q)
		t := r * complex(s.w, 0)
		var c, sh, qs complex128
		switch {
		case real(t) > 1:
			// Scaled by e^(−t): cosh and sinh(t)/r are even in r, so the
			// branch of the root does not matter.
			e := cmplx.Exp(-2 * t)
			c, sh, qs = (1+e)/2, (1-e)/(2*r), r*(1-e)/2
			lg += real(t)
		case cmplx.Abs(t) < 1e-8:
			c, sh, qs = 1, complex(s.w, 0), q*complex(s.w, 0)
		default:
			c, sh, qs = cmplx.Cosh(t), cmplx.Sinh(t)/r, r*cmplx.Sinh(t)
		}
		mu := complex(s.mu, 0)
		if dir < 0 {
			sh, qs = -sh, -qs
		}
		u, w = c*u+mu*sh*w, qs/mu*u+c*w
		if m := max(cabs1(u), cabs1(w)); m > 0 {
			u, w = u/complex(m, 0), w/complex(m, 0)
			lg += math.Log(m)
		}
	}
	return u, w, lg
}

// green0 returns the untilted box's Green's function at the outer
// interfaces, −π²φ_a(x_<)φ_b(x_>)/(φ_a w_b − φ_b w_a).
func (fw *fwork) green0(z complex128) (g00, g01, g11 complex128) {
	segs := fw.segs
	a0u, a0w, la0 := zshot(segs[:fw.i0], z, 1, 0, 1, 0)
	a1u, _, la1 := zshot(segs[fw.i0:fw.i1], z, 1, a0u, a0w, la0)
	b1u, b1w, lb1 := zshot(segs[fw.i1:], z, -1, 0, 1, 0)
	b0u, b0w, lb0 := zshot(segs[fw.i0:fw.i1], z, -1, b1u, b1w, lb1)
	wr := a0u*b0w - b0u*a0w // the Wronskian at x₀, scaled by e^(la0+lb0)
	p := complex(-math.Pi*math.Pi, 0) / wr
	g00 = p * a0u * b0u
	g01 = p * a0u * b1u * complex(math.Exp(lb1-lb0), 0)
	g11 = p * a1u * b1u * complex(math.Exp(la1+lb1-la0-lb0), 0)
	return g00, g01, g11
}

// side is one outer layer as the wall equation needs it.
type side struct {
	f, mu, edge, d float64 // field, mass ratio, band edge at the interface (with the field), wall depth
	s              float64 // (π²μf)^(1/3)
	downhill       bool
}

// dReal returns D at the real level eta (for the downhill side that of
// the bound-like Bi), and for the downhill side under a field ln Q,
// χ = ∂ln Γ/∂η and ε = Ai/Bi at the interface. ok is false where an
// Airy argument is below airy.MinZ or the level is not below the band
// edge at the interface.
func (o *side) dReal(eta float64) (d, lnQ, chi, eps float64, ok bool) {
	delta := o.edge - eta
	if !(delta > 0) {
		return 0, 0, 0, 0, false
	}
	if o.f == 0 {
		k := math.Pi * math.Sqrt(o.mu*delta)
		return 2 * k / (o.mu * math.Expm1(2*k*o.d)), math.Inf(-1), 0, 0, true
	}
	zi := o.s * delta / o.f
	pre := o.s / (math.Pi * o.mu)
	if !o.downhill {
		zb := o.s * (delta + o.f*o.d) / o.f
		ai1, _, bi1, _, zeta1 := airy.Scaled(zi)
		aib, _, bib, _, zetab := airy.Scaled(zb)
		r := math.Exp(-2 * (zetab - zeta1))
		return pre * aib * r / (ai1 * (bib*ai1 - aib*bi1*r)), math.Inf(-1), 0, 0, true
	}
	za := o.s * (delta - o.f*o.d) / o.f
	if !(za >= airy.MinZ) {
		return 0, 0, 0, 0, false
	}
	ai0, _, bi0, bip0, zeta0 := airy.Scaled(zi)
	aia, _, bia, _, zetaa := airy.Scaled(za)
	r := math.Exp(2 * (zetaa - zeta0))
	d = pre * bia * r / ((aia*bi0 - bia*ai0*r) * bi0)
	lnQ = math.Log(pre) - 2*(math.Log(bi0)+zeta0)
	return d, lnQ, 2 * (o.s / o.f) * bip0 / bi0, ai0 / bi0 * math.Exp(-2*zeta0), true
}

// maxComplexZ bounds the Airy arguments of the complex wall equation
// (airy.Complex sums its series there without allocating; beyond,
// Γ < e^(−(4/3)·6^(3/2)) ≈ 3e-9 relative and the first-order width is
// exact to rounding).
const maxComplexZ = airy.MaxComplex

// dComplex returns D at a complex level: the outgoing wave on the
// downhill side, the decaying Ai on the other. Beyond maxComplexZ (an
// uphill wall deep in its barrier) it continues the real D from Re η
// (dUphillTaylor).
func (o *side) dComplex(eta complex128) complex128 {
	if o.f == 0 {
		k := cmplx.Sqrt(complex(math.Pi*math.Pi*o.mu, 0) * (complex(o.edge, 0) - eta))
		return 2 * k / (complex(o.mu, 0) * (cmplx.Exp(2*k*complex(o.d, 0)) - 1))
	}
	zi := complex(o.s/o.f, 0) * (complex(o.edge, 0) - eta)
	pre := complex(o.s/(math.Pi*o.mu), 0)
	if !o.downhill {
		zb := zi + complex(o.s*o.d, 0)
		if cmplx.Abs(zb) > maxComplexZ {
			return o.dUphillTaylor(eta)
		}
		ai1, _, bi1, _ := airy.Complex(zi)
		aib, _, bib, _ := airy.Complex(zb)
		return pre * aib / (ai1 * (bib*ai1 - aib*bi1))
	}
	za := zi - complex(o.s*o.d, 0)
	ai0, _, bi0, _ := airy.Complex(zi)
	aia, _, bia, _ := airy.Complex(za)
	return pre * (bia + 1i*aia) / ((aia*bi0 - bia*ai0) * (bi0 + 1i*ai0))
}

// dUphillTaylor returns the uphill D at a complex level whose wall is
// beyond maxComplexZ, from the real D about Re η: ln D is analytic and
// slowly curved there (ln D ≈ −2(ζ_b − ζ₁) + ln(prefactor), ζ = (2/3)z^(3/2)
// with z linear in η), so its Taylor series in iy = i Im η to third order,
// with the derivatives from central differences of the real D, carries
// the η-dependence of D into the complex root. The real value alone
// shifts a level of width Γ by about ψ(x₁)²|∂D/∂η|Γ/2π², an error that
// does not fall with the basis size: against exact.Solver it left Γ ≈ 0.1
// off by 1e-9 (well (20, 1), f = 10, n = 4) and η by 1.6e-10 (well
// (20, 1.5), f = 3, n = 5) at N = 500, where both errors now fall as N⁻³,
// to 1.6e-10 and 1.4e-11.
func (o *side) dUphillTaylor(eta complex128) complex128 {
	x, y := real(eta), imag(eta)
	d0, _, _, _, ok := o.dReal(x)
	if !ok || d0 == 0 || y == 0 {
		return complex(d0, 0)
	}
	// The Airy variable moves by s/f per unit of η: the step is a small
	// fraction of that scale, and of the distance to the band edge.
	h := min(0.01*o.f/o.s, 0.05*(o.edge-x))
	var l [5]float64
	for i := range l {
		di, _, _, _, ok := o.dReal(x + float64(i-2)*h)
		if !ok || !(di*d0 > 0) {
			return complex(d0, 0)
		}
		l[i] = math.Log(math.Abs(di))
	}
	l1 := (l[3] - l[1]) / (2 * h)
	l2 := (l[3] - 2*l[2] + l[1]) / (h * h)
	l3 := (l[4] - 2*l[3] + 2*l[1] - l[0]) / (2 * h * h * h)
	// ln D(x + iy) − ln D(x) = iy L₁ − y²L₂/2 − iy³L₃/6 + …
	return complex(d0, 0) * cmplx.Exp(complex(-y*y*l2/2, y*l1-y*y*y*l3/6))
}

// wallLevel is the level of one Ritz pair with the walls removed.
type wallLevel struct {
	eta      float64 // the level η_r
	gamma    float64
	errEta   float64 // the iteration's noise and the neglected orders of a narrow width
	errGamma float64 // Γ's relative error from the same
	chi      float64 // ∂ ln Γ/∂η
	complex  bool    // Γ from the complex root (not the first-order width)
}

// walls2 solves the wall equation for the Ritz value theta (an eigenvalue
// of T) whose Ritz function is v0, v1 at the interfaces, left and right
// the outer sides. It reports false if Newton's method leaves the
// neighbourhood of theta (half the distance gap to the nearest other
// Ritz value) or an Airy argument leaves its range.
func (fw *fwork) walls2(left, right *side, d, e, y0, y1 []float64, theta, v0, v1, gap float64) (wallLevel, bool) {
	var out wallLevel
	N := len(d)
	ns := len(fw.segs)
	fw.cw = grow(fw.cw, 6*N)
	fw.piv = grow(fw.piv, N)
	// The part of G beyond the basis at zeroth order in the tilt, smooth
	// near the level (its poles are the box levels beyond the basis): it
	// is formed at two points off the real axis, clear of the box levels
	// inside the basis, and extrapolated back.
	tail := func(z complex128) (t00, t01, t11 complex128) {
		t00, t01, t11 = fw.green0(z)
		for m := range N {
			p, q := fw.ends[m*(ns+1)+fw.i0], fw.ends[m*(ns+1)+fw.i1]
			den := complex(fw.e[m], 0) - z
			t00 -= complex(p*p, 0) / den
			t01 -= complex(p*q, 0) / den
			t11 -= complex(q*q, 0) / den
		}
		return t00, t01, t11
	}
	delta := complex(0, min(gap, 1)/4)
	pv := [2]complex128{complex(v0, 0), complex(v1, 0)}
	// rhs returns θ − η's model, vᵀD̃(I − SD̃)⁻¹v, and x = (I − SD̃)⁻¹v.
	// S is smooth through θ but formed as G less the pole, and the pole
	// of the computed G lies within about u‖T‖ of θ: near θ, S is taken
	// at η + iδ (its change, about δ/gap², moves η by |θ − η|² times as
	// much, and stays smooth in η).
	sepS := 1e-6 * max(1, math.Abs(theta))
	rhs := func(eta, d0, d1 complex128) (complex128, [2]complex128) {
		zs := eta
		if cmplx.Abs(zs-complex(theta, 0)) < 10*sepS {
			zs += complex(0, sepS)
		}
		g00, g01, g11 := greenAt2(d, e, y0, y1, zs, fw.cw, fw.piv)
		a00, a01, a11 := tail(zs + delta)
		b00, b01, b11 := tail(zs + 2*delta)
		den := complex(theta, 0) - zs
		s00 := g00 + 2*a00 - b00 - pv[0]*pv[0]/den
		s01 := g01 + 2*a01 - b01 - pv[0]*pv[1]/den
		s11 := g11 + 2*a11 - b11 - pv[1]*pv[1]/den
		pp := complex(math.Pi*math.Pi, 0)
		e0, e1 := d0/pp, d1/pp
		// A = I − S diag(e0, e1).
		m00, m01, m10, m11 := 1-s00*e0, -s01*e1, -s01*e0, 1-s11*e1
		det := m00*m11 - m01*m10
		x := [2]complex128{(m11*pv[0] - m01*pv[1]) / det, (m00*pv[1] - m10*pv[0]) / det}
		return e0*pv[0]*x[0] + e1*pv[1]*x[1], x
	}
	// The real problem (the bound-like Bi on the downhill side), by
	// Newton's method from the Ritz value with a difference quotient;
	// 1/G carries rounding of about u‖T‖, so the iteration ends when the
	// step stops shrinking at the level of that noise, which is added to
	// the error.
	hreal := func(eta float64) (float64, [2]complex128, bool) {
		d0, _, _, _, ok0 := left.dReal(eta)
		d1, _, _, _, ok1 := right.dReal(eta)
		if !ok0 || !ok1 {
			return 0, [2]complex128{}, false
		}
		r, x := rhs(complex(eta, 0), complex(d0, 0), complex(d1, 0))
		return eta - theta + real(r), x, true
	}
	eta := theta
	var noise, hd float64
	prev := math.Inf(1)
	conv := false
	for range 60 {
		h0, _, ok := hreal(eta)
		hs := 1e-7 * max(1, math.Abs(eta))
		hp, _, ok1 := hreal(eta + hs)
		hm, _, ok2 := hreal(eta - hs)
		if !ok || !ok1 || !ok2 || hp == hm {
			return out, false
		}
		hd = (hp - hm) / (2 * hs)
		step := h0 / hd
		eta -= step
		if !(math.Abs(eta-theta) < gap/2) {
			return out, false
		}
		a := math.Abs(step)
		if a <= 32*unit*max(1, math.Abs(eta)) || (a < 1e-10*max(1, math.Abs(eta)) && a > prev/4) {
			noise = 2 * a
			conv = true
			break
		}
		prev = a
	}
	if !conv {
		return out, false
	}
	out.eta, out.errEta = eta, noise
	if left.f == 0 || !left.downhill {
		return out, true
	}
	_, lnQ, chi, eps, ok := left.dReal(eta)
	_, x, ok1 := hreal(eta)
	if !ok || !ok1 || x[0] == 0 {
		return out, false
	}
	// ∂η/∂D̃₀ = −x₀²/h′(η) along the root of h(η) = η − θ + vᵀD̃(I − SD̃)⁻¹v.
	if !(hd > 0) {
		return out, false
	}
	out.gamma = math.Exp(math.Log(2/(math.Pi*math.Pi)) + lnQ + 2*math.Log(cmplx.Abs(x[0])) - math.Log(hd))
	out.chi = chi
	hw := out.gamma / 2
	second := hw * hw * (math.Abs(chi) + 1/gap)
	narrow := out
	narrow.eta = eta - chi*hw*hw - eps*hw
	narrow.errEta += second
	narrow.errGamma = hw*math.Abs(chi)*(eps+hw*math.Abs(chi)) + 1e-13
	if second <= 1e-15*max(1, math.Abs(eta)) || left.s*(left.edge-eta)/left.f > maxComplexZ {
		return narrow, true
	}
	// A broad level: the complex root, from η_p − iΓ/2.
	hc := func(z complex128) complex128 {
		r, _ := rhs(z, left.dComplex(z), right.dComplex(z))
		return z - complex(theta, 0) + r
	}
	ec := complex(narrow.eta, -hw)
	conv = false
	prev = math.Inf(1)
	for range 60 {
		hs := complex(1e-7*max(hw, 1e-6), 0)
		f := hc(ec)
		fp := (hc(ec+hs) - hc(ec-hs)) / (2 * hs)
		step := f / fp
		ec -= step
		if cmplx.IsNaN(ec) || !(cmplx.Abs(ec-complex(theta, 0)) < gap/2) {
			return narrow, true
		}
		a := cmplx.Abs(step)
		if a <= 32*unit*max(1, cmplx.Abs(ec)) || (a < 1e-10*max(1, cmplx.Abs(ec)) && a > prev/4) {
			noise = 2 * a
			conv = true
			break
		}
		prev = a
	}
	if !conv || !(imag(ec) < 0) {
		return narrow, true
	}
	out.eta, out.gamma, out.complex = real(ec), -2*imag(ec), true
	out.errEta = noise
	out.errGamma = 2 * noise / out.gamma
	return out, true
}
