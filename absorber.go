package tiltwell

import (
	"fmt"
	"math"
	"runtime"
	"slices"
	"sync"
)

// ExcitonLine is one interband transition at one field with its 1s
// exciton: the single-particle line of a [Device] and the binding energy,
// the in-plane density and the escape width that the absorption spectrum
// needs (see [Absorption]). [Excitons.At] computes it for a [Structure];
// for a spectrum from other sources, fill in the fields
// [Absorption.Spectrum] reads: Transition.Hole, Energy, Overlap2,
// Binding, Density, Reduced, Width and Slope.
type ExcitonLine struct {
	DeviceLine
	// Binding is the exciton binding energy E_B in meV from the
	// two-parameter variational trial function ([ExcitonBinding].Energy):
	// the exciton line lies at Energy − Binding/1000 eV. 0 means no
	// exciton.
	Binding float64
	// BindingErr is the estimate of the error of Binding in meV
	// ([ExcitonBinding].Err).
	BindingErr float64
	// Density is the in-plane density of the relative motion at zero
	// electron–hole separation, |φ_1s(0)|², in nm⁻²
	// ([ExcitonBinding].Density): the exciton line's strength is
	// proportional to Overlap2 × Density.
	Density float64
	// Radius is the exciton's in-plane radius λ in nm
	// ([ExcitonBinding].Radius).
	Radius float64
	// Peak is the exciton line's energy Energy − Binding/1000 in eV.
	Peak float64
	// Reduced is the in-plane reduced mass μ = m_e m_h∥/(m_e + m_h∥) of
	// the electron and the hole in m₀, from the well material: it sets the
	// continuum's joint density of states and the exciton's kinetic
	// energy.
	Reduced float64
	// Width is the escape width Γ_e + Γ_h in meV, the FWHM of the
	// Lorentzian broadening that the field gives the line through the
	// escape of either carrier from the well: ħ/τ_e + ħ/τ_h, 0 for bound
	// states.
	Width float64
	// Slope is ∂Energy/∂L, the change of the transition energy with the
	// well width at the same field, in meV/nm: with a spread of well
	// widths it sets the line's inhomogeneous width (see
	// [Absorption].WidthSpread). It is formed by a central difference
	// over ±0.1% of the width; the exciton binding's change with the
	// width is left out.
	Slope float64
}

// Excitons is a [Device] whose lines carry their excitons: for each
// transition at each field, the single-particle line and the variational
// binding energy and in-plane density of its 1s exciton ([Exciton]),
// ready for [Absorption.Spectrum]. Build one with [NewExcitons]; it is
// immutable and safe for concurrent use.
//
// The exciton of each transition uses the electron's and the hole's
// wavefunctions at the field (the hole's in the mirrored tilt), the
// in-plane reduced mass of the electron and the hole band's in-plane
// mass ([Material.HeavyHoleMassInPlane], [Material.LightHoleMassInPlane])
// and the static permittivity of the well material; the reduced mass
// along the growth axis is that of the carriers' masses in the well. Its
// limits are those of [Exciton.Binding]: one dielectric constant
// everywhere, no band mixing, and under a field with finite barriers a
// binding energy that is an estimate, not a bound.
type Excitons struct {
	d       *Device
	solvers [3]WaveSolver
	x       [3]Exciton // by hole band
	kane    float64
	width   float64
	need    [3][]bool // need[c][n−1]: some transition uses level n of c
	// The structure with the well widened and narrowed by slopeStep, for
	// Slope: the reduced problems and a solver per carrier.
	side  [2]Reduced
	sides [2][3]WaveSolver
	k     [3]int // levels needed of each carrier
}

// slopeStep is the relative change of the well width in the central
// difference of [ExcitonLine].Slope: the difference's error, of order
// (δL)² ∂³E/∂L³/6, is then about 1e-6 of the slope, and the rounding of
// the energies (1e-13 eV) contributes 1e-9 meV/nm.
const slopeStep = 1e-3

