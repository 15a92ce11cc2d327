package tiltwell

import (
	"fmt"
	"math"
	"strconv"
)

// DefaultMismatch is the largest relative lattice mismatch |a − a_s|/a_s
// between a layer and the substrate that a [Structure] accepts by default
// (0.2%). Strain is outside the model: a layer grown on a mismatched
// substrate is strained, which moves its band edges by roughly a
// deformation potential (a few eV) times the strain, so 0.2% stands for
// shifts of order 10 meV that the model leaves out (order of magnitude,
// from memory). AlAs on GaAs (0.14% at 300 K) passes; In0.53Ga0.47As and
// In0.52Al0.48As on InP are within 0.04%.
const DefaultMismatch = 2e-3

// Slab is one layer of a [Structure]: a material and its thickness.
type Slab struct {
	Material Material
	// Thickness is in metres. The first and last slabs of a Structure are
	// semi-infinite: their Thickness must be 0.
	Thickness float64
}

// Structure is a layered quantum well in physical units: slabs of
// material listed along the growth direction +z, a temperature and a
// uniform electric field. [Structure.Reduce] turns it into the reduced
// problems of its electron, heavy hole and light hole, each a [Stack] in
// the units of one slab, the reference well.
//
// The model is the single-band envelope-function one in each band, with
// BenDaniel–Duke interfaces (see [Stack]): Γ-valley electrons, and heavy
// and light holes with their [001] masses (the growth direction is [001]),
// uncoupled. It leaves out strain, band mixing, non-parabolicity and the
// in-plane motion; excitons are not included.
type Structure struct {
	// Slabs are the layers in order along +z, at least three: the first
	// and the last are semi-infinite (Thickness 0).
	Slabs []Slab
	// Well is the index in Slabs of the reference well, an inner slab.
	// Its thickness is the width L of every carrier's reduced units, and
	// every band edge is measured from its band edges.
	Well int
	// Temperature is in K, in (0, MaxTemperature].
	Temperature float64
	// Field is the electric field in V/m along +z, from the first slab
	// towards the last: it pushes electrons towards the first slab and
	// holes towards the last. For a p-i-n diode see [DiodeField].
	Field float64
	// Substrate is the material the layers are grown on, for the lattice
	// mismatch check. If its Lattice is 0 (the zero Material), the first
	// slab's material serves as the substrate.
	Substrate Material
	// Mismatch is the largest relative lattice mismatch to the substrate
	// accepted for any slab. If it is 0, [DefaultMismatch] is used; +Inf
	// switches the check off (strained layers are then modelled as if
	// unstrained).
	Mismatch float64
	// AllowIndirect accepts slabs whose lowest conduction valley is X or L
	// rather than Γ at the structure's temperature (Al_xGa_{1−x}As beyond
	// x ≈ 0.4, AlAs). By default they are refused: the Γ-valley electron
	// model describes their conduction band poorly (a barrier of such a
	// material confines Γ electrons, but X or L states lie lower). The
	// holes are unaffected.
	AllowIndirect bool
}

// DiodeField returns the field in V/m of a p-i-n diode in the usual
// approximation of a uniform field across the intrinsic region,
//
//	F = (V_bi − V)/d,
//
// for the built-in voltage builtIn = V_bi (V), the applied bias V (V;
// forward positive, so reverse bias raises the field) and the intrinsic
// thickness d (metres). The field of a junction points from the n side to
// the p side: F is the field along +z of a [Structure] whose slabs are
// listed from the n side to the p side (use −F for slabs listed from p to
// n). It returns an error wrapping [ErrField] for a voltage that is not a
// finite number and [ErrUnits] for a thickness that is not a finite
// positive number.
func DiodeField(builtIn, bias, intrinsic float64) (float64, error) {
	for _, v := range []float64{builtIn, bias} {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return 0, fmt.Errorf("tiltwell: diode: voltage %v V: %w", v, ErrField)
		}
	}
	if !(intrinsic > 0) || math.IsInf(intrinsic, 0) {
		return 0, fmt.Errorf("tiltwell: diode: intrinsic thickness %v m: %w", intrinsic, ErrUnits)
	}
	f := (builtIn - bias) / intrinsic
	if math.IsInf(f, 0) {
		return 0, fmt.Errorf("tiltwell: diode: (%v − %v) V / %v m overflows: %w", builtIn, bias, intrinsic, ErrField)
	}
	return f, nil
}

// Carrier names a kind of carrier of a [Structure].
type Carrier int

