package main

import (
	"runtime/debug"

	"edgewise/solver"
	"edgewise/solver/project"
)

// oneSolveMemory readies the process's memory for the one solve of a run
// (not a study, which solves many times) of project p with options opt.
// The returned function puts the collector's settings back (for the
// tests, which run the command in one process).
//
// The collector is switched off below a limit of several times what the
// solve holds at once (solveNeed): a run allocates little more than
// what it keeps, and a collection during its one solve (the first comes
// at 4 MB) only costs time, its marking sharing the processors with the
// grid (at 513 x 257 nodes, 10 ms of a 45 ms run). The limit keeps the
// memory bounded however the solve allocates.
//
// Then, for a grid of more than largeGrid nodes and where the system has
// them, the heap is backed by large pages (hugePages): on a virtual
// machine the first touch of every 4 KB page costs 10 to 20 µs, more
// than the field's 15 ns a node. On smaller grids, the collection that
// takes costs more than it saves.
func oneSolveMemory(p *project.Project, opt solver.Options) (restore func()) {
	nx, ny := solver.GridFor(p, opt)
	nodes := int64(nx+1) * int64(ny+1)
	need := solveNeed(nodes)
	percent := debug.SetGCPercent(-1)
	limit := debug.SetMemoryLimit(4*need + 64<<20)
	if nodes > largeGrid {
		hugePages(need)
	}
	return func() {
		debug.SetGCPercent(percent)
		debug.SetMemoryLimit(limit)
	}
}

// largeGrid is the number of output nodes above which hugePages pays:
// measured on the 2 x 1 plate, 362 x 181 intervals (66,000 nodes) ran
// about as fast either way, 512 x 256 in 28 ms against 35.
const largeGrid = 1 << 16

// solveNeed is about the most memory a solve with the given number of
// output nodes holds at once: the field and its gradient (24 bytes a
// node), the grid's tables of angles or logarithms (up to 16), and the
// rest of the engine, the cross-check and the CSV writer's bands (a few
// MB).
func solveNeed(nodes int64) int64 { return nodes*40 + 8<<20 }
