package tiltwell_test

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/google/go-cmp/cmp"
	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/basis"
	"github.com/tiltwell/tiltwell/exact"
	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/integrate/quad"
)

// demoPair is the electron/heavy-hole pair of a 10 nm GaAs-like well
// (demo data): m_e = 0.067 and m_hh[001] = 1/(γ₁ − 2γ₂) = 0.3497 with the
// GaAs γ₁ = 6.98, γ₂ = 2.06 of I. Vurgaftman, J. R. Meyer, L. R.
// Ram-Mohan, J. Appl. Phys. 89, 5815 (2001), DOI 10.1063/1.1368156
// (values from memory; 1/(γ₁ − 2γ₂) = 0.34965, rounded to four digits).
var demoPair = tiltwell.Pair{Width: 10e-9, Electron: 0.067, Hole: 0.3497}

// shiftTol is the agreement in meV asked of the exact solver's red shift
// with the mpmath values below. It is set by the exact package's present
// accuracy (about 1e-10 E₁, E₁ ≈ 56 meV for the electron) and can be
// tightened to 1e-9 meV once the reference is good to 1e-14.
const shiftTol = 1e-9

// TestSweepRedShift holds the e1–hh1 red shift −Shift of the demo pair
// against an independent computation, made for this test with mpmath
// 1.3.0 at 30 digits: the Airy determinant Ai(z₀)Bi(z₁) − Ai(z₁)Bi(z₀) = 0
// (DLMF 9.2) solved by findroot for each carrier, with the CODATA 2018
// constants (E. Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)) and
// m_hh = 0.3497. Red shifts of tens of meV at 100–200 kV/cm in a 10 nm
// well are what the trade reports (common practice, no source).
func TestSweepRedShift(t *testing.T) {
	t.Parallel()
	want := []struct{ kv, mpmath float64 }{
		{50, 2.90193960270738},
		{100, 10.7432057127725},
		{150, 22.0988363402124},
		{200, 36.0058830679722},
	}
	fields := make([]float64, len(want))
	for i, w := range want {
		fields[i] = tiltwell.KVPerCM(w.kv)
	}
	ts := []tiltwell.Transition{{E: 1, H: 1}}
	lines, err := demoPair.Sweep(exact.Solver{}, nil, fields, ts)
	if err != nil {
		t.Fatal(err)
	}
	prev := 1.0
	for i, w := range want {
		l := lines[i]
		if got := -l.Shift; math.Abs(got-w.mpmath) > shiftTol {
			t.Errorf("F = %v kV/cm: red shift %.12f meV, mpmath %.12f", w.kv, got, w.mpmath)
		}
		if l.ShiftErr > 1e-6 {
			t.Errorf("F = %v kV/cm: shift error estimate %g meV from the exact solver", w.kv, l.ShiftErr)
		}
		// The overlap falls with field as the carriers are pulled to
		// opposite walls (common practice, no source).
		if !(l.Overlap2 < prev && l.Overlap2 > 0) {
			t.Errorf("F = %v kV/cm: overlap² %v, want in (0, %v)", w.kv, l.Overlap2, prev)
		}
		prev = l.Overlap2
		if l.OverlapErr > 1e-12 {
			t.Errorf("F = %v kV/cm: quadrature error estimate %g", w.kv, l.OverlapErr)
		}
	}
}

// TestSweepElectronShift: with equal masses the hole's shift equals the
// electron's (the same f, mirrored tilt, same spectrum), so the e1–hh1
// Shift is twice the electron ground-level shift of a 10 nm well with
// m* = 0.067. The shifts below were computed with mpmath from the Airy
// determinant (DLMF 9.2) and the CODATA 2018 constants, to six
// significant digits; they are not a published table.
func TestSweepElectronShift(t *testing.T) {
	t.Parallel()
	want := []struct{ kv, shift float64 }{
		{10, -0.0192946},
		{50, -0.481642},
		{100, -1.91768},
		{200, -7.53596},
	}
	pair := tiltwell.Pair{Width: 10e-9, Electron: 0.067, Hole: 0.067}
	fields := make([]float64, len(want))
	for i, w := range want {
		fields[i] = tiltwell.KVPerCM(w.kv)
	}
	lines, err := pair.Sweep(exact.Solver{}, nil, fields, []tiltwell.Transition{{E: 1, H: 1}})
	if err != nil {
		t.Fatal(err)
	}
	for i, w := range want {
		got := lines[i].Shift / 2
		// Six significant digits: half a unit in the last.
		if !scalar.EqualWithinRel(got, w.shift, 5e-6) {
			t.Errorf("F = %v kV/cm: electron shift %.7g meV, mpmath %v", w.kv, got, w.shift)
		}
	}
}

