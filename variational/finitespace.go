package variational

import (
	"math"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack"
	"gonum.org/v1/gonum/lapack/gonum"
)

// The trial space of the finite well (family Poly on a finite stack),
// after folding (f ≥ 0: the left barrier is the downhill one).
//
// Only the well is expanded: the space is every
//
//	ψ = u(ξ) e^(−β(ξ−ξr)),  0 ≤ ξ ≤ 1,  u a polynomial of degree ≤ pw+1,
//
// spanned by two interface functions (value 1 at one interface, 0 at the
// other) and pw bubbles ξ(1−ξ)(2ξ−1)^j e^(−β(ξ−ξr)) orthonormalized in the
// well. Each barrier enters through the logarithmic derivative Λ(η) of its
// exact real solution at the interface (finiteairy.go; the decaying
// exponential at f = 0): for that solution
//
//	∫_barrier [(1/(μπ²))ψ′² + (v + f(ξ−½) − η)ψ²] dξ = σ(η) ψ(interface)²,
//	σ = ∓Λ/(μπ²) > 0,
//
// so the Rayleigh quotient of the whole line becomes, for trial functions
// continued into the barriers by those solutions, the quadratic form
// H₀ + σ_L(η)e₀e₀ᵀ + σ_R(η)e₁e₁ᵀ − ηS of the well alone (e₀, e₁ the basis
// values at ξ = 0, 1). A level is a fixed point η = λ_n(η) of its n-th
// eigenvalue. Each σ falls as η rises (the barrier solution penetrates
// further), so λ_n(η) − η falls strictly and has one root per n; the
// matching condition (1/μ)ψ′ continuous (BenDaniel–Duke) is the natural
// boundary condition of the form and need not be imposed.
//
// At f = 0 this is a proven upper bound: with e_n(η) the exact n-th level
// of the operator whose barriers are frozen at σ(η), the Ritz value
// λ_n(η) ≥ e_n(η) (min–max), and e_n(η) − η is decreasing with its root
// at the true level η_n, so the fixed point η₀ of λ_n satisfies
// e_n(η₀) − η₀ ≤ 0, η₀ ≥ η_n. At f > 0 the same argument bounds the level
// of the real problem, whose downhill boundary condition is the real part
// of the outgoing one; the resonance η_r differs from it by the second
// order of the escape term (shift2).
//
// With the Ritz pairs (θ_j, x_j) of (H₀, S) and w_aj = e_aᵀx_j, the
// rank-two update is reduced to the 2×2 matrix (G. H. Golub, SIAM Rev.
// 15, 318 (1973), for the rank-one secular equation)
//
//	T(η) = diag(1/σ_L, 1/σ_R) + W(η),   W_ab = Σ_j w_aj w_bj/(θ_j − η),
//
// a level solves det T = 0, and by the Haynsworth inertia additivity the
// number of eigenvalues of the updated pencil below η is
//
//	N(η) = #{θ_j < η} + #{positive eigenvalues of T(η)} − 2,
//
// which counts the levels below η: the n-th level is where N passes from
// n−1 to n (bisection on N isolates it from the poles θ_j; Newton's
// method on det T finishes it).

// maxWellDim is the largest number of well bubbles.
const maxWellDim = 40

// maxFiniteDim is the largest dimension of a finite-well space.
const maxFiniteDim = 2 + maxWellDim

// fparams are the parameters of a finite-well trial space.
type fparams struct {
	vL, mL, vR, mR float64 // barrier heights (E₁) and mass ratios
	f              float64 // reduced field ≥ 0
	beta           float64 // tilt of the well functions
	pw             int     // number of well bubbles
}

// dim returns the dimension of the space.
func (p fparams) dim() int { return 2 + p.pw }

// ceiling returns the confinement ceiling: the lower of the outer band
// edges at their interfaces, v_L − f/2 and v_R + f/2.
func (p fparams) ceiling() float64 { return min(p.vL-p.f/2, p.vR+p.f/2) }

