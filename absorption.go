package tiltwell

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"sync"

	"gonum.org/v1/gonum/integrate/quad"
	"gonum.org/v1/gonum/unit/constant"

	"github.com/tiltwell/tiltwell/internal/faddeeva"
)

// Polarization is the polarization of the light an [Absorption] spectrum
// is computed for.
type Polarization int

// The polarizations. Programs should not rely on the numeric values.
const (
	// TE light has its electric field in the plane of the layers: light
	// at normal incidence, or the TE mode of a waveguide. It is the zero
	// value.
	TE Polarization = iota
	// TM light has its electric field along the growth axis (the TM mode
	// of a waveguide).
	TM
)

// String returns "TE" or "TM".
func (p Polarization) String() string {
	switch p {
	case TE:
		return "TE"
	case TM:
		return "TM"
	}
	return "Polarization(" + strconv.Itoa(int(p)) + ")"
}

// Weight returns |ê·p_cv|² of a transition to the hole band c for light of
// polarization p, in units of |⟨S|p_x|X⟩|² = m₀E_P/2 (E_P the Kane energy,
// [Material].Kane), at the band edge (in-plane wavevector 0):
//
//	      heavy hole   light hole
//	TE    1/2          1/6
//	TM    0            2/3
//
// These follow from the band-edge hole states of the Luttinger–Kohn basis,
// |3/2, ±3/2⟩ = ∓(X ± iY)↑↓/√2 and |3/2, ±1/2⟩ = ∓(X ± iY)↓↑/√6 +
// √(2/3) Z↑↓, with ⟨S|p_x|X⟩ = ⟨S|p_y|Y⟩ = ⟨S|p_z|Z⟩ the only nonzero
// momentum elements: for ê = x̂ a heavy hole couples to one electron spin
// with |⟨S|p_x|X⟩|²/2, a light hole with |⟨S|p_x|X⟩|²/6; for ê = ẑ only
// the light hole couples, with 2/3. Relative to the bulk average
// M_b² = m₀E_P/6 they are 3/2 and 1/2 (TE), 0 and 2 (TM), the form of
// S. L. Chuang, Physics of Photonic Devices, 2nd ed. (Wiley, 2009), ch. 9
// (from memory); the heavy and light holes share TE light 3:1. Away from
// the band edge the weights depend on the in-plane wavevector; the
// band-edge values are used for the whole continuum (common practice, no
// source). Weight returns 0 for a carrier that is not a hole band.
func (p Polarization) Weight(c Carrier) float64 {
	switch {
	case p == TE && c == HeavyHole:
		return 1.0 / 2
	case p == TE && c == LightHole:
		return 1.0 / 6
	case p == TM && c == LightHole:
		return 2.0 / 3
	}
	return 0
}

// Continuum selects the model of the absorption above a transition's
// band edge, the continuum of unbound electron–hole pairs.
type Continuum int

// The continuum models. Programs should not rely on the numeric values.
const (
	// Sommerfeld is the two-dimensional joint density of states with the
	// Coulomb enhancement of the two-dimensional hydrogen atom, the
	// Sommerfeld factor of M. Shinada and S. Sugano, J. Phys. Soc. Jpn.
	// 21, 1936 (1966) (from memory),
	//
	//	S(ε) = 2 / (1 + exp(−2π √(R/ε))),   ε = ħω − E_t > 0,
	//
	// with the Rydberg R = E_B/4 of the line's binding energy E_B (the
	// two-dimensional atom binds by 4R; taking R from the quasi-2D binding
	// is an interpolation, common practice, no source). S is 2 at the
	// edge and tends to 1 far above it, S − 1 ≈ π√(R/ε). It is the zero
	// value.
	Sommerfeld Continuum = iota
	// FreeCarrier is the two-dimensional joint density of states without
	// the Coulomb enhancement: a step of constant height.
	FreeCarrier
	// NoContinuum leaves the continuum out: the spectrum holds the
	// exciton lines only.
	NoContinuum
)

// String returns "Sommerfeld", "free-carrier" or "none".
func (c Continuum) String() string {
	switch c {
	case Sommerfeld:
		return "Sommerfeld"
	case FreeCarrier:
		return "free-carrier"
	case NoContinuum:
		return "none"
	}
	return "Continuum(" + strconv.Itoa(int(c)) + ")"
}

