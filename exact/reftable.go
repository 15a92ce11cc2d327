package exact

import (
	"bufio"
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
// depending on this package's solver staying the same.
//
// # File format
//
// A table file is UTF-8 text, one record per line (a trailing "\r" is
// ignored):
//
//	tiltwell-levels v1: f n energy err (f in F₀; energy, err in E₁)
//	# a note, any number of lines starting with '#'
//	10	1	0.06602629575509023	1.2490009027033011e-14
//	10	2	4.181870005637617	1.0658141036401503e-13
//
// The first line must begin with "tiltwell-levels v1" followed by a colon,
// a space or the end of the line. Lines starting with
// '#' are comments, which make up [Table.Note]; blank lines are ignored.
// Every other line has four fields separated by spaces or tabs: the
// reduced field f, the level number n, the reduced energy η and the
// reference's error estimate, in units of E₁. The numbers f, η and the
// estimate are written by [strconv.FormatFloat] with format 'g' and
// precision −1, the shortest text that [strconv.ParseFloat] turns back into
// the same float64, so the round trip is lossless; n is a decimal integer.
// The levels of one field are consecutive lines with n = 1, 2, …, k; each
// field appears once, and the fields may come in any order and have
// different k.
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

// tableMagic begins the first line of every table file.
const tableMagic = "tiltwell-levels v1"

const tableHeader = tableMagic + ": f n energy err (f in F₀; energy, err in E₁)"

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
// that is not finite or beyond MaxField and for k outside 1..MaxLevels.
func NewTable(fields []float64, k int) (*Table, error) {
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

// WriteTo writes the table in the file format described at [Table]. It
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

// ReadTable reads a table in the format described at [Table]. A malformed
// file gives a [*TableError] naming the line.
func ReadTable(r io.Reader) (*Table, error) {
	sc := bufio.NewScanner(r)
	t := &Table{}
	var notes []string
	seen := map[uint64]bool{}
	line := 0
	for sc.Scan() {
		line++
		text := strings.TrimSuffix(sc.Text(), "\r")
		if line == 1 {
			// The version must be exactly v1: "v10" is another format.
			if rest, ok := strings.CutPrefix(text, tableMagic); !ok || (rest != "" && rest[0] != ':' && rest[0] != ' ') {
				return nil, &TableError{Line: 1, Msg: fmt.Sprintf("does not begin with %q", tableMagic)}
			}
			continue
		}
		if strings.HasPrefix(text, "#") {
			note := strings.TrimPrefix(text, "#")
			notes = append(notes, strings.TrimPrefix(note, " "))
			continue
		}
		cols := strings.Fields(text)
		if len(cols) == 0 {
			continue
		}
		if len(cols) != 4 {
			return nil, &TableError{Line: line, Msg: fmt.Sprintf("%d fields, want 4 (f n energy err)", len(cols))}
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
		last := len(t.Fields) - 1
		switch {
		case n == 1:
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
	if err := sc.Err(); err != nil {
		return nil, fmt.Errorf("exact: reference table, line %d: %w", line+1, err)
	}
	if line == 0 {
		return nil, &TableError{Line: 1, Msg: "empty file"}
	}
	t.Note = strings.Join(notes, "\n")
	if err := t.validate(); err != nil {
		return nil, err
	}
	return t, nil
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
	return nil
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
	return check(s, t.Fields, t.Levels, tol, 0), nil
}
