// Levels prints the confined levels of a tilted well computed by one
// method, as machine-readable tab-separated rows: the entry point for
// scripts and for regression tests in other languages. The well has
// infinitely high walls unless barrier flags give it finite barriers.
//
// Usage:
//
//	go run ./examples/levels -method exact -f 0,1,3,10 -n 5
//	go run ./examples/levels -method exact -f 0,1,2 -n 3 -barrier 4.62 -barrier-mass 1.372
//
// Flags:
//
//	-method NAME    exact, perturb1, perturb2, variational, wkb, wkb-plain or basis (default exact)
//	-f LIST         comma-separated reduced fields f = F/F₀ (default 0,1,3,10)
//	-n K            number of levels per field (default 5)
//	-basis-size N   sine states for -method basis (0: the package default)
//	-wkb-plain      the plain WKB rules with their jump at η = f/2
//	-barrier V      both barrier heights, in units of E₁ of the well
//	-barrier-mass M both barriers' mass ratio m_barrier/m_well (default 1)
//	-barrier-left V, -barrier-right V, -mass-left M, -mass-right M
//	                one side at a time (both heights must be given)
//
// Output: a header line "method f n energy err bound gamma gamma_err", then
// one row per field and level. energy is η = E/E₁ and err the method's own
// error estimate in units of E₁; gamma is the escape width Γ in units of
// E₁ (0 for infinite walls and for bound states; a method that does not
// compute escape reports 0 and puts its estimate of the missing width in
// gamma_err) and gamma_err its estimate; all four are printed with full float64 precision (strconv
// 'g', -1). bound is "rigorous" for a proven bound and "estimate"
// otherwise. Rows are written as they are computed, through a buffer, so
// memory does not grow with the number of fields or levels.
//
// A method that answers outside its range of validity still prints its
// rows and reports the range error on stderr, exiting with status 1; so
// does a finite well that confines fewer than -n levels at a field (the
// confined ones are printed). Bad
// flags or values print one line on stderr and exit with status 2: a
// field that is not a number, is NaN or infinite, overflows float64
// (-f 1e400) or underflows to zero (-f 1e-400; write 0 for zero field).
// A method that fails at a field exits with status 2 after the rows of
// the fields before it.
package main

import (
	"bufio"
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"os"
	"strconv"
	"strings"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/basis"
	"github.com/tiltwell/tiltwell/examples/internal/catalog"
)

// options are the parsed flags.
type options struct {
	method    string
	fields    []float64
	n         int
	basisSize int
	wkbPlain  bool
	stack     tiltwell.Stack // the zero Stack: infinite walls
}

// errHelp asks for the usage text: printed to stdout, exit status 0.
var errHelp = errors.New("help requested")

// usage is the text -h prints.
const usage = `usage: levels [-method NAME] [-f LIST] [-n K] [-basis-size N] [-wkb-plain] [barrier flags]
  -method NAME    exact, perturb1, perturb2, variational, wkb, wkb-plain or basis (default exact)
  -f LIST         comma-separated reduced fields f = F/F₀ (default 0,1,3,10)
  -n K            number of levels per field (default 5)
  -basis-size N   sine states for -method basis (0: the package default)
  -wkb-plain      the plain WKB rules (same as -method wkb-plain)
Barriers (units of E₁ of the well; none given: infinitely high walls):
  -barrier V      both barrier heights
  -barrier-mass M both barriers' mass ratio m_barrier/m_well (default 1)
  -barrier-left V, -barrier-right V, -mass-left M, -mass-right M
                  one side at a time
Output: tab-separated rows "method f n energy err bound gamma gamma_err".
`

// usageError is a bad flag or value: exit status 2.
type usageError struct{ msg string }

func (e usageError) Error() string { return e.msg }

func main() {
	code, err := run(os.Args[1:], os.Stdout)
	if err != nil {
		fmt.Fprintln(os.Stderr, "levels:", err)
	}
	os.Exit(code)
}

// solver returns the solver the options ask for: the catalogue's default
// settings, with -basis-size and -wkb-plain applied (the latter renames the
// method wkb-plain in the output).
func solver(o *options) (tiltwell.Solver, error) {
	name := o.method
	if o.wkbPlain {
		name = "wkb-plain"
		o.method = name
	}
	m, ok := catalog.Lookup(name)
	if !ok {
		return nil, usageError{fmt.Sprintf("unknown method %q (want one of %s)", o.method, catalog.Names())}
	}
	if name == "basis" {
		if o.basisSize < 0 {
			return nil, usageError{fmt.Sprintf("-basis-size %d: must be 0 (default) or positive", o.basisSize)}
		}
		m.Solver = basis.Solver{Size: o.basisSize}
	}
	m, err := catalog.WithStack(m, o.stack)
	if err != nil {
		return nil, usageError{err.Error()}
	}
	return m.Solver, nil
}

