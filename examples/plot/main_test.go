package main

import (
	"image/png"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestRender writes both formats and reads the PNG back.
func TestRender(t *testing.T) {
	dir := t.TempDir()
	pngPath := filepath.Join(dir, "l.png")
	if err := render(pngPath, "png", 5, 2); err != nil {
		t.Fatal(err)
	}
	f, err := os.Open(pngPath)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		t.Fatal(err)
	}
	if b := img.Bounds(); b.Dx() < 500 || b.Dy() < 200 {
		t.Errorf("picture is %v, want a wide two-panel image", b)
	}
	svgPath := filepath.Join(dir, "l.svg")
	if err := render(svgPath, "svg", 5, 2); err != nil {
		t.Fatal(err)
	}
	b, err := os.ReadFile(svgPath)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(b), "<svg") {
		t.Errorf("%s is not SVG", svgPath)
	}
}

// TestRenderModulator draws the -modulator picture (few fields, for speed)
// and reads the PNG back.
func TestRenderModulator(t *testing.T) {
	path := filepath.Join(t.TempDir(), "m.png")
	if err := renderModulator(path, "png", 150, 16); err != nil {
		t.Fatal(err)
	}
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		t.Fatal(err)
	}
	if b := img.Bounds(); b.Dx() < 800 || b.Dy() < 400 {
		t.Errorf("picture is %v, want six panels", b)
	}
}

// TestRenderFinite draws the -finite picture (few fields, for speed) and
// reads the PNG back.
func TestRenderFinite(t *testing.T) {
	path := filepath.Join(t.TempDir(), "f.png")
	if err := renderFinite(path, "png", 150, 16); err != nil {
		t.Fatal(err)
	}
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		t.Fatal(err)
	}
	if b := img.Bounds(); b.Dx() < 600 || b.Dy() < 250 {
		t.Errorf("picture is %v, want two panels", b)
	}
}
