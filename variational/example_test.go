package variational_test

import (
	"fmt"
	"log"

	"github.com/tiltwell/tiltwell/variational"
)

// The ground level at f = 10 is certified to lie in a bracket; the exact
// value, computed independently at high precision (mpmath, from the Airy
// determinant Ai(z₀)Bi(z₁) − Ai(z₁)Bi(z₀) = 0), is 0.0660262957550905.
func Example() {
	br, err := variational.Solver{}.Brackets(nil, 10, 1, nil)
	if err != nil {
		log.Fatal(err)
	}
	b := br[0]
	fmt.Printf("%.10f ≤ η_1 ≤ %.10f (%v)\n", b.Lower, b.Upper, b.Bound)
	// Output:
	// 0.0660262958 ≤ η_1 ≤ 0.0660262958 (rigorous)
}

// Levels reports the upper bound as the energy and the bracket width as
// the error.
func ExampleSolver_Levels() {
	ls, err := variational.Solver{}.Levels(nil, 50, 3)
	if err != nil {
		log.Fatal(err)
	}
	for _, l := range ls {
		fmt.Printf("n=%d η=%.9f err below 1e-10: %v, %v\n", l.N, l.Energy, l.Err < 1e-10, l.Bound)
	}
	// Output:
	// n=1 η=-10.206263432 err below 1e-10: true, rigorous
	// n=2 η=0.865458072 err below 1e-10: true, rigorous
	// n=3 η=9.939274992 err below 1e-10: true, rigorous
}

// The one-parameter tilt of Bastard et al. (Phys. Rev. B 28, 3241 (1983)),
// with its optimal β* and energy E_var (values computed independently at
// high precision (mpmath) from the closed form: 0.321181087792,
// 0.989492224969893 at f = 1; 1.484533899, 0.751464815046145 at f = 5),
// and the proven lower bound beside it, which a small polynomial space at
// the same tilt puts at the exact level (0.989191714351091 and
// 0.741219278430113, computed the same way from the Airy determinant): the
// bracket is as wide as the tilt's own error.
func ExampleSolver_Brackets_tilt() {
	s := variational.Solver{Family: variational.Tilt}
	for _, f := range []float64{1, 5} {
		br, err := s.Brackets(nil, f, 1, nil)
		if err != nil {
			log.Fatal(err)
		}
		b := br[0]
		fmt.Printf("f=%g β*=%.6f E_var=%.6f lower=%.6f\n", f, b.Tilt, b.Upper, b.Lower)
	}
	// Output:
	// f=1 β*=0.321181 E_var=0.989492 lower=0.989192
	// f=5 β*=1.484534 E_var=0.751465 lower=0.741219
}

// A field sweep starts each field's tilt search from the previous
// field's optimum.
func ExampleSolver_Sweep() {
	fs := []float64{0, 20, 40}
	br, err := variational.Solver{}.Sweep(nil, fs, 2)
	if err != nil {
		log.Fatal(err)
	}
	for i, f := range fs {
		fmt.Printf("f=%-3g η_1 ≤ %.6f  η_2 ≤ %.6f\n", f, br[2*i].Upper, br[2*i+1].Upper)
	}
	// Output:
	// f=0   η_1 ≤ 1.000000  η_2 ≤ 4.000000
	// f=20  η_1 ≤ -1.968540  η_2 ≤ 4.079251
	// f=40  η_1 ≤ -7.251144  η_2 ≤ 2.290641
}

// The three families side by side on the ground level: each bracket is
// valid, and as wide as the family's own error (the lower bounds come from
// the richest space at hand); the richer spaces make it narrower.
func Example_families() {
	for _, fam := range []variational.Family{variational.Tilt, variational.Sine, variational.Poly} {
		br, err := variational.Solver{Family: fam}.Brackets(nil, 20, 1, nil)
		if err != nil {
			log.Fatal(err)
		}
		w := br[0].Upper - br[0].Lower
		if w < 1e-11 {
			fmt.Printf("%-4v width below 1e-11\n", fam)
			continue
		}
		fmt.Printf("%-4v width %.2g\n", fam, w)
	}
	// Output:
	// tilt width 0.18
	// sine width 2.2e-08
	// poly width below 1e-11
}
