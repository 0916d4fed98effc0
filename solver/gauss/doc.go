// Package gauss gives Gauss-Legendre quadrature rules: the n nodes x_i and
// weights w_i on [lo, hi] for which
//
//	sum_i w_i f(x_i) = int_lo^hi f(x) dx
//
// holds exactly for every polynomial f of degree up to 2n - 1.
//
// The nodes on [-1, 1] are the roots of the Legendre polynomial P_n,
// found by Newton's method from the asymptotic first guess (Tricomi)
//
//	x_k ~ (1 - 1/(8 n^2) + 1/(8 n^3)) cos(pi (4k - 1) / (4n + 2)),  k = 1 .. n
//
// with P_n and its derivative from the three-term recurrence
//
//	(j + 1) P_{j+1}(x) = (2j + 1) x P_j(x) - j P_{j-1}(x),  P_0 = 1, P_1 = x
//	(1 - x^2) P_n'(x) = n (P_{n-1}(x) - x P_n(x))
//
// and the weights are
//
//	w_k = 2 / ((1 - x_k^2) P_n'(x_k)^2).
//
// Only the nodes in [0, 1) are computed; the others are their mirror
// images, so the rule is exactly symmetric and, for odd n, the middle node
// is exactly 0. The recurrence for the weights runs in double-double
// arithmetic, and the weight is taken at the root rather than at the node
// rounded to float64 (see weight). This costs O(n^2) operations, once for
// each n up to 100: the rule on [-1, 1] is kept.
//
// Above 100 points, the rules the series needs for its coefficients (up to
// a few thousand points, a different n for each edge), O(n^2) is too slow;
// there the nodes and weights come from Bogaert's iteration-free
// asymptotic formulas (see asymptotic.go), accurate to a few ulps for such
// n at O(1) a node.
//
// A rule on [-1, 1] is mapped onto [lo, hi] by x -> (x + 1)/2 (hi - lo) + lo,
// w -> w (hi - lo)/2. The nodes come in descending order. The tests check
// nodes and weights against an independent method (gonum's integrate/quad,
// tabulated below 101 points) and the two methods here against each other
// above 100 points, to 1e-15.
package gauss
