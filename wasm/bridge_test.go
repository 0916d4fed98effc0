//go:build js && wasm

package main

import (
	"encoding/json"
	"math"
	"strings"
	"testing"

	"edgewise/solver"

	"github.com/hack-pad/safejs"
)

const square = `{"schema":"edgewise/1","physics":"generic","width":1,"height":1,"conductivity":1,
 "edges":{"bottom":{"kind":"value","expr":"0"},"top":{"kind":"value","expr":"1"},
 "left":{"kind":"value","expr":"0"},"right":{"kind":"value","expr":"0"}},
 "probes":[{"x":0.5,"y":0.5,"label":"centre"}]}`

// The wrapper works: a call through JavaScript returns the result JSON and
// the field as Float64Arrays of the grid's size.
func TestSolveThroughJS(t *testing.T) {
	fn := engineFunc(t, "solve")
	reply, err := fn.Invoke(square, 8, 8)
	if err != nil {
		t.Fatal(err)
	}
	ok, _ := mustGet(t, reply, "ok").Bool()
	if !ok {
		msg, _ := mustGet(t, reply, "error").String()
		t.Fatalf("solve failed: %s", msg)
	}
	text, _ := mustGet(t, reply, "result").String()
	var r struct{ Probes []solver.ProbeResult }
	if err := json.Unmarshal([]byte(text), &r); err != nil {
		t.Fatal(err)
	}
	// Exact identity: one edge at 1 on a square gives 1/4 at the centre
	// (the four rotations add up to the uniform field 1).
	if len(r.Probes) != 1 || abs(r.Probes[0].Value-0.25) > 1e-6 {
		t.Errorf("centre probe = %+v, want value 0.25", r.Probes)
	}
	u := mustGet(t, reply, "u")
	n, _ := u.Length()
	if n != 81 {
		t.Errorf("u has %d values, want 81 for an 8x8 grid", n)
	}
	ctor, _ := safejs.Global().Get("Float64Array")
	if is, _ := u.InstanceOf(ctor); !is {
		t.Errorf("u is not a Float64Array")
	}
	// Row order: the top-middle node (row 8, column 4) holds the edge value
	// 1 and the bottom-middle node 0. The tolerance only has to tell the
	// rows apart; engine accuracy is tested in solver/.
	top, _ := u.Index(8*9 + 4)
	if v, _ := top.Float(); abs(v-1) > 0.01 {
		t.Errorf("top middle = %g, want 1", v)
	}
}

// Bad input comes back as an error reply naming the field, not a panic.
func TestErrorReply(t *testing.T) {
	bad := strings.Replace(square, `"width":1`, `"width":-1`, 1)
	_, err := solveText(bad, solver.Options{}, 0)
	r := failure(err)
	if r["ok"] != false || r["path"] != "width" || !strings.Contains(r["error"].(string), "width:") {
		t.Errorf("reply = %v, want an error naming width", r)
	}
	if _, err := solveText("{not json", solver.Options{}, 0); err == nil {
		t.Errorf("reply = %v, want an error", r)
	}
}

// engineFunc registers the engine's functions and returns edgewise_<name>.
func engineFunc(t *testing.T, name string) safejs.Value {
	t.Helper()
	if err := register(); err != nil {
		t.Fatal(err)
	}
	fn, err := safejs.Global().Get("edgewise_" + name)
	if err != nil {
		t.Fatal(err)
	}
	return fn
}

func mustGet(t *testing.T, v safejs.Value, key string) safejs.Value {
	t.Helper()
	x, err := v.Get(key)
	if err != nil {
		t.Fatal(err)
	}
	return x
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}

// The solve reply carries the isolines as Float64Arrays: for the square
// with one edge at 1, every level lies within [0, 1] (the
// field's range) and each level's segments end where the next begin.
func TestSolveIsolines(t *testing.T) {
	if err := register(); err != nil {
		t.Fatal(err)
	}
	fn, _ := safejs.Global().Get("edgewise_solve")
	reply, err := fn.Invoke(square, 16, 16, 5)
	if err != nil {
		t.Fatal(err)
	}
	levels, ends := mustGet(t, reply, "levels"), mustGet(t, reply, "ends")
	nl, _ := levels.Length()
	ne, _ := ends.Length()
	if nl < 2 || nl != ne {
		t.Fatalf("%d levels and %d ends, want the same number, at least 2", nl, ne)
	}
	for k := 0; k < nl; k++ {
		v, _ := levels.Index(k)
		f, _ := v.Float()
		if f < 0 || f > 1 {
			t.Errorf("level %d = %g, want within [0, 1]", k, f)
		}
	}
	segs := mustGet(t, reply, "segs")
	ns, _ := segs.Length()
	last, _ := ends.Index(ne - 1)
	if n, _ := last.Int(); n != ns || ns == 0 || ns%4 != 0 {
		t.Errorf("segments: %d numbers, last end %d; want a non-empty multiple of 4 matching the last end", ns, n)
	}
}

