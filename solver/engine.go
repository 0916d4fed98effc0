package solver

import (
	"edgewise/solver/problem"
	"edgewise/solver/series"
)

// SeriesTolerance is the series engine's target accuracy relative to the
// data scale of a problem.
const SeriesTolerance = 1e-9

// solveSeries runs the series engine, telling it where the data of the
// flux and convection edges jumps (value jumps are taken out before, see
// solveWithJumps).
func solveSeries(p *problem.Problem) (field, error) {
	opt := series.Options{Tol: SeriesTolerance}
	for _, j := range dataJumps(p) {
		if p.Edges[j.side].Kind != problem.Value {
			opt.Breaks[j.side] = append(opt.Breaks[j.side], j.s)
		}
	}
	return series.Solve(p, opt)
}
