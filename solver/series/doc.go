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
//  3. Corners: harmonic pieces carry the corner behaviour out of the series
//     (zeta is the local complex coordinate at the corner, one edge along
//     the real axis, the other along the imaginary axis):
//     at a value/value corner the angle function J (1 - 2 theta/pi) at a
//     corner break (the two values differ by J), and Im(zeta^2 log zeta) when the data's
//     curvatures are not those of a harmonic function; at a value/flux or
//     value/convection corner zeta log zeta when the data disagree about
//     the normal derivative (by more than four times the uncertainty of
//     the slope taken from the data: agreeing data leave the gradient at
//     the corner finite) (plus Im(zeta^2 log zeta) taking back the
//     beta s log s it leaves on a convection edge) and zeta^3 log zeta
//     when they disagree at third order; at a corner between two
//     flux/convection edges Re(zeta^2 log zeta) when the data disagree
//     about the mixed derivative (plus zeta^3 log zeta for the beta s^2
//     log s terms). Harmonic polynomials of degree <= 5 (minimum norm) are
//     then fitted so that every edge's residual vanishes, with its second
//     derivative, next to a value edge, and meets the neighbour's
//     homogeneous condition (and its next order) elsewhere. The series
//     coefficients then fall like n^-5 or so (measured 4.7 to 5 on the
//     octave envelopes) instead of n^-1, and about a hundred terms reach
//     Tol = 1e-9 on smooth data.
//  4. Superposition: one sub-problem per edge with that edge's residual
//     data, the other three homogeneous; the basis along the edge is the
//     Sturm-Liouville basis of package basis set by the two neighbours'
//     kinds, coefficients by Gauss-Legendre projection (n+32 nodes for n
//     terms; the sine and cosine families by a rotation recurrence);
//     across the region, exponentials in overflow-free form,
//     exp(-lambda t) and exp(-lambda (2D - t)) over the loaded edge's
//     operator, meet the opposite edge's condition for any aspect ratio.
//  5. Grid: the pieces in one pass per row (one arctangent or logarithm
//     per node, shared by the four corners through symmetry; the corners'
//     powers folded into the smooth polynomial, so a corner adds only its
//     logarithmic part); the sub-problems row by row with per-row
//     truncation (a term falls like exp(-lambda t) at distance t from its
//     edge; the terms dropped sum to at most a tenth of ErrorEstimate, so
//     the grid is covered by it like a probe), by DST-I/DCT-I (gonum
//     dsp/fourier) for the sine pairs and otherwise as one product per row
//     for each pair of opposite sub-problems (they share their basis: the
//     two rows' factors are added first), from tables of the
//     eigenfunctions on the nodes, four terms at a time. Rows are shared
//     among the processors (one in the wasm build); the numbers do not
//     depend on how.
//
// Accuracy: Options.Tol is relative to the data scale (Solution.Scale: the
// range of prescribed values and ambients, the largest |flux| times the
// longer side over k, or |Source| times the shorter side squared over 8k,
// whichever is largest). Each sub-problem doubles its terms until the
// estimated tail is below Tol*Scale/4 or Options.MaxTerms is reached (then
// Warnings says so). The tail estimate: the terms n/2..n-1 are summed at the
// loaded edge, where every term is largest, on 129 Chebyshev points; with
// the coefficients' envelope falling like n^-p over the last two octaves
// the part beyond n is that times r/(1-r), r = 2^(1-p), doubled for
// safety. ErrorEstimate is the sum of the four tails; tests hold the true
// error below it on known cases.
//
// All-flux problems (no value edge and no convection with Hc > 0) have a
// steady state only if the inflow plus Source*W*H is zero (relative 1e-9);
// otherwise Solve returns *ImbalanceError. The free constant is fixed so
// that the area mean of u is zero (the rule package fdcheck uses too), and
// a warning with code mean-fixed says that only differences are
// meaningful.
//
// Breaks: the places where edge data stop being smooth are found once per
// problem by FindBreaks, classified (BreakClass: a value break inside a
// value edge, a flux break of flux or ambient inside a flux or convection
// edge, a corner break where two prescribed values differ, a kink where
// the slope of value, flux or ambient data jumps), and carried out of the
// series analytically: corner breaks by the angle function above, breaks
// inside an edge by break pieces (breakfield.go: the angle function, or
// Re(w log w) for a flux break, Im(w log w) for a value kink,
// Re(w^2 log w) for a flux or ambient kink, about the break's place), the
// rest of the data summed by the series (SolveBreaks). Quadratures split
// at flux breaks and kinks, so the flow of piecewise-linear flux data is
// exact to rounding.
//
// FindBreaks also refuses data the series cannot carry: a pole between
// sample points (the data grow like a power of the distance near it, where
// at a step they stay bounded) returns *PoleError, data beyond MaxData in
// magnitude *DataRangeError.
//
// Weak exchange: with no value edge and every convection edge's Biot
// number h L/k below 1e-4, the sub-problems' smallest eigenvalue, about
// sqrt(2 Bi)/L, leaves too few digits for the nearly uniform level.
// SolveBreaks then solves the limit h -> 0 (weak.go): the field is a level,
// fixed by the balance of the exchange with the ambients, plus an all-flux
// part of mean zero whose convection data are the flux h (ambient - u)
// they carry, corrected until Bi^n is below the tolerance.
//
// Flow through an edge with a value break inside it or a corner break at
// one of its ends is infinite (the gradient grows like 1/r): Flow reports
// finite = false and Warnings says where.
package series
