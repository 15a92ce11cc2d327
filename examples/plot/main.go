// Plot draws the levels of the tilted infinite well against the reduced
// field for each method, and each method's error against the field on a
// log scale: its true error against the exact reference (solid) and its
// own estimate (dashed). The picture is written as PNG or SVG, chosen by
// the file extension, to the path given by -o.
//
// The fields are reduced (f in F₀, energies η in E₁), so the picture holds
// for any width and mass; no physical data is involved.
//
// With -modulator it draws instead, in physical units, the two invented
// demo structures of the tiltwell package (a 10 nm GaAs/Al0.3Ga0.7As well
// and a 1.55 µm-band In0.53Ga0.47As/In0.52Al0.48As well on InP): the
// e1–hh1, e1–lh1 and e1–hh2 transition energies, their overlaps² and the
// carriers' escape times (log scale) against the field from 0 to -kvmax
// kV/cm, from tiltwell.Device with the exact finite-barrier solver.
//
// With -finite it draws the electron of the 10 nm GaAs demo well with
// finite barriers beside the same well with infinite walls: the Stark
// shifts of the two lowest levels and the escape time of each level
// against the field in kV/cm.
//
// Usage:
//
//	go run ./examples/plot -o docs/levels.png [-fmax 30] [-n 3]
//	go run ./examples/plot -modulator -o docs/modulator.png [-kvmax 200]
//	go run ./examples/plot -finite -o docs/finite.png [-kvmax 200]
package main

import (
	"flag"
	"fmt"
	"image/color"
	"math"
	"os"
	"path/filepath"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/examples/internal/catalog"
	"github.com/tiltwell/tiltwell/examples/internal/figure"
)

// method is one curve family of the picture.
type method struct {
	name  string
	s     tiltwell.Solver
	color color.Color
}

// colors picks the methods drawn (the plain WKB rule is left out: its
// jump would swamp the picture) and their colours.
var colors = map[string]color.Color{
	"exact":       color.RGBA{A: 255},
	"perturb1":    color.RGBA{R: 0xd6, G: 0x27, B: 0x28, A: 255},
	"perturb2":    color.RGBA{R: 0xff, G: 0x7f, B: 0x0e, A: 255},
	"wkb":         color.RGBA{R: 0x2c, G: 0xa0, B: 0x2c, A: 255},
	"variational": color.RGBA{R: 0x94, G: 0x67, B: 0xbd, A: 255},
	"basis":       color.RGBA{R: 0x1f, G: 0x77, B: 0xb4, A: 255},
}

// methods returns the methods drawn, the exact reference first.
func methods() []method {
	ex, _ := catalog.Lookup("exact")
	ms := []method{{ex.Name, ex.Solver, colors[ex.Name]}}
	for _, m := range catalog.All() {
		if c, ok := colors[m.Name]; ok && m.Name != "exact" {
			ms = append(ms, method{m.Name, m.Solver, c})
		}
	}
	return ms
}

// errFloor is where zero errors are drawn on the log axis: below float64
// resolution of the energies plotted.
const errFloor = 1e-17

func main() {
	out := flag.String("o", "levels.png", "output file, .png or .svg")
	fmax := flag.Float64("fmax", 30, "largest reduced field")
	k := flag.Int("n", 3, "number of levels")
	mod := flag.Bool("modulator", false, "draw the demo structures' transitions in physical units instead")
	fin := flag.Bool("finite", false, "draw a finite well's levels and escape times beside the infinite well's instead")
	kvMax := flag.Float64("kvmax", 200, "largest field in kV/cm, with -modulator or -finite")
	flag.Parse()
	ext := strings.TrimPrefix(strings.ToLower(filepath.Ext(*out)), ".")
	if ext != "png" && ext != "svg" {
		fail(fmt.Errorf("-o %q: want a .png or .svg file", *out))
	}
	if *mod || *fin {
		if !(*kvMax > 0 && *kvMax <= 400) {
			fail(fmt.Errorf("-kvmax %v: want 0 < kvmax ≤ 400 kV/cm", *kvMax))
		}
		render := renderModulator
		if *fin {
			render = renderFinite
		}
		if err := render(*out, ext, *kvMax, 201); err != nil {
			fail(err)
		}
		return
	}
	switch {
	case !(*fmax > 0) || math.IsInf(*fmax, 0) || *fmax > exact.MaxField:
		fail(fmt.Errorf("-fmax %v: want 0 < fmax ≤ %g", *fmax, float64(exact.MaxField)))
	case *k < 1 || *k > 10:
		fail(fmt.Errorf("-n %d: want 1 to 10 levels", *k))
	}
	if err := render(*out, ext, *fmax, *k); err != nil {
		fail(err)
	}
}

