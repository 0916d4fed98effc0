// Package solver is the edgewise solve pipeline as the page and the batch
// runner see it: it compiles a decoded project (package project) into a
// problem.Problem, solves it by the series method (package series) with an
// independent finite-difference cross-check (package fdcheck), and reports
// the result (JSON, schema "edgewise-result/1") together with the field on
// an output grid, its isolines and previews of the edge data.
//
// Bad user data never panics: every error is a *project.Error that names
// the field path of the project, and for formulas the byte column, for
// example
//
//	edges.top.ambient: col 4: unknown name "tt"
//
// Sign conventions: flows are per unit depth and positive INTO the region;
// the flux vector is q = -(Kx du/dx, Ky du/dy).
package solver

// # Loops in functions of their own
//
// In the browser the engine starts in the JavaScript engine's baseline
// compiler and its hot functions are compiled again, optimized, on
// background threads. Go's WebAssembly code jumps back to the top of its
// function for every turn of a loop, and the browser counts each turn as
// the whole distance from the top: a loop near the end of a large
// function makes that function hot within a few hundred turns, and
// optimizing a large function takes tens to hundreds of milliseconds of a
// processor. On a machine with two processors that work took the
// processor from the first solve (measured: 380 ms for the demo against
// 70-110 ms without the optimizing compiler).
//
// So a loop that runs over grid nodes, quadrature points or terms, in a
// function that is large for other reasons, lives in a small function of
// its own marked //go:noinline (the Go compiler would otherwise put it
// back). The numbers do not change: the same operations run in the same
// order.
