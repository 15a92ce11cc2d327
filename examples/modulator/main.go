// Modulator computes what an electroabsorption-modulator designer asks of
// a quantum well, from its materials and a field or bias range: the
// transition energies e1–hh1, e1–lh1, … in eV and as vacuum wavelengths,
// their shift from zero field, the electron–hole overlap², and the
// escape times of the electron and the hole, with the exact finite-barrier
// solver (tiltwell.NewDevice with exact.Solver).
//
// Without structure flags it runs two demo structures, invented for the
// purpose (tiltwell.DemoGaAsWell and tiltwell.DemoInGaAsWell): a 10 nm
// GaAs/Al0.3Ga0.7As well and a 1.55 µm-band In0.53Ga0.47As/In0.52Al0.48As
// well lattice-matched to InP, at fields from 0 to 200 kV/cm. Material
// parameters are those of the tiltwell package (I. Vurgaftman, J. R.
// Meyer, L. R. Ram-Mohan, J. Appl. Phys. 89, 5815 (2001)). The model is
// single-particle and single-band: no excitons (measured absorption peaks
// lie a few meV lower), no strain, no band mixing, parabolic bands.
//
// Usage:
//
//	go run ./examples/modulator                       # both demos, 0–200 kV/cm
//	go run ./examples/modulator -tsv                  # the same as tab-separated rows
//	go run ./examples/modulator -well InGaAs:0.53 -barrier InAlAs:0.52 \
//	    -substrate InP -width 9.4 -bias 0:-8:0.5 -vbi 0.8 -intrinsic 400
//	go run ./examples/modulator -infinite [-method exact|perturb2|…]  # infinite walls
//
// With -tsv the output is tab-separated rows with the header
//
//	structure field_kV_cm transition energy_eV wavelength_nm shift_meV overlap2 escape_e_s escape_h_s
//
// (and bias_V last with -bias), one row per structure, field and
// transition, floats in their shortest exact form ('g', -1; an escape time
// is +Inf for a level that does not escape). Rows are written as they are
// computed, so memory does not grow with the number of fields. Bad input
// gives a one-line error on stderr and exit status 2; so does a field
// where a level the transitions need is no longer confined (the rows
// before it are written).
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
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/examples/internal/catalog"
)

// usage is the text -h prints.
const usage = `usage: modulator [flags]
Structure (all three, or none for the two invented demo structures):
  -well SPEC        well material: GaAs, AlAs, InAs, InP, AlGaAs:x, InGaAs:x, InAlAs:x
  -barrier SPEC     barrier material, both sides
  -width NM         well width in nm
  -substrate SPEC   substrate for the lattice-mismatch check (default: the barrier)
  -temp K           temperature in K (default 300)
Fields (one of):
  -kv RANGE         fields in kV/cm: FROM:TO:STEP (inclusive) or a comma list (default 0:200:10)
  -bias RANGE       biases in V of a p-i-n diode (forward positive, reverse negative),
                    with -vbi V (built-in voltage) and -intrinsic NM (intrinsic
                    thickness); the field is (V_bi − V)/d
Output:
  -transitions LIST e1-hh1,e1-hh2,e1-lh1 by default
  -tsv              tab-separated rows: structure field_kV_cm transition energy_eV
                    wavelength_nm shift_meV overlap2 escape_e_s escape_h_s [bias_V]
Infinite walls (the old demo pair, 10 nm, GaAs masses):
  -infinite         e1–hh1 red shift and overlaps with infinitely high walls
  -method NAME      solver for -infinite: ` + "%s" + ` (default exact)
`

// usageError is a bad flag or value: exit status 2.
type usageError struct{ msg string }

func (e usageError) Error() string { return e.msg }

var errHelp = errors.New("help requested")

func main() {
	code, err := run(os.Args[1:], os.Stdout)
	if err != nil {
		fmt.Fprintln(os.Stderr, "modulator:", oneLine(err.Error()))
	}
	os.Exit(code)
}

// oneLine keeps an error message on one line.
func oneLine(s string) string { return strings.Join(strings.Fields(s), " ") }

// options are the parsed flags.
type options struct {
	well, barrier, substrate string
	width, temp              float64 // nm, K
	kv, bias                 string
	vbi, intrinsic           float64 // V, nm
	transitions              string
	tsv, infinite            bool
	method                   string
	set                      map[string]bool
}

