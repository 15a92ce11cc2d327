// Regress shows how the author of a simulator checks their own solver
// against tiltwell's exact reference. The solver here is a plain
// finite-difference discretisation, written as a library user would write
// one; the program holds it against exact.Check at growing grid sizes,
// shows its error shrinking, prints the report Check gives when a
// tolerance is not met, and checks it against a saved reference table as a
// regression test in another project would. Last, a finite-difference
// solver of a finite well in a box is checked the same way, and the
// reference's escape widths catch its claim that the levels are bound.
//
// In a test the same check is one line:
//
//	exacttest.TestSolver(t, fd{intervals: 4000, safety: 2}, exact.Grid{Fields: fields, Levels: 3, Tol: 1e-5})
//
// Usage:
//
//	go run ./examples/regress
package main

import (
	"bytes"
	"fmt"
	"io"
	"math"
	"os"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
)

// fd is a finite-difference solver of the tilted well: the three-point
// second difference on intervals equal steps h = 1/intervals,
//
//	−(φ_(i−1) − 2φ_i + φ_(i+1))/(π² h²) + f (ξ_i − ½) φ_i = η φ_i,
//
// a symmetric tridiagonal matrix whose lowest eigenvalues come from Sturm
// sequence bisection (J. W. Demmel, Applied Numerical Linear Algebra,
// SIAM 1997, §5.3.4, from memory). Its error falls as h²; the estimate is
// Richardson's, from the same problem on the grid of step 2h:
//
//	Err = safety × |η_h − η_2h| / 3   (η_h = η + c h² + O(h⁴))
//
// plus the bisection's own tolerance. intervals must be even; a safety
// of 0 means 1.
type fd struct {
	intervals int
	safety    float64
}

var _ tiltwell.Solver = fd{}

func (s fd) Levels(dst []tiltwell.Level, f float64, k int) ([]tiltwell.Level, error) {
	dst = dst[:0]
	if s.intervals < 4 || s.intervals%2 != 0 {
		return dst, fmt.Errorf("fd: %d intervals, need an even number ≥ 4: %w", s.intervals, tiltwell.ErrUnits)
	}
	// The coarse grid has intervals/2 − 1 interior points, hence levels.
	if err := tiltwell.CheckArgs("fd", f, k, s.intervals/2-1, 0); err != nil {
		return dst, err
	}
	af, _ := tiltwell.Fold(f)
	safety := s.safety
	if safety == 0 {
		safety = 1
	}
	for n := 1; n <= k; n++ {
		fine, e1 := eigen(s.intervals, af, n)
		coarse, e2 := eigen(s.intervals/2, af, n)
		dst = append(dst, tiltwell.Level{N: n, Energy: fine, Err: safety*math.Abs(fine-coarse)/3 + e1 + e2})
	}
	return dst, nil
}

// eigen returns the n-th eigenvalue of the difference operator on m
// intervals at field f, and the width of its final bisection bracket.
func eigen(m int, f float64, n int) (eta, width float64) {
	h := 1 / float64(m)
	off := -1 / (math.Pi * math.Pi * h * h)
	diag := func(i int) float64 { return -2*off + f*(float64(i)*h-0.5) }
	// Gershgorin bounds on the whole spectrum.
	lo := diag(1) + 2*off - math.Abs(f)
	hi := diag(m-1) - 2*off + math.Abs(f)
	for range 200 {
		mid := lo + (hi-lo)/2
		if mid == lo || mid == hi || hi-lo <= 2e-16*math.Max(math.Abs(lo), math.Abs(hi)) {
			break
		}
		if below(m, diag, off, mid) >= n {
			hi = mid
		} else {
			lo = mid
		}
	}
	return lo + (hi-lo)/2, hi - lo
}

// below counts the eigenvalues below x: the negative pivots of T − xI.
func below(m int, diag func(int) float64, off, x float64) int {
	count := 0
	q := 1.0
	for i := 1; i < m; i++ {
		if i == 1 {
			q = diag(i) - x
		} else {
			q = diag(i) - x - off*off/q
		}
		if q == 0 {
			q = -1e-300 // a zero pivot: perturb it, counting x as above
		}
		if q < 0 {
			count++
		}
	}
	return count
}

func main() {
	if err := run(os.Stdout); err != nil {
		fmt.Fprintln(os.Stderr, "regress:", err)
		os.Exit(2)
	}
}

func run(w io.Writer) error {
	grid := exact.Grid{Fields: []float64{0, 1, 5, 10, 20, -10}, Levels: 3}
	fmt.Fprintf(w, "Finite differences against the exact reference, fields %v, %d levels.\n\n", grid.Fields, grid.Levels)
	fmt.Fprintf(w, "%9s  %13s  %5s  %8s  %23s\n", "intervals", "worst |error|", "ratio", "where", "undershoots, safety 1|2")
	prev := 0.0
	for _, m := range []int{50, 100, 200, 400, 800} {
		r, err := exact.Check(fd{intervals: m}, grid)
		if err != nil {
			return err
		}
		r2, err := exact.Check(fd{intervals: m, safety: 2}, grid)
		if err != nil {
			return err
		}
		ratio := "—"
		if prev > 0 {
			ratio = fmt.Sprintf("%.2f", prev/r.Abs.Value)
		}
		prev = r.Abs.Value
		fmt.Fprintf(w, "%9d  %13.3e  %5s  %8s  %12d | %d of %d\n", m, r.Abs.Value, ratio,
			fmt.Sprintf("f=%g n=%d", r.Abs.F, r.Abs.N), r.Undershoots, r2.Undershoots, r.Points)
	}
	fmt.Fprintf(w, "\nThe error falls 4× per halving of h: second order, as the three-point difference\n"+
		"should. Richardson's estimate is nearly exact but falls short by the O(h⁴) terms on\n"+
		"about half the levels; a safety factor of 2 covers them all.\n\n")

	// A tolerance the coarse grid cannot meet: the report says where and
	// by how much.
	strict := grid
	strict.Tol = 1e-4
	r, err := exact.Check(fd{intervals: 100, safety: 2}, strict)
	if err != nil {
		return err
	}
	fmt.Fprintf(w, "With a tolerance of %g at 100 intervals (safety 2):\n\n%s\n", strict.Tol, r)

	// Regression against a saved table, as a project without the live
	// reference at hand would do: write the table once (here to memory;
	// in a project, to testdata/), read it back in the test.
	tab, err := exact.NewTable(grid.Fields, grid.Levels)
	if err != nil {
		return err
	}
	tab.Note = "reference for the fd regression example"
	var file bytes.Buffer
	if _, err := tab.WriteTo(&file); err != nil {
		return err
	}
	saved, err := exact.ReadTable(&file)
	if err != nil {
		return err
	}
	r, err = saved.Check(fd{intervals: 4000, safety: 2}, 1e-5)
	if err != nil {
		return err
	}
	verdict := "passes"
	if !r.OK() {
		verdict = "fails"
	}
	fmt.Fprintf(w, "Against a saved table (%d levels), 4000 intervals, tolerance 1e-5: %s (worst error %.3g).\n", r.Points, verdict, r.Abs.Value)
	return finiteWell(w)
}
