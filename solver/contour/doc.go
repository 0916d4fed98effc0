// Package contour draws isolines of a field sampled on a regular node grid
// and picks round contour levels and label positions for them.
//
// The grid has (nx+1) x (ny+1) nodes, row by row from the bottom:
//
//	u[j*(nx+1) + i]  at  x = i*w/nx,  y = j*h/ny,   0 <= i <= nx, 0 <= j <= ny
//
// Lines uses marching squares. A node counts as high when u >= level.
// Each cell edge whose two nodes differ is cut at the linearly
// interpolated point, always computed from the node with the smaller
// index, so the two cells sharing an edge produce bit-identical points.
// Saddle cells (two high corners on a diagonal) are resolved by the average
// of the four corners: the corners whose class differs from that centre
// value are cut off. Cells with a NaN corner are skipped, so lines stop at
// missing data. Segments of zero length (a line through a node) are dropped.
//
// Join links the segments into polylines through a hash table keyed on endpoints
// rounded to a small fraction of the drawing's extent; LabelSpots picks a
// point and a direction on each long enough polyline for a text label.
package contour