// fspace is a finite-well trial space tabulated at the nodes of a
// Gauss–Legendre rule, with H₀ and S and their Ritz pairs.
type fspace struct {
	p      fparams
	r      *rule
	wv, wd []float64 // basis values and derivatives, dim blocks of n values
	rec    []float64 // Gram–Schmidt coefficients of the bubbles (pw×pw)
	h, s   []float64 // dim×dim
	scale  []float64 // diagonal scaling of the basis
	vals   []float64 // Ritz values θ_j of (H₀, S), ascending
	vecs   []float64 // dim×dim; column j is x_j (S-orthonormal)
	w0, w1 []float64 // w_0j = ψ_j(0), w_1j = ψ_j(1)
	work   []float64
	sc     []float64 // dim×n scratch for the matrix products
}

func newFspace() *fspace {
	nmax := ruleSizes[len(ruleSizes)-1]
	d := maxFiniteDim
	sp := &fspace{
		wv:    make([]float64, d*nmax),
		wd:    make([]float64, d*nmax),
		rec:   make([]float64, maxWellDim*maxWellDim),
		h:     make([]float64, d*d),
		s:     make([]float64, d*d),
		scale: make([]float64, d),
		vals:  make([]float64, d),
		vecs:  make([]float64, d*d),
		w0:    make([]float64, d),
		w1:    make([]float64, d),
		sc:    make([]float64, d*nmax),
	}
	var wq [1]float64
	gonum.Implementation{}.Dsyev(lapack.EVCompute, blas.Upper, d, sp.vecs, d, sp.vals, wq[:], -1)
	sp.work = make([]float64, max(int(wq[0]), 3*d))
	return sp
}

// build tabulates the space of p with the rule r, fills H₀ and S and
// computes their Ritz pairs. It reports false if the Gram matrix is not
// numerically positive definite or the eigensolver fails.
func (sp *fspace) build(r *rule, p fparams) bool {
	sp.tabulate(r, p)
	sp.matrices()
	return sp.solve()
}

// nested makes sp the space of large with only pw of its bubbles: its
// matrices are the leading blocks of large's (which must be tabulated and
// filled, not yet solved), and it computes their Ritz pairs. It is not
// tabulated: it serves level, not wavefunctions.
func (sp *fspace) nested(large *fspace, pw int) bool {
	sp.p, sp.r = large.p, large.r
	sp.p.pw = pw
	dim, ld := sp.p.dim(), large.p.dim()
	for a := range dim {
		copy(sp.h[a*dim:(a+1)*dim], large.h[a*ld:a*ld+dim])
		copy(sp.s[a*dim:(a+1)*dim], large.s[a*ld:a*ld+dim])
	}
	return sp.solve()
}

