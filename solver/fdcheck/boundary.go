package fdcheck

import (
	"math"
	"slices"

	"edgewise/solver/gauss"
	"edgewise/solver/problem"
)

// bnode is one boundary node as one edge sees it: whether the edge holds
// it at a value, and what its boundary segment on that edge contributes.
// A corner node has one bnode on each of its two edges.
type bnode struct {
	a      int     // node index
	fixed  bool    // held by a value part of this edge
	val    float64 // the value it is held at (when fixed)
	pieces []piece // its boundary segment, cut at part boundaries and breaks
}

// piece is a stretch of a node's boundary segment.
//
// On a free node every piece is a data term of kind Flux or Convection.
// On a fixed node a piece of kind Value is a stretch of a value part,
// whose flow is a share of the node's reaction; pieces of other kinds are
// still computed, for the flows of their parts.
type piece struct {
	part   int          // the part credited with the piece's flow
	kind   problem.Kind // how the piece acts on the node
	length float64
	f      float64 // integral of F (Flux) or of Hc F (Convection)
	h      float64 // integral of Hc (Convection)
}

// flow returns the flow entering through a data piece at node value u.
func (pc *piece) flow(u float64) float64 {
	if pc.kind == problem.Convection {
		return pc.f - pc.h*u
	}
	return pc.f
}

// edgeParts returns the parts of edge e: its own for a mixed edge, one
// part standing for the whole edge otherwise.
func edgeParts(p *problem.Problem, e problem.Side) []problem.Part {
	edge := &p.Edges[e]
	if edge.Mixed() {
		return edge.Parts
	}
	q := problem.Part{To: p.Length(e), Kind: edge.Kind, F: edge.F}
	if edge.Kind == problem.Convection {
		q.Hc = problem.Const(edge.Hc)
	}
	return []problem.Part{q}
}

// boundary works out the bnodes of edge e (see the package comment, "Edges
// made of parts"). It returns a *problem.NonFiniteError for data or a
// convection coefficient that is not finite where it is evaluated.
func (s *system) boundary(e problem.Side) ([]bnode, error) {
	p := s.p
	parts := s.parts[e]
	length := p.Length(e)
	m := s.edgeNodes(e)
	h := length / float64(m)
	tol := snapTol * h
	// ends[i] is where part i ends; the last runs to the edge's end
	ends := make([]float64, len(parts))
	for i := range parts {
		_, ends[i] = partRange(parts, i, length)
	}
	out := make([]bnode, m+1)
	var cuts []float64
	for t := range out {
		pos := float64(t) * h
		if t == m {
			pos = length
		}
		a, seg := s.edgeNode(e, t)
		bn := bnode{a: a}
		lo, hi := max(0, pos-h/2), min(length, pos+h/2)

		// the parts holding the node: the one it lies in, or both parts
		// of a boundary it lies on (within round-off)
		at, held := pos, [2]int{-1, -1}
		held[0] = partAt(ends, pos)
		for i := 0; i+1 < len(parts); i++ {
			if math.Abs(pos-ends[i]) <= tol {
				at, held = ends[i], [2]int{i, i + 1}
			}
		}
		count := 0
		for _, q := range held {
			if q >= 0 && parts[q].Kind == problem.Value {
				v, err := evalAt(parts[q].F, e, at)
				if err != nil {
					return nil, err
				}
				bn.val += v
				count++
			}
		}
		if count > 0 {
			bn.fixed, bn.val = true, bn.val/float64(count)
		}

		// the segment's pieces, between part boundaries and breaks
		cuts = append(cuts[:0], lo, hi)
		for i := 0; i+1 < len(parts); i++ {
			if ends[i] > lo+tol && ends[i] < hi-tol {
				cuts = append(cuts, ends[i])
			}
		}
		for _, b := range p.Edges[e].Breaks {
			if b > lo+tol && b < hi-tol {
				cuts = append(cuts, b)
			}
		}
		slices.Sort(cuts)
		cuts = slices.CompactFunc(cuts, func(x, y float64) bool { return math.Abs(x-y) <= tol })
		if q := partAt(ends, (lo+hi)/2); len(cuts) == 2 && parts[q].Kind != problem.Value {
			// an uncut segment: the node's own sample (the ghost-node scheme)
			from, to := partRange(parts, q, length)
			pc, err := sample(parts[q], q, e, min(max(pos, from), to), seg)
			if err != nil {
				return nil, err
			}
			bn.pieces = []piece{pc}
			out[t] = bn
			continue
		}
		for k := 0; k+1 < len(cuts); k++ {
			c0, c1 := cuts[k], cuts[k+1]
			q := partAt(ends, (c0+c1)/2)
			var pc piece
			var err error
			switch {
			case parts[q].Kind != problem.Value:
				pc, err = integrate(parts[q], q, e, c0, c1)
			case bn.fixed:
				pc = piece{part: q, kind: problem.Value, length: c1 - c0}
			default:
				// a free node whose segment reaches into a value part: the
				// data of the part next to it on the node's side, at their
				// common boundary, carried on over the stretch
				r := nearestData(parts, q, (c0+c1)/2 < pos)
				from, to := partRange(parts, r, length)
				pc, err = sample(parts[r], q, e, min(max(c0, from), to), c1-c0)
			}
			if err != nil {
				return nil, err
			}
			bn.pieces = append(bn.pieces, pc)
		}
		out[t] = bn
	}
	return out, nil
}

