package perturb

import (
	"testing"

	"github.com/tiltwell/tiltwell/internal/squarewell"
)

var wellLevelSink *wellLevel

// BenchmarkColdLevel times the first use of a finite-well level by a
// second-order Levels: the zero-field root, the series to order J, and the
// second-order validity limit (what a stack not yet in the cache costs per
// level).
func BenchmarkColdLevel(b *testing.B) {
	w := squarewell.Well{VL: 4.3, ML: 1.37, VR: 4.3, MR: 1.37}
	side := &wellSide{well: w, sym: true, count: w.Count()}
	b.ReportAllocs()
	for b.Loop() {
		wellLevelSink = buildWellLevel(side, 1)
		wellLevelSink.lim(1)
	}
}
