package basis

import (
	"fmt"
	"math"

	"github.com/tiltwell/tiltwell"
)

// ritz diagonalises the tilted stack in the N states of the current box
// (buildBasis done) and fills w.fw.out with levels 1..min(k, N) and the
// Ritz value of level k + 1 where N > k. See [Solver] for the method and
// the error terms.
func (w *work) ritz(g *geometry, N, k int) error {
	fw := &w.fw
	nq, ns := fw.nq, len(fw.segs)
	kk := min(k+1, N)
	w.a, w.eig = grow(w.a, N*N), grow(w.eig, N)
	fw.g = grow(fw.g, N*nq)
	phi, gg := fw.phi[:N*nq], fw.g[:N*nq]
	for m := range N {
		p, q := phi[m*nq:(m+1)*nq], gg[m*nq:(m+1)*nq]
		for i := range p {
			q[i] = p[i] * fw.wt[i] * fw.wf[i]
		}
	}
	a := w.a[:N*N]
	for i := range N {
		gi := gg[i*nq : (i+1)*nq]
		for j := i; j < N; j++ {
			pj := phi[j*nq : (j+1)*nq]
			pj = pj[:len(gi)]
			s := 0.0
			for q, x := range gi {
				s += x * pj[q]
			}
			a[i*N+j] = s
		}
		a[i*N+i] += fw.e[i]
	}
	fw.wd = grow(fw.wd, N)
	for m := range N {
		fw.wd[m] = a[m*N+m] - fw.e[m]
	}
	// The tridiagonal reduction with the values of the states at x₀
	// carried along, for the Green's function of the wall (greens.go).
	w.gv = grow(w.gv, 2*N)
	for m := range N {
		w.gv[m] = fw.ends[m*(ns+1)+fw.i0]
		w.gv[N+m] = fw.ends[m*(ns+1)+fw.i1]
	}
	ok := w.eigenSelected(N, kk)
	fw.gy = append(fw.gy[:0], w.gv[:2*N]...)
	w.gv = w.gv[:0]
	if !ok {
		return fmt.Errorf("basis: eigensolver did not converge at N = %d, f = %g: %w", N, g.f, tiltwell.ErrNoConvergence)
	}
	fw.out = grow(fw.out, kk)
	fw.psi = grow(fw.psi, nq)
	psi := fw.psi[:nq]
	eNext := fw.e[N] // the first box level outside the basis
	for j := range kk {
		lv := &fw.out[j]
		if j == k {
			lv.theta = w.eig[j]
			break
		}
		clear(psi)
		var diag, dnorm, psi0, psi1 float64
		for i := range N {
			c := a[i*N+j]
			diag += fw.e[i] * c * c
			dnorm += c * c
			p := phi[i*nq : (i+1)*nq]
			p = p[:len(psi)]
			for q, x := range p {
				psi[q] += c * x
			}
			psi0 += c * fw.ends[i*(ns+1)+fw.i0]
			psi1 += c * fw.ends[i*(ns+1)+fw.i1]
		}
		var wpsi, wpsi2, wabs float64
		for q, x := range psi {
			t := fw.wt[q] * fw.wf[q] * x * x
			wpsi += t
			wabs += math.Abs(t)
			wpsi2 += t * fw.wf[q]
		}
		// ‖PWψ‖², P the projection on the basis: Σ_m (Σ_q Φ_mq w_q W_q ψ_q)².
		var pw2 float64
		for m := range N {
			s := 0.0
			gm := gg[m*nq : (m+1)*nq]
			gm = gm[:len(psi)]
			for q, x := range psi {
				s += gm[q] * x
			}
			pw2 += s * s
		}
		rho := (diag + wpsi) / dnorm
		lv.theta = rho
		// ‖(1 − P)Wψ‖², the residual outside the basis, and the rounding
		// of that difference.
		r2 := max(wpsi2/dnorm-pw2/(dnorm*dnorm), 0) + 8*float64(nq)*unit*wpsi2/dnorm
		// The tilt and potential pull the spectrum of the states outside
		// the basis down by at most −min W.
		gapOut := eNext + fw.wmin - rho
		var trunc float64
		if gapOut > 0 {
			// The second-order energy of the states outside the basis,
			// Σ_(m>N) r_m²/(E_m − θ), at most ‖r‖²/(E_(N+1) + min W − θ).
			trunc = r2 / gapOut
		} else {
			// The top of a small basis: only |θ − η| ≲ ‖r‖ is left.
			trunc = math.Sqrt(r2)
		}
		psi0, psi1 = psi0/math.Sqrt(dnorm), psi1/math.Sqrt(dnorm)
		// The pointwise error of ψ from the part outside the basis, δ,
		// by |δ(x)|² ≤ 2‖δ‖‖δ′‖ (δ vanishes on the walls), with
		// ‖δ‖ ≤ ‖r‖/gap and ‖δ′‖² ≤ π²μ_max ‖r‖²(E_(N+1) − v_min)/gap².
		dpsi := 0.0
		if gapOut > 0 {
			dpsi = math.Sqrt(2*math.Pi*r2*math.Sqrt(fw.mumax*math.Max(eNext-fw.vmin, 1))) / gapOut
		} else {
			dpsi = math.Sqrt(r2)
		}
		// The bound on the second-order term covers the Ritz truncation
		// (the higher orders are smaller by about ‖r‖/gap): no factor.
		lv.trunc = trunc
		lv.err = lv.trunc
		lv.bound = tiltwell.Estimate
		// Rounding: the Rayleigh quotient of float64 sums over N states and
		// Q nodes.
		lv.err += 4 * math.Sqrt(float64(N+nq)) * unit * (diag + wabs + math.Abs(rho))
		w.walls(g, N, j, lv, rho, psi0, psi1, dpsi)
	}
	return nil
}

