package exact

import (
	"fmt"
	"math"

	"github.com/tiltwell/tiltwell"
)

// stackLevel is one solved level of a stack with what the wavefunction
// and the dipole need.
type stackLevel struct {
	lv      tiltwell.Level
	real    realLevel
	spacing float64 // π/(dD/dη): the local level spacing dη/dn
}

// notConfined says why a level is not confined; empty if it is.
type notConfined string

// solveStackLevel solves level n of c above floor (the level below, or
// −Inf) from the starting hint (NaN for none).
func (c *calc) solveStackLevel(n int, floor, hint float64) (stackLevel, notConfined, error) {
	target := float64(n-1) * math.Pi
	vmin, ec, ub := c.bounds(n)
	lo := max(vmin, floor)
	hi := min(ec, ub)
	guess := hint
	if !(guess > lo && guess < hi) {
		guess = mid(lo, hi)
	}
	if !(hi > lo) {
		return stackLevel{}, "the band edges leave no room below the barrier", nil
	}
	// The ceiling: if the level equation has not reached (n−1)π there,
	// level n is not confined.
	m := c.matchPoint()
	// A level within rounding of the ceiling is not confined.
	rhi, err := c.evalChecked(n, hi, m)
	if err != nil {
		return stackLevel{}, "", err
	}
	if !(rhi.D-target > rhi.errD) {
		if hi == ec {
			return stackLevel{}, "above the barrier", nil
		}
		// The level is within rounding of its Dirichlet bound (tall
		// barriers): widen the bound by its rounding width, and only
		// then fall back on the ceiling.
		hi = min(ec, hi+max(16*rhi.errD/max(rhi.Dp, 1e-300), 8*eps*math.Abs(hi), 1e-300))
		if rhi, err = c.evalChecked(n, hi, m); err != nil {
			return stackLevel{}, "", err
		}
		if !(rhi.D-target > rhi.errD) {
			hi = ec
			if rhi, err = c.evalChecked(n, hi, m); err != nil {
				return stackLevel{}, "", err
			}
			if !(rhi.D-target > rhi.errD) {
				return stackLevel{}, "above the barrier", nil
			}
		}
	}
	// D is −π exactly at the level below; below the lowest band edge it
	// lies in (−π, 0).
	glo := -math.Pi
	if floor < vmin {
		glo = -(float64(n) - 0.5) * math.Pi
	}
	rl, err := c.solveReal(n, lo, hi, glo, rhi.D-target, guess)
	if err != nil {
		return stackLevel{}, "", err
	}
	out := stackLevel{real: rl, spacing: math.Pi / rl.res.Dp}
	out.lv = tiltwell.Level{N: n, Energy: rl.eta, Err: rl.err, Bound: tiltwell.Estimate}
	if !(rl.eta+rl.err < ec) {
		return stackLevel{}, "above the barrier", nil
	}
	if c.f == 0 {
		return out, "", nil
	}
	why, err := c.escape(&out)
	return out, why, err
}

// evalChecked evaluates the level equation for level n at η, with an error
// if the layers need more Taylor steps than one evaluation may take.
func (c *calc) evalChecked(n int, eta float64, m int) (evalResult, error) {
	r := c.eval(eta, m, c.scaleAt(m, eta))
	if math.IsInf(r.errD, 1) {
		return r, fmt.Errorf("exact: level %d at f = %g: the stack's layers hold more than %d Taylor steps at this field: %w", n, c.f, maxSteps, tiltwell.ErrOutOfRange)
	}
	return r, nil
}

