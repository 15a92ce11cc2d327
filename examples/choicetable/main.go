// Choicetable prints, as Markdown, the README's method-choice tables: for
// each method and each range of reduced fields, the worst true error of
// the lowest levels against the exact reference and the method's own
// estimate, the time per level measured on this machine, and the method
// tiltwell.Choose picks for a few tolerances.
//
// The fields are reduced (f in F₀, energies in E₁), so the tables hold for
// any well; no physical data is involved. Timings, and so the choices
// between methods that all meet a tolerance, depend on the machine.
//
// With -finite the tables are for a finite well instead: the electron of
// the invented 10 nm GaAs/Al0.3Ga0.7As demo well (barrier 4.62 E₁, mass
// ratio 1.372, as tiltwell.DemoGaAsWell gives them), over the fields where
// it still confines its two lowest levels, with a fourth table of the
// escape widths' errors.
//
// Usage:
//
//	go run ./examples/choicetable > table.md
//	go run ./examples/choicetable -finite > finite.md
package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"os"
	"strings"
	"time"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/examples/internal/catalog"
)

// candidates are the methods in the tables, cheapest first, for the well
// st.
func candidates(st tiltwell.Stack) ([]tiltwell.Candidate, error) {
	var cs []tiltwell.Candidate
	for _, m := range catalog.All() {
		m, err := catalog.WithStack(m, st)
		if err != nil {
			return nil, err
		}
		cs = append(cs, tiltwell.Candidate{Name: m.Name, Solver: m.Solver})
	}
	return cs, nil
}

// ranges are the largest |f| of each column: for the infinite well, and
// for the finite demo well, which confines its two lowest levels up to
// about f = 4.
var (
	ranges       = []float64{1, 10, 100, 1000}
	finiteRanges = []float64{0.5, 1, 2, 4}
)

// finiteDemo is the finite well of -finite.
func finiteDemo() (tiltwell.Stack, error) { return tiltwell.FiniteWell(4.62, 1.372) }

// tolerances are the rows of the choice table, absolute in E₁.
var tolerances = []float64{1e-1, 1e-2, 1e-4, 1e-8, 1e-12}

// fieldsUpTo samples [0, fmax]: zero, then fmax times 1e-3 … 1 (1-2-5
// steps, then tenths), so that both the weak-field end and the strong end
// are covered.
func fieldsUpTo(fmax float64) []float64 {
	fs := []float64{0}
	for _, x := range []float64{1e-3, 2e-3, 5e-3, 1e-2, 2e-2, 5e-2} {
		fs = append(fs, x*fmax)
	}
	for i := 1; i <= 10; i++ {
		fs = append(fs, float64(i)/10*fmax)
	}
	return fs
}

func main() {
	k := flag.Int("n", 0, "number of levels (default 3, or 2 with -finite)")
	fin := flag.Bool("finite", false, "tables for the finite demo well")
	flag.Parse()
	var st tiltwell.Stack
	rs := ranges
	if *k == 0 {
		*k = 3
		if *fin {
			*k = 2
		}
	}
	if *fin {
		var err error
		if st, err = finiteDemo(); err != nil {
			fmt.Fprintln(os.Stderr, "choicetable:", err)
			os.Exit(2)
		}
		rs = finiteRanges
	}
	if *k < 1 || *k > 20 {
		fmt.Fprintf(os.Stderr, "choicetable: -n %d: want 1 to 20 levels\n", *k)
		os.Exit(2)
	}
	if err := run(os.Stdout, *k, rs, tolerances, st); err != nil {
		fmt.Fprintln(os.Stderr, "choicetable:", err)
		os.Exit(2)
	}
}

// cell is one method over one range.
type cell struct {
	trueErr, est float64
	gammaErr     float64 // worst |Γ − Γ_exact|
	gammaEst     float64 // worst GammaErr
	outside      bool    // the method refused or flagged a field of the range
	cost         time.Duration
}

// errorTable writes one table of worst errors, a row per method and a
// column per range: the true error and the method's own estimate that
// pick returns from a cell, "reference (estimate)" for the exact solver
// and "outside" where the method refused or flagged a field.
func errorTable(w io.Writer, header, rule string, cands []tiltwell.Candidate, cells [][]cell, pick func(cell) (trueErr, est float64)) {
	fmt.Fprintln(w, header)
	fmt.Fprintln(w, rule)
	for ci, c := range cands {
		var b strings.Builder
		fmt.Fprintf(&b, "| %s |", c.Name)
		for _, cl := range cells[ci] {
			trueErr, est := pick(cl)
			switch {
			case cl.outside:
				b.WriteString(" outside |")
			case c.Name == "exact":
				fmt.Fprintf(&b, " reference (%s) |", sci(est))
			default:
				fmt.Fprintf(&b, " %s (%s) |", sci(trueErr), sci(est))
			}
		}
		fmt.Fprintln(w, b.String())
	}
}

