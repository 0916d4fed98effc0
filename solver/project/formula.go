package project

import (
	"errors"

	"edgewise/solver/expr"
)

// formulaVars are the names an edge formula may use, in the order Eval
// takes their values.
var formulaVars = []string{"x", "y", "s", "W", "H"}

// CompileFormula compiles the text of an edge formula into a function of
// the distance s along the edge; point maps s to (x, y). Errors carry the
// field path and the column.
func CompileFormula(src, path string, point func(s float64) (x, y float64), w, h float64) (func(float64) float64, error) {
	return compileFormula(src, path, point, w, h, nil)
}

// compileFormula is CompileFormula with named constants (the project's
// parameters) besides pi and e.
func compileFormula(src, path string, point func(s float64) (x, y float64), w, h float64, consts []expr.Const) (func(float64) float64, error) {
	e, err := expr.CompileWith(src, consts, formulaVars...)
	if err != nil {
		var xe *expr.Error
		if errors.As(err, &xe) {
			return nil, &Error{Path: path, Col: xe.Col, Msg: xe.Msg}
		}
		return nil, Errorf(path, "%v", err)
	}
	if v, ok := e.Const(); ok {
		return func(float64) float64 { return v }, nil
	}
	return func(s float64) float64 {
		x, y := point(s)
		vals := [5]float64{x, y, s, w, h}
		return e.Eval(vals[:])
	}, nil
}
