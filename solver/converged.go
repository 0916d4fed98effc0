package solver

import (
	"fmt"
	"math"

	"edgewise/solver/problem"
)

// unconvergedEstimate is the estimated error, relative to the range of
// the field, above which a series that stopped at its term limit makes
// the result unconverged: its numbers are then not good to 1% of their
// range. Below it the term-limit warning and the estimate say how far the
// numbers can be trusted (the published strip check at Bi = 10 and aspect
// 100 stops at 4096 terms with an estimate of 0.4% of its range and agrees
// with its table to 1e-4).
const unconvergedEstimate = 1e-2

// dataRange returns the range of the prescribed values and of the
// ambients of exchanging convection edges, sampled at 1025 points along
// each edge, and whether the maximum principle bounds the field by it: no
// source, and every flux edge (or convection edge with h = 0) insulated,
// with at least one edge that holds a value or exchanges.
func dataRange(pr *problem.Problem) (lo, hi float64, applies bool) {
	if pr.Source != 0 {
		return 0, 0, false
	}
	const n = 1024
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, side := range problem.Sides {
		e := pr.Edges[side]
		L := pr.Length(side)
		for i := 0; i <= n; i++ {
			kind, f, hc := e.Condition(L * float64(i) / n)
			bounds := kind == problem.Value || (kind == problem.Convection && hc > 0)
			if kind == problem.Convection && hc == 0 {
				continue // insulated
			}
			v := f(L * float64(i) / n)
			if !bounds {
				if v != 0 {
					return 0, 0, false // a prescribed inflow
				}
				continue
			}
			lo, hi = min(lo, v), max(hi, v)
		}
	}
	return lo, hi, hi >= lo
}

// boundingData returns the data at (x, y) of an edge through it that holds
// a value or exchanges (its ambient), and whether there is one.
func boundingData(pr *problem.Problem, x, y float64) (float64, bool) {
	for _, side := range problem.Sides {
		e := pr.Edges[side]
		var s float64
		switch {
		case side == problem.Bottom && y == 0, side == problem.Top && y == pr.H:
			s = x
		case side == problem.Left && x == 0, side == problem.Right && x == pr.W:
			s = y
		default:
			continue
		}
		kind, f, hc := e.Condition(s)
		if kind == problem.Flux || (kind == problem.Convection && hc == 0) {
			continue
		}
		if v := f(s); v-v == 0 {
			return v, true
		}
	}
	return 0, false
}

// checkConverged sets r.Accuracy.Converged: false when the engine has
// already warned that it did not converge, and false with a warning when
// the field's extremes leave the range the maximum principle allows (by
// more than twice the estimate, or 1e-9 of the range for rounding) or a
// series stopped at its term limit with an estimate above
// unconvergedEstimate of the field's range.
func checkConverged(pr *problem.Problem, r *Result) {
	r.Accuracy.Converged = true
	for _, w := range r.Warnings {
		if w.Code == problem.NotConverged {
			// the engine says so itself (the fit of mixed edges missed
			// its tolerance by far): its own warning says why
			r.Accuracy.Converged = false
			return
		}
	}
	est := r.Accuracy.Estimate
	if lo, hi, ok := dataRange(pr); ok {
		// an extreme on a bounding edge may sit on a peak of its data
		// narrower than the samples: the data there count too
		for _, e := range []Extreme{r.Min, r.Max} {
			if v, on := boundingData(pr, e.X, e.Y); on {
				lo, hi = min(lo, v), max(hi, v)
			}
		}
		tol := 2*est + 1e-9*max(hi-lo, math.Abs(lo), math.Abs(hi))
		if r.Min.Value < lo-tol || r.Max.Value > hi+tol || r.Min.Value != r.Min.Value || r.Max.Value != r.Max.Value {
			r.Accuracy.Converged = false
			r.Warnings = append(r.Warnings, problem.Warning{Code: problem.NotConverged, Edges: []problem.Side{},
				Text: fmt.Sprintf("the result is not reliable: with no source and no prescribed inflow the field must lie between %.6g and %.6g "+
					"(the prescribed values and ambients), but the solution reaches %.6g to %.6g; the series did not converge for these data",
					lo, hi, r.Min.Value, r.Max.Value)})
			return
		}
	}
	capped := false
	for _, w := range r.Warnings {
		capped = capped || w.Code == problem.TermLimit
	}
	span := r.Max.Value - r.Min.Value
	if capped && !(est <= unconvergedEstimate*span) {
		r.Accuracy.Converged = false
		r.Warnings = append(r.Warnings, problem.Warning{Code: problem.NotConverged, Edges: []problem.Side{},
			Text: fmt.Sprintf("the result is not reliable: the series stopped at its term limit with an estimated error of %.3g, "+
				"more than %g of the field's range %.6g", est, unconvergedEstimate, span)})
	}
}
