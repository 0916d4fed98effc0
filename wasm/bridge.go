//go:build js && wasm

package main

import (
	"errors"
	"fmt"
	"unsafe"

	"edgewise/solver"

	"github.com/hack-pad/safejs"
)

// engine keeps its buffers between solves: wasm memory never shrinks.
var engine solver.Solver

// defaultLevels is the number of isoline levels when the caller does not say.
const defaultLevels = 10

// solveCall decodes the JavaScript arguments, solves and builds the reply.
func solveCall(args []safejs.Value) any {
	if len(args) < 1 {
		return failure(errors.New("edgewise_solve needs the project JSON"))
	}
	text, err := args[0].String()
	if err != nil {
		return failure(fmt.Errorf("project must be JSON text: %w", err))
	}
	opt := solver.Options{}
	if len(args) >= 3 {
		nx, err1 := args[1].Int()
		ny, err2 := args[2].Int()
		if err1 == nil && err2 == nil && nx > 0 && ny >= 0 {
			opt.Nx, opt.Ny = nx, ny // ny 0: nx along the longer side, the other in proportion
		}
	}
	levels := defaultLevels
	if len(args) >= 4 {
		if n, err := args[3].Int(); err == nil && n >= 0 {
			levels = min(n, 60)
		}
	}
	return solveText(text, opt, levels)
}

// solveText is the part of a call that does not read JavaScript arguments.
func solveText(text string, opt solver.Options, levels int) any {
	p, err := solver.Decode([]byte(text))
	if err != nil {
		return failure(err)
	}
	if opt.Nx > 0 && opt.Ny == 0 {
		opt.Nx, opt.Ny = solver.Proportional(p.Width, p.Height, opt.Nx)
	}
	out, err := engine.Solve(p, opt)
	if err != nil {
		return failure(err)
	}
	reply := map[string]any{"ok": true, "result": string(out.Result.JSON()), "nx": out.Nx, "ny": out.Ny, "w": out.W, "h": out.H}
	arrays := map[string][]float64{"u": out.U, "ux": out.Ux, "uy": out.Uy}
	if levels > 0 {
		iso := out.Isolines(levels)
		ends := make([]float64, len(iso.Ends))
		for k, e := range iso.Ends {
			ends[k] = float64(e)
		}
		arrays["levels"], arrays["segs"], arrays["ends"], arrays["labels"] = iso.Levels, iso.Segs, ends, iso.Labels
	}
	for name, s := range arrays {
		arr, err := float64Array(s)
		if err != nil {
			return failure(err)
		}
		reply[name] = arr
	}
	return reply
}

// failure is the reply for an error, with the field path and column when
// the error has them.
func failure(err error) map[string]any {
	r := map[string]any{"ok": false, "error": err.Error(), "path": "", "col": 0}
	var fe *solver.Error
	if errors.As(err, &fe) {
		r["path"], r["col"] = fe.Path, fe.Col
	}
	return r
}

// uint8Array copies b into a new JavaScript Uint8Array.
func uint8Array(b []byte) (safejs.Value, error) {
	ctor, err := safejs.Global().Get("Uint8Array")
	if err != nil {
		return safejs.Value{}, err
	}
	arr, err := ctor.New(len(b))
	if err != nil {
		return safejs.Value{}, err
	}
	if _, err := safejs.CopyBytesToJS(arr, b); err != nil {
		return safejs.Value{}, err
	}
	return arr, nil
}

// float64Array copies s into a new JavaScript Float64Array in one block copy.
func float64Array(s []float64) (safejs.Value, error) {
	ctor, err := safejs.Global().Get("Float64Array")
	if err != nil {
		return safejs.Value{}, err
	}
	arr, err := ctor.New(len(s))
	if err != nil {
		return safejs.Value{}, err
	}
	if len(s) == 0 {
		return arr, nil
	}
	buf, err := arr.Get("buffer")
	if err != nil {
		return safejs.Value{}, err
	}
	u8ctor, err := safejs.Global().Get("Uint8Array")
	if err != nil {
		return safejs.Value{}, err
	}
	view, err := u8ctor.New(buf)
	if err != nil {
		return safejs.Value{}, err
	}
	raw := unsafe.Slice((*byte)(unsafe.Pointer(unsafe.SliceData(s))), len(s)*8)
	if _, err := safejs.CopyBytesToJS(view, raw); err != nil {
		return safejs.Value{}, err
	}
	return arr, nil
}
