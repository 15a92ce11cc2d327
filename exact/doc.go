// Package exact is the exact reference for the tilted infinite well.
package exact
