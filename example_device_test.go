package tiltwell_test

import (
	"fmt"
	"log"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
)

// ExampleNewDevice sweeps the reverse bias of a p-i-n diode whose
// intrinsic region holds the invented demo well, 10 nm of GaAs between
// Al0.3Ga0.7As barriers: the e1–hh1 and e1–lh1 lines in eV and nm, their
// red shift, the overlap² that sets their strength, and how long the
// electron and the hole stay in the well, all from the exact
// finite-barrier levels.
func ExampleNewDevice() {
	exactFor := func(s tiltwell.Stack) tiltwell.WaveSolver { return exact.Solver{Stack: s} }
	ts := []tiltwell.Transition{{E: 1, H: 1}, {E: 1, H: 1, Hole: tiltwell.LightHole}}
	d, err := tiltwell.NewDevice(tiltwell.DemoGaAsWell(), exactFor, ts)
	if err != nil {
		log.Fatal(err)
	}
	// Built-in voltage 1.5 V, intrinsic region 1 µm, reverse biases
	// 0 to −9 V: 15 to 105 kV/cm.
	biases := []float64{0, -3, -6, -9}
	fields := make([]float64, len(biases))
	for i, v := range biases {
		if fields[i], err = tiltwell.DiodeField(1.5, v, 1e-6); err != nil {
			log.Fatal(err)
		}
	}
	lines, err := d.Lines(nil, fields)
	if err != nil {
		log.Fatal(err)
	}
	for i, l := range lines {
		fmt.Printf("bias %2.0f V %5.1f kV/cm %v: %.4f eV %6.2f nm shift %6.2f meV overlap² %.3f τ_e %8.2e s τ_h %8.2e s\n",
			biases[i/len(ts)], tiltwell.InKVPerCM(l.Field), l.Transition, l.Energy, l.Wavelength, l.Shift, l.Overlap2, l.ElectronEscape, l.HoleEscape)
	}
	// Output:
	// bias  0 V  15.0 kV/cm e1-hh1: 1.4605 eV 848.89 nm shift  -0.59 meV overlap² 0.955 τ_e 8.87e+48 s τ_h 7.73e+53 s
	// bias  0 V  15.0 kV/cm e1-lh1: 1.4755 eV 840.29 nm shift  -0.38 meV overlap² 0.989 τ_e 8.87e+48 s τ_h 4.81e+16 s
	// bias -3 V  45.0 kV/cm e1-hh1: 1.4561 eV 851.48 nm shift  -5.02 meV overlap² 0.778 τ_e 2.36e+05 s τ_h 3.21e+06 s
	// bias -3 V  45.0 kV/cm e1-lh1: 1.4725 eV 841.99 nm shift  -3.36 meV overlap² 0.914 τ_e 2.36e+05 s τ_h 1.20e-05 s
	// bias -6 V  75.0 kV/cm e1-hh1: 1.4482 eV 856.14 nm shift -12.96 meV overlap² 0.567 τ_e 5.24e-04 s τ_h 1.87e-03 s
	// bias -6 V  75.0 kV/cm e1-lh1: 1.4667 eV 845.34 nm shift  -9.20 meV overlap² 0.786 τ_e 5.24e-04 s τ_h 6.86e-10 s
	// bias -9 V 105.0 kV/cm e1-hh1: 1.4376 eV 862.43 nm shift -23.52 meV overlap² 0.395 τ_e 1.14e-07 s τ_h 2.73e-07 s
	// bias -9 V 105.0 kV/cm e1-lh1: 1.4581 eV 850.30 nm shift -17.75 meV overlap² 0.633 τ_e 1.14e-07 s τ_h 1.21e-11 s
}
