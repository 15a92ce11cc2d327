package variational

import (
	"math"
	"sync"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/integrate/quad"
	"gonum.org/v1/gonum/lapack"
	"gonum.org/v1/gonum/lapack/gonum"
)

// shape says which factor multiplies the envelope in a Krylov trial space.
type shape int

const (
	// sineShape spans e^(−β(ξ−ξr)) sin(πξ) p(cos πξ), deg p < dim, which
	// is e^(−β(ξ−ξr)) span{sin(kπξ), k = 1..dim}.
	sineShape shape = iota
	// polyShape spans e^(−β(ξ−ξr)) ξ(1−ξ) p(2ξ−1), deg p < dim.
	polyShape
)

// maxDim is the largest space the package builds: the verification space
// of the lower bounds (see Solver.brackets).
const maxDim = 48

// maxRitzDim is the largest Ritz space of the searched upper bounds.
const maxRitzDim = 40

// ncoef is the length of a coefficient vector: sine orders 0..maxDim+1 or
// powers of t = 2ξ−1 from 0 to maxDim+1 (the start adds two).
const ncoef = maxDim + 3

// rule is a Gauss–Legendre rule on [0, 1] with the start and multiplier of
// each shape tabulated at its nodes. Rules are built once and never
// modified.
type rule struct {
	n    int
	x, w []float64
	sw   []float64 // √w
	// start[s] holds the start function of shape s and its first two
	// derivatives, mult[s] the multiplier and its derivatives, each as
	// three consecutive blocks of n values.
	start, mult [2][]float64
}

// ruleSizes are the node counts of the tabulated rules, smallest first.
var ruleSizes = [...]int{64, 96, 144, 216}

var rules = sync.OnceValue(func() []*rule {
	rs := make([]*rule, len(ruleSizes))
	p2 := math.Pi * math.Pi
	for i, n := range ruleSizes {
		r := &rule{n: n, x: make([]float64, n), w: make([]float64, n), sw: make([]float64, n)}
		quad.Legendre{}.FixedLocations(r.x, r.w, 0, 1)
		for j, w := range r.w {
			r.sw[j] = math.Sqrt(w)
		}
		for s := range 2 {
			r.start[s] = make([]float64, 3*n)
			r.mult[s] = make([]float64, 3*n)
		}
		for j, x := range r.x {
			sn, cs := math.Sincos(math.Pi * x)
			// sineShape: start sin(πξ), multiplier cos(πξ).
			r.start[sineShape][j] = sn
			r.start[sineShape][n+j] = math.Pi * cs
			r.start[sineShape][2*n+j] = -p2 * sn
			r.mult[sineShape][j] = cs
			r.mult[sineShape][n+j] = -math.Pi * sn
			r.mult[sineShape][2*n+j] = -p2 * cs
			// polyShape: start ξ(1−ξ), multiplier 2ξ−1.
			r.start[polyShape][j] = x * (1 - x)
			r.start[polyShape][n+j] = 1 - 2*x
			r.start[polyShape][2*n+j] = -2
			r.mult[polyShape][j] = 2*x - 1
			r.mult[polyShape][n+j] = 2
		}
		rs[i] = r
	}
	return rs
})

// space is a Krylov trial space and its Ritz pairs at one field and tilt:
// functions q_0..q_{dim−1}, orthonormal in the discrete inner product of a
// rule, tabulated at its nodes (value, first and, in full mode, second
// derivative), with the recurrence that generates them (so they can be
// evaluated anywhere), their expansion coefficients (full mode; used only to
// bound the functions off the real axis), the Hamiltonian and Gram
// matrices, and the Ritz values and vectors.
type space struct {
	r     *rule
	shape shape
	dim   int
	beta  float64
	f     float64
	full  bool

	env      []float64 // envelope at the nodes
	v, d, dd []float64 // dim blocks of n values
	coef     []float64 // dim blocks of ncoef coefficients
	rec      []float64 // dim×dim: q_j = (m q_{j−1} − Σ_{i<j} rec[j*dim+i] q_i)/rec[j*dim+j]
	h, s     []float64 // dim×dim, row major
	vals     []float64 // Ritz values, ascending
	vecs     []float64 // dim×dim; column j is the j-th Ritz vector after solve(true)
	work     []float64
	tmp      []float64
	scaled   []float64 // dim×n scratch for the matrix products
	phi      []float64 // a Ritz function at the nodes
	hphi     []float64 // H applied to it

	// search is the level search state (kept here so that the objective
	// passed to the minimizer needs no allocation).
	search levelSearch
	tilt   tiltSearch
	// brackets is scratch for Levels.
	brackets [MaxLevels]Bracket
}