// TestSweepZeroField: at F = 0 both wavefunctions are √2 sin(nπξ) (closed
// form, see the package documentation), so the overlap is δ_EH by
// orthonormality (with the sign convention φ′(0) > 0 for the hole, see
// Line.Overlap), and nothing has shifted.
func TestSweepZeroField(t *testing.T) {
	t.Parallel()
	ts := []tiltwell.Transition{{E: 1, H: 1}, {E: 1, H: 2}, {E: 2, H: 2}, {E: 1, H: 3}, {E: 3, H: 1}}
	lines, err := demoPair.Sweep(exact.Solver{}, exact.Solver{}, []float64{0}, ts)
	if err != nil {
		t.Fatal(err)
	}
	for i, l := range lines {
		want := 0.0
		if ts[i].E == ts[i].H {
			want = 1
		}
		if l.Transition != ts[i] || l.Field != 0 {
			t.Errorf("line %d is %v at F = %v, want %v at 0", i, l.Transition, l.Field, ts[i])
		}
		if math.Abs(l.Overlap-want) > 1e-12 || math.Abs(l.Overlap2-want*want) > 1e-12 {
			t.Errorf("%v: overlap %v (squared %v), want %v", l.Transition, l.Overlap, l.Overlap2, want)
		}
		if l.Shift != 0 {
			t.Errorf("%v: shift %v meV at zero field, want 0", l.Transition, l.Shift)
		}
	}
}

// trialSolver is a test WaveSolver with a closed-form overlap: level 1
// only, with the trial function of G. Bastard, E. E. Mendez, L. L. Chang,
// L. Esaki, Phys. Rev. B 28, 3241 (1983) (its form from memory: the
// zero-field level times e^(−βξ)), taken with β = f/4 (a fixed choice for
// the test, not the variational optimum):
//
//	ψ(ξ) = N sin(πξ) e^(−βξ),  N⁻² = g(−2β),
//	g(c) = ∫₀¹ sin²(πξ) e^(cξ) dξ = 2π² (e^c − 1) / (c (c² + 4π²))
//
// (g by elementary integration; g(0) = 1/2). Its energy is the trial
// energy ⟨ψ|H|ψ⟩ of that function, by elementary integration (checked
// with mpmath),
// η(β) = 1 + β²/π² − (f/2)[coth β − 1/β − 2β/(β² + π²)].
type trialSolver struct{ maxField float64 }

func trialG(c float64) float64 {
	if c == 0 {
		return 0.5
	}
	return 2 * math.Pi * math.Pi * math.Expm1(c) / (c * (c*c + 4*math.Pi*math.Pi))
}

func trialBeta(f float64) float64 { return f / 4 }

func trialEnergy(f float64) float64 {
	b := trialBeta(f)
	if b == 0 {
		return 1
	}
	return 1 + b*b/(math.Pi*math.Pi) - f/2*(1/math.Tanh(b)-1/b-2*b/(b*b+math.Pi*math.Pi))
}

func (s trialSolver) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	dst = dst[:0]
	if err := tiltwell.CheckArgs("trial", f, k, 1, s.maxField); err != nil {
		return dst, err
	}
	af, _ := tiltwell.Fold(f)
	return append(dst, tiltwell.Level{N: 1, Energy: trialEnergy(af), Err: 1e-3}), nil
}

func (s trialSolver) Wavefunction(f float64, n int) (tiltwell.Wavefunction, error) {
	if err := tiltwell.CheckArgs("trial", f, n, 1, s.maxField); err != nil {
		return nil, err
	}
	af, mirrored := tiltwell.Fold(f)
	b := trialBeta(af)
	norm := 1 / math.Sqrt(trialG(-2*b))
	var w tiltwell.Wavefunction = tiltwell.WaveFunc(func(xi float64) float64 {
		return norm * math.Sin(math.Pi*xi) * math.Exp(-b*xi)
	})
	if mirrored {
		w = tiltwell.Mirror(w, n)
	}
	return w, nil
}

// trialOverlap is the closed-form overlap of trialSolver's electron at f_e
// with its hole in the mirrored tilt at f_h: ψ_h(ξ) = ψ(1 − ξ; β_h), and
// sin(π(1 − ξ)) = sin(πξ), so
//
//	∫ ψ_e ψ_h = N_e N_h e^(−β_h) g(β_h − β_e).
func trialOverlap(fe, fh float64) float64 {
	be, bh := trialBeta(fe), trialBeta(fh)
	return math.Exp(-bh) * trialG(bh-be) / math.Sqrt(trialG(-2*be)*trialG(-2*bh))
}

// TestSweepOverlapConverges holds the adaptive Gauss–Legendre overlap
// against the closed form of trialSolver, from a flat function to one
// squeezed against a wall (β_h up to 75, a decay length of 1/75 of the
// well), where low orders are far off.
func TestSweepOverlapConverges(t *testing.T) {
	t.Parallel()
	we, wh, err := demoPair.Wells()
	if err != nil {
		t.Fatal(err)
	}
	var fields []float64
	for _, fe := range []float64{0, 0.3, 2, 8, 20, 58} {
		fields = append(fields, we.Field(fe), -we.Field(fe))
	}
	lines, err := demoPair.Sweep(trialSolver{}, nil, fields, []tiltwell.Transition{{E: 1, H: 1}})
	if err != nil {
		t.Fatal(err)
	}
	for _, l := range lines {
		fe, fh := math.Abs(we.Reduced(l.Field)), math.Abs(wh.Reduced(l.Field))
		want := trialOverlap(fe, fh)
		if !scalar.EqualWithinAbsOrRel(l.Overlap, want, 1e-14, 1e-12) {
			t.Errorf("f_e = %.4g, f_h = %.4g: overlap %.17g, closed form %.17g (quadrature estimate %g)", fe, fh, l.Overlap, want, l.OverlapErr)
		}
		if !(l.OverlapErr <= 1e-12) {
			t.Errorf("f_e = %.4g: quadrature estimate %g above 1e-12", fe, l.OverlapErr)
		}
		wantShift := we.MilliEV(trialEnergy(fe)-1) + wh.MilliEV(trialEnergy(fh)-1)
		if !scalar.EqualWithinAbsOrRel(l.Shift, wantShift, 1e-12, 1e-12) {
			t.Errorf("f_e = %.4g: shift %v meV, want %v", fe, l.Shift, wantShift)
		}
	}
	// The sweep went up to f_h = 58·m_hh/m_e ≈ 303, β_h ≈ 76: check that
	// the case the comment promises was really covered.
	if fh := wh.Reduced(fields[len(fields)-2]); fh < 300 {
		t.Errorf("largest hole field %v, want at least 300", fh)
	}
}

