package tiltwell

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
)

// Limits on the layers of a [Stack]. They keep every method's arithmetic
// finite (no square of a band edge or a width overflows) and every
// per-layer table small; real structures sit far inside them.
const (
	// MaxLayers is the largest number of layers in a Stack, outer layers
	// included.
	MaxLayers = 1000
	// MaxEdge is the largest |Edge| of a layer, in E₁.
	MaxEdge = 1e300
	// MaxLayerWidth is the largest Width of an inner layer, in units of
	// the reference width L.
	MaxLayerWidth = 1e4
	// MinMass and MaxMass bound a layer's mass ratio μ.
	MinMass, MaxMass = 1e-6, 1e6
)

// Layer is one layer of a [Stack]: a slab in which the carrier has one band
// edge and one effective mass, in the reduced units of the stack's
// reference well.
type Layer struct {
	// Width is the thickness in units of the reference width L. The first
	// and last layers of a stack are semi-infinite: their Width must be 0.
	Width float64
	// Edge is the band edge v in units of E₁, measured from the band edge
	// of the reference well: the barrier height, for a barrier.
	Edge float64
	// Mass is the ratio μ = m/m* of the layer's effective mass to the
	// reference well's.
	Mass float64
}

// Stack is the layer structure a carrier moves in: a band edge and an
// effective mass that are constant in each layer, the layers ordered
// left to right along +ξ (the direction of the field), the first and the
// last semi-infinite. One inner layer is the reference well, which fixes
// the reduced units: it spans ξ ∈ [0, 1] and has Edge 0 and Mass 1, and
// the field's potential f(ξ − ½) vanishes at its centre. In these units
// the Hamiltonian is (BenDaniel–Duke, with μ(ξ) the mass ratio and v(ξ) the
// band edge)
//
//	H = −(1/π²) d/dξ (1/μ(ξ)) d/dξ + v(ξ) + f (ξ − ½),
//
// with φ and (1/μ) dφ/dξ continuous at every interface (D. J. BenDaniel and
// C. B. Duke, Phys. Rev. 152, 683 (1966)).
//
// The zero value is the reference well alone between infinitely high
// walls, the model every method solves by default. Other stacks come from
// [FiniteWell], [AsymmetricWell] and [NewStack], which validate them. A
// Stack is immutable: it holds its own copy of the layers, so one value
// may be shared by many solvers and goroutines.
type Stack struct {
	layers []Layer
	// left[i] is the ξ of the left edge of layer i (−Inf for layer 0).
	left []float64
	ref  int
}

// LayerError reports an invalid layer or layer list given to [NewStack],
// [FiniteWell] or [AsymmetricWell]. It wraps [ErrUnits].
type LayerError struct {
	// Layer is the index of the offending layer, or −1 if the list as a
	// whole is at fault (too few layers, a bad reference index).
	Layer int
	// What names the quantity ("width", "edge", "mass", "reference"), and
	// Value is its value.
	What  string
	Value float64
	// Why says what is wrong with it.
	Why string
}

func (e *LayerError) Error() string {
	if e.Layer < 0 {
		return fmt.Sprintf("tiltwell: stack: %s %v: %s: %v", e.What, e.Value, e.Why, ErrUnits)
	}
	return fmt.Sprintf("tiltwell: stack: layer %d: %s %v: %s: %v", e.Layer, e.What, e.Value, e.Why, ErrUnits)
}

// Unwrap returns [ErrUnits].
func (e *LayerError) Unwrap() error { return ErrUnits }

// FiniteWell returns the symmetric finite well: the reference well between
// two semi-infinite barriers of height barrier (in E₁) in which the
// carrier's mass is mass times its mass in the well. A 10 nm GaAs well in
// Al₀.₃Ga₀.₇As, for its electron at 300 K, is FiniteWell(4.62, 1.372) with
// the parameters of [GaAs] and [AlGaAs] (see [DemoGaAsWell]).
func FiniteWell(barrier, mass float64) (Stack, error) {
	return AsymmetricWell(barrier, mass, barrier, mass)
}

// AsymmetricWell returns the reference well between a left barrier of
// height left (E₁) and mass ratio massLeft and a right barrier of height
// right and mass ratio massRight.
func AsymmetricWell(left, massLeft, right, massRight float64) (Stack, error) {
	return NewStack([]Layer{{Edge: left, Mass: massLeft}, {Width: 1, Mass: 1}, {Edge: right, Mass: massRight}}, 1)
}