var spacePool = sync.Pool{New: func() any {
	nmax := ruleSizes[len(ruleSizes)-1]
	sp := &space{
		env:    make([]float64, nmax),
		v:      make([]float64, maxDim*nmax),
		d:      make([]float64, maxDim*nmax),
		dd:     make([]float64, maxDim*nmax),
		coef:   make([]float64, maxDim*ncoef),
		rec:    make([]float64, maxDim*maxDim),
		h:      make([]float64, maxDim*maxDim),
		s:      make([]float64, maxDim*maxDim),
		vals:   make([]float64, maxDim),
		vecs:   make([]float64, maxDim*maxDim),
		tmp:    make([]float64, nmax),
		scaled: make([]float64, maxDim*nmax),
		phi:    make([]float64, nmax),
		hphi:   make([]float64, nmax),
	}
	var wq [1]float64
	gonum.Implementation{}.Dsyev(lapack.EVCompute, blas.Upper, maxDim, sp.vecs, maxDim, sp.vals, wq[:], -1)
	sp.work = make([]float64, max(int(wq[0]), 3*maxDim))
	sp.search.sp = sp
	return sp
}}

// build tabulates the Krylov basis of the given shape and dimension with
// envelope e^(−β(ξ−ξr)), ξr = 0 for β ≥ 0 and 1 for β < 0 (so that the
// envelope never exceeds 1), and fills the Hamiltonian matrix at field f by
// the rule r.
//
// In search mode (full false) the basis comes from the three-term
// (Stieltjes) recurrence, only values and first derivatives are kept, and
// the Gram matrix is taken to be the identity; the Ritz values are then
// only used to choose β. In full mode every new function is orthogonalized
// against all earlier ones, twice, second derivatives and expansion
// coefficients are tabulated, and the Gram matrix is computed, so that the
// Ritz values of the pencil are the Rayleigh–Ritz values of a genuine
// trial space (up to the quadrature error, which bounds.go bounds).
func (sp *space) build(r *rule, sh shape, dim int, beta, f float64, full bool) {
	sp.r, sp.shape, sp.dim, sp.beta, sp.f, sp.full = r, sh, dim, beta, f, full
	n := r.n
	xr := 0.0
	if beta < 0 {
		xr = 1
	}
	env := sp.env[:n]
	for i, x := range r.x {
		env[i] = math.Exp(-beta * (x - xr))
	}
	start := r.start[sh]
	b2 := beta * beta
	v, d := sp.v[:n], sp.d[:n]
	for i := range n {
		e, s0, s1 := env[i], start[i], start[n+i]
		v[i] = e * s0
		d[i] = e * (s1 - beta*s0)
	}
	rec := sp.rec[:dim*dim]
	clear(rec)
	if full {
		dd := sp.dd[:n]
		for i := range n {
			dd[i] = env[i] * (start[2*n+i] - 2*beta*start[n+i] + b2*start[i])
		}
		c := sp.coef[:ncoef]
		clear(c)
		if sh == sineShape {
			c[1] = 1 // sin(1·πξ)
		} else {
			c[0] = 1 // p = 1
		}
	}
	rec[0] = sp.normalize(0)
	mult := r.mult[sh]
	for j := 1; j < dim; j++ {
		pv, pd := sp.v[(j-1)*n:j*n], sp.d[(j-1)*n:j*n]
		v, d := sp.v[j*n:(j+1)*n], sp.d[j*n:(j+1)*n]
		for i := range n {
			m0, m1 := mult[i], mult[n+i]
			v[i] = m0 * pv[i]
			d[i] = m1*pv[i] + m0*pd[i]
		}
		lo := 0
		if !full {
			lo = max(0, j-2)
		}
		if full {
			pdd, dd := sp.dd[(j-1)*n:j*n], sp.dd[j*n:(j+1)*n]
			for i := range n {
				dd[i] = mult[2*n+i]*pv[i] + 2*mult[n+i]*pd[i] + mult[i]*pdd[i]
			}
			pc, nc := sp.coef[(j-1)*ncoef:j*ncoef], sp.coef[j*ncoef:(j+1)*ncoef]
			clear(nc)
			if sh == sineShape {
				// cos(πξ) sin(kπξ) = ½ sin((k+1)πξ) + ½ sin((k−1)πξ).
				for k := 1; k < ncoef-1; k++ {
					nc[k+1] += pc[k] / 2
					nc[k-1] += pc[k] / 2
				}
				nc[0] = 0
			} else {
				copy(nc[1:], pc[:ncoef-1])
			}
		}
		// Gram–Schmidt against q_lo..q_{j−1}, twice.
		for range 2 {
			for i := lo; i < j; i++ {
				qv := sp.v[i*n : (i+1)*n]
				p := 0.0
				for l, wl := range r.w {
					p += wl * v[l] * qv[l]
				}
				rec[j*dim+i] += p
				qd := sp.d[i*n : (i+1)*n]
				for l := range n {
					v[l] -= p * qv[l]
					d[l] -= p * qd[l]
				}
				if full {
					qdd, dd := sp.dd[i*n:(i+1)*n], sp.dd[j*n:(j+1)*n]
					for l := range n {
						dd[l] -= p * qdd[l]
					}
					qc, nc := sp.coef[i*ncoef:(i+1)*ncoef], sp.coef[j*ncoef:(j+1)*ncoef]
					for l := range nc {
						nc[l] -= p * qc[l]
					}
				}
			}
		}
		rec[j*dim+j] = sp.normalize(j)
	}
	sp.matrices()
}

