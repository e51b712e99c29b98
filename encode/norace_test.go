//go:build !race

package encode_test

const raceEnabled = false
