// Package exacttest holds the *testing.T side of the exact package's
// conformance checks: [TestSolver] and [TestTable] run [exact.Check] and
// [exact.Table.Check] inside a test and fail it, with the report, when a
// solver does not pass.
//
// It is a package of its own, as testing/fstest and io/iotest are, so that
// a program which imports exact to solve levels does not link the testing
// package.
package exacttest

import (
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
)

// TestSolver runs [exact.Check] inside a test and fails tb, with the
// report, if the solver does not pass (see [exact.Report.OK]) or Check
// cannot run. It returns the report (nil if Check could not run) for
// further checks of its own.
//
//	func TestAgainstExact(t *testing.T) {
//		exacttest.TestSolver(t, mysolver.Solver{}, exact.Grid{Fields: []float64{0, 1, 10, 100}, Levels: 5})
//	}
func TestSolver(tb testing.TB, s tiltwell.Solver, g exact.Grid) *exact.Report {
	tb.Helper()
	r, err := exact.Check(s, g)
	if err != nil {
		tb.Fatalf("exact.Check: %v", err)
		return nil
	}
	if !r.OK() {
		tb.Errorf("%s", r)
	}
	return r
}

// TestTable runs [exact.Table.Check] inside a test and fails tb, with the
// report, if the solver does not pass. It returns the report (nil if the
// check could not run).
//
//	func TestRegression(t *testing.T) {
//		f, err := os.Open("testdata/levels.txt")
//		if err != nil {
//			t.Fatal(err)
//		}
//		defer f.Close()
//		tab, err := exact.ReadTable(f)
//		if err != nil {
//			t.Fatal(err)
//		}
//		exacttest.TestTable(t, mysolver.Solver{}, tab, 1e-9)
//	}
func TestTable(tb testing.TB, s tiltwell.Solver, t *exact.Table, tol float64) *exact.Report {
	tb.Helper()
	r, err := t.Check(s, tol)
	if err != nil {
		tb.Fatalf("exact: table check: %v", err)
		return nil
	}
	if !r.OK() {
		tb.Errorf("%s", r)
	}
	return r
}
