package solver

import (
	"math"
	"strings"

	"edgewise/solver/physics"
	"edgewise/solver/problem"
	"edgewise/solver/project"
	"edgewise/solver/series"
)

// CautionsWithheld replaces the physics' cautions of a result that did not
// converge.
const CautionsWithheld = "No cautions or derived answers are given for this result: the engine could not meet its " +
	"tolerance (see the warnings), so the numbers they would be computed from are not reliable. Change the data (a smoother step, " +
	"a smaller Biot number) or check the case by another method."

// Options controls a solve.
type Options struct {
	// Nx, Ny are the output grid in intervals; zero takes the project's
	// grid or, failing that, DefaultGrid intervals along the longer side.
	Nx, Ny int
	// NoCrossCheck skips the finite-difference cross-check.
	NoCrossCheck bool
}

// DefaultGrid is the number of output intervals along the longer side when
// neither the project nor the caller says.
const DefaultGrid = 200

// Output is a result together with the field on the output grid. The
// slices belong to the Solver and are overwritten by its next Solve.
type Output struct {
	Result Result
	W, H   float64 // the rectangle
	Nx, Ny int
	// U, Ux, Uy hold the value and gradient at node j*(Nx+1)+i, at
	// x = i*W/Nx, y = j*H/Ny.
	U, Ux, Uy []float64
	// field is the solved series and kx, ky the conductivity, for
	// evaluations off the grid (Profile).
	field  field
	kx, ky float64
}

// field is what the engine provides.
type field = series.Field

// A Solver keeps work buffers between solves (WebAssembly memory never
// shrinks, so the page reuses one Solver). It is not safe for concurrent use.
type Solver struct {
	u, ux, uy []float64
}

// GridFor returns the output grid for a project: the options' grid, the
// project's, or DefaultGrid intervals along the longer side with the other
// in proportion (at least 2).
func GridFor(p *project.Project, opt Options) (nx, ny int) {
	switch {
	case opt.Nx > 0 && opt.Ny > 0:
		return opt.Nx, opt.Ny
	case p.Grid != nil:
		return p.Grid.Nx, p.Grid.Ny
	}
	return problem.Proportional(p.Width, p.Height, DefaultGrid)
}

// Solve solves a decoded project.
func (s *Solver) Solve(p *project.Project, opt Options) (*Output, error) {
	nx, ny := GridFor(p, opt)
	if nx < 2 || ny < 2 || nx > project.MaxGrid || ny > project.MaxGrid {
		return nil, project.Errorf("grid", "from 2 to %d intervals per side, got %d x %d", project.MaxGrid, nx, ny)
	}
	pr, err := project.Compile(p)
	if err != nil {
		return nil, err
	}
	breaks, err := series.FindBreaks(pr)
	if err != nil {
		return nil, wrapEngineError(pr, err)
	}
	f, err := series.SolveBreaks(pr, breaks, seriesOptions)
	if err != nil {
		return nil, wrapEngineError(pr, err)
	}
	// The cross-check's independent solutions need only the problem and
	// a coarse grid of the series: where there is more than one
	// processor they are made while the output grid is summed.
	var check *crossRun
	checked := func() {}
	if !opt.NoCrossCheck {
		check = newCrossRun(pr, f, breaks)
		checked = meanwhile(check.run)
	}
	n := (nx + 1) * (ny + 1)
	s.u, s.ux, s.uy = grow(s.u, n), grow(s.ux, n), grow(s.uy, n)
	f.Grid(nx, ny, s.u, s.ux, s.uy)
	out := &Output{W: pr.W, H: pr.H, Nx: nx, Ny: ny, U: s.u, Ux: s.ux, Uy: s.uy, field: f, kx: pr.Kx, ky: pr.Ky}
	settleCorners(pr, out, breaks)
	out.Result = report(p, pr, f, out)
	for i, q := range out.Result.Probes {
		if q.Gradient[0]-q.Gradient[0] != 0 || q.Gradient[1]-q.Gradient[1] != 0 {
			out.Result.Probes[i].Unbounded = unboundedAt(pr, breaks, q.X, q.Y)
		}
	}
	checked()
	if check != nil {
		// before checkConverged: an independent solution that differs
		// by more than both accuracies makes the result not converged
		check.apply(&out.Result)
	}
	checkConverged(pr, &out.Result)
	out.Result.Accuracy.Statement = out.Result.Accuracy.statement()
	if out.Result.Accuracy.Converged {
		out.Result.Answers = answers(p, pr, f, out, breaks)
		out.Result.Cautions = cautions(p, pr, out, &out.Result)
	} else {
		// derived answers and cautions computed from numbers the engine
		// cannot stand behind would mislead either way
		out.Result.Cautions = []string{CautionsWithheld, physics.Deferral}
	}
	out.Result.chooseColour()
	if !allFinite(out.U) {
		return nil, project.Errorf("", "the solution is not finite; please report this project")
	}
	return out, nil
}