// stackRun solves the folded stack at field f ≥ 0 for k levels into
// w.fw.out and returns how many are confined (and why the next is not).
func (s Solver) stackRun(w *work, g *geometry, k int) (st Stats, confined int, why string, err error) {
	fw := &w.fw
	// Every level lies above the lowest band edge of the inner layers
	// (with the field; a potential can lower it, so not with one):
	// below the ceiling there is then no room for one.
	if g.pot == nil {
		lowest := math.Inf(1)
		for i, l := range g.inner {
			lowest = min(lowest, l.Edge+g.f*(g.innerLo[i]-0.5))
		}
		if !(lowest < g.ceiling) {
			return st, 0, "the band edges leave no room below the barrier", nil
		}
	}
	if g.f == 0 && g.pot == nil {
		return s.zeroField(w, g, k)
	}
	tol := s.Tol
	if tol == 0 {
		tol = DefaultTol
	}
	fw.stale = false
	solve := func(N int) error {
		if err := fw.buildBasis(g, N); err != nil {
			return err
		}
		st.Tries++
		st.Size = N
		return w.ritz(g, N, k)
	}
	// Place the box: probe solves at a small basis, each with the box of
	// the highest level the one before confined, until the box settles.
	// A Ritz value lies above the box's level, whose turning point is
	// then nearer the well than the true one: the downhill wall stays
	// inside the barrier of every level it is sized for.
	probe := k + probeExtra
	if s.Size > 0 {
		probe = min(probe, s.Size)
	}
	top := math.NaN()
	dl, dr := math.NaN(), math.NaN()
	for range maxBoxPasses {
		ndl, ndr := g.depths(top, boxDecay)
		if math.Abs(ndl-dl) <= 0.02*dl+1e-9 && math.Abs(ndr-dr) <= 0.02*dr+1e-9 {
			break
		}
		dl, dr = ndl, ndr
		fw.setBox(g, dl, dr)
		if err := solve(probe); err != nil {
			return st, 0, "", err
		}
		n, _ := confinedCount(g, fw.out, min(k, probe))
		top = fw.out[max(n, 1)-1].theta
		if !(top < g.ceiling) {
			break
		}
	}
	N := s.Size
	if N == 0 {
		N = max(probe, k+12)
	}
	prevN := 0 // a smaller basis on the same box, whose levels are in fw.prev
	for {
		if st.Size != N {
			if err := solve(N); err != nil {
				return st, 0, "", err
			}
		}
		confined, why = confinedCount(g, fw.out, min(k, N))
		measured := prevN >= N/2 && prevN < N
		if measured {
			fw.measure(N, prevN, confined)
			confined, why = confinedCount(g, fw.out, min(k, N))
		}
		if s.Size > 0 || N == AutoMaxSize {
			break
		}
		// Grow while a confined level misses the tolerance: its Ritz
		// truncation (N⁻⁵), or the wall's error (N⁻³; measured, or for
		// the first size its model) up to wallMaxSize.
		worst, rate := 0.0, 5.0
		for _, lv := range fw.out[:max(confined, 1)] {
			t := tol * max(1, math.Abs(lv.energy))
			worst = max(worst, lv.trunc/t)
			wall := lv.Err - lv.err
			if N < wallMaxSize && wall > t {
				worst, rate = max(worst, wall/t), 3
			}
		}
		if worst <= 1 {
			break
		}
		fw.prev = append(fw.prev[:0], fw.out...)
		prevN = N
		gr := min(2, max(1.25, 1.1*math.Pow(worst, 1/rate)))
		N = min(AutoMaxSize, int(math.Ceil(float64(N)*gr)))
		if rate == 3 {
			N = min(N, max(wallMaxSize, prevN))
		}
	}
	// Where the wall correction is not negligible and no smaller basis on
	// this box measured its error, solve one.
	need := false
	for _, lv := range fw.out[:confined] {
		need = need || lv.wall > max(1e-15*max(1, math.Abs(lv.energy)), 0.01*lv.err)
	}
	if need && N >= partnerMin && !(prevN >= N/2 && prevN < N) {
		fw.save = append(fw.save[:0], fw.out...)
		np := int(math.Round(partnerRatio * float64(N)))
		if err := solve(np); err != nil {
			return st, 0, "", err
		}
		fw.prev = append(fw.prev[:0], fw.out...)
		fw.out = append(fw.out[:0], fw.save...)
		st.Size = N
		fw.stale = true
		fw.measure(N, np, confined)
		confined, why = confinedCount(g, fw.out, min(k, N))
	}
	return st, confined, why, nil
}

