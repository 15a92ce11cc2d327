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
	vmin, ec, ub := c.bounds(n)
	lo := max(vmin, floor)
	hi := min(ec, ub)
	if !(hi > lo) {
		return stackLevel{}, "the band edges leave no room below the barrier", nil
	}
	guess := hint
	if !(guess > lo && guess < hi) {
		guess = c.model(n)
	}
	if !(guess > lo && guess < hi) {
		guess = mid(lo, hi)
	}
	// D − (n−1)π at the top of the bracket: below the Dirichlet bound a
	// level is certain (min–max), and only a stand-in is needed. At the
	// ceiling the level is not certain, but D is increasing: a root that
	// Newton steps reach inside the bracket is the level. solveReal
	// evaluates D at the ceiling only when it needs the bracket (a
	// level within rounding of the ceiling is not confined).
	ghi := math.Pi / 2
	checkHi := !(ub < ec)
	// D is −π exactly at the level below; below the lowest band edge it
	// lies in (−π, 0).
	glo := -math.Pi
	if floor < vmin {
		glo = -(float64(n) - 0.5) * math.Pi
	}
	rl, err := c.solveReal(n, lo, hi, glo, ghi, guess, checkHi)
	if err == errAboveCeiling {
		return stackLevel{}, "above the barrier", nil
	}
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
	if err == nil && why == "" && !(out.lv.Energy+out.lv.Err < ec) {
		// The resonance's own η_r (it may move above η₀) is at or above
		// the ceiling.
		return out, "above the barrier", nil
	}
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
	sp := out.spacing
	// The pieces are evaluated at evalEta; the level is the Newton step
	// δ beyond it (δ ≈ 1e-8 when the iteration stopped on quadratic
	// convergence). ln Γ and κ₂ are carried over δ to first order, with
	// F_r″ from the last two evaluations, when those are far enough apart
	// for the difference to be accurate; otherwise the level equation is
	// evaluated again at the level.
	delta := eta - rl.evalEta
	Fp := wronskSlope(&rl.res)
	fpp := math.NaN() // F_r″/F_r′
	// F_r″ at evalEta from the cubic Hermite interpolant of F_r and F_r′
	// at the last two evaluations, a step h apart: it errs by about
	// h² F⁗/(12F′), which the carry multiplies by δ; F⁗/F′ is at most
	// about (|F″/F′| + 1/spacing)³ (also when F carries an exponential
	// factor e^(λη)). The carry is used only when that error is below
	// 1e-12 of Γ.
	h := rl.prevEta - rl.evalEta
	carryErr := math.Inf(1)
	if !math.IsNaN(rl.prevFp) && math.Abs(h) > 1e-9*sp && math.Abs(h) < 0.1*sp {
		F := wronsk(&rl.res)
		dF := rl.prevF - F - Fp*h
		dD := rl.prevFp - Fp
		fpp = 2 * (3*dF/h - dD) / (h * Fp)
		k := math.Abs(fpp) + 1/sp
		carryErr = math.Abs(delta) * h * h * k * k * k
	}
	if delta != 0 && !(carryErr <= 1e-12 && math.Abs(delta) <= 1e-6*sp) {
		rl.res = c.eval(eta, m, rl.S)
		rl.evalEta = eta
		rl.prevFp = math.NaN()
		delta = 0
		Fp = wronskSlope(&rl.res)
		fpp = math.NaN()
	}
	if delta == 0 {
		carryErr = 0
	}
	L, R := &rl.res.L, &rl.res.R
	v := rstate{u: dual{0, 0}, w: dual{1, 0}}
	for j := 1; j < m; j++ {
		c.cross(&v, j, 1, rl.evalEta, nil)
	}
	G := v.u.v*R.w.v - v.w.v*R.u.v
	Gd := v.u.d*R.w.v + v.u.v*R.w.d - v.w.d*R.u.v - v.w.v*R.u.d
	bc := rl.res.bc
	if !rl.res.hasBC {
		bc.lam, bc.pre, bc.zeta = c.leftBC(rl.evalEta)
	}
	lam, lnPrest, zetaI := bc.lam, math.Log(bc.pre), bc.zeta
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
	// χ₁ = (PG)′/(PG), with P′/P = 2μΛ/f (P ∝ 1/M²).
	chi1 := 2*mu0*lam.v/c.f + Gd/G
	lnGamma := math.Log(ratio) + lnScale
	if delta != 0 {
		lnGamma += delta * (chi1 - fpp)
	}
	steps := float64(L.steps + R.steps + v.steps)
	relRound := 8*eps*(4+steps) + 2*eps*(math.Abs(lnPrest)+2*zetaI+math.Abs(v.lg)+math.Abs(L.lg))
	if lnGamma < math.Log(gammaFloor) {
		out.lv.Gamma, out.lv.GammaErr = 0, gammaFloor
		return "", nil
	}
	gamma := math.Exp(lnGamma)
	g := -gamma / 2
	// κ₂ = F_r″/(2F_r′), when the second-order shift can matter.
	kappa2 := 0.0
	if math.Abs(g)*(math.Abs(chi1)+1/sp) > 1e-9 {
		if math.IsNaN(fpp) {
			h := 1e-6 * sp
			r2 := c.eval(rl.evalEta+h, m, rl.S)
			Fp2 := wronskSlope(&r2) * math.Exp(r2.L.lg+r2.R.lg-L.lg-R.lg)
			fpp = (Fp2 - Fp) / (h * Fp)
		}
		kappa2 = fpp / 2
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
	// Rounding, the level's own error carried through d ln Γ/dη, the
	// neglected third order, and the first-order carry over δ (its
	// second-order remainder, and the error of F_r″ over d).
	carry := delta*delta*chi*chi + 2*carryErr
	out.lv.GammaErr = gamma * (relRound + (math.Abs(chi1)+2*math.Abs(kappa2))*rl.err + 4*gc*gc + carry)
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
	merr           float64 // η₀ − model of the level below (NaN if none)
}

