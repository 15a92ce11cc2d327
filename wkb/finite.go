package wkb

import (
	"errors"
	"fmt"
	"math"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/internal/squarewell"
)

// This file puts the quantisation on a single finite well: the reference
// well between a left barrier v_L, μ_L and a right barrier v_R, μ_R (see
// the package documentation, "Finite barriers", for the rule, its sources
// and its measured accuracy). The field is folded to f ≥ 0 with
// [tiltwell.Stack.Fold], so the left barrier is the downhill one, through
// which the carrier escapes, and the right one is uphill. With
// e = η + f/2, the kinetic energy at the downhill interface ξ = 0, and
// ε_A = (f/π)^(2/3):
//
//	well:           x = (fξ − e)/ε_A,                    x₀ = −e/ε_A, x₁ = (f − e)/ε_A
//	left barrier:   z = μ_L^(1/3) (v_L − e + fξ)/ε_A,     z_L at ξ = 0, ζ_L = (2/3) z_L^(3/2)
//	right barrier:  z = μ_R^(1/3) (v_R − e + fξ)/ε_A,     z_R at ξ = 1
//
// The level function, in units of π (ψ = F/π, with dψ/de for Newton's
// method), is
//
//	F = S + χ(x₀) + d_L − χ(x₁) + g_R,
//	d_L = atan2(y(x₀), q_L B − l(x₀)),   g_R = atan2(y(x₁), l(x₁) − q_R Ai′/Ai(z_R)),
//
// with y = 1/(πM²), l = M′/M of the well's Airy pair, q = μ^(−2/3), and B
// the downhill barrier's log-derivative from its phase-integral series.

// Validity limits of the quasiclassical treatment of the downhill barrier.
const (
	// minBarrierAction is the smallest under-barrier action ζ_L = ∫κ dξ
	// (units of ħ) of a level the method reports: the phase-integral
	// series of the barrier's solution is used only where it is at least
	// this.
	minBarrierAction = 0.6
	// maxBroad is the largest (Γ/2)χ, the half-width times the rate at
	// which the width changes with η, for which the first-order width
	// and the second-order shift of η are used.
	maxBroad = 0.3
	// finiteSafety multiplies the first omitted terms of the series in
	// the connection rule's Err and GammaErr.
	finiteSafety = 2
	// gammaFloor is the smallest Γ reported as a number; a smaller one
	// is reported as Gamma = 0 with GammaErr = gammaFloor.
	gammaFloor = 1e-300
)

// maxAiryArg caps a barrier's Airy coordinate at its interface: past it
// (barriers up to 1e300 E₁ at fields down to 1e-150) the barrier is a
// hard wall to every digit, its step phase below 1e-50 and its Gamow
// factor e^(−1e150), and the cap keeps the arithmetic finite.
const maxAiryArg = 1e100

// well is a single finite well folded to f ≥ 0, with the constants of the
// connection rule.
type well struct {
	f              float64
	vL, mL, vR, mR float64
	ea, invEa      float64 // ε_A and 1/ε_A
	cL, cR         float64 // μ^(1/3)
	qL, qR         float64 // μ^(−2/3)
}

// newWell returns the well of a three-layer stack at field f ≥ 0.
func newWell(st tiltwell.Stack, f float64) well {
	l, r := st.Outer()
	w := well{f: f, vL: l.Edge, mL: l.Mass, vR: r.Edge, mR: r.Mass}
	if f > 0 {
		w.ea = airyEnergy(f)
		w.invEa = 1 / w.ea
		w.cL, w.cR = math.Cbrt(w.mL), math.Cbrt(w.mR)
		w.qL, w.qR = 1/(w.cL*w.cL), 1/(w.cR*w.cR)
	}
	return w
}

// checkStack returns an error wrapping errors.ErrUnsupported for a stack
// other than infinite walls or a single finite well.
func checkStack(st tiltwell.Stack) error {
	if st.Infinite() || st.Len() == 3 {
		return nil
	}
	return fmt.Errorf("wkb: stack %v: only infinite walls and a single finite well (3 layers) are supported: %w", st, errors.ErrUnsupported)
}

