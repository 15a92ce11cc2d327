package exact

// TEMPORARY placeholder so that sibling packages can compile and test while
// the Airy-phase solver is written: a 600-state sine-basis diagonalisation.
// It is replaced by the real solver before the foundation lands.

import (
	"math"

	"github.com/tiltwell/tiltwell"
	"gonum.org/v1/gonum/mat"
)

// MaxField is the largest |f| the solver accepts.
const MaxField = 1e5

// MaxLevels is the largest k the solver accepts.
const MaxLevels = 1000

// Solver is the exact reference. The zero value is ready to use.
type Solver struct{}

var _ tiltwell.WaveSolver = Solver{}

const nb = 600

func eig(f float64) ([]float64, *mat.Dense) {
	h := mat.NewSymDense(nb, nil)
	for i := 1; i <= nb; i++ {
		h.SetSym(i-1, i-1, float64(i*i))
		for j := i + 1; j <= nb; j += 2 {
			mi, mj := float64(i), float64(j)
			d := mi*mi - mj*mj
			h.SetSym(i-1, j-1, -8*f*mi*mj/(math.Pi*math.Pi*d*d))
		}
	}
	var es mat.EigenSym
	es.Factorize(h, true)
	var v mat.Dense
	es.VectorsTo(&v)
	return es.Values(nil), &v
}

// Levels implements tiltwell.Solver.
func (Solver) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	dst = dst[:0]
	if err := tiltwell.CheckArgs("exact", f, k, MaxLevels, MaxField); err != nil {
		return dst, err
	}
	af, _ := tiltwell.Fold(f)
	vals, _ := eig(af)
	for n := 1; n <= k; n++ {
		dst = append(dst, tiltwell.Level{N: n, Energy: vals[n-1], Err: 1e-9 * math.Max(1, math.Abs(vals[n-1])), Bound: tiltwell.Estimate})
	}
	return dst, nil
}

// Wavefunction implements tiltwell.WaveSolver.
func (Solver) Wavefunction(f float64, n int) (tiltwell.Wavefunction, error) {
	if err := tiltwell.CheckArgs("exact", f, n, MaxLevels, MaxField); err != nil {
		return nil, err
	}
	af, mir := tiltwell.Fold(f)
	_, v := eig(af)
	c := make([]float64, nb)
	s := 0.0
	for i := range c {
		c[i] = v.At(i, n-1)
		s += c[i] * float64(i+1)
	}
	if s < 0 {
		for i := range c {
			c[i] = -c[i]
		}
	}
	var w tiltwell.Wavefunction = tiltwell.WaveFunc(func(x float64) float64 {
		r := 0.0
		for i, ci := range c {
			r += ci * math.Sqrt2 * math.Sin(float64(i+1)*math.Pi*x)
		}
		return r
	})
	if mir {
		w = tiltwell.Mirror(w, n)
	}
	return w, nil
}
