package exact

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"sync"

	"github.com/tiltwell/tiltwell"
	"gonum.org/v1/gonum/integrate/quad"
)

// Grid says where [Check] holds a solver against the reference, and how
// strictly.
type Grid struct {
	// Fields are the reduced fields f (in F₀), each finite with
	// |f| ≤ MaxField. Negative fields are allowed.
	Fields []float64
	// Levels is the number of levels k compared at each field,
	// 1 ≤ Levels ≤ MaxLevels.
	Levels int
	// Tol is an absolute tolerance on |η − η_exact| in units of E₁. If it
	// is 0, no tolerance is imposed: the solver is held only to its own
	// error estimates, and the diff in the report uses the largest error
	// estimate the solver gave on the grid.
	Tol float64
	// MaxRatio, if not 0, is the most pessimistic an estimate may be:
	// a level with Err > MaxRatio × |η − η_exact| where the true error is
	// above 1e-14 (1e-12 for a finite Stack) counts as a failure. The
	// tiltwell rules use 10.
	MaxRatio float64
	// Stack is the layer structure the solver under test was made for;
	// the reference is Solver{Stack: Stack}. The zero Stack is the well
	// with infinitely high walls.
	Stack tiltwell.Stack
}

// Worst is where a quantity over the grid was largest.
type Worst struct {
	// Value is the quantity (an error in E₁, a ratio, …).
	Value float64
	// F and N are the reduced field and the level number where it was
	// found.
	F float64
	N int
}

// Point is one level at one field, as the solver gave it and as the
// reference has it.
type Point struct {
	F float64
	N int
	// Want is the reference energy η, Got the solver's, in units of E₁.
	Want, Got float64
	// Err and Bound are the solver's own error estimate and its kind.
	Err   float64
	Bound tiltwell.Bound
	// RefErr is the reference's own error estimate of Want, in E₁.
	RefErr float64
}

// True returns the true error |Got − Want|.
func (p Point) True() float64 { return math.Abs(p.Got - p.Want) }

// Excess returns how many times the true error exceeds what the two
// estimates cover, |Got − Want| / (Err + RefErr): above 1 for an
// undershoot, +Inf for a nonzero error with both estimates 0.
func (p Point) Excess() float64 {
	d := p.True()
	if d == 0 {
		return 0
	}
	return d / (p.Err + p.RefErr)
}

// Gross reports whether the point is a gross undershoot: a true error
// beyond both the small-excess allowance and the rounding floor, that is
//
//	|Got − Want| > SmallExcess × (Err + RefErr)  and
//	|Got − Want| > RoundingULPs × 2⁻⁵² × max(1, |Want|).
//
// [Check] never forgives a gross undershoot, whatever the Bound.
func (p Point) Gross() bool {
	d := p.True()
	return d > SmallExcess*(p.Err+p.RefErr) && d > roundingFloor(p.Want)
}

// SmallExcess is the factor by which the true error of an Estimate level
// may exceed the covered error Err + Err_exact and still count as a small
// undershoot, of which [Check] forgives up to 1% of the grid. The tiltwell
// rules let an estimate miss on at most 1% of a grid, by small excesses
// only; the factor 3 is this package's choice of "small" (common
// practice, no source).
const SmallExcess = 3

// RoundingULPs is the rounding floor of the undershoot rule, in units in
// the last place of max(1, |η_exact|): a true error within
// RoundingULPs × 2⁻⁵² × max(1, |η_exact|) (8.9e-16 for |η| ≤ 1) is
// rounding of a float64 energy: at an Estimate level it counts as a small
// undershoot however small the estimate (a Rigorous level must still
// cover it).
const RoundingULPs = 4

// roundingFloor is RoundingULPs ulps of max(1, |eta|).
func roundingFloor(eta float64) float64 {
	return RoundingULPs * 0x1p-52 * math.Max(1, math.Abs(eta))
}

