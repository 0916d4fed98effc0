//go:build js && wasm

package main

import (
	"strconv"
	"strings"
	"testing"

	"edgewise/solver/jsonlite"
	"edgewise/solver/report"

	"github.com/hack-pad/safejs"
)

// The outputs functions are on the global object after register and answer
// through JavaScript.
func TestOutputsThroughJS(t *testing.T) {
	if err := register(); err != nil {
		t.Fatal(err)
	}
	for _, name := range []string{"edgewise_export", "edgewise_report", "edgewise_validate", "edgewise_version", "edgewise_checks", "edgewise_check"} {
		fn, err := safejs.Global().Get(name)
		if err != nil || fn.Type() != safejs.TypeFunction {
			t.Fatalf("%s is not registered", name)
		}
	}
	fn, _ := safejs.Global().Get("edgewise_export")
	reply, err := fn.Invoke("probes-csv", square, `{"nx": 4, "ny": 4}`)
	if err != nil {
		t.Fatal(err)
	}
	if ok, _ := mustGet(t, reply, "ok").Bool(); !ok {
		msg, _ := mustGet(t, reply, "error").String()
		t.Fatalf("export failed: %s", msg)
	}
	text, _ := mustGet(t, reply, "text").String()
	lines := strings.Split(strings.TrimSpace(text), "\r\n")
	if len(lines) != 2 || !strings.HasPrefix(lines[1], "centre,0.5,0.5,") {
		t.Fatalf("probes CSV %q", lines)
	}
	// Exact identity: the four rotations add up to 1, so the centre is
	// 1/4; 1e-9 is the engine's target for exact identities.
	v, err := strconv.ParseFloat(strings.Split(lines[1], ",")[3], 64)
	if err != nil || abs(v-0.25) > 1e-9 {
		t.Errorf("centre value %q, want 0.25", strings.Split(lines[1], ",")[3])
	}
	// A missing argument is an error reply, not a panic.
	reply, err = fn.Invoke()
	if err != nil {
		t.Fatal(err)
	}
	if ok, _ := mustGet(t, reply, "ok").Bool(); ok {
		t.Errorf("export with no arguments succeeded")
	}
	ver, _ := safejs.Global().Get("edgewise_version")
	reply, _ = ver.Invoke()
	if v, _ := mustGet(t, reply, "version").String(); v == "" {
		t.Errorf("empty version")
	}
}

func TestExportKinds(t *testing.T) {
	for _, c := range []struct{ kind, prefix, mime string }{
		{"field-csv", "x [m],y [m],value u,grad_x", "text/csv"},
		{"probes-csv", "label,x [m]", "text/csv"},
		{"edges-csv", "edge,part,kind,from [m]", "text/csv"},
		{"svg", "<?xml", "image/svg+xml"},
	} {
		r, err := exportText(c.kind, square, callOptions{Nx: 4, Ny: 4})
		if err != nil {
			t.Fatalf("%s: %v", c.kind, err)
		}
		if !strings.HasPrefix(r["text"].(string), c.prefix) || !strings.HasPrefix(r["mime"].(string), c.mime) {
			t.Errorf("%s: %.60q, %v", c.kind, r["text"], r["mime"])
		}
	}
	if _, err := exportText("xlsx", square, callOptions{}); err == nil {
		t.Errorf("unknown kind accepted")
	}
	if _, err := exportText("svg", "{", callOptions{}); err == nil {
		t.Errorf("bad project accepted")
	}
}

func TestReportText(t *testing.T) {
	r, err := reportText(square, callOptions{Date: "2026-12-02", Nx: 4, Ny: 4})
	if err != nil {
		t.Fatal(err)
	}
	tree, err := jsonlite.Parse([]byte(r["report"].(string)))
	if err != nil {
		t.Fatal(err)
	}
	if m := tree.(map[string]any); m["date"] != "2026-12-02" || m["version"] == "" {
		t.Errorf("report %v", m)
	}
	if !strings.Contains(r["svg"].(string), "<svg") {
		t.Errorf("no picture")
	}
}

