// Absorption computes the absorption spectrum of a quantum well at
// several fields, the change of absorption Δα between them and what it
// makes of an electroabsorption modulator: the exciton lines and continua
// of the transitions e1–hh1, e1–lh1, e1–hh2 and e2–hh2 from the exact
// finite-barrier levels (tiltwell.NewExcitons with exact.Solver) and the
// variational exciton binding, broadened and summed by
// tiltwell.Absorption, and the best operating wavelength of a waveguide
// modulator switched from the first field to each of the others.
//
// It runs two demo structures, invented for the purpose
// (tiltwell.DemoGaAsWell and tiltwell.DemoInGaAsWell): a 10 nm
// GaAs/Al0.3Ga0.7As well and a 1.55 µm-band In0.53Ga0.47As/In0.52Al0.48As
// well lattice-matched to InP, at 0, 50, 100 and 150 kV/cm. Material
// parameters are those of the tiltwell package (I. Vurgaftman, J. R.
// Meyer, L. R. Ram-Mohan, J. Appl. Phys. 89, 5815 (2001)); the refractive
// indices, which the material table lacks, are 3.6 for GaAs near its band
// edge (D. T. F. Marple, J. Appl. Phys. 35, 1241 (1964); value from
// memory) and 3.56 for In0.53Ga0.47As (the Ioffe Institute's NSM archive,
// 3.1 + 0.46y for Ga0.47In0.53AsyP1−y at y = 1, an infrared value). The
// broadening (5 meV Gaussian, 2 meV Lorentzian, a well-width spread of
// 0.14 nm, half a GaAs monolayer) is invented, of the order reported for
// room-temperature wells (from memory), and so is the waveguide (100 µm,
// confinement factor 0.05). The model has no band mixing, no
// strain, no self-consistent field, and a variational exciton.
//
// Usage:
//
//	go run ./examples/absorption                  # human-readable summary
//	go run ./examples/absorption -tsv             # the spectra as rows
//	go run ./examples/absorption -excitons        # the excitons as rows
//	go run ./examples/absorption -png docs/absorption.png   # the picture
//
// With -tsv the output is tab-separated rows with the header
//
//	structure field_kV_cm photon_eV wavelength_nm alpha_per_cm
//
// one row per structure, field and photon energy (α in cm⁻¹ of the well
// material); with -excitons the header is
//
//	structure field_kV_cm transition energy_eV binding_meV overlap2
//
// one row per structure, field and transition, energy_eV being the
// single-particle transition energy (the exciton line lies binding_meV
// below it). Floats are in their shortest exact form ('g', -1). Bad input
// gives a one-line error on stderr and exit status 2.
package main

import (
	"bufio"
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/examples/internal/catalog"
)

// usage is the text -h prints.
const usage = `usage: absorption [flags]
  -kv LIST            fields in kV/cm, comma-separated (default 0,50,100,150); the
                      first is the modulator's reference state
  -transitions LIST   default e1-hh1,e1-lh1,e1-hh2,e2-hh2
  -inhomogeneous MEV  Gaussian FWHM in meV (default 5)
  -homogeneous MEV    Lorentzian FWHM in meV added to the escape widths (default 2)
  -spread NM          standard deviation of the well width in nm (default 0.14)
  -points N           photon energies per spectrum (default 500)
  -length UM          waveguide length in µm (default 100)
  -confinement G      the mode's confinement factor in the wells (default 0.05)
  -max-insertion DB   insertion-loss limit of the best operating point (default 3)
Output (at most one):
  -tsv                rows: structure field_kV_cm photon_eV wavelength_nm alpha_per_cm
  -excitons           rows: structure field_kV_cm transition energy_eV binding_meV overlap2
  -png FILE           draw the spectra and Δα against wavelength into FILE (.png or .svg)
`

// usageError is a bad flag or value: exit status 2.
type usageError struct{ msg string }

func (e usageError) Error() string { return e.msg }

var errHelp = errors.New("help requested")

func main() {
	code, err := run(os.Args[1:], os.Stdout)
	if err != nil {
		fmt.Fprintln(os.Stderr, "absorption:", strings.Join(strings.Fields(err.Error()), " "))
	}
	os.Exit(code)
}

