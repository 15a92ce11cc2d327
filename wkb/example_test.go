package wkb_test

import (
	"fmt"
	"log"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/wkb"
)

// The lowest levels at f = 10 by the connection rule, each with its own
// error estimate.
func Example() {
	levels, err := wkb.Solver{}.Levels(nil, 10, 3)
	if err != nil {
		log.Fatal(err)
	}
	for _, l := range levels {
		fmt.Printf("n=%d η=%.6f ± %.1e (%v)\n", l.N, l.Energy, l.Err, l.Bound)
	}
	// Output:
	// n=1 η=0.068669 ± 7.3e-03 (estimate)
	// n=2 η=4.182094 ± 4.8e-04 (estimate)
	// n=3 η=9.184725 ± 9.6e-05 (estimate)
}

// At low field the textbook two-wall rule shifts the ground level up, by
// f²/48, while the true level moves down; its error estimate is larger than
// the shift it predicts. The connection rule resolves the red shift.
func ExampleSolver_Levels() {
	for _, s := range []wkb.Solver{{Plain: true}, {}} {
		l, err := s.Levels(nil, 1, 1)
		if err != nil {
			log.Fatal(err)
		}
		fmt.Printf("plain=%v: η₁ − 1 = %+.6f ± %.6f\n", s.Plain, l[0].Energy-1, l[0].Err)
	}
	// Output:
	// plain=true: η₁ − 1 = +0.021297 ± 0.032594
	// plain=false: η₁ − 1 = -0.010447 ± 0.000849
}

// The ground-state wavefunction at f = 100 lies against the low wall; past
// the turning point near ξ = 0.24 it decays as an Airy function, over the
// Airy length (π² f)^(−1/3) ≈ 0.1.
func ExampleSolver_Wavefunction() {
	w, err := wkb.Solver{}.Wavefunction(100, 1)
	if err != nil {
		log.Fatal(err)
	}
	for _, xi := range []float64{0.05, 0.1, 0.2, 0.3, 0.5} {
		fmt.Printf("φ(%.2f) = %.6f\n", xi, w.At(xi))
	}
	// Output:
	// φ(0.05) = 1.438132
	// φ(0.10) = 2.268986
	// φ(0.20) = 1.989397
	// φ(0.30) = 0.898646
	// φ(0.50) = 0.055939
}

// Methods swap behind the tiltwell.Solver interface. Near f = 2.25, where
// the plain rule changes branch for the ground level, it is off by 0.2.
func Example_compareMethods() {
	methods := []struct {
		name string
		s    tiltwell.Solver
	}{
		{"wkb", wkb.Solver{}},
		{"wkb plain", wkb.Solver{Plain: true}},
		{"exact", exact.Solver{}},
	}
	for _, m := range methods {
		levels, err := m.s.Levels(nil, 2.3, 2)
		if err != nil {
			log.Fatal(err)
		}
		fmt.Printf("%-9s %.6f %.6f\n", m.name, levels[0].Energy, levels[1].Energy)
	}
	// Output:
	// wkb       0.944246 4.016556
	// wkb plain 0.734749 4.027746
	// exact     0.943295 4.016520
}

// A finite well: the invented GaAs/Al₀.₃Ga₀.₇As-like electron well of
// barrier 4.3 E₁ and barrier mass ratio 1.37. Under a field each level
// gains an escape width Γ through the downhill barrier, with its own
// estimate; the exact solver's levels are shown beside them.
func ExampleSolver_finiteWell() {
	well, err := tiltwell.FiniteWell(4.3, 1.37)
	if err != nil {
		log.Fatal(err)
	}
	levels, err := wkb.Solver{Stack: well}.Levels(nil, 0.5, 2)
	if err != nil {
		log.Fatal(err)
	}
	ref, err := exact.Solver{Stack: well}.Levels(nil, 0.5, 2)
	if err != nil {
		log.Fatal(err)
	}
	for i, l := range levels {
		fmt.Printf("n=%d η=%.9f ± %.0e Γ=%.4e ± %.0e (exact η=%.9f Γ=%.4e)\n", l.N, l.Energy, l.Err, l.Gamma, l.GammaErr, ref[i].Energy, ref[i].Gamma)
	}
	// Past the two confined levels, the list ends with the reason.
	_, err = wkb.Solver{Stack: well}.Levels(nil, 0.5, 3)
	fmt.Println(err)
	// Output:
	// n=1 η=0.529459942 ± 2e-13 Γ=2.3876e-29 ± 2e-40 (exact η=0.529459942 Γ=2.3876e-29)
	// n=2 η=2.117109963 ± 2e-09 Γ=2.2743e-12 ± 1e-19 (exact η=2.117109962 Γ=2.2743e-12)
	// wkb: 3 levels asked for at f = 0.5, the well confines 2 (level 3: above the downhill barrier's top or within 0.6 ħ of under-barrier action of it (the method's quasiclassical limit)): tiltwell: level not available
}
