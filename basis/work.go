package basis

import (
	"math"
	"sync"

	"github.com/tiltwell/tiltwell"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/lapack"
	"gonum.org/v1/gonum/lapack/gonum"
)

// work is the scratch space of one call. It grows to the largest size a
// goroutine has used and is recycled through pool, so calls at a size seen
// before do not allocate.
type work struct {
	a     []float64        // N×N: the matrix, then its eigenvectors (columns)
	eig   []float64        // N eigenvalues, ascending
	lw    []float64        // LAPACK workspace
	hc    []float64        // M×kk: (off-diagonal part of H) × (Ritz vectors)
	hcLo  []float64        // N×kk: low parts of hc inside the basis
	vrow  []float64        // 2kk: a potential's row sums in double-double
	lv    []level          // kk per-level bracket data
	theta []float64        // kk Ritz values
	err   []float64        // kk error bars
	bound []tiltwell.Bound // kk bound kinds
	mom   []float64        // cosine moments C_j of the potential, j = 0..3N
	x, wt []float64        // quadrature nodes and weights

	d, e, tau       []float64 // tridiagonal form and reflector scalars
	dl, dd, du, du2 []float64 // LU factors of T − λI
	piv             []bool    // row interchanges of the factors
	z               []float64 // N×kk tridiagonal eigenvectors
	iv              []float64 // the inverse-iteration vector
	dots            []float64 // kk inner products of a reflector

	fw fwork // a finite stack's box, basis and levels (finite.go)
	// gv, if it has length 2N, holds two vectors of length N that
	// eigenSelected replaces with Qᵀgv, Q the orthogonal factor of the
	// tridiagonal reduction A = Q T Qᵀ (T is left in d and e); the
	// infinite well leaves it empty.
	gv []float64
}

// level holds what the bracket of one Ritz pair needs. Offsets are from
// θ_dd = theta + lo, the Rayleigh quotient of the computed Ritz vector in
// double-double.
type level struct {
	theta          float64 // θ_dd rounded to float64: the reported energy
	lo             float64 // θ_dd − theta
	up             float64 // bound on η_k − θ_dd (rounding, non-orthogonality)
	offLoP, offHiP float64 // ρ of the plain Ritz vector lies in θ_dd + [offLoP, offHiP]
	sig2P          float64 // bound on its variance
	improved       bool    // the corrected trial function is available
	offLoU, offHiU float64 // the same for u = ψ + δ
	sig2U          float64 // bound on its variance
}

var pool = sync.Pool{New: func() any { return new(work) }}

func getWork() *work  { return pool.Get().(*work) }
func putWork(w *work) { pool.Put(w) }

// grow returns s with length n, reusing its storage if it can.
func grow[T any](s []T, n int) []T {
	if cap(s) >= n {
		return s[:n]
	}
	return make([]T, n)
}

// sizes prepares w for basis size N, outer range M and kk levels.
func (w *work) sizes(N, M, kk int) {
	w.a = grow(w.a, N*N)
	w.eig = grow(w.eig, N)
	w.hc = grow(w.hc, M*kk)
	w.hcLo = grow(w.hcLo, N*kk)
	w.lv = grow(w.lv, kk)
	w.theta = grow(w.theta, kk)
	w.err = grow(w.err, kk)
	w.bound = grow(w.bound, kk)
}

// blockedMax is the largest N for which the blocked Householder
// reduction is used. Beyond it gonum's blocked code calls a parallel Dgemm,
// which allocates; the unblocked code (minimal workspace) does not and is
// as fast there.
const blockedMax = 128

// eigen overwrites w.a (upper triangle of the N×N matrix) with its
// eigenvectors and w.eig with its eigenvalues. It reports false if the QL
// iteration failed.
func (w *work) eigen(N int) bool {
	var impl gonum.Implementation
	lwork := max(1, 3*N-1)
	if N <= blockedMax {
		w.lw = grow(w.lw, max(1, len(w.lw)))
		impl.Dsyev(lapack.EVCompute, blas.Upper, N, w.a, N, w.eig, w.lw[:1], -1)
		lwork = max(lwork, int(w.lw[0]))
	}
	w.lw = grow(w.lw, lwork)
	return impl.Dsyev(lapack.EVCompute, blas.Upper, N, w.a, N, w.eig, w.lw, lwork)
}

