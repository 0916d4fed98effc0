package study

import (
	"encoding/json"
	"errors"
	"math"
	"os"
	"reflect"
	"sort"
	"strings"
	"testing"

	"edgewise/solver"
	"edgewise/solver/project"
)

func load(t testing.TB, name string) []byte {
	t.Helper()
	b, err := os.ReadFile("../../testdata/study/" + name)
	if err != nil {
		t.Fatal(err)
	}
	return b
}

func decodeBoth(t testing.TB, proj, st []byte) (*project.Project, *Study) {
	t.Helper()
	p, err := project.Decode(proj)
	if err != nil {
		t.Fatal(err)
	}
	s, err := Decode(st, p)
	if err != nil {
		t.Fatal(err)
	}
	return p, s
}

// withText writes the project file again with some parameter values
// replaced, through encoding/json: the way a user or another tool would
// write the single case by hand.
func withText(t *testing.T, data []byte, values map[string]float64) []byte {
	t.Helper()
	var m map[string]any
	if err := json.Unmarshal(data, &m); err != nil {
		t.Fatal(err)
	}
	params := m["parameters"].(map[string]any)
	for k, v := range values {
		params[k] = v
	}
	b, err := json.Marshal(m)
	if err != nil {
		t.Fatal(err)
	}
	return b
}

// Each row is the single solve of the same case (the project file written
// with the row's values, solved with every check on) to the last digit.
func TestRowEqualsSingleSolve(t *testing.T) {
	data := load(t, "plate.json")
	st := []byte(`{"schema": "edgewise-study/1",
	  "vary": [{"name": "h_top", "from": 5, "to": 500, "steps": 3, "scale": "log"}, {"name": "k_plate", "values": [120, 200]}],
	  "report": ["max.value", "max.x", "min.value", "mean", "balance", "probes.T1.value", "probes.T1.gradient.y",
	             "probes.T1.flux.x", "edges.top.flow", "edges.left.flow", "accuracy.estimate", "accuracy.terms"]}`)
	p, s := decodeBoth(t, data, st)
	var sv solver.Solver
	for i := range s.Rows() {
		row := s.Run(p, i, &sv, solver.Options{})
		if row.Err != nil {
			t.Fatalf("row %d: %v", i, row.Err)
		}
		vals := map[string]float64{}
		for k, a := range s.Vary {
			vals[a.Name] = row.Params[k]
		}
		q, err := project.Decode(withText(t, data, vals))
		if err != nil {
			t.Fatal(err)
		}
		var single solver.Solver
		out, err := single.Solve(q, solver.Options{})
		if err != nil {
			t.Fatal(err)
		}
		for k, path := range s.Report {
			o, err := Lookup(path, q)
			if err != nil {
				t.Fatal(err)
			}
			want, _ := o(&out.Result)
			if Format(row.Outputs[k]) != Format(want) {
				t.Errorf("row %d %s = %s, the single solve gives %s", i, path, Format(row.Outputs[k]), Format(want))
			}
		}
	}
}

// Rows run like nested loops, the last axis fastest.
func TestRowOrder(t *testing.T) {
	s := &Study{Vary: []Axis{{"a", []float64{1, 2}}, {"b", []float64{10, 20, 30}}}}
	var got [][]float64
	for i := range s.Rows() {
		got = append(got, s.Values(i))
	}
	want := [][]float64{{1, 10}, {1, 20}, {1, 30}, {2, 10}, {2, 20}, {2, 30}}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("rows %v, want %v", got, want)
	}
}

func TestSteps(t *testing.T) {
	lin := Steps(5, 100, 20, Linear)
	if len(lin) != 20 || lin[0] != 5 || lin[19] != 100 || lin[1] != 10 {
		t.Errorf("linear steps %v", lin)
	}
	lg := Steps(1, 1000, 4, Log)
	for i, want := range []float64{1, 10, 100, 1000} {
		// equal ratios: exact at the ends, to rounding of exp and log inside
		if math.Abs(lg[i]-want) > 1e-13*want || (i == 0 || i == 3) && lg[i] != want {
			t.Errorf("log step %d = %.17g, want %g", i, lg[i], want)
		}
	}
}

