package exact

import (
	"errors"
	"fmt"
	"math"
	"sync"

	"github.com/tiltwell/tiltwell"
)

// The level equation of a stack (see [Solver] for the model and the
// formulation). The stack is seen at the folded field f ≥ 0: the downhill
// side is on the left.

// gammaFloor is the smallest escape width reported as a number: a smaller
// Γ is reported as Gamma = 0 with GammaErr = gammaFloor, an upper bound.
const gammaFloor = 1e-300

// narrowLimit is the largest γχ (half-width times the relative rate of
// change of the level equation) for which the perturbative Γ is used; its
// relative error is about (γχ)².
const narrowLimit = 1e-5

// leftBC returns the log-derivative w/φ at interface 1 that the solution
// has coming from the left: the decaying exponential at f = 0, and the
// real part (s/μ)M′/M of the outgoing wave's log-derivative at f > 0; with,
// for f > 0, the flux factor P = pre·e^(−2ζ) (the imaginary part is −P;
// pre = 1 and ζ = 0 at f = 0).
func (c *calc) leftBC(eta float64) (lam dual, pre, zeta float64) {
	_, hi, v, mu := c.layer(0)
	if c.f == 0 {
		k := math.Pi * math.Sqrt(mu*max(v-eta, 0))
		return dual{k / mu, -math.Pi * math.Pi / (2 * k)}, 1, 0
	}
	q := max(v+c.f*(hi-0.5)-eta, 0)
	ls := c.scale(0)
	if z := ls.c * q; z < posStart {
		return ls.modulusTable(z)
	}
	p := ls.forbOne(q, true)
	return ls.modulusBC(&p)
}

// rightBC returns the log-derivative at interface n−1 of the solution that
// decays to the right: e^(−κξ) at f = 0, Ai at f > 0.
func (c *calc) rightBC(eta float64) dual {
	lo, _, v, mu := c.layer(c.n - 1)
	if c.f == 0 {
		k := math.Pi * math.Sqrt(mu*max(v-eta, 0))
		return dual{-k / mu, math.Pi * math.Pi / (2 * k)}
	}
	q := max(v+c.f*(lo-0.5)-eta, 0)
	ls := c.scale(c.n - 1)
	if z := ls.c * q; z < posStart {
		return ls.aiTable(z)
	}
	p := ls.forbOne(q, false)
	return p.ld
}

// evalResult is the level equation at one η.
type evalResult struct {
	// D is the mismatch ϑ_L − ϑ_R of the Prüfer angles at the matching
	// interface, Dp = dD/dη, errD an estimate of the rounding error in D.
	D, Dp, errD float64
	// The left and right solutions at the matching interface.
	L, R rstate
	// The left boundary condition at this η (leftBC), when hasBC: the
	// escape width reuses it.
	bc    leftEdge
	hasBC bool
}

// leftEdge is what leftBC returns at one η.
type leftEdge struct {
	lam       dual
	pre, zeta float64
}

// angle returns the line angle of (w, Sφ) in [0, π) and its η-derivative.
func angle(st *rstate, S float64) (a, ad float64) {
	U, W := S*st.u.v, st.w.v
	r := max(math.Abs(U), math.Abs(W))
	if r == 0 || math.IsInf(r, 0) {
		return lineAngle(U, W), 0
	}
	U, W = U/r, W/r
	Ud, Wd := S*st.u.d/r, st.w.d/r
	return lineAngle(U, W), (Ud*W - U*Wd) / (U*U + W*W)
}

// eval evaluates the level equation at η with matching interface m and
// Prüfer scale S.
func (c *calc) eval(eta float64, m int, S float64) evalResult {
	var bc leftEdge
	bc.lam, bc.pre, bc.zeta = c.leftBC(eta)
	res := evalResult{L: rstate{u: dual{1, 0}, w: bc.lam}}
	for j := 1; j < m; j++ {
		c.cross(&res.L, j, 1, eta, nil)
	}
	res.R = rstate{u: dual{1, 0}, w: c.rightBC(eta)}
	for j := c.n - 2; j >= m; j-- {
		c.cross(&res.R, j, -1, eta, nil)
	}
	res = c.match(res.L, res.R, S)
	res.bc, res.hasBC = bc, true
	return res
}

