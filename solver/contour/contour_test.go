package contour

import (
	"fmt"
	"math"
	"math/rand/v2"
	"strconv"
	"testing"
)

// grid samples f at the nodes of an nx by ny grid on w by h.
func grid(nx, ny int, w, h float64, f func(x, y float64) float64) []float64 {
	u := make([]float64, (nx+1)*(ny+1))
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			u[j*(nx+1)+i] = f(float64(i)*w/float64(nx), float64(j)*h/float64(ny))
		}
	}
	return u
}

// u = x: the isoline of level c is the vertical line x = c, exactly, since
// linear interpolation reproduces a linear field. Tolerance 1e-12 * w: the
// rounding of one interpolation.
func TestLinearFieldVerticalLines(t *testing.T) {
	const nx, ny, w, h = 10, 7, 2.0, 1.0
	u := grid(nx, ny, w, h, func(x, y float64) float64 { return x })
	levels := append(Levels(0, w, 5), 0.2, 1.3333) // 0.2 falls on a node column
	var segs []float64
	for _, c := range levels {
		segs = Lines(segs[:0], u, nx, ny, w, h, c)
		if len(segs) == 0 {
			t.Fatalf("level %g: no segments", c)
		}
		for k := 0; k < len(segs); k += 2 {
			if d := math.Abs(segs[k] - c); d > 1e-12*w {
				t.Errorf("level %g: point x = %.17g off by %.3g", c, segs[k], d)
			}
		}
		lines := Join(segs)
		if len(lines) != 1 {
			t.Fatalf("level %g: %d polylines, want 1", c, len(lines))
		}
		l := lines[0]
		if len(l) != 2*(ny+1) {
			t.Errorf("level %g: %d points, want %d", c, len(l)/2, ny+1)
		}
		y0, y1 := math.Min(l[1], l[len(l)-1]), math.Max(l[1], l[len(l)-1])
		if y0 != 0 || math.Abs(y1-h) > 1e-15 {
			t.Errorf("level %g: line runs from y=%g to y=%g, want 0 to %g", c, y0, y1, h)
		}
		spots := LabelSpots(lines, 0.5*h)
		if len(spots) != 1 || math.Abs(spots[0].Angle-math.Pi/2) > 1e-12 ||
			math.Abs(spots[0].Y-h/2) > 1e-12 || math.Abs(spots[0].X-c) > 1e-12 {
			t.Errorf("level %g: label spots %+v, want one at (%g, %g) angle pi/2", c, spots, c, h/2)
		}
		if s := LabelSpots(lines, 1.5*h); len(s) != 0 {
			t.Errorf("level %g: line shorter than minLen got a label", c)
		}
	}
}

// u = (x-a)^2 + (y-b)^2: isolines are circles of radius r = sqrt(level).
// Along a cell edge the field is a parabola with curvature 2, so the
// linear interpolant is off by at most d^2/4 (d the node spacing) and the
// crossing point by at most d^2/(8r) in radius; tolerance is that bound
// times 1.01 plus 1e-12 for rounding.
func TestCirclesClosed(t *testing.T) {
	const nx, ny, w, h = 40, 30, 2.0, 1.5
	a, b := 1.0, 0.75
	u := grid(nx, ny, w, h, func(x, y float64) float64 { return (x-a)*(x-a) + (y-b)*(y-b) })
	d := math.Max(w/nx, h/ny)
	worst := 0.0
	for _, r := range []float64{0.2, 0.37, 0.5, 0.7} {
		level := r * r
		lines := Join(Lines(nil, u, nx, ny, w, h, level))
		if len(lines) != 1 {
			t.Fatalf("r=%g: %d polylines, want 1", r, len(lines))
		}
		l := lines[0]
		if l[0] != l[len(l)-2] || l[1] != l[len(l)-1] {
			t.Errorf("r=%g: polyline not closed", r)
		}
		tol := 1.01*d*d/(8*r) + 1e-12
		for k := 0; k < len(l); k += 2 {
			e := math.Abs(math.Hypot(l[k]-a, l[k+1]-b) - r)
			worst = math.Max(worst, e/tol)
			if e > tol {
				t.Errorf("r=%g: point (%g, %g) off the circle by %.3g > %.3g", r, l[k], l[k+1], e, tol)
			}
		}
		// The polygon's length approaches the circumference from below.
		length := 0.0
		for k := 2; k < len(l); k += 2 {
			length += math.Hypot(l[k]-l[k-2], l[k+1]-l[k-1])
		}
		if c := 2 * math.Pi * r; length > c*(1+1e-3) || length < c*0.98 {
			t.Errorf("r=%g: length %.5f, circumference %.5f", r, length, c)
		}
		for _, s := range LabelSpots(lines, 0) {
			if e := math.Abs(math.Hypot(s.X-a, s.Y-b) - r); e > tol {
				t.Errorf("r=%g: label spot off the circle by %g", r, e)
			}
		}
	}
	t.Logf("worst error / bound: %.3f", worst)
}