// On a linear problem (the field is linear in a prescribed value) the sweep
// is linear to rounding.
func TestLinearSweep(t *testing.T) {
	proj := []byte(`{"schema": "edgewise/1", "physics": "heat", "parameters": {"t_hot": 1},
	  "width": 0.3, "height": 0.1, "conductivity": 45,
	  "edges": {"bottom": {"kind": "value", "expr": "t_hot*(1 + s/W)"}, "top": {"kind": "convection", "h": 30, "ambient": "0"},
	            "left": {"kind": "flux", "expr": "0"}, "right": {"kind": "value", "expr": "0"}},
	  "probes": [{"x": 0.1, "y": 0.05, "label": "P"}], "grid": {"nx": 30, "ny": 10}}`)
	st := []byte(`{"schema": "edgewise-study/1", "vary": [{"name": "t_hot", "from": 10, "to": 100, "steps": 10}],
	  "report": ["probes.P.value", "mean", "edges.top.flow", "max.value"]}`)
	p, s := decodeBoth(t, proj, st)
	var rows []Row
	if _, err := s.Sweep(p, Config{Workers: 2}, func(r Row) error { rows = append(rows, r); return nil }); err != nil {
		t.Fatal(err)
	}
	for k, path := range s.Report {
		v0, v9 := rows[0].Outputs[k], rows[9].Outputs[k]
		for i, r := range rows {
			// t_hot = 10 (i + 1): each output is (i + 1) times the first
			want := v0 * float64(i+1)
			if d := math.Abs(r.Outputs[k] - want); d > 1e-13*math.Abs(v9) {
				t.Errorf("%s at row %d = %.17g, %g times row 0 is %.17g (off by %.2g)", path, i, r.Outputs[k], float64(i+1), want, d)
			}
		}
	}
}

// The rows of the shards, merged by row index, are the unsharded rows.
func TestShardsUnion(t *testing.T) {
	p, s := decodeBoth(t, load(t, "plate.json"), load(t, "sweep.json"))
	all := sweepRecords(t, p, s, Config{Workers: 2})
	var merged [][]string
	for i := range 4 {
		part := sweepRecords(t, p, s, Config{Workers: 2, Shard: i, Shards: 4})
		for _, r := range part {
			if r[0] == "" || len(r) != len(s.Header()) {
				t.Fatalf("shard %d row %v", i, r)
			}
		}
		merged = append(merged, part...)
	}
	sort.SliceStable(merged, func(a, b int) bool { return atoi(merged[a][0]) < atoi(merged[b][0]) })
	if !reflect.DeepEqual(merged, all) {
		t.Errorf("shards merged:\n%v\nunsharded:\n%v", merged, all)
	}
	if len(all) != s.Rows() || s.Rows() != 15 {
		t.Errorf("%d rows for %d cases", len(all), s.Rows())
	}
}

func atoi(s string) int {
	n := 0
	for _, c := range s {
		n = 10*n + int(c-'0')
	}
	return n
}

func sweepRecords(t *testing.T, p *project.Project, s *Study, cfg Config) [][]string {
	t.Helper()
	var recs [][]string
	failed, err := s.Sweep(p, cfg, func(r Row) error { recs = append(recs, r.Record(s)); return nil })
	if err != nil || failed != 0 {
		t.Fatalf("sweep: %d failed, %v", failed, err)
	}
	return recs
}

// A row whose solve fails carries its error; the others are solved.
func TestFailedRow(t *testing.T) {
	p, s := decodeBoth(t, load(t, "plate.json"), []byte(`{"schema": "edgewise-study/1",
	  "vary": [{"name": "h_top", "values": [25, -5, 50]}], "report": ["max.value"]}`))
	recs := map[int][]string{}
	failed, err := s.Sweep(p, Config{Workers: 3}, func(r Row) error { recs[r.Index] = r.Record(s); return nil })
	if err != nil || failed != 1 {
		t.Fatalf("%d failed, %v", failed, err)
	}
	want := []string{"1", "-5", "", "edges.top.h: convection coefficient must be zero or more, got -5"}
	if !reflect.DeepEqual(recs[1], want) {
		t.Errorf("failed row %q, want %q", recs[1], want)
	}
	if recs[0][2] == "" || recs[2][2] == "" || recs[0][3] != "" {
		t.Errorf("good rows %q %q", recs[0], recs[2])
	}
}