// Report is the result of [Check]: how far a solver is from the reference
// and whether it keeps the [tiltwell.Solver] contract.
type Report struct {
	// Solver names the solver's type (fmt %T).
	Solver string
	// Points is the number of levels compared, Fields the number of fields.
	Points, Fields int
	// Abs is the worst absolute error |η − η_exact| in E₁; Rel the worst
	// relative error |η − η_exact|/|η_exact| over levels with η_exact ≠ 0
	// (large near the field where a level crosses zero energy).
	Abs, Rel Worst
	// Undershoots counts the levels whose error estimate did not cover
	// the true error: |η − η_exact| > Err + Err_exact, the reference's own
	// estimate added so that its rounding is not held against the solver.
	// RigorousUndershoots counts those of Rigorous levels, which the
	// tiltwell rules never allow. GrossUndershoots counts those of
	// Estimate levels that are gross (see [Point.Gross]): beyond
	// SmallExcess × (Err + Err_exact) and beyond the rounding floor
	// RoundingULPs × 2⁻⁵² × max(1, |η_exact|); none is allowed. The
	// others are small undershoots, and Allowed is how many of them the
	// rules tolerate: 1% (rounded down) of the Estimate levels.
	Undershoots, RigorousUndershoots, GrossUndershoots, Allowed int
	// Undershot lists up to maxListed (10) undershoots: the rigorous and
	// gross ones first, then the small ones, each group in grid order.
	Undershot []Point
	// WorstUndershoot is the undershoot with the largest [Point.Excess]
	// (the first such in grid order), the zero Point if there is none.
	WorstUndershoot Point
	// Ratio is the most pessimistic estimate, Err/|η − η_exact| over the
	// levels whose true error is above 1e-14; Pessimistic counts the
	// levels beyond Grid.MaxRatio (0 if MaxRatio is 0).
	Ratio       Worst
	Pessimistic int
	// Tol is the tolerance Grid.Tol (0 if none); Beyond counts the levels
	// with |η − η_exact| > Tol + Err_exact.
	Tol    float64
	Beyond int
	// Gamma is filled in for a finite Stack: how the escape widths Γ
	// compare with the reference's.
	Gamma *GammaReport
	// Waves is filled in for a [tiltwell.WaveSolver]: the worst
	// normalisation defect |∫φ² dξ − 1| and the smallest overlap
	// ∫φ φ_exact dξ, over the grid (over the wavefunctions' supports,
	// [tiltwell.Support], for a finite Stack).
	Waves *WaveReport
	// Violations lists broken rules of the Solver contract and errors the
	// solver returned on the grid.
	Violations []string
	// Margin is the distance |η − η_exact| beyond which a level enters
	// Diff: Tol, or the largest error estimate on the grid if Tol is 0,
	// plus the largest error estimate of the reference, in E₁.
	Margin float64
	// Diff lists the levels beyond Margin, and only those, in grid order,
	// two lines each, "(-want +got)":
	//
	//	-f=5.1 n=3: 9.04957041621239
	//	+f=5.1 n=3: 9.049579465782806
	//
	// the energies written in the shortest form that reads back as the
	// same float64 (strconv 'g', −1). At most maxDiff (50) levels are
	// listed, then a line "… and N more levels beyond the margin". Diff
	// is empty if every energy is within the margin.
	Diff string
}

// GammaReport compares the escape widths Γ of a solver with the
// reference's over the grid, by the rules that [Report] applies to the
// energies: an undershoot is |Γ − Γ_exact| > GammaErr + GammaErr_exact;
// a gross one is beyond SmallExcess times that and beyond the rounding
// floor RoundingULPs ulps of Γ_exact (or 1e-300); pessimism is measured
// where the true error is above 1e-12.
type GammaReport struct {
	// Abs is the worst |Γ − Γ_exact| in E₁, Rel the worst |Γ −
	// Γ_exact|/Γ_exact over the levels with Γ_exact > 0.
	Abs, Rel Worst
	// Undershoots, GrossUndershoots and Allowed count as for the
	// energies; Worst is the undershoot with the largest excess.
	Undershoots, GrossUndershoots, Allowed int
	Worst                                  GammaPoint
	// Ratio is the most pessimistic GammaErr/|Γ − Γ_exact| where the true
	// error is above 1e-12; Pessimistic counts those beyond
	// Grid.MaxRatio.
	Ratio       Worst
	Pessimistic int
}

// GammaPoint is one level's escape width as the solver gave it and as the
// reference has it, in E₁.
type GammaPoint struct {
	F                     float64
	N                     int
	Want, Got             float64
	GammaErr, RefGammaErr float64
}

// Excess returns |Got − Want|/(GammaErr + RefGammaErr) (0 for no error).
func (p GammaPoint) Excess() float64 {
	d := math.Abs(p.Got - p.Want)
	if d == 0 {
		return 0
	}
	return d / (p.GammaErr + p.RefGammaErr)
}

// WaveReport summarises the wavefunctions of a [tiltwell.WaveSolver] over
// the grid.
type WaveReport struct {
	// Norm is the worst |∫φ² dξ − 1| (over [0, 1], or over the
	// wavefunction's support for a finite Stack).
	Norm Worst
	// Overlap is the smallest ∫φ φ_exact dξ: 1 for a perfect
	// wavefunction, negative for one with the wrong sign.
	Overlap Worst
}

// OK reports whether the solver passed:
//   - no contract violations or solver errors;
//   - no undershoot of a Rigorous level: |η − η_exact| ≤ Err + Err_exact
//     at every Rigorous level;
//   - no gross undershoot of an Estimate level: |η − η_exact| ≤
//     SmallExcess × (Err + Err_exact) (3×), or within the rounding floor
//     RoundingULPs × 2⁻⁵² × max(1, |η_exact|) (4 ulps), at every Estimate
//     level;
//   - at most Allowed (1% of the Estimate levels, rounded down) small
//     undershoots, where the estimate misses by less than that;
//   - no level beyond Tol or MaxRatio when those are set;
//   - for a finite Stack, the same rules for the escape widths (see
//     [GammaReport]).
func (r *Report) OK() bool {
	ok := len(r.Violations) == 0 && r.RigorousUndershoots == 0 && r.GrossUndershoots == 0 &&
		r.Undershoots-r.RigorousUndershoots <= r.Allowed && r.Beyond == 0 && r.Pessimistic == 0
	if g := r.Gamma; g != nil {
		ok = ok && g.GrossUndershoots == 0 && g.Undershoots <= g.Allowed && g.Pessimistic == 0
	}
	return ok
}

