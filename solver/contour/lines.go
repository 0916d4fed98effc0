package contour

import "math"

// Lines appends to dst the isoline segments of the field u at the given
// level, four numbers x0, y0, x1, y1 per segment, and returns the extended
// slice (nil dst allocates; pass dst[:0] to reuse a buffer). Segments have
// no particular orientation. u holds the
// (nx+1)*(ny+1) node values described in the package comment, on a
// rectangle w by h. Lines panics if nx or ny is below 1 or u has the wrong
// length (caller bugs).
func Lines(dst []float64, u []float64, nx, ny int, w, h float64, level float64) []float64 {
	if nx < 1 || ny < 1 {
		panic("contour: grid needs nx, ny >= 1")
	}
	if len(u) != (nx+1)*(ny+1) {
		panic("contour: len(u) != (nx+1)*(ny+1)")
	}
	if math.IsNaN(level) {
		return dst
	}
	fx, fy := w/float64(nx), h/float64(ny)
	stride := nx + 1
	for j := range ny {
		y0 := float64(j) * fy
		y1 := float64(j+1) * fy
		dst = rowLines(dst, u[j*stride:(j+1)*stride], u[(j+1)*stride:(j+2)*stride], fx, y0, y1, level)
	}
	return dst
}

// rowLines appends the segments of the row of cells between the node rows
// row and up (at y0 and y1). The loops of Lines run in small functions of
// their own, so that the browser optimizes little code when a grid has
// many cells (see the package doc of edgewise/solver, Loops in functions
// of their own).
//
//go:noinline
func rowLines(dst, row, up []float64, fx, y0, y1, level float64) []float64 {
	// Classes of the left corners carry over from the previous cell.
	var left int
	if row[0] >= level {
		left |= 1
	}
	if up[0] >= level {
		left |= 8
	}
	for i := range len(row) - 1 {
		v00, v10, v11, v01 := row[i], row[i+1], up[i+1], up[i]
		right := 0
		if v10 >= level {
			right |= 2
		}
		if v11 >= level {
			right |= 4
		}
		idx := left | right
		left = (right>>1)&1 | (right<<1)&8 // right corners become the next cell's left ones
		if idx == 0 || idx == 15 {
			continue // includes cells whose NaN corners all compare false
		}
		if v00 != v00 || v10 != v10 || v11 != v11 || v01 != v01 {
			continue // NaN corner
		}
		dst = cellLines(dst, idx, float64(i)*fx, float64(i+1)*fx, y0, y1, v00, v10, v11, v01, level)
	}
	return dst
}

// cellLines appends the segments of the cell [x0, x1] x [y0, y1] of class
// idx with corner values v00, v10, v11, v01.
//
//go:noinline
func cellLines(dst []float64, idx int, x0, x1, y0, y1, v00, v10, v11, v01, level float64) []float64 {
	// Crossing points on the four edges, interpolated from the
	// lower-index node: bottom (00-10), right (10-11), top (01-11),
	// left (00-01).
	var ex, ey [4]float64
	if (idx^idx>>1)&1 != 0 {
		ex[0], ey[0] = x0+(level-v00)/(v10-v00)*(x1-x0), y0
	}
	if (idx>>1^idx>>2)&1 != 0 {
		ex[1], ey[1] = x1, y0+(level-v10)/(v11-v10)*(y1-y0)
	}
	if (idx>>3^idx>>2)&1 != 0 {
		ex[2], ey[2] = x0+(level-v01)/(v11-v01)*(x1-x0), y1
	}
	if (idx^idx>>3)&1 != 0 {
		ex[3], ey[3] = x0, y0+(level-v00)/(v01-v00)*(y1-y0)
	}
	if idx == 5 || idx == 10 {
		return saddle(dst, idx, &ex, &ey, 0.25*(v00+v10+v11+v01) >= level)
	}
	a, b := cut[idx][0], cut[idx][1]
	return seg(dst, ex[a], ey[a], ex[b], ey[b])
}

// saddle appends the two segments of a saddle cell (class 5 or 10): they
// cut off the corners unlike the centre, high or not.
//
//go:noinline
func saddle(dst []float64, idx int, ex, ey *[4]float64, centreHigh bool) []float64 {
	if (idx == 5) == centreHigh {
		// cut corners 10 (edges 0,1) and 01 (edges 2,3)
		dst = seg(dst, ex[0], ey[0], ex[1], ey[1])
		return seg(dst, ex[2], ey[2], ex[3], ey[3])
	}
	// cut corners 00 (edges 3,0) and 11 (edges 1,2)
	dst = seg(dst, ex[3], ey[3], ex[0], ey[0])
	return seg(dst, ex[1], ey[1], ex[2], ey[2])
}

// cut lists, for every non-saddle case, the two edges the line crosses.
var cut = [16][2]uint8{
	1: {3, 0}, 2: {0, 1}, 3: {3, 1}, 4: {1, 2}, 6: {0, 2}, 7: {3, 2},
	8: {2, 3}, 9: {2, 0}, 11: {2, 1}, 12: {1, 3}, 13: {1, 0}, 14: {0, 3},
}

// seg appends a segment of non-zero length. It is not inlined, to keep
// cellLines small (see rowLines).
//
//go:noinline
func seg(dst []float64, x0, y0, x1, y1 float64) []float64 {
	if x0 == x1 && y0 == y1 {
		return dst // a line through a node gives zero-length pieces
	}
	return append(dst, x0, y0, x1, y1)
}
