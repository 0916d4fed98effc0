package series

import (
	"math"
	"sort"

	"edgewise/solver/problem"
)

// mixed reports whether any edge of p is mixed (problem.Edge.Parts).
func mixed(p *problem.Problem) bool {
	for _, e := range p.Edges {
		if e.Mixed() {
			return true
		}
	}
	return false
}

// mixedBreaks is FindBreaks for a problem with mixed edges: the breaks of
// each part's data strictly inside the part (as FindBreaks finds them on
// a one-condition edge), where two parts meet a ValueBreak when both hold
// values that differ, a PartMeet when a value part meets another kind, a
// FluxBreak otherwise; and the corner breaks, where the parts or edges
// meeting at a corner both hold values that differ. Every place inside a
// mixed edge where its data or condition change is recorded in its
// Breaks, for the quadratures.
func mixedBreaks(p *problem.Problem) ([]Break, error) {
	var out []Break
	for _, side := range problem.Sides {
		e := &p.Edges[side]
		e.Breaks = nil
		if !e.Mixed() {
			bs, err := edgeBreaks(p, side)
			if err != nil {
				return nil, err
			}
			for _, b := range bs {
				if b.Class == FluxBreak || b.Class == KinkBreak {
					e.Breaks = append(e.Breaks, b.S)
				}
			}
			out = append(out, bs...)
			continue
		}
		L := p.Length(side)
		for i, part := range e.Parts {
			from, to := e.PartRange(i, L)
			one := *p
			one.Edges[side] = problem.Edge{Kind: part.Kind, F: part.F, Hc: 1}
			bs, err := edgeBreaks(&one, side)
			if err != nil {
				return nil, err
			}
			for _, b := range bs {
				if b.S > from && b.S < to {
					out = append(out, b)
					e.Breaks = append(e.Breaks, b.S)
				}
			}
			if i == 0 {
				continue
			}
			prev := e.Parts[i-1]
			a, b := prev.F(from), part.F(from)
			br := Break{Class: FluxBreak, Side: side, Corner: -1, S: from, From: a, To: b}
			switch {
			case prev.Kind == problem.Value && part.Kind == problem.Value:
				br.Class = ValueBreak
				if a == b || math.Abs(a-b) <= 1e-12*max(math.Abs(a), math.Abs(b)) {
					br.Class = KinkBreak
					br.From, br.To = 0, 0
				}
			case prev.Kind == problem.Value || part.Kind == problem.Value:
				br.Class, br.From, br.To = PartMeet, 0, 0
			}
			out = append(out, br)
			e.Breaks = append(e.Breaks, from)
		}
		sort.Float64s(e.Breaks)
	}
	// corners: the condition that touches each corner
	for c := 0; c < 4; c++ {
		e1, e2 := problem.Side(c), problem.Side((c+3)%4)
		k1, f1 := endCondition(p, e1, edgeEnd(e1, c))
		k2, f2 := endCondition(p, e2, edgeEnd(e2, c))
		if k1 != problem.Value || k2 != problem.Value {
			continue
		}
		s := float64(edgeEnd(e1, c)) * p.Length(e1)
		v1, v2 := f1(s), f2(float64(edgeEnd(e2, c))*p.Length(e2))
		if math.Abs(v1-v2) > 1e-14*max(math.Abs(v1), math.Abs(v2), 1e-300) {
			out = append(out, Break{Class: CornerBreak, Side: e1, Corner: c, S: s, From: v1, To: v2})
		}
	}
	return out, nil
}

// endCondition returns the kind and data of the condition at one end of an
// edge (0 its start, 1 its end).
func endCondition(p *problem.Problem, side problem.Side, end int) (problem.Kind, func(float64) float64) {
	e := p.Edges[side]
	if !e.Mixed() {
		return e.Kind, e.F
	}
	q := e.Parts[0]
	if end == 1 {
		q = e.Parts[len(e.Parts)-1]
	}
	return q.Kind, q.F
}
