package tiltwell_test

import (
	"fmt"
	"log"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/perturb"
)

// ExampleChoose picks between a cheap approximation and the exact
// reference: second-order perturbation theory is good enough for a loose
// tolerance at weak fields, and only the exact solver meets a tight one.
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
		fmt.Printf("tol %.0e: %s\n", tol, ch.Name)
		p := ch.Trials[0]
		fmt.Printf("  perturb2: worst estimate %.1e at f = %.2f, n = %d; met: %v\n", p.Worst.Err, p.F, p.Worst.N, p.Met)
		fmt.Printf("  exact: met: %v\n", ch.Trials[1].Met)
	}
	// Output:
	// tol 1e-03: perturb2
	//   perturb2: worst estimate 2.1e-05 at f = 1.00, n = 1; met: true
	//   exact: met: true
	// tol 1e-08: exact
	//   perturb2: worst estimate 2.1e-05 at f = 1.00, n = 1; met: false
	//   exact: met: true
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
	// F =   0 kV/cm, e1-h1: red shift  0.0000 meV, overlap² 1.000000
	// F =   0 kV/cm, e1-h2: red shift  0.0000 meV, overlap² 0.000000
	// F =  50 kV/cm, e1-h1: red shift  2.9019 meV, overlap² 0.903027
	// F =  50 kV/cm, e1-h2: red shift -0.1752 meV, overlap² 0.096150
	// F = 100 kV/cm, e1-h1: red shift 10.7432 meV, overlap² 0.711854
	// F = 100 kV/cm, e1-h2: red shift  0.0975 meV, overlap² 0.276829
}
