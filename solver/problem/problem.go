// Package problem holds the resolved mathematical problem that every solver
// in edgewise works on: a rectangle 0 <= x <= W, 0 <= y <= H with
// conductivity Kx, Ky, a uniform volumetric source, and one condition on each
// of its four edges. The project file (package project) is decoded and its
// formulas compiled into this form; the series engine and the
// finite-difference cross-check both read it and never see JSON or text.
//
// The governing equation is
//
//	Kx u_xx + Ky u_yy = -Source
//
// and every flux is the flux ENTERING the region per unit edge length and
// unit depth:
//
//	bottom (y = 0):  -Ky du/dy     top   (y = H):  +Ky du/dy
//	left   (x = 0):  -Kx du/dx     right (x = W):  +Kx du/dx
//
// so that, at steady state, the inflows through the four edges plus
// Source*W*H add up to zero.
//
// Edge kinds:
//
//	Value       u = F(s)                              (Dirichlet)
//	Flux        entering flux = F(s)                  (Neumann; 0 = insulated)
//	Convection  entering flux = Hc * (F(s) - u)        (Robin; F is the ambient)
//
// The coordinate s runs along the edge: bottom and top from the left end
// (s = x), left and right from the bottom end (s = y).
package problem

import (
	"fmt"
	"math"
	"slices"
)

// Kind is the kind of condition held on an edge.
type Kind int

const (
	Value      Kind = iota // prescribed field value (Dirichlet)
	Flux                   // prescribed entering flux (Neumann)
	Convection             // entering flux = Hc (ambient - u) (Robin)
)

var kindNames = []string{Value: "value", Flux: "flux", Convection: "convection"}

func (k Kind) String() string { return nameOf(kindNames, int(k), "Kind") }

// ParseKind returns the kind whose String is name.
func ParseKind(name string) (Kind, bool) {
	k, ok := indexOf(kindNames, name)
	return Kind(k), ok
}

// Kinds lists the edge kinds in their fixed order.
var Kinds = [...]Kind{Value, Flux, Convection}

// Side names one edge of the rectangle. The order is counter-clockwise
// starting at the bottom, so that Side+1 (mod 4) is the next edge
// counter-clockwise.
type Side int

const (
	Bottom Side = iota // y = 0, s = x
	Right              // x = W, s = y
	Top                // y = H, s = x
	Left               // x = 0, s = y
)

// Sides lists the four edges in their fixed order.
var Sides = [4]Side{Bottom, Right, Top, Left}

var sideNames = []string{Bottom: "bottom", Right: "right", Top: "top", Left: "left"}

func (s Side) String() string { return nameOf(sideNames, int(s), "Side") }

// ParseSide returns the side whose String is name.
func ParseSide(name string) (Side, bool) {
	s, ok := indexOf(sideNames, name)
	return Side(s), ok
}

// nameOf returns names[i], or typ(i) for a value that has no name.
func nameOf(names []string, i int, typ string) string {
	if i < 0 || i >= len(names) {
		return fmt.Sprintf("%s(%d)", typ, i)
	}
	return names[i]
}

// indexOf returns the index of name in names (0 and false when absent).
func indexOf(names []string, name string) (int, bool) {
	i := slices.Index(names, name)
	return max(i, 0), i >= 0
}

// Edge is the condition held on one edge.
type Edge struct {
	Kind Kind
	// F is the edge data as a function of s: the value for Value, the
	// entering flux for Flux, the ambient value for Convection. F must be
	// safe for concurrent use and must not be nil. It may return a
	// non-finite number for bad user data; solvers check what they get
	// (see Check) and report it as a *NonFiniteError.
	F func(s float64) float64
	// Hc is the convection coefficient (>= 0) for Convection; unused
	// otherwise.
	Hc float64
	// Breaks lists, in increasing order, places strictly inside the edge
	// where F jumps (a flux break: a step of flux or of ambient) or its
	// slope jumps (a kink, on any kind of edge); found by
	// series.FindBreaks. Solvers that integrate F split their rules there,
	// so that a break costs them no accuracy. Optional: nil when F is
	// continuous or its breaks are not known.
	Breaks []float64
	// Parts, when not nil, makes the edge mixed: its conditions change
	// along it (see Part). Kind, F and Hc then describe no condition:
	// Compile sets Kind and F to the first part's kind and a function
	// giving each part's data, for displays only, and every solver must
	// read the parts (Mixed says when). A one-condition edge with a
	// constant Hc has no parts.
	Parts []Part
}

// Part is one stretch of a mixed edge, from the previous part's To (0 for
// the first) to its own To (the edge's length for the last).
type Part struct {
	To   float64
	Kind Kind
	// F is the data as for Edge.F (value, entering flux or ambient), as a
	// function of s along the whole edge.
	F func(s float64) float64
	// Hc is the convection coefficient along the edge (>= 0), for a
	// Convection part; nil otherwise.
	Hc func(s float64) float64
}

// Mixed reports whether the edge's conditions change along it.
func (e *Edge) Mixed() bool { return len(e.Parts) > 0 }

// Condition returns the condition held at s along the edge: its kind,
// data and convection coefficient there (the part's, on a mixed edge).
func (e *Edge) Condition(s float64) (Kind, func(float64) float64, float64) {
	if !e.Mixed() {
		return e.Kind, e.F, e.Hc
	}
	p := e.Parts[e.PartAt(s)]
	h := 0.0
	if p.Kind == Convection {
		h = p.Hc(s)
	}
	return p.Kind, p.F, h
}

