package project

import (
	"edgewise/solver/problem"
)

// Compile turns a decoded project into the mathematical problem, compiling
// every formula. Errors name the field path and, for formulas, the column.
func Compile(p *Project) (*problem.Problem, error) {
	pr := &problem.Problem{
		W: p.Width, H: p.Height,
		Kx: p.Conductivity.X, Ky: p.Conductivity.Y,
		Source: p.Source,
	}
	for _, side := range problem.Sides {
		h, err := p.checkEdge(side)
		if err != nil {
			return nil, err
		}
		f, seg, _, err := p.EdgeData(side)
		if err != nil {
			return nil, err
		}
		pr.Edges[side] = problem.Edge{Kind: seg.Kind, F: f, Hc: h}
	}
	if err := pr.Validate(); err != nil {
		return nil, Errorf("", "%v", err)
	}
	return pr, nil
}

// EdgeData compiles the formula that holds an edge's data (the value, the
// entering flux or the ambient, whichever its kind takes) into a function
// of the distance s along the edge, and returns the edge's segment and the
// formula's project path. The edge must be one segment.
func (p *Project) EdgeData(side problem.Side) (f func(s float64) float64, seg Segment, path string, err error) {
	seg, ok := p.Edges[side].Whole()
	if !ok {
		return nil, seg, "", Errorf("edges."+side.String()+".segments", "mixed conditions along one edge are not solved yet (%d segments); give the edge one condition", len(p.Edges[side].Segments))
	}
	src, key := seg.data()
	path = "edges." + side.String() + "." + key
	pr := problem.Problem{W: p.Width, H: p.Height}
	point := func(s float64) (x, y float64) { return pr.Point(side, s) }
	f, err = compileFormula(src, path, point, p.Width, p.Height, p.Consts())
	return f, seg, path, err
}
