// Package report turns a solved project into what edgewise hands out: the
// downloads (field CSV, probes CSV and the SVG picture, through package
// export) and the content of the printable report (inputs with units,
// results tables, cautions and the methods used), as plain text tables that
// the page only lays out. Everything is made here, in Go, so that it is
// tested natively; no user text is ever interpreted.
//
// Names and units follow the project's physics, from the one table in
// package physics (solver.Units); lengths are in metres in every physics.
// Pictures are coloured by the scale the result names (Result.Colour, from
// colour.Choose), the same as the page's canvas.
package report