// measure sets the wall's error of the confined levels in fw.out (basis
// N) from the change of the wall correction η − θ (and of Γ) since the
// smaller basis in fw.prev (size np) on the same box: it falls about as
// N⁻³, so the error at N is the change over (N/np)³ − 1, taken
// measureSafety times (θ's own truncation, N⁻⁵, is estimated apart).
func (fw *fwork) measure(N, np, confined int) {
	r := math.Pow(float64(N)/float64(np), 3) - 1
	for j := range min(confined, len(fw.prev)) {
		lv, pv := &fw.out[j], &fw.prev[j]
		if math.IsInf(pv.Err, 0) || math.IsNaN(pv.energy) {
			continue
		}
		dw := (lv.energy - lv.theta) - (pv.energy - pv.theta)
		lv.finish(measureSafety*math.Abs(dw)/r, measureSafety*math.Abs(lv.gamma-pv.gamma)/r)
	}
}

// measureSafety multiplies the measured wall error, of η and of Γ: the
// change between two sizes over (N/N′)³ − 1 has matched the error to
// within a factor of 2 once N is past about 40 (pre-asymptotic sizes can
// stall or change sign). With 2, on the large grid of the tests
// (TestFiniteLargeGrid), where the measure dominates the estimate (166
// energies, 187 widths), the estimate's ratio to the true error has
// median 2.0 and 1% quantile 0.48 for η, 0.91 for Γ; with 3, 5% of those
// widths were more than 10× pessimistic.
const measureSafety = 2