// escape fills in Γ (and the second-order shift of η_r) of a level of
// the real problem at f > 0.
//
// The outgoing boundary condition at interface 1 is the real one plus
// −iP(0, 1), so the complex level equation is F(η) = F_r(η) − iP G(η),
// with F_r the Wronskian of the real left and right solutions and G that
// of the left solution starting from (0, 1) with the right one. Around
// the real root η₀ (F_r(η₀) = 0), with g = PG/F_r′, χ₁ = (PG)′/(PG) and
// κ₂ = F_r″/(2F_r′),
//
//	η = η₀ + i g + g²(κ₂ − χ₁) + O(g³χ²),
//
// so Γ = −2g to relative order (gχ)², and η_r gains g²(κ₂ − χ₁).
func (c *calc) escape(out *stackLevel) (notConfined, error) {
	rl := &out.real
	eta, m := rl.eta, rl.m
	if rl.evalEta != eta {
		// Γ needs the solutions at the level itself.
		rl.res = c.eval(eta, m, rl.S)
		rl.evalEta = eta
	}
	L, R := &rl.res.L, &rl.res.R
	v := rstate{u: dual{0, 0}, w: dual{1, 0}}
	for j := 1; j < m; j++ {
		c.cross(&v, j, 1, eta, nil)
	}
	Fp := L.u.d*R.w.v + L.u.v*R.w.d - L.w.d*R.u.v - L.w.v*R.u.d
	G := v.u.v*R.w.v - v.w.v*R.u.v
	Gd := v.u.d*R.w.v + v.u.v*R.w.d - v.w.d*R.u.v - v.w.v*R.u.d
	lam, lnPrest, zetaI := c.leftBC(eta)
	_, _, _, mu0 := c.layer(0)
	lnScale := lnPrest - 2*zetaI + v.lg - L.lg
	ratio := -2 * G / Fp // Γ = ratio · e^lnScale
	if lnScale < math.Log(gammaFloor)-800 {
		// Far below anything a float64 holds, whatever the prefactor.
		out.lv.Gamma, out.lv.GammaErr = 0, gammaFloor
		return "", nil
	}
	if !(ratio > 0) || math.IsNaN(lnScale) {
		return "", fmt.Errorf("exact: level %d at f = %g: escape width of the wrong sign: %w", out.lv.N, c.f, tiltwell.ErrNoConvergence)
	}
	lnGamma := math.Log(ratio) + lnScale
	chi1 := 2*mu0*lam.v/c.f + Gd/G
	steps := float64(L.steps + R.steps + v.steps)
	relRound := 8*eps*(4+steps) + 2*eps*(math.Abs(lnPrest)+2*zetaI+math.Abs(v.lg)+math.Abs(L.lg))
	if lnGamma < math.Log(gammaFloor) {
		out.lv.Gamma, out.lv.GammaErr = 0, gammaFloor
		return "", nil
	}
	gamma := math.Exp(lnGamma)
	g := -gamma / 2
	// κ₂ from F_r′ at a nearby η, when the second-order shift can matter.
	kappa2 := 0.0
	sp := out.spacing
	if math.Abs(g)*(math.Abs(chi1)+1/sp) > 1e-9 {
		h := 1e-6 * sp
		r2 := c.eval(eta+h, m, rl.S)
		Fp2 := r2.L.u.d*r2.R.w.v + r2.L.u.v*r2.R.w.d - r2.L.w.d*r2.R.u.v - r2.L.w.v*r2.R.u.d
		Fp2 *= math.Exp(r2.L.lg + r2.R.lg - L.lg - R.lg)
		kappa2 = (Fp2 - Fp) / (2 * h * Fp)
	}
	chi := math.Abs(chi1) + math.Abs(kappa2) + 1/sp
	gc := math.Abs(g) * chi
	if gc > narrowLimit || c.forceBroad {
		return c.broad(out, g, chi1, kappa2)
	}
	eta2 := g * g * (kappa2 - chi1)
	out.lv.Energy = eta + eta2
	out.lv.Err = rl.err + 4*math.Abs(eta2)*gc + g*g*chi*gc
	out.lv.Gamma = gamma
	out.lv.GammaErr = gamma * (relRound + (math.Abs(chi1)+2*math.Abs(kappa2))*rl.err + 4*gc*gc)
	return "", nil
}

