package project

import (
	"math"
	"reflect"
	"strings"
	"testing"

	"edgewise/solver/problem"
)

// segmented is the base project (0.4 x 0.2) with its top edge in segments.
func segmented(t *testing.T, segs ...any) []byte {
	t.Helper()
	if segs == nil {
		segs = []any{} // [], not null
	}
	return mutate(t, func(m map[string]any) {
		edges(m)["top"] = map[string]any{"segments": segs}
	})
}

func seg(kv ...any) map[string]any {
	m := map[string]any{}
	for i := 0; i < len(kv); i += 2 {
		m[kv[i].(string)] = kv[i+1]
	}
	return m
}

// Segments decode in order with their own kinds and data, "to" where each
// ends, and the project writes them back and reads them again unchanged.
func TestSegmentsRoundTrip(t *testing.T) {
	b := segmented(t,
		seg("to", 0.1, "kind", "value", "expr", "12"),
		seg("to", 0.25, "kind", "flux", "expr", "0"),
		seg("kind", "convection", "h", "when(s < 0.3, 8, 20)", "ambient", "18"))
	p, err := Decode(b)
	if err != nil {
		t.Fatal(err)
	}
	want := []Segment{
		{To: 0.1, Kind: problem.Value, Expr: "12"},
		{To: 0.25, Kind: problem.Flux, Expr: "0"},
		{Kind: problem.Convection, HExpr: "when(s < 0.3, 8, 20)", Ambient: "18"},
	}
	if got := p.Edges[problem.Top].Segments; !reflect.DeepEqual(got, want) {
		t.Errorf("segments\n%+v\nwant\n%+v", got, want)
	}
	text := p.JSON()
	const top = `"top":{"segments":[{"to":0.1,"kind":"value","expr":"12"},{"to":0.25,"kind":"flux","expr":"0"},{"kind":"convection","h":"when(s \u003c 0.3, 8, 20)","ambient":"18"}]}` // < escaped for HTML
	if !strings.Contains(string(text), top) {
		t.Errorf("written as\n%s\nwant %s", text, top)
	}
	q, err := Decode(text)
	if err != nil {
		t.Fatalf("re-decoding %s: %v", text, err)
	}
	if !reflect.DeepEqual(p, q) {
		t.Errorf("round trip changed the project:\n%+v\n%+v", p, q)
	}
	// one segment in the list form is the one-condition form
	one, err := Decode(segmented(t, seg("kind", "convection", "h", 10, "ambient", "20")))
	if err != nil {
		t.Fatal(err)
	}
	base, _ := Decode([]byte(baseProject))
	if !reflect.DeepEqual(one, base) {
		t.Errorf("one segment in a list:\n%+v\nwant the one-condition edge\n%+v", one.Edges[problem.Top], base.Edges[problem.Top])
	}
}

func TestSegmentErrors(t *testing.T) {
	v := func(to any) map[string]any { return seg("to", to, "kind", "value", "expr", "1") }
	last := seg("kind", "flux", "expr", "0")
	tests := []struct {
		name string
		b    []byte
		want string
	}{
		{"unordered", segmented(t, v(0.25), v(0.2), last), "edges.top.segments[1].to: 0.2 is not after 0.25"},
		{"equal", segmented(t, v(0.1), v(0.1), last), "edges.top.segments[1].to: 0.1 is not after 0.1"},
		{"empty", segmented(t), `edges.top.segments: empty list (give at least one segment, or the edge's one condition {"kind": ..})`},
		{"at the start", segmented(t, v(0), last), "edges.top.segments[0].to: 0 is not after the edge's start (0)"},
		{"before the start", segmented(t, v(-0.1), last), "edges.top.segments[0].to: -0.1 is not after the edge's start (0)"},
		{"at the end", segmented(t, v(0.4), last), "edges.top.segments[0].to: 0.4 is not before the edge's end (0.4)"},
		{"outside", segmented(t, v(0.1), v(0.5), last), "edges.top.segments[1].to: 0.5 is not before the edge's end (0.4)"},
		{"to on the last", segmented(t, v(0.1), v(0.2)), `edges.top.segments[1].to: the last segment runs to the edge's end (0.4) and takes no "to"`},
		{"no to", segmented(t, last, last), "edges.top.segments[0].to: missing (every segment but the last says where it ends)"},
		{"text to", segmented(t, v("0.1"), last), `edges.top.segments[0].to: expected a number, got the text "0.1"`},
		{"unknown key", segmented(t, seg("to", 0.1, "kind", "value", "expr", "1", "colour", "red"), last),
			"edges.top.segments[0].colour: unknown key (allowed here: kind, expr, to)"},
		{"unknown kind", segmented(t, v(0.1), seg("kind", "wall")), `edges.top.segments[1].kind: unknown edge kind "wall" (use value, flux or convection)`},
		{"missing data", segmented(t, v(0.1), seg("kind", "convection", "ambient", "1")), "edges.top.segments[1].h: missing"},
		{"negative h", segmented(t, v(0.1), seg("kind", "convection", "h", -2, "ambient", "1")),
			"edges.top.segments[1].h: convection coefficient must be zero or more, got -2"},
		{"negative h formula", segmented(t, v(0.1), seg("kind", "convection", "h", "2-5", "ambient", "1")),
			"edges.top.segments[1].h: convection coefficient must be zero or more, got -3"},
		{"infinite h formula", segmented(t, v(0.1), seg("kind", "convection", "h", "1e300*1e300", "ambient", "1")),
			"edges.top.segments[1].h: 1e300*1e300 gives +Inf, not a finite number"},
		{"not a list", mutate(t, func(m map[string]any) { edges(m)["top"] = map[string]any{"segments": map[string]any{}} }),
			"edges.top.segments: expected a list [..] of segments, got an object"},
		{"segments and kind", mutate(t, func(m map[string]any) {
			edges(m)["top"] = map[string]any{"segments": []any{last}, "kind": "value"}
		}), "edges.top.kind: unknown key (allowed here: segments)"},
		{"to on one condition", mutate(t, func(m map[string]any) { edge(m, "left")["to"] = 0.1 }),
			"edges.left.to: unknown key (allowed here: kind, expr)"},
		{"strong convection segment", segmented(t, v(0.1), seg("kind", "convection", "h", 1e12, "ambient", "1")),
			"edges.top.segments[1].h: 1e+12 gives a Biot number ..."},
	}
	for _, tt := range tests {
		_, err := Decode(tt.b)
		got := "<nil>"
		if err != nil {
			got = err.Error()
		}
		if prefix, ok := strings.CutSuffix(tt.want, "..."); ok && strings.HasPrefix(got, prefix) || got == tt.want {
			continue
		}
		t.Errorf("%s: error\n%s\nwant\n%s", tt.name, got, tt.want)
	}
}

