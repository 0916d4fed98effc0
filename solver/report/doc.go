// Package report turns a solved project into what edgewise hands out: the
// downloads (field CSV, probes CSV and the SVG picture, through package
// export) and the content of the printable report (inputs with units,
// results tables, cautions and the methods used), as plain text tables that
// the page only lays out. Everything is made here, in Go, so that it is
// tested natively; no user text is ever interpreted.
//
// Units follow the project's physics:
//
//	physics        field                  flux            flow (per m depth)  conductivity
//	heat           temperature [°C]       W/m2            W/m                 W/(m K)
//	electrostatic  potential [V]          C/m2            C/m                 F/m
//	seepage        hydraulic head [m]     m/s             m2/s                m/s
//	generic        value (no units)
//
// Lengths are in metres in every physics.
package report