func parse(args []string) (options, error) {
	fs := flag.NewFlagSet("modulator", flag.ContinueOnError)
	fs.SetOutput(io.Discard)
	var o options
	fs.StringVar(&o.well, "well", "", "well material")
	fs.StringVar(&o.barrier, "barrier", "", "barrier material")
	fs.StringVar(&o.substrate, "substrate", "", "substrate material")
	fs.Float64Var(&o.width, "width", 0, "well width in nm")
	fs.Float64Var(&o.temp, "temp", 300, "temperature in K")
	fs.StringVar(&o.kv, "kv", "0:200:10", "fields in kV/cm")
	fs.StringVar(&o.bias, "bias", "", "biases in V")
	fs.Float64Var(&o.vbi, "vbi", 0, "built-in voltage in V")
	fs.Float64Var(&o.intrinsic, "intrinsic", 0, "intrinsic thickness in nm")
	fs.StringVar(&o.transitions, "transitions", "e1-hh1,e1-hh2,e1-lh1", "transitions")
	fs.BoolVar(&o.tsv, "tsv", false, "tab-separated output")
	fs.BoolVar(&o.infinite, "infinite", false, "infinite walls")
	fs.StringVar(&o.method, "method", "exact", "solver for -infinite")
	if err := fs.Parse(args); err != nil {
		if errors.Is(err, flag.ErrHelp) {
			return o, errHelp
		}
		return o, usageError{err.Error()}
	}
	if fs.NArg() > 0 {
		return o, usageError{fmt.Sprintf("unexpected argument %q", fs.Arg(0))}
	}
	o.set = map[string]bool{}
	fs.Visit(func(f *flag.Flag) { o.set[f.Name] = true })
	if o.infinite {
		for _, name := range []string{"well", "barrier", "width", "substrate", "temp", "bias", "vbi", "intrinsic", "transitions", "tsv"} {
			if o.set[name] {
				return o, usageError{fmt.Sprintf("-%s does not go with -infinite", name)}
			}
		}
		return o, nil
	}
	if o.set["method"] {
		return o, usageError{"-method goes with -infinite (the structures are solved exactly)"}
	}
	n := 0
	for _, name := range []string{"well", "barrier", "width"} {
		if o.set[name] {
			n++
		}
	}
	if n != 0 && n != 3 {
		return o, usageError{"give -well, -barrier and -width together (or none of them for the demos)"}
	}
	if n == 0 && (o.set["substrate"] || o.set["temp"]) {
		return o, usageError{"-substrate and -temp describe your own structure: give -well, -barrier and -width too"}
	}
	if o.set["bias"] {
		if o.set["kv"] {
			return o, usageError{"give -kv or -bias, not both"}
		}
		if !o.set["vbi"] || !o.set["intrinsic"] {
			return o, usageError{"-bias needs -vbi (built-in voltage, V) and -intrinsic (intrinsic thickness, nm)"}
		}
	} else if o.set["vbi"] || o.set["intrinsic"] {
		return o, usageError{"-vbi and -intrinsic go with -bias"}
	}
	return o, nil
}

// maxPoints bounds the number of fields a range may hold.
const maxPoints = 10_000_000

// parseRange parses FROM:TO:STEP (from FROM towards TO, inclusive, in
// steps of |STEP|; TO may lie below FROM) or a comma-separated list, of
// finite numbers, for the flag named flagName.
func parseRange(flagName, s string) ([]float64, error) {
	num := func(v string) (float64, error) {
		x, err := strconv.ParseFloat(strings.TrimSpace(v), 64)
		if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
			return 0, usageError{fmt.Sprintf("-%s: %q is not a finite number", flagName, strings.TrimSpace(v))}
		}
		return x, nil
	}
	if parts := strings.Split(s, ":"); len(parts) == 3 {
		var v [3]float64
		for i, p := range parts {
			x, err := num(p)
			if err != nil {
				return nil, err
			}
			v[i] = x
		}
		from, to, step := v[0], v[1], v[2]
		if step == 0 {
			return nil, usageError{fmt.Sprintf("-%s %s: the step must not be 0", flagName, s)}
		}
		if step = math.Abs(step); to < from {
			step = -step
		}
		count := math.Floor((to-from)/step+1e-9) + 1
		if !(count <= maxPoints) {
			return nil, usageError{fmt.Sprintf("-%s %s: %g points, at most %d", flagName, s, count, maxPoints)}
		}
		out := make([]float64, int(count))
		for i := range out {
			// 0:1:0.1 gives 0.3, not 0.30000000000000004.
			v := from + float64(i)*step
			out[i], _ = strconv.ParseFloat(strconv.FormatFloat(v, 'g', 12, 64), 64)
		}
		return out, nil
	} else if len(parts) != 1 {
		return nil, usageError{fmt.Sprintf("-%s %q: want FROM:TO:STEP or a comma-separated list", flagName, s)}
	}
	var out []float64
	for _, p := range strings.Split(s, ",") {
		x, err := num(p)
		if err != nil {
			return nil, err
		}
		out = append(out, x)
	}
	return out, nil
}

