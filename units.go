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

// NewWell returns the Well of width (metres) and effective mass (units of the
// electron mass m₀). It returns an error wrapping [ErrUnits] if either is not
// a finite positive number, or if together they put E₁ or F₀ outside the
// float64 range. The width is in metres: a 10 nm well is 10e-9.
func NewWell(width, mass float64) (Well, error) {
	w := Well{Width: width, Mass: mass}
	if err := w.validate(); err != nil {
		return Well{}, err
	}
	return w, nil
}

func (w Well) validate() error {
	if !(w.Width > 0) || math.IsInf(w.Width, 0) {
		return fmt.Errorf("tiltwell: well width %v m: %w", w.Width, ErrUnits)
	}
	if !(w.Mass > 0) || math.IsInf(w.Mass, 0) {
		return fmt.Errorf("tiltwell: effective mass %v m₀: %w", w.Mass, ErrUnits)
	}
	// Widths and masses far outside any device (a width of 1e-200 m, say)
	// overflow or underflow the scales; refuse them rather than convert
	// every field to 0 or ∞.
	if e, f0 := w.EnergyUnit(), w.FieldUnit(); !(e > 0) || math.IsInf(e, 0) || !(f0 > 0) || math.IsInf(f0, 0) {
		return fmt.Errorf("tiltwell: width %v m and mass %v m₀ give E₁ = %v J, F₀ = %v V/m: %w", w.Width, w.Mass, e, f0, ErrUnits)
	}
	return nil
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

// KVPerCM converts a field in kV/cm, the unit device papers use, to V/m.
func KVPerCM(kv float64) float64 { return kv * 1e5 }

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
