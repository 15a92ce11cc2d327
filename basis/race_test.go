//go:build race

package basis

// raceEnabled reports a -race build, where sync.Pool drops items at
// random, so allocation counts are meaningless.
const raceEnabled = true