// parseTransitions parses the -transitions list, such as "e1-hh1,e2-lh1".
func parseTransitions(s string) ([]tiltwell.Transition, error) {
	ts, err := catalog.Transitions(s)
	if err != nil {
		return nil, usageError{"-transitions: " + err.Error()}
	}
	return ts, nil
}

// job is one structure to sweep.
type job struct {
	name  string // short name, the TSV's structure column
	about string // what the structure is, for the human-readable header
	s     tiltwell.Structure
}

// jobs returns the structures the options ask for.
func jobs(o options) ([]job, error) {
	if o.well == "" {
		return []job{
			{"demo-GaAs", "invented demo: 10 nm GaAs between Al0.3Ga0.7As barriers on GaAs, 300 K", tiltwell.DemoGaAsWell()},
			{"demo-InGaAs", fmt.Sprintf("invented demo: %g nm In0.53Ga0.47As between In0.52Al0.48As barriers on InP, 300 K", tiltwell.DemoInGaAsWidth*1e9), tiltwell.DemoInGaAsWell()},
		}, nil
	}
	well, err := tiltwell.ParseMaterial(o.well)
	if err != nil {
		return nil, usageError{"-well: " + err.Error()}
	}
	barrier, err := tiltwell.ParseMaterial(o.barrier)
	if err != nil {
		return nil, usageError{"-barrier: " + err.Error()}
	}
	var sub tiltwell.Material
	if o.substrate != "" {
		if sub, err = tiltwell.ParseMaterial(o.substrate); err != nil {
			return nil, usageError{"-substrate: " + err.Error()}
		}
	}
	if !(o.width > 0) || math.IsInf(o.width, 0) {
		return nil, usageError{fmt.Sprintf("-width %v: the well width must be a positive number of nm", o.width)}
	}
	s := tiltwell.Structure{
		Slabs:       []tiltwell.Slab{{Material: barrier}, {Material: well, Thickness: o.width * 1e-9}, {Material: barrier}},
		Well:        1,
		Temperature: o.temp,
		Substrate:   sub,
	}
	subName := barrier.Name
	if o.substrate != "" {
		subName = sub.Name
	}
	return []job{{
		name:  fmt.Sprintf("%s/%s-%gnm", well.Name, barrier.Name, o.width),
		about: fmt.Sprintf("%g nm %s between %s barriers on %s, %g K", o.width, well.Name, barrier.Name, subName, o.temp),
		s:     s,
	}}, nil
}

// header is the first line of the -tsv output.
const header = "structure\tfield_kV_cm\ttransition\tenergy_eV\twavelength_nm\tshift_meV\toverlap2\tescape_e_s\tescape_h_s"

// chunkFields is how many fields are computed before their rows are
// written.
const chunkFields = 64

