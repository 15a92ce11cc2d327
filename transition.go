package tiltwell

import (
	"fmt"
	"math"
	"runtime"
	"strconv"
	"strings"
	"sync"
	"sync/atomic"

	"gonum.org/v1/gonum/integrate/quad"
)

// Pair is an electron and a hole in one well of width Width (metres), each
// with its own effective mass in units of the electron mass m₀. A
// heavy-hole pair in GaAs, for instance, has Electron = 0.067 and
// Hole = 0.3497 (I. Vurgaftman, J. R. Meyer, L. R. Ram-Mohan, J. Appl.
// Phys. 89, 5815 (2001)).
//
// Each carrier has its own reduced units (see [Well]): the same field F
// in V/m is f_e = F/F₀(m_e) for the electron and f_h = F/F₀(m_h) for the
// hole. The hole, of opposite charge, sees the mirrored tilt, the reduced
// field −f_h.
type Pair struct {
	// Width is the well width L in metres.
	Width float64
	// Electron and Hole are the effective masses m_e and m_h in units of
	// the electron mass m₀.
	Electron, Hole float64
}

// Wells returns the electron's and the hole's [Well]. It returns an error
// wrapping [ErrUnits] if [NewWell] refuses the width or a mass (not a
// finite positive number, or outside the plausible ranges).
func (p Pair) Wells() (electron, hole Well, err error) {
	if electron, err = NewWell(p.Width, p.Electron); err != nil {
		return Well{}, Well{}, fmt.Errorf("tiltwell: electron: %w", err)
	}
	if hole, err = NewWell(p.Width, p.Hole); err != nil {
		return Well{}, Well{}, fmt.Errorf("tiltwell: hole: %w", err)
	}
	return electron, hole, nil
}

// Transition names an interband transition by its electron level E, its
// hole level H (1 for the ground level) and the hole's band: e1–hh1 is
// Transition{E: 1, H: 1}, e1–hh2 is Transition{E: 1, H: 2}.
type Transition struct {
	// E and H are the electron and hole level numbers, from 1.
	E, H int
	// Hole is the hole's band, heavy hole (the zero value) or light hole.
	// It names the transition; the hole's mass and levels are those of
	// the Pair and the hole solver given to [Pair.Sweep].
	Hole Carrier
}

// String returns the transition in the usual notation, such as "e1-hh2"
// or "e1-lh1".
func (t Transition) String() string {
	return "e" + strconv.Itoa(t.E) + "-" + t.Hole.String() + strconv.Itoa(t.H)
}

// ParseTransition parses the notation [Transition.String] writes, such as
// "e1-hh1" or "e2-lh1" (case-insensitive, surrounding spaces ignored). It
// returns an error wrapping [ErrLevel] for anything else, or for a level
// outside 1..[MaxLevelRequest].
func ParseTransition(s string) (Transition, error) {
	p := strings.ToLower(strings.TrimSpace(s))
	bad := fmt.Errorf("tiltwell: transition %q: want the form e1-hh1 or e1-lh2: %w", s, ErrLevel)
	e, h, ok := strings.Cut(p, "-")
	if !ok || !strings.HasPrefix(e, "e") {
		return Transition{}, bad
	}
	var t Transition
	switch {
	case strings.HasPrefix(h, "hh"):
		t.Hole, h = HeavyHole, h[2:]
	case strings.HasPrefix(h, "lh"):
		t.Hole, h = LightHole, h[2:]
	default:
		return Transition{}, bad
	}
	var err1, err2 error
	t.E, err1 = strconv.Atoi(e[1:])
	t.H, err2 = strconv.Atoi(h)
	if err1 != nil || err2 != nil {
		return Transition{}, bad
	}
	if t.E < 1 || t.H < 1 || t.E > MaxLevelRequest || t.H > MaxLevelRequest {
		return Transition{}, fmt.Errorf("tiltwell: transition %q: levels run from 1 to %d: %w", s, MaxLevelRequest, ErrLevel)
	}
	return t, nil
}