// TestSweepMirror: the spectrum is even in f and the overlap only changes
// sign convention under F → −F (mirror symmetry, see the package
// documentation).
func TestSweepMirror(t *testing.T) {
	t.Parallel()
	F := tiltwell.KVPerCM(120)
	lines, err := demoPair.Sweep(trialSolver{}, nil, []float64{F, -F}, []tiltwell.Transition{{E: 1, H: 1}})
	if err != nil {
		t.Fatal(err)
	}
	if p, m := lines[0], lines[1]; p.Shift != m.Shift || math.Abs(p.Overlap2-m.Overlap2) > 1e-14 {
		t.Errorf("F = ±120 kV/cm: shift %v vs %v, overlap² %v vs %v", p.Shift, m.Shift, p.Overlap2, m.Overlap2)
	}
}

// TestSweepDeterministic: the parallel sweep gives the lines of a field
// by field loop, in order, every time.
func TestSweepDeterministic(t *testing.T) {
	t.Parallel()
	var fields []float64
	for kv := -150.0; kv <= 300; kv += 15 {
		fields = append(fields, tiltwell.KVPerCM(kv))
	}
	ts := []tiltwell.Transition{{E: 1, H: 1}}
	var want []tiltwell.Line
	for _, F := range fields {
		l, err := demoPair.Sweep(trialSolver{}, nil, []float64{F}, ts)
		if err != nil {
			t.Fatal(err)
		}
		want = append(want, l...)
	}
	for run := range 5 {
		got, err := demoPair.Sweep(trialSolver{}, nil, fields, ts)
		if err != nil {
			t.Fatal(err)
		}
		if diff := cmp.Diff(want, got); diff != "" {
			t.Fatalf("run %d: parallel sweep differs from the serial one (-want +got):\n%s", run, diff)
		}
	}
}

// TestSweepSolverError: a solver error comes back for the first failing
// field in list order, whichever goroutine met it first.
func TestSweepSolverError(t *testing.T) {
	t.Parallel()
	_, wh, err := demoPair.Wells()
	if err != nil {
		t.Fatal(err)
	}
	// trialSolver{maxField: 50} fails where the hole's f_h > 50.
	var fields []float64
	for kv := 10.0; kv <= 1000; kv += 10 {
		fields = append(fields, tiltwell.KVPerCM(kv))
	}
	first := -1
	for i, F := range fields {
		if wh.Reduced(F) > 50 {
			first = i
			break
		}
	}
	want := fmt.Sprintf("F = %g V/m", fields[first])
	for run := range 10 {
		_, err := demoPair.Sweep(trialSolver{maxField: 50}, nil, fields, []tiltwell.Transition{{E: 1, H: 1}})
		if !errors.Is(err, tiltwell.ErrOutOfRange) {
			t.Fatalf("run %d: error %v, want one wrapping ErrOutOfRange", run, err)
		}
		if !strings.Contains(err.Error(), want) {
			t.Fatalf("run %d: error %q does not name the first failing field (%s)", run, err, want)
		}
	}
}

