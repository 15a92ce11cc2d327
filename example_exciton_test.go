package tiltwell_test

import (
	"fmt"
	"log"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
)

// The heavy-hole exciton of a 10 nm GaAs well between infinite walls, at
// zero field and at 100 kV/cm: the field pulls the electron and the hole
// apart and the exciton binds less. Masses and ε_r as in the package tests
// (GaAs, I. Vurgaftman et al., J. Appl. Phys. 89, 5815 (2001)).
func ExampleExciton_Binding() {
	const (
		me  = 0.067   // electron
		mhz = 0.34965 // heavy hole along the growth axis, 1/(γ₁ − 2γ₂)
		mhp = 0.11062 // heavy hole in the plane, 1/(γ₁ + γ₂)
	)
	pair := tiltwell.Pair{Width: 10e-9, Electron: me, Hole: mhz}
	x := tiltwell.Exciton{
		Width:      10e-9,
		Reduced:    me * mhp / (me + mhp),
		Normal:     me * mhz / (me + mhz),
		Dielectric: 12.9,
	}
	fmt.Printf("Ry* = %.2f meV, a* = %.1f nm\n", x.Rydberg(), x.BohrRadius())
	we, wh, err := pair.Wells()
	if err != nil {
		log.Fatal(err)
	}
	for _, kv := range []float64{0, 100} {
		F := tiltwell.KVPerCM(kv)
		e, err := exact.Solver{}.Wavefunction(we.Reduced(F), 1)
		if err != nil {
			log.Fatal(err)
		}
		// The hole sees the mirrored tilt.
		h, err := exact.Solver{}.Wavefunction(-wh.Reduced(F), 1)
		if err != nil {
			log.Fatal(err)
		}
		b, err := x.Binding(e, h)
		if err != nil {
			log.Fatal(err)
		}
		fmt.Printf("%3.0f kV/cm: binding %.2f meV (one parameter %.2f), λ = %.1f nm, β = %.2f\n",
			kv, b.Energy, b.OneParameter, b.Radius, b.Anisotropy)
	}
	// Output:
	// Ry* = 3.41 meV, a* = 16.4 nm
	//   0 kV/cm: binding 8.46 meV (one parameter 8.33), λ = 12.1 nm, β = 0.57
	// 100 kV/cm: binding 7.91 meV (one parameter 7.77), λ = 12.7 nm, β = 0.57
}
