package tiltwell

import (
	"fmt"
	"math"
	"runtime"
	"sync"
	"sync/atomic"
)

// StackSolver returns a [WaveSolver] for the levels of one carrier's
// [Stack]. [NewDevice] calls it once for each carrier it needs; with the
// exact reference it is
//
//	func(s tiltwell.Stack) tiltwell.WaveSolver { return exact.Solver{Stack: s} }
//
// The solvers it returns must be safe for concurrent use, as every
// [Solver] in this module is.
type StackSolver func(Stack) WaveSolver

// WaveBuilder is a [WaveSolver] that builds the wavefunction of a level
// it has just computed from the level itself, in storage the caller
// reuses: without solving the level again and, in steady state, without
// allocating. [Device.Lines] uses it when a solver implements it;
// otherwise it calls Wavefunction at every field, which solves each level
// a second time.
type WaveBuilder interface {
	WaveSolver
	// BuildWave returns the wavefunction of level l at reduced field f,
	// where l is a level that Levels returned for the same f: the
	// function that Wavefunction(f, l.N) returns (to rounding), built
	// from l instead of solving the level again. It implements [Spread]
	// if Wavefunction's does.
	//
	// reuse is nil or a Wavefunction that BuildWave returned earlier and
	// that the caller no longer uses: BuildWave may build the result in
	// its storage, and then must not allocate. The result is safe for
	// concurrent use until it is passed to BuildWave again.
	//
	// Errors follow the rules of [Solver.Levels]; an l that is not a
	// level of the solver at f is an error wrapping [ErrLevel].
	BuildWave(reuse Wavefunction, f float64, l Level) (Wavefunction, error)
}

// Device is a [Structure] prepared for sweeps of its interband
// transitions over the applied field: its electron, heavy-hole and
// light-hole problems in their reduced units (see [Structure.Reduce]),
// a solver for each, the transitions asked for and their zero-field
// levels. Build one with [NewDevice] and call [Device.Lines] for as many
// fields as needed. A Device is immutable and safe for concurrent use.
//
// The model is the single-particle one of [Structure]: each band on its
// own (no band mixing, no strain, parabolic bands) and no exciton
// binding, so the transition energies lie a few meV above the absorption
// peaks a measurement shows.
type Device struct {
	r       Reduced
	ts      []Transition
	solvers [3]WaveSolver // by Carrier; nil for a hole band no transition names
	// builders holds the solvers that are WaveBuilders (nil otherwise).
	builders [3]WaveBuilder
	k        [3]int    // levels needed of each carrier
	need     [3][]bool // need[c][n−1]: some transition uses level n of c
	layers   [3][]Layer
	ifaces   []float64 // the interfaces, shared by every carrier's stack
	zero     [3][]Level
	pool     sync.Pool // of *deviceScratch
}

