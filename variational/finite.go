package variational

import (
	"errors"
	"fmt"
	"math"
	"sync"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/internal/squarewell"
)

// finiteWork is the scratch of one call on a finite well.
type finiteWork struct {
	large, mid, small *fspace
	tilt              ftilt // the one-parameter objective (kept here so that the search allocates nothing)
	brackets          [MaxLevels]Bracket
}

var finitePool = sync.Pool{New: func() any {
	return &finiteWork{large: newFspace(), mid: newFspace(), small: newFspace()}
}}

// checkStack reports a stack or family the package does not solve.
func (s Solver) checkStack() error {
	if s.Stack.Infinite() {
		return nil
	}
	if s.Family == Sine {
		return fmt.Errorf("variational: the sine family needs infinite walls, not the stack %v: %w", s.Stack, errors.ErrUnsupported)
	}
	if _, err := squarewell.FromStack(s.Stack); err != nil {
		return fmt.Errorf("variational: stack %v: only a single finite well with both barriers above it is supported (%v): %w", s.Stack, err, errors.ErrUnsupported)
	}
	return nil
}

// finiteDims returns the number of well bubbles of the reported space of
// a call for k levels at reduced field f ≥ 0,
//
//	min(2k + Extra − 2 + ⌈0.8 f^(1/3)⌉, 40), at least 12:
//
// the levels at strong field are Airy functions on the scale f^(−1/3),
// and the measured need on the test grid was 2n + 10 + 0.8 f^(1/3) bubbles
// for level n (f ≤ 1000). The convergence checks use the nested spaces
// with 4 and 8 fewer.
func (s Solver) finiteDims(k int, f float64) int {
	e := s.Extra
	if e == 0 {
		e = defaultExtra
	}
	return max(12, min(maxWellDim, 2*k+e-2+int(math.Ceil(0.8*math.Cbrt(f)))))
}

// finiteTilt is the tilt of the Poly space's well functions at reduced
// field f ≥ 0: the trend of the infinite-well optimum (ritzGuess).
func finiteTilt(f float64) float64 { return ritzGuess(polyShape, f) }

// Escape validity: a level whose estimated relative remainder of the
// perturbative escape treatment, x(1 + 3ε²) with x = |δ₂|/(Γ/2), exceeds
// maxEscapeRemainder is too broad for the real variational problem and is
// reported as not confined.
const maxEscapeRemainder = 0.5

// gammaRel is the relative margin of GammaErr for the variational and
// rounding error of Γ₁ itself (measured below 1e-10 on the test grid).
const gammaRel = 1e-6

