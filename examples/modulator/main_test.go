package main

import (
	"math"
	"strconv"
	"strings"
	"testing"
)

// runOK runs the command and fails the test unless it exits 0.
func runOK(t *testing.T, args ...string) string {
	t.Helper()
	var out strings.Builder
	code, err := run(args, &out)
	if code != 0 || err != nil {
		t.Fatalf("%v: exit %d, %v", args, code, err)
	}
	return out.String()
}

// TestDefaultTSV checks the documented -tsv format of the default run:
// the header, one row per demo structure, field (0 to 200 kV/cm) and
// transition, nine columns, floats in their shortest round-trip form. It
// holds the rows to facts of the trade: the zero-field e1–hh1 line of a
// 10 nm GaAs/Al0.3Ga0.7As well near 1.46 eV and its red shift at 100
// kV/cm of the order of 10–20 meV (from memory; the single-particle shift
// is a few meV larger than the excitonic one measured, so 10–25 meV is
// accepted), and the InGaAs demo's zero-field e1–hh1 line in the 1.55 µm
// band it was sized for (1530–1565 nm, the C band; common practice, no
// source).
func TestDefaultTSV(t *testing.T) {
	t.Parallel()
	rows := strings.Split(strings.TrimSuffix(runOK(t, "-tsv"), "\n"), "\n")
	if rows[0] != "structure\tfield_kV_cm\ttransition\tenergy_eV\twavelength_nm\tshift_meV\toverlap2\tescape_e_s\tescape_h_s" {
		t.Fatalf("header %q", rows[0])
	}
	if got, want := len(rows)-1, 2*21*3; got != want {
		t.Fatalf("%d rows, want %d (2 structures, 21 fields, 3 transitions)", got, want)
	}
	count := map[string]int{}
	maxKV := 0.0
	for _, r := range rows[1:] {
		c := strings.Split(r, "\t")
		if len(c) != 9 {
			t.Fatalf("row %q: %d columns", r, len(c))
		}
		count[c[0]]++
		var v [9]float64
		for i := 1; i < 9; i++ {
			if i == 2 {
				continue
			}
			x, err := strconv.ParseFloat(c[i], 64)
			if err != nil || math.IsNaN(x) || strconv.FormatFloat(x, 'g', -1, 64) != c[i] {
				t.Fatalf("row %q: column %d %q is not a float in shortest form", r, i, c[i])
			}
			v[i] = x
		}
		kv, E, shift := v[1], v[3], v[5]
		maxKV = max(maxKV, kv)
		switch {
		case c[0] == "demo-GaAs" && c[2] == "e1-hh1" && kv == 0:
			if math.Abs(E-1.46) > 0.01 {
				t.Errorf("GaAs demo e1-hh1 at zero field: %v eV, want 1.46 ± 0.01", E)
			}
		case c[0] == "demo-GaAs" && c[2] == "e1-hh1" && kv == 100:
			if !(-shift >= 10 && -shift <= 25) {
				t.Errorf("GaAs demo red shift at 100 kV/cm: %v meV, want 10–25", -shift)
			}
		case c[0] == "demo-InGaAs" && c[2] == "e1-hh1" && kv == 0:
			if lam := v[4]; !(lam > 1530 && lam < 1565) {
				t.Errorf("InGaAs demo e1-hh1 at zero field: %v nm, want in the C band", lam)
			}
		}
		if c[2] != "e1-hh1" && c[2] != "e1-hh2" && c[2] != "e1-lh1" {
			t.Errorf("row %q: transition %q", r, c[2])
		}
	}
	if count["demo-GaAs"] != 63 || count["demo-InGaAs"] != 63 || maxKV < 150 {
		t.Errorf("rows per structure %v, largest field %v kV/cm", count, maxKV)
	}
}

// TestText checks the human-readable output: it says the demos are
// invented and that the picture is single-particle, and labels its
// columns.
func TestText(t *testing.T) {
	t.Parallel()
	out := runOK(t, "-kv", "0,100")
	for _, want := range []string{"invented demo", "no exciton", "Vurgaftman", "demo-GaAs", "demo-InGaAs", "shift meV", "overlap²", "τ_e s", "bound"} {
		if !strings.Contains(out, want) {
			t.Errorf("output lacks %q:\n%s", want, out)
		}
	}
}

// TestOwnStructure: a structure from flags, swept in bias, gives the field
// (V_bi − V)/d of a p-i-n diode in each row (the usual uniform-field
// approximation, common practice, no source) and the bias in a last
// column; it matches the demo it copies.
func TestOwnStructure(t *testing.T) {
	t.Parallel()
	rows := strings.Split(strings.TrimSuffix(runOK(t, "-tsv", "-well", "GaAs", "-barrier", "AlGaAs:0.3", "-width", "10",
		"-bias", "1:-3:1", "-vbi", "1.5", "-intrinsic", "500", "-transitions", "e1-hh1"), "\n"), "\n")
	if !strings.HasSuffix(rows[0], "\tescape_h_s\tbias_V") || len(rows) != 6 {
		t.Fatalf("header %q and %d rows, want bias_V last and 5 rows", rows[0], len(rows)-1)
	}
	demo := strings.Split(strings.TrimSuffix(runOK(t, "-tsv", "-kv", "10,30,50,70,90", "-transitions", "e1-hh1"), "\n"), "\n")
	for i, r := range rows[1:] {
		c := strings.Split(r, "\t")
		if c[0] != "GaAs/Al0.3Ga0.7As-10nm" {
			t.Errorf("structure name %q", c[0])
		}
		v, _ := strconv.ParseFloat(c[9], 64)
		kv, _ := strconv.ParseFloat(c[1], 64)
		if want := (1.5 - v) / 500e-9 / 1e5; math.Abs(kv-want) > 1e-12*want || v != float64(1-i) {
			t.Errorf("bias %v V: field %v kV/cm, want %v", v, kv, want)
		}
		d := strings.Split(demo[1+i], "\t")
		if c[3][:10] != d[3][:10] {
			t.Errorf("bias %v V: energy %s eV, the demo at %s kV/cm: %s", v, c[3], d[1], d[3])
		}
	}
}

