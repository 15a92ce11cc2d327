// Compare puts every method of tiltwell side by side on a demo well: at a
// few fields it prints each method's levels, their true error against the
// exact reference, the method's own error estimate, and the time per level
// measured on this machine, as an aligned text table.
//
// The well is invented demo data: a 20 nm well holding an electron of
// effective mass 0.067 m₀ (GaAs-like), not a device.
//
// Usage:
//
//	go run ./examples/compare [-kv 10,50,100,200] [-n 3] [barrier flags]
//
// The barrier flags of examples/levels (-barrier V -barrier-mass M, or
// -barrier-left, -barrier-right, -mass-left, -mass-right; heights in units
// of E₁ of the demo well) give the well finite barriers; the table then
// also shows each method's escape width Γ, its true error and its
// estimate.
//
// Energies are reduced, η = E/E₁; errors are in units of E₁. A method that
// answers outside its range of validity is marked "outside range"; one that
// does not answer shows its error.
package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"os"
	"strconv"
	"strings"
	"text/tabwriter"
	"time"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/examples/internal/catalog"
)

// method is one entry of the comparison.
type method struct {
	name string
	s    tiltwell.Solver
}

// methods are the methods compared, cheapest first, for the well st.
func methods(st tiltwell.Stack) ([]method, error) {
	var ms []method
	for _, m := range catalog.All() {
		m, err := catalog.WithStack(m, st)
		if err != nil {
			return nil, err
		}
		ms = append(ms, method{m.Name, m.Solver})
	}
	return ms, nil
}

// Demo well (invented): 20 nm, GaAs-like electron mass.
const (
	demoWidth = 20e-9
	demoMass  = 0.067
)

func main() {
	kvs := flag.String("kv", "10,50,100,200", "comma-separated fields in kV/cm")
	k := flag.Int("n", 3, "number of levels")
	b := catalog.BarrierFlags(flag.CommandLine)
	flag.Parse()
	fields, err := parseList(*kvs)
	if err == nil && *k < 1 {
		err = fmt.Errorf("-n %d: need at least one level", *k)
	}
	var st tiltwell.Stack
	if err == nil {
		st, err = b.Stack(flag.CommandLine)
	}
	if err != nil {
		fmt.Fprintln(os.Stderr, "compare:", err)
		os.Exit(2)
	}
	if err := run(os.Stdout, fields, *k, st); err != nil {
		fmt.Fprintln(os.Stderr, "compare:", err)
		os.Exit(2)
	}
}

func parseList(s string) ([]float64, error) {
	var out []float64
	for _, p := range strings.Split(s, ",") {
		x, err := strconv.ParseFloat(strings.TrimSpace(p), 64)
		if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
			return nil, fmt.Errorf("bad field %q in -kv", p)
		}
		out = append(out, x)
	}
	return out, nil
}

func run(w io.Writer, kvs []float64, k int, st tiltwell.Stack) error {
	well, err := tiltwell.NewWell(demoWidth, demoMass)
	if err != nil {
		return err
	}
	fmt.Fprintf(w, "Demo well (invented data): L = %g nm, m* = %g m₀ (GaAs-like electron).\n", demoWidth*1e9, demoMass)
	fmt.Fprintf(w, "E₁ = %.4f meV, F₀ = %.4f kV/cm. Energies η = E/E₁, errors in E₁; time per level measured here.\n",
		well.MilliEV(1), well.FieldUnit()/1e5)
	finite := !st.Infinite()
	if finite {
		fmt.Fprintf(w, "Finite barriers %v; Γ is the escape width in E₁.\n", st)
	} else {
		fmt.Fprintf(w, "Infinitely high walls.\n")
	}
	fmt.Fprintln(w)

	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', tabwriter.AlignRight)
	head := "F kV/cm\tf\tn\tmethod\tη\t|η − exact|\testimate\tbound\t"
	if finite {
		head += "Γ\t|Γ − exact|\tΓ estimate\t"
	}
	fmt.Fprintln(tw, head+"ns/level\t")
	ms, err := methods(st)
	if err != nil {
		return err
	}
	for _, kv := range kvs {
		f := well.Reduced(tiltwell.KVPerCM(kv))
		ref, err := exact.Solver{Stack: st}.Levels(nil, f, k)
		if _, confined := tiltwell.Confined(err); err != nil && !confined {
			return fmt.Errorf("exact reference at %g kV/cm: %w", kv, err)
		}
		if len(ref) < k {
			fmt.Fprintf(tw, "%g\t%.4g\t\t\tthe well confines %d levels here\t\n", kv, f, len(ref))
		}
		results := make([][]tiltwell.Level, len(ms))
		errs := make([]error, len(ms))
		cost := make([]time.Duration, len(ms))
		for i, m := range ms {
			results[i], errs[i] = m.s.Levels(nil, f, k)
			if len(results[i]) == k && errs[i] == nil {
				cost[i] = perLevel(m.s, f, k)
			}
		}
		for n := 1; n <= len(ref); n++ {
			for i, m := range ms {
				ls := results[i]
				if len(ls) < n {
					fmt.Fprintf(tw, "%g\t%.4g\t%d\t%s\t—\t\t\t\t\t  %v\n", kv, f, n, m.name, errs[i])
					continue
				}
				l := ls[n-1]
				note := ""
				if errors.Is(errs[i], tiltwell.ErrOutOfRange) {
					note = "  outside range"
				}
				gamma := ""
				if finite {
					gamma = fmt.Sprintf("%.3g\t%.2g\t%.2g\t", l.Gamma, math.Abs(l.Gamma-ref[n-1].Gamma), l.GammaErr)
				}
				fmt.Fprintf(tw, "%g\t%.4g\t%d\t%s\t%.12f\t%.2g\t%.2g\t%v\t%s%d\t%s\n",
					kv, f, n, m.name, l.Energy, math.Abs(l.Energy-ref[n-1].Energy), l.Err, l.Bound, gamma, cost[i].Nanoseconds(), note)
			}
		}
	}
	return tw.Flush()
}

// perLevel times s.Levels at f, repeated for about a millisecond, and
// returns the fastest call's time per level: other work on the machine
// only ever adds time.
func perLevel(s tiltwell.Solver, f float64, k int) time.Duration {
	dst := make([]tiltwell.Level, 0, k)
	dst, _ = s.Levels(dst, f, k) // warm up: tables built on first use
	fastest := time.Duration(math.MaxInt64)
	for start := time.Now(); fastest == math.MaxInt64 || time.Since(start) < time.Millisecond; {
		t0 := time.Now()
		dst, _ = s.Levels(dst, f, k)
		fastest = min(fastest, time.Since(t0))
	}
	return fastest / time.Duration(k)
}
