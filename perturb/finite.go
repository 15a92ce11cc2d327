package perturb

import (
	"errors"
	"fmt"
	"math"
	"sync"
	"sync/atomic"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/internal/squarewell"
)

// Validity of the finite-well series (see [Solver.Limit] and the package
// documentation). The order-P result is trusted up to the field where the
// first of these happens:
//
//   - the allowance for the orders beyond J (tail) reaches
//     wellTailFraction of the first neglected terms
//     |E_(P+1)| f^(P+1) + |E_(P+2)| f^(P+2);
//   - those neglected terms reach gapFraction of the distance from η₀ to
//     the nearest other bound level or to the lower barrier top;
//   - the quasiclassical escape width reaches wellGammaFraction of that
//     distance, or the level reaches the top of the downhill barrier;
//   - the neglected terms cancel while the allowance is not negligible
//     (noCancel).
const (
	wellTailFraction  = 0.05
	wellGammaFraction = 0.01
)

// gammaSafety is the factor between the quasiclassical escape width and
// the GammaErr reported for it, and gammaShift the multiple of it added to
// the energy's error estimate for the shift of the level beyond all
// orders of the series; the package documentation gives the measurements
// against the exact solver behind them.
const (
	gammaSafety = 2
	gammaShift  = 1.5
)

// ampOrder is the order of the interface amplitude used in the escape
// width (the state to order 4, as the energy to order 10 needs by Wigner's
// 2n+1 rule).
const ampOrder = 4

// stackCacheSize is the number of stacks whose level series are kept.
const stackCacheSize = 16

// wellLevel is the precomputed series of one level of a finite well, built
// once and read-only after.
type wellLevel struct {
	eta0 float64
	e    [wellOrder + 1]float64 // E_j, E[0] = 0
	de   [wellOrder + 1]float64 // rounding allowance δE_j
	lims [3]lazyLimit           // validity limits: Order 1, Order 2, dipole
	gap  float64                // distance to the nearest other level or the barrier top
	// first is the lowest order of the allowance for the orders beyond J:
	// the last two orders that do not vanish by symmetry (J−2 and J for
	// a symmetric well, J−1 and J otherwise).
	first int
	// fBest is the field up to which the allowance for the orders beyond
	// J stays below the third- and fourth-order terms; best sums the
	// series to J below it.
	fBest float64
	rml   float64 // √μ_L
	// The downhill (left) barrier for f > 0; the series of the state's
	// amplitude at the interface, Σ amp[j] f^j, and of its norm,
	// Σ nrm[m] f^m (ψ₀ normalized, intermediate normalisation), to
	// ampOrder; and ‖φ₁‖² of the normalized first-order state.
	vl, ml float64
	amp    [ampOrder + 1]float64
	nrm    [2*ampOrder + 1]float64
	s11    float64
	geom   wellGeom
	psi1   pieces // ψ₁ with ψ₀ = sin θ in the well (not normalized)
}

// wellSide is one orientation of a finite well: as given, or mirrored
// (the stack [tiltwell.Stack.Fold] gives for f < 0).
type wellSide struct {
	well  squarewell.Well
	sym   bool // mirror-symmetric: odd orders vanish
	count int  // bound levels, at most MaxLevels
	why   string
	slots []levelSlot
}

type levelSlot struct {
	once sync.Once
	lv   *wellLevel
}

// wellTable holds both orientations of a stack.
type wellTable struct {
	stack tiltwell.Stack
	sides [2]*wellSide
}

// stackCache keeps the tables of the stackCacheSize most recently added
// stacks. Readers load the current list without locking; a miss builds a
// table and publishes a new list under mu. Tables are never modified after
// they are published, except through their levels' sync.Once.
var stackCache struct {
	mu   sync.Mutex
	list atomic.Pointer[[]*wellTable]
}

