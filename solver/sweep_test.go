package solver

import (
	"fmt"
	"math"
	"testing"

	"edgewise/solver/fdcheck"
	"edgewise/solver/problem"
)

// sweepProblem builds the test problem for one combination of edge kinds:
// smooth but non-trivial data on every edge (values that do not agree at
// the corners, fluxes, convection with Biot numbers k/(h L) from about 0.3
// to 3 and a varying ambient) and a uniform source. When no edge fixes the
// level (all flux, or convection with h = 0), the fluxes are made to balance
// the source exactly, so that a steady state exists.
func sweepProblem(kinds [4]problem.Kind) *problem.Problem {
	p := &problem.Problem{W: 0.3, H: 0.2, Kx: 12, Ky: 12, Source: 4000}
	fixed := false
	for i, k := range kinds {
		if k != problem.Flux {
			fixed = true
		}
		side := problem.Side(i)
		L := p.Length(side)
		phase := float64(i)
		switch k {
		case problem.Value:
			base := 40 + 15*phase
			p.Edges[side] = problem.Edge{Kind: k, F: func(s float64) float64 {
				return base + 20*math.Sin(math.Pi*s/L+phase) + 10*s/L
			}}
		case problem.Flux:
			p.Edges[side] = problem.Edge{Kind: k, F: func(s float64) float64 {
				return 300 * math.Cos(2*math.Pi*s/L+phase)
			}}
		case problem.Convection:
			p.Edges[side] = problem.Edge{Kind: k, Hc: 40 + 60*phase, F: func(s float64) float64 {
				return 20 + 5*s/L
			}}
		}
	}
	if !fixed {
		// all flux: a constant inflow on every edge that carries the source
		// out; the cosine parts integrate to zero over each edge
		q := -p.Source * p.W * p.H / (2 * (p.W + p.H))
		for _, side := range problem.Sides {
			f := p.Edges[side].F
			p.Edges[side].F = func(s float64) float64 { return q + f(s) }
		}
	}
	return p
}

// Every one of the 81 combinations of edge kinds, solved by the series,
// agrees with the independent finite-difference solution (Richardson on
// two grids) away from the corners, and its edge flows balance the source.
func TestAllKindCombinationsAgainstFiniteDifferences(t *testing.T) {
	if raceEnabled {
		// the race detector slows this sweep tenfold; make test runs it
		// again without -race (target test-sweep)
		t.Skip("runs without -race in make test-sweep")
	}
	const n = 48
	worst, worstName := 0.0, ""
	for c := 0; c < 81; c++ {
		var kinds [4]problem.Kind
		name := ""
		for i, v := 0, c; i < 4; i, v = i+1, v/3 {
			kinds[i] = problem.Kind(v % 3)
			name += fmt.Sprintf("%s=%v ", problem.Side(i), kinds[i])
		}
		p := sweepProblem(kinds)
		f, err := solveSeries(p)
		if err != nil {
			t.Errorf("%s: %v", name, err)
			continue
		}
		nx, ny := problem.Proportional(p.W, p.H, n)
		g, _, err := fdcheck.Richardson(p, nx, ny)
		if err != nil {
			t.Errorf("%s: finite differences: %v", name, err)
			continue
		}
		// compare away from the corners (a fifth of the shorter side),
		// where corner singularities slow the finite differences down
		scale, diff := 0.0, 0.0
		for j := 0; j <= ny; j++ {
			for i := 0; i <= nx; i++ {
				x, y := float64(i)*p.W/float64(nx), float64(j)*p.H/float64(ny)
				if nearCorner(p, x, y, 0.2*min(p.W, p.H)) {
					continue
				}
				u, _, _ := f.At(x, y)
				fd := g.U[j*(nx+1)+i]
				scale = max(scale, math.Abs(fd))
				diff = max(diff, math.Abs(u-fd))
			}
		}
		rel := diff / scale
		if rel > worst {
			worst, worstName = rel, name
		}
		// Tolerance: Richardson-extrapolated finite differences on a 48
		// interval grid are good to about 1e-5 of the field away from the
		// corners (seen: 7.8e-6); 1e-4 leaves room for the corner pollution
		// of the extrapolation.
		if rel > 1e-4 {
			t.Errorf("%s: series and finite differences differ by %.3g of the field", name, rel)
		}
		// conservation: inflows + source = 0 when every flow is finite
		sum, total, finite := p.Source*p.W*p.H, math.Abs(p.Source*p.W*p.H), true
		for _, side := range problem.Sides {
			q, ok := f.Flow(side)
			finite = finite && ok
			sum += q
			total += math.Abs(q)
		}
		if finite && math.Abs(sum) > 1e-6*total {
			t.Errorf("%s: flows do not balance: %.3g of %.3g", name, sum, total)
		}
	}
	t.Logf("largest difference from finite differences: %.3g of the field (%s)", worst, worstName)
}

func nearCorner(p *problem.Problem, x, y, d float64) bool {
	for _, c := range [4][2]float64{{0, 0}, {p.W, 0}, {p.W, p.H}, {0, p.H}} {
		if math.Hypot(x-c[0], y-c[1]) < d {
			return true
		}
	}
	return false
}
