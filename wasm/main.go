//go:build js && wasm

// Command wasm is the bridge between the edgewise page and the engine. It
// runs inside the page's Web Worker, registers these JavaScript functions
// and never returns:
//
//	edgewise_solve(projectJSON string, nx, ny, levels number) -> reply
//	edgewise_colours(n number) -> {ok, sequential, diverging: Uint8Array(3n), names}
//	edgewise_preview(projectJSON string, side string, n number) -> {ok, s, v: Float64Array}
//	edgewise_units() -> {ok, heat, electrostatic, seepage, generic: {value, value_unit, ...}}
//
// A solve reply is a plain object: {ok: true, result: "<result JSON>", nx,
// ny, w, h, u, ux, uy: Float64Array, and the isolines levels, segs, ends,
// labels: Float64Array} on success (nx, ny 0 take the project's grid or the
// default; levels is the number of isoline levels wanted, 0 for none), or
// {ok: false, error: "one line", path: "edges.top.expr", col: 7} on bad
// input. The typed arrays are fresh buffers at the top level of the reply,
// which the worker transfers to the page without copying. Nothing panics
// across the boundary: every callback recovers its own panics into an error
// reply.
package main

import (
	"fmt"
	"os"

	"github.com/hack-pad/safejs"
)

func main() {
	if err := register(); err != nil {
		fmt.Fprintln(os.Stderr, "edgewise:", err)
	}
	select {}
}

// calls are the functions the bridge registers, as edgewise_<name>.
var calls = map[string]func(args []safejs.Value) any{
	"solve":   solveCall,
	"colours": coloursCall,
	"preview": previewCall,
	"units":   unitsCall,
}

func register() error {
	for name, f := range calls {
		fn, err := safejs.FuncOf(guarded(name, f))
		if err != nil {
			return err
		}
		if err := safejs.Global().Set("edgewise_"+name, fn); err != nil {
			return err
		}
	}
	return nil
}

// guarded wraps a call so that a panic inside it becomes an error reply.
func guarded(name string, f func(args []safejs.Value) any) func(safejs.Value, []safejs.Value) any {
	return func(_ safejs.Value, args []safejs.Value) (reply any) {
		defer func() {
			if r := recover(); r != nil {
				reply = failure(fmt.Errorf("internal error in edgewise_%s: %v (please report this project)", name, r))
			}
		}()
		return f(args)
	}
}