// The barrier's series is truncated after a number of terms that grows
// with the under-barrier action ζ_L, blended smoothly between whole
// numbers so that the level is a smooth function of the field:
//
//	K(ζ_L) = min(max(2 (ζ_L − 0.7), 0), 8),
//
// K = 0 being the plane-wave decay constant κ and K = 1 the first-order
// WKB form (1/√κ) e^(∫κ), whose log-derivative is κ − κ′/(2κ). The
// truncation error of B = √z V₊/U₊ then has one sign for every ζ_L the
// method accepts (after K terms it changes sign near ζ_L ≈ 0.55 K + 0.1:
// past that the next terms no longer measure it), and the next three
// terms, each counted at most as large as the one before, bound it: by
// 1.5 to 6 times the true error for ζ_L ≥ 0.9, measured on the exact
// Airy modulus (TestBarrierSeries).
const (
	maxBarrierOrder = 8
	barrierOffset   = 0.7
)

// barrierOrder returns the blend of the truncations: the order K, the
// weight σ of order K + 1, and dσ/dζ_L.
func barrierOrder(zetaL float64) (k int, sig, dsig float64) {
	kr := 2 * (zetaL - barrierOffset)
	if kr <= 0 {
		return 0, 0, 0
	}
	if kr >= maxBarrierOrder {
		return maxBarrierOrder, 0, 0
	}
	k = int(kr)
	t := kr - float64(k)
	// σ = 6t⁵ − 15t⁴ + 10t³: its first and second derivatives vanish at
	// both ends, so the level has two continuous derivatives in f.
	return k, t * t * t * (10 + t*(6*t-15)), 60 * t * t * (1 - t) * (1 - t)
}

// barrierSeriesErr returns the estimate of the error of a quantity that
// changes by sB δB/B + sU δU₊/U₊ with the relative errors of
// B = √z V₊/U₊ and U₊ in the blend of [barrierOrder] at ζ: after each
// truncation K, the next three terms' changes, each counted at most as
// large as the one before, blended with the same weight.
func barrierSeriesErr(zeta, sB, sU float64) float64 {
	c := airyCoefs()
	k, sig, _ := barrierOrder(zeta)
	b := 1 / zeta
	// Partial sums U_j, V_j for j = 0..k+4.
	var u, v [maxBarrierOrder + 5]float64
	u[0], v[0] = 1, 1
	bk := 1.0
	for j := 1; j <= k+4; j++ {
		bk *= b
		u[j] = u[j-1] + c.u[j]*bk
		v[j] = v[j-1] + c.v[j]*bk
	}
	est := 0.0
	for j, wt := range [2]float64{1 - sig, sig} {
		if wt == 0 {
			continue
		}
		cp := math.Inf(1)
		r0, u0 := v[k+j]/u[k+j], u[k+j]
		for i := k + j + 1; i <= k+j+3; i++ {
			d := sB*(v[i]/u[i]-v[i-1]/u[i-1])/r0 + sU*(u[i]-u[i-1])/u0
			cp = min(cp, math.Abs(d))
			est += wt * cp
		}
	}
	return est
}

// barrierSeries returns U₊ = Σ_(k≤K) u_k ζ^(−k) and V₊ = Σ v_k ζ^(−k)
// (DLMF 9.7.7–9.7.8) and their derivatives with respect to b = 1/ζ.
func barrierSeries(b float64, K int) (u, v, du, dv float64) {
	c := airyCoefs()
	u, v = 1, 1
	bk := 1.0
	for k := 1; k <= K; k++ {
		du += float64(k) * c.u[k] * bk
		dv += float64(k) * c.v[k] * bk
		bk *= b
		u += c.u[k] * bk
		v += c.v[k] * bk
	}
	return u, v, du, dv
}

// downhill holds the downhill interface's quantities.
type downhill struct {
	chi0   float64 // χ(x₀) = θ(x₀) − ζ₀, the well's phase past its action
	y, l   float64 // 1/(πM²) and M′/M of the well at x₀
	b      float64 // B = M_b′/M_b of the barrier at z_L
	u      float64 // U₊, with M_b² = e^(2ζ_L) U₊²/(π √z_L)
	x      float64 // q_L B − l
	d2     float64 // x² + y²
	dL     float64 // the step phase atan2(y, x)
	dchi0  float64 // dχ(x₀)/de
	dx, dy float64 // de-derivatives of x and y
	ddL    float64 // dd_L/de
	dlnG   float64 // d ln G/de
}

