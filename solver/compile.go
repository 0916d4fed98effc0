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
	specs := map[problem.Side]EdgeSpec{
		problem.Bottom: p.Edges.Bottom, problem.Right: p.Edges.Right,
		problem.Top: p.Edges.Top, problem.Left: p.Edges.Left,
	}
	for _, side := range problem.Sides {
		spec := specs[side]
		path := "edges." + side.String()
		point := func(s float64) (x, y float64) { return pr.Point(side, s) }
		var e problem.Edge
		var err error
		switch spec.Kind {
		case "value":
			e.Kind = problem.Value
			e.F, err = compileFormula(spec.Expr, path+".expr", point, p.Width, p.Height)
		case "flux":
			e.Kind = problem.Flux
			e.F, err = compileFormula(spec.Expr, path+".expr", point, p.Width, p.Height)
		case "convection":
			e.Kind = problem.Convection
			e.Hc = spec.H
			e.F, err = compileFormula(spec.Ambient, path+".ambient", point, p.Width, p.Height)
		default:
			return nil, errorf(path+".kind", "unknown edge kind %q (use value, flux or convection)", spec.Kind)
		}
		if err != nil {
			return nil, err
		}
		pr.Edges[side] = e
	}
	if err := pr.Validate(); err != nil {
		return nil, errorf("", "%v", err)
	}
	return pr, nil
}

// exprPath is the project path of the formula that holds an edge's data.
func exprPath(p *problem.Problem, side problem.Side) string {
	if p.Edges[side].Kind == problem.Convection {
		return "edges." + side.String() + ".ambient"
	}
	return "edges." + side.String() + ".expr"
}
