//go:build js && wasm

// Command wasm is the bridge between the edgewise page and the engine. It
// runs inside the page's Web Worker, registers these JavaScript functions
// (the table calls) and never returns:
//
//	edgewise_solve(projectJSON string, nx, ny, levels number, noCheck bool) -> reply
//	edgewise_preview(projectJSON string, side string, n number) -> {ok, s, v: Float64Array}
//	edgewise_export(kind, projectJSON, optionsJSON) -> {ok, text, name, mime}
//	    kind: "field-csv" | "probes-csv" | "edges-csv" | "svg"; options (all optional):
//	    {"nx": n, "ny": n, "pixel_width": px, "levels": n}
//	edgewise_report(projectJSON, optionsJSON) -> {ok, report: "<report JSON>", svg}
//	    options: {"date": "text printed as the report's date", "pixel_width": px}
//	edgewise_validate(projectJSON) -> {ok} | {ok: false, error, path, col}
//	edgewise_version() -> {ok, version}
//	edgewise_checks(checksJSON) -> {ok, cases: "[{id, title, source, basis}, ...]"}
//	edgewise_check(checksJSON, id) -> {ok, outcome: "<verify.Outcome JSON>"}
//	edgewise_study_paths, edgewise_study_rows, edgewise_study_seek: studies (study.go)
//
// A solve reply is a plain object: {ok: true, result: "<result JSON>", nx,
// ny, w, h, u, ux, uy: Float64Array, and the isolines levels, segs, ends,
// labels: Float64Array} (nx, ny 0 take the project's grid or the default;
// levels is the number of isoline levels wanted, 0 for none; noCheck true
// leaves out the finite-difference cross-check: the result's
// accuracy.crosscheck is then null with no reason, and the page, which asks
// so for its first picture only, runs the same solve again with the check
// and takes its accuracy from there). The typed
// arrays are fresh buffers at the top level of the reply, which the worker
// transfers to the page without copying.
//
// Every function answers {ok: false, error: "one line", path:
// "edges.top.expr", col: 7} on bad input. Nothing panics across the
// boundary: the one guard turns a panic into such a reply. All functions
// share one solver.Solver (engine), whose buffers grow to the largest grid
// asked for and are reused: WebAssembly memory never shrinks.
package main

import (
	"errors"
	"fmt"
	"os"
	"sync"

	"edgewise/solver"
	"edgewise/solver/project"

	"github.com/hack-pad/safejs"
)

func main() {
	if err := register(); err != nil {
		fmt.Fprintln(os.Stderr, "edgewise:", err)
	}
	select {}
}

// call is a function the bridge offers to JavaScript: it reads its
// arguments and returns the reply's fields, or an error for the reply.
type call func(args []safejs.Value) (map[string]any, error)

// calls are the functions the bridge registers, as edgewise_<name>.
var calls = map[string]call{
	"solve":    solveCall,
	"preview":  previewCall,
	"export":   exportCall,
	"report":   reportCall,
	"validate": validateCall,
	"version":  versionCall,
	"checks":   checksCall,
	"check":    checkCall,

	"study_paths": studyPathsCall, // study.go
	"study_rows":  studyRowsCall,
	"study_seek":  studySeekCall,
}

// engine is the one Solver of the bridge. Calls run one at a time on the
// worker's thread, and each copies what it needs out of the Solver's
// buffers before it returns.
var engine solver.Solver

func register() error {
	for name, f := range calls {
		if err := expose("edgewise_"+name, f); err != nil {
			return err
		}
	}
	return nil
}

// expose puts f on the global object as name, behind the guard.
func expose(name string, f call) error {
	fn, err := safejs.FuncOf(guarded(name, f))
	if err != nil {
		return err
	}
	return safejs.Global().Set(name, fn)
}

// Every call runs on one long-lived goroutine, runner, not on the
// goroutine the runtime starts for each call from JavaScript: that one
// starts with a small stack, which a solve grows several times over,
// copying it each time (and the copying's table lookups made a large
// runtime function hot in the browser, see the package doc of
// edgewise/solver, "Loops in functions of their own"). The runner's stack
// is grown once before the first call and stays so between calls (a
// garbage collection may halve it while it idles; it then grows once
// more). The caller waits for the call to end, so
// calls still run one at a time, in order. A call must therefore never
// call back into JavaScript that calls the engine again: it would wait
// for the runner it holds (none does; none calls JavaScript functions).
var (
	work    = make(chan func())
	done    = make(chan struct{})
	started sync.Once
)

func runner() {
	deepen(stackFrames)
	for f := range work {
		f()
		done <- struct{}{}
	}
}

// stackFrames frames of deepen make the runner's stack grow to about
// 256 KB before the first call, while it is shallow and cheap to copy.
const stackFrames = 8

//go:noinline
func deepen(n int) byte {
	var b [32 << 10]byte
	b[n] = byte(n)
	if n > 0 {
		return deepen(n-1) + b[n]
	}
	return b[0]
}

// guarded wraps a call so that an error or a panic inside it becomes an
// error reply; the call runs on the runner.
func guarded(name string, f call) func(safejs.Value, []safejs.Value) any {
	run := guard(name, f)
	return func(this safejs.Value, args []safejs.Value) (reply any) {
		started.Do(func() { go runner() })
		work <- func() { reply = run(this, args) }
		<-done
		return reply
	}
}

// guard makes an error or a panic inside f an error reply.
func guard(name string, f call) func(safejs.Value, []safejs.Value) any {
	return func(_ safejs.Value, args []safejs.Value) (reply any) {
		defer func() {
			if r := recover(); r != nil {
				reply = failure(fmt.Errorf("internal error in %s: %v (please report this project)", name, r))
			}
		}()
		m, err := f(args)
		if err != nil {
			return failure(err)
		}
		return m
	}
}

// failure is the reply for an error, with the field path and column when
// the error has them.
func failure(err error) map[string]any {
	r := map[string]any{"ok": false, "error": err.Error(), "path": "", "col": 0}
	var fe *project.Error
	if errors.As(err, &fe) {
		r["path"], r["col"] = fe.Path, fe.Col
	}
	return r
}