// DeviceLine is one interband transition of a [Device] at one field, in
// physical units.
type DeviceLine struct {
	// Field is the field F in V/m along +z of the [Structure].
	Field float64
	Transition
	// Energy is the transition energy in eV in the single-particle
	// picture: the well's band gap plus the electron level above the
	// conduction-band edge plus the hole level below the valence-band
	// edge (see [Reduced]),
	//
	//	Energy = Gap + η_e E₁(e) + η_h E₁(h).
	Energy float64
	// EnergyErr is the error of Energy in meV from the solvers' estimates
	// of the two levels, Err_e E₁(e) + Err_h E₁(h). It does not include
	// the uncertainty of the material parameters (band offsets are
	// uncertain by some tens of meV; from memory) or of the model.
	EnergyErr float64
	// Wavelength is the vacuum wavelength hc/Energy in nm (see
	// [Wavelength]).
	Wavelength float64
	// Shift is Energy minus its value at zero field, in meV: negative for
	// the red shift of the ground transition. It is formed from the
	// levels' shifts, η(F) − η(0), so that it keeps its digits at weak
	// fields.
	Shift float64
	// ShiftErr is the sum of the four levels' error estimates in Shift,
	// in meV.
	ShiftErr float64
	// Overlap is the electron–hole overlap, dimensionless:
	//
	//	Overlap = ∫ φ_e(ξ) φ_h(ξ) dξ
	//
	// over the whole line (both wavefunctions reach into the barriers),
	// in practice over the union of the two wavefunctions' supports (see
	// [Spread]): outside its support a bound state holds less than
	// 1e-16 of its weight, and beyond the downhill turning point, where
	// the support of a quasi-bound level (F ≠ 0) ends, the wavefunction
	// describes the escaped carrier rather than the level. Both
	// wavefunctions are positive at the first interface, so Overlap is
	// positive for e1–hh1 at zero field; Overlap2 does not depend on the
	// sign.
	Overlap float64
	// Overlap2 is Overlap², to which the strength of the absorption line
	// is proportional.
	Overlap2 float64
	// OverlapErr is the quadrature's estimate of its error in Overlap, at
	// most 1e-12 (see [Device.Lines]). It does not include the error of
	// the solvers' wavefunctions.
	OverlapErr float64
	// ElectronEscape and HoleEscape are the escape times τ = ħ/(Γ E₁) in
	// seconds of the electron and the hole from their levels, Γ the
	// level's escape width and E₁ the carrier's energy unit (see
	// [Well.EscapeTime]): +Inf for a level whose Γ is 0, a bound state at
	// zero field or a width below what the solver resolves (the exact
	// solver's 1e-300 E₁).
	ElectronEscape, HoleEscape float64
	// ElectronEscapeErr and HoleEscapeErr are the relative errors of the
	// escape times, GammaErr/Gamma of the levels (exactly |τ − τ_true|/τ_true
	// when GammaErr is the true error of Γ). They are 0 for a bound state
	// (Γ = GammaErr = 0) and +Inf when Γ = 0 but the solver puts a
	// nonzero estimate GammaErr on it: the escape time, reported +Inf, is
	// then unresolved and may be as short as ħ/(GammaErr E₁) (with the
	// exact solver, GammaErr = 1e-300 and that is beyond 1e280 s).
	ElectronEscapeErr, HoleEscapeErr float64
}

// NewDevice prepares the structure s for sweeps of the transitions ts over
// the field: it reduces s (see [Structure.Reduce]; s.Field is ignored,
// the fields come with each call of [Device.Lines]), asks solve for a
// solver of the electron's stack and of each hole band a transition names
// (HeavyHole for e1–hh1, LightHole for e1–lh1; a device may mix both),
// and solves the zero-field levels that the shifts are measured from.
//
// NewDevice returns an error naming the value for: a structure that
// Reduce refuses (a [*StructureError]); a nil solve, or a nil solver from
// it ([ErrNoSolver]); an empty transition list, a level below 1 or above
// [MaxLevelRequest], or a hole band other than HeavyHole and LightHole
// ([ErrLevel]); a level that the well does not confine at zero field (a
// [*ConfinedError], wrapping ErrLevel, from the solver); and any other
// error or panic ([ErrPanic]) of solve or the solvers.
func NewDevice(s Structure, solve StackSolver, ts []Transition) (d *Device, err error) {
	defer func() {
		if r := recover(); r != nil {
			d, err = nil, fmt.Errorf("tiltwell: device: a solver panicked: %v: %w", r, ErrPanic)
		}
	}()
	if solve == nil {
		return nil, fmt.Errorf("tiltwell: device: nil StackSolver: %w", ErrNoSolver)
	}
	if len(ts) == 0 {
		return nil, fmt.Errorf("tiltwell: device: no transitions given: %w", ErrLevel)
	}
	d = &Device{ts: append([]Transition(nil), ts...)}
	for _, t := range ts {
		if t.E < 1 || t.H < 1 || t.E > MaxLevelRequest || t.H > MaxLevelRequest {
			return nil, fmt.Errorf("tiltwell: device: transition %v: levels run from 1 to %d: %w", t, MaxLevelRequest, ErrLevel)
		}
		if t.Hole != HeavyHole && t.Hole != LightHole {
			return nil, fmt.Errorf("tiltwell: device: transition %v: unknown hole band: %w", t, ErrLevel)
		}
		d.k[Electron] = max(d.k[Electron], t.E)
		d.k[t.Hole] = max(d.k[t.Hole], t.H)
	}
	s.Field = 0
	if d.r, err = s.Reduce(); err != nil {
		return nil, err
	}
	for c := range d.k {
		if d.k[c] > 0 {
			d.need[c] = make([]bool, d.k[c])
		}
	}
	for _, t := range ts {
		d.need[Electron][t.E-1] = true
		d.need[t.Hole][t.H-1] = true
	}
	d.ifaces = d.r.Carriers[Electron].Stack.Interfaces(nil)
	for _, c := range [...]Carrier{Electron, HeavyHole, LightHole} {
		if d.k[c] == 0 {
			continue
		}
		cw := &d.r.Carriers[c]
		sv := solve(cw.Stack)
		if sv == nil || isNil(sv) {
			return nil, fmt.Errorf("tiltwell: device: the StackSolver returned a nil solver for the %s: %w", c.name(), ErrNoSolver)
		}
		d.solvers[c] = sv
		d.builders[c], _ = sv.(WaveBuilder)
		d.layers[c] = cw.Stack.Layers(nil)
		lv, err := sv.Levels(nil, 0, d.k[c])
		if err == nil {
			err = checkLevels(lv, d.k[c])
		}
		if err != nil {
			return nil, d.levelError(c, 0, 0, err)
		}
		d.zero[c] = lv
	}
	d.pool.New = func() any { return new(deviceScratch) }
	return d, nil
}

