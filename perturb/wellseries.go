package perturb

import (
	"math"
	"sync"

	"gonum.org/v1/gonum/integrate/quad"

	"github.com/tiltwell/tiltwell/internal/squarewell"
)

// The Rayleigh–Schrödinger series of one level of the finite well,
//
//	η_n(f) = η₀ + E₁ f + E₂ f² + … + E_J f^J + O(f^(J+1)),
//
// solved in closed form piece by piece (see the package documentation,
// section "Finite wells"). Every order ψ_j of the wavefunction is, with
// x = ξ in the left barrier, u = ξ − ½ in the well and y = ξ − 1 in the
// right barrier,
//
//	ψ_j = L_j(x) e^(κ_L x)                      ξ < 0
//	ψ_j = P_j(u) cos θ + Q_j(u) sin θ,  θ = ku + θ₀,   0 ≤ ξ ≤ 1
//	ψ_j = R_j(y) e^(−κ_R y)                     ξ > 1
//
// with polynomials L_j, P_j, Q_j, R_j of degree at most 2j, θ₀ = k/2 + δ_L
// and ψ₀ the zero-field state of [squarewell] with B = 1. The recursion is
// that of series.go (intermediate normalisation ⟨ψ₀|ψ_j⟩ = 0 for j ≥ 1,
// N₀ = ⟨ψ₀|ψ₀⟩):
//
//	E_j = ⟨ψ₀|V|ψ_(j−1)⟩ / N₀,
//	(H₀ − η₀) ψ_j = −V ψ_(j−1) + Σ_(i=1..j) E_i ψ_(j−i),   V = ξ − ½,
//
// solved in each layer (μ constant there) as
//
//	well:      ψ″ + k² ψ = π² (V ψ_(j−1) − Σ E_i ψ_(j−i))
//	barriers:  ψ″ − κ² ψ = π² μ (V ψ_(j−1) − Σ E_i ψ_(j−i)),
//
// each particular solution a polynomial times the layer's own function:
// in the well P″ + 2kQ′ = A, Q″ − 2kP′ = B for a right-hand side
// A cos θ + B sin θ (as in series.go); in the left barrier, with
// right-hand side S(x) e^(κx), L″ + 2κL′ = S, so
// L′ = Σ_m (−1)^m S^(m)/(2κ)^(m+1); in the right barrier, with
// S(y) e^(−κy), R″ − 2κR′ = S, so R′ = −Σ_m S^(m)/(2κ)^(m+1). Only the
// decaying exponential is allowed in each barrier. The constant of L is
// set to 0, and cos θ, sin θ are added in the well to match ψ and
// (1/μ) dψ/dξ at ξ = 0 (BenDaniel–Duke); the constant of R then matches
// ψ at ξ = 1, and (1/μ) dψ/dξ at ξ = 1 matches by the choice of E_j (the
// solvability condition; its residual is kept as a check). Last, the
// multiple of ψ₀ that makes ⟨ψ₀|ψ_j⟩ = 0 is removed. Inner products are
// closed forms in the barriers (∫₋∞⁰ g e^(λx) dx = Σ_m (−1)^m g^(m)(0)/λ^(m+1))
// and, in the well, repeated integration by parts when the wave number is
// large enough for it to be well conditioned, Gauss–Legendre quadrature
// otherwise.

// wellOrder is J, the highest order of the finite-well series.
const wellOrder = 10

// wellGeom is the zero-field data of one bound level that the series needs.
type wellGeom struct {
	n        int
	eta0, k  float64 // η₀ and k = π√η₀
	kl, kr   float64 // κ_L, κ_R
	ml, mr   float64 // μ_L, μ_R
	sl, cl   float64 // sin, cos of θ at ξ = 0 (δ_L)
	s1, c1   float64 // sin, cos of θ at ξ = 1 (nπ − δ_R)
	th0      float64 // θ at ξ = ½
	s2l, c2l float64 // sin, cos of 2θ at ξ = 0
	s2r, c2r float64 // sin, cos of 2θ at ξ = 1
	dl, dr   float64 // δ_L, δ_R
	n0       float64 // N₀ = ⟨ψ₀|ψ₀⟩
	state    squarewell.State
	vl, vr   float64 // barrier heights
	// tabs holds the tables of the integrals, built on first use by the
	// series (nil until then, and dropped after it).
	tabs *intTables
}

// maxProd is the largest degree of a product of two pieces' polynomials
// with V, 2·(2J) + 1, plus one.
const maxProd = 4*wellOrder + 2