// The carriers. Programs should not rely on the numeric values, except
// that they index [Reduced.Carriers]. HeavyHole is the zero value, so that
// the hole band of a [Transition] defaults to the heavy hole.
const (
	HeavyHole Carrier = iota
	LightHole
	Electron
)

// String returns "e", "hh" or "lh", the names used in transition labels
// such as e1-hh1.
func (c Carrier) String() string {
	switch c {
	case Electron:
		return "e"
	case HeavyHole:
		return "hh"
	case LightHole:
		return "lh"
	}
	return "Carrier(" + strconv.Itoa(int(c)) + ")"
}

// mass returns the carrier's mass along the growth direction in m.
func (c Carrier) mass(m Material) float64 {
	switch c {
	case Electron:
		return m.ElectronMass
	case HeavyHole:
		return m.HeavyHoleMass()
	default:
		return m.LightHoleMass()
	}
}

// edge returns the carrier's band edge in m at temperature T, in eV on the
// absolute scale, and the sign that turns it into the carrier's own energy
// (+1 for electrons, −1 for holes, whose energies grow downwards).
func (c Carrier) edge(m Material, T float64) (e, sign float64) {
	if c == Electron {
		return m.VBO + m.Gamma.At(T), 1
	}
	return m.VBO, -1
}

// CarrierWell is one carrier's view of a [Structure] in its own reduced
// units: the stack and the reduced field to solve with any [Solver].
type CarrierWell struct {
	Carrier Carrier
	// Well is the physical scale: the reference well's thickness and the
	// carrier's mass in it along the growth direction (m₀).
	Well Well
	// Stack holds the slabs in the carrier's reduced units: widths in units
	// of the well thickness L, masses as ratios to the carrier's mass in
	// the well, and band edges in units of its E₁ measured from its band
	// edge in the well: from the conduction-band edge upwards for the
	// electron, from the valence-band edge downwards for the holes, so a
	// hole's barrier height is the valence-band offset.
	Stack Stack
	// F is the reduced field the carrier sees: F/F₀ for the electron and
	// −F/F₀ for the holes, which the field pushes the other way (F₀ from
	// the carrier's own mass; see [Well.FieldUnit]).
	F float64
	// E1 is the carrier's energy unit E₁ = ħ²π²/(2m*L²) in eV: a level η
	// lies η·E1 eV from the carrier's band edge in the well (above Ec for
	// the electron, below Ev for a hole).
	E1 float64
	// Edge is the carrier's band edge in the well, in eV on the absolute
	// scale of [Material.VBO]: Ec for the electron, Ev for the holes.
	Edge float64
}

// Reduced is a [Structure] reduced to the problems of its carriers. A
// transition between electron level η_e and hole level η_h has the energy
//
//	E = Gap + η_e E1_e + η_h E1_h
//
// in eV, in the single-particle picture (no exciton binding): both levels
// are measured from their band edges at the centre of the well, where the
// field's potential vanishes.
type Reduced struct {
	// Temperature is in K and Field in V/m, as in the Structure.
	Temperature, Field float64
	// Gap is the Γ band gap of the reference well at Temperature, in eV.
	Gap float64
	// Carriers holds the heavy hole, light hole and electron, indexed by
	// [Carrier]: Carriers[Electron] is the electron.
	Carriers [3]CarrierWell
}

// StructureError reports an invalid [Structure]. It wraps [ErrUnits], or
// [ErrField] for a field that is not a finite number.
type StructureError struct {
	// Slab is the index of the offending slab, or −1 if the structure as a
	// whole is at fault (too few slabs, the temperature, the field).
	Slab int
	// Material is the slab's material name, if any.
	Material string
	// What names the quantity and Value is its value.
	What  string
	Value float64
	// Why says what is wrong.
	Why string
	// Err is the wrapped sentinel or underlying error.
	Err error
}

func (e *StructureError) Error() string {
	where := "tiltwell: structure: "
	if e.Slab >= 0 {
		where += "slab " + strconv.Itoa(e.Slab)
		if e.Material != "" {
			where += " (" + e.Material + ")"
		}
		where += ": "
	}
	return fmt.Sprintf("%s%s %v: %s: %v", where, e.What, e.Value, e.Why, e.Err)
}

// Unwrap returns the wrapped error.
func (e *StructureError) Unwrap() error { return e.Err }