// The edge preview samples the formula along the edge; a bad formula comes
// back as an error reply with the path and column.
func TestPreviewThroughJS(t *testing.T) {
	if err := register(); err != nil {
		t.Fatal(err)
	}
	fn, _ := safejs.Global().Get("edgewise_preview")
	p := strings.Replace(square, `"top":{"kind":"value","expr":"1"}`, `"top":{"kind":"value","expr":"2*s"}`, 1)
	reply, err := fn.Invoke(p, "top", 4)
	if err != nil {
		t.Fatal(err)
	}
	v := mustGet(t, reply, "v")
	if n, _ := v.Length(); n != 5 {
		t.Fatalf("preview has %d samples, want 5", n)
	}
	// exact: 2*s at s = 0.75 on the unit square
	x, _ := v.Index(3)
	if f, _ := x.Float(); abs(f-1.5) > 1e-12 {
		t.Errorf("v[3] = %g, want 1.5", f)
	}
	bad := strings.Replace(square, `"expr":"1"`, `"expr":"sinn(s)"`, 1)
	reply, err = fn.Invoke(bad, "top", 4)
	if err != nil {
		t.Fatal(err)
	}
	path, _ := mustGet(t, reply, "path").String()
	col, _ := mustGet(t, reply, "col").Int()
	if path != "edges.top.expr" || col != 1 {
		t.Errorf("error at %q col %d, want edges.top.expr col 1", path, col)
	}
}

// A panic inside a call becomes an error reply, not a crash.
func TestPanicBecomesError(t *testing.T) {
	f := guarded("test", func([]safejs.Value) (map[string]any, error) { panic("boom") })
	r, ok := f(safejs.Value{}, nil).(map[string]any)
	if !ok || r["ok"] != false || !strings.Contains(r["error"].(string), "boom") {
		t.Errorf("reply = %v, want an error reply naming the panic", r)
	}
	// the calls' one goroutine outlives the panic: the next call answers
	// (a runner that died with it would leave this call waiting)
	next := guarded("test", func([]safejs.Value) (map[string]any, error) { return map[string]any{"ok": true}, nil })
	if r, ok := next(safejs.Value{}, nil).(map[string]any); !ok || r["ok"] != true {
		t.Errorf("after the panic, reply = %v, want ok", r)
	}
}

// The solve reply carries the flow net's flow lines and equipotentials
// when there is a net (a slab between two full-side terminals: flow lines
// along x, equipotentials along y), and neither when there is none (the
// square's corner jumps make its flows infinite).
func TestSolveFlowNet(t *testing.T) {
	if err := register(); err != nil {
		t.Fatal(err)
	}
	fn, _ := safejs.Global().Get("edgewise_solve")
	slab := `{"schema":"edgewise/1","physics":"heat","width":2,"height":1,"conductivity":1,
	  "edges":{"bottom":{"kind":"flux","expr":"0"},"top":{"kind":"flux","expr":"0"},
	  "left":{"kind":"value","expr":"1"},"right":{"kind":"value","expr":"0"}}}`
	reply, err := fn.Invoke(slab, 20, 10, 5)
	if err != nil {
		t.Fatal(err)
	}
	for name, horizontal := range map[string]bool{"flowsegs": true, "equisegs": false} {
		segs := mustGet(t, reply, name)
		n, _ := segs.Length()
		if n == 0 || n%4 != 0 {
			t.Fatalf("%s: %d numbers", name, n)
		}
		for k := 0; k < n; k += 4 {
			a, _ := segs.Index(k + 1 - boolInt(!horizontal))
			b, _ := segs.Index(k + 3 - boolInt(!horizontal))
			fa, _ := a.Float()
			fb, _ := b.Float()
			if math.Abs(fa-fb) > 1e-9 {
				t.Fatalf("%s: segment %d not straight along its axis: %g vs %g", name, k/4, fa, fb)
			}
		}
	}
	reply, err = fn.Invoke(square, 16, 16, 5)
	if err != nil {
		t.Fatal(err)
	}
	if v, _ := reply.Get("flowsegs"); !v.IsUndefined() {
		t.Error("a net for a project whose flows are infinite")
	}
}

func boolInt(b bool) int {
	if b {
		return 1
	}
	return 0
}

// A solve without its cross-check (the page's first picture) gives the
// same result as the full one but for the accuracy's cross-check figures,
// which it leaves null without a reason; the full solve then carries them.
func TestSolveWithoutCrossCheck(t *testing.T) {
	fn := engineFunc(t, "solve")
	result := func(noCheck bool) map[string]any {
		reply, err := fn.Invoke(square, 40, 40, 0, noCheck)
		if err != nil {
			t.Fatal(err)
		}
		if ok, _ := mustGet(t, reply, "ok").Bool(); !ok {
			msg, _ := mustGet(t, reply, "error").String()
			t.Fatalf("solve failed: %s", msg)
		}
		text, _ := mustGet(t, reply, "result").String()
		var r map[string]any
		if err := json.Unmarshal([]byte(text), &r); err != nil {
			t.Fatal(err)
		}
		return r
	}
	quick, full := result(true), result(false)
	qa, fa := quick["accuracy"].(map[string]any), full["accuracy"].(map[string]any)
	if qa["crosscheck"] != nil || qa["crosscheck_skipped"] != nil || qa["crosscheck_grid"] != nil {
		t.Errorf("without the cross-check the accuracy is %v, want crosscheck null and no reason", qa)
	}
	if c, ok := fa["crosscheck"].(float64); !ok || c > 1e-4 {
		t.Errorf("the full solve's cross-check is %v, want a small difference", fa["crosscheck"])
	}
	delete(quick, "accuracy")
	delete(full, "accuracy")
	a, _ := json.Marshal(quick)
	b, _ := json.Marshal(full)
	if string(a) != string(b) {
		t.Errorf("the result without the cross-check differs from the full one:\n%s\n%s", a, b)
	}
	// the series' own figures are the same; the rest of the accuracy
	// (the cross-check's figures and what they show) is the full solve's
	for _, k := range []string{"terms", "estimate", "converged"} {
		if qa[k] != fa[k] {
			t.Errorf("accuracy.%s: %v without the cross-check, %v with it", k, qa[k], fa[k])
		}
	}
}
