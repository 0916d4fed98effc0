package solver

import (
	"fmt"
	"math"

	"edgewise/solver/problem"
	"edgewise/solver/project"
)

// Rules of thumb behind the cautions.
const (
	// BurnTemperature: skin burns on brief contact with metal above about
	// 60 °C (common practice).
	BurnTemperature = 60.0
	// AirBreakdown: breakdown field of dry air at sea level, about 3 kV/mm
	// (AMS Glossary of Meteorology, read).
	AirBreakdown = 3e6 // V/m
	// CriticalGradient: critical hydraulic gradient (Gs - 1)/(1 + e), about 1
	// for common soils (soil mechanics texts; common practice).
	CriticalGradient = 1.0
)

// Deferral ends every list of cautions.
const Deferral = "edgewise solves an idealised two-dimensional steady model: check what you take from it " +
	"against the codes and standards that apply where you work, and have a licensed professional approve " +
	"any decision that depends on it."

// cautions computes the physics-specific cautions from a solved field.
func cautions(p *project.Project, pr *problem.Problem, out *Output, r *Result) []string {
	var list []string
	u := Units(p.Physics)
	singular := !(r.Edges[problem.Bottom].Finite && r.Edges[problem.Top].Finite && r.Edges[problem.Left].Finite && r.Edges[problem.Right].Finite)
	switch p.Physics {
	case project.Heat:
		if r.Max.Value >= BurnTemperature {
			where := "inside the section"
			if onBoundary(pr, r.Max.X, r.Max.Y) {
				where = "on its edge"
			}
			list = append(list, fmt.Sprintf("The hottest point is %.4g %s %s at (%.4g, %.4g) m: bare skin touching metal above "+
				"about %g %s can burn within seconds (common practice). Guard or insulate surfaces people can reach.",
				r.Max.Value, u.ValueUnit, where, r.Max.X, r.Max.Y, BurnTemperature, u.ValueUnit))
		}
	case project.Electrostatic:
		peak, x, y := peakGradient(out)
		kvmm := peak / 1e6
		var msg string
		switch {
		case peak >= AirBreakdown:
			msg = fmt.Sprintf("Peak field strength %.3g kV/mm at (%.4g, %.4g) m exceeds about 3 kV/mm, the breakdown field of dry "+
				"air at sea level (AMS Glossary of Meteorology): an air gap of this shape would spark over.", kvmm, x, y)
		case peak >= AirBreakdown/3:
			msg = fmt.Sprintf("Peak field strength %.3g kV/mm at (%.4g, %.4g) m is more than a third of about 3 kV/mm, the "+
				"breakdown field of dry air at sea level (AMS Glossary of Meteorology); humidity, altitude, dirt and sharp "+
				"edges lower it in practice.", kvmm, x, y)
		default:
			msg = fmt.Sprintf("Peak field strength %.3g kV/mm at (%.4g, %.4g) m, against about 3 kV/mm for the breakdown of dry "+
				"air at sea level (AMS Glossary of Meteorology).", kvmm, x, y)
		}
		list = append(list, msg)
		if singular {
			list = append(list, "The field strength is unbounded at a corner where the prescribed potential jumps; the peak "+
				"above is limited by the output grid. Real electrodes there need rounded edges or a gap.")
		}
	case project.Seepage:
		for _, side := range problem.Sides {
			if pr.Edges[side].Kind != problem.Value {
				continue // exit faces are value edges where water leaves
			}
			g, x, y, found := exitGradient(pr, out, side)
			if !found {
				continue
			}
			level := "below"
			if g >= CriticalGradient {
				level = "at or above"
			} else if g >= CriticalGradient/2 {
				level = "more than half of"
			}
			list = append(list, fmt.Sprintf("Exit gradient %.3g on the %v edge (at %.4g, %.4g m) is %s the critical hydraulic "+
				"gradient of about 1 ((Gs - 1)/(1 + e) for common soils; common practice): heave and piping start there, "+
				"so designs keep a wide margin below it.", g, side, x, y, level))
		}
		if singular {
			list = append(list, "The hydraulic gradient is unbounded where the prescribed head jumps (at a corner or "+
				"inside an edge); exit gradients near that point are larger than any grid value shows.")
		}
	}
	return append(list, Deferral)
}

// exitGradient returns the largest gradient magnitude on the output grid
// along a value edge, over the nodes where water leaves the region through
// it (the flux -K grad h points out of the region), and where; found is
// false when nothing leaves through that edge. Nodes where the gradient is
// unbounded (NaN: a jump of head) are left out.
func exitGradient(pr *problem.Problem, out *Output, side problem.Side) (g, x, y float64, found bool) {
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
		if m := math.Hypot(gx, gy); m > g {
			g, x, y, found = m, float64(i)*out.W/float64(nx), float64(j)*out.H/float64(ny), true
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
