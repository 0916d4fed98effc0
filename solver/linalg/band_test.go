package linalg

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack/lapack64"
)

// laplaceBand is the band (half-bandwidth nx+1) of the five-point
// Laplacian on an (nx+1) x (ny+1) node grid with every boundary node held
// (a unit diagonal there), plus shift on the diagonal: the shape of the
// cross-check's system.
func laplaceBand(nx, ny int, shift float64) (a []float64, n, k int) {
	n, k = (nx+1)*(ny+1), nx+1
	a = make([]float64, n*(k+1))
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			r := j*(nx+1) + i
			if i == 0 || j == 0 || i == nx || j == ny {
				a[r*(k+1)] = 1 + shift
				continue
			}
			a[r*(k+1)] = 4 + shift
			if i+1 < nx {
				a[r*(k+1)+1] = -1
			}
			if j+1 < ny {
				a[r*(k+1)+k] = -1
			}
		}
	}
	return a, n, k
}

// randomBand is a random symmetric band made positive definite by a
// dominant diagonal.
func randomBand(r *rand.Rand, n, k int) []float64 {
	a := make([]float64, n*(k+1))
	for i := range n {
		for d := 1; d <= min(k, n-1-i); d++ {
			a[i*(k+1)+d] = r.Float64()*2 - 1
		}
	}
	for i := range n {
		s := 0.0
		for d := 1; d <= k; d++ {
			if i+d < n {
				s += math.Abs(a[i*(k+1)+d])
			}
			if i-d >= 0 {
				s += math.Abs(a[(i-d)*(k+1)+d])
			}
		}
		a[i*(k+1)] = s + 0.1 + r.Float64()
	}
	return a
}

// The factor and the solution agree with gonum's band Cholesky (lapack64
// Pbtrf and Pbtrs, the reference) to rounding, on random bands of many
// shapes and on the grid Laplacian; and the solution satisfies A x = b.
func TestCholeskyBandAgainstGonum(t *testing.T) {
	r := rand.New(rand.NewPCG(5, 6))
	type cas struct {
		name string
		a    []float64
		n, k int
	}
	var cases []cas
	for _, nk := range [][2]int{{1, 0}, {1, 3}, {5, 0}, {5, 1}, {5, 4}, {5, 9}, {40, 3}, {100, 17}} {
		cases = append(cases, cas{fmt.Sprintf("random %d/%d", nk[0], nk[1]), randomBand(r, nk[0], nk[1]), nk[0], nk[1]})
	}
	a, n, k := laplaceBand(20, 13, 0)
	cases = append(cases, cas{"laplace 20x13", a, n, k})
	for _, c := range cases {
		b := make([]float64, c.n)
		for i := range b {
			b[i] = r.Float64()*2 - 1
		}
		// reference
		ref := slices.Clone(c.a)
		tr, ok := lapack64.Pbtrf(blas64.SymmetricBand{Uplo: blas.Upper, N: c.n, K: c.k, Stride: c.k + 1, Data: ref})
		if !ok {
			t.Fatalf("%s: gonum finds it not positive definite", c.name)
		}
		xref := slices.Clone(b)
		lapack64.Pbtrs(tr, blas64.General{Rows: c.n, Cols: 1, Stride: 1, Data: xref})

		u := slices.Clone(c.a)
		if !CholeskyBand(u, c.n, c.k) {
			t.Fatalf("%s: not positive definite", c.name)
		}
		for i := range c.n {
			for d := 0; d <= min(c.k, c.n-1-i); d++ {
				g, w := u[i*(c.k+1)+d], ref[i*(c.k+1)+d]
				// rounding only: the two sum in different orders
				if math.Abs(g-w) > 1e-13*(1+math.Abs(w)) {
					t.Fatalf("%s: U[%d][%d] = %v, gonum %v", c.name, i, i+d, g, w)
				}
			}
		}
		x := slices.Clone(b)
		SolveBand(u, c.n, c.k, x)
		for i := range x {
			if math.Abs(x[i]-xref[i]) > 1e-12*(1+math.Abs(xref[i])) {
				t.Fatalf("%s: x[%d] = %v, gonum %v", c.name, i, x[i], xref[i])
			}
		}
		// residual of A x = b with the original band
		for i := range c.n {
			s := 0.0
			for j := max(0, i-c.k); j <= min(c.n-1, i+c.k); j++ {
				lo, hi := min(i, j), max(i, j)
				s += c.a[lo*(c.k+1)+hi-lo] * x[j]
			}
			if math.Abs(s-b[i]) > 1e-12 {
				t.Fatalf("%s: row %d of A x - b = %v", c.name, i, s-b[i])
			}
		}
	}
}

// A matrix that is not positive definite, or holds NaN, is refused.
func TestCholeskyBandRefuses(t *testing.T) {
	a, n, k := laplaceBand(6, 5, 0)
	a[10*(k+1)] = -1 // a negative diagonal
	if CholeskyBand(a, n, k) {
		t.Error("negative diagonal: factored")
	}
	a, n, k = laplaceBand(6, 5, 0)
	a[9*(k+1)+1] = math.NaN()
	if CholeskyBand(a, n, k) {
		t.Error("NaN: factored")
	}
	// symmetric, indefinite: [[1, 2], [2, 1]] has eigenvalues 3 and -1
	if CholeskyBand([]float64{1, 2, 1, 0}, 2, 1) {
		t.Error("indefinite 2 x 2: factored")
	}
}

// BenchmarkCholeskyBand factors and solves the cross-check's system shape
// (the five-point Laplacian on a square grid of n intervals), ours and
// gonum's.
func BenchmarkCholeskyBand(b *testing.B) {
	for _, nx := range []int{32, 64} {
		a, n, k := laplaceBand(nx, nx, 0)
		rhs := make([]float64, n)
		for i := range rhs {
			rhs[i] = float64(i % 7)
		}
		u, x := make([]float64, len(a)), make([]float64, n)
		b.Run(fmt.Sprint(nx), func(b *testing.B) {
			for b.Loop() {
				copy(u, a)
				copy(x, rhs)
				if !CholeskyBand(u, n, k) {
					b.Fatal("not positive definite")
				}
				SolveBand(u, n, k, x)
			}
		})
		b.Run(fmt.Sprint(nx)+"/gonum", func(b *testing.B) {
			for b.Loop() {
				copy(u, a)
				copy(x, rhs)
				tr, ok := lapack64.Pbtrf(blas64.SymmetricBand{Uplo: blas.Upper, N: n, K: k, Stride: k + 1, Data: u})
				if !ok {
					b.Fatal("not positive definite")
				}
				lapack64.Pbtrs(tr, blas64.General{Rows: n, Cols: 1, Stride: 1, Data: x})
			}
		})
	}
}
