//go:build unix

package main

import (
	"syscall"
	"time"
)

// processorTime is the processor time the test process has used so far
// (user and system, all threads), for benchmarks to report beside the
// wall time on a shared machine.
func processorTime() time.Duration {
	var r syscall.Rusage
	if syscall.Getrusage(syscall.RUSAGE_SELF, &r) != nil {
		return 0
	}
	return time.Duration(r.Utime.Nano() + r.Stime.Nano())
}
