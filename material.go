package tiltwell

import (
	"fmt"
	"math"
	"strconv"
	"strings"
)

// Limits of the material model.
const (
	// MaxTemperature is the highest temperature, in K, at which a
	// [Material] gives a band gap. The Varshni fits of the compilation
	// (see [Material], [VMR]) describe data
	// from low temperature to a few hundred kelvin (from memory); 1000 K
	// keeps every gap here positive and is far above any device's
	// operating point.
	MaxTemperature = 1000
)

// Varshni is one term of a temperature-dependent gap: Weight times the
// Varshni law (Y. P. Varshni, Physica 34, 149 (1967); the form and the
// parameters of [VMR] Sec. III)
//
//	E(T) = E0 − Alpha T²/(T + Beta).
type Varshni struct {
	// Weight is the term's share, the alloy fraction of its end member (1
	// for a binary).
	Weight float64
	// E0 is the gap at 0 K in eV.
	E0 float64
	// Alpha is in eV/K and Beta in K.
	Alpha, Beta float64
}

// Valley is the energy of one conduction-band valley (Γ, X or L) above the
// top of the valence band as a function of temperature:
//
//	E(T) = Σ_i Weight_i [E0_i − Alpha_i T²/(T + Beta_i)] − Bow.
//
// A binary has one term (the second has Weight 0); an alloy A_xB_{1−x}C
// has the terms of its end members AC and BC with weights x and 1 − x and
// the bowing energy Bow = x(1 − x)C. The alloy's gap at temperature T is
// thus the interpolation, with bowing, of its end members' gaps at T: the
// bowing rule of [VMR] Sec. IV applied at each temperature, with the
// bowing parameter taken independent of temperature (as [VMR] does, from
// memory).
type Valley struct {
	Terms [2]Varshni
	// Bow is the bowing energy x(1 − x)C in eV, subtracted from the
	// interpolated gap.
	Bow float64
}

// At returns the valley's energy in eV at temperature T (K). It does not
// check T; [Material.Gap] does.
func (v Valley) At(T float64) float64 {
	e := -v.Bow
	for _, t := range v.Terms {
		if t.Weight != 0 {
			e += t.Weight * (t.E0 - t.Alpha*T*T/(T+t.Beta))
		}
	}
	return e
}

