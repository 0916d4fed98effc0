package solver

import "edgewise/solver/problem"

// crossCheck compares the series with an independent finite-difference
// solution. (Until the finite-difference package lands it reports that it
// was skipped.)
func crossCheck(pr *problem.Problem, f field, r *Result) {
	r.Accuracy.CrosscheckReason = "finite-difference cross-check not built yet"
}