// Reduced returns the reduced problems of the device's structure at zero
// field (see [Structure.Reduce]).
func (d *Device) Reduced() Reduced { return d.r }

// Transitions returns a copy of the transitions the device computes, in
// the order of the lines of [Device.Lines].
func (d *Device) Transitions() []Transition { return append([]Transition(nil), d.ts...) }

// name returns the carrier's name for messages.
func (c Carrier) name() string {
	switch c {
	case Electron:
		return "electron"
	case HeavyHole:
		return "heavy hole"
	case LightHole:
		return "light hole"
	}
	return c.String()
}

// levelError describes a failure of carrier c's Levels at the field F
// (V/m; reduced f): which level is not confined, if that is the cause.
func (d *Device) levelError(c Carrier, F, f float64, err error) error {
	where := fmt.Sprintf("at %g kV/cm (reduced field %g)", InKVPerCM(F), f)
	if F == 0 {
		where = "at zero field"
	}
	if n, ok := Confined(err); ok {
		return fmt.Errorf("tiltwell: device: %s: the %s's level %d is not confined, and %v needs it: %w",
			where, c.name(), n+1, d.user(c, n+1), err)
	}
	return fmt.Errorf("tiltwell: device: %s: %s levels: %w", where, c.name(), err)
}

// user returns the first transition that needs level n of carrier c, for
// messages.
func (d *Device) user(c Carrier, n int) Transition {
	for _, t := range d.ts {
		if (c == Electron && t.E >= n) || (c == t.Hole && t.H >= n) {
			return t
		}
	}
	return d.ts[0]
}

