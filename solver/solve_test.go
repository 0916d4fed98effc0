package solver

import (
	"encoding/json"
	"math"
	"reflect"
	"slices"
	"strings"
	"testing"

	"edgewise/solver/problem"
	"edgewise/solver/project"
)

// previewProject has a formula on every edge; the right one varies.
const previewProject = `{"schema": "edgewise/1", "physics": "heat", "width": 0.4, "height": 0.2, "conductivity": 50,
  "edges": {"bottom": {"kind": "value", "expr": "100"}, "top": {"kind": "convection", "h": 10, "ambient": "20"},
    "left": {"kind": "flux", "expr": "0"}, "right": {"kind": "value", "expr": "20 + 5*sin(pi*s/H)"}}}`

func TestPreviewEdge(t *testing.T) {
	p, err := project.Decode([]byte(previewProject))
	if err != nil {
		t.Fatal(err)
	}
	s, v, err := PreviewEdge(p, problem.Right, 4)
	if err != nil {
		t.Fatal(err)
	}
	// right edge: 20 + 5 sin(pi s/H), s from 0 to H = 0.2; reference values
	// from Go's math package through the formula itself: 20, 23.5355, 25, 23.5355, 20
	want := []float64{20, 20 + 5*0.7071067811865476, 25, 20 + 5*0.7071067811865476, 20}
	for i := range want {
		if d := v[i] - want[i]; d > 1e-12 || d < -1e-12 || s[i] != 0.2*float64(i)/4 {
			t.Errorf("sample %d: s=%g v=%g, want s=%g v=%g", i, s[i], v[i], 0.2*float64(i)/4, want[i])
		}
	}
	p.Edges[problem.Top].Segments[0].Ambient = "1/(s - 0.2)"
	if _, _, err := PreviewEdge(p, problem.Top, 4); err == nil || err.Error() != "edges.top.ambient: not a finite number at s = 0.2" {
		t.Errorf("error %v, want the place where the ambient is not finite", err)
	}
}

// Result.JSON writes the same document as encoding/json (the standard
// library, the reference) would from the struct's field tags, except that
// the edges, an array indexed by side, are an object keyed by the side
// names in the side order.
func TestResultJSON(t *testing.T) {
	f1, f2, cc := 12.5, -3.25e-7, 1.5e-9
	r := Result{
		Schema: ResultSchema,
		Probes: []ProbeResult{{Label: `a "b" <c>`, X: 0.1, Y: 0.2, Value: 3, Gradient: [2]float64{1, -2}, Flux: [2]float64{-5, 10}}},
		Edges: EdgeFlows{problem.Bottom: {Flow: &f1, Finite: true, Mean: 2, PerLength: &f2,
			Segments: []SegmentFlow{{From: 0, To: 0.5, Kind: "value", Flow: &f1, Finite: true, Mean: 2}, {From: 0.5, To: 1, Kind: "flux", Finite: false, Mean: -0.5}}}, problem.Top: {Finite: false, Mean: -1}, problem.Left: {Flow: &f2, Finite: true}, problem.Right: {Flow: &f1, Finite: true}},
		SourceTotal: 7, Mean: 1.0 / 3, Min: Extreme{-1, 0, 0.5}, Max: Extreme{2, 0.4, 0.2},
		Accuracy: Accuracy{Terms: 120, Estimate: 1e-10, Crosscheck: &cc, CrosscheckGrid: "24x12"},
		Warnings: []problem.Warning{{Code: problem.TermLimit, Edges: []problem.Side{problem.Top, problem.Bottom}, Text: "w\n1"}}, Cautions: []string{"c1", "c2"}, Grid: project.GridSize{Nx: 10, Ny: 5},
		Colour: ColourScale{Map: "ember-tide", From: -2, To: 2},
	}
	for _, balance := range []*float64{nil, &f2} {
		r.Balance = balance
		want, err := json.Marshal(&r)
		if err != nil {
			t.Fatal(err)
		}
		var a, b map[string]any
		if err := json.Unmarshal(want, &a); err != nil {
			t.Fatal(err)
		}
		a["edges"] = map[string]any{
			"bottom": map[string]any{"flow": f1, "finite": true, "mean": 2.0, "per_length": f2, "segments": []any{
				map[string]any{"from": 0.0, "to": 0.5, "kind": "value", "flow": f1, "finite": true, "mean": 2.0},
				map[string]any{"from": 0.5, "to": 1.0, "kind": "flux", "flow": nil, "finite": false, "mean": -0.5}}},
			"right": map[string]any{"flow": f1, "finite": true, "mean": 0.0, "per_length": nil, "segments": []any{}},
			"top":   map[string]any{"flow": nil, "finite": false, "mean": -1.0, "per_length": nil, "segments": []any{}},
			"left":  map[string]any{"flow": f2, "finite": true, "mean": 0.0, "per_length": nil, "segments": []any{}},
		}
		if err := json.Unmarshal(r.JSON(), &b); err != nil {
			t.Fatalf("%v in %s", err, r.JSON())
		}
		if !reflect.DeepEqual(a, b) {
			t.Errorf("Result.JSON differs from the struct tags:\n%s\n%s", r.JSON(), want)
		}
		text := string(r.JSON())
		if i := []int{strings.Index(text, `"bottom"`), strings.Index(text, `"right"`), strings.Index(text, `"top"`), strings.Index(text, `"left"`)}; !slices.IsSorted(i) {
			t.Errorf("edges not in the side order (bottom, right, top, left): %s", text)
		}
	}
}

