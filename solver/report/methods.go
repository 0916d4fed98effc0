package report

import (
	"edgewise/solver"
	"edgewise/solver/contour"
	"edgewise/solver/fdcheck"
	"edgewise/solver/project"
	"edgewise/solver/series"
)

// Methods lists the published methods behind a solve of p, in the words of
// the report. Each package that implements a method describes it beside
// its code (series.Method, series.BreakMethod, fdcheck.Method,
// contour.Method); this only puts them in order.
func Methods(p *project.Project, r *solver.Result) []string {
	pr, err := project.Compile(p)
	if err != nil { // a solved project compiles; say so rather than guess
		return []string{"Methods not listed: " + err.Error()}
	}
	m := append(series.Method(pr), series.BreakMethod(pr)...)
	if r.Accuracy.Crosscheck != nil {
		m = append(m, fdcheck.Method)
	} else {
		m = append(m, "Finite-difference cross-check (two grids, Richardson extrapolation): not run for this solve.")
	}
	return append(m, contour.Method)
}
