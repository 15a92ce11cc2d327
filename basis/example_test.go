package basis_test

import (
	"fmt"
	"log"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/basis"
)

// The three lowest levels at f = 10 in a 40-state basis, each with its
// certified bracket.
func Example() {
	ls, err := basis.Solver{Size: 40}.Levels(nil, 10, 3)
	if err != nil {
		log.Fatal(err)
	}
	for _, l := range ls {
		fmt.Printf("n=%d η=%.9f Err<1e-9: %v %v\n", l.N, l.Energy, l.Err < 1e-9, l.Bound)
	}
	// Output:
	// n=1 η=0.066026296 Err<1e-9: true rigorous
	// n=2 η=4.181870006 Err<1e-9: true rigorous
	// n=3 η=9.184678802 Err<1e-9: true rigorous
}

// Levels reuses dst: with capacity for k levels it does not allocate.
func ExampleSolver_Levels() {
	s := basis.Solver{Size: 20}
	dst := make([]tiltwell.Level, 0, 2)
	for _, f := range []float64{0, 5, -5} {
		var err error
		dst, err = s.Levels(dst, f, 2)
		if err != nil {
			log.Fatal(err)
		}
		fmt.Printf("f=%+.0f: %.6f %.6f\n", f, dst[0].Energy, dst[1].Energy)
	}
	// Output:
	// f=+0: 1.000000 4.000000
	// f=+5: 0.741219 4.069220
	// f=-5: 0.741219 4.069220
}

// With Size 0 the basis size is chosen from the tolerance; Solve reports it.
func ExampleSolver_Solve() {
	ls, st, err := basis.Solver{Tol: 1e-8}.Solve(nil, 100, 2)
	if err != nil {
		log.Fatal(err)
	}
	fmt.Printf("N=%d tries=%d\n", st.Size, st.Tries)
	for _, l := range ls {
		fmt.Printf("n=%d η=%.6f Err<1e-8: %v\n", l.N, l.Energy, l.Err < 1e-8*max(1, -l.Energy))
	}
	// Output:
	// N=99 tries=1
	// n=1 η=-26.516407 Err<1e-8: true
	// n=2 η=-8.941262 Err<1e-8: true
}

// A user potential: a barrier of height 40 E₁ in the middle of the well,
// with Breaks at its edges so the quadrature converges. The levels are
// estimates (no exact reference exists), still upper bounds.
func ExampleSolver_potential() {
	s := basis.Solver{
		Size: 80,
		Potential: func(xi float64) float64 {
			if xi > 0.45 && xi < 0.55 {
				return 40
			}
			return 0
		},
		Breaks: []float64{0.45, 0.55},
	}
	ls, err := s.Levels(nil, 5, 2)
	if err != nil {
		log.Fatal(err)
	}
	for _, l := range ls {
		fmt.Printf("n=%d η=%.4f %v\n", l.N, l.Energy, l.Bound)
	}
	// Output:
	// n=1 η=2.6881 estimate
	// n=2 η=5.1999 estimate
}

// The wavefunction of the ground level, normalized with φ′(0) > 0.
func ExampleSolver_Wavefunction() {
	w, err := basis.Solver{Size: 40}.Wavefunction(10, 1)
	if err != nil {
		log.Fatal(err)
	}
	for _, xi := range []float64{0.25, 0.5, 0.75} {
		fmt.Printf("φ(%.2f) = %.6f\n", xi, w.At(xi))
	}
	// Output:
	// φ(0.25) = 1.624628
	// φ(0.50) = 1.108595
	// φ(0.75) = 0.339124
}
