package fdcheck

import (
	"fmt"
	"math"

	"edgewise/solver/linalg"
	"edgewise/solver/problem"
)

// Grid holds node values u[j*(Nx+1)+i] at x = i*W/Nx, y = j*H/Ny.
type Grid struct {
	Nx, Ny int
	W, H   float64
	U      []float64

	// Inflow is the discrete flow entering through each edge per unit
	// depth, indexed by problem.Side (see the package comment for how
	// corners are shared).
	Inflow [4]float64
	// PartInflow is the discrete flow entering through each part of each
	// edge, indexed by problem.Side and then by part (one entry, equal to
	// Inflow, for an edge that is not mixed); each edge's entries add up
	// to its Inflow (see the package comment, "Edges made of parts").
	PartInflow [4][]float64
	// PartMean is the mean of the field along each part of each edge,
	// indexed like PartInflow: the mean of the data on a value part, the
	// mean of the piecewise-linear interpolation of the edge's node values
	// on any other part (for a flux or convection part, the mean surface
	// value under it).
	PartMean [4][]float64
	// SourceTotal is Source*W*H, so that the four inflows plus SourceTotal
	// add up to zero to round-off.
	SourceTotal float64
	// Mean is the area mean of the field by the trapezoid rule on the grid
	// (zero for all-flux problems, by the rule of the package comment).
	// Richardson extrapolates it like the node values, which removes the
	// h^2 error of the scheme and of the rule together.
	Mean float64
}

// At returns the bilinear interpolation of the node values at (x, y).
// Points outside the rectangle are clamped to its nearest edge.
func (g *Grid) At(x, y float64) float64 {
	i, tx := locate(x, g.W, g.Nx)
	j, ty := locate(y, g.H, g.Ny)
	row := g.Nx + 1
	u00 := g.U[j*row+i]
	u10 := g.U[j*row+i+1]
	u01 := g.U[(j+1)*row+i]
	u11 := g.U[(j+1)*row+i+1]
	return (1-ty)*((1-tx)*u00+tx*u10) + ty*((1-tx)*u01+tx*u11)
}

// locate returns the interval index k in [0, n-1] holding v on [0, length]
// split into n intervals, and the fraction t in [0, 1] of v across it.
func locate(v, length float64, n int) (k int, t float64) {
	f := v / length * float64(n)
	switch {
	case f <= 0:
		return 0, 0
	case f >= float64(n):
		return n - 1, 1
	case f != f: // NaN: let it propagate through the weights
		return 0, f
	}
	k = int(f)
	if k > n-1 {
		k = n - 1
	}
	return k, f - float64(k)
}

// ImbalanceError reports an all-flux problem (no value part, no
// convection part with Hc > 0) whose discrete inflows and source do not add up to
// zero, so that it has no steady state.
type ImbalanceError struct {
	Inflow      float64 // sum of the discrete edge inflows, per unit depth
	SourceTotal float64 // Source * W * H
}

func (e *ImbalanceError) Error() string {
	return fmt.Sprintf("fdcheck: no steady state: no edge holds a value or convects, "+
		"and the edge inflow %.6g plus the source %.6g leaves %.6g unbalanced",
		e.Inflow, e.SourceTotal, e.Inflow+e.SourceTotal)
}

// balanceTol is the relative tolerance of the all-flux compatibility test,
// relative to the largest single term of the sum.
const balanceTol = 1e-9

// Solve solves on an Nx x Ny interval grid (nx, ny >= 2).
//
// It returns the error of p.Validate, a *problem.NonFiniteError for edge
// data or a convection coefficient that is not finite where it is
// evaluated (a boundary node, or a quadrature point of a piece), an
// *ImbalanceError for an unbalanced all-flux problem, or an error if the
// system cannot be factorized. It panics if nx or ny is below 2.
func Solve(p *problem.Problem, nx, ny int) (*Grid, error) {
	return solve(p, nx, ny, false)
}

