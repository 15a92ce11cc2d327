package main

import (
	"fmt"
	"runtime"
	"strconv"
	"strings"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/examples/internal/catalog"
)

// TestOutputFormat checks the documented format: the header, one row per
// field and level, eight tab-separated columns, floats that parse back to
// the same value, zero escape widths (infinite walls), and the exact
// f = 0 levels n² (common practice, no source: the particle in a box).
func TestOutputFormat(t *testing.T) {
	for _, m := range []string{"exact", "perturb1", "perturb2", "variational", "wkb", "basis"} {
		var out strings.Builder
		code, err := run([]string{"-method", m, "-f", "0,0.5,-2", "-n", "3"}, &out)
		if code != 0 || err != nil {
			t.Fatalf("%s: exit %d, %v", m, code, err)
		}
		lines := strings.Split(strings.TrimSuffix(out.String(), "\n"), "\n")
		if lines[0] != "method\tf\tn\tenergy\terr\tbound\tgamma\tgamma_err" {
			t.Fatalf("%s: header %q", m, lines[0])
		}
		if len(lines) != 1+3*3 {
			t.Fatalf("%s: %d rows, want 9", m, len(lines)-1)
		}
		for i, l := range lines[1:] {
			c := strings.Split(l, "\t")
			if len(c) != 8 || c[0] != m {
				t.Fatalf("%s: row %q", m, l)
			}
			g, err3 := strconv.ParseFloat(c[6], 64)
			ge, err4 := strconv.ParseFloat(c[7], 64)
			if err3 != nil || err4 != nil || g != 0 || ge < 0 {
				t.Fatalf("%s: row %q: gamma and gamma_err", m, l)
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

// TestBadInput checks one-line errors and exit status 2, and that each
// names what is wrong.
func TestBadInput(t *testing.T) {
	for _, c := range []struct {
		args []string
		want string
	}{
		{[]string{"-method", "nosuch"}, "unknown method"},
		{[]string{"-f", "1,x"}, `"x" is not a number`},
		{[]string{"-f", "NaN"}, `"NaN" is not a finite number`},
		{[]string{"-f", "Inf"}, `"Inf" is not a finite number`},
		{[]string{"-f", "1e400"}, `"1e400" is out of range`},
		{[]string{"-f", "-1e400"}, `"-1e400" is out of range`},
		{[]string{"-f", "1e-400"}, `"1e-400" underflows to 0`},
		{[]string{"-f", "0,-2e-324"}, `"-2e-324" underflows to 0`},
		{[]string{"-f", "0x1p-1080"}, `"0x1p-1080" underflows to 0`},
		{[]string{"-n", "0"}, "-n 0"},
		{[]string{"-n", "2000"}, "2000"},
		{[]string{"-bogus"}, "bogus"},
		{[]string{"-method", "basis", "-basis-size", "-3"}, "-basis-size -3"},
		{[]string{"-method", "basis", "-basis-size", "2", "-n", "5"}, "5"},
		{[]string{"-wkb-plain"}, "-wkb-plain"},
		{[]string{"-method", "exact", "-basis-size", "10"}, "-basis-size"},
		{[]string{"extra"}, "extra"},
	} {
		var out strings.Builder
		code, err := run(c.args, &out)
		if code != 2 || err == nil || strings.Contains(err.Error(), "\n") || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%v: exit %d, err %v; want exit 2 and one line that says %q", c.args, code, err, c.want)
		}
	}
	// Zero written any way is zero field, not an underflow.
	for _, f := range []string{"0", "-0", "0.000", "0e-999", "0x0p-2000"} {
		var out strings.Builder
		if code, err := run([]string{"-f", f, "-n", "1"}, &out); code != 0 || err != nil {
			t.Errorf("-f %s: exit %d, %v", f, code, err)
		}
	}
}

// TestRowsByteIdentical holds the rows against the formatting the
// command had before it wrote into a reused buffer: fmt with
// strconv.FormatFloat('g', -1) per column, which scripts may already
// parse. Fields include −0, a subnormal and a huge one.
func TestRowsByteIdentical(t *testing.T) {
	fields := []string{"0", "-0", "5e-324", "1e-300", "0.25", "-3", "17.5", "1000"}
	for _, m := range []string{"exact", "perturb2", "variational", "wkb", "basis"} {
		var out strings.Builder
		code, err := run([]string{"-method", m, "-n", "4", "-f", strings.Join(fields, ",")}, &out)
		if code == 2 || (code == 1) != (m == "perturb2") {
			t.Fatalf("%s: exit %d, %v", m, code, err)
		}
		c, _ := catalog.Lookup(m)
		var want strings.Builder
		want.WriteString("method\tf\tn\tenergy\terr\tbound\tgamma\tgamma_err\n")
		g := func(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
		for _, fs := range fields {
			f, _ := strconv.ParseFloat(fs, 64)
			ls, _ := c.Solver.Levels(nil, f, 4)
			for _, l := range ls {
				fmt.Fprintf(&want, "%s\t%s\t%d\t%s\t%s\t%s\t%s\t%s\n", m, g(f), l.N, g(l.Energy), g(l.Err), l.Bound, g(l.Gamma), g(l.GammaErr))
			}
		}
		if out.String() != want.String() {
			t.Errorf("%s: output differs from fmt formatting:\n%s\nwant\n%s", m, out.String(), want.String())
		}
	}
}

// countWriter counts the bytes written to it and keeps none.
type countWriter struct{ n int }

func (w *countWriter) Write(p []byte) (int, error) { w.n += len(p); return len(p), nil }

// TestStreams: the memory the command allocates does not grow with its
// output. 3000 fields × 100 levels write about 25 MB; the command used to
// hold all of it in memory before writing.
func TestStreams(t *testing.T) {
	_, list := benchFields(3000)
	var w countWriter
	var before, after runtime.MemStats
	runtime.ReadMemStats(&before)
	if code, err := run([]string{"-n", "100", "-f", list}, &w); code != 0 || err != nil {
		t.Fatalf("exit %d, %v", code, err)
	}
	runtime.ReadMemStats(&after)
	// What may be allocated: the parsed list (the -f string split into
	// 3000 strings and floats), the 64 KiB buffer, one row buffer and the
	// levels: well under 1 MB whatever the output.
	if alloc := after.TotalAlloc - before.TotalAlloc; alloc > 1<<20 || w.n < 20<<20 {
		t.Errorf("wrote %d bytes and allocated %d bytes", w.n, alloc)
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

// TestFailsMidway: a field the method refuses ends the output with exit
// status 2 after the rows of the fields before it, in order.
func TestFailsMidway(t *testing.T) {
	var out strings.Builder
	code, err := run([]string{"-f", "0,1,1e12,2", "-n", "2"}, &out)
	if code != 2 || err == nil {
		t.Fatalf("exit %d, err %v", code, err)
	}
	lines := strings.Split(strings.TrimSuffix(out.String(), "\n"), "\n")
	if len(lines) != 1+2*2 || !strings.HasPrefix(lines[3], "exact\t1\t1\t") {
		t.Errorf("output %q, want the header and the rows of f = 0 and 1", out.String())
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

// TestBarriers: the barrier flags give a finite well. Its zero-field
// levels solve the textbook finite-well condition (checked in the exact
// and squarewell packages; here the rows are held to exact.Solver with the
// same stack), escape widths appear under field, the mirror of an
// asymmetric well needs the mirrored flags, and a well that confines
// fewer levels than -n prints the confined ones and exits with status 1.
func TestBarriers(t *testing.T) {
	rows := func(args ...string) ([][]string, int, error) {
		var out strings.Builder
		code, err := run(args, &out)
		var rs [][]string
		for _, l := range strings.Split(strings.TrimSuffix(out.String(), "\n"), "\n")[1:] {
			rs = append(rs, strings.Split(l, "\t"))
		}
		return rs, code, err
	}
	st, err := tiltwell.AsymmetricWell(4, 1.2, 6, 1.5)
	if err != nil {
		t.Fatal(err)
	}
	rs, code, err := rows("-method", "exact", "-f", "0,2", "-n", "2", "-barrier-left", "4", "-barrier-right", "6", "-mass-left", "1.2", "-mass-right", "1.5")
	if code != 0 || err != nil || len(rs) != 4 {
		t.Fatalf("exit %d, %v, %d rows", code, err, len(rs))
	}
	for i, r := range rs {
		f, _ := strconv.ParseFloat(r[1], 64)
		want, err := exact.Solver{Stack: st}.Levels(nil, f, 2)
		if err != nil {
			t.Fatal(err)
		}
		w := want[i%2]
		if r[3] != strconv.FormatFloat(w.Energy, 'g', -1, 64) || r[6] != strconv.FormatFloat(w.Gamma, 'g', -1, 64) {
			t.Errorf("row %q, want energy %v gamma %v", r, w.Energy, w.Gamma)
		}
		if g, _ := strconv.ParseFloat(r[6], 64); (f == 0) != (g == 0) {
			t.Errorf("row %q: gamma %g at f = %g", r, g, f)
		}
	}
	// The mirror: -f with the sides swapped gives the same levels.
	a, _, _ := rows("-f", "3", "-n", "2", "-barrier-left", "4", "-barrier-right", "6")
	b, _, _ := rows("-f", "-3", "-n", "2", "-barrier-left", "6", "-barrier-right", "4")
	for i := range a {
		if a[i][3] != b[i][3] || a[i][6] != b[i][6] {
			t.Errorf("mirror: %q vs %q", a[i], b[i])
		}
	}
	// Fewer confined than asked: the confined rows, then exit status 1.
	rs, code, err = rows("-f", "0", "-n", "9", "-barrier", "4.62", "-barrier-mass", "1.372")
	if code != 1 || err == nil || len(rs) != 3 || !strings.Contains(err.Error(), "confines 3") {
		t.Errorf("-n 9 in a 3-level well: exit %d, %v, %d rows", code, err, len(rs))
	}
	// Bad combinations.
	for _, args := range [][]string{
		{"-barrier", "4", "-barrier-left", "3", "-barrier-right", "3"},
		{"-barrier-left", "3"},
		{"-barrier-mass", "2"},
		{"-barrier", "4", "-barrier-mass", "2", "-mass-left", "1"},
		{"-barrier", "NaN"},
		{"-barrier", "4", "-barrier-mass", "0"},
		{"-barrier", "4", "-barrier-mass", "-1"},
	} {
		var out strings.Builder
		if code, err := run(args, &out); code != 2 || err == nil {
			t.Errorf("%q: exit %d, %v; want status 2 and a message", args, code, err)
		}
	}
}