// maxListed is the most undershoots a Report lists one by one.
const maxListed = 10

// normTol is the largest |∫φ² − 1| accepted from a wavefunction: the
// contract asks for normalized wavefunctions, and the quadrature is good
// to about 1e-13.
const normTol = 1e-6

// ratioFloor is the true error above which an estimate's pessimism is
// measured (the tiltwell rules: "not more than 10× pessimistic where the
// true error is above 1e-14", and 1e-12 for finite barriers,
// ratioFloorStack, for energies and widths alike).
const (
	ratioFloor      = 1e-14
	ratioFloorStack = 1e-12
)

// Check holds the solver s against the exact reference ([Solver]) at every
// field and level of g, and checks the rules of the [tiltwell.Solver]
// contract (and of [tiltwell.WaveSolver] if s is one):
//   - NaN and ±Inf fields give errors wrapping [tiltwell.ErrField], k = 0
//     and k = −1 errors wrapping [tiltwell.ErrLevel], each with a result
//     of length 0 and no panic;
//   - Levels returns k levels, N = 1..k, energies in increasing order, no
//     NaN or infinite energy, Err neither NaN nor negative, a known Bound;
//   - Levels appends to dst[:0], reusing dst's storage when it has the
//     capacity, and gives the same levels as with a nil dst;
//   - the energies at f and −f agree within the two error estimates
//     (for a finite Stack, only if it is [tiltwell.Stack.Symmetric]);
//   - the levels computed from several goroutines at once agree with the
//     serial ones within their error estimates;
//   - for a WaveSolver: the same errors from Wavefunction, At(ξ) = 0
//     outside [0, 1] and for NaN, ∫φ² = 1 within 1e-6, and the sign
//     convention φ′(0) > 0 (seen as a positive overlap with the exact
//     wavefunction).
//
// For a finite g.Stack the reference is Solver{Stack: g.Stack}, the
// escape widths are held to their estimates as the energies are (see
// [GammaReport]), and the wavefunctions are integrated over their
// supports ([tiltwell.Support]) in pieces between the interfaces (At is
// not required to vanish outside [0, 1]); the sign convention is then φ >
// 0 at the first interface. The grid must lie where the reference confines
// g.Levels levels.
//
// A panic in s is recovered and reported as a violation. Errors that s
// returns at the grid's fields are violations too: choose a grid inside
// the method's range.
//
// Check returns an error, and no report, only if it cannot run: a nil s
// (wrapping [tiltwell.ErrNoSolver]), an empty field list or a field that
// is not finite ([tiltwell.ErrField]), |f| > MaxField
// ([tiltwell.ErrOutOfRange]), Levels outside 1..MaxLevels
// ([tiltwell.ErrLevel]), a field where the reference confines fewer than
// g.Levels levels (an error wrapping [tiltwell.ErrLevel]), or a negative
// or NaN Tol or MaxRatio ([tiltwell.ErrUnits]).
func Check(s tiltwell.Solver, g Grid) (*Report, error) {
	if s == nil {
		return nil, fmt.Errorf("exact: check: nil solver: %w", tiltwell.ErrNoSolver)
	}
	if len(g.Fields) == 0 {
		return nil, fmt.Errorf("exact: check: no fields: %w", tiltwell.ErrField)
	}
	for _, f := range g.Fields {
		if err := tiltwell.CheckArgs("exact: check", f, g.Levels, MaxLevels, MaxField); err != nil {
			return nil, err
		}
	}
	if err := checkLimits(g.Tol, g.MaxRatio); err != nil {
		return nil, err
	}
	ref := make([][]tiltwell.Level, len(g.Fields))
	for i, f := range g.Fields {
		ls, err := Solver{Stack: g.Stack}.Levels(nil, f, g.Levels)
		if err != nil {
			return nil, fmt.Errorf("exact: check: reference at f = %g: %w", f, err)
		}
		ref[i] = ls
	}
	return check(s, g.Stack, g.Fields, ref, g.Tol, g.MaxRatio), nil
}

func checkLimits(tol, maxRatio float64) error {
	if !(tol >= 0) || math.IsInf(tol, 0) {
		return fmt.Errorf("exact: check: tolerance %v: %w", tol, tiltwell.ErrUnits)
	}
	if !(maxRatio >= 0) || math.IsInf(maxRatio, 0) {
		return fmt.Errorf("exact: check: MaxRatio %v: %w", maxRatio, tiltwell.ErrUnits)
	}
	return nil
}

