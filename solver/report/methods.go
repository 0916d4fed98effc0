package report

import (
	"edgewise/solver"
	"edgewise/solver/contour"
	"edgewise/solver/fdcheck"
	"edgewise/solver/project"
	"edgewise/solver/series"
	"edgewise/solver/spectral"
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
	switch {
	case r.Accuracy.Crosscheck == nil:
		m = append(m, "Independent cross-check: not run for this solve.")
	case r.Accuracy.CrosscheckMethod == solver.CheckSpectral:
		m = append(m, spectral.Method)
	default:
		m = append(m, fdcheck.Method)
	}
	return append(m, contour.Method)
}
