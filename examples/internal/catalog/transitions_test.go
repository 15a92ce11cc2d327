package catalog

import (
	"errors"
	"testing"

	"github.com/tiltwell/tiltwell"
)

// TestTransitions: a list in the trade's notation (common practice, no
// source) reads back in order; any bad entry is an error wrapping ErrLevel.
func TestTransitions(t *testing.T) {
	got, err := Transitions("e1-hh1, e2-lh1,e1-hh2")
	want := []tiltwell.Transition{{E: 1, H: 1}, {E: 2, H: 1, Hole: tiltwell.LightHole}, {E: 1, H: 2}}
	if err != nil || len(got) != len(want) {
		t.Fatalf("Transitions = %v, %v; want %v", got, err, want)
	}
	for i := range want {
		if got[i] != want[i] {
			t.Errorf("entry %d: %v, want %v", i, got[i], want[i])
		}
	}
	for _, s := range []string{"", "e1-hh1,", "e1-hh1,x", "e1-h1"} {
		if ts, err := Transitions(s); !errors.Is(err, tiltwell.ErrLevel) || ts != nil {
			t.Errorf("Transitions(%q) = %v, %v; want nil and ErrLevel", s, ts, err)
		}
	}
}