// The value a seek returns, solved directly, meets the target within the
// stated tolerance.
func TestSeekMeetsTarget(t *testing.T) {
	data := load(t, "plate.json")
	for _, c := range []struct {
		study string
		tol   float64
	}{
		{`{"schema": "edgewise-study/1", "seek": {"name": "h_top", "from": 5, "to": 500, "target": {"probes.T1.value": 100}}}`,
			DefaultTolerance(100)},
		{`{"schema": "edgewise-study/1", "seek": {"name": "k_plate", "from": 10, "to": 1000, "target": {"edges.top.flow": -600},
		   "tolerance": 1e-6}, "report": ["mean"]}`, 1e-6},
	} {
		p, s := decodeBoth(t, data, []byte(c.study))
		var sv solver.Solver
		calls := 0
		res, err := s.Find(p, &sv, solver.Options{}, func(int, float64, float64) bool { calls++; return true })
		if err != nil {
			t.Fatal(err)
		}
		if res.Tolerance != c.tol || calls != res.Solves || res.Solves > 40 || len(res.Outputs) != len(s.Report) {
			t.Errorf("seek %+v after %d calls", res, calls)
		}
		q, err := p.With(map[string]float64{s.Seek.Name: res.Value})
		if err != nil {
			t.Fatal(err)
		}
		out, err := sv.Solve(q, solver.Options{})
		if err != nil {
			t.Fatal(err)
		}
		got, _ := s.Seek.out(&out.Result)
		if math.Abs(got-s.Seek.Target) > res.Tolerance || got != res.Achieved {
			t.Errorf("%s at %s = %.17g is %.17g (reported %.17g), target %g within %g",
				s.Seek.Output, s.Seek.Name, res.Value, got, res.Achieved, s.Seek.Target, res.Tolerance)
		}
		if res.Bracket > RootTolerance*math.Abs(s.Seek.To-s.Seek.From)*1.01 {
			t.Errorf("bracket %g left", res.Bracket)
		}
	}
}

func TestSeekFailures(t *testing.T) {
	data := load(t, "plate.json")
	for _, c := range []struct{ study, want string }{
		{`{"schema": "edgewise-study/1", "seek": {"name": "h_top", "from": 5, "to": 500, "target": {"probes.T1.value": 85}}}`,
			"seek: the bracket holds no solution: probes.T1.value is 112.6470118075234 at h_top = 5 and 95.5612110274669 at h_top = 500, both above the target 85"},
		// the prescribed value steps at t_heater = 100: the maximum jumps from 100 - 30*... to 130
		{`{"schema": "edgewise-study/1", "seek": {"name": "t_heater", "from": 50, "to": 150, "target": {"max.value": 115}}}`,
			"seek: max.value jumps across the target 115 near t_heater = ..."},
	} {
		proj := data
		if strings.Contains(c.study, "t_heater") {
			proj = []byte(strings.Replace(string(data), `"t_heater - 30*(2*s/W - 1)^2"`, `"when(t_heater < 100, 90, 130)"`, 1))
		}
		p, s := decodeBoth(t, proj, []byte(c.study))
		var sv solver.Solver
		res, err := s.Find(p, &sv, solver.Options{}, nil)
		if err == nil || !matches(err.Error(), c.want) {
			t.Errorf("seek gave %+v, %v\nwant the error %s", res, err, c.want)
		}
	}
}

func matches(got, want string) bool {
	if pre, ok := strings.CutSuffix(want, "..."); ok {
		return strings.HasPrefix(got, pre)
	}
	return got == want
}