// wallMaxSize is the largest basis the automatic size grows to for the
// wall's error alone (it falls only as N⁻³; beyond, the error is
// reported as it is).
const wallMaxSize = 256

// partnerRatio is the size of the second basis that measures the wall's
// error, relative to the first; partnerMin is the smallest basis that
// gets one.
const (
	partnerRatio = 0.7
	partnerMin   = 16
)

// confinedCount returns how many of levels 1..k in out are confined, from
// the bottom, and why the next is not: a level must lie below the lower
// of the outer band edges at their interfaces by more than its error, and
// under a field its width must be below the spacing to the next Ritz
// value (out[k] holds level k + 1 when the basis has it) and below the
// distance to the level below (the criteria of the exact solver).
func confinedCount(g *geometry, out []flevel, k int) (int, string) {
	for j := range k {
		lv := &out[j]
		if !(lv.energy+lv.Err < g.ceiling) {
			return j, "above the barrier"
		}
		if g.f > 0 {
			if j+1 < len(out) && !(lv.gamma < out[j+1].theta-lv.theta) {
				return j, fmt.Sprintf("its width Γ = %.3g exceeds the level spacing %.3g", lv.gamma, out[j+1].theta-lv.theta)
			}
			if j > 0 && !(lv.gamma < lv.energy-out[j-1].energy) {
				return j, fmt.Sprintf("its width Γ = %.3g exceeds its distance %.3g to the level below", lv.gamma, lv.energy-out[j-1].energy)
			}
		}
	}
	return k, ""
}

// zeroField solves the untilted stack without a potential: the levels are
// the Dirichlet box levels E_D (upper bounds, by min–max: the box's
// functions are admissible for the whole line) and the Neumann box levels
// E_N bound them from below (min–max again: dropping the continuity of φ
// at the walls lowers every level, and the outer half-lines beyond the
// walls have no spectrum below their band edges), so every level below
// the lower outer band edge lies in [E_N, E_D]. The box is wide (decay
// exponent zeroDecay), so that the bracket is at the rounding of the
// roots, except within about 1e-4 of the barrier top.
func (s Solver) zeroField(w *work, g *geometry, k int) (st Stats, confined int, why string, err error) {
	fw := &w.fw
	lim := float64(zeroBoxMax)
	if g.userBox > 0 {
		lim = g.userBox
	}
	fw.e, fw.en = grow(fw.e, k), grow(fw.en, k)
	dl, dr := min(1, lim), min(1, lim)
	if g.userBox > 0 {
		dl, dr = lim, lim
	}
	for pass := range maxBoxPasses {
		fw.setBox(g, dl, dr)
		st.Tries++
		if !boxLevels(fw.segs, dirichlet, fw.e) {
			return st, 0, "", fmt.Errorf("basis: box levels could not be bracketed: %w", tiltwell.ErrNoConvergence)
		}
		if g.userBox > 0 || pass == maxBoxPasses-1 {
			break
		}
		n := 0
		for n < k && fw.e[n] < g.ceiling {
			n++
		}
		top := fw.e[max(n, 1)-1]
		ndl := depth(g.edgeL, top, g.ml, 0, zeroDecay, lim, true)
		ndr := depth(g.edgeR, top, g.mr, 0, zeroDecay, lim, false)
		if ndl <= dl*1.02 && ndr <= dr*1.02 && pass > 0 {
			break
		}
		dl, dr = max(dl, ndl), max(dr, ndr)
	}
	if !boxLevels(fw.segs, neumann, fw.en) {
		return st, 0, "", fmt.Errorf("basis: box levels could not be bracketed: %w", tiltwell.ErrNoConvergence)
	}
	fw.out = grow(fw.out, k)
	for j := range k {
		ed, en := fw.e[j], fw.en[j]
		if !(ed < g.ceiling) {
			return st, j, "above the barrier", nil
		}
		// Within rounding of the barrier top the two roots can come out
		// in the wrong order (E_D below E_N by 8e-14 at 2e-4 under a
		// 0.18 E₁ barrier, found by fuzzing): their distance is then
		// rounding too, and counts as such.
		re := rootRounding(fw.segs, ed) + rootRounding(fw.segs, en)
		fw.out[j] = flevel{energy: ed, err: (math.Abs(ed-en) + re) * (1 + 4*unit), bound: tiltwell.Rigorous, theta: ed}
		fw.out[j].finish(0, 0)
	}
	return st, k, "", nil
}