// normalize scales q_j to unit discrete norm and returns the norm it had.
func (sp *space) normalize(j int) float64 {
	n := sp.r.n
	v, d := sp.v[j*n:(j+1)*n], sp.d[j*n:(j+1)*n]
	nn := 0.0
	for l, wl := range sp.r.w {
		nn += wl * v[l] * v[l]
	}
	norm := math.Sqrt(nn)
	inv := 1 / norm
	for l := range n {
		v[l] *= inv
		d[l] *= inv
	}
	if sp.full {
		dd := sp.dd[j*n : (j+1)*n]
		for l := range n {
			dd[l] *= inv
		}
		c := sp.coef[j*ncoef : (j+1)*ncoef]
		for l := range c {
			c[l] *= inv
		}
	}
	return norm
}

// matrices fills H_ab = ∫ (q_a′ q_b′/π² + f(ξ−½) q_a q_b) dξ and, in full
// mode, S_ab = ∫ q_a q_b dξ, by the rule: with the tabulated functions as
// the rows of dim×n matrices D (derivatives) and V (values) and the rule's
// weights w, H = D W Dᵀ/π² + V W F Vᵀ and S = V W Vᵀ (F = diag f(ξ−½)).
func (sp *space) matrices() {
	r, dim, n := sp.r, sp.dim, sp.r.n
	bi := blas64.Implementation()
	sc := sp.scaled[:dim*n]
	for a := range dim {
		da, row := sp.d[a*n:(a+1)*n], sc[a*n:(a+1)*n]
		for l := range n {
			row[l] = da[l] * r.sw[l]
		}
	}
	h := sp.h[:dim*dim]
	bi.Dsyrk(blas.Upper, blas.NoTrans, dim, n, 1/(math.Pi*math.Pi), sc, n, 0, h, dim)
	for a := range dim {
		va, row := sp.v[a*n:(a+1)*n], sc[a*n:(a+1)*n]
		for l, xl := range r.x {
			row[l] = va[l] * r.w[l] * sp.f * (xl - 0.5)
		}
	}
	// H += (V W F) Vᵀ, upper triangle: row a of the product with rows b ≥ a.
	for a := range dim {
		row := sc[a*n : (a+1)*n]
		bi.Dgemv(blas.NoTrans, dim-a, n, 1, sp.v[a*n:], n, row, 1, 1, h[a*dim+a:], 1)
	}
	if sp.full {
		for a := range dim {
			va, row := sp.v[a*n:(a+1)*n], sc[a*n:(a+1)*n]
			for l := range n {
				row[l] = va[l] * r.sw[l]
			}
		}
		bi.Dsyrk(blas.Upper, blas.NoTrans, dim, n, 1, sc, n, 0, sp.s, dim)
		for a := range dim {
			for b := a + 1; b < dim; b++ {
				sp.s[b*dim+a] = sp.s[a*dim+b]
			}
		}
	}
	for a := range dim {
		for b := a + 1; b < dim; b++ {
			h[b*dim+a] = h[a*dim+b]
		}
	}
}