// well side of the downhill interface at e: the well's solution to all
// digits, its Airy modulus and phase at x₀ = −e/ε_A.
func (w *well) wellSide(e float64) (d downhill) {
	x0 := -e * w.invEa
	var dchi, dldx float64
	d.chi0, dchi, d.y, d.l, dldx = airyWall(x0)
	// dx₀/de = −1/ε_A, θ″ = −2θ′ l, l′ = x + θ′² − l² (from w″ = x w,
	// DLMF 9.2.1).
	d.dchi0 = -dchi * w.invEa
	d.dy = 2 * d.y * d.l * w.invEa
	d.dx = dldx * w.invEa // −dl/de, completed by the barrier side
	return d
}

// withBarrier completes the well side ws with the barrier's growing
// solution at z_L, ζ_L from its phase-integral series, B = √z_L V₊/U₊:
// blended as in [barrierOrder] if K < 0, else truncated after K terms
// (then without derivatives).
func (w *well) withBarrier(ws downhill, zl, zetaL float64, K int) downhill {
	d := ws
	b := 1 / zetaL
	sz := math.Sqrt(zl)
	var r, u, dr, du float64 // V₊/U₊, U₊ and their b-derivatives
	var sig, dsig, r1, u1 float64
	k := K
	if K < 0 {
		k, sig, dsig = barrierOrder(zetaL)
	}
	u0, v0, du0, dv0 := barrierSeries(b, k)
	r, u = v0/u0, u0
	dr, du = (dv0*u0-v0*du0)/(u0*u0), du0
	if sig > 0 {
		uu, vv, duu, dvv := barrierSeries(b, k+1)
		r1, u1 = vv/uu, uu
		dr = (1-sig)*dr + sig*(dvv*uu-vv*duu)/(uu*uu)
		du = (1-sig)*du + sig*duu
		r = (1-sig)*r + sig*r1
		u = (1-sig)*u + sig*u1
	}
	d.u = u
	d.b = sz * r
	d.x = w.qL*d.b - d.l
	d.d2 = d.x*d.x + d.y*d.y
	d.dL = math.Atan2(d.y, d.x)
	if K >= 0 {
		return d
	}
	// dz_L/de = −μ_L^(1/3)/ε_A, dζ_L/de = √z_L dz_L/de, db/de = −b² dζ_L/de.
	dzl := -w.cL * w.invEa
	dzeta := sz * dzl
	dbdE := -b * b * dzeta
	drE := dr * dbdE
	duE := du * dbdE
	if sig > 0 {
		// the blend's weight moves with ζ_L
		drE += dsig * dzeta * (r1 - v0/u0)
		duE += dsig * dzeta * (u1 - u0)
	}
	dB := dzl/(2*sz)*r + sz*drE
	d.dx = w.qL*dB + ws.dx
	d.ddL = (d.x*d.dy - d.y*d.dx) / d.d2
	// G = q_L y √z_L e^(−2ζ_L)/(U₊² (x² + y²)).
	d.dlnG = d.dy/d.y + dzl/(2*zl) - 2*dzeta - 2*duE/u - 2*(d.x*d.dx+d.y*d.dy)/d.d2
	return d
}

// lnG returns ln G, the imaginary part the outgoing wave adds to F
// (see [well.finish]).
func (w *well) lnG(d *downhill, zl, zetaL float64) float64 {
	return math.Log(w.qL*d.y*math.Sqrt(zl)/(d.u*d.u*d.d2)) - 2*zetaL
}

// point is the connection rule evaluated at one e.
type point struct {
	e         float64
	psi, dpsi float64 // F/π and (dF/de)/π
	zl        float64 // z_L
	zetaL     float64 // ζ_L, the under-barrier action
	dh        downhill
	x1        float64 // the uphill interface's Airy coordinate
}