// bounds returns, for level n: the lowest band edge vmin of the problem on
// [ξ₁, ∞) (every level lies above it), the confinement ceiling ec (the
// lower of the outer band edges at their interfaces: levels must lie
// below it), and a rigorous upper bound ub on the n-th level: the
// Dirichlet levels v + n²/(μw²) of an inner layer raised by the largest
// field potential in it (min–max).
func (c *calc) bounds(n int) (vmin, ec, ub float64) {
	f := c.f
	_, x1, v0, _ := c.layer(0)
	xn, _, vn, _ := c.layer(c.n - 1)
	ec = min(v0+f*(x1-0.5), vn+f*(xn-0.5))
	vmin = vn + f*(xn-0.5)
	ub = math.Inf(1)
	nn := float64(n) * float64(n)
	for j := 1; j < c.n-1; j++ {
		lo, hi, v, mu := c.layer(j)
		vmin = min(vmin, v+f*(lo-0.5))
		w := hi - lo
		ub = min(ub, v+nn/(mu*w*w)+f*(hi-0.5))
	}
	return vmin, ec, ub
}

// ref returns the index of the reference layer in the folded frame.
func (c *calc) ref() int {
	r := c.st.Ref()
	if c.mirror {
		return c.n - 1 - r
	}
	return r
}

// matchPoint returns the default matching interface: the left edge of the
// inner layer whose band edge (at its left edge, the lowest point of the
// layer for f ≥ 0) is lowest, where the low levels live.
func (c *calc) matchPoint() int {
	best, m := math.Inf(1), 1
	for j := 1; j < c.n-1; j++ {
		lo, _, v, _ := c.layer(j)
		if e := v + c.f*(lo-0.5); e < best {
			best, m = e, j
		}
	}
	return m
}

// maxSelect is the most layers for which the matching interface is chosen
// level by level; larger stacks keep the default.
const maxSelect = 64

// allEval is the level equation at every inner interface.
type allEval struct {
	L, R [maxSelect]rstate
	S    [maxSelect]float64
	bc   leftEdge
}

// evalAll evaluates the level equation at every inner interface at once:
// the left solution is carried rightward and the right one leftward
// through all inner layers. The Prüfer scales S are those at η = ref.
func (c *calc) evalAll(a *allEval, eta, ref float64) {
	a.bc.lam, a.bc.pre, a.bc.zeta = c.leftBC(eta)
	a.L[1] = rstate{u: dual{1, 0}, w: a.bc.lam}
	for i := 2; i < c.n; i++ {
		a.L[i] = a.L[i-1]
		c.cross(&a.L[i], i-1, 1, eta, nil)
	}
	a.R[c.n-1] = rstate{u: dual{1, 0}, w: c.rightBC(eta)}
	for i := c.n - 2; i >= 1; i-- {
		a.R[i] = a.R[i+1]
		c.cross(&a.R[i], i, -1, eta, nil)
	}
	for i := 1; i < c.n; i++ {
		a.S[i] = c.scaleAt(i, ref)
	}
}

// thickInner reports whether some inner layer is a barrier at η that
// holds the solution's growth to more than e^3 (∫κ > 3 at the lower of
// its ends): only then does it matter at which interface a level is
// matched.
func (c *calc) thickInner(eta float64) bool {
	for j := 1; j < c.n-1; j++ {
		lo, hi, v, mu := c.layer(j)
		q := v + c.f*(lo-0.5) - eta
		if q > 0 && math.Pi*math.Sqrt(mu*q)*(hi-lo) > 3 {
			return true
		}
	}
	return false
}