// Units says in which units [Absorption.Spectrum] returns its values.
type Units int

// The units of a spectrum. Programs should not rely on the numeric values.
const (
	// PerCM is the absorption coefficient α in cm⁻¹ of the well material.
	PerCM Units = iota
	// Relative is the polarization-weighted optical joint density of
	// states per unit area J(ħω) in nm⁻² meV⁻¹ (see [Absorption]): α
	// without the prefactor that needs the refractive index and the Kane
	// energy.
	Relative
)

// String returns "cm⁻¹" or "nm⁻² meV⁻¹".
func (u Units) String() string {
	switch u {
	case PerCM:
		return "cm⁻¹"
	case Relative:
		return "nm⁻² meV⁻¹"
	}
	return "Units(" + strconv.Itoa(int(u)) + ")"
}

// fwhmPerSigma is 2√(2 ln 2), the FWHM of a Gaussian in units of its
// standard deviation.
const fwhmPerSigma = 2.3548200450309493

// Absorption is the model of a quantum well's interband absorption
// spectrum: how each transition's exciton line and continuum are
// broadened, the light's polarization and the refractive index that sets
// the absolute scale. [Absorption.Spectrum] evaluates it for the
// transitions of an [Absorber].
//
// The model. For a transition t between an electron and a hole subband,
// with overlap² I_t² = |∫φ_e φ_h dz|², single-particle energy E_t and
// exciton binding energy E_B (so the exciton line sits at E_X = E_t − E_B),
// the absorption coefficient of the well material is
//
//	α(ħω) = [2π² α_fs (ħ²/m₀) (E_P/ħω) / (n L_w)] J(ħω),
//	J(ħω) = Σ_t w_t I_t² [2 ρ_t V(ħω − E_X) + (μ_t/(πħ²)) C_t(ħω − E_t)],
//
// with α_fs the fine-structure constant, E_P the Kane energy of the well
// material, n the refractive index, L_w the well width, w_t the
// polarization weight of the hole band ([Polarization.Weight]), ρ_t the
// exciton's in-plane density at zero electron–hole separation
// |φ_1s(0)|² ([ExcitonBinding].Density), μ_t the in-plane reduced mass,
// V the line shape (below) and C_t the broadened continuum (below). The
// prefactor is Fermi's golden rule for the A·p coupling,
// α = (πe²/(n c ε₀ m₀² ω)) |ê·p_cv|² ρ_j, with |ê·p_cv|² = w_t m₀E_P/2 and
// e²/ε₀ = 4π α_fs ħc: S. L. Chuang, Physics of Photonic Devices, 2nd ed.
// (Wiley, 2009), ch. 9, whose quantum-well step is
// C₀ |ê·p_cv|² I² μ/(πħ² L_w), C₀ = πe²/(n c ε₀ m₀² ω) (from memory). The
// joint density of states ρ_j (per unit volume and energy, both spins) is
// μ/(πħ²L_w) for the continuum of a pair of subbands and
// (2/L_w)|φ_1s(0)|² δ(ħω − E_X) for the exciton, whose relative motion
// in the plane, normalized over the plane, enters the matrix element
// through its value at zero separation (R. J. Elliott, Phys. Rev. 108,
// 1384 (1957), for the bulk form; from memory). In the two-dimensional
// limit |φ_1s(0)|² = 8/(π a*²) and the line's integrated strength is
// 8 E_B times the continuum step, the Sommerfeld enhancement doubling the
// step at the edge. Only the 1s exciton of each transition is included:
// in the two-dimensional limit the excited states 2s, 3s, … carry
// 1/27, 1/125, … of its strength (their sum about 5%), just below the
// edge, where the broadened continuum covers them.
//
// Broadening. Every line and continuum is convolved with the Voigt
// profile V, the convolution of a Gaussian of FWHM Inhomogeneous (the
// spread of well widths and compositions; widened per transition by
// WidthSpread) and a Lorentzian of FWHM
// Γ = Width + Homogeneous, Width being the transition's escape width
// Γ_e + Γ_h ([ExcitonLine].Width). The Voigt profile is Re w(z)/(σ√(2π)),
// z = (x + iΓ/2)/(σ√2), with the Faddeeva function w by J. A. C.
// Weideman, SIAM J. Numer. Anal. 31, 1497 (1994) (internal/faddeeva:
// relative error at most 9.1e-16 against a 600-bit series). The continuum is
// C_t(u) = ∫₀^∞ V(u − ε) S(ε) dε, S the Sommerfeld factor (or 1): see
// [Absorption.Spectrum] for how it is computed.
//
// The zero value is not usable: Inhomogeneous must be set.
type Absorption struct {
	// Inhomogeneous is the FWHM of the Gaussian broadening in meV, which
	// must be positive: the inhomogeneous width from fluctuations of the
	// well width and composition. 2 to 8 meV is typical of good GaAs
	// wells (from memory).
	Inhomogeneous float64
	// Homogeneous is a Lorentzian FWHM in meV added to every transition's
	// escape width: the homogeneous width from scattering (at room
	// temperature mostly by LO phonons, a few meV in GaAs wells; from
	// memory). It must be 0 or positive.
	Homogeneous float64
	// WidthSpread is the standard deviation of the well width over the
	// illuminated area in nm (monolayer steps, interface roughness): it
	// adds |∂E_t/∂L|·WidthSpread ([ExcitonLine].Slope) in quadrature to
	// the standard deviation of each transition's Gaussian, to first
	// order in the spread (common practice, no source). The field makes
	// the levels more sensitive to the width, so this broadening grows
	// with the field; escape (Width) adds little to it below the fields
	// that ionise the carriers. It must be 0 or positive. A GaAs
	// monolayer is 0.283 nm (half the lattice constant).
	WidthSpread float64
	// Index is the refractive index n of the well material at the photon
	// energies of the spectrum (the material table holds none). If it is
	// 0, the spectrum is in [Relative] units; otherwise it must be
	// positive and finite. GaAs near its band edge at room temperature
	// has n ≈ 3.6 (D. T. F. Marple, J. Appl. Phys. 35, 1241 (1964),
	// doi:10.1063/1.1713601; value from memory).
	Index float64
	// Continuum selects the continuum model; the zero value is
	// [Sommerfeld].
	Continuum Continuum
	// Polarization of the light; the zero value is [TE].
	Polarization Polarization
}

