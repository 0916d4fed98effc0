package fdcheck_test

import (
	"fmt"

	"edgewise/solver/fdcheck"
	"edgewise/solver/problem"
)

// A plate 2 wide and 1 high with its top edge at 1 and the other three at
// 0 (the set-up of the Incropera & DeWitt worked problem in CHECKS.md,
// theta(1, 0.5) = 0.445).
func ExampleRichardson() {
	p := &problem.Problem{W: 2, H: 1, Kx: 1, Ky: 1}
	for _, e := range problem.Sides {
		p.Edges[e] = problem.Edge{Kind: problem.Value, F: problem.Const(0)}
	}
	p.Edges[problem.Top].F = problem.Const(1)
	nx, ny := problem.Proportional(p.W, p.H, 32)
	g, indicator, err := fdcheck.Richardson(p, nx, ny)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("grid %d x %d: theta(1, 0.5) = %.4f, indicator %.0e\n", nx, ny, g.At(1, 0.5), indicator)
	// Output:
	// grid 32 x 16: theta(1, 0.5) = 0.4451, indicator 5e-03
}
