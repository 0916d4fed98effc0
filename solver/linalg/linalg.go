// Package linalg holds the small dense solvers the engine needs: for the
// series' corner fits, a square solve by Gaussian elimination with partial
// pivoting and a minimum-norm least-squares solve by a one-sided Jacobi
// singular value decomposition (Hestenes' method); for the spectral
// cross-check, the eigenvalues and eigenvectors of a symmetric matrix by
// the cyclic Jacobi method; for the finite-difference cross-check, a band
// Cholesky factorisation and solve (band.go).
//
// The dense systems are tiny (tens of rows and columns). gonum's mat package
// solves them just as well, but linking it brings most of gonum's LAPACK
// into the WebAssembly engine (about 0.5 MB); these few dozen lines do not.
// The tests check the routines against gonum's mat on seeded random
// systems.
//
// Matrices are row-major: a[i*cols + j] is row i, column j.
package linalg

import (
	"errors"
	"math"
)

// ErrSingular is returned by Solve for a matrix that is singular to
// working precision.
var ErrSingular = errors.New("linalg: matrix is singular")

// Solve solves the n x n system a x = b and returns x. a and b are not
// changed.
func Solve(a []float64, b []float64) ([]float64, error) {
	n := len(b)
	if len(a) != n*n {
		panic("linalg: Solve needs an n x n matrix for n right-hand sides")
	}
	m := append([]float64(nil), a...)
	x := append([]float64(nil), b...)
	scale := 0.0
	for _, v := range m {
		scale = math.Max(scale, math.Abs(v))
	}
	for k := 0; k < n; k++ {
		p := k
		for i := k + 1; i < n; i++ {
			if math.Abs(m[i*n+k]) > math.Abs(m[p*n+k]) {
				p = i
			}
		}
		if math.Abs(m[p*n+k]) <= 1e-14*scale || scale == 0 {
			return nil, ErrSingular
		}
		if p != k {
			for j := 0; j < n; j++ {
				m[k*n+j], m[p*n+j] = m[p*n+j], m[k*n+j]
			}
			x[k], x[p] = x[p], x[k]
		}
		for i := k + 1; i < n; i++ {
			f := m[i*n+k] / m[k*n+k]
			if f == 0 {
				continue
			}
			for j := k; j < n; j++ {
				m[i*n+j] -= f * m[k*n+j]
			}
			x[i] -= f * x[k]
		}
	}
	for k := n - 1; k >= 0; k-- {
		s := x[k]
		for j := k + 1; j < n; j++ {
			s -= m[k*n+j] * x[j]
		}
		x[k] = s / m[k*n+k]
	}
	return x, nil
}

// MinNorm returns the x of smallest norm that minimises |a x - b| for the
// rows x cols matrix a, treating singular values at or below rcond times
// the largest as zero. a and b are not changed.
func MinNorm(a []float64, rows, cols int, b []float64, rcond float64) []float64 {
	if len(a) != rows*cols || len(b) != rows {
		panic("linalg: MinNorm: sizes do not match")
	}
	// One-sided Jacobi: rotate pairs of columns of U = a (and of V = I)
	// until all columns of U are orthogonal; then a = U V^T with the
	// column norms of U the singular values.
	u := append([]float64(nil), a...)
	v := identity(cols)
	for sweep := 0; sweep < 60; sweep++ {
		if !orthogonalize(u, v, rows, cols) {
			break
		}
	}
	sigma, smax := columnNorms(u, rows, cols)
	x := make([]float64, cols)
	for j, sj := range sigma {
		if sj == 0 || sj <= rcond*smax {
			continue
		}
		addComponent(x, u, v, rows, cols, j, sj, b)
	}
	return x
}

// The loops of MinNorm and SymEigen run in small functions of their own,
// so that the browser optimizes little code while they run (see the
// package doc of edgewise/solver, Loops in functions of their own).

// identity returns the n x n identity matrix.
//
//go:noinline
func identity(n int) []float64 {
	q := make([]float64, n*n)
	for i := 0; i < n; i++ {
		q[i*n+i] = 1
	}
	return q
}

// orthogonalize makes one sweep of the one-sided Jacobi method over the
// pairs of columns of u (rows x cols), turning v's columns alike, and
// reports whether it rotated any pair.
//
//go:noinline
func orthogonalize(u, v []float64, rows, cols int) bool {
	const eps = 1e-15
	rotated := false
	for p := 0; p < cols-1; p++ {
		for q := p + 1; q < cols; q++ {
			alpha, beta, gamma := columnProducts(u, rows, cols, p, q)
			if gamma == 0 || math.Abs(gamma) <= eps*math.Sqrt(alpha*beta) {
				continue
			}
			rotated = true
			c, s := jacobiAngle((beta - alpha) / (2 * gamma))
			rotateColumns(u, rows, cols, p, q, c, s)
			rotateColumns(v, cols, cols, p, q, c, s)
		}
	}
	return rotated
}

// columnProducts returns the products u_p.u_p, u_q.u_q and u_p.u_q of
// columns p and q of u (rows x cols).
func columnProducts(u []float64, rows, cols, p, q int) (alpha, beta, gamma float64) {
	for i := 0; i < rows; i++ {
		up, uq := u[i*cols+p], u[i*cols+q]
		alpha += up * up
		beta += uq * uq
		gamma += up * uq
	}
	return alpha, beta, gamma
}