func TestSweepBadInput(t *testing.T) {
	t.Parallel()
	ok := []tiltwell.Transition{{E: 1, H: 1}}
	fields := []float64{0, 1e7}
	for _, tc := range []struct {
		name   string
		pair   tiltwell.Pair
		s      tiltwell.WaveSolver
		fields []float64
		ts     []tiltwell.Transition
		want   error
	}{
		{"width=-10nm", tiltwell.Pair{Width: -10e-9, Electron: 0.067, Hole: 0.35}, trialSolver{}, fields, ok, tiltwell.ErrUnits},
		{"width=0", tiltwell.Pair{Electron: 0.067, Hole: 0.35}, trialSolver{}, fields, ok, tiltwell.ErrUnits},
		{"me=-0.067", tiltwell.Pair{Width: 10e-9, Electron: -0.067, Hole: 0.35}, trialSolver{}, fields, ok, tiltwell.ErrUnits},
		{"mh=-0.35", tiltwell.Pair{Width: 10e-9, Electron: 0.067, Hole: -0.35}, trialSolver{}, fields, ok, tiltwell.ErrUnits},
		{"mh=NaN", tiltwell.Pair{Width: 10e-9, Electron: 0.067, Hole: math.NaN()}, trialSolver{}, fields, ok, tiltwell.ErrUnits},
		{"me=Inf", tiltwell.Pair{Width: 10e-9, Electron: math.Inf(1), Hole: 0.35}, trialSolver{}, fields, ok, tiltwell.ErrUnits},
		{"solver=nil", demoPair, nil, fields, ok, tiltwell.ErrNoSolver},
		{"F=NaN", demoPair, trialSolver{}, []float64{0, math.NaN()}, ok, tiltwell.ErrField},
		{"F=+Inf", demoPair, trialSolver{}, []float64{math.Inf(1)}, ok, tiltwell.ErrField},
		{"fields=none", demoPair, trialSolver{}, nil, ok, tiltwell.ErrField},
		{"transitions=none", demoPair, trialSolver{}, fields, nil, tiltwell.ErrLevel},
		{"E=0", demoPair, trialSolver{}, fields, []tiltwell.Transition{{E: 0, H: 1}}, tiltwell.ErrLevel},
		{"H=-1", demoPair, trialSolver{}, fields, []tiltwell.Transition{{E: 1, H: 1}, {E: 1, H: -1}}, tiltwell.ErrLevel},
		{"E=MaxLevelRequest+1", demoPair, trialSolver{}, fields, []tiltwell.Transition{{E: tiltwell.MaxLevelRequest + 1, H: 1}}, tiltwell.ErrLevel},
		{"H=MaxInt", demoPair, trialSolver{}, fields, []tiltwell.Transition{{E: 1, H: math.MaxInt}}, tiltwell.ErrLevel},
		{"width=10m", tiltwell.Pair{Width: 10, Electron: 0.067, Hole: 0.35}, trialSolver{}, fields, ok, tiltwell.ErrUnits},
		// trialSolver has level 1 only: its own ErrLevel comes through.
		{"H=2/unsupported", demoPair, trialSolver{}, fields, []tiltwell.Transition{{E: 1, H: 2}}, tiltwell.ErrLevel},
	} {
		t.Run(tc.name, func(t *testing.T) {
			t.Parallel()
			lines, err := tc.pair.Sweep(tc.s, nil, tc.fields, tc.ts)
			if !errors.Is(err, tc.want) {
				t.Fatalf("error %v, want one wrapping %v", err, tc.want)
			}
			if lines != nil {
				t.Errorf("bad input still gave %d lines", len(lines))
			}
		})
	}
}

func TestTransitionString(t *testing.T) {
	t.Parallel()
	// The trade writes the heavy-hole transitions e1-hh1, e1-hh2 and the
	// light-hole ones e1-lh1 (common practice, no source).
	for _, c := range []struct {
		t    tiltwell.Transition
		want string
	}{
		{tiltwell.Transition{E: 1, H: 1}, "e1-hh1"},
		{tiltwell.Transition{E: 1, H: 2}, "e1-hh2"},
		{tiltwell.Transition{E: 2, H: 1, Hole: tiltwell.LightHole}, "e2-lh1"},
		{tiltwell.Transition{E: 1, H: 1, Hole: 7}, "e1-Carrier(7)1"},
	} {
		if got := c.t.String(); got != c.want {
			t.Errorf("%+v.String() = %q, want %q", c.t, got, c.want)
		}
	}
}

// TestSweepHoleKinds: a light-hole transition is labelled so, and one
// Sweep cannot mix two hole bands (a Pair has one hole mass).
func TestSweepHoleKinds(t *testing.T) {
	t.Parallel()
	lh := tiltwell.Transition{E: 1, H: 1, Hole: tiltwell.LightHole}
	lines, err := demoPair.Sweep(exact.Solver{}, nil, []float64{1e7}, []tiltwell.Transition{lh})
	if err != nil {
		t.Fatal(err)
	}
	if lines[0].Transition != lh || lines[0].String() != "e1-lh1" {
		t.Errorf("line %v, want e1-lh1", lines[0].Transition)
	}
	for _, ts := range [][]tiltwell.Transition{
		{{E: 1, H: 1}, lh},
		{{E: 1, H: 1, Hole: 9}},
	} {
		if _, err := demoPair.Sweep(exact.Solver{}, nil, []float64{1e7}, ts); !errors.Is(err, tiltwell.ErrLevel) {
			t.Errorf("%v: error %v, want one wrapping ErrLevel", ts, err)
		}
	}
}

// TestSweepOverlapErr holds OverlapErr against a 600-point Gauss–Legendre
// reference of the same integrand (the rule converges geometrically, so
// at 600 points it is exact to rounding for every case here): the
// estimate must cover the true error at every line, over fields from 0
// to 3e8 V/m (f_e up to 53, f_h up to 280) and transitions up to e5–hh5.
func TestSweepOverlapErr(t *testing.T) {
	t.Parallel()
	we, wh, err := demoPair.Wells()
	if err != nil {
		t.Fatal(err)
	}
	x, w := make([]float64, 600), make([]float64, 600)
	quad.Legendre{}.FixedLocations(x, w, 0, 1)
	var ts []tiltwell.Transition
	for e := 1; e <= 5; e++ {
		for h := 1; h <= 5; h += 2 {
			ts = append(ts, tiltwell.Transition{E: e, H: h})
		}
	}
	var fields []float64
	for i := range 40 {
		fields = append(fields, 3e8*math.Pow(float64(i)/39, 3))
	}
	lines, err := demoPair.Sweep(exact.Solver{}, nil, fields, ts)
	if err != nil {
		t.Fatal(err)
	}
	// The reference's own rounding: 600 terms of size ≤ 2/600 each.
	const refRound = 1e-15
	for _, l := range lines {
		fe, fh := we.Reduced(l.Field), wh.Reduced(l.Field)
		a, err1 := exact.Solver{}.Wavefunction(fe, l.E)
		b, err2 := exact.Solver{}.Wavefunction(-fh, l.H)
		if err1 != nil || err2 != nil {
			t.Fatal(err1, err2)
		}
		ref := 0.0
		for i := range x {
			ref += w[i] * a.At(x[i]) * b.At(x[i])
		}
		if d := math.Abs(l.Overlap - ref); d > l.OverlapErr+refRound || !(l.OverlapErr <= 1e-12) {
			t.Errorf("%v at f_e = %.4g: overlap %.17g, reference %.17g: error %.2g, estimate %.2g", l.Transition, fe, l.Overlap, ref, d, l.OverlapErr)
		}
	}
}

