package main

import (
	"bytes"
	"strings"
	"testing"

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
