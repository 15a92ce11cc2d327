package exact

import (
	"bufio"
	"bytes"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/tiltwell/tiltwell"
)

// Table is a saved reference: the exact levels at a set of fields, written
// to a small text file so that a solver can be checked against it later,
// for instance in the regression tests of another project, without
// depending on this package's solver staying the same. The file format is
// described in the package documentation, under "Reference table files".
//
// A table holds at most [MaxTableFields] fields, [MaxLevels] levels at each
// field and [MaxTableRows] levels in all, and a Note of at most
// [MaxTableNote] bytes; [ReadTable] refuses a file as soon as it passes one
// of these limits. A table at the limits holds 69 MB once read, and
// reading it allocates 180 MB in all (BenchmarkReadTable, 1048 fields of
// 1000 levels; 65536 fields of 16 levels take 53 MB and 134 MB).
type Table struct {
	// Note is free text, written as '#' comment lines after the header;
	// ReadTable collects every comment line into it.
	Note string
	// Fields are the reduced fields in the order of the file.
	Fields []float64
	// Levels[i] are the levels at Fields[i], N = 1..len(Levels[i]), with
	// the reference's error estimates in Err and Bound Estimate.
	Levels [][]tiltwell.Level
}

// Limits of a table and of its file.
const (
	// MaxTableRows is the most levels a table holds, summed over its
	// fields: 2²⁰, 50 MB as []tiltwell.Level.
	MaxTableRows = 1 << 20
	// MaxTableFields is the most fields a table holds: 2¹⁶.
	MaxTableFields = 1 << 16
	// MaxTableNote is the longest Note, in bytes: 32 KiB (so that each of
	// its lines, written as "# line", fits in MaxTableLine).
	MaxTableNote = 32 << 10
	// MaxTableLine is the longest line of a table file, in bytes, without
	// its line end: 64 KiB.
	MaxTableLine = 64 << 10
)

// tableVersion is the format version; tableMagic begins the first line of
// every table file.
const (
	tableVersion = 2
	tableMagic   = "tiltwell-levels v"
)

var tableHeader = fmt.Sprintf("%s%d: f n energy err (f in F₀; energy, err in E₁)", tableMagic, tableVersion)

// TableError reports a malformed table: the line (1 for the first line of
// the file, 0 for a problem of the whole table) and what is wrong.
type TableError struct {
	Line int
	Msg  string
}

func (e *TableError) Error() string {
	if e.Line == 0 {
		return "exact: reference table: " + e.Msg
	}
	return fmt.Sprintf("exact: reference table, line %d: %s", e.Line, e.Msg)
}

// NewTable computes the table of the lowest k levels at each of the fields
// with [Solver]. It returns an error, as [Solver.Levels] does, for a field
// that is not finite or beyond MaxField and for k outside 1..MaxLevels,
// and a [*TableError], before solving anything, for more than
// [MaxTableFields] fields or [MaxTableRows] levels in all.
func NewTable(fields []float64, k int) (*Table, error) {
	if len(fields) > MaxTableFields || (k > 0 && len(fields) > MaxTableRows/k) {
		return nil, &TableError{Msg: fmt.Sprintf("%d fields of %d levels: more than %d fields or %d levels", len(fields), k, MaxTableFields, MaxTableRows)}
	}
	t := &Table{Fields: append([]float64(nil), fields...), Levels: make([][]tiltwell.Level, len(fields))}
	for i, f := range fields {
		ls, err := Solver{}.Levels(nil, f, k)
		if err != nil {
			return nil, fmt.Errorf("exact: table: %w", err)
		}
		t.Levels[i] = ls
	}
	if err := t.validate(); err != nil {
		return nil, err
	}
	return t, nil
}

