package series

import (
	"errors"

	"edgewise/solver/problem"
)

// solveMixed solves a problem with mixed edges.
func solveMixed(p *problem.Problem, opt Options) (Field, error) {
	return nil, errors.New("mixed conditions along one edge are not solved yet")
}
