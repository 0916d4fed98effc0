package project

import (
	"fmt"
	"strings"

	"edgewise/solver/jsonlite"
	"edgewise/solver/problem"
)

// Edges holds the four edge conditions, indexed by problem.Side. The JSON
// object is keyed by the side names.
type Edges [4]Edge

// Edge is the condition on one edge as the user wrote it: an ordered list
// of segments along the edge, each running from where the previous one
// ends (the first from s = 0) to its To. The one-condition JSON form
// {"kind": ..} is an edge of one segment.
//
// Until the engine solves edges made of segments, Decode gives exactly one
// segment per edge and Compile refuses more.
type Edge struct {
	Segments []Segment
}

// Segment is one condition along a part of an edge.
type Segment struct {
	Kind    problem.Kind
	Expr    string  // value or entering flux (value, flux)
	H       float64 // convection coefficient (convection)
	Ambient string  // ambient value (convection)
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
		w.Key("h")
		num(path+".h", s.H)
		w.Key("ambient").Str(s.Ambient)
	} else {
		w.Key("expr").Str(s.Expr)
	}
	w.Close('}')
}

// edge reads one edge in its one-condition form {"kind": ..} as an edge of
// one segment.
func (d *decoder) edge(v any, path string) Edge {
	return Whole(d.segment(v, path))
}

// segment reads one condition: its kind and the data that kind takes.
func (d *decoder) segment(v any, path string) Segment {
	m, ok := v.(map[string]any)
	if !ok {
		d.fail(path, "expected an object {\"kind\": ..}, got %s", describe(v))
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
		if m = d.object(v, path, []string{"kind", "expr"}); m != nil {
			e.Expr = d.formula(m["expr"], path+".expr")
		}
	case problem.Convection:
		if m = d.object(v, path, []string{"kind", "h", "ambient"}); m != nil {
			e.H = d.quantity(m["h"], path+".h")
			if d.err == nil && e.H < 0 {
				d.fail(path+".h", "convection coefficient must be zero or more, got %g", e.H)
			}
			e.Ambient = d.formula(m["ambient"], path+".ambient")
		}
	}
	return e
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
