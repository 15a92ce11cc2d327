//go:build !race

package basis

const raceEnabled = false
