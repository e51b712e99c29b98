//go:build race

package encode_test

// raceEnabled is true under the race detector, where allocation counts
// mean nothing.
const raceEnabled = true