// Reduce checks the structure and returns its reduced problems: for the
// electron, the heavy hole and the light hole, the [Well] (width = the
// reference well's thickness, mass = the carrier's mass there along
// [001]), the [Stack] of band edges and mass ratios, the reduced field and
// E₁ in eV; and the well's band gap, so that transition energies can be
// formed in eV (see [Reduced]).
//
// It returns a [*StructureError] naming the value for: fewer than three
// slabs or more than [MaxLayers]; a Well index that is not an inner slab;
// a temperature outside (0, MaxTemperature] or NaN; a field that is NaN or
// infinite, or so large that a reduced field overflows ([ErrField]); an outer slab with a nonzero thickness or an
// inner one whose thickness is not a finite positive number; a material
// that fails [Material.Validate]; a slab mismatched to the substrate by
// more than Mismatch; an indirect slab unless AllowIndirect; and a
// structure whose reduced units fall outside what [NewWell] and
// [NewStack] accept (layers more than [MaxLayerWidth] well widths thick,
// mass ratios beyond [MinMass, MaxMass]).
func (s Structure) Reduce() (Reduced, error) {
	n := len(s.Slabs)
	whole := func(what string, v float64, why string, err error) error {
		return &StructureError{Slab: -1, What: what, Value: v, Why: why, Err: err}
	}
	if n < 3 || n > MaxLayers {
		return Reduced{}, whole("slab count", float64(n), "need 3 to "+strconv.Itoa(MaxLayers)+" (two semi-infinite outer slabs and the well)", ErrUnits)
	}
	if s.Well < 1 || s.Well > n-2 {
		return Reduced{}, whole("well index", float64(s.Well), "must name an inner slab, 1.."+strconv.Itoa(n-2), ErrUnits)
	}
	T := s.Temperature
	if err := checkTemperature(T); err != nil {
		return Reduced{}, whole("temperature (K)", T, "need 0 < T ≤ "+strconv.FormatFloat(MaxTemperature, 'g', -1, 64)+" K", ErrUnits)
	}
	if math.IsNaN(s.Field) || math.IsInf(s.Field, 0) {
		return Reduced{}, whole("field (V/m)", s.Field, "must be a finite number", ErrField)
	}
	tol := s.Mismatch
	switch {
	case tol == 0:
		tol = DefaultMismatch
	case !(tol > 0):
		return Reduced{}, whole("mismatch tolerance", tol, "must be positive (0 for the default, +Inf for no check)", ErrUnits)
	}
	sub := s.Substrate
	if sub.Lattice == 0 {
		sub = s.Slabs[0].Material
	} else if err := sub.Validate(); err != nil {
		return Reduced{}, &StructureError{Slab: -1, Material: sub.Name, What: "substrate", Value: sub.Lattice, Why: "invalid material", Err: err}
	}

	for i, sl := range s.Slabs {
		m := sl.Material
		bad := func(what string, v float64, why string, err error) error {
			return &StructureError{Slab: i, Material: m.Name, What: what, Value: v, Why: why, Err: err}
		}
		outer := i == 0 || i == n-1
		switch {
		case outer && sl.Thickness != 0:
			return Reduced{}, bad("thickness (m)", sl.Thickness, "an outer slab is semi-infinite; its thickness must be 0", ErrUnits)
		case !outer && !(sl.Thickness > 0 && !math.IsInf(sl.Thickness, 1)):
			return Reduced{}, bad("thickness (m)", sl.Thickness, "an inner slab's thickness must be a finite positive number", ErrUnits)
		}
		if err := m.Validate(); err != nil {
			return Reduced{}, bad("material", m.Composition, "invalid material", err)
		}
		// Validate and checkTemperature ensure a finite lattice mismatch.
		mis, _ := m.Mismatch(sub, T)
		if math.Abs(mis) > tol {
			return Reduced{}, bad("lattice mismatch", mis, fmt.Sprintf("beyond ±%g to the substrate %s: strain is outside the model", tol, sub.Name), ErrUnits)
		}
		if ind, valley, margin, _ := m.Indirect(T); ind && !s.AllowIndirect {
			return Reduced{}, bad("composition", m.Composition,
				fmt.Sprintf("indirect at %g K (the %s valley is %.3g eV below Γ): outside the Γ-valley model (set AllowIndirect to accept it)", T, valley, margin), ErrUnits)
		}
	}

	wm := s.Slabs[s.Well].Material
	r := Reduced{Temperature: T, Field: s.Field, Gap: wm.Gamma.At(T)}
	L := s.Slabs[s.Well].Thickness
	layers := make([]Layer, n)
	for _, c := range [...]Carrier{Electron, HeavyHole, LightHole} {
		mass := c.mass(wm)
		w, err := NewWell(L, mass)
		if err != nil {
			return Reduced{}, &StructureError{Slab: s.Well, Material: wm.Name, What: c.String() + " well", Value: L,
				Why: "no physical scale", Err: err}
		}
		e1 := w.EnergyUnit() / ElementaryCharge // eV
		edge, sign := c.edge(wm, T)
		for i, sl := range s.Slabs {
			e, _ := c.edge(sl.Material, T)
			layers[i] = Layer{
				Width: sl.Thickness / L,
				Edge:  sign * (e - edge) / e1,
				Mass:  c.mass(sl.Material) / mass,
			}
		}
		// The reference well exactly as NewStack requires it.
		layers[s.Well] = Layer{Width: 1, Mass: 1}
		st, err := NewStack(layers, s.Well)
		if err != nil {
			return Reduced{}, &StructureError{Slab: -1, What: c.String() + " stack", Value: float64(n),
				Why: "outside the reduced units' limits", Err: err}
		}
		f := sign * w.Reduced(s.Field)
		if math.IsInf(f, 0) {
			return Reduced{}, &StructureError{Slab: -1, What: "field (V/m)", Value: s.Field,
				Why: fmt.Sprintf("the %v's reduced field F/F₀ overflows (F₀ = %g V/m)", c, w.FieldUnit()), Err: ErrField}
		}
		r.Carriers[c] = CarrierWell{
			Carrier: c,
			Well:    w,
			Stack:   st,
			F:       f,
			E1:      e1,
			Edge:    edge,
		}
	}
	return r, nil
}

