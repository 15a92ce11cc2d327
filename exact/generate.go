package exact

// airytable.go is generated at 256 bits by the airygen program beside it.
//go:generate go run ./internal/cmd/airygen
//go:generate go run ./internal/cmd/thetagen
