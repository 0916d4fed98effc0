package solver

import (
	"fmt"
	"math"
	"sort"

	"edgewise/solver/contour"
	"edgewise/solver/problem"
	"edgewise/solver/series"
)

// The flow net: flow lines drawn so that each channel between two
// neighbouring lines carries the same flow, with equipotentials at the
// matching step, so that the cells are curvilinear squares (in the mapped
// coordinates y' = y sqrt(kx/ky) when the material is orthotropic).
//
// For a source-free field the flow function psi (the harmonic conjugate,
// up to the factor k) has
//
//	dpsi/dy = qx,  dpsi/dx = -qy      (q = -K grad u, the flux)
//
// so that along the boundary, walked counter-clockwise, psi grows by the
// flow leaving the region, and psi is constant along insulated parts.
// Along the boundary psi follows the series' flux at the grid nodes and
// its jump along each edge is the series' edge flow; inside, each column is integrated from
// the bottom by the trapezoid rule on the grid's gradient and its small
// mismatch with the top value spread linearly, which is exact enough for a
// drawing.

// MaxDrops is the most potential drops a drawn net may have.
const MaxDrops = 200

// DefaultChannels is the number of flow channels when the project does
// not say.
const DefaultChannels = 8

// FlowNet describes the flow net of a solve; Reason says why there is
// none ("" when there is one).
type FlowNet struct {
	Reason string
	// Channels is the number of flow channels, Drops the number of
	// potential drops that makes the cells square (not a whole number in
	// general), Ratio = Channels/Drops = Flow/(k Difference).
	Channels      int
	Drops         float64
	Ratio         float64
	Flow          float64 // total flow through the net, per unit depth
	Difference    float64 // the potential difference across it
	FlowStep      float64 // flow per channel
	PotentialStep float64 // potential per drop
	Low           float64 // the potential the drops count from
	// Traced is set when the lines were traced through the flux field
	// (a source: no flow function, the net is not square); Note says so.
	Traced bool
	Note   string
	psi    []float64
	psiMin float64
	traced []float64 // the traced lines' segments
}

// flowNet builds the flow function on the output grid and the net's
// numbers.
func flowNet(pr *problem.Problem, out *Output, a *Answers, channels int) FlowNet {
	if channels <= 0 {
		channels = DefaultChannels
	}
	r := &out.Result
	var in, leaving float64
	for _, e := range r.Edges {
		if !e.Finite {
			return FlowNet{Reason: "not drawn: a flow is infinite (two prescribed values meet), so equal channels cannot be counted"}
		}
		in += max(*e.Flow, 0)
		leaving += max(-*e.Flow, 0)
	}
	if pr.Source != 0 {
		if !(leaving > 0) {
			return FlowNet{Reason: "not drawn: nothing leaves through the edges"}
		}
		n := FlowNet{Channels: channels, Traced: true, Note: tracedNote, Flow: leaving, FlowStep: leaving / float64(channels)}
		n.traced = out.traceFlowLines(pr, channels, leaving)
		return n
	}
	du := r.Max.Value - r.Min.Value
	low := r.Min.Value
	if c := a.Conductance; c != nil {
		du, low = c.High.Value-c.Low.Value, c.Low.Value
	}
	if !(du > 0) {
		return FlowNet{Reason: "not drawn: nothing flows"}
	}
	psi, psiMin, psiMax := flowFunction(pr, r, out)
	// the flow through the net is the span of the flow function: the
	// inflow when it enters through one stretch of the boundary, less when
	// the same edge lets it in and out
	in = psiMax - psiMin
	k := math.Sqrt(pr.Kx * pr.Ky)
	if !(in > 1e-9*k*du) {
		return FlowNet{Reason: "not drawn: nothing flows"}
	}
	n := FlowNet{Channels: channels, Flow: in, Difference: du, Low: low, psi: psi, psiMin: psiMin}
	n.Ratio = in / (k * du)
	n.Drops = float64(channels) / n.Ratio
	if n.Drops > MaxDrops {
		return FlowNet{Reason: fmt.Sprintf("not drawn: %d channels would need %.3g drops; ask for fewer channels", channels, n.Drops)}
	}
	n.FlowStep = in / float64(channels)
	n.PotentialStep = du / n.Drops
	return n
}

