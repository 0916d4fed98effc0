//go:build race

package export

// raceOn makes the long exhaustive-style tests shorter under the race
// detector, which slows them tenfold and finds nothing in them.
const raceOn = true
