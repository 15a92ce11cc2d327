//go:build !race

package perturb

// raceEnabled reports whether the race detector is on (allocation counts
// are not meaningful then).
const raceEnabled = false