// rootRounding returns a bound on the rounding error of a box level e:
// the Prüfer angle accumulates about u per radian of phase and a few u
// per layer, divided by its slope in e (measured by a difference).
func rootRounding(segs []seg, e float64) float64 {
	phase := float64(len(segs))
	for _, s := range segs {
		phase += math.Pi * math.Sqrt(s.mu*math.Abs(s.v-e)) * s.w
	}
	h := 1e-7 * math.Max(1, math.Abs(e))
	slope := (boxAngle(segs, dirichlet, e+h, 1) - boxAngle(segs, dirichlet, e-h, 1)) / (2 * h)
	if !(slope > 0) {
		return 1e-8 * math.Max(1, math.Abs(e))
	}
	return 8*unit*phase/slope + 4*unit*math.Abs(e)
}

// geometryFor returns the folded geometry of the Solver's stack at the
// field f.
func (s Solver) geometryFor(w *work, f float64) geometry {
	// tiltwell.Stack.Fold, with the mirrored stack kept in the workspace
	// (Mirror allocates) while the Solver's stack is the same.
	af, mir := tiltwell.Fold(f)
	st := s.Stack
	if mir {
		if !w.fw.mirrorOf.Equal(s.Stack) || w.fw.mirrorOf.Infinite() {
			w.fw.mirrorOf, w.fw.mirrored = s.Stack, s.Stack.Mirror()
		}
		st = w.fw.mirrored
	}
	g := w.fw.newGeometry(st, af)
	g.pot, g.mirror = s.Potential, mir
	g.userBox = s.Box
	g.limit = DefaultBox
	if s.Box > 0 {
		g.limit = s.Box
	}
	if s.Potential != nil {
		w.fw.brk = w.fw.brk[:0]
		if mir {
			for i := len(s.Breaks) - 1; i >= 0; i-- {
				w.fw.brk = append(w.fw.brk, 1-s.Breaks[i])
			}
		} else {
			w.fw.brk = append(w.fw.brk, s.Breaks...)
		}
		g.breaks = w.fw.brk
	}
	return g
}

// solveStack is Solve for a finite Stack.
func (s Solver) solveStack(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, Stats, error) {
	dst = dst[:0]
	if err := s.check(f, k); err != nil {
		return dst, Stats{}, err
	}
	w := getWork()
	defer putWork(w)
	fr := negligible(f)
	g := s.geometryFor(w, fr)
	st, n, why, err := s.stackRun(w, &g, k)
	if err != nil {
		return dst, st, err
	}
	// A field below tinyField moves a level by at most |f| times the
	// reach of the state, the box's largest |ξ − ½|.
	extra := 0.0
	if f != fr {
		extra = math.Abs(f) * max(math.Abs(w.fw.segs[0].lo-0.5), math.Abs(w.fw.segs[len(w.fw.segs)-1].lo+w.fw.segs[len(w.fw.segs)-1].w-0.5))
	}
	for j := range n {
		lv := &w.fw.out[j]
		b := lv.bound
		if extra > 0 {
			b = tiltwell.Estimate
		}
		dst = append(dst, tiltwell.Level{N: j + 1, Energy: lv.energy, Err: lv.Err + extra, Bound: b, Gamma: lv.gamma, GammaErr: lv.GammaErr})
	}
	if n < k {
		return dst, st, &tiltwell.ConfinedError{Method: "basis", F: f, Asked: k, Confined: n, Why: fmt.Sprintf("level %d: %s", n+1, why)}
	}
	return dst, st, nil
}