func newLevelIter() levelIter {
	return levelIter{floor: math.Inf(-1), prevR: math.Inf(-1), merr: math.NaN()}
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
	mdl := c.model(n)
	switch {
	case !math.IsNaN(mdl) && !math.IsNaN(it.merr):
		// The model, corrected by its error on the level below.
		hint = mdl + it.merr
	case !math.IsNaN(mdl):
		hint = mdl
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
	it.merr = sl.real.eta - mdl
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
	return stackLevel{}, fmt.Errorf("exact: level %d: %w", n, tiltwell.ErrLevel)
}

// mirrorSides reports whether the layers on the two sides of the
// reference layer are mirror images of each other (widths, band edges and
// masses), as in every symmetric stack.
func (c *calc) mirrorSides() bool {
	r := c.ref()
	if 2*r != c.n-1 {
		return false
	}
	for j := range r {
		a, _ := c.st.Layer(j)
		b, _ := c.st.Layer(c.n - 1 - j)
		if a != b {
			return false
		}
	}
	return true
}

// model returns a starting value for level n when the reference layer has
// confining sides (NaN otherwise): the zero-field level of the reference
// well, from the phase condition
//
//	k + δ_L + δ_R = nπ,   δ = atan2(k φ, ±w)
//
// with (φ, w) the zero-field solution that decays away from the well on
// each side, carried through that side's layers to the well's edge (for a
// single barrier δ = atan(μk/κ), κ = π√(μ(v − η))); then shifted by the
// Stark shift of the infinite well of the equivalent width L = nπ/k (at
// the field f L³ in its own units, scaled by 1/L²) from the infinite
// solver's own starting models (second order and triangular).
func (c *calc) model(n int) float64 {
	r := c.ref()
	_, _, v0, _ := c.layer(0)
	_, _, vn, _ := c.layer(c.n - 1)
	if !(v0 > 0 && vn > 0) || n > MaxLevels {
		return math.NaN()
	}
	// side returns the phase δ of one side at wave number k and dδ/dk,
	// or ok false if the side does not confine or its solution has a
	// zero (the side holds a level of its own).
	side := func(k float64, left bool) (d, dd float64, ok bool) {
		eta := k * k / (math.Pi * math.Pi)
		var st rstate
		if left {
			_, _, v, mu := c.layer(0)
			if !(v > eta) {
				return 0, 0, false
			}
			kap := math.Pi * math.Sqrt(mu*(v-eta))
			st = rstate{u: dual{1, 0}, w: dual{kap / mu, -math.Pi * math.Pi / (2 * kap)}}
			for j := 1; j < r; j++ {
				lo, hi, v, mu := c.layer(j)
				zeroFieldLayer(&st, hi-lo, v, mu, eta)
			}
		} else {
			_, _, v, mu := c.layer(c.n - 1)
			if !(v > eta) {
				return 0, 0, false
			}
			kap := math.Pi * math.Sqrt(mu*(v-eta))
			st = rstate{u: dual{1, 0}, w: dual{-kap / mu, math.Pi * math.Pi / (2 * kap)}}
			for j := c.n - 2; j > r; j-- {
				lo, hi, v, mu := c.layer(j)
				zeroFieldLayer(&st, lo-hi, v, mu, eta)
			}
			st.w = dual{-st.w.v, -st.w.d}
		}
		if st.nodes != 0 || !(st.u.v > 0) {
			return 0, 0, false
		}
		// δ = atan2(kφ, w); dη/dk = 2k/π².
		y, x := k*st.u.v, st.w.v
		e := 2 * k / (math.Pi * math.Pi)
		yd := st.u.v + k*st.u.d*e
		xd := st.w.d * e
		return math.Atan2(y, x), (yd*x - y*xd) / (x*x + y*y), true
	}
	// In a stack whose sides are mirror images (every symmetric stack)
	// one side serves both.
	same := c.mirrorSides()
	g := func(k float64) (float64, float64, bool) {
		dl, dld, ok1 := side(k, true)
		if same {
			return k + 2*dl - float64(n)*math.Pi, 1 + 2*dld, ok1
		}
		dr, drd, ok2 := side(k, false)
		return k + dl + dr - float64(n)*math.Pi, 1 + dld + drd, ok1 && ok2
	}
	kt := math.Pi * math.Sqrt(min(v0, vn))
	lo, hi := 0.0, min(float64(n)*math.Pi, kt*(1-1e-12))
	if v, _, ok := g(hi); !ok || v < 0 {
		return math.NaN() // beyond the model's bound levels
	}
	// Start from the penetration estimate of the outer barriers.
	_, _, _, ml := c.layer(0)
	_, _, _, mr := c.layer(c.n - 1)
	k := float64(n) * math.Pi / (1 + ml/(math.Pi*math.Sqrt(ml*v0)) + mr/(math.Pi*math.Sqrt(mr*vn)))
	if !(k > lo && k < hi) {
		k = 0.5 * (lo + hi)
	}
	// A start good to about 1e-8 is all the solver needs. Where the
	// Stark shift (about C_n f² for the infinite well, secondOrder) is
	// above 1e-4, the shift's own error is far larger than that, and a
	// Newton step below 1e-4 k, whose result is good to about 1e-8, is
	// taken without evaluating g again to confirm it.
	short := 1e-8
	if math.Abs(secondOrder(n))*c.f*c.f > 1e-4 {
		short = 1e-4
	}
	for range 8 {
		v, d, ok := g(k)
		if !ok {
			return math.NaN()
		}
		if v == 0 {
			break
		}
		if v > 0 {
			hi = k
		} else {
			lo = k
		}
		nk := k - v/d
		if math.Abs(nk-k) < short*k {
			// Converged (a step this short may round onto the end of
			// the bracket it came from; bisecting away would undo it).
			k = nk
			break
		}
		if !(nk > lo && nk < hi) {
			nk = 0.5 * (lo + hi)
		}
		k = nk
	}
	eta0 := k * k / (math.Pi * math.Pi)
	if c.f == 0 {
		return eta0
	}
	L := float64(n) * math.Pi / k
	fl := c.f * L * L * L
	if !(fl < MaxField) {
		return math.NaN()
	}
	nn := float64(n) * float64(n)
	// α = (π² f L³)^(1/3) = L (π²f)^(1/3), the reference layer's scale
	// (its mass ratio is 1).
	alpha := L * c.scale(r).s
	tri := -fl/2 - airyZero(n)*(alpha*alpha/(math.Pi*math.Pi))
	inf := guess(fl, alpha, n, tri, math.NaN(), max(nn-fl/2, tri), nn+fl/2)
	return eta0 + (inf-nn)/(L*L)
}
