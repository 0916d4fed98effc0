//go:build js && wasm

package main

import (
	"errors"
	"fmt"

	"edgewise/solver"
	"edgewise/solver/problem"
	"edgewise/solver/project"
	"edgewise/solver/report"

	"github.com/hack-pad/safejs"
)

// defaultLevels is the number of isoline levels when the caller does not say.
const defaultLevels = 10

// solveCall decodes the JavaScript arguments, solves and builds the reply.
func solveCall(args []safejs.Value) (map[string]any, error) {
	if len(args) < 1 {
		return nil, errors.New("edgewise_solve needs the project JSON")
	}
	text, err := args[0].String()
	if err != nil {
		return nil, fmt.Errorf("project must be JSON text: %w", err)
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
	if len(args) >= 5 {
		if skip, err := args[4].Truthy(); err == nil && skip {
			opt.NoCrossCheck = true
		}
	}
	return solveText(text, opt, levels)
}

// solveText is the part of a call that does not read JavaScript arguments.
func solveText(text string, opt solver.Options, levels int) (map[string]any, error) {
	p, err := project.Decode([]byte(text))
	if err != nil {
		return nil, err
	}
	if opt.Nx > 0 && opt.Ny == 0 {
		opt.Nx, opt.Ny = problem.Proportional(p.Width, p.Height, opt.Nx)
	}
	out, err := engine.Solve(p, opt)
	if err != nil {
		return nil, err
	}
	reply := map[string]any{"ok": true, "result": string(out.Result.JSON()), "nx": out.Nx, "ny": out.Ny, "w": out.W, "h": out.H}
	arrays := map[string][]float64{"u": out.U, "ux": out.Ux, "uy": out.Uy}
	if levels > 0 {
		// round levels in the unit the page shows values in
		_, scale, offset := report.Shown(p.Physics, p.Display, "value")
		iso := out.Isolines(levels, scale, offset)
		ends := make([]float64, len(iso.Ends))
		for k, e := range iso.Ends {
			ends[k] = float64(e)
		}
		arrays["levels"], arrays["segs"], arrays["ends"], arrays["labels"] = iso.Levels, iso.Segs, ends, iso.Labels
		// the flow net: flow lines and its equipotentials, when there is one
		if flow, equi := out.FlowLines(); flow != nil {
			arrays["flowsegs"], arrays["equisegs"] = flow, equi
		}
	}
	for name, s := range arrays {
		arr, err := float64Array(s)
		if err != nil {
			return nil, err
		}
		reply[name] = arr
	}
	return reply, nil
}
