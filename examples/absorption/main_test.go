package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// runOK runs the command and fails the test unless it succeeds.
func runOK(t *testing.T, args ...string) string {
	t.Helper()
	var out bytes.Buffer
	code, err := run(args, &out)
	if err != nil || code != 0 {
		t.Fatalf("run %q: status %d, error %v", args, code, err)
	}
	return out.String()
}

// The -excitons rows of the default run cover both demo structures at 0,
// 50, 100 and 150 kV/cm, four transitions each, with the documented
// header; the e1–hh1 exciton of the GaAs demo binds by 7.87 meV at zero
// field and less at 150 kV/cm.
func TestExcitonRows(t *testing.T) {
	if raceEnabled {
		t.Skip("the default run's 32 exciton bindings take half a minute under the race detector; TestSpectrumRows runs the same code")
	}
	out := runOK(t, "-excitons")
	lines := strings.Split(strings.TrimSpace(out), "\n")
	if want := "structure\tfield_kV_cm\ttransition\tenergy_eV\tbinding_meV\toverlap2"; lines[0] != want {
		t.Fatalf("header %q, want %q", lines[0], want)
	}
	if got, want := len(lines)-1, 2*4*4; got != want {
		t.Fatalf("%d rows, want %d", got, want)
	}
	binding := map[string]float64{}
	for _, l := range lines[1:] {
		f := strings.Split(l, "\t")
		if len(f) != 6 {
			t.Fatalf("row %q: %d columns", l, len(f))
		}
		for _, v := range f[3:] {
			x, err := strconv.ParseFloat(v, 64)
			if err != nil || x < 0 {
				t.Fatalf("row %q: %q", l, v)
			}
		}
		if f[2] == "e1-hh1" {
			binding[f[0]+"@"+f[1]], _ = strconv.ParseFloat(f[4], 64)
		}
	}
	if b := binding["demo-GaAs@0"]; b < 7.86 || b > 7.88 {
		t.Errorf("GaAs e1–hh1 binding at 0 kV/cm: %g meV, want 7.87", b)
	}
	if !(binding["demo-GaAs@150"] < binding["demo-GaAs@0"]) || !(binding["demo-InGaAs@150"] < binding["demo-InGaAs@0"]) {
		t.Errorf("bindings do not fall with the field: %v", binding)
	}
}

// The -tsv rows: the documented header, one row per structure, field and
// photon energy, and α that is finite and nonnegative, with the
// wavelength matching the photon energy.
func TestSpectrumRows(t *testing.T) {
	out := runOK(t, "-tsv", "-kv", "0,150", "-points", "50")
	lines := strings.Split(strings.TrimSpace(out), "\n")
	if want := "structure\tfield_kV_cm\tphoton_eV\twavelength_nm\talpha_per_cm"; lines[0] != want {
		t.Fatalf("header %q, want %q", lines[0], want)
	}
	if got, want := len(lines)-1, 2*2*50; got != want {
		t.Fatalf("%d rows, want %d", got, want)
	}
	for _, l := range lines[1:] {
		f := strings.Split(l, "\t")
		e, _ := strconv.ParseFloat(f[2], 64)
		nm, _ := strconv.ParseFloat(f[3], 64)
		a, err := strconv.ParseFloat(f[4], 64)
		if err != nil || !(a >= 0 && a < 1e6) || e*nm < 1239.8 || e*nm > 1239.9 {
			t.Fatalf("row %q", l)
		}
	}
}

func TestText(t *testing.T) {
	out := runOK(t, "-kv", "0,100")
	for _, want := range []string{"demo-GaAs", "demo-InGaAs", "invented demo", "e1-hh1", "strongest peak", "to   100 kV/cm"} {
		if !strings.Contains(out, want) {
			t.Errorf("output lacks %q:\n%s", want, out)
		}
	}
}

func TestPicture(t *testing.T) {
	name := filepath.Join(t.TempDir(), "a.png")
	runOK(t, "-kv", "0,100", "-points", "100", "-png", name)
	b, err := os.ReadFile(name)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.HasPrefix(b, []byte("\x89PNG")) {
		t.Errorf("%s is not a PNG", name)
	}
}

func TestBadInput(t *testing.T) {
	for _, args := range [][]string{
		{"-inhomogeneous", "-1"},
		{"-inhomogeneous", "0"},
		{"-homogeneous", "NaN"},
		{"-spread", "-0.1"},
		{"-kv", "0,x"},
		{"-kv", "NaN"},
		{"-points", "1"},
		{"-transitions", "e1-xx1"},
		{"-transitions", "e0-hh1"},
		{"-confinement", "2"},
		{"-length", "0"},
		{"-max-insertion", "-3"},
		{"-tsv", "-excitons"},
		{"-png", "a.gif"},
		{"stray"},
		{"-kv", "1e9"}, // beyond where the levels are confined
	} {
		var out bytes.Buffer
		code, err := run(args, &out)
		if code != 2 || err == nil {
			t.Errorf("%q: status %d, error %v; want status 2 and an error", args, code, err)
		}
	}
}

func TestHelp(t *testing.T) {
	if out := runOK(t, "-h"); !strings.Contains(out, "-excitons") {
		t.Errorf("help text lacks -excitons:\n%s", out)
	}
}
