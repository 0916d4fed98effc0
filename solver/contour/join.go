package contour

import "math"

// Join links segments (x0, y0, x1, y1 each, as Lines makes them) into
// polylines of x, y pairs. Segment ends meet when they round to the same
// point on a lattice 1e-9 of the segments' extent wide; segments whose two
// ends round to the same point are dropped. A closed loop is returned with
// its first point repeated exactly at the end. Where more than two
// segments meet at one point (a level passing exactly through a saddle
// node) the walk takes them in input order, so every segment is used
// exactly once. Join panics if len(segs) is not a multiple of 4.
func Join(segs []float64) [][]float64 {
	if len(segs)%4 != 0 {
		panic("contour: Join needs x0, y0, x1, y1 per segment")
	}
	n := len(segs) / 4
	if n == 0 {
		return nil
	}
	minX, minY, maxX, maxY := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
	for k := 0; k < len(segs); k += 2 {
		minX, maxX = math.Min(minX, segs[k]), math.Max(maxX, segs[k])
		minY, maxY = math.Min(minY, segs[k+1]), math.Max(maxY, segs[k+1])
	}
	q := 1e-9 * math.Max(maxX-minX, maxY-minY)
	if !(q > 0) {
		q = 1e-300
	}
	key := func(x, y float64) [2]int64 {
		return [2]int64{int64(math.Round((x - minX) / q)), int64(math.Round((y - minY) / q))}
	}
	// ends maps a rounded point to the segment ends there (2*s or 2*s+1).
	ends := make(map[[2]int64][]int32, 2*n)
	for s := range n {
		for e := range 2 {
			k := key(segs[4*s+2*e], segs[4*s+2*e+1])
			ends[k] = append(ends[k], int32(2*s+e))
		}
	}
	used := make([]bool, n)
	for s := range n {
		// Pieces shorter than the lattice (three cuts meeting near a node
		// whose value rounds to the level) would only make stray polylines.
		used[s] = key(segs[4*s], segs[4*s+1]) == key(segs[4*s+2], segs[4*s+3])
	}
	// next returns an unused segment end at (x, y) and marks it used.
	next := func(x, y float64) (int, bool) {
		for _, se := range ends[key(x, y)] {
			if s := int(se / 2); !used[s] {
				used[s] = true
				return int(se), true
			}
		}
		return 0, false
	}
	var lines [][]float64
	for s := range n {
		if used[s] {
			continue
		}
		used[s] = true
		fwd := []float64{segs[4*s], segs[4*s+1], segs[4*s+2], segs[4*s+3]}
		fwd = walk(fwd, segs, next)
		startKey := key(fwd[0], fwd[1])
		endKey := key(fwd[len(fwd)-2], fwd[len(fwd)-1])
		if startKey == endKey {
			fwd[len(fwd)-2], fwd[len(fwd)-1] = fwd[0], fwd[1] // closed: repeat the first point exactly
		} else {
			// Grow the other way from the start, then put it in front.
			back := walk([]float64{fwd[2], fwd[3], fwd[0], fwd[1]}, segs, next)
			if len(back) > 4 {
				line := make([]float64, 0, len(back)+len(fwd)-4)
				for k := len(back) - 2; k >= 4; k -= 2 {
					line = append(line, back[k], back[k+1])
				}
				fwd = append(line, fwd...)
			}
		}
		lines = append(lines, fwd)
	}
	return lines
}

// walk extends line from its last point while an unused segment starts or
// ends there.
func walk(line, segs []float64, next func(x, y float64) (int, bool)) []float64 {
	for {
		se, ok := next(line[len(line)-2], line[len(line)-1])
		if !ok {
			return line
		}
		s, e := se/2, se%2
		o := 1 - e // the other end
		line = append(line, segs[4*s+2*o], segs[4*s+2*o+1])
	}
}

// Spot is a place for an isoline label.
type Spot struct {
	Line  int     // index of the polyline in the slice given to LabelSpots
	X, Y  float64 // a point on the polyline
	Angle float64 // direction of the line there, radians counter-clockwise from +x, in (-pi/2, pi/2]
}

// LabelSpots returns one label place for every polyline at least minLen
// long: the point halfway along its length, with the direction of the
// piece it lies on. The angle is folded into (-pi/2, pi/2] so that text
// drawn along it reads left to right. Angles are in the field's own
// coordinates (y up); a drawing with y down negates them.
func LabelSpots(lines [][]float64, minLen float64) []Spot {
	var spots []Spot
	for li, l := range lines {
		total := 0.0
		for k := 2; k+1 < len(l); k += 2 {
			total += math.Hypot(l[k]-l[k-2], l[k+1]-l[k-1])
		}
		if total < minLen || total == 0 {
			continue
		}
		half, acc := total/2, 0.0
		for k := 2; k+1 < len(l); k += 2 {
			dx, dy := l[k]-l[k-2], l[k+1]-l[k-1]
			d := math.Hypot(dx, dy)
			if acc+d >= half && d > 0 {
				f := (half - acc) / d
				a := math.Atan2(dy, dx)
				if a > math.Pi/2 {
					a -= math.Pi
				} else if a <= -math.Pi/2 {
					a += math.Pi
				}
				spots = append(spots, Spot{Line: li, X: l[k-2] + f*dx, Y: l[k-1] + f*dy, Angle: a})
				break
			}
			acc += d
		}
	}
	return spots
}