// tableOf returns the table of a single finite well st (Len() == 3).
func tableOf(st tiltwell.Stack) *wellTable {
	if p := stackCache.list.Load(); p != nil {
		for _, t := range *p {
			if t.stack.Equal(st) {
				return t
			}
		}
	}
	stackCache.mu.Lock()
	defer stackCache.mu.Unlock()
	var old []*wellTable
	if p := stackCache.list.Load(); p != nil {
		old = *p
		for _, t := range old {
			if t.stack.Equal(st) {
				return t
			}
		}
	}
	t := newWellTable(st)
	list := make([]*wellTable, 0, stackCacheSize)
	list = append(list, t)
	list = append(list, old[:min(len(old), stackCacheSize-1)]...)
	stackCache.list.Store(&list)
	return t
}

func newWellTable(st tiltwell.Stack) *wellTable {
	t := &wellTable{stack: st}
	t.sides[0] = newWellSide(st)
	if st.Symmetric() {
		t.sides[1] = t.sides[0]
	} else {
		// The stack Stack.Fold returns for a negative field.
		m, _, _ := st.Fold(-1)
		t.sides[1] = newWellSide(m)
	}
	return t
}

func newWellSide(st tiltwell.Stack) *wellSide {
	s := &wellSide{sym: st.Symmetric()}
	w, err := squarewell.FromStack(st)
	if err != nil {
		// A barrier at or below the well's band edge: nothing is bound.
		s.why = "a barrier is not above the well, so nothing is bound"
		return s
	}
	s.well = w
	s.count = min(w.Count(), MaxLevels)
	s.slots = make([]levelSlot, s.count)
	return s
}

// level returns level n (1 ≤ n ≤ count), building it on first use.
func (s *wellSide) level(n int) *wellLevel {
	sl := &s.slots[n-1]
	sl.once.Do(func() { sl.lv = buildWellLevel(s, n) })
	return sl.lv
}

// buildWellLevel runs the series of level n and derives its limits.
func buildWellLevel(s *wellSide, n int) *wellLevel {
	g, err := newWellGeom(s.well, n)
	if err != nil {
		// Level(n) succeeds for every n ≤ Count; this is a broken
		// invariant, not bad input.
		panic("perturb: finite well level " + fmt.Sprint(n) + ": " + err.Error())
	}
	ws := g.series()
	lv := &wellLevel{eta0: g.eta0, geom: g, vl: s.well.VL, ml: s.well.ML, rml: math.Sqrt(s.well.ML), first: wellOrder - 1}
	if s.sym {
		lv.first = wellOrder - 2
	}
	for j := 1; j <= ws.order; j++ {
		lv.e[j] = ws.E[j]
		lv.de[j] = ws.dE[j]
		if s.sym && j%2 == 1 {
			// Odd orders vanish by the mirror symmetry (η(−f) = η(f)).
			lv.e[j], lv.de[j] = 0, 0
		}
	}
	// Orders that could not be computed (overflow in extremely shallow
	// wells) count as unknown: the limit below becomes 0.
	for j := ws.order + 1; j <= wellOrder; j++ {
		lv.de[j] = math.MaxFloat64
	}
	if len(ws.psi) > 1 {
		lv.psi1 = ws.psi[1]
		lv.psi1.nv = nil
	}
	rn := math.Sqrt(g.n0)
	ma := min(ws.order, ampOrder)
	for i := 0; i <= ma; i++ {
		lv.amp[i] = finiteOr(at0(ws.psi[i].L)/rn, 0)
		d := finiteOr(g.inner(&ws.psi[i], &ws.psi[i], false)/g.n0, 0)
		lv.nrm[2*i] += d
		if i == 1 {
			lv.s11 = d
		}
		for j := i + 1; j <= ma; j++ {
			lv.nrm[i+j] += 2 * finiteOr(g.inner(&ws.psi[i], &ws.psi[j], false)/g.n0, 0)
		}
	}
	// Distance to the nearest other level or to the continuum.
	top := math.Min(s.well.VL, s.well.VR)
	lv.gap = top - g.eta0
	if n > 1 {
		if e, _, err := s.well.Level(n - 1); err == nil {
			lv.gap = math.Min(lv.gap, g.eta0-e)
		}
	}
	if n < s.count {
		if e, _, err := s.well.Level(n + 1); err == nil {
			lv.gap = math.Min(lv.gap, e-g.eta0)
		}
	}
	lv.fBest = bisectLog(func(f float64) bool {
		var pw [wellOrder + 1]float64
		wellPowers(&pw, f)
		return lv.tail(&pw) <= lv.lead(2, &pw)
	}, -300, math.Log10(MaxField))
	lv.geom.tabs = nil // only the series needs them
	return lv
}

