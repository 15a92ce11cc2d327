package tiltwell

import (
	"fmt"
	"math"
)

// dBPerNeper is 10/ln 10 = 10 log₁₀ e: a power ratio e^(−x) is 4.343 x dB.
const dBPerNeper = 4.342944819032518

// Modulator is the optical path of an electroabsorption modulator through
// its quantum wells: the light crosses Path metres of well material
// (weighted by the optical mode's overlap with it), so that at an
// absorption coefficient α of the wells the power transmission is
//
//	T = exp(−α Path) · 10^(−Loss/10).
//
// Build one with [Waveguide] or [SurfaceNormal], or fill in Path for
// another geometry. The figures of merit between two biases
// ([Modulator.Figures]) follow from the two spectra α₁, α₂ alone (for
// instance from [Absorption.Spectrum] at the fields of two biases, see
// [DiodeField]).
type Modulator struct {
	// Path is the effective length of well material the light crosses,
	// in metres: Γℓ for a waveguide of length ℓ whose mode has the
	// confinement factor Γ in all the wells together, N·L_w·p for light
	// crossing N wells of width L_w p times at normal incidence.
	Path float64
	// Loss is the insertion loss that does not depend on the bias, in dB
	// (coupling, propagation loss outside the wells' absorption,
	// reflections): 0 or positive.
	Loss float64
}

// Waveguide returns the [Modulator] of a waveguide of length (metres)
// whose optical mode has the confinement factor confinement ∈ (0, 1] in
// all the wells together (N wells of confinement Γ₁ each: NΓ₁):
// Path = confinement × length, the modal absorption being Γα (common
// practice, no source). It returns an error
// wrapping [ErrUnits] for a length that is not a finite positive number
// or a confinement factor outside (0, 1].
func Waveguide(length, confinement float64) (Modulator, error) {
	if !(length > 0) || math.IsInf(length, 0) {
		return Modulator{}, fmt.Errorf("tiltwell: waveguide: length %v m is not a finite positive number: %w", length, ErrUnits)
	}
	if !(confinement > 0 && confinement <= 1) {
		return Modulator{}, fmt.Errorf("tiltwell: waveguide: confinement factor %v outside (0, 1]: %w", confinement, ErrUnits)
	}
	return Modulator{Path: confinement * length}, nil
}

// SurfaceNormal returns the [Modulator] of light crossing wells quantum
// wells of width (metres) passes times at normal incidence (1 for a
// transmission device, 2 for a reflection device with a mirror behind the
// wells): Path = wells × width × passes. It returns an error wrapping
// [ErrUnits] for a well count or pass count below 1 or a width outside
// [MinWellWidth, MaxWellWidth].
func SurfaceNormal(wells int, width float64, passes int) (Modulator, error) {
	if wells < 1 || passes < 1 {
		return Modulator{}, fmt.Errorf("tiltwell: surface-normal modulator: %d wells, %d passes: need at least 1 of each: %w", wells, passes, ErrUnits)
	}
	if !(width >= MinWellWidth && width <= MaxWellWidth) {
		return Modulator{}, fmt.Errorf("tiltwell: surface-normal modulator: well width %v m outside [%g, %g] m: %w", width, float64(MinWellWidth), float64(MaxWellWidth), ErrUnits)
	}
	return Modulator{Path: float64(wells) * width * float64(passes)}, nil
}

// Operating is a modulator's behaviour at one photon energy between two
// biases, 1 and 2 (see [Modulator.Figures]).
type Operating struct {
	// Energy is the photon energy in eV and Wavelength its vacuum
	// wavelength in nm.
	Energy, Wavelength float64
	// Alpha1 and Alpha2 are the wells' absorption coefficients at the two
	// biases in cm⁻¹, and Change = Alpha2 − Alpha1 (Δα).
	Alpha1, Alpha2, Change float64
	// Transmission1 and Transmission2 are the power transmissions at the
	// two biases (see [Modulator]).
	Transmission1, Transmission2 float64
	// Extinction is the extinction ratio in dB, the ratio of the higher
	// transmission to the lower: 10 log₁₀(e) |Δα| Path.
	Extinction float64
	// Insertion is the insertion loss in dB, the loss in the more
	// transparent state: 10 log₁₀(e) min(α₁, α₂) Path + Loss.
	Insertion float64
}

func (m Modulator) validate() error {
	if !(m.Path > 0) || math.IsInf(m.Path, 0) {
		return fmt.Errorf("tiltwell: modulator: path %v m is not a finite positive number: %w", m.Path, ErrUnits)
	}
	if !(m.Loss >= 0) || math.IsInf(m.Loss, 0) {
		return fmt.Errorf("tiltwell: modulator: loss %v dB: must be 0 or a finite positive number: %w", m.Loss, ErrUnits)
	}
	return nil
}

