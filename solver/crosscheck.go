package solver

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"edgewise/solver/fdcheck"
	"edgewise/solver/problem"
	"edgewise/solver/series"
	"edgewise/solver/spectral"
)

// CrossCheckGrid is the number of intervals along the longer side of the
// grid the cross-check compares on (and of the finite differences' coarse
// grid; their fine grid has twice as many).
const CrossCheckGrid = 24

// spectralNodes is the number of GLL intervals along the shorter (scaled)
// side of the spectral check's first solution; its second has half as
// many again, and the longer side up to spectralLong times as many. A
// check that does not confirm the estimate tries once more with half as
// many nodes again.
const (
	spectralNodes = 16
	spectralLong  = 48
)

// confirmWithin is how far above the series' estimate the check's
// difference may lie and still confirm it (the estimate is meant to lie
// within about 10 times the true error, the check's own error adds to it).
const confirmWithin = 100

// crossCheck compares the series with an independent solution at the
// nodes of a coarse grid, leaving out the neighbourhood of corners and of
// the places where the field is singular: two grid cells around every
// corner, and a fifth of the shorter side around corner breaks, value
// breaks inside edges and the points where a value part of a mixed edge
// meets a flux or convection part (the field goes like r^(1/2) there).
//
// The independent solution is the spectral Galerkin solution of package
// spectral, on two numbers of nodes (and, when that does not confirm the
// estimate, on half as many again); where it still does not
// confirm the estimate and does not resolve the problem to the series'
// accuracy, or an edge is made of parts, the Richardson-extrapolated
// finite differences of package fdcheck are tried too, and the check
// that resolves the problem better is kept. Either way the result
// says how far the check itself goes (Accuracy.CrosscheckResolution) and
// whether it confirms the series' estimate (Accuracy.CrosscheckVerdict).
func crossCheck(pr *problem.Problem, f field, r *Result, breaks []series.Break) {
	c := newCrossRun(pr, f, breaks)
	c.run()
	c.apply(r)
}

// A crossRun is one cross-check in three steps: newCrossRun takes from
// the series what the check compares with (a coarse grid of it, which
// must not run at the same time as another Grid of the same field); run
// makes the independent solutions, reading nothing but the problem and
// its own data, so that it may run at the same time as the series' own
// output grid; apply writes the outcome into the result.
type crossRun struct {
	pq     *problem.Problem // the problem the check solves
	nx, ny int
	sum    []float64 // the series' values on the check's grid
	keep   []bool    // the nodes compared
	est    float64   // the series' error estimate
	breaks []series.Break
	best   check
	reason string // why no check could be made, or ""
}

func newCrossRun(pr *problem.Problem, f field, breaks []series.Break) *crossRun {
	nx, ny := problem.Proportional(pr.W, pr.H, CrossCheckGrid)
	// A weakly exchanging problem is checked through the flux problem its
	// varying part solves (nearly singular for the grid as it is).
	pq, shift := pr, 0.0
	if w, ok := f.(interface {
		Equivalent() (*problem.Problem, float64)
	}); ok {
		pq, shift = w.Equivalent()
	}
	sum := make([]float64, (nx+1)*(ny+1))
	f.Grid(nx, ny, sum, nil, nil)
	for k := range sum {
		sum[k] -= shift
	}
	return &crossRun{pq: pq, nx: nx, ny: ny, sum: sum, keep: compared(pr, nx, ny, breaks), est: f.ErrorEstimate(), breaks: breaks}
}

// run makes the independent solutions and keeps the best check.
func (c *crossRun) run() {
	pq, nx, ny, sum, keep, est, breaks := c.pq, c.nx, c.ny, c.sum, c.keep, c.est, c.breaks
	best, err := spectralCheck(pq, spectralNodes, nx, ny, sum, keep, breaks)
	confirms := func() bool { return err == nil && verdict(best.diff, best.resolution, est) == VerdictConfirms }
	if !confirms() && err == nil {
		// half as many nodes again may confirm: narrow features of the
		// data may need them, and near a corner whose conditions do not
		// join smoothly the error falls like a power of the nodes
		if finer, ferr := spectralCheck(pq, spectralNodes*3/2, nx, ny, sum, keep, breaks); ferr == nil && finer.resolution < best.resolution {
			best = finer
		}
	}
	if !confirms() && (err != nil || best.resolution > est*confirmWithin/10) {
		fd, fdErr := fdCheck(pq, nx, ny, sum, keep)
		switch {
		case fdErr != nil && err != nil:
			c.reason = fdErr.Error()
			return
		case fdErr == nil && (err != nil || fd.resolution < best.resolution):
			best = fd
		}
	}
	c.best = best
}

