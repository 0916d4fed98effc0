//go:build js && wasm

package main

import (
	"encoding/json"
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
	if err := register(); err != nil {
		t.Fatal(err)
	}
	fn, err := safejs.Global().Get("edgewise_solve")
	if err != nil {
		t.Fatal(err)
	}
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
	var r solver.Result
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
	r := solveText(bad, solver.Options{}).(map[string]any)
	if r["ok"] != false || r["path"] != "width" || !strings.Contains(r["error"].(string), "width:") {
		t.Errorf("reply = %v, want an error naming width", r)
	}
	r = solveText("{not json", solver.Options{}).(map[string]any)
	if r["ok"] != false {
		t.Errorf("reply = %v, want an error", r)
	}
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
