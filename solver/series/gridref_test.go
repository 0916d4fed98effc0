package series

import (
	"fmt"
	"math"
	"math/rand"
	"slices"
	"testing"

	"edgewise/solver/problem"
)

// The fast grid (blocked kernels, shared logarithms, row recurrences,
// parallel rows) must give the numbers the term-by-term grid gave
// (gridold_test.go) to rounding: the same series with the same per-row
// cut-offs, summed in another order. Tolerance 1e-12 of the field's range
// on the grid for u, and of the largest gradient for ux and uy (away from
// the nodes where the gradient is unbounded; NaN where the reference has
// NaN). Cases: seeded random problems of every kind (breaks, weak exchange,
// orthotropy, sources), random mixed edges, the benchmark's two-pool
// problem; grids from 1 x 1 to 200 x 60, with and without gradients.
func TestGridMatchesReference(t *testing.T) {
	type tc struct {
		name string
		pr   *problem.Problem
	}
	var cases []tc
	rng := rand.New(rand.NewSource(13))
	nRand, nMixed := 24, 12
	if raceOn {
		nRand, nMixed = 4, 2
	}
	for i := 0; i < nRand; i++ {
		cases = append(cases, tc{fmt.Sprintf("random %d", i), randomCase(rng)})
	}
	for i := 0; i < nMixed; i++ {
		cases = append(cases, tc{fmt.Sprintf("mixed %d", i), randomMixedCase(rng)})
	}
	cases = append(cases, tc{"two pools", benchMixedProblem()},
		tc{"steps", stepProblem(1, 1)}, tc{"steps, orthotropic", stepProblem(2, 0.5)})
	kinds := map[string]int{} // fields compared, by type
	worstU, worstG := 0.0, 0.0
	var rangeU []float64 // per comparison: largest |difference| over the range of u
	sizes := [][2]int{{1, 1}, {2, 1}, {7, 3}, {40, 25}, {200, 60}, {65, 129}}
	for _, c := range cases {
		breaks, err := FindBreaks(c.pr)
		if err != nil {
			continue // refused data: nothing to grid
		}
		f, err := SolveBreaks(c.pr, breaks, Options{MaxTerms: 1024})
		if err != nil {
			if _, ok := err.(*ImbalanceError); ok {
				continue
			}
			t.Errorf("%s: %v", c.name, err)
		}
		kinds[fmt.Sprintf("%T", f)]++
		for _, sz := range sizes {
			nx, ny := sz[0], sz[1]
			n := (nx + 1) * (ny + 1)
			mu, mg := seriesMagnitude(f, nx, ny)
			for _, grad := range []int{0, 1, 2, 3} { // none, ux, uy, both
				u, ux, uy := make([]float64, n), make([]float64, n), make([]float64, n)
				ru, rux, ruy := make([]float64, n), make([]float64, n), make([]float64, n)
				if grad&1 == 0 {
					ux, rux = nil, nil
				}
				if grad&2 == 0 {
					uy, ruy = nil, nil
				}
				f.Grid(nx, ny, u, ux, uy)
				refFieldGrid(f, nx, ny, ru, rux, ruy)
				lo, hi, gmax := math.Inf(1), math.Inf(-1), 0.0
				for k := range ru {
					lo, hi = min(lo, ru[k]), max(hi, ru[k])
				}
				for _, g := range [][]float64{rux, ruy} {
					for _, v := range g {
						if !math.IsNaN(v) && !math.IsInf(v, 0) {
							gmax = max(gmax, math.Abs(v))
						}
					}
				}
				tolU := 1e-12 * max(hi-lo, math.Abs(hi), math.Abs(lo), 1e-300)
				tolG := 1e-12 * max(gmax, 1e-300)
				worstU = max(worstU, diffRatio(u, ru, tolU, mu))
				rangeU = append(rangeU, diffRatio(u, ru, tolU/1e-12, nil))
				if r := rangeU[len(rangeU)-1]; r > 1e-12 && grad == 3 && nx == 200 {
					// only where the terms dwarf the field (the random mixed
					// cases' families reach 1e6 to 1e10 times the range)
					t.Logf("%s: difference %.2g of the range, largest sum of |term| %.2g ranges", c.name, r, slices.Max(mu)*1e-12/tolU)
				}
				worstG = max(worstG, diffRatio(ux, rux, tolG, mg), diffRatio(uy, ruy, tolG, mg))
				for k := range ru {
					if !(math.Abs(u[k]-ru[k]) <= tolU+roundTol*at(mu, k)) {
						t.Fatalf("%s %dx%d grad %d node %d: u %.17g, reference %.17g (tolerance %.3g)", c.name, nx, ny, grad, k, u[k], ru[k], tolU)
					}
				}
				for gi, g := range [][2][]float64{{ux, rux}, {uy, ruy}} {
					for k := range g[1] {
						a, b := g[0][k], g[1][k]
						if math.IsNaN(b) || math.IsInf(b, 0) {
							if !math.IsNaN(a) && !math.IsInf(a, 0) {
								t.Fatalf("%s %dx%d node %d: gradient %d %g, reference %g", c.name, nx, ny, k, gi, a, b)
							}
							continue
						}
						if !(math.Abs(a-b) <= tolG+roundTol*at(mg, k)) {
							t.Fatalf("%s %dx%d grad %d node %d: gradient %d %.17g, reference %.17g (tolerance %.3g)", c.name, nx, ny, grad, k, gi, a, b, tolG)
						}
					}
				}
			}
		}
	}
	slices.Sort(rangeU)
	t.Logf("fields compared: %v; largest difference %.3g of its tolerance (u), %.3g (gradient); u differences over the range: median %.2g, 90%% %.2g, largest %.2g",
		kinds, worstU, worstG, rangeU[len(rangeU)/2], rangeU[len(rangeU)*9/10], rangeU[len(rangeU)-1])
	if kinds["*series.mixedField"] < 2 || kinds["*series.Solution"] < 2 || kinds["*series.breakField"] < 2 {
		t.Errorf("too few cases compared: %v", kinds)
	}
}

