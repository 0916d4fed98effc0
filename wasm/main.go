//go:build js && wasm

// Command wasm is the bridge between the edgewise page and the engine. It
// runs inside the page's Web Worker, registers one JavaScript function and
// never returns:
//
//	edgewise_solve(projectJSON string, nx, ny number) -> reply
//
// A reply is a plain object: {ok: true, result: "<result JSON>", nx, ny,
// u, ux, uy: Float64Array} on success, or {ok: false, error: "one line",
// path: "edges.top.expr", col: 7} on bad input. The Float64Arrays are fresh
// buffers the worker transfers to the page without copying. Nothing panics
// across the boundary: a panic inside the engine becomes an error reply.
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

func register() error {
	fn, err := safejs.FuncOf(func(_ safejs.Value, args []safejs.Value) any {
		return solveCall(args)
	})
	if err != nil {
		return err
	}
	return safejs.Global().Set("edgewise_solve", fn)
}