// Material holds the band parameters of one III–V semiconductor, a binary
// or a ternary alloy of fixed composition, as the effective-mass model
// uses them. Obtain one from [GaAs], [AlAs], [InAs], [InP], [AlGaAs],
// [InGaAs], [InAlAs] or [ParseMaterial]; a Material built by hand must
// pass [Material.Validate] before use (a [Structure] checks it).
//
// The model is the parabolic single-band one: a Γ-valley electron of mass
// ElectronMass and heavy and light holes whose masses along the growth
// direction [001] follow from the Luttinger parameters. It ignores strain
// (see [Structure] for the lattice-mismatch check), non-parabolicity,
// valence-band mixing and the temperature dependence of the masses. An
// Al_xGa_{1−x}As alloy is an indirect semiconductor beyond x ≈ 0.4 (see
// [Material.Indirect]): its lowest conduction states are then in the X or
// L valleys, which this model does not describe.
//
// Unless stated otherwise every value is from the standard compilation
// [VMR]. The binary values are those of its tables of recommended
// band-structure parameters, one table per compound, in Sec. III (GaAs
// III A, AlAs III B, InAs III C, InP III F; by our reading Tables I, II,
// III and VI, numbering from memory). The alloy values use the bowing
// parameters of its Sec. IV (the Al_xGa_{1−x}As, Ga_{1−x}In_xAs and
// Al_xIn_{1−x}As subsections). The numbers were checked against two
// independent public copies of these tables, which agree on every
// value used here except the two noted at [AlGaAs] and [InGaAs]. The
// static dielectric constants, which [VMR] does not list, are from [NSM].
//
// References:
//   - [VMR] I. Vurgaftman, J. R. Meyer, L. R. Ram-Mohan, "Band parameters
//     for III–V compound semiconductors and their alloys", J. Appl. Phys.
//     89, 5815 (2001), doi:10.1063/1.1368156.
//   - [NSM] the Ioffe Institute's semiconductor database (NSM archive,
//     http://www.ioffe.ru/SVA/NSM/Semicond/), after M. E. Levinshtein,
//     S. L. Rumyantsev, M. S. Shur (eds.), Handbook Series on
//     Semiconductor Parameters, Vol. 1 (World Scientific, 1996): static
//     dielectric constants GaAs 12.90 and AlAs 10.06 (its Al_xGa_{1−x}As
//     entry, 12.90 − 2.84x), InAs 15.15, InP 12.5.
type Material struct {
	// Name is the chemical formula: "GaAs", "Al0.3Ga0.7As".
	Name string
	// Composition is the alloy fraction x of the first-named group-III
	// element (Al in AlGaAs, In in InGaAs and InAlAs); 0 for a binary.
	Composition float64
	// Lattice is the lattice constant at 300 K in metres (5.65325e-10 for
	// GaAs), and LatticeExpansion its temperature coefficient in m/K.
	// Alloys follow Vegard's law: linear interpolation ([VMR] gives no
	// bowing of the lattice constants of these alloys).
	Lattice, LatticeExpansion float64
	// Gamma, X and L are the conduction-band valleys: their energies above
	// the valence-band maximum. Gamma is the band gap of a direct
	// semiconductor.
	Gamma, X, L Valley
	// VBO is the energy of the valence-band maximum in eV on the absolute
	// scale of [VMR] (Sec. III, "valence band offset"; the InSb maximum is
	// 0). It is taken independent of temperature, so the whole temperature
	// dependence of the gap goes to the conduction band (common practice,
	// no source).
	VBO float64
	// ElectronMass is the Γ-valley electron effective mass in units of the
	// electron mass m₀.
	ElectronMass float64
	// Luttinger1, Luttinger2 and Luttinger3 are the Luttinger parameters
	// γ1, γ2, γ3 (dimensionless) of the valence band (J. M. Luttinger,
	// Phys. Rev. 102, 1030 (1956)).
	Luttinger1, Luttinger2, Luttinger3 float64
	// Kane is the Kane energy E_P = 2m₀P²/ħ² in eV, the interband momentum
	// matrix element.
	Kane float64
	// Permittivity is the static relative dielectric constant ε_s
	// (dimensionless), from [NSM], interpolated linearly in alloys.
	Permittivity float64
}

// binaryParams are the [VMR] values of one binary compound. Masses in m₀,
// energies in eV, lattice constants in Å at 300 K and Å/K.
type binaryParams struct {
	name                    string
	a, da                   float64
	gamma, x, l             Varshni
	vbo, me                 float64
	g1, g2, g3, ep, epsilon float64
}

// The binaries of [VMR], Sec. III. The Varshni α of the table are in
// meV/K; they are written here in eV/K.
var (
	// GaAs, [VMR] Sec. III A (Table I by our reading).
	gaAs = binaryParams{
		name: "GaAs", a: 5.65325, da: 3.88e-5,
		gamma: Varshni{1, 1.519, 0.5405e-3, 204},
		x:     Varshni{1, 1.981, 0.460e-3, 204},
		l:     Varshni{1, 1.815, 0.605e-3, 204},
		vbo:   -0.80, me: 0.067,
		g1: 6.98, g2: 2.06, g3: 2.93, ep: 28.8,
		epsilon: 12.90, // [NSM]
	}
	// AlAs, [VMR] Sec. III B (Table II by our reading).
	alAs = binaryParams{
		name: "AlAs", a: 5.6611, da: 2.90e-5,
		gamma: Varshni{1, 3.099, 0.885e-3, 530},
		x:     Varshni{1, 2.24, 0.70e-3, 530},
		l:     Varshni{1, 2.46, 0.605e-3, 204},
		vbo:   -1.33, me: 0.15,
		g1: 3.76, g2: 0.82, g3: 1.42, ep: 21.1,
		epsilon: 10.06, // [NSM], 12.90 − 2.84
	}
	// InAs, [VMR] Sec. III C (Table III by our reading).
	inAs = binaryParams{
		name: "InAs", a: 6.0583, da: 2.74e-5,
		gamma: Varshni{1, 0.417, 0.276e-3, 93},
		x:     Varshni{1, 1.433, 0.276e-3, 93},
		l:     Varshni{1, 1.133, 0.276e-3, 93},
		vbo:   -0.59, me: 0.026,
		g1: 20.0, g2: 8.5, g3: 9.2, ep: 21.5,
		epsilon: 15.15, // [NSM]
	}
	// InP, [VMR] Sec. III F (Table VI by our reading). Its X gap is given
	// as 2.384 − 3.7e-4 T eV, the Varshni law with β = 0.
	inP = binaryParams{
		name: "InP", a: 5.8697, da: 2.79e-5,
		gamma: Varshni{1, 1.4236, 0.363e-3, 162},
		x:     Varshni{1, 2.384, 0.37e-3, 0},
		l:     Varshni{1, 2.014, 0.363e-3, 162},
		vbo:   -0.94, me: 0.0795,
		g1: 5.08, g2: 1.60, g3: 2.10, ep: 20.7,
		epsilon: 12.5, // [NSM]
	}
)

