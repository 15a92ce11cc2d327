//go:build !race

package wkb_test

// raceEnabled reports a -race build; see race_test.go.
const raceEnabled = false
