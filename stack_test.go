package tiltwell_test

import (
	"errors"
	"math"
	"slices"
	"testing"

	"github.com/tiltwell/tiltwell"
)

// A stepped double well, invented for these tests: barrier 5 | well of
// width 0.5 at edge −1 | the reference well | barrier 2, width 0.3 | well
// 0.7 at edge 0.5 | barrier 8, heavier.
var stepped = []tiltwell.Layer{
	{Edge: 5, Mass: 1.2},
	{Width: 0.5, Edge: -1, Mass: 0.9},
	{Width: 1, Mass: 1},
	{Width: 0.3, Edge: 2, Mass: 1.3},
	{Width: 0.7, Edge: 0.5, Mass: 1},
	{Edge: 8, Mass: 1.5},
}

func TestStackGeometry(t *testing.T) {
	t.Parallel()
	s, err := tiltwell.NewStack(stepped, 2)
	if err != nil {
		t.Fatal(err)
	}
	if got, want := s.Interfaces(nil), []float64{-0.5, 0, 1, 1.3, 2}; !slices.Equal(got, want) {
		t.Errorf("interfaces %v, want %v", got, want)
	}
	for _, tc := range []struct {
		xi         float64
		i          int
		edge, mass float64
	}{
		{-10, 0, 5, 1.2}, {-0.5, 1, -1, 0.9}, {-0.1, 1, -1, 0.9}, {0, 2, 0, 1}, {0.5, 2, 0, 1},
		{1, 3, 2, 1.3}, {1.29, 3, 2, 1.3}, {1.3, 4, 0.5, 1}, {2, 5, 8, 1.5}, {1e10, 5, 8, 1.5},
	} {
		if i := s.Index(tc.xi); i != tc.i {
			t.Errorf("Index(%g) = %d, want %d", tc.xi, i, tc.i)
		}
		if e, m := s.At(tc.xi); e != tc.edge || m != tc.mass {
			t.Errorf("At(%g) = %g, %g; want %g, %g", tc.xi, e, m, tc.edge, tc.mass)
		}
	}
	if lo, hi := s.Span(0); !math.IsInf(lo, -1) || hi != -0.5 {
		t.Errorf("Span(0) = %g, %g", lo, hi)
	}
	if lo, hi := s.Span(5); lo != 2 || !math.IsInf(hi, 1) {
		t.Errorf("Span(5) = %g, %g", lo, hi)
	}
	if lo, hi := s.Span(6); !math.IsNaN(lo) || !math.IsNaN(hi) {
		t.Errorf("Span(6) = %g, %g, want NaN", lo, hi)
	}
	if _, ok := s.Layer(-1); ok {
		t.Error("Layer(-1) reported ok")
	}
	if l, ok := s.Layer(3); !ok || l != stepped[3] {
		t.Errorf("Layer(3) = %+v, %v", l, ok)
	}
	if s.Symmetric() {
		t.Error("stepped stack reported symmetric")
	}
	// The stack holds its own copy.
	mod := slices.Clone(stepped)
	s2, _ := tiltwell.NewStack(mod, 2)
	mod[0].Edge = 99
	if l, _ := s2.Layer(0); l.Edge != 5 {
		t.Error("NewStack did not copy its layers")
	}
}

// TestStackMirror: ξ → 1 − ξ reverses the layers and maps each interface
// x to 1 − x; mirroring twice gives the stack back.
func TestStackMirror(t *testing.T) {
	t.Parallel()
	s, err := tiltwell.NewStack(stepped, 2)
	if err != nil {
		t.Fatal(err)
	}
	m := s.Mirror()
	if m.Ref() != 3 {
		t.Errorf("mirrored reference index %d, want 3", m.Ref())
	}
	if got, want := m.Interfaces(nil), []float64{-1, -0.30000000000000004, 0, 1, 1.5}; !slices.Equal(got, want) {
		t.Errorf("mirrored interfaces %v, want %v", got, want)
	}
	for _, xi := range []float64{-3, -0.7, -0.2, 0.25, 0.9, 1.1, 1.6, 4} {
		e1, m1 := s.At(xi)
		e2, m2 := m.At(1 - xi)
		if e1 != e2 || m1 != m2 {
			t.Errorf("At(%g) = %g, %g but mirror At(%g) = %g, %g", xi, e1, m1, 1-xi, e2, m2)
		}
	}
	if !m.Mirror().Equal(s) {
		t.Errorf("mirror of mirror %v, want %v", m.Mirror(), s)
	}
	f, af, mir := s.Fold(-3)
	if !f.Equal(m) || af != 3 || !mir {
		t.Errorf("Fold(-3) = %v, %g, %v", f, af, mir)
	}
	f, af, mir = s.Fold(2)
	if !f.Equal(s) || af != 2 || mir {
		t.Errorf("Fold(2) = %v, %g, %v", f, af, mir)
	}
}

