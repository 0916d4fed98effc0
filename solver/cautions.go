package solver

import (
	"fmt"
	"math"

	"edgewise/solver/problem"
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
func cautions(p *Project, pr *problem.Problem, out *Output, r *Result) []string {
	var list []string
	u := Units(p.Physics)
	singular := !(r.Edges.Bottom.Finite && r.Edges.Top.Finite && r.Edges.Left.Finite && r.Edges.Right.Finite)
	switch p.Physics {
	case Heat:
		if r.Max.Value >= BurnTemperature {
			where := "inside the section"
			if onBoundary(pr, r.Max.X, r.Max.Y) {
				where = "on its edge"
			}
			list = append(list, fmt.Sprintf("The hottest point is %.4g %s %s at (%.4g, %.4g) m: bare skin touching metal above "+
				"about %g %s can burn within seconds (common practice). Guard or insulate surfaces people can reach.",
				r.Max.Value, u.ValueUnit, where, r.Max.X, r.Max.Y, BurnTemperature, u.ValueUnit))
		}
	case Electrostatic:
		peak, x, y := peakGradient(out, nil)
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
	case Seepage:
		for _, side := range problem.Sides {
			ef := edgeFlow(r, side)
			if pr.Edges[side].Kind != problem.Value || !ef.Finite || *ef.Flow >= 0 {
				continue // exit faces are value edges where water leaves
			}
			g, x, y := peakGradient(out, &side)
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
			list = append(list, "The hydraulic gradient is unbounded at a corner where the prescribed head jumps; exit "+
				"gradients near that corner are larger than any grid value shows.")
		}
	}
	return append(list, Deferral)
}

// peakGradient returns the largest gradient magnitude on the output grid,
// or along one edge when side is not nil, and where it is.
func peakGradient(out *Output, side *problem.Side) (peak, x, y float64) {
	nx, ny := out.Nx, out.Ny
	consider := func(i, j int) {
		k := j*(nx+1) + i
		g := math.Hypot(out.Ux[k], out.Uy[k])
		if g > peak {
			peak, x, y = g, float64(i)*out.W/float64(nx), float64(j)*out.H/float64(ny)
		}
	}
	switch {
	case side == nil:
		for j := 0; j <= ny; j++ {
			for i := 0; i <= nx; i++ {
				consider(i, j)
			}
		}
	case *side == problem.Bottom || *side == problem.Top:
		j := 0
		if *side == problem.Top {
			j = ny
		}
		for i := 0; i <= nx; i++ {
			consider(i, j)
		}
	default:
		i := 0
		if *side == problem.Right {
			i = nx
		}
		for j := 0; j <= ny; j++ {
			consider(i, j)
		}
	}
	return peak, x, y
}

func onBoundary(pr *problem.Problem, x, y float64) bool {
	tol := 1e-9 * max(pr.W, pr.H)
	return x <= tol || y <= tol || pr.W-x <= tol || pr.H-y <= tol
}

func edgeFlow(r *Result, side problem.Side) EdgeFlow {
	switch side {
	case problem.Bottom:
		return r.Edges.Bottom
	case problem.Top:
		return r.Edges.Top
	case problem.Left:
		return r.Edges.Left
	}
	return r.Edges.Right
}