// WriteTo writes the table in the file format of the package
// documentation (version 2, with its end line). It
// returns the number of bytes written and the first error, including a
// [*TableError] if the table itself breaks the format's rules.
func (t *Table) WriteTo(w io.Writer) (int64, error) {
	if err := t.validate(); err != nil {
		return 0, err
	}
	bw := bufio.NewWriter(w)
	cw := &countWriter{w: bw}
	fmt.Fprintln(cw, tableHeader)
	if t.Note != "" {
		for _, line := range strings.Split(t.Note, "\n") {
			if line == "" {
				fmt.Fprintln(cw, "#")
			} else {
				fmt.Fprintln(cw, "# "+line)
			}
		}
	}
	var buf []byte
	for i, f := range t.Fields {
		for _, l := range t.Levels[i] {
			buf = strconv.AppendFloat(buf[:0], f, 'g', -1, 64)
			buf = append(buf, '\t')
			buf = strconv.AppendInt(buf, int64(l.N), 10)
			buf = append(buf, '\t')
			buf = strconv.AppendFloat(buf, l.Energy, 'g', -1, 64)
			buf = append(buf, '\t')
			buf = strconv.AppendFloat(buf, l.Err, 'g', -1, 64)
			buf = append(buf, '\n')
			cw.Write(buf)
		}
	}
	fmt.Fprintf(cw, "end %d\n", t.rows())
	if cw.err != nil {
		return cw.n, cw.err
	}
	err := bw.Flush()
	return cw.n, err
}

// countWriter counts bytes and keeps the first error.
type countWriter struct {
	w   io.Writer
	n   int64
	err error
}

func (c *countWriter) Write(p []byte) (int, error) {
	if c.err != nil {
		return 0, c.err
	}
	n, err := c.w.Write(p)
	c.n += int64(n)
	c.err = err
	return n, err
}

// ReadTable reads a table in the file format of the package documentation
// (version 2). A malformed file gives a [*TableError] naming the line: a
// version 1 file (which has no end line, so a cut file cannot be told from
// a whole one), a file cut short (no end line, an end line whose count is
// not the number of levels read, or no newline after it), text after the
// end line, a line longer than [MaxTableLine], or a table beyond
// [MaxTableFields] fields, [MaxTableRows] levels, [MaxLevels] levels at
// one field or a note beyond [MaxTableNote] bytes (refused as soon as the
// limit is passed). An error of r itself is returned wrapped, with the
// line it happened on.
func ReadTable(r io.Reader) (*Table, error) {
	sc := bufio.NewScanner(r)
	sc.Buffer(make([]byte, 0, 4096), MaxTableLine+2) // room for "\r\n"
	sc.Split(scanLines)
	t := &Table{}
	var notes []string
	noteBytes, rows := 0, 0
	seen := map[uint64]bool{}
	line, end := 0, 0 // end: the line of "end …", once read
	var cols [5]string
	for sc.Scan() {
		line++
		text, complete := strings.CutSuffix(sc.Text(), "\n")
		text = strings.TrimSuffix(text, "\r")
		if len(text) > MaxTableLine {
			return nil, &TableError{Line: line, Msg: fmt.Sprintf("line longer than %d bytes", MaxTableLine)}
		}
		if end != 0 {
			return nil, &TableError{Line: line, Msg: fmt.Sprintf("text after the end line (line %d)", end)}
		}
		if line == 1 {
			if err := checkVersion(text); err != nil {
				return nil, err
			}
			if !complete {
				return nil, &TableError{Line: 1, Msg: "no line after the header: the file is cut short"}
			}
			continue
		}
		if strings.HasPrefix(text, "#") {
			note := strings.TrimPrefix(strings.TrimPrefix(text, "#"), " ")
			if noteBytes += len(note) + 1; noteBytes > MaxTableNote+1 {
				return nil, &TableError{Line: line, Msg: fmt.Sprintf("note longer than %d bytes", MaxTableNote)}
			}
			notes = append(notes, note)
			continue
		}
		nc := splitFields(cols[:], text)
		if nc == 0 {
			continue
		}
		if cols[0] == "end" {
			if err := checkEnd(cols[:nc], rows, line, complete); err != nil {
				return nil, err
			}
			end = line
			continue
		}
		if nc != 4 {
			return nil, &TableError{Line: line, Msg: fmt.Sprintf("%s fields, want 4 (f n energy err) or an end line", tooMany(nc, len(cols)))}
		}
		f, err1 := strconv.ParseFloat(cols[0], 64)
		n, err2 := strconv.Atoi(cols[1])
		e, err3 := strconv.ParseFloat(cols[2], 64)
		de, err4 := strconv.ParseFloat(cols[3], 64)
		for _, err := range []error{err1, err2, err3, err4} {
			if err != nil {
				return nil, &TableError{Line: line, Msg: err.Error()}
			}
		}
		if rows++; rows > MaxTableRows {
			return nil, &TableError{Line: line, Msg: fmt.Sprintf("more than %d levels", MaxTableRows)}
		}
		last := len(t.Fields) - 1
		switch {
		case n == 1:
			if len(t.Fields) == MaxTableFields {
				return nil, &TableError{Line: line, Msg: fmt.Sprintf("more than %d fields", MaxTableFields)}
			}
			if seen[math.Float64bits(f)] {
				return nil, &TableError{Line: line, Msg: fmt.Sprintf("field %v appears twice", f)}
			}
			seen[math.Float64bits(f)] = true
			t.Fields = append(t.Fields, f)
			t.Levels = append(t.Levels, nil)
			last++
		case last < 0 || math.Float64bits(t.Fields[last]) != math.Float64bits(f) || n != len(t.Levels[last])+1:
			return nil, &TableError{Line: line, Msg: fmt.Sprintf("f=%v n=%d does not continue the levels 1, 2, … of one field", f, n)}
		}
		t.Levels[last] = append(t.Levels[last], tiltwell.Level{N: n, Energy: e, Err: de, Bound: tiltwell.Estimate})
		if msg := badRow(f, t.Levels[last][n-1]); msg != "" {
			return nil, &TableError{Line: line, Msg: msg}
		}
	}
	switch err := sc.Err(); {
	case err == bufio.ErrTooLong:
		return nil, &TableError{Line: line + 1, Msg: fmt.Sprintf("line longer than %d bytes", MaxTableLine)}
	case err != nil:
		return nil, fmt.Errorf("exact: reference table, line %d: %w", line+1, err)
	case line == 0:
		return nil, &TableError{Line: 1, Msg: "empty file"}
	case end == 0:
		return nil, &TableError{Line: line + 1, Msg: fmt.Sprintf("no end line after %d levels: the file is cut short", rows)}
	}
	t.Note = strings.Join(notes, "\n")
	if err := t.validate(); err != nil {
		return nil, err
	}
	return t, nil
}