func TestFiniteWell(t *testing.T) {
	t.Parallel()
	s, err := tiltwell.FiniteWell(4.3, 1.37)
	if err != nil {
		t.Fatal(err)
	}
	if !s.Symmetric() || s.Infinite() || s.Len() != 3 || s.Ref() != 1 {
		t.Errorf("FiniteWell: symmetric %v, infinite %v, %d layers, ref %d", s.Symmetric(), s.Infinite(), s.Len(), s.Ref())
	}
	if got := s.String(); got != "[v=4.3 μ=1.37 | w=1 v=0 μ=1 (ref) | v=4.3 μ=1.37]" {
		t.Errorf("String() = %q", got)
	}
	a, err := tiltwell.AsymmetricWell(3, 1, 5, 2)
	if err != nil {
		t.Fatal(err)
	}
	if a.Symmetric() {
		t.Error("asymmetric well reported symmetric")
	}
	l, r := a.Mirror().Outer()
	if l != (tiltwell.Layer{Edge: 5, Mass: 2}) || r != (tiltwell.Layer{Edge: 3, Mass: 1}) {
		t.Errorf("mirrored outer layers %+v %+v", l, r)
	}
	var inf tiltwell.Stack
	if !inf.Infinite() || !inf.Symmetric() || inf.String() != "infinite walls" || inf.Index(0.5) != -1 {
		t.Error("zero Stack is not the infinite well")
	}
	if e, _ := inf.At(1.5); !math.IsInf(e, 1) {
		t.Errorf("infinite walls: edge %g outside the well", e)
	}
	if got := inf.Interfaces(nil); !slices.Equal(got, []float64{0, 1}) {
		t.Errorf("infinite walls: interfaces %v", got)
	}
}

// TestStackErrors: each bad layer is refused with a LayerError naming it.
func TestStackErrors(t *testing.T) {
	t.Parallel()
	ok := func() []tiltwell.Layer { return slices.Clone(stepped) }
	for _, tc := range []struct {
		name   string
		layers []tiltwell.Layer
		ref    int
		layer  int
		what   string
	}{
		{"too few", stepped[:2], 1, -1, "layer count"},
		{"ref outer", ok(), 0, -1, "reference index"},
		{"ref last", ok(), 5, -1, "reference index"},
		{"ref not unit", ok(), 1, 1, "reference"},
		{"outer width", func() []tiltwell.Layer { l := ok(); l[0].Width = 1; return l }(), 2, 0, "width"},
		{"negative width", func() []tiltwell.Layer { l := ok(); l[3].Width = -0.1; return l }(), 2, 3, "width"},
		{"zero width", func() []tiltwell.Layer { l := ok(); l[3].Width = 0; return l }(), 2, 3, "width"},
		{"NaN width", func() []tiltwell.Layer { l := ok(); l[4].Width = math.NaN(); return l }(), 2, 4, "width"},
		{"huge width", func() []tiltwell.Layer { l := ok(); l[4].Width = 1e5; return l }(), 2, 4, "width"},
		{"NaN edge", func() []tiltwell.Layer { l := ok(); l[5].Edge = math.NaN(); return l }(), 2, 5, "edge"},
		{"Inf edge", func() []tiltwell.Layer { l := ok(); l[0].Edge = math.Inf(1); return l }(), 2, 0, "edge"},
		{"zero mass", func() []tiltwell.Layer { l := ok(); l[1].Mass = 0; return l }(), 2, 1, "mass"},
		{"negative mass", func() []tiltwell.Layer { l := ok(); l[5].Mass = -1; return l }(), 2, 5, "mass"},
		{"NaN mass", func() []tiltwell.Layer { l := ok(); l[3].Mass = math.NaN(); return l }(), 2, 3, "mass"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			s, err := tiltwell.NewStack(tc.layers, tc.ref)
			var le *tiltwell.LayerError
			if !errors.As(err, &le) || !errors.Is(err, tiltwell.ErrUnits) {
				t.Fatalf("error %v, want a LayerError wrapping ErrUnits", err)
			}
			if le.Layer != tc.layer || le.What != tc.what {
				t.Errorf("error names layer %d %q, want %d %q (%v)", le.Layer, le.What, tc.layer, tc.what, err)
			}
			if !s.Infinite() {
				t.Errorf("a refused stack came back non-zero: %v", s)
			}
		})
	}
	if _, err := tiltwell.FiniteWell(math.NaN(), 1); !errors.Is(err, tiltwell.ErrUnits) {
		t.Errorf("FiniteWell(NaN, 1): %v", err)
	}
	if _, err := tiltwell.FiniteWell(1e300, 1); err != nil {
		t.Errorf("FiniteWell(1e300, 1): %v", err)
	}
}