// finiteBrackets computes the brackets of a finite well; the arguments
// have been checked. When fewer than k levels are confined it returns
// those with a *tiltwell.ConfinedError.
func (s Solver) finiteBrackets(fw *finiteWork, dst []Bracket, f float64, k int, warm []Bracket) ([]Bracket, error) {
	dst = dst[:0]
	st, af, mirrored := s.Stack.Fold(f)
	w, err := squarewell.FromStack(st)
	if err != nil {
		return dst, fmt.Errorf("variational: %w", err)
	}
	sign := 1.0
	if mirrored {
		sign = -1
	}
	confined := func(n int, why string) error {
		return &tiltwell.ConfinedError{Method: "variational", F: f, Asked: k, Confined: n - 1, Why: fmt.Sprintf("level %d: %s", n, why)}
	}
	if af == 0 {
		c := w.Count()
		for n := 1; n <= k; n++ {
			if n > c {
				return dst, confined(n, fmt.Sprintf("the well binds %d levels at zero field", c))
			}
			b, err := zeroFieldBracket(w, n)
			if err != nil {
				return dst, err
			}
			dst = append(dst, b)
		}
		return dst, nil
	}
	pw := s.finiteDims(k, af)
	beta := finiteTilt(af)
	pl := fparams{vL: w.VL, mL: w.ML, vR: w.VR, mR: w.MR, f: af, beta: beta, pw: pw}
	r := rules()[pickRule(pl.dim(), 2*beta)] // e^(−2βξ) in every product needs about 2|β| more nodes
	fw.large.tabulate(r, pl)
	fw.large.matrices()
	if !fw.mid.nested(fw.large, pw-4) || !fw.small.nested(fw.large, pw-8) || !fw.large.solve() {
		return dst, fmt.Errorf("variational: stack %v at f = %g: trial space not positive definite: %w", s.Stack, f, tiltwell.ErrNoConvergence)
	}
	prevL, prevM, prevS, prevE := math.Inf(-1), math.Inf(-1), math.Inf(-1), math.Inf(-1)
	for n := 1; n <= k; n++ {
		lv := fw.large.level(n, prevL)
		if !lv.ok {
			return dst, confined(n, "above the barrier")
		}
		lm := fw.mid.level(n, prevM)
		ls := fw.small.level(n, prevS)
		b, lo, hi, why := finiteLevelBracket(n, pl, lv, lm, ls, prevE)
		if why != "" {
			return dst, confined(n, why)
		}
		if s.Family == Tilt {
			tb, ok := fw.tiltBracket(w, af, b, lo, hi, warm, sign)
			if !ok {
				return dst, confined(n, "the one-parameter tilt has no stationary energy below the downhill barrier")
			}
			b = tb
		} else {
			b.Tilt = sign * beta
		}
		dst = append(dst, b)
		prevL, prevM, prevS, prevE = lv.eta, lm.eta, ls.eta, b.Energy
		if !lm.ok {
			prevM = math.Inf(1)
		}
		if !ls.ok {
			prevS = math.Inf(1)
		}
	}
	return dst, nil
}

// finiteLevelBracket turns level n of the large space (lv) and of its
// nested spaces with 4 and 8 fewer bubbles (lm, ls, possibly not ok) into
// a bracket at f > 0, or says why the level is not confined. prev is the
// reported energy of the level below.
//
// The reported energy is the large space's fixed point η₀ (a Ritz value,
// above the level η_B of the real problem, up to rounding). The bracket
// holds
//   - below η₀, the convergence error (see finiteConvergence; the spaces
//     are nested, so the fixed point falls as the space grows towards
//     η_B);
//   - the rounding allowance on both sides;
//   - the escape shift: η_r = η_B + δ₂(1 + r) with δ₂ the second order in
//     the escape term, on its own side, widened by the relative remainder
//     |r| ≤ x(1 + 3ε²), x = |δ₂|/(Γ₁/2), which covered the measured
//     remainder on the test grid (0.6x…0.94x for |ε| ≤ 0.3, up to half
//     of x(1 + 3ε²) at |ε| ≈ 1.6).
//
// The level's Err, max(Upper − η₀, η₀ − Lower), is then |δ₂|(1 + x(1 +
// 3ε²)) plus the convergence and rounding terms: its ratio to the true
// error |δ₂|(1 + r) stays below 3 where the escape dominates.
//
// GammaErr is Γ₁(1 + x(1 + 3ε²) + gammaRel), Γ₁ the first-order escape
// width.
func finiteLevelBracket(n int, p fparams, lv, lm, ls flevel, prev float64) (b Bracket, lo, hi float64, why string) {
	eta := lv.eta
	ro := finiteRoundoff(p, eta)
	conv := finiteConvergence(p, lv, lm, ls, ro)
	rem := 0.0
	if lv.gamma > 0 {
		x := 2 * math.Abs(lv.shift) / lv.gamma // not /(γ/2): γ/2 underflows for the narrowest levels
		rem = x * (1 + 3*lv.e.eps*lv.e.eps)
		if !(rem <= maxEscapeRemainder) {
			return Bracket{}, 0, 0, fmt.Sprintf("too broad for the real variational problem (Γ ≈ %.3g, escape remainder %.2g)", lv.gamma, rem)
		}
	}
	// η_r = η_B + δ₂(1 + r), |r| ≤ rem, with η₀ − conv ≤ η_B ≤ η₀: the
	// estimated enclosure [lo, hi] of η_r, and the bracket of η₀ itself.
	s1, s2 := lv.shift*(1-rem), lv.shift*(1+rem)
	lo = eta - conv - ro + min(s1, s2)
	hi = eta + ro + max(s1, s2)
	b = Bracket{N: n, Energy: eta, Lower: min(lo, eta-ro), Upper: max(hi, eta+ro), Bound: tiltwell.Estimate, GammaErr: lv.gamma * (1 + rem + gammaRel)}
	ceil := p.ceiling()
	switch {
	case !(b.Upper < ceil):
		return Bracket{}, 0, 0, "above the barrier"
	case !(lv.gamma < b.Energy-prev):
		return Bracket{}, 0, 0, fmt.Sprintf("its width Γ ≈ %.3g exceeds its distance %.3g to the level below", lv.gamma, b.Energy-prev)
	}
	return b, lo, hi, ""
}

