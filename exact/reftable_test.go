package exact_test

import (
	"bytes"
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"math/big"
	"math/rand/v2"
	"os"
	"path/filepath"
	"runtime"
	"slices"
	"strconv"
	"strings"
	"testing"

	"github.com/google/go-cmp/cmp"
	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/exact/exacttest"
	"github.com/tiltwell/tiltwell/exact/internal/bigairy"
)

// updateTable rewrites testdata/levels.txt from the present solver:
//
//	go test ./exact -run TestGoldenTable -update-table
var updateTable = flag.Bool("update-table", false, "rewrite testdata/levels.txt from exact.Solver")

const goldenPath = "testdata/levels.txt"

// goldenFields are the fields of testdata/levels.txt: zero, tiny, the
// fields of the independent values in TestGoldenTable, a negative one,
// and the ends of the range.
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
// regression test of both: every saved energy within its own stated Err
// of the live one, so the table cannot drift from the solver) and against
// levels computed independently at high precision (mpmath) from the Airy
// determinant Ai(z₀)Bi(z₁) − Ai(z₁)Bi(z₀) = 0, 15 significant digits.
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
	for i, f := range tab.Fields {
		live, err := exact.Solver{}.Levels(nil, f, len(tab.Levels[i]))
		if err != nil {
			t.Fatal(err)
		}
		for j, saved := range tab.Levels[i] {
			if d := math.Abs(saved.Energy - live[j].Energy); !(d <= saved.Err) {
				t.Errorf("f=%v n=%d: saved %v ± %.2g, live solver %v (%.2g away): regenerate the table (-update-table)",
					f, saved.N, saved.Energy, saved.Err, live[j].Energy, d)
			}
		}
	}

	// Computed independently at high precision (mpmath): not a published
	// table.
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
				t.Errorf("f=%v n=%d: table %.17g ± %.2g, independent value %.15g", f, n+1, got.Energy, got.Err, want[n])
			}
		}
	}
	if found != len(published) {
		t.Errorf("table has %d of the %d published fields", found, len(published))
	}
}

