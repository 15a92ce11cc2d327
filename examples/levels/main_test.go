package main

import (
	"strconv"
	"strings"
	"testing"
)

// TestOutputFormat checks the format of DESIGN.md: the header, one row per
// field and level, six tab-separated columns, floats that parse back to
// the same value, and the exact f = 0 levels n² (common practice, no
// source: the particle in a box).
func TestOutputFormat(t *testing.T) {
	for _, m := range []string{"exact", "perturb1", "perturb2", "variational", "wkb", "basis"} {
		var out strings.Builder
		code, err := run([]string{"-method", m, "-f", "0,0.5,-2", "-n", "3"}, &out)
		if code != 0 || err != nil {
			t.Fatalf("%s: exit %d, %v", m, code, err)
		}
		lines := strings.Split(strings.TrimSuffix(out.String(), "\n"), "\n")
		if lines[0] != "method\tf\tn\tenergy\terr\tbound" {
			t.Fatalf("%s: header %q", m, lines[0])
		}
		if len(lines) != 1+3*3 {
			t.Fatalf("%s: %d rows, want 9", m, len(lines)-1)
		}
		for i, l := range lines[1:] {
			c := strings.Split(l, "\t")
			if len(c) != 6 || c[0] != m {
				t.Fatalf("%s: row %q", m, l)
			}
			e, err1 := strconv.ParseFloat(c[3], 64)
			_, err2 := strconv.ParseFloat(c[4], 64)
			if err1 != nil || err2 != nil || (c[5] != "rigorous" && c[5] != "estimate") {
				t.Fatalf("%s: row %q", m, l)
			}
			if strconv.FormatFloat(e, 'g', -1, 64) != c[3] {
				t.Errorf("%s: energy %q is not the shortest round-trip form", m, c[3])
			}
			if m == "exact" && i < 3 {
				if want := float64((i + 1) * (i + 1)); e != want {
					t.Errorf("exact f=0 n=%d: %v, want %v", i+1, e, want)
				}
			}
		}
	}
}

// TestBadInput checks one-line errors and exit status 2.
func TestBadInput(t *testing.T) {
	for _, args := range [][]string{
		{"-method", "nosuch"},
		{"-f", "1,x"},
		{"-f", "NaN"},
		{"-f", "Inf"},
		{"-n", "0"},
		{"-n", "2000"},
		{"-bogus"},
		{"-method", "basis", "-basis-size", "-3"},
		{"-method", "basis", "-basis-size", "2", "-n", "5"},
		{"-wkb-plain"},
		{"-method", "exact", "-basis-size", "10"},
		{"extra"},
	} {
		var out strings.Builder
		code, err := run(args, &out)
		if code != 2 || err == nil || strings.Contains(err.Error(), "\n") {
			t.Errorf("%v: exit %d, err %v", args, code, err)
		}
	}
}

// TestOutsideRange checks that a method answering outside its validity
// prints its rows and exits 1.
func TestOutsideRange(t *testing.T) {
	var out strings.Builder
	code, err := run([]string{"-method", "perturb2", "-f", "100", "-n", "1"}, &out)
	if code != 1 || err == nil || strings.Count(out.String(), "\n") != 2 {
		t.Errorf("exit %d, err %v, output %q", code, err, out.String())
	}
}

// TestHelp checks that -h prints the flags and exits 0.
func TestHelp(t *testing.T) {
	var out strings.Builder
	code, err := run([]string{"-h"}, &out)
	if code != 0 || err != nil || !strings.Contains(out.String(), "-basis-size") {
		t.Errorf("exit %d, err %v, output %q", code, err, out.String())
	}
}
