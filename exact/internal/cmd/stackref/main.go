// Command stackref writes exact/testdata/stack256.txt: reference
// quasi-bound levels η_r and escape widths Γ of finite-barrier and layered
// wells under a field, computed at 256 bits by the independent math/big
// solver in internal/bigstack (Taylor shooting in ξ with Airy boundary
// conditions and complex Newton; not the float64 transfer-matrix solver of
// package exact). The structures and fields are bigstack.Structures; the
// file format is documented in internal/bigstack/table.go and read by
// bigstack.ReadTable. The exact package's tests hold its results and error
// estimates against this file, and bigstack's tests re-derive a sample of
// its rows.
//
// Usage, from the exact directory:
//
//	go run ./internal/cmd/stackref > testdata/stack256.txt
//
// It prints its running time on stderr (a few minutes on two cores).
package main

import (
	"log"
	"os"
	"runtime"
	"time"

	"github.com/tiltwell/tiltwell/exact/internal/bigstack"
)

func main() {
	start := time.Now()
	if err := bigstack.WriteTable(os.Stdout, runtime.NumCPU()); err != nil {
		log.Fatal(err)
	}
	log.Printf("stackref: done in %v", time.Since(start).Round(time.Second))
}
