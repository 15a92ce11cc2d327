package tiltwell

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/unit/constant"
)

// Physical constants, CODATA 2018 (E. Tiesinga, P. J. Mohr, D. B. Newell,
// B. N. Taylor, "CODATA recommended values of the fundamental physical
// constants: 2018", Rev. Mod. Phys. 93, 025010 (2021)).
const (
	// Planck is the Planck constant h in J s. The constant is exact.
	Planck = float64(constant.Planck)
	// ReducedPlanck is ħ = h/(2π) in J s. It is exact, being derived from
	// an exact constant.
	ReducedPlanck = Planck / (2 * math.Pi)
	// ElementaryCharge is e in C. The constant is exact.
	ElementaryCharge = float64(constant.ElementaryCharge)
	// LightSpeed is the speed of light in vacuum c in m/s. The constant
	// is exact.
	LightSpeed = float64(constant.LightSpeedInVacuum)
	// ElectronMass is the electron rest mass m₀ in kg, CODATA 2018
	// 9.1093837015(28)e-31 kg (relative standard uncertainty 3.0e-10).
	// gonum's unit/constant has no electron mass, so it is written here,
	// once.
	ElectronMass = 9.1093837015e-31
)

// Well is the physical scale of a well: its width and the effective mass of
// the particle in it. It converts between reduced and physical units.
//
// The zero value is not usable; construct a Well with [NewWell], which
// validates it. The conversion methods do not check their receiver: on a
// Well that NewWell would refuse they return 0, ±Inf or NaN.
type Well struct {
	// Width is the well width L in metres.
	Width float64
	// Mass is the effective mass m* in units of the electron mass m₀.
	Mass float64
}

// Plausible scales of a well: [NewWell] refuses widths and masses outside
// these ranges as typing mistakes. A monolayer of a III–V crystal is about
// 0.28 nm and quantum confinement fades beyond a few hundred nm; the
// band-edge effective masses of semiconductors lie between about 0.01 and
// a few electron masses (common practice, no source).
const (
	// MinWellWidth and MaxWellWidth bound the width, in metres: 0.1 nm
	// and 10 µm.
	MinWellWidth, MaxWellWidth = 0.1e-9, 10e-6
	// MinWellMass and MaxWellMass bound the effective mass, in units of
	// m₀.
	MinWellMass, MaxWellMass = 1e-3, 20
)

// NewWell returns the Well of width (metres) and effective mass (units of
// the electron mass m₀). The width is in metres: a 10 nm well is 10e-9.
//
// NewWell returns an error wrapping [ErrUnits] if either is not a finite
// positive number, if together they put E₁ or F₀ outside the normal
// float64 range (subnormal, zero or infinite), or if the width lies
// outside [MinWellWidth, MaxWellWidth] or the mass outside [MinWellMass, MaxWellMass].
// The error names the value and, where one is likely, the mistake: a
// width in nanometres (NewWell(10, …)), a mass in kilograms, the two
// arguments swapped.
func NewWell(width, mass float64) (Well, error) {
	w := Well{Width: width, Mass: mass}
	if err := w.validate(); err != nil {
		return Well{}, err
	}
	return w, nil
}

func (w Well) validate() error {
	if !(w.Width > 0) || math.IsInf(w.Width, 0) {
		return fmt.Errorf("tiltwell: well width %v m is not a finite positive number: %w", w.Width, ErrUnits)
	}
	if !(w.Mass > 0) || math.IsInf(w.Mass, 0) {
		return fmt.Errorf("tiltwell: effective mass %v m₀ is not a finite positive number: %w", w.Mass, ErrUnits)
	}
	widthOK := w.Width >= MinWellWidth && w.Width <= MaxWellWidth
	massOK := w.Mass >= MinWellMass && w.Mass <= MaxWellMass
	if !widthOK && !massOK && w.Mass >= MinWellWidth && w.Mass <= MaxWellWidth && w.Width >= MinWellMass && w.Width <= MaxWellMass {
		return fmt.Errorf("tiltwell: width %g m and mass %g m₀: swapped? NewWell takes the width (m) first, then the mass (m₀): %w", w.Width, w.Mass, ErrUnits)
	}
	if !widthOK {
		return fmt.Errorf("tiltwell: width %g m outside %g–%g m%s: %w", w.Width, float64(MinWellWidth), float64(MaxWellWidth), widthHint(w.Width), ErrUnits)
	}
	if !massOK {
		return fmt.Errorf("tiltwell: effective mass %g m₀ outside %g–%g m₀%s: %w", w.Mass, float64(MinWellMass), float64(MaxWellMass), massHint(w.Mass), ErrUnits)
	}
	// Within the plausible ranges the scales are normal numbers; the check
	// stays so that no change of the ranges can let a subnormal or
	// infinite scale through.
	if e, f0 := w.EnergyUnit(), w.FieldUnit(); !normal(e) || !normal(f0) {
		return fmt.Errorf("tiltwell: width %v m and mass %v m₀ give E₁ = %v J, F₀ = %v V/m: %w", w.Width, w.Mass, e, f0, ErrUnits)
	}
	return nil
}

// normal reports whether x is a positive normal float64.
func normal(x float64) bool {
	return x >= 0x1p-1022 && !math.IsInf(x, 0)
}