// eval evaluates the connection rule at e, for f > 0, 0 < e < v_L.
func (w *well) eval(e float64) point {
	p := point{e: e}
	f := w.f
	s, ds := action(f, e)
	ul := w.vL - e
	p.zl = min(w.cL*ul*w.invEa, maxAiryArg)
	p.zetaL = 2.0 / 3 * p.zl * math.Sqrt(p.zl)
	d := w.withBarrier(w.wellSide(e), p.zl, p.zetaL, -1)
	p.dh = d
	// Uphill interface, to all digits. Its derivatives follow from the
	// modulus–phase identities and the Riccati form λ′ = z − λ² of
	// Ai″ = z Ai, with dx₁/de = −1/ε_A and dz_R/de = −μ_R^(1/3)/ε_A.
	x1 := (f - e) * w.invEa
	p.x1 = x1
	chi1, dchi1, y1, l1, dldx1 := airyWall(x1)
	zr := min(max(w.cR*(w.vR-e+f)*w.invEa, 0), maxAiryArg)
	lam, dlamdz := airyAiLog(zr)
	X1 := l1 - w.qR*lam
	gR := math.Atan2(y1, X1)
	dy1 := 2 * y1 * l1 * w.invEa
	dl1 := -dldx1 * w.invEa
	dlam := -dlamdz * w.cR * w.invEa
	dX1 := dl1 - w.qR*dlam
	dgR := (X1*dy1 - y1*dX1) / (X1*X1 + y1*y1)
	p.psi = s + (d.chi0-chi1+gR+d.dL)*(1/math.Pi)
	p.dpsi = ds + (d.dchi0+dchi1*w.invEa+dgR+d.ddL)*(1/math.Pi)
	return p
}

// limits returns the interval of e in which the connection rule is
// evaluated: ζ₀ ≥ minWellAction above lo, and below hi both the
// confinement ceiling (the level below the outer band edges at their
// interfaces, e < v_L and e < v_R + f) and ζ_L ≥ minBarrierAction; and
// whether hi is set by the barrier action rather than the ceiling.
func (w *well) limits() (lo, hi float64, byAction bool) {
	f := w.f
	lo = 0
	// ζ_L = (2π√μ_L/(3f)) (v_L − e)^(3/2) ≥ minBarrierAction.
	c := 3 * f * minBarrierAction / (2 * math.Pi * math.Sqrt(w.mL))
	hi = w.vL - math.Cbrt(c*c)
	byAction = true
	if ceil := w.vR + f; ceil <= hi {
		hi, byAction = ceil, false
	}
	return lo, hi, byAction
}

// solve finds e of level n by Newton's method on ψ = F/π, kept inside the
// bracket [lo, hi] on which ψ(lo) ≤ n − 1 + … < n ≤ ψ(hi) has been
// checked by the caller, starting from guess.
func (w *well) solve(n int, lo, hi, guess float64) (point, error) {
	fn := float64(n)
	e := guess
	if !(e > lo && e < hi) {
		e = lo + (hi-lo)/2
	}
	for range 100 {
		p := w.eval(e)
		if p.psi < fn {
			lo = e
		} else {
			hi = e
		}
		step := (fn - p.psi) / p.dpsi
		next := e + step
		as := math.Abs(step)
		// A step at the rounding of ψ leaves e within it of the root.
		if as <= 2*eps*e+2*eps*(fn+1)/p.dpsi || hi-lo <= 4*eps*hi {
			return p, nil
		}
		if !(next > lo && next < hi) {
			next = lo + (hi-lo)/2
		}
		e = next
	}
	return point{}, fmt.Errorf("wkb: f = %g, n = %d: finite-well rule did not converge: %w", w.f, n, tiltwell.ErrNoConvergence)
}

// finiteLevels is [Solver.Levels] for a single finite well.
func (s Solver) finiteLevels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	st, af, _ := s.Stack.Fold(f)
	if af < tinyField {
		return zeroFieldLevels(dst, st, f, k)
	}
	w := newWell(st, af)
	dst, _, err := w.scanLevels(dst, f, k, s.Plain)
	return dst, err
}

