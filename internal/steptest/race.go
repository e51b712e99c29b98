//go:build race

package steptest

// raceEnabled is true under the race detector, where sync.Pool drops items
// on purpose and allocation counts mean nothing.
const raceEnabled = true