// PartRange returns where part i of an edge of length L starts and ends.
func (e *Edge) PartRange(i int, L float64) (from, to float64) {
	if i > 0 {
		from = e.Parts[i-1].To
	}
	to = L
	if i < len(e.Parts)-1 {
		to = e.Parts[i].To
	}
	return from, to
}

// PartAt returns the index of the part that holds s (the later part at a
// boundary between two).
func (e *Edge) PartAt(s float64) int {
	for i := range len(e.Parts) - 1 {
		if s < e.Parts[i].To {
			return i
		}
	}
	return len(e.Parts) - 1
}

// Problem is a steady field problem on a rectangle.
type Problem struct {
	W, H   float64 // extent in x and y, > 0
	Kx, Ky float64 // conductivity along x and y, > 0
	Source float64 // uniform volumetric source
	Edges  [4]Edge // indexed by Side
}

// Length returns the length of the given edge.
func (p *Problem) Length(s Side) float64 {
	if s == Bottom || s == Top {
		return p.W
	}
	return p.H
}

// Point returns the coordinates of the point at distance s along edge e.
func (p *Problem) Point(e Side, s float64) (x, y float64) {
	switch e {
	case Bottom:
		return s, 0
	case Top:
		return s, p.H
	case Left:
		return 0, s
	case Right:
		return p.W, s
	}
	panic("problem: bad side " + e.String())
}

// NonFiniteError reports edge data that evaluated to NaN or an infinity.
type NonFiniteError struct {
	Side Side
	S    float64 // where along the edge
}

func (e *NonFiniteError) Error() string {
	return fmt.Sprintf("%v: not a finite number at s = %.6g", e.Side, e.S)
}

// Eval returns F(s) for edge e, or a *NonFiniteError if it is not finite.
func (p *Problem) Eval(e Side, s float64) (float64, error) {
	v := p.Edges[e].F(s)
	if v-v != 0 { // NaN or ±Inf
		return 0, &NonFiniteError{Side: e, S: s}
	}
	return v, nil
}

// Validate checks the parts of a problem that are not functions. It returns
// an error naming the offending part; the caller (the project decoder) has
// normally reported these already with field paths.
func (p *Problem) Validate() error {
	pos := func(name string, v float64) error {
		if !(v > 0) || v-v != 0 {
			return fmt.Errorf("problem: %s must be a positive finite number, got %g", name, v)
		}
		return nil
	}
	for _, c := range []struct {
		n string
		v float64
	}{{"W", p.W}, {"H", p.H}, {"Kx", p.Kx}, {"Ky", p.Ky}} {
		if err := pos(c.n, c.v); err != nil {
			return err
		}
	}
	if p.Source-p.Source != 0 {
		return fmt.Errorf("problem: Source must be finite, got %g", p.Source)
	}
	for _, s := range Sides {
		e := p.Edges[s]
		if e.Mixed() {
			if err := p.validParts(s); err != nil {
				return err
			}
			continue
		}
		if e.F == nil {
			return fmt.Errorf("problem: %v edge has no data function", s)
		}
		if e.Kind < Value || e.Kind > Convection {
			return fmt.Errorf("problem: %v edge has bad kind %v", s, e.Kind)
		}
		if e.Kind == Convection && (e.Hc < 0 || e.Hc-e.Hc != 0) {
			return fmt.Errorf("problem: %v edge convection coefficient must be >= 0, got %g", s, e.Hc)
		}
	}
	return nil
}

// validParts checks the parts of a mixed edge: each with data, a known
// kind and, for convection, a coefficient function; their ends strictly
// inside the edge and increasing.
func (p *Problem) validParts(s Side) error {
	e := p.Edges[s]
	L := p.Length(s)
	prev := 0.0
	for i, q := range e.Parts {
		switch {
		case q.F == nil:
			return fmt.Errorf("problem: %v edge part %d has no data function", s, i)
		case q.Kind < Value || q.Kind > Convection:
			return fmt.Errorf("problem: %v edge part %d has bad kind %v", s, i, q.Kind)
		case q.Kind == Convection && q.Hc == nil:
			return fmt.Errorf("problem: %v edge part %d is convection without a coefficient", s, i)
		}
		if i < len(e.Parts)-1 {
			if !(q.To > prev && q.To < L) {
				return fmt.Errorf("problem: %v edge part %d ends at %g, not between %g and %g", s, i, q.To, prev, L)
			}
			prev = q.To
		}
	}
	return nil
}

// Proportional picks a grid (nx, ny) of intervals for a w x h rectangle:
// n along the longer side and the shorter side in proportion. It is the one
// rule for every grid edgewise makes: the output grid, the cross-check's
// and the published checks'.
//
// The rule: the longer side gets max(n, 2) intervals, the shorter side
// round(max(n, 2) * shorter/longer), but at least 2. So the grid never has
// more than (n+1)^2 nodes, whatever the aspect; a very thin rectangle gets 2
// intervals across and long, flat cells. For an orthotropic problem pass the
// mapped height H*sqrt(Kx/Ky) to get cells that are square in the mapped
// variables. If w or h is not a positive finite number (bad user data that
// the decoder reports), both sides get max(n, 2) intervals.
func Proportional(w, h float64, n int) (nx, ny int) {
	n = max(n, 2)
	if !(w > 0) || !(h > 0) || math.IsInf(w, 1) || math.IsInf(h, 1) {
		return n, n
	}
	long, short := w, h
	if h > w {
		long, short = h, w
	}
	m := max(int(math.Round(float64(n)*(short/long))), 2)
	if w >= h {
		return n, m
	}
	return m, n
}

// Const returns an edge data function that is the constant v.
func Const(v float64) func(float64) float64 { return func(float64) float64 { return v } }
