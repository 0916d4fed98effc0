package solver

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
		spec := p.Edges[side]
		src, path := spec.data(side)
		point := func(s float64) (x, y float64) { return pr.Point(side, s) }
		f, err := compileFormula(src, path, point, p.Width, p.Height)
		if err != nil {
			return nil, err
		}
		pr.Edges[side] = problem.Edge{Kind: spec.Kind, F: f}
		if spec.Kind == problem.Convection {
			pr.Edges[side].Hc = spec.H
		}
	}
	if err := pr.Validate(); err != nil {
		return nil, errorf("", "%v", err)
	}
	return pr, nil
}

// data returns the formula that holds the edge's data (the value, the
// entering flux or the ambient) and its project path.
func (e EdgeSpec) data(side problem.Side) (src, path string) {
	if e.Kind == problem.Convection {
		return e.Ambient, "edges." + side.String() + ".ambient"
	}
	return e.Expr, "edges." + side.String() + ".expr"
}

// exprPath is the project path of the formula that holds an edge's data.
func exprPath(p *problem.Problem, side problem.Side) string {
	_, path := EdgeSpec{Kind: p.Edges[side].Kind}.data(side)
	return path
}