// selectedMin is the smallest N for which the selected-vector path is
// used; below it Dsyev is as fast.
const selectedMin = 24

// eigenSelected does what eigen does for the first kk eigenvectors only
// (the eigenvalues are all computed): Householder reduction to tridiagonal
// form (Dsytrd), all eigenvalues by the Pal–Walker–Kahan QL iteration
// (Dsterf), the kk eigenvectors of the tridiagonal matrix by inverse
// iteration with re-orthogonalisation inside clusters (the strategy of
// LAPACK's Dstein; Parlett §4.2 and §7.9), and the back-transformation by
// the Householder reflectors. Its cost, 4N³/3 + O(N²kk) flops, is a third
// to a sixth of Dsyev's for kk ≪ N. Columns kk..N−1 of w.a are left
// undefined.
func (w *work) eigenSelected(N, kk int) bool {
	var impl gonum.Implementation
	w.d, w.e, w.tau = grow(w.d, N), grow(w.e, N), grow(w.tau, N)
	lwork := 1
	if N <= blockedMax {
		w.lw = grow(w.lw, max(1, len(w.lw)))
		impl.Dsytrd(blas.Upper, N, w.a, N, w.d, w.e[:N-1], w.tau[:N-1], w.lw[:1], -1)
		lwork = max(1, int(w.lw[0]))
	}
	w.lw = grow(w.lw, lwork)
	impl.Dsytrd(blas.Upper, N, w.a, N, w.d, w.e[:N-1], w.tau[:N-1], w.lw, lwork)
	copy(w.eig, w.d)
	w.lw = grow(w.lw, max(lwork, N))
	copy(w.lw, w.e[:N-1])
	if !impl.Dsterf(N, w.eig, w.lw[:N-1]) {
		return false
	}
	// Tridiagonal eigenvectors, by inverse iteration, into z (N×kk).
	tnorm := 0.0 // ‖T‖₁
	for i := range N {
		s := math.Abs(w.d[i])
		if i > 0 {
			s += math.Abs(w.e[i-1])
		}
		if i < N-1 {
			s += math.Abs(w.e[i])
		}
		tnorm = max(tnorm, s)
	}
	w.z, w.iv = grow(w.z, N*kk), grow(w.iv, N)
	z, x := w.z, w.iv
	first := 0 // first vector of the current cluster
	for j := range kk {
		lam := w.eig[j]
		if j > 0 && lam-w.eig[j-1] > 1e-3*tnorm {
			first = j
		}
		w.factor(N, lam, tnorm)
		for i := range x {
			x[i] = 1 + 0.5*math.Sin(float64(i*(j+7))) // no special direction
		}
		for range 3 {
			w.solveTri(N, x)
			for c := first; c < j; c++ { // modified Gram–Schmidt in the cluster
				dot := 0.0
				for i := range N {
					dot += x[i] * z[i*kk+c]
				}
				for i := range N {
					x[i] -= dot * z[i*kk+c]
				}
			}
			nrm := 0.0
			for _, v := range x {
				nrm += v * v
			}
			nrm = 1 / math.Sqrt(nrm)
			for i := range x {
				x[i] *= nrm
			}
		}
		for i := range N {
			z[i*kk+j] = x[i]
		}
	}
	if len(w.gv) == 2*N {
		w.reflectT(N)
	}
	// Back-transformation: the eigenvectors of A are Q y, with
	// Q = H_(N−2) ⋯ H_0 and H_i = I − τ_i v vᵀ, v = (A[0:i, i+1], 1, 0, …).
	a := w.a
	w.dots = grow(w.dots, kk)
	dots := w.dots
	for i := 0; i < N-1; i++ {
		tau := w.tau[i]
		if tau == 0 {
			continue
		}
		zi := z[i*kk : (i+1)*kk]
		copy(dots, zi)
		for r := range i {
			if vr := a[r*N+i+1]; vr != 0 {
				for c, zc := range z[r*kk : (r+1)*kk] {
					dots[c] += vr * zc
				}
			}
		}
		for c := range dots {
			dots[c] *= tau
			zi[c] -= dots[c]
		}
		for r := range i {
			if vr := a[r*N+i+1]; vr != 0 {
				zr := z[r*kk : (r+1)*kk]
				for c, d := range dots {
					zr[c] -= vr * d
				}
			}
		}
	}
	for i := range N {
		copy(a[i*N:i*N+kk], z[i*kk:(i+1)*kk])
	}
	return true
}