// options are the parsed flags.
type options struct {
	kv                        []float64
	transitions               []tiltwell.Transition
	absorption                tiltwell.Absorption
	points                    int
	length, confinement, loss float64 // µm, 1, dB
	tsv, excitons             bool
	png                       string
}

// maxPoints bounds -points and the number of fields.
const maxPoints = 100000

func parse(args []string) (options, error) {
	fs := flag.NewFlagSet("absorption", flag.ContinueOnError)
	fs.SetOutput(io.Discard)
	var o options
	kv := fs.String("kv", "0,50,100,150", "")
	ts := fs.String("transitions", "e1-hh1,e1-lh1,e1-hh2,e2-hh2", "")
	fs.Float64Var(&o.absorption.Inhomogeneous, "inhomogeneous", 5, "")
	fs.Float64Var(&o.absorption.Homogeneous, "homogeneous", 2, "")
	fs.Float64Var(&o.absorption.WidthSpread, "spread", 0.14, "")
	fs.IntVar(&o.points, "points", 500, "")
	fs.Float64Var(&o.length, "length", 100, "")
	fs.Float64Var(&o.confinement, "confinement", 0.05, "")
	fs.Float64Var(&o.loss, "max-insertion", 3, "")
	fs.BoolVar(&o.tsv, "tsv", false, "")
	fs.BoolVar(&o.excitons, "excitons", false, "")
	fs.StringVar(&o.png, "png", "", "")
	if err := fs.Parse(args); err != nil {
		if errors.Is(err, flag.ErrHelp) {
			return o, errHelp
		}
		return o, usageError{err.Error()}
	}
	if fs.NArg() > 0 {
		return o, usageError{fmt.Sprintf("unexpected argument %q", fs.Arg(0))}
	}
	outputs := 0
	for _, b := range []bool{o.tsv, o.excitons, o.png != ""} {
		if b {
			outputs++
		}
	}
	if outputs > 1 {
		return o, usageError{"-tsv, -excitons and -png do not go together"}
	}
	if ext := strings.ToLower(filepath.Ext(o.png)); o.png != "" && ext != ".png" && ext != ".svg" {
		return o, usageError{fmt.Sprintf("-png %q: the file must end in .png or .svg", o.png)}
	}
	for _, p := range strings.Split(*kv, ",") {
		x, err := strconv.ParseFloat(strings.TrimSpace(p), 64)
		if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
			return o, usageError{fmt.Sprintf("-kv: %q is not a finite number", strings.TrimSpace(p))}
		}
		o.kv = append(o.kv, x)
	}
	if len(o.kv) > maxPoints {
		return o, usageError{fmt.Sprintf("-kv: %d fields, at most %d", len(o.kv), maxPoints)}
	}
	var err error
	if o.transitions, err = parseTransitions(*ts); err != nil {
		return o, err
	}
	if o.points < 2 || o.points > maxPoints {
		return o, usageError{fmt.Sprintf("-points %d: need 2 to %d", o.points, maxPoints)}
	}
	if !(o.loss >= 0) || math.IsInf(o.loss, 0) {
		return o, usageError{fmt.Sprintf("-max-insertion %v: need 0 (no limit) or a positive number of dB", o.loss)}
	}
	// The broadening and the waveguide are checked by the library, with
	// messages naming the value.
	if _, err := tiltwell.Waveguide(o.length*1e-6, o.confinement); err != nil {
		return o, usageError{err.Error()}
	}
	probe := o.absorption
	probe.Index = 0
	l := tiltwell.ExcitonLine{Reduced: 0.05}
	l.Energy, l.E, l.H = 1, 1, 1
	if _, err := probe.Spectrum(nil, tiltwell.Absorber{Width: 1e-8, Lines: []tiltwell.ExcitonLine{l}}, []float64{1}); err != nil {
		return o, usageError{err.Error()}
	}
	return o, nil
}

// parseTransitions parses the -transitions list, such as "e1-hh1,e2-lh1".
func parseTransitions(s string) ([]tiltwell.Transition, error) {
	ts, err := catalog.Transitions(s)
	if err != nil {
		return nil, usageError{"-transitions: " + err.Error()}
	}
	return ts, nil
}

// demo is one invented demo structure with what the material table lacks.
type demo struct {
	name  string // the rows' structure column
	about string
	s     tiltwell.Structure
	index float64 // refractive index near the band edge (see the package doc)
}