// TestGoldenTableBig holds a sample of the saved table against the
// project's own 200-bit reference (internal/bigairy, math/big Airy
// functions, independent of the float64 solver): each saved energy is
// within one unit in the last place of the 200-bit level, and its stated
// Err covers the difference. The rows include f = 10, n = 1, once saved
// as 0.06602629575509023, 21 ulps from the level 0.0660262957550905163….
func TestGoldenTableBig(t *testing.T) {
	t.Parallel()
	tab := readGolden(t)
	sample := []struct {
		f float64
		n int
	}{{1e-8, 1}, {0.5, 6}, {10, 1}, {10, 2}, {10, 3}, {100, 3}, {-30, 4}, {1000, 6}}
	for _, c := range sample {
		i := slices.Index(tab.Fields, c.f)
		if i < 0 || c.n > len(tab.Levels[i]) {
			t.Errorf("f=%v n=%d not in the table", c.f, c.n)
			continue
		}
		saved := tab.Levels[i][c.n-1]
		want, err := bigairy.Level(c.f, c.n, 200)
		if err != nil {
			t.Fatal(err)
		}
		d, _ := new(big.Float).Sub(big.NewFloat(saved.Energy), want).Float64()
		w, _ := want.Float64()
		ulp := math.Nextafter(math.Abs(w), math.Inf(1)) - math.Abs(w)
		if math.Abs(d) > ulp || math.Abs(d) > saved.Err {
			t.Errorf("f=%v n=%d: saved %v ± %.2g, 200-bit level %s: %.2g away (%.2f ulp)",
				c.f, c.n, saved.Energy, saved.Err, want.Text('g', 25), d, math.Abs(d)/ulp)
		}
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
	const head = "tiltwell-levels v2: f n energy err\n"
	long := strings.Repeat("x", exact.MaxTableLine+1)
	for _, tc := range []struct {
		name, file string
		line       int
		msg        string // in the error
	}{
		{"empty", "", 1, "empty"},
		{"magic", "levels v2\n1 1 1 0\nend 1\n", 1, "does not begin"},
		{"version-1", "tiltwell-levels v1: f n energy err\n1 1 1 0\n", 1, "version 1 table: it has no end line"},
		{"version-20", "tiltwell-levels v20 future format\n1 1 1 0\nend 1\n", 1, `version "20"`},
		{"header-only", "tiltwell-levels v2", 1, "cut short"},
		{"no-rows", head + "# only a note\nend 0\n", 0, "no fields"},
		{"columns", head + "1 1 0.98\nend 1\n", 2, "3 fields"},
		{"float", head + "1 1 0.98x 0\nend 1\n", 2, "invalid syntax"},
		{"int", head + "1 1.5 0.98 0\nend 1\n", 2, "invalid syntax"},
		{"start-at-2", head + "1 2 4 0\nend 1\n", 2, "does not continue"},
		{"gap", head + "1 1 1 0\n1 3 9 0\nend 2\n", 3, "does not continue"},
		{"field-changes", head + "1 1 1 0\n2 2 4 0\nend 2\n", 3, "does not continue"},
		{"field-twice", head + "1 1 1 0\n2 1 1 0\n1 1 1 0\nend 3\n", 4, "appears twice"},
		{"nan-energy", head + "1 1 NaN 0\nend 1\n", 2, "energy NaN"},
		{"inf-field", head + "+Inf 1 1 0\nend 1\n", 2, "not finite"},
		{"big-field", head + "2e5 1 1 0\nend 1\n", 2, "beyond MaxField"},
		{"negative-err", head + "1 1 1 -1e-16\nend 1\n", 2, "error estimate"},
		{"level-1001", head + "1 1001 1 0\nend 1\n", 2, "does not continue"},
		// Truncation: the end line is missing, counts other levels, or
		// has no newline; anything after it is refused too.
		{"no-end", head + "1 1 1 0\n1 2 4 0\n", 4, "no end line after 2 levels"},
		{"cut-row", head + "1 1 1 0\n1 2 4 0.00", 4, "no end line after 2 levels"},
		{"end-count", head + "1 1 1 0\n1 2 4 0\nend 3\n", 4, "end line counts 3 levels, the file has 2"},
		{"end-cut", head + "1 1 1 0\nend 1", 3, "no newline after the end line"},
		{"end-fields", head + "1 1 1 0\nend 1 levels\n", 3, "end line with 3 fields"},
		{"end-number", head + "1 1 1 0\nend one\n", 3, "end line: "},
		{"after-end", head + "1 1 1 0\nend 1\n1 2 4 0\n", 4, "text after the end line (line 3)"},
		{"blank-after-end", head + "1 1 1 0\nend 1\n\n", 4, "text after the end line"},
		// Limits.
		{"long-row", head + "1 1 1 0" + long + "\nend 1\n", 2, "line longer than 65536 bytes"},
		{"long-note", head + "# " + long + "\n1 1 1 0\nend 1\n", 2, "line longer than 65536 bytes"},
		{"long-last-line", head + long, 2, "line longer than 65536 bytes"},
		{"long-note-total", head + strings.Repeat("# "+strings.Repeat("y", 1023)+"\n", 33) + "1 1 1 0\nend 1\n", 34, "note longer than 32768 bytes"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			t.Parallel()
			_, err := exact.ReadTable(strings.NewReader(tc.file))
			var te *exact.TableError
			if !errors.As(err, &te) {
				t.Fatalf("error %v, want a *TableError", err)
			}
			if te.Line != tc.line || !strings.Contains(err.Error(), tc.msg) {
				t.Errorf("error %q at line %d, want line %d and %q", err, te.Line, tc.line, tc.msg)
			}
		})
	}
	// CRLF line ends and blank lines are accepted.
	tab, err := exact.ReadTable(strings.NewReader("tiltwell-levels v2\r\n\r\n0\t1\t1\t0\r\n0 2 4 0\r\nend 2\r\n"))
	if err != nil || len(tab.Levels) != 1 || tab.Levels[0][1].Energy != 4 {
		t.Errorf("CRLF table: %v, %+v", err, tab)
	}
	// A line of exactly MaxTableLine bytes is read, with either line end.
	for _, eol := range []string{"\n", "\r\n"} {
		note := strings.Repeat("z", exact.MaxTableLine-2)
		file := head + "# " + note[:exact.MaxTableNote] + eol + "0 1 1 0" + strings.Repeat(" ", exact.MaxTableLine-7) + eol + "end 1" + eol
		if tab, err := exact.ReadTable(strings.NewReader(file)); err != nil || len(tab.Note) != exact.MaxTableNote {
			t.Errorf("lines of %d bytes ending %q: %v", exact.MaxTableLine, eol, err)
		}
	}
}