// lead returns the first neglected terms of the order-p energy,
// |E_(p+1)| f^(p+1) + |E_(p+2)| f^(p+2), for the powers pw of f.
func (lv *wellLevel) lead(p int, pw *[wellOrder + 1]float64) float64 {
	return math.Abs(lv.e[p+1])*pw[p+1] + math.Abs(lv.e[p+2])*pw[p+2]
}

// tail returns the allowance for the orders beyond J: the larger of the
// last two terms that do not vanish by symmetry, with their rounding
// allowance.
func (lv *wellLevel) tail(pw *[wellOrder + 1]float64) float64 {
	t := 0.0
	for j := lv.first; j <= wellOrder; j++ {
		t = math.Max(t, (math.Abs(lv.e[j])+lv.de[j])*pw[j])
	}
	return t
}

// best returns the best energy the series gives at the field with powers
// pw: the sum to order J up to fBest, where the allowance for the orders
// beyond J is below the third- and fourth-order terms, else the
// second-order energy. The escape width and the confinement test use it.
func (lv *wellLevel) best(pw *[wellOrder + 1]float64) float64 {
	eta, _ := lv.energy(2, pw)
	if pw[1] <= lv.fBest {
		for j := wellOrder; j > 2; j-- {
			eta += lv.e[j] * pw[j]
		}
	}
	return eta
}

// lazyLimit is a validity limit computed on first use.
type lazyLimit struct {
	once sync.Once
	v    float64
}

// lim returns the validity limit of kind 0 (Order 1), 1 (Order 2) or 2
// (the dipole), computing it on first use.
func (lv *wellLevel) lim(kind int) float64 {
	l := &lv.lims[kind]
	l.once.Do(func() {
		if kind == 2 {
			l.v = lv.dipoleLimit()
		} else {
			l.v = lv.limit(kind + 1)
		}
	})
	return l.v
}

// judged returns the energy by which the confinement of the level and its
// escape width are judged at the field f with powers pw: the best energy
// of the series inside the validity limit lim, and the zero-field level
// beyond it, where the series is not to be trusted (a lower level's series
// past its limit would otherwise cut the list of levels short).
func (lv *wellLevel) judged(pw *[wellOrder + 1]float64, f, lim float64) float64 {
	if f > lim {
		return lv.eta0
	}
	return lv.best(pw)
}

// limit returns the validity limit of the order-p energy (see
// wellTailFraction).
func (lv *wellLevel) limit(p int) float64 {
	ok := func(f float64) bool {
		var pw [wellOrder + 1]float64
		wellPowers(&pw, f)
		ld := lv.lead(p, &pw)
		if !(lv.tail(&pw) <= wellTailFraction*ld) || !(ld <= gapFraction*lv.gap) {
			return false
		}
		gam, _, conf := lv.gamma(f, lv.best(&pw), math.NaN())
		return conf && gam <= wellGammaFraction*lv.gap
	}
	// These criteria hold below some field and fail above it: bisect
	// log f between 1e-300 and MaxField.
	lim := bisectLog(ok, -300, math.Log10(MaxField))
	return lv.noCancel(lim, func(f float64) (sum, abs, allow float64) {
		var pw [wellOrder + 1]float64
		wellPowers(&pw, f)
		for j := p + 1; j <= wellOrder; j++ {
			t := lv.e[j] * pw[j]
			sum += t
			abs += math.Abs(t)
		}
		gam, _, _ := lv.gamma(f, lv.best(&pw), math.NaN())
		return sum, abs, lv.tail(&pw) + gammaShift*gam
	})
}

