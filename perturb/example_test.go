package perturb_test

import (
	"errors"
	"fmt"
	"log"
	"math"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/perturb"
)

// The second-order levels at f = 2, each with its error estimate.
func Example() {
	levels, err := perturb.Solver{}.Levels(nil, 2, 3)
	if err != nil {
		log.Fatal(err)
	}
	for _, lv := range levels {
		fmt.Printf("n=%d η=%.6f ± %.1e (%v)\n", lv.N, lv.Energy, lv.Err, lv.Bound)
	}
	// Output:
	// n=1 η=0.956682 ± 3.4e-04 (estimate)
	// n=2 η=4.012918 ± 3.2e-04 (estimate)
	// n=3 η=9.007696 ± 1.1e-05 (estimate)
}

// Beyond the validity limit of one of the levels asked for, Levels still
// answers, with an error wrapping tiltwell.ErrOutOfRange.
func ExampleSolver_Levels() {
	s := perturb.Solver{Order: 2}
	levels, err := s.Levels(nil, 8, 2)
	var re *tiltwell.RangeError
	if errors.As(err, &re) {
		fmt.Printf("past the limit %.2f of level 1 or 2\n", re.Limit)
	} else if err != nil {
		log.Fatal(err)
	}
	for _, lv := range levels {
		fmt.Printf("n=%d η=%.4f ± %.4f\n", lv.N, lv.Energy, lv.Err)
	}
	// Output:
	// past the limit 6.35 of level 1 or 2
	// n=1 η=0.3069 ± 0.0771
	// n=2 η=4.2067 ± 0.0741
}

// The validity limits grow like n².
func ExampleSolver_Limit() {
	for _, order := range []int{1, 2} {
		s := perturb.Solver{Order: order}
		fmt.Printf("Order %d:", order)
		for _, n := range []int{1, 2, 3, 12} {
			lim, err := s.Limit(n)
			if err != nil {
				log.Fatal(err)
			}
			fmt.Printf(" n=%d %.1f", n, lim)
		}
		fmt.Println()
	}
	// Output:
	// Order 1: n=1 5.3 n=2 8.0 n=3 16.1 n=12 126.8
	// Order 2: n=1 6.4 n=2 6.4 n=3 10.5 n=12 282.4
}

// The dipole 2C_n f, beside the exact one.
func ExampleSolver_Dipole() {
	d, derr, err := perturb.Solver{}.Dipole(3, 1)
	if err != nil {
		log.Fatal(err)
	}
	want, err := exact.Solver{}.Dipole(3, 1)
	if err != nil {
		log.Fatal(err)
	}
	fmt.Printf("first order %.6f ± %.6f, exact %.6f\n", d, derr, want)
	// Output:
	// first order -0.064977 ± 0.002178, exact -0.062810
}

// The first-order wavefunction of the ground level leans toward ξ < ½,
// where the potential f(ξ − ½) is low.
func ExampleSolver_Wavefunction() {
	w, err := perturb.Solver{}.Wavefunction(4, 1)
	if err != nil {
		log.Fatal(err)
	}
	for _, xi := range []float64{0.25, 0.5, 0.75} {
		fmt.Printf("ψ(%.2f) = %.6f\n", xi, w.At(xi))
	}
	// Output:
	// ψ(0.25) = 1.302015
	// ψ(0.50) = 1.375101
	// ψ(0.75) = 0.642672
}

// First order, second order and the exact reference behind one interface.
func Example_compareOrders() {
	ref, err := exact.Solver{}.Levels(nil, 4, 1)
	if err != nil {
		log.Fatal(err)
	}
	fmt.Printf("exact    η₁ = %.6f\n", ref[0].Energy)
	for _, c := range []struct {
		name string
		s    tiltwell.Solver
	}{
		{"perturb1", perturb.Solver{Order: 1}},
		{"perturb2", perturb.Solver{Order: 2}},
	} {
		levels, err := c.s.Levels(nil, 4, 1)
		if err != nil {
			log.Fatal(err)
		}
		lv := levels[0]
		fmt.Printf("%s η₁ = %.6f ± %.1e (true error %.1e)\n", c.name, lv.Energy, lv.Err, math.Abs(lv.Energy-ref[0].Energy))
	}
	// Output:
	// exact    η₁ = 0.831812
	// perturb1 η₁ = 1.000000 ± 1.7e-01 (true error 1.7e-01)
	// perturb2 η₁ = 0.826727 ± 5.1e-03 (true error 5.1e-03)
}

// A finite well: the GaAs-like demo electron well (invented demo data,
// barriers of 4.3 E₁ with mass ratio 1.37) at f = 1. Perturbation theory
// cannot see escape, so Gamma is 0 and GammaErr estimates the missing
// width.
func ExampleSolver_finiteWell() {
	st, err := tiltwell.FiniteWell(4.3, 1.37)
	if err != nil {
		log.Fatal(err)
	}
	s := perturb.Solver{Stack: st}
	levels, err := s.Levels(nil, 1, 2)
	if err != nil {
		log.Fatal(err)
	}
	for _, lv := range levels {
		lim, _ := s.Limit(lv.N)
		fmt.Printf("n=%d η=%.5f ± %.1e  Γ=%g ± %.1e  limit %.2f\n", lv.N, lv.Energy, lv.Err, lv.Gamma, lv.GammaErr, lim)
	}
	// The third level, 0.05 E₁ below the barrier top, is trusted only at
	// very weak fields.
	lim3, _ := s.Limit(3)
	fmt.Printf("limit of n=3: %.3f\n", lim3)
	// Output:
	// n=1 η=0.49978 ± 4.0e-04  Γ=0 ± 1.4e-13  limit 2.58
	// n=2 η=2.11806 ± 1.2e-03  Γ=0 ± 2.8e-05  limit 1.25
	// limit of n=3: 0.005
}
