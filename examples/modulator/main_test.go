package main

import (
	"bytes"
	"strings"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
)

// TestRun: the e1–hh1 red shift of the demo pair at 100 kV/cm is
// 10.7432 meV to four decimals (computed with mpmath from the Airy
// determinant, DLMF 9.2, and the CODATA 2018 constants; see the root
// package's TestSweepRedShift), and the columns are labelled in the
// trade's notation, e1-hh1 and e1-hh2 (common practice, no source).
func TestRun(t *testing.T) {
	var buf bytes.Buffer
	if err := run(&buf, exact.Solver{}, "exact", []float64{0, tiltwell.KVPerCM(100)}); err != nil {
		t.Fatal(err)
	}
	out := buf.String()
	if !strings.Contains(out, "10.7432") {
		t.Errorf("no red shift of 10.7432 meV at 100 kV/cm:\n%s", out)
	}
	if !strings.Contains(out, "overlap e1-hh1") || !strings.Contains(out, "overlap² e1-hh2") {
		t.Errorf("header does not name e1-hh1 and e1-hh2:\n%s", out)
	}
	if !strings.Contains(out, "1.000000  1.000000         0.000000") {
		t.Errorf("zero-field row does not show overlap 1, e1-hh2 0:\n%s", out)
	}
}
