// Package series solves the steady field problem of package problem,
//
//	Kx u_xx + Ky u_yy = -Source   on [0, W] x [0, H],
//
// analytically, by separation of variables and superposition.
//
// Steps (each documented where it is done):
//
//  1. Orthotropy: y' = y sqrt(Kx/Ky) maps the problem onto an isotropic one
//     with k = sqrt(Kx Ky) on [0, W] x [0, H sqrt(Kx/Ky)]; the source
//     becomes Source/sqrt(Kx/Ky), flux data and Hc of the left and right
//     edges are divided by sqrt(Kx/Ky) (their s is stretched by it), those
//     of the bottom and top edges are unchanged. Edge flows are unchanged.
//  2. Source: a quadratic particular solution is subtracted (y(H-y) or
//     x(W-x) across the shorter side; for all-flux problems one that takes
//     each edge's net flow) and its edge values and fluxes go into the data.
//  3. Corners: harmonic pieces carry the corner behaviour out of the series:
//     the angle function J (1 - 2 theta/pi) at a jump of prescribed value,
//     Im(zeta^2 log zeta) at a value/value corner whose data curvatures are
//     not those of a harmonic function, zeta log zeta at a value/flux or
//     value/convection corner whose data disagree about the normal
//     derivative, Re(zeta^2 log zeta) at a flux/convection corner whose
//     data disagree about the mixed derivative, and harmonic polynomials of
//     degree <= 4 (minimum norm) fitted so that every edge's residual
//     vanishes at value neighbours and meets the neighbour's homogeneous
//     condition elsewhere. The series coefficients then fall like n^-4 or
//     faster (n^-5 between two value edges) instead of n^-1.
//  4. Superposition: one sub-problem per edge with that edge's residual
//     data, the other three homogeneous; the basis along the edge is the
//     Sturm-Liouville basis of package basis set by the two neighbours'
//     kinds, coefficients by Gauss-Legendre projection; across the region,
//     exponentials in overflow-free form meet the opposite edge's condition.
//
// Accuracy: Options.Tol is relative to the data scale (Solution.Scale: the
// range of prescribed values and ambients, the largest |flux| times the
// longer side over k, or |Source| times the shorter side squared over 8k,
// whichever is largest). Each sub-problem doubles its terms until the
// estimated tail (see sub.tailEstimate) is below Tol*Scale/4 or
// Options.MaxTerms is reached; ErrorEstimate is the sum of the four tails.
//
// All-flux problems (no value edge and no convection with Hc > 0) have a
// steady state only if the inflow plus Source*W*H is zero (relative 1e-9);
// otherwise Solve returns *ImbalanceError. The free constant is fixed so
// that the area mean of u is zero (the rule package fdcheck uses too).
//
// Flow through an edge adjacent to a jump of prescribed value is infinite
// (the gradient grows like 1/r): Flow reports finite = false and Warnings
// says where.
package series