// dipoleLimit returns the validity limit of the dipole: the second-order
// limit, lowered where the neglected terms of dη/df cancel (see noCancel).
func (lv *wellLevel) dipoleLimit() float64 {
	return lv.noCancel(lv.lim(1), func(f float64) (sum, abs, allow float64) {
		var pw [wellOrder + 1]float64
		wellPowers(&pw, f)
		var tail float64
		for j := 3; j <= wellOrder; j++ {
			t := float64(j) * lv.e[j] * pw[j-1]
			sum += t
			abs += math.Abs(t)
			if j >= lv.first {
				tail = math.Max(tail, float64(j)*(math.Abs(lv.e[j])+lv.de[j])*pw[j-1])
			}
		}
		d := lv.e[1] + 2*lv.e[2]*f
		gam, ds, _ := lv.gamma(f, lv.best(&pw), d)
		if gam > 0 {
			tail += gammaShift * gam * ds
		}
		return sum, abs, tail
	})
}

// noCancel returns the field up to which the neglected terms, summed by
// terms(f) into sum and abs = Σ|terms| with the allowance allow for what
// the series does not know (the orders beyond J and the escape width), do
// not cancel while the allowance is more than 0.1% of them, searching
// below lim. Where |sum| < ¼ abs the error of the result approaches
// zero, and near that zero no estimate built from the sizes of the terms
// can stay within 10× of it; the range of fields where it fails is about
// allow/(10 abs) of f wide, so the zeros where the allowance is below 0.1%
// of the terms (ranges narrower than 1e-4 of f, met at weak field) are
// accepted, and the first other one ends the range of validity. It is
// looked for on a grid of 50 fields per decade over the two decades below
// lim (below, the allowance is far below 0.1% of the terms) and refined
// by bisection.
func (lv *wellLevel) noCancel(lim float64, terms func(f float64) (sum, abs, allow float64)) float64 {
	if lim == 0 {
		return 0
	}
	ok := func(f float64) bool {
		sum, abs, allow := terms(f)
		return math.Abs(sum) >= 0.25*abs || allow <= 1e-3*abs
	}
	const perDecade, decades = 50, 2
	step := math.Pow(10, 1.0/perDecade)
	f := lim * math.Pow(10, -decades)
	for i := -decades * perDecade; i <= 0; i++ {
		if !ok(f) {
			return bisectLog(ok, math.Log10(f/step), math.Log10(f))
		}
		f *= step
	}
	return lim
}

// bisectLog returns the largest f = 10^x, x in [lo, hi], up to which ok
// holds, assuming ok holds below some field and fails above it: 10^hi if
// ok(10^hi), 0 if not ok(10^lo).
func bisectLog(ok func(float64) bool, lo, hi float64) float64 {
	if ok(math.Pow(10, hi)) {
		return math.Pow(10, hi)
	}
	if !ok(math.Pow(10, lo)) {
		return 0
	}
	for hi-lo > 1e-5 {
		mid := 0.5 * (lo + hi)
		if ok(math.Pow(10, mid)) {
			lo = mid
		} else {
			hi = mid
		}
	}
	return math.Pow(10, lo)
}

// finiteOr returns x, or alt if x is NaN or infinite: an estimate built
// from orders that overflowed (extremely shallow wells, far beyond their
// validity limit) is reported as the largest float64.
func finiteOr(x, alt float64) float64 {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return alt
	}
	return x
}

// wellPowers sets pw[j] = f^j, j = 0…J.
func wellPowers(pw *[wellOrder + 1]float64, f float64) {
	x := 1.0
	for j := range pw {
		pw[j] = x
		x *= f
	}
}

