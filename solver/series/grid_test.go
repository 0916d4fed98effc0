package series

import (
	"fmt"
	"math"
	"runtime"
	"testing"

	"edgewise/solver/problem"
)

// Grid must agree with At at every node (same series, different summation:
// transforms and recurrences vs direct sums). Tolerance: 1e-9 of the scale
// for u, 1e-6 relative to the largest gradient for the derivatives (the
// per-row truncation keeps terms by their size in u).
func TestGridMatchesAt(t *testing.T) {
	defer func(m int) { maxTab = m }(maxTab)
	for name, p := range gridCases() {
		for _, mt := range []int{512, 3} { // tables, then mostly rotations
			maxTab = mt
			testGridAgainstAt(t, name, p)
		}
	}
}

// gridCases are the grid tests' problems: value edges only, wide (the
// sine pairs) and tall with a jump at every corner, and mixed kinds with
// a source (the separable products).
func gridCases() map[string]*problem.Problem {
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
	return cases
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

// The grid's rows and columns are shared among the workers; every node
// must get its additions in the same order whatever their number, so the
// grid is the same bit for bit on one processor and on several (the sine
// pairs both ways, with rows summed by transforms near the loaded edges
// and from the tables farther in; the pieces; the separable products).
func TestGridSameOnAnyWorkers(t *testing.T) {
	defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(1))
	for name, p := range gridCases() {
		s := mustSolve(t, p, Options{})
		for _, sz := range [][2]int{{256, 128}, {77, 201}, {3, 2}} {
			nx, ny := sz[0], sz[1]
			n := (nx + 1) * (ny + 1)
			var want [3][]float64
			for _, procs := range []int{1, 2, 3, 5} {
				runtime.GOMAXPROCS(procs)
				got := [3][]float64{make([]float64, n), make([]float64, n), make([]float64, n)}
				s.Grid(nx, ny, got[0], got[1], got[2])
				if procs == 1 {
					want = got
					continue
				}
				for a := range got {
					for k := range got[a] {
						if math.Float64bits(got[a][k]) != math.Float64bits(want[a][k]) {
							t.Fatalf("%s %dx%d on %d processors: array %d node %d is %v, on one %v", name, nx, ny, procs, a, k, got[a][k], want[a][k])
						}
					}
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

// classicalTerms is the largest term index the classical series of the
// benchmark case needs for an error below 1e-6 at distance d from every
// edge: with edge values up to 100 the tail after term n is below
// (4*100/(n pi)) exp(-n pi d) / (1 - exp(-2 pi d)).
func classicalTerms(d float64) int {
	n := 1
	for 400/(float64(n)*math.Pi)*math.Exp(-float64(n)*math.Pi*d)/(1-math.Exp(-2*math.Pi*d)) > 1e-6 {
		n += 2
	}
	return n
}

// BenchmarkNaiveClassical: the textbook way, the classical series of each
// edge (no corner treatment, so as many terms as 1e-6 at distance d from
// the edges needs, see classicalTerms: d = 0.02, or d = 1/512, the first
// interior row of the 513 x 513 grid) summed by the naive double loop over
// points and terms, on n x n nodes; scale by (513/n)^2 to compare with
// BenchmarkSolveGrid/513.
func BenchmarkNaiveClassical(b *testing.B) {
	vals := [4]float64{0, 50, 100, 20}
	for _, c := range []struct {
		name string
		d    float64
		n    int
	}{{"d=0.02/33", 0.02, 33}, {"d=0.02/65", 0.02, 65}, {"d=1|512/33", 1.0 / 512, 33}} {
		terms, n := classicalTerms(c.d), c.n
		b.Run(c.name, func(b *testing.B) {
			b.ReportMetric(float64((terms+1)/2), "odd-terms/edge")
			u := make([]float64, n*n)
			for b.Loop() {
				for j := 0; j < n; j++ {
					for i := 0; i < n; i++ {
						x, y := float64(i)/float64(n-1), float64(j)/float64(n-1)
						sum := 0.0
						for e, v := range vals {
							X, Y := rotateToTop(problem.Side(e), x, y)
							for k := 1; k <= terms; k += 2 {
								a := float64(k) * math.Pi
								sum += v * 4 / a * math.Sin(a*X) * math.Exp(a*(Y-1)) * (1 - math.Exp(-2*a*Y)) / (1 - math.Exp(-2*a))
							}
						}
						u[j*n+i] = sum
					}
				}
			}
		})
	}
}

// rotateToTop maps (x, y) in the unit square so that edge e becomes the
// top edge.
func rotateToTop(e problem.Side, x, y float64) (X, Y float64) {
	switch e {
	case problem.Bottom:
		return 1 - x, 1 - y
	case problem.Left:
		return y, 1 - x
	case problem.Right:
		return 1 - y, x
	}
	return x, y
}
