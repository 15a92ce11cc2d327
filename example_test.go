package tiltwell_test

import (
	"fmt"
	"log"
	"strings"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/perturb"
)

// ExampleChoose picks between a cheap approximation and the exact
// reference: second-order perturbation theory is good enough for a loose
// tolerance at weak fields, and only the exact solver meets a tight one.
// Where both meet the tolerance Choose takes the faster on this machine
// (perturb2, typically 20 times faster), so the example prints which
// candidates met it rather than a choice that depends on timing.
func ExampleChoose() {
	cands := []tiltwell.Candidate{
		{Name: "perturb2", Solver: perturb.Solver{Order: 2}},
		{Name: "exact", Solver: exact.Solver{}},
	}
	fields := []float64{0, 0.25, 0.5, 0.75, 1}
	for _, tol := range []float64{1e-3, 1e-8} {
		ch, err := tiltwell.Choose(cands, tol, fields, 3)
		if err != nil {
			log.Fatal(err)
		}
		var met []string
		for _, tr := range ch.Trials {
			if tr.Met {
				met = append(met, tr.Name)
			}
		}
		fmt.Printf("tol %.0e: met by %s\n", tol, strings.Join(met, " and "))
		p := ch.Trials[0]
		fmt.Printf("  perturb2: worst estimate %.1e at f = %.2f, n = %d\n", p.Worst.Err, p.F, p.Worst.N)
		if len(met) == 1 {
			fmt.Printf("  chosen: %s\n", ch.Name)
		}
	}
	// Output:
	// tol 1e-03: met by perturb2 and exact
	//   perturb2: worst estimate 2.1e-05 at f = 1.00, n = 1
	// tol 1e-08: met by exact
	//   perturb2: worst estimate 2.1e-05 at f = 1.00, n = 1
	//   chosen: exact
}

// ExampleChoose_physicalUnits chooses a method for a 10 nm GaAs-like
// electron well (demo data: m* = 0.067) from 0 to 100 kV/cm with a
// tolerance of 0.01 meV, converted with the Well's methods, and sweeps the
// e1–hh1 transition with the chosen solver. Only the exact solver meets
// 0.01 meV over that range, so the choice does not depend on timing.
func ExampleChoose_physicalUnits() {
	w, err := tiltwell.NewWell(10e-9, 0.067)
	if err != nil {
		log.Fatal(err)
	}
	var fields []float64
	for kv := 0.0; kv <= 100; kv += 25 {
		fields = append(fields, w.Reduced(tiltwell.KVPerCM(kv)))
	}
	cands := []tiltwell.Candidate{
		{Name: "perturb2", Solver: perturb.Solver{Order: 2}},
		{Name: "exact", Solver: exact.Solver{}},
	}
	ch, err := tiltwell.Choose(cands, w.FromMilliEV(0.01), fields, 2)
	if err != nil {
		log.Fatal(err)
	}
	p := ch.Trials[0]
	fmt.Printf("perturb2: worst estimate %.3f meV at %.0f kV/cm\n", w.MilliEV(p.Worst.Err), tiltwell.InKVPerCM(w.Field(p.F)))
	fmt.Printf("chosen: %s\n", ch.Name)

	pair := tiltwell.Pair{Width: 10e-9, Electron: 0.067, Hole: 0.3497}
	lines, err := pair.Sweep(ch.WaveSolver, nil, []float64{tiltwell.KVPerCM(100)}, []tiltwell.Transition{{E: 1, H: 1}})
	if err != nil {
		log.Fatal(err)
	}
	fmt.Printf("%v at 100 kV/cm: red shift %.4f meV\n", lines[0].Transition, -lines[0].Shift)
	// Output:
	// perturb2: worst estimate 0.012 meV at 100 kV/cm
	// chosen: exact
	// e1-hh1 at 100 kV/cm: red shift 10.7432 meV
}

// ExampleWavelength converts between photon energy and vacuum wavelength:
// the room-temperature band gap of GaAs, about 1.42 eV (common practice,
// no source), and a line shifted 10 meV to the red.
func ExampleWavelength() {
	fmt.Printf("1.42 eV: %.1f nm\n", tiltwell.Wavelength(1.42))
	fmt.Printf("1.41 eV: %.1f nm\n", tiltwell.Wavelength(1.42-0.010))
	fmt.Printf("850 nm: %.4f eV\n", tiltwell.PhotonEnergy(850))
	// Output:
	// 1.42 eV: 873.1 nm
	// 1.41 eV: 879.3 nm
	// 850 nm: 1.4586 eV
}

// ExamplePair_Sweep computes the red shift and the overlap of the e1–hh1
// transition of an electron and a heavy hole in a 10 nm GaAs-like well
// (demo data; masses from I. Vurgaftman et al., J. Appl. Phys. 89, 5815
// (2001)), and the e1–hh2 transition the field makes allowed.
func ExamplePair_Sweep() {
	pair := tiltwell.Pair{Width: 10e-9, Electron: 0.067, Hole: 0.3497}
	fields := []float64{0, tiltwell.KVPerCM(50), tiltwell.KVPerCM(100)}
	ts := []tiltwell.Transition{{E: 1, H: 1}, {E: 1, H: 2}}
	lines, err := pair.Sweep(exact.Solver{}, nil, fields, ts)
	if err != nil {
		log.Fatal(err)
	}
	for _, l := range lines {
		fmt.Printf("F = %3.0f kV/cm, %v: red shift %7.4f meV, overlap² %.6f\n", l.Field/1e5, l.Transition, 0-l.Shift, l.Overlap2)
	}
	// Output:
	// F =   0 kV/cm, e1-hh1: red shift  0.0000 meV, overlap² 1.000000
	// F =   0 kV/cm, e1-hh2: red shift  0.0000 meV, overlap² 0.000000
	// F =  50 kV/cm, e1-hh1: red shift  2.9019 meV, overlap² 0.903027
	// F =  50 kV/cm, e1-hh2: red shift -0.1752 meV, overlap² 0.096150
	// F = 100 kV/cm, e1-hh1: red shift 10.7432 meV, overlap² 0.711854
	// F = 100 kV/cm, e1-hh2: red shift  0.0975 meV, overlap² 0.276829
}