// An end of the bracket within the tolerance of the target is an answer,
// even with no sign change.
func TestSeekAtAnEnd(t *testing.T) {
	p, s := decodeBoth(t, load(t, "plate.json"), []byte(`{"schema": "edgewise-study/1",
	  "seek": {"name": "h_top", "from": 5, "to": 500, "target": {"probes.T1.value": 112.6471}, "tolerance": 1e-3}}`))
	var sv solver.Solver
	res, err := s.Find(p, &sv, solver.Options{}, nil)
	if err != nil || res.Value != 5 || res.Solves != 2 || math.Abs(res.Achieved-112.6471) > 1e-3 {
		t.Errorf("seek %+v, %v; want h_top = 5 after 2 solves", res, err)
	}
}

// Brent's method on a smooth function: the root to the bracket tolerance,
// in few evaluations.
func TestBrent(t *testing.T) {
	n := 0
	g := func(x float64) (float64, error) { n++; return x*x*x - 2, nil }
	x, fx, w, err := brent(g, 0, 4, -2, 62, 1e-12, 1e-10)
	if err != nil || math.Abs(x-math.Cbrt(2)) > 1e-11 || math.Abs(fx) > 1e-10 || w > 1e-12 || n > 20 {
		t.Errorf("root %.17g (g = %g, bracket %g) after %d evaluations, %v", x, fx, w, n, err)
	}
	// a step across zero is no root
	step := func(x float64) (float64, error) { return math.Copysign(1, x-1), nil }
	if _, _, _, err := brent(step, 0, 3, -1, 1, 1e-9, 1e-6); err == nil {
		t.Errorf("a jump across zero was taken for a root")
	}
}

