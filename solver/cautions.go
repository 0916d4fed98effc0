package solver

import (
	"math"

	"edgewise/solver/physics"
	"edgewise/solver/problem"
	"edgewise/solver/project"
)

// cautions computes the physics-specific cautions from a solved field; the
// thresholds and wording are in the physics table.
func cautions(p *project.Project, pr *problem.Problem, out *Output, r *Result) []string {
	return physics.Get(p.Physics).Cautions(&solvedField{pr: pr, out: out, r: r})
}

// solvedField is what the cautions read (physics.Field).
type solvedField struct {
	pr  *problem.Problem
	out *Output
	r   *Result
}

func (f *solvedField) Max() (v, x, y float64, onEdge bool) {
	m := f.r.Max
	return m.Value, m.X, m.Y, onBoundary(f.pr, m.X, m.Y)
}

func (f *solvedField) PeakGradient() (g, x, y float64) { return peakGradient(f.out) }

func (f *solvedField) Exits() []physics.Exit {
	var list []physics.Exit
	for _, side := range problem.Sides {
		var pts [][2]float64
		var near float64
		if a := f.r.Answers; a != nil { // the same places as the answers' exit gradients
			pts, near = a.Singular, a.Near
		}
		// exit faces are value parts where water leaves
		for _, q := range partsOf(f.pr, nil, side) {
			if q.kind != problem.Value {
				continue
			}
			if g, x, y, found := exitGradientAway(f.pr, f.out, side, q.from, q.to, pts, near); found {
				list = append(list, physics.Exit{Edge: side.String(), G: g, X: x, Y: y})
			}
		}
	}
	return list
}

func (f *solvedField) Dielectric() (name, source string, strength, peak, x, y, near float64) {
	e := f.r.Answers.Electrostatic
	if e == nil { // not an electrostatic result: the answers were not made
		g, px, py := peakGradient(f.out)
		return "dry air at sea level", "AMS Glossary of Meteorology", physics.AirBreakdown, g, px, py, 0
	}
	return e.Dielectric, e.Source, e.Breakdown, e.Peak.G, e.Peak.X, e.Peak.Y, f.r.Answers.Near
}

func (f *solvedField) Singular() bool {
	if a := f.r.Answers; a != nil && len(a.Singular) > 0 {
		return true // also where a held part meets another kind: finite flows, unbounded gradient
	}
	for _, e := range f.r.Edges {
		if !e.Finite {
			return true
		}
	}
	return false
}

// exitGradient returns the largest gradient magnitude on the output grid
// along a value edge, over the nodes where water leaves the region through
// it (the flux -K grad h points out of the region), and where; found is
// false when nothing leaves through that edge. Nodes where the gradient is
// unbounded (NaN: a jump of head) are left out.
func exitGradient(pr *problem.Problem, out *Output, side problem.Side) (g, x, y float64, found bool) {
	return exitGradientAway(pr, out, side, 0, pr.Length(side), nil, 0)
}

// exitGradientAway is exitGradient over the nodes at least d from every
// point of pts.
func exitGradientAway(pr *problem.Problem, out *Output, side problem.Side, from, to float64, pts [][2]float64, d float64) (g, x, y float64, found bool) {
	nx, ny := out.Nx, out.Ny
	var i0, j0, di, dj, n int
	var nxo, nyo float64 // outward normal
	switch side {
	case problem.Bottom:
		i0, j0, di, dj, n, nxo, nyo = 0, 0, 1, 0, nx, 0, -1
	case problem.Top:
		i0, j0, di, dj, n, nxo, nyo = 0, ny, 1, 0, nx, 0, 1
	case problem.Left:
		i0, j0, di, dj, n, nxo, nyo = 0, 0, 0, 1, ny, -1, 0
	default:
		i0, j0, di, dj, n, nxo, nyo = nx, 0, 0, 1, ny, 1, 0
	}
	for t := 0; t <= n; t++ {
		i, j := i0+t*di, j0+t*dj
		k := j*(nx+1) + i
		gx, gy := out.Ux[k], out.Uy[k]
		// outward flux -(Kx gx, Ky gy) . n > 0
		if gx-gx != 0 || gy-gy != 0 || -(pr.Kx*gx*nxo+pr.Ky*gy*nyo) <= 0 {
			continue
		}
		px, py := float64(i)*out.W/float64(nx), float64(j)*out.H/float64(ny)
		s := py // along the edge
		if side == problem.Bottom || side == problem.Top {
			s = px
		}
		if s < from || s > to {
			continue // outside the part
		}
		if m := math.Hypot(gx, gy); m > g && farFrom(pts, px, py, d) {
			g, x, y, found = m, px, py, true
		}
	}
	return g, x, y, found
}

// peakGradient returns the largest gradient magnitude on the output grid
// and where it is; nodes where it is unbounded (NaN) are left out.
func peakGradient(out *Output) (peak, x, y float64) {
	nx, ny := out.Nx, out.Ny
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			k := j*(nx+1) + i
			if g := math.Hypot(out.Ux[k], out.Uy[k]); g > peak {
				peak, x, y = g, float64(i)*out.W/float64(nx), float64(j)*out.H/float64(ny)
			}
		}
	}
	return peak, x, y
}

func onBoundary(pr *problem.Problem, x, y float64) bool {
	tol := 1e-9 * max(pr.W, pr.H)
	return x <= tol || y <= tol || pr.W-x <= tol || pr.H-y <= tol
}