// roundTol is the rounding allowed, relative to the sum of |term| of the
// series: each grid sums up to a thousand terms per sub-problem, in its
// own order, so each carries about sqrt(1000) units of rounding (7e-15)
// of that sum; the cases reach 6e-15 (a thin strip whose four series of
// 1e5 cancel to 5).
const roundTol = 2e-14

// randomMixedCase: one or two edges of two to four parts of random kinds
// (value, flux, convection with h of its own) and random data, the other
// edges of random kinds.
func randomMixedCase(rng *rand.Rand) *problem.Problem {
	p := randomCase(rng)
	mixed := []problem.Side{problem.Side(rng.Intn(4))}
	if rng.Intn(2) == 0 {
		mixed = append(mixed, (mixed[0]+problem.Side(1+rng.Intn(3)))%4)
	}
	for _, side := range mixed {
		L := p.Length(side)
		np := 2 + rng.Intn(3)
		var e problem.Edge
		for i := 0; i < np; i++ {
			kind := problem.Kind(rng.Intn(3))
			if i > 0 && kind == e.Parts[i-1].Kind {
				kind = (kind + 1) % 3
			}
			v := rng.NormFloat64() * 20
			part := problem.Part{Kind: kind, F: konst(v)}
			if kind == problem.Convection {
				part.Hc = konst(math.Pow(10, rng.Float64()*2-1) * p.Kx / L)
			}
			if i < np-1 {
				part.To = L * (float64(i) + 0.3 + 0.4*rng.Float64()) / float64(np)
			}
			e.Parts = append(e.Parts, part)
		}
		e.Kind, e.F = e.Parts[0].Kind, e.Parts[0].F
		p.Edges[side] = e
	}
	return p
}

// diffRatio returns the largest |a - b| over finite b, over its
// tolerance tol + roundTol mag.
func diffRatio(a, b []float64, tol float64, mag []float64) float64 {
	worst := 0.0
	for k := range b {
		if !math.IsNaN(b[k]) && !math.IsInf(b[k], 0) {
			m := 0.0
			if mag != nil {
				m = mag[k]
			}
			worst = max(worst, math.Abs(a[k]-b[k])/(tol+roundTol*m))
		}
	}
	return worst
}

// seriesMagnitude returns, per node, the sum over the series terms the
// grid keeps of |term| for u and for the gradient (|X_k| <= 1): the
// scale of the rounding of any order of summation. Nil for fields
// without a series of their own.
func seriesMagnitude(f Field, nx, ny int) (mu, mg []float64) {
	var s *Solution
	switch f := f.(type) {
	case *Solution:
		s = f
	case *weakField:
		return seriesMagnitude(f.v, nx, ny)
	case *breakField:
		return seriesMagnitude(f.v, nx, ny)
	case *mixedField:
		mu, mg = seriesMagnitude(f.inner, nx, ny)
		if f.ms == nil {
			return mu, mg
		}
		// the family members: sum of |x_k F_k| and of |x_k grad F_k|
		for _, me := range f.ms.edges {
			fm := me.fam
			if fm == nil {
				continue
			}
			v, vx, vy := make([]float64, fm.n), make([]float64, fm.n), make([]float64, fm.n)
			for j := 0; j <= ny; j++ {
				for i := 0; i <= nx; i++ {
					fm.xy(float64(i)*f.pr.W/float64(nx), float64(j)*f.pr.H/float64(ny), v, vx, vy)
					k := j*(nx+1) + i
					for m := range v {
						c := math.Abs(f.x[me.famOff+m])
						mu[k] += c * math.Abs(v[m])
						mg[k] += c * (math.Abs(vx[m]) + math.Abs(vy[m]))
					}
				}
			}
		}
		return mu, mg
	default:
		return nil, nil
	}
	nn := (nx + 1) * (ny + 1)
	mu, mg = make([]float64, nn), make([]float64, nn)
	cut := 0.025 * s.est
	for _, sp := range s.subs {
		vert := sp.side == problem.Left || sp.side == problem.Right
		far := sp.side == problem.Top || sp.side == problem.Right
		M, rows := nx, ny
		if vert {
			M, rows = ny, nx
		}
		a, b := make([]float64, sp.n), make([]float64, sp.n)
		for r := 0; r <= rows; r++ {
			rr := r
			if far {
				rr = rows - r
			}
			t := sp.D * float64(rr) / float64(rows)
			n := sp.rowTerms(t, cut)
			sp.refRowY(t, n, a, b, false, 1)
			su, sg := 0.0, 0.0
			for k := 0; k < n; k++ {
				su += math.Abs(a[k])
				sg += math.Abs(b[k]) + math.Abs(a[k]*sp.b.Lambda[k])
			}
			for i := 0; i <= M; i++ {
				g := gidx(vert, nx, i, r)
				mu[g] += su
				mg[g] += sg
			}
		}
	}
	return mu, mg
}

