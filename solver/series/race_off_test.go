//go:build !race

package series

const raceOn = false