// energy returns the order-p energy η₀ + Σ_(j≤p) E_j f^j and the sum of
// the magnitudes of its terms.
func (lv *wellLevel) energy(p int, pw *[wellOrder + 1]float64) (eta, size float64) {
	eta, size = lv.eta0, math.Abs(lv.eta0)
	for j := 1; j <= p; j++ {
		t := lv.e[j] * pw[j]
		eta += t
		size += math.Abs(t)
	}
	return eta, size
}

// estimate returns the error estimate of the order-p energy at f > 0
// before the escape allowance:
//
//	|Σ_(p<j≤J) E_j f^j| + max_(J−3≤j≤J) (|E_j| + δE_j) f^j + Σ_j δE_j f^j + 8ε Σ|terms|.
func (lv *wellLevel) estimate(p int, pw *[wellOrder + 1]float64, size float64) float64 {
	var rest, round, tail float64
	for j := 1; j <= wellOrder; j++ {
		if j > p {
			rest += lv.e[j] * pw[j]
		}
		round += lv.de[j] * pw[j]
		if j >= lv.first {
			tail = math.Max(tail, (math.Abs(lv.e[j])+lv.de[j])*pw[j])
		}
	}
	return finiteOr(math.Abs(rest)+tail+round+8*eps*size, math.MaxFloat64)
}

// gamma returns the quasiclassical escape width of the level at f ≥ 0 and
// energy eta (from best) through the left (downhill) barrier, the exponent S of its
// tunnelling factor, and whether the level is below the top of that
// barrier at the interface (confined). See [Solver] for the formula. If d
// is not NaN it is used as the dipole dη/df in dS/df (returned in place
// of S).
func (lv *wellLevel) gamma(f, eta, d float64) (gam, s float64, confined bool) {
	w := lv.vl - f/2 - eta // height of the barrier above the level at ξ = 0
	if !(w > 0) {
		return 0, 0, false
	}
	if f == 0 {
		return 0, 0, true
	}
	rm, rw := lv.rml, math.Sqrt(w)
	s = 4 * math.Pi * rm * w * rw / (3 * f)
	var a, nrm float64
	for j := ampOrder; j >= 0; j-- {
		a = a*f + lv.amp[j]
	}
	for m := 2 * ampOrder; m >= 0; m-- {
		nrm = nrm*f + lv.nrm[m]
	}
	if nrm > 0 {
		a /= math.Sqrt(nrm)
	}
	kappa := math.Pi * rm * rw
	gam = 2 / (math.Pi * math.Pi) * a * a * kappa / lv.ml * math.Exp(-s)
	if !math.IsNaN(d) {
		// |dS/df| with dw/df = −½ − d.
		s = s/f + 2*math.Pi*rm*rw*math.Abs(0.5+d)/f
	}
	return gam, s, true
}

// levelsStack is Levels for a finite stack; p is the order, and the
// arguments have been checked.
func (s Solver) levelsStack(dst []tiltwell.Level, f float64, k, p int) ([]tiltwell.Level, error) {
	side, err := s.side(f)
	if err != nil {
		return dst, err
	}
	af, _ := tiltwell.Fold(f)
	var pw [wellOrder + 1]float64
	wellPowers(&pw, af)
	lim := math.Inf(1)
	why := ""
	for n := 1; n <= k; n++ {
		if n > side.count {
			why = fmt.Sprintf("the well binds %d levels at f = 0", side.count)
			if side.why != "" {
				why = side.why
			}
			break
		}
		lv := side.level(n)
		eta, size := lv.energy(p, &pw)
		l := tiltwell.Level{N: n, Energy: eta, Err: 8 * eps * size, Bound: tiltwell.Estimate}
		if af > 0 {
			gam, _, conf := lv.gamma(af, lv.judged(&pw, af, lv.lim(p-1)), math.NaN())
			if !conf {
				why = fmt.Sprintf("level %d is above the downhill barrier at the interface", n)
				break
			}
			l.GammaErr = gammaSafety * gam
			l.Err = lv.estimate(p, &pw, size) + gammaShift*gam
		}
		lim = math.Min(lim, lv.lim(p-1))
		dst = append(dst, l)
	}
	var errs []error
	if len(dst) < k {
		errs = append(errs, &tiltwell.ConfinedError{Method: "perturb", F: f, Asked: k, Confined: len(dst), Why: why})
	}
	if af > lim {
		errs = append(errs, &tiltwell.RangeError{Method: "perturb", F: f, Limit: lim})
	}
	switch len(errs) {
	case 0:
		return dst, nil
	case 1:
		return dst, errs[0]
	}
	return dst, errors.Join(errs...)
}

