package main

import (
	"bytes"
	"strings"
	"testing"

	"github.com/tiltwell/tiltwell"
)

// TestRun: one row per field, level and method, and the exact solver's true
// error against itself is 0.
func TestRun(t *testing.T) {
	var buf bytes.Buffer
	if err := run(&buf, []float64{10, 100}, 2, tiltwell.Stack{}); err != nil {
		t.Fatal(err)
	}
	ms, err := methods(tiltwell.Stack{})
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(strings.TrimSpace(buf.String()), "\n")
	rows := 0
	for _, l := range lines {
		f := strings.Fields(l)
		if len(f) < 5 {
			continue
		}
		for _, m := range ms {
			if f[3] == m.name {
				rows++
				if m.name == "exact" && f[5] != "0" {
					t.Errorf("exact row with true error %s: %q", f[5], l)
				}
			}
		}
	}
	if want := 2 * 2 * len(ms); rows != want {
		t.Errorf("%d method rows, want %d:\n%s", rows, want, buf.String())
	}
}

// TestRunFinite: with finite barriers every method answers, with the Γ
// columns, and exact's own Γ error is 0.
func TestRunFinite(t *testing.T) {
	st, err := tiltwell.FiniteWell(18, 1.37)
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := run(&buf, []float64{0, 20}, 2, st); err != nil {
		t.Fatal(err)
	}
	out := buf.String()
	if !strings.Contains(out, "|Γ − exact|") {
		t.Fatalf("no Γ columns:\n%s", out)
	}
	rows := 0
	for _, l := range strings.Split(out, "\n") {
		f := strings.Fields(l)
		if len(f) >= 11 && f[3] == "exact" {
			rows++
			if f[5] != "0" || f[9] != "0" {
				t.Errorf("exact row with nonzero true error: %q", l)
			}
		}
	}
	if rows != 4 {
		t.Errorf("%d exact rows, want 4:\n%s", rows, out)
	}
}
