package basis

import (
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
	a     []float64 // N×N: the matrix, then its eigenvectors (columns)
	eig   []float64 // N eigenvalues, ascending
	lw    []float64 // LAPACK workspace
	hc    []float64 // M×kk: (off-diagonal part of H) × (Ritz vectors)
	lv    []level   // kk per-level bracket data
	theta []float64 // kk Ritz values
	err   []float64 // kk error bars
	bound []tiltwell.Bound
	mom   []float64 // cosine moments C_j of the potential, j = 0..3N
	x, wt []float64 // quadrature nodes and weights
}

// level holds what the bracket of one Ritz pair needs.
type level struct {
	theta          float64 // Rayleigh quotient of the computed Ritz vector
	up             float64 // rounding allowance on the upper bound θ
	rhoLoP, rhoHiP float64 // bounds on ρ of the plain Ritz vector
	sig2P          float64 // bound on its variance
	improved       bool    // the corrected trial function is available
	rhoLoU, rhoHiU float64 // bounds on ρ of u = ψ + δ
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