// tabulate tabulates the basis of p at the nodes of r: the interface
// functions and the bubbles, the latter by the three-term (Stieltjes)
// recurrence of the polynomials orthogonal under the weight of the first
// bubble, ξ²(1−ξ)²e^(−2β(ξ−ξr)), in the rule's inner product (each new
// bubble orthogonalized against the two before it, twice). Orthogonality
// to the earlier ones is lost only slowly, and the Gram matrix is
// computed in full anyway.
func (sp *fspace) tabulate(r *rule, p fparams) {
	sp.p, sp.r = p, r
	n := r.n
	xr := 0.0
	if p.beta < 0 {
		xr = 1
	}
	// The interface functions (1−ξ)^mL e/e(0) and ξ^mR e/e(1), e the
	// envelope, with the powers (at most pw+1, so that the span is still
	// every polynomial of degree ≤ pw+1 times e) large enough that each
	// peaks at its own interface (d/dξ ln(ξ^m e^(−βξ)) = m/ξ − β ≥ 0 on
	// [0, 1] for m ≥ β); then the bubbles.
	mL, mR := 1, 1
	if p.beta > 1 {
		mR = min(p.pw+1, int(math.Ceil(p.beta)))
	} else if p.beta < -1 {
		mL = min(p.pw+1, int(math.Ceil(-p.beta)))
	}
	e0, e1 := math.Exp(-p.beta*(0-xr)), math.Exp(-p.beta*(1-xr))
	for l, x := range r.x {
		e := math.Exp(-p.beta * (x - xr))
		pl, pr := math.Pow(1-x, float64(mL-1)), math.Pow(x, float64(mR-1))
		sp.wv[l] = (1 - x) * pl * e / e0
		sp.wd[l] = (-float64(mL) - p.beta*(1-x)) * pl * e / e0
		sp.wv[n+l] = x * pr * e / e1
		sp.wd[n+l] = (float64(mR) - p.beta*x) * pr * e / e1
		if p.pw > 0 {
			sp.wv[2*n+l] = x * (1 - x) * e
			sp.wd[2*n+l] = (1 - 2*x - p.beta*x*(1-x)) * e
		}
	}
	rec := sp.rec[:p.pw*p.pw]
	clear(rec)
	if p.pw > 0 {
		rec[0] = sp.normalize(2)
	}
	for j := 1; j < p.pw; j++ {
		a := 2 + j
		pv, pd := sp.wv[(a-1)*n:a*n], sp.wd[(a-1)*n:a*n]
		v, d := sp.wv[a*n:(a+1)*n], sp.wd[a*n:(a+1)*n]
		for l, x := range r.x {
			v[l] = (2*x - 1) * pv[l]
			d[l] = 2*pv[l] + (2*x-1)*pd[l]
		}
		for range 2 {
			for i := max(0, j-2); i < j; i++ {
				qv, qd := sp.wv[(2+i)*n:(3+i)*n], sp.wd[(2+i)*n:(3+i)*n]
				pp := 0.0
				for l, wl := range r.w {
					pp += wl * v[l] * qv[l]
				}
				rec[j*p.pw+i] += pp
				for l := range n {
					v[l] -= pp * qv[l]
					d[l] -= pp * qd[l]
				}
			}
		}
		rec[j*p.pw+j] = sp.normalize(a)
	}
}

// normalize scales basis function a to unit discrete norm and returns the
// norm it had.
func (sp *fspace) normalize(a int) float64 {
	n := sp.r.n
	v, d := sp.wv[a*n:(a+1)*n], sp.wd[a*n:(a+1)*n]
	nn := 0.0
	for l, wl := range sp.r.w {
		nn += wl * v[l] * v[l]
	}
	norm := math.Sqrt(nn)
	for l := range n {
		v[l] /= norm
		d[l] /= norm
	}
	return norm
}

// matrices fills H₀_ab = ∫₀¹ (ψ_a′ψ_b′/π² + f(ξ−½)ψ_aψ_b) dξ and
// S_ab = ∫₀¹ ψ_aψ_b dξ by the rule: with the tabulated functions as the
// rows of dim×n matrices D (derivatives) and V (values) and the weights
// W, H₀ = D W Dᵀ/π² + (V W F) Vᵀ and S = V W Vᵀ, F = diag f(ξ−½).
func (sp *fspace) matrices() {
	p, r := sp.p, sp.r
	dim, n := p.dim(), r.n
	bi := blas64.Implementation()
	h, s := sp.h[:dim*dim], sp.s[:dim*dim]
	sc := sp.sc[:dim*n]
	for a := range dim {
		da, row := sp.wd[a*n:(a+1)*n], sc[a*n:(a+1)*n]
		for l := range n {
			row[l] = da[l] * r.sw[l]
		}
	}
	bi.Dsyrk(blas.Upper, blas.NoTrans, dim, n, 1/(math.Pi*math.Pi), sc, n, 0, h, dim)
	for a := range dim {
		va, row := sp.wv[a*n:(a+1)*n], sc[a*n:(a+1)*n]
		for l := range n {
			row[l] = va[l] * r.sw[l]
		}
	}
	bi.Dsyrk(blas.Upper, blas.NoTrans, dim, n, 1, sc, n, 0, s, dim)
	for a := range dim {
		va, row := sp.wv[a*n:(a+1)*n], sc[a*n:(a+1)*n]
		for l, x := range r.x {
			row[l] = va[l] * r.w[l] * p.f * (x - 0.5)
		}
	}
	// H₀ += (V W F) Vᵀ, upper triangle: row a of the product with rows b ≥ a.
	for a := range dim {
		bi.Dgemv(blas.NoTrans, dim-a, n, 1, sp.wv[a*n:], n, sc[a*n:(a+1)*n], 1, 1, h[a*dim+a:], 1)
	}
	for a := range dim {
		for b := a + 1; b < dim; b++ {
			h[b*dim+a] = h[a*dim+b]
			s[b*dim+a] = s[a*dim+b]
		}
	}
}