// Line is one transition at one field, as computed by [Pair.Sweep].
type Line struct {
	// Field is the field F in V/m.
	Field float64
	Transition
	// Shift is the change of the transition energy from zero field, in
	// meV: ΔE_e + ΔE_h, the electron level's shift plus the hole level's
	// (each measured away from its band edge). It is negative for the
	// red shift of the ground transition. The hole is solved at its
	// reduced field −f_h (see [Pair]):
	//
	//	Shift = E₁(m_e) [η_E(f_e) − η_E(0)] + E₁(m_h) [η_H(−f_h) − η_H(0)]
	Shift float64
	// ShiftErr is the sum of the solvers' error estimates of the four
	// levels in Shift, in meV.
	ShiftErr float64
	// Overlap is the electron–hole overlap integral, dimensionless:
	//
	//	Overlap = ∫₀¹ φ_E(ξ; f_e) φ_H(ξ; −f_h) dξ
	//
	// with both wavefunctions from their solvers, the hole's at −f_h, the
	// same well whose energy enters Shift. For a mirror-symmetric well
	// φ(ξ; −f_h) = (−1)^(H+1) φ(1 − ξ; f_h) (see [Mirror]). Its sign
	// follows the convention φ′(0) > 0 of both wavefunctions; Overlap2
	// does not depend on it.
	Overlap float64
	// Overlap2 is Overlap², to which the strength of the absorption line is
	// proportional.
	Overlap2 float64
	// OverlapErr is the quadrature's estimate of its own error in
	// Overlap, at most 1e-12: the Gauss–Legendre order is raised until it
	// is. It extrapolates the decay of the integrand's Legendre
	// coefficients at the top of the rule's band to the degrees the rule
	// misses, and adds the rounding of the sum; held against a 600-point
	// reference, it covered the true error at every line of the test grid
	// (TestSweepOverlapErr, TestOverlapEstimate). It does not include the
	// error of the solvers' wavefunctions.
	OverlapErr float64
}

// WaveSampler is a [WaveSolver] that evaluates the wavefunction of a level
// it has just computed at many points at once, without solving the level
// again and without allocating. [Pair.Sweep] uses it when a solver
// implements it (exact.Solver does); otherwise Sweep calls Wavefunction at
// every field, which solves each level a second time. [WaveBuilder] is its
// counterpart for wavefunctions sampled piece by piece.
type WaveSampler interface {
	WaveSolver
	// SampleWave appends φ(ξ) of level l at reduced field f, for each ξ
	// in xi in turn, to dst[:0] and returns the result. l must be a level
	// that Levels returned for the same f; an implementation may use its
	// Energy instead of solving the level again. The values are those of
	// Wavefunction(f, l.N), to rounding. If dst has capacity for len(xi)
	// values, SampleWave must not allocate. Errors follow the rules of
	// [Solver.Levels].
	SampleWave(dst []float64, f float64, l Level, xi []float64) ([]float64, error)
}

