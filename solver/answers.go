package solver

import (
	"fmt"
	"math"

	"edgewise/solver/gauss"
	"edgewise/solver/physics"
	"edgewise/solver/problem"
	"edgewise/solver/project"
	"edgewise/solver/series"
)

// The derived answers each trade reports, computed from the solved field
// by the engine, so that the runner and the page agree. The quantities
// that hold for every physics (edge means, flows per length, conductance
// between terminals, the flow net) come first; each physics then adds its
// own (trades.go); the flow net is in flownet.go and trace.go.
//
// Parts: the conductance, the charge and the exit gradient are taken part
// by part: a one-condition edge is one part (index 0), an edge made of
// segments one part per segment (partsOf), and everything below reads
// parts only.

// Answers are the derived quantities of a solve.
type Answers struct {
	// Conductance is the two-terminal conductance, nil when it is not
	// defined; NoConductance says why in one line.
	Conductance   *Conductance
	NoConductance string
	// FlowNet is the flow net (flow lines with equipotentials); its
	// Reason says why there is none.
	FlowNet FlowNet
	// Exactly one of these is set, by the project's physics.
	Heat          *HeatAnswers
	Electrostatic *ElectroAnswers
	Seepage       *SeepageAnswers
	// Singular lists the points where the gradient is unbounded (two
	// prescribed values meet), and Near the distance from them inside
	// which peaks are not taken.
	Singular [][2]float64
	Near     float64
}

// Terminal is one side of a two-terminal problem: its value and the parts
// held at it, named EDGE[i].
type Terminal struct {
	Value float64
	Parts []string
}

// Conductance is the flow between two terminals per unit difference
// (DESIGN.md, "Two-terminal conductance").
type Conductance struct {
	High, Low     Terminal
	Flow          float64 // into the region through the high terminal, per unit depth
	PerDifference float64 // Flow / (high - low)
	ShapeFactor   float64 // Flow / (sqrt(kx ky) (high - low))
}

// part is a stretch of one edge with one condition: a whole one-condition
// edge, or one part (segment) of a mixed edge.
type part struct {
	side     problem.Side
	index    int
	from, to float64 // along the edge
	kind     problem.Kind
	f        func(float64) float64 // its data
	hc       func(float64) float64 // its convection coefficient (convection)
	seg      *SegmentFlow          // its flow and mean in the result (nil before)
}

func (q part) name() string { return fmt.Sprintf("%s[%d]", q.side, q.index) }

// partsOf lists the parts of an edge, with their flows and means from the
// result r (nil: without them).
func partsOf(pr *problem.Problem, r *Result, side problem.Side) []part {
	e := pr.Edges[side]
	L := pr.Length(side)
	var out []part
	if !e.Mixed() {
		hc := e.Hc
		out = []part{{side: side, from: 0, to: L, kind: e.Kind, f: e.F, hc: func(float64) float64 { return hc }}}
	}
	for i, p := range e.Parts {
		from, to := e.PartRange(i, L)
		out = append(out, part{side: side, index: i, from: from, to: to, kind: p.Kind, f: p.F, hc: p.Hc})
	}
	if r != nil && len(r.Edges[side].Segments) == len(out) {
		for i := range out {
			out[i].seg = &r.Edges[side].Segments[i]
		}
	}
	return out
}

// constH returns a part's convection coefficient when it is one number
// along the part.
func (q part) constH() (float64, bool) {
	if q.hc == nil {
		return 0, false
	}
	return series.ConstantH(q.hc, q.from, q.to)
}

// edgeRule returns Gauss-Legendre nodes and weights over [lo, hi] in
// panels (4 panels of 16 points): the mean of a smooth field along an edge
// to round-off.
func edgeRule(lo, hi float64) (xs, ws []float64) {
	const panels, n = 4, 16
	x, w := make([]float64, n), make([]float64, n)
	for p := 0; p < panels; p++ {
		a := lo + (hi-lo)*float64(p)/panels
		b := lo + (hi-lo)*float64(p+1)/panels
		gauss.Legendre(x, w, a, b)
		xs, ws = append(xs, x...), append(ws, w...)
	}
	return xs, ws
}

// partMean is the average field value along a part: the prescribed data
// on a value part, the series on the boundary elsewhere.
func partMean(pr *problem.Problem, f field, q part) float64 {
	xs, ws := edgeRule(q.from, q.to)
	var sum float64
	for i, s := range xs {
		if q.kind == problem.Value {
			sum += ws[i] * q.f(s)
			continue
		}
		x, y := pr.Point(q.side, s)
		u, _, _ := f.At(x, y)
		sum += ws[i] * u
	}
	return sum / (q.to - q.from)
}

// uniform reports whether a value part holds one value, and which.
func uniform(pr *problem.Problem, q part) (float64, bool) {
	const n = 64
	f := q.f
	v0 := f(q.from)
	for i := 1; i <= n; i++ {
		v := f(q.from + (q.to-q.from)*float64(i)/n)
		if math.Abs(v-v0) > 1e-12*max(1, math.Abs(v0)) {
			return 0, false
		}
	}
	return v0, true
}

