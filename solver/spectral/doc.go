// Package spectral is the second, independent solution of the problem of
// package problem that the cross-check compares the series with on smooth
// data. It solves
//
//	Kx u_xx + Ky u_yy = -Source
//
// by a Legendre spectral Galerkin method with Gauss-Lobatto-Legendre
// (GLL) quadrature: one spectral element covering the rectangle, the
// field a polynomial of degree Nx in x and Ny in y given by its values at
// the tensor grid of GLL nodes. It shares no code and no idea with the
// series (no eigenfunction expansion, no corner pieces) or with the
// finite differences, and on a field that is smooth up to the edges and
// corners its error falls faster than any power of 1/N: 20 to 40 nodes a
// side give 1e-10 of the field.
//
// # The discrete problem
//
// In weak form, for every test function v that vanishes on the value
// edges,
//
//	int Kx u_x v_x + Ky u_y v_y dA + sum over convection edges int Hc u v ds
//	  = int Source v dA + sum over flux edges int q v ds
//	    + sum over convection edges int Hc g v ds
//
// where q is the entering flux and g the ambient. With the Lagrange
// polynomials of the GLL nodes as basis and test functions and every
// integral taken by the GLL rule, the mass matrices are diagonal
// (Mx = diag(wx), My = diag(wy)) and the system separates:
//
//	Ax U My + Mx U Ay = B
//
//	Ax = Kx Sx + Hc_left e_0 e_0^T + Hc_right e_N e_N^T
//
// with Sx the 1-D stiffness matrix (int l_i' l_k' dx by the GLL rule) and
// Ay alike along y. The nodes of a value edge hold the data there and are
// moved to the right-hand side; every other node is unknown. The corner
// node shared by two value edges never enters the equations of the free
// nodes, so disagreeing corner values cost only the accuracy the
// singularity costs. With Ãx = Mx^-1/2 Ax Mx^-1/2 = Qx Λx Qx^T (symmetric;
// package linalg's Jacobi method), and Ãy alike,
//
//	U = Mx^-1/2 Qx [ (Qx^T Mx^-1/2 B My^-1/2 Qy)_pq / (λ_p + μ_q) ] Qy^T My^-1/2
//
// which is the fast diagonalisation method: O(N^3) operations, a few
// milliseconds at N = 48. When no edge holds a value and no convection
// edge exchanges (all flux), the pair of constant modes has λ + μ = 0:
// that component is left out (the data's imbalance at the quadrature's
// accuracy) and the field is shifted to mean 0, as the series does.
//
// # What limits it
//
// Where the field is not smooth up to the boundary (steps and kinks of
// the data, a corner whose two conditions disagree, edges made of parts)
// the error falls only like a power of 1/N, and near the trouble it is
// not small at all. The cross-check therefore solves on N and 1.5 N
// nodes and compares the two, so that it knows how far it can be trusted
// itself before it reads a difference from the series as the series'
// error.
package spectral
