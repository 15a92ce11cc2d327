//go:build !race

package main

// raceEnabled reports whether the race detector is on: the slowest tests
// then check a sample.
const raceEnabled = false
