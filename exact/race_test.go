//go:build race

package exact_test

// raceEnabled reports a -race build, where the race detector slows the
// million-line table tests about fivefold; see norace_test.go.
const raceEnabled = true