// insulated reports whether a flux part carries no flux.
func insulated(pr *problem.Problem, q part) bool {
	if q.kind == problem.Convection {
		h, ok := q.constH()
		return ok && h == 0
	}
	const n = 64
	for i := 0; i <= n; i++ {
		if q.f(q.from+(q.to-q.from)*float64(i)/n) != 0 {
			return false
		}
	}
	return true
}

// conductance finds the two terminals and the conductance between them,
// or says in one line why it is not defined.
func conductance(pr *problem.Problem, r *Result) (*Conductance, string) {
	if pr.Source != 0 {
		return nil, "not defined: there is a source, so the flow depends on more than the difference of two values"
	}
	type group struct {
		v     float64
		parts []part
	}
	var groups []group
	for _, side := range problem.Sides {
		for _, q := range partsOf(pr, r, side) {
			switch {
			case q.kind == problem.Convection && !insulated(pr, q):
				where := "the " + side.String() + " edge"
				if pr.Edges[side].Mixed() {
					where = q.name()
				}
				return nil, fmt.Sprintf("not defined: convection is present (%s)", where)
			case q.kind != problem.Value:
				if !insulated(pr, q) {
					return nil, fmt.Sprintf("not defined: a flux enters through %s, which is not insulated", q.name())
				}
				continue
			}
			v, ok := uniform(pr, q)
			if !ok {
				return nil, fmt.Sprintf("not defined: the value on %s is not uniform", q.name())
			}
			found := false
			for g := range groups {
				if math.Abs(groups[g].v-v) <= 1e-12*max(1, math.Abs(v)) {
					groups[g].parts, found = append(groups[g].parts, q), true
				}
			}
			if !found {
				groups = append(groups, group{v: v, parts: []part{q}})
			}
		}
	}
	switch {
	case len(groups) > 2:
		return nil, fmt.Sprintf("not defined: the value parts hold %d different values, more than two", len(groups))
	case len(groups) < 2:
		return nil, "not defined: there are not two different prescribed values"
	}
	hi, lo := groups[0], groups[1]
	if hi.v < lo.v {
		hi, lo = lo, hi
	}
	c := &Conductance{High: Terminal{Value: hi.v}, Low: Terminal{Value: lo.v}}
	for _, q := range hi.parts {
		c.High.Parts = append(c.High.Parts, q.name())
		if q.seg == nil || !q.seg.Finite {
			return nil, "infinite: the two terminals meet at a corner (or a step), where the flow has no finite total"
		}
		c.Flow += *q.seg.Flow
	}
	for _, q := range lo.parts {
		c.Low.Parts = append(c.Low.Parts, q.name())
		if q.seg == nil || !q.seg.Finite {
			return nil, "infinite: the two terminals meet at a corner (or a step), where the flow has no finite total"
		}
	}
	du := hi.v - lo.v
	c.PerDifference = c.Flow / du
	c.ShapeFactor = c.Flow / (math.Sqrt(pr.Kx*pr.Ky) * du)
	return c, ""
}

// singularPoints lists where two prescribed values meet (a corner break
// or a step inside a value edge) and where a value part meets a flux or
// convection part: the gradient is unbounded there.
func singularPoints(pr *problem.Problem, breaks []series.Break) [][2]float64 {
	var pts [][2]float64
	corners := [4][2]float64{{0, 0}, {pr.W, 0}, {pr.W, pr.H}, {0, pr.H}}
	for _, b := range breaks {
		switch b.Class {
		case series.CornerBreak:
			pts = append(pts, corners[b.Corner])
		case series.ValueBreak, series.PartMeet:
			x, y := pr.Point(b.Side, b.S)
			pts = append(pts, [2]float64{x, y})
		}
	}
	return pts
}

// NearFraction is the distance from a singular point, as a fraction of the
// shorter side, inside which peaks of the gradient are not taken.
const NearFraction = 0.02

// farFrom reports whether (x, y) is at least d from every point.
func farFrom(pts [][2]float64, x, y, d float64) bool {
	for _, p := range pts {
		if math.Hypot(x-p[0], y-p[1]) < d {
			return false
		}
	}
	return true
}

// answers computes the derived answers of a solved project.
func answers(p *project.Project, pr *problem.Problem, f field, out *Output, breaks []series.Break) *Answers {
	r := &out.Result
	a := &Answers{Singular: singularPoints(pr, breaks), Near: NearFraction * min(pr.W, pr.H)}
	a.Conductance, a.NoConductance = conductance(pr, r)
	asked := project.Asked{}
	if p.Answers != nil {
		asked = *p.Answers
	}
	a.FlowNet = flowNet(pr, out, a, asked.Channels)
	switch p.Physics {
	case physics.Heat:
		a.Heat = heatAnswers(pr, r, a)
	case physics.Electrostatic:
		a.Electrostatic = electroAnswers(pr, f, out, a, asked)
	case physics.Seepage:
		a.Seepage = seepageAnswers(pr, out, a, asked)
	}
	return a
}
