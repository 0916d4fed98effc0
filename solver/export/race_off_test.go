//go:build !race

package export

const raceOn = false