func parse(args []string) (options, error) {
	fs := flag.NewFlagSet("levels", flag.ContinueOnError)
	fs.SetOutput(io.Discard)
	var o options
	var list string
	fs.StringVar(&o.method, "method", "exact", "method name")
	fs.StringVar(&list, "f", "0,1,3,10", "comma-separated reduced fields")
	fs.IntVar(&o.n, "n", 5, "levels per field")
	fs.IntVar(&o.basisSize, "basis-size", 0, "sine states for -method basis")
	fs.BoolVar(&o.wkbPlain, "wkb-plain", false, "plain WKB rules")
	b := catalog.BarrierFlags(fs)
	if err := fs.Parse(args); err != nil {
		if errors.Is(err, flag.ErrHelp) {
			return o, errHelp
		}
		return o, usageError{err.Error()}
	}
	var err error
	if o.stack, err = b.Stack(fs); err != nil {
		return o, usageError{err.Error()}
	}
	if fs.NArg() > 0 {
		return o, usageError{fmt.Sprintf("unexpected argument %q", fs.Arg(0))}
	}
	if o.wkbPlain && o.method != "wkb" {
		return o, usageError{"-wkb-plain goes with -method wkb"}
	}
	if o.basisSize != 0 && o.method != "basis" {
		return o, usageError{"-basis-size goes with -method basis"}
	}
	if o.n < 1 {
		return o, usageError{fmt.Sprintf("-n %d: need at least 1 level", o.n)}
	}
	for _, s := range strings.Split(list, ",") {
		v, err := parseField(strings.TrimSpace(s))
		if err != nil {
			return o, err
		}
		o.fields = append(o.fields, v)
	}
	return o, nil
}

// parseField parses one reduced field of the -f list.
func parseField(s string) (float64, error) {
	v, err := strconv.ParseFloat(s, 64)
	switch {
	case errors.Is(err, strconv.ErrRange):
		return 0, usageError{fmt.Sprintf("-f: %q is out of range: |f| must stay below 1.8e308", s)}
	case err != nil:
		return 0, usageError{fmt.Sprintf("-f: %q is not a number", s)}
	case math.IsNaN(v) || math.IsInf(v, 0):
		return 0, usageError{fmt.Sprintf("-f: %q is not a finite number", s)}
	case v == 0 && nonzeroDigits(s):
		return 0, usageError{fmt.Sprintf("-f: %q underflows to 0: |f| must be 0 or at least 5e-324", s)}
	}
	return v, nil
}

// nonzeroDigits reports whether the mantissa of the number s, decimal or
// hexadecimal, has a digit other than 0.
func nonzeroDigits(s string) bool {
	s = strings.TrimLeft(s, "+-")
	hex := len(s) > 1 && s[0] == '0' && (s[1] == 'x' || s[1] == 'X')
	if hex {
		s = s[2:]
	}
	for _, c := range s {
		switch {
		case !hex && (c == 'e' || c == 'E'), hex && (c == 'p' || c == 'P'):
			return false
		case c >= '1' && c <= '9', hex && (c >= 'a' && c <= 'f' || c >= 'A' && c <= 'F'):
			return true
		}
	}
	return false
}

// header is the first line of the output.
const header = "method\tf\tn\tenergy\terr\tbound\tgamma\tgamma_err\n"

// run executes the command and returns the exit status.
func run(args []string, out io.Writer) (int, error) {
	o, err := parse(args)
	if errors.Is(err, errHelp) {
		_, err := io.WriteString(out, usage)
		return 0, err
	}
	if err != nil {
		return 2, err
	}
	s, err := solver(&o)
	if err != nil {
		return 2, err
	}
	w := bufio.NewWriterSize(out, 64<<10)
	code, err := write(w, s, o)
	if ferr := w.Flush(); ferr != nil && code != 2 {
		return 1, ferr
	}
	return code, err
}

// chunk is the levels of a run of consecutive fields, passed from the
// goroutine that solves them to the one that writes them.
type chunk struct {
	fields []float64        // the fields, a window of options.fields
	levels []tiltwell.Level // field i's levels at [i·n, i·n + count[i])
	count  []int            // levels returned for each field
	errs   []error          // the error of each field's Levels call
}

// chunks is how many chunks are in flight: one being solved, one being
// written, one waiting. Memory stays at chunks·chunkLevels levels
// whatever the number of fields.
const (
	chunks      = 3
	chunkLevels = 512
)