// scanLines is a [bufio.SplitFunc] that returns each line with its "\n",
// if it has one, so that a last line without it can be told apart.
func scanLines(data []byte, atEOF bool) (advance int, token []byte, err error) {
	if i := bytes.IndexByte(data, '\n'); i >= 0 {
		return i + 1, data[:i+1], nil
	}
	if atEOF && len(data) > 0 {
		return len(data), data, nil
	}
	return 0, nil, nil
}

// splitFields splits text at runs of spaces and tabs into cols, as
// [strings.Fields] does for these two, without allocating. It returns the
// number of fields, len(cols)+1 if there are more than cols holds.
func splitFields(cols []string, text string) int {
	n := 0
	for i := 0; i < len(text); {
		if c := text[i]; c == ' ' || c == '\t' {
			i++
			continue
		}
		if n == len(cols) {
			return n + 1
		}
		j := i + 1
		for j < len(text) && text[j] != ' ' && text[j] != '\t' {
			j++
		}
		cols[n] = text[i:j]
		n++
		i = j
	}
	return n
}

// tooMany formats a field count from [splitFields], which stops counting at
// max+1.
func tooMany(n, max int) string {
	if n > max {
		return fmt.Sprintf("more than %d", max)
	}
	return strconv.Itoa(n)
}

// checkVersion checks the header line: version 2, the present one. The
// version must be exactly 2: "v20" is another format.
func checkVersion(text string) error {
	rest, ok := strings.CutPrefix(text, tableMagic)
	if !ok {
		return &TableError{Line: 1, Msg: fmt.Sprintf("does not begin with %q", tableMagic+strconv.Itoa(tableVersion))}
	}
	v := rest
	if i := strings.IndexAny(rest, ": "); i >= 0 {
		v = rest[:i]
	}
	switch v {
	case strconv.Itoa(tableVersion):
		return nil
	case "1":
		return &TableError{Line: 1, Msg: "version 1 table: it has no end line, so a file cut short cannot be told " +
			"from a whole one; write it again with Table.WriteTo, or, after making sure it is whole, " +
			"change v1 to v2 and add the line \"end N\" (N the number of levels)"}
	}
	return &TableError{Line: 1, Msg: fmt.Sprintf("format version %q, this package reads version %d", v, tableVersion)}
}

