//go:build !race

package exact

// underRace reports a -race build; see stackrace_test.go.
const underRace = false