// run executes the command and returns the exit status.
func run(args []string, out io.Writer) (int, error) {
	o, err := parse(args)
	if errors.Is(err, errHelp) {
		_, err := fmt.Fprintf(out, usage, catalog.Names())
		return 0, err
	}
	if err != nil {
		return 2, err
	}
	if o.infinite {
		return runInfinite(out, o)
	}
	ts, err := parseTransitions(o.transitions)
	if err != nil {
		return 2, err
	}
	js, err := jobs(o)
	if err != nil {
		return 2, err
	}
	// The fields in V/m, and the biases they come from (nil for -kv).
	var fields, biases []float64
	if o.set["bias"] {
		if biases, err = parseRange("bias", o.bias); err != nil {
			return 2, err
		}
		if math.IsNaN(o.vbi) || math.IsInf(o.vbi, 0) {
			return 2, usageError{fmt.Sprintf("-vbi %v: not a finite voltage", o.vbi)}
		}
		if !(o.intrinsic > 0) || math.IsInf(o.intrinsic, 0) {
			return 2, usageError{fmt.Sprintf("-intrinsic %v: the intrinsic thickness must be a positive number of nm", o.intrinsic)}
		}
		fields = make([]float64, len(biases))
		for i, v := range biases {
			if fields[i], err = tiltwell.DiodeField(o.vbi, v, o.intrinsic*1e-9); err != nil {
				return 2, usageError{fmt.Sprintf("-bias %g V: %v", v, err)}
			}
		}
	} else {
		kv, err := parseRange("kv", o.kv)
		if err != nil {
			return 2, err
		}
		fields = make([]float64, len(kv))
		for i, v := range kv {
			fields[i] = tiltwell.KVPerCM(v)
		}
	}
	devices := make([]*tiltwell.Device, len(js))
	for i, j := range js {
		d, err := tiltwell.NewDevice(j.s, func(s tiltwell.Stack) tiltwell.WaveSolver { return exact.Solver{Stack: s} }, ts)
		if err != nil {
			return 2, fmt.Errorf("%s: %w", j.name, err)
		}
		devices[i] = d
	}
	w := bufio.NewWriterSize(out, 64<<10)
	code, err := write(w, o, js, devices, fields, biases)
	if ferr := w.Flush(); ferr != nil && code == 0 {
		return 1, ferr
	}
	return code, err
}

// write streams the rows of every structure, chunk by chunk of fields.
func write(w *bufio.Writer, o options, js []job, devices []*tiltwell.Device, fields, biases []float64) (int, error) {
	if o.tsv {
		h := header
		if biases != nil {
			h += "\tbias_V"
		}
		if _, err := fmt.Fprintln(w, h); err != nil {
			return 1, err
		}
	} else {
		fmt.Fprint(w, intro)
	}
	var lines []tiltwell.DeviceLine
	var row []byte
	for k, j := range js {
		d := devices[k]
		nt := len(d.Transitions())
		if !o.tsv {
			describe(w, j, d, biases != nil)
		}
		for start := 0; start < len(fields); start += chunkFields {
			end := min(start+chunkFields, len(fields))
			var err error
			lines, err = d.Lines(lines, fields[start:end])
			for i, l := range lines {
				row = row[:0]
				if o.tsv {
					row = tsvRow(row, j.name, l)
				} else {
					row = textRow(row, l, i%nt == 0)
				}
				if biases != nil {
					b := biases[start+i/nt]
					if o.tsv {
						row = append(row, '\t')
						row = strconv.AppendFloat(row, b, 'g', -1, 64)
					} else {
						row = fmt.Appendf(row, "  %7.3g", b)
					}
				}
				row = append(row, '\n')
				if _, werr := w.Write(row); werr != nil {
					return 1, werr
				}
			}
			if err != nil {
				return 2, fmt.Errorf("%s: %w", j.name, err)
			}
			if err := w.Flush(); err != nil {
				return 1, err
			}
		}
	}
	return 0, nil
}

// intro opens the human-readable output.
const intro = `Interband transitions of a quantum well under an electric field, from
exact finite-barrier levels in the single-particle picture: no exciton
binding (measured absorption peaks lie a few meV lower), no strain, no band
mixing, parabolic bands. Material parameters: I. Vurgaftman, J. R. Meyer,
L. R. Ram-Mohan, J. Appl. Phys. 89, 5815 (2001). Escape time: how long a
carrier stays in its level before tunnelling out ("bound": it does not).
`

// describe writes the header of one structure's table.
func describe(w io.Writer, j job, d *tiltwell.Device, bias bool) {
	r := d.Reduced()
	fmt.Fprintf(w, "\n%s: %s\n", j.name, j.about)
	fmt.Fprintf(w, "  well band gap %.4f eV at %g K\n", r.Gap, r.Temperature)
	for _, c := range []tiltwell.Carrier{tiltwell.Electron, tiltwell.HeavyHole, tiltwell.LightHole} {
		cw := r.Carriers[c]
		left, right := cw.Stack.Outer()
		fmt.Fprintf(w, "  %-2v mass %.4f m₀, E₁ %6.2f meV, barriers %6.1f and %6.1f meV\n",
			cw.Carrier, cw.Well.Mass, cw.E1*1e3, left.Edge*cw.E1*1e3, right.Edge*cw.E1*1e3)
	}
	fmt.Fprintf(w, "  %8s  %-7s %10s %9s %10s %9s %10s %10s", "F kV/cm", "line", "E eV", "λ nm", "shift meV", "overlap²", "τ_e s", "τ_h s")
	if bias {
		fmt.Fprintf(w, "  %7s", "bias V")
	}
	fmt.Fprintln(w)
}

