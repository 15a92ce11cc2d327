package main

import (
	"bytes"
	"strings"
	"testing"

	"github.com/tiltwell/tiltwell"
)

// TestRun checks the shape of the Markdown on one small range, and the one
// choice that does not depend on timing: at a tolerance of 1e-12 only the
// exact solver's own estimates (a few ulp) are small enough.
func TestRun(t *testing.T) {
	var buf bytes.Buffer
	if err := run(&buf, 2, []float64{1}, []float64{1e-2, 1e-12}, tiltwell.Stack{}); err != nil {
		t.Fatal(err)
	}
	out := buf.String()
	for _, want := range []string{
		"| method | \\|f\\| ≤ 1 |",
		"|---|---|",
		"| tolerance | \\|f\\| ≤ 1 |",
		"| 1e-12 | exact |",
	} {
		if !strings.Contains(out, want) {
			t.Errorf("output lacks %q:\n%s", want, out)
		}
	}
	if strings.Contains(out, "| 0.01 | none |") {
		t.Errorf("no method meets 1e-2 at |f| ≤ 1:\n%s", out)
	}
	// One row per method in each of the first two tables.
	if got, want := strings.Count(out, "\n| exact |"), 2; got != want {
		t.Errorf("%d exact rows, want %d:\n%s", got, want, out)
	}
}

// TestRunFinite: the finite-well tables have the escape-width table too,
// and at 1e-12 the choice is exact or variational, the two methods whose
// estimates reach that far at |f| ≤ 0.5 (which of them depends on timing,
// so both are accepted; exact is about 40× cheaper).
func TestRunFinite(t *testing.T) {
	st, err := finiteDemo()
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := run(&buf, 2, []float64{0.5}, []float64{1e-12}, st); err != nil {
		t.Fatal(err)
	}
	out := buf.String()
	for _, want := range []string{"Finite well [v=4.62", "escape widths Γ"} {
		if !strings.Contains(out, want) {
			t.Errorf("output lacks %q:\n%s", want, out)
		}
	}
	if !strings.Contains(out, "| 1e-12 | exact |") && !strings.Contains(out, "| 1e-12 | variational |") {
		t.Errorf("1e-12 not met by exact or variational:\n%s", out)
	}
	if got, want := strings.Count(out, "\n| exact |"), 3; got != want {
		t.Errorf("%d exact rows, want %d:\n%s", got, want, out)
	}
}
