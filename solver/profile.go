package solver

import "math"

// ProfilePoint is the field at one place of a line profile, D along the
// line from its start.
type ProfilePoint struct {
	D, X, Y, Value, Gx, Gy, Qx, Qy float64
}

// MaxProfilePoints is the most places a profile may ask for.
const MaxProfilePoints = 2000

// Profile returns the field at n+1 equally spaced places on the line from
// (x0, y0) to (x1, y1), clamped into the rectangle, from the series itself
// (not the output grid). It returns nil before a solve or for n < 1.
func (o *Output) Profile(x0, y0, x1, y1 float64, n int) []ProfilePoint {
	if o.field == nil || n < 1 {
		return nil
	}
	n = min(n, MaxProfilePoints)
	clamp := func(v, hi float64) float64 { return min(max(v, 0), hi) }
	x0, x1 = clamp(x0, o.W), clamp(x1, o.W)
	y0, y1 = clamp(y0, o.H), clamp(y1, o.H)
	length := math.Hypot(x1-x0, y1-y0)
	pts := make([]ProfilePoint, 0, n+1)
	for i := 0; i <= n; i++ {
		t := float64(i) / float64(n)
		x, y := x0+t*(x1-x0), y0+t*(y1-y0)
		u, gx, gy := o.field.At(x, y)
		pts = append(pts, ProfilePoint{D: t * length, X: x, Y: y, Value: u, Gx: gx, Gy: gy, Qx: -o.kx * gx, Qy: -o.ky * gy})
	}
	return pts
}
