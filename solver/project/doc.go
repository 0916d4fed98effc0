// Package project reads and writes edgewise project files (JSON, schema
// "edgewise/1") and compiles them into the mathematical problem
// (problem.Problem) that the solvers work on.
//
// Decode is strict: unknown keys, missing fields, wrong types, non-finite or
// out-of-range numbers are errors. Every error is an *Error that names the
// field path of the project and, for a formula, the byte column:
//
//	edges.top.ambient: col 4: unknown name "tt"
//
// A project may name parameters ("parameters": {"h_top": 25}): every
// formula may use them like pi, and every number field that takes text
// (sizes, conductivity, source, h, probe coordinates) may be written as a
// formula of them, worked out at decoding; Project.Texts keeps those texts
// so that the file is written back as it was written. Project.With and
// DecodeWith give the project with other parameter values, checked as
// Decode checks a file.
//
// Project.JSON writes the file back in the field order of the contract, so
// that Decode(p.JSON()) gives p again. Compile turns each edge's formula
// into a function of the distance s along the edge.
package project