// Absorber is what [Absorption.Spectrum] needs of a quantum well at one
// field: its width and Kane energy, and one [ExcitonLine] per transition.
// [Excitons.At] builds it from a [Structure]; it may as well be filled
// by hand.
type Absorber struct {
	// Field is the field in V/m the lines were computed at; Spectrum does
	// not read it.
	Field float64
	// Width is the well width L_w in metres, the length that the
	// absorption coefficient is per.
	Width float64
	// Kane is the Kane energy E_P of the well material in eV
	// ([Material].Kane). If it is 0, the spectrum is in [Relative] units.
	Kane float64
	// Lines holds the transitions. Spectrum reads of each only
	// Transition.Hole, Energy, Overlap2, Binding, Density, Reduced,
	// Width and Slope.
	Lines []ExcitonLine
}

// Units returns the units [Absorption.Spectrum] uses with the absorber
// ab: [PerCM] if both the refractive index and the Kane energy are set,
// [Relative] otherwise.
func (a Absorption) Units(ab Absorber) Units {
	if a.Index > 0 && ab.Kane > 0 {
		return PerCM
	}
	return Relative
}

// Limits of a spectrum.
const (
	// MaxBroadening is the largest Gaussian standard deviation or
	// Lorentzian FWHM of a line that [Absorption.Spectrum] accepts, in
	// meV: 1 keV, far beyond any absorption line, and small enough that
	// the sums and squares of the continuum stay finite.
	MaxBroadening = 1e6

	// MaxLattice is the largest number of points of the lattice on which
	// [Absorption.Spectrum] computes one transition's continuum: the
	// energy range (plus 32 broadening widths) divided by a step of about
	// a quarter of the Gaussian's standard deviation. At its limit one
	// continuum costs about 0.1 s (43 ms measured at 16000 points).
	MaxLattice = 20000
)

