package solver

import (
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