func (b binaryParams) material() Material {
	return Material{
		Name:             b.name,
		Lattice:          b.a * 1e-10,
		LatticeExpansion: b.da * 1e-10,
		Gamma:            Valley{Terms: [2]Varshni{b.gamma}},
		X:                Valley{Terms: [2]Varshni{b.x}},
		L:                Valley{Terms: [2]Varshni{b.l}},
		VBO:              b.vbo,
		ElectronMass:     b.me,
		Luttinger1:       b.g1, Luttinger2: b.g2, Luttinger3: b.g3,
		Kane:         b.ep,
		Permittivity: b.epsilon,
	}
}

// GaAs returns gallium arsenide ([VMR] Sec. III A).
func GaAs() Material { return gaAs.material() }

// AlAs returns aluminium arsenide ([VMR] Sec. III B), an indirect
// semiconductor: its X valley lies below Γ (see [Material.Indirect]).
func AlAs() Material { return alAs.material() }

// InAs returns indium arsenide ([VMR] Sec. III C).
func InAs() Material { return inAs.material() }

// InP returns indium phosphide ([VMR] Sec. III F).
func InP() Material { return inP.material() }

// bowing holds the nonzero bowing parameters C of one ternary, in the
// convention of [VMR] Sec. IV,
//
//	P(A_xB_{1−x}C) = x P(AC) + (1 − x) P(BC) − x(1 − x) C,
//
// with A the first-named group-III element.
type bowing struct {
	// gamma returns the Γ-gap bowing at composition x (it depends on x
	// for AlGaAs).
	gamma      func(x float64) float64
	x, l       float64
	vbo, me    float64
	ep         float64
	hh, lh     float64 // bowing of the [001] hole masses (GaInAs only)
	holeMasses bool    // whether hh and lh are given
}

// The ternaries of [VMR] Sec. IV. Parameters without a bowing parameter
// there are interpolated linearly.
var (
	// Al_xGa_{1−x}As: Γ-gap bowing −0.127 + 1.310x eV, X-gap bowing
	// 0.055 eV, and no VBO bowing (the GaAs/AlAs offset of 0.53 eV is
	// shared linearly). The two public copies we checked read the
	// X bowing as 0.055 and 0.55 eV; 0.055 is the one consistent with the
	// Γ–X crossover near x ≈ 0.4–0.45 (common practice, no source), while
	// 0.55 would make Al0.35Ga0.65As indirect.
	alGaAsBowing = bowing{
		gamma: func(x float64) float64 { return -0.127 + 1.310*x },
		x:     0.055,
	}
	// Ga_{1−x}In_xAs (here In_xGa_{1−x}As, A = InAs): Γ gap 0.477 eV,
	// X gap 1.4 eV, L gap 0.33 eV, VBO −0.38 eV, electron mass 0.0091,
	// E_P −1.48 eV, and [001] hole masses −0.145 (heavy) and 0.0202
	// (light). One public copy reads the light-hole value as
	// 0.202, which would give an unphysical 0.006 m₀ at x = 0.53; 0.0202
	// gives 0.052 m₀, close to the commonly quoted 0.05 m₀ (from memory).
	inGaAsBowing = bowing{
		gamma: func(float64) float64 { return 0.477 },
		x:     1.4, l: 0.33,
		vbo: -0.38, me: 0.0091, ep: -1.48,
		hh: -0.145, lh: 0.0202, holeMasses: true,
	}
	// Al_xIn_{1−x}As (here In_xAl_{1−x}As, A = InAs): Γ gap 0.70 eV,
	// VBO −0.64 eV, electron mass 0.049, E_P −4.81 eV.
	inAlAsBowing = bowing{
		gamma: func(float64) float64 { return 0.70 },
		vbo:   -0.64, me: 0.049, ep: -4.81,
	}
)

