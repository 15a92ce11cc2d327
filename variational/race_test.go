//go:build race

package variational

// raceEnabled reports a -race build, where sync.Pool drops items at
// random (so allocation counts are meaningless) and plain Go loops run
// about twenty times slower.
const raceEnabled = true
