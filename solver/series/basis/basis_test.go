package basis

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"
)

// Roots of x tan x = Bi: a flux end at s = 0 (Bi 0) and a convection end.
// R. G. Watts, Essentials of Applied Mathematics for Scientists and
// Engineers (2007), Appendix A, Table A.1 (read). Printed to 4 decimals, so
// the tolerance is half a unit in the last place.
func TestRootsTanTable(t *testing.T) {
	for _, c := range []struct {
		bi   float64
		want [4]float64
	}{
		{0.01, [4]float64{0.0998, 3.1448, 6.2848, 9.4258}},
		{0.1, [4]float64{0.3111, 3.1731, 6.2991, 9.4354}},
		{1, [4]float64{0.8603, 3.4256, 6.4373, 9.5293}},
		{10, [4]float64{1.4289, 4.3058, 7.2281, 10.2003}},
	} {
		for i, w := range c.want {
			got := Root(i+1, 0, c.bi)
			if math.Abs(got-w) > 0.5e-4 {
				t.Errorf("x tan x = %g: root %d = %.6f, want %.4f", c.bi, i+1, got, w)
			}
			// The root satisfies the equation itself (Go's math package as reference).
			if r := got*math.Tan(got) - c.bi; math.Abs(r) > 1e-9*math.Max(1, c.bi) {
				t.Errorf("x tan x = %g: residual %g at root %d", c.bi, r, i+1)
			}
		}
	}
}

// Roots of x cot x = -Bi: a value end at s = 0 (Bi = Inf) and a convection
// end. Watts (2007), Appendix A, Table A.2 (read), 4 decimals. The table's
// 11.0856 (Bi = 1, root 4) differs by one unit in the last place from the
// root of the equation, 11.08554 (checked through its residual in
// TestRootsSweep), so this table is held to one unit in the last place.
func TestRootsCotTable(t *testing.T) {
	for _, c := range []struct {
		bi   float64
		want [4]float64
	}{
		{1, [4]float64{2.0288, 4.9132, 7.9787, 11.0856}},
		{2, [4]float64{2.2889, 5.0870, 8.0962, 11.1727}},
	} {
		for i, w := range c.want {
			got := Root(i+1, math.Inf(1), c.bi)
			if math.Abs(got-w) > 1e-4 {
				t.Errorf("x cot x = -%g: root %d = %.6f, want %.4f", c.bi, i+1, got, w)
			}
			// Same roots with the ends swapped (the equation is symmetric).
			if sw := Root(i+1, c.bi, math.Inf(1)); math.Abs(sw-got) > 1e-12*got {
				t.Errorf("swapped ends: %g vs %g", sw, got)
			}
		}
	}
}

// No root missed or duplicated: for Bi from 1e-6 to 1e6 and every pair of
// end kinds, the roots are strictly increasing, root m lies in
// [(m-1) pi, m pi], and the pole-free form
// (BiA BiB - mu^2) sin mu + mu (BiA + BiB) cos mu vanishes there
// (exact identity; scaled so it is O(1)).
func TestRootsSweep(t *testing.T) {
	bis := []float64{0, 1e-6, 1e-3, 0.1, 1, 7.5, 100, 1e4, 1e6, math.Inf(1)}
	for _, a := range bis {
		for _, b := range bis {
			prev := -1.0
			for m := 1; m <= 60; m++ {
				mu := Root(m, a, b)
				if mu <= prev && !(m == 1 && mu == 0) {
					t.Fatalf("Bi %g,%g: root %d = %g not above %g", a, b, m, mu, prev)
				}
				if mu < float64(m-1)*math.Pi-1e-12 || mu > float64(m)*math.Pi+1e-12 {
					t.Fatalf("Bi %g,%g: root %d = %g outside its bracket", a, b, m, mu)
				}
				prev = mu
				// Residual of the boundary conditions of X = sin(mu s + phi) on [0, 1].
				phi := phase(mu, a)
				x1, dx1 := math.Sin(mu+phi), mu*math.Cos(mu+phi)
				var res float64
				switch {
				case math.IsInf(b, 1):
					res = x1
				default:
					res = (dx1 + b*x1) / (mu + b + 1)
				}
				if math.Abs(res) > 1e-10 {
					t.Fatalf("Bi %g,%g: root %d = %.15g leaves residual %g", a, b, m, mu, res)
				}
			}
		}
	}
}

// Orthogonality and norms (Sturm-Liouville): the Gram matrix by 200-node
// Gauss-Legendre quadrature (gonum integrate/quad; exact to rounding for
// these entire integrands) is diagonal with the stated norms, and the
// stated integrals match. Tolerance 1e-12 of L (rounding).
func TestOrthogonality(t *testing.T) {
	xs, ws := make([]float64, 200), make([]float64, 200)
	for _, c := range [][2]float64{{0, 0}, {math.Inf(1), 0}, {0.3, 5}, {math.Inf(1), 2}, {1e-6, 1e6}} {
		L := 2.5
		b := New(L, c[0], c[1], 12)
		quad.Legendre{}.FixedLocations(xs, ws, 0, L)
		for i := 0; i < 12; i++ {
			for j := i; j < 12; j++ {
				sum, sumI := 0.0, 0.0
				for k, s := range xs {
					xi, _ := b.X(i, s)
					xj, _ := b.X(j, s)
					sum += ws[k] * xi * xj
					sumI += ws[k] * xi
				}
				want := 0.0
				if i == j {
					want = b.Norm[i]
					if math.Abs(sumI-b.Int[i]) > 1e-12*L {
						t.Errorf("Bi %v: integral %d = %g, want %g", c, i, b.Int[i], sumI)
					}
				}
				if math.Abs(sum-want) > 1e-12*L {
					t.Errorf("Bi %v: <X%d,X%d> = %g, want %g", c, i, j, sum, want)
				}
			}
		}
	}
}

// Row agrees with X term by term (to 4e-12 of the term's size over 4000
// terms) for even and uneven bases, Biot numbers from 1e-3 to 1e4.
func TestRowAgreesWithX(t *testing.T) {
	for _, bi := range [][2]float64{{0, 0}, {math.Inf(1), 0}, {1e-3, 0}, {2, 5}, {1e4, math.Inf(1)}, {300, 300}} {
		b := New(2, bi[0], bi[1], 4096)
		x, dx := make([]float64, 4000), make([]float64, 4000)
		for _, s := range []float64{0, 0.3, 1.1, 1.999, 2} {
			b.Row(s, 50, 4050, x, dx)
			for i := 50; i < 4050; i++ {
				want, wantD := b.X(i, s)
				if math.Abs(x[i-50]-want) > 4e-12 || math.Abs(dx[i-50]-wantD) > 4e-12*b.Lambda[i] {
					t.Fatalf("Biot %v, s %g, term %d: Row %.15g %.15g, X %.15g %.15g", bi, s, i, x[i-50], dx[i-50], want, wantD)
				}
			}
		}
	}
}
