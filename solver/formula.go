package solver

import (
	"strconv"
	"strings"
)

// compileFormula turns the text of an edge formula into a function of the
// distance s along the edge. (Constant formulas only, until the formula
// language lands.)
func compileFormula(src, path string, _ func(s float64) (x, y float64), _, _ float64) (func(float64) float64, error) {
	v, err := strconv.ParseFloat(strings.TrimSpace(src), 64)
	if err != nil {
		return nil, errorf(path, "only plain numbers are accepted for now, got %q", src)
	}
	return func(float64) float64 { return v }, nil
}
