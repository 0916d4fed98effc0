package solver

import (
	"edgewise/solver/problem"
	"edgewise/solver/series"
)

// edgeParts fills each edge's mean, flow per unit length and segments:
// for an edge made of parts the engine's flow and mean of each part (the
// edge's mean their length-weighted mean), for a one-condition edge one
// segment with the edge's flow and mean.
func edgeParts(pr *problem.Problem, f field, r *Result) {
	for _, side := range problem.Sides {
		ef := &r.Edges[side]
		L := pr.Length(side)
		if ef.Finite {
			v := *ef.Flow / L
			ef.PerLength = &v
		}
		if !pr.Edges[side].Mixed() {
			ef.Mean = partMean(pr, f, part{side: side, kind: pr.Edges[side].Kind, f: pr.Edges[side].F, from: 0, to: L})
			ef.Segments = []SegmentFlow{{From: 0, To: L, Kind: pr.Edges[side].Kind.String(), Flow: ef.Flow, Finite: ef.Finite, Mean: ef.Mean}}
			continue
		}
		ef.Mean, ef.Segments = 0, nil
		for _, p := range series.PartsOf(f, pr, side) {
			g := SegmentFlow{From: p.From, To: p.To, Kind: p.Kind.String(), Finite: p.Finite, Mean: p.Mean}
			if p.Finite {
				q := p.Flow
				g.Flow = &q
			}
			ef.Segments = append(ef.Segments, g)
			ef.Mean += p.Mean * (p.To - p.From) / L
		}
	}
}
