package main

import (
	"fmt"
	"image/color"
	"path/filepath"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/examples/internal/figure"
)

// fieldColors colour the fields in order.
var fieldColors = []color.Color{
	color.RGBA{R: 0x1f, G: 0x77, B: 0xb4, A: 255},
	color.RGBA{R: 0x2c, G: 0xa0, B: 0x2c, A: 255},
	color.RGBA{R: 0xff, G: 0x7f, B: 0x0e, A: 255},
	color.RGBA{R: 0xd6, G: 0x27, B: 0x28, A: 255},
	color.RGBA{R: 0x94, G: 0x67, B: 0xbd, A: 255},
	color.RGBA{R: 0x8c, G: 0x56, B: 0x4b, A: 255},
}

// render draws, for each structure, its spectra at every field (top) and
// Δα = α(F) − α(F₀) against the wavelength (bottom), into out (.png or
// .svg).
func render(out string, rs []result) error {
	ext := strings.TrimPrefix(strings.ToLower(filepath.Ext(out)), ".")
	if ext != "png" && ext != "svg" {
		return usageError{fmt.Sprintf("-png %q: the file must end in .png or .svg", out)}
	}
	top := make([]*plot.Plot, len(rs))
	bottom := make([]*plot.Plot, len(rs))
	for i, r := range rs {
		var err error
		if top[i], bottom[i], err = panels(r); err != nil {
			return err
		}
	}
	return figure.Write(out, ext, 24*vg.Centimeter, 16*vg.Centimeter, [][]*plot.Plot{top, bottom})
}

// panels draws one structure's spectra and changes of absorption.
func panels(r result) (spectra, change *plot.Plot, err error) {
	newPlot := func(title, ylabel string) *plot.Plot {
		p := plot.New()
		p.Title.Text = title
		p.X.Label.Text = "wavelength (nm)"
		p.X.Tick.Marker = wholeTicks{}
		p.Y.Label.Text = ylabel
		p.Add(plotter.NewGrid())
		// Top right: long wavelengths, below the edge.
		p.Legend.Top = true
		p.Legend.XOffs, p.Legend.YOffs = -vg.Millimeter, -vg.Millimeter
		return p
	}
	name := strings.TrimPrefix(r.name, "demo-")
	spectra = newPlot(fmt.Sprintf("%s well (invented demo): absorption", name), "α (1/cm)")
	change = newPlot(fmt.Sprintf("%s: change from %g kV/cm", name, r.fields[0]), "Δα (1/cm)")
	add := func(p *plot.Plot, y []float64, i int, label string) error {
		pts := make(plotter.XYs, len(r.photon))
		for j, e := range r.photon {
			pts[j] = plotter.XY{X: tiltwell.Wavelength(e), Y: y[j]}
		}
		return figure.Line(p, pts, fieldColors[i%len(fieldColors)], false, label)
	}
	for i, alpha := range r.alpha {
		if err := add(spectra, alpha, i, fmt.Sprintf("%g kV/cm", r.fields[i])); err != nil {
			return nil, nil, err
		}
		if i == 0 {
			continue
		}
		d := make([]float64, len(alpha))
		for j := range d {
			d[j] = alpha[j] - r.alpha[0][j]
		}
		if err := add(change, d, i, fmt.Sprintf("%g kV/cm", r.fields[i])); err != nil {
			return nil, nil, err
		}
	}
	zero, err := plotter.NewLine(plotter.XYs{{X: tiltwell.Wavelength(r.photon[0]), Y: 0}, {X: tiltwell.Wavelength(r.photon[len(r.photon)-1]), Y: 0}})
	if err != nil {
		return nil, nil, err
	}
	zero.Color = color.Gray{Y: 0x80}
	change.Add(zero)
	// Δα: the legend below the axis, where the long-wavelength side
	// holds no data.
	change.Legend.Top = false
	change.Legend.YOffs = vg.Millimeter
	spectra.Y.Min = 0
	return spectra, change, nil
}

// wholeTicks is the default tick marker with whole-number labels.
type wholeTicks struct{}

// Ticks returns the default ticks for [min, max], labelled without
// decimals.
func (wholeTicks) Ticks(min, max float64) []plot.Tick {
	ts := plot.DefaultTicks{}.Ticks(min, max)
	for i := range ts {
		if ts[i].Label != "" {
			ts[i].Label = fmt.Sprintf("%.0f", ts[i].Value)
		}
	}
	return ts
}