func TestDecodeErrors(t *testing.T) {
	p, err := project.Decode(load(t, "plate.json"))
	if err != nil {
		t.Fatal(err)
	}
	const head = `{"schema": "edgewise-study/1", `
	for _, c := range []struct{ name, study, want string }{
		{"unknown parameter", head + `"vary": [{"name": "h_tp", "values": [1]}], "report": ["mean"]}`,
			`vary[0].name: unknown parameter "h_tp" (the project defines h_top, k_plate, t_heater)`},
		{"steps below 2", head + `"vary": [{"name": "h_top", "from": 1, "to": 2, "steps": 1}], "report": ["mean"]}`,
			"vary[0].steps: must be a whole number from 2 to 100000 (the number of values, both ends included), got 1"},
		{"steps not whole", head + `"vary": [{"name": "h_top", "from": 1, "to": 2, "steps": 2.5}], "report": ["mean"]}`,
			"vary[0].steps: must be a whole number from 2 to 100000 (the number of values, both ends included), got 2.5"},
		{"log through zero", head + `"vary": [{"name": "h_top", "from": -1, "to": 2, "steps": 3, "scale": "log"}], "report": ["mean"]}`,
			"vary[0].from: a log scale needs both ends above zero, got -1"},
		{"log to zero", head + `"vary": [{"name": "h_top", "from": 1, "to": 0, "steps": 3, "scale": "log"}], "report": ["mean"]}`,
			"vary[0].to: a log scale needs both ends above zero, got 0"},
		{"unknown scale", head + `"vary": [{"name": "h_top", "from": 1, "to": 2, "steps": 3, "scale": "exp"}], "report": ["mean"]}`,
			`vary[0].scale: unknown scale "exp" (use linear or log)`},
		{"unknown report path", head + `"vary": [{"name": "h_top", "values": [1]}], "report": ["mean", "max.val"]}`,
			`report[1]: unknown output "max.val" (use one of max.value, ...`},
		{"unknown probe", head + `"vary": [{"name": "h_top", "values": [1]}], "report": ["probes.T2.value"]}`,
			`report[0]: unknown output "probes.T2.value": "T2" is not a probe label (the project has T1)`},
		{"unknown edge", head + `"vary": [{"name": "h_top", "values": [1]}], "report": ["edges.north.flow"]}`,
			`report[0]: unknown output "edges.north.flow": "north" is not an edge (bottom, right, top or left)`},
		{"later output", head + `"vary": [{"name": "h_top", "values": [1]}], "report": ["answers.uplift.force"]}`,
			`report[0]: unknown output "answers.uplift.force" (use one of ...`},
		{"unknown key", head + `"vary": [{"name": "h_top", "values": [1]}], "report": ["mean"], "repeat": 2}`,
			"repeat: unknown key (allowed here: schema, vary, report, seek)"},
		{"unknown axis key", head + `"vary": [{"name": "h_top", "from": 1, "to": 2, "steps": 3, "step": 1}], "report": ["mean"]}`,
			"vary[0].step: unknown key (allowed here: name, from, to, steps, scale)"},
		{"values and steps", head + `"vary": [{"name": "h_top", "values": [1], "steps": 3}], "report": ["mean"]}`,
			"vary[0].steps: unknown key (allowed here: name, values)"},
		{"varied twice", head + `"vary": [{"name": "h_top", "values": [1]}, {"name": "h_top", "values": [2]}], "report": ["mean"]}`,
			`vary[1].name: "h_top" is varied twice`},
		{"no report", head + `"vary": [{"name": "h_top", "values": [1]}]}`,
			`report: missing (list the outputs to collect, such as "max.value")`},
		{"vary and seek", head + `"vary": [{"name": "h_top", "values": [1]}], "report": ["mean"],
		  "seek": {"name": "h_top", "from": 1, "to": 2, "target": {"mean": 3}}}`, "seek: a study has vary or seek, not both"},
		{"seek unknown output", head + `"seek": {"name": "h_top", "from": 1, "to": 2, "target": {"hottest": 3}}}`,
			`seek.target: unknown output "hottest" (use one of ...`},
		{"seek two targets", head + `"seek": {"name": "h_top", "from": 1, "to": 2, "target": {"mean": 3, "max.value": 4}}}`,
			"seek.target: expected one output and its target, such as {\"max.value\": 85}, got an object"},
		{"seek empty bracket", head + `"seek": {"name": "h_top", "from": 2, "to": 2, "target": {"mean": 3}}}`,
			"seek.to: the bracket is empty: from and to are both 2"},
		{"seek bad tolerance", head + `"seek": {"name": "h_top", "from": 1, "to": 2, "target": {"mean": 3}, "tolerance": 0}}`,
			"seek.tolerance: must be greater than zero, got 0"},
		{"wrong schema", `{"schema": "edgewise/1", "vary": []}`,
			`schema: expected "edgewise-study/1", got "edgewise/1" (not an edgewise study, or a newer version)`},
		{"not JSON", `{"schema": `, "not a study file: JSON syntax error at line 1, col 12: ..."},
		{"long number", head + `"vary": [{"name": "h_top", "values": [1` + strings.Repeat("0", 5000) + `]}], "report": ["mean"]}`,
			"vary[0].values[0]: 10000000...(5001 digits) is not a finite number"},
	} {
		_, err := Decode([]byte(c.study), p)
		if err == nil || !matches(err.Error(), c.want) || strings.Contains(err.Error(), "\n") {
			t.Errorf("%s: error %v\nwant %s", c.name, err, c.want)
		}
	}
}

// FuzzDecode: no study file panics the decoder, and every error is one
// line.
func FuzzDecode(f *testing.F) {
	f.Add(load(f, "sweep.json"))
	f.Add(load(f, "seek.json"))
	f.Add([]byte(`{"schema": "edgewise-study/1", "vary": [{"name": "h_top", "from": 1e308, "to": -1e308, "steps": 1e9}], "report": [1]}`))
	p, err := project.Decode(load(f, "plate.json"))
	if err != nil {
		f.Fatal(err)
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		s, err := Decode(data, p)
		if err != nil {
			if strings.Contains(err.Error(), "\n") {
				t.Fatalf("error of more than one line: %q", err)
			}
			return
		}
		if s.Seek == nil && (s.Rows() < 1 || s.Rows() > MaxRows) {
			t.Fatalf("%d rows", s.Rows())
		}
	})
}

// An error from emit (a closed pipe) stops the sweep: it returns the
// error and emits nothing more.
func TestSweepStopsOnEmitError(t *testing.T) {
	p, s := decodeBoth(t, load(t, "plate.json"), load(t, "sweep.json"))
	stop := errors.New("pipe closed")
	n := 0
	_, err := s.Sweep(p, Config{Workers: 3}, func(r Row) error {
		n++
		if r.Index == 2 {
			return stop
		}
		return nil
	})
	if err != stop || n != 3 {
		t.Errorf("error %v after %d rows, want %v after 3", err, n, stop)
	}
}