// Overlap quadrature of a Device. The wavefunctions of a layered well
// have a kink at every interface (φ′/μ is continuous, φ′ is not), so the
// overlap integrand is smooth only within a layer: it is integrated layer
// by layer over the union [lo, hi] of the two wavefunctions' supports, with
// the Gauss–Legendre ladder and error estimate of [Pair.Sweep] on each
// piece. In an outer layer the integrand decays away from the interface
// roughly as e^(−κd), κ = κ_e + κ_h the sum of the two carriers' decay
// constants π√(μ(v + f(ξ − ½) − η)) at the interface (in units of 1/L).
// A tail of length D whose κD exceeds tailDecay is split into pieces of
// lengths D/2^s, D/2^s, D/2^(s−1), …, D/2 from the interface outwards,
// the first holding about tailDecay e-foldings: Gauss–Legendre
// converges fast on an exponential once N exceeds about κℓ/4 (the bound
// below), so long pieces cost fewer nodes than many short ones, and the
// split keeps each piece's estimate in its own scale.
//
// The first order tried on a piece of length ℓ is the one whose error
// bound (eω/4N)^(2N) (see orders) is below e^(−startTarget + δ), with
// ω = (ℓ/2)(k_e + k_h), k the largest local wavenumber or decay
// constant π√(μ|v + f(ξ − ½) − η|) of each carrier at the piece's ends,
// and δ the least decay from the interface to the piece's near end
// (δ = 0 in inner layers). Over 0–200 kV/cm that first try was accepted
// at every piece of the demo GaAs well, 99.7% of the demo InGaAs well's
// and 95% of the stepped well's of the tests, for e1–hh1, e1–hh2 and
// e1–lh1, at 80–110 nodes per wavefunction and transition in all. Each
// piece must reach an estimate within 1e-12 divided by the transition's
// number of pieces; OverlapErr is the sum of the pieces' estimates.
const (
	maxTailSplits = 12
	// tailDecay is κℓ of the first piece of a tail.
	tailDecay = 32
	// startTarget is −ln of the error bound the first rule tried must
	// reach, relative to the integrand's size: e^(−40) ≈ 4e-18.
	startTarget = 40
	// negligible: a piece where the integrand stays below this fraction
	// of the piece's tolerance at every node counts with ℓ·max|g| as its
	// error, even when its Legendre coefficients are rounding noise that
	// does not decay (an integrand underflowing in a far tail).
	negligible = 1e-3
)

// piece is one stretch of a layer that the overlap integrates over.
type piece struct {
	a, b  float64
	start int // index in orders of the first rule to try
}

// deviceScratch is one worker's reusable storage.
type deviceScratch struct {
	lv     [3][]Level
	waves  [3][]Wavefunction
	sup    [3][][2]float64 // the wavefunctions' supports
	vals   [3][][]float64  // the wavefunctions at the current nodes
	want   [3][]bool       // which wavefunctions the current piece needs
	xs     []float64
	tmp    []piece // one transition's pieces
	pieces []piece // every transition's pieces, each once
	mask   []uint64
	count  []int     // per transition: its number of pieces
	q, est []float64 // per transition: the sums over the pieces
	pq, pe []float64 // per transition: the current piece
}