// side returns the orientation of s.Stack that serves the field f, or an
// error for a stack the solver does not support.
func (s Solver) side(f float64) (*wellSide, error) {
	if s.Stack.Len() != 3 {
		return nil, fmt.Errorf("perturb: stack %v: only a single finite well (three layers) is supported: %w", s.Stack, errors.ErrUnsupported)
	}
	_, mir := tiltwell.Fold(f)
	t := tableOf(s.Stack)
	if mir {
		return t.sides[1], nil
	}
	return t.sides[0], nil
}

// stackLevel returns level n of the orientation for f, or an error if the
// well does not bind it at f = 0.
func (s Solver) stackLevel(f float64, n int) (*wellLevel, error) {
	side, err := s.side(f)
	if err != nil {
		return nil, err
	}
	if n > side.count {
		why := side.why
		if why == "" {
			why = fmt.Sprintf("the well binds %d levels at f = 0", side.count)
		}
		return nil, &tiltwell.ConfinedError{Method: "perturb", F: f, Asked: n, Confined: side.count, Why: why}
	}
	return side.level(n), nil
}

// dipoleStack is Dipole for a finite stack.
func (s Solver) dipoleStack(f float64, n int) (d, derr float64, err error) {
	lv, err := s.stackLevel(f, n)
	if err != nil {
		return 0, 0, err
	}
	af, mir := tiltwell.Fold(f)
	d = lv.e[1] + 2*lv.e[2]*af
	if af > 0 {
		var pw [wellOrder + 1]float64
		wellPowers(&pw, af)
		gam, ds, conf := lv.gamma(af, lv.judged(&pw, af, lv.lim(2)), d)
		if !conf {
			return 0, 0, &tiltwell.ConfinedError{Method: "perturb", F: f, Asked: n, Confined: n - 1,
				Why: fmt.Sprintf("level %d is above the downhill barrier at the interface", n)}
		}
		var rest, round, tail float64
		for j := 3; j <= wellOrder; j++ {
			rest += float64(j) * lv.e[j] * pw[j-1]
		}
		for j := 1; j <= wellOrder; j++ {
			round += float64(j) * lv.de[j] * pw[j-1]
			if j >= lv.first {
				tail = math.Max(tail, float64(j)*(math.Abs(lv.e[j])+lv.de[j])*pw[j-1])
			}
		}
		derr = math.Abs(rest) + tail + round + 8*eps*(math.Abs(lv.e[1])+math.Abs(2*lv.e[2]*af))
		if gam > 0 {
			derr += gammaShift * gam * ds
		}
		derr = finiteOr(derr, math.MaxFloat64)
	} else {
		derr = 8 * eps * math.Abs(d)
	}
	if mir {
		d = -d
	}
	if af > lv.lim(2) {
		return d, derr, &tiltwell.RangeError{Method: "perturb", F: f, Limit: lv.lim(2)}
	}
	return d, derr, nil
}

// limitStack is Limit for a finite stack: the smaller of the limits for
// positive and negative fields.
func (s Solver) limitStack(n, p int) (float64, error) {
	lp, err := s.stackLevel(1, n)
	if err != nil {
		return 0, err
	}
	lm, err := s.stackLevel(-1, n)
	if err != nil {
		return 0, err
	}
	return math.Min(lp.lim(p-1), lm.lim(p-1)), nil
}