// ternary returns the alloy A_xB_{1−x}C of the binaries a (weight x) and
// b. name is the alloy's name for errors ("AlGaAs") and formula the
// pattern of its formula, with a %s for each fraction ("AlGaAs", "Al%sGa%sAs").
func ternary(x float64, a, b binaryParams, c bowing, name, formula string) (Material, error) {
	if !(x >= 0 && x <= 1) {
		return Material{}, fmt.Errorf("tiltwell: %s: composition x = %v outside [0, 1]: %w", name, x, ErrUnits)
	}
	y := 1 - x
	xy := x * y
	lin := func(pa, pb float64) float64 { return x*pa + y*pb }
	terms := func(va, vb Varshni) [2]Varshni {
		va.Weight, vb.Weight = x, y
		return [2]Varshni{va, vb}
	}
	m := Material{
		Name:             alloyName(formula, x),
		Composition:      x,
		Lattice:          lin(a.a, b.a) * 1e-10,
		LatticeExpansion: lin(a.da, b.da) * 1e-10,
		Gamma:            Valley{Terms: terms(a.gamma, b.gamma), Bow: xy * c.gamma(x)},
		X:                Valley{Terms: terms(a.x, b.x), Bow: xy * c.x},
		L:                Valley{Terms: terms(a.l, b.l), Bow: xy * c.l},
		VBO:              lin(a.vbo, b.vbo) - xy*c.vbo,
		ElectronMass:     lin(a.me, b.me) - xy*c.me,
		// [VMR] gives no bowing for the Luttinger parameters of these
		// alloys: they are interpolated linearly (its bowing rule with
		// C = 0), which interpolates the inverse [001] hole masses
		// γ1 ∓ 2γ2 linearly.
		Luttinger1:   lin(a.g1, b.g1),
		Luttinger2:   lin(a.g2, b.g2),
		Luttinger3:   lin(a.g3, b.g3),
		Kane:         lin(a.ep, b.ep) - xy*c.ep,
		Permittivity: lin(a.epsilon, b.epsilon),
	}
	if c.holeMasses {
		// The [001] hole masses with their bowing, and the γ1, γ2 that
		// reproduce them: 1/m_hh = γ1 − 2γ2, 1/m_lh = γ1 + 2γ2.
		hh := lin(1/(a.g1-2*a.g2), 1/(b.g1-2*b.g2)) - xy*c.hh
		lh := lin(1/(a.g1+2*a.g2), 1/(b.g1+2*b.g2)) - xy*c.lh
		m.Luttinger1 = (1/hh + 1/lh) / 2
		m.Luttinger2 = (1/lh - 1/hh) / 4
	}
	return m, nil
}

// alloyName formats an alloy's formula from a pattern with two %s for the
// fractions: "Al%sGa%sAs" → "Al0.3Ga0.7As".
func alloyName(pattern string, x float64) string {
	f := func(v float64) string { return strconv.FormatFloat(v, 'g', 6, 64) }
	return fmt.Sprintf(pattern, f(x), f(1-x))
}