// run writes the three tables for k levels over the given ranges of |f|
// and tolerances.
func run(w io.Writer, k int, ranges, tolerances []float64, st tiltwell.Stack) error {
	cands, err := candidates(st)
	if err != nil {
		return err
	}
	cells := make([][]cell, len(cands))
	choices := make([][]string, len(tolerances))
	for ri, fmax := range ranges {
		fields := fieldsUpTo(fmax)
		for ci, c := range cands {
			cl, err := measure(c.Solver, st, fields, k)
			if err != nil {
				return fmt.Errorf("%s: %w", c.Name, err)
			}
			cells[ci] = append(cells[ci], cl)
		}
		for ti, tol := range tolerances {
			ch, err := tiltwell.Choose(cands, tol, fields, k)
			name := ch.Name
			if errors.Is(err, tiltwell.ErrNoneMeets) {
				name = "none"
			} else if err != nil {
				return err
			}
			choices[ti] = append(choices[ti], name)
			if ti == 0 {
				for ci, tr := range ch.Trials {
					cells[ci][ri].cost = tr.Stats.PerLevel
				}
			}
		}
	}

	header := "| method |"
	rule := "|---|"
	for _, fmax := range ranges {
		header += fmt.Sprintf(" \\|f\\| ≤ %g |", fmax)
		rule += "---|"
	}
	if st.Infinite() {
		fmt.Fprintf(w, "Worst error of the %d lowest levels over each range of reduced fields, in E₁: true error against `exact.Solver` (the method's own estimate). \"outside\" marks a method that refuses or flags part of the range.\n\n", k)
	} else {
		fmt.Fprintf(w, "Finite well %v. Worst error of the %d lowest levels over each range of reduced fields, in E₁: true error against `exact.Solver{Stack: …}` (the method's own estimate). \"outside\" marks a method that refuses or flags part of the range.\n\n", st, k)
	}
	errorTable(w, header, rule, cands, cells, func(cl cell) (float64, float64) { return cl.trueErr, cl.est })

	if !st.Infinite() {
		fmt.Fprintf(w, "\nWorst error of the escape widths Γ, in E₁: true error (the method's own estimate). A method that reports Γ = 0 puts its estimate of the missing width in the estimate.\n\n")
		errorTable(w, header, rule, cands, cells, func(cl cell) (float64, float64) { return cl.gammaErr, cl.gammaEst })
	}

	fmt.Fprintf(w, "\nTime per level, measured by `tiltwell.Choose` on the machine that ran `go run ./examples/choicetable`.\n\n")
	fmt.Fprintln(w, header)
	fmt.Fprintln(w, rule)
	for ci, c := range cands {
		var b strings.Builder
		fmt.Fprintf(&b, "| %s |", c.Name)
		for _, cl := range cells[ci] {
			if cl.outside {
				b.WriteString(" — |")
			} else {
				fmt.Fprintf(&b, " %s |", ns(cl.cost))
			}
		}
		fmt.Fprintln(w, b.String())
	}

	fmt.Fprintf(w, "\nThe method `tiltwell.Choose` picks: the cheapest whose own estimates meet the tolerance (absolute, in E₁) on every level and field of the range.\n\n")
	fmt.Fprintln(w, strings.Replace(header, "method", "tolerance", 1))
	fmt.Fprintln(w, rule)
	for ti, tol := range tolerances {
		fmt.Fprintf(w, "| %g | %s |\n", tol, strings.Join(choices[ti], " | "))
	}
	return nil
}

// measure runs s over the fields against the exact reference for the
// well st.
func measure(s tiltwell.Solver, st tiltwell.Stack, fields []float64, k int) (cell, error) {
	var cl cell
	for _, f := range fields {
		ref, err := exact.Solver{Stack: st}.Levels(nil, f, k)
		if err != nil {
			return cl, err
		}
		ls, err := s.Levels(nil, f, k)
		if err != nil {
			cl.outside = true
			continue
		}
		for n, l := range ls {
			cl.trueErr = math.Max(cl.trueErr, math.Abs(l.Energy-ref[n].Energy))
			cl.est = math.Max(cl.est, l.Err)
			cl.gammaErr = math.Max(cl.gammaErr, math.Abs(l.Gamma-ref[n].Gamma))
			cl.gammaEst = math.Max(cl.gammaEst, l.GammaErr)
		}
	}
	return cl, nil
}

// sci formats an error compactly: "0" or "2.2e-02".
func sci(x float64) string {
	if x == 0 {
		return "0"
	}
	return fmt.Sprintf("%.1e", x)
}

// ns formats a duration with two significant digits and a unit.
func ns(d time.Duration) string {
	x := float64(d.Nanoseconds())
	unit := "ns"
	for _, u := range []string{"µs", "ms", "s"} {
		if x < 1000 {
			break
		}
		x, unit = x/1000, u
	}
	if x >= 100 {
		return fmt.Sprintf("%.0f %s", math.Round(x/10)*10, unit)
	}
	if x >= 10 {
		return fmt.Sprintf("%.0f %s", x, unit)
	}
	return fmt.Sprintf("%.1f %s", x, unit)
}
