//go:build !race

package bigstack

const raceEnabled = false