// With a uniform source and all four edges at zero the largest value is at
// the centre, by symmetry (exact), and it is positive.
func TestMaxOfSourceAtCentre(t *testing.T) {
	p, out := mustSolve(t, `{"schema":"edgewise/1","physics":"generic","width":2,"height":1,"conductivity":1,"source":2,
	 "edges":{"bottom":{"kind":"value","expr":"0"},"top":{"kind":"value","expr":"0"},
	 "left":{"kind":"value","expr":"0"},"right":{"kind":"value","expr":"0"}}, "grid":{"nx":7,"ny":5}}`, Options{NoCrossCheck: true})
	mx := out.Result.Max
	// the coarse 7 x 5 grid has no node at the centre; the search finds it
	// to a thousandth of a cell (0.0003 in x, 0.0002 in y)
	if math.Abs(mx.X-1) > 3e-4 || math.Abs(mx.Y-0.5) > 2e-4 || mx.Value <= 0 {
		t.Errorf("max %+v, want at (1, 0.5)", mx)
	}
	u, _, _ := solveAt(t, p, 1, 0.5)
	if mx.Value < u-1e-12 || mx.Value > u+1e-9 {
		t.Errorf("max value %v, the centre value is %v", mx.Value, u)
	}
	// the edges hold 0; the series reproduces it to round-off of the data
	// scale (1e-9 relative to the peak is the engine's tolerance)
	if mn := out.Result.Min; math.Abs(mn.Value) > 1e-9*mx.Value || !onBoundary(&problem.Problem{W: 2, H: 1}, mn.X, mn.Y) {
		t.Errorf("min %+v, want 0 on an edge", mn)
	}
}

func solveAt(t *testing.T, p *project.Project, x, y float64) (u, ux, uy float64) {
	t.Helper()
	pr, err := project.Compile(p)
	if err != nil {
		t.Fatal(err)
	}
	f, err := solveSeries(pr)
	if err != nil {
		t.Fatal(err)
	}
	return f.At(x, y)
}

// mustSolve decodes a project and solves it, failing the test on any error.
func mustSolve(t *testing.T, text string, opt Options) (*project.Project, *Output) {
	t.Helper()
	p, err := project.Decode([]byte(text))
	if err != nil {
		t.Fatal(err)
	}
	var s Solver
	out, err := s.Solve(p, opt)
	if err != nil {
		t.Fatal(err)
	}
	return p, out
}

// A probe where the gradient is unbounded says why, in one line: at a
// corner where two prescribed values differ, and where a held part meets
// an insulated one; a probe where it is finite says nothing.
func TestProbeGradientNoneSaysWhy(t *testing.T) {
	p, err := project.Decode([]byte(`{"schema":"edgewise/1","physics":"heat","width":2,"height":1,"conductivity":1,
	 "edges":{"bottom":{"segments":[{"to":1,"kind":"value","expr":"0"},{"kind":"flux","expr":"0"}]},"right":{"kind":"value","expr":"500"},
	 "top":{"kind":"flux","expr":"0"},"left":{"kind":"value","expr":"100"}},
	 "probes":[{"x":0,"y":0},{"x":1,"y":0},{"x":1,"y":0.5}]}`))
	if err != nil {
		t.Fatal(err)
	}
	var s Solver
	out, err := s.Solve(p, Options{Nx: 20, Ny: 10, NoCrossCheck: true})
	if err != nil {
		t.Fatal(err)
	}
	pr := out.Result.Probes
	if !strings.Contains(pr[0].Unbounded, "corner") || !strings.Contains(pr[1].Unbounded, "r^-1/2") || pr[2].Unbounded != "" {
		t.Errorf("reasons %q, %q, %q", pr[0].Unbounded, pr[1].Unbounded, pr[2].Unbounded)
	}
	if !strings.Contains(string(out.Result.JSON()), `"gradient_none":"unbounded: a held part`) {
		t.Errorf("the JSON lacks the reason: %s", out.Result.JSON())
	}
}
