package solver

import "edgewise/solver/problem"

// StepMethod describes, in the words of the report, how the steps inside
// the edges of p are treated (see jumps.go and innerjump.go); nil when the
// edge data have none.
func StepMethod(p *problem.Problem) []string {
	var value, flux bool
	for _, j := range dataJumps(p) {
		if p.Edges[j.side].Kind == problem.Value {
			value = true
		} else {
			flux = true
		}
	}
	var m []string
	if value {
		m = append(m, "Steps of prescribed value inside an edge, found by sampling and bisection, carried out of the series by angle functions (A - B) theta/pi; the flow through such an edge is infinite.")
	}
	if flux {
		m = append(m, "Steps of flux or of ambient inside an edge carried out of the series by the harmonic piece Re(w log w), w the local complex coordinate at the step, so that a step costs no accuracy.")
	}
	return m
}