// TestOverlapEstimate holds the error estimate of every rule of the ladder,
// used alone, against the same 600-point reference, where the rule is far
// from converged as well as where it has: wherever the estimate claims
// less than 1e-6 (the quadrature accepts 1e-12) it must cover the true
// error. Where it is too coarse to tell (the Legendre coefficients of the
// integrand not yet decaying) it says +Inf or something large, and the
// ladder moves on.
func TestOverlapEstimate(t *testing.T) {
	t.Parallel()
	x, w := make([]float64, 600), make([]float64, 600)
	quad.Legendre{}.FixedLocations(x, w, 0, 1)
	checked, resolved := 0, 0
	for _, fe := range []float64{0, 1e-3, 0.5, 2, 5, 13, 35, 80, 200, 500} {
		for _, ratio := range []float64{1, 5.2, 0.3} {
			fh := fe * ratio
			for e := 1; e <= 10; e += 3 {
				for h := 1; h <= 10; h += 3 {
					a, err1 := exact.Solver{}.Wavefunction(fe, e)
					b, err2 := exact.Solver{}.Wavefunction(-fh, h)
					if err1 != nil || err2 != nil {
						t.Fatal(err1, err2)
					}
					ref := 0.0
					for i := range x {
						ref += w[i] * a.At(x[i]) * b.At(x[i])
					}
					for o := range tiltwell.Orders {
						nodes, integ := tiltwell.OverlapRule(o)
						if len(nodes) > 128 {
							break
						}
						ve, vh := make([]float64, len(nodes)), make([]float64, len(nodes))
						for i, xi := range nodes {
							ve[i], vh[i] = a.At(xi), b.At(xi)
						}
						q, est := integ(ve, vh)
						d := math.Abs(q - ref)
						if est >= 1e-6 {
							continue
						}
						checked++
						if d > 1e-14 {
							resolved++
						}
						if d > est+1e-15 {
							t.Errorf("f_e = %g, f_h = %g, e%d-hh%d, %d points: error %.2g, estimate %.2g", fe, fh, e, h, len(nodes), d, est)
						}
					}
				}
			}
		}
	}
	// The check must have met truncation errors well above rounding, or
	// it proves nothing about the extrapolation.
	if checked < 500 || resolved < 50 {
		t.Errorf("only %d estimates below 1e-6 checked, %d of them with a true error above 1e-14", checked, resolved)
	}
}

// sampledTrial is trialSolver that also implements tiltwell.WaveSampler,
// evaluating its closed form without allocating.
type sampledTrial struct{ trialSolver }

func (s sampledTrial) SampleWave(dst []float64, f float64, l tiltwell.Level, xi []float64) ([]float64, error) {
	dst = dst[:0]
	if err := tiltwell.CheckArgs("trial", f, l.N, 1, s.maxField); err != nil {
		return dst, err
	}
	af, mirrored := tiltwell.Fold(f)
	b := trialBeta(af)
	norm := 1 / math.Sqrt(trialG(-2*b))
	for _, x := range xi {
		if mirrored {
			x = 1 - x // level 1: no sign change
		}
		v := 0.0
		if x >= 0 && x <= 1 {
			v = norm * math.Sin(math.Pi*x) * math.Exp(-b*x)
		}
		dst = append(dst, v)
	}
	return dst, nil
}

// TestSweepSampler: a WaveSampler gives the lines the Wavefunction path
// gives, and Sweep allocates nothing per field with it: a sweep over 201
// fields makes as many allocations as one over 21.
func TestSweepSampler(t *testing.T) {
	var _ tiltwell.WaveSampler = sampledTrial{}
	ts := []tiltwell.Transition{{E: 1, H: 1}}
	short, long := sweepFields(21), sweepFields(201)
	want, err := demoPair.Sweep(trialSolver{}, nil, long, ts)
	if err != nil {
		t.Fatal(err)
	}
	got, err := demoPair.Sweep(sampledTrial{}, nil, long, ts)
	if err != nil {
		t.Fatal(err)
	}
	if diff := cmp.Diff(want, got); diff != "" {
		t.Errorf("sampled lines differ from the Wavefunction path (-want +got):\n%s", diff)
	}
	if testing.CoverMode() != "" || raceEnabled {
		t.Skip("allocation counts differ under -race and -cover")
	}
	allocs := func(fields []float64) float64 {
		return testing.AllocsPerRun(20, func() {
			if _, err := demoPair.Sweep(sampledTrial{}, nil, fields, ts); err != nil {
				t.Fatal(err)
			}
		})
	}
	if a, b := allocs(short), allocs(long); a != b {
		t.Errorf("%v allocations for 21 fields, %v for 201: Sweep allocates per field", a, b)
	}
}

