// Command levelref writes exact/testdata/levels256.txt: reference levels of
// the tilted infinite well computed by the independent 256-bit solver in
// internal/bigairy (Airy determinant or high-precision shooting, not the
// phase formulation of package exact), on a grid of reduced fields and
// levels n = 1..50. The exact package's tests hold its float64 results and
// error estimates against this file, and re-derive a sample of its rows.
//
// Usage, from the exact directory:
//
//	go run ./internal/cmd/levelref > testdata/levels256.txt
package main

import (
	"fmt"
	"log"
	"os"
	"runtime"
	"sync"

	"github.com/tiltwell/tiltwell/exact/internal/bigairy"
)

// Fields is the reference grid; it spans weak field (perturbative),
// the crossover near η ≈ f/2 and strong field (triangular).
var fields = []float64{1e-8, 1e-6, 1e-4, 1e-3, 0.01, 0.03, 0.1, 0.3, 0.5, 1, 2, 3, 5, 7, 10, 15, 20, 30, 50, 70, 100, 150, 200, 300, 500, 700, 1000, 2000, 3000, 5000, 7000, 1e4}

const maxN = 50

func main() {
	type row struct {
		f   float64
		n   int
		val string
	}
	rows := make([]row, 0, len(fields)*maxN)
	for _, f := range fields {
		for n := 1; n <= maxN; n++ {
			rows = append(rows, row{f: f, n: n})
		}
	}
	var wg sync.WaitGroup
	sem := make(chan struct{}, runtime.NumCPU())
	for i := range rows {
		wg.Add(1)
		sem <- struct{}{}
		go func() {
			defer wg.Done()
			defer func() { <-sem }()
			v, err := bigairy.Level(rows[i].f, rows[i].n, 256)
			if err != nil {
				log.Fatalf("f=%g n=%d: %v", rows[i].f, rows[i].n, err)
			}
			rows[i].val = v.Text('e', 30)
		}()
	}
	wg.Wait()
	fmt.Println("# Reference levels η_n(f) of H = −(1/π²)d²/dξ² + f(ξ − ½) on [0, 1], Dirichlet walls.")
	fmt.Println("# Computed at 256 bits by internal/bigairy (independent of the float64 phase solver);")
	fmt.Println("# regenerate with: go run ./internal/cmd/levelref > testdata/levels256.txt")
	fmt.Println("# columns: f n eta (31 significant digits)")
	for _, r := range rows {
		fmt.Printf("%g %d %s\n", r.f, r.n, r.val)
	}
	os.Stdout.Sync()
}
