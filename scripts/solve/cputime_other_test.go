//go:build !unix

package main

import "time"

// processorTime is not measured here; benchmarks then report 0.
func processorTime() time.Duration { return 0 }