// allFinite says whether every value is finite. It is a function of its
// own, not inlined, to keep the loop out of Solve's code (see the
// package doc, "Loops in functions of their own").
//
//go:noinline
func allFinite(u []float64) bool {
	for _, v := range u {
		if v-v != 0 {
			return false
		}
	}
	return true
}

func grow(b []float64, n int) []float64 {
	if cap(b) < n {
		return make([]float64, n)
	}
	return b[:n]
}

// settleCorners gives the corner nodes with a corner break (two
// prescribed values that differ) the mean of the two values (the field has
// no value there; the mean is what the picture and the isolines need). The
// gradient there is unbounded and stays NaN.
func settleCorners(pr *problem.Problem, out *Output, breaks []series.Break) {
	broken := cornerBreaks(breaks)
	nodes := [4]int{0, out.Nx, (out.Nx+1)*(out.Ny+1) - 1, out.Ny * (out.Nx + 1)}
	ends := [4][2]problem.Side{{problem.Bottom, problem.Left}, {problem.Bottom, problem.Right},
		{problem.Top, problem.Right}, {problem.Top, problem.Left}}
	for c, k := range nodes {
		if !broken[c] || out.U[k]-out.U[k] == 0 {
			continue
		}
		x, y := float64(k%(out.Nx+1))*pr.W/float64(out.Nx), float64(k/(out.Nx+1))*pr.H/float64(out.Ny)
		a := pr.Edges[ends[c][0]].F(x)
		b := pr.Edges[ends[c][1]].F(y)
		out.U[k], out.Ux[k], out.Uy[k] = (a+b)/2, math.NaN(), math.NaN()
	}
}

// wrapEngineError puts the project path on errors the engine reports about
// edge data.
func wrapEngineError(pr *problem.Problem, err error) error {
	if nf, ok := err.(*problem.NonFiniteError); ok {
		return project.Errorf(project.DataPath(nf.Side, pr.Edges[nf.Side].Kind), "not a finite number at s = %.6g", nf.S)
	}
	if pe, ok := err.(*series.PoleError); ok {
		return project.Errorf(project.DataPath(pe.Side, pr.Edges[pe.Side].Kind), "grows without bound near s = %.6g (a pole, not a step); the data must be finite along the whole edge", pe.S)
	}
	if re, ok := err.(*series.DataRangeError); ok {
		return project.Errorf(project.DataPath(re.Side, pr.Edges[re.Side].Kind), "%g at s = %.6g is outside the range the engine handles (magnitude up to %g)", re.V, re.S, series.MaxData)
	}
	if _, ok := err.(*project.Error); ok {
		return err
	}
	// the engine's own prefix means nothing to the user
	return project.Errorf("edges", "%s", strings.TrimPrefix(err.Error(), "series: "))
}