// waveOnly hides every method of a solver but those of
// tiltwell.WaveSolver, so that Sweep and Device take the Wavefunction path.
type waveOnly struct{ tiltwell.WaveSolver }

// TestSweepExactSampler: exact.Solver is a WaveSampler; its samples give
// the lines of the Wavefunction path (which solves every level again) to
// rounding, and Sweep allocates nothing per field with it.
func TestSweepExactSampler(t *testing.T) {
	var _ tiltwell.WaveSampler = exact.Solver{}
	ts := []tiltwell.Transition{{E: 1, H: 1}, {E: 1, H: 2}, {E: 2, H: 3}}
	short, long := sweepFields(21), sweepFields(201)
	long = append(long, -long[100], tiltwell.KVPerCM(900))
	want, err := demoPair.Sweep(waveOnly{exact.Solver{}}, nil, long, ts)
	if err != nil {
		t.Fatal(err)
	}
	got, err := demoPair.Sweep(exact.Solver{}, nil, long, ts)
	if err != nil {
		t.Fatal(err)
	}
	for i := range got {
		g, w := got[i], want[i]
		if g.Shift != w.Shift || g.ShiftErr != w.ShiftErr || math.Abs(g.Overlap-w.Overlap) > 1e-14 || g.OverlapErr > 1e-12 {
			t.Errorf("%v at %g V/m: sampled %+v, Wavefunction path %+v", g.Transition, g.Field, g, w)
		}
	}
	if testing.CoverMode() != "" || raceEnabled {
		t.Skip("allocation counts differ under -race and -cover")
	}
	allocs := func(fields []float64) float64 {
		return testing.AllocsPerRun(20, func() {
			if _, err := demoPair.Sweep(exact.Solver{}, nil, fields, ts); err != nil {
				t.Fatal(err)
			}
		})
	}
	if a, b := allocs(short), allocs(long); a != b {
		t.Errorf("%v allocations for %d fields, %v for %d: Sweep allocates per field", a, len(short), b, len(long))
	}
}

// stepPotential is an asymmetric well for the basis solver: a step of 20
// E₁ on the right half (demo data).
func stepPotential(xi float64) float64 {
	if xi > 0.5 {
		return 20
	}
	return 0
}

// TestSweepAsymmetric: with a well that is not mirror-symmetric (a basis
// solver with a potential step), the hole's shift and its overlap must
// describe the same well, the one at −f_h: Shift is built from the
// hole's level at −f_h and Overlap from its wavefunction there, checked
// here against the solver's own Levels and a 600-point quadrature.
func TestSweepAsymmetric(t *testing.T) {
	t.Parallel()
	s := basis.Solver{Size: 60, Potential: stepPotential, Breaks: []float64{0.5}}
	pair := tiltwell.Pair{Width: 10e-9, Electron: 0.067, Hole: 0.067 * 3}
	we, wh, err := pair.Wells()
	if err != nil {
		t.Fatal(err)
	}
	F := tiltwell.KVPerCM(150)
	fe, fh := we.Reduced(F), wh.Reduced(F)
	lines, err := pair.Sweep(s, nil, []float64{F}, []tiltwell.Transition{{E: 1, H: 1}})
	if err != nil {
		t.Fatal(err)
	}
	level := func(f float64) float64 {
		ls, err := s.Levels(nil, f, 1)
		if err != nil {
			t.Fatal(err)
		}
		return ls[0].Energy
	}
	e0 := level(0)
	hm, hp := level(-fh), level(fh)
	// The test can tell the two conventions apart only if the well's
	// asymmetry moves the hole level by much more than the tolerance.
	if math.Abs(wh.MilliEV(hp-hm)) < 1 {
		t.Fatalf("hole level at ±f_h differs by %g meV only: not asymmetric enough", wh.MilliEV(hp-hm))
	}
	wantShift := we.MilliEV(level(fe)-e0) + wh.MilliEV(hm-e0)
	if got := lines[0].Shift; !scalar.EqualWithinAbsOrRel(got, wantShift, 1e-9, 1e-12) {
		t.Errorf("shift %.12g meV, want %.12g from the hole at −f_h (+f_h would give %.12g)", got, wantShift, we.MilliEV(level(fe)-e0)+wh.MilliEV(hp-e0))
	}
	a, err1 := s.Wavefunction(fe, 1)
	b, err2 := s.Wavefunction(-fh, 1)
	if err1 != nil || err2 != nil {
		t.Fatal(err1, err2)
	}
	x, w := make([]float64, 600), make([]float64, 600)
	quad.Legendre{}.FixedLocations(x, w, 0, 1)
	ref := 0.0
	for i := range x {
		ref += w[i] * a.At(x[i]) * b.At(x[i])
	}
	if got := lines[0].Overlap; math.Abs(got-ref) > 1e-12 {
		t.Errorf("overlap %.15g, want %.15g from the hole's wavefunction at −f_h", got, ref)
	}
}

