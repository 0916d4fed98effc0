package project

import (
	"reflect"
	"strings"
	"testing"

	"edgewise/solver/problem"
)

// paramProject uses its parameters in a formula and in number fields of
// every kind: sizes, conductivity, source, h and probe coordinates.
const paramProject = `{
  "schema": "edgewise/1", "physics": "heat",
  "parameters": {"w_plate": 0.4, "k_plate": 200, "h_top": 25, "t_hot": 90, "q": 1000},
  "width": "w_plate", "height": "w_plate/2", "conductivity": "k_plate", "source": "q",
  "edges": {
    "bottom": {"kind": "value", "expr": "t_hot - 10*sin(pi*s/W)"},
    "top": {"kind": "convection", "h": "2*h_top", "ambient": "20"},
    "left": {"kind": "flux", "expr": "0"},
    "right": {"kind": "value", "expr": 20}
  },
  "probes": [{"x": "w_plate/2", "y": 0.05, "label": "P1"}]
}`

func TestParametersDecode(t *testing.T) {
	p, err := Decode([]byte(paramProject))
	if err != nil {
		t.Fatal(err)
	}
	want := []Parameter{{"h_top", 25}, {"k_plate", 200}, {"q", 1000}, {"t_hot", 90}, {"w_plate", 0.4}}
	if !reflect.DeepEqual(p.Parameters, want) {
		t.Errorf("parameters %v, want %v (in name order)", p.Parameters, want)
	}
	top, _ := p.Edges[problem.Top].Whole()
	if p.Width != 0.4 || p.Height != 0.2 || p.Conductivity != (Conductivity{200, 200}) || p.Source != 1000 ||
		top.H != 50 || p.Probes[0].X != 0.2 {
		t.Errorf("number fields: width %g height %g k %v source %g h %g probe x %g",
			p.Width, p.Height, p.Conductivity, p.Source, top.H, p.Probes[0].X)
	}
	pr, err := Compile(p)
	if err != nil {
		t.Fatal(err)
	}
	// the formula sees the parameter: 90 - 10 sin(pi/2) at the middle
	if got := pr.Edges[problem.Bottom].F(0.2); got != 80 {
		t.Errorf("bottom formula at the middle = %g, want 80", got)
	}
}

// A project with parameters round-trips: the texts come back as written,
// the numbers as numbers.
func TestParametersRoundTrip(t *testing.T) {
	p, err := Decode([]byte(paramProject))
	if err != nil {
		t.Fatal(err)
	}
	b := p.JSON()
	for _, frag := range []string{`"parameters":{"h_top":25,"k_plate":200,"q":1000,"t_hot":90,"w_plate":0.4}`,
		`"width":"w_plate"`, `"height":"w_plate/2"`, `"conductivity":"k_plate"`, `"source":"q"`,
		`"h":"2*h_top"`, `"x":"w_plate/2","y":0.05`, `"expr":"20"`} {
		if !strings.Contains(string(b), frag) {
			t.Errorf("encoded project lacks %s:\n%s", frag, b)
		}
	}
	q, err := Decode(b)
	if err != nil {
		t.Fatalf("re-decoding: %v\n%s", err, b)
	}
	if !reflect.DeepEqual(p, q) {
		t.Errorf("round trip changed the project:\n%+v\n%+v", p, q)
	}
	// orthotropic conductivity written as text keeps its object form even
	// when both are equal
	o, err := Decode([]byte(strings.Replace(paramProject, `"conductivity": "k_plate"`,
		`"conductivity": {"x": "k_plate", "y": 200}`, 1)))
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(o.JSON()), `"conductivity":{"x":"k_plate","y":200}`) {
		t.Errorf("orthotropic text conductivity written as %s", o.JSON())
	}
}