// Quadrature of the overlap. The integrand g = φ_E φ_H is an entire
// function on [0, 1] (a product of Airy functions, or of sines), so an
// N-point Gauss–Legendre rule (gonum's quad.Legendre; I. Bogaert, SIAM J.
// Sci. Comput. 36, A1008 (2014)), exact for polynomials of degree 2N − 1,
// converges faster than any power of N once N exceeds the integrand's
// number of oscillations.
//
// The order N is taken from the ladder below, sized from the levels: a
// level of energy η at field f oscillates on [0, 1] with at most the
// local wavenumber π√(|η| + |f|/2), so the product behaves like e^(iωt)
// on t ∈ [−1, 1] with ω = (π/2)(√(|η_E| + |f_e|/2) + √(|η_H| + |f_h|/2)),
// whose N-point Gauss error is about (eω/4N)^(2N) (from the Legendre
// coefficients of e^(iωt), spherical Bessel functions of ω, DLMF 18.17.17
// and 10.19.1). The first N where that is below 1e-20 is tried first:
// the cautious estimate below then accepts it on the first try at 96% of
// the fields and levels of a test grid (0–1e9 V/m, levels up to 9).
//
// The error estimate uses only the N values already sampled: the Legendre
// coefficients a_k of g (from the same rule) at the top of the band,
// e₁ = max |a_k| for N−4 ≤ k < N, and d = max(4, N/4) degrees lower, e₀.
// Their ratio gives a decay rate r = (e₁/e₀)^(1/d); for an entire
// function the decay only speeds up with k, so the error of the rule,
// Σ_{k≥2N} a_k ∫(P_k − rule) with |∫(P_k − rule)| ≤ 1 on [0, 1], is at
// most about e₁ r^(N+1)/(1 − r). To this OverlapErr adds the rounding of
// the sum, N·ε·Σ w_i |g_i|. If OverlapErr is above overlapTol the next
// order of the ladder is tried, up to maxOrder.
const (
	overlapTol = 1e-12
	maxOrder   = 1024
)

// orders is the ladder of Gauss–Legendre orders the overlap may use.
var orders = [...]int{8, 12, 14, 16, 18, 20, 22, 24, 28, 32, 40, 48, 64, 80, 96, 128, 160, 192, 256, 320, 384, 512, 640, 768, 896, maxOrder}

// rule is one Gauss–Legendre rule on [0, 1] with what the error estimate
// needs: p[i][j] = (2k+1) w_i P_k(2x_i − 1) for the eight degrees k of
// the two windows (j < 4: the lower window, j ≥ 4: the top one).
type rule struct {
	x, w []float64
	p    [][8]float64
	d    int // the gap between the windows
}

// rules builds each order of the ladder once, on first use. The rules must
// not be modified.
var rules = func() (r [len(orders)]func() *rule) {
	for i, n := range orders {
		r[i] = sync.OnceValue(func() *rule { return newRule(n) })
	}
	return r
}()

func newRule(n int) *rule {
	r := &rule{x: make([]float64, n), w: make([]float64, n), p: make([][8]float64, n), d: max(4, n/4)}
	quad.Legendre{}.FixedLocations(r.x, r.w, 0, 1)
	var ks [8]int
	for j := range 4 {
		ks[j] = n - 4 - r.d + j
		ks[4+j] = n - 4 + j
	}
	for i, x := range r.x {
		// P_k by the three-term recurrence (DLMF 18.9.1).
		t := 2*x - 1
		p0, p1 := 1.0, t
		for k := 0; k < n; k++ {
			pk := p0
			if k == 1 {
				pk = p1
			} else if k > 1 {
				p0, p1 = p1, ((2*float64(k)-1)*t*p1-(float64(k)-1)*p0)/float64(k)
				pk = p1
			}
			for j, kj := range ks {
				if kj == k {
					r.p[i][j] = (2*float64(k) + 1) * r.w[i] * pk
				}
			}
		}
	}
	return r
}

// firstOrder returns the index in orders of the first rule to try for
// levels whose largest √(|η| + |f|/2) are ae (electron) and ah (hole).
func firstOrder(ae, ah float64) int {
	return startOrder(math.Pi/2*(ae+ah), 46) // ω; e^(−46) ≈ 1e-20
}

