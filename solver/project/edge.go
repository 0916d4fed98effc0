package project

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"edgewise/solver/expr"
	"edgewise/solver/jsonlite"
	"edgewise/solver/problem"
)

// MaxSegments is the most segments one edge may have.
const MaxSegments = 64

// Edges holds the four edge conditions, indexed by problem.Side. The JSON
// object is keyed by the side names.
type Edges [4]Edge

// Edge is the condition on one edge as the user wrote it: an ordered list
// of segments along the edge, each running from where the previous one
// ends (the first from s = 0) to its To. The one-condition JSON form
// {"kind": ..} is an edge of one segment.
//
// Until the engine solves edges made of segments, Compile refuses an edge
// of more than one (and an h that varies along an edge) with an error
// that says so.
type Edge struct {
	Segments []Segment
}

// Segment is one condition along a part of an edge.
type Segment struct {
	Kind problem.Kind
	Expr string  // value or entering flux (value, flux)
	H    float64 // convection coefficient (convection), when it is one number
	// HExpr is the convection coefficient as the user wrote it when it is
	// a formula ("when(s < 25, 8, 20)"), or "" when it is a plain number.
	// A formula whose value is one number also sets H; one that varies
	// along the edge leaves H zero (and Compile refuses it until the
	// engine solves it).
	HExpr   string
	Ambient string // ambient value (convection)
	// To is where the segment ends, as a distance s along the edge; the
	// last segment runs to the edge's end and its To is not used.
	To float64
}

// Whole returns the edge held by one condition from end to end.
func Whole(s Segment) Edge { return Edge{Segments: []Segment{s}} }

// Whole returns the edge's one segment, or false when the edge is made of
// more than one (or none).
func (e Edge) Whole() (Segment, bool) {
	if len(e.Segments) != 1 {
		return Segment{}, false
	}
	return e.Segments[0], true
}

// data returns the formula that holds the segment's data (the value, the
// entering flux or the ambient, whichever its kind takes) and its key.
func (s Segment) data() (src, key string) {
	if s.Kind == problem.Convection {
		return s.Ambient, "ambient"
	}
	return s.Expr, "expr"
}

// DataPath is the project path of the formula that holds the data of an
// edge of the given kind: edges.<side>.ambient for convection,
// edges.<side>.expr otherwise.
func DataPath(side problem.Side, kind problem.Kind) string {
	_, key := Segment{Kind: kind}.data()
	return "edges." + side.String() + "." + key
}

// length returns the length of the edge on side.
func (p *Project) length(side problem.Side) float64 {
	if side == problem.Bottom || side == problem.Top {
		return p.Width
	}
	return p.Height
}

// SegmentPath is the project path of segment i of the edge on side:
// edges.<side> for an edge of one segment (written in the one-condition
// form), edges.<side>.segments[i] otherwise.
func SegmentPath(side problem.Side, e Edge, i int) string {
	if len(e.Segments) == 1 {
		return "edges." + side.String()
	}
	return "edges." + side.String() + ".segments[" + strconv.Itoa(i) + "]"
}

// write writes the edge: an edge of one segment in the one-condition form
// {"kind": ..}, a longer one as {"segments": [..]} with "to" on every
// segment but the last.
// num writes the number field at a path (as its text when it was written
// as text).
func (e Edge) write(w *jsonlite.Writer, path string, num func(path string, v float64)) {
	if s, ok := e.Whole(); ok {
		s.write(w, false, path, num)
		return
	}
	w.Open('{').Key("segments").Open('[')
	for i, s := range e.Segments {
		s.write(w, i < len(e.Segments)-1, fmt.Sprintf("%s.segments[%d]", path, i), num)
	}
	w.Close(']').Close('}')
}

func (s Segment) write(w *jsonlite.Writer, to bool, path string, num func(path string, v float64)) {
	w.Open('{')
	if to {
		w.Key("to")
		num(path+".to", s.To)
	}
	w.Key("kind").Str(s.Kind.String())
	if s.Kind == problem.Convection {
		if s.HExpr != "" {
			w.Key("h").Str(s.HExpr)
		} else {
			w.Key("h")
			num(path+".h", s.H)
		}
		w.Key("ambient").Str(s.Ambient)
	} else {
		w.Key("expr").Str(s.Expr)
	}
	w.Close('}')
}

// edge reads one edge: the one-condition form {"kind": ..} as an edge of
// one segment, or {"segments": [..]}; length is the edge's length.
func (d *decoder) edge(v any, path string, length float64) Edge {
	if m, ok := v.(map[string]any); ok {
		if _, ok := m["segments"]; ok {
			return d.segments(v, path, length)
		}
	}
	return Whole(d.segment(v, path, nil))
}