// boundaryWalk returns the grid nodes of the boundary counter-clockwise
// from (0, 0), with the edge each step runs along.
func boundaryWalk(nx, ny int) (nodes []int, sides []problem.Side) {
	add := func(i, j int, s problem.Side) {
		nodes, sides = append(nodes, j*(nx+1)+i), append(sides, s)
	}
	for i := 1; i <= nx; i++ {
		add(i, 0, problem.Bottom)
	}
	for j := 1; j <= ny; j++ {
		add(nx, j, problem.Right)
	}
	for i := nx - 1; i >= 0; i-- {
		add(i, ny, problem.Top)
	}
	for j := ny - 1; j >= 0; j-- {
		add(0, j, problem.Left)
	}
	return nodes, sides
}

// flowFunction returns psi on the output grid, psi(0, 0) = 0, and its
// smallest and largest boundary values. Along each edge psi is the trapezoid sum of the
// flux leaving at the grid nodes (the series' own gradient there), with its
// small difference from the series' edge flow spread linearly along the
// edge, so that the jump of psi along every edge is the series' flow.
func flowFunction(pr *problem.Problem, r *Result, out *Output) (psi []float64, lo, hi float64) {
	nx, ny := out.Nx, out.Ny
	hx, hy := out.W/float64(nx), out.H/float64(ny)
	psi = make([]float64, (nx+1)*(ny+1))
	nodes, sides := boundaryWalk(nx, ny)
	leaving := func(k int, side problem.Side) float64 {
		q := -series.Entering(pr, side, out.Ux[k], out.Uy[k])
		if q-q != 0 { // a corner node with no gradient of its own: the edge's flow corrects the sum
			return 0
		}
		return q
	}
	prev, v := 0, 0.0
	for t := 0; t < len(nodes); {
		side := sides[t]
		end := runEnd(sides, t) // the run of steps along this side
		h := hx
		if side == problem.Left || side == problem.Right {
			h = hy
		}
		start, acc := v, trapezoidSums(leaving, side, prev, nodes[t:end], h)
		corr := edgeCorrection(pr, r, side, acc, func(u int) float64 { return nodeS(side, nodes[t+u], nx, hx, hy) })
		v, lo, hi = setSide(psi, nodes, t, end, start, acc, corr, v, lo, hi)
		prev, t = nodes[end-1], end
	}
	interior(psi, pr.Kx, out.Ux, nx, ny, hy)
	return psi, lo, hi
}

// The loops of flowFunction run in small functions of their own, so that
// the browser optimizes little code for a large grid (see the package
// doc, Loops in functions of their own).

// runEnd returns the end of the run of steps along the side of step t.
//
//go:noinline
func runEnd(sides []problem.Side, t int) int {
	end := t
	for end < len(sides) && sides[end] == sides[t] {
		end++
	}
	return end
}

// trapezoidSums returns the trapezoid sums, step h, of the flow leaving
// through side at the nodes from prev on, one sum for each of nodes.
//
//go:noinline
func trapezoidSums(leaving func(k int, side problem.Side) float64, side problem.Side, prev int, nodes []int, h float64) []float64 {
	acc := make([]float64, 0, len(nodes))
	sum, q0 := 0.0, leaving(prev, side)
	for _, k := range nodes {
		q1 := leaving(k, side)
		sum += (q0 + q1) / 2 * h
		acc = append(acc, sum)
		q0 = q1
	}
	return acc
}

// setSide sets psi at the boundary nodes[t:end] of one side from start,
// the sums acc and the correction corr, and returns the last value and
// the smallest and largest so far.
//
//go:noinline
func setSide(psi []float64, nodes []int, t, end int, start float64, acc []float64, corr func(u int) float64, v, lo, hi float64) (float64, float64, float64) {
	for u := t; u < end; u++ {
		val := start + acc[u-t] + corr(u-t)
		if u < len(nodes)-1 { // the last node is (0, 0): psi stays 0 there (the closure is the balance)
			psi[nodes[u]] = val
			lo, hi = min(lo, val), max(hi, val)
		}
		v = val
	}
	return v, lo, hi
}

// interior sets psi inside: up each column from the bottom by the
// trapezoid rule on kx times the gradient ux, matching the top.
//
//go:noinline
func interior(psi []float64, kx float64, ux []float64, nx, ny int, hy float64) {
	acc := make([]float64, ny+1)
	for i := 1; i < nx; i++ {
		column(psi, acc, kx, ux, i, nx, ny, hy)
	}
}