// A row whose solve does not converge (accuracy.converged false) prints no
// number: it is a failed row with the reason, and a seek through such a
// case fails instead of answering. The case is a strongly exchanging top
// edge that the engine flags (solver's TestUnconvergedWithholdsCautions).
func TestUnconvergedRowFails(t *testing.T) {
	proj := []byte(`{"schema":"edgewise/1","physics":"heat","width":0.2,"height":0.05,"conductivity":15,"source":0,
	 "parameters":{"h_top":10},
	 "edges":{"bottom":{"kind":"value","expr":"90"},"right":{"kind":"value","expr":"90"},
	 "top":{"kind":"convection","h":"h_top","ambient":"82"},"left":{"kind":"flux","expr":"0"}}}`)
	p, s := decodeBoth(t, proj, []byte(`{"schema":"edgewise-study/1","vary":[{"name":"h_top","values":[10, 1e9]}],"report":["max.value"]}`))
	var sv solver.Solver
	ok, bad := s.Run(p, 0, &sv, solver.Options{}), s.Run(p, 1, &sv, solver.Options{})
	if ok.Err != nil || len(ok.Outputs) != 1 {
		t.Fatalf("h = 10: %v", ok.Err)
	}
	if bad.Err == nil || !strings.Contains(bad.Err.Error(), "not converged") || bad.Outputs != nil {
		t.Errorf("h = 1e9: err %v, outputs %v: want a failed row saying not converged", bad.Err, bad.Outputs)
	}
	_, seek := decodeBoth(t, proj, []byte(`{"schema":"edgewise-study/1","seek":{"name":"h_top","from":10,"to":1e9,"target":{"max.value":85}},"report":[]}`))
	if _, err := seek.Find(p, &sv, solver.Options{}, nil); err == nil || !strings.Contains(err.Error(), "not converged") {
		t.Errorf("seek through an unconverged end: %v, want not converged", err)
	}
}

// The derived answers are report paths too. A slab between two values
// with insulated sides has the conductance k H / W exactly (exact
// identity, one-dimensional conduction), so a sweep of k gives it at each
// row; the thermal resistance is its inverse, the hot edge's mean its
// value, and a path the result does not have (a seepage answer of a heat
// project) is an empty field.
func TestAnswerPaths(t *testing.T) {
	proj := []byte(`{"schema":"edgewise/1","physics":"heat","width":2,"height":0.5,"conductivity":"k","source":0,
	 "parameters":{"k":4},
	 "edges":{"bottom":{"kind":"flux","expr":"0"},"top":{"kind":"flux","expr":"0"},"left":{"kind":"value","expr":"80"},"right":{"kind":"value","expr":"20"}}}`)
	p, s := decodeBoth(t, proj, []byte(`{"schema":"edgewise-study/1","vary":[{"name":"k","values":[1, 4, 15]}],
	 "report":["conductance.per_difference","answers.heat.thermal_resistance","edges.left.mean","answers.seepage.discharge"]}`))
	var sv solver.Solver
	for i, k := range []float64{1, 4, 15} {
		r := s.Run(p, i, &sv, solver.Options{})
		if r.Err != nil {
			t.Fatal(r.Err)
		}
		want := k * 0.5 / 2
		if got := r.Outputs[0]; math.Abs(got-want) > 1e-9*want {
			t.Errorf("k = %g: conductance %v, want %v", k, got, want)
		}
		if got := r.Outputs[1]; math.Abs(got*want-1) > 1e-9 {
			t.Errorf("k = %g: resistance %v, want %v", k, got, 1/want)
		}
		if got := r.Outputs[2]; math.Abs(got-80) > 1e-9 {
			t.Errorf("k = %g: mean of the hot edge %v, want 80", k, got)
		}
		if got := r.Outputs[3]; !math.IsNaN(got) {
			t.Errorf("k = %g: a seepage answer of a heat project %v, want none", k, got)
		}
	}
}