// One saddle cell, corners 00 = 1, 10 = 0, 11 = 1, 01 = 0 (the centre
// average is 0.5). Expected segments worked out by hand from the rule in
// the package comment.
func TestSaddle(t *testing.T) {
	u := []float64{1, 0, 0, 1} // row j=0: 00, 10; row j=1: 01, 11
	cases := []struct {
		name  string
		level float64
		want  [][4]float64
	}{
		// centre 0.5 >= 0.5: centre high, the low corners 10 and 01 are cut off
		{"centre high", 0.5, [][4]float64{{0.5, 0, 1, 0.5}, {0.5, 1, 0, 0.5}}},
		// centre 0.5 < 0.6: centre low, the high corners 00 and 11 are cut off
		{"centre low", 0.6, [][4]float64{{0, 0.4, 0.4, 0}, {1, 0.6, 0.6, 1}}},
	}
	for _, c := range cases {
		got := Lines(nil, u, 1, 1, 1, 1, c.level)
		if len(got) != 4*len(c.want) {
			t.Fatalf("%s: %d numbers, want %d", c.name, len(got), 4*len(c.want))
		}
		for s, w := range c.want {
			for k := range 4 {
				if math.Abs(got[4*s+k]-w[k]) > 1e-15 {
					t.Errorf("%s: segment %d = %v, want %v", c.name, s, got[4*s:4*s+4], w)
					break
				}
			}
		}
	}
	// The mirrored saddle (case 10) must give the mirrored picture.
	v := []float64{0, 1, 1, 0}
	got := Lines(nil, v, 1, 1, 1, 1, 0.5) // centre high: cut low corners 00 and 11
	want := []float64{0, 0.5, 0.5, 0, 1, 0.5, 0.5, 1}
	for k := range want {
		if len(got) != len(want) || math.Abs(got[k]-want[k]) > 1e-15 {
			t.Fatalf("mirrored saddle: %v, want %v", got, want)
		}
	}
}

// A saddle in a larger field: u = (x-0.5)(y-0.5)+1 on the unit square with
// an odd number of cells, so no node sits on the crossing. Level 1 + eps
// (eps > 0) gives two hyperbola branches in the quadrants where u > 1,
// level 1 - eps the other two: each must be two separate open polylines.
func TestSaddleField(t *testing.T) {
	const n = 9
	u := grid(n, n, 1, 1, func(x, y float64) float64 { return (x-0.5)*(y-0.5) + 1 })
	for _, level := range []float64{1.01, 0.99} {
		lines := Join(Lines(nil, u, n, n, 1, 1, level))
		if len(lines) != 2 {
			t.Errorf("level %g: %d polylines, want 2", level, len(lines))
		}
		for _, l := range lines {
			for k := 0; k < len(l); k += 2 {
				sgn := (l[k] - 0.5) * (l[k+1] - 0.5)
				if (level > 1) != (sgn > 0) {
					t.Errorf("level %g: point (%g, %g) in the wrong quadrant", level, l[k], l[k+1])
				}
			}
		}
	}
}

// Cells with a NaN corner produce nothing; the rest is unchanged.
func TestNaNCellsSkipped(t *testing.T) {
	const nx, ny = 6, 4
	u := grid(nx, ny, 6, 4, func(x, y float64) float64 { return x })
	full := Lines(nil, u, nx, ny, 6, 4, 2.5)
	u[2*(nx+1)+2] = math.NaN() // node (2, 2): touches cells (1..2, 1..2)
	got := Lines(nil, u, nx, ny, 6, 4, 2.5)
	// Level 2.5 crosses column 2 of cells; rows 1 and 2 of it touch the NaN node.
	if len(got) != len(full)-8 {
		t.Fatalf("with NaN: %d segments, want %d", len(got)/4, len(full)/4-2)
	}
	for k := 0; k < len(got); k += 4 {
		ymid := 0.5 * (got[k+1] + got[k+3])
		if ymid > 1 && ymid < 3 {
			t.Errorf("segment at y=%g in a NaN cell", ymid)
		}
	}
	if len(Join(got)) != 2 {
		t.Errorf("line broken by NaN cells should give 2 polylines")
	}
}

