package linalg

import "math"

// CholeskyBand factors in place the n x n symmetric positive definite
// band matrix a, of half-bandwidth k, as U^T U with U upper triangular of
// the same band. a holds the upper triangle by rows:
//
//	a[i*(k+1) + d] = A[i][i+d],   d = 0..k
//
// (the places past the last row's end are not read), and U replaces it
// in the same layout. It returns false, with a partly overwritten, when a
// pivot is not positive: the matrix is not positive definite, or holds
// NaN.
//
// Row j, once final, is subtracted from the rows below it within the band
// (the right-looking rank-one form); the inner loop runs along a stored
// row, contiguous in memory. The work is about n k^2 / 2 multiply-adds.
func CholeskyBand(a []float64, n, k int) bool {
	st := k + 1
	if n < 0 || k < 0 || len(a) < (n-1)*st+1 {
		panic("linalg: CholeskyBand: the band does not hold n rows")
	}
	for j := range n {
		m := min(k, n-1-j) // the row's stored width past the diagonal
		row := a[j*st : j*st+m+1]
		d := row[0]
		if !(d > 0) {
			return false
		}
		d = math.Sqrt(d)
		row[0] = d
		inv := 1 / d
		for p := 1; p <= m; p++ {
			row[p] *= inv
		}
		for p := 1; p <= m; p++ {
			v := row[p]
			if v == 0 {
				continue
			}
			src := row[p:]
			dst := a[(j+p)*st : (j+p)*st+len(src)]
			for i, u := range src {
				dst[i] -= v * u
			}
		}
	}
	return true
}

// SolveBand solves U^T U x = b for the factor U that CholeskyBand made of
// an n x n band of half-bandwidth k; x replaces b.
func SolveBand(u []float64, n, k int, b []float64) {
	st := k + 1
	if len(b) != n || len(u) < (n-1)*st+1 {
		panic("linalg: SolveBand: sizes do not match")
	}
	// U^T y = b, column by column of U^T (row by row of U)
	for j := range n {
		m := min(k, n-1-j)
		row := u[j*st : j*st+m+1]
		y := b[j] / row[0]
		b[j] = y
		rest := b[j+1 : j+1+m]
		for p, v := range row[1:] {
			rest[p] -= v * y
		}
	}
	// U x = y, from the last row up
	for j := n - 1; j >= 0; j-- {
		m := min(k, n-1-j)
		row := u[j*st : j*st+m+1]
		s := b[j]
		for p, v := range row[1:] {
			s -= v * b[j+1+p]
		}
		b[j] = s / row[0]
	}
}
