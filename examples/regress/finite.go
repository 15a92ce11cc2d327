package main

import (
	"fmt"
	"io"
	"math"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
)

// fdWell is a finite-difference solver of a finite well, written as a
// simulator author would: the well and pad widths of barrier on each side
// in a box with hard walls, a uniform mesh of step h = 1/perUnit with
// nodes on the interfaces, and the BenDaniel–Duke operator in flux form,
//
//	−(1/π²) [(φ_(i+1) − φ_i)/μ_(i+½) − (φ_i − φ_(i−1))/μ_(i−½)] / h² + V_i φ_i = η φ_i,
//
// μ_(i±½) the mass ratio of the cell between two nodes and V_i = v_i +
// f(ξ_i − ½), with v_i at an interface node the mean of its two sides
// (the finite-volume reading of the matching conditions; common
// practice, no source). The matrix is made symmetric by the diagonal
// scaling that makes the flux form self-adjoint (it already is), and its
// eigenvalues come from Sturm bisection as in fd. Err is Richardson's
// estimate from the mesh of step 2h, times safety; the box cannot show
// escape, so Gamma is 0 and GammaErr 0: the solver claims the levels are
// bound, which exact.Check tests.
type fdWell struct {
	vl, ml, vr, mr float64
	perUnit        int     // mesh intervals per unit of ξ (even)
	pad            float64 // barrier width kept on each side, in L
	safety         float64
}

var _ tiltwell.Solver = fdWell{}

func (s fdWell) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	dst = dst[:0]
	if err := tiltwell.CheckArgs("fdwell", f, k, 50, 0); err != nil {
		return dst, err
	}
	vl, ml, vr, mr := s.vl, s.ml, s.vr, s.mr
	if f < 0 {
		// The mirror image at |f|.
		vl, ml, vr, mr, f = vr, mr, vl, ml, -f
	}
	safety := max(s.safety, 1)
	for n := 1; n <= k; n++ {
		fine, w1 := s.eigen(s.perUnit, vl, ml, vr, mr, f, n)
		coarse, w2 := s.eigen(s.perUnit/2, vl, ml, vr, mr, f, n)
		dst = append(dst, tiltwell.Level{N: n, Energy: fine, Err: safety*math.Abs(fine-coarse)/3 + w1 + w2})
	}
	return dst, nil
}

// eigen returns the n-th eigenvalue on a mesh of per intervals per unit
// length and its bisection width.
func (s fdWell) eigen(per int, vl, ml, vr, mr, f float64, n int) (eta, width float64) {
	h := 1 / float64(per)
	np := int(math.Round(s.pad * float64(per)))
	m := per + 2*np // intervals in the box
	x := func(i int) float64 { return float64(i-np) * h }
	// Cell i lies between nodes i and i+1.
	cellMass := func(i int) float64 {
		switch {
		case i < np:
			return ml
		case i >= np+per:
			return mr
		}
		return 1
	}
	edge := func(i int) float64 {
		switch {
		case i < np:
			return vl
		case i == np:
			return vl / 2
		case i == np+per:
			return vr / 2
		case i > np+per:
			return vr
		}
		return 0
	}
	c := 1 / (math.Pi * math.Pi * h * h)
	diag := func(i int) float64 {
		return c/cellMass(i-1) + c/cellMass(i) + edge(i) + f*(x(i)-0.5)
	}
	off := func(i int) float64 { return -c / cellMass(i) } // between nodes i and i+1
	lo, hi := math.Inf(1), math.Inf(-1)
	for i := 1; i < m; i++ {
		r := math.Abs(off(i-1)) + math.Abs(off(i))
		lo, hi = min(lo, diag(i)-r), max(hi, diag(i)+r)
	}
	for range 200 {
		mid := lo + (hi-lo)/2
		if mid == lo || mid == hi || hi-lo <= 2e-16*math.Max(math.Abs(lo), math.Abs(hi)) {
			break
		}
		// Negative pivots of T − mid·I count the eigenvalues below mid.
		count, q := 0, 1.0
		for i := 1; i < m; i++ {
			if i == 1 {
				q = diag(i) - mid
			} else {
				o := off(i - 1)
				q = diag(i) - mid - o*o/q
			}
			if q == 0 {
				q = -1e-300
			}
			if q < 0 {
				count++
			}
		}
		if count >= n {
			hi = mid
		} else {
			lo = mid
		}
	}
	return lo + (hi-lo)/2, hi - lo
}

// finiteWell runs the finite-well part of the demonstration: the same
// kind of check on a finite well, where the reference also knows how fast
// each level empties.
func finiteWell(w io.Writer) error {
	// The electron of the invented 10 nm GaAs/Al0.3Ga0.7As demo well
	// (tiltwell.DemoGaAsWell): barrier 4.62 E₁, mass ratio 1.372.
	st, err := tiltwell.FiniteWell(4.62, 1.372)
	if err != nil {
		return err
	}
	solver := fdWell{vl: 4.62, ml: 1.372, vr: 4.62, mr: 1.372, perUnit: 400, pad: 3, safety: 2}
	fmt.Fprintf(w, "\nA finite well (barriers %v):\nfinite differences in a box with 3 L of barrier on each side, 400 intervals per L.\n\n", st)
	r, err := exact.Check(solver, exact.Grid{Stack: st, Fields: []float64{0}, Levels: 3})
	if err != nil {
		return err
	}
	fmt.Fprintf(w, "At zero field, 3 bound levels: %s, worst error %.3g at n=%d, estimates %d× at most.\n",
		verdict(r), r.Abs.Value, r.Abs.N, int(math.Ceil(r.Ratio.Value)))

	// Under a field every level leaks out through the downhill barrier.
	// The box cannot show it: the solver claims Γ = 0 ± 0, and the
	// reference's escape widths catch the claim, however small the width.
	r, err = exact.Check(solver, exact.Grid{Stack: st, Fields: []float64{0.25, 0.5, -0.5}, Levels: 2})
	if err != nil {
		return err
	}
	fmt.Fprintf(w, "\nAt f = 0.25 and ±0.5 the energies are as good, but the solver says the levels are bound:\n\n%s\n", r)
	fmt.Fprintf(w, "A box solver must declare how much escape width it misses (GammaErr), or stay at f = 0.\n")

	// Stronger still, the downhill barrier inside the box falls below the
	// well's levels, and the box holds states of its own there.
	r, err = exact.Check(solver, exact.Grid{Stack: st, Fields: []float64{2}, Levels: 1})
	if err != nil {
		return err
	}
	u := r.WorstUndershoot
	fmt.Fprintf(w, "\nAt f = 2 the box's lowest state, η = %.4f, lies in the tilted barrier, not in the well\n"+
		"(exact η = %.4f): %s, %d gross undershoot.\n", u.Got, u.Want, verdict(r), r.GrossUndershoots)
	return nil
}

// verdict says whether a report passes.
func verdict(r *exact.Report) string {
	if r.OK() {
		return "passes"
	}
	return "fails"
}