func TestValidate(t *testing.T) {
	if _, err := validateText(square); err != nil {
		t.Errorf("good project: %v", err)
	}
	bad := strings.Replace(square, `"expr":"1"`, `"expr":"1 +"`, 1)
	_, err := validateText(bad)
	if err == nil || !strings.HasPrefix(err.Error(), "edges.top.expr: col ") {
		t.Errorf("bad formula: %v, want an error naming edges.top.expr and the column", err)
	}
	r := failure(err)
	if r["path"] != "edges.top.expr" {
		t.Errorf("failure reply %v", r)
	}
}

func TestParseOptions(t *testing.T) {
	o, err := parseOptions(`{"nx": 10, "ny": 5, "pixel_width": 800, "levels": -1, "date": "today"}`)
	if err != nil || o.Nx != 10 || o.Ny != 5 || o.PixelWidth != 800 || o.Levels != -1 || o.Date != "today" {
		t.Errorf("options %+v, %v", o, err)
	}
	o, err = parseOptions(`{"profile": [0, 0.5, 1, 0.25]}`)
	if err != nil || o.Profile == nil || *o.Profile != (report.ProfileLine{X0: 0, Y0: 0.5, X1: 1, Y1: 0.25}) {
		t.Errorf("profile option %+v, %v", o.Profile, err)
	}
	for _, bad := range []string{`[]`, `{"nx": 1.5}`, `{"colour": 1}`, `{"pixel_width": -1}`, `{"nx": 5000}`, `{"date": 3}`, `{`,
		`{"profile": [0, 1, 2]}`, `{"profile": [0, 1, 2, "3"]}`, `{"profile": "0,1,2,3"}`} {
		if _, err := parseOptions(bad); err == nil {
			t.Errorf("options %s accepted", bad)
		}
	}
}

func TestChecksFunctions(t *testing.T) {
	file := `{"schema":"edgewise-checks/1","cases":[{"id":"centre","title":"centre of the square",
	  "source":"Exact identity: the four rotations add up to 1","basis":"exact","kind":"identity","project":` + square + `,
	  "quantity":{"formula":"probe_value","probe":"centre"},"expect":0.25,"tol":1e-9,"tol_reason":"exact identity"}]}`
	r, err := checksText(file)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(r["cases"].(string), `"id":"centre"`) {
		t.Errorf("cases %v", r["cases"])
	}
	r, err = checkText(file, "centre")
	if err != nil {
		t.Fatal(err)
	}
	tree, err := jsonlite.Parse([]byte(r["outcome"].(string)))
	if err != nil {
		t.Fatal(err)
	}
	if m := tree.(map[string]any); m["pass"] != true {
		t.Errorf("outcome %v", m)
	}
	if _, err := checkText(file, "nothing"); err == nil {
		t.Errorf("unknown case accepted")
	}
	if _, err := checksText(`{"schema":"other"}`); err == nil {
		t.Errorf("foreign checks file accepted")
	}
}

// A runtime panic inside an exposed function comes back as an error reply.
func TestExposeRecovers(t *testing.T) {
	if err := expose("edgewise_test_panic", func([]safejs.Value) (map[string]any, error) {
		var m map[string]int
		m["x"]++ // a nil map write: a runtime panic
		return nil, nil
	}); err != nil {
		t.Fatal(err)
	}
	fn, _ := safejs.Global().Get("edgewise_test_panic")
	reply, err := fn.Invoke()
	if err != nil {
		t.Fatal(err)
	}
	ok, _ := mustGet(t, reply, "ok").Bool()
	msg, _ := mustGet(t, reply, "error").String()
	if ok || !strings.Contains(msg, "internal error in edgewise_test_panic") {
		t.Errorf("reply ok=%v error=%q, want an internal-error reply", ok, msg)
	}
}
