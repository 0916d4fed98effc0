//go:build js

package solver

// meanwhile returns job itself, to be run where the wait is: WebAssembly
// has one processor (and the goroutine would only make the engine
// larger).
func meanwhile(job func()) (wait func()) { return job }
