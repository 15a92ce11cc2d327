// Package catalog is the one list of tiltwell's methods that the example
// programs share, under the names examples/levels documents: adding a
// method to the library means adding it here once.
package catalog

import (
	"errors"
	"fmt"
	"strings"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/basis"
	"github.com/tiltwell/tiltwell/exact"
	"github.com/tiltwell/tiltwell/perturb"
	"github.com/tiltwell/tiltwell/variational"
	"github.com/tiltwell/tiltwell/wkb"
)

// Method is one method of the library with its default settings.
type Method struct {
	// Name is the method's name in the examples' flags and tables.
	Name string
	// Solver computes the levels.
	Solver tiltwell.WaveSolver
}

// All returns every method with its default settings, roughly cheapest
// first, the exact reference last.
func All() []Method {
	return []Method{
		{"perturb1", perturb.Solver{Order: 1}},
		{"perturb2", perturb.Solver{Order: 2}},
		{"wkb-plain", wkb.Solver{Plain: true}},
		{"wkb", wkb.Solver{}},
		{"variational", variational.Solver{}},
		{"basis", basis.Solver{}},
		{"exact", exact.Solver{}},
	}
}

// Lookup returns the method called name and whether there is one.
func Lookup(name string) (Method, bool) {
	for _, m := range All() {
		if m.Name == name {
			return m, true
		}
	}
	return Method{}, false
}

// Names returns the names of all methods, comma-separated, for messages.
func Names() string {
	var s []string
	for _, m := range All() {
		s = append(s, m.Name)
	}
	return strings.Join(s, ", ")
}

// WithStack returns m set up for the layers st (the zero Stack keeps the
// infinite walls). It returns an error wrapping errors.ErrUnsupported for
// a method that does not solve finite barriers.
func WithStack(m Method, st tiltwell.Stack) (Method, error) {
	if st.Infinite() {
		return m, nil
	}
	switch s := m.Solver.(type) {
	case exact.Solver:
		s.Stack = st
		m.Solver = s
	case perturb.Solver:
		s.Stack = st
		m.Solver = s
	case wkb.Solver:
		s.Stack = st
		m.Solver = s
	case variational.Solver:
		s.Stack = st
		m.Solver = s
	case basis.Solver:
		s.Stack = st
		m.Solver = s
	default:
		return Method{}, fmt.Errorf("method %s does not solve finite barriers: %w", m.Name, errors.ErrUnsupported)
	}
	return m, nil
}
