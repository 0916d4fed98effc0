package project

import (
	"math"

	"edgewise/solver/problem"
)

// The ranges of the numbers the engine handles. Outside them products and
// powers of the sizes, conductivities and data overflow or lose every
// digit, so a project outside them is refused up front, with the range.
const (
	minSize, maxSize      = 1e-12, 1e12 // width and height
	minK, maxK            = 1e-30, 1e30 // conductivity
	maxBiot               = 1e8         // h L / k of a convection edge, L the longer side
	maxSource             = 1e100       // |source|
	rangeAdviceStrongBiot = "an edge that exchanges this strongly holds its ambient value: use a value edge with the ambient as its value"
)

// inRange refuses, after decoding, the numbers the engine cannot handle
// (see the constants above); the first error sticks.
func (d *decoder) inRange(p *Project) {
	if d.err == nil && p != nil {
		d.err = engineRange(p)
	}
}

// engineRange returns an error naming the first field of p outside the
// ranges the engine handles, or nil.
func engineRange(p *Project) *Error {
	for _, c := range []struct {
		path     string
		v        float64
		lo, hi   float64
		quantity string
	}{
		{"width", p.Width, minSize, maxSize, "sizes"},
		{"height", p.Height, minSize, maxSize, "sizes"},
		{"conductivity", p.Conductivity.X, minK, maxK, "conductivities"},
		{"conductivity", p.Conductivity.Y, minK, maxK, "conductivities"},
	} {
		if !(c.v >= c.lo && c.v <= c.hi) {
			return Errorf(c.path, "%g is outside the range the engine handles: %s from %g to %g", c.v, c.quantity, c.lo, c.hi)
		}
	}
	if math.Abs(p.Source) > maxSource {
		return Errorf("source", "%g is outside the range the engine handles: -%g to %g", p.Source, maxSource, maxSource)
	}
	L, k := max(p.Width, p.Height), min(p.Conductivity.X, p.Conductivity.Y)
	for _, side := range problem.Sides {
		for i, seg := range p.Edges[side].Segments {
			if seg.Kind != problem.Convection {
				continue
			}
			if bi := seg.H * L / k; bi > maxBiot {
				return Errorf(SegmentPath(side, p.Edges[side], i)+".h", "%g gives a Biot number h L/k = %.3g (L the longer side, k the smaller conductivity), above the %g the engine handles; %s",
					seg.H, bi, maxBiot, rangeAdviceStrongBiot)
			}
		}
	}
	return nil
}
