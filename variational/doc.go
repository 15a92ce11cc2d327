// Package variational brackets the levels of the tilted infinite well
// between a Rayleigh–Ritz upper bound and a Temple lower bound.
package variational
