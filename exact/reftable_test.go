package exact_test

import (
	"bytes"
	"errors"
	"flag"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/google/go-cmp/cmp"
	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/exact/exacttest"
)

// updateTable rewrites testdata/levels.txt from the present solver:
//
//	go test ./exact -run TestGoldenTable -update-table
var updateTable = flag.Bool("update-table", false, "rewrite testdata/levels.txt from exact.Solver")

const goldenPath = "testdata/levels.txt"

// goldenFields are the fields of testdata/levels.txt: zero, tiny, the
// fields of check-values.md §3, a negative one, and the ends of the range.
var goldenFields = []float64{0, 1e-8, 0.5, 1, 5, 10, 20, 50, 100, -30, 1000, 1e5}

const goldenLevels = 6

const goldenNote = `The lowest six levels of the tilted infinite well at twelve reduced fields,
from exact.Solver (the Airy-phase solver) of github.com/tiltwell/tiltwell.
Regenerate: go test ./exact -run TestGoldenTable -update-table`

func readGolden(t *testing.T) *exact.Table {
	t.Helper()
	f, err := os.Open(goldenPath)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	tab, err := exact.ReadTable(f)
	if err != nil {
		t.Fatal(err)
	}
	return tab
}

// TestGoldenTable holds the saved table against the live solver (a
// regression test of both) and against check-values.md §3 (exact values
// computed there with mpmath from the Airy determinant, 15 significant
// digits).
func TestGoldenTable(t *testing.T) {
	if *updateTable {
		tab, err := exact.NewTable(goldenFields, goldenLevels)
		if err != nil {
			t.Fatal(err)
		}
		tab.Note = goldenNote
		var buf bytes.Buffer
		if _, err := tab.WriteTo(&buf); err != nil {
			t.Fatal(err)
		}
		if err := os.MkdirAll(filepath.Dir(goldenPath), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(goldenPath, buf.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	t.Parallel()
	tab := readGolden(t)
	if tab.Note != goldenNote {
		t.Errorf("note %q, want %q", tab.Note, goldenNote)
	}
	exacttest.TestTable(t, exact.Solver{}, tab, 0)

	// check-values.md §3, "Exact values, computed here from
	// Ai(x-)Bi(x+) - Ai(x+)Bi(x-) = 0 (mpmath)".
	published := map[float64][3]float64{
		1:   {0.989191714351091, 4.0032088300244, 9.00192325107681},
		5:   {0.741219278430113, 4.06922048935081, 9.04766385801899},
		10:  {0.0660262957550905, 4.18187000563762, 9.18467880199912},
		20:  {-1.9685399313543, 4.07925089520686, 9.62528390552019},
		50:  {-10.2062634323475, 0.865458071834238, 9.93927499167423},
		100: {-26.5164070902714, -8.94126155816345, 5.44766594418562},
	}
	found := 0
	for i, f := range tab.Fields {
		want, ok := published[f]
		if !ok {
			continue
		}
		found++
		for n := range 3 {
			got := tab.Levels[i][n]
			// The published values have 15 significant digits: half a
			// unit in the last is at most 5e-15 relative. The table's
			// own estimate Err is added.
			if d := math.Abs(got.Energy - want[n]); d > got.Err+5e-15*math.Abs(want[n]) {
				t.Errorf("f=%v n=%d: table %.17g ± %.2g, check-values.md §3 %.15g", f, n+1, got.Energy, got.Err, want[n])
			}
		}
	}
	if found != len(published) {
		t.Errorf("table has %d of the %d published fields", found, len(published))
	}
}

// TestTableRoundTrip: writing and reading back gives the same float64
// bits, for the golden table and for random bit patterns.
func TestTableRoundTrip(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(1, 1))
	// finite returns a random finite float64 of any exponent, sign and
	// mantissa, including subnormals.
	finite := func() float64 {
		for {
			x := math.Float64frombits(rng.Uint64())
			if !math.IsNaN(x) && !math.IsInf(x, 0) {
				return x
			}
		}
	}
	tab := &exact.Table{Note: "random bits\n\n  indented line\n# hash\n"}
	special := []float64{0, math.Copysign(0, -1), 5e-324, -math.MaxFloat64, math.MaxFloat64, 1e-300, 0.1, 1.0 / 3}
	for i := range 40 {
		f := finite()
		if math.Abs(f) > exact.MaxField || i == 0 {
			f = math.Ldexp(rng.Float64(), rng.IntN(17)) * float64(1-2*rng.IntN(2))
		}
		if i == 1 {
			f = math.Copysign(0, -1) // -0 and 0 are different fields in a file
		}
		var ls []tiltwell.Level
		for n := 1; n <= 1+rng.IntN(4); n++ {
			e := finite()
			if n <= len(special) && i == 2 {
				e = special[n-1]
			}
			ls = append(ls, tiltwell.Level{N: n, Energy: e, Err: math.Abs(finite())})
		}
		tab.Fields = append(tab.Fields, f)
		tab.Levels = append(tab.Levels, ls)
	}
	golden := readGolden(t)
	for name, want := range map[string]*exact.Table{"random": tab, "golden": golden} {
		var buf bytes.Buffer
		n, err := want.WriteTo(&buf)
		if err != nil {
			t.Fatal(err)
		}
		if n != int64(buf.Len()) {
			t.Errorf("%s: WriteTo reported %d bytes, wrote %d", name, n, buf.Len())
		}
		got, err := exact.ReadTable(&buf)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		// Compare bits: cmp's float64 == would take -0 for 0.
		bits := cmp.Comparer(func(a, b float64) bool { return math.Float64bits(a) == math.Float64bits(b) })
		if diff := cmp.Diff(want, got, bits); diff != "" {
			t.Errorf("%s: round trip changed the table (-want +got):\n%s", name, diff)
		}
	}
}

func TestReadTableErrors(t *testing.T) {
	t.Parallel()
	const head = "tiltwell-levels v1: f n energy err\n"
	for _, tc := range []struct {
		name, file string
		line       int
	}{
		{"empty", "", 1},
		{"magic", "levels v1\n1 1 1 0\n", 1},
		{"no-rows", head + "# only a note\n", 0},
		{"columns", head + "1 1 0.98\n", 2},
		{"float", head + "1 1 0.98x 0\n", 2},
		{"int", head + "1 1.5 0.98 0\n", 2},
		{"start-at-2", head + "1 2 4 0\n", 2},
		{"gap", head + "1 1 1 0\n1 3 9 0\n", 3},
		{"field-changes", head + "1 1 1 0\n2 2 4 0\n", 3},
		{"field-twice", head + "1 1 1 0\n2 1 1 0\n1 1 1 0\n", 4},
		{"nan-energy", head + "1 1 NaN 0\n", 2},
		{"inf-field", head + "+Inf 1 1 0\n", 2},
		{"big-field", head + "2e5 1 1 0\n", 2},
		{"negative-err", head + "1 1 1 -1e-16\n", 2},
	} {
		t.Run(tc.name, func(t *testing.T) {
			t.Parallel()
			_, err := exact.ReadTable(strings.NewReader(tc.file))
			var te *exact.TableError
			if !errors.As(err, &te) {
				t.Fatalf("error %v, want a *TableError", err)
			}
			if te.Line != tc.line {
				t.Errorf("error %q at line %d, want line %d", err, te.Line, tc.line)
			}
		})
	}
	// CRLF line ends and blank lines are accepted.
	tab, err := exact.ReadTable(strings.NewReader("tiltwell-levels v1\r\n\r\n0\t1\t1\t0\r\n0 2 4 0\r\n"))
	if err != nil || len(tab.Levels) != 1 || tab.Levels[0][1].Energy != 4 {
		t.Errorf("CRLF table: %v, %+v", err, tab)
	}
}

// TestTableCheck: a solver checked against the saved table, as another
// project would.
func TestTableCheck(t *testing.T) {
	t.Parallel()
	tab := readGolden(t)
	// Right: the sine basis, at the table's fields it can handle.
	small := &exact.Table{}
	for i, f := range tab.Fields {
		if math.Abs(f) <= 10 {
			small.Fields = append(small.Fields, f)
			small.Levels = append(small.Levels, tab.Levels[i][:3])
		}
	}
	if r, err := small.Check(sineBasis{size: 40, claim: 1e-8}, 1e-9); err != nil || !r.OK() {
		t.Errorf("sine basis against the saved table: %v\n%s", err, r)
	}
	// Wrong by 1e-6.
	r, err := tab.Check(offset{d: 1e-6}, 0)
	if err != nil {
		t.Fatal(err)
	}
	if r.OK() || r.Undershoots != r.Points || r.Points != len(goldenFields)*goldenLevels {
		t.Errorf("offset solver: OK %v, %d undershoots of %d levels; want all %d to fail", r.OK(), r.Undershoots, r.Points, len(goldenFields)*goldenLevels)
	}
	var rec recordTB
	exacttest.TestTable(&rec, offset{d: 1e-6}, tab, 0)
	if len(rec.errors) != 1 {
		t.Errorf("TestTable of a wrong solver: %d errors, want 1", len(rec.errors))
	}
	// Bad calls.
	if _, err := tab.Check(nil, 0); !errors.Is(err, tiltwell.ErrNoSolver) {
		t.Errorf("nil solver: %v", err)
	}
	if _, err := tab.Check(exact.Solver{}, -1); !errors.Is(err, tiltwell.ErrUnits) {
		t.Errorf("tol = -1: %v", err)
	}
	var te *exact.TableError
	if _, err := (&exact.Table{}).Check(exact.Solver{}, 0); !errors.As(err, &te) {
		t.Errorf("empty table: %v", err)
	}
	if _, err := (*exact.Table)(nil).Check(exact.Solver{}, 0); !errors.As(err, &te) {
		t.Errorf("nil table: %v", err)
	}
}

func TestNewTableErrors(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name   string
		fields []float64
		k      int
		want   error
	}{
		{"f=NaN", []float64{1, math.NaN()}, 2, tiltwell.ErrField},
		{"f=1e6", []float64{1e6}, 2, tiltwell.ErrOutOfRange},
		{"k=0", []float64{1}, 0, tiltwell.ErrLevel},
	} {
		if _, err := exact.NewTable(tc.fields, tc.k); !errors.Is(err, tc.want) {
			t.Errorf("%s: error %v, want one wrapping %v", tc.name, err, tc.want)
		}
	}
	var te *exact.TableError
	if _, err := exact.NewTable(nil, 2); !errors.As(err, &te) {
		t.Errorf("no fields: error %v, want a *TableError", err)
	}
}

// FuzzReadTable: any input is read or refused with a *TableError, never a
// panic, and a table that reads writes back to one that reads the same.
func FuzzReadTable(f *testing.F) {
	if b, err := os.ReadFile(goldenPath); err == nil {
		f.Add(string(b))
	}
	f.Add("tiltwell-levels v1\n# note\n0 1 1 0\n0 2 4 0\n")
	f.Add("tiltwell-levels v1\n1e-08\t1\t0.9999999999999994\t4e-15\n")
	f.Add("tiltwell-levels v1\n-0 1 1 0\n0 1 1 0\n")
	f.Fuzz(func(t *testing.T, file string) {
		tab, err := exact.ReadTable(strings.NewReader(file))
		if err != nil {
			var te *exact.TableError
			if !errors.As(err, &te) && !strings.Contains(err.Error(), "token too long") {
				t.Fatalf("error %v is not a *TableError", err)
			}
			return
		}
		var buf bytes.Buffer
		if _, err := tab.WriteTo(&buf); err != nil {
			t.Fatalf("a table that was read does not write: %v", err)
		}
		again, err := exact.ReadTable(&buf)
		if err != nil {
			t.Fatalf("a written table does not read: %v\n%s", err, buf.String())
		}
		bits := cmp.Comparer(func(a, b float64) bool { return math.Float64bits(a) == math.Float64bits(b) })
		if diff := cmp.Diff(tab, again, bits); diff != "" {
			t.Fatalf("round trip changed the table (-want +got):\n%s", diff)
		}
	})
}

// TestReadTableVersion checks that only version 1 is read.
func TestReadTableVersion(t *testing.T) {
	for _, head := range []string{"tiltwell-levels v10 future format", "tiltwell-levels v2", "tiltwell-levelsv1"} {
		if _, err := exact.ReadTable(strings.NewReader(head + "\n0 1 1 0\n")); err == nil {
			t.Errorf("header %q accepted", head)
		}
	}
	if _, err := exact.ReadTable(strings.NewReader("tiltwell-levels v1\n0 1 1 0\n")); err != nil {
		t.Errorf("bare v1 header refused: %v", err)
	}
}
