package main

import (
	"bytes"
	"strings"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/exact/exacttest"
)

// TestRun: the program's story holds: second-order convergence, a failing
// report at a strict tolerance, and a passing regression check.
func TestRun(t *testing.T) {
	var buf bytes.Buffer
	if err := run(&buf); err != nil {
		t.Fatal(err)
	}
	out := buf.String()
	for _, want := range []string{"4.00", "FAIL", "(-want +got)", "passes"} {
		if !strings.Contains(out, want) {
			t.Errorf("output lacks %q:\n%s", want, out)
		}
	}
}

// TestFD holds the finite-difference solver, with its safety factor, to
// the contract and its own estimates, as a user's test would.
func TestFD(t *testing.T) {
	exacttest.TestSolver(t, fd{intervals: 400, safety: 2}, exact.Grid{Fields: []float64{0, 0.5, 3, 30, -8}, Levels: 4})
}

// TestFDWell: the finite-well box solver passes at zero field, where the
// levels are bound, and the checker catches its Γ = 0 claim under field
// and its spurious barrier state at f = 2 (the story the program tells).
func TestFDWell(t *testing.T) {
	st, err := tiltwell.FiniteWell(4.62, 1.372)
	if err != nil {
		t.Fatal(err)
	}
	s := fdWell{vl: 4.62, ml: 1.372, vr: 4.62, mr: 1.372, perUnit: 400, pad: 3, safety: 2}
	exacttest.TestSolver(t, s, exact.Grid{Stack: st, Fields: []float64{0}, Levels: 3})
	r, err := exact.Check(s, exact.Grid{Stack: st, Fields: []float64{0.5}, Levels: 2})
	if err != nil {
		t.Fatal(err)
	}
	if r.OK() || r.Gamma == nil || r.Gamma.GrossUndershoots != 2 || r.GrossUndershoots != 0 {
		t.Errorf("f = 0.5: OK %v, Γ report %+v, %d gross energy undershoots; want the Γ claims caught and the energies passed", r.OK(), r.Gamma, r.GrossUndershoots)
	}
	var buf bytes.Buffer
	if err := finiteWell(&buf); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"At zero field, 3 bound levels: passes", "Γ = 0 ± 0", "lies in the tilted barrier"} {
		if !strings.Contains(buf.String(), want) {
			t.Errorf("output lacks %q:\n%s", want, buf.String())
		}
	}
}