// walls removes both walls of the box from the Ritz level rho of level j
// (psi0, psi1: its values at the outer interfaces, dpsi their error) and
// completes lv, with the escape width under a field (greens.go). lv.err
// holds the truncation and rounding terms on entry. lv.wall is a model of
// the error the Green's function leaves (its part beyond the basis), used
// where no second basis size measures it (stackRun).
func (w *work) walls(g *geometry, N, j int, lv *flevel, rho, psi0, psi1, dpsi float64) {
	fw := &w.fw
	lv.energy, lv.gamma, lv.gammaRel, lv.wall, lv.chi = rho, 0, 0, 0, 0
	if fw.dl <= 0 || fw.dr <= 0 {
		// A wall on an interface: the level is not below that barrier.
		lv.err = math.Inf(1)
		lv.finish(0, 0)
		return
	}
	theta := w.eig[j]
	gap := math.Inf(1)
	if j > 0 {
		gap = theta - w.eig[j-1]
	}
	if j+1 < N {
		gap = min(gap, w.eig[j+1]-theta)
	}
	left := side{f: g.f, mu: g.ml, edge: g.edgeL, d: fw.dl, downhill: true}
	right := side{f: g.f, mu: g.mr, edge: g.edgeR, d: fw.dr}
	if g.f > 0 {
		left.s = math.Cbrt(math.Pi * math.Pi * g.ml * g.f)
		right.s = math.Cbrt(math.Pi * math.Pi * g.mr * g.f)
	}
	wl, ok := fw.walls2(&left, &right, w.d[:N], w.e[:N-1], fw.gy[:N], fw.gy[N:2*N], theta, psi0, psi1, gap)
	if !ok {
		lv.err = math.Inf(1)
		lv.finish(0, 0)
		return
	}
	lv.energy += wl.eta - theta
	lv.err += wl.errEta
	lv.gamma, lv.chi, lv.gammaRel = wl.gamma, wl.chi, wl.errGamma
	if wl.complex {
		// Γ and η are one complex root: the wall's measured error covers
		// both, and Γ does not inherit η's error through χ.
		lv.chi = 0
	} else {
		// The first-order width ∝ ((I − SD̃)⁻¹v)₀², v₀ = ψ(x₀): its
		// relative error is twice ψ(x₀)'s.
		lv.gammaRel += 2 * dpsi / math.Abs(psi0)
	}
	// The model of what G misses: the Ritz function's error at x₀
	// (through ψ(x₀)², the weight of the level's pole) times the distance
	// d from the pole, and the first-order tilt of the box states beyond
	// the basis, Σ_(m>N) χ_m(x₀)²W_mm/(E_m − η)², times d²/ψ(x₀)², from
	// the mean over the last basis states.
	ns := len(fw.segs)
	last := max(1, min(8, N/4))
	mw := 0.0
	for m := N - last; m < N; m++ {
		v := fw.ends[m*(ns+1)+fw.i0]
		mw += v * v * fw.wd[m]
	}
	mw /= float64(last)
	den := math.Max(fw.e[N-1]-wl.eta, 1)
	d2 := (wl.eta-theta)*(wl.eta-theta) + lv.gamma*lv.gamma/4
	p := max(psi0*psi0, psi1*psi1)
	lv.wall = math.Sqrt(d2)*2*dpsi/math.Sqrt(p) + d2/p*math.Abs(mw)*float64(N)/(3*den*den)
	lv.finish(lv.wall, 2*lv.wall)
}

// finish sets the reported errors from the parts: the wall's error in the
// level (wallE) and in Γ (wallG), and Γ's share of the level's error,
// ∂Γ/∂η = χΓ.
func (lv *flevel) finish(wallE, wallG float64) {
	lv.Err = lv.err + wallE
	lv.GammaErr = lv.gamma*lv.gammaRel + wallG + lv.gamma*math.Abs(lv.chi)*lv.Err
}
