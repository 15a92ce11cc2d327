package basis_test

import (
	"fmt"
	"log"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/basis"
)

// ExampleSolver_finiteWell solves a finite well: the invented
// GaAs/Al₀.₃Ga₀.₇As-like electron well (barrier 4.3 E₁, barrier mass
// ratio 1.37), at zero field (bound states with rigorous brackets) and
// under a field, where the levels are resonances with an escape width.
func ExampleSolver_finiteWell() {
	st, err := tiltwell.FiniteWell(4.3, 1.37)
	if err != nil {
		log.Fatal(err)
	}
	s := basis.Solver{Stack: st}
	for _, f := range []float64{0, 2} {
		ls, err := s.Levels(nil, f, 3)
		if _, ok := tiltwell.Confined(err); err != nil && !ok {
			log.Fatal(err)
		}
		fmt.Printf("f = %g: %d levels confined\n", f, len(ls))
		for _, l := range ls {
			fmt.Printf("  n=%d η=%.6f (%s) Γ=%.3e\n", l.N, l.Energy, l.Bound, l.Gamma)
		}
	}
	// Output:
	// f = 0: 3 levels confined
	//   n=1 η=0.539320 (rigorous) Γ=0.000e+00
	//   n=2 η=2.116882 (rigorous) Γ=0.000e+00
	//   n=3 η=4.246696 (rigorous) Γ=0.000e+00
	// f = 2: 2 levels confined
	//   n=1 η=0.386890 (estimate) Γ=2.820e-06
	//   n=2 η=2.100709 (estimate) Γ=1.942e-02
}
