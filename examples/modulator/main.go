// Modulator prints what an electroabsorption modulator designer wants from
// a quantum well: the red shift of the e1–hh1 transition and the
// electron–hole overlap versus the applied field in kV/cm, with the e1–hh2
// transition that the field makes allowed.
//
// The pair is demo data: an electron and a heavy hole in a 10 nm
// GaAs-like well with infinitely high walls. The masses are GaAs values,
// m_e = 0.067 m₀ and m_hh = 1/(γ₁ − 2γ₂) = 0.3497 m₀ along [001], from
// I. Vurgaftman, J. R. Meyer, L. R. Ram-Mohan, "Band parameters for III–V
// compound semiconductors and their alloys", J. Appl. Phys. 89, 5815
// (2001). Real wells have finite barriers and excitons, which this model
// leaves out: check a device design against measurement.
//
// Usage:
//
//	go run ./examples/modulator [-method exact|perturb2|wkb|variational|basis|…] [-kv 0,20,...]
package main

import (
	"flag"
	"fmt"
	"io"
	"math"
	"os"
	"strconv"
	"strings"
	"text/tabwriter"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/examples/internal/catalog"
)

// demoPair is the invented demo device: a 10 nm well with GaAs masses.
var demoPair = tiltwell.Pair{Width: 10e-9, Electron: 0.067, Hole: 0.3497}

func main() {
	name := flag.String("method", "exact", "method: "+catalog.Names())
	kvs := flag.String("kv", "0,20,40,60,80,100,120,140,160,180,200", "comma-separated fields in kV/cm")
	flag.Parse()
	m, ok := catalog.Lookup(*name)
	if !ok {
		fmt.Fprintf(os.Stderr, "modulator: unknown -method %q (want one of %s)\n", *name, catalog.Names())
		os.Exit(2)
	}
	s := m.Solver
	var fields []float64
	for _, p := range strings.Split(*kvs, ",") {
		kv, err := strconv.ParseFloat(strings.TrimSpace(p), 64)
		if err != nil || math.IsNaN(kv) || math.IsInf(kv, 0) {
			fmt.Fprintf(os.Stderr, "modulator: bad field %q in -kv\n", p)
			os.Exit(2)
		}
		fields = append(fields, tiltwell.KVPerCM(kv))
	}
	if err := run(os.Stdout, s, *name, fields); err != nil {
		fmt.Fprintln(os.Stderr, "modulator:", err)
		os.Exit(2)
	}
}

func run(w io.Writer, s tiltwell.WaveSolver, name string, fields []float64) error {
	we, wh, err := demoPair.Wells()
	if err != nil {
		return err
	}
	ts := []tiltwell.Transition{{E: 1, H: 1}, {E: 1, H: 2}}
	lines, err := demoPair.Sweep(s, s, fields, ts)
	if err != nil {
		return err
	}
	fmt.Fprintf(w, "Demo pair (invented device, GaAs masses from Vurgaftman et al., J. Appl. Phys. 89, 5815 (2001)):\n")
	fmt.Fprintf(w, "L = %g nm, m_e = %g m₀, m_hh = %g m₀; E₁(e) = %.3f meV, E₁(hh) = %.3f meV. Method: %s.\n\n",
		demoPair.Width*1e9, demoPair.Electron, demoPair.Hole, we.MilliEV(1), wh.MilliEV(1), name)
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', tabwriter.AlignRight)
	fmt.Fprintf(tw, "F kV/cm\tf_e\tf_hh\tred shift meV\t± meV\toverlap %v\toverlap²\toverlap² %v\t\n", ts[0], ts[1])
	for i := 0; i < len(lines); i += len(ts) {
		l11, l12 := lines[i], lines[i+1]
		fmt.Fprintf(tw, "%g\t%.3f\t%.3f\t%.4f\t%.1g\t%.6f\t%.6f\t%.6f\t\n",
			l11.Field/1e5, we.Reduced(l11.Field), wh.Reduced(l11.Field), 0-l11.Shift, l11.ShiftErr, l11.Overlap, l11.Overlap2, l12.Overlap2)
	}
	return tw.Flush()
}
