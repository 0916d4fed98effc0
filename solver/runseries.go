package solver

import (
	"slices"

	"edgewise/solver/problem"
	"edgewise/solver/series"
)

// SeriesTolerance is the series engine's target accuracy relative to the
// data scale of a problem.
const SeriesTolerance = 1e-9

// solveSeries runs the series engine.
func solveSeries(p *problem.Problem) (field, error) {
	return series.Solve(p, series.Options{Tol: SeriesTolerance})
}

// markBreaks records in the problem where the data of flux and convection
// edges jumps, for the solvers that integrate it (value jumps are taken
// out before, see solveWithJumps).
func markBreaks(p *problem.Problem) {
	for _, j := range dataJumps(p) {
		if e := &p.Edges[j.side]; e.Kind != problem.Value {
			e.Breaks = append(e.Breaks, j.s)
		}
	}
	for _, s := range problem.Sides {
		slices.Sort(p.Edges[s].Breaks)
	}
}
