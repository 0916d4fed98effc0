package project

import (
	"encoding/json"
	"errors"
	"os"
	"reflect"
	"strings"
	"testing"

	"edgewise/solver/problem"
)

const baseProject = `{
  "schema": "edgewise/1", "title": "test plate", "physics": "heat",
  "width": 0.4, "height": 0.2, "conductivity": 50, "source": 0,
  "edges": {
    "bottom": {"kind": "value", "expr": "100"},
    "top": {"kind": "convection", "h": 10, "ambient": "20"},
    "left": {"kind": "flux", "expr": "0"},
    "right": {"kind": "value", "expr": "20 + 5*sin(pi*s/H)"}
  },
  "probes": [{"x": 0.2, "y": 0.1, "label": "P1"}],
  "grid": {"nx": 40, "ny": 20}
}`

// mutate decodes the base project, applies f to the generic tree and
// encodes it again.
func mutate(t *testing.T, f func(m map[string]any)) []byte {
	t.Helper()
	var m map[string]any
	if err := json.Unmarshal([]byte(baseProject), &m); err != nil {
		t.Fatal(err)
	}
	f(m)
	b, err := json.Marshal(m)
	if err != nil {
		t.Fatal(err)
	}
	return b
}

func edges(m map[string]any) map[string]any { return m["edges"].(map[string]any) }
func edge(m map[string]any, s string) map[string]any {
	return edges(m)[s].(map[string]any)
}

func TestDecodeGood(t *testing.T) {
	p, err := Decode([]byte(baseProject))
	if err != nil {
		t.Fatal(err)
	}
	if p.Width != 0.4 || p.Conductivity != (Conductivity{50, 50}) || p.Edges[problem.Top].Segments[0].H != 10 ||
		p.Edges[problem.Right].Segments[0].Expr != "20 + 5*sin(pi*s/H)" || len(p.Probes) != 1 || p.Grid.Nx != 40 {
		t.Errorf("decoded %+v", p)
	}
	// a round trip through JSON gives the same project
	b := p.JSON()
	q, err := Decode(b)
	if err != nil {
		t.Fatalf("re-decoding %s: %v", b, err)
	}
	if !reflect.DeepEqual(p, q) {
		t.Errorf("round trip changed the project:\n%+v\n%+v", p, q)
	}
	// and the text holds what the file held (encoding/json, the standard
	// library's reader, as the reference)
	var orig, again map[string]any
	_ = json.Unmarshal([]byte(baseProject), &orig)
	if err := json.Unmarshal(b, &again); err != nil || !reflect.DeepEqual(orig, again) {
		t.Errorf("project text differs from the file:\n%s", b)
	}
	b2 := q.JSON()
	if string(b) != string(b2) {
		t.Errorf("round trip changed the project:\n%s\n%s", b, b2)
	}
}

// An edge in the one-condition form is one segment; an edge of more than
// one segment built in Go compiles to a mixed edge, and is written
// in the segments form (segments_test.go has the rest).
func TestEdgeIsOneSegment(t *testing.T) {
	p, err := Decode([]byte(baseProject))
	if err != nil {
		t.Fatal(err)
	}
	for _, side := range problem.Sides {
		if n := len(p.Edges[side].Segments); n != 1 {
			t.Errorf("%v: %d segments, want 1", side, n)
		}
	}
	want := Segment{Kind: problem.Convection, H: 10, Ambient: "20"}
	if got, ok := p.Edges[problem.Top].Whole(); !ok || got != want {
		t.Errorf("top edge %+v, %v; want %+v", got, ok, want)
	}
	p.Edges[problem.Top] = Edge{Segments: []Segment{
		{To: 0.1, Kind: problem.Value, Expr: "12"},
		{Kind: problem.Flux, Expr: "0"},
	}}
	pr, err := Compile(p)
	if err != nil {
		t.Fatalf("compile of two segments: %v", err)
	}
	top := pr.Edges[problem.Top]
	if !top.Mixed() || len(top.Parts) != 2 || top.Parts[0].To != 0.1 || top.Parts[1].Kind != problem.Flux || top.F(0.05) != 12 || top.F(0.2) != 0 {
		t.Errorf("two segments compiled to %+v", top)
	}
	const topJSON = `"top":{"segments":[{"to":0.1,"kind":"value","expr":"12"},{"kind":"flux","expr":"0"}]}`
	if text := string(p.JSON()); !strings.Contains(text, topJSON) {
		t.Errorf("two segments written as\n%s\nwant %s", text, topJSON)
	}
}