// check compares s with the reference levels ref[i] at fields[i], for
// the stack st.
func check(s tiltwell.Solver, st tiltwell.Stack, fields []float64, ref [][]tiltwell.Level, tol, maxRatio float64) *Report {
	r := &Report{Solver: fmt.Sprintf("%T", s), Fields: len(fields), Tol: tol}
	floor := ratioFloor
	var gr *GammaReport
	var nGamma int
	if !st.Infinite() {
		floor = ratioFloorStack
		gr = &GammaReport{}
		r.Gamma = gr
	}
	// got[i] are the solver's energies at fields[i] (nil where it broke
	// the contract), for the diff once the margin is known.
	got := make([][]float64, len(fields))
	var nEst, underEst, underRig, underGross int
	var smallListed []Point
	maxClaim, maxRef := 0.0, 0.0
	for i, f := range fields {
		k := len(ref[i])
		ls, err := callLevels(s, nil, f, k)
		if err != nil {
			r.violate("f=%g: Levels(nil, %g, %d): %v", f, f, k, err)
			continue
		}
		if !r.levelsOK(ls, f, k) {
			continue
		}
		r.dstReuse(s, ls, f, k)
		if st.Symmetric() {
			r.mirror(s, ls, f, k)
		}
		got[i] = make([]float64, k)
		for j, l := range ls {
			rl := ref[i][j]
			p := Point{F: f, N: l.N, Want: rl.Energy, Got: l.Energy, Err: l.Err, Bound: l.Bound, RefErr: rl.Err}
			d := p.True()
			r.Points++
			got[i][j] = l.Energy
			maxClaim = math.Max(maxClaim, l.Err)
			maxRef = math.Max(maxRef, rl.Err)
			if d > r.Abs.Value || r.Points == 1 {
				r.Abs = Worst{d, f, l.N}
			}
			if rl.Energy != 0 {
				if rel := d / math.Abs(rl.Energy); rel > r.Rel.Value {
					r.Rel = Worst{rel, f, l.N}
				}
			}
			if l.Bound != tiltwell.Rigorous {
				nEst++
			}
			if d > l.Err+rl.Err {
				fatal := true
				switch {
				case l.Bound == tiltwell.Rigorous:
					underRig++
				case p.Gross():
					underGross++
					underEst++
				default:
					underEst++
					fatal = false
				}
				switch {
				case fatal && len(r.Undershot) < maxListed:
					r.Undershot = append(r.Undershot, p)
				case !fatal && len(smallListed) < maxListed:
					smallListed = append(smallListed, p)
				}
				if p.Excess() > r.WorstUndershoot.Excess() {
					r.WorstUndershoot = p
				}
			}
			if gr != nil {
				nGamma++
				gr.add(GammaPoint{F: f, N: l.N, Want: rl.Gamma, Got: l.Gamma, GammaErr: l.GammaErr, RefGammaErr: rl.GammaErr}, maxRatio)
			}
			if d > floor {
				q := l.Err / d
				if q > r.Ratio.Value {
					r.Ratio = Worst{q, f, l.N}
				}
				if maxRatio > 0 && q > maxRatio {
					r.Pessimistic++
				}
			}
			if tol > 0 && d > tol+rl.Err {
				r.Beyond++
			}
		}
	}
	r.Undershoots = underEst + underRig
	r.RigorousUndershoots = underRig
	r.GrossUndershoots = underGross
	for _, p := range smallListed {
		if len(r.Undershot) == maxListed {
			break
		}
		r.Undershot = append(r.Undershot, p)
	}
	r.Allowed = nEst / 100
	if gr != nil {
		gr.Allowed = nGamma / 100
	}
	r.badInput(s, fields[0], len(ref[0]))
	r.concurrent(s, fields, ref)
	if ws, ok := s.(tiltwell.WaveSolver); ok {
		r.waves(ws, st, fields, ref)
	}
	r.Margin = tol
	if r.Margin == 0 {
		r.Margin = maxClaim
	}
	r.Margin += maxRef
	r.Diff = diff(fields, ref, got, r.Margin)
	return r
}

// add counts one level's escape width.
func (g *GammaReport) add(p GammaPoint, maxRatio float64) {
	d := math.Abs(p.Got - p.Want)
	if d > g.Abs.Value {
		g.Abs = Worst{d, p.F, p.N}
	}
	if p.Want > 0 {
		if rel := d / p.Want; rel > g.Rel.Value {
			g.Rel = Worst{rel, p.F, p.N}
		}
	}
	if d > p.GammaErr+p.RefGammaErr {
		g.Undershoots++
		floor := max(RoundingULPs*0x1p-52*p.Want, gammaFloor)
		if d > SmallExcess*(p.GammaErr+p.RefGammaErr) && d > floor {
			g.GrossUndershoots++
		}
		if p.Excess() > g.Worst.Excess() {
			g.Worst = p
		}
	}
	if d > ratioFloorStack {
		q := p.GammaErr / d
		if q > g.Ratio.Value {
			g.Ratio = Worst{q, p.F, p.N}
		}
		if maxRatio > 0 && q > maxRatio {
			g.Pessimistic++
		}
	}
}