// Spectrum returns the absorption spectrum of the absorber ab at each
// photon energy in photon (eV), in dst resized to len(photon) (if dst is
// nil, a new slice is allocated): the absorption coefficient α in cm⁻¹
// of the well material if a.Index and ab.Kane are set, otherwise the
// optical joint density J in nm⁻² meV⁻¹ (see [Absorption], and
// [Absorption.Units]). The photon energies may come in any order.
//
// The exciton lines are evaluated directly. Each continuum is computed on
// a lattice of step h anchored at its band edge, h = min(max(σ/4, Γ/16),
// R/2) (σ the Gaussian's standard deviation, Γ the Lorentzian FWHM, R the
// Sommerfeld Rydberg), by the trapezoidal rule in ε with three
// Euler–Maclaurin corrections at the edge (DLMF 2.10.1), where
// V(u − ε)S(ε) has its only end (S is flat there: all its derivatives
// vanish; the derivatives of V come from those of w), and the Lorentzian
// tail beyond 32 widths from an expansion of V,
// (Γ/2π)(1/y² + (3σ² − Γ²/4)/y⁴), integrated against S by a 6-point
// Gauss–Legendre rule; the lattice values are then interpolated to the
// photon energies by 10-point Lagrange interpolation. Held against an
// independent quadrature of the defining integral over Gaussian,
// Lorentzian and mixed broadenings with and without the Sommerfeld factor
// (TestContinuumAgainstQuadrature), the continuum is accurate to 1.2e-7
// of its step height.
//
// Cost: for the four transitions of [DemoGaAsWell] in BenchmarkAbsorption
// (500 photon energies over 240 meV, 4 meV Gaussian and 4 meV Lorentzian
// FWHM), 2–4 ms on one core of a shared machine, mostly the continua's
// lattice sums (about 600 × 600 terms each).
//
// Spectrum returns an error wrapping [ErrUnits], naming the value, for: an
// Inhomogeneous width that is not a finite positive number, a
// Homogeneous width that is negative or not finite, an Index that is
// negative or not finite, an unknown Continuum or Polarization; a width
// ab.Width outside [MinWellWidth, MaxWellWidth], a Kane energy that is
// negative or not finite, no lines; a line whose hole band is not
// HeavyHole or LightHole, whose Energy is not a finite positive number,
// whose Overlap2 lies outside [0, 1], whose Binding, Density or Width is
// negative or not finite, whose binding puts the exciton at or below zero
// energy, whose Reduced mass is not a finite positive number, or whose
// broadening exceeds [MaxBroadening]; and for
// no photon energies or one that is not a finite positive number; and
// for a continuum that would need more than [MaxLattice] lattice points
// (a broadening, or a Sommerfeld Rydberg E_B/4, far narrower than the
// energy range).
func (a Absorption) Spectrum(dst []float64, ab Absorber, photon []float64) ([]float64, error) {
	if err := a.validate(); err != nil {
		return dst, err
	}
	if err := ab.validate(); err != nil {
		return dst, err
	}
	if len(photon) == 0 {
		return dst, fmt.Errorf("tiltwell: absorption: no photon energies: %w", ErrUnits)
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for i, e := range photon {
		if !(e > 0) || math.IsInf(e, 0) {
			return dst, fmt.Errorf("tiltwell: absorption: photon energy %d is %v eV, not a finite positive number: %w", i, e, ErrUnits)
		}
		lo, hi = min(lo, e), max(hi, e)
	}
	out := resize(dst, len(photon))
	clear(out)
	sigma := a.Inhomogeneous / fwhmPerSigma
	var u []float64
	for _, l := range ab.Lines {
		w := a.Polarization.Weight(l.Hole) * l.Overlap2
		if w == 0 {
			continue
		}
		gamma := (l.Width + a.Homogeneous) / 2 // HWHM
		sig := math.Hypot(sigma, l.Slope*a.WidthSpread)
		if !(sig <= MaxBroadening && 2*gamma <= MaxBroadening) {
			return dst, fmt.Errorf("tiltwell: absorption: %v: broadening σ = %g meV, Γ = %g meV beyond %g meV: %w", l.Transition, sig, 2*gamma, float64(MaxBroadening), ErrUnits)
		}
		if l.Density > 0 {
			peak := l.Energy - l.Binding/1e3
			amp := 2 * w * l.Density
			for i, e := range photon {
				out[i] += amp * faddeeva.Voigt((e-peak)*1e3, sig, gamma)
			}
		}
		if a.Continuum == NoContinuum {
			continue
		}
		r := 0.0
		if a.Continuum == Sommerfeld {
			r = l.Binding / 4
		}
		u = resize(u, len(photon))
		for i, e := range photon {
			u[i] = (e - l.Energy) * 1e3
		}
		step := w * jointDensity(l.Reduced)
		if err := addContinuum(out, u, step, sig, gamma, r); err != nil {
			return dst, fmt.Errorf("tiltwell: absorption: %v continuum over %g–%g eV: %w", l.Transition, lo, hi, err)
		}
	}
	if a.Units(ab) == PerCM {
		for i, e := range photon {
			out[i] *= prefactor(a.Index, ab.Kane, ab.Width, e)
		}
	}
	return out, nil
}

// jointDensity returns μ/(πħ²) in nm⁻² meV⁻¹ for the in-plane reduced
// mass mu (m₀): the two-dimensional joint density of states of a pair of
// subbands per unit area and energy, both spins.
func jointDensity(mu float64) float64 {
	return mu * ElectronMass / (math.Pi * ReducedPlanck * ReducedPlanck) * 1e-18 * 1e-3 * ElementaryCharge
}

// prefactor returns 2π² α_fs (ħ²/m₀)(E_P/E)/(n L_w) in cm⁻¹ per
// nm⁻² meV⁻¹ (see [Absorption]), for the Kane energy ep and photon energy
// e in eV and the well width lw in metres.
func prefactor(n, ep, lw, e float64) float64 {
	p := 2 * math.Pi * math.Pi * float64(constant.FineStructure) * ReducedPlanck * ReducedPlanck / ElectronMass *
		(ep / e) / (n * lw) // J m: α in m⁻¹ per J(ħω) in m⁻² J⁻¹
	return p * 1e18 / (1e-3 * ElementaryCharge) * 1e-2
}

func (a Absorption) validate() error {
	bad := func(what string, v float64, why string) error {
		return fmt.Errorf("tiltwell: absorption: %s %v: %s: %w", what, v, why, ErrUnits)
	}
	switch {
	case !(a.Inhomogeneous > 0) || math.IsInf(a.Inhomogeneous, 0):
		return bad("inhomogeneous FWHM (meV)", a.Inhomogeneous, "must be a finite positive number")
	case !(a.Homogeneous >= 0) || math.IsInf(a.Homogeneous, 0):
		return bad("homogeneous FWHM (meV)", a.Homogeneous, "must be 0 or a finite positive number")
	case !(a.WidthSpread >= 0) || math.IsInf(a.WidthSpread, 0):
		return bad("width spread (nm)", a.WidthSpread, "must be 0 or a finite positive number")
	case !(a.Index >= 0) || math.IsInf(a.Index, 0):
		return bad("refractive index", a.Index, "must be 0 (relative units) or a finite positive number")
	case a.Continuum < Sommerfeld || a.Continuum > NoContinuum:
		return bad("continuum model", float64(a.Continuum), "unknown")
	case a.Polarization != TE && a.Polarization != TM:
		return bad("polarization", float64(a.Polarization), "unknown")
	}
	return nil
}

func (ab Absorber) validate() error {
	if !(ab.Width >= MinWellWidth && ab.Width <= MaxWellWidth) {
		return fmt.Errorf("tiltwell: absorption: well width %v m outside [%g, %g] m: %w", ab.Width, float64(MinWellWidth), float64(MaxWellWidth), ErrUnits)
	}
	if !(ab.Kane >= 0) || math.IsInf(ab.Kane, 0) {
		return fmt.Errorf("tiltwell: absorption: Kane energy %v eV: must be 0 (relative units) or a finite positive number: %w", ab.Kane, ErrUnits)
	}
	if len(ab.Lines) == 0 {
		return fmt.Errorf("tiltwell: absorption: no transitions: %w", ErrUnits)
	}
	for _, l := range ab.Lines {
		bad := func(what string, v float64, why string) error {
			return fmt.Errorf("tiltwell: absorption: %v: %s %v: %s: %w", l.Transition, what, v, why, ErrUnits)
		}
		finite := func(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
		switch {
		case l.Hole != HeavyHole && l.Hole != LightHole:
			return bad("hole band", float64(l.Hole), "must be HeavyHole or LightHole")
		case !(l.Energy > 0) || !finite(l.Energy):
			return bad("energy (eV)", l.Energy, "must be a finite positive number")
		case !(l.Overlap2 >= 0 && l.Overlap2 <= 1+1e-9):
			return bad("overlap²", l.Overlap2, "must lie in [0, 1]")
		case !(l.Binding >= 0) || !finite(l.Binding):
			return bad("binding energy (meV)", l.Binding, "must be 0 or a finite positive number")
		case !(l.Binding/1e3 < l.Energy):
			return bad("binding energy (meV)", l.Binding, fmt.Sprintf("puts the exciton at or below zero energy (transition at %g eV)", l.Energy))
		case !(l.Density >= 0) || !finite(l.Density):
			return bad("exciton density (nm⁻²)", l.Density, "must be 0 or a finite positive number")
		case !(l.Reduced > 0) || !finite(l.Reduced):
			return bad("in-plane reduced mass (m₀)", l.Reduced, "must be a finite positive number")
		case !(l.Width >= 0) || !finite(l.Width):
			return bad("escape width (meV)", l.Width, "must be 0 or a finite positive number")
		case !finite(l.Slope):
			return bad("slope ∂E/∂L (meV/nm)", l.Slope, "must be finite")
		}
	}
	return nil
}

// sommerfeld returns the two-dimensional Sommerfeld factor
// 2/(1 + exp(−2π√(r/eps))) for eps > 0 (see [Sommerfeld]); 1 for r = 0.
func sommerfeld(eps, r float64) float64 {
	if r == 0 {
		return 1
	}
	return 2 / (1 + math.Exp(-2*math.Pi*math.Sqrt(r/eps)))
}

// Continuum lattice settings.
const (
	// tailWidths is the distance, in broadening widths max(σ, Γ/2), from
	// a lattice point to the end of its trapezoidal sum, beyond which
	// the tail expansion takes over: its first omitted term is
	// (width/distance)⁴ ≈ 1e-6 of the tail, itself at most 1% of the
	// step.
	tailWidths = 32
	// interpPoints is the number of lattice points each photon energy is
	// interpolated from.
	interpPoints = 10
	// tailNodes is the order of the Gauss–Legendre rule of the tail.
	tailNodes = 6
)

// tailRule is the tailNodes-point Gauss–Legendre rule on [0, 1], built
// once and read-only after.
var tailRule = sync.OnceValue(func() quadNodes {
	r := quadNodes{x: make([]float64, tailNodes), w: make([]float64, tailNodes)}
	quad.Legendre{}.FixedLocations(r.x, r.w, 0, 1)
	return r
})

// interpWeights holds the barycentric weights (−1)^j C(9, j) of 10-point
// equispaced interpolation (J.-P. Berrut and L. N. Trefethen, SIAM Rev.
// 46, 501 (2004), §5; from memory).
var interpWeights = [interpPoints]float64{1, -9, 36, -84, 126, -126, 84, -36, 9, -1}

// addContinuum adds step·C(u_i) to out[i] for each offset u_i (meV) from
// the band edge, where C(u) = ∫₀^∞ V(u − ε; σ, γ) S(ε; r) dε is the
// broadened continuum of unit step (γ the Lorentzian HWHM; r the
// Sommerfeld Rydberg, 0 for none). See [Absorption.Spectrum] for the
// method.
func addContinuum(out, u []float64, step, sigma, gamma, r float64) error {
	width := max(sigma, gamma)
	h := max(sigma/4, gamma/8)
	if r > 0 {
		h = min(h, r/2)
	}
	umin, umax := slices.Min(u), slices.Max(u)
	kmin := int(math.Floor(umin/h)) - interpPoints/2
	kmax := int(math.Ceil(umax/h)) + interpPoints/2
	d0 := tailWidths * width
	// The trapezoidal sum runs over ε_j = jh, j = 0..jmax, far enough
	// that every lattice point is at least d0 from its end.
	top := max(float64(kmax)*h, 0) + d0
	n := float64(kmax-kmin+1) + top/h
	if !(n <= MaxLattice) {
		why := "widen the broadening or narrow the energy range"
		if r > 0 && h == r/2 {
			why = fmt.Sprintf("the step is set by the Sommerfeld Rydberg E_B/4 = %.3g meV: narrow the energy range, or use the FreeCarrier continuum", r)
		}
		return fmt.Errorf("the continuum needs %.3g lattice points (step %.3g meV over %.3g meV), more than %d: %s: %w",
			n, h, umax-umin+top, MaxLattice, why, ErrUnits)
	}
	jmax := int(math.Ceil(top / h))
	// S on the ε lattice, and V at every lattice distance that occurs,
	// |k − j| ≤ max(|kmin − jmax|, |kmax|), by symmetry of V.
	s := make([]float64, jmax+1)
	s0 := 1.0 // S(0⁺)
	if r > 0 {
		s0 = 2
	}
	s[0] = s0
	for j := 1; j <= jmax; j++ {
		s[j] = sommerfeld(float64(j)*h, r)
	}
	mmax := max(jmax-kmin, kmax, -kmin)
	kern := make([]float64, mmax+1)
	for m := range kern {
		kern[m] = faddeeva.Voigt(float64(m)*h, sigma, gamma)
	}
	tr := tailRule()
	// The tail's expansion coefficient c = 3σ² − γ² (γ the HWHM).
	c := 3*sigma*sigma - gamma*gamma
	vals := make([]float64, kmax-kmin+1)
	for k := kmin; k <= kmax; k++ {
		uk := float64(k) * h
		// Trapezoidal rule over ε ∈ [0, jmax h]: Σ_j V((k − j)h) S_j,
		// split where k − j changes sign so that kern is indexed by
		// |k − j| directly.
		sum := 0.5*kern[abs(k)]*s[0] + 0.5*kern[abs(k-jmax)]*s[jmax]
		split := min(max(k, 0), jmax-1) // last j ≤ k in 1..jmax−1
		for j := 1; j <= split; j++ {
			sum += kern[k-j] * s[j]
		}
		for j := max(split+1, 1); j < jmax; j++ {
			sum += kern[j-k] * s[j]
		}
		sum *= h
		// Euler–Maclaurin at ε = 0, where S is flat (DLMF 2.10.1):
		// + (h²/12) f′(0) − (h⁴/720) f‴(0) + (h⁶/30240) f⁽⁵⁾(0), with
		// f⁽ⁿ⁾(0) = −V⁽ⁿ⁾(u)S(0) for odd n.
		_, d1, d3, d5 := faddeeva.VoigtDerivatives(uk, sigma, gamma)
		h2 := h * h
		sum -= s0 * h2 * (d1/12 - h2*(d3/720-h2*d5/30240))
		// The tail beyond ε = jmax h, at distance dk ≥ d0: with
		// y = dk/q², ∫_dk^∞ V(y) S(u + y) dy =
		// (2γ/(π dk)) ∫₀¹ (q + c q⁵/dk²) S(u + dk/q²) dq.
		if gamma > 0 {
			dk := float64(jmax)*h - uk
			t := 0.0
			for i, q := range tr.x {
				sq := 1.0
				if r > 0 {
					sq = sommerfeld(uk+dk/(q*q), r)
				}
				t += tr.w[i] * (q + c*q*q*q*q*q/(dk*dk)) * sq
			}
			sum += 2 * gamma / (math.Pi * dk) * t
		}
		vals[k-kmin] = sum
	}
	// Interpolate to each u from the interpPoints lattice points around
	// it (barycentric form, equispaced nodes).
	for i, ui := range u {
		t := ui/h - float64(kmin)
		first := int(math.Floor(t)) - interpPoints/2 + 1
		first = min(max(first, 0), len(vals)-interpPoints)
		x := t - float64(first)
		var num, den float64
		exact := -1
		for j := range interpPoints {
			d := x - float64(j)
			if d == 0 {
				exact = j
				break
			}
			q := interpWeights[j] / d
			num += q * vals[first+j]
			den += q
		}
		if exact >= 0 {
			out[i] += step * vals[first+exact]
		} else {
			out[i] += step * num / den
		}
	}
	return nil
}

func abs(k int) int {
	if k < 0 {
		return -k
	}
	return k
}