// solve is Solve; with balanced the balance of an all-flux problem is
// taken as known (see RichardsonBalanced).
func solve(p *problem.Problem, nx, ny int, balanced bool) (*Grid, error) {
	if nx < 2 || ny < 2 {
		panic(fmt.Sprintf("fdcheck: grid must have at least 2 x 2 intervals, got %d x %d", nx, ny))
	}
	if err := p.Validate(); err != nil {
		return nil, err
	}
	s, err := newSystem(p, nx, ny)
	if err != nil {
		return nil, err
	}
	s.balanced = balanced
	if err := s.assemble(); err != nil {
		return nil, err
	}
	if err := s.solve(); err != nil {
		return nil, err
	}
	g := &Grid{Nx: nx, Ny: ny, W: p.W, H: p.H, U: make([]float64, len(s.u)), SourceTotal: p.Source * p.W * p.H}
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			g.U[j*(nx+1)+i] = s.u[s.node(i, j)]
		}
	}
	g.Inflow, g.PartInflow = s.inflows()
	g.Mean = s.mean()
	if g.PartMean, err = s.partMeans(); err != nil {
		return nil, err
	}
	return g, nil
}

// Richardson solves on (nx, ny) and (2nx, 2ny) and returns the extrapolated values
// (4 u_fine - u_coarse)/3 at the coarse nodes, plus the max |u_fine - u_coarse| as an
// error indicator of the fine grid.
//
// The inflows of the returned grid are extrapolated the same way; where an
// edge flow is infinite (a jump of value at a corner) they do not converge.
func Richardson(p *problem.Problem, nx, ny int) (g *Grid, indicator float64, err error) {
	return richardson(p, nx, ny, false)
}

// RichardsonBalanced is Richardson for a problem whose balance is known
// (an all-flux problem that a more accurate quadrature of its data has
// found balanced): the imbalance of the grid's own trapezoid rule, an
// error of that rule and not of the problem, is spread over the cells
// whatever its size instead of being reported.
func RichardsonBalanced(p *problem.Problem, nx, ny int) (g *Grid, indicator float64, err error) {
	return richardson(p, nx, ny, true)
}

func richardson(p *problem.Problem, nx, ny int, balanced bool) (g *Grid, indicator float64, err error) {
	coarse, err := solve(p, nx, ny, balanced)
	if err != nil {
		return nil, 0, err
	}
	fine, err := solve(p, 2*nx, 2*ny, balanced)
	if err != nil {
		return nil, 0, err
	}
	frow := 2*nx + 1
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			k := j*(nx+1) + i
			uc, uf := coarse.U[k], fine.U[2*j*frow+2*i]
			indicator = math.Max(indicator, math.Abs(uf-uc))
			coarse.U[k] = (4*uf - uc) / 3
		}
	}
	for e := range coarse.Inflow {
		coarse.Inflow[e] = (4*fine.Inflow[e] - coarse.Inflow[e]) / 3
		for i, c := range coarse.PartInflow[e] {
			coarse.PartInflow[e][i] = (4*fine.PartInflow[e][i] - c) / 3
		}
	}
	coarse.Mean = (4*fine.Mean - coarse.Mean) / 3
	for e := range coarse.PartMean {
		for i, c := range coarse.PartMean[e] {
			coarse.PartMean[e][i] = (4*fine.PartMean[e][i] - c) / 3
		}
	}
	return coarse, indicator, nil
}

// system is the assembled grid system. Nodes are numbered along the shorter
// side first so that the band is as narrow as it can be.
type system struct {
	p        *problem.Problem
	nx, ny   int
	hx, hy   float64
	wx, wy   []float64 // cell widths: the trapezoid weights
	si, sj   int       // index strides in i and j
	k        int       // bandwidth
	n        int       // number of nodes
	band     []float64 // upper band, row-major, stride k+1
	rhs      []float64
	fixed    []bool // node value prescribed (value parts, or the pinned node)
	val      []float64
	onValue  []bool            // node held by a value part (not merely pinned)
	parts    [4][]problem.Part // each edge's parts (one for an edge that is not mixed)
	bnodes   [4][]bnode        // each edge's nodes, by s
	singular bool              // all-flux: one node pinned, mean removed after
	balanced bool              // all-flux balance known: spread any discrete imbalance
	u        []float64
}

func newSystem(p *problem.Problem, nx, ny int) (*system, error) {
	s := &system{p: p, nx: nx, ny: ny, hx: p.W / float64(nx), hy: p.H / float64(ny)}
	if nx <= ny {
		s.si, s.sj, s.k = 1, nx+1, nx+1
	} else {
		s.si, s.sj, s.k = ny+1, 1, ny+1
	}
	s.n = (nx + 1) * (ny + 1)
	s.wx = weights(s.hx, nx)
	s.wy = weights(s.hy, ny)
	s.band = make([]float64, s.n*(s.k+1))
	s.rhs = make([]float64, s.n)
	s.fixed = make([]bool, s.n)
	s.val = make([]float64, s.n)
	s.onValue = make([]bool, s.n)
	for _, e := range problem.Sides {
		s.parts[e] = edgeParts(p, e)
		bn, err := s.boundary(e)
		if err != nil {
			return nil, err
		}
		s.bnodes[e] = bn
	}
	return s, nil
}