// finiteConvergence estimates the error η₀ − η_B of the large space's
// fixed point from the nested spaces with 4 and 8 fewer bubbles: with the
// differences d₁ = η(small) − η(mid) and d₂ = η(mid) − η(large), the tail
// of a geometric sequence, d₂ρ/(1 − ρ) with ρ = d₂/d₁. The convergence is
// faster than geometric (the eigenfunctions are entire in the well), so
// this overestimates the error, by 3× at f = 1000 and n = 10 on the
// test grid. Differences both within the rounding allowance ro carry no
// information and give 0; a sequence that does not yet converge (ρ ≥ ½,
// or a space without the level) gives d₁ + d₂, or the distance to the
// ceiling.
func finiteConvergence(p fparams, lv, lm, ls flevel, ro float64) float64 {
	if !lm.ok {
		return p.ceiling() - lv.eta
	}
	d2 := lm.eta - lv.eta
	if !ls.ok {
		return math.Abs(d2) + p.ceiling() - lm.eta
	}
	d1 := ls.eta - lm.eta
	if math.Abs(d1) <= ro && math.Abs(d2) <= ro {
		return 0
	}
	d2 = max(d2, 0)
	rho := d2 / d1
	if !(d1 > 0 && rho < 0.5) {
		return math.Abs(d1) + d2
	}
	return d2 * rho / (1 - rho)
}

// finiteRoundoff is the rounding allowance of a finite-well level at
// f > 0: 80ε(1 + |η| + f/2), calibrated against the exact reference: the
// converged levels fall up to about 70ε(1 + |η| + f/2) from it at
// f = 1000 (the cancellation between the potential, up to f/2 in size,
// and the kinetic energy of a level localized at the low interface, in a
// polynomial basis on the whole well), and far less at weak fields.
func finiteRoundoff(p fparams, eta float64) float64 {
	return 80 * eps * (1 + math.Abs(eta) + p.f/2)
}

// tiltBracket returns the bracket of the one-parameter tilt at f > 0,
// given the Poly bracket b of the ground level and Poly's estimated
// enclosure [lo, hi] of the resonance: the tilt's energy is the reported
// one, and the bracket reaches from it across [lo, hi], so that its Err
// is the tilt's own distance from Poly's estimate plus Poly's
// uncertainty.
func (fw *finiteWork) tiltBracket(w squarewell.Well, af float64, b Bracket, lo, hi float64, warm []Bracket, sign float64) (Bracket, bool) {
	st, err := w.State(1)
	if err != nil {
		return Bracket{}, false
	}
	fw.tilt = newFtilt(w, st, af)
	t := &fw.tilt
	guess := 0.0
	if len(warm) > 0 {
		guess = sign * warm[0].Tilt
	}
	beta, e, ok := t.optimum(guess)
	if !ok {
		return Bracket{}, false
	}
	ro := 8 * eps * (1 + math.Abs(e) + af/2)
	tb := Bracket{N: 1, Energy: e, Upper: max(e+ro, hi), Lower: min(lo, e-ro), Bound: tiltwell.Estimate, Tilt: sign * beta, GammaErr: b.GammaErr}
	return tb, true
}

