package catalog

import (
	"strings"

	"github.com/tiltwell/tiltwell"
)

// Transitions parses a comma-separated list of transitions in the trade's
// notation, such as "e1-hh1,e2-lh1" (see [tiltwell.ParseTransition]). The
// error wraps tiltwell.ErrLevel and names the entry it could not read.
func Transitions(list string) ([]tiltwell.Transition, error) {
	var ts []tiltwell.Transition
	for _, p := range strings.Split(list, ",") {
		t, err := tiltwell.ParseTransition(p)
		if err != nil {
			return nil, err
		}
		ts = append(ts, t)
	}
	return ts, nil
}