// AlGaAs returns Al_xGa_{1−x}As ([VMR] Sec. IV, Al_xGa_{1−x}As): Γ-gap
// bowing −0.127 + 1.310x eV, X-gap bowing 0.055 eV, everything else
// linear in x (the valence-band offset too). Public copies of
// [VMR] differ on the X bowing (0.055 or 0.55 eV); 0.055 is the one that
// keeps the Γ–X crossover near x ≈ 0.4–0.45, where the trade puts it. It
// returns an error wrapping [ErrUnits] unless 0 ≤ x ≤ 1. Beyond x ≈ 0.41
// the alloy is indirect (see [Material.Indirect]); a [Structure] refuses
// such layers unless told otherwise.
func AlGaAs(x float64) (Material, error) {
	return ternary(x, alAs, gaAs, alGaAsBowing, "AlGaAs", "Al%sGa%sAs")
}

// InGaAs returns In_xGa_{1−x}As ([VMR] Sec. IV, Ga_{1−x}In_xAs), with the
// bowing of its Γ, X and L gaps, valence-band offset, electron mass, Kane
// energy and [001] hole masses; γ1 and γ2 are those that reproduce the
// bowed hole masses, γ3 is linear. Public copies of [VMR] differ
// on the light-hole bowing (0.0202 or 0.202); we use 0.0202, the one that
// gives a physical mass (0.052 m₀ at x = 0.53, not 0.006 m₀). It returns
// an error wrapping [ErrUnits] unless 0 ≤ x ≤ 1. In0.53Ga0.47As is
// lattice-matched to InP.
func InGaAs(x float64) (Material, error) {
	return ternary(x, inAs, gaAs, inGaAsBowing, "InGaAs", "In%sGa%sAs")
}

// InAlAs returns In_xAl_{1−x}As ([VMR] Sec. IV, Al_xIn_{1−x}As), with the
// bowing of its Γ gap, valence-band offset, electron mass and Kane energy;
// the rest, the Luttinger parameters included, is linear in x. It returns
// an error wrapping [ErrUnits] unless 0 ≤ x ≤ 1. In0.52Al0.48As is
// lattice-matched to InP.
func InAlAs(x float64) (Material, error) {
	return ternary(x, inAs, alAs, inAlAsBowing, "InAlAs", "In%sAl%sAs")
}

// materialNames are the names ParseMaterial knows, binaries first.
var materialNames = []string{"GaAs", "AlAs", "InAs", "InP", "AlGaAs", "InGaAs", "InAlAs"}

// MaterialNames returns the material names [ParseMaterial] accepts, in a
// new slice: the binaries, then the alloys (which take ":x").
func MaterialNames() []string { return append([]string(nil), materialNames...) }

// ParseMaterial returns the material named by spec, for command lines: a
// binary by its formula ("GaAs", "AlAs", "InAs", "InP") or an alloy by its
// name and composition x after a colon ("AlGaAs:0.3" is Al0.3Ga0.7As,
// "InGaAs:0.53", "InAlAs:0.52"; x is the fraction of the first-named
// element). Names are matched without regard to case. It returns an error
// wrapping [ErrUnits] for an unknown name, a missing or malformed
// composition, or a composition outside [0, 1].
func ParseMaterial(spec string) (Material, error) {
	name, comp, hasComp := strings.Cut(strings.TrimSpace(spec), ":")
	var alloy func(float64) (Material, error)
	var binary binaryParams
	switch strings.ToLower(name) {
	case "gaas":
		binary = gaAs
	case "alas":
		binary = alAs
	case "inas":
		binary = inAs
	case "inp":
		binary = inP
	case "algaas":
		alloy = AlGaAs
	case "ingaas":
		alloy = InGaAs
	case "inalas":
		alloy = InAlAs
	default:
		return Material{}, fmt.Errorf("tiltwell: unknown material %q (known: %s): %w", spec, strings.Join(materialNames, ", "), ErrUnits)
	}
	switch {
	case alloy == nil && hasComp:
		return Material{}, fmt.Errorf("tiltwell: material %q: the binary %s takes no composition: %w", spec, binary.name, ErrUnits)
	case alloy == nil:
		return binary.material(), nil
	case !hasComp:
		return Material{}, fmt.Errorf("tiltwell: material %q: the alloy %s needs a composition, as in %q: %w", spec, name, name+":0.3", ErrUnits)
	}
	x, err := strconv.ParseFloat(strings.TrimSpace(comp), 64)
	if err != nil {
		return Material{}, fmt.Errorf("tiltwell: material %q: composition %q is not a number: %w", spec, comp, ErrUnits)
	}
	return alloy(x)
}

