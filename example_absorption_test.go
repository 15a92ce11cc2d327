package tiltwell_test

import (
	"fmt"
	"log"

	"github.com/tiltwell/tiltwell"
)

// The absorption of the invented demo well, 10 nm of GaAs between
// Al0.3Ga0.7As barriers, at zero field and at 100 kV/cm: the e1–hh1 and
// e1–lh1 excitons from the exact finite-barrier levels and the
// variational binding, broadened by 4 meV (Gaussian) and 4 meV
// (Lorentzian), with the refractive index 3.6 of GaAs near its band edge.
// At 100 kV/cm the strongest peak is the light hole's, whose overlap the
// field reduces less. Then the best wavelength for a waveguide modulator, 100 µm long with a
// confinement factor of 0.1, switched between the two fields, with at most
// 3 dB of insertion loss.
func ExampleAbsorption_Spectrum() {
	ts := []tiltwell.Transition{{E: 1, H: 1}, {E: 1, H: 1, Hole: tiltwell.LightHole}}
	x, err := tiltwell.NewExcitons(tiltwell.DemoGaAsWell(), exactFor, ts)
	if err != nil {
		log.Fatal(err)
	}
	a := tiltwell.Absorption{Inhomogeneous: 4, Homogeneous: 4, WidthSpread: 0.14, Index: 3.6}
	photon := make([]float64, 401) // 1.40 to 1.50 eV
	for i := range photon {
		photon[i] = 1.40 + 0.1*float64(i)/400
	}
	var spectra [2][]float64
	for i, kv := range []float64{0, 100} {
		ab, err := x.At(tiltwell.KVPerCM(kv))
		if err != nil {
			log.Fatal(err)
		}
		for _, l := range ab.Lines {
			fmt.Printf("%3.0f kV/cm %v: exciton at %.4f eV, binding %.2f meV, overlap² %.3f\n", kv, l.Transition, l.Peak, l.Binding, l.Overlap2)
		}
		if spectra[i], err = a.Spectrum(nil, ab, photon); err != nil {
			log.Fatal(err)
		}
		top := 0
		for j, v := range spectra[i] {
			if v > spectra[i][top] {
				top = j
			}
		}
		fmt.Printf("%3.0f kV/cm: absorption peak %.2g %v at %.1f nm\n", kv, spectra[i][top], a.Units(ab), tiltwell.Wavelength(photon[top]))
	}
	wg, err := tiltwell.Waveguide(100e-6, 0.1)
	if err != nil {
		log.Fatal(err)
	}
	best, err := wg.Best(photon, spectra[0], spectra[1], 3)
	if err != nil {
		log.Fatal(err)
	}
	fmt.Printf("best: %.1f nm, Δα %.2g cm⁻¹, extinction %.0f dB, insertion loss %.1f dB\n", best.Wavelength, best.Change, best.Extinction, best.Insertion)
	// Output:
	//   0 kV/cm e1-hh1: exciton at 1.4533 eV, binding 7.87 meV, overlap² 0.984
	//   0 kV/cm e1-lh1: exciton at 1.4672 eV, binding 8.65 meV, overlap² 0.999
	//   0 kV/cm: absorption peak 2.8e+04 cm⁻¹ at 853.2 nm
	// 100 kV/cm e1-hh1: exciton at 1.4329 eV, binding 6.61 meV, overlap² 0.421
	// 100 kV/cm e1-lh1: exciton at 1.4521 eV, binding 7.67 meV, overlap² 0.659
	// 100 kV/cm: absorption peak 9.8e+03 cm⁻¹ at 853.9 nm
	// best: 865.4 nm, Δα 8e+03 cm⁻¹, extinction 35 dB, insertion loss 3.0 dB
}
