// Package figure holds the plotting steps the example programs share: a
// grid of gonum plots written to a PNG or SVG file, and a coloured,
// optionally dashed, labelled line.
package figure

import (
	"image/color"
	"os"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Palette is the colour sequence of the pictures.
var Palette = []color.Color{
	color.RGBA{R: 0x1f, G: 0x77, B: 0xb4, A: 255},
	color.RGBA{R: 0xff, G: 0x7f, B: 0x0e, A: 255},
	color.RGBA{R: 0x2c, G: 0xa0, B: 0x2c, A: 255},
	color.RGBA{R: 0xd6, G: 0x27, B: 0x28, A: 255},
	color.RGBA{R: 0x94, G: 0x67, B: 0xbd, A: 255},
	color.RGBA{R: 0x8c, G: 0x56, B: 0x4b, A: 255},
}

// Write lays the plots out as rows of panels, aligned, on a canvas of
// the given size and writes it to the file out in format ext ("png" or
// "svg").
func Write(out, ext string, width, height vg.Length, rows [][]*plot.Plot) error {
	c, err := draw.NewFormattedCanvas(width, height, ext)
	if err != nil {
		return err
	}
	tiles := draw.Tiles{Rows: len(rows), Cols: len(rows[0]), PadX: vg.Centimeter, PadY: 5 * vg.Millimeter,
		PadTop: 2 * vg.Millimeter, PadBottom: 2 * vg.Millimeter, PadLeft: 2 * vg.Millimeter, PadRight: 2 * vg.Millimeter}
	cs := plot.Align(rows, tiles, draw.New(c))
	for i, r := range rows {
		for j, p := range r {
			p.Draw(cs[i][j])
		}
	}
	f, err := os.Create(out)
	if err != nil {
		return err
	}
	if _, err := c.WriteTo(f); err != nil {
		f.Close()
		return err
	}
	return f.Close()
}

// Line adds the points to p as a line of colour col, dashed if dash, with
// a legend entry unless label is empty. Fewer than two points add
// nothing.
func Line(p *plot.Plot, pts plotter.XYs, col color.Color, dash bool, label string) error {
	if len(pts) < 2 {
		return nil
	}
	l, err := plotter.NewLine(pts)
	if err != nil {
		return err
	}
	l.Color = col
	l.Width = vg.Points(1.4)
	if dash {
		l.Dashes = []vg.Length{vg.Points(4), vg.Points(2)}
	}
	p.Add(l)
	if label != "" {
		p.Legend.Add(label, l)
	}
	return nil
}