// Lines must reuse dst without allocating.
func TestLinesNoAlloc(t *testing.T) {
	u := grid(32, 32, 1, 1, func(x, y float64) float64 { return x*x + y*y })
	dst := Lines(nil, u, 32, 32, 1, 1, 0.5)
	allocs := testing.AllocsPerRun(20, func() { dst = Lines(dst[:0], u, 32, 32, 1, 1, 0.5) })
	if allocs != 0 {
		t.Errorf("Lines allocates %g times with a big enough dst", allocs)
	}
}

func TestLevels(t *testing.T) {
	cases := []struct {
		min, max float64
		n        int
		want     []float64
	}{
		{0, 1, 5, []float64{0.2, 0.4, 0.6, 0.8}},
		{0, 100, 10, []float64{10, 20, 30, 40, 50, 60, 70, 80, 90}},
		{0, 1, 3, []float64{0.25, 0.5, 0.75}},
		{-0.3, 0.3, 5, []float64{-0.2, -0.1, 0, 0.1, 0.2}},
		{21.3, 178.9, 6, []float64{25, 50, 75, 100, 125, 150, 175}},
		{0.0012, 0.0049, 3, []float64{0.002, 0.003, 0.004}},
		// errors: no levels
		{1, 1, 5, nil},
		{2, 1, 5, nil},
		{0, 1, 0, nil},
		{math.NaN(), 1, 5, nil},
		{0, math.Inf(1), 5, nil},
		{-math.MaxFloat64, math.MaxFloat64, 5, nil}, // width overflows
	}
	for _, c := range cases {
		got := Levels(c.min, c.max, c.n)
		if fmt.Sprint(got) != fmt.Sprint(c.want) {
			t.Errorf("Levels(%g, %g, %d) = %v, want %v", c.min, c.max, c.n, got, c.want)
		}
	}
}

// Ranges narrow for their magnitude: the spacing is near the float64
// resolution. Levels must return (not loop forever) and whatever it
// returns must be strictly inside and strictly increasing.
func TestLevelsNarrowRanges(t *testing.T) {
	for _, c := range [][2]float64{{1e17, 1e17 + 64}, {1, 1 + 1e-15}, {1e300, 1.0000000000001e300}, {-5e-324, 5e-324}} {
		lv := Levels(c[0], c[1], 5)
		for k, v := range lv {
			if !(v > c[0] && v < c[1]) || (k > 0 && !(v > lv[k-1])) {
				t.Errorf("Levels(%g, %g, 5) = %v", c[0], c[1], lv)
				break
			}
		}
	}
}

// Seeded random ranges, half of them with round ends: every level strictly
// inside, evenly spaced by a 1/2/2.5/5 x 10^k step, and the count within a
// factor of about two of n (the step choices are at most 2 apart).
func TestLevelsProperties(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11))
	for it := range 2000 {
		scale := math.Pow(10, float64(rng.IntN(13)-6))
		lo := (rng.Float64()*2 - 1) * scale
		hi := lo + rng.Float64()*scale*3
		if it%2 == 0 {
			lo, hi = math.Round(lo/scale*4)*scale/4, math.Round(hi/scale*4)*scale/4
		}
		n := 1 + rng.IntN(20)
		lv := Levels(lo, hi, n)
		if !(lo < hi) {
			continue
		}
		if len(lv) < n/2-1 || len(lv) > 2*n+1 {
			t.Errorf("Levels(%g, %g, %d): %d levels", lo, hi, n, len(lv))
		}
		for k, v := range lv {
			if !(v > lo && v < hi) {
				t.Errorf("Levels(%g, %g, %d): level %g not strictly inside", lo, hi, n, v)
			}
			if k > 0 {
				step := v - lv[k-1]
				e := math.Floor(math.Log10(step))
				m := step / math.Pow(10, e)
				okStep := false
				for _, s := range []float64{1, 2, 2.5, 5, 10} {
					okStep = okStep || math.Abs(m-s) < 1e-6
				}
				if !okStep {
					t.Errorf("Levels(%g, %g, %d): step %g is not round", lo, hi, n, step)
				}
				if q := v / step; math.Abs(q-math.Round(q)) > 1e-6 {
					t.Errorf("Levels(%g, %g, %d): level %g not a multiple of %g", lo, hi, n, v, step)
				}
			}
			if s := strconv.FormatFloat(v, 'g', -1, 64); len(s) > 12 {
				t.Errorf("Levels(%g, %g, %d): level prints as %s", lo, hi, n, s)
			}
		}
	}
}