// mustStructure returns the demo structure or panics: the demos are built
// from constant, valid compositions, so an error is a broken invariant.
func mustStructure(barrier, well func() (Material, error), width float64, sub Material) Structure {
	b, err := barrier()
	if err != nil {
		panic(err)
	}
	w, err := well()
	if err != nil {
		panic(err)
	}
	return Structure{
		Slabs:       []Slab{{Material: b}, {Material: w, Thickness: width}, {Material: b}},
		Well:        1,
		Temperature: 300,
		Substrate:   sub,
	}
}

// DemoGaAsWell returns an invented demo structure: a 10 nm GaAs well
// between semi-infinite Al0.3Ga0.7As barriers on a GaAs substrate, at
// 300 K and zero field (set Field to tilt it). Its reduced stacks (barrier
// v in E₁, mass ratio μ) are, as the package tests measure them:
//
//	electron    E₁ = 56.12 meV  v =  4.620  μ = 1.372
//	heavy hole  E₁ = 10.75 meV  v = 14.785  μ = 1.084
//	light hole  E₁ = 41.74 meV  v =  3.809  μ = 1.182
//
// and its zero-field e1–hh1 transition is at 1.4611 eV (848.6 nm) in the
// single-particle picture.
func DemoGaAsWell() Structure {
	return mustStructure(
		func() (Material, error) { return AlGaAs(0.3) },
		func() (Material, error) { return GaAs(), nil },
		10e-9, GaAs())
}

// DemoInGaAsWidth is the well width of [DemoInGaAsWell], in metres.
const DemoInGaAsWidth = 9.4e-9

// DemoInGaAsWell returns an invented demo structure for the 1.55 µm band:
// an In0.53Ga0.47As well between semi-infinite In0.52Al0.48As barriers,
// both lattice-matched to the InP substrate, at 300 K and zero field.
// The width, [DemoInGaAsWidth] = 9.4 nm (about 32 monolayers), is our
// estimate of the width that puts the zero-field e1–hh1 transition at
// 1.55 µm: in the single-particle picture, from the finite-well levels,
// it is at 0.7992 eV (1551 nm). The estimate leaves out the exciton
// binding energy (a few meV) and strain. The reduced stacks are
//
//	electron    E₁ = 98.96 meV  v =  5.275  μ = 1.704
//	heavy hole  E₁ = 11.28 meV  v = 16.962  μ = 1.029
//	light hole  E₁ = 82.42 meV  v =  2.322  μ = 0.887
func DemoInGaAsWell() Structure {
	return mustStructure(
		func() (Material, error) { return InAlAs(0.52) },
		func() (Material, error) { return InGaAs(0.53) },
		DemoInGaAsWidth, InP())
}
