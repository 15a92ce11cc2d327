package tiltwell

import (
	"fmt"
	"math"
	"runtime"
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
// wrapping [ErrUnits] if the width or a mass is not a finite positive
// number.
func (p Pair) Wells() (electron, hole Well, err error) {
	if electron, err = NewWell(p.Width, p.Electron); err != nil {
		return Well{}, Well{}, fmt.Errorf("tiltwell: electron: %w", err)
	}
	if hole, err = NewWell(p.Width, p.Hole); err != nil {
		return Well{}, Well{}, fmt.Errorf("tiltwell: hole: %w", err)
	}
	return electron, hole, nil
}

// Transition names an interband transition by its electron level E and
// hole level H (1 for the ground level): e1–hh1 is Transition{1, 1},
// e1–hh2 is Transition{1, 2}.
type Transition struct {
	// E and H are the electron and hole level numbers, from 1.
	E, H int
}

// String returns the transition as "e1-h2".
func (t Transition) String() string { return fmt.Sprintf("e%d-h%d", t.E, t.H) }

// Line is one transition at one field, as computed by [Pair.Sweep].
type Line struct {
	// Field is the field F in V/m.
	Field float64
	Transition
	// Shift is the change of the transition energy from zero field, in
	// meV: ΔE_e + ΔE_h, the electron level's shift plus the hole level's
	// (each measured away from its band edge). It is negative for the
	// red shift of the ground transition.
	//
	//	Shift = E₁(m_e) [η_E(f_e) − η_E(0)] + E₁(m_h) [η_H(f_h) − η_H(0)]
	Shift float64
	// ShiftErr is the sum of the solvers' error estimates of the four
	// levels in Shift, in meV.
	ShiftErr float64
	// Overlap is the electron–hole overlap integral, dimensionless:
	//
	//	Overlap = ∫₀¹ φ_E(ξ; f_e) φ_H(ξ; −f_h) dξ
	//
	// where φ(ξ; −f_h) = (−1)^(H+1) φ(1 − ξ; f_h) is the hole's level in
	// the mirrored tilt (see [Mirror]). Its sign follows the convention
	// φ′(0) > 0 of both wavefunctions; Overlap2 does not depend on it.
	Overlap float64
	// Overlap2 is Overlap², to which the strength of the absorption line is
	// proportional.
	Overlap2 float64
	// OverlapErr is the quadrature's error estimate of Overlap: the
	// difference between the last two Gauss–Legendre orders. It does not
	// include the error of the solver's wavefunctions.
	OverlapErr float64
}

// Quadrature of the overlap: Gauss–Legendre rules (gonum's quad.Legendre;
// I. Bogaert, SIAM J. Sci. Comput. 36, A1008 (2014)) of orders
// minOrder, 2 minOrder, … maxOrder, until two successive orders agree to
// overlapTol. An n-point rule is exact for polynomials of degree 2n − 1,
// and the integrand is entire, so the error falls faster than any power
// once n exceeds the number of oscillations (DLMF 3.5.19 for the error
// term).
const (
	minOrder   = 32
	maxOrder   = 1024
	overlapTol = 1e-12
)

// rule is one Gauss–Legendre rule on [0, 1].
type rule struct {
	x, w []float64
}

// legendreRules are the rules of orders minOrder … maxOrder, built once on
// first use. They must not be modified.
var legendreRules = sync.OnceValue(func() []rule {
	var rs []rule
	for n := minOrder; n <= maxOrder; n *= 2 {
		r := rule{x: make([]float64, n), w: make([]float64, n)}
		quad.Legendre{}.FixedLocations(r.x, r.w, 0, 1)
		rs = append(rs, r)
	}
	return rs
})

// Sweep computes each transition in ts at each field (V/m) in fields,
// with electron levels and wavefunctions from electron and hole ones from
// hole (if hole is nil, electron serves both). It returns
// len(fields)·len(ts) lines in field order, and within one field in the
// order of ts: line i·len(ts) + j is transition ts[j] at fields[i].
//
// The fields are computed in parallel, on at most runtime.GOMAXPROCS(0)
// goroutines, so the solvers must be safe for concurrent use, as every
// [Solver] in this module is. The result does not depend on the number of
// goroutines or their timing.
//
// Sweep returns an error, and no lines, for a width or mass that is not a
// finite positive number (wrapping [ErrUnits]), a nil electron solver
// ([ErrNoSolver]), an empty transition list or a level below 1
// ([ErrLevel]), and an empty field list or a NaN or infinite field
// ([ErrField]). An error from a solver, such as a field beyond its range
// ([ErrOutOfRange]), is returned for the first field in the list where it
// happened; an overlap whose quadrature does not settle by order maxOrder
// gives [ErrNoConvergence].
//
// Special cases are:
//
//	F = 0: Shift = 0; Overlap = 1 for E = H, 0 for E ≠ H
//	F < 0: the same Shift and Overlap2 as for |F|
func (p Pair) Sweep(electron, hole WaveSolver, fields []float64, ts []Transition) ([]Line, error) {
	we, wh, err := p.Wells()
	if err != nil {
		return nil, err
	}
	if electron == nil {
		return nil, fmt.Errorf("tiltwell: sweep: nil electron solver: %w", ErrNoSolver)
	}
	if hole == nil {
		hole = electron
	}
	if len(ts) == 0 {
		return nil, fmt.Errorf("tiltwell: sweep: no transitions given: %w", ErrLevel)
	}
	var ke, kh int
	for _, t := range ts {
		if t.E < 1 || t.H < 1 {
			return nil, fmt.Errorf("tiltwell: sweep: transition %v: levels start at 1: %w", t, ErrLevel)
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
	if err != nil {
		return nil, fmt.Errorf("tiltwell: sweep: electron at zero field: %w", err)
	}
	h0, err := hole.Levels(nil, 0, kh)
	if err != nil {
		return nil, fmt.Errorf("tiltwell: sweep: hole at zero field: %w", err)
	}
	if err := checkLevels(e0, ke); err != nil {
		return nil, fmt.Errorf("tiltwell: sweep: electron at zero field: %w", err)
	}
	if err := checkLevels(h0, kh); err != nil {
		return nil, fmt.Errorf("tiltwell: sweep: hole at zero field: %w", err)
	}

	s := sweep{
		we: we, wh: wh, electron: electron, hole: hole, ts: ts,
		ke: ke, kh: kh, e0: e0, h0: h0,
	}
	lines := make([]Line, len(fields)*len(ts))
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
				if err := s.field(lines[int(i)*len(ts):int(i+1)*len(ts)], fields[i], &sc); err != nil {
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
	ts             []Transition
	ke, kh         int
	e0, h0         []Level
}

// scratch is one worker's reusable storage.
type scratch struct {
	le, lh []Level
	we, wh []Wavefunction
	ve, vh [][]float64
	prev   []float64
}

// field fills out, one line per transition, at the field F (V/m).
func (s *sweep) field(out []Line, F float64, sc *scratch) error {
	fe, fh := s.we.Reduced(F), s.wh.Reduced(F)
	var err error
	if sc.le, err = s.electron.Levels(sc.le, fe, s.ke); err != nil {
		return fmt.Errorf("tiltwell: sweep: electron at F = %g V/m (f = %g): %w", F, fe, err)
	}
	if err = checkLevels(sc.le, s.ke); err != nil {
		return fmt.Errorf("tiltwell: sweep: electron at F = %g V/m (f = %g): %w", F, fe, err)
	}
	if sc.lh, err = s.hole.Levels(sc.lh, fh, s.kh); err != nil {
		return fmt.Errorf("tiltwell: sweep: hole at F = %g V/m (f = %g): %w", F, fh, err)
	}
	if err = checkLevels(sc.lh, s.kh); err != nil {
		return fmt.Errorf("tiltwell: sweep: hole at F = %g V/m (f = %g): %w", F, fh, err)
	}

	// The wavefunctions each transition needs, one solver call per level.
	sc.we = resize(sc.we, s.ke)
	sc.wh = resize(sc.wh, s.kh)
	clear(sc.we)
	clear(sc.wh)
	for _, t := range s.ts {
		if sc.we[t.E-1] == nil {
			if sc.we[t.E-1], err = s.electron.Wavefunction(fe, t.E); err != nil {
				return fmt.Errorf("tiltwell: sweep: electron level %d at F = %g V/m: %w", t.E, F, err)
			}
		}
		if sc.wh[t.H-1] == nil {
			// The hole sees the mirrored tilt (see Pair).
			if sc.wh[t.H-1], err = s.hole.Wavefunction(-fh, t.H); err != nil {
				return fmt.Errorf("tiltwell: sweep: hole level %d at F = %g V/m: %w", t.H, F, err)
			}
		}
	}

	for j, t := range s.ts {
		le, lh := sc.le[t.E-1], sc.lh[t.H-1]
		out[j] = Line{
			Field:      F,
			Transition: t,
			Shift:      s.we.MilliEV(le.Energy-s.e0[t.E-1].Energy) + s.wh.MilliEV(lh.Energy-s.h0[t.H-1].Energy),
			ShiftErr:   s.we.MilliEV(le.Err+s.e0[t.E-1].Err) + s.wh.MilliEV(lh.Err+s.h0[t.H-1].Err),
		}
	}
	if err := s.overlaps(out, sc); err != nil {
		return fmt.Errorf("tiltwell: sweep: F = %g V/m: %w", F, err)
	}
	return nil
}

// overlaps fills the Overlap fields of out by Gauss–Legendre rules of
// increasing order until every transition's integral has settled.
func (s *sweep) overlaps(out []Line, sc *scratch) error {
	sc.prev = resize(sc.prev, len(out))
	sc.ve = resize(sc.ve, s.ke)
	sc.vh = resize(sc.vh, s.kh)
	for i, r := range legendreRules() {
		for n, w := range sc.we {
			if w != nil {
				sc.ve[n] = sample(sc.ve[n], w, r.x)
			}
		}
		for n, w := range sc.wh {
			if w != nil {
				sc.vh[n] = sample(sc.vh[n], w, r.x)
			}
		}
		settled := true
		for j, t := range s.ts {
			ve, vh := sc.ve[t.E-1], sc.vh[t.H-1]
			sum := 0.0
			for q, wq := range r.w {
				sum += wq * ve[q] * vh[q]
			}
			if math.IsNaN(sum) {
				return fmt.Errorf("transition %v: NaN wavefunction value: %w", t, ErrNoConvergence)
			}
			if i > 0 {
				d := math.Abs(sum - sc.prev[j])
				out[j].OverlapErr = d
				if !(d <= overlapTol) {
					settled = false
				}
			}
			sc.prev[j] = sum
			out[j].Overlap = sum
			out[j].Overlap2 = sum * sum
		}
		if i > 0 && settled {
			return nil
		}
	}
	return fmt.Errorf("overlap quadrature did not settle to %g by order %d: %w", float64(overlapTol), maxOrder, ErrNoConvergence)
}

// sample returns w at the points x, in dst resized to len(x).
func sample(dst []float64, w Wavefunction, x []float64) []float64 {
	dst = resize(dst, len(x))
	for i, xi := range x {
		dst[i] = w.At(xi)
	}
	return dst
}

// resize returns s with length n, reusing its storage when it can.
func resize[T any](s []T, n int) []T {
	if cap(s) >= n {
		return s[:n]
	}
	return make([]T, n)
}