func at(s []float64, k int) float64 {
	if s == nil {
		return 0
	}
	return s[k]
}

// BenchmarkMixedGrid513: the grid alone of BenchmarkMixedSolve513's
// problem, 513 x 513 nodes with gradients, by Field.Grid and by the
// term-by-term reference (run both in one process to compare them on a
// busy machine).
func BenchmarkMixedGrid513(b *testing.B) {
	pr := benchMixedProblem()
	f := solveForTest(b, pr)
	u, ux, uy := make([]float64, 513*513), make([]float64, 513*513), make([]float64, 513*513)
	for _, c := range []struct {
		name string
		grid func(nx, ny int, u, ux, uy []float64)
	}{{"fast", f.Grid}, {"reference", func(nx, ny int, u, ux, uy []float64) { refFieldGrid(f, nx, ny, u, ux, uy) }}} {
		b.Run(c.name, func(b *testing.B) {
			for b.Loop() {
				c.grid(512, 512, u, ux, uy)
			}
		})
	}
}

// sub.at takes the exponentials of evenly spaced eigenvalues by a product
// per term between exact ones (expEvery): it must agree with math.Exp for
// every term to rounding, 1e-14 of the sum of |term| (seeded places, every
// sub-problem of problems whose edges give evenly spaced eigenvalues).
func TestSubAtStepExponentials(t *testing.T) {
	rng := rand.New(rand.NewSource(5))
	kinds := []problem.Kind{problem.Value, problem.Flux}
	checked := 0
	for c := 0; c < 8; c++ {
		p := &problem.Problem{W: 0.5 + 3*rng.Float64(), H: 0.5 + 3*rng.Float64(), Kx: 1, Ky: 1}
		for _, e := range problem.Sides {
			v := rng.NormFloat64() * 10
			p.Edges[e] = problem.Edge{Kind: kinds[rng.Intn(2)], F: func(s float64) float64 { return v * (1 + s*s) }}
		}
		p.Edges[problem.Bottom].Kind = problem.Value
		s, err := Solve(p, Options{})
		if err != nil {
			t.Fatal(err)
		}
		for _, sp := range s.subs {
			if !sp.b.Uniform {
				continue
			}
			checked++
			for k := 0; k < 50; k++ {
				ls, lt := sp.L*rng.Float64(), sp.D*rng.Float64()
				u, us, ut := sp.at(ls, lt)
				var wu, wus, wut, mag float64
				for i := 0; i < sp.rowTerms(lt, 0); i++ {
					x, dx := sp.b.X(i, ls)
					lam := sp.b.Lambda[i]
					var y, dy float64
					if sp.zero && i == 0 {
						y, dy = sp.A[0]+sp.B[0]*lt, sp.B[0]
					} else {
						ea, eb := math.Exp(-lam*lt), math.Exp(-lam*(2*sp.D-lt))
						y, dy = sp.A[i]*ea+sp.B[i]*eb, lam*(sp.B[i]*eb-sp.A[i]*ea)
					}
					wu, wus, wut = wu+x*y, wus+dx*y, wut+x*dy
					mag += math.Abs(y) + math.Abs(dx*y) + math.Abs(dy)
				}
				if d := max(math.Abs(u-wu), math.Abs(us-wus), math.Abs(ut-wut)); !(d <= 1e-14*mag) {
					t.Fatalf("case %d %v (%g, %g): at (%.17g, %.17g, %.17g), direct (%.17g, %.17g, %.17g): %.3g of %.3g",
						c, sp.side, ls, lt, u, us, ut, wu, wus, wut, d, mag)
				}
			}
		}
	}
	if checked < 8 {
		t.Errorf("only %d sub-problems with evenly spaced eigenvalues", checked)
	}
}