// weights returns the cell widths of a grid of n intervals of width h.
func weights(h float64, n int) []float64 {
	w := make([]float64, n+1)
	for i := range w {
		w[i] = h
	}
	w[0], w[n] = h/2, h/2
	return w
}

func (s *system) node(i, j int) int { return i*s.si + j*s.sj }

// edgeNodes returns the number of intervals along edge e.
func (s *system) edgeNodes(e problem.Side) int {
	if e == problem.Bottom || e == problem.Top {
		return s.nx
	}
	return s.ny
}

// edgeNode returns the node index and segment length of the t-th node of
// edge e, counted along s.
func (s *system) edgeNode(e problem.Side, t int) (a int, seg float64) {
	switch e {
	case problem.Bottom:
		return s.node(t, 0), s.wx[t]
	case problem.Top:
		return s.node(t, s.ny), s.wx[t]
	case problem.Left:
		return s.node(0, t), s.wy[t]
	default: // problem.Right
		return s.node(s.nx, t), s.wy[t]
	}
}

// eachFace calls f for every pair of neighbouring nodes with the
// conductance of the face between their cells.
func (s *system) eachFace(f func(a, b int, c float64)) {
	kx, ky := s.p.Kx, s.p.Ky
	for j := 0; j <= s.ny; j++ {
		for i := 0; i <= s.nx; i++ {
			a := s.node(i, j)
			if i < s.nx {
				f(a, a+s.si, kx*s.wy[j]/s.hx)
			}
			if j < s.ny {
				f(a, a+s.sj, ky*s.wx[i]/s.hy)
			}
		}
	}
}

// assemble builds the band matrix and right-hand side.
func (s *system) assemble() error {
	p := s.p
	// Value parts fix their nodes; where two hold one node (a corner, or a
	// boundary between two value parts, which the edge has averaged) it
	// takes the mean of their values.
	count := make([]int, s.n)
	for _, e := range problem.Sides {
		for _, bn := range s.bnodes[e] {
			if bn.fixed {
				s.val[bn.a] += bn.val
				count[bn.a]++
			}
		}
	}
	for a, c := range count {
		if c > 0 {
			s.fixed[a], s.onValue[a] = true, true
			s.val[a] /= float64(c)
		}
	}
	if err := s.checkBalance(); err != nil {
		return err
	}

	stride := s.k + 1
	s.eachFace(func(a, b int, c float64) {
		s.band[a*stride] += c
		s.band[b*stride] += c
		switch {
		case !s.fixed[a] && !s.fixed[b]:
			s.band[a*stride+(b-a)] -= c // b > a always
		case !s.fixed[a]:
			s.rhs[a] += c * s.val[b]
		case !s.fixed[b]:
			s.rhs[b] += c * s.val[a]
		}
	})
	for j, wy := range s.wy {
		for i, wx := range s.wx {
			s.rhs[s.node(i, j)] += p.Source * wx * wy
		}
	}
	for _, e := range problem.Sides {
		for _, bn := range s.bnodes[e] {
			if s.fixed[bn.a] {
				continue
			}
			for _, pc := range bn.pieces {
				// a free node has data pieces only: Flux and Convection
				s.band[bn.a*stride] += pc.h
				s.rhs[bn.a] += pc.f
			}
		}
	}
	for a, f := range s.fixed {
		if f {
			// Keep the natural diagonal as the scale of the row.
			s.rhs[a] = s.band[a*stride] * s.val[a]
		}
	}
	return nil
}

// checkBalance decides whether the problem is all-flux (no node held by a
// value part, no convection with a positive integral of Hc over any
// segment) and, if so, checks that the discrete inflows balance the
// source. A balanced all-flux problem has its imbalance (at most
// balanceTol of the largest term, any size when the balance is known)
// spread over the cells by area, so that the system is exactly compatible,
// and node 0 pinned; solve removes the mean afterwards.
func (s *system) checkBalance() error {
	p := s.p
	for _, e := range problem.Sides {
		for _, bn := range s.bnodes[e] {
			if bn.fixed {
				return nil
			}
			for _, pc := range bn.pieces {
				if pc.h > 0 {
					return nil
				}
			}
		}
	}
	source := p.Source * p.W * p.H
	inflow, largest := 0.0, math.Abs(source)
	for _, e := range problem.Sides {
		for _, bn := range s.bnodes[e] {
			in := 0.0
			for _, pc := range bn.pieces {
				in += pc.f // convection with Hc = 0: insulated, f = 0
			}
			inflow += in
			largest = math.Max(largest, math.Abs(in))
		}
	}
	imbalance := inflow + source
	if !s.balanced && math.Abs(imbalance) > balanceTol*largest {
		return &ImbalanceError{Inflow: inflow, SourceTotal: source}
	}
	s.singular = true
	area := p.W * p.H
	for j, wy := range s.wy {
		for i, wx := range s.wx {
			s.rhs[s.node(i, j)] -= imbalance * wx * wy / area
		}
	}
	s.fixed[0], s.val[0] = true, 0
	return nil
}