// scanLevels appends levels 1..k of w (at the unfolded field f, for the
// errors) to dst[:0] and returns them with the root of the last one.
func (w *well) scanLevels(dst []tiltwell.Level, f float64, k int, plain bool) ([]tiltwell.Level, point, error) {
	dst = dst[:0]
	sc := w.newScan()
	var prev, prev2 point
	for n := 1; n <= k; n++ {
		// A start from the levels below (a cubic through the last two
		// levels and spacings, as far as they are known).
		guess := math.NaN()
		switch {
		case n >= 3:
			// Cubic Hermite extrapolation, exact for e(n) up to cubic.
			guess = 5*prev2.e - 4*prev.e + 2/prev2.dpsi + 4/prev.dpsi
		case n == 2:
			guess = prev.e + 1/prev.dpsi
		}
		p, why, err := sc.next(n, guess)
		if err != nil {
			return dst[:0], point{}, err
		}
		lv := tiltwell.Level{}
		if why == "" {
			lv, why = w.finish(n, p)
		}
		if why != "" {
			return dst, prev, &tiltwell.ConfinedError{Method: "wkb", F: f, Asked: k, Confined: n - 1, Why: fmt.Sprintf("level %d: %s", n, why)}
		}
		if plain {
			lv = w.plainLevel(lv, p)
		}
		if !finite(lv.Energy, lv.Err, lv.Gamma, lv.GammaErr) {
			return dst[:0], point{}, fmt.Errorf("wkb: f = %g, n = %d: the finite-well rule lost its accuracy (%+v): %w", f, n, lv, tiltwell.ErrNoConvergence)
		}
		dst = append(dst, lv)
		prev2, prev = prev, p
	}
	return dst, prev, nil
}

// finite reports whether every x is neither NaN nor infinite.
func finite(xs ...float64) bool {
	for _, x := range xs {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return false
		}
	}
	return true
}

// scan finds the levels of the connection rule in increasing order.
type scan struct {
	w            *well
	lo, hi       float64 // the bracket of the next level
	psiLo, psiHi float64 // ψ at the bottom of the well and at hi
	byAction     bool    // hi is set by minBarrierAction, not by the ceiling
}

func (w *well) newScan() scan {
	sc := scan{w: w}
	sc.lo, sc.hi, sc.byAction = w.limits()
	sc.psiLo, sc.psiHi = math.Inf(1), math.Inf(-1)
	if sc.hi > sc.lo {
		sc.psiLo, sc.psiHi = w.eval(sc.lo).psi, w.eval(sc.hi).psi
	}
	return sc
}

// next solves level n (the levels below it having been solved, or n = 1)
// and moves the bracket above it. It returns a non-empty reason if the
// level is not confined by the method's criterion.
func (sc *scan) next(n int, guess float64) (point, string, error) {
	fn := float64(n)
	if sc.psiHi < fn {
		return point{}, sc.w.why(sc.byAction), nil
	}
	if n == 1 {
		if sc.psiLo >= fn {
			return point{}, "below the well's bottom", nil
		}
		// ψ grows about as √e (the well's action) from the bottom.
		r := (fn - sc.psiLo) / (sc.psiHi - sc.psiLo)
		guess = sc.lo + (sc.hi-sc.lo)*r*r
	}
	p, err := sc.w.solve(n, sc.lo, sc.hi, guess)
	if err != nil {
		return point{}, "", err
	}
	sc.lo = p.e
	return p, "", nil
}

func (w *well) why(byAction bool) string {
	if byAction {
		return fmt.Sprintf("above the downhill barrier's top or within %.3g ħ of under-barrier action of it (the method's quasiclassical limit)", minBarrierAction)
	}
	return "above the uphill barrier at its interface"
}

