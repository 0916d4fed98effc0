//go:build !js

package solver

import "runtime"

// meanwhile starts job on another goroutine when there is more than one
// processor and returns the function that waits for it to end (and
// panics with its panic, if it had one); on one processor it returns job
// itself, to be run where the wait is.
func meanwhile(job func()) (wait func()) {
	if runtime.GOMAXPROCS(0) == 1 {
		return job
	}
	done := make(chan any, 1)
	go func() {
		defer func() { done <- recover() }()
		job()
	}()
	return func() {
		if r := <-done; r != nil {
			panic(r)
		}
	}
}