// snapTol is the distance, relative to the grid step, within which a node
// counts as lying on a part boundary and a cut is merged with a segment end
// or another cut (round-off of the node positions).
const snapTol = 1e-9

// partRange returns where part i starts and ends on an edge of the given
// length.
func partRange(parts []problem.Part, i int, length float64) (from, to float64) {
	e := problem.Edge{Parts: parts}
	return e.PartRange(i, length)
}

// partAt returns the part holding s (the later one at a boundary), from
// the parts' ends.
func partAt(ends []float64, s float64) int {
	for i := 0; i+1 < len(ends); i++ {
		if s < ends[i] {
			return i
		}
	}
	return len(ends) - 1
}

// nearestData returns the first part that is not a value part going from
// value part q towards a free node: up the edge when up, down otherwise.
// The part holding a free node is one, so one is always found.
func nearestData(parts []problem.Part, q int, up bool) int {
	step := -1
	if up {
		step = 1
	}
	for r := q + step; r >= 0 && r < len(parts); r += step {
		if parts[r].Kind != problem.Value {
			return r
		}
	}
	panic("fdcheck: a free node next to value parts only")
}

// sample returns the data piece of part q (credited to part credit) over a
// stretch of the given length, from its data at s.
func sample(q problem.Part, credit int, e problem.Side, s, length float64) (piece, error) {
	v, err := evalAt(q.F, e, s)
	if err != nil {
		return piece{}, err
	}
	pc := piece{part: credit, kind: q.Kind, length: length}
	if q.Kind != problem.Convection {
		pc.f = v * length
		return pc, nil
	}
	hc, err := evalAt(q.Hc, e, s)
	if err != nil {
		return piece{}, err
	}
	pc.h = hc * length
	pc.f = pc.h * v
	return pc, nil
}

// integrate returns the data piece of part q (index i) over [lo, hi], by
// an 8-point Gauss-Legendre rule.
func integrate(q problem.Part, i int, e problem.Side, lo, hi float64) (piece, error) {
	var xs, ws [8]float64
	gauss.Legendre(xs[:], ws[:], lo, hi)
	pc := piece{part: i, kind: q.Kind, length: hi - lo}
	for k, x := range xs {
		v, err := evalAt(q.F, e, x)
		if err != nil {
			return piece{}, err
		}
		if q.Kind != problem.Convection {
			pc.f += ws[k] * v
			continue
		}
		hc, err := evalAt(q.Hc, e, x)
		if err != nil {
			return piece{}, err
		}
		pc.h += ws[k] * hc
		pc.f += ws[k] * hc * v
	}
	return pc, nil
}

// evalAt returns f(s), or a *problem.NonFiniteError naming edge e if it is
// not finite.
func evalAt(f func(float64) float64, e problem.Side, s float64) (float64, error) {
	v := f(s)
	if v-v != 0 {
		return 0, &problem.NonFiniteError{Side: e, S: s}
	}
	return v, nil
}