// levelIter walks the levels of a stack upwards, carrying what the next
// level's start and its confinement test need. Levels, Level,
// Wavefunction and Dipole all walk with it, so that they agree to the bit.
type levelIter struct {
	n              int
	e1, d1, e2, d2 float64 // the last two levels' η₀ and spacings
	floor          float64 // η₀ of the level below
	prevR          float64 // η_r of the level below
}

func newLevelIter() levelIter {
	return levelIter{floor: math.Inf(-1), prevR: math.Inf(-1)}
}

// next solves the next level. It reports why the level is not confined
// (empty if it is):
//
//   - η_r + Err is not below the ceiling (the lower of the outer band
//     edges at their interfaces);
//   - f ≠ 0 and Γ is not below the local level spacing π/(dD/dη);
//   - f ≠ 0 and Γ is not below the distance η_r − η_r(n−1) to the level
//     below (the two are not resolved).
func (c *calc) next(it *levelIter) (stackLevel, notConfined, error) {
	it.n++
	n := it.n
	hint := math.NaN()
	switch {
	case n >= 3:
		// Cubic Hermite extrapolation in n, dη/dn = π/(dD/dη).
		hint = 5*it.e2 - 4*it.e1 + 2*it.d2 + 4*it.d1
	case n == 2:
		hint = it.e1 + it.d1
	}
	sl, why, err := c.solveStackLevel(n, it.floor, hint)
	if err != nil || why != "" {
		return sl, why, err
	}
	if c.f != 0 {
		switch g := sl.lv.Gamma; {
		case !(g < sl.spacing):
			return sl, notConfined(fmt.Sprintf("its width Γ = %.3g exceeds the level spacing %.3g", g, sl.spacing)), nil
		case !(g < sl.lv.Energy-it.prevR):
			return sl, notConfined(fmt.Sprintf("its width Γ = %.3g exceeds its distance %.3g to the level below", g, sl.lv.Energy-it.prevR)), nil
		}
	}
	it.e2, it.d2 = it.e1, it.d1
	it.e1, it.d1 = sl.real.eta, sl.spacing
	it.floor = sl.real.eta
	it.prevR = sl.lv.Energy
	return sl, "", nil
}

// stackLevels appends the lowest k levels of the stack at f to dst.
func (s Solver) stackLevels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	dst = dst[:0]
	if err := tiltwell.CheckArgs("exact", f, k, MaxLevels, MaxField); err != nil {
		return dst, err
	}
	c := newCalc(s.Stack, f)
	it := newLevelIter()
	for n := 1; n <= k; n++ {
		sl, why, err := c.next(&it)
		if err != nil {
			return dst[:0], err
		}
		if why != "" {
			return dst, &tiltwell.ConfinedError{Method: "exact", F: f, Asked: k, Confined: n - 1, Why: fmt.Sprintf("level %d: %s", n, why)}
		}
		dst = append(dst, sl.lv)
	}
	return dst, nil
}

// stackLevel returns level n alone.
func (s Solver) stackLevel(f float64, n int) (tiltwell.Level, error) {
	sl, _, err := s.solveOneCalc(f, n)
	return sl.lv, err
}

// nth solves levels 1..n and returns level n, or a ConfinedError saying how
// many are confined.
func (c *calc) nth(n int, f float64) (stackLevel, error) {
	it := newLevelIter()
	for k := 1; k <= n; k++ {
		sl, why, err := c.next(&it)
		if err != nil {
			return stackLevel{}, err
		}
		if why != "" {
			return stackLevel{}, &tiltwell.ConfinedError{Method: "exact", F: f, Asked: n, Confined: k - 1, Why: fmt.Sprintf("level %d: %s", k, why)}
		}
		if k == n {
			return sl, nil
		}
	}
	panic("unreachable")
}