// factor computes the LU factorisation with partial pivoting of T − λI, T
// the tridiagonal matrix in w.d, w.e, into w.dl, w.dd, w.du, w.du2,
// w.piv (as LAPACK's Dgttrf), with zero pivots replaced by u‖T‖ (the
// perturbation inverse iteration tolerates; Parlett §4.2).
func (w *work) factor(N int, lam, tnorm float64) {
	w.dl, w.dd, w.du, w.du2 = grow(w.dl, N), grow(w.dd, N), grow(w.du, N), grow(w.du2, N)
	w.piv = grow(w.piv, N)
	dl, dd, du, du2 := w.dl, w.dd, w.du, w.du2
	for i := range N {
		dd[i] = w.d[i] - lam
		if i < N-1 {
			dl[i], du[i] = w.e[i], w.e[i]
		}
		du2[i] = 0
		w.piv[i] = false
	}
	tiny := unit * tnorm
	for i := 0; i < N-1; i++ {
		if math.Abs(dd[i]) >= math.Abs(dl[i]) {
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
			w.piv[i] = true
		}
	}
	if dd[N-1] == 0 {
		dd[N-1] = tiny
	}
}

// solveTri overwrites x with (T − λI)⁻¹x using the factors of factor,
// scaling x down first if the solution would overflow.
func (w *work) solveTri(N int, x []float64) {
	dl, dd, du, du2 := w.dl, w.dd, w.du, w.du2
	for i := 0; i < N-1; i++ { // L⁻¹ with the row interchanges
		if w.piv[i] {
			x[i], x[i+1] = x[i+1], x[i]-dl[i]*x[i+1]
		} else {
			x[i+1] -= dl[i] * x[i]
		}
	}
	for i := N - 1; i >= 0; i-- { // U⁻¹
		s := x[i]
		if i+1 < N {
			s -= du[i] * x[i+1]
		}
		if i+2 < N {
			s -= du2[i] * x[i+2]
		}
		x[i] = s / dd[i]
		if math.Abs(x[i]) > 1e100 { // rescale; only the direction matters
			for r := i; r < N; r++ {
				x[r] *= 1e-100
			}
			for r := range i {
				x[r] *= 1e-100
			}
		}
	}
}

// reflectT overwrites the two vectors in w.gv with Qᵀ times them,
// Q = H_(N−2) ⋯ H_0 the product of the Householder reflectors that Dsytrd
// left in the upper triangle of w.a: Qᵀ = H_0 ⋯ H_(N−2), so the reflectors
// act from the last.
func (w *work) reflectT(N int) {
	w.reflect1(N, w.gv[:N])
	w.reflect1(N, w.gv[N:2*N])
}

func (w *work) reflect1(N int, x []float64) {
	a := w.a
	for i := N - 2; i >= 0; i-- {
		tau := w.tau[i]
		if tau == 0 {
			continue
		}
		// v = (A[0:i, i+1], 1, 0, …).
		dot := x[i]
		for r := range i {
			dot += a[r*N+i+1] * x[r]
		}
		dot *= tau
		x[i] -= dot
		for r := range i {
			x[r] -= dot * a[r*N+i+1]
		}
	}
}