// Compile checks every segment's formulas and an h formula along its
// segment; an h formula of one value compiles like the number, more than
// one segment or an h that varies makes a mixed edge.
func TestCompileSegments(t *testing.T) {
	v := func(to any, e string) map[string]any { return seg("to", to, "kind", "value", "expr", e) }
	conv := func(h any) map[string]any { return seg("kind", "convection", "h", h, "ambient", "18") }
	oneTop := func(h any) []byte {
		return mutate(t, func(m map[string]any) { edges(m)["top"] = conv(h) })
	}
	tests := []struct {
		name string
		b    []byte
		want string
	}{
		{"formula error in a segment", segmented(t, v(0.1, "2*tt"), conv(5)), `edges.top.segments[0].expr: col 3: unknown name "tt"`},
		{"h formula error", segmented(t, v(0.1, "1"), conv("8 +")), "edges.top.segments[1].h: col ..."},
		// h = 10 - 100 s is negative from s = 0.1; on the segment 0.25 .. 0.4 first at its start
		{"negative h in a segment", segmented(t, v(0.25, "1"), conv("10 - 100*s")),
			"edges.top.segments[1].h: the convection coefficient must be zero or more; it is -15 at s = 0.25"},
		// on the whole edge, 0 .. 0.4 in 1000 steps: first negative at s = 0.1004
		{"negative h on an edge", oneTop("10 - 100*s"), "edges.top.h: the convection coefficient must be zero or more; it is -0.04 at s = 0.1004"},
		{"h negative before a pole", oneTop("1/(s - 0.2)"), "edges.top.h: the convection coefficient must be zero or more; it is -5 at s = 0"},
		{"h pole", oneTop("1/(s - 0.2)^2"), "edges.top.h: not a finite number at s = 0.2"},
	}
	for _, tt := range tests {
		// an h that is no formula at all is refused already by Decode,
		// like any number field written as text; the rest by Compile
		var pr *problem.Problem
		p, err := Decode(tt.b)
		if err == nil {
			pr, err = Compile(p)
		}
		got := "<nil>"
		if err != nil {
			got = err.Error()
		}
		if prefix, ok := strings.CutSuffix(tt.want, "..."); ok && strings.HasPrefix(got, prefix) || got == tt.want {
			if pr != nil {
				t.Errorf("%s: a problem came out with the error", tt.name)
			}
			continue
		}
		t.Errorf("%s: error\n%s\nwant\n%s", tt.name, got, tt.want)
	}
	for _, h := range []any{"2*5", "10", 10} {
		p, err := Decode(oneTop(h))
		if err != nil {
			t.Fatal(err)
		}
		pr, err := Compile(p)
		if err != nil {
			t.Fatalf("h %v: %v", h, err)
		}
		if got := pr.Edges[problem.Top]; got.Hc != 10 || got.Mixed() {
			t.Errorf("h %v compiles to %g (mixed %v), want 10 on a one-condition edge", h, got.Hc, got.Mixed())
		}
	}
	mixed := []struct {
		name  string
		b     []byte
		kinds []problem.Kind
		h     float64 // h of the last part at s = 0.35
	}{
		{"value then flux", segmented(t, v(0.1, "12"), seg("kind", "flux", "expr", "0")), []problem.Kind{problem.Value, problem.Flux}, -1},
		{"varying h", oneTop("when(s < 0.3, 8, 20)"), []problem.Kind{problem.Convection}, 20},
		{"varying h, one segment in a list", segmented(t, conv("8 + 20*s")), []problem.Kind{problem.Convection}, 15},
	}
	for _, tt := range mixed {
		p, err := Decode(tt.b)
		if err != nil {
			t.Fatal(err)
		}
		pr, err := Compile(p)
		if err != nil {
			t.Fatalf("%s: %v", tt.name, err)
		}
		top := pr.Edges[problem.Top]
		if !top.Mixed() || len(top.Parts) != len(tt.kinds) {
			t.Errorf("%s: %d parts, want %d", tt.name, len(top.Parts), len(tt.kinds))
			continue
		}
		for i, k := range tt.kinds {
			if top.Parts[i].Kind != k {
				t.Errorf("%s: part %d is %v, want %v", tt.name, i, top.Parts[i].Kind, k)
			}
		}
		if last := top.Parts[len(top.Parts)-1]; tt.h >= 0 && math.Abs(last.Hc(0.35)-tt.h) > 1e-12 {
			t.Errorf("%s: h(0.35) = %g, want %g", tt.name, last.Hc(0.35), tt.h)
		}
		if err := pr.Validate(); err != nil {
			t.Errorf("%s: %v", tt.name, err)
		}
	}
}