// maxDiff is the most levels Report.Diff lists.
const maxDiff = 50

// diff lists the levels whose energy got[i][j] is farther than margin
// from ref[i][j], in the format documented at Report.Diff.
func diff(fields []float64, ref [][]tiltwell.Level, got [][]float64, margin float64) string {
	var b []byte
	listed, more := 0, 0
	for i, f := range fields {
		for j, e := range got[i] {
			w := ref[i][j].Energy
			if !(math.Abs(e-w) > margin) {
				continue
			}
			if listed == maxDiff {
				more++
				continue
			}
			listed++
			for _, side := range []struct {
				sign byte
				v    float64
			}{{'-', w}, {'+', e}} {
				b = append(b, side.sign, 'f', '=')
				b = strconv.AppendFloat(b, f, 'g', -1, 64)
				b = append(b, " n="...)
				b = strconv.AppendInt(b, int64(j+1), 10)
				b = append(b, ": "...)
				b = strconv.AppendFloat(b, side.v, 'g', -1, 64)
				b = append(b, '\n')
			}
		}
	}
	if more > 0 {
		b = fmt.Appendf(b, "… and %d more levels beyond the margin\n", more)
	}
	return string(b)
}

func (r *Report) violate(format string, args ...any) {
	r.Violations = append(r.Violations, fmt.Sprintf(format, args...))
}

// callLevels runs s.Levels, turning a panic into an error.
func callLevels(s tiltwell.Solver, dst []tiltwell.Level, f float64, k int) (ls []tiltwell.Level, err error) {
	defer func() {
		if p := recover(); p != nil {
			ls, err = nil, fmt.Errorf("panic: %v", p)
		}
	}()
	return s.Levels(dst, f, k)
}

// levelsOK checks the shape of one Levels result.
func (r *Report) levelsOK(ls []tiltwell.Level, f float64, k int) bool {
	if len(ls) != k {
		r.violate("f=%g: Levels returned %d levels, want %d", f, len(ls), k)
		return false
	}
	ok := true
	for j, l := range ls {
		switch {
		case l.N != j+1:
			r.violate("f=%g: level %d has N = %d", f, j+1, l.N)
			ok = false
		case math.IsNaN(l.Energy) || math.IsInf(l.Energy, 0):
			r.violate("f=%g n=%d: energy %v", f, l.N, l.Energy)
			ok = false
		case math.IsNaN(l.Err) || l.Err < 0:
			r.violate("f=%g n=%d: error estimate %v", f, l.N, l.Err)
			ok = false
		case l.Bound != tiltwell.Estimate && l.Bound != tiltwell.Rigorous:
			r.violate("f=%g n=%d: unknown bound kind %v", f, l.N, l.Bound)
			ok = false
		case j > 0 && !(l.Energy >= ls[j-1].Energy):
			r.violate("f=%g: level %d (%v) below level %d (%v)", f, l.N, l.Energy, j, ls[j-1].Energy)
			ok = false
		}
	}
	return ok
}

// dstReuse checks that Levels appends to dst[:0] in dst's storage and
// overwrites what was there.
func (r *Report) dstReuse(s tiltwell.Solver, ls []tiltwell.Level, f float64, k int) {
	dst := make([]tiltwell.Level, 1, k+1)
	dst[0] = tiltwell.Level{N: -7, Energy: math.NaN(), Err: math.NaN()}
	got, err := callLevels(s, dst, f, k)
	if err != nil {
		r.violate("f=%g: Levels with a reused dst: %v", f, err)
		return
	}
	if len(got) != k || &got[:1][0] != &dst[:1][0] {
		r.violate("f=%g: Levels did not append to dst[:0] in dst's storage (cap %d, k %d)", f, cap(dst), k)
		return
	}
	for j := range got {
		if got[j].N != ls[j].N || math.Abs(got[j].Energy-ls[j].Energy) > got[j].Err+ls[j].Err {
			r.violate("f=%g n=%d: Levels gave %v with a reused dst, %v with nil", f, j+1, got[j], ls[j])
			return
		}
	}
}

// mirror checks η_n(−f) = η_n(f) within the estimates.
func (r *Report) mirror(s tiltwell.Solver, ls []tiltwell.Level, f float64, k int) {
	if f == 0 {
		return
	}
	m, err := callLevels(s, nil, -f, k)
	if err != nil {
		r.violate("f=%g: Levels at the mirrored field %g: %v", f, -f, err)
		return
	}
	if len(m) != k {
		r.violate("f=%g: %d levels at the mirrored field, want %d", f, len(m), k)
		return
	}
	for j := range m {
		if d := math.Abs(m[j].Energy - ls[j].Energy); !(d <= m[j].Err+ls[j].Err) {
			r.violate("f=%g n=%d: energies at ±f differ by %g, beyond the estimates %g + %g", f, j+1, d, ls[j].Err, m[j].Err)
			return
		}
	}
}

