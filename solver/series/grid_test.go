package series

import (
	"fmt"
	"math"
	"testing"

	"edgewise/solver/problem"
)

// Grid must agree with At at every node (same series, different summation:
// transforms and recurrences vs direct sums). Tolerance: 1e-9 of the scale
// for u, 1e-6 relative to the largest gradient for the derivatives (the
// per-row truncation keeps terms by their size in u).
func TestGridMatchesAt(t *testing.T) {
	cases := map[string]*problem.Problem{
		"values with jumps":              valueBox(2, 1, 0, 50, 100, 0),
		"values, all corners jump, tall": valueBox(0.5, 1.7, 10, 50, 100, -3),
	}
	mixed := &problem.Problem{W: 1, H: 1.5, Kx: 3, Ky: 1, Source: 2}
	mixed.Edges[problem.Bottom] = problem.Edge{Kind: problem.Value, F: func(s float64) float64 { return 10 * math.Sin(3*s) }}
	mixed.Edges[problem.Right] = problem.Edge{Kind: problem.Convection, Hc: 4, F: problem.Const(20)}
	mixed.Edges[problem.Top] = problem.Edge{Kind: problem.Flux, F: func(s float64) float64 { return s * s }}
	mixed.Edges[problem.Left] = problem.Edge{Kind: problem.Value, F: problem.Const(5)}
	cases["mixed"] = mixed
	defer func(m int) { maxTab = m }(maxTab)
	for name, p := range cases {
		for _, mt := range []int{512, 3} { // tables, then mostly rotations
			maxTab = mt
			testGridAgainstAt(t, name, p)
		}
	}
}

func testGridAgainstAt(t *testing.T, name string, p *problem.Problem) {
	t.Helper()
	s := mustSolve(t, p, Options{})
	for _, sz := range [][2]int{{1, 1}, {2, 1}, {1, 3}, {8, 5}, {16, 8}, {33, 20}, {64, 40}} {
		nx, ny := sz[0], sz[1]
		n := (nx + 1) * (ny + 1)
		u, ux, uy := make([]float64, n), make([]float64, n), make([]float64, n)
		s.Grid(nx, ny, u, ux, uy)
		u2 := make([]float64, n)
		s.Grid(nx, ny, u2, nil, nil) // value-only path
		for k := range u {
			if math.Abs(u2[k]-u[k]) > 1e-9*s.Scale() {
				t.Fatalf("%s %dx%d node %d: u-only grid %.12g, with gradient %.12g", name, nx, ny, k, u2[k], u[k])
			}
		}
		gmax := 0.0
		for k := range ux {
			if !math.IsNaN(ux[k]) {
				gmax = math.Max(gmax, math.Hypot(ux[k], uy[k]))
			}
		}
		for j := 0; j <= ny; j++ {
			for i := 0; i <= nx; i++ {
				x, y := p.W*float64(i)/float64(nx), p.H*float64(j)/float64(ny)
				a, b, c := s.At(x, y)
				k := j*(nx+1) + i
				if math.Abs(a-u[k]) > 1e-9*s.Scale() {
					t.Fatalf("%s %dx%d node (%d,%d): grid u %.12g, At %.12g", name, nx, ny, i, j, u[k], a)
				}
				if math.IsNaN(b) && math.IsNaN(ux[k]) {
					continue
				}
				if math.Abs(b-ux[k]) > 1e-6*gmax || math.Abs(c-uy[k]) > 1e-6*gmax {
					t.Fatalf("%s %dx%d node (%d,%d): grid grad (%g,%g), At (%g,%g)", name, nx, ny, i, j, ux[k], uy[k], b, c)
				}
			}
		}
	}
}

func benchCase() *problem.Problem { return valueBox(1, 1, 0, 50, 100, 20) }

// BenchmarkSolveGrid: Solve + Grid (u only) on n x n nodes, four value
// edges with jumps at all corners.
func BenchmarkSolveGrid(b *testing.B) {
	for _, n := range []int{65, 129, 257, 513, 1025} {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			p := benchCase()
			u := make([]float64, n*n)
			for b.Loop() {
				s, err := Solve(p, Options{Tol: 1e-8})
				if err != nil {
					b.Fatal(err)
				}
				s.Grid(n-1, n-1, u, nil, nil)
			}
		})
	}
}

// BenchmarkNaive: the same series summed by the naive double loop over
// points and all terms (sin and exp per term and point), on n x n nodes;
// scale by (513/n)^2 to compare with BenchmarkSolveGrid/513.
func BenchmarkNaive(b *testing.B) {
	for _, n := range []int{33, 65} {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			p := benchCase()
			u := make([]float64, n*n)
			for b.Loop() {
				s, err := Solve(p, Options{Tol: 1e-8})
				if err != nil {
					b.Fatal(err)
				}
				s.naiveGrid(n-1, n-1, u)
			}
		})
	}
}

func (s *Solution) naiveGrid(nx, ny int, u []float64) {
	m := s.m
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			x, y := m.W*float64(i)/float64(nx), m.H*float64(j)/float64(ny)
			v, _, _ := s.known(x, y, -1)
			for _, sp := range s.subs {
				ls, lt := sp.local(x, y, m.W, m.H)
				for k := 0; k < sp.n; k++ {
					xk, _ := sp.b.X(k, ls)
					lam := sp.b.Lambda[k]
					v += xk * (sp.A[k]*math.Exp(-lam*lt) + sp.B[k]*math.Exp(-lam*(2*sp.D-lt)))
				}
			}
			u[j*(nx+1)+i] = v
		}
	}
}

// BenchmarkSolveGridMixed: Solve + Grid with gradients, a value, a flux and
// two convection edges with a source (the separable, non-sine path).
func BenchmarkSolveGridMixed(b *testing.B) {
	for _, n := range []int{65, 129, 257, 513} {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			p := &problem.Problem{W: 0.4, H: 0.15, Kx: 167, Ky: 167, Source: 1e4}
			p.Edges[problem.Bottom] = problem.Edge{Kind: problem.Value, F: func(s float64) float64 { return 180 - 40*(2*s/0.4-1)*(2*s/0.4-1) }}
			p.Edges[problem.Top] = problem.Edge{Kind: problem.Convection, Hc: 15, F: problem.Const(30)}
			p.Edges[problem.Left] = problem.Edge{Kind: problem.Flux, F: problem.Const(0)}
			p.Edges[problem.Right] = problem.Edge{Kind: problem.Convection, Hc: 200, F: problem.Const(35)}
			u, ux, uy := make([]float64, n*n), make([]float64, n*n), make([]float64, n*n)
			for b.Loop() {
				s, err := Solve(p, Options{})
				if err != nil {
					b.Fatal(err)
				}
				s.Grid(n-1, n-1, u, ux, uy)
			}
		})
	}
}
