package fdcheck

import (
	"math"
	"testing"

	"edgewise/solver/problem"
)

// A heater strip (a step of flux) puts exactly its strength times its
// width into the grid when the problem names where the data jumps: the
// segments the steps cut are averaged, not sampled (exact integral:
// 3000 W/m2 over 0.07 m = 210 W/m). Without the breaks a sample counts a
// whole segment on one side of each step.
func TestFluxStepIntegratedExactly(t *testing.T) {
	strip := func(s float64) float64 {
		if s >= 0.1 && s <= 0.17 {
			return 3000
		}
		return 0
	}
	p := &problem.Problem{W: 0.3, H: 0.2, Kx: 50, Ky: 50}
	p.Edges[problem.Bottom] = problem.Edge{Kind: problem.Flux, F: strip}
	p.Edges[problem.Top] = problem.Edge{Kind: problem.Flux, F: problem.Const(0)}
	p.Edges[problem.Right] = problem.Edge{Kind: problem.Flux, F: problem.Const(0)}
	p.Edges[problem.Left] = problem.Edge{Kind: problem.Value, F: problem.Const(30)}
	for _, n := range []int{16, 24, 37} {
		g, err := Solve(p, n, n*2/3)
		if err != nil {
			t.Fatal(err)
		}
		without := g.Inflow[problem.Bottom]
		p.Edges[problem.Bottom].Breaks = []float64{0.1, 0.17}
		g, err = Solve(p, n, n*2/3)
		p.Edges[problem.Bottom].Breaks = nil
		if err != nil {
			t.Fatal(err)
		}
		if got := g.Inflow[problem.Bottom]; math.Abs(got-210) > 1e-9 {
			t.Errorf("n=%d: strip puts in %.12g, want 210 (without breaks %.6g)", n, got, without)
		}
	}
}

// An all-flux problem that balances exactly (bottom s^2 in, a uniform
// W^2/3 out through the top: both integrate to W^3/3) does not balance
// under the grid's trapezoid rule, which overestimates the integral of s^2
// by W h^2/6. Richardson refuses it; RichardsonBalanced, told the balance
// is known, spreads that error and solves, with the mean at zero.
func TestRichardsonBalanced(t *testing.T) {
	const W, H = 2.0, 1.0
	p := &problem.Problem{W: W, H: H, Kx: 3, Ky: 3}
	p.Edges[problem.Bottom] = problem.Edge{Kind: problem.Flux, F: func(s float64) float64 { return s * s }}
	p.Edges[problem.Top] = problem.Edge{Kind: problem.Flux, F: problem.Const(-W * W / 3)}
	p.Edges[problem.Left] = problem.Edge{Kind: problem.Flux, F: problem.Const(0)}
	p.Edges[problem.Right] = problem.Edge{Kind: problem.Flux, F: problem.Const(0)}
	if _, _, err := Richardson(p, 24, 12); err == nil {
		t.Fatal("Richardson balanced the trapezoid rule's error")
	}
	g, _, err := RichardsonBalanced(p, 24, 12)
	if err != nil {
		t.Fatal(err)
	}
	// tolerance: rounding of a mean of values of order 0.1
	if math.Abs(g.Mean) > 1e-12 {
		t.Errorf("mean %g, want 0", g.Mean)
	}
	// the inflows balance to the trapezoid rule's error, W h^2/6 with
	// h = W/48 on the fine grid, Richardson removing most of it
	if in := g.Inflow[problem.Bottom] + g.Inflow[problem.Top]; math.Abs(in) > W*math.Pow(W/48, 2)/6 {
		t.Errorf("net inflow %g", in)
	}
}