// NewExcitons prepares the structure s for the excitons of the
// transitions ts, with the solvers from solve: it builds the [Device] of
// s (see [NewDevice]; s.Field is ignored) and asks solve once more for a
// solver of each carrier, for the wavefunctions the excitons need. It
// returns the errors of NewDevice: a structure [Structure.Reduce]
// refuses, a nil solver, a bad transition, or a level the well does not
// confine at zero field.
func NewExcitons(s Structure, solve StackSolver, ts []Transition) (x *Excitons, err error) {
	defer func() {
		if r := recover(); r != nil {
			x, err = nil, fmt.Errorf("tiltwell: excitons: a solver panicked: %v: %w", r, ErrPanic)
		}
	}()
	d, err := NewDevice(s, solve, ts)
	if err != nil {
		return nil, err
	}
	r := d.Reduced()
	wm := s.Slabs[s.Well].Material
	x = &Excitons{d: d, kane: wm.Kane, width: r.Carriers[Electron].Well.Width}
	ce := r.Carriers[Electron]
	ifaces := ce.Stack.Interfaces(nil)
	for _, t := range ts {
		for _, c := range [...]Carrier{Electron, t.Hole} {
			if x.solvers[c] == nil {
				x.solvers[c] = solve(r.Carriers[c].Stack)
				if x.solvers[c] == nil || isNil(x.solvers[c]) {
					return nil, fmt.Errorf("tiltwell: excitons: the StackSolver returned a nil solver for the %s: %w", c.name(), ErrNoSolver)
				}
			}
			n := t.E
			if c != Electron {
				n = t.H
			}
			for len(x.need[c]) < n {
				x.need[c] = append(x.need[c], false)
			}
			x.need[c][n-1] = true
			x.k[c] = max(x.k[c], n)
		}
		me, mz := wm.ElectronMass, r.Carriers[t.Hole].Well.Mass
		mp := wm.HeavyHoleMassInPlane()
		if t.Hole == LightHole {
			mp = wm.LightHoleMassInPlane()
		}
		x.x[t.Hole] = Exciton{
			Width:      ce.Well.Width,
			Reduced:    me * mp / (me + mp),
			Normal:     ce.Well.Mass * mz / (ce.Well.Mass + mz),
			Dielectric: wm.Permittivity,
			Interfaces: ifaces,
		}
	}
	for i, sign := range [...]float64{1, -1} {
		s2 := s
		s2.Field = 0
		s2.Slabs = append([]Slab(nil), s.Slabs...)
		s2.Slabs[s.Well].Thickness *= 1 + sign*slopeStep
		if x.side[i], err = s2.Reduce(); err != nil {
			return nil, fmt.Errorf("tiltwell: excitons: the well %+g%% wider: %w", sign*100*slopeStep, err)
		}
		for c, k := range x.k {
			if k == 0 {
				continue
			}
			x.sides[i][c] = solve(x.side[i].Carriers[c].Stack)
			if x.sides[i][c] == nil || isNil(x.sides[i][c]) {
				return nil, fmt.Errorf("tiltwell: excitons: the StackSolver returned a nil solver for the %s: %w", Carrier(c).name(), ErrNoSolver)
			}
		}
	}
	return x, nil
}

// slopes fills the Slope of each line at the field F from the
// transition energies of the widened and narrowed wells.
func (x *Excitons) slopes(lines []ExcitonLine, F float64) error {
	var e [2][]float64
	for i := range x.side {
		r := &x.side[i]
		var lv [3][]Level
		for c, k := range x.k {
			if k == 0 {
				continue
			}
			cw := &r.Carriers[c]
			f := cw.Well.Reduced(F)
			if Carrier(c) != Electron {
				f = -f
			}
			var err error
			if lv[c], err = x.sides[i][c].Levels(nil, f, k); err == nil {
				err = checkLevels(lv[c], k)
			}
			if err != nil {
				return fmt.Errorf("tiltwell: excitons: at %g kV/cm, the well %+g%% wider: %s levels: %w", InKVPerCM(F), (1-2*float64(i))*100*slopeStep, Carrier(c).name(), err)
			}
		}
		e[i] = make([]float64, len(lines))
		for j, l := range lines {
			e[i][j] = r.Gap + lv[Electron][l.E-1].Energy*r.Carriers[Electron].E1 + lv[l.Hole][l.H-1].Energy*r.Carriers[l.Hole].E1
		}
	}
	dl := 2 * slopeStep * x.width * 1e9 // nm
	for j := range lines {
		lines[j].Slope = (e[0][j] - e[1][j]) * 1e3 / dl
	}
	return nil
}

// Device returns the device whose lines the excitons extend.
func (x *Excitons) Device() *Device { return x.d }

// Exciton returns the exciton parameters used for transitions to the hole
// band c (HeavyHole or LightHole): width, reduced masses, dielectric
// constant and interfaces (a copy). For a band no transition names it
// returns the zero Exciton.
func (x *Excitons) Exciton(c Carrier) Exciton {
	if c != HeavyHole && c != LightHole {
		return Exciton{}
	}
	e := x.x[c]
	e.Interfaces = slices.Clone(e.Interfaces)
	return e
}