// apply writes the check into r.
func (c *crossRun) apply(r *Result) {
	if c.reason != "" {
		r.Accuracy.CrosscheckReason = c.reason
		return
	}
	best, est := c.best, c.est
	r.Accuracy.Crosscheck = &best.diff
	r.Accuracy.CrosscheckResolution = &best.resolution
	r.Accuracy.CrosscheckMethod = best.name
	r.Accuracy.CrosscheckGrid = best.method
	r.Accuracy.CrosscheckVerdict = verdict(best.diff, best.resolution, est)
	switch r.Accuracy.CrosscheckVerdict {
	case VerdictLimited:
		r.Accuracy.CrosscheckLimit = best.limit
	case VerdictDiffers:
		// two independent solutions disagree by more than both their
		// accuracies: the numbers cannot be stood behind
		r.Warnings = append(r.Warnings, problem.Warning{Code: problem.NotConverged, Edges: []problem.Side{},
			Text: fmt.Sprintf("the result is not reliable: an independent solution (%s) differs from the series by %.3g, "+
				"more than its own resolution %.3g and the series' estimate %.3g can explain", best.method, best.diff, best.resolution, est)})
	}
	for _, b := range c.breaks {
		if b.Class == series.PartMeet {
			// the grid's error there is of first order and spreads: the
			// difference then measures the grid, not the series
			r.Accuracy.CrosscheckGrid += "; first order where a value part meets another kind, so the difference mostly measures the grid there"
			break
		}
	}
}

// A check is what one independent method found: its largest difference
// from the series, how far it resolves the problem itself, and its name.
type check struct {
	diff, resolution float64
	name             string // CheckSpectral or CheckFiniteDifferences
	method           string
	limit            string // what limits the resolution (see Accuracy.CrosscheckLimit)
}

// The independent solutions (Accuracy.CrosscheckMethod).
const (
	CheckSpectral          = "spectral"
	CheckFiniteDifferences = "finite-differences"
)

// Verdicts of the cross-check (Accuracy.CrosscheckVerdict).
const (
	// VerdictConfirms: the independent solution resolves the problem
	// and agrees with the series within confirmWithin times the series'
	// estimate.
	VerdictConfirms = "confirms"
	// VerdictLimited: it differs by more, but no more than its own
	// resolution explains: it cannot confirm the estimate on this
	// problem.
	VerdictLimited = "limited"
	// VerdictDiffers: it differs by more than its own resolution and the
	// estimate together can explain.
	VerdictDiffers = "differs"
)

func verdict(diff, resolution, est float64) string {
	switch {
	case diff <= confirmWithin*est && resolution <= confirmWithin*est:
		// a check that resolves the problem less well than that
		// cannot confirm it, however small its difference
		return VerdictConfirms
	case diff <= 3*resolution+confirmWithin*est:
		return VerdictLimited
	}
	return VerdictDiffers
}

// compared marks the nodes of the nx x ny grid the check compares at.
func compared(pr *problem.Problem, nx, ny int, breaks []series.Break) []bool {
	broken := cornerBreaks(breaks)
	hx, hy := pr.W/float64(nx), pr.H/float64(ny)
	near := func(x, y, cx, cy, d float64) bool { return math.Hypot(x-cx, y-cy) < d }
	corners := [4][2]float64{{0, 0}, {pr.W, 0}, {pr.W, pr.H}, {0, pr.H}}
	keep := make([]bool, (nx+1)*(ny+1))
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
			keep[j*(nx+1)+i] = !skip
		}
	}
	return keep
}

// largest returns the largest |a - b| over the kept nodes.
func largest(a, b []float64, keep []bool) float64 {
	worst := 0.0
	for k, ok := range keep {
		if ok {
			worst = max(worst, math.Abs(a[k]-b[k]))
		}
	}
	return worst
}

// spectralCheck solves pq by the spectral method on two numbers of nodes,
// base and half as many again along the shorter side, and compares the
// finer with the series' values sum.
func spectralCheck(pq *problem.Problem, base, nx, ny int, sum []float64, keep []bool, breaks []series.Break) (check, error) {
	// nodes by the scaled sides (the field varies on the scale of
	// L/sqrt(K)), the shorter with base
	ex, ey := pq.W/math.Sqrt(pq.Kx), pq.H/math.Sqrt(pq.Ky)
	n := func(b int, mine, other float64) int {
		return min(spectralLong*b/spectralNodes, int(math.Ceil(float64(b)*max(1, math.Sqrt(mine/other)))))
	}
	var fields [2]*spectral.Field
	for i, b := range [2]int{base, base * 3 / 2} {
		f, err := spectral.Solve(pq, n(b, ex, ey), n(b, ey, ex))
		if err != nil {
			return check{}, err
		}
		fields[i] = f
	}
	coarse, fine := fields[0].Grid(nx, ny, nil), fields[1].Grid(nx, ny, nil)
	sx, sy := fields[1].Nodes()
	// where the two solutions differ most says what limits them
	at, res := 0, -1.0
	for k, ok := range keep {
		if d := math.Abs(coarse[k] - fine[k]); ok && d > res {
			at, res = k, d
		}
	}
	x, y := float64(at%(nx+1))*pq.W/float64(nx), float64(at/(nx+1))*pq.H/float64(ny)
	return check{
		diff:       largest(sum, fine, keep),
		resolution: res,
		name:       CheckSpectral,
		method:     fmt.Sprintf("spectral Galerkin on %d x %d Gauss-Lobatto nodes", sx+1, sy+1),
		limit:      spectralLimit(pq, breaks, x, y),
	}, nil
}

