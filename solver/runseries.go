package solver

import (
	"edgewise/solver/problem"
	"edgewise/solver/series"
)

// SeriesTolerance is the series engine's target accuracy relative to the
// data scale of a problem.
const SeriesTolerance = 1e-9

// seriesOptions are the series engine's options for every solve.
var seriesOptions = series.Options{Tol: SeriesTolerance}

// solveSeries finds the breaks of p and runs the series engine.
func solveSeries(p *problem.Problem) (field, error) {
	breaks, err := series.FindBreaks(p)
	if err != nil {
		return nil, err
	}
	return series.SolveBreaks(p, breaks, seriesOptions)
}