// checkTemperature returns an error wrapping [ErrUnits] unless
// 0 < T ≤ MaxTemperature.
func checkTemperature(T float64) error {
	if !(T > 0 && T <= MaxTemperature) {
		return fmt.Errorf("tiltwell: temperature %v K: need 0 < T ≤ %v K: %w", T, MaxTemperature, ErrUnits)
	}
	return nil
}

// Gap returns the Γ-valley band gap in eV at temperature T in K. It
// returns an error wrapping [ErrUnits] unless 0 < T ≤ [MaxTemperature].
// For GaAs, Gap(300) = 1.4225 eV.
func (m Material) Gap(T float64) (float64, error) {
	if err := checkTemperature(T); err != nil {
		return 0, fmt.Errorf("%s: %w", m.Name, err)
	}
	return m.Gamma.At(T), nil
}

// Ec returns the Γ-valley conduction-band edge in eV on the absolute scale
// of [VMR]: VBO + Gap(T). Errors are those of [Material.Gap].
func (m Material) Ec(T float64) (float64, error) {
	g, err := m.Gap(T)
	return m.VBO + g, err
}

// Ev returns the valence-band edge (the heavy- and light-hole maximum) in
// eV on the absolute scale of [VMR]: VBO, at every temperature.
func (m Material) Ev() float64 { return m.VBO }

// Indirect reports whether the X or the L valley lies below the Γ valley
// at temperature T (K), so that the material's lowest conduction states
// are outside the Γ-valley model; valley names the lowest valley ("Γ",
// "X" or "L") and margin is E_Γ − min(E_X, E_L) in eV (positive when
// indirect). Errors are those of [Material.Gap]. With the [VMR]
// parameters Al_xGa_{1−x}As turns indirect at x = 0.411 at 300 K, through
// the L valley (the Γ–X crossover alone is at x = 0.435), and at x = 0.417
// at 4 K, through the X valley; AlAs is indirect (X). The trade puts the
// crossover near x ≈ 0.4–0.45 (common practice, no source).
func (m Material) Indirect(T float64) (indirect bool, valley string, margin float64, err error) {
	g, err := m.Gap(T)
	if err != nil {
		return false, "", 0, err
	}
	valley, low := "Γ", g
	if e := m.X.At(T); e < low {
		valley, low = "X", e
	}
	if e := m.L.At(T); e < low {
		valley, low = "L", e
	}
	return valley != "Γ", valley, g - math.Min(m.X.At(T), m.L.At(T)), nil
}

// LatticeAt returns the lattice constant in metres at temperature T (K):
// Lattice + LatticeExpansion (T − 300). Errors are those of
// [Material.Gap].
func (m Material) LatticeAt(T float64) (float64, error) {
	if err := checkTemperature(T); err != nil {
		return 0, fmt.Errorf("%s: %w", m.Name, err)
	}
	return m.Lattice + m.LatticeExpansion*(T-300), nil
}

// Mismatch returns the relative lattice mismatch (a − a_s)/a_s of m on the
// substrate sub at temperature T (K): positive for a layer under
// compression. Errors are those of [Material.Gap].
func (m Material) Mismatch(sub Material, T float64) (float64, error) {
	a, err := m.LatticeAt(T)
	if err != nil {
		return 0, err
	}
	as, err := sub.LatticeAt(T)
	if err != nil {
		return 0, err
	}
	return (a - as) / as, nil
}

// HeavyHoleMass returns the heavy-hole mass along the growth direction
// [001] in m₀: 1/(γ1 − 2γ2), from the Luttinger Hamiltonian (J. M.
// Luttinger, Phys. Rev. 102, 1030 (1956); the formula as in [VMR] Sec. II,
// from memory). For GaAs it is 0.3497.
func (m Material) HeavyHoleMass() float64 { return 1 / (m.Luttinger1 - 2*m.Luttinger2) }