// Solvers that break the contract or panic, for TestSweepFaults.
type (
	// badLevel returns level values set by set, at fields f ≥ 1 only.
	badLevel struct {
		trialSolver
		set func(*tiltwell.Level)
	}
	// badWave returns a wavefunction with the value v at every point.
	badWave struct {
		trialSolver
		v float64
	}
	// nilWave returns a nil wavefunction and no error.
	nilWave struct{ trialSolver }
	// panicWave returns a wavefunction that panics.
	panicWave struct{ trialSolver }
	// spreadSolver returns a wavefunction that reaches beyond [0, 1].
	spreadSolver struct{ trialSolver }
	// ptrSolver is a solver with pointer receivers, for typed nils.
	ptrSolver struct{ trialSolver }
	// fieldOnly is a basis solver whose levels use its Potential only
	// away from zero field, so that a panic in it happens on Sweep's
	// workers (in Wavefunction), not in the zero-field levels Sweep
	// solves first.
	fieldOnly struct{ basis.Solver }
)

func (s fieldOnly) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	if f == 0 {
		return basis.Solver{}.Levels(dst, f, k)
	}
	return s.Solver.Levels(dst, f, k)
}

func (s badLevel) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	dst, err := s.trialSolver.Levels(dst, f, k)
	if err == nil && math.Abs(f) >= 1 {
		s.set(&dst[0])
	}
	return dst, err
}

func (s badWave) Wavefunction(f float64, n int) (tiltwell.Wavefunction, error) {
	return tiltwell.WaveFunc(func(float64) float64 { return s.v }), nil
}

func (nilWave) Wavefunction(f float64, n int) (tiltwell.Wavefunction, error) { return nil, nil }

func (panicWave) Wavefunction(f float64, n int) (tiltwell.Wavefunction, error) {
	return tiltwell.WaveFunc(func(float64) float64 { panic("broken wavefunction") }), nil
}

type spread struct{ tiltwell.Wavefunction }

func (spread) Support() (lo, hi float64) { return -0.2, 1.2 }

func (s spreadSolver) Wavefunction(f float64, n int) (tiltwell.Wavefunction, error) {
	w, err := s.trialSolver.Wavefunction(f, n)
	return spread{w}, err
}

func (s *ptrSolver) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	return s.trialSolver.Levels(dst, f, k)
}

func (s *ptrSolver) Wavefunction(f float64, n int) (tiltwell.Wavefunction, error) {
	return s.trialSolver.Wavefunction(f, n)
}

// TestSweepFaults: a solver that returns a non-finite number, a nil or
// panicking wavefunction, or a typed nil gives an error that names the
// problem, never a panic or a non-finite line.
func TestSweepFaults(t *testing.T) {
	t.Parallel()
	var typedNil *ptrSolver
	panicky := basis.Solver{Potential: func(xi float64) float64 {
		if xi > 0.9 {
			panic("broken potential")
		}
		return 0
	}}
	fields := []float64{0, tiltwell.KVPerCM(30), tiltwell.KVPerCM(100)}
	for _, tc := range []struct {
		name           string
		electron, hole tiltwell.WaveSolver
		want           error
		text           string
	}{
		{"energy=+Inf", badLevel{set: func(l *tiltwell.Level) { l.Energy = math.Inf(1) }}, nil, tiltwell.ErrNoConvergence, "energy +Inf"},
		{"err=NaN", badLevel{set: func(l *tiltwell.Level) { l.Err = math.NaN() }}, nil, tiltwell.ErrNoConvergence, "error estimate NaN"},
		{"gamma=+Inf", badLevel{set: func(l *tiltwell.Level) { l.Gamma = math.Inf(1) }}, nil, tiltwell.ErrNoConvergence, "escape width +Inf"},
		{"gammaerr=-1", badLevel{set: func(l *tiltwell.Level) { l.GammaErr = -1 }}, nil, tiltwell.ErrNoConvergence, "escape width estimate -1"},
		{"wave=NaN", badWave{v: math.NaN()}, nil, tiltwell.ErrNoConvergence, "wavefunction value NaN"},
		{"wave=-Inf", trialSolver{}, badWave{v: math.Inf(-1)}, tiltwell.ErrNoConvergence, "wavefunction value -Inf"},
		{"wave=nil", nilWave{}, nil, tiltwell.ErrNoSolver, "nil wavefunction"},
		{"wave=panics", panicWave{}, nil, tiltwell.ErrPanic, "broken wavefunction"},
		{"potential=panics", panicky, nil, tiltwell.ErrPanic, "broken potential"},
		{"potential=panics-on-worker", fieldOnly{panicky}, nil, tiltwell.ErrPanic, "F = 0 V/m: a solver or its wavefunction panicked: broken potential"},
		{"wave=spread", spreadSolver{}, nil, tiltwell.ErrOutOfRange, "[-0.2, 1.2]"},
		{"electron=typed-nil", typedNil, nil, tiltwell.ErrNoSolver, "nil *tiltwell_test.ptrSolver"},
		{"hole=typed-nil", trialSolver{}, typedNil, tiltwell.ErrNoSolver, "nil *tiltwell_test.ptrSolver"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			t.Parallel()
			lines, err := demoPair.Sweep(tc.electron, tc.hole, fields, []tiltwell.Transition{{E: 1, H: 1}})
			if !errors.Is(err, tc.want) || !strings.Contains(fmt.Sprint(err), tc.text) {
				t.Fatalf("error %v, want one wrapping %v that says %q", err, tc.want, tc.text)
			}
			if lines != nil {
				t.Errorf("%d lines with the error", len(lines))
			}
		})
	}
}

