package main

import (
	"bytes"
	"strings"
	"testing"
)

// TestRun: one row per field, level and method, and the exact solver's true
// error against itself is 0.
func TestRun(t *testing.T) {
	var buf bytes.Buffer
	if err := run(&buf, []float64{10, 100}, 2); err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(strings.TrimSpace(buf.String()), "\n")
	rows := 0
	for _, l := range lines {
		f := strings.Fields(l)
		if len(f) < 5 {
			continue
		}
		for _, m := range methods() {
			if f[3] == m.name {
				rows++
				if m.name == "exact" && f[5] != "0" {
					t.Errorf("exact row with true error %s: %q", f[5], l)
				}
			}
		}
	}
	if want := 2 * 2 * len(methods()); rows != want {
		t.Errorf("%d method rows, want %d:\n%s", rows, want, buf.String())
	}
}
