//go:build js && wasm

package main

import (
	"strings"
	"testing"

	"edgewise/solver"
)

// The page asks for n intervals along the longer side with ny = 0 and
// reads the grid from the reply: the proportion rule is the engine's
// (problem.Proportional), not the page's.
func TestSolveGridAlongLongerSide(t *testing.T) {
	wide := strings.Replace(square, `"width":1`, `"width":2`, 1)
	reply, err := solveText(wide, solver.Options{Nx: 40, Ny: 0}, 0)
	if err != nil {
		t.Fatalf("solve failed: %v", err)
	}
	if reply["nx"] != 40 || reply["ny"] != 20 {
		t.Errorf("grid %v x %v, want 40 x 20 (40 along the longer side, the other in proportion)", reply["nx"], reply["ny"])
	}
}
