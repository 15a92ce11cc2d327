//go:build race

package wkb_test

// raceEnabled reports a -race build, under which the allocation tests are
// skipped; see norace_test.go.
const raceEnabled = true