// solve factorizes the system and solves it into s.u, by the band
// Cholesky of linalg (the same factor as LAPACK's Pbtrf/Pbtrs, checked
// against gonum's in linalg's tests; gonum's BLAS and LAPACK are no longer
// linked into the engine for it). The system is an M-matrix by
// construction, so a failed factorization or a non-finite result means
// data far outside any physical range.
func (s *system) solve() error {
	if !linalg.CholeskyBand(s.band, s.n, s.k) {
		return fmt.Errorf("fdcheck: the %d x %d grid system is not positive definite", s.nx, s.ny)
	}
	linalg.SolveBand(s.band, s.n, s.k, s.rhs)
	for _, v := range s.rhs {
		if v-v != 0 {
			return fmt.Errorf("fdcheck: the %d x %d grid system gave a non-finite result (data out of range)", s.nx, s.ny)
		}
	}
	s.u = s.rhs
	if s.singular {
		mean := s.mean()
		for a := range s.u {
			s.u[a] -= mean
		}
	}
	return nil
}

// mean returns the trapezoid area mean of the solution.
func (s *system) mean() float64 {
	sum := 0.0
	for j, wy := range s.wy {
		for i, wx := range s.wx {
			sum += wx * wy * s.u[s.node(i, j)]
		}
	}
	return sum / (s.p.W * s.p.H)
}

// inflows returns the discrete flow entering through each edge and
// through each of its parts.
func (s *system) inflows() (flow [4]float64, parts [4][]float64) {
	p := s.p
	// Reaction of the nodes held by value parts: what enters through their
	// boundary segments so that their balance closes.
	react := make([]float64, s.n)
	s.eachFace(func(a, b int, c float64) {
		if s.onValue[a] || s.onValue[b] {
			d := c * (s.u[a] - s.u[b])
			react[a] += d
			react[b] -= d
		}
	})
	for j, wy := range s.wy {
		for i, wx := range s.wx {
			react[s.node(i, j)] -= p.Source * wx * wy
		}
	}
	for _, e := range problem.Sides {
		parts[e] = make([]float64, len(s.parts[e]))
	}
	for _, e := range problem.Sides {
		m := len(s.bnodes[e]) - 1
		for t, bn := range s.bnodes[e] {
			if !s.onValue[bn.a] {
				for _, pc := range bn.pieces {
					parts[e][pc.part] += pc.flow(s.u[bn.a])
				}
				continue
			}
			if t == 0 || t == m {
				continue // corners below, once each
			}
			r := react[bn.a]
			for _, pc := range bn.pieces {
				if pc.kind != problem.Value {
					f := pc.flow(s.u[bn.a])
					parts[e][pc.part] += f
					r -= f
				}
			}
			shareByLength(parts[e], bn.pieces, r)
		}
	}
	for e := problem.Bottom; e <= problem.Left; e++ {
		// the corner at the start of e (bottom-left for the bottom edge,
		// and so on counter-clockwise)
		t := 0
		if e == problem.Top || e == problem.Left {
			t = len(s.bnodes[e]) - 1
		}
		if bn := s.bnodes[e][t]; s.onValue[bn.a] {
			o, ot := s.neighbour(e, t)
			s.cornerShare(e, t, o, ot, react, &parts)
		}
	}
	for _, e := range problem.Sides {
		for _, f := range parts[e] {
			flow[e] += f
		}
	}
	return flow, parts
}

// shareByLength adds r to the parts of the value pieces among pieces, in
// proportion to their lengths (all to the first piece's part if none is
// a value piece, as on a node held by a value part shorter than the
// round-off of the node positions).
func shareByLength(parts []float64, pieces []piece, r float64) {
	total := valueLength(pieces)
	if total == 0 {
		parts[pieces[0].part] += r
		return
	}
	for _, pc := range pieces {
		if pc.kind == problem.Value {
			parts[pc.part] += r * pc.length / total
		}
	}
}

