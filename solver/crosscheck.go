package solver

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"edgewise/solver/fdcheck"
	"edgewise/solver/problem"
	"edgewise/solver/series"
)

// CrossCheckGrid is the number of intervals along the longer side of the
// coarse cross-check grid; the fine grid has twice as many.
const CrossCheckGrid = 24

// crossCheck compares the series with an independent finite-difference
// solution (Richardson-extrapolated from two grids) at the coarse grid's
// nodes, leaving out the neighbourhood of corners where the finite
// differences are not meant to be accurate: two coarse cells around every
// corner, and a fifth of the shorter side around corner breaks, value
// breaks inside edges and the points where a value part of a mixed edge
// meets a flux or convection part (the field goes like r^(1/2) there,
// which the finite differences resolve only to first order).
func crossCheck(pr *problem.Problem, f field, r *Result, breaks []series.Break) {
	nx, ny := problem.Proportional(pr.W, pr.H, CrossCheckGrid)
	// A weakly exchanging problem is checked through the flux problem its
	// varying part solves (nearly singular for the grid as it is). An
	// all-flux problem is balanced: the series has checked that (and
	// refused it otherwise) with a quadrature far finer than the grid's
	// trapezoid rule, whose imbalance is its own error.
	pq, shift := pr, 0.0
	if w, ok := f.(interface {
		Equivalent() (*problem.Problem, float64)
	}); ok {
		pq, shift = w.Equivalent()
	}
	g, _, err := fdcheck.RichardsonBalanced(pq, nx, ny)
	if err != nil {
		msg := strings.TrimPrefix(err.Error(), "fdcheck: ") // the package's prefix means nothing to the user
		var ie *fdcheck.ImbalanceError
		if errors.As(err, &ie) {
			r.Accuracy.CrosscheckReason = "the finite-difference check could not balance the problem: " + msg
		} else {
			r.Accuracy.CrosscheckReason = "the finite-difference check failed: " + msg
		}
		return
	}
	broken := cornerBreaks(breaks)
	hx, hy := pr.W/float64(nx), pr.H/float64(ny)
	near := func(x, y, cx, cy, d float64) bool { return math.Hypot(x-cx, y-cy) < d }
	corners := [4][2]float64{{0, 0}, {pr.W, 0}, {pr.W, pr.H}, {0, pr.H}}
	sum := make([]float64, (nx+1)*(ny+1))
	f.Grid(nx, ny, sum, nil, nil)
	worst := 0.0
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			x, y := float64(i)*hx, float64(j)*hy
			skip := false
			for _, b := range breaks {
				if b.Class == series.ValueBreak || b.Class == series.PartMeet {
					jx, jy := pr.Point(b.Side, b.S)
					skip = skip || near(x, y, jx, jy, 0.2*min(pr.W, pr.H))
				}
			}
			for c, xy := range corners {
				if near(x, y, xy[0], xy[1], 2.01*math.Hypot(hx, hy)) ||
					(broken[c] && near(x, y, xy[0], xy[1], 0.2*min(pr.W, pr.H))) {
					skip = true
				}
			}
			if skip {
				continue
			}
			k := j*(nx+1) + i
			worst = max(worst, math.Abs(sum[k]-shift-g.U[k]))
		}
	}
	r.Accuracy.Crosscheck = &worst
	r.Accuracy.CrosscheckGrid = fmt.Sprintf("%dx%d and %dx%d intervals, Richardson-extrapolated", nx, ny, 2*nx, 2*ny)
	for _, b := range breaks {
		if b.Class == series.PartMeet {
			// the grid's error there is of first order and spreads: the
			// difference then measures the grid, not the series
			r.Accuracy.CrosscheckGrid += "; first order where a value part meets another kind, so the difference mostly measures the grid there"
			break
		}
	}
}

// cornerBreaks reports, for the corners bottom-left, bottom-right,
// top-right, top-left, whether a corner break is there.
func cornerBreaks(breaks []series.Break) [4]bool {
	var out [4]bool
	for _, b := range breaks {
		if b.Class == series.CornerBreak {
			out[b.Corner] = true
		}
	}
	return out
}