func TestJoinPanicsOnBadLength(t *testing.T) {
	defer func() {
		if recover() == nil {
			t.Error("Join of 3 numbers did not panic")
		}
	}()
	Join([]float64{1, 2, 3})
}

func BenchmarkLines(b *testing.B) {
	for _, n := range []int{128, 512} {
		b.Run(fmt.Sprint(n+1), func(b *testing.B) {
			u := grid(n, n, 0.4, 0.15, func(x, y float64) float64 {
				return math.Sin(9*x)*math.Cosh(7*y) + 40*x*y
			})
			levels := Levels(-2, 2.5, 12)
			var segs []float64
			b.ResetTimer()
			for b.Loop() {
				for _, c := range levels {
					segs = Lines(segs[:0], u, n, n, 0.4, 0.15, c)
				}
			}
		})
	}
}

func BenchmarkLinesJoin(b *testing.B) {
	const n = 512
	u := grid(n, n, 1, 1, func(x, y float64) float64 { return (x-0.5)*(x-0.5) + (y-0.3)*(y-0.3) })
	levels := Levels(0, 0.74, 12)
	var segs []float64
	for b.Loop() {
		for _, c := range levels {
			segs = Lines(segs[:0], u, n, n, 1, 1, c)
			_ = Join(segs)
		}
	}
}

// joinByMap is Join written plainly with a map of slices: the reference
// for the hash table of Join.
func joinByMap(segs []float64) [][]float64 {
	n := len(segs) / 4
	if n == 0 {
		return nil
	}
	minX, minY, maxX, maxY := extent(segs)
	q := 1e-9 * math.Max(maxX-minX, maxY-minY)
	if !(q > 0) {
		q = 1e-300
	}
	key := func(x, y float64) [2]int64 {
		return [2]int64{int64(math.Round((x - minX) / q)), int64(math.Round((y - minY) / q))}
	}
	ends := map[[2]int64][]int{}
	used := make([]bool, n)
	for e := range 2 * n {
		k := key(segs[2*e], segs[2*e+1])
		ends[k] = append(ends[k], e)
	}
	for s := range n {
		used[s] = key(segs[4*s], segs[4*s+1]) == key(segs[4*s+2], segs[4*s+3])
	}
	grow := func(line []float64) []float64 {
		for {
			found := false
			for _, e := range ends[key(line[len(line)-2], line[len(line)-1])] {
				if s := e / 2; !used[s] {
					used[s], found = true, true
					o := 1 - e%2
					line = append(line, segs[4*s+2*o], segs[4*s+2*o+1])
					break
				}
			}
			if !found {
				return line
			}
		}
	}
	var lines [][]float64
	for s := range n {
		if used[s] {
			continue
		}
		used[s] = true
		fwd := grow([]float64{segs[4*s], segs[4*s+1], segs[4*s+2], segs[4*s+3]})
		if key(fwd[0], fwd[1]) == key(fwd[len(fwd)-2], fwd[len(fwd)-1]) {
			fwd[len(fwd)-2], fwd[len(fwd)-1] = fwd[0], fwd[1]
		} else if back := grow([]float64{fwd[2], fwd[3], fwd[0], fwd[1]}); len(back) > 4 {
			var line []float64
			for k := len(back) - 2; k >= 4; k -= 2 {
				line = append(line, back[k], back[k+1])
			}
			fwd = append(line, fwd...)
		}
		lines = append(lines, fwd)
	}
	return lines
}

// Join gives the polylines of joinByMap, bit for bit: for isolines, and
// for segments between a few lattice points, where many ends meet at one
// point, segments repeat and some have both ends at one point.
func TestJoinMatchesMap(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11)) // seeded
	var cases [][]float64
	u := grid(40, 30, 2, 1, func(x, y float64) float64 { return math.Sin(5*x)*math.Cos(7*y) + 0.3*x })
	for _, c := range Levels(-1, 1.6, 9) {
		cases = append(cases, Lines(nil, u, 40, 30, 2, 1, c))
	}
	for range 50 {
		segs := make([]float64, 4*(1+rng.IntN(60)))
		for k := range segs {
			segs[k] = float64(rng.IntN(4)) * 0.25
		}
		cases = append(cases, segs)
	}
	for i, segs := range cases {
		got, want := Join(segs), joinByMap(segs)
		if fmt.Sprint(got) != fmt.Sprint(want) {
			t.Errorf("case %d: Join gives %v, want %v", i, got, want)
		}
	}
}
