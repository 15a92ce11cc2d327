package variational_test

import (
	"fmt"
	"log"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/variational"
)

// On a finite well the Poly family brackets the zero-field levels with a
// proven enclosure, and under a field gives the real variational level
// with an estimate that includes the escape shift; the escape width it
// leaves out (Γ = 0) is in GammaErr. The well is a GaAs/Al₀.₃Ga₀.₇As-like
// electron well (invented demo numbers, see tiltwell.FiniteWell); the
// exact solver puts its levels at f = 0 at 0.549490, 2.161489 and
// 4.442279, and at f = 2 at 0.403528 (Γ = 3.9e-7) and 2.156996
// (Γ = 0.0071, which shifts the level 4.2e-5 below the real variational
// value).
func ExampleSolver_finiteWell() {
	st, err := tiltwell.FiniteWell(4.62, 1.372)
	if err != nil {
		log.Fatal(err)
	}
	s := variational.Solver{Stack: st}
	for _, f := range []float64{0, 2} {
		ls, err := s.Levels(nil, f, 3)
		fmt.Printf("f=%g:", f)
		if n, ok := tiltwell.Confined(err); ok {
			fmt.Printf(" %d levels confined", n)
		} else if err != nil {
			log.Fatal(err)
		}
		fmt.Println()
		for _, l := range ls {
			fmt.Printf("  n=%d η=%.6f %v, Err < 1e-10: %v, Γ < 1e-6: %v\n", l.N, l.Energy, l.Bound, l.Err < 1e-10, l.GammaErr < 1e-6)
		}
	}
	// Output:
	// f=0:
	//   n=1 η=0.549490 rigorous, Err < 1e-10: true, Γ < 1e-6: true
	//   n=2 η=2.161489 rigorous, Err < 1e-10: true, Γ < 1e-6: true
	//   n=3 η=4.442279 rigorous, Err < 1e-10: true, Γ < 1e-6: true
	// f=2: 2 levels confined
	//   n=1 η=0.403528 estimate, Err < 1e-10: true, Γ < 1e-6: true
	//   n=2 η=2.157038 estimate, Err < 1e-10: false, Γ < 1e-6: false
}

// The one-parameter tilt of Bastard et al. on the same well: its energy
// is a closed form, a stationary value 0.0028 above the exact level
// 0.403528, and the bracket reaches down to the Poly space's estimate.
func ExampleSolver_finiteTilt() {
	st, err := tiltwell.FiniteWell(4.62, 1.372)
	if err != nil {
		log.Fatal(err)
	}
	br, err := variational.Solver{Family: variational.Tilt, Stack: st}.Brackets(nil, 2, 1, nil)
	if err != nil {
		log.Fatal(err)
	}
	b := br[0]
	fmt.Printf("β* = %.4f, E = %.6f, level in [%.6f, %.6f], %v\n", b.Tilt, b.Energy, b.Lower, b.Upper, b.Bound)
	// Output:
	// β* = 1.1521, E = 0.406357, level in [0.403528, 0.406357], estimate
}
