package main

import (
	"fmt"
	"image/color"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/examples/internal/figure"
)

// The -modulator picture: for each invented demo structure
// (tiltwell.DemoGaAsWell, tiltwell.DemoInGaAsWell), the transition
// energies, the overlaps² and the escape times against the field in
// kV/cm, from tiltwell.Device with the exact solver.

// line is one transition drawn in the -modulator picture.
type line struct {
	t     tiltwell.Transition
	color color.Color
	dash  bool
}

var modLines = []line{
	{tiltwell.Transition{E: 1, H: 1}, color.RGBA{R: 0x1f, G: 0x77, B: 0xb4, A: 255}, false},
	{tiltwell.Transition{E: 1, H: 1, Hole: tiltwell.LightHole}, color.RGBA{R: 0xff, G: 0x7f, B: 0x0e, A: 255}, false},
	{tiltwell.Transition{E: 1, H: 2}, color.RGBA{R: 0x2c, G: 0xa0, B: 0x2c, A: 255}, true},
}

// Escape times above tauMax (s) are left out of the picture: at weak
// fields they run to 1e100 s and more, which a device never sees.
const (
	tauMin = 1e-14
	tauMax = 1e4
)

// renderModulator draws the two structures' panels, samples fields from 0
// to kvMax kV/cm, and writes them to out in format ext.
func renderModulator(out, ext string, kvMax float64, samples int) error {
	structures := []struct {
		name string
		s    tiltwell.Structure
	}{
		{"GaAs/Al0.3Ga0.7As, 10 nm (invented demo)", tiltwell.DemoGaAsWell()},
		{fmt.Sprintf("InGaAs/InAlAs on InP, %g nm (invented demo)", tiltwell.DemoInGaAsWidth*1e9), tiltwell.DemoInGaAsWell()},
	}
	var rows [][]*plot.Plot
	for _, st := range structures {
		ps, err := modulatorPanels(st.name, st.s, kvMax, samples)
		if err != nil {
			return err
		}
		rows = append(rows, ps)
	}
	return figure.Write(out, ext, 30*vg.Centimeter, 18*vg.Centimeter, rows)
}

// modulatorPanels computes the three panels of one structure.
func modulatorPanels(name string, s tiltwell.Structure, kvMax float64, samples int) ([]*plot.Plot, error) {
	ts := make([]tiltwell.Transition, len(modLines))
	for i, l := range modLines {
		ts[i] = l.t
	}
	d, err := tiltwell.NewDevice(s, func(st tiltwell.Stack) tiltwell.WaveSolver { return exact.Solver{Stack: st} }, ts)
	if err != nil {
		return nil, err
	}
	fields := make([]float64, samples)
	for i := range fields {
		fields[i] = tiltwell.KVPerCM(kvMax * float64(i) / float64(samples-1))
	}
	lines, err := d.Lines(nil, fields)
	if err != nil {
		return nil, err
	}
	newPlot := func(title, ylabel string) *plot.Plot {
		p := plot.New()
		p.Title.Text = title
		p.X.Label.Text = "field F (kV/cm)"
		p.Y.Label.Text = ylabel
		p.Add(plotter.NewGrid())
		return p
	}
	energy := newPlot(name, "transition energy (eV)")
	energy.Y.Tick.Marker = labelled{format: "%.3f"}
	energy.Legend.Top = false
	energy.Legend.Left = true
	energy.Legend.XOffs, energy.Legend.YOffs = vg.Millimeter, vg.Millimeter
	overlap := newPlot("electron–hole overlap²", "overlap²")
	overlap.Legend.Top = true
	overlap.Legend.XOffs, overlap.Legend.YOffs = -vg.Millimeter, -vg.Millimeter
	escape := newPlot("escape time (tunnelling out of the level)", "τ (s)")
	escape.Y.Scale = plot.LogScale{}
	escape.Y.Tick.Marker = decades{every: 3}
	escape.Y.Min, escape.Y.Max = tauMin, tauMax
	escape.Legend.Top = false
	escape.Legend.Left = true
	escape.Legend.XOffs, escape.Legend.YOffs = vg.Millimeter, vg.Millimeter

	nt := len(ts)
	add := figure.Line
	for j, ml := range modLines {
		var e, o plotter.XYs
		for i := j; i < len(lines); i += nt {
			l := lines[i]
			kv := tiltwell.InKVPerCM(l.Field)
			e = append(e, plotter.XY{X: kv, Y: l.Energy})
			o = append(o, plotter.XY{X: kv, Y: l.Overlap2})
		}
		if err := add(energy, e, ml.color, ml.dash, ml.t.String()); err != nil {
			return nil, err
		}
		if err := add(overlap, o, ml.color, ml.dash, ml.t.String()); err != nil {
			return nil, err
		}
	}
	// Escape times: the electron's level 1 (from any line) and each hole
	// level's.
	tau := func(pick func(tiltwell.DeviceLine) float64, j int) plotter.XYs {
		var pts plotter.XYs
		for i := j; i < len(lines); i += nt {
			if v := pick(lines[i]); v <= tauMax && v >= tauMin {
				pts = append(pts, plotter.XY{X: tiltwell.InKVPerCM(lines[i].Field), Y: v})
			}
		}
		return pts
	}
	if err := add(escape, tau(func(l tiltwell.DeviceLine) float64 { return l.ElectronEscape }, 0), color.Black, false, "electron e1"); err != nil {
		return nil, err
	}
	for j, ml := range modLines {
		label := ml.t.Hole.String() + fmt.Sprint(ml.t.H)
		if err := add(escape, tau(func(l tiltwell.DeviceLine) float64 { return l.HoleEscape }, j), ml.color, ml.dash, label); err != nil {
			return nil, err
		}
	}
	for _, p := range []*plot.Plot{energy, overlap, escape} {
		p.X.Min, p.X.Max = 0, kvMax
	}
	overlap.Y.Min, overlap.Y.Max = 0, 1
	return []*plot.Plot{energy, overlap, escape}, nil
}

// labelled is the default tick marker with its labels printed in format.
type labelled struct{ format string }

// Ticks returns the default ticks for [min, max], relabelled.
func (l labelled) Ticks(min, max float64) []plot.Tick {
	ts := plot.DefaultTicks{}.Ticks(min, max)
	for i := range ts {
		if ts[i].Label != "" {
			ts[i].Label = fmt.Sprintf(l.format, ts[i].Value)
		}
	}
	return ts
}