// finish turns the root p of level n into a Level: Γ from the first-order
// escape, the second-order shift of η, and the error estimates.
//
// The outgoing wave's log-derivative at z_L is B + iθ_b′ (the modulus and
// phase of Bi + i Ai), θ_b′ = −1/(πM_b²), so κ̂ gains an imaginary part
// and F gains i G to first order, G = q_L/(π M_b² √t₀ D²) =
// q_L √z_L e^(−2ζ_L)/(√t₀ D² U₊²). The complex level of F + iG = nπ is
// (expanding about the real root η₀)
//
//	η = η₀ − i G/F′ + g² (F″/(2F′) − G′/G + (XP − YQ) F′) + …,  g = G/F′,
//
// the last term from the second order of Λ in the imaginary part of κ̂;
// so Γ = 2G/F′ (the quasiclassical width: at leading order
// Γ = P e^(−2ζ_L)/T, the Gamow factor over the classical period
// T = 2 dF/dη times the step's transmission P = 4μ_L kκ/(κ² + μ_L²k²);
// L. D. Landau and E. M. Lifshitz, Quantum Mechanics, §50, from memory).
func (w *well) finish(n int, p point) (tiltwell.Level, string) {
	d := p.dh
	fp := math.Pi * p.dpsi // dF/dη
	lnG := w.lnG(&d, p.zl, p.zetaL)
	gamma := math.Exp(lnG + math.Log(2/fp))
	g := gamma / 2
	chi1 := d.dlnG
	xy := d.x / d.y * fp
	sp := 1 / p.dpsi // the level spacing dη/dn
	kappa2 := 0.0
	chi := math.Abs(chi1) + math.Abs(xy) + 1/sp
	if g*chi > 1e-9 {
		h := 1e-6 * sp
		p2 := w.eval(p.e + h)
		kappa2 = (p2.dpsi - p.dpsi) / (2 * h * p.dpsi)
		chi += math.Abs(kappa2)
	}
	gc := g * chi
	if gc > maxBroad {
		return tiltwell.Level{}, fmt.Sprintf("too broad for the quasiclassical width (Γ/2 times its rate of change %.2g > %g)", gc, maxBroad)
	}
	eta2 := g * g * (kappa2 - chi1 + xy)
	// The next three terms of the barrier's series after each of the
	// blended truncations, each counted at most as large as the one
	// before (past its smallest term the series grows, and the error
	// stays about the size of that term), blended with the same weight:
	// relative errors eB of B and eU of U₊ (TestBarrierSeries measures
	// them against the Airy modulus), turned into the phase and ln G by
	// their sensitivities, ∂d_L/∂B = −y q_L/(x² + y²) and
	// ∂ln G/∂B = −2x q_L/(x² + y²).
	sens := w.qL * d.b / d.d2
	dF := barrierSeriesErr(p.zetaL, d.y*sens, 0)
	dLnG := barrierSeriesErr(p.zetaL, 2*d.x*sens, 2)
	eta := p.e - w.f/2
	fn := float64(n)
	// Rounding: ψ ≈ n to a few ε (n + 1), the Airy phases to
	// ε (2 + ζ̄) in the table; η = e − f/2 to ε (|η| + e)/2.
	// The table's phases carry ε (2 + ζ̄) each (as for hard walls);
	// beyond it the phases are formed without their large part.
	zb := 0.0
	for _, x := range [2]float64{p.x1, -p.e * w.invEa} {
		if x >= airyLo && x <= airyHi {
			zb += 2 + 2.0/3*max(-x, 0)*math.Sqrt(max(-x, 0))
		}
	}
	round := eps*(4*(fn+1)+(4+zb)/math.Pi)/p.dpsi + eps*(math.Abs(eta)+p.e)
	errE := finiteSafety*dF/fp + round + 4*math.Abs(eta2)*gc + g*gc*gc
	lv := tiltwell.Level{N: n, Energy: eta + eta2, Err: errE, Bound: tiltwell.Estimate}
	// F′ errs by the e-derivative of the phase error; the truncation
	// error falls off like ζ_L^(−K−1), so its log-derivative is about
	// (K + 1)/ζ_L times dζ_L/de = −κ(0)/f.
	k, _, _ := barrierOrder(p.zetaL)
	dzeta := w.cL * math.Sqrt(p.zl) * w.invEa
	relFp := dF * float64(k+1) * dzeta / (p.zetaL * fp)
	rel := finiteSafety*math.Expm1(dLnG) + relFp + (math.Abs(chi1)+2*math.Abs(kappa2))*errE + gc*gc +
		eps*(8+4*p.zetaL)
	if gamma < gammaFloor {
		lv.Gamma, lv.GammaErr = 0, gammaFloor
		return lv, ""
	}
	lv.Gamma = gamma
	lv.GammaErr = gamma * rel
	return lv, ""
}

// zeroFieldLevels returns the levels of the folded stack st at f = 0 from
// the closed form of internal/squarewell, where the step phases are exact.
func zeroFieldLevels(dst []tiltwell.Level, st tiltwell.Stack, f float64, k int) ([]tiltwell.Level, error) {
	sw, err := squarewell.FromStack(st)
	if err != nil {
		return dst, &tiltwell.ConfinedError{Method: "wkb", F: f, Asked: k, Confined: 0, Why: "a barrier is not above the well, so nothing is bound at zero field"}
	}
	c := sw.Count()
	for n := 1; n <= min(k, c); n++ {
		eta, _, err := sw.Level(n)
		if err != nil {
			return dst[:0], err
		}
		// The square-well phase condition solved to 2ε in k: 4ε in η,
		// with rounding of the phases.
		dst = append(dst, tiltwell.Level{N: n, Energy: eta, Err: 16 * eps * eta, Bound: tiltwell.Estimate})
	}
	if c < k {
		return dst, &tiltwell.ConfinedError{Method: "wkb", F: f, Asked: k, Confined: c, Why: fmt.Sprintf("level %d: above the lower barrier at zero field", c+1)}
	}
	return dst, nil
}

