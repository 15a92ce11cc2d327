package exact_test

import (
	"fmt"
	"log"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
)

// The lowest three levels of the tilted well at reduced field f = 10.
func Example() {
	levels, err := exact.Solver{}.Levels(nil, 10, 3)
	if err != nil {
		log.Fatal(err)
	}
	for _, l := range levels {
		fmt.Printf("n=%d η=%.12f err<%.0e\n", l.N, l.Energy, 1e-14)
		_ = l.Err
	}
	// Output:
	// n=1 η=0.066026295755 err<1e-14
	// n=2 η=4.181870005638 err<1e-14
	// n=3 η=9.184678801999 err<1e-14
}

// Reusing dst avoids allocation across a field sweep.
func ExampleSolver_Levels() {
	var s tiltwell.Solver = exact.Solver{}
	dst := make([]tiltwell.Level, 0, 2)
	for _, f := range []float64{0, 50, 100} {
		var err error
		dst, err = s.Levels(dst, f, 2)
		if err != nil {
			log.Fatal(err)
		}
		fmt.Printf("f=%-3g η₁=%9.5f η₂=%9.5f\n", f, dst[0].Energy, dst[1].Energy)
	}
	// Output:
	// f=0   η₁=  1.00000 η₂=  4.00000
	// f=50  η₁=-10.20626 η₂=  0.86546
	// f=100 η₁=-26.51641 η₂= -8.94126
}

// The dipole ⟨ξ − ½⟩ is the slope dη/df (Hellmann–Feynman); the ground
// state leans towards the low-potential wall.
func ExampleSolver_Dipole() {
	d, err := exact.Solver{}.Dipole(10, 1)
	if err != nil {
		log.Fatal(err)
	}
	fmt.Printf("⟨ξ − ½⟩ = %.6f\n", d)
	// Output:
	// ⟨ξ − ½⟩ = -0.165330
}

// A wavefunction can be evaluated anywhere; it vanishes at the walls.
func ExampleSolver_Wavefunction() {
	w, err := exact.Solver{}.Wavefunction(10, 1)
	if err != nil {
		log.Fatal(err)
	}
	for _, xi := range []float64{0, 0.25, 0.5, 0.75, 1} {
		fmt.Printf("φ(%.2f) = %.6f\n", xi, w.At(xi))
	}
	// Output:
	// φ(0.00) = 0.000000
	// φ(0.25) = 1.624628
	// φ(0.50) = 1.108596
	// φ(0.75) = 0.339124
	// φ(1.00) = 0.000000
}

func ExampleAiry() {
	ai, aip, bi, bip := exact.Airy(1)
	fmt.Printf("Ai(1) = %.15f\nAi′(1) = %.15f\nBi(1) = %.15f\nBi′(1) = %.15f\n", ai, aip, bi, bip)
	// Output:
	// Ai(1) = 0.135292416312881
	// Ai′(1) = -0.159147441296793
	// Bi(1) = 1.207423594952871
	// Bi′(1) = 0.932435933392776
}

// A finite well: barriers 4.3 E₁ high in which the carrier is 1.37 times
// heavier, roughly the electron of a 10 nm GaAs well between Al₀.₃Ga₀.₇As
// barriers. Under a field its levels are quasi-bound: Γ is the escape
// width in E₁. It binds three levels at zero field.
func ExampleSolver_finiteWell() {
	st, err := tiltwell.FiniteWell(4.3, 1.37)
	if err != nil {
		log.Fatal(err)
	}
	s := exact.Solver{Stack: st}
	for _, f := range []float64{0, 1, 2} {
		ls, err := s.Levels(nil, f, 2)
		if err != nil {
			log.Fatal(err)
		}
		for _, l := range ls {
			fmt.Printf("f=%g n=%d η=%.6f Γ=%.2g\n", f, l.N, l.Energy, l.Gamma)
		}
	}
	_, err = s.Levels(nil, 0, 4)
	n, _ := tiltwell.Confined(err)
	fmt.Println("bound at f = 0:", n)
	// Output:
	// f=0 n=1 η=0.539320 Γ=0
	// f=0 n=2 η=2.116882 Γ=0
	// f=1 n=1 η=0.500173 Γ=6.9e-14
	// f=1 n=2 η=2.116891 Γ=1.4e-05
	// f=2 n=1 η=0.386890 Γ=2.8e-06
	// f=2 n=2 η=2.100709 Γ=0.019
	// bound at f = 0: 3
}

// A sweep builds each wavefunction from the level just solved, in one
// reused wavefunction's storage: no level is solved twice and nothing is
// allocated once the storage exists.
func ExampleSolver_BuildWave() {
	s := exact.Solver{}
	var levels []tiltwell.Level
	var w tiltwell.Wavefunction
	for _, f := range []float64{0, 10, 20} {
		var err error
		if levels, err = s.Levels(levels, f, 1); err != nil {
			log.Fatal(err)
		}
		if w, err = s.BuildWave(w, f, levels[0]); err != nil {
			log.Fatal(err)
		}
		fmt.Printf("f=%-2g η₁=%8.5f φ(0.25)=%.6f\n", f, levels[0].Energy, w.At(0.25))
	}
	// Output:
	// f=0  η₁= 1.00000 φ(0.25)=1.000000
	// f=10 η₁= 0.06603 φ(0.25)=1.624628
	// f=20 η₁=-1.96854 φ(0.25)=1.826778
}