// FuzzSweep: any field and masses give lines or an error wrapping a root
// sentinel, never a panic or a NaN.
func FuzzSweep(f *testing.F) {
	f.Add(1e7, 0.067, 0.3497, 1, 1)
	f.Add(0.0, 1.0, 1.0, 2, 3)
	f.Add(-3e8, 0.01, 5.0, 1, 2)
	f.Add(math.NaN(), 0.067, 0.35, 1, 1)
	f.Fuzz(func(t *testing.T, F, me, mh float64, e, h int) {
		if e > 8 || h > 8 {
			t.Skip("levels above 8: slow and not more telling")
		}
		pair := tiltwell.Pair{Width: 10e-9, Electron: me, Hole: mh}
		lines, err := pair.Sweep(exact.Solver{}, nil, []float64{F}, []tiltwell.Transition{{E: e, H: h}})
		if err != nil {
			for _, s := range []error{tiltwell.ErrUnits, tiltwell.ErrField, tiltwell.ErrLevel, tiltwell.ErrOutOfRange, tiltwell.ErrNoConvergence} {
				if errors.Is(err, s) {
					return
				}
			}
			t.Fatalf("error %v wraps no root sentinel", err)
		}
		if len(lines) != 1 {
			t.Fatalf("%d lines, want 1", len(lines))
		}
		l := lines[0]
		for _, v := range []float64{l.Shift, l.ShiftErr, l.Overlap, l.Overlap2, l.OverlapErr} {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				t.Fatalf("non-finite value in %+v", l)
			}
		}
		if l.Overlap2 > 1+1e-9 {
			t.Fatalf("overlap² %v above 1 (Cauchy–Schwarz)", l.Overlap2)
		}
	})
}

// sweepFields returns n fields evenly spaced over 0–200 kV/cm.
func sweepFields(n int) []float64 {
	fields := make([]float64, n)
	for i := range fields {
		fields[i] = tiltwell.KVPerCM(200 * float64(i) / float64(n-1))
	}
	return fields
}

// BenchmarkSweep times a sweep of e1–hh1 and e1–hh2 for the demo pair with
// exact.Solver (part=sweep), against the level solves alone that it needs
// (part=levels: electron level 1 at f_e and hole levels 1–2 at −f_h at each
// field, one goroutine). Both report ns/field; run with -cpu 1,2 for the
// parallel speed-up. allocs/op at fields=21 and fields=201 show the
// allocations per field.
func BenchmarkSweep(b *testing.B) {
	ts := []tiltwell.Transition{{E: 1, H: 1}, {E: 1, H: 2}}
	we, wh, err := demoPair.Wells()
	if err != nil {
		b.Fatal(err)
	}
	for _, n := range []int{21, 201} {
		fields := sweepFields(n)
		b.Run(fmt.Sprintf("part=levels/fields=%d", n), func(b *testing.B) {
			le := make([]tiltwell.Level, 0, 1)
			lh := make([]tiltwell.Level, 0, 2)
			b.ReportAllocs()
			runs := 0
			for b.Loop() {
				for _, F := range fields {
					if le, err = (exact.Solver{}).Levels(le, we.Reduced(F), 1); err != nil {
						b.Fatal(err)
					}
					if lh, err = (exact.Solver{}).Levels(lh, -wh.Reduced(F), 2); err != nil {
						b.Fatal(err)
					}
				}
				runs++
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(runs*n), "ns/field")
		})
		b.Run(fmt.Sprintf("part=sweep/fields=%d", n), func(b *testing.B) {
			b.ReportAllocs()
			runs := 0
			for b.Loop() {
				if _, err := demoPair.Sweep(exact.Solver{}, nil, fields, ts); err != nil {
					b.Fatal(err)
				}
				runs++
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(runs*n), "ns/field")
		})
	}
}

// TestParseTransition: ParseTransition reads back what String writes, in
// the notation of the trade (common practice, no source), and refuses
// anything else with ErrLevel.
func TestParseTransition(t *testing.T) {
	t.Parallel()
	for _, tr := range []tiltwell.Transition{{E: 1, H: 1}, {E: 2, H: 3, Hole: tiltwell.LightHole}, {E: 12, H: 1}} {
		got, err := tiltwell.ParseTransition(tr.String())
		if err != nil || got != tr {
			t.Errorf("ParseTransition(%q) = %v, %v", tr.String(), got, err)
		}
	}
	if got, err := tiltwell.ParseTransition(" E1-LH2 "); err != nil || got != (tiltwell.Transition{E: 1, H: 2, Hole: tiltwell.LightHole}) {
		t.Errorf("ParseTransition(\" E1-LH2 \") = %v, %v", got, err)
	}
	for _, s := range []string{"", "e1", "e1-h1", "h1-e1", "e0-hh1", "e1-hh0", "e-hh1", "e1-hh", "e1-xx1", "e1-hh1x", "e99999-hh1", "e1-hh-1"} {
		if _, err := tiltwell.ParseTransition(s); !errors.Is(err, tiltwell.ErrLevel) {
			t.Errorf("ParseTransition(%q): %v, want ErrLevel", s, err)
		}
	}
}
