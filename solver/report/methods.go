package report

import (
	"edgewise/solver"
	"edgewise/solver/problem"
	"edgewise/solver/project"
)

// Methods lists the published methods behind a solve of p, in the words of
// the report.
func Methods(p *project.Project, r *solver.Result) []string {
	m := []string{
		"Separation of variables with superposition: one sub-problem per edge carrying that edge's data, the other three edges homogeneous of their own kind.",
	}
	seen := map[string]bool{}
	for _, s := range problem.Sides {
		desc := basis(neighbours(p, s))
		if !seen[desc] {
			seen[desc] = true
			m = append(m, desc)
		}
	}
	m = append(m,
		"Hyperbolic functions across the region in overflow-free ratio form (exponentials of differences).",
		"Harmonic corner functions (a bilinear fit to the corner values, and an angle function at a jump of prescribed value) subtracted before expanding, so that the coefficients fall like 1/n^3.",
	)
	if p.Source != 0 {
		m = append(m, "A particular solution for the uniform source, its edge values and fluxes carried into the sub-problems.")
	}
	if p.Conductivity.X != p.Conductivity.Y {
		m = append(m, "Orthotropic conductivity mapped onto an isotropic problem by the change of variable y' = y sqrt(kx/ky).")
	}
	if allFlux(p) {
		m = append(m, "All edges prescribe flux: a steady state exists only when inflow and source balance; the free constant is fixed by the engine's stated rule.")
	}
	m = append(m, "Number of terms chosen from the decay of the coefficient tail, with an error estimate from the tail.")
	if r.Accuracy.Crosscheck != nil {
		m = append(m, "Independent cross-check: finite differences on two grids with Richardson extrapolation (banded Cholesky solver).")
	} else {
		m = append(m, "Finite-difference cross-check (two grids, Richardson extrapolation): not run for this solve.")
	}
	m = append(m, "Isolines by marching squares on the output grid.")
	return m
}

// basis names the Sturm-Liouville basis along an edge whose two
// neighbouring edges have the given kinds.
func basis(a, b problem.Kind) string {
	switch {
	case a == problem.Convection || b == problem.Convection:
		return "Robin eigenfunctions along edges next to a convection edge, their eigenvalues the roots of x tan x = Bi, x cot x = -Bi or the two-sided form, found by a safeguarded Newton/bisection iteration."
	case a == problem.Value && b == problem.Value:
		return "Sine series along edges between two value edges (coefficients by the discrete sine transform)."
	case a == problem.Flux && b == problem.Flux:
		return "Cosine series with its constant mode along edges between two flux edges (coefficients by Gauss-Legendre quadrature)."
	}
	return "Quarter-wave sine and cosine series along edges between a value edge and a flux edge (coefficients by Gauss-Legendre quadrature)."
}

// neighbours returns the kinds held next to the two ends of side s: those
// of the segments of the neighbouring edges that touch its corners.
func neighbours(p *project.Project, s problem.Side) (atStart, atEnd problem.Kind) {
	first := func(e project.Edge) problem.Kind { return e.Segments[0].Kind }
	last := func(e project.Edge) problem.Kind { return e.Segments[len(e.Segments)-1].Kind }
	e := &p.Edges
	switch s {
	case problem.Bottom:
		return first(e[problem.Left]), first(e[problem.Right])
	case problem.Top:
		return last(e[problem.Left]), last(e[problem.Right])
	case problem.Left:
		return first(e[problem.Bottom]), first(e[problem.Top])
	}
	return last(e[problem.Bottom]), last(e[problem.Top])
}

func allFlux(p *project.Project) bool {
	for _, e := range p.Edges {
		for _, s := range e.Segments {
			if s.Kind != problem.Flux {
				return false
			}
		}
	}
	return true
}
