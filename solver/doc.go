// Package solver is the edgewise engine as the page and the batch runner see
// it: it decodes a project file (JSON, schema "edgewise/1") strictly, compiles
// its edge formulas into a problem.Problem, solves it by the series method
// (package series) with an independent finite-difference cross-check
// (package fdcheck), and reports the result (JSON, schema
// "edgewise-result/1") together with the field on an output grid.
//
// Bad user data never panics: every error names the field path of the
// project, and for formulas the byte column, for example
//
//	edges.top.ambient: col 4: unknown name "tt"
//
// Sign conventions: flows are per unit depth and positive INTO the region;
// the flux vector is q = -(Kx du/dx, Ky du/dy).
package solver