// intTables holds what the inner products of one level need: the barrier
// moments tL[m] = ∫₋∞⁰ x^m e^(2κ_L x) dx = (−1)^m m!/(2κ_L)^(m+1) and
// tR[m] = ∫₀^∞ y^m e^(−2κ_R y) dy = m!/(2κ_R)^(m+1); and, when the well's
// integrals are done by quadrature (quad), sin θ and cos θ at the nodes.
type intTables struct {
	tL, tR [maxProd + 1]float64
	quad   bool
	rule   int // index in glRules
	sn, cs []float64
}

// newWellGeom returns the geometry of level n of w.
func newWellGeom(w squarewell.Well, n int) (wellGeom, error) {
	st, err := w.State(n)
	if err != nil {
		return wellGeom{}, err
	}
	k := st.K
	dl, dr, _, _ := w.Phase(k)
	sgn := 1.0 // (−1)^(n+1)
	if n%2 == 0 {
		sgn = -1
	}
	g := wellGeom{
		n: n, eta0: st.Eta, k: k, kl: st.KL, kr: st.KR, ml: w.ML, mr: w.MR,
		dl: dl, dr: dr, vl: w.VL, vr: w.VR, state: st,
	}
	g.sl, g.cl = math.Sincos(dl)
	sr, cr := math.Sincos(dr)
	g.s1, g.c1 = sgn*sr, -sgn*cr
	g.th0 = k/2 + dl
	g.s2l, g.c2l = math.Sincos(2 * dl)
	s2, c2 := math.Sincos(2 * dr)
	g.s2r, g.c2r = -s2, c2
	g.n0 = 1 / (st.B * st.B)
	return g, nil
}

// pieces is a function on the whole line in the closed form above, with,
// once it is finished, its well piece at the quadrature nodes (nv, nil
// when the closed forms are used).
type pieces struct {
	L, P, Q, R poly
	nv         []float64
}

// wellSeries is the result of the recursion for one level.
type wellSeries struct {
	// E[j] is E_j, j = 1…J (E[0] unused); orders beyond order are 0.
	E [wellOrder + 1]float64
	// dE[j] is the rounding allowance of E_j: 4ε times ∫|ψ₀ V ψ_(j−1)|
	// over N₀, the size of the integrand of its projection. The true
	// rounding error was measured 40 to 4000 times smaller at high orders
	// (levels 1 to 1000 of a well with v = 1e20 against the infinite-well
	// series), and about as large at first order (the odd orders of
	// symmetric wells, TestWellSeriesSymmetric), so the allowance matters
	// only where cancellation is severe: the top orders of levels above
	// about n = 50.
	dE [wellOrder + 1]float64
	// order is the highest order computed with finite values (J unless
	// the arithmetic overflowed, for extremely shallow wells).
	order int
	// psi are ψ₀ … ψ_order.
	psi []pieces
	// resid is the largest relative residual of the solvability condition.
	resid float64
}

// mul returns a·b.
func mul(a, b poly) poly {
	if len(a) == 0 || len(b) == 0 {
		return nil
	}
	d := make(poly, len(a)+len(b)-1)
	for i, x := range a {
		for j, y := range b {
			d[i+j] += x * y
		}
	}
	return d
}

// shiftMul returns (t + c)·p: the potential V = t + c in a layer's own
// variable t times p.
func shiftMul(p poly, c float64) poly { return axpy(c, p, p.mulU()) }

// at returns p(0) (0 for the empty polynomial).
func at0(p poly) float64 {
	if len(p) == 0 {
		return 0
	}
	return p[0]
}

// addConst adds c to the constant term of *p.
func addConst(p *poly, c float64) {
	if len(*p) == 0 {
		*p = poly{c}
		return
	}
	(*p)[0] += c
}

// glRules are the Gauss–Legendre rules on [−½, ½] of glSizes points used
// for the well's integrals when the closed form is ill-conditioned. They
// must not be modified.
var (
	glSizes = [...]int{48, 96}
	glRules = sync.OnceValue(func() (r [len(glSizes)]struct{ x, w []float64 }) {
		for i, n := range glSizes {
			r[i].x, r[i].w = make([]float64, n), make([]float64, n)
			quad.Legendre{}.FixedLocations(r[i].x, r[i].w, -0.5, 0.5)
		}
		return r
	})
)

