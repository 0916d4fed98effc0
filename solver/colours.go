package solver

import "edgewise/solver/colour"

// chooseColour sets the colour scale of a result from its extremes, by the
// one rule every picture follows (colour.Choose).
func (r *Result) chooseColour() {
	s := colour.Choose(r.Min.Value, r.Max.Value)
	r.Colour = ColourScale{Map: s.Map.Name(), From: s.From, To: s.To}
}

// Scale returns the colour scale the result names; an unknown map name
// gives colour.Choose over From .. To.
func (c ColourScale) Scale() colour.Scale {
	if m, ok := colour.ByName(c.Map); ok {
		return colour.Scale{Map: m, From: c.From, To: c.To}
	}
	return colour.Choose(c.From, c.To)
}
