package spectral

import (
	"fmt"
	"math"
	"testing"

	"edgewise/solver/internal/exact"
	"edgewise/solver/problem"
)

// On smooth fields the error falls to rounding level with 24 intervals a
// side, for all 81 combinations of edge kinds, with orthotropy and a
// source; all-flux problems come out with mean 0.
func TestManufacturedAllKinds(t *testing.T) {
	kinds := []problem.Kind{problem.Value, problem.Flux, problem.Convection}
	e := exact.Smooth{Kx: 2, Ky: 0.5, Src: 3, A: 1.3}
	worst := 0.0
	for c := 0; c < 81; c++ {
		var k [4]problem.Kind
		for s, cc := 0, c; s < 4; s, cc = s+1, cc/3 {
			k[s] = kinds[cc%3]
		}
		pr := e.Problem(1.5, 1, k, 4)
		f, err := Solve(pr, 24, 20)
		if err != nil {
			t.Fatal(err)
		}
		shift := 0.0
		if f.Floats {
			shift = e.Mean(pr.W, pr.H) // the exact field less its mean
		}
		for _, xy := range [][2]float64{{0.3, 0.2}, {1.5, 1}, {0, 0.5}, {0.75, 0}, {1.2, 0.9}} {
			d := math.Abs(f.At(xy[0], xy[1]) - (e.U(xy[0], xy[1]) - shift))
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

// The error falls faster than any power: from 8 to 16 intervals it falls
// by more than 1e4 (a second-order method would give 4).
func TestSpectralConvergence(t *testing.T) {
	e := exact.Smooth{Kx: 1, Ky: 1, Src: 0, A: 2}
	pr := e.Problem(1, 1, [4]problem.Kind{problem.Value, problem.Convection, problem.Flux, problem.Value}, 3)
	errAt := func(n int) float64 {
		f, err := Solve(pr, n, n)
		if err != nil {
			t.Fatal(err)
		}
		worst := 0.0
		g := f.Grid(10, 10, nil)
		for j := 0; j <= 10; j++ {
			for i := 0; i <= 10; i++ {
				worst = max(worst, math.Abs(g[j*11+i]-e.U(float64(i)/10, float64(j)/10)))
			}
		}
		return worst
	}
	e8, e16 := errAt(8), errAt(16)
	if !(e16 < 1e-4*e8) || e16 > 1e-10 {
		t.Errorf("error at 8 intervals %g, at 16 %g: not spectral", e8, e16)
	}
}

// The GLL rule integrates polynomials up to degree 2n - 1 exactly (the
// exact identity that defines it), and its inner nodes for n = 3 are
// ±1/sqrt 5, as in the published small Lobatto rules (Abramowitz &
// Stegun 25.4.32, from memory).
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
	e := exact.Smooth{Kx: 1, Ky: 1, Src: 1, A: 1}
	pr := e.Problem(1, 1, [4]problem.Kind{problem.Value, problem.Convection, problem.Flux, problem.Value}, 3)
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