// flattest returns the interface where dD/dη is smallest, among those
// where the level equation agrees with η being within slack of its root:
// |D − target| ≤ D′ slack + 1e-9, target = (n − 1)π. By the Prüfer
// identity dϑ/dη = S π² ∫φ²/(S²φ² + w²), at a level that is where the
// level's wavefunction is largest: both solutions reach it growing
// (stably), and the level equation is least steep there. Deep inside a
// thick barrier both solutions have lost all but their growing parts and
// their angles no longer follow η: D is flat there but stuck away from
// the target (by π/2, and by 0.25π, in stacks found by fuzzing, where the
// wavefunction matched there was nonsense). The test leaves such
// interfaces out; if it leaves none, the default interface is returned.
func (c *calc) flattest(a *allEval, target, slack float64) (evalResult, int) {
	best, m := math.Inf(1), 0
	var res evalResult
	for i := 1; i < c.n; i++ {
		r := c.match(a.L[i], a.R[i], a.S[i])
		// The slope is positive wherever it is computed faithfully; a
		// slope that is not is rounding noise and disqualifies the
		// interface.
		if r.Dp > 0 && r.Dp < best && math.Abs(r.D-target) <= r.Dp*slack+1e-9 {
			best, m, res = r.Dp, i, r
		}
	}
	if m == 0 {
		m = c.matchPoint()
		res = c.match(a.L[m], a.R[m], a.S[m])
	}
	res.bc, res.hasBC = a.bc, true
	return res, m
}

// match forms the level equation from the left and right solutions at one
// interface.
func (c *calc) match(L, R rstate, S float64) evalResult {
	res := evalResult{L: L, R: R}
	nr := R.nodes
	if R.u.v == 0 && nr > 0 {
		// A zero exactly at the matching point belongs to the left.
		nr--
	}
	aL, aLd := angle(&L, S)
	aR, aRd := angle(&R, S)
	res.D = float64(L.nodes+nr)*math.Pi + aL - aR
	res.Dp = aLd - aRd
	res.errD = 4 * eps * (4 + float64(L.steps+R.steps) + math.Abs(res.D))
	if L.over || R.over {
		res.errD = math.Inf(1)
	}
	return res
}

// scaleAt returns the Prüfer scale S at interface m for a level near η:
// the local wave number over μ.
func (c *calc) scaleAt(m int, eta float64) float64 {
	lo, _, v, mu := c.layer(m)
	q := v + c.f*(lo-0.5) - eta
	l := math.Pi * math.Pi * mu * math.Abs(q)
	s2 := 0.0
	if c.f > 0 {
		sc := c.scale(m)
		s2 = sc.s * sc.s
	}
	return math.Sqrt(max(l, s2, 1)) / mu
}

// realLevel is a solved level of the real problem.
type realLevel struct {
	eta, err float64
	// res is the level equation at evalEta, the last η evaluated (the
	// final η is a Newton step beyond it when the iteration stopped on
	// quadratic convergence).
	res     evalResult
	evalEta float64
	m       int
	S       float64
	its     int
	// The Wronskian F_r and its slope F_r′ of the evaluation before last,
	// at prevEta, scaled to res's log-scales (NaN if there was none at the
	// same matching point): with res's they give F_r″.
	prevEta, prevF, prevFp float64
}

// wronsk returns F_r = φ_L w_R − w_L φ_R from r's solutions (in their
// scaled units).
func wronsk(r *evalResult) float64 {
	return r.L.u.v*r.R.w.v - r.L.w.v*r.R.u.v
}

// wronskSlope returns F_r′ = d/dη (φ_L w_R − w_L φ_R) from the duals of r's
// solutions (in their scaled units).
func wronskSlope(r *evalResult) float64 {
	L, R := &r.L, &r.R
	return L.u.d*R.w.v + L.u.v*R.w.d - L.w.d*R.u.v - L.w.v*R.u.d
}