// LightHoleMass returns the light-hole mass along [001] in m₀:
// 1/(γ1 + 2γ2). For GaAs it is 0.0901.
func (m Material) LightHoleMass() float64 { return 1 / (m.Luttinger1 + 2*m.Luttinger2) }

// HeavyHoleMassInPlane returns the heavy-hole mass in the plane of the
// layers in m₀: 1/(γ1 + γ2), the in-plane mass of the band that is heavy
// along [001] in the axial approximation of the Luttinger Hamiltonian
// (common practice, no source); in the plane the heavy hole is the lighter
// one. For GaAs it is 0.1107.
func (m Material) HeavyHoleMassInPlane() float64 { return 1 / (m.Luttinger1 + m.Luttinger2) }

// LightHoleMassInPlane returns the light-hole mass in the plane of the
// layers in m₀: 1/(γ1 − γ2), in the axial approximation (common practice,
// no source). For GaAs it is 0.2041.
func (m Material) LightHoleMassInPlane() float64 { return 1 / (m.Luttinger1 - m.Luttinger2) }

// Validate returns an error wrapping [ErrUnits], naming the first
// offending parameter, unless every parameter is finite and physical: a
// positive lattice constant, valleys with weights in [0, 1] summing to 1
// and nonnegative Varshni β, positive electron and [001] hole masses
// (γ1 > 2|γ2|), and positive Kane energy and permittivity. The materials
// of this package always pass.
func (m Material) Validate() error {
	bad := func(what string, v float64, why string) error {
		return fmt.Errorf("tiltwell: material %q: %s %v: %s: %w", m.Name, what, v, why, ErrUnits)
	}
	finite := func(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
	switch {
	case !(m.Composition >= 0 && m.Composition <= 1):
		return bad("composition", m.Composition, "must be in [0, 1]")
	case !(m.Lattice > 0) || !finite(m.Lattice):
		return bad("lattice constant (m)", m.Lattice, "must be positive")
	case !finite(m.LatticeExpansion):
		return bad("lattice expansion (m/K)", m.LatticeExpansion, "must be finite")
	case !finite(m.VBO):
		return bad("VBO (eV)", m.VBO, "must be finite")
	case !(m.ElectronMass > 0) || !finite(m.ElectronMass):
		return bad("electron mass (m₀)", m.ElectronMass, "must be positive")
	case !finite(m.Luttinger1) || !finite(m.Luttinger2) || !finite(m.Luttinger3):
		return bad("Luttinger parameter γ1", m.Luttinger1, fmt.Sprintf("γ1, γ2, γ3 = %v, %v, %v must be finite", m.Luttinger1, m.Luttinger2, m.Luttinger3))
	case !(m.Luttinger1 > 2*math.Abs(m.Luttinger2)):
		return bad("Luttinger parameter γ1", m.Luttinger1, fmt.Sprintf("must exceed 2|γ2| = %v for positive hole masses", 2*math.Abs(m.Luttinger2)))
	case !(m.Kane > 0) || !finite(m.Kane):
		return bad("Kane energy (eV)", m.Kane, "must be positive")
	case !(m.Permittivity > 0) || !finite(m.Permittivity):
		return bad("permittivity", m.Permittivity, "must be positive")
	}
	for _, v := range []struct {
		name string
		v    Valley
	}{{"Γ", m.Gamma}, {"X", m.X}, {"L", m.L}} {
		sum := 0.0
		for _, t := range v.v.Terms {
			if !(t.Weight >= 0 && t.Weight <= 1) || !finite(t.E0) || !finite(t.Alpha) || !(t.Beta >= 0) || !finite(t.Beta) {
				return bad(v.name+" valley weight", t.Weight, fmt.Sprintf("term %+v: need weight in [0, 1], finite E0 and α, finite β ≥ 0", t))
			}
			sum += t.Weight
		}
		if math.Abs(sum-1) > 1e-12 || !finite(v.v.Bow) {
			return bad(v.name+" valley weights' sum", sum, fmt.Sprintf("must be 1, with a finite bowing energy (%v)", v.v.Bow))
		}
	}
	return nil
}
