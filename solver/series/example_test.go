package series_test

import (
	"fmt"

	"edgewise/solver/problem"
	"edgewise/solver/series"
)

// A square plate with the top edge at 100 and the other three at 0: the
// centre is 25 exactly (the four rotations add up to the uniform case),
// and the flow through the top edge is infinite (the value jumps at its
// corners).
func ExampleSolve() {
	p := &problem.Problem{W: 1, H: 1, Kx: 1, Ky: 1}
	for _, e := range problem.Sides {
		p.Edges[e] = problem.Edge{Kind: problem.Value, F: problem.Const(0)}
	}
	p.Edges[problem.Top].F = problem.Const(100)
	s, err := series.Solve(p, series.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	u, _, _ := s.At(0.5, 0.5)
	fmt.Printf("centre %.9f\n", u)
	_, finite := s.Flow(problem.Top)
	fmt.Println("top flow finite:", finite)
	fmt.Println(s.Warnings()[0].Text)
	// Output:
	// centre 25.000000000
	// top flow finite: false
	// flow through the top edge is infinite: the value jumps from 100 to 0 at the top-right corner
}

// An insulated bar with a heat source and one face losing heat by
// convection balances: the inflows plus the source add up to zero.
func ExampleSolution_Flow() {
	p := &problem.Problem{W: 0.2, H: 0.05, Kx: 15, Ky: 15, Source: 2e5}
	for _, e := range problem.Sides {
		p.Edges[e] = problem.Edge{Kind: problem.Flux, F: problem.Const(0)}
	}
	p.Edges[problem.Top] = problem.Edge{Kind: problem.Convection, Hc: 40, F: problem.Const(20)}
	s, err := series.Solve(p, series.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	top, _ := s.Flow(problem.Top)
	fmt.Printf("source %.1f W/m, top %.1f W/m\n", p.Source*p.W*p.H, top)
	// Output:
	// source 2000.0 W/m, top -2000.0 W/m
}
