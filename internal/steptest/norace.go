//go:build !race

package steptest

const raceEnabled = false