// zeroFieldBracket returns a proven bracket on level n of the finite well
// at f = 0 (n ≤ w.Count()), by Kato's inclusion (T. Kato, J. Phys. Soc.
// Japan 4, 334 (1949)): for a trial function φ in the domain of H with
// Rayleigh quotient E and variance σ², and an interval (α′, α) that holds
// exactly one level η_n, with σ² < (α − E)(E − α′),
//
//	E − σ²/(α − E) ≤ η_n ≤ E + σ²/(E − α′).
//
// The trial function is the zero-field state of internal/squarewell at
// its computed wave number k, made to satisfy the BenDaniel–Duke
// condition exactly at both interfaces (so that Hφ has no δ-functions) by
// giving its right tail the decay κ′ = −μ_R k cot(k + δ_L) that matches
// the well's slope: then Hφ = ηφ up to ξ = 1 and Hφ = η′φ beyond, with
// η = k²/π² and η′ = v_R − κ′²/(μ_R π²), so with w_R the weight of the
// right tail
//
//	E = η + (η′ − η) w_R,   σ² = (η′ − η)² w_R (1 − w_R).
//
// The interval comes from the phase condition k + δ_L(k) + δ_R(k) = nπ
// without solving it: the phases increase with k and lie in [0, π/2), so
//
//	k_{n+1} ≥ (n+1)π − δ_L(k*) − δ_R(k*),  k* = min((n+1)π, π√min(v_L, v_R)),
//	k_{n−1} ≤ (n−1)π − δ_L((n−2)π) − δ_R((n−2)π),
//
// and α = min(min(v_L, v_R), max(n², k_{n+1,lo}²/π²)) is below both the
// next level and the continuum, α′ = k_{n−1,hi}²/π² above the level below
// (−∞ for n = 1). The bracket is proven up to floating-point rounding, for
// which each end carries the allowance 16ε(1 + η) + 8ε(v_R + |η′| + η)w_R
// (the rounding of η = k²/π² and of η′ − η), checked against the exact
// reference.
func zeroFieldBracket(w squarewell.Well, n int) (Bracket, error) {
	st, err := w.State(n)
	if err != nil {
		return Bracket{}, fmt.Errorf("variational: %w", err)
	}
	pp := math.Pi * math.Pi
	k := st.K
	eta := k * k / pp
	sk, ck := math.Sincos(k + st.DL)
	kp := -w.MR * k * ck / sk
	ro := 16 * eps * (1 + eta)
	b := Bracket{N: n, Lower: eta - ro, Upper: eta + ro, Energy: eta + ro, Bound: tiltwell.Estimate}
	if !(kp > 0) {
		return b, nil
	}
	etap := w.VR - kp*kp/(w.MR*pp)
	in := 0.5 - (math.Sin(2*(k+st.DL))-math.Sin(2*st.DL))/(4*k)
	nl := st.A * st.A / (2 * st.KL)
	nw := st.B * st.B * in
	nr := st.C * st.C / (2 * kp)
	wr := nr / (nl + nw + nr)
	e := eta + (etap-eta)*wr
	s2 := (etap - eta) * (etap - eta) * wr * (1 - wr)
	// Rounding: of η = k²/π², and of η′ − η (formed from v_R), weighted.
	ro += 8 * eps * (w.VR + math.Abs(etap) + eta) * wr
	vt := min(w.VL, w.VR)
	kstar := min(float64(n+1)*math.Pi, math.Pi*math.Sqrt(vt))
	dl, dr, _, _ := w.Phase(kstar)
	klo := float64(n+1)*math.Pi - dl - dr
	nn := float64(n) * float64(n)
	alpha := min(vt, max(nn, klo*klo/pp))
	alphap := math.Inf(-1)
	if n >= 2 {
		dl, dr, _, _ := w.Phase(float64(n-2) * math.Pi)
		khi := float64(n-1)*math.Pi - dl - dr
		alphap = khi * khi / pp
	}
	if !(e > alphap && e < alpha && s2 < (alpha-e)*(e-alphap)) {
		return b, nil
	}
	b.Lower = e - s2/(alpha-e) - ro
	b.Upper = e + ro
	if n >= 2 {
		b.Upper += s2 / (e - alphap)
	}
	b.Energy = b.Upper
	b.Bound = tiltwell.Rigorous
	return b, nil
}
