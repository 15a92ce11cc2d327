package main

import (
	"fmt"
	"io"
	"strconv"
	"strings"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
)

// benchFields returns n reduced fields spread over [0, 100] as the -f
// list of the command.
func benchFields(n int) ([]float64, string) {
	fields := make([]float64, n)
	parts := make([]string, n)
	for i := range fields {
		fields[i] = 100 * float64(i) / float64(n)
		parts[i] = strconv.FormatFloat(fields[i], 'g', -1, 64)
	}
	return fields, strings.Join(parts, ",")
}

// BenchmarkRun times the command for the lowest 10 exact levels at 1000
// fields (part=command, output to io.Discard) against the library's
// Levels calls alone for the same fields (part=library). Both report
// ns/field; their ratio is the command's overhead.
func BenchmarkRun(b *testing.B) {
	const n, k = 1000, 10
	fields, list := benchFields(n)
	b.Run(fmt.Sprintf("part=library/method=exact/k=%d/fields=%d", k, n), func(b *testing.B) {
		dst := make([]tiltwell.Level, 0, k)
		b.ReportAllocs()
		runs := 0
		for b.Loop() {
			for _, f := range fields {
				var err error
				if dst, err = (exact.Solver{}).Levels(dst, f, k); err != nil {
					b.Fatal(err)
				}
			}
			runs++
		}
		b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(runs*n), "ns/field")
	})
	b.Run(fmt.Sprintf("part=command/method=exact/k=%d/fields=%d", k, n), func(b *testing.B) {
		args := []string{"-method", "exact", "-n", strconv.Itoa(k), "-f", list}
		b.ReportAllocs()
		runs := 0
		for b.Loop() {
			if code, err := run(args, io.Discard); code != 0 || err != nil {
				b.Fatal(code, err)
			}
			runs++
		}
		b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(runs*n), "ns/field")
	})
}
