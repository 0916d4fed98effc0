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
		e, err := p.compileEdge(side)
		if err != nil {
			return nil, err
		}
		pr.Edges[side] = e
	}
	if err := pr.Validate(); err != nil {
		return nil, Errorf("", "%v", err)
	}
	return pr, nil
}

// EdgeData compiles the formula that holds an edge's data (the value, the
// entering flux or the ambient, whichever its kind takes) into a function
// of the distance s along the edge, and returns the edge's first segment
// and the formula's project path. For an edge made of segments the
// function gives each segment's data and the path is the segment list's.
func (p *Project) EdgeData(side problem.Side) (f func(s float64) float64, seg Segment, path string, err error) {
	e, err := p.compileEdge(side)
	if err != nil {
		return nil, Segment{}, "", err
	}
	seg = p.Edges[side].Segments[0]
	if whole, ok := p.Edges[side].Whole(); ok {
		_, key := whole.data()
		return e.F, seg, "edges." + side.String() + "." + key, nil
	}
	return e.F, seg, "edges." + side.String() + ".segments", nil
}