// plainLevel returns the level of the plain rule, given the connection
// rule's level c at its root p:
//
//	S + δ_L + δ_R = nπ   (e > f: both ends at a step),
//	S + δ_L + π/4 = nπ   (e ≤ f: the turning point inside the well),
//
// tan δ = μ_b k/κ with the local plane waves at the interface, and
// Γ = P e^(−2ζ_L)/T with the step's transmission factor
// P = 4 μ_L k κ/(κ² + μ_L² k²) = 2 sin 2δ_L and the classical period
// T = 2 dF/dη. Its Err and GammaErr are its distance from the connection
// rule plus the connection rule's own estimates.
func (w *well) plainLevel(c tiltwell.Level, p point) tiltwell.Level {
	e, dpsi := w.plainE(c.N, p.e)
	lv := c
	eta := e - w.f/2
	lv.Err = math.Abs(eta-c.Energy) + c.Err
	lv.Energy = eta
	ul := max(w.vL-e, 0)
	zetaL := 2 * math.Pi * math.Sqrt(w.mL) / (3 * w.f) * ul * math.Sqrt(ul)
	dl, _ := stepPhase(e, ul, w.mL)
	gamma := math.Sin(2*dl) * math.Exp(-2*zetaL) / (math.Pi * dpsi)
	if gamma < gammaFloor {
		gamma = 0
	}
	lv.GammaErr = math.Abs(gamma-c.Gamma) + c.GammaErr
	lv.Gamma = gamma
	return lv
}

// stepPhase returns δ = atan(μ k/κ) with k = π√e, κ = π√(μ u), and dδ/de
// (u = v − e decreasing as e grows).
func stepPhase(e, u, mu float64) (d, dd float64) {
	k := math.Sqrt(e)
	kp := math.Sqrt(mu * max(u, 0))
	d = math.Atan2(mu*k, kp)
	// dδ/de = (μ/2)(κ² + μ k²)/(k κ (κ² + μ² k²)) in units with π = 1.
	den := k * kp * (kp*kp + mu*mu*k*k)
	if den == 0 {
		return d, math.Inf(1)
	}
	return d, mu / 2 * (kp*kp + mu*k*k) / den
}

// plainPsi returns F/π of the plain rule and its e-derivative, on the
// two-interface branch (two = true, e ≥ f) or the turning-point branch.
func (w *well) plainPsi(e float64, two bool) (psi, dpsi float64) {
	s, ds := action(w.f, e)
	dl, ddl := stepPhase(e, w.vL-e, w.mL)
	if two {
		dr, ddr := stepPhase(e-w.f, w.vR-e+w.f, w.mR)
		return s + (dl+dr)/math.Pi, ds + (ddl+ddr)/math.Pi
	}
	return s + dl/math.Pi + 0.25, ds + ddl/math.Pi
}

// plainE solves the plain rule for level n near the connection rule's
// e0: on the two-interface branch if it has a root with e ≥ f, else on
// the turning-point branch, by bisection safeguarded Newton steps.
func (w *well) plainE(n int, e0 float64) (e, dpsi float64) {
	fn := float64(n)
	f := w.f
	two := false
	lo, hi := 0.0, min(w.vL, w.vR+f)
	if f < hi {
		if p, _ := w.plainPsi(f, true); p <= fn {
			two, lo = true, f
		} else {
			hi = f
		}
	}
	e = min(max(e0, lo), hi)
	for range 200 {
		p, d := w.plainPsi(e, two)
		if p < fn {
			lo = e
		} else {
			hi = e
		}
		next := e + (fn-p)/d
		if !(next > lo && next < hi) {
			next = lo + (hi-lo)/2
		}
		if math.Abs(next-e) <= 4*eps*max(e, 1) || hi-lo <= 4*eps*hi {
			_, d = w.plainPsi(next, two)
			return next, d
		}
		e = next
	}
	_, d := w.plainPsi(e, two)
	return e, d
}
