package main

import (
	"runtime/debug"

	"edgewise/solver"
	"edgewise/solver/project"
)

// oneSolveMemory readies the process's memory for the one solve of a run
// (not a study, which solves many times): about need bytes of it live at
// once (see solveNeed). The returned function puts the collector's
// settings back (for the tests, which run the command in one process).
//
// The collector is switched off below a limit of several times that: a
// run allocates little more than what it keeps, and a collection during
// its one solve (the first comes at 4 MB) only costs time, its marking
// sharing the processors with the grid (at 513 x 257 nodes, 10 ms of a
// 45 ms run). The limit keeps the memory bounded however the solve
// allocates.
//
// Then, where the system has them, the heap is backed by large pages
// (hugePages): on a virtual machine the first touch of every 4 KB page
// costs 10 to 20 µs, more than the field's 15 ns a node.
func oneSolveMemory(need int64) (restore func()) {
	percent := debug.SetGCPercent(-1)
	limit := debug.SetMemoryLimit(4*need + 64<<20)
	hugePages(need)
	return func() {
		debug.SetGCPercent(percent)
		debug.SetMemoryLimit(limit)
	}
}

// solveNeed is about the most memory a solve with nx x ny output
// intervals holds at once: the field and its gradient (24 bytes a node),
// the grid's tables of angles or logarithms (up to 16), and the rest of
// the engine, the cross-check and the CSV writer's bands (a few MB).
func solveNeed(p *project.Project, opt solver.Options) int64 {
	nx, ny := solver.GridFor(p, opt)
	return int64(nx+1)*int64(ny+1)*40 + 8<<20
}
