//go:build race

package series

// raceOn thins the heavy sweeps when the race detector slows every
// solve about tenfold; the full sweeps run without -race.
const raceOn = true