// With works the texts out again for the new values and checks them as
// Decode does.
func TestProjectWith(t *testing.T) {
	p, err := Decode([]byte(paramProject))
	if err != nil {
		t.Fatal(err)
	}
	q, err := p.With(map[string]float64{"w_plate": 1, "h_top": 5})
	if err != nil {
		t.Fatal(err)
	}
	top, _ := q.Edges[problem.Top].Whole()
	if q.Width != 1 || q.Height != 0.5 || q.Probes[0].X != 0.5 || top.H != 10 {
		t.Errorf("with w_plate = 1, h_top = 5: width %g height %g probe x %g h %g", q.Width, q.Height, q.Probes[0].X, top.H)
	}
	if v, _ := q.Parameter("w_plate"); v != 1 {
		t.Errorf("parameter w_plate = %g in the new project", v)
	}
	if p.Width != 0.4 {
		t.Errorf("With changed the original: width %g", p.Width)
	}
	for _, c := range []struct {
		values map[string]float64
		want   string
	}{
		{map[string]float64{"w_plate": -1}, "width: must be greater than zero, got -1"},
		{map[string]float64{"h_top": -1}, "edges.top.h: convection coefficient must be zero or more, got -2"},
		{map[string]float64{"w": 1}, "parameters.w: not a parameter of this project"},
	} {
		if _, err := p.With(c.values); err == nil || err.Error() != c.want {
			t.Errorf("With(%v): error %v, want %s", c.values, err, c.want)
		}
	}
}

func TestParameterErrors(t *testing.T) {
	tests := []struct {
		name string
		edit func(m map[string]any)
		want string
	}{
		{"variable name", func(m map[string]any) { m["parameters"] = map[string]any{"x": 1} },
			`parameters.x: cannot name a parameter: "x" is a variable of the formulas (x, y, s, W, H)`},
		{"width name", func(m map[string]any) { m["parameters"] = map[string]any{"W": 1} },
			`parameters.W: cannot name a parameter: "W" is a variable of the formulas (x, y, s, W, H)`},
		{"constant name", func(m map[string]any) { m["parameters"] = map[string]any{"pi": 3} },
			`parameters.pi: cannot name a parameter: "pi" is a built-in constant`},
		{"function name", func(m map[string]any) { m["parameters"] = map[string]any{"sinh": 3} },
			`parameters.sinh: cannot name a parameter: "sinh" is a built-in function`},
		{"not a name", func(m map[string]any) { m["parameters"] = map[string]any{"2h": 3} },
			`parameters.2h: cannot name a parameter: "2h" is not a name (a letter or _, then letters, digits or _)`},
		{"space in name", func(m map[string]any) { m["parameters"] = map[string]any{"h top": 3} },
			`parameters.h top: cannot name a parameter: "h top" is not a name (a letter or _, then letters, digits or _)`},
		{"text value", func(m map[string]any) { m["parameters"] = map[string]any{"h_top": "3"} },
			`parameters.h_top: a parameter is a number, got the text "3"`},
		{"unused", func(m map[string]any) { m["parameters"] = map[string]any{"h_top": 3} },
			"parameters.h_top: defined but not used (use it in a formula or a number field, or remove it)"},
		{"used in a number field, not defined", func(m map[string]any) { edge(m, "top")["h"] = "2*h_tp" },
			`edges.top.h: col 3: unknown name "h_tp"`},
		{"misspelt, with a suggestion", func(m map[string]any) {
			m["parameters"] = map[string]any{"h_top": 3}
			edge(m, "top")["h"] = "2*h_tpo"
		}, `edges.top.h: col 3: unknown name "h_tpo" (did you mean h_top?)`},
		{"variable in a number field", func(m map[string]any) { m["width"] = "2*W" },
			`width: col 3: unknown name "W" (this formula may use pi, e)`},
		{"not finite", func(m map[string]any) { m["source"] = "1/0" }, "source: 1/0 gives +Inf, not a finite number"},
	}
	for _, tt := range tests {
		_, err := Decode(mutate(t, tt.edit))
		if err == nil || err.Error() != tt.want {
			t.Errorf("%s: error %v\nwant %s", tt.name, err, tt.want)
		}
	}
}

// A name used in an edge formula but not defined is reported by Compile
// with the formula's path and the column.
func TestParameterUndefinedInFormula(t *testing.T) {
	p, err := Decode(mutate(t, func(m map[string]any) {
		m["parameters"] = map[string]any{"t_hot": 90}
		edge(m, "bottom")["expr"] = "t_hot + t_cold"
	}))
	if err != nil {
		t.Fatal(err)
	}
	const want = `edges.bottom.expr: col 9: unknown name "t_cold"`
	if _, err := Compile(p); err == nil || err.Error() != want {
		t.Errorf("error %v, want %s", err, want)
	}
}