// textRow appends one human-readable row; the field is printed on the
// first line of each field only.
func textRow(b []byte, l tiltwell.DeviceLine, first bool) []byte {
	field := ""
	if first {
		field = strconv.FormatFloat(tiltwell.InKVPerCM(l.Field), 'g', 6, 64)
	}
	return fmt.Appendf(b, "  %8s  %-7v %10.5f %9.2f %10.3f %9.5f %10s %10s",
		field, l.Transition, l.Energy, l.Wavelength, l.Shift, l.Overlap2, seconds(l.ElectronEscape), seconds(l.HoleEscape))
}

// seconds formats an escape time.
func seconds(t float64) string {
	if math.IsInf(t, 1) {
		return "bound"
	}
	return strconv.FormatFloat(t, 'e', 2, 64)
}

// tsvRow appends one tab-separated row.
func tsvRow(b []byte, name string, l tiltwell.DeviceLine) []byte {
	b = append(b, name...)
	for _, v := range []any{tiltwell.InKVPerCM(l.Field), l.Transition, l.Energy, l.Wavelength, l.Shift, l.Overlap2, l.ElectronEscape, l.HoleEscape} {
		b = append(b, '\t')
		switch v := v.(type) {
		case float64:
			b = strconv.AppendFloat(b, v, 'g', -1, 64)
		case tiltwell.Transition:
			b = append(b, v.String()...)
		}
	}
	return b
}

// infinitePair is the invented demo pair of -infinite: a 10 nm well with
// the GaAs electron and [001] heavy-hole masses (0.067 and 1/(γ₁ − 2γ₂) =
// 0.3497, Vurgaftman et al.) and infinitely high walls.
var infinitePair = tiltwell.Pair{Width: 10e-9, Electron: 0.067, Hole: 0.3497}

// runInfinite prints the e1–hh1 red shift and the e1–hh1 and e1–hh2
// overlaps of the infinite-wall demo pair, solved by -method.
func runInfinite(out io.Writer, o options) (int, error) {
	m, ok := catalog.Lookup(o.method)
	if !ok {
		return 2, usageError{fmt.Sprintf("unknown -method %q (want one of %s)", o.method, catalog.Names())}
	}
	kv, err := parseRange("kv", o.kv)
	if err != nil {
		return 2, err
	}
	fields := make([]float64, len(kv))
	for i, v := range kv {
		fields[i] = tiltwell.KVPerCM(v)
	}
	we, wh, err := infinitePair.Wells()
	if err != nil {
		return 2, err
	}
	ts := []tiltwell.Transition{{E: 1, H: 1}, {E: 1, H: 2}}
	lines, err := infinitePair.Sweep(m.Solver, m.Solver, fields, ts)
	if err != nil {
		return 2, err
	}
	w := bufio.NewWriter(out)
	fmt.Fprintf(w, "Invented demo pair with infinitely high walls (GaAs masses from Vurgaftman et al., J. Appl. Phys. 89, 5815 (2001)):\n")
	fmt.Fprintf(w, "L = %g nm, m_e = %g m₀, m_hh = %g m₀; E₁(e) = %.3f meV, E₁(hh) = %.3f meV. Method: %s.\n\n",
		infinitePair.Width*1e9, infinitePair.Electron, infinitePair.Hole, we.MilliEV(1), wh.MilliEV(1), m.Name)
	fmt.Fprintf(w, "%8s %8s %8s %13s %8s %15s %9s %15s\n", "F kV/cm", "f_e", "f_hh", "red shift meV", "± meV", "overlap e1-hh1", "overlap²", "overlap² e1-hh2")
	for i := 0; i < len(lines); i += len(ts) {
		l11, l12 := lines[i], lines[i+1]
		fmt.Fprintf(w, "%8g %8.3f %8.3f %13.4f %8.1g %15.6f %9.6f %15.6f\n",
			tiltwell.InKVPerCM(l11.Field), we.Reduced(l11.Field), wh.Reduced(l11.Field), 0-l11.Shift, l11.ShiftErr, l11.Overlap, l11.Overlap2, l12.Overlap2)
	}
	if err := w.Flush(); err != nil {
		return 1, err
	}
	return 0, nil
}