// checkEnd checks the end line "end N" at line: N must be the number of
// levels read, rows, and the line must end in a newline.
func checkEnd(cols []string, rows, line int, complete bool) error {
	if len(cols) != 2 {
		return &TableError{Line: line, Msg: fmt.Sprintf("end line with %d fields, want 2 (end N)", len(cols))}
	}
	n, err := strconv.Atoi(cols[1])
	switch {
	case err != nil:
		return &TableError{Line: line, Msg: "end line: " + err.Error()}
	case n != rows:
		return &TableError{Line: line, Msg: fmt.Sprintf("end line counts %d levels, the file has %d: the file is cut short or edited", n, rows)}
	case !complete:
		return &TableError{Line: line, Msg: "no newline after the end line: the file is cut short"}
	}
	return nil
}

// badRow describes what is wrong with one level of a table, or returns "".
func badRow(f float64, l tiltwell.Level) string {
	switch {
	case math.IsNaN(f) || math.IsInf(f, 0) || math.Abs(f) > MaxField:
		return fmt.Sprintf("field %v not finite or beyond MaxField", f)
	case l.N < 1 || l.N > MaxLevels:
		return fmt.Sprintf("level %d outside 1..%d", l.N, MaxLevels)
	case math.IsNaN(l.Energy) || math.IsInf(l.Energy, 0):
		return fmt.Sprintf("energy %v", l.Energy)
	case math.IsNaN(l.Err) || math.IsInf(l.Err, 0) || l.Err < 0:
		return fmt.Sprintf("error estimate %v", l.Err)
	}
	return ""
}

// validate checks the rules of the format on a Table value.
func (t *Table) validate() error {
	if t == nil {
		return &TableError{Msg: "nil table"}
	}
	if len(t.Fields) == 0 {
		return &TableError{Msg: "no fields"}
	}
	if len(t.Levels) != len(t.Fields) {
		return &TableError{Msg: fmt.Sprintf("%d fields but %d lists of levels", len(t.Fields), len(t.Levels))}
	}
	seen := map[uint64]bool{}
	for i, f := range t.Fields {
		if seen[math.Float64bits(f)] {
			return &TableError{Msg: fmt.Sprintf("field %v appears twice", f)}
		}
		seen[math.Float64bits(f)] = true
		if len(t.Levels[i]) == 0 {
			return &TableError{Msg: fmt.Sprintf("no levels at f=%v", f)}
		}
		for j, l := range t.Levels[i] {
			if l.N != j+1 {
				return &TableError{Msg: fmt.Sprintf("f=%v: level %d has N = %d", f, j+1, l.N)}
			}
			if msg := badRow(f, l); msg != "" {
				return &TableError{Msg: fmt.Sprintf("f=%v n=%d: %s", f, l.N, msg)}
			}
		}
	}
	if strings.ContainsAny(t.Note, "\r") {
		return &TableError{Msg: "note contains a carriage return"}
	}
	if len(t.Note) > MaxTableNote {
		return &TableError{Msg: fmt.Sprintf("note of %d bytes, more than %d", len(t.Note), MaxTableNote)}
	}
	if n := len(t.Fields); n > MaxTableFields {
		return &TableError{Msg: fmt.Sprintf("%d fields, more than %d", n, MaxTableFields)}
	}
	if n := t.rows(); n > MaxTableRows {
		return &TableError{Msg: fmt.Sprintf("%d levels, more than %d", n, MaxTableRows)}
	}
	return nil
}

// rows is the number of levels in the table.
func (t *Table) rows() int {
	n := 0
	for _, ls := range t.Levels {
		n += len(ls)
	}
	return n
}

// Check holds the solver s against the table, as [Check] does against the
// live reference, at the table's fields and levels; tol is the absolute
// tolerance in E₁, 0 for none (see [Grid]). The table's own error
// estimates play the role of the reference's. It returns an error for a
// nil s, a table that breaks the format's rules, or a negative or NaN tol.
func (t *Table) Check(s tiltwell.Solver, tol float64) (*Report, error) {
	if s == nil {
		return nil, fmt.Errorf("exact: check: nil solver: %w", tiltwell.ErrNoSolver)
	}
	if err := t.validate(); err != nil {
		return nil, err
	}
	if err := checkLimits(tol, 0); err != nil {
		return nil, err
	}
	return check(s, tiltwell.Stack{}, t.Fields, t.Levels, tol, 0), nil
}