// trigInt returns ∫_(−½)^(½) g(u) cos 2θ du and ∫ g(u) sin 2θ du,
// 2θ = Ku + 2θ₀, K = 2k, by integration by parts,
//
//	∫ g cos t du = [Σ_m g^(m) sin(t + mπ/2) / K^(m+1)],
//	∫ g sin t du = −[Σ_m g^(m) cos(t + mπ/2) / K^(m+1)].
//
// With K above twice the degree the terms shrink geometrically and the sum
// is well conditioned; inner uses it only there.
func (g *wellGeom) trigInt(p poly) (ic, is float64) {
	K := 2 * g.k
	sinT := [2]float64{g.s2l, g.s2r}
	cosT := [2]float64{g.c2l, g.c2r}
	var res [2][2]float64 // [end][cos, sin]
	for e, u := range [2]float64{-0.5, 0.5} {
		d := p
		kp := K
		for m := 0; len(d) > 0; m++ {
			v := d.eval(u) / kp
			var sm, cm float64 // sin(t + mπ/2), cos(t + mπ/2)
			switch m % 4 {
			case 0:
				sm, cm = sinT[e], cosT[e]
			case 1:
				sm, cm = cosT[e], -sinT[e]
			case 2:
				sm, cm = -sinT[e], -cosT[e]
			case 3:
				sm, cm = -cosT[e], sinT[e]
			}
			res[e][0] += v * sm
			res[e][1] -= v * cm
			d = d.deriv()
			kp *= K
		}
	}
	return res[1][0] - res[0][0], res[1][1] - res[0][1]
}

// tables returns the integral tables of g, building them on first use.
func (g *wellGeom) tables() *intTables {
	if g.tabs != nil {
		return g.tabs
	}
	t := new(intTables)
	ll, lr := 1/(2*g.kl), 1/(2*g.kr)
	t.tL[0], t.tR[0] = ll, lr
	for m := 1; m <= maxProd; m++ {
		t.tL[m] = -t.tL[m-1] * float64(m) * ll
		t.tR[m] = t.tR[m-1] * float64(m) * lr
	}
	// The rule has at least 12 + (maxProd + 2k)/2 points: the integrand
	// is a polynomial of degree ≤ maxProd times a trigonometric function
	// of frequency 2k, and the rule's error beyond the polynomial part,
	// of the order of (k/2)^(2N)/(2N)! (DLMF 3.5.19 with the derivatives
	// of e^(2iku)), is below rounding.
	if K := 2 * g.k; K <= 2*float64(maxProd+1) {
		t.quad = true
		for i, n := range glSizes {
			t.rule = i
			if float64(n) >= 12+(maxProd+K)/2 {
				break
			}
		}
		rules := glRules()
		r := &rules[t.rule]
		t.sn, t.cs = make([]float64, len(r.x)), make([]float64, len(r.x))
		for i, u := range r.x {
			t.sn[i], t.cs[i] = math.Sincos(g.k*u + g.th0)
		}
	}
	g.tabs = t
	return t
}

// nodeValues returns the well piece of p at the quadrature nodes: its
// cache if set, else computed into buf.
func (g *wellGeom) nodeValues(p *pieces, buf []float64) []float64 {
	if p.nv != nil {
		return p.nv
	}
	t := g.tables()
	x := glRules()[t.rule].x
	for i, u := range x {
		buf[i] = p.P.eval(u)*t.cs[i] + p.Q.eval(u)*t.sn[i]
	}
	return buf
}

// fix caches the node values of a finished piece.
func (g *wellGeom) fix(p *pieces) {
	if t := g.tables(); t.quad {
		p.nv = g.nodeValues(p, make([]float64, glSizes[t.rule]))
	}
}

// inner returns ⟨a|b⟩, or ⟨a|V|b⟩ with V = ξ − ½ if withV, over the line:
// the barrier integrals from the moment tables, and the well's either by
// the closed form of trigInt (for 2k above twice the largest degree of the
// products, where it is well conditioned) or by the Gauss–Legendre rule
// of the tables applied to ψ_a ψ_b (exact to rounding there).
func (g *wellGeom) inner(a, b *pieces, withV bool) float64 {
	t := g.tables()
	var s float64
	for i, x := range a.L {
		for j, y := range b.L {
			if c := x * y; c != 0 {
				if withV {
					s += c * (t.tL[i+j+1] - 0.5*t.tL[i+j])
				} else {
					s += c * t.tL[i+j]
				}
			}
		}
	}
	for i, x := range a.R {
		for j, y := range b.R {
			if c := x * y; c != 0 {
				if withV {
					s += c * (t.tR[i+j+1] + 0.5*t.tR[i+j])
				} else {
					s += c * t.tR[i+j]
				}
			}
		}
	}
	if !t.quad {
		pa, qa := a.P, a.Q
		if withV {
			pa, qa = pa.mulU(), qa.mulU()
		}
		pp, qq := mul(pa, b.P), mul(qa, b.Q)
		pq := axpy(1, mul(pa, b.Q), mul(qa, b.P))
		ic, _ := g.trigInt(axpy(-1, qq, pp))
		_, is := g.trigInt(pq)
		return s + 0.5*intOne(axpy(1, pp, qq)) + 0.5*ic + 0.5*is
	}
	var bufA, bufB [96]float64
	va, vb := g.nodeValues(a, bufA[:]), g.nodeValues(b, bufB[:])
	rules := glRules()
	r := &rules[t.rule]
	for i, w := range r.w {
		if withV {
			w *= r.x[i]
		}
		s += w * va[i] * vb[i]
	}
	return s
}

