package project

import (
	"math"

	"edgewise/solver/expr"
	"edgewise/solver/problem"
)

// hSamples is how many evenly spaced places along a segment an h formula
// is checked at (never negative, always finite).
const hSamples = 1000

// checkEdge compiles every formula of the edge on side, segment by
// segment, and checks an h formula at hSamples+1 places along its
// segment: a negative or non-finite h is an error naming the place. It
// returns the edge's convection coefficient when the edge is one
// convection segment with one h, and an error saying so when the edge is
// made of more than one segment or its h varies along it: the engine does
// not solve those yet, and no number may come out for them.
func (p *Project) checkEdge(side problem.Side) (h float64, err error) {
	e := p.Edges[side]
	pr := problem.Problem{W: p.Width, H: p.Height}
	point := func(s float64) (x, y float64) { return pr.Point(side, s) }
	varies := ""
	from := 0.0
	for i, seg := range e.Segments {
		to := seg.To
		if i == len(e.Segments)-1 {
			to = p.length(side)
		}
		path := SegmentPath(side, e, i)
		src, key := seg.data()
		if _, err := compileFormula(src, path+"."+key, point, p.Width, p.Height, p.Consts()); err != nil {
			return 0, err
		}
		h = seg.H
		if seg.Kind == problem.Convection && seg.HExpr != "" {
			f, err := compileFormula(seg.HExpr, path+".h", point, p.Width, p.Height, p.Consts())
			if err != nil {
				return 0, err
			}
			for j := 0; j <= hSamples; j++ {
				s := from + (to-from)*float64(j)/hSamples
				if v := f(s); !(v >= 0) || math.IsInf(v, 1) {
					if v < 0 {
						return 0, Errorf(path+".h", "the convection coefficient must be zero or more; it is %.6g at s = %.6g", v, s)
					}
					return 0, Errorf(path+".h", "not a finite number at s = %.6g", s)
				}
			}
			c, err := expr.CompileWith(seg.HExpr, p.Consts(), formulaVars...)
			if v, ok := c.Const(); err == nil && ok {
				h = v
			} else if varies == "" {
				varies = path + ".h"
			}
		}
		from = to
	}
	switch {
	case len(e.Segments) > 1:
		return 0, Errorf("edges."+side.String()+".segments", "mixed conditions along one edge are not solved yet (%d segments); give the edge one condition", len(e.Segments))
	case varies != "":
		return 0, Errorf(varies, "an h that varies along the edge is not solved yet; give one number")
	}
	return h, nil
}