// solve computes the Ritz values (ascending) and vectors (columns of
// vecs, S-orthonormal) of (H₀, S), and their values at the interfaces. It
// reports false if the Gram matrix is not numerically positive definite.
func (sp *fspace) solve() bool {
	dim := sp.p.dim()
	impl := gonum.Implementation{}
	bi := blas64.Implementation()
	s := sp.s[:dim*dim]
	for a := range dim {
		sp.scale[a] = 1 / math.Sqrt(s[a*dim+a])
	}
	c := sp.vecs[:dim*dim]
	for a := range dim {
		for b := range dim {
			s[a*dim+b] *= sp.scale[a] * sp.scale[b]
			c[a*dim+b] = sp.h[a*dim+b] * sp.scale[a] * sp.scale[b]
		}
	}
	if !impl.Dpotrf(blas.Upper, dim, s, dim) {
		return false
	}
	bi.Dtrsm(blas.Left, blas.Upper, blas.Trans, blas.NonUnit, dim, dim, 1, s, dim, c, dim)
	bi.Dtrsm(blas.Right, blas.Upper, blas.NoTrans, blas.NonUnit, dim, dim, 1, s, dim, c, dim)
	for a := range dim {
		for b := a + 1; b < dim; b++ {
			m := (c[a*dim+b] + c[b*dim+a]) / 2
			c[a*dim+b], c[b*dim+a] = m, m
		}
	}
	if !impl.Dsyev(lapack.EVCompute, blas.Upper, dim, c, dim, sp.vals[:dim], sp.work, len(sp.work)) {
		return false
	}
	bi.Dtrsm(blas.Left, blas.Upper, blas.NoTrans, blas.NonUnit, dim, dim, 1, s, dim, c, dim)
	for a := range dim {
		for j := range dim {
			c[a*dim+j] *= sp.scale[a]
		}
	}
	// The eigensolver's error is ε times the largest Ritz value, which the
	// high-degree bubbles make large (1e5 for 40 of them); the Rayleigh
	// quotient xᵀH₀x of each computed Ritz vector (S-normalized) in the
	// original basis has an error of ε times the scale of the level itself,
	// and an error second order in that of x.
	hx := sp.sc[:dim*dim]
	bi.Dsymm(blas.Left, blas.Upper, dim, dim, 1, sp.h, dim, c, dim, 0, hx, dim)
	for j := range dim {
		q := 0.0
		for a := range dim {
			q += c[a*dim+j] * hx[a*dim+j]
		}
		sp.vals[j] = q
	}
	// Keep them ascending (a refinement can swap a near-degenerate pair).
	for j := 1; j < dim; j++ {
		for i := j; i > 0 && sp.vals[i] < sp.vals[i-1]; i-- {
			sp.vals[i], sp.vals[i-1] = sp.vals[i-1], sp.vals[i]
			for a := range dim {
				c[a*dim+i], c[a*dim+i-1] = c[a*dim+i-1], c[a*dim+i]
			}
		}
	}
	// Only the interface functions are nonzero at the interfaces, with
	// value 1 at their own.
	for j := range dim {
		sp.w0[j], sp.w1[j] = c[j], c[dim+j]
	}
	return true
}
