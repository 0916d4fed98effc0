package project

import (
	"math"

	"edgewise/solver/expr"
	"edgewise/solver/problem"
)

// hSamples is how many evenly spaced places along a segment an h formula
// is checked at (never negative, always finite).
const hSamples = 1000

// compileEdge compiles every formula of the edge on side, segment by
// segment, and checks an h formula at hSamples+1 places along its
// segment: a negative or non-finite h is an error naming the place. An
// edge of one segment with one h becomes a one-condition edge; an edge of
// more than one segment, or with an h that varies along it, a mixed edge
// (problem.Edge.Parts) whose F gives each part's data (for displays).
func (p *Project) compileEdge(side problem.Side) (problem.Edge, error) {
	e := p.Edges[side]
	pr := problem.Problem{W: p.Width, H: p.Height}
	point := func(s float64) (x, y float64) { return pr.Point(side, s) }
	varies := false
	from := 0.0
	parts := make([]problem.Part, len(e.Segments))
	for i, seg := range e.Segments {
		to := seg.To
		if i == len(e.Segments)-1 {
			to = p.length(side)
		}
		path := SegmentPath(side, e, i)
		src, key := seg.data()
		f, err := compileFormula(src, path+"."+key, point, p.Width, p.Height, p.Consts())
		if err != nil {
			return problem.Edge{}, err
		}
		parts[i] = problem.Part{To: to, Kind: seg.Kind, F: f}
		if seg.Kind == problem.Convection {
			h := seg.H
			parts[i].Hc = func(float64) float64 { return h }
		}
		if seg.Kind == problem.Convection && seg.HExpr != "" {
			f, err := compileFormula(seg.HExpr, path+".h", point, p.Width, p.Height, p.Consts())
			if err != nil {
				return problem.Edge{}, err
			}
			for j := 0; j <= hSamples; j++ {
				s := from + (to-from)*float64(j)/hSamples
				if v := f(s); !(v >= 0) || math.IsInf(v, 1) {
					if v < 0 {
						return problem.Edge{}, Errorf(path+".h", "the convection coefficient must be zero or more; it is %.6g at s = %.6g", v, s)
					}
					return problem.Edge{}, Errorf(path+".h", "not a finite number at s = %.6g", s)
				}
			}
			c, err := expr.CompileWith(seg.HExpr, p.Consts(), formulaVars...)
			if v, ok := c.Const(); err == nil && ok {
				parts[i].Hc = func(float64) float64 { return v }
			} else {
				parts[i].Hc = f
				varies = true
			}
		}
		from = to
	}
	if len(parts) == 1 && !varies {
		q := parts[0]
		out := problem.Edge{Kind: q.Kind, F: q.F}
		if q.Kind == problem.Convection {
			out.Hc = q.Hc(0)
		}
		return out, nil
	}
	edge := problem.Edge{Kind: parts[0].Kind, Parts: parts}
	edge.F = func(s float64) float64 { return edge.Parts[edge.PartAt(s)].F(s) }
	return edge, nil
}