func TestDecodeErrors(t *testing.T) {
	tests := []struct {
		name string
		edit func(m map[string]any)
		want string // the whole one-line message, or its start when it ends in "..."
	}{
		{"unknown top-level key", func(m map[string]any) { m["colour"] = "red" },
			"colour: unknown key (allowed here: ..."},
		{"unknown edge key", func(m map[string]any) { edge(m, "top")["expr"] = "1" },
			"edges.top.expr: unknown key (allowed here: kind, h, ambient)"},
		{"missing edge", func(m map[string]any) { delete(edges(m), "left") }, "edges.left: missing"},
		{"missing kind", func(m map[string]any) { delete(edge(m, "left"), "kind") },
			"edges.left.kind: missing (use value, flux or convection)"},
		{"wrong kind", func(m map[string]any) { edge(m, "left")["kind"] = "insulated" },
			`edges.left.kind: unknown edge kind "insulated" (use value, flux or convection)`},
		{"negative width", func(m map[string]any) { m["width"] = -1 }, "width: must be greater than zero, got -1"},
		{"zero height", func(m map[string]any) { m["height"] = 0 }, "height: must be greater than zero, got 0"},
		{"text width", func(m map[string]any) { m["width"] = "0,4" },
			`width: col 2: decimal comma in "0,4": write 0.4 with a point (to separate arguments, put a space after the comma)`},
		{"negative h", func(m map[string]any) { edge(m, "top")["h"] = -3 },
			"edges.top.h: convection coefficient must be zero or more, got -3"},
		{"orthotropic zero", func(m map[string]any) { m["conductivity"] = map[string]any{"x": 1, "y": 0} },
			"conductivity.y: must be greater than zero, got 0"},
		{"orthotropic extra", func(m map[string]any) { m["conductivity"] = map[string]any{"x": 1, "y": 2, "z": 3} },
			"conductivity.z: unknown key (allowed here: x, y)"},
		{"schema", func(m map[string]any) { m["schema"] = "other/2" },
			`schema: expected "edgewise/1", got "other/2" (not an edgewise project, or a newer version)`},
		{"physics", func(m map[string]any) { m["physics"] = "magnetic" },
			`physics: unknown physics "magnetic" (use heat, electrostatic, seepage or generic)`},
		{"probe outside", func(m map[string]any) { m["probes"].([]any)[0].(map[string]any)["x"] = 0.5 },
			"probes[0].x: 0.5 is outside the rectangle (0 .. 0.4)"},
		{"grid fraction", func(m map[string]any) { m["grid"].(map[string]any)["nx"] = 10.5 },
			"grid.nx: must be a whole number from 2 to 1024, got 10.5"},
		{"empty formula", func(m map[string]any) { edge(m, "bottom")["expr"] = "  " },
			"edges.bottom.expr: empty formula (write 0 for zero)"},
		{"aspect", func(m map[string]any) { m["width"] = 1e4; m["height"] = 1 },
			"width: the aspect ratio width/height = 10000 is outside 1e-3 .. 1e3"},
		{"orthotropic aspect", func(m map[string]any) { m["conductivity"] = map[string]any{"x": 1e-4, "y": 400} },
			"conductivity: with kx/ky = 2.5e-07 this rectangle acts like one of aspect ratio 4e+03, outside 1e-3 .. 1e3"},
		// fixed bugs
		{"missing kind with an earlier error kept", func(m map[string]any) {
			m["width"] = -1
			delete(edge(m, "left"), "kind")
		}, "width: must be greater than zero, got -1"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Decode(mutate(t, tc.edit))
			if err == nil {
				t.Fatalf("no error, want %q", tc.want)
			}
			got := err.Error()
			if want, prefix := strings.CutSuffix(tc.want, "..."); prefix {
				if !strings.HasPrefix(got, want) {
					t.Errorf("error %q, want it to start with %q", got, want)
				}
			} else if got != tc.want {
				t.Errorf("error %q, want %q", got, tc.want)
			}
			if strings.Contains(got, "\n") {
				t.Errorf("error has more than one line: %q", got)
			}
		})
	}
}

