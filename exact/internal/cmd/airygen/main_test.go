package main

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"

	"github.com/tiltwell/tiltwell/exact/internal/bigairy"
)

// TestTableUpToDate regenerates airytable.go in process and requires the
// committed file to be byte-identical, so every float64 in the table is the
// one the 256-bit computation gives. Run `go generate ./exact` after changing
// package bigairy or this program.
func TestTableUpToDate(t *testing.T) {
	t.Parallel()
	path := filepath.Join("..", "..", "..", "airytable.go")
	have, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	want, err := render(bigairy.Nodes(zMin, step, count))
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(have, want) {
		hl := bytes.Split(have, []byte("\n"))
		wl := bytes.Split(want, []byte("\n"))
		for i := 0; i < len(hl) || i < len(wl); i++ {
			var h, w []byte
			if i < len(hl) {
				h = hl[i]
			}
			if i < len(wl) {
				w = wl[i]
			}
			if !bytes.Equal(h, w) {
				t.Fatalf("%s is stale at line %d (run go generate ./exact):\nhave %s\nwant %s", path, i+1, h, w)
			}
		}
	}
}

// TestTableShape checks the layout constants the exact package relies on:
// 133 nodes from −13 to +20 in steps of 1/4.
func TestTableShape(t *testing.T) {
	t.Parallel()
	if last := zMin + float64(count-1)*step; last != 20 {
		t.Errorf("last node %v, want 20", last)
	}
}