// At computes every transition at the field F (V/m): the [Device] line
// and the exciton's binding energy and density, with the well's width
// and Kane energy, as an [Absorber] for [Absorption.Spectrum]. The
// bindings of the transitions are computed in parallel, on at most
// runtime.GOMAXPROCS(0) goroutines; the result does not depend on their
// number.
//
// Cost: the bindings dominate. For the four transitions of
// BenchmarkAbsorption (e1–hh1, e1–lh1, e1–hh2 and e2–hh2 of
// [DemoGaAsWell]) At costs 15–20 ms at 0 and 100 kV/cm on one core of a
// shared machine, against 0.04–0.25 ms for the single-particle lines
// alone ([Device.Lines]).
//
// At returns the errors of [Device.Lines] (a field that is not finite, a
// level that is not confined at F, a solver's failure), and those of
// [Exciton.Binding] for the transition it names.
func (x *Excitons) At(F float64) (ab Absorber, err error) {
	defer func() {
		if r := recover(); r != nil {
			ab, err = Absorber{}, fmt.Errorf("tiltwell: excitons: at %g kV/cm: a solver or its wavefunction panicked: %v: %w", InKVPerCM(F), r, ErrPanic)
		}
	}()
	dl, err := x.d.Lines(nil, []float64{F})
	if err != nil {
		return Absorber{}, err
	}
	// The wavefunctions, each level once.
	r := x.d.Reduced()
	var waves [3][]Wavefunction
	for c, need := range x.need {
		if len(need) == 0 {
			continue
		}
		f := r.Carriers[c].Well.Reduced(F)
		if Carrier(c) != Electron {
			f = -f
		}
		waves[c] = make([]Wavefunction, len(need))
		for n, ok := range need {
			if !ok {
				continue
			}
			w, err := x.solvers[c].Wavefunction(f, n+1)
			if err == nil && (w == nil || isNil(w)) {
				err = fmt.Errorf("nil wavefunction: %w", ErrNoSolver)
			}
			if err != nil {
				return Absorber{}, fmt.Errorf("tiltwell: excitons: at %g kV/cm: %s level %d wavefunction: %w", InKVPerCM(F), Carrier(c).name(), n+1, err)
			}
			waves[c][n] = w
		}
	}
	lines := make([]ExcitonLine, len(dl))
	errs := make([]error, len(dl))
	work := func(j int) {
		defer func() {
			if r := recover(); r != nil {
				errs[j] = fmt.Errorf("tiltwell: excitons: %v at %g kV/cm: the exciton's wavefunctions panicked: %v: %w", dl[j].Transition, InKVPerCM(F), r, ErrPanic)
			}
		}()
		l := dl[j]
		ex := x.x[l.Hole]
		b, err := ex.Binding(waves[Electron][l.E-1], waves[l.Hole][l.H-1])
		if err != nil {
			errs[j] = fmt.Errorf("tiltwell: excitons: %v at %g kV/cm: %w", l.Transition, InKVPerCM(F), err)
			return
		}
		lines[j] = ExcitonLine{
			DeviceLine: l,
			Binding:    b.Energy,
			BindingErr: b.Err,
			Density:    b.Density,
			Radius:     b.Radius,
			Peak:       l.Energy - b.Energy/1e3,
			Reduced:    ex.Reduced,
			Width:      escapeWidth(l.ElectronEscape) + escapeWidth(l.HoleEscape),
		}
	}
	workers := min(runtime.GOMAXPROCS(0), len(dl))
	if workers <= 1 {
		for j := range dl {
			work(j)
		}
	} else {
		var wg sync.WaitGroup
		next := make(chan int, len(dl))
		for j := range dl {
			next <- j
		}
		close(next)
		for range workers {
			wg.Go(func() {
				for j := range next {
					work(j)
				}
			})
		}
		wg.Wait()
	}
	for _, err := range errs {
		if err != nil {
			return Absorber{}, err
		}
	}
	if err := x.slopes(lines, F); err != nil {
		return Absorber{}, err
	}
	return Absorber{Field: F, Width: x.width, Kane: x.kane, Lines: lines}, nil
}

// escapeWidth returns ħ/τ in meV for an escape time τ in seconds: the
// escape width Γ of a level as an energy (0 for τ = +Inf).
func escapeWidth(tau float64) float64 {
	if math.IsInf(tau, 1) {
		return 0
	}
	return ReducedPlanck / tau / ElementaryCharge * 1e3
}