// absProjection returns a bound on ∫|ψ₀ V p| over the line.
func (g *wellGeom) absProjection(p *pieces) float64 {
	t := g.tables()
	s := 0.5 * (polyMag(p.P) + polyMag(p.Q))
	var l, r float64
	for i, c := range p.L {
		l += math.Abs(c) * (math.Abs(t.tL[i+1]) + 0.5*math.Abs(t.tL[i]))
	}
	for i, c := range p.R {
		r += math.Abs(c) * (t.tR[i+1] + 0.5*t.tR[i])
	}
	return s + math.Abs(g.sl)*l + math.Abs(g.s1)*r
}

// polyMag returns Σ |p_i| 2^(−i), a bound on |p(u)| for |u| ≤ ½.
func polyMag(p poly) float64 {
	s, x := 0.0, 1.0
	for _, c := range p {
		s += math.Abs(c) * x
		x /= 2
	}
	return s
}

// psi0 returns ψ₀ with B = 1.
func (g *wellGeom) psi0() pieces {
	return pieces{L: poly{g.sl}, Q: poly{1}, R: poly{g.s1}}
}

// wellAt returns ψ and dψ/dξ of the well piece at u.
func (g *wellGeom) wellAt(p *pieces, u, s, c float64) (v, d float64) {
	P, dP := evalD(p.P, u)
	Q, dQ := evalD(p.Q, u)
	return P*c + Q*s, (dP+g.k*Q)*c + (dQ-g.k*P)*s
}

// evalD returns p(u) and p′(u) (Horner).
func evalD(p poly, u float64) (v, d float64) {
	for i := len(p) - 1; i >= 0; i-- {
		d = d*u + v
		v = v*u + p[i]
	}
	return v, d
}

// solveWell returns the particular polynomials P, Q with P(0) = Q(0) = 0
// of ψ″ + k²ψ = A cos θ + B sin θ (series.go).
func (g *wellGeom) solveWell(A, B poly) (P, Q poly) {
	k := g.k
	inv4k2 := 1 / (4 * k * k)
	// q = Σ_m (−1/(4k²))^m D^(2m) (A/(2k) + B′/(4k²)), in place.
	q := make(poly, max(len(A), len(B)-1))
	addTo(&q, 1/(2*k), A)
	addTo(&q, inv4k2, B.deriv())
	buf := make(poly, len(q))
	d := q
	scale := 1.0
	for len(d) > 2 {
		d = derivInto(buf, derivInto(buf, d))
		scale *= -inv4k2
		addTo(&q, scale, d)
	}
	pp := make(poly, max(len(q)-1, len(B)))
	addTo(&pp, 1/(2*k), q.deriv())
	addTo(&pp, -1/(2*k), B)
	return pp.integ(), q.integ()
}

// solveBarrier returns the particular polynomial p with p(0) = 0 of
// p″ + 2σκ p′ = S: the barrier solution p e^(σκt), σ = +1 on the left
// (t = x) and −1 on the right (t = y).
func solveBarrier(S poly, kappa, sigma float64) poly {
	// q′ + 2σκ q = S:  q = Σ_m (−σ)^m S^(m) / (2κ)^(m+1) · σ.
	q := make(poly, len(S))
	buf := make(poly, len(S))
	t := sigma / (2 * kappa)
	for d := S; len(d) > 0; d = derivInto(buf, d) {
		addTo(&q, t, d)
		t *= -sigma / (2 * kappa)
	}
	return q.integ()
}

// addTo adds a·x to *dst, growing it to the length of x if needed.
func addTo(dst *poly, a float64, x poly) {
	if len(x) > len(*dst) {
		*dst = append(*dst, make(poly, len(x)-len(*dst))...)
	}
	d := *dst
	for i, c := range x {
		d[i] = a*c + d[i]
	}
}