// Sweep computes each transition in ts at each field (V/m) in fields,
// with electron levels and wavefunctions from electron and hole ones from
// hole (if hole is nil, electron serves both). It returns
// len(fields)·len(ts) lines in field order, and within one field in the
// order of ts: line i·len(ts) + j is transition ts[j] at fields[i].
//
// The hole is solved at its reduced field −f_h, energy and wavefunction
// alike (see [Pair] and [Line]), so Shift and Overlap describe the same
// well even when it is not mirror-symmetric (a basis solver with a
// Potential, say). Sweep integrates the overlap over [0, 1], the well with
// infinitely high walls: a solver whose wavefunctions reach beyond (a
// [Spread], from a finite [Stack]) gives an error wrapping
// [ErrOutOfRange]. A solver that implements [WaveSampler] is sampled
// without solving its levels twice.
//
// The fields are computed in parallel, on at most runtime.GOMAXPROCS(0)
// goroutines, so the solvers must be safe for concurrent use, as every
// [Solver] in this module is. The result does not depend on the number of
// goroutines or their timing.
//
// Cost: each wavefunction a transition needs is sampled at 16–20 points
// per field for the low levels of a 10 nm GaAs-like pair at 0–200 kV/cm.
// With exact.Solver, a [WaveSampler], e1–hh1 and e1–hh2 cost about
// 3.3 µs per field against 1.05 µs for the three level solves alone
// (BenchmarkSweep, 201 fields, one core of a shared machine): 3.1 times
// the levels, of which the sampling (55 points and three wavefunctions
// built from their levels) is 60%. With a WaveSampler, Sweep allocates
// nothing per field (TestSweepSampler, TestSweepExactSampler).
//
// Sweep returns an error, and no lines, for a width or mass that
// [NewWell] refuses (wrapping [ErrUnits]), a nil solver or a nil pointer
// in the interface ([ErrNoSolver]), an empty transition list, a level
// below 1 or above [MaxLevelRequest], or transitions naming two hole
// bands ([ErrLevel]), and an empty field list or a NaN or infinite field
// ([ErrField]). An error from a solver, such as a field beyond its range
// ([ErrOutOfRange]), a result that breaks the [Solver] contract (a NaN or
// infinite energy, error estimate or wavefunction value:
// [ErrNoConvergence]), or a panic in a solver or its wavefunctions
// ([ErrPanic]) is returned for the first field in the list where it
// happened; so is an overlap whose quadrature does not settle to 1e-12 by
// order 1024 ([ErrNoConvergence]).
//
// Special cases are:
//
//	F = 0: Shift = 0; Overlap = 1 for E = H, 0 for E ≠ H
//	F < 0: the same Shift and Overlap2 as for |F| (mirror-symmetric wells)
func (p Pair) Sweep(electron, hole WaveSolver, fields []float64, ts []Transition) (lines []Line, err error) {
	// A panic in a solver called on this goroutine becomes an error; the
	// workers recover their own.
	defer func() {
		if r := recover(); r != nil {
			lines, err = nil, fmt.Errorf("tiltwell: sweep: a solver panicked: %v: %w", r, ErrPanic)
		}
	}()
	we, wh, err := p.Wells()
	if err != nil {
		return nil, err
	}
	if electron == nil {
		return nil, fmt.Errorf("tiltwell: sweep: nil electron solver: %w", ErrNoSolver)
	}
	if isNil(electron) {
		return nil, fmt.Errorf("tiltwell: sweep: electron solver is a nil %T: %w", electron, ErrNoSolver)
	}
	if hole == nil {
		hole = electron
	} else if isNil(hole) {
		return nil, fmt.Errorf("tiltwell: sweep: hole solver is a nil %T: %w", hole, ErrNoSolver)
	}
	if len(ts) == 0 {
		return nil, fmt.Errorf("tiltwell: sweep: no transitions given: %w", ErrLevel)
	}
	var ke, kh int
	for _, t := range ts {
		if t.E < 1 || t.H < 1 || t.E > MaxLevelRequest || t.H > MaxLevelRequest {
			return nil, fmt.Errorf("tiltwell: sweep: transition %v: levels run from 1 to %d: %w", t, MaxLevelRequest, ErrLevel)
		}
		if t.Hole != HeavyHole && t.Hole != LightHole {
			return nil, fmt.Errorf("tiltwell: sweep: transition %v: unknown hole band: %w", t, ErrLevel)
		}
		if t.Hole != ts[0].Hole {
			return nil, fmt.Errorf("tiltwell: sweep: transitions %v and %v name two hole bands, and a Pair has one hole: sweep them separately: %w", ts[0], t, ErrLevel)
		}
		ke, kh = max(ke, t.E), max(kh, t.H)
	}
	if len(fields) == 0 {
		return nil, fmt.Errorf("tiltwell: sweep: no fields given: %w", ErrField)
	}
	for _, F := range fields {
		if math.IsNaN(F) || math.IsInf(F, 0) {
			return nil, fmt.Errorf("tiltwell: sweep: F = %v V/m: %w", F, ErrField)
		}
	}

	// The zero-field levels, from the same solvers, so that a method's
	// error at f = 0 does not show up as a shift.
	e0, err := electron.Levels(nil, 0, ke)
	if err == nil {
		err = checkLevels(e0, ke)
	}
	if err != nil {
		return nil, fmt.Errorf("tiltwell: sweep: electron at zero field: %w", err)
	}
	h0, err := hole.Levels(nil, 0, kh)
	if err == nil {
		err = checkLevels(h0, kh)
	}
	if err != nil {
		return nil, fmt.Errorf("tiltwell: sweep: hole at zero field: %w", err)
	}

	s := sweep{
		we: we, wh: wh, electron: electron, hole: hole, ts: ts,
		ke: ke, kh: kh, e0: e0, h0: h0,
	}
	s.es, _ = electron.(WaveSampler)
	s.hs, _ = hole.(WaveSampler)
	// A sampled solver hands out no Wavefunction to ask for its Support:
	// ask once, at zero field, whether its wavefunctions stay in [0, 1].
	for _, c := range []struct {
		name string
		ws   WaveSolver
		sm   WaveSampler
	}{{"electron", electron, s.es}, {"hole", hole, s.hs}} {
		if c.sm == nil {
			continue
		}
		w, err := c.ws.Wavefunction(0, 1)
		if err == nil {
			err = checkWave(w)
		}
		if err != nil {
			return nil, fmt.Errorf("tiltwell: sweep: %s level 1 at zero field: %w", c.name, err)
		}
	}

	lines = make([]Line, len(fields)*len(ts))
	errs := make([]error, len(fields))
	// Workers take fields in increasing index order. After a failure at
	// field i no worker starts a field beyond i, and every field before i
	// has already been handed out, so the first failure in field order is
	// always found: the error returned does not depend on timing.
	var next atomic.Int64
	var stop atomic.Int64
	stop.Store(int64(len(fields)))
	var wg sync.WaitGroup
	for range min(runtime.GOMAXPROCS(0), len(fields)) {
		wg.Go(func() {
			var sc scratch
			for {
				i := next.Add(1) - 1
				if i >= int64(len(fields)) || i > stop.Load() {
					return
				}
				if err := s.safeField(lines[int(i)*len(ts):int(i+1)*len(ts)], fields[i], &sc); err != nil {
					errs[i] = err
					for {
						old := stop.Load()
						if i >= old || stop.CompareAndSwap(old, i) {
							break
						}
					}
				}
			}
		})
	}
	wg.Wait()
	for _, err := range errs {
		if err != nil {
			return nil, err
		}
	}
	return lines, nil
}