// badInput checks the errors for NaN and infinite fields and k < 1.
func (r *Report) badInput(s tiltwell.Solver, f float64, k int) {
	for _, tc := range []struct {
		f    float64
		k    int
		want error
	}{
		{math.NaN(), k, tiltwell.ErrField},
		{math.Inf(1), k, tiltwell.ErrField},
		{math.Inf(-1), k, tiltwell.ErrField},
		{f, 0, tiltwell.ErrLevel},
		{f, -1, tiltwell.ErrLevel},
	} {
		dst := make([]tiltwell.Level, 2, k+2)
		ls, err := callLevels(s, dst, tc.f, tc.k)
		if !errors.Is(err, tc.want) {
			r.violate("Levels(dst, %v, %d): error %v, want one wrapping %q", tc.f, tc.k, err, tc.want)
			continue
		}
		if len(ls) != 0 {
			r.violate("Levels(dst, %v, %d): %d levels with the error, want 0", tc.f, tc.k, len(ls))
		}
	}
	ws, ok := s.(tiltwell.WaveSolver)
	if !ok {
		return
	}
	for _, tc := range []struct {
		f    float64
		n    int
		want error
	}{
		{math.NaN(), 1, tiltwell.ErrField},
		{math.Inf(1), 1, tiltwell.ErrField},
		{f, 0, tiltwell.ErrLevel},
	} {
		if _, err := callWave(ws, tc.f, tc.n); !errors.Is(err, tc.want) {
			r.violate("Wavefunction(%v, %d): error %v, want one wrapping %q", tc.f, tc.n, err, tc.want)
		}
	}
}

// concurrent computes the grid from several goroutines at once and
// compares with the serial result.
func (r *Report) concurrent(s tiltwell.Solver, fields []float64, ref [][]tiltwell.Level) {
	const workers = 4
	results := make([][][]tiltwell.Level, workers)
	var wg sync.WaitGroup
	for w := range workers {
		wg.Go(func() {
			var dst []tiltwell.Level
			for i, f := range fields {
				ls, err := callLevels(s, dst, f, len(ref[i]))
				if err != nil {
					results[w] = append(results[w], nil)
					continue
				}
				results[w] = append(results[w], append([]tiltwell.Level(nil), ls...))
				dst = ls
			}
		})
	}
	wg.Wait()
	for i, f := range fields {
		serial, err := callLevels(s, nil, f, len(ref[i]))
		if err != nil || len(serial) != len(ref[i]) {
			continue // reported already
		}
		for w := range workers {
			c := results[w][i]
			if len(c) != len(serial) {
				r.violate("f=%g: %d levels when called concurrently, %d serially", f, len(c), len(serial))
				return
			}
			for j := range c {
				if d := math.Abs(c[j].Energy - serial[j].Energy); !(d <= c[j].Err+serial[j].Err) {
					r.violate("f=%g n=%d: concurrent call gave %v, serial %v", f, j+1, c[j].Energy, serial[j].Energy)
					return
				}
			}
		}
	}
}

// callWave calls ws.Wavefunction, turning a panic into an error.
func callWave(ws tiltwell.WaveSolver, f float64, n int) (w tiltwell.Wavefunction, err error) {
	defer func() {
		if p := recover(); p != nil {
			w, err = nil, fmt.Errorf("panic: %v", p)
		}
	}()
	w, err = ws.Wavefunction(f, n)
	if err == nil && w == nil {
		err = errors.New("nil wavefunction and nil error")
	}
	return w, err
}

// callAt calls w.At, turning a panic into NaN.
func callAt(w tiltwell.Wavefunction, xi float64) (v float64) {
	defer func() {
		if p := recover(); p != nil {
			v = math.NaN()
		}
	}()
	return w.At(xi)
}

// waves checks the wavefunctions of every level on the grid.
func (r *Report) waves(ws tiltwell.WaveSolver, st tiltwell.Stack, fields []float64, ref [][]tiltwell.Level) {
	wr := &WaveReport{Overlap: Worst{Value: math.Inf(1)}}
	r.Waves = wr
	for i, f := range fields {
		for n := 1; n <= len(ref[i]); n++ {
			w, err := callWave(ws, f, n)
			if err != nil {
				r.violate("f=%g: Wavefunction(%g, %d): %v", f, f, n, err)
				continue
			}
			we, err := Solver{Stack: st}.Wavefunction(f, n)
			if err != nil {
				r.violate("f=%g: reference wavefunction %d: %v", f, n, err)
				continue
			}
			outside := []float64{-0.25, -1e-300, 1 + 1e-15, 2, math.NaN(), math.Inf(1)}
			if !st.Infinite() {
				outside = []float64{math.NaN()}
			}
			for _, xi := range outside {
				if v := callAt(w, xi); v != 0 {
					r.violate("f=%g n=%d: At(%v) = %v, want 0 outside [0, 1]", f, n, xi, v)
					break
				}
			}
			var norm, ov float64
			var ok bool
			if st.Infinite() {
				norm, ov, ok = integrals(w, we)
			} else {
				norm, ov, ok = stackIntegrals(w, we, st)
			}
			if !ok {
				r.violate("f=%g n=%d: wavefunction has NaN or infinite values, or panics", f, n)
				continue
			}
			if d := math.Abs(norm - 1); d > wr.Norm.Value {
				wr.Norm = Worst{d, f, n}
			}
			if ov < wr.Overlap.Value {
				wr.Overlap = Worst{ov, f, n}
			}
			if d := math.Abs(norm - 1); d > normTol {
				r.violate("f=%g n=%d: ∫φ² = %.12g, want 1 within %g", f, n, norm, float64(normTol))
			}
			// A clearly negative overlap is the right state with the wrong
			// sign; a small one is a poor wavefunction, reported above.
			if ov < -0.5 {
				r.violate("f=%g n=%d: overlap with the exact wavefunction %.6f: sign convention φ′(0) > 0 broken", f, n, ov)
			}
		}
	}
}