// widthHint guesses the unit a width outside the plausible range was
// written in.
func widthHint(width float64) string {
	for _, u := range []struct {
		name  string
		scale float64
		exp   string
	}{{"nm", 1e-9, "e-9"}, {"Å", 1e-10, "e-10"}, {"µm", 1e-6, "e-6"}} {
		if v := width * u.scale; v >= MinWellWidth && v <= MaxWellWidth {
			return fmt.Sprintf(": did you mean %g %s = %g%s?", width, u.name, width, u.exp)
		}
	}
	return ""
}

// massHint guesses the mistake behind a mass outside the plausible range.
func massHint(mass float64) string {
	if v := mass / ElectronMass; v >= MinWellMass && v <= MaxWellMass {
		return fmt.Sprintf(": in kilograms? the mass is in units of m₀, %.4g here", v)
	}
	if v := mass / 1000; mass > MaxWellMass && v >= MinWellMass && v <= MaxWellMass {
		return fmt.Sprintf(": did you mean %g m₀?", v)
	}
	return ""
}

// EnergyUnit returns E₁ = ħ²π²/(2 m* L²) in joules, the ground level of the
// well at zero field.
func (w Well) EnergyUnit() float64 {
	m := w.Mass * ElectronMass
	hl := ReducedPlanck * math.Pi / w.Width // ħπ/L
	return hl * hl / (2 * m)
}

// FieldUnit returns F₀ = E₁/(e L) in V/m, the field whose potential drop
// across the well equals E₁/e.
func (w Well) FieldUnit() float64 {
	return w.EnergyUnit() / (ElementaryCharge * w.Width)
}

// Reduced returns the reduced field f = F/F₀ for a field F in V/m.
func (w Well) Reduced(field float64) float64 { return field / w.FieldUnit() }

// Field returns the field F = f F₀ in V/m for a reduced field f.
func (w Well) Field(f float64) float64 { return f * w.FieldUnit() }

// Joules returns the energy η E₁ in joules for a reduced energy η.
func (w Well) Joules(eta float64) float64 { return eta * w.EnergyUnit() }

// MilliEV returns the energy η E₁ in meV for a reduced energy η.
func (w Well) MilliEV(eta float64) float64 {
	return eta * w.EnergyUnit() / ElementaryCharge * 1e3
}

// EV returns the energy η E₁ in eV for a reduced energy η.
func (w Well) EV(eta float64) float64 {
	return eta * w.EnergyUnit() / ElementaryCharge
}

// FromJoules returns the reduced energy η = E/E₁ of an energy E in
// joules.
func (w Well) FromJoules(e float64) float64 { return e / w.EnergyUnit() }

// FromMilliEV returns the reduced energy η = E/E₁ of an energy E in meV:
// a tolerance of 0.1 meV for [Choose] is w.FromMilliEV(0.1).
func (w Well) FromMilliEV(mev float64) float64 {
	return mev * 1e-3 * ElementaryCharge / w.EnergyUnit()
}

// FromEV returns the reduced energy η = E/E₁ of an energy E in eV.
func (w Well) FromEV(ev float64) float64 {
	return ev * ElementaryCharge / w.EnergyUnit()
}

// KVPerCM converts a field in kV/cm, the unit device papers use, to V/m.
func KVPerCM(kv float64) float64 { return kv * 1e5 }

// InKVPerCM converts a field in V/m to kV/cm.
func InKVPerCM(field float64) float64 { return field / 1e5 }

// VPerMicron converts a field in V/µm to V/m.
func VPerMicron(v float64) float64 { return v * 1e6 }

// InVPerMicron converts a field in V/m to V/µm.
func InVPerMicron(field float64) float64 { return field / 1e6 }

// hcOverE is hc/e in eV m, exact from the exact constants h, c and e
// (CODATA 2018): 1.239841984…e-6.
const hcOverE = Planck * LightSpeed / ElementaryCharge

// Wavelength returns the vacuum wavelength λ = hc/E in nm of a photon of
// energy E in eV: 1239.84198… nm for 1 eV. It returns +Inf for E = 0 and
// a negative wavelength for a negative energy.
func Wavelength(ev float64) float64 { return hcOverE * 1e9 / ev }

// PhotonEnergy returns the energy E = hc/λ in eV of a photon of vacuum
// wavelength λ in nm: 1.42 eV, the band gap of GaAs at room temperature,
// is about 873 nm.
func PhotonEnergy(nm float64) float64 { return hcOverE * 1e9 / nm }

// EscapeTime returns the escape time τ = ħ/(Γ E₁) in seconds of a level
// whose escape width is gamma = Γ in units of E₁ (see [Level.Gamma]): the
// lifetime of a carrier in the level before it tunnels out. A bound state,
// gamma = 0, never escapes: EscapeTime returns +Inf. For a negative or NaN
// gamma it returns NaN.
func (w Well) EscapeTime(gamma float64) float64 {
	if !(gamma >= 0) {
		return math.NaN()
	}
	// ħ/(Γ E₁) without forming Γ E₁, which underflows for the narrowest
	// resonances (Γ ≈ 1e-300).
	return ReducedPlanck / w.EnergyUnit() / gamma
}
