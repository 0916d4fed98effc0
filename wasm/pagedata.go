//go:build js && wasm

package main

// The data the page's form and legend ask for: the colour tables and a
// preview of one edge's formula. (The names and units of each physics come
// from physics.json, made from solver/physics at build time.)

import (
	"errors"
	"fmt"

	"edgewise/solver"
	"edgewise/solver/problem"
	"edgewise/solver/project"

	"github.com/hack-pad/safejs"
)

// previewCall samples one edge's formula (the ambient for a convection
// edge) at n+1 points along it, for the page's small profile plot.
func previewCall(args []safejs.Value) (map[string]any, error) {
	if len(args) < 2 {
		return nil, errors.New("edgewise_preview needs the project JSON and a side")
	}
	text, err1 := args[0].String()
	side, err2 := args[1].String()
	if err1 != nil || err2 != nil {
		return nil, errors.New("edgewise_preview: project and side must be text")
	}
	n := 64
	if len(args) >= 3 {
		if v, err := args[2].Int(); err == nil && v >= 1 && v <= 4096 {
			n = v
		}
	}
	s, v, err := previewText(text, side, n)
	if err != nil {
		return nil, err
	}
	sa, err := float64Array(s)
	if err != nil {
		return nil, err
	}
	va, err := float64Array(v)
	if err != nil {
		return nil, err
	}
	return map[string]any{"ok": true, "s": sa, "v": va}, nil
}

// previewText is the part of a preview that does not read JavaScript
// arguments.
func previewText(text, sideName string, n int) (s, v []float64, err error) {
	p, err := project.Decode([]byte(text))
	if err != nil {
		return nil, nil, err
	}
	side, ok := problem.ParseSide(sideName)
	if !ok {
		return nil, nil, &project.Error{Path: "edges", Msg: fmt.Sprintf("unknown edge %q", sideName)}
	}
	return solver.PreviewEdge(p, side, n)
}