func TestConfinedError(t *testing.T) {
	t.Parallel()
	err := error(&tiltwell.ConfinedError{Method: "exact", F: 2, Asked: 5, Confined: 3, Why: "level 4 above the barrier"})
	if !errors.Is(err, tiltwell.ErrLevel) {
		t.Errorf("%v does not wrap ErrLevel", err)
	}
	if n, ok := tiltwell.Confined(err); n != 3 || !ok {
		t.Errorf("Confined = %d, %v", n, ok)
	}
	if n, ok := tiltwell.Confined(tiltwell.ErrLevel); n != 0 || ok {
		t.Errorf("Confined(ErrLevel) = %d, %v", n, ok)
	}
	want := "exact: 5 levels asked for at f = 2, the well confines 3 (level 4 above the barrier): tiltwell: level not available"
	if err.Error() != want {
		t.Errorf("%q, want %q", err.Error(), want)
	}
}

// TestMirrorNil: the mirror of a nil wavefunction is zero, not a panic.
func TestMirrorNil(t *testing.T) {
	t.Parallel()
	if v := tiltwell.Mirror(nil, 1).At(0.5); v != 0 {
		t.Errorf("Mirror(nil, 1).At(0.5) = %g", v)
	}
}

// TestMirrorOutside: for infinite walls the mirror is 0 outside [0, 1],
// even where 1 − ξ rounds onto the wall and w(1) is a rounding residue
// (common practice, no source: the Wavefunction contract).
func TestMirrorOutside(t *testing.T) {
	t.Parallel()
	m := tiltwell.Mirror(tiltwell.WaveFunc(func(xi float64) float64 { return 1 }), 1)
	for _, xi := range []float64{-1e-300, -0.25, 1 + 1e-15, 2} {
		if v := m.At(xi); v != 0 {
			t.Errorf("Mirror(w, 1).At(%g) = %g, want 0", xi, v)
		}
	}
	if v := m.At(0.5); v != 1 {
		t.Errorf("Mirror(w, 1).At(0.5) = %g, want 1", v)
	}
}

// spreadWave is a test wavefunction that reaches beyond [0, 1].
type spreadWave struct{}

func (spreadWave) At(xi float64) float64     { return math.Exp(-xi * xi) }
func (spreadWave) Support() (lo, hi float64) { return -2, 1.5 }

// TestMirrorSpread: a mirrored wavefunction keeps its tails and mirrors
// its support.
func TestMirrorSpread(t *testing.T) {
	t.Parallel()
	m := tiltwell.Mirror(spreadWave{}, 2)
	if lo, hi := tiltwell.Support(m); lo != -0.5 || hi != 3 {
		t.Errorf("mirrored support [%g, %g], want [-0.5, 3]", lo, hi)
	}
	if got, want := m.At(2.5), -math.Exp(-2.25); got != want {
		t.Errorf("mirrored At(2.5) = %g, want %g", got, want)
	}
	if lo, hi := tiltwell.Support(tiltwell.WaveFunc(math.Sin)); lo != 0 || hi != 1 {
		t.Errorf("default support [%g, %g], want [0, 1]", lo, hi)
	}
}
