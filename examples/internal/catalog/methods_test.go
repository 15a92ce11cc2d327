package catalog

import (
	"testing"

	"github.com/tiltwell/tiltwell/exact"
)

// TestAll checks that every method answers at a weak field with an
// estimate covering its true error against the exact reference (a
// cross-check inside the project, no published source).
func TestAll(t *testing.T) {
	seen := map[string]bool{}
	for _, m := range All() {
		if seen[m.Name] {
			t.Errorf("duplicate name %q", m.Name)
		}
		seen[m.Name] = true
		got, ok := Lookup(m.Name)
		if !ok || got.Name != m.Name {
			t.Errorf("Lookup(%q) = %v, %v", m.Name, got, ok)
		}
		lv, err := m.Solver.Levels(nil, 0.5, 2)
		if err != nil {
			t.Fatalf("%s: %v", m.Name, err)
		}
		ex, _ := exact.Solver{}.Levels(nil, 0.5, 2)
		for i := range lv {
			if d := lv[i].Energy - ex[i].Energy; d > lv[i].Err+1e-15 || -d > lv[i].Err+1e-15 {
				t.Errorf("%s n=%d: error %.3g beyond its estimate %.3g", m.Name, i+1, d, lv[i].Err)
			}
		}
	}
	if _, ok := Lookup("nosuch"); ok {
		t.Error("Lookup found a method that does not exist")
	}
}
