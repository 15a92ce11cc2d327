//go:build race

package exact

// underRace reports a -race build (sync.Pool drops items there, so the
// allocation tests skip); see stacknorace_test.go.
const underRace = true