// derivInto writes p′ into buf (which may be p itself) and returns it.
func derivInto(buf, p poly) poly {
	if len(p) <= 1 {
		return buf[:0]
	}
	for i := 1; i < len(p); i++ {
		buf[i-1] = float64(i) * p[i]
	}
	return buf[:len(p)-1]
}

// scalePoly multiplies p by a in place.
func scalePoly(p poly, a float64) {
	for i := range p {
		p[i] *= a
	}
}

// finite reports whether every coefficient of p is finite.
func finitePoly(p poly) bool {
	for _, c := range p {
		if math.IsNaN(c) || math.IsInf(c, 0) {
			return false
		}
	}
	return true
}

// series runs the recursion to order J.
func (g *wellGeom) series() wellSeries {
	var ws wellSeries
	p0 := g.psi0()
	g.fix(&p0)
	ws.psi = []pieces{p0}
	pi2 := math.Pi * math.Pi
	for j := 1; j <= wellOrder; j++ {
		prev := &ws.psi[j-1]
		ej := g.inner(&p0, prev, true) / g.n0
		if math.IsNaN(ej) || math.IsInf(ej, 0) {
			break
		}
		ws.E[j] = ej
		ws.dE[j] = 4 * eps * g.absProjection(prev) / g.n0
		// Right-hand sides V ψ_(j−1) − Σ E_i ψ_(j−i), per layer.
		A, B := prev.P.mulU(), prev.Q.mulU()
		SL, SR := shiftMul(prev.L, -0.5), shiftMul(prev.R, 0.5)
		for i := 1; i <= j; i++ {
			q := &ws.psi[j-i]
			addTo(&A, -ws.E[i], q.P)
			addTo(&B, -ws.E[i], q.Q)
			addTo(&SL, -ws.E[i], q.L)
			addTo(&SR, -ws.E[i], q.R)
		}
		scalePoly(A, pi2)
		scalePoly(B, pi2)
		scalePoly(SL, pi2*g.ml)
		scalePoly(SR, pi2*g.mr)
		var ps pieces
		ps.P, ps.Q = g.solveWell(A, B)
		ps.L = solveBarrier(SL, g.kl, 1)
		ps.R = solveBarrier(SR, g.kr, -1)
		// Match ψ and (1/μ)ψ′ at ξ = 0 with cos θ, sin θ in the well.
		vL := at0(ps.L)
		dL := (at0(ps.L.deriv()) + g.kl*vL) / g.ml
		vw, dw := g.wellAt(&ps, -0.5, g.sl, g.cl)
		a := g.cl*(vL-vw) - g.sl*(dL-dw)/g.k
		b := g.sl*(vL-vw) + g.cl*(dL-dw)/g.k
		addConst(&ps.P, a)
		addConst(&ps.Q, b)
		// Match ψ at ξ = 1 with the constant of R; (1/μ)ψ′ matches by
		// the solvability condition.
		vw1, dw1 := g.wellAt(&ps, 0.5, g.s1, g.c1)
		addConst(&ps.R, vw1-at0(ps.R))
		dR := (at0(ps.R.deriv()) - g.kr*at0(ps.R)) / g.mr
		// The residual is measured against the size of the terms that
		// make up both sides (ψ(1) is formed with cancellation when κ_R
		// is large).
		mag := math.Abs(ps.P.eval(0.5)*g.c1) + math.Abs(ps.Q.eval(0.5)*g.s1)
		scale := math.Abs(dw1) + (math.Abs(at0(ps.R.deriv()))+g.kr*mag)/g.mr
		if scale > 0 {
			ws.resid = math.Max(ws.resid, math.Abs(dR-dw1)/scale)
		}
		// ⟨ψ₀|ψ_j⟩ = 0.
		g.fix(&ps)
		s := g.inner(&p0, &ps, false) / g.n0
		addConst(&ps.L, -s*g.sl)
		addConst(&ps.Q, -s)
		addConst(&ps.R, -s*g.s1)
		for i := range ps.nv {
			ps.nv[i] -= s * p0.nv[i]
		}
		if !(finitePoly(ps.L) && finitePoly(ps.P) && finitePoly(ps.Q) && finitePoly(ps.R)) {
			ws.order = j
			ws.psi = append(ws.psi, pieces{})
			return ws
		}
		ws.psi = append(ws.psi, ps)
		ws.order = j
	}
	return ws
}