func TestDecodeSyntax(t *testing.T) {
	_, err := Decode([]byte("{\n  \"schema\": \"edgewise/1\",\n  \"width\" 0.4\n}"))
	if err == nil || !strings.Contains(err.Error(), "line 3") {
		t.Errorf("error %v, want the line of the JSON syntax error", err)
	}
	for _, bad := range []string{"", "[]", "null", `{"schema":"edgewise/1"} {}`} {
		if _, err := Decode([]byte(bad)); err == nil {
			t.Errorf("Decode(%q) gave no error", bad)
		}
	}
}

// Formula errors carry the field path and the column of the formula.
func TestFormulaErrorsNameFieldAndColumn(t *testing.T) {
	tests := []struct {
		side, field, formula, want string
		col                        int
	}{
		{"top", "ambient", "20 + tt", `edges.top.ambient: col 6: unknown name "tt"`, 6},
		{"right", "expr", "sinn(s)", `edges.right.expr: col 1: unknown name "sinn" (did you mean sinh?)`, 1},
		{"bottom", "expr", "(1 + s", `edges.bottom.expr: col 7: missing ")"`, 7},
	}
	for _, tc := range tests {
		b := mutate(t, func(m map[string]any) { edge(m, tc.side)[tc.field] = tc.formula })
		p, err := Decode(b)
		if err != nil {
			t.Fatal(err)
		}
		_, err = Compile(p)
		var fe *Error
		if !errors.As(err, &fe) {
			t.Fatalf("%s: error %v, want *project.Error", tc.formula, err)
		}
		if !strings.HasPrefix(err.Error(), tc.want) || fe.Col != tc.col {
			t.Errorf("%s: error %q col %d, want %q col %d", tc.formula, err, fe.Col, tc.want, tc.col)
		}
	}
}

func TestDemoDecodes(t *testing.T) {
	b, err := os.ReadFile("../../site/demo.json")
	if err != nil {
		t.Fatal(err)
	}
	p, err := Decode(b)
	if err != nil {
		t.Fatalf("the demo project does not decode: %v", err)
	}
	if _, err := Compile(p); err != nil {
		t.Fatalf("the demo project does not compile: %v", err)
	}
}

// A number of 5000 digits is never echoed back in full, on the page (which
// shows the decoder's message) or in the runner.
func TestLongNumberShortenedInMessages(t *testing.T) {
	digits := strings.Repeat("7", 5000)
	_, err := Decode([]byte(`{"schema":"edgewise/1","physics":"heat","width":` + digits + `,"height":1,"conductivity":1,
	 "edges":{"bottom":{"kind":"value","expr":"0"},"top":{"kind":"value","expr":"0"},"left":{"kind":"value","expr":"0"},"right":{"kind":"value","expr":"0"}}}`))
	if err == nil {
		t.Fatal("a width of 5000 digits decoded")
	}
	if msg := err.Error(); len(msg) > 300 || strings.Contains(msg, digits[:40]) || !strings.Contains(msg, "(5000 digits)") {
		t.Errorf("message %d bytes: %.200q", len(msg), msg)
	}
	if got := Shorten("width 12 and 3.5e+300"); got != "width 12 and 3.5e+300" {
		t.Errorf("Shorten changed a short message: %q", got)
	}
}