// write writes the header and the rows, one field at a time, in order.
// The levels are solved on a goroutine of their own while the rows are
// written on this one, so with two cores the digits cost no wall-clock
// time beyond the solving; each row is formatted into one reused buffer
// (the method and f once per field).
func write(w *bufio.Writer, s tiltwell.Solver, o options) (int, error) {
	if _, err := w.WriteString(header); err != nil {
		return 1, err
	}
	per := max(1, chunkLevels/o.n) // fields per chunk
	free := make(chan *chunk, chunks)
	for range chunks {
		free <- &chunk{levels: make([]tiltwell.Level, per*o.n), count: make([]int, per), errs: make([]error, per)}
	}
	full := make(chan *chunk, chunks)
	done := make(chan struct{})
	defer close(done)
	go solve(s, o, per, free, full, done)

	var soft error
	var buf []byte
	for c := range full {
		for i, f := range c.fields {
			lv := c.levels[i*o.n : i*o.n+c.count[i]]
			if err := c.errs[i]; err != nil {
				if !usable(lv, err) {
					// No usable result: bad input for this method.
					return 2, err
				}
				if soft == nil {
					soft = err
				}
			}
			buf = append(buf[:0], o.method...)
			buf = append(buf, '\t')
			buf = appendFloat(buf, f)
			buf = append(buf, '\t')
			prefix := len(buf)
			for _, l := range lv {
				buf = buf[:prefix]
				buf = strconv.AppendInt(buf, int64(l.N), 10)
				buf = append(buf, '\t')
				buf = appendFloat(buf, l.Energy)
				buf = append(buf, '\t')
				buf = appendFloat(buf, l.Err)
				buf = append(buf, '\t')
				buf = append(buf, boundName(l.Bound)...)
				buf = append(buf, '\t')
				buf = appendFloat(buf, l.Gamma)
				buf = append(buf, '\t')
				buf = appendFloat(buf, l.GammaErr)
				buf = append(buf, '\n')
				if _, err := w.Write(buf); err != nil {
					return 1, err
				}
			}
		}
		free <- c
	}
	if soft != nil {
		return 1, soft
	}
	return 0, nil
}

// solve fills chunks taken from free with the levels of o.fields in order
// and passes them on to full, which it closes at the end. It stops early
// when done is closed, and after the chunk holding a field with no usable
// result. A panic in the solver is passed on as that field's error.
func solve(s tiltwell.Solver, o options, per int, free <-chan *chunk, full chan<- *chunk, done <-chan struct{}) {
	defer close(full)
	for start := 0; start < len(o.fields); start += per {
		var c *chunk
		select {
		case c = <-free:
		case <-done:
			return
		}
		c.fields = o.fields[start:min(start+per, len(o.fields))]
		stop := false
		for i, f := range c.fields {
			dst := c.levels[i*o.n : i*o.n : (i+1)*o.n]
			lv, err := levels(s, dst, f, o.n)
			c.count[i] = copy(dst[:cap(dst)], lv[:min(len(lv), o.n)])
			c.errs[i] = err
			if err != nil && !usable(lv, err) {
				c.fields = c.fields[:i+1]
				stop = true
				break
			}
		}
		select {
		case full <- c:
		case <-done:
			return
		}
		if stop {
			return
		}
	}
}

// usable reports whether levels returned with err are still printed: a
// method answering outside its range of validity, or a finite well
// confining fewer levels than asked for.
func usable(lv []tiltwell.Level, err error) bool {
	if len(lv) == 0 {
		return false
	}
	_, confined := tiltwell.Confined(err)
	return confined || errors.Is(err, tiltwell.ErrOutOfRange)
}

// levels calls s.Levels, turning a panic into an error.
func levels(s tiltwell.Solver, dst []tiltwell.Level, f float64, k int) (lv []tiltwell.Level, err error) {
	defer func() {
		if r := recover(); r != nil {
			lv, err = nil, fmt.Errorf("f = %g: the solver panicked: %v", f, r)
		}
	}()
	return s.Levels(dst, f, k)
}

// boundName returns b.String() without calling it for the two bounds
// every row has.
func boundName(b tiltwell.Bound) string {
	switch b {
	case tiltwell.Rigorous:
		return rigorous
	case tiltwell.Estimate:
		return estimate
	}
	return b.String()
}

var rigorous, estimate = tiltwell.Rigorous.String(), tiltwell.Estimate.String()

// appendFloat appends v as strconv 'g', -1 formats it.
func appendFloat(b []byte, v float64) []byte {
	if v == 0 && !math.Signbit(v) {
		return append(b, '0')
	}
	return strconv.AppendFloat(b, v, 'g', -1, 64)
}