// TestInfinite keeps the infinite-wall demo: its e1–hh1 red shift at 100
// kV/cm is 10.7432 meV to four decimals (computed with mpmath from the Airy
// determinant, DLMF 9.2, and the CODATA 2018 constants; see the root
// package's TestSweepRedShift).
func TestInfinite(t *testing.T) {
	t.Parallel()
	out := runOK(t, "-infinite", "-kv", "0,100")
	if !strings.Contains(out, "10.7432") || !strings.Contains(out, "overlap e1-hh1") || !strings.Contains(out, "Invented") {
		t.Errorf("no red shift of 10.7432 meV at 100 kV/cm, or no labels:\n%s", out)
	}
}

// TestBadInput: one-line errors and exit status 2, each naming what is
// wrong; at a field where a level is no longer confined the rows before
// it are written first.
func TestBadInput(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		args []string
		want string
	}{
		{[]string{"-well", "Unobtainium", "-barrier", "GaAs", "-width", "10"}, `unknown material "Unobtainium"`},
		{[]string{"-well", "GaAs", "-barrier", "AlGaAs:1.3", "-width", "10"}, "x = 1.3 outside [0, 1]"},
		{[]string{"-well", "GaAs", "-barrier", "AlGaAs:0.6", "-width", "10"}, "indirect"},
		{[]string{"-well", "InGaAs:0.53", "-barrier", "AlGaAs:0.3", "-width", "10"}, "lattice mismatch"},
		{[]string{"-well", "GaAs", "-barrier", "AlGaAs:0.3", "-width", "-10"}, "-width -10"},
		{[]string{"-well", "GaAs", "-barrier", "AlGaAs:0.3", "-width", "10", "-temp", "0"}, "temperature (K) 0"},
		{[]string{"-well", "GaAs", "-barrier", "AlGaAs:0.3", "-width", "10", "-temp", "-5"}, "temperature (K) -5"},
		{[]string{"-well", "GaAs", "-width", "10"}, "together"},
		{[]string{"-temp", "77"}, "your own structure"},
		{[]string{"-kv", "0:100:0"}, "must not be 0"},
		{[]string{"-kv", "0,NaN"}, `"NaN" is not a finite number`},
		{[]string{"-kv", "1:2"}, "FROM:TO:STEP"},
		{[]string{"-kv", "0:1e300:1e-300"}, "points, at most"},
		{[]string{"-bias", "0:-5:1"}, "-bias needs -vbi"},
		{[]string{"-bias", "0", "-vbi", "1", "-intrinsic", "0"}, "-intrinsic 0"},
		{[]string{"-vbi", "1"}, "go with -bias"},
		{[]string{"-kv", "10", "-bias", "0", "-vbi", "1", "-intrinsic", "100"}, "not both"},
		{[]string{"-transitions", "e1-hh0"}, "levels run from 1"},
		{[]string{"-transitions", "hh1-e1"}, "want the form e1-hh1"},
		{[]string{"-transitions", "e1-lh3"}, "light hole's level 3 is not confined"},
		{[]string{"-method", "wkb"}, "goes with -infinite"},
		{[]string{"-infinite", "-method", "nosuch"}, "unknown -method"},
		{[]string{"-infinite", "-tsv"}, "does not go with -infinite"},
		{[]string{"extra"}, "unexpected argument"},
		{[]string{"-bogus"}, "bogus"},
	} {
		var out strings.Builder
		code, err := run(c.args, &out)
		if code != 2 || err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%v: exit %d, %v; want 2 and an error saying %q", c.args, code, err, c.want)
			continue
		}
		if msg := oneLine(err.Error()); msg != err.Error() {
			t.Errorf("%v: error %q is not one line", c.args, err)
		}
	}
	var out strings.Builder
	code, err := run([]string{"-tsv", "-kv", "0,100,2000,50", "-transitions", "e1-hh1"}, &out)
	if code != 2 || err == nil || !strings.Contains(err.Error(), "at 2000 kV/cm") || !strings.Contains(err.Error(), "electron's level 1 is not confined") {
		t.Errorf("2000 kV/cm: exit %d, %v; want 2 and the electron's level 1 not confined", code, err)
	}
	if rows := strings.Count(out.String(), "\n"); rows != 3 {
		t.Errorf("2000 kV/cm: %d lines written, want the header and the rows at 0 and 100 kV/cm:\n%s", rows, out.String())
	}
}

// TestHelp prints the usage and exits 0.
func TestHelp(t *testing.T) {
	t.Parallel()
	out := runOK(t, "-h")
	if !strings.Contains(out, "usage: modulator") || !strings.Contains(out, "exact") {
		t.Errorf("help text:\n%s", out)
	}
}
