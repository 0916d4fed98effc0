package linalg

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// Solve agrees with gonum's mat (the reference) on seeded random systems,
// including the Vandermonde systems the series engine solves for its
// finite-difference stencils.
func TestSolveAgainstGonum(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	check := func(n int, a, b []float64) {
		x, err := Solve(a, b)
		if err != nil {
			t.Fatal(err)
		}
		var want mat.VecDense
		if err := want.SolveVec(mat.NewDense(n, n, append([]float64(nil), a...)), mat.NewVecDense(n, append([]float64(nil), b...))); err != nil {
			t.Fatal(err)
		}
		for i := range x {
			// tolerance: both are backward stable; the Vandermonde
			// matrices of order 7 have condition numbers near 1e6
			if d := math.Abs(x[i] - want.AtVec(i)); d > 1e-8*math.Max(1, math.Abs(want.AtVec(i))) {
				t.Errorf("n=%d x[%d] = %g, gonum %g", n, i, x[i], want.AtVec(i))
			}
		}
	}
	for n := 1; n <= 12; n++ {
		a, b := make([]float64, n*n), make([]float64, n)
		for i := range a {
			a[i] = rng.NormFloat64()
		}
		for i := range b {
			b[i] = rng.NormFloat64()
		}
		check(n, a, b)
	}
	v := make([]float64, 49)
	for k := 0; k < 7; k++ {
		for j := 0; j < 7; j++ {
			v[k*7+j] = math.Pow(float64(j), float64(k))
		}
	}
	check(7, v, []float64{0, 1, 0, 0, 0, 0, 0})
	if _, err := Solve([]float64{1, 2, 2, 4}, []float64{1, 1}); err != ErrSingular {
		t.Errorf("singular matrix: error %v", err)
	}
}

// MinNorm agrees with the minimum-norm least-squares solution from gonum's
// SVD (the reference) for tall, wide and rank-deficient matrices.
func TestMinNormAgainstGonum(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for _, sz := range [][3]int{{5, 5, 5}, {9, 4, 4}, {4, 9, 4}, {12, 21, 12}, {8, 8, 5}, {20, 14, 9}} {
		rows, cols, rank := sz[0], sz[1], sz[2]
		// a = L R with L rows x rank, R rank x cols: rank-deficient when rank
		// is below both sizes
		l, r := mat.NewDense(rows, rank, nil), mat.NewDense(rank, cols, nil)
		for i := 0; i < rows; i++ {
			for j := 0; j < rank; j++ {
				l.Set(i, j, rng.NormFloat64())
			}
		}
		for i := 0; i < rank; i++ {
			for j := 0; j < cols; j++ {
				r.Set(i, j, rng.NormFloat64())
			}
		}
		var a mat.Dense
		a.Mul(l, r)
		b := make([]float64, rows)
		for i := range b {
			b[i] = rng.NormFloat64()
		}
		flat := make([]float64, rows*cols)
		for i := 0; i < rows; i++ {
			for j := 0; j < cols; j++ {
				flat[i*cols+j] = a.At(i, j)
			}
		}
		x := MinNorm(flat, rows, cols, b, 1e-12)

		var svd mat.SVD
		if !svd.Factorize(&a, mat.SVDThin) {
			t.Fatal("gonum SVD failed")
		}
		var want mat.VecDense
		svd.SolveVecTo(&want, mat.NewVecDense(rows, b), svd.Rank(1e-12))
		for j := 0; j < cols; j++ {
			// tolerance: condition numbers of these products are below
			// about 1e3; 1e-9 leaves room for both algorithms' round-off
			if d := math.Abs(x[j] - want.AtVec(j)); d > 1e-9*math.Max(1, math.Abs(want.AtVec(j))) {
				t.Errorf("%dx%d rank %d: x[%d] = %.15g, gonum %.15g", rows, cols, rank, j, x[j], want.AtVec(j))
			}
		}
	}
}

// SymEigen rebuilds seeded random symmetric matrices (Q diag Q^T), keeps
// Q orthogonal, and finds the eigenvalues gonum's mat.EigenSym finds.
func TestSymEigenAgainstGonum(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for _, n := range []int{1, 2, 3, 7, 20, 47} {
		a := make([]float64, n*n)
		for i := 0; i < n; i++ {
			for j := i; j < n; j++ {
				v := rng.NormFloat64()
				if i == j {
					v *= float64(n) // a wide spread of eigenvalues
				}
				a[i*n+j], a[j*n+i] = v, v
			}
		}
		vals, q := SymEigen(a, n)
		// tolerance: Jacobi is accurate to a few roundings of the norm
		// (at most about 50 n here)
		tol := 1e-13 * float64(n) * float64(n)
		for i := 0; i < n; i++ {
			for j := 0; j < n; j++ {
				rebuilt, dot := 0.0, 0.0
				for k := 0; k < n; k++ {
					rebuilt += q[i*n+k] * vals[k] * q[j*n+k]
					dot += q[k*n+i] * q[k*n+j]
				}
				if d := math.Abs(rebuilt - a[i*n+j]); d > tol {
					t.Fatalf("n=%d: Q diag Q^T differs from a at %d,%d by %g", n, i, j, d)
				}
				want := 0.0
				if i == j {
					want = 1
				}
				if d := math.Abs(dot - want); d > 1e-13*float64(n) {
					t.Fatalf("n=%d: Q^T Q differs from I at %d,%d by %g", n, i, j, d)
				}
			}
		}
		var es mat.EigenSym
		if !es.Factorize(mat.NewSymDense(n, append([]float64(nil), a...)), false) {
			t.Fatal("gonum EigenSym failed")
		}
		want := es.Values(nil)
		got := append([]float64(nil), vals...)
		slices.Sort(got)
		for i := range want {
			if d := math.Abs(got[i] - want[i]); d > tol {
				t.Errorf("n=%d eigenvalue %d: %g, gonum %g", n, i, got[i], want[i])
			}
		}
	}
}