// valueLength returns the length of the value pieces among pieces.
func valueLength(pieces []piece) float64 {
	l := 0.0
	for _, pc := range pieces {
		if pc.kind == problem.Value {
			l += pc.length
		}
	}
	return l
}

// cornerShare shares the reaction of a corner node held by a value part
// between the parts of its two edges: e (its t-th node) and o (its ot-th
// node). Data pieces (a flux or convection part touching the corner) take
// their own data term. If only one edge holds the corner at a value, its
// value pieces take the rest. If both do, each takes its entering flux
// extrapolated from its own inner nodes times its value length, and the
// two share what is left (the discretisation error, O(h^2) for smooth
// data) equally; a split in proportion to the lengths would be only
// first-order accurate where the two fluxes differ.
func (s *system) cornerShare(e problem.Side, t int, o problem.Side, ot int, react []float64, parts *[4][]float64) {
	a := s.bnodes[e][t].a
	u := s.u[a]
	r := react[a]
	for _, side := range [2]problem.Side{e, o} {
		k := t
		if side == o {
			k = ot
		}
		for _, pc := range s.bnodes[side][k].pieces {
			if pc.kind != problem.Value {
				f := pc.flow(u)
				parts[side][pc.part] += f
				r -= f
			}
		}
	}
	pe, po := s.bnodes[e][t].pieces, s.bnodes[o][ot].pieces
	le, lo := valueLength(pe), valueLength(po)
	switch {
	case lo == 0:
		shareByLength(parts[e], pe, r)
		return
	case le == 0:
		shareByLength(parts[o], po, r)
		return
	}
	fe, oke := s.cornerFlux(e, t, react)
	fo, oko := s.cornerFlux(o, ot, react)
	re := r * le / (le + lo) // no inner nodes to extrapolate from: by length
	if oke && oko {
		own, other := fe*le, fo*lo
		re = own + (r-own-other)/2
	}
	shareByLength(parts[e], pe, re)
	shareByLength(parts[o], po, r-re)
}

// cornerFlux estimates the entering flux per unit length at the t-th
// (corner) node of edge e, held by a value part, from the reactions of the
// nearest inner nodes (at h, 2h, 3h) by quadratic extrapolation, so that
// the error of the corner term is O(h^4) and leaves the h^2 expansion of
// the flow clean for Richardson; times the value length it is the
// trapezoid term that the node balance holds (every node's term is its
// point flux times its segment). Only inner nodes whose segments lie
// wholly on value parts count (the flux is smooth across a boundary
// between two value parts that agree there; where they disagree the flow
// is infinite anyway): with two of them it extrapolates linearly, with
// one it takes that node's flux, with none it reports false.
func (s *system) cornerFlux(e problem.Side, t int, react []float64) (float64, bool) {
	m := s.edgeNodes(e)
	var q [3]float64 // flux at the k-th inner node from the corner
	n := 0
	for k := 1; k <= min(3, m-1); k++ {
		i := k
		if t != 0 {
			i = m - k
		}
		bn := s.bnodes[e][i]
		if !bn.fixed || !onlyValue(bn.pieces) {
			break
		}
		_, seg := s.edgeNode(e, i)
		q[k-1] = react[bn.a] / seg
		n++
	}
	switch n {
	case 3:
		return 3*q[0] - 3*q[1] + q[2], true
	case 2:
		return 2*q[0] - q[1], true
	case 1:
		return q[0], true
	}
	return 0, false
}

// onlyValue reports whether every piece is a value piece.
func onlyValue(pieces []piece) bool {
	for _, pc := range pieces {
		if pc.kind != problem.Value {
			return false
		}
	}
	return true
}

// neighbour returns the other edge meeting edge e at its t-th node (t = 0
// or the last), and that corner's index along the other edge.
func (s *system) neighbour(e problem.Side, t int) (problem.Side, int) {
	first := t == 0
	switch e {
	case problem.Bottom:
		if first {
			return problem.Left, 0
		}
		return problem.Right, 0
	case problem.Top:
		if first {
			return problem.Left, s.ny
		}
		return problem.Right, s.ny
	case problem.Left:
		if first {
			return problem.Bottom, 0
		}
		return problem.Top, 0
	default: // problem.Right
		if first {
			return problem.Bottom, s.nx
		}
		return problem.Top, s.nx
	}
}
