package bigstack

import (
	"errors"
	"fmt"
	"math"
	"testing"

	"github.com/tiltwell/tiltwell"
)

// The first-order narrow width 2A/B′ (one Newton step from the real root,
// whose error is quadratic in the step Γ/2) and complex Newton differ by
// terms of order Γ² (common practice, no source); measured: at most 12Γ²
// relative in Γ and 1.4Γ² in η_r.
func TestNarrowAgainstNewton(t *testing.T) {
	t.Parallel()
	const prec = 128
	for _, c := range sample([]struct {
		v, mu, f float64
		n        int
	}{{4.3, 1.37, 2, 1}, {10, 1, 3, 2}, {50, 2, 5, 3}, {50, 1.37, 3, 1}}) {
		t.Run(fmt.Sprintf("v=%g/f=%g/n=%d", c.v, c.f, c.n), func(t *testing.T) {
			t.Parallel()
			w := single(c.v, c.mu, c.v, c.mu)
			a, err := level(w, 1, c.f, c.n, prec, routeNarrowOnly)
			if err != nil {
				t.Fatal(err)
			}
			b, err := level(w, 1, c.f, c.n, prec, routeNewtonOnly)
			if err != nil {
				t.Fatal(err)
			}
			if a.Route != RouteNarrow || b.Route != RouteNewton {
				t.Fatalf("routes %v, %v", a.Route, b.Route)
			}
			g := math.Pow(10, f64(b.Log10Gamma))
			dg := math.Abs(f64(newf(prec).Sub(a.Log10Gamma, b.Log10Gamma))) * math.Ln10
			de := relErr(a.Eta, b.Eta, 1)
			t.Logf("Γ = %.4g: narrow − Newton: Γ rel %.3g, η_r rel %.3g", g, dg, de)
			if dg > math.Max(100*g*g, 1e-34) || de > math.Max(100*g*g, 1e-34) {
				t.Errorf("narrow and Newton differ: Γ rel %g, η_r rel %g (Γ = %g)", dg, de, g)
			}
		})
	}
}

// Raising the precision changes a result only beyond the precision asked
// for: 128 against 192 bits on each route.
func TestPrecisionConsistency(t *testing.T) {
	t.Parallel()
	double := []Layer{{0, 10, 1.37}, {1, 0, 1}, {0.2, 10, 1.37}, {1, 0, 1}, {0, 10, 1.37}}
	for _, c := range sample([]struct {
		layers []Layer
		f      float64
		n      int
		route  Route
	}{
		{single(50, 2, 50, 2), 0, 4, RouteBound},
		{single(300, 1.37, 300, 1.37), 1e-6, 2, RouteNarrow},
		{single(4.3, 1.37, 4.3, 1.37), 2, 1, RouteNewton},
		{double, -1, 3, RouteNewton},
	}) {
		t.Run(fmt.Sprintf("%v/f=%g", c.route, c.f), func(t *testing.T) {
			t.Parallel()
			a, err := Level(c.layers, 1, c.f, c.n, 128)
			if err != nil {
				t.Fatal(err)
			}
			b, err := Level(c.layers, 1, c.f, c.n, 192)
			if err != nil {
				t.Fatal(err)
			}
			if a.Route != c.route || b.Route != c.route {
				t.Errorf("routes %v, %v; want %v", a.Route, b.Route, c.route)
			}
			if e := relErr(a.Eta, b.Eta, 1); e > 0x1p-124 {
				t.Errorf("η: rel %g between 128 and 192 bits", e)
			}
			if c.route != RouteBound {
				// log₁₀ Γ to 2^-124 relative to Γ: absolute ≤ 2^-124/ln 10.
				if d := math.Abs(f64(newf(256).Sub(a.Log10Gamma, b.Log10Gamma))); d > 0x1p-124 {
					t.Errorf("log₁₀ Γ: diff %g between 128 and 192 bits", d)
				}
			}
		})
	}
}

func TestErrors(t *testing.T) {
	t.Parallel()
	w := single(4.3, 1.37, 4.3, 1.37)
	for _, c := range []struct {
		name   string
		layers []Layer
		ref    int
		f      float64
		n      int
		prec   uint
		want   error
	}{
		{"NaN field", w, 1, math.NaN(), 1, 0, tiltwell.ErrField},
		{"Inf field", w, 1, math.Inf(-1), 1, 0, tiltwell.ErrField},
		{"huge field", w, 1, 2e4, 1, 0, tiltwell.ErrOutOfRange},
		{"n = 0", w, 1, 1, 0, 0, tiltwell.ErrLevel},
		{"n too big", w, 1, 1, MaxLevel + 1, 0, tiltwell.ErrLevel},
		{"precision", w, 1, 1, 1, MaxPrec + 1, tiltwell.ErrOutOfRange},
		{"two layers", w[:2], 1, 1, 1, 0, tiltwell.ErrUnits},
		{"ref outer", w, 0, 1, 1, 0, tiltwell.ErrUnits},
		{"ref not unit", []Layer{{0, 4, 1}, {1.5, 0, 1}, {0, 4, 1}}, 1, 1, 1, 0, tiltwell.ErrUnits},
		{"outer width", []Layer{{1, 4, 1}, {1, 0, 1}, {0, 4, 1}}, 1, 1, 1, 0, tiltwell.ErrUnits},
		{"negative width", []Layer{{0, 4, 1}, {1, 0, 1}, {-1, 2, 1}, {0, 4, 1}}, 1, 1, 1, 0, tiltwell.ErrUnits},
		{"NaN edge", []Layer{{0, math.NaN(), 1}, {1, 0, 1}, {0, 4, 1}}, 1, 1, 1, 0, tiltwell.ErrUnits},
		{"Inf edge", []Layer{{0, math.Inf(1), 1}, {1, 0, 1}, {0, 4, 1}}, 1, 1, 1, 0, tiltwell.ErrUnits},
		{"zero mass", []Layer{{0, 4, 0}, {1, 0, 1}, {0, 4, 1}}, 1, 1, 1, 0, tiltwell.ErrUnits},
		{"not confined", w, 1, 10, 1, 0, tiltwell.ErrLevel},
		{"above the bound states", w, 1, 0, 4, 0, tiltwell.ErrLevel},
	} {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			r, err := Level(c.layers, c.ref, c.f, c.n, c.prec)
			if !errors.Is(err, c.want) || r != nil {
				t.Errorf("got %v, %v; want an error wrapping %v", r, err, c.want)
			}
		})
	}
	// The arguments are not modified.
	w2 := append([]Layer(nil), w...)
	w2[2].Edge = 7
	keep := append([]Layer(nil), w2...)
	if _, err := Level(w2, 1, -1, 1, 64); err != nil {
		t.Fatal(err)
	}
	for i := range keep {
		if w2[i] != keep[i] {
			t.Errorf("layer %d changed: %+v → %+v", i, keep[i], w2[i])
		}
	}
}