// solveReal finds level n of the real problem inside (lo, hi), where
// D(lo) < (n−1)π ≤ D(hi) (glo and ghi are D − (n−1)π at the ends, glo
// possibly a rough stand-in), starting from guess.
//
// The steps are Newton steps in θ, η = lo + (hi − lo) sin²θ over the
// first bracket, which removes the square-root behaviour of the level
// equation at both ends (D ∝ √(η − lo) above a band edge, and the tail's
// 1/κ below a barrier top); a step that leaves the bracket is replaced by
// an Illinois (modified regula falsi) step. In a stack of more than three
// layers the level equation is formed at every inner interface (they
// share their roots and the count of levels below η) and the shortest
// Newton step is taken: a level far from an interface makes the
// equation there steep, while it is smooth where the level lives.
//
// With checkHi, hi is the confinement ceiling and ghi a stand-in: D is
// evaluated there only when an Illinois step needs the bracket while hi is
// still the ceiling, and solveReal returns errAboveCeiling if D does not
// exceed (n−1)π there by more than its rounding. A root reached by Newton
// steps needs no such check: D increases with η, so a root below the
// ceiling is the level.
func (c *calc) solveReal(n int, lo, hi, glo, ghi, guess float64, checkHi bool) (realLevel, error) {
	target := float64(n-1) * math.Pi
	lo0, w0 := lo, hi-lo
	hi0 := hi
	eta := guess
	if !(eta > lo && eta < hi) {
		eta = mid(lo, hi)
	}
	// sel: the stack has several interfaces to choose from; full: this
	// iteration evaluates them all (the first, and after a rejected
	// step).
	sel := c.n > 3 && c.n <= maxSelect
	// Without thick inner barriers every interface does: start at the
	// default one.
	full := sel && c.thickInner(eta)
	var ae *allEval
	if sel {
		ae = allPool.Get().(*allEval)
		defer allPool.Put(ae)
	}
	m := c.matchPoint()
	ref := eta
	S := c.scaleAt(m, ref)
	var prevEta, prevDp float64
	havePrev := false
	side := 0 // Illinois: which end was kept last
	// The last evaluation's η, F_r, F_r′ and log-scale, for F_r″.
	lastEta, lastF, lastFp, lastLg, lastM := math.NaN(), math.NaN(), math.NaN(), 0.0, -1
	// newtonNext returns the θ-Newton step from η for the equation
	// value g with slope dp, and whether it lies inside the bracket.
	newtonNext := func(g, dp float64) (float64, bool) {
		if !(dp > 0) || math.IsInf(dp, 0) {
			return 0, false
		}
		next := eta - g/dp
		if u, v := (eta-lo0)/w0, (hi0-eta)/w0; u > 0 && v > 0 {
			// sin θ, cos θ and sin 2θ, cos 2θ without θ itself.
			sn, cs := math.Sqrt(u), math.Sqrt(v)
			s2, c2 := 2*sn*cs, v-u
			dth := -g / (dp * w0 * s2)
			// θ₁ = θ + Δθ must stay in (0, π/2); θ ≥ sin θ and
			// π/2 − θ ≥ cos θ settle most steps without θ.
			in := dth > -sn && dth < cs
			if !in {
				th := math.Atan2(sn, cs)
				in = th+dth > 0 && th+dth < math.Pi/2
			}
			if in {
				// Δη = w₀ sin(θ₁ + θ) sin(θ₁ − θ) = w₀ sin(2θ + Δθ)
				// sin Δθ, without cancellation.
				var sd, cd float64
				if t := dth * dth; t < 1e-6 {
					// The series, good to 1e-13 of the step
					// (the iteration needs far less).
					sd, cd = dth*(1-t/6), 1-t/2
				} else {
					sd, cd = math.Sincos(dth)
				}
				next = eta + w0*(s2*cd+c2*sd)*sd
			}
		}
		return next, next > lo && next < hi
	}
	for it := 1; it <= 200; it++ {
		var r evalResult
		next, ok := 0.0, false
		wasFull := full
		if full {
			c.evalAll(ae, eta, ref)
			// The shortest Newton step that stays in the bracket; if
			// none does, the equation where the previous step was
			// taken.
			bestStep := math.Inf(1)
			for i := 1; i < c.n; i++ {
				ri := c.match(ae.L[i], ae.R[i], ae.S[i])
				nx, in := newtonNext(ri.D-target, ri.Dp)
				if in && math.Abs(nx-eta) < bestStep {
					r, m, next, ok, bestStep = ri, i, nx, true, math.Abs(nx-eta)
				}
			}
			if !ok {
				r = c.match(ae.L[m], ae.R[m], ae.S[m])
			}
			r.bc, r.hasBC = ae.bc, true
			S = ae.S[m]
			full = false
			havePrev = false
		} else {
			r = c.eval(eta, m, S)
			next, ok = newtonNext(r.D-target, r.Dp)
		}
		evalEta := eta
		if math.IsInf(r.errD, 1) {
			return realLevel{}, fmt.Errorf("exact: level %d at f = %g: the stack's layers hold more than %d Taylor steps at this field: %w", n, c.f, maxSteps, tiltwell.ErrOutOfRange)
		}
		g := r.D - target
		if g > 0 {
			hi, ghi = eta, g
		} else {
			lo, glo = eta, g
		}
		dp := r.Dp
		ulp := eps * max(1, math.Abs(eta))
		// F_r and F_r′ of the evaluation before this one, in this one's
		// scale.
		pEta, pF, pFp := lastEta, math.NaN(), math.NaN()
		if lastM == m {
			sc := math.Exp(lastLg - (r.L.lg + r.R.lg))
			pF, pFp = lastF*sc, lastFp*sc
		}
		lastEta, lastF, lastFp, lastLg, lastM = eta, wronsk(&r), wronskSlope(&r), r.L.lg+r.R.lg, m
		done := func(eta, err float64) (realLevel, error) {
			evalEta := evalEta
			if sel && (wasFull || c.thickInner(evalEta)) {
				// Match where the level lives (it matters only
				// across thick inner barriers).
				if !wasFull {
					c.evalAll(ae, evalEta, ref)
				}
				// evalEta is within the last Newton step of the
				// root, some 1e-8 at most.
				r, m = c.flattest(ae, target, 1e-6*max(1, math.Abs(evalEta)))
				S = ae.S[m]
				if r.Dp > 0 {
					err = max(err, 2*r.errD/r.Dp+2*ulp)
				}
				pEta, pF, pFp = math.NaN(), math.NaN(), math.NaN()
			}
			return realLevel{eta: eta, err: err, res: r, evalEta: evalEta, m: m, S: S, its: it, prevEta: pEta, prevF: pF, prevFp: pFp}, nil
		}
		if dp > 0 && !math.IsInf(dp, 0) {
			step := g / dp
			if math.Abs(g) <= r.errD || math.Abs(step) <= 2*eps*math.Abs(eta) {
				nx := eta - step
				if !(nx >= lo && nx <= hi) {
					nx = eta
				}
				return done(nx, 2*r.errD/dp+2*ulp)
			}
			curv := 0.0
			if havePrev && eta != prevEta {
				curv = math.Abs((dp - prevDp) / (eta - prevEta) / (2 * dp))
			}
			prevEta, prevDp, havePrev = eta, dp, true
			if ok {
				if curv > 0 && 8*curv*step*step <= r.errD/dp+eps*math.Abs(eta) {
					nx := eta - step
					return done(nx, 2*r.errD/dp+2*eps*math.Abs(nx)+curv*step*step)
				}
				eta = next
				side = 0
				continue
			}
		}
		// Illinois step between the bracket ends, and a fresh look at
		// where to match. Its top end must hold a true value of D: at an
		// unchecked ceiling, evaluate it now.
		if checkHi && hi == hi0 {
			checkHi = false
			rhi, err := c.evalChecked(n, hi, c.matchPoint())
			if err != nil {
				return realLevel{}, err
			}
			if !(rhi.D-target > rhi.errD) {
				return realLevel{}, errAboveCeiling
			}
			ghi = rhi.D - target
		}
		full = sel
		a, b, ga, gb := lo, hi, glo, ghi
		switch {
		case side < 0:
			ga /= 2
		case side > 0:
			gb /= 2
		}
		nx := a - ga*(b-a)/(gb-ga)
		if g > 0 {
			side = 1
		} else {
			side = -1
		}
		if !(nx > lo && nx < hi) || math.IsInf(a, 0) || math.IsInf(b, 0) {
			nx = mid(lo, hi)
		}
		if nx == lo || nx == hi {
			return done(eta, 2*r.errD/max(dp, 1e-300)+2*ulp+(hi-lo))
		}
		eta = nx
	}
	return realLevel{}, fmt.Errorf("exact: level %d at f = %g: %w", n, c.f, tiltwell.ErrNoConvergence)
}

// errAboveCeiling is solveReal's report that D does not reach the
// level's target below the ceiling: the level is not confined.
var errAboveCeiling = errors.New("exact: level above the ceiling")

var allPool = sync.Pool{New: func() any { return new(allEval) }}

// mid returns the midpoint of [lo, hi], or a finite point inside it when
// an end is infinite.
func mid(lo, hi float64) float64 {
	switch {
	case math.IsInf(lo, -1) && math.IsInf(hi, 1):
		return 0
	case math.IsInf(lo, -1):
		return hi - max(1, 2*math.Abs(hi))
	case math.IsInf(hi, 1):
		return lo + max(1, 2*math.Abs(lo))
	}
	return lo + (hi-lo)/2
}