// columnNorms returns the norms of the columns of u (rows x cols) and the
// largest of them.
//
//go:noinline
func columnNorms(u []float64, rows, cols int) (sigma []float64, smax float64) {
	sigma = make([]float64, cols)
	for j := range sigma {
		s := 0.0
		for i := 0; i < rows; i++ {
			s += u[i*cols+j] * u[i*cols+j]
		}
		sigma[j] = math.Sqrt(s)
		smax = math.Max(smax, sigma[j])
	}
	return sigma, smax
}

// addComponent adds to x the part of MinNorm's solution along singular
// value sj, column j of u and v.
//
//go:noinline
func addComponent(x, u, v []float64, rows, cols, j int, sj float64, b []float64) {
	// (u_j . b) / sigma_j, with u_j = U[:, j] / sigma_j
	dot := 0.0
	for i := 0; i < rows; i++ {
		dot += u[i*cols+j] * b[i]
	}
	f := dot / (sj * sj)
	for i := range x {
		x[i] += v[i*cols+j] * f
	}
}

// SymEigen returns the eigenvalues of the symmetric n x n matrix a and its
// eigenvectors: a = Q diag(vals) Q^T with Q orthogonal, column j of q
// (q[i*n+j]) belonging to vals[j]. Only the upper triangle of a is read;
// a is not changed. The eigenvalues are not sorted.
//
// The cyclic Jacobi method rotates away every off-diagonal element in
// turn until they are all below 1e-15 of the diagonal's scale; it is
// accurate to a few units of rounding relative to the largest eigenvalue
// and costs about 6 n^3 operations a sweep, with 6 to 10 sweeps: meant for
// n up to a few hundred.
func SymEigen(a []float64, n int) (vals, q []float64) {
	if len(a) != n*n {
		panic("linalg: SymEigen needs an n x n matrix")
	}
	m := symmetric(a, n)
	q = identity(n)
	scale := maxAbs(m)
	if scale > 0 {
		diagonalize(m, q, n, 1e-15*scale)
	}
	return diagonal(m, n), q
}

// symmetric returns the symmetric n x n matrix whose upper triangle is
// that of a.
//
//go:noinline
func symmetric(a []float64, n int) []float64 {
	m := make([]float64, n*n)
	for i := 0; i < n; i++ {
		for j := i; j < n; j++ {
			m[i*n+j], m[j*n+i] = a[i*n+j], a[i*n+j]
		}
	}
	return m
}

// maxAbs returns the largest magnitude in m (0 for none).
//
//go:noinline
func maxAbs(m []float64) float64 {
	scale := 0.0
	for _, v := range m {
		scale = math.Max(scale, math.Abs(v))
	}
	return scale
}

// diagonalize rotates away, sweep after sweep of the cyclic Jacobi
// method, the off-diagonal elements of the symmetric n x n matrix m above
// tiny, turning q's columns alike.
//
//go:noinline
func diagonalize(m, q []float64, n int, tiny float64) {
	for sweep := 0; sweep < 60; sweep++ {
		rotated := false
		for p := 0; p < n-1; p++ {
			for r := p + 1; r < n; r++ {
				apr := m[p*n+r]
				if math.Abs(apr) <= tiny {
					continue
				}
				rotated = true
				app, arr := m[p*n+p], m[r*n+r]
				// the angle that zeroes m[p][r]
				c, s := jacobiAngle((arr - app) / (2 * apr))
				rotateColumns(m, n, n, p, r, c, s)
				rotateRows(m, n, p, r, c, s)
				m[p*n+r], m[r*n+p] = 0, 0
				rotateColumns(q, n, n, p, r, c, s)
			}
		}
		if !rotated {
			return
		}
	}
}

// diagonal returns the diagonal of the n x n matrix m.
//
//go:noinline
func diagonal(m []float64, n int) []float64 {
	vals := make([]float64, n)
	for i := range vals {
		vals[i] = m[i*n+i]
	}
	return vals
}

// jacobiAngle returns the cosine and sine of the Jacobi rotation for
// theta = (a_qq - a_pp) / (2 a_pq): t the smaller root of
// t^2 + 2 theta t - 1 = 0 (for stability), c = 1/sqrt(1 + t^2), s = c t.
func jacobiAngle(theta float64) (c, s float64) {
	t := math.Copysign(1, theta) / (math.Abs(theta) + math.Sqrt(1+theta*theta))
	c = 1 / math.Sqrt(1+t*t)
	return c, c * t
}

// rotateColumns turns columns p and q of the row-major matrix a (rows x
// stride) by the rotation (c, s): a_p, a_q <- c a_p - s a_q, s a_p + c a_q.
func rotateColumns(a []float64, rows, stride, p, q int, c, s float64) {
	for i := 0; i < rows; i++ {
		ap, aq := a[i*stride+p], a[i*stride+q]
		a[i*stride+p], a[i*stride+q] = c*ap-s*aq, s*ap+c*aq
	}
}

// rotateRows turns rows p and r of the n x n matrix m by the rotation
// (c, s): m_p, m_r <- c m_p - s m_r, s m_p + c m_r.
func rotateRows(m []float64, n, p, r int, c, s float64) {
	for k := 0; k < n; k++ {
		mpk, mrk := m[p*n+k], m[r*n+k]
		m[p*n+k], m[r*n+k] = c*mpk-s*mrk, s*mpk+c*mrk
	}
}