// sweep holds what every field of a Sweep shares. It is read-only while
// the workers run.
type sweep struct {
	we, wh         Well
	electron, hole WaveSolver
	es, hs         WaveSampler // the solvers as WaveSamplers, or nil
	ts             []Transition
	ke, kh         int
	e0, h0         []Level
}

// scratch is one worker's reusable storage.
type scratch struct {
	le, lh []Level
	ve, vh [][]float64 // wavefunction values at the nodes, by level
	done   []bool      // which of ve, vh hold the current rule's values
}

// safeField is field with a panic in a solver turned into an error.
func (s *sweep) safeField(out []Line, F float64, sc *scratch) (err error) {
	defer func() {
		if r := recover(); r != nil {
			err = fmt.Errorf("tiltwell: sweep: F = %g V/m: a solver or its wavefunction panicked: %v: %w", F, r, ErrPanic)
		}
	}()
	return s.field(out, F, sc)
}

// field fills out, one line per transition, at the field F (V/m).
func (s *sweep) field(out []Line, F float64, sc *scratch) error {
	fe, fh := s.we.Reduced(F), s.wh.Reduced(F)
	var err error
	if sc.le, err = s.electron.Levels(sc.le, fe, s.ke); err == nil {
		err = checkLevels(sc.le, s.ke)
	}
	if err != nil {
		return fmt.Errorf("tiltwell: sweep: electron at F = %g V/m (f = %g): %w", F, fe, err)
	}
	// The hole sees the mirrored tilt (see Pair): its levels and its
	// wavefunctions both at −f_h.
	if sc.lh, err = s.hole.Levels(sc.lh, -fh, s.kh); err == nil {
		err = checkLevels(sc.lh, s.kh)
	}
	if err != nil {
		return fmt.Errorf("tiltwell: sweep: hole at F = %g V/m (f = %g): %w", F, -fh, err)
	}

	for j, t := range s.ts {
		le, lh := sc.le[t.E-1], sc.lh[t.H-1]
		l := Line{
			Field:      F,
			Transition: t,
			Shift:      s.we.MilliEV(le.Energy-s.e0[t.E-1].Energy) + s.wh.MilliEV(lh.Energy-s.h0[t.H-1].Energy),
			ShiftErr:   s.we.MilliEV(le.Err+s.e0[t.E-1].Err) + s.wh.MilliEV(lh.Err+s.h0[t.H-1].Err),
		}
		if math.IsInf(l.Shift, 0) || math.IsNaN(l.Shift) || math.IsInf(l.ShiftErr, 0) || math.IsNaN(l.ShiftErr) {
			return fmt.Errorf("tiltwell: sweep: %v at F = %g V/m: shift %v ± %v meV is not finite: %w", t, F, l.Shift, l.ShiftErr, ErrNoConvergence)
		}
		out[j] = l
	}
	if err := s.overlaps(out, fe, fh, sc); err != nil {
		return fmt.Errorf("tiltwell: sweep: F = %g V/m: %w", F, err)
	}
	return nil
}

