package variational

// RaceEnabled reports a -race build to the external tests (see
// race_test.go), which then thin their grids.
const RaceEnabled = raceEnabled
