package exact_test

import (
	"math"
	"strings"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/exact/exacttest"
)

// boxFD is an independent solver of a finite well for the Check tests:
// plain three-point finite differences of the BenDaniel–Duke Hamiltonian
// in a box, the interfaces halfway between grid points, eigenvalues by
// bisection on Sturm counts. Its Err is the Richardson estimate |E_h −
// E_2h|/3 of the second-order scheme with a safety factor 1.5 (common
// practice, no source); it
// sees no escape, so Gamma is 0 and GammaErr a bound on the missing Γ it
// is told.
type boxFD struct {
	v, mu    float64 // barrier height and mass ratio, both sides
	m        int     // grid points per unit length
	box      float64 // box half-width beyond the well
	missingΓ float64
}

func (b boxFD) levels(f float64, m, k int) []float64 {
	h := 1 / float64(m)
	n := int(math.Round((1 + 2*b.box) * float64(m)))
	c := 1 / (math.Pi * math.Pi * h * h)
	mass := func(x float64) float64 {
		switch {
		case math.Abs(x) < h/4 || math.Abs(x-1) < h/4:
			return (1 + b.mu) / 2
		case x > 0 && x < 1:
			return 1
		}
		return b.mu
	}
	d := make([]float64, n)
	e := make([]float64, n)
	for i := range n {
		x := -b.box + (float64(i)+0.5)*h
		v := b.v
		if x > 0 && x < 1 {
			v = 0
		}
		d[i] = c*(1/mass(x-h/2)+1/mass(x+h/2)) + v + f*(x-0.5)
		e[i] = -c / mass(x+h/2)
	}
	count := func(lam float64) int {
		neg, q := 0, d[0]-lam
		for i := 0; ; i++ {
			if q < 0 {
				neg++
			}
			if i+1 == n {
				return neg
			}
			if q == 0 {
				q = 1e-300
			}
			q = d[i+1] - lam - e[i]*e[i]/q
		}
	}
	out := make([]float64, k)
	for j := range k {
		lo, hi := -math.Abs(f)*(1+b.box), b.v+math.Abs(f)*(1+b.box)
		for range 100 {
			md := lo + (hi-lo)/2
			if count(md) > j {
				hi = md
			} else {
				lo = md
			}
		}
		out[j] = lo + (hi-lo)/2
	}
	return out
}

func (b boxFD) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	dst = dst[:0]
	if err := tiltwell.CheckArgs("boxfd", f, k, 5, 10); err != nil {
		return dst, err
	}
	fine, coarse := b.levels(f, b.m, k), b.levels(f, b.m/2, k)
	for j := range k {
		dst = append(dst, tiltwell.Level{N: j + 1, Energy: fine[j], Err: 1.5 * math.Abs(fine[j]-coarse[j]) / 3, GammaErr: b.missingΓ})
	}
	return dst, nil
}

// doubledGamma is the exact solver with every Γ doubled.
type doubledGamma struct{ exact.Solver }

func (d doubledGamma) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	ls, err := d.Solver.Levels(dst, f, k)
	for i := range ls {
		ls[i].Gamma *= 2
	}
	return ls, err
}

func TestCheckStack(t *testing.T) {
	t.Parallel()
	well, err := tiltwell.FiniteWell(12, 1.37)
	if err != nil {
		t.Fatal(err)
	}
	asym, err := tiltwell.AsymmetricWell(6, 0.8, 12, 1.5)
	if err != nil {
		t.Fatal(err)
	}
	// The reference against itself, symmetric and asymmetric, with its
	// wavefunctions over their supports.
	for _, st := range []tiltwell.Stack{well, asym} {
		r := exacttest.TestSolver(t, exact.Solver{Stack: st}, exact.Grid{Fields: []float64{0, 0.5, -1, 2}, Levels: 2, MaxRatio: 10, Stack: st})
		if r != nil && (r.Gamma == nil || r.Waves == nil || r.Waves.Norm.Value > 1e-10) {
			t.Errorf("%v: report without Γ or wavefunctions, or a poor norm: %s", st, r)
		}
	}
	// An independent finite-difference solver, within its own Richardson
	// estimates (its box turns the narrow resonances into bound levels).
	fd := boxFD{v: 12, mu: 1.37, m: 800, box: 1.5, missingΓ: 1e-12}
	exacttest.TestSolver(t, fd, exact.Grid{Fields: []float64{0, 0.5, 1}, Levels: 2, Stack: well})
	// Doubled widths are gross undershoots of GammaErr.
	r, err := exact.Check(doubledGamma{exact.Solver{Stack: well}}, exact.Grid{Fields: []float64{1, 2}, Levels: 2, Stack: well})
	if err != nil {
		t.Fatal(err)
	}
	if r.OK() || r.Gamma.GrossUndershoots == 0 || !strings.Contains(r.String(), "escape widths") {
		t.Errorf("doubled Γ passed or went unreported:\n%s", r)
	}
	// A field where the reference confines too few levels cannot be
	// checked.
	if _, err := exact.Check(exact.Solver{Stack: well}, exact.Grid{Fields: []float64{0}, Levels: 8, Stack: well}); err == nil {
		t.Error("Check with more levels than the well confines: no error")
	}
}
