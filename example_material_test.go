package tiltwell_test

import (
	"fmt"
	"log"

	"github.com/tiltwell/tiltwell"
)

// ExampleParseMaterial looks materials up by the names a command line
// would use and prints their room-temperature gaps and band edges on the
// compilation's absolute scale.
func ExampleParseMaterial() {
	for _, spec := range []string{"GaAs", "AlGaAs:0.3", "InGaAs:0.53", "InAlAs:0.52", "InP"} {
		m, err := tiltwell.ParseMaterial(spec)
		if err != nil {
			log.Fatal(err)
		}
		gap, err := m.Gap(300)
		if err != nil {
			log.Fatal(err)
		}
		ec, _ := m.Ec(300)
		fmt.Printf("%-15s gap %.4f eV  Ec %+.4f eV  Ev %+.4f eV  m_e %.4f  m_hh %.4f  m_lh %.4f\n",
			m.Name, gap, ec, m.Ev(), m.ElectronMass, m.HeavyHoleMass(), m.LightHoleMass())
	}
	// Output:
	// GaAs            gap 1.4225 eV  Ec +0.6225 eV  Ev -0.8000 eV  m_e 0.0670  m_hh 0.3497  m_lh 0.0901
	// Al0.3Ga0.7As    gap 1.8408 eV  Ec +0.8818 eV  Ev -0.9590 eV  m_e 0.0919  m_hh 0.3791  m_lh 0.1065
	// In0.53Ga0.47As  gap 0.7373 eV  Ec +0.1432 eV  Ev -0.5940 eV  m_e 0.0430  m_hh 0.3771  m_lh 0.0516
	// In0.52Al0.48As  gap 1.4507 eV  Ec +0.6653 eV  Ev -0.7855 eV  m_e 0.0733  m_hh 0.3880  m_lh 0.0458
	// InP             gap 1.3529 eV  Ec +0.4129 eV  Ev -0.9400 eV  m_e 0.0795  m_hh 0.5319  m_lh 0.1208
}

// ExampleStructure_Reduce turns the invented demo well, 10 nm of GaAs
// between Al0.3Ga0.7As barriers, biased in a p-i-n diode, into the reduced
// problems of its electron, heavy hole and light hole: each a tiltwell.Stack
// and a reduced field, ready for any solver.
func ExampleStructure_Reduce() {
	s := tiltwell.DemoGaAsWell()
	// Built-in voltage 1.5 V, reverse bias 3.5 V, 1 µm intrinsic region,
	// slabs listed from the n side: 50 kV/cm along +z.
	F, err := tiltwell.DiodeField(1.5, -3.5, 1e-6)
	if err != nil {
		log.Fatal(err)
	}
	s.Field = F
	r, err := s.Reduce()
	if err != nil {
		log.Fatal(err)
	}
	fmt.Printf("field %.0f kV/cm, well gap %.4f eV at %.0f K\n", r.Field/1e5, r.Gap, r.Temperature)
	for _, c := range []tiltwell.Carrier{tiltwell.Electron, tiltwell.HeavyHole, tiltwell.LightHole} {
		cw := r.Carriers[c]
		b, _ := cw.Stack.Layer(0)
		fmt.Printf("%-2v m = %.4f m₀  E₁ = %6.3f meV  barrier v = %6.3f E₁  μ = %.4f  f = %+.4f\n",
			cw.Carrier, cw.Well.Mass, cw.E1*1e3, b.Edge, b.Mass, cw.F)
	}
	// Output:
	// field 50 kV/cm, well gap 1.4225 eV at 300 K
	// e  m = 0.0670 m₀  E₁ = 56.124 meV  barrier v =  4.620 E₁  μ = 1.3716  f = +0.8909
	// hh m = 0.3497 m₀  E₁ = 10.754 meV  barrier v = 14.785 E₁  μ = 1.0842  f = -4.6492
	// lh m = 0.0901 m₀  E₁ = 41.739 meV  barrier v =  3.809 E₁  μ = 1.1821  f = -1.1979
}