// Wavefunction integrals by Gauss–Legendre rules (gonum's quad.Legendre)
// of orders 64, 128, … 1024 until two successive orders agree to 1e-13;
// the integrands are entire, so the rules converge geometrically once
// they resolve the oscillations (DLMF 3.5.19 for the error term).
const (
	waveMinOrder = 64
	waveMaxOrder = 1024
	waveTol      = 1e-13
)

type glRule struct{ x, w []float64 }

// waveRules are built once and must not be modified.
var waveRules = sync.OnceValue(func() []glRule {
	var rs []glRule
	for n := waveMinOrder; n <= waveMaxOrder; n *= 2 {
		r := glRule{x: make([]float64, n), w: make([]float64, n)}
		quad.Legendre{}.FixedLocations(r.x, r.w, 0, 1)
		rs = append(rs, r)
	}
	return rs
})

// integrals returns ∫φ² and ∫φ φ_exact over [0, 1], at the last order
// used; ok is false for NaN or infinite values.
func integrals(w, we tiltwell.Wavefunction) (norm, overlap float64, ok bool) {
	var pn, po float64
	for i, r := range waveRules() {
		norm, overlap = 0, 0
		for q, x := range r.x {
			v := callAt(w, x)
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return 0, 0, false
			}
			norm += r.w[q] * v * v
			overlap += r.w[q] * v * we.At(x)
		}
		if i > 0 && math.Abs(norm-pn) <= waveTol && math.Abs(overlap-po) <= waveTol {
			break
		}
		pn, po = norm, overlap
	}
	return norm, overlap, true
}

// stackIntegrals returns ∫φ² over w's support and ∫φ φ_exact over the
// union of the two supports, each integral in pieces between the stack's
// interfaces (where φ′ jumps with the mass), by the rules of [integrals]
// on each piece; ok is false for NaN or infinite values or a support that
// is not a finite interval.
func stackIntegrals(w, we tiltwell.Wavefunction, st tiltwell.Stack) (norm, overlap float64, ok bool) {
	lo, hi := tiltwell.Support(w)
	elo, ehi := tiltwell.Support(we)
	if !(lo < hi) || math.IsInf(lo, 0) || math.IsInf(hi, 0) {
		return 0, 0, false
	}
	cuts := func(a, b float64) []float64 {
		c := []float64{a}
		for _, x := range st.Interfaces(nil) {
			if x > a && x < b {
				c = append(c, x)
			}
		}
		return append(c, b)
	}
	sq := func(x float64) float64 { v := callAt(w, x); return v * v }
	prod := func(x float64) float64 { return callAt(w, x) * we.At(x) }
	c := cuts(lo, hi)
	for i := 0; i+1 < len(c); i++ {
		v, good := pieceIntegral(sq, c[i], c[i+1])
		if !good {
			return 0, 0, false
		}
		norm += v
	}
	c = cuts(min(lo, elo), max(hi, ehi))
	for i := 0; i+1 < len(c); i++ {
		v, good := pieceIntegral(prod, c[i], c[i+1])
		if !good {
			return 0, 0, false
		}
		overlap += v
	}
	return norm, overlap, true
}

// pieceIntegral integrates g over [a, b] with the Gauss–Legendre rules of
// [integrals], on subintervals of length at most 1 (the wavefunctions
// oscillate or decay on the scale of the reference well), raising the
// order until two successive orders agree to waveTol.
func pieceIntegral(g func(float64) float64, a, b float64) (float64, bool) {
	n := max(1, int(math.Ceil(b-a)))
	total := 0.0
	for j := range n {
		x0 := a + (b-a)*float64(j)/float64(n)
		x1 := a + (b-a)*float64(j+1)/float64(n)
		var prev, s float64
		for i, r := range waveRules() {
			s = 0
			for q, x := range r.x {
				v := g(x0 + (x1-x0)*x)
				if math.IsNaN(v) || math.IsInf(v, 0) {
					return 0, false
				}
				s += r.w[q] * v
			}
			s *= x1 - x0
			if i > 0 && math.Abs(s-prev) <= waveTol {
				break
			}
			prev = s
		}
		total += s
	}
	return total, true
}

