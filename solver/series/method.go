package series

import (
	"edgewise/solver/problem"
	"edgewise/solver/series/basis"
)

// Method describes, in the words of the report, the series method as Solve
// applies it to p, one sentence per step (see the package comment for the
// details). The bases and the steps for a source, orthotropy and an
// all-flux problem appear only when p has them.
func Method(p *problem.Problem) []string {
	m := []string{
		"Separation of variables with superposition: one sub-problem per edge carrying that edge's residual data, the other three edges homogeneous of their own kind.",
	}
	// a mixed edge is a value edge of the inner problem the series solves
	inner := *p
	for _, side := range problem.Sides {
		if p.Edges[side].Mixed() {
			inner.Edges[side] = problem.Edge{Kind: problem.Value, F: p.Edges[side].F}
		}
	}
	md := newModel(&inner)
	seen := map[string]bool{}
	for _, e := range problem.Sides {
		a, b, _ := neighbours(e)
		L := md.length(e)
		d := basis.Method(biot(md, a, L), biot(md, b, L))
		if !seen[d] {
			seen[d] = true
			m = append(m, d)
		}
	}
	m = append(m,
		"Series coefficients by Gauss-Legendre projection of the edge data (n+32 nodes for n terms, one rule between each pair of steps in the data).",
		"Exponentials across the region in overflow-free form, exp(-lambda t) and exp(-lambda (2D - t)), so that any aspect ratio from 1e-3 to 1e3 is safe.",
		"Corner pieces subtracted before expanding: the angle function where two prescribed values jump at a corner, "+
			"zeta log zeta, zeta^2 log zeta and zeta^3 log zeta where the data of two edges disagree at a corner, "+
			"and harmonic polynomials of degree up to 5 (minimum norm) fitted to the remaining corner conditions, "+
			"so that the coefficients fall like about n^-5 instead of n^-1.",
	)
	if p.Source != 0 {
		m = append(m, "A quadratic particular solution for the uniform source, its edge values and fluxes carried into the sub-problems.")
	}
	if p.Kx != p.Ky {
		m = append(m, "Orthotropic conductivity mapped onto an isotropic problem by the change of variable y' = y sqrt(kx/ky).")
	}
	if mixed(p) {
		m = append(m, MixedMethod...)
	}
	if md.allFlx {
		m = append(m, "All edges prescribe flux: a steady state exists only when inflow and source balance (to 1e-9); the free constant makes the area mean of the field zero.")
	}
	m = append(m,
		"Terms doubled until the estimated tail is below the tolerance: the last two octaves of the coefficients give their rate of decay, "+
			"the dropped terms are summed on the loaded edge and extrapolated geometrically, and that estimate is doubled for safety.",
		"Output grid summed row by row with per-row truncation, by the discrete sine transform (DST-I) for edges between two value edges.",
	)
	return m
}

// MixedMethod describes, in the words of the report, how edges made of
// parts (mixed conditions along one edge, or an h that varies along it)
// are solved (mixed.go has the details).
var MixedMethod = []string{
	"Edges made of parts: each is solved as a value edge of an inner problem, its value parts holding their data and each run of flux and convection parts an unknown smooth trace (polynomials joined to the value parts with three continuous derivatives), " +
		"plus, at every place where a value part meets another kind (or h steps from holding to exchanging little), the singular functions Re(c (zeta - z)^(j+1/2)) that carry the r^(1/2) behaviour there exactly.",
	"The unknowns are fitted, by a singular value decomposition, to the flux and convection conditions collocated at Chebyshev points of each run (one series solve of the inner problem per unknown, the series being linear in its data); " +
		"the residual of those conditions between the collocation points gives the part of the error estimate that the fit adds, doubled for safety.",
}

// BreakMethod describes, in the words of the report, how the breaks inside
// the edges of p (FindBreaks) are carried; nil when the edge data have none.
func BreakMethod(p *problem.Problem) []string {
	breaks, err := FindBreaks(p)
	if err != nil {
		return nil // such a project is refused before it is solved
	}
	var value, flux, kink, meet bool
	for _, b := range breaks {
		switch b.Class {
		case ValueBreak:
			value = true
		case FluxBreak:
			flux = true
		case KinkBreak:
			kink = true
		case PartMeet:
			meet = true
		}
	}
	var m []string
	if value {
		m = append(m, "Breaks of prescribed value inside an edge, found once by sampling and bisection, carried out of the series by angle functions (A - B) theta/pi; the flow through such an edge is infinite.")
	}
	if flux {
		m = append(m, "Breaks of flux or of ambient inside an edge, found once by sampling and bisection, carried out of the series by the harmonic piece Re(w log w), w the local complex coordinate at the break, so that a step costs no accuracy.")
	}
	if kink {
		m = append(m, "Kinks (jumps of slope) of value, flux or ambient inside an edge, found once by sampling and the meeting of the lines on either side, carried out of the series by the harmonic pieces Im(w log w) (value) and Re(w^2 log w) (flux, ambient), w the local complex coordinate at the kink; integrals of the data split there.")
	}
	if meet {
		m = append(m, "Where a value part meets a flux or convection part the gradient grows like r^-1/2: the field and the flows there are exact in form (the singular functions above); peaks of the gradient are taken away from those points.")
	}
	return m
}
