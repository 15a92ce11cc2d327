//go:build !race

package variational

// raceEnabled reports a -race build; see race_test.go.
const raceEnabled = false
