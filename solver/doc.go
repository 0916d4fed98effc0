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