// String returns the report as readable text, several lines, ending in
// the diff if there is one.
func (r *Report) String() string {
	var b strings.Builder
	verdict := "ok"
	if !r.OK() {
		verdict = "FAIL"
	}
	fmt.Fprintf(&b, "exact.Check of %s: %d levels at %d fields: %s\n", r.Solver, r.Points, r.Fields, verdict)
	for _, w := range []struct {
		name string
		w    Worst
	}{{"absolute", r.Abs}, {"relative", r.Rel}} {
		if w.w.Value == 0 {
			fmt.Fprintf(&b, "  worst %s error 0\n", w.name)
		} else {
			fmt.Fprintf(&b, "  worst %s error %.3g at f=%g n=%d\n", w.name, w.w.Value, w.w.F, w.w.N)
		}
	}
	fmt.Fprintf(&b, "  error estimates: %d of %d undershot the true error (%d rigorous, %d gross, none allowed; %d small, %d allowed)\n",
		r.Undershoots, r.Points, r.RigorousUndershoots, r.GrossUndershoots,
		r.Undershoots-r.RigorousUndershoots-r.GrossUndershoots, r.Allowed)
	shown := 0
	if r.Undershoots > 0 {
		fmt.Fprintf(&b, "    worst: %s\n", r.WorstUndershoot.describe())
		shown++
	}
	for _, p := range r.Undershot {
		if p == r.WorstUndershoot {
			continue // listed above as the worst
		}
		fmt.Fprintf(&b, "    %s\n", p.describe())
		shown++
	}
	if r.Undershoots > shown {
		fmt.Fprintf(&b, "    … and %d more\n", r.Undershoots-shown)
	}
	if r.Ratio.Value > 1 {
		fmt.Fprintf(&b, "  most pessimistic estimate: %.3g × the true error at f=%g n=%d", r.Ratio.Value, r.Ratio.F, r.Ratio.N)
		if r.Pessimistic > 0 {
			fmt.Fprintf(&b, "; %d levels beyond the limit", r.Pessimistic)
		}
		b.WriteString("\n")
	}
	if r.Tol > 0 {
		fmt.Fprintf(&b, "  tolerance %g: %d levels beyond it\n", r.Tol, r.Beyond)
	}
	if g := r.Gamma; g != nil {
		fmt.Fprintf(&b, "  escape widths: worst |Γ − Γ_exact| %.3g (f=%g n=%d), relative %.3g (f=%g n=%d); %d undershoots (%d gross, %d allowed)",
			g.Abs.Value, g.Abs.F, g.Abs.N, g.Rel.Value, g.Rel.F, g.Rel.N, g.Undershoots, g.GrossUndershoots, g.Allowed)
		if g.Ratio.Value > 1 {
			fmt.Fprintf(&b, "; most pessimistic %.3g× (f=%g n=%d)", g.Ratio.Value, g.Ratio.F, g.Ratio.N)
			if g.Pessimistic > 0 {
				fmt.Fprintf(&b, ", %d beyond the limit", g.Pessimistic)
			}
		}
		b.WriteString("\n")
		if g.Undershoots > 0 {
			p := g.Worst
			fmt.Fprintf(&b, "    worst: f=%g n=%d: Γ = %.17g ± %.3g, exact %.17g ± %.3g\n", p.F, p.N, p.Got, p.GammaErr, p.Want, p.RefGammaErr)
		}
	}
	if w := r.Waves; w != nil {
		fmt.Fprintf(&b, "  wavefunctions: |∫φ² − 1| ≤ %.3g (f=%g n=%d), overlap with exact ≥ %.12f (f=%g n=%d)\n",
			w.Norm.Value, w.Norm.F, w.Norm.N, w.Overlap.Value, w.Overlap.F, w.Overlap.N)
	}
	if len(r.Violations) == 0 {
		b.WriteString("  contract: kept\n")
	} else {
		fmt.Fprintf(&b, "  contract: %d violations\n", len(r.Violations))
		for _, v := range r.Violations {
			fmt.Fprintf(&b, "    %s\n", v)
		}
	}
	if r.Diff != "" {
		fmt.Fprintf(&b, "  energies beyond the margin %.3g (-want +got):\n", r.Margin)
		for line := range strings.Lines(r.Diff) {
			b.WriteString("    ")
			b.WriteString(line)
		}
	}
	return b.String()
}

// describe is one line about an undershot point for [Report.String].
func (p Point) describe() string {
	kind := "small"
	switch {
	case p.Bound == tiltwell.Rigorous:
		kind = "rigorous"
	case p.Gross():
		kind = "gross"
	}
	return fmt.Sprintf("f=%g n=%d: %s undershoot, true error %.3g, estimate %.3g (%v) + reference %.3g, %.3g× over; η = %.17g, exact %.17g",
		p.F, p.N, kind, p.True(), p.Err, p.Bound, p.RefErr, p.Excess(), p.Got, p.Want)
}