// overlaps fills the Overlap fields of out with Gauss–Legendre rules from
// the ladder, starting from the order the levels call for, until every
// transition's error estimate is within overlapTol.
func (s *sweep) overlaps(out []Line, fe, fh float64, sc *scratch) error {
	var ae, ah float64
	for _, t := range s.ts {
		ae = max(ae, math.Sqrt(math.Abs(sc.le[t.E-1].Energy)+math.Abs(fe)/2))
		ah = max(ah, math.Sqrt(math.Abs(sc.lh[t.H-1].Energy)+math.Abs(fh)/2))
	}
	sc.ve = resize(sc.ve, s.ke)
	sc.vh = resize(sc.vh, s.kh)
	sc.done = resize(sc.done, s.ke+s.kh)
	for o := firstOrder(ae, ah); o < len(orders); o++ {
		r := rules[o]()
		clear(sc.done)
		settled := true
		for j, t := range s.ts {
			var err error
			if !sc.done[t.E-1] {
				if sc.ve[t.E-1], err = sample(sc.ve[t.E-1], s.electron, s.es, fe, sc.le[t.E-1], r.x); err != nil {
					return fmt.Errorf("electron level %d: %w", t.E, err)
				}
				sc.done[t.E-1] = true
			}
			if !sc.done[s.ke+t.H-1] {
				if sc.vh[t.H-1], err = sample(sc.vh[t.H-1], s.hole, s.hs, -fh, sc.lh[t.H-1], r.x); err != nil {
					return fmt.Errorf("hole level %d: %w", t.H, err)
				}
				sc.done[s.ke+t.H-1] = true
			}
			q, est := integrate(r, sc.ve[t.E-1], sc.vh[t.H-1])
			out[j].Overlap, out[j].Overlap2, out[j].OverlapErr = q, q*q, est
			if !(est <= overlapTol) {
				settled = false
			}
		}
		if settled {
			return nil
		}
	}
	return fmt.Errorf("overlap quadrature did not settle to %g by order %d: %w", float64(overlapTol), maxOrder, ErrNoConvergence)
}

