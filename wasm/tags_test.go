package main

import (
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"strings"
	"testing"
)

// Every Go file of the bridge touches JavaScript and so must build only for
// js/wasm; this test (built for the host) fails when one lacks the tag.
func TestEveryFileIsTagged(t *testing.T) {
	files, err := filepath.Glob("*.go")
	if err != nil {
		t.Fatal(err)
	}
	checked := 0
	for _, f := range files {
		if f == "tags_test.go" {
			continue
		}
		b, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		if !strings.HasPrefix(string(b), "//go:build js && wasm\n") {
			t.Errorf("%s does not start with //go:build js && wasm", f)
		}
		checked++
	}
	if checked < 2 {
		t.Errorf("checked %d files, expected the bridge's sources", checked)
	}
}

// The bridge has one registration point (safejs.FuncOf is called once, in
// expose, for every function of the table) and one solver.Solver: the
// downloads and the checks reuse the page's, whose buffers are the
// largest thing the bridge keeps.
func TestOneRegistrationAndOneSolver(t *testing.T) {
	files, err := filepath.Glob("*.go")
	if err != nil {
		t.Fatal(err)
	}
	funcOf, solvers := 0, 0
	for _, f := range files {
		if strings.HasSuffix(f, "_test.go") {
			continue
		}
		b, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		funcOf += strings.Count(string(b), "safejs.FuncOf(")
		solvers += strings.Count(string(b), " solver.Solver\n")
	}
	if funcOf != 1 || solvers != 1 {
		t.Errorf("safejs.FuncOf called in %d places and %d solver.Solver variables, want 1 and 1", funcOf, solvers)
	}
}

// The engine stays small: packages that would add hundreds of kilobytes to
// the WebAssembly binary for little use (reflection-driven JSON, image and
// compression codecs, gonum's dense matrices with most of its LAPACK) must
// not be linked into it. Measured when they were removed: encoding/json
// about 470 kB, gonum/mat about 650 kB, image/png with compress/flate about
// 300 kB.
func TestEngineLeavesOutHeavyPackages(t *testing.T) {
	if runtime.GOOS == "js" {
		t.Skip("needs the go command (runs on the host)")
	}
	cmd := exec.Command("go", "list", "-deps", ".")
	cmd.Env = append(os.Environ(), "GOOS=js", "GOARCH=wasm")
	out, err := cmd.Output()
	if err != nil {
		t.Fatalf("go list: %v", err)
	}
	deps := strings.Fields(string(out))
	if len(deps) < 10 {
		t.Fatalf("go list gave %d packages", len(deps))
	}
	for _, d := range deps {
		switch d {
		case "encoding/json", "image/png", "compress/flate", "encoding/xml", "gonum.org/v1/gonum/mat", "html/template", "regexp":
			t.Errorf("the wasm engine links %s", d)
		}
	}
}
