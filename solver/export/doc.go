// Package export writes the text downloads of edgewise: the field and the
// probes as CSV and a picture as a standalone SVG. They are made here, in
// Go, so that they can be tested natively against golden files; the page
// only saves the bytes it is given.
//
// CSV (RFC 4180): comma separated, CRLF line ends, text cells quoted when
// they hold a comma, a quote or a line break (quotes doubled). The first
// line names every column with its unit in square brackets. Numbers are
// written in the shortest representation that reads back exactly, byte for
// byte as strconv's 'g' with precision -1 writes them (by a formatter of
// this package, shortest.go, twice as fast; the tests compare the two); a
// zero is written 0 (never -0), a missing value of the field NaN, and a
// number a probe has not (its gradient where that is unbounded) an empty
// cell.
//
// Text cells (labels, the header) are guarded against formula injection
// (common practice): the text is cut at every comma, semicolon, tab and
// line break, the separators a spreadsheet may split on, and each piece
// that starts, after any spaces (Unicode ones too, such as U+00A0), with
// = + - @, a full-width form of one of them (U+FF1D U+FF0B U+FF0D U+FF20),
// the minus sign U+2212, a tab or a line break gets an apostrophe in front,
// so that a spreadsheet shows it as text instead of running it; a guarded
// cell is always quoted. The label a;=1+1;b is written "a;'=1+1;b".
//
// Field CSV: one row per grid node, y outer and x inner (row j = 0 at the
// bottom first), columns
//
//	x [L], y [L], <quantity> [U], grad_x [U/L], grad_y [U/L], flux_x [F], flux_y [F]
//
// with flux = -(Kx grad_x, Ky grad_y). Without gradients (Ux and Uy nil) the
// last four columns are left out.
//
// Probes CSV: one row per probe, columns
//
//	label, x [L], y [L], <quantity> [U], grad_x [U/L], grad_y [U/L], flux_x [F], flux_y [F], note
//
// where note says why a cell is empty (or is empty itself).
// SVG: a standalone SVG 1.1/2 document in the SVG namespace only (no other
// URL, no script, no external reference). The rectangle is drawn to scale
// (PixelW pixels wide, at most twice that tall), the field as an embedded
// PNG raster (a data: URL) coloured by a colour.Scale (the result's, so
// that it matches the page's canvas), the isolines as
// paths with their values written along them, a legend bar with ticks and
// unit, and the title. All user text passes through xml.EscapeText.
package export