// integrate returns ∫₀¹ g for g = ve·vh sampled at the nodes of r, and the
// estimate of its error (see overlapTol).
func integrate(r *rule, ve, vh []float64) (q, est float64) {
	// Scalar accumulators (not an array) so that they stay in registers.
	var abs, c0, c1, c2, c3, c4, c5, c6, c7 float64
	ve, vh = ve[:len(r.w)], vh[:len(r.w)]
	for i, w := range r.w {
		g := ve[i] * vh[i]
		q += w * g
		abs += w * math.Abs(g)
		p := &r.p[i]
		c0 += p[0] * g
		c1 += p[1] * g
		c2 += p[2] * g
		c3 += p[3] * g
		c4 += p[4] * g
		c5 += p[5] * g
		c6 += p[6] * g
		c7 += p[7] * g
	}
	e0 := max(math.Abs(c0), math.Abs(c1), math.Abs(c2), math.Abs(c3))
	e1 := max(math.Abs(c4), math.Abs(c5), math.Abs(c6), math.Abs(c7))
	n := float64(len(r.w))
	est = n * 0x1p-53 * abs
	switch {
	case e1 <= 8*est:
		// The top coefficients are rounding noise (each sums N terms
		// weighted by up to 2N): the band is resolved.
	case e1 >= e0:
		// Not decaying: the rule is too coarse to say anything.
		est = math.Inf(1)
	default:
		// rate = (e₁/e₀)^(1/d), and rate^(N+1), by one logarithm.
		lr := math.Log(e1/e0) / float64(r.d)
		est += e1 * math.Exp(lr*(n+1)) / -math.Expm1(lr)
	}
	return q, est
}

// sample returns the values of level l at reduced field f at the points
// x, in dst resized to len(x): from the WaveSampler sm if there is one,
// else from ws.Wavefunction. A value that is NaN or infinite, or a
// wavefunction that reaches beyond [0, 1], is an error.
func sample(dst []float64, ws WaveSolver, sm WaveSampler, f float64, l Level, x []float64) ([]float64, error) {
	if sm != nil {
		var err error
		if dst, err = sm.SampleWave(dst, f, l, x); err != nil {
			return dst, err
		}
		if len(dst) != len(x) {
			return dst, fmt.Errorf("SampleWave returned %d values for %d points: %w", len(dst), len(x), ErrNoConvergence)
		}
	} else {
		w, err := ws.Wavefunction(f, l.N)
		if err == nil {
			err = checkWave(w)
		}
		if err != nil {
			return dst, err
		}
		dst = resize(dst, len(x))
		for i, xi := range x {
			dst[i] = w.At(xi)
		}
	}
	for i, v := range dst {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return dst, fmt.Errorf("wavefunction value %v at ξ = %g: %w", v, x[i], ErrNoConvergence)
		}
	}
	return dst, nil
}

// checkWave reports a nil wavefunction or one that reaches beyond the
// interval [0, 1] Sweep integrates over.
func checkWave(w Wavefunction) error {
	if w == nil || isNil(w) {
		return fmt.Errorf("nil wavefunction: %w", ErrNoSolver)
	}
	if lo, hi := Support(w); lo < 0 || hi > 1 {
		return fmt.Errorf("wavefunction reaches [%g, %g], beyond the infinite walls at 0 and 1 that Sweep integrates between: %w", lo, hi, ErrOutOfRange)
	}
	return nil
}

// resize returns s with length n, reusing its storage when it can.
func resize[T any](s []T, n int) []T {
	if cap(s) >= n {
		return s[:n]
	}
	return make([]T, n)
}