// TestReadTableCut: the golden file cut at any byte is refused with a
// *TableError, and the whole file is read.
func TestReadTableCut(t *testing.T) {
	t.Parallel()
	b, err := os.ReadFile(goldenPath)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := exact.ReadTable(bytes.NewReader(b)); err != nil {
		t.Fatalf("the whole file: %v", err)
	}
	for n := range len(b) {
		_, err := exact.ReadTable(bytes.NewReader(b[:n]))
		var te *exact.TableError
		if !errors.As(err, &te) {
			t.Fatalf("file cut to %d of %d bytes: error %v, want a *TableError", n, len(b), err)
		}
	}
}

// rowsReader generates a table file of fields × levels rows, without
// holding it in memory.
type rowsReader struct {
	fields, levels int
	i, n           int // next row: field i, level n (0 before the header)
	buf            []byte
}

func (r *rowsReader) Read(p []byte) (int, error) {
	for len(r.buf) < len(p) && r.i < r.fields {
		if r.n == 0 {
			r.buf = append(r.buf, "tiltwell-levels v2\n"...)
			r.n = 1
		}
		r.buf = strconv.AppendInt(r.buf, int64(r.i), 10)
		r.buf = append(r.buf, "e-2 "...) // distinct fields within MaxField
		r.buf = strconv.AppendInt(r.buf, int64(r.n), 10)
		r.buf = append(r.buf, " 1 0\n"...)
		if r.n++; r.n > r.levels {
			r.i, r.n = r.i+1, 1
		}
	}
	if len(r.buf) == 0 {
		return 0, io.EOF
	}
	k := copy(p, r.buf)
	r.buf = r.buf[:copy(r.buf, r.buf[k:])]
	return k, nil
}