// Lines computes the transitions of the device at each field (V/m) in
// fields and appends them to dst[:0]: len(fields)·len(ts) lines in field
// order, and within one field in the order of the transitions given to
// [NewDevice]. If dst is nil, a new slice is allocated and returned. For a
// p-i-n diode, get the fields from the biases with [DiodeField].
//
// Each carrier is solved at its own reduced field (see [CarrierWell]),
// the holes at −F/F₀(h), energies and wavefunctions alike. The fields are
// computed in parallel, on at most runtime.GOMAXPROCS(0) goroutines; the
// result does not depend on their number or timing. A solver that is a
// [WaveBuilder] (exact.Solver is) builds each wavefunction from the level
// just solved, in the worker's reused storage; otherwise Lines calls
// Wavefunction at every field. With capacity in dst, Lines allocates
// nothing per field in steady state beyond what the solvers' Levels and
// Wavefunction allocate, and at most once per call (TestDeviceAllocs);
// exact.Solver allocates nothing (TestDeviceExactBuilder).
//
// Cost, with the exact solver on one core (BenchmarkDeviceLines: e1–hh1
// and e1–lh1 of [DemoGaAsWell] at 10⁴ fields from 0 to 150 kV/cm; CPU
// time on a shared machine): 36 µs per field, 0.36 s for the 10⁴ fields
// (1.5 s when Lines called Wavefunction), 3 times the three level solves
// alone (12 µs per field). Building the three wavefunctions from the
// levels takes 7 µs of it; the overlap quadrature, about 330 wavefunction
// evaluations per field at 35–50 ns each, most of the rest.
//
// Lines returns an error, and no lines, for a field that is NaN or
// infinite or so large that a carrier's reduced field overflows
// ([ErrField]). When a field fails, Lines returns the lines of the fields
// before it in the list, which are complete, together with the error of
// the first failing field: a level that is not confined there (the error
// names the carrier, the level and the field, and wraps the solver's
// [*ConfinedError]), any other error of a solver, a NaN or infinite result
// ([ErrNoConvergence]), a transition energy that is not positive
// ([ErrOutOfRange]), an overlap whose quadrature does not settle
// ([ErrNoConvergence]), or a panic in a solver or its wavefunctions
// ([ErrPanic]).
//
// Special cases are:
//
//	F = 0: Shift = 0; escape times +Inf
//	F < 0: for a mirror-symmetric structure, the same lines as for |F|
//	       (Overlap may change sign)
func (d *Device) Lines(dst []DeviceLine, fields []float64) ([]DeviceLine, error) {
	dst = dst[:0]
	for _, F := range fields {
		if math.IsNaN(F) || math.IsInf(F, 0) {
			return dst, fmt.Errorf("tiltwell: device: field %v V/m: %w", F, ErrField)
		}
		for c := range d.k {
			if d.k[c] > 0 && math.IsInf(d.r.Carriers[c].Well.Reduced(F), 0) {
				return dst, fmt.Errorf("tiltwell: device: field %g V/m: the %s's reduced field overflows: %w", F, Carrier(c).name(), ErrField)
			}
		}
	}
	nt := len(d.ts)
	lines := resize(dst, len(fields)*nt)
	if len(fields) == 0 {
		return lines, nil
	}
	workers := min(runtime.GOMAXPROCS(0), len(fields))
	if workers == 1 {
		sc := d.pool.Get().(*deviceScratch)
		defer d.pool.Put(sc)
		for i, F := range fields {
			if err := d.safeField(lines[i*nt:(i+1)*nt], F, sc); err != nil {
				return lines[:i*nt], err
			}
		}
		return lines, nil
	}
	// Workers take fields in increasing index order; after a failure at
	// field i no worker starts a field beyond i, and every field before i
	// has been handed out and is finished by the time the workers are
	// done, so the first failure in field order is always found.
	var next atomic.Int64
	var stop atomic.Int64
	stop.Store(int64(len(fields)))
	var mu sync.Mutex
	firstErr, firstAt := error(nil), len(fields)
	var wg sync.WaitGroup
	for range workers {
		wg.Go(func() {
			sc := d.pool.Get().(*deviceScratch)
			defer d.pool.Put(sc)
			for {
				i := next.Add(1) - 1
				if i >= int64(len(fields)) || i > stop.Load() {
					return
				}
				if err := d.safeField(lines[int(i)*nt:int(i+1)*nt], fields[i], sc); err != nil {
					mu.Lock()
					if int(i) < firstAt {
						firstErr, firstAt = err, int(i)
					}
					mu.Unlock()
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
	if firstErr != nil {
		return lines[:firstAt*nt], firstErr
	}
	return lines, nil
}

// safeField is field with a panic in a solver turned into an error.
func (d *Device) safeField(out []DeviceLine, F float64, sc *deviceScratch) (err error) {
	defer func() {
		if r := recover(); r != nil {
			err = fmt.Errorf("tiltwell: device: at %g kV/cm: a solver or its wavefunction panicked: %v: %w", InKVPerCM(F), r, ErrPanic)
		}
	}()
	return d.field(out, F, sc)
}

// field fills out, one line per transition, at the field F (V/m).
func (d *Device) field(out []DeviceLine, F float64, sc *deviceScratch) error {
	var f [3]float64
	for _, c := range [...]Carrier{Electron, HeavyHole, LightHole} {
		if d.k[c] == 0 {
			continue
		}
		cw := &d.r.Carriers[c]
		f[c] = cw.Well.Reduced(F)
		if c != Electron {
			f[c] = -f[c]
		}
		var err error
		if sc.lv[c], err = d.solvers[c].Levels(sc.lv[c], f[c], d.k[c]); err == nil {
			err = checkLevels(sc.lv[c], d.k[c])
		}
		if err != nil {
			return d.levelError(c, F, f[c], err)
		}
		sc.waves[c] = resize(sc.waves[c], d.k[c])
		sc.sup[c] = resize(sc.sup[c], d.k[c])
		sc.vals[c] = resize(sc.vals[c], d.k[c])
		sc.want[c] = resize(sc.want[c], d.k[c])
		for n, ok := range d.need[c] {
			if !ok {
				continue
			}
			var w Wavefunction
			if b := d.builders[c]; b != nil {
				w, err = b.BuildWave(sc.waves[c][n], f[c], sc.lv[c][n])
			} else {
				w, err = d.solvers[c].Wavefunction(f[c], n+1)
			}
			if err == nil && (w == nil || isNil(w)) {
				err = fmt.Errorf("nil wavefunction: %w", ErrNoSolver)
			}
			if err != nil {
				return fmt.Errorf("tiltwell: device: at %g kV/cm (reduced field %g): %s level %d wavefunction: %w", InKVPerCM(F), f[c], c.name(), n+1, err)
			}
			l, h := Support(w)
			if !(l < h) || math.IsInf(l, 0) || math.IsInf(h, 0) {
				return fmt.Errorf("tiltwell: device: at %g kV/cm: %s level %d wavefunction's support [%v, %v] is not a finite interval: %w", InKVPerCM(F), c.name(), n+1, l, h, ErrNoConvergence)
			}
			sc.waves[c][n], sc.sup[c][n] = w, [2]float64{l, h}
		}
	}
	// Each transition is integrated over the union of its two
	// wavefunctions' supports; pieces that several transitions share are
	// sampled once.
	nt := len(d.ts)
	words := (nt + 63) / 64
	sc.pieces, sc.mask = sc.pieces[:0], sc.mask[:0]
	sc.count = resize(sc.count, nt)
	for j, t := range d.ts {
		se, sh := sc.sup[Electron][t.E-1], sc.sup[t.Hole][t.H-1]
		sc.tmp = d.split(sc.tmp[:0], min(se[0], sh[0]), max(se[1], sh[1]), &f, sc)
		sc.count[j] = len(sc.tmp)
		for _, p := range sc.tmp {
			i := 0
			for i < len(sc.pieces) && sc.pieces[i] != p {
				i++
			}
			if i == len(sc.pieces) {
				sc.pieces = append(sc.pieces, p)
				for range words {
					sc.mask = append(sc.mask, 0)
				}
			}
			sc.mask[i*words+j/64] |= 1 << (j % 64)
		}
	}
	sc.q, sc.est = resize(sc.q, nt), resize(sc.est, nt)
	sc.pq, sc.pe = resize(sc.pq, nt), resize(sc.pe, nt)
	clear(sc.q)
	clear(sc.est)
	for i, p := range sc.pieces {
		if err := d.integratePiece(p, sc.mask[i*words:(i+1)*words], sc); err != nil {
			return fmt.Errorf("tiltwell: device: at %g kV/cm: %w", InKVPerCM(F), err)
		}
	}
	ce := &d.r.Carriers[Electron]
	for j, t := range d.ts {
		ch := &d.r.Carriers[t.Hole]
		le, lh := sc.lv[Electron][t.E-1], sc.lv[t.Hole][t.H-1]
		e0, h0 := d.zero[Electron][t.E-1], d.zero[t.Hole][t.H-1]
		l := DeviceLine{
			Field:      F,
			Transition: t,
			Energy:     d.r.Gap + le.Energy*ce.E1 + lh.Energy*ch.E1,
			EnergyErr:  1e3 * (le.Err*ce.E1 + lh.Err*ch.E1),
			Shift:      1e3 * ((le.Energy-e0.Energy)*ce.E1 + (lh.Energy-h0.Energy)*ch.E1),
			ShiftErr:   1e3 * ((le.Err+e0.Err)*ce.E1 + (lh.Err+h0.Err)*ch.E1),
			Overlap:    sc.q[j],
			Overlap2:   sc.q[j] * sc.q[j],
			OverlapErr: sc.est[j],
		}
		l.ElectronEscape, l.ElectronEscapeErr = escape(ce.Well, le)
		l.HoleEscape, l.HoleEscapeErr = escape(ch.Well, lh)
		for _, v := range [...]float64{l.Energy, l.EnergyErr, l.Shift, l.ShiftErr} {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return fmt.Errorf("tiltwell: device: %v at %g kV/cm: energy %v eV ± %v meV, shift %v ± %v meV: not finite: %w",
					t, InKVPerCM(F), l.Energy, l.EnergyErr, l.Shift, l.ShiftErr, ErrNoConvergence)
			}
		}
		if !(l.Energy > 0) {
			return fmt.Errorf("tiltwell: device: %v at %g kV/cm: transition energy %g eV is not positive: the field is beyond the model: %w",
				t, InKVPerCM(F), l.Energy, ErrOutOfRange)
		}
		l.Wavelength = Wavelength(l.Energy)
		out[j] = l
	}
	return nil
}

// escape returns the escape time in seconds of level l of a carrier in
// the well w, and its relative error (see [DeviceLine]).
func escape(w Well, l Level) (tau, rel float64) {
	tau = w.EscapeTime(l.Gamma)
	switch {
	case l.Gamma > 0:
		rel = l.GammaErr / l.Gamma
	case l.GammaErr > 0:
		rel = math.Inf(1)
	}
	return tau, rel
}

// kRange returns, over the wavefunctions of carrier c at reduced field f
// (levels from sc), the largest |local wavenumber| π√(μ|v + f(ξ − ½) − η|)
// at ξ = a or b in layer j, and the smallest decay constant
// π√(μ max(v + f(ξ − ½) − η, 0)) at those points.
func (d *Device) kRange(c int, j int, f, a, b float64, sc *deviceScratch) (kmax, kmin float64) {
	ly := d.layers[c][j]
	kmin = math.Inf(1)
	for n, ok := range d.need[c] {
		if !ok {
			continue
		}
		eta := sc.lv[c][n].Energy
		for _, x := range [2]float64{a, b} {
			q := ly.Edge + f*(x-0.5) - eta
			kmax = max(kmax, math.Pi*math.Sqrt(ly.Mass*math.Abs(q)))
			kmin = min(kmin, math.Pi*math.Sqrt(ly.Mass*max(q, 0)))
		}
	}
	return kmax, kmin
}

// pairK returns the electron's and the worse hole band's kRange summed:
// the rates of the product φ_e φ_h.
func (d *Device) pairK(j int, f *[3]float64, a, b float64, sc *deviceScratch) (kmax, kmin float64) {
	emax, emin := d.kRange(int(Electron), j, f[Electron], a, b, sc)
	hmax, hmin := 0.0, math.Inf(1)
	for _, c := range [...]Carrier{HeavyHole, LightHole} {
		if d.k[c] > 0 {
			x, n := d.kRange(int(c), j, f[c], a, b, sc)
			hmax, hmin = max(hmax, x), min(hmin, n)
		}
	}
	return emax + hmax, emin + hmin
}

// split appends to dst the stretches of [lo, hi] to integrate over: the
// inner layers whole, the outer ones in geometrically growing pieces.
func (d *Device) split(dst []piece, lo, hi float64, f *[3]float64, sc *deviceScratch) []piece {
	m := len(d.ifaces) // layers 0..m
	for j := 0; j <= m; j++ {
		a, b := lo, hi
		if j > 0 {
			a = max(a, d.ifaces[j-1])
		}
		if j < m {
			b = min(b, d.ifaces[j])
		}
		if !(b > a) {
			continue
		}
		if j > 0 && j < m {
			kmax, _ := d.pairK(j, f, a, b, sc)
			dst = append(dst, piece{a: a, b: b, start: startOrder((b-a)/2*kmax, startTarget)})
			continue
		}
		// An outer layer: x0 is its interface, the pieces grow away from
		// it towards the end of the support.
		x0, dir := b, -1.0
		if j == m {
			x0, dir = a, 1
		}
		D := b - a
		_, k0 := d.pairK(j, f, x0, x0, sc)
		splits := 0
		if r := D * k0 / tailDecay; r > 1 {
			splits = min(int(math.Ceil(math.Log2(r))), maxTailSplits)
		}
		// Boundaries at distances D/2^splits, D/2^(splits−1), …, D.
		near := 0.0
		for s := splits; s >= 0; s-- {
			far := D / float64(int(1)<<s)
			if s == 0 {
				far = D
			}
			pa, pb := x0+dir*near, x0+dir*far
			if pa > pb {
				pa, pb = pb, pa
			}
			kmax, _ := d.pairK(j, f, pa, pb, sc)
			_, kmin := d.pairK(j, f, x0, x0+dir*near, sc)
			dst = append(dst, piece{a: pa, b: pb, start: startOrder((pb-pa)/2*kmax, startTarget-near*kmin)})
			near = far
		}
	}
	return dst
}

// startOrder returns the index in orders of the first Gauss–Legendre rule
// to try for an integrand that behaves like e^(iωt) on t ∈ [−1, 1]: the
// first N whose error bound (eω/4N)^(2N) (see orders) is below e^(−need).
func startOrder(omega, need float64) int {
	eo := math.E * omega
	for i, n := range orders {
		if need <= 0 {
			return i
		}
		q := 4 * float64(n) / eo
		// ln q ≤ (q − 1)/√q for q ≥ 1: orders that fail this bound
		// (with a margin for its rounding) fail the test, and need no
		// logarithm.
		if !(q > 1) || 2*float64(n)*(q-1)/math.Sqrt(q) < need*(1-1e-9) {
			continue
		}
		if 2*float64(n)*math.Log(q) >= need {
			return i
		}
	}
	return len(orders) - 1
}

// integratePiece adds the integral over the piece p, and its error
// estimate, to sc.q and sc.est of each transition in the bit set users,
// raising the order of the rule from p.start until every estimate is
// within overlapTol divided by the transition's number of pieces.
func (d *Device) integratePiece(p piece, users []uint64, sc *deviceScratch) error {
	uses := func(j int) bool { return users[j/64]&(1<<(j%64)) != 0 }
	for c := range sc.want {
		clear(sc.want[c])
	}
	for j, t := range d.ts {
		if uses(j) {
			sc.want[Electron][t.E-1] = true
			sc.want[t.Hole][t.H-1] = true
		}
	}
	width := p.b - p.a
	for o := p.start; o < len(orders); o++ {
		r := rules[o]()
		sc.xs = resize(sc.xs, len(r.x))
		for i, x := range r.x {
			sc.xs[i] = p.a + width*x
		}
		for c := range sc.want {
			for n, ok := range sc.want[c] {
				if !ok {
					continue
				}
				v := resize(sc.vals[c][n], len(sc.xs))
				w := sc.waves[c][n]
				for i, x := range sc.xs {
					v[i] = w.At(x)
					if math.IsNaN(v[i]) || math.IsInf(v[i], 0) {
						return fmt.Errorf("%s level %d wavefunction is %v at ξ = %g: %w", Carrier(c).name(), n+1, v[i], x, ErrNoConvergence)
					}
				}
				sc.vals[c][n] = v
			}
		}
		settled := true
		for j, t := range d.ts {
			if !uses(j) {
				continue
			}
			tol := overlapTol / float64(sc.count[j])
			ve, vh := sc.vals[Electron][t.E-1], sc.vals[t.Hole][t.H-1]
			q, est := integrate(r, ve, vh)
			if !(est*width <= tol) {
				// A far tail where the integrand is negligible but its
				// Legendre coefficients are rounding noise.
				if m := maxProduct(ve, vh); m*width <= negligible*tol {
					est = m
				} else {
					settled = false
					break
				}
			}
			sc.pq[j], sc.pe[j] = q*width, est*width
		}
		if !settled {
			continue
		}
		for j := range d.ts {
			if uses(j) {
				sc.q[j] += sc.pq[j]
				sc.est[j] += sc.pe[j]
			}
		}
		return nil
	}
	return fmt.Errorf("overlap quadrature on [%g, %g] did not settle by order %d: %w", p.a, p.b, maxOrder, ErrNoConvergence)
}

// maxProduct returns max |a_i b_i|.
func maxProduct(a, b []float64) float64 {
	m := 0.0
	for i, x := range a {
		m = max(m, math.Abs(x*b[i]))
	}
	return m
}
