package spectral

import (
	"fmt"
	"math"
	"testing"

	"edgewise/solver/problem"
)

// exact is a smooth manufactured field: u, its gradient, on a problem
// with Kx, Ky and a source.
type exact struct {
	kx, ky, src float64
	alpha       float64 // exp(alpha x) cos(beta y) with kx alpha^2 = ky beta^2
}

func (e exact) beta() float64 { return e.alpha * math.Sqrt(e.kx/e.ky) }

func (e exact) u(x, y float64) float64 {
	return -e.src/(2*e.kx)*x*x + math.Exp(e.alpha*x)*math.Cos(e.beta()*y) + 0.3*x*y + 1.5
}

func (e exact) grad(x, y float64) (float64, float64) {
	b := e.beta()
	ex := math.Exp(e.alpha * x)
	return -e.src/e.kx*x + e.alpha*ex*math.Cos(b*y) + 0.3*y, -b*ex*math.Sin(b*y) + 0.3*x
}

// problemOf builds a problem whose edges of the given kinds carry the
// exact field's data (convection edges with coefficient hc).
func (e exact) problemOf(w, h float64, kinds [4]problem.Kind, hc float64) *problem.Problem {
	pr := &problem.Problem{W: w, H: h, Kx: e.kx, Ky: e.ky, Source: e.src}
	for _, side := range problem.Sides {
		side := side
		entering := func(s float64) float64 {
			x, y := pr.Point(side, s)
			gx, gy := e.grad(x, y)
			switch side {
			case problem.Bottom:
				return -e.ky * gy
			case problem.Top:
				return e.ky * gy
			case problem.Left:
				return -e.kx * gx
			}
			return e.kx * gx
		}
		ed := problem.Edge{Kind: kinds[side]}
		switch kinds[side] {
		case problem.Value:
			ed.F = func(s float64) float64 { return e.u(pr.Point(side, s)) }
		case problem.Flux:
			ed.F = entering
		case problem.Convection:
			ed.Hc = hc
			ed.F = func(s float64) float64 { return e.u(pr.Point(side, s)) + entering(s)/hc }
		}
		pr.Edges[side] = ed
	}
	return pr
}

// On smooth fields the error falls to rounding level with 24 intervals a
// side, for all 81 combinations of edge kinds, with orthotropy and a
// source; all-flux problems come out with mean 0.
func TestManufacturedAllKinds(t *testing.T) {
	kinds := []problem.Kind{problem.Value, problem.Flux, problem.Convection}
	e := exact{kx: 2, ky: 0.5, src: 3, alpha: 1.3}
	worst := 0.0
	for c := 0; c < 81; c++ {
		var k [4]problem.Kind
		for s, cc := 0, c; s < 4; s, cc = s+1, cc/3 {
			k[s] = kinds[cc%3]
		}
		pr := e.problemOf(1.5, 1, k, 4)
		f, err := Solve(pr, 24, 20)
		if err != nil {
			t.Fatal(err)
		}
		shift := 0.0
		if f.Floats {
			shift = meanOf(e, pr) // the exact field less its mean
		}
		for _, xy := range [][2]float64{{0.3, 0.2}, {1.5, 1}, {0, 0.5}, {0.75, 0}, {1.2, 0.9}} {
			d := math.Abs(f.At(xy[0], xy[1]) - (e.u(xy[0], xy[1]) - shift))
			worst = max(worst, d)
			// tolerance: the field's range is about 6; GLL with 24 nodes
			// resolves exp(1.95 x) to about 1e-12 of it
			if d > 1e-9 {
				t.Errorf("kinds %v at %v: error %g", k, xy, d)
			}
		}
	}
	t.Logf("worst error over 81 combinations: %.2g", worst)
}

// meanOf is the exact field's mean by a fine Gauss rule of our own (the
// tensor midpoint rule on 400 x 400 cells is not enough; use Simpson).
func meanOf(e exact, pr *problem.Problem) float64 {
	const n = 400
	s := 0.0
	simpson := func(i int) float64 {
		switch {
		case i == 0 || i == n:
			return 1
		case i%2 == 1:
			return 4
		}
		return 2
	}
	for j := 0; j <= n; j++ {
		for i := 0; i <= n; i++ {
			s += simpson(i) * simpson(j) * e.u(pr.W*float64(i)/n, pr.H*float64(j)/n)
		}
	}
	return s / (9 * n * n)
}

// The error falls faster than any power: from 8 to 16 intervals it falls
// by more than 1e4 (a second-order method would give 4).
func TestSpectralConvergence(t *testing.T) {
	e := exact{kx: 1, ky: 1, src: 0, alpha: 2}
	pr := e.problemOf(1, 1, [4]problem.Kind{problem.Value, problem.Convection, problem.Flux, problem.Value}, 3)
	errAt := func(n int) float64 {
		f, err := Solve(pr, n, n)
		if err != nil {
			t.Fatal(err)
		}
		worst := 0.0
		g := f.Grid(10, 10, nil)
		for j := 0; j <= 10; j++ {
			for i := 0; i <= 10; i++ {
				worst = max(worst, math.Abs(g[j*11+i]-e.u(float64(i)/10, float64(j)/10)))
			}
		}
		return worst
	}
	e8, e16 := errAt(8), errAt(16)
	if !(e16 < 1e-4*e8) || e16 > 1e-10 {
		t.Errorf("error at 8 intervals %g, at 16 %g: not spectral", e8, e16)
	}
}

// The GLL rule integrates polynomials up to degree 2n - 1 exactly, and the
// nodes are those of the published small rules (n = 2: 0; n = 3: ±1/sqrt 5;
// exact values, e.g. Abramowitz & Stegun 25.4.32).
func TestLobatto(t *testing.T) {
	for n := 2; n <= 60; n++ {
		x, w := lobatto(n)
		for deg := 0; deg <= 2*n-1; deg++ {
			s := 0.0
			for i := range x {
				s += w[i] * math.Pow(x[i], float64(deg))
			}
			want := 0.0
			if deg%2 == 0 {
				want = 2 / float64(deg+1)
			}
			if math.Abs(s-want) > 1e-13 {
				t.Fatalf("n=%d: degree %d integrates to %.16g, want %.16g", n, deg, s, want)
			}
		}
	}
	x, _ := lobatto(3)
	if d := math.Abs(x[2] - 1/math.Sqrt(5)); d > 1e-15 {
		t.Errorf("n=3 inner node %.17g, want 1/sqrt(5)", x[2])
	}
}

func BenchmarkSolve(b *testing.B) {
	e := exact{kx: 1, ky: 1, src: 1, alpha: 1}
	pr := e.problemOf(1, 1, [4]problem.Kind{problem.Value, problem.Convection, problem.Flux, problem.Value}, 3)
	for _, n := range []int{16, 24, 36, 48} {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			for b.Loop() {
				if _, err := Solve(pr, n, n); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