// TestTableLimits: a table beyond MaxTableRows levels is refused as soon
// as the limit is passed, reading and writing.
func TestTableLimits(t *testing.T) {
	t.Parallel()
	fields := exact.MaxTableRows/exact.MaxLevels + 1 // 1049 fields × 1000 levels
	var te *exact.TableError
	// Reading a million lines takes 0.4 s, 2–4 s under the race detector,
	// which has nothing to find in it: the -race run skips it.
	if !raceEnabled {
		_, err := exact.ReadTable(&rowsReader{fields: fields, levels: exact.MaxLevels})
		if !errors.As(err, &te) || te.Line != exact.MaxTableRows+2 || !strings.Contains(err.Error(), "more than 1048576 levels") {
			t.Errorf("%d levels: error %v, want a *TableError at line %d", fields*exact.MaxLevels, err, exact.MaxTableRows+2)
		}
	}
	_, err := exact.ReadTable(&rowsReader{fields: exact.MaxTableFields + 1, levels: 1})
	if !errors.As(err, &te) || te.Line != exact.MaxTableFields+2 || !strings.Contains(err.Error(), "more than 65536 fields") {
		t.Errorf("%d fields: error %v, want a *TableError at line %d", exact.MaxTableFields+1, err, exact.MaxTableFields+2)
	}
	// Writing: the levels of one field shared by all, so the test itself
	// stays small.
	ls := make([]tiltwell.Level, exact.MaxLevels)
	for i := range ls {
		ls[i] = tiltwell.Level{N: i + 1, Energy: float64(i * i)}
	}
	big := &exact.Table{}
	for i := range fields {
		big.Fields = append(big.Fields, float64(i))
		big.Levels = append(big.Levels, ls)
	}
	if _, err := big.WriteTo(io.Discard); !errors.As(err, &te) || !strings.Contains(err.Error(), "more than 1048576") {
		t.Errorf("writing %d levels: %v, want a *TableError", fields*exact.MaxLevels, err)
	}
	many := &exact.Table{}
	for i := range exact.MaxTableFields + 1 {
		many.Fields = append(many.Fields, float64(i)/100)
		many.Levels = append(many.Levels, ls[:1])
	}
	if _, err := many.WriteTo(io.Discard); !errors.As(err, &te) || !strings.Contains(err.Error(), "more than 65536") {
		t.Errorf("writing %d fields: %v, want a *TableError", exact.MaxTableFields+1, err)
	}
	note := &exact.Table{Fields: []float64{0}, Levels: [][]tiltwell.Level{ls[:1]}, Note: strings.Repeat("n", exact.MaxTableNote+1)}
	if _, err := note.WriteTo(io.Discard); !errors.As(err, &te) {
		t.Errorf("writing a note of %d bytes: %v, want a *TableError", exact.MaxTableNote+1, err)
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
	// Beyond the limits: refused before solving (a million levels would
	// take seconds).
	for _, c := range []struct{ fields, k int }{{exact.MaxTableFields + 1, 1}, {1100, exact.MaxLevels}} {
		if _, err := exact.NewTable(make([]float64, c.fields), c.k); !errors.As(err, &te) {
			t.Errorf("%d fields of %d levels: error %v, want a *TableError", c.fields, c.k, err)
		}
	}
}

// FuzzReadTable: any input is read or refused with a *TableError, never a
// panic, and a table that reads writes back to one that reads the same.
func FuzzReadTable(f *testing.F) {
	if b, err := os.ReadFile(goldenPath); err == nil {
		f.Add(string(b))
	}
	f.Add("tiltwell-levels v2\n# note\n0 1 1 0\n0 2 4 0\nend 2\n")
	f.Add("tiltwell-levels v2\n1e-08\t1\t0.9999999999999994\t4e-15\nend 1\n")
	f.Add("tiltwell-levels v2\n-0 1 1 0\n0 1 1 0\nend 2\n")
	f.Add("tiltwell-levels v1\n0 1 1 0\n")
	f.Fuzz(func(t *testing.T, file string) {
		tab, err := exact.ReadTable(strings.NewReader(file))
		if err != nil {
			var te *exact.TableError
			if !errors.As(err, &te) {
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

// TestReadTableVersion checks that only version 2 is read.
func TestReadTableVersion(t *testing.T) {
	t.Parallel()
	for _, head := range []string{"tiltwell-levels v20 future format", "tiltwell-levels v1", "tiltwell-levels v1: f n energy err", "tiltwell-levels v3", "tiltwell-levelsv2", "tiltwell-levels v"} {
		if _, err := exact.ReadTable(strings.NewReader(head + "\n0 1 1 0\nend 1\n")); err == nil {
			t.Errorf("header %q accepted", head)
		}
	}
	for _, head := range []string{"tiltwell-levels v2", "tiltwell-levels v2 levels", "tiltwell-levels v2: f n energy err"} {
		if _, err := exact.ReadTable(strings.NewReader(head + "\n0 1 1 0\nend 1\n")); err != nil {
			t.Errorf("header %q refused: %v", head, err)
		}
	}
}

// endRows is a rowsReader followed by the end line.
type endRows struct {
	rowsReader
	done bool
}

func (e *endRows) Read(p []byte) (int, error) {
	n, err := e.rowsReader.Read(p)
	if n == 0 && !e.done && len(p) >= 16 {
		e.done = true
		return copy(p, "end "+strconv.Itoa(e.fields*e.levels)+"\n"), nil
	}
	return n, err
}

// BenchmarkReadTable reads a table at the limits (1048 fields of 1000
// levels, 65536 of 16) and reports the heap it holds once read (MB-held),
// besides the bytes allocated in all (B/op).
func BenchmarkReadTable(b *testing.B) {
	for _, c := range []struct{ fields, levels int }{{exact.MaxTableRows / exact.MaxLevels, exact.MaxLevels}, {exact.MaxTableFields, exact.MaxTableRows / exact.MaxTableFields}} {
		b.Run(fmt.Sprintf("fields=%d/levels=%d", c.fields, c.levels), func(b *testing.B) {
			var file bytes.Buffer
			if _, err := io.Copy(&file, &endRows{rowsReader: rowsReader{fields: c.fields, levels: c.levels}}); err != nil {
				b.Fatal(err)
			}
			b.ReportAllocs()
			held := 0.0
			for b.Loop() {
				var before, after runtime.MemStats
				runtime.GC()
				runtime.ReadMemStats(&before)
				tab, err := exact.ReadTable(bytes.NewReader(file.Bytes()))
				if err != nil {
					b.Fatal(err)
				}
				runtime.GC()
				runtime.ReadMemStats(&after)
				held = max(held, float64(after.HeapAlloc)-float64(before.HeapAlloc))
				runtime.KeepAlive(tab)
			}
			b.ReportMetric(held/1e6, "MB-held")
		})
	}
}