// report computes the result numbers from the solved field.
func report(p *project.Project, pr *problem.Problem, f field, out *Output) Result {
	r := Result{
		Schema:   ResultSchema,
		Probes:   []ProbeResult{},
		Warnings: append([]problem.Warning{}, f.Warnings()...),
		Cautions: []string{},
		Grid:     project.GridSize{Nx: out.Nx, Ny: out.Ny},
		Mean:     f.Mean(),
	}
	for _, q := range p.Probes {
		u, gx, gy := f.At(q.X, q.Y)
		r.Probes = append(r.Probes, ProbeResult{
			Label: q.Label, X: q.X, Y: q.Y, Value: u,
			Gradient: [2]float64{gx, gy},
			Flux:     [2]float64{-pr.Kx * gx, -pr.Ky * gy},
		})
	}
	r.SourceTotal = pr.Source * pr.W * pr.H
	sum, finite := r.SourceTotal, true
	for _, side := range problem.Sides {
		q, ok := f.Flow(side)
		ef := EdgeFlow{Finite: ok}
		if ok {
			ef.Flow = &q
			sum += q
		} else {
			finite = false
		}
		r.Edges[side] = ef
	}
	if finite {
		r.Balance = &sum
	}
	edgeParts(pr, f, &r)
	r.Min, r.Max = extremes(pr, f, out)
	r.Accuracy.Terms = f.Terms()
	r.Accuracy.Estimate = f.ErrorEstimate()
	return r
}

// extremes finds the smallest and largest values: the extreme nodes of
// the output grid, then a compass search on the series itself from there,
// with steps from one grid cell down to a thousandth of one, kept inside the
// rectangle. Corner nodes with no value of their own (a corner break) are
// left out.
func extremes(pr *problem.Problem, f field, out *Output) (lo, hi Extreme) {
	nx, ny := out.Nx, out.Ny
	ilo, ihi := -1, -1
	for k, v := range out.U {
		if out.Ux[k] != out.Ux[k] { // a singular corner
			continue
		}
		if ilo < 0 || v < out.U[ilo] {
			ilo = k
		}
		if ihi < 0 || v > out.U[ihi] {
			ihi = k
		}
	}
	if ilo < 0 { // cannot happen on a grid of at least 2 x 2 intervals
		ilo, ihi = 0, 0
	}
	hx, hy := pr.W/float64(nx), pr.H/float64(ny)
	at := func(k int, sign float64) Extreme {
		e := Extreme{Value: out.U[k], X: float64(k%(nx+1)) * hx, Y: float64(k/(nx+1)) * hy}
		for step := 1.0; step > 1e-3; step /= 2 {
			for moved := true; moved; {
				moved = false
				for _, d := range [4][2]float64{{1, 0}, {-1, 0}, {0, 1}, {0, -1}} {
					x := min(max(e.X+d[0]*step*hx, 0), pr.W)
					y := min(max(e.Y+d[1]*step*hy, 0), pr.H)
					if u, _, _ := f.At(x, y); sign*u > sign*e.Value {
						e, moved = Extreme{Value: u, X: x, Y: y}, true
					}
				}
			}
		}
		return e
	}
	return at(ilo, -1), at(ihi, 1)
}

// unboundedAt says why the gradient has no value at (x, y): which break of
// the boundary data is there.
func unboundedAt(pr *problem.Problem, breaks []series.Break, x, y float64) string {
	corners := [4][2]float64{{0, 0}, {pr.W, 0}, {pr.W, pr.H}, {0, pr.H}}
	near := func(a, b [2]float64) bool {
		return math.Abs(a[0]-b[0]) <= 1e-9*pr.W && math.Abs(a[1]-b[1]) <= 1e-9*pr.H
	}
	at := [2]float64{x, y}
	for _, b := range breaks {
		switch b.Class {
		case series.CornerBreak:
			if near(at, corners[b.Corner]) {
				return "unbounded: two prescribed values that differ meet at this corner (the gradient grows like 1/r); move the probe off it"
			}
		case series.ValueBreak, series.PartMeet:
			bx, by := pr.Point(b.Side, b.S)
			if near(at, [2]float64{bx, by}) {
				if b.Class == series.PartMeet {
					return "unbounded: a held part of the edge meets another kind here (the gradient grows like r^-1/2); move the probe off it"
				}
				return "unbounded: the prescribed value jumps here (the gradient grows like 1/r); move the probe off it"
			}
		}
	}
	for _, c := range corners {
		if near(at, c) {
			return "unbounded: the data of the two edges disagree at this corner (the gradient grows like log r); move the probe off it"
		}
	}
	return "unbounded here: the boundary data jump or change kind at this point; move the probe off it"
}
