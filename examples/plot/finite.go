package main

import (
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/examples/internal/figure"
)

// The -finite picture: the electron of the invented 10 nm
// GaAs/Al0.3Ga0.7As demo well (barrier 4.62 E₁, mass ratio 1.372, as
// tiltwell.DemoGaAsWell gives them; m* = 0.067 m₀) with finite barriers
// beside the same well with infinitely high walls: the Stark shift of its
// two lowest levels against the field in physical units (the finite
// well's is several times larger), and the escape time of each level.

var finiteColors = figure.Palette

// renderFinite samples fields from 0 to kvMax kV/cm and writes the two
// panels to out in format ext.
func renderFinite(out, ext string, kvMax float64, samples int) error {
	st, err := tiltwell.FiniteWell(4.62, 1.372)
	if err != nil {
		return err
	}
	w, err := tiltwell.NewWell(10e-9, 0.067)
	if err != nil {
		return err
	}
	const k = 3
	finite, infinite := exact.Solver{Stack: st}, exact.Solver{}
	energy := plot.New()
	energy.Title.Text = "10 nm GaAs-like electron well (invented demo)"
	energy.X.Label.Text = "field F (kV/cm)"
	energy.Y.Label.Text = "Stark shift E_n(F) − E_n(0) (meV)"
	energy.Add(plotter.NewGrid())
	energy.Legend.Top = false
	energy.Legend.Left = true
	energy.Legend.XOffs, energy.Legend.YOffs = vg.Millimeter, vg.Millimeter
	escape := plot.New()
	escape.Title.Text = "escape time of each level (finite barriers)"
	escape.X.Label.Text = "field F (kV/cm)"
	escape.Y.Label.Text = "τ (s)"
	escape.Add(plotter.NewGrid())
	escape.Y.Scale = plot.LogScale{}
	escape.Y.Tick.Marker = decades{every: 3}
	escape.Y.Min, escape.Y.Max = tauMin, tauMax
	escape.Legend.Top = true

	fin := make([]plotter.XYs, k)
	inf := make([]plotter.XYs, k)
	tau := make([]plotter.XYs, k)
	var dst []tiltwell.Level
	// The zero-field levels the shifts are measured from.
	fin0, err := finite.Levels(nil, 0, k)
	if err != nil {
		return err
	}
	inf0, err := infinite.Levels(nil, 0, k)
	if err != nil {
		return err
	}
	for i := range samples {
		kv := kvMax * float64(i) / float64(samples-1)
		f := w.Reduced(tiltwell.KVPerCM(kv))
		// A finite well confines fewer levels as the field grows: the
		// confined ones come back with a ConfinedError.
		dst, err = finite.Levels(dst, f, k)
		if _, ok := tiltwell.Confined(err); err != nil && !ok {
			return err
		}
		for _, l := range dst {
			fin[l.N-1] = append(fin[l.N-1], plotter.XY{X: kv, Y: w.MilliEV(l.Energy - fin0[l.N-1].Energy)})
			if t := w.EscapeTime(l.Gamma); t >= tauMin && t <= tauMax {
				tau[l.N-1] = append(tau[l.N-1], plotter.XY{X: kv, Y: t})
			}
		}
		if dst, err = infinite.Levels(dst, f, k); err != nil {
			return err
		}
		for _, l := range dst {
			inf[l.N-1] = append(inf[l.N-1], plotter.XY{X: kv, Y: w.MilliEV(l.Energy - inf0[l.N-1].Energy)})
		}
	}
	add := figure.Line
	names := []string{"e1", "e2", "e3"}
	for n := range k {
		if n == 2 {
			// e3 of the finite well leaves it below 20 kV/cm; its
			// shift would only crowd the panel.
			if err := add(escape, tau[n], finiteColors[n], false, names[n]); err != nil {
				return err
			}
			continue
		}
		if err := add(energy, fin[n], finiteColors[n], false, names[n]+" finite barriers"); err != nil {
			return err
		}
		if err := add(energy, inf[n], finiteColors[n], true, names[n]+" infinite walls"); err != nil {
			return err
		}
		if err := add(escape, tau[n], finiteColors[n], false, names[n]); err != nil {
			return err
		}
	}
	energy.X.Min, energy.X.Max = 0, kvMax
	escape.X.Min, escape.X.Max = 0, kvMax

	return figure.Write(out, ext, 26*vg.Centimeter, 11*vg.Centimeter, [][]*plot.Plot{{energy, escape}})
}
