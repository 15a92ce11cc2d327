// Levels prints the confined levels of the tilted infinite well computed by
// one method, as machine-readable tab-separated rows: the entry point for
// scripts and for regression tests in other languages.
//
// Usage:
//
//	go run ./examples/levels -method exact -f 0,1,3,10 -n 5
//
// Flags:
//
//	-method NAME    exact, perturb1, perturb2, variational, wkb, wkb-plain or basis (default exact)
//	-f LIST         comma-separated reduced fields f = F/F₀ (default 0,1,3,10)
//	-n K            number of levels per field (default 5)
//	-basis-size N   sine states for -method basis (0: the package default)
//	-wkb-plain      the plain WKB rules with their jump at η = f/2
//
// Output: a header line "method f n energy err bound", then one row per field
// and level. energy is η = E/E₁ and err the method's own error estimate in
// units of E₁, both printed with full float64 precision (strconv 'g', -1);
// bound is "rigorous" for a proven bound and "estimate" otherwise. A method
// that answers outside its range of validity still prints its rows and
// reports the range error on stderr, exiting with status 1. Bad flags or
// values print one line on stderr and exit with status 2.
package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
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
}

// errHelp asks for the usage text: printed to stdout, exit status 0.
var errHelp = errors.New("help requested")

// usage is the text -h prints.
const usage = `usage: levels [-method NAME] [-f LIST] [-n K] [-basis-size N] [-wkb-plain]
  -method NAME    exact, perturb1, perturb2, variational, wkb, wkb-plain or basis (default exact)
  -f LIST         comma-separated reduced fields f = F/F₀ (default 0,1,3,10)
  -n K            number of levels per field (default 5)
  -basis-size N   sine states for -method basis (0: the package default)
  -wkb-plain      the plain WKB rules (same as -method wkb-plain)
Output: tab-separated rows "method f n energy err bound".
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
		return basis.Solver{Size: o.basisSize}, nil
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
	if err := fs.Parse(args); err != nil {
		if errors.Is(err, flag.ErrHelp) {
			return o, errHelp
		}
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
		v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
		if err != nil {
			return o, usageError{fmt.Sprintf("-f: %q is not a number", s)}
		}
		o.fields = append(o.fields, v)
	}
	return o, nil
}

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
	var b strings.Builder
	b.WriteString("method\tf\tn\tenergy\terr\tbound\n")
	var soft error
	var lv []tiltwell.Level
	for _, f := range o.fields {
		lv, err = s.Levels(lv, f, o.n)
		if err != nil {
			if len(lv) == 0 || !errors.Is(err, tiltwell.ErrOutOfRange) {
				// No usable result: bad input for this method.
				return 2, err
			}
			soft = err
		}
		for _, l := range lv {
			fmt.Fprintf(&b, "%s\t%s\t%d\t%s\t%s\t%s\n", o.method, g(f), l.N, g(l.Energy), g(l.Err), l.Bound)
		}
	}
	if _, err := io.WriteString(out, b.String()); err != nil {
		return 1, err
	}
	if soft != nil {
		return 1, soft
	}
	return 0, nil
}

func g(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