var demos = []demo{
	{"demo-GaAs", "invented demo: 10 nm GaAs between Al0.3Ga0.7As barriers on GaAs, 300 K", tiltwell.DemoGaAsWell(), 3.6},
	{"demo-InGaAs", fmt.Sprintf("invented demo: %g nm In0.53Ga0.47As between In0.52Al0.48As barriers on InP, 300 K", tiltwell.DemoInGaAsWidth*1e9), tiltwell.DemoInGaAsWell(), 3.56},
}

// result is one structure's spectra at every field.
type result struct {
	demo
	fields []float64 // kV/cm
	ab     []tiltwell.Absorber
	photon []float64    // eV
	alpha  [][]float64  // per field, cm⁻¹
	swing  []swingPoint // per field after the first
}

// swingPoint is the best operating point of the swing from the first
// field to another.
type swingPoint struct {
	op  tiltwell.Operating
	err error // tiltwell.ErrNoneMeets: no point within the loss limit
}

// compute builds the excitons and spectra of a demo at every field.
func compute(d demo, o options) (result, error) {
	r := result{demo: d, fields: o.kv}
	x, err := tiltwell.NewExcitons(d.s, func(s tiltwell.Stack) tiltwell.WaveSolver { return exact.Solver{Stack: s} }, o.transitions)
	if err != nil {
		return r, fmt.Errorf("%s: %w", d.name, err)
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, kv := range o.kv {
		ab, err := x.At(tiltwell.KVPerCM(kv))
		if err != nil {
			return r, fmt.Errorf("%s: %w", d.name, err)
		}
		r.ab = append(r.ab, ab)
		for _, l := range ab.Lines {
			lo, hi = min(lo, l.Peak), max(hi, l.Energy)
		}
	}
	// From 80 meV below the lowest exciton (the transparent side, where a
	// modulator works) to 40 meV above the highest transition.
	lo, hi = lo-0.08, hi+0.04
	r.photon = make([]float64, o.points)
	for i := range r.photon {
		r.photon[i] = lo + (hi-lo)*float64(i)/float64(o.points-1)
	}
	a := o.absorption
	a.Index = d.index
	for _, ab := range r.ab {
		alpha, err := a.Spectrum(nil, ab, r.photon)
		if err != nil {
			return r, fmt.Errorf("%s at %g kV/cm: %w", d.name, tiltwell.InKVPerCM(ab.Field), err)
		}
		r.alpha = append(r.alpha, alpha)
	}
	wg, err := tiltwell.Waveguide(o.length*1e-6, o.confinement)
	if err != nil {
		return r, err
	}
	for i := 1; i < len(r.alpha); i++ {
		op, err := wg.Best(r.photon, r.alpha[0], r.alpha[i], o.loss)
		if err != nil && !errors.Is(err, tiltwell.ErrNoneMeets) {
			return r, err
		}
		r.swing = append(r.swing, swingPoint{op, err})
	}
	return r, nil
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
	var rs []result
	for _, d := range demos {
		r, err := compute(d, o)
		if err != nil {
			return 2, err
		}
		rs = append(rs, r)
	}
	if o.png != "" {
		if err := render(o.png, rs); err != nil {
			return 1, err
		}
		return 0, nil
	}
	w := bufio.NewWriterSize(out, 64<<10)
	switch {
	case o.tsv:
		writeSpectra(w, rs)
	case o.excitons:
		writeExcitons(w, rs)
	default:
		writeText(w, rs, o)
	}
	if err := w.Flush(); err != nil {
		return 1, err
	}
	return 0, nil
}

func g(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// writeSpectra writes the -tsv rows.
func writeSpectra(w *bufio.Writer, rs []result) {
	w.WriteString("structure\tfield_kV_cm\tphoton_eV\twavelength_nm\talpha_per_cm\n")
	for _, r := range rs {
		for i, alpha := range r.alpha {
			for j, e := range r.photon {
				fmt.Fprintf(w, "%s\t%s\t%s\t%s\t%s\n", r.name, g(r.fields[i]), g(e), g(tiltwell.Wavelength(e)), g(alpha[j]))
			}
		}
	}
}

// writeExcitons writes the -excitons rows.
func writeExcitons(w *bufio.Writer, rs []result) {
	w.WriteString("structure\tfield_kV_cm\ttransition\tenergy_eV\tbinding_meV\toverlap2\n")
	for _, r := range rs {
		for i, ab := range r.ab {
			for _, l := range ab.Lines {
				fmt.Fprintf(w, "%s\t%s\t%v\t%s\t%s\t%s\n", r.name, g(r.fields[i]), l.Transition, g(l.Energy), g(l.Binding), g(l.Overlap2))
			}
		}
	}
}

// writeText writes the human-readable summary.
func writeText(w *bufio.Writer, rs []result, o options) {
	a := o.absorption
	fmt.Fprintf(w, "Absorption of quantum wells under a field: exact finite-barrier levels, variational excitons,\n")
	fmt.Fprintf(w, "broadening %g meV (Gaussian) and %g meV + escape (Lorentzian), well-width spread %g nm, TE light.\n",
		a.Inhomogeneous, a.Homogeneous, a.WidthSpread)
	for _, r := range rs {
		fmt.Fprintf(w, "\n%s: %s\n", r.name, r.about)
		fmt.Fprintf(w, "refractive index %g, Kane energy %.3g eV; photon energies %.4f–%.4f eV\n",
			r.index, r.ab[0].Kane, r.photon[0], r.photon[len(r.photon)-1])
		fmt.Fprintf(w, "  field  transition  energy    exciton   binding  overlap²  escape   ∂E/∂L\n")
		fmt.Fprintf(w, "  kV/cm               eV        eV        meV                meV      meV/nm\n")
		for i, ab := range r.ab {
			for j, l := range ab.Lines {
				field := ""
				if j == 0 {
					field = strconv.FormatFloat(r.fields[i], 'f', -1, 64)
				}
				fmt.Fprintf(w, "  %5s  %-10v  %.4f    %.4f    %5.2f    %.4f    %-7s  %6.2f\n",
					field, l.Transition, l.Energy, l.Peak, l.Binding, l.Overlap2, width(l.Width), l.Slope)
			}
		}
		fmt.Fprintf(w, "  field  strongest peak            α at the e1–hh1 exciton\n")
		for i, alpha := range r.alpha {
			top := 0
			for j, v := range alpha {
				if v > alpha[top] {
					top = j
				}
			}
			hh := alphaAt(r.photon, alpha, r.ab[i].Lines[0].Peak)
			fmt.Fprintf(w, "  %5s  %6.0f cm⁻¹ at %6.1f nm  %6.0f cm⁻¹ (%v at %.1f nm)\n", g(r.fields[i]), alpha[top],
				tiltwell.Wavelength(r.photon[top]), hh, r.ab[i].Lines[0].Transition, tiltwell.Wavelength(r.ab[i].Lines[0].Peak))
		}
		fmt.Fprintf(w, "  waveguide %g µm, confinement %g, switched from %g kV/cm; best point with insertion loss ≤ %g dB:\n",
			o.length, o.confinement, r.fields[0], o.loss)
		for i, s := range r.swing {
			if s.err != nil {
				fmt.Fprintf(w, "  to %5s kV/cm: none within the limit (least loss %.1f dB at %.1f nm)\n", g(r.fields[i+1]), s.op.Insertion, s.op.Wavelength)
				continue
			}
			fmt.Fprintf(w, "  to %5s kV/cm: %6.1f nm, Δα %+6.0f cm⁻¹, extinction %5.1f dB, insertion loss %4.2f dB\n",
				g(r.fields[i+1]), s.op.Wavelength, s.op.Change, s.op.Extinction, s.op.Insertion)
		}
	}
}

// width formats an escape width in meV, "0" for a bound pair.
func width(v float64) string {
	if v == 0 {
		return "0"
	}
	return strconv.FormatFloat(v, 'g', 2, 64)
}

// alphaAt interpolates alpha (on the uniform grid photon) linearly at e.
func alphaAt(photon, alpha []float64, e float64) float64 {
	step := (photon[len(photon)-1] - photon[0]) / float64(len(photon)-1)
	t := (e - photon[0]) / step
	i := min(max(int(t), 0), len(photon)-2)
	f := t - float64(i)
	return alpha[i]*(1-f) + alpha[i+1]*f
}
