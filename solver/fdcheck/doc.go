// Package fdcheck is the independent finite-difference cross-check of the
// series engine. It solves the problem of package problem,
//
//	Kx u_xx + Ky u_yy = -Source
//
// on a node-centred grid of Nx x Ny intervals that includes the boundary
// nodes, x_i = i W/Nx, y_j = j H/Ny, by a second-order finite-volume
// (equivalently ghost-node) scheme. Every node owns the cell
// [x_i - hx/2, x_i + hx/2] x [y_j - hy/2, y_j + hy/2] clipped to the
// rectangle, so boundary nodes own half cells and corner nodes quarter
// cells; the cell widths wx_i, wy_j are the trapezoid weights of the grid.
// The balance of a node is
//
//	sum over faces  K (u_nb - u)/h * (face length)
//	  + inflow through its boundary segments
//	  + Source * wx_i * wy_j  =  0
//
// which in the interior is the 5-point stencil times the cell area, and on a
// flux or convection edge is the ghost-node scheme with a central difference
// for the normal derivative, times the half (or quarter) cell area. On the
// edges:
//
//   - a Flux edge contributes F(s) * (segment length);
//   - a Convection edge contributes Hc (F(s) - u) * (segment length), so
//     Hc = 0 is an insulated edge;
//   - a Value edge fixes its nodes. At a corner touching a Value edge the
//     value edge wins; where two Value edges meet, the corner node takes the
//     mean of their two end values.
//
// Edge data is evaluated at every boundary node, corners included, even
// where a Value edge wins the corner (the edge flows need it). Where a
// node's segment holds a place where the data jump or kink
// (problem.Edge.Breaks), the segment is cut there and each piece's data
// integrated by an 8-point Gauss-Legendre rule instead of sampled.
//
// Written this way the matrix is symmetric and positive (semi)definite; it is
// stored as a band matrix (numbering the nodes along the shorter side, so the
// bandwidth is min(Nx, Ny) + 1) and solved by a band Cholesky
// factorization (linalg.CholeskyBand, tested against gonum's lapack64
// Pbtrf/Pbtrs; no condition estimate, which would cost more than the
// solve). The cost is about (Nx+1)(Ny+1) (min(Nx,Ny)+1)^2
// operations; grids up to about 64 x 64 intervals are cheap, larger ones are
// not meant for this package.
//
// The scheme is exact for every quadratic u (the 5-point stencil and the
// central boundary difference are), so its error falls like h^2 for smooth
// solutions, and Richardson extrapolation (4 u_h/2 - u_h)/3 removes the
// leading term. Where a Value edge meets a flux or convection edge at a
// corner, the ghost-node closure leaves an h^3 term (observed in the
// tests), so near such corners the extrapolated error falls like h^3
// rather than h^4.
//
// # Edges made of parts
//
// A mixed edge (problem.Edge.Parts) changes its condition along it, and a
// convection part has a coefficient Hc(s) that may vary (a one-condition
// edge is read as one part, with its constant Hc). Each boundary node
// takes the condition of the part that holds it:
//
//   - a node inside a value part, or on the boundary between a value part
//     and any other part, is fixed at that value part's value there (the
//     value part decides, so the node at a value/flux meeting holds the
//     value); on the boundary between two value parts it takes the mean
//     of their two values, as at a corner between two Value edges;
//   - any other node is free, and its boundary segment [s - h/2, s + h/2]
//     (clipped to the edge) is cut at the part boundaries and breaks
//     inside it. A flux piece contributes the integral of its F, a
//     convection piece the integrals of Hc and Hc F (the node's balance
//     gets  int Hc F ds - u int Hc ds), each by an 8-point Gauss-Legendre
//     rule on the piece; a segment that nothing cuts takes the node's own
//     sample, F(s) or Hc(s) and Hc(s) F(s), times its length, so that an
//     edge of one part is the scheme above exactly. A piece of a free
//     node's segment that lies on a value part (a boundary between nodes)
//     carries the data of the node's own part, taken at their common
//     boundary: the true flux there is unknown, and carrying the
//     neighbour's data keeps the node's balance right to O(h^2) for a
//     smooth field, where dropping the piece would be O(h).
//
// At a corner the part touching it decides, with the corner rules above.
// Only diagonal terms and right-hand sides change, so the matrix stays
// symmetric and positive (semi)definite and the band Cholesky solves it
// whatever Hc(s) does, steps from 0 to 1e9 included.
//
// Accuracy. Where parts meet at a node and a value part is on one side,
// the scheme stays second order for a smooth field. Where a flux part
// meets a convection part, or Hc jumps, inside a node's segment, the
// node's value stands for the field over the convection piece, an O(h^2)
// term in that node's balance, and the node errors there fall like
// h^2 log(1/h) (observed order 1.7..1.8 on grids of 12 to 96 intervals).
// Where a value part meets a flux or convection part the field goes like
// r^(1/2): no second-order scheme resolves it, the error near the
// meeting point falls like h^(1/2) and the flows, and through them the
// whole field, converge at first order (on the exact two-part fields,
// about 1% of the value difference away from the meeting points and 1.5%
// in the flows at 120 intervals); Richardson extrapolation removes little
// there.
//
// Grid.PartInflow holds the flow entering through each part. A free
// node's pieces go to the parts they lie on (a piece carried over a value
// part, to that value part). A fixed node's reaction is shared: its data
// pieces take their data terms (convection at the node's value) and its
// value pieces the rest, in proportion to their lengths; at a corner
// between two value parts the rule of "Edge flows" below shares it. The
// part flows of an edge add up to its Inflow. Grid.PartMean holds the mean
// of the field along each part: the mean of the data on a value part, the
// mean of the piecewise-linear interpolation of the edge's node values on
// any other part (second order for a smooth field).
//
// # All-flux problems
//
// When no node is held by a value part and no convection piece has a
// positive integral of Hc, the system is singular: a steady state exists only if the discrete inflows (edge data
// times the same segment lengths as above) plus Source*W*H add up to zero.
// If the sum is not zero to a relative 1e-9 of the largest single term (one
// node's inflow or the source total), Solve returns an *ImbalanceError.
// Otherwise the free constant is fixed by the rule
//
//	area mean of u = 0   (trapezoid weights wx_i wy_j)
//
// which is the rule the series engine uses as well.
//
// # Edge flows
//
// Grid.Inflow holds the discrete flow entering through each edge per unit
// depth: the data times segment length on Flux and Convection edges, and the
// reaction (the residual of the node balance) at the fixed nodes of Value
// edges. A corner node between a Value edge and another edge gives the other
// edge its own data term and the Value edge the rest; at a corner between
// two Value edges each edge takes its flux extrapolated from its own inner
// nodes (quadratic extrapolation from the three nearest; linear or constant
// on edges of 3 or 2 intervals, or when fewer inner nodes lie wholly on
// value parts; by length when none does) over its half segment, and the two share the remainder
// equally (second-order accurate for smooth solutions; meaningless, like
// the flow itself, at a jump of value). So the four inflows plus the source total
// balance to round-off for any solution.
//
// Errors: bad user data (a non-finite edge value, an unbalanced all-flux
// problem, a problem that fails Validate) is returned as an error; a grid
// smaller than 2 x 2 intervals is a caller bug and panics with the prefix
// "fdcheck: ".
package fdcheck