// column sets psi inside column i; acc is room for ny+1 values.
//
//go:noinline
func column(psi, acc []float64, kx float64, ux []float64, i, nx, ny int, hy float64) {
	acc[0] = psi[i]
	for j := 1; j <= ny; j++ {
		k0, k1 := (j-1)*(nx+1)+i, j*(nx+1)+i
		acc[j] = acc[j-1] - kx*(ux[k0]+ux[k1])/2*hy
	}
	miss := psi[ny*(nx+1)+i] - acc[ny]
	for j := 1; j < ny; j++ {
		psi[j*(nx+1)+i] = acc[j] + miss*float64(j)/float64(ny)
	}
}

// nodeS is the place along side of grid node k.
// edgeCorrection returns what to add to the trapezoid sums acc of the flow
// leaving along one side (acc[u] up to its u-th node from the corner the
// walk starts at; node u at s(u) along the edge) so that psi takes the
// series' flows exactly: at the side's end the edge's flow, and, for an
// edge made of parts, at every place where two parts meet the flow of the
// parts before it (where a value part meets another kind the flux grows
// like r^-1/2 and the trapezoid sum misses part of it). Between those
// places the correction is linear in the distance along the side.
func edgeCorrection(pr *problem.Problem, r *Result, side problem.Side, acc []float64, s func(u int) float64) func(u int) float64 {
	L := pr.Length(side)
	back := side == problem.Top || side == problem.Left // the walk runs towards s = 0
	dist := func(x float64) float64 {
		if back {
			return L - x
		}
		return x
	}
	// the trapezoid sum at distance d, linear between the nodes
	sumAt := func(d float64) float64 {
		prevD, prevA := 0.0, 0.0
		for u := range acc {
			du := dist(s(u))
			if d <= du {
				if du == prevD {
					return acc[u]
				}
				return prevA + (acc[u]-prevA)*(d-prevD)/(du-prevD)
			}
			prevD, prevA = du, acc[u]
		}
		return prevA
	}
	knotD, knotC := []float64{0}, []float64{0}
	if segs := r.Edges[side].Segments; len(segs) > 1 {
		type cut struct{ d, exact float64 }
		var cuts []cut
		for i := 0; i+1 < len(segs); i++ {
			at, left := segs[i].To, 0.0 // the flow leaving through the parts the walk has passed
			for _, g := range segs {
				if (!back && g.To <= at) || (back && g.From >= at) {
					left -= *g.Flow
				}
			}
			cuts = append(cuts, cut{dist(at), left})
		}
		// sort.Slice, not slices.SortFunc: a generic sort of its own for
		// this type made the engine 16 KB larger
		sort.Slice(cuts, func(a, b int) bool { return cuts[a].d < cuts[b].d })
		for _, c := range cuts {
			knotD, knotC = append(knotD, c.d), append(knotC, c.exact-sumAt(c.d))
		}
	}
	knotD, knotC = append(knotD, L), append(knotC, -*r.Edges[side].Flow-acc[len(acc)-1])
	return func(u int) float64 {
		d := dist(s(u))
		for k := 1; k < len(knotD); k++ {
			if d <= knotD[k] {
				if knotD[k] == knotD[k-1] {
					return knotC[k]
				}
				return knotC[k-1] + (knotC[k]-knotC[k-1])*(d-knotD[k-1])/(knotD[k]-knotD[k-1])
			}
		}
		return knotC[len(knotC)-1]
	}
}

func nodeS(side problem.Side, k, nx int, hx, hy float64) float64 {
	i, j := k%(nx+1), k/(nx+1)
	if side == problem.Bottom || side == problem.Top {
		return float64(i) * hx
	}
	return float64(j) * hy
}

// FlowLines returns the flow net's flow lines and equipotentials as
// segments x0,y0,x1,y1 (field coordinates); nil when there is no net.
func (o *Output) FlowLines() (flow, equi []float64) {
	n := o.Result.Answers
	if n == nil || n.FlowNet.Reason != "" {
		return nil, nil
	}
	net := &n.FlowNet
	if net.Traced {
		return net.traced, nil
	}
	// at most the asked channels' lines; fewer when the flow function
	// spans less than the total inflow (several inflow parts)
	for c := 1; c < net.Channels; c++ {
		flow = contour.Lines(flow, net.psi, o.Nx, o.Ny, o.W, o.H, net.psiMin+float64(c)*net.FlowStep)
	}
	for d := 1; float64(d) < net.Drops; d++ {
		equi = contour.Lines(equi, o.U, o.Nx, o.Ny, o.W, o.H, net.Low+float64(d)*net.PotentialStep)
	}
	return flow, equi
}
