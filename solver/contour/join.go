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
//
// Its loops run in small functions of their own, so that the browser
// optimizes little code when an isoline has many segments (see the
// package doc of edgewise/solver, Loops in functions of their own).
func Join(segs []float64) [][]float64 {
	if len(segs)%4 != 0 {
		panic("contour: Join needs x0, y0, x1, y1 per segment")
	}
	n := len(segs) / 4
	if n == 0 {
		return nil
	}
	minX, minY, maxX, maxY := extent(segs)
	q := 1e-9 * math.Max(maxX-minX, maxY-minY)
	if !(q > 0) {
		q = 1e-300
	}
	j := &joiner{segs: segs, lat: lattice{minX, minY, q}, used: make([]bool, n)}
	j.index()
	return j.lines()
}

// extent returns the smallest and largest x and y of the segment ends.
//
//go:noinline
func extent(segs []float64) (minX, minY, maxX, maxY float64) {
	minX, minY, maxX, maxY = math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
	for k := 0; k < len(segs); k += 2 {
		minX, maxX = math.Min(minX, segs[k]), math.Max(maxX, segs[k])
		minY, maxY = math.Min(minY, segs[k+1]), math.Max(maxY, segs[k+1])
	}
	return minX, minY, maxX, maxY
}

// lattice rounds points to the lattice on which segment ends meet.
type lattice struct{ minX, minY, q float64 }

func (l *lattice) key(x, y float64) [2]int64 {
	return [2]int64{int64(math.Round((x - l.minX) / l.q)), int64(math.Round((y - l.minY) / l.q))}
}

// joiner holds the state of one Join: segment end e is end e%2 of
// segment e/2; ends that round to the same point are found through a
// hash table whose chains keep the ends in input order.
type joiner struct {
	segs  []float64
	lat   lattice
	used  []bool     // used[s]: segment s is in a polyline, or too short for one
	keys  [][2]int64 // keys[e]: the rounded point of end e
	first []int32    // first[b]: the first end in bucket b, -1 when none
	after []int32    // after[e]: the next end in e's bucket, -1 when none
}

// bucket returns the hash table bucket of a rounded point.
func (j *joiner) bucket(k [2]int64) int {
	h := uint64(k[0])*0x9e3779b97f4a7c15 ^ uint64(k[1])*0xc2b2ae3d27d4eb4f
	return int((h ^ h>>32) & uint64(len(j.first)-1))
}

// index rounds every segment end, chains the ends of each bucket in input
// order and marks as used the segments whose ends round to one point.
func (j *joiner) index() {
	ne := len(j.segs) / 2
	size := 1
	for size < 2*ne {
		size *= 2
	}
	j.keys, j.first, j.after = make([][2]int64, ne), make([]int32, size), make([]int32, ne)
	j.chain()
	j.markShort()
}

// chain rounds every segment end and chains the ends of each bucket in
// input order.
//
//go:noinline
func (j *joiner) chain() {
	for b := range j.first {
		j.first[b] = -1
	}
	for e := len(j.keys) - 1; e >= 0; e-- {
		k := j.lat.key(j.segs[2*e], j.segs[2*e+1])
		b := j.bucket(k)
		j.keys[e], j.after[e], j.first[b] = k, j.first[b], int32(e)
	}
}

// markShort marks as used the segments whose two ends round to one point:
// pieces shorter than the lattice (three cuts meeting near a node whose
// value rounds to the level) would only make stray polylines.
//
//go:noinline
func (j *joiner) markShort() {
	for s := range j.used {
		j.used[s] = j.keys[2*s] == j.keys[2*s+1]
	}
}

// next returns an unused segment end at (x, y), the first in input order,
// and marks its segment used.
//
//go:noinline
func (j *joiner) next(x, y float64) (int, bool) {
	k := j.lat.key(x, y)
	for e := j.first[j.bucket(k)]; e >= 0; e = j.after[e] {
		if s := int(e / 2); j.keys[e] == k && !j.used[s] {
			j.used[s] = true
			return int(e), true
		}
	}
	return 0, false
}

// lines returns the polylines, one for each unused segment in turn.
//
//go:noinline
func (j *joiner) lines() [][]float64 {
	var lines [][]float64
	for s, u := range j.used {
		if !u {
			lines = append(lines, j.line(s))
		}
	}
	return lines
}

// line returns the polyline through segment s, grown both ways.
func (j *joiner) line(s int) []float64 {
	segs, key := j.segs, j.lat.key
	j.used[s] = true
	fwd := []float64{segs[4*s], segs[4*s+1], segs[4*s+2], segs[4*s+3]}
	fwd = walk(fwd, j)
	startKey := key(fwd[0], fwd[1])
	endKey := key(fwd[len(fwd)-2], fwd[len(fwd)-1])
	if startKey == endKey {
		fwd[len(fwd)-2], fwd[len(fwd)-1] = fwd[0], fwd[1] // closed: repeat the first point exactly
		return fwd
	}
	// Grow the other way from the start, then put it in front.
	back := walk([]float64{fwd[2], fwd[3], fwd[0], fwd[1]}, j)
	if len(back) > 4 {
		fwd = reversedBefore(back, fwd)
	}
	return fwd
}

// reversedBefore returns the points of back after its first two, in
// reverse order, followed by fwd.
//
//go:noinline
func reversedBefore(back, fwd []float64) []float64 {
	line := make([]float64, 0, len(back)+len(fwd)-4)
	for k := len(back) - 2; k >= 4; k -= 2 {
		line = append(line, back[k], back[k+1])
	}
	return append(line, fwd...)
}

// walk extends line from its last point while an unused segment starts or
// ends there.
//
//go:noinline
func walk(line []float64, j *joiner) []float64 {
	segs := j.segs
	for {
		se, ok := j.next(line[len(line)-2], line[len(line)-1])
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