// NewStack returns the stack of the given layers, left to right, with
// layers[ref] the reference well. It copies layers.
//
// It returns a [*LayerError] (wrapping [ErrUnits]) unless: there are 3 to
// [MaxLayers] layers; ref is an inner layer (1 ≤ ref ≤ len(layers) − 2)
// equal to Layer{Width: 1, Edge: 0, Mass: 1}; the outer layers have Width
// 0; every inner Width is in (0, MaxLayerWidth]; every Edge is finite with
// |Edge| ≤ MaxEdge; and every Mass is in [MinMass, MaxMass].
func NewStack(layers []Layer, ref int) (Stack, error) {
	n := len(layers)
	if n < 3 || n > MaxLayers {
		return Stack{}, &LayerError{Layer: -1, What: "layer count", Value: float64(n), Why: "need 3 to " + strconv.Itoa(MaxLayers) + " (two semi-infinite outer layers and at least the reference well)"}
	}
	if ref < 1 || ref > n-2 {
		return Stack{}, &LayerError{Layer: -1, What: "reference index", Value: float64(ref), Why: "must name an inner layer, 1.." + strconv.Itoa(n-2)}
	}
	for i, l := range layers {
		outer := i == 0 || i == n-1
		switch {
		case outer && l.Width != 0:
			return Stack{}, &LayerError{Layer: i, What: "width", Value: l.Width, Why: "an outer layer is semi-infinite; its width must be 0"}
		case !outer && !(l.Width > 0 && l.Width <= MaxLayerWidth):
			return Stack{}, &LayerError{Layer: i, What: "width", Value: l.Width, Why: "an inner layer's width must be in (0, " + strconv.FormatFloat(MaxLayerWidth, 'g', -1, 64) + "] (units of L)"}
		case !(math.Abs(l.Edge) <= MaxEdge):
			return Stack{}, &LayerError{Layer: i, What: "edge", Value: l.Edge, Why: "a band edge must be finite, at most 1e300 E₁ in size"}
		case !(l.Mass >= MinMass && l.Mass <= MaxMass):
			return Stack{}, &LayerError{Layer: i, What: "mass", Value: l.Mass, Why: "a mass ratio must be in [1e-06, 1e+06]"}
		}
	}
	if r := layers[ref]; r != (Layer{Width: 1, Mass: 1}) {
		return Stack{}, &LayerError{Layer: ref, What: "reference", Value: float64(ref),
			Why: fmt.Sprintf("the reference well must be {Width: 1, Edge: 0, Mass: 1}, not %+v", r)}
	}
	s := Stack{layers: append([]Layer(nil), layers...), left: make([]float64, n), ref: ref}
	s.left[0] = math.Inf(-1)
	// Edges from the reference well outwards, so that the reference's own
	// edges are exactly 0 and 1.
	s.left[ref], s.left[ref+1] = 0, 1
	for i := ref - 1; i >= 1; i-- {
		s.left[i] = s.left[i+1] - layers[i].Width
	}
	for i := ref + 2; i < n; i++ {
		s.left[i] = s.left[i-1] + layers[i-1].Width
	}
	return s, nil
}

// Infinite reports whether s is the zero Stack: the reference well between
// infinitely high walls.
func (s Stack) Infinite() bool { return s.layers == nil }

// Len returns the number of layers, outer layers included; 0 for infinite
// walls.
func (s Stack) Len() int { return len(s.layers) }

// Ref returns the index of the reference well among the layers (0 for
// infinite walls).
func (s Stack) Ref() int { return s.ref }

// Layers appends the layers, left to right, to dst[:0] and returns the
// result. If dst is nil, a new slice is allocated and returned. For
// infinite walls it returns dst[:0].
func (s Stack) Layers(dst []Layer) []Layer { return append(dst[:0], s.layers...) }

// Layer returns layer i (0 ≤ i < Len()) and true, or the zero Layer and
// false for an i out of range.
func (s Stack) Layer(i int) (Layer, bool) {
	if i < 0 || i >= len(s.layers) {
		return Layer{}, false
	}
	return s.layers[i], true
}

// Interfaces appends the positions ξ of the Len() − 1 interfaces, in
// increasing order, to dst[:0] and returns the result: for a single finite
// well, 0 and 1. For infinite walls it appends the walls, 0 and 1.
func (s Stack) Interfaces(dst []float64) []float64 {
	dst = dst[:0]
	if s.Infinite() {
		return append(dst, 0, 1)
	}
	return append(dst, s.left[1:]...)
}

// Span returns the interval [lo, hi] of layer i in ξ: lo = −Inf for the
// first layer, hi = +Inf for the last. For an i out of range, or infinite
// walls, it returns NaN, NaN.
func (s Stack) Span(i int) (lo, hi float64) {
	if i < 0 || i >= len(s.layers) {
		return math.NaN(), math.NaN()
	}
	lo, hi = s.left[i], math.Inf(1)
	if i+1 < len(s.layers) {
		hi = s.left[i+1]
	}
	return lo, hi
}

// Index returns the layer that holds ξ: the i with Span(i) containing ξ,
// the layer on the right at an interface. For infinite walls, and for a
// NaN ξ, it returns −1.
func (s Stack) Index(xi float64) int {
	if s.Infinite() || math.IsNaN(xi) {
		return -1
	}
	// The last left edge at or below ξ (left[0] = −Inf).
	lo, hi := 0, len(s.left)-1
	for lo < hi {
		mid := (lo + hi + 1) / 2
		if s.left[mid] <= xi {
			lo = mid
		} else {
			hi = mid - 1
		}
	}
	return lo
}