// segments reads {"segments": [..]}: each segment its own condition, "to"
// on every one but the last, strictly increasing inside the edge.
func (d *decoder) segments(v any, path string, length float64) Edge {
	m := d.object(v, path, []string{"segments"})
	if m == nil {
		return Edge{}
	}
	path += ".segments"
	list, ok := m["segments"].([]any)
	switch {
	case !ok:
		d.fail(path, "expected a list [..] of segments, got %s", Describe(m["segments"]))
		return Edge{}
	case len(list) == 0:
		d.fail(path, "empty list (give at least one segment, or the edge's one condition {\"kind\": ..})")
		return Edge{}
	case len(list) > MaxSegments:
		d.fail(path, "%d segments; at most %d on one edge", len(list), MaxSegments)
		return Edge{}
	}
	e := Edge{Segments: make([]Segment, len(list))}
	from := 0.0
	for i, sv := range list {
		sp := path + "[" + strconv.Itoa(i) + "]"
		last := i == len(list)-1
		to, hasTo := any(nil), false
		if sm, ok := sv.(map[string]any); ok {
			to, hasTo = sm["to"]
		}
		switch {
		case last && hasTo:
			d.fail(sp+".to", "the last segment runs to the edge's end (%g) and takes no \"to\"", length)
		case !last && !hasTo:
			d.fail(sp+".to", "missing (every segment but the last says where it ends)")
		}
		e.Segments[i] = d.segment(sv, sp, []string{"to"})
		if d.err != nil {
			return Edge{}
		}
		if last {
			break
		}
		t := d.number(to, sp+".to")
		switch {
		case d.err != nil:
		case i == 0 && !(t > 0):
			d.fail(sp+".to", "%g is not after the edge's start (0)", t)
		case i > 0 && !(t > from):
			d.fail(sp+".to", "%g is not after %g", t, from)
		case !(t < length):
			d.fail(sp+".to", "%g is not before the edge's end (%g)", t, length)
		}
		if d.err != nil {
			return Edge{}
		}
		e.Segments[i].To, from = t, t
	}
	return e
}

// segment reads one condition: its kind and the data that kind takes;
// extra are the other keys it may have (a segment's "to", read by the
// caller).
func (d *decoder) segment(v any, path string, extra []string) Segment {
	m, ok := v.(map[string]any)
	if !ok {
		d.fail(path, "expected an object {\"kind\": ..}, got %s", Describe(v))
		return Segment{}
	}
	if _, ok := m["kind"]; !ok {
		d.fail(path+".kind", "missing (use %s)", kindChoice())
		return Segment{}
	}
	name := d.text(m["kind"], path+".kind")
	if d.err != nil {
		return Segment{}
	}
	kind, ok := problem.ParseKind(name)
	if !ok {
		d.fail(path+".kind", "unknown edge kind %q (use %s)", name, kindChoice())
		return Segment{}
	}
	e := Segment{Kind: kind}
	switch kind {
	case problem.Value, problem.Flux:
		if m = d.object(v, path, []string{"kind", "expr"}, extra...); m != nil {
			e.Expr = d.formula(m["expr"], path+".expr")
		}
	case problem.Convection:
		if m = d.object(v, path, []string{"kind", "h", "ambient"}, extra...); m != nil {
			e.H, e.HExpr = d.coefficient(m["h"], path+".h")
			e.Ambient = d.formula(m["ambient"], path+".ambient")
		}
	}
	return e
}

// coefficient reads a convection coefficient: a number, or a formula
// along the edge. A formula whose value is one number gives that number
// too (both are checked here: zero or more); one that varies is checked
// when compiled (see Compile), as are formulas that do not compile.
func (d *decoder) coefficient(v any, path string) (h float64, src string) {
	if text, ok := v.(string); ok {
		_, errConst := expr.CompileWith(text, d.consts)
		e, errAlong := expr.CompileWith(text, d.consts, formulaVars...)
		if errConst != nil && errAlong == nil {
			// a formula along the edge
			src = d.formula(text, path)
			if d.err != nil {
				return 0, ""
			}
			d.use(e.Named())
			if c, ok := e.Const(); ok {
				h = c
			}
		} else {
			// a number written as text, perhaps of the parameters, kept as
			// written like any number field (a text that is no formula
			// at all is reported here, with its column)
			h = d.quantity(v, path)
		}
	} else {
		h = d.number(v, path)
	}
	switch {
	case d.err != nil:
	case math.IsInf(h, 0):
		d.fail(path, "%s is not a finite number", src)
	case !(h >= 0):
		d.fail(path, "convection coefficient must be zero or more, got %g", h)
	}
	return h, src
}

// kindChoice lists the edge kinds for an error message: "value, flux or
// convection".
func kindChoice() string {
	n := len(problem.Kinds)
	names := make([]string, n)
	for i, k := range problem.Kinds {
		names[i] = k.String()
	}
	return strings.Join(names[:n-1], ", ") + " or " + names[n-1]
}