// solve computes the Ritz values and, if vectors is true, the Ritz vectors
// (columns of sp.vecs, S-orthonormal). In search mode it solves the
// standard eigenproblem of H; in full mode the generalized one for the
// pencil (H, S) by Cholesky reduction. It reports false if S is not
// numerically positive definite or the eigensolver fails.
func (sp *space) solve(vectors bool) bool {
	dim := sp.dim
	impl := gonum.Implementation{}
	c := sp.vecs[:dim*dim]
	copy(c, sp.h[:dim*dim])
	bi := blas64.Implementation()
	if sp.full {
		// S = Uᵀ U; C = U⁻ᵀ H U⁻¹.
		if !impl.Dpotrf(blas.Upper, dim, sp.s, dim) {
			return false
		}
		bi.Dtrsm(blas.Left, blas.Upper, blas.Trans, blas.NonUnit, dim, dim, 1, sp.s, dim, c, dim)
		bi.Dtrsm(blas.Right, blas.Upper, blas.NoTrans, blas.NonUnit, dim, dim, 1, sp.s, dim, c, dim)
		for a := range dim {
			for b := a + 1; b < dim; b++ {
				m := (c[a*dim+b] + c[b*dim+a]) / 2
				c[a*dim+b], c[b*dim+a] = m, m
			}
		}
	}
	job := lapack.EVNone
	if vectors {
		job = lapack.EVCompute
	}
	if !impl.Dsyev(job, blas.Upper, dim, c, dim, sp.vals[:dim], sp.work, len(sp.work)) {
		return false
	}
	if vectors && sp.full {
		// x = U⁻¹ y.
		bi.Dtrsm(blas.Left, blas.Upper, blas.NoTrans, blas.NonUnit, dim, dim, 1, sp.s, dim, c, dim)
	}
	return true
}

// ritzFunction tabulates the j-th Ritz function φ = Σ_a x_a q_a (after
// solve(true) in full mode) and Hφ = Σ_a x_a (−q_a″/π² + f(ξ−½) q_a) at
// the nodes, into sp.phi and sp.hphi.
func (sp *space) ritzFunction(j int) {
	n, dim := sp.r.n, sp.dim
	phi, hphi := sp.phi[:n], sp.hphi[:n]
	clear(phi)
	clear(hphi)
	ip2 := 1 / (math.Pi * math.Pi)
	for a := range dim {
		x := sp.vecs[a*dim+j]
		va, dda := sp.v[a*n:(a+1)*n], sp.dd[a*n:(a+1)*n]
		for l := range n {
			phi[l] += x * va[l]
			hphi[l] -= x * dda[l] * ip2
		}
	}
	for l, xl := range sp.r.x {
		hphi[l] += sp.f * (xl - 0.5) * phi[l]
	}
}
