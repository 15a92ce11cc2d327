// Package exact is the exact reference for the tilted infinite well: the
// levels, wavefunctions and dipoles of
//
//	H = −(1/π²) d²/dξ² + f (ξ − ½),   φ(0) = φ(1) = 0,
//
// from the Airy-function solution, to full float64 accuracy, for any level
// up to [MaxLevels] and any field |f| ≤ [MaxField]. Every other method in
// tiltwell is tested against it.
//
// The package also exports the real-argument Airy functions it is built on
// ([Airy], [AiryScaled], [ModulusPhase], [AiZero]), accurate to a few units
// in the last place (relative to the modulus where they oscillate; see
// [Airy]), from a node table computed at 256-bit precision (the generators
// are internal/cmd/airygen and thetagen; `go generate` rewrites the tables).
//
// References:
//   - NIST Digital Library of Mathematical Functions, chapter 9 (Airy and
//     related functions), https://dlmf.nist.gov/9, equations cited where
//     used.
//   - M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions,
//     §10.4 (Airy functions), Table 10.13 (zeros).
package exact