// render draws both panels and writes them to the file out in format ext
// ("png" or "svg").
func render(out, ext string, fmax float64, k int) error {
	levels, errs, err := curves(fmax, k)
	if err != nil {
		return err
	}
	return figure.Write(out, ext, 24*vg.Centimeter, 10*vg.Centimeter, [][]*plot.Plot{{levels, errs}})
}

func fail(err error) {
	fmt.Fprintln(os.Stderr, "plot:", err)
	os.Exit(2)
}

// curves computes both panels over 0 ≤ f ≤ fmax.
func curves(fmax float64, k int) (levels, errs *plot.Plot, err error) {
	const samples = 121
	levels = plot.New()
	levels.Title.Text = fmt.Sprintf("lowest %d levels", k)
	levels.X.Label.Text = "reduced field f = F/F₀"
	levels.Y.Label.Text = "energy η = E/E₁"
	levels.Legend.Top = false
	levels.Legend.Left = true
	levels.Legend.XOffs = vg.Millimeter
	levels.Legend.YOffs = vg.Millimeter
	levels.Add(plotter.NewGrid())

	errs = plot.New()
	errs.Title.Text = "worst error: true (solid), own estimate (dashed)"
	errs.X.Label.Text = "reduced field f = F/F₀"
	errs.Y.Label.Text = "|error| in E₁"
	errs.Y.Scale = plot.LogScale{}
	errs.Y.Tick.Marker = decades{every: 2}
	errs.Legend.Top = true
	errs.Legend.Left = false
	errs.Legend.XOffs = -vg.Millimeter
	errs.Legend.YOffs = -22 * vg.Millimeter // below the cheap methods' curves, above basis
	errs.Add(plotter.NewGrid())

	fields := make([]float64, samples)
	for i := range fields {
		fields[i] = fmax * float64(i) / (samples - 1)
	}
	ref := make([][]tiltwell.Level, samples)
	for i, f := range fields {
		if ref[i], err = (exact.Solver{}).Levels(nil, f, k); err != nil {
			return nil, nil, err
		}
	}
	for mi, m := range methods() {
		// Each level is a run of points where the method answers within
		// its range; a method that stops is drawn up to where it stops.
		lv := make([]plotter.XYs, k)
		var trueErr, estErr plotter.XYs
		dst := make([]tiltwell.Level, 0, k)
		for i, f := range fields {
			dst, err = m.s.Levels(dst, f, k)
			if err != nil {
				continue
			}
			worstTrue, worstEst := 0.0, 0.0
			for n, l := range dst {
				lv[n] = append(lv[n], plotter.XY{X: f, Y: l.Energy})
				worstTrue = math.Max(worstTrue, math.Abs(l.Energy-ref[i][n].Energy))
				worstEst = math.Max(worstEst, l.Err)
			}
			trueErr = append(trueErr, plotter.XY{X: f, Y: math.Max(worstTrue, errFloor)})
			estErr = append(estErr, plotter.XY{X: f, Y: math.Max(worstEst, errFloor)})
		}
		for n, pts := range lv {
			if len(pts) == 0 {
				continue
			}
			l, err := plotter.NewLine(pts)
			if err != nil {
				return nil, nil, err
			}
			l.Color = m.color
			l.Width = vg.Points(1.2)
			if mi > 0 {
				l.Dashes = []vg.Length{vg.Points(4), vg.Points(2)}
			}
			levels.Add(l)
			if n == 0 {
				levels.Legend.Add(m.name, l)
			}
		}
		if m.name == "exact" {
			// Its true error is zero by definition; draw its estimate.
			trueErr = nil
		}
		if len(trueErr) > 0 {
			l, err := plotter.NewLine(trueErr)
			if err != nil {
				return nil, nil, err
			}
			l.Color = m.color
			l.Width = vg.Points(1.2)
			errs.Add(l)
			errs.Legend.Add(m.name, l)
		}
		if len(estErr) > 0 {
			l, err := plotter.NewLine(estErr)
			if err != nil {
				return nil, nil, err
			}
			l.Color = m.color
			l.Width = vg.Points(1)
			l.Dashes = []vg.Length{vg.Points(3), vg.Points(2)}
			errs.Add(l)
			if m.name == "exact" {
				errs.Legend.Add("exact (estimate)", l)
			}
		}
	}
	errs.Y.Min = errFloor
	return levels, errs, nil
}

// decades marks every power of ten on a log axis and labels every few.
type decades struct{ every int }

// Ticks returns the ticks for the range [min, max].
func (d decades) Ticks(min, max float64) []plot.Tick {
	lo, hi := int(math.Floor(math.Log10(min))), int(math.Ceil(math.Log10(max)))
	var ts []plot.Tick
	for e := lo; e <= hi; e++ {
		t := plot.Tick{Value: math.Pow(10, float64(e))}
		if e%d.every == 0 {
			t.Label = fmt.Sprintf("1e%d", e)
		}
		ts = append(ts, t)
	}
	return ts
}