// At returns the band edge v(ξ) (E₁) and the mass ratio μ(ξ) at ξ, the
// layer on the right at an interface. For infinite walls it returns
// (0, 1) inside [0, 1] and (+Inf, 1) outside; for a NaN ξ, (NaN, NaN).
func (s Stack) At(xi float64) (edge, mass float64) {
	if math.IsNaN(xi) {
		return math.NaN(), math.NaN()
	}
	if s.Infinite() {
		if xi >= 0 && xi <= 1 {
			return 0, 1
		}
		return math.Inf(1), 1
	}
	l := s.layers[s.Index(xi)]
	return l.Edge, l.Mass
}

// Outer returns the left and right semi-infinite layers; for infinite
// walls, both have Edge +Inf and Mass 1.
func (s Stack) Outer() (left, right Layer) {
	if s.Infinite() {
		w := Layer{Edge: math.Inf(1), Mass: 1}
		return w, w
	}
	return s.layers[0], s.layers[len(s.layers)-1]
}

// Mirror returns the stack reflected about the centre of the reference
// well, ξ → 1 − ξ: the layers in reverse order. A level of s at field −f
// is the level of s.Mirror() at field f, and its wavefunction is the
// mirrored one (see [Stack.Fold]).
func (s Stack) Mirror() Stack {
	if s.Infinite() {
		return s
	}
	n := len(s.layers)
	m := Stack{layers: make([]Layer, n), left: make([]float64, n), ref: n - 1 - s.ref}
	for i, l := range s.layers {
		m.layers[n-1-i] = l
	}
	m.left[0] = math.Inf(-1)
	for i := 1; i < n; i++ {
		// Layer n−i of s ends where mirrored layer i begins.
		m.left[i] = 1 - s.left[n-i]
	}
	return m
}

// Symmetric reports whether s equals its mirror image, so that its levels
// are even in the field. Infinite walls are symmetric.
func (s Stack) Symmetric() bool { return s.Equal(s.Mirror()) }

// Fold returns the stack and the field a method computes with for the
// field f: s and f for f ≥ 0, and the mirror image s.Mirror() and −f for
// f < 0, with mirrored = true. The levels at (s, f) are those at the
// folded pair; a wavefunction at (s, f) is ξ ↦ σ φ(1 − ξ) for the folded
// pair's φ, with the sign σ = ±1 that restores the sign convention of
// [Wavefunction].
func (s Stack) Fold(f float64) (folded Stack, af float64, mirrored bool) {
	af, mirrored = Fold(f)
	if mirrored {
		return s.Mirror(), af, true
	}
	return s, af, false
}

// Equal reports whether s and t describe the same layers with the same
// reference well.
func (s Stack) Equal(t Stack) bool {
	if len(s.layers) != len(t.layers) || s.ref != t.ref {
		return false
	}
	for i := range s.layers {
		if s.layers[i] != t.layers[i] {
			return false
		}
	}
	return true
}

// String describes the stack as its layers, "[v=4.3 μ=1.37 | w=1 v=0 μ=1
// (ref) | v=4.3 μ=1.37]", or "infinite walls".
func (s Stack) String() string {
	if s.Infinite() {
		return "infinite walls"
	}
	var b strings.Builder
	b.WriteByte('[')
	for i, l := range s.layers {
		if i > 0 {
			b.WriteString(" | ")
		}
		if i > 0 && i < len(s.layers)-1 {
			b.WriteString("w=")
			b.WriteString(strconv.FormatFloat(l.Width, 'g', -1, 64))
			b.WriteByte(' ')
		}
		b.WriteString("v=")
		b.WriteString(strconv.FormatFloat(l.Edge, 'g', -1, 64))
		b.WriteString(" μ=")
		b.WriteString(strconv.FormatFloat(l.Mass, 'g', -1, 64))
		if i == s.ref {
			b.WriteString(" (ref)")
		}
	}
	b.WriteByte(']')
	return b.String()
}

// ConfinedError reports that a well confines fewer levels than were asked
// for: a finite well binds finitely many levels at zero field, and under a
// field a level that is no longer confined (by the method's documented
// criterion) ends the list. It wraps [ErrLevel]. A [Solver]'s Levels
// returns the Confined levels below the first unconfined one together with
// this error.
type ConfinedError struct {
	// Method names the method, such as "exact".
	Method string
	// F is the reduced field.
	F float64
	// Asked is the number of levels asked for, Confined the number the
	// well confines at F (fewer than Asked).
	Asked, Confined int
	// Why says, for the first unconfined level, why it is not confined
	// (above the barrier, too broad); it may be empty.
	Why string
}

func (e *ConfinedError) Error() string {
	s := fmt.Sprintf("%s: %d levels asked for at f = %g, the well confines %d", e.Method, e.Asked, e.F, e.Confined)
	if e.Why != "" {
		s += " (" + e.Why + ")"
	}
	return s + ": " + ErrLevel.Error()
}

// Unwrap returns [ErrLevel].
func (e *ConfinedError) Unwrap() error { return ErrLevel }

// Confined returns the number of confined levels reported by err, and
// true, if err is or wraps a [*ConfinedError]; otherwise 0 and false.
func Confined(err error) (int, bool) {
	var ce *ConfinedError
	if errors.As(err, &ce) {
		return ce.Confined, true
	}
	return 0, false
}