// fdCheck solves pq by finite differences on two grids, Richardson
// extrapolation, and compares with the series' values sum.
func fdCheck(pq *problem.Problem, nx, ny int, sum []float64, keep []bool) (check, error) {
	// An all-flux problem is balanced: the series has checked that (and
	// refused it otherwise) with a quadrature far finer than the grid's
	// trapezoid rule, whose imbalance is its own error.
	g, indicator, err := fdcheck.RichardsonBalanced(pq, nx, ny)
	if err != nil {
		msg := strings.TrimPrefix(err.Error(), "fdcheck: ") // the package's prefix means nothing to the user
		var ie *fdcheck.ImbalanceError
		if errors.As(err, &ie) {
			return check{}, errors.New("the finite-difference check could not balance the problem: " + msg)
		}
		return check{}, errors.New("the finite-difference check failed: " + msg)
	}
	return check{
		diff: largest(sum, g.U, keep),
		// the difference between the grids is the fine grid's error
		// where the scheme is of first order (near steps and part
		// meetings), three times it where it is of second; the
		// extrapolation's is smaller, by how much the grids cannot tell
		resolution: indicator,
		name:       CheckFiniteDifferences,
		method:     fmt.Sprintf("finite differences on %dx%d and %dx%d intervals, Richardson-extrapolated", nx, ny, 2*nx, 2*ny),
		limit:      "its grids (second order where the field is smooth, first order next to steps, corners whose conditions disagree and part meetings)",
	}, nil
}

// spectralLimit names what keeps the spectral solution from resolving the
// problem, found where its two resolutions differ most, (x, y): the
// nearest corner or break of the data within a third of the shorter side;
// farther from all of them, the singular points in general, whose error a
// polynomial solution spreads over the whole rectangle.
func spectralLimit(pr *problem.Problem, breaks []series.Break, x, y float64) string {
	reach := min(pr.W, pr.H) / 3
	what, best := "the corners whose conditions do not join smoothly and any steps or kinks in the data: "+
		"a polynomial solution converges slowly next to them and spreads their error", reach
	corners := [4]struct {
		x, y float64
		name string
	}{{0, 0, "bottom-left"}, {pr.W, 0, "bottom-right"}, {pr.W, pr.H, "top-right"}, {0, pr.H, "top-left"}}
	for _, c := range corners {
		if d := math.Hypot(x-c.x, y-c.y); d < best {
			what, best = "the "+c.name+" corner, where the two edges' conditions do not join smoothly", d
		}
	}
	for _, b := range breaks {
		if b.Class == series.CornerBreak {
			continue // a corner: named above
		}
		bx, by := pr.Point(b.Side, b.S)
		if d := math.Hypot(x-bx, y-by); d < best {
			kind := "kink"
			if b.Class == series.ValueBreak || b.Class == series.FluxBreak {
				kind = "step"
			}
			what, best = fmt.Sprintf("the %s in the %s edge's data", kind, b.Side), d
		}
	}
	return what
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

// noCheck ends the statement of a solve run without its check; the page
// puts its own sentence in its place while the check runs (site/results.js,
// NO_CHECK), so the two must agree.
const noCheck = " No independent check was run for this solve."

// statement is the one accuracy statement of a result (Accuracy.Statement),
// as the page and the report show it: what the numbers are good to, which figure to rely
// on, and what the independent check shows. The numbers are left as the
// markers {estimate}, {difference} and {resolution}, for each reader to
// write in its own units.
func (a *Accuracy) statement() string {
	s := "The numbers are good to {estimate}: the series' own error estimate, the figure to rely on " +
		"(the largest error of the field's values away from singular points)."
	name := "finite differences"
	if a.CrosscheckMethod == CheckSpectral {
		name = "a spectral Galerkin method"
	}
	switch {
	case a.Crosscheck == nil && a.CrosscheckReason != "":
		return s + " No independent check was made: " + a.CrosscheckReason + "."
	case a.Crosscheck == nil:
		return s + noCheck
	case a.CrosscheckVerdict == VerdictConfirms:
		return s + " An independent solution by " + name + " agrees to within {difference}, which confirms it."
	case a.CrosscheckVerdict == VerdictLimited:
		return s + " An independent solution by " + name + " agrees to within {difference}, but resolves this problem only to about " +
			"{resolution}, limited by " + a.CrosscheckLimit + "; it cannot confirm the estimate more closely than that."
	case a.CrosscheckVerdict == VerdictDiffers:
		return s + " An independent solution by " + name + " differs by {difference}, more than its own resolution ({resolution}) " +
			"and the estimate explain: these numbers are not reliable."
	}
	return s
}
