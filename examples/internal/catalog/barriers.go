package catalog

import (
	"errors"
	"flag"
	"fmt"

	"github.com/tiltwell/tiltwell"
)

// Barriers holds the barrier flags every example shares: -barrier and
// -barrier-mass for both sides, or -barrier-left, -barrier-right,
// -mass-left and -mass-right, heights in units of E₁ of the well.
type Barriers struct {
	both, left, right  float64
	mass, massL, massR float64
}

// BarrierFlags registers the barrier flags on fs and returns where their
// values go; call Stack after fs.Parse.
func BarrierFlags(fs *flag.FlagSet) *Barriers {
	b := new(Barriers)
	fs.Float64Var(&b.both, "barrier", 0, "both barrier heights (E₁)")
	fs.Float64Var(&b.left, "barrier-left", 0, "left barrier height (E₁)")
	fs.Float64Var(&b.right, "barrier-right", 0, "right barrier height (E₁)")
	fs.Float64Var(&b.mass, "barrier-mass", 1, "both barriers' mass ratio")
	fs.Float64Var(&b.massL, "mass-left", 1, "left barrier's mass ratio")
	fs.Float64Var(&b.massR, "mass-right", 1, "right barrier's mass ratio")
	return b
}

// Stack returns the well the barrier flags set on fs describe: the zero
// Stack (infinite walls) when no height is given. Its errors are one-line
// messages for the command line.
func (b *Barriers) Stack(fs *flag.FlagSet) (tiltwell.Stack, error) {
	set := map[string]bool{}
	fs.Visit(func(f *flag.Flag) { set[f.Name] = true })
	side := set["barrier-left"] || set["barrier-right"]
	switch {
	case set["barrier"] && side:
		return tiltwell.Stack{}, errors.New("give -barrier or -barrier-left and -barrier-right, not both")
	case side && !(set["barrier-left"] && set["barrier-right"]):
		return tiltwell.Stack{}, errors.New("-barrier-left and -barrier-right go together")
	case set["barrier-mass"] && (set["mass-left"] || set["mass-right"]):
		return tiltwell.Stack{}, errors.New("give -barrier-mass or -mass-left and -mass-right, not both")
	}
	if !set["barrier"] && !side {
		for _, name := range []string{"barrier-mass", "mass-left", "mass-right"} {
			if set[name] {
				return tiltwell.Stack{}, fmt.Errorf("-%s needs a barrier height (-barrier V): without one the walls are infinitely high", name)
			}
		}
		return tiltwell.Stack{}, nil
	}
	vl, vr, ml, mr := b.left, b.right, b.massL, b.massR
	if set["barrier"] {
		vl, vr = b.both, b.both
	}
	if set["barrier-mass"] {
		ml, mr = b.mass, b.mass
	}
	st, err := tiltwell.AsymmetricWell(vl, ml, vr, mr)
	if err != nil {
		var le *tiltwell.LayerError
		if errors.As(err, &le) {
			side := map[int]string{0: "left barrier", 2: "right barrier"}[le.Layer]
			return tiltwell.Stack{}, fmt.Errorf("%s %s %v: %s", side, le.What, le.Value, le.Why)
		}
		return tiltwell.Stack{}, err
	}
	return st, nil
}