// Transmission returns the power transmission exp(−α Path)·10^(−Loss/10)
// at the absorption coefficient alpha (cm⁻¹). It does not check its
// arguments.
func (m Modulator) Transmission(alpha float64) float64 {
	return math.Exp(-alpha*1e2*m.Path - m.Loss/dBPerNeper)
}

// Figures returns the modulator's [Operating] figures at each photon
// energy in photon (eV), from the absorption coefficients alpha1 and
// alpha2 (cm⁻¹) of the wells at the two biases at those energies, in dst
// resized to len(photon) (if dst is nil, a new slice is allocated).
//
// It returns an error wrapping [ErrUnits] for a Path that is not a finite
// positive number or a negative or infinite Loss, slices of different
// lengths or no photon energies, a photon energy that is not a finite
// positive number, and an absorption coefficient that is negative or not
// finite.
func (m Modulator) Figures(dst []Operating, photon, alpha1, alpha2 []float64) ([]Operating, error) {
	if err := m.validate(); err != nil {
		return dst, err
	}
	if len(photon) == 0 || len(alpha1) != len(photon) || len(alpha2) != len(photon) {
		return dst, fmt.Errorf("tiltwell: modulator: %d photon energies, %d and %d absorption coefficients: need as many of each, at least one: %w",
			len(photon), len(alpha1), len(alpha2), ErrUnits)
	}
	out := resize(dst, len(photon))
	for i, e := range photon {
		a1, a2 := alpha1[i], alpha2[i]
		switch {
		case !(e > 0) || math.IsInf(e, 0):
			return dst, fmt.Errorf("tiltwell: modulator: photon energy %d is %v eV: %w", i, e, ErrUnits)
		case !(a1 >= 0) || math.IsInf(a1, 0) || !(a2 >= 0) || math.IsInf(a2, 0):
			return dst, fmt.Errorf("tiltwell: modulator: at %g eV the absorption coefficients are %v and %v cm⁻¹: need finite values ≥ 0: %w", e, a1, a2, ErrUnits)
		}
		k := dBPerNeper * 1e2 * m.Path // dB per cm⁻¹
		out[i] = Operating{
			Energy:        e,
			Wavelength:    Wavelength(e),
			Alpha1:        a1,
			Alpha2:        a2,
			Change:        a2 - a1,
			Transmission1: m.Transmission(a1),
			Transmission2: m.Transmission(a2),
			Extinction:    k * math.Abs(a2-a1),
			Insertion:     k*min(a1, a2) + m.Loss,
		}
	}
	return out, nil
}

// Best returns the operating point, among the photon energies given, with
// the largest extinction ratio whose insertion loss is at most
// maxInsertion dB (ties go to the lower insertion loss); maxInsertion = 0
// means no limit, which picks the largest |Δα|. The answer is one of the
// given energies: its resolution is that of the photon grid.
//
// It returns the errors of [Modulator.Figures], an error wrapping
// [ErrUnits] for a negative or NaN maxInsertion, and one wrapping
// [ErrNoneMeets], with the point of least insertion loss, when no photon
// energy meets the limit.
func (m Modulator) Best(photon, alpha1, alpha2 []float64, maxInsertion float64) (Operating, error) {
	if !(maxInsertion >= 0) {
		return Operating{}, fmt.Errorf("tiltwell: modulator: insertion-loss limit %v dB: must be 0 (no limit) or positive: %w", maxInsertion, ErrUnits)
	}
	ops, err := m.Figures(nil, photon, alpha1, alpha2)
	if err != nil {
		return Operating{}, err
	}
	limit := maxInsertion
	if limit == 0 {
		limit = math.Inf(1)
	}
	best, least := -1, 0
	for i, o := range ops {
		if o.Insertion < ops[least].Insertion {
			least = i
		}
		if o.Insertion > limit {
			continue
		}
		if best < 0 || o.Extinction > ops[best].Extinction ||
			o.Extinction == ops[best].Extinction && o.Insertion < ops[best].Insertion {
			best = i
		}
	}
	if best < 0 {
		l := ops[least]
		return l, fmt.Errorf("tiltwell: modulator: no photon energy has an insertion loss within %g dB; the least is %.3g dB at %.4f eV (%.1f nm): %w",
			maxInsertion, l.Insertion, l.Energy, l.Wavelength, ErrNoneMeets)
	}
	return ops[best], nil
}
